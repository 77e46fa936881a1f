"""Coil forms: one class per kind of coil, each answering the form protocol.

The protocol (design.md) is what lets one solver serve every form. A form
answers, vectorised over turns N (float arrays allowed for root finding):

``inductance(N)``     low-frequency inductance, H
``min_turns()``       fewest turns the form allows (1 for a winding)
``max_turns()``       most turns that fit (``math.inf`` when nothing limits it)
``limit_reason(N)``   the limit in words, for infeasible requests
``wire_length(N)``    wire to cut, m, leads included
``resistance(N)``     DC resistance at a temperature, ohm

Optional: ``search_limit()`` gives (turns, reason) where ``max_turns()`` is
infinite (a former of unstated length), so the solver refuses an unreachable
target quickly; ``self_capacitance(N)`` (F) and ``ac_resistance(N, f)`` give the
coil at frequency (:mod:`coilplan.apparent`); ``permeability_response()`` says
how L follows the core's permeability (:mod:`coilplan.core_frequency`).
Cored forms add ``flux_density(N, current)`` (T) for saturation checks.
Forms check their inputs and raise :class:`~coilplan.errors.InvalidInputError`
naming their own field (``inner_diameter``, ``pitch``); the command line shows
the option that set it (:mod:`coilplan.cli._fields`).
"""

from __future__ import annotations

from typing import Protocol

from coilplan.forms.closed import ClosedCore
from coilplan.forms.gapped import GappedCore
from coilplan.forms.multilayer import MULTILAYER_METHODS, MultilayerCoil, MultilayerMethod
from coilplan.forms.rod import RodCoil
from coilplan.forms.solenoid import SOLENOID_METHODS, Solenoid, SolenoidMethod
from coilplan.forms.spiral import SPIRAL_METHODS, FlatSpiral, SpiralMethod
from coilplan.forms.toroid import Toroid

__all__ = [
    "MULTILAYER_METHODS",
    "SOLENOID_METHODS",
    "SPIRAL_METHODS",
    "ClosedCore",
    "CoilForm",
    "FlatSpiral",
    "GappedCore",
    "MultilayerCoil",
    "MultilayerMethod",
    "RodCoil",
    "Solenoid",
    "SolenoidMethod",
    "SpiralMethod",
    "Toroid",
]


class CoilForm(Protocol):
    """What the solver and the reports need of any coil form."""

    def inductance(self, turns): ...

    def min_turns(self) -> float: ...

    def max_turns(self) -> float: ...

    def limit_reason(self, turns: float, lowest: bool = False) -> str: ...

    def wire_length(self, turns): ...

    def resistance(self, turns, temperature_C: float = 20.0): ...
