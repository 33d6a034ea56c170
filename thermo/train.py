"""A whole train at a known mass flow: intake filter, stages, coolers, totals [1]_."""
from __future__ import annotations

__all__ = ["solve_train"]

import math

from .cooler import solve_cooler
from .document import site_pressure
from .exergy import DeadState, flow_exergy
from .flow import NORMAL_PRESSURE, NORMAL_TEMPERATURE
from .models.base import PropertyModel
from .recovery import heat_recovery
from .results import InletResult, TrainResult, Warning_
from .split import stage_pressure_ratios
from .stage import solve_stage
from . import coolprop_adapter


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
        Normalised project document (:func:`thermo.document.normalise`).
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
    ambient = model.at_tp(T0, P0, "site intake")
    dead = DeadState(T0, P0, ambient.h, ambient.s)
    p1 = P0 - norm["inlet_pressure_drop_Pa"]
    after_filter = model.at_hp(ambient.h, p1, "intake filter outlet", T_guess=T0)
    filt_sgen = mass_flow * (after_filter.s - ambient.s)
    inlet = InletResult(ambient, after_filter, filt_sgen, T0 * filt_sgen)

    specs = norm["stages"]
    drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in specs]
    ratios = stage_pressure_ratios(p1, norm["discharge_pressure_Pa"], [s["pressure_ratio"] for s in specs], drops)

    warnings: list[Warning_] = []
    stages, coolers = [], []
    point, velocity = after_filter, 0.0
    for i, spec in enumerate(specs):
        st = solve_stage(model, spec, i, point, velocity, point.P * ratios[i], mass_flow, dead, detail)
        stages.append(st)
        limit = spec.get("max_discharge_temperature_K")
        if limit is not None and st.outlet.T > limit:
            warnings.append(Warning_(f"stages[{i}].max_discharge_temperature_K",
                                     f"stage {i + 1} discharge {st.outlet.T:.1f} K exceeds its limit {limit:.1f} K"))
        point, velocity = st.outlet, st.exit_velocity_m_s
        if spec["cooler"] is not None:
            c = solve_cooler(model, spec["cooler"], i, point, velocity, mass_flow, dead, 8 if detail else 1,
                             ambient_relative_humidity=norm["site"]["relative_humidity"])
            coolers.append(c)
            point, velocity = c.outlet, 0.0
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
    energy_res = (shaft - mass_flow * (point.h + 0.5 * velocity ** 2 - ambient.h) - q_rej) / shaft
    exergy_res = (shaft - x_gain - x_dest - x_heat) / shaft
    driver_eff = norm["driver"]["efficiency"]
    fad = mass_flow / ambient.rho
    normal = mass_flow / model.at_tp(NORMAL_TEMPERATURE, NORMAL_PRESSURE, "normal state").rho
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
        energy_residual=energy_res, exergy_residual=exergy_res, warnings=warnings)
    if norm.get("heat_recovery"):
        result.recovery = heat_recovery(norm["heat_recovery"], model, specs, stages, coolers, mass_flow, driver,
                                        hours=(norm.get("year") or {}).get("operating_hours_per_year"))
    for name in ("shaft_power_W", "energy_residual", "exergy_residual", "second_law_efficiency"):
        if not math.isfinite(getattr(result, name)):
            raise ArithmeticError(f"non-finite {name} in train solve")  # a bug, never user input
    return result
