"""The project document: its schema, validation, field paths, and its files.

    doc = load("plant.json")      # parse safely, upgrade old versions, validate
    save(doc, "plant.json")       # validate, write atomically, keep plant.json.bak

The document: :mod:`.schema_types` (a tiny declarative schema language), :mod:`.schema`
(every key, unit, range and default), :mod:`.validation` (problems, normalise, and the
site resolved once for the solver), :mod:`.paths` (field paths like
``stages[1].efficiency.value``), :mod:`.schema_docs` (the meaning of every key; generates
``docs/project-format.md``).

    doc = load("plant.json")      # parse safely, upgrade old versions, validate
    save(doc, "plant.json")       # validate, write atomically, keep plant.json.bak

Its files: :mod:`.parse` (untrusted bytes → JSON data, with size and depth limits),
:mod:`.migrate` (format versions and the upgrade chain), :mod:`.reading` (load),
:mod:`.writing` (dumps, atomic save, backup). The file format is documented in
``docs/project-format.md``.
"""
from __future__ import annotations

from stagewright.core.project import migrate  # the module (its function: stagewright.core.project.migrate.migrate)
from stagewright.core.project.parse import MAX_DEPTH, MAX_FILE_BYTES
from stagewright.core.project.reading import load, load_with_problems, loads, read_document
from stagewright.core.project.writing import atomic_write, backup_path, dumps, save

__all__ = ["load", "load_with_problems", "loads", "save", "dumps", "backup_path", "atomic_write",
           "read_document", "MAX_FILE_BYTES", "MAX_DEPTH"]
