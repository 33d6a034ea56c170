"""One compression stage: first- and second-law balance of an open system [1]_ [2]_."""
from __future__ import annotations

__all__ = ["StageResult", "solve_stage"]

import math
from dataclasses import dataclass

from stagewright.core.errors import (InputError, PropertyRangeError, SecondLawViolation, StagewrightError, message_detail,
                           quantity)
from stagewright.core.chart_points import PointsOnDemand, known_points, path_ends
from stagewright.core.exergy import DeadState, heat_exergy
from stagewright.core.models.base import T_MAX, T_MIN, Point, PropertyModel
from stagewright.core.polytropic import polytropic_efficiency_between, polytropic_path


@dataclass
class StageResult:
    """Everything computed for one stage (SI units throughout)."""

    index: int
    inlet: Point
    inlet_velocity_m_s: float
    outlet: Point
    exit_velocity_m_s: float
    pressure_ratio: float
    isentropic_outlet: Point
    isentropic_efficiency: float
    polytropic_efficiency: float
    polytropic_exponent: float
    gas_power_W: float
    shaft_power_W: float
    mechanical_loss_W: float
    heat_loss_W: float
    heat_loss_boundary_temperature_K: float
    heat_loss_exergy_W: float
    entropy_generation_W_K: float
    exergy_destroyed_W: float
    path: list


def _adiabatic_path(model: PropertyModel, start: Point, h_end: float, p_out: float, eta_s: float,
                    detail: bool, where: str, t_guess: float, known_end: Point | None = None
                    ) -> tuple[float, list[Point]]:
    """Polytropic efficiency and path of the adiabatic compression ending at ``h_end``;
    without ``detail`` only the end point (NaN efficiency), which is all the power needs.
    ``known_end`` is the end state when it is already known (a measured discharge with no casing
    heat loss or exit kinetic energy): used where the search fails, rather than solved again."""
    if detail:
        try:
            return polytropic_efficiency_between(model, start, h_end, p_out, eta_s, T_guess=t_guess)
        except StagewrightError:
            # the polytropic efficiency is a reported figure only: when no path can be searched
            # (one near the top of the property range), the balance stands and the figure is
            # reported unavailable (NaN; the train adds a note) — unless the discharge itself is
            # out of range, which the at_hp below raises and _adiabatic_work names by its input
            if known_end is not None:
                return math.nan, [start, known_end]
    return math.nan, [start, model.at_hp(h_end, p_out, f"{where} discharge", T_guess=t_guess)]


def _ratio_out_of_range(spec: dict, where: str, start: Point, r: float, exc: PropertyRangeError) -> StagewrightError:
    """Even the isentropic discharge of a stage is beyond the property range: named by the stage's
    pressure ratio (given, or from the split), with what would bring it back."""
    field = f"{where}.pressure_ratio"
    text = (f"even an isentropic compression from {start.T:.2f} K at a pressure ratio of {r:.4g} would end "
            f"outside the property range ({T_MIN:g} K … {T_MAX:g} K); a lower pressure ratio (another stage) or a cooler before "
            "this stage keeps it in range")
    return PropertyRangeError(f"{field}: {spec.get('pressure_ratio')!r} — {text}", field,
                              message_detail("{label} {value}: " + text.replace("{", "{{").replace("}", "}}"),
                                             {"value": r}))


def _outlet_out_of_range(where: str, q_loss: float, v_out: float, exc: PropertyRangeError) -> StagewrightError:
    """The discharge after the casing heat loss and the exit kinetic energy is beyond the property
    range (cooled below it): named by the input that takes the energy away."""
    field, value, what = (f"{where}.heat_loss_W", q_loss, "casing heat loss") if q_loss > 0.0 else \
        (f"{where}.exit_velocity_m_s", v_out, "exit velocity")
    text = (f"the {what} takes the discharge outside the property range ({T_MIN:g} K … {T_MAX:g} K); "
            f"a smaller {what} keeps it in range")
    return PropertyRangeError(f"{field}: {value!r} — {text}", field,
                              message_detail("{label} {value}: " + text.replace("{", "{{").replace("}", "}}"),
                                             {"value": value}))


