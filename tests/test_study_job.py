"""A study job of the window, Qt-free: a plain comparison is one case, a sensitivity run one
case per value, and a cancelled study answers with what it had finished.

Numbers are checked against the closed form of perfect-gas compression
(``fluids.compressible.isentropic_work_compression``, C. Bell, fluids / ChEDL on PyPI).
"""
from __future__ import annotations

import pytest
from fluids.compressible import isentropic_work_compression

from stagewright.gui.study.job import StudyRequest, partial_answer, run_request
from conftest import make_doc
from stagewright.core.study import StudyCancelled

R_MOLAR, M_AIR = 8.314462618, 0.02896546  # J/(mol K) CODATA 2018; kg/mol (CoolProp's air)


def doc():
    d = make_doc(model="constant_cp", stages=2, p_out=9e5, eta=0.8, cool_to=303.15)
    d["fluid"].update({"cp_J_kgK": R_MOLAR / M_AIR * 3.5, "k": 1.4})
    return d


def test_a_comparison_is_one_case():
    ans = run_request(StudyRequest(doc(), 3, 6000.0, 0.2))
    assert ans["variable"] is None and ans["complete"] and len(ans["cases"]) == 1
    rows = ans["cases"][0]["rows"]
    assert [r["stages"] for r in rows] == [1, 2, 3]
    assert rows[0]["operating_hours_per_year"] == 6000.0 and rows[0]["energy_price_per_kWh"] == 0.2
    assert ans["first_efficiency"] is None


def test_a_sensitivity_run_is_one_case_per_value():
    ans = run_request(StudyRequest(doc(), 2, 8000.0, 0.15, "ambient_temperature_K", (278.15, 298.15)))
    assert [c["value"] for c in ans["cases"]] == [278.15, 298.15]
    for case in ans["cases"]:
        w = isentropic_work_compression(T1=case["value"], k=1.4, Z=1.0, P1=1e5, P2=9e5, eta=0.8) / M_AIR
        assert case["rows"][0]["driver_power_W"] == pytest.approx(w, rel=1e-9)  # one stage: ratio 9


def test_a_cancelled_study_keeps_what_it_finished():
    fractions = []
    req = StudyRequest(doc(), 4, 8000.0, 0.15)
    with pytest.raises(StudyCancelled) as err:
        run_request(req, lambda f, m: fractions.append(f), lambda: len(fractions) > 2)
    ans = partial_answer(req, err.value.partial, str(err.value))
    assert not ans["complete"] and "2 of 4" in ans["message"]
    rows = ans["cases"][0]["rows"]
    assert [r["stages"] for r in rows] == [1, 2]
    assert "repeats the project's first stage" in rows[0]["note"]
    assert rows[1]["saving_W"] == pytest.approx(rows[0]["driver_power_W"] - rows[1]["driver_power_W"])
    assert partial_answer(req, [], "study cancelled")["cases"] == []


def test_trial_progress_counts_the_trial_solves_between_the_studys_reports():
    # the study asks whether to stop once as it starts an option and once before every trial
    # solve (stagewright.core.study.trials.TrialSolver); the count of the latter grows within an option,
    # starts again with the next, and ends at the option's own count of solves
    import re
    import threading

    from stagewright.gui.study.job import TrialProgress
    seen = []
    progress = TrialProgress(lambda f, m: seen.append((f, m)), threading.Event(), interval=0.0)
    ans = run_request(StudyRequest(doc(), 3, 6000.0, 0.2), progress.report, progress.cancel)
    assert ans["complete"]
    fractions = [f for f, _ in seen]
    assert fractions == sorted(fractions) and fractions[-1] == 1.0
    counts = [(m.split(" (")[0], int(re.search(r"\((\d+) trial solves?\)$", m).group(1)))
              for _, m in seen if "trial solve" in m]
    assert {name for name, _ in counts} >= {"optimising the 2-stage option", "optimising the 3-stage option"}
    for name in {name for name, _ in counts}:
        mine = [n for who, n in counts if who == name]
        assert mine == list(range(1, len(mine) + 1))  # 1, 2, 3 … within each option
    for row in ans["cases"][0]["rows"]:  # the last count of an option is its number of solves
        mine = [n for who, n in counts if who == f"optimising the {row['stages']}-stage option"]
        assert (mine[-1] if mine else 0) == row["solves"]
