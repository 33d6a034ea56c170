"""The stage pressure ratios of least driver power under the stages' limits."""
from __future__ import annotations

__all__ = ["SplitResult", "optimal_split", "split_prepared", "solve_at", "METHOD"]

import math
from dataclasses import dataclass, field
from typing import Any, Callable

from stagewright.core.project.delivery import delivery_pressure
from stagewright.core.project.validation import resolve_site
from stagewright.core.results import TrainResult
from stagewright.core.solve import model_for, solve
from stagewright.core.study.limits import (BindingLimit, LimitNotMet, RatioBounds, active_limit, failure_detail,
                                          implied_ratio, pressure_reach_problems, ratio_bounds, violated_limit)
from stagewright.core.study.prepare import Prepared, prepare
from stagewright.core.study.pressure_steps import (PRESSURE_STEP, pressure_sensitivities, pressure_step,
                                                  stage_pressures)
from stagewright.core.study.progress import cancel_check
from stagewright.core.study.start import equal_split, ideal_gas_split
from stagewright.core.study.trials import SoftLimit, Trial, TrialSolver, soft_limits


class _NumpyOnFirstUse:
    """Stands for numpy until a study uses it: the window imports this module while it opens, and
    numpy's import (a tenth of a second or more) then waited before the window showed."""

    def __getattr__(self, name):
        import numpy
        globals()["np"] = numpy
        return getattr(numpy, name)


np = _NumpyOnFirstUse()

METHOD = ("SLSQP (scipy.optimize) on the logarithms of the stage ratios; the last free stage's "
          "ratio follows from the discharge pressure (stagewright.core.split.delivered_pressure), so it is "
          "met exactly; gradients from forward differences of lean train solves in the intermediate "
          "pressures (chain rule to the ratios); started from the better of the equal split and the "
          "ideal-gas optimum")

_T_SCALE = 100.0  # K per unit of a scaled temperature constraint
_T_INSIDE = 1e-5  # K kept inside every temperature limit by the optimiser's constraints
_ACTIVE_K = 0.01  # K: a limit this close is reported as active
_FD_STEP = 1e-6  # step in ln r for forward differences
#: The objective is the driver power over the start's, times this. The scaled power's curvature in
#: ln r is about e²·r^e/((r^e − 1)·N) ≈ 0.1 for air (e = R/cp ≈ 0.29) at 2 … 8 stages; SLSQP's
#: quasi-Newton matrix starts from the identity [Kraft 1988], so its first steps were about ten times
#: too short and it spent iterations learning the scale (Nocedal & Wright 2006, §6.1, on scaling the
#: initial matrix). Times 5 the curvature is about 0.5; the stop test (ftol on the scaled value) is
#: then 5 times finer too. Measured on the baseline trains of tests/test_study_unchanged.py: 30 %
#: fewer trial solves, every optimum at or below the old power (tests/data/study_baseline_2ad76eb.json).
_OBJECTIVE_SCALE = 5.0
_PENALTY = 10.0 * _OBJECTIVE_SCALE  # scaled objective of a trial split the train cannot run


_failure_detail = failure_detail  # its old name here (tests/test_messages.py imports it)


def minimize(*args, **kwargs):
    """scipy.optimize.minimize, imported on first use (keeps the window's start-up light)."""
    from scipy.optimize import minimize as _minimize
    return _minimize(*args, **kwargs)


@dataclass
class SplitResult:
    """The optimum split of one train, or the closest one when its limits cannot be met.

    Attributes
    ----------
    pressure_ratios : list of float or None
        Stage ratios, first stage first; None when the ratio bounds alone rule out the
        discharge pressure.
    result : TrainResult or None
        The train solved in full at these ratios (None as above).
    feasible : bool
        True when every limit is met. When False the split is the one that comes closest
        and must not be used as a design: ``binding_limits`` says what fails and by how much.
    binding_limits : list of BindingLimit
        Active limits of a feasible optimum, or the violated ones.
    iterations : int
        Optimiser iterations (all phases).
    solves : int
        Trial train solves.
    notes : list of str
        What the study changed in the project to make it a design problem.
    method : str
        How the split was found.
    """

    pressure_ratios: list | None
    result: TrainResult | None
    feasible: bool
    binding_limits: list
    iterations: int
    solves: int
    notes: list = field(default_factory=list)
    method: str = METHOD

    def to_dict(self) -> dict:
        """Plain data (the full train result under ``result``)."""
        return {"pressure_ratios": self.pressure_ratios, "feasible": self.feasible,
                "binding_limits": [b.to_dict() for b in self.binding_limits],
                "iterations": self.iterations, "solves": self.solves, "notes": list(self.notes),
                "method": self.method, "result": None if self.result is None else self.result.to_dict()}


