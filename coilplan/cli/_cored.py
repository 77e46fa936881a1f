"""Options and input handling shared by the cored commands (toroid, gapped)."""

from __future__ import annotations

import functools
from dataclasses import dataclass

import click

from coilplan.cli._types import QuantityType
from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity, parse_loss_factor, parse_measurement, parse_q_reading

__all__ = ["CoreChoice", "core_options", "resolve_core"]

LENGTH = QuantityType("m")


class PairType(click.ParamType):
    """``A@B``: a pair read by one of the parsers of :mod:`coilplan.quantities` (returns its tuple)."""

    def __init__(self, name: str, parser):
        self.name = name
        self.parser = parser

    def convert(self, value, param, ctx):
        if isinstance(value, tuple):
            return value
        try:
            return self.parser(value)
        except InvalidInputError as error:
            self.fail(f"expected {error.expected}; got {value!r}", param, ctx)


def measurement_type() -> PairType:
    """``L@N``: an inductance measured at a whole number of turns."""
    return PairType("L@N", parse_measurement)


def loss_factor_type() -> PairType:
    """``tanδ/µi@f``: a relative loss factor at its frequency."""
    return PairType("tanδ/µi@f", parse_loss_factor)


def q_reading_type() -> PairType:
    """``Q@f``: a Q read on the meter at its test frequency."""
    return PairType("Q@f", parse_q_reading)


def core_options(function):
    """What a cored form command adds to the shared options: the core's material, AL or loss, and the drive."""
    options = [
        click.option("--mu", type=click.FloatRange(min=1.0, max=1e6),
                     help="Relative permeability of the core (1 to 1e6)."),
        click.option("--material", help="A generic material class (see: coilplan materials)."),
        click.option("--al", type=QuantityType("H/t2"), help="Known AL value, inductance per turn², e.g. 420nH."),
        click.option("--loss-factor", type=loss_factor_type(), metavar="tanδ/µi@f",
                     help="The core material's relative loss factor tanδ/µi at a frequency, e.g. 40e-6@1MHz "
                          "(a data sheet's figure): gives the core's loss at --at."),
        click.option("--measured-q", type=q_reading_type(),
                     help="The Q the meter showed on the winding of the last --measured reading, with its test "
                          "frequency, e.g. 85@100kHz: gives the core's loss."),
        click.option("--bsat", type=QuantityType("T"),
                     help="Saturation flux density, if known (else from --material)."),
        click.option("--current", type=QuantityType("A", allow_zero=True), default="0A",
                     help="DC current in the winding, for the saturation check."),
        click.option("--ac-current", type=QuantityType("A", allow_zero=True), default="0A",
                     help="AC current amplitude (peak) on top of the DC."),
        click.option("--ac-voltage", type=QuantityType("V"), help="RMS sine voltage across the winding (with --at)."),
    ]
    return functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


@dataclass(frozen=True)
class CoreChoice:
    """What the user said about the core, resolved: permeability, AL fit and saturation."""

    mu_r: float | None
    al_given: float | None
    saturation_flux_density: float | None
    material_name: str | None
    basis: str


def resolve_core(*, mu, material, al, measured, bsat, temperature, allow_gap=False) -> CoreChoice:
    """Check the core options against each other and resolve them (one line per conflict)."""
    sources = [name for name, value in (("--mu", mu), ("--al", al), ("--measured", measured or None))
               if value is not None]
    if len(sources) > 1:
        raise InvalidInputError(sources[1], f"only one of {', '.join(sources)}", None)
    chosen = None
    if material is not None:
        from coilplan.materials import material as find_material

        chosen = find_material(material)
        if mu is not None:
            raise InvalidInputError("--mu", "either --mu or --material, not both", None)
    mu_r = mu if mu is not None else (chosen.mu_initial if chosen is not None else None)
    if mu_r is None and al is None and not measured and not allow_gap:
        raise InvalidInputError("--mu", "the core: one of --mu, --material, --al or --measured L@N", None)
    limit = bsat
    if limit is None and chosen is not None:
        limit = float(chosen.saturation_flux_density(temperature))
    if measured:
        readings = ", ".join(f"{format_quantity(value, 'H')} at {turns} turns" for value, turns in measured)
        basis = f"measured: {readings}"
    elif al is not None:
        basis = "given AL value"
    elif chosen is not None:
        basis = f"material {chosen.name} (initial permeability {chosen.mu_initial:g}, typical)"
    elif mu_r is not None:
        basis = f"permeability {mu_r:g}"
    else:
        basis = "gap and permeability"
    return CoreChoice(mu_r, al, limit, chosen.name if chosen is not None else None, basis)
