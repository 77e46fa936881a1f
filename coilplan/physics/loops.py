r"""Circular filaments: Maxwell's mutual inductance, round-wire loops, filament sums.

Every coil form that is a stack of circular turns (single-layer solenoids,
multilayer coils, flat spirals) reduces exactly to the sum of the turns'
self-inductances and the mutual inductances of every pair of turns. This
module holds that engine. All functions are pure, take SI values (metres)
and return henry; they broadcast over their arguments and pass NaN through.

========================  ==============================  ====================================
symbol                    parameter                       meaning
========================  ==============================  ====================================
:math:`a`, :math:`b`      ``radius_a``, ``radius_b``      radii of two coaxial circles
:math:`z`                 ``separation``                  axial distance between their planes
:math:`R`                 ``loop_radius``                 radius of a loop to the wire centre
:math:`\rho`              ``wire_radius``                 radius of the round wire
:math:`p`                 ``pitch``                       axial distance between turns
:math:`N`                 ``turns``                       number of turns
:math:`m`                 (internal)                      elliptic parameter, :math:`m = k^2`
========================  ==============================  ====================================

Convention: the complete elliptic integrals :math:`K(m)` and :math:`E(m)`
take the *parameter* :math:`m = k^2`, as ``scipy.special.ellipk`` and
``mpmath.ellipk`` do, not the modulus :math:`k`. The one magnetic constant
of the project is ``scipy.constants.mu_0``.
"""

from __future__ import annotations

import math
import operator
import warnings
from fractions import Fraction

import numpy as np
from scipy.constants import mu_0
from scipy.special import elliprd, zeta

from coilplan.errors import OutsideValidityWarning

__all__ = [
    "coaxial_filaments_inductance",
    "coaxial_mutual_inductance",
    "loop_self_inductance",
    "loop_self_inductance_gmd",
    "solenoid_filament_inductance",
]

#: Largest wire_radius / loop_radius for which the thin-ring formula is used
#: without a warning. Our choice, not a published limit: the thin-ring formula
#: and the GMD method, both in error by O(ratio^2), differ by 0.19 % at a
#: ratio of 0.1 and by 0.84 % at 0.2.
_THIN_RING_LIMIT = 0.2

#: Default bound on the size of one temporary array in the pair sums.
_DEFAULT_BLOCK_BYTES = 16 * 2**20

#: Cap on the rows of one block of the pair sum: keeps the triangle of pairs
#: inside a block (and its index arrays) small.
_MAX_BLOCK_ROWS = 512

#: Geometric mean distance of a round wire's cross-section from itself, per
#: unit wire radius: GMD = rho * exp(-1/4) (Maxwell 1873; Grover 1946).
_GMD_FACTOR = np.exp(-0.25)


# ---------------------------------------------------------------- kernels


def _maxwell_landen(a, b, z, *, reuse_z=False):
    """Maxwell's M for a, b > 0, z >= 0 (arrays that broadcast), no masks.

    M = mu0 (r1 + r2) [K(k1^2) - E(k1^2)], k1 = 4ab/(r1 + r2)^2, and
    K(m) - E(m) = (m/3) R_D(0, 1 - m, 1) with 1 - k1^2 = 4 r1 r2/(r1 + r2)^2.
    Temporaries are reused in place: three arrays of the broadcast shape
    (counting ``z`` when ``reuse_z`` allows it to be overwritten).
    """
    shape = np.broadcast_shapes(np.shape(a), np.shape(b), np.shape(z))
    t = np.asarray(np.subtract(a, b))
    r1 = np.hypot(t, z, out=t if t.shape == shape else None)
    t = np.asarray(np.add(a, b))
    r2 = np.hypot(t, z, out=t if t.shape == shape else None)
    reusable = reuse_z and isinstance(z, np.ndarray) and z.shape == shape
    s = np.add(r1, r2, out=z if reusable else None)
    # y = 1 - k1^2 = (4 r1 / s) (r2 / s), into r1
    np.multiply(r1, 4.0, out=r1)
    np.divide(r1, s, out=r1)
    np.divide(r2, s, out=r2)
    np.multiply(r1, r2, out=r1)
    # k1 = (4 a / s) (b / s), into r2
    np.divide(np.multiply(a, 4.0), s, out=r2)
    np.multiply(r2, b, out=r2)
    np.divide(r2, s, out=r2)
    elliprd(0.0, r1, 1.0, out=r1)
    # M = mu0 s k1^2 R_D / 3, into r2
    np.square(r2, out=r2)
    np.multiply(r2, r1, out=r2)
    np.multiply(r2, s, out=r2)
    np.multiply(r2, mu_0 / 3.0, out=r2)
    return r2


