"""Reading project files: every rejection says where (field path, or line and column).

Reference for what is valid JSON: RFC 8259, *The JavaScript Object Notation (JSON) Data
Interchange Format* (IETF, 2017); Python's standard ``json`` module is used as the
independent reader of what we write.
"""
from __future__ import annotations

import json
import os
import re

import pytest

from tests.conftest import SAMPLES, make_doc
from stagewright.core.errors import InputError, ProjectFileError, StagewrightError
from stagewright.core.project import dumps, load, loads, save
from stagewright.core.project.schema import FORMAT_VERSION

FIXTURE_V1 = SAMPLES.parent / "tests" / "fixtures" / "project_v1.json"


def _text(doc) -> str:
    return json.dumps(doc, indent=2)


def test_load_returns_the_document_with_format_and_version(tmp_path):
    doc = make_doc()
    p = tmp_path / "a.json"
    p.write_text(json.dumps(doc), encoding="utf-8")
    got = load(p)
    assert got == {"format": "stagewright-project", "version": FORMAT_VERSION, **doc}


@pytest.mark.parametrize("text, line, column", [
    ('{\n  "title": "x"\n  "note": "y"\n}', 3, 3),          # missing comma
    ('{"title": "x",}', 1, 15),                              # trailing comma (RFC 8259 §4)
    ('{"title": \'x\'}', 1, 11),                             # single quotes are not JSON
    ('{"title": "x"', 1, 14),                                # truncated
    ("", 1, 1),                                              # empty file
])
def test_broken_json_names_line_and_column(text, line, column):
    # positions as the standard json module reports them (1-based line and column)
    ref = pytest.raises(json.JSONDecodeError, json.loads, text).value
    assert (ref.lineno, ref.colno) == (line, column)
    with pytest.raises(ProjectFileError, match=rf"^line {line}, column {column}: broken JSON") as info:
        loads(text)
    assert (info.value.line, info.value.column) == (line, column)


@pytest.mark.parametrize("mutate, field, expected", [
    (lambda d: d.update(discharge_pressure_Pa="9 bar"), r"discharge_pressure_Pa: '9 bar'", "expected a number"),
    (lambda d: d["site"].update(ambient_temperature_K=None), r"site\.ambient_temperature_K: None", "expected a number"),
    (lambda d: d.update(stages={}), r"stages: \{\}", "expected a list"),
    (lambda d: d["stages"][0].update(efficiency=0.8), r"stages\[0\]\.efficiency: 0\.8", "expected an object"),
    (lambda d: d.pop("flow"), r"flow: None", "required key is missing"),
    (lambda d: d["site"].pop("ambient_temperature_K"), r"site\.ambient_temperature_K", r"missing; expected a number in \[223\.15, 333\.15\] K"),
    (lambda d: d.update(colour="red"), r"colour: 'red'", "unknown key; known keys here: .*discharge_pressure_Pa"),
    (lambda d: d["stages"][1]["cooler"].update(fins=4), r"stages\[1\]\.cooler\.fins: 4", "unknown key"),
    (lambda d: d["stages"][0]["efficiency"].update(value=1.5), r"stages\[0\]\.efficiency\.value: 1\.5", r"\[0\.001, 1\]"),
    (lambda d: d["flow"].update(value=-2.0), r"flow\.value: -2\.0", r"\[1e-06, 1000\] kg/s"),
    (lambda d: d["flow"].update(kind="litres"), r"flow\.kind: 'litres'", "expected one of 'mass'"),
    (lambda d: d.update(version=True), r"version: True", "whole number"),
])
def test_validation_names_field_value_and_expected(mutate, field, expected):
    doc = make_doc()
    mutate(doc)
    with pytest.raises(StagewrightError) as info:
        loads(_text(doc))
    lines = [str(p) for p in getattr(info.value, "problems", [info.value])]
    assert any(re.search(field + ".*" + expected, line) for line in lines), lines


def test_every_problem_is_listed_at_once():
    doc = make_doc()
    doc["site"]["ambient_temperature_K"] = 1.0
    doc["stages"][1]["efficiency"]["value"] = 0.0
    doc["extra"] = 1
    with pytest.raises(InputError) as info:
        loads(_text(doc))
    assert {p.field for p in info.value.problems} == {
        "site.ambient_temperature_K", "stages[1].efficiency.value", "extra"}


@pytest.mark.parametrize("text, match", [
    ("[1, 2]", r"^\(document\): a list — not a Stagewright project"),
    ('"hello"', r"^\(document\): text — not a Stagewright project"),
    ("3.5", r"^\(document\): a number — not a Stagewright project"),
    ("null", r"^\(document\): null — not a Stagewright project"),
    ('{"name": "my spreadsheet", "rows": []}', r"no 'format' key and none of the project keys \(found: name, rows\)"),
    ('{"format": "other-tool", "stages": []}', r"^format: 'other-tool' — not a Stagewright project file"),
])
def test_not_a_project_file(text, match):
    with pytest.raises(ProjectFileError, match=match):
        loads(text)


def test_a_file_without_format_but_with_project_keys_is_read():
    doc = make_doc()
    assert "format" not in doc
    assert loads(_text(doc))["format"] == "stagewright-project"


def test_duplicate_key_is_refused_with_its_path():
    # RFC 8259 §4: names within an object SHOULD be unique; a reader that keeps the last
    # one silently drops the first, so refuse
    text = _text(make_doc()).replace('"value": 0.8', '"value": 0.8, "value": 0.7', 1)
    with pytest.raises(ProjectFileError, match=r"^stages\[0\]\.efficiency\.value: key given more than once"):
        loads(text)


def test_unreadable_and_missing_files(tmp_path):
    with pytest.raises(ProjectFileError, match="cannot read"):
        load(tmp_path / "absent.json")
    with pytest.raises(ProjectFileError, match="not a regular file"):
        load(tmp_path)


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="named pipes are POSIX")
def test_a_named_pipe_is_refused_without_blocking(tmp_path):
    fifo = tmp_path / "pipe.json"
    os.mkfifo(fifo)
    with pytest.raises(ProjectFileError, match="not a regular file"):
        load(fifo)  # opening a pipe with no writer would block forever


def test_error_carries_the_source_path(tmp_path):
    p = tmp_path / "bad.json"
    p.write_text("{", encoding="utf-8")
    with pytest.raises(ProjectFileError) as info:
        load(p)
    assert info.value.source == p


def test_reading_never_writes(tmp_path):
    p = tmp_path / "old.json"
    p.write_text(_text(make_doc()), encoding="utf-8")  # no format/version keys
    before = (p.read_bytes(), os.stat(p).st_mtime_ns)
    load(p)
    assert (p.read_bytes(), os.stat(p).st_mtime_ns) == before
    assert sorted(os.listdir(tmp_path)) == ["old.json"]


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.json")) + [FIXTURE_V1], ids=lambda p: p.name)
def test_round_trip_is_identical(path, tmp_path):
    first = load(path)
    out = tmp_path / path.name
    save(first, out)
    second = load(out)
    assert second == first
    assert json.loads(out.read_text(encoding="utf-8")) == first  # the stdlib reads it the same
    save(second, out)
    assert out.read_bytes() == (tmp_path / (path.name + ".bak")).read_bytes()  # byte-stable


@pytest.mark.parametrize("path", sorted(SAMPLES.glob("*.json")), ids=lambda p: p.name)
def test_samples_are_stored_in_canonical_form(path):
    # so that saving a sample from the window produces no diff
    assert path.read_text(encoding="utf-8") == dumps(load(path))
