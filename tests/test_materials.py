"""Tests of coilplan.materials: the core_data/materials.csv table, the Material record and look-ups."""

from __future__ import annotations

import csv
import io
import itertools
import math
import re
import warnings
from pathlib import Path

import numpy as np
import pydantic
import pytest
from hypothesis import given
from hypothesis import strategies as st

import coilplan.materials as materials_module
from coilplan import _data
from coilplan.errors import DataFileError, InvalidInputError, OutsideValidityWarning
from coilplan.materials import (
    Material,
    all_materials,
    find_materials,
    material,
    materials_for_permeability,
)

CORE_DATA = Path(__file__).resolve().parent.parent / "core_data"
TEXT = (CORE_DATA / "materials.csv").read_text(encoding="utf-8")


def csv_rows() -> list[dict[str, str]]:
    """The data rows of materials.csv, read with the csv module (not coilplan's loader)."""
    lines = [line for line in TEXT.splitlines() if line.strip() and not line.startswith("#")]
    return list(csv.DictReader(io.StringIO("\n".join(lines))))


ROWS = {row["name"]: row for row in csv_rows()}
NAMES = list(ROWS)


def by_family(family: str) -> list[Material]:
    return [core for core in all_materials() if core.family == family]


# --------------------------------------------------------------------------- the table


def test_every_row_loads_in_file_order_with_a_source():
    """Every CSV row becomes a Material, in file order, and each names its source."""
    cores = all_materials()
    assert [core.name for core in cores] == NAMES
    assert len(NAMES) == len(set(NAMES)) >= 9
    for core in cores:
        assert core.source.strip() and core.source == ROWS[core.name]["source"]
        # a row that cites no address must say where its values come from instead
        assert "http" in core.source or "from memory" in core.source or "definition" in core.source


def test_the_classes_the_issue_asks_for_are_present():
    """MnZn high-μ and power, NiZn about 125/250/800, two powdered irons and air are in the table."""
    for name in ("mnzn-high-mu", "mnzn-power", "nizn-125", "nizn-250", "nizn-800",
                 "iron-powder-rf", "iron-powder-power", "air"):
        assert name in NAMES


def test_no_maker_grade_names_in_the_table():
    """Rows describe classes by physics: no colour codes and no numbered grade names ("mix 2")."""
    lowered = TEXT.lower()
    for colour in ("red", "yellow", "green", "blue", "white", "black", "grey", "gray", "orange"):
        assert re.search(rf"\b{colour}\b", lowered) is None, colour
    assert re.search(r"\b(?:mix|material|type|grade)\s*#?-?\d", lowered) is None


@pytest.mark.parametrize("core", all_materials(), ids=lambda core: core.name)
def test_ranges_are_consistent(core: Material):
    """low <= typical <= high, Bsat(100 °C) <= Bsat(25 °C) < 3 T, f_low < f_high, Curie above 100 °C."""
    low, high = core.mu_range
    assert 1 <= low <= core.mu_initial <= high
    if core.family == "air":
        assert core.saturation_flux_density_25C is None and core.curie_temperature is None
        return
    assert 0 < core.saturation_flux_density_100C <= core.saturation_flux_density_25C < 3.0
    assert core.curie_temperature > 100
    assert core.frequency_range is not None
    assert 0 < core.frequency_range[0] < core.frequency_range[1]


@pytest.mark.parametrize("core", all_materials(), ids=lambda core: core.name)
def test_loader_converts_mT_to_tesla(core: Material):
    """The SI record holds the CSV's mT values divided by 1000, and its μ columns as given."""
    row = ROWS[core.name]
    assert core.mu_initial == float(row["mu_initial_typical"])
    assert core.mu_range == (float(row["mu_initial_low"]), float(row["mu_initial_high"]))
    if row["bsat_25C_mT"]:
        assert core.saturation_flux_density_25C == pytest.approx(float(row["bsat_25C_mT"]) / 1000)
        assert core.saturation_flux_density_100C == pytest.approx(float(row["bsat_100C_mT"]) / 1000)


