"""One coil, one pipeline: a form and a request in, one answer out.

Every entry calls :func:`design`: the form commands, ``rewind``, the trim log, the kit and the Python API.
The steps, in order, each written once:

0. a form with a free part **settles** it from the request (a gapped core's gap, or a choke's turns and gap);
1. **calibrate** the form to the readings (:func:`coilplan.calibrate.calibrate`): its AL value, or a
   scale factor on its model, each reading compared with the winding it was taken on;
2. a **given self-capacitance** replaces the form's estimate (:class:`coilplan.apparent.GivenCapacitance`);
3. the **core at the operating frequency**: its permeability there and its loss
   (:func:`core_at_operating_frequency`, :mod:`coilplan.core_frequency`);
4. **solve** for the turns (the apparent inductance at the operating frequency when there is one) or
   check the turns given, and the **figures** of the form (:mod:`coilplan.results`);
5. the **cautions** the coil calls for.

Examples
--------
>>> from coilplan.forms import Solenoid
>>> from coilplan.wire import parse_wire
>>> coil = Solenoid.on_former(0.025, parse_wire("0.5mm"))
>>> answer = design(coil, Request(target=10e-6))
>>> answer.result["turns"], round(answer.result["inductance_H"] * 1e6, 2)
(18, 9.69)
"""

from __future__ import annotations

import math
import warnings
from typing import Any

from coilplan.answer import Answer
from coilplan.apparent import GivenCapacitance
from coilplan.calibrate import Measured, calibrate
from coilplan.errors import CoilplanWarning, InvalidInputError, MeasurementWarning, OutsideValidityWarning
from coilplan.quantities import format_quantity
from coilplan.request import Request

__all__ = ["Answer", "core_at_operating_frequency", "design"]


def design(form: Any, request: Request) -> Answer:
    """The one pipeline: calibrate ``form`` to the request's readings, set its core at the operating
    frequency, solve or check the turns, and gather the figures, warnings and cautions.

    Parameters
    ----------
    form : CoilForm
        An uncalibrated form (:mod:`coilplan.forms`).
    request : Request
        What is asked (:mod:`coilplan.request`).

    Raises
    ------
    InvalidInputError
        A request the form cannot use (a reading beyond its reach, an unknown core without readings).
    InfeasibleError
        A target no whole number of turns meets, or turns that do not fit.
    """
    from coilplan.results import figures_of

    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always", CoilplanWarning)
        form, request, settled = _settle(form, request)
        calibrated, measured = calibrate(form, request)
        if request.self_capacitance is not None and hasattr(calibrated, "self_capacitance"):
            calibrated = GivenCapacitance(calibrated, request.self_capacitance)
        solved = core_at_operating_frequency(calibrated, request, measured)
        _unused_frequency(solved, request)
        result = figures_of(form)(solved, turns=request.turns, target=request.wanted_inductance,
                                  temperature_C=request.temperature, measured=measured,
                                  frequency=request.operating_frequency, drive=request.drive)
        if measured is not None and measured.permeability_fitted is not None:
            result["mu_fitted"] = measured.permeability_fitted
        if measured is not None and request.core.material is None and result.get("mu_r_implied"):
            from coilplan.materials import materials_for_permeability

            result["matching_materials"] = [match.material.name for match in materials_for_permeability(result["mu_r"])]
        if measured is not None and measured.notices:
            result["notices"] = list(measured.notices)
        result.update(settled)
    texts: list[str] = []
    for item in caught:
        if issubclass(item.category, CoilplanWarning):
            if str(item.message) not in texts:
                texts.append(str(item.message))
        else:  # anything else keeps its ordinary treatment
            warnings.warn_explicit(item.message, item.category, item.filename, item.lineno)
    return Answer(solved, result, tuple(texts), tuple(_cautions(result, request, measured)), measured, request)


def _settle(form: Any, request: Request) -> tuple[Any, Request, dict[str, Any]]:
    """(form, request, fields): the form's free part set from the request, where it has one."""
    if hasattr(form, "settle"):
        settled: tuple[Any, Request, dict[str, Any]] = form.settle(request)
        return settled
    if request.turns is not None and request.target is not None:
        raise InvalidInputError("target", "either turns or a target, not both", None)
    return form, request, {}


def _unused_frequency(form: Any, request: Request) -> None:
    """Say once why an operating frequency changes nothing: a form with no self-capacitance to work with."""
    if request.operating_frequency is None or request.self_capacitance is not None or hasattr(form, "self_capacitance"):
        return
    warnings.warn(f"the operating frequency {format_quantity(request.operating_frequency, 'Hz')} changes "
                  f"nothing here: a coil of unknown geometry has no self-capacitance estimate; give the one "
                  f"measured on the coil (self-capacitance, from two resonances) to correct for it",
                  MeasurementWarning, stacklevel=2)


