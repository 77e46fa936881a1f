r"""The share-out's mixed-integer program: the whole problem for :func:`scipy.optimize.milp` (HiGHS), level by level.

Variables are the (option, reel) cuts, then :math:`u_c` per coil type; the rows are every coil type
(:math:`\sum x + u_c = n_c`), every stock item (:math:`\le m_s`) and every reel (:math:`\sum \ell_o x \le L_r`).
The coils left out are minimised first, then the folded cost of the other levels with the first held at its
optimum; ``mip_rel_gap`` 0 and whole-number costs make each optimum exact, and the rounded solution is
checked against every row. The same program with an unlimited (bought) reel of each wire gives the shortfall.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from coilplan.kit.share_numbers import _Plan

__all__ = ["SHORTFALL_SECONDS", "TIME_LIMIT_S"]

#: Seconds HiGHS may take on one level before the best solution found so far is used (and said so), and
#: on the program that finds the shortfall.
TIME_LIMIT_S = 5.0
SHORTFALL_SECONDS = 2.0
#: A reel row of the program is held this far (m) below the reel's length, so HiGHS's feasibility
#: tolerance cannot cut a piece longer than what is there.
_REEL_SLACK = 1e-6


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
