"""The design check through the whole pipeline: model text → solve → check.

Every expected value is computed in the test from the standard's own equation
or table (AISC 360-22 Chapter J; EN 1993-1-8:2005 Tables 3.4, 3.10, 3.3.9),
or is a printed design-table value, each named where it is used. The demands
come from stacks whose plane shears are fixed by statics or by symmetry
(a single lap carries P in its one plane; a symmetric double lap P/2 in each),
so a check value can be compared with the standard alone.
"""

from __future__ import annotations

import math
from typing import Any

import pytest

import plyshear
from plyshear.codes.check import CheckItem, CheckResult
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint
from plyshear.model.modelfile import loads

# Printed design tables round to three significant figures: half a unit in the
# third figure is at most 0.5/100 of the value.
REL_TABLE_ROUNDING = 5e-3
# Capacities computed here from the same equation and exact unit factors:
# only floating-point round-off separates them.
REL_EXACT = 1e-9
# Demands fixed by statics or symmetry: the stiffness solution reproduces them
# to round-off (measured below 1e-9).
REL_STATICS = 1e-6
# Pin moment of a clevis against Table 3.10's uniform-bearing formula: the
# pin's own flexibility makes the bearing slightly non-uniform (measured 4e-6
# with the soft bearing used here).
REL_PIN_FORMULA = 5e-3
# AISC J5.2 prints the filler factor in two unit forms, 1 - 0.4(t - 0.25) (in)
# and 1 - 0.0154(t - 6) (mm); at t = 1/2 in they differ by 0.36 %.
REL_UNIT_FORMS = 5e-3

KIP = 4448.2216152605  # N, exact (1000 lbf)
KSI = 6.894757293168361  # MPa, exact
INCH = 25.4  # mm, exact
KN = 1000.0  # N


# --- model building -------------------------------------------------------------------


def _value(v: Any) -> str:
    if isinstance(v, bool):
        return "true" if v else "false"
    if isinstance(v, str):
        return f'"{v}"'
    return repr(v)


def model(
    units: str,
    bolt: dict[str, Any],
    plies: list[dict[str, Any]],
    members: dict[str, dict[str, Any]],
    check: dict[str, Any] | None = None,
    analysis: dict[str, Any] | None = None,
) -> str:
    """Return model-file text for the given tables."""
    out = ["format = 1", f'units = "{units}"', "", "[bolt]"]
    out += [f"{k} = {_value(v)}" for k, v in bolt.items()]
    for ply in plies:
        out += ["", "[[ply]]"] + [f"{k} = {_value(v)}" for k, v in ply.items()]
    for name, body in members.items():
        out += ["", f"[member.{name}]"] + [f"{k} = {_value(v)}" for k, v in body.items()]
    for table, body in (("analysis", analysis), ("check", check)):
        if body:
            out += ["", f"[{table}]"] + [f"{k} = {_value(v)}" for k, v in body.items()]
    return "\n".join(out) + "\n"


def run(
    text: str, standard: str | None = None, method: str | None = None
) -> tuple[Joint, Solution, CheckResult]:
    joint = loads(text)
    sol = plyshear.solve(joint)
    return joint, sol, plyshear.check(joint, sol, standard, method)


def item(result: CheckResult, what: str, where: str) -> CheckItem:
    found = [i for i in result.items if i.what == what and i.where == where]
    assert len(found) == 1, [(i.what, i.where) for i in result.items]
    return found[0]


def plies_kip_in(members: list[str | None], t: float = 0.5) -> list[dict[str, Any]]:
    """A36 plies (Fy 36, Fu 58 ksi, AISC Manual Table 2-5) of thickness t in."""
    out = []
    for i, m in enumerate(members, start=1):
        ply: dict[str, Any] = {"name": f"p{i}", "thickness": t, "fy": 36, "fu": 58}
        if m is not None:
            ply["member"] = m
        out.append(ply)
    return out


def single_lap_kip_in(
    diameter: str,
    grade: str,
    load: float,
    threads: str = "included",
    check: dict[str, Any] | None = None,
    **bolt: Any,
) -> str:
    """Two plies, one plane: the plane carries the whole load (statics)."""
    return model(
        "kip-in",
        {"diameter": diameter, "grade": grade, "threads": threads, **bolt},
        plies_kip_in(["held", "pulled"]),
        {"held": {"support": True}, "pulled": {"load": load}},
        check,
    )


