"""Staging-study chart: driver power and highest discharge temperature against stage count.

Built on a plain matplotlib ``Figure`` (no Qt, no pyplot). Rows come from the staging study
(one dict per arrangement with ``stages``, ``driver_power_W``,
``max_discharge_temperature_K`` and ``feasible``). Feasible arrangements are filled markers,
infeasible ones hollow grey; lines have gids ``"staging-power"`` and ``"staging-temperature"``.
"""
from __future__ import annotations

__all__ = ["draw_staging_chart"]

import numpy as np
from matplotlib.backends.backend_agg import RendererAgg
from matplotlib.figure import Figure
from matplotlib.font_manager import FontProperties
from matplotlib.lines import Line2D
from matplotlib.ticker import MaxNLocator

from stagewright.gui.presentation import units
from stagewright.gui.charts import style

_HANDLE, _TEXTPAD, _COLSPACE = 2.2, 0.8, 2.0  # legend spacing, [font sizes] (matplotlib's own units)
_measure = RendererAgg(10, 10, 72.0)  # 72 dpi: one pixel is one point


def _legend_columns(fig, handles) -> int:
    """Most legend columns (≤ number of entries) whose total width fits the figure."""
    prop = FontProperties(family=style.FONT, size=style.SIZE_NOTE)
    size = style.SIZE_NOTE
    widths = [_measure.get_text_width_height_descent(h.get_label(), prop, ismath=False)[0]
              + (_HANDLE + _TEXTPAD) * size for h in handles]
    available = fig.bbox.width / fig.dpi * 72.0 - 2.0 * size  # [pt], less the legend's border
    for ncol in range(len(handles), 1, -1):
        cols = np.array_split(np.array(widths), ncol)  # how matplotlib deals entries into columns
        if sum(c.max() for c in cols if c.size) + _COLSPACE * size * (ncol - 1) <= available:
            return ncol
    return 1


def _fit_label(fig, text: str) -> str:
    """An axis label on two lines when one would not fit half the figure's height (a short panel)."""
    prop = FontProperties(family=style.FONT, size=style.SIZE_LABEL)
    width = _measure.get_text_width_height_descent(text, prop, ismath=False)[0]
    if width <= 0.5 * fig.bbox.height / fig.dpi * 72.0 or " [" not in text:
        return text
    words = text.split(" ")
    half = len(words) // 2
    return " ".join(words[:half]) + "\n" + " ".join(words[half:])


def draw_staging_chart(fig: Figure, study_rows: list[dict], system: str = "SI", limit_K: float | None = None,
                       title: str | None = "Staging study") -> Figure:
    """Draw power and discharge temperature against the number of stages into ``fig``.

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure to draw into (cleared first).
    study_rows : list of dict
        One row per arrangement: ``stages`` [-], ``driver_power_W`` [W],
        ``max_discharge_temperature_K`` [K], ``feasible`` [bool]. Power or temperature
        may be ``None`` for an arrangement that could not be solved.
    system : str
        Display units, ``"SI"`` or ``"US"``.
    limit_K : float, optional
        A discharge-temperature limit to draw, [K].
    title : str or None
        Title above the axes (None: none, where the chart sits under a heading of its own).

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    ax = fig.add_subplot(1, 1, 1)
    ax_t = ax.twinx()
    pw = units.unit("power", system)
    tu = units.unit("temperature", system)
    rows = sorted(study_rows, key=lambda r: r["stages"])
    p_rows = [r for r in rows if r.get("driver_power_W") is not None]
    t_rows = [r for r in rows if r.get("max_discharge_temperature_K") is not None]
    ax.plot([r["stages"] for r in p_rows], [pw.to_display(r["driver_power_W"]) for r in p_rows],
            color=style.POWER, lw=1.6, zorder=3, gid="staging-power")
    ax_t.plot([r["stages"] for r in t_rows], [tu.to_display(r["max_discharge_temperature_K"]) for r in t_rows],
              color=style.TEMPERATURE, lw=1.4, ls=(0, (5, 2)), zorder=3, gid="staging-temperature")
    for target, key, unit_, colour in ((ax, "driver_power_W", pw, style.POWER),
                                       (ax_t, "max_discharge_temperature_K", tu, style.TEMPERATURE)):
        for r in rows:
            if r.get(key) is None:
                continue
            ok = bool(r.get("feasible", True))
            target.plot([r["stages"]], [unit_.to_display(r[key])], marker="o" if key == "driver_power_W" else "s",
                        ms=5.5, color=colour if ok else style.INFEASIBLE,
                        markerfacecolor=colour if ok else style.PAPER, markeredgewidth=1.2, zorder=4)
    if limit_K is not None:
        ax_t.axhline(tu.to_display(limit_K), color=style.LIMIT, lw=1.0, ls=(0, (6, 2)), gid="staging-limit")
    style.style_axes(ax, title=title, xlabel="Number of stages",
                     ylabel=units.label("Driver power", "power", system))
    ax.xaxis.set_major_locator(MaxNLocator(integer=True))
    ax_t.spines["top"].set_visible(False)
    ax_t.spines["right"].set_color(style.MUTED)
    ax_t.tick_params(labelsize=style.SIZE_TICK, colors=style.INK, length=3, width=0.7)
    ax_t.set_ylabel(_fit_label(fig, units.label("Highest discharge temperature", "temperature", system)),
                    fontsize=style.SIZE_LABEL, color=style.INK, fontfamily=style.FONT)
    handles = [Line2D([], [], color=style.POWER, marker="o", lw=1.6, label="driver power"),
               Line2D([], [], color=style.TEMPERATURE, marker="s", lw=1.4, ls=(0, (5, 2)),
                      label="highest discharge temperature"),
               Line2D([], [], color=style.INFEASIBLE, marker="o", markerfacecolor=style.PAPER, lw=0,
                      label="infeasible arrangement")]
    if limit_K is not None:
        handles.append(Line2D([], [], color=style.LIMIT, lw=1.0, ls=(0, (6, 2)), label="discharge limit"))
    # below the axes as a figure legend, so the constrained layout makes room for it, in as
    # many columns as the figure's width holds (one row of four is wider than a narrow panel)
    leg = fig.legend(handles=handles, loc="outside lower center", ncol=_legend_columns(fig, handles),
                     fontsize=style.SIZE_NOTE, frameon=False, handlelength=_HANDLE, columnspacing=_COLSPACE)
    for t in leg.get_texts():
        t.set_color(style.INK)
    return fig
