"""The calculation report: a self-contained HTML file (inline SVG) or a PDF.

Order of contents: title, project, the standing caution; the model echo (bolt,
stack, planes); the elevation of the stack beside the shear, moment and
bearing-pressure diagrams; the results per plane and per ply; the design
check with clauses and the governing item; the capacity and plane efficiency;
the assumptions and the version of plyshear.
"""

from __future__ import annotations

import datetime as _dt
import html
import io
import os
import re
from dataclasses import dataclass

from matplotlib.backends.backend_pdf import PdfPages
from matplotlib.figure import Figure

from plyshear import __version__
from plyshear import units as _units
from plyshear.codes.check import check
from plyshear.codes.resistance import nominal_bearing
from plyshear.codes.result import UNVERIFIED, CheckResult
from plyshear.errors import CapacityError
from plyshear.mechanics.capacity import CapacitySummary, summarize
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint
from plyshear.report import diagrams
from plyshear.report.text import CAUTION, capacity_text, check_text, fmt, table

CAUTION_LONG = (
    "This calculation was prepared with plyshear. Its results support, and never replace, "
    "the judgement of a licensed professional engineer (the engineer of record) and the "
    "requirements of the governing local code and its national annex. Every input and "
    "result must be checked before use."
)


@dataclass(frozen=True)
class ReportData:
    """Everything a report shows, computed once."""

    joint: Joint
    solution: Solution
    check: CheckResult
    capacity: CapacitySummary | None
    capacity_note: str
    created: str


def build(sol: Solution) -> ReportData:
    """Check a solved joint and (where it converges) find its capacity, on this one solve."""
    joint = sol.joint
    res = check(sol)
    try:
        cap: CapacitySummary | None = summarize(sol, nominal_bearing(joint))
        note = ""
    except (CapacityError, ValueError) as exc:
        cap, note = None, f"capacity not available: {exc}"
    created = _created()
    return ReportData(joint, sol, res, cap, note, created)


def _created() -> str:
    """Today's date, or the date of ``SOURCE_DATE_EPOCH`` (reproducible builds) if set."""
    epoch = os.environ.get("SOURCE_DATE_EPOCH", "").strip()
    if epoch.isdigit():
        return _dt.datetime.fromtimestamp(int(epoch), tz=_dt.UTC).date().isoformat()
    return _dt.date.today().isoformat()


def _first_bolt_utilization(res: CheckResult) -> dict[int, float]:
    """The bolt-shear utilization of the first bolt's planes (the figures draw that bolt)."""
    return {plane: u for (bolt, plane), u in res.plane_utilization().items() if bolt == 0}


def _esc(text: object) -> str:
    return html.escape(str(text))


def _html_table(headers: list[str], rows: list[list[str]], marked: int | None = None) -> str:
    head = "".join(f"<th>{_esc(h)}</th>" for h in headers)
    body = []
    for i, r in enumerate(rows):
        cls = ' class="governing"' if i == marked else ""
        body.append(f"<tr{cls}>" + "".join(f"<td>{_esc(c)}</td>" for c in r) + "</tr>")
    return f"<table><thead><tr>{head}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def _svg(fig: Figure, name: str) -> str:
    """The figure as an inline ``<svg>`` element (no XML prolog, no RDF metadata).

    Its ids are hashed with ``name`` (one per figure of the report): the same
    input gives the same bytes, and two figures never share an id.
    """
    text = diagrams.figure_bytes(fig, "svg", salt=f"plyshear-{name}").decode("utf-8")
    text = re.sub(r"<metadata>.*?</metadata>", "", text[text.find("<svg"):], flags=re.S)
    # every id and reference prefixed: matplotlib names glyphs and groups alike in
    # every figure ("DejaVuSans-48", "figure_1"), and a page may hold one id once
    text = re.sub(r'\bid="([^"]+)"', rf'id="{name}-\1"', text)
    text = re.sub(r'(href="#|url\(#)([^")]+)', rf"\g<1>{name}-\2", text)
    return text


