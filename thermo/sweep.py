"""Parametric sweeps: solve a project over a grid of one or more input fields.

Large sweeps run on every core (a process pool); all sweeps report progress and can be
cancelled between chunks. Points that fail are recorded with their message, never NaN in
what a user sees.
"""
from __future__ import annotations

__all__ = ["sweep", "axis_problems", "SweepResult", "SweepCancelled", "SWEEP_OUTPUTS"]

import copy
import itertools
import math
import os
from concurrent.futures import ProcessPoolExecutor
from dataclasses import dataclass, field

from stagewright.core.project.paths import set_path
from stagewright.core.process_pool import pool_context
from stagewright.core.errors import InputError, StagewrightError
from stagewright.core.project.delivery import DELIVERY_KEYS, state_delivery
from stagewright.core.project.validation import normalise
from stagewright.core.solve import solve_normalised

#: result keys collected at every point (totals of ``TrainResult.to_dict()``)
SWEEP_OUTPUTS = ("mass_flow_kg_s", "shaft_power_W", "driver_power_W", "specific_power_kW_per_m3_min",
                 "heat_rejected_W", "exergy_destroyed_W", "second_law_efficiency",
                 "isothermal_efficiency", "max_discharge_temperature_K", "condensate_kg_s")
_POOL_THRESHOLD = 2000  # points; below this a pool's start-up costs more than it saves
_CHUNK = 250
MAX_POINTS = 1_000_000


class SweepCancelled(StagewrightError):
    """The sweep was cancelled; ``partial`` holds the points finished so far."""


@dataclass
class SweepResult:
    """Outputs of a sweep on a grid; ``values[key][i]`` belongs to ``points[i]``."""

    axes: dict
    points: list
    values: dict
    errors: dict = field(default_factory=dict)  #: point index -> message

    def to_dict(self) -> dict:
        return {"axes": self.axes, "points": self.points,
                "values": {k: [None if (v is None or not math.isfinite(v)) else v for v in vals]
                           for k, vals in self.values.items()},
                "errors": {str(i): msg for i, msg in self.errors.items()}}


def _summary(result) -> tuple:
    out = []
    for key in SWEEP_OUTPUTS:
        if key == "max_discharge_temperature_K":
            out.append(max(s.outlet.T for s in result.stages))
        elif key == "condensate_kg_s":  # a water total, not a train total (0 for dry air)
            out.append(result.water.condensate_kg_s if result.water is not None else 0.0)
        else:
            out.append(float(getattr(result, key, 0.0) or 0.0))
    return tuple(out)


def _set_axis_value(doc: dict, path: str, value: float) -> None:
    """Set one axis value; an axis on one delivery-pressure key replaces a statement in the other
    (absolute or gauge, :mod:`stagewright.core.project.delivery`), so that the point states exactly one."""
    if path in DELIVERY_KEYS:
        state_delivery(doc, path, value)
    else:
        set_path(doc, path, value)


def axis_problems(doc: dict, axes: dict) -> dict:
    """Validate each axis value once (not each grid point): (path, value) -> message.

    A path that does not lead into the project file (an index past the last stage, a key under
    a number) is a problem of every value, named like any other input error."""
    bad = {}
    for p in axes:
        for v in axes[p]:
            trial = copy.deepcopy(doc)
            try:
                _set_axis_value(trial, p, float(v))
            except (TypeError, KeyError, IndexError) as exc:
                bad[(p, float(v))] = str(InputError(f"axes.{p}", p, f"expected a field path of the project file ({exc})"))
                continue
            try:
                normalise(trial)
            except StagewrightError as exc:
                bad[(p, float(v))] = str(exc)
    return bad


def _solve_chunk(base_norm: dict, paths: list, chunk: list, bad: dict) -> list:
    work = copy.deepcopy(base_norm)
    results = []
    for values in chunk:
        problem = next((bad[(p, v)] for p, v in zip(paths, values) if (p, v) in bad), None)
        if problem is not None:
            results.append(("error", problem))
            continue
        for p, v in zip(paths, values):
            _set_axis_value(work, p, v)
        try:
            results.append(("ok", _summary(solve_normalised(work, detail=False, fast=True))))
        except StagewrightError as exc:
            results.append(("error", str(exc)))
    return results



