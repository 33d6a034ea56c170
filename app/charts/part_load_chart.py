"""Part-load chart: the package's input power and specific power against the air it delivers.

Built on a plain matplotlib ``Figure`` (no Qt, no pyplot) from ``TrainResult.to_dict()["package"]``
(:func:`stagewright.core.part_load.figures.package_figures`): two panels over delivered free air —
package input power (line ``"part-load-power"``) with the ideal control for reference, input in
proportion to flow at the full-load specific power (dashed, ``"part-load-ideal"``), and package
specific power (``"part-load-specific"``, with its full-load value as a dashed line,
``"part-load-specific-ideal"``), one legend under both. The stated load is marked on both (``"part-load-stated"``,
``"part-load-stated-specific"``) and the data-sheet loads as small rings (``"part-load-sheet"``).
A wide, short figure puts the panels side by side; a taller one stacks them (same rule as the
year chart, :func:`stagewright.gui.charts.year_chart.side_by_side_for`).
"""
from __future__ import annotations

__all__ = ["draw_part_load_chart"]

from matplotlib.figure import Figure

from stagewright.gui.charts import fit_layout, style
from stagewright.gui.charts.year_chart import side_by_side_for
from stagewright.gui.presentation import units
from stagewright.gui.presentation.package_table import J_M3, load_name

_STATED = style.LIMIT  # the stated load: plum, the colour of a stated limit or mark


def _show(si, quantity: str, system: str, to_si: float = 1.0):
    return None if si is None else units.to_display(si * to_si, quantity, system)


def draw_part_load_chart(fig: Figure, package: dict, system: str = "SI", side_by_side: bool | None = None) -> Figure:
    """Draw the package's part-load curve into ``fig`` (cleared first).

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure (or sub-figure) to draw into.
    package : dict
        ``TrainResult.to_dict()["package"]``: ``curve`` (points at demands 0 … 1), ``at_load``,
        ``part_loads``, ``full_load`` and ``control_label``.
    system : str
        Display units, ``"SI"`` or ``"US"``.
    side_by_side : bool, optional
        The two panels in a row (True) or stacked (False); by default from the figure's shape.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    fit_layout.install(fig)
    if side_by_side is None:
        side_by_side = side_by_side_for(fig.bbox.width, fig.bbox.height / 1.6)
    ax_p, ax_s = fig.subplots(1, 2) if side_by_side else fig.subplots(2, 1, sharex=True)
    flow_label = units.label("Free air delivered", "volume_flow", system)
    power_u = units.unit("power", system).symbol
    sp_u = units.unit("specific_power", system).symbol
    curve = package["curve"]
    q = [_show(p["delivered_fad_m3_s"], "volume_flow", system) for p in curve]
    power = [_show(p["package_power_W"], "power", system) for p in curve]
    full = package["full_load"]
    q_full, p_full = _show(full["delivered_fad_m3_s"], "volume_flow", system), _show(full["package_power_W"],
                                                                                       "power", system)
    ax_p.plot(q, power, color=style.SHAFT, lw=1.8, gid="part-load-power",
              label=f"{package['control_label']} (package input)")
    ax_p.plot([0.0, q_full], [0.0, p_full], color=style.MUTED, lw=1.0, ls="--", gid="part-load-ideal",
              label="input in proportion to flow (ideal)")
    spec = [(qi, _show(p["package_specific_power_J_m3"], "specific_power", system, J_M3))
            for qi, p in zip(q, curve) if p["package_specific_power_J_m3"] is not None and p["demand_fraction"] >= 0.1]
    ax_s.plot([s[0] for s in spec], [s[1] for s in spec], color=style.COMPRESSION, lw=1.8, gid="part-load-specific",
              label="package specific power")
    sp_full = _show(full["package_specific_power_J_m3"], "specific_power", system, J_M3)
    ax_s.axhline(sp_full, color=style.MUTED, lw=1.0, ls="--", gid="part-load-specific-ideal",
                 label="full-load value (ideal)")
    sheet = [p for p in package["part_loads"] if p["demand_fraction"] > 0.0]
    ax_p.plot([_show(p["delivered_fad_m3_s"], "volume_flow", system) for p in sheet],
              [_show(p["package_power_W"], "power", system) for p in sheet], ls="none", marker="o", ms=5,
              mfc="none", mec=style.SHAFT, gid="part-load-sheet", label="data-sheet loads")
    at = package["at_load"]
    q_at = _show(at["delivered_fad_m3_s"], "volume_flow", system)
    stated = f"stated load {load_name(at['demand_fraction'])}"
    ax_p.plot([q_at], [_show(at["package_power_W"], "power", system)], ls="none", marker="D", ms=7,
              color=_STATED, gid="part-load-stated", label=stated)
    if at["package_specific_power_J_m3"] is not None:
        ax_s.plot([q_at], [_show(at["package_specific_power_J_m3"], "specific_power", system, J_M3)], ls="none",
                  marker="D", ms=7, color=_STATED, gid="part-load-stated-specific", label=stated)
    style.style_axes(ax_p, title="Package input power", xlabel=flow_label if side_by_side else None,
                     ylabel=f"Input [{power_u}]")
    style.style_axes(ax_s, title="Package specific power", xlabel=flow_label, ylabel=f"[{sp_u}]")
    ax_p.set_xlim(0.0, q_full * 1.03)
    ax_p.set_ylim(0.0, max(power + [p_full]) * 1.08)
    top = max([s[1] for s in spec] + [sp_full])
    ax_s.set_ylim(0.0, top * 1.1)
    ax_s.set_xlim(0.0, q_full * 1.03)
    handles, labels = ax_p.get_legend_handles_labels()
    more = [(h, lab) for h, lab in zip(*ax_s.get_legend_handles_labels()) if lab not in labels]
    # one legend under both panels: inside either it covers some control's curve
    fig.legend(handles + [h for h, _ in more], labels + [lab for _, lab in more], loc="outside lower center",
               ncol=3, fontsize=style.SIZE_NOTE, frameon=False)
    return fig
