r"""Load and unload times of a compressor cycling on a receiver's pressure band.

With an ideal gas in an isothermal receiver of volume :math:`V` at the intake temperature,
the pressure band :math:`\Delta p` holds the free-air volume :math:`V \Delta p / p_a`. A
compressor of capacity :math:`Q_c` (free air delivery) against a demand :math:`Q_d = x Q_c`
fills it in :math:`t_l` and the demand empties it in :math:`t_u`:

.. math::

    t_l = \frac{V \Delta p}{p_a (Q_c - Q_d)}, \qquad
    t_u = \frac{V \Delta p}{p_a Q_d}, \qquad
    N = \frac{3600}{t_l + t_u} = \frac{3600\, x (1 - x)}{\tau_r}, \quad
    \tau_r = \frac{V \Delta p}{p_a Q_c}

so the loaded share of time is :math:`x` whatever the receiver, and the cycles per hour
peak at :math:`x = 1/2`. (Ideal gas, isothermal receiver at the intake temperature, demand
steady over a cycle: common practice, no source; the storage rule of thumb of gallons per
cfm in U.S. Department of Energy, *Improving Compressed Air System Performance: A
Sourcebook for Industry*, rests on the same balance.)
"""
from __future__ import annotations

__all__ = ["ReceiverCycle", "receiver_cycle"]

import math
from dataclasses import dataclass


@dataclass(frozen=True)
class ReceiverCycle:
    """Loaded and unloaded time of one cycle [s] and the cycles per hour."""

    loaded_s: float
    unloaded_s: float
    cycles_per_hour: float


def receiver_cycle(volume_m3: float, band_Pa: float, intake_pressure_Pa: float,
                   capacity_m3_s: float, demand_fraction: float) -> ReceiverCycle:
    r"""The load/unload cycle on a receiver's pressure band.

    Parameters
    ----------
    volume_m3 : float
        Receiver (and piping) volume [m³], > 0.
    band_Pa : float
        Pressure band between loading and unloading [Pa], > 0.
    intake_pressure_Pa : float
        Pressure the free air delivery refers to [Pa], > 0.
    capacity_m3_s : float
        The compressor's free air delivery when loaded [m³/s], > 0.
    demand_fraction : float
        Demand over capacity [-], 0…1.

    Returns
    -------
    ReceiverCycle
        Loaded and unloaded seconds of one cycle (``math.inf`` at 0 or 1, where the compressor
        never changes state) and cycles per hour (0 there).

    Raises
    ------
    ValueError
        If a volume, band, pressure or capacity is not positive or the demand is outside 0…1
        (programming error: the project's ranges are checked before).

    Notes
    -----
    :math:`t_l = V\Delta p / (p_a (Q_c - Q_d))`, :math:`t_u = V\Delta p / (p_a Q_d)`: an
    isothermal ideal-gas receiver (common practice, no source).

    References
    ----------
    U.S. Department of Energy (2003), *Improving Compressed Air System Performance: A
    Sourcebook for Industry*, "Compressed air storage" (qualitative: storage sets the cycle
    length of load/unload control).

    Examples
    --------
    >>> c = receiver_cycle(2.0, 50_000.0, 100_000.0, 0.1, 0.5)  # 1 m³ of free air in the band
    >>> round(c.loaded_s, 6), round(c.unloaded_s, 6), round(c.cycles_per_hour, 6)
    (20.0, 20.0, 90.0)
    """
    if min(volume_m3, band_Pa, intake_pressure_Pa, capacity_m3_s) <= 0.0 or not 0.0 <= demand_fraction <= 1.0:
        raise ValueError("receiver_cycle: volume, band, pressure and capacity must be > 0, demand 0…1")
    free_air = volume_m3 * band_Pa / intake_pressure_Pa
    x = demand_fraction
    # divided one at a time: a tiny demand (the schema allows any load above 0) makes the time
    # infinite, never a product that underflows to a division by zero
    loaded = math.inf if x >= 1.0 else free_air / capacity_m3_s / (1.0 - x)
    unloaded = math.inf if x <= 0.0 else free_air / capacity_m3_s / x
    period = loaded + unloaded
    cycles = 0.0 if x <= 0.0 or x >= 1.0 or math.isinf(period) else 3600.0 / period
    return ReceiverCycle(loaded, unloaded, cycles)
