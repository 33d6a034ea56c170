"""Trial solves of one train at given stage ratios: cached, counted, cancellable."""
from __future__ import annotations

__all__ = ["SoftLimit", "soft_limits", "Trial", "TrialSolver"]

import math
from dataclasses import dataclass
from typing import Callable

from stagewright.core.cooler import cooler_outlet_temperature, outlet_field
from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.results import TrainResult
from stagewright.core.project.schema import STAGE
from stagewright.core.solve import solve_normalised
from stagewright.core.study.progress import StudyCancelled


@dataclass(frozen=True)
class SoftLimit:
    """A temperature limit on one stage; its margin [K] is ≥ 0 when met.

    ``kind`` is ``"max_temperature"`` (discharge at most ``limit``) or ``"cooler"`` (the
    cooler after the stage can only cool: discharge at least ``limit``, its outlet).
    """

    field: str
    stage: int
    kind: str
    limit: float

    def margin(self, result: TrainResult) -> float:
        """How far the solved train is inside the limit, [K] (negative: violated)."""
        t = result.stages[self.stage].outlet.T
        return self.limit - t if self.kind == "max_temperature" else t - self.limit


def soft_limits(stages: list[dict], ambient_K: float) -> list[SoftLimit]:
    """The temperature limits of normalised stage entries at a site ambient temperature [K].

    A cooler rated from its UA has no set outlet temperature and so no limit here."""
    out = []
    for i, st in enumerate(stages):
        if st.get("max_discharge_temperature_K") is not None:
            out.append(SoftLimit(f"stages[{i}].max_discharge_temperature_K", i, "max_temperature",
                                 st["max_discharge_temperature_K"]))
        cooler = st.get("cooler")
        t_out = cooler_outlet_temperature(cooler, ambient_K) if cooler else None
        if t_out is not None:
            out.append(SoftLimit(outlet_field(cooler, f"stages[{i}].cooler"), i, "cooler", t_out))
    return out


@dataclass
class Trial:
    """One trial split and what the train does with it."""

    ratios: tuple
    result: TrainResult | None
    error: StagewrightError | None
    margins: tuple | None  #: one per soft limit, [K]; None when the solve failed

    @property
    def ok(self) -> bool:
        return self.result is not None

    @property
    def feasible(self) -> bool:
        """Solved, and every temperature limit met (ratio bounds are the caller's)."""
        return self.ok and all(m >= 0.0 for m in self.margins)

    @property
    def power_W(self) -> float:
        return self.result.driver_power_W


class TrialSolver:
    """Solve a train at given ratios with the lean core solve; remember every trial.

    Parameters
    ----------
    doc : dict
        Normalised design document (:class:`stagewright.core.study.prepare.Prepared`).
    limits : list of SoftLimit
        The temperature limits to evaluate on each trial.
    should_stop : callable
        Checked before every solve; when it returns True, :class:`StudyCancelled` is raised.

    Notes
    -----
    Trials use ``solve_normalised(doc, detail=False)``: the same energy and entropy balances
    as a full solve, without the reporting-only polytropic-efficiency search of isentropic
    stages (about ten times cheaper on the real-gas model), on the fast property path
    (``fast=True``: interpolated enhancement factor for moist real-gas air, within 1e-4 of
    the exact path). The chosen split is then solved in full on the exact path. The document
    is normalised once; a trial changes only the stage ratios, so only they are checked
    against the schema. Trials share their stage results: a stage whose inlet stream and
    discharge pressure are those of an earlier trial is taken from it (``reuse`` of
    :func:`stagewright.core.solve.solve_normalised`; the same inputs give the same results). The
    optimiser's differences move one intermediate pressure at a time
    (:mod:`stagewright.core.study.pressure_steps`), so a difference solves the two stages around it
    (and, in moist air, the next one, which the separator's carry-over reaches).
    """

    def __init__(self, doc: dict, limits: list[SoftLimit], should_stop: Callable[[], bool]):
        self.doc, self.limits, self.should_stop = doc, limits, should_stop
        self._cache: dict[tuple, Trial] = {}
        self._stages: dict = {}  # stage results shared by trials whose leading stages did not change
        self.solves = 0
        self.best: Trial | None = None  #: lowest-power feasible trial so far

    def __call__(self, ratios) -> Trial:
        key = tuple(float(r) for r in ratios)
        hit = self._cache.get(key)
        if hit is not None:
            return hit
        if self.should_stop():
            raise StudyCancelled()
        doc = dict(self.doc)
        doc["stages"] = [dict(s, pressure_ratio=r) for s, r in zip(self.doc["stages"], key)]
        self.solves += 1
        try:
            _check_ratios(key)
            result = solve_normalised(doc, detail=False, fast=True, reuse=self._stages)
        except StagewrightError as exc:
            trial = Trial(key, None, exc, None)
        else:
            trial = Trial(key, result, None, tuple(lim.margin(result) for lim in self.limits))
        self._cache[key] = trial
        return trial

    def offer(self, trial: Trial, ratios_ok: bool) -> None:
        """Keep ``trial`` as the best so far if it is feasible (``ratios_ok``: within bounds)."""
        if ratios_ok and trial.feasible and (self.best is None or trial.power_W < self.best.power_W):
            self.best = trial


_RATIO = STAGE.fields["pressure_ratio"]


def _check_ratios(ratios) -> None:
    """The schema's range check of ``stages[i].pressure_ratio``, for trial ratios."""
    for i, r in enumerate(ratios):
        if not (math.isfinite(r) and _RATIO.lo < r <= _RATIO.hi):
            raise InputError(f"stages[{i}].pressure_ratio", r, _RATIO.describe())
