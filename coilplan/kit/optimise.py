r"""How the stock and the wire are shared out: the lexicographic optimum under the stock counts and reel lengths.

**The problem.** Coil type c is wanted :math:`n_c` times, stock item s holds :math:`m_s`, reel r holds
:math:`L_r` metres of one wire. A winding option o = (c, s, w) is a feasible winding of c on s with wire w
(:mod:`coilplan.kit.assign`), with its piece of wire :math:`\ell_o` (m, margin included) and whole-number
costs. Choose whole numbers :math:`x_{o,r}` (units of o cut from reel r, a reel of o's wire) and
:math:`u_c` (units of c left out) with

.. math::

    \sum_{o \ni c,\,r} x_{o,r} + u_c = n_c,\qquad
    \sum_{o \ni s,\,r} x_{o,r} \le m_s,\qquad
    \sum_{o} \ell_o\,x_{o,r} \le L_r

(every coil type, every stock item, every reel: a piece is cut whole from one reel), minimising in
this order: the coils left out :math:`\sum u_c`, the wire used (:func:`cost_levels`: in steps of
``wire_step``, 1 mm unless the plan is too large for that to stay exact below), the closeness to
target (:math:`|L - L_{target}|/L_{target}` in steps of 0.1 %), the Q at the operating frequency
(:math:`1/(1+Q)` in steps of 0.001). The levels are folded into one whole-number cost per option,
each level's weight above what the levels below can add up to over all coil units, every total
below 2⁵³ so the order is exact in float64 (a plan too large for that drops the Q level, then
counts the wire in coarser steps).

**Solvers**, tried in this order (``Solution.method`` says which answered):

1. ``"assignment"``: the stock-only relaxation (no reel rows). Each (coil, stock) pair keeps its
   cheapest wire and the problem is an assignment of coil units to stock units with one "not
   placed" column per coil unit, solved exactly by :func:`scipy.optimize.linear_sum_assignment`.
   Its optimum bounds the full problem's from below, so when its pieces fit on the reels
   (first-fit decreasing finds a packing) it is optimal. The usual case: the reels hold enough.
2. ``"core"``, when the reels run short (column generation): the mixed-integer program of the whole
   problem, :func:`scipy.optimize.milp` (HiGHS; first the coils left out, then the folded cost of the
   other levels with the first held at its optimum; ``mip_rel_gap`` 0 and whole-number costs make
   each optimum exact, and the rounded solution is checked against every row), solved on a core of
   options: at first every wire of the (coil, stock) pairs the stock-only answer uses. The duals of
   the core's linear relaxation (:func:`scipy.optimize.linprog`) price each wire per metre; the
   assignment with those prices added (exact for its priced costs) brings its pairs into the core
   for the next round (:data:`CORE_ROUNDS` at most, while the core stays within
   :data:`CORE_COLUMNS` cuts) and gives a proven lower bound, its cost less the price of the wire it
   saves (Lagrangian relaxation of the reel rows). The core's program stops within
   :data:`CORE_GAP` on the lower levels. The answer keeps to every count and reel; it is proven
   optimal where it meets the bound.
3. ``"milp"``: for plans of up to :data:`MILP_COLUMNS` (option, reel) cuts whose core answer is not
   proven, the same program on every option, which proves the optimum unless HiGHS stops at
   :data:`TIME_LIMIT_S` on a level (the reel rows make it a knapsack: proving the last millimetre can
   take long); then the better of the two answers is kept, with the better lower bound (HiGHS's dual
   bound or the Lagrangian one), reported as ``Solution.bound`` so the gap is known. On the benchmark
   plan of 200 coil types by 100 stock items the core answer is within 1 % of the wire's bound.

**Shortfall.** When the reels leave out coils that the stock would carry (more left out than in the
stock-only relaxation), each wire's shortfall is the least length that, bought as one more reel of
that wire, lets the stock-only number of coils be placed (one more program, for a plan small
enough for ``"milp"``; if HiGHS does not prove it within :data:`SHORTFALL_SECONDS`, the least it
found, which is enough but perhaps more than needed), or else what the stock-only answer cuts from
that wire beyond its reels.
"""

from __future__ import annotations

