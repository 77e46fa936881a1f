"""The README stays true: its test command is CI's, and its tour output is what the commands print."""

import pathlib
import re
import shlex

import pytest
from click.testing import CliRunner

from coilplan.cli import main

ROOT = pathlib.Path(__file__).resolve().parent.parent
README = (ROOT / "README.md").read_text(encoding="utf-8")


def tour_blocks():
    """(command line, expected output) for every ```console block of the README."""
    blocks = re.findall(r"```console\n(.*?)```", README, flags=re.S)
    cases = []
    for block in blocks:
        lines = block.rstrip("\n").split("\n")
        assert lines[0].startswith("$ coilplan "), lines[0]
        cases.append(pytest.param(lines[0][2:], "\n".join(lines[1:]), id=lines[0][2:]))
    return cases


def test_readme_test_command_is_what_ci_runs():
    """The README's test command and the last line of .ci/run are the same text."""
    ci_command = (ROOT / ".ci" / "run").read_text(encoding="utf-8").strip().splitlines()[-1]
    indented = [line.strip() for line in README.splitlines() if line.startswith("    ")]
    assert ci_command in indented


@pytest.mark.parametrize(("command", "expected"), tour_blocks())
def test_readme_tour_output(command, expected):
    """Each tour command prints exactly what the README shows (stdout and stderr as a terminal shows them)."""
    result = CliRunner().invoke(main, shlex.split(command)[1:], prog_name="coilplan")
    assert result.output.rstrip("\n") == expected.rstrip("\n")
    assert "Traceback" not in result.output


def test_readme_has_a_tour():
    """The tour is there (guards against a README edit that drops every block)."""
    assert len(tour_blocks()) >= 4
