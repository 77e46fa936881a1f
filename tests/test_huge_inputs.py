"""Absurdly long numbers are refused in one line that quotes at most a few dozen characters of them, before
any arithmetic could overflow (a count or gauge of hundreds or thousands of digits; a litz of 10^20 strands)."""

import pytest
from click.testing import CliRunner

from coilplan.cli import main

NINES = "9" * 309
CASES = [
    (["solenoid", "--former", "25mm", "--wire", "0.5mm", "--turns", "9" * 4400], "--turns"),
    (["wire", NINES, "--series", "awg"], "WIRE"),
    (["wire", NINES, "--series", "swg"], "WIRE"),
    (["solenoid", "--former", "25mm", "--wire", NINES + "awg", "--turns", "3"], "--wire"),
    (["solenoid", "--former", "25mm", "--wire", NINES + "x0.1mm", "--turns", "3"], "--wire"),
    (["solenoid", "--former", "25mm", "--wire", "1" + "0" * 20 + "x0.05mm", "--turns", "3"], "--wire"),
]


@pytest.mark.parametrize(("arguments", "option"), CASES, ids=[" ".join(a)[:50] for a, _ in CASES])
def test_a_huge_number_is_refused_in_one_short_line(arguments, option):
    outcome = CliRunner().invoke(main, arguments)
    assert outcome.exit_code == 2, outcome.stderr
    line = outcome.stderr.strip()
    assert "\n" not in line and line.startswith(f"coilplan: error: {option}: expected ")
    assert "internal error" not in line and len(line) < 300


def test_a_core_past_its_curie_point_is_said_so_not_a_crash():
    """MnZn power ferrite at 250 °C is past its Curie point (docs/methods.md §27: B_sat falls to zero there):
    a choke for a current cannot be designed (exit 1, naming --temperature), and a given winding says why
    the core saturates at 0 T."""
    base = ["gapped", "--ae", "52mm2", "--le", "57mm", "--material", "mnzn-power", "--wire", "0.6mm",
            "--current", "1.5A", "--temperature", "250C"]
    choke = CliRunner().invoke(main, [*base, "--window-width", "10mm", "--window-depth", "6mm", "--target", "470uH"])
    assert choke.exit_code == 1
    assert choke.stderr.startswith("coilplan: error: cannot be done:") and "Curie point" in choke.stderr
    given = CliRunner().invoke(main, [*base, "--gap", "1mm", "--turns", "50"])
    assert given.exit_code == 0 and "past its Curie point" in given.stdout
