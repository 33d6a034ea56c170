"""ISO 2533 standard atmosphere: published table values."""
import pytest

from stagewright.core.atmosphere import standard_elevation, standard_pressure
from stagewright.core.errors import InputError


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


# ---- the inverse: elevation for a barometric pressure -----------------------------------------

@pytest.mark.parametrize("z, p", [(0.0, 101_325.0), (500.0, 95_461.0), (1000.0, 89_875.0), (2000.0, 79_495.0)])
def test_elevation_matches_iso_2533_table(z, p):
    # ISO 2533:1975 table (geopotential altitude), pressures printed to 1 Pa: ±0.5 Pa is
    # about ±0.05 m at these altitudes (dp/dH ≈ −12 Pa/m near sea level, −10 Pa/m at 2 km)
    assert standard_elevation(p) == pytest.approx(z, abs=0.06)


@pytest.mark.parametrize("z", [-500.0, -123.4, 0.0, 1234.5, 5000.0, 8848.0, 11_000.0])
def test_elevation_is_the_inverse_of_the_pressure(z):
    # round trip of an inverse (closed form of the same ISO 2533 troposphere relation)
    assert standard_elevation(standard_pressure(z)) == pytest.approx(z, abs=1e-9)


def test_elevation_agrees_with_fluids_atmosphere_1976():
    # fluids.ATMOSPHERE_1976 (US Standard Atmosphere 1976, identical to ISO 2533 in the
    # troposphere) takes geometric altitude: 2000 m geometric is 1999.37 m geopotential
    # (H = r0 z / (r0 + z), r0 = 6 356 766 m: US Standard Atmosphere 1976, eq. 18, from memory)
    from fluids.atmosphere import ATMOSPHERE_1976
    r0, z = 6_356_766.0, 2000.0
    assert standard_elevation(ATMOSPHERE_1976(z).P) == pytest.approx(r0 * z / (r0 + z), abs=0.01)


@pytest.mark.parametrize("p", [20_000.0, 110_000.0, float("nan")])
def test_pressure_outside_the_troposphere_names_field_value_and_range(p):
    with pytest.raises(InputError, match=r"site\.barometric_pressure_Pa.*22632 Pa … 107478 Pa"):
        standard_elevation(p)
