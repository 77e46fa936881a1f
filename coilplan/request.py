"""What is asked of a coil: one validated request that every entry (commands, trim log, kit, Python) fills in.

A request says what is wanted (a turn count, a target inductance, or resonance with a capacitor), where
the coil will work (the operating frequency, the drive), and what the meter showed on it (readings, each
with its own turns and, where the test winding differs from the planned one, its own wire, pitch or
winding length). It names its fields in the library's words (``target``, ``readings``); the command line
and the kit map their options and plan-file keys onto them in one place each.

Examples
--------
>>> request = Request(target=10e-6, frequency=7.1e6, readings=(Reading(8.2e-6, 20),))
>>> request.wanted_inductance, request.operating_frequency
(1e-05, 7100000.0)
"""

from __future__ import annotations

import math
import operator
from dataclasses import dataclass, field
from typing import Any

from coilplan.errors import InvalidInputError
from coilplan.wire import Wire

__all__ = ["DEFAULT_TOLERANCE", "CoreFacts", "Drive", "Reading", "Request"]

#: Meter accuracy assumed when none is given: ±1 % of reading, typical of a bench LCR meter's basic
#: accuracy at its test frequency (common practice, no source).
DEFAULT_TOLERANCE = 0.01


def _whole(value: Any, name: str, what: str) -> int | None:
    """A whole number (a numpy integer too) of at least one, or None."""
    if value is None:
        return None
    try:
        count = operator.index(value)
    except TypeError:
        raise InvalidInputError(name, what, value) from None
    if count < 1:
        raise InvalidInputError(name, what, value)
    return count


def _finite_positive(value: Any, name: str, what: str) -> None:
    if value is not None and not (isinstance(value, (int, float)) and math.isfinite(value) and value > 0):
        raise InvalidInputError(name, what, value)


@dataclass(frozen=True)
class Reading:
    """One reading of the meter on the coil or a test winding.

    Parameters
    ----------
    inductance : float
        What the meter showed, H (at its test frequency: the apparent inductance there).
    turns : int
        The turns wound when it was read.
    wire : Wire, optional
        The test winding's wire, where it is not the planned coil's.
    pitch : float, optional
        The test winding's pitch (turn centre to centre), m, where it differs.
    winding_length : float, optional
        The test winding's length end to end, m, where its turns were spread over a fixed length.
    """

    inductance: float
    turns: int
    wire: Wire | None = None
    pitch: float | None = None
    winding_length: float | None = None

    def __post_init__(self) -> None:
        _finite_positive(self.inductance, "readings", "a reading of a positive inductance")
        object.__setattr__(self, "turns", _whole(self.turns, "readings", "a reading at a whole number of turns, "
                                                 "at least one"))
        _finite_positive(self.pitch, "readings", "a test winding's pitch above zero")
        _finite_positive(self.winding_length, "readings", "a test winding's length above zero")

    @property
    def own_winding(self) -> bool:
        """True when the reading was taken on a winding other than the planned coil's."""
        return self.wire is not None or self.pitch is not None or self.winding_length is not None


@dataclass(frozen=True)
class Drive:
    """The current and voltage the coil carries: a DC current, an AC peak current, or an RMS sine voltage."""

    dc_current: float = 0.0
    ac_current: float = 0.0
    ac_voltage: float | None = None
    flux_limit: float | None = None  # a design limit for the peak flux density, T (a choke's turns)

    def __post_init__(self) -> None:
        for name, value in (("dc_current", self.dc_current), ("ac_current", self.ac_current)):
            if not (math.isfinite(value) and value >= 0):
                raise InvalidInputError(name, "a current of zero or more", value)
        _finite_positive(self.ac_voltage, "ac_voltage", "an RMS voltage above zero")
        _finite_positive(self.flux_limit, "flux_limit", "a flux-density limit above zero")
        if self.ac_voltage is not None and self.ac_current:
            raise InvalidInputError("ac_voltage", "either an AC voltage or an AC current, not both", None)


@dataclass(frozen=True)
class CoreFacts:
    """What is known of a core's material beyond its permeability: its class, a loss factor, a Q reading.

    Parameters
    ----------
    material : str, optional
        A generic material class (``coilplan materials``): its dispersion and loss.
    loss_factor : (float, float), optional
        A relative loss factor tanδ/µi and the frequency it holds at, Hz (a data sheet's figure).
    measured_q : (float, float), optional
        A Q the meter read on the winding of the last reading, and its test frequency, Hz.
    """

    material: str | None = None
    loss_factor: tuple[float, float] | None = None
    measured_q: tuple[float, float] | None = None

    def __post_init__(self) -> None:
        if self.measured_q is not None and self.loss_factor is not None:
            raise InvalidInputError("measured_q", "either a Q reading or a loss factor, not both", None)


