r"""LC tanks: resonance, reactance, the tuning ratio of a variable capacitor, and the voltage across a driven tank.

=========  =====================  ==================================================
symbol     parameter              meaning
=========  =====================  ==================================================
L          ``inductance``         inductance of the coil, H
C          ``capacitance``        total capacitance across the coil, F
f          ``frequency``          frequency, Hz (ω = 2πf)
X          (returned)             reactance of L or of C at resonance, Ω
Z0         (returned)             characteristic impedance √(L/C), Ω
Cmin/Cmax  ``c_min``, ``c_max``   a variable capacitor's travel, F
Cs         ``stray``              capacitance across the coil besides the tuning
                                  capacitor (wiring, the active device's input, the
                                  coil's own self-capacitance), F
Cp         ``padder``             fixed capacitor in series with the tuning capacitor, F
R          ``ratio``              capacitance ratio a band needs, (fmax/fmin)²
Q          ``q``                  quality factor of the loaded tank
P          ``power``              power dissipated in the tank, W
=========  =====================  ==================================================

Every kernel is pure numpy, broadcasts over its arguments and passes NaN through.

References
----------
.. [Terman1943] F. E. Terman, *Radio Engineers' Handbook*, McGraw-Hill, 1943, sec. 3 (resonant circuits:
   f = 1/(2π√(LC)), X = √(L/C) at resonance, the parallel-resonant impedance Q·X) and sec. 6 (tuning
   ranges with padding and trimming capacitors). Recalled (from memory); the relations themselves are
   elementary circuit theory and are re-derived in each docstring.
"""

from __future__ import annotations

import numpy as np

__all__ = [
    "band_capacitance_ratio",
    "characteristic_impedance",
    "max_stray_capacitance",
    "resonant_capacitance",
    "resonant_frequency",
    "resonant_inductance",
    "series_capacitance",
    "tank_voltage_rms",
]

_TWO_PI = 2.0 * np.pi


def resonant_frequency(inductance, capacitance):
    r"""Resonant frequency of an inductance and a capacitance.

    .. math::

        f = \frac{1}{2\pi\sqrt{LC}}

    Parameters
    ----------
    inductance : float or array_like
        L, H.
    capacitance : float or array_like
        C, the total across the coil, F.

    Returns
    -------
    ndarray
        f, Hz.

    Notes
    -----
    Lossless lumped L and C [Terman1943]_; losses shift a parallel tank's
    resonance by a fraction of order 1/(2Q²), negligible for Q above about 10.

    Examples
    --------
    >>> round(float(resonant_frequency(100e-6, 100e-12)) / 1e3, 2)  # kHz, docs/methods.md §10
    1591.55
    """
    L = np.asarray(inductance, dtype=float)
    C = np.asarray(capacitance, dtype=float)
    return 1.0 / (_TWO_PI * np.sqrt(L * C))


def resonant_inductance(frequency, capacitance):
    r"""Inductance that resonates with a capacitance at a frequency.

    .. math::

        L = \frac{1}{(2\pi f)^2\,C}

    Parameters
    ----------
    frequency : float or array_like
        f, Hz.
    capacitance : float or array_like
        C, F.

    Returns
    -------
    ndarray
        L, H.

    Examples
    --------
    >>> round(float(resonant_inductance(530e3, 365e-12)) * 1e6, 2)  # µH, docs/methods.md §10
    247.06
    """
    f = np.asarray(frequency, dtype=float)
    C = np.asarray(capacitance, dtype=float)
    return 1.0 / ((_TWO_PI * f) ** 2 * C)


def resonant_capacitance(frequency, inductance):
    r"""Capacitance that resonates with an inductance at a frequency.

    .. math::

        C = \frac{1}{(2\pi f)^2\,L}

    Parameters
    ----------
    frequency : float or array_like
        f, Hz.
    inductance : float or array_like
        L, H.

    Returns
    -------
    ndarray
        C, F.

    Examples
    --------
    >>> round(float(resonant_capacitance(1591549.43, 100e-6)) * 1e12, 3)  # pF
    100.0
    """
    f = np.asarray(frequency, dtype=float)
    L = np.asarray(inductance, dtype=float)
    return 1.0 / ((_TWO_PI * f) ** 2 * L)


def characteristic_impedance(inductance, capacitance):
    r"""Characteristic impedance of a tank: the reactance of L (and of C) at resonance.

    .. math::

        Z_0 = \sqrt{L/C} = \omega_0 L = \frac{1}{\omega_0 C},\qquad \omega_0 = \frac{1}{\sqrt{LC}}

    Parameters
    ----------
    inductance : float or array_like
        L, H.
    capacitance : float or array_like
        C, F.

    Returns
    -------
    ndarray
        Z0, Ω.

    Examples
    --------
    >>> float(characteristic_impedance(100e-6, 100e-12))
    1000.0
    """
    L = np.asarray(inductance, dtype=float)
    C = np.asarray(capacitance, dtype=float)
    return np.sqrt(L / C)


