"""Per-stage limits of a staging study, and how a limit binds or fails.

Three kinds of limit act on a split:

* pressure-ratio bounds (``min_pressure_ratio``, ``max_pressure_ratio``) — pure pressure
  arithmetic, checked here before any property is evaluated;
* the maximum discharge temperature (``max_discharge_temperature_K``);
* the cooler after a stage, which can only cool: the stage must discharge at least as hot
  as the cooler's outlet temperature (the core's cooler rejects anything else).

The temperature kinds need a train solve and are handled by :mod:`stagewright.core.study.optimal_split`;
this module holds the shared types and the pressure-arithmetic checks.
"""
from __future__ import annotations

__all__ = ["MIN_STAGE_RATIO", "RATIO_CAP", "BindingLimit", "LimitNotMet", "RatioBounds",
           "ratio_bounds", "pressure_reach_problems", "implied_ratio", "active_limit", "violated_limit",
           "failure_detail"]

import math
from dataclasses import dataclass


from stagewright.core.errors import InputError
from stagewright.core.split import delivered_pressure

#: Smallest ratio the study gives a stage: a numerical floor (a stage at ratio 1 does
#: nothing and its polytropic exponent is undefined), not an engineering limit.
MIN_STAGE_RATIO = 1.001
#: Largest stage ratio the project format accepts (``stages[].pressure_ratio``).
RATIO_CAP = 40.0


def brentq(*args, **kwargs):
    """scipy.optimize.brentq, imported on first use (keeps the window's start-up light)."""
    from scipy.optimize import brentq as _brentq
    return _brentq(*args, **kwargs)


@dataclass(frozen=True)
class BindingLimit:
    """A limit that decides the split.

    Attributes
    ----------
    field : str
        Path of the limit in the project (``stages[0].max_discharge_temperature_K``).
    limit : float or None
        The value set in the project, [unit of the field] (None if it is not a number).
    value : float or None
        What the returned split gives for the limited quantity (same unit), None when no
        split could be evaluated.
    closest_feasible : float or None
        For a violated limit, the nearest value of the limit that some split meets; for an
        active limit, None.
    status : str
        ``"active"`` (met, holding the optimum back) or ``"violated"`` (no split meets it).
    message : str
        One line for people (SI).
    detail : dict or None
        Where the limit is a solve that failed: that error's template and values
        (:func:`stagewright.core.errors.message_detail`), for display units.
    """

    field: str
    limit: float | None
    value: float | None
    closest_feasible: float | None
    status: str
    message: str
    detail: dict | None = None

    def to_dict(self) -> dict:
        """Plain-data form for JSON."""
        return {"field": self.field, "limit": self.limit, "value": self.value,
                "closest_feasible": self.closest_feasible, "status": self.status, "message": self.message,
                "detail": self.detail}


class LimitNotMet(InputError):
    """No split meets a limit; names it, its value and the closest feasible value.

    Attributes
    ----------
    binding : list of BindingLimit
        Every violated limit (the message names the first).
    split : SplitResult or None
        The split that comes closest (least violation), for display; never a design.
    """

    def __init__(self, binding: list[BindingLimit], split=None):
        first = binding[0]
        super().__init__(first.field, first.limit, first.message)
        self.binding = list(binding)
        self.split = split


@dataclass(frozen=True)
class RatioBounds:
    """Stage-ratio bounds; ``lo_set``/``hi_set`` tell which come from the project."""

    lo: tuple
    hi: tuple
    lo_set: tuple
    hi_set: tuple

    def pinned(self, i: int) -> bool:
        """True when stage ``i`` has no freedom (min = max)."""
        return self.hi[i] - self.lo[i] <= 1e-12 * self.hi[i]


