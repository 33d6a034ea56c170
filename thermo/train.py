"""A whole train at a known mass flow: intake filter, stages, coolers, totals [1]_."""
from __future__ import annotations

__all__ = ["solve_train"]

import math
from dataclasses import dataclass, field

from stagewright.core.chart_points import known_points
from stagewright.core.cooler import solve_cooler
from stagewright.core.errors import InputError, message_detail, quantity
from stagewright.core.exergy import flow_exergy, water_exergy
from stagewright.core.flow import NORMAL_PRESSURE, NORMAL_TEMPERATURE
from stagewright.core.moist.freezing import frozen_condensate_warning, intake_rime_warning
from stagewright.core.moist.stream import MoistAir, check_humid_range, moist_stream
from stagewright.core.moist.iso8573 import REFERENCE_PRESSURE, REFERENCE_TEMPERATURE, humidity_class
from stagewright.core.models.base import Point, PropertyModel, check_range
from stagewright.core.heat_recovery import heat_recovery
from stagewright.core.project.delivery import stated_delivery
from stagewright.core.solve_context import SolveContext, fixed_state
from stagewright.core.results import InletResult, TrainResult, Warning_, WaterResult
from stagewright.core.split import stage_pressure_ratios
from stagewright.core.stage import solve_stage
from stagewright.core import coolprop_adapter


def solve_train(ctx: SolveContext, mass_flow: float, detail: bool = True, reuse: dict | None = None) -> TrainResult:
    r"""Solve a normalised project at a given mass flow [1]_.

    Totals follow from the component balances; two closure figures check them:

    .. math::

        \varepsilon_E = \frac{\dot W_\mathrm{shaft} - \dot m\,(h_d + \tfrac12 V_d^2 - h_0)
        - \sum \dot Q}{\dot W_\mathrm{shaft}}, \qquad
        \varepsilon_X = \frac{\dot W_\mathrm{shaft} - \dot m\,\psi_d - \sum \dot X_\mathrm{dest}
        - \sum \dot X_Q}{\dot W_\mathrm{shaft}}

    Parameters
    ----------
    ctx : SolveContext
        The solve's context (:func:`stagewright.core.solve_context.solve_context`): normalised project,
        resolved site, property model and intake state.
    mass_flow : float
        Mass flow of air, [kg/s].
    detail : bool
        False skips reporting-only work (polytropic efficiencies of isentropic stages,
        points along paths); powers, states and totals are unchanged. For trial solves.
    reuse : dict or None
        Stage and cooler results of earlier solves of the same document that differ only in
        stage ratios (a staging study's trials), reused where a stage's inputs are the same
        (:func:`_stage_and_cooler`); None solves every stage.

    Returns
    -------
    TrainResult

    Raises
    ------
    StagewrightError
        For a stage or cooler that cannot be solved (its message names the field, value
        and valid range), a state outside the property model's range, or a second-law
        violation.

    Notes
    -----
    Steps: the intake filter (:func:`_intake_filter`), the stage ratios
    (:func:`stagewright.core.split.stage_pressure_ratios`), the stages and coolers in flow order
    (:func:`_run_line`), the totals and closures (:func:`_totals`), heat recovery.

    Moist intake air (see :mod:`stagewright.core.moist.stream`): ``mass_flow`` is the dry-air flow; each
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

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.project.validation import normalise
    >>> from stagewright.core.solve_context import solve_context
    >>> norm = normalise({"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...                   "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 4e5,
    ...                   "fluid": {"model": "constant_cp"},
    ...                   "stages": [{"efficiency": {"kind": "isentropic", "value": 1.0}}]})
    >>> r = solve_train(solve_context(norm, ConstantCpAir()), 2.0)
    >>> round(r.shaft_power_W)  # 2 kg/s · 1005 J/(kg K) · 293.15 K · (4 ** (0.4 / 1.4) − 1)
    286363
    >>> abs(r.energy_residual) < 1e-12
    True

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.5 (exergy balance, exergetic efficiency).
    """
    norm = ctx.norm
    inlet = _intake_filter(ctx, mass_flow)
    specs = norm["stages"]
    drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in specs]
    want = ctx.delivery_pressure_Pa  # resolved at the boundary (stated absolute or gauge)
    ratios = stage_pressure_ratios(ctx.intake.after_filter.P, want, [s["pressure_ratio"] for s in specs], drops)
    line = _run_line(ctx, ratios, mass_flow, detail, reuse)
    if all(s["pressure_ratio"] is not None for s in specs):
        if abs(line.point.P - want) > 1e-3 * want:
            line.warnings.append(Warning_(stated_delivery(norm)[0],
                                          f"the stage ratios give {line.point.P:.0f} Pa after the last cooler, "
                                          f"not the {want:.0f} Pa asked for",
                                          message_detail("The stage pressure ratios give {got} after the last "
                                                         "cooler, not the {want} asked for",
                                                         {"got": quantity(line.point.P, "pressure"),
                                                          "want": quantity(want, "pressure")})))
    result = _totals(ctx, inlet, line, mass_flow, detail)
    if norm.get("heat_recovery"):  # moist air: each cooler's own stream model (latent heat included)
        result.recovery = heat_recovery(norm["heat_recovery"], ctx.model, specs, line.stages, line.coolers,
                                        mass_flow, result.driver_power_W,
                                        hours=(norm.get("year") or {}).get("operating_hours_per_year"))
    for name in ("shaft_power_W", "energy_residual", "exergy_residual", "second_law_efficiency"):
        if not math.isfinite(getattr(result, name)):
            raise ArithmeticError(f"non-finite {name} in train solve")  # a bug, never user input
    return result


