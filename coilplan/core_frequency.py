r"""A cored coil at its operating frequency: the core's permeability there, and the loss it adds.

A core's permeability falls and its loss rises with frequency (:mod:`coilplan.physics.dispersion`).
For a form whose inductance depends on the core's permeability µ through some g(µ)
(the toroid's µ itself, a gapped core's µe, a rod's apparent permeability), the coil at f has

.. math::

    L(f) = L(f_{ref})\,\frac{g(\mu'(f))}{g(\mu'(f_{ref}))},\qquad
    R_{core}(f) = \omega L(f)\,\tan\delta(f)\,D,\qquad
    D = \frac{\partial \ln g}{\partial \ln \mu}\Big|_{\mu'(f)}

where f_ref is the frequency the form was calibrated at (the meter's, or the low-frequency
limit for a class's typical µi). The dilution D follows from L(µ' − jµ'') to first order in the
loss angle: D = 1 for a closed ungapped core; µe/µ for a gapped core (the IEC 60401-3 rule that
the gapped core's loss angle is tanδ/µi·µe, from memory); about µrod/µ for a rod, as in
[JohnsonJasik] (see :func:`coilplan.physics.dispersion.core_loss_resistance`).
"""

from __future__ import annotations

import dataclasses
import functools
import math
from collections.abc import Callable
from dataclasses import dataclass
from typing import TYPE_CHECKING

import numpy as np

from coilplan.quantities import format_quantity

if TYPE_CHECKING:
    from coilplan.materials import Dispersion

__all__ = [
    "CoreAtFrequency",
    "CoreSpectrum",
    "at_frequency",
    "class_spectrum",
    "core_drift",
    "core_resistance_batch",
    "loss_factor_from_q",
    "permeability_response",
]

# relative step for the numerical derivative of ln g: central differences are good to ~1e-10 here
_STEP = 1e-5


@dataclass(frozen=True)
class CoreSpectrum:
    """How one core's permeability and loss change with frequency.

    Parameters
    ----------
    mu : float
        The core's relative permeability as the form uses it, at ``reference_frequency``.
    reference_frequency : float
        Hz; 0 for the low-frequency limit (a class's typical µi is that).
    dispersion : Dispersion, optional
        The material class's dispersion; its shape is applied to this core.
    loss_factor, loss_factor_frequency : float, optional
        A relative loss factor tanδ/µi the user read (a data sheet), at its frequency: the
        class's loss curve is scaled through it, or with no class taken flat in frequency.
    loss_factor_source : str
        Where the loss factor came from, in words ("given", "from the Q reading ...").
    """

    mu: float
    reference_frequency: float = 0.0
    dispersion: Dispersion | None = None
    loss_factor: float | None = None
    loss_factor_frequency: float | None = None
    loss_factor_source: str = "given"

    def __post_init__(self) -> None:
        if self.dispersion is None and self.loss_factor is None:
            raise ValueError("a spectrum needs a material class or a loss factor")

    def _shape(self, frequency):
        """χ'(f)/χ(0) of the class's relaxation (1 with no class: no drift known)."""
        if self.dispersion is None:
            return np.ones_like(np.asarray(frequency, dtype=float))
        x = np.asarray(frequency, dtype=float) / self.dispersion.relaxation_frequency
        return 1.0 / (1.0 + x * x)

    @property
    def mu_low_frequency(self) -> float:
        """The core's µ in the low-frequency limit, from ``mu`` at the reference frequency."""
        return 1.0 + (self.mu - 1.0) / float(self._shape(self.reference_frequency))

    def real_permeability(self, frequency):
        """µ'(f) of this core: the class's relaxation shape on this core's susceptibility."""
        return 1.0 + (self.mu_low_frequency - 1.0) * self._shape(frequency)

    def loss_tangent(self, frequency):
        """tanδ(f) of this core's material."""
        if self.dispersion is None:
            return np.full(np.shape(frequency), self.loss_factor * self.mu_low_frequency)[()]
        curve = self.dispersion.loss_tangent(frequency)
        if self.loss_factor is None:
            return curve
        # the user's tanδ/µi, times this core's µi, is its tanδ there: scale the class's curve through it
        there = float(self.dispersion.loss_tangent(self.loss_factor_frequency))
        return curve * (self.loss_factor * self.mu_low_frequency / there)

    @property
    def basis(self) -> str:
        """Where the loss figure comes from, in words."""
        if self.loss_factor is not None:
            given = (f"loss factor {self.loss_factor:.3g} at {format_quantity(self.loss_factor_frequency, 'Hz')} "
                     f"{self.loss_factor_source}")
            if self.dispersion is None:
                return f"{given}, taken flat in frequency (name the class, --material, for its rise)"
            return f"{given}, rising as {self.dispersion.name} does"
        return f"typical of {self.dispersion.name}, rough (a factor of two or more either way)"


def permeability_response(form) -> Callable[[float], float] | None:
    """g(µ): what the form's inductance is proportional to as the core's permeability changes.

    Forms answer through a ``permeability_response`` method of their own (a calibrated
    ScaledForm passes the question to the form inside, its factor does not depend on µ);
    None when the form has none or cannot say.
    """
    method = getattr(form, "permeability_response", None)
    return None if method is None else method()


