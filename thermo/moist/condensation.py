"""Water that condenses in a cooler: latent and sensible duty, the separator, condensate volume [1]_ [2]_."""
from __future__ import annotations

__all__ = ["Condensation", "condensation", "condensate_volume_L_h", "cooling_line"]

import math
from dataclasses import dataclass

from stagewright.core import coolprop_adapter as cpa
from stagewright.core.models.base import Point
from stagewright.core.moist.dew_point import dew_point
from stagewright.core.moist.saturation import T_TRIPLE


@dataclass(frozen=True)
class Condensation:
    """Water balance of one cooler and its separator (SI units; mass flows in kg/s)."""

    condensate_kg_s: float  #: water vapour condensed in the cooler
    latent_duty_W: float  #: part of the duty released by that condensation
    sensible_duty_W: float  #: part of the duty that cools the stream without phase change
    liquid_kg_s: float  #: liquid water at the cooler outlet (condensed plus any carried in)
    drained_kg_s: float  #: liquid removed by the separator
    carry_over_kg_s: float  #: liquid that the separator lets through to the next stage
    condensate_L_h: float  #: volume flow of the drained condensate at outlet T and p, [L/h]
    liquid_enthalpy_J_kg: float  #: specific enthalpy of the condensate, [J/kg]
    liquid_entropy_J_kgK: float  #: specific entropy of the condensate, [J/(kg K)]
    after: Point  #: the stream leaving the separator
    water_after: float  #: total water per dry air after the separator, [kg/kg]


def condensation(model, inlet: Point, outlet: Point, duty_W: float, mass_flow: float,
                 separator_efficiency: float) -> Condensation:
    r"""Split a cooler's duty into sensible and latent parts and pass the outlet through the separator [1]_ [2]_.

    The sensible part cools the inlet mixture, its phases frozen, to the outlet temperature
    and pressure; the latent part is the condensation at the outlet:

    .. math::

        \dot Q_\mathrm{lat} = \dot m_a\,[h(T_2, p_2; w_{v1}, w_{l1}) - h_2], \qquad
        \dot Q_\mathrm{sens} = \dot Q - \dot Q_\mathrm{lat}, \qquad
        \dot m_\mathrm{cond} = \dot m_a (w_{v1} - w_{v2})

    The separator removes the fraction :math:`\eta_\mathrm{sep}` of the liquid at the
    outlet; the rest is carried over. Separation of phases that are in equilibrium at one
    temperature and pressure generates no entropy.

    Parameters
    ----------
    model : MoistAir
        Stream model of the cooler (its total water).
    inlet, outlet : Point
        Cooler inlet and outlet (equilibrium) states.
    duty_W : float
        Heat rejected by the cooler, [W].
    mass_flow : float
        Dry-air mass flow, [kg/s].
    separator_efficiency : float
        Fraction of the liquid removed, [-].

    Returns
    -------
    Condensation

    References
    ----------
    .. [1] ASHRAE Handbook — Fundamentals, 2017, ch. 1, §"Psychrometric processes"
       (cooling with dehumidification: sensible and latent heat).
    .. [2] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §14-7 (dehumidification by cooling).
    """
    h_frozen, _ = model.gas_only(outlet.T, outlet.P, inlet.w, inlet.wl)
    latent = mass_flow * (h_frozen - outlet.h)
    condensed = mass_flow * (inlet.w - outlet.w)
    liquid = mass_flow * outlet.wl
    if outlet.wl > 0.0:
        h_l, s_l = model.mixture.liquid(outlet.T, outlet.P)
    else:
        h_l = s_l = 0.0
    removed = separator_efficiency * outlet.wl
    after = Point(outlet.T, outlet.P, outlet.h - removed * h_l, outlet.s - removed * s_l, outlet.rho,
                  outlet.w, outlet.wl - removed)
    drained = mass_flow * removed
    return Condensation(
        condensate_kg_s=condensed, latent_duty_W=latent, sensible_duty_W=duty_W - latent, liquid_kg_s=liquid,
        drained_kg_s=drained, carry_over_kg_s=liquid - drained,
        condensate_L_h=condensate_volume_L_h(drained, outlet.T, outlet.P),
        liquid_enthalpy_J_kg=h_l, liquid_entropy_J_kgK=s_l, after=after, water_after=model.water - removed)


def condensate_volume_L_h(mass_kg_s: float, T: float, P: float) -> float:
    """Volume flow [L/h] of liquid water flowing at ``mass_kg_s`` [kg/s], density of IAPWS-95 at T [K], P [Pa].

    Below the triple point (a cooler outlet below 0.01 °C, where the condensate is ice) the
    volume is that of the melted water at 273.16 K, what a heated drain passes."""
    if mass_kg_s == 0.0:
        return 0.0
    return mass_kg_s / cpa.liquid_water_density(max(T, T_TRIPLE), P) * 1000.0 * 3600.0


def cooling_line(model, inlet: Point, t_out: float, p_out: float, where: str, points: int = 8) -> list[Point]:
    """States along a cooler's line (p linear in T), with the point where condensation starts.

    Parameters
    ----------
    model : MoistAir
        Stream model of the cooler.
    inlet : Point
        Cooler inlet.
    t_out, p_out : float
        Outlet temperature [K] and pressure [Pa].
    where : str
        Context for error messages.
    points : int
        Number of segments of the line.

    Returns
    -------
    list of Point
        From the inlet to the outlet; when the line crosses the dew point, that point is
        included and the condensing part gets at least half the segments, so the chart shows
        where the cooling line bends (entropy falls faster once latent heat is removed).
    """
    t_in, p_in = inlet.T, inlet.P

    def p_at(T: float) -> float:
        return p_in if t_in == t_out else p_out + (T - t_out) / (t_in - t_out) * (p_in - p_out)

    def excess(T: float) -> float:
        return model.water - model.mixture.saturation_ratio(T, p_at(T))

    temps = [t_in + k / points * (t_out - t_in) for k in range(1, points)]
    if inlet.wl == 0.0 and t_in > t_out and excess(t_out) > 0.0 and excess(t_in) < 0.0:
        t_dew = dew_point(model.mixture, model.water, p_at, t_out, t_in)
        n_cond = max(points // 2, math.ceil(points * (t_dew - t_out) / (t_in - t_out)))
        n_sens = max(1, points - n_cond)
        temps = ([t_in + k / n_sens * (t_dew - t_in) for k in range(1, n_sens + 1)]
                 + [t_dew + k / n_cond * (t_out - t_dew) for k in range(1, n_cond)])
    return [inlet] + [model.at_tp(T, p_at(T), f"{where} cooling line") for T in temps]
