"""Input checks shared by the forms; each raises InvalidInputError naming the option."""

from __future__ import annotations

import math

import numpy as np

from coilplan.errors import InvalidInputError

__all__ = ["between_whole_turns", "positive"]


def positive(value: float | None, option: str, what: str) -> None:
    """Accept None or a finite value above zero; otherwise name the option."""
    if value is not None and not (math.isfinite(value) and value > 0):
        raise InvalidInputError(option, f"{what} above zero", value)


def between_whole_turns(turns, value_at):
    """A whole-turn quantity made continuous for the root finder: exact at whole N, linear between.

    ``value_at(n)`` gives the value at a whole number of turns n >= 1 (callers cache it when it
    is costly); ``turns`` may be any float array, and N < 1 takes the value at one turn.
    """
    turns = np.asarray(turns, dtype=float)
    flat = np.atleast_1d(turns).ravel()
    low = np.maximum(np.floor(flat), 1.0)
    value_low = np.array([value_at(int(n)) for n in low])
    value_high = np.array([value_at(int(n) + 1) for n in low])
    result = (value_low + (flat - low) * (value_high - value_low)).reshape(turns.shape)
    return result[()] if turns.ndim == 0 else result
