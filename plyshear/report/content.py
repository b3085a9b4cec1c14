"""What the calculation report says, as data: sections of tables, paragraphs and figures.

The HTML (:mod:`plyshear.report.document`) and the typeset PDF
(:mod:`plyshear.report.typeset`) render the same sections in the same order,
so the two never disagree. Quantities are in the report's units
(:mod:`plyshear.report.quantities`).
"""

from __future__ import annotations

from collections.abc import Callable, Sequence
from dataclasses import dataclass, field

from matplotlib.figure import Figure

from plyshear.codes.check import UNVERIFIED, CheckResult, load_level
from plyshear.mechanics.capacity import CapacitySummary
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint
from plyshear.report.handcalc import LastPlane, hand_rows
from plyshear.report.numbers import fmt, item_values
from plyshear.report.quantities import Display, display

#: The caution printed on every report (the terminal's is shorter).
CAUTION_LONG = (
    "This calculation was prepared with plyshear. Its results support, and never replace, "
    "the judgement of a licensed professional engineer (the engineer of record) and the "
    "requirements of the governing local code and its national annex. Every input and "
    "result must be checked before use."
)


@dataclass(frozen=True)
class Table:
    """A table: headers, rows of text cells, one alignment letter per column.

    Attributes:
        headers: Column titles.
        rows: Cells, already formatted.
        align: ``l`` or ``r`` per column (numbers right).
        caption: A short heading above the table, or "".
        marked: The row to emphasise (the governing item), or None.
    """

    headers: list[str]
    rows: list[list[str]]
    align: str
    caption: str = ""
    marked: int | None = None


@dataclass(frozen=True)
class Para:
    """A paragraph; ``strong`` starts it with a bold word (e.g. "Warning")."""

    text: str
    strong: str = ""


@dataclass(frozen=True)
class Items:
    """A bulleted list."""

    items: list[str]


@dataclass(frozen=True)
class Graphic:
    """A figure, drawn when rendered (``draw`` returns a matplotlib Figure).

    Attributes:
        name: A short id, unique in the report (prefixes the SVG's ids).
        draw: Makes the figure.
        caption: What it shows and how to read it.
        landscape: Wide figure (the PDF gives it a page of its own).
    """

    name: str
    draw: Callable[[], Figure]
    caption: str
    landscape: bool = False


Block = Table | Para | Items | Graphic


@dataclass(frozen=True)
class Section:
    """A numbered section of the report."""

    heading: str
    blocks: Sequence[Block] = field(default_factory=list)


@dataclass(frozen=True)
class ReportData:
    """Everything a report shows, computed once.

    Attributes:
        joint: The joint.
        solution: Its linear solution.
        check: Its design check.
        capacity: Its capacity answers, or None where they could not be found.
        capacity_note: Why the capacity is missing, or "".
        created: The report's date (ISO).
        last_plane: What the last plane adds to the nonlinear ultimate, or None.
    """

    joint: Joint
    solution: Solution
    check: CheckResult
    capacity: CapacitySummary | None
    capacity_note: str
    created: str
    last_plane: LastPlane | None = None

    @property
    def units(self) -> Display:
        """The report's units."""
        return display(self.joint.units)


#: The load cases of a joint. Today a model has one: the member loads as given.
#: A list so that the load cases and combinations of a later format slot in here.
MODEL_CASE = "model"


def load_cases(joint: Joint) -> list[tuple[str, list[tuple[float, float]]]]:
    """The load cases as (name, load of every member in N), in the model's order."""
    return [(MODEL_CASE, [m.load for m in joint.members])]


