"""Text reports of multilayer and flat-spiral answers (from :mod:`coilplan.results.coils`)."""

from __future__ import annotations

from coilplan.quantities import format_length
from coilplan.report.text import aligned_rows, turns_word
from coilplan.report.turns_rows import frequency_rows, henry, target_text, turns_rows, winding_rows

__all__ = ["multilayer_lines", "spiral_lines"]


def _title(result: dict, what: str) -> str:
    if "turns_now" in result:
        return f"{what} as measured, to {henry(result['target_H'])}"
    if "target_H" in result:
        return f"{what} for {target_text(result)}"
    return f"{what}, {turns_word(result['turns'])}"


def _fit_text(fits) -> str:
    return {None: "no limit given", True: "fits", False: "does NOT fit"}[fits]


def _tail_rows(result: dict) -> list[tuple[str, ...]]:
    """Wire, resistance, frequency, method and Wheeler's figure beside the method's."""
    rows = winding_rows(result)
    rows += frequency_rows(result)
    rows.append(("method", result["method"], result["method_note"]))
    rows.append(("accuracy", result["method_accuracy"]))
    if result["method"] == "filament":
        rows.append(("Wheeler's formula", henry(result["wheeler_inductance_H"]),
                     f"{result['wheeler_difference']:+.2%} from the exact sum (an approximation)"))
    else:
        rows.append(("exact sum", henry(result["exact_inductance_H"]),
                     f"Wheeler differs by {result['wheeler_difference']:+.2%} from it"))
    if "turns_now" in result:
        rows.append(("calibrated", f"× {result['model_factor']:.4f}", "the model scaled to the readings"))
    return rows


def multilayer_lines(result: dict) -> list[str]:
    """Lines of the multilayer report: the answer, the layers and build, wire and method.

    Examples
    --------
    >>> lines = multilayer_lines({"turns": 30, "inductance_H": 1e-5, "layers": 3, "turns_per_layer": 10,
    ...     "style": "layered", "packing": 1.0, "pitch_m": 0.001, "layer_pitch_m": 0.001,
    ...     "former_diameter_m": 0.01, "width_m": 0.01, "depth_m": 0.003, "outer_diameter_m": 0.016,
    ...     "fits": None, "wire_length_m": 1.2, "lead_m": 0.0, "dc_resistance_ohm": 0.03,
    ...     "temperature_C": 20.0, "dc_resistance_at_temperature_ohm": 0.03, "method": "filament",
    ...     "method_note": "x", "method_accuracy": "y", "wheeler_inductance_H": 1.01e-5,
    ...     "wheeler_difference": 0.01, "exact_inductance_H": 1e-5,
    ...     "wire": {"label": "1.00 mm", "diameter_m": 0.00095, "overall_diameter_m": 0.001, "grade": "1"}})
    >>> lines[0]
    'Multilayer air-core coil, 30 turns'
    """
    rows = turns_rows(result)
    if "max_turns" in result:
        rows.append(("most that fit", turns_word(result["max_turns"]), f"up to {henry(result['max_inductance_H'])}"))
    rows += [
        ("layers", str(result["layers"]), f"{result['turns_per_layer']} turns in a full layer, {result['style']}"),
        ("build", format_length(result["depth_m"]), "radial depth of the winding"),
        ("outer diameter", format_length(result["outer_diameter_m"]),
         f"on a {format_length(result['former_diameter_m'])} former"),
        ("winding width", format_length(result["width_m"]),
         f"pitch {format_length(result['pitch_m'])}, layer pitch {format_length(result['layer_pitch_m'])}, "
         f"packing {result['packing']:g}"),
    ]
    if "max_depth_m" in result:
        rows.append(("fit", _fit_text(result["fits"]), f"window depth {format_length(result['max_depth_m'])}"))
    rows += _tail_rows(result)
    return [_title(result, "Multilayer air-core coil"), "", *aligned_rows(rows)]


def spiral_lines(result: dict) -> list[str]:
    """Lines of the flat-spiral report: the answer, the radial extent, wire and method."""
    rows = turns_rows(result)
    if "max_turns" in result:
        rows.append(("most that fit", turns_word(result["max_turns"]), f"up to {henry(result['max_inductance_H'])}"))
    rows += [
        ("inner diameter", format_length(result["inner_diameter_m"])),
        ("outer diameter", format_length(result["outer_diameter_m"]),
         f"radial width {format_length(result['depth_m'])}"),
        ("radial pitch", format_length(result["radial_pitch_m"]), f"gap {format_length(result['spacing_m'])}"),
    ]
    if "max_outer_diameter_m" in result:
        rows.append(("fit", _fit_text(result["fits"]), f"within {format_length(result['max_outer_diameter_m'])}"))
    rows += _tail_rows(result)
    return [_title(result, "Flat spiral coil"), "", *aligned_rows(rows)]
