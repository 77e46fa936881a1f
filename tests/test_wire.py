"""Tests of coilplan.wire (gauges, copper, enamel build, parsing) and the core_data loader."""

from __future__ import annotations

import csv
import dataclasses
import io
import itertools
import json
import math
from pathlib import Path

import mpmath
import numpy as np
import pydantic
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from coilplan import _data
from coilplan.errors import DataFileError, InvalidInputError, OutsideValidityWarning
from coilplan.wire import (
    GRADES,
    Wire,
    awg_diameter,
    copper_resistance_per_metre,
    copper_resistivity,
    current_for_density,
    enamel_build,
    parse_awg_gauge,
    parse_current_density,
    parse_wire,
    swg_diameter,
    wire_table,
)

CORE_DATA = Path(__file__).resolve().parent.parent / "core_data"
INCH = 0.0254
mpmath.mp.dps = 40


def awg_mm_mpmath(gauge) -> mpmath.mpf:
    """ASTM B258 formula d = 0.127 mm * 92^((36 - n)/39), at 40 digits."""
    return mpmath.mpf("0.127") * mpmath.power(92, (36 - mpmath.mpf(gauge)) / 39)


def rho_mpmath(temperature_C) -> mpmath.mpf:
    """IEC 60028: rho = 1/58 ohm mm^2/m * (1 + 0.00393 (T - 20)), in ohm m, at 40 digits."""
    return (mpmath.mpf(1) / 58 * mpmath.mpf("1e-6")
            * (1 + mpmath.mpf("0.00393") * (mpmath.mpf(temperature_C) - 20)))


def csv_rows(name: str) -> list[dict[str, str]]:
    """The data rows of a core_data table, read with the csv module (not coilplan's loader)."""
    text = (CORE_DATA / name).read_text(encoding="utf-8")
    lines = [line for line in text.splitlines() if line.strip() and not line.startswith("#")]
    return list(csv.DictReader(io.StringIO("\n".join(lines))))


# --------------------------------------------------------------------------- AWG


@pytest.mark.parametrize("gauge", [10, 20, 24, 30, 36, 40])
def test_awg_matches_formula_recomputed_with_mpmath(gauge):
    """awg_diameter reproduces the ASTM B258 formula (docs/methods.md §7 (b) gauges) to 1e-13."""
    # Source: ASTM B258 formula, as given on https://cvrt.me/en/bb/viewtopic.php?f=1&t=1103
    expected_mm = float(awg_mm_mpmath(gauge))
    assert float(awg_diameter(gauge)) * 1e3 == pytest.approx(expected_mm, rel=1e-13, abs=0)


@pytest.mark.parametrize(("gauge", "published_mm"), [
    pytest.param(10, 2.588, id="AWG10"),
    pytest.param(20, 0.812, id="AWG20"),
    pytest.param(24, 0.511, id="AWG24"),
    pytest.param(30, 0.255, id="AWG30"),
])
def test_awg_matches_rounded_published_table(gauge, published_mm):
    """The formula agrees with a published AWG table rounded to 0.001 mm."""
    # Source: https://cms.ua/en/articles/awg-labeling-system-thickness-of-the-wires (3 decimals)
    assert float(awg_diameter(gauge)) * 1e3 == pytest.approx(published_mm, abs=0.0005)


def test_awg_36_and_0000_are_exact_by_definition():
    """36 AWG is 0.005 in and 0000 AWG 0.46 in: the two points that define the series."""
    # Source: ASTM B258 definition of the series (docs/methods.md §7).
    assert float(awg_diameter(36)) / INCH == pytest.approx(0.005, rel=1e-14, abs=0)
    assert float(awg_diameter(-3)) / INCH == pytest.approx(0.46, rel=1e-14, abs=0)
    assert float(awg_diameter("0000")) == float(awg_diameter("4/0")) == float(awg_diameter(-3))


@pytest.mark.parametrize(("text", "number"), [
    ("0", 0), ("00", -1), ("000", -2), ("0000", -3), ("1/0", 0), ("2/0", -1), ("4/0", -3),
    ("24", 24), ("24.5", 24.5), ("56", 56),
])
def test_parse_awg_gauge_aught_sizes(text, number):
    """Aught sizes count down from 0: 00 = -1, 0000 = 4/0 = -3 in the B258 formula."""
    # Source: ASTM B258 numbering (docs/methods.md §7: "0000" = -3 in the formula).
    assert parse_awg_gauge(text) == number


