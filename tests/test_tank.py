"""The tank library: two of L, C, f; band coverage with a variable capacitor; L and C0 fitted to resonances.

Expected values come from f = 1/(2π√(LC)) and the band rule Cmax,total/Cmin,total ≥ (fmax/fmin)² (docs/methods.md
§10), worked out here with mpmath or exact fractions, and from synthetic readings made with 1/ω² = L·(C + C0).
"""

import math
from fractions import Fraction

import mpmath as mp
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from coilplan.errors import InvalidInputError
from coilplan.tank import solve_tank
from coilplan.tank_band import DEFAULT_STRAY_F, plan_band
from coilplan.tank_drive import HIGH_RF_VOLTAGE_V, drive_fields, tank_cautions
from coilplan.tank_fit import DEFAULT_FREQUENCY_TOLERANCE, fit_resonances
from coilplan.tank_values import parse_range, parse_resonance


def mp_f(inductance, capacitance):
    """f = 1/(2π√(LC)) at 30 digits (docs/methods.md §10)."""
    with mp.workdps(30):
        return float(1 / (2 * mp.pi * mp.sqrt(mp.mpf(inductance) * mp.mpf(capacitance))))


def readings(inductance, c0, capacitors):
    """Noise-free resonances of a coil L with C0 across it: f_i = 1/(2π√(L(C_i + C0))), by mpmath."""
    return [(c, mp_f(inductance, c + c0)) for c in capacitors]


# --- any two of L, C, f ------------------------------------------------------------------------------------------


def test_two_of_three_hand_worked():
    """240 µH with 365 pF resonates at the mpmath value (docs/methods.md §10: 537.73 kHz); X = √(L/C) there."""
    tank = solve_tank(inductance=240e-6, capacitance=365e-12)
    assert tank.solved_for == "frequency"
    assert tank.frequency == pytest.approx(mp_f(240e-6, 365e-12), rel=1e-14, abs=0)
    assert tank.reactance == pytest.approx(math.sqrt(240e-6 / 365e-12), rel=1e-13, abs=0)
    assert tank.characteristic_impedance == pytest.approx(math.sqrt(240e-6 / 365e-12), rel=1e-15, abs=0)


@given(inductance=st.floats(1e-8, 1.0), capacitance=st.floats(1e-13, 1e-6))
def test_two_of_three_round_trips(inductance, capacitance):
    """L, C → f; then f with C gives L back and f with L gives C back."""
    f = solve_tank(inductance=inductance, capacitance=capacitance).frequency
    back_l = solve_tank(frequency=f, capacitance=capacitance)
    back_c = solve_tank(frequency=f, inductance=inductance)
    assert (back_l.solved_for, back_c.solved_for) == ("inductance", "capacitance")
    assert back_l.inductance == pytest.approx(inductance, rel=1e-12, abs=0)
    assert back_c.capacitance == pytest.approx(capacitance, rel=1e-12, abs=0)


@pytest.mark.parametrize(("kwargs", "option"), [
    pytest.param({"frequency": 1e6}, "inductance or capacitance", id="one-given"),
    pytest.param({}, "inductance or capacitance or frequency", id="none-given"),
    pytest.param({"frequency": 1e6, "inductance": 1e-6, "capacitance": 1e-9}, "frequency", id="all-three"),
    pytest.param({"frequency": 1e6, "inductance": -1e-6}, "inductance", id="negative"),
])
def test_two_of_three_errors_name_the_field(kwargs, option):
    """Not exactly two given, or a value not above zero: InvalidInputError naming the field."""
    with pytest.raises(InvalidInputError) as caught:
        solve_tank(**kwargs)
    assert caught.value.option == option


# --- parsing ------------------------------------------------------------------------------------------------------


def test_parse_range_and_resonance():
    """'low:high' in either order; 'C@f' as capacitor and frequency; each end read by parse_quantity."""
    assert parse_range("530kHz:1700kHz", "Hz", "--band") == (530e3, 1700e3)
    assert parse_range("1.7MHz : 530 kHz", "Hz", "--band") == (530e3, 1.7e6)
    assert parse_resonance("220pF@1.1MHz") == (220e-12, 1.1e6)


