"""The library's field names as the command line's options: the one map between the two.

The library raises :class:`~coilplan.errors.InvalidInputError` naming the field or parameter it checked
(``target``, ``readings``, ``inner_diameter``); the command line shows the option the user typed for it.
Most fields are set by the same option in every command (:data:`FIELD_OPTIONS`); where commands set one
field with different options, :data:`COMMAND_OPTIONS` says which, command by command. The boundary in
:mod:`coilplan.cli` applies :func:`in_option_words` with the name of the command that ran.
"""

from __future__ import annotations

from coilplan.errors import InfeasibleError, InvalidInputError

__all__ = ["COMMAND_OPTIONS", "FIELD_OPTIONS", "in_option_words", "option_for"]

#: field of a request, a form or a library function -> the option that sets it in every command
FIELD_OPTIONS = {
    # the request (coilplan.request) and what every form command shares
    "turns": "--turns",
    "target": "--target",
    "tuning": "--target-frequency",
    "frequency": "--at",
    "readings": "--measured",
    "meter_frequency": "--meter-freq",
    "tolerance": "--tolerance",
    "spread": "--spread",
    "self_capacitance": "--self-capacitance",
    "turns_uncertainty": "--turns-uncertainty",
    "temperature": "--temperature",
    "measured_q": "--measured-q",
    "loss_factor": "--loss-factor",
    "dc_current": "--current",
    "ac_current": "--ac-current",
    "ac_voltage": "--ac-voltage",
    "peak_current": "--current",
    "flux_limit": "--max-flux",
    "material": "--material",
    "wire": "--wire",
    "grade": "--grade",
    "overall": "--overall",
    "lead": "--lead",
    "plot": "--plot",
    # the forms (coilplan.forms)
    "diameter": "--diameter",
    "former_diameter": "--former",
    "former_permittivity": "--former-permittivity",
    "pitch": "--pitch",
    "length": "--length",
    "max_length": "--max-length",
    "method": "--method",
    "width": "--width",
    "max_depth": "--max-depth",
    "packing": "--packing",
    "style": "--style",
    "spacing": "--spacing",
    "height": "--height",
    "chamfer": "--chamfer",
    "layers": "--layers",
    "al": "--al",
    "mu_r": "--mu",
    "mu_initial": "--mu",
    "rod_length": "--rod-length",
    "rod_diameter": "--rod-diameter",
    "coil_length": "--coil-length",
    "position": "--position",
    "ae": "--ae",
    "le": "--le",
    "gap": "--gap",
    "window_width": "--window-width",
    "window_depth": "--window-depth",
    "turn_length": "--turn-length",
    "offset": "--offset",
    # wire (coilplan.wire)
    "series": "--series",
    "density": "--density",
    "density_A_per_mm2": "--density",
    # tuned circuits (coilplan.tank and coilplan.tank_*)
    "inductance": "--inductance",
    "capacitance": "--capacitance",
    "band": "--band",
    "capacitor": "--capacitor",
    "stray": "--stray",
    "padder": "--padder",
    "points": "--resonance",
    "power": "--power",
    "q": "--q",
    # unknown turn counts (coilplan.turn_count and coilplan.turn_count_*)
    "before": "--before",
    "after": "--after",
    "added": "--added",
    "test_winding": "--test-winding",
    "test_inductance": "--test-winding",
    "test_turns": "--test-winding",
    "unknown_inductance": "--unknown",
    "resistance": "--resistance",
    "lead_resistance": "--lead-resistance",
    "inner_perimeter": "--inner-perimeter",
    "outer_perimeter": "--outer-perimeter",
    "resistance_tolerance": "--resistance-tolerance",
    "diameter_tolerance": "--diameter-tolerance",
    "length_tolerance": "--length-tolerance",
}

#: command -> the fields it sets with an option of its own (over :data:`FIELD_OPTIONS`)
COMMAND_OPTIONS = {
    "toroid": {"inner_diameter": "--id", "outer_diameter": "--od"},
    "spiral": {"inner_diameter": "--inner", "outer_diameter": "--outer"},
    "tank": {"frequency": "--frequency"},
}


def option_for(field: str, command: str | None = None) -> str:
    """The option that sets ``field`` in ``command``; ``"a or b"`` maps each; anything else is kept as it is.

    >>> option_for("inner_diameter", "toroid"), option_for("inner_diameter", "spiral")
    ('--id', '--inner')
    >>> option_for("capacitance or frequency", "tank"), option_for("--out", "kit")
    ('--capacitance or --frequency', '--out')
    """
    own = COMMAND_OPTIONS.get(command or "", {})
    return " or ".join(own.get(name) or FIELD_OPTIONS.get(name, name) for name in field.split(" or "))


def in_option_words(error: InvalidInputError | InfeasibleError,
                    command: str | None = None) -> InvalidInputError | InfeasibleError:
    """The error with its field named as the option that sets it in ``command``.

    An option name is kept as it is, and so is an error of a file (a plan or a log names its own keys).
    """
    if error.option is None or type(error) not in (InvalidInputError, InfeasibleError):
        return error
    option = option_for(error.option, command)
    if option == error.option:
        return error
    if isinstance(error, InfeasibleError):
        return InfeasibleError(error.message, option=option, achievable=error.achievable)
    return InvalidInputError(option, error.expected, error.got)
