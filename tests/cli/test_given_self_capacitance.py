"""A self-capacitance the user measured replaces the estimate everywhere; answers near self-resonance are honest.

The reference relations are the parallel-C model of a coil (docs/methods.md §10): the apparent inductance
L/(1 − ω²LC) and the self-resonance f = 1/(2π√(LC)).
"""

import json
import math

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main

AIR = ["solenoid", "--former", "25mm", "--wire", "0.5mm"]
RING = ["toroid", "--od", "23mm", "--id", "14mm", "--height", "7mm", "--wire", "0.5mm"]
CORE = ["gapped", "--ae", "50mm2", "--le", "45mm", "--wire", "0.3mm", "--material", "mnzn-power", "--gap", "0.5mm"]


def run(*args):
    return CliRunner().invoke(main, list(args))


def run_json(*args):
    outcome = run(*args, "--json")
    assert outcome.exit_code == 0, outcome.stdout + outcome.stderr
    return flat_document(json.loads(outcome.stdout))["result"]


def apparent(inductance, frequency, capacitance):
    return inductance / (1 - (2 * math.pi * frequency) ** 2 * inductance * capacitance)


@pytest.mark.parametrize("capacitance", [1e-12, 20e-12, 200e-12])
def test_a_given_self_capacitance_sets_the_target_at_the_operating_frequency(capacitance):
    """Without readings too: the turns chosen show the target at --at with the C given, not the estimate."""
    result = run_json(*AIR, "--target", "10uH", "--at", "3MHz", "--self-capacitance", f"{capacitance * 1e12:g}pF")
    assert result["self_capacitance_F"] == pytest.approx(capacitance, rel=1e-12)
    assert result["self_capacitance_source"] == "given"
    shown = apparent(result["inductance_H"], 3e6, capacitance)
    assert result["target_inductance_at_turns_H"] == pytest.approx(shown, rel=1e-9)
    for neighbour in ("inductance_below_H", "inductance_above_H"):  # the other whole turn is no closer
        assert abs(shown / 10e-6 - 1) <= abs(result[neighbour] / 10e-6 - 1) + 1e-12


def test_the_answer_moves_with_the_given_capacitance():
    """More self-capacitance, fewer turns for the same apparent target (L/(1 − ω²LC) rises with C)."""
    small = run_json(*AIR, "--target", "10uH", "--at", "3MHz", "--self-capacitance", "1fF")
    large = run_json(*AIR, "--target", "10uH", "--at", "3MHz", "--self-capacitance", "100pF")
    assert large["turns"] < small["turns"]


def test_a_forward_answer_reports_the_given_capacitance_and_its_self_resonance():
    result = run_json(*RING, "--mu", "125", "--turns", "20", "--self-capacitance", "5pF")
    assert result["self_capacitance_F"] == pytest.approx(5e-12, rel=1e-12)
    assert result["srf_Hz"] == pytest.approx(1 / (2 * math.pi * math.sqrt(result["inductance_H"] * 5e-12)),
                                             rel=1e-12)


def test_a_gapped_core_with_a_given_capacitance_cannot_reach_past_its_self_resonance():
    """A single-layer gapped winding has no estimate; a given 10 pF makes 1 mH at 100 MHz impossible (exit 1)."""
    outcome = run(*CORE, "--target", "1mH", "--at", "100MHz", "--self-capacitance", "10pF")
    assert outcome.exit_code == 1
    assert "resonates by itself" in outcome.stderr and len(outcome.stderr.strip().splitlines()) == 1


def test_even_one_turn_resonating_below_the_frequency_is_infeasible():
    """AL 20 nH with 5 pF: one turn resonates at 503 MHz, so nothing works at 1 GHz (exit 1, one line)."""
    outcome = run(*RING, "--al", "20nH", "--target", "10uH", "--at", "1GHz", "--self-capacitance", "5pF")
    assert outcome.exit_code == 1 and "resonates by itself" in outcome.stderr
    assert 1 / (2 * math.pi * math.sqrt(20e-9 * 5e-12)) < 1e9


def test_rewind_in_the_self_resonance_rise_is_refused():
    """55 µH at 20 turns, 10 pF, 100 µH wanted at 100 MHz: the exact turns lie where L/(1 − ω²LC) runs away, and
    1 turn shows 301 nH while 2 are above self-resonance — no whole number of turns is an answer (exit 1)."""
    outcome = run("rewind", "--measured", "55uH@20", "--target", "100uH", "--at", "100MHz",
                  "--self-capacitance", "10pF")
    assert outcome.exit_code == 1
    assert "self-resonance rise" in outcome.stderr and len(outcome.stderr.strip().splitlines()) == 1
    assert apparent(55e-6 / 400, 100e6, 10e-12) == pytest.approx(300.8e-9, rel=1e-3)


def test_rewind_says_the_low_frequency_equivalent_when_it_is_out_of_reach():
    outcome = run("rewind", "--measured", "55uH@20", "--target", "100uH", "--at", "1GHz",
                  "--self-capacitance", "10pF", "--meter-freq", "1kHz")
    assert outcome.exit_code == 1
    low = 100e-6 / (1 + (2 * math.pi * 1e9) ** 2 * 100e-6 * 10e-12)  # L = L_app/(1 + ω²L_app·C)
    assert "at low frequency" in outcome.stderr and f"{low * 1e9:.3f} nH" in outcome.stderr


def test_a_reading_taken_near_self_resonance_is_refused():
    """55 µH read at 100 MHz with 10 pF implies L = 252 nH and an SRF of 100.2 MHz: the reading is unusable."""
    outcome = run("rewind", "--measured", "55uH@20", "--target", "100uH", "--self-capacitance", "10pF",
                  "--meter-freq", "100MHz")
    assert outcome.exit_code == 2
    line = outcome.stderr.strip()
    assert line.startswith("coilplan: error: --meter-freq") and "99.8%" in line
    low = 55e-6 / (1 + (2 * math.pi * 100e6) ** 2 * 55e-6 * 10e-12)
    assert 100e6 * 2 * math.pi * math.sqrt(low * 10e-12) == pytest.approx(0.998, abs=5e-4)
