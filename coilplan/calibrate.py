"""A model calibrated by readings: its inductance scaled by a fitted factor, all else unchanged.

The fits themselves live in :mod:`coilplan.rewind` (``closed_core_fit`` for the AL of a closed
core, ``model_fit`` for the scale factor on a model whose shape matters).
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

__all__ = ["ScaledForm"]


@dataclass(frozen=True)
class ScaledForm:
    """A form whose inductance is its model's times a fitted factor; everything else delegates.

    Parameters
    ----------
    form : CoilForm
        The uncalibrated form.
    factor : float
        The scale factor from :func:`coilplan.rewind.model_fit`.

    Examples
    --------
    >>> class Square:
    ...     def inductance(self, turns):
    ...         return 1e-9 * np.asarray(turns, dtype=float) ** 2
    ...     def max_turns(self):
    ...         return 100.0
    >>> scaled = ScaledForm(Square(), 1.25)
    >>> round(float(scaled.inductance(40)) * 1e6, 3), scaled.max_turns()
    (2.0, 100.0)
    """

    form: object
    factor: float

    def inductance(self, turns):
        return self.factor * np.asarray(self.form.inductance(turns), dtype=float)

    def __getattr__(self, name):
        return getattr(self.form, name)
