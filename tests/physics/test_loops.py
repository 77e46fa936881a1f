"""Tests of coilplan.physics.loops: Maxwell's M, round-wire loops, filament sums.

References used below (full entries in the module's docstrings):
Maxwell 1873 (Treatise vol. 2 art. 701), Rosa & Grover 1912 (Bull. Bureau of
Standards 8, formulas (1), (2)), DLMF 19.25.1, Grover 1946, Knight 2010 (the
Rosa/Grover method as set out at g3ynh.info, "Rosa_Km"), and the check values
of docs/methods.md §1, §3 and §5 (marked "computed here" there: computed
from the published formulas; every one is reproduced here with mpmath before
it is compared).
"""

import math
import warnings

import mpmath
import numpy as np
import pytest
from hypothesis import assume, given, settings
from hypothesis import strategies as st
from scipy.constants import mu_0

from coilplan.errors import OutsideValidityWarning
from coilplan.physics import loops
from coilplan.physics.loops import (
    coaxial_filaments_inductance,
    coaxial_mutual_inductance,
    loop_self_inductance,
    loop_self_inductance_gmd,
    solenoid_filament_inductance,
)

#: The rounded mu0 (4 pi 1e-7 H/m) of the check values in docs/methods.md §1, §3 and §5.
MU0_REFERENCES = 4 * mpmath.pi * mpmath.mpf(10) ** -7


# ------------------------------------------------------------ mpmath references


def maxwell_textbook(a, b, z, mu0=mu_0):
    """Maxwell's M in the textbook form (Rosa & Grover 1912, formulas (1), (2)).

    mpmath's ellipk/ellipe take the parameter m = k^2. Call inside a workdps block.
    """
    a, b, z = mpmath.mpf(a), mpmath.mpf(b), mpmath.mpf(z)
    m = 4 * a * b / ((a + b) ** 2 + z**2)
    k = mpmath.sqrt(m)
    return mpmath.mpf(mu0) * mpmath.sqrt(a * b) * (
        (2 / k - k) * mpmath.ellipk(m) - (2 / k) * mpmath.ellipe(m)
    )


def neumann_reduced(a, b, z, mu0):
    """Neumann's integral mu0/(4 pi) oint oint dl.dl'/r for coaxial circles.

    dl.dl' = a b cos(phi - phi') dphi dphi'; the integrand depends on phi - phi'
    only, so one of the two integrations gives exactly 2 pi and
    M = (mu0 a b / 2) int_0^{2 pi} cos psi / sqrt(a^2 + b^2 + z^2 - 2ab cos psi) dpsi,
    evaluated over [0, pi] (even integrand) with breakpoints that resolve the
    peak at psi = 0 for close circles.
    """
    a, b, z = mpmath.mpf(a), mpmath.mpf(b), mpmath.mpf(z)

    def integrand(psi):
        return mpmath.cos(psi) / mpmath.sqrt(a * a + b * b + z * z - 2 * a * b * mpmath.cos(psi))

    gap = (mpmath.sqrt((a - b) ** 2 + z * z)) / max(a, b)
    points = [0, gap / 10, gap, 10 * gap, mpmath.pi / 2, mpmath.pi]
    points = sorted(set(p for p in points if p <= mpmath.pi))
    return mpmath.mpf(mu0) * a * b * mpmath.quad(integrand, points)


def nagaoka_coefficient_mp(diameter_over_length):
    """Nagaoka's K_L for a current sheet, docs/methods.md §1 (Nagaoka 1909)."""
    x = mpmath.mpf(diameter_over_length)
    m = x**2 / (1 + x**2)  # k^2 = D^2/(D^2 + l^2)
    k = mpmath.sqrt(m)
    kp2 = 1 - m
    kp = mpmath.sqrt(kp2)
    big_k, big_e = mpmath.ellipk(m), mpmath.ellipe(m)
    return 4 / (3 * mpmath.pi * kp) * ((kp2 / m) * (big_k - big_e) + big_e - k)


