"""The ``stagewright`` command: open the workbench, or solve/check projects headless.

    stagewright [PROJECT.json]                 open the workbench (a demo when no file)
    stagewright --screenshot OUT.png [PROJECT] render the window offscreen and exit
    stagewright solve FILE|FOLDER … [--json]   solve projects, print tables or JSON
    stagewright check FILE|FOLDER …            validate project files
    stagewright year PROJECT.json … [--json]   a year at the site: annual energy, cost, condensate
    stagewright study PROJECT --max-stages N   staging options side by side (see app/study_cli.py)
    stagewright sweep PROJECT --axis FIELD=START:STOP:N …
                                               a grid of input values, one CSV row per point
    stagewright report FILE|FOLDER … [-o OUT] [--csv [OUT.csv]] [--units SI|US]
                                               PDF (and CSV) reports

Headless commands never import Qt. Every failure is one line on stderr; the exit
status is 0 when all files succeeded, 2 when any input was rejected.
"""
from __future__ import annotations

__all__ = ["main", "expand_paths"]

import argparse
import json
import sys
from pathlib import Path

EXIT_OK, EXIT_FAILED, EXIT_INPUT = 0, 1, 2


def expand_paths(items: list[str]) -> list[Path]:
    """Files named directly, plus every ``*.json`` in folders named, in sorted order."""
    out: list[Path] = []
    for item in items:
        p = Path(item)
        out.extend(sorted(p.glob("*.json")) if p.is_dir() else [p])
    return out


def _solve(args) -> int:
    from thermo import StagewrightError, solve
    from thermo.project import load
    from .solve_table import format_result

    from .progress import Progress

    status, outputs = EXIT_OK, []
    paths = expand_paths(args.files)
    with Progress(len(paths)) as bar:
        for path in paths:
            bar.step(path.name)
            try:
                doc = load(path)
                result = solve(doc).to_dict()
            except StagewrightError as exc:
                bar.message(f"{path}: {exc}")
                status = EXIT_INPUT
                outputs.append({"file": str(path), "error": str(exc)})
                continue
            outputs.append({"file": str(path), "title": doc.get("title", ""), "result": result})
    if args.json:
        ok = [o for o in outputs]
        payload = ok[0].get("result") if len(paths) == 1 and "result" in ok[0] else ok
        if not (len(paths) == 1 and "error" in ok[0]):
            print(json.dumps(payload, indent=2, allow_nan=False))
    else:
        for o in outputs:
            if "result" in o:
                print(format_result(o["title"], o["result"]))
                print()
    return status


def _check(args) -> int:
    from thermo import StagewrightError
    from thermo.project.parse import read_limited
    from thermo.project.reading import read_document
    from thermo.schema import FORMAT_VERSION

    status = EXIT_OK
    paths = expand_paths(args.files)
    for item in args.files:
        if Path(item).is_dir() and not any(Path(item).glob("*.json")):
            print(f"{item}: no *.json files in this folder")
            status = EXIT_INPUT
    for path in paths:
        try:
            _, declared = read_document(read_limited(path))
        except StagewrightError as exc:
            for problem in getattr(exc, "problems", None) or [exc]:
                print(f"{path}: {problem}")
            status = EXIT_INPUT
            continue
        ok = "ok" if declared == FORMAT_VERSION else \
            f"ok (format version {declared}; saving it upgrades it to version {FORMAT_VERSION})"
        single = len(args.files) == 1 and not Path(args.files[0]).is_dir()
        print(ok if single else f"{path}: {ok}")
    return status


def _study(args) -> int:
    from .study_cli import run
    return run(args)


def _sweep(args) -> int:
    from .sweep_cli import run
    return run(args)


def _report(args) -> int:
    from .report.batch import run_report
    return run_report(args, expand_paths)


def _year(args) -> int:
    from thermo import StagewrightError
    from thermo.project import load
    from thermo.year import run_year
    from .progress import Progress
    from .year_table import format_year

    status, outputs = EXIT_OK, []
    for path in expand_paths(args.files):
        try:
            doc = load(path)
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
    if args.json and outputs:
        print(json.dumps(outputs[0]["year"] if len(outputs) == 1 else outputs, indent=2, allow_nan=False))
    elif not args.json:
        for o in outputs:
            print(format_year(o["title"], o["year"]))
            print()
    return status


def _solve_arguments(p: argparse.ArgumentParser) -> None:
    p.add_argument("--json", action="store_true", help="machine-readable results (SI, unit in each key)")


def _report_arguments(p: argparse.ArgumentParser) -> None:
    from .report.batch import add_arguments
    add_arguments(p)


SUBCOMMANDS = {"solve": _solve, "check": _check, "report": _report, "study": _study, "year": _year,
               "sweep": _sweep}

#: sub-command -> function adding its own options to its parser
SUBCOMMAND_OPTIONS = {"solve": _solve_arguments, "report": _report_arguments, "year": _solve_arguments}


def _headless_parser(name: str) -> argparse.ArgumentParser:
    if name == "study":
        from .study_cli import build_parser
        return build_parser()
    if name == "sweep":
        from .sweep_cli import build_parser as sweep_parser
        return sweep_parser()
    p = argparse.ArgumentParser(prog=f"stagewright {name}")
    p.add_argument("files", nargs="+", help="project files or folders of them")
    SUBCOMMAND_OPTIONS.get(name, lambda _: None)(p)
    return p


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``stagewright`` console script."""
    argv = sys.argv[1:] if argv is None else list(argv)
    if argv and argv[0] in SUBCOMMANDS:
        args = _headless_parser(argv[0]).parse_args(argv[1:])
        try:
            return SUBCOMMANDS[argv[0]](args)
        except KeyboardInterrupt:
            return EXIT_FAILED
        except BrokenPipeError:  # output piped into e.g. `head`, which stopped reading
            import os
            os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
            return EXIT_FAILED
    p = argparse.ArgumentParser(prog="stagewright", description="Compression-train workbench.")
    p.add_argument("project", nargs="?", help="project file to open (default: a demo project)")
    p.add_argument("--screenshot", metavar="OUT.png", help="render the window offscreen to a PNG and exit")
    p.add_argument("--size", metavar="WxH", help="window size for --screenshot (default 1280x800)")
    args = p.parse_args(argv)
    from .gui_main import run_gui  # Qt is imported only here
    return run_gui(args.project, args.screenshot, size=args.size)


if __name__ == "__main__":
    sys.exit(main())
