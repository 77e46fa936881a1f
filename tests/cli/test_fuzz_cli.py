"""Every command under random option values, and plan files edited by hand: exit 0, 1 or 2, never a traceback.

Values are drawn from valid, borderline and malformed text: right and wrong units, odd prefix case,
micro signs, commas, exponents, huge and tiny numbers, empty strings and unicode.
"""

import os
import shlex
import tempfile

from click.testing import CliRunner
from hypothesis import given, settings
from hypothesis import strategies as st

from coilplan.cli import main

NUMBERS = ["0", "1", "-1", "2.5", "1e9", "1e-9", "1e400", "nan", "inf", ",5", "1,5", "", " ", "٣", "1_000"]
UNITS = ["", "uH", "µH", "μH", "mH", "UH", "pF", "nF", "MHz", "mhz", "kHz", "Hz", "mm", "MM", "in", "mil",
         "m", "um", "A", "mA", "V", "T", "mT", "C", "K", "%", "ppm", "awg", "swg", "ohm", "mm2", "x"]


@st.composite
def value(draw):
    """A value as a hurried bench user might type it."""
    if draw(st.booleans()):
        return draw(st.sampled_from(NUMBERS)) + draw(st.sampled_from(UNITS))
    return draw(st.one_of(st.text(max_size=8), st.sampled_from(["24awg", "0.5mm", "10uH@20", "100pF@1MHz",
                                                                  "530kHz:1700kHz", "40x0.1mm", "nizn-125",
                                                                  "40e-6@1MHz", "30ppm@100kHz", "85@100kHz"])))


COMMANDS = {
    "solenoid": ["--former", "--diameter", "--wire", "--turns", "--target", "--pitch", "--length", "--max-length",
                 "--lead", "--temperature", "--at", "--measured", "--tolerance", "--target-frequency",
                 "--capacitance", "--self-capacitance", "--meter-freq", "--former-permittivity"],
    "toroid": ["--od", "--id", "--height", "--wire", "--turns", "--target", "--mu", "--material", "--al",
               "--measured", "--current", "--ac-current", "--ac-voltage", "--at", "--bsat", "--chamfer",
               "--loss-factor", "--measured-q", "--meter-freq"],
    "gapped": ["--ae", "--le", "--gap", "--wire", "--turns", "--target", "--mu", "--material", "--current",
               "--window-width", "--window-depth", "--max-flux", "--measured", "--at", "--loss-factor", "--measured-q"],
    "rod": ["--rod-length", "--rod-diameter", "--wire", "--turns", "--target", "--mu", "--material", "--position",
            "--coil-length", "--former", "--measured", "--at", "--loss-factor", "--measured-q"],
    "multilayer": ["--former", "--width", "--wire", "--turns", "--target", "--packing", "--max-depth", "--at"],
    "spiral": ["--inner", "--wire", "--spacing", "--outer", "--turns", "--target"],
    "rewind": ["--measured", "--target", "--at", "--self-capacitance", "--tolerance", "--turn-length"],
    "count-turns": ["--before", "--after", "--added", "--test-winding", "--unknown", "--resistance", "--wire",
                    "--turn-length", "--tolerance"],
    "tank": ["--inductance", "--capacitance", "--frequency", "--band", "--capacitor", "--stray", "--resonance",
             "--padder", "--power", "--q"],
    "wire": ["--grade", "--temperature", "--density", "--overall", "--series"],
    "materials": ["--mu", "--spread"],
}

# A valid core for each command, so that random options also reach the physics, not only the parser.
BASES = {
    "solenoid": ["--former", "25mm", "--wire", "0.5mm"],
    "toroid": ["--od", "23mm", "--id", "14mm", "--height", "7mm", "--wire", "0.5mm", "--mu", "125"],
    "gapped": ["--ae", "50mm2", "--le", "40mm", "--wire", "0.3mm", "--mu", "2000", "--gap", "0.2mm"],
    "rod": ["--rod-length", "100mm", "--rod-diameter", "10mm", "--wire", "0.3mm", "--mu", "125"],
    "multilayer": ["--former", "10mm", "--width", "8mm", "--wire", "0.2mm"],
    "spiral": ["--inner", "20mm", "--wire", "0.5mm", "--spacing", "0.5mm"],
    "rewind": ["--measured", "50uH@20"],
    "count-turns": [],
    "tank": [],
    "wire": [],
    "materials": [],
}


@settings(max_examples=int(os.environ.get("COILPLAN_FUZZ_EXAMPLES", "600")), deadline=None)
@given(data=st.data())
def test_random_options_never_crash(data):
    """Any mix of options and values ends in exit status 0, 1 or 2 with at most one error line, no traceback."""
    command = data.draw(st.sampled_from(sorted(COMMANDS)))
    options = data.draw(st.lists(st.sampled_from(COMMANDS[command]), min_size=1, max_size=4, unique=True))
    arguments = [command, *BASES[command]]
    for option in options:
        arguments += [option, data.draw(value())]
    result = CliRunner().invoke(main, arguments)
    assert result.exit_code in (0, 1, 2), (arguments, result.output)
    assert "Traceback" not in result.output, arguments
    assert "internal error" not in result.output, (arguments, result.output)
    if result.exit_code:
        assert result.stderr.count("\n") == 1, (arguments, result.stderr)
    if result.exit_code == 2:  # a usage error names the option (or the argument) it is about
        assert any(name in result.stderr for name in (*options, *COMMANDS[command], "MATERIAL", "GAUGE")), (
            arguments, result.stderr)


TRIM_OPTIONS = ["--target", "--tolerance", "--measured", "--at", "--meter-freq", "--self-capacitance",
                "--turn-length", "--wire", "--offset"]


