"""A whole train at a known mass flow: intake filter, stages, coolers, totals [1]_."""
from __future__ import annotations

__all__ = ["solve_train", "intake_model", "mixture_for"]

import math

from thermo.cooler import solve_cooler
from thermo.project.validation import site_pressure
from thermo.exergy import DeadState, flow_exergy, water_exergy
from thermo.flow import NORMAL_PRESSURE, NORMAL_TEMPERATURE
from thermo.moist.stream import MoistAir, check_humid_range, intake_humidity_ratio, is_moist
from thermo.moist.iso8573 import REFERENCE_PRESSURE, REFERENCE_TEMPERATURE, humidity_class
from thermo.models.base import PropertyModel
from thermo.moist.mixture import MoistMixture, make_mixture
from thermo.heat_recovery import heat_recovery
from thermo.results import InletResult, TrainResult, Warning_, WaterResult
from thermo.split import stage_pressure_ratios
from thermo.stage import solve_stage
from thermo import coolprop_adapter


def mixture_for(model: PropertyModel) -> MoistMixture:
    """The moist-air formulation of a dry-air model (built once per model object)."""
    mix = getattr(model, "_moist_mixture", None)
    if mix is None:
        mix = model._moist_mixture = make_mixture(model)
    return mix


def intake_model(norm: dict, model: PropertyModel):
    """(stream model at the intake, mixture or None, intake humidity ratio W0 [kg/kg]).

    A dry intake (no humidity given, or zero) returns the dry-air model itself, so the
    dry calculation is exactly the one without moist air.
    """
    site = norm["site"]
    if not is_moist(site):
        return model, None, 0.0
    key = (site["ambient_temperature_K"], site_pressure(norm), site.get("relative_humidity"),
           site.get("dew_point_K"), site.get("humidity_ratio"))
    memo = getattr(model, "_intake_memo", None)  # the last site: a sweep's fast axis often keeps it
    if memo is not None and memo[0] == key:
        return memo[1]
    mixture = mixture_for(model)
    W0 = intake_humidity_ratio(site, mixture, site["ambient_temperature_K"], site_pressure(norm))
    out = (model, None, 0.0) if W0 <= 0.0 else (MoistAir(mixture, W0), mixture, W0)
    model._intake_memo = (key, out)
    return out


def _intake_states(norm: dict, dry_model: PropertyModel, mass_flow: float):
    """(stream model, mixture, W0, ambient state, dead state, filter outlet, filter balance, site RH).

    The same site and intake filter give the same states: the last answer is kept on the model
    (sweeps and studies solve many trains at one site)."""
    T0 = norm["site"]["ambient_temperature_K"]
    P0 = site_pressure(norm)
    model, mixture, W0 = intake_model(norm, dry_model)
    # the stream model itself (not its id, which a later object could reuse) identifies the water
    key = (model, T0, P0, norm["inlet_pressure_drop_Pa"], norm["site"]["relative_humidity"])
    memo = getattr(dry_model, "_intake_states_memo", None)
    if memo is not None and memo[0] == key:
        ambient, dead, after_filter, rh0 = memo[1]
    else:
        ambient = model.at_tp(T0, P0, "site intake")
        if mixture is None:
            dead = DeadState(T0, P0, ambient.h, ambient.s)
        else:
            dead = DeadState(T0, P0, ambient.h, ambient.s, W0, *_water_reference(mixture, T0, P0, W0))
        p1 = P0 - norm["inlet_pressure_drop_Pa"]
        after_filter = model.at_hp(ambient.h, p1, "intake filter outlet", T_guess=T0)
        rh0 = norm["site"]["relative_humidity"] if mixture is None else mixture.relative_humidity(T0, P0, W0)
        dry_model._intake_states_memo = (key, (ambient, dead, after_filter, rh0))
    filt_sgen = mass_flow * (after_filter.s - ambient.s)
    return model, mixture, W0, ambient, dead, after_filter, InletResult(ambient, after_filter, filt_sgen,
                                                                      T0 * filt_sgen), rh0


