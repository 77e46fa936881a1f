"""The answer for a winding on a closed core of unknown geometry: the turns to add or remove, from readings."""

from __future__ import annotations

from coilplan.errors import InvalidInputError
from coilplan.forms import ClosedCore
from coilplan.results._common import Measured, turns_block

__all__ = ["closed_result"]


def closed_result(form: ClosedCore, *, turns: int | None = None, target: float | None = None,
                  temperature_C: float = 20.0, measured: Measured | None = None,
                  frequency: float | None = None, drive=None) -> dict:
    """Turns to add or remove on a coil whose core follows L = AL·N² (+ L0), from its readings.

    Returns
    -------
    dict
        :func:`coilplan.rewind_answer.rewind_fields` plus ``al_H``, ``offset_H`` and, with a wire and a turn
        length, ``resistance_change_ohm``.
    """
    if measured is None or target is None:
        raise InvalidInputError("readings", "readings of the coil and a target: a core of unknown geometry is "
                                "known only by what the meter showed", None)
    result = turns_block(form, turns=None, target=target, measured=measured, frequency=frequency)
    result["al_H"] = form.al
    result["offset_H"] = form.offset
    if form.wire is not None and form.turn_length is not None:
        result["resistance_change_ohm"] = float(form.resistance(result["turns"], temperature_C)
                                                - form.resistance(result["turns_now"], temperature_C))
    return result
