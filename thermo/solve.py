"""Solve a project document: pick the model, find the mass flow, balance the train."""
from __future__ import annotations

__all__ = ["solve", "solve_normalised", "model_for", "release_thread_models"]

import atexit
import threading

from stagewright.core.project.validation import normalise
from stagewright.core.errors import InputError, SecondLawViolation, StagewrightError, message_detail, quantity
from stagewright.core.flow import mass_flow_from
from stagewright.core.models import make_model
from stagewright.core.results import TrainResult
from stagewright.core.solve_context import SolveContext, release_thread_caches, solve_context
from stagewright.core.train import solve_train

_local = threading.local()


@atexit.register
def _release_models() -> None:
    """Drop cached CoolProp states before interpreter teardown (avoids nanobind leak reports)."""
    getattr(_local, "models", {}).clear()
    release_thread_caches()


def release_thread_models() -> None:
    """Drop the calling thread's cached property models, and the mixtures and intake states
    kept for them (:mod:`stagewright.core.solve_context`). Call it in a worker thread before the thread
    ends: states left in a finished thread are only collected at interpreter teardown, too
    late for CoolProp."""
    _release_models()


def model_for(fluid: dict, fast: bool = False):
    """Property model for a ``fluid`` section, reused per thread (one AbstractState each).

    ``fast`` gives a separate model flagged ``fast_properties``: its moist-air mixture
    interpolates the enhancement factor (:mod:`stagewright.core.moist.enhancement_table`)."""
    cache = getattr(_local, "models", None)
    if cache is None:
        cache = _local.models = {}
    key = (fluid.get("model", "real_gas"), fluid.get("cp_J_kgK"), fluid.get("k"), fast)
    if key not in cache:
        model = make_model(fluid)
        if fast:
            model.fast_properties = True
        cache[key] = model
    return cache[key]


def solve(doc: dict, detail: bool = True) -> TrainResult:
    """Solve a compression train described by a project document.

    Parameters
    ----------
    doc : dict
        Project document (see ``docs/project-format.md``).
    detail : bool
        False skips reporting-only work (see :func:`stagewright.core.train.solve_train`); powers,
        states and totals are unchanged. Used for the many trial solves of a study.

    Returns
    -------
    TrainResult
        Every state, component balance and total; ``.to_dict()`` gives plain data.

    Raises
    ------
    StagewrightError
        For any input problem (its message names the field, value and valid range),
        a state outside the property model's range, or a second-law violation.

    Notes
    -----
    When the flow is given as shaft power, the mass flow is found by the secant method
    on the shaft power of the whole train (a running machine checked from measured
    pressures, temperatures and power), converged to 1e-12 relative.

    Examples
    --------
    >>> doc = {"site": {"ambient_temperature_K": 293.15, "barometric_pressure_Pa": 100000.0},
    ...        "fluid": {"model": "constant_cp"}, "flow": {"kind": "mass", "value": 1.0},
    ...        "discharge_pressure_Pa": 400000.0,
    ...        "stages": [{"efficiency": {"kind": "isentropic", "value": 1.0}}]}
    >>> round(solve(doc).stages[0].outlet.T, 3)  # 293.15 * 4 ** (0.4 / 1.4)
    435.619
    """
    return solve_normalised(normalise(doc), detail)


def solve_normalised(norm: dict, detail: bool = True, fast: bool = False, reuse: dict | None = None) -> TrainResult:
    """:func:`solve` for a document already passed through :func:`stagewright.core.project.validation.normalise`.

    For callers that validate once and then solve many variants (sweeps, studies).
    ``fast`` selects the fast property path of trial solves: for moist real-gas air the
    enhancement factor is interpolated (:mod:`stagewright.core.moist.enhancement_table`); reported figures
    agree with the exact path to better than 1e-4 relative (tests/test_fast_path.py), and
    the other models are unaffected. ``reuse`` (a dict the caller keeps across solves of one
    document that differ only in stage ratios) lets a stage whose inputs did not change be
    taken from an earlier solve (:func:`stagewright.core.train.solve_train`); shaft-power flows ignore it.

    The site is resolved here, once per solve (:func:`stagewright.core.project.validation.resolve_site`),
    and the solve's context built from it (:func:`stagewright.core.solve_context.solve_context`: the
    intake's stream model, humidity ratio and states); every train solve of the shaft-power
    iteration reads them from that one context.
    """
    flow = norm["flow"]
    fixed = _casing_power(norm, flow["value"]) if flow["kind"] == "shaft_power" else 0.0
    ctx = solve_context(norm, model_for(norm["fluid"], fast))
    if flow["kind"] != "shaft_power":
        # moist intake: FAD refers to the moist air, so the intake's stream model converts it
        m = mass_flow_from(flow["kind"], flow["value"], ctx.intake.model, ctx.site.ambient_temperature_K,
                           ctx.site.pressure_Pa, ambient=ctx.intake.ambient)
        res = solve_train(ctx, m, detail, reuse)
    else:
        res = _solve_for_power(ctx, flow["value"], fixed, detail)
    if detail and norm.get("package"):
        # only projects with a package need it
        from stagewright.core.part_load.figures import package_figures, package_warnings
        res.package = package_figures(norm, res)
        res.warnings.extend(package_warnings(res.package))
    return res


