"""`coilplan tank` through CliRunner: JSON keys, text lines, exit codes and one-line errors.

Expected numbers are worked out here from f = 1/(2π√(LC)), the band rule (fmax/fmin)² ≤ Cmax,total/Cmin,total
(docs/methods.md §10) and V = √(P·Q·X) for a tank of parallel resistance Q·X.
"""

import json
import math

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main


def run(*args):
    return CliRunner().invoke(main, ["tank", *args])


def run_json(*args, code=0):
    result = run(*args, "--json")
    assert result.exit_code == code, result.stdout + result.stderr
    return flat_document(json.loads(result.stdout))


def one_line_error(result, code):
    """The run failed with ``code``, one line on stderr, nothing on stdout and no traceback."""
    assert result.exit_code == code, result.stdout + result.stderr
    assert "Traceback" not in result.stdout + result.stderr
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("coilplan: error: ")
    return lines[0]


def test_json_two_of_three():
    """100 µH and 100 pF: ω = 1/√(1e-14) = 1e7 rad/s, so f = 1e7/(2π) Hz and X = √(L/C) = 1000 Ω (by hand)."""
    document = run_json("--inductance", "100uH", "--capacitance", "100pF")
    assert list(document) == ["schema", "command", "inputs", "result", "warnings", "cautions"]
    assert document["command"] == "tank"
    result = document["result"]
    assert result["mode"] == "lc" and result["solved_for"] == "frequency"
    assert result["frequency_Hz"] == pytest.approx(1e7 / (2 * math.pi), rel=1e-14, abs=0)
    assert result["inductance_H"] == pytest.approx(100e-6) and result["capacitance_F"] == pytest.approx(100e-12)
    assert result["reactance_ohm"] == pytest.approx(1000.0, rel=1e-13, abs=0)
    assert result["characteristic_impedance_ohm"] == pytest.approx(1000.0, rel=1e-13, abs=0)
    assert document["inputs"] == {"inductance_H": 100e-6, "capacitance_F": 100e-12}
    assert document["cautions"] == []


def test_json_round_trip_through_the_frequency():
    """The frequency printed for 240 µH and 365 pF, given back with 365 pF, gives 240 µH."""
    f = run_json("--inductance", "240uH", "--capacitance", "365pF")["result"]["frequency_Hz"]
    back = run_json("--frequency", f"{f:.12g}Hz", "--capacitance", "365pF")["result"]
    assert back["solved_for"] == "inductance" and back["inductance_H"] == pytest.approx(240e-6, rel=1e-11, abs=0)


def test_text_two_of_three_lines():
    """The text answer: the summary line, then aligned rows naming the formula of the value computed."""
    result = run("--inductance", "100uH", "--capacitance", "100pF")
    assert result.exit_code == 0, result.stderr
    lines = result.stdout.splitlines()
    assert lines[0] == "tank: 100.0 μH with 100.0 pF resonates at 1.592 MHz"
    assert lines[3].split() == ["frequency", "1.592", "MHz", "(computed:", "f", "=", "1/(2π√(LC)))"]
    assert lines[5].split()[:4] == ["characteristic", "impedance", "1.000", "kΩ"]


def test_power_and_q_give_the_tank_voltage_and_the_cautions():
    """5 W into Q 100 at X = 1000 Ω: V = √(5·100·1000) = 707.1 V RMS; licensing and RF-voltage cautions shown."""
    document = run_json("--inductance", "100uH", "--capacitance", "100pF", "--power", "5W", "--q", "100")
    result = document["result"]
    assert result["tank_voltage_rms_V"] == pytest.approx(math.sqrt(5 * 100 * 1000), rel=1e-12, abs=0)
    assert result["parallel_resistance_ohm"] == pytest.approx(100e3, rel=1e-12, abs=0)
    assert document["inputs"]["power_W"] == 5.0 and document["inputs"]["q"] == 100.0
    cautions = " ".join(document["cautions"])
    assert "licensing" in cautions and "707 V" in cautions
    text = run("--inductance", "100uH", "--capacitance", "100pF", "--power", "500mW", "--q", "100").stdout
    assert "cautions:" in text and "V = √(P·Q·X)" in text


