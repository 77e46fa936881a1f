"""Tests of the ``coilplan wire`` command through click's CliRunner."""

from __future__ import annotations

import json

import mpmath
import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main

mpmath.mp.dps = 30
INCH = 0.0254

ONE_WIRE_KEYS = {
    "label", "series", "grade", "diameter_m", "overall_diameter_m", "max_overall_diameter_m",
    "overall_diameter_by_grade_m", "max_overall_diameter_by_grade_m", "enamel_extrapolated",
    "area_m2", "turns_per_m", "resistance_ohm_per_m", "temperature_C",
    "resistance_at_temperature_ohm_per_m", "current_density_A_per_mm2", "current_A",
}


def run(*args: str):
    return CliRunner().invoke(main, ["wire", *args])


def awg_m(gauge: int) -> float:
    """ASTM B258: d = 0.127 mm * 92^((36 - n)/39), in metres."""
    return float(mpmath.mpf("0.127e-3") * mpmath.power(92, (36 - mpmath.mpf(gauge)) / 39))


def copper_ohm_per_m(diameter: float, temperature_C: float = 20.0) -> float:
    """IEC 60028: rho = 1/58 ohm mm^2/m * (1 + 0.00393 (T - 20)), over pi d^2/4."""
    rho = mpmath.mpf(1) / 58 * mpmath.mpf("1e-6") * (1 + mpmath.mpf("0.00393")
                                                      * (temperature_C - 20))
    return float(rho / (mpmath.pi * mpmath.mpf(diameter) ** 2 / 4))


def test_one_wire_json_fields():
    """`wire 24awg --json` gives the formula's diameter, IEC 60028 resistance and J*A current."""
    # Sources: ASTM B258 formula (diameter), IEC 60028 (resistivity); docs/methods.md §7.
    result = run("24awg", "--json")
    assert result.exit_code == 0, result.output
    document = flat_document(json.loads(result.stdout))
    assert list(document) == ["schema", "command", "inputs", "result", "warnings", "cautions"]
    assert document["command"] == "wire"
    wire = document["result"]
    assert set(wire) == ONE_WIRE_KEYS
    d = awg_m(24)
    assert wire["label"] == "24 AWG" and wire["grade"] == "1" and wire["series"] == "awg"
    assert wire["diameter_m"] == pytest.approx(d, rel=1e-12, abs=0)
    assert d < wire["overall_diameter_m"] < wire["max_overall_diameter_m"]
    assert wire["resistance_ohm_per_m"] == pytest.approx(copper_ohm_per_m(d), rel=1e-12, abs=0)
    assert wire["resistance_at_temperature_ohm_per_m"] == wire["resistance_ohm_per_m"]
    assert wire["current_A"] == pytest.approx(3.0 * float(mpmath.pi) / 4 * (d * 1e3) ** 2,
                                              rel=1e-12)
    assert wire["turns_per_m"] == pytest.approx(1 / wire["overall_diameter_m"], rel=1e-12, abs=0)
    grades = wire["overall_diameter_by_grade_m"]
    assert grades["1"] == wire["overall_diameter_m"] < grades["2"] < grades["3"]
    assert document["warnings"] == [] and document["cautions"] == []


def test_one_wire_json_temperature_grade_and_density():
    """--temperature, --grade and --density reach the result."""
    result = run("30awg", "--temperature", "100C", "--grade", "2", "--density", "2.5A/mm2",
                 "--json")
    assert result.exit_code == 0, result.output
    wire = flat_document(json.loads(result.stdout))["result"]
    d = awg_m(30)
    # Source: IEC 60028 definition, alpha20 = 0.00393/K.
    assert wire["resistance_at_temperature_ohm_per_m"] == pytest.approx(
        copper_ohm_per_m(d, 100.0), rel=1e-12)
    assert wire["grade"] == "2"
    assert wire["overall_diameter_m"] == wire["overall_diameter_by_grade_m"]["2"]
    assert wire["current_A"] == pytest.approx(2.5 * float(mpmath.pi) / 4 * (d * 1e3) ** 2)


def test_one_wire_measured_overall():
    """--overall replaces the grade's estimate by the measured diameter."""
    result = run("24awg", "--overall", "0.56mm", "--json")
    assert result.exit_code == 0, result.output
    wire = flat_document(json.loads(result.stdout))["result"]
    assert wire["grade"] == "measured"
    assert wire["overall_diameter_m"] == pytest.approx(0.56e-3)
    assert wire["max_overall_diameter_m"] is None


