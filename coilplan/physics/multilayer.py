r"""Multilayer coils and flat spirals: Wheeler's formulas and the exact turn-by-turn sum.

A multilayer winding is a stack of layers of circular turns; a flat spiral is
a set of circular turns of rising radius in one plane. Both reduce exactly to
the sum of every turn's self-inductance and the mutual inductance of every
pair of turns (:func:`coilplan.physics.loops.coaxial_filaments_inductance`).
Wheeler's formulas are named approximations of the same coils as uniform
current sheets. All functions are pure, take SI values and return henry.

==========================  ============================  ==========================================
symbol                      parameter                     meaning
==========================  ============================  ==========================================
:math:`a`                   ``mean_radius``               mean radius of the winding section
:math:`b`                   ``length``                    axial length of the winding
:math:`c`                   ``depth``                     radial depth (build) of the winding
:math:`N`                   ``turns``                     number of turns
:math:`r_0`                 ``inner_radius``              radius at which the winding starts
:math:`W`                   ``winding_width``             axial width available to each layer
:math:`p`                   (internal)                    axial pitch, overall wire diameter × packing
:math:`h`                   (internal)                    layer pitch (radial distance of layers)
==========================  ============================  ==========================================

Layer styles. ``"layered"``: each layer's turns sit directly above the last
(a square grid), layer pitch :math:`h = p`. ``"staggered"`` (orthocyclic):
every second layer is shifted by half a pitch and nests in the grooves of the
one below, :math:`h = (\sqrt3/2)\,p`, and holds one turn fewer when the width
is a whole number of pitches. The packing factor (>= 1) stretches both pitches
for hand winding. Common practice, no source: about 1.0 for machine or very
careful layer winding, 1.05 to 1.1 for careful hand layer winding, 1.15 to
1.2 for a hand-wound "scramble" (random) winding.
"""

from __future__ import annotations

import math
import warnings

import numpy as np
from scipy.constants import epsilon_0, mu_0
from scipy.special import ellipe, ellipkm1, elliprd

from coilplan.errors import OutsideValidityWarning
from coilplan.physics.loops import _as_float, _maxwell_landen, coaxial_filaments_inductance, loop_self_inductance

__all__ = [
    "layer_grid_inductance",
    "layer_pitch",
    "layer_turn_counts",
    "layered_winding_layout",
    "multilayer_filament_inductance",
    "spiral_filament_inductance",
    "spiral_filament_inductances",
    "spiral_self_capacitance",
    "spiral_turn_radii",
    "wheeler_multilayer_inductance",
    "wheeler_spiral_inductance",
]

_INCH = 0.0254

#: Wheeler's multilayer claim holds "when the terms in the denominator are about
#: equal". Our reading of "about equal": the largest of 6a, 9b, 10c within twice
#: the smallest (not a published figure).
_WHEELER_TERM_SPREAD = 2.0

#: Wheeler's flat-spiral claim: within 5 % for c > 0.2 a (Pender & McIlwain).
_SPIRAL_MIN_DEPTH_RATIO = 0.2

#: Layer pitch over axial pitch for each layer style (square grid; hexagonal nesting).
_LAYER_PITCH = {"layered": 1.0, "staggered": math.sqrt(3.0) / 2.0}

#: Slack on the turns a width holds, so that a width of exactly n pitches holds n turns despite rounding.
_WHOLE_PITCH_SLACK = 1e-9


