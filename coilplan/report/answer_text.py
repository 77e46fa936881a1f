"""The text of one coil's answer, every form alike: a title, then a section for each part of the answer
(:mod:`coilplan.answer`) that has something to say, in the order a bench user works through them.

Each section's rows come from the figures present, never from the form's name, so a new form is
rendered without touching this module.
"""

from __future__ import annotations

from coilplan.quantities import format_length, format_quantity
from coilplan.report.text import aligned_rows, turns_word
from coilplan.report.turns_rows import henry, rewind_rows, target_text

__all__ = ["answer_lines"]

#: what each command's coil is called in a title
_NOUN = {"solenoid": "Single-layer air-core coil", "multilayer": "Multilayer air-core coil",
         "spiral": "Flat spiral coil", "toroid": "Toroid", "gapped": "Gapped core",
         "rod": "Coil on a ferrite rod", "rewind": "Coil on a closed core"}


def answer_lines(command: str, result: dict) -> list[str]:
    """The answer as text: the title, then each section with its heading (rows aligned across sections).

    Examples
    --------
    >>> print("\\n".join(answer_lines("solenoid", {"turns": 3, "inductance_H": 1e-6})))
    Single-layer air-core coil, 3 turns
    <BLANKLINE>
    To wind
      inductance  1.000 μH
    """
    sections = [(heading, rows) for heading, rows_of in _SECTIONS if (rows := rows_of(result))]
    aligned = iter(aligned_rows([row for _, rows in sections for row in rows]))
    lines = [_title(command, result)]
    for heading, rows in sections:
        lines += ["", heading(result) if callable(heading) else heading, *(next(aligned) for _ in rows)]
    return lines


def _title(command: str, result: dict) -> str:
    noun = _NOUN.get(command, "Coil")
    mode = result.get("mode")
    if mode == "choke design":
        peak = result["current_A"] + result["ac_current_A"]
        return f"Gapped choke for {henry(result['asked_H'])} at {format_quantity(peak, 'A', 3)} peak"
    if mode == "gap for turns":
        return f"{noun}: the gap for {henry(result['asked_H'])} at {turns_word(result['turns'])}"
    if "turns_now" in result:
        return f"{noun} as measured, to {henry(result['target_H'])}"
    if "target_H" in result:
        return f"{noun} for {target_text(result)}"
    return f"{noun}, {turns_word(result['turns'])}"


# ---- the sections ------------------------------------------------------------------------------------------
def _measured_rows(result: dict) -> list[tuple[str, ...]]:
    """The coil as the meter showed it: now, the change, what to expect, the range and the plan; the readings."""
    rows = rewind_rows(result) if "turns_now" in result else []
    if "offset_H" in result:  # the bare closed-core law: its fit is the whole model
        rows.append(("AL value", _al(result["al_H"]), "fitted, L = AL·N²"))
        if result.get("offset_H"):
            rows.append(("leads", henry(result["offset_H"]), "fitted series part, L = AL·N² + L0"))
        for reading, residual in zip(result["readings"], result["residuals"], strict=True):
            rows.append(("reading", f"{henry(reading['inductance_H'])} at {turns_word(reading['turns'])}",
                         f"{residual:+.2%} off the fit"))
    if "resistance_change_ohm" in result:
        rows.append(("resistance change", format_quantity(result["resistance_change_ohm"], "ohm", 3)))
    return rows


