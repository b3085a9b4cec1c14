"""Hostile --vary specifications: every one ends in a table or one error line, never a traceback.

Random specs are built from pieces that reach every branch of the key and value
syntax (good and bad keys, lists, ranges, names, quantities, arrays, brackets,
quotes, huge and tiny numbers, foreign characters). A run passes when it exits 0
or 1 (1: no case could be solved) with a summary line, or 2 with exactly one line
starting ``error: ``. ``PLYSHEAR_PROPERTY_EXAMPLES`` sizes the run, as for the
other property suites.
"""

from __future__ import annotations

import os

from click.testing import CliRunner
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from plyshear.cli import main
from tests.conftest import FORK

EXAMPLES = int(os.environ.get("PLYSHEAR_PROPERTY_EXAMPLES", "60"))

KEYS = [
    "bolt.diameter",
    "bolt.grade",
    "bolt.threads",
    "bolt.length",
    "ply[1].thickness",
    "ply[2].steel",
    "ply[3].gap",
    "ply.lug.fy",
    "ply[2].member",
    "member.lug.load",
    "member.fork.support",
    "analysis.elements_per_ply",
    "analysis.bearing",
    "check.standard",
    "check.method",
    "pattern.count",
    "ply[0].thickness",
    "ply[4].thickness",
    "bolt",
    "blot.diameter",
    "ply.nope.thickness",
    "member.x.load",
    "bolt.diameter.x",
    "",
    "ply[1]",
    "ply[999999999999].thickness",
    "units",
    "ply[1].name",
    "ply[١].thickness",
]
TOKENS = [
    "20",
    "24",
    "-3",
    "0",
    "1e308",
    "1e-300",
    "nan",
    "inf",
    "8.8",
    "10.9",
    "S355",
    "S9999",
    "true",
    "false",
    '"12 mm"',
    "0.5 in",
    "12 kip",
    "[100,0]",
    "[1,2",
    "]",
    "[[1]]",
    "",
    "'x'",
    "10:14:2",
    "14:10:2",
    "1:2:0",
    "0:1e9:1e-9",
    "a:b",
    "٢٤",
    "\u2029",
    "9" * 30,
    "lrfd",
    "en1993-1-8",
    "component",
    "fitted",
]


@st.composite
def specs(draw) -> list[str]:
    out = []
    for _ in range(draw(st.integers(1, 2))):
        key = draw(st.sampled_from(KEYS))
        values = ",".join(draw(st.lists(st.sampled_from(TOKENS), min_size=1, max_size=3)))
        out += ["--vary", f"{key}={values}" if draw(st.booleans()) or not values else key]
    return out


@settings(
    max_examples=EXAMPLES,
    deadline=None,
    suppress_health_check=[HealthCheck.function_scoped_fixture],
)
@given(specs())
def test_hostile_vary_ends_in_a_table_or_one_error_line(write_model, args) -> None:
    path = write_model(FORK)
    result = CliRunner().invoke(
        main, ["sweep", str(path), "--capacity", "none", "--workers", "1", "--quiet", *args]
    )
    assert result.exception is None or isinstance(result.exception, SystemExit), (
        args,
        repr(result.exception),
    )
    if result.exit_code == 2:
        lines = result.stderr.strip().splitlines()
        assert len(lines) == 1, (args, result.stderr)
        assert lines[0].startswith("error: "), (args, result.stderr)
    else:
        assert result.exit_code in (0, 1), (args, result.exit_code, result.output)
        assert " cases, " in result.stdout, (args, result.stdout)
