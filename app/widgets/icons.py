"""The workbench's own SVG icons (``icons/`` at the top of the repository, package data in a wheel)."""
from __future__ import annotations

__all__ = ["icon", "ICON_DIR"]

from functools import lru_cache

from PySide6.QtGui import QIcon

from stagewright.gui.data_files import data_dir

ICON_DIR = data_dir("icons", "app.svg")


@lru_cache(maxsize=None)
def icon(name: str) -> QIcon:
    """``icon("stage_add")`` → ``icons/stage_add.svg`` (an empty icon if the file is missing)."""
    path = ICON_DIR / f"{name}.svg"
    return QIcon(str(path)) if path.is_file() else QIcon()
