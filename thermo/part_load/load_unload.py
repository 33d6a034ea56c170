r"""Load/unload control: full capacity, or none while the motor runs on.

The compressor delivers at full capacity until the receiver reaches the top of the band,
then unloads (the motor runs on) until the demand has drawn the band down. The loaded share
of time is the demand fraction :math:`x`; the cycle length comes from the receiver
(:mod:`.receiver`). Unloading is not instant: the power falls from the loaded power
:math:`P_l` toward the unloaded power :math:`P_u = f_u P_l` as the separator blows down,
taken as exponential with time constant :math:`\tau_b`, so the mean power over an unloaded
period :math:`t_u` is

.. math::

    \bar P_u = P_u + (P_l - P_u)\,\frac{\tau_b}{t_u}\left(1 - e^{-t_u/\tau_b}\right)

Short cycles (a small receiver) spend more of each unloaded period blowing down, which is
why a larger receiver saves energy at the same demand (U.S. Department of Energy 2003,
*Improving Compressed Air System Performance: A Sourcebook for Industry*, the load/unload
curves by storage size; the exponential form and the default unloaded share 0.25 and time
constant 40 s are common practice, no source).
"""
from __future__ import annotations

__all__ = ["load_unload_duty", "mean_unloaded_power", "SHORT_CYCLES_PER_HOUR", "short_cycling_note"]

import math

from stagewright.core.part_load.duty import ControlDuty, RunState
from stagewright.core.part_load.receiver import receiver_cycle


#: more load/unload cycles an hour than this wear the inlet valve and blowdown and waste energy in
#: blowdowns: say so (common practice, no source)
SHORT_CYCLES_PER_HOUR = 60.0


def short_cycling_note(cycles_per_hour: float | None) -> tuple:
    """A note when the receiver makes the control cycle more than :data:`SHORT_CYCLES_PER_HOUR` times an hour."""
    if cycles_per_hour is None or cycles_per_hour <= SHORT_CYCLES_PER_HOUR:
        return ()
    return (f"short cycling: {cycles_per_hour:.0f} cycles an hour (more than {SHORT_CYCLES_PER_HOUR:.0f}); "
            "a larger receiver or a wider pressure band lengthens the cycle",)


def mean_unloaded_power(loaded_W: float, unloaded_W: float, unloaded_s: float, blowdown_s: float) -> float:
    r"""Mean power over an unloaded period of ``unloaded_s`` seconds [W].

    Parameters
    ----------
    loaded_W, unloaded_W : float
        Power when loaded and when fully blown down [W].
    unloaded_s : float
        Length of the unloaded period [s] (``math.inf``: the blown-down power).
    blowdown_s : float
        Time constant of the blowdown [s], ≥ 0 (0: instant).

    Returns
    -------
    float
        :math:`P_u + (P_l - P_u)(\tau_b/t_u)(1 - e^{-t_u/\tau_b})`.

    Examples
    --------
    >>> round(mean_unloaded_power(100.0, 25.0, 40.0, 40.0), 3)  # 25 + 75 (1 − e⁻¹)
    72.409
    """
    if blowdown_s <= 0.0 or math.isinf(unloaded_s):
        return unloaded_W
    if unloaded_s <= 0.0:
        return loaded_W
    r = blowdown_s / unloaded_s
    return unloaded_W + (loaded_W - unloaded_W) * r * -math.expm1(-1.0 / r)


def load_unload_duty(control: dict, loaded_W: float, capacity_m3_s: float, intake_pressure_Pa: float,
                     demand_fraction: float, speed_fraction: float = 1.0) -> ControlDuty:
    """Running states of load/unload control at a demand.

    Parameters
    ----------
    control : dict
        The project's ``package.control`` (``receiver_volume_m3``, ``pressure_band_Pa``,
        ``unloaded_power_fraction``, ``blowdown_time_s``).
    loaded_W : float
        Shaft power when loaded [W].
    capacity_m3_s : float
        Free air delivery when loaded [m³/s].
    intake_pressure_Pa : float
        Pressure the free air delivery refers to [Pa].
    demand_fraction : float
        Demand over ``capacity_m3_s`` [-], 0…1.
    speed_fraction : float
        Motor speed of both states (a variable-speed drive cycling at its minimum speed).

    Returns
    -------
    ControlDuty
        Loaded for ``demand_fraction`` of the time at ``loaded_W``, unloaded for the rest at
        :func:`mean_unloaded_power`, with the receiver's cycles per hour.

    Examples
    --------
    >>> c = {"receiver_volume_m3": 2.0, "pressure_band_Pa": 50_000.0,
    ...      "unloaded_power_fraction": 0.25, "blowdown_time_s": 0.0}
    >>> d = load_unload_duty(c, 100.0, 0.1, 100_000.0, 0.5)
    >>> round(d.mean_shaft_power_W, 6), round(d.cycles_per_hour, 6)  # 0.5·100 + 0.5·25
    (62.5, 90.0)
    """
    x = demand_fraction
    cyc = receiver_cycle(control["receiver_volume_m3"], control["pressure_band_Pa"], intake_pressure_Pa,
                         capacity_m3_s, x)
    unloaded = control["unloaded_power_fraction"] * loaded_W
    states = [RunState(x, loaded_W, speed_fraction)] if x > 0.0 else []
    if x < 1.0:
        states.append(RunState(1.0 - x, mean_unloaded_power(loaded_W, unloaded, cyc.unloaded_s,
                                                            control["blowdown_time_s"]), speed_fraction))
    cycles = cyc.cycles_per_hour if 0.0 < x < 1.0 else None
    return ControlDuty(demand_fraction=x, states=tuple(states), loaded_fraction=x, cycles_per_hour=cycles,
                       notes=short_cycling_note(cycles))
