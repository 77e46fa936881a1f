"""``coilplan trim start | add | strike | show``: the measurement log of one coil being trimmed toward its target.

The coil is a closed core of unknown geometry (the default), or any form command's coil given with
``--coil "solenoid --former 25mm --wire 0.5mm"``: the text is read by that command's own parser
(:mod:`coilplan.cli.coil_text`) and kept in the log, so every reading refits the same form, through
:func:`coilplan.pipeline.design` as the command itself would.
"""

from __future__ import annotations

import contextlib
from pathlib import Path

import click

from coilplan.cli._common import captured_warnings, emit, json_option
from coilplan.cli._cored import measurement_type
from coilplan.cli._types import PercentType, QuantityType
from coilplan.errors import CoilplanWarning, InvalidInputError
from coilplan.files import WriteInterrupted, write_atomically
from coilplan.quantities import format_quantity
from coilplan.report.text import aligned_rows, bullet_lines, printable
from coilplan.report.turns_rows import henry, rewind_rows
from coilplan.request import DEFAULT_TOLERANCE
from coilplan.rewind import low_frequency_readings
from coilplan.session import TrimStep, add_reading, evaluate, fit_points, new_log, strike_reading
from coilplan.session_file import load_log, save_log, start_log
from coilplan.session_model import ClosedCoreCoil, LogWriteError, TrimLog
from coilplan.wire import parse_wire

__all__ = ["trim"]

LOG_FILE = click.Path(dir_okay=False, path_type=Path)


def _plot_path(ctx, param, value):
    """Check the --plot file's ending before anything is read or written."""
    if value is None:
        return None
    from coilplan.report.plot import plot_format

    plot_format(value)
    return value


def _same_file(one: Path, other: Path) -> bool:
    try:
        return one.resolve() == other.resolve() or (one.exists() and other.exists() and one.samefile(other))
    except (OSError, RuntimeError):  # a symlink loop: not the same file as far as we can tell
        return False


def _check_plot_beside(plot_path, file) -> None:
    """The picture must not land on the log itself: that would replace the readings with a drawing."""
    if plot_path is not None and _same_file(Path(plot_path), Path(file)):
        raise InvalidInputError("--plot", f"a file other than the trim log {file} (the picture would replace the "
                                "readings)", str(plot_path))


plot_option = click.option("--plot", "plot_path", type=LOG_FILE, callback=_plot_path,
                           help="Also draw L against N to this file (.png, .svg or .pdf).")


@contextlib.contextmanager
def _write_errors():
    """A file that cannot be written (exit status 1) or a write cut short by Ctrl-C (130): one line, the old
    file kept."""
    try:
        yield
    except (LogWriteError, WriteInterrupted) as error:
        raise _one_line(str(error), error) from None


@click.group(invoke_without_command=True)
@click.pass_context
def trim(ctx: click.Context) -> None:
    """The measurement log of one coil being trimmed toward its target (one JSON file per coil).

    Start the log with the target and the coil (a closed core of unknown geometry unless --coil
    describes it as a form command would), then after each change of turns give the new reading
    with `add`: every reading refits the coil's model and prints the next step. A second reading
    at the same turns is a re-measure (the fit sees their mean); `strike` leaves a misread one out.
    """
    if ctx.invoked_subcommand is None:
        click.echo(ctx.get_help())


@trim.command()
@click.argument("file", type=LOG_FILE)
@click.option("--target", type=QuantityType("H"), required=True, help="Inductance wanted (as read at --at).")
@click.option("--coil", "coil_text", metavar="TEXT",
              help='The coil as a form command describes it, quoted, e.g. "solenoid --former 25mm --wire 0.5mm" '
                   "(solenoid, multilayer, spiral, toroid, gapped or rod); default a closed core of unknown "
                   "geometry, L = AL·N².")
@click.option("--at", "frequency", type=QuantityType("Hz"), help="Operating frequency (with --self-capacitance).")
@click.option("--meter-freq", type=QuantityType("Hz"), help="The meter's test frequency.")
@click.option("--tolerance", type=PercentType(),
              help=f"Meter accuracy per reading, e.g. 2% (assumed {DEFAULT_TOLERANCE:.0%} if not given).")
@click.option("--self-capacitance", type=QuantityType("F"),
              help="The coil's self-capacitance, to correct for frequency.")
@click.option("--offset", is_flag=True,
              help="Closed core: fit a fixed series inductance for the leads (from the second turn count).")
@click.option("--turn-length", type=QuantityType("m"),
              help="Closed core: mean length of one turn, for the wire to add or remove.")
