"""docs/project-format.md cannot drift: its key tables are generated and compared here.

The check is against the code itself (the schema and real solve results), on purpose:
the document is a description of them.
"""
from __future__ import annotations

import re

import pytest

import stagewright.core
from tests.conftest import ROOT, SAMPLES, make_doc
from stagewright.core.project import schema_docs
from stagewright.core.project import load
from stagewright.core.project.schema import PROJECT
from stagewright.core.project.schema_types import Num, walk

DOC = ROOT / "docs" / "project-format.md"
FIX = "run `python -m stagewright.core.project.schema_docs --write` after describing the key in thermo/project/schema_docs.py"


def test_every_schema_key_has_a_meaning_and_none_is_stale():
    paths = [p for p, _ in walk(PROJECT)]
    missing = [p for p in paths if p not in schema_docs.PROJECT_KEYS]
    stale = [p for p in schema_docs.PROJECT_KEYS if p not in paths]
    assert not missing, f"describe these keys in thermo/project/schema_docs.py PROJECT_KEYS: {missing}"
    assert not stale, f"these keys are no longer in the schema; remove them from PROJECT_KEYS: {stale}"


def _results():
    out = [stagewright.core.solve(load(p)).to_dict() for p in sorted(SAMPLES.glob("*.json"))]
    hot = make_doc(stages=1, p_out=4e5)
    hot["stages"][0]["max_discharge_temperature_K"] = 300.0  # to produce a warning entry
    hot["stages"][0]["cooler"] = None
    out.append(stagewright.core.solve(hot).to_dict())
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


_RANGE_ROW = re.compile(r"^\| `(?P<key>[^`]+)`(?: \(kind `(?P<kind>\w+)`\))? \|[^|]*\|[^|]*\| "
                        r"(?P<lo_b>[\[(])(?P<lo>[^,]+), (?P<hi>[^\])]+)(?P<hi_b>[\])]) \|", re.M)


@pytest.mark.parametrize("key, kind, where", [
    ("stages[].efficiency.value", "isentropic", lambda d: d["stages"][0]["efficiency"]),
    ("stages[].efficiency.value", "polytropic", lambda d: d["stages"][0]["efficiency"]),
    ("stages[].mechanical_efficiency", None, lambda d: d["stages"][0]),
    ("driver.efficiency", None, lambda d: d.setdefault("driver", {})),
    ("flow.value", "mass", lambda d: d["flow"]),
    ("flow.value", "free_air_delivery", lambda d: d["flow"]),
    ("flow.value", "shaft_power", lambda d: d["flow"]),
    ("fluid.k", None, lambda d: d.setdefault("fluid", {})),
])
def test_the_documented_range_is_what_the_loader_accepts(key, kind, where):
    # issue 22 item 13: the table said (0, 1], (0, 1000], (1, 1.7] while the loader refused
    # efficiencies below 0.001, flows below 1e-6 and k below 1.001
    import math

    from tests.conftest import make_doc
    from stagewright.core.project.validation import problems

    text = (ROOT / "docs" / "project-format.md").read_text(encoding="utf-8")
    rows = [m for m in _RANGE_ROW.finditer(text) if m["key"] == key and m["kind"] == kind]
    assert len(rows) == 1, f"no range row for {key} ({kind})"
    row = rows[0]
    lo, hi = float(row["lo"]), float(row["hi"])
    field = key.replace("[]", "[0]")
    for value, accepted in [(lo if row["lo_b"] == "[" else math.nextafter(lo, math.inf), True),
                            (math.nextafter(lo, -math.inf) if row["lo_b"] == "[" else lo, False),
                            (hi if row["hi_b"] == "]" else math.nextafter(hi, -math.inf), True)]:
        doc = make_doc(model="constant_cp", stages=1)
        node = where(doc)
        if kind is not None:
            node["kind"] = kind
        node[key.rsplit(".", 1)[1]] = value
        named = [p for p in problems(doc) if p.field == field]
        assert (not named) == accepted, f"{field} = {value!r}: documented {row[0]!r}, loader says {named}"
