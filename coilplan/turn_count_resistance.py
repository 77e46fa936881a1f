r"""The unknown turn count from the winding's DC resistance, its wire and the mean turn length.

N = (R − R_leads)/(R'(T)·ℓ_turn), with R' the resistance per metre of the copper (IEC 60028,
:mod:`coilplan.wire`) and ℓ_turn the mean length of one turn (:func:`mean_turn_length` for an even
bobbin winding). The interval takes the reading, the wire diameter and the turn length all erring
the same way.

=====================  ============================  ======================================
symbol                 parameter                     meaning
=====================  ============================  ======================================
:math:`R`              ``resistance``                DC resistance read on the winding, Ω
:math:`\ell_{turn}`    ``turn_length``               mean length of one turn, m
=====================  ============================  ======================================
"""

from __future__ import annotations

import math

from coilplan.errors import InvalidInputError
from coilplan.quantities import format_length, format_quantity
from coilplan.turn_count_estimate import (
    TurnEstimate,
    _check_positive,
    _check_tolerance,
    _percent,
    _refuse_under_one_turn,
    _span,
    _whole,
)
from coilplan.wire import Wire

__all__ = ["DEFAULT_DIAMETER_TOLERANCE", "DEFAULT_LENGTH_TOLERANCE", "DEFAULT_RESISTANCE_TOLERANCE",
           "count_from_resistance", "mean_turn_length"]

#: Accuracy of a low-ohm DC reading with nulled test leads (common practice, no source).
DEFAULT_RESISTANCE_TOLERANCE = 0.02
#: Bare copper diameter known to ±2 %: a micrometer on scraped wire, or a gauge taken as nominal
#: (common practice, no source).
DEFAULT_DIAMETER_TOLERANCE = 0.02
#: Mean turn length estimated from the bobbin to ±5 % (common practice, no source).
DEFAULT_LENGTH_TOLERANCE = 0.05


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