@click.option("--wire", "wire_text", help="Closed core: the wire (for the resistance change), e.g. 0.5mm or 26swg.")
@click.option("--name", help="A name for the coil, shown in the reports.")
@click.option("--measured", "measured", type=measurement_type(), multiple=True,
              help="Readings already taken, L@N (repeatable; the last is the coil as it is now).")
@click.option("--force", is_flag=True, help="Replace a file already at FILE.")
@plot_option
@json_option
def start(file, target, coil_text, frequency, meter_freq, tolerance, self_capacitance, offset, turn_length,
          wire_text, name, measured, force, plot_path, as_json):
    """Start the log FILE for one coil: the target, the coil and how the readings are taken."""
    from coilplan.cli.coil_text import split_coil

    _check_plot_beside(plot_path, file)
    command, arguments = None, ()
    if coil_text is not None:
        for option, given, why in (("--offset", offset, "a closed core's lead fit"),
                                   ("--turn-length", turn_length, "a closed core's turn; the form knows its own"),
                                   ("--wire", wire_text, "put the wire in the --coil text")):
            if given:
                raise InvalidInputError(option, f"no {option} with --coil ({why})", None)
        command, arguments = split_coil(coil_text)
    elif self_capacitance is not None and meter_freq is None and frequency is None:
        # a closed core's log has no self-resonance to report: the value only corrects readings and target
        raise InvalidInputError("--self-capacitance", "--meter-freq and/or --at to go with it", None)
    if wire_text is not None:
        parse_wire(wire_text, option="--wire")
    log = new_log(target, name=name, offset=offset, turn_length=turn_length, wire=wire_text, command=command,
                  arguments=arguments, operating_frequency=frequency, meter_frequency=meter_freq,
                  tolerance=tolerance, self_capacitance=self_capacitance)
    for value, turns in measured:
        log = add_reading(log, value, turns)
    inputs = {"file": str(file), "target_H": target, "coil": coil_text, "frequency_Hz": frequency,
              "meter_frequency_Hz": meter_freq, "tolerance": tolerance, "self_capacitance_F": self_capacitance,
              "offset": offset, "turn_length_m": turn_length, "wire": wire_text, "name": name,
              "measured": [{"inductance_H": v, "turns": n} for v, n in measured], "force": force}
    if plot_path is not None and not measured:
        raise click.BadParameter("needs at least one reading to draw: give --measured L@N", param_hint="--plot")
    with captured_warnings() as warnings_:
        step = evaluate(log) if log.readings else None
        picture = _picture(plot_path, file, log, step)
        with _write_errors():
            start_log(file, log, force=force)
        _write_plot(plot_path, picture, file)
    _report("trim", file, log, step, inputs, warnings_, as_json, plot_path, started=True)


@trim.command()
@click.argument("file", type=LOG_FILE)
@click.option("--measured", "measured", type=measurement_type(), required=True,
              help="The coil as it is now, L@N, e.g. 96uH@27 (at turns already read: a re-measure, averaged).")
@click.option("--note", help="A note kept with the reading (what was done, the meter used).")
@plot_option
@json_option
def add(file, measured, note, plot_path, as_json):
    """Add a reading to the log FILE, refit and print the next step.

    A reading at a turn count already in the log is a re-measure: both are kept, and the fit sees
    their mean (one point per turn count).
    """
    _check_plot_beside(plot_path, file)
    value, turns = measured
    log = add_reading(load_log(file), value, turns, note=note)
    inputs = {"file": str(file), "measured": {"inductance_H": value, "turns": turns}, "note": note}
    with captured_warnings() as warnings_:
        step = evaluate(log)  # a refit that fails leaves the file as it was
        picture = _picture(plot_path, file, log, step)
        with _write_errors():
            save_log(file, log)
        _write_plot(plot_path, picture, file)
    _report("trim", file, log, step, inputs, warnings_, as_json, plot_path)


@trim.command()
@click.argument("file", type=LOG_FILE)
@click.argument("number", metavar="K", type=int)
@click.option("--why", help="Why it is struck out (kept with the reading), e.g. 'typed 10 for 100'.")
@plot_option
@json_option
def strike(file, number, why, plot_path, as_json):
    """Strike reading K (as trim show numbers them) out of the log FILE: it stays in the file, marked
    with the time and the reason, and is left out of the fit; refit and print the next step."""
    _check_plot_beside(plot_path, file)
    log = strike_reading(load_log(file), number, why=why)
    inputs = {"file": str(file), "reading": number, "why": why}
    if plot_path is not None and not fit_points(log):
        raise click.BadParameter("needs at least one reading not struck out to draw", param_hint="--plot")
    with captured_warnings() as warnings_:
        step = evaluate(log) if fit_points(log) else None  # a refit that fails leaves the file as it was
        picture = _picture(plot_path, file, log, step)
        with _write_errors():
            save_log(file, log)
        _write_plot(plot_path, picture, file)
    _report("trim", file, log, step, inputs, warnings_, as_json, plot_path)