def wheeler_multilayer_inductance(mean_radius, length, depth, turns):
    r"""Inductance of a multilayer coil by Wheeler's 1928 formula (an approximation).

    .. math::

        L\,[\mu\mathrm{H}] = \frac{0.8\,a^2 N^2}{6a + 9b + 10c}
        \qquad (a, b, c \text{ in inches})

    Parameters
    ----------
    mean_radius : float or array_like
        :math:`a`, mean radius of the winding section (middle of the build), m.
    length : float or array_like
        :math:`b`, axial length of the winding, m.
    depth : float or array_like
        :math:`c`, radial depth of the winding, m.
    turns : float or array_like
        :math:`N`, turns. All arguments broadcast.

    Returns
    -------
    L : float or ndarray
        Inductance, H (converted from µH and inches here).

    Warns
    -----
    OutsideValidityWarning
        When the denominator terms are not "about equal" (our reading: the
        largest more than twice the smallest).

    Notes
    -----
    Wheeler claims 1 % "when the terms in the denominator are about equal"
    [Wheeler1928]_; when they are unequal (pancake-like or long thin
    sections) the error grows to several percent. The formula treats the
    winding as a uniform current density over its section (no round-wire
    correction).

    References
    ----------
    .. [Wheeler1928] H. A. Wheeler, "Simple inductance formulas for radio coils",
       *Proc. IRE*, vol. 16, no. 10, pp. 1398-1400, 1928 (multilayer formula),
       quoted at https://www.pupman.com/listarchives/1998/April/msg00062.html.

    Examples
    --------
    >>> from coilplan.physics.multilayer import wheeler_multilayer_inductance
    >>> print(f"{wheeler_multilayer_inductance(0.0254, 0.0254 * 2 / 3, 0.0254 * 0.6, 100) * 1e6:.4f} uH")
    444.4444 uH
    """
    a = _as_float(mean_radius) / _INCH
    b = _as_float(length) / _INCH
    c = _as_float(depth) / _INCH
    N = _as_float(turns)
    terms = np.stack(np.broadcast_arrays(6.0 * a, 9.0 * b, 10.0 * c))
    with np.errstate(divide="ignore", invalid="ignore"):
        spread = np.max(terms, axis=0) / np.min(terms, axis=0)
        L = 0.8 * a**2 * N**2 / (6.0 * a + 9.0 * b + 10.0 * c) * 1e-6
    worst = np.max(spread, initial=0.0, where=np.isfinite(spread))
    if worst > _WHEELER_TERM_SPREAD:
        msg = ("wheeler_multilayer_inductance: the terms 6a, 9b, 10c must be about equal (largest within "
               f"{_WHEELER_TERM_SPREAD:g} × the smallest) for Wheeler's 1 % claim; got a spread of {worst:.3g}")
        warnings.warn(msg, OutsideValidityWarning, stacklevel=2)
    return L[()]


def wheeler_spiral_inductance(mean_radius, depth, turns):
    r"""Inductance of a flat spiral by Wheeler's formula (an approximation).

    .. math::

        L\,[\mu\mathrm{H}] = \frac{a^2 N^2}{8a + 11c}
        \qquad (a, c \text{ in inches})

    Parameters
    ----------
    mean_radius : float or array_like
        :math:`a`, mean radius of the spiral (middle of the winding), m.
    depth : float or array_like
        :math:`c`, radial width of the winding (outer minus inner radius), m.
    turns : float or array_like
        :math:`N`, turns. All arguments broadcast.

    Returns
    -------
    L : float or ndarray
        Inductance, H.

    Warns
    -----
    OutsideValidityWarning
        When :math:`c \le 0.2a`, outside the stated range.

    Notes
    -----
    Stated accuracy: within 5 % for :math:`c > 0.2a` [PenderMcIlwain1945]_.
    For narrow spirals a thin ribbon's inductance depends logarithmically on
    its width and the formula departs from round wire; use the filament sum.

    References
    ----------
    .. [PenderMcIlwain1945] H. Pender and K. McIlwain, *Electrical Engineers'
       Handbook*, 3rd ed., Wiley, 1945 (Wheeler's flat-spiral formula), quoted at
       https://pupman.com/listarchives/1998/May/msg00105.html.

    Examples
    --------
    >>> from coilplan.physics.multilayer import wheeler_spiral_inductance
    >>> print(f"{wheeler_spiral_inductance(0.0254, 0.0254, 10) * 1e6:.4f} uH")
    5.2632 uH
    """
    a = _as_float(mean_radius) / _INCH
    c = _as_float(depth) / _INCH
    N = _as_float(turns)
    with np.errstate(divide="ignore", invalid="ignore"):
        L = a**2 * N**2 / (8.0 * a + 11.0 * c) * 1e-6
        narrow = np.any(c <= _SPIRAL_MIN_DEPTH_RATIO * a)
    if narrow:
        msg = ("wheeler_spiral_inductance: the radial width c must exceed 0.2 × the mean radius a for "
               "Wheeler's 5 % claim; got a narrower spiral")
        warnings.warn(msg, OutsideValidityWarning, stacklevel=2)
    return L[()]


