"""Fuzzed model files: every case ends in a result or one error line, never a traceback.

The count comes from PLYSHEAR_FUZZ_CASES (default 200 so CI stays quick; the full
run is PLYSHEAR_FUZZ_CASES=10000) and the seed from PLYSHEAR_FUZZ_SEED (default 0)
so a failing case repeats.
"""

from __future__ import annotations

import os
import random
import time

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import FORK, MODELS

CASES = int(os.environ.get("PLYSHEAR_FUZZ_CASES", "200"))
SEED = int(os.environ.get("PLYSHEAR_FUZZ_SEED", "0"))
SECONDS_PER_CASE = 10.0  # bounded time: a hang or a runaway mesh fails the case

SEEDS = [FORK] + [p.read_text(encoding="utf-8") for p in sorted(MODELS.glob("*.toml"))]
VALUES = [
    "-3",
    "0",
    "nan",
    "inf",
    "-inf",
    "1e308",
    "true",
    '"x"',
    "[]",
    "{}",
    '"12 kN"',
    '"0.5 in"',
    "10000000000",
    "3.5",
    '""',
    "[1, 2, 3]",
    '"N-mm"',
    "-0.0",
]
KEYS = [
    "thickness",
    "diameter",
    "gap",
    "load",
    "grade",
    "steel",
    "member",
    "support",
    "elements_per_ply",
    "units",
    "format",
    "edge",
    "width",
    "link_stiffness",
    "foundation_modulus",
    "pitch",
    "count",
    "positions",
    "enters",
    "hole_offset",
]


def _mutate(text: str, rng: random.Random) -> bytes:
    lines = text.splitlines()
    kind = rng.randrange(9)
    if kind == 0 and lines:  # change a value
        i = rng.randrange(len(lines))
        if "=" in lines[i]:
            key = lines[i].split("=")[0]
            lines[i] = f"{key}= {rng.choice(VALUES)}"
    elif kind == 1 and lines:  # delete a line
        del lines[rng.randrange(len(lines))]
    elif kind == 2:  # add a key somewhere
        lines.insert(rng.randrange(len(lines) + 1), f"{rng.choice(KEYS)} = {rng.choice(VALUES)}")
    elif kind == 3 and lines:  # duplicate a block
        i = rng.randrange(len(lines))
        lines[i:i] = lines[i : i + rng.randrange(1, 8)]
    elif kind == 4:  # huge counts
        lines.append(
            rng.choice(
                [
                    "[analysis]\nelements_per_ply = 1000000000",
                    "[pattern]\ncount = 100000\npitch = 1",
                    "\n".join(
                        f'[[ply]]\nname = "q{i}"\nthickness = 1\nsteel = "S355"'
                        for i in range(2500)
                    ),
                ]
            )
        )
    elif kind == 5:  # random bytes
        data = bytearray("\n".join(lines).encode())
        for _ in range(rng.randrange(1, 6)):
            if data:
                data[rng.randrange(len(data))] = rng.randrange(256)
        return bytes(data)
    elif kind == 6:  # deep nesting
        lines.append("x = " + "[" * 5000 + "]" * 5000)
    elif kind == 7:  # truncate
        return "\n".join(lines)[: rng.randrange(len("\n".join(lines)) + 1)].encode()
    else:  # swap two lines
        if len(lines) > 1:
            i, j = rng.randrange(len(lines)), rng.randrange(len(lines))
            lines[i], lines[j] = lines[j], lines[i]
    return "\n".join(lines).encode("utf-8", errors="surrogateescape")


def test_fuzzed_model_files_never_crash(tmp_path) -> None:
    rng = random.Random(SEED)
    runner = CliRunner()
    path = tmp_path / "fuzz.toml"
    for case in range(CASES):
        data = _mutate(rng.choice(SEEDS), rng)
        path.write_bytes(data)
        command = rng.choice(["solve", "validate", "check"])
        t0 = time.perf_counter()
        result = runner.invoke(main, [command, str(path)])
        took = time.perf_counter() - t0
        where = f"case {case} (seed {SEED}), {command}, took {took:.1f} s"
        assert took < SECONDS_PER_CASE, where
        assert result.exception is None or isinstance(result.exception, SystemExit), (
            where,
            data[:400],
            result.exception,
        )
        assert result.exit_code in (0, 1, 2), where
        if result.exit_code == 2:
            lines = result.output.strip().splitlines()
            assert len(lines) == 1, (where, result.output)
            assert lines[0].startswith(f"error: {path}"), (where, lines[0])


def test_ten_megabyte_file_is_refused_in_one_line(tmp_path) -> None:
    path = tmp_path / "big.toml"
    path.write_bytes(FORK.encode() + b"#" * 10_000_000)
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == 2
    assert "file too large" in result.output


@pytest.mark.parametrize("command", ["solve", "check", "validate", "capacity"])
def test_directory_instead_of_a_file(tmp_path, command) -> None:
    result = CliRunner().invoke(main, [command, str(tmp_path)])
    assert result.exit_code == 2
    assert result.exception is None or isinstance(result.exception, SystemExit)
