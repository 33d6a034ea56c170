"""The Qt-free project model: change signals, paths, defaults and problems from the schema."""
from __future__ import annotations

import copy

from stagewright.gui.document.paths import ABSENT
from stagewright.gui.document.model import ProjectModel, Signal, new_document
from stagewright.core.project.validation import problems


def test_signal_connect_emit_disconnect():
    sig, seen = Signal(), []
    sig.connect(seen.append)
    sig.connect(seen.append)  # connecting twice is one connection
    sig.emit("a")
    sig.disconnect(seen.append)
    sig.emit("b")
    assert seen == ["a"]


def test_new_document_is_valid_against_the_schema():
    assert problems(new_document()) == []


def test_set_announces_the_path_and_returns_the_old_value(doc_factory):
    m = ProjectModel(doc_factory())
    paths = []
    m.changed.connect(paths.append)
    assert m.set("stages[1].efficiency.value", 0.7) == 0.8
    assert m.set("stages[0].max_discharge_temperature_K", 420.0) is ABSENT
    assert m.set("stages[0].max_discharge_temperature_K", ABSENT) == 420.0
    assert "max_discharge_temperature_K" not in m.doc["stages"][0]
    assert paths == ["stages[1].efficiency.value"] + ["stages[0].max_discharge_temperature_K"] * 2


def test_values_are_copied_in(doc_factory):
    m = ProjectModel(doc_factory())
    cooler = {"outlet_temperature_K": 300.0}
    m.set("stages[0].cooler", cooler)
    cooler["outlet_temperature_K"] = 1.0
    assert m.get("stages[0].cooler.outlet_temperature_K") == 300.0


def test_stage_list_changes_and_structure_signal(doc_factory):
    doc = doc_factory(stages=3)
    for i, st in enumerate(doc["stages"]):
        st["name"] = f"s{i}"
    m = ProjectModel(doc)
    events = []
    m.structure_changed.connect(lambda *a: events.append(a))
    m.move_stage(0, 2)
    removed = m.remove_stage(1)
    m.insert_stage(0, removed)
    assert [s["name"] for s in m.doc["stages"]] == ["s2", "s1", "s0"]
    assert events == [("move", 0, 2), ("remove", 1, 1), ("insert", 0, 0)]


def test_problems_and_normalised_view(doc_factory):
    doc = doc_factory()
    doc["stages"][0]["efficiency"]["value"] = 1.5
    m = ProjectModel(doc)
    assert [p.field for p in m.problems()] == ["stages[0].efficiency.value"]
    norm = m.normalised()  # defaults are filled in even while the document has a problem
    assert norm["stages"][0]["mechanical_efficiency"] == 1.0
    assert "mechanical_efficiency" not in m.doc["stages"][0]
    assert m.doc == doc and m.doc is not doc
    snap = m.snapshot()
    snap["stages"].clear()
    assert m.stage_count == 2


def test_set_many_is_one_change(doc_factory):
    m = ProjectModel(doc_factory())
    paths = []
    m.changed.connect(paths.append)
    old = m.set_many([("site.barometric_pressure_Pa", ABSENT), ("site.elevation_m", 300.0)])
    assert old == [100_000.0, ABSENT]
    assert paths == ["site"]
    assert copy.deepcopy(ABSENT) is ABSENT
