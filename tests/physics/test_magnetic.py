"""Closed-core physics: IEC 60205 ring parameters, AL values, gaps, fringing and flux density."""

import math

import mpmath as mp
import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.physics import magnetic as mag


def test_iec_60205_ring_example():
    """ID 15, OD 25, h 10 mm: C1, C2, le, Ae, Ve of docs/methods.md §8, recomputed here by mpmath quadrature.

    The definitions are IEV 221-04-31 (C1 = Σ l/A, C2 = Σ l/A², le = C1²/C2, Ae = C1/C2, Ve = C1³/C2²);
    for a ring the sums are integrals over parallel thin rings: 1/C1 = ∫ h dr/(2πr) and the C2
    term follows from the flux-weighted section. IEC 60205 asks for 5 significant figures.
    """
    r1, r2, h = mp.mpf("7.5e-3"), mp.mpf("12.5e-3"), mp.mpf("10e-3")
    # thin rings in parallel: conductance h dr / (2πr); C1 is the reciprocal of their sum
    c1_exact = 1 / mp.quad(lambda r: h / (2 * mp.pi * r), [r1, r2])
    c1, c2 = mag.ring_core_constants(15e-3, 25e-3, 10e-3)
    assert float(c1) == pytest.approx(float(c1_exact), rel=1e-12, abs=0)
    le, ae, ve = mag.effective_parameters(c1, c2)
    assert float(le) * 1e3 == pytest.approx(60.1802, abs=5e-5)  # docs/methods.md §8, (b)
    assert float(ae) * 1e6 == pytest.approx(48.9268, abs=5e-5)
    assert float(ve) * 1e9 == pytest.approx(2944.42, abs=5e-3)
    assert float(le) < math.pi * 20e-3  # le is shorter than the mean circumference (pitfall 8)
    assert float(ae) < 50e-6  # and Ae smaller than the geometric section


@given(inner=st.floats(min_value=1e-3, max_value=0.1), ratio=st.floats(min_value=1.05, max_value=5.0),
       height=st.floats(min_value=1e-3, max_value=0.05), mu=st.floats(min_value=1.0, max_value=2e4))
def test_ring_al_equals_amperes_law(inner, ratio, height, mu):
    """µ0 µr Ae/le equals ∫ µ0 µr h dr/(2πr) = µ0 µr h ln(OD/ID)/(2π) (Ampère's law; docs/methods.md §8)."""
    le, ae, _ = mag.effective_parameters(*mag.ring_core_constants(inner, inner * ratio, height))
    exact = mu_0 * mu * height * math.log(ratio) / (2 * math.pi)
    assert float(mag.al_value(mu, ae, le)) == pytest.approx(exact, rel=1e-12, abs=0)


def test_gapped_al_published_relation_and_limits():
    """AL = µ0 Ae/(lg + le/µr): 239.359 nH and µe = 95.238 for the docs/methods.md §8 example; limits."""
    ae, le, mu = 100e-6, 50e-3, 2000.0
    al = float(mag.gapped_al(ae, le, 0.5e-3, mu))
    assert al * 1e9 == pytest.approx(mu_0 * ae / (0.5e-3 + le / mu) * 1e9, rel=1e-14, abs=0)
    assert al * 1e9 == pytest.approx(239.359, abs=5e-4)
    effective_mu = al * le / (mu_0 * ae)
    assert effective_mu == pytest.approx(95.238, abs=5e-4)
    # no gap: the ungapped core's µ0 µr Ae/le (5026.5 nH)
    assert float(mag.gapped_al(ae, le, 0.0, mu)) == pytest.approx(float(mag.al_value(mu, ae, le)))
    # a gap dominating the path: the air gap alone, µ0 Ae/lg
    assert float(mag.gapped_al(ae, le, 5e-3, 1e9)) == pytest.approx(mu_0 * ae / 5e-3, rel=1e-6, abs=0)


def test_fringing_factor_worked_value():
    """McLyman's F = 1 + (lg/√Ae) ln(2G/lg) = 1.1844 for lg 0.5 mm, Ae 100 mm², G 10 mm (docs/methods.md §8)."""
    assert float(mag.fringing_factor(0.5e-3, 100e-6, 10e-3)) == pytest.approx(1.1844, abs=5e-5)
    assert float(mag.fringing_factor(0.0, 100e-6, 10e-3)) == 1.0
    gaps = np.array([0.1e-3, 0.3e-3, 1e-3])
    assert np.all(np.diff(mag.fringing_factor(gaps, 100e-6, 10e-3)) > 0)


def test_flux_density_hand_worked():
    """B = L·I/(N·Ae): 200 µH at 40 turns carrying 1.5 A on 50 mm² gives 0.15 T (hand-worked)."""
    al = 200e-6 / 40**2
    assert float(mag.peak_flux_density(al, 40, 1.5, 50e-6)) == pytest.approx(200e-6 * 1.5 / (40 * 50e-6))
    assert float(mag.peak_flux_density(al, 40, 1.5, 50e-6)) == pytest.approx(0.15)


def test_sine_flux_density_transformer_equation():
    """B_peak = V_rms/(4.44 f N Ae) (the transformer equation; 4.44 = 2π/√2 rounded)."""
    value = float(mag.sine_peak_flux_density(230.0, 50.0, 1000, 4e-4))
    assert value == pytest.approx(230.0 / (2 * math.pi / math.sqrt(2) * 50 * 1000 * 4e-4), rel=1e-14, abs=0)
    assert value == pytest.approx(230.0 / (4.44 * 50 * 1000 * 4e-4), rel=1e-3, abs=0)


def test_chamfered_ring_against_quadrature():
    """A 45° chamfer of leg c: C1 = 2π/∫h(r)dr/r and C2 = 2π∫h(r)dr/r²/(∫h dr/r)³ by mpmath quadrature.

    These are the rectangular-ring integrals of IEC 60205 applied to the reduced height h(r)
    (our derivation, as the docstring says); here checked against an independent quadrature,
    and against the section-area loss of four 45° chamfers, 2c² (geometry).
    """
    r1, r2, h, c = (mp.mpf(v) for v in ("7.5e-3", "12.5e-3", "10e-3", "1e-3"))

    def height(r):
        if r < r1 + c:
            return h - 2 * (c - (r - r1))
        if r > r2 - c:
            return h - 2 * (c - (r2 - r))
        return h

    nodes = [r1, r1 + c, r2 - c, r2]
    i1 = mp.quad(lambda r: height(r) / r, nodes)
    i2 = mp.quad(lambda r: height(r) / r**2, nodes)
    c1, c2 = mag.ring_core_constants(15e-3, 25e-3, 10e-3, 1e-3)
    assert float(c1) == pytest.approx(float(2 * mp.pi / i1), rel=1e-12, abs=0)
    assert float(c2) == pytest.approx(float(2 * mp.pi * i2 / i1**3), rel=1e-12, abs=0)
    area = float(mp.quad(height, nodes))
    assert area == pytest.approx(50e-6 - 2 * 1e-6, rel=1e-12, abs=0)
