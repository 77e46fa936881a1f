"""Unknown turn counts (coilplan.turn_count): each method against model-generated data and the physics.

The model data come from the laws each method rests on, written out here and not taken from the code
under test: L = AL·N² on a closed core (the definition of AL in IEC 60205) and R = N·ℓ_turn·ρ(T)/(πd²/4)
with ρ(T) of annealed copper by IEC 60028 (docs/methods.md §7).
"""

import math

import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.turn_count import count_turns
from coilplan.turn_count_added import added_turns_for_half_turn, count_from_added_turns
from coilplan.turn_count_resistance import DEFAULT_LENGTH_TOLERANCE, count_from_resistance, mean_turn_length
from coilplan.turn_count_test_winding import count_from_test_winding
from coilplan.wire import parse_wire

turns_st = st.integers(min_value=2, max_value=3000)
al_st = st.floats(min_value=1e-10, max_value=1e-5)  # 0.1 nH to 10 µH per turn²: air-ish to high-µ ferrite
tolerance_st = st.floats(min_value=1e-4, max_value=0.05)
unit_st = st.floats(min_value=-1.0, max_value=1.0)  # a reading error as a fraction of the tolerance


def closed_core(al: float, turns: float) -> float:
    """L = AL·N² (IEC 60205 definition of AL)."""
    return al * turns**2


def copper_ohm_per_m(diameter: float, temperature_C: float) -> float:
    """IEC 60028: ρ = (1/58 Ω·mm²/m)·(1 + 0.00393·(T − 20 °C)), over the copper area πd²/4 (docs/methods.md §7)."""
    rho = 1e-6 / 58.0 * (1.0 + 0.00393 * (temperature_C - 20.0))
    return rho / (math.pi * diameter**2 / 4.0)


def q_of(tolerance: float) -> float:
    """The most √(L_a/L_b) can move when each reading errs by ±tolerance: √((1 + t)/(1 − t))."""
    return math.sqrt((1 + tolerance) / (1 - tolerance))


# --------------------------------------------------------------------------- (a) added turns


def test_added_turns_hand_worked():
    """10 turns raising 1.20 mH to 1.45 mH: N = 10/(√(1.45/1.20) − 1) = 100.76 (hand-worked from L = AL·N²)."""
    estimate = count_from_added_turns(1.20e-3, 1.45e-3, 10)
    assert estimate.turns_exact == pytest.approx(10 / (math.sqrt(1.45 / 1.20) - 1), rel=1e-12, abs=0)
    assert estimate.turns == 101
    assert "√(1.450 mH/1.200 mH)" in estimate.explanation and "about 101 turns" in estimate.explanation


@given(turns=turns_st, added=st.integers(min_value=1, max_value=1000), al=al_st)
def test_added_turns_recovers_the_model_count(turns, added, al):
    """L1 = AL·N², L2 = AL·(N + a)² (IEC 60205) give back N, for any core."""
    estimate = count_from_added_turns(closed_core(al, turns), closed_core(al, turns + added), added)
    assert estimate.turns_exact == pytest.approx(turns, rel=1e-8, abs=0)
    assert estimate.turns == turns
    assert estimate.turns_low <= turns <= estimate.turns_high


@given(data=st.data(), turns=st.integers(min_value=3, max_value=3000), al=al_st)
def test_removed_turns_recover_the_model_count(data, turns, al):
    """L2 = AL·(N − b)² after removing b turns gives back N, the count as found (IEC 60205 AL)."""
    removed = data.draw(st.integers(min_value=1, max_value=turns - 1))
    estimate = count_from_added_turns(closed_core(al, turns), closed_core(al, turns - removed), -removed)
    assert estimate.turns_exact == pytest.approx(turns, rel=1e-8, abs=0)
    assert dict(estimate.extra)["turns_after_change"] == pytest.approx(turns - removed, rel=1e-8, abs=0)


@given(turns=turns_st, added=st.integers(min_value=-2999, max_value=1000), al=al_st, tolerance=tolerance_st,
       e1=unit_st, e2=unit_st)
