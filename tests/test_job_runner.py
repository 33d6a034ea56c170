"""The background-job runner: work runs in its own thread; only the newest job's progress and
answer come back; cancel answers with what was finished; forget drops a job; errors arrive as
one-line messages naming field, value and range, a bug as "internal error", never a traceback.

These tests check the runner's own contract (threads and signals), so no physical value is
checked here: the out-of-range input comes from the project schema's own range
(``stagewright.core.project.schema``), not from a published source."""
from __future__ import annotations

import threading

import pytest

pytest.importorskip("pytestqt")

from PySide6.QtCore import Signal  # noqa: E402

from stagewright.gui.jobs.job_runner import JobCancelled, JobRunner  # noqa: E402

pytestmark = pytest.mark.gui

WAIT_MS = 10_000


def gated(payload, report, cancel):
    """Work for the tests: payload = (name, gate); waits for its gate, or for its cancel event
    unless its name starts with "stubborn" (a job that cannot stop before its gate opens)."""
    name, gate = payload
    report(0, name)
    while not gate.wait(0.01):
        if cancel.is_set() and not name.startswith("stubborn"):
            raise JobCancelled({"name": name, "done": 1}, f"{name} cancelled after 1 of 2 steps")
    report(1, name)
    return {"name": name, "thread": threading.get_ident()}


class GatedRunner(JobRunner):
    progress = Signal(int, int, str)

    def __init__(self, work=gated):
        super().__init__(work, what="the test job", thread_name="stagewright-test-job")


def record(runner):
    """Every signal the runner passes on, in order: (signal, job, first argument)."""
    seen = []
    for name in ("progress", "finished", "cancelled", "failed"):
        getattr(runner, name).connect(lambda job, first, *_rest, name=name: seen.append((name, job, first)))
    return seen


@pytest.fixture
def runner(qtbot):
    r = GatedRunner()
    yield r
    r.shutdown()


def test_work_runs_in_the_worker_thread_and_answers(qtbot, runner):
    seen = record(runner)
    open_gate = threading.Event()
    open_gate.set()
    with qtbot.waitSignal(runner.finished, timeout=WAIT_MS) as blocker:
        job = runner.run(("a", open_gate))
    answer_job, answer, seconds = blocker.args
    assert answer_job == job == runner.latest_job
    assert answer["name"] == "a" and answer["thread"] != threading.get_ident()
    assert seconds >= 0.0 and not runner.busy
    assert [s for s in seen if s[0] == "progress"] == [("progress", job, 0), ("progress", job, 1)]


def test_a_superseded_job_is_dropped(qtbot, runner):
    seen = record(runner)
    held, second_gate = threading.Event(), threading.Event()
    first = runner.run(("first", held))
    qtbot.waitUntil(lambda: ("progress", first, 0) in seen, timeout=WAIT_MS)
    second_gate.set()
    with qtbot.waitSignal(runner.finished, timeout=WAIT_MS) as blocker:
        second = runner.run(("second", second_gate))
        held.set()  # the first job now finishes too (its event is set: it may answer cancelled)
    qtbot.wait(100)
    assert blocker.args[1]["name"] == "second"
    assert {job for _, job, _ in seen if job != first} == {second}
    assert [s for s in seen if s[0] != "progress"] == [("finished", second, blocker.args[1])]
    assert not runner.busy


def test_a_job_superseded_while_queued_never_runs(qtbot):
    ran = []

    def work(payload, report, cancel):
        ran.append(payload[0])
        return gated(payload, report, cancel)
    r = GatedRunner(work)
    try:
        held, open_gate = threading.Event(), threading.Event()
        open_gate.set()
        r.run(("stubborn", held))
        qtbot.waitUntil(lambda: ran == ["stubborn"], timeout=WAIT_MS)
        r.run(("queued", open_gate))  # queued behind "running"…
        with qtbot.waitSignal(r.finished, timeout=WAIT_MS) as blocker:
            r.run(("newest", open_gate))  # …and superseded before it started
            held.set()
        assert blocker.args[1]["name"] == "newest"
        assert ran == ["stubborn", "newest"]
    finally:
        r.shutdown()


def test_cancel_answers_with_what_was_finished(qtbot, runner):
    seen = record(runner)
    job = runner.run(("long", threading.Event()))
    qtbot.waitUntil(lambda: ("progress", job, 0) in seen, timeout=WAIT_MS)
    assert runner.busy
    with qtbot.waitSignal(runner.cancelled, timeout=WAIT_MS) as blocker:
        runner.cancel()
    assert blocker.args == [job, {"name": "long", "done": 1}, "long cancelled after 1 of 2 steps"]
    assert not runner.busy
    assert [s[0] for s in seen] == ["progress", "cancelled"]


