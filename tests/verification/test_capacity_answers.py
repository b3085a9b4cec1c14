"""The capacity answers against each other, the statics of a thin ply, and earlier results.

* The static theorem of limit analysis (from memory: e.g. Neal, *The Plastic
  Methods of Structural Analysis*, ch. 2): with an elastic–perfectly-plastic
  bolt and elastic–perfectly-plastic bearing, the peak of the load–slip curve
  tends to the rigid-plastic collapse load from below. The collapse LP is a
  lower bound on its own discretisation, which is refined until doubling moves
  it by less than 0.5 %: that is the allowance above it.
* Statics of a thin ply: a member with one ply can deliver no more than that
  ply's bearing strength, AISC 360-22 J3.10(a)(1), 2.4 d t Fu.
* The elastic bolt (``[analysis] bolt = "elastic"``) is the analysis of
  plyshear 3d5be30, before the bolt could yield: its answers on stacks whose
  bearing strength did not change (no edge given, so no tear-out) are kept.
"""

from __future__ import annotations

import dataclasses

import numpy as np
import pytest

import plyshear
from plyshear.mechanics import capacity, incremental, studies
from plyshear.mechanics.collapse import collapse
from plyshear.mechanics.strengths import strengths
from plyshear.model import modelfile
from tests.conftest import MODELS

LP_TOL = 0.005  # the collapse LP's discretisation tolerance (its default)
NEAR_COLLAPSE = 0.03  # the bound on how far below collapse the peak may stop
HUGE = 1e15
REL_REGRESSION = 1e-6  # bisection and Newton tolerances of either version


def _stack(
    members: list[str],
    thick: list[float],
    *,
    bolt: str = "elastic-plastic",
    bearing: str = "elastic-plastic",
    limits: bool = False,
    ends: str = "free",
) -> str:
    """An M20 8.8 pin through S355-like plies; member a held, member b pulled."""
    lines = [
        "format = 1",
        'units = "N-mm"',
        "[bolt]",
        "diameter = 20",
        'grade = "8.8"',
        'threads = "excluded"',
        f'ends = "{ends}"',
        "[analysis]",
        f'bearing = "{bearing}"',
        f'bolt = "{bolt}"',
        f"deformation_limits = {str(limits).lower()}",
    ]
    for j, (m, t) in enumerate(zip(members, thick, strict=True)):
        lines += [
            "[[ply]]",
            f'name = "{m}{j}"',
            f'member = "{m}"',
            f"thickness = {t!r}",
            "fy = 355",
            "fu = 490",
        ]
    lines += ["[member.a]", "support = true", "[member.b]", "load = 100000"]
    return "\n".join(lines) + "\n"


@pytest.mark.parametrize(
    ("members", "thick", "ends"),
    [
        (["a", "b"], [10.0, 10.0], "free"),  # bearing only in both plies
        (["a", "b"], [30.0, 30.0], "free"),  # a hinge in each ply
        (["a", "b", "a"], [15.0, 30.0, 15.0], "free"),  # a slender clevis: two hinges
        (["a", "b", "a", "b"], [10.0, 20.0, 20.0, 10.0], "clamped"),
    ],
    ids=["lap-10-10", "lap-30-30", "clevis-15-30-15", "four-plies-clamped"],
)
def test_elastic_plastic_peak_approaches_the_collapse_load(members, thick, ends) -> None:
    joint = modelfile.loads(_stack(members, thick, ends=ends))
    # shear rupture out of the way (it is brittle in the analysis and ductile in the
    # LP): the mechanisms of bearing and bending, which both must find alike
    s = strengths(joint)
    s = dataclasses.replace(s, plane=np.full(s.plane.size, HUGE), fub=HUGE)
    peak = incremental.analyse(joint, strength=s).peak
    lp = collapse(
        incremental.reference_pattern(joint),
        list(s.bearing),
        s.moment,
        s.shear,
        list(s.net_section),
    ).load
    assert peak <= lp * (1.0 + LP_TOL)
    assert peak >= lp * (1.0 - NEAR_COLLAPSE)


@pytest.mark.parametrize(
    ("members", "thick", "law", "ends", "expected"),
    [
        # plyshear 3d5be30 (before the yielding bolt) on these stacks: nonlinear capacity, N
        (["a", "b", "a"], [15.0, 30.0, 15.0], "elastic-plastic", "free", 127159.96639990134),
        (
            ["a", "b", "a", "b", "a"],
            [8.0, 12.0, 16.0, 12.0, 8.0],
            "plate-bearing",
            "free",
            492862.7073556406,
        ),
        (
            ["a", "b", "a", "b"],
            [10.0, 20.0, 20.0, 10.0],
            "elastic-plastic",
            "clamped",
            467404.72139588534,
        ),
        (["a", "b"], [10.0, 10.0], "bolt-shear", "free", 57280.558082512),
    ],
    ids=["clevis", "five-plies-plate-bearing", "four-plies-clamped", "lap-bolt-shear"],
)
def test_elastic_bolt_reproduces_the_earlier_analysis(members, thick, law, ends, expected) -> None:
    joint = modelfile.loads(
        _stack(members, thick, bolt="elastic", bearing=law, limits=True, ends=ends)
    )
    result = incremental.analyse(joint)
    assert result.load == pytest.approx(expected, rel=REL_REGRESSION)


@pytest.mark.parametrize("bearing", ["component", "elastic-plastic", "plate-bearing", "bolt-shear"])
def test_a_thin_ply_bounds_every_capacity(bearing) -> None:
    # a 4 mm tongue between two 20 mm cheeks: the tongue's bearing governs
    joint = modelfile.loads(
        _stack(
            ["a", "b", "a"],
            [20.0, 4.0, 20.0],
            bearing=bearing,
            bolt="strain-hardening",
            limits=True,
        )
    )
    # AISC 360-22 J3.10(a)(1): 2.4 d t Fu, the only ply of the pulled member ...
    tongue = 2.4 * 20.0 * 490.0 * 4.0
    if bearing == "plate-bearing":
        # ... or the peak of Rex & Easterling (2003), R/Rn = 1.74x/(1+√x)² − 0.009x at
        # 1.74/(1+√x)³ = 0.009, of Rn = 2.4 d t Fu (a far edge)
        root = (1.74 / 0.009) ** (1.0 / 3.0) - 1.0
        tongue *= 1.74 * root**2 / (1.0 + root) ** 2 - 0.009 * root**2
    summary = capacity.summarize(joint)
    for name, answer in summary.answers.items():
        assert answer.load <= tongue * (1.0 + 1e-6), name
    # and the collapse reaches it: the tongue's bearing is the mechanism
    assert summary.collapse.load == pytest.approx(tongue, rel=1e-6)
    assert [name for _, name in summary.mechanism.mechanism.bearing] == ["b1"]


def test_planes_study_with_a_filler_rebuilds_the_model() -> None:
    joint = plyshear.load_model(MODELS / "splice-with-filler.toml")
    own = capacity.separating_planes(joint)
    rows = studies.planes_study(joint, own)
    row = next(r for r in rows if r.planes == own)
    assert [p.is_filler for p in row.joint.plies] == [p.is_filler for p in joint.plies]
    model = capacity.summarize(joint)
    for name, answer in model.answers.items():
        assert row.summary.answers[name].load == pytest.approx(answer.load, rel=1e-9), name
