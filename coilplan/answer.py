"""The answer for one coil, in named parts, and the published shape of every command's ``--json``.

A figure's key means one thing wherever it appears (``inductance_H``, ``turns``, ``turns_change``) and
belongs to one part of the answer, named for what the bench user does with it:

=================  =========================================================================
part               what it holds
=================  =========================================================================
``wind``           the turns to wind and what they give; the target; the most that fit
``as_measured``    the coil as the meter showed it, the change to make, its range and plan
``winding``        the winding's shape on its former, core or bobbin
``copper``         the wire, the length to cut, the resistance
``core``           the core: AL value, permeability, effective parameters, loss at frequency
``at_frequency``   self-capacitance, self-resonance, the coil at the operating frequency, Q
``drive``          currents, flux density and the margin to saturation
``model``          the method, its accuracy, the figures beside it, the calibration factor
=================  =========================================================================

:func:`parts_of` sorts a flat result into these parts; :func:`flat` joins them again, so a script
finds a figure by its name in any part. The ``--json`` document carries :data:`SCHEMA_VERSION`
and follows the JSON Schema :func:`json_schema` writes (shipped as ``coilplan/output.schema.json``).
"""

from __future__ import annotations

from collections.abc import Mapping
from dataclasses import dataclass, field
from typing import Any

__all__ = ["FIGURES", "FORM_COMMANDS", "PARTS", "SCHEMA_NAME", "SCHEMA_VERSION", "Answer", "flat", "flat_document",
           "json_schema", "parts_of"]

SCHEMA_NAME = "coilplan-output"
#: 2: ``result`` of the form commands nested in parts; 1 (unversioned): one flat ``result``.
SCHEMA_VERSION = 2

PARTS = ("wind", "as_measured", "winding", "copper", "core", "at_frequency", "drive", "model")

_NUMBER, _INT, _BOOL, _TEXT, _LIST, _OBJECT = "number", "integer", "boolean", "string", "array", "object"

