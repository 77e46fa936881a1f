r"""Tuned circuits: the third of L, C and f, band coverage with a variable capacitor, and L and C0 from resonances.

Three jobs, each a function returning a frozen result with ``as_dict()`` (the ``result`` object of
``coilplan tank --json``):

* :func:`solve_tank`: any two of L, C, f give the third, f = 1/(2π√(LC)), with the reactance
  at f and the characteristic impedance √(L/C).
* :func:`plan_band`: a variable capacitor of travel Cmin..Cmax, a stray Cs across the coil and
  an optional padder Cp in series with the capacitor. A band fmin..fmax needs the ratio
  R = (fmax/fmin)²; the capacitor stands a stray up to Cs ≤ (Cmax − R·Cmin)/(R − 1); the coil
  L = 1/((2π fmin)²(Cmax + Cs)) puts the low band edge at the bottom of the capacitor's travel.
* :func:`fit_resonances`: the coil resonated with known capacitors C_i at f_i. Since
  1/ω² = L·(C + C0) is a straight line in C, a weighted least-squares line gives L (the slope)
  and C0, the stray plus self-capacitance across the coil (intercept/slope).

:func:`drive_fields` and :func:`tank_cautions` add the voltage across a tank driven at power,
V = √(P·Q·X), and the brief cautions that go with it.

=================  ===================  ==============================================
symbol             parameter            meaning
=================  ===================  ==============================================
L                  ``inductance``       inductance, H
C                  ``capacitance``      capacitance across the coil, F
f                  ``frequency``        resonant frequency, Hz
Cmin, Cmax         ``capacitor``        the variable capacitor's travel, F
fmin, fmax         ``band``             the band to tune, Hz
Cs                 ``stray``            stray across the coil (wiring, device input, the
                                        coil's self-capacitance), F
Cp                 ``padder``           fixed capacitor in series with the variable one, F
C_i, f_i           ``points``           known capacitor and the resonance read with it
C0                 (fitted)             stray plus self-capacitance across the coil, F
t                  ``tolerance``        relative accuracy of each frequency reading
=================  ===================  ==============================================
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from coilplan.errors import InvalidInputError
from coilplan.physics import resonance as rs
from coilplan.quantities import format_quantity, parse_pair, parse_quantity

__all__ = [
    "DEFAULT_FREQUENCY_TOLERANCE",
    "DEFAULT_STRAY_F",
    "HIGH_RF_VOLTAGE_V",
    "MAX_TANK_Q",
    "TANK_POWER_RANGE",
    "BandPlan",
    "ResonanceFit",
    "TankSolution",
    "drive_fields",
    "fit_resonances",
    "parse_range",
    "parse_resonance",
    "plan_band",
    "solve_tank",
    "tank_cautions",
]

#: Stray capacitance assumed across a tuned coil when none is given: wiring, a valve's or
#: transistor's input and the coil's own self-capacitance (a typical figure; common practice, no source).
DEFAULT_STRAY_F = 15e-12
#: Relative accuracy assumed for each resonance reading when none is given: a peak found with a
#: signal generator and read on a counter (common practice, no source); a dip meter's dial is worse.
DEFAULT_FREQUENCY_TOLERANCE = 0.005
#: From this RMS voltage across a tank on, the text cautions about RF voltage: the 50 V AC upper
#: limit of extra-low voltage (IEC 61140, from memory); RF burns are a hazard in their own right.
HIGH_RF_VOLTAGE_V = 50.0

#: Largest loaded Q taken for a tank: no coil-and-capacitor tank reaches 100,000 (a silver-plated
#: cavity reaches about 10,000; common practice, no source), and the voltage √(P·Q·X) must stay a figure.
MAX_TANK_Q = 1e5
#: Powers taken for a driven tank, W: a microwatt (a receiver's tank) to 100 kW (a broadcast
#: transmitter's); a bench tool's outer limits (common practice, no source).
TANK_POWER_RANGE = (1e-6, 1e5)

_RANGE_EXAMPLES = {"Hz": "530kHz:1700kHz", "F": "10pF:365pF"}
_ONE_POINT = "two resonances or more: one gives only L·(C + C0)"


def _f(value: float, unit: str, digits: int = 4) -> str:
    return format_quantity(float(value), unit, digits)


# --- parsing -------------------------------------------------------------------------------------------------


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
    (one of the ``points`` of :func:`fit_resonances`).

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


# --- any two of L, C, f --------------------------------------------------------------------------------------


@dataclass(frozen=True)
class TankSolution:
    """L, C and f of a tank, one of them computed from the other two.

    Attributes
    ----------
    inductance, capacitance, frequency : float
        H, F, Hz.
    solved_for : str
        ``"inductance"``, ``"capacitance"`` or ``"frequency"``: the one computed.
    reactance : float
        ωL at the resonant frequency (equal to 1/(ωC) there), Ω.
    characteristic_impedance : float
        √(L/C), Ω.
    """

    inductance: float
    capacitance: float
    frequency: float
    solved_for: str
    reactance: float
    characteristic_impedance: float

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan tank --json`` for two of L, C, f."""
        return {
            "mode": "lc",
            "solved_for": self.solved_for,
            "inductance_H": self.inductance,
            "capacitance_F": self.capacitance,
            "frequency_Hz": self.frequency,
            "reactance_ohm": self.reactance,
            "characteristic_impedance_ohm": self.characteristic_impedance,
        }


