"""Benchmarks of the multilayer filament sum: speed, memory and agreement with mpmath.

Run with timing: ``python -m pytest tests/benchmarks/test_bench_multilayer.py --benchmark-enable -p no:cacheprovider``
(add ``COILPLAN_FULL_BENCH=1`` for 10 000 turns at full size). Under the default
``--benchmark-disable`` each body runs once, at reduced sizes where heavy, and still
checks its answer. Figures: tests/benchmarks/README.md. The coil is invented for the
benchmark: a 10 mm former, 10 mm winding width, 0.20 mm wire of 0.22 mm overall
diameter, staggered (orthocyclic) layers.
"""

import os
import resource
import time
import tracemalloc

import mpmath
import numpy as np
from scipy.constants import mu_0

from coilplan.physics.multilayer import layered_winding_layout, multilayer_filament_inductance

FULL = bool(os.environ.get("COILPLAN_FULL_BENCH"))
COIL = {"inner_radius": 0.005, "winding_width": 0.010, "wire_diameter": 0.0002, "overall_diameter": 0.00022,
        "style": "staggered"}
PEAK_BUDGET_BYTES = 128 * 2**20  # a few 16 MiB blocks, far inside the 1 GB goal


def _mp_sum(turns, dps=30):
    """The same turn-by-turn sum at ``dps`` digits: textbook Maxwell form (Rosa & Grover 1912, (1), (2))."""
    radii, offsets, counts, p, _ = layered_winding_layout(COIL["inner_radius"], COIL["winding_width"],
                                                          COIL["overall_diameter"], turns, style=COIL["style"])
    r = np.repeat(radii, counts)
    z = np.concatenate([o + p * np.arange(n) for o, n in zip(offsets, counts, strict=True)])
    with mpmath.workdps(dps):
        rho = mpmath.mpf(COIL["wire_diameter"]) / 2
        rs = [mpmath.mpf(float(x)) for x in r]
        zs = [mpmath.mpf(float(x)) for x in z]
        total = mpmath.fsum(mu_0 * a * (mpmath.log(8 * a / rho) - mpmath.mpf(7) / 4) for a in rs)
        pairs = []
        for i in range(len(rs)):
            for j in range(i + 1, len(rs)):
                a, b, dz = rs[i], rs[j], zs[i] - zs[j]
                m = 4 * a * b / ((a + b) ** 2 + dz**2)
                k = mpmath.sqrt(m)
                pairs.append(mpmath.sqrt(a * b) * ((2 / k - k) * mpmath.ellipk(m) - (2 / k) * mpmath.ellipe(m)))
        return total + 2 * mu_0 * mpmath.fsum(pairs)


def test_bench_multilayer_1000_turns(benchmark):
    """1000-turn multilayer coil by the exact method (goal < 0.3 s); equals the direct pair sum."""
    inductance = benchmark(multilayer_filament_inductance, turns=1000, **COIL)
    direct = multilayer_filament_inductance(turns=1000, regroup=False, **COIL)
    benchmark.extra_info["direct_pair_sum_relative_difference"] = abs(inductance / direct - 1)
    assert abs(inductance / direct - 1) < 1e-12
    if FULL:
        start = time.perf_counter()
        multilayer_filament_inductance(turns=1000, **COIL)
        assert time.perf_counter() - start < 0.3


def test_bench_multilayer_10000_turns(benchmark):
    """10 000 turns (goal < 20 s, < 1 GB); 3000 without COILPLAN_FULL_BENCH. Checked against the direct sum."""
    turns = 10_000 if FULL else 3000
    tracemalloc.start()
    try:
        start = time.perf_counter()
        inductance = benchmark.pedantic(multilayer_filament_inductance, kwargs={"turns": turns, **COIL},
                                        rounds=1, iterations=1)
        elapsed = time.perf_counter() - start
        peak = tracemalloc.get_traced_memory()[1]
    finally:
        tracemalloc.stop()
    direct = multilayer_filament_inductance(turns=turns, regroup=False, **COIL)
    benchmark.extra_info.update(turns=turns, seconds=elapsed, peak_traced_MiB=peak / 2**20,
                                process_max_rss_MiB=resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024,
                                direct_pair_sum_relative_difference=abs(inductance / direct - 1))
    assert abs(inductance / direct - 1) < 1e-11
    assert peak < PEAK_BUDGET_BYTES
    if FULL:
        assert elapsed < 20.0


def test_bench_multilayer_against_mpmath(benchmark):
    """The vectorised sum equals the same sum in mpmath (30 digits) to 1e-9 relative (issue 6)."""
    turns = 200 if FULL else 40
    inductance = benchmark(multilayer_filament_inductance, turns=turns, **COIL)
    reference = float(_mp_sum(turns))
    benchmark.extra_info.update(turns=turns, mpmath_relative_difference=abs(inductance / reference - 1))
    assert abs(inductance / reference - 1) < 1e-9