def _cautions(result: dict[str, Any], request: Request, measured: Measured | None) -> list[str]:
    """The safety cautions this coil calls for, each where it applies."""
    from coilplan.cautions import tuned_circuit_cautions
    from coilplan.results.cored import cored_cautions

    cautions: list[str] = []
    if "saturation_margin" in result:  # a cored coil
        unknown_core = request.core.material is None and measured is not None and "al_H" in result
        cautions += cored_cautions(result, request.temperature, material_name=request.core.material,
                                   unknown_core=unknown_core)
    return cautions + tuned_circuit_cautions(request.tuning is not None)


def core_at_operating_frequency(form: Any, request: Request, measured: Measured | None) -> Any:
    """``form`` with its core's µ' and loss at the operating frequency, when the core's material is known.

    The material is known from its class (``core.material``: the class's dispersion), a loss factor a
    data sheet gives, or a Q the meter read on the winding of the last reading (which gives the loss
    factor at the meter's frequency: :func:`coilplan.core_frequency.loss_factor_from_q`). The form is
    calibrated at the meter's frequency when readings were taken, else at 0 (the class's µi). Without
    any of them, without an operating frequency, or for an air core, the form comes back as it is.
    """
    from coilplan.core_frequency import permeability_response

    core, frequency = request.core, request.operating_frequency
    mu = _core_permeability(form)
    if frequency is None or mu is None or mu <= 1.0 or permeability_response(form) is None:
        return form
    if core.material is None and core.loss_factor is None and core.measured_q is None:
        return form
    from coilplan.core_frequency import CoreSpectrum, at_frequency
    from coilplan.materials import material as find_material
    from coilplan.materials import material_dispersion

    dispersion = material_dispersion(core.material) if core.material is not None else None
    if core.material is not None:
        high = (find_material(core.material).frequency_range or (None, None))[1]
        if high is not None and frequency > high:
            warnings.warn(f"{format_quantity(frequency, 'Hz')} is above the usual range of {core.material} "
                          f"(up to {format_quantity(high, 'Hz')}): its permeability and loss there are far from "
                          f"typical, and the core's figures are only an indication", OutsideValidityWarning,
                          stacklevel=2)
    reference = (request.meter_frequency if measured is not None else None) or 0.0
    loss_factor, source = core.loss_factor, "given"
    if core.measured_q is not None:
        loss_factor = _loss_factor_from_q(form, mu, reference, dispersion, request)
        if loss_factor is None and dispersion is None:
            return form
        source = f"from the Q reading {core.measured_q[0]:g}"
    value, at = loss_factor if loss_factor is not None else (None, None)
    if dispersion is None and value is None:
        return form
    spectrum = CoreSpectrum(mu=mu, reference_frequency=reference, dispersion=dispersion,
                            loss_factor=value, loss_factor_frequency=at, loss_factor_source=source)
    return at_frequency(form, spectrum, frequency)


def _core_permeability(form: Any) -> float | None:
    """The core's relative permeability as the form uses it (a ring's, a gap's material, a rod's µi)."""
    for name in ("permeability", "mu_r", "mu_initial"):
        value = getattr(form, name, None)
        value = value() if callable(value) else value
        if value is not None:
            return float(value)
    return None


def _loss_factor_from_q(form: Any, mu: float, reference: float, dispersion: Any,
                        request: Request) -> tuple[float, float] | None:
    """(tanδ/µi, f) from the Q read on the last reading's winding; None (with a warning) when it tells nothing."""
    from coilplan.core_frequency import CoreSpectrum, at_frequency, loss_factor_from_q

    assert request.core.measured_q is not None  # the caller's condition
    q_value, q_frequency = request.core.measured_q
    turns = int(request.readings[-1].turns)
    probe = at_frequency(form, CoreSpectrum(mu=mu, reference_frequency=reference, dispersion=dispersion,
                                            loss_factor=1e-6, loss_factor_frequency=q_frequency), q_frequency)
    copper = float(form.ac_resistance(turns, q_frequency, request.temperature))
    inductance = float(probe.inductance(turns))
    found = loss_factor_from_q(q_value, q_frequency, inductance, copper, probe.dilution,
                               probe.spectrum.mu_low_frequency)
    if found is not None:
        return found, q_frequency
    copper_q = 2 * math.pi * q_frequency * inductance / copper
    fallback = (f"the typical loss of {request.core.material} is used" if dispersion is not None
                else "it is left out")
    warnings.warn(f"the Q reading {q_value:g} at {format_quantity(q_frequency, 'Hz')} is at or above the "
                  f"copper's alone ({copper_q:.0f} by the model): the core's loss is too small to tell from "
                  f"it, and {fallback}", MeasurementWarning, stacklevel=2)
    return None
