"""Defects found with issue 17: demo --copy, sweep legends by value, a swept diameter's
stress area, the package namespace."""

from __future__ import annotations

import filecmp

import pytest
from click.testing import CliRunner

import plyshear
from plyshear.cli import main
from tests.conftest import MODELS

EXIT_BAD_INPUT = 2
#: ISO 898-1:2013 Table 4 (from memory): tensile stress area of M36 x 4 is 817 mm².
AS_M36 = 817.0
REL_TABLE_ROUNDING = 5e-3


def test_demo_copies_the_examples_and_says_how(tmp_path) -> None:
    out = tmp_path / "examples"
    result = CliRunner().invoke(main, ["demo", "--copy", str(out)])
    assert result.exit_code == 0, result.output
    shipped = sorted(p.name for p in MODELS.glob("*.toml"))
    assert sorted(p.name for p in out.iterdir()) == shipped
    for name in shipped:
        assert filecmp.cmp(out / name, MODELS / name, shallow=False)
    (out / shipped[0]).write_text("my edits", encoding="utf-8")
    again = CliRunner().invoke(main, ["demo", "--copy", str(out)])
    assert again.exit_code == EXIT_BAD_INPUT
    assert "--force" in again.output
    assert (out / shipped[0]).read_text(encoding="utf-8") == "my edits"
    hint = CliRunner().invoke(main, ["demo"]).output
    assert "plyshear demo --copy" in hint
    assert "models/<file>" not in hint


def test_sweep_legend_sorts_inch_sizes_by_value() -> None:
    from plyshear.report.sweepplot import sweep_figure

    rows = [
        {"case": i, "ply[1].thickness": t, "bolt.diameter": d, "utilization": 0.5}
        for i, (d, t) in enumerate(
            ((d, t) for d in ("1 in", "3/4 in", "7/8 in") for t in (0.5, 0.75)), start=1
        )
    ]
    fig = sweep_figure(rows, "ply[1].thickness", "bolt.diameter", {}, "utilization", "kip-in")
    labels = [t.get_text() for t in fig.axes[0].get_legend().get_texts()]
    # 3/4 in < 7/8 in < 1 in by value (19.05, 22.225, 25.4 mm)
    assert labels == ["bolt.diameter = 3/4 in", "bolt.diameter = 7/8 in", "bolt.diameter = 1 in"]


def test_a_swept_diameter_gets_its_own_stress_area() -> None:
    from plyshear.model import modelfile
    from plyshear.sweep import keys as sk

    data = modelfile.read(MODELS / "lug-cheek-plates.toml")  # gives stress_area = 1040
    key = sk.parse_key("bolt.diameter", data)
    joint = modelfile.from_dict(sk.apply(data, [key], [36]))
    assert joint.bolt.stress_area == pytest.approx(AS_M36, rel=REL_TABLE_ROUNDING)
    same = modelfile.from_dict(sk.apply(data, [key], [40]))  # the file's own diameter
    assert same.bolt.stress_area == pytest.approx(1040.0, rel=1e-12)  # the file's value
    area = sk.parse_key("bolt.stress_area", data)
    given = modelfile.from_dict(sk.apply(data, [key, area], [36, 800]))
    assert given.bolt.stress_area == pytest.approx(800.0, rel=1e-12)  # the case's own


def test_package_namespace_is_the_api() -> None:
    public = {n for n in vars(plyshear) if not n.startswith("_")}
    assert public == {"capacity", "check", "load_model", "solve"} | {
        n
        for n in public
        if n
        in ("codes", "mechanics", "model", "report", "units", "sweep", "errors", "verify", "cli")
    }  # subpackages once imported
    for leaked in ("os", "Any", "annotations", "TYPE_CHECKING"):
        assert not hasattr(plyshear, leaked)


@pytest.mark.parametrize("bad", [None, "models/fork-four-planes.toml", 3.0])
def test_the_api_names_what_it_needs_when_given_something_else(bad: object) -> None:
    with pytest.raises(TypeError, match=r"plyshear\.solve needs a Joint .*load_model"):
        plyshear.solve(bad)  # type: ignore[arg-type]
    with pytest.raises(TypeError, match=r"plyshear\.capacity needs a Joint"):
        plyshear.capacity(bad)  # type: ignore[arg-type]
