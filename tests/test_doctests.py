"""The examples in the docstrings of ``stagewright.core`` and ``stagewright.gui`` and in
``docs/python-api.md`` run, under the installed import names.

pytest's ``--doctest-modules`` would import ``thermo/solve.py`` by its path, as a second copy of
the module named after the folder, beside ``stagewright.core.solve`` (other classes, other
caches, warning filters that do not apply), so the modules are found by name here instead.
Every module is also imported once (what ``--doctest-modules`` did for modules without
examples). No physical value is checked here beyond what each docstring states with its source.
"""
from __future__ import annotations

import doctest
import importlib
import importlib.util
import io
import pkgutil

import pytest

import stagewright.core
import stagewright.gui
from tests.conftest import ROOT

FLAGS = doctest.ELLIPSIS | doctest.NORMALIZE_WHITESPACE
API_DOC = ROOT / "docs" / "python-api.md"


def module_names() -> list[str]:
    """Every module of both packages, by installed name (sub-packages are imported to walk them)."""
    names = []
    for pkg in (stagewright.core, stagewright.gui):
        names.append(pkg.__name__)
        names += [m.name for m in pkgutil.walk_packages(pkg.__path__, pkg.__name__ + ".")]
    return sorted(names)


def has_examples(name: str) -> bool:
    origin = importlib.util.find_spec(name).origin
    with open(origin, encoding="utf-8") as f:
        return ">>>" in f.read()


def run(tests) -> tuple[int, str]:
    """Run doctests; (examples attempted, report of every failure)."""
    out = io.StringIO()
    runner = doctest.DocTestRunner(optionflags=FLAGS)
    for test in tests:
        runner.run(test, out=out.write)
    result = runner.summarize(verbose=False)
    return result.attempted, out.getvalue() if result.failed else ""


def test_every_module_imports_under_its_installed_name():
    names = module_names()
    assert len(names) > 150 and "stagewright.core.solve" in names and "stagewright.gui.entry" in names
    for name in names:
        assert importlib.import_module(name).__name__ == name


@pytest.mark.parametrize("name", [n for n in module_names() if has_examples(n)])
def test_docstring_examples(name):
    module = importlib.import_module(name)
    tests = [t for t in doctest.DocTestFinder().find(module, name) if t.examples]
    attempted, failures = run(tests)
    assert attempted > 0, f"{name} has '>>>' in its source but no example was found"
    assert not failures, failures


def test_python_api_document():
    text = API_DOC.read_text(encoding="utf-8")
    test = doctest.DocTestParser().get_doctest(text, {"__name__": "python_api_doc"}, str(API_DOC), str(API_DOC), 0)
    attempted, failures = run([test])
    assert attempted >= 20, "docs/python-api.md lost its examples"
    assert not failures, failures
