"""`coilplan rod` through CliRunner: the rod's effect, calibration by a reading, limits and bad input."""

import json

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main
from coilplan.physics.rod import rod_permeability

ROD = ["rod", "--rod-length", "100mm", "--rod-diameter", "10mm", "--wire", "0.3mm"]


def run(*args):
    return CliRunner().invoke(main, list(args))


def run_json(*args):
    result = run(*args, "--json")
    assert result.exit_code == 0, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))


def test_rod_raises_inductance_and_warns_until_calibrated():
    """The rod adds inductance over the air winding, and the uncalibrated answer says it is rough."""
    document = run_json(*ROD, "--material", "nizn-125", "--turns", "60")
    result = document["result"]
    assert result["inductance_H"] > 5 * result["air_inductance_H"]
    assert result["rod_permeability"] == pytest.approx(float(rod_permeability(125, 10)))
    assert any("uncalibrated" in text for text in document["warnings"])


def test_mu_one_is_the_air_coil():
    """µ = 1: the rod does nothing, and the answer is the Nagaoka current sheet of the winding."""
    result = run_json(*ROD, "--mu", "1", "--turns", "40")["result"]
    assert result["inductance_H"] == pytest.approx(result["air_inductance_H"], rel=1e-9, abs=0)


def test_calibration_reproduces_the_reading():
    """With one reading the calibrated model gives that reading back at its turns (the scale fit)."""
    document = run_json(*ROD, "--material", "nizn-125", "--measured", "240uH@60", "--turns", "60")
    assert document["result"]["inductance_H"] == pytest.approx(240e-6, rel=1e-12, abs=0)
    assert not any("uncalibrated" in text for text in document["warnings"])
    inverse = run_json(*ROD, "--material", "nizn-125", "--measured", "240uH@60", "--target", "240uH")["result"]
    assert inverse["turns_exact"] == pytest.approx(60, rel=1e-9, abs=0)


def test_coil_off_centre_has_less_inductance():
    """Sliding the winding toward a rod end lowers L (the rod's field is strongest at its middle)."""
    centred = run_json(*ROD, "--mu", "125", "--turns", "50")["result"]["inductance_H"]
    shifted = run_json(*ROD, "--mu", "125", "--turns", "50", "--position", "35mm")["result"]["inductance_H"]
    assert shifted < centred


@pytest.mark.parametrize(("extra", "status", "text"), [
    (["--turns", "10"], 2, "--mu"),
    (["--mu", "125", "--al", "100nH", "--turns", "10"], 2, "--al"),
    (["--mu", "125", "--former", "5mm", "--turns", "10"], 2, "--former"),
    (["--mu", "125", "--coil-length", "200mm", "--turns", "10"], 2, "--coil-length"),
    (["--mu", "125", "--target", "1H"], 1, "fill"),
    (["--mu", "125", "--position", "1,5mm", "--turns", "10"], 2, "--position"),
])
def test_bad_input(extra, status, text):
    """One line naming the option or the limit, the right exit status, no traceback."""
    result = run(*ROD, *extra)
    assert result.exit_code == status, result.stdout + result.stderr
    assert result.stderr.count("\n") == 1 and text in result.stderr
    assert "Traceback" not in result.stderr