def double_lap_kip_in(
    diameter: str,
    grade: str,
    load: float,
    threads: str = "included",
    check: dict[str, Any] | None = None,
    **bolt: Any,
) -> str:
    """Outer plies held, middle ply pulled: P/2 in each plane (symmetry)."""
    return model(
        "kip-in",
        {"diameter": diameter, "grade": grade, "threads": threads, **bolt},
        plies_kip_in(["held", "pulled", "held"]),
        {"held": {"support": True}, "pulled": {"load": load}},
        check,
    )


def en_plies(spec: list[tuple[str | None, float]], **extra: Any) -> list[dict[str, Any]]:
    """S355-like plies with fy 355, fu 510 MPa given on the ply."""
    out = []
    for i, (m, t) in enumerate(spec, start=1):
        ply: dict[str, Any] = {"name": f"p{i}", "thickness": t, "fy": 355, "fu": 510, **extra}
        if m is not None:
            ply["member"] = m
        out.append(ply)
    return out


def ab_in2(d_in: float) -> float:
    """Nominal body area πd²/4, in² (AISC 360-22 J3.6)."""
    return math.pi * d_in**2 / 4.0


# --- 1. AISC bolt shear per plane ---------------------------------------------------------

# AISC 360-22 Table J3.2 (ksi): Fnv threads included (N) / excluded (X).
FNV_KSI = {
    ("A325", "included"): 54.0,
    ("A325", "excluded"): 68.0,
    ("A490", "included"): 68.0,
    ("A490", "excluded"): 84.0,
    ("A307", "included"): 27.0,
    ("A307", "excluded"): 27.0,
}
PHI_V, OMEGA_V = 0.75, 2.00  # AISC 360-22 J3.6

# from memory: AISC Manual (15th ed.) Table 7-1, 5/8 in bolt, single shear, kip
# (ASD Rn/Omega, LRFD phi Rn). A307 from the same table's A307 row.
TABLE_7_1_5_8 = {
    ("A325", "included"): (8.28, 12.4),
    ("A325", "excluded"): (10.4, 15.6),
    ("A490", "included"): (10.4, 15.6),
    ("A490", "excluded"): (12.9, 19.3),
    ("A307", "included"): (4.14, 6.21),
}


@pytest.mark.parametrize(
    ("grade", "threads"), list(TABLE_7_1_5_8), ids=[f"{g}-{t}" for g, t in TABLE_7_1_5_8]
)
def test_aisc_single_plane_shear_matches_manual_table_7_1(grade: str, threads: str) -> None:
    asd_printed, lrfd_printed = TABLE_7_1_5_8[grade, threads]
    text = single_lap_kip_in("5/8 in", grade, 5.0, threads)
    for method, printed, factor in (
        ("lrfd", lrfd_printed, PHI_V),
        ("asd", asd_printed, 1.0 / OMEGA_V),
    ):
        _, _, res = run(text, "aisc360-22", method)
        shear = item(res, "bolt shear", "plane 1")
        # derived: AISC 360-22 Eq. J3-1, Rn = Fnv Ab, Ab = pi d^2/4 also through threads
        derived = factor * FNV_KSI[grade, threads] * ab_in2(0.625) * KIP
        assert shear.capacity == pytest.approx(derived, rel=REL_EXACT)
        assert shear.capacity / KIP == pytest.approx(printed, rel=REL_TABLE_ROUNDING)
        assert shear.demand == pytest.approx(5.0 * KIP, rel=REL_STATICS)  # statics: P
        assert "J3.6" in shear.clause
        assert "Table J3.2" in shear.clause


def test_aisc_a307_threads_do_not_change_the_strength() -> None:
    # AISC 360-22 Table J3.2: one Fnv (27 ksi) for A307, threads permitted in the plane
    caps = [
        item(run(single_lap_kip_in("5/8 in", "A307", 3.0, t))[2], "bolt shear", "plane 1").capacity
        for t in ("included", "excluded")
    ]
    assert caps[0] == pytest.approx(caps[1], rel=REL_EXACT)


