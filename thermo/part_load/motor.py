r"""The motor at part load: its electrical input for a shaft power.

By default the motor's losses are split into a constant part (iron, friction and windage)
and a load part that grows with the square of the load (winding losses), the segregation of
losses of IEC 60034-2-1 (the structure from memory); at full load they are the rated losses
:math:`L_r = P_r (1/\eta_r - 1)`:

.. math::  L(x) = L_r\,\bigl(k + (1 - k)\,x^2\bigr), \qquad x = P / P_r

so the efficiency at rated output is :math:`\eta_r` exactly and falls at light load. The
constant share :math:`k` = 0.35 is common practice, no source. A user's own efficiency
points (a supplier's curve) replace it: their losses :math:`P(1/\eta - 1)` are interpolated
linearly in load, the end points' losses held beyond them.
"""
from __future__ import annotations

__all__ = ["motor_input"]

import numpy as np


def _points_loss(points: list, rated_W: float, shaft_W: float) -> float:
    ordered = sorted(points, key=lambda p: p["load_fraction"])
    xs = [p["load_fraction"] for p in ordered]
    losses = [rated_W * p["load_fraction"] * (1.0 / p["efficiency"] - 1.0) for p in ordered]
    return float(np.interp(shaft_W / rated_W, xs, losses))


def motor_input(motor: dict, rated_output_W: float, rated_efficiency: float, shaft_W: float) -> float:
    r"""Electrical input of the motor giving ``shaft_W`` [W].

    Parameters
    ----------
    motor : dict
        ``package.motor`` (``fixed_loss_share`` k [-], ``efficiency_points``).
    rated_output_W : float
        The motor's rated output :math:`P_r` [W], > 0.
    rated_efficiency : float
        Its efficiency at rated output :math:`\eta_r` [-] (the project's ``driver.efficiency``).
    shaft_W : float
        Shaft power it gives [W], ≥ 0 (0: running unloaded with nothing on the shaft).

    Returns
    -------
    float
        :math:`P + L(P/P_r)`.

    Notes
    -----
    With ``efficiency_points`` the losses come from the points; otherwise from the loss split.

    References
    ----------
    IEC 60034-2-1:2014, *Rotating electrical machines — Part 2-1: Standard methods for
    determining losses and efficiency from tests*: constant and load-dependent losses
    (from memory).

    Examples
    --------
    >>> m = {"fixed_loss_share": 0.35, "efficiency_points": []}
    >>> round(motor_input(m, 100.0, 0.95, 100.0), 9) == round(100.0 / 0.95, 9)
    True
    >>> round(motor_input(m, 100.0, 0.95, 50.0), 4)  # 50 + 5.2632 (0.35 + 0.65/4)
    52.6974
    """
    if motor.get("efficiency_points"):
        return shaft_W + _points_loss(motor["efficiency_points"], rated_output_W, shaft_W)
    k = motor["fixed_loss_share"]
    x = shaft_W / rated_output_W
    rated_loss = rated_output_W * (1.0 / rated_efficiency - 1.0)
    return shaft_W + rated_loss * (k + (1.0 - k) * x * x)
