"""``stagewright report``: PDF (and CSV) reports for one project, several, or a folder of them.

Keeps going past a bad file: each failure is one line on stderr, and the exit status at
the end is 2 if any input was rejected, 1 if anything else failed (an unwritable output,
say), 0 when every report was written.
"""
from __future__ import annotations

__all__ = ["run", "add_arguments", "output_paths"]

import argparse
import sys
from pathlib import Path

from stagewright.gui.cli.outputs import FORCE_HELP, output_problems
from stagewright.gui.cli.paths import EXIT_FAILED, EXIT_INPUT, EXIT_OK, expand_paths


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Options of ``report`` beyond the files."""
    p.add_argument("-o", "--output", metavar="OUT",
                   help="PDF file for one project, or a folder for several "
                        "(default: each project's name with .pdf, beside it)")
    p.add_argument("--csv", nargs="?", const="", default=None, metavar="OUT.csv",
                   help="also write the balance sheet as CSV (file for one project; "
                        "without a value: beside each PDF)")
    p.add_argument("--units", choices=("SI", "US"), default="SI", help="display units (default SI)")
    p.add_argument("--force", action="store_true", help=FORCE_HELP)
    p.add_argument("--stagings", type=int, choices=range(1, 9), metavar="N", default=None,
                   help="also compare 1 … N stages, each at its optimum split, and print the comparison")
    p.add_argument("--prepared-by", metavar="NAME", default=None,
                   help="who made the report, printed on its first page (default: your user account's name)")


def output_paths(paths: list[Path], output: str | None, csv: str | None) -> list[tuple[Path, Path | None]]:
    """(PDF, CSV or None) to write for each project file."""
    single = len(paths) == 1 and output is not None and not Path(output).is_dir() and output.lower().endswith(".pdf")
    out = []
    for path in paths:
        if single:
            pdf = Path(output)
        elif output is not None:
            pdf = Path(output) / (path.stem + ".pdf")
        else:
            pdf = path.with_suffix(".pdf")
        if csv is None:
            out.append((pdf, None))
        elif csv and len(paths) == 1:
            out.append((pdf, Path(csv)))
        else:
            out.append((pdf, pdf.with_suffix(".csv")))
    return out


def run(args) -> int:
    """Write the reports asked for on the command line; returns the exit status."""
    from stagewright.core import StagewrightError, solve
    from stagewright.core.project import load

    from stagewright.gui.cli.progress import Progress
    from stagewright.gui.report import export_report

    paths = expand_paths(args.files)
    if len(paths) > 1 and args.output and args.output.lower().endswith(".pdf"):
        print(f"-o {args.output}: several projects need a folder for their reports, not one PDF file",
              file=sys.stderr)
        return EXIT_INPUT
    if len(paths) > 1 and args.csv:
        print(f"--csv {args.csv}: give --csv without a file name for several projects (one CSV beside each PDF)",
              file=sys.stderr)
        return EXIT_INPUT
    plan = output_paths(paths, args.output, args.csv)
    refused = output_problems(paths, [f for pair in plan for f in pair if f is not None],
                              force=getattr(args, "force", False), create_folders=True)
    if refused:  # before any work: nothing is written when one output may not be
        for line in refused:
            print(line, file=sys.stderr)
        return EXIT_INPUT
    status = EXIT_OK
    with Progress(len(paths)) as bar:
        for path, (pdf, csv_path) in zip(paths, plan):
            bar.step(path.name)
            try:
                doc = load(path)
                pdf.parent.mkdir(parents=True, exist_ok=True)
                result = solve(doc)
                rows = None
                if getattr(args, "stagings", None):
                    from stagewright.core.study import compare_stagings
                    rows = compare_stagings(doc, args.stagings).rows()
                export_report(doc, result, pdf, csv_path, system=args.units, source_name=path.name,
                              study_rows=rows, prepared_by=getattr(args, "prepared_by", None))
            except StagewrightError as exc:
                bar.message(f"{path}: {exc}")
                status = max(status, EXIT_INPUT)
            except OSError as exc:
                bar.message(f"{path}: cannot write the report {pdf} ({exc.strerror or exc})")
                status = status or EXIT_FAILED
            except Exception as exc:  # a bug must not stop a batch; it still gets its own line
                bar.message(f"{path}: report failed: {type(exc).__name__}: {exc}")
                status = status or EXIT_FAILED
    return status
