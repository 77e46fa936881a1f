"""Readings on the coil in hand, for every form command: options, conditions and calibration."""

from __future__ import annotations

import dataclasses
import functools

import click

from coilplan.apparent import GivenCapacitance, has_frequency_model
from coilplan.calibrate import ScaledForm
from coilplan.cli._types import PercentType, QuantityType
from coilplan.errors import InvalidInputError
from coilplan.physics.resonance import resonant_inductance
from coilplan.quantities import format_quantity
from coilplan.results._common import Measured
from coilplan.rewind import DEFAULT_TOLERANCE, Conditions, closed_core_fit, low_frequency_readings, model_fit
from coilplan.solve import search_turns

__all__ = [
    "calibrate_form",
    "coil_options",
    "conditions_from",
    "measurement_options",
    "readings_within_reach",
    "resolve_target",
    "run_model_coil",
    "tuning_options",
]


def measurement_options(function):
    """--meter-freq, --tolerance, --self-capacitance, --turns-uncertainty (with --measured and --at)."""
    options = [
        click.option("--meter-freq", type=QuantityType("Hz"), help="The meter's test frequency."),
        click.option("--tolerance", type=PercentType(),
                     help=f"Meter accuracy per reading, e.g. 2% (assumed {DEFAULT_TOLERANCE:.0%} if not given)."),
        click.option("--self-capacitance", type=QuantityType("F"),
                     help="The coil's self-capacitance, to correct readings and target for frequency."),
        click.option("--turns-uncertainty", type=click.FloatRange(min=0.0), default=0.0,
                     help="± turns on the counts of the readings, if not counted exactly."),
    ]
    return functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


def conditions_from(*, tolerance, meter_freq, at, self_capacitance, turns_uncertainty) -> Conditions:
    """The measurement conditions."""
    return Conditions(tolerance=DEFAULT_TOLERANCE if tolerance is None else tolerance,
                      tolerance_assumed=tolerance is None, meter_frequency=meter_freq, operating_frequency=at,
                      self_capacitance=self_capacitance, turns_uncertainty=turns_uncertainty)


def calibrate_form(build, readings, conditions: Conditions, kind: str):
    """(calibrated form, Measured or None).

    A self-capacitance the user gave (``--self-capacitance``) replaces the form's estimate in
    the form returned (:class:`coilplan.apparent.GivenCapacitance`), with or without readings.

    ``build(al)`` makes the form; ``al`` is None for the uncalibrated model. ``kind``
    "al": a closed core whose AL comes from the readings; "scale": a model (air coil,
    rod) whose level is scaled to them.
    """
    given = conditions.self_capacitance if not conditions.self_capacitance_estimated else None

    def with_given(form):
        return form if given is None else GivenCapacitance(form, given)

    if not readings:
        return with_given(build(None)), None
    readings = list(readings)
    readings_within_reach(build(1.0 if kind == "al" else None), readings, conditions.turns_uncertainty)
    frequencies_given = conditions.meter_frequency is not None or conditions.operating_frequency is not None
    if conditions.self_capacitance is None and frequencies_given:
        # no measured self-capacitance: the form's own estimate for the coil as it is now
        estimate = build(1.0 if kind == "al" else None)  # geometry only: C(N) does not depend on AL
        if has_frequency_model(estimate):
            turns_now = readings[-1][1]
            conditions = dataclasses.replace(conditions, self_capacitance=float(estimate.self_capacitance(turns_now)),
                                             self_capacitance_estimated=True)
    low = low_frequency_readings(readings, conditions)
    if kind == "al":
        fit = closed_core_fit(low)
        calibrated = build(fit.value)
    else:
        form = build(None)
        fit = model_fit(form, low)
        calibrated = ScaledForm(form, fit.value)
    return with_given(calibrated), Measured(readings, fit, conditions)


def readings_within_reach(form, readings, turns_uncertainty: float = 0.0) -> None:
    """Refuse a reading (--measured L@N) at more turns than this form can hold, or a doubt on the counts
    (--turns-uncertainty) as large as a count itself.

    The limit is the one the solver works to (:func:`coilplan.solve.search_turns`): what fits the
    former, window or rod, or on a former of unstated length the longest winding the tool plans.
    A reading beyond it is not of this coil: a miscounted or mistyped turn count, or the wrong former.
    A count known to ± its own size or more could be no turns at all.
    """
    readings = list(readings or ())
    limit, reason = search_turns(form)
    for inductance, turns in readings:
        if turns > limit + 1e-9:
            raise InvalidInputError(
                "--measured", f"a reading at a turn count this coil can have, at most {limit:.0f}: "
                f"{form.limit_reason(limit) if reason is None else reason}",
                f"{format_quantity(inductance, 'H')}@{turns}")
    fewest = min((turns for _, turns in readings), default=None)
    if fewest is not None and turns_uncertainty >= fewest:
        raise InvalidInputError("--turns-uncertainty", f"an uncertainty below the fewest turns read ({fewest}): "
                                "a count known only to ± its own size could be no turns at all",
                                f"{turns_uncertainty:g}")


