"""Plain-text building blocks: aligned label/value rows and bulleted notes."""

from __future__ import annotations

import unicodedata
from collections.abc import Iterable, Sequence

__all__ = ["aligned_rows", "bullet_lines", "printable", "turns_word"]


def aligned_rows(rows: Iterable[Sequence[str]], indent: int = 2) -> list[str]:
    """Align rows of cells into columns; the last cell of a row may be ragged.

    Examples
    --------
    >>> for line in aligned_rows([("turns", "38"), ("inductance", "10.20 μH", "(at 38 turns)")]):
    ...     print(line)
      turns       38
      inductance  10.20 μH  (at 38 turns)
    """
    rows = [tuple(row) for row in rows]
    if not rows:
        return []
    columns = max(len(row) for row in rows)
    widths = [0] * columns
    for row in rows:
        for index, cell in enumerate(row[:-1]):
            widths[index] = max(widths[index], len(cell))
    lines = []
    for row in rows:
        cells = [cell.ljust(widths[index]) for index, cell in enumerate(row[:-1])]
        cells.append(row[-1])
        lines.append((" " * indent + "  ".join(cells)).rstrip())
    return lines


def bullet_lines(title: str, items: Sequence[str]) -> list[str]:
    """A titled list of notes (warnings, cautions); nothing when there are none.

    Examples
    --------
    >>> print("\\n".join(bullet_lines("warnings", ["pitch is wide"])))
    warnings:
      - pitch is wide
    """
    if not items:
        return []
    return [f"{title}:"] + [f"  - {item}" for item in items]


def turns_word(count) -> str:
    """A whole number of turns in words: ``1 turn``, ``2 turns``.

    Examples
    --------
    >>> turns_word(1), turns_word(40)
    ('1 turn', '40 turns')
    """
    return f"{count} turn" if count == 1 else f"{count} turns"


def printable(text: str) -> str:
    r"""Text from a user's file as one printable line: control characters (a newline, an escape) shown escaped.

    Examples
    --------
    >>> print(printable("coil\nA\x1b[31m"))
    coil\nA\x1b[31m
    """
    return "".join(repr(char)[1:-1] if unicodedata.category(char).startswith("C") else char for char in text)
