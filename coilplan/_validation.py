"""Pydantic validation errors in the house's one-line shape: where, what is wrong, what was given."""

from __future__ import annotations

from dataclasses import dataclass

__all__ = ["Problem", "first_problem"]


@dataclass(frozen=True)
class Problem:
    """The first problem of a pydantic ``ValidationError``, in parts the callers place.

    Attributes
    ----------
    location : tuple
        pydantic's ``loc`` of the first problem.
    message : str
        Its message, first letter in lower case, pydantic's "Value error, " prefix dropped.
    got : str
        `` (got 'value')`` when a plain value was given (cut to 40 characters), else "".
    more : str
        ``; and N more problem(s)`` when there were others, else "".
    """

    location: tuple
    message: str
    got: str
    more: str


def first_problem(error) -> Problem:
    """The first problem of ``error`` (a ``pydantic.ValidationError``) as a :class:`Problem`."""
    items = error.errors(include_url=False)
    first = items[0]
    message = first["msg"].removeprefix("Value error, ")
    message = message[:1].lower() + message[1:]
    got = ""
    if "input" in first and not isinstance(first["input"], (dict, list, tuple)) and first["type"] != "missing":
        shown = repr(first["input"])
        got = f" (got {shown[:37] + '...' if len(shown) > 40 else shown})"
    more = f"; and {len(items) - 1} more problem{'s' if len(items) > 2 else ''}" if len(items) > 1 else ""
    return Problem(tuple(first["loc"]), message, got, more)
