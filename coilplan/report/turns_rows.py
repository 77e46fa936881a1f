"""Rows that every form's report starts with: the turns to wind and what they give."""

from __future__ import annotations

from coilplan.quantities import format_length, format_quantity
from coilplan.report.text import turns_word

__all__ = ["frequency_rows", "henry", "rewind_rows", "target_text", "turns_rows", "winding_rows"]


def henry(value: float) -> str:
    """An inductance to four significant digits."""
    return format_quantity(value, "H", 4)


def target_text(result: dict) -> str:
    """The target in words: ``10.00 μH``, or ``10.00 μH at 7.000 MHz`` when it is an apparent value there."""
    if result.get("target_is_apparent"):
        return f"{henry(result['target_H'])} at {format_quantity(result['target_frequency_Hz'], 'Hz', 4)}"
    return henry(result["target_H"])


def turns_rows(result: dict) -> list[tuple[str, ...]]:
    """The answer rows: forward (inductance) or inverse (turns, exact solution, neighbours).

    Examples
    --------
    >>> turns_rows({"turns": 3, "inductance_H": 1e-6})
    [('inductance', '1.000 μH')]
    """
    if "target_H" not in result:
        return [("inductance", henry(result["inductance_H"]))]
    if "turns_now" in result:
        return rewind_rows(result)
    if result.get("target_is_apparent"):
        at = format_quantity(result["target_frequency_Hz"], "Hz", 4)
        rows = [("wind", f"{turns_word(result['turns'])}",
                 f"shows {henry(result['target_inductance_at_turns_H'])} at {at} "
                 f"({henry(result['inductance_H'])} at low frequency)"),
                ("exact solution", f"{result['turns_exact']:.3f} turns")]
    else:
        rows = [("wind", f"{turns_word(result['turns'])}", f"gives {henry(result['inductance_H'])}"),
                ("exact solution", f"{result['turns_exact']:.3f} turns")]
    if result["turns_below"] != result["turns_above"]:
        rows.append(("whole turns either side",
                     f"{turns_word(result['turns_below'])}: {henry(result['inductance_below_H'])}",
                     f"{turns_word(result['turns_above'])}: {henry(result['inductance_above_H'])}"))
    rows += [("note", notice) for notice in result.get("notices", [])]
    return rows


def _change(step: int) -> str:
    if step == 0:
        return "no change"
    return f"{'remove' if step < 0 else 'add'} {abs(step)} turn{'s' if abs(step) != 1 else ''}"


def rewind_rows(result: dict) -> list[tuple[str, ...]]:
    """The answer rows for a measured coil: now, the change, the range, the words and the plan."""
    low, high = result["turns_range"]
    span = ("n/a" if low is None or high is None
            else f"{turns_word(low)}" if low == high else f"{low} to {turns_word(high)}")
    basis = f"±{result['uncertainty']:.1%} on the calibrated model"
    if result["tolerance_assumed"]:
        basis += " (meter tolerance assumed)"
    rows = [
        ("now", f"{turns_word(result['turns_now'])}"),
        ("change", _change(result["turns_change"]), f"to {turns_word(result['turns'])}"),
        ("expect", henry(result["inductance_H"]), f"at {turns_word(result['turns'])}"),
    ]
    if result.get("apparent_inductance_H") and result["apparent_inductance_H"] != result["inductance_H"]:
        rows.append(("", henry(result["apparent_inductance_H"]), "apparent, at the operating frequency"))
    rows += [
        ("exact solution", f"{result['turns_exact']:.2f} turns"),
        ("range", span, basis),
    ]
    if result.get("wire_change_m") is not None and result["wire_change_m"] == result["wire_change_m"]:
        rows.append(("wire change", f"{abs(result['wire_change_m']) * 1e3:.0f} mm",
                     "comes off" if result["wire_change_m"] < 0 else "more to wind on"))
    rows.append(("how", result["explanation"]))
    for index, step in enumerate(result["plan"], start=1):
        rows.append((f"step {index}" if len(result["plan"]) > 1 else "plan", step))
    return rows


