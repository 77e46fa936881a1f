"""`coilplan trim start | add | show` through CliRunner: the next step, the plot, and a log that is never lost."""

import errno
import json
import math
import os
import sys

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main
from coilplan.rewind import closed_core_fit


def run(*args):
    result = CliRunner().invoke(main, [str(arg) for arg in args])
    assert "Traceback" not in result.stdout + result.stderr
    return result


def run_json(*args):
    result = run(*args, "--json")
    assert result.exit_code == 0, result.stdout + result.stderr
    document = flat_document(json.loads(result.stdout))
    assert document["command"] == "trim"
    return document


def one_line_error(result, code, *fragments):
    assert result.exit_code == code, result.stdout + result.stderr
    assert result.stderr.count("\n") == 1, result.stderr
    for fragment in fragments:
        assert fragment in result.stderr, (fragment, result.stderr)


@pytest.fixture
def log(tmp_path):
    """A log started for 100 µH with a 2 % meter and one reading (55 µH at 20 turns, issue 4)."""
    path = tmp_path / "coil.json"
    result = run("trim", "start", path, "--target", "100uH", "--tolerance", "2%", "--name", "demo choke",
                 "--measured", "55uH@20")
    assert result.exit_code == 0, result.stderr
    return path


def test_start_prints_the_first_answer(tmp_path):
    """start with a reading gives the N² answer: 20 turns at 55 µH → 27 turns for 100 µH (issue 4; IEC 60205 AL)."""
    document = run_json("trim", "start", tmp_path / "c.json", "--target", "100uH", "--tolerance", "2%",
                        "--measured", "55uH@20")
    result = document["result"]
    assert result["al_H"] == pytest.approx(55e-6 / 400, rel=1e-12, abs=0)
    assert result["turns_exact"] == pytest.approx(20 * math.sqrt(100 / 55), rel=1e-9, abs=0)  # hand-worked
    assert (result["turns_now"], result["turns"], result["turns_change"]) == (20, 27, 7)
    assert result["turns_range"] == [27, 27]
    assert result["file"] == str(tmp_path / "c.json")
    assert result["notices"] == []
    assert result["readings"][0]["turns"] == 20 and result["readings"][0]["residual"] == pytest.approx(0, abs=1e-12)


def test_start_without_readings_says_what_next(tmp_path):
    """start alone writes an empty log and says how to add the first reading."""
    path = tmp_path / "c.json"
    result = run("trim", "start", path, "--target", "47uH")
    assert result.exit_code == 0, result.stderr
    assert f"coilplan trim add {path} --measured L@N" in result.stdout
    assert json.loads(path.read_text())["readings"] == []


def test_start_add_show_round_trip(log):
    """Each add refits all readings (as coilplan.rewind does on them), and show repeats the state unchanged."""
    readings = [(55e-6, 20), (104e-6, 28), (98e-6, 27)]
    for value, turns in readings[1:]:
        document = run_json("trim", "add", log, "--measured", f"{value * 1e6:g}uH@{turns}", "--note", "trimmed")
    result = document["result"]
    fit = closed_core_fit(readings)
    assert result["al_H"] == pytest.approx(fit.value, rel=1e-12, abs=0)
    assert result["residuals"] == pytest.approx(list(fit.residuals), rel=1e-9, abs=1e-15)
    assert [r["turns"] for r in result["readings"]] == [20, 28, 27]
    assert result["readings"][2]["note"] == "trimmed"
    before = log.read_bytes()
    shown = run_json("trim", "show", log)
    assert log.read_bytes() == before
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "inductance_H", "al_H"):
        assert shown["result"][key] == result[key], key
    text = run("trim", "show", log)
    assert text.exit_code == 0
    assert text.stdout.startswith(f"Trim log demo choke ({log}): closed core, to 100.0 μH")
    assert "reading 3" in text.stdout and "off the fit" in text.stdout and "trimmed" in text.stdout


def test_add_names_the_inductance_rising_after_removing_turns(log):
    """L = AL·N² rises with N (IEC 60205), so 60 µH after going from 20 to 19 turns is noticed in the output."""
    document = run_json("trim", "add", log, "--measured", "60uH@19")
    assert any("rose" in text and "removing 1 turn" in text for text in document["result"]["notices"])
    text = run("trim", "show", log)
    assert "notices:" in text.stdout and "rose" in text.stdout


def test_add_says_stop_on_target(log):
    """A reading within the 2 % meter tolerance of the target says stop (common practice, no source)."""
    document = run_json("trim", "add", log, "--measured", "101uH@27")
    assert any("stop here" in text for text in document["result"]["notices"])


def test_start_refuses_an_existing_file_without_force(log):
    """start over an existing log: exit 2, one line naming the file and --force; the log byte-identical."""
    before = log.read_bytes()
    result = run("trim", "start", log, "--target", "10uH")
    one_line_error(result, 2, str(log), "--force")
    assert log.read_bytes() == before
    replaced = run("trim", "start", log, "--target", "10uH", "--force")
    assert replaced.exit_code == 0, replaced.stderr
    assert json.loads(log.read_text())["target_H"] == pytest.approx(10e-6)


@pytest.mark.parametrize("args, fragment", [
    pytest.param(["--measured", "55uH"], "--measured", id="no-turns"),
    pytest.param(["--measured", "0uH@20"], "--measured", id="zero-inductance"),
    pytest.param(["--measured", "50uH@0"], "--measured", id="zero-turns"),
    pytest.param(["--measured", "50uH@20"], "not yet in the log", id="repeated-turn-count"),
    pytest.param(["--measured", "50uH@18", "--plot", "out.gif"], "--plot", id="plot-ending"),
])
def test_add_bad_input_is_one_line_and_keeps_the_log(log, args, fragment):
    """Bad values on add: exit 2, one line naming the option; the log byte-identical."""
    before = log.read_bytes()
    one_line_error(run("trim", "add", log, *args), 2, fragment)
    assert log.read_bytes() == before


