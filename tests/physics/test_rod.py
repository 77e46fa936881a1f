"""Ferrite-rod physics: demagnetising factors, apparent permeability and a coil on a rod."""

import math
import warnings

import mp_reference as ref
import mpmath as mp
import numpy as np
import pytest
from hypothesis import given, settings
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.physics import rod
from coilplan.physics.solenoid import current_sheet_inductance

INF = math.inf


# ---------------------------------------------------------------- independent mpmath references


def mp_spheroid(m, dps=40):
    """Osborn 1945 / Stoner closed form of the prolate spheroid's axial factor, in mpmath (docs/methods.md §9)."""
    with mp.workdps(dps):
        m = mp.mpf(m)
        root = mp.sqrt(m * m - 1)
        return (m / root * mp.log(m + root) - 1) / (m * m - 1)


def mp_maxwell(a, b, z):
    """Maxwell's mutual inductance of coaxial circles, textbook elliptic form, per µ0 (docs/methods.md §5)."""
    with mp.workdps(max(mp.mp.dps, 40)):  # k² = 1 − O(z²): keep it off 1 at the nodes near z = 0
        z = max(z, mp.mpf("1e-15"))  # the log singularity of a = b; [0, 1e-15] adds ~1e-14 relative
        k2 = 4 * a * b / ((a + b) ** 2 + z * z)
        k = mp.sqrt(k2)
        return mp.sqrt(a * b) * ((2 / k - k) * mp.ellipk(k2) - 2 / k * mp.ellipe(k2))


def mp_midplane_flux_factor(gamma, dps=20):
    """N_f at χ = 0 by direct quadrature: 1 − (midplane flux of the equivalent current sheet)/(µ0 M A).

    A uniformly magnetised cylinder has the B field of a current sheet K = M on its side; its flux
    through the midplane disc is ∫ M_Maxwell(a, a, z) K dz over the sheet (reciprocity), and
    N_f = −<H>/M = 1 − <B>/(µ0 M). Independent of the module's closed form and of its slice model.
    """
    with mp.workdps(dps):
        a = mp.mpf(1) / 2
        half = mp.mpf(gamma) / 2
        flux = 2 * mp.quad(lambda z: mp_maxwell(a, a, z), [0, a / 100, a, half])
        return 1 - flux / (mp.pi * a * a)


# ---------------------------------------------------------------- spheroid (for comparison only)

# docs/methods.md §9, (b) values of the closed form; re-derived here with mpmath before use.
SPHEROID_B = [
    pytest.param(2.0, 0.17356400, id="m=2"),
    pytest.param(5.0, 0.05582097, id="m=5"),
    pytest.param(10.0, 0.02028588, id="m=10"),
    pytest.param(20.0, 0.00674905, id="m=20"),
]


@pytest.mark.parametrize(("m", "listed"), SPHEROID_B)
def test_spheroid_matches_references_values_via_mpmath(m, listed):
    """The closed form (Osborn 1945), evaluated in mpmath, gives docs/methods.md §9b's eight decimals; so do we."""
    exact = float(mp_spheroid(m))
    assert abs(exact - listed) <= 0.6e-8  # docs/methods.md §9b prints 8 decimals
    assert abs(float(rod.spheroid_demagnetising_factor(m)) / exact - 1) < 1e-13


def test_spheroid_against_mpmath_over_a_wide_range():
    """Prolate branch and its series near the sphere agree with the mpmath closed form to 1e-13."""
    for m in [1.0001, 1.005, 1.05, 1.3, 3.0, 30.0, 300.0, 3e4]:
        assert abs(float(rod.spheroid_demagnetising_factor(m)) / float(mp_spheroid(m)) - 1) < 1e-13, m


def test_spheroid_asymptote():
    """For long spheroids N → (ln 2m − 1)/m², the gap being below ln(m)/m² relative (Osborn 1945 expansion)."""
    for m in [10.0, 100.0, 1e3, 1e4]:
        asymptote = (math.log(2 * m) - 1) / m**2
        gap = abs(float(rod.spheroid_demagnetising_factor(m)) / asymptote - 1)
        assert gap < math.log(m) / m**2, m


