"""The inverse solver: round trips, whole-number choice, batch solves and infeasible targets."""

import math

import numpy as np
import pytest
from hypothesis import given
from hypothesis import strategies as st

from coilplan.errors import InfeasibleError
from coilplan.forms import Solenoid
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire


class ClosedCore:
    """L = AL·N², the closed-core law (IEC 60205 AL value): the solver's simplest form."""

    def __init__(self, al, most=math.inf):
        self.al, self.most = al, most

    def inductance(self, turns):
        return self.al * np.asarray(turns, dtype=float) ** 2

    def min_turns(self):
        return 1.0

    def max_turns(self):
        return self.most

    def limit_reason(self, turns, lowest=False):
        return "one turn" if lowest else f"{turns:.0f} turns fill the window"


def test_closed_core_has_the_square_root_answer():
    """For L = AL·N² the continuous answer is √(L/AL) (definition of AL, IEC 60205)."""
    solution = solve_turns(ClosedCore(62.5e-9), 33e-6)
    assert math.isclose(solution.turns_exact, math.sqrt(33e-6 / 62.5e-9), rel_tol=1e-12)
    assert (solution.turns_below, solution.turns_above) == (22, 23)
    assert solution.turns == 23  # 23² AL = 33.06 µH is closer to 33 µH than 22² AL = 30.25 µH
    assert math.isclose(solution.inductance, 62.5e-9 * 23**2)


def test_whole_number_target_is_exact():
    """A target that is exactly a whole number of turns returns that number on both sides."""
    solution = solve_turns(ClosedCore(1e-9), 1e-9 * 40**2)
    assert solution.turns == solution.turns_below == solution.turns_above == 40


def coil(**changes):
    settings = {"diameter": 0.0255, "wire": parse_wire("0.5mm"), "method": "nagaoka-rosa"}
    settings.update(changes)
    return Solenoid(**settings)


@given(turns=st.floats(min_value=1.0, max_value=5000.0),
       spacing=st.floats(min_value=1.0, max_value=4.0))
def test_round_trip_continuous(turns, spacing):
    """Solving for the inductance of a forward-computed coil returns its turns (continuous)."""
    form = coil(pitch=parse_wire("0.5mm").overall_diameter * spacing)
    target = float(form.inductance(turns))
    solution = solve_turns(form, target)
    assert math.isclose(solution.turns_exact, turns, rel_tol=1e-9)
    assert math.isclose(float(form.inductance(solution.turns_exact)), target, rel_tol=1e-9)


@given(turns=st.integers(min_value=1, max_value=3000))
def test_round_trip_whole_turns(turns):
    """The inductance of a whole number of turns solves back to that whole number."""
    form = coil()
    solution = solve_turns(form, float(form.inductance(turns)))
    assert solution.turns == turns


@given(target=st.floats(min_value=1e-7, max_value=1e-2))
def test_neighbours_bracket_the_target_and_the_closer_is_chosen(target):
    """The whole numbers either side bracket the target; the recommended one is closer in L."""
    solution = solve_turns(coil(), target)
    assert solution.inductance_below <= target * (1 + 1e-12)
    assert solution.inductance_above >= target * (1 - 1e-12)
    closer = min(abs(solution.inductance_below - target), abs(solution.inductance_above - target))
    assert abs(solution.inductance - target) == closer


def test_batch_matches_one_by_one():
    """An array of targets solves in one call to the same answers as single solves."""
    form = coil()
    targets = np.logspace(-6, -3, 50)
    batch = solve_turns(form, targets)
    for index in (0, 17, 49):
        single = solve_turns(form, targets[index])
        assert math.isclose(batch.turns_exact[index], single.turns_exact, rel_tol=1e-10)
        assert batch.turns[index] == single.turns


def test_target_above_what_fits_names_the_limit():
    """A target beyond the usable former length is infeasible and says what does fit."""
    form = coil(max_length=0.03)
    with pytest.raises(InfeasibleError) as caught:
        solve_turns(form, 1e-3)
    largest = float(form.inductance(math.floor(form.max_turns())))
    assert caught.value.achievable[1] == pytest.approx(largest)
    assert "usable length" in str(caught.value) and "above" in str(caught.value)