def load_rows(data: ReportData) -> Table:
    """Every member with its role, its applied load per case and its reaction."""
    joint, sol, u = data.joint, data.solution, data.units
    f, lf = u.factor("force"), u.label("force")
    rows = []
    for case, loads in load_cases(joint):
        for m, load, res in zip(joint.members, loads, sol.members, strict=True):
            role = "support" if m.support else ("loaded" if m.is_loaded else "free")
            applied = (
                ["-", "-", "-"]
                if m.support
                else [
                    fmt(load[0] / f),
                    fmt(load[1] / f),
                    fmt(float((load[0] ** 2 + load[1] ** 2) ** 0.5) / f),
                ]
            )
            reaction = (
                [fmt(res.reaction_xy[0] / f), fmt(res.reaction_xy[1] / f)]
                if m.support
                else ["-", "-"]
            )
            plies = ", ".join(p.name for p in joint.plies if p.member == m.name)
            rows.append([m.name, role, case, *applied, *reaction, plies])
    return Table(
        [
            "member",
            "role",
            "case",
            f"Fx [{lf}]",
            f"Fy [{lf}]",
            f"|F| [{lf}]",
            f"Rx [{lf}]",
            f"Ry [{lf}]",
            "plies",
        ],
        rows,
        "lllrrrrrl",
        "members, applied loads and reactions",
    )


def loads_text(data: ReportData) -> list[str]:
    """The load level, the units, the sign rule and the equal-split line."""
    joint, res = data.joint, data.check
    level = load_level(joint, res.standard, res.method)
    declared = (
        "declared in [check] loads"
        if joint.check.loads
        else "the method's default; declare [check] loads to be sure"
    )
    fx = data.units.label("force")
    return [
        f"Load level: {level} ({declared}). Units: forces in {fx}, lengths in "
        f"{data.units.label('length')}, moments in {data.units.label('moment')}, stresses in "
        f"{data.units.label('stress')} (model file in {joint.units}).",
        "Applied loads are the forces on the loaded members; a reaction is the force the "
        "support applies to its member, so loads and reactions sum to zero.",
        equal_split(data),
    ]


def equal_split(data: ReportData) -> str:
    """The hand-method contrast line (total / planes against the worst plane), report units."""
    from plyshear.report.handcalc import equal_split as _equal
    from plyshear.report.handcalc import member_planes, total_load

    sol, u = data.solution, data.units
    f, lf = u.factor("force"), u.label("force")
    equal = _equal(data.joint)
    if equal is None:
        return "Equal split: not applicable (no load or no plane between members)."
    nb = len(sol.bolts)
    k, worst = max(
        ((k, p) for k, b in enumerate(sol.bolts) for p in b.planes), key=lambda kp: kp[1].shear
    )
    where = f"bolt {k + 1} plane {worst.index}" if nb > 1 else f"plane {worst.index}"
    per = f"{member_planes(data.joint)} planes" + (f" x {nb} bolts" if nb > 1 else "")
    return (
        f"Worst {where}: {fmt(worst.shear / f)} {lf} = {worst.shear / equal:.2f} x the "
        f"equal split {fmt(total_load(data.joint) / f)} {lf} / {per} = "
        f"{fmt(equal / f)} {lf}."
    )


def model_rows(data: ReportData) -> list[Table]:
    """The model echo: bolt, stack, planes."""
    joint, sol, u = data.joint, data.solution, data.units
    ln, st, f = u.factor("length"), u.factor("stress"), u.factor("force")
    ll, ls, lf = u.label("length"), u.label("stress"), u.label("force")
    b = joint.bolt
    bolt_rows = [
        ["diameter", f"{fmt(b.diameter / ln)} {ll}"],
        ["grade", b.grade],
        ["fyb / fub", f"{fmt(b.fyb / st)} / {fmt(b.fub / st)} {ls}"],
        ["stress area", f"{fmt(b.stress_area / u.factor('area'))} {u.label('area')}"],
        [
            "length / thread length",
            "unknown"
            if b.length is None
            else f"{fmt(b.length / ln)} / {fmt((b.thread_length or 0) / ln)} {ll}",
        ],
        ["threads", b.threads + (" (assumed in every plane)" if b.threads_assumed else "")],
        ["ends", b.ends],
        ["hole", b.hole],
        ["pretension / tension", f"{fmt(b.pretension / f)} / {fmt(b.tension / f)} {lf}"],
    ]
    starts = joint.ply_starts()
    stack = []
    for j, p in enumerate(joint.plies):
        stack.append(
            [
                str(j + 1),
                p.name,
                p.member or "(filler)",
                fmt(p.thickness / ln),
                fmt(p.gap / ln),
                p.steel or "-",
                f"{fmt(p.fy / st)} / {fmt(p.fu / st)}",
                "-" if p.edge is None else fmt(p.edge / ln),
                fmt(starts[j] / ln),
                "rigid"
                if p.link_stiffness is None
                else f"{fmt(p.link_stiffness / u.factor('stiffness'))} {u.label('stiffness')}",
            ]
        )
    planes = [
        [
            str(p.index),
            fmt(p.z / ln),
            f"{joint.plies[p.above].name} / {joint.plies[p.below].name}",
            "included" if p.threads else "excluded",
        ]
        for p in sol.first_bolt_planes
    ]
    return [
        Table(["property", "value"], bolt_rows, "ll", "bolt"),
        Table(
            [
                "#",
                "ply",
                "member",
                f"t [{ll}]",
                f"gap [{ll}]",
                "steel",
                f"fy / fu [{ls}]",
                f"edge [{ll}]",
                f"z [{ll}]",
                "link",
            ],
            stack,
            "rlllrrlrrr",
            "stack",
        ),
        Table(["plane", f"z [{ll}]", "between", "threads"], planes, "rrll", "planes"),
    ]


