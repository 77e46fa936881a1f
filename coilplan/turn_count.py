r"""The unknown turn count of a coil in hand: every method the data allow, and the strongest of them.

A salvaged choke or a potted coil seldom says how many turns it has. Three bench
measurements each give the count with an interval from the stated uncertainties:

* **added turns** (``"added-turns"``, :mod:`coilplan.turn_count_added`): readings before and
  after winding on known turns, N = a/(√(L₂/L₁) − 1).
* **test winding** (``"test-winding"``, :mod:`coilplan.turn_count_test_winding`): a test
  winding of n turns on the same closed core, N = n·√(L_x/L_t).
* **DC resistance** (``"resistance"``, :mod:`coilplan.turn_count_resistance`):
  N = (R − R_leads)/(R'(T)·ℓ_turn).

Each interval is the worst case of the stated tolerances (every error pushing the
same way). :func:`count_turns` runs every method the data allow and names the
strongest: the one with the narrowest interval relative to its count.
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.turn_count_added import count_from_added_turns
from coilplan.turn_count_estimate import METHOD_LABELS, TurnEstimate, _span
from coilplan.turn_count_ratio import DEFAULT_METER_TOLERANCE
from coilplan.turn_count_resistance import (
    DEFAULT_DIAMETER_TOLERANCE,
    DEFAULT_LENGTH_TOLERANCE,
    DEFAULT_RESISTANCE_TOLERANCE,
    count_from_resistance,
)
from coilplan.turn_count_test_winding import count_from_test_winding
from coilplan.wire import Wire

__all__ = ["TurnCount", "count_turns", "strongest_estimate"]

_WHY = {
    "added-turns": "an inductance ratio cancels the core's unknown AL, so only the meter's error remains, "
                   "and that shrinks as more turns are added",
    "test-winding": "an inductance ratio cancels the core's unknown AL, so only the meter's error remains",
    "resistance": "it needs no core at all, but rests on the wire diameter and the estimated turn length",
}


@dataclass(frozen=True)
class TurnCount:
    """The turn count by every method the data allowed, and the strongest of them.

    Attributes
    ----------
    strongest : TurnEstimate
        The estimate with the narrowest interval relative to its count.
    estimates : tuple of TurnEstimate
        Every estimate, in the order added turns, test winding, DC resistance.
    reason : str
        Why the strongest is the strongest, in words.
    warnings : tuple of str
    assumptions : tuple of str
    """

    strongest: TurnEstimate
    estimates: tuple[TurnEstimate, ...]
    reason: str
    warnings: tuple[str, ...]
    assumptions: tuple[str, ...]

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan count-turns --json``."""
        best = self.strongest
        return {
            "turns": best.turns,
            "turns_exact": best.turns_exact,
            "turns_range": list(best.turns_range),
            "method": best.method,
            "reason": self.reason,
            "methods": [estimate.as_dict() for estimate in self.estimates],
            "assumptions": list(self.assumptions),
        }


def _unique(items) -> tuple[str, ...]:
    return tuple(dict.fromkeys(items))


def strongest_estimate(estimates: Sequence[TurnEstimate], skipped: Sequence[str] = ()) -> TurnCount:
    """Choose the strongest estimate, cross-check the others against it, and gather the notes.

    Parameters
    ----------
    estimates : sequence of TurnEstimate
    skipped : sequence of str
        Why a method with data could not be used; each becomes a warning.

    Returns
    -------
    TurnCount

    Raises
    ------
    InfeasibleError
        No estimate: the reasons in ``skipped`` joined.
    """
    estimates = tuple(estimates)
    if not estimates:
        raise InfeasibleError("; ".join(skipped) or "no method had its data")
    best = min(estimates, key=lambda estimate: estimate.relative_uncertainty)
    others = [estimate for estimate in estimates if estimate is not best]

    def spread(estimate: TurnEstimate) -> str:
        if not math.isfinite(estimate.relative_uncertainty):
            return "unbounded"
        return f"±{estimate.relative_uncertainty * 100:.1f} %"

    if others:
        against = ", ".join(f"{spread(other)} by {other.label}" for other in others)
        reason = (f"{best.label} has the narrowest interval relative to the count ({spread(best)} against "
                  f"{against}): {_WHY[best.method]}")
    else:
        reason = f"{best.label} is the only method the data allow: {_WHY[best.method]}"
    warnings_ = [*skipped]
    for estimate in estimates:
        warnings_.extend(estimate.warnings)
    if best.method != "added-turns" and best.worst_deviation > 1.0:
        advice = {"test-winding": "the count's relative error is about the meter's, so only a more accurate "
                                  "meter narrows it",
                  "resistance": "measure the turn length and the bare wire diameter more closely, or add an "
                                "inductance method"}[best.method]
        warnings_.append(f"the count is known only to {_span(best.turns_low, best.turns_high)} turns "
                         f"({best.label}): {advice}")
    for other in others:
        if other.turns_high < best.turns_low or other.turns_low > best.turns_high:
            warnings_.append(
                f"the methods disagree: {best.label} gives {_span(best.turns_low, best.turns_high)} turns, "
                f"{other.label} {_span(other.turns_low, other.turns_high)}; usual causes: turns added in the "
                "opposite sense or off the core, a core that is not closed (gapped or a rod), lead resistance, "
                "a wrong wire diameter or turn length, readings on different meter ranges")
    assumptions = _unique(note for estimate in estimates for note in estimate.assumptions)
    return TurnCount(best, estimates, reason, _unique(warnings_), assumptions)


