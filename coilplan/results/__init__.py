"""Whole answers for one coil: the solve plus every figure a bench user needs, in SI.

A result is a plain dict with SI values and the unit in the key
(``inductance_H``, ``length_m``), ready for ``--json`` and for the text report.
:func:`coilplan.pipeline.design` builds it through :func:`figures_of`, so the
command line, the trim log, the kit and scripts get the same answer.
"""

from collections.abc import Callable
from typing import Any

from coilplan.results.closed import closed_result
from coilplan.results.coils import multilayer_result, spiral_result
from coilplan.results.cored import gapped_result, rod_result, toroid_result
from coilplan.results.solenoid import solenoid_result

__all__ = ["closed_result", "figures_of", "gapped_result", "multilayer_result", "rod_result", "solenoid_result",
           "spiral_result", "toroid_result"]


def figures_of(form: Any) -> Callable[..., dict[str, Any]]:
    """The figures builder for ``form`` (unwrapped to the form it was built as)."""
    from coilplan.forms import ClosedCore, FlatSpiral, GappedCore, MultilayerCoil, RodCoil, Solenoid, Toroid

    builders = {Solenoid: solenoid_result, MultilayerCoil: multilayer_result, FlatSpiral: spiral_result,
                Toroid: toroid_result, GappedCore: gapped_result, RodCoil: rod_result, ClosedCore: closed_result}
    while type(form) not in builders and hasattr(type(form), "__getattr__") and "form" in vars(form):
        form = vars(form)["form"]
    try:
        return builders[type(form)]
    except KeyError:
        raise TypeError(f"no figures for a {type(form).__name__}") from None
