"""``stagewright year PROJECT.json … [--json] [--profile HOURLY.csv [--bin [K]]] [--csv OUT.csv]``.

A year at the site (energy, cost, condensate, coolers): the project's own ``year`` section, or a
profile read from an hourly or logged CSV file (:mod:`stagewright.gui.document.year_csv`; units in its header
or chosen with ``--temperature-unit`` / ``--humidity-unit``), optionally binned by temperature and
humidity (:func:`stagewright.core.year_profile.bin_profile`). ``--coolers design_once`` sizes the coolers
once and rates every bin at that UA. ``--csv`` writes every bin as one CSV row (SI, unit in each
column name). Progress on a terminal; Ctrl+C stops the run.
"""
from __future__ import annotations

__all__ = ["run", "add_arguments", "bins_csv_rows"]

import argparse
import csv
import json
import sys

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths

_T_UNITS = {"C": "°C", "°C": "°C", "F": "°F", "°F": "°F", "K": "K"}
_H_UNITS = {"%": "%", "percent": "%", "fraction": ""}


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Options of ``year`` beyond the files."""
    p.add_argument("--json", action="store_true", help="machine-readable results (SI, unit in each key)")
    p.add_argument("--profile", metavar="CSV", help="hourly or logged ambient profile replacing the project's")
    p.add_argument("--temperature-unit", choices=sorted(_T_UNITS), default="°C",
                   help="unit of temperature columns whose header names none (default °C)")
    p.add_argument("--humidity-unit", choices=sorted(_H_UNITS), default="%",
                   help="unit of relative humidity and load columns whose header names none (default %%)")
    p.add_argument("--bin", nargs="?", const=1.0, type=float, metavar="K",
                   help="bin the CSV rows by temperature (K wide, default 1) and humidity (5 %%) for speed")
    p.add_argument("--coolers", choices=("size_every_bin", "design_once"),
                   help="size the coolers in every bin, or once at the design condition and rate every bin")
    p.add_argument("--csv", metavar="OUT", help="write every bin as a CSV row (SI)")


def _bin_label(b: dict) -> str:
    """``"-7.5°C 84%"``: a bin named by its mean in the text tables' units."""
    return f"{b['temperature_K'] - 273.15:.1f}°C {100 * b['relative_humidity']:.0f}%"


def _with_profile(doc: dict, args) -> dict:
    """The project with the CSV profile (and cooler mode) of the command line, if any."""
    from stagewright.gui.document.year_csv import read_profile_csv
    from stagewright.core.year_profile import bin_profile
    doc = dict(doc)
    year = dict(doc.get("year") or {})
    if args.profile:
        units = {"temperature": _T_UNITS[args.temperature_unit], "fraction": _H_UNITS[args.humidity_unit]}
        rows = read_profile_csv(args.profile, units).bins
        if args.bin:
            rows = bin_profile(rows, t_step=args.bin, label=_bin_label)
        year["profile"] = {"kind": "bins", "bins": rows}
        year.pop("operating_hours_per_year", None)
    if args.coolers:
        year["coolers"] = {**(year.get("coolers") or {}), "mode": args.coolers}
    if year:
        doc["year"] = year
    return doc


def bins_csv_rows(year: dict) -> list[list]:
    """Header and one row per bin of ``YearResult.to_dict()``: scalar figures, then one column per
    stage for each per-cooler list (``cooler_outlet_temperatures_K[1]`` …), then the limit flags."""
    bins = year["bins"]
    if not bins:
        return [[]]
    first = bins[0]
    scalars = [k for k, v in first.items() if not isinstance(v, list)]
    lists = [k for k, v in first.items() if isinstance(v, list) and k not in ("warnings", "limit_flags")]
    n = len(first["cooler_outlet_temperatures_K"])
    header = scalars + [f"{k}[{i + 1}]" for k in lists for i in range(n)] + ["limit_flags"]
    rows = [header]
    for b in bins:
        rows.append([b[k] for k in scalars] + [b[k][i] for k in lists for i in range(n)]
                    + ["; ".join(b["limit_flags"])])
    return rows


def run(args) -> int:
    """Run the year of every project named; a project without a year section (and no
    ``--profile``) is rejected."""
    from stagewright.core import StagewrightError
    from stagewright.core.project import load
    from stagewright.core.year import run_year
    from stagewright.gui.cli.progress import Progress
    from stagewright.gui.cli.year_table import format_year

    status, outputs = EXIT_OK, []
    for path in expand_paths(args.files):
        try:
            doc = _with_profile(load(path), args)
            bars: list = []

            def tick(done: int, total: int) -> None:
                if not bars:
                    bars.append(Progress(total))
                bars[0].step(f"{path.name}: bin {done} of {total}")
            try:
                result = run_year(doc, progress=tick).to_dict()
            finally:
                for bar in bars:
                    bar.__exit__(None, None, None)
        except StagewrightError as exc:
            print(f"{path}: {exc}", file=sys.stderr)
            status = EXIT_INPUT
            continue
        outputs.append({"file": str(path), "title": doc.get("title", ""), "year": result})
    if args.csv and outputs:
        with open(args.csv, "w", newline="", encoding="utf-8") as fh:
            csv.writer(fh).writerows(bins_csv_rows(outputs[0]["year"]))
    if args.json and outputs:
        print(json.dumps(outputs[0]["year"] if len(outputs) == 1 else outputs, indent=2, allow_nan=False))
    elif not args.json:
        for o in outputs:
            print(format_year(o["title"], o["year"]))
            print()
    return status
