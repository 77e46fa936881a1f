"""Tests of the ``coilplan materials`` command through click's CliRunner."""

from __future__ import annotations

import csv
import io
import json
from pathlib import Path

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main

CORE_DATA = Path(__file__).resolve().parents[2] / "core_data"

MATERIAL_KEYS = {
    "name", "family", "description", "mu_initial", "mu_low", "mu_high",
    "saturation_flux_density_T", "saturation_flux_density_100C_T", "curie_C",
    "frequency_low_Hz", "frequency_high_Hz", "resistivity_ohm_m", "resistivity_class",
    "loss_note", "source", "relaxation_frequency_Hz", "loss_factor",
}


def run(*args: str):
    return CliRunner().invoke(main, ["materials", *args])


def csv_rows() -> dict[str, dict[str, str]]:
    """materials.csv read with the csv module, by name (independent of coilplan's loader)."""
    text = (CORE_DATA / "materials.csv").read_text(encoding="utf-8")
    lines = [line for line in text.splitlines() if line.strip() and not line.startswith("#")]
    return {row["name"]: row for row in csv.DictReader(io.StringIO("\n".join(lines)))}


ROWS = csv_rows()


def test_listing_text():
    """With no argument: a title, a header line and one aligned line per class, then notes."""
    result = run()
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    assert lines[0] == "Generic core material classes (typical values):"
    assert lines[1].split()[:3] == ["class", "family", "μi"]
    table = lines[2:2 + len(ROWS)]
    assert [line.split()[0] for line in table] == list(ROWS)
    # aligned: the family column starts at the same place on every line
    column = lines[1].index("family")
    for line in table:
        assert line[column:].startswith(ROWS[line.split()[0]]["family"]), line
    assert lines[2 + len(ROWS)] == "notes:"
    assert "cautions:" not in result.stdout


def test_listing_json_matches_the_csv():
    """--json lists every class with the documented keys, SI values converted from the CSV."""
    result = run("--json")
    assert result.exit_code == 0, result.output
    document = flat_document(json.loads(result.stdout))
    assert list(document) == ["schema", "command", "inputs", "result", "warnings", "cautions"]
    assert document["command"] == "materials"
    assert document["inputs"] == {"material": None, "mu": None, "spread": None}
    items = document["result"]["materials"]
    assert [item["name"] for item in items] == list(ROWS)
    for item in items:
        assert set(item) == MATERIAL_KEYS
        row = ROWS[item["name"]]
        assert item["mu_initial"] == float(row["mu_initial_typical"])
        assert (item["mu_low"], item["mu_high"]) == (float(row["mu_initial_low"]),
                                                     float(row["mu_initial_high"]))
        if row["bsat_25C_mT"]:
            assert item["saturation_flux_density_T"] == pytest.approx(float(row["bsat_25C_mT"]) / 1e3)
            assert item["saturation_flux_density_100C_T"] == pytest.approx(
                float(row["bsat_100C_mT"]) / 1e3)
        else:
            assert item["saturation_flux_density_T"] is None
        assert item["source"] == row["source"] and item["source"]
    assert document["cautions"] == [] and document["warnings"] == []


def test_one_material_text():
    """`materials nizn-125` shows that class with its permeability spread and source."""
    result = run("nizn-125")
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    assert lines[0] == f"nizn-125: {ROWS['nizn-125']['description']}"
    assert "  initial permeability  125 typical (100 to 160)" in lines
    assert "  saturation            360 mT at 25 °C, 310 mT at 100 °C" in lines
    assert "  used as an inductor   1 MHz to 30 MHz" in lines
    assert any(line.startswith("  source") and "http" in line for line in lines)


def test_one_material_json_and_salvage_caution():
    """A class common in mains gear carries the charged-capacitor caution; NiZn-125 does not."""
    power = json.loads(run("iron-powder-power", "--json").stdout)
    assert [item["name"] for item in power["result"]["materials"]] == ["iron-powder-power"]
    assert len(power["cautions"]) == 1 and "capacitors" in power["cautions"][0]
    assert json.loads(run("NiZn-125", "--json").stdout)["cautions"] == []


