r"""Sizing a cooler: the UA needed for a given air outlet temperature [1]_ [2]_.

The compressed air is the hot stream, the coolant the cold one. With mean capacity rates
taken from the terminal enthalpy changes,

.. math::

    C_h = \frac{\dot Q}{T_{h,i} - T_{h,o}}, \quad C_c = \frac{\dot Q}{T_{c,o} - T_{c,i}},
    \quad \varepsilon = \frac{\dot Q}{C_\min (T_{h,i} - T_{c,i})}, \quad
    UA = C_\min\, N(\varepsilon, C_r), \quad F = \frac{\dot Q}{UA\,\Delta T_\mathrm{lm,cf}}

so that the ε–NTU and LMTD–F methods give the same UA by construction, and the coolant
energy balance equals the air-side duty exactly (the coolant outlet follows from its
enthalpy, :mod:`stagewright.core.exchanger.coolant`).

When the moist air condenses (its outlet lies below its dew point at the cooler
pressure) one LMTD over the whole exchanger would be wrong: below the dew point the
air's apparent capacity rate jumps (latent heat). The exchanger is then split at the dew
point into a **dry zone** (sensible, sized as above) and a **wet zone** sized on an
enthalpy driving force (:func:`wet_zone`, Braun, Klein & Mitchell 1989; Threlkeld 1970).
The zones are taken in counter-current series: the coolant meets the wet zone first and
reaches the dry zone at the boundary temperature :math:`T_{c,b}` from
:math:`h_c(T_{c,b}) = h_c(T_{c,i}) + \dot Q_{wet}/\dot m_c`. This is exact for counter-flow;
for the cross-flow and 1-2 shell arrangements it is the usual zone-by-zone approximation
(each zone treated as its own exchanger of that arrangement). The exchanger's UA is the
sum of the zones'. The wet zone's driving force is its log-mean enthalpy difference
(:func:`~stagewright.core.exchanger.zone_figures.enthalpy_driving_force`), not an F-corrected LMTD;
the whole exchanger's ε and NTU are on mean capacity rates and its F is that of
counter-flow, 1, or not defined (:func:`~stagewright.core.exchanger.zone_figures.overall_figures`).
"""
from __future__ import annotations

__all__ = ["HotSide", "Zone", "Exchanger", "size_exchanger", "Infeasible", "dry_zone", "wet_zone"]

import math
from dataclasses import dataclass, field
from typing import Callable


from stagewright.core.direct_init import direct_init
from stagewright.core.errors import InputError
from stagewright.core.exchanger.coolant import CoolantSide, coolant_side, temperature_from_h
from stagewright.core.exchanger.effectiveness import ARRANGEMENTS, max_effectiveness, ntu_from_effectiveness
from stagewright.core.exchanger.lmtd import counterflow_lmtd
from stagewright.core.exchanger.zone_figures import enthalpy_driving_force, overall_figures


class Infeasible(InputError):
    """No finite exchanger of the arrangement reaches these temperatures (a temperature cross)."""


@direct_init
@dataclass(frozen=True)
class HotSide:
    """What the compressed air does in the cooler: terminal temperatures and duty (SI).

    For moist air that condenses, the dew point, the duty down to it and the stream's
    equilibrium enthalpy ``h(T)`` at the cooler pressure (per kg of ``flow_kg_s``, liquid
    water included) let the exchanger be split into a dry and a wet zone.
    """

    inlet_temperature_K: float
    outlet_temperature_K: float
    duty_W: float
    dew_point_K: float | None = None
    dew_point_duty_W: float = 0.0  #: duty from the inlet down to the dew point, [W]
    flow_kg_s: float = 0.0  #: flow the enthalpy function refers to (dry air), [kg/s]
    equilibrium_enthalpy: Callable[[float], float] | None = None  #: h(T) [J/kg] at the cooler pressure
    moist_cp_J_kgK: float = 0.0  #: specific heat of the unsaturated stream per kg of flow, [J/(kg K)]

    @property
    def condenses(self) -> bool:
        return (self.dew_point_K is not None and self.equilibrium_enthalpy is not None
                and self.outlet_temperature_K < self.dew_point_K < self.inlet_temperature_K)