def _wind_rows(result: dict) -> list[tuple[str, ...]]:
    """The turns to wind and what they give, the most that fit, and notes on the answer."""
    rows: list[tuple[str, ...]] = []
    mode = result.get("mode")
    if mode == "choke design":
        rows = [("wind", turns_word(result["turns"]), f"gives {henry(result['inductance_H'])}"),
                ("flux limit used", format_quantity(result["max_flux_density_T"], "T", 3),
                 "the fewest turns that stay below it")]
    elif mode == "gap for turns":
        rows = [("inductance", henry(result["inductance_H"]))]
    elif "turns_now" in result:
        rows = []
    elif "target_H" not in result:
        rows = [("inductance", henry(result["inductance_H"]))]
    else:
        if result.get("target_is_apparent"):
            at = format_quantity(result["target_frequency_Hz"], "Hz", 4)
            gives = (f"shows {henry(result['target_inductance_at_turns_H'])} at {at} "
                     f"({henry(result['inductance_H'])} at low frequency)")
        else:
            gives = f"gives {henry(result['inductance_H'])}"
        rows = [("wind", turns_word(result["turns"]), gives), ("exact solution", f"{result['turns_exact']:.3f} turns")]
        if result["turns_below"] != result["turns_above"]:
            rows.append(("whole turns either side",
                         f"{turns_word(result['turns_below'])}: {henry(result['inductance_below_H'])}",
                         f"{turns_word(result['turns_above'])}: {henry(result['inductance_above_H'])}"))
    if result.get("max_turns") is not None and "turns_window" not in result:
        fits = (f"up to {henry(result['max_inductance_H'])}" if "max_inductance_H" in result
                else "layer winding" if "le_m" in result else "")
        rows.append(("most that fit", turns_word(result["max_turns"]), fits))
    return rows + [("note", notice) for notice in result.get("notices", [])]


def _winding_rows(result: dict) -> list[tuple[str, ...]]:
    """The winding's shape: diameter, pitch and length; layers and build; the ring or spiral it fills."""
    rows: list[tuple[str, ...]] = []
    if "height_m" in result:
        rows += [("ring", f"{format_length(result['outer_diameter_m'])} OD × "
                          f"{format_length(result['inner_diameter_m'])} ID × {format_length(result['height_m'])} high"),
                 ("one layer holds", turns_word(result["turns_one_layer"]), "on the inside circumference"),
                 ("window holds", turns_word(result["turns_window"]), "layer on layer to the centre (theoretical)")]
        return rows
    if "diameter_m" in result:
        note = "to wire centres"
        if "former_diameter_m" in result:
            note += f" (former {format_length(result['former_diameter_m'])} + wire)"
        rows.append(("coil diameter", format_length(result["diameter_m"]), note))
    if "pitch_m" in result and "style" not in result:
        spaced = "" if "close_wound" not in result else "close wound" if result["close_wound"] else "spaced"
        rows.append(("pitch", format_length(result["pitch_m"]), spaced))
    if "length_m" in result:
        where = "end to end on the former"
        if "position_m" in result:
            where = ("centred on the rod" if result["position_m"] == 0
                     else f"centre {format_length(abs(result['position_m']))} off the rod's centre")
        rows.append(("winding length", format_length(result["length_m"]), where))
    if "max_length_m" in result:
        rows.append(("former length", f"{format_length(result['length_m'])} used",
                     f"of {format_length(result['max_length_m'])} usable"))
    if "length_to_diameter" in result:
        rows.append(("length / diameter", f"{result['length_to_diameter']:.3f}",
                     "current-sheet length N × pitch over diameter"))
    if "style" in result:  # layers of a multilayer coil
        rows += [("layers", str(result["layers"]),
                  f"{result['turns_per_layer']} turns in a full layer, {result['style']}"),
                 ("build", format_length(result["depth_m"]), "radial depth of the winding"),
                 ("outer diameter", format_length(result["outer_diameter_m"]),
                  f"on a {format_length(result['former_diameter_m'])} former"),
                 ("winding width", format_length(result["width_m"]),
                  f"pitch {format_length(result['pitch_m'])}, layer pitch {format_length(result['layer_pitch_m'])}, "
                  f"packing {result['packing']:g}")]
        if "max_depth_m" in result:
            rows.append(("fit", _fit(result["fits"]), f"window depth {format_length(result['max_depth_m'])}"))
    if "radial_pitch_m" in result:
        rows += [("inner diameter", format_length(result["inner_diameter_m"])),
                 ("outer diameter", format_length(result["outer_diameter_m"]),
                  f"radial width {format_length(result['depth_m'])}"),
                 ("radial pitch", format_length(result["radial_pitch_m"]), f"gap {format_length(result['spacing_m'])}")]
        if "max_outer_diameter_m" in result:
            rows.append(("fit", _fit(result["fits"]), f"within {format_length(result['max_outer_diameter_m'])}"))
    if "le_m" in result and "turns_per_layer" in result and result["turns_per_layer"] is not None:
        rows.append(("turns per layer", str(result["turns_per_layer"])))
    return rows


