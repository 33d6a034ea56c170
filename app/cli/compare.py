"""``stagewright compare PROJECT.json [--cases A,B,…] [--reference NAME] [--json|--csv]``: the cases of
one project side by side, each figure with its difference from the reference case.

Text (display units, a column per case), JSON (SI, unit in each key) or CSV (SI, a row per case).
A case that cannot be solved is listed with its reason; the exit status is then 2.
"""
from __future__ import annotations

__all__ = ["build_parser", "run", "format_comparison"]

import argparse
import csv
import io
import json
import sys

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK
from stagewright.gui.document.messages import warning_text
from stagewright.gui.presentation.cautions import CAUTIONS, DEFERRAL
from stagewright.gui.presentation.compare_table import CASE_FIGURES, case_row, difference, difference_text, flags
from stagewright.gui.presentation.figures import condition_holds, shown

_OUT = "text"


def build_parser() -> argparse.ArgumentParser:
    p = argparse.ArgumentParser(prog="stagewright compare",
                                description="Compare the cases of one project, each against a reference case.")
    p.add_argument("project", help="a project file with cases")
    p.add_argument("--cases", help="comma-separated case names, in the order to show (default: all)")
    p.add_argument("--reference", help="the case the others are compared with (default: the first shown)")
    p.add_argument("--units", choices=("SI", "US"), default="SI", help="display units of the text table")
    p.add_argument("--no-year", action="store_true", help="skip the year at the site (faster; no annual figures)")
    out = p.add_mutually_exclusive_group()
    out.add_argument("--json", action="store_true", help="results as JSON (SI, unit in each key)")
    out.add_argument("--csv", action="store_true", help="one CSV row per case (SI, unit in each column name)")
    return p


def _names(text: str | None) -> list[str] | None:
    if not text:
        return None
    return [n.strip() for n in text.split(",") if n.strip()]


def _figures(outcomes) -> list:
    """The figures that apply to at least one solved case (no dew point row for dry air only)."""
    rows = [case_row(o.result, o.year) for o in outcomes if o.result is not None]
    return [f for f in shown(CASE_FIGURES, _OUT)
            if any(condition_holds(f, _OUT, r) and f.value(r) is not None for r in rows)]


def format_comparison(title: str, outcomes, reference: str, system: str = "SI", doc: dict | None = None) -> str:
    """The comparison as an aligned text table: a row per figure, a column per case, and below
    each case's value its difference from the reference."""
    ref = next(o for o in outcomes if o.name == reference)
    ref_row = case_row(ref.result, ref.year)
    figures = _figures(outcomes)
    table = []  # (label, values, differences) per figure
    for f in figures:
        sym = f.symbol_in(_OUT, system)
        values, deltas = [], []
        for o in outcomes:
            row = case_row(o.result, o.year)
            values.append(f.text(row, _OUT, system, grouping=True) if o.result is not None else "—")
            deltas.append("" if o is ref or o.result is None or ref.result is None
                          else difference_text(f, row, ref_row, _OUT, system))
        table.append((f"{f.label_in(_OUT)} [{sym}]" if sym else f.label_in(_OUT), values, deltas))
    label_w = max([len(label) + 2 for label, _v, _d in table] + [10])
    col_w = max([len(o.name) for o in outcomes] + [len(t) for _l, v, d in table for t in v + d] + [10]) + 2
    lines = [title or "(untitled project)", f"Cases compared with {reference!r}", ""]
    lines.append(" " * label_w + "".join(f"{o.name:>{col_w}}" for o in outcomes))
    for label, values, deltas in table:
        lines.append(f"{label:<{label_w}}" + "".join(f"{v:>{col_w}}" for v in values))
        if any(deltas):
            lines.append(" " * label_w + "".join(f"{d:>{col_w}}" for d in deltas))
    lines.append("")
    for o in outcomes:
        for flag in flags(o.result, o.error):
            lines.append(f"{o.name}: {flag}")
        for w in (o.result or {}).get("warnings") or []:
            lines.append(f"  {warning_text(w, o.document, system)}")
    title_t, text_t = next(c for c in CAUTIONS if c[0] == "Discharge temperature")
    lines += ["", f"Caution — {title_t}: {text_t}", "", DEFERRAL]
    return "\n".join(lines).rstrip() + "\n"


def _json(outcomes, reference: str) -> dict:
    ref = next(o for o in outcomes if o.name == reference)
    ref_row = case_row(ref.result, ref.year)
    cases = []
    for o in outcomes:
        row = case_row(o.result, o.year)
        figures = {f.id: f.value(row) for f in CASE_FIGURES} if o.result is not None else {}
        diffs = {}
        if o.result is not None and ref.result is not None and o is not ref:
            for f in CASE_FIGURES:
                d = difference(f, row, ref_row)
                if d is not None:
                    diffs[f.id] = {"difference": d[0], "relative": d[1]}
        cases.append({"name": o.name, "solved": o.result is not None, "error": o.error, "figures": figures,
                      "differences_from_reference": diffs,
                      "warnings": [w.get("message", "") for w in (o.result or {}).get("warnings") or []]})
    return {"reference": reference, "cases": cases}


def _csv(outcomes) -> str:
    buf = io.StringIO()
    ids = [f.id for f in CASE_FIGURES]
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["case", "solved", "error", *ids])
    for o in outcomes:
        row = case_row(o.result, o.year)
        writer.writerow([o.name, "yes" if o.result is not None else "no", o.error,
                         *[("" if (v := f.value(row)) is None else repr(float(v))) for f in CASE_FIGURES]])
    return buf.getvalue()


def run(args) -> int:
    """Solve the cases asked for and print the comparison; exit status 2 if any case failed."""
    from stagewright.core import StagewrightError
    from stagewright.core.cases import compare_cases
    from stagewright.core.project import load
    from stagewright.core.project.cases import case_names

    try:
        doc = load(args.project)
        names = _names(args.cases) or case_names(doc)
        reference = args.reference or names[0]
        if reference not in names:
            names = [reference, *names]
        outcomes = compare_cases(doc, names, with_year=not args.no_year)
    except (StagewrightError, OSError) as exc:
        print(f"{args.project}: {exc}", file=sys.stderr)
        return EXIT_INPUT
    if args.json:
        print(json.dumps(_json(outcomes, reference), indent=2, allow_nan=False))
    elif args.csv:
        sys.stdout.write(_csv(outcomes))
    else:
        sys.stdout.write(format_comparison(doc.get("title", ""), outcomes, reference, args.units, doc))
    return EXIT_OK if all(o.result is not None and not o.error for o in outcomes) else EXIT_INPUT
