"""A pin plate that ruptures before the pin: the capacity names the lug, planes do not help.

The fork of models/fork-four-planes.toml on a pin, its legs cut down to 34 mm
wide: beside a 25 mm hole (d + 1 mm) each leg keeps b = 4.5 mm, so its net
tension F_u·2·t·b (AISC 360-22 D5.1(a), Eq. D5-1, b_e capped by the side
distance) is far below its bearing and the pin's planes. The fork can then
never carry more than the sum over its legs, 2·b·F_u·Σt, however many planes
it has (the planes study keeps each member's total thickness).
"""

from __future__ import annotations

import dataclasses

import pytest

import plyshear
from plyshear.mechanics.capacity import governing_lugs, summarize
from plyshear.mechanics.strengths import LUG_NET_TENSION, lug_strengths, strengths
from plyshear.mechanics.studies import planes_study
from plyshear.report.capacity_data import mechanism_parts
from plyshear.report.text import planes_text
from tests.conftest import MODELS

NARROW = 34.0  # mm, the legs' width
# The collapse LP converges to its load to this (HiGHS tolerances, refinement).
REL_LP = 1e-6


def _narrow_fork() -> plyshear.Joint:
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    joint = dataclasses.replace(joint, check=dataclasses.replace(joint.check, connector="pin"))
    for j, ply in enumerate(joint.plies):
        if ply.member == "fork":
            joint = joint.with_ply(j, width=NARROW)
    return joint


def _fork_cap(joint: plyshear.Joint) -> float:
    """Sum over the fork's legs of F_u·2·t·b, b = (w − d_h)/2 (hand, AISC 360-22 D5-1)."""
    dh = joint.bolt.diameter + 1.0  # the pin hole: d + 1 mm (D5.2's S.I. limit)
    side = (NARROW - dh) / 2.0
    return sum(
        p.fu * 2.0 * p.thickness * min(side, 2.0 * p.thickness + 16.0)
        for p in joint.plies
        if p.member == "fork"
    )


def test_the_lug_strength_caps_the_ply() -> None:
    joint = _narrow_fork()
    s = strengths(joint)
    lug = lug_strengths(joint)[0]
    assert lug is not None
    # b_e = min(2 x 12 + 16, (34 - 25)/2) = 4.5 mm; F_u 2 t b_e (Eq. D5-1)
    assert lug.net_tension == pytest.approx(joint.plies[0].fu * 2 * 12 * 4.5, rel=1e-12)
    assert s.bearing_rule[0] == LUG_NET_TENSION
    assert s.ply_force[0] == pytest.approx(lug.net_tension, rel=1e-12)
    # a bolt (not a pin) keeps the bearing strength: the D5 rules are for pins
    bolt = dataclasses.replace(joint, check=dataclasses.replace(joint.check, connector="bolt"))
    assert strengths(bolt).bearing_rule[0] != LUG_NET_TENSION


def test_the_capacity_names_the_lug() -> None:
    joint = _narrow_fork()
    summary = summarize(joint)
    assert summary.nonlinear.event == LUG_NET_TENSION
    assert summary.nonlinear.where.startswith("ply fork-")
    assert LUG_NET_TENSION in summary.collapse.where
    # the fork's legs all at their rupture strength hold the collapse: the hand sum
    assert summary.collapse.load == pytest.approx(_fork_cap(joint), rel=REL_LP)
    assert summary.nonlinear.load <= summary.collapse.load * (1 + REL_LP)
    parts = mechanism_parts(summary, joint)
    assert any(p.endswith(f"at full bearing ({LUG_NET_TENSION})") for p in parts)
    # before any plane: the planes' own strength is well above the fork's
    assert summary.plane_strength * summary.planes > 2 * _fork_cap(joint)


def test_extra_planes_do_not_pay_when_the_lug_governs() -> None:
    joint = _narrow_fork()
    rows = planes_study(joint, 4)
    cap = _fork_cap(joint)  # Σt of the fork is kept, so the cap is the same for every variant
    for r in rows:
        assert r.summary.collapse.load == pytest.approx(cap, rel=REL_LP)
        assert r.summary.nonlinear.load <= cap * (1 + REL_LP)
        assert governing_lugs(r.joint, r.summary.strengths, r.summary.mechanism)
    text = planes_text(rows, joint, "total")
    assert "the lug governs, not the pin" in text
