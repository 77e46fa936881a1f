r"""The trim log: one JSON file per coil, the readings taken while it is trimmed toward its target.

A coil is trimmed in steps: measure, remove (or add) turns, measure again. The log
keeps every reading with its time and a note, and after each one the closed-core
model is refitted to all of them (:func:`coilplan.rewind.closed_core_fit`) and the
next step is worked out by :func:`coilplan.rewind.rewind_fields`, the one place
turns to add or remove are computed:

.. math::

    L = A_L N^2 \;(+\, L_0)

(the AL value as IEC 60205 defines it, inductance per turn squared; L0 a fixed
series part for the leads, fitted with ``offset`` from two readings on).

The file is a versioned document (``"schema": "coilplan-trim-log"``, ``"version": 1``),
validated on load; a file that does not validate is refused with its name and what
is wrong, and never changed. Every write goes to a temporary file in the same
folder, is flushed and synced to disk, and then replaces the log in one step
(``os.replace``), so a crash leaves either the old log or the new one, never half
of one.

=====================  =====================  ==========================================
file field             Python                 meaning
=====================  =====================  ==========================================
``target_H``           ``TrimLog.target_H``   inductance wanted, H (as read at the
                                              operating frequency when one is given)
``tolerance``          ``Conditions``         meter accuracy per reading, relative
``readings[i]``        :class:`Reading`       one reading: inductance, turns, time, note
``coil.model``         ``"closed-core"``      the law fitted (the only one for now)
=====================  =====================  ==========================================
"""

from __future__ import annotations

import itertools
import json
import math
from dataclasses import dataclass
from datetime import UTC, datetime
from pathlib import Path
from typing import Annotated, Literal

import numpy as np
from pydantic import BaseModel, ConfigDict, Field, ValidationError, field_validator, model_validator

from coilplan._validation import first_problem
from coilplan.errors import InvalidInputError
from coilplan.files import FileWriteError, write_atomically
from coilplan.forms import ClosedCore
from coilplan.quantities import format_quantity
from coilplan.rewind import DEFAULT_TOLERANCE, Conditions, Fit, closed_core_answer, low_frequency_readings
from coilplan.wire import parse_wire

__all__ = [
    "SCHEMA",
    "VERSION",
    "Coil",
    "LogExistsError",
    "LogFileError",
    "LogWriteError",
    "Reading",
    "TrimLog",
    "TrimStep",
    "add_reading",
    "conditions_of",
    "evaluate",
    "load_log",
    "new_log",
    "record_reading",
    "save_log",
    "start_log",
    "write_atomically",
]

#: The name every trim log carries in its ``schema`` field.
SCHEMA = "coilplan-trim-log"
#: The newest log version this coilplan reads and the one it writes.
VERSION = 1

PositiveFinite = Annotated[float, Field(gt=0, allow_inf_nan=False)]


class LogFileError(InvalidInputError):
    """A trim log that cannot be used: missing, not JSON, not a trim log, or a field that does not validate.

    Parameters
    ----------
    file : str
        The log's path as given.
    problem : str
        What is wrong, in one line.
    """

    def __init__(self, file: str, problem: str):
        super().__init__(str(file), problem, None)
        self.file = str(file)
        self.problem = problem

    def __str__(self) -> str:
        return f"{self.file}: {self.problem}"


class LogExistsError(LogFileError):
    """``start`` found a file at the log's path and was not told to replace it."""


#: The name this module has always used for a failed write.
LogWriteError = FileWriteError


class _Record(BaseModel):
    model_config = ConfigDict(extra="forbid", frozen=True, allow_inf_nan=False)


class Coil(_Record):
    """What the log says about the coil: a name, the law fitted, and what the wire change needs."""

    name: str | None = None
    model: Literal["closed-core"] = "closed-core"
    offset: bool = False
    turn_length_m: PositiveFinite | None = None
    wire: str | None = None

    @field_validator("wire")
    @classmethod
    def _known_wire(cls, text: str | None) -> str | None:
        if text is not None:
            try:
                parse_wire(text, option="wire")
            except InvalidInputError as error:
                raise ValueError(f"expected {error.expected}") from None
        return text