def test_target_below_one_turn_is_infeasible():
    """Less than one turn's inductance cannot be wound."""
    with pytest.raises(InfeasibleError, match="single turn"):
        solve_turns(coil(), 1e-9)


def test_fixed_length_spreads_turns():
    """With a fixed winding length the pitch is length/N and the answer fits the length."""
    form = coil(length=0.04)
    solution = solve_turns(form, 20e-6)
    assert float(form.pitch_at(solution.turns)) * solution.turns == pytest.approx(0.04)
    assert solution.turns <= form.max_turns()


# --- targets beyond any coil, and where the search stops (issue 8) ---------------------------------------------


class CountingCore(ClosedCore):
    """ClosedCore that counts the turn counts it was asked for, and may name a search limit of its own."""

    def __init__(self, al, most=math.inf, search=None):
        super().__init__(al, most)
        self.search, self.asked = search, []

    def inductance(self, turns):
        self.asked.extend(np.atleast_1d(turns).tolist())
        return super().inductance(turns)

    def search_limit(self):
        return (math.inf, "") if self.search is None else (self.search, f"{self.search:.0f} turns, the most "
                                                                         f"this form plans")


@pytest.mark.parametrize("target", [0.0, -1e-6, np.array([1e-6, 0.0])])
def test_target_not_above_zero_is_below_one_turn(target):
    """A band around a target, target·(1 − u) with u >= 1, reaches zero: that is below one turn, in words,
    not a defect (one turn of any winding has some inductance)."""
    with pytest.raises(InfeasibleError, match="not above zero: even one turn"):
        solve_turns(ClosedCore(1e-9), target)


def test_infinite_target_is_above_any_winding():
    with pytest.raises(InfeasibleError, match="above what any winding reaches"):
        solve_turns(ClosedCore(1e-9), math.inf)


def test_nan_target_is_a_defect():
    with pytest.raises(ValueError, match="numbers"):
        solve_turns(ClosedCore(1e-9), math.nan)


def test_form_search_limit_bounds_an_unlimited_form():
    """A form with no physical limit but a search limit of its own: the solver stops there and the
    refusal gives the form's words and the largest L it can reach (AL·N², IEC 60205)."""
    form = CountingCore(1e-9, search=1000.0)
    with pytest.raises(InfeasibleError, match="the most this form plans") as caught:
        solve_turns(form, 1.0)
    assert caught.value.achievable[1] == pytest.approx(1e-9 * 1000**2)
    assert max(form.asked) == 1000.0
    assert solve_turns(form, 1e-9 * 700**2).turns == 700


def test_without_any_limit_the_search_stops_at_ten_million_turns():
    """No limit at all: the refusal names the solver's own limit (ten million turns)."""
    form = CountingCore(1e-12)
    with pytest.raises(InfeasibleError, match="10000000 turns, beyond which this solver does not search"):
        solve_turns(form, 1e6)
    assert max(form.asked) == 1e7


def test_solenoid_of_unstated_length_stops_at_a_hundred_metres():
    """A former of unstated length is searched up to a 100 m winding (the longest length the tool reads), and
    the reachable top is the inductance there: L of N = (100 m − d)/p + 1 turns."""
    form = coil()
    with pytest.raises(InfeasibleError, match=r"100\.0 m winding") as caught:
        solve_turns(form, 1e3)
    turns = math.floor((100.0 - form.wire.overall_diameter) / form.wire.overall_diameter + 1.0 + 1e-9)
    assert caught.value.achievable[1] == pytest.approx(float(form.inductance(turns)), rel=1e-12)
    # just inside: solved, and the winding is at most 100 m long
    solution = solve_turns(form, 0.999 * caught.value.achievable[1])
    assert float(form.winding_length(solution.turns)) <= 100.0
