"""Single-layer solenoid physics against published tables and independent mpmath evaluations."""

import math
import warnings

import mp_reference as ref
import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.errors import OutsideValidityWarning
from coilplan.physics import solenoid as sol

# Grover 1946, Table 36 (K against l/D), six decimals, as transcribed in a public file
# (docs/methods.md §1, item (a)); the tolerance is the table's rounding.
GROVER_TABLE_36 = [
    pytest.param(1.0, 0.688423, id="D/l=1"),
    pytest.param(2.0, 0.525510, id="l/D=0.5"),
    pytest.param(5.0, 0.319825, id="l/D=0.2"),
    pytest.param(10.0, 0.203324, id="l/D=0.1"),
    pytest.param(100.0, 0.034960, id="l/D=0.01"),
]


@pytest.mark.parametrize(("ratio", "table"), GROVER_TABLE_36)
def test_nagaoka_matches_grover_table_36(ratio, table):
    """Nagaoka's coefficient reproduces Grover's Table 36 to its six printed decimals."""
    assert abs(float(sol.nagaoka_coefficient(ratio)) - table) <= 0.6e-6


@pytest.mark.parametrize("ratio", [0.1, 0.2, 0.5])
def test_nagaoka_long_coil_side_from_memory(ratio):
    """Long-coil side of the 1912/1946 tables, four decimals (from memory: 0.9588, 0.9201, 0.8181)."""
    remembered = {0.1: 0.9588, 0.2: 0.9201, 0.5: 0.8181}[ratio]
    assert abs(float(sol.nagaoka_coefficient(ratio)) - remembered) <= 0.6e-4


def test_nagaoka_against_mpmath_over_sixteen_decades():
    """The vectorised coefficient agrees with mpmath's textbook form within its stated error for long and short
    coils alike: 1e-14 up to D/l = 10, about 1e-16·x² to 5e-14 at 26, then the short-coil expansion (which the
    closed form, losing ~1e-16·x², would not meet) keeps 1e-14 at any shortness."""
    ratios = np.logspace(-8, 8, 160)
    ours = sol.nagaoka_coefficient(ratios)
    for ratio, value in zip(ratios, ours, strict=True):
        exact = float(ref.nagaoka(ratio, dps=60))
        assert abs(value / exact - 1) <= _stated_error(ratio), ratio


def _stated_error(ratio):
    """The coefficient's stated relative error at D/l = ratio (its docstring)."""
    return min(max(1e-14, 1e-16 * ratio * ratio), 5e-14) if ratio <= 26 else 1e-14


@given(st.floats(min_value=1e-6, max_value=1e7))
def test_nagaoka_against_mpmath_property(ratio):
    """Any D/l in a wide range: agreement with mpmath within the stated error."""
    exact = float(ref.nagaoka(ratio, dps=50))
    assert abs(float(sol.nagaoka_coefficient(ratio)) / exact - 1) <= _stated_error(ratio)


def test_nagaoka_of_a_disc_of_current_stays_finite():
    """A sheet a millionth of its diameter long, or shorter still: K_L → (2/(πx))(ln 4x − 1/2) (the short
    solenoid's leading term, Rosa & Grover 1912), never NaN, down to the largest float ratio."""
    for ratio in (1e6, 1e12, 1e100, 1e300):
        value = float(sol.nagaoka_coefficient(ratio))
        leading = 2 / (math.pi * ratio) * (math.log(4 * ratio) - 0.5)
        assert math.isfinite(value) and value == pytest.approx(leading, rel=1e-9)


def test_nagaoka_limits_and_masks():
    """Infinitely long → 1, zero length → 0, NaN and negative → NaN; shape is kept."""
    values = sol.nagaoka_coefficient(np.array([[0.0, np.inf], [np.nan, -1.0]]))
    assert values.shape == (2, 2)
    assert values[0, 0] == 1.0 and values[0, 1] == 0.0
    assert np.isnan(values[1]).all()


