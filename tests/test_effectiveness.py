"""ε-NTU relations against the ht library and Incropera's closed forms."""
import math

import ht
import pytest

from stagewright.core.errors import InputError
from stagewright.core.exchanger.effectiveness import (ARRANGEMENTS, crossflow_unmixed_effectiveness, effectiveness,
                                            max_effectiveness, ntu_from_effectiveness)
from stagewright.core.project.schema import ARRANGEMENT_NAMES

NTUS = [0.05, 0.4, 1.0, 2.5, 6.0]
CRS = [0.0, 0.2, 0.55, 0.9, 1.0]

# (our arrangement, hot_is_cmin) -> ht subtype (ht.effectiveness_from_NTU, C. Bell, ht library)
HT_SUBTYPE = {("counter_flow", True): "counterflow", ("counter_flow", False): "counterflow",
              ("cross_flow_unmixed", True): "crossflow", ("cross_flow_unmixed", False): "crossflow",
              ("cross_flow_hot_mixed", True): "crossflow, mixed Cmin",
              ("cross_flow_hot_mixed", False): "crossflow, mixed Cmax",
              ("shell_and_tube_1_2", True): "S&T", ("shell_and_tube_1_2", False): "S&T"}


def test_registry_matches_schema():
    assert tuple(ARRANGEMENTS) == ARRANGEMENT_NAMES


@pytest.mark.parametrize("key", list(HT_SUBTYPE))
@pytest.mark.parametrize("ntu", NTUS)
@pytest.mark.parametrize("cr", [c for c in CRS if c > 0.0])
def test_effectiveness_matches_ht(key, ntu, cr):
    # ht.effectiveness_from_NTU (Incropera/Shah closed forms; crossflow unmixed: exact integral, Triboix 2009)
    arr, hot_min = key
    ours = effectiveness(arr, ntu, cr, hot_min)
    theirs = ht.effectiveness_from_NTU(ntu, cr, subtype=HT_SUBTYPE[key])
    assert ours == pytest.approx(theirs, rel=1e-9, abs=1e-12)


@pytest.mark.parametrize("key", [k for k in HT_SUBTYPE if k[0] != "cross_flow_unmixed"])
@pytest.mark.parametrize("ntu", NTUS)
@pytest.mark.parametrize("cr", [0.2, 0.55, 0.9])
def test_ntu_inverse_matches_ht(key, ntu, cr):
    # ht.NTU_from_effectiveness: the closed-form inverses of Incropera eqs. 11.29b–11.34b
    arr, hot_min = key
    eps = effectiveness(arr, ntu, cr, hot_min)
    theirs = ht.NTU_from_effectiveness(eps, cr, subtype=HT_SUBTYPE[key])
    assert ntu_from_effectiveness(arr, eps, cr, hot_min) == pytest.approx(theirs, rel=1e-8)
    assert ntu_from_effectiveness(arr, eps, cr, hot_min) == pytest.approx(ntu, rel=1e-9)


@pytest.mark.parametrize("ntu", NTUS)
@pytest.mark.parametrize("cr", [0.2, 1.0])
def test_crossflow_unmixed_inverse_round_trip(ntu, cr):
    eps = crossflow_unmixed_effectiveness(ntu, cr)
    assert ntu_from_effectiveness("cross_flow_unmixed", eps, cr) == pytest.approx(ntu, rel=1e-9)


@pytest.mark.parametrize("arr", list(ARRANGEMENTS))
@pytest.mark.parametrize("ntu", NTUS)
def test_zero_capacity_ratio_is_condenser_limit(arr, ntu):
    # Incropera 2007 eq. 11.35a: for Cr = 0 every arrangement gives ε = 1 − exp(−NTU)
    assert effectiveness(arr, ntu, 0.0) == pytest.approx(1.0 - math.exp(-ntu), rel=1e-12)


@pytest.mark.parametrize("ntu", NTUS)
def test_counterflow_balanced_closed_form(ntu):
    # Incropera 2007 eq. 11.29a with Cr = 1: ε = NTU / (1 + NTU); and just off Cr = 1, continuous
    assert effectiveness("counter_flow", ntu, 1.0) == pytest.approx(ntu / (1 + ntu), rel=1e-14)
    assert effectiveness("counter_flow", ntu, 1.0 - 1e-9) == pytest.approx(ntu / (1 + ntu), rel=1e-7)


def test_crossflow_unmixed_near_incropera_approximation():
    # Incropera 2007 eq. 11.32 (approximate fit, both fluids unmixed); the exact series differs by
    # well under 2 % at moderate NTU (common practice, no source for the tolerance)
    ntu, cr = 2.0, 0.5
    approx = 1 - math.exp((1 / cr) * ntu ** 0.22 * (math.exp(-cr * ntu ** 0.78) - 1))
    assert crossflow_unmixed_effectiveness(ntu, cr) == pytest.approx(approx, rel=0.02)


