"""The measured coil: calibration, the frequency correction, turns to add or remove and their range."""

import json
import math

import mp_reference as ref
import mpmath as mp
import numpy as np
import pytest
from click.testing import CliRunner
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.answer import flat_document
from coilplan.calibrate import ScaledForm
from coilplan.cli import main
from coilplan.forms import ClosedCore, Solenoid
from coilplan.rewind import (
    Conditions,
    apparent_inductance,
    closed_core_fit,
    low_frequency_inductance,
    model_fit,
)
from coilplan.rewind_answer import rewind_fields
from coilplan.wire import parse_wire


def run_json(*args):
    result = CliRunner().invoke(main, [*args, "--json"])
    assert result.exit_code == 0, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))


def test_closed_core_twenty_turn_example():
    """A 20-turn test winding at 55 µH gives 27 turns for 100 µH (the N² law: 20·√(100/55) = 26.97; issue 4)."""
    result = run_json("rewind", "--measured", "55uH@20", "--target", "100uH")["result"]
    assert result["turns_exact"] == pytest.approx(20 * math.sqrt(100 / 55), rel=1e-12, abs=0)
    assert result["turns"] == 27
    assert result["turns_change"] == 7
    assert result["al_H"] == pytest.approx(55e-6 / 400)


def test_air_coil_differs_from_square_root_scaling_as_nagaoka_says():
    """Removing turns from a close-wound coil shortens it: the answer solves L(N)/L(N0) = target/reading
    with the Rosa-corrected Nagaoka L (mpmath reference, independent of coilplan), not N0·√(ratio)."""
    wire = parse_wire("0.5mm", grade="bare")
    args = ("solenoid", "--diameter", "25mm", "--wire", "0.5mm", "--grade", "bare")
    result = run_json(*args, "--measured", "20uH@30", "--target", "10uH")["result"]
    pitch = wire.overall_diameter

    def ratio(turns):
        return (ref.rosa_solenoid(0.025, pitch, 0.0005, turns, mu_0)
                / ref.rosa_solenoid(0.025, pitch, 0.0005, 30, mu_0))

    # Rosa's km is defined at whole turns: bracket the answer between the two whole numbers around it
    below, above = result["turns_below"], result["turns_above"]
    assert float(ratio(below)) <= 0.5 <= float(ratio(above))
    naive = 30 * math.sqrt(0.5)
    assert result["turns_exact"] < naive - 1  # the N² rule would leave too many turns
    # continuous solution against the current sheet alone, solved by mpmath (Nagaoka's K, no Rosa terms)
    sheet = Solenoid(diameter=0.025, wire=wire, method="sheet")
    calibrated = ScaledForm(sheet, model_fit(sheet, [(20e-6, 30)]).value)
    target_sheet = mp.findroot(lambda n: ref.nagaoka(0.025 / (n * pitch)) * n / (
        ref.nagaoka(0.025 / (30 * pitch)) * 30) - 0.5, 20)
    fields, _ = rewind_fields(calibrated, 10e-6, [(20e-6, 30)], model_fit(sheet, [(20e-6, 30)]), Conditions())
    assert fields["turns_exact"] == pytest.approx(float(target_sheet), rel=1e-9, abs=0)


@given(st.floats(min_value=1e-7, max_value=1e-2), st.floats(min_value=1e3, max_value=3e7),
       st.floats(min_value=1e-13, max_value=1e-10))
def test_self_capacitance_correction_both_ways(inductance, frequency, capacitance):
    """L → L/(1 − ω²LC) → back gives L, below self-resonance (docs/methods.md §10)."""
    omega2 = (2 * math.pi * frequency) ** 2
    if omega2 * inductance * capacitance >= 0.9:
        return
    apparent = float(apparent_inductance(inductance, frequency, capacitance))
    assert apparent == pytest.approx(inductance / (1 - omega2 * inductance * capacitance), rel=1e-12, abs=0)
    back = float(low_frequency_inductance(apparent, frequency, capacitance))
    assert back == pytest.approx(inductance, rel=1e-12, abs=0)


def test_references_apparent_inductance_value():
    """100 µH with 5 pF at 1 MHz appears as 102.014 µH (docs/methods.md §10)."""
    assert float(apparent_inductance(100e-6, 1e6, 5e-12)) * 1e6 == pytest.approx(102.014, abs=5e-4)


def test_target_at_frequency_shows_as_target():
    """With --at and a self-capacitance, the apparent inductance at --at of the answer is the target."""
    result = run_json("rewind", "--measured", "120uH@36", "--target", "150uH", "--at", "2MHz",
                      "--self-capacitance", "8pF", "--meter-freq", "100kHz")["result"]
    al = float(low_frequency_inductance(120e-6, 1e5, 8e-12)) / 36**2
    low_target = 150e-6 / (1 + (2 * math.pi * 2e6) ** 2 * 150e-6 * 8e-12)
    assert result["turns_exact"] == pytest.approx(math.sqrt(low_target / al), rel=1e-9, abs=0)
    exact_apparent = float(apparent_inductance(al * result["turns_exact"] ** 2, 2e6, 8e-12))
    assert exact_apparent == pytest.approx(150e-6, rel=1e-9, abs=0)


def test_srf_warning_near_resonance():
    """An operating frequency above a third of the SRF warns (common practice, no source)."""
    document = run_json("rewind", "--measured", "100uH@30", "--target", "100uH", "--at", "5MHz",
                        "--self-capacitance", "10pF")
    assert any("self-resonant" in text for text in document["warnings"])


