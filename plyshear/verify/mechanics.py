"""Verification cases of the mechanics (closed forms of beams) and of bolt rows."""

from __future__ import annotations

import math
from collections.abc import Callable

import numpy as np

from plyshear.verify.case import (
    REL_HETENYI,
    REL_PRINTED_3,
    REL_ROUND_OFF,
    REL_SHAPE_FACTOR,
    REL_STATICS,
    Case,
    case,
    clevis,
    model,
    ply,
    solve,
)

# --- mechanics ----------------------------------------------------------------


@case
def case_timoshenko_cantilever() -> Case:
    """A cantilever of exact Timoshenko elements against the closed form."""
    from plyshear.mechanics import beam

    d, length, n, p, e, nu = 20.0, 60.0, 4, 1000.0, 210000.0, 0.3
    area, inertia = beam.circle_properties(np.array([d]))
    kga = beam.shear_coefficient_circle(nu) * e / (2 * (1 + nu)) * area[0]
    ei = e * inertia[0]
    h = np.full(n, length / n)
    k = beam.stiffness(np.full(n, ei), beam.phi_shear(np.full(n, ei), np.full(n, kga), h), h)
    big = np.zeros((2 * n + 2, 2 * n + 2))
    for i in range(n):
        big[2 * i : 2 * i + 4, 2 * i : 2 * i + 4] += k[i]
    f = np.zeros(2 * n + 2)
    f[-2] = p
    u = np.linalg.solve(big[2:, 2:], f[2:])
    ref = p * length**3 / (3 * ei) + p * length / kga
    return Case(
        "mechanics",
        "timoshenko_cantilever",
        "Timoshenko & Gere, Mechanics of Materials (1972): w = PL³/3EI + PL/κGA",
        "tip deflection, 4 elements [mm]",
        ref,
        float(u[-2]),
        REL_ROUND_OFF,
    )


@case
def case_cowper_shear_coefficient() -> Case:
    """Cowper's printed shear coefficient of a solid circle."""
    from plyshear.mechanics import beam

    return Case(
        "mechanics",
        "cowper_shear_coefficient",
        "Cowper, J. Appl. Mech. 33 (1966): κ = 0.886 printed for a circle, ν = 0.3",
        "shear coefficient κ [-]",
        0.886,
        beam.shear_coefficient_circle(0.3),
        REL_PRINTED_3,
    )


def _hetenyi(half: Callable[[float], float]) -> tuple[float, float]:
    """(plyshear's largest moment, β) of a bolt on equal springs, loaded in the middle."""
    d, e, k, t_load, p = 20.0, 210000.0, 2000.0, 0.2, 10000.0
    beta = (k / (4 * e * math.pi * d**4 / 64)) ** 0.25
    spring = "fy = 355\nfu = 490\nfoundation_modulus = {}\n"
    text = (
        'format = 1\nunits = "N-mm"\n'
        f'[bolt]\ndiameter = {d}\ngrade = "8.8"\nthreads = "excluded"\nE = {e}\n'
        + ply("head", "fork", half(beta), spring.format(k))
        + ply("loaded", "lug", t_load, spring.format(1e6))
        + ply("nut", "fork", half(beta), spring.format(k))
        + f"[member.fork]\nsupport = true\n[member.lug]\nload = {p}\n"
        '[analysis]\nbeam = "euler-bernoulli"\nelements_per_ply = 12\n'
    )
    _, sol = solve(text)
    return sol.bolts[0].max_moment, beta


@case
def case_hetenyi_infinite_beam_moment() -> Case:
    """Moment under a point load on a long beam on springs, P/4β."""
    m, beta = _hetenyi(lambda b: 7.0 / b)
    return Case(
        "mechanics",
        "hetenyi_infinite_beam_moment",
        "Hetényi, Beams on Elastic Foundation (1946), ch. II: M = P/4β",
        "moment under the load, P = 10 kN [N·mm]",
        10000.0 / (4 * beta),
        m,
        REL_HETENYI,
    )


