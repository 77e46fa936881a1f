r"""The kit planner's work: every coil on every stock item, then the best assignment under the counts.

1. **Evaluate.** Each stock item (a former as a single-layer :class:`~coilplan.forms.Solenoid`, a ring
   core as a :class:`~coilplan.forms.Toroid`) is built once with each wire on the reels, and
   :func:`coilplan.solve.solve_turns` finds the turns of every coil type in one batched call.
   A coil with an operating frequency f is solved for its apparent inductance there,
   :math:`L_{app} = L/(1 - \omega^2 L C)` (the small-R limit that :class:`coilplan.apparent.ApparentForm`
   uses), by a fixed-point on the low-frequency target :math:`L = L_{app}/(1 + \omega^2 L_{app} C(N))`
   (one correction and a second batched solve; the whole numbers round it are then checked at f directly
   and the closest kept).
   A pair is rejected when the turns do not fit, the coil self-resonates below f, the nearest
   whole number of turns misses the tolerance, or the core runs at or above
   :data:`coilplan.saturation.NEAR_SATURATION` of its saturation flux density at the coil's current.
   Of the wires that work, each pair keeps the one with the lowest cost (below).

2. **Assign.** One row per coil unit, one column per stock unit, plus one "not placed" column per row;
   :func:`scipy.optimize.linear_sum_assignment` minimises the total of a lexicographic weighted cost:
   first the number of coils left unplaced, then the wire used (to ``wire_resolution_m``, 1 mm
   unless the plan is too large for that to stay exact in float64), then the closeness to target
   (:math:`|L - L_{target}|/L_{target}` in steps of 0.1 %), then the Q at the operating frequency
   (:math:`1/(1+Q)` in steps of 0.001). Each level's weight exceeds the largest total the levels below it
   can reach over all rows, and every cost is a whole number below 2⁵³, so the order is exact. A plan
   too large for that drops the Q level first (``q_in_objective`` false), then counts the wire in
   coarser steps (1 cm, 10 cm ...).

3. **Wire.** The lengths to cut (computed length plus the wire margin) are allocated to the reels of
   their wire by first-fit decreasing: the longest piece first, each to the first reel (in plan order)
   that still holds it. What fits on no reel is that wire's shortfall.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass, field
from typing import NamedTuple

import numpy as np

from coilplan.errors import CoilplanWarning, InfeasibleError, InvalidInputError
from coilplan.forms import Solenoid, Toroid
from coilplan.physics.frequency import apparent_inductance_and_resistance, q_factor
from coilplan.quantities import format_length, format_quantity
from coilplan.saturation import NEAR_SATURATION
from coilplan.solve import solve_turns
from coilplan.wire import Wire, parse_wire

__all__ = [
    "Candidate",
    "Evaluation",
    "KitResult",
    "Placement",
    "StockItem",
    "allocate_wire",
    "assign_units",
    "build_form",
    "captured",
    "cost_levels",
    "evaluate_plan",
    "plan_kit",
    "wire_key",
]

#: Closeness to target is counted in steps of this fraction (0.1 %).
CLOSENESS_STEP = 1e-3
#: Q enters as 1/(1+Q) in steps of 1/Q_STEPS (the last, weakest level: at Q = 70 a step is a Q of about 5).
Q_STEPS = 1000
_EXACT = 2.0**53


@dataclass(frozen=True)
class StockItem:
    """One line of stock: a former or a ring core, how many, and its label for messages."""

    kind: str  # "former" or "toroid"
    index: int  # 0-based within its table
    label: str
    count: int
    spec: object


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


@dataclass
class Evaluation:
    """Every coil type against every stock item: feasibility, the cost levels and the reasons."""

    plan: object
    stock: list[StockItem]
    wires: list[tuple[str, str, Wire]]  # (text, grade, nominal wire) per distinct reel wire
    candidates: dict[tuple[int, int], Candidate]  # the cheapest wire of each feasible pair
    options: dict[tuple[int, int], list[Candidate]]  # every wire that works, cheapest first
    reasons: dict[tuple[int, int], object]  # text, or a function giving it: read them with reason()
    wire_length: np.ndarray  # (coil types, stock items), m; inf where infeasible
    closeness: np.ndarray
    q_cost: np.ndarray  # 1/(1+Q), 0 without an operating frequency

    @property
    def feasible(self) -> np.ndarray:
        return np.isfinite(self.wire_length)

    def reason(self, coil: int, stock: int) -> str:
        """Why coil type ``coil`` cannot go on stock item ``stock``, in words ("" when it can)."""
        if self.feasible[coil, stock]:
            return ""
        return _text(self.reasons.get((coil, stock), "no winding found"))


@dataclass(frozen=True)
class Placement:
    """Some units of one coil type on one stock item, with what the winding card needs."""

    coil: int
    stock: int
    quantity: int
    candidate: Candidate
    form: object


@dataclass
class KitResult:
    """The planned kit: the placements, the wire allocation and what could not be done."""

    evaluation: Evaluation
    placements: list[Placement]
    unit_assignment: list[int | None]  # per coil unit: the stock unit's column, or None
    objective: tuple[int, int, int, int]  # (unplaced, wire units, closeness steps, Q steps)
    wire_resolution_m: float
    q_in_objective: bool
    reels: list[dict] = field(default_factory=list)
    shortfall: dict[str, float] = field(default_factory=dict)
    unplaced: list[str] = field(default_factory=list)

    @property
    def complete(self) -> bool:
        return not self.unplaced and not self.shortfall


def _text(reason) -> str:
    """A reason kept as text or as a function that writes it (formatted only when it is read)."""
    return reason() if callable(reason) else str(reason)


# --- evaluation --------------------------------------------------------------------------------------


def _stock(plan) -> list[StockItem]:
    items = []
    for kind in ("former", "toroid"):
        for index, spec in enumerate(getattr(plan, kind)):
            label = f"{kind} {spec.name!r}" if spec.name else f"{kind}[{index + 1}]"
            items.append(StockItem(kind, index, label, spec.count, spec))
    return items


def _wires(plan) -> list[tuple[str, str, Wire]]:
    seen: dict[tuple[str, str], Wire] = {}
    for reel in plan.reel:
        key = (reel.wire, reel.grade)
        if key not in seen:
            seen[key] = parse_wire(reel.wire, grade=reel.grade, option="wire")
    return [(text, grade, wire) for (text, grade), wire in seen.items()]


def build_form(item: StockItem, wire: Wire, settings):
    """The coil form of ``item`` wound with ``wire`` by hand (pitch = overall diameter / packing).

    Raises
    ------
    InvalidInputError
        The wire does not suit the item (too thick for the hole or the former).
    """
    hand = Wire(label=wire.label, series=wire.series, diameter=wire.diameter,
                overall_diameter=wire.overall_diameter / settings.packing, grade="measured")
    spec = item.spec
    if item.kind == "former":
        return Solenoid(diameter=spec.diameter + wire.overall_diameter, wire=hand, max_length=spec.length,
                        lead=settings.lead)
    mu_r, bsat = None, None
    if spec.material is not None:
        from coilplan.materials import material

        chosen = material(spec.material)
        mu_r = chosen.mu_initial
        limit = chosen.saturation_flux_density(settings.temperature_C)
        bsat = None if limit is None else float(limit)
    return Toroid(inner_diameter=spec.id, outer_diameter=spec.od, height=spec.height, wire=hand, al=spec.al,
                  al_basis="given AL value" if spec.al is not None else f"material {spec.material}",
                  mu_r=None if spec.al is not None else mu_r, saturation_flux_density=bsat, lead=settings.lead)


def _apparent(form, turns, frequency):
    """L at the operating frequency (small-R limit; NaN at or above self-resonance), vectorised."""
    low = np.asarray(form.inductance(turns), dtype=float)
    capacitance = np.asarray(form.self_capacitance(turns), dtype=float)
    omega2 = (2.0 * np.pi * frequency) ** 2
    apparent, _ = apparent_inductance_and_resistance(frequency, low, 0.0, capacitance)
    return np.where(1.0 - omega2 * low * capacitance > 0, apparent, np.nan), low


def _solve_on_form(form, targets, frequency, tolerance, current, settings):
    """Turns and figures for every coil on one form; (arrays, reasons) with NaN turns where rejected."""
    count = targets.size
    reasons: dict[int, str] = {}
    turns = np.full(count, np.nan)
    top = math.floor(float(form.max_turns()) + 1e-9)
    if top < 1:
        return turns, dict.fromkeys(range(count), f"not one turn fits: {form.limit_reason(1.0)}"), None
    smallest, largest = (float(v) for v in form.inductance(np.array([1.0, float(top)])))
    low_target = targets.copy()
    exact = np.full(count, np.nan)

    def solve(selected):
        selected = selected & (low_target >= smallest) & (low_target <= largest)
        exact[selected] = np.nan
        if selected.any():
            exact[selected] = np.atleast_1d(solve_turns(form, low_target[selected]).turns_exact)

    solve(np.ones(count, dtype=bool))
    tuned = (frequency > 0) & np.isfinite(exact)
    if tuned.any() and hasattr(form, "self_capacitance"):  # one fixed-point correction for the self-capacitance
        capacitance = np.asarray(form.self_capacitance(exact[tuned]), dtype=float)
        omega2 = (2.0 * np.pi * frequency[tuned]) ** 2
        low_target[tuned] = targets[tuned] / (1.0 + omega2 * targets[tuned] * capacitance)
        solve(tuned)
    # the reasons are formatted only when a message needs them (most are never read)
    for index in np.flatnonzero(low_target < smallest):
        reasons[int(index)] = lambda t=float(targets[index]): (
            f"a single turn already gives {format_quantity(smallest, 'H')}, above the {format_quantity(t, 'H')} wanted")
    for index in np.flatnonzero(low_target > largest):
        reasons[int(index)] = lambda t=float(targets[index]): (
            f"needs {format_quantity(t, 'H')}, above the {format_quantity(largest, 'H')} of "
            f"{form.limit_reason(float(top))}")
    inside = np.isfinite(exact)
    if not inside.any():
        return turns, reasons, None
    where = np.flatnonzero(inside)
    f = frequency[where]
    wanted = targets[where]
    # the whole numbers round the solution (two more either side absorb what the one correction leaves)
    base = np.floor(exact[where] + 1e-9)
    trial = np.clip(base[None, :] + np.arange(-1.0, 3.0)[:, None], 1.0, float(top))
    trial_apparent = np.vstack([_apparent(form, row, f)[0] for row in trial])
    errors = np.nan_to_num(np.abs(trial_apparent - wanted), nan=np.inf)
    best_row = np.argmin(errors, axis=0)
    columns = np.arange(where.size)
    chosen = trial[best_row, columns]
    apparent = trial_apparent[best_row, columns]
    below, above = trial[1], trial[2]
    app_below, app_above = trial_apparent[1], trial_apparent[2]
    closeness = np.abs(apparent - wanted) / wanted
    for position, index in enumerate(where):
        if not np.isfinite(apparent[position]):
            reasons[int(index)] = lambda f=float(f[position]), n=int(chosen[position]): (
                f"self-resonates below its {format_quantity(f, 'Hz')} operating frequency at {n} turns")
        elif closeness[position] > tolerance[index]:
            reasons[int(index)] = lambda n=(int(below[position]), int(above[position])), got=(
                    float(app_below[position]), float(app_above[position])), tol=float(tolerance[index]): (
                f"the nearest whole turns ({n[0]} or {n[1]}) give {format_quantity(got[0], 'H')} or "
                f"{format_quantity(got[1], 'H')}, outside ±{tol:.1%}")
    if hasattr(form, "flux_density") and form.saturation_flux_density:
        flux = np.asarray(form.flux_density(chosen, current[where]), dtype=float)
        limit = float(form.saturation_flux_density)
        for position, index in enumerate(where):
            if current[index] > 0 and flux[position] >= NEAR_SATURATION * limit and int(index) not in reasons:
                reasons[int(index)] = (f"at {format_quantity(current[index], 'A')} the core would run at "
                                       f"{format_quantity(flux[position], 'T')}, {flux[position] / limit:.0%} of "
                                       f"its {format_quantity(limit, 'T')} saturation")
    turns[where] = chosen
    extra = {"apparent": apparent, "closeness": closeness, "where": where}
    return turns, reasons, extra


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
    settings = plan.settings
    stock = _stock(plan)
    wires = _wires(plan)
    coils = plan.coil
    targets = np.array([coil.target_inductance for coil in coils])
    frequency = np.array([coil.operating_frequency or 0.0 for coil in coils])
    tolerance = np.array([coil.tolerance for coil in coils])
    current = np.array([coil.current for coil in coils])
    shape = (len(coils), len(stock))
    wire_length = np.full(shape, np.inf)
    closeness = np.full(shape, np.inf)
    q_cost = np.full(shape, np.inf)
    candidates: dict[tuple[int, int], Candidate] = {}
    options: dict[tuple[int, int], list[Candidate]] = {}
    reasons: dict[tuple[int, int], str] = {}
    form_name = {"former": "solenoid", "toroid": "toroid"}
    for s, item in enumerate(stock):
        allowed = np.array([form_name[item.kind] in coil.forms for coil in coils])
        for c in np.flatnonzero(~allowed):
            reasons[(int(c), s)] = f"not allowed: the coil takes {', '.join(coils[c].forms)} only"
        ranked_options: dict[int, list[tuple[tuple[int, int, int], Candidate]]] = {}
        best: dict[int, tuple[int, int, int]] = {}
        for w, (_, _, wire) in enumerate(wires):
            try:
                form = build_form(item, wire, settings)
            except InvalidInputError as error:
                for c in np.flatnonzero(allowed):
                    reasons.setdefault((int(c), s), f"{wire.label} wire does not suit it: expected {error.expected}")
                continue
            chosen = np.flatnonzero(allowed)
            if chosen.size == 0:
                break
            turns, why, extra = _solve_on_form(form, targets[chosen], frequency[chosen], tolerance[chosen],
                                               current[chosen], settings)
            for local, reason in why.items():
                reasons.setdefault((int(chosen[local]), s),
                                   lambda r=reason, label=wire.label: f"with {label}: {_text(r)}")
            if extra is None:
                continue
            good = [p for p, local in enumerate(extra["where"]) if int(local) not in why]
            if not good:
                continue
            local = extra["where"][good]
            n = turns[local]
            length = np.asarray(form.wire_length(n), dtype=float) * (1.0 + settings.wire_margin)
            f = frequency[chosen][local]
            with np.errstate(divide="ignore", invalid="ignore"):
                resistance = np.asarray(form.ac_resistance(n, np.where(f > 0, f, 1.0), settings.temperature_C))
                q = np.where(f > 0, q_factor(form.inductance(n), resistance, np.where(f > 0, f, 1.0)), np.nan)
            lows = np.asarray(form.inductance(n), dtype=float)
            q_term = np.where(np.isfinite(q), 1.0 / (1.0 + q), 0.0)
            close = extra["closeness"][good]
            ranks = zip(np.rint(length / 1e-3).astype(np.int64).tolist(),
                        np.rint(close / CLOSENESS_STEP).astype(np.int64).tolist(),
                        np.rint(q_term * Q_STEPS).astype(np.int64).tolist(), strict=True)
            q_values = [None if not math.isfinite(value) else value for value in q.tolist()]
            rows = zip(chosen[local].tolist(), ranks, n.astype(np.int64).tolist(), lows.tolist(),
                       extra["apparent"][good].tolist(), length.tolist(), close.tolist(), q_term.tolist(), q_values,
                       strict=True)
            for c, ranked, whole, low, app, cut, near, q_part, q_value in rows:
                candidate = Candidate(c, s, w, whole, low, app, cut, q_value)
                if c not in best or ranked < best[c]:
                    best[c] = ranked
                    wire_length[c, s], closeness[c, s], q_cost[c, s] = cut, near, q_part
                ranked_options.setdefault(c, []).append((ranked, candidate))
        for c, ranked in ranked_options.items():
            ranked.sort(key=lambda item: item[0])  # stable: the first of equals stays first
            options[(c, s)] = [candidate for _, candidate in ranked]
            candidates[(c, s)] = options[(c, s)][0]
            reasons.pop((c, s), None)
        if progress is not None:
            progress(1)
    return Evaluation(plan, stock, wires, candidates, options, reasons, wire_length, closeness, q_cost)


# --- assignment -------------------------------------------------------------------------------------


def cost_levels(evaluation: Evaluation, wire_resolution: float, with_q: bool = True):
    """Whole-number cost levels per (coil type, stock item): wire units, closeness steps, Q steps."""
    feasible = evaluation.feasible
    wire_units = np.where(feasible, np.rint(np.where(feasible, evaluation.wire_length, 0) / wire_resolution), 0)
    close_units = np.where(feasible, np.rint(np.where(feasible, evaluation.closeness, 0) / CLOSENESS_STEP), 0)
    q_units = np.where(feasible & with_q, np.rint(np.where(feasible, evaluation.q_cost, 0) * Q_STEPS), 0)
    return wire_units.astype(np.int64), close_units.astype(np.int64), q_units.astype(np.int64)


def _weights(rows: int, wire_units, close_units, q_units):
    """Level weights (w_wire, w_close, w_q) and the 'not placed' cost, each above what the levels below sum to."""
    w_q = 1
    w_close = rows * int(q_units.max(initial=0)) + 1
    w_wire = w_close * (rows * int(close_units.max(initial=0)) + 1) + rows * int(q_units.max(initial=0))
    largest_row = w_wire * int(wire_units.max(initial=0)) + w_close * int(close_units.max(initial=0)) + \
        int(q_units.max(initial=0))
    unplaced = rows * largest_row + 1
    return w_wire, w_close, w_q, unplaced, rows * unplaced


def assign_units(evaluation: Evaluation):
    """The optimal unit assignment.

    Returns (per coil unit the stock unit's column or None, the objective (unplaced, wire units,
    closeness steps, Q steps), the wire resolution in m, whether Q took part, the coil type of each
    row, the stock item of each column).

    The expanded matrix has one row per coil unit and one column per stock unit, then one
    "not placed" column per row; infeasible cells are forbidden (infinite cost).
    """
    from scipy.optimize import linear_sum_assignment

    coils = evaluation.plan.coil
    row_type = np.repeat(np.arange(len(coils)), [coil.count for coil in coils])
    col_type = np.repeat(np.arange(len(evaluation.stock)), [item.count for item in evaluation.stock])
    rows = row_type.size
    resolution, with_q = 1e-3, True
    while True:
        levels = cost_levels(evaluation, resolution, with_q)
        w_wire, w_close, w_q, unplaced_cost, bound = _weights(rows, *levels)
        if bound < _EXACT:
            break
        if with_q:
            with_q = False
        else:
            resolution *= 10.0
    wire_units, close_units, q_units = levels
    type_cost = (wire_units * w_wire + close_units * w_close + q_units * w_q).astype(float)
    type_cost[~evaluation.feasible] = np.inf
    real = type_cost[np.ix_(row_type, col_type)] if col_type.size else np.zeros((rows, 0))
    dummy = np.full((rows, rows), np.inf)
    np.fill_diagonal(dummy, float(unplaced_cost))
    matrix = np.hstack([real, dummy])
    picked_rows, picked_cols = linear_sum_assignment(matrix)
    assignment: list[int | None] = [None] * rows
    for r, c in zip(picked_rows, picked_cols, strict=True):
        assignment[int(r)] = int(c) if c < col_type.size else None
    objective = _objective(assignment, row_type, col_type, levels)
    return assignment, objective, resolution, with_q, row_type, col_type


def _objective(assignment, row_type, col_type, levels) -> tuple[int, int, int, int]:
    wire_units, close_units, q_units = levels
    unplaced = sum(1 for column in assignment if column is None)
    totals = [0, 0, 0]
    for row, column in enumerate(assignment):
        if column is None:
            continue
        cell = (row_type[row], col_type[column])
        totals[0] += int(wire_units[cell])
        totals[1] += int(close_units[cell])
        totals[2] += int(q_units[cell])
    return unplaced, *totals


# --- wire ----------------------------------------------------------------------------------------


def allocate_wire(pieces: list[tuple[str, float]], reels: list[dict]) -> list[int]:
    """First-fit decreasing: each piece (wire key, length), longest first, to the first reel of its wire that holds it.

    ``reels`` is updated in place (``used_m``, ``pieces``); returns the indices of the pieces placed.

    Examples
    --------
    >>> reels = [{"wire": "a", "length_m": 6.0, "used_m": 0.0, "pieces": 0},
    ...          {"wire": "a", "length_m": 5.0, "used_m": 0.0, "pieces": 0}]
    >>> sorted(allocate_wire([("a", 2.0), ("a", 4.0), ("a", 3.0)], reels)), [reel["used_m"] for reel in reels]
    ([0, 1, 2], [6.0, 3.0])
    """
    placed = []
    for index in sorted(range(len(pieces)), key=lambda i: -pieces[i][1]):
        key, length = pieces[index]
        for reel in reels:
            if reel["wire"] == key and reel["length_m"] - reel["used_m"] >= length - 1e-12:
                reel["used_m"] += length
                reel["pieces"] += 1
                placed.append(index)
                break
    return placed


def wire_key(text: str, grade: str) -> str:
    """How a reel's wire is named in the bill of materials and the shortfall."""
    return f"{text} grade {grade}" if grade != "bare" else f"{text} bare"


