r"""L and C0 of a coil from resonances with known capacitors.

:func:`fit_resonances`: the coil resonated with known capacitors C_i at f_i. Since
1/ω² = L·(C + C0) is a straight line in C, a weighted least-squares line gives L (the slope)
and C0, the stray plus self-capacitance across the coil (intercept/slope). It returns a frozen
:class:`ResonanceFit` with ``as_dict()`` (the ``result`` object of ``coilplan tank --json``).

=================  ===================  ==============================================
symbol             parameter            meaning
=================  ===================  ==============================================
L                  (fitted)             inductance, H
C_i, f_i           ``points``           known capacitor and the resonance read with it
C0                 (fitted)             stray plus self-capacitance across the coil, F
t                  ``tolerance``        relative accuracy of each frequency reading
=================  ===================  ==============================================
"""

from __future__ import annotations

import math
from collections.abc import Sequence
from dataclasses import dataclass, field

import numpy as np

from coilplan.errors import InvalidInputError
from coilplan.physics import resonance as rs
from coilplan.tank_values import _f

__all__ = ["DEFAULT_FREQUENCY_TOLERANCE", "ResonanceFit", "fit_resonances"]

#: Relative accuracy assumed for each resonance reading when none is given: a peak found with a
#: signal generator and read on a counter (common practice, no source); a dip meter's dial is worse.
DEFAULT_FREQUENCY_TOLERANCE = 0.005

_ONE_POINT = "two resonances or more: one gives only L·(C + C0)"