def _efficiency_out_of_range(model: PropertyModel, spec: dict, where: str, start: Point, iso: Point,
                             p_out: float, exc: PropertyRangeError) -> PropertyRangeError:
    """A discharge beyond the property range, named by the efficiency input that puts it there,
    with its value and the least efficiency that keeps the discharge in range."""
    eff = spec["efficiency"]
    kind, value = eff["kind"], eff.get("value")
    if kind == "discharge_temperature":
        field = f"{where}.efficiency.value_K"
        return PropertyRangeError(
            f"{field}: {eff['value_K']!r} — with the casing heat loss and exit kinetic energy, the adiabatic "
            f"compression would end above the property range (at most {T_MAX:g} K); a lower discharge "
            "temperature, heat loss or exit velocity keeps it in range", field,
            message_detail("{label} {value}: with the casing heat loss and exit kinetic energy, the adiabatic "
                           "compression would end above the property range (at most {t_max}); a lower discharge "
                           "temperature, heat loss or exit velocity keeps it in range",
                           {"value": quantity(eff["value_K"], "temperature"),
                            "t_max": quantity(T_MAX, "temperature")}))
    if iso.T >= T_MAX:
        field = f"{where}.pressure_ratio"
        return PropertyRangeError(
            f"{field}: {p_out / start.P:.6g} — even an isentropic compression would end above the property "
            f"range (at most {T_MAX:g} K); a lower pressure ratio (more stages) keeps it in range", field)
    field = f"{where}.efficiency.value"
    if kind == "isentropic":  # Δh = Δh_s/η_s up to h(T_max, p2)
        least = (iso.h - start.h) / (model.at_tp(T_MAX, p_out, field).h - start.h)
    else:  # ln(T2/T1) = ln(T2s/T1)/η_p for a perfect gas: an estimate for the others
        least = math.log(iso.T / start.T) / math.log(T_MAX / start.T)
    about = "" if kind == "isentropic" else "about "
    err = PropertyRangeError(
        f"{field}: {value!r} — the discharge would be above the property range (at most {T_MAX:g} K at "
        f"{p_out:.6g} Pa); an efficiency of {about}{least:.3g} or more keeps it in range", field,
        message_detail("{label} {value}: the discharge would be above the property range (at most {t_max} "
                       "at {p}); " + f"{about}" + "{least} or more keeps it in range",
                       {"value": value, "t_max": quantity(T_MAX, "temperature"), "p": quantity(p_out, "pressure"),
                        "least": round(least, 4)}))
    return err