def _casing_power(norm: dict, target_W: float) -> float:
    r"""Shaft power the casing heat losses take alone, :math:`\sum_i \dot Q_i / \eta_{m,i}` [W].

    Parameters
    ----------
    norm : dict
        Normalised project document (its stages' ``heat_loss_W`` [W] and
        ``mechanical_efficiency`` [-]).
    target_W : float
        Shaft power asked for, [W].

    Returns
    -------
    float
        The casing losses' shaft power, [W].

    Raises
    ------
    InputError
        Naming ``flow.value`` when the power asked for does not exceed it (no air would move).

    Notes
    -----
    :math:`\dot W_\mathrm{shaft} = (\dot m\,\Delta h_0 + \dot Q)/\eta_m` per stage
    (:func:`stagewright.core.stage.solve_stage`), so the shaft power tends to this sum as the flow
    tends to zero.
    """
    fixed = sum(s["heat_loss_W"] / s["mechanical_efficiency"] for s in norm["stages"])
    if target_W <= fixed:
        raise InputError("flow.value", target_W,
                         f"shaft power must exceed {fixed:.6g} W, the casing heat losses alone; "
                         "this power is too small to move any air",
                         message_detail("Shaft power {value} is too small to move any air: it must exceed "
                                        "{fixed}, the casing heat losses alone",
                                        {"value": quantity(target_W, "power"), "fixed": quantity(fixed, "power")}))
    return fixed


def _first_trial(ctx: SolveContext) -> tuple[float, TrainResult]:
    """The first trial flow and its lean solve: 1 kg/s, else the first of a few decades either
    side that the second law allows. With a casing heat loss the heat per kilogram depends on the
    flow, so a measured discharge temperature may be possible only at smaller (or larger) flows
    than the first trial's; the first refusal is raised when no trial is allowed."""
    first = None
    for m in (1.0, 0.1, 10.0, 0.01, 100.0, 1e-3, 1e-4, 1e-5):
        try:
            return m, solve_train(ctx, m, False)
        except SecondLawViolation as exc:
            first = first or exc
    raise first


def _solve_for_power(ctx: SolveContext, target_W: float, fixed: float, detail: bool = True) -> TrainResult:
    """Find the mass flow whose shaft power equals ``target_W`` (secant, bracketed); ``fixed`` is
    the shaft power of the casing heat losses, [W] (:func:`_casing_power`).

    A trial flow the second law refuses (a measured discharge temperature that needs the casing
    heat loss of a smaller flow) is halved back toward the last allowed trial; only when the
    iteration ends on a refused flow is that refusal raised."""
    # The trial solves skip the reporting-only work (their shaft power is the same either way);
    # the converged flow is then solved once with ``detail``. Without casing heat loss the
    # power per kilogram does not depend on the flow, so the first estimate is usually the
    # answer: it is solved with ``detail`` at once.
    m0, r0 = _first_trial(ctx)
    per_kg = (r0.shaft_power_W - fixed) / m0
    m1 = (target_W - fixed) / per_kg
    m_prev, f_prev = m0, r0.shaft_power_W - target_W
    trial_detail = detail and fixed == 0.0
    refused = None
    for _ in range(60):
        try:
            r1 = solve_train(ctx, m1, trial_detail)
        except SecondLawViolation as exc:
            refused, trial_detail = exc, False
            m1 = 0.5 * (m1 + m_prev)
            continue
        refused = None
        f1 = r1.shaft_power_W - target_W
        if abs(f1) <= 1e-12 * target_W:
            return r1 if trial_detail == detail else solve_train(ctx, m1, detail)
        trial_detail = False
        if f1 == f_prev:
            break
        m_next = m1 - f1 * (m1 - m_prev) / (f1 - f_prev)
        m_prev, f_prev, m1 = m1, f1, max(m_next, 0.5 * m1)
    if refused is not None:
        raise refused
    raise StagewrightError(f"flow.value: no mass flow gives a shaft power of {target_W:.6g} W", "flow.value",
                           message_detail("No mass flow gives a shaft power of {value}",
                                          {"value": quantity(target_W, "power")}))
