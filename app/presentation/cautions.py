"""Safety cautions shown in the Help menu, the messages area and every report.

One text for all places, so the window and the printed report never disagree.
"""
from __future__ import annotations

__all__ = ["CAUTIONS", "DEFERRAL", "cautions_text"]

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


def cautions_text() -> str:
    """All cautions and the deferral to local codes as plain text."""
    body = "\n\n".join(f"{title}: {text}" for title, text in CAUTIONS)
    return f"{body}\n\n{DEFERRAL}"
