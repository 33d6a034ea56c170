"""Start the workbench window (``stagewright [PROJECT]``) or render it to a PNG
(``stagewright --screenshot OUT.png [PROJECT]``).

Before Qt starts on Linux, :func:`platform_problem` checks that Qt's X11 (xcb) platform plugin
can load — its system libraries present (``ldd``), a display to open — and the window prints
what to install instead of letting Qt abort with a message that may name the wrong library.
"""
from __future__ import annotations

__all__ = ["run_gui", "DEMO_PROJECT", "wait_for_first_solve", "save_screenshot", "show_panel", "XCB_PACKAGES",
           "missing_libraries", "packages_for", "xcb_plugin", "platform_problem"]

import importlib.util
import os
import re
import subprocess
import sys
import tempfile
from pathlib import Path

from stagewright.gui.data_files import data_dir

DEMO_PROJECT = data_dir("sample_projects", "two_stage_plant_air.json") / "two_stage_plant_air.json"

#: system libraries that Qt's xcb platform plugin (PySide6 6.x: ``libqxcb.so`` and the Qt libraries
#: it loads) links against and a desktop may lack → the Debian/Ubuntu package holding each (found
#: with ``ldd`` on the plugin and ``dpkg -S`` on Debian 12); the README's quick start installs them all
XCB_PACKAGES: dict[str, str] = {
    "libxcb-icccm.so.4": "libxcb-icccm4", "libxcb-keysyms.so.1": "libxcb-keysyms1",
    "libxcb-cursor.so.0": "libxcb-cursor0", "libxcb-image.so.0": "libxcb-image0",
    "libxcb-randr.so.0": "libxcb-randr0", "libxcb-render-util.so.0": "libxcb-render-util0",
    "libxcb-render.so.0": "libxcb-render0", "libxcb-shape.so.0": "libxcb-shape0",
    "libxcb-shm.so.0": "libxcb-shm0", "libxcb-sync.so.1": "libxcb-sync1", "libxcb-util.so.1": "libxcb-util1",
    "libxcb-xfixes.so.0": "libxcb-xfixes0", "libxcb-xkb.so.1": "libxcb-xkb1", "libxcb.so.1": "libxcb1",
    "libX11-xcb.so.1": "libx11-xcb1", "libX11.so.6": "libx11-6", "libXau.so.6": "libxau6",
    "libXdmcp.so.6": "libxdmcp6", "libxkbcommon.so.0": "libxkbcommon0",
    "libxkbcommon-x11.so.0": "libxkbcommon-x11-0", "libEGL.so.1": "libegl1", "libGL.so.1": "libgl1",
    "libGLX.so.0": "libglx0", "libGLdispatch.so.0": "libglvnd0", "libfontconfig.so.1": "libfontconfig1",
    "libfreetype.so.6": "libfreetype6", "libdbus-1.so.3": "libdbus-1-3", "libglib-2.0.so.0": "libglib2.0-0",
    "libgthread-2.0.so.0": "libglib2.0-0",
}
_NOT_FOUND = re.compile(r"^\s*(\S+)\s+=>\s+not found\s*$", re.MULTILINE)


def missing_libraries(ldd_output: str) -> list[str]:
    r"""The libraries ``ldd`` reports as ``not found``, each once, in the order first named.

    Examples
    --------
    >>> missing_libraries("\tlibxcb-icccm.so.4 => not found\n\tlibc.so.6 => /lib/libc.so.6 (0x7f)\n"
    ...                   "\tlibxcb-icccm.so.4 => not found\n")
    ['libxcb-icccm.so.4']
    """
    return list(dict.fromkeys(_NOT_FOUND.findall(ldd_output)))


def packages_for(libraries: list[str]) -> tuple[list[str], list[str]]:
    """``(Debian/Ubuntu packages to install, libraries with no known package)`` for ``libraries``."""
    known = [XCB_PACKAGES[lib] for lib in libraries if lib in XCB_PACKAGES]
    return list(dict.fromkeys(known)), [lib for lib in libraries if lib not in XCB_PACKAGES]


def xcb_plugin() -> Path | None:
    """PySide6's xcb platform plugin (found without loading Qt), or None."""
    spec = importlib.util.find_spec("PySide6")
    for folder in (spec.submodule_search_locations or []) if spec else []:
        plugin = Path(folder) / "Qt" / "plugins" / "platforms" / "libqxcb.so"
        if plugin.is_file():
            return plugin
    return None