import dataclasses
import math
from dataclasses import dataclass

import numpy as np

__all__ = ["CLOSENESS_STEP", "CORE_COLUMNS", "CORE_GAP", "CORE_ROUNDS", "MILP_COLUMNS", "Q_STEPS", "SHORTFALL_SECONDS",
           "TIME_LIMIT_S", "Solution", "cost_levels", "first_fit_decreasing", "optimise"]

#: Closeness to target is counted in steps of this fraction (0.1 %).
CLOSENESS_STEP = 1e-3
#: Q enters as 1/(1+Q) in steps of 1/Q_STEPS (the last, weakest level: at Q = 70 a step is a Q of about 5).
Q_STEPS = 1000
#: The mixed-integer program is used for plans of up to this many (winding option, reel) cuts.
MILP_COLUMNS = 1500
#: Seconds HiGHS may take on one level before the best solution found so far is used (and said so), and
#: on the program that finds the shortfall.
TIME_LIMIT_S = 5.0
SHORTFALL_SECONDS = 2.0
#: Rounds of the core program and priced assignment at most, for a plan too large for the whole program;
#: the core grows only while its program stays within CORE_COLUMNS cuts (a fraction of a second each).
CORE_ROUNDS = 4
CORE_COLUMNS = 1000
#: HiGHS's relative gap on the core's lower levels (a heuristic answer, its bound reported): about
#: 1e-4 of the wire, which spares it most of the proof; the whole program uses 0.
CORE_GAP = 1e-4
_EXACT = 2.0**53
#: A reel row of the program is held this far (m) below the reel's length, so HiGHS's feasibility
#: tolerance cannot cut a piece longer than what is there.
_REEL_SLACK = 1e-6


@dataclass(frozen=True)
class Solution:
    """The shared-out stock and wire.

    Attributes
    ----------
    cuts : dict
        (option index, reel index) → units wound with that option from that reel.
    objective : tuple
        (coils left out, wire units, closeness steps, Q steps).
    resolution : float
        The wire unit, m.
    with_q : bool
        Whether the Q level took part.
    method : str
        ``"assignment"``, ``"milp"`` or ``"core"`` (module notes).
    proven : bool
        The objective is proven optimal.
    bound : tuple or None
        For an unproven answer, a proven lower bound: (coils left out, wire units); the wire's bound
        holds only where the coils' bound equals the objective's.
    stock_only_unplaced : int
        Coils the stock alone leaves out (the relaxation's optimum).
    shortfall : dict
        Wire index → metres to add to the reels to place what the stock alone allows.
    """

    cuts: dict
    objective: tuple[int, int, int, int]
    resolution: float
    with_q: bool
    method: str
    proven: bool
    bound: tuple[int, int] | None
    stock_only_unplaced: int
    shortfall: dict


def cost_levels(evaluation, resolution: float, with_q: bool = True):
    """Whole-number cost levels per winding option (``evaluation.flat`` order): wire units, closeness steps, Q steps."""
    arrays = evaluation.arrays
    wire_units = np.rint(arrays["length"] / resolution).astype(np.int64)
    close_units = np.rint(arrays["closeness"] / CLOSENESS_STEP).astype(np.int64)
    q_units = (np.rint(arrays["q_cost"] * Q_STEPS).astype(np.int64) if with_q
               else np.zeros(wire_units.size, dtype=np.int64))
    return wire_units, close_units, q_units


def _weights(rows: int, wire_units, close_units, q_units):
    """Level weights (w_wire, w_close, w_q), the 'not placed' cost and the bound on any total."""
    top_q, top_close, top_wire = (int(a.max(initial=0)) for a in (q_units, close_units, wire_units))
    w_close = rows * top_q + 1
    w_wire = w_close * (rows * top_close + 1) + rows * top_q
    largest_row = w_wire * top_wire + w_close * top_close + top_q
    unplaced = rows * largest_row + 1
    return (w_wire, w_close, 1, unplaced), rows * unplaced


def _exact_levels(evaluation, rows: int, resolution: float):
    with_q = True
    while True:
        levels = cost_levels(evaluation, resolution, with_q)
        weights, bound = _weights(rows, *levels)
        if bound < _EXACT:
            return resolution, with_q, levels, weights
        if with_q:
            with_q = False
        else:
            resolution *= 10.0


