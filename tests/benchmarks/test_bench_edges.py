"""Speed of the answers at the edges of what a coil can be (issue 8): unreachable targets refused quickly.

Each case is one whole command run in-process through click's CliRunner (imports already done), so the
figure is the work of the answer, not the interpreter's start-up. Under the default ``--benchmark-disable``
each body runs once and still checks the answer; with ``--benchmark-enable`` it is timed:

    python -m pytest tests/benchmarks/test_bench_edges.py --benchmark-enable -p no:cacheprovider

Goals and the figures before and after are in tests/benchmarks/README.md. No assertion here is on time.
The coils are the ones issue 8 names (invented geometries: a 25 mm former with 0.5 mm wire, a 10 mm
bobbin 8 mm wide with 0.3 mm wire, a 30 mm spiral hole, a 100 mm × 10 mm rod of µi 125).
"""

import shlex

import pytest
from click.testing import CliRunner

from coilplan.cli import main

ROD = "--rod-length 100mm --rod-diameter 10mm --mu 125 --wire 0.3mm"

# (id, command line, exit status, words in the output or the error line)
CASES = [
    ("multilayer-1kH-wheeler", "multilayer --wire 0.3mm --former 10mm --width 8mm --target 1kH --method wheeler-1928",
     1, "stops at 4800 turns"),
    ("multilayer-10H", "multilayer --wire 0.3mm --former 10mm --width 8mm --target 10H", 1, "stops at 4800 turns"),
    ("multilayer-1.1H-near-the-limit", "multilayer --wire 0.3mm --former 10mm --width 8mm --target 1.1H", 0,
     "4680 turns"),
    ("solenoid-1kH", "solenoid --former 25mm --wire 0.5mm --target 1kH", 1, "100.0 m winding"),
    ("solenoid-1kH-filament", "solenoid --former 25mm --wire 0.5mm --target 1kH --method filament", 1,
     "100.0 m winding"),
    ("solenoid-1kH-fine-wire-filament", "solenoid --former 25mm --wire 0.01mm --target 1kH --method filament", 1,
     "100.0 m winding"),
    ("solenoid-1mHz-with-1F", "solenoid --former 25mm --wire 0.5mm --target-frequency 1mHz --capacitance 1F", 1,
     "100.0 m winding"),
    ("rod-10uH-at-100MHz-100pF", f"rod {ROD} --target 10uH --at 100MHz --self-capacitance 100pF", 1,
     "resonates by itself"),
    ("spiral-100000-turns", "spiral --wire 0.5mm --inner 30mm --spacing 0mm --turns 100000", 1, "do not fit"),
    ("spiral-10H-near-the-limit", "spiral --wire 0.5mm --inner 30mm --spacing 0mm --target 10H", 0, "2965 turns"),
]


def _answer(arguments):
    return CliRunner().invoke(main, arguments)


@pytest.mark.parametrize(("line", "code", "words"), [case[1:] for case in CASES], ids=[case[0] for case in CASES])
def test_bench_edge(benchmark, line, code, words):
    """The whole command; its exit status and words are checked on every run."""
    result = benchmark.pedantic(_answer, args=(shlex.split(line),), rounds=3, iterations=1, warmup_rounds=1)
    assert result.exit_code == code, result.output + result.stderr
    assert words in result.stdout + result.stderr
