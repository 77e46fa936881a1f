"""What the forms share about their winding: the same form wound otherwise, and a core's level set by readings."""

from __future__ import annotations

import dataclasses
from typing import Any, ClassVar

from coilplan.errors import InvalidInputError

__all__ = ["CoreLaw", "Rewindable"]


class Rewindable:
    """A form that can be wound with another wire, pitch or length (a test winding before the real one).

    A form names the fields that hold its pitch and its fixed winding length (None where it has no
    such choice); an unstated pitch and length mean close wound with the test winding's own wire.
    """

    _pitch_field: ClassVar[str | None] = None
    _length_field: ClassVar[str | None] = None

    wire: Any

    def with_winding(self, *, wire: Any = None, pitch: float | None = None,
                     winding_length: float | None = None) -> Any:
        """This form wound with ``wire`` (default its own) at ``pitch`` or over ``winding_length``."""
        changes = {"wire": self.wire if wire is None else wire}
        for field_name, value, what in ((self._pitch_field, pitch, "pitch"),
                                        (self._length_field, winding_length, "winding length")):
            if field_name is not None:
                changes[field_name] = value
            elif value is not None:
                raise InvalidInputError("readings", f"a test winding without a {what}: this form sets it itself",
                                        None)
        return dataclasses.replace(self, **changes)  # type: ignore[type-var]


class CoreLaw:
    """A closed-core form, L = AL·N²: readings set its AL value (:mod:`coilplan.calibrate`)."""

    calibration: ClassVar[str] = "al"
    #: the field that stays unknown until readings set it (named when there are none)
    permeability_field: ClassVar[str] = "mu_r"

    al: float | None

    def with_al(self, al: float, offset: float = 0.0) -> Any:
        """This form with the AL value the readings gave (a lead offset is the bare core law's alone)."""
        return dataclasses.replace(self, al=al)  # type: ignore[type-var]

    @property
    def permeability_unknown(self) -> bool:
        """True while neither an AL value nor a permeability is known: only readings can set it."""
        return self.al is None and getattr(self, "mu_r", None) is None