def optimal_split(doc: dict, *, strict: bool = True, cancel: Any = None) -> SplitResult:
    r"""Stage pressure ratios that minimise the driver power of a project's train.

    The objective is the driver power of the train solved on the project's own property
    model, cooler outlet temperatures and pressure drops; the discharge pressure after the
    last cooler is met exactly. Limits per stage: ``min_pressure_ratio``,
    ``max_pressure_ratio``, ``max_discharge_temperature_K``, and the cooler after the stage
    (the stage must discharge at least as hot as the cooler's outlet).

    .. math::

        \min_{r_1..r_N} \dot W_\mathrm{driver}(r) \quad\text{s.t.}\quad
        p_d(r) = p_\mathrm{discharge},\;
        r_{\mathrm{lo},i} \le r_i \le r_{\mathrm{hi},i},\;
        T_{2,i}(r) \le T_{\max,i}

    Parameters
    ----------
    doc : dict
        Project document.
    strict : bool
        True: raise :class:`~stagewright.core.study.limits.LimitNotMet` when no split meets the
        limits. False: return the closest split with ``feasible=False`` instead.
    cancel : None, threading.Event or callable
        Checked before every trial solve.

    Returns
    -------
    SplitResult

    Raises
    ------
    LimitNotMet
        (``strict`` only) naming the limit, its value and the closest feasible value.
    StudyCancelled
        If ``cancel`` is set.
    StagewrightError
        For an invalid project.

    Notes
    -----
    Variables are :math:`x_j = \ln r_j` of the free stages but the last; that stage's
    ratio follows from the discharge pressure, which is affine in any one ratio
    (:func:`~stagewright.core.study.limits.implied_ratio`), and its bounds become two explicit
    constraints. Stages with min = max are held. Phases:

    1. the ratio bounds are checked against the discharge pressure (pressure arithmetic);
    2. the start is the better of the equal split (:func:`stagewright.core.split.stage_pressure_ratios`)
       and the ideal-gas optimum (:func:`~stagewright.core.study.start.ideal_gas_split`), both
       clipped to the bounds;
    3. if the start breaks a temperature limit, SLSQP first minimises the worst
       violation (a minimax in an extra variable); if that stays positive the limits
       cannot be met and the minimax split, with the violation, is the answer;
    4. SLSQP minimises the power from a feasible start.

    Derivatives are forward differences of lean trial solves, one intermediate pressure at a
    time, turned into derivatives in the variables by the chain rule
    (:mod:`~stagewright.core.study.pressure_steps`, [3]_ §8.1): a difference solves again only
    the stages next to the pressure it moves, so an iteration costs a number of stage solves
    proportional to the number of stages. The objective is the driver power relative to the
    start's, scaled so that its curvature suits SLSQP's first quasi-Newton steps ([3]_ §6.1).

    The returned split is the lowest-power trial that met every limit exactly (SLSQP's
    constraints keep 1e-5 K inside the temperature limits), solved again in full.
    Without a ratio limit this problem is the classical one with the well-known answer
    for ideal gases (equal ratios with intercooling to the inlet temperature) [1]_.

    References
    ----------
    .. [1] Y. A. Çengel, M. A. Boles, *Thermodynamics: An Engineering Approach*, 8th ed.,
       McGraw-Hill, 2015, §7-11 (multistage compression with intercooling).
    .. [2] D. Kraft, *A software package for sequential quadratic programming*,
       DFVLR-FB 88-28, Oberpfaffenhofen, 1988 (SLSQP).
    .. [3] J. Nocedal, S. J. Wright, *Numerical Optimization*, 2nd ed., Springer, 2006.

    Examples
    --------
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 1e5},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...        "discharge_pressure_Pa": 9e5,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
    ...                    "cooler": {"outlet_temperature_K": 293.15}}] * 2}
    >>> [round(r, 4) for r in optimal_split(doc).pressure_ratios]
    [3.0, 3.0]
    """
    return split_prepared(prepare(doc), strict=strict, should_stop=cancel_check(cancel))