def _thin_ring(R, rho, high_frequency=False):
    """Thin-ring formula with masks: NaN where rho >= R or an input is negative."""
    half_y = 0.0 if high_frequency else 0.25
    with np.errstate(divide="ignore", invalid="ignore"):
        L = mu_0 * R * (np.log(8.0 * R / rho) - 2.0 + half_y)
    return np.where((rho >= R) | (rho < 0) | (R <= 0), np.nan, L)


def _warn_thick_wire(R, rho, where):
    """Warn (OutsideValidityWarning) when rho/R exceeds _THIN_RING_LIMIT anywhere."""
    with np.errstate(divide="ignore", invalid="ignore"):
        ratio = np.abs(np.asarray(rho, dtype=float) / np.asarray(R, dtype=float))
    worst = np.max(ratio, initial=0.0, where=np.isfinite(ratio))
    if worst > _THIN_RING_LIMIT:
        msg = (
            f"{where}: wire radius / loop radius must stay below {_THIN_RING_LIMIT} for the "
            f"thin-ring formula, whose error grows as that ratio squared; got up to {worst:.3g}"
            + ("; NaN where the wire radius reaches the loop radius" if worst >= 1 else "")
        )
        warnings.warn(msg, OutsideValidityWarning, stacklevel=3)


def _as_float(x):
    return np.asarray(x, dtype=float)


# ---------------------------------------------------------------- public


def coaxial_mutual_inductance(radius_a, radius_b, separation):
    r"""Mutual inductance of two coaxial circular filaments (Maxwell).

    .. math::

        M = \mu_0 \sqrt{ab}\left[\left(\frac{2}{k} - k\right)K(k^2)
            - \frac{2}{k}E(k^2)\right],\qquad
        k^2 = \frac{4ab}{(a+b)^2 + z^2},

    evaluated in the equivalent, numerically stable form (descending Landen
    transformation and Carlson's symmetric integral):

    .. math::

        r_1 = \sqrt{(a-b)^2 + z^2},\quad r_2 = \sqrt{(a+b)^2 + z^2},\quad
        k_1 = \frac{4ab}{(r_1 + r_2)^2},

        M = \mu_0 \sqrt{ab}\,\frac{2}{\sqrt{k_1}}\left[K(k_1^2) - E(k_1^2)\right]
          = \mu_0 (r_1 + r_2)\,\frac{k_1^2}{3}\,
            R_D\!\left(0,\ \frac{4 r_1 r_2}{(r_1 + r_2)^2},\ 1\right).

    Parameters
    ----------
    radius_a : float or array_like
        Radius :math:`a` of the first circle, m (>= 0).
    radius_b : float or array_like
        Radius :math:`b` of the second circle, m (>= 0).
    separation : float or array_like
        Axial distance :math:`z` between the planes of the circles, m; the
        sign is ignored (:math:`|z|` is used).

    The three arguments broadcast against each other.

    Returns
    -------
    M : float or ndarray
        Mutual inductance, H, of the broadcast shape. ``+inf`` where the
        circles coincide (:math:`a = b > 0`, :math:`z = 0`); ``0`` where a
        radius is zero or the separation is infinite; NaN where a radius is
        negative or an input is NaN.

    Notes
    -----
    The textbook form cancels badly both for close circles (:math:`k \to 1`)
    and for distant ones (:math:`k \to 0`). The form used here has no
    subtraction: :math:`k_1` and :math:`1 - k_1^2` are products of ratios,
    and :math:`K(m) - E(m) = (m/3) R_D(0, 1 - m, 1)` [DLMF19]_ is evaluated
    by ``scipy.special.elliprd``. Against the textbook form in mpmath at 40
    or more significant digits, the relative error stayed below 1.1e-15 over
    6000 geometries drawn from radii of 0.1 mm to 10 m, radius ratios of
    :math:`10^{\pm 3}` and separations from nearly touching
    (:math:`z = 10^{-7} a`, :math:`a \approx b`) to :math:`z = 100 a`.
    Elliptic parameter convention: :math:`m = k^2`. The formula is exact for
    filaments. For round wires with uniform current it is applied at the wire
    centres, since the geometric mean distance of two circular wire sections
    is the distance of their centres [Grover1946]_.

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701.
    .. [RosaGrover1912] E. B. Rosa and F. W. Grover, "Formulas and tables for
       the calculation of mutual and self-inductance", *Bulletin of the Bureau
       of Standards*, vol. 8, no. 1, pp. 1-237, 1912, formulas (1) and (2).
    .. [DLMF19] NIST Digital Library of Mathematical Functions, eq. 19.25.1
       (Carlson's :math:`R_D` for :math:`K - E`), https://dlmf.nist.gov/19.25.
    .. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas
       and Tables*, Van Nostrand, New York, 1946 (Dover reprint 1962),
       geometric mean distances.

    Examples
    --------
    Two 100 mm radius circles 100 mm apart:

    >>> from coilplan.physics.loops import coaxial_mutual_inductance
    >>> print(f"{coaxial_mutual_inductance(0.1, 0.1, 0.1) * 1e9:.6f} nH")
    49.407846 nH
    >>> coaxial_mutual_inductance(0.1, 0.1, 0.0)
    np.float64(inf)
    """
    a = _as_float(radius_a)
    b = _as_float(radius_b)
    z = np.asarray(np.abs(_as_float(separation)))
    with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
        M = _maxwell_landen(a, b, z, reuse_z=True)
    coincident = (a == b) & (a > 0) & (z == 0)
    zero = (((a == 0) & (b >= 0)) | ((b == 0) & (a >= 0))) & (z >= 0)
    far = np.isinf(z) & (a >= 0) & (b >= 0) & np.isfinite(a) & np.isfinite(b)
    negative = (a < 0) | (b < 0)
    M = np.where(coincident, np.inf, M)
    M = np.where(zero | far, 0.0, M)
    M = np.where(negative, np.nan, M)
    return M[()]