@pytest.mark.parametrize(("text", "unit", "option"), [
    pytest.param("530kHz", "Hz", "--band", id="one-end"),
    pytest.param("530kHz:1700kHz:2MHz", "Hz", "--band", id="three-ends"),
    pytest.param("10pF:365pH", "F", "--capacitor", id="wrong-unit"),
    pytest.param("10pF:10pF", "F", "--capacitor", id="equal-ends"),
    pytest.param("10:365", "F", "--capacitor", id="no-unit"),
])
def test_parse_range_errors(text, unit, option):
    """A malformed range raises InvalidInputError naming the option and the low:high form."""
    with pytest.raises(InvalidInputError) as caught:
        parse_range(text, unit, option)
    assert caught.value.option == option and "low:high" in caught.value.expected


@pytest.mark.parametrize("text", ["100pF", "100pF@", "1.2MHz@100pF", "100pF@1.2MHz@3"])
def test_parse_resonance_errors(text):
    """Not C@f: InvalidInputError on the fit's points with the expected form."""
    with pytest.raises(InvalidInputError) as caught:
        parse_resonance(text)
    assert caught.value.option == "points" and "100pF@1.2MHz" in caught.value.expected


# --- band coverage ------------------------------------------------------------------------------------------------

BAND = (530e3, 1700e3)
RATIO = Fraction(1700, 530) ** 2  # the band rule's (fmax/fmin)², exact


def test_band_hand_worked_530_to_1700_kHz():
    """10–365 pF with 15 pF stray: R = (170/53)², Cs ≤ (365 − 10R)/(R − 1) pF, L = 1/((2π·530 kHz)²·380 pF), and the
    band covered runs from 530 kHz to 530·√(380/25) kHz (all by hand or mpmath)."""
    plan = plan_band(capacitor=(10e-12, 365e-12), band=BAND, stray=15e-12)
    assert plan.required_ratio == pytest.approx(float(RATIO), rel=1e-14, abs=0)
    assert plan.max_stray == pytest.approx(float((365 - 10 * RATIO) / (RATIO - 1)) * 1e-12, rel=1e-12, abs=0)
    with mp.workdps(30):
        inductance = float(1 / ((2 * mp.pi * 530e3) ** 2 * mp.mpf("380e-12")))
    assert plan.inductance == pytest.approx(inductance, rel=1e-13, abs=0)
    assert plan.covered[0] == pytest.approx(530e3, rel=1e-13, abs=0)
    assert plan.covered[1] == pytest.approx(530e3 * math.sqrt(380 / 25), rel=1e-13, abs=0)
    assert plan.available_ratio == pytest.approx(380 / 25, rel=1e-14, abs=0)
    assert plan.covers_band is True and not plan.stray_assumed
    assert plan.shortfall() is None
    assert any("swing to spare" in note for note in plan.advice)


def test_band_the_capacitor_cannot_cover():
    """10–250 pF with 20 pF stray swings 270/30 = 9:1 < R: covered only to 530·√9 = 1590 kHz; it would just work with
    Cs = (250 − 10R)/(R − 1) pF; the answer says so and names the trade-off."""
    plan = plan_band(capacitor=(10e-12, 250e-12), band=BAND, stray=20e-12)
    assert plan.covers_band is False
    assert plan.available_ratio == pytest.approx(9.0, rel=1e-14, abs=0)
    assert plan.covered == pytest.approx((530e3, 1590e3), rel=1e-13, abs=0)
    assert plan.max_stray == pytest.approx(float((250 - 10 * RATIO) / (RATIO - 1)) * 1e-12, rel=1e-12, abs=0)
    text = " ".join(plan.advice)
    assert "15.84 pF" in text and "padder" in text and "trimmer" in text and "narrower band" in text
    assert "1.590 MHz" in plan.shortfall()
    # at exactly that stray the band is just covered (the band rule with equality)
    just = plan_band(capacitor=(10e-12, 250e-12), band=BAND, stray=plan.max_stray)
    assert just.covers_band is True and just.covered[1] == pytest.approx(1700e3, rel=1e-12, abs=0)


def test_band_no_stray_at_all_would_do():
    """A capacitor whose own Cmax/Cmin = 5 < R cannot cover the band: max_stray < 0 and the advice says so."""
    plan = plan_band(capacitor=(50e-12, 250e-12), band=BAND, stray=0.0)
    assert plan.max_stray < 0 and plan.covers_band is False
    assert any("no stray at all" in note for note in plan.advice)