def test_nagaoka_is_one_minus_demagnetising_factor():
    """1 − K_L is the magnetometric demagnetising factor of a cylinder (χ = 0), docs/methods.md §9."""
    # Values (b) in docs/methods.md §9 come from the same identity; recompute via mpmath here.
    for length_over_diameter in (1, 2, 5, 10, 20):
        exact = 1 - ref.nagaoka(1 / length_over_diameter)
        ours = 1 - float(sol.nagaoka_coefficient(1 / length_over_diameter))
        assert abs(ours - float(exact)) < 1e-13


def test_wheeler_1928_within_published_accuracy_where_it_applies():
    """Wheeler 1928 is within its claimed 1 % of the exact sheet for l > 0.8 r (Wheeler 1928)."""
    ratios = np.linspace(1e-3, 2.5, 2000)  # D/l <= 2.5  <=>  l >= 0.8 r
    error = sol.wheeler_1928_coefficient(ratios) / sol.nagaoka_coefficient(ratios) - 1
    assert np.max(np.abs(error)) < 0.01


def test_wheeler_1928_outside_range_warns_and_degrades():
    """Outside l > 0.8 r the formula warns; at l = 0.2 r it is about 11 % low (docs/methods.md §2a)."""
    with pytest.warns(OutsideValidityWarning):
        value = sol.wheeler_1928_coefficient(10.0)  # l = 0.2 r
    error = float(value) / float(ref.nagaoka(10.0)) - 1
    assert -0.12 < error < -0.09


def test_wheeler_1928_worked_example():
    """r = 1 in, l = 2 in, N = 20: the formula gives 400/(9 + 20) µH = 13.793 µH (Wheeler 1928)."""
    radius, length, turns = 0.0254, 0.0508, 20
    value = sol.current_sheet_inductance(2 * radius, length, turns, sol.wheeler_1928_coefficient)
    assert math.isclose(float(value), 400 / 29 * 1e-6, rel_tol=1e-3)  # µ0 here is CODATA, not 4π·1e-7


def test_wheeler_1982_and_lundin_accuracy():
    """Wheeler 1982 within 2.5e-5 and Lundin 1985 within its claimed ~3 ppm of the exact value."""
    ratios = np.logspace(-3, 3, 4000)
    exact = sol.nagaoka_coefficient(ratios)
    assert np.max(np.abs(sol.wheeler_1982_coefficient(ratios) / exact - 1)) < 2.5e-5
    assert np.max(np.abs(sol.lundin_coefficient(ratios) / exact - 1)) < 3e-6


# Grover 1946, km table p. 150 as reproduced by Knight ("Table 7#1"), docs/methods.md §3 (a).
GROVER_KM = [(2, 0.1137), (3, 0.1663), (4, 0.1973), (5, 0.2180), (10, 0.2664), (20, 0.2964),
             (30, 0.3079), (50, 0.3182), (100, 0.3269)]


@pytest.mark.parametrize(("turns", "table"), GROVER_KM)
def test_rosa_km_matches_grover_table(turns, table):
    """km agrees with Grover's four-decimal table (N = 30 is 1 in the 4th place off, per Knight)."""
    tolerance = 1.5e-4 if turns == 30 else 0.6e-4
    assert abs(float(sol.rosa_km(turns)) - table) <= tolerance


@pytest.mark.parametrize("turns", [2, 7, 8, 9, 33, 500, 3000, 65600])
def test_rosa_km_against_mpmath_sum(turns):
    """The cumulative-sum km equals the term-by-term sum at 30 digits (both sides of the series switch)."""
    assert abs(float(sol.rosa_km(turns)) - float(ref.rosa_km(turns))) < 1e-13


def test_rosa_km_limit_and_interpolation():
    """km → ln(2π) − 3/2 (docs/methods.md §3); non-integer N lies between its neighbours."""
    limit = math.log(2 * math.pi) - 1.5
    assert abs(float(sol.rosa_km(2**20)) - limit) < 1e-5
    # far beyond the table (the tails in closed form): km(N) = limit − O(ln N / N), rising towards it
    far = sol.rosa_km(np.array([1e6, 1e7, 1e9, 1e12]))
    assert np.all(np.diff(far) > 0) and np.all(far < limit)
    assert abs(float(far[-1]) - limit) < 1e-10
    assert float(sol.rosa_km(1)) == 0.0
    between = float(sol.rosa_km(10.5))
    assert float(sol.rosa_km(10)) < between < float(sol.rosa_km(11))


