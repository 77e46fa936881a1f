r"""The measured coil: readings, their frequency correction, and the calibration of a model to them.

A reading ``L@N`` is what the meter shows at its test frequency. Near
self-resonance that is the apparent inductance, not the coil's own:

.. math::

    L_{app} = \frac{L}{1 - \omega^2 L C_{self}}
    \quad\Longleftrightarrow\quad
    L = \frac{L_{app}}{1 + \omega^2 L_{app} C_{self}}

so each reading is first brought back to the low-frequency L at the meter
frequency, and the form's model is calibrated to those values: a closed core's AL
(:func:`closed_core_fit`) or a scale factor on a model (:func:`scale_fit`). The turns to add or
remove, their range and words are in :mod:`coilplan.rewind_answer`.
"""

from __future__ import annotations

from dataclasses import dataclass, field

import numpy as np

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.physics.frequency import self_resonant_frequency
from coilplan.quantities import format_quantity
from coilplan.request import DEFAULT_TOLERANCE

__all__ = [
    "DEFAULT_TOLERANCE",
    "SRF_FRACTION",
    "Conditions",
    "Fit",
    "apparent_inductance",
    "check_readings",
    "closed_core_fit",
    "low_frequency_inductance",
    "low_frequency_readings",
    "model_fit",
    "scale_fit",
]

#: Above this fraction of the self-resonant frequency the apparent inductance departs noticeably from
#: L (by about 1/(1 − x²): 12 % at a third of the SRF). Common practice, no source.
SRF_FRACTION = 1.0 / 3.0


@dataclass(frozen=True)
class Conditions:
    """How the readings were taken and where the coil will work.

    Attributes
    ----------
    tolerance : float
        Meter accuracy, relative (0.01 = ±1 %).
    tolerance_assumed : bool
        True when the tolerance is the default, not the user's figure.
    meter_frequency : float, optional
        The meter's test frequency, Hz.
    operating_frequency : float, optional
        The frequency the coil will work at, Hz.
    self_capacitance : float, optional
        The coil's self-capacitance, F (taken the same at every reading).
    self_capacitance_estimated : bool
        True when ``self_capacitance`` is the form's own estimate, not a value given.
    turns_uncertainty : float
        ± turns on the counts of the readings (0: counted exactly).
    """

    tolerance: float = DEFAULT_TOLERANCE
    tolerance_assumed: bool = True
    meter_frequency: float | None = None
    operating_frequency: float | None = None
    self_capacitance: float | None = None
    self_capacitance_estimated: bool = False
    turns_uncertainty: float = 0.0


@dataclass(frozen=True)
class Fit:
    """A one-parameter calibration of a model to readings.

    Attributes
    ----------
    kind : {"al", "scale"}
        The calibrated quantity: the AL value of a closed core, or a scale factor on a model.
    value : float
        AL in H per turn², or the dimensionless factor.
    residuals : tuple of float
        Relative residual of each reading, (L_i − fit)/L_i.
    scatter : float
        Standard error of the fitted value from the residuals, relative (0 for one reading).
    """

    kind: str
    value: float
    residuals: tuple[float, ...]
    scatter: float = 0.0
    extra: dict = field(default_factory=dict)