def test_aisc_double_shear_is_checked_per_plane() -> None:
    load = 20.0  # kip
    _, sol, res = run(double_lap_kip_in("3/4 in", "A325", load))
    single = item(run(single_lap_kip_in("3/4 in", "A325", load))[2], "bolt shear", "plane 1")
    for k in (1, 2):
        plane = item(res, "bolt shear", f"plane {k}")
        # the check is per plane: each plane's capacity is one plane's value
        assert plane.capacity == pytest.approx(single.capacity, rel=REL_EXACT)
        # symmetry: P/2 in each plane
        assert plane.demand == pytest.approx(load / 2 * KIP, rel=REL_STATICS)
    # docs/references.md derived: 3/4 in Group A-N single 17.89 kip, double 35.79 kip (LRFD)
    assert single.capacity / KIP == pytest.approx(17.89, rel=REL_TABLE_ROUNDING)
    assert 2 * single.capacity / KIP == pytest.approx(35.79, rel=REL_TABLE_ROUNDING)


def test_aisc_threads_from_geometry_switch_planes_from_x_to_n() -> None:
    # Five 1/2 in plies: planes at z = 0.5, 1.0, 1.5, 2.0 in. Thread from
    # z = length - thread_length = 3.0 - 1.75 = 1.25 in, inside ply 3: plane k
    # lies between ply k and ply k+1, so planes 3 and 4 are threaded.
    text = model(
        "kip-in",
        {"diameter": "5/8 in", "grade": "A325", "length": 3.0, "thread_length": 1.75},
        plies_kip_in(["a", "b", "a", "b", "a"]),
        {"a": {"support": True}, "b": {"load": 10.0}},
    )
    _, sol, res = run(text, "aisc360-22", "lrfd")
    assert [p.threads for p in sol.bolts[0].planes] == [False, False, True, True]
    ab = ab_in2(0.625)
    for k, fnv in ((1, 68.0), (2, 68.0), (3, 54.0), (4, 54.0)):  # AISC 360-22 Table J3.2 X / N
        cap = item(res, "bolt shear", f"plane {k}").capacity
        assert cap == pytest.approx(PHI_V * fnv * ab * KIP, rel=REL_EXACT)  # derived: Eq. J3-1


# --- 2. EN shear per plane and bearing -------------------------------------------------------

GAMMA_M2 = 1.25  # EN 1993-1-8:2005 Table 2.1 (recommended)
AS_M20 = 245.0  # mm², ISO 898-1 stress area of M20
FUB = {"8.8": 800.0, "10.9": 1000.0}  # MPa, ISO 898-1
# EN 1993-1-8 Table 3.4: alpha_v through threads 0.6 (8.8) / 0.5 (10.9); shank 0.6
ALPHA_V_THREADS = {"8.8": 0.6, "10.9": 0.5}
# printed design tables (docs/references.md, read): M20 per plane through threads, kN
PRINTED_THREADS_KN = {"8.8": 94.1, "10.9": 98.0}


def en_single_lap(grade: str, threads: str, load_kn: float = 50.0, **bolt: Any) -> str:
    return model(
        "kN-mm",
        {"diameter": 20, "grade": grade, "threads": threads, **bolt},
        en_plies([("held", 10), ("pulled", 10)]),
        {"held": {"support": True}, "pulled": {"load": load_kn}},
        {"standard": "en1993-1-8"},
    )


@pytest.mark.parametrize("grade", ["8.8", "10.9"])
def test_en_m20_shear_through_threads_matches_printed_tables(grade: str) -> None:
    _, _, res = run(en_single_lap(grade, "included"))
    shear = item(res, "bolt shear", "plane 1")
    derived = ALPHA_V_THREADS[grade] * FUB[grade] * AS_M20 / GAMMA_M2  # Table 3.4
    assert shear.capacity == pytest.approx(derived, rel=REL_EXACT)
    assert shear.capacity / KN == pytest.approx(PRINTED_THREADS_KN[grade], rel=REL_TABLE_ROUNDING)
    assert shear.demand == pytest.approx(50.0 * KN, rel=REL_STATICS)


@pytest.mark.parametrize("grade", ["8.8", "10.9"])
def test_en_m20_shear_through_shank_uses_the_gross_area(grade: str) -> None:
    _, _, res = run(en_single_lap(grade, "excluded"))
    # EN 1993-1-8 Table 3.4: shank in the plane, A = pi d^2/4, alpha_v = 0.6
    derived = 0.6 * FUB[grade] * math.pi * 20.0**2 / 4.0 / GAMMA_M2
    assert item(res, "bolt shear", "plane 1").capacity == pytest.approx(derived, rel=REL_EXACT)


