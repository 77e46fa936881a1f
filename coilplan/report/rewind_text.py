"""Text report of ``coilplan rewind`` (a closed core, from readings alone)."""

from __future__ import annotations

from coilplan.quantities import format_quantity
from coilplan.report.text import aligned_rows, turns_word
from coilplan.report.turns_rows import henry, rewind_rows

__all__ = ["rewind_lines"]


def rewind_lines(result: dict) -> list[str]:
    """The rewind answer, the readings with their residuals, and the fitted AL (and lead offset)."""
    rows = rewind_rows(result)
    rows.append(("AL value", f"{format_quantity(result['al_H'], 'H', 4)} per turn²", "fitted, L = AL·N²"))
    if result["offset_H"]:
        rows.append(("leads", henry(result["offset_H"]), "fitted series part, L = AL·N² + L0"))
    for reading, residual in zip(result["readings"], result["residuals"], strict=True):
        rows.append(("reading", f"{henry(reading['inductance_H'])} at {turns_word(reading['turns'])}",
                     f"{residual:+.2%} off the fit"))
    for notice in result.get("notices", []):
        rows.append(("note", notice))
    if "resistance_change_ohm" in result:
        rows.append(("resistance change", format_quantity(result["resistance_change_ohm"], "ohm", 3)))
    title = f"Measured coil on a closed core, to {henry(result['target_H'])}"
    return [title, "", *aligned_rows(rows)]