#: every figure of a coil's answer: key -> (part, JSON type)
FIGURES: dict[str, tuple[str, str]] = {
    # what to wind
    "turns": ("wind", _INT), "turns_exact": ("wind", _NUMBER), "inductance_H": ("wind", _NUMBER),
    "turns_below": ("wind", _INT), "turns_above": ("wind", _INT), "inductance_below_H": ("wind", _NUMBER),
    "inductance_above_H": ("wind", _NUMBER), "target_H": ("wind", _NUMBER), "target_is_apparent": ("wind", _BOOL),
    "target_frequency_Hz": ("wind", _NUMBER), "target_inductance_at_turns_H": ("wind", _NUMBER),
    "max_turns": ("wind", _INT), "max_inductance_H": ("wind", _NUMBER), "mode": ("wind", _TEXT),
    "asked_H": ("wind", _NUMBER), "max_flux_density_T": ("wind", _NUMBER), "notices": ("wind", _LIST),
    # the coil as measured and the change to make
    "turns_now": ("as_measured", _INT), "turns_change": ("as_measured", _INT), "turns_range": ("as_measured", _LIST),
    "turns_range_exact": ("as_measured", _LIST), "uncertainty": ("as_measured", _NUMBER),
    "tolerance": ("as_measured", _NUMBER), "tolerance_assumed": ("as_measured", _BOOL),
    "wire_change_m": ("as_measured", _NUMBER), "readings": ("as_measured", _LIST),
    "residuals": ("as_measured", _LIST), "measured_residuals": ("as_measured", _LIST),
    "calibration": ("as_measured", _OBJECT), "explanation": ("as_measured", _TEXT), "plan": ("as_measured", _LIST),
    "target_low_frequency_H": ("as_measured", _NUMBER), "resistance_change_ohm": ("as_measured", _NUMBER),
    "offset_H": ("as_measured", _NUMBER),
    # the winding's shape
    "diameter_m": ("winding", _NUMBER), "pitch_m": ("winding", _NUMBER), "close_wound": ("winding", _BOOL),
    "length_m": ("winding", _NUMBER), "sheet_length_m": ("winding", _NUMBER),
    "length_to_diameter": ("winding", _NUMBER), "layers": ("winding", _INT), "turns_per_layer": ("winding", _INT),
    "style": ("winding", _TEXT), "packing": ("winding", _NUMBER), "layer_pitch_m": ("winding", _NUMBER),
    "former_diameter_m": ("winding", _NUMBER), "width_m": ("winding", _NUMBER), "depth_m": ("winding", _NUMBER),
    "outer_diameter_m": ("winding", _NUMBER), "fits": ("winding", _BOOL), "max_depth_m": ("winding", _NUMBER),
    "inner_diameter_m": ("winding", _NUMBER), "radial_pitch_m": ("winding", _NUMBER),
    "spacing_m": ("winding", _NUMBER), "max_outer_diameter_m": ("winding", _NUMBER),
    "max_length_m": ("winding", _NUMBER), "coil_length_m": ("winding", _NUMBER), "position_m": ("winding", _NUMBER),
    "turns_one_layer": ("winding", _INT), "turns_window": ("winding", _INT), "chamfer_m": ("winding", _NUMBER),
    "height_m": ("winding", _NUMBER), "layering": ("winding", _TEXT),
    # the copper
    "wire": ("copper", _OBJECT), "wire_length_m": ("copper", _NUMBER), "lead_m": ("copper", _NUMBER),
    "dc_resistance_ohm": ("copper", _NUMBER), "temperature_C": ("copper", _NUMBER),
    "dc_resistance_at_temperature_ohm": ("copper", _NUMBER), "wire_per_turn_m": ("copper", _NUMBER),
    "current_density_A_per_mm2": ("copper", _NUMBER),
    # the core
    "al_H": ("core", _NUMBER), "al_basis": ("core", _TEXT), "al_from_readings": ("core", _BOOL),
    "al_no_fringing_H": ("core", _NUMBER), "fringing_factor": ("core", _NUMBER), "gap_m": ("core", _NUMBER),
    "mu_r": ("core", _NUMBER), "mu_r_implied": ("core", _BOOL), "effective_mu": ("core", _NUMBER),
    "ae_m2": ("core", _NUMBER), "le_m": ("core", _NUMBER), "ve_m3": ("core", _NUMBER),
    "c1_per_m": ("core", _NUMBER), "c2_per_m3": ("core", _NUMBER), "rod_length_m": ("core", _NUMBER),
    "rod_diameter_m": ("core", _NUMBER), "mu_initial": ("core", _NUMBER), "mu_fitted": ("core", _NUMBER),
    "rod_permeability": ("core", _NUMBER), "air_inductance_H": ("core", _NUMBER),
    "matching_materials": ("core", _LIST), "core_loss_resistance_ohm": ("core", _NUMBER),
    "core_q": ("core", _NUMBER), "core_loss_tangent": ("core", _NUMBER), "core_dilution": ("core", _NUMBER),
    "core_permeability": ("core", _NUMBER), "core_inductance_ratio": ("core", _NUMBER),
    "core_reference_frequency_Hz": ("core", _NUMBER), "inductance_reference_H": ("core", _NUMBER),
    "core_loss_basis": ("core", _TEXT),
    # at the operating frequency
    "frequency_Hz": ("at_frequency", _NUMBER), "self_capacitance_F": ("at_frequency", _NUMBER),
    "self_capacitance_source": ("at_frequency", _TEXT), "medhurst_self_capacitance_F": ("at_frequency", _NUMBER),
    "former_permittivity": ("at_frequency", _NUMBER), "srf_Hz": ("at_frequency", _NUMBER),
    "srf_fraction": ("at_frequency", _NUMBER), "ac_resistance_ohm": ("at_frequency", _NUMBER),
    "apparent_inductance_H": ("at_frequency", _NUMBER), "apparent_resistance_ohm": ("at_frequency", _NUMBER),
    "q": ("at_frequency", _NUMBER), "copper_q": ("at_frequency", _NUMBER), "q_terminals": ("at_frequency", _NUMBER),
    "plot": ("at_frequency", _TEXT),
    # the drive and saturation
    "current_A": ("drive", _NUMBER), "ac_current_A": ("drive", _NUMBER), "ac_voltage_V": ("drive", _NUMBER),
    "flux_density_T": ("drive", _NUMBER), "flux_density_ac_T": ("drive", _NUMBER),
    "flux_density_dc_T": ("drive", _NUMBER), "saturation_flux_density_T": ("drive", _NUMBER),
    "saturation_margin": ("drive", _NUMBER), "max_current_A": ("drive", _NUMBER), "near_saturation": ("drive", _BOOL),
    # the model
    "method": ("model", _TEXT), "method_note": ("model", _TEXT), "method_accuracy": ("model", _TEXT),
    "nagaoka": ("model", _NUMBER), "exact_inductance_H": ("model", _NUMBER),
    "wheeler_inductance_H": ("model", _NUMBER), "wheeler_difference": ("model", _NUMBER),
    "model_factor": ("model", _NUMBER), "calibrated": ("model", _BOOL),
}