@settings(max_examples=int(os.environ.get("COILPLAN_FUZZ_EXAMPLES", "600")) // 6, deadline=None)
@given(data=st.data())
def test_random_trim_logs_never_crash(data):
    """`trim start` then `trim add` with random values: exit 0, 1 or 2, one line on failure, a log only on success."""
    options = data.draw(st.lists(st.sampled_from(TRIM_OPTIONS), min_size=1, max_size=3, unique=True))
    with tempfile.TemporaryDirectory() as folder:
        log = os.path.join(folder, "log.json")
        arguments = ["trim", "start", log, "--target", "100uH"]
        for option in options:
            if option == "--offset":
                arguments.append(option)
            else:
                arguments += [option, data.draw(value())]
        result = CliRunner().invoke(main, arguments)
        assert result.exit_code in (0, 1, 2), (arguments, result.output)
        assert "Traceback" not in result.output and "internal error" not in result.output, (arguments, result.output)
        if result.exit_code:
            assert result.stderr.count("\n") == 1, (arguments, result.stderr)
            assert not os.path.exists(log), arguments  # a refused start writes nothing
            return
        added = CliRunner().invoke(main, ["trim", "add", log, "--measured", data.draw(value())])
        assert added.exit_code in (0, 1, 2), added.output
        assert "Traceback" not in added.output and "internal error" not in added.output, added.output


# A form's coil for the trim log: the command's base, the core left to the readings where they must give it.
TRIM_COILS = {
    "solenoid": BASES["solenoid"],
    "toroid": ["--od", "23mm", "--id", "14mm", "--height", "7mm", "--wire", "0.5mm"],
    "gapped": ["--ae", "50mm2", "--le", "40mm", "--wire", "0.3mm"],
    "multilayer": BASES["multilayer"],
    "spiral": BASES["spiral"],
}


@settings(max_examples=int(os.environ.get("COILPLAN_FUZZ_EXAMPLES", "600")) // 12, deadline=None)
@given(data=st.data())
def test_random_form_trim_logs_never_crash(data):
    """`trim start --coil` with a form's options given random values, then `add` and `strike`: exit 0, 1 or 2,
    one line on failure, a log only on success."""
    command = data.draw(st.sampled_from(sorted(TRIM_COILS)))
    words = [command, *TRIM_COILS[command]]
    for option in data.draw(st.lists(st.sampled_from(COMMANDS[command]), max_size=2, unique=True)):
        words += [option, data.draw(value())]
    with tempfile.TemporaryDirectory() as folder:
        log = os.path.join(folder, "log.json")
        arguments = ["trim", "start", log, "--target", "100uH", "--coil", shlex.join(words)]
        if data.draw(st.booleans()):
            arguments += ["--measured", data.draw(value())]
        runs = [CliRunner().invoke(main, arguments)]
        if runs[0].exit_code == 0:
            runs.append(CliRunner().invoke(main, ["trim", "add", log, "--measured", data.draw(value())]))
            runs.append(CliRunner().invoke(main, ["trim", "strike", log, data.draw(value())]))
        elif runs[0].exit_code:
            assert not os.path.exists(log), arguments  # a refused start writes nothing
        for result in runs:
            assert result.exit_code in (0, 1, 2), (arguments, result.output)
            assert "Traceback" not in result.output and "internal error" not in result.output, (arguments,
                                                                                               result.output)
            if result.exit_code:
                assert result.stderr.count("\n") == 1, (arguments, result.stderr)


PLAN_FIELDS = {
    "coil": {"name": '"c1"', "count": "2", "target": '"10uH"', "tolerance": '"5%"', "at": '"3.5MHz"',
             "current": '"10mA"'},
    "toroid": {"name": '"ring"', "od": '"12.7mm"', "id": '"7.7mm"', "height": '"4.8mm"', "material": '"nizn-125"',
               "count": "3"},
    "former": {"name": '"tube"', "diameter": '"10mm"', "length": '"30mm"', "count": "2"},
    "reel": {"wire": '"0.3mm"', "length": '"20m"'},
}


def _plan(fields: dict) -> str:
    return "\n".join(f"[[{table}]]\n" + "\n".join(f"{key} = {text}" for key, text in entries.items())
                     for table, entries in fields.items())


@settings(max_examples=int(os.environ.get("COILPLAN_FUZZ_EXAMPLES", "600")) // 6, deadline=None)
@given(data=st.data())
def test_random_plan_files_never_crash(data):
    """A plan file edited by hand: one field given a random value (or dropped). Exit 0, 1 or 2; on a usage error
    one line naming the file and the field."""
    table = data.draw(st.sampled_from(sorted(PLAN_FIELDS)))
    key = data.draw(st.sampled_from(sorted(PLAN_FIELDS[table])))
    fields = {name: dict(entries) for name, entries in PLAN_FIELDS.items()}
    if data.draw(st.booleans()):
        del fields[table][key]
    else:
        raw = data.draw(value())
        fields[table][key] = data.draw(st.sampled_from([f'"{raw}"', raw or '""', f"'{raw}'"]))
    with tempfile.TemporaryDirectory() as folder:
        plan = os.path.join(folder, "plan.toml")
        with open(plan, "w", encoding="utf-8") as handle:
            handle.write(_plan(fields))
        result = CliRunner().invoke(main, ["kit", plan])
    assert result.exit_code in (0, 1, 2), result.output
    assert "Traceback" not in result.output and "internal error" not in result.output, (fields, result.output)
    if result.exit_code == 2:
        assert result.stderr.count("\n") == 1 and "plan.toml" in result.stderr, (fields, result.stderr)
