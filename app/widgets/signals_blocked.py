"""``with signals_blocked(widget):`` — programmatic updates that do not echo back as edits."""
from __future__ import annotations

__all__ = ["signals_blocked"]

from contextlib import contextmanager


@contextmanager
def signals_blocked(*widgets):
    previous = [w.blockSignals(True) for w in widgets]
    try:
        yield
    finally:
        for w, was in zip(widgets, previous):
            w.blockSignals(was)