def first_fit_decreasing(pieces, reels) -> list[int | None]:
    """Each piece (wire, length), longest first, to the first reel (wire, length) of its wire with room for it.

    Returns the reel index of each piece (None where no reel holds it).

    Examples
    --------
    >>> first_fit_decreasing([(0, 2.0), (0, 4.0), (0, 3.0), (1, 1.0)], [(0, 6.0), (0, 5.0)])
    [0, 0, 1, None]
    """
    left = [length for _, length in reels]
    placed: list[int | None] = [None] * len(pieces)
    for index in sorted(range(len(pieces)), key=lambda i: -pieces[i][1]):
        wire, length = pieces[index]
        for r, (reel_wire, _) in enumerate(reels):
            if reel_wire == wire and left[r] >= length - 1e-12:
                left[r] -= length
                placed[index] = r
                break
    return placed


@dataclass
class _Plan:
    """The plan's numbers, as the solvers use them."""

    coil_counts: np.ndarray
    stock_counts: np.ndarray
    reels: list[tuple[int, float]]  # (wire index, length) per reel, plan order
    budget: np.ndarray  # metres per wire, all its reels together
    coil: np.ndarray  # per option
    stock: np.ndarray
    wire: np.ndarray
    length: np.ndarray
    cost: np.ndarray  # the folded whole-number cost, float64 (exact below 2**53)
    levels: tuple
    weights: tuple  # (w_wire, w_close, w_q, the cost of a coil left out)
    resolution: float

    @property
    def unplaced_cost(self) -> float:
        return float(self.weights[3])

    @property
    def units(self) -> int:
        return int(self.coil_counts.sum())


def _assignment(plan: _Plan, cost: np.ndarray) -> list[int | None]:
    """Per coil unit the option it takes (None: not placed), minimising Σ ``cost`` under the stock counts."""
    from scipy.optimize import linear_sum_assignment

    coils, stocks = plan.coil_counts.size, plan.stock_counts.size
    pair = plan.coil * stocks + plan.stock
    order = np.lexsort((np.arange(cost.size), cost, pair))  # per pair, cheapest first, the first of equals first
    first = order[np.r_[True, pair[order][1:] != pair[order][:-1]]] if order.size else order
    best = np.full(coils * stocks, -1, dtype=np.int64)
    pair_cost = np.full(coils * stocks, np.inf)
    best[pair[first]] = first
    pair_cost[pair[first]] = cost[first]
    best, pair_cost = best.reshape(coils, stocks), pair_cost.reshape(coils, stocks)
    row_type = np.repeat(np.arange(coils), plan.coil_counts)
    col_type = np.repeat(np.arange(stocks), plan.stock_counts)
    rows = row_type.size
    taken: list[int | None] = [None] * rows
    if col_type.size == 0:
        return taken
    # a cell no winding fits costs as much as leaving the coil out, and means just that: every row and
    # column left over in the rectangle is a coil left out or a stock unit unused, so the optimum of
    # this square-or-wider-side matching is that of the matching with one "not placed" column per row
    matrix = np.minimum(pair_cost, plan.unplaced_cost)[np.ix_(row_type, col_type)]
    picked_rows, picked_cols = linear_sum_assignment(matrix)
    for r, column in zip(picked_rows.tolist(), picked_cols.tolist(), strict=True):
        option = int(best[row_type[r], col_type[column]])
        if option >= 0:
            taken[r] = option
    return taken


def _on_reels(plan: _Plan, taken: list[int | None]) -> tuple[dict, list[int]]:
    """Pack the placed units' pieces by first-fit decreasing: (cuts, the options of the units left without wire)."""
    placed = [o for o in taken if o is not None]
    reel_of = first_fit_decreasing([(int(plan.wire[o]), float(plan.length[o])) for o in placed], plan.reels)
    cuts: dict[tuple[int, int], int] = {}
    missing = []
    for o, r in zip(placed, reel_of, strict=True):
        if r is None:
            missing.append(o)
        else:
            cuts[(o, r)] = cuts.get((o, r), 0) + 1
    return cuts, missing


