"""Round copper winding wire: gauges, enamel build, resistance and current.

Three ways to name a wire are understood: an AWG gauge (by the ASTM B258
formula), an SWG gauge (from the Imperial Standard Wire Gauge table in
``core_data/swg.csv``) and a bare diameter with its unit. A :class:`Wire` record
holds the bare diameter and the overall diameter over the enamel, which sets
the pitch of a close-wound coil.

=====================  ========================  ===========================================
symbol                 parameter                 meaning
=====================  ========================  ===========================================
:math:`n`              ``gauge``                 AWG number; 1/0 = 0, 2/0 = −1, 4/0 = −3
:math:`d`              ``diameter``              bare copper diameter, m
:math:`D`              ``overall_diameter``      diameter over the enamel, m
:math:`T`              ``temperature_C``         conductor temperature, °C
:math:`\\rho`           ``copper_resistivity``    resistivity of annealed copper, Ω·m
:math:`J`              ``density_A_per_mm2``     current density, A/mm²
=====================  ========================  ===========================================

The enamel build comes from a *partial* copy of IEC 60317-0-1 Table 1 (see
:func:`enamel_build`): values between its rows are interpolated and values
beyond them extrapolated, and a :class:`Wire` says when that happened.
"""

from __future__ import annotations

import dataclasses
import difflib
import functools
import math
import re
import warnings
from typing import Literal, NamedTuple

import numpy as np

from coilplan._data import RowError, load_table, rule
from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.quantities import format_length, parse_quantity

__all__ = [
    "GRADES",
    "EnamelBuild",
    "Wire",
    "awg_diameter",
    "copper_resistance_per_metre",
    "copper_resistivity",
    "current_for_density",
    "enamel_build",
    "parse_awg_gauge",
    "parse_current_density",
    "parse_wire",
    "swg_diameter",
    "wire_table",
]

#: The enamel grades a user may ask for: IEC 60317 grades 1, 2, 3, or bare copper.
GRADES: tuple[str, ...] = ("1", "2", "3", "bare")

# IEC 60028 (1925): annealed copper at 20 °C has 1/58 Ω·mm²/m, and the constant-mass
# temperature coefficient of resistance at 20 °C is 0.00393 per kelvin.
_RHO_20 = 1.0 / 58.0 * 1e-6  # Ω·m
_ALPHA_20 = 0.00393  # 1/K, referenced to 20 °C
# The range in which coilplan trusts the linear law without a warning (our choice, no source).
_LINEAR_RANGE_C = (-50.0, 200.0)

# AWG: 4/0 (n = -3) is the largest gauge ASTM B258 defines; 56 is the finest we accept.
_AWG_RANGE = (-3, 56)
# Bare diameters typed by the user: coilplan's own sanity range (a slip of unit lands outside).
_DIAMETER_RANGE_M = (10e-6, 13e-3)
_INCH = 0.0254


# --------------------------------------------------------------------------- copper


def copper_resistivity(temperature_C=20.0):
    """Resistivity of annealed copper by IEC 60028, linear in temperature.

    .. math::

        \\rho(T) = \\rho_{20}\\,[1 + \\alpha_{20}\\,(T - 20\\,°C)],\\qquad
        \\rho_{20} = \\tfrac{1}{58}\\ \\Omega\\,mm^2/m,\\quad \\alpha_{20} = 0.00393\\ K^{-1}

    Parameters
    ----------
    temperature_C : float or array_like, shape (n,)
        Conductor temperature, °C.

    Returns
    -------
    numpy.ndarray or numpy.float64
        Resistivity, Ω·m, shaped like ``temperature_C``. NaN in, NaN out.

    Warns
    -----
    OutsideValidityWarning
        A temperature outside −50 °C to 200 °C, where coilplan does not rely on the
        linear law (a range of our choosing; the standard states only α at 20 °C).

    Notes
    -----
    α = 0.00393 /K is referenced to 20 °C: do not re-reference it to 0 °C or
    compound it. Commercial copper runs about 97 % to 101 % of this conductivity.

    References
    ----------
    .. [IEC60028] IEC 60028:1925, *International standard of resistance for copper*,
       International Electrotechnical Commission, 1925.

    Examples
    --------
    >>> print(f"{copper_resistivity(20.0) * 1e9:.4f} nΩ·m")
    17.2414 nΩ·m
    >>> print(f"{copper_resistivity(100.0) * 1e9:.3f} nΩ·m")
    22.662 nΩ·m
    """
    temperature = np.asarray(temperature_C, dtype=float)
    low, high = _LINEAR_RANGE_C
    if np.any((temperature < low) | (temperature > high)):
        warnings.warn(f"copper resistivity: the linear IEC 60028 law is used outside "
                      f"{low:g} °C to {high:g} °C", OutsideValidityWarning, stacklevel=2)
    return (_RHO_20 * (1.0 + _ALPHA_20 * (temperature - 20.0)))[()]


