r"""Frequency dispersion of a soft magnetic core: complex permeability, core loss resistance, inductance drift.

=============  ===========================  ==================================================
symbol         parameter                    meaning
=============  ===========================  ==================================================
f, ω           ``frequency``                frequency, Hz; ω = 2πf
µ = µ' − jµ''  (returned)                   complex relative permeability ([IEV121-12-30])
µi             ``mu_initial``               initial (low-frequency, low-flux) permeability
f_r            ``relaxation_frequency``     relaxation frequency: µ'' peaks there
tanδ/µi        ``loss_factor``              relative loss factor ([IEC60401-3]) at f0
f0             ``loss_factor_frequency``    the frequency the loss factor is stated at
J_s            ``saturation_flux_density``  saturation polarisation µ0·Ms, T (≈ B_sat)
D              ``dilution``                 loss dilution: µe/µ' for a gapped core, µrod/µ'
                                            for a rod, 1 for a closed ungapped core
=============  ===========================  ==================================================

Two models, used together:

* :func:`complex_permeability`: one Debye-type relaxation of the magnetisation
  (domain-wall motion or spin rotation, [Snoek1948]) plus a small constant loss
  angle for the hysteresis and residual losses that IEC 60401-3 data report as
  the relative loss factor tanδ/µi. It gives µ' (the inductance's drift) and an
  upper bound on the loss.
* :func:`catalogue_loss_tangent`: the loss tangent as IEC 60401-3 catalogues
  present it, tanδ/µi against frequency, through two points of a class (a
  low-frequency value and one at the top of its usual range), log-log
  interpolated and never above the relaxation's loss.

All functions are pure, broadcast over every argument and pass NaN through.

**Roughness.** A single relaxation has the broadest loss tail a single
mechanism can have: well below f_r its loss tangent is about f/f_r. Real NiZn
ferrites have a resonance-like spin spectrum whose loss well below f_r is much
lower (from memory, up to about ten times lower at f_r/5); that is why the loss
in an answer comes from the catalogue curve, and the relaxation only caps it.
The real part µ' of the relaxation is closer: within a class's useful range it
stays near µi, as measured spectra do. Class values are typical
(``core_data/dispersion.csv``): a real core may differ by a factor of two or
more in f_r and in the loss factor.

References
----------
.. [Snoek1948] J. L. Snoek, "Dispersion and absorption in magnetic ferrites at
   frequencies above one Mc/s", *Physica*, vol. 14, no. 4, pp. 207-217, 1948
   (the product (µi − 1)·f_r limited by the saturation magnetisation; the paper
   was not opened, the constant is from memory).
.. [IEV121-12-30] IEC 60050-121, International Electrotechnical Vocabulary,
   121-12-30 "complex relative permeability", µr = µ'r − jµ''r, 2021
   (https://std.iec.ch/iev/iev.nsf/, read).
.. [IEC60401-3] IEC 60401-3:2015, *Terms and nomenclature for cores made of
   magnetically soft ferrites, Part 3: Guidelines on the format of data
   appearing in manufacturers' catalogues*: the relative loss factor tanδ/µi
   with its frequency, flux density and temperature (summary read at
   https://tnlab.org/en/deep-dive-into-iec-60401-3-soft-ferrite-material-data-sheets-dont-get-fooled-by-pretty-numbers/).
.. [JohnsonJasik] R. C. Johnson and H. Jasik, *Antenna Engineering Handbook*,
   ch. 5: core-loss resistance of a rod coil R_m = ω (µrod/µ')² µ'' µ0 F N² A/l,
   as quoted by A. J. Payne, "Losses in ferrite rod antennas"
   (https://studylib.net/doc/8228355/losses-in-ferrite-rod-antennas, read).
.. [Debye1929] P. Debye, *Polar Molecules*, Chemical Catalog Co., 1929 (the
   single-relaxation form, from memory).
"""

from __future__ import annotations

import numpy as np
from scipy.constants import physical_constants

__all__ = [
    "catalogue_loss_tangent",
    "complex_permeability",
    "core_loss_resistance",
    "inductance_ratio",
    "snoek_relaxation_frequency",
]

# γ/2π of the free electron (g ≈ 2.0023), Hz per tesla, CODATA through scipy. Ferrites have
# g close to 2 (from memory, 2.0 to 2.1), so this sets Snoek's constant to a few per cent.
_GAMMA_OVER_2PI = physical_constants["electron gyromag. ratio in MHz/T"][0] * 1e6
# Snoek's factor for the rotational susceptibility of randomly oriented grains, χ = (2/3) Ms/H_K
# (from memory): (µi − 1) f_r = (2/3) (γ/2π) J_s.
_SNOEK_FACTOR = 2.0 / 3.0


