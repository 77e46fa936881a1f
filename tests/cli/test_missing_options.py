"""A required option or argument left out is one sentence: its name, what it expects, that it is required, and
where the help is; never the bare name (every command, every required parameter)."""

import click
import pytest
from click.testing import CliRunner

from coilplan.cli import _COMMANDS, _missing_text, main


def _commands():
    for name in sorted(_COMMANDS):
        command = main.get_command(click.Context(main), name)
        if isinstance(command, click.Group):
            for sub in sorted(command.commands):
                yield f"{name} {sub}", command.commands[sub]
        else:
            yield name, command


REQUIRED = [(path, param) for path, command in _commands() for param in command.params if param.required]


@pytest.mark.parametrize(("path", "param"), REQUIRED, ids=[f"{path} {param.name}" for path, param in REQUIRED])
def test_every_required_parameter_says_what_it_expects(path, param):
    context = click.Context(click.Command(path.split()[-1]), info_name=path)
    text = _missing_text(click.MissingParameter(ctx=context, param=param))
    name = max(param.opts, key=len) if isinstance(param, click.Option) else param.human_readable_name
    assert text.startswith(f"{name}: expected ") and "it is required" in text
    assert len(text) > len(name) + 40  # a sentence, not the bare name


@pytest.mark.parametrize("path", sorted({path for path, _ in REQUIRED}))
def test_a_command_missing_its_first_required_parameter_fails_in_one_sentence(path):
    outcome = CliRunner().invoke(main, path.split())
    assert outcome.exit_code == 2
    lines = outcome.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("coilplan: error: ")
    assert "expected" in lines[0] and "it is required" in lines[0] and not lines[0].endswith(":")
