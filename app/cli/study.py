"""``stagewright study``: staging options side by side, headless (never imports Qt).

    stagewright study PROJECT.json --max-stages N [--json] [--hours H] [--price P]
                      [--vary ambient_temperature_K=278.15,293.15,308.15]

Exit status 0 when some option meets every limit (for ``--vary``: at every value), 2 when
the input is rejected or no option meets the limits (the limit, its value and the
closest feasible value are named on stderr).
"""
from __future__ import annotations

__all__ = ["build_parser", "run"]

import argparse
import json
import sys

EXIT_OK, EXIT_INPUT = 0, 2


def build_parser() -> argparse.ArgumentParser:
    """Argument parser of the ``study`` sub-command."""
    from stagewright.core.study import DEFAULT_ENERGY_PRICE, DEFAULT_OPERATING_HOURS, MAX_STAGES, SITE_VARIABLES

    p = argparse.ArgumentParser(prog="stagewright study",
                                description="Compare 1 … N stages, each at its least-power pressure split.")
    p.add_argument("project", help="project file")
    p.add_argument("--max-stages", type=int, default=4, metavar="N", help=f"most stages, 1 … {MAX_STAGES} (default 4)")
    p.add_argument("--json", action="store_true", help="machine-readable rows (SI, unit in each key)")
    p.add_argument("--hours", type=float, default=DEFAULT_OPERATING_HOURS, metavar="H",
                   help=f"operating hours per year for the yearly saving (default {DEFAULT_OPERATING_HOURS:g})")
    p.add_argument("--price", type=float, default=DEFAULT_ENERGY_PRICE, metavar="P",
                   help=f"energy price per kWh, any currency (default {DEFAULT_ENERGY_PRICE:g})")
    p.add_argument("--vary", metavar="VAR=V1,V2,…",
                   help=f"repeat the study for several values of a site variable ({', '.join(SITE_VARIABLES)}; SI)")
    return p


def _parse_vary(text: str):
    from stagewright.core import InputError

    name, sep, values = text.partition("=")
    try:
        parsed = [float(v) for v in values.split(",") if v.strip()]
    except ValueError:
        parsed = None
    if not sep or not parsed:
        raise InputError("--vary", text, "expected VARIABLE=VALUE,VALUE,… (SI units)")
    return name.strip(), parsed


def _infeasible_line(path, rows: list[dict]) -> str | None:
    """stderr line when no option meets the limits: the most-stage option's first limit."""
    if any(r["feasible"] for r in rows):
        return None
    last = rows[-1]
    detail = last["binding_limits"][0]["message"] if last["binding_limits"] else "limits not met"
    field = last["binding_limits"][0]["field"] if last["binding_limits"] else ""
    return f"{path}: no option up to {last['stages']} stage(s) meets every limit: {field}: {detail}"


def run(args) -> int:
    """Run the study sub-command; returns the exit status."""
    from stagewright.core import StagewrightError
    from stagewright.core.project import load
    from stagewright.core.study import compare_stagings, sensitivity
    from stagewright.gui.cli.study_table import format_comparison, format_sensitivity

    try:
        doc = load(args.project)
        if args.vary:
            variable, values = _parse_vary(args.vary)
            study = sensitivity(doc, variable, values, args.max_stages, operating_hours_per_year=args.hours,
                                energy_price_per_kWh=args.price)
            points = study.rows()
            problems = [f"{args.project}: {p['variable']} = {p['value']:g}: {p['error']}" for p in points
                        if p["options"] is None]
            problems += [line for p in points if p["options"]
                         for line in [_infeasible_line(f"{args.project} ({p['variable']} = {p['value']:g})",
                                                       p["options"])] if line]
            print(json.dumps(points, indent=2, allow_nan=False) if args.json
                  else format_sensitivity(doc.get("title", ""), points))
        else:
            rows = compare_stagings(doc, args.max_stages, operating_hours_per_year=args.hours,
                                    energy_price_per_kWh=args.price).rows()
            line = _infeasible_line(args.project, rows)
            problems = [line] if line else []
            print(json.dumps(rows, indent=2, allow_nan=False) if args.json
                  else format_comparison(doc.get("title", ""), rows))
    except StagewrightError as exc:
        print(f"{args.project}: {exc}", file=sys.stderr)
        return EXIT_INPUT
    for line in problems:
        print(line, file=sys.stderr)
    return EXIT_INPUT if problems else EXIT_OK
