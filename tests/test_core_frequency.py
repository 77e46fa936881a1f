"""The core at the operating frequency: permeability drift, core loss, dilution and the Q, through the CLI.

The independent references are the definition of complex permeability (IEC 60050-121, 121-12-30:
µ = µ' − jµ'', so a winding on a closed core has Z = jω·µ0·µ·N²·Ae/le), the gapped core's series
reluctance law 1/µe = 1/µ + lg/le evaluated in complex arithmetic, and the rod loss formula of
Johnson & Jasik (Antenna Engineering Handbook, ch. 5, as quoted by A. J. Payne, "Losses in ferrite
rod antennas"). The Debye relaxation is written out here independently of the package.
"""

import json
import math

import numpy as np
import pytest
from click.testing import CliRunner
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.answer import flat_document
from coilplan.cli import main
from coilplan.physics import dispersion as disp

RING = ["toroid", "--od", "12.7mm", "--id", "7.7mm", "--height", "4.8mm", "--wire", "26awg"]
CORE = ["gapped", "--ae", "50mm2", "--le", "45mm", "--wire", "0.3mm", "--no-fringing"]
ROD = ["rod", "--rod-length", "100mm", "--rod-diameter", "10mm", "--wire", "0.3mm"]


def run(*args):
    return CliRunner().invoke(main, list(args))


def run_json(*args):
    outcome = run(*args, "--json")
    assert outcome.exit_code == 0, outcome.stdout + outcome.stderr
    return flat_document(json.loads(outcome.stdout))


def debye_real(f, mu_i, f_r):
    """µ' of the single relaxation 1 + (µi − 1)/(1 + j f/f_r) (Debye 1929, from memory), written out here."""
    return (1 + (mu_i - 1) / (1 + 1j * f / f_r)).real


# --------------------------------------------------------------------------- the catalogue loss curve


@settings(max_examples=60, deadline=None)
@given(mu_i=st.floats(2.0, 2e4), f_r=st.floats(1e4, 1e10), low=st.floats(1e-7, 1e-3), rise=st.floats(1.0, 30.0),
       f0=st.floats(1e3, 1e7), span=st.floats(2.0, 1e3), f=st.floats(0.0, 1e11))
def test_catalogue_loss_never_exceeds_the_relaxation(mu_i, f_r, low, rise, f0, span, f):
    """No single mechanism loses more than the Debye form's broad tail: the line is capped by it at every f."""
    tangent = disp.catalogue_loss_tangent(f, mu_i, f_r, low, f0, low * rise, f0 * span)
    relaxation = disp.complex_permeability(f, mu_i, f_r, low, f0)
    assert 0 <= tangent <= -relaxation.imag / relaxation.real * (1 + 1e-12)


def test_catalogue_loss_is_a_straight_line_on_log_log_axes():
    """IEC 60401-3 charts tanδ/µi against f on log-log axes: between the two points the curve is a power law."""
    mu_i, f_r = 125.0, 54e6
    f = np.geomspace(1e5, 3e7, 7)
    tangent = disp.catalogue_loss_tangent(f, mu_i, f_r, 30e-6, 1e5, 160e-6, 3e7)
    slopes = np.diff(np.log(tangent)) / np.diff(np.log(f))
    assert slopes == pytest.approx(np.full(6, math.log(160 / 30) / math.log(300)), rel=1e-12)
    # below the first point the floor is flat (the residual loss), unless the relaxation is lower still
    assert disp.catalogue_loss_tangent(1e3, mu_i, f_r, 30e-6, 1e5, 160e-6, 3e7) <= 30e-6 * mu_i


# --------------------------------------------------------------------------- a toroid: a closed ungapped core


