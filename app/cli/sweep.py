"""``stagewright sweep``: a project solved over a grid of input values, headless (never imports Qt).

    stagewright sweep PROJECT.json --axis FIELD=START:STOP:N [--axis FIELD=V1,V2,…]
                      [-o OUT.csv] [--processes N]

Each ``--axis`` names a field of the project file by its path (``site.ambient_temperature_K``,
``discharge_pressure_Pa`` or ``discharge_gauge_pressure_Pa`` — an axis on one of these replaces a
project's statement in the other —, ``stages[0].efficiency.value`` …) and its values in SI units, as the
project file carries them; the grid is the product of the axes, the last one fastest. One CSV row
per grid point: the axis values, the totals of ``stagewright.core.sweep.SWEEP_OUTPUTS`` (SI, the unit in
each column name) and, for a point that cannot be solved, its message.

Grid points are solved on the fast property path (agreement with a full solve better than 1e-4
relative in every column; see ``thermo/sweep.py``); solve a chosen point with
``stagewright solve`` for its full balance. Exit status 0 when the grid was solved (points that
fail are rows with their message), 2 when the project, an axis or the output is refused, 1 when interrupted
or the output cannot be written. ``-o`` never writes over the project, and replaces an existing
file only with ``--force`` (app/cli/outputs.py).
"""
from __future__ import annotations

__all__ = ["build_parser", "run", "parse_axis"]

import argparse
import csv
import io
import math
import sys
from pathlib import Path

EXIT_OK, EXIT_INTERRUPTED, EXIT_INPUT = 0, 1, 2
MAX_AXIS_VALUES = 10_000


def build_parser() -> argparse.ArgumentParser:
    """Argument parser of the ``sweep`` sub-command."""
    p = argparse.ArgumentParser(prog="stagewright sweep",
                                description="Solve a project over a grid of input values; one CSV row per point.")
    p.add_argument("project", help="project file")
    p.add_argument("--axis", action="append", required=True, metavar="FIELD=START:STOP:N|FIELD=V1,V2,…",
                   help="a field path and its values in SI units: N evenly spaced values from START to STOP, "
                        "or a list; repeat for a grid")
    p.add_argument("-o", "--output", metavar="OUT.csv", help="CSV file (default: standard output)")
    p.add_argument("--force", action="store_true", help="replace OUT.csv if it exists (never the project file)")
    p.add_argument("--processes", type=int, metavar="N",
                   help="worker processes (default: every core for 2000 points or more, else 1)")
    return p


def parse_axis(text: str) -> tuple[str, list[float]]:
    """``FIELD=START:STOP:N`` or ``FIELD=V1,V2,…`` → (field path, values).

    Raises
    ------
    InputError
        Naming ``--axis``, the text given and the form expected.
    """
    from stagewright.core import InputError

    expected = (f"expected FIELD=START:STOP:N (N from 1 to {MAX_AXIS_VALUES}) or FIELD=V1,V2,… "
                "with finite values in SI units")
    field, sep, values = text.partition("=")
    field = field.strip()
    try:
        if ":" in values:
            start, stop, n = values.split(":")
            start, stop, count = float(start), float(stop), int(n)
            if not 1 <= count <= MAX_AXIS_VALUES:
                raise ValueError
            parsed = [start] if count == 1 else [start + k * (stop - start) / (count - 1) for k in range(count)]
        else:
            parsed = [float(v) for v in values.split(",") if v.strip()]
    except ValueError:
        parsed = []
    if not sep or not field or not parsed or len(parsed) > MAX_AXIS_VALUES or not all(map(math.isfinite, parsed)):
        raise InputError("--axis", text, expected)
    return field, parsed


def _reject_dead_axes(doc: dict, axes: dict) -> None:
    """An axis none of whose values gives a valid project (a misspelt field, a range wholly
    outside the schema) rejects the sweep with the first value's own message."""
    from stagewright.core import StagewrightError
    from stagewright.core.sweep import axis_problems

    bad = axis_problems(doc, axes)
    for field, values in axes.items():
        if all((field, float(v)) in bad for v in values):
            raise StagewrightError(bad[(field, float(values[0]))], field)


def run(args) -> int:
    """Run the sweep sub-command; returns the exit status."""
    from stagewright.core import StagewrightError
    from stagewright.core.project import load
    from stagewright.core.sweep import SWEEP_OUTPUTS, sweep

    from stagewright.gui.cli.progress import Progress

    if args.output:
        from stagewright.gui.cli.outputs import output_problems
        refused = output_problems([Path(args.project)], [Path(args.output)], force=args.force)
        if refused:  # before the sweep: its work would be lost
            print(f"-o {refused[0]}", file=sys.stderr)
            return EXIT_INPUT
    try:
        doc = load(args.project)
        axes: dict[str, list[float]] = {}
        for text in args.axis:
            field, values = parse_axis(text)
            axes[field] = values
        _reject_dead_axes(doc, axes)
        total = math.prod(len(v) for v in axes.values())
        with Progress(total, enabled=None if total > 1 else False) as bar:
            def tick(fraction: float, _message: str) -> None:
                bar.count = round(fraction * total) - 1
                bar.step("points solved")
            result = sweep(doc, axes, processes=args.processes, progress=tick)
    except StagewrightError as exc:
        print(f"{args.project}: {exc}", file=sys.stderr)
        return EXIT_INPUT
    except KeyboardInterrupt:
        print(f"{args.project}: sweep interrupted", file=sys.stderr)
        return EXIT_INTERRUPTED
    out = io.StringIO() if args.output else sys.stdout
    w = csv.writer(out)
    w.writerow(list(axes) + list(SWEEP_OUTPUTS) + ["error"])
    for i, point in enumerate(result.points):
        values = ["" if result.values[k][i] is None else repr(result.values[k][i]) for k in SWEEP_OUTPUTS]
        w.writerow([repr(v) for v in point] + values + [result.errors.get(i, "")])
    if args.output:
        from stagewright.gui.cli.outputs import write_text_atomically
        try:
            write_text_atomically(Path(args.output), out.getvalue())
        except OSError as exc:
            print(f"-o {args.output}: cannot write ({exc.strerror or exc}); nothing was written", file=sys.stderr)
            return EXIT_INTERRUPTED
    failed = len(result.errors)
    if failed:
        print(f"{args.project}: {failed} of {len(result.points)} points could not be solved (see the error column)",
              file=sys.stderr)
    return EXIT_OK
