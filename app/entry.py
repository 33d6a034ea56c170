"""The ``stagewright`` console script: a headless sub-command, or the workbench window.

    stagewright [PROJECT.json]                 open the workbench (a demo when no file)
    stagewright --screenshot OUT.png [PROJECT] render the window offscreen and exit
    stagewright SUB-COMMAND …                  solve, check, report, study, year, sweep
                                               (see app/cli/main.py)

Qt is imported only when the window is asked for.
"""
from __future__ import annotations

__all__ = ["main"]

import argparse
import sys


def main(argv: list[str] | None = None) -> int:
    """Entry point of the ``stagewright`` console script; returns the exit status."""
    from stagewright.gui.cli.main import SUBCOMMANDS, main as run_subcommand

    argv = sys.argv[1:] if argv is None else list(argv)
    if argv and argv[0] in SUBCOMMANDS:
        return run_subcommand(argv)
    p = argparse.ArgumentParser(prog="stagewright", description="Compression-train workbench.",
                                epilog=f"sub-commands: {', '.join(SUBCOMMANDS)} (stagewright SUB -h)")
    p.add_argument("project", nargs="?", help="project file to open (default: a demo project)")
    p.add_argument("--screenshot", metavar="OUT.png", help="render the window offscreen to a PNG and exit")
    p.add_argument("--size", metavar="WxH", help="window size for --screenshot (default 1280x800)")
    args = p.parse_args(argv)
    from stagewright.gui.window.launch import run_gui  # Qt is imported only here
    return run_gui(args.project, args.screenshot, size=args.size)


if __name__ == "__main__":
    sys.exit(main())
