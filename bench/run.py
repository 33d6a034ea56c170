"""Stagewright benchmarks: medians and spreads of the main jobs, ratios against a naive reference.

    python bench/run.py            # all cases
    python bench/run.py solve      # cases whose name contains "solve"

Plain Python, no timing asserts. Figures are recorded in bench/RESULTS.md.
"""
from __future__ import annotations

import copy
import json
import os
import platform
import resource
import statistics
import subprocess
import sys
import tempfile
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
sys.path.insert(0, str(ROOT))
sys.path.insert(0, str(ROOT / "bench"))

import stagewright.core  # noqa: E402
import stagewright.core.coolprop_adapter  # noqa: E402
from naive import naive_minimal, naive_solve  # noqa: E402

SAMPLES = sorted((ROOT / "sample_projects").glob("*.json"))


def four_stage_doc(humid: bool = True) -> dict:
    """Invented 4-stage real-gas train to 40 bar(a), water-cooled, humid intake."""
    doc = {
        "title": "bench: four-stage 40 bar(a)",
        "site": {"ambient_temperature_K": 303.15, "barometric_pressure_Pa": 100_000.0,
                 "relative_humidity": 0.6 if humid else 0.0},
        "fluid": {"model": "real_gas"},
        "flow": {"kind": "free_air_delivery", "value": 0.5},
        "inlet_pressure_drop_Pa": 1500.0,
        "discharge_pressure_Pa": 40e5,
        "driver": {"efficiency": 0.96},
        "stages": [{"efficiency": {"kind": "isentropic", "value": 0.8},
                    "mechanical_efficiency": 0.985, "heat_loss_W": 1000.0,
                    "cooler": {"approach_K": 8.0, "coolant_inlet_temperature_K": 298.15,
                               "pressure_drop_Pa": 15_000.0}} for _ in range(4)],
    }
    return doc


def measure(fn, repeat: int, warmup: int = 1) -> tuple[float, float, float]:
    """Median, minimum and maximum wall time of ``fn()`` over ``repeat`` runs, [s]."""
    for _ in range(warmup):
        fn()
    times = []
    for _ in range(repeat):
        t = time.perf_counter()
        fn()
        times.append(time.perf_counter() - t)
    return statistics.median(times), min(times), max(times)


def _fmt(t: float) -> str:
    return f"{t * 1e3:9.2f} ms" if t < 1 else f"{t:9.3f} s "


ROWS: list[tuple] = []


def report(name: str, ours, naive=None, extra: str = "") -> None:
    med, lo, hi = ours
    ratio = f"{naive[0] / med:7.1f}×" if naive else "       "
    line = f"{name:<44}{_fmt(med)}  [{_fmt(lo).strip()} … {_fmt(hi).strip()}]  {ratio} {extra}"
    ROWS.append(line)
    print(line, flush=True)


def _humid_supported() -> bool:
    try:
        r = stagewright.core.solve(four_stage_doc(True)).to_dict()
    except stagewright.core.StagewrightError:
        return False
    return "condensate_kg_s" in r


def case_samples():
    for path in SAMPLES:
        doc = json.loads(path.read_text())
        ours = measure(lambda: stagewright.core.solve(doc), 20)
        dry_naive = _naive_applicable(doc)
        naive_doc = _with_absolute_discharge(doc)
        naive = measure(lambda: naive_solve(naive_doc), 3) if dry_naive else None
        report(f"solve {path.stem}", ours, naive)


def _with_absolute_discharge(doc: dict) -> dict:
    """``doc`` with its discharge as an absolute pressure (the naive train reads only that key): a
    gauge entry plus the site's barometric pressure (a document that gives one states the other)."""
    if "discharge_pressure_Pa" in doc or "discharge_gauge_pressure_Pa" not in doc:
        return doc
    from stagewright.core.project.validation import barometric_pressure
    return dict(doc, discharge_pressure_Pa=doc["discharge_gauge_pressure_Pa"] + barometric_pressure(doc["site"]))


