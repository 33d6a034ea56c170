"""The layering rules, stated as import-linter contracts in ``pyproject.toml`` (the core never
imports the front end, Qt or matplotlib; Qt-free front-end modules never import Qt, not even
through another module; the command line never imports the window; the front end's layers).
CI also runs ``lint-imports`` on its own; this test lets the suite fail on a broken contract."""
from importlinter.cli import lint_imports

from tests.conftest import ROOT


def test_import_contracts_are_kept(monkeypatch, capsys):
    monkeypatch.chdir(ROOT)
    status = lint_imports(config_filename=str(ROOT / "pyproject.toml"), no_cache=True)
    assert status == 0, capsys.readouterr().out[-4000:]
