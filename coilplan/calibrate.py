r"""A form calibrated by readings: the one place where what the meter showed sets a model's level.

Three ways, chosen by what the form says of itself:

* a closed-core law (``calibration = "al"``: toroid, gapped core, a bare core of unknown geometry)
  takes its AL value from the readings, L = AL·N² (+ L0 for the leads where the form asks for it),
  :func:`coilplan.rewind.closed_core_fit`;
* a model whose shape matters (air coils, a rod) keeps its shape and takes a scale factor,
  :func:`coilplan.rewind.scale_fit`, each reading compared with the model of *its own* winding (a test
  winding of another wire, pitch or length is modelled as wound);
* a rod of unknown material (``permeability_unknown``) first takes the permeability that makes its model
  read the last reading, so the shape follows the real core; the scale factor then absorbs the rest.

Before any fit each reading is brought back to the coil's low-frequency inductance at the meter's
frequency, L = L_app/(1 + ω²L_app·C) (docs/methods.md §10), with the self-capacitance given or estimated
for the winding as it was read.
"""

from __future__ import annotations

import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING, Any

import numpy as np
from numpy.typing import ArrayLike

from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity

if TYPE_CHECKING:
    from coilplan.request import Reading, Request
    from coilplan.rewind import Conditions, Fit

__all__ = ["Measured", "ScaledForm", "calibrate", "conditions_of"]


@dataclass(frozen=True)
class ScaledForm:
    """A form whose inductance is its model's times a fitted factor; everything else delegates.

    Parameters
    ----------
    form : CoilForm
        The uncalibrated form.
    factor : float
        The scale factor from :func:`coilplan.rewind.scale_fit`.

    Examples
    --------
    >>> class Square:
    ...     def inductance(self, turns):
    ...         return 1e-9 * np.asarray(turns, dtype=float) ** 2
    ...     def max_turns(self):
    ...         return 100.0
    >>> scaled = ScaledForm(Square(), 1.25)
    >>> round(float(scaled.inductance(40)) * 1e6, 3), scaled.max_turns()
    (2.0, 100.0)
    """

    form: Any
    factor: float

    def inductance(self, turns: ArrayLike) -> Any:
        return self.factor * np.asarray(self.form.inductance(turns), dtype=float)

    def __getattr__(self, name: str) -> Any:
        return getattr(self.form, name)


@dataclass(frozen=True)
class Measured:
    """Readings of the coil (as the meter showed them), their calibration and the conditions.

    ``same_winding`` is False when the last reading was of a test winding other than the planned coil:
    then there is nothing to add or remove, only a coil to wind.
    """

    readings: list[tuple[float, int]]
    fit: Fit
    conditions: Conditions
    notices: tuple[str, ...] = ()
    same_winding: bool = True
    permeability_fitted: float | None = None


def conditions_of(request: Request, self_capacitance_estimate: float | None = None) -> Conditions:
    """The measurement conditions of a request (:class:`coilplan.rewind.Conditions`)."""
    from coilplan.rewind import Conditions

    given = request.self_capacitance
    return Conditions(tolerance=request.tolerance_or_default, tolerance_assumed=request.tolerance is None,
                      meter_frequency=request.meter_frequency, operating_frequency=request.operating_frequency,
                      self_capacitance=given if given is not None else self_capacitance_estimate,
                      self_capacitance_estimated=given is None and self_capacitance_estimate is not None,
                      turns_uncertainty=request.turns_uncertainty)


def _as_wound(form: Any, reading: Reading) -> Any:
    """The form wound as the reading's winding was (its own wire, pitch or length), else the form."""
    if not reading.own_winding:
        return form
    if not hasattr(form, "with_winding"):
        raise InvalidInputError("readings", "readings of the planned winding: this form's model does not "
                                "depend on the winding, so a test winding's wire, pitch or length is not used", None)
    return form.with_winding(wire=reading.wire, pitch=reading.pitch, winding_length=reading.winding_length)


def _within_reach(form: Any, reading: Reading) -> None:
    """Refuse a reading at more turns than its winding can hold: a miscounted turn count or the wrong form."""
    from coilplan.solve import search_turns

    limit, reason = search_turns(form)
    if reading.turns > limit + 1e-9:
        raise InvalidInputError(
            "readings", f"a reading at a turn count this coil can have, at most {limit:.0f}: "
            f"{form.limit_reason(limit) if reason is None else reason}",
            f"{format_quantity(reading.inductance, 'H')}@{reading.turns}")


