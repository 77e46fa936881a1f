"""The inverse solver: turns for a target inductance, for any coil form.

It works only through the form protocol (:class:`coilplan.forms.CoilForm`):
``inductance(turns)`` vectorised over float turns, ``min_turns()``,
``max_turns()`` and ``limit_reason(turns)``, and, where nothing physical
limits the turns (``max_turns()`` is infinite), an optional
``search_limit()``: the most turns worth searching on that form and why, in
words (a solenoid's winding as long as the longest length the tool reads,
say). Without either, the search stops at :data:`SEARCH_LIMIT` turns. So a
new form needs no change here.

The continuous root of L(N) = target is found in logarithmic variables,
f(u) = ln L(e^u) − ln target, which is nearly straight (L grows roughly as
N², less for long coils), by a vectorised Illinois (modified regula falsi)
iteration inside a bracket that is checked first. The whole numbers on
either side are then evaluated exactly and the one closer in inductance is
recommended.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from coilplan.errors import InfeasibleError, SolverError
from coilplan.quantities import format_quantity

__all__ = ["SEARCH_LIMIT", "TurnsSolution", "search_turns", "solve_apparent", "solve_turns"]

#: Turns beyond which the solver does not search when the form sets no limit of its own: ten
#: million, more than any coil wound by hand or on a bench machine (common practice, no source).
SEARCH_LIMIT = 1e7


@dataclass(frozen=True)
class TurnsSolution:
    """Result of :func:`solve_turns` (arrays when the targets were an array).

    Attributes
    ----------
    target : float or ndarray
        The inductance asked for, H.
    turns_exact : float or ndarray
        Continuous solution N* with L(N*) = target.
    turns : int or ndarray
        Recommended whole number: of floor(N*) and floor(N*) + 1, the one whose
        inductance is closer to the target (and that fits).
    turns_below, turns_above : int or ndarray
        The whole numbers on either side of N* (equal when N* is whole).
    inductance, inductance_below, inductance_above : float or ndarray
        L at the recommended number and at the two neighbours, H.
    iterations, evaluations : int
        Work done by the root finder.
    converged : bool
        True when every root met the tolerance.
    message : str
        A one-line account of the solve.
    """

    target: float | np.ndarray
    turns_exact: float | np.ndarray
    turns: int | np.ndarray
    turns_below: int | np.ndarray
    turns_above: int | np.ndarray
    inductance: float | np.ndarray
    inductance_below: float | np.ndarray
    inductance_above: float | np.ndarray
    iterations: int
    evaluations: int
    converged: bool
    message: str


def _log_inductance(form, turns: np.ndarray) -> np.ndarray:
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.log(np.asarray(form.inductance(turns), dtype=float))


def search_turns(form) -> tuple[float, str | None]:
    """(most whole turns searched, why in words or None): ``max_turns()`` (its words are the form's
    ``limit_reason``), else the form's ``search_limit()``, else :data:`SEARCH_LIMIT`."""
    limit = float(form.max_turns())
    if math.isfinite(limit):
        return float(math.floor(limit + 1e-9)), None
    own = getattr(form, "search_limit", None)
    if callable(own):
        turns, reason = own()
        if float(turns) <= SEARCH_LIMIT:
            return float(math.floor(float(turns) + 1e-9)), reason
    return SEARCH_LIMIT, (f"{SEARCH_LIMIT:.0f} turns, beyond which this solver does not search (more than any "
                          f"coil wound by hand or machine)")


def _upper_bracket(form, log_target: np.ndarray, low: float) -> tuple[float, str | None]:
    """The top of the bracket: doubling from a few turns until L reaches the largest target.

    It stops at the form's own limit or at the search limit (with the words for that limit,
    :func:`search_turns`), so the solver never evaluates a costly model far beyond the answer.
    """
    limit, reason = search_turns(form)
    needed = float(np.max(log_target))
    high = min(max(2.0 * low, 2.0), limit)
    while high < limit and _log_inductance(form, np.array([high]))[0] < needed:
        high = min(2.0 * high, limit)
    return high, reason


