r"""Start/stop control: the motor stops when the receiver is full and starts when it is drawn down.

The receiver sets the natural cycle (:mod:`.receiver`): :math:`N = 3600\,x(1-x)/\tau_r`
cycles per hour, each with a start. A motor allows only so many starts an hour; when the
natural cycles exceed that limit :math:`N_{max}`, only a share :math:`N_{max}/N` of the cycles
stop the motor, and in the others it runs on unloaded (as load/unload control, with its
blowdown, :mod:`.load_unload`). Stopped, the package draws nothing (auxiliaries off).
The default limit of 6 starts an hour is common practice, no source (motor suppliers state
their own).
"""
from __future__ import annotations

__all__ = ["start_stop_duty"]

from stagewright.core.part_load.duty import ControlDuty, RunState
from stagewright.core.part_load.load_unload import mean_unloaded_power
from stagewright.core.part_load.receiver import receiver_cycle


def start_stop_duty(control: dict, full_W: float, capacity_m3_s: float, intake_pressure_Pa: float,
                    demand_fraction: float) -> ControlDuty:
    """Running states of start/stop control at a demand.

    Parameters
    ----------
    control : dict
        ``package.control`` (receiver keys and ``max_starts_per_hour``).
    full_W : float
        Shaft power when loaded [W].
    capacity_m3_s : float
        Free air delivery when loaded [m³/s].
    intake_pressure_Pa : float
        Pressure the free air delivery refers to [Pa].
    demand_fraction : float
        Demand over capacity [-], 0…1.

    Returns
    -------
    ControlDuty
        Loaded :math:`x` of the time; stopped :math:`(1-x)\\,\\phi`; running unloaded
        :math:`(1-x)(1-\\phi)`, with :math:`\\phi = \\min(1, N_{max}/N)`.

    Examples
    --------
    >>> c = {"receiver_volume_m3": 2.0, "pressure_band_Pa": 50_000.0, "unloaded_power_fraction": 0.25,
    ...      "blowdown_time_s": 0.0, "max_starts_per_hour": 45.0}
    >>> d = start_stop_duty(c, 100.0, 0.1, 100_000.0, 0.5)  # 90 natural cycles/h, half may stop
    >>> round(d.mean_shaft_power_W, 6), round(d.starts_per_hour, 6)  # 0.5·100 + 0.25·25
    (56.25, 45.0)
    """
    x = demand_fraction
    cyc = receiver_cycle(control["receiver_volume_m3"], control["pressure_band_Pa"], intake_pressure_Pa,
                         capacity_m3_s, x)
    limit = control["max_starts_per_hour"]
    stopping = 1.0 if cyc.cycles_per_hour <= limit else limit / cyc.cycles_per_hour
    states = [RunState(x, full_W)] if x > 0.0 else []
    notes = ()
    if x < 1.0:
        states.append(RunState((1.0 - x) * stopping, 0.0, 0.0, running=False))
        if stopping < 1.0:
            unloaded = mean_unloaded_power(full_W, control["unloaded_power_fraction"] * full_W, cyc.unloaded_s,
                                           control["blowdown_time_s"])
            states.append(RunState((1.0 - x) * (1.0 - stopping), unloaded))
            notes = (f"the receiver allows {cyc.cycles_per_hour:.0f} cycles an hour, the motor "
                     f"{limit:g} starts: it runs on unloaded in the other cycles",)
    cycles = cyc.cycles_per_hour if 0.0 < x < 1.0 else None
    return ControlDuty(demand_fraction=x, states=tuple(s for s in states if s.time_fraction > 0.0),
                       loaded_fraction=x, cycles_per_hour=cycles,
                       starts_per_hour=min(cyc.cycles_per_hour, limit), notes=notes)
