"""MultilayerCoil and FlatSpiral answer the form protocol: inverse round trip, limits, wire, warnings."""

import math
import warnings

import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from coilplan.errors import InfeasibleError, InvalidInputError, OutsideValidityWarning
from coilplan.forms import FlatSpiral, MultilayerCoil
from coilplan.physics.multilayer import multilayer_filament_inductance
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire


def wire(text="0.3mm", grade="1"):
    return parse_wire(text, grade=grade, overall=None)


@settings(max_examples=8, deadline=None)
@given(turns=st.integers(2, 400), style=st.sampled_from(["layered", "staggered"]),
       packing=st.floats(1 / 1.2, 1.0), width_mm=st.floats(3.0, 20.0))
def test_multilayer_inverse_round_trip(turns, style, packing, width_mm):
    """Solving for the inductance of N turns returns N (style.md: the inverse round trip)."""
    form = MultilayerCoil(former_diameter=0.01, width=width_mm / 1000, wire=wire(), style=style, packing=packing)
    assert solve_turns(form, float(form.inductance(turns))).turns == turns


@settings(max_examples=8, deadline=None)
@given(turns=st.integers(2, 80), spacing_mm=st.floats(0.0, 1.0), method=st.sampled_from(["filament", "wheeler"]))
def test_spiral_inverse_round_trip(turns, spacing_mm, method):
    """Solving for the inductance of N spiral turns returns N."""
    form = FlatSpiral(inner_diameter=0.02, wire=wire("0.5mm"), spacing=spacing_mm / 1000, method=method)
    assert solve_turns(form, float(form.inductance(turns))).turns == turns


def test_inductance_interpolates_between_whole_turns_and_rises():
    """Non-integer N: linear between whole-turn values (as Solenoid's filament method); L rises with N."""
    form = MultilayerCoil(former_diameter=0.008, width=0.005, wire=wire("0.2mm"))
    values = form.inductance(np.array([30.0, 30.25, 31.0]))
    assert values[1] == pytest.approx(values[0] + 0.25 * (values[2] - values[0]), rel=1e-14)
    assert np.all(np.diff(form.inductance(np.arange(1.0, 120.0))) > 0)
    exact = multilayer_filament_inductance(0.004, 0.005, 0.2e-3, 31, overall_diameter=form.wire.overall_diameter)
    assert values[2] == pytest.approx(exact, rel=1e-14)


def test_window_limits_the_turns():
    """max_turns counts the full and staggered layers that the depth holds (geometry)."""
    d = wire("0.5mm", "bare").overall_diameter  # bare: overall = 0.5 mm
    form = MultilayerCoil(former_diameter=0.01, width=0.005, wire=wire("0.5mm", "bare"), style="staggered",
                          max_depth=0.5e-3 + 2 * math.sqrt(3) / 2 * d + 1e-7)
    assert form.max_turns() == 10 + 9 + 10  # three layers: 10, 9, 10
    assert float(form.depth(29)) <= form.max_depth


def test_wire_length_of_layers():
    """Wire is Σ 2π r over the turns: one full layer of 10 and two turns on the next, by hand."""
    w = wire("0.5mm", "bare")
    form = MultilayerCoil(former_diameter=0.01, width=0.005, wire=w, lead=0.02)
    expected = 10 * 2 * math.pi * 0.00525 + 2 * 2 * math.pi * 0.00575 + 0.04
    assert float(form.wire_length(12)) == pytest.approx(expected)
    spiral = FlatSpiral(inner_diameter=0.02, wire=w, spacing=0.5e-3)
    assert float(spiral.wire_length(3)) == pytest.approx(2 * math.pi * (0.01025 + 0.01125 + 0.01225))


def test_wheeler_method_warns_outside_its_range():
    """A flat, deep section: validity_warnings says Wheeler is outside its range (docs/methods.md §4)."""
    form = MultilayerCoil(former_diameter=0.01, width=0.002, wire=wire("0.2mm"), method="wheeler-1928")
    with pytest.warns(OutsideValidityWarning, match="Wheeler"):
        form.validity_warnings(400)


def test_bad_input_names_the_field():
    """Errors name the field: a width below one turn, packing above 1, touching bare spiral turns."""
    with pytest.raises(InvalidInputError, match=r"^width:"):
        MultilayerCoil(former_diameter=0.01, width=0.0001, wire=wire())
    with pytest.raises(InvalidInputError, match=r"^packing:"):
        MultilayerCoil(former_diameter=0.01, width=0.01, wire=wire(), packing=1.1)
    with pytest.raises(InvalidInputError, match=r"^spacing:"):
        FlatSpiral(inner_diameter=0.01, wire=wire("0.5mm", "bare"))