def test_en_bearing_k1_alpha_b_worked_geometry() -> None:
    # M20 8.8 in a normal hole (d0 = 22 mm, EN 1090-2 Table 11 clearance 2 mm),
    # ply t 10, fu 510, e1 40, e2 = width/2 = 30.
    text = model(
        "kN-mm",
        {"diameter": 20, "grade": "8.8", "threads": "excluded"},
        [
            {
                "name": "plate",
                "member": "held",
                "thickness": 10,
                "fy": 355,
                "fu": 510,
                "edge": 40,
                "width": 60,
            },
            {"name": "thick", "member": "pulled", "thickness": 30, "fy": 355, "fu": 510},
        ],
        {"held": {"support": True}, "pulled": {"load": 80}},
        {"standard": "en1993-1-8"},
    )
    _, _, res = run(text)
    bearing = item(res, "bearing", "ply plate")
    d0, e1, e2, t, fu, d = 22.0, 40.0, 30.0, 10.0, 510.0, 20.0
    alpha_b = min(e1 / (3 * d0), FUB["8.8"] / fu, 1.0)  # Table 3.4, end bolt
    k1 = min(2.8 * e2 / d0 - 1.7, 2.5)  # Table 3.4, edge bolt, one line
    derived = k1 * alpha_b * fu * d * t / GAMMA_M2
    assert bearing.capacity == pytest.approx(derived, rel=REL_EXACT)
    # docs/references.md derived: 104.8 kN
    assert bearing.capacity / KN == pytest.approx(104.8, rel=REL_TABLE_ROUNDING)
    assert bearing.demand == pytest.approx(80.0 * KN, rel=REL_STATICS)
    assert "d0 22 mm" in bearing.note


# --- 3. Fillers ---------------------------------------------------------------------------


def aisc_filler_factor_us(t_in: float) -> float:
    """AISC 360-22 J5.2(b): 1 - 0.4(t - 0.25), t in in; the 0.85 floor from memory."""
    return 1.0 if t_in <= 0.25 else max(0.85, 1.0 - 0.4 * (t_in - 0.25))


def splice_with_filler(fillers: list[float], developed: bool = False) -> str:
    """Cover / flange / loose filler plies / cover: planes 2.. bound the filler."""
    plies = [
        {"name": "cover-top", "member": "covers", "thickness": 0.5, "fy": 50, "fu": 65},
        {"name": "flange", "member": "beam", "thickness": 0.625, "fy": 50, "fu": 65},
    ]
    plies += [
        {"name": f"filler-{i}", "thickness": t, "fy": 36, "fu": 58}
        for i, t in enumerate(fillers, start=1)
    ]
    plies.append({"name": "cover-bottom", "member": "covers", "thickness": 0.5, "fy": 50, "fu": 65})
    check = {"fillers": "developed" if developed else "undeveloped"}
    return model(
        "kip-in",
        {"diameter": "3/4 in", "grade": "A325", "threads": "excluded"},
        plies,
        {"covers": {"support": True}, "beam": {"load": 30.0}},
        check,
    )


@pytest.mark.parametrize(
    "fillers", [[0.5], [0.25, 0.25], [0.75]], ids=["one-1/2in", "two-1/4in", "one-3/4in"]
)
def test_aisc_j5_2_filler_factor_on_the_planes_that_bound_the_pack(fillers: list[float]) -> None:
    _, sol, res = run(splice_with_filler(fillers), "aisc360-22", "lrfd")
    plain = PHI_V * 68.0 * ab_in2(0.75) * KIP  # AISC 360-22 Eq. J3-1, Group A-X
    factor = aisc_filler_factor_us(sum(fillers))  # the pack thickness, as found from the stack
    # plane 1 (cover-top / flange) bounds no filler: no reduction
    assert item(res, "bolt shear", "plane 1").capacity == pytest.approx(plain, rel=REL_EXACT)
    bounding = [p.index for p in sol.bolts[0].planes if p.index > 1]
    assert bounding
    for k in (bounding[0], bounding[-1]):  # flange / filler and filler / cover-bottom
        cap = item(res, "bolt shear", f"plane {k}").capacity
        assert cap == pytest.approx(plain * factor, rel=REL_UNIT_FORMS)
        assert "J5.2" in item(res, "bolt shear", f"plane {k}").clause


