"""``coilplan count-turns``: the unknown turn count of a coil in hand, from measurements."""

from __future__ import annotations

import re

import click

from coilplan import turn_count
from coilplan.cautions import salvaged_mains_caution
from coilplan.cli._common import captured_warnings, emit, json_option
from coilplan.cli._measured import infeasible_as_json
from coilplan.cli._types import CountType, PercentType, QuantityType, TemperatureType
from coilplan.errors import InvalidInputError
from coilplan.quantities import format_length, parse_measurement
from coilplan.report.count_turns_text import count_turns_lines
from coilplan.turn_count_ratio import DEFAULT_METER_TOLERANCE
from coilplan.turn_count_resistance import (
    DEFAULT_DIAMETER_TOLERANCE,
    DEFAULT_LENGTH_TOLERANCE,
    DEFAULT_RESISTANCE_TOLERANCE,
    mean_turn_length,
)
from coilplan.wire import parse_wire

__all__ = ["SignedTurnsType", "count_turns"]

class SignedTurnsType(click.ParamType):
    """A whole number of turns other than 0; negative for turns removed."""

    name = "turns"

    def convert(self, value, param, ctx):
        if isinstance(value, int):
            return value
        stripped = str(value).strip()
        if not re.fullmatch(r"[+-]?\d+", stripped) or int(stripped) == 0:
            self.fail(f"expected a whole number of turns other than 0 (negative for turns removed); got {value!r}",
                      param, ctx)
        return int(stripped)


INDUCTANCE = QuantityType("H")
LENGTH = QuantityType("m")


def _turn_length(turn_length, inner, outer) -> tuple[float | None, str]:
    """The mean turn length given directly or from the two perimeters, and a note of its source."""
    perimeters = {"--inner-perimeter": inner, "--outer-perimeter": outer}
    given = [name for name, value in perimeters.items() if value is not None]
    if turn_length is not None and given:
        raise InvalidInputError("--turn-length", "either --turn-length or --inner-perimeter with "
                                "--outer-perimeter, not both", None)
    if turn_length is not None:
        return turn_length, "as measured"
    if len(given) == 1:
        missing = next(name for name in perimeters if name not in given)
        raise InvalidInputError(missing, f"a perimeter to go with {given[0]} (their mean is the turn length)", None)
    if not given:
        return None, ""
    mean = mean_turn_length(inner, outer)
    return mean, f"the mean of the {format_length(inner)} and {format_length(outer)} perimeters"


_NEEDS_TEXT = ("no measurements given: added turns needs --before, --after and --added (or --removed); "
               "test winding needs --test-winding L@N and --unknown; DC resistance needs --resistance, --wire "
               "and --turn-length (or --inner-perimeter and --outer-perimeter)")


@click.command("count-turns")
@click.option("--before", type=INDUCTANCE, help="Inductance of the coil as found, e.g. 1.2mH.")
@click.option("--after", type=INDUCTANCE, help="Inductance after adding (or removing) the known turns.")
@click.option("--added", type=SignedTurnsType(),
              help="Turns added in the same sense, on the same core; negative for turns removed.")
@click.option("--removed", type=CountType(), help="Turns removed (instead of --added).")
@click.option("--test-winding", "test_winding_text", metavar="L@N",
              help="Reading of a separate test winding of N turns on the same core, e.g. 55uH@20.")
@click.option("--unknown", type=INDUCTANCE, help="Reading of the unknown winding (the test winding left open).")
@click.option("--resistance", type=QuantityType("ohm"), help="DC resistance read across the winding.")
@click.option("--wire", "wire_text", help="Its wire: bare diameter (0.5mm, 20mil) or gauge (24awg, 26swg).")
@click.option("--turn-length", type=LENGTH, help="Mean length of one turn of the winding.")
@click.option("--inner-perimeter", type=LENGTH, help="Length of one turn under the winding (round: π × diameter).")
@click.option("--outer-perimeter", type=LENGTH, help="Length of one turn over the winding; the mean of the two "
              "perimeters is the turn length.")
