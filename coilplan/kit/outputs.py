"""What the kit planner hands out: the summary table, the plan as JSON, the bill of materials, the winding cards.

Every figure comes from :func:`placement_fields`, so the table, the JSON, the CSV and the cards
always agree. The cards are self-contained HTML pages with the form drawn to scale in inline SVG.
"""

from __future__ import annotations

import csv
import html
import io
import math
import re

from coilplan.apparent import ApparentForm, frequency_fields
from coilplan.cautions import (
    MAINS_EQUIPMENT_CLASSES,
    hot_winding_cautions,
    salvaged_mains_caution,
    tuned_circuit_cautions,
)
from coilplan.kit.assign import KitResult, Placement, captured, wire_key
from coilplan.quantities import format_length, format_quantity
from coilplan.report.json_report import json_document
from coilplan.report.text import aligned_rows, bullet_lines
from coilplan.saturation import saturation_check

__all__ = ["bom_csv", "card_files", "kit_document", "placement_fields", "result_fields", "summary_lines",
           "winding_card"]


def _henry(value: float) -> str:
    return format_quantity(value, "H", 4)


def placement_fields(result: KitResult, placement: Placement) -> dict:
    """The figures of one placement (SI, unit in the key) with its warnings and cautions."""
    plan = result.evaluation.plan
    settings = plan.settings
    coil = plan.coil[placement.coil]
    item = result.evaluation.stock[placement.stock]
    text, grade, wire = result.evaluation.wires[placement.candidate.wire]
    form = placement.form
    turns = placement.candidate.turns
    frequency = coil.operating_frequency
    fields = {
        "coil": coil.name, "quantity": placement.quantity, "count_wanted": coil.count,
        "stock": item.label, "stock_kind": item.kind, "form": "solenoid" if item.kind == "former" else "toroid",
        "wire": wire.label, "wire_reel": wire_key(text, grade), "turns": turns, "layers": 1,
        "target_H": coil.target_inductance, "tolerance": coil.tolerance,
        "inductance_H": placement.candidate.inductance,
        "wire_length_m": placement.candidate.wire_length, "wire_length_total_m":
            placement.candidate.wire_length * placement.quantity, "lead_m": settings.lead,
    }
    operating = placement.candidate.apparent_inductance
    meter = settings.meter_frequency
    expected = float(ApparentForm(form, meter).inductance(turns)) if meter else placement.candidate.inductance
    fields.update(meter_frequency_Hz=meter, meter_inductance_H=expected,
                  accept_low_H=expected * coil.target_inductance * (1 - coil.tolerance) / operating,
                  accept_high_H=expected * coil.target_inductance * (1 + coil.tolerance) / operating)
    extra, warnings_ = captured(frequency_fields, form, turns, frequency, settings.temperature_C)
    fields.update(extra)
    spec = item.spec
    if item.kind == "former":
        fields.update(former_diameter_m=spec.diameter, former_length_m=spec.length,
                      winding_length_m=float(form.winding_length(turns)), pitch_m=float(form.pitch_at(turns)))
    else:
        fields.update(od_m=spec.od, id_m=spec.id, height_m=spec.height, al_H=form.al,
                      material=spec.material)
    cautions = list(tuned_circuit_cautions(coil.tuned))
    near = False
    if item.kind == "toroid" and coil.current > 0:
        check = saturation_check(form, turns, dc_current=coil.current)
        fields.update(flux_density_T=check.flux_density_peak, saturation_flux_density_T=check.saturation_flux_density)
        near = check.near_saturation
    density = coil.current / (wire.area * 1e6) if coil.current else 0.0
    cautions += hot_winding_cautions(current_density=density, temperature_C=settings.temperature_C,
                                     near_saturation=near)
    if item.kind == "toroid" and spec.material in MAINS_EQUIPMENT_CLASSES:
        cautions.append(salvaged_mains_caution())
    fields["warnings"] = warnings_
    fields["cautions"] = cautions
    return fields


