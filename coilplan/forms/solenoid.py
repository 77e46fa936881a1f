"""The single-layer air-core solenoid form."""

from __future__ import annotations

import functools
import math
import warnings
from dataclasses import dataclass
from typing import Literal, get_args

import numpy as np

from coilplan.errors import InvalidInputError, OutsideValidityWarning
from coilplan.forms._checks import between_whole_turns
from coilplan.forms._checks import positive as _positive
from coilplan.forms._losses import winding_resistance_factor
from coilplan.forms._winding import Rewindable
from coilplan.physics import loops, solenoid
from coilplan.physics.frequency import knight_self_capacitance, medhurst_self_capacitance
from coilplan.quantities import ACCEPTED_RANGES, format_length
from coilplan.wire import Wire

__all__ = ["LONGEST_WINDING", "SOLENOID_METHODS", "Solenoid", "SolenoidMethod"]

#: The longest winding the solver plans on a former of unstated length, m: the longest length the
#: tool reads (coilplan.quantities.ACCEPTED_RANGES), 100 m.
LONGEST_WINDING = ACCEPTED_RANGES["m"][1]

#: Knight's self-capacitance formula was fitted to, and checked against, Medhurst's table over
#: l/D = 0.1 to 50 (docs/methods.md §6; Knight 2016): outside that it is an extrapolation.
KNIGHT_LENGTH_RATIO = (0.1, 50.0)

#: Largest pitch angle (tan ψ = p/(πD)) for which Knight's 1/cos²ψ factor is taken without a
#: warning: 20°, a helix a fifth of a turn's circumference per turn, coarser than any of
#: Medhurst's spaced coils (our limit, no published figure). Beyond it the winding is more a
#: bent wire than a coil, and 1/cos²ψ grows without bound as ψ nears 90°.
KNIGHT_PITCH_ANGLE_DEG = 20.0

SolenoidMethod = Literal["nagaoka-rosa", "filament", "sheet", "lundin", "wheeler-1982",
                         "wheeler-1928"]

#: Each solenoid method: (what it computes, its accuracy and source), in words.
SOLENOID_METHODS: dict[str, tuple[str, str]] = {
    "nagaoka-rosa": ("Nagaoka current sheet (exact) with Rosa's round-wire corrections",
                     "a few parts in 10,000 for an even winding of round wire (NBS method, Knight)"),
    "filament": ("turn-by-turn sum: Maxwell's mutual inductance of coaxial circles "
                 "and each turn's round-wire self-inductance",
                 "helix pitch ignored; within a few parts in 10,000 of nagaoka-rosa"),
    "sheet": ("Nagaoka current sheet (exact), no round-wire corrections",
              "exact for a sheet; a real close-wound coil of few turns reads a few percent less"),
    "lundin": ("Lundin 1985 approximation of the current sheet, no round-wire corrections",
               "about 3 ppm of the sheet (Lundin)"),
    "wheeler-1982": ("Wheeler 1982 approximation of the current sheet, no round-wire corrections",
                     "within 2e-5 of the sheet (computed here; no claim found)"),
    "wheeler-1928": ("Wheeler 1928 approximation of the current sheet, no round-wire corrections",
                     "about 1 % for a winding longer than 0.8 × radius (Wheeler)"),
}