def rosa_ks_mp(pitch, wire_diameter):
    """Rosa's ks (Grover's G) = 5/4 - ln(2p/d), docs/methods.md §3."""
    return mpmath.mpf(5) / 4 - mpmath.log(2 * mpmath.mpf(pitch) / mpmath.mpf(wire_diameter))


def rosa_km_mp(turns):
    """Rosa's km (Grover's H) from the strip-GMD form of docs/methods.md §3.

    eps_k = ln(k p) - ln g_k with ln g_k - ln p = [(k+1)^2 ln(k+1) + (k-1)^2 ln(k-1)
    - 2 k^2 ln k]/2 - 3/2; p cancels, so it is left out.
    """

    def eps(k):
        k = mpmath.mpf(k)
        lower = (k - 1) ** 2 * mpmath.log(k - 1) if k > 1 else 0
        ln_g = ((k + 1) ** 2 * mpmath.log(k + 1) + lower - 2 * k**2 * mpmath.log(k)) / 2 - 1.5
        return mpmath.log(k) - ln_g

    n = turns
    return 2 / mpmath.mpf(n) * mpmath.fsum((n - k) * eps(k) for k in range(1, n))


def solenoid_sum_mp(diameter, pitch, wire_diameter, turns, self_term, mu0=mu_0):
    """N L_self + 2 sum (N-k) M(a, a, k p) in mpmath, textbook Maxwell form."""
    a = mpmath.mpf(diameter) / 2
    rho = mpmath.mpf(wire_diameter) / 2
    if self_term == "thin_ring":
        l_self = mpmath.mpf(mu0) * a * (mpmath.log(8 * a / rho) - mpmath.mpf(7) / 4)
    else:  # "gmd": M(a, a, rho e^{-1/4})
        l_self = maxwell_textbook(a, a, rho * mpmath.exp(-0.25), mu0)
    mutual = mpmath.fsum(
        (turns - k) * maxwell_textbook(a, a, k * mpmath.mpf(pitch), mu0) for k in range(1, turns)
    )
    return turns * l_self + 2 * mutual


def rel(x, ref):
    return abs(float((mpmath.mpf(x) - ref) / ref))


# ------------------------------------------------------------------- API


def test_all_is_sorted_and_public():
    """The module's __all__ is sorted and names exactly its public functions."""
    assert list(loops.__all__) == sorted(loops.__all__)
    assert set(loops.__all__) == {
        "coaxial_filaments_inductance",
        "coaxial_mutual_inductance",
        "loop_self_inductance",
        "loop_self_inductance_gmd",
        "solenoid_filament_inductance",
    }


# ----------------------------------------------------- Maxwell: accuracy


def _log_uniform(lo_exp, hi_exp):
    return st.floats(lo_exp, hi_exp).map(lambda e: 10.0**e)


@st.composite
def coaxial_geometries(draw):
    """(a, b, z): radii 1e-4..10 m, b/a 1e-3..1e3, z = 0 (a != b) or 1e-6 a..100 a,
    with a dedicated branch for nearly touching circles (a ~ b, z ~ 1e-6 a)."""
    a = draw(_log_uniform(-4, 1))
    kind = draw(st.sampled_from(["wide", "near_equal", "touching"]))
    if kind == "wide":
        b = a * draw(_log_uniform(-3, 3))
        z = draw(st.one_of(st.just(0.0), _log_uniform(-6, 2))) * a
    elif kind == "near_equal":
        sign = draw(st.sampled_from([-1.0, 1.0]))
        b = a * (1.0 + sign * draw(_log_uniform(-12, -3)))
        z = draw(st.one_of(st.just(0.0), _log_uniform(-6, 2))) * a
    else:
        b = a * (1.0 + draw(st.sampled_from([0.0, 1e-9, -1e-7, 1e-5])))
        z = a * draw(_log_uniform(-7, -5))
    assume(not (z == 0.0 and a == b))
    return a, b, z


