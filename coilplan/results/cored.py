"""Whole answers for cored forms: toroids and gapped cores, with the saturation check."""

from __future__ import annotations

import math
import warnings

from scipy.constants import mu_0

from coilplan.apparent import frequency_fields
from coilplan.cautions import (
    MAINS_EQUIPMENT_CLASSES,
    MAINS_VOLTAGE_V,
    hot_winding_cautions,
    mains_voltage_caution,
    salvaged_mains_caution,
)
from coilplan.errors import OutsideValidityWarning
from coilplan.forms import GappedCore, Toroid
from coilplan.results._common import Measured, turns_block, wire_fields
from coilplan.results._common import given_capacitance as _given_capacitance
from coilplan.saturation import saturation_check

__all__ = ["cored_cautions", "drive_fields", "gapped_result", "rod_result", "toroid_result"]

_UNCALIBRATED = ("the rod model is uncalibrated: expect tens of percent from a real rod; wind a few test "
                 "turns, measure, and give the reading (L@N) for an answer to trim by")


def drive_fields(form, turns: int, drive=None, frequency: float | None = None) -> dict:
    """Flux density, saturation margin, largest current and current density, as result fields."""
    from coilplan.request import Drive

    drive = Drive() if drive is None else drive
    dc_current, ac_current, ac_voltage = drive.dc_current, drive.ac_current, drive.ac_voltage
    check = saturation_check(form, turns, dc_current=dc_current, ac_current=ac_current,
                             ac_voltage=ac_voltage, frequency=frequency)
    area_mm2 = form.wire.area * 1e6
    fields = {
        "current_A": dc_current,
        "ac_current_A": ac_current,
        "flux_density_dc_T": check.flux_density_dc,
        "flux_density_ac_T": check.flux_density_ac,
        "flux_density_T": check.flux_density_peak,
        "saturation_flux_density_T": check.saturation_flux_density,
        "saturation_margin": check.margin,
        "max_current_A": check.max_dc_current,
        "near_saturation": check.near_saturation,
        # RMS current over the copper: DC plus a sine of the given amplitude
        "current_density_A_per_mm2": math.hypot(dc_current, ac_current / math.sqrt(2)) / area_mm2,
    }
    if ac_voltage is not None:
        fields["ac_voltage_V"] = ac_voltage
        fields["frequency_Hz"] = frequency
    return fields


def cored_cautions(result: dict, temperature_C: float, *, material_name: str | None = None,
                   unknown_core: bool = False) -> list[str]:
    """The cautions a cored result calls for: hot winding, saturation, mains voltage, salvaged cores.

    A core of a class mostly found in mains-powered gear, or an unknown core being
    identified from a test winding, brings the caution about salvaged equipment.
    """
    cautions = hot_winding_cautions(current_density=result.get("current_density_A_per_mm2", 0.0),
                                    temperature_C=temperature_C,
                                    near_saturation=bool(result.get("near_saturation")))
    if (result.get("ac_voltage_V") or 0.0) >= MAINS_VOLTAGE_V:
        cautions.append(mains_voltage_caution())
    if unknown_core or material_name in MAINS_EQUIPMENT_CLASSES:
        cautions.append(salvaged_mains_caution())
    return cautions


def _winding_fields(form, turns: int, temperature_C: float) -> dict:
    # the coil's own inductance at the meter's frequency; at --at the core's change is in core_inductance_ratio
    own = getattr(form, "reference_inductance", form.inductance)
    return {
        "inductance_H": float(own(turns)),
        "wire_length_m": float(form.wire_length(turns)),
        "lead_m": form.lead,
        "dc_resistance_ohm": float(form.resistance(turns, 20.0)),
        "temperature_C": float(temperature_C),
        "dc_resistance_at_temperature_ohm": float(form.resistance(turns, temperature_C)),
        "wire": wire_fields(form.wire),
    }


