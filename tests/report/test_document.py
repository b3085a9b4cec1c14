"""The calculation report: valid HTML with every plane shear and the caution; PDF pages."""

from __future__ import annotations

import io
import json
import math
from html.parser import HTMLParser
from pathlib import Path

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
EXIT_BAD_INPUT = 2
#: Paper sizes in PDF points (1/72 in): ISO 216 A4 is 210 x 297 mm, ANSI US Letter
#: 8.5 x 11 in (from memory: ISO 216; ANSI/ASME Y14.1).
A4_PT = (210 / 25.4 * 72, 297 / 25.4 * 72)
LETTER_PT = (8.5 * 72, 11 * 72)
REL_PAPER = 1e-3  # the PDF rounds its media box to 4 decimals
#: The typeset report's side margins, mm (plyshear.report.typeset.MARGIN_X).
MARGIN_X_MM = 18.0
#: A line may reach the text box's edge within this (the PDF's rounding), points.
ABS_LINE_PT = 0.5


class _Checker(HTMLParser):
    """Collect text and check that every opened element is closed in order."""

    VOID = {"meta", "br", "img", "hr", "input", "link", "path", "use", "rect", "stop"}

    def __init__(self) -> None:
        super().__init__()
        self.stack: list[str] = []
        self.text: list[str] = []
        self.errors: list[str] = []

    def handle_starttag(self, tag, attrs) -> None:
        if tag not in self.VOID:
            self.stack.append(tag)

    def handle_startendtag(self, tag, attrs) -> None:
        pass

    def handle_endtag(self, tag) -> None:
        if tag in self.VOID:
            return
        if not self.stack or self.stack[-1] != tag:
            self.errors.append(f"</{tag}> closes {self.stack[-1] if self.stack else 'nothing'}")
        else:
            self.stack.pop()

    def handle_data(self, data) -> None:
        self.text.append(data)


def _report(tmp_path: Path, model: Path, suffix: str) -> Path:
    out = tmp_path / f"report{suffix}"
    result = CliRunner().invoke(main, ["report", str(model), "-o", str(out)])
    assert result.exit_code == 0, result.output
    return out


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_html_report_is_valid_and_carries_every_plane_shear(tmp_path, path) -> None:
    out = _report(tmp_path, path, ".html")
    text = out.read_text(encoding="utf-8")
    checker = _Checker()
    checker.feed(text)
    checker.close()
    assert checker.errors == []
    assert checker.stack == []
    body = " ".join(checker.text)
    assert "licensed professional engineer" in body
    assert "<svg" in text
    assert "http://" not in text.replace("http://www.w3.org", "")  # no external assets
    solved = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
    from plyshear.report.text import fmt

    to_report = KN_PER[solved["units"]["force"]]
    for plane in solved["bolts"][0]["planes"]:
        assert fmt(plane["shear"] * to_report) in body, plane


#: The report prints metric forces in kN (exact: 1 N = 0.001 kN) and US ones in kip.
KN_PER = {"N": 1e-3, "kN": 1.0, "kip": 1.0}


class _Tables(HTMLParser):
    """Collect each table's caption and rows of cell texts."""

    def __init__(self) -> None:
        super().__init__()
        self.tables: dict[str, list[list[str]]] = {}
        self._caption: str | None = None
        self._cell: list[str] | None = None
        self._rows: list[list[str]] = []
        self._in_caption = False

    def handle_starttag(self, tag, attrs) -> None:
        if tag == "table":
            self._caption, self._rows = "", []
        elif tag == "caption":
            self._in_caption = True
        elif tag == "tr":
            self._rows.append([])
        elif tag in ("td", "th"):
            self._cell = []

    def handle_endtag(self, tag) -> None:
        if tag == "caption":
            self._in_caption = False
        elif tag in ("td", "th") and self._cell is not None:
            self._rows[-1].append("".join(self._cell))
            self._cell = None
        elif tag == "table":
            self.tables[self._caption or f"table {len(self.tables)}"] = self._rows

    def handle_data(self, data) -> None:
        if self._in_caption:
            self._caption = (self._caption or "") + data
        elif self._cell is not None:
            self._cell.append(data)


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_loads_section_lists_every_member_load_and_reaction(tmp_path, path) -> None:
    import tomllib

    from plyshear.report.text import fmt

    parser = _Tables()
    parser.feed(_quick_html(path))
    header, *rows = parser.tables["members, applied loads and reactions"]
    by_member = {r[0]: dict(zip(header, r, strict=True)) for r in rows}
    raw = tomllib.loads(path.read_text(encoding="utf-8"))  # the model file itself
    solved = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
    k = KN_PER[solved["units"]["force"]]
    lf = "kN" if solved["units"]["force"] in ("N", "kN") else "kip"
    assert set(by_member) == set(raw["member"])
    for name, spec in raw["member"].items():
        row = by_member[name]
        if spec.get("support"):
            assert row["role"] == "support"
            reaction = next(m for m in solved["members"] if m["name"] == name)["reaction_xy"]
            assert row[f"Rx [{lf}]"] == fmt(reaction[0] * k)
            assert row[f"Ry [{lf}]"] == fmt(reaction[1] * k)
        elif "load" in spec:
            load = spec["load"] if isinstance(spec["load"], list) else [spec["load"], 0]
            assert row["role"] == "loaded"
            assert row[f"Fx [{lf}]"] == fmt(_in_report(load[0], k))
            assert row[f"Fy [{lf}]"] == fmt(_in_report(load[1], k))


