"""Turns to add or remove on a measured coil: the answer's fields, its range, the words, the plan and the warnings.

The readings are first brought back to the low-frequency L and the form calibrated to them
(:mod:`coilplan.rewind`); the target at the operating frequency is turned into the low-frequency L that
shows as the target there, and the solver gives the turns.

The uncertainty of the answer combines the meter's tolerance (systematic: it
does not average out over readings), the scatter of the readings about the
fitted model, and any doubt in the turn counts of the readings; the range of
turns is the solve at the target's two ends of that band (docs/methods.md §20).
"""

from __future__ import annotations

import itertools
import math

import numpy as np

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.physics.frequency import self_resonant_frequency
from coilplan.quantities import format_quantity
from coilplan.rewind import (
    SRF_FRACTION,
    Conditions,
    Fit,
    apparent_inductance,
    low_frequency_inductance,
    low_frequency_readings,
)
from coilplan.solve import solve_turns

__all__ = ["rewind_fields"]

#: A reading farther off the fitted model than this many tolerances is named as suspicious.
SUSPICIOUS_TOLERANCES = 2.0

USUAL_CAUSES = ("lead inductance (long test leads or a long pigtail), the meter's test frequency near "
                "self-resonance, uneven or bunched turns, a core near saturation or a gap that moved")


def _backwards(readings) -> list[str]:
    """A warning when more turns read less inductance (by turn count, not by the order taken)."""
    ordered = sorted(readings, key=lambda reading: reading[1])
    for (low_value, low_turns), (high_value, high_turns) in itertools.pairwise(ordered):
        if high_value <= low_value:
            return [f"more turns read less: {format_quantity(high_value, 'H')} at {high_turns} turns against "
                    f"{format_quantity(low_value, 'H')} at {low_turns} turns. Turns added in the opposite sense, "
                    f"a shorted turn, a reading error, or {USUAL_CAUSES}: check before trimming by this answer"]
    return []


def _suspicious(fit: Fit, readings, conditions: Conditions) -> list[str]:
    """Warnings naming readings that do not follow the model, with the usual causes."""
    if len(fit.residuals) < 2:
        return []
    limit = SUSPICIOUS_TOLERANCES * conditions.tolerance
    worst = int(np.argmax(np.abs(fit.residuals)))
    if abs(fit.residuals[worst]) <= limit:
        return []
    value, turns = list(readings)[worst]
    return [f"the readings do not follow the model: {format_quantity(value, 'H')} at {turns} turns is "
            f"{fit.residuals[worst]:+.1%} off the fitted curve, more than {SUSPICIOUS_TOLERANCES:g} × the "
            f"±{conditions.tolerance:.1%} meter tolerance. Usual causes: {USUAL_CAUSES}. The fit uses every "
            f"reading; check that one and measure it again"]


def _target_at_low_frequency(target: float, conditions: Conditions) -> float:
    """The low-frequency L that shows as ``target`` at the operating frequency."""
    if conditions.self_capacitance is None or conditions.operating_frequency is None:
        return target
    return float(low_frequency_inductance(target, conditions.operating_frequency, conditions.self_capacitance))


def _uncertainty(form, fit: Fit, conditions: Conditions, readings) -> float:
    """Relative uncertainty of the calibrated model: meter, scatter and turn counts, in quadrature."""
    parts = [conditions.tolerance, fit.scatter]
    if conditions.turns_uncertainty:
        # a reading at N ± δ turns: the model's relative change there is the calibration's doubt
        turns = list(readings)[-1][1]
        base = float(form.inductance(turns))
        shifted = float(form.inductance(turns + conditions.turns_uncertainty))
        parts.append(abs(shifted / base - 1.0))
    return math.sqrt(sum(part * part for part in parts))


