"""Sweep keys and values (plyshear.sweep.keys): the syntax, and one-line errors naming the key."""

from __future__ import annotations

import tomllib

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from plyshear.sweep import keys as sk
from tests.conftest import FORK

DATA = tomllib.loads(FORK)


@pytest.mark.parametrize(
    ("text", "path"),
    [
        ("bolt.diameter", ("bolt", "diameter")),
        ("ply[2].thickness", ("ply", 1, "thickness")),
        ("ply.leg-2.steel", ("ply", 2, "steel")),
        ("member.lug.load", ("member", "lug", "load")),
        ("analysis.elements_per_ply", ("analysis", "elements_per_ply")),
        ("check.standard", ("check", "standard")),
    ],
)
def test_keys_resolve_to_paths(text: str, path: tuple) -> None:
    assert sk.parse_key(text, DATA).path == path


@pytest.mark.parametrize(
    ("text", "fragment"),
    [
        ("ply[9].thickness", "ply[9].thickness: the model has plies 1 to 3 (got ply[9])"),
        ("ply[0].thickness", "the model has plies 1 to 3"),
        ("bolt.diamter", "bolt.diamter: unknown key 'diamter' of bolt; did you mean 'diameter'?"),
        ("blot.diameter", "did you mean 'bolt'?"),
        ("member.hanger.load", "no member is named 'hanger'"),
        ("ply.leg3.thickness", "no ply is named 'leg3'; did you mean 'leg-2'?"),
        ("ply[1].name", "a ply's name cannot be varied"),
        ("bolt", "expected one key after the bolt table"),
        ("bolt..diameter", "not a key"),
        ("units", "unknown table 'units'"),
    ],
)
def test_bad_keys_name_themselves(text: str, fragment: str) -> None:
    with pytest.raises(sk.SweepError) as err:
        sk.parse_key(text, DATA)
    assert fragment in str(err.value)
    assert "\n" not in str(err.value)


def _values(spec: str) -> list:
    return sk.parse_vary(spec, DATA)[1]


def test_lists_ranges_names_and_arrays() -> None:
    assert _values("bolt.diameter=16,20,24") == [16, 20, 24]
    assert _values("ply[2].thickness=8:20:2") == [8, 10, 12, 14, 16, 18, 20]  # ends included
    assert _values("ply[2].thickness=20:8:-4") == [20, 16, 12, 8]
    assert _values("ply[2].thickness=1:1.3:0.1") == [1.0, 1.1, 1.2, 1.3]  # no 1.2000000000000002
    assert _values("bolt.grade=8.8,10.9") == ["8.8", "10.9"]  # names stay text
    assert _values('ply[1].thickness=0.5 in,"12 mm"') == ["0.5 in", "12 mm"]
    assert _values("member.lug.load=[100,50],[200, 100]") == [[100, 50], [200, 100]]


@pytest.mark.parametrize(
    ("spec", "fragment"),
    [
        ("ply[2].thickness=8:20:0", "ply[2].thickness: the step 0 never gets from 8 to 20"),
        ("ply[2].thickness=8:20:-1", "never gets from 8 to 20"),
        ("ply[2].thickness=8:x", "a range is start:stop or start:stop:step"),
        ("ply[2].thickness=", "ply[2].thickness: no values after '='"),
        ("ply[2].thickness=1,,2", "an empty value"),
        ("ply[2].thickness", "write --vary KEY=VALUES"),
        ("ply[2].thickness=0:1e7:1", "more than 1000000 values"),
    ],
)
def test_bad_values_name_the_key(spec: str, fragment: str) -> None:
    with pytest.raises(sk.SweepError) as err:
        sk.parse_vary(spec, DATA)
    assert fragment in str(err.value)


def test_factorial_order_and_count() -> None:
    a = sk.parse_vary("bolt.diameter=20,24", DATA)
    b = sk.parse_vary("ply[2].thickness=10:14:2", DATA)
    keys, rows = sk.cases([a, b])
    assert [k.text for k in keys] == ["bolt.diameter", "ply[2].thickness"]
    assert rows == [[20, 10], [20, 12], [20, 14], [24, 10], [24, 12], [24, 14]]


def test_the_same_value_twice_is_refused() -> None:
    a = sk.parse_vary("ply[3].thickness=10,12", DATA)
    b = sk.parse_vary("ply.leg-2.thickness=14", DATA)
    with pytest.raises(sk.SweepError, match="set the same value"):
        sk.cases([a, b])


def test_apply_sets_values_and_leaves_the_model_alone() -> None:
    keys, rows = sk.cases(
        [
            sk.parse_vary("ply[2].thickness=30", DATA),
            sk.parse_vary("analysis.elements_per_ply=4", DATA),
        ]
    )
    edited = sk.apply(DATA, keys, rows[0])
    assert edited["ply"][1]["thickness"] == 30
    assert edited["analysis"] == {"elements_per_ply": 4}
    assert DATA["ply"][1]["thickness"] == 20  # the parsed model is untouched
    assert "analysis" not in DATA


