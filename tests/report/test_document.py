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
PDF_PAGES = 4  # model and results; diagrams; check; capacity and assumptions


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

    for plane in solved["bolts"][0]["planes"]:
        assert fmt(plane["shear"]) in body, plane


def test_pdf_report_has_its_pages_and_text(tmp_path) -> None:
    pypdf = pytest.importorskip("pypdf")
    out = _report(tmp_path, MODELS / "fork-four-planes.toml", ".pdf")
    reader = pypdf.PdfReader(io.BytesIO(out.read_bytes()))
    assert len(reader.pages) == PDF_PAGES
    first = reader.pages[0].extract_text()
    assert "Hanger to three-leg fork" in first
    assert "licensed professional engineer" in first
    check_page = reader.pages[2].extract_text()
    assert "governing" in check_page
    assert "Table 3.4" in check_page


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
    result = CliRunner().invoke(main, ["report", str(EXAMPLES[0]), "-o",
                                       str(tmp_path / "r.docx")])
    assert result.exit_code == EXIT_BAD_INPUT
    assert ".html or .pdf" in result.output


class _Tables(HTMLParser):
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
    tables = _Tables()
    tables.feed(_report(tmp_path, path, ".html").read_text(encoding="utf-8"))
    (planes,) = [t for t in tables.tables if t and t[0][:2] == ["bolt", "plane"]]
    header, rows = planes[0], planes[1:]
    util = {(int(r[0]), int(r[1])): float(r[header.index("utilization")]) for r in rows}
    solved = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
    expected = {(k, p["index"]): p["shear"] / (SPLICE_F_V_RD * SPLICE_BETA_LF)
                for k, bolt in enumerate(solved["bolts"], start=1) for p in bolt["planes"]}
    assert len(expected) == 6 * 4  # six bolts, four planes each (five plies)
    assert util == pytest.approx(expected, abs=ABS_3_DECIMALS)
