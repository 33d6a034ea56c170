"""Year-at-site chart: energy, condensate and worst discharge temperature bin by bin.

Built on a plain matplotlib ``Figure`` (no Qt, no pyplot) from ``YearResult.to_dict()``
(:func:`thermo.year.run_year`): three panels sharing the bin axis — energy per bin
(bars, gid ``"year-energy-<i>"``), condensate drained per bin (bars, ``"year-condensate-<i>"``)
and the highest stage discharge temperature of the bin (line ``"year-discharge"``), with the
worst bin marked (``"year-worst"``). Titles and month labels are fitted to the figure's width
at every draw (:mod:`app.charts.fit_layout`).
"""
from __future__ import annotations

__all__ = ["draw_year_chart"]

from matplotlib.figure import Figure

from app.presentation import units
from app.charts import fit_layout, style

_MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August", "September", "October",
           "November", "December")


def draw_year_chart(fig: Figure, year: dict, system: str = "SI", limit_K: float | None = None) -> Figure:
    """Draw a year at the site into ``fig`` (cleared first).

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure to draw into (any back end).
    year : dict
        ``YearResult.to_dict()``: ``bins`` with ``label``, ``energy_kWh`` [kWh],
        ``condensate_m3`` [m³] and ``max_discharge_temperature_K`` [K].
    system : str
        Display units, ``"SI"`` or ``"US"``.
    limit_K : float, optional
        Discharge-temperature limit to draw, [K].

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    fit_layout.install(fig)  # titles and month labels fit a narrow panel (wrapped or smaller, same words)
    bins = year.get("bins") or []
    ax_e, ax_w, ax_t = fig.subplots(3, 1, sharex=True)
    if not bins:
        for ax in (ax_e, ax_w, ax_t):
            ax.set_axis_off()
        ax_w.text(0.5, 0.5, "No year run yet", transform=ax_w.transAxes, ha="center", va="center",
                  fontsize=style.SIZE_LABEL, color=style.MUTED, fontfamily=style.FONT)
        return fig
    x = list(range(len(bins)))
    labels = [b["label"] for b in bins]
    en = units.unit("energy", system)
    vol = units.unit("liquid_volume", system)
    tu = units.unit("temperature", system)
    for i, b in enumerate(bins):
        ax_e.bar(i, en.to_display(b["energy_kWh"] * 3.6e6), width=0.7, color=style.POWER, gid=f"year-energy-{i}",
                 zorder=3)
        ax_w.bar(i, vol.to_display(b["condensate_m3"]), width=0.7, color=style.LATENT, edgecolor=style.SENSIBLE,
                 linewidth=0.6, gid=f"year-condensate-{i}", zorder=3)
    temps = [tu.to_display(b["max_discharge_temperature_K"]) for b in bins]
    ax_t.plot(x, temps, color=style.TEMPERATURE, marker="o", markersize=3.5, linewidth=1.4, gid="year-discharge",
              zorder=3)
    worst = max(range(len(bins)), key=lambda i: bins[i]["max_discharge_temperature_K"])
    ax_t.plot([worst], [temps[worst]], linestyle="none", marker="o", markersize=8, markerfacecolor="none",
              markeredgecolor=style.LIMIT, markeredgewidth=1.4, gid="year-worst", zorder=4)
    ax_t.annotate(f"worst: {labels[worst]}", (worst, temps[worst]), xytext=(0, -14), textcoords="offset points",
                  ha="center", va="top", fontsize=style.SIZE_NOTE, color=style.LIMIT, fontfamily=style.FONT)
    if limit_K is not None:
        ax_t.axhline(tu.to_display(limit_K), color=style.LIMIT, linewidth=1.0, linestyle="--", gid="year-limit")
    total = units.format_value(year["totals"]["energy_kWh"] * 3.6e6, "energy", system, with_unit=True) \
        if year.get("totals") else ""
    style.style_axes(ax_e, title=f"Energy per bin (year: {total})" if total else "Energy per bin",
                     ylabel=en.symbol, grid_axis="y")
    style.style_axes(ax_w, title="Condensate drained", ylabel=vol.symbol, grid_axis="y")
    style.style_axes(ax_t, title="Highest discharge temperature", ylabel=tu.symbol, grid_axis="y")
    lo, hi = min(temps), max(temps + ([tu.to_display(limit_K)] if limit_K is not None else []))
    pad = max(0.15 * (hi - lo), 2.0)
    ax_t.set_ylim(lo - 1.6 * pad, hi + pad)
    short = [lab[:3] if lab in _MONTHS else lab for lab in labels]  # month names: Jan … Dec (no overlap)
    long_ticks = max(len(t) for t in short) > 4 or len(bins) > 12
    ax_t.set_xticks(x, short, rotation=45 if long_ticks else 0, ha="right" if long_ticks else "center")
    ax_t.set_xlim(-0.6, len(bins) - 0.4)
    return fig
