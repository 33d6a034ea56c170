"""Progress spans and cancellation checks."""
import threading

import pytest

from stagewright.core.errors import StagewrightError
from stagewright.core.study.progress import ProgressSpan, StudyCancelled, cancel_check


def test_cancel_check_accepts_event_callable_and_none():
    ev = threading.Event()
    check = cancel_check(ev)
    assert check() is False
    ev.set()
    assert check() is True
    assert cancel_check(None)() is False
    assert cancel_check(lambda: 1)() is True
    with pytest.raises(TypeError):
        cancel_check(42)


def test_study_cancelled_is_a_stagewright_error_with_partial_results():
    err = StudyCancelled("stopped", [1, 2])
    assert isinstance(err, StagewrightError) and err.partial == [1, 2]


def test_progress_span_maps_sub_ranges_and_clamps():
    seen = []
    span = ProgressSpan(lambda f, m: seen.append((round(f, 12), m)))
    sub = span.sub(0.5, 1.0).sub(0.0, 0.5)
    sub.report(0.0, "a")
    sub.report(1.0, "b")
    sub.report(2.0, "c")
    assert seen == [(0.5, "a"), (0.75, "b"), (0.75, "c")]
    ProgressSpan(None).report(0.5, "nobody listens")
