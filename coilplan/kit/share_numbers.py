r"""The share-out's numbers: whole-number cost levels, folded into one exact cost, and the plan as arrays.

Each winding option has whole-number costs on three levels below the coils left out: the wire used (in steps
of the wire unit), the closeness to target (:math:`|L - L_{target}|/L_{target}` in steps of
:data:`CLOSENESS_STEP`) and the Q (:math:`1/(1+Q)` in steps of 1/:data:`Q_STEPS`). The levels are folded into
one whole-number cost per option, each level's weight above what the levels below can add up to over all
coil units, every total below 2⁵³ so the order is exact in float64 (a plan too large for that drops the Q
level, then counts the wire in coarser steps). The solvers are in :mod:`coilplan.kit.optimise`.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["CLOSENESS_STEP", "Q_STEPS", "cost_levels"]


#: Closeness to target is counted in steps of this fraction (0.1 %).
CLOSENESS_STEP = 1e-3
#: Q enters as 1/(1+Q) in steps of 1/Q_STEPS (the last, weakest level: at Q = 70 a step is a Q of about 5).
Q_STEPS = 1000
_EXACT = 2.0**53


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


def _wire_use(plan: _Plan, taken) -> np.ndarray:
    use = np.zeros(plan.budget.size)
    for o in taken:
        if o is not None:
            use[plan.wire[o]] += plan.length[o]
    return use


def _folded_cost(plan: _Plan, taken) -> float:
    """Σ cost of an assignment (per unit its option, or None for a coil left out)."""
    return float(sum(plan.cost[o] if o is not None else plan.unplaced_cost for o in taken))
