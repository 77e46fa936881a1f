"""What the kit planner hands out: the summary table, the plan as JSON, the bill of materials, the winding cards.

Every figure comes from :func:`placement_fields`, so the table, the JSON, the CSV and the cards
always agree. The cards (:mod:`coilplan.kit.cards`) are self-contained HTML pages with the form drawn
to scale in inline SVG.
"""

from __future__ import annotations

import csv
import io
import math

import numpy as np

from coilplan.apparent import ApparentForm, frequency_fields
from coilplan.cautions import (
    MAINS_EQUIPMENT_CLASSES,
    hot_winding_cautions,
    salvaged_mains_caution,
    tuned_circuit_cautions,
)
from coilplan.core_frequency import at_frequency
from coilplan.kit.assign import KitResult, Placement, captured, wire_key
from coilplan.kit.cards import card_files, winding_card
from coilplan.kit.stock import core_spectrum, describe
from coilplan.quantities import format_length, format_quantity
from coilplan.report.json_report import json_document
from coilplan.report.text import aligned_rows, bullet_lines
from coilplan.saturation import saturation_check

__all__ = ["ROD_UNCALIBRATED", "bom_csv", "card_files", "kit_document", "placement_fields", "result_fields",
           "summary_lines", "winding_card"]


def _henry(value: float) -> str:
    return format_quantity(value, "H", 4)


#: Said of every winding on a rod whose model no reading has calibrated.
ROD_UNCALIBRATED = ("the rod model is uncalibrated: expect tens of percent from a real rod; wind a test winding on "
                    "one of these rods, measure it, and give the reading as measured (with measured_wire) in the "
                    "plan to scale the model")


#: The stock kinds wound in layers (the others take one layer).
LAYERED = ("gapped", "bobbin")


def _layer_of(item, form, turns: int | None) -> int | None:
    """The layer turn ``turns`` ends in (1 for a single-layer form; None for no turn)."""
    if turns is None:
        return None
    return int(form.layers(turns)) if item.kind in LAYERED else 1


def _layer_turns(form, turns: int) -> list[int]:
    """Turns in each layer, the first layer first."""
    layers = np.asarray(form.layers(np.arange(1, turns + 1)), dtype=np.int64)
    return np.bincount(layers)[1:].tolist()


