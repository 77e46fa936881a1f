"""``coilplan wire``: wire gauges with their bare and enamelled diameters, resistance, current.

Thin: it parses, asks :mod:`coilplan.wire` and renders. With no WIRE it lists
the gauges of one series or of all three; with a WIRE it shows that one.
"""

from __future__ import annotations

import warnings

import click

from coilplan.cautions import hot_winding_cautions
from coilplan.cli._types import QuantityType, TemperatureType
from coilplan.errors import InvalidInputError
from coilplan.quantities import format_length, format_quantity
from coilplan.report import aligned_rows, bullet_lines, json_document
from coilplan.wire import (
    GRADES,
    Wire,
    current_for_density,
    parse_current_density,
    parse_wire,
    wire_table,
)

__all__ = ["wire"]

# A/mm²: a figure in common use for small, air-cooled coils (common practice, no source).
_DEFAULT_DENSITY = 3.0

_SERIES_TITLES = {
    "awg": "AWG, bare diameters by the ASTM B258 formula",
    "swg": "SWG, bare diameters from the Imperial Standard Wire Gauge table",
    "metric": "Metric, IEC 60317-0-1 preferred nominal diameters",
}
_ORIGIN = {
    "awg": "ASTM B258 formula",
    "swg": "Imperial Standard Wire Gauge",
    "metric": "IEC 60317-0-1 preferred diameter",
    "diameter": "diameter as given",
}
_ENAMEL_NOTE = ("typical overall diameter: midway between the minimum and the maximum of "
                "IEC 60317-0-1, interpolated from a partial table of that standard")
_EXTRAPOLATED_MARK = "*"


class _DensityType(click.ParamType):
    """A current density in A/mm² (``3``, ``3A/mm2``, ``300A/cm2``)."""

    name = "density"

    def convert(self, value, param, ctx):
        if isinstance(value, float):
            return value
        try:
            return parse_current_density(value)
        except InvalidInputError as error:
            self.fail(f"expected {error.expected}; got {value!r}", param, ctx)


def _density_note(density: float) -> str:
    text = f"{density:g} A/mm²"
    if density == _DEFAULT_DENSITY:
        return (f"current at {text}, a figure in common use for small coils (common practice, "
                "no source); set another with --density")
    return f"current at {text}, as set by --density"


def _wire_result(wire: Wire, temperature: float, density: float) -> dict:
    by_grade = {grade: wire.with_grade(grade) for grade in ("1", "2", "3")}
    return {
        "label": wire.label,
        "series": wire.series,
        "grade": wire.grade,
        "diameter_m": wire.diameter,
        "overall_diameter_m": wire.overall_diameter,
        "max_overall_diameter_m": wire.max_overall_diameter,
        "overall_diameter_by_grade_m": {g: w.overall_diameter for g, w in by_grade.items()},
        "max_overall_diameter_by_grade_m": {g: w.max_overall_diameter
                                            for g, w in by_grade.items()},
        "enamel_extrapolated": any(w.enamel_extrapolated for w in by_grade.values()),
        "area_m2": wire.area,
        "turns_per_m": wire.turns_per_metre,
        "resistance_ohm_per_m": float(wire.resistance_per_metre(20.0)),
        "temperature_C": temperature,
        "resistance_at_temperature_ohm_per_m": float(wire.resistance_per_metre(temperature)),
        "current_density_A_per_mm2": density,
        "current_A": float(current_for_density(wire, density)),
    }


def _cautions(temperature: float, density: float) -> list[str]:
    return hot_winding_cautions(current_density=density, temperature_C=temperature)


def _mm(value: float | None) -> str:
    return "n/a" if value is None else format_length(value).removesuffix(" mm")


def _one_wire_lines(wire: Wire, result: dict, temperature: float, density: float) -> list[str]:
    inches = wire.diameter / 0.0254
    lines = [f"{wire.label}: bare copper {format_length(wire.diameter)} ({inches:#.4g} in), "
             f"{_ORIGIN[wire.series]}"]
    rows = []
    for grade in ("1", "2", "3"):
        typical = result["overall_diameter_by_grade_m"][grade]
        largest = result["max_overall_diameter_by_grade_m"][grade]
        chosen = "(chosen)" if wire.grade == grade else ""
        mark = _EXTRAPOLATED_MARK if wire.with_grade(grade).enamel_extrapolated else ""
        rows.append((f"overall, grade {grade}", f"{format_length(typical)} typical{mark}",
                     f"at most {format_length(largest)}{mark}", chosen))
    if wire.grade == "measured":
        rows.append(("overall, measured", format_length(wire.overall_diameter), "(chosen)"))
    elif wire.grade == "bare":
        rows.append(("overall, bare", format_length(wire.overall_diameter), "(chosen)"))
    rows.append(("copper area", f"{wire.area * 1e6:.4g} mm²"))
    rows.append(("resistance", f"{format_quantity(result['resistance_ohm_per_m'], 'ohm')}/m "
                 "at 20 °C"))
    if temperature != 20.0:
        rows.append(("", f"{format_quantity(result['resistance_at_temperature_ohm_per_m'], 'ohm')}"
                     f"/m at {temperature:g} °C"))
    pitch_basis = {"measured": "measured overall", "bare": "bare copper"}.get(
        wire.grade, f"grade {wire.grade}")
    rows.append(("close-wound", f"{wire.turns_per_metre / 100:.4g} turns per cm "
                 f"({pitch_basis})"))
    rows.append(("current", f"{format_quantity(result['current_A'], 'A')} at {density:g} A/mm²"))
    return lines + aligned_rows(rows)


