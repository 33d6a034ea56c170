"""Temperature–entropy chart of a solved train, built on a plain matplotlib ``Figure``.

No Qt and no pyplot: the window puts the figure on a Qt canvas, the report prints it into a
PDF. Every process segment is one ``Line2D`` with a gid (``"stage-1"``, ``"cooler-1"`` …,
1-based) so that callers and tests can find them; reference lines have gids ``"isobar-k"``,
``"ambient"`` and ``"limit-k"``.

Entropy is drawn relative to the intake state, :math:`s - s_\\mathrm{intake}`, because the
absolute value depends on each property model's reference state. The chart only draws:
the process path and the isobars come from the core as plain SI data
(:mod:`stagewright.core.ts_lines`), computed from the property model the result names.
"""
from __future__ import annotations

__all__ = ["draw_ts_chart", "stage_limits", "isobar_pressures"]


import math

from matplotlib.figure import Figure

from stagewright.core.ts_lines import ISOBAR_POINTS, isobar_pressures, isobars, path_segments

from stagewright.gui.presentation import units
from stagewright.gui.charts import style


def stage_limits(result: dict, limits_K=None) -> list:
    """Discharge-temperature limit of each stage [K] (``None`` where there is none).

    ``limits_K`` may be one number for every stage, or a list with one entry per stage;
    when it is not given, each stage's ``max_discharge_temperature_K`` is read from the
    result if present.
    """
    n = len(result["stages"])
    if limits_K is None:
        return [st.get("max_discharge_temperature_K") for st in result["stages"]]
    if isinstance(limits_K, (int, float)):
        return [float(limits_K)] * n
    lims = list(limits_K)[:n]
    return lims + [None] * (n - len(lims))