HEADER = next(line for line in TEXT.splitlines() if line.startswith("name,"))
GOOD_ROW = ('demo,NiZn ferrite,"invented row",125,100,160,360,310,300,1e5,high,1e6,3e7,'
            '"none",invented for a test')


def test_a_good_row_parses():
    """The template row used below is valid, so each bad variant fails for its one change."""
    (row,) = _data.parse_table(f"# test\n{HEADER}\n{GOOD_ROW}\n", "test.csv",
                               materials_module._MaterialRow)
    assert row.name == "demo" and row.bsat_25C_mT == 360


@pytest.mark.parametrize(("change", "column"), [
    pytest.param(("125,100,160", "90,100,160"), "mu_initial_high", id="typical-below-low"),
    pytest.param(("125,100,160", "125,100,110"), "mu_initial_high", id="high-below-typical"),
    pytest.param(("360,310,300", "310,360,300"), "bsat_100C_mT", id="hot-above-cold"),
    pytest.param(("360,310,300", "360,,300"), "bsat_100C_mT", id="one-bsat-only"),
    pytest.param(("360,310,300", "360,310,80"), "curie_C", id="curie-below-100C"),
    pytest.param(("360,310,300", "360,310,hot"), "curie_C", id="curie-not-a-number"),
    pytest.param(("1e6,3e7", "3e7,1e6"), "frequency_high_Hz", id="frequencies-reversed"),
    pytest.param(("NiZn ferrite", "CoZn ferrite"), "family", id="unknown-family"),
    pytest.param(("1e5,high", "1e5,low"), "resistivity_class", id="class-disagrees"),
    pytest.param(("demo,", "Demo Core,"), "name", id="name-not-an-id"),
    pytest.param((",invented for a test", ","), "source", id="no-source"),
])
def test_malformed_row_names_file_line_and_column(change, column):
    """A bad row raises DataFileError naming the file, the 1-based line and the column."""
    old, new = change
    bad = GOOD_ROW.replace(old, new, 1)
    assert bad != GOOD_ROW
    text = f"# comment\n# comment\n{HEADER}\n{GOOD_ROW}\n{bad}\n"
    with pytest.raises(DataFileError) as caught:
        _data.parse_table(text, "materials.csv", materials_module._MaterialRow)
    assert (caught.value.file, caught.value.line, caught.value.column) == ("materials.csv", 5, column)
    assert str(caught.value).startswith(f"materials.csv, line 5, column {column}: ")


def test_material_is_frozen():
    """Material records cannot be changed in place (copy with model_copy instead)."""
    core = material("nizn-125")
    with pytest.raises(pydantic.ValidationError):
        core.mu_initial = 3.0
    assert core.model_copy(update={"mu_initial": 130.0}).mu_initial == 130.0


# --------------------------------------------------------------------------- physics sanity


def test_nizn_resistivity_far_above_mnzn():
    """Every NiZn class has at least 1000 times the resistivity of every MnZn class."""
    # Source: "NiZn ... higher (several orders of magnitude)" resistivity than MnZn,
    # https://www.txyrdz.com/news/industry-news/ferrite-core-selection-guide-mnzn-vs-nizn-core-types-applications.html;
    # MnZn ~0.1-10 ohm m, NiZn ~1e4-1e6 ohm m is common practice (from memory).
    highest_mnzn = max(core.resistivity for core in by_family("MnZn ferrite"))
    lowest_nizn = min(core.resistivity for core in by_family("NiZn ferrite"))
    assert lowest_nizn >= 1e3 * highest_mnzn
    assert all(0.05 <= core.resistivity <= 20 for core in by_family("MnZn ferrite"))
    assert all(core.resistivity_class == "low" for core in by_family("MnZn ferrite"))
    assert all(core.resistivity_class == "high" for core in by_family("NiZn ferrite"))


def test_mnzn_has_higher_permeability_and_saturation_than_nizn():
    """Every MnZn class exceeds every NiZn class in typical μi and in Bsat at 25 °C."""
    # Source: "MnZn ferrites exhibit higher permeability (µi) and saturation induction levels (Bs)"
    # than NiZn, https://studylib.net/doc/18367224/soft-ferrites-introduction
    mnzn, nizn = by_family("MnZn ferrite"), by_family("NiZn ferrite")
    assert min(c.mu_initial for c in mnzn) > max(c.mu_initial for c in nizn)
    assert min(c.saturation_flux_density_25C for c in mnzn) > max(c.saturation_flux_density_25C for c in nizn)


