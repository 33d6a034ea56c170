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


def _reference_num(schema: Num, value, path: str, out: list):
    """The general check of one number, written out (finite, whole where asked, within its bounds)."""
    if not isinstance(value, (int, float)) or isinstance(value, bool) or not math.isfinite(value):
        out.append((path, value))
        return value
    if schema.integer and not float(value).is_integer():
        out.append((path, value))
        return value
    lo = value <= schema.lo if schema.lo_open else value < schema.lo
    hi = value >= schema.hi if schema.hi_open else value > schema.hi
    if lo or hi:
        out.append((path, value))
    return int(value) if schema.integer else float(value)


@pytest.mark.parametrize("lo_open", [False, True])
@pytest.mark.parametrize("hi_open", [False, True])
def test_a_plain_number_field_taken_on_the_quick_path_is_what_the_general_check_gives(lo_open, hi_open):
    # issue 19: an object's plain float fields inside their bounds are taken as they are, without
    # the general check's calls; the normalised value, its type and the problems must not change
    num = Num(223.15, 333.15, "K", lo_open=lo_open, hi_open=hi_open, default=288.15)
    schema = Obj({"t": num, "label": Text(default="x")})
    rng = random.Random(19)
    values = _VALUES + [rng.uniform(200.0, 350.0) for _ in range(300)] + [math.nextafter(223.15, 0.0),
                                                                          math.nextafter(333.15, 1e9)]
    for value in values:
        out: list = []
        got = check(schema, {"t": value}, "site", out)
        ref_out: list = []
        ref = _reference_num(num, value, "site.t", ref_out)
        assert [(p.field, p.value) for p in out] == [(f, v) for f, v in ref_out]
        assert got["t"] == ref or (got["t"] != got["t"] and ref != ref), value
        assert type(got["t"]) is type(ref), value
        assert got["label"] == "x"
    assert check(schema, {}, "site", []) == {"t": 288.15, "label": "x"}
