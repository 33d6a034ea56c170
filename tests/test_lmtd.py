"""Log-mean temperature difference and F correction against ht and Bowman–Mueller–Nagle."""
import math

import ht
import pytest

from stagewright.core.errors import InputError
from stagewright.core.exchanger.effectiveness import effectiveness
from stagewright.core.exchanger.lmtd import correction_factor, counterflow_lmtd, log_mean


@pytest.mark.parametrize("temps", [(420.0, 305.0, 295.0, 330.0), (380.0, 300.0, 290.0, 370.0),
                                   (350.0, 320.0, 300.0, 330.0)])
def test_counterflow_lmtd_matches_ht(temps):
    # ht.LMTD (counterflow=True), Incropera 2007 eq. 11.15
    assert counterflow_lmtd(*temps) == pytest.approx(ht.LMTD(*temps), rel=1e-12)


def test_equal_differences_limit_and_textbook_value():
    assert log_mean(12.0, 12.0) == 12.0
    assert log_mean(12.0, 12.0 * (1 + 1e-12)) == pytest.approx(12.0, rel=1e-11)
    assert log_mean(60.0, 20.0) == pytest.approx(40.0 / math.log(3.0), rel=1e-14)  # eq. 11.15


def test_touching_temperatures_refused():
    with pytest.raises(InputError, match="touch or cross"):
        counterflow_lmtd(400.0, 300.0, 300.0, 350.0)


def _bmn(p, r):
    """Bowman, Mueller & Nagle (1940), Trans. ASME 62, 283: F of a 1-2 shell-and-tube exchanger."""
    s = math.sqrt(r * r + 1)
    return (s * math.log((1 - p) / (1 - p * r))) / (
        (r - 1) * math.log((2 - p * (r + 1 - s)) / (2 - p * (r + 1 + s))))


@pytest.mark.parametrize("thi,tho,tci,tco", [(400.0, 350.0, 300.0, 340.0), (450.0, 320.0, 290.0, 330.0),
                                             (380.0, 330.0, 300.0, 310.0)])
def test_shell_and_tube_factor_matches_fakheri_and_bmn(thi, tho, tci, tco):
    # ht.F_LMTD_Fakheri (Fakheri 2003, J. Heat Transfer 125, 1186) and the BMN closed form
    c_h, c_c = 1.0 / (thi - tho), 1.0 / (tco - tci)  # per unit duty
    cmin, cmax = min(c_h, c_c), max(c_h, c_c)
    eps = 1.0 / (cmin * (thi - tci))
    f = correction_factor("shell_and_tube_1_2", eps, cmin / cmax, c_h <= c_c)
    assert f == pytest.approx(ht.F_LMTD_Fakheri(thi, tho, tci, tco, shells=1), rel=1e-9)
    p, r = (tco - tci) / (thi - tci), (thi - tho) / (tco - tci)
    assert f == pytest.approx(_bmn(p, r), rel=1e-9)


def test_correction_factor_reproduces_duty():
    # Q = UA F ΔTlm,cf (Incropera 2007 eq. 11.18) for a cross-flow exchanger of known NTU
    ntu, cr, cmin = 1.7, 0.6, 1000.0
    eps = effectiveness("cross_flow_unmixed", ntu, cr)
    thi, tci = 420.0, 300.0
    q = eps * cmin * (thi - tci)
    tho, tco = thi - q / cmin, tci + q / (cmin / cr)
    f = correction_factor("cross_flow_unmixed", eps, cr)
    assert 0.0 < f < 1.0
    assert ntu * cmin * f * counterflow_lmtd(thi, tho, tci, tco) == pytest.approx(q, rel=1e-10)
