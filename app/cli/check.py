"""``stagewright check FILE|FOLDER …``: "ok", or one line per problem (exit status 2)."""
from __future__ import annotations

__all__ = ["run"]

from pathlib import Path

from stagewright.gui.cli.paths import EXIT_INPUT, EXIT_OK, expand_paths


def run(args) -> int:
    """Validate every file named without solving it."""
    from stagewright.core import StagewrightError
    from stagewright.core.project.parse import read_limited
    from stagewright.core.project.reading import read_document
    from stagewright.core.project.schema import FORMAT_VERSION

    status = EXIT_OK
    paths = expand_paths(args.files)
    for item in args.files:
        if Path(item).is_dir() and not any(Path(item).glob("*.json")):
            print(f"{item}: no *.json files in this folder")
            status = EXIT_INPUT
    for path in paths:
        try:
            _, declared = read_document(read_limited(path))
        except StagewrightError as exc:
            for problem in getattr(exc, "problems", None) or [exc]:
                print(f"{path}: {problem}")
            status = EXIT_INPUT
            continue
        ok = "ok" if declared == FORMAT_VERSION else \
            f"ok (format version {declared}; saving it upgrades it to version {FORMAT_VERSION})"
        single = len(args.files) == 1 and not Path(args.files[0]).is_dir()
        print(ok if single else f"{path}: {ok}")
    return status
