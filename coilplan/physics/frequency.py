r"""At the operating frequency: self-capacitance, skin and proximity effect, litz wire, Q and the parallel-C model.

============  ==========================  ===================================================
symbol        parameter                   meaning
============  ==========================  ===================================================
D             ``diameter``                coil diameter to the wire centres, m
l             ``length``                  winding length of a single-layer coil, m
H             (returned)                  Medhurst's factor, pF per cm of diameter
εi, εx        ``former_permittivity``,    relative permittivity inside the winding (former)
              ``outside_permittivity``    and outside it
ψ             (from ``pitch``)            pitch angle of the helix, tan ψ = p/(πD)
f, ω          ``frequency``               frequency, Hz; ω = 2πf
ρ             ``resistivity``             conductor resistivity, Ω·m (see
                                          :func:`coilplan.wire.copper_resistivity`)
δ             ``skin_depth``              skin depth, m
a             ``radius``                  conductor radius, m
Δ             ``delta``                   Dowell's layer thickness over skin depth, with porosity
p             ``layers``                  layers in one winding portion (between zero-field points)
η             (porosity)                  Dowell's layer porosity, (√π/2)·d·N_layer/b
L, R, C       ``inductance``, ...         series inductance, series resistance, capacitance
============  ==========================  ===================================================

All functions are pure, take SI floats or arrays and broadcast over every
argument. They are NaN-transparent (NaN in, NaN out); limits such as zero
frequency are handled by explicit masks and documented. Outside a method's
stated range they warn with :class:`~coilplan.errors.OutsideValidityWarning`
and still return a value.

References
----------
.. [Medhurst1947] R. G. Medhurst, "H.F. resistance and self-capacitance of
   single-layer solenoids", *Wireless Engineer*, vol. 24, no. 281, pp. 35-43,
   Feb. 1947, and no. 282, pp. 80-92, Mar. 1947 (table of H against l/D).
.. [Knight2016] D. W. Knight, "The self-resonance and self-capacitance of
   solenoid coils: applicable theory, models and calculation methods",
   g3ynh.info / ResearchGate, 2016 (first version 2010,
   https://www.scribd.com/document/94791835/self-res).
.. [Dowell1966] P. L. Dowell, "Effects of eddy currents in transformer
   windings", *Proc. IEE*, vol. 113, no. 8, pp. 1387-1394, 1966.
.. [Sullivan1999] C. R. Sullivan, "Optimal choice for number of strands in a
   litz-wire transformer winding", *IEEE Trans. Power Electronics*, vol. 14,
   no. 2, pp. 283-291, 1999 (summary: http://www.dartmouth.edu/~sullivan/litzwire/).
.. [Massarini1997] A. Massarini and M. K. Kazimierczuk, "Self-capacitance of
   inductors", *IEEE Trans. Power Electronics*, vol. 12, no. 4, pp. 671-676,
   July 1997.
.. [Ramo1994] S. Ramo, J. R. Whinnery and T. Van Duzer, *Fields and Waves in
   Communication Electronics*, 3rd ed., Wiley, 1994 (two parallel cylinders).
.. [DLMF] NIST Digital Library of Mathematical Functions, §10.2 (J0, J1 power
   series) and §10.17 (Hankel asymptotic expansions).
"""

from __future__ import annotations

import math
import warnings
from fractions import Fraction

import numpy as np
from scipy.constants import epsilon_0, mu_0
from scipy.special import jve

from coilplan.errors import OutsideValidityWarning
from coilplan.physics._pchip import pchip_evaluate, pchip_slopes

__all__ = [
    "apparent_inductance_and_resistance",
    "coil_impedance",
    "dowell_delta",
    "dowell_factor",
    "knight_self_capacitance",
    "litz_resistance_ratio",
    "medhurst_h",
    "medhurst_self_capacitance",
    "multilayer_self_capacitance",
    "q_factor",
    "round_wire_impedance_ratio",
    "round_wire_resistance_ratio",
    "self_resonant_frequency",
    "skin_depth",
    "solenoid_proximity_factor",
    "toroid_self_capacitance",
]

_SQRT_PI_2 = math.sqrt(math.pi) / 2.0  # (√π/2): side of the square with the area of a circle of unit diameter


def _out(value):
    """Return a 0-d result as a numpy scalar, anything else as an array."""
    value = np.asarray(value)
    return value[()] if value.ndim == 0 else value


# --------------------------------------------------------------------------- self-capacitance

# Medhurst's table [Medhurst1947]: H in pF per cm of diameter against l/D, as
# posted to the Tesla coil mailing list (the paper itself was not seen):
#   (a) https://pupman.com/listarchives/1997/november/msg00393.html and
#       http://pupman.com/listarchives/1997/january/msg00722.html: every row but
#       2.5, 3.5 and 4.5;
#   (b) https://pupman.com/listarchives/1996/june/msg00129.html: the rows 1.0 to 5.0
#       in steps of 0.5, which agree with (a) where both give a value.
# 0.8 and 1.0 share the minimum 0.46 (docs/methods.md §6a lists 0.46 at both).
_MEDHURST_TABLE = (
    # (l/D, H pF/cm, source)
    (0.1, 0.96, "a"),
    (0.2, 0.70, "a"),
    (0.5, 0.50, "a"),
    (0.8, 0.46, "a"),
    (1.0, 0.46, "a, b"),
    (1.5, 0.47, "a, b"),
    (2.0, 0.50, "a, b"),
    (2.5, 0.56, "b"),
    (3.0, 0.61, "a, b"),
    (3.5, 0.67, "b"),
    (4.0, 0.72, "a, b"),
    (4.5, 0.77, "b"),
    (5.0, 0.81, "a, b"),
    (10.0, 1.32, "a"),
    (20.0, 2.36, "a"),
    (50.0, 5.8, "a"),
)
_MEDHURST_LOG_X = np.log([row[0] for row in _MEDHURST_TABLE])
_MEDHURST_LOG_H = np.log([row[1] for row in _MEDHURST_TABLE])
_MEDHURST_SLOPES = pchip_slopes(_MEDHURST_LOG_X, _MEDHURST_LOG_H)
# power laws through the two end points at either side, for extrapolation
_MEDHURST_SLOPE_LOW = (_MEDHURST_LOG_H[1] - _MEDHURST_LOG_H[0]) / (_MEDHURST_LOG_X[1] - _MEDHURST_LOG_X[0])
_MEDHURST_SLOPE_HIGH = (_MEDHURST_LOG_H[-1] - _MEDHURST_LOG_H[-2]) / (_MEDHURST_LOG_X[-1] - _MEDHURST_LOG_X[-2])


