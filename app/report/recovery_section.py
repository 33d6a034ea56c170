"""The report's heat-recovery section: what the coolers and casings can deliver, and its worth.

Printed when the project has a ``heat_recovery`` section; its figures are those of
:mod:`stagewright.gui.presentation.recovery_table` that show in the ``"pdf"`` output. No Qt.
"""
from __future__ import annotations

__all__ = ["heat_recovery"]

from stagewright.gui.presentation import recovery_table
from stagewright.gui.presentation.figures import shown
from stagewright.gui.report.layout import Column, Pager, Table

_PDF = "pdf"


def heat_recovery(p: Pager, result: dict, system: str) -> None:
    """Heat recovery figures and the heat each stage's cooler and casing can give (nothing without)."""
    rec = result.get("heat_recovery")
    if not rec:
        return
    figures = shown(recovery_table.RECOVERY, _PDF)
    rows = [[f.label_in(_PDF), f.text(rec, _PDF, system, with_unit=True)] for f in figures]
    notes = " ".join(f"{f.label_in(_PDF)}: {f.note}." for f in figures if f.note)
    p.heading("Heat recovery", keep_with=1.5)
    p.table(Table("", [Column("", align="left"), Column("", align="left", wrap=True)], rows, header=False,
                  note=notes))
    columns = shown(recovery_table.RECOVERY_BY_STAGE, _PDF)
    cols = [Column("Stage", align="left")] + [Column(f.label_in(_PDF), f.symbol_in(_PDF, system)) for f in columns]
    body = [[str(i)] + [f.text(row, _PDF, system) for f in columns] for i, row in recovery_table.recovery_rows(rec)]
    p.table(Table("Recoverable heat by stage", cols, body,
                  note="A cooler gives the heat its air releases above the coldest useful temperature, latent "
                       "heat of the water condensing there included; a casing gives the recovered share of "
                       "its heat loss."))
