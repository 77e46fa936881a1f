"""The flat-spiral (pancake) air-core coil form: turns of rising radius in one plane."""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass, field
from typing import Literal, get_args

import numpy as np

from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.forms._checks import between_whole_turns, outside_stated_range, positive
from coilplan.forms._losses import winding_resistance_factor
from coilplan.forms._winding import Rewindable
from coilplan.physics import multilayer
from coilplan.quantities import format_length
from coilplan.wire import Wire

__all__ = ["SPIRAL_METHODS", "FlatSpiral", "SpiralMethod"]

SpiralMethod = Literal["filament", "wheeler"]

#: Each method: (what it computes, its accuracy and source), in words.
SPIRAL_METHODS: dict[str, tuple[str, str]] = {
    "filament": ("exact turn-by-turn sum: each turn a circle at its own radius, Maxwell's mutual "
                 "inductances and each turn's round-wire self-inductance",
                 "exact for concentric circular turns; the spiral's lead-in neglected"),
    "wheeler": ("Wheeler's flat-spiral formula (uniform current over the radial width)",
                "within 5 % for a radial width over 0.2 × the mean radius (Wheeler, via Pender & McIlwain)"),
}


#: Most turns the exact pair sum takes on (under a second here). Every answer gives that sum, Wheeler's
#: method beside it, so the limit holds for both methods.
EXACT_TURNS_LIMIT = 3_000


