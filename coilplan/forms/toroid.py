"""The toroid form: a winding on a ring core of rectangular section."""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Literal

import numpy as np
from scipy.constants import mu_0

from coilplan.errors import InvalidInputError
from coilplan.forms._checks import positive
from coilplan.forms._losses import winding_resistance_factor
from coilplan.forms._winding import CoreLaw, Rewindable
from coilplan.physics.frequency import toroid_self_capacitance
from coilplan.physics.magnetic import al_value, effective_parameters, peak_flux_density, ring_core_constants
from coilplan.quantities import format_length
from coilplan.wire import Wire

__all__ = ["Toroid", "ToroidLayers"]

ToroidLayers = Literal["one", "many"]


@dataclass(frozen=True)
class Toroid(CoreLaw, Rewindable):
    """Turns wound through a ring core of rectangular section, L = AL·N².

    Parameters
    ----------
    inner_diameter, outer_diameter, height : float
        The ring's ID, OD and height, m.
    wire : Wire
        The wire; its overall diameter decides how many turns fit.
    al : float, optional
        AL value, H per turn², known or measured; when None it is computed
        from ``mu_r`` as µ0·µr·Ae/le (IEC 60205).
    al_basis : str
        Where the AL value came from, in words, for the report.
    mu_r : float, optional
        Relative permeability, when known or implied.
    saturation_flux_density : float, optional
        B at which the material saturates at the working temperature, T
        (None for air or an unknown material).
    layers : {"one", "many"}
        ``"one"``: a single layer, as many turns as the inside circumference
        holds (the usual RF practice). ``"many"``: layer on layer until the
        hole closes (a theoretical most; hand winding stops well short of it).
    lead : float
        Lead allowance per end, m.
    chamfer : float
        Leg of a 45° chamfer on the ring's edges, m (0: square edges).

    Notes
    -----
    The winding is taken as tight on the core: its own small extra flux
    outside the core and the leakage between turns are ignored, which is
    right to a few percent for a cored toroid and for an air toroid wound all
    round. Turns on the inside circumference: ⌊π(ID − d)/d⌋ for a layer whose
    wire centres sit d/2 inside the hole (common practice, no source).
    """

    inner_diameter: float
    outer_diameter: float
    height: float
    wire: Wire
    al: float | None = None
    al_basis: str = "given"
    mu_r: float | None = None
    saturation_flux_density: float | None = None
    layers: ToroidLayers = "one"
    lead: float = 0.0
    chamfer: float = 0.0
    _layer_table: tuple = field(init=False, repr=False, compare=False)

    def __post_init__(self) -> None:
        positive(self.inner_diameter, "inner_diameter", "an inner diameter")
        positive(self.outer_diameter, "outer_diameter", "an outer diameter")
        positive(self.height, "height", "a core height")
        positive(self.al, "al", "an AL value")
        positive(self.mu_r, "mu_r", "a relative permeability")
        if self.outer_diameter <= self.inner_diameter:
            raise InvalidInputError("outer_diameter", f"an outer diameter above the inner diameter "
                                    f"{format_length(self.inner_diameter)}", format_length(self.outer_diameter))
        if self.al is None and self.mu_r is not None:
            parameters = self.effective_parameters()
            object.__setattr__(self, "al", float(al_value(self.mu_r, parameters["ae"], parameters["le"])))
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if not (math.isfinite(self.chamfer) and 0 <= self.chamfer
                < min(self.height, (self.outer_diameter - self.inner_diameter) / 2) / 2):
            raise InvalidInputError("chamfer", "a chamfer of zero or more, under half the height and the "
                                    "radial width", format_length(self.chamfer))
        if self.layers not in ("one", "many"):
            raise InvalidInputError("layers", "one or many", self.layers)
        if math.pi * (self.inner_diameter - self.wire.overall_diameter) < self.wire.overall_diameter:
            raise InvalidInputError("wire", f"a wire that passes through the "
                                    f"{format_length(self.inner_diameter)} hole at least once",
                                    self.wire.label)
        object.__setattr__(self, "_layer_table", self._layers())

    # geometry -----------------------------------------------------------------
    def _layers(self, layers: str | None = None) -> tuple[np.ndarray, np.ndarray]:
        """Turns and wire length per turn of each layer, innermost first."""
        layers = self.layers if layers is None else layers
        d = self.wire.overall_diameter
        width = (self.outer_diameter - self.inner_diameter) / 2.0
        counts, per_turn = [], []
        layer = 1
        while True:
            centre_diameter = self.inner_diameter - (2 * layer - 1) * d
            turns = math.floor(math.pi * centre_diameter / d) if centre_diameter > 0 else 0
            if turns < 1:
                break
            counts.append(turns)
            # wire centres (layer − ½)·d off the core on every side: each side of the
            # section's rectangle grows by (2·layer − 1)·d, the perimeter by four times that
            grown = (2 * layer - 1) * d
            per_turn.append(2.0 * (width + self.height) + 4.0 * grown)
            if layers == "one":
                break
            layer += 1
        return np.array(counts, dtype=float), np.array(per_turn)

    def effective_parameters(self) -> dict[str, float]:
        """IEC 60205 C1, C2, le, Ae, Ve of the ring, SI."""
        c1, c2 = ring_core_constants(self.inner_diameter, self.outer_diameter, self.height, self.chamfer)
        le, ae, ve = effective_parameters(c1, c2)
        return {"c1": float(c1), "c2": float(c2), "le": float(le), "ae": float(ae), "ve": float(ve)}

    def turns_one_layer(self) -> int:
        """Turns a single layer on the inside circumference holds."""
        return int(self._layer_table[0][0])

    def turns_window(self) -> int:
        """Turns layer on layer until the hole closes (a theoretical most)."""
        return int(self._layers("many")[0].sum())

    def wire_per_turn(self) -> float:
        """Wire for one turn of the first layer, m."""
        return float(self._layer_table[1][0])

    # protocol -----------------------------------------------------------------
    def inductance(self, turns):
        """L = AL·N², H."""
        return self.al * np.asarray(turns, dtype=float) ** 2

    def min_turns(self) -> float:
        return 1.0

    def max_turns(self) -> float:
        return float(self._layer_table[0].sum())

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn on this core"
        if self.layers == "one":
            return (f"one layer on the {format_length(self.inner_diameter)} inside holds "
                    f"{self.turns_one_layer()} turns of this wire (a winding of many layers holds more)")
        return (f"{int(self.max_turns())} turns of this wire fill the window to the centre "
                f"in {len(self._layer_table[0])} layers")

    def wire_length(self, turns):
        """Wire to cut, m: each turn round the section of its layer, plus the leads."""
        counts, per_turn = self._layer_table
        edges = np.concatenate(([0.0], np.cumsum(counts)))
        lengths = np.concatenate(([0.0], np.cumsum(counts * per_turn)))
        turns = np.asarray(turns, dtype=float)
        # beyond the window, continue at the outermost layer's length per turn
        wound = np.interp(turns, edges, lengths, right=np.nan)
        beyond = turns > edges[-1]
        wound = np.where(beyond, lengths[-1] + (turns - edges[-1]) * per_turn[-1], wound)
        return wound + 2.0 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        """DC resistance of the wire to cut, ohm."""
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def self_capacitance(self, turns):
        """Self-capacitance, F: a rough turn-to-turn estimate (±50 %, see toroid_self_capacitance)."""
        turns = np.asarray(turns, dtype=float)
        pitch = np.pi * (self.inner_diameter - self.wire.overall_diameter) / np.maximum(turns, 2.0)
        pitch = np.maximum(pitch, self.wire.overall_diameter)
        return toroid_self_capacitance(np.maximum(turns, 2.0), self.wire_per_turn(), pitch, self.wire.diameter,
                                       permittivity=2.0)

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: DC resistance × the skin-effect ratio (turns spread round the ring)."""
        return self.resistance(turns, temperature_C) * winding_resistance_factor(self.wire, frequency, temperature_C)

    def with_al(self, al: float, offset: float = 0.0) -> Toroid:
        """This ring with the AL value the readings gave; its permeability is then the one AL implies."""
        import dataclasses

        return dataclasses.replace(self, al=al, mu_r=None)

    def permeability(self) -> float:
        """The core's relative permeability: ``mu_r``, or the one the AL value implies, AL·le/(µ0·Ae)."""
        if self.mu_r is not None:
            return float(self.mu_r)
        parameters = self.effective_parameters()
        return float(self.al * parameters["le"] / (mu_0 * parameters["ae"]))

    def permeability_response(self):
        """g(µ) = µ: a closed ungapped core's L is proportional to its permeability."""
        return lambda mu: mu

    def core_area(self) -> float:
        """Effective cross-section Ae, m²."""
        return self.effective_parameters()["ae"]

    def flux_density(self, turns, current):
        """Peak flux density in the core, T: B = AL·N·I/Ae."""
        return peak_flux_density(self.al, turns, current, self.core_area())