class Reading(_Record):
    """One reading as the meter showed it: inductance at a whole number of turns, when, and a note."""

    # the unit stays in the field name, as in the --json keys; hence the N815 (mixedCase) exemptions

    inductance_H: PositiveFinite  # noqa: N815
    turns: Annotated[int, Field(ge=1)]
    time: datetime
    note: str | None = None


class TrimLog(_Record):
    """The whole log of one coil (the JSON file's content, validated)."""

    schema_: Literal["coilplan-trim-log"] = Field(SCHEMA, alias="schema")
    version: Literal[1] = VERSION
    created: datetime
    coil: Coil = Coil()
    target_H: PositiveFinite  # noqa: N815
    operating_frequency_Hz: PositiveFinite | None = None  # noqa: N815
    meter_frequency_Hz: PositiveFinite | None = None  # noqa: N815
    tolerance: Annotated[float, Field(gt=0, lt=1)] = DEFAULT_TOLERANCE
    tolerance_assumed: bool = True
    self_capacitance_F: PositiveFinite | None = None  # noqa: N815
    readings: tuple[Reading, ...] = ()

    @model_validator(mode="after")
    def _one_reading_per_turn_count(self) -> TrimLog:
        counts = [reading.turns for reading in self.readings]
        repeated = sorted({count for count in counts if counts.count(count) > 1})
        if repeated:
            raise ValueError(f"readings: one reading per turn count; repeated: {', '.join(map(str, repeated))}")
        return self


@dataclass(frozen=True)
class TrimStep:
    """The refit after the latest reading and the next step.

    Attributes
    ----------
    fields : dict
        :func:`coilplan.rewind.rewind_fields` (``turns_now``, ``turns``, ``turns_change``,
        ``turns_range`` ...) plus ``al_H``, ``offset_H`` and ``resistance_change_ohm`` where known.
    warnings : tuple of str
        The rewind's own warnings (a reading far off the fitted curve, frequency, assumed tolerance).
    notices : tuple of str
        What the log itself notices: inductance moving against the turns, the target reached.
    fit : Fit
    form : ClosedCore
        The calibrated form.
    """

    fields: dict
    warnings: tuple[str, ...]
    notices: tuple[str, ...]
    fit: Fit
    form: ClosedCore


def _now() -> datetime:
    return datetime.now(UTC).replace(microsecond=0)


def new_log(target: float, *, name: str | None = None, offset: bool = False, turn_length: float | None = None,
            wire: str | None = None, operating_frequency: float | None = None,
            meter_frequency: float | None = None, tolerance: float | None = None,
            self_capacitance: float | None = None, created: datetime | None = None) -> TrimLog:
    """A log with no readings yet (``tolerance`` None: the default, marked as assumed).

    Examples
    --------
    >>> log = new_log(100e-6, tolerance=0.02)
    >>> log.schema_, log.version, log.tolerance_assumed, log.readings
    ('coilplan-trim-log', 1, False, ())
    """
    try:
        return TrimLog(created=created or _now(),
                       coil=Coil(name=name, offset=offset, turn_length_m=turn_length, wire=wire),
                       target_H=target, operating_frequency_Hz=operating_frequency,
                       meter_frequency_Hz=meter_frequency,
                       tolerance=DEFAULT_TOLERANCE if tolerance is None else tolerance,
                       tolerance_assumed=tolerance is None, self_capacitance_F=self_capacitance)
    except ValidationError as error:
        item = error.errors(include_url=False)[0]
        raise InvalidInputError(".".join(str(part) for part in item["loc"]), item["msg"].lower(),
                                item.get("input")) from None


