"""ISO 8573-1 water classes (table values from memory, see thermo/moist/iso8573.py)."""
import pytest

from stagewright.core.moist.iso8573 import class_description, humidity_class


@pytest.mark.parametrize("pdp_C, cls", [(-75.0, "1"), (-70.0, "1"), (-50.0, "2"), (-25.0, "3"), (3.0, "4"),
                                        (5.0, "5"), (9.0, "6"), (10.0, "6"), (10.5, "7"), (35.0, "7")])
def test_vapour_classes_by_pressure_dew_point(pdp_C, cls):
    # ISO 8573-1:2010 Table 3 (from memory): classes 1–6 end at −70, −40, −20, +3, +7, +10 °C
    assert humidity_class(273.15 + pdp_C, 0.0) == cls


@pytest.mark.parametrize("g_m3, cls", [(0.3, "7"), (0.5, "7"), (2.0, "8"), (7.0, "9"), (12.0, "X")])
def test_liquid_classes_by_concentration(g_m3, cls):
    # ISO 8573-1:2010 Table 3 (from memory): liquid water ≤ 0.5, ≤ 5, ≤ 10 g/m³, X above
    assert humidity_class(278.15, g_m3 * 1e-3) == cls


def test_air_without_water_meets_class_1_and_descriptions_read():
    assert humidity_class(None, 0.0) == "1"
    assert "+3 °C" in class_description("4") and "X" in class_description("X")
