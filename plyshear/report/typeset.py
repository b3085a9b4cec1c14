"""The typeset PDF report, set by Typst through its Python binding (``typst`` on PyPI).

Why Typst: it is a real typesetter (line breaking, hyphenation, kerning,
tables whose columns wrap their text to the page), it places SVG figures as
vector graphics, counts pages ("page 2 of 5") natively, and its wheel bundles
the compiler and its fonts: one package (a 34 MB download, 81 MB installed) with
no dependencies and no system fonts needed, so the same input gives the same PDF on any
machine. The alternative weighed was ReportLab (about 2 MB, but it needs
Pillow, and svglib with lxml for vector figures, and its tables do not size
their columns to the page by themselves).

The document is written as Typst markup in which every piece of text is a
Typst string literal (``"..."``), so no character of a model file is read as
markup.
"""

from __future__ import annotations

import tempfile
from pathlib import Path

from plyshear import __version__
from plyshear.report.content import Block, Graphic, Items, ReportData, Table, sections

#: Typst's names of the papers a report is set on.
PAPERS = {"letter": "us-letter", "a4": "a4"}
#: Page margins, mm (the title block sits in the top margin).
MARGIN_X, MARGIN_TOP, MARGIN_BOTTOM = 18.0, 38.0, 16.0
#: The title block's fields, from the model's top-level keys, in print order.
TITLE_FIELDS = (
    ("project", "Project"),
    ("job", "Job"),
    ("subject", "Subject"),
    ("prepared_by", "Prepared by"),
    ("checked_by", "Checked by"),
    ("revision", "Revision"),
    ("date", "Date"),
)


def paper_for(units: str, paper: str | None = None) -> str:
    """The paper a report is set on: ``paper`` if given, else US Letter for kip-in, else A4.

    Args:
        units: The model's unit system.
        paper: ``"letter"``, ``"a4"`` or None (follow the units).

    Returns:
        ``"letter"`` or ``"a4"``.
    """
    if paper is not None:
        if paper not in PAPERS:
            raise ValueError(f"paper must be one of {', '.join(PAPERS)} (got {paper!r})")
        return paper
    return "letter" if units == "kip-in" else "a4"


def lit(text: object) -> str:
    """A Typst string literal holding ``text`` exactly."""
    s = str(text).replace("\\", "\\\\").replace('"', '\\"')
    s = s.replace("\n", "\\n").replace("\r", "\\r").replace("\t", "\\t")
    return f'"{s}"'


def title_values(data: ReportData) -> dict[str, str]:
    """The title block's text per field: the model's keys; blank where absent."""
    joint = data.joint
    block = joint.title_block
    out = {key: getattr(block, key, "") or "" for key, _ in TITLE_FIELDS}
    out["project"] = joint.project
    return out


def _header(data: ReportData) -> str:
    """The title block on every page: title and page count, the seven fields."""
    values = title_values(data)
    title = data.joint.title or str(data.joint.source)

    def cell(key: str, label: str, span: int = 1) -> str:
        return (
            f"grid.cell(colspan: {span})[#text(size: 6pt, fill: luma(90))[#{lit(label)}]"
            f" \\ #{lit(values[key])}]"
        )

    page = (
        'grid.cell[#text(size: 6pt, fill: luma(90))[#"Page"] \\ '
        '#context [#counter(page).display() #" of " #counter(page).final().first()]]'
    )
    cells = [
        f"grid.cell(colspan: 3)[#strong({lit(title)})]",
        page,
        cell("project", "Project", 2),
        cell("job", "Job"),
        cell("subject", "Subject"),
        *(cell(k, label) for k, label in TITLE_FIELDS[3:]),
    ]
    return (
        "#set page(header: [#set text(size: 8pt)\n"
        f"#grid(columns: (1fr,) * 4, stroke: 0.5pt, inset: 3pt, {', '.join(cells)})\n], "
        "header-ascent: 12%)\n"
    )


