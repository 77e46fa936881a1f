"""`coilplan multilayer` and `coilplan spiral` through click's CliRunner: JSON shape, exit codes, errors."""

import json

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main
from coilplan.physics.multilayer import multilayer_filament_inductance, spiral_filament_inductance

ML = ["multilayer", "--former", "10mm", "--width", "8mm", "--wire", "0.2mm"]
SP = ["spiral", "--inner", "30mm", "--wire", "0.5mm", "--spacing", "0.5mm"]
KEYS = ("turns", "inductance_H", "layers", "turns_per_layer", "depth_m", "outer_diameter_m", "wire_length_m",
        "dc_resistance_ohm", "method")


def run(*args):
    return CliRunner().invoke(main, list(args))


def run_json(*args):
    result = run(*args, "--json")
    assert result.exit_code == 0, result.output + result.stderr
    return flat_document(json.loads(result.stdout))


@pytest.mark.parametrize("base", [ML, SP], ids=["multilayer", "spiral"])
def test_json_keys_and_round_trip(base):
    """--target gives whole turns; the result has the issue's keys; --turns of that count gives the same L."""
    document = run_json(*base, "--target", "50uH")
    assert set(document) == {"schema", "command", "inputs", "result", "warnings", "cautions"}
    result = document["result"]
    for key in KEYS:
        assert key in result, key
    assert result["method"] == "filament"
    assert result["inductance_below_H"] <= 50e-6 <= result["inductance_above_H"]
    forward = run_json(*base, "--turns", str(result["turns"]))["result"]
    assert forward["inductance_H"] == pytest.approx(result["inductance_H"], rel=1e-12)


def test_multilayer_forward_is_the_filament_sum():
    """--turns 200 reports the exact sum of the physics kernel, and Wheeler's value beside it."""
    result = run_json(*ML, "--turns", "200", "--style", "staggered")["result"]
    exact = multilayer_filament_inductance(0.005, 0.008, 0.0002, 200,
                                           overall_diameter=result["wire"]["overall_diameter_m"], style="staggered")
    assert result["inductance_H"] == pytest.approx(exact, rel=1e-12)
    assert result["wheeler_difference"] == pytest.approx(result["wheeler_inductance_H"] / exact - 1)
    assert result["layers"] == 6 and result["turns_per_layer"] == 36


def test_spiral_forward_is_the_filament_sum():
    """--turns 10 reports the concentric-circle sum with the first turn centre at inner + d/2."""
    result = run_json(*SP, "--turns", "10")["result"]
    pitch = result["radial_pitch_m"]
    d = result["wire"]["overall_diameter_m"]
    expected = spiral_filament_inductance(0.015 + d / 2 - pitch / 2, pitch, 0.0005, 10)
    assert result["inductance_H"] == pytest.approx(expected, rel=1e-12)


def test_text_names_the_method_and_fit():
    """The text report says which method produced the number and whether the window fits."""
    result = run(*ML, "--turns", "100", "--max-depth", "3mm")
    assert result.exit_code == 0
    assert "filament" in result.stdout and "Wheeler's formula" in result.stdout
    assert "fits" in result.stdout


def test_measured_calibration_and_frequency():
    """--measured scales the model ("scale" calibration) and --at adds the apparent target."""
    result = run_json(*ML, "--measured", "100uH@150", "--target", "200uH")["result"]
    assert "turns_now" in result and result["turns_now"] == 150
    at = run_json(*SP, "--target", "20uH", "--at", "1MHz")["result"]
    assert at["target_is_apparent"] and at["srf_Hz"] > 1e6


@pytest.mark.parametrize(("args", "option", "code"), [
    (["multilayer", "--former", "10mm", "--width", "0.1mm", "--wire", "0.2mm", "--turns", "5"], "--width", 2),
    (["multilayer", "--former", "10mm", "--width", "8mm", "--wire", "0.2mm"], "--turns", 2),
    (["multilayer", "--former", "10mm", "--width", "8mm", "--wire", "0.2mm", "--turns", "5", "--packing", "1.5"],
     "--packing", 2),
    (["spiral", "--inner", "30mm", "--wire", "0.5mm", "--turns", "5"], "--spacing", 2),
    (["spiral", "--inner", "abc", "--wire", "0.5mm", "--spacing", "0", "--turns", "5"], "--inner", 2),
    (["multilayer", "--former", "10mm", "--width", "8mm", "--wire", "0.2mm", "--turns", "5000", "--max-depth", "1mm"],
     "fit", 1),
    (["spiral", "--inner", "30mm", "--wire", "0.5mm", "--outer", "40mm", "--target", "1mH"], "", 1),
])
def test_errors_are_one_line_naming_the_option(args, option, code):
    """Bad input exits 2, an infeasible request 1; one line on stderr naming the option; no traceback."""
    result = run(*args)
    assert result.exit_code == code, result.output
    assert "Traceback" not in result.output + result.stderr
    assert len(result.stderr.strip().splitlines()) == 1
    assert option in result.stderr
