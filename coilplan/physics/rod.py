r"""Ferrite rods: demagnetising factors of a cylinder, apparent permeability, a coil on a rod.

=============  ========================  ==============================================
symbol         parameter                 meaning
=============  ========================  ==============================================
l              ``rod_length``            rod length, m
d              ``rod_diameter``          rod diameter, m (radius a = d/2)
γ              ``length_over_diameter``  l/d, dimensionless
χ              ``susceptibility``        χ = μ − 1 of the rod material
μi             ``mu_initial``            initial (relative) permeability of the material
N_f            (returned)                fluxmetric factor: midplane cross-section
N_m            (returned)                magnetometric factor: whole-volume average
c              ``coil_length``           current-sheet length of the winding, m
D              ``coil_diameter``         winding diameter to the wire centres, m (D >= d)
p              ``position``              offset of the coil centre from the rod centre, m
=============  ========================  ==============================================

The slice model (ours, after the one-dimensional model of [Chen1991]_). The rod
is cut into n equal slices; slice j carries a uniform axial magnetisation M_j,
the same over its whole cross-section. The demagnetising field of that
magnetisation, averaged over each slice's volume, is exact for such a profile:
a uniformly magnetised segment of length t has the volume-averaged factor
:math:`1 - K_L(d/t)` (Nagaoka's coefficient, [Chen1991]_, docs/methods.md §9), and
the interaction of two segments follows from that self term by the usual
four-term difference of end separations (the rule that gives the mutual
inductance of coaxial current sheets from Lorenz's formula). In units of d,

.. math::

    G(u) = |u|\,\bigl[1 - K_L(1/|u|)\bigr],\qquad
    E_{jk} = \tfrac12\bigl[G(b_j - a_k) + G(a_j - b_k) - G(b_j - b_k) - G(a_j - a_k)\bigr],

for slices :math:`[a_j, b_j]`. With slice thickness t and :math:`D = E/t`
(a symmetric Toeplitz matrix), a unit axial field H_0 = 1 gives

.. math::

    \Bigl(\frac{1}{\chi}\,I + D\Bigr) M = \mathbf 1,\qquad
    N_m = \frac{\langle D M\rangle_\text{rod}}{\langle M\rangle_\text{rod}},\qquad
    N_f = \frac{\langle D M\rangle_\text{mid}}{\langle M\rangle_\text{mid}},

i.e. the demagnetising field over the magnetisation, averaged over the whole
rod (magnetometric) or over the two central slices (fluxmetric, the flux
through the midplane). The error of the discretisation falls as 1/n²; two
solutions, with n and 2n slices, are combined by Richardson extrapolation.
At χ = 0 both factors are exact for any n (they then equal the uniformly
magnetised cylinder's values, which the model reproduces term by term).

All public functions are pure numpy/scipy kernels: SI floats or arrays in,
broadcasting over every argument, NaN-transparent; singular limits are
explicit masks.

References
----------
.. [BozorthChapin1942] R. M. Bozorth and D. M. Chapin, "Demagnetizing factors of
   rods", J. Appl. Phys., vol. 13, no. 5, pp. 320-326, 1942.
.. [Chen1991] D.-X. Chen, J. A. Brug and R. B. Goldfarb, "Demagnetizing factors
   for cylinders", IEEE Trans. Magn., vol. 27, no. 4, pp. 3601-3619, 1991
   (one-dimensional model for γ >= 10; χ = 0 values exactly from inductance
   formulas).
.. [Osborn1945] J. A. Osborn, "Demagnetizing factors of the general ellipsoid",
   Phys. Rev., vol. 67, no. 11-12, pp. 351-357, 1945.
.. [Snelling1988] E. C. Snelling, *Soft Ferrites: Properties and Applications*,
   2nd ed., Butterworths, London, 1988 (chapter on aerial rods).
.. [Nagaoka1909] H. Nagaoka, "The inductance coefficients of solenoids",
   J. College of Science, Imperial University Tokyo, vol. 27, art. 6, 1909.
.. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
   vol. 2, Clarendon Press, Oxford, 1873, art. 701 (coaxial circles).
"""

from __future__ import annotations

import functools
import warnings
from typing import Literal

