"""Page layout for printed reports: text, wrapped paragraphs, paginated tables and chart pages.

Everything is drawn with matplotlib text and lines on plain ``Figure`` objects sized as
paper pages, positioned in inches from the bottom-left corner of the page. Text widths are
measured with the Agg renderer (the same font metrics the PDF back end embeds), so wrapping
and column widths are exact rather than estimated. No Qt, no pyplot, no display.
"""
from __future__ import annotations

__all__ = ["PAPER_SIZES", "Column", "Table", "Pager", "text_width", "wrap"]

from dataclasses import dataclass, field
from functools import lru_cache

from matplotlib.backends.backend_agg import RendererAgg
from matplotlib.figure import Figure
from matplotlib.font_manager import FontProperties
from matplotlib.lines import Line2D
from matplotlib.patches import Rectangle

from stagewright.gui.charts import style

#: paper name -> (width, height), [in]; ISO 216 A4 is 210 mm × 297 mm, US Letter 8.5 in × 11 in
PAPER_SIZES = {"A4": (210.0 / 25.4, 297.0 / 25.4), "Letter": (8.5, 11.0)}

_MARGIN_X, _MARGIN_TOP, _MARGIN_BOTTOM = 0.75, 0.85, 0.8  # [in]
_BODY, _SMALL, _TABLE = 8.5, 7.0, 7.5  # font sizes [pt]
_HEADINGS = {1: 13.0, 2: 10.5}
_BAND = "#f2f4f7"  # alternate table rows
_RULE = "#9aa5b1"
_PAD_Y = 0.035  # cell padding above and below, [in]
_KEEP_WHOLE_ROWS = 20  # tables with at most this many rows are kept on one page

_MEASURE_DPI = 720.0  # measure at high resolution: glyph hinting at 72 dpi inflates widths
_renderer = RendererAgg(10, 10, _MEASURE_DPI)


@lru_cache(maxsize=20000)
def text_width(text: str, size: float, bold: bool = False) -> float:
    """Width of one line of text in the report font, [in]."""
    prop = FontProperties(family=style.FONT, size=size, weight="bold" if bold else "normal")
    w, _, _ = _renderer.get_text_width_height_descent(text, prop, ismath=False)
    return w / _MEASURE_DPI


def wrap(text: str, width_in: float, size: float, bold: bool = False) -> list[str]:
    """Greedy word wrap of ``text`` to ``width_in`` inches (explicit newlines kept).

    A single word wider than the line (a long field path, say) is broken between characters.
    """
    lines: list[str] = []
    for para in str(text).split("\n"):
        line = ""
        for word in para.split(" "):
            trial = f"{line} {word}" if line else word
            if text_width(trial, size, bold) <= width_in:
                line = trial
                continue
            if line:
                lines.append(line)
            line = word
            while len(line) > 1:
                cut = _fitting_prefix(line, width_in, size, bold)
                if cut >= len(line):
                    break
                lines.append(line[:cut])
                line = line[cut:]
        lines.append(line)
    return lines


def _fitting_prefix(text: str, width_in: float, size: float, bold: bool) -> int:
    """Length of the longest prefix of ``text`` that fits ``width_in`` (at least 1), measuring only
    prefixes up to about twice a line: a doubling search, then bisection. Linear in the text
    (a 20 000-character word took minutes when every shorter prefix was measured in turn)."""
    fits, probe = 1, 2
    while probe < len(text) and text_width(text[:probe], size, bold) <= width_in:
        fits, probe = probe, probe * 2
    if probe >= len(text):
        if text_width(text, size, bold) <= width_in:
            return len(text)
        probe = len(text)
    while probe - fits > 1:  # text[:fits] fits, text[:probe] does not
        mid = (fits + probe) // 2
        if text_width(text[:mid], size, bold) <= width_in:
            fits = mid
        else:
            probe = mid
    return fits


def _fair_shares(natural: list[float], available: float) -> list[float]:
    """Split ``available`` among columns wanting ``natural`` widths, max–min fairly."""
    shares = [0.0] * len(natural)
    left = list(range(len(natural)))
    while left:
        share = available / len(left)
        small = [j for j in left if natural[j] <= share]
        if not small:
            for j in left:
                shares[j] = share
            break
        for j in small:
            shares[j] = natural[j]
            available -= natural[j]
        left = [j for j in left if j not in small]
    return shares