def band_capacitance_ratio(f_low, f_high):
    r"""Capacitance ratio a tuning capacitor must swing to tune a band with a fixed coil.

    .. math::

        R = \left(\frac{f_{max}}{f_{min}}\right)^2 \le \frac{C_{max,total}}{C_{min,total}}

    Parameters
    ----------
    f_low, f_high : float or array_like
        Band edges, Hz (f_high > f_low for a ratio above 1).

    Returns
    -------
    ndarray
        R, dimensionless.

    Notes
    -----
    From f ∝ 1/√C at fixed L [Terman1943]_. "Total" capacitances include
    everything across the coil: the tuning capacitor, trimmer, wiring, the
    active device's input and the coil's self-capacitance.

    Examples
    --------
    >>> round(float(band_capacitance_ratio(530e3, 1700e3)), 3)  # docs/methods.md §10
    10.288
    """
    return (np.asarray(f_high, dtype=float) / np.asarray(f_low, dtype=float)) ** 2


def max_stray_capacitance(c_min, c_max, ratio):
    r"""Largest fixed capacitance across the coil that still lets a capacitor swing a ratio.

    .. math::

        \frac{C_{max} + C_s}{C_{min} + C_s} \ge R
        \iff C_s \le \frac{C_{max} - R\,C_{min}}{R - 1}\qquad (R > 1)

    Parameters
    ----------
    c_min, c_max : float or array_like
        The capacitor's travel, F (with a padder, the series combinations; see
        :func:`series_capacitance`).
    ratio : float or array_like
        R, the ratio needed (:func:`band_capacitance_ratio`).

    Returns
    -------
    ndarray
        Cs, F. Negative when the capacitor alone (Cs = 0) swings less than R:
        no stray at all would do. NaN where R <= 1 (any stray will do; there
        is no bound).

    Examples
    --------
    >>> round(float(max_stray_capacitance(10e-12, 365e-12, band_capacitance_ratio(530e3, 1700e3))) * 1e12, 2)
    28.22
    """
    c_min = np.asarray(c_min, dtype=float)
    c_max = np.asarray(c_max, dtype=float)
    R = np.asarray(ratio, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        bound = (c_max - R * c_min) / (R - 1.0)
    return np.where(R > 1.0, bound, np.nan)


def series_capacitance(first, second):
    r"""Two capacitors in series, e.g. a tuning capacitor and its padder.

    .. math::

        C = \frac{C_1 C_2}{C_1 + C_2}

    Parameters
    ----------
    first, second : float or array_like
        C1, C2, F; ``inf`` stands for a short (no padder) and returns the other.

    Returns
    -------
    ndarray
        C, F.

    Examples
    --------
    >>> round(float(series_capacitance(500e-12, 500e-12)) * 1e12, 3)
    250.0
    >>> round(float(series_capacitance(365e-12, np.inf)) * 1e12, 3)
    365.0
    """
    c1 = np.asarray(first, dtype=float)
    c2 = np.asarray(second, dtype=float)
    with np.errstate(invalid="ignore", divide="ignore"):
        combined = 1.0 / (1.0 / c1 + 1.0 / c2)
    return combined


def tank_voltage_rms(power, q, reactance):
    r"""RMS voltage across a parallel tank that dissipates a power.

    .. math::

        P = \frac{V^2}{R_p},\quad R_p = Q\,X \;\Rightarrow\; V = \sqrt{P\,Q\,X}

    Parameters
    ----------
    power : float or array_like
        P, the power dissipated in the tank and its load, W.
    q : float or array_like
        Q of the tank as loaded.
    reactance : float or array_like
        X, the reactance of L (or C) at resonance, Ω.

    Returns
    -------
    ndarray
        V, volts RMS (the peak is √2 V).

    Notes
    -----
    The parallel-resonant impedance of a tank of quality factor Q is Q·X
    [Terman1943]_. A few watts into a high-Q tank give hundreds of volts.

    Examples
    --------
    >>> round(float(tank_voltage_rms(5.0, 100.0, 1000.0)), 1)
    707.1
    """
    P = np.asarray(power, dtype=float)
    Q = np.asarray(q, dtype=float)
    X = np.asarray(reactance, dtype=float)
    return np.sqrt(P * Q * X)
