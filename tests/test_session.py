"""The trim log (coilplan.session): the refit after each reading, the notices, and a file that is never lost."""

import errno
import json
import math
import os

import numpy as np
import pytest

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.forms import ClosedCore
from coilplan.rewind import Conditions, closed_core_fit, low_frequency_readings
from coilplan.rewind_answer import rewind_fields
from coilplan.session import add_reading, evaluate, new_log, record_reading, record_strike, strike_reading
from coilplan.session_file import load_log, save_log, start_log
from coilplan.session_model import LogExistsError, LogFileError, LogWriteError


def log_with(readings, **options):
    """A log for a 100 µH target (2 % meter tolerance unless given) holding ``readings``."""
    options.setdefault("tolerance", 0.02)
    log = new_log(options.pop("target", 100e-6), **options)
    for value, turns in readings:
        log = add_reading(log, value, turns)
    return log


@pytest.fixture
def saved(tmp_path):
    """A log on disk with two readings, and its bytes."""
    path = tmp_path / "coil.json"
    start_log(path, log_with([(150e-6, 33), (121e-6, 30)]))
    return path, path.read_bytes()


def no_temporary_files(folder):
    return [name for name in os.listdir(folder) if name.endswith(".tmp")] == []


# --- the refit and the next step ----------------------------------------------------------------


def test_first_reading_follows_the_n_squared_law():
    """20 turns at 55 µH give AL = 137.5 nH and 27 turns for 100 µH (IEC 60205 AL = L/N²; issue 4 example)."""
    step = evaluate(log_with([(55e-6, 20)]))
    assert step.fields["al_H"] == pytest.approx(55e-6 / 20**2, rel=1e-12, abs=0)
    # hand-worked: N = 20·√(100/55) = 26.968
    assert step.fields["turns_exact"] == pytest.approx(20 * math.sqrt(100 / 55), rel=1e-9, abs=0)
    assert step.fields["turns"] == 27
    assert step.fields["turns_change"] == 7
    assert step.fields["turns_now"] == 20


def test_refit_after_each_reading_equals_rewind_on_the_same_readings():
    """After every reading the step equals closed_core_fit + rewind_fields computed here on the same readings."""
    readings = [(160e-6, 34), (131e-6, 31), (104e-6, 28), (96e-6, 27)]
    conditions = Conditions(tolerance=0.02, tolerance_assumed=False)
    log = new_log(100e-6, tolerance=0.02)
    for count in range(1, len(readings) + 1):
        log = add_reading(log, *readings[count - 1])
        step = evaluate(log)
        taken = readings[:count]
        fit = closed_core_fit(taken)
        expected, warnings_ = rewind_fields(ClosedCore(al=fit.value), 100e-6, taken, fit, conditions)
        assert step.fit == fit
        for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "inductance_H"):
            assert step.fields[key] == expected[key], key
        assert step.warnings == tuple(warnings_)
        # weighted least squares in closed form: AL = Σ(N²/L) / Σ(N⁴/L²) (hand-worked normal equation)
        values = np.array([value for value, _ in taken])
        counts = np.array([turns for _, turns in taken], dtype=float)
        assert step.fields["al_H"] == pytest.approx(np.sum(counts**2 / values) / np.sum(counts**4 / values**2),
                                                    rel=1e-12)