def test_ferrite_saturation_in_published_band():
    """MnZn saturates at 0.35-0.5 T at 25 °C, NiZn at 0.2-0.45 T; both lower at 100 °C."""
    # Sources: MnZn "400-500 mT",
    # https://www.txyrdz.com/news/industry-news/what-are-the-characteristics-of-mnzn-ferrites-key-properties-explained.html;
    # ferrites "Bs ≈ 0.3-0.5 T", https://www.txyrdz.com/news/industry-news/soft-magnetic-ferrites-material-types-core-specs-selection-guide.html;
    # the high-μ MnZn class sits just below 0.4 T and NiZn lower still (common practice, from memory).
    for core in by_family("MnZn ferrite"):
        assert 0.35 <= core.saturation_flux_density_25C <= 0.50
    for core in by_family("NiZn ferrite"):
        assert 0.20 <= core.saturation_flux_density_25C <= 0.45
    for core in by_family("MnZn ferrite") + by_family("NiZn ferrite"):
        assert core.saturation_flux_density_100C < core.saturation_flux_density_25C


def test_powder_cores_saturate_far_above_ferrite_but_below_their_bulk_metal():
    """Powder cores saturate at 0.9-1.5 T: over twice any ferrite, below bulk iron and bulk Fe-Si-Al."""
    # Sources: bulk Fe-Si-Al alloy saturates at about 1.1 T (from memory; a stored trade page agreed);
    # bulk iron at about 2.15 T (from memory); a powder core dilutes the metal with insulation and binder, so it must
    # saturate lower. Ferrite Bs is 1/3 to 1/5 of pure iron (common practice, no source).
    ferrite_max = max(core.saturation_flux_density_25C for core in all_materials()
                      if core.family.endswith("ferrite"))
    for core in by_family("powdered iron") + by_family("alloy powder"):
        assert 0.9 <= core.saturation_flux_density_25C <= 1.5
        assert core.saturation_flux_density_25C > 2 * ferrite_max
    assert material("fesial-powder").saturation_flux_density_25C <= 1.10
    assert all(core.saturation_flux_density_25C < 2.15 for core in by_family("powdered iron"))


def test_iron_powder_curie_point_is_that_of_iron():
    """Powdered iron keeps the Curie point of iron, 1043 K = 770 °C."""
    # Source: Curie temperature of iron 1043 K (from memory; any physics handbook).
    for core in by_family("powdered iron"):
        assert core.curie_temperature == pytest.approx(1043 - 273.15, abs=1)


def test_curie_points_follow_permeability_within_nizn():
    """Among NiZn ferrites the Curie point falls as initial permeability rises."""
    # Common practice, no source (more zinc raises μi and lowers the Curie point; Snelling 1988,
    # from memory).
    nizn = sorted(by_family("NiZn ferrite"), key=lambda core: core.mu_initial)
    curies = [core.curie_temperature for core in nizn]
    assert curies == sorted(curies, reverse=True)


def test_frequency_ranges_follow_the_trade():
    """NiZn of μ <= 250 reaches above 1 MHz; MnZn stops by a few MHz; low-μ NiZn reaches VHF."""
    # Source: NiZn "most suitable for frequencies over 1 MHz", MnZn "suitable up to 3 MHz",
    # https://studylib.net/doc/18367224/soft-ferrites-introduction
    for core in by_family("NiZn ferrite"):
        if core.mu_initial <= 250:
            assert core.frequency_range[1] > 1e6
    for core in by_family("MnZn ferrite"):
        assert core.frequency_range[1] <= 3e6
    assert material("nizn-40").frequency_range[1] >= 1e8
    # iron powders are used beyond 100 MHz: https://passive-components.eu/inductors-core-materials-and-their-losses
    assert material("iron-powder-rf").frequency_range[1] > 1e8