def _naive_applicable(doc) -> bool:
    return (doc.get("fluid", {}).get("model", "real_gas") == "real_gas"
            and doc["flow"]["kind"] in ("mass", "free_air_delivery")
            and all(s["efficiency"]["kind"] in ("isentropic", "polytropic") for s in doc["stages"])
            and not any(s.get("pressure_ratio") for s in doc["stages"])
            and all(c.get("outlet_temperature_K") is not None or c.get("coolant_inlet_temperature_K") is not None
                    for c in (s.get("cooler") for s in doc["stages"]) if c))  # the naive ref needs them


def case_four_stage():
    humid = _humid_supported()
    doc = four_stage_doc(humid)
    ours = measure(lambda: stagewright.core.solve(doc), 50)
    naive = measure(lambda: naive_solve(four_stage_doc(False)), 3)
    report("solve 4-stage real gas" + (" moist" if humid else " (dry: moist n/a)"), ours, naive,
           "naive ref is dry")
    # the lean solve of studies, sweeps and the shaft-power iteration (no reporting-only work)
    report("  the same, detail=False (trial solve)", measure(lambda: stagewright.core.solve(doc, detail=False), 50), naive)
    # Editing in the window gives every solve new states: the caches of recent (T, p) (the exact
    # RP-1485 enhancement factor, condensed-water properties) then miss. A new ambient each run:
    report("  the same, a new ambient every solve", measure(_fresh(doc, True), 50), naive)
    report("  the same, detail=False, new ambient", measure(_fresh(doc, False), 50), naive)
    # the window's solve: the balance and, for its charts, the points along paths (to_dict)
    fresh = _fresh(doc, True)
    report("  the same, new ambient, + to_dict (charts)", measure(lambda: fresh().to_dict(), 50), naive)
    minimal = measure(lambda: naive_minimal(four_stage_doc(False)), 20)
    report("naive minimal PropsSI, same train dry", minimal, extra="4 flashes a stage; ratio column: vs itself")
    report("  4-stage moist full solve, new ambient, vs it", measure(_fresh(doc, True), 50), minimal)
    ours, theirs = measure_interleaved(_fresh(doc, True), lambda: naive_minimal(four_stage_doc(False)), 400)
    report("  the same two, alternating call by call (CPU)", ours, theirs,
           f"naive {_fmt(theirs[0]).strip()}; ours/naive {ours[0] / theirs[0]:.3f}")


def measure_interleaved(fn_a, fn_b, repeat: int, warmup: int = 20):
    """Medians, minima and maxima of the CPU time of ``fn_a()`` and ``fn_b()`` called alternately,
    [s]: each pair is timed within a few milliseconds, so a machine whose speed moves by half within
    minutes (CPU steal) moves both alike and their ratio holds."""
    for _ in range(warmup):
        fn_a()
        fn_b()
    a, b = [], []
    clock = time.process_time
    for _ in range(repeat):
        t0 = clock()
        fn_a()
        t1 = clock()
        fn_b()
        t2 = clock()
        a.append(t1 - t0)
        b.append(t2 - t1)
    return ((statistics.median(a), min(a), max(a)), (statistics.median(b), min(b), max(b)))


def _fresh(doc: dict, detail: bool):
    """A solve of ``doc`` at an ambient 0.0137 K warmer than the last call's (no cache hits)."""
    count = [0]

    def run():
        count[0] += 1
        d = dict(doc, site=dict(doc["site"], ambient_temperature_K=doc["site"]["ambient_temperature_K"]
                                + 0.0137 * count[0]))
        return stagewright.core.solve(d, detail=detail)
    return run


def case_shaft_power():
    doc = four_stage_doc(_humid_supported())
    power = stagewright.core.solve(doc).shaft_power_W
    doc["flow"] = {"kind": "shaft_power", "value": power}
    report("solve 4-stage, flow from shaft power", measure(lambda: stagewright.core.solve(doc), 20))