def test_rosa_ks_values():
    """ks = 5/4 − ln(2p/d): 5/4 − ln 2 close wound, zero at p/d = e^(5/4)/2 (docs/methods.md §3)."""
    assert math.isclose(float(sol.rosa_ks(1.0, 1.0)), 1.25 - math.log(2), rel_tol=1e-15)
    assert abs(float(sol.rosa_ks(math.exp(1.25) / 2, 1.0))) < 1e-15


def test_rosa_worked_example_against_mpmath():
    """D = 50 mm, p = 2 mm, N = 25, d = 1 mm: 21.1016 µH (docs/methods.md §3, recomputed with mpmath)."""
    ours = float(sol.solenoid_inductance(0.05, 0.002, 0.001, 25))
    exact = float(ref.rosa_solenoid(0.05, 0.002, 0.001, 25, mu_0))
    assert math.isclose(ours, exact, rel_tol=1e-12)
    assert abs(ours * 1e6 - 21.101609) < 2e-6  # the value printed in docs/methods.md §3


def test_long_coil_limit():
    """A very long coil approaches µ0·N²·A/l (the infinite-solenoid result, any textbook)."""
    diameter, pitch, turns = 0.01, 1e-4, 200_000  # l = 20 m, D/l = 5e-4
    sheet = float(sol.current_sheet_inductance(diameter, turns * pitch, turns))
    ideal = mu_0 * turns**2 * math.pi * diameter**2 / 4 / (turns * pitch)
    assert math.isclose(sheet, ideal, rel_tol=4 * 5e-4 / (3 * math.pi) * 1.01)
    assert sheet < ideal


@given(scale=st.floats(min_value=1e-3, max_value=1e3),
       turns=st.integers(min_value=1, max_value=300),
       spacing=st.floats(min_value=1.0, max_value=5.0))
def test_scaling_all_lengths_scales_inductance(scale, turns, spacing):
    """Scaling every length by s scales an air-core inductance by s (dimensional analysis)."""
    d, w = 0.02, 0.0005
    base = float(sol.solenoid_inductance(d, w * spacing, w, turns))
    scaled = float(sol.solenoid_inductance(d * scale, w * spacing * scale, w * scale, turns))
    assert math.isclose(scaled, base * scale, rel_tol=1e-11)


@given(turns=st.integers(min_value=1, max_value=2000), spacing=st.floats(min_value=1.0, max_value=10.0),
       diameter_over_wire=st.floats(min_value=10.0, max_value=1000.0))
def test_inductance_rises_with_turns(turns, spacing, diameter_over_wire):
    """One more turn of the same winding always adds inductance."""
    wire = 1e-3
    args = (wire * diameter_over_wire, wire * spacing, wire)
    assert float(sol.solenoid_inductance(*args, turns + 1)) > float(sol.solenoid_inductance(*args, turns))


def test_single_turn_is_the_round_wire_loop():
    """N = 1: sheet minus ks equals the thin-ring formula µ0 R [ln(8R/a) − 7/4] (Rosa & Grover 1912).

    The sheet value of a one-turn 'coil' of length p is itself Nagaoka's, so the agreement is to the
    order of the short-sheet expansion, (p/D)² ln: a few parts in 10,000 at D/p = 50.
    """
    radius, wire_radius = 0.025, 0.0005
    pitch = 2 * wire_radius
    ours = float(sol.solenoid_inductance(2 * radius, pitch, 2 * wire_radius, 1))
    ring = mu_0 * radius * (math.log(8 * radius / wire_radius) - 1.75)
    assert math.isclose(ours, ring, rel_tol=1e-3)


def test_no_warnings_from_exact_methods():
    """The exact kernels do not warn anywhere in their range."""
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        sol.nagaoka_coefficient(np.logspace(-6, 6, 50))
        sol.solenoid_inductance(0.02, 0.001, 0.0008, np.arange(1, 100))
