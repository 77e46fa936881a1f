r"""The kit's evaluation: every coil type on every stock item with every reel's wire, and why a pair fails.

Each stock item (:mod:`coilplan.kit.stock`: a former, ring core, ferrite rod, gapped
core or bobbin as its coil form) is built once with each wire on the reels, and
:func:`coilplan.solve.solve_turns` finds the turns of every coil type in one batched call.
A coil with an operating frequency f is solved for its apparent inductance there,
:math:`L_{app} = L/(1 - \omega^2 L C)`, by :func:`coilplan.solve.solve_apparent`, the same batched
solve the form commands use (the whole number closest in apparent inductance is kept).
A winding is rejected when the turns do not fit, the coil self-resonates below f, the nearest
whole number of turns misses the tolerance, a cored form (toroid, rod, gapped core) runs at or above
:data:`coilplan.saturation.NEAR_SATURATION` of its saturation flux density at the coil's current,
or the coil's tap does not fall inside the winding.
Every wire that works is kept as a winding option of the pair, with its cost levels.
"""

from __future__ import annotations

import functools
import math
import warnings
from dataclasses import dataclass, field
from typing import NamedTuple

import numpy as np

from coilplan.core_frequency import core_drift, core_resistance_batch
from coilplan.errors import CoilplanWarning, InvalidInputError
from coilplan.kit.share_numbers import CLOSENESS_STEP, Q_STEPS
from coilplan.kit.stock import StockItem, build_form, core_spectrum, plan_wires, stock_items, winding_limit
from coilplan.physics.frequency import q_factor
from coilplan.quantities import format_quantity
from coilplan.saturation import NEAR_SATURATION
from coilplan.solve import solve_apparent

__all__ = ["OPTION_FIELDS", "Candidate", "Evaluation", "evaluate_plan"]


class Candidate(NamedTuple):
    """One winding of a coil type on a stock item with one of the reels' wires (a light record: there are many)."""

    coil: int
    stock: int
    wire: int
    turns: int
    inductance: float  # low frequency, H
    apparent_inductance: float  # at the operating frequency (= inductance without one), H
    wire_length: float  # to cut, margin included, m
    q: float | None
    closeness: float = 0.0  # |L_app - target| / target
    q_cost: float = 0.0  # 1/(1+Q), 0 without an operating frequency
    tap: int | None = None  # the tap's turn, counted from the start of the winding


#: The arrays an evaluation keeps of its winding options (one entry per option, pair by pair).
OPTION_FIELDS = ("coil", "stock", "wire", "turns", "inductance", "apparent_inductance", "length", "closeness",
                 "q_cost", "q", "tap")


@dataclass
class Evaluation:
    """Every coil type against every stock item: the winding options, their costs and the reasons.

    The options are kept as arrays (``arrays``, :data:`OPTION_FIELDS`), each pair's options together and
    cheapest first (wire to 1 mm, then closeness, then Q); :class:`Candidate` records are made from
    them on demand (``flat``, :meth:`options_of`).
    """

    plan: object
    stock: list[StockItem]
    wires: list[tuple[str, str, object]]  # (text, grade, nominal wire) per distinct reel wire
    reasons: dict[tuple[int, int], object]  # text, or (function, arguments): read them with reason()
    wire_length: np.ndarray  # (coil types, stock items), m, of the cheapest wire; inf where infeasible
    closeness: np.ndarray
    q_cost: np.ndarray  # 1/(1+Q), 0 without an operating frequency
    forms: dict[tuple[int, int], object] = field(default_factory=dict)  # (stock, wire) -> the form built
    arrays: dict[str, np.ndarray] = field(default_factory=dict)

    @property
    def feasible(self) -> np.ndarray:
        return np.isfinite(self.wire_length)

    def reason(self, coil: int, stock: int) -> str:
        """Why coil type ``coil`` cannot go on stock item ``stock``, in words ("" when it can)."""
        if self.feasible[coil, stock]:
            return ""
        return _text(self.reasons.get((coil, stock), "no winding found"))

    def candidate(self, index: int) -> Candidate:
        """The option at ``index`` (of the arrays) as a record."""
        a = self.arrays
        q = float(a["q"][index])
        tap = int(a["tap"][index])
        return Candidate(int(a["coil"][index]), int(a["stock"][index]), int(a["wire"][index]),
                         int(a["turns"][index]), float(a["inductance"][index]),
                         float(a["apparent_inductance"][index]), float(a["length"][index]),
                         None if math.isnan(q) else q, float(a["closeness"][index]), float(a["q_cost"][index]),
                         None if tap < 0 else tap)

    @functools.cached_property
    def flat(self) -> list[Candidate]:
        """Every option as a record, in the arrays' order."""
        return [self.candidate(index) for index in range(self.arrays["coil"].size)]

    @functools.cached_property
    def _pairs(self) -> dict[tuple[int, int], tuple[int, int]]:
        a = self.arrays
        pair = a["coil"] * max(len(self.stock), 1) + a["stock"]
        if pair.size == 0:
            return {}
        starts = np.flatnonzero(np.r_[True, pair[1:] != pair[:-1]])
        stops = np.r_[starts[1:], pair.size]
        return {(int(a["coil"][i]), int(a["stock"][i])): (int(i), int(j)) for i, j in zip(starts, stops, strict=True)}

    def options_of(self, coil: int, stock: int) -> list[Candidate]:
        """Every wire that works for coil type ``coil`` on stock item ``stock``, cheapest first."""
        start, stop = self._pairs.get((coil, stock), (0, 0))
        return [self.candidate(index) for index in range(start, stop)]


