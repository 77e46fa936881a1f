"""``coilplan spiral``: a flat spiral air-core coil, forward or inverse."""

from __future__ import annotations

import click

from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import SPIRAL_METHODS, FlatSpiral
from coilplan.wire import parse_wire

__all__ = ["spiral"]

LENGTH = QuantityType("m")


@click.command()
@click.option("--inner", type=LENGTH, required=True, help="Inside diameter of the spiral, e.g. 30mm.")
@click.option("--spacing", type=QuantityType("m", allow_zero=True),
              help="Gap between adjacent turns (0 for touching enamelled turns).")
@click.option("--outer", type=LENGTH,
              help="Largest outside diameter the turns must fit in (gap 0 when --spacing is not given).")
@click.option("--method", type=click.Choice(list(SPIRAL_METHODS)), default="filament", show_default=True,
              help="Exact turn-by-turn sum, or Wheeler's flat-spiral approximation.")
@form_options()
def spiral(**options):
    """Flat spiral coil of round wire from an inner diameter outwards.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns. Give --spacing (the gap between turns), or --outer (the
    space available), or both.
    """
    run_form("spiral", form_from, options, "flat spiral")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""
    if options["spacing"] is None and options["outer"] is None:
        raise InvalidInputError("--spacing", "one of --spacing or --outer", None)

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    return FlatSpiral(inner_diameter=options["inner"], wire=wire,
                      spacing=0.0 if options["spacing"] is None else options["spacing"],
                      outer_diameter=options["outer"], lead=options["lead"], method=options["method"])