@settings(max_examples=200, deadline=None)
@given(coaxial_geometries())
def test_maxwell_matches_textbook_form_in_mpmath(geometry):
    """The stable Landen/Carlson form equals the textbook form at 40 digits to 1e-13.

    Reference: Maxwell 1873 art. 701 / Rosa & Grover 1912 formulas (1), (2), in
    mpmath (its ellipk/ellipe take m = k^2) at 40 digits beyond those the
    textbook form loses: about -log10(1 - k^2) for close circles (m = k^2 itself
    must resolve 1 - k^2) and -log10(k^2) for distant ones. The bound: about
    twenty roundings and scipy's elliprd (a few ulp); the worst seen over 6000
    drawn geometries was 1.1e-15, so 1e-13 leaves a margin of about 100.
    """
    a, b, z = geometry
    k_squared = 4 * a * b / ((a + b) ** 2 + z**2)
    k_prime_squared = (math.hypot(a - b, z) / math.hypot(a + b, z)) ** 2
    lost = max(0.0, -math.log10(k_squared), -math.log10(k_prime_squared))
    with mpmath.workdps(40 + math.ceil(lost)):
        ref = maxwell_textbook(a, b, z)
        assert rel(coaxial_mutual_inductance(a, b, z), ref) < 1e-13


@pytest.mark.parametrize(
    ("a", "b", "z", "printed_nH"),
    [
        # docs/methods.md §5c, computed there: Maxwell's M, whose every printed digit a direct
        # Neumann double integral reproduces (computed with mu0 = 4 pi 1e-7).
        pytest.param(0.1, 0.1, 0.1, "49.40784631", id="equal-100mm-z100mm"),
        pytest.param(0.1, 0.05, 0.02, "50.22804434", id="100-50mm-z20mm"),
        pytest.param(0.05, 0.05, 0.001, "250.8177766", id="near-touching-50mm-z1mm"),
        pytest.param(0.2, 0.1, 0.0, "109.7235895", id="coplanar-200-100mm"),
        pytest.param(0.01, 0.01, 0.05, "0.1410599422", id="small-far-10mm-z50mm"),
    ],
)
def test_maxwell_check_values_by_neumann_integral(a, b, z, printed_nH):
    """Neumann's integral (mpmath.quad) reproduces each printed check value, and M matches it."""
    with mpmath.workdps(25):
        neumann_ref = neumann_reduced(a, b, z, MU0_REFERENCES)
        # the printed value is Neumann's integral rounded to its last digit
        digits = len(printed_nH.split(".")[1])
        half_unit = 0.5 * 10.0**-digits
        assert abs(float(neumann_ref * 1e9) - float(printed_nH)) <= half_unit * 1.0001
        # our M uses scipy's (CODATA) mu_0: rescale the reference to the same constant
        neumann_codata = neumann_ref * mpmath.mpf(mu_0) / MU0_REFERENCES
        assert rel(coaxial_mutual_inductance(a, b, z), neumann_codata) < 1e-13


def test_maxwell_against_unreduced_neumann_double_integral():
    """A genuine two-dimensional mpmath.quad of Neumann's double integral gives M to 1e-12.

    Reference: F. E. Neumann's formula M = mu0/(4 pi) oint oint dl.dl'/r (textbook
    result), integrated over both angles without the symmetry reduction; the
    geometry is the first check value of docs/methods.md §5c.
    """
    a, b, z = 0.1, 0.1, 0.1
    with mpmath.workdps(15):

        def integrand(phi, phi_prime):
            c = mpmath.cos(phi - phi_prime)
            return a * b * c / mpmath.sqrt(a * a + b * b + z * z - 2 * a * b * c)

        two_pi = [0, mpmath.pi, 2 * mpmath.pi]
        ref = mpmath.mpf(mu_0) / (4 * mpmath.pi) * mpmath.quad(integrand, two_pi, two_pi)
        assert rel(coaxial_mutual_inductance(a, b, z), ref) < 1e-12


