"""``coilplan multilayer``: a multilayer air-core coil on a former or bobbin, forward or inverse."""

from __future__ import annotations

import click

from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.forms import MULTILAYER_METHODS, MultilayerCoil
from coilplan.wire import parse_wire

__all__ = ["multilayer"]

LENGTH = QuantityType("m")


@click.command()
@click.option("--former", type=LENGTH, required=True, help="Outside diameter of the former or bobbin core, e.g. 10mm.")
@click.option("--width", type=LENGTH, required=True, help="Axial winding width between the cheeks, e.g. 8mm.")
@click.option("--style", type=click.Choice(["layered", "staggered"]), default="layered", show_default=True,
              help="Turns directly above turns, or every second layer in the grooves (orthocyclic).")
@click.option("--packing", type=click.FloatRange(min=0.5, max=1.0), default=1.0, show_default=True,
              help="Hand-winding packing: turns sit at the overall wire diameter divided by it, as in a kit plan "
                   "(common practice: 0.9-0.95 careful, about 0.85 random).")
@click.option("--max-depth", type=LENGTH, help="Radial depth of the bobbin window; the build must fit it.")
@click.option("--method", type=click.Choice(list(MULTILAYER_METHODS)), default="filament", show_default=True,
              help="Exact turn-by-turn sum, or Wheeler's 1928 approximation.")
@form_options()
def multilayer(**options):
    """Multilayer air-core coil: layers of turns across a fixed width.

    Forward: --turns N gives the inductance. Inverse: --target gives the whole
    number of turns. The exact method sums every turn as a circle at its own
    radius and axial position; Wheeler's figure is shown beside it.
    """
    run_form("multilayer", form_from, options, "multilayer coil")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    return MultilayerCoil(former_diameter=options["former"], width=options["width"], wire=wire,
                          style=options["style"], packing=options["packing"], max_depth=options["max_depth"],
                          lead=options["lead"], method=options["method"])
