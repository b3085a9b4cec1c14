"""A published worked example reproduced end to end: model → solve → check.

Reference:
    AISC, *Design Examples*, Version 14.0 / 15.0 (companion to the AISC Steel
    Construction Manual), Example D.7 "Pin-Connected Tension Member" (read in a
    reproduction of the example's pages). An ASTM A36 plate (Fy = 36 ksi,
    Fu = 58 ksi, AISC Manual Table 2-5), t = 0.500 in, on a 1.00 in pin carries
    a dead load of 4 kips and a live load of 12 kips. Bearing (Spec. Eq. J7-1):
    Apb = 0.500 in × 1.00 in = 0.500 in², Rn = 1.8·Fy·Apb = 32.4 kips,
    φRn = 0.75 × 32.4 = 24.3 kips ≥ Pu = 24.0 kips; Rn/Ω = 32.4/2.00 = 16.2 kips
    ≥ Pa = 16.0 kips. The example assumes the pin itself is adequate.

Here the plate is the inner ply of a symmetric clevis (outer plies 1 in thick,
held): by statics the plate bears the whole load, so the solved demand is the
example's required strength. The example's member limit states (tensile and
shear rupture, yielding) are outside plyshear; only the bearing is compared.
"""

from __future__ import annotations

import pytest

import plyshear
from plyshear.codes.check import CheckResult
from plyshear.model.modelfile import loads

# The example prints three significant figures (24.3, 16.2, 32.4); here they
# are exact (1.8 × 36 × 0.5 = 32.4) and the agreement is to round-off.
REL_PUBLISHED_ROUNDING = 5e-3
# The plate's bearing is the load by statics (measured to 1e-12).
REL_STATICS = 1e-6

KIP = 4448.2216152605  # N, exact
DEAD, LIVE = 4.0, 12.0  # kip, Example D.7
LOADS = {
    "lrfd": 1.2 * DEAD + 1.6 * LIVE,  # ASCE/SEI 7 LC2, as in the example: 24.0 kip
    "asd": DEAD + LIVE,
}  # 16.0 kip
PUBLISHED = {"lrfd": 24.3, "asd": 16.2}  # kip, Example D.7, bearing
PUBLISHED_RN = 32.4  # kip, Example D.7, Eq. J7-1


def _d7_clevis(load: float, method: str) -> str:
    return f"""\
format = 1
title = "AISC Design Examples D.7: pin-connected tension member"
units = "kip-in"

[bolt]
diameter = 1.00        # the pin, in
grade = "A325"         # the example takes the pin as adequate; any strong grade
threads = "excluded"

[[ply]]
name = "clevis-1"
member = "clevis"
thickness = 1.0
fy = 36
fu = 58

[[ply]]
name = "plate"
member = "plate"
thickness = 0.500      # Example D.7: t = 0.500 in
fy = 36                # ASTM A36
fu = 58

[[ply]]
name = "clevis-2"
member = "clevis"
thickness = 1.0
fy = 36
fu = 58

[member.clevis]
support = true

[member.plate]
load = {load!r}

[check]
standard = "aisc360-22"
method = "{method}"
connector = "pin"
"""


def _check(method: str) -> CheckResult:
    joint = loads(_d7_clevis(LOADS[method], method))
    return plyshear.check(joint, plyshear.solve(joint))


@pytest.mark.parametrize("method", ["lrfd", "asd"])
def test_example_d7_pin_bearing(method: str) -> None:
    res = _check(method)
    bearing = [i for i in res.items if i.what == "pin bearing" and i.where == "ply plate"]
    assert len(bearing) == 1
    item = bearing[0]
    assert item.capacity / KIP == pytest.approx(PUBLISHED[method], rel=REL_PUBLISHED_ROUNDING)
    factor = 0.75 if method == "lrfd" else 1.0 / 2.00  # AISC 360-22 J7: phi 0.75, Omega 2.00
    assert item.capacity / factor / KIP == pytest.approx(PUBLISHED_RN, rel=REL_PUBLISHED_ROUNDING)
    # the required strength of the example: Pu = 24.0 kip, Pa = 16.0 kip
    assert item.demand / KIP == pytest.approx(LOADS[method], rel=REL_STATICS)
    assert "J7" in item.clause
    # the example: bearing governs and is o.k. (24.0 / 24.3, 16.0 / 16.2)
    assert res.governing is not None
    assert (res.governing.what, res.governing.where) == ("pin bearing", "ply plate")
    assert res.governing.utilization == pytest.approx(
        LOADS[method] / PUBLISHED[method], rel=REL_PUBLISHED_ROUNDING
    )
    assert res.passes
