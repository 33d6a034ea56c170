"""Benchmark of the staging study: medians over repeats, printed; nothing is asserted.

    python bench/study.py [--repeats 7]

Cases: a 1…6-stage comparison of the bottling-hall sample on each property model,
single optimal splits, and the cost of one trial (lean) and one full train solve, for
context. Runs on one core (the core is single-threaded; BLAS threads are pinned to 1).
"""
from __future__ import annotations

import os

os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import argparse  # noqa: E402
import copy  # noqa: E402
import json  # noqa: E402
import statistics  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

import stagewright.core  # noqa: E402
from stagewright.core.study import compare_stagings, optimal_split  # noqa: E402

SAMPLE = Path(__file__).resolve().parent.parent / "sample_projects" / "two_stage_plant_air.json"


def timed(fn, repeats: int):
    """Median and minimum wall time [s] of ``fn()`` over ``repeats`` runs, and its last value."""
    times, value = [], None
    for _ in range(repeats):
        t = time.perf_counter()
        value = fn()
        times.append(time.perf_counter() - t)
    return statistics.median(times), min(times), value


def with_model(doc: dict, model: str) -> dict:
    d = copy.deepcopy(doc)
    d["fluid"] = {"model": model}
    return d


def with_stages(doc: dict, n: int) -> dict:
    d = copy.deepcopy(doc)
    d["stages"] = [copy.deepcopy(doc["stages"][0]) for _ in range(n)]
    return d


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--repeats", type=int, default=7)
    args = p.parse_args()
    base = json.loads(SAMPLE.read_text(encoding="utf-8"))
    compare_stagings(base, 2)  # warm-up: CoolProp state, imports

    print(f"staging study benchmark — medians of {args.repeats} runs (min in brackets)\n")
    print(f"{'case':<46}{'median':>10}{'min':>10}{'solves':>8}{'iter':>6}")
    for model in ("real_gas", "ideal_gas", "constant_cp"):
        doc = with_model(base, model)
        med, lo, comp = timed(lambda: compare_stagings(doc, 6), args.repeats)
        solves = sum(o.split.solves for o in comp.options)
        iters = sum(o.split.iterations for o in comp.options)
        print(f"{'compare 1…6 stages, ' + model:<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms{solves:8d}{iters:6d}")
    med, lo, _ = timed(lambda: compare_stagings(base, 8), args.repeats)
    print(f"{'compare 1…8 stages, real_gas':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms")
    tight = copy.deepcopy(base)
    for st in tight["stages"]:
        st["max_discharge_temperature_K"] = 440.0
    med, lo, comp = timed(lambda: compare_stagings(tight, 6), args.repeats)
    solves = sum(o.split.solves for o in comp.options)
    print(f"{'compare 1…6, real_gas, 440 K limit binding':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms{solves:8d}")
    print()
    for n in (2, 3, 6):
        doc = with_stages(base, n)
        med, lo, out = timed(lambda: optimal_split(doc, strict=False), args.repeats)
        print(f"{f'optimal_split, {n} stages, real_gas':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms"
              f"{out.solves:8d}{out.iterations:6d}")
    print()
    for n in (2, 6):
        doc = with_stages(base, n)
        for s in doc["stages"]:
            s["pressure_ratio"] = 9.5 ** (1 / n)
        for detail in (False, True):
            med, lo, _ = timed(lambda: stagewright.core.solve(doc, detail=detail), args.repeats * 5)
            what = "full" if detail else "trial (detail=False)"
            print(f"{f'one {what} solve, {n} stages, real_gas':<46}{med * 1e3:8.2f}ms{lo * 1e3:8.2f}ms")


if __name__ == "__main__":
    main()