def plane_utilization(res: CheckResult) -> dict[int, float]:
    """The bolt-shear utilization of the first bolt's planes (the figures draw that bolt)."""
    return {plane: u for (bolt, plane), u in res.plane_utilization().items() if bolt == 0}


def result_rows(data: ReportData) -> list[Table]:
    """Plane shears (with utilization) and ply bearings, every bolt of a row."""
    joint, sol, u = data.joint, data.solution, data.units
    f, mo = u.factor("force"), u.factor("moment")
    lf, lm = u.label("force"), u.label("moment")
    util = data.check.plane_utilization()
    row = len(sol.bolts) > 1
    first = ["bolt"] if row else []
    planes = [
        [
            *([str(k + 1)] if row else []),
            str(p.index),
            fmt(p.shear / f),
            fmt(p.shear_xy[0] / f),
            fmt(p.shear_xy[1] / f),
            fmt(p.moment / mo),
            f"{util[(k, p.index)]:.3f}" if (k, p.index) in util else "-",
        ]
        for k, b in enumerate(sol.bolts)
        for p in b.planes
    ]
    plies = [
        [
            *([str(k + 1)] if row else []),
            joint.plies[pb.ply].name,
            joint.plies[pb.ply].member or "(filler)",
            fmt(pb.force / f),
            fmt(pb.force_xy[0] / f),
            fmt(pb.force_xy[1] / f),
        ]
        for k, b in enumerate(sol.bolts)
        for pb in b.plies
    ]
    lead = "r" * len(first)
    return [
        Table(
            [*first, "plane", f"V [{lf}]", f"Vx [{lf}]", f"Vy [{lf}]", f"M [{lm}]", "utilization"],
            planes,
            lead + "rrrrrr",
            "plane shears",
        ),
        Table(
            [*first, "ply", "member", f"bearing [{lf}]", f"x [{lf}]", f"y [{lf}]"],
            plies,
            lead + "llrrr",
            "ply bearings (force the bolt applies to the ply)",
        ),
    ]


def check_rows(data: ReportData) -> Table:
    """The check table, sorted by utilization, the governing row marked."""
    res, u = data.check, data.units
    gov = res.governing
    rows, marked = [], None
    for i, item in enumerate(res.sorted_items()):
        demand, capacity, unit = item_values(item, u)
        if item is gov:
            marked = i
        flag = "governing" if item is gov else ("informative" if item.informative else "")
        rows.append(
            [
                item.what,
                item.place(res.units),
                demand,
                capacity,
                unit,
                f"{item.utilization:.3f}",
                item.clause,
                flag,
                item.note,
            ]
        )
    return Table(
        ["check", "where", "demand", "capacity", "unit", "utilization", "clause", "", "note"],
        rows,
        "llrrlrlll",
        "",
        marked,
    )


def check_verdict(data: ReportData) -> list[Para]:
    """The verdict and the check's warnings."""
    res = data.check
    gov = res.governing
    out = []
    if res.unverified:
        out.append(Para(f"({res.unverified}): the demands cannot be trusted.", UNVERIFIED))
    elif gov is not None:
        verdict = "passes" if res.passes else "FAILS"
        out.append(
            Para(
                f"The joint {verdict}: governing {gov.what} at "
                f"{gov.place(res.units)}, utilization {gov.utilization:.3f} "
                f"({gov.clause})."
            )
        )
    out += [Para(w, "Warning:") for w in res.warnings]
    return out


