"""Terminal tables: plain text, fixed-width columns, the joint's own units."""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np

from plyshear import units as _units
from plyshear.codes.check import fitted_holes_note
from plyshear.codes.result import UNVERIFIED, CheckResult
from plyshear.mechanics.capacity import Answer, CapacitySummary
from plyshear.mechanics.results import Solution
from plyshear.mechanics.studies import PlanesRow, ScatterResult
from plyshear.model.joint import Joint
from plyshear.report.numbers import fmt, item_row

CAUTION = (
    "Caution: plyshear supports, and never replaces, the judgement of a licensed "
    "engineer and the governing local code. Check every input and result."
)


def table(headers: Sequence[str], rows: Sequence[Sequence[str]], align: str | None = None) -> str:
    """Return a fixed-width table.

    Args:
        headers: Column titles.
        rows: Cells as strings.
        align: One character per column, ``l`` or ``r`` (default: first
            column left, the rest right).

    Returns:
        The table as text, one line per row, with a rule under the header.
    """
    align = align or "l" + "r" * (len(headers) - 1)
    widths = [
        max(len(h), *(len(r[i]) for r in rows)) if rows else len(h) for i, h in enumerate(headers)
    ]

    def line(cells: Sequence[str]) -> str:
        return "  ".join(
            c.ljust(w) if a == "l" else c.rjust(w)
            for c, w, a in zip(cells, widths, align, strict=True)
        ).rstrip()

    out = [line(headers), line(["-" * w for w in widths])]
    out += [line(r) for r in rows]
    return "\n".join(out)


def solution_text(sol: Solution) -> str:
    """Return the terminal report of a linear solution.

    Plane shears (resultant and x/y), ply bearings with each ply's share of its
    member, members, the largest bolt moment and the equilibrium residual.
    """
    joint = sol.joint
    u = _units.system(joint.units)
    lf, ll, lm = u.label("force"), u.label("length"), u.label("moment")
    f, ln, mo = u.factor("force"), u.factor("length"), u.factor("moment")
    out: list[str] = []
    title = joint.title or (joint.source or "joint")
    bolt = joint.bolt
    out.append(f"{title}")
    out.append(
        f"bolt: d = {fmt(bolt.diameter / ln)} {ll}, grade {bolt.grade}, "
        f"ends {bolt.ends}, {len(joint.plies)} plies, "
        f"{len(sol.bolts[0].planes)} planes, units {joint.units}"
    )
    out.append("")
    many = len(sol.bolts) > 1
    for k, b in enumerate(sol.bolts):
        if many:
            out.append(f"bolt {k + 1} at x = {fmt(b.x / ln)} {ll}")
        rows = []
        for p in b.planes:
            rows.append(
                [
                    str(p.index),
                    fmt(p.z / ln),
                    f"{joint.plies[p.above].name} / {joint.plies[p.below].name}",
                    fmt(p.shear / f),
                    fmt(p.shear_xy[0] / f),
                    fmt(p.shear_xy[1] / f),
                    fmt(p.moment / mo),
                    "in" if p.threads else "out",
                ]
            )
        out.append(
            table(
                [
                    "plane",
                    f"z [{ll}]",
                    "between",
                    f"V [{lf}]",
                    f"Vx [{lf}]",
                    f"Vy [{lf}]",
                    f"M [{lm}]",
                    "threads",
                ],
                rows,
                "lrlrrrrl",
            )
        )
        out.append("")
        member_total: dict[str, float] = {}
        for pb in b.plies:
            owner = joint.plies[pb.ply].member
            if owner is not None:
                member_total[owner] = member_total.get(owner, 0.0) + pb.force
        rows = []
        for pb in b.plies:
            ply = joint.plies[pb.ply]
            share = "-"
            if ply.member is not None and member_total[ply.member] > 0:
                share = f"{100 * pb.force / member_total[ply.member]:.1f} %"
            rows.append(
                [
                    ply.name,
                    ply.member or "(filler)",
                    fmt(ply.thickness / ln),
                    fmt(pb.force / f),
                    fmt(pb.force_xy[0] / f),
                    fmt(pb.force_xy[1] / f),
                    share,
                ]
            )
        out.append(
            table(
                [
                    "ply",
                    "member",
                    f"t [{ll}]",
                    f"bearing [{lf}]",
                    f"x [{lf}]",
                    f"y [{lf}]",
                    "share of member",
                ],
                rows,
                "llrrrrr",
            )
        )
        out.append("")
        out.append(
            f"max bolt moment: {fmt(b.max_moment / mo)} {lm} at z = {fmt(b.max_moment_z / ln)} {ll}"
        )
    if many:
        out.append("")
        out.append(row_text(sol))
    rows = []
    for m in sol.members:
        mem = joint.members[m.member]
        if mem.support:
            rows.append(
                [
                    mem.name,
                    "support",
                    fmt(m.reaction_xy[0] / f),
                    fmt(m.reaction_xy[1] / f),
                    "0",
                    "0",
                ]
            )
        else:
            rows.append(
                [
                    mem.name,
                    "loaded" if mem.is_loaded else "free",
                    fmt(mem.load[0] / f),
                    fmt(mem.load[1] / f),
                    fmt(m.displacement_xy[0] / ln, 3),
                    fmt(m.displacement_xy[1] / ln, 3),
                ]
            )
    out.append("")
    out.append(
        table(
            ["member", "role", f"Fx [{lf}]", f"Fy [{lf}]", f"ux [{ll}]", f"uy [{ll}]"],
            rows,
            "llrrrr",
        )
    )
    out.append("")
    out.append(equal_split_line(sol))
    out.append(f"equilibrium residual: {sol.equilibrium_residual:.1e} (relative to the load)")
    fitted = fitted_holes_note(joint)
    if fitted:
        out.append(f"note: {fitted}")
    out += [f"WARNING: {w}" for w in sol.warnings]
    out.append("")
    out.append(CAUTION)
    return "\n".join(out)


