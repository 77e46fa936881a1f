"""The whole answer for a multilayer air-core coil and for a flat spiral."""

from __future__ import annotations

import math
import warnings

from coilplan.apparent import frequency_fields
from coilplan.errors import OutsideValidityWarning
from coilplan.forms import MULTILAYER_METHODS, SPIRAL_METHODS, FlatSpiral, MultilayerCoil
from coilplan.results._common import Measured, turns_block, wire_fields
from coilplan.results._common import given_capacitance as _given_capacitance

__all__ = ["multilayer_result", "spiral_result"]


def _quiet(function, *args) -> float:
    """A comparison figure (Wheeler beside the exact value): its range warning is the form's to give."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)
        return float(function(*args))


def _common(form, result: dict, chosen: int, temperature_C: float, frequency, measured, methods) -> None:
    factor = getattr(form, "factor", 1.0)
    exact = factor * float(form.exact_inductance(chosen))
    wheeler = factor * _quiet(form.wheeler_inductance, chosen)
    result.update(
        inductance_H=float(form.inductance(chosen)),
        exact_inductance_H=exact,
        wheeler_inductance_H=wheeler,
        wheeler_difference=wheeler / exact - 1.0,
        wire_length_m=float(form.wire_length(chosen)),
        lead_m=form.lead,
        dc_resistance_ohm=float(form.resistance(chosen, 20.0)),
        temperature_C=float(temperature_C),
        dc_resistance_at_temperature_ohm=float(form.resistance(chosen, temperature_C)),
        method=form.method,
        model_factor=factor,
        method_note=methods[form.method][0],
        method_accuracy=methods[form.method][1],
        wire=wire_fields(form.wire),
    )
    result.update(frequency_fields(form, chosen, frequency, temperature_C, _given_capacitance(measured)))
    limit = form.fit_turns()  # what the window or outer diameter holds (not the exact method's own cap)
    if math.isfinite(limit):
        result["max_turns"] = math.floor(limit + 1e-9)
        result["max_inductance_H"] = float(form.inductance(float(result["max_turns"])))


def multilayer_result(form: MultilayerCoil, *, turns: int | None = None, target: float | None = None,
                      temperature_C: float = 20.0, measured: Measured | None = None,
                      frequency: float | None = None, drive=None) -> dict:
    """Forward (``turns``) or inverse (``target``) answer for a multilayer coil.

    Parameters are as for :func:`coilplan.results.solenoid_result`.

    Returns
    -------
    dict
        ``turns``, ``inductance_H`` (by the form's method), ``layers``,
        ``turns_per_layer``, ``depth_m`` (radial build), ``outer_diameter_m``,
        ``fits`` (None without a depth limit), ``wire_length_m``,
        ``dc_resistance_ohm``, ``method``, ``wheeler_inductance_H`` and
        ``wheeler_difference`` (Wheeler's value over the method's, minus 1), plus
        the inverse and frequency fields of :func:`~coilplan.results._common.turns_block`.

    Raises
    ------
    ValueError
        Unless exactly one of ``turns`` and ``target`` is given (checked by ``turns_block``).
    InfeasibleError
        The target cannot be reached within the window, or the turns do not fit.
    """
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    form.validity_warnings(chosen)
    depth = float(form.depth(chosen))
    result.update(
        layers=int(form.layers(chosen)),
        turns_per_layer=form.turns_per_layer(),
        style=form.style,
        packing=form.packing,
        pitch_m=form.pitch,
        layer_pitch_m=form.layer_pitch,
        former_diameter_m=form.former_diameter,
        width_m=form.width,
        depth_m=depth,
        outer_diameter_m=float(form.outer_diameter(chosen)),
        fits=None if form.max_depth is None else bool(depth <= form.max_depth * (1 + 1e-9)),
    )
    if form.max_depth is not None:
        result["max_depth_m"] = form.max_depth
    _common(form, result, chosen, temperature_C, frequency, measured, MULTILAYER_METHODS)
    return result


def spiral_result(form: FlatSpiral, *, turns: int | None = None, target: float | None = None,
                  temperature_C: float = 20.0, measured: Measured | None = None,
                  frequency: float | None = None, drive=None) -> dict:
    """Forward (``turns``) or inverse (``target``) answer for a flat spiral.

    Returns
    -------
    dict
        As :func:`multilayer_result`, with ``layers`` 1, ``turns_per_layer`` equal
        to ``turns``, ``depth_m`` the radial width, ``outer_diameter_m``,
        ``inner_diameter_m``, ``radial_pitch_m`` and ``spacing_m``.
    """
    result = turns_block(form, turns=turns, target=target, measured=measured, frequency=frequency)
    chosen = result["turns"]
    form.validity_warnings(chosen)
    outside = float(form.outside_diameter(chosen))
    result.update(
        layers=1,
        turns_per_layer=chosen,
        inner_diameter_m=form.inner_diameter,
        radial_pitch_m=form.radial_pitch,
        spacing_m=form.spacing,
        depth_m=float(form.depth(chosen)),
        outer_diameter_m=outside,
        fits=None if form.outer_diameter is None else bool(outside <= form.outer_diameter * (1 + 1e-9)),
    )
    if form.outer_diameter is not None:
        result["max_outer_diameter_m"] = form.outer_diameter
    _common(form, result, chosen, temperature_C, frequency, measured, SPIRAL_METHODS)
    return result