def _out(value):
    """Return a 0-d result as a numpy scalar, anything else as an array."""
    value = np.asarray(value)
    return value[()] if value.ndim == 0 else value


def snoek_relaxation_frequency(mu_initial, saturation_flux_density):
    r"""Relaxation (natural resonance) frequency of a ferrite by Snoek's law.

    .. math::

        (\mu_i - 1)\, f_r = \frac{2}{3}\,\frac{\gamma}{2\pi}\,J_s,
        \qquad \frac{\gamma}{2\pi} = 28.025\ \mathrm{GHz/T}

    Parameters
    ----------
    mu_initial : float or array_like
        µi, initial relative permeability; 1 (no magnetic response) gives +inf.
    saturation_flux_density : float or array_like
        J_s = µ0·Ms, T; the saturation flux density B_s of a data table is used
        for it (the two differ by µ0·H at saturation, well under 1 % in ferrites).

    Returns
    -------
    ndarray or float
        f_r, Hz.

    Notes
    -----
    Snoek's limit for the rotational permeability of a polycrystalline ferrite
    whose grains have random easy axes [Snoek1948]: the static susceptibility
    (2/3)·Ms/H_K times the resonance frequency (γ/2π)·µ0·H_K does not depend on
    the anisotropy field H_K. The factor 2/3 and the form are from memory;
    γ/2π is the free electron's (CODATA, via scipy), and ferrites' g-factor is
    within a few per cent of 2. Measured ferrites lie on or below this line;
    domain-wall relaxation in high-permeability MnZn ferrite lies below it
    (from memory, about a factor 2). Use it for NiZn and MnZn power ferrites;
    it does not apply to metal powders, whose roll-off is set by eddy currents.

    Examples
    --------
    >>> print(f"{float(snoek_relaxation_frequency(125, 0.36)) / 1e6:.1f} MHz")
    54.2 MHz
    """
    mu = np.asarray(mu_initial, dtype=float)
    js = np.asarray(saturation_flux_density, dtype=float)
    with np.errstate(divide="ignore"):
        return _out(_SNOEK_FACTOR * _GAMMA_OVER_2PI * js / (mu - 1.0))


def _residual_loss_angle(mu_i, f_r, loss_factor, f0):
    """The constant loss angle t on the susceptibility that makes tanδ(f0) = loss_factor·µi (t ≥ 0)."""
    x0 = np.divide(f0, f_r)
    chi = mu_i - 1.0
    a = chi / (1.0 + x0**2)  # relaxation: χ(f0) = a − jb
    b = a * x0
    target = loss_factor * mu_i
    with np.errstate(divide="ignore", invalid="ignore"):
        t = (target * (1.0 + a) - b) / a  # from (b + a t)/(1 + a) = target
    t = np.where(chi == 0.0, 0.0, t)  # no magnetic response: nothing to lose
    return np.where(np.isnan(t), t, np.maximum(t, 0.0))


