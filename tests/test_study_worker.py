"""The study worker: studies run off the GUI thread; only the newest job answers; cancel
answers with what was finished; bad input fails with its field. Checks against the closed
form of staged perfect-gas compression (``fluids.compressible.isentropic_work_compression``,
C. Bell, fluids / ChEDL on PyPI) where a number is checked."""
from __future__ import annotations

import threading

import pytest

pytest.importorskip("pytestqt")

from fluids.compressible import isentropic_work_compression  # noqa: E402

from stagewright.gui.study.job import StudyRequest  # noqa: E402
from stagewright.gui.study.worker import StudyController  # noqa: E402
from conftest import make_doc  # noqa: E402

pytestmark = pytest.mark.gui

R_MOLAR, M_AIR = 8.314462618, 0.02896546  # J/(mol K) CODATA 2018; kg/mol (CoolProp's air)


def request(n=3, **kw) -> StudyRequest:
    doc = make_doc(model="constant_cp", stages=2, p_out=9e5, eta=0.8)
    doc["fluid"].update({"cp_J_kgK": R_MOLAR / M_AIR * 3.5, "k": 1.4})
    doc.update(kw.pop("doc_extra", {}))
    return StudyRequest(doc, n, 8000.0, 0.15, **kw)


@pytest.fixture
def controller(qtbot):
    c = StudyController()
    yield c
    c.shutdown()


def test_a_study_runs_in_another_thread_and_reports_progress(qtbot, controller, monkeypatch):
    import stagewright.core.study
    threads, fractions = [], []
    real = stagewright.core.study.compare_stagings

    def spy(*a, **kw):
        threads.append(threading.get_ident())
        return real(*a, **kw)
    monkeypatch.setattr(stagewright.core.study, "compare_stagings", spy)
    controller.progress.connect(lambda job, f, m: fractions.append(f))
    with qtbot.waitSignal(controller.finished, timeout=30_000) as blocker:
        controller.run(request(3))
    job, answer, seconds = blocker.args
    assert threads and threads[0] != threading.get_ident()
    assert fractions[-1] == 1.0 and fractions == sorted(fractions)
    rows = answer["cases"][0]["rows"]
    assert [r["stages"] for r in rows] == [1, 2, 3]
    w2 = isentropic_work_compression(T1=293.15, k=1.4, Z=1.0, P1=1e5, P2=3e5, eta=0.8) / M_AIR
    assert rows[1]["driver_power_W"] == pytest.approx(2 * w2, rel=1e-6)
    assert answer["complete"] and not controller.busy


def test_only_the_newest_study_answers(qtbot, controller):
    done = []
    controller.finished.connect(lambda job, answer, s: done.append((job, answer)))
    controller.run(request(8))
    with qtbot.waitSignal(controller.finished, timeout=30_000):
        last = controller.run(request(2))
    qtbot.waitUntil(lambda: not controller.busy, timeout=5000)
    assert [job for job, _ in done] == [last]
    assert len(done[0][1]["cases"][0]["rows"]) == 2


def test_cancel_answers_with_the_options_finished(qtbot, controller, monkeypatch):
    import stagewright.core.study
    real = stagewright.core.study.compare_stagings
    reached = threading.Event()

    def held(doc, max_stages=4, *, progress=None, cancel=None, **kw):
        def report(f, m):
            progress(f, m)
            if f > 0.0 and not reached.is_set():
                reached.set()
                cancel.wait(20)  # hold after the first option until cancelled
        return real(doc, max_stages, progress=report, cancel=cancel, **kw)
    monkeypatch.setattr(stagewright.core.study, "compare_stagings", held)
    controller.run(request(5))
    qtbot.waitUntil(reached.is_set, timeout=30_000)
    with qtbot.waitSignal(controller.cancelled, timeout=30_000) as blocker:
        controller.cancel()
    job, answer, message = blocker.args
    assert not answer["complete"] and "1 of 5" in message
    assert [r["stages"] for r in answer["cases"][0]["rows"]] == [1]
    assert not controller.busy


def test_bad_input_fails_with_its_field(qtbot, controller):
    req = request(3, variable="ambient_temperature_K", values=(400.0,))  # above the schema's 333.15 K
    with qtbot.waitSignal(controller.failed, timeout=30_000) as blocker:
        controller.run(req)
    job, message, field = blocker.args
    assert field == "site.ambient_temperature_K"
    assert "333.15" in message


def test_forget_drops_the_running_study(qtbot, controller):
    answers = []
    for sig in (controller.finished, controller.cancelled, controller.failed):
        sig.connect(lambda job, *a: answers.append(job))
    controller.run(request(8))
    controller.forget()
    assert not controller.busy
    # the thread runs jobs in order: any answer of the forgotten job would arrive before this one
    with qtbot.waitSignal(controller.finished, timeout=30_000):
        last = controller.run(request(1))
    assert answers == [last]
