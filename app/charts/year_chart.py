"""Year-at-site chart: energy, condensate and worst discharge temperature bin by bin.

Built on a plain matplotlib ``Figure`` (no Qt, no pyplot) from ``YearResult.to_dict()``
(:func:`stagewright.core.year.run_year`): three panels — energy per bin (bars, gid ``"year-energy-<i>"``),
condensate drained per bin (bars, ``"year-condensate-<i>"``) and the highest stage discharge
temperature of the bin (line ``"year-discharge"``), with the worst bin circled
(``"year-worst"``) and named in that panel's title, never beside the point, where it would run
into the month labels of a short panel. A wide, short figure (a panel docked under the
window's charts) puts the three panels side by side, each with its own month labels; a taller
one stacks them over one shared month axis. Titles and month labels are fitted to the space at
every draw (:mod:`stagewright.gui.charts.fit_layout`).
"""
from __future__ import annotations

__all__ = ["draw_year_chart", "side_by_side_for", "SIDE_BY_SIDE_ASPECT"]

from matplotlib.figure import Figure

from stagewright.gui.presentation import units
from stagewright.gui.charts import fit_layout, style

_MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August", "September", "October",
           "November", "December")
#: a figure at least this many times as wide as it is tall shows the panels side by side
#: (three stacked panels in a short figure leave each a sliver; common practice, no source)
SIDE_BY_SIDE_ASPECT = 2.2


def side_by_side_for(width: float, height: float) -> bool:
    """Whether a figure ``width`` × ``height`` (any one unit) shows the three panels side by side.

    Examples
    --------
    >>> side_by_side_for(900, 230), side_by_side_for(700, 600)
    (True, False)
    """
    return width >= SIDE_BY_SIDE_ASPECT * height


