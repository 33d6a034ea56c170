"""The bracketed root finder against scipy.optimize.brentq (a general-purpose reference)."""
import math

import pytest
from scipy.optimize import brentq

from stagewright.core.roots import bracketed_root


@pytest.mark.parametrize("f, lo, hi", [
    (lambda x: x ** 3 - 2 * x - 5, 2.0, 3.0),          # Wallis's classical test equation
    (lambda x: math.exp(x) - 10.0, 0.0, 5.0),
    (lambda x: 1e5 * (1.2 * x) ** 3 - 9e5, 1.0, 40.0),  # a delivered-pressure-like cubic
    (lambda x: math.cos(x) - x, 0.0, 1.0),
])
def test_agrees_with_brentq(f, lo, hi):
    assert bracketed_root(f, lo, hi) == pytest.approx(brentq(f, lo, hi, xtol=1e-15), rel=1e-12)


def test_refuses_a_bracket_without_sign_change():
    with pytest.raises(ValueError, match="same sign"):
        bracketed_root(lambda x: x * x + 1.0, -1.0, 1.0)


def test_flat_ends_do_not_give_nan():
    # a step-like function: both ends equal in size, regula falsi must not divide 0 by 0
    x = bracketed_root(lambda x: 1.0 if x > 0.3 else -1.0, 0.0, 1.0, xtol=1e-12)
    assert x == pytest.approx(0.3, abs=1e-9)