def _quick_html(path: Path) -> str:
    """The HTML report without the (slow) capacity section."""
    import plyshear
    from plyshear.report import document

    joint = plyshear.load_model(path)
    sol = plyshear.solve(joint)
    data = document.ReportData(
        joint, sol, plyshear.check(joint, sol), None, "skipped", "2026-12-02"
    )
    return document.to_html(data)


def _in_report(value: float | str, k: float) -> float:
    """A model-file force in the report's unit: a bare number times ``k``, or "300 kN"."""
    if isinstance(value, str):
        number, unit = value.split()
        assert unit == "kN"
        return float(number)
    return value * k


def test_html_report_carries_the_equal_split_line(tmp_path) -> None:
    text = _quick_html(MODELS / "fork-four-planes.toml")
    assert "the equal split 250 kN / 4 planes = 62.5 kN" in text  # 250 / 4 by hand


def _pdf(tmp_path: Path, model: Path, *extra: str) -> object:
    pypdf = pytest.importorskip("pypdf")
    out = tmp_path / "report.pdf"
    result = CliRunner().invoke(main, ["report", str(model), "-o", str(out), "--force", *extra])
    assert result.exit_code == 0, result.output
    return pypdf.PdfReader(io.BytesIO(out.read_bytes()))


def _words(page) -> str:
    return " ".join(page.extract_text().split())


def _line_widths(page) -> list[tuple[float, str]]:
    """Width of every text line drawn on the page, points (pypdf's layout-mode parser)."""
    from pypdf._text_extraction._layout_mode._fixed_width_page import text_show_operations
    from pypdf.generic import ContentStream

    ops = iter(ContentStream(page["/Contents"].get_object(), page.pdf, "bytes").operations)
    groups = text_show_operations(ops, page._layout_mode_fonts(), strip_rotated=False)
    return [(g["displaced_tx"] - g["tx"], g["text"]) for g in groups]


def test_pdf_report_has_title_block_page_numbers_and_a4_for_metric(tmp_path) -> None:
    reader = _pdf(tmp_path, MODELS / "fork-four-planes.toml")
    pages = len(reader.pages)
    for n, page in enumerate(reader.pages, start=1):
        words = _words(page)
        assert f"Page {n} of {pages}" in words, words[:200]
        assert "Hanger to three-leg fork" in words  # the title block on every page
        for label in ("Project", "Job", "Subject", "Prepared by", "Checked by", "Revision", "Date"):
            assert label in words
        box = page.mediabox
        size = sorted((float(box.width), float(box.height)))
        assert size == pytest.approx(A4_PT, rel=REL_PAPER)
    first = _words(reader.pages[0])
    assert "licensed professional engineer" in first
    text = " ".join(_words(p) for p in reader.pages)
    assert "governing" in text
    assert "Table 3.4" in text


def test_pdf_report_of_a_kip_inch_model_is_on_letter_unless_told(tmp_path) -> None:
    model = MODELS / "splice-with-filler.toml"
    box = _pdf(tmp_path, model).pages[0].mediabox
    assert (float(box.width), float(box.height)) == pytest.approx(LETTER_PT, rel=REL_PAPER)
    box = _pdf(tmp_path, model, "--paper", "a4").pages[0].mediabox
    assert (float(box.width), float(box.height)) == pytest.approx(A4_PT, rel=REL_PAPER)


def test_no_pdf_text_line_runs_past_the_text_box(tmp_path) -> None:
    reader = _pdf(tmp_path, MODELS / "lug-cheek-plates.toml")
    for page in reader.pages:
        box = page.mediabox
        width = float(box.width) - 2 * MARGIN_X_MM / 25.4 * 72
        widths = _line_widths(page)
        assert widths
        for w, text in widths:
            assert w <= width + ABS_LINE_PT, text


def test_title_block_shows_the_model_keys(tmp_path) -> None:
    source = (MODELS / "fork-four-planes.toml").read_text(encoding="utf-8")
    keys = (
        'job = "J-4711"\nsubject = "Hanger pin H2"\nprepared_by = "A. Engineer"\n'
        'checked_by = "B. Checker"\nrevision = "C"\ndate = 2026-11-30\n'
    )
    model = tmp_path / "titled.toml"
    model.write_text(keys + source, encoding="utf-8")
    words = _words(_pdf(tmp_path, model).pages[1])
    for value in ("J-4711", "Hanger pin H2", "A. Engineer", "B. Checker", "2026-11-30"):
        assert value in words