def result_fields(result: KitResult) -> dict:
    """The whole plan as one mapping (the JSON ``result``)."""
    placements = [placement_fields(result, placement) for placement in result.placements]
    wanted = sum(coil.count for coil in result.evaluation.plan.coil)
    return {
        "complete": result.complete,
        "coils_wanted": wanted,
        "coils_placed": sum(p.quantity for p in result.placements),
        "objective": {"order": ["unplaced coils", "wire used", "closeness to target", "Q at the operating frequency"],
                      "unplaced": result.objective[0], "wire_units": result.objective[1],
                      "closeness_steps": result.objective[2], "q_steps": result.objective[3],
                      "wire_resolution_m": result.wire_resolution_m, "q_in_objective": result.q_in_objective},
        "placements": placements,
        "reels": [dict(reel) for reel in result.reels],
        "shortfall_m": dict(result.shortfall),
        "not_placed": list(result.unplaced),
    }


def _cautions(fields: dict) -> list[str]:
    seen: list[str] = []
    for placement in fields["placements"]:
        for text in placement["cautions"]:
            if text not in seen:
                seen.append(text)
    return seen


def _warnings(fields: dict) -> list[str]:
    seen: list[str] = []
    for placement in fields["placements"]:
        for text in placement["warnings"]:
            line = f"{placement['coil']}: {text}"
            if line not in seen:
                seen.append(line)
    return seen


def kit_document(plan_file: str, fields: dict) -> str:
    """The plan as the ``--json`` document (also written as plan.json)."""
    return json_document("kit", {"plan": str(plan_file)}, fields, _warnings(fields), _cautions(fields))


def summary_lines(plan_file: str, fields: dict) -> list[str]:
    """The summary table for the terminal."""
    total = sum(p["wire_length_total_m"] for p in fields["placements"])
    lines = [f"Kit plan {plan_file}: {fields['coils_placed']} of {fields['coils_wanted']} coils placed, "
             f"{format_length(total)} of wire", ""]
    rows = [("coil", "×", "on", "turns", "wire", "cut each", "meter reads", "accept")]
    for p in fields["placements"]:
        rows.append((p["coil"], str(p["quantity"]), p["stock"], str(p["turns"]), p["wire"],
                     format_length(p["wire_length_m"]), _henry(p["meter_inductance_H"]),
                     f"{_henry(p['accept_low_H'])} to {_henry(p['accept_high_H'])}"))
    lines += aligned_rows(rows)
    lines += ["", *aligned_rows([("reel", "on reel", "cut", "pieces")]
                                + [(r["wire"], format_length(r["length_m"]), format_length(r["used_m"]),
                                    str(r["pieces"])) for r in fields["reels"]])]
    notes = bullet_lines("not done", fields["not_placed"])
    if notes:
        lines += ["", *notes]
    for block in (bullet_lines("warnings", _warnings(fields)), bullet_lines("cautions", _cautions(fields))):
        if block:
            lines += ["", *block]
    return lines


def bom_csv(fields: dict, result: KitResult) -> str:
    """The bill of materials: stock used, wire by reel wire, coils placed; one row each."""
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(["section", "item", "description", "needed", "unit", "on_hand", "short"])
    used: dict[str, int] = {}
    for p in fields["placements"]:
        used[p["stock"]] = used.get(p["stock"], 0) + p["quantity"]
    for item in result.evaluation.stock:
        spec = item.spec
        if item.kind == "former":
            description = f"former, {format_length(spec.diameter)} diameter, {format_length(spec.length)} long"
        else:
            core = spec.material if spec.material else f"AL {format_quantity(spec.al, 'H')} per turn²"
            description = (f"ring core, OD {format_length(spec.od)}, ID {format_length(spec.id)}, "
                           f"height {format_length(spec.height)}, {core}")
        writer.writerow(["stock", item.label, description, used.get(item.label, 0), "pcs", item.count, 0])
    needed: dict[str, float] = {}
    on_hand: dict[str, float] = {}
    for p in fields["placements"]:
        needed[p["wire_reel"]] = needed.get(p["wire_reel"], 0.0) + p["wire_length_total_m"]
    for reel in fields["reels"]:
        on_hand[reel["wire"]] = on_hand.get(reel["wire"], 0.0) + reel["length_m"]
    for key in on_hand:
        writer.writerow(["wire", key, "enamelled copper wire, cut lengths include the margin",
                         f"{needed.get(key, 0.0):.3f}", "m", f"{on_hand[key]:.3f}",
                         f"{fields['shortfall_m'].get(key, 0.0):.3f}"])
    for coil in result.evaluation.plan.coil:
        placed = sum(p["quantity"] for p in fields["placements"] if p["coil"] == coil.name)
        writer.writerow(["coil", coil.name, f"target {_henry(coil.target_inductance)} ±{coil.tolerance:.1%}",
                         coil.count, "pcs", placed, coil.count - placed])
    return out.getvalue()