def test_aisc_thin_filler_is_not_reduced() -> None:
    # AISC 360-22 J5.2(a): thin fillers (3/16 in, below 1/4 in and 6 mm) need no reduction
    _, _, res = run(splice_with_filler([0.1875]), "aisc360-22", "lrfd")
    plain = PHI_V * 68.0 * ab_in2(0.75) * KIP
    for k in (1, 2, 3):
        assert item(res, "bolt shear", f"plane {k}").capacity == pytest.approx(plain, rel=REL_EXACT)


def test_aisc_quarter_inch_filler_is_not_reduced() -> None:
    # AISC 360-22 J5.2: a 1/4 in filler takes the factor 1 - 0.4(t - 0.25) = 1.0
    _, _, res = run(splice_with_filler([0.25]), "aisc360-22", "lrfd")
    plain = PHI_V * 68.0 * ab_in2(0.75) * KIP
    for k in (1, 2, 3):
        assert item(res, "bolt shear", f"plane {k}").capacity == pytest.approx(plain, rel=REL_EXACT)


def test_aisc_developed_fillers_are_not_reduced() -> None:
    # AISC 360-22 J5.2(b): no reduction when the fillers are developed
    _, _, res = run(splice_with_filler([0.5], developed=True), "aisc360-22", "lrfd")
    plain = PHI_V * 68.0 * ab_in2(0.75) * KIP
    for k in (1, 2, 3):
        assert item(res, "bolt shear", f"plane {k}").capacity == pytest.approx(plain, rel=REL_EXACT)


def test_aisc_undeveloped_filler_thicker_than_3_4_in_fails() -> None:
    # AISC 360-22 J5.2(b): the factor covers fillers up to 3/4 in; thicker must be developed
    _, _, res = run(splice_with_filler([1.0]), "aisc360-22", "lrfd")
    flagged = [i for i in res.items if i.what == "filler thickness"]
    assert flagged
    assert all(i.utilization > 1.0 for i in flagged)
    assert not res.passes


def en_pack_joint(pack: list[float]) -> str:
    plies = en_plies([("covers", 10), ("plate", 10)] + [(None, t) for t in pack] + [("covers", 10)])
    return model(
        "kN-mm",
        {"diameter": 20, "grade": "8.8", "threads": "excluded"},
        plies,
        {"covers": {"support": True}, "plate": {"load": 100}},
        {"standard": "en1993-1-8"},
    )


def test_en_beta_p_for_a_30_mm_pack_on_an_m20_bolt() -> None:
    _, _, res = run(en_pack_joint([15.0, 15.0]))  # two pack plies: one 30 mm pack
    shank = 0.6 * FUB["8.8"] * math.pi * 20.0**2 / 4.0 / GAMMA_M2  # Table 3.4
    beta_p = 9 * 20.0 / (8 * 20.0 + 3 * 30.0)  # EN 1993-1-8 3.6.1(12)
    assert beta_p == pytest.approx(0.72, rel=REL_TABLE_ROUNDING)  # published example: 0.72
    assert item(res, "bolt shear", "plane 1").capacity == pytest.approx(shank, rel=REL_EXACT)
    for k in (2, 4):  # plate / pack and pack / cover
        cap = item(res, "bolt shear", f"plane {k}").capacity
        assert cap == pytest.approx(beta_p * shank, rel=REL_EXACT)
        assert "3.6.1(12)" in item(res, "bolt shear", f"plane {k}").clause


def test_en_pack_up_to_a_third_of_d_is_not_reduced() -> None:
    # EN 1993-1-8 3.6.1(12): beta_p applies only when tp > d/3 (6 mm < 20/3)
    _, _, res = run(en_pack_joint([6.0]))
    shank = 0.6 * FUB["8.8"] * math.pi * 20.0**2 / 4.0 / GAMMA_M2
    for k in (1, 2, 3):
        assert item(res, "bolt shear", f"plane {k}").capacity == pytest.approx(shank, rel=REL_EXACT)


# --- 4. Pin bending (EN 1993-1-8 Table 3.10) -----------------------------------------------


