"""Core dispersion: the Debye-type relaxation, Snoek's law, core loss resistance and the inductance drift."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from scipy import integrate, optimize

from coilplan.physics import dispersion as disp

mu_values = st.floats(min_value=1.5, max_value=2e4)
relaxation_values = st.floats(min_value=1e3, max_value=1e10)


def debye(f, mu_i, f_r):
    """The textbook single-relaxation form written out independently (Debye 1929, from memory)."""
    return 1 + (mu_i - 1) / (1 + 1j * f / f_r)


# --------------------------------------------------------------------------- limits of the relaxation


@given(mu_i=mu_values, f_r=relaxation_values)
def test_zero_frequency_gives_initial_permeability(mu_i, f_r):
    """At f = 0 the relaxation gives µ = µi exactly, with no loss (the static limit of the Debye form)."""
    mu = disp.complex_permeability(0.0, mu_i, f_r)
    assert mu.real == pytest.approx(mu_i, rel=1e-15)
    assert mu.imag == 0.0


@given(mu_i=mu_values, f_r=relaxation_values)
def test_far_above_relaxation_the_core_is_air(mu_i, f_r):
    """For f = 10⁴ f_r, µ' − 1 ≈ (µi − 1)·10⁻⁸ and µ'' ≈ (µi − 1)·10⁻⁴; at infinity µ = 1 (Debye form's limit)."""
    mu = disp.complex_permeability(1e4 * f_r, mu_i, f_r)
    assert mu.real - 1 == pytest.approx((mu_i - 1) * 1e-8, rel=1e-6)
    assert -mu.imag == pytest.approx((mu_i - 1) * 1e-4, rel=1e-6)
    assert disp.complex_permeability(math.inf, mu_i, f_r) == 1.0


@pytest.mark.parametrize("mu_i", [40.0, 125.0, 2300.0])
def test_loss_peaks_at_the_relaxation_frequency_with_half_the_susceptibility(mu_i):
    """µ'' found by a numerical maximiser peaks at f = f_r with (µi − 1)/2, and µ' = (µi + 1)/2 there (Debye)."""
    f_r = 54e6
    found = optimize.minimize_scalar(lambda log_f: disp.complex_permeability(10**log_f, mu_i, f_r).imag,
                                     bounds=(5.0, 10.0), method="bounded", options={"xatol": 1e-9})
    assert 10**found.x == pytest.approx(f_r, rel=1e-5)
    at_peak = disp.complex_permeability(f_r, mu_i, f_r)
    assert -at_peak.imag == pytest.approx((mu_i - 1) / 2, rel=1e-14)
    assert at_peak.real == pytest.approx((mu_i + 1) / 2, rel=1e-14)


def test_half_value_points_of_the_loss_peak():
    """µ'' is half its peak at f/f_r = 2 ± √3, the roots of x² − 4x + 1 = 0 (from 2x/(1 + x²) = 1/2)."""
    mu_i, f_r = 250.0, 25e6
    for x in (2 - math.sqrt(3), 2 + math.sqrt(3)):
        assert -disp.complex_permeability(x * f_r, mu_i, f_r).imag == pytest.approx((mu_i - 1) / 4, rel=1e-13)
    # and the two points are symmetric in log frequency about f_r (their product is f_r²)
    assert (2 - math.sqrt(3)) * (2 + math.sqrt(3)) == pytest.approx(1.0, rel=1e-15)


def test_kramers_kronig_sum_rule_and_dispersion_relation():
    """µ'(f) − 1 = (2/π) P∫ f' µ''(f')/(f'² − f²) df' (Kramers–Kronig), checked by scipy quadrature at 0 and 0.7 f_r."""
    mu_i, f_r = 800.0, 6.8e6

    def loss(f):
        return -disp.complex_permeability(f, mu_i, f_r).imag

    # f = 0: the static susceptibility is (2/π)∫ µ''(f)/f df; integrate in u = ln f
    static, _ = integrate.quad(lambda u: loss(math.exp(u)), math.log(f_r) - 40, math.log(f_r) + 40, limit=200)
    assert 2 / math.pi * static == pytest.approx(mu_i - 1, rel=1e-8)
    # f = 0.7 f_r: principal value with scipy's Cauchy weight on [0, 20 f_r], plus the tail
    f = 0.7 * f_r
    near, _ = integrate.quad(lambda g: g * loss(g) / (g + f), 0.0, 20 * f_r, weight="cauchy", wvar=f, limit=200)
    tail, _ = integrate.quad(lambda u: math.exp(u) ** 2 * loss(math.exp(u)) / (math.exp(u) ** 2 - f**2),
                             math.log(20 * f_r), math.log(f_r) + 40, limit=200)
    assert 1 + 2 / math.pi * (near + tail) == pytest.approx(disp.complex_permeability(f, mu_i, f_r).real, rel=1e-6)