# ---------------------------------------------------- Maxwell: properties


GEOMETRY_GRID = [
    (a, b, z)
    for a in (1e-3, 0.05, 2.0)
    for b in (1e-3, 0.049, 0.05, 3.0)
    for z in (0.0, 1e-5, 0.01, 0.3, 40.0)
    if not (a == b and z == 0)
]


def test_maxwell_symmetric_in_radii_and_sign_of_separation():
    """M(a, b, z) = M(b, a, z) = M(a, b, -z) (reciprocity; textbook result)."""
    a, b, z = (np.array(col) for col in zip(*GEOMETRY_GRID, strict=True))
    m = coaxial_mutual_inductance(a, b, z)
    np.testing.assert_allclose(coaxial_mutual_inductance(b, a, z), m, rtol=1e-15)
    np.testing.assert_array_equal(coaxial_mutual_inductance(a, b, -z), m)


@pytest.mark.parametrize(("a", "b"), [(0.05, 0.05), (0.05, 0.02), (0.001, 2.0)])
def test_maxwell_decreases_with_separation(a, b):
    """M never rises as |z| grows, and falls strictly once the change is above rounding.

    Textbook result (the flux of one circle through the other). For z far below the
    gap |a - b| the relative change, of order (z/b)^2, is below one ulp.
    """
    z = np.concatenate([[0.0 if a != b else 1e-9], np.geomspace(1e-8, 1e3, 400)])
    m = coaxial_mutual_inductance(a, b, z)
    assert np.all(np.diff(m) <= 0)
    resolved = z[1:] > 1e-3 * max(a, b)
    assert np.all(np.diff(m)[resolved] < 0)
    assert np.all(m > 0)


@pytest.mark.parametrize(("a", "b"), [(0.05, 0.05), (0.05, 0.01), (0.003, 0.02)])
def test_maxwell_far_field_is_dipole_dipole(a, b):
    """For z >> a, b, M -> mu0 pi a^2 b^2 / (2 z^3), the coupling of two magnetic dipoles.

    Textbook result: the on-axis field of a dipole m = I pi a^2 is mu0 m/(2 pi z^3),
    its flux through the far circle is that times pi b^2. The first correction,
    -3(a^2 + b^2)/(2 z^2), comes from expanding (a^2 + b^2 + z^2)^(-3/2) (derived
    here); the test checks the relative deviation against it to 2 %.
    """
    z = np.array([30.0, 100.0, 1000.0]) * max(a, b)
    dipole = mu_0 * math.pi * a**2 * b**2 / (2 * z**3)
    deviation = coaxial_mutual_inductance(a, b, z) / dipole - 1
    first_correction = -1.5 * (a**2 + b**2) / z**2
    np.testing.assert_allclose(deviation, first_correction, rtol=0.02)


def test_maxwell_scales_with_length():
    """Scaling every length by s scales M by s (an air-core inductance is a length times mu0)."""
    a, b, z = (np.array(col) for col in zip(*GEOMETRY_GRID, strict=True))
    for s in (3.7, 1e-3, 250.0):
        np.testing.assert_allclose(
            coaxial_mutual_inductance(s * a, s * b, s * z),
            s * coaxial_mutual_inductance(a, b, z),
            rtol=1e-14,
        )


def test_maxwell_masks_and_nan_transparency():
    """Coincident circles give +inf, a zero radius or infinite distance 0, NaN passes through."""
    m = coaxial_mutual_inductance(
        [0.1, 0.0, 0.1, 0.1, np.nan, 0.1, -0.1], [0.1, 0.1, 0.0, 0.1, 0.1, 0.1, 0.1],
        [0.0, 0.0, 0.2, np.inf, 0.1, np.nan, 0.1],
    )
    assert m[0] == np.inf
    assert m[1] == 0.0 and m[2] == 0.0 and m[3] == 0.0
    assert np.isnan(m[4:]).all()