def solve_stage(model: PropertyModel, spec: dict, index: int, inlet: Point, inlet_velocity: float,
                p_out: float, mass_flow: float, dead: DeadState, detail: bool = True) -> StageResult:
    r"""Solve one stage for its discharge state, power and entropy generation [1]_ [2]_.

    Energy (steady flow, inlet kinetic energy counted, casing heat loss :math:`\dot Q`):

    .. math::

        \dot W_\mathrm{gas} = \dot m \left(h_2 + \tfrac12 V_2^2 - h_1 - \tfrac12 V_1^2\right)
        + \dot Q, \qquad \dot W_\mathrm{shaft} = \dot W_\mathrm{gas} / \eta_m

    Entropy (heat leaves at the boundary temperature :math:`T_b`, mechanical losses end
    as heat at the dead-state temperature :math:`T_0`) and Gouy–Stodola:

    .. math::

        \dot S_\mathrm{gen} = \dot m (s_2 - s_1) + \frac{\dot Q}{T_b}
        + \frac{\dot W_\mathrm{shaft} - \dot W_\mathrm{gas}}{T_0}, \qquad
        \dot X_\mathrm{dest} = T_0 \dot S_\mathrm{gen}

    Parameters
    ----------
    model : PropertyModel
        Property model of the gas.
    spec : dict
        Normalised stage entry of the project document.
    index : int
        Position of the stage (0-based), for messages.
    inlet : Point
        Static inlet state.
    inlet_velocity : float
        Inlet velocity, [m/s] (non-zero only when a stage follows a stage directly).
    p_out : float
        Discharge pressure, [Pa].
    mass_flow : float
        Mass flow through the stage, [kg/s].
    dead : DeadState
        Site dead state.
    detail : bool
        False skips the reporting-only work: for isentropic and measured-temperature
        stages the polytropic efficiency is then NaN and the path holds only its two end
        points. Power, discharge state and entropy generation are the same either way
        (used by the staging study, which solves many trial splits).

    Returns
    -------
    StageResult

    Raises
    ------
    SecondLawViolation
        If a measured discharge temperature implies an isentropic efficiency above 1, or
        the balance needs negative entropy generation.

    Notes
    -----
    For moist air the model is a :class:`~stagewright.core.moist.stream.MoistAir` of the stage's total
    water; h and s are per kilogram of dry air, ``mass_flow`` is the dry-air flow and the
    kinetic energy is that of the whole moist mass. Liquid carried into a stage (a
    separator of efficiency below 1) evaporates as compression heats the stream, by
    phase equilibrium along the path.

    Efficiencies refer to the adiabatic internal compression from the inlet stagnation
    state to the discharge pressure, whose end enthalpy is
    :math:`h_{2i} = h_{01} + \dot W_\mathrm{gas}/\dot m`:
    :math:`\eta_s = (h_{2s} - h_{01})/(h_{2i} - h_{01})`; the polytropic efficiency is that
    of the constant-efficiency path from 01 to 2i (see :mod:`stagewright.core.polytropic`). The
    casing loss and the exit kinetic energy are then taken off to give the static
    discharge state. The returned ``path`` runs from the inlet to that actual discharge
    (:func:`_actual_path`), so that a chart never shows the stage hotter than it is. Efficiencies are therefore total-to-static: the exit kinetic energy
    counts as a loss, and an efficiency of 1 with a non-zero exit velocity is refused as a
    second-law violation. The polytropic exponent is :math:`n = \ln(p_2/p_1)/\ln(\rho_{2i}/\rho_{01})`.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §5-4 (steady-flow energy balance), §7-13 (entropy balance),
       §8-8 (second-law efficiency).
    .. [2] ASME PTC 10-1997, *Performance Test Code on Compressors and Exhausters*, §5.
    """
    where = f"stages[{index}]"
    eff = spec["efficiency"]
    v_out = spec["exit_velocity_m_s"]
    q_loss = spec["heat_loss_W"]
    q = q_loss / mass_flow
    k = getattr(model, "mass_per_dry_kg", 1.0)  # moist air: kinetic energy of 1 + W kg per kg dry air
    start = inlet if inlet_velocity == 0.0 else model.at_hp(
        inlet.h + 0.5 * inlet_velocity ** 2 * k, inlet.P, where, T_guess=inlet.T)
    r = p_out / start.P
    t_guess = start.T * r ** 0.285
    try:
        iso = model.at_sp(start.s, p_out, f"{where} isentropic discharge", T_guess=t_guess)
    except PropertyRangeError as exc:
        raise _ratio_out_of_range(spec, where, start, r, exc) from None
    dh_s = iso.h - start.h
    if not (r > 1.0 + 1e-9 and dh_s > 0.0):  # a ratio of 1 + 1e-16 passes "> 1" but gives 0/0 below
        raise InputError(f"{where}.pressure_ratio", r,
                         "expected a pressure ratio above 1 + 1e-9; this stage raises the pressure "
                         "too little to compute")
    dh, eta_p, path = _adiabatic_work(model, spec, where, start, iso, p_out, q, k, detail)
    if not math.isfinite(dh):  # e.g. an isentropic efficiency of 1e-320
        raise PropertyRangeError(f"{where}.efficiency.value: {eff.get('value')!r} — the compression work "
                                 "it implies is unbounded; the discharge state leaves the property range",
                                 f"{where}.efficiency.value")
    h_out = start.h + dh - q - 0.5 * v_out ** 2 * k
    if not detail and q_loss == 0.0 and v_out == 0.0:  # a trial's path ends at h_out already
        outlet = path[-1]
    else:
        last = path_ends(path)[1]
        near = getattr(model, "isobaric_guess", None)  # second order from the end's own inversion
        guess = near(last, h_out) if near is not None else None
        if guess is None:  # first order with a secant cp
            cp_mean = dh_s / (iso.T - start.T) if iso.T > start.T else 1000.0
            if last.T > iso.T + 0.1:  # the isobaric secant at p_out, nearer the discharge: a closer guess
                cp_mean = (last.h - iso.h) / (last.T - iso.T)
            guess = last.T + (h_out - last.h) / cp_mean
        try:
            outlet = model.at_hp(h_out, p_out, f"{where} discharge", T_guess=guess)
        except PropertyRangeError as exc:
            if abs(h_out - last.h) > 1e-9 * abs(dh):  # at the edge of the range (a measured
                raise _outlet_out_of_range(where, q_loss, v_out, exc) from None  # 1300 K): the known
            outlet = last                                                        # end is the outlet
    w_gas = mass_flow * dh
    w_shaft = w_gas / spec["mechanical_efficiency"]
    w_mech = w_shaft - w_gas
    t_b = spec["heat_loss_boundary_temperature_K"] or dead.T0
    _check_heat_loss(where, q_loss, t_b, known_points(path), outlet)
    end = path_ends(path)[1]  # end of the adiabatic internal compression (the efficiencies' reference)
    if q_loss != 0.0 or v_out != 0.0:  # chart points: made when a chart (or to_dict) reads them
        path = (PointsOnDemand(lambda: _actual_path(model, start, outlet, p_out, detail), (start, outlet))
                if detail else _actual_path(model, start, outlet, p_out, detail))
    s_gen = mass_flow * (outlet.s - inlet.s) + q_loss / t_b + w_mech / dead.T0
    if s_gen < -1e-9 * max(1.0, w_shaft / dead.T0):
        hint = (" — the efficiency is total-to-static, so it must leave room for the exit kinetic "
                "energy; lower the efficiency or the exit velocity") if v_out > 0.0 else ""
        key = "exit_velocity_m_s" if v_out > 0.0 else \
            "efficiency.value_K" if eff["kind"] == "discharge_temperature" else "efficiency.value"
        field = f"{where}.{key}"
        value = v_out if v_out > 0.0 else eff.get("value_K", eff.get("value"))
        raise SecondLawViolation(
            f"{field}: {value!r} — the given data need negative entropy generation ({s_gen:.4g} W/K): "
            f"a second-law violation{hint}", field,
            message_detail("Stage {n}: the given data need negative entropy generation ({s_gen}): a second-law "
                           "violation" + hint, {"n": index + 1, "s_gen": quantity(s_gen, "entropy_rate")}))
    n = math.log(p_out / start.P) / math.log(end.rho / start.rho)
    return StageResult(
        index=index, inlet=inlet, inlet_velocity_m_s=inlet_velocity, outlet=outlet,
        exit_velocity_m_s=v_out, pressure_ratio=r, isentropic_outlet=iso,
        isentropic_efficiency=dh_s / dh, polytropic_efficiency=eta_p, polytropic_exponent=n,
        gas_power_W=w_gas, shaft_power_W=w_shaft, mechanical_loss_W=w_mech, heat_loss_W=q_loss,
        heat_loss_boundary_temperature_K=t_b, heat_loss_exergy_W=heat_exergy(q_loss, t_b, dead.T0),
        entropy_generation_W_K=s_gen, exergy_destroyed_W=dead.T0 * s_gen, path=path)