def ratio_bounds(stages: list[dict]) -> RatioBounds:
    """Ratio bounds of normalised stage entries (project values, else 1.001 … 40)."""
    lo, hi, lo_set, hi_set = [], [], [], []
    for st in stages:
        a, b = st.get("min_pressure_ratio"), st.get("max_pressure_ratio")
        lo.append(max(MIN_STAGE_RATIO, a) if a is not None else MIN_STAGE_RATIO)
        hi.append(min(RATIO_CAP, b) if b is not None else RATIO_CAP)
        lo_set.append(a is not None and a >= MIN_STAGE_RATIO)
        hi_set.append(b is not None and b < RATIO_CAP)
    return RatioBounds(tuple(lo), tuple(hi), tuple(lo_set), tuple(hi_set))


def implied_ratio(p_in: float, p_delivery: float, ratios: list[float], drops: list[float], k: int) -> float:
    r"""Ratio of stage ``k`` that makes the train deliver ``p_delivery`` exactly, [-].

    The delivered pressure is affine in any one stage ratio,
    :math:`p_d(r_k) = A r_k + B` (see :func:`stagewright.core.split.delivered_pressure`), so
    :math:`r_k = (p_d - B)/A` with :math:`B = p_d(0)`, :math:`A = p_d(1) - B`.

    Returns NaN when no positive ratio does it (an upstream pressure below zero).

    Examples
    --------
    >>> round(implied_ratio(1e5, 9e5, [3.0, None], [0.0, 0.0], 1), 12)
    3.0
    """
    trial = list(ratios)
    trial[k] = 0.0
    b = delivered_pressure(p_in, trial, drops)
    trial[k] = 1.0
    a = delivered_pressure(p_in, trial, drops) - b
    if not a > 0.0:
        return math.nan
    return (p_delivery - b) / a


def _stage_list(idx: list[int]) -> str:
    return ", ".join(str(i + 1) for i in idx)


def pressure_reach_problems(p_in: float, p_delivery: float, drops: list[float],
                            bounds: RatioBounds) -> list[BindingLimit]:
    r"""Violated ratio bounds: the discharge pressure out of reach of every allowed split.

    Parameters
    ----------
    p_in : float
        Stage-1 inlet pressure, [Pa].
    p_delivery : float
        Pressure wanted after the last cooler, [Pa].
    drops : list of float
        Cooler pressure drop after each stage, [Pa].
    bounds : RatioBounds
        Stage-ratio bounds.

    Returns
    -------
    list of BindingLimit
        Empty when some split within the bounds meets the discharge pressure; otherwise
        the bounds that prevent it, each with the closest feasible common value.

    Notes
    -----
    The delivered pressure rises monotonically with every stage ratio, so the bounds
    admit a split exactly when :math:`p_d(r_\mathrm{lo}) \le p_\mathrm{delivery} \le
    p_d(r_\mathrm{hi})`. The closest feasible value is the one number c that, used as
    the bound on every stage whose bound is too tight, just meets the discharge pressure.
    """
    n = len(drops)
    lo, hi = list(bounds.lo), list(bounds.hi)
    p_max = delivered_pressure(p_in, hi, drops)
    if p_max < p_delivery:
        capped = [i for i in range(n) if bounds.hi_set[i]]

        def reach(c: float) -> float:
            return delivered_pressure(p_in, [max(h, c) if i in capped else h for i, h in enumerate(hi)],
                                      drops) - p_delivery
        if not capped or reach(RATIO_CAP) < 0.0:
            top = delivered_pressure(p_in, [RATIO_CAP] * n, drops)
            return [BindingLimit("discharge_pressure_Pa", p_delivery, p_max, top, "violated",
                                 f"{n} stage(s) of pressure ratio up to {RATIO_CAP:g} deliver at most "
                                 f"{top:.6g} Pa (closest feasible value), below the {p_delivery:.6g} Pa "
                                 "asked for: add stages")]
        c = brentq(reach, min(hi[i] for i in capped), RATIO_CAP, xtol=1e-12, rtol=1e-14)
        tight = [i for i in capped if hi[i] < c]
        msg = (f"the maximum pressure ratios of stage(s) {_stage_list(tight)} deliver at most "
               f"{p_max:.6g} Pa, below the {p_delivery:.6g} Pa asked for: a maximum of at least "
               f"{c:.4f} is needed (closest feasible value), or add stages")
        return [BindingLimit(f"stages[{i}].max_pressure_ratio", hi[i], None, c, "violated", msg) for i in tight]
    p_min = delivered_pressure(p_in, lo, drops)
    if p_min > p_delivery:
        raised = [i for i in range(n) if bounds.lo_set[i]]

        def over(c: float) -> float:
            return delivered_pressure(p_in, [min(v, c) if i in raised else v for i, v in enumerate(lo)],
                                      drops) - p_delivery
        if not raised or over(MIN_STAGE_RATIO) > 0.0:
            return [BindingLimit("discharge_pressure_Pa", p_delivery, p_min, p_min, "violated",
                                 f"{n} stage(s) of pressure ratio at least {MIN_STAGE_RATIO:g} deliver at "
                                 f"least {p_min:.6g} Pa (closest feasible value), above the "
                                 f"{p_delivery:.6g} Pa asked for: use fewer stages")]
        c = brentq(over, MIN_STAGE_RATIO, max(lo[i] for i in raised), xtol=1e-12, rtol=1e-14)
        tight = [i for i in raised if lo[i] > c]
        msg = (f"the minimum pressure ratios of stage(s) {_stage_list(tight)} deliver at least "
               f"{p_min:.6g} Pa, above the {p_delivery:.6g} Pa asked for: a minimum of at most "
               f"{c:.4f} is needed (closest feasible value), or use fewer stages")
        return [BindingLimit(f"stages[{i}].min_pressure_ratio", lo[i], None, c, "violated", msg) for i in tight]
    return []


