r"""Heat recovery: what the coolers and casings could deliver as hot water or warm air [1]_ [2]_.

A recovery exchanger heating a stream to the delivery temperature :math:`T_d` with a
minimum approach :math:`\Delta T_\min` can only take heat from air hotter than
:math:`T_x = T_d + \Delta T_\min`. From each cooler that is the heat the compressed air
gives up between its inlet and :math:`\max(T_{out}, T_x)`:

.. math::

    \dot Q_{rec,k} = \dot m\left[h_{0,in} - h(\max(T_{out}, T_x), p_{out})\right]
    \quad (T_{0,in} > T_x), \qquad 0 \text{ otherwise}

From each casing, the stated share of its heat loss when that heat is available above
:math:`T_x` (at the stage's heat-loss boundary temperature when one is given, otherwise
at the mean of the stage inlet and discharge temperatures, where a jacket would collect
it). The value per year is the boiler fuel it saves:

.. math:: V = \frac{\dot Q_{rec}\, t_{op}}{1000\,\eta_{boiler}}\, c_{fuel}

with :math:`t_{op}` in hours and :math:`c_{fuel}` per kWh of fuel.

For moist intake air :math:`h` is the equilibrium enthalpy of the cooler's own stream per
kilogram of dry air (:class:`stagewright.core.moist.stream.MoistAir`, liquid water included) and
:math:`\dot m` the dry-air flow, so that where :math:`T_x` lies below the stream's dew point
the latent heat of the water condensed above :math:`T_x` counts as recoverable (ASHRAE
Handbook—Fundamentals 2017, ch. 1, cooling with dehumidification).
"""
from __future__ import annotations

__all__ = ["RecoveryResult", "heat_recovery", "cooler_heat_above"]

from dataclasses import dataclass, field

from stagewright.core.models.base import PropertyModel

HOURS_PER_YEAR = 8760.0


@dataclass
class RecoveryResult:
    """Recoverable heat of one solved train (SI; money per the user's fuel-price unit)."""

    delivery_temperature_K: float
    source_temperature_K: float  #: delivery temperature plus approach: the coldest useful air, [K]
    coolers_W: list = field(default_factory=list)  #: per stage, None where there is no cooler
    casings_W: list = field(default_factory=list)
    recoverable_heat_W: float = 0.0
    share_of_driver_input: float = 0.0
    operating_hours_per_year: float = HOURS_PER_YEAR
    heat_per_year_kWh: float = 0.0
    fuel_saved_per_year_kWh: float = 0.0
    value_per_year: float = 0.0


def cooler_heat_above(model: PropertyModel, cooler, mass_flow: float, t_x: float) -> float:
    r"""Heat [W] a cooler's air gives up above ``t_x`` [K] (see the module formula) [1]_.

    Parameters
    ----------
    model : PropertyModel
        Property model of the air (used when the cooler does not carry its stream model).
    cooler : CoolerResult
        The solved cooler; its ``stream_model`` (moist air: the stream's total water) is used.
    mass_flow : float
        Air mass flow (dry-air flow for moist air), [kg/s].
    t_x : float
        Coldest air temperature a recovery exchanger can use, [K].

    Returns
    -------
    float
        Recoverable heat, [W]; between 0 and the cooler duty.
    """
    t_in = cooler.stagnation_inlet_temperature_K or cooler.inlet.T
    if t_in <= t_x:
        return 0.0
    if cooler.outlet.T >= t_x:
        return cooler.duty_W
    stream = getattr(cooler, "stream_model", None) or model  # moist air: the cooler's own water content
    h_in0 = cooler.outlet.h + cooler.duty_W / mass_flow
    h_x = stream.at_tp(t_x, cooler.outlet.P, f"stages[{cooler.index}].cooler recovery").h
    return min(cooler.duty_W, max(0.0, mass_flow * (h_in0 - h_x)))


def heat_recovery(spec: dict, model: PropertyModel, stage_specs: list, stages: list, coolers: list,
                  mass_flow: float, driver_power_W: float, hours: float | None = None) -> RecoveryResult:
    r"""Recoverable heat from every cooler and casing, its share and its yearly value [1]_ [2]_.

    Parameters
    ----------
    spec : dict
        Normalised ``heat_recovery`` section.
    model : PropertyModel
        Property model of the air.
    stage_specs : list of dict
        Normalised stage entries (for the casing heat-loss boundary temperature).
    stages : list of StageResult
        Solved stages.
    coolers : list of CoolerResult or None
        Solved coolers, one entry per stage.
    mass_flow : float
        Air mass flow, [kg/s].
    driver_power_W : float
        Electrical (driver input) power, [W].
    hours : float, optional
        Operating hours per year, [h]; default from the section, else 8760.

    Returns
    -------
    RecoveryResult

    Examples
    --------
    >>> import stagewright.core
    >>> doc = {"site": {"ambient_temperature_K": 293.15}, "fluid": {"model": "constant_cp"},
    ...        "flow": {"kind": "mass", "value": 1.0}, "discharge_pressure_Pa": 8e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
    ...                    "cooler": {"outlet_temperature_K": 303.15}}],
    ...        "heat_recovery": {"delivery_temperature_K": 333.15}}
    >>> r = stagewright.core.solve(doc)
    >>> r.recovery.recoverable_heat_W < r.coolers[0].duty_W
    True

    References
    ----------
    .. [1] ISO 11011:2013, *Compressed air — Energy efficiency — Assessment*, ISO, Geneva
       (heat recovery as part of the assessment; the method, not figures).
    .. [2] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §5-4 (steady-flow energy balance of the recovery exchanger).
    """
    t_x = spec["delivery_temperature_K"] + spec["approach_K"]
    per_cooler = [None if c is None else cooler_heat_above(model, c, mass_flow, t_x) for c in coolers]
    per_casing = []
    for sp, st in zip(stage_specs, stages):
        t_avail = sp.get("heat_loss_boundary_temperature_K") or 0.5 * (st.inlet.T + st.outlet.T)
        per_casing.append(spec["casing_share"] * st.heat_loss_W if t_avail > t_x else 0.0)
    total = sum(q for q in per_cooler if q is not None) + sum(per_casing)
    if hours is None:
        hours = spec.get("operating_hours_per_year")
    hours = HOURS_PER_YEAR if hours is None else hours
    heat_kwh = total * hours / 1000.0
    fuel_kwh = heat_kwh / spec["boiler_efficiency"]
    return RecoveryResult(delivery_temperature_K=spec["delivery_temperature_K"], source_temperature_K=t_x,
                          coolers_W=per_cooler, casings_W=per_casing, recoverable_heat_W=total,
                          share_of_driver_input=total / driver_power_W if driver_power_W > 0 else 0.0,
                          operating_hours_per_year=hours, heat_per_year_kWh=heat_kwh,
                          fuel_saved_per_year_kWh=fuel_kwh, value_per_year=fuel_kwh * spec["fuel_price_per_kWh"])
