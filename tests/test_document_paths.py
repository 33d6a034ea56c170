"""Window-side path helpers (reading, setting, removing, relating field paths)."""
from __future__ import annotations

from stagewright.gui.document.paths import ABSENT, get_in, is_related, set_in, stage_index


def test_get_set_remove(doc_factory):
    doc = doc_factory()
    assert get_in(doc, "stages[1].cooler.pressure_drop_Pa") == 0.0
    assert get_in(doc, "stages[5].name") is ABSENT
    assert set_in(doc, "stages[1].exit_velocity_m_s", 20.0) is ABSENT
    assert set_in(doc, "stages[1].exit_velocity_m_s", ABSENT) == 20.0
    assert "exit_velocity_m_s" not in doc["stages"][1]
    doc["stages"][0]["cooler"] = None
    set_in(doc, "stages[0].cooler.approach_K", 5.0)  # a missing object is created
    assert doc["stages"][0]["cooler"] == {"approach_K": 5.0}


def test_relations():
    assert is_related("", "site.elevation_m")
    assert is_related("stages[1]", "stages[1].cooler.approach_K")
    assert not is_related("stages[1]", "stages[10].name")
    assert stage_index("site.elevation_m") is None and stage_index("stages[3]") == 3
