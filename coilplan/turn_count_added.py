r"""The unknown turn count from added turns: readings before and after winding on known turns.

Read L₁, wind ``a`` more turns in the same sense on the same core, read L₂. On a closed core
L = A_L·N² (the definition of A_L in IEC 60205), so (N + a)/N = √(L₂/L₁) and
N = a/(√(L₂/L₁) − 1). Turns removed are a negative ``a``. :func:`added_turns_for_half_turn`
says how many turns to add for a count known to ±0.5 turn.

=====================  ============================  ======================================
symbol                 parameter                     meaning
=====================  ============================  ======================================
:math:`L_1, L_2`       ``before``, ``after``         readings before and after the change, H
:math:`a`              ``added``                     turns added (negative: removed)
:math:`t`              ``tolerance``                 relative accuracy of each reading
=====================  ============================  ======================================
"""

from __future__ import annotations

import math

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.turn_count_estimate import (
    TurnEstimate,
    _check_positive,
    _check_tolerance,
    _henry,
    _percent,
    _refuse_under_one_turn,
    _span,
    _whole,
)
from coilplan.turn_count_ratio import _CLOSED_CORE, _WORST_CASE, DEFAULT_METER_TOLERANCE, _meter_note, _root_shift

__all__ = ["added_turns_for_half_turn", "count_from_added_turns"]


def _added_interval(ratio: float, added: int, tolerance: float) -> tuple[float, float]:
    """Worst-case (low, high) of N = a/(√ρ − 1) when each reading errs by ±tolerance."""
    q = 1.0 + _root_shift(tolerance)
    root = math.sqrt(ratio)
    ends = []
    for moved in (root * q, root / q):
        step = moved - 1.0
        ends.append(added / step if step * added > 0 else math.inf)
    return min(ends), max(ends)


def added_turns_for_half_turn(turns: float, tolerance: float, *, removed: bool = False) -> int | None:
    """The fewest turns to add (or remove) for a worst-case interval within ±0.5 turn.

    The interval of :func:`count_from_added_turns` is computed for exact readings of a
    coil of ``turns`` turns, L₂/L₁ = ((N ± a)/N)², and ``a`` is the smallest whole
    number whose interval lies within N ± 0.5.

    Parameters
    ----------
    turns : float
        The coil's count (an estimate), N.
    tolerance : float
        Relative accuracy of each reading, t.
    removed : bool
        Turns taken off rather than added.

    Returns
    -------
    int or None
        ``a``; None when no number of turns will do: for added turns the
        interval narrows towards about ±N·t, so it needs N·(q − 1) < 0.5 with
        q = √((1 + t)/(1 − t)); removed turns must leave at least one.

    Examples
    --------
    >>> added_turns_for_half_turn(30, 0.01)
    47
    >>> added_turns_for_half_turn(100, 0.01) is None
    True
    """
    q = 1.0 + _root_shift(tolerance)
    sign = -1 if removed else 1

    def narrow(a: int) -> bool:
        low, high = _added_interval(((turns + sign * a) / turns) ** 2, sign * a, tolerance)
        return high - turns <= 0.5 and turns - low <= 0.5

    if removed:
        largest = math.ceil(turns) - 1
        if largest < 1 or not narrow(largest):
            return None
    else:
        if turns * (q - 1.0) >= 0.5:
            return None
        largest = 1
        while not narrow(largest):
            largest *= 2
            if largest > 2**62:  # N·(q − 1) a hair below 0.5: no practical number of turns
                return None
    lowest = 1
    if narrow(lowest):
        return lowest
    while largest - lowest > 1:  # narrow(largest) is True, narrow(lowest) False: bisect
        middle = (lowest + largest) // 2
        if narrow(middle):
            largest = middle
        else:
            lowest = middle
    return largest