def toroid_result(form: Toroid, *, turns: int | None = None, target: float | None = None,
                  temperature_C: float = 20.0, measured: Measured | None = None, frequency: float | None = None,
                  drive=None) -> dict:
    """Forward or inverse answer for a toroid, with IEC 60205 parameters and the saturation check.

    Parameters
    ----------
    form : Toroid
    turns, target : int or float
        Exactly one: whole turns (forward) or a target inductance, H (inverse).
    temperature_C : float
        Working temperature for the second resistance figure, °C.
    measured : Measured, optional
        Readings of the coil as it is, for turns to add or remove (see :func:`turns_block`).
    frequency : float, optional
        The operating frequency, Hz.
    drive : Drive, optional
        The currents and voltage, for :func:`drive_fields`.

    Returns
    -------
    dict
        ``turns``, ``inductance_H``, ``al_H``, ``mu_r``, ``c1_per_m``, ``c2_per_m3``,
        ``le_m``, ``ae_m2``, ``ve_m3``, ``turns_one_layer``, ``max_turns``,
        ``wire_length_m``, ``dc_resistance_ohm``, flux-density fields, and the
        inverse's ``turns_exact`` and neighbours.
    """
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    parameters = form.effective_parameters()
    result.update(
        al_H=form.al,
        al_basis=form.al_basis,
        mu_r=form.permeability(),
        mu_r_implied=form.mu_r is None,
        inner_diameter_m=form.inner_diameter,
        outer_diameter_m=form.outer_diameter,
        height_m=form.height,
        c1_per_m=parameters["c1"],
        c2_per_m3=parameters["c2"],
        le_m=parameters["le"],
        ae_m2=parameters["ae"],
        ve_m3=parameters["ve"],
        layering=form.layers,
        chamfer_m=form.chamfer,
        turns_one_layer=form.turns_one_layer(),
        turns_window=form.turns_window(),
        max_turns=int(form.max_turns()),
        wire_per_turn_m=form.wire_per_turn(),
        **_winding_fields(form, chosen, temperature_C),
        **drive_fields(form, chosen, drive, frequency),
    )
    result.update(frequency_fields(form, chosen, frequency, temperature_C, _given_capacitance(measured)))
    return result


def gapped_result(form: GappedCore, *, turns: int | None = None, target: float | None = None,
                  temperature_C: float = 20.0, measured: Measured | None = None, frequency: float | None = None,
                  drive=None) -> dict:
    """Forward or inverse answer for a gapped core, with fringing shown separately.

    Returns
    -------
    dict
        ``turns``, ``inductance_H``, ``al_H`` (in use), ``al_no_fringing_H``,
        ``fringing_factor``, ``gap_m``, ``ae_m2``, ``le_m``, ``effective_mu``,
        ``turns_per_layer``, ``max_turns``, winding and flux-density fields.
    """
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    al = form.al_value
    factor = form.fringing_factor() if form.al is None else 1.0
    result.update(
        al_H=al,
        al_from_readings=measured is not None,
        al_no_fringing_H=al / factor,
        fringing_factor=factor,
        gap_m=form.gap,
        mu_r=form.mu_r,
        ae_m2=form.ae,
        le_m=form.le,
        effective_mu=al * form.le / (mu_0 * form.ae),
        turns_per_layer=form.turns_per_layer(),
        max_turns=None if math.isinf(form.max_turns()) else int(form.max_turns()),
        **_winding_fields(form, chosen, temperature_C),
        **drive_fields(form, chosen, drive, frequency),
    )
    result.update(frequency_fields(form, chosen, frequency, temperature_C, _given_capacitance(measured)))
    return result


def rod_result(form, *, turns: int | None = None, target: float | None = None, temperature_C: float = 20.0,
               measured: Measured | None = None, frequency: float | None = None,
                  drive=None) -> dict:
    """Forward or inverse answer for a coil on a ferrite rod.

    Parameters
    ----------
    form : RodCoil or ScaledForm of one
        The rod coil, calibrated (a :class:`~coilplan.calibrate.ScaledForm`) or not.
    measured : Measured, optional
        Readings of the coil as it is: the fit that produced the scale factor, and the
        turns to add or remove.

    Returns
    -------
    dict
        ``turns``, ``inductance_H``, ``air_inductance_H``, ``rod_permeability``,
        ``model_factor`` (1 when uncalibrated), ``coil_length_m`` (current sheet),
        ``length_m`` (winding, end to end), ``pitch_m``, ``diameter_m`` (to wire
        centres), winding and flux-density fields, and the inverse's neighbours.
    """
    if measured is None:
        warnings.warn(_UNCALIBRATED, OutsideValidityWarning, stacklevel=2)
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    factor = getattr(form, "factor", 1.0)
    result.update(
        rod_length_m=form.rod_length,
        rod_diameter_m=form.rod_diameter,
        mu_initial=form.mu_initial,
        rod_permeability=form.rod_permeability(),
        air_inductance_H=float(form.air_inductance(chosen)),
        model_factor=factor,
        calibrated=measured is not None,
        coil_length_m=float(form.sheet_length(chosen)),
        length_m=float(form.winding_length(chosen)),
        pitch_m=float(form.pitch_at(chosen)),
        diameter_m=form.coil_diameter,
        position_m=form.position,
        max_turns=math.floor(form.max_turns() + 1e-9),
        **_winding_fields(form, chosen, temperature_C),
        **drive_fields(form, chosen, drive, frequency),
    )
    if measured is not None:
        result["measured_residuals"] = list(measured.fit.residuals)
    result.update(frequency_fields(form, chosen, frequency, temperature_C, _given_capacitance(measured)))
    return result
