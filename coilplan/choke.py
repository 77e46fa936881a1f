r"""Designing a gapped choke: the turns and the gap that carry a DC current at a target inductance.

The flux a choke must carry without saturating sets its turns; the gap then
sets its AL. With the peak current Î and a design flux-density limit B_max:

.. math::

    N \ge \frac{L\,\hat I}{B_{max} A_e} \quad(\text{from } B = L I/(N A_e)),\qquad
    A_L = L/N^2 \;\Rightarrow\; l_g \text{ from } A_L(l_g)

The fewest turns that meet both the flux limit and the ungapped core's AL are
taken (fewest turns: least copper, lowest resistance), then the winding must
fit the window. This is the usual energy-storage design of a gapped inductor
(McLyman 2004, ch. 8).
"""

from __future__ import annotations

import dataclasses
import math

from coilplan.errors import InfeasibleError
from coilplan.forms import GappedCore
from coilplan.physics.magnetic import gapped_al
from coilplan.quantities import format_quantity

__all__ = ["design_choke"]


def design_choke(core: GappedCore, target: float, peak_current: float,
                 max_flux_density: float) -> tuple[GappedCore, int]:
    """The core with the gap that gives ``target`` at the fewest turns that stay below ``max_flux_density``.

    Parameters
    ----------
    core : GappedCore
        The core, wire and window (its own gap and AL are ignored; ``mu_r`` is needed).
    target : float
        Inductance, H.
    peak_current : float
        DC plus AC peak current, A (> 0).
    max_flux_density : float
        Design limit for the peak flux density, T (below saturation).

    Returns
    -------
    tuple
        (GappedCore with the gap set, turns).

    Raises
    ------
    InfeasibleError
        When the turns the flux needs do not fit the window.
    """
    if not max_flux_density > 0:  # a material past its Curie point: B_sat is zero there
        raise InfeasibleError(f"the flux-density limit is {format_quantity(max_flux_density, 'T')}: at this "
                              f"temperature the core is past its Curie point and carries no flux, so no number of "
                              f"turns carries {format_quantity(peak_current, 'A')}; work it cooler",
                              option="temperature")
    flux_turns = target * peak_current / (max_flux_density * core.ae)
    ungapped_al = float(gapped_al(core.ae, core.le, 0.0, core.mu_r))
    al_turns = math.sqrt(target / ungapped_al)
    turns = max(math.ceil(flux_turns - 1e-9), math.floor(al_turns) + 1, 1)
    if turns > core.max_turns():
        raise InfeasibleError(
            f"{format_quantity(target, 'H')} at {format_quantity(peak_current, 'A')} needs at least "
            f"{turns} turns to stay below {format_quantity(max_flux_density, 'T')}, but "
            f"{core.limit_reason(core.max_turns())}: use a larger core or thinner wire",
            option="peak_current")
    gap = core.gap_for_al(target / turns**2)
    return dataclasses.replace(core, gap=gap, al=None), turns