@pytest.mark.parametrize("gap", [0.0, 5.0])
def test_en_pin_bending_of_a_symmetric_clevis(gap: float) -> None:
    f, d, a, b = 10000.0, 30.0, 12.0, 20.0  # N, mm
    plies = [
        {"name": "outer-1", "member": "clevis", "thickness": a},
        {"name": "inner", "member": "eye", "thickness": b, "gap": gap},
        {"name": "outer-2", "member": "clevis", "thickness": a, "gap": gap},
    ]
    for p in plies:  # soft bearing against a stiff pin: uniform bearing
        p.update(fy=355, fu=490, foundation_modulus=10)
    text = model(
        "N-mm",
        {"diameter": d, "grade": "8.8", "threads": "excluded"},
        plies,
        {"clevis": {"support": True}, "eye": {"load": f}},
        {"standard": "en1993-1-8", "connector": "pin"},
        {"elements_per_ply": 10},
    )
    _, _, res = run(text)
    bending = item(res, "pin bending", "bolt")
    assert not bending.informative  # a pin: Table 3.10 applies
    # EN 1993-1-8 Table 3.10: M_Ed = F_Ed (b + 4c + 2a)/8
    assert bending.demand == pytest.approx(f * (b + 4 * gap + 2 * a) / 8, rel=REL_PIN_FORMULA)
    # EN 1993-1-8 Table 3.10: M_Rd = 1.5 Wel fyp / gamma_M0, Wel = pi d^3/32, gamma_M0 1.0
    fyp = 640.0  # MPa, ISO 898-1 class 8.8
    assert bending.capacity == pytest.approx(1.5 * math.pi * d**3 / 32 * fyp, rel=REL_EXACT)
    assert bending.z == pytest.approx(a + gap + b / 2, abs=b / 10 / 2)  # mid-span
    # Table 3.10 pin bearing, 1.5 t d fy / gamma_M0, of the inner plate carrying F
    inner = item(res, "pin bearing", "ply inner")
    assert inner.capacity == pytest.approx(1.5 * b * d * 355.0, rel=REL_EXACT)
    assert inner.demand == pytest.approx(f, rel=REL_STATICS)


# --- 5. Slip --------------------------------------------------------------------------------

MU_CLASS_A_AISC = 0.30  # AISC 360-22 J3.8, Class A
D_U = 1.13  # AISC 360-22 J3.8
TB_3_4_GROUP_A = 28.0  # kip, AISC 360-22 Table J3.1


@pytest.mark.parametrize("pretension", [TB_3_4_GROUP_A, None], ids=["given", "table-j3-1"])
def test_aisc_slip_of_a_pretensioned_group_a_bolt_class_a(pretension: float | None) -> None:
    load = 15.0  # kip
    bolt = {"pretension": pretension} if pretension is not None else {}
    text = double_lap_kip_in(
        "3/4 in", "A325", load, "excluded", {"slip_critical": True, "slip_class": "A"}, **bolt
    )
    for method, factor in (("lrfd", 1.00), ("asd", 1.0 / 1.50)):  # J3.8, standard holes
        _, _, res = run(text, "aisc360-22", method)
        slip = item(res, "slip", "bolt")
        ns = 2  # two planes between different members
        derived = factor * MU_CLASS_A_AISC * D_U * 1.0 * TB_3_4_GROUP_A * ns * KIP  # Eq. J3-4
        assert slip.capacity == pytest.approx(derived, rel=REL_EXACT)
        assert slip.demand == pytest.approx(load * KIP, rel=REL_STATICS)  # the member's force


def test_aisc_slip_planes_count_only_planes_between_different_members() -> None:
    # plies held / held / pulled: plane 1 joins two plies of one member, no slip there
    text = model(
        "kip-in",
        {
            "diameter": "3/4 in",
            "grade": "A325",
            "threads": "excluded",
            "pretension": TB_3_4_GROUP_A,
        },
        plies_kip_in(["held", "held", "pulled"]),
        {"held": {"support": True}, "pulled": {"load": 10.0}},
        {"slip_class": "A"},
    )
    _, _, res = run(text, "aisc360-22", "lrfd")
    derived = MU_CLASS_A_AISC * D_U * TB_3_4_GROUP_A * 1 * KIP  # J3.8 with ns = 1
    assert item(res, "slip", "bolt").capacity == pytest.approx(derived, rel=REL_EXACT)