def case_study():
    try:
        from stagewright.core.study import compare_stagings
    except ImportError:
        print(f"{'staging comparison 1…6':<44}  (stagewright.core.study not available)")
        return
    doc = four_stage_doc(_humid_supported())
    report("staging comparison 1…6 stages", measure(lambda: compare_stagings(doc, max_stages=6), 5))
    report("staging comparison 1…8 stages", measure(lambda: compare_stagings(doc, max_stages=8), 3))
    try:
        from stagewright.core.warm_pool import warm_up_pool
    except ImportError:
        return
    t = time.perf_counter()
    warm_up_pool(2)  # as the window does after its first study
    print(f"{'  (warming two worker processes)':<44}  {_fmt(time.perf_counter() - t)}")
    report("  the same, 2 processes (warm pool)",
           measure(lambda: compare_stagings(doc, max_stages=8, processes=2), 5))


def case_first_coolant():
    """A fresh process's first solve with a water coolant, cold and after the window's warm-up."""
    code = ("import json, time, stagewright.core\n"
            "from stagewright.core.exchanger import coolant\n"
            "doc = json.load(open('sample_projects/two_stage_plant_air.json'))\n"
            "for s in doc['stages']: s['cooler']['coolant'] = {'kind': 'water', 'temperature_rise_K': 8.0}\n"
            "stagewright.core.solve(json.load(open('sample_projects/two_stage_plant_air.json')))\n"
            "WARM\n"
            "t = time.perf_counter(); stagewright.core.solve(doc); print(time.perf_counter() - t)\n")
    for label, warm in (("cold", "pass"), ("after warm_up()", "getattr(coolant, 'warm_up', lambda: None)()")):
        def run():
            out = subprocess.run([sys.executable, "-c", code.replace("WARM", warm)], cwd=ROOT, check=True,
                                 capture_output=True, text=True).stdout
            return float(out.split()[-1])
        times = [run() for _ in range(3)]
        report(f"first solve with a water coolant, {label}",
               (statistics.median(times), min(times), max(times)))


def case_sweep():
    try:
        from stagewright.core.sweep import sweep
    except ImportError:
        print(f"{'sweep 10 000 points':<44}  (stagewright.core.sweep not available)")
        return
    doc = json.loads((ROOT / "sample_projects" / "two_stage_plant_air.json").read_text())
    import numpy as np
    # ambient 2–45 °C: the demo's intake is humid, and moist air below 0 °C is out of scope
    # (such points fail at once and would flatter the figure)
    axes = {"site.ambient_temperature_K": list(np.linspace(275.15, 318.15, 100)),
            "discharge_pressure_Pa": list(np.linspace(6e5, 13e5, 100))}
    failed = []
    timing = measure(lambda: failed.append(len(sweep(doc, axes).errors)), 3, warmup=0)
    report("sweep 10 000 points (T0 × p_d)", timing,
           extra=f"peak RSS {_peak_mb():.0f} MB (this process); {max(failed)} points failed")


def case_year():
    from stagewright.core.year import run_year
    doc = json.loads((ROOT / "sample_projects" / "three_stage_site_year.json").read_text())
    profile = doc["year"]["profile"]
    report(f"year at site ({len(profile.get('months') or profile.get('bins') or [])} bins)",
           measure(lambda: run_year(doc), 5))
    doc["year"]["coolers"] = {"mode": "design_once", "design_condition": "hottest_bin"}
    report("year at site, design once, rate every bin", measure(lambda: run_year(doc), 5))
    cpu = []

    def timed_cpu():
        c0 = time.process_time()
        run_year(doc)
        cpu.append(time.process_time() - c0)
    report("  the same, CPU time of this process", measure(timed_cpu, 7), extra=f"CPU median "
           f"{statistics.median(cpu[1:]) * 1e3:.1f} ms; load {os.getloadavg()[0]:.1f}")
    report("  the same, bins on the fast path", measure(lambda: run_year(doc, exact=False), 5))