def copper_resistance_per_metre(diameter, temperature_C=20.0):
    """DC resistance per metre of round solid copper wire.

    .. math::

        R' = \\frac{\\rho(T)}{\\pi d^2 / 4}

    Parameters
    ----------
    diameter : float or array_like, shape (n,)
        Bare copper diameter, m.
    temperature_C : float or array_like, shape (n,)
        Conductor temperature, °C (broadcast against ``diameter``).

    Returns
    -------
    numpy.ndarray or numpy.float64
        Resistance, Ω/m. ρ(T) is :func:`copper_resistivity`.

    Examples
    --------
    >>> print(f"{copper_resistance_per_metre(1e-3):.5f} Ω/m")
    0.02195 Ω/m
    """
    diameter = np.asarray(diameter, dtype=float)
    return (copper_resistivity(temperature_C) / (math.pi * diameter**2 / 4.0))[()]


# --------------------------------------------------------------------------- gauges


def _gauge_error(option: str, expected: str, text: object, why: str = "") -> InvalidInputError:
    return InvalidInputError(option, expected + (f" ({why})" if why else ""), text)


def parse_awg_gauge(text: str, option: str = "gauge") -> float:
    """Read an AWG gauge number: ``"24"``, ``"24.5"``, ``"0"``, ``"00"`` … ``"0000"``, ``"4/0"``.

    ``"0000"`` and ``"4/0"`` are −3 in the formula of :func:`awg_diameter`, ``"00"``
    and ``"2/0"`` are −1, ``"0"`` and ``"1/0"`` are 0. Half gauges are accepted.

    Returns
    -------
    float
        The gauge number n, from −3 (4/0) to 56.

    Raises
    ------
    InvalidInputError
        Not a whole or half gauge from 4/0 to 56.

    Examples
    --------
    >>> parse_awg_gauge("0000"), parse_awg_gauge("2/0"), parse_awg_gauge("24.5")
    (-3.0, -1.0, 24.5)
    """
    expected = "an AWG gauge from 4/0 (0000) to 56, whole or half, such as 24awg"
    stripped = str(text).strip().lower()
    if len(stripped) > 6:  # read no further: no gauge is written with so many characters
        raise _gauge_error(option, expected, text, "no gauge is written with so many digits")
    if re.fullmatch(r"0+", stripped):
        number = 1.0 - len(stripped)
    elif match := re.fullmatch(r"([1-9])\s*/\s*0", stripped):
        number = 1.0 - int(match.group(1))
    elif re.fullmatch(r"\d+(?:\.\d+)?", stripped):
        number = float(stripped)
        if stripped.startswith("0") and not stripped.startswith("0."):
            raise _gauge_error(option, expected, text, "a leading 0 makes it an aught size")
        if number * 2 != round(number * 2):
            raise _gauge_error(option, expected, text, "only whole and half gauges")
        if number < 1 and number != round(number):
            raise _gauge_error(option, expected, text, "half gauges start at 1")
    else:
        raise _gauge_error(option, expected, text)
    if not _AWG_RANGE[0] <= number <= _AWG_RANGE[1]:
        raise _gauge_error(option, expected, text, f"there is no AWG {stripped} here")
    return number


def awg_diameter(gauge):
    """Bare diameter of an AWG gauge by the ASTM B258 formula.

    .. math::

        d_n = 0.127\\ \\mathrm{mm} \\times 92^{(36 - n)/39}

    so that 36 AWG is exactly 0.005 in and 4/0 (n = −3) exactly 0.46 in; 39
    gauges span the ratio 92 between them.

    Parameters
    ----------
    gauge : float or array_like, shape (n,), or str
        Gauge number n (fractional gauges allowed), or one gauge as text in the
        forms :func:`parse_awg_gauge` reads (``"0000"``, ``"4/0"``, ``"24"``).

    Returns
    -------
    numpy.ndarray or numpy.float64
        Bare diameter, m. NaN in, NaN out.

    Notes
    -----
    ASTM B258 tabulates these diameters rounded to 0.1 mil; for the finest
    gauges the rounded table differs from the formula by up to about 1.5 %.

    References
    ----------
    .. [ASTMB258] ASTM B258, *Standard Specification for Standard Nominal Diameters
       and Cross-Sectional Areas of AWG Sizes of Solid Round Wires Used as Electrical
       Conductors*, ASTM International (formula of the AWG series).

    Examples
    --------
    >>> print(f"{awg_diameter(24) * 1e3:.6f} mm")
    0.510559 mm
    >>> print(f"{awg_diameter('0000') / 0.0254:.6f} in")
    0.460000 in
    """
    number = parse_awg_gauge(gauge) if isinstance(gauge, str) else np.asarray(gauge, dtype=float)
    return (0.127e-3 * 92.0 ** ((36.0 - np.asarray(number, dtype=float)) / 39.0))[()]