def test_maxwell_broadcasts_and_returns_scalars_for_scalars():
    """Arguments broadcast against each other; scalar inputs give a scalar."""
    a = np.array([0.01, 0.02, 0.03])[:, None]
    z = np.array([0.0, 0.005])[None, :]
    m = coaxial_mutual_inductance(a, 0.025, z)
    assert m.shape == (3, 2)
    assert m[1, 0] == coaxial_mutual_inductance(0.02, 0.025, 0.0)
    assert np.ndim(coaxial_mutual_inductance(0.1, 0.1, 0.1)) == 0


# ------------------------------------------------------------------ loops


@pytest.mark.parametrize(
    ("R", "rho", "printed_lf_nH", "printed_hf_nH", "printed_gmd_nH"),
    [
        # docs/methods.md §5, computed there: thin-ring formula (Rosa & Grover 1912)
        # and the GMD method M(R, R, rho e^-1/4) (Grover 1946).
        pytest.param(0.05, 0.0005, "310.050799", "294.342836", "310.0555", id="R50mm-a0.5mm"),
        pytest.param(0.1, 0.001, "620.1016", "588.6857", None, id="R100mm-a1mm"),
        pytest.param(0.01, 0.0005, "41.7854", None, "41.8032", id="R10mm-a0.5mm"),
    ],
)
def test_loop_check_values(R, rho, printed_lf_nH, printed_hf_nH, printed_gmd_nH):
    """The thin-ring and GMD loop inductances match mpmath and the printed check values."""

    def check(got, formula, printed):
        # printed values use mu0 = 4 pi 1e-7; our functions use scipy's mu_0
        if printed is not None:
            digits = len(printed.split(".")[1])
            assert abs(float(formula(MU0_REFERENCES)) * 1e9 - float(printed)) <= (
                0.5001 * 10.0**-digits
            )
        assert rel(got, formula(mpmath.mpf(mu_0))) < 1e-13

    with mpmath.workdps(30):
        Rm, rhom = mpmath.mpf(R), mpmath.mpf(rho)
        ln = mpmath.log(8 * Rm / rhom)
        check(loop_self_inductance(R, rho), lambda mu: mu * Rm * (ln - mpmath.mpf(7) / 4),
              printed_lf_nH)
        check(loop_self_inductance(R, rho, high_frequency=True), lambda mu: mu * Rm * (ln - 2),
              printed_hf_nH)
        check(loop_self_inductance_gmd(R, rho),
              lambda mu: maxwell_textbook(Rm, Rm, rhom * mpmath.exp(-0.25), mu), printed_gmd_nH)


def test_loop_formula_and_gmd_method_agree_to_order_ratio_squared():
    """Thin-ring and GMD self-inductances differ by O((rho/R)^2): the gap falls ~100x per 10x."""
    R = 0.05
    rho = R * np.array([1e-2, 1e-3])
    gap = np.abs(loop_self_inductance_gmd(R, rho) / loop_self_inductance(R, rho) - 1)
    assert gap[0] < 3e-5  # docs/methods.md §5b: 1.5e-5 at R/rho = 100
    assert gap[1] < gap[0] / 50


@pytest.mark.parametrize("function", [loop_self_inductance, loop_self_inductance_gmd])
def test_loop_thick_wire_warns_and_masks(function):
    """rho/R above 0.2 warns (pointing at the caller); rho >= R returns NaN."""
    with pytest.warns(OutsideValidityWarning, match="below 0.2") as record:
        L = function(0.01, np.array([0.001, 0.003, 0.01, 0.02]))
    assert record[0].filename == __file__
    assert np.isfinite(L[:2]).all() and L[0] > L[1] > 0
    assert np.isnan(L[2:]).all()