def _form_fields(item, form, turns: int) -> dict:
    """The dimensions of the form and how the winding sits on it (SI)."""
    spec = item.spec
    if item.kind == "former":
        return dict(former_diameter_m=spec.diameter, former_length_m=spec.length,
                    winding_length_m=float(form.winding_length(turns)), pitch_m=float(form.pitch_at(turns)))
    if item.kind == "toroid":
        return dict(od_m=spec.od, id_m=spec.id, height_m=spec.height, al_H=form.al, material=spec.material)
    if item.kind == "rod":
        return dict(rod_length_m=spec.length, rod_diameter_m=spec.diameter, former_diameter_m=spec.former,
                    winding_length_m=float(form.winding_length(turns)), pitch_m=float(form.pitch_at(turns)),
                    material=spec.material, mu_initial=float(form.mu_initial),
                    rod_permeability=float(form.rod_permeability()), calibration_factor=item.scale)
    if item.kind == "gapped":
        return dict(ae_m2=spec.ae, le_m=spec.le, gap_m=spec.gap, al_H=float(form.al_value), material=spec.material,
                    window_width_m=spec.window_width, window_depth_m=spec.window_depth,
                    leg_diameter_m=2.0 * math.sqrt(spec.ae / math.pi), turns_per_layer=form.turns_per_layer(),
                    wire_pitch_m=form.wire.overall_diameter, layer_turns=_layer_turns(form, turns))
    return dict(bobbin_diameter_m=spec.diameter, bobbin_width_m=spec.width, bobbin_depth_m=spec.depth,
                style=spec.style, turns_per_layer=form.turns_per_layer(), build_m=float(form.depth(turns)),
                pitch_m=float(form.pitch), layer_pitch_m=float(form.layer_pitch), layer_turns=_layer_turns(form, turns))


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
    tap = placement.candidate.tap
    fields = {
        "coil": coil.name, "quantity": placement.quantity, "count_wanted": coil.count,
        "stock": item.label, "stock_kind": item.kind, "form": item.form_name,
        "wire": wire.label, "wire_reel": wire_key(text, grade), "turns": turns, "layers": _layer_of(item, form, turns),
        "tap_turn": tap, "tap_layer": _layer_of(item, form, tap),
        "target_H": coil.target_inductance, "tolerance": coil.tolerance,
        "inductance_H": placement.candidate.inductance,
        "wire_length_m": placement.candidate.wire_length, "wire_length_total_m":
            placement.candidate.wire_length * placement.quantity, "lead_m": settings.lead,
        "reels": [{"reel": r + 1, "pieces": pieces} for r, pieces in placement.reels],
    }
    operating = placement.candidate.apparent_inductance
    meter = settings.meter_frequency
    expected = float(ApparentForm(form, meter).inductance(turns)) if meter else placement.candidate.inductance
    fields.update(meter_frequency_Hz=meter, meter_inductance_H=expected,
                  accept_low_H=expected * coil.target_inductance * (1 - coil.tolerance) / operating,
                  accept_high_H=expected * coil.target_inductance * (1 + coil.tolerance) / operating)
    if frequency:  # the core's permeability and loss there, when its class is named
        form = at_frequency(form, core_spectrum(item, form), frequency)
    extra, warnings_ = captured(frequency_fields, form, turns, frequency, settings.temperature_C)
    if hasattr(form, "validity_warnings"):  # the model's own range, for the turns chosen
        warnings_ += [text for text in captured(form.validity_warnings, turns)[1] if text not in warnings_]
    fields.update(extra)
    fields.update(_form_fields(item, form, turns))
    if item.kind == "rod" and item.scale is None:
        warnings_.append(ROD_UNCALIBRATED)
    cautions = list(tuned_circuit_cautions(coil.tuned))
    near = False
    if item.kind in ("toroid", "rod", "gapped") and coil.current > 0:
        check = saturation_check(form, turns, dc_current=coil.current)
        fields.update(flux_density_T=check.flux_density_peak, saturation_flux_density_T=check.saturation_flux_density)
        near = check.near_saturation
    density = coil.current / (wire.area * 1e6) if coil.current else 0.0
    cautions += hot_winding_cautions(current_density=density, temperature_C=settings.temperature_C,
                                     near_saturation=near)
    if item.kind in ("toroid", "gapped") and item.spec.material in MAINS_EQUIPMENT_CLASSES:
        cautions.append(salvaged_mains_caution())
    fields["warnings"] = warnings_
    fields["cautions"] = cautions
    return fields


