"""``coilplan solenoid``: a single-layer air-core coil, forward or inverse."""

from __future__ import annotations

import click

from coilplan.cautions import tuned_circuit_cautions
from coilplan.cli._common import captured_warnings, context_inputs, draw_impedance_plot, emit, json_option, plot_option
from coilplan.cli._measured import (
    calibrate_form,
    coil_options,
    conditions_from,
    measurement_options,
    readings_within_reach,
    resolve_target,
    tuning_options,
)
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import SOLENOID_METHODS, Solenoid
from coilplan.report.solenoid_text import solenoid_lines
from coilplan.results import solenoid_result
from coilplan.wire import parse_wire

__all__ = ["readings_within_reach", "solenoid"]

LENGTH = QuantityType("m")

#: Largest relative permittivity taken for a former: ceramics used for coil formers are about 6 to 10,
#: plastics 2 to 4 (common practice, no source); 100 leaves room and keeps the estimate a figure.
MAX_FORMER_PERMITTIVITY = 100.0


def one_of(first: tuple[str, object], second: tuple[str, object]) -> None:
    (name_a, value_a), (name_b, value_b) = first, second
    if value_a is None and value_b is None:
        raise InvalidInputError(name_a, f"one of {name_a} or {name_b}", None)
    if value_a is not None and value_b is not None:
        raise InvalidInputError(name_a, f"either {name_a} or {name_b}, not both", None)


@click.command()
@coil_options
@click.option("--former", type=LENGTH, help="Outside diameter of the former, e.g. 25mm.")
@click.option("--diameter", type=LENGTH, help="Coil diameter to the wire centres (instead of --former).")
@click.option("--pitch", type=LENGTH, help="Distance between turn centres; default close wound.")
@click.option("--length", type=LENGTH, help="Fixed winding length to spread the turns over (instead of --pitch).")
@click.option("--max-length", type=LENGTH, help="Usable length of the former; the winding must fit.")
@click.option("--method", type=click.Choice(list(SOLENOID_METHODS)), default="nagaoka-rosa",
              show_default=True, help="Inductance method (see the README for accuracy).")
@click.option("--former-permittivity", type=click.FloatRange(min=1.0, max=MAX_FORMER_PERMITTIVITY), default=1.0,
              show_default=True,
              help="Relative permittivity of the former, for the self-capacitance (solid polystyrene about 2.5).")
@measurement_options
@tuning_options
@plot_option
@json_option
def solenoid(turns, target, former, diameter, wire_text, grade, overall, pitch, length, max_length,
             lead, temperature, method, measured, frequency, former_permittivity, meter_freq, tolerance,
             self_capacitance, turns_uncertainty, target_frequency, tuning_capacitance, plot_path, as_json):
    """Single-layer air-core coil on a round former.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns to wind, with the inductance of the whole numbers either side.
    The coil diameter is to the wire centres: former + overall wire diameter.
    """
    target, frequency = resolve_target(target, target_frequency, tuning_capacitance, frequency)
    one_of(("--turns", turns), ("--target", target))
    one_of(("--former", former), ("--diameter", diameter))
    wire = parse_wire(wire_text, grade=grade, overall=overall, option="--wire")
    coil_diameter = diameter if diameter is not None else former + wire.overall_diameter
    conditions = conditions_from(tolerance=tolerance, meter_freq=meter_freq, at=frequency,
                                 self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)

    def build(_):
        return Solenoid(diameter=coil_diameter, wire=wire, pitch=pitch, length=length,
                        max_length=max_length, lead=lead, method=method, former_permittivity=former_permittivity)

    with captured_warnings() as warnings_:
        form, readings = calibrate_form(build, measured, conditions, "scale")
        result = solenoid_result(form, turns=turns, target=target, temperature_C=temperature,
                                 former_diameter=former, measured=readings, frequency=frequency)
    draw_impedance_plot(plot_path, form, result, frequency, temperature, f"single-layer coil, {result['turns']} turns")
    emit(command="solenoid", as_json=as_json,
         inputs=context_inputs(),
         result=result, warnings_=warnings_, cautions=tuned_circuit_cautions(target_frequency is not None),
         render=solenoid_lines)
