"""The T–s paths of several cases overlaid on one chart (a colour per case, the reference case
drawn heavier). Entropy is relative to each case's own intake, as on the single-case chart
(:mod:`stagewright.gui.charts.ts_chart`), so paths start at zero and differ in where they go. The lines come
from the core as plain SI data (:func:`stagewright.core.ts_lines.path_segments`)."""
from __future__ import annotations

__all__ = ["draw_case_paths", "CASE_COLOURS"]

from matplotlib.figure import Figure

from stagewright.core.ts_lines import path_segments

from stagewright.gui.charts import style
from stagewright.gui.presentation import units

#: colours of the cases in order (the house palette's most distinct entries)
CASE_COLOURS = (style.SHAFT, style.COMPRESSION, style.COOLING, style.LIMIT, style.AMBIENT, style.DESTROYED,
                style.HEAT_EXERGY, style.SENSIBLE)


def draw_case_paths(fig: Figure, outcomes: list, reference: str, system: str = "SI") -> Figure:
    """Draw the compression and cooling path of every solved case in ``outcomes``
    (:class:`stagewright.core.cases.CaseOutcome`); each line has the gid ``"<case>:<segment>"``.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    ax = fig.add_subplot(1, 1, 1)
    t_unit = units.unit("temperature", system)
    s_unit = units.unit("specific_entropy", system)
    solved = [o for o in outcomes if o.result is not None]
    for i, o in enumerate(solved):
        colour = CASE_COLOURS[i % len(CASE_COLOURS)]
        heavy = o.name == reference
        s0 = o.result["intake"]["entropy_J_kgK"] if "entropy_J_kgK" in o.result["intake"] else None
        segments = path_segments(o.result)
        if s0 is None and segments:
            s0 = segments[0].points[0][2]
        for k, seg in enumerate(segments):
            t = [t_unit.to_display(p[0]) for p in seg.points]
            s = [(p[2] - s0) / s_unit.scale for p in seg.points]
            ax.plot(s, t, color=colour, lw=2.2 if heavy else 1.3, ls="-" if seg.kind == "stage" else "--",
                    label=o.name if k == 0 else None, gid=f"{o.name}:{seg.name}", zorder=3 if heavy else 2)
    style.style_axes(ax, title="Temperature–entropy paths of the cases",
                     xlabel=f"Entropy relative to each case's intake [{s_unit.symbol}]",
                     ylabel=f"Temperature [{t_unit.symbol}]")
    if solved:
        ax.legend(fontsize=style.SIZE_TICK, frameon=False, loc="best",
                  title="compression solid, cooling dashed", title_fontsize=style.SIZE_NOTE)
    else:
        ax.text(0.5, 0.5, "No cases compared yet", ha="center", va="center", transform=ax.transAxes,
                fontsize=style.SIZE_LABEL, color=style.MUTED, fontfamily=style.FONT)
    return fig