def assumptions(data: ReportData) -> list[str]:
    """The modelling assumptions, stated."""
    from plyshear import __version__

    joint, sol = data.joint, data.solution
    a = joint.analysis
    links = [p.name for p in joint.plies if p.link_stiffness is not None]
    out = [
        f"bearing law: {a.bearing} (linear solve: EN 1993-1-8 Table 6.11 plate-bearing "
        "stiffness spread over each ply, unless a ply gives foundation_modulus)",
        f"bolt beam: {a.beam}; ends {joint.bolt.ends}; section from the thread geometry",
        f"plies tied to their member rigidly, except through elastic links: "
        f"{', '.join(links) if links else 'none'}",
        f"mesh: {a.elements_per_ply} elements per ply and gap (none shorter than d/40)",
        f"hole clearance in the capacity analysis: {a.clearance}",
        f"equilibrium residual of the solve: {sol.equilibrium_residual:.1e} of the load",
        f"demands are the model's loads as given, taken as {data.check.loads} loads "
        "([check] loads; default factored for LRFD and EN 1993-1-8, service for ASD)",
        "the capacity uses nominal strengths without resistance factors",
    ]
    out += [f"warning: {w}" for w in sol.warnings]
    out += [f"note: {n}" for n in data.check.notes]
    if data.capacity_note:
        out.append(data.capacity_note)
    out.append(f"plyshear {__version__}, report of {data.created}, model {joint.source}")
    return out


def method_name(res: CheckResult) -> str:
    """LRFD, ASD or partial factors."""
    return {"lrfd": "LRFD", "asd": "ASD"}.get(res.method, "partial factors")


def sections(data: ReportData) -> list[Section]:
    """The report, section by section, in the order it is read."""
    from plyshear.report import diagrams

    res = data.check
    length = data.units.label("length")
    out = [
        Section("Model", model_rows(data)),
        Section(
            "Loads, supports and reactions", [load_rows(data), *[Para(t) for t in loads_text(data)]]
        ),
        Section(
            "Stack, shear, moment and bearing pressure along the bolt",
            [
                Graphic(
                    "stack",
                    lambda: diagrams.solution_figure(
                        data.solution, plane_utilization(res), pressure=True
                    ),
                    f"Elevation of the stack (dimensions in {length}) beside the bolt's shear "
                    "(plane shears with their utilization), bending moment and bearing "
                    "pressure.",
                    landscape=True,
                )
            ],
        ),
        Section("Results", result_rows(data)),
        Section(
            "Hand methods beside the model",
            [
                hand_table(data),
                Para(
                    "Ratio = model / hand method: above 1 the hand method understates the demand."
                ),
            ],
        ),
        Section(
            f"Design check: {res.edition}, {method_name(res)}; loads: {res.loads}",
            [check_rows(data), *check_verdict(data)],
        ),
        Section("Capacity and plane efficiency", capacity_blocks(data)),
        Section("Assumptions", [Items(assumptions(data))]),
    ]
    return out