@dataclass(frozen=True)
class Request:
    """What is asked of one coil, checked as a whole.

    One of ``turns``, ``target`` and ``tuning`` says what is wanted; ``turns`` with ``target`` asks a form with
    a free part (a gapped core's gap) to set it.

    Parameters
    ----------
    turns : int, optional
        The turns to wind (forward: gives the inductance).
    target : float, optional
        The inductance wanted, H; at ``frequency`` when one is given, as the coil shows it there.
    tuning : (float, float), optional
        (frequency Hz, capacitance F): the coil that resonates with that capacitor at that frequency.
    frequency : float, optional
        The operating frequency, Hz.
    readings : tuple of Reading
        Readings of the coil in hand or of a test winding, in the order taken (the last is the coil now).
    meter_frequency : float, optional
        The meter's test frequency, Hz.
    tolerance : float, optional
        The meter's accuracy per reading, relative; None takes :data:`DEFAULT_TOLERANCE` (and says so).
    self_capacitance : float, optional
        A self-capacitance measured on the coil, F: replaces the form's estimate.
    turns_uncertainty : float
        ± turns on the counts of the readings.
    temperature : float
        Working temperature of the winding, °C.
    drive : Drive
    core : CoreFacts
    """

    turns: int | None = None
    target: float | None = None
    tuning: tuple[float, float] | None = None
    frequency: float | None = None
    readings: tuple[Reading, ...] = ()
    meter_frequency: float | None = None
    tolerance: float | None = None
    self_capacitance: float | None = None
    turns_uncertainty: float = 0.0
    temperature: float = 20.0
    drive: Drive = field(default_factory=Drive)
    core: CoreFacts = field(default_factory=CoreFacts)

    def __post_init__(self) -> None:
        object.__setattr__(self, "readings", tuple(self.readings))
        if self.tuning is not None and (self.turns is not None or self.target is not None):
            other = "turns" if self.turns is not None else "target"
            raise InvalidInputError(other, f"either {other} or a tuning, not both", None)
        object.__setattr__(self, "turns", _whole(self.turns, "turns", "a whole number of turns, at least one"))
        _finite_positive(self.target, "target", "an inductance above zero")
        _finite_positive(self.frequency, "frequency", "a frequency above zero")
        _finite_positive(self.meter_frequency, "meter_frequency", "a frequency above zero")
        _finite_positive(self.self_capacitance, "self_capacitance", "a capacitance above zero")
        if self.tolerance is not None and not (math.isfinite(self.tolerance) and 0 <= self.tolerance < 0.5):
            raise InvalidInputError("tolerance", "a meter tolerance from 0 to under 50 %", self.tolerance)
        if not (math.isfinite(self.turns_uncertainty) and self.turns_uncertainty >= 0):
            raise InvalidInputError("turns_uncertainty", "an uncertainty of zero turns or more", self.turns_uncertainty)
        if self.tuning is not None:
            tuned_frequency, capacitance = self.tuning
            _finite_positive(tuned_frequency, "tuning", "a resonant frequency above zero")
            _finite_positive(capacitance, "tuning", "a tuning capacitance above zero")
            if self.frequency is not None and abs(self.frequency / tuned_frequency - 1.0) > 1e-12:
                raise InvalidInputError("frequency", "the resonant frequency of the tuning, or none", None)
        if self.drive.ac_voltage is not None and self.operating_frequency is None:
            raise InvalidInputError("frequency", "the operating frequency that goes with an AC voltage", None)
        fewest = min((reading.turns for reading in self.readings), default=None)
        if fewest is not None and self.turns_uncertainty >= fewest:
            raise InvalidInputError("turns_uncertainty", f"an uncertainty below the fewest turns read ({fewest}): "
                                    "a count known only to ± its own size could be no turns at all",
                                    f"{self.turns_uncertainty:g}")
        if self.core.measured_q is not None and not self.readings:
            raise InvalidInputError("measured_q", "a reading too: the Q belongs to the winding of the last reading",
                                    None)

    @property
    def wanted_inductance(self) -> float | None:
        """The inductance wanted at the operating frequency, H (from ``target`` or the tuning); None forward.

        To resonate with C at f the coil must show L = 1/((2πf)²·C) there: its own self-capacitance
        is in parallel with C, and the apparent inductance L/(1 − ω²LC_self) absorbs it exactly.
        """
        if self.tuning is not None:
            from coilplan.physics.resonance import resonant_inductance

            return float(resonant_inductance(*self.tuning))  # type: ignore[no-untyped-call]
        return self.target

    @property
    def operating_frequency(self) -> float | None:
        """Hz: the given frequency, or the tuning's."""
        return self.tuning[0] if self.tuning is not None and self.frequency is None else self.frequency

    @property
    def tolerance_or_default(self) -> float:
        return DEFAULT_TOLERANCE if self.tolerance is None else self.tolerance