def tuning_options(function):
    """--target-frequency with --capacitance: wind for resonance with a given capacitor."""
    options = [
        click.option("--target-frequency", type=QuantityType("Hz"),
                     help="Resonate at this frequency with --capacitance (instead of --target)."),
        click.option("--capacitance", "tuning_capacitance", type=QuantityType("F"),
                     help="The capacitor across the coil, with --target-frequency."),
    ]
    return functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


def resolve_target(target, target_frequency, tuning_capacitance, at):
    """(target inductance, operating frequency) from --target or --target-frequency with --capacitance.

    To resonate with C at f the coil must show L = 1/((2πf)²·C) there: its own self-capacitance
    is in parallel with C, and the apparent inductance L/(1 − ω²LC_self) absorbs it exactly.
    """
    if target_frequency is None and tuning_capacitance is None:
        return target, at
    if target_frequency is None or tuning_capacitance is None:
        missing = "--capacitance" if tuning_capacitance is None else "--target-frequency"
        raise InvalidInputError(missing, "both --target-frequency and --capacitance", None)
    if target is not None:
        raise InvalidInputError("--target", "either --target or --target-frequency with --capacitance", None)
    if at is not None and abs(at / target_frequency - 1.0) > 1e-12:
        raise InvalidInputError("--at", "the same frequency as --target-frequency, or leave it out", None)
    return resonant_inductance(target_frequency, tuning_capacitance), target_frequency


def _stack(options):
    return lambda function: functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


def coil_options(function):
    """What every air-cored form command shares: turns or target, the wire, the leads and temperature,
    readings of the coil in hand and the operating frequency."""
    from coilplan.cli._cored import measurement_type
    from coilplan.cli._types import CountType, TemperatureType

    length = QuantityType("m")
    return _stack([
        click.option("--turns", type=CountType(), help="Turns wound (forward: gives the inductance)."),
        click.option("--target", type=QuantityType("H"),
                     help="Inductance wanted, e.g. 10uH (inverse: gives the turns)."),
        click.option("--wire", "wire_text", required=True,
                     help="Bare wire diameter (0.5mm, 20mil), gauge (24awg, 26swg) or litz (40x0.1mm)."),
        click.option("--grade", type=click.Choice(["1", "2", "3", "bare"]), default="1", show_default=True,
                     help="Enamel grade (IEC 60317), or bare wire."),
        click.option("--overall", type=length, help="Measured overall (insulated) wire diameter; overrides --grade."),
        click.option("--lead", type=QuantityType("m", allow_zero=True), default="0mm", show_default=True,
                     help="Lead allowance per end, added to the wire to cut."),
        click.option("--temperature", type=TemperatureType(), default="20C", show_default=True,
                     help="Winding temperature for a second DC resistance figure."),
        click.option("--measured", "measured", type=measurement_type(), multiple=True,
                     help="A reading L@N on this coil, e.g. 47uH@30 (repeatable): calibrates the model."),
        click.option("--at", "frequency", type=QuantityType("Hz"),
                     help="Operating frequency: the target is the inductance the coil shows there; adds SRF, R, Q."),
    ])(function)


def run_model_coil(command: str, make_form, result_of, render, title: str, options: dict) -> None:
    """The whole of an air-cored form command, given how to make its form from the wire.

    ``options`` are the command's parsed options (those of :func:`coil_options`,
    :func:`measurement_options`, :func:`tuning_options`, ``--plot`` and ``--json``);
    ``make_form(wire)`` builds the uncalibrated form; ``result_of`` is its results builder.
    Readings scale the model (its shape is kept); the answer is rendered or printed as JSON.
    """
    from coilplan.cautions import tuned_circuit_cautions
    from coilplan.cli._common import captured_warnings, context_inputs, draw_impedance_plot, emit
    from coilplan.cli.solenoid import one_of
    from coilplan.wire import parse_wire

    target, frequency = resolve_target(options["target"], options["target_frequency"],
                                       options["tuning_capacitance"], options["frequency"])
    one_of(("--turns", options["turns"]), ("--target", target))
    wire = parse_wire(options["wire_text"], grade=options["grade"], overall=options["overall"], option="--wire")
    conditions = conditions_from(tolerance=options["tolerance"], meter_freq=options["meter_freq"], at=frequency,
                                 self_capacitance=options["self_capacitance"],
                                 turns_uncertainty=options["turns_uncertainty"])
    temperature = options["temperature"]
    with captured_warnings() as warnings_:
        form, readings = calibrate_form(lambda _: make_form(wire), options["measured"], conditions, "scale")
        result = result_of(form, turns=options["turns"], target=target, temperature_C=temperature,
                           measured=readings, frequency=frequency)
    draw_impedance_plot(options["plot_path"], form, result, frequency, temperature,
                        f"{title}, {result['turns']} turns")
    emit(command=command, as_json=options["as_json"], inputs=context_inputs(), result=result, warnings_=warnings_,
         cautions=tuned_circuit_cautions(options["target_frequency"] is not None), render=render)