# --- the whole plan --------------------------------------------------------------------------------


def _explain(evaluation: Evaluation, coil_index: int, missing: int, taken: dict[int, dict[int, int]]) -> str:
    coil = evaluation.plan.coil[coil_index]
    head = f"coil {coil.name!r} × {missing}"
    fits = [s for s in range(len(evaluation.stock)) if evaluation.feasible[coil_index, s]]
    if not fits:
        why = [f"{evaluation.stock[s].label}: {evaluation.reason(coil_index, s)}" for s in range(len(evaluation.stock))]
        if not why:
            return f"{head}: there is no stock in the plan"
        shown = "; ".join(why[:3]) + (f"; and {len(why) - 3} more" if len(why) > 3 else "")
        return f"{head}: no stock fits it ({shown})"
    parts = []
    for s in fits[:3]:
        holders = taken.get(s, {})
        others = ", ".join(f"{evaluation.plan.coil[c].name!r} ({n})" for c, n in sorted(holders.items())
                           if c != coil_index)
        own = holders.get(coil_index, 0)
        count = evaluation.stock[s].count
        owner = " and ".join(([f"assigned to {others}"] if others else [])
                             + ([f"carrying {own} of its own"] if own else [])) or "in use"
        parts.append(f"the {count} of {evaluation.stock[s].label} that would carry it are {owner}")
    if len(fits) > 3:
        parts.append(f"and {len(fits) - 3} more stock items that would carry it are in use")
    return f"{head}: " + "; ".join(parts)


