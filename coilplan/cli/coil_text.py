"""A coil described as a form command's own options: ``solenoid --former 25mm --wire 0.5mm``.

The trim log (``coilplan trim start --coil TEXT``) keeps a coil's description as the command's name and its
argument list, and rebuilds the form from them at every reading. The text is read by that command's own
click parser (``command.make_context``) and its module's ``form_from(options)``, so a coil in the log is
described, checked and built exactly as on that command's line; the request that goes with it is the
command's own :func:`coilplan.cli._measured.request_from`, with the log's target, conditions and readings
where the command line would have ``--target``, ``--at``, ``--meter-freq``, ``--tolerance``,
``--self-capacitance`` and ``--measured``. Those belong to the log, so the description may not give them.

Examples
--------
>>> coil = parse_coil("solenoid", ["--former", "25mm", "--wire", "0.5mm"])
>>> coil.text
'solenoid --former 25mm --wire 0.5mm'
>>> form, request = coil.form_and_request(target=10e-6, readings=((20e-6, 30),))
>>> type(form).__name__, request.target, request.readings[0].turns
('Solenoid', 1e-05, 30)
"""

from __future__ import annotations

import importlib
import shlex
from collections.abc import Sequence
from dataclasses import dataclass

import click

from coilplan.errors import InvalidInputError

__all__ = ["FORM_COMMANDS", "CoilTextError", "DescribedCoil", "parse_coil", "split_coil"]

#: The commands whose coil a trim log can hold: each module has ``form_from(options)``.
FORM_COMMANDS = ("gapped", "multilayer", "rod", "solenoid", "spiral", "toroid")

#: Options of a form command that the trim log sets itself (option parameter -> where it comes from instead).
LOG_OPTIONS = {
    "target": "a trim start option (the log's target)",
    "frequency": "a trim start option (--at, the log's operating frequency)",
    "meter_freq": "a trim start option (the log's meter)",
    "tolerance": "a trim start option (the log's meter)",
    "self_capacitance": "a trim start option (the log's)",
    "measured": "the log's readings: give them to trim start or trim add",
    "turns": "not for a trim log: the readings give the turns now",
    "target_frequency": "not for a trim log: give the inductance wanted with --target",
    "tuning_capacitance": "not for a trim log: give the inductance wanted with --target",
    "turns_uncertainty": "not for a trim log: its turn counts are taken as exact",
    "test_wire": "not for a trim log: its readings are of the coil itself",
    "test_pitch": "not for a trim log: its readings are of the coil itself",
    "test_length": "not for a trim log: its readings are of the coil itself",
    "measured_q": "not for a trim log: a Q reading belongs to one winding, not to the log",
    "plot_path": "a trim option (--plot draws the log)",
    "as_json": "a trim option",
}

#: A reading standing in for the first one when a log starts without any: every refit has readings, and a
#: cored command builds its form differently with them (the core then comes from the readings).
_PROBE_READING = (1e-6, 1)


class CoilTextError(InvalidInputError):
    """A coil description that cannot be used: ``--coil: solenoid --former: expected ...`` on one line.

    Parameters
    ----------
    problem : str
        What is wrong, naming the command and its option.
    """

    def __init__(self, problem: str):
        from coilplan.report.text import printable

        problem = printable(problem)  # it may quote the description's own text (typed, or from a log file)
        super().__init__("--coil", problem, None)
        self.problem = problem

    def __str__(self) -> str:
        return f"--coil: {self.problem}"


def split_coil(text: str) -> tuple[str, tuple[str, ...]]:
    """(command, arguments) of a description typed as one text, split as a shell would.

    Examples
    --------
    >>> split_coil("rod --rod-length 100mm --rod-diameter '10 mm'")
    ('rod', ('--rod-length', '100mm', '--rod-diameter', '10 mm'))
    """
    try:
        words = shlex.split(text)
    except ValueError as error:  # an unclosed quote
        raise CoilTextError(f"a coil description in shell words ({error}); got {text!r}") from None
    if not words:
        raise CoilTextError(f"a form command and its options, e.g. \"solenoid --former 25mm --wire 0.5mm\" "
                            f"(one of {', '.join(FORM_COMMANDS)})")
    return words[0], tuple(words[1:])


