"""The library's field names as the plan file's keys: the one map between the two.

The library raises :class:`~coilplan.errors.InvalidInputError` naming its own field (``readings``,
``meter_frequency``, ``former_diameter``); a kit error names the plan-file key that holds the value, with
the file, the line and the entry (:meth:`coilplan.kit.plan.Plan.problem_at`). Most fields have one key in
every table (:data:`PLAN_KEYS`); where a table keeps a field under a key of its own, :data:`TABLE_KEYS` says
which. A dotted key (``settings.lead``) is a setting, the same for every entry.
"""

from __future__ import annotations

from coilplan.errors import InvalidInputError

__all__ = ["PLAN_KEYS", "TABLE_KEYS", "in_plan_words", "plan_key"]

#: field of the library -> the plan-file key that sets it
PLAN_KEYS = {
    # the settings every entry is wound with
    "meter_frequency": "settings.meter_frequency",
    "temperature": "settings.temperature",
    "lead": "settings.lead",
    "packing": "settings.packing",
    "pitch": "settings.packing",
    # a coil wanted
    "target": "target",
    "tolerance": "tolerance",
    "frequency": "at",
    "dc_current": "current",
    # the stock: its core and its size
    "readings": "measured",
    "wire": "wire",
    "grade": "grade",
    "material": "material",
    "mu_r": "mu",
    "mu_initial": "mu",
    "al": "al",
    "gap": "gap",
    "ae": "ae",
    "le": "le",
    "window_width": "window_width",
    "window_depth": "window_depth",
    "inner_diameter": "id",
    "outer_diameter": "od",
    "height": "height",
    "rod_length": "length",
    "rod_diameter": "diameter",
    "diameter": "diameter",
    "max_length": "length",
    "width": "width",
    "max_depth": "depth",
    "style": "style",
}

#: table -> the fields its entries keep under a key of their own (over :data:`PLAN_KEYS`)
TABLE_KEYS = {
    "rod": {"wire": "measured_wire", "grade": "measured_grade", "former_diameter": "former"},
    "bobbin": {"former_diameter": "diameter"},
}


def plan_key(field: str, table: str) -> str:
    """The plan-file key that sets ``field`` in an entry of ``table`` (the field itself where none does).

    >>> plan_key("readings", "rod"), plan_key("wire", "rod"), plan_key("wire", "reel")
    ('measured', 'measured_wire', 'wire')
    >>> plan_key("meter_frequency", "rod")
    'settings.meter_frequency'
    """
    return TABLE_KEYS.get(table, {}).get(field) or PLAN_KEYS.get(field, field)


def in_plan_words(error: InvalidInputError, plan, table: str, index: int):
    """The library's ``error`` on the ``index``-th entry of ``table``, as a plan-file problem naming its key."""
    problem = f"expected {error.expected}"
    if error.got is not None:
        shown = str(error.got)
        problem += f" (got {shown[:37] + '...' if len(shown) > 40 else shown!r})"
    return plan.problem_at(table, index, plan_key(error.option, table), problem)