def test_awg_half_gauges_lie_between_neighbours():
    """A half gauge lies between its neighbours, at their geometric mean by the formula."""
    whole = np.arange(-3, 56)
    half = whole + 0.5
    d_whole, d_next, d_half = awg_diameter(whole), awg_diameter(whole + 1), awg_diameter(half)
    assert np.all((d_next < d_half) & (d_half < d_whole))
    np.testing.assert_allclose(d_half, np.sqrt(d_whole * d_next), rtol=1e-13)


def test_awg_monotonic_and_vectorised():
    """Thinner wire for every higher gauge; arrays in, arrays out, NaN stays NaN."""
    gauges = np.linspace(-3, 56, 500)
    diameters = awg_diameter(gauges)
    assert diameters.shape == gauges.shape
    assert np.all(np.diff(diameters) < 0)
    assert math.isnan(float(awg_diameter(float("nan"))))


@settings(max_examples=60, deadline=None)
@given(st.floats(min_value=-3, max_value=17))
def test_awg_39_gauges_span_ratio_92(gauge):
    """Any 39 gauges apart differ in diameter by exactly 92 (the B258 definition)."""
    # Source: ASTM B258 formula (docs/methods.md §7).
    ratio = float(awg_diameter(gauge)) / float(awg_diameter(gauge + 39))
    assert ratio == pytest.approx(92.0, rel=1e-12, abs=0)


def test_awg_six_gauges_about_halve_the_diameter():
    """Six gauges up about halves the diameter (92^(6/39) = 2.005)."""
    # Common practice, no source: "six gauges halve the diameter".
    assert float(awg_diameter(18) / awg_diameter(24)) == pytest.approx(2.0, rel=0.003, abs=0)


# --------------------------------------------------------------------------- copper


def test_copper_resistivity_at_20C():
    """rho20 = 1/58 ohm mm^2/m = 17.241 nohm m."""
    # Source: IEC 60028:1925 (https://tnlab.org/iec-60028-the-international-standard-of-
    # resistance-for-copper-1925/): 58 MS/m, 0.017241 ohm mm^2/m.
    assert float(copper_resistivity(20.0)) == pytest.approx(1 / 58e6, rel=1e-15, abs=0)
    assert float(copper_resistivity(20.0)) * 1e9 == pytest.approx(17.241, abs=0.0005)


@pytest.mark.parametrize("temperature", [-40.0, 0.0, 60.0, 100.0, 155.0])
def test_copper_resistivity_follows_iec_60028_line(temperature):
    """rho(T) = rho20 (1 + 0.00393 (T - 20)), recomputed with mpmath from the definition."""
    # Source: IEC 60028 (alpha20 = 0.00393/K referenced to 20 °C); docs/methods.md §7 gives
    # (b) rho(100 °C) = 22.662 nohm m from the same definition.
    expected = float(rho_mpmath(temperature))
    assert float(copper_resistivity(temperature)) == pytest.approx(expected, rel=1e-14, abs=0)


def test_copper_resistivity_100C_rounded_value():
    """rho(100 °C) rounds to 22.662 nohm m."""
    # Source: IEC 60028 definition; value (b) in docs/methods.md §7, here only as a rounding check.
    assert float(copper_resistivity(100.0)) * 1e9 == pytest.approx(22.662, abs=0.0005)


def test_copper_resistivity_warns_outside_linear_range():
    """The linear law is used outside -50..200 °C only with an OutsideValidityWarning."""
    with pytest.warns(OutsideValidityWarning):
        copper_resistivity(300.0)
    values = copper_resistivity(np.array([20.0, np.nan]))
    assert math.isnan(values[1])


@pytest.mark.parametrize("gauge", [20, 30])
def test_resistance_per_metre_awg(gauge):
    """R' = rho20 / (pi d^2/4) for AWG 20 and 30, recomputed with mpmath."""
    # Source: IEC 60028 (rho20) and ASTM B258 (d); docs/methods.md §7 (b) R' values.
    d = awg_mm_mpmath(gauge) * mpmath.mpf("1e-3")
    expected = float(rho_mpmath(20) / (mpmath.pi * d**2 / 4))
    wire = parse_wire(f"{gauge}awg")
    assert float(wire.resistance_per_metre()) == pytest.approx(expected, rel=1e-12, abs=0)
    assert float(copper_resistance_per_metre(float(awg_diameter(gauge)))) == pytest.approx(
        expected, rel=1e-12)