def _text(reason) -> str:
    """A reason kept as text or as (function, arguments) that writes it (formatted only when it is read)."""
    if isinstance(reason, tuple):
        return reason[0](*reason[1:])
    return str(reason)


# --- evaluation --------------------------------------------------------------------------------------


def _single_turn_too_much(smallest: float, wanted: float) -> str:
    return (f"a single turn already gives {format_quantity(smallest, 'H')}, above the "
            f"{format_quantity(wanted, 'H')} wanted")


def _beyond_the_form(wanted: float, largest: float, form, top: int) -> str:
    return (f"needs {format_quantity(wanted, 'H')}, above the {format_quantity(largest, 'H')} of "
            f"{form.limit_reason(top)}")


def _self_resonant(frequency: float, turns: int) -> str:
    return f"self-resonates below its {format_quantity(frequency, 'Hz')} operating frequency at {turns} turns"


def _outside_tolerance(below: int, above: int, got_below: float, got_above: float, tolerance: float) -> str:
    return (f"the nearest whole turns ({below} or {above}) give {format_quantity(got_below, 'H')} or "
            f"{format_quantity(got_above, 'H')}, outside ±{tolerance:.1%}")


def _saturates(current: float, flux: float, limit: float) -> str:
    return (f"at {format_quantity(current, 'A')} the core would run at {format_quantity(flux, 'T')}, "
            f"{flux / limit:.0%} of its {format_quantity(limit, 'T')} saturation")


def _with_wire(label: str, reason) -> str:
    return f"with {label}: {_text(reason)}"


