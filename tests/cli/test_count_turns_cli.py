"""`coilplan count-turns` through CliRunner: JSON shape, text lines, exit codes and one-line errors.

Expected counts come from the laws the methods rest on, written out here: L = AL·N² on a closed core
(IEC 60205 definition of AL) and R = N·ℓ_turn·ρ/(πd²/4) with ρ of annealed copper by IEC 60028.
"""

import json
import math

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cautions import salvaged_mains_caution
from coilplan.cli import main

AL = 250e-9  # H per turn²: a model core for the readings below


def henry_text(turns: int) -> str:
    """A closed-core reading L = AL·N² (IEC 60205), as the user would type it, in µH to 9 digits."""
    return f"{AL * turns**2 * 1e6:.9g}uH"


def run(*args):
    return CliRunner().invoke(main, ["count-turns", *args])


def run_json(*args):
    result = run(*args, "--json")
    assert result.exit_code == 0, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))


ADDED = ("--before", henry_text(90), "--after", henry_text(110), "--added", "20")
TEST_WINDING = ("--test-winding", f"{henry_text(10)}@10", "--unknown", henry_text(90))


def test_json_document_shape_and_keys():
    """--json: {command, inputs, result, warnings, cautions}; result and per-method keys as documented."""
    document = run_json(*ADDED, *TEST_WINDING)
    assert list(document) == ["schema", "command", "inputs", "result", "warnings", "cautions"]
    assert document["command"] == "count-turns"
    result = document["result"]
    assert {"turns", "turns_exact", "turns_range", "method", "methods"} <= set(result)
    assert isinstance(result["turns"], int) and all(isinstance(end, int) for end in result["turns_range"])
    for method in result["methods"]:
        assert {"method", "turns_exact", "turns", "turns_range", "relative_uncertainty", "explanation"} <= set(method)
    assert [m["method"] for m in result["methods"]] == ["added-turns", "test-winding"]
    assert document["inputs"]["added"] == 20 and document["inputs"]["test_winding"]["turns"] == 10
    assert salvaged_mains_caution() in document["cautions"]


def test_json_recovers_the_model_count_by_each_method():
    """Readings made from L = AL·N² with N = 90 give 90 by added turns and by the test winding."""
    result = run_json(*ADDED, *TEST_WINDING)["result"]
    assert result["turns"] == 90 and result["turns_exact"] == pytest.approx(90, rel=1e-7, abs=0)
    assert all(m["turns"] == 90 for m in result["methods"])
    # ±1 % readings: the test winding's ±(q − 1/q)/2, q = √(1.01/0.99), beats 20 added turns on 90
    assert result["method"] == "test-winding"
    q = math.sqrt(1.01 / 0.99)
    assert result["turns_range"] == [math.floor(90 / q + 0.5), math.floor(90 * q + 0.5)]


def test_removed_turns_by_option_and_by_negative_added_agree():
    """--removed 20 and --added -20 are the same request; both give the count as found (N² law)."""
    removed = run_json("--before", henry_text(110), "--after", henry_text(90), "--removed", "20")["result"]
    negative = run_json("--before", henry_text(110), "--after", henry_text(90), "--added", "-20")["result"]
    assert removed == negative
    assert removed["turns"] == 110 and removed["methods"][0]["turns_after_change"] == pytest.approx(90, rel=1e-7, abs=0)


def test_resistance_from_perimeters_equals_the_given_turn_length():
    """--inner/--outer-perimeter 40/60 mm is --turn-length 50 mm; R = N·ℓ·ρ/(πd²/4) gives back N."""
    diameter, turns, turn_length = 0.3e-3, 240, 0.050
    ohms = turns * turn_length * (1e-6 / 58.0) / (math.pi * diameter**2 / 4.0)  # IEC 60028 at 20 °C
    common = ("--resistance", f"{ohms:.9g}ohm", "--wire", "0.3mm")
    by_mean = run_json(*common, "--inner-perimeter", "40mm", "--outer-perimeter", "60mm")["result"]
    direct = run_json(*common, "--turn-length", "50mm")["result"]
    assert by_mean["turns"] == direct["turns"] == turns
    assert by_mean["methods"][0]["turn_length_m"] == pytest.approx(direct["methods"][0]["turn_length_m"])


def test_lead_resistance_is_subtracted():
    """--lead-resistance takes the leads off the reading before dividing by R' and the turn length."""
    diameter, turns, turn_length, leads = 0.3e-3, 240, 0.050, 0.25
    ohms = turns * turn_length * (1e-6 / 58.0) / (math.pi * diameter**2 / 4.0) + leads
    result = run_json("--resistance", f"{ohms:.9g}ohm", "--wire", "0.3mm", "--turn-length", "50mm",
                      "--lead-resistance", "0.25ohm")["result"]
    assert result["turns_exact"] == pytest.approx(turns, rel=1e-7, abs=0)