def test_toroid_core_loss_is_the_real_part_of_the_complex_permeability_impedance():
    """Z = jω·µ0·(µ' − jµ'')·N²·Ae/le (IEV 121-12-30): Im Z/ω is L at f, Re Z the core loss, Q = ωL/(R_cu + R_core)."""
    data = run_json(*RING, "--material", "nizn-125", "--turns", "13", "--at", "7MHz")
    result = data["result"]
    f, n = 7e6, 13
    mu_real = debye_real(f, 125, 54e6)  # dispersion.csv's class: µi 125, f_r 54 MHz
    mu = mu_real * (1 - 1j * result["core_loss_tangent"])
    impedance = 1j * 2 * math.pi * f * mu_0 * mu * n**2 * result["ae_m2"] / result["le_m"]
    assert impedance.imag / (2 * math.pi * f) == pytest.approx(result["inductance_H"] * result["core_inductance_ratio"],
                                                              rel=1e-9)
    assert result["core_permeability"] == pytest.approx(mu_real, rel=1e-12)
    assert impedance.real == pytest.approx(result["core_loss_resistance_ohm"], rel=1e-9)
    omega_l = impedance.imag
    assert result["q"] == pytest.approx(omega_l / (result["ac_resistance_ohm"] + impedance.real), rel=1e-9)
    assert result["core_q"] == pytest.approx(1 / result["core_loss_tangent"], rel=1e-9)
    assert result["q"] < min(result["copper_q"], result["core_q"])


def test_readings_at_the_meter_frequency_carry_to_the_operating_frequency():
    """Calibrated at the meter's 1 MHz, L at 20 MHz is L_meter·µ'(20 MHz)/µ'(1 MHz), the class's Debye shape
    on the susceptibility this core showed (its µ at 1 MHz, implied by the reading)."""
    result = run_json(*RING, "--material", "nizn-125", "--measured", "9.8uH@13", "--meter-freq", "1MHz",
                      "--turns", "13", "--at", "20MHz", "--self-capacitance", "1pF")["result"]
    shown = result["mu_r"]  # this core's µ at 1 MHz
    chi_low = (shown - 1) / ((debye_real(1e6, 125, 54e6) - 1) / 124)
    expected = (1 + chi_low * (debye_real(20e6, 125, 54e6) - 1) / 124) / shown
    assert result["core_inductance_ratio"] == pytest.approx(expected, rel=1e-9)
    assert expected == pytest.approx(debye_real(20e6, 125, 54e6) / debye_real(1e6, 125, 54e6), rel=1e-3)
    assert result["core_reference_frequency_Hz"] == 1e6


def test_the_solver_targets_the_apparent_inductance_with_the_core_at_the_frequency():
    """At 25 MHz µ' of the class is 18 % down: the whole turns chosen are those nearest the target there."""
    data = run_json(*RING, "--material", "nizn-125", "--target", "2uH", "--at", "25MHz")
    result = data["result"]
    omega = 2 * math.pi * 25e6
    ratio = debye_real(25e6, 125, 54e6) / 125
    assert ratio < 0.85

    def apparent(turns):
        own = result["al_H"] * turns**2 * ratio
        return own / (1 - omega**2 * own * result["self_capacitance_F"])

    chosen = result["turns"]
    errors = {n: abs(apparent(n) / 2e-6 - 1) for n in (chosen - 1, chosen, chosen + 1)}
    assert min(errors, key=errors.get) == chosen
    # the low-frequency answer would have been fewer turns
    assert chosen > math.sqrt(2e-6 / result["al_H"])


def test_a_loss_factor_from_a_data_sheet_sets_the_loss_tangent_there():
    """tanδ = (tanδ/µi)·µi (IEC 60401-3's relative loss factor): with --mu alone it is taken flat in frequency."""
    result = run_json(*RING, "--mu", "125", "--loss-factor", "40e-6@1MHz", "--turns", "13", "--at", "7MHz")["result"]
    assert result["core_loss_tangent"] == pytest.approx(40e-6 * 125, rel=1e-12)
    assert result["core_inductance_ratio"] == 1.0  # no class: no drift known


