"""What every command shares: the --json switch, warning capture and output."""

from __future__ import annotations

import contextlib
import warnings
from collections.abc import Callable, Iterator

import click

from coilplan.errors import CoilplanWarning
from coilplan.report import bullet_lines, json_document

__all__ = ["captured_warnings", "emit", "json_option"]

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