def equal_split_line(sol: Solution) -> str:
    """Contrast the worst solved plane with the total load shared equally by the planes.

    The "equal split" is the hand-method assumption: the loaded members' total
    force divided by the number of planes between different members (a filler
    pack between two members counts as one plane, as in the design tables).
    """
    joint = sol.joint
    u = _units.system(joint.units)
    lf, f = u.label("force"), u.factor("force")
    owners = [p.member for p in joint.plies if p.member is not None]
    n_planes = sum(1 for a, b in zip(owners, owners[1:], strict=False) if a != b)
    total = sum(float((m.load[0] ** 2 + m.load[1] ** 2) ** 0.5) for m in joint.members)
    if n_planes == 0 or total == 0:
        return "equal split: not applicable (no load or no plane between members)"
    nb = len(sol.bolts)
    k, worst = max(
        ((k, p) for k, b in enumerate(sol.bolts) for p in b.planes), key=lambda kp: kp[1].shear
    )
    equal = total / (n_planes * nb)
    ratio = worst.shear / equal
    where = f"bolt {k + 1} plane {worst.index}" if nb > 1 else f"plane {worst.index}"
    per = f"{n_planes} planes x {nb} bolts" if nb > 1 else f"{n_planes} planes"
    return (
        f"worst {where}: {fmt(worst.shear / f)} {lf} = {ratio:.2f} x the equal "
        f"split {fmt(total / f)} {lf} / {per} = {fmt(equal / f)} {lf}"
    )