def test_aisc_slip_of_a_single_lap_with_one_filler_has_one_slip_plane() -> None:
    # AISC 360-22 J3.8: ns = number of slip planes required to permit the
    # connection to slip; the parts can slip on either face of the loose filler.
    text = model(
        "kip-in",
        {
            "diameter": "3/4 in",
            "grade": "A325",
            "threads": "excluded",
            "pretension": TB_3_4_GROUP_A,
        },
        plies_kip_in(["held", None, "pulled"]),
        {"held": {"support": True}, "pulled": {"load": 10.0}},
        {"slip_class": "A"},
    )
    _, _, res = run(text, "aisc360-22", "lrfd")
    derived = MU_CLASS_A_AISC * D_U * 1.0 * TB_3_4_GROUP_A * 1 * KIP  # hf 1.0: one filler
    assert item(res, "slip", "bolt").capacity == pytest.approx(derived, rel=REL_EXACT)


def test_en_slip_resistance_with_the_design_preload() -> None:
    text = model(
        "kN-mm",
        {"diameter": 20, "grade": "10.9", "threads": "excluded"},
        en_plies([("held", 10), ("pulled", 10), ("held", 10)]),
        {"held": {"support": True}, "pulled": {"load": 100}},
        {"standard": "en1993-1-8", "slip_critical": True, "slip_class": "A"},
    )
    _, _, res = run(text)
    slip = item(res, "slip", "bolt")
    fpc = 0.7 * FUB["10.9"] * AS_M20  # EN 1993-1-8 3.9.1(2), Eq. 3.7
    ks, n, mu, gamma_m3 = 1.0, 2, 0.5, 1.25  # Table 3.6 normal hole; Table 3.7 class A; 2.2
    assert slip.capacity == pytest.approx(ks * n * mu * fpc / gamma_m3, rel=REL_EXACT)  # Eq. 3.6
    assert slip.demand == pytest.approx(100.0 * KN, rel=REL_STATICS)


# --- 6. Combined tension and shear -------------------------------------------------------------


@pytest.mark.parametrize(
    ("shear_kip", "method"),
    [(12.0, "lrfd"), (12.0, "asd"), (2.0, "lrfd")],
    ids=["lrfd", "asd", "lrfd-capped-at-fnt"],
)
def test_aisc_j3_7_combined_tension_and_shear(shear_kip: float, method: str) -> None:
    tension = 20.0  # kip
    text = single_lap_kip_in("3/4 in", "A325", shear_kip, "included", tension=tension)
    _, _, res = run(text, "aisc360-22", method)
    ab = ab_in2(0.75)
    fnt, fnv = 90.0, 54.0  # AISC 360-22 Table J3.2, Group A, threads included
    frv = shear_kip / ab  # ksi, the plane's solved shear over Ab
    if method == "lrfd":  # AISC 360-22 Eq. J3-3a / J3-3b
        fnt_p = min(fnt, 1.3 * fnt - fnt / (PHI_V * fnv) * frv)
        avail = PHI_V * fnt_p * ab
    else:
        fnt_p = min(fnt, 1.3 * fnt - OMEGA_V * fnt / fnv * frv)
        avail = fnt_p * ab / OMEGA_V
    combined = item(res, "tension + shear", "bolt, plane 1")
    assert combined.capacity == pytest.approx(avail * KIP, rel=REL_STATICS)
    assert combined.demand == pytest.approx(tension * KIP, rel=REL_EXACT)
    if shear_kip == 2.0:
        assert fnt_p == fnt  # the cap of Eq. J3-3 governs at low shear


def test_en_table_3_4_shear_tension_interaction() -> None:
    tension, shear = 60.0, 50.0  # kN
    _, _, res = run(en_single_lap("8.8", "included", shear, tension=tension))
    fv_rd = 0.6 * FUB["8.8"] * AS_M20 / GAMMA_M2  # Table 3.4 shear through threads
    ft_rd = 0.9 * FUB["8.8"] * AS_M20 / GAMMA_M2  # Table 3.4 tension, k2 = 0.9
    assert item(res, "bolt tension", "bolt").capacity == pytest.approx(ft_rd, rel=REL_EXACT)
    value = item(res, "tension + shear", "bolt, plane 1").demand
    # EN 1993-1-8 Table 3.4: Fv,Ed/Fv,Rd + Ft,Ed/(1.4 Ft,Rd) <= 1
    expected = shear * KN / fv_rd + tension * KN / (1.4 * ft_rd)
    assert value == pytest.approx(expected, rel=REL_STATICS)


# --- Defects found while writing these tests ------------------------------------------------


