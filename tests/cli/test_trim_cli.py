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


# --- any form through the log: the same answer as its own command ------------------------------

#: (description, target, trim start options, readings in the order taken)
FORM_LOGS = {
    # single-layer air coil, docs/methods.md §1 and §3, calibrated by a scale factor, §20
    "solenoid": ("solenoid --former 25mm --wire 0.5mm", "10uH", ["--tolerance", "1%"],
                 ["20uH@30", "12.4uH@22", "10.1uH@19"]),
    # the same at frequency: readings corrected with the winding's own self-capacitance estimate, §6b and §10
    "solenoid-at-frequency": ("solenoid --former 25mm --wire 0.5mm", "10uH",
                              ["--tolerance", "1%", "--meter-freq", "100kHz", "--at", "7MHz"],
                              ["20uH@30", "12.4uH@22", "10.3uH@19"]),
    # a coil on a ferrite rod of a named class, slice model §14, scale factor §20
    "rod": ("rod --rod-length 100mm --rod-diameter 10mm --wire 0.3mm --material nizn-125", "300uH",
            ["--tolerance", "2%"], ["200uH@40", "290uH@48"]),
    # a rod of unknown material: the last reading also sets its permeability (§20, the rod's permeability)
    "rod-unknown-material": ("rod --rod-length 100mm --rod-diameter 10mm --wire 0.3mm", "160uH",
                             ["--tolerance", "2%"], ["100uH@40", "146uH@48"]),
}

#: The answer's figures the log must share with the command: the turns and their range, and what they rest on.
SAME_KEYS = ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "turns_range_exact", "turns_below",
             "turns_above", "inductance_H", "inductance_below_H", "inductance_above_H", "uncertainty",
             "target_low_frequency_H", "apparent_inductance_H", "residuals", "explanation", "plan")


@pytest.mark.parametrize("case", sorted(FORM_LOGS))
def test_form_log_answers_as_its_command_after_each_reading(tmp_path, case):
    """After each reading the log gives what the form command gives with the same --measured readings, to 1e-9.

    Both go through one design(form, request); the model and fit are those of docs/methods.md §20 (and the
    form's own sections, see FORM_LOGS), so this checks that the log rebuilds the same form and request.
    """
    text, target, options, readings = FORM_LOGS[case]
    path = tmp_path / "coil.json"
    command = text.split()
    for count in range(1, len(readings) + 1):
        if count == 1:
            ours = run_json("trim", "start", path, "--target", target, "--coil", text, *options,
                            "--measured", readings[0])
        else:
            ours = run_json("trim", "add", path, "--measured", readings[count - 1])
        measured = [part for reading in readings[:count] for part in ("--measured", reading)]
        theirs = CliRunner().invoke(main, [*command, "--target", target, *options, *measured, "--json"])
        assert theirs.exit_code == 0, theirs.stdout + theirs.stderr
        expected = flat_document(json.loads(theirs.stdout))["result"]
        for key in SAME_KEYS:
            if isinstance(expected.get(key), float):
                assert ours["result"][key] == pytest.approx(expected[key], rel=1e-9, abs=0), (count, key)
            elif isinstance(expected.get(key), list) and expected[key] and isinstance(expected[key][0], float):
                assert ours["result"][key] == pytest.approx(expected[key], rel=1e-9, abs=1e-15), (count, key)
            else:
                assert ours["result"][key] == expected.get(key), (count, key)
        assert ours["result"]["calibration"]["value"] == pytest.approx(expected["calibration"]["value"], rel=1e-9)
        if "mu_fitted" in expected:  # the rod of unknown material
            assert ours["result"]["mu_fitted"] == pytest.approx(expected["mu_fitted"], rel=1e-9)
        else:
            assert "mu_fitted" not in ours["result"]
        assert ours["warnings"] == json.loads(theirs.stdout)["warnings"]
    assert json.loads(path.read_text())["coil"] == {"name": None, "model": "form", "command": command[0],
                                                     "arguments": command[1:]}
    shown = run("trim", "show", path)
    assert shown.exit_code == 0
    assert shown.stdout.splitlines()[0] == f"Trim log {path}: {text}, to {henry_text(target)}"


def henry_text(target: str) -> str:
    """The target as the title prints it (four significant digits)."""
    return {"10uH": "10.00 μH", "160uH": "160.0 μH", "300uH": "300.0 μH"}[target]


def test_toroid_log_fits_al_from_the_readings(tmp_path):
    """A ring core of unknown material in the log: AL = L/N² from the reading (IEC 60205, docs/methods.md §8),
    as `coilplan toroid` gives it; the text shows the fitted AL value."""
    coil = "toroid --od 12.7mm --id 7.7mm --height 4.8mm --wire 0.3mm"
    document = run_json("trim", "start", tmp_path / "t.json", "--target", "100uH", "--tolerance", "2%",
                        "--coil", coil, "--measured", "50uH@20")
    result = document["result"]
    assert result["calibration"]["value"] == pytest.approx(50e-6 / 400, rel=1e-12)  # hand-worked AL
    assert (result["turns_now"], result["turns"], result["turns_change"]) == (20, 28, 8)  # √(100/50)·20 = 28.28
    assert document["cautions"]  # the command's cautions come with it (an unknown core may be salvaged)
    text = run("trim", "show", tmp_path / "t.json").stdout
    assert "AL value        125.0 nH per turn²" in text


