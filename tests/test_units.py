"""Display units: exact definitions from NIST SP 811 (2008), Appendix B."""
import pytest

from stagewright.gui.presentation.units import QUANTITIES, SYSTEMS, format_value, to_display, to_si, unit


def test_temperature_scales():
    assert to_display(273.15, "temperature", "SI") == pytest.approx(0.0, abs=1e-12)
    assert to_display(373.15, "temperature", "US") == pytest.approx(212.0, abs=1e-9)  # NIST SP 811
    assert to_display(233.15, "temperature", "US") == pytest.approx(-40.0, abs=1e-9)


def test_pressure_gauge_is_relative_to_site_barometric_pressure():
    u = unit("pressure", "SI", gauge=True, barometric_Pa=95_000.0)
    assert u.symbol == "bar(g)"
    assert u.to_display(895_000.0) == pytest.approx(8.0)
    assert to_display(6894.757293168 + 101_325.0, "pressure", "US", gauge=True) == pytest.approx(1.0)


def test_us_power_and_flow():
    assert to_display(745.69987158, "power", "US") == pytest.approx(1.0)  # 1 hp (NIST SP 811)
    assert to_display(0.3048 ** 3 / 60.0, "volume_flow", "US") == pytest.approx(1.0)  # 1 cfm


@pytest.mark.parametrize("quantity", sorted(QUANTITIES))
@pytest.mark.parametrize("system", SYSTEMS)
def test_round_trip(quantity, system):
    assert to_si(to_display(412.345, quantity, system), quantity, system) == pytest.approx(412.345, rel=1e-12)


def test_format_value_uses_decimals_and_dash_for_missing():
    assert format_value(None, "power") == "—"
    assert format_value(123456.0, "power", with_unit=True) == "123.46 kW"


def test_humidity_ratio_and_condensate_units():
    # NIST SP 811: 1 grain = 64.79891 mg, 1 lb = 0.45359237 kg
    assert to_display(0.01, "humidity_ratio", "SI") == pytest.approx(10.0)
    assert to_display(64.79891e-6 / 0.45359237, "humidity_ratio", "US") == pytest.approx(1.0)
    assert to_display(1.0 / 3600.0, "water_flow", "SI") == pytest.approx(1.0)
    assert to_display(0.45359237 / 3600.0, "water_flow", "US") == pytest.approx(1.0)


def test_cooling_water_and_condensate_volume_flows():
    # NIST SP 811, Appendix B: 1 US gallon = 3.785411784 L exactly; gpm = US gallons per minute
    assert to_display(1.0 / 3600.0, "water_volume_flow", "SI") == pytest.approx(1.0)  # 1 m³/h
    assert to_display(3.785411784e-3 / 60.0, "water_volume_flow", "US") == pytest.approx(1.0)  # 1 US gpm
    assert to_display(1e-3 / 3600.0, "condensate_volume_flow", "SI") == pytest.approx(1.0)  # 1 L/h
    assert to_display(3.785411784e-3 / 3600.0, "condensate_volume_flow", "US") == pytest.approx(1.0)  # 1 gal/h
    assert unit("water_volume_flow", "US").symbol == "US gpm"