def _check_style(style) -> None:
    if style not in _LAYER_PITCH:
        raise ValueError(f"style must be one of {', '.join(_LAYER_PITCH)}; got {style!r}")


def layer_pitch(pitch, style="layered"):
    r"""Radial distance between layers, :math:`h = p` (layered) or :math:`(\sqrt3/2)\,p` (staggered), m.

    Geometry of touching circles of diameter :math:`p`: stacked on a square grid, or each nested
    in the groove between two below (a hexagonal packing, centres at the corners of equilateral
    triangles of side :math:`p`).

    Examples
    --------
    >>> from coilplan.physics.multilayer import layer_pitch
    >>> print(f"{layer_pitch(0.001, 'staggered') * 1e3:.4f} mm")
    0.8660 mm
    """
    _check_style(style)
    return _LAYER_PITCH[style] * pitch


def layer_turn_counts(winding_width, pitch, style="layered"):
    r"""Turns a full even layer and a full odd layer hold across ``winding_width`` at axial ``pitch``.

    :math:`\lfloor W/p \rfloor` for both (layered), or :math:`\lfloor W/p \rfloor` and
    :math:`\lfloor W/p - \tfrac12 \rfloor` (staggered: the odd layers start half a pitch in).

    Returns
    -------
    full, shifted : int
        Turns in layers 0, 2, 4 ... and in layers 1, 3, 5 ...

    Examples
    --------
    >>> from coilplan.physics.multilayer import layer_turn_counts
    >>> layer_turn_counts(0.0031, 0.001, "staggered")
    (3, 2)
    """
    _check_style(style)
    full = math.floor(winding_width / pitch + _WHOLE_PITCH_SLACK)
    shifted = math.floor(winding_width / pitch - 0.5 + _WHOLE_PITCH_SLACK) if style == "staggered" else full
    return full, shifted


