"""Benchmark of the staging study: medians over repeats, printed; nothing is asserted.

    python bench/study.py [--repeats 7]
    python bench/study.py --against DIR [--rounds 5]

Without ``--against``: a 1…6-stage comparison of the bottling-hall sample on each property model,
single optimal splits, and the cost of one trial (lean) and one full train solve, for context.
Runs on one core (the core is single-threaded; BLAS threads are pinned to 1).

With ``--against DIR`` (an export of another commit, e.g. ``git archive 2ad76eb | tar -x -C DIR``):
this checkout and DIR side by side on bench/run.py's four-stage humid real-gas train — the 1…6 and
1…8 comparisons in one process and with 2 processes on a warm pool, and each stage count's own
optimal split (N = 1…8), the growth per stage count. Each round runs one fresh process per tree,
the trees in turn, so that the machine's changing speed falls on both alike; in-process figures
are CPU time (``time.process_time``), pool figures wall time; medians over rounds and repeats.
"""
from __future__ import annotations

import os

os.environ.setdefault("OMP_NUM_THREADS", "1")
os.environ.setdefault("OPENBLAS_NUM_THREADS", "1")

import argparse  # noqa: E402
import copy  # noqa: E402
import importlib  # noqa: E402
import json  # noqa: E402
import statistics  # noqa: E402
import subprocess  # noqa: E402
import sys  # noqa: E402
import time  # noqa: E402
from pathlib import Path  # noqa: E402

ROOT = Path(__file__).resolve().parent.parent
SAMPLE = ROOT / "sample_projects" / "two_stage_plant_air.json"
MOST = 8


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


def four_stage_doc() -> dict:
    """bench/run.py's four-stage real-gas train to 40 bar(a), water-cooled, humid intake (a copy: importing
    bench/run.py would put this checkout ahead of the tree a worker measures)."""
    return {"title": "bench: four-stage 40 bar(a)",
            "site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100_000.0, "relative_humidity": 0.6},
            "fluid": {"model": "real_gas"}, "flow": {"kind": "free_air_delivery", "value": 0.5},
            "inlet_pressure_drop_Pa": 1500.0, "discharge_pressure_Pa": 40e5, "driver": {"efficiency": 0.96},
            "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8}, "mechanical_efficiency": 0.985,
                        "heat_loss_W": 1000.0,
                        "cooler": {"approach_K": 8.0, "coolant_inlet_temperature_K": 298.15,
                                   "pressure_drop_Pa": 15_000.0}} for _ in range(4)]}


# -- one tree, in a worker process ---------------------------------------------------------------
def worker(repeats: int) -> dict:
    """Every side-by-side case once in this process (the tree on PYTHONPATH), as JSON-able data."""
    from stagewright.core.study import compare_stagings
    from stagewright.core.study.optimal_split import split_prepared
    from stagewright.core.study.options import staging_stages
    from stagewright.core.study.prepare import prepare
    from stagewright.core.warm_pool import warm_up_pool

    doc = four_stage_doc()
    compare_stagings(doc, 3)  # imports, property tables, the enhancement-factor nodes

    def cpu(fn):
        t = time.process_time()
        fn()
        return time.process_time() - t

    def wall(fn):
        t = time.perf_counter()
        fn()
        return time.perf_counter() - t

    out = {"where": str(Path(sys.modules["stagewright.core.study"].__file__).resolve().parent.parent.parent)}
    out["compare 1…6, 1 process"] = [cpu(lambda: compare_stagings(doc, 6)) for _ in range(repeats)]
    out["compare 1…8, 1 process"] = [cpu(lambda: compare_stagings(doc, MOST)) for _ in range(repeats)]
    prepared = prepare(doc)
    per_n = {}
    train = importlib.import_module("stagewright.core.train")
    solve_stage, stage_solves = train.solve_stage, [0]

    def counting(*args, **kwargs):
        stage_solves[0] += 1
        return solve_stage(*args, **kwargs)
    for n in range(1, MOST + 1):
        problem = prepared.with_stages(staging_stages(prepared.doc["stages"], n))
        per_n[n] = [cpu(lambda: split_prepared(problem)) for _ in range(repeats)]
        train.solve_stage, stage_solves[0] = counting, 0
        split = split_prepared(problem)  # once more, counting (the final full solve's stages included)
        train.solve_stage = solve_stage
        per_n[f"{n} counts"] = [split.solves, stage_solves[0], split.iterations]
    out["per stage count"] = per_n
    warm_up_pool(2)
    compare_stagings(doc, MOST, processes=2)  # as bench/run.py: the workers' first study fills their tables
    out["compare 1…6, 2 processes (warm pool)"] = [wall(lambda: compare_stagings(doc, 6, processes=2))
                                                    for _ in range(repeats)]
    out["compare 1…8, 2 processes (warm pool)"] = [wall(lambda: compare_stagings(doc, MOST, processes=2))
                                                    for _ in range(repeats)]
    return out


