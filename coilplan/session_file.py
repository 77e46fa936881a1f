"""Reading and writing a trim log: validation on load, version 1 read as version 2, atomic writes.

A file that does not validate is refused with its name and what is wrong, and never changed. Version-1 logs
(closed cores, one reading per turn count, nothing struck) are read as they are and written as version 2
when next changed. Every write goes to a temporary file in the same folder, is flushed and synced to disk,
and then replaces the log in one step (``os.replace``), so a crash leaves either the old log or the new one,
never half of one. The document's fields are in :mod:`coilplan.session_model`.
"""

from __future__ import annotations

import json
from pathlib import Path

from pydantic import ValidationError

from coilplan._validation import first_problem
from coilplan.errors import InvalidInputError
from coilplan.files import write_atomically
from coilplan.session_coil import coil_of
from coilplan.session_model import SCHEMA, VERSION, ClosedCoreCoil, FormCoil, LogExistsError, LogFileError, TrimLog

__all__ = ["load_log", "save_log", "start_log"]


def _where(location) -> str:
    """A pydantic location as the file's field path (``coil.wire``: the coil's kind, a union tag, left out)."""
    parts = [str(part) for index, part in enumerate(location)
             if not (index and location[index - 1] == "coil" and part in ("closed-core", "form"))]
    return ".".join(parts)


def _problem(error: ValidationError) -> str:
    """The first validation problem as 'field: message (got value)'; the count of any others."""
    problem = first_problem(error)
    where = _where(problem.location) or "the document"
    return f"{where}: {problem.message}{problem.got}{problem.more}"


def load_log(path) -> TrimLog:
    """Read and validate a trim log; the file is only read.

    A version-1 log is read as it is and comes back as version 2 (written so when next saved). A form
    command's coil is checked by that command's parser (:func:`coil_of`).

    Raises
    ------
    LogFileError
        No such file, not UTF-8 JSON, not a trim log, written by a newer coilplan, a field that does not
        validate (named, with the value found), or a coil description its command refuses.
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
        log = TrimLog.model_validate_json(raw, strict=True)
    except ValidationError as error:
        raise LogFileError(path, _problem(error)) from None
    if log.version == 1:
        _check_version_1(path, log)
        log = log.model_copy(update={"version": VERSION})
    if isinstance(log.coil, FormCoil):
        try:
            coil_of(log.coil)
        except InvalidInputError as error:
            raise LogFileError(path, f"coil: {getattr(error, 'problem', error)}") from None
    return log


def _check_version_1(path, log: TrimLog) -> None:
    """A version-1 log knew closed cores only, one reading per turn count, and nothing struck out."""
    if not isinstance(log.coil, ClosedCoreCoil):
        raise LogFileError(path, "coil.model: a version-1 log holds a closed core only (a form's coil needs "
                                 "version 2)")
    seen = set()
    for index, reading in enumerate(log.readings):
        if reading.struck is not None:
            raise LogFileError(path, f"readings.{index}.struck: not in a version-1 log (needs version 2)")
        if reading.turns in seen:
            raise LogFileError(path, f"readings.{index}.turns: one reading per turn count in a version-1 log "
                                     f"(repeated: {reading.turns})")
        seen.add(reading.turns)


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