def test_identify_by_permeability_json():
    """--mu 130 ranks the NiZn-125 class first, inside its range, with the salvage caution."""
    result = run("--mu", "130", "--json")
    assert result.exit_code == 0, result.output
    document = flat_document(json.loads(result.stdout))
    assert document["inputs"] == {"material": None, "mu": 130.0, "spread": 0.25}
    found = document["result"]["materials"]
    assert found[0]["name"] == "nizn-125" and found[0]["inside_range"] is True
    assert found[0]["ratio_to_typical"] == pytest.approx(130 / 125)
    assert set(found[0]) == MATERIAL_KEYS | {"inside_range", "ratio_to_typical"}
    assert document["result"]["mu_measured"] == 130.0
    assert any("discharge" in caution for caution in document["cautions"])


def test_identify_5000_text_lists_only_mnzn():
    """--mu 5000 lists MnZn classes only, and the text says permeability alone is not enough."""
    result = run("--mu", "5000")
    assert result.exit_code == 0, result.output
    lines = result.stdout.splitlines()
    assert lines[0].startswith("Classes consistent with a relative permeability of 5000")
    table = [line for line in lines[2:] if line.startswith("  ") and not line.startswith("  -")]
    assert table and all("MnZn ferrite" in line for line in table)
    assert table[0].split()[0] == "mnzn-high-mu"
    assert "cannot tell apart" in result.stdout and "cautions:" in result.stdout


def test_identify_with_tolerance_percent():
    """--tolerance takes a percentage; 0% keeps only classes that contain the value."""
    wide = json.loads(run("--mu", "60", "--json").stdout)["result"]["materials"]
    narrow = json.loads(run("--mu", "60", "--spread", "0%", "--json").stdout)["result"]["materials"]
    assert "nizn-40" in [item["name"] for item in wide]
    assert all(item["inside_range"] for item in narrow)
    assert [item["name"] for item in narrow] == ["fesial-powder", "iron-powder-power"]


def test_no_class_fits():
    """A permeability no class fits gives an empty list, exit 0, and says so in text."""
    result = run("--mu", "90000")
    assert result.exit_code == 0
    assert "  none: check the measurement" in result.stdout
    assert json.loads(run("--mu", "90000", "--json").stdout)["result"]["materials"] == []


@pytest.mark.parametrize(("args", "start"), [
    pytest.param(("nizn-152",), "coilplan: error: MATERIAL: expected a material class such as nizn-125 "
                 "(did you mean nizn-125?)", id="unknown-name"),
    pytest.param(("--mu", "abc"), "coilplan: error: --mu: expected a relative permeability above zero",
                 id="mu-not-a-number"),
    pytest.param(("--mu", "0"), "coilplan: error: --mu: expected a relative permeability above zero",
                 id="mu-zero"),
    pytest.param(("--mu", "nan"), "coilplan: error: --mu: expected a relative permeability above zero",
                 id="mu-nan"),
    pytest.param(("--mu", "130", "--spread", "wide"), "coilplan: error: --spread: expected a fraction",
                 id="bad-spread"),
    pytest.param(("nizn-125", "--mu", "130"), "coilplan: error: --mu: expected either MATERIAL or --mu",
                 id="both"),
])
def test_bad_input_is_one_line_exit_2(args, start):
    """Bad input is one line on stderr naming the option, exit status 2, no traceback."""
    result = run(*args)
    assert result.exit_code == 2
    lines = result.stderr.splitlines()
    assert len(lines) == 1 and lines[0].startswith(start), lines
    assert result.stdout == ""
    assert "Traceback" not in result.output


def test_listed_in_top_level_help():
    """The group's help lists the materials command."""
    result = CliRunner().invoke(main, ["--help"])
    assert result.exit_code == 0
    assert any(line.split()[:1] == ["materials"] for line in result.stdout.splitlines())


def test_one_class_shows_its_loss_factors_as_the_csv_gives_them():
    """The detail and the JSON carry dispersion.csv's two loss-factor points and the relaxation frequency."""
    rows = next(line.split(",") for line in (Path(__file__).parents[2] / "core_data" / "dispersion.csv").read_text(
        encoding="utf-8").splitlines() if line.startswith("nizn-250,"))
    output = CliRunner().invoke(main, ["materials", "nizn-250", "--json"]).stdout
    document = json.loads(output)["result"]["materials"][0]
    assert document["relaxation_frequency_Hz"] == float(rows[1])
    assert [point["loss_factor"] for point in document["loss_factor"]] == [float(rows[3]), float(rows[5])]
    assert [point["frequency_Hz"] for point in document["loss_factor"]] == [float(rows[4]), float(rows[6])]