@dataclass(frozen=True)
class ResonanceFit:
    """L and C0 of a coil fitted to resonances with known capacitors.

    Attributes
    ----------
    inductance, inductance_uncertainty : float
        L and its standard uncertainty, H.
    stray, stray_uncertainty : float
        C0 (stray plus the coil's self-capacitance) and its standard uncertainty, F.
    capacitances, frequencies : tuple of float
        The readings (C_i in F, f_i in Hz), in the order given.
    fitted_frequencies : tuple of float
        1/(2π√(L(C_i + C0))), Hz (NaN where C_i + C0 <= 0).
    tolerance : float
        Relative accuracy of each frequency reading used for the weights.
    chi_square : float
        Σ ((y_i − ŷ_i)/σ_i)² with y = 1/ω².
    degrees_of_freedom : int
        Readings less two.
    uncertainty_scale : float
        √(χ²/ν) when above 1 (the points scatter more than the tolerance allows), else 1.
    warnings, assumptions : tuple of str
    """

    inductance: float
    inductance_uncertainty: float
    stray: float
    stray_uncertainty: float
    capacitances: tuple[float, ...]
    frequencies: tuple[float, ...]
    fitted_frequencies: tuple[float, ...]
    tolerance: float
    chi_square: float
    degrees_of_freedom: int
    uncertainty_scale: float
    warnings: tuple[str, ...] = ()
    assumptions: tuple[str, ...] = field(default=())

    @property
    def residuals(self) -> tuple[float, ...]:
        """Reading less fitted frequency, Hz."""
        return tuple(f - g for f, g in zip(self.frequencies, self.fitted_frequencies, strict=True))

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan tank --json`` for a fit to resonances."""
        points = []
        for c, f, g, r in zip(self.capacitances, self.frequencies, self.fitted_frequencies, self.residuals,
                              strict=True):
            points.append({"capacitance_F": c, "frequency_Hz": f, "fitted_frequency_Hz": g, "residual_Hz": r,
                           "residual_relative": r / g if g > 0 else None})
        return {
            "mode": "resonance-fit",
            "inductance_H": self.inductance,
            "inductance_uncertainty_H": self.inductance_uncertainty,
            "stray_capacitance_F": self.stray,
            "stray_capacitance_uncertainty_F": self.stray_uncertainty,
            "tolerance": self.tolerance,
            "chi_square": self.chi_square,
            "degrees_of_freedom": self.degrees_of_freedom,
            "uncertainty_scale": self.uncertainty_scale,
            "points": points,
            "assumptions": list(self.assumptions),
        }


def _point_text(capacitance: float, frequency: float) -> str:
    return f"{_f(capacitance, 'F')} @ {_f(frequency, 'Hz')}"


def fit_resonances(points: Sequence[tuple[float, float]], tolerance: float | None = None) -> ResonanceFit:
    r"""Fit a coil's L and the capacitance C0 across it to resonances with known capacitors.

    .. math::

        \frac{1}{\omega_i^2} = L\,C_i + L\,C_0,\qquad \sigma_i = 2t\,\frac{1}{\omega_i^2}

    a straight line in C_i, fitted by weighted least squares: slope L, intercept L·C0. A relative
    error t in f_i is a relative error 2t in 1/ω_i².

    Parameters
    ----------
    points : sequence of (float, float)
        (C_i in F, f_i in Hz): a known capacitor across the coil and the frequency at which the
        pair resonated. Two or more, with at least two different capacitors.
    tolerance : float, optional
        Relative accuracy t of each frequency reading, taken as its standard uncertainty (default
        :data:`DEFAULT_FREQUENCY_TOLERANCE`, an assumption, stated in ``assumptions``).

    Returns
    -------
    ResonanceFit
        L and C0 with standard uncertainties from the fit's covariance, (AᵀWA)⁻¹, propagated to
        C0 = (L·C0)/L; both scaled up by √(χ²/ν) when the points scatter more than ``tolerance``.

    Raises
    ------
    InvalidInputError
        One reading; all with the same capacitor; a reading not above zero; readings whose
        frequency does not fall as the capacitance rises (a slope L of zero or less).

    Notes
    -----
    C0 is everything across the coil besides the known capacitor: its self-capacitance and the
    stray of the leads and test jig. The model takes L as the same at every frequency, which
    holds for an air coil well below its self-resonance, and less well for a cored coil whose
    permeability changes with frequency. With two readings the line passes through both and the
    residuals are zero: a third reading checks them. Warnings name a C0 below zero and a worst
    point more than 2t off the line.

    Examples
    --------
    >>> import math
    >>> def f(c): return 1 / (2 * math.pi * math.sqrt(200e-6 * (c + 12e-12)))
    >>> fit = fit_resonances([(100e-12, f(100e-12)), (470e-12, f(470e-12))], tolerance=0.005)
    >>> round(fit.inductance * 1e6, 6), round(fit.stray * 1e12, 6)
    (200.0, 12.0)
    """
    points = [tuple(point) for point in points]
    if len(points) < 2:
        raise InvalidInputError("points", _ONE_POINT)
    assumptions = []
    if tolerance is None:
        tolerance = DEFAULT_FREQUENCY_TOLERANCE
        assumptions.append(f"each resonance read within ±{tolerance:.1%}: an assumed figure for a peak found with a "
                           "signal generator and read on a counter; give --tolerance (a dip meter's dial is worse)")
    tolerance = float(tolerance)
    if not 0 < tolerance < 0.5:
        raise InvalidInputError("tolerance", "a relative tolerance above 0 % and below 50 %", f"{tolerance:.6g}")
    capacitance = np.array([point[0] for point in points], dtype=float)
    frequency = np.array([point[1] for point in points], dtype=float)
    for c, f in points:
        if not (math.isfinite(c) and math.isfinite(f) and c > 0 and f > 0):
            raise InvalidInputError("points", "a known capacitor above zero and a frequency above zero",
                                    f"{c:.6g}F@{f:.6g}Hz")
    if np.ptp(capacitance) <= 1e-9 * capacitance.max():
        raise InvalidInputError("points", "resonances with at least two different capacitors (one capacitor "
                                "gives only L·(C + C0))")
    y = 1.0 / (2.0 * np.pi * frequency) ** 2
    sigma = 2.0 * tolerance * y
    # fit in scaled units (x / max x, y / max y) so that the 2×2 normal equations are well conditioned
    x_scale, y_scale = capacitance.max(), y.max()
    xs, ys, ss = capacitance / x_scale, y / y_scale, sigma / y_scale
    design = np.column_stack([np.ones_like(xs), xs]) / ss[:, None]
    covariance = np.linalg.inv(design.T @ design)
    intercept_s, slope_s = covariance @ (design.T @ (ys / ss))
    L = slope_s * y_scale / x_scale
    if not L > 0:
        raise InvalidInputError("points", "readings whose frequency falls as the capacitance rises (these give "
                                "an inductance of zero or less): check which capacitor went with which reading")
    intercept = intercept_s * y_scale
    c0 = intercept / L
    chi_square = float(np.sum(((y - intercept - L * capacitance) / sigma) ** 2))
    dof = len(points) - 2
    scale = max(1.0, math.sqrt(chi_square / dof)) if dof > 0 else 1.0
    var_l = covariance[1, 1] * (y_scale / x_scale) ** 2
    var_a = covariance[0, 0] * y_scale**2
    cov_al = covariance[0, 1] * y_scale**2 / x_scale
    var_c0 = var_a / L**2 + (intercept / L**2) ** 2 * var_l - 2.0 * intercept / L**3 * cov_al
    u_l = scale * math.sqrt(var_l)
    u_c0 = scale * math.sqrt(max(var_c0, 0.0))
    with np.errstate(invalid="ignore", divide="ignore"):
        fitted = np.where(capacitance + c0 > 0, rs.resonant_frequency(L, np.maximum(capacitance + c0, 0.0)), np.nan)

    warnings_ = []
    if c0 < 0:
        near_zero = " (within twice its uncertainty of zero: too small to resolve with these capacitors)" \
            if -c0 <= 2.0 * u_c0 else ""
        warnings_.append(f"the fitted stray C0 = {_f(c0, 'F', 3)} ± {_f(u_c0, 'F', 2)} is below zero{near_zero}: "
                         "a reading or a capacitor's value is off; check the capacitors on a meter and read each "
                         "resonance at its peak")
    elif u_c0 > 0.5 * c0:
        warnings_.append(f"C0 = {_f(c0, 'F', 3)} is known only to ± {_f(u_c0, 'F', 2)}: a reading with a smaller "
                         "capacitor (nearer C0) pins it better")
    relative = (frequency - fitted) / fitted
    if dof > 0 and np.all(np.isfinite(relative)):
        worst = int(np.argmax(np.abs(relative)))
        if abs(relative[worst]) > 2.0 * tolerance:
            worst_text = _point_text(capacitance[worst], frequency[worst])
            warnings_.append(f"the points do not lie on one line within twice the ±{tolerance:.2%} tolerance: the "
                             f"worst, {worst_text}, is {relative[worst]:+.2%} off it (a reading or a capacitor's "
                             "value is off, or the coil's L changes between the frequencies)")
    elif dof > 0:
        warnings_.append("some points lie where C + C0 is below zero: the readings do not follow 1/ω² = L·(C + C0)")
    if dof == 0:
        assumptions.append("two resonances fix the line exactly, so the residuals are zero: a third reading "
                           "checks them")
    if scale > 1.0:
        assumptions.append(f"the points scatter more than the tolerance allows: the uncertainties are scaled up by "
                           f"√(χ²/ν) = {scale:.3g}")
    assumptions.append("uncertainties are one standard deviation, from each reading's tolerance taken as its standard "
                       "uncertainty; the capacitors' own values are taken as exact")
    return ResonanceFit(
        inductance=float(L), inductance_uncertainty=float(u_l), stray=float(c0), stray_uncertainty=float(u_c0),
        capacitances=tuple(float(c) for c in capacitance), frequencies=tuple(float(f) for f in frequency),
        fitted_frequencies=tuple(float(g) for g in fitted), tolerance=tolerance, chi_square=chi_square,
        degrees_of_freedom=dof, uncertainty_scale=scale, warnings=tuple(warnings_), assumptions=tuple(assumptions))
