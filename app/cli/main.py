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
    stagewright datasheet PROJECT … [--json] [--units SI|US]
                                               the package's data sheet: ISO 1217 reference and site,
                                               full and part loads through its capacity control
    stagewright uncertainty PROJECT … [--json] [--draws N]
                                               a field check's results with their uncertainty,
                                               contributors and verdicts on guarantees

Each sub-command module has ``run(args)``, either ``build_parser()`` or ``add_arguments(p)``,
a one-line ``SUMMARY`` (``stagewright --help`` lists it) and ``EXAMPLES`` (the end of its own
``--help``, above the exit statuses). Importing a module must stay light: the core, the
presentation tables and CoolProp are imported inside ``run`` (``stagewright --help`` and
``check`` never load CoolProp; a test checks it).

Nothing here imports Qt or the window (``app/entry.py`` opens the window when no
sub-command is named). Outputs never replace an input, an existing file only with ``--force``
(``app/cli/outputs.py``). Every failure is one line on stderr; the exit statuses are those of
:mod:`stagewright.gui.cli.paths` (0 done, 1 failed, 2 an input rejected, 64 a usage error).
"""
from __future__ import annotations

__all__ = ["main", "SUBCOMMANDS", "expand_paths", "build_parser", "overview", "summary"]

import argparse
import os
import sys

from stagewright.gui.cli import check, compare, datasheet, report, solve, study, sweep, uncertainty, year
from stagewright.gui.cli.paths import EXIT_FAILED, EXIT_STATUS_HELP, EXIT_USAGE, expand_paths
from stagewright.gui.cli.terminal import escaped_output

#: sub-command -> module with ``run(args)`` and either ``build_parser()`` or ``add_arguments(p)``
#: (imported here, not by name at run time, so the import contracts see them; each module
#: imports the core only when it runs)
SUBCOMMANDS = {"solve": solve, "check": check, "report": report, "study": study, "year": year, "sweep": sweep,
               "uncertainty": uncertainty, "compare": compare, "datasheet": datasheet}

#: sub-commands that take the ``solve`` options (``--json``)
_SOLVE_OPTIONS = ("year",)


def summary(name: str) -> str:
    """One line saying what sub-command ``name`` does: its module's ``SUMMARY``, else the first
    line of its docstring."""
    module = SUBCOMMANDS[name]
    text = getattr(module, "SUMMARY", None) or (module.__doc__ or "").strip().splitlines()[0]
    return text.strip()


def overview() -> str:
    """Every sub-command with its line, as ``stagewright --help`` lists them."""
    width = max(len(n) for n in SUBCOMMANDS) + 2
    lines = ["sub-commands (stagewright SUB-COMMAND --help for its options and an example):"]
    lines += [f"  {name:<{width}}{summary(name)}" for name in SUBCOMMANDS]
    return "\n".join(lines)


def build_parser(name: str) -> argparse.ArgumentParser:
    """The argument parser of sub-command ``name``, its help ending with an example and the
    exit statuses."""
    module = SUBCOMMANDS[name]
    if hasattr(module, "build_parser"):
        p = module.build_parser()
    else:
        p = argparse.ArgumentParser(prog=f"stagewright {name}", description=summary(name))
        p.add_argument("files", nargs="+", help="project files or folders of them")
        if hasattr(module, "add_arguments"):
            module.add_arguments(p)
        elif name in _SOLVE_OPTIONS:
            solve.add_arguments(p)
    examples = getattr(module, "EXAMPLES", "").strip("\n")
    p.epilog = "\n\n".join(part for part in (examples, EXIT_STATUS_HELP) if part)
    p.formatter_class = argparse.RawDescriptionHelpFormatter
    return p


def parse_or_status(parser: argparse.ArgumentParser, argv: list[str]):
    """``parser.parse_args(argv)``, or the exit status when argparse stops: 0 after ``--help``
    or ``--version``, :data:`~stagewright.gui.cli.paths.EXIT_USAGE` after a usage error (argparse's own 2
    would read as a rejected input)."""
    try:
        return parser.parse_args(argv)
    except SystemExit as stop:
        code = stop.code if isinstance(stop.code, int) else EXIT_USAGE
        return EXIT_USAGE if code == 2 else code


def main(argv: list[str] | None = None) -> int:
    """Run one headless sub-command (``argv[0]``) and return its exit status.

    A command line argparse refuses (an unknown sub-command or option, a missing argument)
    prints the usage and returns :data:`~stagewright.gui.cli.paths.EXIT_USAGE`; ``--help`` prints the
    help and returns 0.
    """
    argv = sys.argv[1:] if argv is None else list(argv)
    if not argv or argv[0] not in SUBCOMMANDS:
        top = argparse.ArgumentParser(prog="stagewright", epilog=overview(),
                                      formatter_class=argparse.RawDescriptionHelpFormatter)
        return _unknown(top, argv)
    module = SUBCOMMANDS[argv[0]]
    args = parse_or_status(build_parser(argv[0]), argv[1:])
    if isinstance(args, int):
        return args
    try:
        with escaped_output():  # text from files never acts on the terminal (app/cli/terminal.py)
            return module.run(args)
    except KeyboardInterrupt:
        return EXIT_FAILED
    except BrokenPipeError:  # output piped into e.g. `head`, which stopped reading
        os.dup2(os.open(os.devnull, os.O_WRONLY), sys.stdout.fileno())
        return EXIT_FAILED


def _unknown(parser: argparse.ArgumentParser, argv: list[str]) -> int:
    """Usage error for a command line that names no sub-command."""
    import difflib

    given = argv[0] if argv else None
    close = difflib.get_close_matches(given, list(SUBCOMMANDS), n=1) if given else []
    what = f"{given!r} is not a sub-command" if given else "no sub-command given"
    hint = f" (did you mean {close[0]!r}?)" if close else ""
    try:
        parser.error(f"{what}{hint}; expected one of {', '.join(SUBCOMMANDS)} "
                     "(without a sub-command, stagewright opens the window)")
    except SystemExit:
        pass
    return EXIT_USAGE


if __name__ == "__main__":
    sys.exit(main())
