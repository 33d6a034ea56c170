"""The compressor at full capacity, as the train solve gives it: what every control starts from."""
from __future__ import annotations

__all__ = ["FullLoad", "full_load_of"]

from dataclasses import dataclass


@dataclass(frozen=True)
class FullLoad:
    """Full-capacity figures at the conditions solved (SI).

    ``shaft_power_W`` is the compressor's shaft power (all stages, mechanical losses included);
    ``fad_m3_s`` its free air delivery, referred to ``intake_pressure_Pa``; ``driver_efficiency``
    the motor's full-load efficiency; ``coolant_m3_s`` the water and glycol volume flow the
    coolers take (the pump's flow) and ``coolant_density_kg_m3`` its mean density.
    """

    shaft_power_W: float
    fad_m3_s: float
    intake_pressure_Pa: float
    driver_efficiency: float
    coolant_m3_s: float = 0.0
    coolant_density_kg_m3: float = 1000.0


def _coolant(res) -> tuple[float, float]:
    """Volume flow and mean density of the water and glycol coolers' coolant."""
    vol = mass = 0.0
    for c in res.coolers:
        ex = None if c is None else c.exchanger
        if ex is None or ex.coolant.kind not in ("water", "glycol"):
            continue
        vol += ex.coolant.volume_flow_m3_s
        mass += ex.coolant.flow_kg_s
    return vol, (mass / vol if vol > 0.0 else 1000.0)


def full_load_of(res, driver_efficiency: float, load: float = 1.0) -> FullLoad:
    """Full-load figures from a train result solved at ``load`` times the full flow.

    At ``load`` < 1 (a year's bin solved at its delivered flow) the full-load shaft power and
    delivery are the solve's divided by ``load``: the train's figures per unit of flow at the
    bin's conditions, times the full flow (exact for the train's own balance, which is linear
    in the flow at fixed states; a fixed-UA cooler's outlet moves a little with the flow).

    Parameters
    ----------
    res : stagewright.core.results.TrainResult
        The solved train.
    driver_efficiency : float
        The motor's full-load efficiency [-] (the project's ``driver.efficiency``).
    load : float
        The flow the train was solved at, over the full flow [-], > 0.

    Returns
    -------
    FullLoad
    """
    vol, rho = _coolant(res)
    return FullLoad(shaft_power_W=res.shaft_power_W / load, fad_m3_s=res.free_air_delivery_m3_s / load,
                    intake_pressure_Pa=res.dead.P0, driver_efficiency=driver_efficiency,
                    coolant_m3_s=vol / load, coolant_density_kg_m3=rho)
