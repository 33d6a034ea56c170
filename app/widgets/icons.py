"""The workbench's own SVG icons (``icons/`` at the top of the repository)."""
from __future__ import annotations

__all__ = ["icon", "ICON_DIR"]

from functools import lru_cache
from pathlib import Path

from PySide6.QtGui import QIcon

ICON_DIR = Path(__file__).resolve().parents[2] / "icons"


@lru_cache(maxsize=None)
def icon(name: str) -> QIcon:
    """``icon("stage_add")`` → ``icons/stage_add.svg`` (an empty icon if the file is missing)."""
    path = ICON_DIR / f"{name}.svg"
    return QIcon(str(path)) if path.is_file() else QIcon()
