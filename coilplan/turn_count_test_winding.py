r"""The unknown turn count from a test winding of known turns on the same closed core.

Wind a separate test winding of n turns on the same closed core and read it (L_t) and the unknown
winding (L_x): N = n·√(L_x/L_t), from L = A_L·N² (the definition of A_L in IEC 60205).

=====================  ============================  ======================================
symbol                 parameter                     meaning
=====================  ============================  ======================================
:math:`n, L_t`         ``test_turns``, ``test_...``  test winding: turns and reading, H
:math:`L_x`            ``unknown_inductance``        reading of the unknown winding, H
:math:`t`              ``tolerance``                 relative accuracy of each reading
=====================  ============================  ======================================
"""

from __future__ import annotations

import math

from coilplan.errors import InvalidInputError
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

__all__ = ["count_from_test_winding"]


def count_from_test_winding(test_inductance: float, test_turns: int, unknown_inductance: float,
                       tolerance: float = DEFAULT_METER_TOLERANCE, *, tolerance_given: bool = False) -> TurnEstimate:
    r"""The turn count from a test winding of known turns on the same closed core.

    .. math::

        N = n \sqrt{\frac{L_x}{L_t}}

    from L = A_L·N² for both windings on one core (IEC 60205 definition of A_L).

    Parameters
    ----------
    test_inductance : float
        L_t, the test winding's reading, H.
    test_turns : int
        n, the test winding's turns.
    unknown_inductance : float
        L_x, the unknown winding's reading, H.
    tolerance : float
        Relative accuracy of each reading (default ±1 %, an assumption).
    tolerance_given : bool
        The tolerance is the user's figure (changes the wording only).

    Returns
    -------
    TurnEstimate
        The interval takes L_x high with L_t low and the reverse.

    Raises
    ------
    InvalidInputError
        A reading not above zero, fewer than one test turn, a tolerance outside (0, 50 %).
    InfeasibleError
        Readings whose whole interval lies below one turn (the unknown winding reads less
        than one turn of the test winding would).

    Examples
    --------
    >>> estimate = count_from_test_winding(55e-6, 20, 1.375e-3)
    >>> round(estimate.turns_exact, 3), estimate.turns_range
    (100.0, (99, 101))
    """
    test_inductance = _check_positive(test_inductance, "test_inductance", "a test-winding inductance")
    unknown_inductance = _check_positive(unknown_inductance, "unknown_inductance", "an inductance")
    tolerance = _check_tolerance(tolerance, "tolerance")
    if test_turns < 1 or test_turns != int(test_turns):
        raise InvalidInputError("test_turns", "a test winding of at least 1 whole turn", test_turns)
    test_turns = int(test_turns)
    root = math.sqrt(unknown_inductance / test_inductance)
    turns = test_turns * root
    q = 1.0 + _root_shift(tolerance)
    low, high = turns / q, turns * q
    _refuse_under_one_turn(
        high, turns, f"the {test_turns}-turn test winding at {_henry(test_inductance)} and the unknown winding at "
        f"{_henry(unknown_inductance)}",
        f"the unknown winding reads less than one turn of the test winding would ("
        f"{_henry(test_inductance / test_turns**2)}); a reading is wrong, or the windings are not on the same "
        "closed core")
    words = (f"the {test_turns}-turn test winding read {_henry(test_inductance)} and the unknown winding "
             f"{_henry(unknown_inductance)}: N = {test_turns}·√({_henry(unknown_inductance)}/"
             f"{_henry(test_inductance)}) = {test_turns}·{root:.6g} = {turns:.1f}, about {_whole(turns)} turns "
             f"({_span(low, high)} with ±{_percent(tolerance)} readings)")
    assumptions = [_CLOSED_CORE, "the test winding shares the unknown winding's closed core; each winding was read "
                   "with the other left open", _WORST_CASE]
    if not tolerance_given:
        assumptions.insert(0, _meter_note(tolerance))
    return TurnEstimate("test-winding", turns, low, high, words, (), tuple(assumptions),
                        (("test_turns", test_turns),))
