"""The gapped-core form: a winding on a bobbin of an E, pot or drum core with an air gap."""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.forms._checks import positive
from coilplan.forms._losses import winding_resistance_factor
from coilplan.forms._winding import CoreLaw, Rewindable
from coilplan.physics.frequency import multilayer_self_capacitance
from coilplan.physics.magnetic import fringing_factor, gapped_al, peak_flux_density
from coilplan.quantities import format_length, format_quantity
from coilplan.wire import Wire

__all__ = ["GappedCore"]


@dataclass(frozen=True)
class GappedCore(CoreLaw, Rewindable):
    """Turns on a gapped core, L = AL·N² with AL = F·µ0·Ae/(lg + le/µr).

    Parameters
    ----------
    ae, le : float
        Effective area (m²) and magnetic path length (m) of the core, from its
        data or measured (IEC 60205 definitions).
    wire : Wire
        The wire.
    gap : float, optional
        Total air-gap length in the magnetic path, m (an E pair gapped on the
        centre leg only: that gap; spacers under all legs: twice the spacer).
    mu_r : float, optional
        Relative permeability of the core material (needed with ``gap``).
    al : float, optional
        A known or measured AL value, H per turn², instead of ``gap``/``mu_r``.
    window_width : float, optional
        Winding width along the leg (bobbin length), m: sets the turns per
        layer and, as the window height G, McLyman's fringing factor.
    window_depth : float, optional
        Radial depth of the winding space, m: with ``window_width``, the
        number of layers and so the turns that fit.
    fringing : bool
        Apply McLyman's fringing factor (needs ``window_width``).
    saturation_flux_density : float, optional
        B at which the material saturates at the working temperature, T.
    lead : float
        Lead allowance per end, m.

    Notes
    -----
    Mean turn length: a round centre leg of area Ae is assumed, so layer k's
    turn is 2π(√(Ae/π) + (k − ½)d) long; a square leg is about 13 % longer
    per turn (common practice, no source). Turns that fit: layer winding,
    ⌊width/d⌋ per layer and ⌊depth/d⌋ layers.
    """

    ae: float
    le: float
    wire: Wire
    gap: float | None = None
    mu_r: float | None = None
    al: float | None = None
    window_width: float | None = None
    window_depth: float | None = None
    fringing: bool = True
    saturation_flux_density: float | None = None
    lead: float = 0.0

    def __post_init__(self) -> None:
        positive(self.ae, "ae", "an effective area")
        positive(self.le, "le", "an effective path length")
        positive(self.mu_r, "mu_r", "a relative permeability")
        positive(self.al, "al", "an AL value")
        positive(self.window_width, "window_width", "a winding width")
        positive(self.window_depth, "window_depth", "a winding depth")
        if self.gap is not None and not (math.isfinite(self.gap) and self.gap >= 0):
            raise InvalidInputError("gap", "a gap length of zero or more", self.gap)
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if self.gap is not None and self.gap > 0.5 * self.le:
            raise InvalidInputError("gap", f"a gap well below the path length {format_length(self.le)}",
                                    format_length(self.gap))
        for name, value in (("window_width", self.window_width), ("window_depth", self.window_depth)):
            if value is not None and value < self.wire.overall_diameter:
                raise InvalidInputError(name, f"at least one wire diameter "
                                        f"({format_length(self.wire.overall_diameter)})", format_length(value))

    # magnetics ----------------------------------------------------------------
    def fringing_factor(self, gap: float | None = None) -> float:
        """McLyman's F for ``gap`` (default this core's), 1 when not applied."""
        gap = self.gap if gap is None else gap
        if not self.fringing or self.window_width is None or not gap:
            return 1.0
        return float(fringing_factor(gap, self.ae, self.window_width))

    def al_for_gap(self, gap):
        """AL for a gap length, H per turn², fringing included when applied."""
        base = gapped_al(self.ae, self.le, gap, self.mu_r)
        if not self.fringing or self.window_width is None:
            return base
        return base * fringing_factor(gap, self.ae, self.window_width)

    def settle(self, request):
        """(core, request, fields): a core whose gap is left open takes it from the request.

        Turns with a target give the gap for AL = L/N²; a target with a current gives the turns and the gap of
        a choke that carries it below the flux limit (:func:`coilplan.choke.design_choke`). A core with a gap,
        an AL value or readings is used as it is.
        """
        import dataclasses

        if self.gap is not None or self.al is not None or request.readings:
            if request.turns is not None and request.target is not None:
                raise InvalidInputError("target", "either turns or a target with a known gap, not both", None)
            return self, request, {"mode": "given"}
        if self.mu_r is None:
            raise InvalidInputError("mu_r", "the core's permeability, a known AL value, or a reading", None)
        target, drive = request.target, request.drive
        if request.turns is not None and target is not None:
            core = dataclasses.replace(self, gap=self.gap_for_al(target / request.turns**2))
            return core, dataclasses.replace(request, target=None), {"mode": "gap for turns", "asked_H": target}
        if target is not None and request.turns is None and (drive.dc_current or drive.ac_current):
            from coilplan.choke import design_choke
            from coilplan.saturation import NEAR_SATURATION

            limit = drive.flux_limit
            if limit is None and self.saturation_flux_density is None:
                raise InvalidInputError("flux_limit", "a flux-density limit, a saturation flux density or a "
                                        "material class", None)
            limit = NEAR_SATURATION * self.saturation_flux_density if limit is None else limit
            core, turns = design_choke(self, target, drive.dc_current + drive.ac_current, limit)
            fields = {"mode": "choke design", "asked_H": target, "max_flux_density_T": limit}
            return core, dataclasses.replace(request, target=None, turns=turns), fields
        raise InvalidInputError("gap", "a gap, or turns with a target (gives the gap), or a target with a current "
                                "(gives the turns and the gap)", None)

    @property
    def al_value(self) -> float:
        """The AL value in use, H per turn²."""
        return float(self.al) if self.al is not None else float(self.al_for_gap(self.gap))

    def gap_for_al(self, al: float) -> float:
        """Gap length giving AL = ``al``, m; InfeasibleError when the ungapped core cannot reach it.

        Without fringing: lg = µ0·Ae/AL − le/µr. With it, AL(lg) falls monotonically with
        lg, and the root is found by bisection on ln lg.
        """
        if self.mu_r is None:
            raise InvalidInputError("mu_r", "the core's permeability (or a material class) to compute a gap", None)
        ungapped = float(gapped_al(self.ae, self.le, 0.0, self.mu_r))
        if al >= ungapped:
            raise InfeasibleError(
                f"AL {format_quantity(al, 'H')} per turn² is at or above the ungapped core's "
                f"{format_quantity(ungapped, 'H')}: use more turns, or a core of higher permeability",
                option="target")
        low, high = 1e-9, 0.5 * self.le
        if float(self.al_for_gap(high)) > al:
            raise InfeasibleError(f"even a {format_length(high)} gap leaves AL above "
                                  f"{format_quantity(al, 'H')}: use fewer turns", option="target")
        for _ in range(200):
            middle = math.sqrt(low * high)
            if float(self.al_for_gap(middle)) > al:
                low = middle
            else:
                high = middle
            if high / low - 1 < 1e-13:
                break
        return math.sqrt(low * high)

    def permeability_response(self):
        """g(µ) = AL(µ) at this core's gap; None when the permeability is not known.

        With a measured AL the gap is the one that gives it (:meth:`gap_for_al`); a measured
        AL at or above the ungapped core's says the gap is negligible, and g(µ) = µ.
        """
        if self.mu_r is None:
            return None
        gap = self.gap
        if self.al is not None:
            try:
                gap = self.gap_for_al(float(self.al))
            except InfeasibleError:
                return lambda mu: mu
        factor = self.fringing_factor(gap)
        return lambda mu: gapped_al(self.ae, self.le, gap, mu) * factor

    # protocol -----------------------------------------------------------------
    def inductance(self, turns):
        """L = AL·N², H."""
        return self.al_value * np.asarray(turns, dtype=float) ** 2

    def min_turns(self) -> float:
        return 1.0

    def turns_per_layer(self) -> int | None:
        if self.window_width is None:
            return None
        return math.floor(self.window_width / self.wire.overall_diameter)

    def max_turns(self) -> float:
        per_layer = self.turns_per_layer()
        if per_layer is None or self.window_depth is None:
            return math.inf
        return float(per_layer * math.floor(self.window_depth / self.wire.overall_diameter))

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn on this core"
        return (f"the {format_length(self.window_width)} × {format_length(self.window_depth)} winding "
                f"space holds {int(self.max_turns())} turns of this wire")

    def wire_length(self, turns):
        """Wire to cut, m: layer by layer round a round leg of area Ae, plus the leads."""
        turns = np.asarray(turns, dtype=float)
        d = self.wire.overall_diameter
        leg_radius = math.sqrt(self.ae / math.pi)
        per_layer = self.turns_per_layer()
        if per_layer is None:  # no window given: one even layer's worth of length per turn
            return turns * 2 * math.pi * (leg_radius + d / 2) + 2 * self.lead
        full_layers = np.floor(turns / per_layer)
        # layers 1..m complete: per_layer * 2π Σ (r + (k − ½)d) = per_layer 2π (m r + m² d/2)
        complete = per_layer * 2 * math.pi * (full_layers * leg_radius + full_layers**2 * d / 2)
        partial = (turns - full_layers * per_layer) * 2 * math.pi * (leg_radius + (full_layers + 0.5) * d)
        return complete + partial + 2 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        """DC resistance of the wire to cut, ohm."""
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def layers(self, turns) -> np.ndarray:
        """Layers the winding takes (1 when no window width is given)."""
        per_layer = self.turns_per_layer()
        turns = np.asarray(turns, dtype=float)
        return np.ones_like(turns) if per_layer is None else np.ceil(turns / per_layer)

    def self_capacitance(self, turns):
        """Self-capacitance, F: the layer-to-layer estimate of a layered winding (rough, tens of percent)."""
        d = self.wire.overall_diameter
        layers = self.layers(turns)
        mean_diameter = 2.0 * (math.sqrt(self.ae / math.pi) + layers * d / 2.0)
        width = self.window_width if self.window_width is not None else d * np.asarray(turns, dtype=float)
        gap = (d - self.wire.diameter) + 0.2 * d  # enamel both sides plus a fifth of a wire: touching round wire
        return multilayer_self_capacitance(mean_diameter, width, layers, gap, permittivity=3.0)

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: Dowell's factor for the winding's layers (porosity included)."""
        factor = winding_resistance_factor(self.wire, frequency, temperature_C, layers=self.layers(turns),
                                           turns_per_layer=self.turns_per_layer(), window_width=self.window_width)
        return self.resistance(turns, temperature_C) * factor

    def core_area(self) -> float:
        """Effective cross-section Ae, m²."""
        return self.ae

    def flux_density(self, turns, current):
        """Peak flux density in the core, T: B = AL·N·I/Ae."""
        return peak_flux_density(self.al_value, turns, current, self.core_area())