def layered_winding_layout(inner_radius, winding_width, wire_diameter, turns, *, style="layered", packing=1.0):
    r"""Per-layer layout of a layered winding: radii, axial offsets and turn counts.

    Layer :math:`k` (from 0) has its turn centres at radius
    :math:`r_k = r_0 + h/2 + k h` and axial positions
    :math:`z = o_k + (i + \tfrac12) p - W/2`, :math:`i = 0 \ldots T_k - 1`,
    with :math:`p` = ``wire_diameter`` × ``packing``, :math:`h = p` (layered)
    or :math:`(\sqrt3/2) p` (staggered), :math:`o_k = 0`, or :math:`p/2` on
    the odd layers of a staggered winding. Full layers hold
    :math:`\lfloor W/p \rfloor` turns (staggered odd layers
    :math:`\lfloor W/p - \tfrac12 \rfloor`); the last layer holds what is left.

    Parameters
    ----------
    inner_radius : float
        :math:`r_0`, radius of the former surface, m.
    winding_width : float
        :math:`W`, axial width each layer may fill, m.
    wire_diameter : float
        Overall (insulated) wire diameter, m.
    turns : int
        Whole number of turns, >= 1.
    style : {"layered", "staggered"}
    packing : float
        Packing factor >= 1 (1: turns touching).

    Returns
    -------
    radii, offsets : ndarray, shape (layers,)
        Radius of each layer's turn centres and the axial position of its
        first turn centre, m.
    counts : ndarray of int, shape (layers,)
        Turns in each layer.
    pitch, layer_pitch : float
        Axial pitch :math:`p` and layer pitch :math:`h`, m.

    Raises
    ------
    ValueError
        For an unknown style, a packing below 1, fewer than one turn, or a
        width that holds no turn of a layer.

    Examples
    --------
    >>> from coilplan.physics.multilayer import layered_winding_layout
    >>> radii, offsets, counts, p, h = layered_winding_layout(0.005, 0.0031, 0.001, 7, style="staggered")
    >>> counts.tolist()
    [3, 2, 2]
    """
    _check_style(style)
    if not packing >= 1.0:
        raise ValueError(f"packing must be at least 1; got {packing!r}")
    N = int(turns)
    if N < 1 or turns != N:
        raise ValueError(f"turns must be a whole number of at least 1; got {turns!r}")
    p = float(wire_diameter) * float(packing)
    h = layer_pitch(p, style)
    full, shifted = layer_turn_counts(winding_width, p, style)
    if full < 1 or shifted < 1:
        raise ValueError(f"winding_width must hold at least {'two' if style == 'staggered' else 'one'} "
                         f"turns of a layer; got {winding_width!r} m for a {p!r} m pitch")
    pair = full + shifted
    layers = 2 * (N // pair) + 2
    per_layer = np.tile([full, shifted], layers // 2)
    cumulative = np.cumsum(per_layer)
    used = int(np.searchsorted(cumulative, N)) + 1
    counts = per_layer[:used].copy()
    counts[-1] = N - (cumulative[used - 2] if used > 1 else 0)
    k = np.arange(used)
    radii = inner_radius + h / 2.0 + k * h
    odd = (k % 2 == 1) & (style == "staggered")
    offsets = np.where(odd, p / 2.0, 0.0) + p / 2.0 - winding_width / 2.0
    return radii, offsets, counts, p, h


def layer_grid_inductance(layer_radii, layer_offsets, layer_counts, pitch, wire_radius):
    r"""Filament sum of turns on layers of a regular axial grid, regrouped by pairs of layers.

    .. math::

        L = \sum_p T_p\,L_\text{loop}(r_p, \rho)
          + \sum_{p, q} \sum_{k} n_{pq}(k)\, M\!\left(r_p, r_q, |o_p - o_q + k\,s|\right),

    where :math:`n_{pq}(k) = \max\!\big(0, \min(T_p, T_q + k) - \max(0, k)\big)`
    counts the pairs (turn :math:`i` of layer :math:`p`, turn :math:`j` of
    layer :math:`q`) with :math:`i - j = k`, the term :math:`p = q, k = 0`
    (a turn with itself) is left out, and :math:`s` is the axial pitch. It is
    the same total as :func:`~coilplan.physics.loops.coaxial_filaments_inductance`
    over all the turns, regrouped: :math:`O(P^2 T)` evaluations of Maxwell's
    formula instead of :math:`O(P^2 T^2)`. The pairs of layers (p, q) and (q, p)
    hold the same pairs of turns, so only q >= p is evaluated (about P²·T in all).

    Parameters
    ----------
    layer_radii, layer_offsets : array_like, shape (P,)
        Radius of each layer's turn centres and axial position of its first
        turn, m.
    layer_counts : array_like of int, shape (P,)
        Turns :math:`T_p` in each layer.
    pitch : float
        Axial pitch :math:`s`, m.
    wire_radius : float
        Bare wire radius :math:`\rho`, m.

    Returns
    -------
    L : float
        Low-frequency inductance, H.

    Notes
    -----
    Exact for filaments with the round-wire self term of
    :func:`~coilplan.physics.loops.loop_self_inductance`; agrees with the
    direct pair sum to rounding (tests/benchmarks/README.md).

    Examples
    --------
    >>> from coilplan.physics.loops import coaxial_filaments_inductance
    >>> from coilplan.physics.multilayer import layer_grid_inductance
    >>> grid = layer_grid_inductance([0.01, 0.011], [0.0, 0.0005], [3, 2], 0.001, 0.0004)
    >>> direct = coaxial_filaments_inductance([0.01] * 3 + [0.011] * 2,
    ...     [0.0, 0.001, 0.002, 0.0005, 0.0015], 0.0004)
    >>> bool(abs(grid / direct - 1) < 1e-13)
    True
    """
    r = _as_float(layer_radii).ravel()
    o = _as_float(layer_offsets).ravel()
    T = np.asarray(layer_counts, dtype=np.int64).ravel()
    self_terms = float(np.sum(T * loop_self_inductance(r, wire_radius)))
    total = 0.0
    kmax = int(T.max())
    k = np.arange(-(kmax - 1), kmax, dtype=np.int64)
    for p_index in range(r.size):
        # layers q >= p against layer p at once, shape (P - p, 2 kmax - 1); the pairs (p, q) and
        # (q, p) are the same pairs of turns (n_pq(k) = n_qp(-k) at the same distance), so q > p
        # counts twice
        rest = slice(p_index, None)
        count = np.minimum(T[p_index], T[rest, None] + k[None, :]) - np.maximum(0, k)[None, :]
        count = np.maximum(count, 0)
        count[0, kmax - 1] = 0  # a turn with itself: the self term
        count[1:] *= 2
        dz = np.abs(o[p_index] - o[rest, None] + k[None, :] * float(pitch))
        with np.errstate(divide="ignore", invalid="ignore", over="ignore"):
            M = _maxwell_landen(r[p_index], r[rest, None], dz)
        total += float(np.sum(count * np.where(count > 0, M, 0.0)))
    return np.float64(self_terms + total)


def multilayer_filament_inductance(inner_radius, winding_width, wire_diameter, turns, *, overall_diameter=None,
                                   style="layered", packing=1.0, regroup=True):
    r"""Inductance of a multilayer coil as the exact sum over its turns.

    .. math::

        L = \sum_i L_\text{loop}(r_i, \rho) + 2\sum_{i<j} M(r_i, r_j, |z_i - z_j|),

    over the turn positions of :func:`layered_winding_layout`.

    Parameters
    ----------
    inner_radius : float
        Radius of the former surface, m.
    winding_width : float
        Axial width each layer may fill, m.
    wire_diameter : float
        Bare wire diameter, m (the self term uses its radius).
    turns : int
        Whole number of turns, >= 1.
    overall_diameter : float, optional
        Overall (insulated) diameter, m, that sets the pitches; default the bare
        diameter.
    style : {"layered", "staggered"}
    packing : float
        Packing factor >= 1.
    regroup : bool
        ``True`` (default): the layer-pair regrouping
        (:func:`layer_grid_inductance`), fast; ``False``: the direct pair sum of
        :func:`~coilplan.physics.loops.coaxial_filaments_inductance`.

    Returns
    -------
    L : float
        Low-frequency inductance, H.

    Notes
    -----
    Exact for circular filaments at the turn centres with the thin-ring self
    term (error of order :math:`(\rho/r)^2`); the helix and the layer-to-layer
    crossovers are neglected. Uniform current in each wire (low frequency).

    References
    ----------
    .. [Maxwell1873] J. C. Maxwell, *A Treatise on Electricity and Magnetism*,
       vol. 2, Clarendon Press, Oxford, 1873, art. 701.
    .. [Grover1946] F. W. Grover, *Inductance Calculations: Working Formulas
       and Tables*, Van Nostrand, New York, 1946 (Dover reprint 1962),
       multilayer coils.

    Examples
    --------
    >>> from coilplan.physics.multilayer import multilayer_filament_inductance
    >>> a = multilayer_filament_inductance(0.005, 0.01, 0.0005, 60, style="staggered")
    >>> b = multilayer_filament_inductance(0.005, 0.01, 0.0005, 60, style="staggered", regroup=False)
    >>> bool(abs(a / b - 1) < 1e-12)
    True
    """
    overall = wire_diameter if overall_diameter is None else overall_diameter
    radii, offsets, counts, p, _ = layered_winding_layout(inner_radius, winding_width, overall, turns,
                                                          style=style, packing=packing)
    rho = wire_diameter / 2.0
    if regroup:
        return layer_grid_inductance(radii, offsets, counts, p, rho)
    r = np.repeat(radii, counts)
    z = np.concatenate([o + p * np.arange(n) for o, n in zip(offsets, counts, strict=True)])
    return coaxial_filaments_inductance(r, z, rho)


def spiral_turn_radii(inner_radius, radial_pitch, turns):
    r"""Radii of the turn centres of a flat spiral, :math:`r_k = r_0 + (k + \tfrac12)\,s`.

    Parameters
    ----------
    inner_radius : float
        :math:`r_0`, inner radius of the winding (its inside edge), m.
    radial_pitch : float
        :math:`s`, radial distance between turn centres, m.
    turns : int
        Number of turns.

    Returns
    -------
    ndarray, shape (turns,)
        Radii, m.

    Examples
    --------
    >>> from coilplan.physics.multilayer import spiral_turn_radii
    >>> spiral_turn_radii(0.01, 0.002, 3).round(4).tolist()
    [0.011, 0.013, 0.015]
    """
    return inner_radius + (np.arange(int(turns)) + 0.5) * radial_pitch


def spiral_filament_inductance(inner_radius, radial_pitch, wire_diameter, turns):
    r"""Inductance of a flat spiral as the exact sum over its turns, all in one plane.

    .. math::

        L = \sum_k L_\text{loop}(r_k, \rho) + 2\sum_{j<k} M(r_j, r_k, 0),
        \qquad r_k = r_0 + (k + \tfrac12)\,s,

    each turn a circle at its own radius (the spiral's rise per turn is
    neglected): the same sum as :func:`~coilplan.physics.loops.coaxial_filaments_inductance`
    over the turns, with Maxwell's formula in its in-plane form (:func:`_coplanar_mutual`).

    Parameters
    ----------
    inner_radius : float
        Inner radius of the winding, m.
    radial_pitch : float
        Radial distance between turn centres, m (at least the wire diameter).
    wire_diameter : float
        Bare wire diameter, m.
    turns : int
        Number of turns.

    Returns
    -------
    L : float
        Low-frequency inductance, H.

    Notes
    -----
    Exact for concentric circular filaments with the thin-ring self term; the
    real spiral's radius grows continuously, which the concentric model
    neglects (its effect is of the order of the pitch over the radius of the
    lead-in, our estimate).

    Examples
    --------
    >>> from coilplan.physics.multilayer import spiral_filament_inductance
    >>> print(f"{spiral_filament_inductance(0.02, 0.002, 0.001, 10) * 1e6:.3f} uH")
    7.540 uH
    """
    return np.float64(spiral_filament_inductances(inner_radius, radial_pitch, wire_diameter, turns)[-1])


def spiral_filament_inductances(inner_radius, radial_pitch, wire_diameter, turns):
    r"""The exact sum of :func:`spiral_filament_inductance` for 1, 2, ..., ``turns`` turns at once.

    A spiral's turns keep their radii as it grows outwards, so L(n) = Σ_{k<n} [L_loop(r_k) +
    2 Σ_{i<k} M(r_i, r_k, 0)]: one pass over the pairs gives every turn count up to ``turns``.

    Returns
    -------
    ndarray, shape (turns,)
        L at 1 .. ``turns`` turns, H.

    Examples
    --------
    >>> from coilplan.physics.multilayer import spiral_filament_inductances
    >>> print(f"{spiral_filament_inductances(0.02, 0.002, 0.001, 10)[-1] * 1e6:.3f} uH")
    7.540 uH
    """
    r = spiral_turn_radii(inner_radius, radial_pitch, turns)
    rows = loop_self_inductance(r, wire_diameter / 2.0) + 2.0 * _coplanar_row_sums(r)
    return np.cumsum(rows)


#: Rows of the pair triangle handled at once by :func:`_coplanar_row_sums` (bounds the temporaries).
_COPLANAR_BLOCK = 256


def _coplanar_mutual(inner, outer):
    r"""Maxwell's M of two coplanar coaxial circles, radii ``inner`` < ``outer`` (arrays that broadcast).

    In the plane the Landen form of :func:`~coilplan.physics.loops.coaxial_mutual_inductance`
    reduces to :math:`M = 2\mu_0 b\,[K(t^2) - E(t^2)]`, t = a/b (a < b): r1 + r2 = 2b and
    k1 = a/b. K comes from the complementary parameter 1 − t² = (b − a)(b + a)/b², exact for
    neighbouring turns; below t² = 0.1, where K − E would cancel, K − E = (m/3)·R_D(0, 1 − m, 1)
    (Carlson, DLMF 19.25.1) as in the general kernel. Within a few parts in 10^15 of that kernel
    for a whole spiral, and about twice as fast (scipy's K and E against R_D).
    """
    inner, outer = np.broadcast_arrays(np.asarray(inner, dtype=float), np.asarray(outer, dtype=float))
    m = (inner / outer) ** 2
    complement = (outer - inner) * (outer + inner) / outer**2
    difference = ellipkm1(complement)
    difference -= ellipe(m)
    small = np.flatnonzero(m < 0.1)
    if small.size:
        flat = difference.reshape(-1)
        flat[small] = m.reshape(-1)[small] / 3.0 * elliprd(0.0, complement.reshape(-1)[small], 1.0)
    difference *= 2.0 * mu_0
    difference *= outer
    return difference


def _coplanar_row_sums(radii: np.ndarray) -> np.ndarray:
    """s_j = Σ_{i<j} M(r_i, r_j, 0) over coplanar circles of increasing radius, by blocks of rows."""
    sums = np.zeros(radii.size)
    for start in range(1, radii.size, _COPLANAR_BLOCK):
        stop = min(start + _COPLANAR_BLOCK, radii.size)
        # the rectangle of rows [start, stop) against the columns below the block, then the block's triangle
        sums[start:stop] = np.sum(_coplanar_mutual(radii[None, :start], radii[start:stop, None]), axis=1)
        rows, columns = np.tril_indices(stop - start, -1)
        np.add.at(sums, start + rows, _coplanar_mutual(radii[start + columns], radii[start + rows]))
    return sums


def spiral_self_capacitance(inner_radius, radial_pitch, wire_diameter, turns, permittivity=1.0):
    r"""Rough self-capacitance of a flat spiral from the capacitance of adjacent turns.

    .. math::

        C_{self} \approx \frac{1}{N^2}\sum_{k=0}^{N-2} c'\,2\pi\,\frac{r_k + r_{k+1}}{2},
        \qquad c' = \frac{\pi\varepsilon_0\varepsilon_r}{\operatorname{arcosh}(s/d)},

    Parameters
    ----------
    inner_radius : float
        Inner radius of the winding, m.
    radial_pitch : float or array_like
        :math:`s`, radial distance between turn centres, m.
    wire_diameter : float
        :math:`d`, bare wire diameter, m.
    turns : float or array_like
        :math:`N`, turns (float allowed: the sum is evaluated in closed form).
    permittivity : float
        Effective relative permittivity between turns (1 for air).

    Returns
    -------
    C : float or ndarray
        Capacitance, F, an estimate; NaN where ``s <= d``.

    Notes
    -----
    A rough estimate (our derivation, no published accuracy; expect errors up
    to a factor of two): :math:`c'` is the exact capacitance per length of two
    parallel round wires in a uniform dielectric [Ramo1994]_, and with the voltage :math:`V/N` between adjacent
    turns the :math:`N - 1` gaps store :math:`\tfrac12 C_{self} V^2`.
    Capacitance between non-adjacent turns and to nearby objects is left out.

    References
    ----------
    .. [Ramo1994] S. Ramo, J. R. Whinnery and T. Van Duzer, *Fields and Waves in
       Communication Electronics*, 3rd ed., Wiley, 1994 (two parallel cylinders).

    Examples
    --------
    >>> from coilplan.physics.multilayer import spiral_self_capacitance
    >>> print(f"{spiral_self_capacitance(0.02, 0.002, 0.001, 10) * 1e12:.3f} pF")
    0.358 pF
    """
    N = _as_float(turns)
    s = _as_float(radial_pitch)
    with np.errstate(divide="ignore", invalid="ignore"):
        per_length = np.pi * epsilon_0 * permittivity / np.arccosh(s / wire_diameter)
        gaps = np.maximum(N - 1.0, 0.0)
        # sum over k < N - 1 of (r_k + r_{k+1})/2 = r0 + (k + 1) s, in closed form
        radius_sum = gaps * inner_radius + s * gaps * (gaps + 1.0) / 2.0
        C = per_length * 2.0 * np.pi * radius_sum / N**2
    return np.where(s > wire_diameter, C, np.nan)[()]

