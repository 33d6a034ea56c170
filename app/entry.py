"""The ``stagewright`` console script: a headless sub-command, or the workbench window.

    stagewright [PROJECT.json]                 open the workbench (a demo when no file)
    stagewright --screenshot OUT.png [PROJECT] render the window offscreen and exit
    stagewright --version | --help             the version; every sub-command with a line
    stagewright SUB-COMMAND …                  solve, check, report, study, year, sweep, …
                                               (see app/cli/main.py)

A first argument that names a sub-command is dispatched to it before any parsing here, so
``stagewright PROJECT.json`` still opens the window. Qt is imported only when the window is
asked for, CoolProp only by what solves (``--help`` and ``--version`` load neither).
"""
from __future__ import annotations

__all__ = ["main", "build_parser", "version_text"]

import argparse
import os
import re
import sys

#: a word that is no file: a mistyped sub-command rather than a project to open
_WORD = re.compile(r"[A-Za-z][A-Za-z-]*")


def version_text() -> str:
    """``stagewright 0.1.0 (CoolProp 6.8.0, Python 3.11.7)``, without importing CoolProp."""
    from importlib import metadata

    from stagewright.core import __version__

    try:
        coolprop = f"CoolProp {metadata.version('CoolProp')}, "
    except metadata.PackageNotFoundError:
        coolprop = ""
    return f"stagewright {__version__} ({coolprop}Python {sys.version.split()[0]})"


def build_parser() -> argparse.ArgumentParser:
    """The parser of ``stagewright`` without a sub-command; its help lists every sub-command."""
    from stagewright.gui.cli.main import overview
    from stagewright.gui.cli.paths import EXIT_STATUS_HELP

    p = argparse.ArgumentParser(
        prog="stagewright", formatter_class=argparse.RawDescriptionHelpFormatter,
        usage="stagewright [-h] [--version] [--screenshot OUT.png [--size WxH]] [PROJECT.json]\n"
              "       stagewright SUB-COMMAND [options] …",
        description="Compression-train workbench: without a sub-command it opens the window "
                    "(on PROJECT.json, or a demo project).",
        epilog=f"{overview()}\n\nexample:\n  stagewright plant.json              # open the window on a project\n"
               f"  stagewright check plant.json        # validate it without solving\n"
               f"  stagewright solve plant.json --json\n\n{EXIT_STATUS_HELP}")
    p.add_argument("--version", action="version", version=version_text())
    p.add_argument("project", nargs="?", metavar="PROJECT.json",
                   help="project file to open (default: a demo project)")
    p.add_argument("--screenshot", metavar="OUT.png", help="render the window offscreen to a PNG and exit")
    p.add_argument("--size", metavar="WxH", help="window size for --screenshot (default 1280x800)")
    return p


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``stagewright`` console script; returns the exit status."""
    from stagewright.gui.cli.main import SUBCOMMANDS, main as run_subcommand, parse_or_status

    argv = sys.argv[1:] if argv is None else list(argv)
    if argv and (argv[0] in SUBCOMMANDS or _WORD.fullmatch(argv[0]) and not os.path.exists(argv[0])):
        return run_subcommand(argv)  # a mistyped one (`stagewright slove …`): a usage error naming them
    args = parse_or_status(build_parser(), argv)
    if isinstance(args, int):
        return args
    # the property library parses on the other core while Qt loads and the window opens (without
    # holding the interpreter; the first solve waits for it)
    from stagewright.core.coolprop_adapter import load_library_in_background
    load_library_in_background()
    from stagewright.gui.window.launch import run_gui  # Qt is imported only here
    return run_gui(args.project, args.screenshot, size=args.size)


if __name__ == "__main__":
    sys.exit(main())
