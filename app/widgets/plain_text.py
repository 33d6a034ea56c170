"""Text from files is shown as text: never as markup.

Qt guesses whether a tooltip, a label or a message box holds rich text (``Qt::mightBeRichText``)
and renders it as HTML when it looks like markup, so a project file's key name, title or stage
name could show a local image, fake text or a link in a dialog or tooltip. Every widget that
shows text it did not write itself goes through here: tooltips are escaped and wrapped
(:func:`plain_tip`), labels and message boxes are set to plain text (:func:`plain_label`).
"""
from __future__ import annotations

__all__ = ["plain_tip", "plain_label"]

import html

from PySide6.QtCore import Qt


def plain_tip(text: str) -> str:
    """A tooltip showing ``text`` literally (markup escaped; line breaks and spacing kept).

    Tooltips have no plain-text mode, so the text is escaped and wrapped as rich text of our
    own: Qt renders exactly the characters given. Text without ``<`` or ``&`` cannot be taken
    for markup and is returned unchanged.
    """
    if "<" not in text and "&" not in text:
        return text  # nothing Qt could take for markup: shown as it is
    return f"<p style='white-space:pre-wrap'>{html.escape(text, quote=False)}</p>"


def plain_label(widget):
    """Set a ``QLabel`` or ``QMessageBox`` to show its text as plain text; returns it."""
    widget.setTextFormat(Qt.PlainText)
    return widget
