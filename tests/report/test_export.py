"""Exports: CSV and XLSX read back equal to the JSON of the same command; never overwritten."""

from __future__ import annotations

import csv
import io
import json

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS

DEMO = MODELS / "fork-four-planes.toml"
REL_CSV = 1e-12  # csv writes repr(float): round-trips exactly; the tolerance is for safety
EXIT_BAD_INPUT = 2


def _run(*args: str) -> str:
    result = CliRunner().invoke(main, list(args))
    assert result.exit_code in (0, 1), result.output
    return result.output


def _csv(path) -> dict[str, list[dict[str, str]]]:
    out: dict[str, list[dict[str, str]]] = {}
    for row in csv.DictReader(io.StringIO(path.read_text(encoding="utf-8"))):
        out.setdefault(row["table"], []).append(row)
    return out


def _json(*args: str) -> dict:
    result = CliRunner().invoke(main, [*args, "--json"])
    return json.loads(result.stdout)


def test_solve_csv_has_a_row_per_plane_ply_and_member_equal_to_the_json(tmp_path) -> None:
    out = tmp_path / "r.csv"
    _run("solve", str(DEMO), "-o", str(out))
    rows = _csv(out)
    data = _json("solve", str(DEMO))
    planes = data["bolts"][0]["planes"]
    assert len(rows["plane"]) == len(planes)
    for row, plane in zip(rows["plane"], planes, strict=True):
        assert int(row["index"]) == plane["index"]
        assert float(row["shear"]) == pytest.approx(plane["shear"], rel=REL_CSV)
        assert float(row["shear_y"]) == pytest.approx(plane["shear_xy"][1], abs=1e-12)
        assert float(row["moment"]) == pytest.approx(plane["moment"], rel=REL_CSV)
        assert row["above"] == plane["above"]
    plies = data["bolts"][0]["plies"]
    assert [r["name"] for r in rows["ply"]] == [p["name"] for p in plies]
    for row, ply in zip(rows["ply"], plies, strict=True):
        assert float(row["bearing"]) == pytest.approx(ply["bearing"], rel=REL_CSV)
    assert {r["name"] for r in rows["member"]} == {m["name"] for m in data["members"]}
    assert {r["quantity"]: r["unit"] for r in rows["units"]} == data["units"]


def test_check_xlsx_has_a_sheet_each_equal_to_the_json(tmp_path) -> None:
    openpyxl = pytest.importorskip("openpyxl")
    out = tmp_path / "r.xlsx"
    _run("check", str(DEMO), "-o", str(out))
    book = openpyxl.load_workbook(out)
    assert {"units", "plane", "ply", "member", "check"} <= set(book.sheetnames)
    sheet = book["check"]
    header, *rows = [list(r) for r in sheet.iter_rows(values_only=True)]
    items = _json("check", str(DEMO))["check"]["items"]
    assert len(rows) == len(items)
    for row, item in zip(rows, items, strict=True):
        cells = dict(zip(header, row, strict=True))
        assert cells["what"] == item["what"]
        assert cells["where"] == item["where"]
        assert cells["utilization"] == pytest.approx(item["utilization"], rel=REL_CSV)
        assert cells["clause"] == item["clause"]
    governing = [
        dict(zip(header, r, strict=True))
        for r in rows
        if dict(zip(header, r, strict=True))["governing"] is True
    ]
    assert len(governing) == 1


def test_check_csv_carries_every_check_item(tmp_path) -> None:
    out = tmp_path / "r.csv"
    _run("check", str(DEMO), "-o", str(out))
    rows = _csv(out)["check"]
    items = _json("check", str(DEMO))["check"]["items"]
    assert [(r["what"], r["where"]) for r in rows] == [(i["what"], i["where"]) for i in items]
    for row, item in zip(rows, items, strict=True):
        assert float(row["demand"]) == pytest.approx(item["demand"], rel=REL_CSV)


def test_capacity_csv_has_the_four_answers_of_the_json(tmp_path) -> None:
    out = tmp_path / "c.csv"
    _run("capacity", str(MODELS / "splice-with-filler.toml"), "-o", str(out))
    rows = {r["answer"]: r for r in _csv(out)["capacity"]}
    data = _json("capacity", str(MODELS / "splice-with-filler.toml"))["capacity"]
    for name in ("elastic", "nonlinear", "collapse", "plastic"):
        assert float(rows[name]["load"]) == pytest.approx(data[name]["load"], rel=REL_CSV)
        assert float(rows[name]["efficiency"]) == pytest.approx(
            data["efficiency"][name], rel=REL_CSV
        )


def test_an_export_is_never_overwritten_without_force(tmp_path) -> None:
    out = tmp_path / "r.csv"
    out.write_text("the engineer's own sheet", encoding="utf-8")
    result = CliRunner().invoke(main, ["solve", str(DEMO), "-o", str(out)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert "exists; use --force" in result.output
    assert out.read_text(encoding="utf-8") == "the engineer's own sheet"
    _run("solve", str(DEMO), "-o", str(out), "--force")
    assert out.read_text(encoding="utf-8").startswith("table,")


def test_an_export_needs_csv_or_xlsx(tmp_path) -> None:
    result = CliRunner().invoke(main, ["check", str(DEMO), "-o", str(tmp_path / "r.ods")])
    assert result.exit_code == EXIT_BAD_INPUT
    assert ".csv or .xlsx" in result.output


def test_check_csv_of_a_bolt_row_keys_every_item_on_its_bolt_plane_and_ply(tmp_path) -> None:
    model = MODELS / "splice-six-bolts.toml"
    out = tmp_path / "r.csv"
    _run("check", str(model), "-o", str(out))
    rows = _csv(out)["check"]
    items = _json("check", str(model))["check"]["items"]

    def blank(v: object) -> str:  # csv writes None as an empty cell
        return "" if v is None else str(v)

    assert [(r["bolt"], r["plane"], r["ply"]) for r in rows] == [
        (blank(i["bolt"]), blank(i["plane"]), blank(i["ply"])) for i in items
    ]
    assert {r["bolt"] for r in rows if r["bolt"]} == {str(k) for k in range(1, 7)}  # six bolts
    assert sum(r["governing"] == "true" for r in rows) == 1
