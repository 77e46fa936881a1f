r"""The trim log: one JSON file per coil, the readings taken while it is trimmed toward its target.

A coil is trimmed in steps: measure, remove (or add) turns, measure again. The log keeps every reading
with its time and a note, and after each one the coil's model is refitted to all of them and the next
step worked out by :func:`coilplan.pipeline.design`, the one pipeline every command goes through: the log
builds the uncalibrated form and a :class:`~coilplan.request.Request` (its target, meter and operating
conditions, its readings) and reads the answer; it fits nothing and chooses no turns itself.

The coil is either

* a **closed core of unknown geometry** (``"model": "closed-core"``, the default): the bare law
  :class:`~coilplan.forms.ClosedCore`,

  .. math::

      L = A_L N^2 \;(+\, L_0)

  (the AL value as IEC 60205 defines it, docs/methods.md §8; L0 a fixed series part for the leads,
  fitted with ``offset`` from two turn counts on, docs/methods.md §20), or
* **a form command's coil** (``"model": "form"``): the command's name and its arguments, e.g.
  ``solenoid --former 25mm --wire 0.5mm``, read by that command's own parser and ``form_from`` at every
  refit (:mod:`coilplan.cli.coil_text`), so the log answers exactly as the command would with the same
  ``--measured`` readings.

Two readings at the same turn count are a **re-measure**: both stay in the log, and the fit sees their
mean, one point per turn count (a notice says so). A mistyped reading is **struck out**
(:func:`strike_reading`): it stays in the file, marked with the time and the reason, and is left out of
the fit.

The file, its versions and its fields are in :mod:`coilplan.session_model`; reading and writing it (atomic)
in :mod:`coilplan.session_file`.
"""

from __future__ import annotations

import itertools
import math
from collections.abc import Sequence
from dataclasses import dataclass
from datetime import UTC, datetime
from statistics import fmean

import numpy as np
from pydantic import ValidationError

from coilplan.errors import InvalidInputError
from coilplan.quantities import format_quantity
from coilplan.request import DEFAULT_TOLERANCE
from coilplan.rewind import low_frequency_readings
from coilplan.session_coil import coil_of
from coilplan.session_file import _where, load_log, save_log
from coilplan.session_model import ClosedCoreCoil, FormCoil, Reading, Struck, TrimLog

__all__ = [
    "FitPoint",
    "TrimStep",
    "add_reading",
    "evaluate",
    "fit_points",
    "new_log",
    "record_reading",
    "record_strike",
    "strike_reading",
]

@dataclass(frozen=True)
class FitPoint:
    """One point the fit sees: the mean of the readings (not struck out) at one turn count.

    Attributes
    ----------
    inductance : float
        H, the mean of the readings at ``turns``, as the meter showed them.
    turns : int
    numbers : tuple of int
        The log's numbers (from 1) of the readings averaged into it.
    """

    inductance: float
    turns: int
    numbers: tuple[int, ...]


@dataclass(frozen=True)
class TrimStep:
    """The refit after the latest reading and the next step: what :func:`coilplan.pipeline.design` answered.

    Attributes
    ----------
    fields : dict
        The answer's figures: :func:`coilplan.rewind_answer.rewind_fields` (``turns_now``, ``turns``,
        ``turns_change``, ``turns_range`` ...) and the form's own (``al_H``, ``offset_H`` and
        ``resistance_change_ohm`` for a closed core).
    warnings : tuple of str
        The answer's warnings (a reading far off the fitted curve, frequency, assumed tolerance).
    notices : tuple of str
        What the fit decided (a lead offset left out), and what the log itself notices: inductance moving
        against the turns, re-measures averaged, the target reached.
    fit : Fit
        The calibration of the model to the points.
    form : CoilForm
        The calibrated form.
    cautions : tuple of str
        The answer's safety cautions.
    points : tuple of FitPoint
        The readings as the fit saw them, the coil as it is now last.
    conditions : Conditions
        How the readings were taken (the self-capacitance used to correct them, given or estimated).
    """

    fields: dict
    warnings: tuple[str, ...]
    notices: tuple[str, ...]
    fit: object
    form: object
    cautions: tuple[str, ...] = ()
    points: tuple[FitPoint, ...] = ()
    conditions: object = None


