"""Rows of a measured coil (the answer's "as measured" part, the trim log) and the inductance in words."""

from __future__ import annotations

from coilplan.quantities import format_quantity
from coilplan.report.text import turns_word

__all__ = ["henry", "rewind_rows", "target_text"]


def henry(value: float) -> str:
    """An inductance to four significant digits."""
    return format_quantity(value, "H", 4)


def target_text(result: dict) -> str:
    """The target in words: ``10.00 μH``, or ``10.00 μH at 7.000 MHz`` when it is an apparent value there."""
    if result.get("target_is_apparent"):
        return f"{henry(result['target_H'])} at {format_quantity(result['target_frequency_Hz'], 'Hz', 4)}"
    return henry(result["target_H"])


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