def test_loop_thin_wire_does_not_warn_and_is_nan_transparent():
    """A thin wire raises no warning (filterwarnings=error); NaN and bad radii give NaN."""
    L = loop_self_inductance(np.array([0.05, np.nan, 0.05, -0.05]),
                             np.array([0.0005, 0.0005, -0.001, 0.001]))
    assert np.isfinite(L[0])
    assert np.isnan(L[1:]).all()


# ------------------------------------------------------- filament sums


def test_filaments_equal_direct_double_loop():
    """The vectorised, chunked sum equals a plain double loop over pairs of turns."""
    rng = np.random.default_rng(20240611)
    n = 17
    r = rng.uniform(0.005, 0.04, n)
    z = rng.uniform(-0.02, 0.02, n)
    rho = rng.uniform(1e-4, 5e-4, n)
    direct = 0.0
    for i in range(n):
        direct += float(loop_self_inductance(r[i], rho[i]))
        for j in range(n):
            if i != j:
                direct += float(coaxial_mutual_inductance(r[i], r[j], z[i] - z[j]))
    assert coaxial_filaments_inductance(r, z, rho) == pytest.approx(direct, rel=1e-13, abs=0)


def test_filaments_chunk_size_does_not_change_the_result():
    """Blocks of one element, one row, a few rows or the whole matrix give the same sum."""
    rng = np.random.default_rng(7)
    n = 300
    r = rng.uniform(0.01, 0.03, n)
    z = rng.uniform(0.0, 0.05, n)
    results = [
        coaxial_filaments_inductance(r, z, 2e-4, max_block_bytes=size)
        for size in (8, 8 * n, 8 * 5 * n, 8 * n * n)
    ]
    np.testing.assert_allclose(results, results[-1], rtol=1e-13)


def test_filaments_inputs():
    """Shapes are checked with a clear ValueError; no turns give 0; one turn is its own loop."""
    with pytest.raises(ValueError, match="same length"):
        coaxial_filaments_inductance([0.01, 0.02], [0.0], 1e-4)
    with pytest.raises(ValueError, match="wire_radius must be a scalar or have shape"):
        coaxial_filaments_inductance([0.01, 0.02], [0.0, 0.01], [1e-4, 1e-4, 1e-4])
    assert coaxial_filaments_inductance([], [], 1e-4) == 0.0
    assert coaxial_filaments_inductance([0.05], [0.3], 5e-4) == loop_self_inductance(0.05, 5e-4)
    assert coaxial_filaments_inductance([0.05, 0.05], [0.0, 0.0], 5e-4) == np.inf
    assert np.isnan(coaxial_filaments_inductance([0.05, np.nan], [0.0, 0.01], 5e-4))


def test_filaments_thick_wire_warns_at_the_caller():
    """A wire radius above 0.2 of its turn's radius warns, attributed to this file."""
    with pytest.warns(OutsideValidityWarning) as record:
        coaxial_filaments_inductance([0.01, 0.02], [0.0, 0.01], [0.003, 1e-4])
    assert record[0].filename == __file__


def test_solenoid_sum_equals_general_filament_sum():
    """solenoid_filament_inductance equals coaxial_filaments_inductance for the same turns."""
    n, D, p, d = 40, 0.03, 0.0012, 0.0008
    general = coaxial_filaments_inductance(np.full(n, D / 2), p * np.arange(n), d / 2)
    assert solenoid_filament_inductance(D, p, d, n) == pytest.approx(general, rel=1e-12, abs=0)


def test_solenoid_sum_matches_mpmath_sum():
    """The O(N) sum equals the same sum in mpmath (textbook Maxwell form, 30 digits)."""
    D, p, d, n = 0.05, 0.002, 0.001, 25
    with mpmath.workdps(30):
        ref = solenoid_sum_mp(D, p, d, n, "thin_ring")
        assert rel(solenoid_filament_inductance(D, p, d, n), ref) < 1e-13