def test_added_turns_interval_holds_readings_within_tolerance(turns, added, al, tolerance, e1, e2):
    """Readings anywhere within ±tolerance of the model keep the true N inside the interval (worst case)."""
    if added == 0 or turns + added < 1:
        return
    before = closed_core(al, turns) * (1 + e1 * tolerance)
    after = closed_core(al, turns + added) * (1 + e2 * tolerance)
    try:
        estimate = count_from_added_turns(before, after, added, tolerance)
    except InfeasibleError:  # the perturbed readings reversed the change: refused, not answered wrongly
        assert (after <= before) if added > 0 else (after >= before)
        return
    assert estimate.turns_low * (1 - 1e-9) <= turns <= estimate.turns_high * (1 + 1e-9)


@pytest.mark.parametrize("added", [7, 40, -12])
def test_added_turns_interval_is_the_worst_case_and_no_wider(added):
    """The interval's ends are the counts that the extreme readings (L1 low/L2 high and the reverse) give."""
    turns, al, tolerance = 120, 2e-7, 0.02
    l1, l2 = closed_core(al, turns), closed_core(al, turns + added)
    estimate = count_from_added_turns(l1, l2, added, tolerance)
    ends = sorted(added / (math.sqrt(l2 * (1 + s) / (l1 * (1 - s))) - 1) for s in (tolerance, -tolerance))
    assert (estimate.turns_low, estimate.turns_high) == pytest.approx(ends, rel=1e-12, abs=0)


def test_added_turns_interval_widens_with_tolerance_and_narrows_with_more_turns():
    """A looser meter widens the interval; more added turns narrow it (N = a/(√ρ − 1), model data)."""
    turns, al = 150, 5e-8
    widths = [count_from_added_turns(closed_core(al, turns), closed_core(al, turns + 20), 20, t)
              for t in (0.001, 0.005, 0.01, 0.02, 0.05)]
    spans = [e.turns_high - e.turns_low for e in widths]
    assert spans == sorted(spans) and len(set(spans)) == len(spans)
    narrowing = [count_from_added_turns(closed_core(al, turns), closed_core(al, turns + a), a, 0.01)
                 for a in (5, 20, 80, 320, 1280)]
    spans = [e.turns_high - e.turns_low for e in narrowing]
    assert spans == sorted(spans, reverse=True) and len(set(spans)) == len(spans)


def test_added_turns_refuses_inductance_that_did_not_rise():
    """L2 ≤ L1 after adding turns (turns in the opposite sense, or a bad reading) is refused with the reason."""
    with pytest.raises(InfeasibleError, match="opposite sense") as caught:
        count_from_added_turns(1.2e-3, 1.1e-3, 10)
    assert caught.value.option == "after"
    with pytest.raises(InfeasibleError, match="did not rise"):
        count_from_added_turns(1.2e-3, 1.2e-3, 10)
    with pytest.raises(InfeasibleError, match="did not fall"):
        count_from_added_turns(1.2e-3, 1.3e-3, -10)


def test_wide_interval_warns_and_gives_the_turns_that_narrow_it():
    """Wider than ±1 turn: a warning naming the a for ±0.5 turn; within ±1 turn: no such warning."""
    turns, al, tolerance = 30, 1e-6, 0.01
    wide = count_from_added_turns(closed_core(al, turns), closed_core(al, turns + 5), 5, tolerance)
    assert max(wide.turns_high - turns, turns - wide.turns_low) > 1
    needed = added_turns_for_half_turn(wide.turns_exact, tolerance)
    assert len(wide.warnings) == 1 and f"adding {needed} instead of 5" in wide.warnings[0]
    narrow = count_from_added_turns(closed_core(al, turns), closed_core(al, turns + 400), 400, tolerance)
    assert max(narrow.turns_high - turns, turns - narrow.turns_low) <= 1
    assert narrow.warnings == ()


