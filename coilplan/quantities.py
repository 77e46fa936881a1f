"""Engineering quantities as a bench user types them, and back.

``parse_quantity("47uH", "H")`` reads one value in one expected unit and
returns it in SI base units; :func:`format_quantity` renders an SI value with
an SI prefix and the Greek micro sign. The parser is strict where a slip would
silently change a value by orders of magnitude:

* a decimal comma is refused (``"1,5mm"`` would otherwise read as 15 mm);
* a bare number is refused where a unit is needed (``"25"`` for a length);
* a prefix alone is accepted for electrical units (``"10u"`` = 10 µH when an
  inductance is expected), never for lengths, where ``"m"`` is the metre;
* ``u``, ``µ`` (micro sign) and ``μ`` (Greek mu) all mean micro; ``K`` is
  accepted for kilo; the unit symbol itself is case-blind (``47uh``), the
  prefix is not (``m`` milli, ``M`` mega).

Lengths also take inches (``in``, ``inch``, ``"``) and mils (``mil``, ``thou``).

A value is accepted only within a range no bench coil, core, capacitor or meter
leaves (:data:`ACCEPTED_RANGES`); ``1e300H`` is a slip, not a coil, and refusing it
at the door keeps every formula downstream in the range of a float. The bounds are
inclusive and apply to the magnitude (a negative offset, where allowed, too):

===========  ========================  ===========  ===========  ==========================================
unit         what                      lowest       highest      why these bounds
===========  ========================  ===========  ===========  ==========================================
``H``        inductance                1 fH         100 kH       below a straight millimetre of wire; the
                                                                 top of a bench LCR meter's range
``F``        capacitance               1 fF         1 F          a probe's stray; a large electrolytic
``Hz``       frequency                 1 mHz        100 GHz      slow mains-transformer tests; microwave
``m``        length                    1 µm         100 m        a thin enamel build; a long antenna wire
``m2``       area                      1 µm²        1 m²         a thin wire's section; the largest cores
``ohm``      resistance                1 µΩ         100 MΩ       a thick copper bar; an insulation reading
``A``        current                   1 nA         10 kA        a meter's test current; a welder's lead
``V``        voltage                   1 µV         100 kV       a receiver's input; a large transmitter's
                                                                 tank
``T``        flux density              1 µT         10 T         the Earth's field /50; above any core
                                                                 material's saturation (about 2.5 T)
``H/t2``     AL value                  1 fH         10 H         an air-cored ring; far above any core
                                                                 (about 100 µH per turn²)
===========  ========================  ===========  ===========  ==========================================

(the figures are common practice, no source: a bench tool's outer limits, not a material's).
"""

from __future__ import annotations

import math
import re
from decimal import Decimal

from coilplan.errors import InvalidInputError

__all__ = [
    "ACCEPTED_RANGES",
    "UNIT_NAMES",
    "format_length",
    "format_quantity",
    "parse_count",
    "parse_loss_factor",
    "parse_measurement",
    "parse_pair",
    "parse_q_reading",
    "parse_quantity",
    "parse_relative",
    "parse_temperature",
]

#: What each unit symbol measures, for messages ("expected an inductance ...").
UNIT_NAMES: dict[str, str] = {
    "H": "an inductance",
    "F": "a capacitance",
    "Hz": "a frequency",
    "m": "a length",
    "m2": "an area",
    "ohm": "a resistance",
    "A": "a current",
    "V": "a voltage",
    "T": "a flux density",
    "H/t2": "an AL value (inductance per turn squared)",
}

_EXAMPLES: dict[str, str] = {
    "H": "10uH",
    "F": "330pF",
    "Hz": "1.2MHz",
    "m": "25mm or 1in",
    "m2": "50mm2 or 50mm²",
    "ohm": "0.5ohm",
    "A": "2A",
    "V": "12V",
    "T": "0.3T",
    "H/t2": "420nH",
}

