"""The copper's AC resistance factor for a winding, by the method that fits its wire and layout."""

from __future__ import annotations

import numpy as np

from coilplan.physics.frequency import (
    dowell_delta,
    dowell_factor,
    litz_resistance_ratio,
    round_wire_resistance_ratio,
    skin_depth,
    solenoid_proximity_factor,
)
from coilplan.wire import Wire, copper_resistivity

__all__ = ["winding_resistance_factor"]


def winding_resistance_factor(wire: Wire, frequency, temperature_C: float = 20.0, *, pitch=None, layers=1,
                              turns_per_layer=None, window_width=None):
    """R_ac/R_dc of a winding's copper at ``frequency``.

    * litz (``wire.strands > 1``): per-strand skin effect plus proximity (Sullivan's low-frequency form);
    * several layers with a known window: Dowell's factor with the layer porosity;
    * one layer at a known pitch: the single-layer proximity factor (Dowell's one-layer form, labelled);
    * otherwise: the isolated round wire's exact skin-effect ratio.
    """
    resistivity = copper_resistivity(temperature_C)
    if wire.strands > 1:
        return litz_resistance_ratio(wire.strand_diameter, wire.strands, frequency, resistivity,
                                     bundle_diameter=wire.diameter, layers=np.maximum(layers, 1),
                                     turn_pitch=pitch)
    if turns_per_layer is not None and window_width is not None and np.any(np.asarray(layers) > 1):
        delta = dowell_delta(wire.diameter, skin_depth(frequency, resistivity), turns_per_layer, window_width)
        return dowell_factor(delta, layers)
    if pitch is not None:
        return solenoid_proximity_factor(wire.diameter, pitch, frequency, resistivity)
    return round_wire_resistance_ratio(wire.diameter / 2.0, frequency, resistivity)
