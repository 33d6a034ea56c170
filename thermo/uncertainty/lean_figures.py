r"""The field check's figures from one draw of its inputs, computing only the states they need.

A Monte Carlo run (JCGM 101:2008 §7.2) evaluates the measurement model thousands of times; the
full solve (:func:`stagewright.core.solve.solve_normalised`) also balances entropy, exergy and water,
checks closures and, for a flow given as shaft power, solves the train twice (the secant on
the mass flow). For the trains a field check usually describes, the figures follow from a
handful of states:

- the intake: ambient :math:`h_0 = h(T_0, p_0)` and the filter outlet at :math:`h_0` and
  :math:`p_0 - \Delta p_\mathrm{filter}` (a throttle, :func:`stagewright.core.solve_context.intake_state`);
- per stage, the isentropic discharge :math:`h_{2s} = h(s_1, p_2)` and the discharge,
  measured :math:`h_2 = h(T_2, p_2)` or from the isentropic efficiency
  :math:`h_2 = h_1 + (h_{2s} - h_1)/\eta_s`;
- per cooler, the outlet :math:`h(T_c, p_2 - \Delta p_c)`.

None of these depends on the mass flow, so the work per kilogram :math:`a_i = h_2 - h_1` and
the shaft power :math:`\dot W = \sum_i (\dot m\,a_i + \dot Q_i)/\eta_{m,i}` (the balance of
:func:`stagewright.core.stage.solve_stage`, ASME PTC 10-1997 §5) give a shaft-power flow in closed form,
:math:`\dot m = (\dot W - \sum_i \dot Q_i/\eta_{m,i}) / \sum_i a_i/\eta_{m,i}`; then
:math:`\eta_{s,i} = (h_{2s} - h_1)/(a_i + \dot Q_i/\dot m)`, the cooler duty
:math:`\dot Q_c = \dot m\,(h_2 - h_c)` and the free air delivery :math:`\dot m/\rho_0`
(:func:`stagewright.core.train.solve_train`).

**What it covers.** Dry intake air; stages with a measured discharge temperature, or with an
isentropic efficiency and no casing heat loss; no exit velocity; coolers without a coolant;
no heat-recovery section. For anything else, and for every draw near a refusal of the full
solve (a second-law violation, a cooler that would heat the air, a state outside the property
range, …), :class:`LeanFigures` answers None and the caller runs the full solve, so a draw is
refused for the same reason and with the same message either way.

States from (h, p) and (s, p) are found by Newton's method on T with the model's ``terms``
(W. H. Press et al., *Numerical Recipes*, 3rd ed., 2007, §9.4). Once a step is below
:data:`_STEP_K` the state is carried over that step to first order
(:math:`h \leftarrow h + c_p\,\Delta T`, :math:`s \leftarrow s + c_p \Delta T / T`): Newton's
error after the step is then about 1e-9 K, as in the full solve, without one more property
update. The first guesses are those of the first evaluation (the nominal values): the filter
outlet at its temperature change, the isentropic discharge at :math:`T_1 r^{\kappa}` with that
evaluation's exponent :math:`\kappa`, so a draw near it needs one or two updates per state.
The guesses never change after that, so a draw's answer does not depend on the draws before it
(one process or several give the same figures).
"""
from __future__ import annotations

__all__ = ["LeanFigures"]

import math

from stagewright.core.cooler import cooler_outlet_temperature
from stagewright.core.errors import StagewrightError
from stagewright.core.flow import mass_flow_from
from stagewright.core.models.base import T_MAX, T_MIN
from stagewright.core.project.delivery import delivery_pressure
from stagewright.core.project.validation import resolve_site
from stagewright.core.split import stage_pressure_ratios


#: Newton's last step on T, at most [K]: carried to first order, the state's h and s are then
#: off by ½ |∂c_p/∂T| ΔT² < 1e-6 J/kg (for |∂c_p/∂T| < 2 J/(kg K²); air's is a few tenths,
#: from memory) and ½ c_p ΔT²/T² < 2e-8 J/(kg K) above 200 K: far below what the figures resolve
_STEP_K = 1e-3


class _Defer(Exception):
    """The full solve must answer this draw."""