#: Inclusive (lowest, highest) magnitude accepted for each unit, SI, and the range in words
#: (the table in the module docstring says why).
ACCEPTED_RANGES: dict[str, tuple[float, float, str]] = {
    "H": (1e-15, 1e5, "from 1 fH to 100 kH"),
    "F": (1e-15, 1.0, "from 1 fF to 1 F"),
    "Hz": (1e-3, 1e11, "from 1 mHz to 100 GHz"),
    "m": (1e-6, 100.0, "from 1 µm to 100 m"),
    "m2": (1e-12, 1.0, "from 1 µm² to 1 m²"),
    "ohm": (1e-6, 1e8, "from 1 µΩ to 100 MΩ"),
    "A": (1e-9, 1e4, "from 1 nA to 10 kA"),
    "V": (1e-6, 1e5, "from 1 µV to 100 kV"),
    "T": (1e-6, 10.0, "from 1 µT to 10 T"),
    "H/t2": (1e-15, 10.0, "from 1 fH to 10 H per turn²"),
}

#: Relative slack on the bounds, so that a bound typed another way ("0.001mm") still reads.
_RANGE_SLACK = 1e-12

_PREFIXES: dict[str, Decimal] = {
    "f": Decimal("1e-15"),
    "p": Decimal("1e-12"),
    "n": Decimal("1e-9"),
    "u": Decimal("1e-6"),
    "U": Decimal("1e-6"),
    "\u00b5": Decimal("1e-6"),  # micro sign
    "\u03bc": Decimal("1e-6"),  # Greek small letter mu
    "m": Decimal("1e-3"),
    "k": Decimal("1e3"),
    "K": Decimal("1e3"),
    "M": Decimal("1e6"),
    "G": Decimal("1e9"),
}

# Unit spellings, matched case-blind, for each expected unit.
_SYMBOLS: dict[str, tuple[str, ...]] = {
    "H": ("h", "henry", "henries", "henrys"),
    "F": ("f", "farad", "farads"),
    "Hz": ("hz",),
    "ohm": ("ohm", "ohms", "\u03c9", "\u2126"),
    "A": ("a", "amp", "amps"),
    "V": ("v", "volt", "volts"),
    "T": ("t", "tesla"),
    "H/t2": ("h", "h/t2", "h/turn2", "h/n2"),
}

# Length suffixes (case-blind except that "M" is not a length prefix).
_LENGTH_UNITS: dict[str, Decimal] = {
    "m": Decimal(1),
    "cm": Decimal("1e-2"),
    "mm": Decimal("1e-3"),
    "um": Decimal("1e-6"),
    "\u00b5m": Decimal("1e-6"),
    "\u03bcm": Decimal("1e-6"),
    "in": Decimal("0.0254"),
    "inch": Decimal("0.0254"),
    "inches": Decimal("0.0254"),
    '"': Decimal("0.0254"),
    "mil": Decimal("25.4e-6"),
    "mils": Decimal("25.4e-6"),
    "thou": Decimal("25.4e-6"),
}

_NUMBER = re.compile(r"^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)$")


def _fail(option: str, unit: str, text: str, why: str = "") -> InvalidInputError:
    what = UNIT_NAMES.get(unit, f"a value in {unit}")
    expected = f"{what} such as {_EXAMPLES.get(unit, '1' + unit)}"
    if why:
        expected += f" ({why})"
    return InvalidInputError(option, expected, text)


def _split_number(text: str, option: str, unit: str) -> tuple[Decimal, str]:
    stripped = text.strip()
    if not stripped:
        raise _fail(option, unit, text, "the value is empty")
    if "," in stripped:
        raise _fail(option, unit, text, "write the decimal point as '.', not ','")
    match = _NUMBER.match(stripped)
    if match is None:
        raise _fail(option, unit, text, "it must start with a number")
    return Decimal(match.group(1)), match.group(2).strip()


def _suffix_scale(suffix: str, unit: str) -> Decimal | None:
    """Scale factor of ``suffix`` for ``unit``, or None if it does not fit."""
    if unit == "m":
        return _LENGTH_UNITS.get(suffix) or _LENGTH_UNITS.get(suffix.lower())
    if unit == "m2":
        for square in ("^2", "²", "2"):
            if suffix.endswith(square) and suffix != square:
                length = _suffix_scale(suffix[: -len(square)], "m")
                return None if length is None else length * length
        return None
    if suffix == "":
        return None
    spellings = _SYMBOLS[unit]
    if suffix.lower() in spellings:
        return Decimal(1)
    prefix, rest = suffix[0], suffix[1:]
    if prefix in _PREFIXES and (rest == "" or rest.lower() in spellings):
        return _PREFIXES[prefix]
    return None


