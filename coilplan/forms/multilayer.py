"""The multilayer air-core coil form: layers of turns on a former or bobbin."""

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
from coilplan.physics.frequency import knight_self_capacitance, multilayer_self_capacitance
from coilplan.quantities import format_length
from coilplan.wire import Wire

__all__ = ["MULTILAYER_METHODS", "MultilayerCoil", "MultilayerMethod"]

MultilayerMethod = Literal["filament", "wheeler-1928"]
LayerStyle = Literal["layered", "staggered"]

#: Each method: (what it computes, its accuracy and source), in words.
MULTILAYER_METHODS: dict[str, tuple[str, str]] = {
    "filament": ("exact turn-by-turn sum: Maxwell's mutual inductance of every pair of turns and each "
                 "turn's round-wire self-inductance",
                 "exact for circular turns at the wire centres; helix and crossovers neglected"),
    "wheeler-1928": ("Wheeler 1928 multilayer formula (uniform current over the winding section)",
                     "about 1 % when 6a, 9b and 10c are about equal (Wheeler); several percent otherwise"),
}


#: Most turns and layers the exact filament sum takes on (its work grows as layers² × turns per
#: layer: about a second at the limits here). Every answer gives that sum, Wheeler's method beside
#: it, so the limits hold for both methods: a Wheeler answer past them would take minutes.
EXACT_TURNS_LIMIT = 20_000
EXACT_LAYERS_LIMIT = 200


