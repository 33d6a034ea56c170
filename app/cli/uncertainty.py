"""``stagewright uncertainty PROJECT … [--json] [--draws N] [--seed S] [--no-monte-carlo]``.

The uncertainty of a field check: each result with its expanded uncertainty (k = 2) by
first-order propagation through the solve, checked by Monte Carlo, the largest contributors,
and a verdict per guaranteed figure. Reads the project's ``field_check`` section.
"""
from __future__ import annotations

__all__ = ["add_arguments", "format_uncertainty", "run"]

import json
import sys

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths


def add_arguments(p) -> None:
    """Options of ``stagewright uncertainty``."""
    p.add_argument("--json", action="store_true", help="print JSON instead of tables")
    p.add_argument("--draws", type=int, default=None, help="Monte Carlo draws (default: the project's, 10 000)")
    p.add_argument("--seed", type=int, default=None, help="seed of the draws (default: the project's)")
    p.add_argument("--no-monte-carlo", action="store_true", help="first-order propagation only")
    p.add_argument("--processes", type=int, default=1, help="worker processes for the Monte Carlo draws")
    p.add_argument("--units", choices=("SI", "US"), default="SI", help="display units of the tables")


def _table(header: tuple, rows: list[list[str]]) -> str:
    widths = [max(len(h), *(len(r[j]) for r in rows)) if rows else len(h) for j, h in enumerate(header)]
    lines = ["  ".join(h.ljust(w) for h, w in zip(header, widths)).rstrip(),
             "  ".join("-" * w for w in widths)]
    lines += ["  ".join(c.ljust(w) if j in (0, len(header) - 1) else c.rjust(w)
                        for j, (c, w) in enumerate(zip(r, widths))).rstrip() for r in rows]
    return "\n".join(lines)


def format_uncertainty(title: str, d: dict, system: str = "SI") -> str:
    """Plain-text tables of a field check's uncertainty (``FieldCheckUncertainty.to_dict()``)."""
    from stagewright.gui.presentation import uncertainty_table as ut
    parts = [f"Field check uncertainty — {title or 'untitled project'}", "",
             _table(ut.INPUT_COLUMNS, ut.input_rows(d, system)), "",
             _table(ut.FIGURE_COLUMNS, ut.figure_rows(d, system))]
    if d["verdicts"]:
        parts += ["", _table(ut.VERDICT_COLUMNS, ut.verdict_rows(d, system))]
    parts += [""] + ut.notes(d)
    return "\n".join(parts)


def _ticker(bar, name: str):
    """``progress(fraction, message)`` that moves ``bar`` (a Progress of 100 steps) by whole per cent."""
    shown = [-1]

    def tick(fraction: float, message: str) -> None:
        if int(100 * fraction) != shown[0]:
            shown[0] = int(100 * fraction)
            bar.count = shown[0] - 1
            bar.step(f"{name}: {message}")
    return tick


def run(args) -> int:
    """Report the field-check uncertainty of every project named."""
    from stagewright.gui.cli.progress import Progress
    from stagewright.core import StagewrightError
    from stagewright.core.project import load
    from stagewright.core.uncertainty.field_check import field_check_uncertainty

    status, outputs = EXIT_OK, []
    for path in expand_paths(args.files):
        try:
            doc = load(path)
            with Progress(100) as bar:
                result = field_check_uncertainty(doc, monte_carlo=not args.no_monte_carlo, draws=args.draws,
                                                 seed=args.seed, processes=max(1, args.processes),
                                                 progress=_ticker(bar, path.name)).to_dict()
        except StagewrightError as exc:
            print(f"{path}: {exc}", file=sys.stderr)
            status = EXIT_INPUT
            continue
        outputs.append({"file": str(path), "title": doc.get("title", ""), "uncertainty": result})
    if args.json and outputs:
        print(json.dumps(outputs[0]["uncertainty"] if len(outputs) == 1 else outputs, indent=2, allow_nan=False))
    elif not args.json:
        for o in outputs:
            print(format_uncertainty(o["title"], o["uncertainty"], args.units))
            print()
    return status
