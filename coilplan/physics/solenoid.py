r"""Single-layer solenoids: Nagaoka's current-sheet coefficient and Rosa's round-wire corrections.

=============  ==================  ===========================================
symbol         parameter           meaning
=============  ==================  ===========================================
D              ``diameter``        coil diameter to the wire centres, m
l              ``length``          current-sheet length, l = N·p, m
p              ``pitch``           axial distance between turn centres, m
d              ``wire_diameter``   bare conductor diameter, m
N              ``turns``           number of turns
x              ``ratio``           D/l, dimensionless
K_L            (returned)          Nagaoka's coefficient, 0 < K_L <= 1
=============  ==================  ===========================================

The current sheet: :math:`L_s = \mu_0 \pi (D/2)^2 N^2 K_L(D/l) / l`. A real
winding of round wire differs from the sheet; Rosa's corrections turn the
sheet value into the inductance of the helix of round wire:
:math:`L = L_s - \mu_0 (D/2) N (k_s + k_m)`.

All functions are pure, take SI floats or arrays and broadcast over every
argument. They are NaN-transparent; singular limits are handled by explicit
masks and documented.

References
----------
.. [Nagaoka1909] H. Nagaoka, "The inductance coefficients of solenoids",
   J. College of Science, Imperial University Tokyo, vol. 27, art. 6, 1909.
.. [RosaGrover1912] E. B. Rosa and F. W. Grover, "Formulas and tables for the
   calculation of mutual and self-inductance", Bulletin of the Bureau of
   Standards, vol. 8, no. 1, 1912 (Nagaoka's tables; Rosa's corrections A, B).
.. [Rosa1906] E. B. Rosa, "The self and mutual inductances of linear
   conductors" and "On the geometrical mean distances of rectangular areas and
   the calculation of self-inductance", Bull. Bureau of Standards, vol. 3, 1907.
.. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas and
   Tables*, Van Nostrand, 1946 (Table 36, Nagaoka's K; Tables 38-39, Rosa's
   G and H, written ks and km here).
.. [Knight2016] D. W. Knight, "Rosa's round-wire corrections" and "The
   self-resonance and self-capacitance of solenoid coils", g3ynh.info, 2010-2016
   (SI notation used here).
.. [Wheeler1928] H. A. Wheeler, "Simple inductance formulas for radio coils",
   Proc. IRE, vol. 16, no. 10, pp. 1398-1400, 1928.
.. [Wheeler1982] H. A. Wheeler, "Inductance formulas for circular and square
   coils", Proc. IEEE, vol. 70, no. 12, pp. 1449-1450, 1982.
.. [Lundin1985] R. Lundin, "A handbook formula for the inductance of a
   single-layer circular coil", Proc. IEEE, vol. 73, no. 9, pp. 1428-1429, 1985.
.. [DLMF] NIST Digital Library of Mathematical Functions, §19.25(i), eq. 19.25.1
   (Legendre's integrals in Carlson's symmetric forms).
"""

from __future__ import annotations

import functools
import warnings

import numpy as np
from scipy.constants import mu_0
from scipy.special import digamma, ellipe, ellipkm1, zeta

from coilplan.errors import OutsideValidityWarning

__all__ = [
    "current_sheet_inductance",
    "lundin_coefficient",
    "nagaoka_coefficient",
    "rosa_km",
    "rosa_ks",
    "solenoid_inductance",
    "wheeler_1928_coefficient",
    "wheeler_1982_coefficient",
]

# 1 µH·(1/inch) expressed as a Nagaoka-type coefficient: Wheeler's 1928 formula
# in µH and inches, L = r²N²/(9r + 10l), equals µ0·π·r²·N²·K/l with
# K = c/(9r/l + 10), c = 1e-6 / (µ0 · π · 0.0254 m).
_WHEELER_1928_SCALE = 1e-6 / (mu_0 * np.pi * 0.0254)


