"""coilplan: plan coil windings for inductors made from salvaged and surplus parts.

The library computes each coil form's inductance from published methods
(``coilplan.physics``), wraps the geometry and wire in a form object
(``coilplan.forms``) and solves the inverse problem, turns for a target
(``coilplan.solve``). The ``coilplan`` command is a thin layer over these.
"""

from coilplan.calibrate import AlFit, fit_al
from coilplan.choke import design_choke
from coilplan.errors import (
    CoilplanError,
    DataFileError,
    InfeasibleError,
    InvalidInputError,
    OutsideValidityWarning,
    SolverError,
)
from coilplan.forms import SOLENOID_METHODS, ClosedCore, CoilForm, GappedCore, RodCoil, Solenoid, Toroid
from coilplan.materials import Material, all_materials, material, materials_for_permeability
from coilplan.quantities import format_length, format_quantity, parse_quantity
from coilplan.results import gapped_result, rod_result, solenoid_result, toroid_result
from coilplan.rewind import Conditions, Fit, closed_core_answer, closed_core_fit, model_fit, rewind_fields
from coilplan.saturation import SaturationCheck, saturation_check
from coilplan.session import TrimLog, load_log, record_reading, start_log
from coilplan.solve import TurnsSolution, solve_turns
from coilplan.turn_count import count_turns
from coilplan.wire import Wire, awg_diameter, copper_resistivity, parse_wire

__version__ = "0.1.0"

__all__ = [
    "AlFit",
    "ClosedCore",
    "CoilForm",
    "CoilplanError",
    "Conditions",
    "DataFileError",
    "Fit",
    "GappedCore",
    "InfeasibleError",
    "InvalidInputError",
    "Material",
    "OutsideValidityWarning",
    "RodCoil",
    "SOLENOID_METHODS",
    "SaturationCheck",
    "Solenoid",
    "SolverError",
    "Toroid",
    "TrimLog",
    "TurnsSolution",
    "Wire",
    "all_materials",
    "awg_diameter",
    "closed_core_answer",
    "closed_core_fit",
    "copper_resistivity",
    "count_turns",
    "design_choke",
    "fit_al",
    "format_length",
    "format_quantity",
    "gapped_result",
    "load_log",
    "material",
    "materials_for_permeability",
    "model_fit",
    "parse_quantity",
    "parse_wire",
    "record_reading",
    "rewind_fields",
    "rod_result",
    "saturation_check",
    "solenoid_result",
    "solve_turns",
    "start_log",
    "toroid_result",
]
