"""coilplan: plan coil windings for inductors made from salvaged and surplus parts.

The library computes each coil form's inductance from published methods
(``coilplan.physics``), wraps the geometry and wire in a form object
(``coilplan.forms``) and solves the inverse problem, turns for a target
(``coilplan.solve``). The ``coilplan`` command is a thin layer over these.
"""

from coilplan.errors import (
    CoilplanError,
    DataFileError,
    InfeasibleError,
    InvalidInputError,
    OutsideValidityWarning,
    SolverError,
)
from coilplan.forms import SOLENOID_METHODS, CoilForm, Solenoid
from coilplan.quantities import format_length, format_quantity, parse_quantity
from coilplan.results import solenoid_result
from coilplan.solve import TurnsSolution, solve_turns
from coilplan.wire import Wire, awg_diameter, copper_resistivity, parse_wire

__version__ = "0.1.0"

__all__ = [
    "CoilForm",
    "CoilplanError",
    "DataFileError",
    "InfeasibleError",
    "InvalidInputError",
    "OutsideValidityWarning",
    "SOLENOID_METHODS",
    "Solenoid",
    "SolverError",
    "TurnsSolution",
    "Wire",
    "awg_diameter",
    "copper_resistivity",
    "format_length",
    "format_quantity",
    "parse_quantity",
    "parse_wire",
    "solenoid_result",
    "solve_turns",
]