def _tidy(plan: _Plan, cuts: dict) -> dict:
    """The same pieces repacked first-fit decreasing, reels in plan order, where that packs them all.

    The program may put a piece on any reel of its wire that has room; this keeps the first reels first.
    """
    pieces = [o for (o, _), units in sorted(cuts.items()) for _ in range(units)]
    reel_of = first_fit_decreasing([(int(plan.wire[o]), float(plan.length[o])) for o in pieces], plan.reels)
    if any(r is None for r in reel_of):
        return cuts
    tidy: dict[tuple[int, int], int] = {}
    for o, r in zip(pieces, reel_of, strict=True):
        tidy[(o, r)] = tidy.get((o, r), 0) + 1
    return tidy


def _objective(plan: _Plan, cuts: dict) -> tuple[int, int, int, int]:
    totals = [0, 0, 0]
    placed = 0
    for (o, _), units in cuts.items():
        placed += units
        for level in range(3):
            totals[level] += units * int(plan.levels[level][o])
    return plan.units - placed, *totals


def _folded(plan: _Plan, objective) -> float:
    """The objective as one number: the levels weighted as in the assignment."""
    w_wire, w_close, w_q, unplaced = plan.weights
    return float(objective[0] * unplaced + objective[1] * w_wire + objective[2] * w_close + objective[3] * w_q)


# --- the mixed-integer program ---------------------------------------------------------------------


@dataclass
class _Program:
    """The program's rows and columns (variables: the (option, reel) cuts, then u_c per coil type)."""

    option: np.ndarray
    reel: np.ndarray  # -1: an unlimited (bought) reel of the option's wire
    matrix: object
    lower: np.ndarray
    upper: np.ndarray
    bounds_upper: np.ndarray
    coils: int


def _columns(plan: _Plan, unlimited: bool = False) -> tuple[np.ndarray, np.ndarray]:
    options, reels = [], []
    for r, (reel_wire, reel_length) in enumerate(plan.reels):
        fits = np.flatnonzero((plan.wire == reel_wire) & (plan.length <= reel_length - _REEL_SLACK))
        options.append(fits)
        reels.append(np.full(fits.size, r))
    if unlimited:
        options.append(np.arange(plan.length.size))
        reels.append(np.full(plan.length.size, -1))
    if not options:
        return np.zeros(0, dtype=np.int64), np.zeros(0, dtype=np.int64)
    return np.concatenate(options).astype(np.int64), np.concatenate(reels).astype(np.int64)


def _program(plan: _Plan, unlimited: bool = False) -> _Program:
    from scipy.sparse import coo_matrix

    option, reel = _columns(plan, unlimited)
    cuts, coils, stocks = option.size, plan.coil_counts.size, plan.stock_counts.size
    coil_counts = plan.coil_counts.astype(float)
    stock_counts = plan.stock_counts.astype(float)
    limit = np.minimum(coil_counts[plan.coil[option]], stock_counts[plan.stock[option]])
    real = reel >= 0
    reel_lengths = np.array([length for _, length in plan.reels] + [np.inf])
    limit[real] = np.minimum(limit[real],
                             np.floor((reel_lengths[reel[real]] - _REEL_SLACK) / plan.length[option[real]]))
    columns = np.arange(cuts)
    rows = [plan.coil[option], coils + plan.stock[option], coils + stocks + reel[real], np.arange(coils)]
    cols = [columns, columns, columns[real], cuts + np.arange(coils)]
    values = [np.ones(cuts), np.ones(cuts), plan.length[option[real]], np.ones(coils)]
    matrix = coo_matrix((np.concatenate(values), (np.concatenate(rows), np.concatenate(cols))),
                        shape=(coils + stocks + len(plan.reels), cuts + coils)).tocsr()
    lower = np.concatenate([coil_counts, np.zeros(stocks), np.full(len(plan.reels), -np.inf)])
    upper = np.concatenate([coil_counts, stock_counts, reel_lengths[:-1] - _REEL_SLACK])
    return _Program(option, reel, matrix, lower, upper, np.concatenate([limit, coil_counts]), coils)


