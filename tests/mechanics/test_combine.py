"""Load cases solved once, combinations by superposition, and the envelope.

The reference for superposition is the solve of the same joint with the
combined loads typed in (:meth:`Joint.for_combination` then
:func:`plyshear.solve`): a linear system's response to a sum of loads is the sum
of the responses (superposition, any text on linear elasticity), so the two
agree to round-off. The competing-combination model is statically determinate
(each ply its own member), so its plane shears are statics by hand.
"""

from __future__ import annotations

import dataclasses
from pathlib import Path

import numpy as np
import pytest

import plyshear
from plyshear.mechanics.combine import combined_dict, solve_combinations
from plyshear.model import modelfile
from plyshear.model.joint import Combination, Joint, LoadCase
from tests.conftest import MODELS
from tests.model.test_loadcases import CHAIN, COMBOS

#: Superposition against a direct solve: the issue's 1e-12, relative to the largest value.
REL_SUPERPOSITION = 1e-12
REL_EXACT = 1e-12
EXAMPLES = sorted(MODELS.glob("*.toml"))


def with_cases(joint: Joint, seed: int = 7) -> Joint:
    """The example with four random cases on its loaded members and three combinations."""
    rng = np.random.default_rng(seed)
    loaded = [i for i, m in enumerate(joint.members) if m.is_loaded]
    scale = max(np.hypot(*m.load) for m in joint.members)
    cases = []
    for name in ("dead", "live", "wind", "snow"):
        loads = [(0.0, 0.0)] * len(joint.members)
        for i in loaded:
            loads[i] = tuple(float(v) for v in rng.uniform(-1.0, 1.0, 2) * scale)
        cases.append(LoadCase(name=name, loads=tuple(loads)))
    combos = (
        Combination("c1", (("dead", 1.2), ("live", 1.6), ("snow", 0.5))),
        Combination("c2", (("dead", 0.9), ("wind", 1.0))),
        Combination("c3", (("dead", 1.2), ("wind", -1.0), ("live", 1.0), ("snow", 0.5))),
    )
    return dataclasses.replace(joint, cases=tuple(cases), combinations=combos).for_combination("c1")


def close(a: np.ndarray, b: np.ndarray) -> None:
    scale = float(np.abs(b).max())
    assert float(np.abs(np.asarray(a) - np.asarray(b)).max()) <= REL_SUPERPOSITION * scale


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_each_combination_equals_the_solve_of_its_loads_typed_in(path: Path) -> None:
    joint = with_cases(plyshear.load_model(path))
    combined = solve_combinations(joint)
    for name, sol in combined.combinations.items():
        direct = plyshear.solve(joint.for_combination(name))
        for b, d in zip(sol.bolts, direct.bolts, strict=True):
            close(
                np.array([p.shear_xy for p in b.planes]), np.array([p.shear_xy for p in d.planes])
            )
            close(
                np.array([p.moment_xy for p in b.planes]), np.array([p.moment_xy for p in d.planes])
            )
            close(np.array([p.force_xy for p in b.plies]), np.array([p.force_xy for p in d.plies]))
            close(b.V, d.V)
            close(b.M, d.M)
            close(b.w, d.w)
        close(
            np.array([m.reaction_xy for m in sol.members]),
            np.array([m.reaction_xy for m in direct.members]),
        )
        assert sol.equilibrium_residual < 1e-9  # round-off, as a single solve's
        assert sol.joint.combination == name


@pytest.mark.parametrize("path", EXAMPLES[:2], ids=[p.stem for p in EXAMPLES[:2]])
def test_each_case_alone_equals_its_own_solve(path: Path) -> None:
    joint = with_cases(plyshear.load_model(path))
    combined = solve_combinations(joint)
    for name, sol in combined.cases.items():
        direct = plyshear.solve(joint.for_case(name))
        close(sol.bolts[0].V, direct.bolts[0].V)


def competing() -> Joint:
    return modelfile.loads(CHAIN + COMBOS)


def test_the_governing_combination_of_a_plane_is_the_one_that_maximises_its_shear() -> None:
    # Plies a (held), b, c, each its own member: plane 1 carries b + c, plane 2 c alone
    # (statics). gravity: b = (1.2 * 50, 1.6 * 30) kN, c = 0; uplift: b = 0.9 * 50 kN,
    # c = -120 kN, which reverses plane 1's x shear.
    combined = solve_combinations(competing())
    plane1, plane2 = combined.planes
    gravity = np.hypot(60.0, 48.0) * 1e3  # statics, N
    uplift_1 = abs(45.0 - 120.0) * 1e3  # statics, N
    assert plane1.shear.combination == "gravity"
    assert plane1.shear.value == pytest.approx(max(gravity, uplift_1), rel=REL_EXACT)
    assert plane2.shear.combination == "uplift"
    assert plane2.shear.value == pytest.approx(120e3, rel=REL_EXACT)
    # the uplift combination reverses plane 1's x shear against gravity's
    g = combined.combinations["gravity"].bolts[0].planes[0].shear_xy[0]
    u = combined.combinations["uplift"].bolts[0].planes[0].shear_xy[0]
    assert g * u < 0
    # the ply envelope: c bears 120 kN in uplift only (statics); b the larger of its cases
    by_ply = {combined.joint.plies[p.ply].name: p.bearing for p in combined.plies}
    assert by_ply["c"].combination == "uplift"
    assert by_ply["c"].value == pytest.approx(120e3, rel=REL_EXACT)


def test_envelope_is_the_largest_over_the_direct_solves() -> None:
    joint = with_cases(plyshear.load_model(MODELS / "fork-four-planes.toml"))
    combined = solve_combinations(joint)
    direct = {n: plyshear.solve(joint.for_combination(n)) for n in combined.combinations}
    for p in combined.planes:
        shears = {n: s.bolts[p.bolt].planes[p.index - 1].shear for n, s in direct.items()}
        moments = {n: s.bolts[p.bolt].planes[p.index - 1].moment for n, s in direct.items()}
        assert p.shear.combination == max(shears, key=shears.__getitem__)
        assert p.shear.value == pytest.approx(max(shears.values()), rel=REL_SUPERPOSITION)
        assert p.moment.combination == max(moments, key=moments.__getitem__)


def test_json_carries_cases_combinations_and_envelope() -> None:
    joint = competing()
    data = combined_dict(solve_combinations(joint), "uplift")
    assert data["combination"] == "uplift"
    assert [c["name"] for c in data["cases"]] == ["dead", "live", "wind"]
    assert [c["name"] for c in data["combinations"]] == ["gravity", "uplift"]
    assert data["combinations"][0]["factors"] == {"dead": 1.2, "live": 1.6}
    single = plyshear.solve(joint.for_combination("uplift")).to_dict()
    # each combination's result has the keys of a single result
    assert set(single) - {"bolts", "members"} <= set(data["combinations"][1])
    plane2 = data["envelope"]["bolts"][0]["planes"][1]
    assert plane2["shear"] == pytest.approx(120.0, rel=REL_EXACT)  # kN, statics
    assert plane2["shear_combination"] == "uplift"


def test_a_joint_without_cases_is_refused() -> None:
    with pytest.raises(ValueError, match="no load cases"):
        solve_combinations(plyshear.load_model(MODELS / "fork-four-planes.toml"))
