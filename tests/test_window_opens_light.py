"""What the window loads before it shows: neither CoolProp (its fluid library takes a second or
more to load; the first solve loads it after the first paint) nor numpy (a tenth of a second; the
solver and the study load it when they run). A fresh interpreter builds the window without showing it."""
from __future__ import annotations

import os
import subprocess
import sys

import pytest

from tests.gui_support import ROOT

pytestmark = pytest.mark.gui

_CHILD = """
import sys, tempfile
from pathlib import Path
from PySide6.QtCore import QSettings
from PySide6.QtWidgets import QApplication
from stagewright.core.project import load
from stagewright.gui.window.launch import DEMO_PROJECT
from stagewright.gui.window.main_window import MainWindow
app = QApplication([])
win = MainWindow(load(DEMO_PROJECT), settings=QSettings(str(Path(tempfile.mkdtemp()) / "s.ini"), QSettings.IniFormat),
                 restore_layout=False, autosave_ms=None)
print(sorted(m for m in ("CoolProp", "numpy", "matplotlib", "scipy") if m in sys.modules), flush=True)
import os
os._exit(0)  # no tear-down: the window's background jobs may still be starting
"""


def test_building_the_window_loads_no_heavy_library():
    env = dict(os.environ, QT_QPA_PLATFORM="offscreen", PYTHONPATH=str(ROOT))
    out = subprocess.run([sys.executable, "-c", _CHILD], capture_output=True, text=True, env=env, cwd=ROOT,
                         timeout=120)
    assert out.returncode == 0, out.stderr[-2000:]
    assert out.stdout.strip().splitlines()[-1] == "[]"