def _satisfies(x, program: _Program, extra) -> bool:
    if np.any(x < 0) or np.any(x > program.bounds_upper):
        return False
    values = program.matrix @ x
    if np.any(values < program.lower - 1e-9) or np.any(values > program.upper + _REEL_SLACK):
        return False
    return all(float(row @ x) <= bound for row, bound in extra)


def _solve_in_turn(program: _Program, objectives, extra=(), seconds: float = TIME_LIMIT_S, gap: float = 0.0):
    """Minimise each objective in turn, the earlier ones held at their optimum.

    Returns (x or None, proven, lower bounds): the bounds are each level's optimum, or for the level
    where HiGHS stopped at its time limit, its dual bound (and nothing for the levels after it).
    """
    from scipy.optimize import Bounds, LinearConstraint, milp
    from scipy.sparse import csr_matrix, vstack

    extra = list(extra)
    count = program.matrix.shape[1]
    bounds = Bounds(np.zeros(count), program.bounds_upper)
    best, lower = None, []
    for objective in objectives:
        if best is not None and not np.any(objective):
            lower.append(0.0)
            continue
        matrix = vstack([program.matrix, *[csr_matrix(row[None, :]) for row, _ in extra]]).tocsr()
        upper = np.concatenate([program.upper, [bound for _, bound in extra]])
        below = np.concatenate([program.lower, np.full(len(extra), -np.inf)])
        result = milp(objective, constraints=LinearConstraint(matrix, below, upper), integrality=np.ones(count),
                      bounds=bounds, options={"mip_rel_gap": gap, "time_limit": seconds})
        dual = getattr(result, "mip_dual_bound", None)
        if result.x is None:
            lower.append(-math.inf if dual is None or not math.isfinite(dual) else float(dual))
            return best, False, lower
        x = np.rint(result.x)
        if not _satisfies(x, program, extra):
            return best, False, lower
        best = x
        value = float(objective @ x)
        if result.status != 0:
            lower.append(-math.inf if dual is None or not math.isfinite(dual) else float(dual))
            return best, False, lower
        lower.append(value)
        whole = bool(np.all(objective == np.rint(objective)))
        extra.append((objective, value + 0.5 if whole else value * (1 + 1e-12) + 1e-12))
    return best, True, lower


def _milp(plan: _Plan, seconds: float = TIME_LIMIT_S, gap: float = 0.0):
    """(cuts, proven, folded lower bound) of the full program: coils left out first, then the folded levels."""
    program = _program(plan)
    cuts = program.option.size
    objectives = [np.concatenate([np.zeros(cuts), np.ones(program.coils)]),
                  np.concatenate([plan.cost[program.option], np.zeros(program.coils)])]
    x, proven, lower = _solve_in_turn(program, objectives, seconds=seconds, gap=gap)
    if not lower:
        bound = -math.inf
    elif len(lower) == 1:  # the coils left out not proven: at least the dual bound's whole number of them
        bound = math.ceil(lower[0] - 1e-6) * plan.unplaced_cost
    else:
        bound = lower[0] * plan.unplaced_cost + lower[1]
    if x is None:
        return None, False, bound
    units = x[:cuts]
    return ({(int(program.option[v]), int(program.reel[v])): int(units[v]) for v in np.flatnonzero(units > 0)},
            proven, bound)


def _bought(plan: _Plan, placeable_unplaced: int) -> dict[int, float]:
    """Least length per wire, bought as one more reel of each wire, to leave out only ``placeable_unplaced``."""
    program = _program(plan, unlimited=True)
    cuts = program.option.size
    bought = program.reel < 0
    objective = np.concatenate([np.where(bought, plan.length[program.option], 0.0), np.zeros(program.coils)])
    left_out = np.concatenate([np.zeros(cuts), np.ones(program.coils)])
    x, _, _ = _solve_in_turn(program, [objective], extra=[(left_out, placeable_unplaced + 0.5)],
                             seconds=SHORTFALL_SECONDS)
    shortfall: dict[int, float] = {}
    for v in np.flatnonzero(bought & (x[:cuts] > 0)) if x is not None else []:
        wire = int(plan.wire[program.option[v]])
        shortfall[wire] = shortfall.get(wire, 0.0) + float(x[v]) * float(plan.length[program.option[v]])
    return shortfall


# --- a core program and priced assignments, for large plans ----------------------------------------


