"""Safety cautions: brief, shown only where the input makes them relevant.

Each function returns a list of sentences for the ``cautions`` list of a
result. They defer to local codes and licensed practice; they are reminders,
not instructions. The thresholds are common practice with no single source.
"""

from __future__ import annotations

__all__ = [
    "HOT_CURRENT_DENSITY_A_PER_MM2",
    "HOT_TEMPERATURE_C",
    "MAINS_EQUIPMENT_CLASSES",
    "MAINS_VOLTAGE_V",
    "hot_winding_cautions",
    "mains_voltage_caution",
    "salvaged_mains_caution",
    "tuned_circuit_cautions",
]

#: Above this current density a small wound coil runs hot (common practice, no source).
HOT_CURRENT_DENSITY_A_PER_MM2 = 5.0
#: At or above this conductor temperature, °C, a winding burns skin and ages its enamel.
HOT_TEMPERATURE_C = 100.0
#: From this RMS voltage on, treat the winding as carrying mains-level voltage.
MAINS_VOLTAGE_V = 50.0
#: Material classes mostly found in mains-powered equipment (switching supplies, filter chokes).
MAINS_EQUIPMENT_CLASSES = frozenset({"mnzn-power", "iron-powder-power", "fesial-powder"})


def hot_winding_cautions(*, current_density: float = 0.0, temperature_C: float = 20.0,
                         near_saturation: bool = False) -> list[str]:
    """Cautions for a winding that will run hot: high current density, high temperature, saturation.

    Parameters
    ----------
    current_density : float
        A/mm² in the wire.
    temperature_C : float
        Working conductor temperature, °C.
    near_saturation : bool
        The core runs near or past saturation at the stated current.

    Examples
    --------
    >>> hot_winding_cautions(current_density=2.0)
    []
    """
    cautions = []
    if current_density > HOT_CURRENT_DENSITY_A_PER_MM2:
        cautions.append(f"at {current_density:.3g} A/mm² a wound coil runs hot: check the enamel's "
                        "thermal class and keep it clear of anything that burns")
    if temperature_C >= HOT_TEMPERATURE_C:
        cautions.append(f"a winding at {temperature_C:g} °C burns skin and ages its enamel: check "
                        "the thermal class printed on the reel")
    if near_saturation:
        cautions.append("near saturation the inductance collapses and the current rises steeply: "
                        "the winding and the parts driving it can overheat")
    return cautions


def mains_voltage_caution() -> str:
    """The caution for a winding across mains-level voltage."""
    return ("mains-level voltage can kill: build and test only if you are qualified to, with the "
            "winding insulated for the voltage, and follow local wiring codes")


def salvaged_mains_caution() -> str:
    """The caution for cores taken out of mains-powered equipment."""
    return ("cores salvaged from mains-powered equipment (power supplies, lighting gear) come "
            "from circuits that may hold charged capacitors, and old capacitors may hold hazardous "
            "fluids: unplug, discharge and check with a meter before taking it apart, and follow "
            "local electrical codes")


def tuned_circuit_cautions(tuned: bool) -> list[str]:
    """Cautions for a coil wound to resonate with a capacitor (a tank, a loading coil).

    Examples
    --------
    >>> len(tuned_circuit_cautions(True)), tuned_circuit_cautions(False)
    (1, [])
    """
    if not tuned:
        return []
    return ["in a transmitter's tank or loading coil, high RF voltage appears across the tank and at the top of "
            "the coil (V = √(P·Q·X)); anything that radiates is subject to licensing and power limits: follow "
            "local rules and licensed practice (coilplan tank --power estimates the voltage)"]
