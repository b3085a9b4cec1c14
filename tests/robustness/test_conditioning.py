"""The condition estimate and the ill-conditioning warning (plyshear.mechanics.conditioning).

The estimate is checked against the exact 1-norm condition number that numpy
computes from the dense, Jacobi-scaled matrix (``numpy.linalg.cond(K, 1)``, an
independent reference). Hager's estimator returns a lower bound that is
"almost always within a factor of 3" of the true value (N. J. Higham, ACM TOMS 14
(1988) 381–396, section 4); these small systems give it exactly or nearly.

The hostile stacks of the robustness issue — a ply 1000× thinner or stiffer than
its neighbours, a member held through a very soft link, a grip 20 diameters long —
stay well conditioned after scaling (κ below 1e8) and are solved to round-off;
only a nearly rigid bolt on almost no bearing passes the warning threshold, and
its results still satisfy equilibrium.
"""

from __future__ import annotations

import numpy as np
import pytest

import plyshear
from plyshear.mechanics.assembly import assemble
from plyshear.mechanics.conditioning import COND_WARN
from plyshear.mechanics.solve import _solve_system
from plyshear.model import modelfile
from tests.conftest import FORK, MODELS

#: Hager–Higham: a lower bound, within a factor of 3 in practice (Higham 1988, section 4).
ESTIMATE_FACTOR = 3.0
REL_ROUNDOFF = 1e-9  # statics: round-off of the load only
#: A flagged solve (κ ≈ 1.6e12) keeps about κ·ε ≈ 4e-4 of relative round-off in the
#: worst case; measured 1e-7 on the symmetric plane shears.
REL_FLAGGED = 1e-5


def _dense(sys) -> np.ndarray:
    ab = sys.ab
    u, n = ab.shape[0] - 1, ab.shape[1]
    A = np.zeros((n, n))
    for k in range(u + 1):
        d = ab[u - k, k:]
        A[np.arange(n - k), np.arange(k, n)] = d
        A[np.arange(k, n), np.arange(n - k)] = d
    return np.block([[A, sys.B], [sys.B.T, sys.C]])


def _exact_scaled_condition(joint) -> float:
    K = _dense(assemble(joint))
    r = 1.0 / np.sqrt(np.diag(K))
    return float(np.linalg.cond(K * r[:, None] * r[None, :], 1))


def _edit(old: str, new: str, text: str = FORK) -> str:
    assert old in text
    return text.replace(old, new, 1)


HOSTILE = {
    "ply 1000x thinner": _edit("thickness = 20", "thickness = 0.02"),
    "ply 1000x stiffer": _edit("thickness = 20", "thickness = 20\nfoundation_modulus = 1e8"),
    "member through a soft link": _edit(
        'member = "lug"\nthickness = 20', 'member = "lug"\nthickness = 20\nlink_stiffness = 1e-6'
    ),
    "grip 21 d": FORK.replace("thickness = 10", "thickness = 250").replace(
        'steel = "S355"', "fy = 355\nfu = 490"
    ),
    "rigid bolt on no bearing": FORK.replace(
        "thickness = 10", "thickness = 1\nfoundation_modulus = 0.01"
    ).replace("thickness = 20", "thickness = 1\nfoundation_modulus = 0.01"),
}


@pytest.mark.parametrize("name", sorted(HOSTILE))
def test_estimate_brackets_the_exact_condition(name: str) -> None:
    joint = modelfile.loads(HOSTILE[name])
    exact = _exact_scaled_condition(joint)  # numpy.linalg.cond, dense
    _, _, estimate = _solve_system(assemble(joint))
    assert exact / ESTIMATE_FACTOR <= estimate <= exact * (1 + 1e-8)


@pytest.mark.parametrize("model", sorted(p.name for p in MODELS.glob("*.toml")))
def test_examples_are_well_conditioned_and_unflagged(model: str) -> None:
    joint = plyshear.load_model(MODELS / model)
    sol = plyshear.solve(joint)
    exact = _exact_scaled_condition(joint)  # numpy.linalg.cond, dense
    assert exact / ESTIMATE_FACTOR <= sol.condition <= exact * (1 + 1e-8)
    assert sol.condition < COND_WARN
    assert not any(w.startswith("ill-conditioned:") for w in sol.warnings)


@pytest.mark.parametrize(
    "name", ["ply 1000x thinner", "ply 1000x stiffer", "member through a soft link", "grip 21 d"]
)
def test_hostile_but_sound_stacks_solve_to_round_off(name: str) -> None:
    sol = plyshear.solve(modelfile.loads(HOSTILE[name]))
    assert sol.condition < COND_WARN
    assert not any(w.startswith("ill-conditioned:") for w in sol.warnings)
    assert sol.equilibrium_residual < REL_ROUNDOFF
    # symmetry and statics: the fork is symmetric about the lug's mid-plane, so each of
    # its two planes carries half of the lug's 100 kN (this is what ill-conditioning
    # would spoil; the bearing balance on the supports alone cannot enforce it)
    for plane in sol.first_bolt_planes:
        assert abs(plane.shear_xy[0]) == pytest.approx(50e3, rel=REL_ROUNDOFF)


def test_rigid_bolt_on_no_bearing_is_flagged_and_still_in_equilibrium() -> None:
    sol = plyshear.solve(modelfile.loads(HOSTILE["rigid bolt on no bearing"]))
    assert sol.condition > COND_WARN
    flagged = [w for w in sol.warnings if w.startswith("ill-conditioned: condition estimate")]
    assert len(flagged) == 1
    assert sol.to_dict()["condition_estimate"] == pytest.approx(sol.condition)
    # statics still hold: the fork's reaction balances the lug's 100 kN
    fork = next(m for m in sol.members if sol.joint.members[m.member].name == "fork")
    assert fork.reaction_xy[0] == pytest.approx(-100e3, rel=REL_FLAGGED)
    assert sol.equilibrium_residual < REL_FLAGGED
    # symmetry and statics: each plane carries half of the 100 kN, to about κ·ε
    for plane in sol.first_bolt_planes:
        assert abs(plane.shear_xy[0]) == pytest.approx(50e3, rel=REL_FLAGGED)


def test_the_warning_reaches_the_terminal(write_model) -> None:
    from click.testing import CliRunner

    from plyshear.cli import main

    path = write_model(HOSTILE["rigid bolt on no bearing"])
    result = CliRunner().invoke(main, ["solve", str(path)])
    assert result.exit_code == 0
    assert "ill-conditioned: condition estimate" in result.output