def low_frequency_inductance(apparent, frequency, capacitance):
    r"""The coil's own L from an apparent reading at ``frequency``: L = L_app/(1 + ω² L_app C).

    Examples
    --------
    >>> round(float(low_frequency_inductance(102.014e-6, 1e6, 5e-12)) * 1e6, 3)  # docs/methods.md §10
    100.0
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    apparent = np.asarray(apparent, dtype=float)
    return apparent / (1.0 + omega**2 * apparent * np.asarray(capacitance, dtype=float))


def apparent_inductance(inductance, frequency, capacitance):
    r"""The apparent inductance at ``frequency``: L/(1 − ω² L C); NaN at or above self-resonance.

    Examples
    --------
    >>> round(float(apparent_inductance(100e-6, 1e6, 5e-12)) * 1e6, 3)  # docs/methods.md §10
    102.014
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    inductance = np.asarray(inductance, dtype=float)
    denominator = 1.0 - omega**2 * inductance * np.asarray(capacitance, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(denominator > 0, inductance / denominator, np.nan)


#: A reading taken above this fraction of the coil's self-resonance is refused: there the corrected
#: L ≈ 1/(ω²C) whatever the meter shows, so the reading measures the self-capacitance, not the coil
#: (common practice, no source: a meter reads a coil well below its SRF).
UNUSABLE_SRF_FRACTION = 0.9


def low_frequency_readings(readings, conditions: Conditions) -> list[tuple[float, int]]:
    """Readings with the self-capacitance effect at the meter frequency removed.

    Raises
    ------
    InvalidInputError
        A reading whose corrected L puts the meter frequency above
        :data:`UNUSABLE_SRF_FRACTION` of the coil's self-resonance (``meter_frequency``).
    """
    if conditions.self_capacitance is None or conditions.meter_frequency is None:
        return [(float(value), int(turns)) for value, turns in readings]
    corrected = []
    for value, turns in readings:
        low = float(low_frequency_inductance(value, conditions.meter_frequency, conditions.self_capacitance))
        fraction = conditions.meter_frequency / float(self_resonant_frequency(low, conditions.self_capacitance))
        if fraction > UNUSABLE_SRF_FRACTION:
            raise InvalidInputError(
                "meter_frequency", "a test frequency well below the coil's self-resonance: "
                f"{format_quantity(value, 'H')} at {turns} turns read at "
                f"{format_quantity(conditions.meter_frequency, 'Hz')} puts it at "
                f"{fraction:.1%} of its self-resonance with {format_quantity(conditions.self_capacitance, 'F')}, "
                f"where a reading measures the capacitance, not the coil; measure at a lower frequency", None)
        corrected.append((low, int(turns)))
    return corrected


def check_readings(readings) -> None:
    """Refuse readings that cannot be used: none, repeated turn counts, or more turns reading less."""
    points = list(readings)
    if not points:
        raise InvalidInputError("readings", "at least one reading inductance@turns", None)
    counts = [turns for _, turns in points]
    if len(set(counts)) != len(counts):
        raise InvalidInputError("readings", "one reading per turn count (average repeated readings first)",
                                ", ".join(str(n) for n in counts))


def _scatter(residuals: np.ndarray, parameters: int = 1) -> float:
    """Relative standard error of a fitted level from its residuals (0 without spare readings)."""
    spare = residuals.size - parameters
    if spare <= 0:
        return 0.0
    return float(np.sqrt(np.sum(residuals**2) / spare / residuals.size))


def closed_core_fit(readings, *, offset: bool = False) -> Fit:
    r"""Fit L = AL·N² (+ L0 with ``offset``) to low-frequency readings, weighted by relative error.

    .. math::

        \min \sum_i \left(\frac{L_i - A_L N_i^2 - L_0}{L_i}\right)^2

    A series offset L0 (the leads, a few tens of nH for short leads) needs two readings or more;
    it is reported as ``extra["offset_H"]``.

    Examples
    --------
    >>> round(closed_core_fit([(55e-6, 20)]).value * 1e9, 2)  # issue 4: 20 turns at 55 µH
    137.5
    """
    check_readings(readings)
    inductance = np.array([value for value, _ in readings], dtype=float)
    turns = np.array([count for _, count in readings], dtype=float)
    if offset and inductance.size < 2:
        raise InvalidInputError("offset", "two readings or more to separate the leads from the winding", None)
    columns = [turns**2 / inductance] + ([1.0 / inductance] if offset else [])
    solution, *_ = np.linalg.lstsq(np.column_stack(columns), np.ones_like(inductance), rcond=None)
    al = float(solution[0])
    lead = float(solution[1]) if offset else 0.0
    if al <= 0:
        raise InfeasibleError("the readings give no positive AL value: more turns must read more inductance",
                              option="readings")
    residuals = (inductance - al * turns**2 - lead) / inductance
    return Fit("al", al, tuple(float(r) for r in residuals), _scatter(residuals, 1 + offset),
               {"offset_H": lead} if offset else {})


def model_fit(form, readings) -> Fit:
    r"""Fit a scale factor k on ``form``'s model: min Σ((L_i − k·L_m(N_i))/L_i)² (see :func:`scale_fit`).

    The model's shape (how L changes as the winding grows and moves on the rod or former)
    is kept; its level is set by the readings.
    """
    turns = np.array([count for _, count in readings], dtype=float)
    return scale_fit(readings, np.asarray(form.inductance(turns), dtype=float))


def scale_fit(readings, model) -> Fit:
    r"""Fit a scale factor k to readings against their model values: min Σ((L_i − k·m_i)/L_i)².

    .. math::

        k = \frac{\sum m_i/L_i}{\sum m_i^2/L_i^2}

    ``model`` holds each reading's model value, each from the winding the reading was taken on.
    """
    check_readings(readings)
    inductance = np.array([value for value, _ in readings], dtype=float)
    model = np.asarray(model, dtype=float)
    factor = float(np.sum(model / inductance) / np.sum(model**2 / inductance**2))
    residuals = (inductance - factor * model) / inductance
    return Fit("scale", factor, tuple(float(r) for r in residuals), _scatter(residuals))