def test_refit_with_lead_offset_and_self_capacitance():
    """Offset and frequency correction: as closed_core_fit(offset) on L/(1 + ω²LC) readings (docs/methods.md §10)."""
    readings = [(60e-6, 20), (104e-6, 27), (90e-6, 25)]
    log = log_with(readings, offset=True, meter_frequency=100e3, operating_frequency=500e3,
                   self_capacitance=20e-12)
    step = evaluate(log)
    omega = 2 * math.pi * 100e3
    corrected = [(value / (1 + omega**2 * value * 20e-12), turns) for value, turns in readings]  # hand-worked
    fit = closed_core_fit(corrected, offset=True)
    assert step.fields["al_H"] == pytest.approx(fit.value, rel=1e-12, abs=0)
    assert step.fields["offset_H"] == pytest.approx(fit.extra["offset_H"], rel=1e-12, abs=1e-15)
    conditions = Conditions(tolerance=0.02, tolerance_assumed=False, meter_frequency=100e3,
                            operating_frequency=500e3, self_capacitance=20e-12)
    for (value, turns), (ours, our_turns) in zip(corrected, low_frequency_readings(readings, conditions), strict=True):
        assert ours == pytest.approx(value, rel=1e-14, abs=0) and our_turns == turns
    form = ClosedCore(al=fit.value, offset=fit.extra["offset_H"])
    expected, _ = rewind_fields(form, 100e-6, readings, fit, conditions)
    assert step.fields["turns_exact"] == pytest.approx(expected["turns_exact"], rel=1e-12, abs=0)


def test_offset_waits_for_the_second_reading():
    """With --offset and one reading the fit is L = AL·N² and the log says the offset comes later."""
    step = evaluate(log_with([(55e-6, 20)], offset=True))
    assert step.fields["offset_H"] == 0.0
    assert any("second reading" in text for text in step.notices)


def test_evaluate_needs_a_reading():
    """A log without readings has no step to give."""
    with pytest.raises(InvalidInputError, match="at least one reading"):
        evaluate(new_log(100e-6))


# --- what the log notices -----------------------------------------------------------------------


def test_notice_inductance_rose_after_removing_turns():
    """L rises with N on any coil (L = AL·N², IEC 60205), so a rise after removing turns is named."""
    step = evaluate(log_with([(150e-6, 33), (156e-6, 31)]))
    rose = [text for text in step.notices if "rose" in text]
    assert len(rose) == 1
    assert "reading 2" in rose[0] and "removing 2 turns" in rose[0] and "33 → 31" in rose[0]


def test_notice_inductance_fell_after_adding_turns():
    """A fall after turns were added is named too (the same law)."""
    step = evaluate(log_with([(80e-6, 24), (76e-6, 26)]))
    assert any("fell" in text and "adding 2 turns" in text for text in step.notices)


def test_no_notice_for_readings_that_follow_the_law():
    """Readings taken straight off L = AL·N² give no notice and no far-off warning (hand-worked data)."""
    al = 137.5e-9
    step = evaluate(log_with([(al * 34**2, 34), (al * 30**2, 30)]))
    assert step.notices == ()
    assert not any("off the fitted curve" in text for text in step.warnings)


def test_far_off_point_is_rewinds_warning_not_a_second_notice():
    """A reading far off the fit is warned about once, by coilplan.rewind, and not repeated in the notices."""
    al = 137.5e-9
    readings = [(al * 34**2, 34), (al * 32**2 * 1.15, 32), (al * 30**2, 30)]
    step = evaluate(log_with(readings))
    assert sum("off the fitted curve" in text for text in step.warnings) == 1
    assert not any("off the fitted curve" in text for text in step.notices)


def test_target_reached_says_stop():
    """The last reading within the meter tolerance of the target says stop (common practice, no source)."""
    step = evaluate(log_with([(55e-6, 20), (101e-6, 27)]))
    assert any(text.startswith("on target") and "stop here" in text for text in step.notices)
    # 3 % off with a 2 % meter: not yet
    step = evaluate(log_with([(55e-6, 20), (103e-6, 28)]))
    assert not any("stop here" in text for text in step.notices)


# --- readings that cannot be taken ---------------------------------------------------------------


@pytest.mark.parametrize("value, turns, fragment", [
    pytest.param(100e-6, 0, "whole number of turns", id="no-turns"),
    pytest.param(0.0, 20, "above zero", id="zero-inductance"),
    pytest.param(-5e-6, 20, "above zero", id="negative-inductance"),
    pytest.param(math.nan, 20, "above zero", id="nan"),
])
def test_reading_is_validated(value, turns, fragment):
    """Turns at least 1 and an inductance above zero (common practice, no source); a repeated turn count is a
    re-measure, accepted (see test_remeasure_at_one_count_is_averaged)."""
    log = log_with([(121e-6, 30)])
    with pytest.raises(InvalidInputError, match=fragment) as caught:
        add_reading(log, value, turns)
    assert caught.value.option == "--measured"
    assert len(log.readings) == 1


