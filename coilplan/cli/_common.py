"""What every command shares: the --json switch, warning capture and output."""

from __future__ import annotations

import contextlib
import os
import warnings
from collections.abc import Callable, Iterator

import click

from coilplan.errors import CoilplanWarning, InvalidInputError
from coilplan.report import bullet_lines, json_document

__all__ = ["captured_warnings", "context_inputs", "draw_impedance_plot", "emit", "json_option", "plot_option"]

json_option = click.option("--json", "as_json", is_flag=True,
                           help="Print one JSON object (SI units, unit in the key) instead of text.")


@contextlib.contextmanager
def captured_warnings() -> Iterator[list[str]]:
    """Collect the library's range warnings as text, each once, in order."""
    messages: list[str] = []
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always", CoilplanWarning)
        yield messages
    for item in caught:
        if issubclass(item.category, CoilplanWarning):
            text = str(item.message)
            if text not in messages:
                messages.append(text)
        else:  # anything else keeps its ordinary treatment
            warnings.warn_explicit(item.message, item.category, item.filename, item.lineno)


def emit(*, command: str, as_json: bool, inputs: dict, result: dict, warnings_: list[str],
         cautions: list[str], render: Callable[[dict], list[str]]) -> None:
    """Print the answer: the JSON document, or the text lines with warnings and cautions."""
    if as_json:
        click.echo(json_document(command, inputs, result, warnings_, cautions))
        return
    lines = render(result)
    for block in (bullet_lines("warnings", warnings_), bullet_lines("cautions", cautions)):
        if block:
            lines = [*lines, "", *block]
    click.echo("\n".join(lines))


def _plot_path(ctx, param, value):
    """Check the --plot file's ending before any work is done."""
    if value is None:
        return None
    from coilplan.report.plot import plot_format

    plot_format(value)
    return value


plot_option = click.option("--plot", "plot_path", type=click.Path(dir_okay=False), callback=_plot_path,
                           help="Draw |Z| and Q against frequency to this file (.png, .svg or .pdf).")


def draw_impedance_plot(plot_path, form, result: dict, frequency, temperature_C: float, title: str) -> None:
    """Write the |Z| and Q plot of the answer's coil (atomically) and note the file in the result."""
    if plot_path is None:
        return
    from coilplan.apparent import has_frequency_model, impedance_sweep
    from coilplan.files import FileWriteError, write_atomically
    from coilplan.report.plot import impedance_plot, plot_format

    if not has_frequency_model(form):
        raise InvalidInputError("--plot", "a coil form with a self-capacitance model", None)
    given = result.get("self_capacitance_F") if result.get("self_capacitance_source") == "given" else None
    sweep = impedance_sweep(form, result["turns"], centre=frequency, temperature_C=temperature_C,
                            capacitance=given)
    picture = impedance_plot(sweep=sweep, operating_frequency=frequency, fmt=plot_format(plot_path), title=title)
    try:
        write_atomically(plot_path, picture)
    except FileWriteError as error:
        raise click.ClickException(f"--plot {error}") from None
    result["plot"] = str(plot_path)


_UNIT_SUFFIX = {"H/t2": "_H", "m2": "_m2"}


def context_inputs() -> dict:
    """The options the user gave, for the JSON ``inputs``: keyed by option name with the SI unit.

    ``--target 10uH`` becomes ``"target_H": 1e-05``, ``--former 25mm`` becomes ``"former_m": 0.025``,
    a repeated ``--measured L@N`` a list of ``{"inductance_H", "turns"}``; options left unset are left out.
    """
    from coilplan.cli._types import QuantityType, TemperatureType

    context = click.get_current_context()
    inputs = {}
    for param in context.command.params:
        if not isinstance(param, click.Option) or param.name in ("as_json",):
            continue
        value = context.params.get(param.name)
        if value is None or value == () or value is False:
            continue
        name = max(param.opts, key=len).lstrip("-").replace("-", "_")
        if isinstance(param.type, QuantityType):
            name += _UNIT_SUFFIX.get(param.type.unit, f"_{param.type.unit}")
        elif isinstance(param.type, TemperatureType):
            name += "_C"
        if param.type.name == "L@N":  # readings: (inductance, turns) pairs
            value = [{"inductance_H": inductance, "turns": turns} for inductance, turns in value]
        inputs[name] = str(value) if isinstance(value, os.PathLike) else value
    return inputs