def rewind_fields(form, target: float, readings, fit: Fit, conditions: Conditions) -> tuple[dict, list[str]]:
    """Turns to add or remove on a measured coil, its range, the words, the plan and the warnings.

    Parameters
    ----------
    form : CoilForm
        The calibrated form (its ``inductance`` already fitted to the readings).
    target : float
        Inductance wanted, H: at the operating frequency when one is given, as the meter
        would read it there.
    readings : list of (float, int)
        The readings as the meter showed them, (H, turns); the last is the coil as it is now.
    fit : Fit
        The calibration.
    conditions : Conditions

    Returns
    -------
    tuple
        (result fields, warnings). Fields: ``turns_now``, ``turns``, ``turns_exact``,
        ``turns_change``, ``turns_range``, ``inductance_H`` (low-frequency, at the
        recommended turns, as the meter will read it at its own frequency; for a form
        seen with its core at the operating frequency this and the other meter figures
        are divided by its ``inductance_ratio``), ``apparent_inductance_H`` (at the operating frequency),
        ``target_H``, ``target_low_frequency_H``, ``turns_below``/``turns_above`` and their
        inductances, ``uncertainty``, ``wire_change_m``, ``explanation``, ``plan``.
    """
    warnings_: list[str] = []
    turns_now = int(list(readings)[-1][1])
    fewest = min(int(count) for _, count in readings)
    if conditions.turns_uncertainty >= fewest:
        raise InvalidInputError("turns_uncertainty", f"an uncertainty below the fewest turns read ({fewest}): "
                                "a count known only to ± its own size could be no turns at all",
                                f"{conditions.turns_uncertainty:g}")
    low_target = _target_at_low_frequency(target, conditions)
    try:
        solution = solve_turns(form, low_target)
    except InfeasibleError as error:
        if low_target == target:
            raise
        at = format_quantity(conditions.operating_frequency, "Hz")
        capacitance = format_quantity(conditions.self_capacitance, "F")
        raise InfeasibleError(f"{format_quantity(target, 'H')} at {at} with {capacitance} of self-capacitance is "
                              f"{format_quantity(low_target, 'H')} at low frequency: {error.message}",
                              option=error.option) from None
    _check_apparent(solution, target, conditions)
    uncertainty = _uncertainty(form, fit, conditions, readings)
    ends = []
    for side in (1.0 - uncertainty, 1.0 + uncertainty):
        # a reading = true·(1 + e), |e| <= u: the model may sit high or low by that much, so the
        # true target is met where model(N) = target·(1 + e)
        try:
            ends.append(float(solve_turns(form, low_target * side).turns_exact))
        except InfeasibleError:
            # below one turn the band ends at the single turn; above the form's reach it stays open
            lowest = float(form.min_turns())
            below = low_target * side < float(form.inductance(lowest))
            ends.append(lowest if below else math.nan)
    low_end, high_end = sorted(ends, key=lambda v: (math.isnan(v), v))
    # the whole numbers the answer could round to anywhere in the band
    turns_range = [round(low_end) if math.isfinite(low_end) else None,
                   round(high_end) if math.isfinite(high_end) else None]
    chosen = int(solution.turns)
    change = chosen - turns_now
    # a form seen with its core at the operating frequency solves in those terms; the figures a
    # meter will show are at its own frequency, where the readings were taken
    meter = 1.0 / getattr(form, "inductance_ratio", 1.0)
    fields = {
        "turns_now": turns_now,
        "turns": chosen,
        "turns_exact": float(solution.turns_exact),
        "turns_change": change,
        "inductance_H": float(solution.inductance) * meter,
        "turns_range": turns_range,
        "turns_range_exact": [low_end, high_end],
        "turns_below": int(solution.turns_below),
        "turns_above": int(solution.turns_above),
        "inductance_below_H": float(solution.inductance_below) * meter,
        "inductance_above_H": float(solution.inductance_above) * meter,
        "target_H": float(target),
        "target_low_frequency_H": low_target * meter,
        "uncertainty": uncertainty,
        "tolerance": conditions.tolerance,
        "tolerance_assumed": conditions.tolerance_assumed,
        "wire_change_m": float(form.wire_length(chosen)) - float(form.wire_length(turns_now))
        if hasattr(form, "wire_length") else None,
        "readings": [{"inductance_H": float(v), "turns": int(n)} for v, n in readings],
        "residuals": list(fit.residuals),
        "calibration": {"kind": fit.kind, "value": fit.value, "scatter": fit.scatter},
    }
    fields["apparent_inductance_H"] = _apparent(solution.inductance, conditions)
    fields["explanation"] = _explanation(fields, readings, fit, solution)
    fields["plan"] = _plan(fields)
    warnings_ += _backwards(readings)
    warnings_ += _suspicious(fit, readings, conditions)
    warnings_ += _srf_warnings(readings, chosen, form, conditions)
    if conditions.tolerance_assumed:
        warnings_.append(f"meter tolerance taken as ±{conditions.tolerance:.0%} (an assumption): give your "
                         f"meter's figure with --tolerance")
    return fields, warnings_