def test_case_table(tmp_path) -> None:
    path = tmp_path / "cases.csv"
    path.write_text(
        "bolt.diameter,ply[2].thickness,bolt.grade\n20,18,8.8\n24,,10.9\n", encoding="utf-8"
    )
    keys, rows = sk.read_cases(path, DATA)
    assert [k.text for k in keys] == ["bolt.diameter", "ply[2].thickness", "bolt.grade"]
    assert rows == [[20, 18, "8.8"], [24, None, "10.9"]]  # empty cell: the model's value
    bad = tmp_path / "bad.csv"
    bad.write_text("bolt.diameter,ply[7].thickness\n20,18\n", encoding="utf-8")
    with pytest.raises(sk.SweepError, match=r"bad.csv: header: ply\[7\].thickness"):
        sk.read_cases(bad, DATA)
    short = tmp_path / "short.csv"
    short.write_text("bolt.diameter,ply[2].thickness\n20\n", encoding="utf-8")
    with pytest.raises(sk.SweepError, match="line 2: 1 cells for 2 keys"):
        sk.read_cases(short, DATA)


@pytest.mark.parametrize(
    ("args", "fragment"),
    [
        (["--vary", "ply[9].thickness=1,2"], "ply[9].thickness: the model has plies 1 to 3"),
        (["--vary", "bolt.diamter=20"], "did you mean 'diameter'?"),
        (["--vary", "bolt.diameter=8:4:1"], "bolt.diameter: the step 1 never gets from 8 to 4"),
        ([], "give at least one --vary"),
        (["--vary", "bolt.diameter=20", "-o", "out.txt"], "-o needs a .csv or .jsonl file name"),
        (
            ["--vary", "bolt.diameter=20", "--plot", "p.png", "--response", "volume"],
            "--response 'volume' cannot be plotted",
        ),
        (
            ["--vary", "bolt.diameter=20", "--plot", "p.png", "--x", "bolt.grade"],
            "--x 'bolt.grade' is not a varied key",
        ),
    ],
)
def test_cli_key_errors_are_one_line(write_model, args: list[str], fragment: str) -> None:
    path = write_model(FORK)
    result = CliRunner().invoke(main, ["sweep", str(path), *args])
    assert result.exit_code == 2
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1
    assert lines[0].startswith("error: ")
    assert fragment in lines[0]


@pytest.mark.parametrize(
    ("spec", "fragment"),
    [
        # found in review: these once ended in OverflowError or ValueError tracebacks
        ("ply[2].thickness=0:1e308:1e-308", "has more than 1000000 values"),
        ("ply[2].thickness=0:1:5e-324", "has more than 1000000 values"),
        ("member.lug.load=[1,2],[3", "unbalanced brackets"),
    ],
)
def test_hostile_values_are_one_line_errors(spec: str, fragment: str) -> None:
    with pytest.raises(sk.SweepError, match=fragment.replace("[", r"\[")):
        sk.parse_vary(spec, DATA)


def test_long_integers_and_foreign_digits_do_not_crash() -> None:
    big = "9" * 5000
    assert _values(f"ply[2].thickness={big}") == [float("inf")]  # the loader refuses it
    assert _values("ply[2].thickness=١٢") == ["١٢"]  # not ASCII digits: text for the loader


def test_case_table_keeps_empty_rows_and_counts_lines(tmp_path) -> None:
    path = tmp_path / "cases.csv"
    path.write_text("\ufeff bolt.diameter , ply[2].thickness\n\n20,18\n,\n\n24\n", encoding="utf-8")
    with pytest.raises(sk.SweepError, match="line 6: 1 cells for 2 keys"):
        sk.read_cases(path, DATA)
    path.write_text(" bolt.diameter , ply[2].thickness\n\n20,18\n,\n", encoding="utf-8")
    keys, rows = sk.read_cases(path, DATA)
    assert [k.text for k in keys] == ["bolt.diameter", "ply[2].thickness"]
    assert rows == [[20, 18], [None, None]]  # an empty row is the model itself


def test_jsonl_has_no_infinities() -> None:
    import json

    from plyshear.sweep.output import to_jsonl

    line = to_jsonl(
        [{"case": 1, "bolt.diameter": float("inf"), "x": [float("nan"), 1.0]}],
        ["case", "bolt.diameter", "x"],
    )
    assert json.loads(line) == {"case": 1, "bolt.diameter": None, "x": [None, 1.0]}


@pytest.mark.parametrize(
    ("args", "fragment"),
    [
        (["--no-check", "--plot", "p.png"], "--response utilization needs the check"),
        (["--plot", "p.png", "--response", "efficiency_nonlinear"], "needs --capacity full"),
        (["--plot", "p.png", "--response", "shear_plane_99"], "the model has planes 1 to 2"),
        (
            ["--capacity", "none", "--plot", "p.png", "--response", "capacity_elastic"],
            "needs --capacity elastic or full",
        ),
        (
            [
                "--vary",
                "member.lug.load=[100,0],[200,0]",
                "--plot",
                "p.png",
                "--x",
                "member.lug.load",
            ],
            "member.lug.load has array values",
        ),
    ],
)
def test_chart_options_are_checked_before_the_run(
    write_model, args: list[str], fragment: str
) -> None:
    path = write_model(FORK)
    result = CliRunner().invoke(main, ["sweep", str(path), "--vary", "bolt.diameter=20,24", *args])
    assert result.exit_code == 2
    lines = result.stderr.strip().splitlines()
    assert len(lines) == 1
    assert fragment in lines[0]


def test_a_sweep_where_every_case_fails_exits_1(write_model) -> None:
    path = write_model(FORK)
    result = CliRunner().invoke(main, ["sweep", str(path), "--vary", "pattern.count=2,3"])
    assert result.exit_code == 1
    assert "2 cases, 0 solved, 2 with errors" in result.stdout
    assert "pattern: give positions, or both count and pitch" in result.stdout
