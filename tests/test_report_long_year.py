"""A report of a project with an hourly year: a few pages, not one row per hour; every bin in the
year's CSV beside the report's CSV (an internal check of the report's layout: the year's physics is
checked in test_year_*.py)."""
import csv
import json
from pathlib import Path

from stagewright.core.year import run_year
from stagewright.gui.report import export_report
from stagewright.gui.report.csv_export import year_csv_path
from stagewright.gui.report.year_section import PDF_BINS_MAX, PDF_BINS_PICKED, _printed_bins

SAMPLE = Path(__file__).resolve().parent.parent / "sample_projects" / "three_stage_site_year.json"


def _hourly_bins(n: int) -> list[dict]:
    """An invented year of ``n`` hours: a daily and a yearly swing, −12 °C to 31 °C."""
    import math
    out = []
    for h in range(n):
        t = 282.0 + 12.0 * math.sin(2 * math.pi * (h / 8760.0 - 0.3)) + 6.0 * math.sin(2 * math.pi * h / 24.0)
        out.append({"label": f"hour {h + 1}", "temperature_K": round(t, 2), "relative_humidity": 0.7, "hours": 1.0})
    return out


def test_a_short_year_prints_every_bin_and_a_long_one_the_coldest_and_warmest():
    months = [{"temperature_K": 270.0 + k, "label": str(k)} for k in range(12)]
    assert _printed_bins(months) == (months, "")
    hours = _hourly_bins(8760)
    shown, title = _printed_bins(hours)
    assert len(shown) == 2 * PDF_BINS_PICKED and "of 8760 bins" in title
    temps = sorted(b["temperature_K"] for b in hours)
    assert min(b["temperature_K"] for b in shown) == temps[0]
    assert max(b["temperature_K"] for b in shown) == temps[-1]
    assert [hours.index(b) for b in shown] == sorted(hours.index(b) for b in shown)  # in the year's order
    assert len(_printed_bins(hours[:PDF_BINS_MAX])[0]) == PDF_BINS_MAX


def test_report_of_an_hourly_year_is_short_and_its_csv_holds_every_bin(tmp_path):
    doc = json.loads(SAMPLE.read_text(encoding="utf-8"))
    year = run_year(doc).to_dict()  # the sample's twelve months, each repeated as seven bins (84 > 60)
    year["bins"] = [dict(b, label=f"{b['label']} {k}", temperature_K=b["temperature_K"] + 0.1 * k)
                    for k in range(7) for b in year["bins"]]
    from stagewright.core import solve
    pages = export_report(doc, solve(doc).to_dict(), tmp_path / "r.pdf", tmp_path / "r.csv", year=year)
    assert pages < 20
    with open(year_csv_path(tmp_path / "r.csv"), encoding="utf-8", newline="") as fh:
        rows = list(csv.reader(fh))
    assert len(rows) == 1 + 84 and rows[0][0] == "label"