@settings(max_examples=40)
@given(al=st.floats(min_value=1e-9, max_value=1e-6), turns=st.integers(min_value=5, max_value=200),
       target_ratio=st.floats(min_value=0.3, max_value=3.0), tolerance=st.floats(min_value=0.002, max_value=0.05),
       errors=st.lists(st.floats(min_value=-1.0, max_value=1.0), min_size=1, max_size=4))
def test_noisy_readings_keep_the_truth_inside_the_range(al, turns, target_ratio, tolerance, errors):
    """Readings off by up to the meter tolerance (a systematic bound): the true answer lies in the range, always."""
    counts = [turns + 7 * index for index in range(len(errors))]
    readings = [(al * n * n * (1 + tolerance * e), n) for n, e in zip(counts, errors, strict=True)]
    target = al * turns * turns * target_ratio
    fit = closed_core_fit(readings)
    form = ClosedCore(al=fit.value)
    fields, _ = rewind_fields(form, target, readings, fit, Conditions(tolerance=tolerance, tolerance_assumed=False))
    truth = math.sqrt(target / al)
    low, high = fields["turns_range_exact"]
    assert low * (1 - 1e-9) <= truth <= high * (1 + 1e-9)  # the band ends are roots to 1e-12


def test_offset_fit_recovers_leads():
    """L = AL·N² + L0: four readings generated with a 0.3 µH lead part give it back (weighted least squares)."""
    al, lead = 80e-9, 0.3e-6
    readings = [(al * n * n + lead, n) for n in (5, 10, 20, 30)]
    fit = closed_core_fit(readings, offset=True)
    assert fit.value == pytest.approx(al, rel=1e-10, abs=0)
    assert fit.extra["offset_H"] == pytest.approx(lead, rel=1e-8, abs=0)
    assert max(abs(r) for r in fit.residuals) < 1e-10


def test_inconsistent_readings_are_named_not_averaged_away():
    """Four test windings whose ratios are far from N² ratios: a warning names the odd reading and the causes."""
    document = run_json("rewind", "--measured", "30uH@10", "--measured", "100uH@20", "--measured", "270uH@30",
                        "--measured", "480uH@40", "--target", "200uH", "--tolerance", "2%")
    text = " ".join(document["warnings"])
    assert "100.0 μH at 20 turns" in text and "lead inductance" in text


def test_json_answer_fields():
    """The answer carries the fields of issue 4: now, change, range, AL, wire change."""
    result = run_json("toroid", "--od", "23mm", "--id", "14mm", "--height", "7.5mm", "--wire", "0.5mm",
                      "--measured", "99uH@40", "--target", "47uH", "--tolerance", "3%")["result"]
    for key in ("turns_now", "turns", "turns_exact", "turns_change", "turns_range", "inductance_H", "al_H",
                "wire_change_m"):
        assert key in result
    assert result["turns_change"] == result["turns"] - 40 < 0
    assert result["wire_change_m"] < 0
    assert result["turns_range"][0] <= result["turns"] <= result["turns_range"][1]


def test_plan_approaches_from_above_when_unsure():
    """A range wider than a turn: the first step stops at the top of it (removing is easy, adding back is not)."""
    result = run_json("rewind", "--measured", "400uH@60", "--target", "100uH", "--tolerance", "10%")["result"]
    assert len(result["plan"]) == 2
    assert f"to {result['turns_range'][1]}" in result["plan"][0]


def test_repeated_turn_counts_are_refused():
    """Two readings at the same turns must be averaged by the user first: one line naming --measured."""
    result = CliRunner().invoke(main, ["rewind", "--measured", "1uH@10", "--measured", "1.1uH@10",
                                       "--target", "2uH"])
    assert result.exit_code == 2 and "--measured" in result.stderr and result.stderr.count("\n") == 1


def test_scale_fit_is_weighted_least_squares():
    """model_fit minimises Σ((L − k·model)/L)², checked with numpy's lstsq (independent solver)."""
    form = ClosedCore(al=1e-9)
    readings = [(1.1e-7, 10), (4.3e-7, 20), (9.2e-7, 30)]
    model = np.array([1e-9 * n * n for _, n in readings])
    values = np.array([v for v, _ in readings])
    expected = np.linalg.lstsq((model / values)[:, None], np.ones(3), rcond=None)[0][0]
    assert model_fit(form, readings).value == pytest.approx(expected, rel=1e-12, abs=0)


def test_negative_lead_offset_is_dropped_with_a_note():
    """Leads add inductance in series: a fitted L0 < 0 is scatter, so the plain N² law is used and said."""
    document = run_json("rewind", "--measured", "160uH@34", "--measured", "131uH@31", "--offset",
                        "--target", "100uH")
    result = document["result"]
    assert result["offset_H"] == 0.0
    assert any("below zero" in note for note in result["notices"])
    assert result["inductance_H"] > 0


def test_bare_command_prints_help():
    """`coilplan` alone shows the help (exit 0), not a one-line error."""
    result = CliRunner().invoke(main, [])
    assert result.exit_code == 0 and "Commands:" in result.stdout


def test_more_turns_reading_less_is_flagged():
    """A closed core cannot lose inductance as turns are added (L = AL·N²): the answer warns."""
    document = run_json("rewind", "--measured", "9uH@10", "--measured", "8uH@12", "--target", "20uH")
    assert any("more turns read less" in text for text in document["warnings"])