def nagaoka_coefficient(ratio):
    r"""Nagaoka's coefficient K_L of a uniform current sheet, exact.

    .. math::

        k^2 = \frac{D^2}{D^2 + l^2}, \quad k'^2 = 1 - k^2, \quad
        K_L = \frac{4}{3\pi k'}\left[\frac{k'^2}{k^2}\bigl(K(k^2) - E(k^2)\bigr)
              + E(k^2) - k\right]

    Parameters
    ----------
    ratio : float or array_like
        Diameter over length, D/l (diameter to the wire centres, length of the
        current sheet). Any shape; 0 (infinitely long) and +inf (zero length)
        are allowed.

    Returns
    -------
    ndarray or float
        K_L, dimensionless, in (0, 1]: 1 at ``ratio == 0``, 0 at ``ratio == inf``
        (explicit masks), NaN where ``ratio`` is NaN or negative.

    Notes
    -----
    Lorenz's formula in Nagaoka's form [Nagaoka1909]_, valid for every D/l > 0.
    K and E take the **parameter** m = k² (scipy's and mpmath's convention).
    Both cancellations are avoided: K comes from the complementary parameter
    k'² = 1/(1 + x²) (``scipy.special.ellipkm1``), which is exact to rounding
    for short coils, E from ``scipy.special.ellipe``, and for long coils
    (m < 0.1) K − E from its power series [DLMF]_ 19.5.1-2,

    .. math::

        K - E = \frac{\pi}{2}\sum_{n\ge1}\binom{2n}{n}^2 16^{-n}\,\frac{2n}{2n-1}\,m^n,

    so (k'²/k²)(K − E) = (K − E)/x² never divides a difference by a small
    k². Relative error below 1e-14 for D/l up to 10 (against mpmath), then
    growing with the cancellation in E − k as about 1e-16·(D/l)², to 5e-14 at
    D/l = 26. Shorter coils take the short-coil expansion [RosaGrover1912]_
    (formula for a short solenoid, in powers of l/D), with y = ln 4x:

    .. math::

        K_L = \frac{2}{\pi x}\Bigl[y - \tfrac12 + \frac{y + \frac14}{8x^2}
              - \frac{y - \frac23}{64x^4} + \frac{5\,(y - \frac{109}{120})}{1024x^6}\Bigr],

    whose truncation error is below 1e-14 there and 2e-19 from D/l = 100 (against mpmath), so K_L stays
    exact to rounding for a coil of any shortness.

    References
    ----------
    [Nagaoka1909]_, [RosaGrover1912]_, [Grover1946]_ Table 36, [DLMF]_.

    Examples
    --------
    >>> round(float(nagaoka_coefficient(1.0)), 6)  # Grover Table 36: 0.688423
    0.688423
    >>> float(nagaoka_coefficient(0.0))
    1.0
    """
    x = np.asarray(ratio, dtype=float)
    flat = x.ravel()
    coefficient = np.empty_like(flat)
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        # blocks that stay in cache: the elementwise work then costs less than the
        # two special-function calls it is built on (tests/benchmarks/README.md)
        for start in range(0, flat.size, _BLOCK):
            coefficient[start:start + _BLOCK] = _nagaoka_kernel(flat[start:start + _BLOCK])
        short = (flat > _SHORT_COIL_RATIO) & np.isfinite(flat)
        if short.any():
            coefficient[short] = _short_coil_series(flat[short])
        coefficient[flat == 0] = 1.0  # infinitely long coil
        coefficient[np.isposinf(flat)] = 0.0  # zero length
        coefficient[~(flat >= 0)] = np.nan  # negative or NaN
    coefficient = coefficient.reshape(x.shape)
    return coefficient[()] if coefficient.ndim == 0 else coefficient


_BLOCK = 32768

#: D/l above which the short-coil expansion replaces the closed form (where its truncation error
#: falls below the closed form's cancellation, about 1e-14; against mpmath).
_SHORT_COIL_RATIO = 26.0


def _short_coil_series(x: np.ndarray) -> np.ndarray:
    """K_L for D/l = x > 26 from the short-solenoid expansion (docstring of nagaoka_coefficient)."""
    y = np.log(4.0 * x)
    inverse2 = 1.0 / (x * x)
    bracket = (y - 0.5) + inverse2 * ((y + 0.25) / 8.0
                                      - inverse2 * ((y - 2.0 / 3.0) / 64.0
                                                    - inverse2 * 5.0 * (y - 109.0 / 120.0) / 1024.0))
    return 2.0 / (np.pi * x) * bracket


def _nagaoka_kernel(x: np.ndarray) -> np.ndarray:
    """K_L for a 1-D block of D/l values > 0 (in place, few temporaries)."""
    x2 = x * x
    one_plus = x2 + 1.0
    kp2 = 1.0 / one_plus  # k'^2 = 1/(1 + x^2), exact to rounding
    root = np.sqrt(one_plus)  # 1/k'
    m = x2 * kp2  # k^2
    e = ellipe(m)
    result = ellipkm1(kp2)  # K from the complementary parameter
    result -= e
    small = m < 0.1
    if small.any():  # long coils: K - E from its series, without cancellation
        result[small] = _k_minus_e_series(m[small])
    result /= x2  # (k'^2/k^2)(K - E) = (K - E)/x^2
    result += e
    result -= x / root  # ... + E - k
    result *= root  # ... / k'
    result *= 4.0 / (3.0 * np.pi)
    return result


