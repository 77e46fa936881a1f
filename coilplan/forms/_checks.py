"""Input checks shared by the forms; each raises InvalidInputError naming the option."""

from __future__ import annotations

import math

from coilplan.errors import InvalidInputError

__all__ = ["positive"]


def positive(value: float | None, option: str, what: str) -> None:
    """Accept None or a finite value above zero; otherwise name the option."""
    if value is not None and not (math.isfinite(value) and value > 0):
        raise InvalidInputError(option, f"{what} above zero", value)
