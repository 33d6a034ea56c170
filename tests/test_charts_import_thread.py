"""matplotlib loads off the GUI thread: the window keeps answering while the chart modules import
(on the GUI thread the window stopped answering for most of a second just after its first answer)."""
from __future__ import annotations

import threading
import time

import pytest

import stagewright.gui.window.charts_area as charts_area
from tests.gui_support import make_window

pytestmark = pytest.mark.gui


def test_chart_modules_import_on_another_thread_while_the_window_answers(qtbot, tmp_path, monkeypatch):
    win = make_window(qtbot, tmp_path)
    own = win.panels["charts"]  # the window's own charts first: their drawing is not what is measured
    qtbot.waitUntil(lambda: own.ts is not None and own.ts.pending is None, timeout=20_000)
    qtbot.wait(300)
    panel = charts_area.ChartsPanel(win.editor)
    qtbot.addWidget(panel)
    seen = []
    real = charts_area._import_chart_modules

    def slow_import():
        seen.append(threading.current_thread() is threading.main_thread())
        time.sleep(0.4)  # as a first matplotlib import takes on a slow machine
        real()
    monkeypatch.setattr(charts_area, "_import_chart_modules", slow_import)
    ticks = []
    from PySide6.QtCore import QTimer
    timer = QTimer()
    timer.setInterval(20)
    timer.timeout.connect(lambda: ticks.append(time.perf_counter()))
    timer.start()
    panel.prepare_in_background()
    assert panel.ensure_canvases() is False and panel.ts is None  # made when the import ends
    qtbot.waitUntil(lambda: panel.ts is not None, timeout=10_000)
    timer.stop()
    assert seen == [False]  # not the GUI thread
    assert len(ticks) >= 5  # the event loop ran while the modules imported
    assert panel.ensure_canvases() is True
    win.close()


def test_a_screenshot_waits_for_the_canvases(qtbot, tmp_path):
    win = make_window(qtbot, tmp_path)
    panel = win.panels["charts"]
    assert panel.ensure_canvases(wait=True) is True and panel.ts is not None
    win.close()
