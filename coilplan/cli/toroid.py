"""``coilplan toroid``: a winding on a ring core, forward or inverse, with the saturation check."""

from __future__ import annotations

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
from coilplan.forms import Toroid
from coilplan.report.cored_text import toroid_lines
from coilplan.results.cored import toroid_result
from coilplan.wire import parse_wire

__all__ = ["toroid"]


@click.command()
@click.option("--od", "outer", type=LENGTH, required=True, help="Outside diameter of the ring.")
@click.option("--id", "inner", type=LENGTH, required=True, help="Inside diameter (the hole).")
@click.option("--height", type=LENGTH, required=True, help="Height (thickness) of the ring.")
@click.option("--chamfer", type=QuantityType("m", allow_zero=True), default="0mm", show_default=True,
              help="Leg of a 45° chamfer on the ring's edges.")
@click.option("--layers", type=click.Choice(["one", "many"]), default="one", show_default=True,
              help="One layer on the inside circumference, or layer on layer.")
@core_options
@measurement_options
@tuning_options
@plot_option
@json_option
def toroid(outer, inner, height, chamfer, layers, turns, target, wire_text, grade, overall, mu, material, al, measured,
           loss_factor, measured_q, bsat, current, ac_current, ac_voltage, frequency, temperature, lead, meter_freq,
           tolerance,
           self_capacitance, turns_uncertainty, target_frequency, tuning_capacitance, plot_path, as_json):
    """Ring core (toroid) of rectangular section: AL by IEC 60205, turns, fit and saturation.

    The core is given by --mu, --material, a known --al, or readings --measured L@N on a
    test winding, which also tell which generic material classes the core may be.
    --mu 1 is an air-core toroid.
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    one_of(("--turns", turns), ("--target", target))
    core = resolve_core(mu=mu, material=material, al=al, measured=measured, bsat=bsat, temperature=temperature)
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    drive = drive_arguments(current, ac_current, ac_voltage, frequency)
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)

    def build(fitted_al):
        known = fitted_al if fitted_al is not None else core.al_given
        return Toroid(inner_diameter=inner, outer_diameter=outer, height=height, wire=wire, al=known,
                      al_basis=core.basis, mu_r=core.mu_r if known is None else None,
                      saturation_flux_density=core.saturation_flux_density, layers=layers, lead=lead,
                      chamfer=chamfer)

    with captured_warnings() as warnings_:
        form, readings = calibrate_form(build, measured, conditions, "al")
        form = core_at_frequency(form, core, mu=form.permeability(), loss_factor=loss_factor, frequency=frequency,
                                 reference_frequency=meter_freq if measured else None,
                                 measured_q=measured_q, readings=measured, temperature_C=temperature)
        result = toroid_result(form, turns=turns, target=target, temperature_C=temperature, measured=readings,
                               **drive)
        if core.material_name is None and result["mu_r_implied"]:
            from coilplan.materials import materials_for_permeability

            matches = materials_for_permeability(result["mu_r"])
            result["matching_materials"] = [match.material.name for match in matches]
    finish_cored("toroid", form=form, result=result, core=core, plot_path=plot_path, frequency=frequency,
                 temperature=temperature, title="toroid", unknown_core=core.material_name is None and bool(measured),
                 tuned=target_frequency is not None, warnings_=warnings_, as_json=as_json, render=toroid_lines)
