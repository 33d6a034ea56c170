"""Text from files reaches the terminal as text, never as terminal commands.

A project file may hold anything in a title, a stage name or an unknown key's name: escape
sequences that clear the screen or move the cursor, a carriage return that overprints a line,
bidirectional-override characters that reverse what follows, or an unpaired surrogate (from a
``\\ud800`` escape) that cannot be encoded at all. While a sub-command runs, standard output and
standard error are wrapped (:func:`escaped_output`) so that every such character is printed as
a visible escape (``\\x1b``, ``\\r``, ``\\u202e``, ``\\ud800``); line feeds, tabs and the
``\\r\\n`` of CSV rows pass unchanged. Only :class:`stagewright.gui.cli.progress.Progress` writes its own
control sequence, to the unwrapped stream.
"""
from __future__ import annotations

__all__ = ["escape_controls", "EscapingStream", "escaped_output"]

import contextlib
import re
import sys

#: C0 controls but tab and line feed, a carriage return not starting a CRLF, DEL, C1 controls,
#: bidirectional embeddings/overrides/isolates, and lone surrogates
_UNSAFE = re.compile("[\x00-\x08\x0b-\x0c\x0e-\x1f\x7f-\x9f\u202a-\u202e\u2066-\u2069\ud800-\udfff]|\r(?!\n)")


def _escape(m: re.Match) -> str:
    code = ord(m.group())
    return f"\\x{code:02x}" if code < 0x100 else f"\\u{code:04x}"


def escape_controls(text: str) -> str:
    """``text`` with every character that would act on a terminal shown as an escape.

    Examples
    --------
    >>> escape_controls("ok\\x1b[2J\\rAll checks passed\\n")
    'ok\\\\x1b[2J\\\\x0dAll checks passed\\n'
    >>> escape_controls("a,b\\r\\n\\ud800")
    'a,b\\r\\n\\\\ud800'
    """
    return _UNSAFE.sub(_escape, text)


class EscapingStream:
    """A text stream that escapes :func:`escape_controls` characters on their way to ``raw``."""

    def __init__(self, raw) -> None:
        self.raw = raw

    def write(self, text: str) -> int:
        self.raw.write(escape_controls(text))
        return len(text)

    def writelines(self, lines) -> None:
        for line in lines:
            self.write(line)

    def __getattr__(self, name):  # flush, isatty, fileno, encoding … of the real stream
        return getattr(self.raw, name)


@contextlib.contextmanager
def escaped_output():
    """Wrap ``sys.stdout`` and ``sys.stderr`` in :class:`EscapingStream` for the block."""
    saved = sys.stdout, sys.stderr
    sys.stdout, sys.stderr = EscapingStream(saved[0]), EscapingStream(saved[1])
    try:
        yield
    finally:
        sys.stdout, sys.stderr = saved
