"""File names suggested for a project and its report, made from the project's title. Qt-free.

The name must be valid on Windows, macOS and Linux alike, since projects travel between them:
no ``< > : " / \\ | ? *`` or control characters, no trailing dot or space, none of Windows'
reserved device names (Microsoft, "Naming Files, Paths, and Namespaces"). Letters of any script
and signs such as ``³`` or ``—`` are kept.
"""
from __future__ import annotations

__all__ = ["file_stem_for", "with_suffix_added", "MAX_STEM"]

import re

MAX_STEM = 80
_SEPARATORS = re.compile(r"\s*[/\\]+\s*")
_FORBIDDEN = re.compile(r'[<>:"|?*\x00-\x1f\x7f]+')
_RESERVED = {"CON", "PRN", "AUX", "NUL", *(f"COM{i}" for i in range(1, 10)), *(f"LPT{i}" for i in range(1, 10))}


def file_stem_for(title: str | None, fallback: str = "Untitled") -> str:
    """A file name without extension made from a project title.

    Parameters
    ----------
    title : str or None
        The project's title.
    fallback : str
        The name when the title leaves nothing usable.

    Returns
    -------
    str
        At most :data:`MAX_STEM` characters, cut at a word where possible.

    Examples
    --------
    >>> file_stem_for("Plant air 2027")
    'Plant air 2027'
    >>> file_stem_for('Hall B: 18 m³/min at 8 bar "draft"?')
    'Hall B 18 m³-min at 8 bar draft'
    >>> file_stem_for("  ...  ")
    'Untitled'
    >>> file_stem_for("nul")
    'nul project'
    """
    text = _SEPARATORS.sub("-", str(title or ""))
    text = _FORBIDDEN.sub(" ", text)
    text = " ".join(text.split()).strip(" .-")
    if len(text) > MAX_STEM:
        cut = text[:MAX_STEM]
        text = (cut.rsplit(" ", 1)[0] if " " in cut[MAX_STEM // 2:] else cut).rstrip(" .-")
    if not text:
        return fallback
    if text.split(".")[0].upper() in _RESERVED:
        text += " project"
    return text


def with_suffix_added(name: str, suffix: str) -> tuple[str, bool]:
    """``name`` ending in ``suffix`` (case-insensitive); and whether it had to be added.

    Examples
    --------
    >>> with_suffix_added("/tmp/plant", ".json")
    ('/tmp/plant.json', True)
    >>> with_suffix_added("/tmp/Plant.JSON", ".json")
    ('/tmp/Plant.JSON', False)
    """
    if name.lower().endswith(suffix.lower()):
        return name, False
    return name + suffix, True
