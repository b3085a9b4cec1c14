"""The README's answer for the demo fork, "does another plane pay?", by hand.

The fork's hanger is the member pulled; its two 15 mm plies have a 50 mm edge
distance along the force. AISC 360-22 J3.10(a)(1), hole deformation a design
consideration: each ply's nominal bearing strength is the lesser of
2.4·d·t·Fu and the tear-out 1.2·l_c·t·Fu, with l_c = L_e − d_h/2 and
d_h = d + 2 mm for an M24 in a normal hole (EN 1090-2:2018 Table 11). With
Fu = 510 MPa (S355 to EN 10025-2, t ≤ 40 mm, EN 1993-1-1 Table 3.1), tear-out
governs: 1.2·(50 − 13)·510 = 22 644 N per mm of ply, 679.32 kN for the
hanger's 30 mm. Statics: the hanger's load passes through its plies' bearing,
so no stack of these members — however many planes — carries more.
"""

from __future__ import annotations

import pytest

import plyshear
from plyshear.mechanics import capacity, studies
from tests.conftest import MODELS

# AISC 360-22 J3.10(a)(1) tear-out of the hanger's plies, by hand (see above), N
HANGER = 1.2 * (50.0 - (24.0 + 2.0) / 2.0) * 510.0 * 30.0
REL = 1e-6  # the answers reach the cap to the solvers' tolerances


@pytest.fixture(scope="module")
def fork() -> plyshear.Joint:
    return plyshear.load_model(MODELS / "fork-four-planes.toml")


def test_the_hand_calculation_is_the_models_collapse(fork) -> None:
    assert [p.thickness for p in fork.plies if p.member == "hanger"] == [15.0, 15.0]
    summary = capacity.summarize(fork)
    assert summary.collapse.load == pytest.approx(HANGER, rel=REL)
    assert summary.plastic.load == pytest.approx(HANGER, rel=REL)
    assert sorted(name for _, name in summary.mechanism.mechanism.bearing) == [
        "hanger-1", "hanger-2"]
    # the nonlinear analysis stops short of it (the bent pin reaches its elongation)
    assert summary.nonlinear.load <= HANGER * (1.0 + REL)


def test_no_number_of_planes_passes_the_hangers_bearing(fork) -> None:
    rows = studies.planes_study(fork, 6)
    for r in rows:
        for name, answer in r.summary.answers.items():
            assert answer.load <= HANGER * (1.0 + REL), (r.planes, name)
    # at six planes the ultimate answers meet it: the bearing cap is all that is left
    six = next(r for r in rows if r.planes == 6)
    for name in ("nonlinear", "collapse", "plastic"):
        assert six.summary.answers[name].load == pytest.approx(HANGER, rel=1e-3), name
