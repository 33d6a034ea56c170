"""Cases side by side: bars of the figures that decide between options, one bar per case.

Panels: driver input power, specific power, heat rejected, condensate (moist intake) and the
cost per year (when a year was run), each only when some case has a value. The reference case's
bar is outlined. Reads :data:`stagewright.gui.presentation.compare_table.CASE_FIGURES` for labels and units.
"""
from __future__ import annotations

__all__ = ["draw_case_comparison", "CHART_FIGURES"]

from matplotlib.figure import Figure as MplFigure

from stagewright.gui.charts import style
from stagewright.gui.presentation.compare_table import CASE_FIGURES, case_row

#: ids of the figures drawn, in panel order
CHART_FIGURES = ("driver_power_W", "specific_power_kW_per_m3_min", "heat_rejected_W", "condensate_kg_s", "year_cost")


def draw_case_comparison(fig: MplFigure, outcomes: list, reference: str, system: str = "SI") -> MplFigure:
    """Draw ``outcomes`` (:class:`stagewright.core.cases.CaseOutcome`) into ``fig`` as bar panels.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    solved = [o for o in outcomes if o.result is not None]
    rows = {o.name: case_row(o.result, o.year) for o in solved}
    figures = [f for f in CASE_FIGURES if f.id in CHART_FIGURES
               and any(isinstance(f.value(r), (int, float)) and f.value(r) for r in rows.values())]
    if not solved or not figures:
        ax = fig.add_subplot(1, 1, 1)
        ax.set_axis_off()
        ax.text(0.5, 0.5, "No cases compared yet", ha="center", va="center", transform=ax.transAxes,
                fontsize=style.SIZE_LABEL, color=style.MUTED, fontfamily=style.FONT)
        return fig
    cols = min(3, len(figures))
    rows_n = -(-len(figures) // cols)
    grid = fig.subplots(rows_n, cols, squeeze=False)
    for ax in grid.flat[len(figures):]:
        ax.set_axis_off()
    names = [o.name for o in solved]
    short = [n if len(n) <= 12 else n[:11] + "…" for n in names]
    for ax, f in zip(grid.flat, figures):
        u = f.unit_in("window", system)
        values = [(f.value(rows[n]) or 0.0) * f.to_si for n in names]
        shown = [u.to_display(v) if f.quantity else v for v in values]
        colours = [style.SHAFT if n == reference else style.LATENT for n in names]
        bars = ax.bar(range(len(names)), shown, color=colours, edgecolor=style.INK, linewidth=0.6, zorder=2)
        if len(names) <= 4:
            ax.bar_label(bars, labels=[f"{v:,.{u.decimals}f}".replace(",", " ") for v in shown],
                         fontsize=style.SIZE_NOTE, color=style.INK, padding=2)
        ax.set_xticks(range(len(names)), short, fontsize=style.SIZE_TICK,
                      rotation=30 if len(names) > 2 else 0, ha="right" if len(names) > 2 else "center")
        style.style_axes(ax, title=f.label_in("window"), ylabel=u.symbol or None, grid_axis="y")
        ax.margins(y=0.18)
    return fig
