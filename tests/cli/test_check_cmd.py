"""`plyshear check`: exit codes, the JSON `check` section of the contract, overrides.

The contract is MODELFILE.md ("`plyshear check` adds ..."): exit 0 when every
item passes, 1 when one fails, 2 on bad input (one line, no traceback).
"""

from __future__ import annotations

import json
import re
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS

EXIT_PASS, EXIT_FAIL, EXIT_BAD_INPUT = 0, 1, 2
EXAMPLES = sorted(MODELS.glob("*.toml"))
# `check --json` and `solve --json` print the same solution: equal to round-off.
REL_SAME_SOLUTION = 1e-12
# Printed design tables round to three significant figures.
REL_TABLE_ROUNDING = 5e-3

ITEM_KEYS = {"what", "where", "demand", "capacity", "utilization", "clause"}
GOVERNING_KEYS = {"what", "where", "utilization"}
# clause references as the standards number them: AISC "J3.6", EN "Table 3.4", "3.13.2"
CLAUSE = re.compile(r"\b(J\d+(\.\d+)?|Table \d+\.\d+|\d+\.\d+(\.\d+)?)\b")


def lap(load: float, units: str = "kip-in", standard: str = "aisc360-22") -> str:
    """A 5/8 in A325 single lap, threads included: one plane carries the load."""
    return f"""\
format = 1
title = "single lap"
units = "{units}"

[bolt]
diameter = "5/8 in"
grade = "A325"
threads = "included"

[[ply]]
name = "held"
member = "held"
thickness = 0.5
fy = 36
fu = 58

[[ply]]
name = "pulled"
member = "pulled"
thickness = 0.5
fy = 36
fu = 58

[member.held]
support = true

[member.pulled]
load = {load!r}

[check]
standard = "{standard}"
"""


def invoke(*args: str):
    return CliRunner().invoke(main, ["check", *args])


def test_exit_0_when_every_item_passes(write_model) -> None:
    # AISC Manual Table 7-1 (from memory): 12.4 kip LRFD for 5/8 in Group A-N; 10 kip passes
    result = invoke(str(write_model(lap(10.0))))
    assert result.exit_code == EXIT_PASS, result.output
    assert "PASSES" in result.output


def test_exit_1_when_one_item_fails(write_model) -> None:
    # 15 kip > 12.4 kip (AISC Manual Table 7-1, from memory): bolt shear fails
    result = invoke(str(write_model(lap(15.0))))
    assert result.exit_code == EXIT_FAIL, result.output
    assert "FAILS" in result.output
    data = json.loads(invoke(str(write_model(lap(15.0), "f.toml")), "--json").output)
    assert data["check"]["passes"] is False
    assert data["check"]["governing"]["what"] == "bolt shear"
    assert data["check"]["governing"]["utilization"] > 1.0


def test_json_check_section_keeps_the_contract(write_model) -> None:
    path = write_model(lap(10.0))
    result = invoke(str(path), "--json")
    assert result.exit_code == EXIT_PASS, result.output
    data = json.loads(result.output)
    check = data["check"]
    assert check["standard"] == "aisc360-22"
    assert check["method"] == "lrfd"
    assert check["passes"] is True
    assert check["items"]
    for it in check["items"]:
        assert ITEM_KEYS <= set(it)
        if it["capacity"]:
            assert it["utilization"] == pytest.approx(
                it["demand"] / it["capacity"], rel=REL_SAME_SOLUTION
            )
    assert GOVERNING_KEYS <= set(check["governing"])
    normative = [i for i in check["items"] if not i.get("informative")]
    assert check["governing"]["utilization"] == max(i["utilization"] for i in normative)
    # the solution beside it, as `solve --json` gives it
    assert {"bolts", "members"} <= set(data)


def test_json_demands_are_in_the_model_units(write_model) -> None:
    # a kip-in model: the plane's shear item equals the `solve --json` plane shear (kip)
    path = write_model(lap(10.0))
    solved = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
    checked = json.loads(invoke(str(path), "--json").output)["check"]
    shear = [i for i in checked["items"] if i["what"] == "bolt shear" and i["where"] == "plane 1"]
    assert len(shear) == 1
    plane_1 = solved["bolts"][0]["planes"][0]
    assert shear[0]["demand"] == pytest.approx(plane_1["shear"], rel=REL_SAME_SOLUTION)
    # and the capacity in kip: AISC Manual Table 7-1 (from memory) prints 12.4
    assert shear[0]["capacity"] == pytest.approx(12.4, rel=REL_TABLE_ROUNDING)


def test_standard_option_overrides_the_model(write_model) -> None:
    path = write_model(lap(10.0, standard="aisc360-22"))
    result = invoke(str(path), "--standard", "en1993-1-8", "--json")
    assert result.exit_code in (EXIT_PASS, EXIT_FAIL), result.output
    check = json.loads(result.output)["check"]
    assert check["standard"] == "en1993-1-8"
    assert any("Table 3.4" in i["clause"] for i in check["items"])
    assert not any("J3" in i["clause"] for i in check["items"])


def test_method_asd_with_en_is_bad_input(write_model) -> None:
    path = write_model(lap(10.0, standard="en1993-1-8"))
    for args in (["--method", "asd"], ["--standard", "en1993-1-8", "--method", "asd"]):
        result = invoke(str(path), *args)
        assert result.exit_code == EXIT_BAD_INPUT
        lines = result.output.strip().splitlines()
        assert len(lines) == 1, result.output
        assert lines[0].startswith("error: ")
        assert "Traceback" not in result.output


def test_method_asd_changes_the_capacity(write_model) -> None:
    # AISC Manual Table 7-1 (from memory): 5/8 in Group A-N, ASD 8.28 kip
    data = json.loads(invoke(str(write_model(lap(5.0))), "--method", "asd", "--json").output)
    assert data["check"]["method"] == "asd"
    shear = [i for i in data["check"]["items"] if i["what"] == "bolt shear"][0]
    assert shear["capacity"] == pytest.approx(8.28, rel=REL_TABLE_ROUNDING)


def test_slip_class_of_the_other_standard_is_one_line(write_model) -> None:
    text = (
        lap(10.0, standard="en1993-1-8")
        .replace('standard = "en1993-1-8"', 'standard = "en1993-1-8"\nslip_class = "C"')
        .replace('threads = "included"', 'threads = "included"\npretension = 19')
    )
    result = invoke(str(write_model(text)), "--standard", "aisc360-22")
    assert result.exit_code == EXIT_BAD_INPUT
    assert len(result.output.strip().splitlines()) == 1


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_every_example_runs_through_check(path: Path) -> None:
    result = invoke(str(path))
    assert result.exit_code in (EXIT_PASS, EXIT_FAIL), result.output
    assert "Traceback" not in result.output
    assert "licensed engineer" in result.output
    assert CLAUSE.search(result.output), result.output


def test_installed_console_script_runs_check(write_model) -> None:
    exe = Path(sys.executable).with_name("plyshear")
    if not exe.exists():
        pytest.skip("console script not installed next to this interpreter")
    fails = subprocess.run(
        [str(exe), "check", str(write_model(lap(15.0)))],
        capture_output=True,
        text=True,
        timeout=120,
        check=False,
    )
    assert fails.returncode == EXIT_FAIL, fails.stderr
    assert "FAILS" in fails.stdout