def solve_tank(*, inductance: float | None = None, capacitance: float | None = None,
               frequency: float | None = None) -> TankSolution:
    r"""The third of L, C and f from the other two, f = 1/(2π√(LC)).

    Parameters
    ----------
    inductance, capacitance, frequency : float, optional
        Exactly two of them: H, F, Hz.

    Returns
    -------
    TankSolution

    Raises
    ------
    InvalidInputError
        Not exactly two given, or a value not above zero.

    Examples
    --------
    >>> tank = solve_tank(inductance=240e-6, capacitance=365e-12)  # docs/methods.md §10
    >>> round(tank.frequency / 1e3, 2), tank.solved_for
    (537.73, 'frequency')
    """
    given = {"inductance": inductance, "capacitance": capacitance, "frequency": frequency}
    present = [name for name, value in given.items() if value is not None]
    if len(present) == 3:
        raise InvalidInputError("frequency", "two of the inductance, capacitance and frequency, not all three "
                                "(the third is computed from the other two)")
    if len(present) < 2:
        missing = [name for name in given if name not in present]
        with_what = f" with the {present[0]}" if present else ""
        raise InvalidInputError(" or ".join(missing), f"one more of them{with_what} (any two of the inductance, "
                                "capacitance and frequency give the third)")
    units = {"inductance": "H", "capacitance": "F", "frequency": "Hz"}
    for name in present:
        _positive(given[name], name, units[name])
    if frequency is None:
        solved_for = "frequency"
        frequency = float(rs.resonant_frequency(inductance, capacitance))
    elif capacitance is None:
        solved_for = "capacitance"
        capacitance = float(rs.resonant_capacitance(frequency, inductance))
    else:
        solved_for = "inductance"
        inductance = float(rs.resonant_inductance(frequency, capacitance))
    return TankSolution(
        inductance=float(inductance), capacitance=float(capacitance), frequency=float(frequency),
        solved_for=solved_for, reactance=2.0 * math.pi * float(frequency) * float(inductance),
        characteristic_impedance=float(rs.characteristic_impedance(inductance, capacitance)))


# --- band coverage -------------------------------------------------------------------------------------------