def _copper_rows(result: dict) -> list[tuple[str, ...]]:
    """The wire, the length to cut with its leads, and the DC resistance at 20 °C and at temperature."""
    if "wire" not in result:
        return []
    wire = result["wire"]
    grade = {"bare": "bare wire", "measured": "measured overall"}.get(wire["grade"], f"grade {wire['grade']} enamel")
    lead = result["lead_m"]
    lead_note = (f"{turns_word(result['turns'])} + 2 × {format_length(lead)} leads" if lead > 0
                 else f"{turns_word(result['turns'])}, no lead allowance (add --lead)")
    rows = [("wire", wire["label"], f"{format_length(wire['overall_diameter_m'])} overall, {grade}"),
            ("wire to cut", format_length(result["wire_length_m"]), lead_note)]
    if "wire_per_turn_m" in result:
        rows.append(("wire per turn", format_length(result["wire_per_turn_m"]), "first layer"))
    rows.append(("DC resistance", format_quantity(result["dc_resistance_ohm"], "ohm", 3), "at 20 °C"))
    if result["temperature_C"] != 20.0:
        rows.append(("", format_quantity(result["dc_resistance_at_temperature_ohm"], "ohm", 3),
                     f"at {result['temperature_C']:g} °C"))
    return rows


def _core_rows(result: dict) -> list[tuple[str, ...]]:
    """The core: AL and permeability, its effective parameters or the rod's effect; its figures at frequency."""
    rows: list[tuple[str, ...]] = []
    if "rod_permeability" in result:
        material = (f"µi {result['mu_initial']:.4g}, found from the reading" if "mu_fitted" in result
                    else f"material µi {result['mu_initial']:g}")
        rows += [("rod", f"{format_length(result['rod_length_m'])} × {format_length(result['rod_diameter_m'])}",
                  material),
                 ("rod permeability", f"{result['rod_permeability']:.4g}",
                  "apparent, at the rod's middle (cylinder's demagnetising factor)"),
                 ("without the rod", henry(result["air_inductance_H"]), "the same winding in air (Nagaoka sheet)")]
    elif "le_m" in result and "c1_per_m" not in result:  # a gapped core
        if result.get("gap_m") is not None:
            computed = ", computed" if result.get("mode") in ("choke design", "gap for turns") else ""
            rows.append(("gap", format_length(result["gap_m"]), f"total in the magnetic path{computed}"))
        note = ("from the readings" if result.get("al_from_readings")
                else "with fringing" if result["fringing_factor"] != 1.0 else "no fringing correction")
        rows.append(("AL value", _al(result["al_H"]), note))
        if result["fringing_factor"] != 1.0:
            rows.append(("  without fringing", _al(result["al_no_fringing_H"]),
                         f"McLyman factor {result['fringing_factor']:.3f} (about ±10 % on the correction)"))
        rows += [("effective permeability", f"{result['effective_mu']:.4g}"),
                 ("core Ae, le", f"{result['ae_m2'] * 1e6:.4g} mm²", format_length(result["le_m"]))]
    elif "c1_per_m" in result:  # a ring
        rows += [("AL value", _al(result["al_H"]), result["al_basis"]),
                 ("relative permeability", f"{result['mu_r']:.4g}",
                  "implied by the AL value" if result["mu_r_implied"] else ""),
                 ("effective length le", format_length(result["le_m"]), "IEC 60205"),
                 ("effective area Ae", f"{result['ae_m2'] * 1e6:.4g} mm²", "IEC 60205"),
                 ("effective volume Ve", f"{result['ve_m3'] * 1e9:.4g} mm³", "IEC 60205")]
    if result.get("matching_materials"):
        rows.append(("material classes", ", ".join(result["matching_materials"]),
                     "consistent with the permeability (see coilplan materials)"))
    if "core_q" in result:
        at = format_quantity(result["frequency_Hz"], "Hz", 4)
        reference = result["core_reference_frequency_Hz"]
        where = f"its value at {format_quantity(reference, 'Hz', 4)}" if reference else "its low-frequency value"
        drift = (f"at {at}: {result['core_inductance_ratio']:.2%} of {where}"
                 if abs(result["core_inductance_ratio"] - 1.0) >= 5e-4 else f"at {at}: unchanged from {where}")
        if "target_H" in result and abs(result["core_inductance_ratio"] - 1.0) >= 5e-4:
            drift += ", and the turns allow for it"
        dilution = f" × dilution {result['core_dilution']:.3g}" if result["core_dilution"] < 0.995 else ""
        rows += [("core permeability", f"{result['core_permeability']:.4g}", drift),
                 ("core loss", format_quantity(result["core_loss_resistance_ohm"], "ohm", 3),
                  f"in series: loss tangent {result['core_loss_tangent']:.3g}{dilution}, {result['core_loss_basis']}")]
    return rows


