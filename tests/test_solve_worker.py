"""The solve worker: results come back off the GUI thread; superseded jobs are dropped;
failures arrive as messages with their field."""
from __future__ import annotations

import threading

import pytest

pytest.importorskip("pytestqt")

from stagewright.gui.jobs.solve_worker import SolveController  # noqa: E402

pytestmark = pytest.mark.gui


@pytest.fixture
def controller(qtbot):
    c = SolveController(debounce_ms=5)
    yield c
    c.shutdown()


def test_only_the_newest_job_answers(qtbot, controller, doc_factory):
    done = []
    controller.finished.connect(lambda job, result, seconds: done.append((job, result)))
    controller.request(doc_factory(p_out=4e5))
    controller.request(doc_factory(p_out=6e5))
    with qtbot.waitSignal(controller.finished, timeout=30_000):
        last = controller.request(doc_factory(p_out=9e5), immediate=True)
    qtbot.wait(50)
    assert [job for job, _ in done] == [last]
    assert done[0][1]["delivery"]["pressure_Pa"] == pytest.approx(9e5)
    assert not controller.busy


def test_solves_run_in_another_thread(qtbot, controller, doc_factory, monkeypatch):
    import stagewright.core
    threads = []
    real = stagewright.core.solve

    def spy(doc):
        threads.append(threading.get_ident())
        return real(doc)
    monkeypatch.setattr(stagewright.core, "solve", spy)
    with qtbot.waitSignal(controller.finished, timeout=30_000):
        controller.request(doc_factory(), immediate=True)
    assert threads and threads[0] != threading.get_ident()


def test_a_failed_solve_reports_reason_and_field(qtbot, controller, doc_factory):
    # a measured discharge temperature below the isentropic one needs eta_s > 1: a second-law
    # violation (Çengel & Boles, 8th ed., §7-12: eta_s <= 1 for an adiabatic compressor)
    doc = doc_factory(kind="discharge_temperature", eta=300.0)
    with qtbot.waitSignal(controller.failed, timeout=30_000) as blocker:
        controller.request(doc, immediate=True)
    job, message, field = blocker.args
    assert field == "stages[0].efficiency.value_K"
    assert "second-law violation" in message


def test_cancel_drops_a_running_job(qtbot, controller, doc_factory):
    done = []
    controller.finished.connect(lambda *a: done.append(a))
    controller.request(doc_factory(), immediate=True)
    controller.cancel()
    qtbot.wait(300)
    assert done == [] and not controller.busy


def test_an_edit_while_idle_solves_without_the_debounce_wait(qtbot, doc_factory):
    c = SolveController(debounce_ms=60_000)  # a debounce no test would wait for
    try:
        with qtbot.waitSignal(c.finished, timeout=30_000):
            c.request(doc_factory(p_out=5e5))
        # while that answer is new and the solver idle, the next edit goes straight in too
        with qtbot.waitSignal(c.finished, timeout=30_000) as blocker:
            c.request(doc_factory(p_out=7e5))
        assert blocker.args[1]["delivery"]["pressure_Pa"] == pytest.approx(7e5)
    finally:
        c.shutdown()


def test_edits_during_a_solve_are_gathered_into_one_solve_of_the_newest(qtbot, doc_factory):
    c = SolveController(debounce_ms=50)
    done = []
    c.finished.connect(lambda job, result, seconds: done.append(result["delivery"]["pressure_Pa"]))
    try:
        c.request(doc_factory(p_out=4e5))  # starts at once
        c.request(doc_factory(p_out=6e5))  # the solver is busy: gathered
        c.request(doc_factory(p_out=8e5))  # gathered with it
        qtbot.waitUntil(lambda: not c.busy, timeout=30_000)
        assert done == [pytest.approx(8e5)]
    finally:
        c.shutdown()
