"""The headless sub-commands of ``stagewright``: one module each, dispatched from here.

    stagewright solve FILE|FOLDER … [--json]   solve projects, print tables or JSON
    stagewright check FILE|FOLDER …            validate project files
    stagewright year PROJECT.json … [--json]   a year at the site: annual energy, cost, condensate
    stagewright study PROJECT --max-stages N   staging options side by side (app/cli/study.py)
    stagewright sweep PROJECT --axis FIELD=START:STOP:N …
                                               a grid of input values, one CSV row per point
    stagewright compare PROJECT [--cases A,B] [--reference A] [--json|--csv]
                                               the cases of one project side by side
    stagewright report FILE|FOLDER … [-o OUT] [--csv [OUT.csv]] [--units SI|US] [--force]
                                               PDF (and CSV) reports
    stagewright uncertainty PROJECT … [--json] [--draws N]
                                               a field check's results with their uncertainty,
                                               contributors and verdicts on guarantees

Nothing here imports Qt or the window (``app/entry.py`` opens the window when no
sub-command is named). Outputs never replace an input, an existing file only with ``--force``
(``app/cli/outputs.py``). Every failure is one line on stderr; the exit status is 0 when
all files succeeded, 2 when any input was rejected.
"""
from __future__ import annotations

__all__ = ["main", "SUBCOMMANDS", "expand_paths"]

import argparse
import os
import sys

from stagewright.gui.cli import check, compare, report, solve, study, sweep, uncertainty, year
from stagewright.gui.cli.paths import EXIT_FAILED, expand_paths
from stagewright.gui.cli.terminal import escaped_output

#: sub-command -> module with ``run(args)`` and either ``build_parser()`` or ``add_arguments(p)``
#: (imported here, not by name at run time, so the import contracts see them; each module
#: imports the core only when it runs)
SUBCOMMANDS = {"solve": solve, "check": check, "report": report, "study": study, "year": year, "sweep": sweep,
               "uncertainty": uncertainty, "compare": compare}

#: sub-commands that take the ``solve`` options (``--json``)
_SOLVE_OPTIONS = ("year",)


def _parser(name: str, module) -> argparse.ArgumentParser:
    if hasattr(module, "build_parser"):
        return module.build_parser()
    p = argparse.ArgumentParser(prog=f"stagewright {name}")
    p.add_argument("files", nargs="+", help="project files or folders of them")
    if hasattr(module, "add_arguments"):
        module.add_arguments(p)
    elif name in _SOLVE_OPTIONS:
        solve.add_arguments(p)
    return p


def main(argv: list[str] | None = None) -> int:
    """Run one headless sub-command (``argv[0]``) and return its exit status.

    Raises
    ------
    SystemExit
        From argparse, when ``argv[0]`` is not a sub-command or its options are wrong.
    """
    argv = sys.argv[1:] if argv is None else list(argv)
    if not argv or argv[0] not in SUBCOMMANDS:
        argparse.ArgumentParser(prog="stagewright").error(
            f"expected one of {', '.join(SUBCOMMANDS)} (no sub-command opens the window)")
    module = SUBCOMMANDS[argv[0]]
    args = _parser(argv[0], module).parse_args(argv[1:])
    try:
        with escaped_output():  # text from files never acts on the terminal (app/cli/terminal.py)
            return module.run(args)
    except KeyboardInterrupt:
        return EXIT_FAILED
    except BrokenPipeError:  # output piped into e.g. `head`, which stopped reading
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return EXIT_FAILED


if __name__ == "__main__":
    sys.exit(main())
