"""ISO 2533 standard atmosphere: published table values."""
import pytest

from thermo.atmosphere import standard_pressure
from thermo.errors import InputError


@pytest.mark.parametrize("z, p", [(0.0, 101_325.0), (500.0, 95_461.0), (1000.0, 89_875.0), (2000.0, 79_495.0)])
def test_pressure_matches_iso_2533_table(z, p):
    # ISO 2533:1975 table (geopotential altitude), printed to 1 Pa
    assert standard_pressure(z) == pytest.approx(p, abs=1.0)


def test_pressure_agrees_with_fluids_atmosphere_1976():
    # fluids.ATMOSPHERE_1976 (US Standard Atmosphere 1976) takes geometric altitude; at 1000 m
    # the difference to geopotential is ~0.16 m, about 2 Pa.
    from fluids.atmosphere import ATMOSPHERE_1976
    assert standard_pressure(1000.0) == pytest.approx(ATMOSPHERE_1976(1000.0).P, abs=5.0)


def test_out_of_range_elevation_names_field():
    with pytest.raises(InputError, match=r"site\.elevation_m.*−500 m … 11 000 m"):
        standard_pressure(12_000.0)