def _water_reference(mixture: MoistMixture, T0: float, P0: float, W0: float):
    """Partial specific enthalpy and entropy of water in the ambient air, [J/kg], [J/(kg K)]."""
    x0 = W0 / (mixture.epsilon + W0)
    d = 1e-3
    mu = mixture.mu_water(T0, P0, x0)
    s_w = -(mixture.mu_water(T0 + d, P0, x0) - mixture.mu_water(T0 - d, P0, x0)) / (2.0 * d)
    return mu + T0 * s_w, s_w


def solve_train(norm: dict, model: PropertyModel, mass_flow: float, detail: bool = True) -> TrainResult:
    r"""Solve a normalised project at a given mass flow [1]_.

    Totals follow from the component balances; two closure figures check them:

    .. math::

        \varepsilon_E = \frac{\dot W_\mathrm{shaft} - \dot m\,(h_d + \tfrac12 V_d^2 - h_0)
        - \sum \dot Q}{\dot W_\mathrm{shaft}}, \qquad
        \varepsilon_X = \frac{\dot W_\mathrm{shaft} - \dot m\,\psi_d - \sum \dot X_\mathrm{dest}
        - \sum \dot X_Q}{\dot W_\mathrm{shaft}}

    Parameters
    ----------
    norm : dict
        Normalised project document (:func:`thermo.project.validation.normalise`).
    model : PropertyModel
        Property model named by the project.
    mass_flow : float
        Mass flow of air, [kg/s].
    detail : bool
        False skips reporting-only work (polytropic efficiencies of isentropic stages,
        points along paths); powers, states and totals are unchanged. For trial solves.

    Returns
    -------
    TrainResult

    Notes
    -----
    Moist intake air (see :mod:`thermo.moist.stream`): ``mass_flow`` is the dry-air flow; each
    stage and cooler uses the stream model of its total water; the condensate drained by
    the separators leaves the train at its cooler's outlet temperature and pressure and
    enters both closures:

    .. math::

        \varepsilon_E = \frac{\dot W_\mathrm{shaft} - \dot m_a (h_d + \tfrac12 (1 + W_d) V_d^2 - h_0)
        - \sum \dot m_c h_c - \sum \dot Q}{\dot W_\mathrm{shaft}}, \qquad
        \varepsilon_X = \frac{\dot W_\mathrm{shaft} - \dot m_a \psi_d - \sum \dot m_c \psi_c
        - \sum \dot X_\mathrm{dest} - \sum \dot X_Q}{\dot W_\mathrm{shaft}}

    The reversible isothermal power is the flow exergy of the delivered air brought to
    the ambient temperature, :math:`\dot m [(h - h_0) - T_0 (s - s_0)]_{T_0, p_d}`, which
    for an ideal gas is :math:`\dot m R T_0 \ln(p_d/p_0)`. Second-law efficiency is the
    exergy gained by the air divided by the shaft power; isothermal efficiency is the
    isothermal power divided by the shaft power.

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.5 (exergy balance, exergetic efficiency).
    """
    T0 = norm["site"]["ambient_temperature_K"]
    P0 = site_pressure(norm)
    dry_model = model
    model, mixture, W0, ambient, dead, after_filter, inlet, rh0 = _intake_states(norm, dry_model, mass_flow)
    filt_sgen = inlet.entropy_generation_W_K
    p1 = after_filter.P

    specs = norm["stages"]
    drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in specs]
    ratios = stage_pressure_ratios(p1, norm["discharge_pressure_Pa"], [s["pressure_ratio"] for s in specs], drops)

    warnings: list[Warning_] = []
    stages, coolers = [], []
    point, velocity = after_filter, 0.0
    drains = []  # (kg/s, h, s, T, p) of condensate leaving each separator
    for i, spec in enumerate(specs):
        st = solve_stage(model, spec, i, point, velocity, point.P * ratios[i], mass_flow, dead, detail)
        if mixture is not None:
            check_humid_range(mixture, [st.outlet, max(st.path, key=lambda p: p.T)], f"stages[{i}]",
                              f"stage {i + 1} discharge")
        stages.append(st)
        limit = spec.get("max_discharge_temperature_K")
        if limit is not None and st.outlet.T > limit:
            warnings.append(Warning_(f"stages[{i}].max_discharge_temperature_K",
                                     f"stage {i + 1} discharge {st.outlet.T:.1f} K exceeds its limit {limit:.1f} K"))
        point, velocity = st.outlet, st.exit_velocity_m_s
        if spec["cooler"] is not None:
            c = solve_cooler(model, spec["cooler"], i, point, velocity, mass_flow, dead, 8 if detail else 0,
                             ambient_relative_humidity=rh0)
            coolers.append(c)
            point, velocity = c.leaving, 0.0
            if c.water is not None:
                w = c.water
                if w.drained_kg_s > 0.0:
                    drains.append((w.drained_kg_s, w.liquid_enthalpy_J_kg, w.liquid_entropy_J_kgK, point.T, point.P))
                warnings.extend(_water_notes(i, len(specs), w, mass_flow))
                model = MoistAir(mixture, w.water_after)
        else:
            coolers.append(None)

    if all(s["pressure_ratio"] is not None for s in specs):
        want = norm["discharge_pressure_Pa"]
        if abs(point.P - want) > 1e-3 * want:
            warnings.append(Warning_("discharge_pressure_Pa",
                                     f"the stage ratios give {point.P:.0f} Pa after the last cooler, "
                                     f"not the {want:.0f} Pa asked for"))

    shaft = sum(s.shaft_power_W for s in stages)
    q_rej = (sum(c.duty_W for c in coolers if c) + sum(s.heat_loss_W + s.mechanical_loss_W for s in stages))
    s_gen = filt_sgen + sum(s.entropy_generation_W_K for s in stages) + sum(
        c.entropy_generation_W_K for c in coolers if c)
    x_dest = inlet.exergy_destroyed_W + sum(s.exergy_destroyed_W for s in stages) + sum(
        c.exergy_destroyed_W for c in coolers if c)
    x_heat = sum(s.heat_loss_exergy_W for s in stages) + sum(c.heat_exergy_W for c in coolers if c)
    x_gain = mass_flow * flow_exergy(point, velocity, dead)
    iso_point = model.at_tp(T0, point.P, "isothermal reference")
    iso = mass_flow * flow_exergy(iso_point, 0.0, dead)
    if mixture is None:
        energy_res = (shaft - mass_flow * (point.h + 0.5 * velocity ** 2 - ambient.h) - q_rej) / shaft
        exergy_res = (shaft - x_gain - x_dest - x_heat) / shaft
        fad = mass_flow / ambient.rho
        water = None
    else:
        h_drained = sum(m * h for m, h, _, _, _ in drains)
        x_drained = sum(m * water_exergy(h, s, dead) for m, h, s, _, _ in drains)
        for m, _, _, _, p in drains:  # the isothermal reference delivers the condensate at T0 too
            h_l, s_l = mixture.liquid(T0, p)
            iso += m * water_exergy(h_l, s_l, dead)
        ke = 0.5 * velocity ** 2 * model.mass_per_dry_kg
        energy_res = (shaft - mass_flow * (point.h + ke - ambient.h) - h_drained - q_rej) / shaft
        exergy_res = (shaft - x_gain - x_drained - x_dest - x_heat) / shaft
        fad = mass_flow * (1.0 + ambient.w) / ambient.rho
        water = _water_result(mixture, dry_model, mass_flow, W0, point, P0, drains, x_drained, detail)
    driver_eff = norm["driver"]["efficiency"]
    normal = mass_flow / dry_model.at_tp(NORMAL_TEMPERATURE, NORMAL_PRESSURE, "normal state").rho
    driver = shaft / driver_eff
    result = TrainResult(
        model=model.name, eos_reference=coolprop_adapter.eos_reference(model.name), dead=dead,
        mass_flow_kg_s=mass_flow, free_air_delivery_m3_s=fad, normal_volume_flow_m3_s=normal,
        inlet=inlet, stages=stages, coolers=coolers, delivery=point, delivery_velocity_m_s=velocity,
        shaft_power_W=shaft, driver_power_W=driver,
        specific_power_kW_per_m3_min=(driver / 1000.0) / (fad * 60.0),
        heat_rejected_W=q_rej, entropy_generation_W_K=s_gen, exergy_destroyed_W=x_dest,
        heat_exergy_W=x_heat, exergy_gained_W=x_gain, isothermal_power_W=iso,
        isothermal_efficiency=iso / shaft, second_law_efficiency=x_gain / shaft,
        energy_residual=energy_res, exergy_residual=exergy_res, warnings=warnings, water=water)
    if norm.get("heat_recovery"):  # moist air: each cooler's own stream model (latent heat included)
        result.recovery = heat_recovery(norm["heat_recovery"], dry_model, specs, stages, coolers, mass_flow, driver,
                                        hours=(norm.get("year") or {}).get("operating_hours_per_year"))
    for name in ("shaft_power_W", "energy_residual", "exergy_residual", "second_law_efficiency"):
        if not math.isfinite(getattr(result, name)):
            raise ArithmeticError(f"non-finite {name} in train solve")  # a bug, never user input
    return result