def test_solenoid_worked_example_against_rosa():
    """Rosa's worked example (docs/methods.md §3): filament sum vs corrected Nagaoka.

    Reference values (b), reproduced here first: Maxwell sum with GMD self terms
    21.097955 uH, Rosa-corrected Nagaoka 21.101609 uH (mu0 = 4 pi 1e-7). Knight
    (2010) states the NBS (Rosa/Grover) method is good to "a few parts in 10 000":
    our sum (thin-ring self terms) must be within 3e-4 of Rosa's value.
    """
    D, p, d, n = 0.05, 0.002, 0.001, 25
    r, length = D / 2, n * p
    with mpmath.workdps(30):
        # Rosa's ingredients; first anchor km to Grover's table (his p.150, via
        # Knight's "Table 7#1"): km(10) = 0.2664, km(50) = 0.3182 to 4 places.
        assert abs(float(rosa_km_mp(10)) - 0.2664) < 5e-5
        assert abs(float(rosa_km_mp(50)) - 0.3182) < 5e-5

        def rosa(mu0):
            sheet = mu0 * mpmath.pi * r**2 * n**2 * nagaoka_coefficient_mp(D / length) / length
            return sheet - mu0 * r * n * (rosa_ks_mp(p, d) + rosa_km_mp(n))

        assert abs(float(rosa(MU0_REFERENCES)) * 1e6 - 21.101609) < 5.001e-7
        assert abs(float(solenoid_sum_mp(D, p, d, n, "gmd", MU0_REFERENCES)) * 1e6
                   - 21.097955) < 5.001e-7

        ours = solenoid_filament_inductance(D, p, d, n)
        assert rel(ours, rosa(mpmath.mpf(mu_0))) < 3e-4
        # thin-ring vs GMD self terms: O((rho/r)^2) apart, 1.0e-5 of the total here
        assert rel(ours, solenoid_sum_mp(D, p, d, n, "gmd")) < 2e-5


def test_solenoid_long_coil_limit():
    """A long close-wound coil tends to mu0 N^2 A / l, short by Nagaoka's end effect.

    Long-coil limit: textbook result. End effect: Nagaoka 1909 K_L (docs/methods.md
    §1). The filament sum differs from the current sheet by Rosa's
    round-wire correction, (ks + km) p / (pi r) of mu0 N^2 A / l (docs/methods.md
    §3, with km below its limit ln(2 pi) - 3/2); it bounds the gap to K_L.
    """
    D, p, d = 0.2, 1e-4, 1e-4
    r = D / 2
    ks = 1.25 - math.log(2 * p / d)  # 0.5569 close wound
    km_limit = math.log(2 * math.pi) - 1.5  # 0.3379
    bound = 1.2 * (ks + km_limit) * p / (math.pi * r)
    previous = 0.0
    for n in (20_000, 100_000):
        length = n * p
        long_coil = mu_0 * n**2 * math.pi * r**2 / length
        ratio = solenoid_filament_inductance(D, p, d, n) / long_coil
        with mpmath.workdps(20):
            nagaoka = float(nagaoka_coefficient_mp(D / length))
        assert abs(ratio - nagaoka) < bound
        assert previous < ratio < 1
        previous = ratio
    assert 1 - ratio > 20 * bound  # the end effect itself is well resolved


@pytest.mark.parametrize(("D", "p", "d", "n"), [
    (0.0255, 0.000535, 0.0005, 20_000),  # 25 mm former, 0.5 mm wire: pairs beyond 191 pitches in closed form
    (0.0255, 0.0000129, 0.00001, 100_000),  # fine wire: the switch at 7907 pitches
    (np.array([0.01, 0.05]), 0.001, 0.0005, 5_000),  # geometry broadcast: one switch for both
])
def test_solenoid_far_pairs_in_closed_form_equal_the_term_by_term_sum(monkeypatch, D, p, d, n):
    """Beyond 4 diameters the pairs are summed by the far-field series of Maxwell's formula and Hurwitz
    zeta sums (DLMF 19.5, 25.11); it equals summing Maxwell's formula pair by pair to rounding."""
    fast = solenoid_filament_inductance(D, p, d, n)
    monkeypatch.setattr(loops, "_FAR_START", 1e12)  # every pair term by term
    np.testing.assert_allclose(fast, solenoid_filament_inductance(D, p, d, n), rtol=2e-15)