def side_by_side(other: Path, rounds: int, repeats: int) -> None:
    """Run :func:`worker` in fresh processes, this checkout and ``other`` in turn; print the tables."""
    trees = {"old": other.resolve(), "new": ROOT}
    runs: dict[str, list[dict]] = {"old": [], "new": []}
    for _ in range(rounds):
        for label, tree in trees.items():
            env = dict(os.environ, PYTHONPATH=str(tree))
            text = subprocess.run([sys.executable, str(Path(__file__).resolve()), "--worker", "--repeats", str(repeats)],
                                  cwd=tree, env=env, check=True, capture_output=True, text=True).stdout
            data = json.loads(text.strip().splitlines()[-1])
            assert Path(data["where"]) == tree, f"measured {data['where']}, not {tree}"
            runs[label].append(data)

    def median_ms(label, key, sub=None):
        values = [v for run in runs[label] for v in (run[key] if sub is None else run[key][sub])]
        return 1e3 * statistics.median(values)

    print(f"staging study side by side — old: {trees['old']}, new: {trees['new']}")
    print(f"bench/run.py's four-stage humid real-gas train; medians of {rounds} rounds × {repeats} runs\n")
    print(f"{'case':<42}{'old':>10}{'new':>10}{'old/new':>9}")
    for key in ("compare 1…6, 1 process", "compare 1…8, 1 process", "compare 1…6, 2 processes (warm pool)",
                "compare 1…8, 2 processes (warm pool)"):
        old, new = median_ms("old", key), median_ms("new", key)
        unit = "wall" if "pool" in key else "CPU"
        print(f"{key + ' (' + unit + ')':<42}{old:8.0f}ms{new:8.0f}ms{old / new:8.2f}×")
    print("\none stage count's optimal split (CPU); its trial solves, stage solves and SLSQP iterations")
    print(f"{'N':>3}{'old':>10}{'new':>10}{'old/new':>9}{'old Δ':>9}{'new Δ':>9}"
          f"{'trials old/new':>16}{'stages old/new':>16}{'iter old/new':>14}")
    last = {"old": 0.0, "new": 0.0}
    for n in range(1, MOST + 1):
        t = {label: median_ms(label, "per stage count", str(n)) for label in runs}
        (t_old, s_old, i_old), (t_new, s_new, i_new) = (runs[label][0]["per stage count"][f"{n} counts"]
                                                        for label in ("old", "new"))
        ratio = t["old"] / t["new"] if t["new"] > 0.5 else float("nan")
        print(f"{n:3d}{t['old']:8.1f}ms{t['new']:8.1f}ms{ratio:8.2f}×{t['old'] - last['old']:+7.1f}ms"
              f"{t['new'] - last['new']:+7.1f}ms{f'{t_old}/{t_new}':>16}{f'{s_old}/{s_new}':>16}{f'{i_old}/{i_new}':>14}")
        last = t
    print("(N = 1: the 40 bar(a) discharge is out of reach of one stage; no trial is solved)")


# -- the single-tree table -----------------------------------------------------------------------
def main_table(repeats: int) -> None:
    import stagewright.core
    from stagewright.core.study import compare_stagings, optimal_split
    base = json.loads(SAMPLE.read_text(encoding="utf-8"))
    compare_stagings(base, 2)  # warm-up: CoolProp state, imports

    print(f"staging study benchmark — medians of {repeats} runs (min in brackets)\n")
    print(f"{'case':<46}{'median':>10}{'min':>10}{'solves':>8}{'iter':>6}")
    for model in ("real_gas", "ideal_gas", "constant_cp"):
        doc = with_model(base, model)
        med, lo, comp = timed(lambda: compare_stagings(doc, 6), repeats)
        solves = sum(o.split.solves for o in comp.options)
        iters = sum(o.split.iterations for o in comp.options)
        print(f"{'compare 1…6 stages, ' + model:<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms{solves:8d}{iters:6d}")
    med, lo, _ = timed(lambda: compare_stagings(base, 8), repeats)
    print(f"{'compare 1…8 stages, real_gas':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms")
    tight = copy.deepcopy(base)
    for st in tight["stages"]:
        st["max_discharge_temperature_K"] = 440.0
    med, lo, comp = timed(lambda: compare_stagings(tight, 6), repeats)
    solves = sum(o.split.solves for o in comp.options)
    print(f"{'compare 1…6, real_gas, 440 K limit binding':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms{solves:8d}")
    print()
    for n in (2, 3, 6):
        doc = with_stages(base, n)
        med, lo, out = timed(lambda: optimal_split(doc, strict=False), repeats)
        print(f"{f'optimal_split, {n} stages, real_gas':<46}{med * 1e3:8.1f}ms{lo * 1e3:8.1f}ms"
              f"{out.solves:8d}{out.iterations:6d}")
    print()
    for n in (2, 6):
        doc = with_stages(base, n)
        for s in doc["stages"]:
            s["pressure_ratio"] = 9.5 ** (1 / n)
        for detail in (False, True):
            med, lo, _ = timed(lambda: stagewright.core.solve(doc, detail=detail), repeats * 5)
            what = "full" if detail else "trial (detail=False)"
            print(f"{f'one {what} solve, {n} stages, real_gas':<46}{med * 1e3:8.2f}ms{lo * 1e3:8.2f}ms")


def main() -> None:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--repeats", type=int, default=None, help="runs per case (default 7; 3 a round with --against)")
    p.add_argument("--against", type=Path, help="another tree (a git archive export) to measure side by side")
    p.add_argument("--rounds", type=int, default=5, help="rounds with --against (one process per tree each)")
    p.add_argument("--worker", action="store_true", help=argparse.SUPPRESS)
    args = p.parse_args()
    if args.worker:
        print(json.dumps(worker(args.repeats or 3)))
    elif args.against is not None:
        side_by_side(args.against, args.rounds, args.repeats or 3)
    else:
        main_table(args.repeats or 7)


if __name__ == "__main__":
    main()
