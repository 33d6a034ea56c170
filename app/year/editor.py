"""The year profile editor: months or bins in a unit-aware table, hours, load and prices.

Every change is one undo step through :meth:`stagewright.gui.window.editor.Editor.set_values`; an edit that
would make the year invalid is refused (see :func:`stagewright.gui.year.edits.refusal`) and the
document stays as it was, with the reason shown under the table.
"""
from __future__ import annotations

__all__ = ["YearEditor", "SCALAR_FIELDS", "KIND_CHOICES"]

import re

from PySide6.QtCore import Qt, Signal
from PySide6.QtWidgets import (QAbstractItemView, QComboBox, QFormLayout, QHBoxLayout, QHeaderView, QLabel, QLineEdit,
                               QPushButton, QScrollArea, QStackedWidget, QTableView, QVBoxLayout, QWidget)

from stagewright.gui.widgets.plain_text import plain_label
from stagewright.gui.presentation import units
from stagewright.gui.document.paths import ABSENT, get_in, is_related
from stagewright.gui.widgets.quantity_field import format_entry, parse_number
from stagewright.gui.widgets.signals_blocked import signals_blocked
from stagewright.gui.year.edits import (ENTRY_COLUMNS, cell_pairs, entries_path, profile_as, refusal,
                                        start_from_site, undo_text, with_entry_added, with_entry_removed)
from stagewright.gui.year.profile_model import ProfileTableModel

#: (path, label, quantity, unit text when the quantity has none, tooltip)
SCALAR_FIELDS = [
    ("year.operating_hours_per_year", "Operating hours", "hours", "",
     "Hours the train runs in a year. Empty: 8760 h spread by the days of each month (monthly), "
     "or the bins' own hours (bins)."),
    ("year.load", "Load", "fraction", "", "Share of the project's flow for entries without a load."),
    ("year.energy_price_per_kWh", "Energy price", "ratio", "per kWh", "Price of electric energy."),
    ("year.water_price_per_m3", "Water price", "ratio", "per m³", "Price of once-through cooling water."),
    ("year.coolers.ua_margin", "UA margin", "fraction", "",
     "Fouling margin on UA when the coolers are designed once: every bin is rated with the design UA "
     "plus this share (default 10 %, common practice, no source)."),
    ("year.coolers.max_dryer_inlet_temperature_K", "Dryer inlet max", "temperature", "",
     "Highest temperature of the air reaching the dryer; warmer bins are flagged. Empty: no limit."),
]
#: (path, label, [(value, text)], tooltip) of the year's choices
CHOICE_FIELDS = [
    ("year.coolers.mode", "Coolers", [("size_every_bin", "Sized every bin"), ("design_once", "Designed once")],
     "Sized every bin: each bin gets a perfect cooler for its entry. Designed once: each cooler with a "
     "coolant side is sized at the design condition, then every bin is rated at that fixed UA and "
     "coolant flow, so its outlet, duty and condensate move with the weather."),
    ("year.coolers.design_condition", "Design at", [("site", "Site as stated"), ("hottest_bin", "Hottest bin")],
     "Where the coolers are designed: the project's site as stated, or the year's hottest bin."),
]
KIND_CHOICES = [("monthly", "Monthly means"), ("bins", "Bins of hours")]
#: a change inside one entry of the profile: ``year.profile.bins[12].hours`` (group 1: the index)
_ENTRY_CHANGE = re.compile(r"^year\.profile\.(?:months|bins)\[(\d+)\](?:\.\w+)?$")
#: rows whose cell widths are measured when the table is filled (an 8760-row year is not measured row by row)
_WIDTH_SAMPLE_ROWS = 30
PLACEHOLDER_NOTE = ("Placeholders: every month holds the site's ambient temperature and humidity. "
                    "Replace them with the site's own monthly means.")