@direct_init
@dataclass(frozen=True)
class Zone:
    """One zone of an exchanger (the whole exchanger when nothing condenses), SI units."""

    kind: str  #: "dry" (sensible only) or "wet" (condensing)
    duty_W: float
    hot_inlet_temperature_K: float
    hot_outlet_temperature_K: float
    coolant_inlet_temperature_K: float
    coolant_outlet_temperature_K: float
    hot_capacity_rate_W_K: float
    coolant_capacity_rate_W_K: float
    capacity_ratio: float
    effectiveness: float
    ntu: float
    lmtd_K: float
    #: LMTD correction factor F of a dry zone (≤ 1); None for a wet zone, whose driving force is an enthalpy
    correction_factor: float | None
    ua_W_K: float
    #: wet zone: log-mean enthalpy difference between the air and saturated air at the coolant
    #: temperature, [J/kg dry air] (:mod:`stagewright.core.exchanger.zone_figures`); None for a dry zone
    log_mean_enthalpy_difference_J_kg: float | None = None


@direct_init
@dataclass(frozen=True)
class Exchanger:
    """A sized (or rated) cooler: arrangement, coolant stream, zones and totals (SI units)."""

    arrangement: str
    coolant: CoolantSide
    zones: list = field(default_factory=list)
    ua_W_K: float = 0.0
    lmtd_K: float = 0.0  #: counter-flow LMTD of the four terminal temperatures, [K]
    #: F, ε and NTU of the whole exchanger. When it condenses: ε and NTU on mean capacity rates,
    #: F = 1 for counter-flow and None for other arrangements (:mod:`stagewright.core.exchanger.zone_figures`)
    correction_factor: float | None = 1.0
    effectiveness: float | None = 0.0
    ntu: float | None = 0.0

    @property
    def mean_temperature_difference_K(self) -> float:
        """Effective mean temperature difference Q/UA, [K]."""
        return self.coolant.duty_W / self.ua_W_K if self.ua_W_K > 0.0 else 0.0


def dry_zone(arrangement: str, t_hi: float, t_ho: float, q: float, t_ci: float, t_co: float,
             field_name: str, ntu_start: float | None = None) -> Zone:
    r"""Size one sensible (dry) zone from its four terminal temperatures and duty [1]_ [2]_.

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    t_hi, t_ho : float
        Compressed-air inlet and outlet temperatures, [K].
    q : float
        Zone duty, [W].
    t_ci, t_co : float
        Coolant inlet and outlet temperatures, [K].
    field_name : str
        Input path blamed when the temperatures cross.
    ntu_start : float, optional
        An NTU near the answer (a rating's previous sizing) to start a numerical inversion from
        (:func:`~stagewright.core.exchanger.effectiveness.ntu_from_effectiveness`); the same answer.

    Returns
    -------
    Zone

    Raises
    ------
    Infeasible
        If the air leaves at or below the coolant inlet, the coolant leaves at or above
        the air inlet, or the arrangement cannot reach the effectiveness.
    """
    if q <= 0.0:
        return Zone("dry", 0.0, t_hi, t_ho, t_ci, t_co, 0.0, 0.0, 0.0, 0.0, 0.0, 0.0, 1.0, 0.0)
    if t_ho <= t_ci:
        raise Infeasible(field_name, t_ho, f"the air would leave at {t_ho:.2f} K, not above the "
                                           f"coolant inlet {t_ci:.2f} K (approach must be above 0 K)")
    if t_co >= t_hi:
        raise Infeasible(field_name, t_co, f"the coolant would leave at {t_co:.2f} K, not below the "
                                           f"air inlet {t_hi:.2f} K: a temperature cross")
    c_h = q / (t_hi - t_ho)
    c_c = q / (t_co - t_ci) if t_co > t_ci else math.inf
    c_min, c_max = min(c_h, c_c), max(c_h, c_c)
    cr = c_min / c_max
    hot_is_cmin = c_h <= c_c
    eps = q / (c_min * (t_hi - t_ci))
    limit = max_effectiveness(arrangement, cr, hot_is_cmin)
    if eps >= limit:
        raise Infeasible(field_name, eps, f"the {ARRANGEMENTS[arrangement].label} arrangement reaches "
                                          f"an effectiveness of at most {limit:.6g} at a capacity ratio "
                                          f"of {cr:.4g}, and {eps:.6g} is needed: the temperatures cross")
    ntu = ntu_from_effectiveness(arrangement, eps, cr, hot_is_cmin, field_name, start=ntu_start)
    ua = ntu * c_min
    lmtd = counterflow_lmtd(t_hi, t_ho, t_ci, t_co, field_name)
    return Zone("dry", q, t_hi, t_ho, t_ci, t_co, c_h, c_c, cr, eps, ntu, lmtd, q / (ua * lmtd), ua)