def test_wide_interval_says_when_no_number_of_turns_will_do():
    """N·(q − 1) ≥ 0.5: the interval tends to ±N·(q − 1) as a grows, so the warning says ±0.5 is out of reach."""
    estimate = count_from_added_turns(closed_core(1e-7, 100), closed_core(1e-7, 110), 10, 0.01)
    assert added_turns_for_half_turn(estimate.turns_exact, 0.01) is None
    assert "no number of turns brings it within ±0.5 turn" in estimate.warnings[0]
    # the limit itself, from model data with a million added turns (L = AL·N²)
    far = count_from_added_turns(closed_core(1e-7, 100), closed_core(1e-7, 100 + 10**6), 10**6, 0.01)
    assert far.turns_high - 100 == pytest.approx(100 * (q_of(0.01) - 1), rel=1e-3, abs=0)


@given(turns=st.integers(min_value=2, max_value=120), tolerance=st.floats(min_value=1e-3, max_value=0.01),
       removed=st.booleans())
def test_half_turn_advice_is_the_fewest_turns_that_reach_half_a_turn(turns, tolerance, removed):
    """With the advised a the model-data interval is within ±0.5 turn, and with a − 1 it is not."""
    needed = added_turns_for_half_turn(turns, tolerance, removed=removed)
    sign = -1 if removed else 1

    def deviation(a):
        est = count_from_added_turns(closed_core(1e-6, turns), closed_core(1e-6, turns + sign * a), sign * a, tolerance)
        return max(est.turns_high - turns, turns - est.turns_low)

    if needed is None:
        assert removed or turns * (q_of(tolerance) - 1) >= 0.5
        if removed:
            assert deviation(turns - 1) > 0.5  # even leaving a single turn does not do it
        return
    assert deviation(needed) <= 0.5
    if needed > 1:
        assert deviation(needed - 1) > 0.5


def test_unbounded_when_the_change_is_within_the_tolerance():
    """L2/L1 inside what two ±1 % readings can produce: no upper bound, said in a warning."""
    estimate = count_from_added_turns(1.200e-3, 1.210e-3, 1, 0.01)
    assert math.isinf(estimate.turns_high) and estimate.turns_range[1] is None
    assert "no upper bound" in estimate.warnings[0]


# --------------------------------------------------------------------------- (b) test winding


def test_test_winding_issue_check_value():
    """A 20-turn test winding at 55 µH on the core, a winding reading 100 µH: 27 turns (issue 4, N² law)."""
    estimate = count_from_test_winding(55e-6, 20, 100e-6)
    assert estimate.turns_exact == pytest.approx(20 * math.sqrt(100 / 55), rel=1e-12, abs=0)
    assert estimate.turns == 27


@given(turns=turns_st, test_turns=st.integers(min_value=1, max_value=200), al=al_st, tolerance=tolerance_st,
       e1=unit_st, e2=unit_st)
def test_test_winding_recovers_the_count_and_holds_it_in_the_interval(turns, test_turns, al, tolerance, e1, e2):
    """L_t = AL·n², L_x = AL·N² give N; readings within ±tolerance keep N inside the interval."""
    exact = count_from_test_winding(closed_core(al, test_turns), test_turns, closed_core(al, turns), tolerance)
    assert exact.turns_exact == pytest.approx(turns, rel=1e-9, abs=0) and exact.turns == turns
    assert exact.relative_uncertainty == pytest.approx((q_of(tolerance) - 1 / q_of(tolerance)) / 2, rel=1e-9, abs=0)
    noisy = count_from_test_winding(closed_core(al, test_turns) * (1 + e1 * tolerance), test_turns,
                                    closed_core(al, turns) * (1 + e2 * tolerance), tolerance)
    assert noisy.turns_low * (1 - 1e-9) <= turns <= noisy.turns_high * (1 + 1e-9)


# --------------------------------------------------------------------------- (c) DC resistance


def test_resistance_reference_value():
    """100 turns of 20 AWG at 50 mm a turn: R = 100 × 0.05 m × 0.033309 Ω/m (IEC 60028, docs/methods.md §7)."""
    estimate = count_from_resistance(100 * 0.050 * 0.033309, parse_wire("20awg"), 0.050)
    assert estimate.turns_exact == pytest.approx(100, abs=0.01)  # the reference R' is given to 5 digits
    assert estimate.turns == 100