def _ldd(path: Path) -> str:
    try:
        return subprocess.run(["ldd", str(path)], capture_output=True, text=True, timeout=20).stdout
    except (OSError, subprocess.SubprocessError):
        return ""  # no ldd: leave it to Qt


def platform_problem(env=None, plugin: Path | None = None, ldd=_ldd, platform: str = sys.platform) -> str | None:
    """Why Qt's xcb platform plugin cannot start, as a message for a person (None: no known reason).

    Checked only on Linux when Qt would use xcb with nothing to fall back on: ``QT_QPA_PLATFORM``
    names xcb first, or is unset and there is no Wayland session (Qt then tries xcb alone).

    Parameters
    ----------
    env : mapping, optional
        The environment (default ``os.environ``).
    plugin : Path, optional
        The xcb plugin (default :func:`xcb_plugin`).
    ldd : callable
        ``ldd(path) -> output`` (tests pass sample output).
    platform : str
        ``sys.platform``.
    """
    env = os.environ if env is None else env
    if not platform.startswith("linux"):
        return None
    chosen = [p.split(":")[0].strip() for p in env.get("QT_QPA_PLATFORM", "").split(";") if p.strip()]
    if chosen and chosen[0] != "xcb":
        return None
    if not chosen and (env.get("WAYLAND_DISPLAY") or env.get("XDG_SESSION_TYPE") == "wayland"):
        return None  # Qt tries Wayland too
    plugin = plugin or xcb_plugin()
    missing = missing_libraries(ldd(plugin)) if plugin is not None else []
    if missing:
        packages, unknown = packages_for(missing)
        lines = ["The window cannot start: Qt's X11 (xcb) platform plugin needs system libraries that "
                 f"are missing: {', '.join(missing)}."]
        if packages:
            lines.append(f"On Debian or Ubuntu install them with:\n    sudo apt-get install {' '.join(packages)}")
        if unknown:
            lines.append(f"Find the package that holds {', '.join(unknown)} with your distribution's tools "
                         "(apt-file search, dnf provides).")
        lines.append("The command-line tools (stagewright solve, report, study …) work without them.")
        return "\n".join(lines)
    if not env.get("DISPLAY"):
        return ("The window cannot start: there is no display (DISPLAY is not set). Run stagewright in a "
                "desktop session, or render the window to a picture with --screenshot OUT.png.")
    return None


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


def show_panel(app, window, pid: str, timeout_s: float = 60.0) -> bool:
    """Bring the docked panel ``pid`` (``"package"``, ``"year"`` …) to the front for a screenshot
    (``STAGEWRIGHT_SCREENSHOT_PANEL``) and wait, up to ``timeout_s``, for its worker's answer if it
    started one; False when there is no such panel or it did not settle in time."""
    import time
    dock = window.docks.get(pid)
    if not pid or dock is None:
        return False
    dock.show()
    dock.raise_()
    app.processEvents()
    runner = getattr(window.panels[pid], "runner", None)
    end = time.monotonic() + timeout_s
    while runner is not None and runner.busy and time.monotonic() < end:
        app.processEvents()
        time.sleep(0.02)
    app.processEvents()
    return runner is None or not runner.busy


def save_screenshot(window, out: str) -> None:
    """Draw pending charts and grab the whole window (menus, docks, status bar)."""
    from PySide6.QtWidgets import QApplication
    charts = window.panels.get("charts")
    charts.ensure_canvases(wait=True)
    charts.draw_pending()
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
    problem = platform_problem()
    if problem:
        print(f"stagewright: {problem}", file=sys.stderr)
        return 1
    from PySide6.QtCore import QSettings
    from PySide6.QtWidgets import QApplication

    from stagewright.core import StagewrightError
    from stagewright.core.project import load

    from stagewright.gui.widgets.icons import icon
    from stagewright.gui.window.main_window import MainWindow
    from stagewright.gui.window.recovery_ops import AUTOSAVE_MS
    from stagewright.gui.window.style import apply_style

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
        show_panel(app, window, os.environ.get("STAGEWRIGHT_SCREENSHOT_PANEL", ""))
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