def test_air_has_permeability_one_and_never_saturates():
    """Air is μr = 1 exactly, and its saturation flux density is infinite at any temperature."""
    air = material("air")
    assert air.mu_initial == 1 and air.mu_range == (1, 1)
    assert math.isinf(air.saturation_flux_density(25.0))
    assert np.all(np.isinf(air.saturation_flux_density([0.0, 500.0])))


# --------------------------------------------------------------------------- saturation vs temperature


@pytest.mark.parametrize("name", [n for n in NAMES if n != "air"])
def test_saturation_reproduces_the_table_and_interpolates(name):
    """At 25 and 100 °C the table's values; halfway, their mean; below 25 °C the 25 °C value."""
    core, row = material(name), ROWS[name]
    cold, hot = float(row["bsat_25C_mT"]) / 1000, float(row["bsat_100C_mT"]) / 1000
    assert core.saturation_flux_density(25.0) == pytest.approx(cold, rel=1e-12, abs=0)
    assert core.saturation_flux_density(100.0) == pytest.approx(hot, rel=1e-12, abs=0)
    assert core.saturation_flux_density(62.5) == pytest.approx((cold + hot) / 2, rel=1e-12, abs=0)
    assert core.saturation_flux_density(0.0) == pytest.approx(cold, rel=1e-12, abs=0)


def test_saturation_hand_worked_above_100C():
    """High-μ MnZn at 110 °C follows the line from 0.23 T at 100 °C to 0 at its 130 °C Curie point."""
    core = material("mnzn-high-mu")
    # Hand-worked: extended 25-100 line gives 0.39 - 0.16 * 85/75 = 0.2087 T; the line to the
    # Curie point gives 0.23 * (130 - 110)/(130 - 100) = 0.1533 T; the lower one is taken.
    assert core.saturation_flux_density(110.0) == pytest.approx(0.23 * 20 / 30, rel=1e-12, abs=0)


@pytest.mark.parametrize("name", [n for n in NAMES if n != "air"])
def test_saturation_is_zero_at_and_above_curie(name):
    """At and above the Curie temperature the saturation flux density is zero."""
    core = material(name)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)
        flux = core.saturation_flux_density([core.curie_temperature, core.curie_temperature + 50])
    assert flux.tolist() == [0.0, 0.0]


def test_saturation_warns_outside_0_to_120C():
    """Temperatures outside 0 °C to 120 °C warn; the range ends themselves do not."""
    core = material("mnzn-power")
    for temperature in (-10.0, 121.0):
        with pytest.warns(OutsideValidityWarning, match="0 °C to 120 °C"):
            core.saturation_flux_density(temperature)
    core.saturation_flux_density([0.0, 120.0])  # filterwarnings=error: any warning fails here


def test_saturation_broadcasts_and_passes_nan():
    """An array in gives an array of the same shape out; NaN gives NaN."""
    core = material("nizn-125")
    out = core.saturation_flux_density(np.array([[25.0, 100.0], [np.nan, 50.0]]))
    assert out.shape == (2, 2) and math.isnan(out[1, 0])
    assert isinstance(core.saturation_flux_density(25.0), float)


@given(st.sampled_from([n for n in NAMES if n != "air"]),
       st.floats(min_value=0, max_value=120), st.floats(min_value=0, max_value=120))
def test_saturation_never_rises_with_temperature(name, first, second):
    """Bsat(T) is non-increasing and never negative over the trusted range."""
    core = material(name)
    cooler, warmer = sorted((first, second))
    assert core.saturation_flux_density(warmer) <= core.saturation_flux_density(cooler) + 1e-15
    assert core.saturation_flux_density(warmer) >= 0


# --------------------------------------------------------------------------- look-ups


@pytest.mark.parametrize("typed", ["nizn-125", "NiZn-125", " nizn_125 ", "NIZN 125"])
def test_material_lookup_is_case_and_separator_blind(typed):
    """Names are read case-blind, with '_' and spaces as '-'."""
    assert material(typed).name == "nizn-125"


