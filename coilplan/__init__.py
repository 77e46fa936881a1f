"""coilplan: plan coil windings for inductors made from salvaged and surplus parts.

The library computes each coil form's inductance from published methods
(``coilplan.physics``) and wraps the geometry and wire in a form object
(``coilplan.forms``). One call, :func:`design`, takes a form and a :class:`Request`
(a target or turns, the operating frequency, readings of the coil in hand) and gives
the :class:`Answer`: calibration, the core at frequency, the turns and every figure.
The ``coilplan`` command, the trim log and the kit are thin layers over it.

The public names below are imported on first use, so the command line starts
without loading the parts a command does not need.
"""

import importlib

__version__ = "0.1.0"

# public name -> the module that defines it
_WHERE = {
    "Answer": "coilplan.answer",
    "ClosedCore": "coilplan.forms",
    "CoilForm": "coilplan.forms",
    "CoilplanError": "coilplan.errors",
    "CoilplanWarning": "coilplan.errors",
    "Conditions": "coilplan.rewind",
    "CoreFacts": "coilplan.request",
    "DataFileError": "coilplan.errors",
    "Drive": "coilplan.request",
    "Fit": "coilplan.rewind",
    "FlatSpiral": "coilplan.forms",
    "GappedCore": "coilplan.forms",
    "InfeasibleError": "coilplan.errors",
    "InvalidInputError": "coilplan.errors",
    "KitResult": "coilplan.kit",
    "Material": "coilplan.materials",
    "MULTILAYER_METHODS": "coilplan.forms",
    "MeasurementWarning": "coilplan.errors",
    "MultilayerCoil": "coilplan.forms",
    "OutsideValidityWarning": "coilplan.errors",
    "PlanFileError": "coilplan.kit",
    "Reading": "coilplan.request",
    "Request": "coilplan.request",
    "RodCoil": "coilplan.forms",
    "SOLENOID_METHODS": "coilplan.forms",
    "SPIRAL_METHODS": "coilplan.forms",
    "SaturationCheck": "coilplan.saturation",
    "ScaledForm": "coilplan.calibrate",
    "Solenoid": "coilplan.forms",
    "SolverError": "coilplan.errors",
    "Toroid": "coilplan.forms",
    "TrimLog": "coilplan.session_model",
    "TurnsSolution": "coilplan.solve",
    "Wire": "coilplan.wire",
    "all_materials": "coilplan.materials",
    "awg_diameter": "coilplan.wire",
    "closed_core_fit": "coilplan.rewind",
    "copper_resistivity": "coilplan.wire",
    "count_turns": "coilplan.turn_count",
    "design": "coilplan.pipeline",
    "design_choke": "coilplan.choke",
    "flat_document": "coilplan.answer",
    "format_length": "coilplan.quantities",
    "format_quantity": "coilplan.quantities",
    "gapped_result": "coilplan.results",
    "load_log": "coilplan.session_file",
    "load_plan": "coilplan.kit",
    "material": "coilplan.materials",
    "materials_for_permeability": "coilplan.materials",
    "model_fit": "coilplan.rewind",
    "multilayer_result": "coilplan.results",
    "parse_quantity": "coilplan.quantities",
    "parse_wire": "coilplan.wire",
    "plan_kit": "coilplan.kit",
    "record_reading": "coilplan.session",
    "record_strike": "coilplan.session",
    "rewind_fields": "coilplan.rewind_answer",
    "rod_result": "coilplan.results",
    "saturation_check": "coilplan.saturation",
    "solenoid_result": "coilplan.results",
    "solve_turns": "coilplan.solve",
    "spiral_result": "coilplan.results",
    "start_log": "coilplan.session_file",
    "toroid_result": "coilplan.results",
}

__all__ = sorted(_WHERE)


def __getattr__(name):
    if name in _WHERE:
        value = getattr(importlib.import_module(_WHERE[name]), name)
        globals()[name] = value  # later look-ups skip this function
        return value
    raise AttributeError(f"module 'coilplan' has no attribute {name!r}")


def __dir__():
    return sorted([*globals(), *__all__])