def loop_self_inductance(loop_radius, wire_radius, *, high_frequency=False):
    r"""Self-inductance of a circular loop of round wire (thin-ring formula).

    .. math::

        L = \mu_0 R \left[\ln\frac{8R}{\rho} - 2 + \frac{Y}{2}\right],
        \qquad Y = \tfrac12 \text{ (uniform current)},\quad
        Y = 0 \text{ (surface current)},

    i.e. :math:`\ln(8R/\rho) - 7/4` at low frequency and
    :math:`\ln(8R/\rho) - 2` when skin effect confines the current to the
    surface.

    Parameters
    ----------
    loop_radius : float or array_like
        Radius :math:`R` of the loop to the wire centre, m.
    wire_radius : float or array_like
        Radius :math:`\rho` of the wire, m. Broadcasts against ``loop_radius``.
    high_frequency : bool, optional
        ``False`` (default): uniform current over the wire section (low
        frequency, :math:`Y = 1/2`). ``True``: current on the surface
        (:math:`Y = 0`, the limit of full skin effect).

    Returns
    -------
    L : float or ndarray
        Self-inductance, H, of the broadcast shape. NaN where
        ``wire_radius >= loop_radius``, where ``loop_radius <= 0`` or
        ``wire_radius < 0``; ``+inf`` for a zero wire radius (a filament).

    Warns
    -----
    OutsideValidityWarning
        When ``wire_radius / loop_radius`` exceeds 0.2 anywhere.

    Notes
    -----
    Valid for :math:`\rho \ll R`; the neglected terms are of order
    :math:`(\rho/R)^2` relative [RosaGrover1912]_. The warning threshold
    :math:`\rho/R > 0.2` is our choice, not a published limit. Some texts
    write the constant as :math:`-2 + Y` with :math:`Y = 1/4`: the same
    number; this function uses the :math:`Y/2` convention throughout.
    Compare :func:`loop_self_inductance_gmd`, which agrees to 1.5e-5 at
    :math:`R/\rho = 100` and to 4e-4 at :math:`R/\rho = 20`.

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701 (coaxial circles, the
       basis of the ring formula).
    .. [RosaGrover1912] E. B. Rosa and F. W. Grover, "Formulas and tables for
       the calculation of mutual and self-inductance", *Bulletin of the Bureau
       of Standards*, vol. 8, no. 1, pp. 1-237, 1912 (circular ring of round
       wire).
    .. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas
       and Tables*, Van Nostrand, New York, 1946 (Dover reprint 1962),
       circular ring of round wire.

    Examples
    --------
    A loop of 50 mm radius in wire of 0.5 mm radius:

    >>> from coilplan.physics.loops import loop_self_inductance
    >>> print(f"{loop_self_inductance(0.05, 0.0005) * 1e9:.4f} nH")
    310.0508 nH
    >>> print(f"{loop_self_inductance(0.05, 0.0005, high_frequency=True) * 1e9:.4f} nH")
    294.3428 nH
    """
    R = _as_float(loop_radius)
    rho = _as_float(wire_radius)
    _warn_thick_wire(R, rho, "loop_self_inductance")
    return _thin_ring(R, rho, bool(high_frequency))[()]


