"""``coilplan rewind``: turns to add or remove on a measured closed-core coil, geometry unknown."""

from __future__ import annotations

import click

from coilplan.cli._common import captured_warnings, emit, json_option
from coilplan.cli._cored import measurement_type
from coilplan.cli._measured import infeasible_as_json, measurement_options
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import ClosedCore
from coilplan.pipeline import design
from coilplan.report.answer_text import answer_lines
from coilplan.request import Reading, Request
from coilplan.wire import parse_wire

__all__ = ["rewind"]


@click.command()
@click.option("--measured", "measured", type=measurement_type(), multiple=True, required=True,
              help="A reading L@N, e.g. 120uH@36 (repeatable; the last is the coil as it is now).")
@click.option("--target", type=QuantityType("H"), required=True, help="Inductance wanted (as read at --at).")
@click.option("--offset", is_flag=True, help="Fit a fixed series inductance for the leads (two readings or more).")
@click.option("--turn-length", type=QuantityType("m"), help="Mean length of one turn, for the wire to add or remove.")
@click.option("--wire", "wire_text", help="The wire (for the resistance change), e.g. 0.5mm or 26swg.")
@click.option("--at", "frequency", type=QuantityType("Hz"), help="Operating frequency (with --self-capacitance).")
@measurement_options
@json_option
def rewind(measured, target, offset, turn_length, wire_text, frequency, meter_freq, tolerance, self_capacitance,
           turns_uncertainty, as_json):
    """A coil on a closed core (toroid, pot core, gapped choke): L = AL·N², from readings alone.

    For a coil whose geometry matters (an air coil, a rod) give the readings to its own
    command (solenoid, rod) with --measured: there the winding's length is accounted for.
    """
    if self_capacitance is not None and meter_freq is None and frequency is None:
        # the N² law has no self-resonance to report: the value only corrects readings and target
        raise InvalidInputError("--self-capacitance", "--meter-freq and/or --at to go with it", None)
    with captured_warnings() as warnings_, infeasible_as_json("rewind", as_json, warnings_):
        wire = parse_wire(wire_text) if wire_text else None
        form = ClosedCore(turn_length=turn_length, wire=wire, fit_offset=offset)
        request = Request(target=target, frequency=frequency, readings=tuple(Reading(v, n) for v, n in measured),
                          meter_frequency=meter_freq, tolerance=tolerance, self_capacitance=self_capacitance,
                          turns_uncertainty=turns_uncertainty)
        answer = design(form, request)
    result = {**answer.result, "notices": list(answer.result.get("notices", []))}
    inputs = {"measured": [{"inductance_H": v, "turns": n} for v, n in measured], "target_H": target,
              "offset": offset, "turn_length_m": turn_length, "wire": wire_text, "frequency_Hz": frequency,
              "meter_frequency_Hz": meter_freq, "tolerance": tolerance, "self_capacitance_F": self_capacitance,
              "turns_uncertainty": turns_uncertainty}
    emit(command="rewind", as_json=as_json, inputs={k: v for k, v in inputs.items() if v is not None},
         result=result, warnings_=warnings_ + list(answer.warnings), cautions=list(answer.cautions),
         render=lambda figures: answer_lines("rewind", figures))
