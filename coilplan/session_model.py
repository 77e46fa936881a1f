r"""The trim log's file model: a versioned JSON document, one per coil, validated by pydantic.

The file is a versioned document (``"schema": "coilplan-trim-log"``, ``"version": 2``), validated on
load (:mod:`coilplan.session_file`); the steps that change it are in :mod:`coilplan.session`.

=====================  =======================  ==========================================
file field             Python                   meaning
=====================  =======================  ==========================================
``target_H``           ``TrimLog.target_H``     inductance wanted, H (as read at the
                                                operating frequency when one is given)
``tolerance``          ``TrimLog.tolerance``    meter accuracy per reading, relative
``readings[i]``        :class:`Reading`         one reading: inductance, turns, time, note,
                                                and ``struck`` (when and why) if struck out
``coil``               :class:`ClosedCoreCoil`  ``"model": "closed-core"``: name, ``offset``,
                                                ``turn_length_m``, ``wire``
``coil``               :class:`FormCoil`        ``"model": "form"``: name, ``command``,
                                                ``arguments`` (a form command's own options)
=====================  =======================  ==========================================
"""

from __future__ import annotations

from datetime import datetime
from typing import Annotated, Literal

from pydantic import BaseModel, ConfigDict, Field, field_validator

from coilplan.errors import InvalidInputError
from coilplan.files import FileWriteError
from coilplan.request import DEFAULT_TOLERANCE
from coilplan.wire import parse_wire

__all__ = [
    "SCHEMA",
    "VERSION",
    "ClosedCoreCoil",
    "Coil",
    "FormCoil",
    "LogExistsError",
    "LogFileError",
    "LogWriteError",
    "Reading",
    "Struck",
    "TrimLog",
]

#: The name every trim log carries in its ``schema`` field.
SCHEMA = "coilplan-trim-log"
#: The newest log version this coilplan reads and the one it writes.
VERSION = 2

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


class ClosedCoreCoil(_Record):
    """A closed core of unknown geometry: a name, the lead offset, and what the wire change needs."""

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

    @property
    def text(self) -> str:
        return "closed core"


class FormCoil(_Record):
    """A form command's coil: the command's name and its arguments, e.g. ``solenoid --former 25mm --wire 0.5mm``."""

    name: str | None = None
    model: Literal["form"] = "form"
    command: str
    arguments: tuple[str, ...] = ()

    @property
    def text(self) -> str:
        import shlex

        return shlex.join([self.command, *self.arguments])


#: What the log says about the coil (told apart by ``model``).
Coil = Annotated[ClosedCoreCoil | FormCoil, Field(discriminator="model")]


class Struck(_Record):
    """When a reading was struck out, and why."""

    time: datetime
    why: str | None = None


class Reading(_Record):
    """One reading as the meter showed it: inductance at a whole number of turns, when, a note; struck or not."""

    # the unit stays in the field name, as in the --json keys; hence the N815 (mixedCase) exemptions

    inductance_H: PositiveFinite  # noqa: N815
    turns: Annotated[int, Field(ge=1)]
    time: datetime
    note: str | None = None
    struck: Struck | None = None


class TrimLog(_Record):
    """The whole log of one coil (the JSON file's content, validated)."""

    schema_: Literal["coilplan-trim-log"] = Field(SCHEMA, alias="schema")
    version: Literal[1, 2] = VERSION
    created: datetime
    coil: Coil = ClosedCoreCoil()
    target_H: PositiveFinite  # noqa: N815
    operating_frequency_Hz: PositiveFinite | None = None  # noqa: N815
    meter_frequency_Hz: PositiveFinite | None = None  # noqa: N815
    tolerance: Annotated[float, Field(gt=0, lt=1)] = DEFAULT_TOLERANCE
    tolerance_assumed: bool = True
    self_capacitance_F: PositiveFinite | None = None  # noqa: N815
    readings: tuple[Reading, ...] = ()