def test_resistance_rises_with_temperature_like_resistivity():
    """The ratio R(T)/R(20) is the IEC 60028 ratio 1 + 0.00393 (T - 20)."""
    wire = parse_wire("0.5mm")
    ratio = float(wire.resistance_per_metre(80.0) / wire.resistance_per_metre(20.0))
    assert ratio == pytest.approx(1 + 0.00393 * 60, rel=1e-14, abs=0)


# --------------------------------------------------------------------------- enamel

# docs/methods.md §7 (a): IS 13730-0-1 (the Indian adoption of IEC 60317-0-1) as transcribed at
# http://www.avanticables.com/avanti-conductor/diameter-swg.html (0.315, 0.508, 1.016 mm) and
# https://www.scribd.com/document/694885707/Quality-Chart-1 (0.100 mm).
PUBLISHED_BUILD = [
    # nominal mm, grade, minimum increase mm, maximum overall mm
    pytest.param(0.100, "1", 0.008, 0.117, id="0.100-g1"),
    pytest.param(0.100, "2", 0.016, 0.125, id="0.100-g2"),
    pytest.param(0.315, "1", 0.019, 0.349, id="0.315-g1"),
    pytest.param(0.315, "2", 0.035, 0.367, id="0.315-g2"),
    pytest.param(0.508, "1", 0.025, 0.554, id="0.508-g1"),
    pytest.param(0.508, "2", 0.047, 0.578, id="0.508-g2"),
    pytest.param(1.016, "1", 0.034, 1.080, id="1.016-g1"),
    pytest.param(1.016, "2", 0.065, 1.113, id="1.016-g2"),
    # grade 3, read for this module from the same two transcriptions
    pytest.param(0.100, "3", 0.023, 0.132, id="0.100-g3-scribd"),
    pytest.param(0.315, "3", 0.053, 0.384, id="0.315-g3-avanti"),
    pytest.param(1.016, "3", 0.098, 1.144, id="1.016-g3-avanti"),
]


@pytest.mark.parametrize(("nominal_mm", "grade", "increase_mm", "maximum_mm"), PUBLISHED_BUILD)
def test_enamel_build_reproduces_published_rows(nominal_mm, grade, increase_mm, maximum_mm):
    """At a tabulated row, the minimum increase and maximum overall diameter are the table's."""
    build = enamel_build(nominal_mm * 1e-3, grade)
    assert float(build.minimum_overall) * 1e3 == pytest.approx(nominal_mm + increase_mm,
                                                               rel=1e-12)
    assert float(build.maximum_overall) * 1e3 == pytest.approx(maximum_mm, rel=1e-12, abs=0)
    midpoint = 0.5 * (nominal_mm + increase_mm + maximum_mm)
    assert float(build.typical_overall) * 1e3 == pytest.approx(midpoint, rel=1e-12, abs=0)
    assert not bool(build.extrapolated)


def test_enamel_grade1_0100_second_source():
    """0.100 mm grade 1 runs from 0.108 to 0.117 mm overall."""
    # Source: https://enameled-wires.com/Technical-Documentation/341.html (quoting a maker's table).
    build = enamel_build(0.100e-3, 1)
    assert float(build.minimum_overall) * 1e3 == pytest.approx(0.108, abs=1e-9)
    assert float(build.maximum_overall) * 1e3 == pytest.approx(0.117, abs=1e-9)


def _enamel_column(grade: str, kind: str) -> list[tuple[float, float]]:
    """(nominal mm, overall mm) of one column of core_data/enamel_build.csv."""
    points = []
    for row in csv_rows("enamel_build.csv"):
        d = float(row["nominal_diameter_mm"])
        if kind == "min" and row[f"grade{grade}_min_increase_mm"]:
            points.append((d, d + float(row[f"grade{grade}_min_increase_mm"])))
        if kind == "max" and row[f"grade{grade}_max_overall_mm"]:
            points.append((d, float(row[f"grade{grade}_max_overall_mm"])))
    return sorted(points)


