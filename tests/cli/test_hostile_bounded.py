"""Hostile inputs end in one line, quickly, in bounded memory.

Each was found to hang or grow for minutes before: a unit string with ``^``
exponents (pint evaluated ``9^9^9``), a dotted key of 30,000 parts (25 s and
5 GB inside the TOML parser), ``--cases /dev/zero`` (6.9 GB in 30 s), a FIFO with
no writer (blocked for ever), twelve ranges of a million values (expanded before
being counted), a key of a million characters (a megabyte-long error line).
"""

from __future__ import annotations

import os
import time
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear import units
from plyshear.cli import MAX_ERROR_LINE, main
from tests.conftest import FORK

#: These inputs once hung for minutes or exhausted memory; the guard catches a return of
#: that, not the speed (timings stay out of the tests: each ends in well under a second
#: on an idle machine, far above that on a loaded one).
HANG_GUARD_S = 30.0


def _one_line(args: list[str]) -> str:
    t0 = time.monotonic()
    r = CliRunner().invoke(main, args)
    assert time.monotonic() - t0 < HANG_GUARD_S
    assert r.exit_code == 2, r.output
    lines = r.stderr.strip().splitlines()
    assert len(lines) == 1, lines
    assert lines[0].startswith("error: ")
    return lines[0]


@pytest.mark.parametrize("command", ["validate", "solve"])
def test_a_unit_string_with_caret_exponents_is_one_line(write_model, command: str) -> None:
    units.parse_quantity("1 mm", "length")  # pint's own start-up is not the guard's cost
    path = write_model(FORK.replace("thickness = 20", 'thickness = "1 mm^9^9^9"'))
    line = _one_line([command, str(path)])
    assert "ply[2].thickness" in line
    assert "exponents: integers of at most two digits" in line


@pytest.mark.parametrize(
    ("text", "mm"),
    [
        ("12 mm", 12.0),
        ("0.5 in", 12.7),
        ("3/4 in", 19.05),
        ("2 cm", 20.0),  # exact factors
    ],
)
def test_the_unit_grammar_reads_plain_lengths(text: str, mm: float) -> None:
    # 1 in = 25.4 mm exactly (international inch, 1959)
    assert units.parse_quantity(text, "length") == pytest.approx(mm, rel=1e-15)


@pytest.mark.parametrize(
    ("text", "mpa"),
    [
        ("355 N/mm^2", 355.0),
        ("355 N/mm**2", 355.0),
        ("355 N*mm^-2", 355.0),
        ("50 ksi", 50 * 4.4482216152605e3 / 25.4**2),  # 1 ksi = 1000 lbf/in^2, exact factors
    ],
)
def test_the_unit_grammar_reads_stresses_with_exponents(text: str, mpa: float) -> None:
    assert units.parse_quantity(text, "stress") == pytest.approx(mpa, rel=1e-12)


@pytest.mark.parametrize(
    "text",
    ["1 mm^999", "1 mm**2**2", "1 (mm)", "1 mm + 1 mm", "1 mm^", "1 __class__", "1 mm/", "1/0 mm"],
)
def test_the_unit_grammar_refuses_anything_else(text: str) -> None:
    with pytest.raises(ValueError, match="cannot read"):
        units.parse_quantity(text, "length")


def test_a_key_of_30000_dotted_parts_is_one_line(tmp_path: Path) -> None:
    path = tmp_path / "deep.toml"
    path.write_text(FORK + ".".join(["a"] * 30_000) + " = 1\n", encoding="utf-8")
    assert path.stat().st_size > 60_000  # the review's 61 KB file
    line = _one_line(["validate", str(path)])
    assert "a key of 30000 dotted parts (at most 64)" in line


def test_a_line_longer_than_a_megabyte_is_one_line(tmp_path: Path) -> None:
    path = tmp_path / "long.toml"
    path.write_text(
        FORK.replace('title = "test fork"', f'title = "{"x" * 1_100_000}"'), encoding="utf-8"
    )
    line = _one_line(["validate", str(path)])
    assert "line 2 is longer than 1000000 characters" in line


@pytest.mark.skipif(not Path("/dev/zero").exists(), reason="needs /dev/zero")
def test_cases_from_dev_zero_is_one_line(write_model) -> None:
    path = write_model(FORK)
    line = _one_line(["sweep", str(path), "--cases", "/dev/zero"])
    assert "/dev/zero: not a regular file" in line


@pytest.mark.skipif(not hasattr(os, "mkfifo"), reason="needs FIFOs")
def test_cases_from_a_fifo_without_writer_is_one_line(write_model, tmp_path: Path) -> None:
    path = write_model(FORK)
    fifo = tmp_path / "cases.csv"
    os.mkfifo(fifo)
    line = _one_line(["sweep", str(path), "--cases", str(fifo)])
    assert "not a regular file" in line


def test_twelve_ranges_of_a_million_values_are_counted_before_expanded(write_model) -> None:
    path = write_model(FORK)
    keys = [
        "bolt.diameter",
        "bolt.length",
        "bolt.pretension",
        "bolt.tension",
        "ply[1].thickness",
        "ply[2].thickness",
        "ply[3].thickness",
        "ply[1].gap",
        "ply[2].gap",
        "ply[3].gap",
        "ply[1].edge",
        "ply[2].edge",
    ]
    args = ["sweep", str(path)]
    for k in keys:
        args += ["--vary", f"{k}=1:1000000"]  # 1 000 000 values each: (1e6 - 1)/1 + 1
    line = _one_line(args)
    assert "more than 1000000 cases" in line


def test_a_key_of_a_million_characters_gives_a_short_line(write_model) -> None:
    path = write_model(FORK)
    line = _one_line(["sweep", str(path), "--vary", "bolt." + "x" * 1_000_000 + "=1"])
    assert len(line) <= len("error: ") + MAX_ERROR_LINE
    assert "characters)" in line  # it says how long the message was


def test_one_line_cuts_and_escapes() -> None:
    from plyshear.cli import one_line

    assert one_line("a\u2028b") == "a\\u2028b"  # a line separator cannot split the line
    long = "k" * 5000
    cut = one_line(long)
    assert len(cut) <= MAX_ERROR_LINE
    assert cut.endswith("(5000 characters)")