def test_aisc_a307_long_grip_reduces_the_shear_strength() -> None:
    # 5/8 in A307 through four 1 in plies: grip 4 in > 5d = 3.125 in
    text = model(
        "kip-in",
        {"diameter": "5/8 in", "grade": "A307", "threads": "included"},
        plies_kip_in(["a", "b", "a", "b"], t=1.0),
        {"a": {"support": True}, "b": {"load": 5.0}},
    )
    _, _, res = run(text, "aisc360-22", "lrfd")
    # AISC 360-22 Table J3.2 note: reduce by 1 % for each 1/16 in of grip beyond 5d
    factor = 1.0 - 0.01 * (4.0 - 5 * 0.625) / (1.0 / 16.0)
    derived = PHI_V * 27.0 * ab_in2(0.625) * factor * KIP
    assert item(res, "bolt shear", "plane 1").capacity == pytest.approx(derived, rel=REL_EXACT)


def test_en_pin_bearing_uses_the_lower_yield_of_pin_and_plate() -> None:
    plies = [
        {"name": "outer-1", "member": "clevis", "thickness": 12.0},
        {"name": "inner", "member": "eye", "thickness": 20.0},
        {"name": "outer-2", "member": "clevis", "thickness": 12.0},
    ]
    for p in plies:
        p.update(fy=355, fu=490)
    text = model(
        "N-mm",
        {"diameter": 30, "grade": "4.6", "threads": "excluded"},
        plies,
        {"clevis": {"support": True}, "eye": {"load": 10000.0}},
        {"standard": "en1993-1-8", "connector": "pin"},
    )
    _, _, res = run(text)
    fy = min(240.0, 355.0)  # ISO 898-1 class 4.6 pin, S355 plate
    # EN 1993-1-8 Table 3.10: Fb,Rd = 1.5 t d fy / gamma_M0, fy the lower of pin and plate
    assert item(res, "pin bearing", "ply inner").capacity == pytest.approx(
        1.5 * 20 * 30 * fy, rel=REL_EXACT
    )


# EN 1993-1-8:2005 Table 3.4: M20 10.9 through the shank, 0.6 fub A / gamma_M2 (N);
# 3.8(1): beta_Lf = 1 - (Lj - 15 d)/(200 d), Lj = 5 pitches of 70 mm.
SPLICE_PLANE_RD = (
    0.6 * 1000.0 * math.pi * 20.0**2 / 4.0 / 1.25 * (1.0 - (5 * 70.0 - 15 * 20.0) / (200 * 20.0))
)


def test_items_of_a_bolt_row_are_placed_by_bolt_plane_and_ply() -> None:
    from tests.conftest import MODELS

    joint = plyshear.load_model(MODELS / "splice-six-bolts.toml")
    sol = plyshear.solve(joint)
    res = plyshear.check(sol)
    shear = {(i.bolt, i.plane): i for i in res.items if i.what == "bolt shear"}
    assert set(shear) == {(k, p.index) for k, b in enumerate(sol.bolts) for p in b.planes}
    for (k, index), it in shear.items():
        assert it.demand == pytest.approx(sol.bolts[k].planes[index - 1].shear, rel=1e-12)
        assert it.capacity == pytest.approx(SPLICE_PLANE_RD, rel=1e-12)
        assert it.where == f"bolt {k + 1}: plane {index}"
    data = res.to_dict()
    bearing = [i for i in data["items"] if i["what"] == "bearing"]
    assert {(i["bolt"], i["ply"]) for i in bearing} == {
        (k, name)
        for k in range(1, 7)
        for name in ("cover-outer", "chord-a", "cover-inner", "cover-back")
    }  # the pack is a filler
    assert all(i["plane"] is None for i in bearing)


def test_check_refuses_the_solution_of_another_joint() -> None:
    import dataclasses

    from tests.conftest import FORK

    a = loads(FORK)
    b = loads(FORK.replace("load = 100", "load = 120"))
    with pytest.raises(ValueError, match="the solution is of another joint"):
        plyshear.check(b, plyshear.solve(a))
    # a joint that differs in its [check] settings only is checked, by its own settings,
    # on the same solution
    en = dataclasses.replace(a, check=dataclasses.replace(a.check, standard="en1993-1-8"))
    assert plyshear.check(en, plyshear.solve(a)).standard == "en1993-1-8"
