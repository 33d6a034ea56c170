"""A constrained layout that also makes axes titles and x tick labels fit a narrow figure.

Matplotlib's constrained layout makes room for titles above the axes but not beside them: a
left-aligned title wider than the space right of its axes' left edge is clipped at the
figure's edge, and tick labels that are wider than their spacing run into each other. Each
time the figure is drawn (so again after every resize of a window canvas)
:class:`FittingLayoutEngine` lays the figure out, then

* sets every title back to its full text and font size and, where it does not fit across the
  figure (or, for axes with others to their right in the same row, in the room left of the
  next axes' labels), tries a smaller font (down to :data:`style.SIZE_LABEL`), then two and three lines
  (down to :data:`style.SIZE_NOTE`) — the words never change, only where the lines break; the
  titles of panels side by side then share the smallest size any of them took;
* turns horizontal x tick labels to 45° where neighbours would overlap (and back again
  where the figure has become wide enough);

and lays the figure out again so that the chosen titles and labels get their height.
"""
from __future__ import annotations

__all__ = ["FittingLayoutEngine", "install", "wrap_lines"]

import re
import textwrap
import warnings

from matplotlib.layout_engine import ConstrainedLayoutEngine

from stagewright.gui.charts import style

_EDGE_PX = 2.0      # keep this far from the figure edge
_TICK_GAP_PX = 2.0  # least gap between neighbouring x tick labels
_NBSP = "\u00a0"


def wrap_lines(text: str, lines: int) -> str:
    """``text`` broken at spaces into at most ``lines`` lines of similar length.

    A space between digits (a thousands separator, ``985 585``) is never a break.

    Examples
    --------
    >>> wrap_lines("Energy per bin (year: 985 585 kWh)", 2)
    'Energy per bin\\n(year: 985 585 kWh)'
    >>> wrap_lines("Condensate drained", 1)
    'Condensate drained'
    """
    glued = re.sub(r"(?<=\d) (?=\d)", _NBSP, text)
    if lines <= 1:
        return text
    width = max(1, -(-len(glued) // lines))
    while True:
        parts = textwrap.wrap(glued, width=width, break_long_words=False, break_on_hyphens=False)
        if len(parts) <= lines:
            return "\n".join(parts).replace(_NBSP, " ")
        width += 1


def _titles(ax):
    # Axes keeps its three title Texts (left, centre, right) as attributes; only ``title`` is public
    return [t for t in (getattr(ax, "_left_title", None), ax.title, getattr(ax, "_right_title", None))
            if t is not None and t.get_text()]


def _room_right(ax, renderer, fig) -> float:
    """Right edge [px] a title of ``ax`` may reach: the figure's edge, or short of the labels of
    the nearest axes to its right in the same row (panels side by side)."""
    bound = fig.bbox.x1 - _EDGE_PX
    me = ax.get_window_extent(renderer)
    for other in fig.axes:
        box = other.get_window_extent(renderer)
        if other is ax or box.x0 < me.x1 - 1.0 or box.y0 >= me.y1 or box.y1 <= me.y0:
            continue  # itself, a twin, or not beside it
        bound = min(bound, other.get_tightbbox(renderer).x0 - 2 * _EDGE_PX)
    return bound


def _inside(text, renderer, fig, right: float) -> bool:
    box = text.get_window_extent(renderer)
    return box.x0 >= fig.bbox.x0 + _EDGE_PX and box.x1 <= right


def _fit_title(text, renderer, fig, right: float) -> None:
    full = getattr(text, "_stagewright_full", None)
    if full is None:
        full = text._stagewright_full = (text.get_text(), text.get_fontsize())
    words, size = full
    small = [s for s in (size, 9.5, style.SIZE_LABEL) if s <= size]
    smaller = [s for s in (style.SIZE_LABEL, 8.5, 8.0, style.SIZE_NOTE) if s <= size]
    tries = [(1, s) for s in small] + [(n, s) for n in (2, 3) for s in smaller]
    for lines, s in tries:
        text.set_text(wrap_lines(words, lines))
        text.set_fontsize(s)
        if _inside(text, renderer, fig, right):
            return
    # nothing fits: the last (smallest) try stands


def _fit_ticks(ax, renderer) -> bool:
    """Turn overlapping horizontal x tick labels; True when the rotation changed."""
    labels = [t for t in ax.get_xticklabels() if t.get_visible() and t.get_text()]
    if not labels:
        return False
    base = getattr(ax, "_stagewright_tick_rotation", None)
    if base is None:
        base = ax._stagewright_tick_rotation = labels[0].get_rotation()
    if base != 0.0:
        return False  # the chart chose a rotation itself
    was = labels[0].get_rotation()
    for t in labels:
        t.set_rotation(0.0)
        t.set_horizontalalignment("center")
    boxes = sorted((t.get_window_extent(renderer) for t in labels), key=lambda b: b.x0)
    crowded = any(b.x0 < a.x1 + _TICK_GAP_PX for a, b in zip(boxes, boxes[1:]))
    if crowded:
        for t in labels:
            t.set_rotation(45.0)
            t.set_horizontalalignment("right")
            t.set_rotation_mode("anchor")
    return (45.0 if crowded else 0.0) != was


def _same_size_in_rows(fig, renderer) -> None:
    """Titles of panels side by side take the smallest size any of them needed (a smaller font
    still fits where a larger one did)."""
    boxes = {ax: ax.get_window_extent(renderer) for ax in fig.axes}
    for ax in fig.axes:
        row = [o for o in fig.axes if boxes[o].y0 < boxes[ax].y1 and boxes[o].y1 > boxes[ax].y0]
        titles = [t for o in row for t in _titles(o)]
        if len(titles) > 1:
            size = min(t.get_fontsize() for t in titles)
            for t in titles:
                t.set_fontsize(size)


class FittingLayoutEngine(ConstrainedLayoutEngine):
    """Constrained layout, then titles and x tick labels fitted to the width, then again."""

    def execute(self, fig):
        with warnings.catch_warnings():  # a figure too small to lay out is said once, by the last pass
            warnings.filterwarnings("ignore", message="constrained_layout not applied")
            super().execute(fig)
            renderer = fig._get_renderer()  # the renderer matplotlib's own layout measures with
            for ax in fig.axes:
                _fit_ticks(ax, renderer)
            super().execute(fig)  # axes placed for the tick labels' height before titles are measured
        for ax in fig.axes:
            right = _room_right(ax, renderer, fig)
            for text in _titles(ax):
                _fit_title(text, renderer, fig, right)
        _same_size_in_rows(fig, renderer)
        return super().execute(fig)


def install(fig) -> None:
    """Give ``fig`` the fitting layout (a ``SubFigure`` keeps its parent's layout)."""
    if hasattr(fig, "set_layout_engine"):
        fig.set_layout_engine(FittingLayoutEngine())
