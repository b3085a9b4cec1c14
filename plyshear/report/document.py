"""The calculation report: a self-contained HTML file (inline SVG) or a typeset PDF.

Order of contents (:func:`plyshear.report.content.sections`): title block and
the standing caution; the model echo (bolt, stack, planes); the loads, supports
and reactions; the elevation of the stack beside the shear, moment and
bearing-pressure diagrams; the results per plane and per ply; the design check
with clauses and the governing item; the capacity and plane efficiency; the
assumptions and the version of plyshear.
"""

from __future__ import annotations

import datetime as _dt
import html
import os
import re

from matplotlib.figure import Figure

from plyshear.codes.check import check
from plyshear.codes.resistance import nominal_bearing
from plyshear.errors import CapacityError
from plyshear.mechanics.capacity import CapacitySummary, summarize
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint
from plyshear.report import diagrams
from plyshear.report.content import (
    CAUTION_LONG,
    Block,
    Graphic,
    Items,
    ReportData,
    Table,
    sections,
)
from plyshear.report.text import CAUTION

__all__ = ["CAUTION_LONG", "ReportData", "build", "to_html", "to_pdf"]


def build(sol: Solution) -> ReportData:
    """Check a solved joint and (where it converges) find its capacity, on this one solve."""
    joint = sol.joint
    res = check(sol)
    from plyshear.report.handcalc import last_plane

    try:
        cap: CapacitySummary | None = summarize(sol, nominal_bearing(joint))
        note = ""
    except (CapacityError, ValueError) as exc:
        cap, note = None, f"capacity not available: {exc}"
    created = _created()
    last = last_plane(cap) if cap is not None else None
    return ReportData(joint, sol, res, cap, note, created, last)


def _created() -> str:
    """Today's date, or the date of ``SOURCE_DATE_EPOCH`` (reproducible builds) if set."""
    epoch = os.environ.get("SOURCE_DATE_EPOCH", "").strip()
    if epoch.isdigit():
        return _dt.datetime.fromtimestamp(int(epoch), tz=_dt.UTC).date().isoformat()
    return _dt.date.today().isoformat()


def _esc(text: object) -> str:
    return html.escape(str(text))


def html_table(t: Table) -> str:
    """A :class:`Table` as an HTML table (numbers right-aligned, the marked row bold)."""
    head = "".join(f"<th>{_esc(h)}</th>" for h in t.headers)
    body = []
    for i, r in enumerate(t.rows):
        cls = ' class="governing"' if i == t.marked else ""
        cells = "".join(
            f'<td class="{"num" if a == "r" else "txt"}">{_esc(c)}</td>'
            for c, a in zip(r, t.align, strict=True)
        )
        body.append(f"<tr{cls}>{cells}</tr>")
    cap = f"<caption>{_esc(t.caption)}</caption>" if t.caption else ""
    return f"<table>{cap}<thead><tr>{head}</tr></thead><tbody>{''.join(body)}</tbody></table>"


def svg_inline(fig: Figure, name: str) -> str:
    """The figure as an inline ``<svg>`` element (no XML prolog, no RDF metadata).

    Its ids are hashed with ``name`` (one per figure of the report): the same
    input gives the same bytes, and two figures never share an id.
    """
    text = diagrams.figure_bytes(fig, "svg", salt=f"plyshear-{name}").decode("utf-8")
    text = re.sub(r"<metadata>.*?</metadata>", "", text[text.find("<svg") :], flags=re.S)
    # every id and reference prefixed: matplotlib names glyphs and groups alike in
    # every figure ("DejaVuSans-48", "figure_1"), and a page may hold one id once
    text = re.sub(r'\bid="([^"]+)"', rf'id="{name}-\1"', text)
    text = re.sub(r'(href="#|url\(#)([^")]+)', rf"\g<1>{name}-\2", text)
    return text


def html_block(block: Block) -> str:
    """One block of a section as HTML."""
    if isinstance(block, Table):
        return html_table(block)
    if isinstance(block, Graphic):
        return (
            f"<figure>{svg_inline(block.draw(), block.name)}"
            f"<figcaption>{_esc(block.caption)}</figcaption></figure>"
        )
    if isinstance(block, Items):
        return "<ul>" + "".join(f"<li>{_esc(i)}</li>" for i in block.items) + "</ul>"
    if block.strong == "pre":
        return f"<pre>{_esc(block.text)}</pre>"
    strong = f"<strong>{_esc(block.strong)}</strong> " if block.strong else ""
    return f"<p>{strong}{_esc(block.text)}</p>"


CSS = """
body { font-family: sans-serif; max-width: 60em; margin: 2em auto; color: #111; }
h1 { font-size: 1.5em; } h2 { font-size: 1.15em; border-bottom: 1px solid #999; }
table { border-collapse: collapse; margin: 0.5em 0 1em; font-size: 0.9em; }
caption { text-align: left; font-weight: bold; padding: 0.2em 0; }
th, td { border: 1px solid #999; padding: 0.15em 0.5em; }
th { background: #e8e8e8; } td.num { text-align: right; font-variant-numeric: tabular-nums; }
td.txt { text-align: left; }
tr.governing td { font-weight: bold; background: #d9d9d9; }
.caution { border: 2px solid #111; padding: 0.5em 1em; margin: 1em 0; }
svg { max-width: 100%; height: auto; }
"""


#: The title block's boxes, in the order the PDF shows them.
TITLE_BOXES = (
    ("job", "job"),
    ("subject", "subject"),
    ("prepared_by", "prepared by"),
    ("checked_by", "checked by"),
    ("revision", "revision"),
    ("date", "date"),
)


def title_block_html(joint: Joint) -> str:
    """The title block as a one-row table (blank boxes where the model gives nothing)."""
    tb = joint.title_block
    head = "".join(f"<th>{_esc(label)}</th>" for _, label in TITLE_BOXES)
    cells = "".join(f"<td>{_esc(getattr(tb, key))}</td>" for key, _ in TITLE_BOXES)
    return (
        f'<table class="title-block"><thead><tr>{head}</tr></thead>'
        f"<tbody><tr>{cells}</tr></tbody></table>"
    )


def to_html(data: ReportData) -> str:
    """Return the report as one self-contained HTML document."""
    joint = data.joint
    title = joint.title or str(joint.source)
    parts = [
        "<!DOCTYPE html>",
        '<html lang="en"><head><meta charset="utf-8">',
        f"<title>{_esc(title)}</title><style>{CSS}</style></head><body>",
        f"<h1>{_esc(title)}</h1>",
    ]
    if joint.project:
        parts.append(f'<p class="project">{_esc(joint.project)}</p>')
    parts.append(title_block_html(joint))
    parts.append(f'<p class="caution"><strong>Caution.</strong> {_esc(CAUTION_LONG)}</p>')
    for n, section in enumerate(sections(data), start=1):
        parts.append(f"<section><h2>{n} {_esc(section.heading)}</h2>")
        parts += [html_block(b) for b in section.blocks]
        parts.append("</section>")
    parts.append(f'<p class="caution">{_esc(CAUTION)}</p></body></html>')
    return "\n".join(parts)


def to_pdf(data: ReportData, paper: str | None = None) -> bytes:
    """Return the report as a typeset PDF (see :mod:`plyshear.report.typeset`)."""
    from plyshear.report.typeset import to_pdf as _to_pdf

    return _to_pdf(data, paper)