@dataclasses.dataclass(frozen=True)
class _SwgRow:
    gauge: str = rule(pattern=r"^(?:[1-7]/0|[1-9]\d?)$")
    diameter_in: float = rule(gt=0, lt=1)
    source: str = rule(min_length=1)


@functools.cache
def _swg_diameters() -> dict[str, float]:
    """SWG gauge name -> bare diameter in metres, thickest first."""
    return {row.gauge: row.diameter_in * _INCH for row in load_table("swg.csv", _SwgRow)}


def _swg_name(text: str, option: str) -> str:
    table = _swg_diameters()
    names = list(table)
    expected = f"an SWG gauge from {names[0]} to {names[-1]}, such as 26swg"
    stripped = str(text).strip().lower()
    if re.fullmatch(r"0+", stripped):
        name = f"{len(stripped)}/0"
    elif match := re.fullmatch(r"([1-9])\s*/\s*0", stripped):
        name = f"{match.group(1)}/0"
    elif re.fullmatch(r"[1-9]\d*", stripped):
        name = stripped
    elif re.fullmatch(r"\d+\.\d+", stripped):
        raise _gauge_error(option, expected, text, "SWG has no fractional gauges")
    else:
        raise _gauge_error(option, expected, text)
    if name not in table:
        raise _gauge_error(option, expected, text, "no such SWG gauge" if len(name) > 6 else f"there is no SWG {name}")
    return name


def swg_diameter(gauge, option: str = "gauge") -> float:
    """Bare diameter of an Imperial Standard Wire Gauge size, from ``core_data/swg.csv``.

    Parameters
    ----------
    gauge : str or int
        ``"26"``, ``26``, ``"7/0"`` or ``"0000000"`` (7/0), ``"0"`` (1/0).
    option : str
        The field named in an error message.

    Returns
    -------
    float
        Bare diameter, m.

    Raises
    ------
    InvalidInputError
        Not an SWG gauge (SWG runs from 7/0 to 50).

    References
    ----------
    .. [SWG1883] Board of Trade, Imperial Standard Wire Gauge (Order in Council, 1883);
       later BS 3737:1964, *Standard wire gauge*, withdrawn.

    Examples
    --------
    >>> print(f"{swg_diameter('26') / 0.0254:.3f} in")
    0.018 in
    >>> print(f"{swg_diameter('7/0') * 1e3:.1f} mm")
    12.7 mm
    """
    return _swg_diameters()[_swg_name(str(gauge), option)]


# --------------------------------------------------------------------------- enamel


@dataclasses.dataclass(frozen=True)
class _EnamelRow:
    nominal_diameter_mm: float = rule(gt=0)
    source: str = rule(min_length=1)
    grade1_min_increase_mm: float | None = rule(None, gt=0)
    grade1_max_overall_mm: float | None = rule(None, gt=0)
    grade2_min_increase_mm: float | None = rule(None, gt=0)
    grade2_max_overall_mm: float | None = rule(None, gt=0)
    grade3_min_increase_mm: float | None = rule(None, gt=0)
    grade3_max_overall_mm: float | None = rule(None, gt=0)

    def __post_init__(self):
        for grade in "123":
            largest = getattr(self, f"grade{grade}_max_overall_mm")
            if largest is not None and largest <= self.nominal_diameter_mm:
                raise RowError(f"grade{grade}_max_overall_mm", f"grade {grade} maximum overall diameter must "
                               "exceed the nominal diameter")


