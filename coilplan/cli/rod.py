"""``coilplan rod``: a coil on a ferrite rod, forward or inverse, calibrated by a reading if given."""

from __future__ import annotations

import warnings

import click

from coilplan.cli._common import captured_warnings, json_option, plot_option
from coilplan.cli._cored import LENGTH, core_at_frequency, core_options, drive_arguments, finish_cored, resolve_core
from coilplan.cli._measured import (
    calibrate_form,
    conditions_from,
    measurement_options,
    resolve_target,
    tuning_options,
)
from coilplan.cli._types import QuantityType
from coilplan.cli.solenoid import one_of
from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.forms import RodCoil
from coilplan.report.cored_text import rod_lines
from coilplan.results.cored import rod_result
from coilplan.wire import parse_wire

__all__ = ["rod"]

_UNCALIBRATED = ("the rod model is uncalibrated: expect tens of percent from a real rod; wind a few test "
                 "turns, measure, and give --measured L@N for an answer to trim by")


@click.command()
@click.option("--rod-length", type=LENGTH, required=True, help="Length of the ferrite rod.")
@click.option("--rod-diameter", type=LENGTH, required=True, help="Diameter of the rod.")
@click.option("--former", type=LENGTH, help="Outside diameter of a former round the rod; default wound on the rod.")
@click.option("--pitch", type=LENGTH, help="Distance between turn centres; default close wound.")
@click.option("--coil-length", type=LENGTH, help="Fixed winding length to spread the turns over.")
@click.option("--position", type=QuantityType("m", allow_zero=True, allow_negative=True), default="0mm",
              show_default=True, help="Offset of the coil's centre from the rod's centre.")
@click.option("--max-length", type=LENGTH, help="Usable winding length; default the rod's length.")
@core_options
@measurement_options
@tuning_options
@plot_option
@json_option
def rod(rod_length, rod_diameter, former, pitch, coil_length, position, max_length, turns, target, wire_text,
        grade, overall, mu, material, al, measured, loss_factor, measured_q, bsat, current, ac_current, ac_voltage,
        frequency,
        temperature, lead, meter_freq, tolerance, self_capacitance, turns_uncertainty,
        target_frequency, tuning_capacitance,
        plot_path,
        as_json):
    """Coil on a ferrite rod: the rod's apparent permeability from a cylinder's demagnetising
    factor, and the coil's length, diameter and position on the rod.

    The model is rough (tens of percent) until calibrated: give --measured L@N from a test
    winding and the answer is scaled to it, keeping how L changes as the winding grows.
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    one_of(("--turns", turns), ("--target", target))
    if al is not None:
        raise InvalidInputError("--al", "no AL value for a rod (the winding's length matters): use --measured", None)
    core = resolve_core(mu=mu, material=material, al=None, measured=None, bsat=bsat, temperature=temperature)
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    drive = drive_arguments(current, ac_current, ac_voltage, frequency)
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)

    def build(_):
        return RodCoil(rod_length=rod_length, rod_diameter=rod_diameter, mu_initial=core.mu_r, wire=wire,
                       former_diameter=former, pitch=pitch, coil_length=coil_length, position=position,
                       max_length=max_length, saturation_flux_density=core.saturation_flux_density, lead=lead)

    with captured_warnings() as warnings_:
        form, readings = calibrate_form(build, measured, conditions, "scale")
        form = core_at_frequency(form, core, mu=form.mu_initial, loss_factor=loss_factor, frequency=frequency,
                                 reference_frequency=meter_freq if measured else None,
                                 measured_q=measured_q, readings=measured, temperature_C=temperature)
        if readings is None:
            warnings.warn(_UNCALIBRATED, OutsideValidityWarning, stacklevel=1)
        result = rod_result(form, turns=turns, target=target, temperature_C=temperature, measured=readings, **drive)
    finish_cored("rod", form=form, result=result, core=core, plot_path=plot_path, frequency=frequency,
                 temperature=temperature, title="coil on a rod", unknown_core=False,
                 tuned=target_frequency is not None, warnings_=warnings_, as_json=as_json, render=rod_lines)