def test_unknown_material_suggests_the_close_name():
    """An unknown name raises InvalidInputError on the material, suggesting the close one."""
    with pytest.raises(InvalidInputError) as caught:
        material("nizn-152")
    error = caught.value
    assert error.option == "material" and error.got == "nizn-152"
    assert "did you mean nizn-125?" in error.expected
    assert isinstance(error, ValueError)


def test_unknown_material_without_close_name_lists_all():
    """With nothing close, the message lists every class; the option can be renamed."""
    with pytest.raises(InvalidInputError) as caught:
        material("unobtainium", option="MATERIAL")
    assert caught.value.option == "MATERIAL"
    for name in NAMES:
        assert name in caught.value.expected


def test_find_materials():
    """find_materials matches name, family and description, case-blind."""
    assert [core.name for core in find_materials("NIZN")] == [n for n in NAMES if n.startswith("nizn")]
    assert [core.name for core in find_materials("powdered iron")] == ["iron-powder-rf",
                                                                       "iron-powder-power"]
    assert find_materials("no such thing") == []


def test_public_names_sorted():
    """The module's __all__ is sorted and every name exists."""
    assert materials_module.__all__ == sorted(materials_module.__all__)
    assert all(hasattr(materials_module, name) for name in materials_module.__all__)


# --------------------------------------------------------------------------- identification


def test_identify_nizn_125():
    """μr = 125 is identified as the NiZn ~125 class, inside its range, first."""
    matches = materials_for_permeability(125)
    assert matches[0].material.name == "nizn-125" and matches[0].inside
    assert matches[0].ratio_to_typical == pytest.approx(1.0)
    assert all(match.material.family != "MnZn ferrite" for match in matches)


def test_identify_5000_is_mnzn():
    """μr = 5000 fits only MnZn classes, the high-permeability one first."""
    matches = materials_for_permeability(5000)
    assert matches and all(match.material.family == "MnZn ferrite" for match in matches)
    assert matches[0].material.name == "mnzn-high-mu"


def test_overlapping_ranges_return_both_classes():
    """μr = 60 fits both powder classes: permeability alone cannot tell them apart."""
    inside = [match.material.name for match in materials_for_permeability(60) if match.inside]
    assert {"fesial-powder", "iron-powder-power"} <= set(inside)
    assert "cannot tell apart" in materials_for_permeability.__doc__


def test_zero_spread_keeps_only_classes_that_contain_the_value():
    """With spread 0 every match contains the measured value."""
    matches = materials_for_permeability(100, spread=0)
    assert [match.material.name for match in matches] == ["nizn-125", "fesial-powder"]
    assert all(match.inside for match in matches)
    assert materials_for_permeability(170, spread=0) == []


@given(st.floats(min_value=0.5, max_value=30000), st.floats(min_value=0, max_value=1))
def test_identification_agrees_with_a_direct_check_of_the_csv(mu_r, tolerance):
    """The set returned is exactly the rows whose widened range holds mu_r, contained ones first."""
    widen = 1 + tolerance
    expected = {name for name, row in ROWS.items()
                if float(row["mu_initial_low"]) / widen <= mu_r <= float(row["mu_initial_high"]) * widen}
    matches = materials_for_permeability(mu_r, tolerance)
    assert {match.material.name for match in matches} == expected
    keys = [(not match.inside, match.log_distance) for match in matches]
    assert keys == sorted(keys)
    for match in matches:
        low, high = match.material.mu_range
        assert match.inside == (low <= mu_r <= high)


@pytest.mark.parametrize("bad", [0, -5, math.nan, math.inf, "abc", None])
def test_bad_permeability_raises_on_mu(bad):
    """A permeability that is not a finite number above zero is refused on mu_r."""
    with pytest.raises(InvalidInputError) as caught:
        materials_for_permeability(bad)
    assert caught.value.option == "mu_r"


@pytest.mark.parametrize("bad", [-0.1, math.nan, math.inf, "wide"])
def test_bad_spread_raises_on_spread(bad):
    """A negative or non-finite spread is refused on the spread."""
    with pytest.raises(InvalidInputError) as caught:
        materials_for_permeability(100, spread=bad)
    assert caught.value.option == "spread"