def count_from_added_turns(before: float, after: float, added: int,
                      tolerance: float = DEFAULT_METER_TOLERANCE, *, tolerance_given: bool = False) -> TurnEstimate:
    r"""The turn count from readings before and after adding (or removing) known turns.

    .. math::

        \frac{N + a}{N} = \sqrt{\frac{L_2}{L_1}}
        \quad\Rightarrow\quad N = \frac{a}{\sqrt{L_2/L_1} - 1}

    from L = A_L·N² on a closed core (the definition of A_L in IEC 60205 [IEC60205]_).

    Parameters
    ----------
    before : float
        L₁, the reading of the coil as found, H.
    after : float
        L₂, the reading after the change, H.
    added : int
        Turns added in the same sense, a; negative for turns removed.
    tolerance : float
        Relative accuracy of each reading (default ±1 %, an assumption).
    tolerance_given : bool
        The tolerance is the user's figure, not the default (changes the wording only).

    Returns
    -------
    TurnEstimate
        N is the count of the coil as found (before the change). The interval
        takes L₁ low with L₂ high and the reverse.

    Raises
    ------
    InvalidInputError
        A reading not above zero, ``added`` zero, a tolerance outside (0, 50 %).
    InfeasibleError
        L₂ ≤ L₁ after adding turns (or L₂ ≥ L₁ after removing them): the turns went
        on in the opposite sense, or a reading is wrong; or readings whose whole
        interval lies below one turn (a change far too large for the turns added).

    Notes
    -----
    For an air coil or a ferrite rod L is not proportional to N² (added turns
    lengthen the winding), so the method does not apply there.

    References
    ----------
    .. [IEC60205] IEC 60205:2016, *Calculation of the effective parameters of magnetic
       piece parts*, International Electrotechnical Commission (A_L = L/N²).

    Examples
    --------
    >>> estimate = count_from_added_turns(1.20e-3, 1.45e-3, 10)
    >>> round(estimate.turns_exact, 1), estimate.turns, estimate.turns_range
    (100.8, 101, (91, 113))
    """
    before = _check_positive(before, "before", "an inductance")
    after = _check_positive(after, "after", "an inductance")
    tolerance = _check_tolerance(tolerance, "tolerance")
    if added == 0 or added != int(added):
        raise InvalidInputError("added", "a whole number of turns other than 0 (negative for turns removed)",
                                added)
    added = int(added)
    ratio = after / before
    count = abs(added)
    plural = "s" if count != 1 else ""
    if added > 0 and ratio <= 1.0:
        raise InfeasibleError(
            f"after adding {count} turn{plural} the inductance did not rise ({_henry(before)} before, "
            f"{_henry(after)} after): the turns were wound in the opposite sense (they cancel rather than add), "
            "sit on a different core, or a reading is wrong; check the winding direction and measure again",
            option="after")
    if added < 0 and ratio >= 1.0:
        raise InfeasibleError(
            f"after removing {count} turn{plural} the inductance did not fall ({_henry(before)} before, "
            f"{_henry(after)} after): a reading is wrong, or the turns removed were wound in the opposite sense",
            option="after")
    root = math.sqrt(ratio)
    turns = added / (root - 1.0)
    low, high = _added_interval(ratio, added, tolerance)
    _refuse_under_one_turn(
        high, turns, f"{_henry(before)} before and {_henry(after)} after {count} turn{plural} "
        f"{'added' if added > 0 else 'removed'}",
        "on a closed core (L = AL·N²) that change is far too large for so few turns; a reading is wrong (check "
        "the meter's range and the units), the turns went onto a different core, or the core is not closed")
    estimate_range = _span(low, high)
    if added > 0:
        words = (f"{count} turn{plural} added raised {_henry(before)} to {_henry(after)}: (N+{count})/N = "
                 f"√({_henry(after)}/{_henry(before)}) = {root:.6g}, so N = {count}/{root - 1:.4g} = {turns:.1f}, "
                 f"about {_whole(turns)} turns ({estimate_range} with ±{_percent(tolerance)} readings)")
    else:
        words = (f"{count} turn{plural} removed lowered {_henry(before)} to {_henry(after)}: (N−{count})/N = "
                 f"√({_henry(after)}/{_henry(before)}) = {root:.6g}, so N = {count}/(1 − {root:.6g}) = "
                 f"{turns:.1f}, about {_whole(turns)} turns as found ({estimate_range} with "
                 f"±{_percent(tolerance)} readings); {_whole(turns + added)} are left")
    warnings_: list[str] = []
    deviation = max(high - turns, turns - low)
    if not math.isfinite(high):
        warnings_.append(
            f"added turns: L₂/L₁ = {ratio:.4f} is within what ±{_percent(tolerance)} readings can move it, so the "
            "count has no upper bound: change more turns so that the inductance changes clearly")
    elif deviation > 1.0:
        needed = added_turns_for_half_turn(turns, tolerance, removed=added < 0)
        verb = "removing" if added < 0 else "adding"
        if needed is not None:
            advice = (f"{verb} more turns narrows it: {verb} {needed} instead of {count} would bring it within "
                      "±0.5 turn, enough to tell the whole number")
        else:
            advice = (f"{verb} more turns narrows it, but with ±{_percent(tolerance)} readings no number of turns "
                      f"brings it within ±0.5 turn (it approaches ±{turns * _root_shift(tolerance):.1f} turns); a more "
                      "accurate meter, or both readings on one range back to back, would")
        warnings_.append(f"added turns: the count is known only to {estimate_range} (±{deviation:.1f} turns); "
                         + advice)
    sense = ("the added turns are wound in the same sense as the coil, on the same core" if added > 0 else
             "the turns removed were part of the winding (not a separate or reversed section)")
    assumptions = [_CLOSED_CORE, sense, _WORST_CASE]
    if not tolerance_given:
        assumptions.insert(0, _meter_note(tolerance))
    return TurnEstimate("added-turns", turns, low, high, words, tuple(warnings_), tuple(assumptions),
                        (("turns_after_change", turns + added), ("added", added)))
