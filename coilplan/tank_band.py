r"""Band coverage with a variable capacitor: the ratio a band needs, the largest stray, the coil, the band covered.

:func:`plan_band` takes a variable capacitor of travel Cmin..Cmax, a stray Cs across the coil and
an optional padder Cp in series with the capacitor, and returns a frozen :class:`BandPlan` with
``as_dict()`` (the ``result`` object of ``coilplan tank --json``). A band fmin..fmax needs the ratio
R = (fmax/fmin)²; the capacitor stands a stray up to Cs ≤ (Cmax − R·Cmin)/(R − 1); the coil
L = 1/((2π fmin)²(Cmax + Cs)) puts the low band edge at the bottom of the capacitor's travel.

=================  ===================  ==============================================
symbol             parameter            meaning
=================  ===================  ==============================================
L                  ``inductance``       inductance, H
Cmin, Cmax         ``capacitor``        the variable capacitor's travel, F
fmin, fmax         ``band``             the band to tune, Hz
Cs                 ``stray``            stray across the coil (wiring, device input, the
                                        coil's self-capacitance), F
Cp                 ``padder``           fixed capacitor in series with the variable one, F
=================  ===================  ==============================================
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from coilplan.errors import InvalidInputError
from coilplan.physics import resonance as rs
from coilplan.tank_values import _f, _positive

__all__ = ["DEFAULT_STRAY_F", "BandPlan", "plan_band"]

#: Stray capacitance assumed across a tuned coil when none is given: wiring, a valve's or
#: transistor's input and the coil's own self-capacitance (a typical figure; common practice, no source).
DEFAULT_STRAY_F = 15e-12


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
