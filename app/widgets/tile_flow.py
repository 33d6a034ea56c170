"""A layout that lines its items up in rows, wrapping to a new row when the width runs out, and
shares each row's spare width among the row's items (every row fills the width)."""
from __future__ import annotations

__all__ = ["TileFlowLayout"]

from PySide6.QtCore import QPoint, QRect, QSize, Qt
from PySide6.QtWidgets import QLayout, QLayoutItem, QWidget


class TileFlowLayout(QLayout):
    """Rows of tiles at their size hints, wrapped to the width, stretched to fill each row.

    The layout has a height for each width (:meth:`heightForWidth`); a widget in a dock, which
    Qt sizes from its minimum size rather than from that, calls :meth:`fit_height` on resize.
    """

    def __init__(self, parent: QWidget | None = None, spacing: int = 6):
        super().__init__(parent)
        self._items: list[QLayoutItem] = []
        self.setSpacing(spacing)

    # ---- QLayout's item list --------------------------------------------------------------
    def addItem(self, item: QLayoutItem) -> None:
        self._items.append(item)

    def count(self) -> int:
        return len(self._items)

    def itemAt(self, index: int):
        return self._items[index] if 0 <= index < len(self._items) else None

    def takeAt(self, index: int):
        return self._items.pop(index) if 0 <= index < len(self._items) else None

    # ---- sizes ---------------------------------------------------------------------------
    def expandingDirections(self):
        return Qt.Orientation(0)

    def hasHeightForWidth(self) -> bool:
        return True

    def heightForWidth(self, width: int) -> int:
        return self._arrange(QRect(0, 0, width, 0), move=False)

    def sizeHint(self) -> QSize:
        return self.minimumSize()

    def minimumSize(self) -> QSize:
        size = QSize()
        for item in self._visible():
            size = size.expandedTo(item.minimumSize())
        m = self.contentsMargins()
        return size + QSize(m.left() + m.right(), m.top() + m.bottom())

    def setGeometry(self, rect: QRect) -> None:
        super().setGeometry(rect)
        self._arrange(rect, move=True)

    # ---- arranging -----------------------------------------------------------------------
    def _visible(self) -> list[QLayoutItem]:
        return [i for i in self._items if not (i.widget() and i.widget().isHidden())]

    def rows(self, width: int) -> list[list[QLayoutItem]]:
        """The items of each row at ``width`` (the layout's inner width)."""
        rows: list[list[QLayoutItem]] = [[]]
        used = 0
        for item in self._visible():
            w = item.sizeHint().width()
            if rows[-1] and used + self.spacing() + w > width:
                rows.append([])
                used = 0
            used += (self.spacing() if rows[-1] else 0) + w
            rows[-1].append(item)
        return [r for r in rows if r]

    def _arrange(self, rect: QRect, move: bool) -> int:
        m = self.contentsMargins()
        inner = rect.adjusted(m.left(), m.top(), -m.right(), -m.bottom())
        y = inner.y()
        for row in self.rows(inner.width()):
            height = max(i.sizeHint().height() for i in row)
            natural = sum(i.sizeHint().width() for i in row) + self.spacing() * (len(row) - 1)
            spare = max(0, inner.width() - natural)
            x = inner.x()
            for k, item in enumerate(row):
                extra = spare // len(row) + (1 if k < spare % len(row) else 0)
                w = item.sizeHint().width() + extra
                if move:
                    item.setGeometry(QRect(QPoint(x, y), QSize(w, height)))
                x += w + self.spacing()
            y += height + self.spacing()
        used = y - self.spacing() - inner.y() if self._visible() else 0
        return used + m.top() + m.bottom()

    def fit_height(self, widget: QWidget) -> None:
        """Make ``widget`` (this layout's owner) exactly as tall as its rows at its width."""
        h = self.heightForWidth(widget.width())
        if widget.minimumHeight() != h or widget.maximumHeight() != h:
            widget.setFixedHeight(h)
