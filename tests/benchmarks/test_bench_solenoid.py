"""Speed of the solenoid kernels, the batched solver and the command's start-up.

Out of the default test run's timing: with ``--benchmark-disable`` (the default in
pyproject.toml) each body runs once as a plain test and still checks its answer.
Run ``python -P -m pytest tests/benchmarks --benchmark-enable`` for the figures;
tests/benchmarks/README.md records them. No assertion here is on time.
"""

import os
import subprocess
import sys
import time

import numpy as np
from scipy.special import ellipe, ellipkm1

from coilplan.forms import Solenoid
from coilplan.physics.solenoid import nagaoka_coefficient
from coilplan.solve import solve_turns
from coilplan.wire import parse_wire

RATIOS = np.random.default_rng(20261202).uniform(1e-3, 10.0, 1_000_000)


def _bare_special_calls(ratio):
    """The scipy.special calls the exact coefficient is built on, with their arguments."""
    x2 = ratio * ratio
    kp2 = 1.0 / (1.0 + x2)
    return ellipkm1(kp2), ellipe(x2 * kp2)


def test_bench_nagaoka_million(benchmark):
    """Exact Nagaoka for 1e6 ratios (goal: within 1.5× of the bare special-function calls)."""
    values = benchmark(nagaoka_coefficient, RATIOS)
    assert values.shape == RATIOS.shape and np.all((values > 0) & (values < 1))


def test_bench_bare_special_calls(benchmark):
    """The baseline for the goal above."""
    k, e = benchmark(_bare_special_calls, RATIOS)
    assert np.all(k >= e)


def test_bench_batched_inverse(benchmark):
    """1e4 inverse solves in one batched call (goal: under 0.2 s)."""
    form = Solenoid(diameter=0.0255, wire=parse_wire("0.5mm"))
    targets = np.logspace(-7, -3, 10_000)
    solution = benchmark(solve_turns, form, targets)
    achieved = form.inductance(solution.turns_exact)
    assert np.allclose(achieved, targets, rtol=1e-9)


def _command_seconds(arguments, repeats=7):
    best = np.inf
    for _ in range(repeats):
        start = time.perf_counter()
        subprocess.run(arguments, check=True, stdout=subprocess.DEVNULL)
        best = min(best, time.perf_counter() - start)
    return best


def test_bench_command_start_up():
    """Whole-process wall time of an inverse solve against importing numpy and scipy.special.

    Goal: at most 1.4× (issue 2). Best of 7 runs each; prints the ratio (pytest -s to see it).
    """
    script = os.path.join(os.path.dirname(sys.executable), "coilplan")
    command = [script] if os.path.exists(script) else [sys.executable, "-m", "coilplan"]
    solve = [*command, "solenoid", "--former", "25mm", "--wire", "0.5mm", "--target", "10uH"]
    baseline = _command_seconds([sys.executable, "-c", "import numpy, scipy.special"])
    ours = _command_seconds(solve)
    print(f"\nstart-up: coilplan solenoid {ours:.3f} s, import numpy+scipy.special "
          f"{baseline:.3f} s, ratio {ours / baseline:.2f}")
    assert ours > 0 and baseline > 0
