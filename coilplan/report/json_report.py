"""The ``--json`` document: one object ``{command, inputs, result, warnings, cautions}``.

Quantities are in SI base units with the unit in the key (``inductance_H``,
``length_m``); counts are plain (``turns``). NaN and infinity are never
written: a value that is not defined is ``null``.
"""

from __future__ import annotations

import json
import math
from collections.abc import Mapping, Sequence
from typing import Any

__all__ = ["clean", "json_document"]


def clean(value: Any) -> Any:
    """Plain JSON types: numpy scalars to Python, non-finite floats to None."""
    if isinstance(value, Mapping):
        return {str(key): clean(item) for key, item in value.items()}
    if isinstance(value, (list, tuple)):
        return [clean(item) for item in value]
    if hasattr(value, "tolist") and not isinstance(value, (str, bytes)):
        return clean(value.tolist())
    if isinstance(value, bool) or value is None or isinstance(value, (int, str)):
        return value
    if isinstance(value, float):
        return value if math.isfinite(value) else None
    raise TypeError(f"cannot write {type(value).__name__} to JSON")


def json_document(command: str, inputs: Mapping[str, Any], result: Mapping[str, Any] | None,
                  warnings: Sequence[str] = (), cautions: Sequence[str] = (),
                  error: Mapping[str, Any] | None = None) -> str:
    """Serialise one command's answer as the ``--json`` object (indented, keys in the order given).

    A coil's answer (:data:`coilplan.answer.FORM_COMMANDS`) is written in its parts
    (:func:`coilplan.answer.parts_of`); every document names the schema it follows. A request that
    cannot be done has no result (``null``) and says why in ``error``.

    Examples
    --------
    >>> print(json_document("wire", {"wire": "24awg"}, {"diameter_m": 0.000510559}))
    {
      "schema": {
        "name": "coilplan-output",
        "version": 2
      },
      "command": "wire",
      "inputs": {
        "wire": "24awg"
      },
      "result": {
        "diameter_m": 0.000510559
      },
      "warnings": [],
      "cautions": []
    }
    """
    from coilplan.answer import FORM_COMMANDS, SCHEMA_NAME, SCHEMA_VERSION, parts_of

    if command in FORM_COMMANDS and result is not None:
        result = parts_of(result)
    document = {
        "schema": {"name": SCHEMA_NAME, "version": SCHEMA_VERSION},
        "command": command,
        "inputs": clean(dict(inputs)),
        "result": None if result is None else clean(dict(result)),
        "warnings": [str(text) for text in warnings],
        "cautions": [str(text) for text in cautions],
    }
    if error is not None:
        document["error"] = clean(dict(error))
    return json.dumps(document, indent=2, ensure_ascii=False, allow_nan=False)
