r"""Closed magnetic cores: IEC 60205 effective parameters, AL values, gaps and flux density.

========  ===================  ==============================================
symbol    parameter            meaning
========  ===================  ==============================================
C1        (returned)           core constant Σ l/A, 1/m
C2        (returned)           core constant Σ l/A², 1/m³
le        ``le``               effective magnetic path length, m
Ae        ``ae``               effective cross-section, m²
µr        ``mu_r``             relative permeability of the core material
lg        ``gap``              total length of the air gap in the path, m
AL        ``al``               inductance per turn squared, H
========  ===================  ==============================================

References
----------
.. [IEC60205] IEC 60205:2016, *Calculation of the effective parameters of magnetic
   piece parts* (C1 = Σ l/A, C2 = Σ l/A²; le = C1²/C2, Ae = C1/C2, Ve = C1³/C2²;
   definitions also in IEC 60050-221, IEV 221-04-31).
.. [McLyman2004] C. W. T. McLyman, *Transformer and Inductor Design Handbook*,
   3rd ed., Marcel Dekker, 2004, ch. 8 (fringing flux factor).
"""

from __future__ import annotations

import numpy as np
from scipy.constants import mu_0

__all__ = [
    "al_value",
    "effective_parameters",
    "fringing_factor",
    "gapped_al",
    "peak_flux_density",
    "ring_core_constants",
    "sine_peak_flux_density",
]


def ring_core_constants(inner_diameter, outer_diameter, height, chamfer=0.0):
    r"""Core constants C1, C2 of a ring (toroid) of rectangular cross-section, edges optionally chamfered.

    .. math::

        C_1 = \frac{2\pi}{I_1},\quad C_2 = \frac{2\pi\,I_2}{I_1^3},\qquad
        I_1 = \int_{r_1}^{r_2}\frac{h(r)}{r}\,dr,\quad I_2 = \int_{r_1}^{r_2}\frac{h(r)}{r^2}\,dr

    which for a plain rectangle (h(r) = h) are the familiar

    .. math::

        C_1 = \frac{2\pi}{h\,\ln(r_2/r_1)},\qquad
        C_2 = \frac{2\pi\,(1/r_1 - 1/r_2)}{h^2 \ln^3(r_2/r_1)}

    Parameters
    ----------
    inner_diameter, outer_diameter, height : float or array_like
        ID = 2 r1, OD = 2 r2 and height h of the ring, m; OD > ID > 0.
    chamfer : float or array_like
        Leg c of a 45° chamfer on each of the four edges, m (0: square edges);
        the section's height falls by 2(c − x) within c of either face's edge.

    Returns
    -------
    tuple of ndarray
        (C1 in 1/m, C2 in 1/m³).

    Notes
    -----
    The rectangular ring formulas are those of [IEC60205]_. They follow from
    the field of the ring, H ∝ 1/r, across concentric thin rings in parallel;
    with uniform µ they make µ0 µr N² Ae/le = µ0 µr N² h ln(OD/ID)/(2π) exactly,
    Ampère's law. The chamfered form applies the same two integrals to the
    reduced height h(r) (derived here, not quoted from the standard); the
    chamfer must be under half the height and the radial width.

    Examples
    --------
    >>> c1, c2 = ring_core_constants(15e-3, 25e-3, 10e-3)  # docs/methods.md §8
    >>> round(float(c1) * 1e-3, 6), round(float(c2) * 1e-9, 8)  # per mm, per mm³
    (1.230006, 0.02513973)
    """
    r1 = np.asarray(inner_diameter, dtype=float) / 2.0
    r2 = np.asarray(outer_diameter, dtype=float) / 2.0
    h = np.asarray(height, dtype=float)
    c = np.asarray(chamfer, dtype=float)
    # I1 = ∫ h/r dr and I2 = ∫ h/r² dr for the full rectangle ...
    i1 = h * np.log(r2 / r1)
    i2 = h * (1.0 / r1 - 1.0 / r2)
    # ... less the two chamfered strips, where the height is short by 2(c − (r − r1))
    # near r1, and by 2(c − (r2 − r)) near r2: both linear in r, integrated exactly.
    for start, stop, intercept, slope in ((r1, r1 + c, 2.0 * (c + r1), -2.0),
                                          (r2 - c, r2, 2.0 * (c - r2), 2.0)):
        with np.errstate(divide="ignore", invalid="ignore"):
            log_ratio = np.where(c > 0, np.log(stop / start), 0.0)
            i1 = i1 - (intercept * log_ratio + slope * (stop - start))
            i2 = i2 - (intercept * np.where(c > 0, 1.0 / start - 1.0 / stop, 0.0) + slope * log_ratio)
    c1 = 2.0 * np.pi / i1
    c2 = 2.0 * np.pi * i2 / i1**3
    return c1, c2