import numpy as np
from scipy.constants import mu_0

from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.physics.loops import coaxial_mutual_inductance
from coilplan.physics.solenoid import current_sheet_inductance, nagaoka_coefficient

__all__ = [
    "cylinder_demagnetising_factor",
    "rod_coil_inductance",
    "rod_permeability",
    "spheroid_demagnetising_factor",
]

_KINDS = ("fluxmetric", "magnetometric")
_SLICES_PER_DIAMETER = 16  # coarse mesh; the fine mesh of the Richardson pair has twice as many
_MIN_SLICES = 64
_MAX_SLICES = 2048  # coarse mesh cap: beyond γ = 128 the slices grow thicker than d/16
_SHORT_ROD = 2.0  # below this l/d (and χ > 0) the cross-section-uniform assumption is poor: our choice
_GAUSS_NODES, _GAUSS_WEIGHTS = np.polynomial.legendre.leggauss(16)


# ---------------------------------------------------------------- spheroid


def spheroid_demagnetising_factor(length_over_diameter):
    r"""Axial demagnetising factor of a spheroid (ellipsoid of revolution), exact.

    .. math::

        m > 1:\; N = \frac{1}{m^2 - 1}\left[\frac{m}{\sqrt{m^2-1}}
              \ln\!\bigl(m + \sqrt{m^2-1}\bigr) - 1\right],\qquad
        m < 1:\; N = \frac{1}{1 - m^2}\left[1 - \frac{m}{\sqrt{1-m^2}}\arccos m\right],

    evaluated as :math:`N = (1 - e^2)(\operatorname{artanh} e - e)/e^3`
    (:math:`\operatorname{artanh} e = \operatorname{arcosh} m`) with
    :math:`e^2 = 1 - 1/m^2` (prolate; the oblate branch is its continuation to
    :math:`e^2 < 0`), and by the series
    :math:`N = (1 - e^2)\sum_{k\ge0} e^{2k}/(2k + 3)` where :math:`|e^2| < 0.02`.

    Parameters
    ----------
    length_over_diameter : float or array_like
        m, polar axis over equatorial diameter; any shape, m >= 0.

    Returns
    -------
    ndarray or float
        N, dimensionless, in [0, 1]: 1/3 for a sphere, 1 at m = 0 (a flat disc),
        0 at m = inf (explicit masks); NaN for NaN or negative m.

    Notes
    -----
    The closed form of [Osborn1945]_ (due to Maxwell and Stoner). For large m,
    :math:`N \approx (\ln 2m - 1)/m^2`. For reference and comparison only: a
    ferrite *rod* is a cylinder, whose factor is lower at high permeability and
    depends on χ (:func:`cylinder_demagnetising_factor`; docs/methods.md §9a,
    §9c). Relative error about 1e-15 (against mpmath).

    References
    ----------
    [Osborn1945]_

    Examples
    --------
    >>> round(float(spheroid_demagnetising_factor(10.0)), 8)  # docs/methods.md §9: 0.02028588
    0.02028588
    >>> float(spheroid_demagnetising_factor(1.0))
    0.3333333333333333
    """
    m = np.asarray(length_over_diameter, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        inverse = 1.0 / (m * m)  # 1 − e², kept apart from e² so long spheroids lose no digits
        e2 = 1.0 - inverse
        e = np.sqrt(np.abs(e2))
        prolate = inverse * (np.arccosh(np.maximum(m, 1.0)) - e) / e ** 3  # artanh e = arcosh m
        oblate = inverse * (e - np.arctan(e)) / e ** 3
        closed = np.where(e2 > 0, prolate, oblate)
        series = np.zeros_like(e2)
        for k in range(12, -1, -1):  # |e²| < 0.02: terms beyond e^24 are below 1e-20
            series = series * e2 + 1.0 / (2 * k + 3)
        N = np.where(np.abs(e2) < 0.02, inverse * series, closed)
    N = np.where(m == 0, 1.0, N)
    N = np.where(np.isposinf(m), 0.0, N)
    N = np.where(m >= 0, N, np.nan)
    return N[()]


# ---------------------------------------------------------------- the slice model


def _segment_energy(u):
    """G(u) = |u|(1 − K_L(1/|u|)) in units of d: length × the segment's magnetometric factor."""
    u = np.abs(u)
    with np.errstate(divide="ignore", invalid="ignore"):
        G = u * (1.0 - nagaoka_coefficient(1.0 / u))
    return np.where(u == 0, 0.0, G)


@functools.lru_cache(maxsize=256)
def _demag_column(length_over_diameter: float, slices: int) -> np.ndarray:
    """First column of D = E/t for a rod of l/d = γ cut into equal slices (symmetric Toeplitz)."""
    t = length_over_diameter / slices
    G = _segment_energy(np.arange(slices + 1) * t)
    column = np.empty(slices)
    column[0] = G[1]
    column[1:] = 0.5 * (G[2:] + G[:-2] - 2.0 * G[1:-1])
    column /= t
    column.flags.writeable = False
    return column


def _slice_count(length_over_diameter: float, finer: float = 0.0) -> int:
    """Even number of slices of the coarse mesh: 16 per diameter (and per `finer`), within the caps."""
    n = max(_MIN_SLICES, _SLICES_PER_DIAMETER * length_over_diameter, finer)
    n = int(min(np.ceil(n), _MAX_SLICES))
    return n + (n % 2)


def _solve(column, chi, rhs):
    """x with (I/χ + D) x = rhs, scaled as (I + χD) for χ <= 1 so χ = 0 stays exact; returns (x, scale)."""
    if chi <= 1.0:
        a, b = 1.0, chi  # (I + χD) H = rhs: H = M/χ, the internal field
    else:
        a, b = 1.0 / chi, 1.0  # (I/χ + D) M = rhs; χ = inf gives a = 0
    c = b * np.asarray(column)
    c[0] += a
    from scipy.linalg import solve_toeplitz  # imported here: scipy.linalg costs start-up time for every command

    return solve_toeplitz(c, rhs)


def _demag_factors(length_over_diameter: float, chi: float, slices: int) -> tuple[float, float]:
    """(N_f, N_m) of the slice model with a given even number of slices."""
    D = _demag_column(length_over_diameter, slices)
    x = _solve(D, chi, np.ones(slices))
    # D x without forming D: column sums for the rod average, one row pair for the midplane
    cumulative = np.concatenate(([0.0], np.cumsum(D[1:])))
    k = np.arange(slices)
    column_sums = D[0] + cumulative[k] + cumulative[slices - 1 - k]
    centre = slices // 2
    rows = D[np.abs(centre - 1 - k)] + D[np.abs(centre - k)]
    N_f = float(rows @ x / (x[centre - 1] + x[centre]))
    N_m = float(column_sums @ x / x.sum())
    return N_f, N_m


@functools.lru_cache(maxsize=4096)
def _demag_pair(length_over_diameter: float, chi: float) -> tuple[float, float]:
    """Richardson-extrapolated (N_f, N_m) from n and 2n slices."""
    n = _slice_count(length_over_diameter)
    coarse = _demag_factors(length_over_diameter, chi, n)
    fine = _demag_factors(length_over_diameter, chi, 2 * n)
    return tuple((4.0 * f - c) / 3.0 for f, c in zip(fine, coarse, strict=True))


def _check_kind(kind):
    if kind not in _KINDS:
        raise InvalidInputError("kind", "'fluxmetric' or 'magnetometric'", kind)
    return _KINDS.index(kind)


def _warn_short(gamma, chi, where):
    short = (gamma > 0) & (gamma < _SHORT_ROD) & (chi > 0)
    if np.any(short):
        msg = (f"{where}: the slice model assumes a magnetisation uniform over each cross-section, "
               f"poor for rods shorter than {_SHORT_ROD:g} diameters at χ > 0; "
               f"got l/d down to {np.min(gamma[short]):.3g}")
        warnings.warn(msg, OutsideValidityWarning, stacklevel=3)


def cylinder_demagnetising_factor(length_over_diameter, susceptibility,
                                  kind: Literal["fluxmetric", "magnetometric"] = "fluxmetric"):
    r"""Demagnetising factor of a finite cylinder magnetised along its axis, N(γ, χ) (slice model).

    .. math::

        \Bigl(\frac{1}{\chi} I + D(\gamma)\Bigr) M = \mathbf 1,\qquad
        N_f = \frac{\langle D M\rangle_\text{mid}}{\langle M\rangle_\text{mid}},\quad
        N_m = \frac{\langle D M\rangle}{\langle M\rangle},

    with D the slice-averaged demagnetising operator built from Nagaoka's
    coefficient (module docstring). Exact limits at χ = 0:

    .. math::

        N_m = 1 - K_L(d/l),\qquad
        N_f = 1 - \frac{\gamma\sqrt{\gamma^2 + 4}}{\pi}\bigl[K(m) - E(m)\bigr],
        \quad m = \frac{4}{\gamma^2 + 4}.

    Parameters
    ----------
    length_over_diameter : float or array_like
        γ = l/d, > 0.
    susceptibility : float or array_like
        χ = μ − 1 of the material, >= 0; ``inf`` allowed. Broadcasts against γ.
    kind : {"fluxmetric", "magnetometric"}
        ``"fluxmetric"`` (default): the field and magnetisation averaged over the
        midplane cross-section, the factor a short central coil sees.
        ``"magnetometric"``: averaged over the whole rod.

    Returns
    -------
    ndarray or float
        N, dimensionless. 0 at γ = inf and 1 at γ = 0 (masks); NaN where γ or χ
        is NaN or negative.

    Raises
    ------
    InvalidInputError
        For a ``kind`` other than the two names above.

    Warns
    -----
    OutsideValidityWarning
        For γ < 2 with χ > 0 (our threshold, not a published one).

    Notes
    -----
    *The model.* Axial magnetisation uniform over each cross-section, varying
    along the rod: the one-dimensional model of [Chen1991]_, which they used for
    γ >= 10 (and a two-dimensional model below). The fields are exact for that
    profile (averaged over slice volumes, via Nagaoka's coefficient, exact
    elliptic integrals), so the only modelling assumption is the uniformity
    over the cross-section. It is exact at χ = 0 for every γ; for χ > 0 its
    error grows as the rod gets shorter and is *not quantified here* below
    γ = 10. Bozorth and Chapin [BozorthChapin1942]_ charted apparent against
    true permeability of rods on the same kind of constant-μ calculation.

    *Numerics.* 16 slices per diameter (at least 64, at most 2048) and twice
    as many, Richardson-extrapolated; the discretisation error is below 1e-5
    relative for γ from 2 to 30 at any χ (checked against 64 slices per
    diameter). At χ = 0, N_m is exact to rounding (about 1e-12) and N_f, whose
    midplane is the average over the two central slices, to about 1e-7
    relative after extrapolation. Each new (γ, χ) costs
    about a millisecond at γ = 30; results are cached.

    *Checks.* At χ = 0 the exact values above (N_m: [Chen1991]_; the N_f
    closed form is derived here: the flux of the two end-face charge discs
    through the midplane, with ∫ M dz of Maxwell's coaxial circles from the
    derivative of the current-sheet inductance). The on-axis value
    1 − l/√(l² + d²) is *not* N_f: it is the field at the centre point only,
    above the cross-section average (0.293 against 0.232 at γ = 1), the two
    agreeing to O(1/γ²) relative for long rods. For χ > 0 it agrees with the
    tabulated 1-D computations of docs/methods.md §9 to about 1e-4 relative,
    and with the χ → ∞, γ = 10 value N_f ≈ 0.0172 recalled from
    [BozorthChapin1942]_ (from memory).

    References
    ----------
    [Chen1991]_, [BozorthChapin1942]_, [Nagaoka1909]_, [Osborn1945]_ (the
    ellipsoid, for comparison: :func:`spheroid_demagnetising_factor`).

    Examples
    --------
    >>> round(float(cylinder_demagnetising_factor(10.0, 0.0, "magnetometric")), 7)  # 1 − K_L(0.1)
    0.0411929
    >>> round(float(cylinder_demagnetising_factor(10.0, float("inf"))), 4)  # Bozorth (from memory)
    0.0172
    """
    which = _check_kind(kind)
    gamma, chi = np.broadcast_arrays(np.asarray(length_over_diameter, dtype=float),
                                     np.asarray(susceptibility, dtype=float))
    _warn_short(gamma, chi, "cylinder_demagnetising_factor")
    N = np.full(gamma.shape, np.nan)
    for index in np.ndindex(gamma.shape):
        g, x = float(gamma[index]), float(chi[index])
        if not (g >= 0 and x >= 0):
            continue
        if np.isinf(g):
            N[index] = 0.0
        elif g == 0:
            N[index] = 1.0
        else:
            N[index] = _demag_pair(g, x)[which]
    return N[()]


def rod_permeability(mu_initial, length_over_diameter,
                     kind: Literal["fluxmetric", "magnetometric"] = "fluxmetric"):
    r"""Apparent (rod) permeability of a cylinder of material permeability μi in a uniform field.

    .. math::

        \mu_\text{rod} = \frac{\mu_i}{1 + N(\gamma, \mu_i - 1)\,(\mu_i - 1)}

    Parameters
    ----------
    mu_initial : float or array_like
        μi, relative initial permeability of the material, >= 1.
    length_over_diameter : float or array_like
        γ = l/d, > 0. Broadcasts against ``mu_initial``.
    kind : {"fluxmetric", "magnetometric"}
        Which demagnetising factor (:func:`cylinder_demagnetising_factor`):
        fluxmetric (default) for the flux through the midplane, what a short
        central winding sees; magnetometric for the rod's mean magnetisation.

    Returns
    -------
    ndarray or float
        μ_rod, in [1, μi]: 1 at μi = 1, μi for an infinitely long rod, and
        1/N for μi → inf. NaN where μi < 1 or an input is NaN.

    Notes
    -----
    The relation is the definition of the demagnetising factor (docs/methods.md
    §9a); N is the cylinder's, which depends on μi (§9c). Using the
    ellipsoid's N instead makes μ_rod about 15 % low at γ = 10, μi = 2000. This
    is the permeability of the rod in a *uniform* applied field; the inductance
    of a coil wound on the rod is not μ_rod times its air value
    (:func:`rod_coil_inductance`). Accuracy as for the demagnetising factor;
    real rods add the spread of μi (often ±20 % or more) and its fall with
    frequency and temperature [Snelling1988]_.

    Examples
    --------
    >>> round(float(rod_permeability(2000.0, 10.0)), 1)  # docs/methods.md §9: 56.8
    56.8
    >>> float(rod_permeability(1.0, 10.0))
    1.0
    """
    mu, gamma = np.broadcast_arrays(np.asarray(mu_initial, dtype=float),
                                    np.asarray(length_over_diameter, dtype=float))
    chi = mu - 1.0
    with np.errstate(invalid="ignore"):
        N = cylinder_demagnetising_factor(gamma, np.where(chi >= 0, chi, np.nan), kind)
        result = mu / (1.0 + N * chi)
        result = np.where(np.isposinf(mu), 1.0 / N, result)
    return np.asarray(result)[()]


# ---------------------------------------------------------------- coil on a rod


def _pair_integral(separations, radius_a, radius_b):
    r"""F(u) = ∫₀^|u| (|u| − v) M(a, b, v) dv of Maxwell's coaxial-circle mutual inductance, H·m².

    The double integral of M over two axial intervals is F(b1 − a2) + F(a1 − b2) − F(b1 − b2) − F(a1 − a2).
    Composite 16-point Gauss-Legendre on panels that at most double in length (a geometric grid from
    1e-7 (a + b) up, refined at every requested u), the first panel with v = h s² against the log
    singularity of M at v = 0 when a = b. Computed as u F1(u) − F2(u), F1 = ∫ M, F2 = ∫ v M.
    """
    u = np.abs(np.asarray(separations, dtype=float))
    top = float(np.max(u, initial=0.0))
    if top == 0.0:
        return np.zeros_like(u)
    start = 1e-7 * (radius_a + radius_b)
    grid = start * 2.0 ** np.arange(int(np.ceil(np.log2(max(top / start, 1.0)))) + 1)
    edges = np.unique(np.concatenate(([0.0], grid[grid < top], u[u > 0])))
    lo, hi = edges[:-1], edges[1:]
    s = 0.5 * (_GAUSS_NODES + 1.0)  # nodes on [0, 1]
    w = 0.5 * _GAUSS_WEIGHTS
    v = lo[:, None] + (hi - lo)[:, None] * s[None, :]
    jac = np.broadcast_to((hi - lo)[:, None], v.shape).copy()
    v[0] = hi[0] * s * s  # first panel: v = h s², dv = 2 h s ds
    jac[0] = 2.0 * hi[0] * s
    m = coaxial_mutual_inductance(radius_a, radius_b, v)
    f1 = np.concatenate(([0.0], np.cumsum((m * jac) @ w)))
    f2 = np.concatenate(([0.0], np.cumsum((m * v * jac) @ w)))
    where = np.searchsorted(edges, u)
    return u * f1[where] - f2[where]


def _core_inductance(turns, gamma, chi, coil_span, coil_radius, slices):
    """ΔL/d of the rod's magnetisation (lengths in units of d), for a rod mesh of `slices` equal slices."""
    z = np.linspace(-gamma / 2.0, gamma / 2.0, slices + 1)
    lo, hi = coil_span
    F = _pair_integral(np.concatenate((z - lo, z - hi)), coil_radius, 0.5)
    F_lo, F_hi = F[:slices + 1], F[slices + 1:]
    # Q_j = ∫_slice ∫_coil M dz dz' (flux of the coil through slice j, integrated over its length)
    q = F_lo[1:] + F_hi[:-1] - F_hi[1:] - F_lo[:-1]
    # the Toeplitz system (t I/χ + E) x = q, with E = t D; ΔL = n² q·x / (μ0 A)
    t = gamma / slices
    x = _solve(_demag_column(gamma, slices), chi, q / t)
    scale = chi if chi <= 1.0 else 1.0  # _solve returned H = M/χ for χ <= 1
    area = np.pi / 4.0
    density = turns / (hi - lo)
    return density ** 2 * scale * float(q @ x) / (mu_0 * area)


def rod_coil_inductance(turns, rod_length, rod_diameter, mu_initial, coil_length, coil_diameter,
                        position=0.0):
    r"""Low-frequency inductance of a single-layer coil on a ferrite rod (our slice model, rough).

    .. math::

        L = L_s(D, c, N) + \Delta L,\qquad
        \Delta L = \frac{n^2}{\mu_0 A}\; q^{\mathsf T}
                   \Bigl(\frac{t}{\chi} I + E\Bigr)^{-1} q,\qquad
        q_j = \int_{\text{slice } j}\!\int_{\text{coil}} M\!\left(\tfrac D2, \tfrac d2, z - z'\right) dz\,dz',

    with :math:`L_s` the air-core current sheet (Lorenz/Nagaoka,
    :func:`~coilplan.physics.solenoid.current_sheet_inductance`), n = N/c the
    turns per metre, A = πd²/4, t the slice thickness, E the slice model's
    demagnetising matrix (module docstring) and M Maxwell's mutual inductance
    of coaxial circles (:func:`~coilplan.physics.loops.coaxial_mutual_inductance`).

    Parameters
    ----------
    turns : float or array_like
        N.
    rod_length, rod_diameter : float or array_like
        l and d of the rod, m.
    mu_initial : float or array_like
        μi of the rod material, >= 1 (1 gives the air coil).
    coil_length : float or array_like
        c, current-sheet length of the winding (N·pitch), m; may exceed the rod.
    coil_diameter : float or array_like
        D, winding diameter to the wire centres, m, >= ``rod_diameter``; a larger
        former adds the air space between it and the rod.
    position : float or array_like, optional
        Offset of the coil centre from the rod centre, m (sign ignored; the coil
        may overhang or leave the rod).

    All arguments broadcast against each other.

    Returns
    -------
    ndarray or float
        L in henry. NaN where an input is NaN, a length or diameter is not
        positive, μi < 1 or the coil diameter is smaller than the rod.

    Warns
    -----
    OutsideValidityWarning
        For rods shorter than 2 diameters (see :func:`cylinder_demagnetising_factor`).

    Notes
    -----
    *Physics.* The coil's own field, averaged over the rod's cross-section
    slice by slice (q/(μ0 A t) per ampere-turn density), drives the rod's
    magnetisation in the same slice model that gives
    :func:`cylinder_demagnetising_factor`; the magnetisation is a surface
    current on the rod whose flux linkage with the winding, by reciprocity
    the same q, is ΔL. The coil's length, diameter and position on the rod
    enter only through q. Limits (tests/physics/test_rod.py): ΔL = 0 at
    μi = 1 (the air coil, exactly); a rod centred in a coil much longer than
    itself adds μ0 n² A l χ/(1 + N_m χ), the rod's mean magnetisation in a
    uniform field (to 1e-6 for a coil 100 rods long); a long tight coil on a
    longer rod approaches L_s + (μi − 1) μ0 n² A c, its relative deficit
    falling as 1/c (5 % at c = 20 d, μi = 4). The inductance of a *short*
    coil is not μ_rod times its air value (docs/methods.md §9a, §14).

    *How rough.* The model is ours and not validated against measurements.
    It is a current sheet (no wire-size or pitch corrections, which are small
    next to the rest), the rod material is linear and lossless with one μi,
    and the magnetisation is uniform over each cross-section. The largest
    uncertainties are outside the model: the initial permeability of a rod
    material is rarely known better than ±20-30 %, it falls with frequency
    and temperature, and a salvaged rod's material is usually unknown.
    Expect tens of percent until the model is calibrated by one measured
    inductance; then scale by the measured ratio. Empirical coil-length and
    position factors for aerial rods [Snelling1988]_ were not used: their
    values were not available to check.

    *Numerics.* 16 slices per rod diameter (at least 64, at most 2048, and at
    least 8 per coil length) and twice as many, Richardson-extrapolated;
    discretisation error about 2e-5 relative (a coil of 0.1 l on a rod of
    l/d = 30, against 4 times finer slices). About 10 ms per evaluation there.

    References
    ----------
    [Chen1991]_ (the one-dimensional model), [Nagaoka1909]_, [Maxwell1873]_,
    [Snelling1988]_ (aerial rods, for the behaviour only).

    Examples
    --------
    A 40-turn winding 20 mm long on a 13 mm former, centred on a rod 10 mm
    across and 100 mm long of NiZn ferrite with μi = 125 (an invented example):

    >>> L = rod_coil_inductance(40, 0.1, 0.01, 125.0, 0.02, 0.013)
    >>> print(f"{L * 1e6:.1f} µH")
    114.5 µH
    >>> air = rod_coil_inductance(40, 0.1, 0.01, 1.0, 0.02, 0.013)
    >>> print(f"{air * 1e6:.2f} µH")
    10.33 µH
    """
    arrays = np.broadcast_arrays(*(np.asarray(value, dtype=float) for value in
                                   (turns, rod_length, rod_diameter, mu_initial, coil_length,
                                    coil_diameter, position)))
    shape = arrays[0].shape
    with np.errstate(divide="ignore", invalid="ignore"):
        _warn_short(arrays[1] / arrays[2], arrays[3] - 1.0, "rod_coil_inductance")
    L = np.full(shape, np.nan)
    for index in np.ndindex(shape):
        n_, l_, d_, mu_, c_, D_, p_ = (float(a[index]) for a in arrays)
        valid = (l_ > 0 and d_ > 0 and c_ > 0 and d_ <= D_ and mu_ >= 1 and _usable_turns(n_)
                 and np.isfinite(l_ + d_ + c_ + D_ + p_))
        if not valid:
            continue
        air = float(current_sheet_inductance(D_, c_, n_))
        chi = mu_ - 1.0
        if chi == 0.0 or n_ == 0.0:
            L[index] = air
            continue
        gamma = l_ / d_
        span = ((abs(p_) - c_ / 2.0) / d_, (abs(p_) + c_ / 2.0) / d_)
        slices = _slice_count(gamma, finer=8.0 * l_ / c_)
        coarse = _core_inductance(n_, gamma, chi, span, D_ / (2.0 * d_), slices)
        fine = _core_inductance(n_, gamma, chi, span, D_ / (2.0 * d_), 2 * slices)
        L[index] = air + d_ * (4.0 * fine - coarse) / 3.0
    return L[()]


def _usable_turns(turns: float) -> bool:
    """A usable turn count: finite and not negative."""
    return bool(np.isfinite(turns) and turns >= 0)