@pytest.mark.parametrize("grade", ["1", "2", "3"])
@pytest.mark.parametrize("kind", ["min", "max"])
def test_enamel_interpolation_lies_between_neighbouring_rows(grade, kind):
    """Between two rows of the table, the overall diameter lies between theirs."""
    points = _enamel_column(grade, kind)
    assert len(points) > 20
    for (d0, od0), (d1, od1) in itertools.pairwise(points):
        for fraction in (0.25, 0.5, 0.75):
            d = d0 * (d1 / d0) ** fraction
            build = enamel_build(d * 1e-3, grade)
            value = float(build.minimum_overall if kind == "min" else build.maximum_overall) * 1e3
            assert min(od0, od1) <= value + 1e-12 and value <= max(od0, od1) + 1e-12


def test_enamel_ordering_over_the_whole_range():
    """Overall > bare, min <= typical <= max, and grade 3 > grade 2 > grade 1, 10 µm to 13 mm."""
    d = np.geomspace(10e-6, 13e-3, 2000)
    builds = [enamel_build(d, grade) for grade in ("1", "2", "3")]
    for build in builds:
        assert np.all(build.minimum_overall > d)
        assert np.all(build.minimum_overall <= build.typical_overall)
        assert np.all(build.typical_overall <= build.maximum_overall)
        assert np.all(np.diff(build.typical_overall) > 0)
    for thinner, thicker in itertools.pairwise(builds):
        assert np.all(thicker.typical_overall > thinner.typical_overall)
        assert np.all(thicker.maximum_overall > thinner.maximum_overall)
        assert np.all(thicker.minimum_overall > thinner.minimum_overall)


def test_enamel_extrapolation_is_flagged_and_continuous():
    """Beyond the rows values are flagged; the power law joins the end row without a jump."""
    end = 2.946e-3  # last row of core_data/enamel_build.csv (SWG 11)
    on_row, beyond = enamel_build(end, "1"), enamel_build(end * 1.001, "1")
    assert not bool(on_row.extrapolated)
    assert not bool(enamel_build(0.116 * INCH, "1").extrapolated)  # 11 SWG, 2.9464 mm
    assert bool(enamel_build(5e-3, "1").extrapolated)
    assert bool(enamel_build(0.05e-3, "1").extrapolated)  # grade 1 minimum increase starts 0.067
    assert float(beyond.maximum_overall - end * 1.001) == pytest.approx(
        float(on_row.maximum_overall - end), rel=1e-3)


def test_enamel_rejects_other_grades():
    """enamel_build takes grades 1, 2, 3; anything else is an error on the grade."""
    for grade in ("bare", "4", "thick"):
        with pytest.raises(InvalidInputError) as caught:
            enamel_build(0.5e-3, grade)
        assert caught.value.option == "grade"


def test_enamel_nan_transparent():
    """A NaN or non-positive diameter gives NaN, not an exception or a warning."""
    build = enamel_build(np.array([np.nan, 0.0, 0.5e-3]), "2")
    assert np.isnan(build.typical_overall[:2]).all() and np.isfinite(build.typical_overall[2])


# --------------------------------------------------------------------------- SWG


@pytest.mark.parametrize(("gauge", "inches", "published_mm"), [
    pytest.param("7/0", 0.500, 12.700, id="7/0"),
    pytest.param("1/0", 0.324, 8.230, id="1/0"),
    pytest.param("14", 0.080, 2.032, id="14"),
    pytest.param("26", 0.018, 0.457, id="26"),
    pytest.param("30", 0.0124, 0.315, id="30"),
    pytest.param("40", 0.0048, 0.122, id="40"),
    pytest.param("50", 0.001, 0.025, id="50"),
])
def test_swg_rows_against_published_table(gauge, inches, published_mm):
    """SWG diameters match the published inch values exactly and the mm column to 0.0005 mm."""
    # Source: https://www.engineeringtoolbox.com/swg-standard-wire-gauge-d_1779.html (inches and
    # mm; 7/0 to 44 inches also http://www.calfinewire.com/wirech.htm). That page prints 1/0 as
    # 8.236 mm, a slip: 0.324 in is 8.2296 mm, printed 8.230 in the table of
    # https://gs66-vdclambda.ndc.nasa.gov/product/websites/AMI/mrao.cam.ac.uk/~rob/SI/siwire.htm
    assert swg_diameter(gauge) / INCH == pytest.approx(inches, rel=1e-12, abs=0)
    assert swg_diameter(gauge) * 1e3 == pytest.approx(published_mm, abs=0.0005)


