"""A real Stagewright session in a child process, for the recovery tests: windows with unsaved work.

``python -m tests.crashed_session SPEC_JSON`` (with ``STAGEWRIGHT_DATA_DIR`` set) opens one window
per entry of SPEC_JSON — ``{"path": "/x/plant.json" | null, "title": "…"}`` — types the title into
each project, lets autosave write, prints ``ready`` and waits on standard input. The test then
either kills the process (``kill -9``: a crash) or leaves it running (a live second window).
"""
from __future__ import annotations

import json
import os
import sys
import tempfile
import time
from pathlib import Path

AUTOSAVE_MS = 50


def main(spec_json: str) -> None:
    os.environ.setdefault("QT_QPA_PLATFORM", "offscreen")
    from PySide6.QtCore import QSettings
    from PySide6.QtWidgets import QApplication

    from stagewright.gui.window.main_window import MainWindow
    from tests.gui_support import simple_real_gas_doc

    app = QApplication.instance() or QApplication([])
    settings = QSettings(str(Path(tempfile.mkdtemp()) / "settings.ini"), QSettings.IniFormat)
    windows = []
    for entry in json.loads(spec_json):
        path = entry["path"]
        doc = json.loads(Path(path).read_text(encoding="utf-8")) if path else simple_real_gas_doc()
        win = MainWindow(doc, path, settings=settings, restore_layout=False, autosave_ms=AUTOSAVE_MS)
        win.editor.set_value("title", entry["title"])
        windows.append(win)
    # autosave writes within AUTOSAVE_MS of the change, once the event loop turns; on a busy machine
    # the first solve (loading the property library) can hold the interpreter for a second or two:
    # wait for every window's file (at most 30 s), then a little more
    folder = Path(os.environ["STAGEWRIGHT_DATA_DIR"])
    end = time.monotonic() + 30.0
    while time.monotonic() < end and len(list(folder.rglob("*.json"))) < len(windows):
        app.processEvents()
        time.sleep(0.01)
    end = time.monotonic() + 4 * AUTOSAVE_MS / 1000
    while time.monotonic() < end:
        app.processEvents()
        time.sleep(0.01)
    print("ready", flush=True)
    sys.stdin.readline()


if __name__ == "__main__":
    main(sys.argv[1])
