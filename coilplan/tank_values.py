"""Reading and checking a tank's values: a range ``low:high``, a resonance ``C@f``, a value above zero.

The readers give SI floats for :mod:`coilplan.tank` (two of L, C, f), :mod:`coilplan.tank_band`
(a band and a capacitor's travel), :mod:`coilplan.tank_fit` (resonances) and :mod:`coilplan.tank_drive`
(a tank at power); each refuses bad input with one line naming the option. ``_f`` writes a value
with its unit for their messages.
"""

from __future__ import annotations

import math

from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity, parse_pair, parse_quantity

__all__ = ["parse_range", "parse_resonance"]

_RANGE_EXAMPLES = {"Hz": "530kHz:1700kHz", "F": "10pF:365pF"}


def _f(value: float, unit: str, digits: int = 4) -> str:
    return format_quantity(float(value), unit, digits)


def parse_range(text: str, unit: str, option: str) -> tuple[float, float]:
    """Read a range ``low:high`` of one unit, e.g. a band ``530kHz:1700kHz`` or a capacitor's travel ``10pF:365pF``.

    Parameters
    ----------
    text : str
        What the user typed; the two ends may come in either order.
    unit : str
        The unit both ends must be in (``"Hz"``, ``"F"``).
    option : str
        The field the range is for, named in the message.

    Returns
    -------
    tuple of float
        (low, high) in SI units, low < high.

    Raises
    ------
    InvalidInputError
        Not two values separated by ':', either end not a quantity of ``unit``, or both ends equal.

    Examples
    --------
    >>> parse_range("530kHz:1700kHz", "Hz", "band")
    (530000.0, 1700000.0)
    >>> parse_range("365pF:10pF", "F", "capacitor")
    (1e-11, 3.65e-10)
    """
    example = _RANGE_EXAMPLES.get(unit, f"1{unit}:2{unit}")
    expected = f"a range low:high such as {example}"
    parts = str(text).split(":")
    if len(parts) != 2:
        raise InvalidInputError(option, expected, text)
    try:
        ends = sorted(parse_quantity(part, unit, option) for part in parts)
    except InvalidInputError as error:
        raise InvalidInputError(option, f"{expected} ({error.expected})", text) from None
    if ends[0] == ends[1]:
        raise InvalidInputError(option, f"{expected} with two different ends", text)
    return ends[0], ends[1]


def parse_resonance(text: str, option: str = "points") -> tuple[float, float]:
    """Read a resonance ``C@f``: a known capacitor and the frequency at which the coil resonated with it
    (one of the ``points`` of :func:`coilplan.tank_fit.fit_resonances`).

    Returns
    -------
    tuple of float
        (capacitance in F, frequency in Hz).

    Examples
    --------
    >>> parse_resonance("100pF@1.2MHz")
    (1e-10, 1200000.0)
    """
    return parse_pair(text, lambda part, name: parse_quantity(part, "F", name),
                      lambda part, name: parse_quantity(part, "Hz", name), option,
                      "a resonance capacitance@frequency such as 100pF@1.2MHz")


def _positive(value: float, option: str, unit: str, *, allow_zero: bool = False) -> float:
    value = float(value)
    if not math.isfinite(value) or value < 0 or (value == 0 and not allow_zero):
        what = "zero or more" if allow_zero else "above zero"
        in_unit = f" in {unit}" if unit else ""
        raise InvalidInputError(option, f"a finite value{in_unit} {what}", f"{value:.6g}")
    return value