def test_spheroid_special_shapes():
    """Sphere 1/3, flat disc 1, needle 0, oblate continuous through the sphere; NaN for negative (exact values)."""
    values = rod.spheroid_demagnetising_factor(np.array([1.0, 0.0, INF, -1.0, np.nan]))
    assert values[0] == pytest.approx(1 / 3, rel=1e-15, abs=0)
    assert values[1] == 1.0 and values[2] == 0.0
    assert np.isnan(values[3:]).all()
    # oblate closed form (Osborn 1945), m = 0.5: [1 − m/sqrt(1 − m²) · arccos m]/(1 − m²)
    m = 0.5
    oblate = (1 - m / math.sqrt(1 - m * m) * math.acos(m)) / (1 - m * m)
    assert float(rod.spheroid_demagnetising_factor(m)) == pytest.approx(oblate, rel=1e-13, abs=0)
    near = rod.spheroid_demagnetising_factor(np.array([0.999, 1.0, 1.001]))
    assert near[0] > near[1] > near[2]


# ---------------------------------------------------------------- cylinder at χ = 0 (exact)


@pytest.mark.parametrize("gamma", [0.5, 1.0, 2.0, 5.0, 10.0, 20.0, 30.0])
def test_magnetometric_factor_at_zero_susceptibility_is_one_minus_nagaoka(gamma):
    """N_m(χ = 0) = 1 − K_L(d/l) exactly (Chen et al. 1991; docs/methods.md §1, §9), K_L from mpmath."""
    exact = float(1 - ref.nagaoka(1 / gamma))
    with warnings.catch_warnings():
        warnings.simplefilter("ignore", OutsideValidityWarning)  # γ < 2 warns only for χ > 0; none here
        ours = float(rod.cylinder_demagnetising_factor(gamma, 0.0, "magnetometric"))
    assert abs(ours / exact - 1) < 1e-11  # rounding in the slice sums, ~1e-12 at γ = 30


# docs/methods.md §9, χ = 0 N_f column, (b); recomputed here by mpmath quadrature before use.
FLUXMETRIC_ZERO_CHI_B = [
    pytest.param(1.0, 0.2322108, id="gamma=1"),
    pytest.param(2.0, 0.0935061, id="gamma=2"),
    pytest.param(5.0, 0.0188912, id="gamma=5"),
    pytest.param(10.0, 0.00492653, id="gamma=10"),
    pytest.param(20.0, 0.00124534, id="gamma=20"),
]


@pytest.mark.parametrize(("gamma", "listed"), FLUXMETRIC_ZERO_CHI_B)
def test_fluxmetric_factor_at_zero_susceptibility(gamma, listed):
    """N_f(χ = 0) equals the midplane flux of the equivalent current sheet, by mpmath quadrature (derived here)."""
    exact = float(mp_midplane_flux_factor(gamma))
    assert abs(exact - listed) <= 0.6 * 10 ** (math.floor(math.log10(listed)) - 5)  # docs/methods.md §9c: 6 digits
    # stated accuracy: the midplane is averaged over the two central slices, Richardson-extrapolated
    assert abs(float(rod.cylinder_demagnetising_factor(gamma, 0.0)) / exact - 1) < 2e-7


@pytest.mark.parametrize("gamma", [5.0, 10.0, 20.0, 50.0])
def test_fluxmetric_factor_is_not_the_on_axis_value(gamma):
    """The centre-point value 1 − l/sqrt(l² + d²) (derived here) lies above N_f, within 1/γ² relative."""
    on_axis = 1 - gamma / math.hypot(gamma, 1.0)
    ours = float(rod.cylinder_demagnetising_factor(gamma, 0.0))
    assert ours < on_axis
    assert on_axis / ours - 1 < 1 / gamma**2


# ---------------------------------------------------------------- cylinder at finite χ

