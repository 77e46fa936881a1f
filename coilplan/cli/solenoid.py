"""``coilplan solenoid``: a single-layer air-core coil, forward or inverse."""

from __future__ import annotations

import click

from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import SOLENOID_METHODS, Solenoid
from coilplan.wire import parse_wire

__all__ = ["one_of", "solenoid"]

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
@form_options()
def solenoid(**options):
    """Single-layer air-core coil on a round former.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns to wind, with the inductance of the whole numbers either side.
    The coil diameter is to the wire centres: former + overall wire diameter.
    """
    run_form("solenoid", form_from, options, "single-layer coil")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""
    one_of(("--former", options["former"]), ("--diameter", options["diameter"]))

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    shape = {"wire": wire, "pitch": options["pitch"], "length": options["length"],
             "max_length": options["max_length"], "lead": options["lead"], "method": options["method"],
             "former_permittivity": options["former_permittivity"]}
    if options["former"] is not None:
        return Solenoid.on_former(options["former"], **shape)
    return Solenoid(diameter=options["diameter"], **shape)
