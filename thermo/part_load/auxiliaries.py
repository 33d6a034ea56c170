r"""The package's auxiliaries: cooler fans, the coolant pump and named fixed loads.

The pump's input is the hydraulic power over its efficiency,

.. math::  P_{pump} = \frac{\rho\, g\, H\, \dot V}{\eta_{pump}}

(the definition of pump power input, ISO 9906:2012 — from memory), at the coolers' full-load
coolant flow: a constant-speed pump circulates it whatever the load. Fans and fixed loads
draw their stated power while the package runs.
"""
from __future__ import annotations

__all__ = ["Auxiliaries", "auxiliaries", "STANDARD_GRAVITY_M_S2"]

from dataclasses import dataclass

STANDARD_GRAVITY_M_S2 = 9.80665  #: standard acceleration of gravity (CGPM 1901), [m/s²]


@dataclass(frozen=True)
class Auxiliaries:
    """Electrical input of each auxiliary while the package runs [W]."""

    fan_W: float
    pump_W: float
    other_W: float

    @property
    def total_W(self) -> float:
        return self.fan_W + self.pump_W + self.other_W


def auxiliaries(package: dict, coolant_m3_s: float, coolant_density_kg_m3: float) -> Auxiliaries:
    """The auxiliaries' input while the package runs.

    Parameters
    ----------
    package : dict
        The normalised ``package`` section (``fan_power_W``, ``pump``, ``other_loads``).
    coolant_m3_s : float
        Coolant volume flow the pump circulates [m³/s].
    coolant_density_kg_m3 : float
        Its density [kg/m³].

    Returns
    -------
    Auxiliaries

    Examples
    --------
    >>> pkg = {"fan_power_W": 0.0, "pump": {"head_m": 20.0, "efficiency": 0.7}, "other_loads": []}
    >>> round(auxiliaries(pkg, 0.01, 1000.0).pump_W, 3)  # 1000 · 9.80665 · 20 · 0.01 / 0.7
    2801.9
    """
    pump = package.get("pump")
    pump_W = 0.0 if not pump else (coolant_density_kg_m3 * STANDARD_GRAVITY_M_S2 * pump["head_m"] * coolant_m3_s
                                   / pump["efficiency"])
    other = sum(load["power_W"] for load in package.get("other_loads") or [])
    return Auxiliaries(fan_W=package.get("fan_power_W") or 0.0, pump_W=pump_W, other_W=other)
