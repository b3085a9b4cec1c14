"""The verification cases of :mod:`plyshear.verify`, and the staleness of docs/verification.md.

Each case compares plyshear with a value from outside the project (its source is
named in the case, and in the generated document beside the row); the reference
values are computed in :mod:`plyshear.verify` from the source's formula or copied
from the source's print with its rounding in the tolerance.
"""

from __future__ import annotations

from pathlib import Path

import pytest

from plyshear import verify
from plyshear.verify.__main__ import main

ROOT = Path(__file__).resolve().parents[1]


@pytest.mark.parametrize("name", verify.names())
def test_case(name: str) -> None:
    case = verify.run(name)
    assert case.group in verify.GROUPS
    # the source named in the case (plyshear.verify), at the case's own tolerance
    assert case.value == pytest.approx(case.reference, rel=case.tol)


def test_every_group_has_cases() -> None:
    groups = {verify.run(n).group for n in verify.names()}
    assert groups == set(verify.GROUPS)


def test_document_is_current() -> None:
    committed = (ROOT / "docs" / "verification.md").read_text(encoding="utf-8")
    assert committed == verify.document(ROOT), (
        "docs/verification.md is stale: run `python -m plyshear.verify`"
    )


def test_document_lists_every_verification_module_on_disk() -> None:
    text = verify.document(ROOT)
    on_disk = sorted((ROOT / "tests" / "verification").glob("test_*.py"))
    assert on_disk
    for path in on_disk:
        assert f"`tests/verification/{path.name}`" in text


def test_a_failing_case_is_marked(tmp_path: Path) -> None:
    bad = verify.Case("mechanics", "x", "statics", "V [N]", reference=100.0, value=103.0, tol=0.01)
    assert not bad.passes
    assert "**NO**" in verify.render([bad], [])


def test_main_checks_and_refuses_a_hand_written_file(tmp_path: Path) -> None:
    (tmp_path / "tests" / "verification").mkdir(parents=True)
    (tmp_path / "docs").mkdir()
    target = tmp_path / "docs" / "verification.md"
    assert main(["--root", str(tmp_path), "--check"]) == 1  # missing: stale
    assert main(["--root", str(tmp_path)]) == 0
    assert main(["--root", str(tmp_path), "--check"]) == 0
    target.write_text("# my notes\n", encoding="utf-8")
    assert main(["--root", str(tmp_path)]) == 2
    assert target.read_text(encoding="utf-8") == "# my notes\n"
    assert main(["--root", str(tmp_path / "nowhere")]) == 2