def check_text(result: CheckResult, solution: Solution) -> str:
    """Return the terminal table of a design check, sorted by utilization.

    The governing item is marked ``<< governing``; informative items (outside the
    standard's text) are marked ``(info)`` and do not decide pass or fail.
    """
    u = _units.system(result.units)
    gov = result.governing
    rows = []
    for item in result.sorted_items():
        rows.append(item_row(item, result.units, u, item is gov))
    method = {"lrfd": "LRFD", "asd": "ASD"}.get(result.method, "partial factors")
    title = solution.joint.title or (solution.joint.source or "joint")
    capacity_word = {"lrfd": "design strength", "asd": "allowable strength"}.get(
        result.method, "design resistance"
    )
    declared = (
        "declared in [check] loads"
        if solution.joint.check.loads
        else f"the {'EN 1993-1-8' if result.method not in ('lrfd', 'asd') else method} default; "
        "declare [check] loads to be sure"
    )
    out = [
        title,
        f"check: {result.edition}, {method} (capacity = {capacity_word}); "
        f"loads: {result.loads} ({declared})",
        "",
    ]
    out.append(
        table(
            ["check", "where", "demand", "capacity", "unit", "util.", "clause", ""],
            rows,
            "llrrlrll",
        )
    )
    out.append("")
    if result.unverified:
        out.append(f"{UNVERIFIED} ({result.unverified}); the demands cannot be trusted")
    elif gov is not None:
        verdict = "PASSES" if result.passes else "FAILS"
        out.append(
            f"{verdict}: governing {gov.what} at {gov.place(result.units)}, utilization "
            f"{gov.utilization:.3f} ({gov.clause})"
        )
    out += [f"WARNING: {w}" for w in result.warnings]
    out.append(equal_split_line(solution))
    for note in result.notes:
        out.append(f"note: {note}")
    out += [f"WARNING: {w}" for w in solution.warnings]
    out.append(f"Demands are the model's loads as given, taken as {result.loads} loads.")
    out.append("")
    out.append(CAUTION)
    return "\n".join(out)


def capacity_text(summary: CapacitySummary, joint: Joint, result: CheckResult | None = None) -> str:
    """Return the terminal report of the capacity analysis.

    Args:
        summary: The capacity answers.
        joint: The joint (units, settings).
        result: The check of the same solution, for the verdict line (optional).
    """
    from plyshear.report import capacity_data as cd

    u = _units.system(joint.units)
    f, lf = u.factor("force"), u.label("force")
    k, basis = cd.factor(joint)
    rows = []
    for name, label in cd.ANSWERS:
        a = summary.answers[name]
        what = {"collapse": cd.mechanism_short(summary), "plastic": f"cut: {a.where}"}.get(
            name, f"{a.event}, {cd.where(a, joint)}"
        )
        rows.append(
            [label, fmt(a.load / f), fmt(a.load * k / f), f"{summary.efficiency(a.load):.2f}", what]
        )
    title = joint.title or (joint.source or "joint")
    an = joint.analysis
    out = [
        title,
        f"capacity: bearing law {an.bearing}, bolt {an.bolt}, clearance {an.clearance}; "
        f"nominal strengths; design = nominal x {k:.3g} ({basis})",
        f"{summary.planes} plane{'s' * (summary.planes != 1)} between members; one plane's "
        "rupture strength "
        f"0.62 fub A = {fmt(summary.plane_strength / f)} {lf}",
        "",
    ]
    out.append(
        table(
            ["answer", f"nominal [{lf}]", f"design [{lf}]", "efficiency", "end event / mechanism"],
            rows,
            "lrrrl",
        )
    )
    out.append("")
    out.append(
        "efficiency = load / (planes x one plane's strength): 1.00 means every plane "
        "pulls its full weight"
    )
    out.append(
        "collapse mechanism: "
        + ("; ".join(cd.mechanism_parts(summary, joint)) or "no active constraint")
    )
    out.append("")
    out.append("nonlinear analysis, in order:")
    ev_rows = [
        [fmt(e.load / f), e.event, cd.where(Answer(e.load, e.event, e.where, e.z), joint)]
        for e in summary.analysis.events
    ]
    out.append(table([f"load [{lf}]", "event", "where"], ev_rows, "rll"))
    out.append(
        f"({len(summary.analysis.history)} states, peak load {fmt(summary.analysis.peak / f)} {lf})"
    )
    out.append("")
    s = summary.strengths
    st_rows = [
        [f"ply {p.name}", fmt(float(q) / f), r]
        for p, q, r in zip(joint.plies, s.ply_force, s.bearing_rule, strict=True)
    ]
    st_rows += [
        [
            f"plane {i + 1}",
            fmt(float(v) / f),
            "0.62 fub As (threads)" if t else "0.62 fub Ab (shank)",
        ]
        for i, (v, t) in enumerate(zip(s.plane, s.plane_threaded, strict=True))
    ]
    out.append(table(["strength", f"nominal [{lf}]", "rule"], st_rows, "lrl"))
    out.append(
        f"bolt plastic moment (shank) fyb d^3/6 = "
        f"{fmt(s.shank_moment / u.factor('moment'))} {u.label('moment')}"
    )
    out.append("")
    out.append(cd.verdict(summary, joint, result).text)
    out += [f"note: {n}" for n in cd.notes(summary, joint)]
    out.append("")
    out.append(CAUTION)
    return "\n".join(out)