def test_json_band_coverage():
    """530–1700 kHz with 10–365 pF and the assumed 15 pF stray: R = (1700/530)², Cs ≤ (365 − 10R)/(R − 1) pF,
    L = 1/((2π·530 kHz)²·380 pF) and the top edge 530·√(380/25) kHz."""
    document = run_json("--band", "530kHz:1700kHz", "--capacitor", "10pF:365pF")
    result = document["result"]
    ratio = (1700 / 530) ** 2
    assert result["mode"] == "band" and result["covers_band"] is True
    assert result["required_ratio"] == pytest.approx(ratio, rel=1e-14, abs=0)
    assert result["max_stray_F"] == pytest.approx((365 - 10 * ratio) / (ratio - 1) * 1e-12, rel=1e-12, abs=0)
    assert result["stray_F"] == pytest.approx(15e-12) and result["stray_assumed"] is True
    assert result["inductance_H"] == pytest.approx(1 / ((2 * math.pi * 530e3) ** 2 * 380e-12), rel=1e-12, abs=0)
    assert result["covered_low_Hz"] == pytest.approx(530e3, rel=1e-12, abs=0)
    assert result["covered_high_Hz"] == pytest.approx(530e3 * math.sqrt(380 / 25), rel=1e-12, abs=0)
    assert document["inputs"]["band"] == {"low_Hz": 530e3, "high_Hz": 1700e3}
    assert document["inputs"]["capacitor"] == {"min_F": 10e-12, "max_F": 365e-12}
    assert any("assumed" in note for note in result["assumptions"])


def test_band_not_covered_exits_1_with_the_report():
    """10–250 pF and 20 pF stray swing 9:1 < R: the report shows the band covered (to 530·3 kHz) and the trade-off,
    and the run ends with exit status 1 and one line saying it cannot be done."""
    result = run("--band", "530kHz:1700kHz", "--capacitor", "10pF:250pF", "--stray", "20pF")
    line = one_line_error_with_report(result)
    assert "cannot be done" in line and "1.590 MHz" in line
    assert result.stdout.splitlines()[0] == ("band 530.0 kHz to 1.700 MHz with a 10.00 pF to 250.0 pF capacitor: "
                                             "NOT covered")
    assert "trade-off:" in result.stdout and "15.84 pF" in result.stdout
    document = run_json("--band", "530kHz:1700kHz", "--capacitor", "10pF:250pF", "--stray", "20pF", code=1)
    assert document["result"]["covers_band"] is False
    assert document["result"]["covered_high_Hz"] == pytest.approx(1590e3, rel=1e-12, abs=0)


def one_line_error_with_report(result):
    """Exit 1, a report on stdout, and one error line on stderr without a traceback."""
    assert result.exit_code == 1, result.stdout + result.stderr
    assert result.stdout.strip() and "Traceback" not in result.stdout + result.stderr
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1 and lines[0].startswith("coilplan: error: ")
    return lines[0]


def test_band_with_a_padder():
    """A 500 pF padder in series with 20–500 pF makes the top of the travel 250 pF; with 10 pF stray, L puts
    530 kHz at 260 pF (series C1C2/(C1 + C2), by hand). The swing, (260 pF)/(20·500/520 + 10 pF) = 8.89:1, is now
    short of the band's 10.29:1 (without the padder it would do): exit 1, and the advice blames the padder."""
    result = run_json("--band", "530kHz:1700kHz", "--capacitor", "20pF:500pF", "--stray", "10pF",
                      "--padder", "500pF", code=1)["result"]
    assert result["padder_F"] == pytest.approx(500e-12)
    assert result["total_max_F"] == pytest.approx(260e-12, rel=1e-13, abs=0)
    assert result["available_ratio"] == pytest.approx(260 / (20 * 500 / 520 + 10), rel=1e-13, abs=0)
    assert result["inductance_H"] == pytest.approx(1 / ((2 * math.pi * 530e3) ** 2 * 260e-12), rel=1e-12, abs=0)
    assert result["covers_band"] is False and any("padder narrows the swing" in note for note in result["advice"])
    # a larger padder (1 nF) with 5 pF stray spreads the band less and covers it: (1000·365/1365 + 5)/(1000·10/1010 + 5)
    wide = run_json("--band", "530kHz:1700kHz", "--capacitor", "10pF:365pF", "--stray", "5pF", "--padder", "1nF")
    expected = (1000 * 365 / 1365 + 5) / (1000 * 10 / 1010 + 5)
    assert wide["result"]["available_ratio"] == pytest.approx(expected, rel=1e-13, abs=0)
    assert expected > (1700 / 530) ** 2
    assert wide["result"]["covers_band"] is True


