"""Monotone piecewise-cubic Hermite interpolation (PCHIP), small enough to own.

The same construction as ``scipy.interpolate.PchipInterpolator`` (Fritsch & Butland's weighted
harmonic mean of the neighbouring secants at interior points, the three-point end formula with
Fritsch & Carlson's limits), written here so that interpolating a short table does not import
``scipy.interpolate`` (and with it ``scipy.optimize`` and ``scipy.spatial``) on every command.

References
----------
.. [FritschCarlson1980] F. N. Fritsch and R. E. Carlson, "Monotone piecewise cubic
   interpolation", SIAM J. Numer. Anal., vol. 17, no. 2, pp. 238-246, 1980.
.. [FritschButland1984] F. N. Fritsch and J. Butland, "A method for constructing local
   monotone piecewise cubic interpolants", SIAM J. Sci. Stat. Comput., vol. 5, no. 2,
   pp. 300-304, 1984.
"""

from __future__ import annotations

import numpy as np

__all__ = ["pchip_evaluate", "pchip_slopes"]


def _end_slope(h0, h1, m0, m1):
    slope = ((2.0 * h0 + h1) * m0 - h0 * m1) / (h0 + h1)
    if np.sign(slope) != np.sign(m0):
        return 0.0
    if np.sign(m0) != np.sign(m1) and abs(slope) > abs(3.0 * m0):
        return 3.0 * m0
    return slope


def pchip_slopes(x: np.ndarray, y: np.ndarray) -> np.ndarray:
    """Slopes at the knots of the monotone cubic through (x, y); x strictly increasing, 3 points or more."""
    h = np.diff(x)
    m = np.diff(y) / h
    slopes = np.zeros_like(y)
    same_sign = (m[:-1] * m[1:]) > 0
    w1 = 2.0 * h[1:] + h[:-1]
    w2 = h[1:] + 2.0 * h[:-1]
    with np.errstate(divide="ignore", invalid="ignore"):
        harmonic = (w1 + w2) / (w1 / m[:-1] + w2 / m[1:])
    slopes[1:-1] = np.where(same_sign, harmonic, 0.0)
    slopes[0] = _end_slope(h[0], h[1], m[0], m[1])
    slopes[-1] = _end_slope(h[-1], h[-2], m[-1], m[-2])
    return slopes


def pchip_evaluate(x: np.ndarray, y: np.ndarray, slopes: np.ndarray, points) -> np.ndarray:
    """Evaluate the cubic Hermite interpolant at ``points`` (clipped to [x[0], x[-1]])."""
    points = np.clip(np.asarray(points, dtype=float), x[0], x[-1])
    index = np.clip(np.searchsorted(x, points, side="right") - 1, 0, x.size - 2)
    h = x[index + 1] - x[index]
    t = (points - x[index]) / h
    t2, t3 = t * t, t * t * t
    return ((2 * t3 - 3 * t2 + 1) * y[index] + (t3 - 2 * t2 + t) * h * slopes[index]
            + (-2 * t3 + 3 * t2) * y[index + 1] + (t3 - t2) * h * slopes[index + 1])
