"""Format versions: the upgrade chain is complete, every old version has a fixture, newer
versions are refused and left untouched.

Whoever bumps ``stagewright.core.project.schema.FORMAT_VERSION`` must add, for the old version n:
a step ``@step(n)`` in thermo/project/migrate.py, a fixture tests/fixtures/project_v<n+1>.json
(the old tests/fixtures/project_v<n>.json stays, frozen), and a test named
``test_step_<n>_to_<n+1>`` in this file that checks what the step changes.
"""
from __future__ import annotations

import json
import os
import re
import sys

import pytest

from tests.conftest import ROOT
from stagewright.core.project import schema
from stagewright.core.project.validation import problems
from stagewright.core.errors import ProjectFileError
from stagewright.core.project import load, migrate
from stagewright.core.project.migrate import migrate as migrate_doc

FIXTURES = ROOT / "tests" / "fixtures"


def _fixture_versions() -> list[int]:
    return sorted(int(m.group(1)) for p in FIXTURES.glob("project_v*.json")
                  if (m := re.fullmatch(r"project_v(\d+)\.json", p.name)))


def test_the_chain_has_a_step_from_every_older_version():
    assert sorted(migrate.STEPS) == list(range(1, schema.FORMAT_VERSION)), (
        "FORMAT_VERSION was bumped without an upgrade step: register @step(n) in thermo/project/migrate.py")
    assert migrate.oldest_readable() == 1


def test_there_is_a_fixture_for_every_version():
    assert _fixture_versions() == list(range(1, schema.FORMAT_VERSION + 1)), (
        "add tests/fixtures/project_v<n>.json for every format version (keep the old ones)")


def test_every_step_has_its_own_test():
    names = set(vars(sys.modules[__name__]))
    missing = [f"test_step_{v}_to_{v + 1}" for v in migrate.STEPS if f"test_step_{v}_to_{v + 1}" not in names]
    assert not missing, f"write {missing} in tests/test_project_migrate.py"


@pytest.mark.parametrize("version", _fixture_versions())
def test_each_fixture_declares_its_version_and_loads_as_current(version):
    path = FIXTURES / f"project_v{version}.json"
    raw = json.loads(path.read_text(encoding="utf-8"))
    assert raw["version"] == version
    doc = load(path)
    assert doc["version"] == schema.FORMAT_VERSION and problems(doc) == []


@pytest.mark.parametrize("version", _fixture_versions())
def test_migration_leaves_its_input_alone(version):
    raw = json.loads((FIXTURES / f"project_v{version}.json").read_text(encoding="utf-8"))
    copy = json.loads(json.dumps(raw))
    migrate_doc(raw)
    assert raw == copy


# --- the mechanism, with a step that exists only in this test ------------------------------

@pytest.fixture
def pretend_version_2(monkeypatch):
    """Pretend the format is at version 2 and a 1 → 2 step renames ``note`` to ``remarks``."""
    monkeypatch.setattr(schema, "FORMAT_VERSION", 2)
    monkeypatch.setattr(migrate, "STEPS", {})

    @migrate.step(1)
    def rename(doc):
        doc["remarks"] = doc.pop("note", "")
        return doc
    return rename


def test_chain_runs_the_steps_and_sets_the_version(pretend_version_2):
    doc, declared = migrate_doc({"version": 1, "note": "kept"})
    assert declared == 1 and doc == {"version": 2, "remarks": "kept"}
    assert migrate_doc({"version": 2, "remarks": "x"}) == ({"version": 2, "remarks": "x"}, 2)
    assert migrate_doc({"note": "no version key: version 1"})[0]["remarks"] == "no version key: version 1"


def test_a_step_cannot_be_registered_twice(pretend_version_2):
    with pytest.raises(ValueError, match="already registered"):
        migrate.step(1)(lambda d: d)


def test_a_broken_chain_refuses_what_it_cannot_reach(monkeypatch):
    monkeypatch.setattr(schema, "FORMAT_VERSION", 3)
    monkeypatch.setattr(migrate, "STEPS", {2: lambda d: d})  # 1 → 2 missing
    assert migrate.oldest_readable() == 2
    with pytest.raises(ProjectFileError, match="expected a project format version from 2 to 3"):
        migrate_doc({"version": 1})


# --- versions this release does not read -----------------------------------------------------

@pytest.mark.parametrize("value, match", [
    (schema.FORMAT_VERSION + 1, r"newer Stagewright \(project format version \d+\); this release reads versions up to"),
    (99, "Open it with a newer release; the file has not been changed"),
    (0, "expected a project format version from 1"),
    (-3, "expected a project format version from 1"),
    (1.5, "expected a whole number"),
    ("2", "expected a whole number"),
    (None, "expected a whole number"),
    (True, "expected a whole number"),
])
def test_unknown_versions_are_refused_and_the_file_is_untouched(tmp_path, value, match):
    doc = json.loads((FIXTURES / "project_v1.json").read_text(encoding="utf-8"))
    doc["version"] = value
    path = tmp_path / "future.json"
    path.write_text(json.dumps(doc, indent=2), encoding="utf-8")
    before = (path.read_bytes(), os.stat(path).st_mtime_ns)
    with pytest.raises(ProjectFileError, match=match) as info:
        load(path)
    assert info.value.field == "version"
    assert (path.read_bytes(), os.stat(path).st_mtime_ns) == before
    assert os.listdir(tmp_path) == ["future.json"]


def test_a_whole_float_version_is_read():
    doc = json.loads((FIXTURES / "project_v1.json").read_text(encoding="utf-8"))
    doc["version"] = 1.0
    upgraded, declared = migrate_doc(doc)
    assert declared == 1 and upgraded["version"] == schema.FORMAT_VERSION


# --- the steps ---------------------------------------------------------------------------------

def test_step_1_to_2():
    """Version 2 adds the gauge statement of the delivery pressure; a version-1 file keeps its
    absolute ``discharge_pressure_Pa`` with its meaning and solves exactly as before."""
    import stagewright.core

    raw = json.loads((FIXTURES / "project_v1.json").read_text(encoding="utf-8"))
    doc = migrate.STEPS[1](json.loads(json.dumps(raw)))  # the step alone
    assert doc == raw
    doc, declared = migrate_doc(raw)
    assert declared == 1 and doc["version"] == schema.FORMAT_VERSION
    assert {k: v for k, v in doc.items() if k != "version"} == {k: v for k, v in raw.items() if k != "version"}
    assert "discharge_gauge_pressure_Pa" not in doc
    assert stagewright.core.solve(doc).delivery.P == pytest.approx(raw["discharge_pressure_Pa"], rel=1e-9)


def test_step_2_to_3():
    """Version 3 adds cases and a results snapshot; a version-2 file is a project with one case,
    its base, and solves exactly as before."""
    import stagewright.core
    from stagewright.core.project.cases import case_document, case_names

    raw = json.loads((FIXTURES / "project_v2.json").read_text(encoding="utf-8"))
    assert migrate.STEPS[2](json.loads(json.dumps(raw))) == raw  # the step alone
    doc, declared = migrate_doc(raw)
    assert declared == 2 and doc["version"] == 3
    assert {k: v for k, v in doc.items() if k != "version"} == {k: v for k, v in raw.items() if k != "version"}
    assert case_names(doc) == ["Base"]
    assert stagewright.core.solve(case_document(doc)).to_dict() == stagewright.core.solve(raw).to_dict()