def test_band_padder_in_series():
    """20–500 pF with a 500 pF padder: the swing is 20·500/520 to 250 pF (series C1C2/(C1+C2), by hand), plus the
    10 pF stray across the coil; L puts 530 kHz at 260 pF; the padder narrows the stray the band stands."""
    plan = plan_band(capacitor=(20e-12, 500e-12), band=BAND, stray=10e-12, padder=500e-12)
    low_total = (20 * 500 / 520 + 10) * 1e-12
    assert plan.total_capacitance == pytest.approx((low_total, 260e-12), rel=1e-13, abs=0)
    assert plan.covered[0] == pytest.approx(530e3, rel=1e-13, abs=0)
    assert plan.covered[1] == pytest.approx(530e3 * math.sqrt(260e-12 / low_total), rel=1e-13, abs=0)
    without = plan_band(capacitor=(20e-12, 500e-12), band=BAND, stray=10e-12)
    assert plan.max_stray < without.max_stray  # a padder narrows the swing
    r = float(RATIO)
    assert plan.max_stray == pytest.approx((250e-12 - r * 20 * 500 / 520 * 1e-12) / (r - 1), rel=1e-12, abs=0)


@settings(max_examples=40)
@given(c_min=st.floats(2e-12, 50e-12), span=st.floats(2.0, 60.0), stray=st.floats(0.0, 60e-12),
       f_low=st.floats(100e3, 10e6), band_ratio=st.floats(1.05, 4.0))
def test_band_rule_decides_coverage(c_min, span, stray, f_low, band_ratio):
    """covers_band holds exactly when (Cmax + Cs)/(Cmin + Cs) ≥ (fmax/fmin)², and then the band covered contains the
    band, with its low edge at fmin (docs/methods.md §10's band rule)."""
    c_max = c_min * span
    band = (f_low, f_low * band_ratio)
    plan = plan_band(capacitor=(c_min, c_max), band=band, stray=stray)
    rule = (c_max + stray) / (c_min + stray) >= band_ratio**2
    assert plan.covers_band is rule
    assert plan.covered[0] == pytest.approx(f_low, rel=1e-12, abs=0)
    if rule:
        assert plan.covered[1] >= band[1] * (1 - 1e-12)
    else:
        assert plan.covered[1] < band[1]
    assert (stray <= plan.max_stray * (1 + 1e-12) + 1e-24) is rule or math.isclose(stray, plan.max_stray)


def test_band_covered_by_a_given_coil():
    """--inductance with --capacitor: the band covered is f(L, Cmax + Cs) to f(L, Cmin + Cs) (mpmath)."""
    plan = plan_band(capacitor=(10e-12, 365e-12), inductance=240e-6)
    assert plan.stray == DEFAULT_STRAY_F and plan.stray_assumed and plan.assumptions
    assert plan.covered == pytest.approx((mp_f(240e-6, 380e-12), mp_f(240e-6, 25e-12)), rel=1e-13, abs=0)
    assert plan.covers_band is None and plan.required_ratio is None


def test_band_a_given_coil_that_misses_the_band():
    """A 150 µH coil with 10–365 pF + 15 pF starts above 530 kHz: the band is not covered though the swing is
    enough; a 300 µH coil (471 kHz to 1.84 MHz) covers it with room at both ends."""
    plan = plan_band(capacitor=(10e-12, 365e-12), band=BAND, inductance=150e-6, stray=15e-12)
    assert plan.covered[0] == pytest.approx(mp_f(150e-6, 380e-12), rel=1e-13, abs=0)
    assert plan.covered[0] > 530e3  # too little inductance: the low edge is missed
    assert plan.covers_band is False
    assert "the capacitor's swing is enough" in plan.advice[0]
    wide = plan_band(capacitor=(10e-12, 365e-12), band=BAND, inductance=300e-6, stray=15e-12)
    assert wide.covered[0] < 530e3 and wide.covered[1] > 1700e3 and wide.covers_band is True
    assert plan.inductance_for_band == pytest.approx(1 / ((2 * math.pi * 530e3) ** 2 * 380e-12), rel=1e-13, abs=0)


@pytest.mark.parametrize(("kwargs", "option"), [
    pytest.param({"capacitor": (365e-12, 10e-12), "band": BAND}, "capacitor", id="min-above-max"),
    pytest.param({"capacitor": (10e-12, 365e-12)}, "capacitor", id="no-band-no-coil"),
    pytest.param({"capacitor": (10e-12, 365e-12), "band": BAND, "stray": -1e-12}, "stray", id="negative-stray"),
    pytest.param({"capacitor": (10e-12, 365e-12), "band": BAND, "padder": 0.0}, "padder", id="zero-padder"),
])
def test_band_errors_name_the_field(kwargs, option):
    """Unusable band-planning input raises InvalidInputError naming the field."""
    with pytest.raises(InvalidInputError) as caught:
        plan_band(**kwargs)
    assert caught.value.option == option


