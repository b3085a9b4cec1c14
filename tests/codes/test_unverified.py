"""An ill-conditioned solve fails its check instead of passing with a warning.

The joint: the fork plies of the test fork hang on links of 1e-5 and 1e-6 N/mm,
against bearing springs of order 1e5 N/mm per mm of ply. Round-off in the solve
then costs about log10(κ) of the 16 digits (Golub & Van Loan, Matrix
Computations, 4th ed., 2.6.2: relative error ≲ κ·ε), so the demands cannot be
trusted and the check says so.
"""

from __future__ import annotations

import json

import pytest
from click.testing import CliRunner

import plyshear
from plyshear.cli import main
from plyshear.codes import check as ck
from plyshear.model import modelfile
from tests.conftest import FORK

#: From memory (Golub & Van Loan 2.6): one soft spring of stiffness k in an otherwise
#: stiff system gives a condition number proportional to 1/k; the estimate is a lower
#: bound within a factor of three (Higham 1988), so ratios agree to that factor.
ESTIMATE_FACTOR = 3.0


def _hung(link: str) -> str:
    text = FORK
    for name in ("leg-1", "leg-2"):
        text = text.replace(
            f'name = "{name}"\nmember = "fork"',
            f'name = "{name}"\nmember = "fork"\nlink_stiffness = "{link}"',
        )
    return text


def test_an_ill_conditioned_joint_fails_check(write_model) -> None:
    path = write_model(_hung("1e-6 N/mm"))
    r = CliRunner().invoke(main, ["check", str(path)])
    assert r.exit_code == 1, r.output
    assert "NOT VERIFIED: the solve is ill-conditioned" in r.stdout
    assert "PASSES" not in r.stdout
    assert "fewer than 0" not in r.stdout  # the old wording
    assert "no significant digit" in r.stdout
    data = json.loads(CliRunner().invoke(main, ["check", str(path), "--json"]).stdout)
    assert data["check"]["passes"] is False
    assert data["check"]["verified"] is False
    assert data["condition_estimate"] > ck.UNVERIFIED_CONDITION


def test_the_condition_estimate_grows_as_one_over_the_link() -> None:
    soft = plyshear.solve(modelfile.loads(_hung("1e-6 N/mm")))
    softer = plyshear.solve(modelfile.loads(_hung("1e-5 N/mm")))
    ratio = soft.condition / softer.condition
    assert ratio == pytest.approx(10.0, rel=ESTIMATE_FACTOR)  # 1e-5 / 1e-6


def test_a_sound_joint_is_verified() -> None:
    joint = modelfile.loads(FORK)
    res = plyshear.check(joint, plyshear.solve(joint))
    assert res.unverified == ""
    assert res.to_dict()["verified"] is True
