"""What the two inductance methods of counting turns share: L = AL·N² on a closed core and the meter's tolerance.

Added turns (:mod:`coilplan.turn_count_added`) and a test winding
(:mod:`coilplan.turn_count_test_winding`) both take a ratio of two inductance readings on one closed
core, where L = A_L·N² (the definition of A_L in IEC 60205), so the count goes as the square root of
the ratio. Two readings each within ±t move that root by at most a factor
q = √((1 + t)/(1 − t)).
"""

from __future__ import annotations

import math

from coilplan.turn_count_estimate import _percent

__all__ = ["DEFAULT_METER_TOLERANCE"]

#: Accuracy of each inductance reading when none is given: ±1 %, typical of a bench LCR meter's
#: basic accuracy (common practice, no source). An assumption the user should replace.
DEFAULT_METER_TOLERANCE = 0.01

_CLOSED_CORE = ("closed core: L = AL·N² (IEC 60205). On an air coil or a ferrite rod L is not proportional "
                "to N², because added turns lengthen the winding, so the inductance methods do not apply there")
_WORST_CASE = ("the interval is the worst case (the two readings erring in opposite directions); a scale "
               "error common to both readings, on one meter range, cancels in the ratio")


def _root_shift(tolerance: float) -> float:
    """q − 1: the most the square root of a ratio of two readings within ±tolerance can move, relative."""
    return math.sqrt((1.0 + tolerance) / (1.0 - tolerance)) - 1.0


def _meter_note(tolerance: float) -> str:
    return (f"each inductance reading within ±{_percent(tolerance)}: an assumed figure for a bench LCR meter; "
            "replace it with your meter's stated accuracy (--tolerance)")