class LeanFigures:
    """Figures ``names`` of a normalised document from the states they need (module notes).

    Parameters
    ----------
    names : list of str
        Figure names (:class:`stagewright.core.uncertainty.figures.ResultFigure` ``name``).

    Examples
    --------
    >>> from stagewright.core.models import ConstantCpAir
    >>> from stagewright.core.project.validation import normalise
    >>> norm = normalise({"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...                   "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...                   "discharge_pressure_Pa": 4e5,
    ...                   "stages": [{"efficiency": {"kind": "discharge_temperature", "value_K": 470.0}}]})
    >>> eta = LeanFigures(["stages[0].isentropic_efficiency"])(norm, ConstantCpAir())[0]
    >>> round(eta, 6)  # T1 (r^((k-1)/k) - 1) / (T2 - T1), perfect gas
    0.805594
    """

    def __init__(self, names: list[str]) -> None:
        self.names = list(names)
        where = {n: j for j, n in enumerate(self.names)}
        count = len(self.names)  # a name not asked for goes to the spare slot at the end
        self._efficiency = [where.get(f"stages[{i}].isentropic_efficiency", count) for i in range(count)]
        self._duty = [where.get(f"stages[{i}].cooler.duty_W", count) for i in range(count)]
        self._totals = [where.get(n, count) for n in ("mass_flow_kg_s", "free_air_delivery_m3_s", "shaft_power_W",
                                                       "specific_power_kW_per_m3_min")]
        self._exponents: dict[int, float] = {}  #: stage → κ of its first isentropic discharge
        self._filter_drop_K: float | None = None  #: temperature change through the intake filter, first evaluation

    def __call__(self, norm: dict, model) -> list[float] | None:
        """The figures (SI, in the order of ``names``), or None where the full solve must answer.

        Parameters
        ----------
        norm : dict
            Normalised project document (a draw's values already set).
        model : PropertyModel
            Dry-air property model (:func:`stagewright.core.solve.model_for`).
        """
        if norm.get("heat_recovery"):
            return None
        try:
            site = resolve_site(norm)
            if site.moist:
                return None
            T0, P0 = site.ambient_temperature_K, site.pressure_Pa
            h0, _, v0, _, _ = model.terms(T0, P0, False)
            intake = _state_at(model, 0, h0, site.stage_inlet_pressure_Pa, T0 + (self._filter_drop_K or 0.0))
            if self._filter_drop_K is None:  # the guesses are fixed after the first evaluation, so that a
                self._filter_drop_K = intake[0] - T0  # draw's answer never depends on the draws before it
            line = self._line(norm, model, intake, delivery_pressure(norm, P0), T0)
            return self._figures(norm, model, line, T0, P0, 1.0 / v0)
        except (_Defer, StagewrightError):
            return None

    def _line(self, norm: dict, model, intake: tuple, p_delivery: float, T0: float) -> list:
        """Per stage (spec, inlet, isentropic discharge, discharge, cooler outlet or None), each state
        a tuple (T, P, h, s); raises _Defer outside what this evaluation covers or near a refusal."""
        specs = norm["stages"]
        drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in specs]
        ratios = stage_pressure_ratios(intake[1], p_delivery, [s["pressure_ratio"] for s in specs], drops)
        point, out = intake, []
        for i, (spec, ratio) in enumerate(zip(specs, ratios)):
            eff, cooler = spec["efficiency"], spec["cooler"]
            if spec["exit_velocity_m_s"] != 0.0 or (cooler is not None and cooler.get("coolant") is not None):
                raise _Defer
            start, p_out = point, point[1] * ratio
            kappa = self._exponents.get(i, 0.285)  # 0.285: the full solve's first guess
            iso = _state_at(model, 1, start[3], p_out, start[0] * ratio ** kappa)
            if i not in self._exponents:
                self._exponents[i] = math.log(iso[0] / start[0]) / math.log(ratio)
            if not (ratio > 1.0 + 2e-9 and iso[2] - start[2] > 0.0):
                raise _Defer
            if eff["kind"] == "discharge_temperature":
                h, s, _, _, _ = model.terms(eff["value_K"], p_out, False)
                outlet = (eff["value_K"], p_out, h, s)
            elif eff["kind"] == "isentropic" and spec["heat_loss_W"] == 0.0:
                eta = eff["value"]
                outlet = _state_at(model, 0, start[2] + (iso[2] - start[2]) / eta, p_out,
                                   start[0] + (iso[0] - start[0]) / eta)
            else:
                raise _Defer
            point, leaving = outlet, None
            if cooler is not None:
                leaving = point = _cooler_outlet(model, cooler, outlet, T0)
            out.append((spec, start, iso, outlet, leaving))
        return out

    def _figures(self, norm: dict, model, line: list, T0: float, P0: float, rho0: float) -> list[float]:
        """The figures from the line's states (module notes); raises _Defer near a refusal."""
        flow = norm["flow"]
        if flow["kind"] == "shaft_power":
            fixed = sum(spec["heat_loss_W"] / spec["mechanical_efficiency"] for spec, *_ in line)
            per_kg = sum((outlet[2] - start[2]) / spec["mechanical_efficiency"] for spec, start, _, outlet, _ in line)
            if not (flow["value"] > fixed and per_kg > 0.0):
                raise _Defer
            m = (flow["value"] - fixed) / per_kg
        else:
            m = mass_flow_from(flow["kind"], flow["value"], model, T0, P0)
        values, shaft = [math.nan] * (len(self.names) + 1), 0.0
        if len(line) > len(self.names):
            raise _Defer  # more stages than figures: never for a field check's figures
        for i, (spec, start, iso, outlet, leaving) in enumerate(line):
            q_loss, eta_m = spec["heat_loss_W"], spec["mechanical_efficiency"]
            dh_s, dh = iso[2] - start[2], outlet[2] - start[2] + q_loss / m
            if dh <= dh_s * (1.0 + 1e-9) or not _heat_loss_allowed(spec, q_loss / m, start, iso, outlet, T0):
                raise _Defer
            w_gas = m * dh
            w_shaft = w_gas / eta_m
            t_b = spec["heat_loss_boundary_temperature_K"] or T0
            s_gen = m * (outlet[3] - start[3]) + q_loss / t_b + (w_shaft - w_gas) / T0
            if s_gen < 1e-6 * max(1.0, w_shaft / T0):  # the full solve refuses below -1e-9 of this scale
                raise _Defer
            shaft += w_shaft
            values[self._efficiency[i]] = dh_s / dh
            if leaving is not None:
                values[self._duty[i]] = m * (outlet[2] - leaving[2])
        fad = m / rho0
        for j, v in zip(self._totals, (m, fad, shaft, (shaft / norm["driver"]["efficiency"] / 1000.0) / (fad * 60.0))):
            values[j] = v
        return values[:-1]