def loop_self_inductance_gmd(loop_radius, wire_radius):
    r"""Self-inductance of a round-wire loop by the geometric-mean-distance method.

    .. math::

        L = M\!\left(R,\ R,\ \rho\, e^{-1/4}\right),

    Maxwell's mutual inductance (:func:`coaxial_mutual_inductance`) of two
    coaxial circles of radius :math:`R` whose distance is the geometric mean
    distance :math:`\rho e^{-1/4}` of the wire's circular section from itself.

    Parameters
    ----------
    loop_radius : float or array_like
        Radius :math:`R` of the loop to the wire centre, m.
    wire_radius : float or array_like
        Radius :math:`\rho` of the wire, m. Broadcasts against ``loop_radius``.

    Returns
    -------
    L : float or ndarray
        Low-frequency (uniform current) self-inductance, H. NaN where
        ``wire_radius >= loop_radius``, ``loop_radius <= 0`` or
        ``wire_radius < 0``.

    Warns
    -----
    OutsideValidityWarning
        When ``wire_radius / loop_radius`` exceeds 0.2 anywhere (our choice,
        as for :func:`loop_self_inductance`).

    Notes
    -----
    The GMD of a circular area from itself, :math:`\rho e^{-1/4}`, is exact for
    straight conductors; on a ring the method carries an error of order
    :math:`(\rho/R)^2`, as the thin-ring formula does, and the two agree to
    1.5e-5 at :math:`R/\rho = 100` [Grover1946]_. This is the self term the
    Kirchhoff/Maxwell turn-by-turn sum uses in references of the Rosa method.

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701 (coaxial circles) and
       the method of geometric mean distances in the same volume.
    .. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas
       and Tables*, Van Nostrand, New York, 1946 (Dover reprint 1962),
       geometric mean distances.

    Examples
    --------
    >>> from coilplan.physics.loops import loop_self_inductance_gmd
    >>> print(f"{loop_self_inductance_gmd(0.05, 0.0005) * 1e9:.4f} nH")
    310.0555 nH
    """
    R = _as_float(loop_radius)
    rho = _as_float(wire_radius)
    _warn_thick_wire(R, rho, "loop_self_inductance_gmd")
    L = coaxial_mutual_inductance(R, R, rho * _GMD_FACTOR)
    return np.where((rho >= R) | (rho < 0) | (R <= 0), np.nan, L)[()]


