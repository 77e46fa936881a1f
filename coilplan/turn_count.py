r"""The unknown turn count of a coil in hand, from measurements, by three methods.

A salvaged choke or a potted coil seldom says how many turns it has. Three bench
measurements each give the count with an interval from the stated uncertainties:

* **added turns** (``"added-turns"``): read L₁, wind ``a`` more turns in the same
  sense on the same core, read L₂. On a closed core L = A_L·N² (the definition of
  A_L in IEC 60205), so (N + a)/N = √(L₂/L₁) and N = a/(√(L₂/L₁) − 1). Turns
  removed are a negative ``a``.
* **test winding** (``"test-winding"``): wind a separate test winding of n turns
  on the same closed core and read it (L_t) and the unknown winding (L_x):
  N = n·√(L_x/L_t).
* **DC resistance** (``"resistance"``): N = (R − R_leads)/(R'(T)·ℓ_turn), with R'
  the resistance per metre of the copper (IEC 60028, :mod:`coilplan.wire`) and
  ℓ_turn the mean length of one turn.

Each interval is the worst case of the stated tolerances (every error pushing the
same way). :func:`count_turns` runs every method the data allow and names the
strongest: the one with the narrowest interval relative to its count.

=====================  ============================  ======================================
symbol                 parameter                     meaning
=====================  ============================  ======================================
:math:`L_1, L_2`       ``before``, ``after``         readings before and after the change, H
:math:`a`              ``added``                     turns added (negative: removed)
:math:`n, L_t`         ``test_turns``, ``test_...``  test winding: turns and reading, H
:math:`L_x`            ``unknown_inductance``        reading of the unknown winding, H
:math:`R`              ``resistance``                DC resistance read on the winding, Ω
:math:`\ell_{turn}`    ``turn_length``               mean length of one turn, m
:math:`t`              ``tolerance``                 relative accuracy of each reading
=====================  ============================  ======================================
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.quantities import format_length, format_quantity
from coilplan.wire import Wire

__all__ = [
    "DEFAULT_DIAMETER_TOLERANCE",
    "DEFAULT_LENGTH_TOLERANCE",
    "DEFAULT_METER_TOLERANCE",
    "DEFAULT_RESISTANCE_TOLERANCE",
    "METHOD_LABELS",
    "TurnCount",
    "TurnEstimate",
    "added_turns_for_half_turn",
    "count_from_added_turns",
    "count_from_resistance",
    "count_from_test_winding",
    "count_turns",
    "mean_turn_length",
    "strongest_estimate",
]

#: Accuracy of each inductance reading when none is given: ±1 %, typical of a bench LCR meter's
#: basic accuracy (common practice, no source). An assumption the user should replace.
DEFAULT_METER_TOLERANCE = 0.01
#: Accuracy of a low-ohm DC reading with nulled test leads (common practice, no source).
DEFAULT_RESISTANCE_TOLERANCE = 0.02
#: Bare copper diameter known to ±2 %: a micrometer on scraped wire, or a gauge taken as nominal
#: (common practice, no source).
DEFAULT_DIAMETER_TOLERANCE = 0.02
#: Mean turn length estimated from the bobbin to ±5 % (common practice, no source).
DEFAULT_LENGTH_TOLERANCE = 0.05

#: Plain names of the methods, for text.
METHOD_LABELS: dict[str, str] = {
    "added-turns": "added turns",
    "test-winding": "test winding",
    "resistance": "DC resistance",
}

_WHY = {
    "added-turns": "an inductance ratio cancels the core's unknown AL, so only the meter's error remains, "
                   "and that shrinks as more turns are added",
    "test-winding": "an inductance ratio cancels the core's unknown AL, so only the meter's error remains",
    "resistance": "it needs no core at all, but rests on the wire diameter and the estimated turn length",
}

_CLOSED_CORE = ("closed core: L = AL·N² (IEC 60205). On an air coil or a ferrite rod L is not proportional "
                "to N², because added turns lengthen the winding, so the inductance methods do not apply there")
_WORST_CASE = ("the interval is the worst case (the two readings erring in opposite directions); a scale "
               "error common to both readings, on one meter range, cancels in the ratio")
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


def _meter_note(tolerance: float) -> str:
    return (f"each inductance reading within ±{_percent(tolerance)}: an assumed figure for a bench LCR meter; "
            "replace it with your meter's stated accuracy (--tolerance)")


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


# --------------------------------------------------------------------------- (a) added turns


def _root_shift(tolerance: float) -> float:
    """q − 1: the most the square root of a ratio of two readings within ±tolerance can move, relative."""
    return math.sqrt((1.0 + tolerance) / (1.0 - tolerance)) - 1.0


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


# --------------------------------------------------------------------------- (b) test winding


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


# --------------------------------------------------------------------------- (c) DC resistance


def mean_turn_length(inner_perimeter: float, outer_perimeter: float) -> float:
    r"""Mean length of one turn of a winding that fills a bobbin evenly from one perimeter to another.

    .. math::

        \ell_{turn} = \tfrac{1}{2}\,(P_{inner} + P_{outer})

    The perimeter grows linearly through the build, and an even winding has as
    many turns in each layer, so the mean turn is the mean of the two (common
    practice, no source).

    Parameters
    ----------
    inner_perimeter, outer_perimeter : float
        Length of one turn at the bottom and the top of the winding, m.

    Returns
    -------
    float
        m.

    Raises
    ------
    InvalidInputError
        A perimeter not above zero, or the outer below the inner.

    Examples
    --------
    >>> round(mean_turn_length(0.040, 0.060), 6)
    0.05
    """
    inner = _check_positive(inner_perimeter, "inner_perimeter", "a length")
    outer = _check_positive(outer_perimeter, "outer_perimeter", "a length")
    if outer < inner:
        raise InvalidInputError("outer_perimeter", f"a perimeter at least the inner perimeter "
                                f"{format_length(inner)}", format_length(outer))
    return 0.5 * (inner + outer)


def count_from_resistance(resistance: float, wire: Wire, turn_length: float, *, temperature_C: float = 20.0,
                     lead_resistance: float = 0.0,
                     resistance_tolerance: float = DEFAULT_RESISTANCE_TOLERANCE,
                     diameter_tolerance: float = DEFAULT_DIAMETER_TOLERANCE,
                     length_tolerance: float = DEFAULT_LENGTH_TOLERANCE,
                     given: frozenset[str] = frozenset(), turn_length_note: str = "") -> TurnEstimate:
    r"""The turn count from the winding's DC resistance, its wire and the mean turn length.

    .. math::

        N = \frac{R - R_{leads}}{R'(T)\,\ell_{turn}},\qquad R'(T) = \frac{\rho(T)}{\pi d^2/4}

    with ρ(T) annealed copper by IEC 60028 (:func:`coilplan.wire.copper_resistivity`).

    Parameters
    ----------
    resistance : float
        R, the reading across the winding, Ω.
    wire : Wire
        The wire; its bare copper diameter d counts.
    turn_length : float
        ℓ_turn, the mean length of one turn, m (see :func:`mean_turn_length`).
    temperature_C : float
        The winding's temperature when read, °C.
    lead_resistance : float
        Resistance of leads and test leads, subtracted from R, Ω.
    resistance_tolerance, diameter_tolerance, length_tolerance : float
        Relative uncertainty of R, d and ℓ_turn (defaults ±2 %, ±2 %, ±5 %: assumptions).
        An error δ in d gives about 2δ in R'.
    given : frozenset of str
        Which tolerances the user gave (``"resistance"``, ``"diameter"``, ``"length"``);
        the others are listed as assumptions.
    turn_length_note : str
        Where the turn length came from, for the explanation.

    Returns
    -------
    TurnEstimate
        The interval takes every error in the same direction (worst case).

    Raises
    ------
    InvalidInputError
        A value not above zero, leads of at least the reading, a tolerance outside (0, 50 %).
    InfeasibleError
        A reading below the resistance of one turn of the wire, even at the ends of the tolerances.

    Examples
    --------
    >>> from coilplan.wire import parse_wire
    >>> estimate = count_from_resistance(0.16655, parse_wire("20awg"), 0.050)
    >>> round(estimate.turns_exact, 1), estimate.turns_range
    (100.0, (90, 112))
    """
    resistance = _check_positive(resistance, "resistance", "a resistance")
    turn_length = _check_positive(turn_length, "turn_length", "a length")
    if not (math.isfinite(lead_resistance) and lead_resistance >= 0):
        raise InvalidInputError("lead_resistance", "a resistance of zero or more", f"{lead_resistance:.6g}")
    if lead_resistance >= resistance:
        raise InvalidInputError("lead_resistance", f"less than the reading {format_quantity(resistance, 'ohm')}",
                                format_quantity(lead_resistance, "ohm"))
    t_r = _check_tolerance(resistance_tolerance, "resistance_tolerance")
    t_d = _check_tolerance(diameter_tolerance, "diameter_tolerance")
    t_l = _check_tolerance(length_tolerance, "length_tolerance")
    per_metre = float(wire.resistance_per_metre(temperature_C))
    net = resistance - lead_resistance
    copper_length = net / per_metre
    turns = copper_length / turn_length
    # worst case: R read high, wire thicker (lower R'), turn shorter -- and the reverse
    # a reading within ±t of the true resistance: the truth lies in reading/(1 ± t)
    high = (resistance / (1 - t_r) - lead_resistance) * (1 + t_d) ** 2 / (per_metre * turn_length * (1 - t_l))
    low = max(resistance / (1 + t_r) - lead_resistance, 0.0) * (1 - t_d) ** 2 / (
        per_metre * turn_length * (1 + t_l))
    _refuse_under_one_turn(
        high, turns, f"{format_quantity(net, 'ohm')} of {wire.label} copper ({format_length(copper_length)} of "
        f"wire) at {format_length(turn_length)} a turn",
        f"the reading is below the resistance of a single turn of this wire "
        f"({format_quantity(per_metre * turn_length, 'ohm')}); check the reading (null the test leads), the wire "
        "diameter and the turn length")
    reading = format_quantity(resistance, "ohm")
    if lead_resistance > 0:
        reading += f" − {format_quantity(lead_resistance, 'ohm')} leads = {format_quantity(net, 'ohm')}"
    source = f" ({turn_length_note})" if turn_length_note else ""
    words = (f"{reading} across the winding; {wire.label} copper ({format_length(wire.diameter)} bare) has "
             f"{format_quantity(per_metre, 'ohm')}/m at {temperature_C:g} °C (IEC 60028), so the winding holds "
             f"{format_length(copper_length)} of wire; at {format_length(turn_length)} a turn{source}, "
             f"N = {format_length(copper_length)}/{format_length(turn_length)} = {turns:.1f}, about {_whole(turns)} "
             f"turns ({_span(low, high)} with ±{_percent(t_r)} on R, ±{_percent(t_d)} on the diameter, "
             f"±{_percent(t_l)} on the turn length)")
    assumptions = []
    if "resistance" not in given:
        assumptions.append(f"resistance reading within ±{_percent(t_r)}: an assumed figure; give your meter's "
                           "(--resistance-tolerance), and null the test leads or give --lead-resistance")
    if "diameter" not in given:
        assumptions.append(f"bare copper diameter within ±{_percent(t_d)}: an assumed figure (--diameter-tolerance);"
                           f" a diameter error of δ is 2δ in the resistance per metre")
    if "length" not in given:
        assumptions.append(f"mean turn length within ±{_percent(t_l)}: an assumed figure (--length-tolerance); "
                           "the turn length is usually the weakest link of this method")
    assumptions.append(f"annealed copper by IEC 60028 at {temperature_C:g} °C (0.393 %/K): read the resistance with "
                       "the coil at the stated --temperature; commercial copper runs about 97 % to 101 % of that "
                       "conductivity, and the diameter is of the bare copper, not over the enamel")
    extra = (("turn_length_m", turn_length), ("wire_length_m", copper_length),
             ("resistance_per_metre_ohm_per_m", per_metre), ("temperature_C", float(temperature_C)))
    return TurnEstimate("resistance", turns, low, high, words, (), tuple(assumptions), extra)


# --------------------------------------------------------------------------- the answer


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
