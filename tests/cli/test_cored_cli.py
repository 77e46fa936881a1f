"""`coilplan toroid` and `coilplan gapped` through CliRunner: physics, modes, saturation and bad input."""

import json
import math

import pytest
from click.testing import CliRunner
from scipy.constants import mu_0

from coilplan.answer import flat_document
from coilplan.cli import main

RING = ["toroid", "--od", "25mm", "--id", "15mm", "--height", "10mm", "--wire", "0.5mm"]
CORE = ["gapped", "--ae", "100mm2", "--le", "50mm", "--wire", "0.5mm"]


def run(*args):
    return CliRunner().invoke(main, list(args))


def run_json(*args):
    result = run(*args, "--json")
    assert result.exit_code == 0, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))["result"]


def test_air_toroid_is_amperes_law():
    """--mu 1: L = µ0·N²·h·ln(OD/ID)/(2π) exactly (Ampère's law for a rectangular ring; docs/methods.md §8)."""
    result = run_json(*RING, "--mu", "1", "--turns", "50")
    assert result["inductance_H"] == pytest.approx(mu_0 * 50**2 * 0.010 * math.log(25 / 15) / (2 * math.pi))


def test_toroid_iec_60205_parameters():
    """le, Ae, Ve of the ID 15 / OD 25 / h 10 mm ring (docs/methods.md §8, IEC 60205 definitions)."""
    result = run_json(*RING, "--mu", "2000", "--turns", "10")
    assert result["le_m"] * 1e3 == pytest.approx(60.1802, abs=5e-5)
    assert result["ae_m2"] * 1e6 == pytest.approx(48.9268, abs=5e-5)
    assert result["al_H"] * 1e9 == pytest.approx(2043.30, abs=5e-3)


def test_toroid_from_a_test_winding():
    """Readings give AL = L/N² (IEC 60205 definition of AL) and the implied µr = AL·le/(µ0·Ae)."""
    result = run_json(*RING, "--measured", "120uH@36", "--target", "33uH")
    al = 120e-6 / 36**2
    assert result["al_H"] == pytest.approx(al)
    assert result["turns_exact"] == pytest.approx(math.sqrt(33e-6 / al))
    assert result["mu_r"] == pytest.approx(al * result["le_m"] / (mu_0 * result["ae_m2"]))
    assert result["mu_r_implied"] is True


def test_toroid_saturation_hand_worked():
    """B = L·I/(N·Ae) and the largest current B_sat·Ae/(AL·N) (Faraday's law, hand-worked)."""
    result = run_json(*RING, "--mu", "125", "--turns", "20", "--current", "2A", "--bsat", "0.3T")
    expected = result["inductance_H"] * 2.0 / (20 * result["ae_m2"])
    assert result["flux_density_T"] == pytest.approx(expected)
    assert result["max_current_A"] == pytest.approx(0.3 * result["ae_m2"] / (result["al_H"] * 20))
    assert result["saturation_margin"] == pytest.approx(1 - expected / 0.3)


def test_toroid_one_layer_limit_is_infeasible_past_the_hole():
    """A target needing more turns than one layer holds is infeasible and says how many fit."""
    result = run(*RING, "--mu", "1", "--target", "1mH")
    assert result.exit_code == 1
    assert "one layer" in result.stderr and "holds" in result.stderr
    assert result.stderr.count("\n") == 1


def test_toroid_turns_in_one_layer():
    """One layer holds ⌊π(ID − d)/d⌋ turns (common practice, no source; hand-worked here)."""
    result = run_json(*RING, "--mu", "1", "--turns", "5")
    d = result["wire"]["overall_diameter_m"]
    assert result["turns_one_layer"] == math.floor(math.pi * (0.015 - d) / d)


def test_gapped_al_and_fringing_shown_apart():
    """AL = F·µ0·Ae/(lg + le/µr): no-fringing 239.36 nH and F = 1.1844 (docs/methods.md §8, McLyman)."""
    result = run_json(*CORE, "--gap", "0.5mm", "--mu", "2000", "--window-width", "10mm", "--turns", "40")
    assert result["al_no_fringing_H"] * 1e9 == pytest.approx(239.359, abs=5e-4)
    assert result["fringing_factor"] == pytest.approx(1.1844, abs=5e-5)
    assert result["inductance_H"] == pytest.approx(result["al_H"] * 40**2)


