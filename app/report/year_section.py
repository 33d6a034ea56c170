"""The report's section on a year at the site: the year chart, a row per month or bin, the totals.

Printed when the project has a ``year`` section. The year (``YearResult.to_dict()`` of
:func:`stagewright.core.year.run_year`) is computed by :func:`stagewright.gui.report.export_report`; a year that
could not be computed is reported in words. The columns and totals are the figures of
:mod:`stagewright.gui.presentation.year_tables` that show in the ``"pdf"`` output; a column whose
condition is ``"any"`` is left out when every bin has zero or nothing there (no cooling water,
no heat recovery). No Qt.
"""
from __future__ import annotations

__all__ = ["year_at_site"]

from stagewright.gui.charts.year_chart import draw_year_chart
from stagewright.gui.presentation import year_tables
from stagewright.gui.presentation.figures import Figure, read_path, shown
from stagewright.gui.report.layout import Column, Pager, Table

_PDF = "pdf"


def _column(fig: Figure, system: str) -> Column:
    return Column(fig.label_in(_PDF), fig.symbol_in(_PDF, system), align="left" if fig.is_left_aligned() else "right")


def _bin_columns(bins: list[dict]) -> list[Figure]:
    return [f for f in shown(year_tables.YEAR_BINS, _PDF)
            if f.when_in(_PDF) != "any" or any(f.value(b) for b in bins)]


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
    bins = year["bins"]
    figures = _bin_columns(bins)
    rows = [[f.text(b, _PDF, system) for f in figures] for b in bins]
    p.table(Table("Month by month" if len(bins) == 12 else "Bin by bin", [_column(f, system) for f in figures],
                  rows, note="Energy is the driver's input over the bin's operating hours; condensate and "
                             "cooling water are volumes over those hours; the hottest discharge is that of the "
                             "hottest stage."))
    totals = [[f.label_in(_PDF), _total_text(f, year, system)] for f in year_tables.totals_for(year, _PDF)
              if f.value(year) is not None]
    notes = " ".join(f"{f.label_in(_PDF)}: {f.note}." for f in year_tables.totals_for(year, _PDF) if f.note)
    p.table(Table("The year", [Column("", align="left"), Column("", align="left", wrap=True)], totals,
                  header=False, note=("Money is in the currency of the prices given in the project. " + notes).strip()))
