"""`plyshear capacity`: the JSON `capacity` section of the contract, the plot, the examples.

The contract is MODELFILE.md ("`plyshear capacity --json` adds ..."): planes,
plane_strength, elastic/nonlinear {load, event, where}, plastic {load, cut} and
efficiency {elastic, nonlinear, plastic}, all in the model's units.
"""

from __future__ import annotations

import json
import subprocess
import sys
from pathlib import Path

import pytest
from click.testing import CliRunner

import plyshear
from plyshear.cli import main
from plyshear.mechanics import capacity
from tests.conftest import FORK, MODELS

EXIT_OK, EXIT_BAD_INPUT = 0, 2
EXAMPLES = sorted(MODELS.glob("*.toml"))
KN = 1e3  # N per kN: the FORK fixture is in kN-mm
# JSON floats print with repr: the division by the unit factor is the only rounding.
REL_ROUNDOFF = 1e-12
ANSWER_KEYS = {"load", "design_load", "event", "where"}
PNG_MAGIC = b"\x89PNG\r\n\x1a\n"

FORK_EP = FORK + '[analysis]\nbearing = "elastic-plastic"\n'


def _capacity_json(path: Path) -> dict:
    result = CliRunner().invoke(main, ["capacity", str(path), "--json"])
    assert result.exit_code == EXIT_OK, result.output
    return json.loads(result.stdout)


def test_json_capacity_section_keeps_the_contract(write_model) -> None:
    path = write_model(FORK_EP)
    cap = _capacity_json(path)["capacity"]
    assert {"planes", "plane_strength", "elastic", "nonlinear", "plastic", "efficiency"} <= set(cap)
    assert set(cap["elastic"]) == ANSWER_KEYS
    assert set(cap["nonlinear"]) == ANSWER_KEYS | {"events", "peak"}
    assert set(cap["plastic"]) == {"load", "design_load", "cut"}
    assert set(cap["collapse"]) >= {"load", "design_load", "efficiency", "mechanism"}
    assert set(cap["collapse"]["mechanism"]) >= {"hinges", "bearing", "planes"}
    assert set(cap["strengths"]) == {"bolt_plastic_moment", "planes", "plies"}
    assert set(cap["efficiency"]) == {"elastic", "nonlinear", "collapse", "plastic"}
    assert all(set(e) == {"event", "load", "where"} for e in cap["nonlinear"]["events"])
    assert cap["planes"] == 2  # leg | lug | leg
    joint = plyshear.load_model(path)
    # Kulak, Fisher & Struik (1987): 0.62 fub A_s (threads assumed in every plane
    # of a bolt without length), in kN
    assert joint.bolt.threads_assumed
    expected = 0.62 * joint.bolt.fub * joint.bolt.stress_area / KN
    assert cap["plane_strength"] == pytest.approx(expected, rel=REL_ROUNDOFF)
    assert cap["plastic"]["cut"] == ["plane 1", "plane 2"]


def test_json_efficiency_is_load_over_planes_times_strength(write_model) -> None:
    cap = _capacity_json(write_model(FORK_EP))["capacity"]
    full = cap["planes"] * cap["plane_strength"]
    for key in ("elastic", "nonlinear", "collapse", "plastic"):
        assert cap["efficiency"][key] == pytest.approx(cap[key]["load"] / full, rel=REL_ROUNDOFF)
    assert cap["collapse"]["load"] <= cap["plastic"]["load"]


def test_json_loads_are_the_summary_in_model_units(write_model) -> None:
    path = write_model(FORK_EP)
    cap = _capacity_json(path)["capacity"]
    summary = capacity.summarize(plyshear.load_model(path))
    for key in ("elastic", "nonlinear", "collapse", "plastic"):
        ref = getattr(summary, key).load / KN
        assert cap[key]["load"] == pytest.approx(ref, rel=REL_ROUNDOFF)
    assert cap["nonlinear"]["event"] == summary.nonlinear.event
    # the design value is the nominal times the standard's factor: the fixture is AISC
    # LRFD, phi = 0.75 (AISC 360-22 J3.6)
    for key in ("elastic", "nonlinear", "collapse", "plastic"):
        assert cap[key]["design_load"] == pytest.approx(0.75 * cap[key]["load"], rel=1e-12)


def test_plot_writes_a_png_and_refuses_to_overwrite(write_model, tmp_path) -> None:
    model = write_model(FORK_EP)
    out = tmp_path / "out.png"
    runner = CliRunner()
    first = runner.invoke(main, ["capacity", str(model), "--plot", str(out)])
    assert first.exit_code == EXIT_OK, first.output
    data = out.read_bytes()
    assert data.startswith(PNG_MAGIC)
    again = runner.invoke(main, ["capacity", str(model), "--plot", str(out)])
    assert again.exit_code == EXIT_BAD_INPUT
    assert "exists" in again.stderr
    assert "--force" in again.stderr
    assert "Traceback" not in again.output
    assert out.read_bytes() == data


@pytest.mark.parametrize("path", EXAMPLES, ids=lambda p: p.stem)
def test_every_example_runs_through_capacity(path: Path) -> None:
    result = CliRunner().invoke(main, ["capacity", str(path)])
    assert result.exit_code == EXIT_OK, result.output
    assert "licensed engineer" in result.stdout


def test_installed_console_script_runs_capacity(write_model) -> None:
    exe = Path(sys.executable).with_name("plyshear")
    if not exe.exists():
        pytest.skip("console script not installed next to this interpreter")
    done = subprocess.run(
        [str(exe), "capacity", str(write_model(FORK_EP)), "--json"],
        capture_output=True,
        text=True,
        timeout=120,
        check=False,
    )
    assert done.returncode == EXIT_OK, done.stderr
    assert json.loads(done.stdout)["capacity"]["planes"] == 2
