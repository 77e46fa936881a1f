"""Input checks shared by the forms; each raises InvalidInputError naming the form's field."""

from __future__ import annotations

import math
import warnings

import numpy as np

from coilplan.errors import InvalidInputError, OutsideValidityWarning

__all__ = ["between_whole_turns", "outside_stated_range", "positive"]


def positive(value: float | None, field: str, what: str) -> None:
    """Accept None or a finite value above zero; otherwise name the field."""
    if value is not None and not (math.isfinite(value) and value > 0):
        raise InvalidInputError(field, f"{what} above zero", value)


def between_whole_turns(turns, value_at):
    """A whole-turn quantity made continuous for the root finder: exact at whole N, linear between.

    ``value_at(n)`` gives the value at a whole number of turns n >= 1 (callers cache it when it
    is costly); ``turns`` may be any float array, and N < 1 takes the value at one turn.
    """
    turns = np.asarray(turns, dtype=float)
    flat = np.atleast_1d(turns).ravel()
    low = np.maximum(np.floor(flat), 1.0)
    fraction = np.where(flat > low, flat - low, 0.0)
    value_low = np.array([value_at(int(n)) for n in low])
    # N + 1 only where it counts: at a whole N it would be multiplied by zero (and may be a costly sum)
    value_high = np.array([value_at(int(n) + 1) if part else value for n, part, value
                           in zip(low, fraction, value_low, strict=True)])
    result = (value_low + fraction * (value_high - value_low)).reshape(turns.shape)
    return result[()] if turns.ndim == 0 else result


def outside_stated_range(approximation, turns) -> bool:
    """Whether ``approximation(turns)`` gives its own OutsideValidityWarning (caught, not shown).

    The forms word that warning for the user; the physics function keeps the one statement of its range.
    """
    with warnings.catch_warnings(record=True) as caught:
        warnings.simplefilter("always")
        approximation(turns)
    return any(issubclass(w.category, OutsideValidityWarning) for w in caught)
