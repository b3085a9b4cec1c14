"""Every example model runs through the CLI, and `solve --json` keeps the contract."""

from __future__ import annotations

import json
import subprocess
import sys
import tomllib
from pathlib import Path

import pytest
from click.testing import CliRunner

import plyshear
from plyshear import units
from plyshear.cli import main
from tests.conftest import MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
RESIDUAL_MAX = 1e-9

PLANE_KEYS = {"index", "z", "above", "below", "shear", "shear_xy", "moment", "threads"}
PLY_KEYS = {"name", "member", "bearing", "bearing_xy"}
DIAGRAM_KEYS = {"z", "shear", "moment", "deflection"}


def test_each_example_has_the_bolts_and_planes_its_file_declares() -> None:
    # read with tomllib (the standard library), not plyshear's loader: a row of
    # [pattern] count bolts (one without), one plane between consecutive plies
    found = {}
    for path in EXAMPLES:
        raw = tomllib.loads(path.read_text(encoding="utf-8"))
        bolts = raw.get("pattern", {}).get(
            "count", len(raw.get("pattern", {}).get("positions", [0]))
        )
        data = json.loads(CliRunner().invoke(main, ["solve", str(path), "--json"]).output)
        assert [len(b["planes"]) for b in data["bolts"]] == [len(raw["ply"]) - 1] * bolts
        found[path.stem] = bolts
    assert found["splice-six-bolts"] == 6  # the file's own [pattern] count = 6


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_example_solves_and_json_keeps_the_contract(path: Path) -> None:
    result = CliRunner().invoke(main, ["solve", str(path), "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    assert data["format"] == 1
    assert set(data["units"]) == {"force", "length", "moment", "stress"}
    bolt = data["bolts"][0]
    assert PLANE_KEYS <= set(bolt["planes"][0])
    assert PLY_KEYS <= set(bolt["plies"][0])
    assert DIAGRAM_KEYS <= set(bolt["diagram"])
    assert [p["index"] for p in bolt["planes"]] == list(range(1, len(bolt["planes"]) + 1))
    assert len(bolt["planes"]) == len(bolt["plies"]) - 1
    for plane in bolt["planes"]:
        assert plane["shear"] == pytest.approx(
            (plane["shear_xy"][0] ** 2 + plane["shear_xy"][1] ** 2) ** 0.5, rel=1e-12
        )
    assert {"name", "reaction_xy", "displacement_xy"} <= set(data["members"][0])
    assert data["equilibrium_residual"] < RESIDUAL_MAX
    # statics: the reactions balance the applied loads (in the model's units)
    joint = plyshear.load_model(path)
    per_unit = units.system(joint.units).factor("force")
    for c in range(2):
        applied = sum(m.load[c] for m in joint.members) / per_unit
        reacted = sum(m["reaction_xy"][c] for m in data["members"])
        assert reacted == pytest.approx(-applied, rel=1e-9, abs=1e-9 * per_unit)


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_example_table_has_every_plane_and_the_caution(path: Path) -> None:
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == 0, result.output
    assert "licensed engineer" in result.output
    assert "equilibrium residual" in result.output


def test_demo_runs_and_is_indeterminate() -> None:
    result = CliRunner().invoke(main, ["demo", "--json"])
    assert result.exit_code == 0, result.output
    data = json.loads(result.output)
    members = {p["member"] for p in data["bolts"][0]["plies"]}
    plies_per_member = [sum(p["member"] == m for p in data["bolts"][0]["plies"]) for m in members]
    assert max(plies_per_member) >= 2  # several plies per member: statics cannot split it


def test_plot_writes_each_format(tmp_path: Path) -> None:
    model = MODELS / "fork-four-planes.toml"
    magic = {".png": b"\x89PNG", ".svg": b"<?xml", ".pdf": b"%PDF"}
    for suffix, head in magic.items():
        out = tmp_path / f"fig{suffix}"
        result = CliRunner().invoke(main, ["solve", str(model), "--plot", str(out)])
        assert result.exit_code == 0, result.output
        assert out.read_bytes().startswith(head)


def test_installed_console_script_runs() -> None:
    exe = Path(sys.executable).with_name("plyshear")
    if not exe.exists():
        pytest.skip("console script not installed next to this interpreter")
    out = subprocess.run(
        [str(exe), "solve", str(MODELS / "gusset-three-members.toml")],
        capture_output=True,
        text=True,
        timeout=120,
        check=False,
    )
    assert out.returncode == 0, out.stderr
    assert "plane" in out.stdout
    bad = subprocess.run(
        [str(exe), "solve", "no-such-model.toml"],
        capture_output=True,
        text=True,
        timeout=120,
        check=False,
    )
    assert bad.returncode == 2
    assert bad.stderr.startswith("error: no-such-model.toml: ")
    assert "Traceback" not in bad.stderr
