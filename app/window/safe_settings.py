"""Window settings hold plain values only: a crafted settings file runs nothing.

Qt reads an ``@Variant(…)`` entry of a settings file by deserialising it, and PySide turns a
deserialised Python object back into one with :mod:`pickle` — code that runs as soon as the
file is first parsed (any ``value()``, even of another key). :func:`open_safely` therefore
checks the file *before* Qt reads it and removes every entry that is not plain data: byte
arrays (``saveState``/``saveGeometry``), text, numbers, true/false and lists of text are
kept; ``@Variant`` and every other ``@``-typed value, and escape sequences that could spell
one, are dropped. Values are also checked by type where they are read (:func:`byte_array`).
Settings kept outside a file (the Windows registry) are only type-checked.
"""
from __future__ import annotations

__all__ = ["open_safely", "remove_unsafe_entries", "byte_array", "text_value"]

import os
import re
from pathlib import Path

from PySide6.QtCore import QByteArray, QSettings

#: an element of a value that Qt would read as a typed value (``@Variant(``, ``@DateTime(`` …),
#: possibly after quotes; ``@@`` is Qt's escape of a text starting with ``@``
_TYPED_ELEMENT = re.compile(r'(?:^|,)[\s"]*@(?!@)')
#: escape sequences, read left to right (so ``\\\\x`` is an escaped backslash, then ``x``)
_ESCAPE = re.compile(r"\\(.)", re.DOTALL)
#: escapes that could spell any character (hex, octal, Unicode)
_CODE_ESCAPES = set("01234567xXuU")
#: a byte array (or nothing) as the whole value: unquoted, with no list separator or quote in it, or
#: quoted (Qt quotes a value with separators) with no unescaped quote inside — so no second,
#: typed element can follow it
_SAFE_TYPED = re.compile(r'^\s*(?:@ByteArray\((?:[^",;\\]|\\.)*\)|"@ByteArray\((?:[^"\\]|\\.)*\)"|@Invalid\(\))\s*$',
                         re.DOTALL)


def _safe_value(raw: str) -> bool:
    if _SAFE_TYPED.match(raw):
        return True  # the prefix is literal: Qt reads a byte array (or nothing), never an object
    return not (_TYPED_ELEMENT.search(raw) or _CODE_ESCAPES.intersection(_ESCAPE.findall(raw)))


def remove_unsafe_entries(path) -> list[str]:
    """Remove the entries of the INI settings file ``path`` that are not plain data.

    Returns
    -------
    list of str
        The lines removed (empty when the file was safe, missing or unreadable). A file that is
        not UTF-8 is removed whole.
    """
    path = Path(path)
    try:
        data = path.read_bytes()
    except OSError:
        return []
    try:
        text = data.decode("utf-8")
    except UnicodeDecodeError:
        _replace(path, "")
        return ["(the whole file: not UTF-8)"]
    kept, dropped = [], []
    for entry in _entries(re.split(r"\r\n|\r|\n", text)):
        line = "\n".join(entry)
        stripped = line.strip()
        if not stripped or stripped[0] in ";#[":
            kept.append(line)
            continue
        parts = [part[:-1] if part.endswith("\\") else part for part in entry]
        _key, sep, value = "".join(parts).partition("=")
        # judged as Qt reads it (the lines joined) and, to be safe, each continuation line alone
        safe = sep and _safe_value(value) and (_SAFE_TYPED.match(value) or
                                               not any(_TYPED_ELEMENT.search(part) for part in parts[1:]))
        if safe:
            kept.append(line)
        else:
            dropped.extend(entry)
    if dropped:
        _replace(path, "\n".join(kept))
    return dropped


def _entries(lines: list[str]) -> list[list[str]]:
    """Physical lines grouped into entries: Qt joins a line ending in a backslash with the next
    (it writes long byte arrays that way), so an entry is judged as a whole."""
    out: list[list[str]] = []
    current: list[str] = []
    for line in lines:
        current.append(line)
        if not line.endswith("\\"):
            out.append(current)
            current = []
    if current:
        out.append(current)
    return out


def _replace(path: Path, text: str) -> None:
    tmp = path.with_name(f".{path.name}.{os.getpid()}.tmp")
    try:
        tmp.write_text(text, encoding="utf-8")
        os.replace(tmp, path)
    except OSError:
        try:
            path.unlink()  # cannot rewrite it: better no settings than unsafe ones
        except OSError:
            pass
        tmp.unlink(missing_ok=True)


def open_safely(settings: QSettings | None = None) -> QSettings:
    """``settings`` (default: the application's own) with unsafe entries removed from its file
    before Qt first reads it."""
    settings = settings if settings is not None else QSettings()
    name = settings.fileName()
    if name and Path(name).is_file():
        remove_unsafe_entries(name)
    return settings


def byte_array(settings: QSettings, key: str) -> QByteArray | None:
    """The byte array stored at ``key`` (window geometry, dock state), or None for anything else."""
    value = settings.value(key)
    return value if isinstance(value, QByteArray) else None


def text_value(settings: QSettings, key: str, default: str = "") -> str:
    """The text stored at ``key``, or ``default`` for anything else."""
    value = settings.value(key, default)
    return value if isinstance(value, str) else default
