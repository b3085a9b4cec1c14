"""The HTML report is byte-identical for the same input and SOURCE_DATE_EPOCH."""

from __future__ import annotations

import re

from click.testing import CliRunner

from plyshear.cli import main
from tests.conftest import MODELS

#: 1 700 000 000 s after the Unix epoch is 2023-11-14 22:13:20 UTC (from memory,
#: checkable with `date -u -d @1700000000`).
EPOCH, DATE = "1700000000", "2023-11-14"


def test_the_html_report_is_byte_identical_twice(tmp_path, monkeypatch) -> None:
    monkeypatch.setenv("SOURCE_DATE_EPOCH", EPOCH)
    model = MODELS / "fork-four-planes.toml"
    pages = []
    for name in ("a.html", "b.html"):
        r = CliRunner().invoke(main, ["report", str(model), "-o", str(tmp_path / name)])
        assert r.exit_code == 0, r.output
        pages.append((tmp_path / name).read_bytes())
    assert pages[0] == pages[1]
    text = pages[0].decode("utf-8")
    assert DATE in text
    ids = re.findall(r'id="([^"]+)"', text)
    assert len(ids) == len(set(ids))  # the inline figures never share an id
