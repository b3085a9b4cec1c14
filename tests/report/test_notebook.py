"""Notebook use: results render as HTML tables with the figure, and become DataFrames."""

from __future__ import annotations

import subprocess
import sys
from pathlib import Path

import pytest

import plyshear
from plyshear.report.text import fmt
from tests.conftest import MODELS

DEMO = MODELS / "fork-four-planes.toml"
REL_EXACT = 1e-12
N_PER_KN = 1000.0  # exact


@pytest.fixture(scope="module")
def demo():
    joint = plyshear.load_model(DEMO)
    sol = plyshear.solve(joint)
    return joint, sol, plyshear.check(joint, sol)


def test_solution_renders_its_plane_shears_and_the_figure(demo) -> None:
    _, sol, _ = demo
    html = sol._repr_html_()
    assert "<svg" in html
    for plane in sol.first_bolt_planes:
        assert f">{fmt(plane.shear / N_PER_KN)}<" in html  # the demo is in kN


def test_solution_to_frame_equals_the_json(demo) -> None:
    pytest.importorskip("pandas")
    _, sol, _ = demo
    frame = sol.to_frame()
    planes = sol.to_dict()["bolts"][0]["planes"]
    assert list(frame["index"]) == [p["index"] for p in planes]
    assert list(frame["shear"]) == pytest.approx([p["shear"] for p in planes], rel=REL_EXACT)
    plies = sol.to_frame("plies")
    assert list(plies["name"]) == [p.name for p in sol.joint.plies]
    with pytest.raises(ValueError, match="planes, plies, members"):
        sol.to_frame("bolts")
    same = sol.to_frame("ply")  # the export's sheet name is the same table
    assert list(same["bearing"]) == list(plies["bearing"])


def test_check_to_frame_marks_the_governing_item(demo) -> None:
    pytest.importorskip("pandas")
    _, _, res = demo
    frame = res.to_frame()
    assert len(frame) == len(res.items)
    gov = frame[frame["governing"]]
    assert list(gov["what"]) == [res.governing.what]
    assert float(gov["utilization"].iloc[0]) == pytest.approx(
        res.governing.utilization, rel=REL_EXACT
    )
    assert "governing" in res._repr_html_() or 'class="governing"' in res._repr_html_()


def test_capacity_renders_its_answers() -> None:
    joint = plyshear.load_model(MODELS / "splice-with-filler.toml")
    cap = plyshear.capacity(joint)
    html = cap._repr_html_()
    assert "capacity answers" in html
    assert fmt(cap.nonlinear.load / plyshear.units.system("kip-in").factor("force")) in html
    pytest.importorskip("pandas")
    frame = cap.to_frame()
    assert list(frame["answer"]) == ["elastic", "nonlinear", "collapse", "plastic"]


def test_to_frame_without_pandas_names_the_extra(demo, monkeypatch) -> None:
    _, sol, _ = demo
    monkeypatch.setitem(sys.modules, "pandas", None)  # as if not installed
    from plyshear.report.extras import MissingExtraError

    with pytest.raises(MissingExtraError, match=r"plyshear\[pandas\]"):
        sol.to_frame()


def test_the_notebook_example_runs() -> None:
    pytest.importorskip("pandas")
    script = Path(__file__).parents[2] / "docs" / "notebook.py"
    out = subprocess.run(
        [sys.executable, str(script)], capture_output=True, text=True, timeout=300, check=False
    )
    assert out.returncode == 0, out.stderr
    assert "x the equal split" in out.stdout
