"""Loader for the CSV tables in ``core_data/``.

Each table is plain text: ``#`` lines are comments (the first ones name the
standard or source and its edition), the first other line is the header, and
every row carries a ``source`` column. A table is read once per process
(:func:`functools.cache`) and each row is validated by a pydantic row model;
a bad row raises :class:`~coilplan.errors.DataFileError` naming the file, the
1-based line and the column.

The tables live in the repository's ``core_data/`` folder. An installed
package carries them as ``coilplan.core_data`` (pyproject.toml maps the
folder into the wheel); a source checkout has no such subpackage, so the
loader falls back to ``core_data/`` beside the package folder.
"""

from __future__ import annotations

import csv
import functools
import importlib.resources
from pathlib import Path
from typing import TypeVar

import pydantic

from coilplan.errors import DataFileError

__all__ = ["load_table", "parse_table", "read_data_text"]

Row = TypeVar("Row", bound=pydantic.BaseModel)

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
    row_model : type of pydantic.BaseModel
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
    >>> class Point(pydantic.BaseModel):
    ...     x_mm: float
    ...     source: str
    >>> parse_table("# demo\\nx_mm,source\\n1.5,invented\\n", "demo.csv", Point)
    (Point(x_mm=1.5, source='invented'),)
    """
    lines = [(number, line) for number, line in enumerate(text.splitlines(), start=1)
             if line.strip() and not line.lstrip().startswith("#")]
    if not lines:
        raise DataFileError(file_name, 1, "(header)", "the file has no header line")
    header_number, header_line = lines[0]
    header = [cell.strip() for cell in next(csv.reader([header_line]))]
    fields = row_model.model_fields
    for name in header:
        if name not in fields:
            raise DataFileError(file_name, header_number, name,
                                f"unknown column; expected {', '.join(fields)}")
    for name, field in fields.items():
        if field.is_required() and name not in header:
            raise DataFileError(file_name, header_number, name, "required column is missing")
    rows = []
    for number, line in lines[1:]:
        cells = [cell.strip() for cell in next(csv.reader([line]))]
        if len(cells) != len(header):
            raise DataFileError(file_name, number, "(row)",
                                f"{len(cells)} cells, but the header has {len(header)}")
        record = {name: (cell if cell != "" else None)
                  for name, cell in zip(header, cells, strict=True)}
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
    row_model : type of pydantic.BaseModel
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
    >>> class GaugeRow(pydantic.BaseModel):
    ...     gauge: str
    ...     diameter_in: float
    ...     source: str
    >>> rows = load_table("swg.csv", GaugeRow)
    >>> rows[0].gauge, rows[0].diameter_in, rows[-1].gauge
    ('7/0', 0.5, '50')
    """
    return parse_table(read_data_text(file_name), file_name, row_model)