def result_fields(result: KitResult) -> dict:
    """The whole plan as one mapping (the JSON ``result``)."""
    placements = [placement_fields(result, placement) for placement in result.placements]
    wanted = sum(coil.count for coil in result.evaluation.plan.coil)
    objective = {"order": ["unplaced coils", "wire used", "closeness to target", "Q at the operating frequency"],
                 "unplaced": result.objective[0], "wire_units": result.objective[1],
                 "closeness_steps": result.objective[2], "q_steps": result.objective[3],
                 "wire_resolution_m": result.wire_resolution_m, "q_in_objective": result.q_in_objective,
                 "solver": result.solver, "proven_optimal": result.proven_optimal}
    if result.bound is not None:
        objective["bound"] = {"unplaced": result.bound[0], "wire_units": result.bound[1]}
    return {
        "complete": result.complete,
        "coils_wanted": wanted,
        "coils_placed": sum(p.quantity for p in result.placements),
        "objective": objective,
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


def _tap_text(p: dict) -> str:
    return "" if p["tap_turn"] is None else str(p["tap_turn"])


def _optimality(fields: dict) -> list[str]:
    """A line when the share-out is not proven optimal: how far from the optimum it can be."""
    objective = fields["objective"]
    if objective["proven_optimal"]:
        return []
    bound = objective.get("bound")
    if bound is None:
        return ["the share-out is the best found in the time allowed, not proven optimal"]
    if bound["unplaced"] < objective["unplaced"]:
        return [f"the share-out is not proven optimal: at most {objective['unplaced'] - bound['unplaced']} more "
                f"coils could be placed"]
    gap = (objective["wire_units"] - bound["wire_units"]) * objective["wire_resolution_m"]
    return [f"the share-out places as many coils as can be, with at most {format_length(gap)} more wire than "
            f"the least possible (not proven optimal beyond that)"]


def summary_lines(plan_file: str, fields: dict) -> list[str]:
    """The summary table for the terminal."""
    total = sum(p["wire_length_total_m"] for p in fields["placements"])
    lines = [f"Kit plan {plan_file}: {fields['coils_placed']} of {fields['coils_wanted']} coils placed, "
             f"{format_length(total)} of wire", ""]
    tapped = any(p["tap_turn"] is not None for p in fields["placements"])
    rows = [("coil", "×", "on", "turns", *(("tap",) if tapped else ()), "wire", "cut each", "meter reads",
             "accept")]
    for p in fields["placements"]:
        rows.append((p["coil"], str(p["quantity"]), p["stock"], str(p["turns"]),
                     *((_tap_text(p),) if tapped else ()), p["wire"], format_length(p["wire_length_m"]),
                     _henry(p["meter_inductance_H"]), f"{_henry(p['accept_low_H'])} to {_henry(p['accept_high_H'])}"))
    lines += aligned_rows(rows)
    lines += ["", *aligned_rows([("reel", "on reel", "cut", "pieces")]
                                + [(r["wire"], format_length(r["length_m"]), format_length(r["used_m"]),
                                    str(r["pieces"])) for r in fields["reels"]])]
    notes = bullet_lines("not done", fields["not_placed"])
    if notes:
        lines += ["", *notes]
    for block in (_optimality(fields), bullet_lines("warnings", _warnings(fields)),
                  bullet_lines("cautions", _cautions(fields))):
        if block:
            lines += ["", *block]
    return lines


def bom_csv(fields: dict, result: KitResult) -> str:
    """The bill of materials: stock used, wire by reel wire, the windings, the coils; one row each.

    ``turns`` and ``tap_turn`` are filled on the winding rows (one per coil type, stock item and wire).
    """
    out = io.StringIO()
    writer = csv.writer(out, lineterminator="\n")
    writer.writerow(["section", "item", "description", "needed", "unit", "on_hand", "short", "turns", "tap_turn"])
    used: dict[str, int] = {}
    for p in fields["placements"]:
        used[p["stock"]] = used.get(p["stock"], 0) + p["quantity"]
    for item in result.evaluation.stock:
        writer.writerow(["stock", item.label, describe(item), used.get(item.label, 0), "pcs", item.count, 0, "", ""])
    needed: dict[str, float] = {}
    on_hand: dict[str, float] = {}
    for p in fields["placements"]:
        needed[p["wire_reel"]] = needed.get(p["wire_reel"], 0.0) + p["wire_length_total_m"]
    for reel in fields["reels"]:
        on_hand[reel["wire"]] = on_hand.get(reel["wire"], 0.0) + reel["length_m"]
    for key in on_hand:
        writer.writerow(["wire", key, "enamelled copper wire, cut lengths include the margin",
                         f"{needed.get(key, 0.0):.3f}", "m", f"{on_hand[key]:.3f}",
                         f"{fields['shortfall_m'].get(key, 0.0):.3f}", "", ""])
    for p in fields["placements"]:
        tap = f", tapped at turn {p['tap_turn']}" if p["tap_turn"] is not None else ""
        layers = f" in {p['layers']} layers" if p["layers"] > 1 else ""
        reels = ", ".join(f"reel {r['reel']} ({r['pieces']})" for r in p["reels"])
        writer.writerow(["winding", f"{p['coil']} on {p['stock']}",
                         f"{p['turns']} turns of {p['wire']}{layers}{tap}, {format_length(p['wire_length_m'])} "
                         f"cut each from {reels}", p["quantity"], "pcs", "", "", p["turns"],
                         "" if p["tap_turn"] is None else p["tap_turn"]])
    for coil in result.evaluation.plan.coil:
        placed = sum(p["quantity"] for p in fields["placements"] if p["coil"] == coil.name)
        writer.writerow(["coil", coil.name, f"target {_henry(coil.target_inductance)} ±{coil.tolerance:.1%}",
                         coil.count, "pcs", placed, coil.count - placed, "", ""])
    return out.getvalue()
