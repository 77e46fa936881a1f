"""``coilplan toroid``: a winding on a ring core, forward or inverse, with the saturation check."""

from __future__ import annotations

import click

from coilplan.cli._cored import LENGTH, resolve_core
from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.forms import Toroid
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
@form_options(cored=True)
def toroid(**options):
    """Ring core (toroid) of rectangular section: AL by IEC 60205, turns, fit and saturation.

    The core is given by --mu, --material, a known --al, or readings --measured L@N on a
    test winding, which also tell which generic material classes the core may be.
    --mu 1 is an air-core toroid.
    """
    run_form("toroid", form_from, options, "toroid")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""
    core = resolve_core(mu=options["mu"], material=options["material"], al=options["al"],
                        measured=options["measured"], bsat=options["bsat"], temperature=options["temperature"])

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    known = None if options["measured"] else core.al_given
    return Toroid(inner_diameter=options["inner"], outer_diameter=options["outer"], height=options["height"],
                  wire=wire, al=known, al_basis=core.basis, mu_r=core.mu_r if known is None else None,
                  saturation_flux_density=core.saturation_flux_density, layers=options["layers"],
                  lead=options["lead"], chamfer=options["chamfer"])
