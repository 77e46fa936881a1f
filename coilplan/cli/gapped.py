"""``coilplan gapped``: a gapped core (E, pot, drum and bobbin): turns, gap, or both for a choke."""

from __future__ import annotations

import click

from coilplan.cli._cored import LENGTH, resolve_core
from coilplan.cli._measured import form_options, run_form
from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.forms import GappedCore
from coilplan.saturation import NEAR_SATURATION
from coilplan.wire import parse_wire

__all__ = ["gapped"]


@click.command()
@click.option("--ae", type=QuantityType("m2"), required=True, help="Effective area of the core, e.g. 50mm2.")
@click.option("--le", type=LENGTH, required=True, help="Effective magnetic path length, e.g. 45mm.")
@click.option("--gap", type=QuantityType("m", allow_zero=True),
              help="Total air gap in the path; leave out to have it computed.")
@click.option("--window-width", type=LENGTH, help="Winding width along the leg (bobbin length).")
@click.option("--window-depth", type=LENGTH, help="Radial depth of the winding space.")
@click.option("--no-fringing", is_flag=True, help="Leave out McLyman's fringing correction.")
@click.option("--max-flux", type=QuantityType("T"),
              help=f"Design limit for the peak flux density; default {NEAR_SATURATION:.0%} of B_sat.")
@form_options(cored=True)
def gapped(**options):
    """Gapped core: AL = µ0·Ae/(gap + le/µr), with the fringing correction shown apart.

    With --gap: --turns gives L, --target gives the turns. Without --gap: --turns and
    --target give the gap; --target and --current give the turns and the gap of a choke
    that carries the current without saturating (and fits the window if given).
    """
    run_form("gapped", form_from, options, "gapped core")


def form_from(options: dict):
    """The uncalibrated form the options describe (checked: one line naming the option otherwise)."""
    core = resolve_core(mu=options["mu"], material=options["material"], al=options["al"],
                        measured=options["measured"], bsat=options["bsat"], temperature=options["temperature"],
                        allow_gap=True)
    if (core.al_given is not None or options["measured"]) and options["gap"] is not None:
        raise InvalidInputError("--gap", "either --gap (with --mu or --material) or a known AL, not both", None)
    if core.al_given is None and not options["measured"] and core.mu_r is None:
        raise InvalidInputError("--mu", "the core's permeability (--mu or --material), or --al / --measured", None)

    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"])
    return GappedCore(ae=options["ae"], le=options["le"], wire=wire, gap=options["gap"], mu_r=core.mu_r,
                      al=None if options["measured"] else core.al_given, window_width=options["window_width"],
                      window_depth=options["window_depth"], fringing=not options["no_fringing"],
                      saturation_flux_density=core.saturation_flux_density, lead=options["lead"])
