"""Start the workbench window (``stagewright [PROJECT]``) or render it to a PNG
(``stagewright --screenshot OUT.png [PROJECT]``)."""
from __future__ import annotations

__all__ = ["run_gui", "DEMO_PROJECT", "wait_for_first_solve", "save_screenshot"]

import os
import sys
import tempfile
from pathlib import Path

DEMO_PROJECT = Path(__file__).resolve().parents[2] / "sample_projects" / "two_stage_plant_air.json"


def _parse_size(text: str | None) -> tuple[int, int]:
    if not text:
        return 1280, 800
    w, _, h = text.lower().partition("x")
    return int(w), int(h)


def wait_for_first_solve(app, window, timeout_s: float = 60.0) -> bool:
    """Run the event loop until the first solve answered (or input problems stopped it).

    The loop sleeps between events, so the worker thread has the interpreter to itself.
    """
    from PySide6.QtCore import QEventLoop, QTimer
    ed = window.editor

    def settled() -> bool:
        return bool(ed.solved_jobs or ed.failure or ((ed.problems or ed.entry_errors) and not ed.solver.busy))

    if not settled():
        loop = QEventLoop()
        ed.result_changed.connect(lambda: settled() and loop.quit())
        QTimer.singleShot(int(timeout_s * 1000), loop.quit)
        loop.exec()
    app.processEvents()
    return settled()


def save_screenshot(window, out: str) -> None:
    """Draw pending charts and grab the whole window (menus, docks, status bar)."""
    from PySide6.QtWidgets import QApplication
    charts = window.panels.get("charts")
    charts.ensure_canvases()
    current = charts.tabs.currentWidget()
    if hasattr(current, "canvas"):
        current.canvas.draw()
    QApplication.processEvents()
    if not window.grab().save(str(out)):
        raise OSError(f"could not write {out}")


def run_gui(project: str | None = None, screenshot: str | None = None, size: str | None = None) -> int:
    """Open the window on ``project`` (the demo when None); with ``screenshot`` render and exit."""
    if screenshot and not os.environ.get("QT_QPA_PLATFORM"):
        os.environ["QT_QPA_PLATFORM"] = "offscreen"
    from PySide6.QtCore import QSettings
    from PySide6.QtWidgets import QApplication

    from thermo import StagewrightError
    from thermo.project import load

    from app.widgets.icons import icon
    from app.window.main_window import MainWindow
    from app.window.recovery_ops import AUTOSAVE_MS
    from app.window.style import apply_style

    app = QApplication.instance() or QApplication(sys.argv[:1])
    app.setOrganizationName("Stagewright")
    app.setApplicationName("Stagewright")
    app.setWindowIcon(icon("app"))
    apply_style(app)

    path = Path(project) if project else (DEMO_PROJECT if DEMO_PROJECT.is_file() else None)
    doc, error = None, None
    if path is not None:
        try:
            doc = load(path)
        except StagewrightError as exc:
            error = str(exc)
            if screenshot:
                print(f"stagewright: {error}", file=sys.stderr)
                return 2
            doc, path = None, None
    settings = None
    tmp = None
    if screenshot:  # a screenshot never depends on (or changes) the user's saved layout
        tmp = tempfile.TemporaryDirectory(prefix="stagewright-shot-")
        settings = QSettings(str(Path(tmp.name) / "settings.ini"), QSettings.IniFormat)
    window = MainWindow(doc, path if project else None, settings=settings, restore_layout=not screenshot,
                        autosave_ms=None if screenshot else AUTOSAVE_MS)
    if path is not None and not project:
        window.files.set_untitled_name(f"Demo ({path.name})")  # Save asks for a name: the sample stays as it is
    if screenshot:
        w, h = _parse_size(size or os.environ.get("STAGEWRIGHT_SCREENSHOT_SIZE"))
        window.resize(w, h)
        window.show()
        ok = wait_for_first_solve(app, window)
        save_screenshot(window, screenshot)
        window.editor.shutdown()
        window.close()
        tmp.cleanup()
        if not ok:
            print("stagewright: the first solve did not finish within 60 s", file=sys.stderr)
        return 0
    window.show()
    if error:
        window.prompts.show_error("Cannot open project", error)
    window.recovery.offer()
    return app.exec()