def _now() -> datetime:
    return datetime.now(UTC).replace(microsecond=0)


def _validation_error(error: ValidationError) -> InvalidInputError:
    item = error.errors(include_url=False)[0]
    return InvalidInputError(_where(item["loc"]), item["msg"].lower(), item.get("input"))


def new_log(target: float, *, name: str | None = None, offset: bool = False, turn_length: float | None = None,
            wire: str | None = None, command: str | None = None, arguments: Sequence[str] = (),
            operating_frequency: float | None = None, meter_frequency: float | None = None,
            tolerance: float | None = None, self_capacitance: float | None = None,
            created: datetime | None = None) -> TrimLog:
    """A log with no readings yet (``tolerance`` None: the default, marked as assumed).

    The coil is a closed core of unknown geometry (``offset``, ``turn_length`` and ``wire`` describe it),
    or, with ``command``, that form command's coil described by ``arguments`` (checked by the command's
    own parser: :func:`coilplan.cli.coil_text.parse_coil`).

    Examples
    --------
    >>> log = new_log(100e-6, tolerance=0.02)
    >>> log.schema_, log.version, log.tolerance_assumed, log.readings, log.coil.model
    ('coilplan-trim-log', 2, False, (), 'closed-core')
    >>> new_log(10e-6, command="solenoid", arguments=["--former", "25mm", "--wire", "0.5mm"]).coil.text
    'solenoid --former 25mm --wire 0.5mm'
    """
    if command is not None:
        for field, given in (("offset", offset), ("turn_length", turn_length), ("wire", wire)):
            if given:
                raise InvalidInputError(field, f"no {field} beside a form command's coil (it goes in the "
                                        f"coil's own description)", None)
    try:
        if command is None:
            coil = ClosedCoreCoil(name=name, offset=offset, turn_length_m=turn_length, wire=wire)
        else:
            coil = FormCoil(name=name, command=command, arguments=tuple(arguments))
    except ValidationError as error:
        raise _validation_error(error) from None
    # the checks every request gets, and a description its command refuses, now rather than at the first reading
    coil_of(coil).request(target=target, frequency=operating_frequency, meter_frequency=meter_frequency,
                          tolerance=tolerance, self_capacitance=self_capacitance)
    try:
        return TrimLog(created=created or _now(), coil=coil, target_H=target,
                       operating_frequency_Hz=operating_frequency, meter_frequency_Hz=meter_frequency,
                       tolerance=DEFAULT_TOLERANCE if tolerance is None else tolerance,
                       tolerance_assumed=tolerance is None, self_capacitance_F=self_capacitance)
    except ValidationError as error:
        raise _validation_error(error) from None


def add_reading(log: TrimLog, inductance: float, turns: int, *, note: str | None = None,
                time: datetime | None = None) -> TrimLog:
    """The log with one more reading (the coil as it is now); the log given is not changed.

    A reading at a turn count already in the log is a re-measure: it is kept beside the earlier one, and
    the fit sees their mean (:func:`fit_points`).

    Raises
    ------
    InvalidInputError
        Turns below 1 or not whole, or an inductance not above zero.
    """
    if isinstance(turns, bool) or not isinstance(turns, (int, np.integer)) or turns < 1:
        raise InvalidInputError("--measured", "a whole number of turns, at least 1", turns)
    if not (isinstance(inductance, (int, float, np.floating)) and math.isfinite(inductance) and inductance > 0):
        raise InvalidInputError("--measured", "an inductance above zero", inductance)
    reading = Reading(inductance_H=float(inductance), turns=int(turns), time=time or _now(), note=note)
    return log.model_copy(update={"readings": (*log.readings, reading)})


