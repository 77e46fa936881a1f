"""Text reports of cored answers: toroids and gapped cores (from :mod:`coilplan.results.cored`)."""

from __future__ import annotations

from coilplan.quantities import format_length, format_quantity
from coilplan.report.text import aligned_rows, turns_word
from coilplan.report.turns_rows import frequency_rows, henry, target_text, turns_rows, winding_rows

__all__ = ["gapped_lines", "rod_lines", "toroid_lines"]


def _al(value: float) -> str:
    return f"{format_quantity(value, 'H', 4)} per turn²"


def _drive_rows(result: dict) -> list[tuple[str, ...]]:
    rows: list[tuple[str, ...]] = []
    limit = result["saturation_flux_density_T"]
    driven = result["current_A"] or result["ac_current_A"] or result.get("ac_voltage_V")
    if driven:
        parts = []
        if result["current_A"]:
            parts.append(f"{format_quantity(result['current_A'], 'A', 3)} DC")
        if result["ac_current_A"]:
            parts.append(f"{format_quantity(result['ac_current_A'], 'A', 3)} peak AC")
        if result.get("ac_voltage_V"):
            parts.append(f"{format_quantity(result['ac_voltage_V'], 'V', 3)} RMS at "
                         f"{format_quantity(result['frequency_Hz'], 'Hz', 4)}")
        rows.append(("peak flux density", format_quantity(result["flux_density_T"], "T", 3),
                     " + ".join(parts)))
        rows.append(("current density", f"{result['current_density_A_per_mm2']:.3g} A/mm²", "RMS in the copper"))
    if limit:
        rows.append(("saturates at", format_quantity(limit, "T", 3),
                     f"at {result['temperature_C']:g} °C, typical for the material"))
        if driven:
            margin = result["saturation_margin"]
            state = "below saturation" if margin > 0 else "PAST SATURATION"
            rows.append(("margin", f"{margin:.0%}", state))
        rows.append(("largest DC current", format_quantity(result["max_current_A"], "A", 3),
                     "before saturation at these turns"))
    elif driven:
        rows.append(("saturates at", "unknown", "give --material or --bsat for the margin"))
    return rows


def toroid_lines(result: dict) -> list[str]:
    """Lines of the toroid report: the answer, the core's IEC 60205 figures, winding and drive."""
    title = (f"Toroid for {target_text(result)}" if "target_H" in result
             else f"Toroid, {turns_word(result['turns'])}")
    rows = turns_rows(result)
    mu_note = "implied by the AL value" if result["mu_r_implied"] else ""
    rows += [
        ("AL value", _al(result["al_H"]), result["al_basis"]),
        ("relative permeability", f"{result['mu_r']:.4g}", mu_note),
        ("core", f"{format_length(result['outer_diameter_m'])} OD × {format_length(result['inner_diameter_m'])} ID"
                 f" × {format_length(result['height_m'])} high"),
        ("effective length le", format_length(result["le_m"]), "IEC 60205"),
        ("effective area Ae", f"{result['ae_m2'] * 1e6:.4g} mm²", "IEC 60205"),
        ("effective volume Ve", f"{result['ve_m3'] * 1e9:.4g} mm³", "IEC 60205"),
        ("one layer holds", f"{turns_word(result['turns_one_layer'])}", "on the inside circumference"),
        ("window holds", f"{turns_word(result['turns_window'])}", "layer on layer to the centre (theoretical)"),
        ("wire per turn", format_length(result["wire_per_turn_m"]), "first layer"),
    ]
    rows += winding_rows(result) + frequency_rows(result) + _drive_rows(result)
    if result.get("matching_materials"):
        rows.append(("material classes", ", ".join(result["matching_materials"]),
                     "consistent with the permeability (see coilplan materials)"))
    return [title, "", *aligned_rows(rows)]