def test_a_loss_factor_with_a_class_scales_the_class_curve_through_it():
    """With --material the user's point replaces the class's level and keeps its rise with frequency."""
    at_point = run_json(*RING, "--material", "nizn-125", "--loss-factor", "50ppm@1MHz", "--turns", "13",
                        "--at", "1MHz")["result"]
    assert at_point["core_loss_tangent"] == pytest.approx(50e-6 * 125, rel=1e-12)
    higher = run_json(*RING, "--material", "nizn-125", "--loss-factor", "50ppm@1MHz", "--turns", "13",
                      "--at", "10MHz")["result"]
    plain_1, plain_10 = (run_json(*RING, "--material", "nizn-125", "--turns", "13", "--at", at)["result"]
                         for at in ("1MHz", "10MHz"))
    assert higher["core_loss_tangent"] / at_point["core_loss_tangent"] == pytest.approx(
        plain_10["core_loss_tangent"] / plain_1["core_loss_tangent"], rel=1e-12)


def test_an_unknown_core_says_its_loss_is_not_estimated():
    """--mu alone, at --at: copper Q only, no core fields, and the text says how to get the core's loss."""
    result = run_json(*RING, "--mu", "125", "--turns", "13", "--at", "7MHz")["result"]
    assert "core_q" not in result and result["q"] == result["copper_q"]
    text = run(*RING, "--mu", "125", "--turns", "13", "--at", "7MHz").stdout
    assert "not estimated" in text and "--loss-factor" in text


def test_above_the_class_range_warns():
    """A class used above its usual range (materials.csv's frequency_high_Hz) gets a warning that says so."""
    data = run_json(*RING, "--material", "nizn-800", "--turns", "5", "--at", "10MHz")
    assert any("usual range" in text for text in data["warnings"])


@pytest.mark.parametrize("bad", ["40e-6", "40@1MHz", "x@1MHz", "40e-6@1uH", "-4e-5@1MHz"])
def test_bad_loss_factor_is_one_line_naming_the_option(bad):
    outcome = run(*RING, "--mu", "125", "--turns", "13", "--at", "7MHz", "--loss-factor", bad)
    assert outcome.exit_code == 2
    lines = outcome.stderr.strip().splitlines()
    assert len(lines) == 1 and "--loss-factor" in lines[0] and "Traceback" not in outcome.stderr


# --------------------------------------------------------------------------- dilution: gapped cores and rods


def test_gapped_core_loss_is_diluted_as_the_complex_series_reluctance_gives():
    """1/µe = 1/µ + lg/le with complex µ: Re Z of the gapped core matches the diluted loss to first order."""
    data = run_json(*CORE, "--gap", "0.5mm", "--material", "mnzn-power", "--turns", "90", "--at", "300kHz")
    result = data["result"]
    f, n = 3e5, 90
    mu = debye_real(f, 2300, 4.0e6) * (1 - 1j * result["core_loss_tangent"])
    mu_e = 1 / (1 / mu + 0.5e-3 / 45e-3)
    impedance = 1j * 2 * math.pi * f * mu_0 * mu_e * n**2 * 50e-6 / 45e-3
    assert result["core_loss_resistance_ohm"] == pytest.approx(impedance.real, rel=2e-3)
    # the dilution is µe/µ (IEC 60401-3's tanδ_e = (tanδ/µi)·µe)
    assert result["core_dilution"] == pytest.approx(abs(mu_e) / abs(mu), rel=2e-3)


@pytest.mark.parametrize(("length", "mu"), [("30mm", "40"), ("100mm", "125"), ("200mm", "125"), ("100mm", "800")])
def test_rod_dilution_is_close_to_johnson_and_jasik(length, mu):
    """Johnson & Jasik: R_m = ω(µrod/µ')²µ''µ0FN²A/l, i.e. D = µrod/µ'. Their fixed demagnetising factor is the
    upper bound; the χ-dependent factor of our rod model gives a sensitivity 5 to 20 % lower."""
    args = ["rod", "--rod-length", length, "--rod-diameter", "10mm", "--wire", "0.3mm", "--mu", mu,
            "--loss-factor", "50e-6@1MHz", "--turns", "40", "--at", "1MHz"]
    result = run_json(*args)["result"]
    johnson_jasik = result["rod_permeability"] / float(mu)
    assert 0.78 * johnson_jasik < result["core_dilution"] <= johnson_jasik