def strike_reading(log: TrimLog, number: int, *, why: str | None = None, time: datetime | None = None) -> TrimLog:
    """The log with reading ``number`` (from 1, as listed) struck out: kept, marked, and left out of the fit.

    Raises
    ------
    InvalidInputError
        No reading of that number, or one already struck out.

    Examples
    --------
    >>> log = add_reading(add_reading(new_log(100e-6), 55e-6, 20), 5.5e-6, 22)
    >>> [reading.struck is None for reading in strike_reading(log, 2, why="typed 5.5uH").readings]
    [True, False]
    """
    count = len(log.readings)
    if isinstance(number, bool) or not isinstance(number, (int, np.integer)) or not 1 <= number <= count:
        expected = (f"a reading number from 1 to {count}, as trim show lists them" if count
                    else "a reading to strike out: the log has none yet")
        raise InvalidInputError("reading", expected, number)
    reading = log.readings[number - 1]
    if reading.struck is not None:
        when = reading.struck.time.isoformat(sep=" ", timespec="minutes").replace("+00:00", " UTC")
        reason = f": {reading.struck.why}" if reading.struck.why else ""
        raise InvalidInputError("reading", f"a reading not struck out yet (reading {number} was struck out "
                                f"{when}{reason})", number)
    struck = reading.model_copy(update={"struck": Struck(time=time or _now(), why=why)})
    readings = (*log.readings[: number - 1], struck, *log.readings[number:])
    return log.model_copy(update={"readings": readings})


def fit_points(log: TrimLog) -> tuple[FitPoint, ...]:
    """The readings as the fit sees them: struck ones left out, those at one turn count averaged.

    The points are in the order of each turn count's latest reading, so the last is the coil as it is
    now (the reading the turns to add or remove start from).

    Examples
    --------
    >>> log = new_log(100e-6)
    >>> for value, turns in [(150e-6, 33), (121e-6, 30), (123e-6, 30)]:
    ...     log = add_reading(log, value, turns)
    >>> [(round(p.inductance * 1e6, 3), p.turns, p.numbers) for p in fit_points(log)]
    [(150.0, 33, (1,)), (122.0, 30, (2, 3))]
    """
    groups: dict[int, list[tuple[int, float]]] = {}
    for number, reading in enumerate(log.readings, start=1):
        if reading.struck is None:
            groups.setdefault(reading.turns, []).append((number, reading.inductance_H))
    ordered = sorted(groups.items(), key=lambda item: item[1][-1][0])
    return tuple(FitPoint(fmean(value for _, value in members), turns, tuple(number for number, _ in members))
                 for turns, members in ordered)


def evaluate(log: TrimLog) -> TrimStep:
    """Refit the coil's model to the readings and work out the next step, by :func:`coilplan.pipeline.design`.

    The readings not struck out, averaged per turn count (:func:`fit_points`), go into a
    :class:`~coilplan.request.Request` with the log's target and conditions; the log's coil gives the
    uncalibrated form (:func:`coil_of`). Design corrects the readings for self-capacitance at the meter
    frequency, calibrates the form (a closed core's AL, and its lead offset from the second turn count on;
    a model's scale factor), and answers the turns to add or remove with their range (docs/methods.md §20).

    Raises
    ------
    InvalidInputError
        No readings yet (or every one struck out), or readings the form cannot take.
    InfeasibleError
        The readings give no positive AL value, or no whole number of turns meets the target.

    Examples
    --------
    >>> log = add_reading(new_log(100e-6, tolerance=0.02), 55e-6, 20)  # issue 4: 20 turns at 55 µH
    >>> step = evaluate(log)
    >>> step.fields["turns"], step.fields["turns_change"]
    (27, 7)
    """
    from coilplan.pipeline import design

    points = fit_points(log)
    if not points:
        expected = ("at least one reading: give one with --measured L@N" if not log.readings
                    else "at least one reading not struck out: give one with --measured L@N")
        raise InvalidInputError("readings", expected, None)
    form, request = coil_of(log.coil).form_and_request(
        target=log.target_H, frequency=log.operating_frequency_Hz, meter_frequency=log.meter_frequency_Hz,
        tolerance=None if log.tolerance_assumed else log.tolerance, self_capacitance=log.self_capacitance_F,
        readings=[(point.inductance, point.turns) for point in points])
    answer = design(form, request)
    fields = dict(answer.result)
    found = list(fields.pop("notices", []))
    if "turns_now" not in fields:  # the last reading was of another winding than the coil described
        raise InvalidInputError("readings", "readings of the coil being trimmed: " + "; ".join(found), None)
    notices = _direction_notices(log) + _remeasure_notices(points) + found
    notices += _target_notices(log, points[-1], fields, answer.measured.conditions)
    return TrimStep(fields, tuple(answer.warnings), tuple(notices), answer.measured.fit, answer.form,
                    tuple(answer.cautions), points, answer.measured.conditions)


