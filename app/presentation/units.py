"""The one table of display units (SI and US customary), used by the window, charts and reports.

The calculation core never sees these: it works in bare SI floats. A display value is
``(si - offset) / scale``; an entered value becomes SI as ``display * scale + offset``.
Gauge pressure is relative to the site barometric pressure, so the pressure unit is
built with that pressure as its offset.

Conversion factors are exact by definition (NIST SP 811, 2008 edition, Appendix B):
1 lb = 0.45359237 kg, 1 ft = 0.3048 m, 1 psi = 6894.757293168 Pa,
1 Btu(IT) = 1055.05585262 J, 1 hp (mechanical) = 745.69987158 W, 1 US gal = 3.785411784 L,
1 grain = 64.79891 mg.
"""
from __future__ import annotations

__all__ = ["Unit", "SYSTEMS", "QUANTITIES", "OTHER_UNITS", "unit", "unit_named", "to_display", "to_si",
           "format_value", "label", "NORMAL_VOLUME_NOTE"]

from dataclasses import dataclass

from stagewright.core.flow import NORMAL_PRESSURE, NORMAL_TEMPERATURE

_LB = 0.45359237
_FT = 0.3048
_PSI = 6894.757293168
_BTU = 1055.05585262
_HP = 745.69987158
_GAL = 3.785411784e-3
_R_PER_K = 5.0 / 9.0  # K per °F (or °R)
_GRAIN = 64.79891e-6  # kg (NIST SP 811)


@dataclass(frozen=True)
class Unit:
    """A display unit: ``display = (si - offset) / scale``; ``decimals`` for tables."""

    symbol: str
    scale: float = 1.0
    offset: float = 0.0
    decimals: int = 2

    def to_display(self, si: float) -> float:
        return (si - self.offset) / self.scale

    def to_si(self, shown: float) -> float:
        return shown * self.scale + self.offset


SYSTEMS = ("SI", "US")

#: quantity -> (SI display unit, US customary display unit)
QUANTITIES: dict[str, tuple[Unit, Unit]] = {
    "temperature": (Unit("°C", 1.0, 273.15, 2), Unit("°F", _R_PER_K, 459.67 * _R_PER_K, 1)),
    "temperature_difference": (Unit("K", 1.0, 0.0, 2), Unit("°F", _R_PER_K, 0.0, 1)),
    "pressure": (Unit("bar", 1e5, 0.0, 4), Unit("psi", _PSI, 0.0, 2)),
    "pressure_difference": (Unit("kPa", 1e3, 0.0, 2), Unit("psi", _PSI, 0.0, 3)),
    # a pressure stated gauge (above the site's barometric pressure) in the document, [Pa]
    "gauge_pressure": (Unit("bar(g)", 1e5, 0.0, 4), Unit("psig", _PSI, 0.0, 2)),
    "specific_enthalpy": (Unit("kJ/kg", 1e3, 0.0, 2), Unit("Btu/lb", _BTU / _LB, 0.0, 2)),
    "specific_entropy": (Unit("kJ/(kg·K)", 1e3, 0.0, 4), Unit("Btu/(lb·°R)", _BTU / _LB / _R_PER_K, 0.0, 4)),
    "specific_heat": (Unit("J/(kg·K)", 1.0, 0.0, 1), Unit("Btu/(lb·°R)", _BTU / _LB / _R_PER_K, 0.0, 4)),
    "power": (Unit("kW", 1e3, 0.0, 2), Unit("hp", _HP, 0.0, 2)),
    "heat_flow": (Unit("kW", 1e3, 0.0, 2), Unit("Btu/h", _BTU / 3600.0, 0.0, 0)),
    "entropy_rate": (Unit("W/K", 1.0, 0.0, 2), Unit("Btu/(h·°R)", _BTU / 3600.0 / _R_PER_K, 0.0, 2)),
    "mass_flow": (Unit("kg/s", 1.0, 0.0, 4), Unit("lb/min", _LB / 60.0, 0.0, 2)),
    "volume_flow": (Unit("m³/min", 1.0 / 60.0, 0.0, 3), Unit("cfm", _FT ** 3 / 60.0, 0.0, 1)),
    # volume of dry air at the normal state (NORMAL_VOLUME_NOTE): the same reference in both systems
    "normal_volume_flow": (Unit("Nm³/min", 1.0 / 60.0, 0.0, 3), Unit("scfm", _FT ** 3 / 60.0, 0.0, 1)),
    "specific_power": (Unit("kW/(m³/min)", 1.0, 0.0, 3),
                       Unit("kW/(100 cfm)", 1.0 / (100.0 * _FT ** 3 * 60.0 / 60.0), 0.0, 2)),
    "density": (Unit("kg/m³", 1.0, 0.0, 4), Unit("lb/ft³", _LB / _FT ** 3, 0.0, 5)),
    "velocity": (Unit("m/s", 1.0, 0.0, 1), Unit("ft/s", _FT, 0.0, 1)),
    "length": (Unit("m", 1.0, 0.0, 0), Unit("ft", _FT, 0.0, 0)),
    # water (condensate, cooling water) as a mass flow, [kg/s] inside: exact, no density assumed
    "water_flow": (Unit("kg/h", 1.0 / 3600.0, 0.0, 2), Unit("lb/h", _LB / 3600.0, 0.0, 2)),
    "fraction": (Unit("%", 0.01, 0.0, 2), Unit("%", 0.01, 0.0, 2)),
    "humidity_ratio": (Unit("g/kg", 1e-3, 0.0, 3), Unit("gr/lb", _GRAIN / _LB, 0.0, 1)),
    "ratio": (Unit("", 1.0, 0.0, 4), Unit("", 1.0, 0.0, 4)),
    "conductance": (Unit("kW/K", 1e3, 0.0, 3), Unit("Btu/(h·°F)", _BTU / 3600.0 / _R_PER_K, 0.0, 0)),
    "energy": (Unit("kWh", 3.6e6, 0.0, 0), Unit("kWh", 3.6e6, 0.0, 0)),
    # cooling water (or a water–glycol circuit) as a volume flow at the coolant inlet, [m³/s] inside
    "water_volume_flow": (Unit("m³/h", 1.0 / 3600.0, 0.0, 2), Unit("US gpm", _GAL / 60.0, 0.0, 1)),
    # drained condensate as a volume flow, [m³/s] inside (small: litres per hour)
    "condensate_volume_flow": (Unit("L/h", 1e-3 / 3600.0, 0.0, 2), Unit("US gal/h", _GAL / 3600.0, 0.0, 2)),
    # condensate or cooling water collected over a period, [m³] inside
    "liquid_volume": (Unit("m³", 1.0, 0.0, 3), Unit("US gal", _GAL, 0.0, 1)),
    # free air delivered over a period (a load profile's year), [m³] inside
    "air_volume": (Unit("m³", 1.0, 0.0, 0), Unit("ft³", _FT ** 3, 0.0, 0)),
    # operating hours (a year's profile keeps hours, [h], as its unit)
    "hours": (Unit("h", 1.0, 0.0, 0), Unit("h", 1.0, 0.0, 0)),
    # a duration in seconds (a blowdown), and a rate per hour (starts, load cycles)
    "time": (Unit("s", 1.0, 0.0, 0), Unit("s", 1.0, 0.0, 0)),
    "per_hour": (Unit("1/h", 1.0, 0.0, 1), Unit("1/h", 1.0, 0.0, 1)),
    # an amount in the currency of the energy price the user gave: never converted
    "money": (Unit("cost", 1.0, 0.0, 0), Unit("cost", 1.0, 0.0, 0)),
}