@dataclass(frozen=True)
class FlatSpiral(Rewindable):
    """Flat spiral of round wire from an inner diameter outwards.

    Parameters
    ----------
    inner_diameter : float
        Inside diameter of the winding, m (the first turn's inside edge).
    wire : Wire
        The wire.
    spacing : float
        Gap between adjacent turns, m (0: turns touching). Radial pitch = overall
        wire diameter + spacing.
    outer_diameter : float, optional
        Largest outside diameter allowed, m: sets the turns that fit.
    lead : float
        Lead allowance per end, m.
    method : {"filament", "wheeler"}
        See :data:`SPIRAL_METHODS`.
    """

    inner_diameter: float
    wire: Wire
    spacing: float = 0.0
    outer_diameter: float | None = None
    lead: float = 0.0
    method: SpiralMethod = "filament"
    _cache: dict = field(default_factory=dict, init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        positive(self.inner_diameter, "inner_diameter", "an inner diameter")
        positive(self.outer_diameter, "outer_diameter", "an outer diameter")
        if not (math.isfinite(self.spacing) and self.spacing >= 0):
            raise InvalidInputError("spacing", "a gap between turns of zero or more", self.spacing)
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if self.method not in get_args(SpiralMethod):
            raise InvalidInputError("method", "one of " + ", ".join(get_args(SpiralMethod)), self.method)
        if self.radial_pitch <= self.wire.diameter:
            raise InvalidInputError("spacing", "a gap between turns of bare wire (touching bare turns short "
                                    "out)", format_length(self.spacing))
        if (self.outer_diameter is not None
                and self.outer_diameter < self.inner_diameter + 2 * self.wire.overall_diameter * (1 - 1e-9)):
            least = format_length(self.inner_diameter + 2 * self.wire.overall_diameter)
            raise InvalidInputError("outer_diameter", f"an outer diameter of at least the inner diameter plus two wire "
                                    f"diameters ({least})", format_length(self.outer_diameter))

    # geometry -----------------------------------------------------------------
    @property
    def radial_pitch(self) -> float:
        """Radial distance between turn centres, m."""
        return self.wire.overall_diameter + self.spacing

    @property
    def _centre_grid_start(self) -> float:
        """r_0 of :func:`~coilplan.physics.multilayer.spiral_turn_radii`, m: half a pitch inside the
        first turn's centre, so that the turn centres are r_0 + (k + 1/2)·pitch."""
        return self.inner_diameter / 2.0 + self.wire.overall_diameter / 2.0 - self.radial_pitch / 2.0

    def depth(self, turns):
        """Radial width of the winding, m: N − 1 pitches plus one wire."""
        return (np.asarray(turns, dtype=float) - 1.0) * self.radial_pitch + self.wire.overall_diameter

    def outside_diameter(self, turns):
        """Outside diameter over the winding, m."""
        return self.inner_diameter + 2.0 * self.depth(turns)

    # protocol -----------------------------------------------------------------
    def min_turns(self) -> float:
        return 1.0

    def fit_turns(self) -> float:
        """Turns the space up to the outer diameter holds, for the answer's "most that fit" (``math.inf``
        without one, and when it holds more than the turn-by-turn sum takes on)."""
        room = self._room_turns()
        return room if room <= EXACT_TURNS_LIMIT else math.inf

    def _room_turns(self) -> float:
        if self.outer_diameter is None:
            return math.inf
        room = (self.outer_diameter - self.inner_diameter) / 2.0
        return float(math.floor((room - self.wire.overall_diameter) / self.radial_pitch + 1e-9) + 1)

    def max_turns(self) -> float:
        return min(self._room_turns(), float(EXACT_TURNS_LIMIT))

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn at this inner diameter"
        if self._room_turns() > EXACT_TURNS_LIMIT:
            return (f"the turn-by-turn sum, given with every answer, stops at {EXACT_TURNS_LIMIT} turns, to answer "
                    f"in seconds")
        return (f"{math.floor(turns + 1e-9)} turns at {format_length(self.radial_pitch)} radial pitch fill the "
                f"space from {format_length(self.inner_diameter)} to {format_length(self.outer_diameter)}")

    def inductance(self, turns):
        """Low-frequency inductance, H, by this form's ``method``; vectorised over turns.

        The exact method is evaluated at whole turns and interpolated linearly between.
        """
        turns = np.asarray(turns, dtype=float)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", OutsideValidityWarning)
            if self.method == "wheeler":
                return self.wheeler_inductance(turns)
            return self.exact_inductance(turns)

    def exact_inductance(self, turns):
        """The filament sum, H, at whole turns; linear between whole numbers for the root finder."""
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", OutsideValidityWarning)
            return between_whole_turns(turns, self._whole)

    def wheeler_inductance(self, turns):
        """Wheeler's value, H, on the sheet: radial width c = N·s, mean radius inner + c/2."""
        turns = np.asarray(turns, dtype=float)
        depth = turns * self.radial_pitch
        return multilayer.wheeler_spiral_inductance(self.inner_diameter / 2.0 + depth / 2.0, depth, turns)

    def _whole(self, n: int) -> float:
        """The filament sum at n turns, from one cached pass over every count up to the largest asked for.

        The turns keep their radii as the spiral grows, so a pass to M turns answers every n <= M; a
        larger n redoes the pass to twice M (not past the limit), so a solve costs about one pass in all.
        """
        known = self._cache.get("inductances")
        if known is None or n > known.size:
            size = max(n, min(2 * (0 if known is None else known.size), EXACT_TURNS_LIMIT + 1))
            known = multilayer.spiral_filament_inductances(self._centre_grid_start, self.radial_pitch,
                                                           self.wire.diameter, size)
            self._cache["inductances"] = known
        return float(known[n - 1])

    def turn_radii(self, turns: int):
        """Radii of the turn centres, m."""
        return multilayer.spiral_turn_radii(self._centre_grid_start, self.radial_pitch, turns)

    def wire_length(self, turns):
        """Wire to cut, m: Σ 2π r_k over the turns (closed form, float turns allowed) plus the leads."""
        turns = np.asarray(turns, dtype=float)
        first = self.inner_diameter / 2.0 + self.wire.overall_diameter / 2.0
        return 2 * np.pi * (turns * first + self.radial_pitch * turns * (turns - 1.0) / 2.0) + 2.0 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        """DC resistance of the wire to cut, ohm."""
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def self_capacitance(self, turns):
        """Self-capacitance, F: adjacent-turn estimate (rough, up to a factor of two; see the physics)."""
        return multilayer.spiral_self_capacitance(self._centre_grid_start, self.radial_pitch, self.wire.diameter,
                                                  turns)

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: the one-layer proximity form at the radial pitch (labelled)."""
        factor = winding_resistance_factor(self.wire, frequency, temperature_C, pitch=self.radial_pitch)
        return self.resistance(turns, temperature_C) * factor

    def validity_warnings(self, turns: float) -> None:
        """Warn (OutsideValidityWarning) where the chosen method is outside its stated range."""
        if self.method == "wheeler" and outside_stated_range(self.wheeler_inductance, float(turns)):
            warnings.warn("Wheeler's flat-spiral formula is outside its stated range here (radial width "
                          "below 0.2 × mean radius); the filament method is exact", OutsideValidityWarning,
                          stacklevel=2)
