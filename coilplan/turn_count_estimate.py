"""One method's estimate of a turn count: the result, its words, and the checks every method makes.

:class:`TurnEstimate` holds a count with its worst-case interval, the arithmetic in words and the
method's notes; :mod:`coilplan.turn_count_added`, :mod:`coilplan.turn_count_test_winding` and
:mod:`coilplan.turn_count_resistance` each return one, and :func:`coilplan.turn_count.count_turns`
compares them. The helpers here round a count to whole turns, write intervals, tolerances and
inductances in words, refuse a value or tolerance out of range naming its field, and refuse readings
that leave less than one turn.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.quantities import format_quantity

__all__ = ["METHOD_LABELS", "TurnEstimate"]

#: Plain names of the methods, for text.
METHOD_LABELS: dict[str, str] = {
    "added-turns": "added turns",
    "test-winding": "test winding",
    "resistance": "DC resistance",
}

_MAX_TOLERANCE = 0.5


def _whole(value: float) -> int:
    """Nearest whole number, halves rounded up (not to even)."""
    return math.floor(value + 0.5)


def _percent(fraction: float) -> str:
    return f"{fraction * 100:.3g} %"


def _span(low: float, high: float) -> str:
    low_whole = max(_whole(low), 0)
    if not math.isfinite(high):
        return f"{low_whole} or more"
    return f"{low_whole} to {_whole(high)}"


def _henry(value: float) -> str:
    return format_quantity(value, "H", 4)



def _check_tolerance(value: float, option: str) -> float:
    if not (math.isfinite(value) and 0 < value < _MAX_TOLERANCE):
        raise InvalidInputError(option, f"a tolerance above 0 % and below {_MAX_TOLERANCE:.0%}", f"{value:.6g}")
    return float(value)


def _check_positive(value: float, option: str, expected: str) -> float:
    if not (math.isfinite(value) and value > 0):
        raise InvalidInputError(option, expected + " above zero", f"{value:.6g}")
    return float(value)


def _refuse_under_one_turn(high: float, turns: float, why: str, advice: str) -> None:
    """Raise InfeasibleError when even the top of the interval rounds to no turn at all.

    A winding has at least one turn: readings whose whole interval lies below half a turn
    (shown as "0 to 0") say that a reading, or the premise of the method, is wrong.
    """
    if high < 0.5:
        raise InfeasibleError(f"{why} give {turns:.2g} turns ({high:.2g} at most with the stated tolerances), "
                              f"less than the one turn any winding has: {advice}")


@dataclass(frozen=True)
class TurnEstimate:
    """The turn count by one method, with its worst-case interval.

    Attributes
    ----------
    method : {"added-turns", "test-winding", "resistance"}
    turns_exact : float
        The count as the arithmetic gives it (not rounded).
    turns_low, turns_high : float
        The interval from the stated tolerances; ``turns_high`` is ``inf`` when the
        readings cannot bound it.
    explanation : str
        The arithmetic in words a bench user follows.
    warnings : tuple of str
    assumptions : tuple of str
        The figures taken as given (default tolerances, the model's premise).
    extra : dict
        Method-specific fields for the result (SI units, unit in the key).
    """

    method: str
    turns_exact: float
    turns_low: float
    turns_high: float
    explanation: str
    warnings: tuple[str, ...] = ()
    assumptions: tuple[str, ...] = ()
    extra: tuple[tuple[str, object], ...] = ()

    @property
    def label(self) -> str:
        """The method's plain name."""
        return METHOD_LABELS[self.method]

    @property
    def turns(self) -> int:
        """The nearest whole number of turns (at least 1)."""
        return max(_whole(self.turns_exact), 1)

    @property
    def turns_range(self) -> tuple[int, int | None]:
        """The whole numbers nearest the interval's ends; ``None`` for an unbounded top."""
        high = _whole(self.turns_high) if math.isfinite(self.turns_high) else None
        return max(_whole(self.turns_low), 0), high

    @property
    def relative_uncertainty(self) -> float:
        """Half the interval's width over the count (``inf`` when unbounded)."""
        return (self.turns_high - self.turns_low) / (2.0 * self.turns_exact)

    @property
    def worst_deviation(self) -> float:
        """The farther of the interval's ends from the count, in turns."""
        return max(self.turns_high - self.turns_exact, self.turns_exact - self.turns_low)

    def as_dict(self) -> dict:
        """The per-method object of the ``--json`` result."""
        return {
            "method": self.method,
            "turns_exact": self.turns_exact,
            "turns": self.turns,
            "turns_range": list(self.turns_range),
            "turns_interval": [self.turns_low, self.turns_high],
            "relative_uncertainty": self.relative_uncertainty,
            "explanation": self.explanation,
            **dict(self.extra),
        }