def _series_coefficients(terms: int = 18) -> np.ndarray:
    """Coefficients of K(m) − E(m) = Σ c_n m^n, n = 1 .. terms (DLMF 19.5.1, 19.5.2)."""
    n = np.arange(1, terms + 1, dtype=float)
    central = np.cumprod((2 * n - 1) / (2 * n))  # binom(2n, n) / 4^n
    return np.pi / 2 * central ** 2 * (2 * n) / (2 * n - 1)


_K_MINUS_E = _series_coefficients()


def _k_minus_e_series(m):
    """K(m) − E(m) for 0 <= m < 0.1 by Horner's rule; truncation error below 1e-17 there."""
    total = np.zeros_like(m)
    for coefficient in _K_MINUS_E[::-1]:
        total = (total + coefficient) * m
    return total


def wheeler_1928_coefficient(ratio):
    r"""Wheeler's 1928 single-layer formula, as a Nagaoka-type coefficient (approximation).

    .. math::

        L[\mu H] = \frac{r^2 N^2}{9 r + 10 l} \;(r, l \text{ in inches})
        \quad\Longleftrightarrow\quad
        K \approx \frac{10^{-6}/(\mu_0 \pi \cdot 0.0254)}{4.5\,D/l + 10}

    Parameters
    ----------
    ratio : float or array_like
        D/l, diameter to wire centres over current-sheet length.

    Returns
    -------
    ndarray or float
        Approximate K_L.

    Warns
    -----
    OutsideValidityWarning
        Where l < 0.8 r (D/l > 2.5), outside the range of the published claim.

    Notes
    -----
    Approximation. Claimed accuracy about 1 % for l > 0.8 r [Wheeler1928]_
    (claim recalled, quoted on secondary pages). Against the exact K_L the
    worst error for l ≥ 0.8 r is −0.59 % (near l/r = 7); the formula is biased
    −0.28 % even for very long coils, because the exact long-coil constant in
    its units is 4π²·0.0254 = 1.0028, not 1. At l = 0.2 r it is 11 % low.

    Examples
    --------
    >>> round(float(wheeler_1928_coefficient(1.0)), 4)
    0.6878
    """
    x = np.asarray(ratio, dtype=float)
    if np.any(x > 2.5):
        warnings.warn("Wheeler's 1928 formula is used outside its stated range "
                      "(coil length below 0.8 × radius); expect errors of several percent",
                      OutsideValidityWarning, stacklevel=2)
    result = _WHEELER_1928_SCALE / (4.5 * x + 10.0)
    return result[()] if result.ndim == 0 else result


