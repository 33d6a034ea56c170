"""Installed names: the folders ``thermo/`` and ``app/`` install and import as ``stagewright.core``
and ``stagewright.gui`` (issue 18 item 1), so Stagewright installs beside the ChEDL ``thermo``
property library (a dependency-family neighbour of ``fluids`` and ``ht``) and beside any ``app``.

The side-by-side install needs the package registry and a few minutes: it is marked slow
(``pytest -m slow tests/test_packaging.py``). No physical value is checked here.
"""
from __future__ import annotations

import os
import subprocess
import sys
import textwrap
import tomllib
from pathlib import Path

import pytest

from tests.conftest import ROOT, SAMPLES

INSTALLED = {"thermo": "stagewright.core", "app": "stagewright.gui"}
#: top-level data folders a wheel carries as package data (stagewright.gui.data_files)
DATA = {"icons": "stagewright.gui.icons", "sample_projects": "stagewright.gui.sample_projects"}


def setuptools_config() -> dict:
    return tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))["tool"]["setuptools"]


def test_every_folder_with_an_init_is_an_installed_package():
    """A new sub-package must be named in ``[tool.setuptools] packages`` or the wheel lacks it."""
    config = setuptools_config()
    assert config["package-dir"] == {new: old for old, new in {**INSTALLED, **DATA}.items()}
    expected = set(DATA.values())
    for folder, name in INSTALLED.items():
        for init in (ROOT / folder).rglob("__init__.py"):
            rel = init.parent.relative_to(ROOT / folder).parts
            expected.add(".".join((name, *rel)))
    missing = sorted(expected - set(config["packages"]))
    stale = sorted(set(config["packages"]) - expected)
    assert not missing and not stale, (f"pyproject.toml [tool.setuptools] packages: add {missing}, "
                                       f"remove {stale}")


def test_the_entry_point_and_contracts_use_the_installed_names():
    config = tomllib.loads((ROOT / "pyproject.toml").read_text(encoding="utf-8"))
    assert config["project"]["scripts"] == {"stagewright": "stagewright.gui.entry:main"}
    assert config["tool"]["importlinter"]["root_packages"] == ["stagewright.core", "stagewright.gui"]
    linter = config["tool"]["importlinter"]
    names = [m for c in linter["contracts"] for key in ("source_modules", "forbidden_modules", "containers")
             for m in c.get(key, [])]
    assert names and not [m for m in names if m.split(".")[0] in INSTALLED], names


def test_the_checkout_imports_the_installed_names_from_its_folders():
    """Without an install, ``stagewright/core`` and ``stagewright/gui`` are links to the folders."""
    import stagewright.core
    import stagewright.gui
    assert Path(stagewright.core.__file__).resolve() == ROOT / "thermo" / "__init__.py"
    assert Path(stagewright.gui.__file__).resolve() == ROOT / "app" / "__init__.py"


SIDE_BY_SIDE = textwrap.dedent("""
    import json, sys
    from importlib import metadata
    from pathlib import Path
    import thermo  # the ChEDL property library (rename: keep)
    import stagewright.core, stagewright.gui.cli.main
    site = Path(thermo.__file__).resolve().parents[1]
    assert Path(thermo.__file__).resolve() == site / "thermo" / "__init__.py"
    assert metadata.distribution("thermo").locate_file("thermo/__init__.py").resolve() \\
        == Path(thermo.__file__).resolve()
    assert hasattr(thermo, "Chemical") and not hasattr(thermo, "solve")
    assert Path(stagewright.core.__file__).resolve() == site / "stagewright" / "core" / "__init__.py"
    ours = {str(f).split("/")[0] for f in metadata.files("stagewright")}
    assert ours <= {"stagewright", "stagewright-0.1.0.dist-info", "..", "__pycache__"}, ours
    doc = json.load(open(sys.argv[1]))
    print(thermo.__name__, thermo.Chemical("water").MW > 18.0,
          stagewright.core.__name__, round(stagewright.core.solve(doc).shaft_power_W / 1e3))
""")


@pytest.mark.slow
def test_installs_and_imports_beside_the_chedl_thermo_package(tmp_path):
    """One fresh environment, one ``pip install`` of both, both import (registry needed)."""
    venv = tmp_path / "venv"
    subprocess.run([sys.executable, "-m", "venv", str(venv)], check=True)
    py = venv / ("Scripts/python.exe" if os.name == "nt" else "bin/python")
    pip = subprocess.run([str(py), "-m", "pip", "install", "--quiet", "thermo", str(ROOT)],
                         capture_output=True, text=True, cwd=tmp_path)
    assert pip.returncode == 0, pip.stderr[-3000:]
    env = {k: v for k, v in os.environ.items() if k != "PYTHONPATH"}  # nothing from this checkout
    run = subprocess.run([str(py), "-c", SIDE_BY_SIDE, str(SAMPLES / "two_stage_plant_air.json")],
                         capture_output=True, text=True, cwd=tmp_path, env=env)
    assert run.returncode == 0, run.stderr[-3000:]
    name, water_ok, ours, kw = run.stdout.split()
    assert (name, water_ok, ours) == ("thermo", "True", "stagewright.core") and int(kw) > 0
    check = subprocess.run([str(venv / "bin" / "stagewright"), "check", str(SAMPLES / "two_stage_plant_air.json")],
                           capture_output=True, text=True, cwd=tmp_path, env=env)
    assert check.returncode == 0 and "ok" in check.stdout, check.stdout + check.stderr
