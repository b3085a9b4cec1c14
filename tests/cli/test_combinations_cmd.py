"""The commands on a model with load cases: the governing combination per item,
``--combination NAME``, the verdict over all combinations, one-line refusals.

Reference values are statics of a determinate stack (each ply its own member)
and the same commands on a file with the combined loads typed in.
"""

from __future__ import annotations

import json

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS
from tests.model.test_loadcases import CHAIN, COMBOS

EXIT_PASS, EXIT_FAIL, EXIT_BAD_INPUT = 0, 1, 2
REL_EXACT = 1e-12
#: The chain with a wind of 60 kN on c, so that every combination passes with an M20
#: 8.8 (one plane's design shear about 85 kN, AISC 360-22 Table J3.2, phi 0.75).
MODEL = (CHAIN + COMBOS).replace("wind = -120", "wind = -60")
#: The uplift combination typed in: b = 0.9 * 50 kN, c = -60 kN (statics of the factors).
UPLIFT_TYPED = CHAIN.replace("load = { dead = 50, live = [0, 30] }", "load = 45").replace(
    "load = { wind = -120 }", "load = -60"
)


def run(*args: str) -> tuple[int, str]:
    result = CliRunner().invoke(main, list(args))
    return result.exit_code, result.output


def test_check_names_the_governing_combination_of_every_item(write_model) -> None:
    path = write_model(MODEL)
    code, out = run("check", str(path), "--json")
    assert code == EXIT_PASS, out
    data = json.loads(out)
    per_combo = {
        c["name"]: {(i["what"], i["where"]): i["utilization"] for i in c["check"]["items"]}
        for c in data["combinations"]
    }
    for item in data["check"]["items"]:
        key = (item["what"], item["where"])
        best = max(per_combo, key=lambda n: per_combo[n].get(key, -1.0))
        assert item["combination"] == best
        assert item["utilization"] == pytest.approx(per_combo[best][key], rel=REL_EXACT)
    planes = {
        i["where"]: i["combination"] for i in data["check"]["items"] if i["what"] == "bolt shear"
    }
    # statics: plane 1 carries b + c (gravity: |(60, 48)| = 76.8 kN > uplift 15 kN);
    # plane 2 carries c alone (uplift 60 kN, gravity 0)
    assert planes == {"plane 1": "gravity", "plane 2": "uplift"}
    assert data["check"]["combination"] == data["check"]["governing"]["combination"]
    code, text = run("check", str(path))
    assert code == EXIT_PASS
    row = next(
        line for line in text.splitlines() if line.startswith("bolt shear") and "plane 2" in line
    )
    assert "uplift" in row
    assert "governing combination" in text


def test_one_combination_is_the_file_with_its_loads_typed_in(write_model) -> None:
    cases = write_model(MODEL, "cases.toml")
    typed = write_model(UPLIFT_TYPED, "typed.toml")
    for command in ("solve", "check"):
        code_a, out_a = run(command, str(cases), "--json", "--combination", "uplift")
        code_b, out_b = run(command, str(typed), "--json")
        assert code_a == code_b
        a, b = json.loads(out_a), json.loads(out_b)
        assert a.pop("combination") == "uplift"
        if command == "check":
            assert a["check"].pop("combination") == "uplift"
            # the typed-in file's level is the method's default; the combination's declared
            assert a["check"]["loads"] == b["check"]["loads"] == "factored"
        assert a["bolts"] == b["bolts"]
        assert a["members"] == b["members"]


def test_a_combination_that_fails_fails_the_check(write_model) -> None:
    # uplift with c = -1200 kN: plane 2 carries 1200 kN (statics), far above one M20
    # 8.8 plane's design shear (about 85 kN, AISC 360-22 Table J3.2, phi 0.75)
    path = write_model(MODEL.replace("wind = -60", "wind = -1200"))
    code, out = run("check", str(path), "--json")
    assert code == EXIT_FAIL
    data = json.loads(out)
    assert data["check"]["passes"] is False
    assert data["check"]["combination"] == "uplift"
    gravity = next(c for c in data["combinations"] if c["name"] == "gravity")
    assert gravity["check"]["passes"] is True
    code, _ = run("check", str(path), "--combination", "gravity")
    assert code == EXIT_PASS


def test_solve_shows_cases_combinations_and_envelope(write_model) -> None:
    path = write_model(MODEL)
    code, out = run("solve", str(path))
    assert code == EXIT_PASS
    for words in ("load cases", "combinations", "envelope", "1.2 dead + 1.6 live"):
        assert words in out
    code, out = run("solve", str(path), "--json")
    data = json.loads(out)
    assert data["combination"] == "gravity"  # the top level: the first combination
    assert data["envelope"]["bolts"][0]["planes"][1]["shear"] == pytest.approx(
        60.0, rel=REL_EXACT
    )  # kN, statics: plane 2 carries c alone


@pytest.mark.parametrize(
    "args",
    [
        ("solve", "--combination", "nope"),
        ("check", "--combination", "nope"),
        ("capacity", "--combination", "nope"),
    ],
)
def test_unknown_combination_is_one_line(write_model, args: tuple[str, ...]) -> None:
    path = write_model(MODEL)
    code, out = run(args[0], str(path), *args[1:])
    assert code == EXIT_BAD_INPUT
    assert out.strip().count("\n") == 0
    assert "gravity, uplift" in out


def test_combination_on_a_plain_model_and_sweep_with_cases_are_refused(write_model) -> None:
    code, out = run("solve", str(MODELS / "fork-four-planes.toml"), "--combination", "x")
    assert code == EXIT_BAD_INPUT
    assert "one case" in out
    path = write_model(MODEL)
    code, out = run("sweep", str(path), "--vary", "bolt.diameter=16,20")
    assert code == EXIT_BAD_INPUT
    assert "load cases" in out


def test_a_plain_model_prints_no_combination(write_model) -> None:
    import plyshear

    path = MODELS / "fork-four-planes.toml"
    code, out = run("solve", str(path), "--json")
    assert code == EXIT_PASS
    data = json.loads(out)
    assert not {"combination", "cases", "combinations", "envelope"} & set(data)
    assert out.strip() == json.dumps(plyshear.solve(plyshear.load_model(path)).to_dict(), indent=2)


def test_capacity_runs_on_the_governing_combination(write_model) -> None:
    path = write_model(MODEL)
    result = CliRunner().invoke(main, ["capacity", str(path), "--json"])
    assert result.exit_code == EXIT_PASS, result.output
    assert "combination uplift" in result.stderr or "combination gravity" in result.stderr
    start = result.stdout.index("{")
    data = json.loads(result.stdout[start:])
    assert data["combination"] in ("gravity", "uplift")


EXAMPLE = MODELS.parent.parent / "docs" / "examples" / "gusset-load-cases.toml"


def test_the_four_case_example_runs_through_every_command(tmp_path) -> None:
    for args in (
        ["solve"],
        ["solve", "--json"],
        ["check"],
        ["check", "--json"],
        ["validate"],
        ["capacity", "--json"],
        ["report", "-o", str(tmp_path / "r.html")],
    ):
        result = CliRunner().invoke(main, [args[0], str(EXAMPLE), *args[1:]])
        assert result.exit_code == EXIT_PASS, (args, result.output)
    code, out = run("validate", str(EXAMPLE))
    # ASCE 7-22 2.3.1 (from memory) for D, L, S, W: eq. 1; eq. 2 with and without 0.5S;
    # eq. 3 with L, with 0.5W, alone; eq. 4 with L and S, L, S, neither; eq. 5
    assert "4 load cases, 11 combinations" in out
