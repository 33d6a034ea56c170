"""Edits of the year section (Qt-free): they keep the year valid and, where they restate it,
keep it as it is solved; refusals name the field path, the value and the schema's range."""
import copy
import json

import pytest

from stagewright.gui.document.paths import set_in
from stagewright.gui.year.edits import (cell_pairs, month_hours, profile_as, refusal, start_from_site, undo_text,
                            with_entry_added, with_entry_removed)
from stagewright.core.project.validation import normalise, problems
from stagewright.core.year_profile import DAYS_IN_MONTH, operating_bins

from conftest import SAMPLES, make_doc


def _apply(doc, pairs):
    out = copy.deepcopy(doc)
    for p, v in pairs:
        set_in(out, p, v)
    return out


@pytest.fixture
def sample():
    return json.loads((SAMPLES / "three_stage_site_year.json").read_text(encoding="utf-8"))


def test_start_from_site_is_a_valid_monthly_year_at_the_site():
    doc = make_doc(T0=301.15)
    doc["site"]["relative_humidity"] = 0.4
    doc["year"] = start_from_site(doc)
    assert problems(doc) == []
    bins = operating_bins(normalise(doc)["year"])
    assert {(b.temperature_K, b.relative_humidity) for b in bins} == {(301.15, 0.4)}
    # no hours given: 8760 h spread by the days of each month (stagewright.core.year_profile's rule);
    # 8760 h = 365 d × 24 h, a common year (ISO 8601 calendar)
    assert [b.hours for b in bins] == pytest.approx([24.0 * d for d in DAYS_IN_MONTH])


def test_month_hours_are_what_the_core_solves_for(sample):
    assert month_hours(sample) == pytest.approx([b.hours for b in operating_bins(normalise(sample)["year"])])
    assert sum(month_hours(sample)) == pytest.approx(sample["year"]["operating_hours_per_year"])
    sample["year"]["load"] = 0.0  # invalid year: nothing to show
    assert month_hours(sample) is None


def test_monthly_to_bins_and_back_keeps_the_entries(sample):
    bins_doc = _apply(sample, profile_as(sample, "bins"))
    assert problems(bins_doc) == []
    before = operating_bins(normalise(sample)["year"])
    after = operating_bins(normalise(bins_doc)["year"])
    assert [(b.label, b.temperature_K, b.relative_humidity, b.load) for b in after] == \
        [(b.label, b.temperature_K, b.relative_humidity, b.load) for b in before]
    assert [b.hours for b in after] == pytest.approx([b.hours for b in before], rel=1e-12)
    back = _apply(bins_doc, profile_as(bins_doc, "monthly"))
    assert problems(back) == []
    assert [{k: v for k, v in m.items() if k != "hours"} for m in back["year"]["profile"]["months"]] == \
        sample["year"]["profile"]["months"]
    assert profile_as(sample, "monthly") == []


def test_months_with_their_own_hours_become_bins_without_rescaling(sample):
    sample["year"]["profile"]["months"][0]["hours"] = 0.0  # a shut-down January
    for m in sample["year"]["profile"]["months"][1:]:
        m["hours"] = 300.0
    assert problems(sample) == []
    pairs = profile_as(sample, "bins")
    doc = _apply(sample, pairs)
    assert "operating_hours_per_year" not in doc["year"] and problems(doc) == []
    after = operating_bins(normalise(doc)["year"])
    assert [b.label for b in after][0] == "February" and len(after) == 11
    assert sum(b.hours for b in after) == pytest.approx(3300.0)


def test_typing_one_months_hours_keeps_the_others(sample):
    before = month_hours(sample)
    pairs = cell_pairs(sample, 4, "hours", 100.0)
    assert len(pairs) == 12
    after = month_hours(_apply(sample, pairs))
    assert after[4] == 100.0
    assert after[:4] + after[5:] == pytest.approx(before[:4] + before[5:], abs=1e-6)
    assert cell_pairs(sample, 4, "temperature_K", 280.0) == [("year.profile.months[4].temperature_K", 280.0)]


def test_refusal_names_path_value_and_range_and_passes_good_edits(sample):
    assert refusal(sample, [("year.profile.months[0].temperature_K", 280.0)]) is None
    msg = refusal(sample, [("year.profile.months[0].temperature_K", 20.0)])
    assert "[year.profile.months[0].temperature_K = 20; expected a number in [223.15, 333.15] K]" in msg
    assert "January temperature -253.15 °C" in msg and "-50 to 60 °C" in msg
    msg = refusal(sample, [("year.profile.months[3].hours", 721.0)] + [
        (f"year.profile.months[{i}].hours", 1.0) for i in range(12) if i != 3])
    assert "April" in msg and "720" in msg  # 30 days × 24 h
    assert refusal(sample, [("year.water_price_per_m3", -1.0)]).startswith("Not changed: Water price per m³")