def gapped_lines(result: dict) -> list[str]:
    """Lines of the gapped-core report: the answer, AL with fringing shown apart, winding and drive."""
    mode = result.get("mode", "given")
    if mode == "choke design":
        title = (f"Gapped choke for {henry(result['asked_H'])} at "
                 f"{format_quantity(result['current_A'] + result['ac_current_A'], 'A', 3)} peak")
        rows = [("wind", f"{turns_word(result['turns'])}", f"gives {henry(result['inductance_H'])}"),
                ("gap", format_length(result["gap_m"]), "total in the magnetic path, computed"),
                ("flux limit used", format_quantity(result["max_flux_density_T"], "T", 3),
                 "the fewest turns that stay below it")]
    elif mode == "gap for turns":
        title = f"Gapped core: the gap for {henry(result['asked_H'])} at {turns_word(result['turns'])}"
        rows = [("gap", format_length(result["gap_m"]), "total in the magnetic path, computed"),
                ("inductance", henry(result["inductance_H"]))]
    else:
        title = (f"Gapped core for {target_text(result)}" if "target_H" in result
                 else f"Gapped core, {turns_word(result['turns'])}")
        rows = turns_rows(result)
        if result["gap_m"] is not None:
            rows.append(("gap", format_length(result["gap_m"]), "total in the magnetic path"))
    if result.get("al_from_readings"):
        note = "from the readings"
    else:
        note = "with fringing" if result["fringing_factor"] != 1.0 else "no fringing correction"
    rows.append(("AL value", _al(result["al_H"]), note))
    if result["fringing_factor"] != 1.0:
        rows.append(("  without fringing", _al(result["al_no_fringing_H"]),
                     f"McLyman factor {result['fringing_factor']:.3f} (about ±10 % on the correction)"))
    rows += [
        ("effective permeability", f"{result['effective_mu']:.4g}"),
        ("core Ae, le", f"{result['ae_m2'] * 1e6:.4g} mm²", format_length(result["le_m"])),
    ]
    if result["turns_per_layer"] is not None:
        rows.append(("turns per layer", f"{result['turns_per_layer']}"))
    if result["max_turns"] is not None:
        rows.append(("window holds", f"{turns_word(result['max_turns'])}", "layer winding"))
    rows += winding_rows(result) + frequency_rows(result) + _drive_rows(result)
    return [title, "", *aligned_rows(rows)]


def rod_lines(result: dict) -> list[str]:
    """Lines of the rod-coil report: the answer, the rod's effect, the winding and the model's standing."""
    title = (f"Coil on a ferrite rod for {target_text(result)}" if "target_H" in result
             else f"Coil on a ferrite rod, {turns_word(result['turns'])}")
    rows = turns_rows(result)
    rows += [
        ("without the rod", henry(result["air_inductance_H"]), "the same winding in air (Nagaoka sheet)"),
        ("rod", f"{format_length(result['rod_length_m'])} × {format_length(result['rod_diameter_m'])}",
         f"material µi {result['mu_initial']:g}"),
        ("rod permeability", f"{result['rod_permeability']:.4g}",
         "apparent, at the rod's middle (cylinder's demagnetising factor)"),
        ("coil diameter", format_length(result["diameter_m"]), "to wire centres"),
        ("pitch", format_length(result["pitch_m"])),
        ("winding length", format_length(result["length_m"]),
         "centred on the rod" if result["position_m"] == 0 else
         f"centre {format_length(abs(result['position_m']))} off the rod's centre"),
        ("most that fit", f"{turns_word(result['max_turns'])}"),
    ]
    if result["calibrated"]:
        residuals = ", ".join(f"{value:+.2%}" for value in result["measured_residuals"])
        rows.append(("model calibrated", f"× {result['model_factor']:.4f}",
                     f"from the readings; residuals {residuals}"))
    else:
        rows.append(("model", "uncalibrated", "rough: tens of percent; add --measured L@N from a test winding"))
    rows += winding_rows(result) + frequency_rows(result) + _drive_rows(result)
    return [title, "", *aligned_rows(rows)]
