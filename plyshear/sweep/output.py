"""The sweep's table as CSV, JSON lines or terminal text (strings; the CLI writes them)."""

from __future__ import annotations

import csv
import io
import json
import math
from collections.abc import Sequence
from typing import Any

from plyshear import units as _units

#: Columns shown on the terminal (the files carry them all).
TERMINAL = (
    "case",
    "error",
    "max_shear",
    "worst_bolt",
    "worst_plane",
    "max_moment",
    "utilization",
    "passes",
    "informative",
    "capacity_elastic",
    "load_factor",
    "capacity_nonlinear",
    "capacity_collapse",
    "capacity_plastic",
)
#: Rows printed on the terminal before the rest is summarised.
TERMINAL_ROWS = 40


def to_csv(rows: Sequence[dict[str, Any]], cols: Sequence[str]) -> str:
    """The table as CSV: a header of column names, one row per case, empty where absent."""
    buf = io.StringIO()
    w = csv.writer(buf, lineterminator="\n")
    w.writerow(cols)
    for r in rows:
        w.writerow([_cell(r.get(c)) for c in cols])
    return buf.getvalue()


def _cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value) if math.isfinite(value) else ""
    if isinstance(value, list):
        return json.dumps(value)
    return str(value)


def to_jsonl(rows: Sequence[dict[str, Any]], cols: Sequence[str]) -> str:
    """The table as JSON lines: one object per case, every column (null: absent or not finite)."""
    return "".join(
        json.dumps({c: _json(r.get(c)) for c in cols}, allow_nan=False) + "\n" for r in rows
    )


def _json(value: Any) -> Any:
    if isinstance(value, float) and not math.isfinite(value):
        return None
    if isinstance(value, list):
        return [_json(v) for v in value]
    return value


def units_line(units: str) -> str:
    """Which units the numbers of the table are in."""
    u = _units.system(units)
    return (
        f"units: forces in {u.label('force')}, moments in {u.label('moment')}, "
        f"lengths in {u.label('length')}; utilization, load factor and efficiency are "
        "ratios; capacities use nominal strengths (as plyshear capacity)"
    )


def text(
    rows: Sequence[dict[str, Any]], cols: Sequence[str], keys: Sequence[str], units: str
) -> str:
    """A terminal table of the first rows and a summary of all of them."""
    from plyshear.report.text import fmt, table

    shown = [c for c in cols if c in keys or c in TERMINAL]
    if not any(r.get("error") for r in rows):
        shown.remove("error")
    body = [[_short(r.get(c), fmt, c in keys) for c in shown] for r in rows[:TERMINAL_ROWS]]
    out = [table(shown, body)]
    if len(rows) > TERMINAL_ROWS:
        out.append(f"... {len(rows) - TERMINAL_ROWS} more cases (write them all with -o)")
    out.append(summary(rows))
    out.append(units_line(units))
    return "\n".join(out)


def _short(value: Any, fmt: Any, raw: bool = False) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        if raw:  # a varied key's value, as written
            return "true" if value else "false"
        return "yes" if value else "NO"
    if isinstance(value, float):
        return fmt(value)
    text = str(value)
    return text if len(text) <= 60 else text[:57] + "..."


def summary(rows: Sequence[dict[str, Any]]) -> str:
    """One line: how many cases, failed, passing; the least and most utilized."""
    failed = sum(1 for r in rows if r.get("error"))
    line = f"{len(rows)} cases, {len(rows) - failed} solved, {failed} with errors"
    checked = [r for r in rows if not r.get("error") and r.get("utilization") is not None]
    if checked:
        passing = sum(1 for r in checked if r.get("passes"))
        lo = min(checked, key=lambda r: r["utilization"])
        hi = max(checked, key=lambda r: r["utilization"])
        line += (
            f"; {passing} pass; utilization from {lo['utilization']:.3f} "
            f"(case {lo['case']}) to {hi['utilization']:.3f} (case {hi['case']})"
        )
    over = sum(1 for r in rows if (r.get("informative") or 0.0) > 1.0)
    if over:
        line += (
            f"\nwarning: {over} case(s) exceed 1.0 on an informative item (bolt bending, "
            "outside the standard's bolt clauses): see the 'informative' column"
        )
    return line


#: Columns of text (the rest of a CSV row is numbers, or empty).
TEXT_COLUMNS = frozenset(
    {"case_key", "error", "governing", "capacity_event", "nonlinear_event", "status", "key"}
)
INTEGER_COLUMNS = frozenset({"case", "worst_plane", "worst_bolt", "sample"})


def read_table(path: str, keys: Sequence[Any] = ()) -> list[dict[str, Any]]:
    """Read a sweep's CSV or JSON lines file back into rows with typed values.

    Args:
        path: The file.
        keys: The varied keys (:class:`plyshear.sweep.keys.Key`), whose CSV cells are
            read as a ``--vary`` value is.
    """
    from plyshear.sweep.keys import parse_value

    with open(path, encoding="utf-8", newline="") as fh:
        if not str(path).lower().endswith(".csv"):
            return [json.loads(line) for line in fh if line.strip()]
        by_text = {k.text: k for k in keys}
        rows = []
        for rec in csv.DictReader(fh):
            rows.append({c: _typed(c, v, by_text.get(c), parse_value) for c, v in rec.items()})
        return rows


def _typed(col: str, cell: str | None, key: Any, parse_value: Any) -> Any:
    if cell is None or col in TEXT_COLUMNS:
        return cell or ""
    if key is not None:
        return parse_value(cell, key) if cell else None
    if cell == "":
        return None
    if cell in ("true", "false"):
        return cell == "true"
    try:
        return int(cell) if col in INTEGER_COLUMNS else float(cell)
    except ValueError:
        return cell