@trim.command()
@click.argument("file", type=LOG_FILE)
@plot_option
@json_option
def show(file, plot_path, as_json):
    """Print the state of the log FILE: the readings, the fit and the next step (FILE is not changed)."""
    _check_plot_beside(plot_path, file)
    log = load_log(file)
    if plot_path is not None and not fit_points(log):
        raise click.BadParameter("needs at least one reading in the log to draw", param_hint="--plot")
    with captured_warnings() as warnings_:
        step = evaluate(log) if fit_points(log) else None
        picture = _picture(plot_path, file, log, step)
        _write_plot(plot_path, picture, file, saved=False)
    _report("trim", file, log, step, {"file": str(file)}, warnings_, as_json, plot_path)


def _curve(log: TrimLog, step: TrimStep):
    """The calibrated model to draw (at the meter's frequency, where the readings were taken) and its label."""
    import warnings

    form = step.form
    model = getattr(form, "reference_inductance", form.inductance)

    def curve(turns):
        with warnings.catch_warnings():  # the drawing runs past the readings: no range warnings for it
            warnings.simplefilter("ignore", CoilplanWarning)
            return model(turns)

    fit = step.fit
    if fit.kind == "al":
        label = "fitted: L = AL·N² + L0" if step.fields.get("offset_H") else "fitted: L = AL·N²"
    else:
        label = f"model × {fit.value:.4f}, fitted"
    lowest = 0.0 if isinstance(log.coil, ClosedCoreCoil) else float(form.min_turns())
    return curve, label, lowest


def _picture(plot_path, file, log: TrimLog, step: TrimStep | None) -> bytes | None:
    """The plot's bytes (drawn before anything is saved, so a missing matplotlib changes no file)."""
    if plot_path is None or step is None:
        return None
    from coilplan.report.plot import plot_format, trim_plot

    fields = step.fields
    readings = [(point.inductance, point.turns) for point in step.points]
    conditions = step.conditions
    corrected = conditions.self_capacitance is not None and conditions.meter_frequency is not None
    curve, label, lowest = _curve(log, step)
    return trim_plot(readings=low_frequency_readings(readings, conditions), curve=curve, curve_label=label,
                     target=fields["target_low_frequency_H"], tolerance=conditions.tolerance,
                     turns=fields["turns"], inductance=fields["inductance_H"], fmt=plot_format(plot_path),
                     title=f"{_shown(log.coil.name) or Path(file).name}: trimming toward {henry(log.target_H)}",
                     low_frequency=corrected or fields["target_low_frequency_H"] != log.target_H, lowest=lowest)


def _write_plot(plot_path, picture: bytes | None, file, saved: bool = True) -> None:
    if plot_path is None or picture is None:
        return
    try:
        write_atomically(plot_path, picture)
    except (LogWriteError, WriteInterrupted) as error:
        kept = f"; the log {file} was saved" if saved else ""
        raise _one_line(f"--plot {error}{kept}", error) from None


def _one_line(text: str, error: Exception) -> click.ClickException:
    """The message as a one-line exit: status 130 for an interrupt, 1 for a file that cannot be written."""
    from coilplan.cli import INTERRUPTED

    failure = click.ClickException(text)
    failure.exit_code = INTERRUPTED if isinstance(error, WriteInterrupted) else 1
    return failure


def _result(file, log: TrimLog, step: TrimStep | None, plot_path) -> dict:
    result = dict(step.fields) if step is not None else {"target_H": log.target_H, "tolerance": log.tolerance,
                                                         "tolerance_assumed": log.tolerance_assumed}
    residual_of, mean_of = {}, {}
    if step is not None:
        result["points"] = []
        for point, residual in zip(step.points, step.fields["residuals"], strict=True):
            result["points"].append({"inductance_H": point.inductance, "turns": point.turns,
                                     "readings": list(point.numbers), "residual": residual})
            for number in point.numbers:
                residual_of[number], mean_of[number] = residual, point.numbers
    result["readings"] = []
    for number, reading in enumerate(log.readings, start=1):
        struck = reading.struck
        result["readings"].append({
            "inductance_H": reading.inductance_H, "turns": reading.turns, "time": reading.time.isoformat(),
            "note": reading.note, "residual": residual_of.get(number),
            "struck": None if struck is None else {"time": struck.time.isoformat(), "why": struck.why},
            "averaged_with": [other for other in mean_of.get(number, ()) if other != number]})
    result["notices"] = list(step.notices) if step is not None else []
    result["file"] = str(file)
    result["coil"] = log.coil.model_dump(mode="json")
    if plot_path is not None and step is not None:
        result["plot"] = str(plot_path)
    return result


