"""coilplan.physics.multilayer: Wheeler's formulas and the exact turn-by-turn sums against outside references."""

import warnings

import numpy as np
import pytest

from coilplan.errors import OutsideValidityWarning
from coilplan.physics.loops import coaxial_filaments_inductance, coaxial_mutual_inductance, loop_self_inductance
from coilplan.physics.multilayer import (
    layered_winding_layout,
    multilayer_filament_inductance,
    spiral_filament_inductance,
    spiral_filament_inductances,
    spiral_turn_radii,
    wheeler_multilayer_inductance,
    wheeler_spiral_inductance,
)
from coilplan.physics.solenoid import solenoid_inductance

#: Brooks coil constant, L = 1.69938e-6 · a · N² H (Brooks; Grover; docs/methods.md §4, a (b) value).
BROOKS_CONSTANT = 1.69938e-6


def _sheet_winding(mean_radius, length, depth, cell):
    """A winding section filled with square cells of side ``cell``: (inner radius, width, turns)."""
    axial = round(length / cell)
    radial = round(depth / cell)
    return mean_radius - depth / 2.0, length, axial * radial


def test_wheeler_multilayer_within_one_percent_where_terms_are_equal():
    """6a = 9b = 10c: Wheeler claims 1 % (Wheeler 1928; docs/methods.md §4); the exact sum agrees within it."""
    a, b, c = 0.015, 0.010, 0.009  # 6a = 9b = 10c = 0.09 m
    inner, width, turns = _sheet_winding(a, b, c, 0.0005)
    exact = multilayer_filament_inductance(inner, width, 0.0005, turns)
    with warnings.catch_warnings():
        warnings.simplefilter("error", OutsideValidityWarning)  # inside its range: no warning
        wheeler = wheeler_multilayer_inductance(a, b, c, turns)
    assert abs(wheeler / exact - 1) < 0.01


def test_wheeler_multilayer_error_outside_its_range_is_larger_and_warned():
    """A pancake section (b << c): Wheeler's error exceeds the equal-terms case and a warning says so."""
    inner, width, turns = _sheet_winding(0.015, 0.010, 0.009, 0.0005)
    equal_error = abs(wheeler_multilayer_inductance(0.015, 0.010, 0.009, turns)
                      / multilayer_filament_inductance(inner, width, 0.0005, turns) - 1)
    a, b, c = 0.015, 0.002, 0.020
    inner, width, turns = _sheet_winding(a, b, c, 0.0005)
    exact = multilayer_filament_inductance(inner, width, 0.0005, turns)
    with pytest.warns(OutsideValidityWarning, match="about equal"):
        wheeler = wheeler_multilayer_inductance(a, b, c, turns)
    pancake_error = abs(wheeler / exact - 1)
    # docs/methods.md §4a: the error grows when the terms are unequal (about 6 % here, computed).
    assert pancake_error > 2 * equal_error and pancake_error > 0.02


@pytest.mark.parametrize("cells", [40, 80])
def test_brooks_coil_constant(cells):
    """A Brooks winding (square section c, inner diameter 2c) gives L = 1.69938e-6·a·N² (Brooks; Grover).

    The filament sum of round wires filling the square differs from a uniform current
    by the round-wire correction, of order mu0·a·N against mu0·a·N², i.e. O(1/N): about
    0.08/N here, so 1600 turns are allowed 1e-4 and 6400 turns 2e-5 (the constant's own
    six digits are good to 1e-5).
    """
    c = 0.03
    cell = c / cells
    turns = cells * cells
    L = multilayer_filament_inductance(c, c, cell, turns)
    assert L / (1.5 * c * turns**2) == pytest.approx(BROOKS_CONSTANT, rel=1e-4 if cells == 40 else 2e-5)


def test_brooks_discretisation_error_falls_as_one_over_n():
    """The departure from Brooks' constant is the O(1/N) round-wire term: 4 × the turns, a quarter the error."""
    def error(cells):
        c = 0.03
        L = multilayer_filament_inductance(c, c, c / cells, cells * cells)
        return L / (1.5 * c * cells**4) / BROOKS_CONSTANT - 1
    ratio = error(10) / error(20)
    assert 3.5 < ratio < 4.5


def test_spiral_equals_the_direct_sum_of_loops():
    """One layer of concentric turns equals Σ L_loop + 2 Σ M (Maxwell), added up here turn by turn."""
    inner, pitch, wire, turns = 0.012, 0.0015, 0.0008, 12
    radii = spiral_turn_radii(inner, pitch, turns)
    direct = sum(float(loop_self_inductance(r, wire / 2)) for r in radii)
    for i in range(turns):
        for j in range(i + 1, turns):
            direct += 2 * float(coaxial_mutual_inductance(radii[i], radii[j], 0.0))
    assert spiral_filament_inductance(inner, pitch, wire, turns) == pytest.approx(direct, rel=1e-12)


