"""The ``coilplan`` command line: a thin layer that parses, calls the library and renders.

Commands are imported only when they run, so a plain solve does not pay for
the imports of commands it does not use. Errors are mapped here, once: the
library's field names become the options of the command that ran
(:mod:`coilplan.cli._fields`); bad input is one line on stderr and exit status 2,
an infeasible request one line and exit status 1, never a traceback.
"""

from __future__ import annotations

import importlib
import os
import sys

import click

from coilplan.errors import InfeasibleError, InvalidInputError

__all__ = ["INTERRUPTED", "main", "run"]

#: Exit status after Ctrl-C: 128 + SIGINT, as shells report it (common practice, no source).
INTERRUPTED = 130

# command name -> (module under coilplan.cli, function, one-line help)
_COMMANDS: dict[str, tuple[str, str, str]] = {
    "materials": ("materials", "materials", "Generic core material classes; which ones a measured permeability fits."),
    "solenoid": ("solenoid", "solenoid", "Single-layer air-core coil: inductance from turns, or turns for a target."),
    "multilayer": ("multilayer", "multilayer", "Multilayer air-core coil on a former or bobbin: exact turn-by-turn."),
    "spiral": ("spiral", "spiral", "Flat spiral (pancake) coil: inductance from turns, or turns for a target."),
    "toroid": ("toroid", "toroid", "Ring core: AL (IEC 60205), turns, fit in the hole, saturation."),
    "rewind": ("rewind", "rewind", "Measured coil on a closed core: turns to add or remove, from readings alone."),
    "rod": ("rod", "rod", "Coil on a ferrite rod: turns or inductance, calibrated by a reading."),
    "gapped": ("gapped", "gapped", "Gapped core (E, pot, drum): AL with fringing, turns or gap, saturation."),
    "wire": ("wire", "wire", "Wire gauges: bare and enamelled diameters, resistance, current."),
    "tank": ("tank", "tank", "Tuned circuits: L, C and f; band coverage; L and stray C from resonances."),
    "trim": ("trim", "trim", "The measurement log of one coil being trimmed: start, add a reading, show."),
    "count-turns": ("count_turns", "count_turns", "Unknown turn count: added turns, test winding, DC resistance."),
    "kit": ("kit", "kit", "Many coils from the stock on hand: assignment, bill of materials, winding cards."),
}


class _CoilplanGroup(click.Group):
    """A click group with lazily imported commands and one-line errors."""

    def list_commands(self, ctx: click.Context) -> list[str]:
        return sorted(_COMMANDS)

    def get_command(self, ctx: click.Context, cmd_name: str) -> click.Command | None:
        if cmd_name not in _COMMANDS:
            return None
        module_name, attribute, _ = _COMMANDS[cmd_name]
        module = importlib.import_module(f"coilplan.cli.{module_name}")
        return getattr(module, attribute)

    def invoke(self, ctx: click.Context):
        try:
            return super().invoke(ctx)
        except (InvalidInputError, InfeasibleError) as error:  # the library's field as the option typed
            from coilplan.cli._fields import in_option_words

            raise in_option_words(error, ctx.invoked_subcommand) from None

    def format_commands(self, ctx: click.Context, formatter: click.HelpFormatter) -> None:
        # Short help from the table, without importing every command module.
        rows = [(name, _COMMANDS[name][2]) for name in self.list_commands(ctx)]
        with formatter.section("Commands"):
            formatter.write_dl(rows)

    def main(self, args=None, prog_name=None, complete_var=None, standalone_mode=True, **extra):
        import warnings

        try:
            # arithmetic that runs off the end (an overflow on an absurd input) is judged by its result, which
            # every answer checks: never printed raw; the library's own warnings reach the answer
            with warnings.catch_warnings():
                warnings.simplefilter("ignore", RuntimeWarning)
                code = super().main(args=args, prog_name=prog_name or "coilplan",
                                    complete_var=complete_var, standalone_mode=False, **extra)
        except click.exceptions.NoArgsIsHelpError as error:  # bare `coilplan`: the help, as asked
            click.echo(error.ctx.get_help() if error.ctx else error.format_message())
            code = 0
        except click.MissingParameter as error:
            code = _fail(_missing_text(error), 2)
        except click.BadParameter as error:
            code = _fail(_bad_parameter_text(error), 2)
        except click.UsageError as error:
            where = error.ctx.command_path if error.ctx else "coilplan"
            code = _fail(f"{error.format_message()} (see '{where} --help')", 2)
        except InvalidInputError as error:
            code = _fail(str(error), 2)
        except InfeasibleError as error:
            code = _fail(f"cannot be done: {error}", 1)
        except click.ClickException as error:
            code = _fail(error.format_message(), error.exit_code)
        except (click.Abort, KeyboardInterrupt) as error:  # Ctrl-C: never the status of "cannot be done"
            cause = error.__cause__ or error.__context__
            code = _fail(str(cause) if type(cause).__name__ == "WriteInterrupted" else "interrupted", INTERRUPTED)
        except BrokenPipeError:  # output piped into `head`: not an error of ours
            code = 0
        except Exception as error:  # a defect of ours: still one line, never a traceback
            if os.environ.get("COILPLAN_DEBUG"):
                raise
            code = _fail(f"internal error ({type(error).__name__}: {error}); please report it with "
                         "the command line that caused it (COILPLAN_DEBUG=1 shows the traceback)", 1)
        code = code if isinstance(code, int) else 0
        if standalone_mode:
            sys.exit(code)
        return code


def run() -> None:
    """The ``coilplan`` script: the command line, with Ctrl-C during start-up a one-line exit too."""
    try:
        main(prog_name="coilplan")
    except KeyboardInterrupt:
        _fail("interrupted", INTERRUPTED)
        sys.exit(INTERRUPTED)


def _bad_parameter_text(error: click.BadParameter) -> str:
    if error.param is not None and error.param.opts:
        name = max(error.param.opts, key=len)
    elif error.param is not None:
        name = error.param.human_readable_name
    else:
        name = error.param_hint or "value"
    return f"{name}: {error.message}"


def _missing_text(error: click.MissingParameter) -> str:
    """A required option or argument left out: its name, what it expects, and where the help is."""
    param, where = error.param, error.ctx.command_path if error.ctx else "coilplan"
    if param is None:
        return f"a required value is missing (see '{where} --help')"
    if isinstance(param, click.Option):
        name = max(param.opts, key=len)
        wanted = (param.help or param.type.name).rstrip(".")
        return f"{name}: expected {wanted[:1].lower() + wanted[1:]}; it is required (see '{where} --help')"
    name = param.human_readable_name
    return f"{name}: expected the {name.lower().replace('_', ' ')} argument; it is required (see '{where} --help')"


def _fail(message: str, code: int) -> int:
    """Print one line on stderr and return the exit status."""
    message = " ".join(str(message).split())
    click.echo(f"coilplan: error: {message}", err=True)
    return code


@click.group(cls=_CoilplanGroup, context_settings={"help_option_names": ["-h", "--help"],
                                                    "max_content_width": 100})
@click.version_option(package_name="coilplan", prog_name="coilplan")
def main() -> None:
    """Plan coil windings: inductance from turns, and turns for a target inductance.

    Values take their units, as on a datasheet: 10uH, 330pF, 1.2MHz, 25mm, 1in, 20mil.
    Add --json to any command for machine-readable output (SI units, unit in the key).
    """
