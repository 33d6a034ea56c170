"""The staging study's economic defaults, in a module of their own so that the window can show
them without loading the optimiser."""
from __future__ import annotations

__all__ = ["DEFAULT_OPERATING_HOURS", "DEFAULT_ENERGY_PRICE"]

#: Operating hours per year used for the yearly saving unless given (two shifts and
#: weekends, close to continuous; common practice, no source).
DEFAULT_OPERATING_HOURS = 8000.0
#: Energy price per kWh of driver input, in the user's currency, unless given (an
#: invented round figure, no source: always give your own tariff).
DEFAULT_ENERGY_PRICE = 0.15
