"""At the operating frequency: self-capacitance, skin and proximity effect, litz wire, Q and the parallel-C model.

Reference values come from published tables (Medhurst's, as posted; docs/methods.md §6) or are recomputed here
with mpmath from the published formulas (docs/methods.md §7, §10, §11); nothing is pasted from the code's output.
"""

import functools
import itertools
import math
import warnings

import mpmath as mp
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.constants import epsilon_0, mu_0

from coilplan.errors import OutsideValidityWarning
from coilplan.physics import frequency as fq
from coilplan.physics.solenoid import solenoid_inductance
from coilplan.wire import copper_resistivity

# pytest.approx allows 1e-12 absolute by default, which would let any capacitance in farad pass: purely relative here
approx = functools.partial(pytest.approx, abs=0.0)

RHO_CU = copper_resistivity(20.0)  # IEC 60028 annealed copper, 1/58 Ω·mm²/m

# Medhurst (1947), H in pF per cm of diameter against l/D, as posted:
# pupman.com/listarchives/1997/november/msg00393.html and 1997/january/msg00722.html (docs/methods.md §6),
# and the 1.0 to 5.0 rows of pupman.com/listarchives/1996/june/msg00129.html.
MEDHURST_TABLE = [
    (0.1, 0.96), (0.2, 0.70), (0.5, 0.50), (0.8, 0.46), (1.0, 0.46), (1.5, 0.47), (2.0, 0.50), (2.5, 0.56),
    (3.0, 0.61), (3.5, 0.67), (4.0, 0.72), (4.5, 0.77), (5.0, 0.81), (10.0, 1.32), (20.0, 2.36), (50.0, 5.8),
]


def _quiet(function, *args, **kwargs):
    """Call a kernel with OutsideValidityWarning silenced (for tests that check values, not warnings)."""
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)
        return function(*args, **kwargs)


# --------------------------------------------------------------------------- Medhurst and Knight


@pytest.mark.parametrize(("ratio", "h"), [pytest.param(r, h, id=f"l/D={r:g}") for r, h in MEDHURST_TABLE])
def test_medhurst_h_reproduces_the_table_points(ratio, h):
    """At every table point the interpolated H is Medhurst's value (Medhurst 1947, as posted; docs/methods.md §6)."""
    assert float(fq.medhurst_h(ratio)) == approx(h, rel=1e-13, abs=0)


def test_medhurst_h_interpolates_monotonically_between_points():
    """PCHIP stays between neighbouring table values (no overshoot) and keeps the 0.8-1.0 minimum flat."""
    for (x0, h0), (x1, h1) in itertools.pairwise(MEDHURST_TABLE):
        inner = np.geomspace(x0, x1, 9)[1:-1]
        values = fq.medhurst_h(inner)
        assert np.all(values >= min(h0, h1) - 1e-12)
        assert np.all(values <= max(h0, h1) + 1e-12)
        assert np.all(np.diff(values) * np.sign(h1 - h0) >= -1e-12)
    assert np.allclose(fq.medhurst_h(np.linspace(0.8, 1.0, 5)), 0.46, rtol=1e-13)


def test_medhurst_h_extrapolates_with_a_warning():
    """Outside l/D 0.1-50 the end power law is used and OutsideValidityWarning is raised."""
    with pytest.warns(OutsideValidityWarning, match="0.1 to 50"):
        long_coil = float(fq.medhurst_h(100.0))
    slope = math.log(5.8 / 2.36) / math.log(50.0 / 20.0)  # the last two table points
    assert long_coil == approx(5.8 * 2.0**slope, rel=1e-12, abs=0)
    with pytest.warns(OutsideValidityWarning):
        short_coil = float(fq.medhurst_h(0.05))
    assert short_coil == approx(0.96 * 0.5 ** (math.log(0.70 / 0.96) / math.log(2.0)), rel=1e-12, abs=0)
    assert np.isnan(fq.medhurst_h(np.nan))


def test_medhurst_self_capacitance_is_h_times_diameter_in_cm():
    """C[pF] = H·D[cm] (Medhurst's definition): 10 cm diameter, l/D = 3 gives 0.61 × 10 = 6.1 pF."""
    assert float(fq.medhurst_self_capacitance(0.10, 0.30)) == approx(6.1e-12, rel=1e-12, abs=0)


