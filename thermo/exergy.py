"""Flow exergy relative to the site dead state [1]_."""
from __future__ import annotations

__all__ = ["DeadState", "flow_exergy", "heat_exergy"]

from dataclasses import dataclass

from .models.base import Point


@dataclass(frozen=True)
class DeadState:
    """Ambient state of the site: T0 [K], p0 [Pa], and h0 [J/kg], s0 [J/(kg K)] of air there."""

    T0: float
    P0: float
    h0: float
    s0: float


def flow_exergy(point: Point, velocity: float, dead: DeadState) -> float:
    r"""Specific thermo-mechanical flow exergy of a stream [1]_.

    .. math:: \psi = (h - h_0) - T_0 (s - s_0) + \tfrac{1}{2} V^2

    Parameters
    ----------
    point : Point
        State of the stream.
    velocity : float
        Stream velocity, [m/s].
    dead : DeadState
        Site ambient (dead) state.

    Returns
    -------
    float
        Specific flow exergy, [J/kg].

    Notes
    -----
    Chemical exergy (composition differences against the atmosphere) is left out: the
    delivered air has the composition of the intake air apart from water removed.

    Examples
    --------
    >>> from thermo.models import ConstantCpAir
    >>> m = ConstantCpAir(); d = DeadState(300.0, 1e5, m.at_tp(300.0, 1e5).h, m.at_tp(300.0, 1e5).s)
    >>> round(flow_exergy(m.at_tp(300.0, 1e6), 0.0, d), 1)  # = R T0 ln 10
    198351.3

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.3 (exergy of a stream, Gouy–Stodola theorem).
    """
    return (point.h - dead.h0) - dead.T0 * (point.s - dead.s0) + 0.5 * velocity * velocity


def heat_exergy(heat_W: float, boundary_temperature_K: float, T0: float) -> float:
    r"""Exergy carried by heat crossing a boundary at temperature Tb [1]_.

    .. math:: \dot X_Q = \dot Q \left(1 - \frac{T_0}{T_b}\right)

    Parameters
    ----------
    heat_W : float
        Heat leaving the system, [W].
    boundary_temperature_K : float
        Temperature at which it crosses the boundary, [K].
    T0 : float
        Dead-state temperature, [K].

    Returns
    -------
    float
        Exergy leaving with the heat, [W].

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.2.
    """
    return heat_W * (1.0 - T0 / boundary_temperature_K)
