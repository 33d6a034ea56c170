"""The report's section on a year at the site: the year chart, a row per month or bin, the totals.

Printed when the project has a ``year`` section. The year (``YearResult.to_dict()`` of
:func:`stagewright.core.year.run_year`) is computed by :func:`stagewright.gui.report.export_report`; a year that
could not be computed is reported in words. The columns and totals are the figures of
:mod:`stagewright.gui.presentation.year_tables` that show in the ``"pdf"`` output
(:func:`~stagewright.gui.presentation.year_tables.bin_columns_for`: a column whose condition is ``"any"`` is
left out when every bin has zero or nothing there — no cooling water, no heat recovery, no dew
point of a dry intake — and "Meets limits" when the project states none). The bins are printed in
two tables of readable width: energy and water, then the air reaching the dryer (its temperature,
pressure dew point, each cooler's air outlet and whether the bin meets the stated limits). No Qt.
"""
from __future__ import annotations

__all__ = ["year_at_site"]

from stagewright.gui.charts.year_chart import draw_year_chart
from stagewright.gui.presentation import year_tables
from stagewright.gui.presentation.figures import Figure, read_path
from stagewright.gui.report.layout import Column, Pager, Table

_PDF = "pdf"
PDF_BINS_MAX = 60  #: a year with more bins prints a choice of them (see _printed_bins)
PDF_BINS_PICKED = 20  #: … the coldest and the warmest this many


def _column(fig: Figure, system: str) -> Column:
    return Column(fig.label_in(_PDF), fig.symbol_in(_PDF, system), align="left" if fig.is_left_aligned() else "right")




def _bin_table(title: str, figures: list[Figure], bins: list[dict], system: str, note: str) -> Table:
    rows = [[f.text(b, _PDF, system) for f in figures] for b in bins]
    return Table(title, [_column(f, system) for f in figures], rows, note=note)


def _printed_bins(bins: list[dict]) -> tuple[list[dict], str]:
    """The bins a printed table lists, and its title when they are a choice: up to
    :data:`PDF_BINS_MAX` all of them; beyond (an hourly year would fill hundreds of pages) the
    :data:`PDF_BINS_PICKED` coldest and as many warmest, in the year's order — the bins that size
    freeze protection and the dryer. The totals and the chart cover every bin; every bin is in the
    year's CSV (``stagewright year … --csv``, or beside the report's CSV)."""
    if len(bins) <= PDF_BINS_MAX:
        return bins, ""
    by_temperature = sorted(range(len(bins)), key=lambda i: (bins[i]["temperature_K"], i))
    keep = sorted(set(by_temperature[:PDF_BINS_PICKED]) | set(by_temperature[-PDF_BINS_PICKED:]))
    return ([bins[i] for i in keep],
            f"The {PDF_BINS_PICKED} coldest and {PDF_BINS_PICKED} warmest of {len(bins)} bins")


def _total_text(fig: Figure, year: dict, system: str) -> str:
    text = fig.text(year, _PDF, system, with_unit=True)
    if fig.bin_key:
        text += f" ({read_path(year, fig.bin_key)})"
    return text


def year_at_site(p: Pager, year: dict | None, system: str, limit_K: float | None = None,
                 problem: str = "") -> None:
    """The year at the site (nothing when the project has none; ``problem`` when it could not be run)."""
    if problem:
        p.heading("A year at the site", keep_with=0.5)
        p.paragraph(f"The year at the site could not be computed: {problem}")
        return
    if not year or not year.get("bins"):
        return
    p.charts("A year at the site", [(lambda f: draw_year_chart(f, year, system, limit_K=limit_K), 5.0)])
    bins, picked = _printed_bins(year["bins"])
    columns = year_tables.bin_columns_for(year, _PDF)
    title = ("Month by month" if len(bins) == 12 else "Bin by bin") if not picked else picked
    energy = [f for f in columns if f.id not in year_tables.PDF_DRYER_COLUMNS]
    p.table(_bin_table(title, energy, bins, system,
                       "Energy is the driver's input over the bin's operating hours; condensate and cooling "
                       "water are volumes over those hours; the hottest discharge is that of the hottest stage."
                       + (" Only these bins are listed; the chart and the totals cover the whole year, and the "
                          "year's CSV holds every bin." if picked else "")))
    dryer = [f for f in columns if f.id in year_tables.PDF_DRYER_COLUMNS]
    if dryer:
        keys = [f for f in columns if f.id in year_tables.PDF_ROW_KEYS]
        p.table(_bin_table(f"{title}: the air reaching the dryer", keys + dryer, bins, system,
                           " ".join(f"{f.label_in(_PDF)}: {f.note}." for f in dryer if f.note)))
    totals = [[f.label_in(_PDF), _total_text(f, year, system)] for f in year_tables.totals_for(year, _PDF)
              if f.value(year) is not None]
    notes = " ".join(f"{f.label_in(_PDF)}: {f.note}." for f in year_tables.totals_for(year, _PDF) if f.note)
    p.table(Table("The year", [Column("", align="left"), Column("", align="left", wrap=True)], totals,
                  header=False, note=("Money is in the currency of the prices given in the project. " + notes).strip()))
