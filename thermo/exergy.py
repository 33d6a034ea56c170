"""Flow exergy relative to the site dead state [1]_."""
from __future__ import annotations

__all__ = ["DeadState", "flow_exergy", "heat_exergy", "water_exergy"]

from dataclasses import dataclass

from stagewright.core.models.base import Point


@dataclass(frozen=True)
class DeadState:
    """Ambient state of the site: T0 [K], p0 [Pa], and h0 [J/kg], s0 [J/(kg K)] of air there.

    For moist intake air, h0 and s0 are per kilogram of dry air of the ambient moist air
    (humidity ratio ``W0``), and ``hw0``, ``sw0`` are the partial specific enthalpy and
    entropy of water in it, [J/kg] and [J/(kg K)]: the environment's water, the reference
    of every stream's water (vapour or condensate).
    """

    T0: float
    P0: float
    h0: float
    s0: float
    W0: float = 0.0
    hw0: float = 0.0
    sw0: float = 0.0


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
    Chemical exergy of the dry air is left out: its composition does not change. For
    moist air (h, s per kilogram of dry air, total water :math:`W = w + w_l`) the water is
    referred to the water of the environment,

    .. math:: \psi = h - h_0 - (W - W_0) h_{w0} - T_0\,[s - s_0 - (W - W_0) s_{w0}]
       + \tfrac12 (1 + W) V^2,

    so that the intake air has zero exergy and water removed from the stream carries its
    own exergy (:func:`water_exergy`).

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> m = ConstantCpAir(); d = DeadState(300.0, 1e5, m.at_tp(300.0, 1e5).h, m.at_tp(300.0, 1e5).s)
    >>> round(flow_exergy(m.at_tp(300.0, 1e6), 0.0, d), 1)  # = R T0 ln 10
    198351.3

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.3 (exergy of a stream, Gouy–Stodola theorem).
    """
    water = point.w + point.wl
    if water == 0.0 and dead.W0 == 0.0:
        return (point.h - dead.h0) - dead.T0 * (point.s - dead.s0) + 0.5 * velocity * velocity
    dw = water - dead.W0
    return ((point.h - dead.h0 - dw * dead.hw0) - dead.T0 * (point.s - dead.s0 - dw * dead.sw0)
            + 0.5 * velocity * velocity * (1.0 + water))


def water_exergy(h: float, s: float, dead: DeadState) -> float:
    r"""Specific exergy of water (e.g. drained condensate) against the environment's water [1]_.

    .. math:: \psi_w = (h - h_{w0}) - T_0 (s - s_{w0})

    Parameters
    ----------
    h, s : float
        Specific enthalpy [J/kg] and entropy [J/(kg K)] of the water (same reference as
        the moist-air formulation).
    dead : DeadState
        Site dead state with the water reference.

    Returns
    -------
    float
        Specific exergy, [J/kg]; liquid water at ambient temperature in unsaturated air
        has positive exergy (it could evaporate).

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.4 (chemical exergy, environment with water vapour).
    """
    return (h - dead.hw0) - dead.T0 * (s - dead.sw0)


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