def test_a_job_cancelled_while_queued_still_answers(qtbot, runner):
    # the newest job must answer even if Cancel came before it started, or busy would stay on
    held = threading.Event()
    runner.run(("stubborn", held))
    with qtbot.waitSignal(runner.cancelled, timeout=WAIT_MS) as blocker:
        job = runner.run(("queued", threading.Event()))
        runner.cancel()
        held.set()
    assert blocker.args[0] == job and blocker.args[1]["name"] == "queued"
    assert not runner.busy


def test_forget_drops_the_running_job(qtbot, runner):
    seen = record(runner)
    held, open_gate = threading.Event(), threading.Event()
    open_gate.set()
    forgotten = runner.run(("forgotten", held))
    runner.forget()
    assert not runner.busy
    # jobs run in order: any answer of the forgotten one would arrive before the next one's
    with qtbot.waitSignal(runner.finished, timeout=WAIT_MS):
        last = runner.run(("last", open_gate))
    assert forgotten != last
    assert {job for _, job, _ in seen} == {last}


def test_bad_input_fails_with_field_value_and_range(qtbot):
    from stagewright.core.project.validation import normalise

    from conftest import make_doc
    doc = make_doc()
    doc["site"]["ambient_temperature_K"] = 400.0  # above the schema's 333.15 K (thermo/project/schema.py)
    r = JobRunner(lambda d, report, cancel: normalise(d), what="the test job", thread_name="stagewright-test-job")
    try:
        with qtbot.waitSignal(r.failed, timeout=WAIT_MS) as blocker:
            r.run(doc)
        job, message, field = blocker.args
        assert field == "site.ambient_temperature_K"
        assert "site.ambient_temperature_K" in message and "400" in message and "333.15" in message
        assert "Traceback" not in message and not r.busy
    finally:
        r.shutdown()


def test_a_bug_in_the_work_is_an_internal_error_message(qtbot, capfd):
    def broken(payload, report, cancel):
        return {}["missing_key"]
    r = JobRunner(broken, what="the test job", thread_name="stagewright-test-job")
    try:
        with qtbot.waitSignal(r.failed, timeout=WAIT_MS) as blocker:
            r.run(None)
        job, message, field = blocker.args
        assert message == "internal error in the test job: KeyError: 'missing_key'"
        assert field == "" and not r.busy
        assert "Traceback" in capfd.readouterr().err  # for the developer, on stderr only
    finally:
        r.shutdown()


def test_shutdown_frees_the_thread_states_in_the_worker_thread(qtbot, monkeypatch):
    import importlib
    solve_module = importlib.import_module("stagewright.core.solve")  # stagewright.core.solve is also the function
    freed = []
    monkeypatch.setattr(solve_module, "release_thread_models", lambda: freed.append(threading.get_ident()))
    r = GatedRunner()
    assert r._thread.isRunning()
    r.shutdown()
    assert not r._thread.isRunning()
    assert len(freed) == 1 and freed[0] != threading.get_ident()


def test_a_job_outliving_the_shutdown_wait_does_not_abort_the_process(tmp_path):
    # issue 22 item 5: "QThread: Destroyed while thread is still running", then an abort on close
    import subprocess
    import sys
    import textwrap

    from tests.conftest import ROOT

    script = tmp_path / "outlive.py"
    script.write_text(textwrap.dedent("""
        import sys, threading, time
        sys.path.insert(0, sys.argv[1])
        from PySide6.QtCore import QCoreApplication
        from stagewright.gui.jobs.job_runner import JobRunner
        app = QCoreApplication([])
        started = threading.Event()
        def work(payload, report, cancel):
            started.set()
            time.sleep(float(sys.argv[2]))  # a long step that does not look at its cancel event
            return 1
        runner = JobRunner(work, what="test", thread_name="outliving")
        runner.start(None)
        started.wait(5)
        runner.shutdown(timeout_ms=100)
        runner.deleteLater()
        del runner
        app.processEvents()
        import gc; gc.collect()
        print("closed", flush=True)
    """), encoding="utf-8")
    for sleep_s in ("1.0", "30"):  # ends during the exit grace; outlasts it
        proc = subprocess.run([sys.executable, str(script), str(ROOT), sleep_s], capture_output=True, text=True,
                              timeout=60, env={"QT_QPA_PLATFORM": "offscreen", "PATH": "/usr/bin:/bin"})
        assert proc.returncode == 0 and proc.stdout.strip() == "closed", (sleep_s, proc.returncode, proc.stderr)
        assert "Destroyed while thread" not in proc.stderr
