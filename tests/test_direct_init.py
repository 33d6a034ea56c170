"""direct_init: the faster __init__ of frozen dataclasses keeps everything a dataclass promises."""
from __future__ import annotations

import dataclasses
import pickle

import pytest

from stagewright.core.direct_init import direct_init
from stagewright.core.exchanger.coolant import CoolantSide
from stagewright.core.exchanger.sizing import Exchanger, HotSide, Zone


@dataclasses.dataclass(frozen=True)
class _Plain:
    a: float
    b: str = "x"
    c: list = dataclasses.field(default_factory=list)


@direct_init
@dataclasses.dataclass(frozen=True)
class _Direct:
    a: float
    b: str = "x"
    c: list = dataclasses.field(default_factory=list)


def test_same_fields_defaults_equality_hash_replace_and_pickling_as_the_dataclass_init():
    for args, kw in (((1.0,), {}), ((2.0, "y"), {}), ((3.0,), {"c": [1]}), ((), {"a": 4.0, "b": "z"})):
        plain, direct = _Plain(*args, **kw), _Direct(*args, **kw)
        assert dataclasses.asdict(plain) == dataclasses.asdict(direct)
        assert repr(direct) == repr(plain).replace("_Plain", "_Direct")
    assert _Direct(1.0) == _Direct(1.0) and hash(_Direct(1.0, "q", None)) == hash(_Direct(1.0, "q", None))
    assert _Direct(1.0).c is not _Direct(1.0).c  # a fresh default each time
    assert dataclasses.replace(_Direct(1.0), b="w") == _Direct(1.0, "w")
    assert pickle.loads(pickle.dumps(_Direct(5.0, "p", [2]))) == _Direct(5.0, "p", [2])
    with pytest.raises(dataclasses.FrozenInstanceError):
        _Direct(1.0).a = 2.0
    with pytest.raises(TypeError):
        _Direct()  # a field without a default is still required


def test_refuses_classes_it_would_change():
    with pytest.raises(TypeError):
        direct_init(dataclasses.dataclass(type("Mutable", (), {"__annotations__": {"a": float}})))


@pytest.mark.parametrize("cls", [HotSide, Zone, Exchanger, CoolantSide])
def test_the_exchangers_records_take_the_same_arguments_as_before(cls):
    import inspect
    names = [f.name for f in dataclasses.fields(cls)]
    assert list(inspect.signature(cls.__init__).parameters)[1:] == names
