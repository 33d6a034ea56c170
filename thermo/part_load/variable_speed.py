r"""Variable speed: the motor's speed follows demand down to a minimum speed.

Above the minimum speed :math:`s_{min}` the compressor runs at speed :math:`x` (demand over
capacity), delivering :math:`x Q_c`; its specific energy rises linearly from the full-speed
value to :math:`(1 + r)` times it at the minimum speed (leakage and fixed losses weigh more at
low speed):

.. math::  P(x) = P_{fl}\, x \left(1 + r\,\frac{1 - x}{1 - s_{min}}\right), \qquad s_{min} \le x \le 1

Below the minimum speed it cycles load/unload on the receiver at the minimum speed
(:mod:`.load_unload`, capacity :math:`s_{min} Q_c`, unloaded power a share of the
minimum-speed power). The drive's own losses are added to the motor's input by
:mod:`.drive`. A variable-speed compressor uses less than modulation at part load and about
its full-load specific power down to its minimum speed, as U.S. Department of Energy (2003),
*Improving Compressed Air System Performance: A Sourcebook for Industry*, describes; the
defaults :math:`s_{min}` = 0.30 and :math:`r` = 0.10 are common practice, no source.
"""
from __future__ import annotations

__all__ = ["variable_speed_duty", "speed_power"]

from dataclasses import replace

from stagewright.core.part_load.duty import ControlDuty, RunState
from stagewright.core.part_load.load_unload import load_unload_duty


def speed_power(control: dict, full_W: float, speed: float) -> float:
    """Shaft power at ``speed`` (over full speed) between the minimum and full speed [W].

    Examples
    --------
    >>> c = {"min_speed_fraction": 0.3, "specific_power_rise_at_min_speed": 0.1}
    >>> round(speed_power(c, 100.0, 0.3), 9), round(speed_power(c, 100.0, 1.0), 9)  # 30 (1 + 0.1)
    (33.0, 100.0)
    """
    s_min = control["min_speed_fraction"]
    rise = 0.0 if s_min >= 1.0 else control["specific_power_rise_at_min_speed"] * (1.0 - speed) / (1.0 - s_min)
    return full_W * speed * (1.0 + rise)


def variable_speed_duty(control: dict, full_W: float, capacity_m3_s: float, intake_pressure_Pa: float,
                        demand_fraction: float) -> ControlDuty:
    """Running states of variable-speed control at a demand.

    Parameters
    ----------
    control : dict
        ``package.control`` (``min_speed_fraction``, ``specific_power_rise_at_min_speed`` and the
        receiver keys for cycling below the minimum speed).
    full_W : float
        Full-load (full-speed) shaft power [W].
    capacity_m3_s : float
        Full-speed free air delivery [m³/s].
    intake_pressure_Pa : float
        Pressure the free air delivery refers to [Pa].
    demand_fraction : float
        Demand over full-speed capacity [-], 0…1.

    Returns
    -------
    ControlDuty

    Examples
    --------
    >>> c = {"min_speed_fraction": 0.3, "specific_power_rise_at_min_speed": 0.0,
    ...      "receiver_volume_m3": 1.0, "pressure_band_Pa": 50_000.0,
    ...      "unloaded_power_fraction": 0.25, "blowdown_time_s": 0.0}
    >>> round(variable_speed_duty(c, 100.0, 0.1, 1e5, 0.6).mean_shaft_power_W, 9)
    60.0
    """
    s_min = control["min_speed_fraction"]
    x = demand_fraction
    if x >= s_min:
        return ControlDuty(demand_fraction=x, loaded_fraction=1.0,
                           states=(RunState(1.0, speed_power(control, full_W, x), x),))
    cycling = load_unload_duty(control, speed_power(control, full_W, s_min), capacity_m3_s * s_min,
                               intake_pressure_Pa, x / s_min, speed_fraction=s_min)
    note = "below its minimum speed the compressor cycles load/unload at that speed"
    return replace(cycling, demand_fraction=x, notes=(note, *cycling.notes))
