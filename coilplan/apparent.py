r"""A coil as it looks at its operating frequency: apparent inductance, resistance, Q, self-resonance.

Every form that can estimate its self-capacitance C(N) looks, at frequency f, like

.. math::

    L_{app} = \frac{L}{1 - \omega^2 L C},\qquad f_{SRF} = \frac{1}{2\pi\sqrt{L C}}

(the small-R limit of the parallel-C model, docs/methods.md §10). :class:`ApparentForm`
wraps a form so that the one solver finds the turns whose *apparent* inductance at f is
the target; :func:`frequency_fields` gives the figures a report needs at f.
"""

from __future__ import annotations

import math
import warnings
from dataclasses import dataclass

import numpy as np

from coilplan.errors import MeasurementWarning
from coilplan.physics.frequency import apparent_inductance_and_resistance, q_factor, self_resonant_frequency
from coilplan.quantities import format_quantity
from coilplan.rewind import SRF_FRACTION
from coilplan.solve import search_turns

__all__ = ["ApparentForm", "GivenCapacitance", "frequency_fields", "has_frequency_model", "impedance_sweep"]


def has_frequency_model(form) -> bool:
    """True when the form estimates its self-capacitance (and so its self-resonance)."""
    return hasattr(form, "self_capacitance")


@dataclass(frozen=True)
class GivenCapacitance:
    """``form`` with the self-capacitance the user measured, taken the same at every turn count.

    A measured value (from ``coilplan tank --resonance``, say) replaces the form's estimate
    everywhere: in the target at the operating frequency, the self-resonance and the plot.
    Near the turns it was measured at it is right; far from them the coil's own C changes,
    and the answer says the value was given.
    """

    form: object
    capacitance: float
    capacitance_given = True  # what frequency_fields reports as the source

    def self_capacitance(self, turns):
        return np.full(np.shape(turns), self.capacitance)[()]

    def __getattr__(self, name):
        return getattr(self.form, name)


@dataclass(frozen=True)
class ApparentForm:
    """``form`` seen at ``frequency``: inductance(N) is the apparent L/(1 − ω²·L·C(N)).

    The turns stop short of self-resonance at ``frequency``: above it the coil is a
    capacitor there, and no number of turns gives an inductance.
    """

    form: object
    frequency: float

    def inductance(self, turns):
        turns = np.asarray(turns, dtype=float)
        low = np.asarray(self.form.inductance(turns), dtype=float)
        omega2 = (2.0 * math.pi * self.frequency) ** 2
        denominator = 1.0 - omega2 * low * np.asarray(self.form.self_capacitance(turns), dtype=float)
        with np.errstate(divide="ignore", invalid="ignore"):
            return np.where(denominator > 0, low / denominator, np.nan)

    def _resonant_turns(self) -> float:
        """Turns at which the coil self-resonates at ``frequency`` (inf if it never does in range)."""
        omega2 = (2.0 * math.pi * self.frequency) ** 2

        def product(turns):
            return omega2 * float(self.form.inductance(turns)) * float(self.form.self_capacitance(turns))

        limit, _ = search_turns(self.form)
        low, high = 1.0, min(2.0, limit)
        while product(high) < 1.0 and high < limit:  # double up to the limit: the model may be costly
            low, high = high, min(2.0 * high, limit)
        if product(high) < 1.0:
            return math.inf
        if product(1.0) >= 1.0:
            return 1.0
        for _ in range(100):
            middle = 0.5 * (low + high)
            low, high = (middle, high) if product(middle) < 1.0 else (low, middle)
            if high - low < 1e-9 * high:
                break
        return low

    def max_turns(self) -> float:
        resonant = self._resonant_turns()
        if resonant <= float(self.form.min_turns()):
            return 0.0  # even the fewest turns resonate below the frequency: none work
        return min(float(self.form.max_turns()), resonant * (1.0 - 1e-9))

    def search_limit(self):
        """The form's own search limit (its ``search_limit``, or the solver's) while self-resonance is beyond it."""
        limit, reason = search_turns(self.form)
        return limit, reason

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest or not math.isfinite(self._resonant_turns()) or self._resonant_turns() > float(self.form.max_turns()):
            return self.form.limit_reason(turns, lowest)
        at = format_quantity(self.frequency, "Hz")
        if turns < float(self.form.min_turns()):
            return f"with that, this coil already resonates by itself below {at}"
        return f"{math.floor(turns)} turns; with more, this coil resonates by itself below {at}"

    def __getattr__(self, name):
        return getattr(self.form, name)


