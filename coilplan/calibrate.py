r"""Calibration from measurements: the AL value a closed core's readings imply.

For a closed core L = AL·N², so each reading (L_i, N_i) gives AL_i = L_i/N_i².
Several readings are fitted by weighted least squares in relative terms
(each reading counts by its relative error, as a meter's accuracy is stated):

.. math::

    \min_{A_L} \sum_i \left(\frac{L_i - A_L N_i^2}{L_i}\right)^2
    \;\Rightarrow\; A_L = \frac{\sum_i N_i^2/L_i}{\sum_i N_i^4/L_i^2}
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from coilplan.errors import InvalidInputError

__all__ = ["AlFit", "ScaleFit", "ScaledForm", "fit_al", "fit_scale"]


@dataclass(frozen=True)
class AlFit:
    """An AL value fitted to readings, with each reading's relative residual.

    Attributes
    ----------
    al : float
        H per turn².
    residuals : tuple of float
        (L_i − AL·N_i²)/L_i for each reading, in the order given.
    """

    al: float
    residuals: tuple[float, ...]


def fit_al(measurements) -> AlFit:
    """Fit L = AL·N² to readings ``[(L, N), ...]`` (H, turns).

    Examples
    --------
    >>> fit = fit_al([(120e-6, 36)])
    >>> round(fit.al * 1e9, 3)  # nH per turn²
    92.593
    """
    points = list(measurements)
    if not points:
        raise InvalidInputError("--measured", "at least one reading inductance@turns", None)
    inductance = np.array([point[0] for point in points], dtype=float)
    turns = np.array([point[1] for point in points], dtype=float)
    if len(set(turns.tolist())) != len(turns):
        raise InvalidInputError("--measured", "readings at different turn counts", None)
    al = float(np.sum(turns**2 / inductance) / np.sum(turns**4 / inductance**2))
    residuals = tuple(float(v) for v in (inductance - al * turns**2) / inductance)
    return AlFit(al, residuals)


@dataclass(frozen=True)
class ScaleFit:
    """A scale factor k fitted so that k·L_model(N) matches readings, with relative residuals.

    Attributes
    ----------
    factor : float
        k, dimensionless (1 means the model was right).
    residuals : tuple of float
        (L_i − k·L_model(N_i))/L_i for each reading, in the order given.
    """

    factor: float
    residuals: tuple[float, ...]


def fit_scale(form, measurements) -> ScaleFit:
    r"""Fit a scale factor on a form's model to readings ``[(L, N), ...]``.

    .. math::

        \min_k \sum_i \left(\frac{L_i - k\,L_m(N_i)}{L_i}\right)^2
        \;\Rightarrow\; k = \frac{\sum_i L_m(N_i)/L_i}{\sum_i L_m(N_i)^2/L_i^2}

    For an air coil or a rod coil the model's shape (how L changes with the
    turns through the winding's length and position) is kept and only its level
    is corrected; for a closed core this is the AL fit.

    Examples
    --------
    >>> class Square:
    ...     def inductance(self, turns):
    ...         return 1e-9 * np.asarray(turns, dtype=float) ** 2
    >>> round(fit_scale(Square(), [(2e-6, 40)]).factor, 6)
    1.25
    """
    points = list(measurements)
    if not points:
        raise InvalidInputError("--measured", "at least one reading inductance@turns", None)
    inductance = np.array([point[0] for point in points], dtype=float)
    turns = np.array([point[1] for point in points], dtype=float)
    if len(set(turns.tolist())) != len(turns):
        raise InvalidInputError("--measured", "readings at different turn counts", None)
    model = np.asarray(form.inductance(turns), dtype=float)
    factor = float(np.sum(model / inductance) / np.sum(model**2 / inductance**2))
    residuals = tuple(float(v) for v in (inductance - factor * model) / inductance)
    return ScaleFit(factor, residuals)


@dataclass(frozen=True)
class ScaledForm:
    """A form whose inductance is its model's times a fitted factor; all else delegates.

    Parameters
    ----------
    form : CoilForm
        The uncalibrated form.
    factor : float
        The scale factor from :func:`fit_scale`.
    """

    form: object
    factor: float

    def inductance(self, turns):
        return self.factor * np.asarray(self.form.inductance(turns), dtype=float)

    def __getattr__(self, name):
        return getattr(self.form, name)