# --- L and C0 from resonances -------------------------------------------------------------------------------------


def test_fit_recovers_a_hand_built_coil():
    """Readings made from L = 180 µH, C0 = 8 pF at 47, 150 and 390 pF (mpmath) give L and C0 back, residuals ≈ 0."""
    fit = fit_resonances(readings(180e-6, 8e-12, [47e-12, 150e-12, 390e-12]), tolerance=0.002)
    assert fit.inductance == pytest.approx(180e-6, rel=1e-10, abs=0)
    assert fit.stray == pytest.approx(8e-12, rel=1e-8, abs=0)
    assert max(abs(r) for r in fit.residuals) < 1e-6  # Hz
    assert fit.degrees_of_freedom == 1 and fit.warnings == ()
    result = fit.as_dict()
    assert {"inductance_H", "inductance_uncertainty_H", "stray_capacitance_F", "stray_capacitance_uncertainty_F",
            "points", "chi_square"} <= set(result)
    assert {"capacitance_F", "frequency_Hz", "fitted_frequency_Hz", "residual_Hz", "residual_relative"} == set(
        result["points"][0])


@given(inductance=st.floats(1e-6, 10e-3), c0=st.floats(0.5e-12, 50e-12),
       capacitors=st.lists(st.floats(5e-12, 2e-9), min_size=2, max_size=6, unique=True).filter(
           lambda cs: max(cs) > 1.2 * min(cs)))
def test_fit_is_exact_on_noise_free_data(inductance, c0, capacitors):
    """Noise-free 1/ω² = L·(C + C0) readings give L and C0 back to rounding, for random coils and capacitors."""
    fit = fit_resonances(readings(inductance, c0, capacitors), tolerance=0.01)
    assert fit.inductance == pytest.approx(inductance, rel=1e-9, abs=0)
    assert fit.stray == pytest.approx(c0, rel=1e-6, abs=1e-9 * max(capacitors))


@settings(max_examples=12, derandomize=True)
@given(inductance=st.floats(1e-6, 5e-3), c0=st.floats(1e-12, 40e-12), count=st.integers(2, 6),
       first=st.floats(10e-12, 100e-12), seed=st.integers(0, 2**32 - 1))
def test_fit_uncertainty_covers_the_truth(inductance, c0, count, first, seed):
    """With each reading off by up to ±t (uniform), the truth lies within ±1 stated standard uncertainty most of
    the time (expected ≈ 92 %: the spread is t/√3, the stated one t) and within ±1/3 of it far less often (≈ 43 %):
    too small an uncertainty fails the first check, one inflated threefold the second. Seeded: deterministic."""
    tolerance, trials = 0.005, 200
    rng = np.random.default_rng(seed)
    inside_l = inside_c = tight_l = tight_c = 0
    for _ in range(trials):
        capacitors = first * np.cumprod(rng.uniform(1.5, 3.0, count))
        exact = 1 / (2 * np.pi * np.sqrt(inductance * (capacitors + c0)))
        noisy = exact * (1 + rng.uniform(-tolerance, tolerance, count))
        fit = fit_resonances(list(zip(capacitors, noisy, strict=True)), tolerance=tolerance)
        error_l, error_c = abs(fit.inductance - inductance), abs(fit.stray - c0)
        inside_l += error_l <= fit.inductance_uncertainty
        inside_c += error_c <= fit.stray_uncertainty
        tight_l += error_l <= fit.inductance_uncertainty / 3
        tight_c += error_c <= fit.stray_uncertainty / 3
    assert inside_l >= 0.8 * trials and inside_c >= 0.8 * trials
    assert tight_l <= 0.6 * trials and tight_c <= 0.6 * trials


def test_fit_fails_clearly_on_a_single_point():
    """One resonance gives only L·(C + C0): InvalidInputError on the points saying two or more are needed."""
    with pytest.raises(InvalidInputError) as caught:
        fit_resonances([(100e-12, 1.2e6)])
    assert caught.value.option == "points"
    assert str(caught.value) == "points: expected two resonances or more: one gives only L·(C + C0)"


