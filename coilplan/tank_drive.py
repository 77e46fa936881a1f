r"""A tank driven at power: its parallel resistance and voltage, and the cautions that go with them.

:func:`drive_fields` adds the voltage across a tank driven at power, V = √(P·Q·X), and the
parallel resistance Q·X; :func:`tank_cautions` the brief cautions that go with it.
"""

from __future__ import annotations

import math

from coilplan.errors import InvalidInputError
from coilplan.physics import resonance as rs
from coilplan.tank_values import _f, _positive

__all__ = ["HIGH_RF_VOLTAGE_V", "MAX_TANK_Q", "TANK_POWER_RANGE", "drive_fields", "tank_cautions"]

#: From this RMS voltage across a tank on, the text cautions about RF voltage: the 50 V AC upper
#: limit of extra-low voltage (IEC 61140, from memory); RF burns are a hazard in their own right.
HIGH_RF_VOLTAGE_V = 50.0

#: Largest loaded Q taken for a tank: no coil-and-capacitor tank reaches 100,000 (a silver-plated
#: cavity reaches about 10,000; common practice, no source), and the voltage √(P·Q·X) must stay a figure.
MAX_TANK_Q = 1e5
#: Powers taken for a driven tank, W: a microwatt (a receiver's tank) to 100 kW (a broadcast
#: transmitter's); a bench tool's outer limits (common practice, no source).
TANK_POWER_RANGE = (1e-6, 1e5)


def drive_fields(*, reactance: float, power: float | None = None, q: float | None = None) -> dict:
    r"""The parallel resistance and RMS voltage of a tank driven at power: R_p = Q·X, V = √(P·Q·X).

    Parameters
    ----------
    reactance : float
        X at resonance, Ω.
    power : float, optional
        P dissipated in the tank and its load, W.
    q : float, optional
        Q of the loaded tank.

    Returns
    -------
    dict
        ``power_W``, ``q``, ``parallel_resistance_ohm`` (with ``q``), ``tank_voltage_rms_V`` and
        ``tank_voltage_peak_V`` (with both); empty when neither is given.

    Examples
    --------
    >>> fields = drive_fields(reactance=1000.0, power=5.0, q=100.0)
    >>> round(fields["tank_voltage_rms_V"], 1), round(fields["parallel_resistance_ohm"])
    (707.1, 100000)
    """
    fields: dict = {}
    if power is not None:
        fields["power_W"] = _positive(power, "power", "W")
        low, high = TANK_POWER_RANGE
        if not low <= fields["power_W"] <= high:
            raise InvalidInputError("power", f"a power from {_f(low, 'W', 1)} to {_f(high, 'W', 1)}",
                                    _f(fields["power_W"], "W"))
    if q is not None:
        fields["q"] = _positive(q, "q", "")
        if fields["q"] > MAX_TANK_Q:
            raise InvalidInputError("q", f"a loaded Q above 0 and at most {MAX_TANK_Q:.0f}", f"{fields['q']:.6g}")
        fields["parallel_resistance_ohm"] = fields["q"] * float(reactance)
    if power is not None and q is not None:
        volts = float(rs.tank_voltage_rms(power, q, reactance))
        fields["tank_voltage_rms_V"] = volts
        fields["tank_voltage_peak_V"] = math.sqrt(2.0) * volts
    return fields


def tank_cautions(*, power: float | None = None, voltage_rms: float | None = None) -> list[str]:
    """Cautions for a tank at power: licensing of anything that radiates, and the RF voltage across it.

    Parameters
    ----------
    power : float, optional
        The power the tank is driven at, W; none, no cautions.
    voltage_rms : float, optional
        The estimated RMS voltage across the tank (:func:`drive_fields`), V.

    Examples
    --------
    >>> tank_cautions()
    []
    >>> len(tank_cautions(power=5.0, voltage_rms=707.0))
    2
    """
    if power is None:
        return []
    cautions = ["a tank driven at power belongs to a transmitter: anything that radiates is subject to licensing "
                "and power limits; follow your local rules and licensed practice"]
    if voltage_rms is None:
        cautions.append("high RF voltage appears across a driven tank and at the top of a loading coil, "
                        "V = √(P·Q·X): a few watts into a high-Q tank give hundreds of volts (give --q for an "
                        "estimate)")
    elif voltage_rms >= HIGH_RF_VOLTAGE_V:
        cautions.append(f"about {_f(voltage_rms, 'V', 3)} RMS ({_f(math.sqrt(2.0) * voltage_rms, 'V', 3)} peak) "
                        "appears across "
                        "this tank, and more at the top of a loading coil: RF at this voltage burns and arcs; keep "
                        "clear while it is driven and rate the capacitor and the coil's spacing for the peak")
    return cautions
