"""The README's answer for the demo fork, "does another plane pay?", by hand.

The fork (EN 1993-1-8) pulls its hanger through two 15 mm S355 plies, end
distance e1 = 50 mm along the force, width 100 mm (e2 = 50 mm), M24 in a
normal hole d0 = 26 mm (EN 1090-2:2018 Table 11). EN 1993-1-8 Table 3.4,
characteristic (no γM2): F_b = k1·αb·fu·d·t with k1 = min(2.8·e2/d0 − 1.7, 2.5)
= 2.5, αb = min(e1/(3·d0), fub/fu, 1) = 50/78, fu = 510 MPa (S355, t ≤ 40 mm,
EN 1993-1-1 Table 3.1): 294.2 kN a ply, 588.5 kN for the hanger. Statics: the
hanger's load passes through its plies' bearing, so no stack of these members,
however many planes, carries more.
"""

from __future__ import annotations

import pytest

import plyshear
from plyshear.codes.resistance import nominal_bearing
from plyshear.mechanics import capacity, studies
from tests.conftest import MODELS

# EN 1993-1-8 Table 3.4 bearing of the hanger's two plies, by hand (see above), N
K1, ALPHA_B = 2.5, 50.0 / (3.0 * 26.0)
HANGER = 2 * K1 * ALPHA_B * 510.0 * 24.0 * 15.0
REL = 1e-6  # the answers reach the cap to the solvers' tolerances


@pytest.fixture(scope="module")
def fork() -> plyshear.Joint:
    return plyshear.load_model(MODELS / "fork-four-planes.toml")


def test_the_hand_calculation_is_the_models_collapse(fork) -> None:
    assert [p.thickness for p in fork.plies if p.member == "hanger"] == [15.0, 15.0]
    summary = plyshear.capacity(fork)
    assert summary.collapse.load == pytest.approx(HANGER, rel=REL)
    assert summary.plastic.load == pytest.approx(HANGER, rel=REL)
    assert sorted(name for _, name in summary.mechanism.mechanism.bearing) == [
        "hanger-1",
        "hanger-2",
    ]
    assert summary.nonlinear.load <= HANGER * (1.0 + REL)


def test_no_number_of_planes_passes_the_hangers_bearing(fork) -> None:
    rows = studies.planes_study(fork, 6, bearing_of=nominal_bearing)
    for r in rows:
        for name in ("nonlinear", "collapse", "plastic"):
            assert r.summary.answers[name].load <= HANGER * (1.0 + 1e-3), (r.planes, name)
    # at six planes the ultimate answers meet it: the bearing cap is all that is left
    six = next(r for r in rows if r.planes == 6)
    for name in ("nonlinear", "collapse", "plastic"):
        assert six.summary.answers[name].load == pytest.approx(HANGER, rel=1e-3), name
    assert capacity.separating_planes(six.joint) == 6