class YearEditor(QWidget):
    """Create and edit ``year``; ``refused(message)`` tells the panel about a refused edit."""

    refused = Signal(str)

    def __init__(self, editor, parent=None):
        super().__init__(parent)
        self.editor = editor
        self.stack = QStackedWidget()
        QVBoxLayout(self).setContentsMargins(0, 0, 0, 0)
        self.layout().addWidget(self.stack)
        self.stack.addWidget(self._empty_page())
        self.stack.addWidget(self._profile_page())
        editor.model.changed.connect(self._on_model_changed)
        editor.prefs.changed.connect(self.refresh)
        self.refresh()

    # ---- building ------------------------------------------------------------------------
    def _empty_page(self) -> QWidget:
        page = QWidget()
        lay = QVBoxLayout(page)
        lay.setContentsMargins(4, 8, 4, 4)
        text = QLabel("This project has no year at the site yet. Start from the site to get twelve "
                      "monthly entries at its ambient temperature and humidity, then type the site's "
                      "own monthly means over them.")
        text.setWordWrap(True)
        self.start_button = QPushButton("Start from the site")
        self.start_button.clicked.connect(self.start)
        row = QHBoxLayout()
        row.addWidget(self.start_button)
        row.addStretch(1)
        lay.addWidget(text)
        lay.addLayout(row)
        lay.addStretch(1)
        return page

    def _profile_page(self) -> QWidget:
        page = QWidget()
        lay = QVBoxLayout(page)
        lay.setContentsMargins(0, 2, 0, 0)
        bar = QHBoxLayout()
        bar.addWidget(QLabel("Profile"))
        self.kind = QComboBox()
        for _v, text in KIND_CHOICES:
            self.kind.addItem(text)
        self.kind.setToolTip("Monthly means: exactly 12 months. Bins of hours: any number of ambient "
                             "states, each with its hours. Switching keeps the year as it is solved.")
        self.kind.activated.connect(lambda i: self.set_kind(KIND_CHOICES[i][0]))
        self.import_button = QPushButton("Import CSV…")
        self.import_button.setToolTip("Read an hourly or logged profile from a CSV file (dry-bulb temperature, "
                                      "relative humidity, dew or frost point; optional load, coolant "
                                      "temperature, timestamps or hours), optionally binned.")
        self.import_button.clicked.connect(self._ask_import)
        self.add_button = QPushButton("Add bin")
        self.remove_button = QPushButton("Remove bin")
        self.delete_button = QPushButton("Delete year")
        self.delete_button.setToolTip("Remove the whole year profile from the project (undo brings it back).")
        self.add_button.clicked.connect(self.add_entry)
        self.remove_button.clicked.connect(self.remove_entry)
        self.delete_button.clicked.connect(self.delete_year)
        for w in (self.kind, self.import_button, self.add_button, self.remove_button):
            bar.addWidget(w)
        bar.addStretch(1)
        bar.addWidget(self.delete_button)
        lay.addLayout(bar)
        self.note = QLabel(PLACEHOLDER_NOTE)
        self.note.setObjectName("staleBanner")
        self.note.setWordWrap(True)
        lay.addWidget(self.note)
        body = QHBoxLayout()
        self.rows = ProfileTableModel(self.editor, self.set_cell, self)
        self.table = QTableView()
        self.table.setModel(self.rows)
        self.table.setMinimumHeight(60)
        self.table.verticalHeader().setVisible(False)
        self.table.verticalHeader().setSectionResizeMode(QHeaderView.Fixed)
        self.table.verticalHeader().setDefaultSectionSize(self.table.fontMetrics().height() + 8)
        self.table.horizontalHeader().setResizeContentsPrecision(_WIDTH_SAMPLE_ROWS)
        self.table.setSelectionBehavior(QAbstractItemView.SelectRows)
        self.table.setSelectionMode(QAbstractItemView.SingleSelection)
        self.table.setWordWrap(False)
        self.table.selectionModel().selectionChanged.connect(lambda *_a: self._update_buttons())
        body.addWidget(self.table, 1)
        form_box = QWidget()
        form = QFormLayout(form_box)
        form.setContentsMargins(6, 0, 0, 0)
        self.fields: dict[str, tuple[QLineEdit, QLabel, str]] = {}
        for path, label, quantity, unit_text, tip in SCALAR_FIELDS:
            edit = QLineEdit()
            edit.setAlignment(Qt.AlignRight | Qt.AlignVCenter)
            edit.setMinimumWidth(72)
            edit.setToolTip(tip)
            unit = QLabel(unit_text)
            unit.setObjectName("unitLabel")
            unit.setMinimumWidth(44)
            cell = QWidget()
            cl = QHBoxLayout(cell)
            cl.setContentsMargins(0, 0, 0, 0)
            cl.addWidget(edit, 1)
            cl.addWidget(unit)
            lab = QLabel(label)
            lab.setToolTip(tip)
            form.addRow(lab, cell)
            edit.editingFinished.connect(lambda p=path: self._commit_field(p))
            self.fields[path] = (edit, unit, quantity)
        from stagewright.core.year_design import DEFAULT_UA_MARGIN
        self.fields["year.coolers.ua_margin"][0].setPlaceholderText(f"{100 * DEFAULT_UA_MARGIN:g}")  # the default
        self.choices: dict[str, tuple[QComboBox, list]] = {}
        for path, label, options, tip in CHOICE_FIELDS:
            box = QComboBox()
            for _v, text in options:
                box.addItem(text)
            box.setToolTip(tip)
            box.activated.connect(lambda i, p=path, o=options: self.set_choice(p, o[i][0]))
            lab = QLabel(label)
            lab.setToolTip(tip)
            form.addRow(lab, box)
            self.choices[path] = (box, options)
        scroll = QScrollArea()  # the panel stays as short as the other bottom panels
        scroll.setWidget(form_box)
        scroll.setWidgetResizable(True)
        scroll.setFrameShape(QScrollArea.NoFrame)
        scroll.setHorizontalScrollBarPolicy(Qt.ScrollBarAlwaysOff)
        scroll.setMinimumWidth(form_box.sizeHint().width() + 16)
        body.addWidget(scroll, 0)
        lay.addLayout(body, 1)
        self.message = plain_label(QLabel())
        self.message.setObjectName("editRefusal")
        self.message.setWordWrap(True)
        self.message.hide()
        lay.addWidget(self.message)
        return page

    # ---- actions -------------------------------------------------------------------------
    def start(self) -> None:
        """Create a monthly year at the site's ambient state (one undo step)."""
        self._push([("year", start_from_site(self.editor.model.doc))], "Start the year from the site")

    def delete_year(self) -> None:
        self._push([("year", ABSENT)], "Delete the year at the site")

    def set_kind(self, kind: str) -> bool:
        text = "Give the year as " + dict(KIND_CHOICES)[kind].lower()
        return self._push(profile_as(self.editor.model.doc, kind), text)

    def add_entry(self) -> bool:
        rows = self.table.selectionModel().selectedRows()
        after = rows[0].row() if rows else None
        return self._push(with_entry_added(self.editor.model.doc, after), "Add a bin")

    def remove_entry(self) -> bool:
        rows = self.table.selectionModel().selectedRows()
        index = rows[0].row() if rows else self.rows.rowCount() - 1
        return self._push(with_entry_removed(self.editor.model.doc, index), f"Remove bin {index + 1}")

    def set_cell(self, row: int, key: str, text: str) -> bool:
        """Take ``text`` typed in the display unit for entry ``row``'s ``key``; False if refused."""
        doc = self.editor.model.doc
        value = self._read(text, next(c.quantity for c in ENTRY_COLUMNS if c.key == key))
        if isinstance(value, str) and key != "label":
            return self._refuse(value)
        return self._push(cell_pairs(doc, row, key, value), undo_text(f"{entries_path(doc)}[{row}].{key}", doc))

    def set_choice(self, path: str, value: str) -> bool:
        """Set one of the year's choices (cooler mode, design condition); one undo step."""
        return self._push([(path, value)], undo_text(path, self.editor.model.doc))

    def import_csv(self, path, units_chosen: dict | None = None, bin_steps: tuple | None = None) -> bool:
        """Replace the profile by the bins of a CSV file (one undo step); False, with the reason
        shown, when the file cannot be read — then nothing changes.

        Parameters
        ----------
        path : str or Path
            The CSV file (:mod:`stagewright.gui.document.year_csv`).
        units_chosen : dict, optional
            Units of columns whose header names none, e.g. ``{"temperature": "°F", "fraction": "%"}``.
        bin_steps : tuple, optional
            ``(kelvin, humidity fraction)``: bin the rows (:func:`stagewright.core.year_profile.bin_profile`).
        """
        from pathlib import Path
        from stagewright.core.errors import InputError
        from stagewright.core.year_profile import bin_profile
        from stagewright.gui.document.year_csv import read_profile_csv
        try:
            read = read_profile_csv(path, units_chosen)
        except (InputError, OSError) as exc:
            return self._refuse(f"Not imported: {exc}")
        rows = read.bins
        if bin_steps is not None:
            system = self.editor.prefs.system
            rows = bin_profile(rows, *bin_steps, label=lambda b: _bin_label(b, system))
        if len(rows) > 8784:
            return self._refuse(f"Not imported: {len(rows)} rows; a year holds at most 8784 bins.")
        doc = self.editor.model.doc
        pairs = [("year", {**(doc.get("year") or {}), "profile": {"kind": "bins", "bins": rows}})]
        pairs[0][1].pop("operating_hours_per_year", None)
        what = f"{read.rows} rows" + (f" in {len(rows)} bins" if bin_steps is not None else "")
        done = self._push(pairs, f"Import the profile {Path(path).name}")
        if done:
            self._say(f"Imported {what} from {Path(path).name}; " + "; ".join(read.notes))
        return done

    def _ask_import(self) -> None:  # pragma: no cover - dialogs; tests call import_csv
        from stagewright.gui.year.import_dialog import ask_import
        answer = ask_import(self)
        if answer is not None:
            self.import_csv(*answer)

    def set_field(self, path: str, text: str) -> bool:
        quantity = self.fields[path][2]
        value = self._read(text, quantity)
        if isinstance(value, str):
            return self._refuse(value)
        return self._push([(path, value)], undo_text(path, self.editor.model.doc))

    def _read(self, text: str, quantity: str | None):
        """SI value of typed text, ``ABSENT`` when empty, or a refusal message (str)."""
        text = text.strip()
        if quantity is None:
            return text or ABSENT
        if text == "":
            return ABSENT
        shown = parse_number(text)
        if shown is None:
            return f"Not changed: '{text}' is not a number (use digits, a point for decimals, e.g. 12.5)."
        return float(f"{units.to_si(shown, quantity, self.editor.prefs.system):.12g}")

    def _push(self, pairs: list, text: str) -> bool:
        if not pairs:
            return False
        why = refusal(self.editor.model.doc, pairs, self.editor.prefs.system)
        if why is not None:
            return self._refuse(why)
        self._say("")
        changed = self.editor.set_values(pairs, text)
        if not changed:
            self._refresh_fields()  # the table shows the document as it is; a field may hold typed text
        return changed

    def _say(self, message: str) -> None:
        self.message.setText(message)
        self.message.setVisible(bool(message))

    def _refuse(self, message: str) -> bool:
        """Show why an edit was not made; the document is unchanged, so the table (which reads it)
        shows its value again once the cell's editor closes, and the fields are filled afresh."""
        self._say(message)
        if self.editor.model.doc.get("year"):
            self._refresh_fields()
        self.refused.emit(message)
        return False

    def _commit_field(self, path: str) -> None:
        edit = self.fields[path][0]
        if edit.isModified():
            edit.setModified(False)
            self.set_field(path, edit.text())

    # ---- showing -------------------------------------------------------------------------
    def _on_model_changed(self, path: str) -> None:
        if path == "" or is_related(path, "site"):
            self.refresh()
            return
        if not is_related(path, "year"):
            return
        m = _ENTRY_CHANGE.match(path)
        if m and self.stack.currentIndex() == 1 and self.rows.count == len(self.rows.entries()) \
                and not (self.rows.monthly and path.endswith(".hours")):
            self._entry_changed(int(m.group(1)))  # one cell or one entry: repaint that row only
        else:
            self.refresh()

    def _entry_changed(self, row: int) -> None:
        self._say("")
        self.rows.entry_changed(row)
        self.table.scrollTo(self.rows.index(row, 0))  # undo and redo show what they changed
        if self.rows.monthly:
            self.note.setVisible(_is_placeholder(self.editor.model.doc))

    def refresh(self, keep_message: bool = False) -> None:
        doc = self.editor.model.doc
        year = doc.get("year")
        if not keep_message:
            self._say("")
        if not year:
            self.stack.setCurrentIndex(0)
            self.rows.reset()
            return
        self.stack.setCurrentIndex(1)
        system = self.editor.prefs.system
        kind = get_in(doc, "year.profile.kind", "monthly")
        monthly = kind == "monthly"
        self.kind.setCurrentIndex([k for k, _ in KIND_CHOICES].index(kind))
        self.rows.reset()
        self.table.resizeColumnsToContents()  # measures the first rows only (_WIDTH_SAMPLE_ROWS)
        self._refresh_fields()
        self.note.setVisible(monthly and _is_placeholder(doc))
        self._update_buttons()

    def _refresh_fields(self) -> None:
        """The year's own fields and choices as the document has them (a refused text goes)."""
        doc, system = self.editor.model.doc, self.editor.prefs.system
        for path, (edit, unit, quantity) in self.fields.items():
            value = get_in(doc, path, None)
            u = units.unit(quantity, system)
            if u.symbol:
                unit.setText(u.symbol)
            with signals_blocked(edit):
                edit.setText("" if value is None or value is ABSENT else format_entry(u.to_display(value), u.decimals))
                edit.setModified(False)
        for path, (box, options) in self.choices.items():
            value = get_in(doc, path, None)
            values = [v for v, _ in options]
            with signals_blocked(box):
                box.setCurrentIndex(values.index(value) if value in values else 0)

    def _update_buttons(self) -> None:
        bins = get_in(self.editor.model.doc, "year.profile.kind") == "bins"
        for b in (self.add_button, self.remove_button):
            b.setVisible(bins)
        self.remove_button.setEnabled(bins and self.rows.rowCount() > 1)


def _bin_label(b: dict, system: str) -> str:
    """A binned row named by its mean in display units, e.g. ``"-7.5 °C 84 %"``."""
    t = units.unit("temperature", system)
    return f"{t.to_display(b['temperature_K']):.1f} {t.symbol} {100 * b['relative_humidity']:.0f} %"


def _is_placeholder(doc: dict) -> bool:
    """True while every month still holds the site's own temperature and humidity."""
    months = get_in(doc, "year.profile.months", [])
    site = doc.get("site") or {}
    return len(months) == 12 and all(
        m.get("temperature_K") == site.get("ambient_temperature_K")
        and m.get("relative_humidity") == site.get("relative_humidity", 0.0) for m in months)
