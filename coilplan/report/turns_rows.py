"""Rows that every form's report starts with: the turns to wind and what they give."""

from __future__ import annotations

from coilplan.quantities import format_quantity

__all__ = ["henry", "turns_rows"]


def henry(value: float) -> str:
    """An inductance to four significant digits."""
    return format_quantity(value, "H", 4)


def turns_rows(result: dict) -> list[tuple[str, ...]]:
    """The answer rows: forward (inductance) or inverse (turns, exact solution, neighbours).

    Examples
    --------
    >>> turns_rows({"turns": 3, "inductance_H": 1e-6})
    [('inductance', '1.000 μH')]
    """
    if "target_H" not in result:
        return [("inductance", henry(result["inductance_H"]))]
    rows = [("wind", f"{result['turns']} turns", f"gives {henry(result['inductance_H'])}"),
            ("exact solution", f"{result['turns_exact']:.3f} turns")]
    if result["turns_below"] != result["turns_above"]:
        rows.append(("whole turns either side",
                     f"{result['turns_below']} turns: {henry(result['inductance_below_H'])}",
                     f"{result['turns_above']} turns: {henry(result['inductance_above_H'])}"))
    return rows