def _check_bracket(form, targets: np.ndarray, low: float, high: float,
                   smallest: float, largest: float, reason: str | None) -> None:
    """Raise InfeasibleError, in the user's terms, when a target lies outside [L(low), L(high)]."""
    slack = 1e-12  # a target equal to a limit, up to rounding, is reachable
    if np.any(targets < smallest * (1 - slack)):
        target = float(np.min(targets))
        raise InfeasibleError(
            f"target {format_quantity(target, 'H')} is below the {format_quantity(smallest, 'H')} "
            f"of {form.limit_reason(low, lowest=True)}",
            option="target", achievable=(smallest, largest))
    if np.any(targets > largest * (1 + slack)):
        target = float(np.max(targets))
        reason = form.limit_reason(high) if reason is None else reason
        raise InfeasibleError(
            f"target {format_quantity(target, 'H')} is above the {format_quantity(largest, 'H')} "
            f"this coil can reach: {reason}",
            option="target", achievable=(smallest, largest))


def _refuse_beyond_any_coil(form, targets: np.ndarray) -> None:
    """A target of zero or less is below one turn, an infinite one above any winding: say so in those terms.

    (A caller's band around a target, target·(1 ± u) with u >= 1, reaches them; they are
    not defects.)
    """
    if np.any(targets <= 0):
        raise InfeasibleError(f"target {format_quantity(float(np.min(targets)), 'H')} is not above zero: even "
                              f"{form.limit_reason(float(form.min_turns()), lowest=True)} has more",
                              option="target")
    if np.any(np.isinf(targets)):
        raise InfeasibleError("an infinite target inductance is above what any winding reaches", option="target")


def solve_turns(form, target, *, rtol: float = 1e-12, max_iterations: int = 100) -> TurnsSolution:
    """Turns that give ``target`` inductance on ``form``, continuous and whole.

    Parameters
    ----------
    form : CoilForm
        Any object with ``inductance(turns)``, ``min_turns()``, ``max_turns()``
        and ``limit_reason(turns, lowest=False)``.
    target : float or array_like
        Target low-frequency inductance(s), H, > 0. An array is solved in one
        batched call.
    rtol : float
        Relative tolerance on N* (the bracket width when it stops).
    max_iterations : int
        Iteration cap of the root finder.

    Returns
    -------
    TurnsSolution

    Raises
    ------
    InfeasibleError
        A target below the inductance of the fewest turns the form allows (zero
        or less included), or above the most that fit (infinity included); the
        message names the limit in the user's terms.
    ValueError
        A target that is not a number (NaN).
    SolverError
        The iteration did not converge (a defect, not a user error).

    Notes
    -----
    Requires L(N) to rise monotonically with N on the bracket, which holds
    for every form (more turns of the same winding always add flux linkage).
    """
    targets = np.atleast_1d(np.asarray(target, dtype=float))
    if np.any(np.isnan(targets)):
        raise ValueError("target inductances must be numbers")
    _refuse_beyond_any_coil(form, targets)
    log_target = np.log(targets)
    low_turns = float(form.min_turns())
    high_turns, reason = _upper_bracket(form, log_target, low_turns)
    if high_turns < low_turns:
        raise InfeasibleError(f"not even {form.limit_reason(low_turns, lowest=True)} fits: "
                              f"{form.limit_reason(high_turns)}", option="target")
    log_low, log_high = _log_inductance(form, np.array([low_turns, high_turns]))
    evaluations = 1
    _check_bracket(form, targets, low_turns, high_turns, math.exp(log_low), math.exp(log_high), reason)
    log_target = np.clip(log_target, log_low, log_high)
    f_low = log_low - log_target
    f_high = log_high - log_target

    u, iterations = _illinois(lambda u: _log_inductance(form, np.exp(u)) - log_target,
                              np.full_like(targets, math.log(low_turns)), np.full_like(targets, math.log(high_turns)),
                              f_low.copy(), f_high.copy(), rtol, max_iterations)
    evaluations += iterations

    turns_exact = np.exp(u)
    return _whole_turns(form, targets, turns_exact, low_turns, high_turns,
                        iterations, evaluations, np.ndim(target) == 0)


