"""Text report of a single-layer solenoid answer (from :func:`coilplan.results.solenoid_result`)."""

from __future__ import annotations

from coilplan.quantities import format_length, format_quantity
from coilplan.report.text import aligned_rows, turns_word
from coilplan.report.turns_rows import frequency_rows, henry, target_text, turns_rows

__all__ = ["solenoid_lines"]


def solenoid_lines(result: dict) -> list[str]:
    """Lines of the solenoid report: the answer first, then geometry, wire and method.

    Examples
    --------
    >>> lines = solenoid_lines({"turns": 3, "inductance_H": 1e-6, "diameter_m": 0.02,
    ...     "pitch_m": 0.001, "close_wound": True, "length_m": 0.003, "sheet_length_m": 0.003,
    ...     "length_to_diameter": 0.15, "nagaoka": 0.2, "wire_length_m": 0.19, "lead_m": 0.0,
    ...     "dc_resistance_ohm": 0.01, "temperature_C": 20.0,
    ...     "dc_resistance_at_temperature_ohm": 0.01, "method": "sheet", "method_note": "x", "method_accuracy": "y",
    ...     "wire": {"label": "1.00 mm", "diameter_m": 0.00095, "overall_diameter_m": 0.001,
    ...              "grade": "1"}})
    >>> lines[0]
    'Single-layer air-core coil, 3 turns'
    """
    turns = result["turns"]
    if "turns_now" in result:
        title = f"Single-layer air-core coil as measured, to {henry(result['target_H'])}"
    elif "target_H" in result:
        title = f"Single-layer air-core coil for {target_text(result)}"
    else:
        title = f"Single-layer air-core coil, {turns_word(turns)}"
    rows = turns_rows(result)
    if "max_turns" in result:
        rows.append(("most that fit", f"{turns_word(result['max_turns'])}",
                     f"up to {henry(result['max_inductance_H'])}"))
    if "max_length_m" in result:
        rows.append(("former length", f"{format_length(result['length_m'])} used",
                     f"of {format_length(result['max_length_m'])} usable"))

    wire = result["wire"]
    grade = {"bare": "bare wire", "measured": "measured overall"}.get(
        wire["grade"], f"grade {wire['grade']} enamel")
    diameter_note = "to wire centres"
    if "former_diameter_m" in result:
        diameter_note += f" (former {format_length(result['former_diameter_m'])} + wire)"
    pitch_note = "close wound" if result["close_wound"] else "spaced"
    lead = result["lead_m"]
    lead_note = (f"{turns_word(turns)} + 2 × {format_length(lead)} leads" if lead > 0
                 else f"{turns_word(turns)}, no lead allowance (add --lead)")
    rows += [
        ("coil diameter", format_length(result["diameter_m"]), diameter_note),
        ("wire", f"{wire['label']}",
         f"{format_length(wire['overall_diameter_m'])} overall, {grade}"),
        ("pitch", format_length(result["pitch_m"]), pitch_note),
        ("winding length", format_length(result["length_m"]), "end to end on the former"),
        ("length / diameter", f"{result['length_to_diameter']:.3f}",
         "current-sheet length N × pitch over diameter"),
        ("Nagaoka coefficient", f"{result['nagaoka']:.5f}"),
        ("wire to cut", format_length(result["wire_length_m"]), lead_note),
        ("DC resistance", format_quantity(result["dc_resistance_ohm"], "ohm", 3), "at 20 °C"),
    ]
    if result["temperature_C"] != 20.0:
        rows.append(("", format_quantity(result["dc_resistance_at_temperature_ohm"], "ohm", 3),
                     f"at {result['temperature_C']:g} °C"))
    rows += frequency_rows(result)
    rows.append(("method", result["method"], result["method_note"]))
    rows.append(("accuracy", result["method_accuracy"]))
    if "turns_now" in result:
        rows.append(("calibrated", f"× {result['model_factor']:.4f}", "the model scaled to the readings"))
    return [title, "", *aligned_rows(rows)]