@pytest.mark.parametrize("args, fragment", [
    pytest.param(["--target", "100"], "--target", id="target-without-unit"),
    pytest.param(["--target", "100uH", "--tolerance", "2"], "--tolerance", id="tolerance-without-percent"),
    pytest.param(["--target", "100uH", "--self-capacitance", "5pF"], "--self-capacitance", id="capacitance-alone"),
    pytest.param(["--target", "100uH", "--wire", "thick"], "--wire", id="unknown-wire"),
    pytest.param(["--target", "100uH", "--plot", "x.png"], "--plot", id="plot-without-readings"),
])
def test_start_bad_input_writes_nothing(tmp_path, args, fragment):
    """Bad values on start: exit 2, one line naming the option, and no file left behind."""
    one_line_error(run("trim", "start", tmp_path / "c.json", *args), 2, fragment)
    assert os.listdir(tmp_path) == []


def test_missing_and_corrupt_logs_exit_2(tmp_path):
    """A log that is not there, or cut short, is named on one line (exit 2) and left as it was."""
    missing = tmp_path / "none.json"
    one_line_error(run("trim", "add", missing, "--measured", "50uH@20"), 2, str(missing))
    assert not missing.exists()
    broken = tmp_path / "broken.json"
    broken.write_text('{"schema": "coilplan-trim-log", "version": 1, "crea')
    before = broken.read_bytes()
    for args in (["add", broken, "--measured", "50uH@20"], ["show", broken]):
        one_line_error(run("trim", *args), 2, str(broken), "broken JSON")
    assert broken.read_bytes() == before


def test_infeasible_refit_exits_1_and_keeps_the_log(tmp_path):
    """With a lead offset, more turns reading less gives no positive AL: exit 1, one line, log unchanged."""
    path = tmp_path / "c.json"
    assert run("trim", "start", path, "--target", "100uH", "--offset", "--measured", "100uH@10").exit_code == 0
    before = path.read_bytes()
    one_line_error(run("trim", "add", path, "--measured", "90uH@40"), 1, "AL")
    assert path.read_bytes() == before


def test_full_disk_exits_1_and_keeps_the_log(log, monkeypatch):
    """ENOSPC while saving (simulated): one line with the system's reason, exit 1, the log byte-identical."""
    before = log.read_bytes()

    def full(descriptor, data):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(os, "write", full)
    result = run("trim", "add", log, "--measured", "104uH@28")
    monkeypatch.undo()
    one_line_error(result, 1, str(log), os.strerror(errno.ENOSPC))
    assert log.read_bytes() == before
    assert sorted(os.listdir(log.parent)) == ["coil.json"]


def test_read_only_folder_exits_1_and_writes_nothing(tmp_path, monkeypatch):
    """A folder refusing new files (os.open raising PermissionError, simulated): one line, exit 1, nothing left."""
    path = tmp_path / "c.json"

    def refuse(*args, **kwargs):
        raise PermissionError(errno.EACCES, os.strerror(errno.EACCES))

    monkeypatch.setattr(os, "open", refuse)
    result = run("trim", "start", path, "--target", "100uH")
    monkeypatch.undo()
    one_line_error(result, 1, str(path), "cannot write")
    assert os.listdir(tmp_path) == []


MAGIC = {"png": (b"\x89PNG",), "pdf": (b"%PDF",), "svg": (b"<?xml", b"<svg")}


@pytest.mark.parametrize("ending", ["png", "svg", "pdf"])
def test_plot_files_have_their_format(log, ending):
    """--plot writes the format its name ends in (PNG, PDF and SVG signatures: common practice, no source)."""
    picture = log.parent / f"trim.{ending}"
    document = run_json("trim", "add", log, "--measured", "96uH@27", "--plot", picture)
    assert document["result"]["plot"] == str(picture)
    assert picture.read_bytes().startswith(MAGIC[ending])
    assert not any(name.endswith(".tmp") for name in os.listdir(log.parent))


def test_svg_plot_is_reproducible(log):
    """The same log drawn twice gives a byte-identical SVG (fixed hash salt, no date)."""
    first, second = log.parent / "a.svg", log.parent / "b.svg"
    assert run("trim", "show", log, "--plot", first).exit_code == 0
    assert run("trim", "show", log, "--plot", second).exit_code == 0
    assert first.read_bytes() == second.read_bytes()


def test_plot_without_matplotlib_is_a_hint_and_keeps_the_log(log, monkeypatch):
    """Without matplotlib, --plot is one line naming the plot extra (exit 2) and the reading is not saved."""
    for name in ("matplotlib", "matplotlib.figure", "matplotlib.backends.backend_agg"):
        monkeypatch.setitem(sys.modules, name, None)
    before = log.read_bytes()
    result = run("trim", "add", log, "--measured", "96uH@27", "--plot", log.parent / "p.png")
    one_line_error(result, 2, "--plot", 'pip install "coilplan[plot]"')
    assert log.read_bytes() == before
    assert not (log.parent / "p.png").exists()


def test_trim_is_listed_in_the_help():
    """coilplan --help lists the trim group, and trim --help its three commands."""
    assert "trim" in run("--help").stdout
    bare = run("trim")
    assert bare.exit_code == 0 and "start" in bare.stdout
    text = run("trim", "--help").stdout
    assert all(name in text for name in ("start", "add", "show"))