@dataclass(frozen=True)
class DescribedCoil:
    """A coil as a form command describes it: the command, its arguments and the options they parse to."""

    command: str
    arguments: tuple[str, ...]
    options: dict

    @property
    def text(self) -> str:
        """The description as one would type it after ``coilplan``."""
        return shlex.join([self.command, *self.arguments])

    def options_with(self, *, target: float, frequency: float | None = None, meter_frequency: float | None = None,
                     tolerance: float | None = None, self_capacitance: float | None = None,
                     readings: Sequence[tuple[float, int]] = ()) -> dict:
        """The command's options with the log's target, conditions and readings where its command line would
        have them (``--target``, ``--at``, ``--meter-freq``, ``--tolerance``, ``--self-capacitance``,
        ``--measured``)."""
        return {**self.options, "target": target, "frequency": frequency, "meter_freq": meter_frequency,
                "tolerance": tolerance, "self_capacitance": self_capacitance,
                "measured": tuple((float(value), int(turns)) for value, turns in readings)}

    def request(self, **fields):
        """The command's own ``request_from`` on :meth:`options_with` (the same keywords)."""
        from coilplan.cli._measured import request_from

        return request_from(self.options_with(**fields))

    def form_and_request(self, **fields):
        """(uncalibrated form, Request): the command's own ``form_from`` and ``request_from`` on
        :meth:`options_with` (the same keywords)."""
        from coilplan.cli._measured import request_from

        options = self.options_with(**fields)
        return self._form(options), request_from(options)

    def _form(self, options: dict):
        module = importlib.import_module(f"coilplan.cli.{self.command}")
        try:
            return module.form_from(options)
        except CoilTextError:
            raise
        except InvalidInputError as error:
            from coilplan.cli._fields import in_option_words

            error = in_option_words(error)
            hint = " (the log's readings are its --measured)" if error.option == "--measured" else ""
            got = f"; got {error.got!r}" if error.got is not None else ""
            raise CoilTextError(f"{self.command} {error.option}: expected {error.expected}{got}{hint}") from None


def parse_coil(command: str, arguments: Sequence[str]) -> DescribedCoil:
    """Read a coil description with the command's own parser and check that it builds a form.

    The form is built as every refit will build it, with readings (a stand-in for the first one when there
    are none yet): a cored command takes its core from the readings then.

    Raises
    ------
    CoilTextError
        Not a form command, an option the command does not know or a value it refuses, an option the
        trim log sets itself (``--target``, ``--measured`` ...), or a description the form refuses.
    """
    if command not in FORM_COMMANDS:
        raise CoilTextError(f"a form command first, one of {', '.join(FORM_COMMANDS)} (a closed core of unknown "
                            f"geometry needs no --coil); got {command!r}")
    arguments = tuple(str(argument) for argument in arguments)
    click_command = getattr(importlib.import_module(f"coilplan.cli.{command}"), command)
    try:
        context = click_command.make_context(command, list(arguments), help_option_names=[])
    except click.BadParameter as error:
        name = max(error.param.opts, key=len) if error.param is not None and error.param.opts else None
        text = f" {name}: {error.message}" if name and error.message else f": {error.format_message()}"
        raise CoilTextError(f"{command}{text}") from None
    except click.ClickException as error:
        raise CoilTextError(f"{command}: {error.format_message()}") from None
    for param in click_command.params:
        if param.name in LOG_OPTIONS and context.get_parameter_source(param.name) not in (
                None, click.core.ParameterSource.DEFAULT):
            option = max(param.opts, key=len)
            raise CoilTextError(f"the coil alone, without {option}: {LOG_OPTIONS[param.name]}")
    coil = DescribedCoil(command, arguments, dict(context.params))
    coil._form({**coil.options, "measured": (_PROBE_READING,)})
    return coil
