"""Guard against a Qt binding that corrupts the interpreter (seen with PySide6 6.12.0 on
Python 3.11: every call of a void method dropped one reference to None, so a window crashed
with "deallocating None" after some ten thousand calls)."""
from __future__ import annotations

import sys

import pytest

pytest.importorskip("PySide6")


@pytest.mark.skipif(sys.version_info >= (3, 12), reason="None is immortal from Python 3.12 (PEP 683)")
def test_void_calls_keep_the_reference_count_of_none():
    from PySide6.QtCore import QObject, QTimer
    obj, timer = QObject(), QTimer()
    before = sys.getrefcount(None)
    for _ in range(500):
        obj.setObjectName("x")
        timer.start(1000)
        timer.stop()
    assert sys.getrefcount(None) - before >= -10  # allow unrelated noise, not 1500 lost references
