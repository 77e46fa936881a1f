"""``coilplan spiral``: a flat spiral air-core coil, forward or inverse."""

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
from coilplan.errors import InvalidInputError
from coilplan.forms import SPIRAL_METHODS, FlatSpiral
from coilplan.report.coils_text import spiral_lines
from coilplan.results import spiral_result
from coilplan.wire import parse_wire

__all__ = ["spiral"]

LENGTH = QuantityType("m")


@click.command()
@coil_options
@click.option("--inner", type=LENGTH, required=True, help="Inside diameter of the spiral, e.g. 30mm.")
@click.option("--spacing", type=QuantityType("m", allow_zero=True),
              help="Gap between adjacent turns (0 for touching enamelled turns).")
@click.option("--outer", type=LENGTH,
              help="Largest outside diameter the turns must fit in (gap 0 when --spacing is not given).")
@click.option("--method", type=click.Choice(list(SPIRAL_METHODS)), default="filament", show_default=True,
              help="Exact turn-by-turn sum, or Wheeler's flat-spiral approximation.")
@measurement_options
@tuning_options
@plot_option
@json_option
def spiral(turns, target, inner, wire_text, grade, overall, spacing, outer, lead, temperature, method, measured,
           frequency, meter_freq, tolerance, self_capacitance, turns_uncertainty, target_frequency,
           tuning_capacitance, plot_path, as_json):
    """Flat spiral coil of round wire from an inner diameter outwards.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns. Give --spacing (the gap between turns), or --outer (the
    space available), or both.
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    one_of(("--turns", turns), ("--target", target))
    if spacing is None and outer is None:
        raise InvalidInputError("--spacing", "one of --spacing or --outer", None)
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)

    def build(_):
        return FlatSpiral(inner_diameter=inner, wire=wire, spacing=0.0 if spacing is None else spacing,
                          outer_diameter=outer, lead=lead, method=method)

    with captured_warnings() as warnings_:
        form, readings = calibrate_form(build, measured, conditions, "scale")
        result = spiral_result(form, turns=turns, target=target, temperature_C=temperature,
                               measured=readings, frequency=frequency)
    draw_impedance_plot(plot_path, form, result, frequency, temperature, f"flat spiral, {result['turns']} turns")
    emit(command="spiral", as_json=as_json, inputs=context_inputs(), result=result, warnings_=warnings_,
         cautions=tuned_circuit_cautions(target_frequency is not None), render=spiral_lines)