def frequency_rows(result: dict) -> list[tuple[str, ...]]:
    """Self-capacitance, self-resonance and, at the operating frequency, apparent L, AC resistance and Q."""
    if "self_capacitance_F" not in result:
        return []
    source = "measured, as given" if result.get("self_capacitance_source") == "given" else "estimate"
    note = source
    if source == "estimate" and "turns_one_layer" in result:  # a toroid
        note = "rough estimate, turn to turn only, likely low: measure it (coilplan tank --resonance) if it matters"
    if "medhurst_self_capacitance_F" in result and source == "estimate":
        permittivity = result.get("former_permittivity", 1.0)
        note = (f"Knight, former permittivity {permittivity:g}; Medhurst's table gives "
                f"{format_quantity(result['medhurst_self_capacitance_F'], 'F', 3)} (solid polystyrene formers)")
    if not result["self_capacitance_F"] > 0:  # one layer of a layered winding: no layer-to-layer term
        rows = [("self-capacitance", "not estimated", "a single layer: the layer-to-layer estimate gives none")]
    else:
        rows = [("self-capacitance", format_quantity(result["self_capacitance_F"], "F", 3), note),
                ("self-resonance", format_quantity(result["srf_Hz"], "Hz", 3), "with that self-capacitance alone")]
    if "frequency_Hz" in result and "q" in result:
        at = format_quantity(result["frequency_Hz"], "Hz", 4)
        below = result["apparent_inductance_H"] == result["apparent_inductance_H"]  # NaN above the SRF
        if not below:
            rows.append((f"at {at}", "above self-resonance", "the coil is a capacitor there"))
            return rows
        rows.append((f"at {at}", henry(result["apparent_inductance_H"]), "apparent inductance"))
        rows.append(("AC resistance", format_quantity(result["ac_resistance_ohm"], "ohm", 3),
                     f"copper at {at}: skin and proximity effect"))
        rows += _core_rows(result, at)
        if result.get("srf_fraction", 0) >= 0.1:
            rows.append(("", f"{result['q_terminals']:.0f}", "at the terminals, lowered by the self-capacitance"))
    return rows


def _core_rows(result: dict, at: str) -> list[tuple[str, ...]]:
    """The core at the operating frequency, and the Q: copper, core and the whole coil."""
    cored = "al_H" in result or "rod_permeability" in result
    if not cored:
        return [("Q", f"{result['q']:.0f}", "ωL/R of the copper alone")]
    if "core_q" not in result:
        return [("copper Q", f"{result['q']:.0f}",
                 "ωL/R of the copper alone; the core's loss is not estimated (give --material, or --loss-factor "
                 "tanδ/µi@f from the core's data sheet), so the coil's Q is lower")]
    reference = result["core_reference_frequency_Hz"]
    where = f"its value at {format_quantity(reference, 'Hz', 4)}" if reference else "its low-frequency value"
    return [
        ("core permeability", f"{result['core_permeability']:.4g}",
         f"at {at}: {result['core_inductance_ratio']:.2%} of {where}, and the turns allow for it"
         if abs(result["core_inductance_ratio"] - 1.0) >= 5e-4 else f"at {at}: unchanged from {where}"),
        ("core loss", format_quantity(result["core_loss_resistance_ohm"], "ohm", 3),
         f"in series: loss tangent {result['core_loss_tangent']:.3g}"
         + (f" × dilution {result['core_dilution']:.3g}" if result["core_dilution"] < 0.995 else "")
         + f", {result['core_loss_basis']}"),
        ("Q", f"{result['q']:.0f}", f"ωL/R: copper alone {result['copper_q']:.0f}, core alone {result['core_q']:.0f}"),
    ]


def winding_rows(result: dict) -> list[tuple[str, ...]]:
    """The wire, the wire to cut (with its leads) and the DC resistance, at 20 °C and at temperature."""
    wire = result["wire"]
    grade = {"bare": "bare wire", "measured": "measured overall"}.get(
        wire["grade"], f"grade {wire['grade']} enamel")
    lead = result["lead_m"]
    lead_note = (f"{turns_word(result['turns'])} + 2 × {format_length(lead)} leads" if lead > 0
                 else f"{turns_word(result['turns'])}, no lead allowance (add --lead)")
    rows = [
        ("wire", wire["label"], f"{format_length(wire['overall_diameter_m'])} overall, {grade}"),
        ("wire to cut", format_length(result["wire_length_m"]), lead_note),
        ("DC resistance", format_quantity(result["dc_resistance_ohm"], "ohm", 3), "at 20 °C"),
    ]
    if result["temperature_C"] != 20.0:
        rows.append(("", format_quantity(result["dc_resistance_at_temperature_ohm"], "ohm", 3),
                     f"at {result['temperature_C']:g} °C"))
    return rows