def hourly_profile(hours: int = 8760) -> list:
    """An invented hourly year (a continental site: −12 °C winter nights to 31 °C summer days).

    Seasonal and daily cosines plus a fixed pseudo-random weather term (seed 15); humidity
    falls as the air warms. Deterministic, so that runs compare."""
    import math
    import random
    rng = random.Random(15)
    out, weather = [], 0.0
    for h in range(hours):
        day = h / 24.0
        weather = 0.97 * weather + rng.gauss(0.0, 0.6)
        t = 282.0 - 12.0 * math.cos(2 * math.pi * (day - 15) / 365.0) - 4.0 * math.cos(2 * math.pi * (h % 24 - 3) / 24)
        t += weather
        rh = min(0.98, max(0.25, 0.72 - 0.025 * (t - 282.0) + 0.05 * rng.uniform(-1.0, 1.0)))
        out.append({"temperature_K": round(t, 2), "relative_humidity": round(rh, 3), "hours": 1.0})
    return out


def case_year_hourly():
    """A year of 8760 hourly bins (three-stage sample, fixed coolers rated every hour): CPU and wall."""
    from stagewright.core.year import run_year
    doc = json.loads((ROOT / "sample_projects" / "three_stage_site_year.json").read_text())
    doc["year"] = {"profile": {"kind": "bins", "bins": hourly_profile()},
                   "coolers": {"mode": "design_once", "design_condition": "hottest_bin"}}
    from stagewright.core.year_profile import bin_profile
    binned = dict(doc, year={**doc["year"], "profile": {"kind": "bins", "bins": bin_profile(hourly_profile())}})
    n_binned = len(binned["year"]["profile"]["bins"])
    report(f"year 8760 h binned (1 K × 5 %: {n_binned} bins), design once",
           measure(lambda: run_year(binned, processes=1), 3))
    unique = len({(b["temperature_K"], b["relative_humidity"]) for b in hourly_profile()})
    for processes in (1, 2, 2):  # two-process runs twice: the second finds the forkserver started
        load = os.getloadavg()[0]
        cpu0, t0 = time.process_time(), time.perf_counter()
        y = run_year(doc, processes=processes)
        wall, cpu = time.perf_counter() - t0, time.process_time() - cpu0
        report(f"year 8760 h, design once, {processes} process(es)", (wall, wall, wall),
               extra=f"CPU of this process {cpu:.1f} s; {unique} distinct inputs; load {load:.1f} before, "
                     f"{os.getloadavg()[0]:.1f} after; energy {y.totals['energy_kWh']:.5f} kWh")


def case_files():
    from stagewright.core.project import load, save
    path = SAMPLES[0]
    doc = load(path)
    report("project load", measure(lambda: load(path), 50))
    with tempfile.TemporaryDirectory() as tmp:
        out = Path(tmp) / "p.json"
        report("project save (atomic)", measure(lambda: save(copy.deepcopy(doc), out), 50))


def case_startup():
    if not (ROOT / "app" / "entry.py").exists():
        print(f"{'window start-up to solved demo':<44}  (window not available)")
        return
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    with tempfile.TemporaryDirectory() as tmp:
        shot = str(Path(tmp) / "s.png")

        def run():
            subprocess.run([sys.executable, "-m", "stagewright.gui.entry", "--screenshot", shot], cwd=ROOT, env=env,
                           check=True, capture_output=True)
        ours = measure(run, 5)
    peak = resource.getrusage(resource.RUSAGE_CHILDREN).ru_maxrss / 1024.0
    report("window start-up to solved demo (+PNG)", ours, extra=f"peak RSS {peak:.0f} MB")


def case_startup_phases():
    """Start-up milestones of the window (bench/startup.py): shown, solved demo, charts drawn."""
    if not (ROOT / "app" / "window" / "main_window.py").exists():
        print(f"{'window start-up milestones':<44}  (window not available)")
        return
    import startup
    med = startup.measure(5)
    for key in startup.MILESTONES:
        ROWS.append(f"window start-up to {key:<25}{_fmt(med[key])}")
        print(ROWS[-1], flush=True)
    print(f"{'window start-up CPU (user + system)':<44}{_fmt(med['cpu'])}", flush=True)