def wet_zone(arrangement: str, hot: HotSide, q: float, t_ci: float, t_cb: float, field_name: str,
             ntu_start: float | None = None) -> Zone:
    r"""Size the condensing (wet) zone on an enthalpy driving force [3]_ [4]_ [5]_.

    Below the dew point the air is saturated and sheds latent heat. With a Lewis number
    of one the local heat flux is driven by the difference between the stream enthalpy
    and the enthalpy of saturated air at the coolant temperature,
    :math:`d\dot Q = (UA^*/L)\,[h_a - h_s(T_c)]\,dx`, which makes the zone an exchanger
    between an "enthalpy" stream of capacity :math:`C^*_a = \dot m_a` and a coolant of
    capacity :math:`C^*_c = \dot m_c c_{p,c}/c_s`, where :math:`c_s` is the slope of the
    saturation enthalpy over the coolant's temperature range in the zone. The ε–NTU
    relation of the arrangement then applies to

    .. math::

        arepsilon^* = rac{\dot Q_{wet}}{C^*_\min\,[h_{a,dew} - h_s(T_{c,i})]}, \qquad
        UA^* = C^*_\min N(arepsilon^*, C^*_r), \qquad UA_{wet} = c_{p,m}\,UA^*

    The last step takes the air-side film as the controlling resistance (gas coolers:
    the gas-side coefficient is far below the water-side one), so the thermal
    conductance of the zone is :math:`c_{p,m}` times its enthalpy conductance.

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    hot : HotSide
        The air side (with dew point and equilibrium enthalpy).
    q : float
        Zone duty (from the dew point to the outlet), [W].
    t_ci, t_cb : float
        Coolant temperature entering the wet zone (the coolant inlet) and leaving it
        (at the dew-point boundary), [K].
    field_name : str
        Input path blamed when the zone cannot be built.
    ntu_start : float, optional
        As for :func:`dry_zone`.

    Returns
    -------
    Zone
        ``effectiveness`` and ``ntu`` on the enthalpy basis; ``ua_W_K`` thermal.

    Raises
    ------
    Infeasible
        If the air would have to be cooled to or below the coolant's saturation enthalpy,
        or the arrangement cannot reach the effectiveness.

    References
    ----------
    .. [3] J. E. Braun, S. A. Klein, J. W. Mitchell, "Effectiveness models for cooling
       towers and cooling coils", ASHRAE Transactions 95(2) (1989) 164–174.
    .. [4] J. L. Threlkeld, *Thermal Environmental Engineering*, 2nd ed., Prentice-Hall,
       1970, ch. 13 (enthalpy potential for combined heat and mass transfer).
    .. [5] ASHRAE, *Handbook—HVAC Systems and Equipment*, ch. "Coils" (dry and wet
       zones of a cooling and dehumidifying coil), from memory for the chapter number.
    """
    hs = hot.equilibrium_enthalpy
    m = hot.flow_kg_s
    t_dew, t_ho = hot.dew_point_K, hot.outlet_temperature_K
    h_in = hs(t_dew)
    h_out = h_in - q / m
    h_ci = hs(t_ci)
    if h_out <= h_ci or t_ho <= t_ci:
        raise Infeasible(field_name, t_ho, f"the air would leave at {t_ho:.2f} K, not above the coolant inlet "
                                           f"{t_ci:.2f} K (approach must be above 0 K)")
    if t_cb >= t_dew:
        raise Infeasible(field_name, t_cb, f"the coolant would reach {t_cb:.2f} K at the dew point "
                                           f"{t_dew:.2f} K: a temperature cross in the condensing zone")
    c_c = q / (t_cb - t_ci)
    c_s = (hs(t_cb) - h_ci) / (t_cb - t_ci)
    ca, cc = m, c_c / c_s
    c_min, c_max = min(ca, cc), max(ca, cc)
    cr = c_min / c_max
    eps = q / (c_min * (h_in - h_ci))
    limit = max_effectiveness(arrangement, cr, ca <= cc)
    if eps >= limit:
        raise Infeasible(field_name, eps, f"the condensing zone needs an effectiveness of {eps:.6g}; the "
                                          f"{ARRANGEMENTS[arrangement].label} arrangement reaches at most "
                                          f"{limit:.6g}: the temperatures cross")
    ntu = ntu_from_effectiveness(arrangement, eps, cr, ca <= cc, field_name, start=ntu_start)
    ua = ntu * c_min * hot.moist_cp_J_kgK
    lmtd = counterflow_lmtd(t_dew, t_ho, t_ci, t_cb, field_name)
    return Zone("wet", q, t_dew, t_ho, t_ci, t_cb, q / (t_dew - t_ho), c_c, cr, eps, ntu, lmtd,
                q / (ua * lmtd), ua)


