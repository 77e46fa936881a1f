"""What every form command shares: the options of a request, the request they make, and the one ending."""

from __future__ import annotations

import contextlib
import functools

import click

from coilplan.cli._types import PercentType, QuantityType
from coilplan.errors import InvalidInputError
from coilplan.request import DEFAULT_TOLERANCE, Reading, Request

__all__ = [
    "form_options",
    "measurement_options",
    "readings_from",
    "request_from",
    "run_form",
    "test_winding_options",
    "tuning_options",
    "winding_options",
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


def tuning_options(function):
    """--target-frequency with --capacitance: wind for resonance with a given capacitor."""
    options = [
        click.option("--target-frequency", type=QuantityType("Hz"),
                     help="Resonate at this frequency with --capacitance (instead of --target)."),
        click.option("--capacitance", "tuning_capacitance", type=QuantityType("F"),
                     help="The capacitor across the coil, with --target-frequency."),
    ]
    return functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


def _stack(options):
    return lambda function: functools.reduce(lambda wrapped, option: option(wrapped), reversed(options), function)


def winding_options(function):
    """What every form command shares: turns or target, the wire, the leads and temperature, readings of the
    coil in hand and the operating frequency (one definition, so one name and unit per idea)."""
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
                     help="Working temperature of the winding: a second DC resistance; derates a core's B_sat."),
        click.option("--measured", "measured", type=measurement_type(), multiple=True,
                     help="A reading L@N on the coil or a test winding, e.g. 47uH@30 (repeatable): calibrates "
                          "the model (a core's AL, or the scale of a model whose shape matters)."),
        click.option("--at", "frequency", type=QuantityType("Hz"),
                     help="Operating frequency: the target is the inductance the coil shows there; adds SRF, R, Q."),
    ])(function)


def form_options(cored: bool = False):
    """Every option a form command shares, after its own geometry: the winding and readings, the core and
    drive where it has a core, the meter, the test winding, the tuning, the plot and --json."""
    from coilplan.cli._common import json_option, plot_option
    from coilplan.cli._cored import core_options

    shared = [winding_options, *([core_options] if cored else []), measurement_options, test_winding_options,
              tuning_options, plot_option, json_option]
    return _stack(shared)


def test_winding_options(function):
    """--test-wire, --test-pitch, --test-length: the winding the readings were taken on, where it is not the coil's."""
    length = QuantityType("m")
    return _stack([
        click.option("--test-wire", help="The wire of the test winding the readings were taken on, where it is "
                                         "not --wire (e.g. 0.3mm)."),
        click.option("--test-pitch", type=length, help="The test winding's pitch, where it is not close wound."),
        click.option("--test-length", type=length,
                     help="The test winding's length, where its turns were spread over a fixed length."),
    ])(function)


def readings_from(options: dict) -> tuple[Reading, ...]:
    """The --measured readings, each on the test winding when --test-wire, --test-pitch or --test-length is given."""
    from coilplan.wire import parse_wire

    test_wire = options.get("test_wire")
    wire = None
    if test_wire is not None:
        wire = parse_wire(test_wire, grade=options.get("grade", "1"), option="--test-wire")
    pitch, length = options.get("test_pitch"), options.get("test_length")
    if (wire is not None or pitch is not None or length is not None) and not options.get("measured"):
        given = "--test-wire" if wire is not None else ("--test-pitch" if pitch is not None else "--test-length")
        raise InvalidInputError(given, "a --measured L@N reading taken on that test winding", None)
    return tuple(Reading(value, turns, wire=wire, pitch=pitch, winding_length=length)
                 for value, turns in options.get("measured") or ())


def request_from(options: dict) -> Request:
    """The request a form command's options make (:mod:`coilplan.request`); drive and core where it has them."""
    from coilplan.request import CoreFacts, Drive

    tuning = None
    if options.get("target_frequency") is not None or options.get("tuning_capacitance") is not None:
        if options.get("target_frequency") is None or options.get("tuning_capacitance") is None:
            missing = "--capacitance" if options.get("tuning_capacitance") is None else "--target-frequency"
            raise InvalidInputError(missing, "both --target-frequency and --capacitance", None)
        tuning = (options["target_frequency"], options["tuning_capacitance"])
    if options.get("turns") is None and options.get("target") is None and tuning is None:
        raise InvalidInputError("--turns", "one of --turns or --target", None)
    drive = Drive()
    if "current" in options:
        drive = Drive(dc_current=options["current"], ac_current=options["ac_current"],
                      ac_voltage=options["ac_voltage"], flux_limit=options.get("max_flux"))
    core = CoreFacts(material=options.get("material"), loss_factor=options.get("loss_factor"),
                     measured_q=options.get("measured_q"))
    return Request(turns=options.get("turns"), target=options.get("target"), tuning=tuning,
                   frequency=options.get("frequency"), readings=readings_from(options),
                   meter_frequency=options.get("meter_freq"), tolerance=options.get("tolerance"),
                   self_capacitance=options.get("self_capacitance"),
                   turns_uncertainty=options.get("turns_uncertainty") or 0.0,
                   temperature=options.get("temperature", 20.0), drive=drive, core=core)


@contextlib.contextmanager
def infeasible_as_json(command: str, as_json: bool, warnings_: list[str]):
    """With --json, a request that cannot be done still prints one JSON object (no result, the reason in
    ``error``) before the one-line message on stderr and exit status 1."""
    from coilplan.cli._common import context_inputs
    from coilplan.cli._fields import in_option_words
    from coilplan.errors import InfeasibleError
    from coilplan.report.json_report import json_document

    try:
        yield
    except InfeasibleError as error:
        if as_json:
            worded = in_option_words(error, command)
            click.echo(json_document(command, context_inputs(), None, warnings_, (),
                                     error={"message": f"cannot be done: {worded}", "exit_status": 1,
                                            "achievable_H": list(error.achievable) if error.achievable else None}))
        raise


def run_form(command: str, form_from, options: dict, title: str) -> None:
    """The whole of a form command: its form (``form_from(options)``), the request, :func:`coilplan.pipeline.design`,
    the plot if asked, and the answer printed (text or JSON).
    """
    from coilplan.cli._common import captured_warnings, context_inputs, draw_impedance_plot, emit
    from coilplan.pipeline import design
    from coilplan.report.answer_text import answer_lines

    with captured_warnings() as warnings_, infeasible_as_json(command, options["as_json"], warnings_):
        answer = design(form_from(options), request_from(options))
    result = dict(answer.result)
    draw_impedance_plot(options.get("plot_path"), answer.form, result, answer.request.operating_frequency,
                        answer.request.temperature, f"{title}, {result['turns']} turns")
    emit(command=command, as_json=options["as_json"], inputs=context_inputs(), result=result,
         warnings_=list(dict.fromkeys(warnings_ + list(answer.warnings))), cautions=list(answer.cautions),
         render=lambda figures: answer_lines(command, figures))
