"""``stagewright check``: "ok" (exit 0) or one line per problem (exit 2), never a traceback."""
from __future__ import annotations

import json
import subprocess
import sys

import pytest

import stagewright.core.errors

from stagewright.gui.cli.main import main
from tests.conftest import ROOT, SAMPLES, make_doc
from stagewright.core.project.schema import FORMAT_VERSION, PROJECT


def _write(path, doc):
    path.write_text(json.dumps(doc, indent=2), encoding="utf-8")
    return path


def test_a_good_file_prints_ok(capsys):
    assert main(["check", str(SAMPLES / "two_stage_plant_air.json")]) == 0
    assert capsys.readouterr().out == "ok\n"


def test_a_bad_file_prints_one_line_per_problem(tmp_path, capsys):
    doc = make_doc()
    doc["stages"][0]["efficiency"]["value"] = 1.4
    doc["site"]["humidity"] = 0.5
    path = _write(tmp_path / "bad.json", doc)
    assert main(["check", str(path)]) == 2
    lines = capsys.readouterr().out.splitlines()
    assert lines == [
        f"{path}: site.humidity: 0.5 — unknown key; known keys here: ambient_temperature_K, "
        "barometric_pressure_Pa, dew_point_K, elevation_m, humidity_ratio, relative_humidity",
        f"{path}: stages[0].efficiency.value: 1.4 — expected a number in [0.001, 1]",
    ]


def test_broken_json_prints_line_and_column(tmp_path, capsys):
    path = tmp_path / "broken.json"
    path.write_text('{\n  "title": "x"\n  "note": ""\n}', encoding="utf-8")
    assert main(["check", str(path)]) == 2
    assert capsys.readouterr().out == f"{path}: line 3, column 3: broken JSON (Expecting ',' delimiter)\n"


def test_folders_and_several_files(tmp_path, capsys):
    good = _write(tmp_path / "a.json", dict(make_doc(), version=FORMAT_VERSION))  # current: a plain "ok"
    _write(tmp_path / "b.json", dict(make_doc(), colour="red"))
    empty = tmp_path / "empty"
    empty.mkdir()
    assert main(["check", str(tmp_path), str(good), str(empty), str(tmp_path / "missing.json")]) == 2
    out = capsys.readouterr().out.splitlines()
    assert out == [
        f"{empty}: no *.json files in this folder",
        f"{good}: ok",
        f"{tmp_path / 'b.json'}: colour: 'red' — unknown key; known keys here: " + ", ".join(sorted(PROJECT.fields)),
        f"{good}: ok",
        f"{tmp_path / 'missing.json'}: cannot read (No such file or directory)",
    ]


def test_all_samples_check_ok(capsys):
    assert main(["check", str(SAMPLES)]) == 0
    assert all(line.endswith(": ok") for line in capsys.readouterr().out.splitlines())


def test_a_newer_version_is_one_clear_line(tmp_path, capsys):
    path = _write(tmp_path / "future.json", dict(make_doc(), version=99))
    assert main(["check", str(path)]) == 2
    out = capsys.readouterr().out
    assert out.count("\n") == 1 and "newer Stagewright (project format version 99)" in out


def test_garbage_never_gives_a_traceback(tmp_path):
    garbage = [b"\x89PNG\r\n\x1a\n\x00\x00", b"[" * 100_000, b'{"stages": [' * 5 + b"1", b"\xef\xbb\xbf"]
    paths = []
    for i, content in enumerate(garbage):
        paths.append(tmp_path / f"garbage{i}.json")
        paths[-1].write_bytes(content)
    proc = subprocess.run([sys.executable, "-m", "stagewright.gui.entry", "check", *map(str, paths)], cwd=ROOT,
                          capture_output=True, text=True)
    assert proc.returncode == 2
    assert "Traceback" not in proc.stdout + proc.stderr and proc.stderr == ""
    lines = proc.stdout.splitlines()
    assert [line.split(": ", 1)[0] for line in lines] == [str(p) for p in paths]


@pytest.mark.parametrize("change", [
    lambda d: d["flow"].update(kind="x" * 3_000_000),        # a wrong value of megabytes
    lambda d: d.update({"y" * 1_000_000: 1}),                 # an unknown key of a megabyte
    lambda d: d.update(format="z" * 1_000_000),               # not our format, at length
    lambda d: d["stages"][0].update(efficiency=list(range(200_000))),  # a long list where an object goes
], ids=["value", "key", "format", "list"])
def test_messages_cut_an_echoed_value_to_a_readable_length(tmp_path, capsys, change):
    # issue 22 item 8: the whole value was echoed (a 3 MB line, a dialog half a million pixels tall)
    from stagewright.gui.document.field_specs import problem_message
    from stagewright.core.project import load_with_problems

    doc = json.loads((SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8"))
    change(doc)
    path = tmp_path / "p.json"
    path.write_text(json.dumps(doc), encoding="utf-8")
    assert main(["check", str(path)]) == 2
    lines = capsys.readouterr().out.splitlines()
    assert lines and all(len(line) < 600 for line in lines), max(map(len, lines))
    try:
        _, found = load_with_problems(path)
    except stagewright.core.errors.ProjectFileError as exc:
        assert len(str(exc)) < 400
    else:
        assert found and all(len(problem_message(p, doc)) < 600 for p in found)


def test_a_list_of_far_too_many_items_is_one_message(tmp_path, capsys):
    # issue 22 item 7: 2 million empty stages took 13–22 s and 1.3 GB, and check printed a line
    # per stage; the list is now refused at its documented limit before anything copies it
    from tests.time_limit import finishes_within

    text = (SAMPLES / "two_stage_plant_air.json").read_text(encoding="utf-8")
    text = text.replace('"stages": [', '"stages": [' + "{}," * 300_000, 1)
    path = tmp_path / "many.json"
    path.write_text(text, encoding="utf-8")
    with finishes_within(30.0, "checking 300 000 stages"):
        assert main(["check", str(path)]) == 2
    lines = capsys.readouterr().out.splitlines()
    assert len(lines) == 1 and "stages: 300002 items — expected at most 12" in lines[0], lines[:3]