def _intake_filter(ctx: SolveContext, mass_flow: float) -> InletResult:
    r"""Balance of the intake filter, a throttle from ambient to the stage-1 inlet [1]_.

    .. math:: \dot S_\mathrm{gen} = \dot m (s_1 - s_0), \qquad \dot X_\mathrm{dest} = T_0 \dot S_\mathrm{gen}

    Parameters
    ----------
    ctx : SolveContext
        The solve's context (its intake state: ambient and filter outlet).
    mass_flow : float
        Mass flow of (dry) air, [kg/s].

    Returns
    -------
    InletResult
        Ambient and filter outlet states, entropy generation [W/K], exergy destroyed [W].

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-13 (entropy balance), §8-6 (exergy destroyed).
    """
    intake = ctx.intake
    filt_sgen = mass_flow * (intake.after_filter.s - intake.ambient.s)
    return InletResult(intake.ambient, intake.after_filter, filt_sgen, ctx.site.ambient_temperature_K * filt_sgen)


@dataclass
class _Line:
    """The stages and coolers solved so far, in flow order, and the stream leaving them."""

    model: PropertyModel  #: stream model of the air leaving (moist air: its water after the separators)
    point: Point  #: static state leaving
    velocity: float = 0.0  #: velocity leaving, [m/s]
    stages: list = field(default_factory=list)
    coolers: list = field(default_factory=list)  #: one entry per stage, None where it has no cooler
    drains: list = field(default_factory=list)  #: (kg/s, h, s, T, p) of condensate leaving each separator
    warnings: list = field(default_factory=list)


