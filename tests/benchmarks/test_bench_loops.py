"""Benchmarks of the filament sums in coilplan.physics.loops: speed, memory, accuracy.

Run with timing: ``python -m pytest tests/benchmarks --benchmark-enable -p no:cacheprovider``
(add ``COILPLAN_FULL_BENCH=1`` for the 10 000-turn case). Under the project's default
``--benchmark-disable`` each body runs once as a plain test, at reduced sizes where a
case is heavy, and still checks its result. Figures: tests/benchmarks/README.md.

The coil geometries are invented for the benchmark.
"""

import os
import resource
import time
import tracemalloc

import mpmath
import numpy as np
from scipy.constants import mu_0

from coilplan.physics.loops import (
    coaxial_filaments_inductance,
    coaxial_mutual_inductance,
    loop_self_inductance,
    solenoid_filament_inductance,
)

FULL = bool(os.environ.get("COILPLAN_FULL_BENCH"))

#: Memory a block-wise pair sum may use, whatever N: a few 16 MiB blocks.
#: A sum that held the N x N pair matrix would need 8 N^2 bytes per array
#: (72 MB at N = 3000, 800 MB at N = 10 000).
PEAK_BUDGET_BYTES = 128 * 2**20

# An invented single-layer coil: 40 mm diameter, 0.5 mm pitch, 0.4 mm wire.
SOLENOID = {"diameter": 0.04, "pitch": 0.0005, "wire_diameter": 0.0004}


def _mp_maxwell(a, b, z):
    """Maxwell's M, textbook form (Rosa & Grover 1912, formulas (1), (2)); m = k^2."""
    m = 4 * a * b / ((a + b) ** 2 + z**2)
    k = mpmath.sqrt(m)
    return mu_0 * mpmath.sqrt(a * b) * ((2 / k - k) * mpmath.ellipk(m)
                                        - (2 / k) * mpmath.ellipe(m))


def _mp_solenoid_sum(diameter, pitch, wire_diameter, turns):
    """N L_loop + 2 sum_{k=1}^{N-1} (N - k) M(a, a, k p) at the working precision."""
    a = mpmath.mpf(diameter) / 2
    rho = mpmath.mpf(wire_diameter) / 2
    p = mpmath.mpf(pitch)
    loop = mu_0 * a * (mpmath.log(8 * a / rho) - mpmath.mpf(7) / 4)
    mutual = mpmath.fsum((turns - k) * _mp_maxwell(a, a, k * p) for k in range(1, turns))
    return turns * loop + 2 * mutual


def _layered_winding(layers, turns_per_layer, inner_radius=0.01, pitch=0.00032):
    """A multilayer-like arrangement: layers of equal turns on a square grid (invented)."""
    radii = np.repeat(inner_radius + pitch * np.arange(layers), turns_per_layer)
    positions = np.tile(pitch * np.arange(turns_per_layer), layers)
    return radii, positions, pitch


def _layer_pair_sum(layers, turns_per_layer, inner_radius, pitch, wire_radius):
    """The same total by another grouping: O(layers^2 turns) terms instead of O(N^2).

    Two turns' mutual inductance depends only on their radii and spacing, so the
    pairs of layers p, q contribute sum_k (T - |k|) M(r_p, r_q, |k| pitch).
    """
    t = turns_per_layer
    r = inner_radius + pitch * np.arange(layers)
    k = np.arange(t)
    weight = np.where(k == 0, 1.0, 2.0) * (t - k)  # k and -k
    total = 0.0
    for p_layer in range(layers):
        m = coaxial_mutual_inductance(r[p_layer], r[:, None], k[None, :] * pitch)
        m[p_layer, 0] = 0.0  # a turn with itself: its self-inductance, added below
        total += np.sum(m * weight)
    return total + t * np.sum(loop_self_inductance(r, wire_radius))


def _peak_traced_bytes(function, *args):
    tracemalloc.start()
    try:
        function(*args)
        return tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()


