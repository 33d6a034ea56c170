"""The quick check of flat list items (a year's months and bins) in
stagewright.core.project.schema_types: the same normalised items and the same problems as the
general check, item by item, for good and bad items alike."""
import math
import random

import pytest

from stagewright.core.project.schema import YEAR
from stagewright.core.project.schema_types import Items, Num, Obj, Text, _flat_item_check, check

BINS = YEAR.fields["profile"].variants["bins"]["bins"]
MONTHS = YEAR.fields["profile"].variants["monthly"]["months"]
_VALUES = [0.0, 1.0, -1.0, 0.5, 223.15, 333.15, 223.14999, 333.15001, 263.15, 373.15, 8784.0, 8784.5, 744.0, 1e-300,
           math.nan, math.inf, -math.inf, 1, 0, 300, 2 ** 60, True, False, None, "", "x", "x" * 81, [], {}, 1.5e308]


def _item(rng: random.Random, keys: list) -> object:
    if rng.random() < 0.03:
        return rng.choice([None, [], "bin", 3.0])
    item = {k: rng.choice(_VALUES) if rng.random() < 0.3 else _good(k, rng) for k in keys if rng.random() < 0.9}
    if rng.random() < 0.05:
        item["surprise"] = 1.0
    return item


def _good(key: str, rng: random.Random):
    return {"temperature_K": rng.uniform(223.15, 333.15), "relative_humidity": rng.uniform(0.0, 1.0),
            "hours": rng.uniform(0.1, 700.0), "load": rng.uniform(0.01, 1.0),
            "coolant_inlet_temperature_K": rng.uniform(263.15, 373.15), "label": "July"}[key]


@pytest.mark.parametrize("items", [BINS, MONTHS])
def test_quick_check_of_flat_items_agrees_with_the_general_check_item_by_item(items):
    assert _flat_item_check(items.item) is not None  # the year's entries take the quick path
    rng = random.Random(15)
    keys = list(items.item.fields)
    for _ in range(300):
        value = [_item(rng, keys) for _ in range(rng.randint(1, 12))]
        out_quick: list = []
        quick = check(items, value, "year.profile.x", out_quick)
        out_general: list = []
        general = [check(items.item, v, f"year.profile.x[{i}]", out_general) for i, v in enumerate(value)]
        assert repr(quick) == repr(general)  # repr: NaN equals NaN, key order counts
        assert [(p.field, repr(p.value), p.expected) for p in out_quick] == \
            [(p.field, repr(p.value), p.expected) for p in out_general]


def test_other_items_take_the_general_check():
    assert _flat_item_check(Obj(fields={"n": Num(integer=True)})) is None
    assert _flat_item_check(Obj(fields={"a": Num(), "b": Num()}, one_of=(("a", "b"),))) is None
    assert _flat_item_check(Obj(fields={"inner": Obj()})) is None
    assert _flat_item_check(Num()) is None
    assert _flat_item_check(Obj(fields={"t": Text(), "v": Num(0.0, 1.0)})) is not None


def test_a_numpy_number_or_a_subclass_is_checked_as_before():
    np = pytest.importorskip("numpy")
    out: list = []
    got = check(Items(Obj(fields={"v": Num(0.0, 1.0)})), [{"v": np.float64(0.5)}, {"v": np.float64(2.0)}], "p", out)
    assert got == [{"v": 0.5}, {"v": 2.0}] and [p.field for p in out] == ["p[1].v"]