def _solve_on_form(form, targets, frequency, tolerance, current, drift=None):
    """Turns and figures for every coil on one form; (arrays, reasons) with NaN turns where rejected.

    The turns are the commands' own: :func:`coilplan.solve.solve_apparent`, the batched solve of the
    apparent inductance at each coil's frequency with the core's drift there (``drift``, per coil:
    L(f)/L(0)). A reason is kept as (function, arguments) and written only when a message needs it
    (most are never read).
    """
    count = targets.size
    drift = np.ones(count) if drift is None else np.asarray(drift, dtype=float)
    reasons: dict[int, object] = {}
    turns = np.full(count, np.nan)
    top = winding_limit(form)
    if top < 1:
        return turns, dict.fromkeys(range(count), f"not one turn fits: {form.limit_reason(1.0)}"), None
    smallest, largest = (float(v) for v in form.inductance(np.array([1.0, float(top)])))
    low_target = targets / drift
    at = frequency if hasattr(form, "self_capacitance") else np.zeros(count)
    solution = solve_apparent(form, targets, at, drift)
    for index in np.flatnonzero(low_target < smallest).tolist():
        reasons[index] = (_single_turn_too_much, smallest, float(targets[index]))
    for index in np.flatnonzero(low_target > largest).tolist():
        reasons[index] = (_beyond_the_form, float(targets[index]), largest, form, top)
    unreached = ~np.isfinite(solution.turns) & ~np.isin(np.arange(count), list(reasons))
    for index in np.flatnonzero(unreached).tolist():
        reasons[index] = (_self_resonant, float(frequency[index]), int(min(top, np.nan_to_num(
            solution.turns_above[index], nan=top))))
    where = np.flatnonzero(np.isfinite(solution.turns) & ~np.isin(np.arange(count), list(reasons)))
    if where.size == 0:
        return turns, reasons, None
    chosen = solution.turns[where]
    apparent = solution.inductance[where]
    closeness = np.abs(apparent - targets[where]) / targets[where]
    for position in np.flatnonzero(closeness > tolerance[where]).tolist():
        index = int(where[position])
        reasons[index] = (_outside_tolerance, int(solution.turns_below[index]), int(solution.turns_above[index]),
                          float(solution.inductance_below[index]), float(solution.inductance_above[index]),
                          float(tolerance[index]))
    if hasattr(form, "flux_density") and form.saturation_flux_density:
        flux = np.asarray(form.flux_density(chosen, current[where]), dtype=float)
        limit = float(form.saturation_flux_density)
        for position in np.flatnonzero((current[where] > 0) & (flux >= NEAR_SATURATION * limit)).tolist():
            reasons.setdefault(int(where[position]), (_saturates, float(current[where[position]]),
                                                      float(flux[position]), limit))
    turns[where] = chosen
    extra = {"apparent": apparent, "closeness": closeness, "where": where}
    return turns, reasons, extra


def _tap_too_far(tap: int, turns: int) -> str:
    return f"the tap at turn {tap} needs more than the {turns} turns of this winding"


def _tap_on_one_turn() -> str:
    return "a tap needs at least 2 turns; this winding has 1"


def _taps(coils, tapped, selected, turns):
    """The tap's turn for each chosen coil (−1: none asked), and the reasons where it cannot be placed.

    A fraction is rounded to the nearest whole turn, kept at least one turn from either end.
    """
    taps = np.full(turns.size, -1, dtype=np.int64)
    reasons: dict[int, object] = {}
    for position in np.flatnonzero(tapped[selected]).tolist():
        coil, n = coils[int(selected[position])], int(turns[position])
        if coil.tap_turns is not None:
            if coil.tap_turns >= n:
                reasons[position] = (_tap_too_far, coil.tap_turns, n)
            else:
                taps[position] = coil.tap_turns
        elif n < 2:
            reasons[position] = (_tap_on_one_turn,)
        else:
            taps[position] = min(max(math.floor(coil.tap_fraction * n + 0.5), 1), n - 1)
    return taps, reasons


def evaluate_plan(plan, progress=None) -> Evaluation:
    """Every coil type of ``plan`` against every stock item, with each wire on the reels.

    Parameters
    ----------
    plan : Plan
    progress : callable, optional
        Called with 1 after each stock item (for a progress bar).

    Returns
    -------
    Evaluation
    """
    with warnings.catch_warnings():  # the models' range warnings are given for the chosen windings only
        warnings.simplefilter("ignore", CoilplanWarning)
        return _evaluate(plan, progress)


