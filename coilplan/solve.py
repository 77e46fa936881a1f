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

__all__ = ["SEARCH_LIMIT", "TurnsSolution", "search_turns", "solve_turns"]

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

    # Illinois iteration on u = ln N, all targets at once.
    a = np.full_like(targets, math.log(low_turns))
    b = np.full_like(targets, math.log(high_turns))
    fa, fb = f_low.copy(), f_high.copy()
    side = np.zeros(targets.shape, dtype=np.int8)
    u = a.copy()
    iterations = 0
    done = (fa == 0) | (fb == 0)
    u = np.where(fa == 0, a, np.where(fb == 0, b, u))
    while iterations < max_iterations and not np.all(done):
        iterations += 1
        with np.errstate(divide="ignore", invalid="ignore"):
            u_new = (a * fb - b * fa) / (fb - fa)
        u_new = np.where(np.isfinite(u_new) & (u_new > a) & (u_new < b), u_new, 0.5 * (a + b))
        f_new = _log_inductance(form, np.exp(u_new)) - log_target
        evaluations += 1
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

    turns_exact = np.exp(u)
    return _whole_turns(form, targets, turns_exact, low_turns, high_turns,
                        iterations, evaluations, np.ndim(target) == 0)


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