def _knight_h(ratio, eps_i):
    """Knight's C per cm of diameter, in pF, for D = 1 m (docs/methods.md §6), evaluated by mpmath."""
    x = 1 / mp.mpf(ratio)
    kc = mp.mpf("0.717439") * x + mp.mpf("0.933048") * x ** mp.mpf(1.5) + mp.mpf("0.106") * x**2
    c = 4 * mp.mpf(epsilon_0) * mp.mpf(ratio) / mp.pi * (1 + kc * (1 + mp.mpf(eps_i)) / 2)
    return c * mp.mpf(10) ** 12 / 100


def test_knight_reproduces_medhurst_within_published_agreement():
    """With εi = 2.5 Knight's formula is within ±4.6 % of Medhurst's table, rms about 2 % (docs/methods.md §6)."""
    ratios = np.array([r for r, _ in MEDHURST_TABLE])
    table = np.array([h for _, h in MEDHURST_TABLE])
    knight = fq.knight_self_capacitance(1.0, ratios, former_permittivity=2.5) * 1e12 / 100  # pF per cm of D
    deviation = knight / table - 1
    assert np.max(np.abs(deviation)) <= 0.046
    assert math.sqrt(np.mean(deviation**2)) <= 0.025  # 2.4 % with the half-step rows of the 1996 post included
    for ratio, value in zip(ratios, knight, strict=True):  # the kernel is the formula (mpmath at 30 digits)
        assert value == approx(float(_knight_h(ratio, 2.5)), rel=1e-13, abs=0)


def test_knight_air_core_is_a_third_lower_at_unit_ratio():
    """At l/D = 1 Knight gives 0.459 pF/cm with εi = 2.5 and 0.311 pF/cm (32 % lower) with air (docs/methods.md §6)."""
    solid = float(fq.knight_self_capacitance(0.01, 0.01, former_permittivity=2.5)) * 1e12  # D = 1 cm
    air = float(fq.knight_self_capacitance(0.01, 0.01)) * 1e12
    assert solid == approx(0.459, abs=5e-4)
    assert air == approx(0.311, abs=5e-4)
    assert 1 - air / solid == approx(0.32, abs=0.005)


def test_knight_pitch_angle_factor():
    """The pitch enters as 1/cos²ψ with tan ψ = p/(πD) (Knight 2016, docs/methods.md §6)."""
    flat = float(fq.knight_self_capacitance(0.02, 0.04))
    pitched = float(fq.knight_self_capacitance(0.02, 0.04, pitch=5e-3))
    psi = math.atan(5e-3 / (math.pi * 0.02))
    assert pitched / flat == approx(1 / math.cos(psi) ** 2, rel=1e-14, abs=0)


# --------------------------------------------------------------------------- rough estimates


def test_multilayer_estimate_equals_the_energy_integral():
    """(4/3)·C_layer·(n−1)/n² equals ½C V² = Σ over gaps ½C_layer∫(2V x/n)² dx (energy method, mpmath quadrature)."""
    c_layer = epsilon_0 * 3.0 * math.pi * 0.02 * 0.01 / 0.1e-3
    for n in (2, 3, 5, 12):
        gap_energy = mp.quad(lambda x, n=n: (2 * x / n) ** 2, [0, 1]) * c_layer / 2  # V = 1
        expected = float(2 * (n - 1) * gap_energy)  # C = 2W/V²
        assert float(fq.multilayer_self_capacitance(0.02, 0.01, n, 0.1e-3, 3.0)) == approx(expected, rel=1e-12, abs=0)
    assert float(fq.multilayer_self_capacitance(0.02, 0.01, 2, 0.1e-3, 3.0)) == approx(c_layer / 3, rel=1e-12, abs=0)
    assert float(fq.multilayer_self_capacitance(0.02, 0.01, 1, 0.1e-3, 3.0)) == 0.0


