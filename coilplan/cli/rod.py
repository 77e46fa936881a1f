"""``coilplan rod``: a coil on a ferrite rod, forward or inverse, calibrated by a reading if given."""

from __future__ import annotations

import click

from coilplan.cli._cored import LENGTH, resolve_core
from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import RodCoil
from coilplan.wire import parse_wire

__all__ = ["rod"]


@click.command()
@click.option("--rod-length", type=LENGTH, required=True, help="Length of the ferrite rod.")
@click.option("--rod-diameter", type=LENGTH, required=True, help="Diameter of the rod.")
@click.option("--former", type=LENGTH, help="Outside diameter of a former round the rod; default wound on the rod.")
@click.option("--pitch", type=LENGTH, help="Distance between turn centres; default close wound.")
@click.option("--coil-length", type=LENGTH, help="Fixed winding length to spread the turns over.")
@click.option("--position", type=QuantityType("m", allow_zero=True, allow_negative=True), default="0mm",
              show_default=True, help="Offset of the coil's centre from the rod's centre.")
@click.option("--max-length", type=LENGTH, help="Usable winding length; default the rod's length.")
@form_options(cored=True)
def rod(**options):
    """Coil on a ferrite rod: the rod's apparent permeability from a cylinder's demagnetising
    factor, and the coil's length, diameter and position on the rod.

    The model is rough (tens of percent) until calibrated: give --measured L@N from a test
    winding and the answer is scaled to it, keeping how L changes as the winding grows.
    Without --mu or --material the reading also gives the rod's permeability.
    """
    run_form("rod", form_from, options, "coil on a rod")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""
    if options["al"] is not None:
        raise InvalidInputError("--al", "no AL value for a rod (the winding's length matters): use --measured", None)
    core = resolve_core(mu=options["mu"], material=options["material"], al=None, measured=None,
                        bsat=options["bsat"], temperature=options["temperature"], allow_gap=True)

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    return RodCoil(rod_length=options["rod_length"], rod_diameter=options["rod_diameter"], mu_initial=core.mu_r,
                   wire=wire, former_diameter=options["former"], pitch=options["pitch"],
                   coil_length=options["coil_length"], position=options["position"],
                   max_length=options["max_length"], saturation_flux_density=core.saturation_flux_density,
                   lead=options["lead"])