def _run_line(ctx: SolveContext, ratios: list, mass_flow: float, detail: bool, reuse: dict | None = None) -> _Line:
    """Solve every stage and its cooler in flow order; after a separator the stream carries its new water.

    Parameters
    ----------
    ctx : SolveContext
        The solve's context (stages, intake state, mixture).
    ratios : list of float
        Stage pressure ratios, first stage first, [-].
    mass_flow : float
        Mass flow of (dry) air, [kg/s].
    detail : bool
        As :func:`solve_train`.
    reuse : dict or None
        As :func:`solve_train`.

    Returns
    -------
    _Line
        Solved stages and coolers, the stream leaving the last of them, the condensate
        drained and the warnings (a discharge above its limit, water knocked out or carried).

    Raises
    ------
    StagewrightError
        As :func:`stagewright.core.stage.solve_stage`, :func:`stagewright.core.cooler.solve_cooler` and
        :func:`stagewright.core.moist.stream.check_humid_range`.

    Notes
    -----
    The balances are those of :func:`stagewright.core.stage.solve_stage` and
    :func:`stagewright.core.cooler.solve_cooler`, with their sources.
    """
    intake, mixture = ctx.intake, ctx.mixture
    specs = ctx.norm["stages"]
    line = _Line(intake.model, intake.after_filter)
    rime = intake_rime_warning(intake.frost_deposit, mass_flow, ctx.site.ambient_temperature_K)
    if rime is not None:
        line.warnings.append(rime)
    for i, spec in enumerate(specs):
        st, c = _stage_and_cooler(ctx, line, i, line.point.P * ratios[i], mass_flow, detail, reuse)
        line.stages.append(st)
        if detail and math.isnan(st.polytropic_efficiency):
            line.warnings.append(_polytropic_unavailable(i, spec))
        limit = spec.get("max_discharge_temperature_K")
        if limit is not None and st.outlet.T > limit:
            line.warnings.append(_limit_warning(i, st.outlet.T, limit))
        line.point, line.velocity = st.outlet, st.exit_velocity_m_s
        if c is None:
            line.coolers.append(None)
            continue
        line.coolers.append(c)
        line.point, line.velocity = c.leaving, 0.0
        if c.water is not None:
            w = c.water
            if w.drained_kg_s > 0.0:
                line.drains.append((w.drained_kg_s, w.liquid_enthalpy_J_kg, w.liquid_entropy_J_kgK,
                                    line.point.T, line.point.P))
            line.warnings.extend(_water_notes(i, len(specs), w, mass_flow))
            frozen = frozen_condensate_warning(i, len(specs), c, (spec["cooler"].get("coolant") or {}).get("kind"),
                                               ctx.site.ambient_temperature_K)
            if frozen is not None:
                line.warnings.append(frozen)
            line.model = moist_stream(mixture, w.water_after)
    return line


def _stage_and_cooler(ctx: SolveContext, line: _Line, i: int, p_out: float, mass_flow: float, detail: bool,
                      reuse: dict | None) -> tuple:
    """Stage ``i`` and its cooler (None without one) from the stream leaving the line so far.

    With ``reuse`` (a dict kept by the caller across solves of one document that differ only
    in stage ratios, e.g. a study's trials) a stage whose inlet stream, discharge pressure,
    mass flow and water are those of an earlier solve is taken from it: the same inputs give
    the same results, so nothing reported changes.
    """
    key = None
    if reuse is not None:
        key = (i, line.point, line.velocity, p_out, mass_flow, detail, getattr(line.model, "water", None))
        hit = reuse.get(key)
        if hit is not None:
            return hit
    intake, mixture = ctx.intake, ctx.mixture
    spec = ctx.norm["stages"][i]
    st = solve_stage(line.model, spec, i, line.point, line.velocity, p_out, mass_flow, intake.dead, detail)
    if mixture is not None:
        try:
            check_humid_range(mixture, [st.outlet, max(known_points(st.path), key=lambda p: p.T)], f"stages[{i}]",
                              f"stage {i + 1} discharge")
        except InputError as exc:  # named by the input the remedy changes first: the stage's ratio
            raise InputError(f"stages[{i}].pressure_ratio", round(st.pressure_ratio, 6), exc.problem.expected,
                             exc.detail) from None
    c = None
    if spec["cooler"] is not None:
        c = solve_cooler(line.model, spec["cooler"], i, st.outlet, st.exit_velocity_m_s, mass_flow, intake.dead,
                         8 if detail else 0, ambient_relative_humidity=intake.relative_humidity)
    if key is not None:
        if len(reuse) >= _REUSE_MAX:
            reuse.clear()
        reuse[key] = (st, c)
    return st, c


_REUSE_MAX = 4096  #: stages kept by one ``reuse`` dict


