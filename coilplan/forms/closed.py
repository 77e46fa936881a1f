"""The bare closed-core law, for a coil whose geometry is unknown or does not matter."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import ClassVar

import numpy as np

from coilplan.forms._checks import positive
from coilplan.forms._winding import CoreLaw
from coilplan.wire import Wire

__all__ = ["ClosedCore"]


@dataclass(frozen=True)
class ClosedCore(CoreLaw):
    """L = AL·N² + L0: a winding on a closed core, plus a fixed series part for the leads.

    Parameters
    ----------
    al : float
        AL value, H per turn² (IEC 60205 definition).
    offset : float
        L0, the leads' series inductance, H (0 when not fitted).
    turn_length : float, optional
        Mean length of one turn, m, for the wire to add or remove.
    wire : Wire, optional
        The wire, for resistance.
    """

    al: float | None = None
    offset: float = 0.0
    turn_length: float | None = None
    wire: Wire | None = None
    fit_offset: bool = False

    permeability_field: ClassVar[str] = "al"  # readings set the AL value itself

    def with_al(self, al: float, offset: float = 0.0) -> ClosedCore:
        """This core with the AL value (and the leads' offset) the readings gave."""
        import dataclasses

        return dataclasses.replace(self, al=al, offset=offset)

    def __post_init__(self) -> None:
        positive(self.al, "al", "an AL value")
        positive(self.turn_length, "turn_length", "a mean turn length")

    def inductance(self, turns):
        return self.al * np.asarray(turns, dtype=float) ** 2 + self.offset

    def min_turns(self) -> float:
        return 1.0

    def max_turns(self) -> float:
        return math.inf

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        return "a single turn on this core" if lowest else f"{turns:.0f} turns"

    def wire_length(self, turns):
        """Wire in the winding, m (NaN without a turn length)."""
        length = math.nan if self.turn_length is None else self.turn_length
        return np.asarray(turns, dtype=float) * length

    def resistance(self, turns, temperature_C: float = 20.0):
        if self.wire is None:
            return np.full(np.shape(turns), math.nan)[()]
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)