def test_bench_solenoid_filament_sum_1000_turns(benchmark):
    """A 1000-turn single-layer filament sum (target < 0.2 s) agrees with mpmath to 1e-9.

    Reference: the same sum evaluated term by term in mpmath at mp.dps = 30 with the
    textbook form of Maxwell's M; N = 1000 when timing (or COILPLAN_FULL_BENCH),
    N = 200 in the default test run.
    """
    turns = 1000
    inductance = benchmark(solenoid_filament_inductance, turns=turns, **SOLENOID)
    assert np.isfinite(inductance) and inductance > 0

    checked = turns if (FULL or not benchmark.disabled) else 200
    ours = solenoid_filament_inductance(turns=checked, **SOLENOID)
    with mpmath.workdps(30):
        ref = _mp_solenoid_sum(turns=checked, **SOLENOID)
        agreement = abs(float((ours - ref) / ref))
    benchmark.extra_info["mpmath_turns"] = checked
    benchmark.extra_info["mpmath_relative_difference"] = agreement
    assert agreement < 1e-9
    if FULL:
        start = time.perf_counter()
        solenoid_filament_inductance(turns=turns, **SOLENOID)
        assert time.perf_counter() - start < 0.2


def test_bench_filaments_1000_turns(benchmark):
    """General filament sum, 10 layers x 100 turns (target < 0.3 s), checked by layer pairs."""
    layers, per_layer = 10, 100
    radii, positions, pitch = _layered_winding(layers, per_layer)
    wire_radius = 0.00015
    inductance = benchmark(coaxial_filaments_inductance, radii, positions, wire_radius)
    ref = _layer_pair_sum(layers, per_layer, 0.01, pitch, wire_radius)
    peak = _peak_traced_bytes(coaxial_filaments_inductance, radii, positions, wire_radius)
    benchmark.extra_info["peak_traced_MiB"] = peak / 2**20
    benchmark.extra_info["layer_pair_relative_difference"] = abs(inductance / ref - 1)
    assert abs(inductance / ref - 1) < 1e-12
    assert peak < PEAK_BUDGET_BYTES
    if FULL:
        start = time.perf_counter()
        coaxial_filaments_inductance(radii, positions, wire_radius)
        assert time.perf_counter() - start < 0.3


def test_bench_filaments_10000_turns(benchmark):
    """General filament sum, 40 x 250 = 10 000 turns (targets < 20 s, < 1 GB).

    Without COILPLAN_FULL_BENCH it runs 30 x 100 = 3000 turns, where a sum holding
    the whole pair matrix would already exceed the memory budget asserted here.
    """
    layers, per_layer = (40, 250) if FULL else (30, 100)
    radii, positions, pitch = _layered_winding(layers, per_layer)
    wire_radius = 0.00015

    # one run, timed and traced together (tracemalloc costs little here: the
    # work is in a few hundred large numpy arrays, not in Python objects)
    tracemalloc.start()
    try:
        start = time.perf_counter()
        inductance = benchmark.pedantic(coaxial_filaments_inductance,
                                        args=(radii, positions, wire_radius),
                                        rounds=1, iterations=1)
        elapsed = time.perf_counter() - start
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    max_rss_mib = resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024
    ref = _layer_pair_sum(layers, per_layer, 0.01, pitch, wire_radius)
    benchmark.extra_info["turns"] = layers * per_layer
    benchmark.extra_info["seconds"] = elapsed
    benchmark.extra_info["peak_traced_MiB"] = peak / 2**20
    benchmark.extra_info["process_max_rss_MiB"] = max_rss_mib
    benchmark.extra_info["layer_pair_relative_difference"] = abs(inductance / ref - 1)
    assert abs(inductance / ref - 1) < 1e-12
    assert peak < PEAK_BUDGET_BYTES  # well inside the 1 GB target
    if FULL:
        assert elapsed < 20.0