def test_single_layer_case_agrees_with_rosa_nagaoka():
    """One layer of 25 turns, D = 50 mm, p = 2 mm, d = 1 mm: within a few parts in 10,000 of Rosa (Knight)."""
    exact = multilayer_filament_inductance(0.024, 0.05, 0.001, 25, overall_diameter=0.002)
    assert exact == pytest.approx(float(solenoid_inductance(0.05, 0.002, 0.001, 25)), rel=3e-4)


@pytest.mark.parametrize("style", ["layered", "staggered"])
def test_scaling_all_lengths_scales_inductance(style):
    """Every length × s gives L × s for an air coil (dimensional analysis; style.md physics checks)."""
    base = multilayer_filament_inductance(0.004, 0.006, 0.0003, 150, overall_diameter=0.00033, style=style,
                                          packing=1.07)
    scaled = multilayer_filament_inductance(0.004 * 3.5, 0.006 * 3.5, 0.0003 * 3.5, 150,
                                            overall_diameter=0.00033 * 3.5, style=style, packing=1.07)
    assert scaled == pytest.approx(3.5 * base, rel=1e-12)
    spiral = spiral_filament_inductance(0.01, 0.002, 0.001, 15)
    assert spiral_filament_inductance(0.01 * 0.2, 0.002 * 0.2, 0.001 * 0.2, 15) == pytest.approx(0.2 * spiral,
                                                                                               rel=1e-12)


@pytest.mark.parametrize("style", ["layered", "staggered"])
@pytest.mark.parametrize("turns", [1, 7, 44, 45, 46, 133])
def test_layer_regrouping_equals_the_direct_pair_sum(style, turns):
    """The layer-pair regrouping gives the same total as the direct pair sum, partial last layer included."""
    regrouped = multilayer_filament_inductance(0.005, 0.01, 0.0002, turns, overall_diameter=0.00022, style=style)
    direct = multilayer_filament_inductance(0.005, 0.01, 0.0002, turns, overall_diameter=0.00022, style=style,
                                            regroup=False)
    assert regrouped == pytest.approx(direct, rel=1e-12)


def test_staggered_layout_is_orthocyclic():
    """Staggered: odd layers shifted half a pitch, one turn fewer, layer pitch √3/2 of the pitch (geometry)."""
    radii, offsets, counts, p, h = layered_winding_layout(0.005, 0.005, 0.001, 12, style="staggered")
    assert counts.tolist() == [5, 4, 3]
    assert h == pytest.approx(np.sqrt(3) / 2 * p)
    assert offsets[1] - offsets[0] == pytest.approx(p / 2)
    # nested turns touch: centre distance between a turn and its neighbour below is one wire diameter
    assert np.hypot(p / 2, radii[1] - radii[0]) == pytest.approx(0.001)


def test_wheeler_spiral_within_five_percent_for_a_wide_spiral():
    """c > 0.2a: Wheeler's spiral formula within its 5 % (Pender & McIlwain) of the exact sum of a sheet-like spiral."""
    inner, pitch, turns = 0.01, 0.0005, 40  # c = 20 mm, a = 20 mm
    exact = spiral_filament_inductance(inner, pitch, pitch * 0.9, turns)
    c = turns * pitch
    assert wheeler_spiral_inductance(inner + c / 2, c, turns) == pytest.approx(exact, rel=0.05)
    with pytest.warns(OutsideValidityWarning, match="0.2"):
        wheeler_spiral_inductance(0.05, 0.005, 5)


def test_direct_and_filament_engine_agree_for_spiral():
    """spiral_filament_inductance is the sum of coaxial_filaments_inductance over its radii in one plane,
    to rounding (its in-plane kernel K − E is the general kernel's Carlson R_D in another form)."""
    radii = spiral_turn_radii(0.02, 0.001, 8)
    assert spiral_filament_inductance(0.02, 0.001, 0.0005, 8) == pytest.approx(coaxial_filaments_inductance(
        radii, np.zeros(8), 0.00025), rel=1e-14)


@pytest.mark.parametrize(("inner", "pitch", "turns"), [(0.015, 0.000535, 700), (1e-5, 0.0006, 300), (5.0, 0.0006, 40)])
def test_spiral_counts_from_one_pass_equal_the_general_sum(inner, pitch, turns):
    """Every count 1 .. N from one pass equals the general pair sum over that many turns: across the
    in-plane kernel's switch at (a/b)² = 0.1 (a tiny hole), with blocks of rows, and for a huge hole."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)  # a tiny hole: thick wire for the first turn
        counts = spiral_filament_inductances(inner, pitch, 0.0005, turns)
        for n in (1, 2, 255, 256, 257, turns):
            if n <= turns:
                general = coaxial_filaments_inductance(spiral_turn_radii(inner, pitch, n), np.zeros(n), 0.00025)
                assert counts[n - 1] == pytest.approx(general, rel=1e-13)