def case_report():
    """Chart drawing (Agg, as the window redraws after a solve) and the PDF + CSV report."""
    from matplotlib.backends.backend_agg import FigureCanvasAgg
    from matplotlib.figure import Figure
    from stagewright.core.project import load
    from stagewright.gui.charts import draw_power_split, draw_ts_chart
    from stagewright.gui.report import export_report
    doc = load(SAMPLES[0])
    result = stagewright.core.solve(doc).to_dict()
    fig = Figure(figsize=(7, 4.5), dpi=100)
    FigureCanvasAgg(fig)

    def ts():
        draw_ts_chart(fig, result)
        fig.canvas.draw()

    def split():
        draw_power_split(fig, result)
        fig.canvas.draw()
    report("T–s chart draw + render (Agg)", measure(ts, 10))
    report("power-split chart draw + render (Agg)", measure(split, 10))
    with tempfile.TemporaryDirectory() as tmp:
        report("report PDF + CSV (sample project)",
               measure(lambda: export_report(doc, result, Path(tmp) / "r.pdf", Path(tmp) / "r.csv"), 5))


def _peak_mb() -> float:
    return resource.getrusage(resource.RUSAGE_SELF).ru_maxrss / 1024.0


CASES = [case_samples, case_four_stage, case_shaft_power, case_study, case_first_coolant, case_sweep, case_year,
         case_year_hourly,
         case_files, case_report, case_startup, case_startup_phases]


def case_field_check_monte_carlo():
    """Field-check uncertainty (thermo/uncertainty): first order, and 10 000 Monte Carlo draws
    through the lean solve on the fast property path (the issue 21 target is <= 2 s)."""
    try:
        from stagewright.core.uncertainty.field_check import field_check_uncertainty
    except ImportError:
        print(f"{'field check Monte Carlo':<44}  (stagewright.core.uncertainty not available)")
        return
    doc = json.loads((ROOT / "sample_projects" / "field_check_two_stage.json").read_text())
    report("field check first order (11 inputs)",
           measure(lambda: field_check_uncertainty(doc, monte_carlo=False), 5))
    report("field check 10 000 draws, real gas", measure(lambda: field_check_uncertainty(doc, draws=10_000), 5))
    report("  the same, 2 processes (forkserver warm)",
           measure(lambda: field_check_uncertainty(doc, draws=10_000, processes=2), 3))
    gas = dict(doc, fluid={"model": "constant_cp"})
    report("  the same, perfect gas (constant cp)", measure(lambda: field_check_uncertainty(gas, draws=10_000), 3))
    report("  draws only, every draw a full solve (before)", measure(lambda: _full_solve_draws(doc, 10_000), 1, 0))


def _full_solve_draws(doc: dict, draws: int):
    """The Monte Carlo draws as they were before the lean evaluation: a full solve each."""
    from stagewright.core.project.validation import normalise
    from stagewright.core.uncertainty.figures import result_figures
    from stagewright.core.uncertainty.inputs import measured_inputs
    from stagewright.core.uncertainty.measurement_model import MeasurementModel
    from stagewright.core.uncertainty.monte_carlo import propagate_monte_carlo
    norm = normalise(doc)
    model = MeasurementModel(norm, measured_inputs(norm), result_figures(norm), allow_lean=False)
    return propagate_monte_carlo(model, draws, norm["field_check"]["seed"])


CASES.append(case_field_check_monte_carlo)