def _water_result(mixture, dry_model, mass_flow, W0, delivered, P0, drains, x_drained,
                  detail: bool = True) -> WaterResult:
    """Water totals of a moist train: condensate, delivered dew points, ISO 8573-1 class
    (the atmospheric dew point is reporting-only: None in a trial solve)."""
    drained = sum(m for m, *_ in drains)
    delivered_water = mass_flow * (delivered.w + delivered.wl)
    pdp = mixture.dew_point(delivered.P, delivered.w)
    adp = mixture.dew_point(P0, delivered.w) if detail else None
    ref = dry_model.at_tp(REFERENCE_TEMPERATURE, REFERENCE_PRESSURE, "ISO 8573-1 reference state")
    liquid_conc = delivered.wl * ref.rho  # kg liquid per m³ of air at the reference conditions
    return WaterResult(
        mixture=mixture, intake_humidity_ratio=W0, intake_water_kg_s=mass_flow * W0,
        condensate_kg_s=drained, delivered_water_kg_s=delivered_water, delivered_liquid_kg_s=mass_flow * delivered.wl,
        delivered_pressure_dew_point_K=pdp, delivered_atmospheric_dew_point_K=adp,
        delivered_liquid_kg_m3=liquid_conc, iso8573_humidity_class=humidity_class(pdp, liquid_conc),
        condensate_exergy_W=x_drained,
        water_balance_residual=(mass_flow * W0 - delivered_water - drained) / (mass_flow * W0))


def _water_notes(i: int, n: int, water, mass_flow: float) -> list:
    """Messages about water a cooler knocks out or lets through (condensate is a hazard to manage)."""
    name = "aftercooler" if i == n - 1 else f"intercooler {i + 1}"
    notes = []
    if water.drained_kg_s > 0.0:
        notes.append(Warning_(f"stages[{i}].cooler.separator_efficiency",
                              f"{name} drains {water.drained_kg_s * 3600.0:.2f} kg/h of condensate: it needs a "
                              "working drain, and the condensate must be treated or disposed of as local "
                              "rules require"))
    carried = getattr(water, "carry_over_kg_s", 0.0) or 0.0
    if carried > 0.0:
        where = "the delivered air" if i == n - 1 else f"stage {i + 2}"
        notes.append(Warning_(f"stages[{i}].cooler.separator_efficiency",
                              f"{carried * 3600.0:.2f} kg/h of liquid water passes the {name}'s separator "
                              f"into {where}"))
    return notes

