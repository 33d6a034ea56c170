"""The staging chart widget on its own: a hint until there is something to draw (matplotlib
loaded only then) and the drawn lines carry the rows' figures.
Rows are invented; 1 hp = 745.69987158 W exactly (NIST SP 811, 2008, App. B)."""
from __future__ import annotations

import pytest

pytest.importorskip("pytestqt")

from stagewright.gui.study.chart_view import StagingChartView  # noqa: E402

pytestmark = pytest.mark.gui
HP_W = 745.69987158
ROWS = [{"stages": n, "driver_power_W": p, "max_discharge_temperature_K": t, "feasible": True}
        for n, p, t in ((1, 300_000.0, 520.0), (2, 260_000.0, 440.0), (3, 250_000.0, 410.0))]


def power_line(view):
    from matplotlib.lines import Line2D
    (line,) = [ln for ln in view.figure.findobj(Line2D) if ln.get_gid() == "staging-power"]
    return line


def test_hint_first_then_the_chart(qtbot):
    view = StagingChartView("Run a study first.")
    qtbot.addWidget(view)
    assert view.currentWidget() is view.hint and view.canvas is None
    view.show_rows([], "SI")
    assert view.canvas is None
    view.show_rows(ROWS, "US", limit_K=450.0)
    assert view.currentWidget() is not view.hint and view.toolbar is not None
    line = power_line(view)
    assert list(line.get_xdata()) == [1, 2, 3]
    assert line.get_ydata()[1] == pytest.approx(260.0 / HP_W * 1000.0, rel=1e-9)
    assert not view.figure.axes[0].get_title(loc="left")  # untitled: the panel is its heading
    view.show_rows([], "SI")
    assert view.currentWidget() is view.hint
