"""Saturation of a cored winding: peak flux density against the material's limit.

Works through two members of a cored form: ``flux_density(turns, current)``
(linear in the current) and ``core_area()`` (Ae, for a sine voltage), plus its
``saturation_flux_density`` (T at the working temperature, or None).
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from coilplan.physics.magnetic import sine_peak_flux_density

__all__ = ["NEAR_SATURATION", "SaturationCheck", "saturation_check"]

#: Fraction of the saturation flux density from which the output warns (common practice, no source).
NEAR_SATURATION = 0.8


@dataclass(frozen=True)
class SaturationCheck:
    """Peak flux density of a winding and how far it is from saturation (SI).

    Attributes
    ----------
    flux_density_dc, flux_density_ac, flux_density_peak : float
        B from the DC current, the AC amplitude, and their sum, T.
    saturation_flux_density : float or None
        The material's limit at the working temperature, T (None: unknown or air).
    margin : float or None
        1 − B_peak/B_sat: 0.3 means 30 % below saturation; negative is past it.
    max_dc_current : float or None
        The DC current that, with the AC on top, reaches B_sat, A.
    """

    flux_density_dc: float
    flux_density_ac: float
    flux_density_peak: float
    saturation_flux_density: float | None
    margin: float | None
    max_dc_current: float | None

    @property
    def near_saturation(self) -> bool:
        """True at or above :data:`NEAR_SATURATION` of B_sat."""
        return self.margin is not None and self.margin <= 1.0 - NEAR_SATURATION


def saturation_check(form, turns: float, *, dc_current: float = 0.0, ac_current: float = 0.0,
                     ac_voltage: float | None = None, frequency: float | None = None) -> SaturationCheck:
    r"""Peak flux density for DC plus AC drive, and the margin to saturation.

    .. math::

        B_{peak} = \frac{A_L N I_{dc}}{A_e} + B_{ac},\quad
        B_{ac} = \frac{A_L N \hat I_{ac}}{A_e}\ \text{or}\
                 \frac{\sqrt2\,V_{rms}}{2\pi f N A_e}

    Parameters
    ----------
    form : cored form
        Toroid, GappedCore or any form with ``flux_density``, ``core_area`` and
        ``saturation_flux_density``.
    turns : float
        N.
    dc_current : float
        DC current, A.
    ac_current : float
        AC current amplitude (peak), A.
    ac_voltage, frequency : float, optional
        RMS sine voltage across the winding, V, at ``frequency``, Hz (instead of
        ``ac_current``).

    Returns
    -------
    SaturationCheck
    """
    per_amp = float(form.flux_density(turns, 1.0))
    b_dc = per_amp * dc_current
    if ac_voltage is not None:
        b_ac = float(sine_peak_flux_density(ac_voltage, frequency, turns, form.core_area()))
    else:
        b_ac = per_amp * ac_current
    peak = b_dc + b_ac
    limit = form.saturation_flux_density
    if limit is None or not math.isfinite(limit):  # unknown, or air (never saturates)
        return SaturationCheck(b_dc, b_ac, peak, None, None, None)
    if limit <= 0:  # above the Curie point: no longer magnetic, nothing to carry
        return SaturationCheck(b_dc, b_ac, peak, 0.0, -math.inf if peak > 0 else 0.0, 0.0)
    return SaturationCheck(b_dc, b_ac, peak, limit, 1.0 - peak / limit, max((limit - b_ac) / per_amp, 0.0))
