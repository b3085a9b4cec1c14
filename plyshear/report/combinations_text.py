"""Terminal tables of load cases, combinations, their envelope and their check."""

from __future__ import annotations

from plyshear import units as _units
from plyshear.codes.check import UNVERIFIED
from plyshear.codes.combinations import CombinedCheck
from plyshear.mechanics.combine import Combined
from plyshear.model.joint import Joint
from plyshear.report.numbers import fmt, item_row
from plyshear.report.text import CAUTION, table


def loads_text(joint: Joint) -> str:
    """The load cases (member forces) and the combinations with their factors."""
    u = _units.system(joint.units)
    f, lf = u.factor("force"), u.label("force")
    rows = []
    for case in joint.cases:
        for m, (fx, fy) in zip(joint.members, case.loads, strict=True):
            if (fx, fy) != (0.0, 0.0):
                rows.append([case.name, case.category or "", m.name, fmt(fx / f), fmt(fy / f)])
    out = [
        f"load cases ({lf}):",
        table(["case", "category", "member", "Fx", "Fy"], rows, "lllrr"),
        "",
        "combinations:",
    ]
    crows = [
        [c.name, c.level, " + ".join(f"{fmt(v)} {k}" for k, v in c.factors), c.source]
        for c in joint.combinations
    ]
    out.append(table(["combination", "level", "factors", "equation"], crows, "llll"))
    return "\n".join(out)


def envelope_text(combined: Combined) -> str:
    """The envelope: every plane's largest |V| and |M|, every ply's largest bearing."""
    joint = combined.joint
    u = _units.system(joint.units)
    f, mo = u.factor("force"), u.factor("moment")
    rows = []
    for p in combined.planes:
        where = f"plane {p.index}" + (f" (bolt {p.bolt + 1})" if len(joint.stations) > 1 else "")
        rows.append(
            [
                where,
                fmt(p.shear.value / f),
                p.shear.combination,
                fmt(p.moment.value / mo),
                p.moment.combination,
            ]
        )
    prow = []
    for b in combined.plies:
        where = joint.plies[b.ply].name + (
            f" (bolt {b.bolt + 1})" if len(joint.stations) > 1 else ""
        )
        prow.append([where, fmt(b.bearing.value / f), b.bearing.combination])
    return "\n".join(
        [
            f"envelope over {len(combined.combinations)} combinations "
            f"({u.label('force')}, {u.label('moment')}):",
            table(["plane", "|V|", "combination", "|M|", "combination"], rows, "lrlrl"),
            "",
            table(["ply", "bearing", "combination"], prow, "lrl"),
        ]
    )


def solve_text(combined: Combined) -> str:
    """The terminal report of ``solve`` for a joint with load cases."""
    sols = list(combined.cases.values()) + list(combined.combinations.values())
    residual = max(s.equilibrium_residual for s in sols)
    warnings = dict.fromkeys(w for s in sols for w in s.warnings)
    return "\n".join(
        [
            combined.joint.title or (combined.joint.source or "joint"),
            "",
            loads_text(combined.joint),
            "",
            envelope_text(combined),
            "",
            f"equilibrium residual (largest over cases and combinations): "
            f"{residual:.1e} of the load",
            *[f"WARNING: {w}" for w in warnings],
            "Every combination's full result: --combination NAME (or --json).",
            "",
            CAUTION,
        ]
    )


def check_text(checks: CombinedCheck, joint: Joint) -> str:
    """The check of every combination: the governing line of every item."""
    u = _units.system(joint.units)
    summary = checks.summary()
    rows = []
    lines = checks.lines()
    for line in lines:
        row = item_row(line.item, joint.units, u, line is lines[0])
        row.insert(2, line.combination)
        rows.append(row)
    method = {"lrfd": "LRFD", "asd": "ASD"}.get(summary.method, "partial factors")
    out = [
        joint.title or (joint.source or "joint"),
        f"check: {summary.edition}, {method}; {len(checks.results)} combination"
        f"{'s' if len(checks.results) != 1 else ''}, the governing one per item",
        "",
        table(
            ["check", "where", "combination", "demand", "capacity", "unit", "util.", "clause", ""],
            rows,
            "lllrrlrll",
        ),
        "",
    ]
    gov = summary.governing
    if summary.unverified:
        out.append(f"{UNVERIFIED} ({summary.unverified}); the demands cannot be trusted")
    elif gov is not None:
        verdict = "PASSES" if checks.passes else "FAILS"
        out.append(
            f"{verdict}: governing combination {checks.governing_combination}: "
            f"{gov.what} at {gov.place(joint.units)}, utilization "
            f"{gov.utilization:.3f} ({gov.clause})"
        )
    out += [f"WARNING: {w}" for w in summary.warnings]
    out += [f"note: {n}" for n in summary.notes]
    out += ["", loads_text(joint), "", CAUTION]
    return "\n".join(out)
