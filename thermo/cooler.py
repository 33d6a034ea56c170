"""An intercooler or aftercooler: heat rejected at the coolant temperature [1]_."""
from __future__ import annotations

__all__ = ["CoolerResult", "solve_cooler", "cooler_outlet_temperature"]

from dataclasses import dataclass

from .condensate import Condensation, condensation, cooling_line
from .errors import InputError
from .exergy import DeadState, heat_exergy
from .models.base import Point, PropertyModel


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
    #: moist air only: condensation and separator (None for dry air)
    water: Condensation | None = None

    @property
    def leaving(self) -> Point:
        """The stream that goes on to the next stage (after the separator for moist air)."""
        return self.outlet if self.water is None else self.water.after


def cooler_outlet_temperature(spec: dict) -> float:
    """Air outlet temperature a cooler entry asks for, [K] (outlet given or coolant + approach)."""
    if spec.get("outlet_temperature_K") is not None:
        return spec["outlet_temperature_K"]
    return spec["coolant_inlet_temperature_K"] + spec["approach_K"]


def solve_cooler(model: PropertyModel, spec: dict, index: int, inlet: Point, inlet_velocity: float,
                 mass_flow: float, dead: DeadState, path_points: int = 8) -> CoolerResult:
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
        Number of states returned along the cooling line (for the T–s chart).

    Returns
    -------
    CoolerResult

    Raises
    ------
    InputError
        If the outlet temperature is above the inlet temperature or below the
        temperature of the heat sink, or the pressure drop exceeds the inlet pressure.

    Notes
    -----
    For moist air (a :class:`~thermo.humid.MoistAir` model) the outlet is at phase
    equilibrium: below the dew point at the outlet pressure it is saturated and the rest
    of the water is liquid. The duty is split into sensible and latent parts and the
    separator after the cooler removes its fraction of that liquid
    (:func:`thermo.condensate.condensation`); the entropy balance covers cooler and
    separator, whose phase split itself generates no entropy. The chart line includes the
    dew point and ends with the separator step at the outlet temperature.

    The heat crosses the boundary at the coolant inlet temperature when one is given,
    otherwise at the site ambient temperature; the exchanger's own internal
    temperature differences are therefore part of the cooler's entropy generation. The
    cooling line for charts assumes the pressure falls linearly with temperature.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-13 (entropy balance with boundary heat transfer), §8-6.
    """
    where = f"stages[{index}].cooler"
    field = (f"{where}.outlet_temperature_K" if spec.get("outlet_temperature_K") is not None
             else f"{where}.approach_K")
    t_out = cooler_outlet_temperature(spec)
    t_b = spec.get("coolant_inlet_temperature_K") or dead.T0
    p_out = inlet.P - spec["pressure_drop_Pa"]
    if p_out <= 0.5 * inlet.P:
        raise InputError(f"{where}.pressure_drop_Pa", spec["pressure_drop_Pa"],
                         f"expected less than half the cooler inlet pressure ({0.5 * inlet.P:.0f} Pa)")
    if t_out > inlet.T:
        raise InputError(field, t_out if field.endswith("_temperature_K") else spec["approach_K"],
                         f"cooler outlet {t_out:.2f} K is above its inlet {inlet.T:.2f} K; "
                         "a cooler cannot heat the air")
    if t_out < t_b:
        raise InputError(field, t_out if field.endswith("_temperature_K") else spec["approach_K"],
                         f"cooler outlet {t_out:.2f} K is below the heat-sink temperature "
                         f"{t_b:.2f} K (coolant inlet, or ambient when none is given)")
    outlet = model.at_tp(t_out, p_out, f"{where} outlet")
    moist = getattr(model, "mixture", None) is not None
    ke = 0.5 * inlet_velocity ** 2 * model.mass_per_dry_kg if moist else 0.5 * inlet_velocity ** 2
    duty = mass_flow * (inlet.h + ke - outlet.h)
    s_gen = mass_flow * (outlet.s - inlet.s) + duty / t_b
    if moist:
        water = condensation(model, inlet, outlet, duty, mass_flow, spec["separator_efficiency"])
        path = cooling_line(model, inlet, t_out, p_out, where, path_points) + [outlet]
        if water.drained_kg_s > 0.0:
            path.append(water.after)
        return CoolerResult(index=index, inlet=inlet, outlet=outlet, duty_W=duty, boundary_temperature_K=t_b,
                            heat_exergy_W=heat_exergy(duty, t_b, dead.T0), entropy_generation_W_K=s_gen,
                            exergy_destroyed_W=dead.T0 * s_gen, path=path, water=water)
    path = [inlet]
    for k in range(1, path_points):
        f = k / path_points
        path.append(model.at_tp(inlet.T + f * (t_out - inlet.T), inlet.P + f * (p_out - inlet.P),
                                f"{where} cooling line"))
    path.append(outlet)
    return CoolerResult(index=index, inlet=inlet, outlet=outlet, duty_W=duty, boundary_temperature_K=t_b,
                        heat_exergy_W=heat_exergy(duty, t_b, dead.T0), entropy_generation_W_K=s_gen,
                        exergy_destroyed_W=dead.T0 * s_gen, path=path)