def parse_quantity(text: str, unit: str, option: str = "value", *,
                   allow_zero: bool = False, allow_negative: bool = False) -> float:
    """Read one quantity in one expected unit, returned in SI base units.

    Parameters
    ----------
    text : str
        What the user typed, e.g. ``"47uH"``, ``"47 µH"``, ``"0.5mm"``, ``"20mil"``.
    unit : str
        The expected unit: one of ``H F Hz m m2 ohm A V T H/t2``.
    option : str
        The field the value is for, named in the error message.
    allow_zero, allow_negative : bool
        Whether zero or negative values are accepted (default: only > 0). Where zero is
        accepted it may be typed without a unit (``"0"``): zero is zero in any unit.

    Returns
    -------
    float
        The value in SI base units (H, F, Hz, m, ohm, A, V, T, H per turn²).

    Raises
    ------
    InvalidInputError
        Wrong or missing unit, decimal comma, not a number, not finite,
        zero or negative where that is not allowed, or a magnitude outside
        :data:`ACCEPTED_RANGES` (the message gives the range).

    Examples
    --------
    >>> parse_quantity("47uH", "H")
    4.7e-05
    >>> parse_quantity("1 in", "m")
    0.0254
    >>> parse_quantity("10u", "H")
    1e-05
    >>> parse_quantity("50mm²", "m2")
    5e-05
    """
    if unit not in UNIT_NAMES:
        raise ValueError(f"unit must be one of {sorted(UNIT_NAMES)}; got {unit!r}")
    number, suffix = _split_number(str(text), option, unit)
    if allow_zero and number == 0 and suffix == "":
        return 0.0  # a bare zero: the same in every unit
    scale = _suffix_scale(suffix, unit)
    if scale is None:
        if suffix == "":
            why = "the unit is missing"
        else:
            why = f"'{suffix}' is not a unit of {UNIT_NAMES[unit].split(' ', 1)[1]}"
        raise _fail(option, unit, text, why)
    try:
        value = float(number * scale)  # exact decimal product, rounded once
    except ArithmeticError:  # decimal overflow of an absurd exponent
        value = math.inf
    if not math.isfinite(value) or (value == 0 and number != 0):
        raise _fail(option, unit, text, "the number is out of range")
    if value < 0 and not allow_negative:
        raise _fail(option, unit, text, "it must not be negative")
    if value == 0 and not allow_zero:
        raise _fail(option, unit, text, "it must be above zero")
    lowest, highest, words = ACCEPTED_RANGES[unit]
    if value != 0 and not lowest * (1 - _RANGE_SLACK) <= abs(value) <= highest * (1 + _RANGE_SLACK):
        raise _fail(option, unit, text, words)
    return value


#: The most digits a count is read with: a trillion turns is beyond any coil, and Python refuses to turn
#: strings of thousands of digits into numbers (common practice, no source).
MAX_COUNT_DIGITS = 12


def parse_count(text: str, option: str = "value", *, minimum: int = 1) -> int:
    """Read a whole count such as a number of turns.

    Examples
    --------
    >>> parse_count("40", "turns")
    40
    """
    stripped = str(text).strip()
    if not re.fullmatch(r"[+-]?\d+", stripped):
        raise InvalidInputError(option, f"a whole number of at least {minimum}", text)
    if len(stripped.lstrip("+-0")) > MAX_COUNT_DIGITS:  # read no further: no coil has such a count
        raise InvalidInputError(option, f"a whole number of at least {minimum} with at most {MAX_COUNT_DIGITS} "
                                f"digits", text)
    value = int(stripped)
    if value < minimum:
        raise InvalidInputError(option, f"a whole number of at least {minimum}", text)
    return value


def parse_pair(text: str, first, second, option: str, expected: str):
    """Read ``A@B``: two values joined by ``@``, each read by its own parser.

    ``first`` and ``second`` are callables taking (text, option); the message names the
    whole pair as ``expected`` and the part that failed.

    Examples
    --------
    >>> parse_pair("100pF@1.2MHz", lambda t, o: parse_quantity(t, "F", o),
    ...            lambda t, o: parse_quantity(t, "Hz", o), "resonance", "C@f")
    (1e-10, 1200000.0)
    """
    parts = str(text).split("@")
    if len(parts) != 2:
        raise InvalidInputError(option, expected, text)
    try:
        return first(parts[0], option), second(parts[1], option)
    except InvalidInputError as error:
        raise InvalidInputError(option, f"{expected} ({error.expected})", text) from None


