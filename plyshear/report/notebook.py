"""Results in a notebook: ``_repr_html_`` and ``to_frame()`` on the result classes.

Jupyter shows an object by its ``_repr_html_``: here the report's own tables
(and, for a solution, the shear and moment figure as inline SVG). ``to_frame()``
gives pandas DataFrames (the ``pandas`` extra; without it, one clear error naming
the extra). The rows are those of the exports (:mod:`plyshear.report.export`),
read off the JSON result, in the model's units.

The methods are attached to the result classes when this module is imported
(``plyshear.solve``, ``check`` and ``capacity`` import it), so the mechanics and
the codes stay free of report code; nothing heavy is imported until a method runs.
"""

from __future__ import annotations

from typing import Any

from plyshear.codes.check import CheckResult
from plyshear.mechanics.capacity import CapacitySummary
from plyshear.mechanics.results import Solution

#: The export's (CSV, XLSX) name of each table, also accepted by ``to_frame``.
EXPORT_NAMES = {"plane": "planes", "ply": "plies", "member": "members", "check": "items"}
#: The tables ``to_frame`` gives, per class; the first is the default.
FRAMES = {
    "Solution": ("planes", "plies", "members"),
    "CheckResult": ("items",),
    "CapacitySummary": ("answers", "events"),
}


def _pandas() -> Any:
    from plyshear.report.extras import require

    return require("pandas", "pandas")


def _today() -> str:
    import datetime as dt

    return dt.date.today().isoformat()


def _solution_rows(sol: Solution, table: str) -> list[dict[str, Any]]:
    from plyshear.report.export import tables

    return tables(sol.to_dict(diagram=False))[
        {"planes": "plane", "plies": "ply", "members": "member"}[table]
    ]


def _check_rows(res: CheckResult) -> list[dict[str, Any]]:
    from plyshear.report.export import tables

    return tables({"units": {}, "members": [], "bolts": [], "check": res.to_dict()})["check"]


def _capacity_rows(cap: CapacitySummary, table: str) -> list[dict[str, Any]]:
    from plyshear.report.capacity_data import capacity_dict
    from plyshear.report.export import tables

    data = capacity_dict(cap, cap.solution.joint)
    if table == "events":
        return list(data["nonlinear"]["events"])
    return tables({"units": {}, "members": [], "bolts": [], "capacity": data})["capacity"]


def to_frame(obj: Solution | CheckResult | CapacitySummary, table: str | None = None) -> Any:
    """A pandas DataFrame of a result's table.

    Args:
        obj: A solution (tables ``planes``, ``plies``, ``members``), a check result
            (``items``) or a capacity summary (``answers``, ``events``).
        table: Which table; default the first. The export's sheet names
            (``plane``, ``ply``, ``member``, ``check``) are accepted too.

    Returns:
        The DataFrame, in the model's units.

    Raises:
        plyshear.report.extras.MissingExtraError: Without pandas.
        ValueError: For a table the object does not have.
    """
    pd = _pandas()
    kind = type(obj).__name__
    names = FRAMES[kind]
    table = EXPORT_NAMES.get(table, table) if table else names[0]
    if table not in names:
        raise ValueError(
            f"{kind}.to_frame: table must be one of {', '.join(names)} (got {table!r})"
        )
    if isinstance(obj, Solution):
        rows = _solution_rows(obj, table)
    elif isinstance(obj, CheckResult):
        rows = _check_rows(obj)
    else:
        rows = _capacity_rows(obj, table)
    return pd.DataFrame(rows)


def _data(sol: Solution, res: CheckResult | None = None, cap: CapacitySummary | None = None) -> Any:
    from plyshear.codes.check import check
    from plyshear.report.content import ReportData

    joint = sol.joint
    return ReportData(joint, sol, res if res is not None else check(sol), cap, "", _today())


def solution_html(sol: Solution) -> str:
    """A solution as HTML: plane shears, ply bearings and the shear/moment figure."""
    from plyshear.report import diagrams
    from plyshear.report.content import result_rows
    from plyshear.report.document import html_table, svg_inline

    data = _data(sol)
    parts = [f"<h4>{_esc(sol.joint.title or sol.joint.source or 'joint')}</h4>"]
    parts += [html_table(t) for t in result_rows(data)]
    parts.append(svg_inline(diagrams.solution_figure(sol), f"nb{id(sol):x}"))
    return "\n".join(parts)


def check_html(res: CheckResult) -> str:
    """A check result as HTML: the items by utilization, the governing one marked."""
    from plyshear.report.content import Table
    from plyshear.report.document import html_table

    rows = [
        [
            r["what"],
            r["where"],
            f"{r['demand']:.4g}",
            f"{r['capacity']:.4g}",
            r["unit"],
            f"{r['utilization']:.3f}",
            r["clause"],
        ]
        for r in _check_rows(res)
    ]
    order = sorted(range(len(rows)), key=lambda i: -float(rows[i][5]))
    gov = next((k for k, i in enumerate(order) if _check_rows(res)[i]["governing"]), None)
    verdict = "passes" if res.passes else "FAILS"
    table = Table(
        ["check", "where", "demand", "capacity", "unit", "utilization", "clause"],
        [rows[i] for i in order],
        "llrrlrl",
        f"{res.edition}: the joint {verdict}",
        gov,
    )
    return html_table(table)


def capacity_html(cap: CapacitySummary) -> str:
    """A capacity summary as HTML: the report's capacity section."""
    from plyshear.report.content import capacity_blocks
    from plyshear.report.document import html_block

    return "\n".join(html_block(b) for b in capacity_blocks(_data(cap.solution, cap=cap)))


def _esc(text: object) -> str:
    import html

    return html.escape(str(text))


def _attach() -> None:
    """Give the result classes their notebook methods."""
    for cls, render in (
        (Solution, solution_html),
        (CheckResult, check_html),
        (CapacitySummary, capacity_html),
    ):
        setattr(cls, "_repr_html_", render)  # noqa: B010 (the classes are not report's)
        setattr(cls, "to_frame", to_frame)  # noqa: B010


_attach()