def effective_parameters(c1, c2):
    r"""Effective length, area and volume from the core constants.

    .. math::

        l_e = C_1^2/C_2,\qquad A_e = C_1/C_2,\qquad V_e = C_1^3/C_2^2

    Parameters
    ----------
    c1 : float or array_like
        Σ l/A, 1/m.
    c2 : float or array_like
        Σ l/A², 1/m³.

    Returns
    -------
    tuple of ndarray
        (le in m, Ae in m², Ve in m³).

    Notes
    -----
    Definitions of [IEC60205]_ (IEV 221-04-31). le and Ae are not geometric:
    for a ring le is shorter than the mean circumference and Ae smaller than
    the section, while Ae/le = 1/C1 is exact.

    Examples
    --------
    >>> le, ae, ve = effective_parameters(*ring_core_constants(15e-3, 25e-3, 10e-3))
    >>> round(float(le) * 1e3, 4), round(float(ae) * 1e6, 4), round(float(ve) * 1e9, 2)
    (60.1802, 48.9268, 2944.42)
    """
    c1 = np.asarray(c1, dtype=float)
    c2 = np.asarray(c2, dtype=float)
    return c1 * c1 / c2, c1 / c2, c1**3 / (c2 * c2)


def al_value(mu_r, ae, le):
    r"""AL value (inductance per turn squared) of an ungapped core.

    .. math::

        A_L = \frac{\mu_0 \mu_r A_e}{l_e}

    Parameters
    ----------
    mu_r : float or array_like
        Relative permeability (µ = 1 for an air-core toroid).
    ae, le : float or array_like
        Effective area (m²) and length (m).

    Returns
    -------
    ndarray
        AL in henry per turn².

    Examples
    --------
    >>> le, ae, _ = effective_parameters(*ring_core_constants(15e-3, 25e-3, 10e-3))
    >>> round(float(al_value(2000, ae, le)) * 1e9, 2)  # nH, docs/methods.md §8
    2043.3
    """
    return mu_0 * np.asarray(mu_r, dtype=float) * np.asarray(ae, dtype=float) / np.asarray(le, dtype=float)


def gapped_al(ae, le, gap, mu_r):
    r"""AL value of a core with an air gap, without fringing flux.

    .. math::

        A_L = \frac{\mu_0 A_e}{l_g + l_e/\mu_r}

    Parameters
    ----------
    ae : float or array_like
        Effective area, m².
    le : float or array_like
        Effective magnetic path length, m (the core's, gap excluded).
    gap : float or array_like
        Total gap length lg, m (both legs' gaps added for an E pair gapped on all legs).
    mu_r : float or array_like
        Relative permeability of the core material.

    Returns
    -------
    ndarray
        AL in henry per turn².

    Notes
    -----
    Assumes the gap area equals Ae, lg much smaller than le and the gap's
    linear dimensions, and µr ≫ 1 — the usual magnetic-circuit relation. It
    underestimates L, because flux fringing round the gap widens its area;
    see :func:`fringing_factor`. With no gap it gives :func:`al_value`.

    Examples
    --------
    >>> round(float(gapped_al(100e-6, 50e-3, 0.5e-3, 2000)) * 1e9, 3)  # docs/methods.md §8
    239.359
    """
    ae = np.asarray(ae, dtype=float)
    return mu_0 * ae / (np.asarray(gap, dtype=float) + np.asarray(le, dtype=float) / np.asarray(mu_r, dtype=float))