def _wire_use(plan: _Plan, taken) -> np.ndarray:
    use = np.zeros(plan.budget.size)
    for o in taken:
        if o is not None:
            use[plan.wire[o]] += plan.length[o]
    return use


def _restricted(plan: _Plan, keep: np.ndarray) -> _Plan:
    """The plan with only the options ``keep`` (indices)."""
    return dataclasses.replace(plan, coil=plan.coil[keep], stock=plan.stock[keep], wire=plan.wire[keep],
                               length=plan.length[keep], cost=plan.cost[keep],
                               levels=tuple(level[keep] for level in plan.levels))


def _reel_prices(core: _Plan) -> np.ndarray:
    """A price per metre of each wire: the reel rows' duals of the core's linear relaxation (folded cost)."""
    from scipy.optimize import linprog

    program = _program(core)
    coils = program.coils
    scale = core.weights[0]  # costs in wire units keep the relaxation well scaled
    cost = np.concatenate([core.cost[program.option], np.full(coils, core.unplaced_cost)]) / scale
    result = linprog(cost, A_eq=program.matrix[:coils], b_eq=program.upper[:coils], A_ub=program.matrix[coils:],
                     b_ub=program.upper[coils:], bounds=np.c_[np.zeros(cost.size), program.bounds_upper],
                     method="highs")
    prices = np.zeros(core.budget.size)
    if result.status != 0:
        return prices
    reel_duals = -np.asarray(result.ineqlin.marginals)[core.stock_counts.size:] * scale
    for (wire, _), dual in zip(core.reels, reel_duals, strict=True):
        prices[wire] = max(prices[wire], float(dual), 0.0)
    return prices


def _core_rounds(plan: _Plan, stock_only: list[int | None], rounds: int):
    """Solve the program on a core of options, grown from priced assignments (column generation).

    The core starts as the (coil, stock) pairs of the stock-only answer, every wire of each. Each
    round solves the core's program, prices the wire by the duals of its linear relaxation,
    and runs the priced assignment on the whole plan: its (coil, stock) pairs join the core, and its
    cost less the price of the wire it saves is a proven lower bound (Lagrangian) on the optimum.
    Returns (cuts, folded lower bound, proven). The core's program on the lower levels stops within
    :data:`CORE_GAP` of its optimum: the answer is proven only by meeting the bound.
    """
    pair = plan.coil * plan.stock_counts.size + plan.stock
    in_core = np.isin(pair, [int(pair[o]) for o in stock_only if o is not None])
    best_cuts, best_value, bound = None, math.inf, _folded_cost(plan, stock_only)
    for _ in range(rounds):
        keep = np.flatnonzero(in_core)
        core = _restricted(plan, keep)
        cuts, _, _ = _milp(core, gap=CORE_GAP)
        if cuts is not None:
            cuts = {(int(keep[o]), r): units for (o, r), units in cuts.items()}
            value = _folded(plan, _objective(plan, cuts))
            if value < best_value:
                best_cuts, best_value = cuts, value
        prices = _reel_prices(core)
        taken = _assignment(plan, plan.cost + prices[plan.wire] * plan.length)
        bound = max(bound, _folded_cost(plan, taken) + float(prices @ (_wire_use(plan, taken) - plan.budget)))
        packed, missing = _on_reels(plan, taken)
        if not missing and _folded(plan, _objective(plan, packed)) < best_value:
            best_cuts, best_value = packed, _folded(plan, _objective(plan, packed))
        grown = in_core | np.isin(pair, [int(pair[o]) for o in taken if o is not None])
        if best_value <= bound + 0.5 or np.array_equal(grown, in_core):
            break
        if _columns(_restricted(plan, np.flatnonzero(grown)))[0].size > CORE_COLUMNS:
            break
        in_core = grown
    if best_cuts is None:  # (cannot happen: the core always holds the stock-only answer's pairs)
        best_cuts = _on_reels(plan, stock_only)[0]
    return best_cuts, bound, best_value <= bound + 0.5


def _folded_cost(plan: _Plan, taken) -> float:
    """Σ cost of an assignment (per unit its option, or None for a coil left out)."""
    return float(sum(plan.cost[o] if o is not None else plan.unplaced_cost for o in taken))