# --- the file -----------------------------------------------------------------------------------


def test_round_trip_and_schema_fields(saved):
    """What is saved loads back equal, with the schema's named fields (common practice, no source)."""
    path, _ = saved
    log = load_log(path)
    document = json.loads(path.read_text())
    assert document["schema"] == "coilplan-trim-log" and document["version"] == 2
    assert set(document) == {"schema", "version", "created", "coil", "target_H", "operating_frequency_Hz",
                             "meter_frequency_Hz", "tolerance", "tolerance_assumed", "self_capacitance_F",
                             "readings"}
    assert document["coil"]["model"] == "closed-core"
    assert set(document["readings"][0]) == {"inductance_H", "turns", "time", "note", "struck"}
    assert [(r.inductance_H, r.turns) for r in log.readings] == [(150e-6, 33), (121e-6, 30)]
    save_log(path, log)
    assert load_log(path) == log


def test_record_reading_appends_refits_and_saves(saved):
    """record_reading keeps the old readings, adds the new one with its note, and the step is its refit."""
    path, _ = saved
    log, step = record_reading(path, 104e-6, 28, note="after trimming 2")
    again = load_log(path)
    assert again == log
    assert [r.turns for r in again.readings] == [33, 30, 28]
    assert again.readings[-1].note == "after trimming 2"
    assert step.fit == closed_core_fit([(150e-6, 33), (121e-6, 30), (104e-6, 28)])


def test_start_refuses_an_existing_file_without_force(saved):
    """start never overwrites: the old file stays byte-identical; with force it is replaced."""
    path, before = saved
    with pytest.raises(LogExistsError, match="--force") as caught:
        start_log(path, new_log(47e-6))
    assert str(path) in str(caught.value)
    assert path.read_bytes() == before
    start_log(path, new_log(47e-6), force=True)
    assert load_log(path).target_H == 47e-6 and load_log(path).readings == ()