@pytest.mark.parametrize("cr", [0.3, 1.0])
def test_shell_and_tube_limit(cr):
    # Incropera eq. 11.30a as NTU → ∞: ε → 2 / (1 + Cr + √(1+Cr²))
    lim = 2 / (1 + cr + math.sqrt(1 + cr * cr))
    assert max_effectiveness("shell_and_tube_1_2", cr) == pytest.approx(lim, rel=1e-14)
    assert effectiveness("shell_and_tube_1_2", 60.0, cr) == pytest.approx(lim, rel=1e-12)


def test_unreachable_effectiveness_is_a_temperature_cross():
    with pytest.raises(InputError, match=r"at most an effectiveness of 0\.5857"):
        ntu_from_effectiveness("shell_and_tube_1_2", 0.6, 1.0)
    with pytest.raises(InputError, match="arrangement"):
        effectiveness("spiral", 1.0, 0.5)


def test_crossflow_unmixed_within_rounding_of_its_limit_is_a_temperature_cross():
    # at Cr = 1 both-unmixed cross-flow tends to ε = 1 as NTU → ∞ (Incropera et al. 2007, Table 11.3);
    # an effectiveness the series reaches only beyond 10⁴ transfer units is refused, not a crash
    limit = max_effectiveness("cross_flow_unmixed", 1.0, True)
    eps = 0.5 * (crossflow_unmixed_effectiveness(1e4, 1.0) + limit)
    if eps < limit:
        with pytest.raises(InputError, match="temperatures cross"):
            ntu_from_effectiveness("cross_flow_unmixed", eps, 1.0)
    assert ntu_from_effectiveness("cross_flow_unmixed", 0.5, 1.0) == pytest.approx(
        ht.NTU_from_effectiveness(0.5, 1.0, subtype="crossflow"), rel=1e-6)  # ht library (C. Bell)


@pytest.mark.parametrize("ntu", [1e-4, 0.3, 1.0, 4.0, 25.0, 150.0])
@pytest.mark.parametrize("cr", [1e-8, 0.2, 0.75, 1.0])
def test_crossflow_unmixed_series_matches_scipy_incomplete_gamma(ntu, cr):
    # the same series (Shah & Sekulić 2003, Table 3.3) with scipy.special.gammainc for P(n+1, x)
    import math
    import numpy as np
    from scipy.special import gammainc
    from stagewright.core.exchanger.effectiveness import crossflow_unmixed_effectiveness
    n_max = int(ntu + 12.0 * math.sqrt(ntu) + 40.0)
    k = np.arange(1, n_max + 1, dtype=float)
    ref = float(np.sum(gammainc(k, ntu) * gammainc(k, cr * ntu)) / (cr * ntu)) if cr >= 1e-10 else -math.expm1(-ntu)
    assert crossflow_unmixed_effectiveness(ntu, cr) == pytest.approx(ref, rel=1e-13)


@pytest.mark.parametrize("ntu", [0.01, 0.3, 1.7, 4.0, 9.0])
@pytest.mark.parametrize("cr", [1e-6, 0.05, 0.37, 0.8, 1.0])
def test_crossflow_unmixed_inverse_matches_ht(ntu, cr):
    # issue 15 (speed): Newton steps with the series' exact slope replaced Brent's method; checked
    # against ht.NTU_from_effectiveness (C. Bell's ht library, its own numerical inverse of the
    # exact cross-flow relation) and by the round trip through our series
    eps = crossflow_unmixed_effectiveness(ntu, cr)
    ours = ntu_from_effectiveness("cross_flow_unmixed", eps, cr)
    assert ours == pytest.approx(ntu, rel=1e-10)
    if eps < 0.999:  # near ε = 1 ht's own solve fails to converge (its integral loses precision)
        assert ours == pytest.approx(ht.NTU_from_effectiveness(eps, cr, subtype="crossflow"), rel=1e-6)


@pytest.mark.parametrize("ntu", [0.01, 0.3, 1.7, 4.0, 9.0])
@pytest.mark.parametrize("cr", [1e-6, 0.05, 0.37, 1.0])
@pytest.mark.parametrize("start_factor", [0.5, 0.999, 1.0, 1.001, 3.0])
def test_crossflow_unmixed_inverse_from_a_start_finds_the_same_ntu(ntu, cr, start_factor):
    # a rating starts each inversion from the zone's NTU at its previous sizing: the same root as the
    # round trip through the series (and as ht.NTU_from_effectiveness, above), whatever the start
    eps = crossflow_unmixed_effectiveness(ntu, cr)
    ours = ntu_from_effectiveness("cross_flow_unmixed", eps, cr, start=ntu * start_factor)
    assert ours == pytest.approx(ntu, rel=1e-10)
    # (to 1e-11: at N = 9 and Cr ≈ 0, ε is within 1e-4 of 1 and its rounding moves N by 4e-13)
    assert ours == pytest.approx(ntu_from_effectiveness("cross_flow_unmixed", eps, cr), rel=1e-11)