def test_swg_table_complete_and_monotonic():
    """57 gauges, 7/0 to 50, each thinner than the one before."""
    names = [row["gauge"] for row in csv_rows("swg.csv")]
    assert names == [f"{k}/0" for k in range(7, 0, -1)] + [str(n) for n in range(1, 51)]
    diameters = [swg_diameter(name) for name in names]
    assert all(a > b for a, b in itertools.pairwise(diameters))


@pytest.mark.parametrize(("text", "name"), [("0", "1/0"), ("00", "2/0"), ("0000000", "7/0"),
                                            (26, "26")])
def test_swg_aught_spellings(text, name):
    """SWG 0 is 1/0, 00 is 2/0, seven zeros 7/0."""
    assert swg_diameter(text) == swg_diameter(name)


# --------------------------------------------------------------------------- metric


def test_metric_series_follows_iso3_preferred_numbers():
    """Each metric size is within 1.3 % of its R20 or R40 preferred number 10^(k/n)."""
    # Source: ISO 3 preferred numbers (from memory: the rounded values lie within 1.3 % of
    # the geometric series). Values read from http://www.transwire.co.za/engineering_data.html.
    rows = csv_rows("metric_wire.csv")
    values = [float(row["nominal_diameter_mm"]) for row in rows]
    assert values == sorted(values) and len(set(values)) == len(values)
    assert values[0] == 0.050 and values[-1] == 2.500
    for row, value in zip(rows, values, strict=True):
        steps = 20 if row["renard"] == "R20" else 40
        k = round(steps * math.log10(value))
        assert value == pytest.approx(10 ** (k / steps), rel=0.013, abs=0)
        if row["renard"] == "R40":
            assert k % 2 == 1  # an R40 intermediate is not also an R20 value


def test_metric_table_labels():
    """Metric rows are labelled by their nominal diameter."""
    labels = [wire.label for wire in wire_table("metric")]
    assert labels[:3] == ["0.050 mm", "0.056 mm", "0.063 mm"]
    assert "0.50 mm" in labels and "1.00 mm" in labels and labels[-1] == "2.50 mm"


# --------------------------------------------------------------------------- parse_wire


@pytest.mark.parametrize(("text", "label", "diameter"), [
    ("24awg", "24 AWG", float(awg_diameter(24))),
    ("24 AWG", "24 AWG", float(awg_diameter(24))),
    ("AWG24", "24 AWG", float(awg_diameter(24))),
    ("awg 24", "24 AWG", float(awg_diameter(24))),
    ("#24 awg", "24 AWG", float(awg_diameter(24))),
    ("0000awg", "4/0 AWG", 0.46 * INCH),
    ("4/0awg", "4/0 AWG", 0.46 * INCH),
    ("2/0 AWG", "2/0 AWG", float(awg_diameter(-1))),
    ("0awg", "1/0 AWG", float(awg_diameter(0))),
    ("24.5awg", "24.5 AWG", float(awg_diameter(24.5))),
    ("26swg", "26 SWG", 0.018 * INCH),
    ("SWG 26", "26 SWG", 0.018 * INCH),
    ("Swg26", "26 SWG", 0.018 * INCH),
    ("7/0swg", "7/0 SWG", 0.5 * INCH),
    ("0.5mm", "0.50 mm", 0.5e-3),
    ("0.5 mm", "0.50 mm", 0.5e-3),
    ("20mil", "0.508 mm", 0.508e-3),
    ("0.02in", "0.508 mm", 0.508e-3),
    ("500um", "0.50 mm", 0.5e-3),
])
def test_parse_wire_accepted_spellings(text, label, diameter):
    """Gauges and diameters in the spellings users type, case-blind."""
    wire = parse_wire(text)
    assert wire.label == label
    assert wire.diameter == pytest.approx(diameter, rel=1e-12, abs=0)
    assert wire.grade == "1"


