"""The tutorials of docs/examples run as written.

Every ``console`` block of a tutorial is a command (``$ plyshear ...``) and the
output it prints; the test runs the command and compares the printed lines with
the block (a line ``...`` stands for lines left out). Every number the prose
quotes in bold must be one the commands printed, so the text cannot go stale.
The reference is the tutorial's own text, which an engineer reads.
"""

from __future__ import annotations

import re
import shlex
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear.cli import main

ROOT = Path(__file__).resolve().parents[1]
TUTORIALS = sorted((ROOT / "docs" / "examples").glob("*.md"))
BLOCK = re.compile(r"^```console\n(.*?)^```", re.MULTILINE | re.DOTALL)
BOLD_NUMBER = re.compile(r"\*\*(-?[0-9][0-9.,]*)[^*]*\*\*")
GAP = "..."


def _blocks(text: str) -> list[tuple[list[str], list[str]]]:
    """(command words, expected lines) of every console block."""
    out = []
    for body in BLOCK.findall(text):
        lines = body.rstrip("\n").split("\n")
        assert lines[0].startswith("$ plyshear "), lines[0]
        out.append((shlex.split(lines[0][len("$ plyshear ") :]), lines[1:]))
    return out


def _chunks(expected: list[str]) -> list[list[str]]:
    """The expected lines cut at every ``...``."""
    chunks: list[list[str]] = [[]]
    for line in expected:
        if line == GAP:
            chunks.append([])
        else:
            chunks[-1].append(line.rstrip())
    return [c for c in chunks if c]


def _contains_in_order(actual: list[str], chunks: list[list[str]]) -> bool:
    """Whether every chunk appears as consecutive lines of ``actual``, in order."""
    at = 0
    for chunk in chunks:
        while at + len(chunk) <= len(actual) and actual[at : at + len(chunk)] != chunk:
            at += 1
        if at + len(chunk) > len(actual):
            return False
        at += len(chunk)
    return True


def _run(args: list[str]) -> list[str]:
    result = CliRunner().invoke(main, args)
    assert result.exit_code in (0, 1), result.output  # 1: a check that fails is a result
    return [line.rstrip() for line in result.output.split("\n")]


def test_there_are_three_tutorials_with_their_models() -> None:
    assert len(TUTORIALS) >= 3
    for path in TUTORIALS:
        models = re.findall(r"docs/examples/[\w-]+\.toml", path.read_text(encoding="utf-8"))
        assert models, path.name
        assert all((ROOT / m).is_file() for m in models)


@pytest.mark.parametrize("path", TUTORIALS, ids=[p.stem for p in TUTORIALS])
def test_tutorial_reproduces_its_numbers(path: Path, monkeypatch: pytest.MonkeyPatch) -> None:
    monkeypatch.chdir(ROOT)
    text = path.read_text(encoding="utf-8")
    blocks = _blocks(text)
    assert blocks, f"{path.name}: no console block"
    printed = []
    for args, expected in blocks:
        actual = _run(args)
        # the tutorial's own text: what the command printed when it was written
        assert _contains_in_order(actual, _chunks(expected)), (
            f"{path.name}: `plyshear {' '.join(args)}` no longer prints what the text shows:\n"
            + "\n".join(actual)
        )
        printed.append("\n".join(actual))
    output = "\n".join(printed)
    numbers = set(re.findall(r"-?[0-9][0-9.]*", output))
    prose = BLOCK.sub("", text)
    for number in BOLD_NUMBER.findall(prose):
        # every bold number of the prose is one the commands printed
        assert number.replace(",", "") in numbers, f"{path.name}: **{number}** is not printed"


def test_a_stale_block_is_detected() -> None:
    actual = ["a", "b 1.0", "c", "d"]
    assert _contains_in_order(actual, _chunks(["a", GAP, "c"]))
    assert not _contains_in_order(actual, _chunks(["a", "b 1.1"]))
    assert not _contains_in_order(actual, _chunks(["c", GAP, "a"]))