def test_toroid_estimate_two_cylinder_capacitance_in_series():
    """C_tt = πε l/arccosh(p/d) (two parallel cylinders, Ramo et al.), N − 1 in series; NaN where turns touch."""
    c = float(fq.toroid_self_capacitance(11, 0.03, 1.0e-3, 0.8e-3, permittivity=2.0))
    c_tt = mp.pi * mp.mpf(epsilon_0) * 2 * mp.mpf("0.03") / mp.acosh(mp.mpf("1.0") / mp.mpf("0.8"))
    assert c == approx(float(c_tt / 10), rel=1e-12, abs=0)
    # large separation: the thin-wire limit π ε l / ln(2p/d)
    far = float(fq.toroid_self_capacitance(2, 1.0, 1.0, 1e-4))
    assert far == approx(math.pi * epsilon_0 / math.log(2e4), rel=1e-8, abs=0)
    assert np.isnan(fq.toroid_self_capacitance(10, 0.03, 0.8e-3, 0.8e-3))
    assert np.isnan(fq.toroid_self_capacitance(1, 0.03, 1e-3, 0.8e-3))


# --------------------------------------------------------------------------- skin effect


@pytest.mark.parametrize("frequency", [50.0, 1e3, 100e3, 455e3, 1e6, 10e6])
def test_skin_depth_of_iec_copper(frequency):
    """δ = sqrt(ρ/(π f µ0)) with IEC 60028 copper at 20 °C, recomputed by mpmath (docs/methods.md §7 table)."""
    with mp.workdps(30):
        expected = mp.sqrt(mp.mpf(1) / 58 * mp.mpf("1e-6") / (mp.pi * frequency * mp.mpf(mu_0)))
    assert float(fq.skin_depth(frequency, RHO_CU)) == approx(float(expected), rel=1e-14, abs=0)


def test_skin_depth_values_of_references_table():
    """The §7 table rounds to the same digits: 66.085 µm at 1 MHz, 20.898 µm at 10 MHz (docs/methods.md §7, (b))."""
    assert round(float(fq.skin_depth(1e6, RHO_CU)) * 1e6, 3) == 66.085
    assert round(float(fq.skin_depth(10e6, RHO_CU)) * 1e6, 3) == 20.898
    assert np.isposinf(fq.skin_depth(0.0, RHO_CU))


def _mp_impedance_ratio(x, dps=30):
    """(k a/2)·J0(k a)/J1(k a), k = (1 − j)/δ, by mpmath with complex argument (docs/methods.md §11)."""
    with mp.workdps(dps):
        z = mp.mpc(1, -1) * mp.mpf(x)
        return z / 2 * mp.besselj(0, z) / mp.besselj(1, z)


@settings(max_examples=40)
@given(log_x=st.floats(min_value=-2.0, max_value=3.0))
def test_bessel_ratio_against_mpmath(log_x):
    """Real and imaginary parts agree with mpmath's complex Bessel functions to 1e-12 over a/δ 0.01-1000."""
    x = 10.0**log_x
    expected = _mp_impedance_ratio(x)
    value = complex(fq.round_wire_impedance_ratio(x))
    assert value.real == approx(float(expected.real), rel=1e-12, abs=0)
    assert value.imag == approx(float(expected.imag), rel=1e-12, abs=0)


@pytest.mark.parametrize("x", [0.001, 0.4999999, 0.5, 0.5000001, 9999.0, 10000.0, 10001.0, 1e5, 1e6])
def test_bessel_ratio_at_the_switch_points(x):
    """Either side of the series/Bessel switch (0.5) and the Bessel/asymptote switch (1e4), within 1e-10 of mpmath."""
    expected = _mp_impedance_ratio(x, dps=40)
    value = complex(fq.round_wire_impedance_ratio(x))
    assert value.real == approx(float(expected.real), rel=1e-10, abs=0)
    assert value.imag == approx(float(expected.imag), rel=1e-10, abs=0)


@pytest.mark.parametrize("x", [0.005, 0.01, 0.02, 0.1, 0.3])
def test_bessel_ratio_keeps_the_small_imaginary_part(x):
    """At small a/δ the internal reactance (a/δ)²/4 keeps 13 digits (the plain Bessel quotient loses some; mpmath)."""
    expected = _mp_impedance_ratio(x, dps=40)
    assert float(fq.round_wire_impedance_ratio(x).imag) == approx(float(expected.imag), rel=1e-13, abs=0)