@pytest.mark.parametrize(("text", "kwargs", "option"), [
    pytest.param("", {}, "wire", id="empty"),
    pytest.param("24", {}, "wire", id="plain-number"),
    pytest.param("awg", {}, "wire", id="series-without-gauge"),
    pytest.param("24 bwg", {}, "wire", id="unknown-series"),
    pytest.param("24agw", {}, "wire", id="misspelt-series"),
    pytest.param("60swg", {}, "wire", id="swg-beyond-data"),
    pytest.param("8/0swg", {}, "wire", id="swg-8/0"),
    pytest.param("26.5swg", {}, "wire", id="swg-half"),
    pytest.param("57awg", {}, "wire", id="awg-too-fine"),
    pytest.param("5/0awg", {}, "wire", id="awg-5/0"),
    pytest.param("24.3awg", {}, "wire", id="awg-not-half"),
    pytest.param("024awg", {}, "wire", id="awg-leading-zero"),
    pytest.param("1,5mm", {}, "wire", id="decimal-comma"),
    pytest.param("-0.5mm", {}, "wire", id="negative"),
    pytest.param("0mm", {}, "wire", id="zero"),
    pytest.param("0.5m", {}, "wire", id="metres-slip"),
    pytest.param("5um", {}, "wire", id="too-fine"),
    pytest.param("0.5 furlong", {}, "wire", id="unknown-unit"),
    pytest.param("copper", {}, "wire", id="word"),
    pytest.param("24awg", {"grade": "4"}, "grade", id="grade-4"),
    pytest.param("24awg", {"grade": "measured"}, "grade", id="grade-measured"),
    pytest.param("24awg", {"overall": 0.4e-3}, "overall", id="overall-below-bare"),
    pytest.param("24awg", {"overall": float("nan")}, "overall", id="overall-nan"),
    pytest.param("24", {"series": "bwg"}, "series", id="series-unknown"),
])
def test_parse_wire_malformed(text, kwargs, option):
    """Malformed wires raise InvalidInputError on the field that holds the mistake."""
    with pytest.raises(InvalidInputError) as caught:
        parse_wire(text, **kwargs)
    assert caught.value.option == option
    assert str(caught.value).startswith(f"{option}: expected ")


def test_parse_wire_messages_name_range_and_text():
    """An unknown gauge says what range the series has and shows the text as typed."""
    with pytest.raises(InvalidInputError) as caught:
        parse_wire("60 SWG")
    assert "from 7/0 to 50" in caught.value.expected and caught.value.got == "60 SWG"
    with pytest.raises(InvalidInputError) as caught:
        parse_wire("24agw")
    assert "did you mean awg" in caught.value.expected


def test_parse_wire_option_name_is_passed_through():
    """The caller's option name appears in the error."""
    with pytest.raises(InvalidInputError) as caught:
        parse_wire("nonsense", option="WIRE")
    assert caught.value.option == "WIRE"


def test_parse_wire_series_reads_plain_numbers():
    """With series=, a plain number is a gauge of that series, or mm for metric."""
    assert parse_wire("24", series="awg").label == "24 AWG"
    assert parse_wire("26", series="swg").label == "26 SWG"
    assert parse_wire("0.5", series="metric").diameter == pytest.approx(0.5e-3)


def test_parse_wire_grades():
    """Grade bare is the copper itself; grades 1-3 widen in turn; max bounds the typical."""
    bare = parse_wire("0.5mm", grade="bare")
    assert bare.overall_diameter == bare.diameter and bare.max_overall_diameter is None
    graded = [parse_wire("0.5mm", grade=g) for g in ("1", "2", "3")]
    assert graded[0].overall_diameter < graded[1].overall_diameter < graded[2].overall_diameter
    for wire in graded:
        assert wire.diameter < wire.overall_diameter < wire.max_overall_diameter
    assert parse_wire("0.5mm", grade=2) == graded[1]
    assert parse_wire("0.5mm", grade=" Bare ").grade == "bare"


def test_parse_wire_measured_overall():
    """A measured overall diameter overrides the grade's estimate."""
    wire = parse_wire("24awg", grade="2", overall=0.56e-3)
    assert wire.grade == "measured"
    assert wire.overall_diameter == 0.56e-3 and wire.max_overall_diameter is None
    assert wire.turns_per_metre == pytest.approx(1 / 0.56e-3)
    assert parse_wire("0.5mm", overall=0.5e-3).overall_diameter == 0.5e-3  # equal is allowed


