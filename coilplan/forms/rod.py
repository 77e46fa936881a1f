"""The rod form: a single-layer winding on (or on a former around) a ferrite rod."""

from __future__ import annotations

import math
from dataclasses import dataclass
from typing import ClassVar

import numpy as np
from scipy.constants import mu_0

from coilplan.errors import InvalidInputError
from coilplan.forms._checks import positive
from coilplan.forms._losses import winding_resistance_factor
from coilplan.forms._winding import Rewindable
from coilplan.physics.frequency import knight_self_capacitance
from coilplan.physics.rod import rod_coil_inductance, rod_permeability
from coilplan.physics.solenoid import current_sheet_inductance
from coilplan.quantities import format_length
from coilplan.wire import Wire

__all__ = ["RodCoil"]


@dataclass(frozen=True)
class RodCoil(Rewindable):
    """A coil on a ferrite rod; the rod model is rough (tens of percent) until calibrated.

    Parameters
    ----------
    rod_length, rod_diameter : float
        The rod, m.
    mu_initial : float or None
        Initial permeability of the rod material (from a material class or given); None when
        unknown, for readings to find (:mod:`coilplan.calibrate`).
    wire : Wire
        The wire; its overall diameter sets the close-wound pitch.
    former_diameter : float, optional
        Outside diameter of a former round the rod, m; default wound on the rod itself.
    pitch : float, optional
        Distance between turn centres, m; default close wound. Exclusive with ``coil_length``.
    coil_length : float, optional
        A fixed winding length, m, the turns spread evenly over it (each owns length/N).
    position : float
        Offset of the coil's centre from the rod's centre, m (0: centred).
    max_length : float, optional
        Usable winding length, m; default the rod's length (the winding stays on the rod).
    saturation_flux_density : float, optional
        B_sat of the material at the working temperature, T.
    lead : float
        Lead allowance per end, m.

    Notes
    -----
    The inductance comes from :func:`coilplan.physics.rod.rod_coil_inductance`
    (our slice model of the rod's magnetisation driven by the coil's own field):
    it accounts for the rod's length and diameter, the material's permeability,
    and the coil's length, diameter and position, but not for the spread of real
    material or for the rod's losses. Calibrate from a reading (``--measured``)
    for a first-trim answer: a scale factor keeps the model's shape (how L moves
    with turns as the winding lengthens) and fixes its level.
    """

    rod_length: float
    rod_diameter: float
    mu_initial: float | None
    wire: Wire
    former_diameter: float | None = None
    pitch: float | None = None
    coil_length: float | None = None
    position: float = 0.0
    max_length: float | None = None
    saturation_flux_density: float | None = None
    lead: float = 0.0

    _pitch_field = "pitch"
    _length_field = "coil_length"
    #: the field that stays unknown until readings set it (named when there are none)
    permeability_field: ClassVar[str] = "mu_initial"

    @property
    def permeability_unknown(self) -> bool:
        """True while the rod's material is unknown: a reading sets it (:func:`coilplan.calibrate.calibrate`)."""
        return self.mu_initial is None

    def with_permeability(self, mu: float) -> RodCoil:
        """The same coil on a rod of initial permeability ``mu``."""
        import dataclasses

        return dataclasses.replace(self, mu_initial=float(mu))

    def __post_init__(self) -> None:
        positive(self.rod_length, "rod_length", "a rod length")
        positive(self.rod_diameter, "rod_diameter", "a rod diameter")
        positive(self.pitch, "pitch", "a pitch")
        positive(self.coil_length, "coil_length", "a winding length")
        positive(self.max_length, "max_length", "a usable winding length")
        positive(self.former_diameter, "former_diameter", "a former diameter")
        if self.mu_initial is not None and not (math.isfinite(self.mu_initial) and self.mu_initial >= 1):
            raise InvalidInputError("mu_initial", "a relative permeability of at least 1", self.mu_initial)
        if not math.isfinite(self.position):
            raise InvalidInputError("position", "a finite offset", self.position)
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if self.former_diameter is not None and self.former_diameter < self.rod_diameter:
            raise InvalidInputError("former_diameter", f"a former at least as wide as the "
                                    f"{format_length(self.rod_diameter)} rod", format_length(self.former_diameter))
        if self.pitch is not None and self.coil_length is not None:
            raise InvalidInputError("pitch", "either a pitch or a winding length, not both", None)
        if self.pitch is not None and self.pitch < self.wire.overall_diameter * (1 - 1e-9):
            raise InvalidInputError("pitch", f"a pitch of at least the overall wire diameter "
                                    f"{format_length(self.wire.overall_diameter)}", format_length(self.pitch))
        overall = self.wire.overall_diameter
        if self.usable_length() < overall * (1 - 1e-9):
            field, what = ("rod_length", "a rod") if self.max_length is None else ("max_length", "a usable length")
            raise InvalidInputError(field, f"{what} at least one wire diameter long ({format_length(overall)}), "
                                    f"room for one turn", format_length(self.usable_length()))
        if self.coil_length is not None and self.coil_length > self.usable_length() * (1 + 1e-12):
            raise InvalidInputError("coil_length", f"a winding length within the usable "
                                    f"{format_length(self.usable_length())}", format_length(self.coil_length))

    # geometry -----------------------------------------------------------------
    @property
    def coil_diameter(self) -> float:
        """Winding diameter to the wire centres, m: the former (or rod) plus the overall wire diameter."""
        base = self.rod_diameter if self.former_diameter is None else self.former_diameter
        return base + self.wire.overall_diameter

    def usable_length(self) -> float:
        return self.rod_length if self.max_length is None else self.max_length

    def pitch_at(self, turns):
        turns = np.asarray(turns, dtype=float)
        if self.coil_length is not None:
            return self.coil_length / turns
        pitch = self.wire.overall_diameter if self.pitch is None else self.pitch
        return np.full(turns.shape, pitch)[()]

    def sheet_length(self, turns):
        """Current-sheet length of the winding, m: N·pitch."""
        turns = np.asarray(turns, dtype=float)
        return turns * self.pitch_at(turns)

    def rod_permeability(self) -> float:
        """The rod's apparent (fluxmetric) permeability µi/(1 + N_f(µi − 1))."""
        return float(rod_permeability(self.mu_initial, self.rod_length / self.rod_diameter))

    def permeability_response(self):
        """g(µ) = µrod(µ): the rod's apparent permeability sets the core's share of L (an approximation)."""
        ratio = self.rod_length / self.rod_diameter
        return lambda mu: float(rod_permeability(mu, ratio))

    def air_inductance(self, turns):
        """The same winding with no rod (Nagaoka current sheet), H."""
        turns = np.asarray(turns, dtype=float)
        return current_sheet_inductance(self.coil_diameter, self.sheet_length(turns), turns)

    # protocol -----------------------------------------------------------------
    def inductance(self, turns):
        """Low-frequency inductance by the rod model, H; vectorised over turns."""
        turns = np.asarray(turns, dtype=float)
        flat = np.atleast_1d(turns).ravel()
        values = np.array([float(rod_coil_inductance(n, self.rod_length, self.rod_diameter, self.mu_initial,
                                                     float(self.sheet_length(n)), self.coil_diameter,
                                                     self.position)) for n in flat])
        return values.reshape(turns.shape)[()] if turns.ndim == 0 else values.reshape(turns.shape)

    def min_turns(self) -> float:
        return 1.0

    def max_turns(self) -> float:
        overall = self.wire.overall_diameter
        if self.coil_length is not None:
            return self.coil_length / overall
        return (self.usable_length() - overall) / float(self.pitch_at(1.0)) + 1.0

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn on this rod"
        where = "rod" if self.max_length is None else "usable length"
        return (f"{math.floor(turns + 1e-9)} turns at {format_length(float(self.pitch_at(1.0)))} pitch fill "
                f"the {format_length(self.usable_length())} {where} (a longer usable length, on a longer former, "
                "holds more)")

    def winding_length(self, turns):
        turns = np.asarray(turns, dtype=float)
        return (turns - 1.0) * self.pitch_at(turns) + self.wire.overall_diameter

    def wire_length(self, turns):
        """Wire to cut, m: N helical turns plus a lead at each end."""
        turns = np.asarray(turns, dtype=float)
        return turns * np.hypot(np.pi * self.coil_diameter, self.pitch_at(turns)) + 2.0 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def self_capacitance(self, turns):
        """Self-capacitance, F: Knight's formula for the winding, the rod taken as the former
        (ferrite's permittivity, order 10 for NiZn, common practice, no source, raises it; rough)."""
        turns = np.asarray(turns, dtype=float)
        return knight_self_capacitance(self.coil_diameter, self.sheet_length(turns), self.pitch_at(turns),
                                       former_permittivity=1.0 if self.former_diameter else 10.0)

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: DC × the skin and proximity factor of the single layer
        (the rod's own loss is not included)."""
        factor = winding_resistance_factor(self.wire, frequency, temperature_C, pitch=self.pitch_at(turns))
        return self.resistance(turns, temperature_C) * factor

    def core_area(self) -> float:
        return math.pi * self.rod_diameter**2 / 4.0

    def flux_density(self, turns, current):
        """Estimate of B in the rod, T: µ0·µ_rod·N·I/c (the coil's field times the rod's apparent µ).

        An estimate for a coil long against its diameter, centred on the rod; good to
        tens of percent, like the rest of the rod model.
        """
        turns = np.asarray(turns, dtype=float)
        return mu_0 * self.rod_permeability() * turns * np.asarray(current, dtype=float) / self.sheet_length(turns)
