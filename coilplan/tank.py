r"""A tuned circuit's L, C and f: any two give the third.

:func:`solve_tank` returns a frozen result with ``as_dict()`` (the ``result`` object of
``coilplan tank --json``): f = 1/(2π√(LC)), with the reactance at f and the characteristic
impedance √(L/C). The other jobs of ``coilplan tank`` have their own modules: band coverage with a
variable capacitor (:mod:`coilplan.tank_band`), L and C0 from resonances (:mod:`coilplan.tank_fit`)
and a tank at power with its cautions (:mod:`coilplan.tank_drive`); reading the values is
:mod:`coilplan.tank_values`.

=================  ===================  ==============================================
symbol             parameter            meaning
=================  ===================  ==============================================
L                  ``inductance``       inductance, H
C                  ``capacitance``      capacitance across the coil, F
f                  ``frequency``        resonant frequency, Hz
=================  ===================  ==============================================
"""

from __future__ import annotations

import math
from dataclasses import dataclass

from coilplan.errors import InvalidInputError
from coilplan.physics import resonance as rs
from coilplan.tank_values import _positive

__all__ = ["TankSolution", "solve_tank"]


@dataclass(frozen=True)
class TankSolution:
    """L, C and f of a tank, one of them computed from the other two.

    Attributes
    ----------
    inductance, capacitance, frequency : float
        H, F, Hz.
    solved_for : str
        ``"inductance"``, ``"capacitance"`` or ``"frequency"``: the one computed.
    reactance : float
        ωL at the resonant frequency (equal to 1/(ωC) there), Ω.
    characteristic_impedance : float
        √(L/C), Ω.
    """

    inductance: float
    capacitance: float
    frequency: float
    solved_for: str
    reactance: float
    characteristic_impedance: float

    def as_dict(self) -> dict:
        """The ``result`` object of ``coilplan tank --json`` for two of L, C, f."""
        return {
            "mode": "lc",
            "solved_for": self.solved_for,
            "inductance_H": self.inductance,
            "capacitance_F": self.capacitance,
            "frequency_Hz": self.frequency,
            "reactance_ohm": self.reactance,
            "characteristic_impedance_ohm": self.characteristic_impedance,
        }


def solve_tank(*, inductance: float | None = None, capacitance: float | None = None,
               frequency: float | None = None) -> TankSolution:
    r"""The third of L, C and f from the other two, f = 1/(2π√(LC)).

    Parameters
    ----------
    inductance, capacitance, frequency : float, optional
        Exactly two of them: H, F, Hz.

    Returns
    -------
    TankSolution

    Raises
    ------
    InvalidInputError
        Not exactly two given, or a value not above zero.

    Examples
    --------
    >>> tank = solve_tank(inductance=240e-6, capacitance=365e-12)  # docs/methods.md §10
    >>> round(tank.frequency / 1e3, 2), tank.solved_for
    (537.73, 'frequency')
    """
    given = {"inductance": inductance, "capacitance": capacitance, "frequency": frequency}
    present = [name for name, value in given.items() if value is not None]
    if len(present) == 3:
        raise InvalidInputError("frequency", "two of the inductance, capacitance and frequency, not all three "
                                "(the third is computed from the other two)")
    if len(present) < 2:
        missing = [name for name in given if name not in present]
        with_what = f" with the {present[0]}" if present else ""
        raise InvalidInputError(" or ".join(missing), f"one more of them{with_what} (any two of the inductance, "
                                "capacitance and frequency give the third)")
    units = {"inductance": "H", "capacitance": "F", "frequency": "Hz"}
    for name in present:
        _positive(given[name], name, units[name])
    if frequency is None:
        solved_for = "frequency"
        frequency = float(rs.resonant_frequency(inductance, capacitance))
    elif capacitance is None:
        solved_for = "capacitance"
        capacitance = float(rs.resonant_capacitance(frequency, inductance))
    else:
        solved_for = "inductance"
        inductance = float(rs.resonant_inductance(frequency, capacitance))
    return TankSolution(
        inductance=float(inductance), capacitance=float(capacitance), frequency=float(frequency),
        solved_for=solved_for, reactance=2.0 * math.pi * float(frequency) * float(inductance),
        characteristic_impedance=float(rs.characteristic_impedance(inductance, capacitance)))