def sweep(doc: dict, axes: dict, *, processes: int | None = None, progress=None, cancel=None) -> SweepResult:
    """Solve ``doc`` at every point of the grid spanned by ``axes``.

    Parameters
    ----------
    doc : dict
        Project document (validated at each point by :func:`stagewright.core.solve`).
    axes : dict
        Field path (``"site.ambient_temperature_K"``, ``"stages[0].efficiency.value"``) →
        list of SI values. The grid is their Cartesian product, the last axis fastest.
    processes : int, optional
        Worker processes; default: all cores for sweeps of 2000 points or more, else 1.
    progress : callable, optional
        ``progress(fraction, message)`` after every chunk.
    cancel : callable or threading.Event, optional
        Checked between chunks; when set, :class:`SweepCancelled` is raised with the
        points finished so far in its ``partial`` attribute.

    Returns
    -------
    SweepResult

    Notes
    -----
    An axis on one delivery-pressure key (``discharge_pressure_Pa``, absolute, or
    ``discharge_gauge_pressure_Pa``, gauge) of a project that states the other replaces that
    statement at every point; both keys on axes are refused. The delivery pressure is resolved
    per point, so a gauge statement follows a site axis (elevation, barometric pressure).

    The document is validated once, and each axis value once; grid points are then
    solved from the normalised document without re-validation and without the
    reporting-only work (``detail=False``: totals and states are the same), on the fast
    property path (``fast=True``: for moist real-gas air the enhancement factor is
    interpolated; every output agrees with an exact full solve to better than 1e-4
    relative, see tests/test_fast_path.py).

    Raises
    ------
    InputError
        For an empty axis or a grid larger than one million points.
    SweepCancelled
        When cancelled.
    """
    paths = list(axes)
    if all(k in paths for k in DELIVERY_KEYS):
        raise InputError(f"axes.{DELIVERY_KEYS[1]}", DELIVERY_KEYS[1],
                         f"sweep the delivery pressure as {DELIVERY_KEYS[0]} (absolute) or as "
                         f"{DELIVERY_KEYS[1]} (gauge), not both")
    for p in paths:
        if len(axes[p]) == 0:
            raise InputError(f"axes.{p}", [], "expected at least one value")
    points = [tuple(float(v) for v in combo) for combo in itertools.product(*(axes[p] for p in paths))]
    if len(points) > MAX_POINTS:
        raise InputError("axes", len(points), f"a sweep is limited to {MAX_POINTS} points")
    base_norm = normalise(doc)
    bad = axis_problems(doc, axes)
    is_cancelled = (cancel.is_set if hasattr(cancel, "is_set") else cancel) or (lambda: False)
    chunks = [points[i:i + _CHUNK] for i in range(0, len(points), _CHUNK)]
    n_proc = processes or ((os.cpu_count() or 1) if len(points) >= _POOL_THRESHOLD else 1)
    done: list = []

    def _collect(res):
        done.extend(res)
        if progress:
            progress(len(done) / len(points), f"{len(done)} of {len(points)} points")

    def _cancelled():
        result = _assemble(axes, paths, points[:len(done)], done)
        err = SweepCancelled(f"sweep cancelled after {len(done)} of {len(points)} points")
        err.partial = result
        return err

    if n_proc <= 1:
        for ch in chunks:
            if is_cancelled():
                raise _cancelled()
            _collect(_solve_chunk(base_norm, paths, ch, bad))
    else:
        with ProcessPoolExecutor(max_workers=n_proc, mp_context=pool_context()) as pool:
            futures = [pool.submit(_solve_chunk, base_norm, paths, ch, bad) for ch in chunks]
            for fut in futures:
                if is_cancelled():
                    for f in futures:
                        f.cancel()
                    raise _cancelled()
                _collect(fut.result())
    return _assemble(axes, paths, points, done)


def _assemble(axes, paths, points, done) -> SweepResult:
    values = {k: [] for k in SWEEP_OUTPUTS}
    errors = {}
    for i, (status, payload) in enumerate(done):
        if status == "ok":
            for k, v in zip(SWEEP_OUTPUTS, payload):
                values[k].append(v)
        else:
            errors[i] = payload
            for k in SWEEP_OUTPUTS:
                values[k].append(None)
    return SweepResult({p: list(map(float, axes[p])) for p in paths}, [list(p) for p in points], values, errors)