# --- winding cards ---------------------------------------------------------------------------------

_STYLE = ("body{font-family:sans-serif;max-width:44em;margin:1em auto;color:#111}"
          "table{border-collapse:collapse}td{padding:2px 10px 2px 0;vertical-align:top}"
          "h2{margin-top:1.5em;border-bottom:1px solid #888}svg text{font-size:11px;font-family:sans-serif}"
          ".c{color:#900}")


def _solenoid_svg(p: dict) -> str:
    """Side view of the former with the winding, to scale."""
    length, diameter, winding = p["former_length_m"], p["former_diameter_m"], p["winding_length_m"]
    scale = 360.0 / max(length, diameter)  # px per metre
    w, h = length * scale, diameter * scale
    x0, y0 = 60.0, 30.0
    start = x0 + (w - winding * scale) / 2.0
    turns = p["turns"]
    parts = [f'<rect x="{x0:.1f}" y="{y0:.1f}" width="{w:.1f}" height="{h:.1f}" fill="#eee" stroke="#333"/>']
    if turns <= 400:
        pitch = p["pitch_m"] * scale
        for k in range(turns):
            x = start + (k + 0.5) * pitch
            parts.append(f'<line x1="{x:.2f}" y1="{y0 - 2:.1f}" x2="{x:.2f}" y2="{y0 + h + 2:.1f}" '
                         f'stroke="#b45f06" stroke-width="{max(pitch * 0.6, 0.5):.2f}"/>')
    else:
        parts.append(f'<rect x="{start:.1f}" y="{y0 - 2:.1f}" width="{winding * scale:.1f}" height="{h + 4:.1f}" '
                     f'fill="#b45f06" opacity="0.6"/>')
    parts += [
        f'<text x="{x0 + w / 2:.1f}" y="{y0 + h + 22:.1f}" text-anchor="middle">former length '
        f'{html.escape(format_length(length))}; winding {html.escape(format_length(winding))}</text>',
        f'<text x="{x0 - 6:.1f}" y="{y0 + h / 2:.1f}" text-anchor="end">'
        f'⌀ {html.escape(format_length(diameter))}</text>',
    ]
    return _svg(parts, x0 + w + 40, y0 + h + 40, scale)


def _toroid_svg(p: dict) -> str:
    """Top view of the ring with the turns spread round it, and its section, to scale."""
    od, inner, height = p["od_m"], p["id_m"], p["height_m"]
    scale = 260.0 / od
    cx, cy = 20 + od * scale / 2, 20 + od * scale / 2
    ro, ri = od * scale / 2, inner * scale / 2
    parts = [f'<circle cx="{cx:.1f}" cy="{cy:.1f}" r="{ro:.1f}" fill="#ddd" stroke="#333"/>',
             f'<circle cx="{cx:.1f}" cy="{cy:.1f}" r="{ri:.1f}" fill="#fff" stroke="#333"/>']
    turns = p["turns"]
    for k in range(min(turns, 400)):
        angle = 2 * math.pi * k / turns
        c, s = math.cos(angle), math.sin(angle)
        parts.append(f'<line x1="{cx + (ri - 2) * c:.2f}" y1="{cy + (ri - 2) * s:.2f}" x2="{cx + (ro + 2) * c:.2f}" '
                     f'y2="{cy + (ro + 2) * s:.2f}" stroke="#b45f06" stroke-width="1"/>')
    sx = cx + ro + 40
    width = (od - inner) / 2 * scale
    parts += [f'<rect x="{sx:.1f}" y="{cy - height * scale / 2:.1f}" width="{width:.1f}" '
              f'height="{height * scale:.1f}" fill="#ddd" stroke="#333"/>',
              f'<text x="{cx:.1f}" y="{cy + ro + 18:.1f}" text-anchor="middle">OD {html.escape(format_length(od))}, '
              f'ID {html.escape(format_length(inner))}</text>',
              f'<text x="{sx:.1f}" y="{cy + height * scale / 2 + 16:.1f}">height '
              f'{html.escape(format_length(height))}</text>']
    return _svg(parts, sx + width + 90, cy + ro + 30, scale)