# docs/methods.md §9: a 1-D integral-equation model of the kind Chen et al. 1991 use for γ >= 10,
# computed there (b) and printed to 5 significant digits. Ours is the same kind of model with its own
# discretisation (converged to ~1e-5), so agreement is expected to the table's rounding plus a
# discretisation difference: 2e-4 relative.
FINITE_CHI_B = [
    pytest.param(10.0, 124.0, 0.016182, 0.023463, id="gamma=10,chi=124"),
    pytest.param(10.0, 1999.0, 0.017124, 0.022804, id="gamma=10,chi=1999"),
    pytest.param(10.0, INF, 0.017191, 0.022758, id="gamma=10,chi=inf"),
    pytest.param(20.0, 124.0, 0.0049359, 0.0088987, id="gamma=20,chi=124"),
    pytest.param(20.0, 1999.0, 0.0058330, 0.0081226, id="gamma=20,chi=1999"),
    pytest.param(20.0, INF, 0.0059038, 0.0080646, id="gamma=20,chi=inf"),
]


@pytest.mark.parametrize(("gamma", "chi", "flux", "magnet"), FINITE_CHI_B)
def test_finite_susceptibility_against_the_one_dimensional_table(gamma, chi, flux, magnet):
    """N_f and N_m at finite χ agree with docs/methods.md §9's 1-D model computation to 2e-4 relative."""
    assert float(rod.cylinder_demagnetising_factor(gamma, chi, "fluxmetric")) == pytest.approx(flux, rel=2e-4, abs=0)
    ours = float(rod.cylinder_demagnetising_factor(gamma, chi, "magnetometric"))
    assert ours == pytest.approx(magnet, rel=2e-4, abs=0)


def test_high_permeability_rod_against_bozorth():
    """χ → ∞, γ = 10: N_f ≈ 0.0172 (Bozorth & Chapin 1942, value from memory, 3 figures)."""
    assert abs(float(rod.cylinder_demagnetising_factor(10.0, INF)) - 0.0172) < 1e-4


def test_cylinder_differs_from_ellipsoid_as_references_state():
    """γ = 10, μi = 2000: μ_rod is 56.8 with the cylinder's N_f and 48.1 with the ellipsoid's (docs/methods.md §9)."""
    assert float(rod.rod_permeability(2000.0, 10.0)) == pytest.approx(56.8, abs=0.05)
    ellipsoid = 2000.0 / (1 + float(rod.spheroid_demagnetising_factor(10.0)) * 1999.0)
    assert ellipsoid == pytest.approx(48.1, abs=0.05)


def test_discretisation_is_converged():
    """The Richardson pair agrees with a four-times finer slice model to 1e-5 (stated accuracy of the model)."""
    for gamma, chi in [(3.0, 50.0), (10.0, 1999.0), (25.0, INF)]:
        fine = (4 * np.array(rod._demag_factors(gamma, chi, 128 * int(gamma)))
                - np.array(rod._demag_factors(gamma, chi, 64 * int(gamma)))) / 3
        ours = [float(rod.cylinder_demagnetising_factor(gamma, chi, kind)) for kind in ("fluxmetric", "magnetometric")]
        assert np.allclose(ours, fine, rtol=1e-5, atol=0)


@settings(max_examples=25)
@given(st.floats(2.0, 30.0), st.floats(0.0, 1e4))
def test_factor_falls_with_length(gamma, chi):
    """Both factors fall as the rod lengthens at fixed χ, and both lie in (0, 1) (definition)."""
    for kind in ("fluxmetric", "magnetometric"):
        short, longer = rod.cylinder_demagnetising_factor([gamma, gamma * 1.1], chi, kind)
        assert 0 < longer < short < 1


def test_factor_masks_and_kind():
    """γ = inf gives 0, γ = 0 gives 1, NaN or negative inputs give NaN; a bad kind names the option."""
    values = rod.cylinder_demagnetising_factor(np.array([INF, 0.0, np.nan, -1.0, 10.0]),
                                               np.array([5.0, 0.0, 5.0, 5.0, -0.5]))
    assert values[0] == 0.0 and values[1] == 1.0
    assert np.isnan(values[2:]).all()
    with pytest.raises(InvalidInputError, match="kind"):
        rod.cylinder_demagnetising_factor(10.0, 5.0, "ballistic")