@click.option("--lead-resistance", type=QuantityType("ohm", allow_zero=True), default="0ohm", show_default=True,
              help="Resistance of the leads and test leads, subtracted from --resistance.")
@click.option("--temperature", type=TemperatureType(), default="20C", show_default=True,
              help="Temperature of the winding when its resistance was read.")
@click.option("--tolerance", type=PercentType(),
              help=f"Accuracy of each inductance reading (assumed {DEFAULT_METER_TOLERANCE:.0%} "
                   "if not given: give your meter's).")
@click.option("--resistance-tolerance", type=PercentType(),
              help=f"Accuracy of the resistance reading (assumed {DEFAULT_RESISTANCE_TOLERANCE:.0%}).")
@click.option("--diameter-tolerance", type=PercentType(),
              help=f"Uncertainty of the bare wire diameter (assumed {DEFAULT_DIAMETER_TOLERANCE:.0%}).")
@click.option("--length-tolerance", type=PercentType(),
              help=f"Uncertainty of the turn length (assumed {DEFAULT_LENGTH_TOLERANCE:.0%}).")
@json_option
def count_turns(before, after, added, removed, test_winding_text, unknown, resistance, wire_text, turn_length,
                inner_perimeter, outer_perimeter, lead_resistance, temperature, tolerance, resistance_tolerance,
                diameter_tolerance, length_tolerance, as_json):
    """The unknown turn count of a coil (a salvaged choke, a potted coil), from measurements.

    \b
    Three methods; give the data of one or more, and the strongest is named:
      added turns   read the coil, add a known number of turns in the same sense, read again
                    (--before, --after, --added or --removed)
      test winding  wind a few known turns on the same core, read it and the unknown winding
                    (--test-winding L@N, --unknown)
      DC resistance the resistance, the wire and the mean turn length
                    (--resistance, --wire, --turn-length or --inner-/--outer-perimeter)

    The inductance methods are for closed cores (L = AL·N²), not air coils or rods.
    """
    if added is not None and removed is not None:
        raise InvalidInputError("--removed", "either --added or --removed, not both", None)
    change = added if added is not None else (-removed if removed is not None else None)
    test_winding = parse_measurement(test_winding_text, "--test-winding") if test_winding_text is not None else None
    length, length_note = _turn_length(turn_length, inner_perimeter, outer_perimeter)
    data = (before, after, change, test_winding, unknown, resistance, wire_text, length)
    if all(value is None for value in data):
        raise click.UsageError(_NEEDS_TEXT)
    wire = parse_wire(wire_text) if wire_text is not None else None
    with captured_warnings() as range_warnings, infeasible_as_json("count-turns", as_json, range_warnings):
        answer = turn_count.count_turns(
            before=before, after=after, added=change, test_winding=test_winding, unknown_inductance=unknown,
            resistance=resistance, wire=wire, turn_length=length, temperature_C=temperature,
            lead_resistance=lead_resistance, tolerance=tolerance, resistance_tolerance=resistance_tolerance,
            diameter_tolerance=diameter_tolerance, length_tolerance=length_tolerance, turn_length_note=length_note)
    inputs = {
        "before_H": before, "after_H": after, "added": change,
        "test_winding": None if test_winding is None else {"inductance_H": test_winding[0], "turns": test_winding[1]},
        "unknown_H": unknown, "resistance_ohm": resistance, "wire": wire_text, "turn_length_m": turn_length,
        "inner_perimeter_m": inner_perimeter, "outer_perimeter_m": outer_perimeter,
        "lead_resistance_ohm": lead_resistance if resistance is not None else None,
        "temperature_C": temperature if resistance is not None else None,
        "tolerance": tolerance, "resistance_tolerance": resistance_tolerance,
        "diameter_tolerance": diameter_tolerance, "length_tolerance": length_tolerance,
    }
    emit(command="count-turns", as_json=as_json,
         inputs={key: value for key, value in inputs.items() if value is not None}, result=answer.as_dict(),
         warnings_=[*answer.warnings, *range_warnings], cautions=[salvaged_mains_caution()],
         render=count_turns_lines)
