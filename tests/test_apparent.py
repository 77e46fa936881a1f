"""The coil at its operating frequency: the solve targets the apparent inductance, and tuning to a capacitor."""

import json
import math

import numpy as np
import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.apparent import ApparentForm, frequency_fields
from coilplan.cli import main
from coilplan.errors import InfeasibleError
from coilplan.forms import Solenoid
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire


def coil():
    return Solenoid(diameter=0.0255, wire=parse_wire("0.5mm"))


def run_json(*args):
    result = CliRunner().invoke(main, [*args, "--json"])
    assert result.exit_code == 0, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))


@pytest.mark.parametrize("frequency", [1e6, 7e6, 14e6])
def test_apparent_target_round_trip(frequency):
    """At N*, L/(1 − ω²·L·C) equals the target (docs/methods.md §10, apparent inductance), L and C the form's."""
    form = coil()
    solution = solve_turns(ApparentForm(form, frequency), 8e-6)
    n = solution.turns_exact
    inductance, capacitance = float(form.inductance(n)), float(form.self_capacitance(n))
    omega2 = (2 * math.pi * frequency) ** 2
    assert inductance / (1 - omega2 * inductance * capacitance) == pytest.approx(8e-6, rel=1e-9, abs=0)
    assert inductance < 8e-6  # the self-capacitance makes the coil look larger: fewer turns are needed


def test_tuning_to_a_capacitor_resonates_there():
    """--target-frequency with --capacitance: the coil's L with C plus its own C resonates at f (f = 1/2π√(LC))."""
    result = run_json("solenoid", "--diameter", "25.5mm", "--wire", "0.5mm", "--target-frequency", "7MHz",
                      "--capacitance", "47pF")["result"]
    form = coil()
    n = result["turns_exact"]
    total = 47e-12 + float(form.self_capacitance(n))
    assert 1 / (2 * math.pi * math.sqrt(float(form.inductance(n)) * total)) == pytest.approx(7e6, rel=1e-9, abs=0)
    assert result["target_H"] == pytest.approx(1 / ((2 * math.pi * 7e6) ** 2 * 47e-12), rel=1e-12, abs=0)


def test_above_self_resonance_is_infeasible():
    """A target that needs more turns than stay below self-resonance at f is refused, and says why."""
    form = Solenoid(diameter=0.1, wire=parse_wire("1mm"))
    with pytest.raises(InfeasibleError, match="resonates by itself"):
        solve_turns(ApparentForm(form, 30e6), 1e-3)


def test_frequency_fields_q_and_srf():
    """Q = ωL/R_ac and SRF = 1/(2π√(LC)) with the form's own L, R and C (textbook definitions)."""
    form = coil()
    fields = frequency_fields(form, 18, 7e6)
    inductance, capacitance = float(form.inductance(18)), float(form.self_capacitance(18))
    assert fields["srf_Hz"] == pytest.approx(1 / (2 * math.pi * math.sqrt(inductance * capacitance)), rel=1e-12, abs=0)
    assert fields["q"] == pytest.approx(2 * math.pi * 7e6 * inductance / fields["ac_resistance_ohm"], rel=1e-12,
                                        abs=0)
    assert fields["ac_resistance_ohm"] > float(form.resistance(18))  # skin and proximity only add loss


def test_json_fields_at_frequency():
    """--at adds the fields issue 5 names: self-capacitance, SRF, apparent L, AC resistance, Q."""
    result = run_json("solenoid", "--former", "25mm", "--wire", "0.5mm", "--turns", "18", "--at", "7MHz")["result"]
    for key in ("self_capacitance_F", "srf_Hz", "apparent_inductance_H", "ac_resistance_ohm", "q"):
        assert isinstance(result[key], float) and math.isfinite(result[key]), key


def test_near_self_resonance_warns():
    """Above a third of the SRF the answer warns (common practice, no source)."""
    document = run_json("solenoid", "--diameter", "100mm", "--wire", "1mm", "--turns", "60", "--at", "4MHz")
    assert any("self-resonan" in text for text in document["warnings"])


def test_tuning_options_need_each_other():
    """--target-frequency without --capacitance is one line naming the missing option, exit 2."""
    result = CliRunner().invoke(main, ["solenoid", "--former", "25mm", "--wire", "0.5mm", "--target-frequency",
                                       "7MHz"])
    assert result.exit_code == 2 and "--capacitance" in result.stderr and result.stderr.count("\n") == 1


def test_plot_files_are_written(tmp_path):
    """--plot writes a PNG or SVG (by its ending) of |Z| and Q; a bad ending is one line naming --plot."""
    for name, magic in (("coil.png", b"\x89PNG"), ("coil.svg", b"<?xml")):
        path = tmp_path / name
        run_json("solenoid", "--former", "25mm", "--wire", "0.5mm", "--turns", "18", "--at", "7MHz",
                 "--plot", str(path))
        assert path.read_bytes().startswith(magic)
    result = CliRunner().invoke(main, ["solenoid", "--former", "25mm", "--wire", "0.5mm", "--turns", "18",
                                       "--plot", str(tmp_path / "coil.jpg")])
    assert result.exit_code == 2 and "--plot" in result.stderr and not (tmp_path / "coil.jpg").exists()


def test_impedance_model_peaks_at_the_srf():
    """The sweep's |Z| is largest at the self-resonance of L and C (parallel resonance, textbook)."""
    from coilplan.apparent import impedance_sweep

    sweep = impedance_sweep(coil(), 18, points=4001)
    peak = sweep["frequency_Hz"][int(np.argmax(sweep["impedance_ohm"]))]
    assert peak == pytest.approx(sweep["srf_Hz"], rel=5e-3, abs=0)


def test_litz_beats_solid_wire_of_the_same_copper_at_hf():
    """At 500 kHz, litz of fine strands loses less than one solid wire of the same copper area
    (the reason litz exists: strands far below the skin depth; Sullivan 1999)."""
    litz = parse_wire("40x0.071mm")  # strands below the 93 µm skin depth of copper at 500 kHz
    solid = parse_wire(f"{math.sqrt(40) * 0.071:.4f}mm")
    results = []
    for wire in (litz, solid):
        form = Solenoid(diameter=0.0255, wire=wire)
        ratio = float(form.ac_resistance(60, 5e5)) / float(form.resistance(60))
        results.append(ratio)
    assert results[0] < results[1]