def parts_of(result: Mapping[str, Any]) -> dict[str, dict[str, Any]]:
    """The figures of a flat result sorted into their parts (:data:`PARTS` order; empty parts left out).

    Raises
    ------
    KeyError
        A figure no part claims (a key missing from :data:`FIGURES`: a defect, caught by the tests).

    Examples
    --------
    >>> parts_of({"turns": 18, "wire_length_m": 1.44})
    {'wind': {'turns': 18}, 'copper': {'wire_length_m': 1.44}}
    """
    parts: dict[str, dict[str, Any]] = {}
    for key, value in result.items():
        parts.setdefault(FIGURES[key][0], {})[key] = value
    return {name: parts[name] for name in PARTS if name in parts}


def flat(parts: Mapping[str, Mapping[str, Any]]) -> dict[str, Any]:
    """The parts of an answer joined into one mapping of figures (each key is in one part only).

    Examples
    --------
    >>> flat({"wind": {"turns": 18}, "copper": {"wire_length_m": 1.44}})
    {'turns': 18, 'wire_length_m': 1.44}
    """
    joined: dict[str, Any] = {}
    for figures in parts.values():
        joined.update(figures)
    return joined


def flat_document(document: Mapping[str, Any]) -> dict[str, Any]:
    """A ``--json`` document with a coil's answer joined into one mapping of figures (others as they are).

    For a script that looks figures up by name: ``flat_document(json.loads(text))["result"]["turns"]``.
    """
    if document.get("command") not in FORM_COMMANDS:
        return dict(document)
    return {**document, "result": flat(document["result"])}


@dataclass(frozen=True)
class Answer:
    """The whole answer for one coil: the form as solved, its figures, warnings and cautions.

    Attributes
    ----------
    form : CoilForm
        The form as it was solved: calibrated, with its core at the operating frequency.
    result : Mapping
        The figures in SI units, the unit in the key, by name (:func:`parts` sorts them into parts).
    warnings, cautions : tuple of str
    measured : Measured, optional
        The readings and their calibration (:class:`coilplan.calibrate.Measured`).
    request : Request
        What was asked.
    """

    form: object
    result: Mapping[str, Any]
    warnings: tuple[str, ...] = ()
    cautions: tuple[str, ...] = ()
    measured: object = None
    request: Any = field(default=None)

    @property
    def parts(self) -> dict[str, dict[str, Any]]:
        """The figures by part (:data:`PARTS`)."""
        return parts_of(self.result)

    def __getattr__(self, name: str) -> dict[str, Any]:
        if name in PARTS:  # answer.wind, answer.copper, ...: one part's figures ({} when it has none)
            return self.parts.get(name, {})
        raise AttributeError(name)

    def to_json(self) -> dict[str, Any]:
        """The answer as plain JSON types: ``{"result": {part: {figure: value}}, "warnings", "cautions"}``."""
        from coilplan.report.json_report import clean

        return {"result": clean(self.parts), "warnings": list(self.warnings), "cautions": list(self.cautions)}


def json_schema() -> dict[str, Any]:
    """The JSON Schema (draft 2020-12) of every command's ``--json`` document.

    The form commands' ``result`` is an object of parts, each an object of its known figures (no others);
    the other commands' ``result`` is an object of their own figures.
    """
    def typed(kind: str) -> dict[str, Any]:
        return {"type": [kind, "null"]} if kind in (_NUMBER, _INT, _BOOL) else {"type": kind}

    parts = {name: {"type": "object", "additionalProperties": False,
                    "properties": {key: typed(kind) for key, (part, kind) in FIGURES.items() if part == name}}
             for name in PARTS}
    text_list = {"type": "array", "items": {"type": "string"}}
    return {
        "$schema": "https://json-schema.org/draft/2020-12/schema",
        "title": "coilplan --json output",
        "type": "object",
        "required": ["schema", "command", "inputs", "result", "warnings", "cautions"],
        "additionalProperties": False,
        "properties": {
            "schema": {"type": "object", "required": ["name", "version"], "additionalProperties": False,
                       "properties": {"name": {"const": SCHEMA_NAME}, "version": {"const": SCHEMA_VERSION}}},
            "command": {"type": "string"},
            "inputs": {"type": "object"},
            "result": {"type": ["object", "null"]},
            "warnings": text_list,
            "cautions": text_list,
            "error": {"type": "object", "required": ["message", "exit_status"], "additionalProperties": False,
                      "properties": {"message": {"type": "string"}, "exit_status": {"const": 1},
                                     "achievable_H": {"type": ["array", "null"], "items": {"type": "number"}}}},
        },
        "if": {"properties": {"command": {"enum": list(FORM_COMMANDS)}}},
        "then": {"properties": {"result": {"anyOf": [
            {"type": "null"},
            {"type": "object", "additionalProperties": False, "properties": parts, "required": ["wind"]}]}}},
    }


#: the commands whose ``result`` is one coil's answer in parts
FORM_COMMANDS = ("solenoid", "multilayer", "spiral", "toroid", "gapped", "rod", "rewind")
