"""A one-line progress indication for long command-line batches, on stderr.

Shown only when stderr is a terminal and the batch has more than one file, so pipes, logs
and tests see nothing but the one-line-per-failure messages. Twenty lines of our own rather
than a dependency: all it needs is a carriage return.
"""
from __future__ import annotations

__all__ = ["Progress"]

import shutil
import sys
import time

from stagewright.gui.cli.terminal import EscapingStream, escape_controls


class Progress:
    """``with Progress(n) as bar: bar.step(name)`` prints ``[k/n] name  elapsed`` in place.

    Messages written through :meth:`message` clear the progress line first, so each failure
    keeps its own line.
    """

    def __init__(self, total: int, stream=None, enabled: bool | None = None) -> None:
        self.total = total
        self.stream = stream or sys.stderr
        isatty = getattr(self.stream, "isatty", lambda: False)()
        self.enabled = (isatty and total > 1) if enabled is None else enabled
        self.count = 0
        self.t0 = time.monotonic()
        self._shown = False
        # the progress line's own control sequences go to the real terminal; names are escaped
        self._raw = self.stream.raw if isinstance(self.stream, EscapingStream) else self.stream

    def __enter__(self) -> "Progress":
        return self

    def __exit__(self, *exc) -> None:
        self._clear()

    def _clear(self) -> None:
        if self._shown:
            self._raw.write("\r\033[K")
            self._raw.flush()
            self._shown = False

    def step(self, name: str) -> None:
        """Announce the next item (call before working on it)."""
        self.count += 1
        if not self.enabled:
            return
        width = shutil.get_terminal_size((80, 20)).columns
        text = escape_controls(f"[{self.count}/{self.total}] {name}  {time.monotonic() - self.t0:5.1f} s")
        self._raw.write("\r\033[K" + text[: max(width - 1, 10)])
        self._raw.flush()
        self._shown = True

    def message(self, text: str) -> None:
        """Print a message on its own line (e.g. one failure)."""
        self._clear()
        print(text, file=self.stream)
