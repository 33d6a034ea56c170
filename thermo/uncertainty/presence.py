"""Whether a project asks for a field check's uncertainty (a module without numpy: the window asks
while it opens)."""
from __future__ import annotations

__all__ = ["has_field_check"]


def has_field_check(doc: dict) -> bool:
    """True when the document states an uncertainty for at least one measured input.

    Examples
    --------
    >>> has_field_check({"field_check": {"uncertainties": {"discharge_pressure_Pa": {"kind": "standard"}}}})
    True
    >>> has_field_check({})
    False
    """
    section = doc.get("field_check") if isinstance(doc, dict) else None
    return bool(isinstance(section, dict) and section.get("uncertainties"))
