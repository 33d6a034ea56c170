"""Window start-up: from launching the process to a shown window, a solved demo and drawn charts.

    python bench/startup.py            # median of 7 runs (offscreen)
    python bench/startup.py --runs 3
    python bench/startup.py --kept     # the demo saved with its results (File > Keep Results in File)

Each run starts a fresh interpreter (``--child``) that opens the demo project offscreen and
prints a line at each milestone (``parsed``: CoolProp's fluid library parsed on its background
thread; ``loaded``: CoolProp imported by the first property call); the parent stamps the lines as
they arrive, so interpreter start-up and imports are included. Plain Python, no timing asserts.
"""
from __future__ import annotations

import argparse
import os
import statistics
import subprocess
import sys
import time
from pathlib import Path

ROOT = Path(__file__).resolve().parent.parent
MILESTONES = ("shown", "parsed", "loaded", "figures", "solved", "charts")


def child(project: str | None = None) -> int:
    sys.path.insert(0, str(ROOT))
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    import tempfile

    # as the console script does before it imports Qt (app/entry.py; older trees lack it)
    from stagewright.core import coolprop_adapter
    if hasattr(coolprop_adapter, "load_library_in_background"):
        coolprop_adapter.load_library_in_background()

    from PySide6.QtCore import QEventLoop, QSettings, QTimer
    from PySide6.QtWidgets import QApplication

    from stagewright.gui.window.launch import DEMO_PROJECT
    from stagewright.gui.window.main_window import MainWindow
    from stagewright.gui.window.style import apply_style
    from stagewright.core.project import load

    app = QApplication(sys.argv[:1])
    apply_style(app)
    with tempfile.TemporaryDirectory() as tmp:
        settings = QSettings(str(Path(tmp) / "s.ini"), QSettings.IniFormat)
        win = MainWindow(load(project or DEMO_PROJECT), settings=settings, restore_layout=False, autosave_ms=None)
        loop = QEventLoop()
        charts = win.panels["charts"]
        state = {"solved": False}

        def check():
            if win.editor.result is not None and not state.get("figures"):
                state["figures"] = True  # the balance shows figures: kept with the file, or solved
                print("figures", flush=True)
            if win.editor.solved_jobs and not state["solved"]:
                state["solved"] = True
                print("solved", flush=True)
            if state["solved"] and charts.ts is not None and charts.ts.pending is None:
                charts.ts.canvas.draw()
                print("charts", flush=True)
                loop.quit()
        win.editor.result_changed.connect(check)  # before show: the window's own slots come later
        _watch_library()
        win.show()
        app.processEvents()
        print("shown", flush=True)
        check()
        timer = QTimer()
        timer.timeout.connect(check)
        timer.start(5)
        QTimer.singleShot(60_000, loop.quit)
        loop.exec()
        win.editor.shutdown()
        win.close()
    return 0


def _watch_library() -> None:
    """Print "parsed" when CoolProp's fluid library has been parsed on its background thread and
    "loaded" when the first property call has imported CoolProp (a thread polling every 2 ms)."""
    import threading

    from stagewright.core import coolprop_adapter

    def watch():
        ahead, said = getattr(coolprop_adapter, "_AHEAD", None), set()
        while len(said) < 2:
            if "parsed" not in said and (ahead is None or not ahead.is_alive()):
                said.add("parsed")
                print("parsed", flush=True)
            if "loaded" not in said and getattr(coolprop_adapter, "LOADED", None) is not None:
                said.add("loaded")
                print("loaded", flush=True)
            time.sleep(0.002)
    threading.Thread(target=watch, daemon=True).start()


def one_run(project: str | None = None) -> dict:
    start = time.perf_counter()
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen")
    proc = subprocess.Popen([sys.executable, __file__, "--child"] + (["--project", project] if project else []),
                            stdout=subprocess.PIPE,
                            stderr=subprocess.DEVNULL, text=True, cwd=ROOT, env=env)
    stamps = {}
    for line in proc.stdout:
        stamps[line.strip()] = time.perf_counter() - start
    proc.wait()
    cpu = os.times()
    stamps["cpu"] = cpu.children_user + cpu.children_system
    return stamps


def kept_project(folder: str) -> str:
    """The demo project saved with its results kept in the file (as File > Keep Results in File
    does: :func:`stagewright.core.cases.take_snapshot` of the solved result), in ``folder``."""
    sys.path.insert(0, str(ROOT))
    import stagewright.core
    from stagewright.core.cases import take_snapshot
    from stagewright.core.project import load, save
    from stagewright.core.project.cases import base_name
    from stagewright.gui.window.launch import DEMO_PROJECT
    doc = load(DEMO_PROJECT)
    doc["snapshot"] = take_snapshot({base_name(doc): stagewright.core.solve(doc).to_dict()})
    path = Path(folder) / "demo_kept.json"
    save(doc, path)
    return str(path)


def measure(runs: int, project: str | None = None) -> dict:
    """Median seconds to each milestone, plus the median child CPU time."""
    rows, cpu_before = [], 0.0
    for _ in range(runs):
        r = one_run(project)
        r["cpu"], cpu_before = r["cpu"] - cpu_before, r["cpu"]
        rows.append(r)
    return {k: statistics.median(r[k] for r in rows if k in r) for k in MILESTONES + ("cpu",)}


def main(argv: list[str]) -> int:
    p = argparse.ArgumentParser(description=__doc__.splitlines()[0])
    p.add_argument("--child", action="store_true", help=argparse.SUPPRESS)
    p.add_argument("--runs", type=int, default=7)
    p.add_argument("--kept", action="store_true", help="open the demo saved with its results kept in the file")
    p.add_argument("--project", help=argparse.SUPPRESS)
    args = p.parse_args(argv)
    if args.child:
        return child(args.project)
    import tempfile
    with tempfile.TemporaryDirectory() as folder:
        med = measure(args.runs, kept_project(folder) if args.kept else None)
    print(f"window start-up{' (demo saved with its results)' if args.kept else ''}, median of {args.runs} runs "
          f"(offscreen, {os.cpu_count()} cores, load {os.getloadavg()[0]:.1f}):")
    for k in MILESTONES:
        print(f"  {k:<8}{med[k]:7.2f} s")
    print(f"  cpu     {med['cpu']:7.2f} s  (user + system of one run)")
    return 0


if __name__ == "__main__":
    sys.exit(main(sys.argv[1:]))