def _fits(form: Any, reading: Reading) -> bool:
    from coilplan.solve import search_turns

    return bool(reading.turns <= search_turns(form)[0] + 1e-9)


def _fitted_permeability(form: Any, reading: Reading, wound: Callable[[Any], Any]) -> float:
    """The permeability with which the model of ``wound`` reads ``reading`` (ends of 1 to 1e6 if beyond)."""
    from scipy.optimize import brentq

    def excess(log_mu: float) -> float:
        model = wound(form.with_permeability(math.exp(log_mu)))
        return math.log(float(model.inductance(reading.turns)) / reading.inductance)

    low, high = 0.0, math.log(1e6)
    if excess(high) <= 0:
        return math.exp(high)
    if excess(low) >= 0:
        return 1.0
    return math.exp(float(brentq(excess, low, high, xtol=1e-10)))


def calibrate(form: Any, request: Request) -> tuple[Any, Measured | None]:
    """(calibrated form, :class:`Measured` or None): the form's level set by the request's readings.

    Raises
    ------
    InvalidInputError
        A reading beyond the winding's reach, a reading of a form that does not depend on the
        winding given with its own wire, a reading taken too near self-resonance (``meter_frequency``),
        readings that repeat a turn count.
    """
    from coilplan.apparent import has_frequency_model
    from coilplan.rewind import closed_core_fit, low_frequency_readings, scale_fit

    readings = request.readings
    if not readings:
        if getattr(form, "permeability_unknown", False):
            raise InvalidInputError(getattr(form, "permeability_field", "mu_r"),
                                    "the core's permeability, a material class, or a reading", None)
        return form, None
    law = getattr(form, "calibration", "scale") == "al"
    permeability = None
    if not law and getattr(form, "permeability_unknown", False):
        permeability = _fitted_permeability(form, readings[-1], lambda model: _as_wound(model, readings[-1]))
        form = form.with_permeability(permeability)
    wound = [_as_wound(form, reading) for reading in readings]
    notices: list[str] = []
    same_winding = not readings[-1].own_winding
    for model, reading in zip(wound, readings, strict=True):
        if not law or reading.own_winding:
            _within_reach(model, reading)
        elif same_winding and reading is readings[-1] and not _fits(model, reading):
            # a core's AL does not depend on the wire; a count the planned wire cannot hold is another winding
            same_winding = False
            notices.append(f"the {reading.turns} turns read do not fit with the planned wire: the reading was of "
                           f"another winding, so the answer is the whole winding to put on, not a change")
    estimate = None
    if request.self_capacitance is None and (request.meter_frequency or request.operating_frequency):
        last = wound[-1]
        if has_frequency_model(last):  # the winding's own estimate, as it was when read last
            estimate = float(last.self_capacitance(readings[-1].turns))
    conditions = conditions_of(request, estimate)
    pairs = [(reading.inductance, reading.turns) for reading in readings]
    low = low_frequency_readings(pairs, conditions)
    if law:
        fit_offset = getattr(form, "fit_offset", False)
        if fit_offset and len(low) < 2:
            notices.append("the lead offset is fitted from the second reading on; until then L = AL·N²")
        fit = closed_core_fit(low, offset=fit_offset and len(low) >= 2)
        if fit.extra.get("offset_H", 0.0) < 0:
            negative = fit.extra["offset_H"]
            fit = closed_core_fit(low)
            notices.append(f"the lead offset fitted below zero ({format_quantity(negative, 'H')}), which leads in "
                           f"series cannot be: it is left out and L = AL·N² is fitted to the readings")
        calibrated = form.with_al(fit.value, fit.extra.get("offset_H", 0.0))
    else:
        model = np.array([float(m.inductance(reading.turns)) for m, reading in zip(wound, readings, strict=True)])
        fit = scale_fit(low, model)
        calibrated = ScaledForm(form, fit.value)
    measured = Measured(pairs, fit, conditions, tuple(notices), same_winding=same_winding,
                        permeability_fitted=permeability)
    return calibrated, measured