def test_text_report_lines():
    """The text starts with the answer, has a row per method, the reason, the arithmetic and the cautions."""
    result = run(*TEST_WINDING)
    assert result.exit_code == 0, result.stderr
    lines = result.stdout.splitlines()
    q = math.sqrt(1.01 / 0.99)
    low, high = math.floor(90 / q + 0.5), math.floor(90 * q + 0.5)
    assert lines[0] == f"turn count: about 90 turns ({low} to {high}), by test winding"
    assert lines[1].split() == ["method", "turns", "range", "±"]
    assert lines[2].split() == ["test", "winding", "90", str(low), "to", str(high), "±1.0", "%"]
    assert any(line.startswith("strongest: test winding is the only method") for line in lines)
    assert any("N = 10·√(" in line and "about 90 turns" in line for line in lines)
    assert "assumed:" in lines and "cautions:" in lines
    assert lines[-1] == f"  - {salvaged_mains_caution()}"


def test_wide_added_turns_interval_warns_in_the_text():
    """20 added turns on 90 with ±1 % readings is wider than ±1 turn: the warning is printed."""
    result = run(*ADDED)
    assert result.exit_code == 0
    assert "warnings:" in result.stdout and "added turns: the count is known only to" in result.stdout


def test_ppm_and_percent_are_the_same_tolerance():
    """--tolerance 10000ppm is 1 %: the same interval."""
    percent = run_json(*TEST_WINDING, "--tolerance", "1%")["result"]
    ppm = run_json(*TEST_WINDING, "--tolerance", "10000ppm")["result"]
    assert percent["methods"][0]["turns_interval"] == pytest.approx(ppm["methods"][0]["turns_interval"])
    spaced = run_json(*TEST_WINDING, "--tolerance", "0.5 %")["result"]
    assert spaced["methods"][0]["relative_uncertainty"] < percent["methods"][0]["relative_uncertainty"]


def test_inductance_that_fell_after_adding_turns_is_infeasible():
    """L2 ≤ L1 after adding turns, no other method: exit 1, one line saying why."""
    result = run("--before", "1.2mH", "--after", "1.1mH", "--added", "10")
    assert result.exit_code == 1
    assert result.stderr.count("\n") == 1 and "opposite sense" in result.stderr
    assert "Traceback" not in result.output


def test_no_data_is_a_usage_error_naming_each_method():
    """No measurements: exit 2, one line naming what each method needs."""
    result = run()
    assert result.exit_code == 2
    assert result.stderr.count("\n") == 1
    for needed in ("--before", "--test-winding", "--resistance", "--turn-length"):
        assert needed in result.stderr


@pytest.mark.parametrize(("args", "option"), [
    pytest.param(("--tolerance", "1", *TEST_WINDING), "--tolerance", id="bare-number-tolerance"),
    pytest.param(("--tolerance", "1,5%", *TEST_WINDING), "--tolerance", id="decimal-comma"),
    pytest.param(("--tolerance", "60%", *TEST_WINDING), "--tolerance", id="tolerance-too-big"),
    pytest.param(("--length-tolerance", "5", "--resistance", "1ohm"), "--length-tolerance", id="bare-length-tol"),
    pytest.param(("--test-winding", "55uH", "--unknown", "1mH"), "--test-winding", id="no-turns-in-reading"),
    pytest.param(("--before", "1mH", "--after", "2mH", "--added", "0"), "--added", id="zero-added"),
    pytest.param(("--before", "1mH", "--after", "2mH", "--added", "3", "--removed", "3"), "--removed", id="both"),
    pytest.param(("--before", "1mH", "--added", "3"), "--after", id="missing-after"),
    pytest.param(("--before", "1mH", "--after", "2mH", "--added", "3", "--tolerance", "1%", "--before", "x"),
                 "--before", id="not-an-inductance"),
    pytest.param(("--resistance", "1ohm", "--wire", "0.3mm", "--inner-perimeter", "30mm"), "--outer-perimeter",
                 id="one-perimeter"),
    pytest.param(("--resistance", "1ohm", "--wire", "0.3mm", "--turn-length", "30mm", "--inner-perimeter", "30mm",
                  "--outer-perimeter", "40mm"), "--turn-length", id="length-and-perimeters"),
    pytest.param(("--resistance", "1ohm", "--wire", "0.3", "--turn-length", "30mm"), "--wire", id="bad-wire"),
    pytest.param(("--resistance", "1ohm", "--wire", "0.3mm", "--turn-length", "30mm", "--lead-resistance", "2ohm"),
                 "--lead-resistance", id="leads-above-reading"),
])
def test_bad_input_is_one_line_naming_the_option(args, option):
    """Bad input: exit 2 and one line on stderr that starts with the option, never a traceback."""
    result = run(*args)
    assert result.exit_code == 2, result.output
    assert result.stderr.startswith(f"coilplan: error: {option}")
    assert result.stderr.count("\n") == 1
    assert "Traceback" not in result.output


def test_count_turns_is_listed_in_the_help():
    """The group's help lists count-turns."""
    result = CliRunner().invoke(main, ["--help"])
    assert result.exit_code == 0 and "count-turns" in result.stdout
