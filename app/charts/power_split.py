"""Power-split chart: where the shaft power of a train goes, on a plain matplotlib ``Figure``.

Left panel, an exergy cascade read from the top: the shaft power, then the exergy destroyed
in the intake filter, in each stage and in each cooler, then the exergy carried out with
rejected heat and, for moist intake air, the exergy leaving with the drained condensate
(``condensate_exergy_W``), leaving the exergy gained by the air (the bars close on the shaft
power within the result's exergy residual). A negative term — heat rejected to a sink colder
than ambient — is drawn hatched, adding back to the cascade.

Right panel, the first-law view: the heat rejected by each cooler (sensible and latent parts
when the result gives ``sensible_duty_W`` / ``latent_duty_W``) and, for each stage, the
casing heat loss and the mechanical losses. A cooler that drains condensate has the drained
water flow written after its total.

Bars carry gids (``"exergy-shaft"``, ``"exergy-stage-1"``, ``"heat-cooler-1"`` …) for tests.
"""
from __future__ import annotations

__all__ = ["draw_power_split", "exergy_items", "heat_items", "drained_water"]

from matplotlib.figure import Figure
from matplotlib.patches import Patch

from stagewright.gui.presentation import units
from stagewright.gui.charts import style


def exergy_items(result: dict) -> list[tuple[str, str, float]]:
    """(gid suffix, label, exergy [W]) taken off the shaft power, in flow order.

    The sum of these and the exergy gained by the air equals the shaft power (to the
    result's ``exergy_residual``); for moist air that includes the exergy of the drained
    condensate, which leaves the train as liquid water above the dead state.
    """
    items = [("filter", "Intake filter", result["inlet_filter"]["exergy_destroyed_W"])]
    for i, st in enumerate(result["stages"], 1):
        items.append((f"stage-{i}", f"Stage {i}", st["exergy_destroyed_W"]))
        c = st.get("cooler")
        if c:
            items.append((f"cooler-{i}", f"Cooler {i}", c["exergy_destroyed_W"]))
    items.append(("heat", "Out with rejected heat", result["heat_exergy_W"]))
    if result.get("condensate_exergy_W"):
        items.append(("condensate", "Out with condensate", result["condensate_exergy_W"]))
    return items


def drained_water(result: dict) -> list[float]:
    """Condensate drained by each cooler's separator, [kg/s] (0 where none or no cooler), in stage order."""
    return [((st.get("cooler") or {}).get("drained_kg_s") or 0.0) for st in result["stages"]]


def heat_items(result: dict) -> list[tuple[str, str, list[tuple[str, float]]]]:
    """(gid suffix, label, [(part, heat [W]), ...]) of every heat-rejecting component.

    Parts are ``"sensible"``/``"latent"`` for coolers (``"sensible"`` only, equal to the
    duty, when the result gives no split) and ``"casing"``/``"mechanical"`` for stages.
    """
    rows = []
    for i, st in enumerate(result["stages"], 1):
        losses = [("casing", st.get("heat_loss_W") or 0.0), ("mechanical", st.get("mechanical_loss_W") or 0.0)]
        if any(v > 0.0 for _, v in losses):
            rows.append((f"stage-{i}", f"Stage {i}", losses))
        c = st.get("cooler")
        if c:
            sens, lat = c.get("sensible_duty_W"), c.get("latent_duty_W")
            if sens is None and lat is None:
                parts = [("sensible", c["duty_W"])]
            else:
                lat = lat or 0.0
                parts = [("sensible", c["duty_W"] - lat if sens is None else sens), ("latent", lat)]
            rows.append((f"cooler-{i}", f"Cooler {i}", parts))
    return rows


# each panel's legend sits in an empty axes of its own under the panel (a row of the grid): the layout
# then keeps it clear of the panel's x label and within the panel's width, whatever the figure's size
_LEGEND_BELOW = dict(loc="upper left", bbox_to_anchor=(0.0, 1.0), ncol=1, fontsize=style.SIZE_NOTE,
                     frameon=False, handlelength=1.4, borderaxespad=0.0)
_PART_COLOUR = {"sensible": style.SENSIBLE, "latent": style.LATENT,
                "casing": style.CASING, "mechanical": style.MECHANICAL}
_EXERGY_COLOUR = {"heat": style.HEAT_EXERGY, "condensate": style.CONDENSATE}
_PART_LABEL = {"sensible": "cooler, sensible", "latent": "cooler, latent (condensing)",
               "casing": "stage casing", "mechanical": "mechanical losses"}


def draw_power_split(fig: Figure, result: dict, system: str = "SI") -> Figure:
    """Draw the power split of a solved train into ``fig`` (cleared first).

    Parameters
    ----------
    fig : matplotlib.figure.Figure
        Figure to draw into (any back end).
    result : dict
        ``TrainResult.to_dict()`` of a solve.
    system : str
        Display units, ``"SI"`` or ``"US"``.

    Returns
    -------
    matplotlib.figure.Figure
        The same figure.
    """
    style.prepare(fig)
    (ax_x, ax_q), legends = fig.subplots(2, 2, width_ratios=[1.35, 1.0], height_ratios=[1.0, 0.01])
    for ax in legends:
        ax.set_axis_off()
    _legend(legends[0], _draw_exergy(ax_x, result, system))
    _legend(legends[1], _draw_heat(ax_q, result, system))
    return fig


def _legend(ax, handles: list) -> None:
    """The legend of the panel above ``ax`` (an empty axes), top left, one entry a line."""
    if not handles:
        return
    leg = ax.legend(handles=handles, **_LEGEND_BELOW)
    for t in leg.get_texts():
        t.set_color(style.INK)