def failure_detail(err, n: int, hint: str) -> dict | None:
    """The message template of a failed trial solve, prefixed for the study (None without one)."""
    detail = getattr(err, "detail", None)
    if not detail:
        return None
    return {"template": f"no split of {n} stage(s) could be solved: " + detail["template"] + hint,
            "values": detail["values"]}


def active_limit(lim, t: float, doc: dict) -> BindingLimit:
    """A temperature limit (a :class:`~stagewright.core.study.trials.SoftLimit`) met just at the optimum,
    the stage discharging at ``t`` [K]."""
    if lim.kind == "max_temperature":
        return BindingLimit(lim.field, lim.limit, t, None, "active",
                            f"stage {lim.stage + 1} discharge held at its limit {lim.limit:.2f} K")
    value = doc["stages"][lim.stage]["cooler"]["approach_K"] if lim.field.endswith("approach_K") else lim.limit
    return BindingLimit(lim.field, value, t, None, "active",
                        f"stage {lim.stage + 1} discharges just at its cooler's outlet temperature "
                        f"{lim.limit:.2f} K")


def violated_limit(lim, t: float, margin: float, n: int, doc: dict) -> BindingLimit:
    """A temperature limit that the closest split of ``n`` stages misses by ``-margin`` [K], with the
    closest value of the limit that would be met."""
    if lim.kind == "max_temperature":
        need = lim.limit - margin
        msg = (f"no split of {n} stage(s) keeps every stage within its discharge-temperature limit: "
               f"the closest split still discharges {t:.2f} K from stage {lim.stage + 1}, above its "
               f"limit {lim.limit:.2f} K; the closest feasible value is {need:.2f} K (or add stages)")
        return BindingLimit(lim.field, lim.limit, t, need, "violated", msg)
    cooler = doc["stages"][lim.stage]["cooler"]
    need_t = lim.limit + margin
    if lim.field.endswith("approach_K"):
        value, need = cooler["approach_K"], cooler["approach_K"] + margin
        what = f"approach {value:.2f} K (outlet {lim.limit:.2f} K)"
        closest = f"an approach of at most {need:.2f} K"
    else:
        value, need = lim.limit, need_t
        what = f"outlet {lim.limit:.2f} K"
        closest = f"an outlet of at most {need:.2f} K"
    msg = (f"with {n} stage(s) stage {lim.stage + 1} discharges at most {t:.2f} K, below its cooler's "
           f"{what}, and a cooler cannot heat the air; the closest feasible value is {closest} "
           "(or use fewer stages)")
    return BindingLimit(lim.field, value, t, need, "violated", msg)