def _illinois(function, a: np.ndarray, b: np.ndarray, fa: np.ndarray, fb: np.ndarray, rtol: float,
              max_iterations: int) -> tuple[np.ndarray, int]:
    """Roots of an increasing ``function`` of u = ln N, one per target, by the Illinois (modified regula falsi)
    iteration inside the brackets [a, b] with fa ≤ 0 ≤ fb; (u at the roots, iterations).

    ``function(u)`` takes the array of every target's u. A step that leaves the bracket or is not
    finite is replaced by the bracket's midpoint.
    """
    side = np.zeros(a.shape, dtype=np.int8)
    u = a.copy()
    iterations = 0
    done = (fa == 0) | (fb == 0)
    u = np.where(fa == 0, a, np.where(fb == 0, b, u))
    while iterations < max_iterations and not np.all(done):
        iterations += 1
        with np.errstate(divide="ignore", invalid="ignore"):
            u_new = (a * fb - b * fa) / (fb - fa)
        u_new = np.where(np.isfinite(u_new) & (u_new > a) & (u_new < b), u_new, 0.5 * (a + b))
        f_new = function(u_new)
        right = f_new * fb > 0  # root lies in [a, u_new]
        left = ~right
        # Illinois: halve the stale end's function value when one end repeats
        fa = np.where(right & (side == 1), 0.5 * fa, fa)
        fb = np.where(left & (side == -1), 0.5 * fb, fb)
        b = np.where(right, u_new, b)
        fb = np.where(right, f_new, fb)
        a = np.where(left, u_new, a)
        fa = np.where(left, f_new, fa)
        side = np.where(right, 1, -1).astype(np.int8)
        u = np.where(done, u, u_new)
        done = done | (np.abs(b - a) <= rtol) | (f_new == 0)
    if not np.all(done):
        raise SolverError(f"turns solver did not converge in {max_iterations} iterations")
    return u, iterations


def _whole_turns(form, targets, turns_exact, low_turns, high_turns,
                 iterations, evaluations, scalar) -> TurnsSolution:
    nearest = np.round(turns_exact)
    whole = np.abs(turns_exact - nearest) <= 1e-9 * np.maximum(nearest, 1.0)
    below = np.where(whole, nearest, np.floor(turns_exact))
    above = np.where(whole, nearest, below + 1.0)
    below = np.maximum(below, math.ceil(low_turns - 1e-9))
    above = np.minimum(above, math.floor(high_turns + 1e-9))
    above = np.maximum(above, below)
    pair = form.inductance(np.concatenate([below, above]))
    l_below, l_above = pair[: below.size], pair[below.size:]
    choose_above = np.abs(l_above - targets) < np.abs(l_below - targets)
    turns = np.where(choose_above, above, below)
    inductance = np.where(choose_above, l_above, l_below)

    def out(array, as_int=False):
        array = array.astype(np.int64) if as_int else array
        return array[0].item() if scalar else array

    return TurnsSolution(
        target=out(targets),
        turns_exact=out(turns_exact),
        turns=out(turns, True),
        turns_below=out(below, True),
        turns_above=out(above, True),
        inductance=out(inductance),
        inductance_below=out(l_below),
        inductance_above=out(l_above),
        iterations=iterations,
        evaluations=evaluations + 1,
        converged=True,
        message=f"converged in {iterations} iterations",
    )


