"""Help ▸ Safety cautions and Help ▸ About. The cautions text comes from app/presentation/cautions.py."""
from __future__ import annotations

__all__ = ["CautionsDialog", "about_text"]

import html

from PySide6.QtWidgets import QDialog, QDialogButtonBox, QTextBrowser, QVBoxLayout

from stagewright.gui.presentation.cautions import CAUTIONS, DEFERRAL


def cautions_html() -> str:
    parts = ["<h3>Safety cautions</h3>"]
    for title, text in CAUTIONS:
        parts.append(f"<p><b>{html.escape(title)}.</b> {html.escape(text)}</p>")
    parts.append(f"<p><i>{html.escape(DEFERRAL)}</i></p>")
    return "".join(parts)


class CautionsDialog(QDialog):
    def __init__(self, parent=None):
        super().__init__(parent)
        self.setWindowTitle("Safety cautions — Stagewright")
        self.resize(620, 520)
        lay = QVBoxLayout(self)
        self.browser = QTextBrowser()
        self.browser.setHtml(cautions_html())
        lay.addWidget(self.browser)
        buttons = QDialogButtonBox(QDialogButtonBox.Close)
        buttons.rejected.connect(self.reject)
        lay.addWidget(buttons)


def about_text(version: str, eos: str) -> str:
    return (f"<h3>Stagewright {html.escape(version)}</h3>"
            "<p>A workbench for sizing compressed-air compression trains: stages, intercoolers and "
            "the aftercooler, with first- and second-law balances of every component.</p>"
            f"<p>Real-gas air properties: {html.escape(eos)}.</p>"
            f"<p><i>{html.escape(DEFERRAL)}</i></p>")