def _totals(ctx: SolveContext, inlet: InletResult, line: _Line, mass_flow: float, detail: bool) -> TrainResult:
    """Totals of the train, its reversible isothermal power and the energy and exergy closures [1]_.

    Parameters
    ----------
    ctx : SolveContext
        The solve's context (dead state, ambient, mixture, driver efficiency).
    inlet : InletResult
        The intake filter's balance.
    line : _Line
        The solved stages and coolers (:func:`_run_line`).
    mass_flow : float
        Mass flow of (dry) air, [kg/s].
    detail : bool
        As :func:`solve_train` (the atmospheric dew point of the delivered air is
        reporting-only).

    Returns
    -------
    TrainResult
        Without ``recovery`` (added by :func:`solve_train`).

    Notes
    -----
    The equations are those of :func:`solve_train`.

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.5 (exergy balance, exergetic efficiency).
    """
    intake, mixture, model = ctx.intake, ctx.mixture, line.model
    stages, coolers, point, velocity, drains = line.stages, line.coolers, line.point, line.velocity, line.drains
    dead, ambient = intake.dead, intake.ambient
    shaft = sum(s.shaft_power_W for s in stages)
    q_rej = (sum(c.duty_W for c in coolers if c) + sum(s.heat_loss_W + s.mechanical_loss_W for s in stages))
    s_gen = inlet.entropy_generation_W_K + sum(s.entropy_generation_W_K for s in stages) + sum(
        c.entropy_generation_W_K for c in coolers if c)
    x_dest = inlet.exergy_destroyed_W + sum(s.exergy_destroyed_W for s in stages) + sum(
        c.exergy_destroyed_W for c in coolers if c)
    x_heat = sum(s.heat_loss_exergy_W for s in stages) + sum(c.heat_exergy_W for c in coolers if c)
    x_gain = mass_flow * flow_exergy(point, velocity, dead)
    iso_mixture = mixture.interpolated() if mixture is not None else None  # the reference hardly depends on f
    iso = mass_flow * _isothermal_exergy(model, point.P, dead, iso_mixture)
    if mixture is None:
        energy_res = (shaft - mass_flow * (point.h + 0.5 * velocity ** 2 - ambient.h) - q_rej) / shaft
        exergy_res = (shaft - x_gain - x_dest - x_heat) / shaft
        fad = mass_flow / ambient.rho
        water = None
    else:
        h_drained = sum(m * h for m, h, _, _, _ in drains)
        x_drained = sum(m * water_exergy(h, s, dead) for m, h, s, _, _ in drains)
        for m, _, _, _, p in drains:  # the isothermal reference delivers the condensate at T0 too
            iso += m * _liquid_exergy_at_dead_temperature(iso_mixture, p, dead)
        ke = 0.5 * velocity ** 2 * model.mass_per_dry_kg
        energy_res = (shaft - mass_flow * (point.h + ke - ambient.h) - h_drained - q_rej) / shaft
        exergy_res = (shaft - x_gain - x_drained - x_dest - x_heat) / shaft
        fad = mass_flow * (1.0 + ambient.w) / ambient.rho
        water = _water_result(mixture, ctx.model, mass_flow, intake.humidity_ratio, point, ctx.site.pressure_Pa,
                              drains, x_drained, detail)
    driver_eff = ctx.norm["driver"]["efficiency"]
    normal = mass_flow / fixed_state(ctx.model, NORMAL_TEMPERATURE, NORMAL_PRESSURE, "normal state").rho
    driver = shaft / driver_eff
    return TrainResult(
        model=model.name, eos_reference=coolprop_adapter.eos_reference(model.name), dead=dead,
        mass_flow_kg_s=mass_flow, free_air_delivery_m3_s=fad, normal_volume_flow_m3_s=normal,
        inlet=inlet, stages=stages, coolers=coolers, delivery=point, delivery_velocity_m_s=velocity,
        shaft_power_W=shaft, driver_power_W=driver,
        specific_power_kW_per_m3_min=(driver / 1000.0) / (fad * 60.0),
        heat_rejected_W=q_rej, entropy_generation_W_K=s_gen, exergy_destroyed_W=x_dest,
        heat_exergy_W=x_heat, exergy_gained_W=x_gain, isothermal_power_W=iso,
        isothermal_efficiency=iso / shaft, second_law_efficiency=x_gain / shaft,
        energy_residual=energy_res, exergy_residual=exergy_res, warnings=line.warnings, water=water)