def _adiabatic_work(model: PropertyModel, spec: dict, where: str, start: Point, iso: Point, p_out: float,
                    q: float, k: float, detail: bool) -> tuple[float, float, list[Point]]:
    r"""Specific work of the adiabatic internal compression, its polytropic efficiency and path [1]_.

    .. math:: \Delta h = \frac{h_{2s} - h_{01}}{\eta_s} \quad\text{or}\quad
       \Delta h = h(T_2, p_2) + \tfrac12 V_2^2 + q - h_{01}

    (isentropic efficiency, or measured discharge temperature with casing loss q per kg),
    or the end of the constant-efficiency path for a polytropic efficiency.

    Parameters
    ----------
    model : PropertyModel
        Property model of the gas.
    spec : dict
        Normalised stage entry (its ``efficiency`` and ``exit_velocity_m_s`` [m/s]).
    where : str
        Field path of the stage, for messages.
    start : Point
        Inlet stagnation state.
    iso : Point
        Isentropic discharge state.
    p_out : float
        Discharge pressure, [Pa].
    q : float
        Casing heat loss per kilogram, [J/kg].
    k : float
        Mass per kilogram of dry air carrying the kinetic energy, [-] (1 for dry air).
    detail : bool
        As :func:`solve_stage`.

    Returns
    -------
    tuple
        Δh [J/kg], polytropic efficiency [-] (NaN without ``detail`` unless given) and the path.

    Raises
    ------
    SecondLawViolation
        If a measured discharge temperature needs an isentropic efficiency above 1.

    References
    ----------
    .. [1] ASME PTC 10-1997, *Performance Test Code on Compressors and Exhausters*, §5.
    """
    try:
        return _adiabatic_work_of(model, spec, where, start, iso, p_out, q, k, detail)
    except PropertyRangeError as exc:
        raise _efficiency_out_of_range(model, spec, where, start, iso, p_out, exc) from None