def test_relaxation_matches_the_form_written_out():
    """Without a loss factor the kernel equals the single-relaxation formula evaluated with Python complex numbers."""
    f = np.logspace(2, 10, 41)
    for mu_i, f_r in ((7500.0, 5e5), (8.0, 2e9), (40.0, 1.1e8)):
        expected = np.array([debye(x, mu_i, f_r) for x in f])
        np.testing.assert_allclose(disp.complex_permeability(f, mu_i, f_r), expected, rtol=1e-13)


# --------------------------------------------------------------------------- the loss-factor term


@given(mu_i=mu_values, ratio=st.floats(min_value=1e-6, max_value=1e-2),
       extra=st.floats(min_value=1.01, max_value=100.0))
def test_loss_factor_is_reproduced_at_its_frequency(mu_i, ratio, extra):
    """tanδ(f0)/µi equals the stated loss factor whenever it exceeds the relaxation's own (IEC 60401-3 definition)."""
    f_r = 1e7
    f0 = ratio * f_r
    own = disp.complex_permeability(f0, mu_i, f_r)
    stated = extra * (-own.imag / own.real) / mu_i
    mu = disp.complex_permeability(f0, mu_i, f_r, loss_factor=stated, loss_factor_frequency=f0)
    assert -mu.imag / mu.real / mu_i == pytest.approx(stated, rel=1e-9)
    assert mu.real == own.real  # the loss angle leaves µ' alone, so inductance_ratio needs no loss term


def test_loss_factor_below_the_relaxation_tail_adds_nothing():
    """A stated loss factor lower than the relaxation's tail gives the relaxation alone (t = 0, documented)."""
    pure = disp.complex_permeability(1e6, 125, 54e6)
    assert disp.complex_permeability(1e6, 125, 54e6, loss_factor=1e-6, loss_factor_frequency=1e6) == pure


def test_low_frequency_loss_factor_gives_constant_loss_angle():
    """With f0 = 0 the loss tangent well below f_r is the stated tanδ/µi × µi (frequency-independent term)."""
    mu = disp.complex_permeability(np.array([1.0, 10.0]), 2300, 4e6, loss_factor=3e-6)
    np.testing.assert_allclose(-mu.imag / mu.real, 3e-6 * 2300, rtol=1e-3)  # the tail adds f/f_r ≤ 2.5e-6


def test_nan_passes_and_shapes_broadcast():
    """NaN in gives NaN out; a (3, 1) frequency against (2,) permeabilities gives shape (3, 2)."""
    assert np.isnan(disp.complex_permeability(math.nan, 125, 54e6))
    assert np.isnan(disp.snoek_relaxation_frequency(math.nan, 0.3))
    out = disp.complex_permeability(np.array([[1e3], [1e6], [1e8]]), np.array([40.0, 125.0]), 54e6, 3e-5, 1e5)
    assert out.shape == (3, 2)
    assert disp.snoek_relaxation_frequency(1.0, 0.3) == math.inf


# --------------------------------------------------------------------------- Snoek's law


@pytest.mark.parametrize(("mu_i", "bsat"), [(125, 0.36), (40, 0.24), (800, 0.29), (2300, 0.49)])
def test_snoek_agrees_with_the_cgs_form(mu_i, bsat):
    """(µi − 1) f_r = (4/3) γ Ms in CGS units (γ in rad/(s·Oe), Ms in emu/cm³; Snoek 1948, from memory)."""
    gamma_cgs = 1.76085963e7  # rad s⁻¹ Oe⁻¹ (CODATA 2018 electron gyromagnetic ratio, 1.76085963e11 s⁻¹ T⁻¹)
    ms_cgs = bsat * 1e4 / (4 * math.pi)  # 1 T = 10⁴ G, and 4πMs in gauss
    expected = 4 / 3 * gamma_cgs * ms_cgs / (mu_i - 1)
    assert float(disp.snoek_relaxation_frequency(mu_i, bsat)) == pytest.approx(expected, rel=1e-8)


@given(mu_i=st.floats(min_value=2, max_value=1e4), bsat=st.floats(min_value=0.1, max_value=0.6))
def test_snoek_product_is_constant(mu_i, bsat):
    """(µi − 1)·f_r depends on the saturation only: higher µi, lower f_r (Snoek's law)."""
    low = disp.snoek_relaxation_frequency(mu_i, bsat)
    high = disp.snoek_relaxation_frequency(2 * mu_i, bsat)
    assert high < low
    assert (2 * mu_i - 1) * high == pytest.approx((mu_i - 1) * low, rel=1e-12)