def model_rows(data: ReportData) -> dict[str, tuple[list[str], list[list[str]]]]:
    """The model echo as (headers, rows) tables, in the joint's units."""
    joint, sol = data.joint, data.solution
    u = _units.system(joint.units)
    ln, st = u.factor("length"), u.factor("stress")
    ll, ls = u.label("length"), u.label("stress")
    b = joint.bolt
    bolt_rows = [
        ["diameter", f"{fmt(b.diameter / ln)} {ll}"], ["grade", b.grade],
        ["fyb / fub", f"{fmt(b.fyb / st)} / {fmt(b.fub / st)} {ls}"],
        ["stress area", f"{fmt(b.stress_area / ln**2)} {ll}^2"],
        ["length / thread length",
         "unknown" if b.length is None else
         f"{fmt(b.length / ln)} / {fmt((b.thread_length or 0) / ln)} {ll}"],
        ["threads", b.threads + (" (assumed in every plane)" if b.threads_assumed else "")],
        ["ends", b.ends], ["hole", b.hole],
        ["pretension / tension", f"{fmt(b.pretension / u.factor('force'))} / "
                                 f"{fmt(b.tension / u.factor('force'))} {u.label('force')}"],
    ]
    starts = joint.ply_starts()
    stack = []
    for j, p in enumerate(joint.plies):
        stack.append([str(j + 1), p.name, p.member or "(filler)", fmt(p.thickness / ln),
                      fmt(p.gap / ln), p.steel or "-", f"{fmt(p.fy / st)} / {fmt(p.fu / st)}",
                      "-" if p.edge is None else fmt(p.edge / ln), fmt(starts[j] / ln),
                      "rigid" if p.link_stiffness is None else
                      f"{fmt(p.link_stiffness / u.factor('stiffness'))} "
                      f"{u.label('stiffness')}"])
    planes = [[str(p.index), fmt(p.z / ln), f"{joint.plies[p.above].name} / "
               f"{joint.plies[p.below].name}", "included" if p.threads else "excluded"]
              for p in sol.bolts[0].planes]  # every bolt of a row has the same planes
    return {
        "bolt": (["property", "value"], bolt_rows),
        "stack": (["#", "ply", "member", f"t [{ll}]", f"gap [{ll}]", "steel",
                   f"fy / fu [{ls}]", f"edge [{ll}]", f"z [{ll}]", "link"], stack),
        "planes": (["plane", f"z [{ll}]", "between", "threads"], planes),
    }


def result_rows(data: ReportData) -> dict[str, tuple[list[str], list[list[str]]]]:
    """Plane shears (with utilization) and ply bearings, in the joint's units."""
    joint, sol = data.joint, data.solution
    u = _units.system(joint.units)
    f, mo = u.factor("force"), u.factor("moment")
    lf, lm = u.label("force"), u.label("moment")
    util = data.check.plane_utilization()
    row = len(sol.bolts) > 1
    first = ["bolt"] if row else []
    planes = [[*([str(k + 1)] if row else []), str(p.index), fmt(p.shear / f),
               fmt(p.shear_xy[0] / f), fmt(p.shear_xy[1] / f), fmt(p.moment / mo),
               f"{util[(k, p.index)]:.3f}" if (k, p.index) in util else "-"]
              for k, b in enumerate(sol.bolts) for p in b.planes]
    plies = [[*([str(k + 1)] if row else []), joint.plies[pb.ply].name,
              joint.plies[pb.ply].member or "(filler)",
              fmt(pb.force / f), fmt(pb.force_xy[0] / f), fmt(pb.force_xy[1] / f)]
             for k, b in enumerate(sol.bolts) for pb in b.plies]
    return {
        "planes": ([*first, "plane", f"V [{lf}]", f"Vx [{lf}]", f"Vy [{lf}]", f"M [{lm}]",
                    "utilization"], planes),
        "plies": ([*first, "ply", "member", f"bearing [{lf}]", f"x [{lf}]", f"y [{lf}]"],
                  plies),
    }


def check_rows(data: ReportData) -> tuple[list[str], list[list[str]], int | None]:
    """The check table, sorted by utilization; the index of the governing row."""
    res = data.check
    u = _units.system(res.units)
    gov = res.governing
    rows, marked = [], None
    for i, item in enumerate(res.sorted_items()):
        if item.dimension == "ratio":
            demand, capacity, unit = fmt(item.demand, 3), fmt(item.capacity, 3), ""
        else:
            k = u.factor(item.dimension)
            demand, capacity, unit = (fmt(item.demand / k), fmt(item.capacity / k),
                                      u.label(item.dimension))
        if item is gov:
            marked = i
        flag = "governing" if item is gov else ("informative" if item.informative else "")
        rows.append([item.what, item.place(res.units), demand, capacity, unit,
                     f"{item.utilization:.3f}", item.clause, flag, item.note])
    return (["check", "where", "demand", "capacity", "unit", "utilization", "clause", "",
             "note"], rows, marked)


def assumptions(data: ReportData) -> list[str]:
    """The modelling assumptions, stated."""
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
        "the capacity answers are nominal; their design values are the nominal times the "
        "standard's factor (phi, 1/Omega or 1/gamma_M2), shown beside them",
    ]
    out += [f"warning: {w}" for w in sol.warnings]
    out += [f"note: {n}" for n in data.check.notes]
    if data.capacity_note:
        out.append(data.capacity_note)
    out.append(f"plyshear {__version__}, report of {data.created}, model {joint.source}")
    return out


CSS = """
body { font-family: sans-serif; max-width: 60em; margin: 2em auto; color: #111; }
h1 { font-size: 1.5em; } h2 { font-size: 1.15em; border-bottom: 1px solid #999; }
table { border-collapse: collapse; margin: 0.5em 0 1em; font-size: 0.9em; }
th, td { border: 1px solid #999; padding: 0.15em 0.5em; text-align: right; }
th { background: #e8e8e8; } td:first-child, th:first-child { text-align: left; }
tr.governing td { font-weight: bold; background: #d9d9d9; }
.caution { border: 2px solid #111; padding: 0.5em 1em; margin: 1em 0; }
svg { max-width: 100%; height: auto; }
"""


