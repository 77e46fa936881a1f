"""Reading and writing engineering quantities: units, prefixes, and the slips that must be refused."""

import math
import re

import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.errors import InvalidInputError
from coilplan.quantities import (
    ACCEPTED_RANGES,
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


@st.composite
def _within_range(draw, unit):
    """A value inside the unit's accepted range, log-uniform, a little inside the bounds (6-digit rounding)."""
    lowest, highest, _ = ACCEPTED_RANGES[unit]
    exponent = draw(st.floats(min_value=math.log10(lowest) + 1e-5, max_value=math.log10(highest) - 1e-5))
    return 10.0**exponent


@given(st.sampled_from(["H", "F", "Hz", "ohm", "A", "V"]).flatmap(lambda unit: st.tuples(_within_range(unit),
                                                                                       st.just(unit))))
def test_format_then_parse_round_trips(value_and_unit):
    """format → parse gives the value back to the printed significant digits (pint-style round trip)."""
    value, unit = value_and_unit
    text = format_quantity(value, unit, 6)
    assert math.isclose(parse_quantity(text, unit), value, rel_tol=6e-6)


@given(_within_range("m"))
def test_length_format_round_trips(value):
    """Lengths format in mm or m and read back."""
    assert math.isclose(parse_quantity(format_length(value, 6), "m"), value, rel_tol=6e-6)


# Absurd magnitudes are slips, not coils (issue 8): each unit's bounds are inclusive, one step beyond is
# refused with the range in the message. The bounds are the module's table (a bench tool's limits).
@pytest.mark.parametrize(("inside", "outside", "unit", "words"), [
    ("1fH", "0.1fH", "H", "from 1 fH to 100 kH"),
    ("100kH", "1e300H", "H", "from 1 fH to 100 kH"),
    ("1F", "2F", "F", "from 1 fF to 1 F"),
    ("1mHz", "1e-300Hz", "Hz", "from 1 mHz to 100 GHz"),
    ("100GHz", "1e300Hz", "Hz", "from 1 mHz to 100 GHz"),
    ("1um", "1e-300m", "m", "from 1 µm to 100 m"),
    ("0.001mm", "0.5um", "m", "from 1 µm to 100 m"),
    ("100m", "1e300m", "m", "from 1 µm to 100 m"),
    ("1e-12m2", "1e-13m2", "m2", "1 µm²"),
    ("10kA", "1e300A", "A", "from 1 nA to 10 kA"),
    ("100kV", "1MV", "V", "from 1 µV to 100 kV"),
    ("10T", "1e300T", "T", "from 1 µT to 10 T"),
    ("100Mohm", "1e300ohm", "ohm", "from 1 µΩ to 100 MΩ"),
    ("10H", "1e300H", "H/t2", "from 1 fH to 10 H per turn²"),
])
def test_absurd_magnitudes_refused_with_the_range(inside, outside, unit, words):
    """The bound itself reads; a value beyond it is refused, naming the option and the range."""
    assert parse_quantity(inside, unit) > 0
    with pytest.raises(InvalidInputError) as caught:
        parse_quantity(outside, unit, "--value")
    assert str(caught.value).startswith("--value: expected ")
    assert words in str(caught.value)


def test_range_applies_to_the_magnitude_of_a_negative_value():
    """An offset may be negative, but not absurdly far."""
    assert parse_quantity("-50mm", "m", allow_negative=True) == -0.05
    with pytest.raises(InvalidInputError, match="from 1 µm to 100 m"):
        parse_quantity("-1e300m", "m", "--position", allow_negative=True)


def test_bare_zero_where_zero_is_allowed():
    """Zero needs no unit where zero is accepted (a gap of 0), and still needs one where it is not."""
    assert parse_quantity("0", "m", allow_zero=True) == 0.0
    assert parse_quantity("0.0", "ohm", allow_zero=True) == 0.0
    with pytest.raises(InvalidInputError, match="the unit is missing"):
        parse_quantity("0", "m", "--spacing")
    with pytest.raises(InvalidInputError, match="the unit is missing"):
        parse_quantity("2", "m", "--spacing", allow_zero=True)


@pytest.mark.parametrize(("value", "unit"), [(1e300, "H"), (1e-300, "H"), (-1e300, "Hz"), (1e-19, "F"),
                                             (9.999996e14, "Hz"), (1e21, "ohm")])
def test_no_long_digit_strings_beyond_the_prefixes(value, unit):
    """Far outside f .. G the value is written in scientific notation and still reads back to 4 digits."""
    text = format_quantity(value, unit)
    assert not re.search(r"\d{6,}", text), text
    mantissa, exponent = text.split()[0].split("e")
    assert math.isclose(float(mantissa) * 10.0 ** int(exponent), value, rel_tol=5e-4)


@pytest.mark.parametrize("value", [1e300, -1e300, 1e-300, 5e6])
def test_lengths_beyond_reason_in_scientific_notation(value):
    """A length no tape measure reads is written as mantissa and exponent, never hundreds of digits."""
    text = format_length(value)
    assert not re.search(r"\d{6,}", text), text
    assert math.isclose(float(text.split()[0]), value, rel_tol=5e-4)


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