def _stock_only_shortfall(plan: _Plan, stock_only) -> dict[int, float]:
    over = _wire_use(plan, stock_only) - plan.budget
    return {int(w): float(over[w]) for w in np.flatnonzero(over > 1e-9)}


def optimise(evaluation, *, wire_step: float = 1e-3, solver: str = "auto", rounds: int = CORE_ROUNDS) -> Solution:
    """The lexicographic optimum of the plan under the stock counts and the reel lengths (module notes).

    Parameters
    ----------
    evaluation : Evaluation
        From :func:`coilplan.kit.assign.evaluate_plan`.
    wire_step : float
        The wire unit of the objective, m (coarser where the plan is too large for it to stay exact).
    solver : {"auto", "milp", "core"}
        ``"auto"``: as the module notes say; ``"milp"``: the whole program always (even where the
        stock-only answer fits); ``"core"``: the core program alone where it does not (both for tests).
    rounds : int
        Rounds of the core program at most (``"core"``).
    """
    plan_file = evaluation.plan
    arrays = evaluation.arrays
    coil_counts = np.array([coil.count for coil in plan_file.coil], dtype=np.int64)
    stock_counts = np.array([item.count for item in evaluation.stock], dtype=np.int64)
    wire_index = {(text, grade): w for w, (text, grade, _) in enumerate(evaluation.wires)}
    reels = [(wire_index[(reel.wire, reel.grade)], float(reel.length)) for reel in plan_file.reel]
    budget = np.zeros(len(evaluation.wires))
    for w, length in reels:
        budget[w] += length
    resolution, with_q, levels, weights = _exact_levels(evaluation, int(coil_counts.sum()), wire_step)
    w_wire, w_close, w_q, unplaced_cost = weights
    cost = (levels[0] * w_wire + levels[1] * w_close + levels[2] * w_q).astype(float)
    plan = _Plan(coil_counts, stock_counts, reels, budget, arrays["coil"], arrays["stock"], arrays["wire"],
                 arrays["length"], cost, levels, weights, resolution)

    def answer(cuts, method, proven, bound=None, shortfall=None):
        cuts = _tidy(plan, cuts)
        objective = _objective(plan, cuts)
        return Solution(cuts, objective, resolution, with_q, method, proven, None if proven else bound,
                        stock_only_unplaced, shortfall or {})

    stock_only = _assignment(plan, cost)
    stock_only_unplaced = sum(1 for o in stock_only if o is None)
    cuts, missing = _on_reels(plan, stock_only)
    if not missing and solver != "milp":
        return answer(cuts, "assignment", True)
    columns = _columns(plan)[0].size
    found: list[tuple[dict, str]] = []
    bound, proven = -math.inf, False
    if solver != "milp":
        core_cuts, bound, proven = _core_rounds(plan, stock_only, rounds)
        found.append((core_cuts, "core"))
    if not proven and (solver == "milp" or (solver == "auto" and columns <= MILP_COLUMNS)):
        milp_cuts, milp_proven, milp_bound = _milp(plan)
        bound = max(bound, milp_bound)
        if milp_cuts is not None:
            found.insert(0, (milp_cuts, "milp"))  # the first of equals
            proven = milp_proven
    if not found:  # the program found nothing in its time: what of the stock-only answer packs is feasible
        found.append((cuts, "assignment"))
    cuts, method = min(found, key=lambda entry: _folded(plan, _objective(plan, entry[0])))
    objective = _objective(plan, cuts)
    proven = proven or bound >= _folded(plan, objective) - 0.5
    lower_unplaced = max(stock_only_unplaced, math.floor(bound / unplaced_cost + 1e-9))
    lower_wire = math.floor((bound - lower_unplaced * unplaced_cost) / w_wire + 1e-9) \
        if lower_unplaced == objective[0] else 0
    shortfall = {}
    if objective[0] > stock_only_unplaced:
        shortfall = (_bought(plan, stock_only_unplaced) if columns <= MILP_COLUMNS
                     else _stock_only_shortfall(plan, stock_only))
    return answer(cuts, method, proven, (lower_unplaced, max(lower_wire, 0)), shortfall)
