"""The icons and demo projects are found in a checkout and in an installed wheel (package data)."""
from __future__ import annotations

import tomllib
from pathlib import Path
from types import SimpleNamespace

import stagewright.gui.data_files as data_files

ROOT = Path(__file__).resolve().parents[1]


def test_a_checkout_uses_the_top_level_folders():
    assert data_files.data_dir("icons", "app.svg") == ROOT / "icons"
    assert data_files.data_dir("sample_projects", "two_stage_plant_air.json") == ROOT / "sample_projects"


def test_an_installed_wheel_uses_the_package_data(tmp_path, monkeypatch):
    # a wheel has no top-level folders beside the package: the files come as stagewright.gui.icons
    installed = tmp_path / "site-packages" / "stagewright" / "gui" / "icons"
    installed.mkdir(parents=True)
    (installed / "app.svg").write_text("<svg/>")
    monkeypatch.setattr(data_files, "_REPOSITORY", tmp_path / "site-packages")
    import importlib.util
    monkeypatch.setattr(importlib.util, "find_spec",
                        lambda name: SimpleNamespace(submodule_search_locations=[str(installed)])
                        if name == "stagewright.gui.icons" else None)
    assert data_files.data_dir("icons", "app.svg") == installed


def test_the_wheel_carries_icons_and_sample_projects():
    # pyproject maps the two top-level folders into the package, and their files are package data
    cfg = tomllib.loads((ROOT / "pyproject.toml").read_text())["tool"]["setuptools"]
    for package, folder, pattern in (("stagewright.gui.icons", "icons", "*.svg"),
                                     ("stagewright.gui.sample_projects", "sample_projects", "*.json")):
        assert package in cfg["packages"] and cfg["package-dir"][package] == folder
        assert pattern in cfg["package-data"]["*"]
        assert any((ROOT / folder).glob(pattern))