def _frequency_heading(result: dict) -> str:
    if "q" in result:
        return f"At {format_quantity(result['frequency_Hz'], 'Hz', 4)}"
    return "Self-resonance"


def _frequency_rows(result: dict) -> list[tuple[str, ...]]:
    """Self-capacitance and self-resonance; at the operating frequency the apparent L, AC resistance and Q."""
    if "self_capacitance_F" not in result:
        return []
    source = "measured, as given" if result.get("self_capacitance_source") == "given" else "estimate"
    note = source
    if source == "estimate" and "turns_one_layer" in result:  # a toroid
        note = "rough estimate, turn to turn only, likely low: measure it (coilplan tank --resonance) if it matters"
    if "medhurst_self_capacitance_F" in result and source == "estimate":
        note = (f"Knight, former permittivity {result.get('former_permittivity', 1.0):g}; Medhurst's table gives "
                f"{format_quantity(result['medhurst_self_capacitance_F'], 'F', 3)} (solid polystyrene formers)")
    if not result["self_capacitance_F"] > 0:  # one layer of a layered winding: no layer-to-layer term
        rows = [("self-capacitance", "not estimated", "a single layer: the layer-to-layer estimate gives none")]
    else:
        rows = [("self-capacitance", format_quantity(result["self_capacitance_F"], "F", 3), note),
                ("self-resonance", format_quantity(result["srf_Hz"], "Hz", 3), "with that self-capacitance alone")]
    if "q" not in result:
        return rows
    if result["apparent_inductance_H"] != result["apparent_inductance_H"]:  # NaN: above the SRF
        return [*rows, ("apparent inductance", "above self-resonance", "the coil is a capacitor there")]
    rows += [("apparent inductance", henry(result["apparent_inductance_H"])),
             ("AC resistance", format_quantity(result["ac_resistance_ohm"], "ohm", 3),
              "copper: skin and proximity effect")]
    cored = "al_H" in result or "rod_permeability" in result
    if "core_q" in result:
        rows.append(("Q", f"{result['q']:.0f}",
                     f"ωL/R: copper alone {result['copper_q']:.0f}, core alone {result['core_q']:.0f}"))
    elif cored:
        rows.append(("copper Q", f"{result['q']:.0f}",
                     "ωL/R of the copper alone; the core's loss is not estimated (give --material, or --loss-factor "
                     "tanδ/µi@f from the core's data sheet), so the coil's Q is lower"))
    else:
        rows.append(("Q", f"{result['q']:.0f}", "ωL/R of the copper alone"))
    if result.get("srf_fraction", 0) >= 0.1:
        rows.append(("", f"{result['q_terminals']:.0f}", "at the terminals, lowered by the self-capacitance"))
    return rows


