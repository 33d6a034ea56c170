"""``stagewright solve FILE|FOLDER … [--json]``: the balance table, or results as JSON (SI)."""
from __future__ import annotations

__all__ = ["add_arguments", "run"]

import argparse
import json

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths


def add_arguments(p: argparse.ArgumentParser) -> None:
    """Options of ``solve`` (and ``year``) beyond the files."""
    p.add_argument("--json", action="store_true", help="machine-readable results (SI, unit in each key)")


def run(args) -> int:
    """Solve every file named; one line per rejected file; exit status 2 if any was rejected."""
    from stagewright.core import StagewrightError, solve
    from stagewright.core.project import load
    from stagewright.gui.cli.progress import Progress
    from stagewright.gui.cli.solve_table import format_result

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
        payload = outputs[0].get("result") if len(paths) == 1 and "result" in outputs[0] else outputs
        if not (len(paths) == 1 and "error" in outputs[0]):
            print(json.dumps(payload, indent=2, allow_nan=False))
    else:
        for o in outputs:
            if "result" in o:
                print(format_result(o["title"], o["result"]))
                print()
    return status
