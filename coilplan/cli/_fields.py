"""The library's field names as the command line's options: the one map between the two.

The library raises :class:`~coilplan.errors.InvalidInputError` naming the field it checked
(``target``, ``readings``); the command line shows the option the user typed for it.
"""

from __future__ import annotations

from coilplan.errors import InvalidInputError

__all__ = ["FIELD_OPTIONS", "in_option_words"]

#: field of a request or a form -> the option that sets it
FIELD_OPTIONS = {
    "turns": "--turns",
    "target": "--target",
    "tuning": "--target-frequency",
    "frequency": "--at",
    "readings": "--measured",
    "meter_frequency": "--meter-freq",
    "tolerance": "--tolerance",
    "self_capacitance": "--self-capacitance",
    "turns_uncertainty": "--turns-uncertainty",
    "measured_q": "--measured-q",
    "loss_factor": "--loss-factor",
    "dc_current": "--current",
    "ac_current": "--ac-current",
    "ac_voltage": "--ac-voltage",
    "mu": "--mu",
    "gap": "--gap",
    "flux_limit": "--max-flux",
    "former_diameter": "--former",
}


def in_option_words(error: InvalidInputError) -> InvalidInputError:
    """The error with its field named as the option that sets it (an option name is kept as it is)."""
    option = FIELD_OPTIONS.get(error.option)
    if option is None:
        return error
    return InvalidInputError(option, error.expected, error.got)