def draw_year_chart(fig: Figure, year: dict, system: str = "SI", limit_K: float | None = None,
                    side_by_side: bool | None = None, dryer: bool = False) -> Figure:
    """Draw a year at the site into ``fig`` (cleared first).

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure to draw into (any back end).
    year : dict
        ``YearResult.to_dict()``: ``bins`` with ``label``, ``energy_kWh`` [kWh],
        ``condensate_m3`` [m³] and ``max_discharge_temperature_K`` [K]; ``totals`` with
        ``energy_kWh`` and ``condensate_m3``.
    system : str
        Display units, ``"SI"`` or ``"US"``.
    limit_K : float, optional
        Discharge-temperature limit to draw, [K].
    side_by_side : bool, optional
        The three panels in a row (True) or stacked (False); by default from the figure's shape
        (:func:`side_by_side_for`).
    dryer : bool
        Also draw, in the temperature panel, the air reaching the dryer (``dryer_inlet_temperature_K``,
        gid ``"year-dryer"``) and its pressure dew point (``"year-pdp"``), and ring the bins that
        miss a stated limit (``"year-missed"``). The window draws them; off by default.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    fit_layout.install(fig)  # titles and month labels fit a narrow panel (wrapped or smaller, same words)
    if side_by_side is None:
        side_by_side = side_by_side_for(fig.bbox.width, fig.bbox.height)  # a SubFigure has no size of its own
    bins = year.get("bins") or []
    if side_by_side:
        ax_e, ax_w, ax_t = fig.subplots(1, 3)
    else:
        ax_e, ax_w, ax_t = fig.subplots(3, 1, sharex=True)
    if not bins:
        for ax in (ax_e, ax_w, ax_t):
            ax.set_axis_off()
        ax_w.text(0.5, 0.5, "No year run yet", transform=ax_w.transAxes, ha="center", va="center",
                  fontsize=style.SIZE_LABEL, color=style.MUTED, fontfamily=style.FONT)
        return fig
    _draw_bins(ax_e, ax_w, ax_t, year, system, limit_K)
    if dryer and "dryer_inlet_temperature_K" in bins[0]:
        _draw_dryer(ax_t, bins, system)
    every = max(1, len(bins) // 24)  # at most about 24 labels: an hourly year has thousands of bins
    x = list(range(0, len(bins), every))
    short = [bins[i]["label"][:3] if bins[i]["label"] in _MONTHS else bins[i]["label"] for i in x]  # Jan … Dec
    long_ticks = max(len(t) for t in short) > 4 or len(bins) > 12
    for ax in (ax_e, ax_w, ax_t) if side_by_side else (ax_t,):
        ax.set_xticks(x, short, rotation=45 if long_ticks else 0, ha="right" if long_ticks else "center")
        ax.set_xlim(-0.6, len(bins) - 0.4)
    return fig


def _draw_dryer(ax_t, bins: list, system: str) -> None:
    """The air reaching the dryer and its pressure dew point per bin; bins missing a limit ringed."""
    tu = units.unit("temperature", system)
    x = range(len(bins))
    dryer = [tu.to_display(b["dryer_inlet_temperature_K"]) for b in bins]
    ax_t.plot(x, dryer, color=style.SENSIBLE, linewidth=1.2, gid="year-dryer", zorder=3, label="to dryer")
    if any(b.get("pressure_dew_point_K") is not None for b in bins):
        pdp = [float("nan") if b.get("pressure_dew_point_K") is None else tu.to_display(b["pressure_dew_point_K"])
               for b in bins]
        ax_t.plot(x, pdp, color=style.LATENT, linewidth=1.0, linestyle=":", gid="year-pdp", zorder=3,
                  label="pressure dew point")
    missed = [i for i, b in enumerate(bins) if not b.get("meets_limits", True)]
    if missed:
        ax_t.plot(missed, [dryer[i] for i in missed], linestyle="none", marker="o", markersize=6,
                  markerfacecolor="none", markeredgecolor=style.LIMIT, gid="year-missed", zorder=4,
                  label="misses a limit")
    lo, hi = ax_t.get_ylim()
    ax_t.set_ylim(min(lo, min(v for v in dryer) - 2.0), hi)
    ax_t.legend(loc="best", fontsize=style.SIZE_LABEL - 1, frameon=False)


def _draw_bins(ax_e, ax_w, ax_t, year: dict, system: str, limit_K: float | None) -> None:
    """Bars of energy and condensate, the discharge-temperature line, the worst bin and the titles."""
    bins = year["bins"]
    en = units.unit("energy", system)
    vol = units.unit("liquid_volume", system)
    tu = units.unit("temperature", system)
    for i, b in enumerate(bins):
        ax_e.bar(i, en.to_display(b["energy_kWh"] * 3.6e6), width=0.7, color=style.POWER, gid=f"year-energy-{i}",
                 zorder=3)
        ax_w.bar(i, vol.to_display(b["condensate_m3"]), width=0.7, color=style.LATENT, edgecolor=style.SENSIBLE,
                 linewidth=0.6, gid=f"year-condensate-{i}", zorder=3)
    temps = [tu.to_display(b["max_discharge_temperature_K"]) for b in bins]
    ax_t.plot(range(len(bins)), temps, color=style.TEMPERATURE, marker="o", markersize=3.5, linewidth=1.4,
              gid="year-discharge", zorder=3)
    worst = max(range(len(bins)), key=lambda i: bins[i]["max_discharge_temperature_K"])
    ax_t.plot([worst], [temps[worst]], linestyle="none", marker="o", markersize=8, markerfacecolor="none",
              markeredgecolor=style.LIMIT, markeredgewidth=1.4, gid="year-worst", zorder=4)
    if limit_K is not None:
        ax_t.axhline(tu.to_display(limit_K), color=style.LIMIT, linewidth=1.0, linestyle="--", gid="year-limit")
    totals = year.get("totals") or {}
    energy = units.format_value(totals["energy_kWh"] * 3.6e6, "energy", system, with_unit=True) \
        if totals.get("energy_kWh") is not None else ""
    water = units.format_value(totals["condensate_m3"], "liquid_volume", system, with_unit=True) \
        if totals.get("condensate_m3") is not None else ""
    hottest = units.format_value(bins[worst]["max_discharge_temperature_K"], "temperature", system, with_unit=True)
    style.style_axes(ax_e, title=f"Energy per bin (year: {energy})" if energy else "Energy per bin",
                     ylabel=en.symbol, grid_axis="y")
    style.style_axes(ax_w, title=f"Condensate drained (year: {water})" if water else "Condensate drained",
                     ylabel=vol.symbol, grid_axis="y")
    style.style_axes(ax_t, title=f"Highest discharge temperature (worst: {bins[worst]['label']}, {hottest})",
                     ylabel=tu.symbol, grid_axis="y")
    lo, hi = min(temps), max(temps + ([tu.to_display(limit_K)] if limit_K is not None else []))
    pad = max(0.15 * (hi - lo), 2.0)
    ax_t.set_ylim(lo - pad, hi + pad)