@dataclass
class Column:
    """A table column: header text, unit text (second header row), alignment, wrapping."""

    header: str
    unit: str = ""
    align: str = "right"
    wrap: bool = False  #: wrap long cells (text columns); others set the column width


@dataclass
class Table:
    """A table to print: rows are lists of display strings, one per column."""

    title: str
    columns: list[Column]
    rows: list[list[str]]
    note: str = ""
    header: bool = True  #: False for key–value lists
    widths: list[float] | None = field(default=None)  #: column widths [in], computed if None
    row_notes: list[str] | None = None  #: per row, a remark printed under it across the table
    pairs: int = 1  #: a key–value list (no header) printed as this many label–value column pairs

    def is_label(self, column: int) -> bool:
        """Whether cells of ``column`` are labels of a key–value list (printed bold)."""
        return not self.header and column % (len(self.columns) // max(self.pairs, 1)) == 0


class Pager:
    """Lays report content out top to bottom over as many pages as it needs.

    Parameters
    ----------
    paper : str
        A key of :data:`PAPER_SIZES`.
    running_title : str
        Printed in the header of every page after the first.
    footer_left : str
        Printed at the bottom left of every page (file name, date).
    """

    def __init__(self, paper: str = "A4", running_title: str = "", footer_left: str = "") -> None:
        self.width, self.height = PAPER_SIZES[paper]
        self.running_title = running_title
        self.footer_left = footer_left
        self.pages: list[Figure] = []
        self.left = _MARGIN_X
        self.right = self.width - _MARGIN_X
        self.bottom = _MARGIN_BOTTOM
        self.page_fill: list[float] = []  #: share of the body height used on each page, once it is complete
        self.new_page()

    # ------------------------------------------------------------------ pages and cursor
    @property
    def content_width(self) -> float:
        return self.right - self.left

    def new_page(self) -> Figure:
        fig = Figure(figsize=(self.width, self.height))
        fig.set_facecolor(style.PAPER)
        if self.pages:
            self._draw_charts()
            self.page_fill.append(self.filled())
        self.pages.append(fig)
        self.fig = fig
        self.y = self.height - _MARGIN_TOP
        self._chart_blocks: list[tuple[float, float, list]] = []  # (top, bottom, draws) waiting on this page
        return fig

    def filled(self) -> float:
        """Share of the current page's body height used so far (0 on a fresh page, 1 when full)."""
        body = self.height - _MARGIN_TOP - self.bottom
        return min(1.0, max(0.0, (self.height - _MARGIN_TOP - self.y) / body))

    def space_left(self) -> float:
        return self.y - self.bottom

    def need(self, height_in: float) -> None:
        """Start a new page unless ``height_in`` inches still fit on this one."""
        if height_in > self.space_left() and self.y < self.height - _MARGIN_TOP - 1e-9:
            self.new_page()

    def gap(self, height_in: float) -> None:
        self.y -= height_in

    def _text(self, x: float, y: float, s: str, size: float, bold: bool = False, colour: str = style.INK,
              ha: str = "left", va: str = "baseline", italic: bool = False, fig: Figure | None = None):
        return (fig or self.fig).text(
            x / self.width, y / self.height, s, fontsize=size, fontfamily=style.FONT, color=colour,
            fontweight="bold" if bold else "normal", fontstyle="italic" if italic else "normal",
            ha=ha, va=va)

    def _rule(self, x0: float, x1: float, y: float, colour: str = _RULE, lw: float = 0.6) -> None:
        self.fig.add_artist(Line2D([x0 / self.width, x1 / self.width], [y / self.height] * 2,
                                   transform=self.fig.transFigure, color=colour, lw=lw))

    # ------------------------------------------------------------------------- text blocks
    def title(self, text: str, subtitle: str = "") -> None:
        for line in wrap(text, self.content_width, 17.0, bold=True):
            self.y -= 17.0 * 1.25 / 72.0
            self._text(self.left, self.y, line, 17.0, bold=True)
        if subtitle:
            self.y -= 0.08
            self.paragraph(subtitle, size=9.0, colour=style.MUTED)
        self.y -= 0.06
        self._rule(self.left, self.right, self.y, colour=style.SHAFT, lw=1.4)
        self.y -= 0.12

    def heading(self, text: str, level: int = 1, keep_with: float = 0.9) -> None:
        """A section heading, kept on the same page as the next ``keep_with`` inches."""
        size = _HEADINGS[level]
        h = size * 1.6 / 72.0
        self.need(h + keep_with)
        self.y -= h if self.y < self.height - _MARGIN_TOP - 1e-9 else size * 1.2 / 72.0
        self._text(self.left, self.y, text, size, bold=True, colour=style.SHAFT if level == 1 else style.INK)
        self.y -= 0.08 if level == 1 else 0.05

    def paragraph_height(self, text: str, size: float = _BODY, indent: float = 0.0, bold_lead: str = "") -> float:
        """Height :meth:`paragraph` takes for ``text``, [in]."""
        lead = f"{bold_lead} " if bold_lead else ""
        return len(wrap(lead + text, self.content_width - indent, size)) * size * 1.35 / 72.0 + 0.06

    def paragraph(self, text: str, size: float = _BODY, colour: str = style.INK, indent: float = 0.0,
                  italic: bool = False, bold_lead: str = "", keep_together: bool = False) -> None:
        """Wrapped text; a ``bold_lead`` is printed bold at its start (e.g. a caution title).

        ``keep_together`` moves the whole paragraph to the next page rather than split it.
        """
        lead = f"{bold_lead} " if bold_lead else ""
        lines = wrap(lead + text, self.content_width - indent, size)
        step = size * 1.35 / 72.0
        if keep_together:
            self.need(step * len(lines))
        for k, line in enumerate(lines):
            self.need(step)
            self.y -= step
            x = self.left + indent
            if k == 0 and lead and line.startswith(lead):
                self._text(x, self.y, bold_lead, size, bold=True, colour=colour)
                x += text_width(lead, size, bold=True)
                line = line[len(lead):]
            self._text(x, self.y, line, size, colour=colour, italic=italic)
        self.y -= 0.06

    # ------------------------------------------------------------------------------- tables
    def _fit(self, table: Table) -> tuple[list[float], float]:
        """Column widths [in] and font size [pt] that fit the content width.

        Columns are as wide as their widest cell. When that is too wide, wrapping (text)
        columns give up width, shared max–min fairly: a column narrower than its share keeps
        its natural width and the rest is split among the others; only when the text
        columns would get less than an inch each does the font shrink (down to 6 pt).
        """
        pad = 0.12
        size = _TABLE
        wrap_cols = [j for j, c in enumerate(table.columns) if c.wrap]
        while True:
            widths = []
            for j, col in enumerate(table.columns):
                cells = [r[j] for r in table.rows if j < len(r)]
                w = max([text_width(col.header, size, True), text_width(col.unit, size)]
                        + [text_width(c, size, table.is_label(j)) for c in cells] + [0.3])
                widths.append(w + pad)
            total = sum(widths)
            if total <= self.content_width:
                break
            if wrap_cols:
                fixed = sum(w for j, w in enumerate(widths) if j not in wrap_cols)
                shares = _fair_shares([widths[j] for j in wrap_cols], self.content_width - fixed)
                if shares and min(shares) >= 1.0 or size <= 6.0:
                    for j, w in zip(wrap_cols, shares):
                        widths[j] = max(w, 0.5)
                    return widths, size
            elif size <= 6.0:
                break
            size -= 0.5
        if total < self.content_width and wrap_cols:  # text columns take the spare width
            extra = (self.content_width - total) / len(wrap_cols)
            widths = [w + extra if j in wrap_cols else w for j, w in enumerate(widths)]
        elif total < self.content_width and table.header:  # spread the spare width over the columns
            extra = (self.content_width - total) / len(widths)
            widths = [w + extra for w in widths] if extra < 0.6 else [w + 0.3 for w in widths]
        return widths, size

    def _measure(self, table: Table):
        """Widths, font size, line height, wrapped cells, row heights and block heights of a table."""
        widths, size = table.widths and (table.widths, _TABLE) or self._fit(table)
        line_h = size * 1.32 / 72.0
        prepared = []
        for row in table.rows:
            cells = []
            for j, col in enumerate(table.columns):
                text = row[j] if j < len(row) else ""
                cells.append(wrap(text, widths[j] - 0.1, size) if col.wrap else str(text).split("\n"))
            prepared.append(cells)
        notes = [wrap(n, sum(widths) - 0.3, size - 0.5) if n else [] for n in
                 (table.row_notes or [""] * len(prepared))]
        heights = [(max(len(c) for c in cells) + len(nl)) * line_h + 2 * _PAD_Y
                   for cells, nl in zip(prepared, notes)]
        has_units = table.header and any(c.unit for c in table.columns)
        head_h = (line_h * (2 if has_units else 1) + 2 * _PAD_Y) if table.header else 0.0
        title_h = 10.0 * 1.5 / 72.0 if table.title else 0.0
        note_h = (len(wrap(table.note, self.content_width, _SMALL)) * _SMALL * 1.35 / 72.0 + 0.12
                  if table.note else 0.0)
        return widths, size, line_h, list(zip(prepared, notes)), heights, has_units, head_h, title_h, note_h

    def table_height(self, table: Table) -> float:
        """Height the whole table takes on one page, note included, [in]."""
        *_, heights, _, head_h, title_h, note_h = self._measure(table)
        return title_h + head_h + sum(heights) + 0.05 + note_h

    def table(self, table: Table) -> None:
        """Print a table, breaking across pages between rows and repeating its header."""
        widths, size, line_h, prepared, heights, has_units, head_h, title_h, note_h = self._measure(table)
        pad_y = _PAD_Y
        x0 = self.left
        xs = [x0]
        for w in widths:
            xs.append(xs[-1] + w)
        x_end = xs[-1]

        def start(continued: bool):
            if table.title:
                self.y -= title_h
                self._text(x0, self.y + 0.05, table.title + ("  (continued)" if continued else ""), 9.0,
                           bold=True, colour=style.INK)
            self._rule(x0, x_end, self.y, colour=style.INK, lw=0.8)
            if table.header:
                y = self.y - pad_y
                for j, col in enumerate(table.columns):
                    xa = xs[j] + 0.05 if col.align == "left" else xs[j + 1] - 0.05
                    self._text(xa, y - line_h * 0.8, col.header, size, bold=True, ha=col.align)
                    if has_units and col.unit:
                        self._text(xa, y - line_h * 1.8, col.unit, size - 0.5, colour=style.MUTED, ha=col.align)
                self.y -= head_h
                self._rule(x0, x_end, self.y, colour=_RULE, lw=0.6)

        whole = title_h + head_h + sum(heights) + 0.05 + note_h
        fresh = self.height - _MARGIN_TOP - self.bottom
        if len(heights) <= _KEEP_WHOLE_ROWS and whole <= fresh:
            self.need(whole)  # a short table is never split: it moves to the next page whole
        else:
            first = heights[0] if heights else 0.0
            self.need(title_h + head_h + first + min(2, len(heights)) * line_h + 0.05)
        start(False)
        for k, ((cells, note_lines), h) in enumerate(zip(prepared, heights)):
            if h > self.space_left():
                self._rule(x0, x_end, self.y, colour=style.INK, lw=0.8)
                self.new_page()
                start(True)
            if k % 2 == 1:
                self.fig.add_artist(Rectangle((x0 / self.width, (self.y - h) / self.height),
                                              (x_end - x0) / self.width, h / self.height,
                                              transform=self.fig.transFigure, facecolor=_BAND, edgecolor="none",
                                              zorder=-1))
            for j, (col, lines) in enumerate(zip(table.columns, cells)):
                xa = xs[j] + 0.05 if col.align == "left" else xs[j + 1] - 0.05
                bold = table.is_label(j)
                for m, line in enumerate(lines):
                    self._text(xa, self.y - pad_y - line_h * (m + 0.8), line, size, bold=bold, ha=col.align)
            first_note = max(len(c) for c in cells)
            for m, line in enumerate(note_lines):
                self._text(x0 + 0.25, self.y - pad_y - line_h * (first_note + m + 0.8), line, size - 0.5,
                           colour=style.MUTED, italic=True)
            self.y -= h
        self._rule(x0, x_end, self.y, colour=style.INK, lw=0.8)
        self.y -= 0.06
        if table.note:
            self.paragraph(table.note, size=_SMALL, colour=style.MUTED, keep_together=True)
        self.y -= 0.1

    # ------------------------------------------------------------------------------ charts
    def charts(self, heading: str, draws: list[tuple], gap_after: float = 0.15, shrink: float = 0.85) -> None:
        """A heading and the given charts stacked under it, on this page when they fit.

        ``draws`` holds ``(draw_function, height_in)`` pairs; each function is called with a
        sub-figure of the page (see :mod:`stagewright.gui.charts`) when the page is complete, so that one
        constrained layout, confined to the rectangle from the first chart's top to the last
        one's bottom, lays out every chart block of the page (the text between blocks keeps
        its place: the layout leaves those bands empty). Charts that fit the rest of the page
        only when a little lower (down to ``shrink`` of their height) are drawn that much
        lower rather than moved to a new page.
        """
        heading_h = _HEADINGS[1] * 1.6 / 72.0 + 0.13
        total = sum(h for _, h in draws)
        if self.y < self.height - _MARGIN_TOP - 1e-9:
            room = self.space_left() - heading_h - 0.05
            if total * shrink > room:
                self.new_page()
            elif total > room:
                draws = [(draw, h * room / total) for draw, h in draws]
                total = room
        self.heading(heading, keep_with=0.0)
        top = self.y - 0.05
        bottom = max(self.bottom, top - total)
        self._chart_blocks.append((top, bottom, draws))
        self.y = bottom - gap_after

    def _draw_charts(self) -> None:
        """Draw the chart blocks of the current page in one constrained layout (bands between them empty)."""
        blocks, self._chart_blocks = self._chart_blocks, []
        if not blocks:
            return
        top, bottom = blocks[0][0], blocks[-1][1]
        ratios, slots, y = [], [], top
        for b_top, b_bottom, draws in blocks:
            if y - b_top > 1e-6:  # text between two blocks: an empty band
                ratios.append(y - b_top)
                slots.append(None)
            scale = (b_top - b_bottom) / sum(h for _, h in draws)
            for draw, h in draws:
                ratios.append(h * scale)
                slots.append(draw)
            y = b_bottom
        fig = self.fig
        fig.set_layout_engine("constrained", rect=(self.left / self.width, bottom / self.height,
                                                   self.content_width / self.width, (top - bottom) / self.height))
        subs = fig.subfigures(len(ratios), 1, height_ratios=ratios, hspace=0.0, squeeze=False)[:, 0]
        for sub, draw in zip(subs, slots):
            if draw is not None:
                draw(sub)

    # ---------------------------------------------------------------------------- finishing
    def finish(self) -> list[Figure]:
        """Draw the last page's charts, add running headers and "page i of n" footers; return the pages."""
        self._draw_charts()
        self.page_fill.append(self.filled())
        n = len(self.pages)
        for i, fig in enumerate(self.pages, 1):
            y_foot = _MARGIN_BOTTOM * 0.5
            fig.add_artist(Line2D([self.left / self.width, self.right / self.width],
                                  [(y_foot + 0.16) / self.height] * 2, transform=fig.transFigure,
                                  color=_RULE, lw=0.5))
            self._text(self.left, y_foot, self.footer_left, _SMALL, colour=style.MUTED, fig=fig)
            self._text(self.right, y_foot, f"Page {i} of {n}", _SMALL, colour=style.MUTED, ha="right", fig=fig)
            if i > 1 and self.running_title:
                y_head = self.height - _MARGIN_TOP * 0.55
                self._text(self.left, y_head, self.running_title, _SMALL, colour=style.MUTED, fig=fig)
                self._text(self.right, y_head, "Stagewright", _SMALL, colour=style.MUTED, ha="right", fig=fig)
        return self.pages
