"""Options and input handling shared by the cored commands (toroid, gapped)."""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass

import click

from coilplan.cli._types import CountType, QuantityType, TemperatureType
from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity, parse_loss_factor, parse_measurement, parse_q_reading

__all__ = ["CoreChoice", "core_at_frequency", "core_options", "drive_arguments", "finish_cored", "resolve_core"]

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
    """The options every cored command takes: turns/target, wire, core material, drive."""
    options = [
        click.option("--turns", type=CountType(), help="Turns wound (forward: gives the inductance)."),
        click.option("--target", type=QuantityType("H"), help="Inductance wanted (inverse: gives the turns)."),
        click.option("--wire", "wire_text", required=True, help="Bare diameter (0.5mm) or gauge (24awg, 26swg)."),
        click.option("--grade", type=click.Choice(["1", "2", "3", "bare"]), default="1", show_default=True,
                     help="Enamel grade (IEC 60317), or bare wire."),
        click.option("--overall", type=LENGTH, help="Measured overall (insulated) wire diameter."),
        click.option("--mu", type=click.FloatRange(min=1.0, max=1e6),
                     help="Relative permeability of the core (1 to 1e6)."),
        click.option("--material", help="A generic material class (see: coilplan materials)."),
        click.option("--al", type=QuantityType("H/t2"), help="Known AL value, inductance per turn², e.g. 420nH."),
        click.option("--measured", "measured", type=measurement_type(), multiple=True,
                     help="A reading L@N on a test winding, e.g. 150uH@40 (repeatable): gives the AL."),
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


def core_at_frequency(form, core: CoreChoice, *, mu: float | None, loss_factor, frequency, reference_frequency,
                      measured_q=None, readings=None, temperature_C: float = 20.0):
    """``form`` with its core's µ' and loss at the operating ``frequency``, when the core's material is known.

    The material is known from --material (its class's dispersion), --loss-factor, or a Q the
    meter read on the test winding (--measured-q, which gives the loss factor at the meter's
    frequency: :func:`coilplan.core_frequency.loss_factor_from_q`). The form is calibrated at
    ``reference_frequency`` (the meter's, for readings; else 0, the class's low-frequency µi).
    Without any of them, or without --at, the form comes back as it is.
    """
    if measured_q is not None:
        if loss_factor is not None:
            raise InvalidInputError("--measured-q", "either --measured-q or --loss-factor, not both", None)
        if not readings:
            raise InvalidInputError("--measured-q", "a --measured L@N reading too: the Q belongs to that winding",
                                    None)
    if frequency is None or mu is None or mu <= 1.0:
        return form
    if core.material_name is None and loss_factor is None and measured_q is None:
        return form
    import warnings

    from coilplan.core_frequency import CoreSpectrum, at_frequency, loss_factor_from_q
    from coilplan.errors import MeasurementWarning, OutsideValidityWarning
    from coilplan.materials import material as find_material
    from coilplan.materials import material_dispersion

    dispersion = material_dispersion(core.material_name) if core.material_name is not None else None
    if core.material_name is not None:
        usual = find_material(core.material_name).frequency_range
        high = usual[1] if usual is not None else None
        if high is not None and frequency > high:
            warnings.warn(f"{format_quantity(frequency, 'Hz')} is above the usual range of {core.material_name} "
                          f"(up to {format_quantity(high, 'Hz')}): its permeability and loss there are far from "
                          f"typical, and the core's figures are only an indication", OutsideValidityWarning,
                          stacklevel=2)
    reference = reference_frequency or 0.0
    if measured_q is not None:
        q_value, q_frequency = measured_q
        turns = int(readings[-1][1])
        probe = at_frequency(form, CoreSpectrum(mu=mu, reference_frequency=reference, dispersion=dispersion,
                                                loss_factor=1e-6, loss_factor_frequency=q_frequency), q_frequency)
        if probe is form:
            return form
        copper = float(form.ac_resistance(turns, q_frequency, temperature_C))
        found = loss_factor_from_q(q_value, q_frequency, float(probe.inductance(turns)), copper, probe.dilution,
                                   probe.spectrum.mu_low_frequency)
        if found is None:
            copper_q = 2 * math.pi * q_frequency * float(probe.inductance(turns)) / copper
            fallback = (f"the typical loss of {core.material_name} is used" if dispersion is not None
                        else "it is left out")
            warnings.warn(f"the Q reading {q_value:g} at {format_quantity(q_frequency, 'Hz')} is at or above the "
                          f"copper's alone ({copper_q:.0f} by the model): the core's loss is too small to tell from "
                          f"it, and {fallback}", MeasurementWarning, stacklevel=2)
            if dispersion is None:
                return form
            loss_factor = None
        else:
            loss_factor = (found, q_frequency)
    value, at = loss_factor if loss_factor is not None else (None, None)
    if dispersion is None and value is None:
        return form
    source = "given"
    if measured_q is not None and value is not None:
        source = f"from the Q reading {measured_q[0]:g}"
    spectrum = CoreSpectrum(mu=mu, reference_frequency=reference, dispersion=dispersion,
                            loss_factor=value, loss_factor_frequency=at, loss_factor_source=source)
    return at_frequency(form, spectrum, frequency)


def finish_cored(command: str, *, form, result: dict, core: CoreChoice, plot_path, frequency, temperature: float,
                 title: str, unknown_core: bool, tuned: bool, warnings_: list[str], as_json: bool, render) -> None:
    """The end every cored command shares: the plot if asked, the cautions, and the answer printed."""
    from coilplan.cautions import tuned_circuit_cautions
    from coilplan.cli._common import context_inputs, draw_impedance_plot, emit
    from coilplan.results.cored import cored_cautions

    draw_impedance_plot(plot_path, form, result, frequency, temperature, f"{title}, {result['turns']} turns")
    cautions = cored_cautions(result, temperature, material_name=core.material_name, unknown_core=unknown_core)
    cautions += tuned_circuit_cautions(tuned)
    emit(command=command, as_json=as_json, inputs=context_inputs(), result=result, warnings_=warnings_,
         cautions=cautions, render=render)
