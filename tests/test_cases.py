"""Cases of one project (issue: options side by side): a case is its standalone document, exactly.

The references here are the tool's own file round trip and solve of a standalone project (the
issue's check: "a case's results equal those of the same project written out as a standalone
file, exactly") and the definition of the stored differences (applying them to the base gives
the other design back).
"""
from __future__ import annotations

import itertools
import json

import pytest

import stagewright.core
from conftest import SAMPLES, make_doc
from stagewright.core.cases import compare_cases
from stagewright.core.errors import InputError
from stagewright.core.project import load, save
from stagewright.core.project.case_changes import apply_changes, base_document, differences
from stagewright.core.project.cases import (add_case, case_document, case_names, duplicate_case, make_base, remove_case,
                                  rename_case, unique_name)
from stagewright.core.project.validation import problems

SAMPLE_FILES = sorted(SAMPLES.glob("*.json"))


def _without_nulls(x):
    """Project data with null-valued keys dropped (a missing optional key and null mean the same)."""
    if isinstance(x, dict):
        return {k: _without_nulls(v) for k, v in x.items() if v is not None}
    if isinstance(x, list):
        return [_without_nulls(v) for v in x]
    return x


def _with_cases(path):
    doc = load(path)
    stages = doc["stages"]
    doc = add_case(doc, "Hot day", {"site.ambient_temperature_K": 308.15})
    doc = add_case(doc, "Efficient first stage", {"stages[0].efficiency": {"kind": "isentropic", "value": 0.86}})
    if len(stages) > 1:
        doc = add_case(doc, "One stage fewer", {"stages": stages[1:]})
    return doc


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_a_case_solves_exactly_as_the_same_project_saved_on_its_own(path, tmp_path):
    doc = _with_cases(path)
    assert problems(doc) == []
    outcomes = compare_cases(doc, with_year=False)
    assert [o.name for o in outcomes] == case_names(doc)
    for o in outcomes:
        file = tmp_path / f"{o.name}.json"
        save(case_document(doc, o.name), file)
        alone = load(file)
        assert "cases" not in alone and "snapshot" not in alone
        if o.result is None:  # a case may be refused (e.g. too hot); then alone it is refused the same way
            with pytest.raises(stagewright.core.StagewrightError) as err:
                stagewright.core.solve(alone)
            assert str(err.value) == o.error
            continue
        assert stagewright.core.solve(alone).to_dict() == o.result  # exactly, not approximately


def test_the_base_case_is_the_project_without_its_cases():
    doc = _with_cases(SAMPLE_FILES[0])
    base, = compare_cases(doc, ["Base"], with_year=False)
    plain = {k: v for k, v in doc.items() if k not in ("cases", "base_name")}
    assert base.result == stagewright.core.solve(plain).to_dict()


@pytest.mark.parametrize("a, b", list(itertools.permutations(SAMPLE_FILES, 2)),
                         ids=lambda p: p.stem)
def test_stored_differences_turn_one_design_into_the_other(a, b):
    base, other = load(a), base_document(load(b))  # a design: the file's cases are not part of it
    changes = differences(base, other)
    assert _without_nulls(apply_changes(base, changes)) == _without_nulls(other)
    assert differences(base, base) == {}


def test_a_change_deep_in_a_stage_is_stored_as_that_field_only():
    base = make_doc(stages=3)
    other = json.loads(json.dumps(base))
    other["stages"][2]["cooler"]["pressure_drop_Pa"] = 5000.0
    assert differences(base, other) == {"stages[2].cooler.pressure_drop_Pa": 5000.0}
    other["stages"].pop()
    assert list(differences(base, other)) == ["stages"]  # another stage count: the list as a whole


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_making_a_case_the_base_keeps_every_case_the_same_design(path):
    doc = _with_cases(path)
    before = {n: case_document(doc, n) for n in case_names(doc)}
    for name in case_names(doc)[1:]:
        new = make_base(doc, name)
        assert problems(new) == []
        assert case_names(new)[0] == name and sorted(case_names(new)) == sorted(case_names(doc))
        for n in case_names(doc):
            assert _without_nulls(case_document(new, n)) == _without_nulls(before[n]), (name, n)
        old_base = case_names(doc)[0]
        assert new["cases"][[c["name"] for c in new["cases"]].index(old_base)]["changes"]  # the old base differs


def test_rename_duplicate_remove():
    doc = add_case(make_doc(), "Summer", {"site.ambient_temperature_K": 303.15})
    doc = rename_case(doc, "Summer", "Hot summer")
    doc = rename_case(doc, "Base", "Design")
    assert case_names(doc) == ["Design", "Hot summer"]
    doc = duplicate_case(doc, "Hot summer")
    assert case_names(doc) == ["Design", "Hot summer", "Hot summer copy"]
    assert case_document(doc, "Hot summer copy") == case_document(doc, "Hot summer")
    assert unique_name(doc, "Hot summer") == "Hot summer 2"
    doc = remove_case(doc, "Hot summer")
    assert case_names(doc) == ["Design", "Hot summer copy"]
    with pytest.raises(InputError, match="cannot be removed"):
        remove_case(doc, "Design")
    with pytest.raises(InputError, match="already has a case named"):
        rename_case(doc, "Hot summer copy", "Design")
    with pytest.raises(InputError, match="expected one of the project's cases"):
        case_document(doc, "Winter")


def test_a_bad_change_is_a_problem_naming_the_case_and_the_field():
    doc = add_case(make_doc(), "Wet", {"site.relative_humidity": 1.5})
    found = problems(doc)
    assert len(found) == 1 and found[0].field == "cases[0].changes"
    assert "in case 'Wet', site.relative_humidity" in found[0].expected and found[0].value == 1.5
    doc = add_case(make_doc(), "Odd", {"format": "other"})
    assert "a case may change only" in problems(doc)[0].expected
    doc = add_case(make_doc(), "Past the end", {"stages[5].name": "x"})
    assert problems(doc)[0].field == "cases[0].changes"
    doc = make_doc()
    doc["cases"] = [{"name": "Base", "changes": {}}]
    assert problems(doc)[0].field == "cases[0].name"


@pytest.mark.parametrize("path", SAMPLE_FILES, ids=lambda p: p.stem)
def test_every_sample_with_cases_round_trips_through_save_and_load(path, tmp_path):
    doc = _with_cases(path)
    save(doc, tmp_path / "p.json")
    assert load(tmp_path / "p.json") == doc
