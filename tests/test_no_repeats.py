"""No block of six or more lines of code repeats between two files of plyshear/.

Lines are compared as their tokens (comments, docstrings, blank lines and
indentation set aside), so a block copied and re-indented or re-commented is
still found. What both files need belongs in one module that both import.
"""

from __future__ import annotations

import io
import tokenize
from collections import defaultdict
from pathlib import Path

import plyshear

ROOT = Path(plyshear.__file__).parent
BLOCK = 6  # lines
_SKIP = {
    tokenize.COMMENT,
    tokenize.NL,
    tokenize.NEWLINE,
    tokenize.INDENT,
    tokenize.DEDENT,
    tokenize.ENCODING,
    tokenize.ENDMARKER,
}
#: Lines too common to mark a copy: closing brackets alone.
_TRIVIAL = {")", "]", "}", "),", "],", "},", ") :", "] ,", ") ,"}


def code_lines(text: str) -> list[tuple[int, str]]:
    """(line number, the line's tokens joined) of every line that holds code."""
    by_line: dict[int, list[str]] = defaultdict(list)
    previous = tokenize.INDENT
    for tok in tokenize.generate_tokens(io.StringIO(text).readline):
        docstring = tok.type == tokenize.STRING and previous in (
            tokenize.INDENT,
            tokenize.NEWLINE,
            tokenize.DEDENT,
        )
        if tok.type not in _SKIP and not docstring:
            by_line[tok.start[0]].append(tok.string)
        if tok.type not in (tokenize.COMMENT, tokenize.NL):
            previous = tok.type
    return [(n, " ".join(t)) for n, t in sorted(by_line.items()) if " ".join(t) not in _TRIVIAL]


def repeats(files: dict[str, str]) -> list[tuple[tuple[str, int], ...]]:
    """Blocks of :data:`BLOCK` lines that occur in more than one file, with where."""
    where: dict[tuple[str, ...], set[tuple[str, int]]] = defaultdict(set)
    for name, text in files.items():
        lines = code_lines(text)
        for i in range(len(lines) - BLOCK + 1):
            where[tuple(s for _, s in lines[i : i + BLOCK])].add((name, lines[i][0]))
    return sorted(tuple(sorted(w)) for w in where.values() if len({n for n, _ in w}) > 1)


def test_no_block_of_six_lines_repeats_between_files() -> None:
    files = {
        str(p.relative_to(ROOT)): p.read_text(encoding="utf-8") for p in sorted(ROOT.rglob("*.py"))
    }
    assert repeats(files) == []


def test_a_copied_block_is_found_however_indented_and_commented() -> None:
    block = "".join(f"x{i} = f(y, {i})\n" for i in range(BLOCK))
    moved = "def g():\n" + "".join(f"    {line}  # note\n" for line in block.splitlines())
    found = repeats({"a.py": block, "b.py": '"""doc."""\n' + moved, "c.py": block[:-12]})
    assert found == [(("a.py", 1), ("b.py", 3))]
