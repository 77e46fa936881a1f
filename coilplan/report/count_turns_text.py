"""Text report of ``coilplan count-turns`` (from :meth:`coilplan.turn_count.TurnCount.as_dict`)."""

from __future__ import annotations

import math

from coilplan.report.text import aligned_rows, turns_word
from coilplan.turn_count_estimate import METHOD_LABELS

__all__ = ["count_turns_lines"]


def _range(turns_range: list) -> str:
    low, high = turns_range
    return f"{low} or more" if high is None else f"{low} to {high}"


def _spread(relative: float | None) -> str:
    if relative is None or not math.isfinite(relative):
        return "unbounded"
    return f"±{relative * 100:.1f} %"


def count_turns_lines(result: dict) -> list[str]:
    """The answer, a row per method, why the strongest is, the arithmetic and the assumptions.

    Examples
    --------
    >>> from coilplan.turn_count import count_turns
    >>> lines = count_turns_lines(count_turns(test_winding=(55e-6, 20), unknown_inductance=1.375e-3).as_dict())
    >>> print(lines[0])
    turn count: about 100 turns (99 to 101), by test winding
    """
    label = METHOD_LABELS[result["method"]]
    lines = [f"turn count: about {turns_word(result['turns'])} ({_range(result['turns_range'])}), by {label}"]
    rows = [("method", "turns", "range", "±")]
    for method in result["methods"]:
        rows.append((METHOD_LABELS[method["method"]], str(method["turns"]), _range(method["turns_range"]),
                     _spread(method["relative_uncertainty"])))
    lines += aligned_rows(rows)
    lines += ["", f"strongest: {result['reason']}", "", "how each was worked out:"]
    lines += [f"  - {METHOD_LABELS[method['method']]}: {method['explanation']}" for method in result["methods"]]
    if result["assumptions"]:
        lines += ["", "assumed:"] + [f"  - {note}" for note in result["assumptions"]]
    return lines
