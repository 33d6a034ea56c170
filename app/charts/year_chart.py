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

__all__ = ["draw_year_chart", "side_by_side_for", "SIDE_BY_SIDE_ASPECT", "DENSE_BINS", "year_ticks"]

from matplotlib.figure import Figure

from stagewright.gui.presentation import units
from stagewright.gui.charts import fit_layout, style

_MONTHS = ("January", "February", "March", "April", "May", "June", "July", "August", "September", "October",
           "November", "December")
#: above this many bins a year is drawn as areas and a plain line (one bar and one marker per bin
#: would run together into a band), with a few readable ticks instead of a label per bin
DENSE_BINS = 36
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
    x, short, axis_label = year_ticks(bins, system)
    long_ticks = max(len(t) for t in short) > 4 or (len(bins) > 12 and len(bins) <= DENSE_BINS)
    for ax in (ax_e, ax_w, ax_t) if side_by_side else (ax_t,):
        ax.set_xticks(x, short, rotation=45 if long_ticks else 0, ha="right" if long_ticks else "center")
        ax.set_xlim(-0.6, len(bins) - 0.4)
        if axis_label:
            ax.set_xlabel(axis_label, fontsize=style.SIZE_TICK, color=style.MUTED, fontfamily=style.FONT)
    return fig


def _timestamps(bins: list) -> list | None:
    """The bins' labels as times when every label is one (an imported hourly year), else None."""
    from datetime import datetime
    try:
        return [datetime.fromisoformat(b["label"]) for b in bins]
    except (TypeError, ValueError, KeyError):
        return None


def year_ticks(bins: list, system: str = "SI") -> tuple[list, list, str]:
    """Tick positions, tick texts and an axis label for the bins of a year.

    Twelve months or a few bins: one tick each (``Jan`` … ``Dec``, or the bin's name). More
    (:data:`DENSE_BINS`): an hourly year whose bins are named by their time gets a tick at the
    first hour of each month; bins in order of ambient temperature (a binned year) get about six
    ticks with their temperature; other bins, about six ticks with their number.

    Examples
    --------
    >>> year_ticks([{"label": m} for m in ("January", "February")])
    ([0, 1], ['Jan', 'Feb'], '')
    >>> bins = [{"label": f"b{i}", "temperature_K": 250.0 + i} for i in range(100)]
    >>> year_ticks(bins)
    ([0, 20, 40, 59, 79, 99], ['-23', '-3', '17', '36', '56', '76'], 'bins by ambient temperature [°C]')
    """
    n = len(bins)
    if n <= DENSE_BINS:
        return list(range(n)), [b["label"][:3] if b["label"] in _MONTHS else b["label"] for b in bins], ""
    times = _timestamps(bins)
    if times is not None:
        starts = [i for i, t in enumerate(times) if i == 0 or (t.year, t.month) != (times[i - 1].year, times[i - 1].month)]
        return starts, [f"{times[i]:%b}" for i in starts], f"{times[0]:%Y-%m-%d} to {times[-1]:%Y-%m-%d}, hour by hour"
    x = sorted({round(k * (n - 1) / 5) for k in range(6)})
    temps = [b.get("temperature_K") for b in bins]
    # a binned year lists its bins by temperature step, then humidity: in order within a step (1 K)
    if all(isinstance(t, (int, float)) for t in temps) and all(a <= b + 1.0 for a, b in zip(temps, temps[1:])):
        tu = units.unit("temperature", system)
        return x, [f"{tu.to_display(temps[i]):.0f}" for i in x], f"bins by ambient temperature [{tu.symbol}]"
    return x, [str(i + 1) for i in x], "bin"


def _draw_freezing(ax_w, bins: list, water: list, dense: bool) -> None:
    """The condensate of bins where a cooler's condensate would freeze, marked in its own colour
    (gid ``"year-freezing"``, legend "would freeze"): freeze protection is needed there."""
    frozen = [i for i, b in enumerate(bins) if b.get("freezing_condensate")]
    if not frozen:
        return
    if dense:  # a band behind the hours: their condensate is small (cold air holds little water)
        mask = [bool(b.get("freezing_condensate")) for b in bins]
        ax_w.fill_between(range(len(bins)), 0.0, 1.0, where=mask, step="mid", transform=ax_w.get_xaxis_transform(),
                          color=style.LIMIT, alpha=0.22, linewidth=0.0, gid="year-freezing", zorder=2,
                          label="would freeze")
    else:
        ax_w.bar(frozen, [water[i] for i in frozen], width=0.7, color=style.LIMIT, gid="year-freezing", zorder=4,
                 label="would freeze")
    ax_w.legend(loc="upper right", fontsize=style.SIZE_LABEL - 1, frameon=True, framealpha=0.85, edgecolor=style.GRID)


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
    ax_t.legend(loc="best", fontsize=style.SIZE_LABEL - 1, frameon=True, framealpha=0.85, edgecolor=style.GRID)


def _draw_bins(ax_e, ax_w, ax_t, year: dict, system: str, limit_K: float | None) -> None:
    """Bars of energy and condensate, the discharge-temperature line, the worst bin and the titles."""
    bins = year["bins"]
    en = units.unit("energy", system)
    vol = units.unit("liquid_volume", system)
    tu = units.unit("temperature", system)
    dense = len(bins) > DENSE_BINS
    energy = [en.to_display(b["energy_kWh"] * 3.6e6) for b in bins]
    water = [vol.to_display(b["condensate_m3"]) for b in bins]
    if dense:  # one area each (gid "year-energy", "year-condensate"), not thousands of bars
        x = range(len(bins))
        ax_e.fill_between(x, 0.0, energy, step="mid", color=style.POWER, linewidth=0.0, gid="year-energy", zorder=3)
        ax_w.fill_between(x, 0.0, water, step="mid", color=style.LATENT, edgecolor=style.SENSIBLE, linewidth=0.4,
                          gid="year-condensate", zorder=3)
    else:
        for i in range(len(bins)):
            ax_e.bar(i, energy[i], width=0.7, color=style.POWER, gid=f"year-energy-{i}", zorder=3)
            ax_w.bar(i, water[i], width=0.7, color=style.LATENT, edgecolor=style.SENSIBLE, linewidth=0.6,
                     gid=f"year-condensate-{i}", zorder=3)
    _draw_freezing(ax_w, bins, water, dense)
    temps = [tu.to_display(b["max_discharge_temperature_K"]) for b in bins]
    ax_t.plot(range(len(bins)), temps, color=style.TEMPERATURE, marker="none" if dense else "o", markersize=3.5,
              linewidth=1.0 if dense else 1.4, gid="year-discharge", zorder=3)
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
    per = "hour" if len(bins) > DENSE_BINS and _timestamps(bins) is not None else "bin"
    style.style_axes(ax_e, title=f"Energy per {per} (year: {energy})" if energy else f"Energy per {per}",
                     ylabel=en.symbol, grid_axis="y")
    style.style_axes(ax_w, title=f"Condensate drained (year: {water})" if water else "Condensate drained",
                     ylabel=vol.symbol, grid_axis="y")
    style.style_axes(ax_t, title=f"Highest discharge temperature (worst: {bins[worst]['label']}, {hottest})",
                     ylabel=tu.symbol, grid_axis="y")
    lo, hi = min(temps), max(temps + ([tu.to_display(limit_K)] if limit_K is not None else []))
    pad = max(0.15 * (hi - lo), 2.0)
    ax_t.set_ylim(lo - pad, hi + pad)