def _report(command, file, log, step, inputs, warnings_, as_json, plot_path, started=False) -> None:
    if step is not None:
        warnings_ = [*step.warnings, *(text for text in warnings_ if text not in step.warnings)]
    result = _result(file, log, step, plot_path)
    emit(command=command, as_json=as_json, inputs={k: v for k, v in inputs.items() if v is not None},
         result=result, warnings_=warnings_, cautions=list(step.cautions) if step is not None else [],
         render=lambda fields: _lines(fields, log, started))


def _shown(text: str | None) -> str | None:
    """Text from the log as one printable line (:func:`coilplan.report.text.printable`)."""
    return None if text is None else printable(text)


def _when(stamp: str) -> str:
    return stamp.replace("T", " ")[:16]


def _model_rows(result: dict, log: TrimLog) -> list[tuple[str, ...]]:
    """The calibrated model: a closed core's AL (and leads), or a form's calibration."""
    if isinstance(log.coil, ClosedCoreCoil):
        rows = [("AL value", f"{format_quantity(result['al_H'], 'H', 4)} per turn²", "fitted, L = AL·N²")]
        if result["offset_H"]:
            rows.append(("leads", henry(result["offset_H"]), "fitted series part, L = AL·N² + L0"))
        if "resistance_change_ohm" in result:
            rows.append(("resistance change", format_quantity(result["resistance_change_ohm"], "ohm", 3)))
        return rows
    calibration = result["calibration"]
    if calibration["kind"] == "al":
        rows = [("AL value", f"{format_quantity(calibration['value'], 'H', 4)} per turn²", "fitted, L = AL·N²")]
    else:
        rows = [("calibrated", f"× {calibration['value']:.4f}", "the model scaled to the readings")]
    if "mu_fitted" in result:
        rows.append(("permeability", f"{result['mu_fitted']:.4g}", "fitted: the model reads the last reading"))
    return rows


def _reading_rows(result: dict) -> list[tuple[str, ...]]:
    rows = []
    for number, reading in enumerate(result["readings"], start=1):
        struck = reading["struck"]
        if struck is not None:
            extra = f"struck out {_when(struck['time'])}" + (f": {_shown(struck['why'])}" if struck["why"] else "")
            extra += f"; taken {_when(reading['time'])}"
        elif reading["residual"] is None:
            extra = _when(reading["time"])
        else:
            extra = f"{reading['residual']:+.2%} off the fit"
            if reading["averaged_with"]:
                numbers = sorted([number, *reading["averaged_with"]])
                extra = f"in the mean of readings {', '.join(map(str, numbers[:-1]))} and {numbers[-1]}, " + extra
            extra += f", {_when(reading['time'])}"
        if reading["note"]:
            extra += f", {_shown(reading['note'])}"
        rows.append((f"reading {number}", f"{henry(reading['inductance_H'])} at {reading['turns']} turns", extra))
    return rows


def _lines(result: dict, log: TrimLog, started: bool) -> list[str]:
    """The text report: the answer rows, the fitted model, the readings with residuals, the notices."""
    name = _shown(log.coil.name)
    who = f"{name} ({result['file']})" if name else result["file"]
    assumed = " (assumed)" if log.tolerance_assumed else ""
    title = f"Trim log {who}: {_shown(log.coil.text)}, to {henry(log.target_H)}"
    head = [title, ""]
    if "turns_now" not in result:
        what = "started" if started else ("no readings yet" if not log.readings else "every reading struck out")
        return [*head, *aligned_rows([
            ("log", what, f"meter tolerance ±{log.tolerance:.1%}{assumed}"),
            *_reading_rows(result),
            ("next", f"measure the coil, then: coilplan trim add {result['file']} --measured L@N"),
        ])]
    rows = rewind_rows(result) + _model_rows(result, log) + _reading_rows(result)
    lines = [*head, *aligned_rows(rows)]
    notices = bullet_lines("notices", [_shown(text) for text in result["notices"]])
    if "plot" in result:
        lines.append(f"  plot written to {result['plot']}")
    return [*lines, *(["", *notices] if notices else [])]