def coaxial_filaments_inductance(radii, positions, wire_radius, *,
                                 max_block_bytes=_DEFAULT_BLOCK_BYTES):
    r"""Low-frequency inductance of coaxial circular turns connected in series.

    .. math::

        L = \sum_{i=1}^{N} L_\text{loop}(r_i, \rho_i)
            + 2 \sum_{i<j} M\!\left(r_i,\ r_j,\ |z_i - z_j|\right),

    with :math:`L_\text{loop}` the thin-ring formula at low frequency
    (:func:`loop_self_inductance`) and :math:`M` Maxwell's mutual inductance
    (:func:`coaxial_mutual_inductance`). All turns carry the same current in
    the same sense.

    Parameters
    ----------
    radii : array_like, shape (N,)
        Radius :math:`r_i` of each turn to the wire centre, m.
    positions : array_like, shape (N,)
        Axial position :math:`z_i` of each turn, m.
    wire_radius : float or array_like, shape (N,)
        Wire radius :math:`\rho_i`, m: one for all turns or one per turn.
    max_block_bytes : int, optional
        Upper bound on the size of each temporary array of the pair sum
        (default 16 MiB). The pairs are summed in blocks of rows of the
        N x N pair matrix, so memory stays bounded for any N; the peak is
        about three such blocks.

    Returns
    -------
    L : float
        Total inductance, H. ``0`` for no turns; ``+inf`` if two turns
        coincide; NaN if an input is NaN, a radius is not positive or a wire
        radius reaches its turn's radius.

    Raises
    ------
    ValueError
        If ``radii`` and ``positions`` are not 1-D of the same length, or
        ``wire_radius`` does not broadcast to that length.

    Warns
    -----
    OutsideValidityWarning
        When a wire radius exceeds 0.2 of its turn's radius.

    Notes
    -----
    Exact for filaments. For round wires it assumes uniform current in each
    wire (low frequency) and takes each pair's mutual inductance at the wire
    centres (the geometric mean distance of two circular sections is the
    distance of their centres). The pair sum uses the
    symmetry :math:`M_{ij} = M_{ji}` (only :math:`i < j`, doubled): about
    :math:`N^2/2` evaluations of Maxwell's formula, about 0.15 s for
    N = 1000 and 12 s for N = 10 000 on one core of the development machine
    (see ``tests/benchmarks/README.md``).

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701.
    .. [RosaGrover1912] E. B. Rosa and F. W. Grover, "Formulas and tables for
       the calculation of mutual and self-inductance", *Bulletin of the Bureau
       of Standards*, vol. 8, no. 1, pp. 1-237, 1912, formulas (1) and (2).

    Examples
    --------
    Two turns of 1 mm wire, radii 20 and 22 mm, 3 mm apart (an invented
    arrangement):

    >>> from coilplan.physics.loops import coaxial_filaments_inductance
    >>> L = coaxial_filaments_inductance([0.020, 0.022], [0.0, 0.003], 0.0005)
    >>> print(f"{L * 1e9:.2f} nH")
    312.76 nH
    """
    r = _as_float(radii)
    z = _as_float(positions)
    if r.ndim != 1 or z.shape != r.shape:
        msg = (
            "radii and positions must be 1-D arrays of the same length; "
            f"got shapes {r.shape} and {z.shape}"
        )
        raise ValueError(msg)
    try:
        rho = np.broadcast_to(_as_float(wire_radius), r.shape)
    except ValueError:
        msg = (
            f"wire_radius must be a scalar or have shape {r.shape}; "
            f"got shape {np.shape(wire_radius)}"
        )
        raise ValueError(msg) from None
    n = r.size
    if n == 0:
        return np.float64(0.0)
    _warn_thick_wire(r, rho, "coaxial_filaments_inductance")
    total = np.sum(_thin_ring(r, rho))
    if np.any(~(r > 0)):
        return np.float64(np.nan)

    budget = max(1, int(max_block_bytes) // 8)
    mutual = 0.0
    i0 = 0
    while i0 < n:
        # rows i0..i1-1 against every later turn: a triangle inside the block
        # and a rectangle to its right, so each pair i < j is evaluated once
        rows = min(_MAX_BLOCK_ROWS, max(1, budget // (n - i0)))
        i1 = min(n, i0 + rows)
        iu, ju = np.triu_indices(i1 - i0, 1)
        iu += i0
        ju += i0
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            mutual += np.sum(_maxwell_landen(r[iu], r[ju], np.abs(z[iu] - z[ju]), reuse_z=True))
            if i1 < n:
                dz = np.abs(z[i0:i1, None] - z[None, i1:])
                mutual += np.sum(_maxwell_landen(r[i0:i1, None], r[None, i1:], dz, reuse_z=True))
        i0 = i1
    return np.float64(total + 2.0 * mutual)


def _check_turns(turns):
    """Return turns as a Python int >= 1, or raise ValueError."""
    msg = f"turns must be a whole number of at least 1; got {turns!r}"
    if isinstance(turns, bool):
        raise ValueError(msg)
    try:
        N = operator.index(turns)
    except TypeError:
        try:
            value = float(turns)
        except (TypeError, ValueError):
            raise ValueError(msg) from None
        if not value.is_integer():
            raise ValueError(msg) from None
        N = int(value)
    if N < 1:
        raise ValueError(msg)
    return N


def solenoid_filament_inductance(diameter, pitch, wire_diameter, turns):
    r"""Inductance of a single-layer solenoid as an exact sum over its turns.

    .. math::

        L = N\,L_\text{loop}(a, \rho)
            + 2 \sum_{k=1}^{N-1} (N - k)\, M(a, a, k p),
        \qquad a = D/2,\ \rho = d/2,

    the turn-by-turn (Kirchhoff/Maxwell) sum of :func:`coaxial_filaments_inductance`
    for N equal coaxial turns spaced one pitch apart; because the mutual
    inductance of two equal turns depends only on their spacing, the double
    sum collapses to N - 1 evaluations of Maxwell's formula.

    Parameters
    ----------
    diameter : float or array_like
        Coil diameter :math:`D` to the wire centres, m.
    pitch : float or array_like
        Axial distance :math:`p` between adjacent turns, m.
    wire_diameter : float or array_like
        Bare wire diameter :math:`d`, m.
    turns : int
        Number of turns :math:`N`, a whole number >= 1 (``25`` or ``25.0``).

    ``diameter``, ``pitch`` and ``wire_diameter`` broadcast against each other
    (shape ``S``); ``turns`` is a scalar.

    Returns
    -------
    L : float or ndarray, shape S
        Low-frequency inductance, H. NaN where an input is NaN, the diameter
        is not positive or the wire is as thick as the coil.

    Raises
    ------
    ValueError
        If ``turns`` is not a whole number or is below 1.

    Warns
    -----
    OutsideValidityWarning
        When the wire radius exceeds 0.2 of the coil radius, or the pitch is
        smaller than the wire diameter (turns that overlap).

    Notes
    -----
    Exact for a stack of circular filaments; for a real helix it neglects the
    pitch angle (the turns are taken as closed circles) and assumes uniform
    current in the wire. The self term is the thin-ring formula
    (:func:`loop_self_inductance`, error of order :math:`(\rho/a)^2`). It
    agrees with Rosa's round-wire correction of Nagaoka's current sheet
    (the NBS method [RosaGrover1912]_) to 1.8e-4 for D = 50 mm, p = 2 mm,
    d = 1 mm, N = 25, within the "few parts in 10 000" Knight states for that
    method [Knight2010]_. Cost: N - 1 evaluations of Maxwell's formula.

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701.
    .. [RosaGrover1912] E. B. Rosa and F. W. Grover, "Formulas and tables for
       the calculation of mutual and self-inductance", *Bulletin of the Bureau
       of Standards*, vol. 8, no. 1, pp. 1-237, 1912, formulas (1), (2) and
       the corrections for round wire.
    .. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas
       and Tables*, Van Nostrand, New York, 1946 (Dover reprint 1962),
       single-layer coils.
    .. [Knight2010] D. W. Knight, notes on Rosa's round-wire corrections and
       Grover's table of km, 2010,
       http://www.g3ynh.info/zdocs/magnetics/appendix/Rosa_Km.html.

    Examples
    --------
    25 turns of 1 mm wire at 2 mm pitch on a 50 mm diameter:

    >>> from coilplan.physics.loops import solenoid_filament_inductance
    >>> print(f"{solenoid_filament_inductance(0.05, 0.002, 0.001, 25) * 1e6:.4f} uH")
    21.0977 uH
    """
    N = _check_turns(turns)
    D, p, d = np.broadcast_arrays(_as_float(diameter), _as_float(pitch),
                                  _as_float(wire_diameter))
    a = D / 2.0
    rho = d / 2.0
    _warn_thick_wire(a, rho, "solenoid_filament_inductance")
    if N > 1 and np.any(np.abs(p) < d):
        with np.errstate(divide="ignore", invalid="ignore"):
            worst = np.nanmin(np.abs(p) / d)
        msg = (
            "solenoid_filament_inductance: pitch must be at least the wire diameter "
            f"(turns would overlap); got pitch/wire_diameter down to {worst:.3g}"
        )
        warnings.warn(msg, OutsideValidityWarning, stacklevel=2)
    L = N * _thin_ring(a, rho)
    if N > 1:
        shape = a.shape
        a_flat = a.reshape(-1, 1)
        p_flat = np.abs(p).reshape(-1, 1)
        mutual = np.zeros(a_flat.shape[0])
        with np.errstate(divide="ignore", invalid="ignore"):
            spacing_ratio = np.max(D / np.abs(p), initial=0.0, where=np.isfinite(D / np.abs(p)))
        near = N if not np.isfinite(spacing_ratio) else min(N, max(2, math.ceil(_FAR_START * spacing_ratio)))
        budget = max(1, _DEFAULT_BLOCK_BYTES // 8 // max(1, a_flat.shape[0]))
        for k0 in range(1, near, budget):
            k = np.arange(k0, min(near, k0 + budget), dtype=float)
            with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
                M = _maxwell_landen(a_flat, a_flat, k * p_flat, reuse_z=True)
            M = np.where(a_flat > 0, M, np.nan)
            mutual += np.sum(M * (N - k), axis=-1)
        if near < N:
            mutual += _far_pairs(a_flat[:, 0], (2.0 * a_flat / p_flat)[:, 0], near, N)
        L = L + 2.0 * mutual.reshape(shape)
    return L[()]


#: The single-layer sum is exact term by term for spacings k·p below this many coil diameters
#: (k < 4·D/p); beyond, :func:`_far_pairs` sums the rest in closed form.
_FAR_START = 4.0


def _far_series(terms: int = 16) -> tuple[float, ...]:
    r"""h_i of M(a, a, z) = µ0 a (π/16) Σ_i h_i t^(i + 3/2), t = (2a/z)², from the series of K and E.

    Maxwell's :math:`M = \mu_0 a\,[(2/k - k)K - (2/k)E]` with :math:`m = k^2 = 4a^2/(4a^2 + z^2)`
    has :math:`(2 - m)K - 2E = \frac{\pi}{2}\sum_n c_n m^n`, :math:`c_n = 2\alpha_n - \alpha_{n-1} - 2\eta_n`,
    from :math:`K = \frac{\pi}{2}\sum \alpha_n m^n`, :math:`E = \frac{\pi}{2}\sum \eta_n m^n`
    (DLMF 19.5.1-2; c_0 = c_1 = 0, c_2 = 1/8: the dipole term), so :math:`M = \mu_0 a \frac{\pi}{16}
    \sum_n f_n m^{n+3/2}` with :math:`f_n = 8c_{n+2}` (1, 3/4, 75/128, ...); with m = t/(1 + t) the binomial
    series of :math:`(1 + t)^{-(n+3/2)}` gives :math:`h_i = \sum_{n<=i} f_n \binom{-(n+3/2)}{i-n}`,
    in exact rational arithmetic. |h_i| <= 1, so for t <= 1/16 sixteen terms leave under 1e-19.
    """
    def rising(x, n):
        product = Fraction(1)
        for i in range(n):
            product *= x + i
        return product

    factorial = math.factorial
    alpha = [(rising(Fraction(1, 2), n) / factorial(n)) ** 2 for n in range(terms + 3)]
    eta = [rising(Fraction(-1, 2), n) * rising(Fraction(1, 2), n) / factorial(n) ** 2 for n in range(terms + 3)]
    c = [2 * alpha[n] - (alpha[n - 1] if n else 0) - 2 * eta[n] for n in range(terms + 3)]
    f = [8 * c[n + 2] for n in range(terms)]
    h = [sum(f[n] * (-1) ** (i - n) * rising(n + Fraction(3, 2), i - n) / factorial(i - n) for n in range(i + 1))
         for i in range(terms)]
    return tuple(float(value) for value in h)


_FAR_COEFFICIENTS = _far_series()


def _far_pairs(a, beta, start: int, turns: int):
    r"""Σ_{k=start}^{N-1} (N − k)·M(a, a, k·p) for equal coaxial turns, β = 2a/p, start >= 4β: in closed form.

    With :math:`t_k = (\beta/k)^2` the series of :func:`_far_series` gives powers :math:`k^{-q}`,
    q = 2i + 3, whose sums are Hurwitz zeta differences (DLMF 25.11.1):
    :math:`\sum_{k=K}^{N-1} (N - k) k^{-q} = N[\zeta(q, K) - \zeta(q, N)] - [\zeta(q-1, K) - \zeta(q-1, N)]`.
    """
    total = np.zeros(np.shape(a))
    log_beta = np.log(beta)
    for i, coefficient in enumerate(_FAR_COEFFICIENTS):
        q = 2 * i + 3
        sums = turns * (zeta(q, start) - zeta(q, turns)) - (zeta(q - 1, start) - zeta(q - 1, turns))
        if sums <= 0:
            break
        with np.errstate(over="ignore", under="ignore"):
            total = total + coefficient * np.exp(q * log_beta + math.log(sums))
    return mu_0 * a * (np.pi / 16.0) * total