@settings(max_examples=40, deadline=None)
@given(st.integers(min_value=-6, max_value=112))
def test_awg_label_round_trips(twice_gauge):
    """The label of a parsed AWG wire parses back to the same wire."""
    gauge = twice_gauge / 2
    if gauge < 1 and gauge != int(gauge):
        return  # half gauges start at 1
    text = f"{gauge:g}awg" if gauge >= 1 else f"{1 - int(gauge)}/0awg"
    wire = parse_wire(text)
    assert parse_wire(wire.label) == wire
    assert wire.diameter == pytest.approx(float(awg_diameter(gauge)), rel=1e-14, abs=0)


@pytest.mark.parametrize("series", ["swg", "metric"])
def test_table_labels_round_trip(series):
    """Every label in the SWG and metric listings parses back to the same bare diameter."""
    for wire in wire_table(series):
        assert parse_wire(wire.label).diameter == pytest.approx(wire.diameter, rel=1e-12, abs=0)


# --------------------------------------------------------------------------- the record


def test_wire_record_is_frozen_and_strict():
    """Wire is a frozen record that refuses unknown fields and an overall below the bare wire."""
    wire = parse_wire("24awg")
    with pytest.raises(dataclasses.FrozenInstanceError):
        wire.diameter = 1e-3
    with pytest.raises(TypeError):
        Wire(label="x", series="diameter", diameter=1e-3, overall_diameter=1e-3, grade="bare",
             colour="red")
    with pytest.raises(ValueError, match="overall_diameter"):
        Wire(label="x", series="diameter", diameter=1e-3, overall_diameter=0.9e-3, grade="bare")
    with pytest.raises(ValueError, match="grade"):
        Wire(label="x", series="diameter", diameter=1e-3, overall_diameter=1e-3, grade="4")
    with pytest.raises(ValueError, match="diameter"):
        Wire(label="x", series="diameter", diameter=float("nan"), overall_diameter=1e-3, grade="bare")


def test_wire_area_and_with_grade():
    """area is pi d^2/4; with_grade keeps the copper and changes the enamel."""
    wire = parse_wire("1mm")
    assert wire.area == pytest.approx(math.pi / 4 * 1e-6, rel=1e-15, abs=0)
    thick = wire.with_grade("3")
    assert thick.diameter == wire.diameter and thick.grade == "3"
    assert thick.overall_diameter > wire.overall_diameter
    assert set(GRADES) == {"1", "2", "3", "bare"}


def test_current_for_density():
    """I = J * pi d^2/4 with J in A/mm^2."""
    wire = parse_wire("1mm")
    assert float(current_for_density(wire, 3.0)) == pytest.approx(3 * math.pi / 4, rel=1e-14, abs=0)
    np.testing.assert_allclose(current_for_density(wire, [1.0, 2.0]),
                               [math.pi / 4, math.pi / 2], rtol=1e-14)
    for bad in (0.0, -1.0, float("nan")):
        with pytest.raises(InvalidInputError):
            current_for_density(wire, bad)


@pytest.mark.parametrize(("text", "value"), [("3", 3.0), ("2.5A/mm2", 2.5), ("4 A/mm²", 4.0),
                                             ("300A/cm2", 3.0), ("3e6 A/m2", 3.0)])
def test_parse_current_density(text, value):
    """Densities in A/mm² (or A/cm², A/m²) come back in A/mm²."""
    assert parse_current_density(text) == pytest.approx(value)


@pytest.mark.parametrize("text", ["", "0", "-3", "3,5", "3 A/mm3", "many", "300"])
def test_parse_current_density_refuses(text):
    """Zero, negative, decimal commas, wrong units and slips of unit are refused."""
    with pytest.raises(InvalidInputError) as caught:
        parse_current_density(text)
    assert caught.value.option == "density"


def test_wire_table_series():
    """AWG lists 4/0 to 44, SWG 7/0 to 50; an unknown series is an error on the series."""
    awg = wire_table("awg")
    assert [awg[0].label, awg[-1].label, len(awg)] == ["4/0 AWG", "44 AWG", 48]
    swg = wire_table("SWG", grade="2")
    assert len(swg) == 57 and all(wire.grade == "2" for wire in swg)
    assert wire_table("awg") == wire_table("awg") and wire_table("awg") is not wire_table("awg")
    with pytest.raises(InvalidInputError) as caught:
        wire_table("bwg")
    assert caught.value.option == "series"