def test_one_wire_text():
    """The text view starts with the wire, its bare diameter in mm and inch, and its origin."""
    # 24 AWG = 0.510559 mm = 0.020101 in by the ASTM B258 formula (docs/methods.md §7 (b)).
    result = run("24awg", "--temperature", "60C")
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    assert lines[0] == "24 AWG: bare copper 0.5106 mm (0.02010 in), ASTM B258 formula"
    assert lines[1].split()[:5] == ["overall,", "grade", "1", "0.5461", "mm"]
    assert lines[1].endswith("(chosen)")
    assert any(line.split()[:2] == ["copper", "area"] and line.endswith("0.2047 mm²")
               for line in lines)
    assert any("at 60 °C" in line for line in lines)
    assert any("common practice, no source" in line for line in lines)
    assert "Traceback" not in result.output


def test_swg_listing_text():
    """`wire --series swg` lists 57 gauges under a title and a header row."""
    # Source: SWG table, https://www.engineeringtoolbox.com/swg-standard-wire-gauge-d_1779.html
    result = run("--series", "swg")
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    assert lines[0].startswith("SWG")
    assert lines[1].split()[:3] == ["wire", "copper", "mm"]
    rows = [line for line in lines if line.startswith("  ") and " SWG " in line]
    assert len(rows) == 57
    row_26 = next(line for line in rows if line.split()[:2] == ["26", "SWG"])
    assert row_26.split()[2] == "0.4572"  # 0.018 in
    assert any(line.startswith("warnings:") for line in lines)  # 7/0 SWG is extrapolated


def test_full_listing_json():
    """With no WIRE and --json, result.wires holds every AWG, SWG and metric row."""
    result = run("--json")
    assert result.exit_code == 0, result.output
    document = flat_document(json.loads(result.stdout))
    wires = document["result"]["wires"]
    assert len(wires) == 48 + 57 + 46
    assert all(set(item) == ONE_WIRE_KEYS for item in wires)
    assert [item["series"] for item in wires[:1] + wires[48:49] + wires[-1:]] == [
        "awg", "swg", "metric"]
    assert wires[0]["label"] == "4/0 AWG"
    assert wires[0]["diameter_m"] == pytest.approx(0.46 * INCH, rel=1e-12, abs=0)  # B258 definition
    assert document["warnings"]  # the thickest gauges lie beyond the enamel table


def test_high_density_cautions():
    """A high current density brings a caution about a hot winding."""
    result = run("20awg", "--density", "8", "--json")
    assert result.exit_code == 0, result.output
    assert any("hot" in text for text in flat_document(json.loads(result.stdout))["cautions"])


@pytest.mark.parametrize(("args", "option"), [
    pytest.param(["60swg"], "WIRE", id="swg-beyond-data"),
    pytest.param(["24"], "WIRE", id="plain-number"),
    pytest.param(["24 bwg"], "WIRE", id="unknown-series"),
    pytest.param(["24awg", "--grade", "4"], "--grade", id="grade"),
    pytest.param(["24awg", "--overall", "0.3mm"], "--overall", id="overall-below-bare"),
    pytest.param(["24awg", "--overall", "0.56"], "--overall", id="overall-without-unit"),
    pytest.param(["--overall", "0.56mm"], "--overall", id="overall-without-wire"),
    pytest.param(["24awg", "--density", "0"], "--density", id="density-zero"),
    pytest.param(["24awg", "--density", "3A/mm3"], "--density", id="density-unit"),
    pytest.param(["24awg", "--temperature", "70F"], "--temperature", id="temperature-unit"),
    pytest.param(["--series", "bwg"], "--series", id="series-unknown"),
    pytest.param(["24awg", "--series", "swg"], "--series", id="series-conflict"),
])
def test_bad_input_one_line_exit_2(args, option):
    """Bad input is one line on stderr naming the option, exit status 2, no traceback."""
    result = run(*args)
    assert result.exit_code == 2, result.output
    assert result.stdout == ""
    lines = result.stderr.splitlines()
    assert len(lines) == 1
    assert lines[0].startswith("coilplan: error: ") and option in lines[0]
    assert "Traceback" not in result.output


def test_hot_temperature_warns_and_cautions():
    """Beyond the linear copper law's range the JSON warns, and a hot winding is cautioned."""
    result = run("24awg", "--temperature", "300C", "--json")
    assert result.exit_code == 0, result.output
    document = flat_document(json.loads(result.stdout))
    assert any("IEC 60028" in text for text in document["warnings"])
    assert any("300 °C" in text for text in document["cautions"])