def plan_kit(plan, progress=None) -> KitResult:
    """Evaluate, assign and allocate wire for a validated plan (see the module notes for the objective).

    Raises
    ------
    InfeasibleError
        Never for a partial plan (the result lists what could not be placed); only for a plan with
        no coil and no stock (cannot happen for a validated plan).
    """
    evaluation = evaluate_plan(plan, progress)
    assignment, objective, resolution, with_q, row_type, col_type = assign_units(evaluation)
    if len(row_type) == 0:
        raise InfeasibleError("the plan asks for no coils")
    units = [(int(row_type[row]), int(col_type[column])) for row, column in enumerate(assignment)
             if column is not None]
    keys = [wire_key(text, grade) for text, grade, _ in evaluation.wires]
    reels = [{"wire": wire_key(r.wire, r.grade), "length_m": float(r.length), "used_m": 0.0, "pieces": 0}
             for r in plan.reel]
    # wire: first-fit decreasing on each unit's cheapest wire; units left over try their next wire, and so on
    chosen: list[Candidate | None] = [None] * len(units)
    pending = list(range(len(units)))
    rank = 0
    while pending:
        trying = [u for u in pending if rank < len(evaluation.options[units[u]])]
        if not trying:
            break
        options = [evaluation.options[units[u]][rank] for u in trying]
        placed = allocate_wire([(keys[o.wire], o.wire_length) for o in options], reels)
        for index in placed:
            chosen[trying[index]] = options[index]
        pending = [u for u in pending if chosen[u] is None]
        rank += 1
    shortfall: dict[str, float] = {}
    for u in pending:  # no reel holds any of its wires: report the cheapest one as short
        best = evaluation.options[units[u]][0]
        shortfall[keys[best.wire]] = shortfall.get(keys[best.wire], 0.0) + best.wire_length
        chosen[u] = best
    grouped: dict[tuple[int, int, int], int] = {}
    for (c, s), candidate in zip(units, chosen, strict=True):
        grouped[(c, s, candidate.wire)] = grouped.get((c, s, candidate.wire), 0) + 1
    placements = []
    forms: dict[tuple[int, int], object] = {}
    for (c, s, w), quantity in sorted(grouped.items()):
        candidate = next(o for o in evaluation.options[(c, s)] if o.wire == w)
        if (s, w) not in forms:
            forms[(s, w)] = build_form(evaluation.stock[s], evaluation.wires[w][2], plan.settings)
        placements.append(Placement(c, s, quantity, candidate, forms[(s, w)]))
    taken: dict[int, dict[int, int]] = {}
    for (c, s, _), quantity in grouped.items():
        taken.setdefault(s, {})[c] = taken.get(s, {}).get(c, 0) + quantity
    unplaced = []
    for c, coil in enumerate(plan.coil):
        placed = sum(q for (cc, _, _), q in grouped.items() if cc == c)
        if placed < coil.count:
            unplaced.append(_explain(evaluation, c, coil.count - placed, taken))
    for key, length in shortfall.items():
        unplaced.append(f"wire {key}: {format_length(length)} short of what the placed coils need")
    return KitResult(evaluation, placements, assignment, objective, resolution, with_q, reels, shortfall, unplaced)


def captured(function, *args, **kwargs):
    """Call ``function``; return (its value, the coilplan warnings it gave as text)."""
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always", CoilplanWarning)
        value = function(*args, **kwargs)
    texts = []
    for item in caught:
        if issubclass(item.category, CoilplanWarning):
            if str(item.message) not in texts:
                texts.append(str(item.message))
        else:
            warnings.warn_explicit(item.message, item.category, item.filename, item.lineno)
    return value, texts
