"""Write the golden files of every sample project's report afresh (see ``tests/golden_support.py``).

    python -m tests.regenerate_golden            # every sample
    python -m tests.regenerate_golden NAME …     # only these samples (file stems)

Run it from the repository root after a change that alters what a report says, then review
``git diff tests/golden`` and commit the files with the change.
"""
from __future__ import annotations

import sys
import tempfile
from pathlib import Path

sys.path.insert(0, str(Path(__file__).resolve().parent))
sys.path.insert(0, str(Path(__file__).resolve().parent.parent))

import golden_support as golden  # noqa: E402


def main(argv: list[str] | None = None) -> int:
    names = set(sys.argv[1:] if argv is None else argv)
    samples = [s for s in golden.sample_files() if not names or s.stem in names]
    unknown = names - {s.stem for s in samples}
    if unknown:
        print(f"no such sample project: {', '.join(sorted(unknown))}", file=sys.stderr)
        return 2
    golden.GOLDEN.mkdir(exist_ok=True)
    with tempfile.TemporaryDirectory() as tmp:
        for sample in samples:
            texts = golden.golden_texts(*golden.write_report(sample, Path(tmp)))
            for kind, text in texts.items():
                path = golden.golden_path(sample, kind)
                changed = not path.exists() or path.read_text(encoding="utf-8") != text
                path.write_text(text, encoding="utf-8", newline="\n")
                print(f"{path.relative_to(golden.HERE.parent)}: {'changed' if changed else 'unchanged'}")
    return 0


if __name__ == "__main__":
    raise SystemExit(main())