@dataclass(frozen=True)
class BandPlan:
    """A variable capacitor, its stray and padder, a coil, and the band they tune.

    Attributes
    ----------
    capacitor : tuple of float
        (Cmin, Cmax) of the variable capacitor, F.
    stray : float
        Cs across the coil, F.
    stray_assumed : bool
        Cs is :data:`DEFAULT_STRAY_F`, not the user's figure.
    padder : float or None
        Cp in series with the variable capacitor, F.
    total_capacitance : tuple of float
        (min, max) of everything across the coil: Cs + Cv·Cp/(Cv + Cp), F.
    available_ratio : float
        total max / total min.
    inductance : float
        The coil: given, or the L that puts the low band edge at the top of the capacitance, H.
    inductance_given : bool
    covered : tuple of float
        (low, high) frequencies tuned with that L across the capacitor's travel, Hz.
    band : tuple of float or None
        (fmin, fmax) asked for, Hz.
    required_ratio, max_stray, inductance_for_band : float or None
        (fmax/fmin)²; the largest Cs that still covers the band (negative: none would);
        the L that puts fmin at the bottom of the travel. None without a band.
    covers_band : bool or None
        The covered range contains the band (None without a band).
    advice : tuple of str
        The trade-off in words: what to change when it falls short, what is to spare.
    assumptions : tuple of str
    """

    capacitor: tuple[float, float]
    stray: float
    stray_assumed: bool
    padder: float | None
    total_capacitance: tuple[float, float]
    available_ratio: float
    inductance: float
    inductance_given: bool
    covered: tuple[float, float]
    band: tuple[float, float] | None = None
    required_ratio: float | None = None
    max_stray: float | None = None
    inductance_for_band: float | None = None
    covers_band: bool | None = None
    advice: tuple[str, ...] = ()
    assumptions: tuple[str, ...] = ()

    def shortfall(self) -> str | None:
        """One line saying why the band is not covered, or None when it is (or no band was asked for)."""
        if self.covers_band is not False or self.band is None:
            return None
        low, high = self.band
        return (f"the capacitor and coil tune {_f(self.covered[0], 'Hz')} to {_f(self.covered[1], 'Hz')}, "
                f"not all of the {_f(low, 'Hz')} to {_f(high, 'Hz')} band (see the report for the trade-off)")

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan tank --json`` for band coverage."""
        return {
            "mode": "band",
            "band_low_Hz": None if self.band is None else self.band[0],
            "band_high_Hz": None if self.band is None else self.band[1],
            "capacitor_min_F": self.capacitor[0],
            "capacitor_max_F": self.capacitor[1],
            "stray_F": self.stray,
            "stray_assumed": self.stray_assumed,
            "padder_F": self.padder,
            "total_min_F": self.total_capacitance[0],
            "total_max_F": self.total_capacitance[1],
            "required_ratio": self.required_ratio,
            "available_ratio": self.available_ratio,
            "max_stray_F": self.max_stray,
            "inductance_H": self.inductance,
            "inductance_given": self.inductance_given,
            "inductance_for_band_H": self.inductance_for_band,
            "covered_low_Hz": self.covered[0],
            "covered_high_Hz": self.covered[1],
            "covers_band": self.covers_band,
            "advice": list(self.advice),
            "assumptions": list(self.assumptions),
        }


def _travel(capacitor: tuple[float, float], padder: float | None, stray: float) -> tuple[float, float]:
    """Total capacitance across the coil at the two ends of the capacitor's travel."""
    series_with = math.inf if padder is None else padder
    c_min, c_max = (float(rs.series_capacitance(c, series_with)) for c in capacitor)
    return c_min + stray, c_max + stray


def _band_advice(plan: dict, band: tuple[float, float], no_padder_max_stray: float | None) -> list[str]:
    low, high = band
    ratio, available, max_stray = plan["required_ratio"], plan["available_ratio"], plan["max_stray"]
    stray, padder = plan["stray"], plan["padder"]
    with_padder = f" and the {_f(padder, 'F')} padder" if padder is not None else ""
    advice = []
    if available < ratio * (1 - 1e-12):
        advice.append(f"with {_f(stray, 'F')} stray{with_padder} the capacitor swings {available:.4g}:1; "
                      f"the band needs {ratio:.4g}:1 (the square of {high / low:.4g}:1 in frequency)")
        if max_stray >= 0:
            advice.append(f"it would just cover the band with the stray cut to {_f(max_stray, 'F')}: shorter "
                          "leads, a device with less input capacitance, a coil with less self-capacitance")
        else:
            advice.append(f"no stray at all would do: the capacitor's own swing{with_padder} is short of "
                          f"{ratio:.4g}:1")
        if padder is not None and no_padder_max_stray is not None and no_padder_max_stray > max_stray:
            advice.append(f"the padder narrows the swing: without it the capacitor stands up to "
                          f"{_f(no_padder_max_stray, 'F')} of stray")
        advice.append("a padder (in series) or a trimmer (across) only narrows the swing further; otherwise "
                      f"accept the narrower band {_f(plan['covered'][0], 'Hz')} to {_f(plan['covered'][1], 'Hz')}, "
                      "split the band into two ranges with two coils, or use a capacitor with a larger maximum")
    elif max_stray - stray > 0.005 * stray + 0.1e-12:
        advice.append(f"there is swing to spare: up to {_f(max_stray - stray, 'F')} more across the coil "
                      "(a trimmer sets the top edge), or a padder in series spreads the band over more of the travel")
    return advice


