"""``python -m plyshear.verify``: run the cases and write (or check) docs/verification.md.

The one place of :mod:`plyshear.verify` that prints or writes a file. The document
is generated: an existing file that does not start with the generated header is
never replaced, and the new text is written to a temporary file renamed into place.
"""

from __future__ import annotations

import argparse
import sys
from pathlib import Path

from plyshear.verify import HEADER, document, run_all


def main(argv: list[str] | None = None) -> int:
    """Write (or with ``--check`` compare) docs/verification.md; exit 1 if a case fails."""
    parser = argparse.ArgumentParser(
        prog="python -m plyshear.verify",
        description="Run the verification cases and write docs/verification.md.",
    )
    parser.add_argument(
        "--root",
        type=Path,
        default=Path("."),
        help="the repository's root (default: the current folder)",
    )
    parser.add_argument(
        "--check",
        action="store_true",
        help="do not write; exit 1 if the committed document is stale",
    )
    args = parser.parse_args(argv)
    target = args.root / "docs" / "verification.md"
    if not (args.root / "tests" / "verification").is_dir():
        print(
            f"error: {args.root}: not a plyshear repository (no tests/verification)",
            file=sys.stderr,
        )
        return 2
    text = document(args.root)
    failing = [c.name for c in run_all() if not c.passes]
    if args.check:
        current = target.read_text(encoding="utf-8") if target.exists() else ""
        if current != text:
            print(f"{target}: stale; run python -m plyshear.verify", file=sys.stderr)
            return 1
    else:
        if target.exists() and not target.read_text(encoding="utf-8").startswith(HEADER):
            print(f"error: {target}: exists and was not generated; not replaced", file=sys.stderr)
            return 2
        tmp = target.with_suffix(".md.tmp")
        tmp.write_text(text, encoding="utf-8")
        tmp.replace(target)
        print(f"wrote {target}: {len(run_all())} cases, {len(failing)} failing")
    return 1 if failing else 0


if __name__ == "__main__":
    sys.exit(main())
