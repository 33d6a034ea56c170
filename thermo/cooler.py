"""An intercooler or aftercooler: heat rejected at the coolant temperature [1]_."""
from __future__ import annotations

__all__ = ["CoolerResult", "solve_cooler", "cooler_outlet_temperature", "outlet_field"]

from dataclasses import dataclass, field

from stagewright.core.chart_points import PointsOnDemand
from stagewright.core.moist.condensation import Condensation, condensation, cooling_line
from stagewright.core.moist.dew_point import dew_point
from stagewright.core.moist.saturated_table import saturated_table
from stagewright.core.errors import InputError
from stagewright.core.exchanger import Exchanger, HotSide, make_coolant, rate_exchanger, size_exchanger
from stagewright.core.exergy import DeadState, heat_exergy
from stagewright.core.models.base import Point, PropertyModel, check_range

_FROST_LOW = 173.15  #: lowest dew (frost) point searched for in a cooler, [K] (the schema's lowest dew point)
_FAST_RATING_RTOL = 1e-9  #: rated air outlet on the fast property path (trial solves, year bins), relative


@dataclass
class CoolerResult:
    """Everything computed for one cooler (SI units throughout)."""

    index: int
    inlet: Point
    outlet: Point
    duty_W: float
    boundary_temperature_K: float
    heat_exergy_W: float
    entropy_generation_W_K: float
    exergy_destroyed_W: float
    path: list
    arrangement: str = "counter_flow"
    exchanger: Exchanger | None = None  #: coolant side, UA, ε, NTU, LMTD (when a coolant is given)
    #: air-side pressure at the outlet and stagnation inlet temperature, for heat recovery
    stagnation_inlet_temperature_K: float | None = None
    #: moist air only: condensation and separator (None for dry air)
    water: Condensation | None = None
    #: the stream model the cooler was solved with (moist air: its total water), for heat recovery
    stream_model: object = field(default=None, repr=False, compare=False)

    @property
    def leaving(self) -> Point:
        """The stream that goes on to the next stage (after the separator for moist air)."""
        return self.outlet if self.water is None else self.water.after


def coolant_inlet_temperature(spec: dict, ambient_K: float) -> float | None:
    """Coolant inlet temperature [K]: as given, else the site ambient for an air coolant."""
    if spec.get("coolant_inlet_temperature_K") is not None:
        return spec["coolant_inlet_temperature_K"]
    coolant = spec.get("coolant")
    return ambient_K if coolant is not None and coolant["kind"] == "air" else None


def cooler_outlet_temperature(spec: dict, ambient_K: float | None = None) -> float | None:
    """Air outlet temperature a cooler entry asks for, [K] (outlet given or coolant + approach);
    ``None`` when the cooler is rated from its UA (the outlet is then a result)."""
    if spec.get("outlet_temperature_K") is not None:
        return spec["outlet_temperature_K"]
    if spec.get("approach_K") is None:
        return None
    t_c = coolant_inlet_temperature(spec, ambient_K) if ambient_K is not None else spec["coolant_inlet_temperature_K"]
    return t_c + spec["approach_K"]


def outlet_field(spec: dict, where: str) -> str:
    """Input path of the key that sets the cooler's air outlet."""
    for key in ("outlet_temperature_K", "approach_K", "ua_W_K"):
        if spec.get(key) is not None:
            return f"{where}.{key}"
    return f"{where}.outlet_temperature_K"


