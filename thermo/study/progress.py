"""Progress reports and cancellation for long studies (no threads here: the caller owns them)."""
from __future__ import annotations

__all__ = ["StudyCancelled", "cancel_check", "ProgressSpan"]

from typing import Any, Callable

from stagewright.core.errors import StagewrightError


class StudyCancelled(StagewrightError):
    """A study was cancelled by its caller between two solves.

    Attributes
    ----------
    partial : list
        Whatever was finished before the cancellation (for a staging comparison: the
        options already optimised, fewest stages first); may be empty.
    """

    def __init__(self, message: str = "study cancelled", partial: list | None = None):
        super().__init__(message, "")
        self.partial = list(partial or [])


def cancel_check(cancel: Any) -> Callable[[], bool]:
    """Turn ``None``, a ``threading.Event`` (anything with ``is_set``) or a callable into
    a function that tells whether the study should stop."""
    if cancel is None:
        return lambda: False
    if hasattr(cancel, "is_set"):
        return cancel.is_set
    if callable(cancel):
        return lambda: bool(cancel())
    raise TypeError("cancel must be None, a threading.Event or a callable returning bool")


class ProgressSpan:
    """Maps the progress of one part of a study onto a sub-range of the caller's [0, 1].

    Parameters
    ----------
    callback : callable or None
        ``callback(fraction, message)`` with fraction in [0, 1]; None reports nothing.
    start, stop : float
        The sub-range of the caller's fraction this span covers.
    """

    def __init__(self, callback: Callable[[float, str], Any] | None, start: float = 0.0, stop: float = 1.0):
        self.callback, self.start, self.stop = callback, start, stop

    def report(self, fraction: float, message: str) -> None:
        """Report ``fraction`` (0…1 of this span) with a short message."""
        if self.callback is not None:
            f = self.start + (self.stop - self.start) * min(1.0, max(0.0, fraction))
            self.callback(f, message)

    def sub(self, start: float, stop: float) -> "ProgressSpan":
        """The part [start, stop] (fractions of this span) as a span of its own."""
        width = self.stop - self.start
        return ProgressSpan(self.callback, self.start + width * start, self.start + width * stop)
