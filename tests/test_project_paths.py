"""Field paths: the spelling shared by errors, warnings, undo commands and sweeps."""
import pytest

from tests.conftest import make_doc
from stagewright.core.project.paths import get_path, parse_path, set_path
from stagewright.core.errors import InputError


def test_parse_round_trip():
    assert parse_path("stages[1].cooler.approach_K") == ["stages", 1, "cooler", "approach_K"]


@pytest.mark.parametrize("bad", ["", ".site", "stages[x]", "site..T", "stages[1]junk!"])
def test_malformed_paths_are_refused(bad):
    with pytest.raises(InputError, match="field path"):
        parse_path(bad)


def test_get_and_set():
    doc = make_doc()
    set_path(doc, "stages[1].efficiency.value", 0.77)
    assert get_path(doc, "stages[1].efficiency.value") == 0.77
    set_path(doc, "driver.efficiency", 0.9)  # creates the missing section
    assert doc["driver"] == {"efficiency": 0.9}


def test_error_field_paths_resolve_in_the_document():
    # a path reported by validation must address the offending value
    import stagewright.core
    doc = make_doc()
    doc["stages"][1]["efficiency"]["value"] = 3.0
    with pytest.raises(InputError) as info:
        stagewright.core.solve(doc)
    assert get_path(doc, info.value.field) == 3.0
