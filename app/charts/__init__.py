"""Figure-building functions for Stagewright's charts (no Qt, no pyplot).

Each function takes a :class:`matplotlib.figure.Figure` and a results dictionary
(``TrainResult.to_dict()``), so the window's Qt canvas and the PDF report draw the same
charts.
"""
from __future__ import annotations

__all__ = ["draw_ts_chart", "draw_power_split", "draw_staging_chart"]

from stagewright.gui.charts.power_split import draw_power_split
from stagewright.gui.charts.staging_chart import draw_staging_chart
from stagewright.gui.charts.ts_chart import draw_ts_chart
