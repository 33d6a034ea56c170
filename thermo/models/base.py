"""What every property model of air provides, and the state point it returns."""
from __future__ import annotations

__all__ = ["Point", "PropertyModel", "T_MIN", "T_MAX", "P_MIN", "P_MAX", "check_range"]

from dataclasses import dataclass
from typing import Protocol

from stagewright.core.errors import PropertyRangeError, message_detail, quantity

#: Validity window shared by every model [K] and [Pa]: compressed-air work, well inside
#: the Lemmon et al. (2000) equation of state (59.75 K … 2000 K, up to 2000 MPa).
T_MIN, T_MAX = 200.0, 1300.0
P_MIN, P_MAX = 1.0e3, 1.0e8


def check_range(temperature: float, pressure: float, where: str) -> None:
    """Raise :class:`PropertyRangeError` unless T [K] and p [Pa] lie in the model window."""
    if not (T_MIN <= temperature <= T_MAX):
        raise PropertyRangeError(
            f"{where}: temperature {temperature:.6g} K is outside the property range "
            f"{T_MIN:g} K … {T_MAX:g} K", where,
            message_detail("{where}: temperature {value} is outside the range of the property models, "
                           "{lo} … {hi}", {"where": where, "value": quantity(temperature, "temperature"),
                                            "lo": quantity(T_MIN, "temperature"),
                                            "hi": quantity(T_MAX, "temperature")}))
    if not (P_MIN <= pressure <= P_MAX):
        raise PropertyRangeError(
            f"{where}: pressure {pressure:.6g} Pa is outside the property range "
            f"{P_MIN:g} Pa … {P_MAX:g} Pa", where,
            message_detail("{where}: pressure {value} is outside the range of the property models, "
                           "{lo} … {hi}", {"where": where, "value": quantity(pressure, "absolute_pressure"),
                                            "lo": quantity(P_MIN, "absolute_pressure"),
                                            "hi": quantity(P_MAX, "absolute_pressure")}))


@dataclass(frozen=True, init=False)
class Point:
    """A state of the air stream.

    Attributes
    ----------
    T : float
        Temperature, [K].
    P : float
        Pressure, [Pa].
    h : float
        Specific enthalpy (model's own reference), [J/kg].
    s : float
        Specific entropy (model's own reference), [J/(kg K)].
    rho : float
        Density, [kg/m³] (of the gas phase: dry air and water vapour).
    w : float
        Humidity ratio, water vapour per dry air, [kg/kg] (0 for dry air).
    wl : float
        Liquid water carried per dry air, [kg/kg] (0 for dry air).

    Notes
    -----
    For moist air, h and s are per kilogram of dry air and include the water (vapour and
    liquid), as is usual in psychrometrics; for dry air the two bases coincide.
    """

    T: float
    P: float
    h: float
    s: float
    rho: float
    w: float = 0.0
    wl: float = 0.0

    def __init__(self, T: float, P: float, h: float, s: float, rho: float, w: float = 0.0, wl: float = 0.0):
        # the dataclass's own __init__ of a frozen class sets each field through
        # object.__setattr__ (about 2 µs a point, some sixty points a solve); the instance
        # dictionary takes them directly, with the same fields, equality, hash and pickling
        d = self.__dict__
        d["T"] = T
        d["P"] = P
        d["h"] = h
        d["s"] = s
        d["rho"] = rho
        d["w"] = w
        d["wl"] = wl


class PropertyModel(Protocol):
    """Interface of a property model of dry air (one concept per file in this package)."""

    name: str
    gas_constant: float  #: specific gas constant, [J/(kg K)]

    def at_tp(self, T: float, P: float, where: str = "") -> Point: ...

    def at_hp(self, h: float, P: float, where: str = "", T_guess: float = 300.0) -> Point: ...

    def at_sp(self, s: float, P: float, where: str = "", T_guess: float = 300.0) -> Point: ...

    def polytropic_slope(self, T: float, P: float, efficiency: float) -> float:
        """dT/d(ln p) along a path of constant polytropic efficiency, [K]."""
        ...

    def terms(self, T: float, P: float, slope: bool = True) -> tuple:
        """(h [J/kg], s [J/(kg K)], v [m³/kg], cp [J/(kg K)], (∂h/∂p)_T [m³/kg]) at T, P.

        (∂h/∂p)_T may be returned as 0.0 when ``slope`` is False (it is needed only for
        polytropic paths)."""
        ...