def test_gapped_gap_for_turns_round_trips():
    """The computed gap, fed back in, gives the asked inductance at those turns."""
    gap = run_json(*CORE, "--mu", "2000", "--window-width", "10mm", "--turns", "60", "--target", "1mH")["gap_m"]
    again = run_json(*CORE, "--mu", "2000", "--window-width", "10mm", "--turns", "60", "--gap", f"{gap * 1e3!r}mm")
    assert again["inductance_H"] == pytest.approx(1e-3, rel=1e-9, abs=0)


def test_choke_design_carries_the_current():
    """Turns N = ⌈L·I/(B_max·Ae)⌉ keep B below the limit; the gap then gives L (McLyman's method)."""
    result = run_json(*CORE, "--mu", "2000", "--window-width", "10mm", "--window-depth", "5mm",
                      "--target", "1mH", "--current", "1A", "--bsat", "0.35T")
    limit = 0.8 * 0.35
    assert result["turns"] == math.ceil(1e-3 * 1.0 / (limit * 100e-6))
    assert result["flux_density_T"] <= limit
    assert result["inductance_H"] == pytest.approx(1e-3, rel=1e-9, abs=0)
    assert result["turns"] <= result["max_turns"]


def test_choke_that_cannot_fit_is_infeasible():
    """A current the window cannot carry at this inductance is refused with the reason."""
    result = run(*CORE, "--mu", "2000", "--window-width", "5mm", "--window-depth", "1mm",
                 "--target", "10mH", "--current", "3A", "--bsat", "0.35T")
    assert result.exit_code == 1
    assert "turns" in result.stderr and "larger core" in result.stderr


def test_mains_voltage_and_hot_winding_cautions():
    """A winding across mains-level voltage and a high current density both caution."""
    document = json.loads(run(*CORE, "--gap", "1mm", "--mu", "2000", "--turns", "400", "--ac-voltage", "230V",
                              "--at", "50Hz", "--bsat", "0.35T", "--json").stdout)
    assert any("mains" in text for text in document["cautions"])
    hot = json.loads(run(*RING, "--mu", "125", "--turns", "10", "--current", "3A", "--json").stdout)
    assert any("runs hot" in text for text in hot["cautions"])


BAD = [
    ([*RING, "--turns", "10"], 2, "--mu"),
    ([*RING, "--mu", "125", "--al", "100nH", "--turns", "10"], 2, "only one of"),
    ([*RING, "--mu", "0.5", "--turns", "10"], 2, "--mu"),
    ([*RING, "--al", "100nF", "--turns", "10"], 2, "--al"),
    ([*RING, "--measured", "100uH", "--turns", "10"], 2, "--measured"),
    ([*RING, "--measured", "100uH@0", "--turns", "10"], 2, "--measured"),
    ([*RING, "--mu", "125", "--turns", "10", "--ac-voltage", "5V"], 2, "--at"),
    (["toroid", "--od", "15mm", "--id", "25mm", "--height", "10mm", "--wire", "0.5mm", "--mu", "1", "--turns", "5"],
     2, "--od"),
    ([*CORE, "--mu", "2000", "--turns", "10"], 2, "--gap"),
    ([*CORE, "--gap", "0.5mm", "--turns", "10"], 2, "--mu"),
    (["gapped", "--ae", "100mm", "--le", "50mm", "--wire", "0.5mm", "--mu", "2000", "--gap", "1mm", "--turns", "5"],
     2, "--ae"),
    ([*CORE, "--gap", "-1mm", "--mu", "2000", "--turns", "10"], 2, "--gap"),
    ([*CORE, "--mu", "2000", "--target", "1mH", "--current", "1A"], 2, "--max-flux"),
    ([*CORE, "--mu", "20", "--turns", "5", "--target", "1mH"], 1, "ungapped"),
]


@pytest.mark.parametrize(("arguments", "status", "text"), BAD, ids=[" ".join(b[0][1:]) for b in BAD])
def test_bad_input(arguments, status, text):
    """One line on stderr naming the option or the limit, the right exit status, no traceback."""
    result = run(*arguments)
    assert result.exit_code == status, result.stdout + result.stderr
    assert result.stderr.count("\n") == 1 and text in result.stderr
    assert "Traceback" not in result.stderr
