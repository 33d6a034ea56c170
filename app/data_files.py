"""Where the workbench's own data files are: its icons and the demo projects.

In a checkout (and an editable install) they are the top-level ``icons/`` and
``sample_projects/`` folders of the repository; an installed wheel carries the same files as the
package data ``stagewright.gui.icons`` and ``stagewright.gui.sample_projects`` (pyproject.toml).
"""
from __future__ import annotations

__all__ = ["data_dir"]

from pathlib import Path

_REPOSITORY = Path(__file__).resolve().parents[1]


def data_dir(name: str, marker: str) -> Path:
    """The folder ``name`` (``"icons"`` or ``"sample_projects"``) holding the file ``marker``.

    Examples
    --------
    >>> (data_dir("icons", "app.svg") / "app.svg").is_file()
    True
    """
    here = _REPOSITORY / name
    if (here / marker).is_file():
        return here
    from importlib.util import find_spec  # an installed wheel: the package data (a folder without __init__)
    spec = find_spec(f"stagewright.gui.{name}")
    for folder in (spec.submodule_search_locations or []) if spec is not None else []:
        if (Path(folder) / marker).is_file():
            return Path(folder)
    return here