# --------------------------------------------------------------------------- loader


class _Row(pydantic.BaseModel):
    model_config = pydantic.ConfigDict(extra="forbid")
    gauge: str
    diameter_in: float = pydantic.Field(gt=0)
    note: str | None = None
    source: str


@pytest.mark.parametrize(("text", "line", "column"), [
    pytest.param("# c\ngauge,diameter_in,source\n26,abc,x\n", 3, "diameter_in", id="not-a-number"),
    pytest.param("gauge,diameter_in,source\n\n# c\n26,-1,x\n", 4, "diameter_in", id="negative"),
    pytest.param("gauge,diameter_in,source\n26,0.018\n", 2, "(row)", id="short-row"),
    pytest.param("gauge,diameter_in,colour,source\n", 1, "colour", id="unknown-column"),
    pytest.param("# only\ngauge,diameter_in\n26,0.018\n", 2, "source", id="missing-column"),
    pytest.param("gauge,diameter_in,source\n26,0.018,\n", 2, "source", id="blank-required"),
    pytest.param("# nothing\n", 1, "(header)", id="no-header"),
])
def test_parse_table_bad_rows_name_file_line_column(text, line, column):
    """A bad row raises DataFileError with the file, 1-based line and column."""
    with pytest.raises(DataFileError) as caught:
        _data.parse_table(text, "demo.csv", _Row)
    assert (caught.value.file, caught.value.line, caught.value.column) == ("demo.csv", line,
                                                                           column)
    assert str(caught.value).startswith(f"demo.csv, line {line}, column {column}: ")


def test_parse_table_blank_optional_cell_is_none():
    """A blank cell of an optional column reads as None; quoted commas survive."""
    rows = _data.parse_table('gauge,diameter_in,note,source\n26,0.018,,"a, b"\n', "d.csv", _Row)
    assert rows[0].note is None and rows[0].source == "a, b"


def test_load_table_is_cached_and_missing_file_is_an_error():
    """A table is parsed once per process; a missing file raises DataFileError."""
    class Swg(pydantic.BaseModel):
        gauge: str
        diameter_in: float
        source: str

    assert _data.load_table("swg.csv", Swg) is _data.load_table("swg.csv", Swg)
    with pytest.raises(DataFileError):
        _data.read_data_text("no_such_table.csv")


@pytest.mark.parametrize(("name", "standard"), [("swg.csv", "Standard Wire Gauge"),
                                                ("enamel_build.csv", "IEC 60317-0-1"),
                                                ("metric_wire.csv", "IEC 60317-0-1")])
def test_data_files_name_their_source(name, standard):
    """Each table's header comment names its standard; every row has a source."""
    text = (CORE_DATA / name).read_text(encoding="utf-8")
    comments = [line for line in text.splitlines() if line.startswith("#")]
    assert any(standard in line for line in comments[:3])
    assert all(row["source"].strip() for row in csv_rows(name))


def test_json_safe_wire_values():
    """A Wire's fields dump to plain JSON (no numpy scalars leak out)."""
    dumped = json.dumps(dataclasses.asdict(parse_wire("4/0awg")))
    assert '"enamel_extrapolated": true' in dumped


def test_litz_strands_in_parallel():
    """40×0.1 mm litz: copper area 40·π·d²/4 and R' = ρ/area (IEC 60028 copper, strands in parallel)."""
    wire = parse_wire("40x0.1mm")
    assert wire.strands == 40 and wire.strand_diameter == pytest.approx(1e-4, rel=1e-15, abs=0)
    area = 40 * math.pi * (1e-4) ** 2 / 4
    assert wire.area == pytest.approx(area, rel=1e-12, abs=0)
    assert wire.resistance_per_metre() == pytest.approx(1 / 58e6 / area, rel=1e-12, abs=0)
    # the bundle is at least as wide as the strands' copper packed hexagonally (geometry)
    assert wire.diameter >= math.sqrt(4 * area / math.pi)
    assert parse_wire("40x38awg").label == "40×38 AWG litz"
    with pytest.raises(InvalidInputError):
        parse_wire("1x0.1mm")
