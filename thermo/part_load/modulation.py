r"""Inlet modulation (throttling): the inlet valve closes as demand falls; the motor runs on.

Power falls linearly from full-load power at full capacity to a share :math:`a` of it at
zero flow:

.. math::  P(x) = P_{fl}\,\bigl(a + (1 - a)\,x\bigr)

The default :math:`a = 0.70` is the zero-flow power of a lubricant-injected rotary screw
compressor on inlet modulation as U.S. Department of Energy (2003), *Improving Compressed
Air System Performance: A Sourcebook for Industry*, draws it (from memory: read off its
part-load curves, not looked up for this project). Enter a measured curve
(``measured_curve``) where a supplier's or a test's figures exist.
"""
from __future__ import annotations

__all__ = ["modulation_duty"]

from stagewright.core.part_load.duty import ControlDuty, RunState


def modulation_duty(control: dict, full_W: float, demand_fraction: float) -> ControlDuty:
    """Running state of inlet modulation at a demand.

    Parameters
    ----------
    control : dict
        ``package.control`` with ``zero_flow_power_fraction`` (a) [-].
    full_W : float
        Full-load shaft power [W].
    demand_fraction : float
        Demand over capacity [-], 0…1.

    Returns
    -------
    ControlDuty
        One running state, loaded all the time, at :math:`P_{fl}(a + (1 - a)x)`.

    Examples
    --------
    >>> round(modulation_duty({"zero_flow_power_fraction": 0.7}, 100.0, 0.5).mean_shaft_power_W, 9)
    85.0
    """
    a = control["zero_flow_power_fraction"]
    x = demand_fraction
    return ControlDuty(demand_fraction=x, states=(RunState(1.0, full_W * (a + (1.0 - a) * x)),), loaded_fraction=1.0)