def capacity_blocks(data: ReportData) -> list[Block]:
    """The capacity answers, events and strengths as tables, the verdict, and the figure.

    The numbers come from :mod:`plyshear.report.capacity_data`, as the terminal's
    ``capacity_text`` and the JSON have them.
    """
    from plyshear.mechanics.capacity import Answer
    from plyshear.report import capacity_data as cd
    from plyshear.report import diagrams

    if data.capacity is None:
        return [Para(data.capacity_note)]
    cap, joint, u = data.capacity, data.joint, data.units
    f, lf = u.factor("force"), u.label("force")
    k, basis = cd.factor(joint)
    a = joint.analysis
    answer = (
        [Para(last_plane_line(data), "Does the last plane pay?")]
        if data.last_plane is not None
        else []
    )
    rows = []
    for name, label in cd.ANSWERS:
        ans = cap.answers[name]
        what = {"collapse": cd.mechanism_short(cap), "plastic": f"cut: {ans.where}"}.get(
            name, f"{ans.event}, {cd.where(ans, joint)}"
        )
        rows.append(
            [
                label,
                fmt(ans.load / f),
                fmt(ans.load * k / f),
                f"{cap.efficiency(ans.load):.2f}",
                what,
            ]
        )
    events = [
        [fmt(e.load / f), e.event, cd.where(Answer(e.load, e.event, e.where, e.z), joint)]
        for e in cap.analysis.events
    ]
    s = cap.strengths
    strengths = [
        [f"ply {p.name}", fmt(float(q) / f), r]
        for p, q, r in zip(joint.plies, s.ply_force, s.bearing_rule, strict=True)
    ]
    strengths += [
        [
            f"plane {i + 1}",
            fmt(float(v) / f),
            "0.62 fub As (threads)" if t else "0.62 fub Ab (shank)",
        ]
        for i, (v, t) in enumerate(zip(s.plane, s.plane_threaded, strict=True))
    ]
    strengths.append(
        [
            "bolt plastic moment (shank) fyb d³/6",
            f"{fmt(s.shank_moment / u.factor('moment'))} {u.label('moment')}",
            "",
        ]
    )
    return [
        *answer,
        Para(
            f"Bearing law {a.bearing}, bolt {a.bolt}, clearance {a.clearance}; nominal "
            f"strengths; design = nominal × {k:.3g} ({basis}). {cap.planes} planes between "
            f"members; one plane's rupture strength 0.62 fub A = "
            f"{fmt(cap.plane_strength / f)} {lf}."
        ),
        Table(
            ["answer", f"nominal [{lf}]", f"design [{lf}]", "efficiency", "end event / mechanism"],
            rows,
            "lrrrl",
            "capacity answers",
        ),
        Para(
            "Efficiency = load / (planes × one plane's strength): 1.00 means every plane "
            "pulls its full weight. Collapse mechanism: "
            + ("; ".join(cd.mechanism_parts(cap, joint)) or "no active constraint")
            + "."
        ),
        Table(
            [f"load [{lf}]", "event", "where"],
            events,
            "rll",
            f"nonlinear analysis, in order ({len(cap.analysis.history)} states, peak load "
            f"{fmt(cap.analysis.peak / f)} {lf})",
        ),
        Table(["strength", f"nominal [{lf}]", "rule"], strengths, "lrl", "nominal strengths"),
        Para(cd.verdict(cap, joint, data.check).text),
        *[Para(n, "Note:") for n in cd.notes(cap, joint)],
        Graphic(
            "capacity",
            lambda: diagrams.capacity_figure(cap, joint),
            "Load against slip and the plane shears against load.",
        ),
    ]


def hand_table(data: ReportData) -> Table:
    """The hand methods against the model's worst plane and largest moment."""
    u = data.units
    rows = []
    for r in hand_rows(data.solution):
        k, unit = u.factor(r.dimension), u.label(r.dimension)
        rows.append(
            [
                r.method,
                "-" if r.hand is None else fmt(r.hand / k),
                fmt(r.model / k),
                unit,
                "-" if r.ratio is None else f"{r.ratio:.2f}",
                r.note,
            ]
        )
    return Table(
        ["hand method", "hand", "model", "unit", "ratio", "how"],
        rows,
        "lrrlrl",
        "worst plane shear and largest bolt moment",
    )


def last_plane_line(data: ReportData) -> str:
    """The one-line answer: whether the joint's last plane pays, in force and per cent."""
    lp, u = data.last_plane, data.units
    assert lp is not None
    f, lf = u.factor("force"), u.label("force")
    if lp.gain is None or lp.one_fewer is None:
        return f"not answered: {lp.why_not}."
    pct = 100.0 * lp.gain / lp.one_fewer
    share = 100.0 * lp.gain / lp.plane_strength
    word = "pays" if lp.pays else "does NOT pay"
    return (
        f"plane {lp.planes} {word}: it adds {fmt(lp.gain / f)} {lf} ({pct:+.1f} %) to the "
        f"nonlinear ultimate, {fmt(lp.with_all / f)} {lf} with {lp.planes} planes against "
        f"{fmt(lp.one_fewer / f)} {lf} with the stack rebuilt with {lp.planes - 1} (each "
        f"member keeping its total thickness): {share:.0f} % of one plane's rupture "
        f"strength, {fmt(lp.plane_strength / f)} {lf}."
    )
