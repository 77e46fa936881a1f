"""Loader for the CSV tables in ``core_data/``.

Each table is plain text: ``#`` lines are comments (the first ones name the
standard or source and its edition), the first other line is the header, and
every row carries a ``source`` column. A table is read once per process
(:func:`functools.cache`) and each row is validated by a row model; a bad row
raises :class:`~coilplan.errors.DataFileError` naming the file, the 1-based
line and the column.

A row model is either a pydantic model or a frozen dataclass whose fields
carry their rules as metadata (``gt``, ``ge``, ``lt``, ``pattern``,
``choices``, ``min_length``). The dataclass form serves the tables every
command reads (the wire tables): pydantic takes longer to import than the rest
of a plain solve, so the start-up path does without it.

The tables live in the repository's ``core_data/`` folder. An installed
package carries them as ``coilplan.core_data`` (pyproject.toml maps the
folder into the wheel); a source checkout has no such subpackage, so the
loader falls back to ``core_data/`` beside the package folder.
"""

from __future__ import annotations

import csv
import dataclasses
import functools
import importlib.resources
import math
import re
import types
import typing
from pathlib import Path
from typing import TypeVar

from coilplan.errors import DataFileError

__all__ = ["RowError", "load_table", "parse_table", "read_data_text", "rule"]

Row = TypeVar("Row")


class RowError(ValueError):
    """Raised by a dataclass row's ``__post_init__`` for a rule across columns."""

    def __init__(self, column: str, problem: str):
        super().__init__(column, problem)
        self.column = column
        self.problem = problem


def rule(default=dataclasses.MISSING, **checks):
    """A dataclass field with validation rules, e.g. ``rule(gt=0, lt=1)`` or ``rule(None, gt=0)``."""
    return dataclasses.field(default=default, metadata=checks)


def _field_types(row_model) -> dict[str, tuple[type, bool]]:
    """Column name -> (value type, may be empty) for a dataclass row model."""
    hints = typing.get_type_hints(row_model)
    result = {}
    for item in dataclasses.fields(row_model):
        hint = hints[item.name]
        optional = False
        if isinstance(hint, types.UnionType) or typing.get_origin(hint) is typing.Union:
            arguments = [a for a in typing.get_args(hint) if a is not type(None)]
            optional = len(arguments) < len(typing.get_args(hint))
            hint = arguments[0]
        result[item.name] = (hint, optional)
    return result


def _cell(value: str | None, kind: type, optional: bool, checks: dict):
    """One cell converted and checked; ValueError with the reason."""
    if value is None:
        if optional:
            return None
        raise ValueError("a value is required")
    if kind is float:
        try:
            number = float(value)
        except ValueError:
            raise ValueError("expected a number") from None
        if not math.isfinite(number):
            raise ValueError("expected a finite number")
        for name, test, word in (("gt", number.__gt__, "above"), ("ge", number.__ge__, "at least"),
                                 ("lt", number.__lt__, "below")):
            if name in checks and not test(checks[name]):
                raise ValueError(f"expected a number {word} {checks[name]:g}")
        return number
    text = str(value)
    if len(text) < checks.get("min_length", 0):
        raise ValueError(f"expected at least {checks['min_length']} characters")
    if "pattern" in checks and not re.fullmatch(checks["pattern"], text):
        raise ValueError("does not match the expected form")
    if "choices" in checks and text not in checks["choices"]:
        raise ValueError(f"expected one of {', '.join(checks['choices'])}")
    return text


def _dataclass_row(row_model, record: dict, file_name: str, number: int):
    types_ = _field_types(row_model)
    values = {}
    for item in dataclasses.fields(row_model):
        if item.name not in record:
            continue
        kind, optional = types_[item.name]
        try:
            values[item.name] = _cell(record[item.name], kind, optional, dict(item.metadata))
        except ValueError as error:
            raise DataFileError(file_name, number, item.name,
                                f"{error} (got {record[item.name]!r})") from None
    try:
        return row_model(**values)
    except RowError as error:
        raise DataFileError(file_name, number, error.column, error.problem) from None


def _columns(row_model) -> dict[str, bool]:
    """Column name -> required, for either kind of row model."""
    if dataclasses.is_dataclass(row_model):
        return {item.name: item.default is dataclasses.MISSING and item.default_factory is dataclasses.MISSING
                for item in dataclasses.fields(row_model)}
    return {name: field.is_required() for name, field in row_model.model_fields.items()}