def parse_measurement(text: str, option: str = "readings") -> tuple[float, int]:
    """Read a measured point ``L@N``: an inductance read on the meter at a whole number of turns.

    Returns
    -------
    tuple
        (inductance in H, turns).

    Examples
    --------
    >>> parse_measurement("120uH@36")
    (0.00012, 36)
    """
    return parse_pair(text, lambda part, name: parse_quantity(part, "H", name),
                      lambda part, name: parse_count(part, name), option,
                      "a measurement inductance@turns such as 120uH@36")


def parse_loss_factor(text: str, option: str = "loss_factor") -> tuple[float, float]:
    """Read a relative loss factor and its frequency, ``tanδ/µi@f``: ``40e-6@1MHz`` or ``40ppm@1MHz``.

    Returns
    -------
    tuple
        (tanδ/µi as a plain number, frequency in Hz).

    Examples
    --------
    >>> parse_loss_factor("40e-6@1MHz"), parse_loss_factor("25 ppm@100kHz")
    ((4e-05, 1000000.0), (2.5e-05, 100000.0))
    """
    return parse_pair(text, _loss_factor_number, lambda part, name: parse_quantity(part, "Hz", name), option,
                      "a relative loss factor tanδ/µi@frequency such as 40e-6@1MHz or 40ppm@1MHz")


def parse_q_reading(text: str, option: str = "measured_q") -> tuple[float, float]:
    """Read a Q the meter showed and its test frequency, ``Q@f``: ``85@100kHz``.

    Examples
    --------
    >>> parse_q_reading("85@100kHz")
    (85.0, 100000.0)
    """
    return parse_pair(text, _q_number, lambda part, name: parse_quantity(part, "Hz", name), option,
                      "a Q reading Q@frequency such as 85@100kHz")


def _q_number(text: str, option: str) -> float:
    try:
        value = float(str(text).strip())
    except ValueError:
        raise InvalidInputError(option, "a plain number (the Q) before the @", text) from None
    if not (math.isfinite(value) and 0.5 <= value <= 1e5):
        raise InvalidInputError(option, "a Q from 0.5 to 100000", text)
    return value


def _loss_factor_number(text: str, option: str) -> float:
    stripped = str(text).strip()
    divisor = 1.0
    if stripped.lower().endswith("ppm"):
        stripped, divisor = stripped[:-3].strip(), 1e6
    try:
        value = float(stripped) / divisor
    except ValueError:
        raise InvalidInputError(option, "a plain number or ppm before the @", text) from None
    if not (math.isfinite(value) and 0 < value < 0.01):
        raise InvalidInputError(option, "a loss factor above 0 and below 0.01 (10000 ppm)", text)
    return value


_NUMBER_AND_UNIT = re.compile(r"^([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(%|ppm)$", re.IGNORECASE)
_RELATIVE_EXPECTED = "a relative tolerance such as 1%, 0.5 % or 10000ppm"
_MAX_RELATIVE = 0.5


def parse_relative(text: str, option: str = "tolerance") -> float:
    """Read a relative tolerance in percent or ppm, returned as a fraction.

    Raises
    ------
    InvalidInputError
        A bare number (the % or ppm is missing), a decimal comma, or a value not above 0 and below 50 %.

    Examples
    --------
    >>> parse_relative("1%"), parse_relative("0.5 %"), parse_relative("10000ppm")
    (0.01, 0.005, 0.01)
    """
    stripped = str(text).strip()
    if "," in stripped:
        raise InvalidInputError(option, _RELATIVE_EXPECTED + " (write the decimal point as '.', not ',')", text)
    match = _NUMBER_AND_UNIT.match(stripped)
    if match is None:
        bare = re.fullmatch(r"[+-]?[\d.eE+-]+", stripped)
        why = "the % or ppm is missing" if bare else "it must be a number and % or ppm"
        raise InvalidInputError(option, f"{_RELATIVE_EXPECTED} ({why})", text)
    scale = 1e-2 if match.group(2) == "%" else 1e-6
    value = float(match.group(1)) * scale
    if not 0 < value < _MAX_RELATIVE:
        raise InvalidInputError(option, f"{_RELATIVE_EXPECTED}, above 0 % and below {_MAX_RELATIVE:.0%}", text)
    return value