def solve_apparent(form, targets, frequencies, drift=None, *, rtol: float = 1e-12,
                   max_iterations: int = 200) -> TurnsSolution:
    r"""Turns whose *apparent* inductance at each target's own frequency is the target, many at once.

    Below self-resonance a coil shows L_app = L_e/(1 − ω²·L_e·C(N)), with L_e = d·L(N) its inductance with
    the core's drift d at that frequency (docs/methods.md §10, §19). L_app rises with N to infinity at
    self-resonance, so ln L_app(N) − ln T has one root below it, found by the same Illinois iteration
    on u = ln N as :func:`solve_turns` uses (all targets at once, each with its own ω and d; beyond
    self-resonance the function is taken as large, so the bracket closes from above). A target at 0 Hz
    is the plain L(N) = T/d. Of the whole numbers either side the one closer in apparent inductance is
    chosen, as :func:`solve_turns` does for L.

    Parameters
    ----------
    form : CoilForm
        With ``self_capacitance(turns)`` where any frequency is above zero.
    targets, frequencies : array_like
        Apparent inductances wanted (H) and the frequency each is wanted at (Hz; 0: low frequency).
    drift : array_like, optional
        The core's L(f)/L(f_ref) at each target's frequency (1: air, or a core without a known class).

    Returns
    -------
    TurnsSolution
        Arrays; the inductances are the apparent ones at the targets' frequencies. ``turns_exact`` is NaN
        where no number of turns from the fewest to the most that fit shows the target below
        self-resonance, and ``turns`` where no whole number shows a finite inductance.
    """
    targets = np.atleast_1d(np.asarray(targets, dtype=float))
    omega2 = (2.0 * math.pi * np.broadcast_to(np.asarray(frequencies, dtype=float), targets.shape)) ** 2
    drift = np.broadcast_to(np.asarray(1.0 if drift is None else drift, dtype=float), targets.shape)
    lowest, top = float(form.min_turns()), float(search_turns(form)[0])
    log_target = np.log(targets)
    tuned = bool(np.any(omega2 > 0))

    def excess(u: np.ndarray) -> np.ndarray:
        """ln L_app(e^u) − ln T; beyond self-resonance a large positive number."""
        turns = np.exp(u)
        low = np.asarray(form.inductance(turns), dtype=float) * drift
        capacitance = np.asarray(form.self_capacitance(turns), dtype=float) if tuned else 0.0
        denominator = 1.0 - omega2 * low * capacitance
        with np.errstate(divide="ignore", invalid="ignore"):
            value = np.log(low / denominator) - log_target
        return np.where(denominator > 0, value, 50.0)

    # d·L(N) ≥ T means L_app(N) ≥ T: the low-frequency bracket of T/d closes the apparent one too
    high = _upper_bracket(form, log_target - np.log(drift), lowest)[0]
    a, b = np.full(targets.shape, math.log(lowest)), np.full(targets.shape, math.log(max(high, lowest)))
    fa, fb = excess(a), excess(b)
    reach = (fa <= 0) & (fb >= 0)
    u, _ = _illinois(excess, a, b, np.where(reach, fa, -1.0), np.where(reach, fb, 1.0), rtol, max_iterations)
    exact = np.where(reach, np.exp(u), np.nan)
    return _closest_apparent(form, targets, exact, omega2, drift, lowest, top)


def _closest_apparent(form, targets, exact, omega2, drift, lowest: float, top: float) -> TurnsSolution:
    """The whole numbers either side of ``exact`` and their apparent L; the closer one chosen."""
    columns = {name: np.full(targets.shape, np.nan) for name in ("turns", "below", "above", "shown", "l_below",
                                                                  "l_above")}
    where = np.flatnonzero(np.isfinite(exact))
    nearest = np.round(exact[where])
    whole = np.abs(exact[where] - nearest) <= 1e-9 * np.maximum(nearest, 1.0)
    below = np.clip(np.where(whole, nearest, np.floor(exact[where])), lowest, top)
    above = np.clip(np.where(whole, nearest, below + 1.0), lowest, top)
    candidates = np.concatenate([below, above])
    twice = np.concatenate([where, where])
    low = np.asarray(form.inductance(candidates), dtype=float) * drift[twice]
    capacitance = np.zeros(candidates.size)
    if np.any(omega2[where] > 0):
        capacitance = np.asarray(form.self_capacitance(candidates), dtype=float)
    denominator = 1.0 - omega2[twice] * low * capacitance
    with np.errstate(divide="ignore", invalid="ignore"):
        apparent = np.where(denominator > 0, low / denominator, np.nan)
    errors = np.nan_to_num(np.abs(apparent - targets[twice]), nan=np.inf)
    take_above = errors[where.size:] < errors[: where.size]
    chosen = np.where(take_above, apparent[where.size:], apparent[: where.size])
    columns["turns"][where] = np.where(np.isfinite(chosen), np.where(take_above, above, below), np.nan)
    columns["shown"][where] = chosen
    columns["below"][where], columns["above"][where] = below, above
    columns["l_below"][where], columns["l_above"][where] = apparent[: where.size], apparent[where.size:]
    return TurnsSolution(target=targets, turns_exact=exact, turns=columns["turns"], turns_below=columns["below"],
                         turns_above=columns["above"], inductance=columns["shown"],
                         inductance_below=columns["l_below"], inductance_above=columns["l_above"],
                         iterations=0, evaluations=0, converged=True, message="apparent inductance solved")
