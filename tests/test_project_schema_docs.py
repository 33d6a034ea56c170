"""docs/project-format.md cannot drift: its key tables are generated and compared here.

The check is against the code itself (the schema and real solve results), on purpose:
the document is a description of them.
"""
from __future__ import annotations

import pytest

import thermo
from tests.conftest import ROOT, SAMPLES, make_doc
from thermo.project import schema_docs
from thermo.project import load
from thermo.project.schema import PROJECT
from thermo.project.schema_types import Num, walk

DOC = ROOT / "docs" / "project-format.md"
FIX = "run `python -m thermo.project.schema_docs --write` after describing the key in thermo/project/schema_docs.py"


def test_every_schema_key_has_a_meaning_and_none_is_stale():
    paths = [p for p, _ in walk(PROJECT)]
    missing = [p for p in paths if p not in schema_docs.PROJECT_KEYS]
    stale = [p for p in schema_docs.PROJECT_KEYS if p not in paths]
    assert not missing, f"describe these keys in thermo/project/schema_docs.py PROJECT_KEYS: {missing}"
    assert not stale, f"these keys are no longer in the schema; remove them from PROJECT_KEYS: {stale}"


def _results():
    out = [thermo.solve(load(p)).to_dict() for p in sorted(SAMPLES.glob("*.json"))]
    hot = make_doc(stages=1, p_out=4e5)
    hot["stages"][0]["max_discharge_temperature_K"] = 300.0  # to produce a warning entry
    hot["stages"][0]["cooler"] = None
    out.append(thermo.solve(hot).to_dict())
    return out


def test_every_result_key_has_a_meaning_and_none_is_stale():
    produced = set().union(*(schema_docs.result_paths(r) for r in _results()))
    described = set(schema_docs.RESULT_KEYS)
    assert not produced - described, f"describe in thermo/project/schema_docs.py RESULT_KEYS: {sorted(produced - described)}"
    assert not described - produced, f"no longer produced; remove from RESULT_KEYS: {sorted(described - produced)}"


def test_the_document_holds_the_generated_tables():
    text = DOC.read_text(encoding="utf-8")
    assert schema_docs.render(text) == text, f"docs/project-format.md is out of date: {FIX}"


def test_update_document_rewrites_only_the_generated_blocks(tmp_path):
    copy = tmp_path / "format.md"
    stale = DOC.read_text(encoding="utf-8").replace("| `title` |", "| `old_title` |")
    copy.write_text(stale, encoding="utf-8")
    assert schema_docs.update_document(copy) is True
    assert copy.read_text(encoding="utf-8") == DOC.read_text(encoding="utf-8")
    assert schema_docs.update_document(copy) is False


_LABELS = {"J/(kg K)": "J/(kg·K)"}  # the schema's plain spelling of the same unit
#: keys whose unit is not in the name: flow.value (its unit depends on the kind) and hours
_UNIT_IN_WORDS = {"value", "hours", "operating_hours_per_year"}


@pytest.mark.parametrize("path, node", [(p, n) for p, n in walk(PROJECT) if isinstance(n, Num) and n.unit],
                         ids=lambda x: x if isinstance(x, str) else "")
def test_key_names_carry_the_unit_of_their_schema_entry(path, node):
    # house rule: every key with a unit carries it in its name (see _UNIT_IN_WORDS for the
    # exceptions; the table gives their unit)
    named = schema_docs.unit_of(path)
    if path.rsplit(".", 1)[-1] in _UNIT_IN_WORDS:
        assert named == ""
    else:
        assert named == _LABELS.get(node.unit, node.unit)


def test_every_result_key_with_a_unit_suffix_is_recognised():
    for path in schema_docs.RESULT_KEYS:
        last = path.rsplit(".", 1)[-1]
        if last.endswith(("_K", "_Pa", "_W", "_m", "_s", "_kg", "_kgK", "_m3", "_min")):
            assert schema_docs.unit_of(path), path
