"""What `check`, `solve` and `validate` print for the review's cases (issue 13)."""

from __future__ import annotations

import json

from click.testing import CliRunner

from plyshear.cli import main
from plyshear.model import catalog, modelfile
from tests.conftest import FORK, MODELS

EXIT_BAD_INPUT = 2
SPLICE = MODELS / "splice-with-filler.toml"


def _run(*args: str):
    return CliRunner().invoke(main, list(args))


def test_check_prints_a_warning_under_passes_for_an_informative_item_over_one() -> None:
    result = _run("check", str(SPLICE))
    assert result.exit_code == 0, result.output
    lines = result.output.splitlines()
    verdict = next(i for i, line in enumerate(lines) if line.startswith("PASSES"))
    assert lines[verdict + 1].startswith(
        "WARNING: bolt bending, bolt at z = 0.875 in: "
        "utilization 1.372 > 1.0 on an informative item"
    )


def test_check_json_carries_the_warning() -> None:
    result = _run("check", str(SPLICE), "--json")
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    assert data["check"]["passes"] is True
    (warning,) = data["check"]["warnings"]
    assert warning.startswith("bolt bending")
    assert warning in data["warnings"]


def test_the_check_header_names_the_load_level() -> None:
    lrfd = _run("check", str(SPLICE)).output.splitlines()[1]
    asd = _run("check", str(SPLICE), "--method", "asd").output.splitlines()[1]
    assert "loads: factored" in lrfd
    assert "loads: service" in asd


def test_asd_on_factored_loads_is_one_line_with_exit_2(write_model) -> None:
    text = SPLICE.read_text(encoding="utf-8").replace(
        'method = "lrfd"', 'method = "lrfd"\nloads = "factored"'
    )
    path = write_model(text)
    result = _run("check", str(path), "--method", "asd")
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.output.count("\n") == 1
    assert result.output.startswith(f"error: {path}: check: the loads are declared factored")


def test_solve_and_check_say_the_split_assumes_fitted_holes() -> None:
    for command in ("solve", "check"):
        out = _run(command, str(SPLICE)).output
        assert "note: the plane shears assume fitted holes" in out
        assert f"plyshear capacity {SPLICE} --scatter" in out


def test_an_unloaded_joint_is_refused_by_validate_and_solve(write_model) -> None:
    path = write_model(FORK.replace("load = 100", "load = 0"))
    for command in ("validate", "solve", "check"):
        result = _run(command, str(path))
        assert result.exit_code == EXIT_BAD_INPUT
        assert result.output.startswith(f"error: {path}: member: no member carries a load")
        assert result.output.count("\n") == 1


def test_the_reviews_short_bolt_no_longer_passes(write_model) -> None:
    # a 40 mm bolt on a 56 mm grip
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 40').replace(
        "thickness = 10", "thickness = 18"
    )
    result = _run("check", str(write_model(text)))
    assert result.exit_code == EXIT_BAD_INPUT
    assert "bolt.length: 40 mm is shorter than the grip 56 mm" in result.output


def test_a_short_protrusion_is_a_warning_in_every_command(write_model) -> None:
    path = write_model(FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 60'))
    for args in (
        ["validate"],
        ["solve"],
        ["check"],
        ["capacity"],
        ["planes", "--max", "3"],
        ["sweep", "--vary", "bolt.grade=8.8,10.9", "--quiet"],
    ):
        result = CliRunner().invoke(main, [args[0], str(path), *args[1:]])
        assert "bolt.length: the bolt protrudes 20 mm past the grip" in result.output, args


def test_the_demo_bolt_protrudes_a_nut_and_two_pitches() -> None:
    joint = modelfile.load(MODELS / "fork-four-planes.toml")
    # M24: ISO 4032 nut 21.5 mm (from memory) + 2 x 3 mm pitch (ISO 261 coarse)
    assert catalog.nut_height(24.0) == 21.5
    assert joint.bolt.length - joint.grip >= 21.5 + 2 * 3.0
    assert "protrudes" not in _run("demo").output


def test_the_reviews_mistyped_load_warns_with_the_units(write_model) -> None:
    path = write_model(FORK.replace("load = 100", "load = 800000"))
    result = _run("check", str(path))
    assert result.exit_code == 1
    assert 'a load or size in the wrong units? The file\'s units = "kN-mm"' in result.output
