"""What a trim log's coil stands for: the uncalibrated form and the request :func:`coilplan.pipeline.design` takes.

A closed core of unknown geometry is the bare law :class:`~coilplan.forms.ClosedCore`; a form command's coil
is read by that command's own parser (:mod:`coilplan.cli.coil_text`).
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

from coilplan.forms import ClosedCore
from coilplan.request import Reading as MeterReading
from coilplan.request import Request
from coilplan.session_model import ClosedCoreCoil, FormCoil
from coilplan.wire import parse_wire

__all__ = ["coil_of"]


@dataclass(frozen=True)
class _BareCore:
    """A closed core of unknown geometry as the log describes it: the form and the request it makes."""

    coil: ClosedCoreCoil

    def request(self, *, target: float, frequency: float | None = None, meter_frequency: float | None = None,
                tolerance: float | None = None, self_capacitance: float | None = None,
                readings: Sequence[tuple[float, int]] = ()) -> Request:
        return Request(target=target, frequency=frequency, meter_frequency=meter_frequency, tolerance=tolerance,
                       self_capacitance=self_capacitance,
                       readings=tuple(MeterReading(value, turns) for value, turns in readings))

    def form_and_request(self, **fields):
        wire = parse_wire(self.coil.wire, option="wire") if self.coil.wire else None
        form = ClosedCore(turn_length=self.coil.turn_length_m, wire=wire, fit_offset=self.coil.offset)
        return form, self.request(**fields)


def coil_of(coil: ClosedCoreCoil | FormCoil):
    """What the log's coil stands for: an object whose ``form_and_request(target=..., readings=...)`` gives the
    uncalibrated form and the :class:`~coilplan.request.Request` for :func:`coilplan.pipeline.design`, and whose
    ``request(...)`` gives the request alone (the same keywords).

    A form command's coil is read by that command's own parser (:func:`coilplan.cli.coil_text.parse_coil`):
    the description is the command's, so it is the command that reads it (imported only for such a log).

    Raises
    ------
    InvalidInputError
        A description its command refuses (:class:`coilplan.cli.coil_text.CoilTextError`).
    """
    if isinstance(coil, ClosedCoreCoil):
        return _BareCore(coil)
    from coilplan.cli.coil_text import parse_coil

    return parse_coil(coil.command, coil.arguments)
