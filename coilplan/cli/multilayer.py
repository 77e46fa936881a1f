"""``coilplan multilayer``: a multilayer air-core coil on a former or bobbin, forward or inverse."""

from __future__ import annotations

import click

from coilplan.cautions import tuned_circuit_cautions
from coilplan.cli._common import captured_warnings, context_inputs, draw_impedance_plot, emit, json_option, plot_option
from coilplan.cli._measured import (
    calibrate_form,
    coil_options,
    conditions_from,
    measurement_options,
    resolve_target,
    tuning_options,
)
from coilplan.cli._types import QuantityType
from coilplan.cli.solenoid import one_of
from coilplan.forms import MULTILAYER_METHODS, MultilayerCoil
from coilplan.report.coils_text import multilayer_lines
from coilplan.results import multilayer_result
from coilplan.wire import parse_wire

__all__ = ["multilayer"]

LENGTH = QuantityType("m")


@click.command()
@coil_options
@click.option("--former", type=LENGTH, required=True, help="Outside diameter of the former or bobbin core, e.g. 10mm.")
@click.option("--width", type=LENGTH, required=True, help="Axial winding width between the cheeks, e.g. 8mm.")
@click.option("--style", type=click.Choice(["layered", "staggered"]), default="layered", show_default=True,
              help="Turns directly above turns, or every second layer in the grooves (orthocyclic).")
@click.option("--packing", type=click.FloatRange(min=1.0, max=2.0), default=1.0, show_default=True,
              help="Stretch of the pitches for hand winding (common practice: 1.05-1.1 careful, 1.15-1.2 random).")
@click.option("--max-depth", type=LENGTH, help="Radial depth of the bobbin window; the build must fit it.")
@click.option("--method", type=click.Choice(list(MULTILAYER_METHODS)), default="filament", show_default=True,
              help="Exact turn-by-turn sum, or Wheeler's 1928 approximation.")
@measurement_options
@tuning_options
@plot_option
@json_option
def multilayer(turns, target, former, width, wire_text, grade, overall, style, packing, max_depth, lead,
               temperature, method, measured, frequency, meter_freq, tolerance, self_capacitance,
               turns_uncertainty, target_frequency, tuning_capacitance, plot_path, as_json):
    """Multilayer air-core coil: layers of turns across a fixed width.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns. The exact method sums every turn as a circle at its own
    radius and axial position; Wheeler's figure is shown beside it.
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    one_of(("--turns", turns), ("--target", target))
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)

    def build(_):
        return MultilayerCoil(former_diameter=former, width=width, wire=wire, style=style, packing=packing,
                              max_depth=max_depth, lead=lead, method=method)

    with captured_warnings() as warnings_:
        form, readings = calibrate_form(build, measured, conditions, "scale")
        result = multilayer_result(form, turns=turns, target=target, temperature_C=temperature,
                                   measured=readings, frequency=frequency)
    draw_impedance_plot(plot_path, form, result, frequency, temperature, f"multilayer coil, {result['turns']} turns")
    emit(command="multilayer", as_json=as_json, inputs=context_inputs(), result=result, warnings_=warnings_,
         cautions=tuned_circuit_cautions(target_frequency is not None), render=multilayer_lines)