_CHECKOUT_DATA = Path(__file__).resolve().parent.parent / "core_data"


def read_data_text(file_name: str) -> str:
    """The text of one ``core_data/`` file, from the installed package or the checkout.

    Raises
    ------
    DataFileError
        The file is in neither place.
    """
    try:
        resource = importlib.resources.files("coilplan.core_data") / file_name
        if resource.is_file():
            return resource.read_text(encoding="utf-8")
    except ModuleNotFoundError:  # a source checkout: coilplan/core_data does not exist
        pass
    path = _CHECKOUT_DATA / file_name
    if path.is_file():
        return path.read_text(encoding="utf-8")
    raise DataFileError(file_name, 0, "(file)", "not found in coilplan.core_data or "
                        f"{_CHECKOUT_DATA}")


def parse_table(text: str, file_name: str, row_model: type[Row]) -> tuple[Row, ...]:
    """Validate the rows of one CSV table against ``row_model``.

    Blank cells become ``None`` (so a field typed ``float | None`` may be left
    empty); lines starting with ``#`` and blank lines are skipped.

    Parameters
    ----------
    text : str
        The file's text.
    file_name : str
        The name used in error messages.
    row_model : dataclass type or pydantic model
        One row; its field names are the column names.

    Returns
    -------
    tuple of row_model
        The rows in file order.

    Raises
    ------
    DataFileError
        A missing or unknown column, a row with the wrong number of cells, or a
        cell that does not validate.

    Examples
    --------
    >>> @dataclasses.dataclass(frozen=True)
    ... class Point:
    ...     x_mm: float = rule(gt=0)
    ...     source: str = rule(min_length=1)
    >>> parse_table("# demo\\nx_mm,source\\n1.5,invented\\n", "demo.csv", Point)
    (Point(x_mm=1.5, source='invented'),)
    """
    lines = [(number, line) for number, line in enumerate(text.splitlines(), start=1)
             if line.strip() and not line.lstrip().startswith("#")]
    if not lines:
        raise DataFileError(file_name, 1, "(header)", "the file has no header line")
    header_number, header_line = lines[0]
    header = [cell.strip() for cell in next(csv.reader([header_line]))]
    fields = _columns(row_model)
    for name in header:
        if name not in fields:
            raise DataFileError(file_name, header_number, name,
                                f"unknown column; expected {', '.join(fields)}")
    for name, required in fields.items():
        if required and name not in header:
            raise DataFileError(file_name, header_number, name, "required column is missing")
    rows = []
    for number, line in lines[1:]:
        cells = [cell.strip() for cell in next(csv.reader([line]))]
        if len(cells) != len(header):
            raise DataFileError(file_name, number, "(row)",
                                f"{len(cells)} cells, but the header has {len(header)}")
        record = {name: (cell if cell != "" else None)
                  for name, cell in zip(header, cells, strict=True)}
        if dataclasses.is_dataclass(row_model):
            rows.append(_dataclass_row(row_model, record, file_name, number))
            continue
        import pydantic  # only for pydantic row models, off the start-up path

        try:
            rows.append(row_model.model_validate(record))
        except pydantic.ValidationError as error:
            first = error.errors(include_url=False)[0]
            column = str(first["loc"][0]) if first["loc"] else "(row)"
            shown = record.get(column)
            raise DataFileError(file_name, number, column,
                                f"{first['msg']} (got {shown!r})") from None
    return tuple(rows)


@functools.cache
def load_table(file_name: str, row_model: type[Row]) -> tuple[Row, ...]:
    """Read and validate one ``core_data/`` CSV table, once per process.

    Parameters
    ----------
    file_name : str
        File name inside ``core_data/``, e.g. ``"swg.csv"``.
    row_model : dataclass type or pydantic model
        The model of one row (see :func:`parse_table`).

    Returns
    -------
    tuple of row_model

    Raises
    ------
    DataFileError
        The file is missing or a row does not validate.

    Examples
    --------
    >>> @dataclasses.dataclass(frozen=True)
    ... class GaugeRow:
    ...     gauge: str
    ...     diameter_in: float = rule(gt=0)
    ...     source: str = rule(min_length=1)
    >>> rows = load_table("swg.csv", GaugeRow)
    >>> rows[0].gauge, rows[0].diameter_in, rows[-1].gauge
    ('7/0', 0.5, '50')
    """
    return parse_table(read_data_text(file_name), file_name, row_model)
