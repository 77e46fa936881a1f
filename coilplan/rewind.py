r"""The measured coil: readings, their frequency correction, and turns to add or remove.

A reading ``L@N`` is what the meter shows at its test frequency. Near
self-resonance that is the apparent inductance, not the coil's own:

.. math::

    L_{app} = \frac{L}{1 - \omega^2 L C_{self}}
    \quad\Longleftrightarrow\quad
    L = \frac{L_{app}}{1 + \omega^2 L_{app} C_{self}}

so each reading is first brought back to the low-frequency L at the meter
frequency, the form's model is calibrated to those values, the target at the
operating frequency is turned into the low-frequency L that shows as the
target there, and the solver gives the turns.

The uncertainty of the answer combines the meter's tolerance (systematic: it
does not average out over readings), the scatter of the readings about the
fitted model, and any doubt in the turn counts of the readings; the range of
turns is the solve at the target's two ends of that band.
"""

from __future__ import annotations

import itertools
import math
from dataclasses import dataclass, field

import numpy as np

from coilplan.errors import InfeasibleError, InvalidInputError
from coilplan.physics.frequency import self_resonant_frequency
from coilplan.quantities import format_quantity
from coilplan.request import DEFAULT_TOLERANCE
from coilplan.solve import solve_turns

__all__ = [
    "DEFAULT_TOLERANCE",
    "SRF_FRACTION",
    "Conditions",
    "Fit",
    "apparent_inductance",
    "check_readings",
    "closed_core_fit",
    "low_frequency_inductance",
    "low_frequency_readings",
    "model_fit",
    "scale_fit",
    "rewind_fields",
]

#: Above this fraction of the self-resonant frequency the apparent inductance departs noticeably from
#: L (by about 1/(1 − x²): 12 % at a third of the SRF). Common practice, no source.
SRF_FRACTION = 1.0 / 3.0
#: A reading farther off the fitted model than this many tolerances is named as suspicious.
SUSPICIOUS_TOLERANCES = 2.0

USUAL_CAUSES = ("lead inductance (long test leads or a long pigtail), the meter's test frequency near "
                "self-resonance, uneven or bunched turns, a core near saturation or a gap that moved")


@dataclass(frozen=True)
class Conditions:
    """How the readings were taken and where the coil will work.

    Attributes
    ----------
    tolerance : float
        Meter accuracy, relative (0.01 = ±1 %).
    tolerance_assumed : bool
        True when the tolerance is the default, not the user's figure.
    meter_frequency : float, optional
        The meter's test frequency, Hz.
    operating_frequency : float, optional
        The frequency the coil will work at, Hz.
    self_capacitance : float, optional
        The coil's self-capacitance, F (taken the same at every reading).
    self_capacitance_estimated : bool
        True when ``self_capacitance`` is the form's own estimate, not a value given.
    turns_uncertainty : float
        ± turns on the counts of the readings (0: counted exactly).
    """

    tolerance: float = DEFAULT_TOLERANCE
    tolerance_assumed: bool = True
    meter_frequency: float | None = None
    operating_frequency: float | None = None
    self_capacitance: float | None = None
    self_capacitance_estimated: bool = False
    turns_uncertainty: float = 0.0


@dataclass(frozen=True)
class Fit:
    """A one-parameter calibration of a model to readings.

    Attributes
    ----------
    kind : {"al", "scale"}
        The calibrated quantity: the AL value of a closed core, or a scale factor on a model.
    value : float
        AL in H per turn², or the dimensionless factor.
    residuals : tuple of float
        Relative residual of each reading, (L_i − fit)/L_i.
    scatter : float
        Standard error of the fitted value from the residuals, relative (0 for one reading).
    """

    kind: str
    value: float
    residuals: tuple[float, ...]
    scatter: float = 0.0
    extra: dict = field(default_factory=dict)