@given(turns=st.integers(min_value=1, max_value=5000), diameter=st.floats(min_value=0.05e-3, max_value=3e-3),
       turn_length=st.floats(min_value=5e-3, max_value=0.5), temperature=st.floats(min_value=0.0, max_value=150.0),
       lead=st.floats(min_value=0.0, max_value=0.5))
def test_resistance_recovers_the_model_count(turns, diameter, turn_length, temperature, lead):
    """R = N·ℓ_turn·ρ(T)/(πd²/4) + R_leads (IEC 60028 copper) gives back N."""
    wire = parse_wire(f"{diameter * 1e3:.6f}mm")
    resistance = turns * turn_length * copper_ohm_per_m(wire.diameter, temperature) + lead
    estimate = count_from_resistance(resistance, wire, turn_length, temperature_C=temperature, lead_resistance=lead)
    assert estimate.turns_exact == pytest.approx(turns, rel=1e-8, abs=0)
    assert estimate.turns == turns


@given(turns=st.integers(min_value=1, max_value=5000), er=unit_st, ed=unit_st, el=unit_st,
       tolerances=st.tuples(tolerance_st, tolerance_st, st.floats(min_value=1e-3, max_value=0.2)))
def test_resistance_interval_holds_errors_within_the_tolerances(turns, er, ed, el, tolerances):
    """A reading, a true diameter and a true turn length each off by up to its tolerance keep N inside."""
    t_r, t_d, t_l = tolerances
    nominal = parse_wire("0.4mm")
    true_diameter, true_length, lead = nominal.diameter * (1 + ed * t_d), 0.040 * (1 + el * t_l), 0.05
    reading = (turns * true_length * copper_ohm_per_m(true_diameter, 20.0) + lead) * (1 + er * t_r)
    estimate = count_from_resistance(reading, nominal, 0.040, lead_resistance=lead, resistance_tolerance=t_r,
                                     diameter_tolerance=t_d, length_tolerance=t_l)
    assert estimate.turns_low * (1 - 1e-9) <= turns <= estimate.turns_high * (1 + 1e-9)


def test_resistance_interval_is_the_worst_case_and_no_wider():
    """The ends are the counts when R, d and ℓ_turn all sit at their tolerance limits, pushing the same way."""
    wire, turn_length, lead = parse_wire("0.25mm"), 0.030, 0.1
    per_metre = copper_ohm_per_m(wire.diameter, 20.0)
    reading = 300 * turn_length * per_metre + lead
    t_r, t_d, t_l = 0.01, 0.03, 0.08
    estimate = count_from_resistance(reading, wire, turn_length, lead_resistance=lead, resistance_tolerance=t_r,
                                     diameter_tolerance=t_d, length_tolerance=t_l)
    # R' ∝ 1/d², so a wire (1 ± t_d) thick has R'/(1 ± t_d)²
    # a reading within ±t_r of the true R: the truth lies in reading/(1 ∓ t_r)
    ends = [(reading / (1 - s * t_r) - lead) / (per_metre / (1 + s * t_d) ** 2 * turn_length * (1 - s * t_l))
            for s in (-1, 1)]
    assert (estimate.turns_low, estimate.turns_high) == pytest.approx(ends, rel=1e-12, abs=0)


def test_resistance_interval_is_led_by_the_turn_length():
    """With the default tolerances the interval is at least ±5 % (the turn length alone) and widens with it."""
    wire = parse_wire("0.5mm")
    resistance = 200 * 0.03 * copper_ohm_per_m(wire.diameter, 20.0)
    spans = [count_from_resistance(resistance, wire, 0.03, length_tolerance=t).relative_uncertainty
             for t in (0.01, 0.05, 0.1, 0.2)]
    assert spans == sorted(spans)
    assert count_from_resistance(resistance, wire, 0.03).relative_uncertainty >= DEFAULT_LENGTH_TOLERANCE