def test_band_covered_by_a_given_coil():
    """--inductance with --capacitor (no --band): the edges f(L, Cmax + Cs) and f(L, Cmin + Cs)."""
    result = run_json("--inductance", "240uH", "--capacitor", "10pF:365pF", "--stray", "0pF")["result"]
    assert result["covered_low_Hz"] == pytest.approx(1 / (2 * math.pi * math.sqrt(240e-6 * 365e-12)), rel=1e-12, abs=0)
    assert result["covered_high_Hz"] == pytest.approx(1 / (2 * math.pi * math.sqrt(240e-6 * 10e-12)), rel=1e-12, abs=0)
    assert result["covers_band"] is None


def test_json_resonance_fit():
    """Readings made from L = 200 µH and C0 = 12 pF at 100, 220 and 470 pF give L and C0 back, with residuals."""
    def reading(c_pf):
        return f"{c_pf}pF@{1 / (2 * math.pi * math.sqrt(200e-6 * (c_pf + 12) * 1e-12)):.12g}Hz"

    document = run_json("--resonance", reading(100), "--resonance", reading(220), "--resonance", reading(470),
                        "--tolerance", "0.2%")
    result = document["result"]
    assert result["mode"] == "resonance-fit"
    assert result["inductance_H"] == pytest.approx(200e-6, rel=1e-9, abs=0)
    assert result["stray_capacitance_F"] == pytest.approx(12e-12, rel=1e-7, abs=0)
    assert result["inductance_uncertainty_H"] > 0 and result["stray_capacitance_uncertainty_F"] > 0
    assert len(result["points"]) == 3 and all(abs(p["residual_relative"]) < 1e-9 for p in result["points"])
    assert document["inputs"]["tolerance"] == pytest.approx(0.002)
    assert document["warnings"] == []
    text = run("--resonance", reading(100), "--resonance", reading(470)).stdout.splitlines()
    assert text[0].startswith("from 2 resonances: L = 200.0 μH ± ")
    assert "C0 = 12.00 pF ± " in text[0]


def test_resonance_warnings_reach_the_json():
    """A negative C0 (readings made with C0 = −5 pF) is a warning in the document, not an error."""
    def reading(c_pf):
        return f"{c_pf}pF@{1 / (2 * math.pi * math.sqrt(100e-6 * (c_pf - 5) * 1e-12)):.12g}Hz"

    document = run_json("--resonance", reading(100), "--resonance", reading(330), "--tolerance", "0.1%")
    assert any("below zero" in text for text in document["warnings"])


@pytest.mark.parametrize(("args", "expected"), [
    pytest.param(("--resonance", "100pF@1.2MHz"),
                 "coilplan: error: --resonance: expected two resonances or more: one gives only L·(C + C0)",
                 id="single-resonance"),
    pytest.param(("--inductance", "100pF", "--capacitance", "100pF"), "--inductance", id="wrong-unit"),
    pytest.param(("--frequency", "1MHz"), "--inductance or --capacitance", id="only-one"),
    pytest.param(("--band", "530kHz", "--capacitor", "10pF:365pF"), "--band", id="band-one-end"),
    pytest.param(("--band", "530kHz:1700kHz"), "--band", id="band-without-capacitor"),
    pytest.param(("--capacitor", "10pF:365pF:400pF", "--band", "530kHz:1700kHz"), "--capacitor", id="bad-range"),
    pytest.param(("--resonance", "100pF", "--resonance", "200pF@1MHz"), "--resonance", id="no-at"),
    pytest.param(("--resonance", "100pF@1MHz", "--resonance", "200pF@0.7MHz", "--inductance", "1uH"),
                 "--inductance", id="fit-with-other-options"),
    pytest.param(("--inductance", "1uH", "--frequency", "1MHz", "--tolerance", "1%"), "--tolerance",
                 id="tolerance-without-resonance"),
    pytest.param(("--inductance", "1uH", "--frequency", "1MHz", "--stray", "5pF"), "--stray",
                 id="stray-without-capacitor"),
    pytest.param(("--inductance", "1uH", "--frequency", "1MHz", "--power", "5"), "--power", id="power-no-unit"),
    pytest.param(("--inductance", "1uH", "--frequency", "1MHz", "--q", "0"), "--q", id="q-zero"),
    pytest.param((), "nothing to do", id="nothing"),
])
def test_bad_input_is_one_line_exit_2(args, expected):
    """Unusable input: exit status 2 and one line on stderr naming the option, never a traceback."""
    line = one_line_error(run(*args), 2)
    assert expected in line


def test_tank_is_listed_in_the_group_help():
    """`coilplan --help` lists the tank command."""
    result = CliRunner().invoke(main, ["--help"])
    assert result.exit_code == 0 and any(line.split()[:1] == ["tank"] for line in result.stdout.splitlines())