def _draw_exergy(ax, result: dict, system: str) -> list:
    """The exergy cascade on ``ax``; returns its legend's handles."""
    pw = units.unit("power", system)
    shaft = result["shaft_power_W"]
    items = exergy_items(result)
    labels = ["Shaft power"] + [lab for _, lab, _ in items] + ["Gained by the air"]
    n = len(labels)
    ypos = list(range(n))[::-1]  # first row at the top
    h = 0.62
    ax.barh(ypos[0], pw.to_display(shaft), height=h, color=style.SHAFT, gid="exergy-shaft", zorder=3)
    run = shaft
    for (gid, _, v), yy in zip(items, ypos[1:-1]):
        colour = _EXERGY_COLOUR.get(gid, style.DESTROYED)
        if v >= 0.0:
            left, width, hatch = run - v, v, None
        else:  # adds exergy back: heat went to a sink colder than ambient
            left, width, hatch = run, -v, "////"
        ax.barh(yy, pw.to_display(width), left=pw.to_display(left), height=h, color=colour if hatch is None else "none",
                edgecolor=colour, hatch=hatch, linewidth=0.8 if hatch else 0, gid=f"exergy-{gid}", zorder=3)
        run -= v
    gained = result["exergy_gained_W"]
    ax.barh(ypos[-1], pw.to_display(gained), height=h, color=style.GAINED, gid="exergy-gained", zorder=3)

    values = [shaft] + [v for _, _, v in items] + [gained]
    ends = [shaft]
    run = shaft
    for _, _, v in items:
        ends.append(max(run, run - v))
        run -= v
    ends.append(gained)
    x_max = pw.to_display(max(ends))
    for yy, v, e in zip(ypos, values, ends):
        pct = 100.0 * v / shaft if shaft else 0.0
        ax.annotate(f"{units.format_value(v, 'power', system)}  ({pct:.1f} %)", (pw.to_display(e), yy),
                    xytext=(3, 0), textcoords="offset points", va="center", ha="left",
                    fontsize=style.SIZE_NOTE, color=style.INK, fontfamily=style.FONT)
    ax.set_yticks(ypos, labels)
    ax.set_xlim(0.0, x_max * 1.42)
    ax.set_ylim(-0.6, n - 0.4)
    style.style_axes(ax, title="Where the shaft power goes (exergy)",
                     xlabel=units.label("Power", "power", system), grid_axis="x")
    ax.tick_params(axis="y", length=0)
    handles = [Patch(color=style.DESTROYED, label="destroyed")]
    if result["heat_exergy_W"] >= 0.0:
        handles.append(Patch(color=style.HEAT_EXERGY, label="carried out with rejected heat"))
    else:
        handles.append(Patch(facecolor="none", edgecolor=style.HEAT_EXERGY, hatch="////",
                             label="heat to a sink below ambient (adds back)"))
    if any(gid == "condensate" for gid, _, _ in items):
        handles.append(Patch(color=style.CONDENSATE, label="out with drained condensate"))
    return handles


def _draw_heat(ax, result: dict, system: str) -> list:
    """The heat rejected on ``ax``; returns its legend's handles."""
    hu = units.unit("heat_flow", system)
    rows = heat_items(result)
    n = len(rows)
    ypos = list(range(n))[::-1]
    used = []
    totals = []
    for (gid, _, parts), yy in zip(rows, ypos):
        left = 0.0
        for part, v in parts:
            if v <= 0.0:
                continue
            ax.barh(yy, hu.to_display(v), left=hu.to_display(left), height=0.62, color=_PART_COLOUR[part],
                    gid=f"heat-{gid}-{part}", zorder=3)
            left += v
            if part not in used:
                used.append(part)
        totals.append(left)
    x_max = hu.to_display(max(totals + [1.0]))
    drained = drained_water(result)
    wide = False
    for (gid, _, _), yy, t in zip(rows, ypos, totals):
        text = units.format_value(t, "heat_flow", system)
        if gid.startswith("cooler-") and drained[int(gid.split("-")[1]) - 1] > 0.0:
            water = units.format_value(drained[int(gid.split("-")[1]) - 1], "water_flow", system, with_unit=True)
            text += f"\n{water} drained"
            wide = True
        ax.annotate(text, (hu.to_display(t), yy), xytext=(3, 0), gid=f"note-{gid}",
                    textcoords="offset points", va="center", ha="left", fontsize=style.SIZE_NOTE,
                    color=style.INK, fontfamily=style.FONT)
    ax.set_yticks(ypos, [lab for _, lab, _ in rows])
    if not rows:
        ax.text(0.5, 0.5, "No heat rejected:\nno coolers and no casing or mechanical losses",
                transform=ax.transAxes, ha="center", va="center", fontsize=style.SIZE_LABEL,
                color=style.MUTED, fontfamily=style.FONT)
        ax.set_xticks([])
    ax.set_xlim(0.0, x_max * (1.45 if wide else 1.3))
    ax.set_ylim(-0.6, max(n, 1) - 0.4)
    total = units.format_value(result["heat_rejected_W"], "heat_flow", system, with_unit=True)
    style.style_axes(ax, title=f"Heat rejected: {total}",
                     xlabel=units.label("Heat flow", "heat_flow", system) if rows else None,
                     grid_axis="x" if rows else "")
    ax.tick_params(axis="y", length=0)
    return [Patch(color=_PART_COLOUR[p], label=_PART_LABEL[p]) for p in used]