def test_short_rod_warns():
    """A rod shorter than 2 diameters at χ > 0 is outside the slice model's assumption (our threshold)."""
    with pytest.warns(OutsideValidityWarning, match="l/d"):
        rod.cylinder_demagnetising_factor(1.0, 100.0)


# ---------------------------------------------------------------- apparent permeability


def test_rod_permeability_limits():
    """μi = 1 gives 1; a very long rod gives μi; μi → ∞ gives 1/N_f (the defining relation, docs/methods.md §9)."""
    assert float(rod.rod_permeability(1.0, 10.0)) == 1.0
    assert float(rod.rod_permeability(10.0, 1000.0)) == pytest.approx(10.0, rel=1e-4, abs=0)
    assert float(rod.rod_permeability(INF, 10.0)) == pytest.approx(
        1 / float(rod.cylinder_demagnetising_factor(10.0, INF)), rel=1e-14)
    assert np.isnan(rod.rod_permeability(0.5, 10.0))


def test_rod_permeability_rises_with_mu_and_length():
    """μ_rod rises with μi at fixed γ and with γ at fixed μi, and never exceeds μi (definition)."""
    mu = np.array([1.5, 10.0, 125.0, 800.0, 5000.0])
    for gamma in (3.0, 10.0, 25.0):
        values = rod.rod_permeability(mu, gamma)
        assert np.all(np.diff(values) > 0) and np.all(values < mu)
    values = rod.rod_permeability(250.0, np.array([3.0, 6.0, 12.0, 24.0]), "magnetometric")
    assert np.all(np.diff(values) > 0)


# ---------------------------------------------------------------- coil on a rod


def test_pair_integral_reproduces_nagaoka():
    """For equal radii, 2F(t) is the current sheet's L/n² = µ0 π a² t K_L(2a/t) (Lorenz/Nagaoka, exact)."""
    t = np.array([0.01, 0.3, 1.0, 10.0, 300.0])
    sheet = current_sheet_inductance(1.0, t, 1.0) * t * t
    assert np.allclose(2 * rod._pair_integral(t, 0.5, 0.5), sheet, rtol=1e-10, atol=0)


def test_pair_integral_unequal_radii_against_mpmath():
    """For a coil larger than the rod, F(u) agrees with an mpmath double integral of Maxwell's formula."""
    with mp.workdps(20):
        exact = float(mp_mu0() * mp.quad(lambda v: (2 - v) * mp_maxwell(mp.mpf("0.8"), mp.mpf("0.5"), v), [0, 0.5, 2]))
    assert float(rod._pair_integral(np.array([2.0]), 0.8, 0.5)[0]) == pytest.approx(exact, rel=1e-10, abs=0)


def mp_mu0():
    """µ0 as scipy has it, so the comparison is of the integral only."""
    return mp.mpf(mu_0)


@pytest.mark.parametrize(("coil_length", "coil_diameter", "position"),
                         [(0.02, 0.013, 0.0), (0.2, 0.01, 0.03), (0.005, 0.03, 0.06)])
def test_air_limit(coil_length, coil_diameter, position):
    """μi = 1 gives the air coil: Nagaoka's current sheet of the winding, exactly."""
    air = current_sheet_inductance(coil_diameter, coil_length, 40)
    ours = rod.rod_coil_inductance(40, 0.1, 0.01, 1.0, coil_length, coil_diameter, position)
    assert float(ours) == float(air)