def to_html(data: ReportData) -> str:
    """Return the report as one self-contained HTML document."""
    joint = data.joint
    title = joint.title or str(joint.source)
    parts = ["<!DOCTYPE html>", '<html lang="en"><head><meta charset="utf-8">',
             f"<title>{_esc(title)}</title><style>{CSS}</style></head><body>",
             f"<h1>{_esc(title)}</h1>"]
    if joint.project:
        parts.append(f"<p class=\"project\">{_esc(joint.project)}</p>")
    parts.append(f'<p class="caution"><strong>Caution.</strong> {_esc(CAUTION_LONG)}</p>')
    parts.append("<h2>1 Model</h2>")
    for name, (headers, rows) in model_rows(data).items():
        parts.append(f"<h3>{_esc(name)}</h3>" + _html_table(headers, rows))
    parts.append("<h2>2 Stack, shear, moment and bearing pressure along the bolt</h2>")
    util = _first_bolt_utilization(data.check)
    fig = diagrams.solution_figure(data.solution, util, pressure=True)
    parts.append(f"<figure>{_svg(fig, 'stack')}<figcaption>Elevation of the stack (dimensions in "
                 f"{_esc(_units.system(joint.units).label('length'))}) beside the bolt's "
                 "shear (plane shears with their utilization), bending moment and bearing "
                 "pressure.</figcaption></figure>")
    parts.append("<h2>3 Results</h2>")
    for name, (headers, rows) in result_rows(data).items():
        parts.append(f"<h3>{_esc(name)}</h3>" + _html_table(headers, rows))
    res = data.check
    parts.append(f"<h2>4 Design check: {_esc(res.edition)}, "
                 f"{_esc({'lrfd': 'LRFD', 'asd': 'ASD'}.get(res.method, 'partial factors'))}"
                 f"; loads: {_esc(res.loads)}</h2>")
    headers, rows, marked = check_rows(data)
    parts.append(_html_table(headers, rows, marked))
    gov = res.governing
    if res.unverified:
        parts.append(f"<p><strong>{_esc(UNVERIFIED)}</strong> ({_esc(res.unverified)}): the "
                     "demands cannot be trusted.</p>")
    elif gov is not None:
        verdict = "passes" if res.passes else "FAILS"
        parts.append(f"<p>The joint {verdict}: governing {_esc(gov.what)} at "
                     f"{_esc(gov.place(res.units))}, utilization {gov.utilization:.3f} "
                     f"({_esc(gov.clause)}).</p>")
    parts += [f"<p><strong>Warning:</strong> {_esc(w)}</p>" for w in res.warnings]
    parts.append("<h2>5 Capacity and plane efficiency</h2>")
    if data.capacity is not None:
        parts.append(f"<pre>{_esc(capacity_text(data.capacity, joint, data.check))}</pre>")
        fig = diagrams.capacity_figure(data.capacity, joint)
        parts.append(f"<figure>{_svg(fig, 'capacity')}</figure>")
    else:
        parts.append(f"<p>{_esc(data.capacity_note)}</p>")
    parts.append("<h2>6 Assumptions</h2><ul>")
    parts += [f"<li>{_esc(a)}</li>" for a in assumptions(data)]
    parts.append("</ul>")
    parts.append(f'<p class="caution">{_esc(CAUTION)}</p></body></html>')
    return "\n".join(parts)


def _text_page(pdf: PdfPages, heading: str, lines: list[str]) -> None:
    fig = Figure(figsize=(8.27, 11.69))
    fig.text(0.06, 0.96, heading, fontsize=12, fontweight="bold", va="top")
    fig.text(0.06, 0.93, "\n".join(lines), fontsize=6.2, family="monospace", va="top")
    pdf.savefig(fig)


def to_pdf(data: ReportData) -> bytes:
    """Return the report as a PDF of four pages: model, diagrams, check, capacity."""
    joint = data.joint
    buf = io.BytesIO()
    title = joint.title or str(joint.source)
    with PdfPages(buf, metadata={"Title": title, "Creator": f"plyshear {__version__}"}) as pdf:
        lines = [joint.project, "", *_wrap(CAUTION_LONG), ""]
        for name, (headers, rows) in model_rows(data).items():
            lines += [name.upper(), table(headers, rows), ""]
        for name, (headers, rows) in result_rows(data).items():
            lines += [f"RESULTS: {name.upper()}", table(headers, rows), ""]
        _text_page(pdf, title, lines)
        fig = diagrams.solution_figure(data.solution, _first_bolt_utilization(data.check),
                                       pressure=True)
        fig.set_size_inches(11.69, 8.27)
        pdf.savefig(fig)
        _text_page(pdf, "Design check", check_text(data.check, data.solution).splitlines())
        lines = (capacity_text(data.capacity, joint, data.check).splitlines() if data.capacity
                 else [data.capacity_note])
        lines += ["", "ASSUMPTIONS", *[f"- {a}" for a in assumptions(data)]]
        _text_page(pdf, "Capacity and assumptions", lines)
    return buf.getvalue()


def _wrap(text: str, width: int = 110) -> list[str]:
    import textwrap

    return textwrap.wrap(text, width)