@dataclass(frozen=True)
class CoreAtFrequency:
    """A cored form seen at ``frequency``: inductance(N) with the core's µ' there, and the core's loss.

    ``form`` is calibrated at ``spectrum.reference_frequency``; everything but the inductance
    and the core loss delegates to it. The core's figures at ``frequency`` are worked out once
    (the solver asks for the inductance many times).
    """

    form: object
    spectrum: CoreSpectrum
    frequency: float
    response: Callable[[float], float]

    @functools.cached_property
    def inductance_ratio(self) -> float:
        """L(f)/L(f_ref)."""
        at = float(self.spectrum.real_permeability(self.frequency))
        return float(self.response(at)) / float(self.response(self.spectrum.mu))

    @functools.cached_property
    def dilution(self) -> float:
        """D = ∂ln g/∂ln µ at µ'(f), by a central difference."""
        mu = float(self.spectrum.real_permeability(self.frequency))
        up, down = float(self.response(mu * (1 + _STEP))), float(self.response(mu * (1 - _STEP)))
        return math.log(up / down) / (math.log1p(_STEP) - math.log1p(-_STEP))

    @functools.cached_property
    def real_permeability(self) -> float:
        """µ' of the core at ``frequency``."""
        return float(self.spectrum.real_permeability(self.frequency))

    @functools.cached_property
    def loss_tangent(self) -> float:
        """tanδ of the core's material at ``frequency``."""
        return float(self.spectrum.loss_tangent(self.frequency))

    def inductance(self, turns):
        return self.inductance_ratio * np.asarray(self.form.inductance(turns), dtype=float)

    def reference_inductance(self, turns):
        """L at the reference frequency (as the meter shows it), H."""
        return self.form.inductance(turns)

    def core_resistance(self, turns):
        """R_core = ωL·tanδ·D at ``frequency``, ohm, in series with the copper."""
        omega = 2.0 * math.pi * self.frequency
        return omega * self.inductance(turns) * self.loss_tangent * self.dilution

    def at(self, frequency: float) -> CoreAtFrequency:
        """The same coil at another frequency."""
        return dataclasses.replace(self, frequency=float(frequency))

    def __getattr__(self, name):
        return getattr(self.form, name)


def at_frequency(form, spectrum: CoreSpectrum | None, frequency: float | None):
    """``form`` at ``frequency`` when a spectrum and a response are known; otherwise ``form`` itself."""
    if spectrum is None or frequency is None:
        return form
    response = permeability_response(form)
    if response is None:
        return form
    return CoreAtFrequency(form, spectrum, float(frequency), response)


def loss_factor_from_q(q_reading: float, frequency: float, inductance: float, copper_resistance: float,
                       dilution: float, mu_low_frequency: float) -> float | None:
    r"""The material's relative loss factor from a Q the meter read on the winding (Q = ωL/R, common practice).

    .. math::

        \frac{1}{Q} = \frac{R_{cu} + R_{core}}{\omega L},\quad R_{core} = \omega L \tan\delta\, D
        \quad\Rightarrow\quad
        \frac{\tan\delta}{\mu_i} = \frac{1/Q - R_{cu}/(\omega L)}{D\,\mu_i}

    Returns None when the reading leaves no core loss (its Q at or above the copper's alone:
    the core's loss is below what the reading can tell). The self-capacitance is neglected,
    which is right well below self-resonance, where a meter's Q is read.

    Examples
    --------
    >>> round(loss_factor_from_q(100.0, 1e5, 1e-3, 1.0, 1.0, 2000.0) * 1e6, 3)  # tanδ = 0.01 − 0.0016
    4.204
    """
    omega_l = 2.0 * math.pi * frequency * inductance
    core = 1.0 / q_reading - copper_resistance / omega_l
    if not core > 0 or not dilution > 0:
        return None
    return core / (dilution * mu_low_frequency)


def class_spectrum(form, material_name: str | None, mu: float | None) -> CoreSpectrum | None:
    """The spectrum of a core of the class ``material_name`` whose permeability (as the form uses it) is ``mu``.

    None for no class, air, or a form that cannot say how its inductance follows µ.
    """
    if material_name is None or mu is None or not mu > 1.0 or permeability_response(form) is None:
        return None
    from coilplan.materials import material_dispersion

    dispersion = material_dispersion(material_name)
    return None if dispersion is None else CoreSpectrum(mu=float(mu), dispersion=dispersion)


def core_resistance_batch(form, spectrum: CoreSpectrum, inductance, frequency):
    r"""R_core = ωL·tanδ(f)·D for many windings of one form at once (a plan's coils), ohm.

    The dilution D is taken at the core's low-frequency permeability, once for the form:
    within a class's usual range µ' stays near µi, and D changes with it only to second order.
    """
    response = permeability_response(form)
    at_low = CoreAtFrequency(form, spectrum, 0.0, response)
    frequency = np.asarray(frequency, dtype=float)
    tangent = np.asarray(spectrum.loss_tangent(frequency), dtype=float)
    return 2.0 * math.pi * frequency * np.asarray(inductance, dtype=float) * tangent * at_low.dilution


def core_drift(form, spectrum: CoreSpectrum, frequency):
    """L(f)/L(f_ref) of a form's core at many frequencies (0 Hz gives 1), evaluated once per distinct frequency."""
    response = permeability_response(form)
    frequency = np.asarray(frequency, dtype=float)
    distinct, where = np.unique(frequency, return_inverse=True)
    mu = np.asarray(spectrum.real_permeability(distinct), dtype=float)
    try:  # most responses take an array of permeabilities at once
        ratios = np.asarray(response(mu), dtype=float) / float(response(spectrum.mu))
        if ratios.shape != mu.shape:
            raise TypeError("the response is not vectorised")
    except (TypeError, ValueError):
        ratios = np.array([float(response(value)) for value in mu]) / float(response(spectrum.mu))
    return ratios[where].reshape(frequency.shape)