def _coolant_field(where: str, flow, rise) -> str:
    return f"{where}.coolant.flow_kg_s" if flow is not None else f"{where}.coolant.temperature_rise_K"


def _size(arrangement, hot: HotSide, fluid, t_ci, flow, rise, where, starts: dict | None = None) -> Exchanger:
    side = coolant_side(fluid, t_ci, hot.duty_W, flow=flow, rise=rise, where=where)
    field_name = _coolant_field(where, flow, rise)
    starts = {} if starts is None else starts
    if hot.condenses:
        return _size_two_zones(arrangement, hot, fluid, side, field_name, starts)
    zone = dry_zone(arrangement, hot.inlet_temperature_K, hot.outlet_temperature_K, hot.duty_W,
                    t_ci, side.outlet_temperature_K, field_name, starts.get("whole"))
    starts["whole"] = zone.ntu
    return Exchanger(arrangement=arrangement, coolant=side, zones=[zone], ua_W_K=zone.ua_W_K,
                     lmtd_K=zone.lmtd_K, correction_factor=zone.correction_factor,
                     effectiveness=zone.effectiveness, ntu=zone.ntu)


def _size_two_zones(arrangement, hot: HotSide, fluid, side: CoolantSide, field_name: str,
                    starts: dict) -> Exchanger:
    """Dry zone (inlet → dew point) and wet zone (dew point → outlet), in counter-current series;
    ``starts`` keeps each zone's NTU for the next sizing of a rating to start its inversion from."""
    q_dry = hot.dew_point_duty_W
    q_wet = hot.duty_W - q_dry
    t_ci = side.inlet_temperature_K
    t_cb = t_ci
    if side.flow_kg_s > 0.0 and q_wet > 0.0:
        h_cb = fluid.h(t_ci) + q_wet / side.flow_kg_s
        t_co = side.outlet_temperature_K
        t_cb = temperature_from_h(fluid, h_cb, t_ci, t_co, fluid.h(t_ci), fluid.h(t_co),
                                  near=getattr(fluid, "last_boundary", None))
        fluid.last_boundary = (t_cb, h_cb)  # a rating's next sizing starts its search here
    if t_cb <= t_ci:  # the wet zone's duty warms the coolant by less than rounding: one dry zone
        zone = dry_zone(arrangement, hot.inlet_temperature_K, hot.outlet_temperature_K, hot.duty_W, t_ci,
                        side.outlet_temperature_K, field_name, starts.get("whole"))
        return Exchanger(arrangement=arrangement, coolant=side, zones=[zone], ua_W_K=zone.ua_W_K,
                         lmtd_K=zone.lmtd_K, correction_factor=zone.correction_factor,
                         effectiveness=zone.effectiveness, ntu=zone.ntu)
    wet = enthalpy_driving_force(wet_zone(arrangement, hot, q_wet, t_ci, t_cb, field_name, starts.get("wet")), hot)
    dry = dry_zone(arrangement, hot.inlet_temperature_K, hot.dew_point_K, q_dry, t_cb,
                   side.outlet_temperature_K, field_name, starts.get("dry"))
    starts["wet"], starts["dry"] = wet.ntu, dry.ntu
    ua = wet.ua_W_K + dry.ua_W_K
    lmtd = counterflow_lmtd(hot.inlet_temperature_K, hot.outlet_temperature_K, t_ci, side.outlet_temperature_K,
                            field_name)
    f, eps, ntu = overall_figures(arrangement, hot, side, ua)
    return Exchanger(arrangement=arrangement, coolant=side, zones=[dry, wet], ua_W_K=ua, lmtd_K=lmtd,
                     correction_factor=f, effectiveness=eps, ntu=ntu)