def plan_band(*, capacitor: tuple[float, float], band: tuple[float, float] | None = None,
              inductance: float | None = None, stray: float | None = None,
              padder: float | None = None) -> BandPlan:
    r"""Band coverage with a variable capacitor: ratio needed, the largest stray, the coil, the band covered.

    .. math::

        R = \left(\frac{f_{max}}{f_{min}}\right)^2,\qquad
        C_s \le \frac{C'_{max} - R\,C'_{min}}{R - 1},\qquad
        L = \frac{1}{(2\pi f_{min})^2\,(C'_{max} + C_s)},\qquad
        C' = \frac{C_v C_p}{C_v + C_p}

    where C' is the variable capacitor Cv in series with the padder Cp (C' = Cv without one) and
    the stray Cs sits across the coil, in parallel with that series pair.

    Parameters
    ----------
    capacitor : tuple of float
        (Cmin, Cmax) of the variable capacitor, F; 0 < Cmin < Cmax.
    band : tuple of float, optional
        (fmin, fmax) to tune, Hz. Without it, ``inductance`` is needed and the result is the band covered.
    inductance : float, optional
        A given coil, H: the band it covers (and, with ``band``, whether that contains the band).
    stray : float, optional
        Cs across the coil, F (default :data:`DEFAULT_STRAY_F`, an assumption, stated in ``assumptions``).
    padder : float, optional
        Cp in series with the variable capacitor, F.

    Returns
    -------
    BandPlan
        ``covers_band`` False is an answer, not an error: ``covered`` holds the band actually tuned,
        ``max_stray`` the stray at which it would just work and ``advice`` the trade-off.

    Raises
    ------
    InvalidInputError
        Neither ``band`` nor ``inductance``; a capacitor range not 0 < Cmin < Cmax; a negative stray.

    Notes
    -----
    The band rule Cmax,total/Cmin,total ≥ (fmax/fmin)² and the padder's series combination are
    elementary [Terman1943]_ (see :mod:`coilplan.physics.resonance`). The stray is taken as
    fixed over the travel; a coil's self-capacitance and a device's input capacitance are only
    roughly so.

    Examples
    --------
    >>> plan = plan_band(capacitor=(10e-12, 365e-12), band=(530e3, 1700e3), stray=15e-12)
    >>> round(plan.required_ratio, 3), round(plan.max_stray * 1e12, 2), plan.covers_band
    (10.288, 28.22, True)
    >>> round(plan.inductance * 1e6, 2)  # µH: 530 kHz at 365 + 15 pF
    237.3
    """
    c_min, c_max = (float(value) for value in capacitor)
    if not (math.isfinite(c_min) and math.isfinite(c_max) and 0 < c_min < c_max):
        raise InvalidInputError("capacitor", "a variable capacitor's travel min:max with 0 < min < max",
                                f"{c_min:.6g}:{c_max:.6g}")
    if band is None and inductance is None:
        raise InvalidInputError("capacitor", "a band to plan the coil for, or an inductance for the band it "
                                "covers, with it")
    assumptions = []
    stray_assumed = stray is None
    if stray is None:
        stray = DEFAULT_STRAY_F
        assumptions.append(f"stray across the coil {_f(stray, 'F')}: an assumed typical figure for wiring, a valve's "
                           "or transistor's input and the coil's self-capacitance (give --stray; a coil's own can be "
                           "measured with --resonance)")
    stray = _positive(stray, "stray", "F", allow_zero=True)
    if padder is not None:
        padder = _positive(padder, "padder", "F")
        assumptions.append("the padder is in series with the variable capacitor, and the stray across the coil")
    total_min, total_max = _travel((c_min, c_max), padder, stray)
    available = total_max / total_min
    inductance_given = inductance is not None
    fields: dict = {"required_ratio": None, "max_stray": None, "inductance_for_band": None, "covers_band": None}
    if band is not None:
        low, high = (float(value) for value in band)
        if not (math.isfinite(low) and math.isfinite(high) and 0 < low < high):
            raise InvalidInputError("band", "a band low:high with 0 < low < high", f"{low:.6g}:{high:.6g}")
        ratio = float(rs.band_capacitance_ratio(low, high))
        effective = _travel((c_min, c_max), padder, 0.0)
        fields["required_ratio"] = ratio
        fields["max_stray"] = float(rs.max_stray_capacitance(*effective, ratio))
        fields["inductance_for_band"] = float(rs.resonant_inductance(low, total_max))
    inductance = _positive(inductance, "inductance", "H") if inductance_given else fields["inductance_for_band"]
    covered = (float(rs.resonant_frequency(inductance, total_max)), float(rs.resonant_frequency(inductance, total_min)))
    advice: list[str] = []
    if band is not None:
        slack = 1e-12  # relative: a stray exactly at the limit covers the band
        if inductance_given:
            fields["covers_band"] = covered[0] <= low * (1 + slack) and covered[1] >= high * (1 - slack)
        else:
            fields["covers_band"] = available >= fields["required_ratio"] * (1 - slack)
        no_padder = (float(rs.max_stray_capacitance(c_min, c_max, fields["required_ratio"]))
                     if padder is not None else None)
        advice = _band_advice({**fields, "available_ratio": available, "stray": stray, "padder": padder,
                               "covered": covered}, (low, high), no_padder)
        if inductance_given and not fields["covers_band"] and available >= fields["required_ratio"] * (1 - slack):
            advice.insert(0, f"the capacitor's swing is enough, but this coil tunes {_f(covered[0], 'Hz')} to "
                             f"{_f(covered[1], 'Hz')}: {_f(fields['inductance_for_band'], 'H')} puts "
                             f"{_f(low, 'Hz')} at the bottom of the travel")
    return BandPlan(capacitor=(c_min, c_max), stray=stray, stray_assumed=stray_assumed, padder=padder,
                    total_capacitance=(total_min, total_max), available_ratio=available, inductance=float(inductance),
                    inductance_given=inductance_given, covered=covered,
                    band=None if band is None else (low, high), advice=tuple(advice),
                    assumptions=tuple(assumptions), **fields)