def _svg(parts: list[str], width: float, height: float, scale: float) -> str:
    note = f"drawn to scale: 1 mm = {scale / 1000:.3g} px"
    return (f'<svg xmlns="http://www.w3.org/2000/svg" width="{width:.0f}" height="{height + 16:.0f}" '
            f'viewBox="0 0 {width:.0f} {height + 16:.0f}" role="img" aria-label="{note}">'
            + "".join(parts) + f'<text x="4" y="{height + 12:.0f}">{note}</text></svg>')


def _card_rows(p: dict) -> list[tuple[str, str]]:
    rows = [("wind", f"{p['turns']} turns in {p['layers']} layer of {p['wire']} wire ({p['wire_reel']})"),
            ("cut", f"{format_length(p['wire_length_m'])} of wire for each coil "
                    f"(leads {format_length(p['lead_m'])} at each end and the margin included)"),
            ("on", p["stock"])]
    meter = (f"at {format_quantity(p['meter_frequency_Hz'], 'Hz')}" if p["meter_frequency_Hz"]
             else "at a low test frequency")
    rows.append(("meter", f"expect {_henry(p['meter_inductance_H'])} {meter}; accept "
                          f"{_henry(p['accept_low_H'])} to {_henry(p['accept_high_H'])}"))
    rows.append(("target", f"{_henry(p['target_H'])} ±{p['tolerance']:.1%}"))
    if p.get("frequency_Hz"):
        rows.append(("at", f"{format_quantity(p['frequency_Hz'], 'Hz')}: L {_henry(p['apparent_inductance_H'])}, "
                           f"R {format_quantity(p['ac_resistance_ohm'], 'ohm', 3)}, Q {p['q']:.0f}"))
    if p.get("srf_Hz"):
        rows.append(("self-resonance", f"{format_quantity(p['srf_Hz'], 'Hz', 3)} (self-capacitance "
                                       f"{format_quantity(p['self_capacitance_F'], 'F', 2)}, estimated)"))
    if p.get("flux_density_T") is not None and p.get("saturation_flux_density_T"):
        rows.append(("core", f"{format_quantity(p['flux_density_T'], 'T', 3)} at the coil's current, saturation "
                             f"{format_quantity(p['saturation_flux_density_T'], 'T', 3)}"))
    return rows


def winding_card(name: str, placements: list[dict]) -> str:
    """A self-contained HTML winding card for one coil type (one section per stock item it is wound on)."""
    body = [f"<h1>Winding card: {html.escape(name)}</h1>"]
    for p in placements:
        body.append(f"<h2>{p['quantity']} × on {html.escape(p['stock'])}</h2>")
        body.append(_solenoid_svg(p) if p["form"] == "solenoid" else _toroid_svg(p))
        body.append("<table>" + "".join(f"<tr><td>{html.escape(a)}</td><td>{html.escape(b)}</td></tr>"
                                        for a, b in _card_rows(p)) + "</table>")
        for title, items in (("warnings", p["warnings"]), ("cautions", p["cautions"])):
            if items:
                body.append(f'<p class="c">{title}:</p><ul>' + "".join(f"<li>{html.escape(t)}</li>" for t in items)
                            + "</ul>")
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{html.escape(name)}: winding card</title><style>{_STYLE}</style></head><body>"
            + "\n".join(body) + "</body></html>\n")


def card_files(fields: dict) -> dict[str, str]:
    """File name → HTML of each coil type's winding card (names made safe and distinct)."""
    by_coil: dict[str, list[dict]] = {}
    for p in fields["placements"]:
        by_coil.setdefault(p["coil"], []).append(p)
    files: dict[str, str] = {}
    for name, placements in by_coil.items():
        slug = re.sub(r"[^A-Za-z0-9._-]+", "-", name).strip("-.") or "coil"
        file, number = f"card-{slug}.html", 2
        while file in files:
            file, number = f"card-{slug}-{number}.html", number + 1
        files[file] = winding_card(name, placements)
    return files