def _listing_lines(series: str, wires: list[Wire], results: list[dict], temperature: float,
                   density: float) -> list[str]:
    header = ["wire", "copper mm", "enamel 1 mm", "enamel 2 mm", "enamel 3 mm",
              "resistance per m at 20 °C"]
    if temperature != 20.0:
        header.append(f"per m at {temperature:g} °C")
    header.append(f"current at {density:g} A/mm²")
    rows = [header]
    for wire, result in zip(wires, results, strict=True):
        row = [wire.label, _mm(wire.diameter)]
        for grade in ("1", "2", "3"):
            mark = _EXTRAPOLATED_MARK if wire.with_grade(grade).enamel_extrapolated else ""
            row.append(_mm(result["overall_diameter_by_grade_m"][grade]) + mark)
        row.append(f"{format_quantity(result['resistance_ohm_per_m'], 'ohm')}")
        if temperature != 20.0:
            row.append(format_quantity(result["resistance_at_temperature_ohm_per_m"], "ohm"))
        row.append(format_quantity(result["current_A"], "A", 3))
        rows.append(row)
    return [_SERIES_TITLES[series], *aligned_rows(rows)]


@click.command("wire")
@click.argument("wire_text", metavar="[WIRE]", required=False)
@click.option("--series", type=click.Choice(["awg", "swg", "metric"], case_sensitive=False),
              default=None, help="List one series only; with WIRE, how to read a plain number "
              "such as 24.")
@click.option("--grade", type=click.Choice(GRADES, case_sensitive=False), default="1",
              show_default=True, help="Enamel grade: 1 thin, 2 medium, 3 thick, or bare copper.")
@click.option("--overall", type=QuantityType("m"), default=None, metavar="LENGTH",
              help="Overall diameter you measured over the enamel, e.g. 0.56mm.")
@click.option("--temperature", type=TemperatureType(), default=20.0, show_default="20C",
              help="Conductor temperature for the resistance, e.g. 60C.")
@click.option("--density", type=_DensityType(), default=_DEFAULT_DENSITY,
              show_default="3 A/mm²", metavar="A/MM2", help="Current density for the current.")
@click.option("--json", "as_json", is_flag=True, help="Print one JSON object (SI units).")
def wire(wire_text, series, grade, overall, temperature, density, as_json):
    """Wire gauges: bare and enamelled diameters, resistance and current.

    With no WIRE, list the AWG, SWG and metric sizes (or one --series). With a
    WIRE, show that wire: 24awg, "AWG 24", 4/0awg, 24.5awg, 26swg, 0.5mm, 20mil.
    """
    series = series.lower() if series else None
    grade = grade.lower()
    inputs = {"wire": wire_text, "series": series, "grade": grade, "overall_m": overall,
              "temperature_C": temperature, "density_A_per_mm2": density}
    notes = [_ENAMEL_NOTE, _density_note(density)]
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        if wire_text is None:
            if overall is not None:
                raise click.UsageError("--overall needs a WIRE to apply to")
            listed = [series] if series else ["awg", "swg", "metric"]
            tables = {name: wire_table(name, grade) for name in listed}
            results = {name: [_wire_result(w, temperature, density) for w in wires]
                       for name, wires in tables.items()}
            result = {"wires": [item for name in listed for item in results[name]]}
        else:
            chosen = parse_wire(wire_text, grade=grade, overall=overall, option="WIRE",
                                series=series)
            if series in ("awg", "swg") and chosen.series in ("awg", "swg") \
                    and chosen.series != series:
                raise InvalidInputError("--series", f"the series WIRE names ({chosen.series})",
                                        series)
            result = _wire_result(chosen, temperature, density)
    warning_texts = sorted({str(item.message) for item in caught})
    extrapolated = (result["enamel_extrapolated"] if wire_text is not None
                    else any(item["enamel_extrapolated"] for item in result["wires"]))
    if extrapolated:
        warning_texts.append("enamel figures marked * lie beyond the rows of the partial "
                             "IEC 60317-0-1 table: extrapolated by a power law, not checked "
                             "against the standard")
    cautions = _cautions(temperature, density)
    if as_json:
        click.echo(json_document("wire", inputs, result, warning_texts, cautions))
        return
    if wire_text is None:
        lines = []
        for name in listed:
            lines += _listing_lines(name, tables[name], results[name], temperature, density)
            lines.append("")
        lines.pop()
    else:
        lines = _one_wire_lines(chosen, result, temperature, density)
    lines += bullet_lines("notes", notes)
    lines += bullet_lines("warnings", warning_texts)
    lines += bullet_lines("cautions", cautions)
    click.echo("\n".join(lines))