_NEEDS = {
    "added-turns": "added turns needs the readings before and after a change and the turns added (or removed)",
    "test-winding": "test winding needs the test winding's reading L@N and the unknown winding's inductance",
    "resistance": "DC resistance needs the winding's resistance, the wire and the mean turn length (or the inner "
                  "and outer perimeters)",
}

#: each method's data, field by field, in words (for the one that is missing)
_DATA = {
    "added-turns": {"before": "the reading before the change", "after": "the reading after the change",
                    "added": "the turns added (or removed)"},
    "test-winding": {"test_winding": "the test winding's reading L@N",
                     "unknown_inductance": "the unknown winding's inductance"},
    "resistance": {"resistance": "the winding's DC resistance", "wire": "the wire",
                   "turn_length": "the mean turn length"},
}


def count_turns(*, before: float | None = None, after: float | None = None, added: int | None = None,
                test_winding: tuple[float, int] | None = None, unknown_inductance: float | None = None,
                resistance: float | None = None, wire: Wire | None = None, turn_length: float | None = None,
                temperature_C: float = 20.0, lead_resistance: float = 0.0,
                tolerance: float | None = None, resistance_tolerance: float | None = None,
                diameter_tolerance: float | None = None, length_tolerance: float | None = None,
                turn_length_note: str = "") -> TurnCount:
    """Run every method the data allow and name the strongest.

    Parameters
    ----------
    before, after, added
        Added turns: readings (H) and turns added (negative: removed).
    test_winding : (float, int), optional
        Test winding: its reading (H) and turns; with ``unknown_inductance`` (H).
    resistance, wire, turn_length
        DC resistance (Ω), the wire, the mean turn length (m); with
        ``temperature_C`` and ``lead_resistance`` (Ω).
    tolerance, resistance_tolerance, diameter_tolerance, length_tolerance : float, optional
        Relative uncertainties; None takes the default, which is then listed as an assumption.
    turn_length_note : str
        Where the turn length came from, for the explanation.

    Returns
    -------
    TurnCount

    Raises
    ------
    InvalidInputError
        A method's data incomplete (names the missing field), or no method's data at all.
    InfeasibleError
        Every method with data failed (e.g. the inductance fell after adding turns).

    Examples
    --------
    >>> answer = count_turns(before=1.20e-3, after=1.45e-3, added=10, test_winding=(55e-6, 20),
    ...                      unknown_inductance=1.40e-3)
    >>> answer.strongest.method, answer.strongest.turns
    ('test-winding', 101)
    """
    groups = {
        "added-turns": {"before": before, "after": after, "added": added},
        "test-winding": {"test_winding": test_winding, "unknown_inductance": unknown_inductance},
        "resistance": {"resistance": resistance, "wire": wire, "turn_length": turn_length},
    }
    wanted = []
    for method, values in groups.items():
        if all(value is None for value in values.values()):
            continue
        missing = [name for name, value in values.items() if value is None]
        if missing:
            raise InvalidInputError(missing[0], f"{_DATA[method][missing[0]]} too: {_NEEDS[method]}", None)
        wanted.append(method)
    if not wanted:
        raise InvalidInputError("measurements", f"the data of at least one method: {'; '.join(_NEEDS.values())}",
                                None)
    meter = DEFAULT_METER_TOLERANCE if tolerance is None else tolerance
    estimates, skipped = [], []
    for method in wanted:
        try:
            if method == "added-turns":
                estimates.append(count_from_added_turns(before, after, added, meter,
                                                        tolerance_given=tolerance is not None))
            elif method == "test-winding":
                inductance, turns = test_winding
                estimates.append(count_from_test_winding(inductance, turns, unknown_inductance, meter,
                                                    tolerance_given=tolerance is not None))
            else:
                given = frozenset(name for name, value in (("resistance", resistance_tolerance),
                                                           ("diameter", diameter_tolerance),
                                                           ("length", length_tolerance)) if value is not None)
                estimates.append(count_from_resistance(
                    resistance, wire, turn_length, temperature_C=temperature_C, lead_resistance=lead_resistance,
                    resistance_tolerance=DEFAULT_RESISTANCE_TOLERANCE if resistance_tolerance is None
                    else resistance_tolerance,
                    diameter_tolerance=DEFAULT_DIAMETER_TOLERANCE if diameter_tolerance is None
                    else diameter_tolerance,
                    length_tolerance=DEFAULT_LENGTH_TOLERANCE if length_tolerance is None else length_tolerance,
                    given=given, turn_length_note=turn_length_note))
        except InfeasibleError as error:
            skipped.append(f"{METHOD_LABELS[method]} not used: {error}")
    if not estimates:
        raise InfeasibleError("; ".join(message.split(" not used: ", 1)[1] for message in skipped))
    return strongest_estimate(estimates, skipped)
