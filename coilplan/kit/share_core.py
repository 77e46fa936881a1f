"""The share-out for large plans: the program on a core of options, grown by priced assignments, and its bound.

The duals of the core's linear relaxation (:func:`scipy.optimize.linprog`) price each wire per metre; the
assignment with those prices added brings its pairs into the core for the next round, and its cost less the
price of the wire it saves is a proven lower bound (Lagrangian relaxation of the reel rows).
"""

from __future__ import annotations

import dataclasses
import math

import numpy as np

from coilplan.kit.share_assignment import _assignment, _on_reels
from coilplan.kit.share_numbers import _folded, _folded_cost, _objective, _Plan, _wire_use
from coilplan.kit.share_program import _columns, _milp, _program

__all__ = ["CORE_COLUMNS", "CORE_GAP", "CORE_ROUNDS"]

#: Rounds of the core program and priced assignment at most, for a plan too large for the whole program;
#: the core grows only while its program stays within CORE_COLUMNS cuts (a fraction of a second each).
CORE_ROUNDS = 4
CORE_COLUMNS = 1000
#: HiGHS's relative gap on the core's lower levels (a heuristic answer, its bound reported): about
#: 1e-4 of the wire, which spares it most of the proof; the whole program uses 0.
CORE_GAP = 1e-4


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
