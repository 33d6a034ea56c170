"""Starting splits: the equal split and the ideal-gas optimum."""
import pytest

from stagewright.core.models import ConstantCpAir
from stagewright.core.study.limits import ratio_bounds
from stagewright.core.study.prepare import prepare
from stagewright.core.study.start import equal_split, ideal_gas_split

from conftest import make_doc


def test_equal_split_matches_thermo_split_when_nothing_binds():
    b = ratio_bounds([{}, {}, {}])
    r = equal_split(1e5, 8e5, [0.0, 0.0, 0.0], b)
    assert r == pytest.approx([2.0, 2.0, 2.0], rel=1e-12)


def test_ideal_gas_split_is_the_lagrange_optimum():
    r"""Constant cp, no drops, inlet temperatures 293.15 K and 330 K, efficiencies 0.85 and 0.75:
    :math:`T_i r_i^a/\eta_i` equal (Lagrange condition for least total work at fixed
    overall ratio; Çengel & Boles, Thermodynamics, 8th ed., 2015, §7-11 for equal stages)."""
    doc = make_doc(model="constant_cp", stages=2, p_out=10e5)
    doc["stages"][0]["cooler"]["outlet_temperature_K"] = 330.0
    doc["stages"][0]["efficiency"]["value"] = 0.85
    doc["stages"][1]["efficiency"]["value"] = 0.75
    norm = prepare(doc).doc
    r1, r2 = ideal_gas_split(norm, ConstantCpAir(1005.0, 1.4), 1e5, ratio_bounds(norm["stages"]))
    a = 0.4 / 1.4
    assert 293.15 * r1 ** a / 0.85 == pytest.approx(330.0 * r2 ** a / 0.75, rel=1e-9)
    assert r1 * r2 == pytest.approx(10.0, rel=1e-12)


def test_ideal_gas_split_keeps_stages_under_their_temperature_limit():
    # ideal-gas discharge T2 = T1 (1 + (r^a - 1)/ηs) (Çengel & Boles eq. 7-42 with 7-64)
    doc = make_doc(model="constant_cp", stages=2, p_out=10e5)
    doc["stages"][1]["max_discharge_temperature_K"] = 400.0
    norm = prepare(doc).doc
    r1, r2 = ideal_gas_split(norm, ConstantCpAir(1005.0, 1.4), 1e5, ratio_bounds(norm["stages"]))
    a = 0.4 / 1.4
    assert 293.15 * (1 + (r2 ** a - 1) / 0.8) == pytest.approx(400.0, rel=1e-9)
    assert r1 * r2 == pytest.approx(10.0, rel=1e-12)


def test_no_hint_without_intercooler():
    doc = make_doc(model="constant_cp", stages=2)
    doc["stages"][0]["cooler"] = None
    norm = prepare(doc).doc
    assert ideal_gas_split(norm, ConstantCpAir(), 1e5, ratio_bounds(norm["stages"])) is None