def planes_text(rows: list[PlanesRow], joint: Joint, keep: str) -> str:
    """Return the planes study: capacities and efficiencies per number of planes, and gains."""
    u = _units.system(joint.units)
    f, lf = u.factor("force"), u.label("force")
    table_rows = []
    for r in rows:
        s = r.summary
        table_rows.append(
            [
                str(r.planes),
                fmt(s.plane_strength * s.planes / f),
                fmt(s.elastic.load / f),
                fmt(s.nonlinear.load / f),
                fmt(s.collapse.load / f),
                fmt(s.plastic.load / f),
                f"{s.efficiency(s.nonlinear.load):.2f}",
                f"{s.efficiency(s.collapse.load):.2f}",
                s.nonlinear.event,
            ]
        )
    what = (
        "each member keeps its total thickness"
        if keep == "total"
        else "each ply keeps its thickness"
    )
    out = [
        joint.title or (joint.source or "joint"),
        f"planes study: the stack rebuilt with 2 to {rows[-1].planes} planes ({what}, "
        "fillers and packs kept); nominal strengths",
    ]
    if any(p.gap > 0 for p in joint.plies):
        out.append("note: the model's gaps between plies are left out of the rebuilt stacks")
    if len(joint.stations) > 1:
        out.append(
            f"planes per bolt; every bolt of the row of {len(joint.stations)} is "
            "rebuilt alike and the loads are the row's"
        )
    out.append("")
    out.append(
        table(
            [
                "planes",
                f"n x plane [{lf}]",
                f"elastic [{lf}]",
                f"nonlinear [{lf}]",
                f"collapse [{lf}]",
                f"shear-only [{lf}]",
                "eff. nl.",
                "eff. coll.",
                "end of the nonlinear analysis",
            ],
            table_rows,
            "rrrrrrrrl",
        )
    )
    out.append("")
    out += plane_gains(rows, joint)
    out += lug_lines(rows)
    out.append("")
    out.append(CAUTION)
    return "\n".join(out)


def lug_lines(rows: list[PlanesRow]) -> list[str]:
    """Say where a pin plate's rupture (not the pin) caps the collapse load."""
    from plyshear.mechanics.capacity import governing_lugs

    out = []
    for r in rows:
        lugs = governing_lugs(r.joint, r.summary.strengths, r.summary.mechanism)
        if lugs and not r.summary.mechanism.mechanism.planes:
            what = ", ".join(f"{rule} of ply {name}" for name, rule in lugs)
            out.append(
                f"{r.planes} planes: the lug governs, not the pin ({what}): added planes "
                "cannot raise the collapse load above the plates' strength"
            )
    return out