def _drive_rows(result: dict) -> list[tuple[str, ...]]:
    """The peak flux density the drive gives, the copper's current density, and the margin to saturation."""
    if "saturation_margin" not in result:
        return []
    rows: list[tuple[str, ...]] = []
    limit = result["saturation_flux_density_T"]
    parts = []
    if result["current_A"]:
        parts.append(f"{format_quantity(result['current_A'], 'A', 3)} DC")
    if result["ac_current_A"]:
        parts.append(f"{format_quantity(result['ac_current_A'], 'A', 3)} peak AC")
    if result.get("ac_voltage_V"):
        parts.append(f"{format_quantity(result['ac_voltage_V'], 'V', 3)} RMS")
    if parts:
        rows += [("peak flux density", format_quantity(result["flux_density_T"], "T", 3), " + ".join(parts)),
                 ("current density", f"{result['current_density_A_per_mm2']:.3g} A/mm²", "RMS in the copper")]
    if limit == 0:
        rows.append(("saturates at", "0 T", f"at {result['temperature_C']:g} °C the core is past its Curie point: "
                                            "it carries no flux and gives no inductance of its own"))
    elif limit:
        rows.append(("saturates at", format_quantity(limit, "T", 3), f"at {result['temperature_C']:g} °C"))
        if parts:
            margin = result["saturation_margin"]
            rows.append(("margin", f"{margin:.0%}", "below saturation" if margin > 0 else "PAST SATURATION"))
        rows.append(("largest DC current", format_quantity(result["max_current_A"], "A", 3),
                     "before saturation at these turns"))
    elif parts:
        rows.append(("saturates at", "unknown", "give --material or --bsat for the margin"))
    return rows


def _model_rows(result: dict) -> list[tuple[str, ...]]:
    """The method and its accuracy, the figures beside it, and the model's calibration."""
    rows: list[tuple[str, ...]] = []
    if "method" in result:
        rows += [("method", result["method"], result["method_note"]), ("accuracy", result["method_accuracy"])]
    if "nagaoka" in result:
        rows.append(("Nagaoka coefficient", f"{result['nagaoka']:.5f}"))
    if "wheeler_inductance_H" in result:
        if result["method"] == "filament":
            rows.append(("Wheeler's formula", henry(result["wheeler_inductance_H"]),
                         f"{result['wheeler_difference']:+.2%} from the exact sum (an approximation)"))
        else:
            rows.append(("exact sum", henry(result["exact_inductance_H"]),
                         f"Wheeler differs by {result['wheeler_difference']:+.2%} from it"))
    if "rod_permeability" in result and not result.get("calibrated"):
        rows.append(("model", "uncalibrated", "rough: tens of percent; add --measured L@N from a test winding"))
    elif "model_factor" in result and ("readings" in result or result.get("calibrated")):
        residuals = result.get("measured_residuals") or result.get("residuals") or []
        shown = ", ".join(f"{value:+.2%}" for value in residuals)
        rows.append(("calibrated", f"× {result['model_factor']:.4f}",
                     f"the model scaled to the readings; residuals {shown}" if shown
                     else "the model scaled to the readings"))
    return rows


def _al(value: float) -> str:
    return f"{format_quantity(value, 'H', 4)} per turn²"


def _fit(fits) -> str:
    return {None: "no limit given", True: "fits", False: "does NOT fit"}[fits]


_SECTIONS = (
    ("From the readings", _measured_rows),
    ("To wind", _wind_rows),
    ("The winding", _winding_rows),
    ("The copper", _copper_rows),
    ("The core", _core_rows),
    (_frequency_heading, _frequency_rows),
    ("Current and saturation", _drive_rows),
    ("The model", _model_rows),
)
