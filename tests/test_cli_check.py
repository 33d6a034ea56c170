"""``stagewright check``: "ok" (exit 0) or one line per problem (exit 2), never a traceback."""
from __future__ import annotations

import json
import subprocess
import sys

from app.cli.main import main
from tests.conftest import ROOT, SAMPLES, make_doc
from thermo.project.schema import FORMAT_VERSION, PROJECT


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
        f"{path}: stages[0].efficiency.value: 1.4 — expected a number in (0, 1]",
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
    proc = subprocess.run([sys.executable, "-m", "app.entry", "check", *map(str, paths)], cwd=ROOT,
                          capture_output=True, text=True)
    assert proc.returncode == 2
    assert "Traceback" not in proc.stdout + proc.stderr and proc.stderr == ""
    lines = proc.stdout.splitlines()
    assert [line.split(": ", 1)[0] for line in lines] == [str(p) for p in paths]