def test_bessel_ratio_limits():
    """Low frequency: 1 + (a/δ)⁴/48 and j(a/δ)²/4; high frequency: a/(2δ) + 1/4 + 3δ/(32a) (docs/methods.md §11)."""
    x = 0.05
    z = complex(fq.round_wire_impedance_ratio(x))
    assert z.real - 1 == approx(x**4 / 48, rel=1e-3, abs=0)  # next term is O(x⁸)
    assert z.imag == approx(x**2 / 4, rel=1e-4, abs=0)
    for x in (100.0, 1000.0):
        assert float(fq.round_wire_impedance_ratio(x).real) == approx(x / 2 + 0.25 + 3 / (32 * x), rel=2e-9, abs=0)
    assert complex(fq.round_wire_impedance_ratio(0.0)) == 1.0
    assert np.isnan(fq.round_wire_impedance_ratio(np.nan).real)
    assert np.isnan(fq.round_wire_impedance_ratio(-1.0).real)


def test_round_wire_resistance_ratio_uses_the_skin_depth():
    """R_ac/R_dc(a, f, ρ) is Re Z/R_dc at a/δ; 1 at DC; docs/methods.md §11 value at a/δ = 3 recomputed by mpmath."""
    delta = float(fq.skin_depth(1e6, RHO_CU))
    value = float(fq.round_wire_resistance_ratio(3 * delta, 1e6, RHO_CU))
    assert value == approx(float(_mp_impedance_ratio(3).real), rel=1e-12, abs=0)
    assert float(fq.round_wire_resistance_ratio(1e-3, 0.0, RHO_CU)) == 1.0
    grid = fq.round_wire_resistance_ratio(np.array([0.1e-3, 0.5e-3, 1e-3])[:, None], np.array([1e5, 1e6, 1e7]), RHO_CU)
    assert grid.shape == (3, 3)
    assert np.all(np.diff(grid, axis=0) > 0) and np.all(np.diff(grid, axis=1) > 0)


# --------------------------------------------------------------------------- Dowell


def _mp_dowell(delta, p, dps=50):
    """Dowell's averaged Fr = Δ[ς1 + (2/3)(p² − 1)ς2] by mpmath (Dowell 1966; docs/methods.md §11)."""
    with mp.workdps(dps):
        d = mp.mpf(delta)
        s1 = (mp.sinh(2 * d) + mp.sin(2 * d)) / (mp.cosh(2 * d) - mp.cos(2 * d))
        s2 = (mp.sinh(d) - mp.sin(d)) / (mp.cosh(d) + mp.cos(d))
        return d * (s1 + mp.mpf(2) / 3 * (mp.mpf(p) ** 2 - 1) * s2)


@pytest.mark.parametrize(("delta", "layers"), [
    pytest.param(1.0, 1, id="1-p1"), pytest.param(1.0, 2, id="1-p2"), pytest.param(1.0, 3, id="1-p3"),
    pytest.param(1.0, 5, id="1-p5"), pytest.param(0.5, 3, id="0.5-p3"), pytest.param(2.0, 3, id="2-p3"),
])
def test_dowell_reference_values(delta, layers):
    """The docs/methods.md §11 (b) values (e.g. 1.939965 at Δ = 1, p = 3), recomputed with mpmath."""
    assert float(fq.dowell_factor(delta, layers)) == approx(float(_mp_dowell(delta, layers)), rel=1e-13, abs=0)


@settings(max_examples=40)
@given(log_delta=st.floats(min_value=-3.0, max_value=1.7), layers=st.integers(min_value=1, max_value=12))
def test_dowell_against_mpmath(log_delta, layers):
    """Dowell's Fr agrees with mpmath at 50 digits over Δ 0.001-50, p 1-12."""
    delta = 10.0**log_delta
    assert float(fq.dowell_factor(delta, layers)) == approx(float(_mp_dowell(delta, layers)), rel=1e-12, abs=0)


@pytest.mark.parametrize("delta", [1.9999999, 2.0, 2.0000001])
def test_dowell_switch_point(delta):
    """Either side of the series/exponential switch at Δ = 2 the factor agrees with mpmath to 1e-13."""
    for layers in (1, 4):
        assert float(fq.dowell_factor(delta, layers)) == approx(float(_mp_dowell(delta, layers)), rel=1e-13, abs=0)


