"""Edit → updated balance in the window: from an edit to the shown, current balance.

    python bench/edit_latency.py            # median of 20 edits each (offscreen)
    python bench/edit_latency.py --edits 5

Each run starts a fresh interpreter (``--child``) that opens the demo project offscreen, waits
for its first answer, then times edits made as the panels make them (``Editor.set_value``):
from the call to the moment the window's slots for the new result have run (the balance tables
are filled; the charts redraw later, on their own timer). Cases: the first edit that brings a
water coolant in (before and after the window's background warm-up), and edits of the ambient
temperature. Plain Python, no timing asserts.
"""
from __future__ import annotations

import argparse
import json
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent


def child(edits: int, warm: bool) -> int:
    sys.path.insert(0, str(ROOT))
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    import tempfile

    from PySide6.QtCore import QEventLoop, QSettings, QTimer
    from PySide6.QtWidgets import QApplication

    from stagewright.core.project import load
    from stagewright.gui.window.launch import DEMO_PROJECT
    from stagewright.gui.window.main_window import MainWindow

    app = QApplication(sys.argv[:1])
    with tempfile.TemporaryDirectory() as tmp:
        win = MainWindow(load(DEMO_PROJECT), settings=QSettings(str(Path(tmp) / "s.ini"), QSettings.IniFormat),
                         restore_layout=False, autosave_ms=None)
        win.show()
        ed = win.editor

        charts = win.panels["charts"]

        def spin(until, limit_s: float = 60.0) -> float:
            """Process events until ``until()``; seconds taken."""
            start = time.perf_counter()
            while not until() and time.perf_counter() - start < limit_s:
                app.processEvents()
                time.sleep(0.0005)
            return time.perf_counter() - start

        def current(after: int):
            return lambda: ed.solved_jobs > after and not ed.stale and not ed.solver.busy

        def charts_drawn():
            timer = getattr(charts, "_redraw", None)  # (older windows drew at once)
            return charts.ts is not None and charts.ts.pending is None and not (timer and timer.isActive())

        def edit(path, value) -> tuple[float, float]:
            before = ed.solved_jobs
            t = time.perf_counter()
            ed.set_value(path, value)
            balance = t + spin(current(before))
            drawn = balance + spin(charts_drawn)
            spin(lambda: False, 0.3)  # let the window settle, as between a person's edits
            return balance - t, drawn - t

        spin(current(0))
        spin(charts_drawn)
        if warm:
            win._start_warm_up()
            spin(lambda: False, 3.0)  # the warm-up thread (scipy, coolant tables) has finished by then
        print("coolant %.6f %.6f" % edit("stages[0].cooler.coolant", {"kind": "water", "temperature_rise_K": 8.0}),
              flush=True)
        for k in range(edits):
            print("ambient %.6f %.6f" % edit("site.ambient_temperature_K", 298.15 + 0.37 * (k + 1)), flush=True)
        sys.stdout.flush()
        os._exit(0)  # no closing questions (the project was edited) and no interpreter tear-down
    return 0


def run_child(edits: int, warm: bool) -> dict:
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    out = subprocess.run([sys.executable, __file__, "--child", str(edits)] + (["--warm"] if warm else []),
                         capture_output=True, text=True, cwd=ROOT, env=env, check=True).stdout
    rows: dict = {}
    for line in out.splitlines():
        parts = line.split()
        if len(parts) == 3 and parts[0] in ("coolant", "ambient"):
            rows.setdefault(parts[0], []).append((float(parts[1]), float(parts[2])))
    return rows


def main(argv: list[str]) -> None:
    p = argparse.ArgumentParser(description=__doc__, formatter_class=argparse.RawDescriptionHelpFormatter)
    p.add_argument("--edits", type=int, default=20)
    p.add_argument("--child", type=int, default=None, help=argparse.SUPPRESS)
    p.add_argument("--warm", action="store_true", help=argparse.SUPPRESS)
    args = p.parse_args(argv)
    if args.child is not None:
        code = child(args.child, args.warm)
        sys.stdout.flush()
        os._exit(code)  # no interpreter tear-down: with a pipe for stdout, Qt's could hang
    load = os.getloadavg()[0]
    print(f"edit → updated balance, offscreen window, 2 cores, load {load:.1f} (medians, ms)")
    print("  (balance: the balance tables show the new result; charts: the shown chart is redrawn too)")
    for warm in (False, True):
        rows = run_child(args.edits, warm)
        label = "after the background warm-up" if warm else "right after the first answer"
        balance, drawn = rows["coolant"][0]
        print(f"  first edit bringing a water coolant in, {label}: balance {1e3 * balance:7.1f}, "
              f"charts {1e3 * drawn:7.1f}")
        if warm:
            b = [x for x, _ in rows["ambient"]]
            c = [y for _, y in rows["ambient"]]
            print(f"  ambient temperature edits ({len(b)}): balance median {1e3 * statistics.median(b):7.1f}"
                  f" [min {1e3 * min(b):.1f} … max {1e3 * max(b):.1f}], charts median {1e3 * statistics.median(c):7.1f}")
    print(json.dumps({"load": load}))


if __name__ == "__main__":
    main(sys.argv[1:])