def _feasible(arrangement, hot, fluid, t_ci, flow, rise, where) -> bool:
    try:
        _size(arrangement, hot, fluid, t_ci, flow, rise, where)
    except Infeasible:
        return False
    except InputError:
        return False
    return True


def _limit_message(arrangement, hot, fluid, t_ci, flow, rise, where) -> InputError:
    """Find the smallest coolant flow (or largest rise) that works, for the error message."""
    if flow is not None:
        lo, hi = flow, flow
        while not _feasible(arrangement, hot, fluid, t_ci, hi, None, where):
            hi *= 2.0
            if hi > 1e9:
                return None
        for _ in range(60):
            mid = math.sqrt(lo * hi)
            lo, hi = (lo, mid) if _feasible(arrangement, hot, fluid, t_ci, mid, None, where) else (mid, hi)
        return InputError(f"{where}.coolant.flow_kg_s", flow,
                          f"expected at least {hi:.6g} kg/s: with less {fluid.label} the temperatures "
                          f"cross in this {ARRANGEMENTS[arrangement].label} exchanger for a duty of "
                          f"{hot.duty_W:.6g} W")
    lo, hi = 0.0, rise
    if not _feasible(arrangement, hot, fluid, t_ci, None, 1e-6 * max(rise, 1e-3), where):
        return None
    lo = 1e-6 * max(rise, 1e-3)
    for _ in range(60):
        mid = 0.5 * (lo + hi)
        lo, hi = (mid, hi) if _feasible(arrangement, hot, fluid, t_ci, None, mid, where) else (lo, mid)
    return InputError(f"{where}.coolant.temperature_rise_K", rise,
                      f"expected at most {lo:.4f} K: a larger rise makes the temperatures cross in "
                      f"this {ARRANGEMENTS[arrangement].label} exchanger")


def size_exchanger(arrangement: str, hot: HotSide, fluid, t_ci: float, flow: float | None = None,
                   rise: float | None = None, where: str = "cooler", explain: bool = True,
                   ntu_starts: dict | None = None) -> Exchanger:
    r"""UA, effectiveness, NTU, LMTD and coolant stream of a cooler for a given air outlet [1]_.

    Parameters
    ----------
    arrangement : str
        A key of :data:`stagewright.core.exchanger.effectiveness.ARRANGEMENTS`.
    hot : HotSide
        Air-side terminal temperatures and duty.
    fluid : object
        Coolant from :func:`stagewright.core.exchanger.coolant.make_coolant`.
    t_ci : float
        Coolant inlet temperature, [K].
    flow, rise : float, optional
        Coolant mass flow [kg/s] or temperature rise [K]; exactly one.
    where : str
        Input path of the cooler entry, for messages.
    explain : bool
        On a temperature cross, search for the limiting coolant flow (or rise) and name it
        in the error (off inside rating iterations).
    ntu_starts : dict, optional
        Kept by a rating across its sizings: each zone's NTU, from which the next sizing starts a
        numerical NTU inversion (unmixed cross-flow); the answers are the same.

    Returns
    -------
    Exchanger

    Raises
    ------
    InputError
        On a temperature cross (naming the coolant flow or rise and its limit), an air
        outlet at or below the coolant inlet, or a coolant outside its range.

    Examples
    --------
    >>> from stagewright.core.exchanger.coolant import make_coolant
    >>> w = make_coolant({"kind": "water"}, (293.15, 101325.0, 0.0))
    >>> ex = size_exchanger("counter_flow", HotSide(400.0, 303.15, 97_000.0), w, 293.15, rise=10.0)
    >>> round(ex.ua_W_K / (97_000.0 / ex.lmtd_K), 12)  # counter-flow: UA = Q / LMTD
    1.0

    References
    ----------
    .. [1] F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, *Fundamentals of Heat
       and Mass Transfer*, 6th ed., Wiley, 2007, §11.3–11.5.
    .. [2] R. K. Shah, D. P. Sekulić, *Fundamentals of Heat Exchanger Design*, Wiley, 2003,
       ch. 3 (ε-NTU, P-NTU and MTD methods and their equivalence).
    """
    try:
        return _size(arrangement, hot, fluid, t_ci, flow, rise, where, ntu_starts)
    except Infeasible:
        if not explain or hot.outlet_temperature_K <= t_ci:
            raise
        better = _limit_message(arrangement, hot, fluid, t_ci, flow, rise, where)
        if better is None:
            raise
        raise better from None