def _check_apparent(solution, target: float, conditions: Conditions) -> None:
    """Refuse a whole-turn answer whose apparent inductance at the operating frequency misses by 2× or more.

    Close to self-resonance L/(1 − ω²LC) runs away: the exact turns exist, but no whole
    number of turns shows anything near the target there.
    """
    if conditions.self_capacitance is None or conditions.operating_frequency is None:
        return
    shown = _apparent(solution.inductance, conditions)
    if math.isfinite(shown) and 0.5 < shown / target < 2.0:
        return
    sides = []
    for count, value in ((solution.turns_below, solution.inductance_below),
                         (solution.turns_above, solution.inductance_above)):
        seen = _apparent(value, conditions)
        plural = int(count) != 1
        if math.isfinite(seen):
            sides.append(f"{_turns(int(count))} {'show' if plural else 'shows'} {format_quantity(seen, 'H')}")
        else:
            sides.append(f"{_turns(int(count))} {'are' if plural else 'is'} above self-resonance")
    raise InfeasibleError(f"no whole number of turns shows {format_quantity(target, 'H')} at "
                          f"{format_quantity(conditions.operating_frequency, 'Hz')}: it lies in the self-resonance "
                          f"rise, where {' and '.join(dict.fromkeys(sides))}; use a lower frequency or a coil "
                          f"with less self-capacitance", option="target")


def _apparent(inductance: float, conditions: Conditions) -> float:
    if conditions.self_capacitance is None or conditions.operating_frequency is None:
        return float(inductance)
    return float(apparent_inductance(inductance, conditions.operating_frequency, conditions.self_capacitance))


def _srf_warnings(readings, turns: int, form, conditions: Conditions) -> list[str]:
    capacitance = conditions.self_capacitance
    if capacitance is None:
        return []
    texts = []
    low = low_frequency_readings(readings, conditions)
    for label, frequency, inductance in (
            ("meter", conditions.meter_frequency, max(value for value, _ in low)),
            ("operating", conditions.operating_frequency, float(form.inductance(turns)))):
        if frequency is None:
            continue
        if not inductance > 0:
            continue
        srf = float(self_resonant_frequency(inductance, capacitance))
        if frequency >= SRF_FRACTION * srf:
            texts.append(f"the {label} frequency {format_quantity(frequency, 'Hz')} is {frequency / srf:.0%} of "
                         f"the self-resonant frequency {format_quantity(srf, 'Hz')}: the apparent inductance "
                         f"there departs from L by about {1 / (1 - (frequency / srf) ** 2) - 1:.0%} (rule of "
                         f"thumb: stay below a third of the SRF; common practice, no source)")
    return texts


def _explanation(fields: dict, readings, fit: Fit, solution) -> str:
    """The arithmetic in words a bench user follows."""
    points = list(readings)
    value, turns = points[-1]
    low, high = fields["turns_below"], fields["turns_above"]
    now = fields["turns_now"]
    if len(points) == 1:
        said = f"{turns} turns read {format_quantity(value, 'H')}"
    else:
        counts = sorted(count for _, count in points)
        said = f"{len(points)} readings from {counts[0]} to {counts[-1]} turns fit"
    if fit.kind == "al":
        start = f"{said}, so AL = {format_quantity(fit.value, 'H')} per turn²"
    else:
        start = f"{said} {fit.value:.3f} × the model's value, so the model is scaled by that"
    target_text = format_quantity(fields["target_low_frequency_H"], "H")
    options = []
    for count, inductance in ((low, fields["inductance_below_H"]), (high, fields["inductance_above_H"])):
        step = count - now
        verb = "remove" if step < 0 else "add"
        action = "keep the turns as they are" if step == 0 else f"{verb} {abs(step)}"
        options.append(f"{action} and expect {format_quantity(inductance, 'H')}")
    choices = options[0] if low == high else f"{options[0]}, or {options[1]}"
    return f"{start}; {target_text} needs {fields['turns_exact']:.1f} turns: {choices}"


def _turns(count: int) -> str:
    return f"{count} turn" if count == 1 else f"{count} turns"


def _plan(fields: dict) -> list[str]:
    """Steps that approach the target from above when the answer is less certain than a turn."""
    now, chosen = fields["turns_now"], fields["turns"]
    low_exact, high_exact = fields["turns_range_exact"]
    high = fields["turns_range"][1]
    if chosen == now:
        return ["no change: the coil is on target within a turn"]
    if not (math.isfinite(low_exact) and math.isfinite(high_exact)) or high_exact - low_exact <= 1.0:
        verb = "remove" if chosen < now else "add"
        return [f"{verb} {_turns(abs(chosen - now))}, then measure to confirm"]
    safe = max(high, chosen)
    steps = []
    if safe != now:
        verb = "remove" if safe < now else "add"
        steps.append(f"{verb} {_turns(abs(safe - now))} (to {safe}, the top of the range), then measure")
    steps.append("give that reading with another --measured: the refit narrows the range; then remove "
                 "the rest (removing is easy, adding back means a splice)")
    return steps
