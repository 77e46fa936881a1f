"""Toroid and gapped-core forms, the saturation check and the AL fit, checked by hand-worked geometry."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.choke import design_choke
from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.forms import GappedCore, Toroid
from coilplan.rewind import closed_core_fit
from coilplan.saturation import saturation_check
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire

WIRE = parse_wire("0.5mm", grade="bare")  # overall = bare = 0.5 mm keeps the hand arithmetic plain


def ring(**changes):
    settings = {"inner_diameter": 14e-3, "outer_diameter": 23e-3, "height": 7.5e-3, "wire": WIRE, "mu_r": 125.0}
    settings.update(changes)
    return Toroid(**settings)


def test_toroid_wire_per_turn_is_the_section_perimeter():
    """One turn round a w × h section, wire centres d/2 off the surface: 2(w + h) + 4d (hand-worked)."""
    core = ring()
    width, height, d = 4.5e-3, 7.5e-3, 0.5e-3
    assert float(core.wire_length(1)) == pytest.approx(2 * (width + height) + 4 * d)
    assert float(core.wire_length(10)) == pytest.approx(10 * (2 * (width + height) + 4 * d))


def test_toroid_layers_fill_towards_the_centre():
    """Layer k holds ⌊π(ID − (2k − 1)d)/d⌋ turns; the second layer's turns are 8d longer than the first's."""
    core = ring(layers="many")
    first = math.floor(math.pi * (14e-3 - 0.5e-3) / 0.5e-3)
    second = math.floor(math.pi * (14e-3 - 1.5e-3) / 0.5e-3)
    assert core.turns_one_layer() == first
    per_turn_first = float(core.wire_length(1))
    extra = float(core.wire_length(first + 1)) - float(core.wire_length(first))
    assert extra == pytest.approx(per_turn_first + 8 * 0.5e-3)
    assert core.max_turns() > first + second


def test_toroid_al_from_permeability_is_iec_60205():
    """AL = µ0·µr·Ae/le with the ring's effective parameters (IEC 60205)."""
    core = ring()
    parameters = core.effective_parameters()
    assert core.al == pytest.approx(4e-7 * math.pi * 125 * parameters["ae"] / parameters["le"], rel=1e-9, abs=0)


def test_toroid_needs_a_core_and_a_hole_the_wire_passes():
    """No permeability, no AL and no reading, or a wire too thick for the hole, is refused naming the field."""
    from coilplan.pipeline import design
    from coilplan.request import Request

    with pytest.raises(InvalidInputError, match=r"^mu_r:"):
        design(ring(mu_r=None), Request(turns=10))
    with pytest.raises(InvalidInputError, match=r"^wire:"):
        ring(inner_diameter=1.0e-3, wire=parse_wire("0.8mm"))


@given(st.floats(min_value=1e-7, max_value=1e-4))
def test_toroid_inverse_round_trip(target):
    """Solving a toroid for a target gives N* with AL·N*² = target (the closed-core law)."""
    core = ring(layers="many")
    if target > float(core.inductance(core.max_turns())):
        return
    if target < float(core.inductance(1)):
        return
    solution = solve_turns(core, target)
    assert core.al * solution.turns_exact**2 == pytest.approx(target, rel=1e-9, abs=0)


def test_gapped_wire_length_layer_by_layer():
    """Round leg of area Ae: layer k's turn is 2π(√(Ae/π) + (k − ½)d) long (hand-worked)."""
    core = GappedCore(ae=50e-6, le=40e-3, wire=WIRE, gap=0.2e-3, mu_r=2000, window_width=5e-3, window_depth=3e-3)
    radius = math.sqrt(50e-6 / math.pi)
    per_layer = 10  # 5 mm / 0.5 mm
    assert core.turns_per_layer() == per_layer
    first_layer = per_layer * 2 * math.pi * (radius + 0.25e-3)
    second_layer = per_layer * 2 * math.pi * (radius + 0.75e-3)
    assert float(core.wire_length(10)) == pytest.approx(first_layer)
    assert float(core.wire_length(20)) == pytest.approx(first_layer + second_layer)
    assert float(core.wire_length(15)) == pytest.approx(first_layer + second_layer / 2)
    assert core.max_turns() == 60