def case_cli():
    """``stagewright check`` on a sample and ``stagewright --help``, each a fresh process (issue 18:
    target < 0.5 s; neither imports CoolProp), beside a bare interpreter start."""
    def run(*argv):
        return lambda: subprocess.run([sys.executable, *argv], cwd=ROOT, check=True, capture_output=True)
    bare = measure(run("-c", "pass"), 5)
    report("python start (bare interpreter)", bare)
    report("stagewright check SAMPLE (process)", measure(run("-m", "stagewright.gui.entry", "check", str(SAMPLES[0])), 5),
           extra=f"{measure(run('-m', 'stagewright.gui.entry', 'solve', str(SAMPLES[0])), 3)[0]:.2f} s for solve")
    report("stagewright --help (process)", measure(run("-m", "stagewright.gui.entry", "--help"), 5))


CASES.append(case_cli)


def case_year_editor():
    """The window's year profile editor with an imported 8760-row hourly profile (issue 15): time
    to import and show it, per cell edit, undo, redo, a refused edit, and a switch of units.
    Wall time, and CPU of the GUI thread alone (``time.thread_time``; the solve the edit starts
    runs in its own thread), medians of 15 (import: 3)."""
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import QSettings
    from PySide6.QtWidgets import QApplication
    from stagewright.gui.window.main_window import MainWindow
    app = QApplication.instance() or QApplication([])
    doc = json.loads((ROOT / "sample_projects" / "three_stage_site_year.json").read_text())
    with tempfile.TemporaryDirectory() as tmp:
        csv_path = Path(tmp) / "hourly.csv"
        csv_path.write_text("temperature [K], rh [fraction], hours [h]\n" + "\n".join(
            f"{b['temperature_K']},{b['relative_humidity']},1" for b in hourly_profile()) + "\n")
        win = MainWindow(doc, settings=QSettings(str(Path(tmp) / "s.ini"), QSettings.IniFormat),
                         debounce_ms=10, restore_layout=False)
        win.prompts.ask_save_changes = lambda _name: "discard"  # never a modal question on close
        win.resize(1280, 800)
        win.show()
        app.processEvents()
        ed, stack = win.panels["year"].profile_editor, win.editor.undo_stack

        def timed(fn, repeat, after=None):
            walls, cpus = [], []
            for _ in range(repeat):
                c, t = time.thread_time(), time.perf_counter()
                fn()
                app.processEvents()
                walls.append(time.perf_counter() - t)
                cpus.append(time.thread_time() - c)
                if after is not None:
                    after()
                    app.processEvents()
            return (statistics.median(walls), min(walls), max(walls)), statistics.median(cpus)

        def show(name, fn, repeat=15, after=None):
            wall, cpu = timed(fn, repeat, after)
            report(name, wall, extra=f"GUI-thread CPU {1000 * cpu:.0f} ms")

        # each import undone (untimed) before the next: a second import of the same rows changes nothing
        show("year editor: import + show 8760 rows", lambda: ed.import_csv(csv_path), 3, after=stack.undo)
        ed.import_csv(csv_path)
        step = iter(range(10_000))
        show("year editor: one cell edit (8760 rows)",
             lambda: ed.set_cell(5000, "temperature_K", f"{-5 + 0.1 * next(step):.1f}"))
        show("year editor: undo", stack.undo)
        show("year editor: redo", stack.redo)
        show("year editor: refused edit", lambda: ed.set_cell(5000, "temperature_K", "90"))
        flip = iter(range(10_000))
        show("year editor: switch SI/US", lambda: win.set_us_units(next(flip) % 2 == 0), 6)
        win.editor.shutdown()
        win.close()


CASES.append(case_year_editor)


def main(argv: list[str]) -> None:
    print(f"Stagewright bench — {time.strftime('%Y-%m-%d')} — Python {platform.python_version()}, "
          f"{platform.machine()}, {os.cpu_count()} cores, CoolProp {stagewright.core.coolprop_adapter.coolprop_version()}")
    print(f"{'case':<44}{'median':>12}  [min … max]  naive/ours")
    wanted = argv[1:] if len(argv) > 1 else None
    for case in CASES:
        if wanted and not any(w in case.__name__ for w in wanted):
            continue
        case()


if __name__ == "__main__":
    main(sys.argv)