def test_mean_turn_length_of_an_even_layered_winding():
    """m even layers of wire d on a round bobbin of diameter D: the mean turn is π(D + m·d), the perimeters' mean."""
    bobbin, wire, layers = 0.012, 0.0005, 7
    per_layer = [math.pi * (bobbin + (2 * k + 1) * wire) for k in range(layers)]  # turn centres, layer by layer
    inner, outer = math.pi * bobbin, math.pi * (bobbin + 2 * layers * wire)
    assert mean_turn_length(inner, outer) == pytest.approx(sum(per_layer) / layers, rel=1e-12, abs=0)
    with pytest.raises(InvalidInputError) as caught:
        mean_turn_length(0.05, 0.04)
    assert caught.value.option == "outer_perimeter"


# --------------------------------------------------------------------------- the strongest method


def _data_for(turns: int, al: float = 3e-7, turn_length: float = 0.045):
    wire = parse_wire("0.3mm")
    return {
        "before": closed_core(al, turns), "after": closed_core(al, turns + 15), "added": 15,
        "test_winding": (closed_core(al, 10), 10), "unknown_inductance": closed_core(al, turns),
        "resistance": turns * turn_length * copper_ohm_per_m(wire.diameter, 20.0), "wire": wire,
        "turn_length": turn_length,
    }


def test_every_method_with_data_runs_and_the_narrowest_relative_interval_wins():
    """All three on one model coil: each gives N, and the strongest has the smallest relative uncertainty."""
    answer = count_turns(**_data_for(80))
    assert [e.method for e in answer.estimates] == ["added-turns", "test-winding", "resistance"]
    assert all(e.turns == 80 for e in answer.estimates)
    assert answer.strongest is min(answer.estimates, key=lambda e: e.relative_uncertainty)
    # ±1 % readings: the test winding's ±(q − 1/q)/2 ≈ 1 % beats ±5 % on the turn length alone
    assert answer.strongest.method == "test-winding"
    assert "narrowest" in answer.reason and "by added turns" in answer.reason and "by DC resistance" in answer.reason


def test_resistance_wins_when_the_meter_is_poor():
    """A ±20 % inductance meter against tight resistance data: the resistance method is the strongest."""
    answer = count_turns(**_data_for(80), tolerance=0.2, resistance_tolerance=0.002, diameter_tolerance=0.002,
                         length_tolerance=0.01)
    assert answer.strongest.method == "resistance"
    assert answer.as_dict()["method"] == "resistance" and answer.as_dict()["turns"] == 80


def test_a_failed_method_becomes_a_warning_when_another_works():
    """L2 ≤ L1 with a test winding also given: the warning says why added turns was not used."""
    data = _data_for(80)
    data["after"] = data["before"] * 0.9
    answer = count_turns(**data)
    assert [e.method for e in answer.estimates] == ["test-winding", "resistance"]
    assert any(w.startswith("added turns not used") and "opposite sense" in w for w in answer.warnings)
    with pytest.raises(InfeasibleError, match="opposite sense"):
        count_turns(before=data["before"], after=data["after"], added=15)


def test_methods_that_disagree_are_named():
    """Inductance data from 80 turns and resistance data from 120: a warning that the methods disagree."""
    data = _data_for(80)
    data["resistance"] *= 1.5
    answer = count_turns(**data)
    assert any("the methods disagree" in w and "DC resistance" in w for w in answer.warnings)
    assert not any("disagree" in w for w in count_turns(**_data_for(80)).warnings)


def test_assumed_tolerances_are_listed_and_given_ones_are_not():
    """Default tolerances are listed as assumptions to replace; a tolerance the user gave is not."""
    assumed = count_turns(test_winding=(55e-6, 20), unknown_inductance=1e-3)
    assert any("assumed figure" in note and "--tolerance" in note for note in assumed.assumptions)
    stated = count_turns(test_winding=(55e-6, 20), unknown_inductance=1e-3, tolerance=0.003)
    assert not any("--tolerance)" in note for note in stated.assumptions)
    assert any("closed core" in note for note in stated.assumptions)


