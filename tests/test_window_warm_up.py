"""The window loads the coolant back ends off the GUI thread after its first answer (issue 19:
the first solve with a water coolant used to wait about a second for scipy and CoolProp's
incompressible tables). What is checked is that the loading happens, on another thread, and
that it leaves results alone; how long it takes is measured by bench/run.py, never asserted."""
from __future__ import annotations

import subprocess
import sys
import threading

import pytest

pytest.importorskip("pytestqt")

from gui_support import make_window  # noqa: E402
from tests.conftest import ROOT  # noqa: E402


@pytest.mark.gui
def test_window_warms_the_coolant_back_ends_on_another_thread_after_its_first_answer(qtbot, tmp_path, monkeypatch):
    import stagewright.gui.window.main_window as main_window
    seen = []
    monkeypatch.setattr(main_window, "warm_up_coolants", lambda: seen.append(threading.current_thread().name))
    win = make_window(qtbot, tmp_path)
    qtbot.waitUntil(lambda: bool(seen), timeout=10_000)
    assert seen == ["stagewright-warm-up"]
    assert win.editor.result is not None


def test_warm_up_loads_the_root_finder_and_changes_no_result():
    # a fresh interpreter: scipy.optimize is not loaded by importing the core, and is after warm_up()
    code = ("import sys, json, stagewright.core\n"
            "from stagewright.core.exchanger.coolant import warm_up\n"
            "doc = json.load(open('sample_projects/two_stage_plant_air.json'))\n"
            "for s in doc['stages']: s['cooler']['coolant'] = {'kind': 'water', 'temperature_rise_K': 8.0}\n"
            "before = 'scipy.optimize' in sys.modules\n"
            "warm_up()\n"
            "print(before, 'scipy.optimize' in sys.modules, repr(stagewright.core.solve(doc).shaft_power_W))\n")
    out = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True, check=True,
                         env={"PYTHONPATH": str(ROOT), "PATH": ""}).stdout.split()
    assert out[:2] == ["False", "True"]
    import json
    import stagewright.core
    doc = json.loads((ROOT / "sample_projects" / "two_stage_plant_air.json").read_text())
    for s in doc["stages"]:
        s["cooler"]["coolant"] = {"kind": "water", "temperature_rise_K": 8.0}
    assert float(out[2]) == stagewright.core.solve(doc).shaft_power_W
