"""The README stays true: its test command is CI's, and its tour output is what the commands print."""

import pathlib
import re
import shlex
import shutil

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
def test_readme_tour_output(command, expected, tmp_path, monkeypatch):
    """Each tour command prints exactly what the README shows (stdout and stderr as a terminal shows them).

    The tour runs in order in one empty folder, as a reader would type it (the trim log's file).
    """
    monkeypatch.chdir(_tour_folder(tmp_path))
    result = CliRunner().invoke(main, shlex.split(command)[1:], prog_name="coilplan")
    assert _timeless(result.output.rstrip("\n")) == _timeless(expected.rstrip("\n"))
    assert "Traceback" not in result.output


_FOLDER: list = []


def _timeless(text):
    """The trim log stamps each reading with the time it was taken: compare the rest."""
    return re.sub(r"\d{4}-\d{2}-\d{2} \d{2}:\d{2}", "<time>", text)


def _tour_folder(tmp_path):
    """One folder for the whole tour, so a later command finds the file an earlier one wrote;
    it holds a copy of examples/, as a reader's clone does."""
    if not _FOLDER:
        shutil.copytree(ROOT / "examples", tmp_path / "examples")
        _FOLDER.append(tmp_path)
    return _FOLDER[0]


def test_readme_python_examples_run_as_shown():
    """The ```python blocks of the README are doctests: each line's output is what the library prints."""
    import doctest

    blocks = re.findall(r"```python\n(.*?)```", README, flags=re.S)
    assert blocks, "the README has a From Python section"
    for number, block in enumerate(blocks):
        test = doctest.DocTestParser().get_doctest(block, {}, f"README python block {number + 1}", "README.md", 0)
        runner = doctest.DocTestRunner(optionflags=doctest.NORMALIZE_WHITESPACE)
        runner.run(test)
        assert runner.failures == 0, f"README python block {number + 1} fails: see the output above"


def test_readme_has_a_tour():
    """The tour is there (guards against a README edit that drops every block)."""
    assert len(tour_blocks()) >= 4
