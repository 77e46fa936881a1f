r"""The kit planner's work: every coil on every stock item with every reel's wire, then the best share-out.

1. **Evaluate.** :func:`coilplan.kit.evaluation.evaluate_plan`: each stock item is built once with
   each wire on the reels and every coil type solved on it in one batched call; every wire that works
   is kept as a winding option of the pair, with its cost levels, and a pair that fails with its reason.

2. **Share out.** :func:`coilplan.kit.optimise.optimise`: the lexicographic optimum (fewest coils
   left out, then least wire, then closest to target, then best Q) under the stock counts and the
   lengths on the reels, each piece cut whole from one reel; the solver and the proof of optimality
   are described there. What the reels leave out is reported with each wire's shortfall.
"""

from __future__ import annotations

import warnings
from dataclasses import dataclass, field

from coilplan.errors import CoilplanWarning, InfeasibleError
from coilplan.kit.evaluation import Candidate, Evaluation, evaluate_plan
from coilplan.kit.optimise import Solution, optimise
from coilplan.quantities import format_length

__all__ = ["KitResult", "Placement", "captured", "plan_kit", "wire_key"]


@dataclass(frozen=True)
class Placement:
    """Some units of one coil type on one stock item with one wire, with what the winding card needs."""

    coil: int
    stock: int
    quantity: int
    candidate: Candidate
    form: object
    reels: tuple[tuple[int, int], ...] = ()  # (reel index in plan order, pieces cut from it)


@dataclass
class KitResult:
    """The planned kit: the placements, the wire on each reel and what could not be done."""

    evaluation: Evaluation
    placements: list[Placement]
    objective: tuple[int, int, int, int]  # (unplaced, wire units, closeness steps, Q steps)
    wire_resolution_m: float
    q_in_objective: bool
    solver: str = "assignment"
    proven_optimal: bool = True
    bound: tuple[int, int] | None = None  # a proven lower bound (unplaced, wire units) when not proven optimal
    reels: list[dict] = field(default_factory=list)
    shortfall: dict[str, float] = field(default_factory=dict)
    unplaced: list[str] = field(default_factory=list)

    @property
    def complete(self) -> bool:
        return not self.unplaced and not self.shortfall


def wire_key(text: str, grade: str) -> str:
    """How a reel's wire is named in the bill of materials and the shortfall."""
    return f"{text} grade {grade}" if grade != "bare" else f"{text} bare"


# --- the whole plan --------------------------------------------------------------------------------


def _explain(evaluation: Evaluation, coil_index: int, missing: int, taken: dict[int, dict[int, int]],
             shortfall: dict[str, float]) -> str:
    coil = evaluation.plan.coil[coil_index]
    head = f"coil {coil.name!r} × {missing}"
    fits = [s for s in range(len(evaluation.stock)) if evaluation.feasible[coil_index, s]]
    if not fits:
        allowed = [s for s, item in enumerate(evaluation.stock) if item.form_name in coil.forms]
        others = [s for s in range(len(evaluation.stock)) if s not in allowed]  # "not allowed" says least: last
        why = [f"{evaluation.stock[s].label}: {evaluation.reason(coil_index, s)}" for s in allowed + others]
        if not why:
            return f"{head}: there is no stock in the plan"
        shown = "; ".join(why[:3]) + (f"; and {len(why) - 3} more" if len(why) > 3 else "")
        return f"{head}: no stock fits it ({shown})"
    free = [s for s in fits if sum(taken.get(s, {}).values()) < evaluation.stock[s].count]
    if free:
        keys = []
        for s in free:
            for option in evaluation.options_of(coil_index, s):
                key = wire_key(*evaluation.wires[option.wire][:2])
                if key not in keys:
                    keys.append(key)
        short = [f"{key} ({format_length(shortfall[key])} short)" if key in shortfall else key for key in keys]
        spare = ", ".join(f"{evaluation.stock[s].count - sum(taken.get(s, {}).values())} of "
                          f"{evaluation.stock[s].label}" for s in free[:3])
        return (f"{head}: the reels run out of the wire it needs ({', '.join(short)}); stock that would "
                f"carry it is left over ({spare})")
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
    """Evaluate, then share out the stock and the wire for a validated plan (the objective: optimise's notes).

    Raises
    ------
    InfeasibleError
        Never for a partial plan (the result lists what could not be placed); only for a plan with
        no coil (cannot happen for a validated plan).
    """
    if not any(coil.count for coil in plan.coil):
        raise InfeasibleError("the plan asks for no coils")
    evaluation = evaluate_plan(plan, progress)
    solution: Solution = optimise(evaluation)
    keys = [wire_key(text, grade) for text, grade, _ in evaluation.wires]
    reels = [{"reel": number, "wire": wire_key(r.wire, r.grade), "length_m": float(r.length), "used_m": 0.0,
              "pieces": 0} for number, r in enumerate(plan.reel, start=1)]
    grouped: dict[tuple[int, int, int], dict[int, int]] = {}
    for (o, r), units in solution.cuts.items():
        option = evaluation.candidate(o)
        reels[r]["used_m"] += units * option.wire_length
        reels[r]["pieces"] += units
        cut = grouped.setdefault((option.coil, option.stock, option.wire), {})
        cut[r] = cut.get(r, 0) + units
    placements = []
    for (c, s, w), from_reels in sorted(grouped.items()):
        candidate = next(o for o in evaluation.options_of(c, s) if o.wire == w)
        placements.append(Placement(c, s, sum(from_reels.values()), candidate, evaluation.forms[(s, w)],
                                    tuple(sorted(from_reels.items()))))
    taken: dict[int, dict[int, int]] = {}
    for p in placements:
        taken.setdefault(p.stock, {})[p.coil] = taken.get(p.stock, {}).get(p.coil, 0) + p.quantity
    shortfall = {keys[w]: length for w, length in sorted(solution.shortfall.items())}
    unplaced = []
    for c, coil in enumerate(plan.coil):
        placed = sum(p.quantity for p in placements if p.coil == c)
        if placed < coil.count:
            unplaced.append(_explain(evaluation, c, coil.count - placed, taken, shortfall))
    for key, length in shortfall.items():
        unplaced.append(f"wire {key}: {format_length(length)} short: that much more would let the coils the "
                        f"stock can carry be wound")
    return KitResult(evaluation, placements, solution.objective, solution.resolution, solution.with_q,
                     solution.method, solution.proven, solution.bound, reels, shortfall, unplaced)


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
