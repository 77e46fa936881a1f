"""The share-out's stock-only assignment: coil units to stock units, exactly, then the pieces packed on the reels.

Each (coil, stock) pair keeps its cheapest wire and the problem is an assignment of coil units to stock
units with one "not placed" column per coil unit, solved exactly by :func:`scipy.optimize.linear_sum_assignment`
(the reel rows left out: a lower bound on the whole problem). Its pieces are packed on the reels by
first-fit decreasing (:func:`first_fit_decreasing`); where they all fit, the assignment is optimal
(:mod:`coilplan.kit.optimise`).
"""

from __future__ import annotations

import numpy as np

from coilplan.kit.share_numbers import _Plan, _wire_use

__all__ = ["first_fit_decreasing"]


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


def _stock_only_shortfall(plan: _Plan, stock_only) -> dict[int, float]:
    over = _wire_use(plan, stock_only) - plan.budget
    return {int(w): float(over[w]) for w in np.flatnonzero(over > 1e-9)}