def test_solenoid_far_pairs_equal_the_general_filament_sum():
    """The closed-form tail against the general pair sum over the same 600 turns (20 diameters long)."""
    n, D, p, d = 600, 0.02, 0.001, 0.0006
    general = coaxial_filaments_inductance(np.full(n, D / 2), p * np.arange(n), d / 2)
    assert solenoid_filament_inductance(D, p, d, n) == pytest.approx(general, rel=1e-13, abs=0)


def test_solenoid_sum_at_ten_million_turns_is_the_long_coil_value():
    """The sum's cost no longer grows with N: ten million turns give the long-coil value µ0 π r² N/p times
    Nagaoka's K_L (docs/methods.md §1) less Rosa's round-wire correction (ks + km)·p/(π r) with km at its
    limit ln(2π) − 3/2 (docs/methods.md §3), without ten million evaluations of Maxwell's formula."""
    D, p, d, n = 0.0255, 0.000535, 0.0005, 10_000_000
    r = D / 2
    long_coil = mu_0 * math.pi * r**2 * n / p
    with mpmath.workdps(20):
        nagaoka = float(nagaoka_coefficient_mp(D / (n * p)))
    rosa = (1.25 - math.log(2 * p / d) + math.log(2 * math.pi) - 1.5) * p / (math.pi * r)
    ratio = solenoid_filament_inductance(D, p, d, n) / long_coil
    assert abs(ratio - (nagaoka - rosa)) < 1e-5


def test_solenoid_broadcasts_over_geometry():
    """Array diameter, pitch and wire diameter give element-wise results of the broadcast shape."""
    D = np.array([0.02, 0.03, 0.05])[:, None]
    p = np.array([0.001, 0.0015])[None, :]
    L = solenoid_filament_inductance(D, p, 0.0008, 12)
    assert L.shape == (3, 2)
    assert L[2, 1] == pytest.approx(solenoid_filament_inductance(0.05, 0.0015, 0.0008, 12),
                                    rel=1e-14)


def test_solenoid_one_turn_is_a_loop():
    """One turn is a single loop of round wire."""
    assert solenoid_filament_inductance(0.1, 0.002, 0.001, 1) == loop_self_inductance(0.05, 5e-4)


@pytest.mark.parametrize("turns", [2.5, 0, -3, True, "ten", float("nan")])
def test_solenoid_rejects_bad_turns(turns):
    """Turns must be a whole number of at least 1: anything else raises ValueError naming it."""
    with pytest.raises(ValueError, match="turns must be a whole number of at least 1"):
        solenoid_filament_inductance(0.05, 0.002, 0.001, turns)


def test_solenoid_accepts_integral_float_turns():
    """25.0 turns is 25 turns."""
    assert solenoid_filament_inductance(0.05, 0.002, 0.001, 25.0) == (
        solenoid_filament_inductance(0.05, 0.002, 0.001, np.int64(25))
    )


def test_solenoid_overlapping_turns_warn():
    """A pitch below the wire diameter (overlapping turns) warns; a close-wound coil does not."""
    with pytest.warns(OutsideValidityWarning, match="pitch must be at least the wire diameter"):
        solenoid_filament_inductance(0.05, 0.0009, 0.001, 10)
    with warnings.catch_warnings():
        warnings.simplefilter("error")
        solenoid_filament_inductance(0.05, 0.001, 0.001, 10)