@pytest.mark.parametrize("coil, fragment", [
    pytest.param("solenoid --former 25mm --wire 0.5mm --target 10uH", "without --target", id="target"),
    pytest.param("solenoid --former 25mm --wire 0.5mm --turns 19", "without --turns", id="turns"),
    pytest.param("solenoid --former 25mm --wire 0.5mm --measured 20uH@30", "without --measured", id="measured"),
    pytest.param("solenoid --former 25mm --wire 0.5mm --tolerance 2%", "without --tolerance", id="tolerance"),
    pytest.param("solenoid --former 25mm --wire 0.5mm --at 7MHz", "without --at", id="at"),
    pytest.param("solenoid --former 25mm --wire 0.5mm --json", "without --json", id="json"),
    pytest.param("solenoid --former 25mm", "Missing option '--wire'", id="missing-wire"),
    pytest.param("solenoid --former 25 --wire 0.5mm", "solenoid --former: expected a length", id="bad-length"),
    pytest.param("solenoid --wire 0.5mm", "one of --former or --diameter", id="form-refuses"),
    pytest.param("solenoid --formr 25mm --wire 0.5mm", "No such option '--formr'", id="unknown-option"),
    pytest.param("solenoid --help", "No such option '--help'", id="help"),
    pytest.param("choke --turns 3", "a form command first", id="not-a-form-command"),
    pytest.param("", "a form command and its options", id="empty"),
    pytest.param("solenoid '25mm", "shell words", id="unclosed-quote"),
    pytest.param("solenoid --form\x1br 25mm --wire 0.5mm", "No such option '--form\\x1br'", id="escape-shown-escaped"),
])
def test_coil_text_refused_on_one_line_and_nothing_written(tmp_path, coil, fragment):
    """A --coil text its command refuses, or one giving what the log sets itself: exit 2, one line naming it."""
    result = run("trim", "start", tmp_path / "c.json", "--target", "10uH", "--coil", coil)
    one_line_error(result, 2, "--coil", fragment)
    assert os.listdir(tmp_path) == []


@pytest.mark.parametrize("extra", [["--wire", "0.5mm"], ["--offset"], ["--turn-length", "20mm"]])
def test_closed_core_options_beside_coil_are_refused(tmp_path, extra):
    """--wire, --offset and --turn-length describe the bare closed core: beside --coil they are one-line errors."""
    result = run("trim", "start", tmp_path / "c.json", "--target", "10uH", "--coil",
                 "solenoid --former 25mm --wire 0.5mm", *extra)
    one_line_error(result, 2, extra[0], "--coil")
    assert os.listdir(tmp_path) == []


def test_hand_edited_coil_description_names_the_file(tmp_path):
    """A stored description its command refuses is a one-line error naming the file; the log is kept."""
    path = tmp_path / "c.json"
    coil = "solenoid --former 25mm --wire 0.5mm"
    assert run("trim", "start", path, "--target", "10uH", "--coil", coil).exit_code == 0
    document = json.loads(path.read_text())
    document["coil"]["arguments"] = ["--former", "25", "--wire", "0.5mm"]
    path.write_text(json.dumps(document))
    before = path.read_bytes()
    for args in (["add", path, "--measured", "20uH@30"], ["show", path]):
        one_line_error(run("trim", *args), 2, str(path), "coil: solenoid --former")
    assert path.read_bytes() == before


# --- striking out and re-measuring ---------------------------------------------------------------


def closed_al(readings):
    """AL by the weighted least squares of docs/methods.md §20 in closed form: Σ(N²/L) / Σ(N⁴/L²)."""
    return (sum(n**2 / value for value, n in readings) / sum(n**4 / value**2 for value, n in readings))


def test_strike_leaves_the_reading_out_of_the_fit(log):
    """A struck reading stays in the file but not in the fit: the answer equals the log without it (§20)."""
    run_json("trim", "add", log, "--measured", "9.8uH@28")  # a slip: 98 µH typed as 9.8 µH
    run_json("trim", "add", log, "--measured", "96uH@27")
    document = run_json("trim", "strike", log, 2, "--why", "typed 9.8 for 98")
    result = document["result"]
    assert result["al_H"] == pytest.approx(closed_al([(55e-6, 20), (96e-6, 27)]), rel=1e-12)
    without = run_json("trim", "start", log.parent / "without.json", "--target", "100uH", "--tolerance", "2%",
                       "--measured", "55uH@20", "--measured", "96uH@27")["result"]
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "uncertainty", "al_H"):
        assert result[key] == without[key], key
    assert [reading["residual"] is None for reading in result["readings"]] == [False, True, False]
    kept = json.loads(log.read_text())["readings"][1]
    assert kept["inductance_H"] == pytest.approx(9.8e-6) and kept["struck"]["why"] == "typed 9.8 for 98"
    assert kept["struck"]["time"]
    text = run("trim", "show", log).stdout
    assert "reading 2       9.800 μH at 28 turns  struck out" in text and "typed 9.8 for 98" in text