def add_reading(log: TrimLog, inductance: float, turns: int, *, note: str | None = None,
                time: datetime | None = None) -> TrimLog:
    """The log with one more reading (the coil as it is now); the log given is not changed.

    Raises
    ------
    InvalidInputError
        Turns below 1 or not whole, an inductance not above zero, or a turn count already read.
    """
    if isinstance(turns, bool) or not isinstance(turns, (int, np.integer)) or turns < 1:
        raise InvalidInputError("--measured", "a whole number of turns, at least 1", turns)
    if not (isinstance(inductance, (int, float, np.floating)) and math.isfinite(inductance) and inductance > 0):
        raise InvalidInputError("--measured", "an inductance above zero", inductance)
    for index, reading in enumerate(log.readings, start=1):
        if reading.turns == turns:
            raise InvalidInputError("--measured", f"a turn count not yet in the log (reading {index} is already at "
                                    f"{turns} turns: {format_quantity(reading.inductance_H, 'H')})",
                                    f"{format_quantity(inductance, 'H')}@{turns}")
    reading = Reading(inductance_H=float(inductance), turns=int(turns), time=time or _now(), note=note)
    return log.model_copy(update={"readings": (*log.readings, reading)})


def conditions_of(log: TrimLog) -> Conditions:
    """The measurement conditions the log records (turn counts are taken as exact)."""
    return Conditions(tolerance=log.tolerance, tolerance_assumed=log.tolerance_assumed,
                      meter_frequency=log.meter_frequency_Hz, operating_frequency=log.operating_frequency_Hz,
                      self_capacitance=log.self_capacitance_F)


def evaluate(log: TrimLog) -> TrimStep:
    """Refit the closed-core law to every reading and work out the next step.

    The fit is :func:`coilplan.rewind.closed_core_fit` on the readings with the
    self-capacitance effect at the meter frequency removed; the answer is
    :func:`coilplan.rewind.rewind_fields` on a :class:`~coilplan.forms.ClosedCore`
    with the fitted AL (and lead offset). A lead offset asked for is fitted from the
    second reading on, and left out (with a notice) when it comes out below zero.

    Raises
    ------
    InvalidInputError
        No readings yet.
    InfeasibleError
        The readings give no positive AL value.

    Examples
    --------
    >>> log = add_reading(new_log(100e-6, tolerance=0.02), 55e-6, 20)  # issue 4: 20 turns at 55 µH
    >>> step = evaluate(log)
    >>> step.fields["turns"], step.fields["turns_change"]
    (27, 7)
    """
    if not log.readings:
        raise InvalidInputError("readings", "at least one reading: give one with --measured L@N", None)
    conditions = conditions_of(log)
    readings = [(reading.inductance_H, reading.turns) for reading in log.readings]
    wire = parse_wire(log.coil.wire, option="wire") if log.coil.wire else None
    answer = closed_core_answer(readings, log.target_H, conditions, offset=log.coil.offset,
                                turn_length=log.coil.turn_length_m, wire=wire)
    fields, warnings_, fit, form = answer.fields, answer.warnings, answer.fit, answer.form
    notices = _direction_notices(log.readings) + list(answer.notices)
    notices += _target_notices(log, fields, conditions)
    return TrimStep(fields, tuple(warnings_), tuple(notices), fit, form)


def _direction_notices(readings) -> list[str]:
    """Consecutive readings whose inductance moved against the turns (L rises with N on any coil)."""
    texts = []
    for number, (before, after) in enumerate(itertools.pairwise(readings), start=2):
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


def _target_notices(log: TrimLog, fields: dict, conditions: Conditions) -> list[str]:
    """"Stop" when the latest reading is within the meter tolerance of the target (both at low frequency)."""
    latest = log.readings[-1]
    value = low_frequency_readings([(latest.inductance_H, latest.turns)], conditions)[0][0]
    target = fields["target_low_frequency_H"]
    if abs(value - target) > conditions.tolerance * target:
        return []
    text = (f"on target: {format_quantity(latest.inductance_H, 'H')} at {latest.turns} turns is within the "
            f"±{conditions.tolerance:.1%} meter tolerance of {format_quantity(log.target_H, 'H')}: stop here")
    if fields["turns_change"]:
        text += (f" (the fit's nearest whole number is {fields['turns']} turns, a difference the meter "
                 f"cannot confirm)")
    return [text]