def test_identification_leaves_no_gap_between_the_classes():
    """With the default 25 % widening every μr from 3.2 to 18000 fits at least one class."""
    # The README of core_data/ states this coverage; a table edit that opens a gap must fail here.
    for mu_r in np.geomspace(3.2, 18000, 600):
        assert materials_for_permeability(float(mu_r)), mu_r
    assert materials_for_permeability(2.0) == []  # between air and the lowest powdered iron


# --------------------------------------------------------------------------- dispersion.csv

DISPERSION_TEXT = (CORE_DATA / "dispersion.csv").read_text(encoding="utf-8")


def dispersion_rows() -> dict[str, dict[str, str]]:
    """The data rows of dispersion.csv, read with the csv module (not coilplan's loader)."""
    lines = [line for line in DISPERSION_TEXT.splitlines() if line.strip() and not line.startswith("#")]
    return {row["name"]: row for row in csv.DictReader(io.StringIO("\n".join(lines)))}


DISPERSION_ROWS = dispersion_rows()


def test_every_magnetic_class_has_one_dispersion_row_with_a_source():
    """dispersion.csv has one row per class of materials.csv except air, each naming its source or 'from memory'."""
    assert sorted(DISPERSION_ROWS) == sorted(n for n in NAMES if n != "air")
    assert DISPERSION_TEXT.count("\nair,") == 0
    for name, row in DISPERSION_ROWS.items():
        assert row["source"].strip(), name
        assert "from memory" in row["source"] or "http" in row["source"], name
        assert row["basis"] in ("snoek", "typical")
        loaded = materials_module.material_dispersion(name)
        assert loaded.relaxation_frequency == float(row["relaxation_frequency_Hz"])
        assert loaded.mu_initial == material(name).mu_initial


def test_no_maker_grade_names_in_the_dispersion_table():
    """The dispersion rows describe classes, not a maker's grades ("mix 2", numbered materials)."""
    assert re.search(r"\b(?:mix|material|type|grade)\s*#?-?\d", DISPERSION_TEXT.lower()) is None


def _two_figures(value: float) -> float:
    return float(f"{value:.1e}")


@pytest.mark.parametrize("name", [n for n, row in DISPERSION_ROWS.items() if row["basis"] == "snoek"])
def test_snoek_rows_follow_from_the_class_permeability_and_saturation(name):
    """A 'snoek' row's f_r is Snoek's law (Snoek 1948) with the class's µi and Bs(25 °C), to its 2 figures."""
    from coilplan.physics.dispersion import snoek_relaxation_frequency

    core = material(name)
    exact = float(snoek_relaxation_frequency(core.mu_initial, core.saturation_flux_density_25C))
    assert float(DISPERSION_ROWS[name]["relaxation_frequency_Hz"]) == _two_figures(exact)


def test_nizn_snoek_product_is_constant_within_the_saturation_spread():
    """Across the NiZn classes (µi − 1)·f_r varies only as Bs does, and higher µi has lower f_r (Snoek's law)."""
    nizn = sorted(by_family("NiZn ferrite"), key=lambda core: core.mu_initial)
    relax = [materials_module.material_dispersion(core.name).relaxation_frequency for core in nizn]
    assert all(high < low for low, high in itertools.pairwise(relax))
    products = [(core.mu_initial - 1) * f_r for core, f_r in zip(nizn, relax, strict=True)]
    saturations = [core.saturation_flux_density_25C for core in nizn]
    # the products spread no more than the saturations do, plus 5 % for the rounding to 2 figures
    assert max(products) / min(products) <= max(saturations) / min(saturations) * 1.05
    # and each lies within 5 % of the Snoek constant times its own saturation: 2/3 · 28.025 GHz/T
    for product, bsat in zip(products, saturations, strict=True):
        assert product / bsat == pytest.approx(2 / 3 * 28.0249514e9, rel=0.05)


@pytest.mark.parametrize("name", list(DISPERSION_ROWS))
def test_relaxation_lies_above_the_useful_range(name):
    """An inductor material is used well below its relaxation (common practice, no source): f_r ≥ f_high for
    the classes meant for tuned circuits, and f_r ≥ f_high/2 for broadband and power classes, which run into it."""
    core = material(name)
    f_r = materials_module.material_dispersion(name).relaxation_frequency
    top = core.frequency_range[1]
    if "tuned circuits" in core.description:
        assert f_r >= top
    else:
        assert f_r >= top / 2