def _hot_side(model, where: str, t_stag: float, h_in0: float, p_out: float, mass_flow: float,
              saturated=None):
    r"""``hot_at(T_out)`` → :class:`~stagewright.core.exchanger.HotSide` of the air cooled to ``T_out``.

    For moist air that condenses before ``T_out`` the hot side carries the dew point at the
    cooler outlet pressure, the duty down to it, the equilibrium enthalpy per kg dry air
    (liquid water included) and the mean specific heat of the unsaturated part, so that
    the exchanger is split into a dry and a wet zone (:mod:`stagewright.core.exchanger.sizing`,
    Braun, Klein & Mitchell 1989). Dry air, or moist air that stays above its dew point,
    gives the plain sensible hot side.

    ``saturated``: a :class:`~stagewright.core.moist.saturated_table.SaturatedTable` at ``p_out`` (a
    year's rated cooler on the fast property path), from which the equilibrium enthalpy below the
    dew point is interpolated; None computes it from the stream.
    """
    moist = getattr(model, "mixture", None) is not None and model.water > 0.0
    cache: dict = {}
    points: dict = {}
    # moist air: the equilibrium enthalpy alone (the same sum at_tp makes, without the entropy, the
    # liquid's volume and the Point: a two-phase state's liquid volume was a quarter of a wet sizing)
    h_only = getattr(model, "_h", None) if getattr(model, "mixture", None) is not None else None
    where_out = f"{where} outlet"

    def h_eq(T: float) -> float:
        # a rating sizes the exchanger several times: the dew point and coolant inlet repeat
        h = points.get(T)
        if h is None:
            if len(points) > 64:
                points.clear()
            if h_only is not None:
                check_range(T, p_out, where_out)
                h = None if saturated is None else saturated.enthalpy(T, model.water)
                h = points[T] = h_only(T, p_out) if h is None else h
            else:
                h = points[T] = model.at_tp(T, p_out, where_out).h
        return h

    def dew(t_out: float):
        # the dew point does not depend on the outlet asked for; search once over the widest span
        if "t" not in cache:
            cache["t"] = dew_point(model.mixture, model.water, p_out, _FROST_LOW, t_stag)
        t_dew = cache["t"]
        return t_dew if t_dew is not None and t_out < t_dew < t_stag else None

    def hot_at(t: float) -> HotSide:
        duty = mass_flow * (h_in0 - h_eq(t))
        t_dew = dew(t) if moist else None
        if t_dew is None:
            return HotSide(t_stag, t, duty)
        if "q_dew" not in cache:
            cache["q_dew"] = mass_flow * (h_in0 - h_eq(t_dew))
        q_dew = cache["q_dew"]
        return HotSide(t_stag, t, duty, dew_point_K=t_dew, dew_point_duty_W=q_dew, flow_kg_s=mass_flow,
                       equilibrium_enthalpy=h_eq, moist_cp_J_kgK=q_dew / (mass_flow * (t_stag - t_dew)))

    return hot_at


def solve_cooler(model: PropertyModel, spec: dict, index: int, inlet: Point, inlet_velocity: float,
                 mass_flow: float, dead: DeadState, path_points: int = 8,
                 ambient_relative_humidity: float = 0.0) -> CoolerResult:
    r"""Heat duty and entropy generation of a cooler [1]_.

    .. math::

        \dot Q = \dot m \left(h_1 + \tfrac12 V_1^2 - h_2\right), \qquad
        \dot S_\mathrm{gen} = \dot m (s_2 - s_1) + \frac{\dot Q}{T_b}, \qquad
        \dot X_Q = \dot Q \left(1 - \frac{T_0}{T_b}\right)

    Parameters
    ----------
    model : PropertyModel
        Property model of the gas.
    spec : dict
        Normalised ``cooler`` entry of a stage.
    index : int
        Position of the stage the cooler follows (0-based), for messages.
    inlet : Point
        Air inlet state (the stage discharge).
    inlet_velocity : float
        Air inlet velocity, [m/s]; the outlet velocity is taken as negligible.
    mass_flow : float
        Air mass flow, [kg/s].
    dead : DeadState
        Site dead state.
    path_points : int
        Number of segments of the cooling line returned for the T–s chart; 0 returns only
        inlet and outlet (trial solves: no chart, and no dew-point search on the line).
    ambient_relative_humidity : float
        Site relative humidity, [-] (humidity of an air coolant).

    Returns
    -------
    CoolerResult

    Raises
    ------
    InputError
        If the outlet temperature is above the inlet temperature or below the
        temperature of the heat sink, the pressure drop exceeds the inlet pressure, or
        (with a coolant) the temperatures cross or the coolant flow is too small.

    Notes
    -----
    For moist air (a :class:`~stagewright.core.moist.stream.MoistAir` model) the outlet is at phase
    equilibrium: below the dew point at the outlet pressure it is saturated and the rest
    of the water is liquid. The duty is split into sensible and latent parts and the
    separator after the cooler removes its fraction of that liquid
    (:func:`stagewright.core.moist.condensation.condensation`); the entropy balance covers cooler and
    separator, whose phase split itself generates no entropy. The chart line includes the
    dew point and ends with the separator step at the outlet temperature.

    Without a ``coolant`` entry the heat crosses the boundary at the coolant inlet
    temperature when one is given, otherwise at the site ambient temperature; the
    exchanger's own internal temperature differences and the coolant's warming are then
    part of the cooler's entropy generation. With a ``coolant`` entry the exchanger is
    sized (or, from ``ua_W_K``, rated) by :mod:`stagewright.core.exchanger`, and the heat crosses
    at the coolant's thermodynamic mean temperature :math:`\bar T_c = \Delta h_c/\Delta s_c`,
    so that :math:`\dot Q/\bar T_c` is the entropy the coolant gains and the heat's
    exergy is the exergy the coolant gains. The cooling line for charts assumes the
    pressure falls linearly with temperature.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-13 (entropy balance with boundary heat transfer), §8-6.
    """
    where = f"stages[{index}].cooler"
    field = outlet_field(spec, where)
    coolant = spec.get("coolant")
    t_out = cooler_outlet_temperature(spec, dead.T0)
    t_b = spec.get("coolant_inlet_temperature_K") or dead.T0
    p_out = inlet.P - spec["pressure_drop_Pa"]
    if p_out <= 0.5 * inlet.P:
        raise InputError(f"{where}.pressure_drop_Pa", spec["pressure_drop_Pa"],
                         f"expected less than half the cooler inlet pressure ({0.5 * inlet.P:.0f} Pa)")
    exchanger, t_stag = None, inlet.T
    if coolant is not None:
        t_out, exchanger, t_stag, t_b = _exchanger(model, spec, where, field, inlet, inlet_velocity, p_out,
                                                   mass_flow, dead, t_out, ambient_relative_humidity)
    if t_out > (t_stag if exchanger is not None else inlet.T):
        raise InputError(field, t_out if field.endswith("_temperature_K") else spec["approach_K"],
                         f"cooler outlet {t_out:.2f} K is above its inlet {inlet.T:.2f} K; "
                         "a cooler cannot heat the air")
    if coolant is None and t_out < t_b:
        raise InputError(field, t_out if field.endswith("_temperature_K") else spec["approach_K"],
                         f"cooler outlet {t_out:.2f} K is below the heat-sink temperature "
                         f"{t_b:.2f} K (coolant inlet, or ambient when none is given)")
    moist = getattr(model, "mixture", None) is not None
    outlet = model.at_tp(t_out, p_out, f"{where} outlet")
    ke = 0.5 * inlet_velocity ** 2 * model.mass_per_dry_kg if moist else 0.5 * inlet_velocity ** 2
    duty = mass_flow * (inlet.h + ke - outlet.h)
    s_gen = mass_flow * (outlet.s - inlet.s) + duty / t_b
    water = condensation(model, inlet, outlet, duty, mass_flow, spec["separator_efficiency"]) if moist else None
    if path_points:  # chart points: made when a chart (or to_dict) reads them, never for the balance
        path = PointsOnDemand(lambda: _cooling_path(model, where, inlet, outlet, t_out, p_out, path_points, water),
                              (inlet, water.after if water is not None and water.drained_kg_s > 0.0 else outlet))
    else:
        path = _cooling_path(model, where, inlet, outlet, t_out, p_out, path_points, water)
    return CoolerResult(index=index, inlet=inlet, outlet=outlet, duty_W=duty, boundary_temperature_K=t_b,
                        heat_exergy_W=heat_exergy(duty, t_b, dead.T0), entropy_generation_W_K=s_gen,
                        exergy_destroyed_W=dead.T0 * s_gen, path=path,
                        arrangement=spec.get("arrangement", "counter_flow"), exchanger=exchanger,
                        stagnation_inlet_temperature_K=t_stag, water=water, stream_model=model)


