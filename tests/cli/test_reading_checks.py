"""Readings every form command refuses alike, and the edges of a rewind's range."""

import json

import pytest
from click.testing import CliRunner

from coilplan.answer import flat_document
from coilplan.cli import main

RING = ["toroid", "--od", "23mm", "--id", "14mm", "--height", "7mm", "--wire", "0.5mm"]
ROD = ["rod", "--rod-length", "100mm", "--rod-diameter", "10mm", "--wire", "0.3mm", "--mu", "125"]


def run(*args):
    return CliRunner().invoke(main, list(args))


def one_line(outcome, code, *fragments):
    assert outcome.exit_code == code, outcome.stdout + outcome.stderr
    lines = outcome.stderr.strip().splitlines()
    assert len(lines) == 1 and "Traceback" not in outcome.stderr
    for fragment in fragments:
        assert fragment in lines[0], (fragment, lines[0])


@pytest.mark.parametrize("command", [RING, ROD, ["rewind"]])
def test_a_turns_doubt_as_large_as_the_count_is_refused(command):
    """± 20 turns on a count of 20 could be no turns at all (common practice, no source): exit 2 on every command."""
    one_line(run(*command, "--measured", "55uH@20", "--target", "100uH", "--turns-uncertainty", "20"), 2,
             "--turns-uncertainty", "fewest turns read (20)")


def test_a_reading_at_more_turns_than_the_planned_wire_holds_was_of_another_winding():
    """One layer on a 14 mm hole holds 79 turns of 0.5 mm wire: a reading at 500 turns was of another winding
    (thinner wire: a core's AL does not depend on it), so the answer is a whole winding, said in a note."""
    outcome = run(*RING, "--measured", "55uH@500", "--target", "1uH", "--json")
    assert outcome.exit_code == 0, outcome.stderr
    result = flat_document(json.loads(outcome.stdout))["result"]
    assert "turns_now" not in result and any("another winding" in note for note in result["notices"])
    # L = AL·N² with AL = 55 µH/500² (docs/methods.md §8): 1 µH needs 500·√(1/55) turns
    assert result["turns_exact"] == pytest.approx(500 * (1 / 55) ** 0.5, rel=1e-9)
    # 100 µH needs 674 turns, but only 79 of the planned wire fit: beyond the ring
    assert run(*RING, "--measured", "55uH@500", "--target", "100uH").exit_code == 1


def test_a_reading_at_more_turns_than_its_own_test_wire_holds_is_refused():
    """500 turns of 0.5 mm wire named as the test winding's wire cannot be on a 14 mm hole in one layer."""
    one_line(run(*RING, "--measured", "55uH@500", "--test-wire", "0.5mm", "--target", "100uH"), 2,
             "--measured", "at most")


def test_the_range_stops_at_one_turn_rather_than_opening():
    """A band whose lower end is below one turn ends at the single turn (never null in the JSON)."""
    outcome = run("rewind", "--measured", "1.2uH@3", "--target", "150nH", "--tolerance", "40%", "--json")
    assert outcome.exit_code == 0, outcome.stderr
    result = flat_document(json.loads(outcome.stdout))["result"]
    assert result["turns_range"][0] == 1 and None not in result["turns_range"]


def test_an_absurd_permeability_is_refused():
    one_line(run(*RING, "--mu", "1e300", "--turns", "3"), 2, "--mu")