def _adiabatic_work_of(model: PropertyModel, spec: dict, where: str, start: Point, iso: Point, p_out: float,
                       q: float, k: float, detail: bool) -> tuple[float, float, list[Point]]:
    """:func:`_adiabatic_work` by the kind of the efficiency input."""
    eff = spec["efficiency"]
    kind = eff["kind"]
    dh_s = iso.h - start.h
    if kind == "isentropic":
        dh = dh_s / eff["value"]
        eta_p, path = _adiabatic_path(model, start, start.h + dh, p_out, eff["value"], detail, where,
                                      start.T + (iso.T - start.T) / eff["value"])
    elif kind == "polytropic":
        path = polytropic_path(model, start, p_out, eff["value"])
        eta_p, dh = eff["value"], path[-1].h - start.h
    else:  # measured discharge temperature
        measured = model.at_tp(eff["value_K"], p_out, f"{where}.efficiency.value_K")
        dh = measured.h + 0.5 * spec["exit_velocity_m_s"] ** 2 * k + q - start.h
        if dh <= dh_s:
            raise SecondLawViolation(
                f"{where}.efficiency.value_K: a discharge temperature of {eff['value_K']:.2f} K "
                f"would need an isentropic efficiency above 1 (minimum adiabatic discharge "
                f"{iso.T:.2f} K with the given casing heat loss): a second-law violation — check "
                f"the measured temperatures and pressures", f"{where}.efficiency.value_K",
                message_detail("{label} {value} would need an isentropic efficiency above 1 (the coolest "
                               "adiabatic discharge is {t_min} with the given casing heat loss): a second-law "
                               "violation — check the measured temperatures and pressures",
                               {"value": quantity(eff["value_K"], "temperature"),
                                "t_min": quantity(iso.T, "temperature")}))
        adiabatic = q == 0.0 and spec["exit_velocity_m_s"] == 0.0  # the measured state ends the compression
        eta_p, path = _adiabatic_path(model, start, start.h + dh, p_out, dh_s / dh, detail, where, eff["value_K"],
                                      measured if adiabatic else None)
    return dh, eta_p, path


