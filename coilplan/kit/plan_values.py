"""The kit plan file's values: the user's text with its unit read into SI floats, as pydantic field types.

Every value with a unit is written as text in the user's units (``"4.7uH"``, ``"12 mm"``) and read
with :func:`coilplan.quantities.parse_quantity`; a bare number, which would carry no unit, is refused.
A reel's length is read here from 1 mm to 100 km; readings ``"L@N"`` by
:func:`coilplan.quantities.parse_measurement`; a material class and a wire by their own readers.
The records that use these types are in :mod:`coilplan.kit.plan`.
"""

from __future__ import annotations

import functools
import math
import re
from typing import Annotated, Literal

from pydantic import AfterValidator, BeforeValidator

from coilplan.errors import InvalidInputError
from coilplan.quantities import parse_measurement, parse_quantity, parse_relative, parse_temperature

__all__ = [
    "REEL_RANGE",
    "AlValue",
    "Area",
    "Capacitance",
    "Count",
    "Current",
    "Fraction",
    "Frequency",
    "Grade",
    "Inductance",
    "Length",
    "LengthOrZero",
    "MaterialName",
    "Permeability",
    "Readings",
    "ReelLength",
    "Relative",
    "Temperature",
    "WireText",
]


def _text_of(value, what: str, example: str) -> str:
    if isinstance(value, bool) or not isinstance(value, str):
        raise ValueError(f"expected {what} written as text with its unit, such as \"{example}\"")
    return value


def _checked(parse, *args, **kwargs):
    """``parse(*args, **kwargs)``, its :class:`InvalidInputError` turned into pydantic's ``ValueError``."""
    try:
        return parse(*args, **kwargs)
    except InvalidInputError as error:
        raise ValueError(f"expected {error.expected}") from None


def _read_text(parse, what: str, example: str):
    """A validator reading the user's text with ``parse``.

    Only what the file gives is validated (pydantic leaves the defaults, already SI, alone), so a bare
    number, which would carry no unit, is refused like any other value not written as text.
    """

    def read(value):
        return _checked(parse, _text_of(value, what, example))

    return read


def _quantity(unit: str, what: str, example: str, *, allow_zero: bool = False):
    """A field read from the user's text in ``unit`` (SI float after validation)."""
    return Annotated[float, BeforeValidator(_read_text(
        functools.partial(parse_quantity, unit=unit, allow_zero=allow_zero), what, example))]


_relative = _read_text(parse_relative, "a relative value", "5%")
_temperature = _read_text(parse_temperature, "a temperature", "40C")


def _count(value):
    if isinstance(value, bool) or not isinstance(value, int) or value < 1:
        raise ValueError("expected a whole number of at least 1")
    return value


#: A reel's length may go beyond the 100 m the general length parser accepts (a reel of fine wire holds
#: hundreds of metres); the kit reads it itself, from 1 mm to 100 km.
REEL_RANGE = (1e-3, 1e5)
_REEL_NUMBER = re.compile(r"^\s*(\d+(?:\.\d*)?|\.\d+)(?:[eE]([+-]?\d+))?\s*(.*)$")


def _reel_length(value):
    """A reel's length, SI: the number times the unit, the unit read by parse_quantity from a thousandth of it."""
    text = _text_of(value, "a length", "250m")
    match = _REEL_NUMBER.match(text)
    expected = "a reel length such as 250m (from 1 mm to 100 km)"
    if match is None or not match.group(3).strip():
        raise ValueError(f"expected {expected}")
    per_unit = _checked(parse_quantity, "0.001" + match.group(3).strip(), "m") * 1000.0  # metres in one unit
    exponent = match.group(2) or "0"
    exponent = int(exponent) if len(exponent) <= 5 else 10**6  # no need to read a thousand-digit power
    # a power beyond floats' reach is out of range either way (1e400 would overflow, 1e-400 vanish)
    length = math.inf if abs(exponent) > 300 else float(match.group(1)) * 10.0**exponent * per_unit
    if not (math.isfinite(length) and REEL_RANGE[0] <= length <= REEL_RANGE[1]):
        raise ValueError(f"expected {expected}")
    return length


def _permeability(value):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not math.isfinite(value) or value < 1:
        raise ValueError("expected a relative permeability of at least 1, as a plain number such as 125")
    return float(value)


def _fraction(value):
    if isinstance(value, bool) or not isinstance(value, (int, float)) or not 0 < value < 1:
        raise ValueError("expected a fraction of the turns between 0 and 1, as a plain number such as 0.25")
    return float(value)


def _readings(value):
    """One ``"L@N"`` reading or a list of them -> ((H, turns), ...)."""
    items = [value] if isinstance(value, str) else value
    if not isinstance(items, (list, tuple)) or not items:
        raise ValueError("expected a reading inductance@turns such as \"12uH@20\", or a list of them")
    readings = []
    for item in items:
        text = _text_of(item, "a reading inductance@turns", "12uH@20")
        readings.append(_checked(parse_measurement, text, "measured"))
    if len({turns for _, turns in readings}) != len(readings):
        raise ValueError("expected one reading per turn count (average repeated readings first)")
    return tuple(readings)


def _material_name(name: str) -> str:
    from coilplan.materials import material

    return _checked(material, name).name


def _wire_text(text: str) -> str:
    from coilplan.wire import parse_wire

    _checked(parse_wire, text)
    return text


Length = _quantity("m", "a length", "12mm")
LengthOrZero = _quantity("m", "a length", "20mm", allow_zero=True)
ReelLength = Annotated[float, BeforeValidator(_reel_length)]
Inductance = _quantity("H", "an inductance", "4.7uH")
Capacitance = _quantity("F", "a capacitance", "100pF")
Frequency = _quantity("Hz", "a frequency", "7MHz")
Current = _quantity("A", "a current", "0.5A", allow_zero=True)
AlValue = _quantity("H/t2", "an AL value", "20nH")
Area = _quantity("m2", "an area", "50mm2")
Permeability = Annotated[float, BeforeValidator(_permeability)]
Fraction = Annotated[float, BeforeValidator(_fraction)]
Readings = Annotated[tuple[tuple[float, int], ...], BeforeValidator(_readings)]
MaterialName = Annotated[str, AfterValidator(_material_name)]
WireText = Annotated[str, AfterValidator(_wire_text)]
Grade = Literal["1", "2", "3", "bare"]
Relative = Annotated[float, BeforeValidator(_relative)]
Count = Annotated[int, BeforeValidator(_count)]
Temperature = Annotated[float, BeforeValidator(_temperature)]