def _evaluate(plan, progress) -> Evaluation:
    settings = plan.settings
    stock = stock_items(plan)
    wires = plan_wires(plan)
    coils = plan.coil
    targets = np.array([coil.target_inductance for coil in coils])
    frequency = np.array([coil.operating_frequency or 0.0 for coil in coils])
    tolerance = np.array([coil.tolerance for coil in coils])
    current = np.array([coil.current for coil in coils])
    tapped = np.array([coil.tapped for coil in coils], dtype=bool)
    shape = (len(coils), len(stock))
    wire_length = np.full(shape, np.inf)
    closeness = np.full(shape, np.inf)
    q_cost = np.full(shape, np.inf)
    reasons: dict[tuple[int, int], object] = {}
    forms: dict[tuple[int, int], object] = {}
    kept: list[tuple] = []  # per stock item, the arrays of its options in order
    for s, item in enumerate(stock):
        allowed = np.array([item.form_name in coil.forms for coil in coils])
        for c in np.flatnonzero(~allowed):
            reasons[(int(c), s)] = f"not allowed: the coil takes {', '.join(coils[c].forms)} only"
        chosen = np.flatnonzero(allowed)
        found: list[tuple] = []  # per wire: the arrays of its windings that work
        for w, (_, _, wire) in enumerate(wires if chosen.size else []):
            try:
                form = build_form(item, wire, settings)
            except InvalidInputError as error:
                for c in chosen:
                    reasons.setdefault((int(c), s), f"{wire.label} wire does not suit it: expected {error.expected}")
                continue
            forms[(s, w)] = form
            spectrum = core_spectrum(item, form)
            drift = None if spectrum is None else core_drift(form, spectrum, frequency[chosen])
            turns, why, extra = _solve_on_form(form, targets[chosen], frequency[chosen], tolerance[chosen],
                                               current[chosen], drift)
            if extra is not None:
                good = ~np.isin(extra["where"], np.fromiter(why, dtype=np.int64, count=len(why)))
                taps, tap_why = _taps(coils, tapped, chosen[extra["where"]], turns[extra["where"]])
                for position, text in tap_why.items():
                    why.setdefault(int(extra["where"][position]), text)
                    good[position] = False
            for local, reason in why.items():
                key = (int(chosen[local]), s)
                if key not in reasons:
                    reasons[key] = (_with_wire, wire.label, reason)
            if extra is None or not good.any():
                continue
            local = extra["where"][good]
            n = turns[local]
            length = np.asarray(form.wire_length(n), dtype=float) * (1.0 + settings.wire_margin)
            f = frequency[chosen][local]
            safe_f = np.where(f > 0, f, 1.0)
            lows = np.asarray(form.inductance(n), dtype=float)
            with np.errstate(divide="ignore", invalid="ignore"):
                resistance = np.asarray(form.ac_resistance(n, safe_f, settings.temperature_C))
                own = lows
                if spectrum is not None:  # the core's µ' and its own loss at each coil's frequency
                    own = lows * drift[local]
                    resistance = resistance + core_resistance_batch(form, spectrum, own, safe_f)
                q = np.where(f > 0, q_factor(own, resistance, safe_f), np.nan)
            q_term = np.where(np.isfinite(q), 1.0 / (1.0 + q), 0.0)
            found.append((chosen[local], np.full(local.size, w), n, lows, extra["apparent"][good], length,
                          extra["closeness"][good], q_term, q, taps[good]))
        if found:
            columns = [np.concatenate(column) for column in zip(*found, strict=True)]
            c_all, w_all, _, _, _, cut_all, near_all, q_part_all, _, _ = columns
            # each pair's wires cheapest first: wire to 1 mm, then closeness, then Q; the first wire of equals first
            order = np.lexsort((w_all, np.rint(q_part_all * Q_STEPS), np.rint(near_all / CLOSENESS_STEP),
                                np.rint(cut_all / 1e-3), c_all))
            columns = [column[order] for column in columns]
            kept.append((columns[0], np.full(order.size, s), *columns[1:]))
            c_sorted = columns[0]
            first = np.flatnonzero(np.r_[True, c_sorted[1:] != c_sorted[:-1]])
            best_coils = c_sorted[first]
            wire_length[best_coils, s] = columns[5][first]
            closeness[best_coils, s] = columns[6][first]
            q_cost[best_coils, s] = columns[7][first]
        if progress is not None:
            progress(1)
    # found's columns: coil, wire, turns, L, L at f, length, closeness, Q cost, Q, tap; kept adds the stock second
    kinds = (np.int64, np.int64, np.int64, np.int64, float, float, float, float, float, float, np.int64)
    arrays = {name: (np.concatenate([entry[k] for entry in kept]).astype(kind) if kept else np.zeros(0, kind))
              for k, (name, kind) in enumerate(zip(OPTION_FIELDS, kinds, strict=True))}
    return Evaluation(plan, stock, wires, reasons, wire_length, closeness, q_cost, forms, arrays)
