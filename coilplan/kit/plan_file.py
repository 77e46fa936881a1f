"""Reading a kit plan file: TOML parsed, validated into :class:`~coilplan.kit.plan.Plan`, problems placed.

A plan that does not validate is refused with one line naming the file, the line where it can be found,
the entry (``coil[2] 'osc-7M'``, counted from 1 as the file reads) and the field, with the text the
user wrote.
"""

from __future__ import annotations

import re
import tomllib
from pathlib import Path

from pydantic import ValidationError

from coilplan._validation import first_problem
from coilplan.kit.plan import Plan, PlanFileError, _line_of

__all__ = ["load_plan", "parse_plan"]


def _entry(document: dict, loc: tuple) -> tuple[str, str | None, int | None, str | None]:
    """(entry label, table, index, field) of a pydantic error location."""
    if not loc:
        return "the plan", None, None, None
    table = str(loc[0])
    if len(loc) >= 2 and isinstance(loc[1], int):
        index = loc[1]
        raw = document.get(table, [])
        name = raw[index].get("name") if index < len(raw) and isinstance(raw[index], dict) else None
        label = f"{table}[{index + 1}]" + (f" {name!r}" if isinstance(name, str) else "")
        field = str(loc[2]) if len(loc) > 2 else None
        return label, table, index, field
    field = str(loc[1]) if len(loc) > 1 else None
    return table, table, None, field


def _problem(file: str, text: str, document: dict, error: ValidationError) -> PlanFileError:
    found = first_problem(error)
    label, table, index, field = _entry(document, found.location)
    message = found.message
    field_named = field is not None and not message.startswith(f"{field}:")
    if field is None and ":" in message.split(" ", 1)[0]:  # a model check names its own field
        field = message.split(":", 1)[0]
    where = f"{label}: {field}: " if field_named else f"{label}: "
    problem = where + message + found.got + found.more
    line = _line_of(text, table, index, field) if table is not None else None
    return PlanFileError(file, problem, line)


def parse_plan(text: str, file: str = "plan") -> Plan:
    """Validate a plan given as TOML text; ``file`` is the name the errors give.

    Raises
    ------
    PlanFileError
        Not TOML (with tomllib's line and column), or an entry that does not validate.

    Examples
    --------
    >>> plan = parse_plan('''
    ... [[coil]]
    ... name = "bfo"
    ... count = 2
    ... target = "10uH"
    ... [[former]]
    ... diameter = "12mm"
    ... length = "40mm"
    ... count = 3
    ... [[reel]]
    ... wire = "26awg"
    ... length = "30m"
    ... ''')
    >>> plan.coil[0].target, plan.former[0].diameter, plan.settings.packing
    (1e-05, 0.012, 0.9)
    """
    try:
        document = tomllib.loads(text)
    except tomllib.TOMLDecodeError as error:
        match = re.search(r"\(at line (\d+), column \d+\)", str(error))
        line = int(match.group(1)) if match else None
        reason = re.sub(r"\s*\(at line \d+, column \d+\)", "", str(error))
        raise PlanFileError(file, f"not a TOML plan: {reason[0].lower()}{reason[1:]}", line) from None
    try:
        plan = Plan.model_validate(document)
    except ValidationError as error:
        raise _problem(file, text, document, error) from None
    plan._file, plan._text = str(file), text
    return plan


def load_plan(path) -> Plan:
    """Read and validate the plan file at ``path`` (only read, never written).

    Raises
    ------
    PlanFileError
        No such file, not UTF-8, not TOML, or an entry that does not validate.
    """
    path = Path(path)
    try:
        text = path.read_bytes().decode("utf-8")
    except FileNotFoundError:
        raise PlanFileError(path, "no plan file there") from None
    except IsADirectoryError:
        raise PlanFileError(path, "is a folder, not a plan file") from None
    except UnicodeDecodeError:
        raise PlanFileError(path, "not a plan file (not UTF-8 text)") from None
    except OSError as error:
        raise PlanFileError(path, f"cannot read it ({error.strerror or error})") from None
    return parse_plan(text, str(path))
