"""LC-tank kernels: resonance, the band rule, the padder's series combination and the voltage across a tank.

Reference values are those of docs/methods.md §10, recomputed here with mpmath from f = 1/(2π√(LC)) (tagged (b)
there), and hand-worked cases whose arithmetic is written out beside them.
"""

import math
from fractions import Fraction

import mpmath as mp
import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.physics import resonance as rs


def mp_frequency(inductance, capacitance):
    """f = 1/(2π√(LC)) at 30 digits (Thomson's resonance; docs/methods.md §10)."""
    with mp.workdps(30):
        return 1 / (2 * mp.pi * mp.sqrt(mp.mpf(inductance) * mp.mpf(capacitance)))


@pytest.mark.parametrize(("inductance", "capacitance"), [
    pytest.param(100e-6, 100e-12, id="100uH-100pF"),  # docs/methods.md §10: 1591.55 kHz
    pytest.param(240e-6, 365e-12, id="240uH-365pF"),  # docs/methods.md §10: 537.73 kHz
    pytest.param(2.2e-6, 47e-12, id="2.2uH-47pF"),
])
def test_resonant_frequency_against_mpmath(inductance, capacitance):
    """f = 1/(2π√(LC)) agrees with mpmath at 30 digits to 1e-14 relative."""
    expected = float(mp_frequency(inductance, capacitance))
    assert float(rs.resonant_frequency(inductance, capacitance)) == pytest.approx(expected, rel=1e-14, abs=0)


def test_hand_worked_100uH_100pF():
    """100 µH with 100 pF: LC = 1e-14 s², so ω = 1e7 rad/s exactly, f = 1e7/(2π) Hz and X = √(L/C) = 1000 Ω."""
    assert float(rs.resonant_frequency(100e-6, 100e-12)) == pytest.approx(1e7 / (2 * math.pi), rel=1e-15, abs=0)
    assert float(rs.characteristic_impedance(100e-6, 100e-12)) == pytest.approx(1000.0, rel=1e-15, abs=0)


def test_inductance_to_reach_530kHz_with_365pF():
    """L = 1/((2π·530 kHz)²·365 pF), computed with mpmath (docs/methods.md §10: 247.06 µH)."""
    with mp.workdps(30):
        expected = 1 / ((2 * mp.pi * mp.mpf(530e3)) ** 2 * mp.mpf("365e-12"))
    assert float(rs.resonant_inductance(530e3, 365e-12)) == pytest.approx(float(expected), rel=1e-14, abs=0)


@given(inductance=st.floats(1e-8, 1.0), capacitance=st.floats(1e-13, 1e-6))
def test_the_three_forms_invert_each_other(inductance, capacitance):
    """f from L and C gives back L (with C) and C (with L): the three forms of ω²LC = 1 agree."""
    f = rs.resonant_frequency(inductance, capacitance)
    assert float(rs.resonant_inductance(f, capacitance)) == pytest.approx(inductance, rel=1e-12, abs=0)
    assert float(rs.resonant_capacitance(f, inductance)) == pytest.approx(capacitance, rel=1e-12, abs=0)
    # at resonance ωL = 1/(ωC) = √(L/C)
    omega = 2 * math.pi * float(f)
    impedance = float(rs.characteristic_impedance(inductance, capacitance))
    assert impedance == pytest.approx(omega * inductance, rel=1e-12, abs=0)
    assert omega * inductance == pytest.approx(1 / (omega * capacitance), rel=1e-12, abs=0)


def test_band_ratio_530_to_1700_kHz():
    """(1700/530)² = (170/53)² = 28900/2809 exactly (docs/methods.md §10: ≥ 10.288); with 365 pF total maximum the
    total minimum must be at most 365·2809/28900 pF (docs/methods.md §10: 35.48 pF)."""
    ratio = Fraction(170, 53) ** 2
    assert float(rs.band_capacitance_ratio(530e3, 1700e3)) == pytest.approx(float(ratio), rel=1e-15, abs=0)
    # the band rule Cmax,total/Cmin,total ≥ R: the largest total minimum is Cmax,total/R
    assert 365e-12 / float(rs.band_capacitance_ratio(530e3, 1700e3)) == pytest.approx(
        float(Fraction(365) / ratio) * 1e-12, rel=1e-14)


def test_max_stray_hand_worked():
    """10–365 pF, 530–1700 kHz: Cs ≤ (365 − 10R)/(R − 1) pF with R = 28900/2809, in exact fractions."""
    ratio = Fraction(28900, 2809)
    expected = (365 - 10 * ratio) / (ratio - 1)  # pF
    got = float(rs.max_stray_capacitance(10e-12, 365e-12, float(ratio)))
    assert got == pytest.approx(float(expected) * 1e-12, rel=1e-13, abs=0)


@given(c_min=st.floats(1e-12, 100e-12), span=st.floats(1.5, 100.0), band=st.floats(1.01, 5.0))
def test_max_stray_meets_the_band_rule_with_equality(c_min, span, band):
    """At Cs = max_stray the ratio (Cmax + Cs)/(Cmin + Cs) is exactly R; negative means Cmax/Cmin < R."""
    c_max = c_min * span
    ratio = band**2
    stray = float(rs.max_stray_capacitance(c_min, c_max, ratio))
    if stray >= 0:
        assert (c_max + stray) / (c_min + stray) == pytest.approx(ratio, rel=1e-9, abs=0)
        # a little more stray and the swing falls short
        more = stray * 1.01 + 1e-15
        assert (c_max + more) / (c_min + more) < ratio
    else:
        assert c_max / c_min < ratio


def test_max_stray_is_nan_when_no_ratio_is_needed():
    """R ≤ 1 (a single frequency) bounds no stray: NaN, no division warning."""
    assert np.isnan(rs.max_stray_capacitance(10e-12, 100e-12, 1.0))


def test_series_capacitance():
    """C1C2/(C1 + C2): two equal capacitors halve; no padder (inf) leaves the capacitor; it broadcasts."""
    assert float(rs.series_capacitance(470e-12, 470e-12)) == pytest.approx(235e-12, rel=1e-15, abs=0)
    assert float(rs.series_capacitance(365e-12, np.inf)) == pytest.approx(365e-12, rel=1e-15, abs=0)
    # 20 pF with a 500 pF padder: 20·500/520 pF, by hand
    got = rs.series_capacitance(np.array([20e-12, 500e-12]), 500e-12)
    assert got == pytest.approx([20 * 500 / 520 * 1e-12, 250e-12], rel=1e-14, abs=0)


def test_tank_voltage_hand_worked():
    """5 W into a Q-100 tank of X = 1000 Ω: R_p = Q·X = 100 kΩ, V = √(P·R_p) = √500000 V (P = V²/R_p)."""
    volts = float(rs.tank_voltage_rms(5.0, 100.0, 1000.0))
    assert volts == pytest.approx(math.sqrt(5.0 * 100.0 * 1000.0), rel=1e-15, abs=0)
    assert volts**2 / (100.0 * 1000.0) == pytest.approx(5.0, rel=1e-14, abs=0)


def test_kernels_are_nan_transparent():
    """NaN in gives NaN out, without raising (scipy.special's convention, style.md)."""
    assert np.isnan(rs.resonant_frequency(np.nan, 1e-10))
    assert np.isnan(rs.resonant_inductance(1e6, np.nan))
    assert np.isnan(rs.band_capacitance_ratio(np.nan, 1e6))
    assert np.isnan(rs.tank_voltage_rms(1.0, np.nan, 1.0))
