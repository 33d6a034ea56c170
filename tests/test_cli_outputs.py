"""Outputs of ``stagewright report`` and ``sweep`` (issue 22 item 3, and the missing-folder part
of item 10): never over an input, never two onto one file, an existing file only with ``--force``,
every write atomic."""
from __future__ import annotations

import os
import shutil

import pytest

from stagewright.gui.cli.main import main
from conftest import SAMPLES

DEMO = SAMPLES / "two_stage_plant_air.json"
AXIS = ["--axis", "discharge_pressure_Pa=7e5,8e5"]


@pytest.fixture
def project(tmp_path):
    p = tmp_path / "p.json"
    shutil.copy(DEMO, p)
    return p


def _unchanged(path, before: bytes):
    assert path.read_bytes() == before, f"{path} was changed"


def test_report_csv_onto_the_project_is_refused(project, capsys):
    before = project.read_bytes()
    assert main(["report", str(project), "-o", str(project.with_name("r.pdf")), "--csv", str(project)]) == 2
    assert "is an input file" in capsys.readouterr().err
    _unchanged(project, before)
    assert not project.with_name("r.pdf").exists()  # refused before any work


def test_report_default_name_equal_to_the_input_is_refused(tmp_path, capsys):
    odd = tmp_path / "plant.pdf"  # a project file saved under a .pdf name
    shutil.copy(DEMO, odd)
    before = odd.read_bytes()
    assert main(["report", str(odd)]) == 2
    assert "is an input file" in capsys.readouterr().err
    _unchanged(odd, before)


def test_two_inputs_of_one_name_do_not_collide_in_one_folder(tmp_path, capsys):
    for sub in ("a", "b"):
        (tmp_path / sub).mkdir()
        shutil.copy(DEMO, tmp_path / sub / "plant.json")
    out = tmp_path / "reports"
    assert main(["report", str(tmp_path / "a" / "plant.json"), str(tmp_path / "b" / "plant.json"),
                 "-o", str(out)]) == 2
    assert "written twice" in capsys.readouterr().err
    assert not out.exists() or not any(out.iterdir())


def test_report_replaces_an_existing_file_only_with_force(project, capsys):
    pdf = project.with_name("r.pdf")
    pdf.write_bytes(b"older report")
    assert main(["report", str(project), "-o", str(pdf)]) == 2
    assert "--force" in capsys.readouterr().err
    _unchanged(pdf, b"older report")
    assert main(["report", str(project), "-o", str(pdf), "--force"]) == 0
    assert pdf.read_bytes().startswith(b"%PDF")


def test_sweep_onto_the_project_is_refused(project, capsys):
    before = project.read_bytes()
    assert main(["sweep", str(project), *AXIS, "-o", str(project), "--force"]) == 2
    assert "is an input file" in capsys.readouterr().err
    _unchanged(project, before)


def test_sweep_through_a_symlink_to_the_project_is_refused(project, capsys):
    link = project.with_name("out.csv")
    os.symlink(project, link)
    before = project.read_bytes()
    assert main(["sweep", str(project), *AXIS, "-o", str(link), "--force"]) == 2
    assert "is an input file" in capsys.readouterr().err
    _unchanged(project, before)


def test_sweep_replaces_a_symlink_not_its_target(project, tmp_path):
    other = tmp_path / "other.txt"
    other.write_text("keep me")
    link = tmp_path / "out.csv"
    os.symlink(other, link)
    assert main(["sweep", str(project), *AXIS, "-o", str(link), "--force"]) == 0
    assert other.read_text() == "keep me"
    assert not link.is_symlink() and link.read_text().startswith("discharge_pressure_Pa,")


def test_sweep_refuses_an_existing_output_without_force(project, capsys):
    out = project.with_name("grid.csv")
    out.write_text("old")
    assert main(["sweep", str(project), *AXIS, "-o", str(out)]) == 2
    assert "--force" in capsys.readouterr().err
    _unchanged(out, b"old")


def test_sweep_to_a_missing_folder_is_one_line(project, capsys):
    assert main(["sweep", str(project), *AXIS, "-o", str(project.parent / "nowhere" / "g.csv")]) == 2
    err = capsys.readouterr().err
    assert "does not exist" in err and "Traceback" not in err and len(err.strip().splitlines()) == 1


def test_sweep_write_is_atomic(project, monkeypatch, capsys):
    out = project.with_name("grid.csv")
    out.write_text("old")

    def full_disk(_fd):
        raise OSError(28, "No space left on device")

    monkeypatch.setattr(os, "fsync", full_disk)
    assert main(["sweep", str(project), *AXIS, "-o", str(out), "--force"]) == 1
    assert "cannot write" in capsys.readouterr().err
    _unchanged(out, b"old")
    assert sorted(p.name for p in project.parent.iterdir()) == ["grid.csv", "p.json"]  # no temporary file left