def test_refusal_ignores_problems_the_document_already_had(sample):
    sample["discharge_pressure_Pa"] = 1.0  # a problem elsewhere, not the year's
    assert refusal(sample, [("year.load", 0.5)]) is None
    assert refusal(sample, [("year.load", 1.5)]) is not None


def test_bins_are_added_after_the_selection_and_removed_by_index():
    doc = make_doc(year={"profile": {"kind": "bins", "bins": [
        {"label": "cold", "temperature_K": 270.0, "relative_humidity": 0.8, "hours": 2000.0},
        {"label": "warm", "temperature_K": 300.0, "relative_humidity": 0.5, "hours": 1000.0}]}})
    added = _apply(doc, with_entry_added(doc, 0))
    assert [b.get("label") for b in added["year"]["profile"]["bins"]] == ["cold", None, "warm"]
    assert added["year"]["profile"]["bins"][1]["temperature_K"] == 270.0
    at_end = _apply(doc, with_entry_added(doc, None))
    assert at_end["year"]["profile"]["bins"][2]["temperature_K"] == 300.0
    removed = _apply(doc, with_entry_removed(doc, 0))
    assert [b["label"] for b in removed["year"]["profile"]["bins"]] == ["warm"]
    assert refusal(removed, with_entry_removed(removed, 0)) is not None  # at least one bin
    assert doc["year"]["profile"]["bins"][0]["label"] == "cold"  # pairs never touch the document


def test_undo_text_keeps_month_names_capitalised(sample):
    assert undo_text("year.profile.months[2].temperature_K", sample) == "Change March temperature"
    assert undo_text("year.load", sample) == "Change year load"
    bins = _apply(sample, profile_as(sample, "bins"))
    assert undo_text("year.profile.bins[2].hours", bins) == "Change bin 3 (March) hours"
    del bins["year"]["profile"]["bins"][2]["label"]
    assert undo_text("year.profile.bins[2].hours", bins) == "Change bin 3 hours"


def _whole_document_refusal(doc, pairs):
    """The first new problem by checking the whole document before and after (what ``refusal``
    did for every edit before issue 15's hourly years), as (field, expected)."""
    before = {(p.field, p.expected) for p in problems(doc)}
    new = [p for p in problems(_apply(doc, pairs)) if (p.field, p.expected) not in before]
    return (new[0].field, new[0].expected) if new else None


@pytest.mark.parametrize("kind", ["monthly", "bins"])
def test_a_cell_or_year_field_refusal_checked_locally_says_what_the_whole_document_check_says(sample, kind):
    # refusal checks only the touched entries, the year's own fields and the year's rules; it must
    # refuse exactly what a check of the whole document refuses, with the same field and reason
    doc = copy.deepcopy(sample)
    if kind == "bins":
        for p, v in profile_as(doc, "bins"):
            set_in(doc, p, v)
    key = "months" if kind == "monthly" else "bins"
    edits = [
        [(f"year.profile.{key}[3].temperature_K", 340.0)], [(f"year.profile.{key}[3].temperature_K", 223.15)],
        [(f"year.profile.{key}[5].relative_humidity", 1.2)], [(f"year.profile.{key}[5].relative_humidity", "wet")],
        [(f"year.profile.{key}[0].load", 0.0)], [(f"year.profile.{key}[0].load", 0.5)],
        [(f"year.profile.{key}[2].coolant_inlet_temperature_K", 250.0)],
        [(f"year.profile.{key}[1].hours", 700.0)], [(f"year.profile.{key}[1].hours", 8000.0)],
        [(f"year.profile.{key}[1].hours", 600.0)],
        [(f"year.profile.{key}[4].surprise", 1.0)],
        [("year.load", 0.0)], [("year.load", 0.4)], [("year.operating_hours_per_year", 9000.0)],
        [("year.coolers.mode", "sometimes")], [("year.coolers.ua_margin", 2.0)],
        [("year.energy_price_per_kWh", -1.0)],
        [(f"year.profile.{key}[3].temperature_K", 280.0), (f"year.profile.{key}[4].temperature_K", 400.0)],
    ]
    if kind == "bins":
        edits.append([(f"year.profile.{key}[6].label", "x" * 81)])
    for pairs in edits:
        expected = _whole_document_refusal(doc, pairs)
        message = refusal(doc, pairs)
        if expected is None:
            assert message is None, pairs
        else:
            assert message is not None and f"[{expected[0]}" in message and expected[1] in message, (pairs, message)
