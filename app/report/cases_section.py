"""The report's comparison of cases: a table of the deciding figures, a column per case, each
value with its difference from the reference case, and the bars side by side
(:mod:`stagewright.gui.presentation.compare_table`, :mod:`stagewright.gui.charts.case_chart`). Nothing when the project
has no cases besides its base."""
from __future__ import annotations

__all__ = ["cases_section", "CASES_PER_TABLE"]

from stagewright.gui.charts.case_chart import CHART_FIGURES, draw_case_comparison
from stagewright.gui.presentation.compare_table import CASE_FIGURES, case_row, difference_text, flags
from stagewright.gui.presentation.figures import condition_holds, shown
from stagewright.gui.report.layout import Column, Pager, Table

_PDF = "pdf"
#: cases side by side in one table on a page's width (more cases: further tables)
CASES_PER_TABLE = 4


def cases_section(p: Pager, outcomes: list | None, reference: str, shown_case: str, system: str) -> None:
    """Print the comparison of ``outcomes`` (:class:`stagewright.core.cases.CaseOutcome`) against ``reference``."""
    if not outcomes or len(outcomes) < 2:
        return
    ref = next((o for o in outcomes if o.name == reference), outcomes[0])
    ref_row = case_row(ref.result, ref.year)
    rows = [case_row(o.result, o.year) for o in outcomes]
    figures = [f for f in shown(CASE_FIGURES, _PDF)
               if any(o.result is not None and condition_holds(f, _PDF, r) and f.value(r) is not None
                      for o, r in zip(outcomes, rows))]
    panels = sum(1 for f in figures if f.id in CHART_FIGURES)
    p.charts("Cases compared", [(lambda fig: draw_case_comparison(fig, outcomes, ref.name, system),
                                 2.6 if panels <= 3 else 4.6)])
    p.paragraph(f"The pages before describe the case “{shown_case}”. Below, each case is solved as the same "
                f"project with that case's changes; in brackets after a value, its difference from "
                f"“{ref.name}”.")
    for start in range(0, len(outcomes), CASES_PER_TABLE):
        chunk = list(zip(outcomes, rows))[start:start + CASES_PER_TABLE]
        columns = [Column("", align="left")] + [Column(o.name[:28], "") for o, _r in chunk]
        body = []
        for f in figures:
            sym = f.symbol_in(_PDF, system)
            cells = [f"{f.label_in(_PDF)}" + (f" [{sym}]" if sym else "")]
            for o, row in chunk:
                text = f.text(row, _PDF, system) if o.result is not None else "—"
                if o is not ref and o.result is not None and ref.result is not None:
                    delta = difference_text(f, row, ref_row, _PDF, system)
                    text += f" ({delta})" if delta else ""
                cells.append(text)
            body.append(cells)
        body.append(["Notes"] + ["; ".join(flags(o.result, o.error)) or "no warnings" for o, _r in chunk])
        p.table(Table("Figures of each case" if start == 0 else "Figures of each case (continued)", columns, body))