def parse_temperature(text: str, option: str = "temperature") -> float:
    """Read a temperature in degrees Celsius (``60C``, ``60°C``, ``60degC``; ``333K``).

    Returns
    -------
    float
        Degrees Celsius.

    Examples
    --------
    >>> parse_temperature("60C")
    60.0
    >>> round(parse_temperature("373.15K"), 6)
    100.0
    """
    expected = "a temperature such as 20C or 60°C"
    stripped = str(text).strip()
    if "," in stripped:
        raise InvalidInputError(option, expected + " (write the decimal point as '.')", text)
    match = _NUMBER.match(stripped)
    if match is None:
        raise InvalidInputError(option, expected, text)
    number, suffix = float(match.group(1)), match.group(2).strip()
    if suffix.lower() in ("c", "°c", "degc", "\u2103"):
        celsius = number
    elif suffix == "K":
        celsius = number - 273.15
    else:
        raise InvalidInputError(option, expected + " (the unit must be C or K)", text)
    if not math.isfinite(celsius) or celsius < -273.15:
        raise InvalidInputError(option, expected + " (above absolute zero)", text)
    return celsius


_FORMAT_PREFIXES = (
    (1e9, "G"), (1e6, "M"), (1e3, "k"), (1.0, ""), (1e-3, "m"),
    (1e-6, "\u03bc"), (1e-9, "n"), (1e-12, "p"), (1e-15, "f"),
)


def format_quantity(value: float, unit: str, digits: int = 4) -> str:
    """Render an SI value with an SI prefix, e.g. ``format_quantity(1.02e-5, "H")``.

    ``digits`` is the number of significant digits. The Greek mu stands for micro.
    Non-finite values render as ``"n/a"``. Beyond the prefixes f to G (a mantissa that
    would fall below 0.001 f or reach 1,000,000 G) the value is written in scientific
    notation, so that no figure runs to a long string of digits.

    Examples
    --------
    >>> format_quantity(1.0204e-5, "H")
    '10.20 μH'
    >>> format_quantity(1.239e6, "Hz", 3)
    '1.24 MHz'
    >>> format_quantity(0.0, "ohm")
    '0 Ω'
    >>> format_quantity(2.5e-19, "F"), format_quantity(-3e15, "Hz")
    ('2.500e-19 F', '-3.000e+15 Hz')
    """
    symbol = "Ω" if unit == "ohm" else unit
    if not math.isfinite(value):
        return "n/a"
    if value == 0:
        return f"0 {symbol}"
    magnitude = abs(value)
    # the largest prefix that leaves a mantissa >= 1 after rounding to `digits`, so that
    # 999.96 µ shows as 1.000 m rather than 1000 µ
    rounded, prefix = 0.0, _FORMAT_PREFIXES[-1][1]
    for scale, symbol_prefix in _FORMAT_PREFIXES:
        rounded, prefix = float(f"{magnitude / scale:.{digits}g}"), symbol_prefix
        if rounded >= 1:
            break
    if rounded < 1e-3 or rounded >= 1e6:  # far beyond the prefixes: scientific notation
        return f"{value:.{max(digits - 1, 0)}e} {symbol}"
    decimals = max(digits - 1 - math.floor(math.log10(rounded)), 0) if rounded else 0
    sign = "-" if value < 0 else ""
    return f"{sign}{rounded:.{decimals}f} {prefix}{symbol}"


def format_length(value: float, digits: int = 4) -> str:
    """Render a length in millimetres (below 1 m) or metres; scientific below 1 nm or from 1000 km.

    Examples
    --------
    >>> format_length(0.0125)
    '12.50 mm'
    >>> format_length(2.5)
    '2.500 m'
    >>> format_length(1e300)
    '1.000e+300 m'
    """
    if not math.isfinite(value):
        return "n/a"
    if value != 0 and not 1e-9 <= abs(value) < 1e6:
        return f"{value:.{max(digits - 1, 0)}e} m"
    if abs(value) >= 1:
        decimals = max(digits - 1 - math.floor(math.log10(abs(value))), 0)
        return f"{value:.{decimals}f} m"
    mm = value * 1e3
    if mm == 0:
        return "0 mm"
    decimals = max(digits - 1 - math.floor(math.log10(abs(mm))), 0)
    return f"{mm:.{decimals}f} mm"