def plane_gains(rows: list[PlanesRow], joint: Joint) -> list[str]:
    """One sentence per added plane: what it adds to the nonlinear and collapse loads."""
    u = _units.system(joint.units)
    f, lf = u.factor("force"), u.label("force")
    out = []

    def part(delta: float, base: float, what: str, percent: bool) -> str:
        share = f" ({100.0 * delta / base:+.1f} %)" if percent and base else ""
        if abs(delta) <= 1e-6 * abs(base):
            return f"nothing to the {what}"
        if delta > 0:
            return f"{fmt(delta / f)} {lf}{share} to the {what}"
        return f"minus {fmt(-delta / f)} {lf}{share} to the {what}"

    for a, b in zip(rows, rows[1:], strict=False):
        sa, sb = a.summary, b.summary
        nl = part(
            sb.nonlinear.load - sa.nonlinear.load, sa.nonlinear.load, "nonlinear ultimate", True
        )
        lp = part(sb.collapse.load - sa.collapse.load, sa.collapse.load, "collapse load", False)
        out.append(f"plane {b.planes} adds {nl} and {lp}")
    return out


def scatter_text(result: ScatterResult, joint: Joint) -> str:
    """Return the percentiles of the hole-position Monte Carlo, every sample counted."""
    u = _units.system(joint.units)
    f, lf = u.factor("force"), u.label("force")

    def show(v: float) -> str:
        if np.isfinite(v):
            return fmt(v / f)
        return "fails" if v > 0 else "n/c"  # inf shear: fails below the load; -inf: n/c

    rows = []
    for label, values in (
        ("worst plane shear at the model's load", result.service_shear),
        ("capacity (nonlinear)", result.capacity),
    ):
        rows.append([label, *(show(p) for p in result.percentiles(values)), str(values.size)])
    n = result.service_shear.size
    out = [
        f"hole positions scattered uniformly within the clearance "
        f"({fmt(result.clearance / u.factor('length'))} {u.label('length')} diametral), "
        f"{n} samples; model load {fmt(result.service_load / f)} {lf}",
        "",
        table(
            ["quantity", f"5 % [{lf}]", f"50 % [{lf}]", f"95 % [{lf}]", "samples"], rows, "lrrrr"
        ),
    ]
    if result.below_load:
        out.append(
            f"{result.below_load} of {n} samples fail below the model's load: counted "
            "as the worst shear ('fails')"
        )
    if result.failed:
        out.append(
            f"{result.failed} of {n} samples did not converge: counted as the worst "
            "shear and the worst capacity ('n/c')"
        )
    return "\n".join(out)


def row_text(sol: Solution) -> str:
    """The load share along a bolt row: each bolt's transferred force and worst plane."""
    from plyshear.codes.common import bolt_loads

    joint = sol.joint
    u = _units.system(joint.units)
    f, lf, ln, ll = u.factor("force"), u.label("force"), u.factor("length"), u.label("length")
    loads = bolt_loads(sol)
    mean = float(loads.mean()) if loads.size else 0.0
    rows = [
        [
            str(k + 1),
            fmt(b.x / ln),
            fmt(loads[k] / f),
            f"{loads[k] / mean:.3f}" if mean > 0 else "-",
            fmt(max(p.shear for p in b.planes) / f),
        ]
        for k, b in enumerate(sol.bolts)
    ]
    out = "load share along the row\n" + table(
        ["bolt", f"x [{ll}]", f"load [{lf}]", "/ mean", f"worst plane [{lf}]"], rows
    )
    # net sections: the largest ply force between bolts over (w - d0) t
    from plyshear.mechanics.capacity import hole_clearance

    d0 = joint.bolt.diameter + hole_clearance(joint)
    net = []
    for j, ply in enumerate(joint.plies):
        forces = np.hypot(sol.segment_forces[:, j, 0], sol.segment_forces[:, j, 1])
        if ply.width is None or forces.size == 0:
            continue
        area = (ply.width - d0) * ply.thickness
        net.append(
            [
                ply.name,
                fmt(forces.max() / f),
                fmt(area / ln**2),
                fmt(forces.max() / area / u.factor("stress")),
            ]
        )
    if net:
        out += f"\n\nply net sections between bolts (hole {fmt(d0 / ln)} {ll})\n" + table(
            ["ply", f"max force [{lf}]", f"net area [{ll}^2]", f"stress [{u.label('stress')}]"], net
        )
    return out