def test_frequency_model_is_finite():
    """Self-capacitance and AC resistance are finite and positive; AC above DC (skin effect)."""
    form = MultilayerCoil(former_diameter=0.01, width=0.01, wire=wire())
    spiral = FlatSpiral(inner_diameter=0.02, wire=wire("0.5mm"), spacing=0.5e-3)
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)
        for f, n in ((form, 1), (form, 300), (spiral, 20)):
            assert float(f.self_capacitance(n)) > 0
            assert float(f.ac_resistance(n, 2e6)) > float(f.resistance(n))


# --- limits that hold for every method, and the cost of a whole-turn answer (issue 8) -------------------------


@pytest.mark.parametrize("method", ["filament", "wheeler-1928"])
def test_multilayer_limit_holds_for_both_methods(method):
    """Every answer gives the turn-by-turn sum (Wheeler's figure beside it), so both methods stop where the
    sum does: 200 layers of 24 turns here (8 mm / 0.3265 mm pitch); an unreachable target is refused there."""
    form = MultilayerCoil(former_diameter=0.01, width=0.008, wire=wire(), method=method)
    assert form.max_turns() == 200 * 24
    with pytest.raises(InfeasibleError, match="turn-by-turn sum, given with every answer, stops at 4800 turns"):
        solve_turns(form, 1e3)


@pytest.mark.parametrize("method", ["filament", "wheeler"])
def test_spiral_limit_holds_for_both_methods(method):
    form = FlatSpiral(inner_diameter=0.03, wire=wire("0.5mm"), method=method)
    assert form.max_turns() == 3000
    with pytest.raises(InfeasibleError, match="stops at 3000 turns"):
        solve_turns(form, 1e3)


def test_whole_turns_cost_one_sum_each(monkeypatch):
    """At a whole number of turns the exact sum is evaluated there only, not also at N + 1 (the value is the
    same: linear interpolation with a zero fraction); between whole numbers, at both neighbours."""
    import coilplan.physics.multilayer as physics

    asked = []
    original = physics.multilayer_filament_inductance

    def counting(inner, width, diameter, turns, **options):
        asked.append(turns)
        return original(inner, width, diameter, turns, **options)

    monkeypatch.setattr(physics, "multilayer_filament_inductance", counting)
    form = MultilayerCoil(former_diameter=0.01, width=0.008, wire=wire())
    whole = float(form.inductance(300))
    assert asked == [300]
    between = float(form.inductance(300.25))
    assert asked == [300, 301]  # 300 is cached
    assert whole < between < float(form.inductance(301))


def test_spiral_counts_come_from_one_pass(monkeypatch):
    """A spiral's turns keep their radii as it grows: one pass answers every count up to the largest asked,
    and each count equals the sum over that many turns alone."""
    import coilplan.physics.multilayer as physics

    passes = []
    original = physics.spiral_filament_inductances

    def counting(inner, pitch, diameter, turns):
        passes.append(turns)
        return original(inner, pitch, diameter, turns)

    monkeypatch.setattr(physics, "spiral_filament_inductances", counting)
    form = FlatSpiral(inner_diameter=0.03, wire=wire("0.5mm"))
    solution = solve_turns(form, 50e-6)
    assert len(passes) <= 8  # doubling 2, 4, 8, ... then the root: one pass per doubling, none per iteration
    inner = 0.015 + form.wire.overall_diameter / 2 - form.radial_pitch / 2
    alone = physics.spiral_filament_inductance(inner, form.radial_pitch, form.wire.diameter, solution.turns)
    assert solution.inductance == pytest.approx(float(alone), rel=1e-13)


def test_most_that_fit_only_where_the_sum_can_say_what_it_gives():
    """A window deeper than the turn-by-turn sum goes (a 100 m build) gets no "most that fit" figure: its
    inductance would be the sum over millions of turns. A window within the sum keeps its figure."""
    deep = MultilayerCoil(former_diameter=0.01, width=0.008, wire=wire("0.2mm"), max_depth=100.0)
    assert deep.fit_turns() == math.inf and deep.max_turns() == deep._exact_limit()
    shallow = MultilayerCoil(former_diameter=0.01, width=0.008, wire=wire("0.2mm"), max_depth=0.005)
    assert shallow.fit_turns() == shallow._window_turns() < shallow._exact_limit()
    wide = FlatSpiral(inner_diameter=0.02, wire=wire("0.5mm"), spacing=0.0005, outer_diameter=100.0)
    assert wide.fit_turns() == math.inf and wide.max_turns() == 3000
    narrow = FlatSpiral(inner_diameter=0.02, wire=wire("0.5mm"), spacing=0.0005, outer_diameter=0.05)
    assert narrow.fit_turns() == narrow.max_turns() < 3000
