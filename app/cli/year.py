"""``stagewright year PROJECT.json … [--json]``: a year at the site (energy, cost, condensate)."""
from __future__ import annotations

__all__ = ["run"]

import json
import sys

from app.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths


def run(args) -> int:
    """Run the year of every project named; a project without a year section is rejected."""
    from thermo import StagewrightError
    from thermo.project import load
    from thermo.year import run_year
    from app.cli.progress import Progress
    from app.cli.year_table import format_year

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
