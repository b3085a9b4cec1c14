"""The pin-plate rules from the command line: the lug examples, validate's warning, bad keys."""

from __future__ import annotations

import json

from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import FORK, MODELS

EXIT_BAD_INPUT = 2
PIN = FORK + '\n[check]\nconnector = "pin"\n'


def _check_json(*args: str) -> dict:
    result = CliRunner().invoke(main, ["check", "--json", *args])
    assert result.exit_code in (0, 1), result.output
    return json.loads(result.output)["check"]


def test_the_aisc_lug_example_lists_every_d5_rule_with_its_clause() -> None:
    check = _check_json(str(MODELS / "lifting-lug-aisc.toml"))
    clauses = {(i["what"], i["clause"]) for i in check["items"]}
    # AISC 360-22 D5.1(a) Eq. D5-1, D5.1(b) Eq. D5-2, D2(a) Eq. D2-1, J7 Eq. J7-1, D5.2
    for pair in (
        ("lug net tension", "D5.1(a), Eq. D5-1"),
        ("lug shear-out", "D5.1(b), Eq. D5-2"),
        ("lug gross yielding", "D2(a), Eq. D2-1"),
        ("pin bearing", "J7(a), Eq. J7-1"),
        ("lug geometry", "D5.2"),
        ("lug geometry", "D5.2; D5.1(a)"),
    ):
        assert pair in clauses
    assert check["passes"]
    # five plies, each with width and extension rules
    assert sum(i["what"] == "lug geometry" for i in check["items"]) == 10


def test_the_en_lug_example_lists_table_3_9_and_the_replaceable_rules() -> None:
    check = _check_json(str(MODELS / "lug-cheek-plates.toml"))
    clauses = {(i["what"], i["clause"]) for i in check["items"]}
    # EN 1993-1-8 3.13.1 Table 3.9; 3.13.2 Table 3.10 and Eq. 3.14/3.15
    for pair in (
        ("lug geometry", "3.13.1, Table 3.9 (type A)"),
        ("lug geometry", "3.13.1, Table 3.9 (type B)"),
        ("pin bearing", "3.13.2, Table 3.10"),
        ("pin bearing (serviceability)", "3.13.2, Table 3.10 (replaceable pin)"),
        ("pin bending (serviceability)", "3.13.2, Table 3.10 (replaceable pin)"),
        ("pin contact stress", "3.13.2(3), Eq. 3.14; 3.13.2(3), Eq. 3.15"),
    ):
        assert pair in clauses


def test_validate_warns_of_a_pin_ply_without_edge_or_width(write_model) -> None:
    path = write_model(PIN)
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == 0, result.output
    warnings = [
        line
        for line in result.output.splitlines()
        if line.startswith("warning: ") and "pin plate" in line
    ]
    assert len(warnings) == 3  # three plies, none with edge or width
    assert warnings[0].startswith(
        "warning: ply[1] 'leg-1'.edge: a pin plate without edge and width"
    )


def test_a_bolt_ply_without_width_is_not_a_pin_plate_warning(write_model) -> None:
    result = CliRunner().invoke(main, ["validate", str(write_model(FORK))])
    assert "pin plate" not in result.output


def test_replaceable_must_be_a_boolean(write_model) -> None:
    path = write_model(PIN + 'replaceable = "yes"\n')
    result = CliRunner().invoke(main, ["validate", str(path)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert result.output == (
        f"error: {path}: check.replaceable: must be true or false (got a string)\n"
    )


def test_the_planes_study_json_says_when_the_lug_governs(write_model) -> None:
    # the test fork's legs cut to 34 mm beside a 25 mm pin hole (d + 1 mm): b = 4.5 mm, so
    # each leg's net tension Fu 2 t b (AISC 360-22 Eq. D5-1) is far below the pin's planes
    legs = (
        PIN.replace('name = "leg-1"', 'name = "leg-1"\nedge = 45\nwidth = 34')
        .replace('name = "leg-2"', 'name = "leg-2"\nedge = 45\nwidth = 34')
        .replace('name = "lug"', 'name = "lug"\nedge = 60\nwidth = 120')
    )
    result = CliRunner().invoke(main, ["planes", str(write_model(legs)), "--max", "3", "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    assert [line.split(":")[0] for line in data["lugs"]] == ["2 planes", "3 planes"]
    assert data["planes"][0]["collapse"]["mechanism"]["lugs"] == [
        {"ply": "fork-1", "rule": "lug net tension"},
        {"ply": "fork-2", "rule": "lug net tension"},
    ]