def draw_ts_chart(fig: Figure, result: dict, system: str = "SI", limits_K=None) -> Figure:
    """Draw the T–s chart of a solved train into ``fig`` (cleared first).

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure to draw into (any back end: Qt canvas, Agg, PDF).
    result : dict
        ``TrainResult.to_dict()`` of a solve.
    system : str
        Display units, ``"SI"`` or ``"US"`` (see :mod:`stagewright.gui.presentation.units`).
    limits_K : float or list, optional
        Discharge-temperature limit(s), [K]; by default each stage's
        ``max_discharge_temperature_K`` in the result, if present.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure, for chaining.
    """
    style.prepare(fig)
    ax = fig.add_subplot(1, 1, 1)
    t_unit = units.unit("temperature", system)
    s_unit = units.unit("specific_entropy", system)
    p_unit = units.unit("pressure", system)
    s_ref = result["intake"]["entropy_J_kgK"]

    def x(s):
        return s_unit.to_display(s - s_ref)

    def y(T):
        return t_unit.to_display(T)

    segs = [(seg.name, seg.kind, seg.points) for seg in path_segments(result)]
    all_T = [q[0] for _, _, pts in segs for q in pts] + [result["intake"]["temperature_K"]]
    all_s = [q[2] for _, _, pts in segs for q in pts] + [s_ref]
    lims = stage_limits(result, limits_K)
    lim_T = [v for v in lims if v is not None]
    t_lo = min(all_T + [result["ambient_temperature_K"]])
    t_hi = max(all_T + lim_T)
    span = max(t_hi - t_lo, 20.0)
    t_lo_plot, t_hi_plot = t_lo - 0.08 * span, t_hi + 0.14 * span

    s_lo, s_hi = min(all_s), max(all_s)
    s_span = max(s_hi - s_lo, 1.0)
    s_lo_plot, s_hi_plot = s_lo - 0.06 * s_span, s_hi + 0.16 * s_span

    # isobars from the core (the result's own property model), each labelled at its last point
    # inside the plot box
    for iso in isobars(result, t_lo_plot, t_hi_plot, ISOBAR_POINTS):
        k, p, Ts, ss = iso.number, iso.pressure_Pa, iso.temperature_K, iso.entropy_J_kgK
        ax.plot([x(s) for s in ss], [y(T) for T in Ts], color=style.ISOBAR, lw=0.8, ls=(0, (4, 3)),
                zorder=1, gid=f"isobar-{k}")
        inside = [(x(s), y(T)) for s, T in zip(ss, Ts) if s_lo_plot <= s <= s_hi_plot]
        if len(inside) >= 2:
            (x1, y1), (x2, y2) = inside[-2], inside[-1]
            # text along the isobar: the angle is given in data space and turned into a
            # screen angle by the transform at draw time (follows resizing)
            ax.text(x2, y2, f"{p_unit.to_display(p):.{_pressure_decimals(p_unit, p)}f} {p_unit.symbol}",
                    rotation=math.degrees(math.atan2(y2 - y1, x2 - x1)), rotation_mode="anchor",
                    transform_rotates_text=True, ha="right", va="bottom", fontsize=style.SIZE_NOTE,
                    color=style.MUTED, fontfamily=style.FONT, zorder=3, gid=f"isobar-label-{k}",
                    bbox=dict(boxstyle="square,pad=0.1", fc=style.PAPER, ec="none", alpha=0.8))

    # ambient temperature
    T0 = result["ambient_temperature_K"]
    ax.axhline(y(T0), color=style.AMBIENT, lw=1.0, ls=(0, (1, 2)), zorder=2, gid="ambient")
    ax.annotate(f"ambient {_temp_text(T0, system)}",
                (0.0, y(T0)), xycoords=("axes fraction", "data"), xytext=(3, 3), textcoords="offset points",
                fontsize=style.SIZE_NOTE, color=style.AMBIENT, fontfamily=style.FONT, va="bottom", zorder=3,
                bbox=dict(boxstyle="square,pad=0.1", fc=style.PAPER, ec="none", alpha=0.8))

    # discharge-temperature limits (one line per distinct value)
    by_value: dict[float, list[int]] = {}
    for i, v in enumerate(lims, 1):
        if v is not None:
            by_value.setdefault(round(float(v), 6), []).append(i)
    for k, (v, idx) in enumerate(sorted(by_value.items()), 1):
        which = _stage_list(idx, len(lims))
        ax.axhline(y(v), color=style.LIMIT, lw=1.1, ls=(0, (6, 2)), zorder=2, gid=f"limit-{k}")
        ax.annotate(f"discharge limit, {which}: {_temp_text(v, system)}",
                    (0.0, y(v)), xycoords=("axes fraction", "data"), xytext=(3, 3), textcoords="offset points",
                    fontsize=style.SIZE_NOTE, color=style.LIMIT, fontfamily=style.FONT, ha="left", va="bottom",
                    zorder=3, bbox=dict(boxstyle="square,pad=0.1", fc=style.PAPER, ec="none", alpha=0.8))

    # the process: one Line2D per compression and per cooling line
    for gid, kind, pts in segs:
        colour = style.COMPRESSION if kind == "stage" else style.COOLING
        ax.plot([x(q[2]) for q in pts], [y(q[0]) for q in pts], color=colour, lw=2.0 if kind == "stage" else 1.7,
                solid_capstyle="round", marker="o", markevery=[0, len(pts) - 1], ms=3.2,
                markerfacecolor=style.PAPER, markeredgewidth=1.0, zorder=4, gid=gid,
                label="compression" if gid == "stage-1" else ("cooling" if gid == "cooler-1" else None))
        if kind == "stage":
            # stage number beside the middle of its compression line (isobar labels own the top)
            t_mid = 0.5 * (pts[0][0] + max(q[0] for q in pts))
            mid = min(pts, key=lambda q: abs(q[0] - t_mid))
            ax.annotate(gid.split("-")[1], (x(mid[2]), y(mid[0])), xytext=(5, 0), textcoords="offset points",
                        ha="left", va="center", fontsize=style.SIZE_NOTE, fontweight="bold",
                        color=style.COMPRESSION, fontfamily=style.FONT, gid=f"{gid}-number")

    ax.set_ylim(y(t_lo_plot), y(t_hi_plot))
    ax.set_xlim(x(s_lo_plot), x(s_hi_plot))
    style.style_axes(ax, title="Temperature–entropy path",
                     xlabel=f"Entropy relative to intake, s − s₀ [{s_unit.symbol}]",
                     ylabel=units.label("Temperature", "temperature", system))
    handles = [h for h in ax.get_lines() if h.get_label() in ("compression", "cooling")]
    if handles:
        leg = ax.legend(handles=handles, loc="lower right", bbox_to_anchor=(1.0, 1.0), ncol=2,
                        fontsize=style.SIZE_NOTE, frameon=False, borderaxespad=0.2)
        for t in leg.get_texts():
            t.set_color(style.INK)
    return fig


def _stage_list(idx: list[int], n: int) -> str:
    """'all stages', 'stage 2', 'stages 1–3' or 'stages 1, 3'."""
    if len(idx) == n and n > 1:
        return "all stages"
    if len(idx) == 1:
        return f"stage {idx[0]}"
    if idx == list(range(idx[0], idx[-1] + 1)):
        return f"stages {idx[0]}–{idx[-1]}"
    return "stages " + ", ".join(str(i) for i in idx)


def _temp_text(T: float, system: str) -> str:
    """A temperature for a chart label, to the nearest degree: ``"200 °C"``."""
    u = units.unit("temperature", system)
    return f"{u.to_display(T):.0f} {u.symbol}"


def _pressure_decimals(u, p: float) -> int:
    """Decimals for an isobar label: about three significant figures."""
    v = abs(u.to_display(p))
    return 2 if v < 10 else (1 if v < 100 else 0)
