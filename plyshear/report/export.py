"""Results out of the tool: CSV (one file, a ``table`` column) and XLSX (one sheet per table).

The rows are read off the JSON result (the contract in docs/results.md), so the
three forms never disagree: one row per plane, per ply, per member, per check
item and per capacity answer, in the model's units (the ``units`` table names
them). Columns are documented in docs/results.md.
"""

from __future__ import annotations

import csv
import io
from typing import Any

#: Every table's columns, in order. A CSV has the union, with ``table`` first.
COLUMNS: dict[str, tuple[str, ...]] = {
    "units": ("quantity", "unit"),
    "plane": (
        "bolt",
        "x",
        "index",
        "z",
        "above",
        "below",
        "shear",
        "shear_x",
        "shear_y",
        "moment",
        "moment_x",
        "moment_y",
        "threads",
    ),
    "ply": ("bolt", "x", "name", "member", "bearing", "bearing_x", "bearing_y"),
    "member": ("name", "support", "reaction_x", "reaction_y", "displacement_x", "displacement_y"),
    "check": (
        "what",
        "where",
        "bolt",
        "plane",
        "ply",
        "demand",
        "capacity",
        "unit",
        "utilization",
        "clause",
        "informative",
        "governing",
        "note",
    ),
    "capacity": ("answer", "load", "design_load", "efficiency", "event", "where"),
}
#: What names a check item: the governing one is the item equal to it in all of these.
PLACE = ("what", "where", "bolt", "plane", "ply")
#: The capacity answers exported, in order.
ANSWERS = ("elastic", "nonlinear", "collapse", "plastic")
FORMATS = (".csv", ".xlsx")


def tables(result: dict[str, Any]) -> dict[str, list[dict[str, Any]]]:
    """The JSON result as tables of rows (a dict per row), only those it has."""
    out: dict[str, list[dict[str, Any]]] = {
        "units": [{"quantity": k, "unit": v} for k, v in result["units"].items()],
        "plane": [],
        "ply": [],
        "member": [
            {
                "name": m["name"],
                "support": m.get("support", False),
                "reaction_x": m["reaction_xy"][0],
                "reaction_y": m["reaction_xy"][1],
                "displacement_x": m["displacement_xy"][0],
                "displacement_y": m["displacement_xy"][1],
            }
            for m in result["members"]
        ],
    }
    for k, b in enumerate(result["bolts"], start=1):
        for p in b["planes"]:
            out["plane"].append(
                {
                    "bolt": k,
                    "x": b["x"],
                    "index": p["index"],
                    "z": p["z"],
                    "above": p["above"],
                    "below": p["below"],
                    "shear": p["shear"],
                    "shear_x": p["shear_xy"][0],
                    "shear_y": p["shear_xy"][1],
                    "moment": p["moment"],
                    "moment_x": p["moment_xy"][0],
                    "moment_y": p["moment_xy"][1],
                    "threads": p["threads"],
                }
            )
        for p in b["plies"]:
            out["ply"].append(
                {
                    "bolt": k,
                    "x": b["x"],
                    "name": p["name"],
                    "member": p["member"] or "",
                    "bearing": p["bearing"],
                    "bearing_x": p["bearing_xy"][0],
                    "bearing_y": p["bearing_xy"][1],
                }
            )
    if "check" in result:
        gov = result["check"]["governing"]
        out["check"] = [
            {
                **{c: item.get(c) for c in COLUMNS["check"]},
                "governing": gov is not None and all(item.get(k) == gov.get(k) for k in PLACE),
            }
            for item in result["check"]["items"]
        ]
    if "capacity" in result:
        cap = result["capacity"]
        out["capacity"] = [
            {
                "answer": name,
                "load": cap[name]["load"],
                "design_load": cap[name]["design_load"],
                "efficiency": cap["efficiency"][name],
                "event": cap[name].get("event", ""),
                "where": cap[name].get("where", "; ".join(cap[name].get("cut", []))),
            }
            for name in ANSWERS
        ]
    return out


def _cell(value: Any) -> Any:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    return value


def to_csv(result: dict[str, Any]) -> bytes:
    """One CSV: a ``table`` column, then the union of the tables' columns."""
    data = tables(result)
    header = ["table"]
    for name in data:
        header += [c for c in COLUMNS[name] if c not in header]
    buf = io.StringIO()
    writer = csv.DictWriter(buf, header, lineterminator="\n")
    writer.writeheader()
    for name, rows in data.items():
        for row in rows:
            writer.writerow({"table": name, **{k: _cell(v) for k, v in row.items()}})
    return buf.getvalue().encode("utf-8")


def to_xlsx(result: dict[str, Any]) -> bytes:
    """One workbook, a sheet per table with its own columns (needs the ``xlsx`` extra)."""
    from plyshear.report.extras import require

    openpyxl = require("openpyxl", "xlsx")
    book = openpyxl.Workbook()
    book.remove(book.active)
    for name, rows in tables(result).items():
        sheet = book.create_sheet(name)
        sheet.append(list(COLUMNS[name]))
        for row in rows:
            sheet.append(["" if row.get(c) is None else row.get(c) for c in COLUMNS[name]])
    buf = io.BytesIO()
    book.save(buf)
    return buf.getvalue()


def export(result: dict[str, Any], suffix: str) -> bytes:
    """The result as ``.csv`` or ``.xlsx`` bytes."""
    if suffix == ".csv":
        return to_csv(result)
    if suffix == ".xlsx":
        return to_xlsx(result)
    raise ValueError(f"an export is a {' or '.join(FORMATS)} file (got {suffix!r})")
