"""Whole answers for one coil: the solve plus every figure a bench user needs, in SI.

A result is a plain dict with SI values and the unit in the key
(``inductance_H``, ``length_m``), ready for ``--json`` and for the text report.
Building it here keeps the command line thin and lets scripts get the same
answer as the command.
"""

from coilplan.results.coils import multilayer_result, spiral_result
from coilplan.results.cored import gapped_result, rod_result, toroid_result
from coilplan.results.solenoid import solenoid_result

__all__ = ["gapped_result", "multilayer_result", "rod_result", "solenoid_result", "spiral_result", "toroid_result"]
