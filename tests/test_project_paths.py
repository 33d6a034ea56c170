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


def test_an_index_of_thousands_of_digits_is_a_refusal_not_a_crash(tmp_path):
    """A case change path with a 5000-digit index made ``load`` fail with Python's int() digit-limit
    ValueError (a traceback) instead of naming the path."""
    import json
    from pathlib import Path

    from stagewright.core.errors import InputError, StagewrightError
    from stagewright.core.project import load
    with pytest.raises(InputError):
        parse_path("stages[" + "9" * 5000 + "]")
    with pytest.raises(InputError):
        parse_path("stages[\u0661]")  # an Arabic-Indic one: not an index here
    sample = Path(__file__).resolve().parents[1] / "sample_projects" / "two_stage_plant_air.json"
    doc = json.loads(sample.read_text())
    doc["cases"] = [{"name": "Huge", "changes": {"stages[" + "9" * 5000 + "].name": "x"}}]
    path = tmp_path / "huge.json"
    path.write_text(json.dumps(doc))
    with pytest.raises(StagewrightError) as err:
        load(path)
    assert "cases[0].changes" in str(err.value)