def test_dowell_limits():
    """Small Δ: 1 + (5p² − 1)Δ⁴/45 (docs/methods.md §11); large Δ: Δ(1 + 2(p² − 1)/3), no overflow at Δ = 1000."""
    for p in (1, 3, 6):
        delta = 0.02
        assert float(fq.dowell_factor(delta, p)) - 1 == approx((5 * p * p - 1) * delta**4 / 45, rel=1e-4, abs=0)
        assert float(fq.dowell_factor(1000.0, p)) == approx(1000.0 * (1 + 2 * (p * p - 1) / 3), rel=1e-14, abs=0)
    assert float(fq.dowell_factor(0.0, 3)) == 1.0
    assert np.isposinf(fq.dowell_factor(np.inf, 3))
    assert np.isnan(fq.dowell_factor(np.nan, 3))


def test_dowell_delta_porosity_and_warning():
    """Δ = (√π/2)(d/δ)√η with η = (√π/2)d·N/b (Dowell 1966; docs/methods.md §11b); overfull layer warns."""
    eta = math.sqrt(math.pi) / 2 * 0.5e-3 * 20 / 12e-3
    expected = math.sqrt(math.pi) / 2 * 5.0 * math.sqrt(eta)
    assert float(fq.dowell_delta(0.5e-3, 0.1e-3, 20, 12e-3)) == approx(expected, rel=1e-14, abs=0)
    with pytest.warns(OutsideValidityWarning, match="wider than the winding width"):
        fq.dowell_delta(1e-3, 0.1e-3, 20, 10e-3)


def test_solenoid_proximity_factor_is_dowell_one_layer_with_the_isolated_wire_as_floor():
    """Close-wound: Dowell p = 1 with η = (√π/2)d/p; widely spaced: never below the isolated wire's exact ratio."""
    d, pitch, f = 1e-3, 1.1e-3, 3.5e6
    delta_skin = float(fq.skin_depth(f, RHO_CU))
    eta = math.sqrt(math.pi) / 2 * d / pitch
    delta = math.sqrt(math.pi) / 2 * d / delta_skin * math.sqrt(eta)
    close = float(fq.solenoid_proximity_factor(d, pitch, f, RHO_CU))
    assert close == approx(float(_mp_dowell(delta, 1)), rel=1e-12, abs=0)
    isolated = float(fq.round_wire_resistance_ratio(d / 2, f, RHO_CU))
    assert close > 2 * isolated  # the neighbours' field dominates a close-wound layer
    sparse = float(fq.solenoid_proximity_factor(d, 100 * d, f, RHO_CU))
    assert sparse == approx(isolated, rel=1e-14, abs=0)
    assert float(fq.solenoid_proximity_factor(d, pitch, 0.0, RHO_CU)) == 1.0
    with pytest.warns(OutsideValidityWarning, match="pitch is smaller"):
        fq.solenoid_proximity_factor(d, 0.9e-3, f, RHO_CU)


# --------------------------------------------------------------------------- litz


def test_litz_matches_dowell_series_applied_to_strands():
    """Litz proximity term = Dowell's low-Δ excess on the strands as layers × 3/π (round strand vs Dowell's square).

    Sullivan (1999) derives his litz expression from the same 1-D field as Dowell (1966); with √n strands per
    bundle across the build and p_s = m√n strand layers, Dowell's (5p_s² − 1)Δ_s⁴/45 differs from the round-strand
    result only by the equal-area-square factor π/3 (and the −1/(5p_s²) end term).
    """
    ds, n, m, f = 50e-6, 100, 4, 20e3  # strands far below the skin depth (δ ≈ 0.47 mm)
    delta_skin = float(fq.skin_depth(f, RHO_CU))
    bundle = ds * math.sqrt(n / (math.pi / (2 * math.sqrt(3))))
    litz_excess = float(fq.litz_resistance_ratio(ds, n, f, RHO_CU, layers=m)) - float(
        fq.round_wire_resistance_ratio(ds / 2, f, RHO_CU))
    strand_layers = m * math.isqrt(n)
    eta = math.sqrt(math.pi) / 2 * ds * math.isqrt(n) / bundle
    delta_s = math.sqrt(math.pi) / 2 * ds / delta_skin * math.sqrt(eta)
    dowell_excess = float(_mp_dowell(delta_s, strand_layers)) - 1
    expected_ratio = math.pi / 3 * (1 - 1 / (5 * strand_layers**2))
    assert dowell_excess / litz_excess == approx(expected_ratio, rel=1e-4, abs=0)  # Dowell's Δ⁸ terms: ~Δ_s⁴