def _table(t: Table) -> str:
    cols = ", ".join("right" if a == "r" else "left" for a in t.align)
    head = ", ".join(f"strong({lit(h)})" for h in t.headers)
    cells = []
    for i, row in enumerate(t.rows):
        for c in row:
            cells.append(f"strong({lit(c)})" if i == t.marked else lit(c))
    fill = f"(x, y) => if y == {t.marked + 1} {{ luma(225) }}" if t.marked is not None else "none"
    cap = f"#block(above: 0.8em, below: 0.3em)[#strong({lit(t.caption)})]\n" if t.caption else ""
    return (
        f"{cap}#table(columns: {len(t.headers)}, align: ({cols},), fill: {fill}, "
        f"stroke: 0.4pt + luma(120), inset: (x: 3pt, y: 2pt), "
        f"table.header({head}), {', '.join(cells)})\n"
    )


def _block(block: Block, files: dict[str, bytes]) -> str:
    from plyshear.report import diagrams

    if isinstance(block, Table):
        return _table(block)
    if isinstance(block, Graphic):
        name = f"{block.name}.svg"
        files[name] = diagrams.figure_bytes(block.draw(), "svg", salt=f"plyshear-{block.name}")
        height = "80%" if block.landscape else "40%"
        return (
            f'#figure(image({lit(name)}, width: 100%, height: {height}, fit: "contain"), '
            f"caption: [#{lit(block.caption)}])\n"
        )
    if isinstance(block, Items):
        return "".join(f"- #{lit(i)}\n" for i in block.items) + "\n"
    if block.strong == "pre":
        return f"#raw({lit(block.text)}, block: true)\n"
    strong = f"#strong({lit(block.strong)}) " if block.strong else ""
    return f"#par[{strong}#{lit(block.text)}]\n"


def markup(data: ReportData, paper: str | None = None) -> tuple[str, dict[str, bytes]]:
    """The report as Typst markup, and the figure files it refers to (name → SVG bytes)."""
    from plyshear.report.content import CAUTION_LONG
    from plyshear.report.text import CAUTION

    joint = data.joint
    title = joint.title or str(joint.source)
    files: dict[str, bytes] = {}
    out = [
        f"#set document(title: {lit(title)}, author: {lit(f'plyshear {__version__}')})",
        f'#set page(paper: "{PAPERS[paper_for(joint.units, paper)]}", margin: (x: {MARGIN_X}mm, '
        f"top: {MARGIN_TOP}mm, bottom: {MARGIN_BOTTOM}mm))",
        '#set text(font: "Libertinus Serif", size: 9.5pt, number-type: "lining", '
        'number-width: "tabular", lang: "en")',
        "#set par(justify: false)",
        "#set table(gutter: 0pt)",
        "#show table: set text(size: 8pt)",
        "#show raw: set text(size: 7pt)",
        "#show heading: set block(above: 1.2em, below: 0.6em)",
        '#set heading(numbering: "1")',
        _header(data),
        f'#block(stroke: 1pt, inset: 6pt, width: 100%)[#strong("Caution.") #{lit(CAUTION_LONG)}]',
    ]
    for section in sections(data):
        body = f"= #{lit(section.heading)}\n" + "".join(_block(b, files) for b in section.blocks)
        wide = any(isinstance(b, Graphic) and b.landscape for b in section.blocks)
        out.append(f"#page(flipped: true)[\n{body}]\n" if wide else body)
    out.append(f"#block(stroke: 1pt, inset: 6pt, width: 100%)[#{lit(CAUTION)}]")
    return "\n".join(out), files


def to_pdf(data: ReportData, paper: str | None = None) -> bytes:
    """Typeset the report as PDF bytes.

    Args:
        data: The report's content.
        paper: ``"letter"`` or ``"a4"``; default from the model's units.

    Returns:
        The PDF.
    """
    from plyshear.report.extras import require

    typst = require("typst", "pdf")
    text, files = markup(data, paper)
    with tempfile.TemporaryDirectory(prefix="plyshear-report-") as tmp:
        root = Path(tmp)
        for name, payload in files.items():
            (root / name).write_bytes(payload)
        main = root / "report.typ"
        main.write_text(text, encoding="utf-8")
        return typst.compile(
            str(main), root=str(root), ignore_system_fonts=True, timestamp=_timestamp(data.created)
        )


def _timestamp(created: str) -> int:
    """The report's date as a Unix time (the PDF's creation date: reproducible)."""
    import datetime as dt

    day = dt.date.fromisoformat(created)
    return int(dt.datetime(day.year, day.month, day.day, tzinfo=dt.UTC).timestamp())