def wheeler_1982_coefficient(ratio):
    r"""Wheeler's 1982 "continuous" single-layer formula, as a coefficient (approximation).

    .. math::

        L = \mu_0 N^2 \frac{D}{2}\left[\ln\!\left(1 + \frac{\pi D}{2 l}\right)
            + \frac{1}{2.3004 + 3.437\,l/D + 1.7636\,(l/D)^2
            - 0.47/(0.755 + D/l)^{1.44}}\right]

    so that :math:`K = \frac{2 l}{\pi D}[\ldots]`.

    Parameters
    ----------
    ratio : float or array_like
        D/l; must be > 0 (the long-coil limit D/l → 0 returns 1 by mask).

    Returns
    -------
    ndarray or float
        Approximate K_L.

    Notes
    -----
    Approximation for all shapes [Wheeler1982]_. The coefficients are recalled
    (from memory); against the exact K_L the largest deviation over
    l/D = 5e-4 to 500 is 2.2e-5 (computed here), which is what confirms them.
    The accuracy Wheeler claimed was not found in a stored source.

    Examples
    --------
    >>> round(float(wheeler_1982_coefficient(1.0)), 5)
    0.68841
    """
    x = np.asarray(ratio, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        lod = 1.0 / x
        bracket = (np.log1p(np.pi * x / 2.0)
                   + 1.0 / (2.3004 + 3.437 * lod + 1.7636 * lod * lod
                            - 0.47 / (0.755 + x) ** 1.44))
        result = 2.0 * lod / np.pi * bracket
        result = np.where(x == 0, 1.0, result)
    return result[()] if result.ndim == 0 else result


def lundin_coefficient(ratio):
    r"""Lundin's 1985 handbook formula for K_L (approximation, about 3 ppm).

    .. math::

        f_1(y) = \frac{1 + 0.383901\,y + 0.017108\,y^2}{1 + 0.258952\,y},\quad
        f_2(y) = 0.093842\,y + 0.002029\,y^2 - 0.000801\,y^3

        D \le l:\; K_L = f_1(D^2/l^2) - \frac{4 D}{3\pi l},\qquad
        D \ge l:\; K_L = \frac{2 l}{\pi D}\left\{\left[\ln\frac{4D}{l}
            - \frac12\right] f_1(l^2/D^2) + f_2(l^2/D^2)\right\}

    Parameters
    ----------
    ratio : float or array_like
        D/l, > 0.

    Returns
    -------
    ndarray or float
        Approximate K_L.

    Notes
    -----
    Approximation [Lundin1985]_; coefficients and the ~3 ppm claim recalled
    (from memory). Against the exact K_L the largest error over D/l = 1e-3 to
    1e3 is 2.5 ppm (near D/l = 0.67), computed here. The branches meet at D = l.

    Examples
    --------
    >>> round(float(lundin_coefficient(2.0)), 5)  # Grover Table 36: 0.525510
    0.52551
    """
    x = np.asarray(ratio, dtype=float)

    def f1(y):
        return (1.0 + 0.383901 * y + 0.017108 * y * y) / (1.0 + 0.258952 * y)

    def f2(y):
        return 0.093842 * y + 0.002029 * y * y - 0.000801 * y ** 3

    with np.errstate(divide="ignore", invalid="ignore"):
        long_branch = f1(x * x) - 4.0 * x / (3.0 * np.pi)
        y = 1.0 / (x * x)
        short_branch = (2.0 / (np.pi * x)) * ((np.log(4.0 * x) - 0.5) * f1(y) + f2(y))
        result = np.where(x <= 1.0, long_branch, short_branch)
    return result[()] if result.ndim == 0 else result


def current_sheet_inductance(diameter, length, turns, coefficient=None):
    r"""Inductance of a uniform current sheet (Lorenz/Nagaoka).

    .. math::

        L_s = \frac{\mu_0 \pi (D/2)^2 N^2}{l} K_L(D/l)

    Parameters
    ----------
    diameter : float or array_like
        D, diameter to the wire centres, m.
    length : float or array_like
        l, current-sheet length, m (N·p for a helix of pitch p).
    turns : float or array_like
        N.
    coefficient : callable, optional
        The K_L function of D/l; default the exact :func:`nagaoka_coefficient`.

    Returns
    -------
    ndarray or float
        L_s in henry.

    Examples
    --------
    >>> round(float(current_sheet_inductance(0.05, 0.05, 25)) * 1e6, 6)  # docs/methods.md §3
    21.232684
    """
    diameter = np.asarray(diameter, dtype=float)
    length = np.asarray(length, dtype=float)
    turns = np.asarray(turns, dtype=float)
    k_function = nagaoka_coefficient if coefficient is None else coefficient
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = diameter / length
    result = mu_0 * np.pi * (diameter / 2.0) ** 2 * turns ** 2 / length * k_function(ratio)
    return result[()] if np.ndim(result) == 0 else result


def rosa_ks(pitch, wire_diameter):
    r"""Rosa's self-inductance correction ks (Grover's G) for round wire.

    .. math::

        k_s = \frac54 - \ln\frac{2 p}{d}

    Parameters
    ----------
    pitch : float or array_like
        p, axial distance between turn centres, m.
    wire_diameter : float or array_like
        d, bare conductor diameter, m.

    Returns
    -------
    ndarray or float
        ks, dimensionless: 0.5569 close wound (p = d), zero at p/d = 1.745,
        negative above (widely spaced turns exceed the sheet value).

    Notes
    -----
    The difference between a round wire's self-inductance and that of a strip
    of width p carrying the same current, per turn [Rosa1906]_, [Knight2016]_.
    Accurate to a few parts in 10,000 overall with :func:`rosa_km`
    (Knight's statement for the NBS method).

    Examples
    --------
    >>> round(float(rosa_ks(1.0, 1.0)), 6)
    0.556853
    """
    pitch = np.asarray(pitch, dtype=float)
    wire_diameter = np.asarray(wire_diameter, dtype=float)
    result = 1.25 - np.log(2.0 * pitch / wire_diameter)
    return result[()] if result.ndim == 0 else result


def _epsilon(k):
    """Mutual-inductance difference term ε_k of two turns k pitches apart (k >= 1 integer).

    ε_k = ln k − [(k+1)² ln(k+1) + (k−1)² ln(k−1) − 2k² ln k]/2 + 3/2 (GMD of strips),
    evaluated by its series Σ_{m=4,6,…} 2 k^{2−m}/(m(m−1)(m−2)) for k >= 8, where the
    closed form loses digits to cancellation (series derived here from the closed form).
    """
    k = np.asarray(k, dtype=float)
    closed = (np.log(k) - 0.5 * ((k + 1) ** 2 * np.log(k + 1)
                                 + np.where(k > 1, (k - 1) ** 2 * np.log(np.maximum(k - 1, 1.0)), 0.0)
                                 - 2 * k * k * np.log(k)) + 1.5)
    inverse_square = 1.0 / (k * k)
    series = np.zeros_like(k)
    power = np.ones_like(k)
    for m in range(4, 26, 2):
        power = power * inverse_square
        series = series + 2.0 * power / (m * (m - 1) * (m - 2))
    return np.where(k >= 8, series, closed)


@functools.lru_cache(maxsize=8)
def _km_table(size: int) -> np.ndarray:
    """km for integer turn counts 0 .. size (km(0) = km(1) = 0)."""
    n = np.arange(1, size + 1, dtype=float)  # n = 1 .. size
    k = np.arange(1, size, dtype=float)  # k = 1 .. size-1
    eps = _epsilon(k)
    s0 = np.concatenate(([0.0], np.cumsum(eps)))  # s0[j] = sum_{k=1}^{j} eps_k
    s1 = np.concatenate(([0.0], np.cumsum(k * eps)))
    # km(n) = (2/n) * sum_{k=1}^{n-1} (n-k) eps_k = 2*s0[n-1] - 2*s1[n-1]/n
    km = 2.0 * s0 - 2.0 * s1 / n
    table = np.concatenate(([0.0], km))
    table.setflags(write=False)
    return table


#: Largest whole N whose km comes from the table of exact sums; above it, the sums' tails are
#: evaluated in closed form (:func:`_km_beyond_table`), so km costs the same at any N.
_KM_TABLE_SIZE = 1 << 16

#: ε_k = Σ_j c_j k^(-j), j = 2, 4, ..., 22 (the series of :func:`_epsilon`, m = j + 2).
_EPSILON_SERIES = tuple((j, 2.0 / ((j + 2) * (j + 1) * j)) for j in range(2, 24, 2))


@functools.lru_cache(maxsize=1)
def _km_base_sums() -> tuple[float, float]:
    """Σ ε_k and Σ k·ε_k for k = 1 .. _KM_TABLE_SIZE, summed term by term."""
    k = np.arange(1, _KM_TABLE_SIZE + 1, dtype=float)
    eps = _epsilon(k)
    return float(np.sum(eps)), float(np.sum(k * eps))


def _km_beyond_table(n: np.ndarray) -> np.ndarray:
    r"""km at whole N > _KM_TABLE_SIZE: the exact sums up to the table's end, then their tails in closed form.

    With K = _KM_TABLE_SIZE and ε_k = Σ_j c_j k^{-j} (exact for k >= 8 to the 22nd power, a truncation
    below 1e-100 here), the tails are Hurwitz zeta differences, ζ(s, a) = Σ_{i>=0} (i + a)^{-s}:

    .. math::

        \sum_{k=K+1}^{N-1} k^{-s} = \zeta(s, K+1) - \zeta(s, N), \qquad
        \sum_{k=K+1}^{N-1} k^{-1} = \psi(N) - \psi(K+1)

    (ψ the digamma function, DLMF 5.7.6 and 25.11.1), so km = 2 S0 − 2 S1/N costs O(1) at any N.
    """
    base = float(_KM_TABLE_SIZE + 1)
    s0, s1 = _km_base_sums()
    s0 = np.full(n.shape, s0)
    s1 = np.full(n.shape, s1)
    for power, coefficient in _EPSILON_SERIES:
        s0 = s0 + coefficient * (zeta(power, base) - zeta(power, n))
        if power == 2:  # k·k^-2 = 1/k: the harmonic tail
            s1 = s1 + coefficient * (digamma(n) - digamma(base))
        else:
            s1 = s1 + coefficient * (zeta(power - 1, base) - zeta(power - 1, n))
    return 2.0 * s0 - 2.0 * s1 / n


def rosa_km(turns):
    r"""Rosa's mutual-inductance correction km (Grover's H), by its exact sum.

    .. math::

        k_m = \frac{2}{N}\sum_{k=1}^{N-1}(N-k)\,\varepsilon_k,\quad
        \varepsilon_k = \ln k - \tfrac12\bigl[(k+1)^2\ln(k+1) + (k-1)^2\ln(k-1)
                         - 2k^2\ln k\bigr] + \tfrac32

    Parameters
    ----------
    turns : float or array_like
        N >= 1. Non-integer N (used by root finding) is interpolated linearly
        between the neighbouring whole numbers, so km is continuous in N and
        exact at every whole number.

    Returns
    -------
    ndarray or float
        km, dimensionless: 0 at N = 1, 0.1137 at N = 2, rising to
        ln(2π) − 3/2 = 0.33788 as N → ∞. N < 1 returns 0 (mask); NaN stays NaN.
        Beyond 65,536 turns the sums' tails are taken in closed form (Hurwitz zeta and
        digamma), so a million turns cost no more than ten.

    Notes
    -----
    ε_k is the difference between the mutual inductance of two filaments k
    pitches apart and that of two current strips of width p (their geometric
    mean distances) [Rosa1906]_, [Grover1946]_ Table 39, [Knight2016]_. The sum
    is evaluated for all N at once from cumulative sums of ε_k and k·ε_k.

    Examples
    --------
    >>> [round(float(v), 4) for v in rosa_km([2, 10, 100])]  # Grover: 0.1137, 0.2664, 0.3269
    [0.1137, 0.2664, 0.3269]
    """
    n = np.asarray(turns, dtype=float)
    finite = np.isfinite(n)
    n_safe = np.where(finite, np.clip(n, 1.0, None), 1.0)
    low = np.floor(n_safe)
    fraction = n_safe - low
    largest = float(low.max()) + 1.0 if low.size else 2.0
    size = max(2, 1 << max(int(min(largest, _KM_TABLE_SIZE)) - 1, 1).bit_length())  # a power of two, cached
    table = _km_table(size)

    def exact_at(whole):
        in_table = whole <= size
        values = table[np.where(in_table, whole, 0).astype(np.intp)]
        if not in_table.all():
            values = np.where(in_table, values, _km_beyond_table(np.maximum(whole, size + 1.0)))
        return values

    result = exact_at(low) * (1.0 - fraction) + exact_at(low + 1.0) * fraction
    result = np.where(finite, result, np.nan)
    return result[()] if result.ndim == 0 else result


def solenoid_inductance(diameter, pitch, wire_diameter, turns):
    r"""Low-frequency inductance of a single-layer round-wire solenoid (Nagaoka with Rosa).

    .. math::

        L = \frac{\mu_0 \pi (D/2)^2 N^2}{N p} K_L\!\left(\frac{D}{N p}\right)
            - \mu_0 \frac{D}{2} N (k_s + k_m)

    Parameters
    ----------
    diameter : float or array_like
        D, coil diameter to the wire centres, m.
    pitch : float or array_like
        p, distance between turn centres, m (at least the overall wire diameter).
    wire_diameter : float or array_like
        d, bare conductor diameter, m.
    turns : float or array_like
        N >= 1.

    Returns
    -------
    ndarray or float
        L in henry.

    Notes
    -----
    The current-sheet length is N·p (each turn owns one pitch), not the
    physical winding length (N − 1)p + d [Knight2016]_. The correction scale is
    µ0 × **radius** × N. Accuracy: a few parts in 10,000 for uniform helical
    windings of round wire (the NBS method), low frequency (uniform current
    in the wire); helix pitch angle and the leads are ignored.

    Examples
    --------
    >>> round(float(solenoid_inductance(0.05, 0.002, 0.001, 25)) * 1e6, 4)  # docs/methods.md §3
    21.1016
    """
    diameter = np.asarray(diameter, dtype=float)
    pitch = np.asarray(pitch, dtype=float)
    turns = np.asarray(turns, dtype=float)
    sheet = current_sheet_inductance(diameter, turns * pitch, turns)
    correction = mu_0 * diameter / 2.0 * turns * (rosa_ks(pitch, wire_diameter) + rosa_km(turns))
    result = sheet - correction
    return result[()] if np.ndim(result) == 0 else result
