"""The model file: unit systems, strings with units, defaults and derived data."""

from __future__ import annotations

import pytest

import plyshear
from plyshear.model import modelfile
from plyshear.units import MM_PER_IN, N_PER_KIP, SYSTEMS
from tests.conftest import FORK

REL_EXACT = 1e-12
REL_ROUNDOFF = 1e-9

KSI_IN_MPA = N_PER_KIP / MM_PER_IN**2  # 6.894757 MPa, from the exact inch and pound


def test_unit_factors_are_the_exact_definitions() -> None:
    # NIST SP 811: 1 in = 25.4 mm exactly; 1 lbf = 4.4482216152605 N exactly
    assert SYSTEMS["kip-in"].factor("force") == pytest.approx(4448.2216152605, rel=REL_EXACT)
    assert SYSTEMS["kip-in"].factor("stress") == pytest.approx(6.894757293168361, rel=REL_EXACT)
    assert SYSTEMS["kip-in"].factor("moment") == pytest.approx(
        4448.2216152605 * 25.4, rel=REL_EXACT
    )
    assert SYSTEMS["kN-mm"].factor("stress") == 1.0  # stresses stay MPa in metric systems


def test_strings_with_units_are_parsed() -> None:
    text = (
        FORK.replace("diameter = 24", 'diameter = "0.945 in"')
        .replace("load = 100", 'load = "22.48 kip"')
        .replace("thickness = 20", 'thickness = "2 cm"')
    )
    joint = modelfile.loads(text)
    assert joint.bolt.diameter == pytest.approx(0.945 * 25.4, rel=REL_EXACT)
    assert joint.plies[1].thickness == pytest.approx(20.0, rel=REL_EXACT)
    assert joint.member("lug").load[0] == pytest.approx(22.48 * N_PER_KIP, rel=1e-9)


def test_bare_numbers_follow_the_units_key() -> None:
    joint = modelfile.loads(FORK)
    assert joint.member("lug").load == (100e3, 0.0)  # kN-mm: 100 kN
    assert joint.plies[0].fy == 355.0  # EN 1993-1-1 Table 3.1, S355, t <= 40 mm


KIP_IN = """\
format = 1
units = "kip-in"
[bolt]
diameter = {d}
grade = "8.8"
[[ply]]
name = "leg-1"
member = "fork"
thickness = {t1}
fy = {fy}
fu = {fu}
[[ply]]
name = "lug"
member = "lug"
thickness = {t2}
fy = {fy}
fu = {fu}
[[ply]]
name = "leg-2"
member = "fork"
thickness = {t1}
fy = {fy}
fu = {fu}
gap = {g}
[member.fork]
support = true
[member.lug]
load = [{px}, {py}]
"""

KN_MM = KIP_IN.replace('units = "kip-in"', 'units = "kN-mm"')


def test_same_joint_in_kn_mm_and_kip_in_gives_the_same_results() -> None:
    metric = dict(d=24.0, t1=10.0, t2=20.0, fy=355.0, fu=490.0, g=1.5, px=100.0, py=-30.0)
    inch = dict(
        d=24 / MM_PER_IN,
        t1=10 / MM_PER_IN,
        t2=20 / MM_PER_IN,
        fy=355 / KSI_IN_MPA,
        fu=490 / KSI_IN_MPA,
        g=1.5 / MM_PER_IN,
        px=100e3 / N_PER_KIP,
        py=-30e3 / N_PER_KIP,
    )
    a = plyshear.solve(modelfile.loads(KN_MM.format(**metric)))
    b = plyshear.solve(modelfile.loads(KIP_IN.format(**{k: repr(v) for k, v in inch.items()})))
    assert b.first_bolt_shears() == pytest.approx(a.first_bolt_shears(), rel=REL_ROUNDOFF)
    assert b.bolts[0].max_moment == pytest.approx(a.bolts[0].max_moment, rel=REL_ROUNDOFF)
    # and the JSON of each is in its own units
    ja, jb = a.to_dict(diagram=False), b.to_dict(diagram=False)
    assert jb["units"]["force"] == "kip"
    assert jb["bolts"][0]["planes"][0]["shear"] == pytest.approx(
        ja["bolts"][0]["planes"][0]["shear"] * 1e3 / N_PER_KIP, rel=REL_ROUNDOFF
    )
    assert jb["bolts"][0]["max_moment"] == pytest.approx(
        ja["bolts"][0]["max_moment"] * 1e3 / (N_PER_KIP * MM_PER_IN), rel=REL_ROUNDOFF
    )


def test_thread_position_from_length_and_thread_length() -> None:
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 60\nthread_length = 35')
    joint = modelfile.loads(text)
    sol = plyshear.solve(joint)
    # geometry: the thread starts 60 - 35 = 25 mm under the head; planes at 10 and 30 mm
    assert [p.threads for p in sol.first_bolt_planes] == [False, True]


def test_unknown_thread_geometry_assumes_threads_in_every_plane() -> None:
    joint = modelfile.loads(FORK)
    assert joint.bolt.threads_assumed
    assert all(p.threads for p in plyshear.solve(joint).first_bolt_planes)


def test_thread_length_defaults_from_the_bolt_standard() -> None:
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 100')
    joint = modelfile.loads(text)
    # from memory: ISO 4014, b(ref) = 2d + 6 for l <= 125 mm: 2*24 + 6 = 54 mm
    assert joint.bolt.thread_length == pytest.approx(54.0, rel=REL_EXACT)


def test_edits_return_copies() -> None:
    joint = modelfile.loads(FORK)
    thicker = joint.with_ply(1, thickness=25.0)
    assert joint.plies[1].thickness == 20.0
    assert thicker.plies[1].thickness == 25.0
    with pytest.raises(AttributeError):
        joint.title = "changed"  # type: ignore[misc]