def test_gap_for_al_without_fringing_is_the_closed_form():
    """Without fringing, lg = µ0·Ae/AL − le/µr (inverting AL = µ0 Ae/(lg + le/µr))."""
    core = GappedCore(ae=50e-6, le=40e-3, wire=WIRE, gap=0.0, mu_r=2000, fringing=False)
    al = 200e-9
    expected = 4e-7 * math.pi * 50e-6 / al - 40e-3 / 2000
    assert core.gap_for_al(al) == pytest.approx(expected, rel=1e-6, abs=0)


def test_design_choke_meets_flux_limit_and_inductance():
    """The designed choke stays under the flux limit at the peak current and gives the target."""
    core = GappedCore(ae=52e-6, le=57e-3, wire=WIRE, gap=0.0, mu_r=2300, window_width=10e-3, window_depth=6e-3)
    designed, turns = design_choke(core, 470e-6, 1.5, 0.3)
    assert float(designed.inductance(turns)) == pytest.approx(470e-6, rel=1e-9, abs=0)
    assert float(designed.flux_density(turns, 1.5)) <= 0.3
    assert 470e-6 * 1.5 / ((turns - 1) * 52e-6) > 0.3  # one turn fewer would need B above the limit
    with pytest.raises(InfeasibleError):
        design_choke(core, 50e-3, 5.0, 0.3)


class _Core:
    """A minimal cored form for the saturation check: B = 1 mT per amp per turn, Ae = 1 cm²."""

    def __init__(self, limit):
        self.saturation_flux_density = limit

    def flux_density(self, turns, current):
        return 1e-3 * turns * current

    def core_area(self):
        return 1e-4


def test_saturation_margin_and_largest_current():
    """margin = 1 − B/B_sat; the largest DC current leaves room for the AC on top (hand-worked)."""
    check = saturation_check(_Core(0.3), 10, dc_current=2.0, ac_current=1.0)
    assert check.flux_density_peak == pytest.approx(0.03)
    assert check.margin == pytest.approx(0.9)
    assert check.max_dc_current == pytest.approx((0.3 - 0.01) / 0.01)


def test_saturation_for_air_and_past_the_curie_point():
    """Air (B_sat infinite or unknown) has no limit; a core past its Curie point has none left."""
    assert saturation_check(_Core(math.inf), 10, dc_current=1.0).margin is None
    assert saturation_check(_Core(None), 10, dc_current=1.0).saturation_flux_density is None
    assert saturation_check(_Core(0.0), 10, dc_current=1.0).max_dc_current == 0.0


def test_sine_voltage_flux_density():
    """A sine voltage gives B = √2·V/(2π f N Ae) (Faraday's law)."""
    check = saturation_check(_Core(0.3), 100, ac_voltage=10.0, frequency=1e4)
    assert check.flux_density_ac == pytest.approx(math.sqrt(2) * 10 / (2 * math.pi * 1e4 * 100 * 1e-4))


def test_al_fit_is_the_weighted_least_squares_solution():
    """The AL fit minimises Σ((L − AL·N²)/L)², checked against numpy's lstsq on the scaled system."""
    readings = [(10.2e-6, 10), (41.0e-6, 20), (89.0e-6, 30)]
    inductance = np.array([r[0] for r in readings])
    turns = np.array([r[1] for r in readings], dtype=float)
    design = (turns**2 / inductance)[:, None]
    expected = np.linalg.lstsq(design, np.ones(3), rcond=None)[0][0]
    fit = closed_core_fit(readings)
    assert fit.value == pytest.approx(expected, rel=1e-12, abs=0)
    assert len(fit.residuals) == 3
    with pytest.raises(InvalidInputError):
        closed_core_fit([(1e-6, 10), (2e-6, 10)])
