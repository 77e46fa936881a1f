"""Options and input handling shared by the cored commands (toroid, gapped)."""

from __future__ import annotations

import functools
from dataclasses import dataclass

import click

from coilplan.cli._types import CountType, QuantityType, TemperatureType
from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity, parse_loss_factor, parse_measurement

__all__ = ["CoreChoice", "core_at_frequency", "core_options", "drive_arguments", "resolve_core"]

LENGTH = QuantityType("m")


class MeasurementType(click.ParamType):
    """``L@N``: an inductance measured at a whole number of turns."""

    name = "L@N"

    def convert(self, value, param, ctx):
        if isinstance(value, tuple):
            return value
        try:
            return parse_measurement(value)
        except InvalidInputError as error:
            self.fail(f"expected {error.expected}; got {value!r}", param, ctx)


class LossFactorType(click.ParamType):
    """``tanδ/µi@f``: a relative loss factor at its frequency."""

    name = "tanδ/µi@f"

    def convert(self, value, param, ctx):
        if isinstance(value, tuple):
            return value
        try:
            return parse_loss_factor(value)
        except InvalidInputError as error:
            self.fail(f"expected {error.expected}; got {value!r}", param, ctx)


def core_options(function):
    """The options every cored command takes: turns/target, wire, core material, drive."""
    options = [
        click.option("--turns", type=CountType(), help="Turns wound (forward: gives the inductance)."),
        click.option("--target", type=QuantityType("H"), help="Inductance wanted (inverse: gives the turns)."),
        click.option("--wire", "wire_text", required=True, help="Bare diameter (0.5mm) or gauge (24awg, 26swg)."),
        click.option("--grade", type=click.Choice(["1", "2", "3", "bare"]), default="1", show_default=True,
                     help="Enamel grade (IEC 60317), or bare wire."),
        click.option("--overall", type=LENGTH, help="Measured overall (insulated) wire diameter."),
        click.option("--mu", type=click.FloatRange(min=1.0), help="Relative permeability of the core."),
        click.option("--material", help="A generic material class (see: coilplan materials)."),
        click.option("--al", type=QuantityType("H/t2"), help="Known AL value, inductance per turn², e.g. 420nH."),
        click.option("--measured", "measured", type=MeasurementType(), multiple=True,
                     help="A reading L@N on a test winding, e.g. 150uH@40 (repeatable): gives the AL."),
        click.option("--loss-factor", type=LossFactorType(),
                     help="The core material's relative loss factor tanδ/µi at a frequency, e.g. 40e-6@1MHz "
                          "(a data sheet's figure): gives the core's loss at --at."),
        click.option("--bsat", type=QuantityType("T"),
                     help="Saturation flux density, if known (else from --material)."),
        click.option("--current", type=QuantityType("A", allow_zero=True), default="0A",
                     help="DC current in the winding, for the saturation check."),
        click.option("--ac-current", type=QuantityType("A", allow_zero=True), default="0A",
                     help="AC current amplitude (peak) on top of the DC."),
        click.option("--ac-voltage", type=QuantityType("V"), help="RMS sine voltage across the winding (with --at)."),
        click.option("--at", "frequency", type=QuantityType("Hz"), help="Operating frequency (for --ac-voltage)."),
        click.option("--temperature", type=TemperatureType(), default="20C", show_default=True,
                     help="Working temperature: derates B_sat, gives a second resistance."),
        click.option("--lead", type=QuantityType("m", allow_zero=True), default="0mm", show_default=True,
                     help="Lead allowance per end, added to the wire to cut."),
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


def drive_arguments(current, ac_current, ac_voltage, frequency) -> dict:
    """The drive keywords for the result builders, checked."""
    if ac_voltage is not None and frequency is None:
        raise InvalidInputError("--at", "the operating frequency that goes with --ac-voltage", None)
    if ac_voltage is not None and ac_current:
        raise InvalidInputError("--ac-voltage", "either --ac-voltage or --ac-current, not both", None)
    return {"dc_current": current, "ac_current": ac_current, "ac_voltage": ac_voltage, "frequency": frequency}


def core_at_frequency(form, core: CoreChoice, *, mu: float | None, loss_factor, frequency, reference_frequency):
    """``form`` with its core's µ' and loss at the operating ``frequency``, when the core's material is known.

    The material is known from --material (its class's dispersion) or --loss-factor; the form
    is calibrated at ``reference_frequency`` (the meter's, for readings; else 0, the class's
    low-frequency µi). Without either, or without --at, the form comes back as it is.
    """
    if frequency is None or mu is None or (core.material_name is None and loss_factor is None):
        return form
    import warnings

    from coilplan.core_frequency import CoreSpectrum, at_frequency
    from coilplan.errors import OutsideValidityWarning
    from coilplan.materials import material as find_material
    from coilplan.materials import material_dispersion

    dispersion = material_dispersion(core.material_name) if core.material_name is not None else None
    if dispersion is None and loss_factor is None:
        return form
    if mu <= 1.0:
        return form
    if core.material_name is not None:
        usual = find_material(core.material_name).frequency_range
        high = usual[1] if usual is not None else None
        if high is not None and frequency > high:
            warnings.warn(f"{format_quantity(frequency, 'Hz')} is above the usual range of {core.material_name} "
                          f"(up to {format_quantity(high, 'Hz')}): its permeability and loss there are far from "
                          f"typical, and the core's figures are only an indication", OutsideValidityWarning,
                          stacklevel=2)
    value, at = loss_factor if loss_factor is not None else (None, None)
    spectrum = CoreSpectrum(mu=mu, reference_frequency=reference_frequency or 0.0, dispersion=dispersion,
                            loss_factor=value, loss_factor_frequency=at)
    return at_frequency(form, spectrum, frequency)