# --- L and C0 from resonances --------------------------------------------------------------------------------


@dataclass(frozen=True)
class ResonanceFit:
    """L and C0 of a coil fitted to resonances with known capacitors.

    Attributes
    ----------
    inductance, inductance_uncertainty : float
        L and its standard uncertainty, H.
    stray, stray_uncertainty : float
        C0 (stray plus the coil's self-capacitance) and its standard uncertainty, F.
    capacitances, frequencies : tuple of float
        The readings (C_i in F, f_i in Hz), in the order given.
    fitted_frequencies : tuple of float
        1/(2π√(L(C_i + C0))), Hz (NaN where C_i + C0 <= 0).
    tolerance : float
        Relative accuracy of each frequency reading used for the weights.
    chi_square : float
        Σ ((y_i − ŷ_i)/σ_i)² with y = 1/ω².
    degrees_of_freedom : int
        Readings less two.
    uncertainty_scale : float
        √(χ²/ν) when above 1 (the points scatter more than the tolerance allows), else 1.
    warnings, assumptions : tuple of str
    """

    inductance: float
    inductance_uncertainty: float
    stray: float
    stray_uncertainty: float
    capacitances: tuple[float, ...]
    frequencies: tuple[float, ...]
    fitted_frequencies: tuple[float, ...]
    tolerance: float
    chi_square: float
    degrees_of_freedom: int
    uncertainty_scale: float
    warnings: tuple[str, ...] = ()
    assumptions: tuple[str, ...] = field(default=())

    @property
    def residuals(self) -> tuple[float, ...]:
        """Reading less fitted frequency, Hz."""
        return tuple(f - g for f, g in zip(self.frequencies, self.fitted_frequencies, strict=True))

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan tank --json`` for a fit to resonances."""
        points = []
        for c, f, g, r in zip(self.capacitances, self.frequencies, self.fitted_frequencies, self.residuals,
                              strict=True):
            points.append({"capacitance_F": c, "frequency_Hz": f, "fitted_frequency_Hz": g, "residual_Hz": r,
                           "residual_relative": r / g if g > 0 else None})
        return {
            "mode": "resonance-fit",
            "inductance_H": self.inductance,
            "inductance_uncertainty_H": self.inductance_uncertainty,
            "stray_capacitance_F": self.stray,
            "stray_capacitance_uncertainty_F": self.stray_uncertainty,
            "tolerance": self.tolerance,
            "chi_square": self.chi_square,
            "degrees_of_freedom": self.degrees_of_freedom,
            "uncertainty_scale": self.uncertainty_scale,
            "points": points,
            "assumptions": list(self.assumptions),
        }


def _point_text(capacitance: float, frequency: float) -> str:
    return f"{_f(capacitance, 'F')} @ {_f(frequency, 'Hz')}"


def fit_resonances(points: Sequence[tuple[float, float]], tolerance: float | None = None) -> ResonanceFit:
    r"""Fit a coil's L and the capacitance C0 across it to resonances with known capacitors.

    .. math::

        \frac{1}{\omega_i^2} = L\,C_i + L\,C_0,\qquad \sigma_i = 2t\,\frac{1}{\omega_i^2}

    a straight line in C_i, fitted by weighted least squares: slope L, intercept L·C0. A relative
    error t in f_i is a relative error 2t in 1/ω_i².

    Parameters
    ----------
    points : sequence of (float, float)
        (C_i in F, f_i in Hz): a known capacitor across the coil and the frequency at which the
        pair resonated. Two or more, with at least two different capacitors.
    tolerance : float, optional
        Relative accuracy t of each frequency reading, taken as its standard uncertainty (default
        :data:`DEFAULT_FREQUENCY_TOLERANCE`, an assumption, stated in ``assumptions``).

    Returns
    -------
    ResonanceFit
        L and C0 with standard uncertainties from the fit's covariance, (AᵀWA)⁻¹, propagated to
        C0 = (L·C0)/L; both scaled up by √(χ²/ν) when the points scatter more than ``tolerance``.

    Raises
    ------
    InvalidInputError
        One reading; all with the same capacitor; a reading not above zero; readings whose
        frequency does not fall as the capacitance rises (a slope L of zero or less).

    Notes
    -----
    C0 is everything across the coil besides the known capacitor: its self-capacitance and the
    stray of the leads and test jig. The model takes L as the same at every frequency, which
    holds for an air coil well below its self-resonance, and less well for a cored coil whose
    permeability changes with frequency. With two readings the line passes through both and the
    residuals are zero: a third reading checks them. Warnings name a C0 below zero and a worst
    point more than 2t off the line.

    Examples
    --------
    >>> import math
    >>> def f(c): return 1 / (2 * math.pi * math.sqrt(200e-6 * (c + 12e-12)))
    >>> fit = fit_resonances([(100e-12, f(100e-12)), (470e-12, f(470e-12))], tolerance=0.005)
    >>> round(fit.inductance * 1e6, 6), round(fit.stray * 1e12, 6)
    (200.0, 12.0)
    """
    points = [tuple(point) for point in points]
    if len(points) < 2:
        raise InvalidInputError("points", _ONE_POINT)
    assumptions = []
    if tolerance is None:
        tolerance = DEFAULT_FREQUENCY_TOLERANCE
        assumptions.append(f"each resonance read within ±{tolerance:.1%}: an assumed figure for a peak found with a "
                           "signal generator and read on a counter; give --tolerance (a dip meter's dial is worse)")
    tolerance = float(tolerance)
    if not 0 < tolerance < 0.5:
        raise InvalidInputError("tolerance", "a relative tolerance above 0 % and below 50 %", f"{tolerance:.6g}")
    capacitance = np.array([point[0] for point in points], dtype=float)
    frequency = np.array([point[1] for point in points], dtype=float)
    for c, f in points:
        if not (math.isfinite(c) and math.isfinite(f) and c > 0 and f > 0):
            raise InvalidInputError("points", "a known capacitor above zero and a frequency above zero",
                                    f"{c:.6g}F@{f:.6g}Hz")
    if np.ptp(capacitance) <= 1e-9 * capacitance.max():
        raise InvalidInputError("points", "resonances with at least two different capacitors (one capacitor "
                                "gives only L·(C + C0))")
    y = 1.0 / (2.0 * np.pi * frequency) ** 2
    sigma = 2.0 * tolerance * y
    # fit in scaled units (x / max x, y / max y) so that the 2×2 normal equations are well conditioned
    x_scale, y_scale = capacitance.max(), y.max()
    xs, ys, ss = capacitance / x_scale, y / y_scale, sigma / y_scale
    design = np.column_stack([np.ones_like(xs), xs]) / ss[:, None]
    covariance = np.linalg.inv(design.T @ design)
    intercept_s, slope_s = covariance @ (design.T @ (ys / ss))
    L = slope_s * y_scale / x_scale
    if not L > 0:
        raise InvalidInputError("points", "readings whose frequency falls as the capacitance rises (these give "
                                "an inductance of zero or less): check which capacitor went with which reading")
    intercept = intercept_s * y_scale
    c0 = intercept / L
    chi_square = float(np.sum(((y - intercept - L * capacitance) / sigma) ** 2))
    dof = len(points) - 2
    scale = max(1.0, math.sqrt(chi_square / dof)) if dof > 0 else 1.0
    var_l = covariance[1, 1] * (y_scale / x_scale) ** 2
    var_a = covariance[0, 0] * y_scale**2
    cov_al = covariance[0, 1] * y_scale**2 / x_scale
    var_c0 = var_a / L**2 + (intercept / L**2) ** 2 * var_l - 2.0 * intercept / L**3 * cov_al
    u_l = scale * math.sqrt(var_l)
    u_c0 = scale * math.sqrt(max(var_c0, 0.0))
    with np.errstate(invalid="ignore", divide="ignore"):
        fitted = np.where(capacitance + c0 > 0, rs.resonant_frequency(L, np.maximum(capacitance + c0, 0.0)), np.nan)

    warnings_ = []
    if c0 < 0:
        near_zero = " (within twice its uncertainty of zero: too small to resolve with these capacitors)" \
            if -c0 <= 2.0 * u_c0 else ""
        warnings_.append(f"the fitted stray C0 = {_f(c0, 'F', 3)} ± {_f(u_c0, 'F', 2)} is below zero{near_zero}: "
                         "a reading or a capacitor's value is off; check the capacitors on a meter and read each "
                         "resonance at its peak")
    elif u_c0 > 0.5 * c0:
        warnings_.append(f"C0 = {_f(c0, 'F', 3)} is known only to ± {_f(u_c0, 'F', 2)}: a reading with a smaller "
                         "capacitor (nearer C0) pins it better")
    relative = (frequency - fitted) / fitted
    if dof > 0 and np.all(np.isfinite(relative)):
        worst = int(np.argmax(np.abs(relative)))
        if abs(relative[worst]) > 2.0 * tolerance:
            worst_text = _point_text(capacitance[worst], frequency[worst])
            warnings_.append(f"the points do not lie on one line within twice the ±{tolerance:.2%} tolerance: the "
                             f"worst, {worst_text}, is {relative[worst]:+.2%} off it (a reading or a capacitor's "
                             "value is off, or the coil's L changes between the frequencies)")
    elif dof > 0:
        warnings_.append("some points lie where C + C0 is below zero: the readings do not follow 1/ω² = L·(C + C0)")
    if dof == 0:
        assumptions.append("two resonances fix the line exactly, so the residuals are zero: a third reading "
                           "checks them")
    if scale > 1.0:
        assumptions.append(f"the points scatter more than the tolerance allows: the uncertainties are scaled up by "
                           f"√(χ²/ν) = {scale:.3g}")
    assumptions.append("uncertainties are one standard deviation, from each reading's tolerance taken as its standard "
                       "uncertainty; the capacitors' own values are taken as exact")
    return ResonanceFit(
        inductance=float(L), inductance_uncertainty=float(u_l), stray=float(c0), stray_uncertainty=float(u_c0),
        capacitances=tuple(float(c) for c in capacitance), frequencies=tuple(float(f) for f in frequency),
        fitted_frequencies=tuple(float(g) for g in fitted), tolerance=tolerance, chi_square=chi_square,
        degrees_of_freedom=dof, uncertainty_scale=scale, warnings=tuple(warnings_), assumptions=tuple(assumptions))


# --- a tank at power -----------------------------------------------------------------------------------------


def drive_fields(*, reactance: float, power: float | None = None, q: float | None = None) -> dict:
    r"""The parallel resistance and RMS voltage of a tank driven at power: R_p = Q·X, V = √(P·Q·X).

    Parameters
    ----------
    reactance : float
        X at resonance, Ω.
    power : float, optional
        P dissipated in the tank and its load, W.
    q : float, optional
        Q of the loaded tank.

    Returns
    -------
    dict
        ``power_W``, ``q``, ``parallel_resistance_ohm`` (with ``q``), ``tank_voltage_rms_V`` and
        ``tank_voltage_peak_V`` (with both); empty when neither is given.

    Examples
    --------
    >>> fields = drive_fields(reactance=1000.0, power=5.0, q=100.0)
    >>> round(fields["tank_voltage_rms_V"], 1), round(fields["parallel_resistance_ohm"])
    (707.1, 100000)
    """
    fields: dict = {}
    if power is not None:
        fields["power_W"] = _positive(power, "power", "W")
        low, high = TANK_POWER_RANGE
        if not low <= fields["power_W"] <= high:
            raise InvalidInputError("power", f"a power from {_f(low, 'W', 1)} to {_f(high, 'W', 1)}",
                                    _f(fields["power_W"], "W"))
    if q is not None:
        fields["q"] = _positive(q, "q", "")
        if fields["q"] > MAX_TANK_Q:
            raise InvalidInputError("q", f"a loaded Q above 0 and at most {MAX_TANK_Q:.0f}", f"{fields['q']:.6g}")
        fields["parallel_resistance_ohm"] = fields["q"] * float(reactance)
    if power is not None and q is not None:
        volts = float(rs.tank_voltage_rms(power, q, reactance))
        fields["tank_voltage_rms_V"] = volts
        fields["tank_voltage_peak_V"] = math.sqrt(2.0) * volts
    return fields


def tank_cautions(*, power: float | None = None, voltage_rms: float | None = None) -> list[str]:
    """Cautions for a tank at power: licensing of anything that radiates, and the RF voltage across it.

    Parameters
    ----------
    power : float, optional
        The power the tank is driven at, W; none, no cautions.
    voltage_rms : float, optional
        The estimated RMS voltage across the tank (:func:`drive_fields`), V.

    Examples
    --------
    >>> tank_cautions()
    []
    >>> len(tank_cautions(power=5.0, voltage_rms=707.0))
    2
    """
    if power is None:
        return []
    cautions = ["a tank driven at power belongs to a transmitter: anything that radiates is subject to licensing "
                "and power limits; follow your local rules and licensed practice"]
    if voltage_rms is None:
        cautions.append("high RF voltage appears across a driven tank and at the top of a loading coil, "
                        "V = √(P·Q·X): a few watts into a high-Q tank give hundreds of volts (give --q for an "
                        "estimate)")
    elif voltage_rms >= HIGH_RF_VOLTAGE_V:
        cautions.append(f"about {_f(voltage_rms, 'V', 3)} RMS ({_f(math.sqrt(2.0) * voltage_rms, 'V', 3)} peak) "
                        "appears across "
                        "this tank, and more at the top of a loading coil: RF at this voltage burns and arcs; keep "
                        "clear while it is driven and rate the capacitor and the coil's spacing for the peak")
    return cautions
