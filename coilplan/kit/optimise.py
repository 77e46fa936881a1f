r"""How the stock and the wire are shared out: the lexicographic optimum under the stock counts and reel lengths.

**The problem.** Coil type c is wanted :math:`n_c` times, stock item s holds :math:`m_s`, reel r holds
:math:`L_r` metres of one wire. A winding option o = (c, s, w) is a feasible winding of c on s with wire w
(:mod:`coilplan.kit.evaluation`), with its piece of wire :math:`\ell_o` (m, margin included) and whole-number
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

The parts: the cost levels (:func:`cost_levels`) and the plan as arrays in :mod:`coilplan.kit.share_numbers`,
the stock-only assignment and the packing on the reels in :mod:`coilplan.kit.share_assignment`, the
mixed-integer program and the shortfall (:data:`TIME_LIMIT_S`, :data:`SHORTFALL_SECONDS`) in
:mod:`coilplan.kit.share_program`, the core program and its bound (:data:`CORE_ROUNDS`,
:data:`CORE_COLUMNS`, :data:`CORE_GAP`) in :mod:`coilplan.kit.share_core`; this module runs them in the
order above.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from coilplan.kit.share_assignment import _assignment, _on_reels, _stock_only_shortfall, _tidy
from coilplan.kit.share_core import CORE_ROUNDS, _core_rounds
from coilplan.kit.share_numbers import _exact_levels, _folded, _objective, _Plan
from coilplan.kit.share_program import _bought, _columns, _milp

__all__ = ["MILP_COLUMNS", "Solution", "optimise"]

#: The mixed-integer program is used for plans of up to this many (winding option, reel) cuts.
MILP_COLUMNS = 1500


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


def optimise(evaluation, *, wire_step: float = 1e-3, solver: str = "auto", rounds: int = CORE_ROUNDS) -> Solution:
    """The lexicographic optimum of the plan under the stock counts and the reel lengths (module notes).

    Parameters
    ----------
    evaluation : Evaluation
        From :func:`coilplan.kit.evaluation.evaluate_plan`.
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
