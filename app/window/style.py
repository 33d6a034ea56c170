"""The workbench's look: Fusion style, a light neutral palette, one accent colour (teal)."""
from __future__ import annotations

__all__ = ["apply_style", "ACCENT", "STYLE_SHEET"]

from PySide6.QtGui import QColor, QPalette
from PySide6.QtWidgets import QApplication

ACCENT = "#1f6f78"
PROBLEM = "#c0392b"

STYLE_SHEET = f"""
QMainWindow::separator {{ background: #dde2e7; width: 4px; height: 4px; }}
QDockWidget {{ font-weight: 600; }}
QDockWidget::title {{ background: #e9edf1; padding: 4px 8px; border-bottom: 1px solid #d3d9df; }}
QDockWidget > QWidget {{ font-weight: normal; }}
QLabel#sectionTitle {{ color: {ACCENT}; font-weight: 600; padding-top: 8px; }}
QLabel#unitLabel {{ color: #52606d; }}
QLabel#editRefusal {{ color: {PROBLEM}; }}
QLabel#footNote {{ color: #5b6b7a; font-size: 11px; }}
QLabel#staleBanner {{ background: #fff4e0; color: #7a4b00; border: 1px solid #f0c36d;
                      border-radius: 3px; padding: 4px 8px; }}
QLineEdit {{ padding: 2px 4px; border: 1px solid #c3cbd3; border-radius: 3px; background: white; }}
QLineEdit:focus {{ border: 1px solid {ACCENT}; }}
QLineEdit[invalid="true"] {{ border: 1px solid {PROBLEM}; background: #fdecea; }}
QTableWidget {{ gridline-color: #e3e7eb; }}
QTableWidget[stale="true"] {{ color: #9aa5b1; }}
QHeaderView::section {{ background: #f1f3f5; border: none; border-right: 1px solid #dde2e7;
                        border-bottom: 1px solid #dde2e7; padding: 3px 6px; font-weight: 600; }}
QListWidget#trainList::item {{ padding: 1px 2px; }}
QListWidget#trainList::item:selected {{ background: #d5ebed; color: #102a2d; }}
QListWidget#messagesList::item {{ padding: 3px 2px; border-bottom: 1px solid #eef1f4; }}
QStatusBar QLabel {{ padding: 0 8px; color: #3b4754; }}
QToolBar {{ spacing: 4px; border-bottom: 1px solid #dde2e7; }}
QTabBar::tab:selected {{ color: {ACCENT}; }}
"""


def apply_style(app: QApplication) -> None:
    """Fusion with a light palette whose highlight is the accent colour."""
    app.setStyle("Fusion")
    pal = app.palette()
    pal.setColor(QPalette.Window, QColor("#f6f7f9"))
    pal.setColor(QPalette.Base, QColor("#ffffff"))
    pal.setColor(QPalette.AlternateBase, QColor("#f7f9fa"))
    pal.setColor(QPalette.Highlight, QColor(ACCENT))
    pal.setColor(QPalette.HighlightedText, QColor("#ffffff"))
    pal.setColor(QPalette.WindowText, QColor("#1f2933"))
    pal.setColor(QPalette.Text, QColor("#1f2933"))
    pal.setColor(QPalette.Button, QColor("#eef1f4"))
    app.setPalette(pal)
    app.setStyleSheet(STYLE_SHEET)