def complex_permeability(frequency, mu_initial, relaxation_frequency, loss_factor=0.0, loss_factor_frequency=0.0):
    r"""Complex relative permeability of a core material class: one relaxation plus a constant loss angle.

    .. math::

        \mu' = 1 + \frac{\mu_i - 1}{1 + (f/f_r)^2},\qquad
        \mu'' = \frac{(\mu_i - 1)\,(f/f_r + t)}{1 + (f/f_r)^2}

    that is, the relaxation :math:`1 + (\mu_i - 1)/(1 + j f/f_r)` plus a loss
    :math:`t\,(\mu' - 1)` in step with the in-phase susceptibility. t is the
    residual (hysteresis plus residual-loss) angle, chosen so that the loss
    tangent at the stated frequency equals the stated relative loss factor:

    .. math::

        \tan\delta(f_0) = \frac{\mu''(f_0)}{\mu'(f_0)} = \frac{\tan\delta}{\mu_i}\Big|_{f_0} \cdot \mu_i

    Parameters
    ----------
    frequency : float or array_like
        f, Hz, at least 0.
    mu_initial : float or array_like
        µi, initial relative permeability (≥ 1).
    relaxation_frequency : float or array_like
        f_r, Hz, above 0; +inf gives no dispersion.
    loss_factor : float or array_like
        tanδ/µi at ``loss_factor_frequency`` (IEC 60401-3's relative loss
        factor, a small-signal value); 0 gives the relaxation alone.
    loss_factor_frequency : float or array_like
        f0, Hz, where ``loss_factor`` applies; 0 means the low-frequency limit.

    Returns
    -------
    ndarray or complex
        µ = µ' − jµ'' (µ'' ≥ 0 is the loss), dimensionless.

    Notes
    -----
    Limits of the relaxation part ([Debye1929] form, here for magnetisation):
    µ(0) = µi; µ'' peaks at f = f_r with (µi − 1)/2, where µ' = (µi + 1)/2;
    µ' falls to 1 + (µi − 1)/5 at 2 f_r; for f ≫ f_r, µ' → 1 and µ'' → 0. The
    relaxation alone satisfies the Kramers–Kronig relations. The constant
    loss angle leaves µ' unchanged, so with it they hold only approximately
    (a frequency-independent loss angle is the usual engineering description
    of hysteresis and residual loss at low level, from memory). If the relaxation alone already exceeds the stated loss
    factor at f0, no residual term is added (t = 0) and the model's loss at
    f0 is above the stated one. The loss factor is a small-signal value: at
    higher flux density the hysteresis loss rises (Rayleigh region), which
    this model leaves out. The module docstring states the model's roughness.

    Examples
    --------
    >>> mu = complex_permeability(54e6, 125, 54e6)
    >>> print(f"{mu.real:.1f} - j{-mu.imag:.1f}")
    63.0 - j62.0
    >>> mu = complex_permeability(1e5, 125, 54e6, loss_factor=30e-6, loss_factor_frequency=1e5)
    >>> print(f"tanδ/µi = {-mu.imag / mu.real / 125 * 1e6:.1f}e-6")
    tanδ/µi = 30.0e-6
    """
    f = np.asarray(frequency, dtype=float)
    mu_i = np.asarray(mu_initial, dtype=float)
    f_r = np.asarray(relaxation_frequency, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        x = f / f_r
        relax_real = np.where(np.isinf(x), 0.0, 1.0 / (1.0 + x**2))
        relax_imag = np.where(np.isinf(x), 0.0, x / (1.0 + x**2))
    t = _residual_loss_angle(mu_i, f_r, np.asarray(loss_factor, dtype=float),
                             np.asarray(loss_factor_frequency, dtype=float))
    chi = mu_i - 1.0
    # µ' − 1 = χ/(1 + x²) and µ'' = χ (x + t)/(1 + x²): the loss angle t acts on the in-phase part
    real = 1.0 + chi * relax_real
    imag = -chi * (relax_imag + relax_real * t)
    return _out(real + 1j * imag)


def core_loss_resistance(frequency, inductance, mu_complex, dilution=1.0):
    r"""Series loss resistance a core adds to an inductor.

    .. math::

        R_{core} = \omega L \,\frac{\mu''}{\mu'}\, D

    Parameters
    ----------
    frequency : float or array_like
        f, Hz.
    inductance : float or array_like
        L at ``frequency``, H: the inductance the core gives there (it scales with µ').
    mu_complex : complex or array_like
        The material's µ' − jµ'' at ``frequency`` (:func:`complex_permeability`).
    dilution : float or array_like
        D in (0, 1]: 1 for a closed ungapped core (toroid); µe/µ' for a gapped
        core; µrod/µ' for a coil on a rod, with µrod the rod's apparent permeability.

    Returns
    -------
    ndarray or float
        R_core, Ω, in series with the winding's copper resistance.

    Notes
    -----
    For a closed core the winding's L is proportional to µ, so the complex
    impedance jωL·µ/µ' has the real part ωL·µ''/µ' ([IEV121-12-30] sign
    convention). A gap dilutes the loss: 1/µe = 1/µ + l_g/l_e gives, to first
    order in the loss angle, tanδ_e = tanδ·µe/µ' — why IEC 60401-3 quotes
    tanδ/µi as the material figure (its product with µe is the gapped core's
    loss angle; from memory). For a rod, R_m = ω(µrod/µ')²µ''µ0 F N²A/l
    [JohnsonJasik] with L = µ0 µrod F N²A/l is the same form with
    D = µrod/µ'. Payne found the measured rise in a rod coil's loss larger,
    the excess being copper loss, not core loss.

    Examples
    --------
    >>> mu = complex_permeability(1e6, 125, 54e6)
    >>> print(f"{float(core_loss_resistance(1e6, 10e-6, mu)):.3f} ohm")
    1.154 ohm
    >>> print(f"{float(core_loss_resistance(1e6, 10e-6, mu, dilution=0.1)):.4f} ohm")
    0.1154 ohm
    """
    mu = np.asarray(mu_complex, dtype=complex)
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        tan_delta = -mu.imag / mu.real
    return _out(omega * np.asarray(inductance, dtype=float) * tan_delta * np.asarray(dilution, dtype=float))


def inductance_ratio(frequency_a, frequency_b, mu_initial, relaxation_frequency):
    r"""How a closed core's inductance changes between two frequencies: µ'(f_b)/µ'(f_a).

    .. math::

        \frac{L(f_b)}{L(f_a)} = \frac{\mu'(f_b)}{\mu'(f_a)},\qquad
        \mu'(f) = 1 + \frac{\mu_i - 1}{1 + (f/f_r)^2}

    Parameters
    ----------
    frequency_a : float or array_like
        f_a, Hz: usually the meter's test frequency.
    frequency_b : float or array_like
        f_b, Hz: usually the operating frequency (``--at``).
    mu_initial : float or array_like
        µi.
    relaxation_frequency : float or array_like
        f_r, Hz.

    Returns
    -------
    ndarray or float
        L(f_b)/L(f_a), dimensionless (the loss angle does not change µ').

    Notes
    -----
    For a closed ungapped core. For a gapped core use µe = µ'/(1 + µ'·l_g/l_e)
    at each frequency: the change is diluted by about µe/µ'. Self-resonance of
    the winding is a separate effect (apparent inductance).

    Examples
    --------
    >>> print(f"{float(inductance_ratio(1e3, 1e6, 2300, 4e6)):.4f}")
    0.9412
    """
    def real_part(f):
        x = np.asarray(f, dtype=float) / np.asarray(relaxation_frequency, dtype=float)
        relax = np.where(np.isinf(x), 0.0, 1.0 / (1.0 + x**2))
        return 1.0 + (np.asarray(mu_initial, dtype=float) - 1.0) * relax

    with np.errstate(divide="ignore", invalid="ignore"):
        return _out(real_part(frequency_b) / real_part(frequency_a))



def catalogue_loss_tangent(frequency, mu_initial, relaxation_frequency, loss_factor, loss_factor_frequency,
                           loss_factor_high, loss_factor_high_frequency):
    r"""Loss tangent tanδ = µ''/µ' of a material class from two points of its relative loss factor.

    .. math::

        \frac{\tan\delta}{\mu_i}(f) = F_0 \left(\frac{f}{f_0}\right)^{k},\quad
        k = \frac{\ln(F_1/F_0)}{\ln(f_1/f_0)}\quad (f > f_0;\ F_0 \text{ below } f_0),
        \qquad
        \tan\delta = \min\left(\mu_i \frac{\tan\delta}{\mu_i}(f),\ \tan\delta_{relax}(f)\right)

    Parameters
    ----------
    frequency : float or array_like
        f, Hz, at least 0.
    mu_initial, relaxation_frequency : float or array_like
        µi and f_r, as for :func:`complex_permeability`.
    loss_factor, loss_factor_frequency : float or array_like
        F0 = tanδ/µi at f0 (the low-frequency point; f0 ≥ 0).
    loss_factor_high, loss_factor_high_frequency : float or array_like
        F1 = tanδ/µi at f1 > f0 (the point at the top of the class's usual range),
        F1 ≥ F0.

    Returns
    -------
    ndarray or float
        tanδ, dimensionless.

    Notes
    -----
    IEC 60401-3 asks a catalogue to give the relative loss factor tanδ/µi
    against frequency [IEC60401-3]; on the usual log-log chart it rises
    roughly as a straight line from the residual-loss floor towards the
    material's relaxation (common practice, no source). Two points and a
    straight line on that chart are the least that carries the rise; the
    exponent k is typically between 0.2 and 1 (from memory). The cap is the
    relaxation-plus-residual model of :func:`complex_permeability` through F0:
    no real spectrum of a single mechanism loses more than the Debye form
    (its tail is the broadest), so beyond f1 the line cannot run away above
    f_r, where the loss of the relaxation falls again. Small-signal values.

    Examples
    --------
    >>> print(f"{float(catalogue_loss_tangent(1e5, 125, 54e6, 30e-6, 1e5, 160e-6, 3e7)):.5f}")
    0.00375
    >>> print(f"{float(catalogue_loss_tangent(3e7, 125, 54e6, 30e-6, 1e5, 160e-6, 3e7)):.4f}")
    0.0200
    """
    f = np.asarray(frequency, dtype=float)
    f0 = np.asarray(loss_factor_frequency, dtype=float)
    f1 = np.asarray(loss_factor_high_frequency, dtype=float)
    low = np.asarray(loss_factor, dtype=float)
    high = np.asarray(loss_factor_high, dtype=float)
    mu_i = np.asarray(mu_initial, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        slope = np.log(high / low) / np.log(f1 / np.maximum(f0, 1e-300))
        slope = np.where(high == low, 0.0, slope)
        line = low * np.power(np.maximum(f, f0) / np.maximum(f0, 1e-300), slope)
    line = np.where(f <= f0, low, line)
    relaxation = complex_permeability(f, mu_i, relaxation_frequency, low, f0)
    with np.errstate(divide="ignore", invalid="ignore"):
        relaxation_tangent = -np.imag(relaxation) / np.real(relaxation)
    return _out(np.minimum(mu_i * line, relaxation_tangent))