def test_litz_low_frequency_scaling_and_warning():
    """The proximity excess grows as f² (δ⁻⁴) and as n²; strands thicker than δ warn (Sullivan 1999 validity)."""
    base = float(fq.litz_resistance_ratio(40e-6, 50, 100e3, RHO_CU, layers=3)) - 1
    double_f = float(fq.litz_resistance_ratio(40e-6, 50, 200e3, RHO_CU, layers=3)) - 1
    assert double_f / base == approx(4.0, rel=1e-3, abs=0)
    strand_skin = float(fq.round_wire_resistance_ratio(20e-6, 100e3, RHO_CU))  # one strand alone, not ∝ n
    alone = float(fq.litz_resistance_ratio(40e-6, 50, 100e3, RHO_CU, bundle_diameter=0.4e-3, layers=0)) - strand_skin
    double_n = float(fq.litz_resistance_ratio(40e-6, 100, 100e3, RHO_CU, bundle_diameter=0.4e-3,
                                              layers=0)) - strand_skin
    assert double_n / alone == approx(4.0, rel=1e-12, abs=0)
    assert float(fq.litz_resistance_ratio(40e-6, 50, 0.0, RHO_CU)) == 1.0
    with pytest.warns(OutsideValidityWarning, match="exceeds the skin depth"):
        fq.litz_resistance_ratio(0.3e-3, 20, 1e6, RHO_CU)


# --------------------------------------------------------------------------- Q, SRF and the parallel-C model


def test_self_resonant_frequency_hand_worked():
    """100 µH with 100 pF resonates at 1591.55 kHz (docs/methods.md §10), recomputed by mpmath."""
    expected = 1 / (2 * mp.pi * mp.sqrt(mp.mpf("100e-6") * mp.mpf("100e-12")))
    assert float(fq.self_resonant_frequency(100e-6, 100e-12)) == approx(float(expected), rel=1e-14, abs=0)
    assert np.isposinf(fq.self_resonant_frequency(1e-6, 0.0))


def _mp_parallel(f, L, R, C, rp=None):
    """Z = 1/(1/(R + jωL) + jωC + 1/Rp), the parallel formula written out, by mpmath."""
    w = 2 * mp.pi * mp.mpf(f)
    admittance = 1 / (mp.mpf(R) + 1j * w * mp.mpf(L)) + 1j * w * mp.mpf(C)
    if rp is not None:
        admittance += 1 / mp.mpf(rp)
    return 1 / admittance


@pytest.mark.parametrize(("f", "rp"), [(1e5, None), (1e6, None), (7.1e6, None), (2e7, None), (1e6, 1e6)])
def test_coil_impedance_against_the_parallel_formula(f, rp):
    """Z_s/(1 + Z_s Y) equals 1/(1/Z_s + jωC + 1/Rp) below, near and above the SRF (7.12 MHz here)."""
    L, R, C = 100e-6, 5.0, 5e-12
    expected = _mp_parallel(f, L, R, C, rp)
    z = complex(fq.coil_impedance(f, L, R, C, np.inf if rp is None else rp))
    assert z.real == approx(float(expected.real), rel=1e-12, abs=0)
    assert z.imag == approx(float(expected.imag), rel=1e-12, abs=0)


