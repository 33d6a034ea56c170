"""``stagewright year PROJECT.json … [--json] [--profile HOURLY.csv [--bin [K]]] [--csv OUT.csv]``.

A year at the site (energy, cost, condensate, coolers): the project's own ``year`` section, or a
profile read from an hourly or logged CSV file (:mod:`stagewright.gui.document.year_csv`; units in its header
or chosen with ``--temperature-unit`` / ``--humidity-unit``), optionally binned by temperature and
humidity (:func:`stagewright.core.year_profile.bin_profile`). ``--coolers design_once`` sizes the coolers
once and rates every bin at that UA. ``--csv OUT`` writes every bin as one row (SI, unit in each
column name, one header row): CSV, or Parquet / Excel by the suffix with the optional ``tables``
extra (:mod:`stagewright.gui.cli.tables`); like ``sweep -o`` it never writes over an input and replaces an
existing file only with ``--force``. ``--json`` prints a list, an entry per file (as ``solve
--json``). Progress on a terminal; Ctrl+C stops the run.
"""
from __future__ import annotations

__all__ = ["run", "add_arguments", "bins_csv_rows", "SUMMARY", "EXAMPLES"]

import argparse
import json
import sys
from pathlib import Path

from stagewright.gui.presentation.year_tables import bins_csv_rows  # kept importable from here

from stagewright.gui.cli.outputs import FORCE_HELP
from stagewright.gui.cli.paths import EXIT_FAILED, EXIT_INPUT, EXIT_OK, expand_paths

#: one line in ``stagewright --help``
SUMMARY = 'a year at the site: annual energy, cost, condensate and cooling water, bin by bin'
#: the end of ``stagewright year --help``
EXAMPLES = """\
examples:
  stagewright year plant.json
  stagewright year plant.json --profile hourly.csv --bin 2 --csv bins.csv
  stagewright year plant.json --csv bins.xlsx      # .parquet or .xlsx need the "tables" extra

--json prints one list for one file or several, as solve --json does.
"""

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
    p.add_argument("--csv", metavar="OUT",
                   help="write every bin as a row (SI, unit in each column name): .csv, or .parquet / .xlsx "
                        "with the optional 'tables' extra")
    p.add_argument("--force", action="store_true", help=FORCE_HELP)


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


def run(args) -> int:
    """Run the year of every project named; a project without a year section (and no
    ``--profile``) is rejected."""
    from stagewright.core import StagewrightError
    from stagewright.core.project import load
    from stagewright.core.year import run_year
    from stagewright.gui.cli.progress import Progress
    from stagewright.gui.cli.year_table import format_year

    paths = expand_paths(args.files)
    if args.csv:
        refused = _csv_refused(paths, args)
        if refused:  # before any work: it would be lost
            print(refused, file=sys.stderr)
            return EXIT_INPUT
    status, outputs = EXIT_OK, []
    for path in paths:
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
            outputs.append({"file": str(path), "error": str(exc)})
            continue
        outputs.append({"file": str(path), "title": doc.get("title", ""), "year": result})
    if args.csv and "year" in outputs[0]:
        from stagewright.gui.cli.tables import write_table
        table = bins_csv_rows(outputs[0]["year"])
        try:
            write_table(Path(args.csv), table[0], table[1:])
        except OSError as exc:
            print(f"--csv {args.csv}: cannot write ({exc.strerror or exc}); nothing was written", file=sys.stderr)
            status = status or EXIT_FAILED
    if args.json:  # one shape for one file and for several, as solve --json
        print(json.dumps(outputs, indent=2, allow_nan=False))
    else:
        for o in outputs:
            if "year" in o:
                print(format_year(o["title"], o["year"]))
                print()
    return status


def _csv_refused(paths: list[Path], args) -> str | None:
    """Why ``--csv`` may not be written (checked before any work), or None."""
    from stagewright.gui.cli.outputs import output_problems
    from stagewright.gui.cli.tables import format_problem

    if len(paths) != 1:
        return f"--csv {args.csv}: the bins of one project at a time ({len(paths)} projects named)"
    inputs = paths + ([Path(args.profile)] if args.profile else [])
    refused = output_problems(inputs, [Path(args.csv)], force=args.force) + [p for p in [format_problem(args.csv)] if p]
    return f"--csv {refused[0]}" if refused else None
