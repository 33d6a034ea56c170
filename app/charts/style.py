"""Colours, fonts and axis styling shared by every Stagewright chart (window and report).

The palette is Stagewright's own: a slate-blue ink for text and frames, a copper tone for
compression, a sea-green tone for cooling, muted greys for reference lines and a plum tone
for limits. All sizes are in points so that a chart looks the same on screen and on paper.
"""
from __future__ import annotations

__all__ = ["INK", "MUTED", "GRID", "PAPER", "COMPRESSION", "COOLING", "ISOBAR", "AMBIENT", "LIMIT",
           "GAINED", "DESTROYED", "HEAT_EXERGY", "SHAFT", "SENSIBLE", "LATENT", "CASING",
           "MECHANICAL", "POWER", "TEMPERATURE", "INFEASIBLE", "FONT", "SIZE_TITLE", "SIZE_LABEL",
           "SIZE_TICK", "SIZE_NOTE", "style_axes", "prepare"]

import matplotlib
from matplotlib.figure import Figure

# Stagewright draws no mathematical text: "$" in a title, note or stage name is a dollar sign,
# never mathtext ("$\\foo$" raised, "$5 and $6" was set in italics; issue 22 item 10). Text
# objects read this when they are made, in the window's charts and in every report page.
matplotlib.rcParams["text.parse_math"] = False

# --- colours (Stagewright's own scheme) -------------------------------------------------------
INK = "#27323f"          # text, axes frames
MUTED = "#6b7785"        # secondary text
GRID = "#e3e7ec"         # grid lines
PAPER = "#ffffff"        # figure background
COMPRESSION = "#b8592b"  # compression paths (copper)
COOLING = "#2f8f83"      # cooling lines (sea green)
ISOBAR = "#a9b3bf"       # reference isobars
AMBIENT = "#5c7c3a"      # ambient temperature line (moss)
LIMIT = "#8e3b72"        # discharge-temperature limits (plum)
SHAFT = "#3d5a80"        # shaft power bar (slate blue)
GAINED = "#4f8a5b"       # exergy gained by the air
DESTROYED = "#c98a3b"    # exergy destroyed (ochre)
HEAT_EXERGY = "#7d6ba8"  # exergy leaving with heat (lavender)
SENSIBLE = "#3f88a6"     # sensible cooler duty
LATENT = "#9cc9dc"       # latent cooler duty
CONDENSATE = "#5f8f9e"   # exergy leaving with drained condensate (slate teal)
CASING = "#d08c60"       # casing heat loss
MECHANICAL = "#8a6d5a"   # mechanical losses
POWER = SHAFT            # staging chart: driver power
TEMPERATURE = COMPRESSION  # staging chart: discharge temperature
INFEASIBLE = "#b0b7bf"   # staging chart: infeasible arrangements

# --- fonts (DejaVu Sans ships with matplotlib: identical on every machine and in PDFs) --------
FONT = "DejaVu Sans"
SIZE_TITLE = 10.5
SIZE_LABEL = 9.0
SIZE_TICK = 8.0
SIZE_NOTE = 7.5


def prepare(fig: Figure) -> None:
    """Clear a figure and give it Stagewright's background and a constrained layout.

    ``fig`` may also be a ``SubFigure`` (the report puts two charts on one page); its
    parent figure then owns the layout engine and should use the constrained one.
    """
    fig.clear()
    fig.set_facecolor(PAPER)
    if hasattr(fig, "set_layout_engine"):
        fig.set_layout_engine("constrained")


def style_axes(ax, title: str | None = None, xlabel: str | None = None, ylabel: str | None = None,
               grid_axis: str = "both") -> None:
    """Apply the house axis style: light frame, soft grid, consistent font sizes."""
    ax.set_facecolor(PAPER)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    for side in ("left", "bottom"):
        ax.spines[side].set_color(MUTED)
        ax.spines[side].set_linewidth(0.8)
    ax.tick_params(labelsize=SIZE_TICK, colors=INK, length=3, width=0.7)
    for lab in ax.get_xticklabels() + ax.get_yticklabels():
        lab.set_fontfamily(FONT)
    if grid_axis:
        ax.grid(True, axis=grid_axis, color=GRID, linewidth=0.7, zorder=0)
        ax.set_axisbelow(True)
    if title:
        ax.set_title(title, fontsize=SIZE_TITLE, color=INK, fontfamily=FONT, loc="left", pad=8)
    if xlabel:
        ax.set_xlabel(xlabel, fontsize=SIZE_LABEL, color=INK, fontfamily=FONT)
    if ylabel:
        ax.set_ylabel(ylabel, fontsize=SIZE_LABEL, color=INK, fontfamily=FONT)