def test_rod_inside_a_much_longer_coil():
    """A rod centred in a coil 100 times longer adds µ0 n² A l χ/(1 + N_m χ) (reciprocity, uniform field).

    The flux linkage of the rod's magnetisation with a coil of uniform field nI is µ0 n ∫ M dV
    (reciprocity), and <M> = χ H0/(1 + N_m χ) by the definition of N_m.
    """
    gamma, mu, c, turns = 10.0, 300.0, 1000.0, 100
    total = rod.rod_coil_inductance(turns, gamma, 1.0, mu, c, 1.2)
    air = current_sheet_inductance(1.2, c, turns)
    chi = mu - 1
    N_m = float(rod.cylinder_demagnetising_factor(gamma, chi, "magnetometric"))
    expected = mu_0 * (turns / c) ** 2 * math.pi / 4 * gamma * chi / (1 + N_m * chi)
    # the finite coil's field over the rod is uniform to O((l/c)²); measured 1e-6
    assert float(total - air) / expected == pytest.approx(1.0, abs=1e-5)


def test_long_coil_on_a_longer_rod_approaches_mu_times_air():
    """A tight coil of length c on a rod 3c long: L → L_air + (μi − 1) µ0 n² A c, the deficit falling as 1/c.

    Exactly: inside a long winding on a long rod, H = nI and the rod carries μi µ0 nI (common practice,
    the long-solenoid limit); the ends lose flux over a length set by μi and d, so the relative
    deficit is O(d/c). Tested with a former 1.2 d (air space included) and μi = 4.
    """
    deficits = []
    for c in (20.0, 40.0):
        n = 100 / c
        total = float(rod.rod_coil_inductance(100, 3 * c, 1.0, 4.0, c, 1.2))
        ideal = float(current_sheet_inductance(1.2, c, 100)) + 3.0 * mu_0 * n * n * math.pi / 4 * c
        deficits.append(1 - total / ideal)
    assert 0 < deficits[1] < deficits[0] < 0.06
    assert 1.7 < deficits[0] / deficits[1] < 2.3


def test_moving_the_coil_toward_an_end_lowers_inductance():
    """L falls steadily as the coil slides from the rod's centre past its end, toward the air value."""
    positions = np.array([0.0, 0.01, 0.02, 0.03, 0.04, 0.05, 0.07, 2.0])
    values = rod.rod_coil_inductance(40, 0.1, 0.01, 125.0, 0.02, 0.013, positions)
    assert np.all(np.diff(values) < 0)
    air = float(current_sheet_inductance(0.013, 0.02, 40))
    assert values[-1] == pytest.approx(air, rel=1e-3, abs=0)  # 2 m away: a dipole coupling of order (d/p)³


def test_coil_longer_than_the_rod():
    """A coil longer than the rod: L/L_air stays above 1 and falls toward 1 as the coil outgrows the rod."""
    lengths = np.array([0.1, 0.2, 0.4, 0.8])
    values = rod.rod_coil_inductance(100, 0.1, 0.01, 125.0, lengths, 0.012)
    ratios = values / current_sheet_inductance(0.012, lengths, 100)
    assert np.all(ratios > 1) and np.all(np.diff(ratios) < 0)


def test_rod_coil_scales_with_size():
    """Scaling every length by 3 scales L by 3 (the current-sheet and slice models are scale free)."""
    one = rod.rod_coil_inductance(30, 0.05, 0.008, 200.0, 0.015, 0.01, 0.01)
    three = rod.rod_coil_inductance(30, 0.15, 0.024, 200.0, 0.045, 0.03, 0.03)
    assert float(three) == pytest.approx(3 * float(one), rel=1e-12, abs=0)


def test_rod_coil_rises_with_mu_and_masks():
    """L rises with μi (common practice) and invalid geometry gives NaN (documented masks)."""
    values = rod.rod_coil_inductance(40, 0.1, 0.01, np.array([1.0, 20.0, 125.0, 2000.0]), 0.02, 0.013)
    assert np.all(np.diff(values) > 0)
    bad = rod.rod_coil_inductance(40, 0.1, 0.01, np.array([125.0, 0.5, 125.0]), 0.02,
                                  np.array([0.009, 0.013, 0.013]), np.array([0.0, 0.0, np.nan]))
    assert np.isnan(bad).all()
