"""The whole answer for a single-layer solenoid."""

from __future__ import annotations

import math

from coilplan.apparent import frequency_fields
from coilplan.forms import SOLENOID_METHODS, Solenoid
from coilplan.physics.solenoid import nagaoka_coefficient
from coilplan.results._common import Measured, turns_block, wire_fields
from coilplan.results._common import given_capacitance as _given_capacitance

__all__ = ["solenoid_result"]


def solenoid_result(form: Solenoid, *, turns: int | None = None, target: float | None = None,
                    temperature_C: float = 20.0, measured: Measured | None = None,
                    frequency: float | None = None, drive=None) -> dict:
    """Forward (``turns``) or inverse (``target``) answer for a single-layer solenoid.

    Parameters
    ----------
    form : Solenoid
        The coil form.
    turns : int, optional
        Whole number of turns (forward). Exactly one of ``turns`` and ``target``.
    target : float, optional
        Target low-frequency inductance, H (inverse).
    temperature_C : float
        Temperature for the second DC resistance figure, °C.
    measured : Measured, optional
        Readings of the coil as it is (``form`` then is the calibrated model): the answer
        is the turns to add or remove.
    frequency : float, optional
        Operating frequency, Hz: the target is the apparent inductance there, and the
        result gains the self-capacitance, SRF, AC resistance and Q (see
        :func:`coilplan.apparent.frequency_fields`).

    Returns
    -------
    dict
        ``turns`` (int), ``inductance_H``, ``diameter_m`` (to wire centres),
        ``pitch_m``, ``length_m`` (winding, end to end), ``sheet_length_m``,
        ``length_to_diameter``, ``nagaoka``, ``wire_length_m``,
        ``dc_resistance_ohm`` (20 °C), ``dc_resistance_at_temperature_ohm``,
        and for an inverse ``target_H``, ``turns_exact``, ``turns_below``,
        ``turns_above``, ``inductance_below_H``, ``inductance_above_H``.

    Raises
    ------
    InfeasibleError
        The target cannot be reached within the form's limits, or the turns
        do not fit.
    """
    if (turns is None) == (target is None):
        raise ValueError("give exactly one of turns and target")
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    form.validity_warnings(chosen)
    sheet = float(form.sheet_length(chosen))
    pitch = float(form.pitch_at(chosen))
    result.update(
        inductance_H=float(form.inductance(chosen)),
        diameter_m=form.diameter,
        pitch_m=pitch,
        close_wound=bool(math.isclose(pitch, form.wire.overall_diameter, rel_tol=1e-9)),
        length_m=float(form.winding_length(chosen)),
        sheet_length_m=sheet,
        length_to_diameter=sheet / form.diameter,
        nagaoka=float(nagaoka_coefficient(form.diameter / sheet)),
        wire_length_m=float(form.wire_length(chosen)),
        lead_m=form.lead,
        dc_resistance_ohm=float(form.resistance(chosen, 20.0)),
        temperature_C=float(temperature_C),
        dc_resistance_at_temperature_ohm=float(form.resistance(chosen, temperature_C)),
        method=form.method,
        model_factor=getattr(form, "factor", 1.0),
        method_note=SOLENOID_METHODS[form.method][0],
        method_accuracy=SOLENOID_METHODS[form.method][1],
        wire=wire_fields(form.wire),
    )
    result.update(frequency_fields(form, chosen, frequency, temperature_C, _given_capacitance(measured)))
    result["medhurst_self_capacitance_F"] = float(form.medhurst_self_capacitance(chosen))
    result["former_permittivity"] = form.former_permittivity
    if form.former_diameter is not None:
        result["former_diameter_m"] = form.former_diameter
    if form.max_length is not None:
        result["max_length_m"] = form.max_length
    limit = form.max_turns()
    if math.isfinite(limit):
        result["max_turns"] = math.floor(limit + 1e-9)
        result["max_inductance_H"] = float(form.inductance(float(math.floor(limit + 1e-9))))
    return result