def _exchanger(model: PropertyModel, spec: dict, where: str, field: str, inlet: Point, inlet_velocity: float,
               p_out: float, mass_flow: float, dead: DeadState, t_out: float | None,
               ambient_relative_humidity: float) -> tuple[float, Exchanger | None, float, float]:
    r"""The coolant side of a cooler: sized for the outlet asked for, or rated from its UA [1]_.

    The air enters at its stagnation state, :math:`h_{01} = h_1 + \tfrac12 V_1^2`; the heat
    crosses at the coolant's thermodynamic mean temperature :math:`\bar T_c = \Delta h_c/\Delta s_c`
    (:mod:`stagewright.core.exchanger`).

    Parameters
    ----------
    model : PropertyModel
        Stream model of the air.
    spec : dict
        Normalised ``cooler`` entry (with a ``coolant``).
    where, field : str
        Field paths of the cooler and of the key that sets its outlet, for messages.
    inlet : Point
        Air inlet state.
    inlet_velocity : float
        Air inlet velocity, [m/s].
    p_out : float
        Air outlet pressure, [Pa].
    mass_flow : float
        Air mass flow, [kg/s].
    dead : DeadState
        Site dead state (ambient of an air coolant).
    t_out : float or None
        Air outlet temperature asked for, [K]; None when rated from ``ua_W_K``.
    ambient_relative_humidity : float
        Site relative humidity, [-] (of an air coolant).

    Returns
    -------
    tuple
        Air outlet temperature [K], the exchanger (None when the air is not cooled),
        stagnation inlet temperature [K] and the heat's boundary temperature [K].

    Raises
    ------
    InputError
        If the coolant is not colder than the air, or the outlet asked for is not above the
        coolant inlet; see also :func:`stagewright.core.exchanger.size_exchanger` and
        :func:`stagewright.core.exchanger.rate_exchanger`.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §5-4 (steady-flow energy balance), §7-13 (entropy balance with
       boundary heat transfer).
    """
    coolant = spec["coolant"]
    t_ci = coolant_inlet_temperature(spec, dead.T0)
    t_stag = inlet.T
    exchanger = None
    h_in0 = inlet.h + 0.5 * inlet_velocity ** 2 * getattr(model, "mass_per_dry_kg", 1.0)
    if inlet_velocity > 0.0:
        t_stag = model.at_hp(h_in0, inlet.P, f"{where} inlet (stagnation)", T_guess=inlet.T).T

    fast = getattr(getattr(model, "dry", model), "fast_properties", False)  # trial solves: 1e-4 suffices
    saturated = None
    if fast and spec.get("rating_start") is not None and getattr(model, "mixture", None) is not None:
        saturated = saturated_table(model.mixture, p_out)  # a year's bins: the same pressure every bin
    hot_at = _hot_side(model, where, t_stag, h_in0, p_out, mass_flow, saturated)

    fluid = make_coolant(coolant, (dead.T0, dead.P0, ambient_relative_humidity), fast=fast,
                         humidity_ratio=dead.W0 if fast and dead.W0 > 0.0 else None)
    flow, rise = coolant.get("flow_kg_s"), coolant.get("temperature_rise_K")
    if t_ci >= t_stag:
        raise InputError(f"{where}.coolant_inlet_temperature_K", t_ci,
                         f"expected below the cooler air inlet {t_stag:.2f} K: the coolant cannot "
                         "cool air colder than itself")
    if t_out is None:
        t_out, exchanger = rate_exchanger(spec["arrangement"], spec["ua_W_K"], t_stag, hot_at, fluid,
                                          t_ci, flow, rise, where, rtol=_rating_rtol(spec, fast), start=spec.get("rating_start"))
    else:
        if t_out <= t_ci:
            raise InputError(field, t_out if field.endswith("_temperature_K") else spec["approach_K"],
                             f"expected an air outlet above the coolant inlet {t_ci:.2f} K (an approach "
                             "above 0 K): a finite exchanger cannot cool the air to its coolant "
                             "temperature")
        if t_out < inlet.T:
            exchanger = size_exchanger(spec["arrangement"], hot_at(t_out), fluid, t_ci, flow, rise, where)
    t_b = exchanger.coolant.mean_temperature_K if exchanger is not None else t_ci
    return t_out, exchanger, t_stag, t_b