def _isothermal_exergy(model, P: float, dead, mixture=None) -> float:
    r"""Specific flow exergy of the delivered air brought to the ambient temperature at pressure P,
    [J/kg] (per kilogram of dry air for moist air): the reversible isothermal reference [1]_.

    Dry air: :func:`stagewright.core.exergy.flow_exergy` of the state at :math:`(T_0, p)`. Moist air
    whose water partly condenses at :math:`(T_0, p)`: the gas phase's exergy plus
    :math:`w_l\,(h_l - T_0 s_l)`, and at :math:`T = T_0` the liquid's :math:`h_l - T_0 s_l` is its
    Gibbs energy :math:`g_l = \mu_w(T_0, p, x_{ws})`
    (:meth:`~stagewright.core.moist.mixture.MoistMixture.liquid_gibbs`), which needs no temperature
    derivative of the enhancement factor (the same figure to rounding; four fewer RP-1485 calls).
    ``mixture``: the moist mixture to take the equilibrium and the liquid from (the train's
    :meth:`~stagewright.core.moist.mixture.MoistMixture.interpolated` twin; None: the model's own).

    .. math:: \psi = h_g - h_0 - (W - W_0) h_{w0} - T_0\,[s_g - s_0 - (W - W_0) s_{w0}] + w_l\,g_l

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.3 (exergy of a stream), §3.4 (chemical exergy, environment with water vapour).
    """
    T0 = dead.T0
    if not isinstance(model, MoistAir):
        return flow_exergy(model.at_tp(T0, P, "isothermal reference"), 0.0, dead)
    check_range(T0, P, "isothermal reference")
    if mixture is not None and mixture is not model.mixture:
        model = moist_stream(mixture, model.water)  # the same stream on that mixture's enhancement factor
    w_v, w_l = model.split(T0, P)
    if w_l == 0.0:
        return flow_exergy(model.at_tp(T0, P, "isothermal reference"), 0.0, dead)
    mixture = model.mixture
    h, s = mixture.gas(T0, P, w_v, False)[:2]
    dw = w_v + w_l - dead.W0
    return (h - dead.h0 - dw * dead.hw0) - T0 * (s - dead.s0 - dw * dead.sw0) + w_l * mixture.liquid_gibbs(T0, P)


def _liquid_exergy_at_dead_temperature(mixture, P: float, dead) -> float:
    r"""Specific exergy of condensed water at the ambient temperature and pressure P, [J/kg] [1]_:
    :func:`stagewright.core.exergy.water_exergy` with :math:`h_l - T_0 s_l = g_l(T_0, p)`
    (:meth:`~stagewright.core.moist.mixture.MoistMixture.liquid_gibbs`; no temperature derivative
    of the enhancement factor is needed at :math:`T = T_0`).

    .. math:: \psi_w = g_l(T_0, p) - h_{w0} + T_0 s_{w0}

    References
    ----------
    .. [1] A. Bejan, G. Tsatsaronis, M. Moran, *Thermal Design and Optimization*, Wiley,
       1996, §3.4 (chemical exergy, environment with water vapour).
    """
    return mixture.liquid_gibbs(dead.T0, P) - dead.hw0 + dead.T0 * dead.sw0