def medhurst_h(length_over_diameter):
    r"""Medhurst's self-capacitance factor H (pF per cm of diameter), interpolated from his table.

    .. math::

        \ln H = \mathrm{PCHIP}\bigl(\ln(l/D)\bigr),\qquad C_{self}[\mathrm{pF}] = H\cdot D[\mathrm{cm}]

    Parameters
    ----------
    length_over_diameter : float or array_like
        l/D, winding length over diameter to the wire centres. Any shape.

    Returns
    -------
    ndarray or float
        H in pF/cm. NaN where the ratio is NaN or not positive.

    Warns
    -----
    OutsideValidityWarning
        For l/D outside the table, 0.1 to 50.

    Notes
    -----
    The table [Medhurst1947]_ (16 points, module constant ``_MEDHURST_TABLE``
    with the address of each row) is interpolated, not fitted: a monotone
    piecewise cubic (PCHIP: scipy's construction, coded in coilplan.physics._pchip)
    through (ln l/D, ln H), which passes through every table point exactly and
    keeps the flat minimum at l/D 0.8 to 1.0 flat.
    Outside 0.1 to 50 the value follows the power law through the two end
    points on that side (log-log linear extrapolation), with a warning.

    Medhurst measured coils wound on solid polystyrene rods and claimed about
    5 % accuracy. A coil on an air core or a thin tube has less capacitance,
    about a third less at l/D = 1 (see :func:`knight_self_capacitance`).

    References
    ----------
    [Medhurst1947]_, [Knight2016]_.

    Examples
    --------
    >>> round(float(medhurst_h(1.0)), 3), round(float(medhurst_h(10.0)), 3)
    (0.46, 1.32)
    >>> round(float(medhurst_h(7.0)), 3)  # between the table's 5 and 10
    1.007
    """
    x = np.asarray(length_over_diameter, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        log_x = np.log(x)
    low, high = _MEDHURST_LOG_X[0], _MEDHURST_LOG_X[-1]
    below = log_x < low
    above = log_x > high
    if np.any(below | above):
        warnings.warn("Medhurst's table covers l/D from 0.1 to 50; outside it H is extrapolated "
                      "as a power law through the two end points", OutsideValidityWarning, stacklevel=2)
    log_h = pchip_evaluate(_MEDHURST_LOG_X, _MEDHURST_LOG_H, _MEDHURST_SLOPES, np.clip(log_x, low, high))
    log_h = np.where(below, _MEDHURST_LOG_H[0] + _MEDHURST_SLOPE_LOW * (log_x - low), log_h)
    log_h = np.where(above, _MEDHURST_LOG_H[-1] + _MEDHURST_SLOPE_HIGH * (log_x - high), log_h)
    log_h = np.where(x > 0, log_h, np.nan)  # zero, negative or NaN ratio
    return _out(np.exp(log_h))


def medhurst_self_capacitance(diameter, length):
    r"""Self-capacitance of a single-layer solenoid by Medhurst's table (solid polystyrene former).

    .. math::

        C_{self} = H(l/D)\cdot D[\mathrm{cm}]\ \mathrm{pF} = H(l/D)\cdot 100\,D[\mathrm{m}]\cdot 10^{-12}\ \mathrm{F}

    Parameters
    ----------
    diameter : float or array_like
        D, coil diameter to the wire centres, m.
    length : float or array_like
        l, winding length, m (broadcast against ``diameter``).

    Returns
    -------
    ndarray or float
        C in farad.

    Warns
    -----
    OutsideValidityWarning
        For l/D outside 0.1 to 50 (see :func:`medhurst_h`).

    Notes
    -----
    Medhurst's coils were wound on solid polystyrene rods (relative permittivity
    about 2.5); he claimed about 5 % accuracy [Medhurst1947]_. For an air-cored
    or tubular former the table overestimates; :func:`knight_self_capacitance`
    takes the former's permittivity. The value does not depend on the number of
    turns, only weakly on the pitch.

    Examples
    --------
    >>> print(f"{float(medhurst_self_capacitance(0.05, 0.05)) * 1e12:.2f} pF")  # 5 cm, l/D = 1
    2.30 pF
    """
    diameter = np.asarray(diameter, dtype=float)
    length = np.asarray(length, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = length / diameter
    h = medhurst_h(ratio)
    return _out(h * (diameter * 100.0) * 1e-12)


def knight_self_capacitance(diameter, length, pitch=None, former_permittivity=1.0, outside_permittivity=1.0):
    r"""Self-capacitance of a single-layer solenoid by Knight's formula, with the former's permittivity.

    .. math::

        C = \frac{4\varepsilon_0\varepsilon_x l}{\pi}\,
            \frac{1 + k_c\,(1 + \varepsilon_i/\varepsilon_x)/2}{\cos^2\psi},\qquad
        k_c = 0.717439\,\frac{D}{l} + 0.933048\left(\frac{D}{l}\right)^{3/2} + 0.106\left(\frac{D}{l}\right)^2,
        \qquad \tan\psi = \frac{p}{\pi D}

    Parameters
    ----------
    diameter : float or array_like
        D, coil diameter to the wire centres, m.
    length : float or array_like
        l, winding length, m.
    pitch : float or array_like, optional
        p, distance between turn centres, m; ``None`` ignores the pitch angle (ψ = 0).
    former_permittivity : float or array_like
        εi, relative permittivity inside the winding (1 for air; about 2.5 for a
        solid polystyrene rod; a thin tube lies between).
    outside_permittivity : float or array_like
        εx, relative permittivity outside the winding (1 for air).

    Returns
    -------
    ndarray or float
        C in farad.

    Notes
    -----
    Knight's semi-empirical formula [Knight2016]_ (coefficients as recalled in
    docs/methods.md §6, not read from the paper). With εi = 2.5 (Medhurst's
    polystyrene rods) it reproduces Medhurst's table to within ±4.6 % (rms about
    2 %) over l/D = 0.1 to 50, which supports the coefficients (checked in
    tests/physics/test_frequency.py). With an air core (εi = 1) C is about 32 %
    lower at l/D = 1. The 1/cos²ψ factor matters only for coarse pitches.
    Like Medhurst's table it describes the coil alone, far from other
    conductors; leads, a screen or a nearby chassis add capacitance.

    Examples
    --------
    >>> c = knight_self_capacitance(0.05, 0.05, former_permittivity=2.5)
    >>> print(f"{float(c) * 1e12:.3f} pF")  # Medhurst's table: 0.46 pF/cm x 5 cm = 2.30 pF
    2.296 pF
    """
    diameter = np.asarray(diameter, dtype=float)
    length = np.asarray(length, dtype=float)
    eps_i = np.asarray(former_permittivity, dtype=float)
    eps_x = np.asarray(outside_permittivity, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        x = diameter / length
        kc = 0.717439 * x + 0.933048 * x**1.5 + 0.106 * x**2
        capacitance = 4.0 * epsilon_0 * eps_x * length / np.pi * (1.0 + kc * (1.0 + eps_i / eps_x) / 2.0)
        if pitch is not None:
            tan_psi = np.asarray(pitch, dtype=float) / (np.pi * diameter)
            capacitance = capacitance * (1.0 + tan_psi**2)  # 1/cos²ψ = 1 + tan²ψ
    return _out(capacitance)


def multilayer_self_capacitance(mean_diameter, winding_width, layers, layer_gap, permittivity=1.0):
    r"""Rough self-capacitance of a layered (multilayer) winding from the layer-to-layer capacitance.

    .. math::

        C_{self} \approx \frac{4}{3}\,C_{layer}\,\frac{n - 1}{n^2},\qquad
        C_{layer} = \frac{\varepsilon_0\varepsilon_r\,\pi D_m b}{g}

    Parameters
    ----------
    mean_diameter : float or array_like
        D_m, mean diameter of the winding, m.
    winding_width : float or array_like
        b, axial width of one layer, m.
    layers : float or array_like
        n, number of layers (1 gives 0: a single layer has no layer-to-layer term).
    layer_gap : float or array_like
        g, effective dielectric thickness between adjacent layers, m: the
        interleaving tape plus twice the enamel build, plus a fraction of the wire
        diameter for round wire (the parallel-plate model overestimates for
        touching round wires).
    permittivity : float or array_like
        εr, effective relative permittivity of the gap (enamel about 3 to 4, paper
        and tape 2 to 4, air 1; a mixture for round wire).

    Returns
    -------
    ndarray or float
        C in farad, an estimate.

    Notes
    -----
    An estimate, rough to tens of percent and up to a factor of two (our
    judgment; no published accuracy): the capacitance of adjacent layers as
    parallel plates, combined by the stored electric energy. In a simple layered
    winding (each layer wound in the same sense and the wire returning to the
    start at each layer end; not staggered, not bank-wound) the voltage between
    layers k and k+1 rises linearly from 0 at the end where they join to 2V/n at
    the other end, so each gap stores ½·C_layer·(2V/n)²/3, and the n − 1 gaps
    together store ½·C_self·V² with the C_self above (derived here). This is the
    energy method of [Massarini1997]_, whose paper was seen only in its
    abstract; turn-to-turn capacitance within a layer and the capacitance to a
    core or screen are left out. A measured value (self-resonance with a known
    capacitor) should replace it where it matters.

    Examples
    --------
    >>> c = multilayer_self_capacitance(0.02, 0.01, 4, 0.1e-3, permittivity=3.0)
    >>> print(f"{float(c) * 1e12:.1f} pF")
    41.7 pF
    """
    d = np.asarray(mean_diameter, dtype=float)
    b = np.asarray(winding_width, dtype=float)
    n = np.asarray(layers, dtype=float)
    gap = np.asarray(layer_gap, dtype=float)
    eps = np.asarray(permittivity, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        c_layer = epsilon_0 * eps * np.pi * d * b / gap
        capacitance = 4.0 / 3.0 * c_layer * (n - 1.0) / n**2
    return _out(np.where(n >= 1, capacitance, np.nan))


def toroid_self_capacitance(turns, turn_length, pitch, wire_diameter, permittivity=1.0):
    r"""Rough self-capacitance of a single-layer toroid winding from the turn-to-turn capacitance.

    .. math::

        C_{tt} = \frac{\pi\varepsilon_0\varepsilon_r\,l_t}{\operatorname{arccosh}(p/d)},\qquad
        C_{self} \approx \frac{C_{tt}}{N - 1}

    Parameters
    ----------
    turns : float or array_like
        N, number of turns (N > 1).
    turn_length : float or array_like
        l_t, length of one turn, m.
    pitch : float or array_like
        p, centre distance of adjacent turns where they are closest (on the
        inside of the ring: π·(ID − d_o)/N for a full winding with overall wire
        diameter d_o), m; p > d.
    wire_diameter : float or array_like
        d, bare conductor diameter, m.
    permittivity : float or array_like
        εr, effective relative permittivity around the wires (enamel and air,
        about 1.5 to 3 for touching enamelled turns).

    Returns
    -------
    ndarray or float
        C in farad, an estimate; NaN where p <= d or N <= 1.

    Notes
    -----
    A rough estimate, ±50 % (our judgment; no published accuracy). C_tt is the
    exact capacitance of two parallel cylinders in a uniform dielectric
    [Ramo1994]_, applied along the whole turn although real turns fan out on
    the outside of the ring; the N − 1 turn-to-turn capacitances are taken in
    series, as for a voltage that rises evenly along the winding. Left out: the
    capacitance between the first and the last turn (large when the winding
    closes the ring; leave a gap), the capacitance through a conductive ferrite
    core (which can dominate for MnZn ferrite), and the leads. Massarini and
    Kazimierczuk treat the core and the end turns [Massarini1997]_.

    Examples
    --------
    >>> c = toroid_self_capacitance(20, 0.03, 0.8e-3, 0.7e-3, permittivity=2.0)
    >>> print(f"{float(c) * 1e12:.3f} pF")
    0.166 pF
    """
    n = np.asarray(turns, dtype=float)
    length = np.asarray(turn_length, dtype=float)
    p = np.asarray(pitch, dtype=float)
    d = np.asarray(wire_diameter, dtype=float)
    eps = np.asarray(permittivity, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        c_tt = np.pi * epsilon_0 * eps * length / np.arccosh(p / d)
        capacitance = c_tt / (n - 1.0)
    return _out(np.where((p > d) & (n > 1), capacitance, np.nan))


# --------------------------------------------------------------------------- skin effect


def skin_depth(frequency, resistivity, mu_r=1.0):
    r"""Skin depth of a conductor.

    .. math::

        \delta = \sqrt{\frac{\rho}{\pi f \mu_0 \mu_r}}

    Parameters
    ----------
    frequency : float or array_like
        f, Hz; 0 gives +inf.
    resistivity : float or array_like
        ρ, Ω·m (copper: :func:`coilplan.wire.copper_resistivity`).
    mu_r : float or array_like
        Relative permeability of the conductor (1 for copper).

    Returns
    -------
    ndarray or float
        δ in metre.

    Examples
    --------
    >>> print(f"{float(skin_depth(1e6, 1 / 58e6)) * 1e6:.3f} µm")  # IEC 60028 copper, 20 °C
    66.085 µm
    """
    f = np.asarray(frequency, dtype=float)
    rho = np.asarray(resistivity, dtype=float)
    with np.errstate(divide="ignore"):
        return _out(np.sqrt(rho / (np.pi * f * mu_0 * np.asarray(mu_r, dtype=float))))


def _impedance_series_coefficients(terms: int = 24) -> np.ndarray:
    """Coefficients c_k of (z/2)·J0(z)/J1(z) = Σ c_k u^k, u = z², by exact power-series division ([DLMF] 10.2.2)."""
    j0 = [Fraction((-1) ** k, 4**k * math.factorial(k) ** 2) for k in range(terms)]
    j1 = [Fraction((-1) ** k, 4**k * math.factorial(k) * math.factorial(k + 1)) for k in range(terms)]  # 2J1(z)/z
    quotient: list[Fraction] = []
    for k in range(terms):
        quotient.append((j0[k] - sum(quotient[i] * j1[k - i] for i in range(k))) / j1[0])
    return np.array([float(c) for c in quotient])


_Z_SERIES = _impedance_series_coefficients()
_Z_SERIES_LIMIT = 0.5  # a/δ below this: the power series (u = -2j(a/δ)², |u| <= 0.5, 24 terms: error < 1e-22)
_Z_ASYMPTOTE_LIMIT = 1e4  # a/δ above this: the Hankel asymptote (relative error below 1e-12)


def round_wire_impedance_ratio(radius_over_skin_depth):
    r"""Internal impedance of an isolated round wire over its DC resistance, exact (complex).

    .. math::

        \frac{Z_{int}}{R_{dc}} = \frac{k a}{2}\,\frac{J_0(k a)}{J_1(k a)},\qquad k = \frac{1 - j}{\delta}

    Parameters
    ----------
    radius_over_skin_depth : float or array_like
        a/δ, conductor radius over skin depth, >= 0.

    Returns
    -------
    ndarray or complex
        Z_int/R_dc: the real part is R_ac/R_dc, the imaginary part ω·L_int/R_dc.
        1 at a/δ = 0 (direct current), inf + inf·j at a/δ = +inf; NaN for NaN or
        negative input.

    Notes
    -----
    The Rayleigh-Kelvin solution for a straight round wire far from other
    conductors, time convention e^{jωt} (a positive, inductive imaginary part).
    Evaluated three ways, each where it is accurate to about 1e-15:

    * a/δ < 0.5: the power series in u = (ka)² = −2j(a/δ)², from the series of
      J0 and J1 [DLMF]_ 10.2.2 (the leading terms are
      1 + j(a/δ)²/4 + (a/δ)⁴/48); the Bessel quotient would lose the small
      imaginary part there;
    * 0.5 <= a/δ <= 1e4: the quotient of exponentially scaled Bessel functions
      (``scipy.special.jve``, the same quotient as J0/J1), which unlike ``jv``
      does not overflow beyond a/δ ≈ 700;
    * a/δ > 1e4: the Hankel asymptote [DLMF]_ 10.17.3,
      (ka/2)J0/J1 ≈ jka/2 + 1/4 − 3j/(16ka), that is
      Re = a/(2δ) + 1/4 + 3δ/(32a) and Im = a/(2δ) − 3δ/(32a), relative error
      below 1e-12 there.

    Agreement with mpmath at 30 digits is better than 1e-13 relative from a/δ =
    1e-3 to 1e6, including both switch points (tests/physics/test_frequency.py).

    Examples
    --------
    >>> z = round_wire_impedance_ratio(10.0)  # docs/methods.md §11: 5.2593019
    >>> round(float(z.real), 7), round(float(z.imag), 7)
    (5.2593019, 4.9896275)
    """
    x = np.asarray(radius_over_skin_depth, dtype=float)
    out = np.full(x.shape, complex(np.nan, np.nan), dtype=complex)
    small = (x >= 0) & (x < _Z_SERIES_LIMIT)
    middle = (x >= _Z_SERIES_LIMIT) & (x <= _Z_ASYMPTOTE_LIMIT)
    large = x > _Z_ASYMPTOTE_LIMIT  # includes +inf
    if np.any(small):
        u = -2j * x[small] ** 2
        total = np.zeros(u.shape, dtype=complex)
        for coefficient in _Z_SERIES[::-1]:
            total = total * u + coefficient
        out[small] = total
    if np.any(middle):
        z = (1.0 - 1.0j) * x[middle]
        out[middle] = z / 2.0 * jve(0, z) / jve(1, z)
    if np.any(large):
        xl = x[large]
        inverse = 3.0 / (32.0 * xl)
        value = np.empty(xl.shape, dtype=complex)
        value.real = xl / 2.0 + 0.25 + inverse
        value.imag = xl / 2.0 - inverse
        out[large] = value
    return _out(out)


def round_wire_resistance_ratio(radius, frequency, resistivity, mu_r=1.0):
    r"""AC over DC resistance of an isolated straight round wire (skin effect only), exact.

    .. math::

        \frac{R_{ac}}{R_{dc}} = \operatorname{Re}\left[\frac{k a}{2}\frac{J_0(k a)}{J_1(k a)}\right],\qquad
        k = \frac{1 - j}{\delta},\quad \delta = \sqrt{\frac{\rho}{\pi f \mu_0 \mu_r}}

    Parameters
    ----------
    radius : float or array_like
        a, conductor radius, m.
    frequency : float or array_like
        f, Hz.
    resistivity : float or array_like
        ρ, Ω·m.
    mu_r : float or array_like
        Relative permeability of the conductor (1 for copper).

    Returns
    -------
    ndarray or float
        R_ac/R_dc >= 1; 1 at zero frequency. Low-frequency limit 1 + (a/δ)⁴/48,
        high-frequency asymptote a/(2δ) + 1/4 + 3δ/(32a).

    Notes
    -----
    See :func:`round_wire_impedance_ratio`; the imaginary part of that ratio
    divided by its low-frequency value (a/δ)²/4 is L_int(f)/L_int(0), the
    internal inductance falling from µ0µr/(8π) per metre. A wire in a winding
    also suffers the proximity effect (:func:`dowell_factor`,
    :func:`solenoid_proximity_factor`).

    Examples
    --------
    >>> print(f"{float(round_wire_resistance_ratio(0.5e-3, 1e6, 1 / 58e6)):.4f}")  # 1 mm copper at 1 MHz
    4.0452
    """
    return _out(np.real(round_wire_impedance_ratio(np.asarray(radius, dtype=float)
                                                   / skin_depth(frequency, resistivity, mu_r))))


# --------------------------------------------------------------------------- proximity effect (Dowell)

def _series_in_fourth_powers(x, denominators) -> np.ndarray:
    """Σ_k x^{4k}/(4k + s)! for the offsets s in ``denominators`` (all terms positive: no cancellation)."""
    t = x**4
    total = np.zeros_like(x)
    for factorial in denominators[::-1]:
        total = total * t + 1.0 / factorial
    return total


_TERMS = 14  # Δ < 2: x^{4k}/(4k+s)! with x <= 4 falls below 1e-25 of the first term before k = 14
_FACT = {s: np.array([float(math.factorial(4 * k + s)) for k in range(_TERMS)]) for s in range(4)}
_DOWELL_SERIES_LIMIT = 2.0


def _dowell_terms(delta: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """(Δ·ς1, Δ·ς2) for Δ >= 0 without overflow or cancellation."""
    small = delta < _DOWELL_SERIES_LIMIT
    d_small = np.where(small, delta, 0.0)
    d_large = np.where(small, _DOWELL_SERIES_LIMIT, delta)
    # Δ < 2: sinh x ± sin x and cosh x ∓ cos x as series with terms of one sign.
    #   Δς1 = ½ Σ x^{4k}/(4k+1)! / Σ x^{4k}/(4k+2)!,  x = 2Δ
    #   Δς2 = Δ⁴ Σ Δ^{4k}/(4k+3)! / Σ Δ^{4k}/(4k)!
    x = 2.0 * d_small
    s1_small = 0.5 * _series_in_fourth_powers(x, _FACT[1]) / _series_in_fourth_powers(x, _FACT[2])
    s2_small = d_small**4 * _series_in_fourth_powers(d_small, _FACT[3]) / _series_in_fourth_powers(d_small, _FACT[0])
    # Δ >= 2: numerator and denominator scaled by 2e^{-2Δ} (ς1) and 2e^{-Δ} (ς2): no overflow.
    d_large = np.where(np.isfinite(d_large), d_large, _DOWELL_SERIES_LIMIT)  # +inf is masked by the caller
    e1 = np.exp(-d_large)
    e2 = e1 * e1
    s1_large = d_large * (1.0 - e2 * e2 + 2.0 * e2 * np.sin(2.0 * d_large)) / (
        1.0 + e2 * e2 - 2.0 * e2 * np.cos(2.0 * d_large))
    s2_large = d_large * (1.0 - e2 - 2.0 * e1 * np.sin(d_large)) / (1.0 + e2 + 2.0 * e1 * np.cos(d_large))
    return np.where(small, s1_small, s1_large), np.where(small, s2_small, s2_large)


def dowell_factor(delta, layers):
    r"""Dowell's AC resistance factor of a layered winding, averaged over its layers.

    .. math::

        F_r = \Delta\left[\varsigma_1 + \tfrac{2}{3}(p^2 - 1)\,\varsigma_2\right],\quad
        \varsigma_1 = \frac{\sinh 2\Delta + \sin 2\Delta}{\cosh 2\Delta - \cos 2\Delta},\quad
        \varsigma_2 = \frac{\sinh\Delta - \sin\Delta}{\cosh\Delta + \cos\Delta}

    Parameters
    ----------
    delta : float or array_like
        Δ, equivalent layer thickness over skin depth including the porosity
        (:func:`dowell_delta`), >= 0.
    layers : float or array_like
        p, number of layers in one winding portion, i.e. between points of zero
        field (all the layers of a plain inductor winding), >= 1.

    Returns
    -------
    ndarray or float
        F_r = R_ac/R_dc of the whole portion; 1 at Δ = 0. Small Δ:
        1 + (5p² − 1)Δ⁴/45; large Δ: Δ(1 + 2(p² − 1)/3).

    Notes
    -----
    Dowell's one-dimensional model [Dowell1966]_: each layer is replaced by a
    conducting foil of the same copper area, the field is parallel to the layers
    and rises by the same step across each layer (formula as in docs/methods.md
    §11b). For round wire the foil comes from the square of equal area
    (:func:`dowell_delta`); the model is known to be inaccurate for sparse
    layers of round wire (porosity well below 1), and it ignores the winding's
    curvature, its ends and any air gap's fringing field. Evaluated without
    cancellation or overflow for every Δ: cancellation-free power series below
    Δ = 2, exponentially scaled hyperbolic functions above.

    Examples
    --------
    >>> round(float(dowell_factor(1.0, 3)), 6)  # docs/methods.md §11
    1.939965
    """
    delta = np.asarray(delta, dtype=float)
    p = np.asarray(layers, dtype=float)
    delta, p = np.broadcast_arrays(delta, p)
    valid = (delta >= 0) & (p >= 0)
    d = np.where(valid, delta, 0.0)
    s1, s2 = _dowell_terms(d)
    factor = s1 + 2.0 / 3.0 * (p * p - 1.0) * s2
    factor = np.where(np.isposinf(d), np.inf, factor)
    return _out(np.where(valid, factor, np.nan))


def dowell_delta(wire_diameter, skin_depth, turns_per_layer, winding_width):
    r"""Dowell's Δ for a layer of round wire: the square-equivalent thickness over δ, with porosity.

    .. math::

        \Delta = \frac{\sqrt{\pi}}{2}\,\frac{d}{\delta}\,\sqrt{\eta},\qquad
        \eta = \frac{\sqrt{\pi}}{2}\,\frac{d\,N_{layer}}{b}

    Parameters
    ----------
    wire_diameter : float or array_like
        d, bare conductor diameter, m.
    skin_depth : float or array_like
        δ, m (:func:`skin_depth`).
    turns_per_layer : float or array_like
        N_layer, turns side by side in one layer.
    winding_width : float or array_like
        b, width of the layer (the winding window's breadth), m.

    Returns
    -------
    ndarray or float
        Δ, dimensionless.

    Warns
    -----
    OutsideValidityWarning
        Where the turns do not fit in the width (d·N_layer > b).

    Notes
    -----
    Round wire of diameter d is replaced by a square conductor of equal area,
    side (√π/2)d; the porosity η is the fraction of the layer's width filled by
    those squares [Dowell1966]_ (docs/methods.md §11b).

    Examples
    --------
    >>> round(float(dowell_delta(0.5e-3, 0.1e-3, 20, 12e-3)), 4)
    3.808
    """
    d = np.asarray(wire_diameter, dtype=float)
    n = np.asarray(turns_per_layer, dtype=float)
    b = np.asarray(winding_width, dtype=float)
    if np.any(d * n > b):
        warnings.warn("Dowell's porosity: the turns of a layer are wider than the winding width "
                      "(wire diameter × turns per layer > width)", OutsideValidityWarning, stacklevel=2)
    with np.errstate(divide="ignore", invalid="ignore"):
        porosity = _SQRT_PI_2 * d * n / b
        return _out(_SQRT_PI_2 * d / np.asarray(skin_depth, dtype=float) * np.sqrt(porosity))


def solenoid_proximity_factor(wire_diameter, pitch, frequency, resistivity):
    r"""AC over DC resistance of a single-layer solenoid winding: Dowell's one-layer formula (approximation).

    .. math::

        F = \max\left(F_{r}^{Dowell}(\Delta, p = 1),\ \frac{R_{ac}}{R_{dc}}\Big|_{isolated}\right),\qquad
        \Delta = \frac{\sqrt{\pi}}{2}\frac{d}{\delta}\sqrt{\eta},\quad \eta = \frac{\sqrt{\pi}}{2}\frac{d}{p}

    Parameters
    ----------
    wire_diameter : float or array_like
        d, bare conductor diameter, m.
    pitch : float or array_like
        p, distance between turn centres, m (>= d).
    frequency : float or array_like
        f, Hz.
    resistivity : float or array_like
        ρ, Ω·m.

    Returns
    -------
    ndarray or float
        R_ac/R_dc of the winding (skin and proximity effect together).

    Warns
    -----
    OutsideValidityWarning
        Where the pitch is smaller than the wire diameter.

    Notes
    -----
    A labelled approximation. Medhurst measured the resistance ratio of
    single-layer solenoids against spacing and l/D [Medhurst1947]_, but his
    table could not be read here, so coilplan uses Dowell's formula for one
    layer (:func:`dowell_factor` with p = 1) with the winding's porosity: a
    long solenoid is one layer with the field of the current sheet on its
    inside and none outside, which is Dowell's one-layer case [Dowell1966]_.
    It ignores the end turns (where the field turns radial and the loss rises),
    the curvature of the winding, and the field outside a short coil, so it
    underestimates for short coils; and like every use of Dowell's model for
    round wire it is inaccurate for sparse layers. For widely spaced turns
    Dowell's value even falls below the loss of the wire alone, which is a
    lower bound (the skin-effect loss of a round wire and its loss in an
    external field add; Ferreira's orthogonality, from memory), so the result
    is never less than :func:`round_wire_resistance_ratio`. Expect roughly
    ±30 % for close-wound coils of l/D about 1 and above (our judgment).

    Examples
    --------
    >>> print(f"{float(solenoid_proximity_factor(1e-3, 1.5e-3, 7e6, 1 / 58e6)):.2f}")
    27.27
    """
    d = np.asarray(wire_diameter, dtype=float)
    p = np.asarray(pitch, dtype=float)
    if np.any(p < d):
        warnings.warn("solenoid proximity factor: the pitch is smaller than the wire diameter",
                      OutsideValidityWarning, stacklevel=2)
    delta_skin = skin_depth(frequency, resistivity)
    with np.errstate(divide="ignore", invalid="ignore"):
        porosity = _SQRT_PI_2 * d / p
        delta = _SQRT_PI_2 * d / delta_skin * np.sqrt(porosity)
    dowell = dowell_factor(delta, 1.0)
    isolated = np.real(round_wire_impedance_ratio(d / 2.0 / delta_skin))
    return _out(np.maximum(dowell, isolated))  # np.maximum keeps NaN


# --------------------------------------------------------------------------- litz wire

_HEXAGONAL_PACKING = math.pi / (2.0 * math.sqrt(3.0))  # densest packing of equal circles, 0.9069


def litz_resistance_ratio(strand_diameter, strands, frequency, resistivity, bundle_diameter=None, layers=1,
                          turn_pitch=None):
    r"""AC over DC resistance of ideal litz wire: per-strand skin effect plus proximity loss (low-frequency method).

    .. math::

        F_r = F_{skin}\!\left(\frac{d_s}{2\delta}\right) +
        \begin{cases}
        \dfrac{(\pi\,n\,m)^2 d_s^6}{192\,\delta^4\,p_t^2} & m \ge 1 \text{ layers (winding field)}\\[2ex]
        \dfrac{n^2 d_s^6}{128\,\delta^4\,D_b^2} & m = 0 \text{ (a bundle on its own)}
        \end{cases}

    Parameters
    ----------
    strand_diameter : float or array_like
        d_s, bare diameter of one strand, m.
    strands : float or array_like
        n, number of strands.
    frequency : float or array_like
        f, Hz.
    resistivity : float or array_like
        ρ, Ω·m.
    bundle_diameter : float or array_like, optional
        D_b, overall diameter of the bundle, m; default: the strands in the
        densest (hexagonal) packing, d_s·√(n/0.9069), which is the smallest
        possible bundle and so errs towards more loss.
    layers : float or array_like
        m, layers of bundle in one winding portion (between zero-field points);
        0 for a bundle far from other turns (a lead).
    turn_pitch : float or array_like, optional
        p_t, axial distance between turns of bundle in a layer, m; default
        ``bundle_diameter`` (close-wound).

    Returns
    -------
    ndarray or float
        R_ac/R_dc of the litz winding (DC resistance of the n strands in parallel).

    Warns
    -----
    OutsideValidityWarning
        Where the strand diameter exceeds the skin depth: the low-frequency
        proximity expression then overestimates the loss.

    Notes
    -----
    Sullivan's low-frequency expression for litz windings [Sullivan1999]_: an
    ideally twisted bundle, in which every strand takes every position and
    carries I/n, loses in each strand the eddy-current power of a round wire in
    a transverse field, P' = π ω² B² d_s⁴/(128 ρ) per metre (peak B; valid for
    d_s ≪ δ), and the field in a layered winding rises linearly across the
    winding's build to N·I/b. Averaging B² = µ0² H² across the build gives the
    first case with N/b = m/p_t (Sullivan's factor k = 1 for this simple 1-D
    field; derived again here). For a bundle alone the field is the bundle's own,
    H = I r/(2π R²), which gives the second case (derived here in the same way).
    F_skin is the exact isolated-wire ratio of one strand
    (:func:`round_wire_resistance_ratio`), close to 1 for fine strands. The
    first case equals Dowell's low-Δ series applied to the strands as layers to
    within the factor 3/π that separates a round strand from Dowell's square
    equivalent (checked in the tests). Not included: bundle-level losses from
    imperfect twisting, loss from the strand insulation's effect on the fill,
    and any gap's fringing field.

    Examples
    --------
    >>> # 20 strands of 0.071 mm copper at 455 kHz, close-wound in 2 layers
    >>> print(f"{float(litz_resistance_ratio(71e-6, 20, 455e3, 1 / 58e6, layers=2)):.3f}")
    2.029
    """
    ds = np.asarray(strand_diameter, dtype=float)
    n = np.asarray(strands, dtype=float)
    m = np.asarray(layers, dtype=float)
    if bundle_diameter is None:
        bundle = ds * np.sqrt(n / _HEXAGONAL_PACKING)
    else:
        bundle = np.asarray(bundle_diameter, dtype=float)
    pitch = bundle if turn_pitch is None else np.asarray(turn_pitch, dtype=float)
    delta = np.asarray(skin_depth(frequency, resistivity), dtype=float)
    if np.any(ds > delta):
        warnings.warn("litz wire: the strand diameter exceeds the skin depth; the low-frequency "
                      "proximity expression overestimates the loss there", OutsideValidityWarning, stacklevel=2)
    strand_skin = np.real(round_wire_impedance_ratio(ds / 2.0 / delta))
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio4 = (ds / delta) ** 4 * ds**2  # d_s⁶/δ⁴
        winding = (np.pi * n * m) ** 2 * ratio4 / (192.0 * pitch**2)
        alone = n**2 * ratio4 / (128.0 * bundle**2)
    proximity = np.where(m > 0, winding, alone)
    return _out(np.where(m >= 0, strand_skin + proximity, np.nan))


# --------------------------------------------------------------------------- Q, resonance, parallel-C model


def q_factor(inductance, resistance, frequency):
    r"""Quality factor of a series L-R: reactance over resistance.

    .. math::

        Q = \frac{\omega L}{R},\qquad \omega = 2\pi f

    Parameters
    ----------
    inductance : float or array_like
        L, H.
    resistance : float or array_like
        R, total series loss resistance (copper plus core), Ω; 0 gives +inf.
    frequency : float or array_like
        f, Hz.

    Returns
    -------
    ndarray or float
        Q, dimensionless.

    Examples
    --------
    >>> round(float(q_factor(10e-6, 1.0, 1e6)), 3)
    62.832
    """
    with np.errstate(divide="ignore", invalid="ignore"):
        return _out(2.0 * np.pi * np.asarray(frequency, dtype=float) * np.asarray(inductance, dtype=float)
                    / np.asarray(resistance, dtype=float))


def self_resonant_frequency(inductance, capacitance):
    r"""Self-resonant frequency of an inductance with its self-capacitance (lossless).

    .. math::

        f_{SRF} = \frac{1}{2\pi\sqrt{L C}}

    Parameters
    ----------
    inductance : float or array_like
        L, H.
    capacitance : float or array_like
        C, F (self-capacitance plus any stray across the coil).

    Returns
    -------
    ndarray or float
        f in Hz; +inf for C = 0.

    Examples
    --------
    >>> print(f"{float(self_resonant_frequency(100e-6, 100e-12)) / 1e3:.2f} kHz")  # docs/methods.md §10
    1591.55 kHz
    """
    with np.errstate(divide="ignore"):
        return _out(1.0 / (2.0 * np.pi * np.sqrt(np.asarray(inductance, dtype=float)
                                                  * np.asarray(capacitance, dtype=float))))


def coil_impedance(frequency, inductance, resistance, capacitance, parallel_resistance=np.inf):
    r"""Terminal impedance of the lumped coil model: series L-R with C (and optionally R_p) across it.

    .. math::

        Z = \frac{Z_s}{1 + Z_s\,(j\omega C + 1/R_p)},\qquad Z_s = R + j\omega L

    Parameters
    ----------
    frequency : float or array_like
        f, Hz.
    inductance : float or array_like
        L, low-frequency (true) inductance, H.
    resistance : float or array_like
        R, series loss resistance at this frequency, Ω.
    capacitance : float or array_like
        C, self-capacitance (plus strays across the coil), F.
    parallel_resistance : float or array_like
        R_p, a loss across the terminals (dielectric loss of the former), Ω;
        +inf (default) for none.

    Returns
    -------
    ndarray or complex
        Z in ohm, complex (e^{jωt}: positive imaginary part = inductive).

    Notes
    -----
    The lumped model a meter sees below and around the first self-resonance. A
    single-layer coil is really a helical line; the model describes it well up
    to and a little beyond the SRF [Knight2016]_. Written as Z_s/(1 + Z_s Y)
    it needs no division by Z_s, so R = 0 at f = 0 gives 0.

    Examples
    --------
    >>> z = coil_impedance(1e6, 100e-6, 5.0, 5e-12)
    >>> round(float(z.real), 3), round(float(z.imag), 2)
    (5.203, 640.97)
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    series = np.asarray(resistance, dtype=float) + 1j * omega * np.asarray(inductance, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        admittance = 1j * omega * np.asarray(capacitance, dtype=float) + 1.0 / np.asarray(parallel_resistance,
                                                                                           dtype=float)
        return _out(series / (1.0 + series * admittance))


def apparent_inductance_and_resistance(frequency, inductance, resistance, capacitance):
    r"""Inductance and resistance a series-reading meter shows at f: Im Z/ω and Re Z of the parallel-C model.

    .. math::

        L_{app} = \frac{L(1 - \omega^2 L C) - R^2 C}{(1 - \omega^2 L C)^2 + (\omega R C)^2},\qquad
        R_{app} = \frac{R}{(1 - \omega^2 L C)^2 + (\omega R C)^2}

    Parameters
    ----------
    frequency : float or array_like
        f, Hz.
    inductance : float or array_like
        L, true (low-frequency) inductance, H.
    resistance : float or array_like
        R, series loss resistance at f, Ω.
    capacitance : float or array_like
        C, self-capacitance plus strays across the coil, F.

    Returns
    -------
    tuple of ndarray
        (L_app in H, R_app in Ω).

    Notes
    -----
    The exact real and imaginary parts of :func:`coil_impedance` (no parallel
    resistance), written so that f = 0 needs no division by ω (L_app(0) =
    L − R²C). When ωRC ≪ 1 − ω²LC and R²C ≪ L they reduce to the familiar
    L/(1 − ω²LC) and R/(1 − ω²LC)² (docs/methods.md §10). Above the SRF L_app
    is negative: the coil looks capacitive.

    Examples
    --------
    >>> l_app, r_app = apparent_inductance_and_resistance(1e6, 100e-6, 0.0, 5e-12)
    >>> print(f"{float(l_app) * 1e6:.3f} µH")  # docs/methods.md §10: 102.014 µH
    102.014 µH
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    L = np.asarray(inductance, dtype=float)
    R = np.asarray(resistance, dtype=float)
    C = np.asarray(capacitance, dtype=float)
    detune = 1.0 - omega**2 * L * C
    with np.errstate(divide="ignore", invalid="ignore"):
        denominator = detune**2 + (omega * R * C) ** 2
        return _out((L * detune - R * R * C) / denominator), _out(R / denominator)