def fringing_factor(gap, ae, window_height):
    r"""McLyman's fringing-flux factor F for a gapped core (engineering estimate).

    .. math::

        F = 1 + \frac{l_g}{\sqrt{A_e}}\,\ln\frac{2G}{l_g}

    Parameters
    ----------
    gap : float or array_like
        Gap length lg, m (per gap).
    ae : float or array_like
        Cross-section at the gap, m².
    window_height : float or array_like
        G, the winding window's height (the length of the leg that carries
        the gap), m.

    Returns
    -------
    ndarray
        F >= 1; the inductance with fringing is about F × the no-fringing value.
        1 where the gap is zero.

    Notes
    -----
    An approximation [McLyman2004]_, roughly ±10 % on the correction; recalled
    (from memory). It grows with the gap and is meant for gaps small against
    the leg's width; outside that, measure.

    Examples
    --------
    >>> round(float(fringing_factor(0.5e-3, 100e-6, 10e-3)), 4)  # docs/methods.md §8
    1.1844
    """
    gap = np.asarray(gap, dtype=float)
    ae = np.asarray(ae, dtype=float)
    height = np.asarray(window_height, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        factor = 1.0 + gap / np.sqrt(ae) * np.log(2.0 * height / gap)
    return np.where(gap == 0, 1.0, factor)


def peak_flux_density(al, turns, current, ae):
    r"""Flux density in the core for a current in the winding.

    .. math::

        B = \frac{L I}{N A_e} = \frac{A_L N I}{A_e}

    Parameters
    ----------
    al : float or array_like
        AL value, H per turn² (with fringing, if any, included).
    turns : float or array_like
        N.
    current : float or array_like
        Current (peak, for the peak flux density), A.
    ae : float or array_like
        Effective area, m².

    Returns
    -------
    ndarray
        B in tesla.

    Notes
    -----
    Faraday's law: the flux N·Φ = L·I, with Φ = B·Ae. For a gapped core the
    flux through the core is taken as the whole flux (fringing counted in AL).

    Examples
    --------
    >>> round(float(peak_flux_density(100e-9, 50, 1.0, 50e-6)), 3)
    0.1
    """
    return (np.asarray(al, dtype=float) * np.asarray(turns, dtype=float) * np.asarray(current, dtype=float)
            / np.asarray(ae, dtype=float))


def sine_peak_flux_density(voltage_rms, frequency, turns, ae):
    r"""Peak flux density for a sine voltage across the winding.

    .. math::

        B_{peak} = \frac{\sqrt2\,V_{rms}}{2\pi f N A_e} = \frac{V_{rms}}{4.44\,f N A_e}

    Parameters
    ----------
    voltage_rms : float or array_like
        RMS sine voltage across the winding, V.
    frequency : float or array_like
        f, Hz.
    turns : float or array_like
        N.
    ae : float or array_like
        Effective area, m².

    Returns
    -------
    ndarray
        B_peak in tesla.

    Notes
    -----
    Faraday's law for a sine: the transformer equation of every textbook.

    Examples
    --------
    >>> round(float(sine_peak_flux_density(4.44, 1e3, 100, 1e-4)), 6)
    0.099935
    """
    return (np.sqrt(2.0) * np.asarray(voltage_rms, dtype=float)
            / (2.0 * np.pi * np.asarray(frequency, dtype=float) * np.asarray(turns, dtype=float)
               * np.asarray(ae, dtype=float)))
