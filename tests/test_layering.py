"""The layering rule: the calculation core never pulls in Qt or a GUI back end."""
import ast
import subprocess
import sys
from pathlib import Path

from tests.conftest import ROOT

FORBIDDEN = ("PySide6", "PyQt5", "PyQt6", "shiboken6", "matplotlib", "app")


def test_no_module_in_thermo_imports_qt_matplotlib_or_the_front_end():
    offenders = []
    for path in (ROOT / "thermo").rglob("*.py"):
        tree = ast.parse(path.read_text(encoding="utf-8"))
        for node in ast.walk(tree):
            names = []
            if isinstance(node, ast.Import):
                names = [a.name for a in node.names]
            elif isinstance(node, ast.ImportFrom) and node.level == 0 and node.module:
                names = [node.module]
            offenders += [f"{path.relative_to(ROOT)}: {n}" for n in names if n.split(".")[0] in FORBIDDEN]
    assert offenders == []


def test_importing_and_solving_loads_no_qt():
    code = ("import sys, json, thermo; "
            "thermo.solve(json.load(open('sample_projects/two_stage_plant_air.json'))); "
            "bad = [m for m in sys.modules if m.split('.')[0] in ('PySide6', 'shiboken6', 'matplotlib')]; "
            "print(bad); sys.exit(1 if bad else 0)")
    proc = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout + proc.stderr


def test_headless_cli_loads_no_qt():
    code = ("import sys; from app.cli.main import main; "
            "main(['check', 'sample_projects']); "
            "bad = [m for m in sys.modules if m.split('.')[0] in ('PySide6', 'shiboken6')]; "
            "sys.exit(1 if bad else 0)")
    proc = subprocess.run([sys.executable, "-c", code], cwd=ROOT, capture_output=True, text=True)
    assert proc.returncode == 0, proc.stdout + proc.stderr