# --------------------------------------------------------------------------- core loss resistance


@given(f=st.floats(min_value=1e3, max_value=1e8), mu_i=mu_values, x=st.floats(min_value=1e-3, max_value=10.0),
       inductance=st.floats(min_value=1e-7, max_value=1e-1))
def test_core_loss_is_the_real_part_of_the_winding_impedance(f, mu_i, x, inductance):
    """For a closed core L ∝ µ, so Z = jωL·µ/µ' and R_core = Re Z = ωL µ''/µ' (IEV 121-12-30 sign convention)."""
    mu = disp.complex_permeability(f, mu_i, f / x)
    impedance = 1j * 2 * math.pi * f * inductance * complex(mu) / mu.real
    assert float(disp.core_loss_resistance(f, inductance, mu)) == pytest.approx(impedance.real, rel=1e-12)


@pytest.mark.parametrize("gap_ratio", [1e-3, 1e-2, 1e-1])
def test_gap_dilutes_the_loss_by_effective_over_material_permeability(gap_ratio):
    """A gapped core (1/µe = 1/µ + l_g/l_e, complex) loses ωL·µ''/µ'·(µe/µ') to first order in tanδ (IEC 60205)."""
    f, inductance = 1e5, 1e-3
    mu = complex(disp.complex_permeability(f, 2300, 4e6, loss_factor=3e-6, loss_factor_frequency=1e4))
    mu_e = 1 / (1 / mu + gap_ratio)
    exact = (1j * 2 * math.pi * f * inductance * mu_e / mu_e.real).real
    diluted = disp.core_loss_resistance(f, inductance, mu, dilution=mu_e.real / mu.real)
    tan_delta = -mu.imag / mu.real
    assert float(diluted) == pytest.approx(exact, rel=2 * tan_delta)


def test_rod_dilution_by_apparent_over_material_permeability():
    """A rod's apparent µrod = µ/(1 + N(µ − 1)) has tanδ_rod ≈ tanδ·(µrod/µ')·(1 − N) (Johnson & Jasik form)."""
    f, demag = 1e6, 0.01
    mu = complex(disp.complex_permeability(f, 125, 54e6))
    rod = mu / (1 + demag * (mu - 1))
    exact = -rod.imag / rod.real
    model = float(disp.core_loss_resistance(f, 1.0, mu, dilution=rod.real / mu.real)) / (2 * math.pi * f)
    assert model * (1 - demag) == pytest.approx(exact, rel=0.03)


def test_core_loss_hand_worked():
    """µ = 100 − j1 at 1 MHz on 10 µH: R = 2π·10⁶·10⁻⁵·0.01 = 0.6283 Ω; with D = 0.2, 0.1257 Ω (hand-worked)."""
    assert float(disp.core_loss_resistance(1e6, 10e-6, 100 - 1j)) == pytest.approx(0.62832, rel=1e-5)
    assert float(disp.core_loss_resistance(1e6, 10e-6, 100 - 1j, dilution=0.2)) == pytest.approx(0.125664, rel=1e-5)


# --------------------------------------------------------------------------- inductance drift


@given(f_a=st.floats(min_value=1e2, max_value=1e9), f_b=st.floats(min_value=1e2, max_value=1e9),
       mu_i=mu_values, f_r=relaxation_values)
def test_inductance_ratio_is_the_ratio_of_real_parts(f_a, f_b, mu_i, f_r):
    """L(f_b)/L(f_a) = µ'(f_b)/µ'(f_a) of the written-out relaxation; it falls when f_b > f_a."""
    expected = debye(f_b, mu_i, f_r).real / debye(f_a, mu_i, f_r).real
    ratio = float(disp.inductance_ratio(f_a, f_b, mu_i, f_r))
    assert ratio == pytest.approx(expected, rel=1e-12)
    if f_b > f_a:
        assert ratio <= 1.0


def test_inductance_ratio_hand_worked():
    """µi 2300, f_r 4 MHz, 1 kHz → 1 MHz: (1 + 2299/1.0625)/(1 + 2299/(1 + 6.25e-8)) = 0.94120 (hand-worked)."""
    assert float(disp.inductance_ratio(1e3, 1e6, 2300, 4e6)) == pytest.approx(0.941202, rel=1e-5)
    assert float(disp.inductance_ratio(1e6, 1e6, 2300, 4e6)) == 1.0