def _state_at(model, which: int, target: float, P: float, T: float) -> tuple:
    """(T, P, h, s) where h (``which`` 0) or s (1) is ``target`` at pressure P: Newton from T,
    stopped once the step is below :data:`_STEP_K` and the state carried over that last step
    to first order (module notes)."""
    for _ in range(30):
        h, s, _, cp, _ = model.terms(T, P, False)
        step = (h - target) / cp if which == 0 else (s - target) * T / cp
        if abs(step) < _STEP_K:
            T -= step
            if not (T_MIN + 1e-6 < T < T_MAX - 1e-6):
                raise _Defer
            return (T, P, target, s - step * cp / T) if which == 0 else (T, P, h - step * cp, target)
        T -= step
        if not (T_MIN < T < T_MAX):
            raise _Defer
    raise _Defer


def _cooler_outlet(model, cooler: dict, inlet: tuple, T0: float) -> tuple:
    """(T, P, h, s) leaving a cooler without a coolant (:func:`stagewright.core.cooler.solve_cooler`);
    raises _Defer where that would refuse it, or nearly."""
    t_out = cooler_outlet_temperature(cooler, T0)
    t_b = cooler.get("coolant_inlet_temperature_K") or T0
    p_c = inlet[1] - cooler["pressure_drop_Pa"]
    if t_out is None or p_c <= 0.5 * inlet[1] or t_out > inlet[0] - 1e-6 or t_out < t_b:
        raise _Defer
    h, s, _, _, _ = model.terms(t_out, p_c, False)
    return t_out, p_c, h, s


def _heat_loss_allowed(spec: dict, q: float, start: tuple, iso: tuple, outlet: tuple, T0: float) -> bool:
    """False where the full solve might refuse the casing heat loss ``q`` [J/kg]: the gas cooled
    below the boundary the heat leaves at (the Clausius check of :func:`stagewright.core.stage.solve_stage`),
    or the adiabatic compression before the loss ending near the top of the property range."""
    if q <= 0.0:
        return True
    t_b = spec["heat_loss_boundary_temperature_K"] or T0
    cp = (iso[2] - start[2]) / (iso[0] - start[0]) if iso[0] > start[0] else 1000.0  # secant cp, an estimate
    return outlet[0] >= t_b + 1e-6 and outlet[0] + 2.0 * q / cp < T_MAX
