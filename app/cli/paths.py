"""What every sub-command shares: exit statuses and the files named on the command line.

Exit statuses (the same for every sub-command, listed in ``stagewright --help``):

====  ==============================================================================
0     everything asked for was done
1     failed otherwise: interrupted (Ctrl+C), or an output could not be written
2     an input was rejected: a project file (unreadable, not valid), a value given to an
      option (``--axis``, ``--vary``), an output refused before any work
64    usage error: the command line itself is wrong (an unknown option or sub-command, a
      missing argument, an option value of the wrong type); nothing was read
      (``EX_USAGE`` of BSD ``sysexits.h``)
====  ==============================================================================
"""
from __future__ import annotations

__all__ = ["EXIT_OK", "EXIT_FAILED", "EXIT_INPUT", "EXIT_USAGE", "EXIT_STATUS_HELP", "expand_paths"]

from pathlib import Path

EXIT_OK, EXIT_FAILED, EXIT_INPUT, EXIT_USAGE = 0, 1, 2, 64

#: the exit statuses as every ``--help`` ends with them
EXIT_STATUS_HELP = f"""exit status:
  {EXIT_OK}   done
  {EXIT_FAILED}   failed otherwise (interrupted, or an output could not be written)
  {EXIT_INPUT}   an input was rejected (a project file, an option's value, an output refused)
  {EXIT_USAGE}  usage error: the command line itself is wrong; nothing was read"""


def expand_paths(items: list[str]) -> list[Path]:
    """Files named directly, plus every ``*.json`` in folders named, in sorted order.

    Examples
    --------
    >>> [p.name for p in expand_paths(["a.json", "b.json"])]
    ['a.json', 'b.json']
    """
    out: list[Path] = []
    for item in items:
        p = Path(item)
        out.extend(sorted(p.glob("*.json")) if p.is_dir() else [p])
    return out