@dataclass(frozen=True)
class Solenoid(Rewindable):
    """Single-layer air-core solenoid of round wire, wound at an even pitch.

    Parameters
    ----------
    diameter : float
        Coil diameter to the wire centres, m (a former's outside diameter plus
        the overall wire diameter).
    wire : Wire
        The wire; its overall (insulated) diameter sets the close-wound pitch.
    pitch : float, optional
        Distance between turn centres, m; default close wound (the overall wire
        diameter). Exclusive with ``length``.
    length : float, optional
        A fixed winding length, m, over which the turns are spread evenly, each
        owning length/N of it. Exclusive with ``pitch``.
    max_length : float, optional
        Usable length of the former, m: the winding, end to end, must fit it.
    lead : float
        Lead allowance per end, m, added twice to the wire to cut.
    method : str
        One of :data:`SOLENOID_METHODS`.
    former_permittivity : float
        Relative permittivity of the former, for the self-capacitance (1: air or
        a thin tube; about 2.5 for solid polystyrene, as Medhurst's formers).
    former_diameter : float, optional
        The former's outside diameter, m, when the coil was described by it
        (:meth:`on_former`): a test winding of another wire then sits on the same former.
    """

    diameter: float
    wire: Wire
    pitch: float | None = None
    length: float | None = None
    max_length: float | None = None
    lead: float = 0.0
    method: SolenoidMethod = "nagaoka-rosa"
    former_permittivity: float = 1.0
    former_diameter: float | None = None

    _pitch_field = "pitch"
    _length_field = "length"

    @classmethod
    def on_former(cls, former_diameter: float, wire: Wire, **fields) -> Solenoid:
        """The coil wound on a former of this outside diameter: D = former + overall wire diameter."""
        _positive(former_diameter, "former_diameter", "a former diameter")
        return cls(diameter=former_diameter + wire.overall_diameter, wire=wire, former_diameter=former_diameter,
                   **fields)

    def with_winding(self, *, wire=None, pitch=None, winding_length=None) -> Solenoid:
        """This coil wound otherwise; on a former, a thicker or thinner wire moves the turn centres."""
        rewound = super().with_winding(wire=wire, pitch=pitch, winding_length=winding_length)
        if self.former_diameter is None or wire is None:
            return rewound
        import dataclasses

        return dataclasses.replace(rewound, diameter=self.former_diameter + wire.overall_diameter)

    def __post_init__(self) -> None:
        if not (math.isfinite(self.former_permittivity) and self.former_permittivity >= 1):
            raise InvalidInputError("former_permittivity", "a relative permittivity of at least 1",
                                    self.former_permittivity)
        _positive(self.diameter, "diameter", "a coil diameter")
        _positive(self.pitch, "pitch", "a pitch")
        _positive(self.length, "length", "a winding length")
        _positive(self.max_length, "max_length", "a usable former length")
        if not (math.isfinite(self.lead) and self.lead >= 0):
            raise InvalidInputError("lead", "a lead allowance of zero or more", self.lead)
        if self.method not in get_args(SolenoidMethod):
            raise InvalidInputError("method", "one of " + ", ".join(get_args(SolenoidMethod)),
                                    self.method)
        overall = self.wire.overall_diameter
        if self.pitch is not None and self.length is not None:
            raise InvalidInputError("pitch", "either a pitch or a winding length, not both", None)
        if self.pitch is not None and self.pitch < overall * (1 - 1e-9):
            raise InvalidInputError(
                "pitch", f"a pitch of at least the overall wire diameter "
                f"{format_length(overall)} (turns cannot overlap)", format_length(self.pitch))
        if self.diameter <= overall:
            raise InvalidInputError("diameter", f"a coil diameter above the overall wire "
                                    f"diameter {format_length(overall)}",
                                    format_length(self.diameter))
        if self.length is not None and self.length < overall:
            raise InvalidInputError("length", f"a winding length of at least one wire diameter "
                                    f"({format_length(overall)})", format_length(self.length))
        if (self.length is not None and self.max_length is not None
                and self.length > self.max_length * (1 + 1e-12)):
            raise InvalidInputError("length", f"a winding length within the usable "
                                    f"{format_length(self.max_length)} of the former",
                                    format_length(self.length))
        if self.max_length is not None and self.max_length < overall:
            raise InvalidInputError("max_length", f"a usable length of at least one wire "
                                    f"diameter ({format_length(overall)})",
                                    format_length(self.max_length))

    # geometry -----------------------------------------------------------------
    def pitch_at(self, turns):
        """Pitch, m, at ``turns`` (constant unless the winding length is fixed)."""
        turns = np.asarray(turns, dtype=float)
        if self.length is not None:
            return self.length / turns
        pitch = self.wire.overall_diameter if self.pitch is None else self.pitch
        return np.full(turns.shape, pitch)[()]

    def winding_length(self, turns):
        """Length the winding occupies end to end, m: (N − 1)·p + overall wire diameter."""
        turns = np.asarray(turns, dtype=float)
        return (turns - 1.0) * self.pitch_at(turns) + self.wire.overall_diameter

    def sheet_length(self, turns):
        """Current-sheet length used by the model, m: N·p (each turn owns one pitch)."""
        turns = np.asarray(turns, dtype=float)
        return turns * self.pitch_at(turns)

    # protocol -----------------------------------------------------------------
    def min_turns(self) -> float:
        return 1.0

    def max_turns(self) -> float:
        overall = self.wire.overall_diameter
        if self.length is not None:
            return self.length / overall  # pitch may not fall below the wire
        if self.max_length is not None:
            pitch = self.pitch_at(1.0)
            return (self.max_length - overall) / pitch + 1.0
        return math.inf

    def search_limit(self) -> tuple[float, str]:
        """Most turns the solver searches when nothing else limits them, and why: a winding as long as
        :data:`LONGEST_WINDING`, the longest length the tool reads (a former longer than that is no
        bench former)."""
        pitch = float(self.pitch_at(1.0))
        turns = (LONGEST_WINDING - self.wire.overall_diameter) / pitch + 1.0
        return turns, (f"{math.floor(turns + 1e-9)} turns at {format_length(pitch)} pitch make a "
                       f"{format_length(LONGEST_WINDING)} winding, the longest this tool plans (give the former's "
                       f"usable length)")

    def limit_reason(self, turns: float, lowest: bool = False) -> str:
        if lowest:
            return "a single turn of this wire at this diameter"
        whole = math.floor(turns + 1e-9)
        if self.length is not None:
            return (f"{whole} close-wound turns fill the fixed {format_length(self.length)} "
                    f"winding length")
        return (f"{whole} turns at {format_length(float(self.pitch_at(1.0)))} pitch fill the "
                f"{format_length(self.max_length)} usable length of the former")

    def inductance(self, turns):
        """Low-frequency inductance, H, by this form's ``method``; vectorised over turns.

        Range warnings are held back here (the solver probes turn counts far from
        the answer); :meth:`validity_warnings` gives them for the turns chosen.
        """
        with warnings.catch_warnings():
            warnings.simplefilter("ignore", OutsideValidityWarning)
            return self._inductance(np.asarray(turns, dtype=float))

    def _inductance(self, turns: np.ndarray):
        pitch = self.pitch_at(turns)
        if self.method == "nagaoka-rosa":
            return solenoid.solenoid_inductance(self.diameter, pitch, self.wire.diameter, turns)
        if self.method == "filament":
            return self._filament_inductance(turns)
        coefficient = {
            "sheet": solenoid.nagaoka_coefficient,
            "lundin": solenoid.lundin_coefficient,
            "wheeler-1982": solenoid.wheeler_1982_coefficient,
            "wheeler-1928": solenoid.wheeler_1928_coefficient,
        }[self.method]
        return solenoid.current_sheet_inductance(self.diameter, turns * pitch, turns, coefficient)

    def _filament_inductance(self, turns: np.ndarray):
        """Filament sum at whole turns; linear between whole numbers for the root finder."""
        @functools.cache
        def at_whole(n: int) -> float:
            return float(loops.solenoid_filament_inductance(self.diameter, float(self.pitch_at(n)),
                                                            self.wire.diameter, n))

        return between_whole_turns(turns, at_whole)

    def wire_length(self, turns):
        """Wire to cut, m: N helical turns of length √((πD)² + p²) plus a lead at each end."""
        turns = np.asarray(turns, dtype=float)
        per_turn = np.hypot(np.pi * self.diameter, self.pitch_at(turns))
        return turns * per_turn + 2.0 * self.lead

    def resistance(self, turns, temperature_C: float = 20.0):
        """DC resistance of the wire to cut, ohm, at ``temperature_C``."""
        return self.wire_length(turns) * self.wire.resistance_per_metre(temperature_C)

    def self_capacitance(self, turns):
        """Self-capacitance, F, by Knight's formula with the former's permittivity."""
        turns = np.asarray(turns, dtype=float)
        return knight_self_capacitance(self.diameter, self.sheet_length(turns), self.pitch_at(turns),
                                       former_permittivity=self.former_permittivity)

    def medhurst_self_capacitance(self, turns):
        """Self-capacitance, F, by Medhurst's table (his coils were on solid polystyrene formers)."""
        turns = np.asarray(turns, dtype=float)
        return medhurst_self_capacitance(self.diameter, self.sheet_length(turns))

    def ac_resistance(self, turns, frequency, temperature_C: float = 20.0):
        """Resistance at ``frequency``, ohm: DC resistance × the skin and proximity factor of the winding."""
        factor = winding_resistance_factor(self.wire, frequency, temperature_C, pitch=self.pitch_at(turns))
        return self.resistance(turns, temperature_C) * factor

    def validity_warnings(self, turns: float) -> None:
        """Warn (OutsideValidityWarning) where the method is used outside its stated range."""
        ratio = self.diameter / float(self.sheet_length(turns))
        if self.method == "wheeler-1928" and ratio > 2.5:
            warnings.warn("Wheeler's 1928 formula is outside its stated range here (winding "
                          "length below 0.8 × radius); expect errors of several percent",
                          OutsideValidityWarning, stacklevel=2)
        if self.wire.diameter > 0.1 * self.diameter:
            warnings.warn("the wire is thick against the coil diameter (over a tenth of it): the "
                          "round-wire corrections assume a thin wire; expect about 1 % error",
                          OutsideValidityWarning, stacklevel=2)
        self._self_capacitance_warnings(turns)

    def _self_capacitance_warnings(self, turns: float) -> None:
        """Warn where Knight's self-capacitance formula is used outside its range (an extrapolation)."""
        length_ratio = float(self.sheet_length(turns)) / self.diameter
        low, high = KNIGHT_LENGTH_RATIO
        if not low <= length_ratio <= high:
            warnings.warn(f"the self-capacitance (Knight's formula) is an extrapolation here: length / diameter "
                          f"{length_ratio:.4g} is outside the {low:g} to {high:g} it was checked over against "
                          f"Medhurst's measurements; treat it and the self-resonance as rough",
                          OutsideValidityWarning, stacklevel=3)
        angle = math.degrees(math.atan(float(self.pitch_at(turns)) / (math.pi * self.diameter)))
        if angle > KNIGHT_PITCH_ANGLE_DEG:
            warnings.warn(f"the pitch angle is {angle:.0f}°: Knight's 1/cos²ψ factor in the self-capacitance is "
                          f"meant for a helix of small pitch angle ({KNIGHT_PITCH_ANGLE_DEG:g}° at most here, our "
                          f"limit) and grows without bound towards 90°, so the self-capacitance and self-resonance "
                          f"shown are not to be trusted; Medhurst's figure is given beside it",
                          OutsideValidityWarning, stacklevel=3)