def frequency_fields(form, turns: int, frequency: float | None, temperature_C: float = 20.0,
                     capacitance: float | None = None) -> dict:
    """Self-capacitance and self-resonance, and at ``frequency``: apparent L and R, AC resistance, Q.

    Returns
    -------
    dict
        ``self_capacitance_F``, ``srf_Hz``; with a frequency also ``frequency_Hz``,
        ``ac_resistance_ohm`` (copper, at f), ``apparent_inductance_H``,
        ``apparent_resistance_ohm``, ``q`` (ωL/R_ac, copper only), ``q_terminals`` (the Q a meter
        across the terminals sees, ωL_app/R_app, lowered by the self-capacitance) and ``srf_fraction``.
        Empty when the form has no frequency model. ``capacitance`` (F), when given, is a
        measured self-capacitance that replaces the form's estimate
        (``self_capacitance_source`` says which was used).
    """
    if not has_frequency_model(form):
        return {}
    inductance = float(form.inductance(turns))
    source = "given" if capacitance is not None or getattr(form, "capacitance_given", False) else "estimated"
    capacitance = float(form.self_capacitance(turns)) if capacitance is None else float(capacitance)
    fields = {"self_capacitance_F": capacitance, "self_capacitance_source": source,
              "srf_Hz": float(self_resonant_frequency(inductance, capacitance))}
    if frequency is None:
        return fields
    resistance = float(form.ac_resistance(turns, frequency, temperature_C))
    core = _core_fields(form, turns, frequency)
    total = resistance + core.get("core_loss_resistance_ohm", 0.0)
    below = frequency < fields["srf_Hz"]
    if below:
        apparent_l, apparent_r = apparent_inductance_and_resistance(frequency, inductance, total, capacitance)
    else:
        apparent_l = apparent_r = math.nan
    if not below:
        warnings.warn(f"{format_quantity(frequency, 'Hz')} is above this coil's self-resonance at "
                      f"{format_quantity(fields['srf_Hz'], 'Hz')}: there it is a capacitor, not an inductor",
                      MeasurementWarning, stacklevel=2)
    elif frequency >= SRF_FRACTION * fields["srf_Hz"]:
        warnings.warn(f"{format_quantity(frequency, 'Hz')} is {frequency / fields['srf_Hz']:.0%} of the "
                      f"self-resonant frequency {format_quantity(fields['srf_Hz'], 'Hz')}: the coil's "
                      f"inductance and loss there depend strongly on its self-capacitance and strays (rule of "
                      f"thumb: stay below a third of the SRF; common practice, no source)",
                      MeasurementWarning, stacklevel=2)
    fields.update(
        frequency_Hz=float(frequency),
        ac_resistance_ohm=resistance,
        apparent_inductance_H=float(apparent_l),
        apparent_resistance_ohm=float(apparent_r),
        q=float(q_factor(inductance, total, frequency)),
        copper_q=float(q_factor(inductance, resistance, frequency)),
        q_terminals=float(q_factor(apparent_l, apparent_r, frequency)) if below else math.nan,
        srf_fraction=float(frequency / fields["srf_Hz"]),
    )
    fields.update(core)
    return fields


def _core_fields(form, turns: int, frequency: float) -> dict:
    """The core's figures at ``frequency``: µ', loss tangent, dilution, loss resistance, core Q."""
    if not hasattr(form, "core_resistance"):
        return {}
    if not math.isclose(form.frequency, frequency, rel_tol=1e-12):
        form = form.at(frequency)
    tangent, dilution = form.loss_tangent, form.dilution
    return {
        "core_loss_resistance_ohm": float(form.core_resistance(turns)),
        "core_q": 1.0 / (tangent * dilution) if tangent * dilution > 0 else math.inf,
        "core_loss_tangent": tangent,
        "core_dilution": dilution,
        "core_permeability": form.real_permeability,
        "core_inductance_ratio": form.inductance_ratio,
        "core_reference_frequency_Hz": form.spectrum.reference_frequency,
        "inductance_reference_H": float(form.reference_inductance(turns)),
        "core_loss_basis": form.spectrum.basis,
    }


def impedance_sweep(form, turns: int, *, centre: float | None = None, temperature_C: float = 20.0,
                    points: int = 400, capacitance: float | None = None) -> dict:
    """|Z| and Q of the coil from well below to beyond its self-resonance, for the plot.

    Z is the parallel-C model (series L and R_ac(f), plus the core's µ'(f) and loss when the
    form carries them, the self-capacitance across; see
    :func:`coilplan.physics.frequency.coil_impedance`); Q here is |Im Z|/Re Z, the coil as a
    meter across its terminals sees it, which falls to zero at the SRF (and is not drawn
    above it, where the coil is a capacitor).

    Returns
    -------
    dict
        ``frequency_Hz``, ``impedance_ohm`` (|Z|), ``q`` arrays, and ``srf_Hz``.
    """
    from coilplan.physics.frequency import coil_impedance

    inductance = float(form.inductance(turns))
    capacitance = float(form.self_capacitance(turns)) if capacitance is None else float(capacitance)
    srf = float(self_resonant_frequency(inductance, capacitance))
    if not (math.isfinite(srf) and srf > 0):  # nothing to sweep around: say so before any arithmetic on it
        from coilplan.errors import InvalidInputError

        raise InvalidInputError("plot", "a coil whose self-resonance is known, to draw |Z| and Q around it (no "
                                "self-capacitance is estimated for this winding: give the coil's self-capacitance)",
                                None)
    low = min(srf / 100.0, (centre or srf) / 10.0)
    frequencies = np.geomspace(low, 3.0 * srf, points)
    resistance = np.array([float(form.ac_resistance(turns, f, temperature_C)) for f in frequencies])
    if hasattr(form, "core_resistance"):  # the core's µ' and loss at each frequency
        seen = [form.at(f) for f in frequencies]
        inductance = np.array([float(at.inductance(turns)) for at in seen])
        resistance = resistance + np.array([float(at.core_resistance(turns)) for at in seen])
    impedance = coil_impedance(frequencies, inductance, resistance, capacitance)
    with np.errstate(divide="ignore", invalid="ignore"):
        quality = np.where(impedance.imag > 0, impedance.imag / impedance.real, np.nan)  # inductive side only
    return {"frequency_Hz": frequencies, "impedance_ohm": np.abs(impedance), "q": quality, "srf_Hz": srf}