def _direction_notices(log: TrimLog) -> list[str]:
    """Consecutive readings (not struck out) whose inductance moved against the turns (L rises with N on any coil)."""
    texts = []
    kept = [(number, reading) for number, reading in enumerate(log.readings, start=1) if reading.struck is None]
    for (_, before), (number, after) in itertools.pairwise(kept):
        step = after.turns - before.turns
        rise = after.inductance_H - before.inductance_H
        if step * rise >= 0:
            continue
        action = f"removing {-step}" if step < 0 else f"adding {step}"
        moved = "rose" if rise > 0 else "fell"
        texts.append(f"reading {number}: the inductance {moved} from {format_quantity(before.inductance_H, 'H')} "
                     f"to {format_quantity(after.inductance_H, 'H')} after {action} turn{'s' if abs(step) > 1 else ''}"
                     f" ({before.turns} → {after.turns}), which no coil does: check the turn count, the test leads "
                     f"and their position, and that the core or its gap did not shift; then measure again")
    return texts


def _remeasure_notices(points: Sequence[FitPoint]) -> list[str]:
    """Readings at one turn count, averaged: say which, and what the fit sees."""
    texts = []
    for point in points:
        if len(point.numbers) < 2:
            continue
        numbers = ", ".join(map(str, point.numbers[:-1])) + f" and {point.numbers[-1]}"
        texts.append(f"readings {numbers} at {point.turns} turns are averaged (a re-measure at the same turns): "
                     f"the fit sees their mean, {format_quantity(point.inductance, 'H')}; each stays in the log "
                     f"(strike out a misread one with trim strike)")
    return texts


def _target_notices(log: TrimLog, latest: FitPoint, fields: dict, conditions) -> list[str]:
    """"Stop" when the coil as it is now reads within the meter tolerance of the target (both at low frequency)."""
    value = low_frequency_readings([(latest.inductance, latest.turns)], conditions)[0][0]
    target = fields["target_low_frequency_H"]
    if abs(value - target) > conditions.tolerance * target:
        return []
    text = (f"on target: {format_quantity(latest.inductance, 'H')} at {latest.turns} turns is within the "
            f"±{conditions.tolerance:.1%} meter tolerance of {format_quantity(log.target_H, 'H')}: stop here")
    if fields["turns_change"]:
        text += (f" (the fit's nearest whole number is {fields['turns']} turns, a difference the meter "
                 f"cannot confirm)")
    return [text]


def record_reading(path, inductance: float, turns: int, *, note: str | None = None,
                   time: datetime | None = None) -> tuple[TrimLog, TrimStep]:
    """Load the log, add a reading, refit, save: (the new log, the next step).

    The log is saved only when the reading is accepted and the refit succeeds.
    """
    log = add_reading(load_log(path), inductance, turns, note=note, time=time)
    step = evaluate(log)
    save_log(path, log)
    return log, step


def record_strike(path, number: int, *, why: str | None = None,
                  time: datetime | None = None) -> tuple[TrimLog, TrimStep | None]:
    """Load the log, strike out reading ``number``, refit, save: (the new log, the next step or None).

    The step is None when no reading is left to fit; the log is saved only when the refit succeeds.
    """
    log = strike_reading(load_log(path), number, why=why, time=time)
    step = evaluate(log) if fit_points(log) else None
    save_log(path, log)
    return log, step
