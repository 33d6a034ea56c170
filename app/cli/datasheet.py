"""``stagewright datasheet PROJECT … [--json] [--units SI|US]``.

The package's data-sheet figures: free air delivery, package input and package specific power
at the ISO 1217 reference conditions and at the site, full load and the project's
``package.part_loads``, through the package's capacity control, motor and auxiliaries
(:mod:`stagewright.core.part_load.data_sheet`). Reads the project's ``package`` section.
``--json`` prints a list, an entry per file (as ``solve --json``): ``{"file", "title",
"data_sheet"}``, or ``{"file", "error"}`` for a file that was rejected.
"""
from __future__ import annotations

__all__ = ["add_arguments", "format_data_sheet", "run", "SUMMARY", "EXAMPLES"]

import json
import sys

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths

#: one line in ``stagewright --help``
SUMMARY = "the package's data sheet: ISO 1217 reference and site, full and part loads"
#: the end of ``stagewright datasheet --help``
EXAMPLES = """\
examples:
  stagewright datasheet plant.json
  stagewright datasheet plant.json --units US
  stagewright datasheet plant.json --json

The project needs a 'package' section (capacity control, motor, auxiliaries).
--json prints one list for one file or several, as solve --json does.
"""


def add_arguments(p) -> None:
    """Options of ``stagewright datasheet``."""
    p.add_argument("--json", action="store_true", help="print JSON (SI) instead of tables")
    p.add_argument("--units", choices=("SI", "US"), default="SI", help="display units of the tables")


def _table(header: list, rows: list) -> list:
    widths = [max(len(h), *(len(r[j]) for r in rows)) for j, h in enumerate(header)]
    out = ["  ".join(h.rjust(w) if j else h.ljust(w) for j, (h, w) in enumerate(zip(header, widths))).rstrip(),
           "  ".join("-" * w for w in widths)]
    out += ["  ".join(c.rjust(w) if j else c.ljust(w) for j, (c, w) in enumerate(zip(r, widths))).rstrip()
            for r in rows]
    return out


def format_data_sheet(title: str, sheet: dict, system: str = "SI") -> str:
    """Plain-text data sheet of ``DataSheet.to_dict()`` in the display units of ``system``."""
    from stagewright.gui.presentation.units import format_value, unit
    q, p, sp = (unit(k, system).symbol for k in ("volume_flow", "power", "specific_power"))
    lines = [f"Package data sheet — {title or 'untitled project'}", f"Capacity control: {sheet['control']}", ""]
    for col in sheet["columns"]:
        lines.append(f"{col['label']}: inlet {format_value(col['inlet_pressure_Pa'], 'pressure', system, True)}, "
                     f"{format_value(col['inlet_temperature_K'], 'temperature', system, True)}, "
                     f"RH {format_value(col['relative_humidity'], 'fraction', system, True)}; discharge "
                     f"{format_value(col['discharge_pressure_Pa'], 'pressure', system, True)}")
        rows = [[f"{100.0 * pt['demand_fraction']:.0f}",
                 format_value(pt["delivered_fad_m3_s"], "volume_flow", system),
                 format_value(pt["driver_power_W"], "power", system),
                 format_value(pt["package_power_W"] - pt["driver_power_W"], "power", system),
                 format_value(pt["package_power_W"], "power", system),
                 format_value(None if pt["package_specific_power_J_m3"] is None
                              else pt["package_specific_power_J_m3"] / 60_000.0, "specific_power", system)]
                for pt in col["points"]]
        lines += _table(["load [%]", f"FAD [{q}]", f"driver [{p}]", f"auxiliaries [{p}]", f"package [{p}]",
                         f"specific [{sp}]"], rows) + [""]
    lines += [f"Note: {n}." for n in sheet["notes"]]
    lines.append("Caution: receivers and pressure vessels need their relief devices and inspections under local "
                 "codes; a start/stop or variable-speed machine may start without warning.")
    return "\n".join(lines)


def run(args) -> int:
    """Print the data sheet of every project named."""
    from stagewright.core import StagewrightError
    from stagewright.core.part_load.data_sheet import data_sheet
    from stagewright.core.project import load

    status, outputs = EXIT_OK, []
    for path in expand_paths(args.files):
        try:
            doc = load(path)
            sheet = data_sheet(doc).to_dict()
        except StagewrightError as exc:
            print(f"{path}: {exc}", file=sys.stderr)
            status = EXIT_INPUT
            outputs.append({"file": str(path), "error": str(exc)})
            continue
        outputs.append({"file": str(path), "title": doc.get("title", ""), "data_sheet": sheet})
    if args.json:  # one shape for one file and for several, as solve --json
        print(json.dumps(outputs, indent=2, allow_nan=False))
    else:
        for o in outputs:
            if "data_sheet" in o:
                print(format_data_sheet(o["title"], o["data_sheet"], args.units))
                print()
    return status
