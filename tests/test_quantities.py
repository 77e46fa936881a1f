"""Reading and writing engineering quantities: units, prefixes, and the slips that must be refused."""

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.errors import InvalidInputError
from coilplan.quantities import (
    format_length,
    format_quantity,
    parse_count,
    parse_quantity,
    parse_temperature,
)

# SI prefixes (BIPM SI Brochure, 9th ed., Table 7) and inch = 25.4 mm exactly (1959 agreement).
GOOD = [
    ("47uH", "H", 47e-6),
    ("47 µH", "H", 47e-6),  # micro sign U+00B5
    ("47 μH", "H", 47e-6),  # Greek mu U+03BC
    ("47uh", "H", 47e-6),
    ("4.7u", "H", 4.7e-6),
    ("2.2mH", "H", 2.2e-3),
    ("1.5H", "H", 1.5),
    ("330pF", "F", 330e-12),
    ("0.1uF", "F", 1e-7),
    ("1.2MHz", "Hz", 1.2e6),
    ("455kHz", "Hz", 455e3),
    ("455KHz", "Hz", 455e3),
    ("7e6Hz", "Hz", 7e6),
    ("25mm", "m", 0.025),
    ("2.5cm", "m", 0.025),
    ("1m", "m", 1.0),
    ("1in", "m", 0.0254),
    ('1"', "m", 0.0254),
    ("20mil", "m", 20 * 25.4e-6),
    ("20 thou", "m", 20 * 25.4e-6),
    ("500um", "m", 500e-6),
    ("0.47ohm", "ohm", 0.47),
    ("4.7kΩ", "ohm", 4700.0),
    ("420nH", "H/t2", 420e-9),
    (".5mm", "m", 0.0005),
    ("5MM", "m", 0.005),  # length units are case-blind: megametres are never meant
    ("3fF", "F", 3e-15),
]


@pytest.mark.parametrize(("text", "unit", "value"), GOOD)
def test_accepted_spellings(text, unit, value):
    """Each spelling a bench user types reads as the SI value."""
    assert math.isclose(parse_quantity(text, unit), value, rel_tol=1e-15)


BAD = [
    ("10", "H", "unit is missing"),
    ("25", "m", "unit is missing"),
    ("10uF", "H", "not a unit of inductance"),
    ("1,5mm", "m", "decimal point"),
    ("-3pF", "F", "negative"),
    ("0pF", "F", "above zero"),
    ("nan", "H", "number"),
    ("inf", "H", "number"),
    ("", "H", "empty"),
    ("   ", "H", "empty"),
    ("1e999H", "H", "out of range"),
    ("1e-999H", "H", "out of range"),
    ("25 m m", "m", "not a unit"),
    ("10 uHz", "H", "not a unit"),
    ("12 furlongs", "m", "not a unit"),
]


@pytest.mark.parametrize(("text", "unit", "why"), BAD)
def test_refused_with_the_option_named(text, unit, why):
    """A slip is refused with the option, the rule and what was typed."""
    with pytest.raises(InvalidInputError) as caught:
        parse_quantity(text, unit, "--value")
    message = str(caught.value)
    assert message.startswith("--value: expected ")
    assert why in message
    assert caught.value.option == "--value"


def test_zero_allowed_when_asked():
    """A lead allowance may be zero."""
    assert parse_quantity("0mm", "m", allow_zero=True) == 0.0


@given(st.floats(min_value=1e-15, max_value=1e11), st.sampled_from(["H", "F", "Hz", "ohm", "A"]))
def test_format_then_parse_round_trips(value, unit):
    """format → parse gives the value back to the printed significant digits (pint-style round trip)."""
    text = format_quantity(value, unit, 6)
    assert math.isclose(parse_quantity(text, unit), value, rel_tol=6e-6)


@given(st.floats(min_value=1e-7, max_value=1e3))
def test_length_format_round_trips(value):
    """Lengths format in mm or m and read back."""
    assert math.isclose(parse_quantity(format_length(value, 6), "m"), value, rel_tol=6e-6)


def test_prefix_rolls_over_after_rounding():
    """999.96 µH at 4 digits shows as 1.000 mH, never 1000 µH."""
    assert format_quantity(999.96e-6, "H") == "1.000 mH"


def test_counts_and_temperatures():
    """Turn counts are whole numbers; temperatures read in °C or K."""
    assert parse_count("40") == 40
    for bad in ("0", "-1", "2.5", "ten", ""):
        with pytest.raises(InvalidInputError):
            parse_count(bad, "--turns")
    assert parse_temperature("60°C") == 60.0
    assert parse_temperature("-10C") == -10.0
    assert math.isclose(parse_temperature("300K"), 26.85)
    for bad in ("60F", "hot", "-300C", "1,5C"):
        with pytest.raises(InvalidInputError):
            parse_temperature(bad)