def test_crash_in_the_middle_of_a_write_keeps_the_old_file(saved, monkeypatch):
    """A write that dies half-way (simulated) leaves the old log byte-identical and no temporary file."""
    path, before = saved
    real_write = os.write

    def half_then_crash(descriptor, data):
        real_write(descriptor, bytes(data[: len(data) // 2]))
        raise KeyboardInterrupt  # the process is stopped mid-write

    monkeypatch.setattr(os, "write", half_then_crash)
    with pytest.raises(KeyboardInterrupt):
        record_reading(path, 104e-6, 28)
    monkeypatch.undo()
    assert path.read_bytes() == before
    assert no_temporary_files(path.parent)


def test_crash_before_the_rename_keeps_the_old_file(saved, monkeypatch):
    """A crash after the data is written but before os.replace leaves the old log byte-identical."""
    path, before = saved

    def crash(*args):
        raise RuntimeError("simulated crash")

    monkeypatch.setattr(os, "replace", crash)
    with pytest.raises(RuntimeError):
        record_reading(path, 104e-6, 28)
    monkeypatch.undo()
    assert path.read_bytes() == before
    assert no_temporary_files(path.parent)


def test_stray_temporary_file_does_not_break_the_next_run(saved):
    """A temporary file left by a killed run (half a log) is ignored: the next reading saves fine."""
    path, _ = saved
    stray = path.parent / f".{path.name}.abc123.tmp"
    stray.write_bytes(path.read_bytes()[:40])
    record_reading(path, 104e-6, 28)
    assert [r.turns for r in load_log(path).readings] == [33, 30, 28]
    assert stray.read_bytes()  # not ours to remove: it is left alone


def test_full_disk_gives_one_line_and_keeps_the_file(saved, monkeypatch):
    """ENOSPC during the write (simulated) is a LogWriteError with the system's reason; the old log stays."""
    path, before = saved

    def full(descriptor, data):
        raise OSError(errno.ENOSPC, os.strerror(errno.ENOSPC))

    monkeypatch.setattr(os, "write", full)
    with pytest.raises(LogWriteError) as caught:
        record_reading(path, 104e-6, 28)
    monkeypatch.undo()
    assert caught.value.code == errno.ENOSPC
    assert "\n" not in str(caught.value) and str(path) in str(caught.value)
    assert os.strerror(errno.ENOSPC) in str(caught.value)
    assert path.read_bytes() == before
    assert no_temporary_files(path.parent)


def test_read_only_folder_gives_one_line_and_keeps_the_file(saved, monkeypatch):
    """A folder that refuses new files (simulated with os.open raising PermissionError) keeps the old log."""
    path, before = saved

    def refuse(*args, **kwargs):
        raise PermissionError(errno.EACCES, os.strerror(errno.EACCES), str(path.parent))

    monkeypatch.setattr(os, "open", refuse)
    with pytest.raises(LogWriteError) as caught:
        record_reading(path, 104e-6, 28)
    monkeypatch.undo()
    assert caught.value.code == errno.EACCES
    assert "cannot write" in str(caught.value)
    assert path.read_bytes() == before


def good_document():
    return {"schema": "coilplan-trim-log", "version": 1, "created": "2025-03-01T10:00:00Z",
            "coil": {"name": "demo", "model": "closed-core", "offset": False, "turn_length_m": None, "wire": None},
            "target_H": 1e-4, "operating_frequency_Hz": None, "meter_frequency_Hz": None, "tolerance": 0.02,
            "tolerance_assumed": False, "self_capacitance_F": None,
            "readings": [{"inductance_H": 1.5e-4, "turns": 33, "time": "2025-03-01T10:05:00Z", "note": None}]}


def changed(**updates):
    document = good_document()
    for key, value in updates.items():
        if key == "turns":
            document["readings"][0]["turns"] = value
        elif key == "wire":
            document["coil"]["wire"] = value
        else:
            document[key] = value
    return json.dumps(document)


@pytest.mark.parametrize("text, fragment", [
    pytest.param(json.dumps(good_document())[:-30], "broken JSON", id="truncated"),
    pytest.param("", "broken JSON", id="empty"),
    pytest.param(changed(schema="some-other-log"), "not a coilplan trim log", id="wrong-schema"),
    pytest.param("[1, 2]", "not a coilplan trim log", id="not-an-object"),
    pytest.param(changed(version=3), "newer coilplan", id="newer-version"),
    pytest.param(changed(version="1"), "version", id="version-as-text"),
    pytest.param(changed(turns="33"), "readings.0.turns", id="turns-as-text"),
    pytest.param(changed(turns=33.5), "readings.0.turns", id="turns-not-whole"),
    pytest.param(changed(target_H=-1e-4), "target_H", id="negative-target"),
    pytest.param(changed(tolerance=1.5), "tolerance", id="tolerance-above-one"),
    pytest.param(changed(wire="thick"), "coil.wire", id="unknown-wire"),
    pytest.param(changed(colour="red"), "colour", id="unknown-field"),
])
def test_corrupt_or_foreign_file_is_refused_and_kept(tmp_path, text, fragment):
    """A file that is not a valid log is refused naming the file and the problem, and stays byte-identical."""
    path = tmp_path / "coil.json"
    path.write_text(text)
    before = path.read_bytes()
    with pytest.raises(LogFileError) as caught:
        load_log(path)
    message = str(caught.value)
    assert str(path) in message and fragment in message and "\n" not in message
    with pytest.raises(LogFileError):
        record_reading(path, 104e-6, 28)
    assert path.read_bytes() == before
    assert os.listdir(tmp_path) == ["coil.json"]


def test_the_good_document_itself_loads(tmp_path):
    """The document the corrupt cases start from is valid (so each case fails for its own change)."""
    path = tmp_path / "coil.json"
    path.write_text(json.dumps(good_document()))
    assert load_log(path).readings[0].turns == 33


def test_missing_file_is_named(tmp_path):
    """A log that is not there is a LogFileError naming the path."""
    with pytest.raises(LogFileError, match="no trim log there"):
        load_log(tmp_path / "nothing.json")


def test_failed_refit_saves_nothing(saved):
    """A reading the fit cannot use (no positive AL with a lead offset) leaves the log as it was."""
    path, _ = saved
    start_log(path, log_with([(100e-6, 10)], offset=True), force=True)
    before = path.read_bytes()
    with pytest.raises(InfeasibleError):
        record_reading(path, 90e-6, 40)  # more turns reading less: AL < 0
    assert path.read_bytes() == before


def test_save_keeps_the_file_permissions(saved):
    """Replacing the log keeps the mode bits the user gave it (common practice, no source)."""
    path, _ = saved
    path.chmod(0o640)
    record_reading(path, 104e-6, 28)
    assert path.stat().st_mode & 0o777 == 0o640


def test_negative_lead_offset_is_left_out():
    """Series leads add inductance (L0 ≥ 0, common practice, no source): a negative fitted L0 falls back to AL·N²."""
    readings = [(160e-6, 34), (131e-6, 31)]  # exactly fitted by L0 = −11.9 µH (hand-worked)
    assert closed_core_fit(readings, offset=True).extra["offset_H"] < 0
    step = evaluate(log_with(readings, offset=True))
    assert step.fields["offset_H"] == 0.0
    assert step.fit == closed_core_fit(readings)
    assert step.fields["inductance_H"] > 0 and step.fields["turns"] > 20
    assert any("below zero" in text for text in step.notices)


# --- re-measures, struck readings, any form, version 1 ------------------------------------------


def weighted_al(readings):
    """AL by the weighted least squares of docs/methods.md §20 in closed form: Σ(N²/L) / Σ(N⁴/L²)."""
    values = np.array([value for value, _ in readings])
    counts = np.array([turns for _, turns in readings], dtype=float)
    return float(np.sum(counts**2 / values) / np.sum(counts**4 / values**2))


def test_remeasure_at_one_count_is_averaged():
    """Two readings at 30 turns are kept; the fit sees their mean, one point per count (docs/methods.md §20)."""
    log = log_with([(150e-6, 33), (121e-6, 30), (125e-6, 30)])
    assert [(r.inductance_H, r.turns) for r in log.readings] == [(150e-6, 33), (121e-6, 30), (125e-6, 30)]
    step = evaluate(log)
    assert [(p.turns, p.numbers) for p in step.points] == [(33, (1,)), (30, (2, 3))]
    assert step.points[-1].inductance == pytest.approx(123e-6, rel=1e-15)
    assert step.fit == closed_core_fit([(150e-6, 33), (123e-6, 30)])
    assert step.fields["al_H"] == pytest.approx(weighted_al([(150e-6, 33), (123e-6, 30)]), rel=1e-12)
    assert step.fields["turns_now"] == 30
    assert any("averaged" in text and "readings 2 and 3" in text for text in step.notices)


def test_struck_reading_is_left_out_of_the_fit():
    """A struck reading is kept and marked, and the step equals that of the log without it (§20)."""
    log = log_with([(160e-6, 34), (13.1e-6, 31), (104e-6, 28)])
    struck = strike_reading(log, 2, why="typed 13.1 for 131")
    assert struck.readings[1].inductance_H == 13.1e-6 and struck.readings[1].struck.why == "typed 13.1 for 131"
    assert log.readings[1].struck is None  # the log given is not changed
    step, without = evaluate(struck), evaluate(log_with([(160e-6, 34), (104e-6, 28)]))
    assert step.fit == without.fit == closed_core_fit([(160e-6, 34), (104e-6, 28)])
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "uncertainty"):
        assert step.fields[key] == without.fields[key], key
    assert [p.numbers for p in step.points] == [(1,), (3,)]
    with pytest.raises(InvalidInputError, match="reading 2 was struck out"):
        strike_reading(struck, 2)
    with pytest.raises(InvalidInputError, match="from 1 to 3"):
        strike_reading(struck, 4)
    with pytest.raises(InvalidInputError, match="not struck out"):
        evaluate(strike_reading(strike_reading(struck, 1), 3))


def test_record_strike_saves_and_refits(saved):
    """record_strike marks the reading in the file and gives the refit on what is left."""
    path, _ = saved
    log, step = record_strike(path, 1, why="wrong core")
    assert load_log(path) == log and log.readings[0].struck.why == "wrong core"
    assert step.fit == closed_core_fit([(121e-6, 30)])


def test_form_coil_is_evaluated_by_design_as_its_command_builds_it():
    """A solenoid's log answers as design(Solenoid.on_former(...), Request(...)) on the same readings (§1, §20)."""
    from coilplan.forms import Solenoid
    from coilplan.pipeline import design
    from coilplan.request import Reading as MeterReading
    from coilplan.request import Request
    from coilplan.wire import parse_wire

    log = new_log(10e-6, tolerance=0.01, command="solenoid", arguments=["--former", "25mm", "--wire", "0.5mm"])
    for value, turns in [(20e-6, 30), (12.4e-6, 22)]:
        log = add_reading(log, value, turns)
    step = evaluate(log)
    readings = (MeterReading(20e-6, 30), MeterReading(12.4e-6, 22))
    answer = design(Solenoid.on_former(0.025, parse_wire("0.5mm")),
                    Request(target=10e-6, tolerance=0.01, readings=readings))
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "inductance_H", "uncertainty"):
        assert step.fields[key] == answer.result[key], key
    assert step.fit == answer.measured.fit


def test_form_coil_refused_beside_closed_core_fields():
    """A form's coil takes no closed-core wire, offset or turn length (they belong in its description)."""
    with pytest.raises(InvalidInputError, match="wire"):
        new_log(10e-6, command="solenoid", arguments=["--former", "25mm", "--wire", "0.5mm"], wire="0.5mm")


def test_version_1_document_loads_as_version_2(tmp_path):
    """A version-1 log loads unchanged on disk and comes back as version 2 with its readings and coil."""
    path = tmp_path / "coil.json"
    path.write_text(json.dumps(good_document()))
    before = path.read_bytes()
    log = load_log(path)
    assert log.version == 2 and log.coil.name == "demo" and log.coil.model == "closed-core"
    assert [(r.inductance_H, r.turns, r.struck) for r in log.readings] == [(1.5e-4, 33, None)]
    assert path.read_bytes() == before
    record_reading(path, 1.21e-4, 30)
    assert json.loads(path.read_text())["version"] == 2


@pytest.mark.parametrize("change, fragment", [
    pytest.param(lambda d: d["readings"][0].update(struck={"time": "2025-03-01T10:06:00Z", "why": None}),
                 "readings.0.struck", id="struck-in-v1"),
    pytest.param(lambda d: d["readings"].append(dict(d["readings"][0])), "one reading per turn count",
                 id="repeated-count-in-v1"),
    pytest.param(lambda d: d.update(coil={"name": None, "model": "form", "command": "solenoid", "arguments": []}),
                 "coil.model", id="form-in-v1"),
])
def test_version_1_holds_only_what_version_1_knew(tmp_path, change, fragment):
    """What only version 2 can hold (struck readings, re-measures, a form's coil) is refused in a version-1 file."""
    document = good_document()
    change(document)
    path = tmp_path / "coil.json"
    path.write_text(json.dumps(document))
    with pytest.raises(LogFileError, match=fragment):
        load_log(path)


def test_form_coil_in_the_file_is_checked_by_its_command(tmp_path):
    """A stored description its command refuses is a LogFileError naming the file and the option."""
    document = good_document() | {"version": 2}
    document["coil"] = {"name": None, "model": "form", "command": "solenoid", "arguments": ["--former", "25mm"]}
    path = tmp_path / "coil.json"
    path.write_text(json.dumps(document))
    with pytest.raises(LogFileError, match="coil: solenoid: Missing option '--wire'") as caught:
        load_log(path)
    assert str(path) in str(caught.value)