@pytest.mark.parametrize("name", list(DISPERSION_ROWS))
def test_loss_factor_is_reproduced_at_its_frequency(name):
    """Each row's tanδ/µi exceeds the relaxation's own loss at its frequency, so the model returns it there."""
    dispersion = materials_module.material_dispersion(name)
    mu = dispersion.permeability(dispersion.loss_factor_frequency)
    assert -mu.imag / mu.real / dispersion.mu_initial == pytest.approx(dispersion.loss_factor, rel=1e-9)
    assert mu.real <= dispersion.mu_initial


def test_air_has_no_dispersion_and_unknown_names_fail():
    """Air gives None (no core loss); an unknown class raises InvalidInputError naming the material."""
    assert materials_module.material_dispersion("air") is None
    with pytest.raises(InvalidInputError) as caught:
        materials_module.material_dispersion("nizn-152")
    assert caught.value.option == "material"


@pytest.mark.parametrize(("change", "column"), [
    (("snoek", "guess"), "basis"),
    ((",3e-5,", ",-3e-5,"), "loss_factor"),
    ((",5.4e7,", ",0,"), "relaxation_frequency_Hz"),
])
def test_malformed_dispersion_row_names_file_line_and_column(change, column):
    """A bad cell raises DataFileError naming dispersion.csv, the line and the column."""
    lines = DISPERSION_TEXT.splitlines()
    index = next(i for i, text in enumerate(lines) if text.startswith("nizn-125,"))
    lines[index] = lines[index].replace(*change, 1)
    bad = "\n".join(lines)
    assert bad != DISPERSION_TEXT.rstrip("\n")
    with pytest.raises(DataFileError) as caught:
        _data.parse_table(bad, "dispersion.csv", materials_module._DispersionRow)
    line = next(n for n, text in enumerate(bad.splitlines(), start=1) if text.startswith("nizn-125"))
    assert (caught.value.file, caught.value.line, caught.value.column) == ("dispersion.csv", line, column)


def _dispersion_error(monkeypatch, row) -> DataFileError:
    """The DataFileError that loading dispersion.csv raises when it holds only ``row``."""
    real_load = materials_module.load_table
    monkeypatch.setattr(materials_module, "load_table",
                        lambda file, model: (row,) if file == "dispersion.csv" else real_load(file, model))
    materials_module._dispersions.cache_clear()
    try:
        with pytest.raises(DataFileError) as caught:
            materials_module.material_dispersion("nizn-125")
        return caught.value
    finally:
        monkeypatch.undo()
        materials_module._dispersions.cache_clear()


def test_dispersion_row_for_an_unknown_class_is_a_data_error(monkeypatch):
    """A dispersion row naming a class missing from materials.csv raises DataFileError on the name column."""
    error = _dispersion_error(monkeypatch, materials_module._DispersionRow(
        "nizn-999", 1e7, "typical", 1e-5, 1e5, 1e-4, 1e7, "invented for the test"))
    assert error.column == "name" and "nizn-999" in str(error)


def test_dispersion_high_point_below_the_first_is_a_data_error(monkeypatch):
    """A loss factor at the top of the range below the low-frequency one (a falling loss line) is refused."""
    error = _dispersion_error(monkeypatch, materials_module._DispersionRow(
        "nizn-125", 5.4e7, "snoek", 3e-5, 1e5, 1e-5, 3e7, "invented for the test"))
    assert error.column == "loss_factor_high"


def test_every_class_loss_line_rises_to_its_usual_range_top():
    """Each class's second loss point sits at the top of its usual range (materials.csv) — the data's own rule."""
    for core in materials_module.all_materials():
        if core.family == "air":
            continue
        spread = materials_module.material_dispersion(core.name)
        assert spread.loss_factor_high_frequency == core.frequency_range[1]
        assert spread.loss_factor_high > spread.loss_factor