def _actual_path(model: PropertyModel, start: Point, outlet: Point, p_out: float, detail: bool) -> list[Point]:
    r"""The path of a stage that loses heat through its casing (or leaves with exit kinetic
    energy): from the inlet to the actual discharge state, never through the hotter end of
    the adiabatic reference compression [1]_.

    The real process is non-adiabatic; it is drawn as the path of constant polytropic
    efficiency between the actual end states (:math:`dh = v\,dp/\eta_p` with the
    :math:`\eta_p` found from the end points by
    :func:`stagewright.core.polytropic.polytropic_efficiency_between`), the usual end-point
    description of a compression whose heat transfer is not resolved along the way.

    Parameters
    ----------
    model : PropertyModel
        Property model of the gas.
    start : Point
        Inlet stagnation state.
    outlet : Point
        Static discharge state.
    p_out : float
        Discharge pressure, [Pa].
    detail : bool
        False keeps only the two end points (a trial solve draws nothing).

    Returns
    -------
    list of Point
        States from ``start`` to ``outlet``; the two end points alone where no
        compression path of positive efficiency joins them (the discharge is not hotter than
        the inlet).

    References
    ----------
    .. [1] ASME PTC 10-1997, *Performance Test Code on Compressors and Exhausters*, §5
       (polytropic process between the measured end states).
    """
    if not detail or outlet.T <= start.T:
        return [start, outlet]
    iso = model.at_sp(start.s, p_out, "stage path", T_guess=outlet.T)
    guess = (iso.h - start.h) / (outlet.h - start.h)
    try:
        _, path = polytropic_efficiency_between(model, start, outlet.h, p_out, guess)
    except StagewrightError:
        return [start, outlet]
    return path[:-1] + [outlet]


def _check_heat_loss(where: str, q_loss: float, t_b: float, path: list[Point], outlet: Point) -> None:
    """Refuse a casing heat loss that would leave the gas below the boundary it leaves at [1]_:
    heat flows from the hotter body only (Clausius statement of the second law).

    Parameters
    ----------
    where : str
        Field path of the stage, for messages.
    q_loss : float
        Casing heat loss, [W].
    t_b : float
        Boundary temperature at which it leaves, [K].
    path : list of Point
        Compression path.
    outlet : Point
        Static discharge state.

    Raises
    ------
    SecondLawViolation
        If the gas is never hotter than the boundary, or the loss cools it below.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, ch. 6 (the Clausius statement of the second law).
    """
    if q_loss > 0.0 and t_b > max(p.T for p in path):
        raise SecondLawViolation(
            f"{where}.heat_loss_boundary_temperature_K: casing heat cannot leave at {t_b:.2f} K "
            f"when the gas is never hotter than {max(p.T for p in path):.2f} K "
            "(a second-law violation)", f"{where}.heat_loss_boundary_temperature_K",
            message_detail("{label} {t_b}: casing heat cannot leave at this temperature when the gas is never "
                           "hotter than {t_max} (a second-law violation)",
                           {"t_b": quantity(t_b, "temperature"), "t_max": quantity(max(p.T for p in path),
                                                                                   "temperature")}))
    if q_loss > 0.0 and outlet.T < t_b:
        raise SecondLawViolation(
            f"{where}.heat_loss_W: a casing heat loss of {q_loss:.6g} W would cool the gas to "
            f"{outlet.T:.2f} K, below the {t_b:.2f} K boundary it leaves at (a second-law "
            "violation); lower the heat loss or raise the flow", f"{where}.heat_loss_W",
            message_detail("{label} {q} would cool the gas to {t_out}, below the {t_b} boundary it leaves at "
                           "(a second-law violation): lower the heat loss or raise the flow",
                           {"q": quantity(q_loss, "heat_flow"), "t_out": quantity(outlet.T, "temperature"),
                            "t_b": quantity(t_b, "temperature")}))
