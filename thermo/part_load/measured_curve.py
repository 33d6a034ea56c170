"""A measured part-load curve: power fraction against flow fraction, interpolated linearly."""
from __future__ import annotations

__all__ = ["measured_curve_duty", "curve_power_fraction"]

import numpy as np

from stagewright.core.part_load.duty import ControlDuty, RunState


def curve_power_fraction(points: list, flow_fraction: float) -> float:
    """Power over full-load power at ``flow_fraction``: linear between the points, the end
    points' values beyond them.

    Parameters
    ----------
    points : list of dict
        ``{"flow_fraction": x, "power_fraction": p}`` [-], in any order.
    flow_fraction : float
        Demand over capacity [-].

    Returns
    -------
    float

    Examples
    --------
    >>> pts = [{"flow_fraction": 0.0, "power_fraction": 0.3}, {"flow_fraction": 1.0, "power_fraction": 1.0}]
    >>> round(curve_power_fraction(pts, 0.5), 9)
    0.65
    """
    ordered = sorted(points, key=lambda p: p["flow_fraction"])
    xs = [p["flow_fraction"] for p in ordered]
    ys = [p["power_fraction"] for p in ordered]
    return float(np.interp(flow_fraction, xs, ys))


def measured_curve_duty(control: dict, full_W: float, demand_fraction: float) -> ControlDuty:
    """Running state on a measured curve: :math:`P = P_{fl}\\, f(x)` with ``f`` from ``control["points"]``.

    Parameters
    ----------
    control : dict
        ``package.control`` with ``points``.
    full_W : float
        Full-load shaft power [W]: the curve's power fractions refer to it.
    demand_fraction : float
        Demand over capacity [-].

    Returns
    -------
    ControlDuty
    """
    x = demand_fraction
    return ControlDuty(demand_fraction=x, loaded_fraction=1.0,
                       states=(RunState(1.0, full_W * curve_power_fraction(control["points"], x)),))
