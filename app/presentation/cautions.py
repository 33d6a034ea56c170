"""Safety cautions shown in the Help menu, the messages area and every report.

One text for all places, so the window and the printed report never disagree.
"""
from __future__ import annotations

__all__ = ["CAUTIONS", "DEFERRAL", "cautions_text", "WINTER", "ALL_CAUTIONS", "FREEZING_K", "below_freezing",
           "cautions_for", "PACKAGE_CAUTIONS", "package_cautions"]

DEFERRAL = (
    "Stagewright is a calculation aid. Its results do not replace the design review, "
    "inspection and sign-off that local codes require; the design, installation and operation "
    "of compressed-air systems must follow the applicable local codes, the manufacturers' "
    "instructions and licensed engineering practice."
)

CAUTIONS = (
    ("Discharge temperature",
     "High discharge temperatures degrade lubricants and seals and can ignite oil carbon deposits "
     "in discharge lines (a known cause of compressor fires and explosions). Respect the "
     "manufacturer's limit for every stage; limits around 150 °C are widely used for lubricated "
     "reciprocating machines (common practice; check the applicable standard)."),
    ("Pressure vessels and relief",
     "Receivers, coolers, separators and piping are pressure equipment. They must be designed, "
     "marked, inspected and protected by correctly sized relief valves according to the "
     "pressure-equipment rules that apply at the site. Never isolate a relief valve."),
    ("Hot surfaces",
     "Stage casings, discharge piping and cooler inlets run hot enough to burn. Guard or insulate "
     "them and allow them to cool before maintenance; lock out the driver and vent the system "
     "to atmospheric pressure before opening any part."),
    ("Condensate disposal",
     "Condensate from coolers and separators contains oil and other contaminants. Drain it "
     "regularly (automatic drains fail: check them) and treat or dispose of it as local "
     "environmental rules require; it must not go to a surface-water drain untreated."),
    ("Compressed air itself",
     "Compressed air can inject air or particles through skin, lift debris at speed and rupture "
     "hoses. Never point it at a person; use rated hoses, couplings and restraints."),
)


#: shown where the site or a month or bin of its year is below 0 °C (:func:`cautions_for`), and in Help
WINTER = (
    "Freezing condensate",
    "Below 0 °C the condensate of coolers and separators freezes wherever it meets the cold: in an "
    "air-cooled cooler, in a separator, drain valve or drain line outside a heated room, and in any "
    "cooler whose coolant is below 0 °C. A frozen drain lets water carry over to the dryer and the "
    "network, and ice can split a drain line, a trap or a separator bowl. Heat-trace and insulate "
    "drains and separators (or keep them indoors), check that automatic drains work in frost, and "
    "hold a minimum air outlet temperature above 0 °C on air-cooled coolers (louvres, fan control or "
    "a bypass) (common practice, no source).")

#: every caution, the winter one included (Help ▸ Safety cautions lists them all)
ALL_CAUTIONS = CAUTIONS + (WINTER,)

FREEZING_K = 273.15  #: 0 °C, [K]


def _profile_temperatures(doc: dict) -> list:
    """Ambient temperatures [K] of the year's months or bins in a project document (as stored)."""
    year = doc.get("year") if isinstance(doc, dict) else None
    profile = year.get("profile") if isinstance(year, dict) else None
    if not isinstance(profile, dict):
        return []
    rows = profile.get("months") or profile.get("bins") or []
    return [r.get("temperature_K") for r in rows if isinstance(r, dict)]


def below_freezing(doc: dict) -> bool:
    """Whether the site's ambient, or that of a month or bin of its year, is below 0 °C.

    Examples
    --------
    >>> below_freezing({"site": {"ambient_temperature_K": 288.15}})
    False
    >>> below_freezing({"site": {"ambient_temperature_K": 288.15},
    ...                 "year": {"profile": {"kind": "bins", "bins": [{"temperature_K": 265.0}]}}})
    True
    """
    site = doc.get("site") if isinstance(doc, dict) else None
    temps = [site.get("ambient_temperature_K")] if isinstance(site, dict) else []
    temps += _profile_temperatures(doc)
    return any(isinstance(t, (int, float)) and not isinstance(t, bool) and t < FREEZING_K for t in temps)


def cautions_for(doc: dict | None = None, warnings=(), year: dict | None = None) -> tuple:
    """The cautions a report or the window shows for a project: :data:`CAUTIONS`, and :data:`WINTER`
    when :func:`below_freezing` holds, a result warning says condensate would freeze, or a bin of
    the year does (``freezing_bins``).

    Parameters
    ----------
    doc : dict, optional
        The project document (None: the cautions every project gets).
    warnings : iterable of dict
        Result warnings (``{"field", "message"}``), e.g. ``TrainResult.to_dict()["warnings"]``.
    year : dict, optional
        The year at the site (``YearResult.to_dict()``).

    Examples
    --------
    >>> site = {"site": {"ambient_temperature_K": 283.15}}
    >>> WINTER in cautions_for(site), WINTER in cautions_for(site, year={"freezing_bins": ["Jan"]})
    (False, True)
    """
    freezing = any("freez" in str(w.get("message", "")).lower() for w in warnings)
    freezing = freezing or bool((year or {}).get("freezing_bins"))
    return ALL_CAUTIONS if freezing or (doc is not None and below_freezing(doc)) else CAUTIONS


#: cautions of a package with a capacity control (the package panel and the report's package section)
PACKAGE_CAUTIONS = (
    ("Receiver and relief",
     "The receiver a capacity control cycles on is a pressure vessel. It must be designed, marked, "
     "inspected and protected by a relief valve able to discharge the full delivery of every compressor "
     "that can feed it, as the pressure-equipment rules at the site require. A control's pressure band is "
     "no protection: never set it, or raise it, above the receiver's and the package's rated pressure."),
    ("Automatic restart",
     "A compressor under start/stop or variable-speed control stops when the demand falls and starts "
     "again without warning when the pressure drops. A stopped machine is not a safe one: mark it as "
     "starting automatically, and isolate and lock out the driver and vent the package before any work on it."),
    ("Data-sheet figures",
     "The data sheet states figures as this project computes them, at the stated reference conditions. "
     "Compare them with a supplier's only at the same conditions, the same delivery pressure and the same "
     "scope of auxiliaries; acceptance tests follow the applicable test standard, not this sheet."),
)


def package_cautions(control_kind: str) -> tuple:
    """The package cautions that matter for ``control_kind`` (restart only where the motor stops).

    Examples
    --------
    >>> [t for t, _ in package_cautions("modulation")]
    ['Receiver and relief', 'Data-sheet figures']
    """
    restarts = control_kind in ("start_stop", "variable_speed")
    return tuple(c for c in PACKAGE_CAUTIONS if restarts or c[0] != "Automatic restart")


def cautions_text() -> str:
    """All cautions and the deferral to local codes as plain text."""
    body = "\n\n".join(f"{title}: {text}" for title, text in CAUTIONS)
    return f"{body}\n\n{DEFERRAL}"