#: quantity -> further display units an output may name by symbol (:func:`unit_named`): the plain-text
#: tables of the command line print pressures in kPa, energies in MWh and humidity ratios in kg/kg
OTHER_UNITS: dict[str, tuple[Unit, ...]] = {
    "pressure": (Unit("kPa", 1e3, 0.0, 2),),
    "energy": (Unit("MWh", 3.6e9, 0.0, 3),),
    "humidity_ratio": (Unit("kg/kg", 1.0, 0.0, 5),),
}


#: the reference state of Nm³/min and scfm (stagewright.core.flow: DIN 1343 normal state, dry air)
NORMAL_VOLUME_NOTE = (
    f"Normal volume: the volume of the dry air at the DIN 1343 normal state, "
    f"{NORMAL_TEMPERATURE - 273.15:g} °C and {NORMAL_PRESSURE / 1e5:g} bar(a) "
    f"({(NORMAL_TEMPERATURE * 1.8 - 459.67):.0f} °F, {NORMAL_PRESSURE / _PSI:.3f} psia). Nm³/min and scfm "
    "both refer to that state here; scfm is NOT at the 60 °F or 68 °F standard conditions some US "
    "catalogues use, so compare such figures only after converting.")


def unit(quantity: str, system: str = "SI", *, gauge: bool = False, barometric_Pa: float = 101_325.0) -> Unit:
    """Display unit of a quantity in a unit system.

    Parameters
    ----------
    quantity : str
        A key of :data:`QUANTITIES`.
    system : str
        ``"SI"`` or ``"US"``.
    gauge : bool
        For ``"pressure"`` only: relative to ``barometric_Pa`` (bar(g), psig).
    barometric_Pa : float
        Site barometric pressure, [Pa].
    """
    u = QUANTITIES[quantity][SYSTEMS.index(system)]
    if quantity == "pressure":
        tag = ("(g)" if gauge else "(a)") if system == "SI" else ("g" if gauge else "a")
        return Unit(u.symbol + tag, u.scale, barometric_Pa if gauge else 0.0, u.decimals)
    return u


def unit_named(quantity: str, symbol: str) -> Unit:
    """The display unit of a quantity whose symbol is ``symbol``, SI, US or one of :data:`OTHER_UNITS`.

    Raises
    ------
    KeyError
        When the quantity has no unit of that symbol.

    Examples
    --------
    >>> unit_named("pressure", "kPa").to_display(101_325.0)
    101.325
    """
    for u in QUANTITIES[quantity] + OTHER_UNITS.get(quantity, ()):
        if u.symbol == symbol:
            return u
    raise KeyError(f"{quantity} has no display unit {symbol!r}")


def to_display(si: float, quantity: str, system: str = "SI", **kw) -> float:
    """SI value → display value."""
    return unit(quantity, system, **kw).to_display(si)


def to_si(shown: float, quantity: str, system: str = "SI", **kw) -> float:
    """Display value → SI value."""
    return unit(quantity, system, **kw).to_si(shown)


def format_value(si: float | None, quantity: str, system: str = "SI", with_unit: bool = False, **kw) -> str:
    """Display text of an SI value with the quantity's usual number of decimals (``—`` for None)."""
    if si is None:
        return "—"
    u = unit(quantity, system, **kw)
    text = f"{u.to_display(si):,.{u.decimals}f}".replace(",", " ")
    return f"{text} {u.symbol}".rstrip() if with_unit else text


def label(name: str, quantity: str, system: str = "SI", **kw) -> str:
    """Column or axis label: ``"Temperature [°C]"``."""
    sym = unit(quantity, system, **kw).symbol
    return f"{name} [{sym}]" if sym else name