class _LogLogColumn:
    """One column of the enamel table: increase in diameter against bare diameter.

    Interpolation is linear in (log d, log increase). Beyond the first or last
    row the column follows a power law through that end row, its exponent fitted
    by least squares (in log-log) to the rows within a factor of 2 in diameter
    of that end.
    """

    _FIT_SPAN = math.log(2.0)
    _HALF_DIGIT = 0.0005e-3  # m

    def __init__(self, diameters_m: np.ndarray, increases_m: np.ndarray):
        self.x = np.log(diameters_m)
        self.y = np.log(increases_m)
        self.slope_low = self._end_slope(self.x, self.y)
        self.slope_high = self._end_slope(self.x[::-1], self.y[::-1])

    @classmethod
    def _end_slope(cls, x: np.ndarray, y: np.ndarray) -> float:
        near = np.abs(x - x[0]) <= cls._FIT_SPAN
        near[:2] = True  # at least the end row and its neighbour
        dx, dy = x[near] - x[0], y[near] - y[0]
        return float(np.sum(dx * dy) / np.sum(dx * dx))

    def __call__(self, diameter: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        with np.errstate(divide="ignore", invalid="ignore"):  # d <= 0 gives NaN, as scipy does
            x = np.log(np.where(diameter > 0, diameter, np.nan))
        y = np.interp(x, self.x, self.y)
        below, above = x < self.x[0], x > self.x[-1]
        y = np.where(below, self.y[0] + self.slope_low * (x - self.x[0]), y)
        y = np.where(above, self.y[-1] + self.slope_high * (x - self.x[-1]), y)
        # Flag only what lies beyond the end rows by more than half the table's last
        # digit (0.0005 mm): 11 SWG is 2.9464 mm, tabulated as 2.946 mm.
        low, high = np.exp(self.x[0]) - self._HALF_DIGIT, np.exp(self.x[-1]) + self._HALF_DIGIT
        return np.exp(y), (diameter < low) | (diameter > high)


@functools.cache
def _enamel_columns() -> dict[str, tuple[_LogLogColumn, _LogLogColumn]]:
    """Grade -> (minimum increase, maximum increase) columns, in metres."""
    rows = load_table("enamel_build.csv", _EnamelRow)
    columns = {}
    for grade in "123":
        smallest, largest = [], []
        for row in rows:
            d = row.nominal_diameter_mm
            minimum = getattr(row, f"grade{grade}_min_increase_mm")
            maximum = getattr(row, f"grade{grade}_max_overall_mm")
            if minimum is not None:
                smallest.append((d * 1e-3, minimum * 1e-3))
            if maximum is not None:
                largest.append((d * 1e-3, (maximum - d) * 1e-3))
        columns[grade] = tuple(_LogLogColumn(*np.array(sorted(points)).T)
                               for points in (smallest, largest))
    return columns


class EnamelBuild(NamedTuple):
    """Overall diameters of one enamel grade, in metres (arrays shaped like the input)."""

    minimum_overall: np.ndarray
    """Bare diameter plus the minimum increase in diameter."""
    typical_overall: np.ndarray
    """Midway between the minimum and the maximum overall diameter."""
    maximum_overall: np.ndarray
    """The maximum overall diameter."""
    extrapolated: np.ndarray
    """True where a value came from beyond the table's rows, not between them."""


def _check_grade(grade: object, option: str = "grade") -> str:
    text = str(grade).strip().lower()
    if text not in GRADES:
        raise InvalidInputError(option, "an enamel grade: 1, 2, 3 or bare", grade)
    return text


def enamel_build(diameter, grade="1") -> EnamelBuild:
    """Overall diameter of enamelled round copper wire of one IEC 60317 grade.

    For each nominal diameter, IEC 60317-0-1 Table 1 gives the minimum
    increase in diameter :math:`\\Delta_{min}` and the maximum overall diameter
    :math:`D_{max}`; the typical overall diameter taken here is midway between:

    .. math::

        D_{min} = d + \\Delta_{min},\\qquad
        D_{typ} = \\tfrac12 (D_{min} + D_{max})

    Parameters
    ----------
    diameter : float or array_like, shape (n,)
        Bare (nominal) copper diameter, m.
    grade : {"1", "2", "3"} or int
        Enamel grade: 1 thin, 2 medium, 3 thick.

    Returns
    -------
    EnamelBuild
        ``minimum_overall``, ``typical_overall``, ``maximum_overall`` in m and the
        ``extrapolated`` flag, each shaped like ``diameter``.

    Raises
    ------
    InvalidInputError
        A grade other than 1, 2 or 3 (field ``grade``).

    Notes
    -----
    **This is an interpolation of a partial table.** The primary IEC table was
    not available; ``core_data/enamel_build.csv`` holds the rows read from two
    transcriptions of IS 13730-0-1 (the Indian adoption of IEC 60317-0-1),
    0.040 mm to 2.946 mm, with grade 3 from 0.067 mm and the minimum increases
    from 0.067 mm. Both increases, Δ_min and D_max − d, are interpolated
    linearly in log-log between rows, so every tabulated row is reproduced.
    Beyond the rows each increase follows a power law through the end row,
    its exponent fitted to the rows within a factor of 2 in diameter of that
    end; such values are flagged ``extrapolated`` and were not checked against
    the standard. Grade 3 is not derived from grade 2: its rows were found
    (their minimum increase is about 1.5 times grade 2's).

    References
    ----------
    .. [IEC60317-0-1] IEC 60317-0-1, *Specifications for particular types of winding
       wires, Part 0-1: General requirements, Enamelled round copper wire*, Table 1;
       as IS 13730-0-1, Bureau of Indian Standards.

    Examples
    --------
    >>> build = enamel_build(0.315e-3, "1")
    >>> print(f"{build.minimum_overall * 1e3:.3f} {build.maximum_overall * 1e3:.3f} mm")
    0.334 0.349 mm
    >>> print(f"{build.typical_overall * 1e3:.4f} mm")
    0.3415 mm
    """
    grade = _check_grade(grade)
    if grade == "bare":
        raise InvalidInputError("grade", "an enamel grade: 1, 2 or 3", grade)
    diameter = np.asarray(diameter, dtype=float)
    smallest, largest = _enamel_columns()[grade]
    minimum_increase, low_out = smallest(diameter)
    maximum_increase, high_out = largest(diameter)
    minimum = diameter + minimum_increase
    maximum = diameter + maximum_increase
    return EnamelBuild(minimum[()], (0.5 * (minimum + maximum))[()], maximum[()],
                       (low_out | high_out)[()])


# --------------------------------------------------------------------------- the record


@dataclasses.dataclass(frozen=True)
class Wire:
    """One round solid copper wire: its name, bare and overall diameters (SI units).

    Build one with :func:`parse_wire` or take rows from :func:`wire_table`.

    Attributes
    ----------
    label : str
        The wire's name, e.g. ``"24 AWG"``, ``"26 SWG"``, ``"0.50 mm"``.
    series : {"awg", "swg", "metric", "diameter"}
        Where the bare diameter came from ("diameter": typed by the user).
    diameter : float
        Bare copper diameter, m.
    overall_diameter : float
        The diameter that sets the close-wound pitch, m: the typical overall
        diameter of the grade (see :func:`enamel_build`), the bare diameter for
        ``"bare"``, or the measured value for ``"measured"``.
    max_overall_diameter : float or None
        The grade's maximum overall diameter, m; None for bare or measured wire.
    grade : {"1", "2", "3", "bare", "measured"}
    enamel_extrapolated : bool
        The enamel figures came from beyond the rows of the partial table.
    """

    label: str
    series: Literal["awg", "swg", "metric", "diameter"]
    diameter: float
    overall_diameter: float
    grade: Literal["1", "2", "3", "bare", "measured"]
    max_overall_diameter: float | None = None
    enamel_extrapolated: bool = False
    strands: int = 1
    strand_diameter: float | None = None

    def __post_init__(self):
        """Refuse a record that cannot be (a frozen record with its rules, checked once)."""
        if not self.label:
            raise ValueError("label must not be empty")
        if self.series not in ("awg", "swg", "metric", "diameter"):
            raise ValueError(f"series must be awg, swg, metric or diameter; got {self.series!r}")
        if self.grade not in ("1", "2", "3", "bare", "measured"):
            raise ValueError(f"grade must be 1, 2, 3, bare or measured; got {self.grade!r}")
        for name in ("diameter", "overall_diameter", "max_overall_diameter"):
            value = getattr(self, name)
            if value is None:
                continue
            try:
                value = float(value)  # plain floats: numpy scalars would leak into JSON
            except (TypeError, ValueError):
                raise ValueError(f"{name} must be a length in metres; got {value!r}") from None
            if not (math.isfinite(value) and value > 0):
                raise ValueError(f"{name} must be a finite length above zero; got {value!r}")
            object.__setattr__(self, name, value)
        if not (isinstance(self.strands, int) and self.strands >= 1):
            raise ValueError(f"strands must be a whole number of at least 1; got {self.strands!r}")
        if (self.strands > 1) != (self.strand_diameter is not None):
            raise ValueError("a stranded (litz) wire needs its strand_diameter, and only it")
        if self.overall_diameter < self.diameter:
            raise ValueError("overall_diameter must be at least the bare diameter")
        largest = self.max_overall_diameter
        if largest is not None and largest < self.overall_diameter:
            raise ValueError("max_overall_diameter must be at least overall_diameter")

    @property
    def area(self) -> float:
        """Copper cross-section, m²: π d²/4, or n·π d_s²/4 for n strands of litz."""
        if self.strands > 1:
            return self.strands * math.pi * self.strand_diameter**2 / 4.0
        return math.pi * self.diameter**2 / 4.0

    @property
    def turns_per_metre(self) -> float:
        """Turns per metre of a close-wound layer, 1 / overall diameter."""
        return 1.0 / self.overall_diameter

    def resistance_per_metre(self, temperature_C=20.0):
        """DC resistance per metre at ``temperature_C`` (°C), Ω/m.

        See :func:`copper_resistance_per_metre` (IEC 60028 copper); litz: the strands in
        parallel (the lay's few percent of extra length is not counted).
        """
        if self.strands > 1:
            return copper_resistance_per_metre(self.strand_diameter, temperature_C) / self.strands
        return copper_resistance_per_metre(self.diameter, temperature_C)

    def with_grade(self, grade) -> Wire:
        """The same copper with another enamel grade (``"1"``, ``"2"``, ``"3"``, ``"bare"``)."""
        return _make_wire(self.label, self.series, self.diameter, _check_grade(grade))


def _make_wire(label: str, series: str, diameter: float, grade: str,
               overall: float | None = None) -> Wire:
    if overall is not None:
        return Wire(label=label, series=series, diameter=diameter, overall_diameter=overall,
                    grade="measured")
    if grade == "bare":
        return Wire(label=label, series=series, diameter=diameter, overall_diameter=diameter,
                    grade="bare")
    build = enamel_build(diameter, grade)
    return Wire(label=label, series=series, diameter=diameter,
                overall_diameter=float(build.typical_overall),
                max_overall_diameter=float(build.maximum_overall), grade=grade,
                enamel_extrapolated=bool(build.extrapolated))


def _mm_label(diameter_m: float) -> str:
    """``0.0005`` -> ``"0.50 mm"``: at least two decimals, at least two significant digits."""
    text = f"{diameter_m * 1e3:.4f}".rstrip("0")
    whole, _, decimals = text.partition(".")
    decimals = decimals.ljust(2, "0")
    if whole == "0" and len(decimals.lstrip("0")) < 2:
        decimals = decimals.ljust(len(decimals) - len(decimals.lstrip("0")) + 2, "0")
    return f"{whole}.{decimals} mm"


def _awg_label(number: float) -> str:
    if number <= 0:
        return f"{1 - int(number)}/0 AWG"
    return f"{number:g} AWG"


# --------------------------------------------------------------------------- parsing

_SERIES_WORDS = ("awg", "swg")
_WIRE_EXPECTED = "a wire such as 24awg, 26swg or a bare diameter such as 0.5mm"
_GAUGE_BEFORE = re.compile(r"#?\s*([\d./\s]*?)\s*(awg|swg)")
#: The most strands read in a litz wire: bundles of a few thousand strands are made; ten thousand leaves
#: room (common practice, no source).
MAX_LITZ_STRANDS = 10000
_LITZ = re.compile(r"(\d+)\s*[x\u00d7]\s*(.+?)(?:\s*litz)?")
#: Fill of a bundle of round strands in its circle (hexagonal packing, π/(2√3)); a real
#: bundle is looser, so the overall diameter here is the smallest (common practice, no source).
_BUNDLE_FILL = math.pi / (2.0 * math.sqrt(3.0))


def _litz(match, *, raw_text: str, grade: str, overall: float | None, option: str) -> Wire:
    """``40x0.1mm`` or ``40x38awg``: n enamelled strands, each read as a wire of its own."""
    count = match.group(1).lstrip("0")
    strands = int(count) if len(count) <= 6 else MAX_LITZ_STRANDS + 1
    if not 2 <= strands <= MAX_LITZ_STRANDS:
        raise InvalidInputError(option, f"litz as strands×strand, such as 40x0.1mm, with 2 to {MAX_LITZ_STRANDS} "
                                "strands", raw_text)
    strand = parse_wire(match.group(2), grade=grade, option=option)
    factor = math.sqrt(strands / _BUNDLE_FILL)
    bundle = strand.diameter * factor
    bundle_overall = strand.overall_diameter * factor if overall is None else overall
    if bundle_overall < bundle:
        raise InvalidInputError("overall", f"an overall diameter of at least the bundle's "
                                f"{bundle * 1e3:.3f} mm", f"{bundle_overall * 1e3:.3f} mm")
    return Wire(label=f"{strands}×{strand.label} litz", series=strand.series, diameter=bundle,
                overall_diameter=bundle_overall, grade="measured" if overall is not None else strand.grade,
                strands=strands, strand_diameter=strand.diameter)
_GAUGE_AFTER = re.compile(r"(awg|swg)\s*#?\s*([\d./\s]*)")


def _from_gauge(series: str, gauge_text: str, grade: str, overall: float | None,
                option: str, raw: str) -> Wire:
    try:
        if series == "awg":
            number = parse_awg_gauge(gauge_text, option)
            label, diameter = _awg_label(number), float(awg_diameter(number))
        else:
            name = _swg_name(gauge_text, option)
            label, diameter = f"{name} SWG", _swg_diameters()[name]
    except InvalidInputError as error:  # show the whole text as typed, not just the number
        raise InvalidInputError(error.option, error.expected, raw) from None
    return _checked_wire(label, series, diameter, grade, overall)


def _checked_wire(label: str, series: str, diameter: float, grade: str,
                  overall: float | None) -> Wire:
    if overall is not None and not (math.isfinite(overall) and overall >= diameter):
        shown = _mm_label(overall) if math.isfinite(overall) else overall
        raise InvalidInputError("overall", "a measured overall diameter no smaller than "
                                f"the bare diameter {_mm_label(diameter)}", shown)
    return _make_wire(label, series, diameter, grade, overall)


def _is_length_unit(suffix: str) -> bool:
    try:
        parse_quantity("1" + suffix, "m")
    except InvalidInputError:
        return False
    return True


def parse_wire(text: str, grade="1", overall: float | None = None, option: str = "wire",
               *, series: str | None = None) -> Wire:
    """Read a wire as a user names it: an AWG or SWG gauge, or a bare diameter.

    Accepted (case-blind, spaces allowed): ``"24awg"``, ``"24 AWG"``, ``"AWG24"``,
    ``"#24 awg"``, ``"0000awg"``, ``"4/0awg"``, ``"24.5awg"``; ``"26swg"``,
    ``"SWG 26"``, ``"7/0swg"``; ``"0.5mm"``, ``"20mil"``, ``"0.02in"``; litz as strands×strand,
    ``"40x0.1mm"``, ``"40x38awg"`` (its ``diameter`` is then the bundle's, packed hexagonally,
    and ``strands``, ``strand_diameter`` say what it is made of).

    Parameters
    ----------
    text : str
        The wire as typed.
    grade : {"1", "2", "3", "bare"}
        Enamel grade for the overall diameter (default grade 1).
    overall : float, optional
        A measured overall diameter, m; it overrides the grade's estimate and
        must be at least the bare diameter.
    option : str
        The field named in error messages for ``text``.
    series : {"awg", "swg", "metric"}, optional
        How to read a plain number (``"24"``): as a gauge of that series, or for
        ``"metric"`` as millimetres. Without it a plain number is refused.

    Returns
    -------
    Wire

    Raises
    ------
    InvalidInputError
        Malformed text, a gauge outside its series (on ``option``), a grade not
        in 1, 2, 3, bare (on ``grade``), an overall diameter below the bare
        diameter (on ``overall``).

    Examples
    --------
    >>> wire = parse_wire("24 AWG")
    >>> wire.label, wire.grade, round(wire.diameter * 1e3, 4)
    ('24 AWG', '1', 0.5106)
    >>> parse_wire("SWG 26", grade="bare").overall_diameter == parse_wire("26swg").diameter
    True
    """
    grade = _check_grade(grade)
    if match := _LITZ.fullmatch(str(text).strip().lower()):
        return _litz(match, raw_text=str(text), grade=grade, overall=overall, option=option)
    if series is not None and series not in ("awg", "swg", "metric"):
        raise InvalidInputError("series", "one of awg, swg, metric", series)
    raw = str(text)
    stripped = raw.strip().lower()
    if not stripped:
        raise InvalidInputError(option, _WIRE_EXPECTED + " (the value is empty)", raw)
    if "," in stripped:
        raise InvalidInputError(option, _WIRE_EXPECTED + " (write the decimal point as '.')",
                                raw)
    if match := _GAUGE_BEFORE.fullmatch(stripped):
        gauge_text, word = match.group(1), match.group(2)
    elif match := _GAUGE_AFTER.fullmatch(stripped):
        word, gauge_text = match.group(1), match.group(2)
    else:
        word = gauge_text = None
    if word is not None:
        if not gauge_text.strip():
            raise InvalidInputError(option, _WIRE_EXPECTED + f" ({word.upper()} needs a gauge "
                                    "number)", raw)
        return _from_gauge(word, gauge_text, grade, overall, option, raw)
    if re.fullmatch(r"[\d./]+", stripped):
        if series in _SERIES_WORDS:
            return _from_gauge(series, stripped, grade, overall, option, raw)
        if series == "metric":
            stripped += "mm"
        else:
            raise InvalidInputError(option, _WIRE_EXPECTED + " (a plain number needs its gauge "
                                    "series or length unit)", raw)
    if not re.match(r"[+-]?(?:\d|\.\d)", stripped):
        raise InvalidInputError(option, _WIRE_EXPECTED, raw)
    try:
        diameter = parse_quantity(stripped, "m", option)
    except InvalidInputError as error:
        suffix = re.sub(r"^[+-]?[\d.]+(?:e[+-]?\d+)?\s*", "", stripped)
        if _is_length_unit(suffix):
            raise error from None
        close = difflib.get_close_matches(suffix, ["awg", "swg", "mm", "mil", "in"], n=2,
                                          cutoff=0.5)
        hint = f"; did you mean {' or '.join(close)}?" if close and suffix else ""
        why = f"'{suffix}' is not a gauge series or length unit{hint}" if suffix else ""
        raise InvalidInputError(option, _WIRE_EXPECTED + (f" ({why})" if why else ""),
                                raw) from None
    low, high = _DIAMETER_RANGE_M
    if not low <= diameter <= high:
        raise InvalidInputError(option, "a bare diameter from 0.010 mm to 13 mm "
                                f"({raw.strip()} is {format_length(diameter)})", raw)
    label = _mm_label(diameter)
    return _checked_wire(label, "diameter", diameter, grade, overall)


# --------------------------------------------------------------------------- tables


@dataclasses.dataclass(frozen=True)
class _MetricRow:
    nominal_diameter_mm: float = rule(gt=0, lt=20)
    renard: str = rule(choices=("R20", "R40"))
    source: str = rule(min_length=1)


@functools.cache
def _table(series: str, grade: str) -> tuple[Wire, ...]:
    if series == "awg":
        return tuple(_make_wire(_awg_label(n), "awg", float(awg_diameter(n)), grade)
                     for n in range(_AWG_RANGE[0], 45))
    if series == "swg":
        return tuple(_make_wire(f"{name} SWG", "swg", diameter, grade)
                     for name, diameter in _swg_diameters().items())
    rows = load_table("metric_wire.csv", _MetricRow)
    return tuple(_make_wire(_mm_label(row.nominal_diameter_mm * 1e-3), "metric",
                            row.nominal_diameter_mm * 1e-3, grade) for row in rows)


def wire_table(series: str, grade="1") -> list[Wire]:
    """The wires of one series, thickest first for gauges, thinnest first for metric.

    Parameters
    ----------
    series : {"awg", "swg", "metric"}
        ``"awg"``: 4/0 to 44 by the ASTM B258 formula; ``"swg"``: 7/0 to 50 from
        ``core_data/swg.csv``; ``"metric"``: the IEC 60317-0-1 preferred nominal
        diameters 0.050 mm to 2.50 mm from ``core_data/metric_wire.csv``.
    grade : {"1", "2", "3", "bare"}

    Returns
    -------
    list of Wire

    Raises
    ------
    InvalidInputError
        An unknown series (``series``) or grade (``grade``).

    Examples
    --------
    >>> [wire.label for wire in wire_table("awg")[:2]], len(wire_table("swg"))
    (['4/0 AWG', '3/0 AWG'], 57)
    """
    key = str(series).strip().lower()
    if key not in ("awg", "swg", "metric"):
        raise InvalidInputError("series", "one of awg, swg, metric", series)
    return list(_table(key, _check_grade(grade)))


# --------------------------------------------------------------------------- current

_DENSITY_UNITS = {"a/mm2": 1.0, "a/mm²": 1.0, "a/mm^2": 1.0, "a/mm**2": 1.0,
                  "a/cm2": 1e-2, "a/cm²": 1e-2, "a/cm^2": 1e-2,
                  "a/m2": 1e-6, "a/m²": 1e-6, "a/m^2": 1e-6}
_DENSITY_MAX = 50.0  # A/mm²: above this a coil's current density is surely a slip of unit


def parse_current_density(text, option: str = "density") -> float:
    """Read a current density, returned in A/mm² (``"3"``, ``"3A/mm2"``, ``"300A/cm2"``).

    Raises
    ------
    InvalidInputError
        Not a number above 0 and at most 50 A/mm², or an unknown unit.

    Examples
    --------
    >>> parse_current_density("3"), parse_current_density("2.5 A/mm²")
    (3.0, 2.5)
    >>> parse_current_density("300A/cm2")
    3.0
    """
    expected = "a current density in A/mm² such as 3 or 3A/mm2"
    stripped = str(text).strip()
    if "," in stripped:
        raise InvalidInputError(option, expected + " (write the decimal point as '.')", text)
    match = re.fullmatch(r"([+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*)", stripped)
    if match is None:
        raise InvalidInputError(option, expected, text)
    unit = match.group(2).replace(" ", "").lower()
    if unit and unit not in _DENSITY_UNITS:
        raise InvalidInputError(option, expected + f" ('{match.group(2)}' is not a unit of "
                                "current density)", text)
    value = float(match.group(1)) * _DENSITY_UNITS.get(unit, 1.0)
    if not math.isfinite(value) or value <= 0:
        raise InvalidInputError(option, expected + " (above zero)", text)
    if value > _DENSITY_MAX:
        raise InvalidInputError(option, expected + f" (at most {_DENSITY_MAX:g} A/mm²; "
                                "was it A/cm²?)", text)
    return value


def current_for_density(wire: Wire, density_A_per_mm2):
    """Current that gives ``density_A_per_mm2`` in the wire's copper.

    .. math::

        I = J \\cdot \\frac{\\pi d^2}{4}

    Parameters
    ----------
    wire : Wire
    density_A_per_mm2 : float or array_like, shape (n,)
        Current density, A/mm², above zero.

    Returns
    -------
    numpy.ndarray or numpy.float64
        Current, A.

    Raises
    ------
    InvalidInputError
        A density that is not above zero (``density_A_per_mm2``).

    Examples
    --------
    >>> print(f"{current_for_density(parse_wire('1mm'), 3.0):.4f} A")
    2.3562 A
    """
    density = np.asarray(density_A_per_mm2, dtype=float)
    if not np.all(np.isfinite(density) & (density > 0)):
        raise InvalidInputError("density_A_per_mm2", "a current density above zero, in A/mm²",
                                density_A_per_mm2)
    return (density * wire.area * 1e6)[()]