def test_apparent_inductance_and_resistance_are_im_z_over_omega_and_re_z():
    """(L_app, R_app) = (Im Z/ω, Re Z) of the model; small R gives L/(1 − ω²LC), R/(1 − ω²LC)² (docs/methods.md §10)."""
    L, C = 100e-6, 5e-12
    f = np.array([1e5, 1e6, 3e6, 5e6])
    for R in (0.5, 20.0):
        l_app, r_app = fq.apparent_inductance_and_resistance(f, L, R, C)
        z = fq.coil_impedance(f, L, R, C)
        assert np.allclose(l_app, z.imag / (2 * np.pi * f), rtol=1e-12, atol=0)
        assert np.allclose(r_app, z.real, rtol=1e-12, atol=0)
    detune = 1 - (2 * np.pi * f) ** 2 * L * C
    l_small, r_small = fq.apparent_inductance_and_resistance(f, L, 1e-3, C)
    assert np.allclose(l_small, L / detune, rtol=1e-9)
    assert np.allclose(r_small, 1e-3 / detune**2, rtol=1e-9)
    # docs/methods.md §10: 100 µH with 5 pF at 1 MHz looks like 102.014 µH
    w = 2 * mp.pi * mp.mpf(10) ** 6
    expected = mp.mpf("100e-6") / (1 - w**2 * mp.mpf("100e-6") * mp.mpf("5e-12"))
    assert float(fq.apparent_inductance_and_resistance(1e6, L, 0.0, C)[0]) == approx(float(expected), rel=1e-13, abs=0)
    # at DC the exact form needs no division by ω: L − R²C
    assert float(fq.apparent_inductance_and_resistance(0.0, L, 20.0, C)[0]) == approx(L - 400 * C, rel=1e-14, abs=0)


def test_q_factor_of_a_typical_air_coil():
    """An HF air coil (invented: 25 mm diameter, 20 turns of 1 mm wire, 1.5 mm pitch) has Q 100-400 at 3.5-7 MHz.

    The range is common practice, no source (well-made single-layer air coils at HF measure Q of a few
    hundred; a stored QEX 2001 survey of the handbook Q formulas was found but its values were not readable).
    The wire alone (skin effect only) would give Q above 500: the proximity factor is what brings it down.
    """
    diameter, wire, pitch, turns = 25e-3, 1e-3, 1.5e-3, 20
    inductance = float(solenoid_inductance(diameter, pitch, wire, turns))
    r_dc = RHO_CU * turns * math.pi * diameter / (math.pi * wire**2 / 4)
    for f in (3.5e6, 7e6):
        r_ac = r_dc * float(fq.solenoid_proximity_factor(wire, pitch, f, RHO_CU))
        q = float(fq.q_factor(inductance, r_ac, f))
        assert 100 < q < 400
        skin_only = float(fq.q_factor(inductance, r_dc * float(fq.round_wire_resistance_ratio(wire / 2, f, RHO_CU)), f))
        assert skin_only > 500
    assert float(fq.q_factor(10e-6, 1.0, 1e6)) == approx(2 * math.pi * 10.0, rel=1e-15, abs=0)


def test_kernels_are_nan_transparent():
    """NaN in gives NaN out, without raising (scipy.special convention; style.md)."""
    nan = float("nan")
    assert np.isnan(_quiet(fq.knight_self_capacitance, nan, 0.01))
    assert np.isnan(fq.skin_depth(nan, RHO_CU))
    assert np.isnan(fq.round_wire_resistance_ratio(nan, 1e6, RHO_CU))
    assert np.isnan(fq.dowell_factor(1.0, nan))
    assert np.isnan(fq.solenoid_proximity_factor(nan, 1e-3, 1e6, RHO_CU))
    assert np.isnan(fq.litz_resistance_ratio(nan, 10, 1e5, RHO_CU))
    assert np.isnan(fq.coil_impedance(nan, 1e-6, 1.0, 1e-12).real)


def test_own_pchip_equals_scipys():
    """Our monotone cubic is scipy.interpolate.PchipInterpolator's (the reference library), to rounding."""
    from scipy.interpolate import PchipInterpolator

    from coilplan.physics._pchip import pchip_evaluate, pchip_slopes

    rng = np.random.default_rng(7)
    for _ in range(20):
        x = np.cumsum(rng.uniform(0.1, 2.0, 12))
        y = np.cumsum(rng.normal(0.0, 1.0, 12))
        points = np.linspace(x[0], x[-1], 501)
        ours = pchip_evaluate(x, y, pchip_slopes(x, y), points)
        assert np.allclose(ours, PchipInterpolator(x, y)(points), rtol=1e-12, atol=1e-12)