def split_prepared(prepared: Prepared, strict: bool = False,
                   should_stop: Callable[[], bool] = lambda: False) -> SplitResult:
    """:func:`optimal_split` for an already prepared problem (used by the comparison)."""
    problem = _Problem(prepared, should_stop)
    out = problem.run()
    if strict and not out.feasible:
        raise LimitNotMet(out.binding_limits, out)
    return out


class _Problem:
    """One optimisation: variables, constraint vector and the phases."""

    def __init__(self, prepared: Prepared, should_stop: Callable[[], bool]):
        self.prepared = prepared
        doc = self.doc = prepared.doc
        stages = doc["stages"]
        self.n = len(stages)
        self.site = resolve_site(doc)
        self.p_in = self.site.stage_inlet_pressure_Pa
        self.p_d = delivery_pressure(doc, self.site.pressure_Pa)  # stated absolute or gauge
        self.drops = [(s["cooler"] or {}).get("pressure_drop_Pa", 0.0) for s in stages]
        self.bounds: RatioBounds = ratio_bounds(stages)
        free = [i for i in range(self.n) if not self.bounds.pinned(i)]
        self.implied = free[-1] if free else None
        self.var = free[:-1]
        self.limits: list[SoftLimit] = soft_limits(stages, self.site.ambient_temperature_K)
        self.trials = TrialSolver(doc, self.limits, should_stop)
        self.iterations = 0
        self.w_ref = 1.0
        self._memo: dict[bytes, tuple] = {}
        self._last_jacobian: tuple = (None, None)

    # -- variables ---------------------------------------------------------------------
    def ratios(self, x) -> list[float]:
        r = list(self.bounds.lo)
        for j, i in enumerate(self.var):
            r[i] = math.exp(x[j])
        if self.implied is not None:
            r[self.implied] = implied_ratio(self.p_in, self.p_d, r, self.drops, self.implied)
        return r

    def x_of(self, ratios) -> np.ndarray:
        return np.array([math.log(ratios[i]) for i in self.var])

    def hard(self, r: list[float]) -> list[float]:
        """Bounds of the implied stage, scaled; ≥ 0 when met."""
        if self.implied is None:
            return []
        k = self.implied
        rk = r[k]
        if not math.isfinite(rk):
            return [-1.0, -1.0]
        return [(rk - self.bounds.lo[k]) / self.bounds.lo[k], (self.bounds.hi[k] - rk) / self.bounds.hi[k]]

    def ratios_ok(self, r: list[float]) -> bool:
        return all(math.isfinite(v) and lo * (1 - 1e-12) <= v <= hi * (1 + 1e-12)
                   for v, lo, hi in zip(r, self.bounds.lo, self.bounds.hi))

    def trial(self, r: list[float]) -> Trial | None:
        """Solve at ``r`` unless the implied ratio is impossible (≤ 1 or undefined)."""
        if not all(math.isfinite(v) and v > 1.0 for v in r):
            return None
        t = self.trials(r)
        self.trials.offer(t, self.ratios_ok(r))
        return t

    # -- objective and constraints as one vector, with forward differences --------------
    def values(self, x) -> tuple:
        key = np.asarray(x, dtype=float).tobytes()
        hit = self._memo.get(key)
        if hit is not None:
            return hit
        out = self._memo[key] = self.values_at(self.ratios(x))
        return out

    def values_at(self, r: list[float]) -> tuple:
        """Scaled objective and constraint vector of the train at the ratios ``r``."""
        t = self.trial(r)
        hard = self.hard(r)
        if t is None or not t.ok:
            return _PENALTY, np.array(hard + [-1.0] * len(self.limits))
        soft = [(m - _T_INSIDE) / _T_SCALE for m in t.margins]
        return t.power_W / self.w_ref * _OBJECTIVE_SCALE, np.array(hard + soft)

    def jacobian(self, x) -> tuple:
        """Forward differences of :meth:`values` in the intermediate pressures, then the chain rule
        to the variables (:mod:`~stagewright.core.study.pressure_steps`): each difference solves
        again the two stages around the pressure it moves, with their coolers; the train takes
        the others from earlier trials."""
        x = np.asarray(x, dtype=float)
        key = x.tobytes()
        if self._last_jacobian[0] != key:  # SLSQP asks for the objective's and the constraints' in turn
            self._last_jacobian = (key, self._pressure_jacobian(x))
        df, dc = self._last_jacobian[1]
        return df.copy(), dc.copy()

    def _pressure_jacobian(self, x: np.ndarray) -> tuple:
        f0, c0 = self.values(x)
        r = self.ratios(x)
        if not all(math.isfinite(v) and v > 1.0 for v in r):
            return self.ratio_jacobian(x)
        p = stage_pressures(self.p_in, r, self.drops)
        df = np.zeros(len(x))
        dc = np.zeros((len(c0), len(x)))
        by_pressure = {}
        for i in range(self.var[0], self.implied):
            r1, h = pressure_step(self.p_in, r, self.drops, i)
            f1, c1 = self.values_at(r1)
            if f1 == _PENALTY and f0 != _PENALTY:
                r1, h = pressure_step(self.p_in, r, self.drops, i, -PRESSURE_STEP)
                f1, c1 = self.values_at(r1)
            by_pressure[i] = ((f1 - f0) / h, (c1 - c0) / h)
        for j, dp in enumerate(pressure_sensitivities(r, p, self.var, self.implied)):
            for i, dp_dx in dp.items():
                df[j] += by_pressure[i][0] * dp_dx
                dc[:, j] += by_pressure[i][1] * dp_dx
        return df, dc

    def ratio_jacobian(self, x) -> tuple:
        """Forward differences of :meth:`values` in the variables themselves (a point whose
        ratios cannot all be formed, where there are no intermediate pressures to move)."""
        x = np.asarray(x, dtype=float)
        f0, c0 = self.values(x)
        df = np.zeros(len(x))
        dc = np.zeros((len(c0), len(x)))
        for j in range(len(x)):
            step = np.zeros(len(x))
            step[j] = _FD_STEP
            f1, c1 = self.values(x + step)
            h = _FD_STEP
            if f1 == _PENALTY and f0 != _PENALTY:
                f1, c1 = self.values(x - step)
                h = -_FD_STEP
            df[j] = (f1 - f0) / h
            dc[:, j] = (c1 - c0) / h
        return df, dc

    # -- phases ----------------------------------------------------------------------------
    def run(self) -> SplitResult:
        reach = pressure_reach_problems(self.p_in, self.p_d, self.drops, self.bounds)
        if reach:
            return SplitResult(None, None, False, reach, 0, 0, list(self.prepared.notes))
        start = self.start()
        if start is None:  # no start could be solved: report the train's own error
            return self.failed()
        if not self.var:
            return self.finish()
        self.w_ref = start.power_W if start.ok else 1.0
        x0 = self.x_of(start.ratios)
        if not start.feasible or not self.ratios_ok(list(start.ratios)):
            x0 = self.minimax(x0)
            if x0 is None:
                return self.finish()
        self.minimise(x0)
        return self.finish()

    def start(self) -> Trial | None:
        model = model_for(self.doc["fluid"])
        candidates = [equal_split(self.p_in, self.p_d, self.drops, self.bounds),
                      ideal_gas_split(self.doc, model, self.p_in, self.bounds, site=self.site)]
        trials = []
        for r in candidates:
            if r is None:
                continue
            r = self.ratios(self.x_of(r))  # the implied stage exactly on the discharge pressure
            t = self.trial(r)
            if t is not None:
                trials.append(t)
        if not trials:
            return None

        def rank(t: Trial):
            if t.feasible and self.ratios_ok(list(t.ratios)):
                return (0, t.power_W)
            if t.ok:
                return (1, -min(t.margins, default=0.0))
            return (2, 0.0)
        best = min(trials, key=rank)
        return best if best.ok else None

    def minimax(self, x0: np.ndarray) -> np.ndarray | None:
        """Minimise the worst scaled violation; the point, or None if it stays violated."""
        m = len(self.limits)
        nh = len(self.hard([1.0] * self.n))
        _, c0 = self.values(x0)
        t0 = max(-float(np.min(c0[nh:])) if m else 0.0, -0.01) + 1e-3

        def f(z):
            return z[-1]

        def fj(z):
            g = np.zeros(len(z))
            g[-1] = 1.0
            return g

        def c(z):
            _, cv = self.values(z[:-1])
            return np.concatenate([cv[:nh], cv[nh:] + z[-1]])

        def cj(z):
            _, dc = self.jacobian(z[:-1])
            extra = np.zeros((dc.shape[0], 1))
            extra[nh:, 0] = 1.0
            return np.hstack([dc, extra])

        box = self.box() + [(-0.01, None)]
        res = minimize(f, np.append(x0, t0), jac=fj, method="SLSQP", bounds=box,
                       constraints=[{"type": "ineq", "fun": c, "jac": cj}],
                       options={"ftol": 1e-10, "maxiter": 100})
        self.iterations += int(res.nit)
        if self.trials.best is not None:
            return self.x_of(self.trials.best.ratios)
        return None

    def box(self) -> list[tuple]:
        return [(math.log(self.bounds.lo[i]), math.log(self.bounds.hi[i])) for i in self.var]

    def minimise(self, x0: np.ndarray) -> None:
        res = minimize(lambda x: self.values(x)[0], x0, jac=lambda x: self.jacobian(x)[0],
                       method="SLSQP", bounds=self.box(),
                       constraints=[{"type": "ineq", "fun": lambda x: self.values(x)[1],
                                     "jac": lambda x: self.jacobian(x)[1]}],
                       options={"ftol": 1e-10, "maxiter": 100})
        self.iterations += int(res.nit)
        self.values(res.x)  # make sure SLSQP's last point was offered

    # -- answers -----------------------------------------------------------------------------
    def closest(self) -> Trial | None:
        """The solved trial within the ratio bounds whose worst temperature margin is best."""
        best = None
        for t in self.trials._cache.values():
            if t.ok and self.ratios_ok(list(t.ratios)):
                if best is None or min(t.margins, default=0.0) > min(best.margins, default=0.0):
                    best = t
        return best

    def failed(self) -> SplitResult:
        errors = [t.error for t in self.trials._cache.values() if t.error is not None]
        if not errors:
            raise ArithmeticError("no start split could be formed")  # a bug, never user input
        err = errors[0]
        problem = getattr(err, "problem", None)
        value = problem.value if problem is not None and isinstance(problem.value, (int, float)) else None
        hint = ""
        if "cannot heat the air" in str(err):
            hint = (" — with this many stages no stage gets as hot as that cooler's outlet: use fewer stages "
                    "or a lower cooler outlet temperature" if self.n > 1 else " — lower the cooler outlet temperature")
        binding = [BindingLimit(err.field or "stages", value, None, None, "violated",
                                f"no split of {self.n} stage(s) could be solved: {err}{hint}",
                                failure_detail(err, self.n, hint))]
        return SplitResult(None, None, False, binding, self.iterations, self.trials.solves,
                           list(self.prepared.notes))

    def finish(self) -> SplitResult:
        if self.var:
            chosen = self.trials.best or self.closest()
        else:  # nothing to choose: the bounds fix the split
            r = self.ratios([])
            chosen = self.trial(r)
            chosen = chosen if chosen is not None and chosen.ok else None
        if chosen is None:
            return self.failed()
        ratios = list(chosen.ratios)
        result = solve_at(self.doc, ratios)
        margins = [lim.margin(result) for lim in self.limits]
        feasible = self.ratios_ok(ratios) and all(m >= 0.0 for m in margins)
        binding = self.binding(ratios, result, margins, feasible)
        return SplitResult(ratios, result, feasible, binding, self.iterations, self.trials.solves,
                           list(self.prepared.notes))

    def binding(self, ratios, result, margins, feasible) -> list[BindingLimit]:
        out = []
        worst = min(margins, default=0.0)
        for lim, m in zip(self.limits, margins):
            t = result.stages[lim.stage].outlet.T
            if feasible and m <= _ACTIVE_K:
                out.append(active_limit(lim, t, self.doc))
            elif not feasible and m < 0.0 and m <= worst + _ACTIVE_K:
                out.append(violated_limit(lim, t, m, self.n, self.doc))
        if feasible:
            b = self.bounds
            for i, r in enumerate(ratios):
                if b.lo_set[i] and r <= b.lo[i] * (1 + 1e-7):
                    out.append(BindingLimit(f"stages[{i}].min_pressure_ratio", b.lo[i], r, None, "active",
                                            f"stage {i + 1} held at its minimum pressure ratio {b.lo[i]:g}"))
                if b.hi_set[i] and r >= b.hi[i] * (1 - 1e-7):
                    out.append(BindingLimit(f"stages[{i}].max_pressure_ratio", b.hi[i], r, None, "active",
                                            f"stage {i + 1} held at its maximum pressure ratio {b.hi[i]:g}"))
        return out


def solve_at(doc: dict, ratios: list[float]) -> TrainResult:
    """The full solve of a study's train at the stage ratios ``ratios`` (a split's ``result``)."""
    doc = dict(doc)
    doc["stages"] = [dict(s, pressure_ratio=r) for s, r in zip(doc["stages"], ratios)]
    return solve(doc)