def low_frequency_inductance(apparent, frequency, capacitance):
    r"""The coil's own L from an apparent reading at ``frequency``: L = L_app/(1 + ω² L_app C).

    Examples
    --------
    >>> round(float(low_frequency_inductance(102.014e-6, 1e6, 5e-12)) * 1e6, 3)  # docs/methods.md §10
    100.0
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    apparent = np.asarray(apparent, dtype=float)
    return apparent / (1.0 + omega**2 * apparent * np.asarray(capacitance, dtype=float))


def apparent_inductance(inductance, frequency, capacitance):
    r"""The apparent inductance at ``frequency``: L/(1 − ω² L C); NaN at or above self-resonance.

    Examples
    --------
    >>> round(float(apparent_inductance(100e-6, 1e6, 5e-12)) * 1e6, 3)  # docs/methods.md §10
    102.014
    """
    omega = 2.0 * np.pi * np.asarray(frequency, dtype=float)
    inductance = np.asarray(inductance, dtype=float)
    denominator = 1.0 - omega**2 * inductance * np.asarray(capacitance, dtype=float)
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(denominator > 0, inductance / denominator, np.nan)


#: A reading taken above this fraction of the coil's self-resonance is refused: there the corrected
#: L ≈ 1/(ω²C) whatever the meter shows, so the reading measures the self-capacitance, not the coil
#: (common practice, no source: a meter reads a coil well below its SRF).
UNUSABLE_SRF_FRACTION = 0.9


def low_frequency_readings(readings, conditions: Conditions) -> list[tuple[float, int]]:
    """Readings with the self-capacitance effect at the meter frequency removed.

    Raises
    ------
    InvalidInputError
        A reading whose corrected L puts the meter frequency above
        :data:`UNUSABLE_SRF_FRACTION` of the coil's self-resonance (``meter_frequency``).
    """
    if conditions.self_capacitance is None or conditions.meter_frequency is None:
        return [(float(value), int(turns)) for value, turns in readings]
    corrected = []
    for value, turns in readings:
        low = float(low_frequency_inductance(value, conditions.meter_frequency, conditions.self_capacitance))
        fraction = conditions.meter_frequency / float(self_resonant_frequency(low, conditions.self_capacitance))
        if fraction > UNUSABLE_SRF_FRACTION:
            raise InvalidInputError(
                "meter_frequency", "a test frequency well below the coil's self-resonance: "
                f"{format_quantity(value, 'H')} at {turns} turns read at "
                f"{format_quantity(conditions.meter_frequency, 'Hz')} puts it at "
                f"{fraction:.1%} of its self-resonance with {format_quantity(conditions.self_capacitance, 'F')}, "
                f"where a reading measures the capacitance, not the coil; measure at a lower frequency", None)
        corrected.append((low, int(turns)))
    return corrected


def check_readings(readings) -> None:
    """Refuse readings that cannot be used: none, repeated turn counts, or more turns reading less."""
    points = list(readings)
    if not points:
        raise InvalidInputError("readings", "at least one reading inductance@turns", None)
    counts = [turns for _, turns in points]
    if len(set(counts)) != len(counts):
        raise InvalidInputError("readings", "one reading per turn count (average repeated readings first)",
                                ", ".join(str(n) for n in counts))


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


def _scatter(residuals: np.ndarray, parameters: int = 1) -> float:
    """Relative standard error of a fitted level from its residuals (0 without spare readings)."""
    spare = residuals.size - parameters
    if spare <= 0:
        return 0.0
    return float(np.sqrt(np.sum(residuals**2) / spare / residuals.size))


def closed_core_fit(readings, *, offset: bool = False) -> Fit:
    r"""Fit L = AL·N² (+ L0 with ``offset``) to low-frequency readings, weighted by relative error.

    .. math::

        \min \sum_i \left(\frac{L_i - A_L N_i^2 - L_0}{L_i}\right)^2

    A series offset L0 (the leads, a few tens of nH for short leads) needs two readings or more;
    it is reported as ``extra["offset_H"]``.

    Examples
    --------
    >>> round(closed_core_fit([(55e-6, 20)]).value * 1e9, 2)  # issue 4: 20 turns at 55 µH
    137.5
    """
    check_readings(readings)
    inductance = np.array([value for value, _ in readings], dtype=float)
    turns = np.array([count for _, count in readings], dtype=float)
    if offset and inductance.size < 2:
        raise InvalidInputError("offset", "two readings or more to separate the leads from the winding", None)
    columns = [turns**2 / inductance] + ([1.0 / inductance] if offset else [])
    solution, *_ = np.linalg.lstsq(np.column_stack(columns), np.ones_like(inductance), rcond=None)
    al = float(solution[0])
    lead = float(solution[1]) if offset else 0.0
    if al <= 0:
        raise InfeasibleError("the readings give no positive AL value: more turns must read more inductance",
                              option="readings")
    residuals = (inductance - al * turns**2 - lead) / inductance
    return Fit("al", al, tuple(float(r) for r in residuals), _scatter(residuals, 1 + offset),
               {"offset_H": lead} if offset else {})


def model_fit(form, readings) -> Fit:
    r"""Fit a scale factor k on ``form``'s model: min Σ((L_i − k·L_m(N_i))/L_i)² (see :func:`scale_fit`).

    The model's shape (how L changes as the winding grows and moves on the rod or former)
    is kept; its level is set by the readings.
    """
    turns = np.array([count for _, count in readings], dtype=float)
    return scale_fit(readings, np.asarray(form.inductance(turns), dtype=float))


def scale_fit(readings, model) -> Fit:
    r"""Fit a scale factor k to readings against their model values: min Σ((L_i − k·m_i)/L_i)².

    .. math::

        k = \frac{\sum m_i/L_i}{\sum m_i^2/L_i^2}

    ``model`` holds each reading's model value, each from the winding the reading was taken on.
    """
    check_readings(readings)
    inductance = np.array([value for value, _ in readings], dtype=float)
    model = np.asarray(model, dtype=float)
    factor = float(np.sum(model / inductance) / np.sum(model**2 / inductance**2))
    residuals = (inductance - factor * model) / inductance
    return Fit("scale", factor, tuple(float(r) for r in residuals), _scatter(residuals))