@case
def case_hetenyi_finite_beam_moment() -> Case:
    """Moment at the centre of a free–free beam of βL = 2 on springs."""
    lam, p = 2.0, 10000.0
    m, beta = _hetenyi(lambda b: (lam / b - 0.2) / 2)
    ref = p / (4 * beta) * (math.cosh(lam) - math.cos(lam)) / (math.sinh(lam) + math.sin(lam))
    return Case(
        "mechanics",
        "hetenyi_finite_beam_moment",
        "Hetényi (1946), ch. V, free ends, central load (from memory; checked by "
        "tests/verification against a BVP solve)",
        "central moment, βL = 2 [N·mm]",
        ref,
        m,
        REL_HETENYI,
    )


@case
def case_circle_shape_factor() -> Case:
    """Fully plastic moment of a solid circle over its first-yield moment."""
    from plyshear.mechanics.section import BoltSteel, moment_curvature, yield_moment

    d = 20.0
    steel = BoltSteel(model="elastic-plastic", E=210000.0, fy=640.0, fu=800.0, eu=0.12)
    kappa = 1000.0 * 2 * steel.ey / d
    m, _ = moment_curvature(steel, np.array([kappa]), np.array([d]))
    return Case(
        "mechanics",
        "circle_shape_factor",
        "from memory: Neal, The Plastic Methods of Structural Analysis, ch. 1: Mp/My = 16/3π",
        "M(κ = 1000 κ_y)/M_y [-]",
        16 / (3 * math.pi),
        float(m[0] / yield_moment(steel.fy, d)),
        REL_SHAPE_FACTOR,
    )


@case
def case_en_table_6_11_modulus_per_thickness() -> Case:
    """The default bearing modulus of a thin ply: the Table 6.11 spring over its thickness."""
    from plyshear.mechanics import bearing

    joint = model(
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 24\ngrade = "8.8"\n'
        'threads = "excluded"\n'
        + ply("a", "a", 12.0, 'steel = "S355"\n')
        + ply("b", "b", 12.0, 'steel = "S355"\n')
        + "[member.a]\nsupport = true\n[member.b]\nload = 1000.0\n"
    )
    # EN 1993-1-8 Table 6.11 row 12: k12 = 24 kb kt d fu/E, kt = 1.5 t/16 below its cap,
    # kb = 1.25 without an edge; so E k12/t = 2.25 kb d fu (docs/theory.md, section 3)
    ref = 2.25 * 1.25 * 24.0 * 510.0
    return Case(
        "mechanics",
        "en_table_6_11_modulus_per_thickness",
        "EN 1993-1-8 Table 6.11 (bolts in bearing), spread over t ≤ 26.7 mm: "
        "k = 2.25 kb d fu; EN 10025-2 S355 fu = 510 MPa",
        "foundation modulus, M24 in a 12 mm ply [MPa]",
        ref,
        bearing.component(joint.bolt, joint.plies[0]),
        REL_ROUND_OFF,
    )


@case
def case_clevis_plane_shear_statics() -> Case:
    """Each plane of a symmetric clevis carries half the load."""
    _, sol = solve(clevis(10.0, 20.0, 2.0))
    return Case(
        "mechanics",
        "clevis_plane_shear_statics",
        "statics and symmetry: V = F/2 per plane",
        "plane 1 shear, F = 100 kN [N]",
        50000.0,
        sol.bolts[0].planes[0].shear,
        REL_STATICS,
    )


# --- rows -------------------------------------------------------------------------


def _lap(ta: float, tb: float, positions: list[float] | None) -> str:
    """Two plies lapped on M20 8.8 bolts: ply a loaded before, ply b held after (N-mm)."""
    data = 'steel = "S355"\nwidth = 60\n'
    pattern = f"[pattern]\npositions = {positions!r}\n" if positions else ""
    enters = ('enters = "before"\n', 'enters = "after"\n') if positions else ("", "")
    return (
        'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "8.8"\n'
        'threads = "excluded"\n'
        + pattern
        + ply("a", "a", ta, data)
        + ply("b", "b", tb, data)
        + f"[member.a]\nload = 100000.0\n{enters[0]}[member.b]\nsupport = true\n{enters[1]}"
    )


def _bolt_spring(ta: float, tb: float) -> float:
    """The slip stiffness of one bolt of the lap, N/mm: load over the member's slip."""
    joint, sol = solve(_lap(ta, tb, None))
    a = [m.name for m in joint.members].index("a")
    slip = next(m.displacement_xy[0] for m in sol.members if m.member == a)
    return 100000.0 / slip