# --- the file ----------------------------------------------------------------------------------


def _problem(error: ValidationError) -> str:
    """The first validation problem as 'field: message (got value)'; the count of any others."""
    problem = first_problem(error)
    where = ".".join(str(part) for part in problem.location) or "the document"
    return f"{where}: {problem.message}{problem.got}{problem.more}"


def load_log(path) -> TrimLog:
    """Read and validate a trim log; the file is only read.

    Raises
    ------
    LogFileError
        No such file, not UTF-8 JSON, not a trim log, written by a newer coilplan, or a field
        that does not validate (named, with the value found).
    """
    path = Path(path)
    try:
        raw = path.read_bytes()
    except FileNotFoundError:
        raise LogFileError(path, "no trim log there (start one with: coilplan trim start)") from None
    except IsADirectoryError:
        raise LogFileError(path, "is a folder, not a trim log") from None
    except OSError as error:
        raise LogFileError(path, f"cannot read it ({error.strerror or error})") from None
    try:
        document = json.loads(raw.decode("utf-8"))
    except UnicodeDecodeError:
        raise LogFileError(path, "not a trim log (not UTF-8 text)") from None
    except json.JSONDecodeError as error:
        raise LogFileError(path, f"not a trim log: broken JSON at line {error.lineno} column {error.colno} "
                                 f"({error.msg}); was it cut short?") from None
    if not isinstance(document, dict) or document.get("schema") != SCHEMA:
        found = document.get("schema") if isinstance(document, dict) else type(document).__name__
        raise LogFileError(path, f"not a coilplan trim log (expected \"schema\": \"{SCHEMA}\"; found {found!r})")
    version = document.get("version")
    if isinstance(version, bool) or not isinstance(version, int) or version < 1:
        raise LogFileError(path, f"version: expected a whole number from 1 (found {version!r})")
    if version > VERSION:
        raise LogFileError(path, f"written by a newer coilplan (log version {version}; this one reads up to "
                                 f"{VERSION}): update coilplan to read it")
    try:
        return TrimLog.model_validate_json(raw, strict=True)
    except ValidationError as error:
        raise LogFileError(path, _problem(error)) from None


def _document(log: TrimLog) -> bytes:
    return (json.dumps(log.model_dump(mode="json", by_alias=True), indent=2, ensure_ascii=False,
                       allow_nan=False) + "\n").encode("utf-8")


def save_log(path, log: TrimLog) -> None:
    """Write the log atomically over ``path`` (see :func:`write_atomically`)."""
    write_atomically(path, _document(log))


def start_log(path, log: TrimLog, *, force: bool = False) -> None:
    """Write a new log; refuse when anything is at ``path`` unless ``force`` (then replace it atomically).

    Raises
    ------
    LogExistsError
        Something is already at ``path`` and ``force`` is false.
    """
    path = Path(path)
    if path.is_dir():
        raise LogFileError(path, "is a folder: give a file name for the trim log")
    if path.exists() and not force:
        raise LogExistsError(path, "a file is already there: give --force to start the log over (it will be "
                                   "replaced), or choose another name")
    save_log(path, log)


def record_reading(path, inductance: float, turns: int, *, note: str | None = None,
                   time: datetime | None = None) -> tuple[TrimLog, TrimStep]:
    """Load the log, add a reading, refit, save: (the new log, the next step).

    The log is saved only when the reading is accepted and the refit succeeds.
    """
    log = add_reading(load_log(path), inductance, turns, note=note, time=time)
    step = evaluate(log)
    save_log(path, log)
    return log, step

