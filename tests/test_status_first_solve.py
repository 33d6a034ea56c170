"""The status bar's solve time says when loading the property library was part of it (the first solve
of a session loads CoolProp, most of a second; later solves take milliseconds)."""
from __future__ import annotations

import time

import pytest

from stagewright.core import coolprop_adapter
from tests.gui_support import make_window, wait_solved

pytestmark = pytest.mark.gui


def test_a_solve_that_loaded_the_library_says_so_and_later_ones_do_not(qtbot, tmp_path, monkeypatch):
    win = make_window(qtbot, tmp_path)
    ed = win.editor
    # as if this solve had loaded CoolProp, 1.2 s of its time
    import stagewright.core as core
    real = core.solve

    def loading(doc):
        result = real(doc)
        monkeypatch.setattr(coolprop_adapter, "LOADED", (1.2, time.perf_counter()))
        return result
    monkeypatch.setattr(core, "solve", loading)
    n = ed.solved_jobs
    ed.set_value("site.ambient_temperature_K", 299.15)
    wait_solved(qtbot, win, n)
    assert "1200 ms of it loading the property library, once" in win.status_solve.text()
    assert ed.library_load_seconds == pytest.approx(1.2)
    # the next solve, at once: that load has been told
    monkeypatch.setattr(core, "solve", real)
    n = ed.solved_jobs
    ed.set_value("site.ambient_temperature_K", 300.15)
    wait_solved(qtbot, win, n)
    assert "loading" not in win.status_solve.text() and ed.library_load_seconds is None
    # a load that ended long before a solve is not that solve's
    monkeypatch.setattr(coolprop_adapter, "LOADED", (1.2, time.perf_counter() - 60.0))
    n = ed.solved_jobs
    ed.set_value("site.ambient_temperature_K", 301.15)
    wait_solved(qtbot, win, n)
    assert win.status_solve.text().startswith("Solved in ") and "loading" not in win.status_solve.text()
    win.close()
