"""A generous wall-clock bound for "must not hang" checks (POSIX; SIGALRM in the main thread).

Not a timing assertion: the bound is many times what the work needs on a slow, shared
machine, and far below what the quadratic or worse behaviour it guards against takes.
"""
from __future__ import annotations

import contextlib
import signal

import pytest


class Hang(AssertionError):
    """The work did not finish within its bound."""


@contextlib.contextmanager
def finishes_within(seconds: float, what: str = "the work"):
    """Fail with :class:`Hang` if the body runs longer than ``seconds``."""
    if not hasattr(signal, "setitimer"):
        pytest.skip("needs SIGALRM")

    def _alarm(_signum, _frame):
        raise Hang(f"{what} took more than {seconds} s (a hang, or worse than linear time)")

    previous = signal.signal(signal.SIGALRM, _alarm)
    signal.setitimer(signal.ITIMER_REAL, seconds)
    try:
        yield
    finally:
        signal.setitimer(signal.ITIMER_REAL, 0)
        signal.signal(signal.SIGALRM, previous)