def test_fit_needs_two_different_capacitors_and_a_falling_frequency():
    """The same capacitor twice fixes no slope; a frequency that rises with C gives no positive L: both errors."""
    with pytest.raises(InvalidInputError, match="two different capacitors"):
        fit_resonances([(100e-12, 1.2e6), (100e-12, 1.21e6)])
    with pytest.raises(InvalidInputError, match="falls as the capacitance rises"):
        fit_resonances([(100e-12, 1.0e6), (200e-12, 1.1e6)])


def test_fit_warns_on_a_negative_c0():
    """Readings made with C0 = −5 pF (a capacitor value off) give a negative C0, and a warning says so."""
    fit = fit_resonances(readings(100e-6, -5e-12, [100e-12, 330e-12]), tolerance=0.001)
    assert fit.stray == pytest.approx(-5e-12, rel=1e-8, abs=0)
    assert any("below zero" in text for text in fit.warnings)


def test_fit_warns_when_the_points_are_off_a_line_and_names_the_worst():
    """One reading 3 % high (six times a ±0.5 % tolerance) is named as the worst; chi-square scales the uncertainty."""
    points = readings(150e-6, 10e-12, [47e-12, 100e-12, 220e-12, 470e-12])
    points[2] = (points[2][0], points[2][1] * 1.03)
    fit = fit_resonances(points, tolerance=0.005)
    off_line = [text for text in fit.warnings if "do not lie on one line" in text]
    assert len(off_line) == 1 and "220.0 pF" in off_line[0]
    assert fit.uncertainty_scale > 1.0
    clean = fit_resonances(readings(150e-6, 10e-12, [47e-12, 100e-12, 220e-12, 470e-12]), tolerance=0.005)
    assert not any("do not lie on one line" in text for text in clean.warnings)


def test_fit_states_its_assumptions():
    """The default tolerance is an assumption, said so; two points say that the residuals cannot check them."""
    fit = fit_resonances(readings(50e-6, 6e-12, [100e-12, 470e-12]))
    assert fit.tolerance == DEFAULT_FREQUENCY_TOLERANCE
    text = " ".join(fit.assumptions)
    assert "assumed" in text and "third reading" in text


# --- a tank at power ----------------------------------------------------------------------------------------------


def test_drive_fields_and_cautions():
    """P = V²/R_p with R_p = Q·X: 2 W, Q 50, X 1 kΩ gives √100000 V; the cautions follow --power and the threshold."""
    fields = drive_fields(reactance=1000.0, power=2.0, q=50.0)
    assert fields["parallel_resistance_ohm"] == pytest.approx(50e3)
    assert fields["tank_voltage_rms_V"] == pytest.approx(math.sqrt(2.0 * 50.0 * 1000.0), rel=1e-14, abs=0)
    assert fields["tank_voltage_peak_V"] == pytest.approx(math.sqrt(2.0) * math.sqrt(1e5), rel=1e-14, abs=0)
    assert drive_fields(reactance=1000.0) == {}
    assert tank_cautions() == []
    assert len(tank_cautions(power=2.0)) == 2  # licensing, and the general voltage caution (no Q given)
    loud = tank_cautions(power=2.0, voltage_rms=fields["tank_voltage_rms_V"])
    assert any("licensing" in text for text in loud) and any("316 V" in text for text in loud)
    quiet = tank_cautions(power=0.01, voltage_rms=HIGH_RF_VOLTAGE_V / 2)
    assert len(quiet) == 1 and "licensing" in quiet[0]


# --- a driven tank's Q and power within reason (issue 8) --------------------------------------------------------


@pytest.mark.parametrize(("fields", "option"), [({"q": 1e300}, "q"), ({"q": 1.5e5}, "q"),
                                                ({"power": 1e300}, "power"), ({"power": 1e-9}, "power")])
def test_drive_beyond_any_tank_is_refused(fields, option):
    """A loaded Q above 100,000 or a power outside a microwatt to 100 kW is a slip, refused by name: the
    voltage √(P·Q·X) would otherwise be a figure of hundreds of digits."""
    with pytest.raises(InvalidInputError, match=f"^{option}: expected"):
        drive_fields(reactance=316.0, **fields)


def test_drive_at_the_limits_is_finite():
    """At Q = 100,000 and 100 kW across 316 Ω: V = √(1e5 · 1e5 · 316) = 1.78 MV RMS (hand-worked)."""
    fields = drive_fields(reactance=316.0, power=1e5, q=1e5)
    assert fields["tank_voltage_rms_V"] == pytest.approx(math.sqrt(1e5 * 1e5 * 316.0))