@pytest.mark.parametrize(("data", "option"), [
    pytest.param({"before": 1e-3}, "after", id="before-alone"),
    pytest.param({"before": 1e-3, "after": 2e-3}, "added", id="no-added"),
    pytest.param({"unknown_inductance": 1e-3}, "test_winding", id="unknown-alone"),
    pytest.param({"resistance": 1.0, "turn_length": 0.04}, "wire", id="no-wire"),
    pytest.param({}, "measurements", id="nothing"),
])
def test_incomplete_data_names_the_missing_option(data, option):
    """A method's data half given, or none at all: InvalidInputError naming what is missing."""
    with pytest.raises(InvalidInputError) as caught:
        count_turns(**data)
    assert caught.value.option == option


@pytest.mark.parametrize(("call", "option"), [
    pytest.param(lambda: count_from_added_turns(1e-3, 2e-3, 0), "added", id="zero-added"),
    pytest.param(lambda: count_from_added_turns(-1e-3, 2e-3, 5), "before", id="negative-reading"),
    pytest.param(lambda: count_from_added_turns(1e-3, 2e-3, 5, 0.6), "tolerance", id="tolerance-too-big"),
    pytest.param(lambda: count_from_test_winding(1e-3, 0, 2e-3), "test_turns", id="no-test-turns"),
    pytest.param(lambda: count_from_resistance(1.0, parse_wire("0.3mm"), 0.04, lead_resistance=1.5),
                 "lead_resistance", id="leads-above-reading"),
])
def test_bad_values_name_their_option(call, option):
    """Values out of range raise InvalidInputError with the option that carried them."""
    with pytest.raises(InvalidInputError) as caught:
        call()
    assert caught.value.option == option


# --- readings that give less than one turn (issue 8): a winding has at least one ----------------------------


def test_added_turns_with_a_rise_far_too_large_is_infeasible():
    """1 mH to 100 kH from 5 added turns: (N + 5)/N = √1e8 = 1e4, N = 5/9999 ≈ 0.0005 turns (IEC 60205 law)."""
    with pytest.raises(InfeasibleError, match=r"give 0\.0005 turns .* less than the one turn"):
        count_from_added_turns(1e-3, 1e5, 5)


def test_test_winding_reading_below_one_test_turn_is_infeasible():
    """An unknown winding reading less than one turn of the test winding would: N = 10·√(1 pH/1 µH) = 0.01."""
    with pytest.raises(InfeasibleError, match=r"less than one turn of the test winding would \(10\.00 nH\)"):
        count_from_test_winding(1e-6, 10, 1e-12)


def test_resistance_below_one_turn_of_wire_is_infeasible():
    """1 mΩ of 0.3 mm copper is 4.1 mm of wire at 20 °C (IEC 60028: 0.017241 Ω·mm²/m), under one 30 mm turn."""
    with pytest.raises(InfeasibleError, match="below the resistance of a single turn"):
        count_from_resistance(1e-3, parse_wire("0.3mm"), 0.030)


def test_a_method_below_one_turn_is_dropped_with_a_note_when_another_stands():
    """The sub-turn method is set aside in words; the other gives the count."""
    answer = count_turns(before=1e-3, after=1e-3 * (110 / 100) ** 2, added=10,
                         resistance=1e-3, wire=parse_wire("0.3mm"), turn_length=0.030)
    assert answer.strongest.method == "added-turns" and answer.strongest.turns == 100
    assert any(text.startswith("DC resistance not used:") and "one turn" in text for text in answer.warnings)


def test_one_turn_at_the_edge_still_counts():
    """A reading a little under one turn, within the tolerances of one, is one turn, not an error."""
    wire = parse_wire("0.3mm")
    one_turn = float(wire.resistance_per_metre(20.0)) * 0.030
    estimate = count_from_resistance(0.8 * one_turn, wire, 0.030)
    assert estimate.turns == 1