def _water_result(mixture, dry_model, mass_flow, W0, delivered, P0, drains, x_drained,
                  detail: bool = True) -> WaterResult:
    """Water totals of a moist train: condensate, delivered dew points, ISO 8573-1 class
    (the atmospheric dew point is reporting-only: None in a trial solve)."""
    drained = sum(m for m, *_ in drains)
    delivered_water = mass_flow * (delivered.w + delivered.wl)
    pdp = mixture.dew_point(delivered.P, delivered.w)
    adp = mixture.dew_point(P0, delivered.w) if detail else None
    ref = fixed_state(dry_model, REFERENCE_TEMPERATURE, REFERENCE_PRESSURE, "ISO 8573-1 reference state")
    liquid_conc = delivered.wl * ref.rho  # kg liquid per m³ of air at the reference conditions
    return WaterResult(
        mixture=mixture, intake_humidity_ratio=W0, intake_water_kg_s=mass_flow * W0,
        condensate_kg_s=drained, delivered_water_kg_s=delivered_water, delivered_liquid_kg_s=mass_flow * delivered.wl,
        delivered_pressure_dew_point_K=pdp, delivered_atmospheric_dew_point_K=adp,
        delivered_liquid_kg_m3=liquid_conc, iso8573_humidity_class=humidity_class(pdp, liquid_conc),
        condensate_exergy_W=x_drained,
        water_balance_residual=_water_residual(mass_flow * W0, delivered_water, drained))


def _water_residual(intake_kg_s: float, delivered_kg_s: float, drained_kg_s: float) -> float:
    """Water balance closure over the intake's water; 0 when the intake carries none a float can hold
    (a humidity ratio of 1e-320 times a small flow underflows to 0: nothing in, nothing out)."""
    if intake_kg_s <= 0.0:
        return 0.0
    return (intake_kg_s - delivered_kg_s - drained_kg_s) / intake_kg_s


def _polytropic_unavailable(i: int, spec: dict) -> Warning_:
    """A reported-only figure that could not be found (no constant-efficiency path to the discharge
    stays within the property range): shown as unavailable; powers, states and totals stand."""
    key = "value_K" if spec["efficiency"]["kind"] == "discharge_temperature" else "value"
    text = ("the polytropic efficiency could not be found (no constant-efficiency path to the discharge "
            "stays within the property range) and is shown as unavailable; the balance is not affected")
    return Warning_(f"stages[{i}].efficiency.{key}", f"stage {i + 1}: {text}",
                    message_detail("Stage {n}: " + text, {"n": i + 1}))


def _limit_warning(i: int, t_out: float, limit: float) -> Warning_:
    """A stage discharging above its temperature limit: the value and the limit (a hazard)."""
    return Warning_(f"stages[{i}].max_discharge_temperature_K",
                    f"stage {i + 1} discharge {t_out:.1f} K exceeds its limit {limit:.1f} K",
                    message_detail("Stage {n} discharge temperature {t} is above its {limit} limit",
                                   {"n": i + 1, "t": quantity(t_out, "temperature"),
                                    "limit": quantity(limit, "temperature")}))


def _water_notes(i: int, n: int, water, mass_flow: float) -> list:
    """Messages about water a cooler knocks out or lets through (condensate is a hazard to manage)."""
    name = "aftercooler" if i == n - 1 else f"intercooler {i + 1}"
    notes = []
    if water.drained_kg_s > 0.0:
        tail = (": it needs a working drain, and the condensate must be treated or disposed of as local "
                "rules require")
        notes.append(Warning_(f"stages[{i}].cooler.separator_efficiency",
                              f"{name} drains {water.drained_kg_s * 3600.0:.2f} kg/h of condensate" + tail,
                              message_detail("{name} drains {flow} of condensate" + tail,
                                             {"name": name[:1].upper() + name[1:],
                                              "flow": quantity(water.drained_kg_s, "water_flow")})))
    carried = getattr(water, "carry_over_kg_s", 0.0) or 0.0
    if carried > 0.0:
        where = "the delivered air" if i == n - 1 else f"stage {i + 2}"
        notes.append(Warning_(f"stages[{i}].cooler.separator_efficiency",
                              f"{carried * 3600.0:.2f} kg/h of liquid water passes the {name}'s separator "
                              f"into {where}",
                              message_detail("{flow} of liquid water passes the {name}'s separator into {where}",
                                             {"flow": quantity(carried, "water_flow"), "name": name,
                                              "where": where})))
    return notes