def test_pdf_needs_the_pdf_extra_or_says_so(tmp_path, monkeypatch) -> None:
    import sys

    monkeypatch.setitem(sys.modules, "typst", None)  # as if not installed
    result = CliRunner().invoke(
        main, ["report", str(MODELS / "fork-four-planes.toml"), "-o", str(tmp_path / "r.pdf")]
    )
    assert result.exit_code == EXIT_BAD_INPUT
    assert "plyshear[pdf]" in result.output
    assert not (tmp_path / "r.pdf").exists()


def test_report_is_not_overwritten_without_force(tmp_path) -> None:
    out = tmp_path / "calc.html"
    out.write_text("the signed calculation", encoding="utf-8")
    model = MODELS / "gusset-three-members.toml"
    result = CliRunner().invoke(main, ["report", str(model), "-o", str(out)])
    assert result.exit_code == EXIT_BAD_INPUT
    assert "exists; use --force" in result.output
    assert out.read_text(encoding="utf-8") == "the signed calculation"
    result = CliRunner().invoke(main, ["report", str(model), "-o", str(out), "--force"])
    assert result.exit_code == 0
    assert out.read_text(encoding="utf-8").startswith("<!DOCTYPE html>")


def test_interrupted_write_leaves_the_old_file(tmp_path, monkeypatch) -> None:
    from plyshear import cli

    out = tmp_path / "calc.pdf"
    out.write_bytes(b"old report")

    def broken_fsync(fd: int) -> None:
        raise KeyboardInterrupt

    monkeypatch.setattr(cli.os, "fsync", broken_fsync)
    with pytest.raises(KeyboardInterrupt):
        cli.write_atomic(out, b"new report, half written", force=True)
    assert out.read_bytes() == b"old report"
    assert sorted(p.name for p in tmp_path.iterdir()) == ["calc.pdf"]


def test_report_needs_html_or_pdf(tmp_path) -> None:
    result = CliRunner().invoke(main, ["report", str(EXAMPLES[0]), "-o", str(tmp_path / "r.docx")])
    assert result.exit_code == EXIT_BAD_INPUT
    assert ".html or .pdf" in result.output


class _AllTables(HTMLParser):
    """Collect every table as rows of cell texts (header row first)."""

    def __init__(self) -> None:
        super().__init__()
        self.tables: list[list[list[str]]] = []
        self._cell: list[str] | None = None

    def handle_starttag(self, tag, attrs) -> None:
        if tag == "table":
            self.tables.append([])
        elif tag == "tr" and self.tables:
            self.tables[-1].append([])
        elif tag in ("td", "th"):
            self._cell = []

    def handle_endtag(self, tag) -> None:
        if tag in ("td", "th") and self._cell is not None:
            self.tables[-1][-1].append("".join(self._cell).strip())
            self._cell = None

    def handle_data(self, data) -> None:
        if self._cell is not None:
            self._cell.append(data)


# EN 1993-1-8:2005 Table 3.4, M20 class 10.9 through the shank: alpha_v 0.6, gross
# area, gamma_M2 1.25; 3.8(1): beta_Lf = 1 - (Lj - 15 d) / (200 d) for Lj = 5 x 70 mm.
SPLICE_F_V_RD = 0.6 * 1000.0 * math.pi * 20.0**2 / 4.0 / 1.25 / 1000.0  # kN
SPLICE_BETA_LF = 1.0 - (5 * 70.0 - 15 * 20.0) / (200 * 20.0)
ABS_3_DECIMALS = 5e-4  # the report prints utilizations to three decimals


def test_bolt_row_report_shows_every_bolts_plane_utilizations(tmp_path) -> None:
    path = MODELS / "splice-six-bolts.toml"
    tables = _AllTables()
    tables.feed(_report(tmp_path, path, ".html").read_text(encoding="utf-8"))
    (planes,) = [t for t in tables.tables if t and t[0][:2] == ["bolt", "plane"]]
    header, rows = planes[0], planes[1:]
    util = {(int(r[0]), int(r[1])): float(r[header.index("utilization")]) for r in rows}
    solved = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
    expected = {
        (k, p["index"]): p["shear"] / (SPLICE_F_V_RD * SPLICE_BETA_LF)
        for k, bolt in enumerate(solved["bolts"], start=1)
        for p in bolt["planes"]
    }
    assert len(expected) == 6 * 4  # six bolts, four planes each (five plies)
    assert util == pytest.approx(expected, abs=ABS_3_DECIMALS)