def test_a_plot_includes_the_core_loss(tmp_path):
    """The |Z| and Q sweep uses the core's µ' and loss at each frequency: at --at its Q is the terminal Q."""
    from coilplan.apparent import impedance_sweep
    from coilplan.core_frequency import CoreSpectrum, at_frequency
    from coilplan.forms import Toroid
    from coilplan.materials import material_dispersion
    from coilplan.wire import parse_wire

    ring = Toroid(inner_diameter=7.7e-3, outer_diameter=12.7e-3, height=4.8e-3, wire=parse_wire("26awg"), mu_r=125)
    form = at_frequency(ring, CoreSpectrum(mu=125, dispersion=material_dispersion("nizn-125")), 7e6)
    sweep = impedance_sweep(form, 13, centre=7e6, points=2001)
    result = run_json(*RING, "--material", "nizn-125", "--turns", "13", "--at", "7MHz")["result"]
    q_at = np.interp(math.log(7e6), np.log(sweep["frequency_Hz"]), sweep["q"])
    assert q_at == pytest.approx(result["q_terminals"], rel=5e-3)


# --------------------------------------------------------------------------- the loss from a Q reading


def test_a_q_reading_inverts_the_forward_model():
    """Read back the Q the model itself gives at 100 kHz (1/Q = (R_cu + R_core)/ωL): the loss factor found
    from it is the class's, so the answer at 7 MHz is the class-only answer."""
    plain = run_json(*RING, "--material", "nizn-125", "--turns", "13", "--at", "100kHz")["result"]
    reading = f"{plain['q']:.12g}@100kHz"
    inductance = f"{plain['inductance_H'] * plain['core_inductance_ratio'] * 1e6:.12g}uH@13"  # as read at 100 kHz
    found = run_json(*RING, "--material", "nizn-125", "--measured", inductance, "--measured-q", reading,
                     "--meter-freq", "100kHz", "--turns", "13", "--at", "7MHz")["result"]
    expected = run_json(*RING, "--material", "nizn-125", "--turns", "13", "--at", "7MHz")["result"]
    assert found["core_loss_tangent"] == pytest.approx(expected["core_loss_tangent"], rel=1e-6)
    assert "Q reading" in found["core_loss_basis"]


def test_a_q_reading_without_a_class_is_taken_flat():
    """With no class the loss factor from the reading holds at every frequency: tanδ at --at is the one read."""
    result = run_json(*RING, "--measured", "10uH@13", "--measured-q", "90@1MHz", "--turns", "13", "--at", "5MHz")
    core = result["result"]
    omega_l = 2 * math.pi * 1e6 * 10e-6
    copper = run_json(*RING, "--al", f"{10e-6 / 13**2 * 1e9:.12g}nH", "--turns", "13", "--at", "1MHz")["result"]
    tangent_read = 1 / 90 - copper["ac_resistance_ohm"] / omega_l  # D = 1 on a ring
    assert core["core_loss_tangent"] == pytest.approx(tangent_read, rel=1e-6)


def test_a_q_reading_above_the_copper_alone_is_refused_with_a_warning():
    """A Q above what the copper alone allows leaves no core loss to find: the answer says so and leaves it out."""
    data = run_json(*RING, "--measured", "10uH@13", "--measured-q", "90000@1MHz", "--turns", "13", "--at", "5MHz")
    assert "core_q" not in data["result"]
    assert any("too small to tell" in text for text in data["warnings"])


@pytest.mark.parametrize(("extra", "why"), [
    (["--measured-q", "90@1MHz"], "--measured"),
    (["--measured", "10uH@13", "--measured-q", "90@1MHz", "--loss-factor", "4e-5@1MHz"], "not both"),
    (["--measured", "10uH@13", "--measured-q", "0@1MHz"], "0.5"),
    (["--measured", "10uH@13", "--measured-q", "90"], "Q@frequency"),
])
def test_bad_q_reading_is_one_line(extra, why):
    outcome = run(*RING, "--mu", "125", "--turns", "13", "--at", "5MHz", *extra) if "--measured" not in extra \
        else run(*RING, "--turns", "13", "--at", "5MHz", *extra)
    assert outcome.exit_code == 2, outcome.stdout
    lines = outcome.stderr.strip().splitlines()
    assert len(lines) == 1 and "--measured-q" in lines[0] and why in lines[0]