def _rating_rtol(spec: dict, fast: bool) -> float:
    """Relative tolerance of a rated air outlet: 1e-12 exact, 1e-9 on the fast path (trial solves), or
    what the entry's ``rating_start`` asks for on the fast path (a year's bins, :mod:`stagewright.core.year`)."""
    if not fast:
        return 1e-12
    start = spec.get("rating_start")
    return _FAST_RATING_RTOL if start is None or start.rtol is None else start.rtol


def _cooling_path(model: PropertyModel, where: str, inlet: Point, outlet: Point, t_out: float, p_out: float,
                  path_points: int, water: Condensation | None) -> list[Point]:
    """States along the cooling line for charts: the pressure falls linearly with temperature.

    Parameters
    ----------
    model : PropertyModel
        Stream model of the air.
    where : str
        Field path of the cooler, for messages.
    inlet, outlet : Point
        Air inlet and outlet states.
    t_out : float
        Air outlet temperature, [K].
    p_out : float
        Air outlet pressure, [Pa].
    path_points : int
        Segments of the line; 0 gives inlet and outlet only.
    water : Condensation or None
        Condensation and separator of moist air (None for dry air).

    Returns
    -------
    list of Point
        Dry air: ``path_points`` equal steps in temperature and pressure. Moist air: the line
        of :func:`stagewright.core.moist.condensation.cooling_line` (with its dew point), the outlet,
        and the separator outlet where water is drained.

    Notes
    -----
    For drawing only: the line between the two end states is not part of any balance, and
    the linear fall of pressure with temperature is an assumption (common practice, no
    source).
    """
    if water is not None:
        path = (cooling_line(model, inlet, t_out, p_out, where, path_points) if path_points else [inlet]) + [outlet]
        if water.drained_kg_s > 0.0:
            path.append(water.after)
        return path
    path = [inlet]
    for k in range(1, path_points):
        f = k / path_points
        path.append(model.at_tp(inlet.T + f * (t_out - inlet.T), inlet.P + f * (p_out - inlet.P),
                                f"{where} cooling line"))
    path.append(outlet)
    return path
