"""One linear solve per command: the report and the capacity reuse the solution they have."""

from __future__ import annotations

import pytest
from click.testing import CliRunner

from plyshear.cli import main
from plyshear.mechanics import solve as solve_module
from tests.conftest import MODELS

FORK = MODELS / "fork-four-planes.toml"


@pytest.fixture
def solves(monkeypatch) -> list:
    calls: list = []
    real = solve_module.solve

    def counted(joint):
        calls.append(joint.plies)
        return real(joint)

    monkeypatch.setattr(solve_module, "solve", counted)
    return calls


@pytest.mark.parametrize(
    "args",
    [
        ["report", str(FORK), "-o", "{tmp}/r.html"],
        ["capacity", str(FORK), "--json"],
        ["check", str(FORK), "--json"],
    ],
    ids=["report", "capacity-json", "check-json"],
)
def test_a_command_solves_the_joint_once(tmp_path, solves, args) -> None:
    result = CliRunner().invoke(main, [a.format(tmp=tmp_path) for a in args])
    assert result.exit_code in (0, 1), result.output  # 1: a check that fails
    # the model's own stack once (the report's "does the last plane pay?" solves a
    # rebuilt stack of its own)
    assert solves.count(solves[0]) == 1