def _row_shares(ta: float, tb: float, n: int) -> np.ndarray:
    """The bolt shares plyshear solves for the lap with n bolts at 70 mm pitch, N."""
    _, sol = solve(_lap(ta, tb, [70.0 * i for i in range(n)]))
    return np.array([b.plies[0].force for b in sol.bolts])


def compatibility_shares(
    k: float, pitch: float, ea_a: float, ea_b: float, load: float, n: int
) -> np.ndarray:
    r"""Bolt shares of a lap joint by compatibility (bolts as springs, plates as bars).

    Plate a carries ``load`` into bolt 1 first; plate b leaves past bolt n. With
    R_i the bolt forces, between bolts i and i + 1 plate a carries
    P − ΣR_{≤i} and plate b ΣR_{≤i}, and the slip difference of neighbours is
    the plates' elongation difference:

    .. math:: \frac{R_i - R_{i+1}}{k} = p\left(\frac{P - S_i}{EA_a} - \frac{S_i}{EA_b}\right),
        \qquad S_i = \sum_{m \le i} R_m, \qquad \sum R = P

    (from memory: Tate & Rosenfeld, NACA TN 1051 (1946), the classical
    bolt-load distribution of a row).
    """
    a = np.zeros((n, n))
    rhs = np.zeros(n)
    a[0, :] = 1.0
    rhs[0] = load
    for i in range(n - 1):
        a[i + 1, i] += 1.0 / k
        a[i + 1, i + 1] -= 1.0 / k
        a[i + 1, : i + 1] += pitch * (1.0 / ea_a + 1.0 / ea_b)
        rhs[i + 1] = pitch * load / ea_a
    return np.linalg.solve(a, rhs)


@case
def case_row_two_bolts_unequal() -> Case:
    """Two bolts, plates 10 and 20 mm: the closed form of the first bolt's share."""
    e, w, p, load = 210000.0, 60.0, 70.0, 100000.0
    k = _bolt_spring(10.0, 20.0)
    fa, fb = p / (e * 10 * w), p / (e * 20 * w)
    ref = load * (1 / k + fa) / (2 / k + fa + fb)
    return Case(
        "rows",
        "row_two_bolts_unequal",
        "compatibility of a two-bolt lap (from memory: Tate & Rosenfeld 1946): "
        "R1 = P(1/k + p/EAa)/(2/k + p/EAa + p/EAb)",
        "bolt 1 share, plates 10/20 mm; k from the one-bolt solve [N]",
        ref,
        _row_shares(10.0, 20.0, 2)[0],
        REL_STATICS,
    )


@case
def case_row_three_bolts_equal() -> Case:
    """Three bolts, equal plates: the end bolts' share P(1 + α)/(3 + 2α)."""
    e, w, p, load = 210000.0, 60.0, 70.0, 100000.0
    alpha = _bolt_spring(12.0, 12.0) * p / (e * 12 * w)
    return Case(
        "rows",
        "row_three_bolts_equal",
        "compatibility of a three-bolt lap, equal plates (from memory: Tate & "
        "Rosenfeld 1946): R1 = R3 = P(1 + α)/(3 + 2α), α = kp/EA",
        "bolt 1 share, plates 12/12 mm; k from the one-bolt solve [N]",
        load * (1 + alpha) / (3 + 2 * alpha),
        _row_shares(12.0, 12.0, 3)[0],
        REL_STATICS,
    )


@case
def case_row_three_bolts_unequal() -> Case:
    """Three bolts, plates 8 and 24 mm: the middle bolt by the compatibility equations."""
    e, w, p = 210000.0, 60.0, 70.0
    k = _bolt_spring(8.0, 24.0)
    ref = compatibility_shares(k, p, e * 8 * w, e * 24 * w, 100000.0, 3)[1]
    return Case(
        "rows",
        "row_three_bolts_unequal",
        "compatibility of a three-bolt lap (from memory: Tate & Rosenfeld 1946), "
        "solved as three linear equations",
        "bolt 2 share, plates 8/24 mm; k from the one-bolt solve [N]",
        ref,
        _row_shares(8.0, 24.0, 3)[1],
        REL_STATICS,
    )
