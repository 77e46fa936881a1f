"""Parts of an answer that every form shares: the turns (forward or solved) and the fit check."""

from __future__ import annotations

import math
import warnings

import numpy as np

from coilplan.apparent import ApparentForm, has_frequency_model
from coilplan.calibrate import Measured
from coilplan.errors import InfeasibleError, MeasurementWarning
from coilplan.quantities import format_quantity
from coilplan.rewind_answer import rewind_fields
from coilplan.solve import TurnsSolution, search_turns, solve_apparent, solve_turns

__all__ = ["Measured", "check_fits", "given_capacitance", "turns_block", "wire_fields"]


def turns_block(form, *, turns: int | None, target: float | None, measured: Measured | None = None,
                frequency: float | None = None) -> dict:
    """``turns`` checked against what fits, or solved for ``target``, as result fields.

    Returns ``turns`` and, for an inverse, ``target_H``, ``turns_exact``,
    ``turns_below``, ``turns_above``, ``inductance_below_H``, ``inductance_above_H``.
    With readings (``measured``) and a target, the answer is the rewind of the coil as
    it is now: :func:`coilplan.rewind_answer.rewind_fields` (``turns_now``, ``turns_change``,
    ``turns_range`` ...), its warnings given as :class:`MeasurementWarning`.
    With an operating ``frequency`` and a form that estimates its self-capacitance,
    the target is the apparent inductance there (:class:`coilplan.apparent.ApparentForm`);
    ``inductance_H`` stays the coil's own (low-frequency) value.
    """
    if (turns is None) == (target is None):
        raise ValueError("give exactly one of turns and target")
    if measured is not None and target is not None and measured.same_winding:
        fields, texts = rewind_fields(form, target, measured.readings, measured.fit, measured.conditions)
        for text in texts:
            warnings.warn(text, MeasurementWarning, stacklevel=2)
        return fields
    if target is None:
        check_fits(form, int(turns))
        return {"turns": int(turns)}
    at_frequency = frequency is not None and has_frequency_model(form)
    solution = _solve_at(form, target, frequency) if at_frequency else solve_turns(form, target)
    result = {
        "target_H": float(target),
        "target_is_apparent": at_frequency,
        "turns": int(solution.turns),
        "turns_exact": float(solution.turns_exact),
        "turns_below": int(solution.turns_below),
        "turns_above": int(solution.turns_above),
        "inductance_below_H": float(solution.inductance_below),
        "inductance_above_H": float(solution.inductance_above),
    }
    if at_frequency:
        result["target_frequency_Hz"] = float(frequency)
        result["target_inductance_at_turns_H"] = float(solution.inductance)  # apparent, at the frequency
    return result


def _solve_at(form, target: float, frequency: float):
    """The turns whose apparent inductance at ``frequency`` is ``target``: the batched solve the kit uses too
    (:func:`coilplan.solve.solve_apparent`). A target beyond what a whole number of turns shows below
    self-resonance is refused in the apparent form's words (:class:`coilplan.apparent.ApparentForm`).
    """
    solution = solve_apparent(form, target, frequency)
    exact = float(solution.turns_exact[0])
    if not math.isfinite(exact) or not math.isfinite(float(solution.turns[0])) \
            or exact > search_turns(ApparentForm(form, frequency))[0] + 1e-9:
        solve_turns(ApparentForm(form, frequency), target)  # raises InfeasibleError, saying why
    return TurnsSolution(**{name: value[0] if isinstance(value, np.ndarray) else value
                            for name, value in vars(solution).items()})


def given_capacitance(measured: Measured | None) -> float | None:
    """The self-capacitance the user measured and gave, if any (not the form's estimate)."""
    if measured is None or measured.conditions.self_capacitance_estimated:
        return None
    return measured.conditions.self_capacitance


def check_fits(form, turns: int) -> None:
    """Raise InfeasibleError when ``turns`` do not fit the form."""
    limit = form.max_turns()
    if turns > limit + 1e-9:
        whole = math.floor(limit + 1e-9)
        largest = float(form.inductance(float(whole))) if whole >= 1 else math.nan
        raise InfeasibleError(f"{turns} turns do not fit: {form.limit_reason(limit)} "
                              f"(at most {format_quantity(largest, 'H')})", option="turns")


def wire_fields(wire) -> dict:
    """The wire of an answer, as result fields: label, bare and overall diameter (m), enamel grade."""
    return {"label": wire.label, "diameter_m": wire.diameter, "overall_diameter_m": wire.overall_diameter,
            "grade": wire.grade}