@pytest.mark.parametrize("number, fragment", [
    pytest.param(1, "reading 1 was struck out", id="already-struck"),
    pytest.param(3, "from 1 to 2", id="missing"),
    pytest.param(0, "from 1 to 2", id="zero"),
])
def test_strike_bad_number_is_one_line_and_keeps_the_log(log, number, fragment):
    """Striking a struck or missing reading: exit 2, one line; the log byte-identical."""
    run_json("trim", "add", log, "--measured", "96uH@27")
    assert run("trim", "strike", log, 1).exit_code == 0
    before = log.read_bytes()
    one_line_error(run("trim", "strike", log, number), 2, fragment)
    assert log.read_bytes() == before


def test_striking_every_reading_leaves_no_step(log):
    """With nothing left to fit the log says so and asks for a reading; show agrees."""
    document = run_json("trim", "strike", log, 1)
    assert "turns" not in document["result"] and document["result"]["readings"][0]["struck"] is not None
    text = run("trim", "show", log).stdout
    assert "every reading struck out" in text and f"coilplan trim add {log} --measured L@N" in text
    one_line_error(run("trim", "show", log, "--plot", log.parent / "p.svg"), 2, "--plot")


def test_remeasure_at_the_same_turns_is_averaged(log):
    """A second reading at 28 turns is kept beside the first; the fit sees their mean (one point per count)."""
    run_json("trim", "add", log, "--measured", "104uH@28")
    document = run_json("trim", "add", log, "--measured", "100uH@28", "--note", "leads shortened")
    result = document["result"]
    assert result["al_H"] == pytest.approx(closed_al([(55e-6, 20), (102e-6, 28)]), rel=1e-12)  # mean 102 µH
    assert result["points"][-1]["readings"] == [2, 3] and result["points"][-1]["inductance_H"] == pytest.approx(102e-6)
    assert any("averaged" in text and "readings 2 and 3" in text for text in result["notices"])
    kept = [r["inductance_H"] for r in json.loads(log.read_text())["readings"]]
    assert kept == pytest.approx([55e-6, 104e-6, 100e-6])
    mean = run_json("trim", "start", log.parent / "mean.json", "--target", "100uH", "--tolerance", "2%",
                    "--measured", "55uH@20", "--measured", "102uH@28")["result"]
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "uncertainty"):
        assert result[key] == mean[key], key


def test_remeasure_after_going_back_is_the_coil_now(log):
    """Turns put back to a count read before: its readings are averaged, and that count is the coil now."""
    run_json("trim", "add", log, "--measured", "104uH@28")
    result = run_json("trim", "add", log, "--measured", "56uH@20")["result"]
    assert result["turns_now"] == 20
    assert [point["turns"] for point in result["points"]] == [28, 20]


def test_version_1_log_still_loads_and_is_written_as_version_2(tmp_path):
    """A log written by the first schema (closed core) shows as before and is upgraded on the next change."""
    path = tmp_path / "old.json"
    path.write_text(json.dumps({
        "schema": "coilplan-trim-log", "version": 1, "created": "2025-03-01T10:00:00Z",
        "coil": {"name": "old choke", "model": "closed-core", "offset": False, "turn_length_m": None, "wire": None},
        "target_H": 1e-4, "operating_frequency_Hz": None, "meter_frequency_Hz": None, "tolerance": 0.02,
        "tolerance_assumed": False, "self_capacitance_F": None,
        "readings": [{"inductance_H": 5.5e-5, "turns": 20, "time": "2025-03-01T10:05:00Z", "note": None}]}))
    before = path.read_bytes()
    shown = run_json("trim", "show", path)["result"]
    assert (shown["turns"], shown["turns_change"]) == (27, 7)  # AL = 55 µH/20² (IEC 60205), N = 20·√(100/55)
    assert path.read_bytes() == before
    run_json("trim", "add", path, "--measured", "98uH@27")
    document = json.loads(path.read_text())
    assert document["version"] == 2 and [r["turns"] for r in document["readings"]] == [20, 27]
    assert document["coil"]["name"] == "old choke"


def test_names_and_notes_print_on_their_own_line(tmp_path):
    """A name or note holding a newline or a terminal escape is shown escaped: the report keeps its lines."""
    path = tmp_path / "c.json"
    result = run("trim", "start", path, "--target", "100uH", "--name", "coil\nA\x1b[31m", "--measured", "55uH@20")
    assert result.exit_code == 0
    assert result.stdout.splitlines()[0] == f"Trim log coil\\nA\\x1b[31m ({path}): closed core, to 100.0 μH"
    text = run("trim", "add", path, "--measured", "98uH@27", "--note", "second\rline").stdout
    assert "second\\rline" in text and "\r" not in text
