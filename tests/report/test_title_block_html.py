"""The HTML report carries the title block as the PDF does, and hand-method sizes in the
model's units (found by a new-user trial)."""

from __future__ import annotations

import plyshear
from plyshear.model import modelfile
from plyshear.report import document, handcalc
from tests.conftest import FORK, MODELS


def _html(joint: plyshear.Joint) -> str:
    sol = plyshear.solve(joint)
    data = document.ReportData(joint, sol, plyshear.check(sol), None, "skipped", "2026-12-02")
    return document.to_html(data)


def test_the_html_report_has_every_title_block_key() -> None:
    keys = {
        "job": "J-0417",
        "subject": "Chord splice",
        "prepared_by": "A. Author",
        "checked_by": "B. Checker",
        "revision": "C",
    }
    head = "".join(f'{k} = "{v}"\n' for k, v in keys.items())
    joint = modelfile.loads(head + FORK)
    html = _html(joint)
    for label, value in zip(
        ("job", "subject", "prepared by", "checked by", "revision"), keys.values(), strict=True
    ):
        assert f"<th>{label}</th>" in html
        assert f"<td>{value}</td>" in html


def test_hand_method_sizes_are_in_the_model_units() -> None:
    joint = plyshear.load_model(MODELS / "lifting-lug-aisc.toml")  # kip-in
    rows = handcalc.hand_rows(plyshear.solve(joint))
    note = next(r.note for r in rows if "Table 3.10" in r.method)
    assert note.endswith("in (a: the thicker outer ply)") or "not applicable" in note
    assert " mm " not in note