@dataclass(frozen=True)
class MultilayerCoil(Rewindable):
    """Multilayer air-core coil: layers of round wire across a fixed winding width.

    Parameters
    ----------
    former_diameter : float
        Outside diameter of the former or bobbin core, m (the winding starts there).
    width : float
        Axial winding width between the bobbin cheeks, m.
    wire : Wire
        The wire; its overall diameter sets the pitches.
    style : {"layered", "staggered"}
        Simple layered (turns above turns) or staggered/orthocyclic (every second
        layer shifted half a pitch into the grooves).
    packing : float
        Hand-winding packing factor, 0.5 < p ≤ 1, as in a kit plan: the turns sit at the overall wire
        diameter divided by it, along the layer and from layer to layer (1: machine-perfect; common
        practice about 0.9 to 0.95 for careful hand winding, 0.85 random; see
        :mod:`coilplan.physics.multilayer`, whose own factor is 1/p).
    max_depth : float, optional
        Radial depth of the bobbin window, m: the build must fit it.
    lead : float
        Lead allowance per end, m.
    method : {"filament", "wheeler-1928"}
        Inductance method, see :data:`MULTILAYER_METHODS`.
    """

    former_diameter: float
    width: float
    wire: Wire
    style: LayerStyle = "layered"
    packing: float = 1.0
    max_depth: float | None = None
    lead: float = 0.0
    method: MultilayerMethod = "filament"
    _cache: dict = field(default_factory=dict, init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        positive(self.former_diameter, "former_diameter", "a former diameter")
        positive(self.width, "width", "a winding width")
        positive(self.max_depth, "max_depth", "a winding depth")
        if not (math.isfinite(self.packing) and 0.5 <= self.packing <= 1.0):
            raise InvalidInputError("packing", "a packing factor from 0.5 to 1", self.packing)
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if self.style not in get_args(LayerStyle):
            raise InvalidInputError("style", "one of " + ", ".join(get_args(LayerStyle)), self.style)
        if self.method not in get_args(MultilayerMethod):
            raise InvalidInputError("method", "one of " + ", ".join(get_args(MultilayerMethod)), self.method)
        needed = (2.0 if self.style == "staggered" else 1.0) * self.pitch
        if self.width < needed * (1 - 1e-9):
            raise InvalidInputError("width", f"a winding width of at least {format_length(needed)} "
                                    f"({'two turns' if self.style == 'staggered' else 'one turn'} of this wire)",
                                    format_length(self.width))
        if self.max_depth is not None and self.max_depth < self.wire.overall_diameter * (1 - 1e-9):
            raise InvalidInputError("max_depth", f"a depth of at least one wire diameter "
                                    f"({format_length(self.wire.overall_diameter)})", format_length(self.max_depth))

    # geometry -----------------------------------------------------------------
    @property
    def pitch(self) -> float:
        """Axial pitch, m: overall wire diameter / packing."""
        return self.wire.overall_diameter / self.packing

    @property
    def layer_pitch(self) -> float:
        """Radial distance between layers, m (√3/2 of the pitch when staggered)."""
        return multilayer.layer_pitch(self.pitch, self.style)

    def turns_per_layer(self) -> int:
        """Turns in a full (even-numbered) layer."""
        return multilayer.layer_turn_counts(self.width, self.pitch, self.style)[0]

    def _shifted_layer_turns(self) -> int:
        """Turns in a full odd-numbered layer (one fewer when staggered and the width is whole pitches)."""
        return multilayer.layer_turn_counts(self.width, self.pitch, self.style)[1]

    def _mean_layer_turns(self) -> float:
        return 0.5 * (self.turns_per_layer() + self._shifted_layer_turns())

    def layers(self, turns):
        """Layers the winding takes (the last may be partial); vectorised."""
        turns = np.asarray(turns, dtype=float)
        full, shifted = self.turns_per_layer(), self._shifted_layer_turns()
        pairs = np.floor(turns / (full + shifted) - 1e-12)
        rest = turns - pairs * (full + shifted)
        return (2 * pairs + np.where(rest > full + 1e-9, 2, 1)) * (turns > 0)

    def depth(self, turns):
        """Radial build, m: (layers − 1) layer pitches + one pitch."""
        return (self.layers(turns) - 1.0) * self.layer_pitch + self.pitch

    def outer_diameter(self, turns):
        """Outside diameter over the winding, m."""
        return self.former_diameter + 2.0 * self.depth(turns)

    def _layer_radius(self, k):
        return self.former_diameter / 2.0 + self.layer_pitch / 2.0 + k * self.layer_pitch

    # protocol -----------------------------------------------------------------
    def min_turns(self) -> float:
        return 1.0

    def fit_turns(self) -> float:
        """Turns the winding window holds, for the answer's "most that fit" (``math.inf`` without a maximum
        depth, and when the window holds more than the turn-by-turn sum takes on: what that many turns
        would give cannot be worked out in seconds, so no figure is given for it)."""
        window = self._window_turns()
        return window if window <= self._exact_limit() else math.inf

    def _window_turns(self) -> float:
        if self.max_depth is None:
            return math.inf
        layers = math.floor((self.max_depth - self.pitch) / self.layer_pitch + 1e-9) + 1
        full, shifted = self.turns_per_layer(), self._shifted_layer_turns()
        return float((layers + 1) // 2 * full + layers // 2 * shifted)

    def _exact_limit(self) -> float:
        return float(min(EXACT_TURNS_LIMIT, EXACT_LAYERS_LIMIT * self._mean_layer_turns()))

    def max_turns(self) -> float:
        return min(self._window_turns(), math.floor(self._exact_limit()))

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn on this former"
        if self._window_turns() > self._exact_limit():
            return (f"the turn-by-turn sum, given with every answer, stops at {math.floor(self._exact_limit())} "
                    f"turns ({EXACT_LAYERS_LIMIT} layers or {EXACT_TURNS_LIMIT} turns at most), to answer in "
                    f"seconds")
        return (f"the {format_length(self.width)} × {format_length(self.max_depth)} winding window holds "
                f"{math.floor(turns + 1e-9)} turns of this wire ({self.style})")

    def inductance(self, turns):
        """Low-frequency inductance, H, by this form's ``method``; vectorised over turns.

        The exact method is evaluated at whole turns and interpolated linearly between
        them for the root finder. Range warnings are held back here (the solver probes
        far from the answer); :meth:`validity_warnings` gives them for the turns chosen.
        """
        turns = np.asarray(turns, dtype=float)
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", OutsideValidityWarning)
            if self.method == "wheeler-1928":
                return self.wheeler_inductance(turns)
            return self.exact_inductance(turns)

    def wheeler_inductance(self, turns):
        """Wheeler's 1928 value, H, on the sheet section: b = T·p, c = N·h/T (mean turns per layer)."""
        turns = np.asarray(turns, dtype=float)
        length = self.turns_per_layer() * self.pitch
        depth = turns * self.layer_pitch / self._mean_layer_turns()
        mean_radius = self.former_diameter / 2.0 + depth / 2.0
        return multilayer.wheeler_multilayer_inductance(mean_radius, length, depth, turns)

    def _whole(self, n: int) -> float:
        if n not in self._cache:
            self._cache[n] = float(multilayer.multilayer_filament_inductance(
                self.former_diameter / 2.0, self.width, self.wire.diameter, n,
                overall_diameter=self.wire.overall_diameter, style=self.style, packing=1.0 / self.packing))
        return self._cache[n]

    def exact_inductance(self, turns):
        """The filament sum, H, at whole turns; linear between whole numbers for the root finder."""
        return between_whole_turns(turns, self._whole)

    def wire_length(self, turns):
        """Wire to cut, m: each turn 2π × its layer's radius, plus a lead at each end."""
        turns = np.asarray(turns, dtype=float)
        full, shifted = self.turns_per_layer(), self._shifted_layer_turns()
        count = int(np.max(self.layers(turns), initial=1)) + 1
        per_layer = np.tile([full, shifted], count // 2 + 1)[:count].astype(float)
        radii = self._layer_radius(np.arange(count))
        done = np.concatenate([[0.0], np.cumsum(per_layer)])
        length_done = np.concatenate([[0.0], np.cumsum(per_layer * 2 * np.pi * radii)])
        complete = np.clip(np.searchsorted(done, turns, side="right") - 1, 0, count - 1)
        rest = turns - done[complete]
        return length_done[complete] + rest * 2 * np.pi * radii[complete] + 2.0 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        """DC resistance of the wire to cut, ohm."""
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def self_capacitance(self, turns):
        """Self-capacitance, F: the layer-to-layer estimate (rough, tens of percent); Knight's for one layer."""
        turns = np.asarray(turns, dtype=float)
        d = self.wire.overall_diameter
        layers = self.layers(turns)
        mean_diameter = self.former_diameter + self.depth(turns)
        gap = (d - self.wire.diameter) + 0.2 * d  # as coilplan.forms.gapped: enamel twice plus a fifth of a wire
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", OutsideValidityWarning)
            layered = multilayer_self_capacitance(mean_diameter, self.width, np.maximum(layers, 1), gap,
                                                  permittivity=3.0)
            single = knight_self_capacitance(self.former_diameter + d, np.maximum(turns, 1) * self.pitch,
                                             self.pitch)
        return np.where(layers > 1, layered, single)[()]

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: Dowell's factor for the layers (one layer: the proximity form)."""
        factor = winding_resistance_factor(self.wire, frequency, temperature_C, pitch=self.pitch,
                                           layers=self.layers(turns), turns_per_layer=self.turns_per_layer(),
                                           window_width=self.width)
        return self.resistance(turns, temperature_C) * factor

    def validity_warnings(self, turns: float) -> None:
        """Warn (OutsideValidityWarning) where the chosen method is outside its stated range."""
        if self.method == "wheeler-1928" and outside_stated_range(self.wheeler_inductance, turns):
            warnings.warn("Wheeler's multilayer formula is outside its stated range here (6a, 9b and 10c "
                          "far from equal); expect several percent error; the filament method is exact",
                          OutsideValidityWarning, stacklevel=2)
        if self.wire.diameter > 0.2 * self.former_diameter:
            warnings.warn("the wire is thick against the former (over a fifth of its diameter): the thin-ring "
                          "self-inductance of each turn loses accuracy", OutsideValidityWarning, stacklevel=2)
