r"""The verification cases: every published or closed-form value plyshear reproduces.

Each case computes one quantity with plyshear and the same quantity from a
source outside the project (a standard's clause or table, a published worked
example, a closed form, a paper), with the tolerance it must meet and why.
The test suite runs every case (``tests/test_verify.py``), and
``python -m plyshear.verify`` writes them as the table of
``docs/verification.md``, followed by the verification test modules found on
disk, so the document is the tests' own record and a test fails when the
committed copy is stale.

Reference values are computed here from the source's formula where one exists
(the closed form is the source, not a pasted number); printed values carry the
source's rounding in their tolerance.
"""

from __future__ import annotations

import argparse
import ast
import functools
import math
import sys
from collections.abc import Callable
from dataclasses import dataclass
from pathlib import Path

import numpy as np

KIP = 4448.2216152605  #: N per kip (exact: 1 lbf = 0.45359237 kg × 9.80665 m/s²)
IN = 25.4  #: mm per inch (exact)
KSI = KIP / IN**2  #: MPa per ksi

#: A value printed to three significant figures.
REL_PRINTED_3 = 5e-3
#: Two forms of one formula, or statics: round-off only.
REL_ROUND_OFF = 1e-9
#: Statics through a solved stack (the equilibrium residual of the solve).
REL_STATICS = 1e-6
#: A check item against the clause's formula worked by hand: the same arithmetic.
REL_END_TO_END = 1e-6
#: Hetényi's beam: the load spread over a thin ply shifts w and M by ~βt/2 ≈ 0.2 %.
REL_HETENYI = 1e-2
#: The pin formula assumes uniform bearing; the pin's flexibility adds ~4e-6 (measured).
REL_PIN_FORMULA = 5e-3
#: The collapse LP converges to 0.5 % on mesh doubling (its default tolerance).
REL_COLLAPSE = 5e-3
#: The incremental analysis' regularising stiffness lifts a plateau by ~1e-8 k0·δ.
REL_PLATEAU = 1e-4
#: The rigid-plastic moment is approached as the elastic core shrinks (c = r/1000 here).
REL_SHAPE_FACTOR = 1e-3

GROUPS = ("mechanics", "AISC 360-22", "EN 1993-1-8", "capacity", "rows")


@dataclass(frozen=True)
class Case:
    """One verification case, evaluated.

    Attributes:
        group: One of :data:`GROUPS`.
        name: Short identifier (also the test's id).
        source: The reference: standard and clause, book, paper, example.
        quantity: What is compared, with its unit.
        reference: The source's value.
        value: plyshear's value.
        tol: Allowed relative difference.
    """

    group: str
    name: str
    source: str
    quantity: str
    reference: float
    value: float
    tol: float

    @property
    def ratio(self) -> float:
        """plyshear over the reference."""
        return self.value / self.reference

    @property
    def passes(self) -> bool:
        """True when the two agree within ``tol`` (relative)."""
        return abs(self.value - self.reference) <= self.tol * abs(self.reference)


CaseFn = Callable[[], Case]
_REGISTRY: dict[str, CaseFn] = {}


def _case(fn: CaseFn) -> CaseFn:
    """Register a case function under its name (without the leading ``case_``)."""
    _REGISTRY[fn.__name__.removeprefix("case_")] = fn
    return fn


def names() -> list[str]:
    """Every case's name, in the document's order."""
    return list(_REGISTRY)


@functools.cache
def run(name: str) -> Case:
    """Evaluate one case (cached: the tests and the document share one run)."""
    return _REGISTRY[name]()


def run_all() -> list[Case]:
    """Evaluate every case."""
    return [run(n) for n in names()]


# --- models -------------------------------------------------------------------


def _model(text: str):  # noqa: ANN202 - a Joint; imported lazily
    from plyshear.model.modelfile import loads

    return loads(text, "<verification case>")


def _ply(name: str, member: str | None, t: float, extra: str = "") -> str:
    owner = f'member = "{member}"\n' if member else ""
    return f'[[ply]]\nname = "{name}"\n{owner}thickness = {t!r}\n{extra}'


def _solve(text: str):  # noqa: ANN202 - (joint, solution)
    import plyshear

    joint = _model(text)
    return joint, plyshear.solve(joint)


def _item(text: str, what: str, where: str):  # noqa: ANN202 - a CheckItem
    import plyshear

    joint, sol = _solve(text)
    items = [i for i in plyshear.check(joint, sol).items if i.what == what and i.where == where]
    if len(items) != 1:
        raise LookupError(f"expected one {what!r} item at {where!r}, found {len(items)}")
    return items[0]


# --- mechanics ----------------------------------------------------------------


@_case
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
        big[2 * i:2 * i + 4, 2 * i:2 * i + 4] += k[i]
    f = np.zeros(2 * n + 2)
    f[-2] = p
    u = np.linalg.solve(big[2:, 2:], f[2:])
    ref = p * length**3 / (3 * ei) + p * length / kga
    return Case("mechanics", "timoshenko_cantilever",
                "Timoshenko & Gere, Mechanics of Materials (1972): w = PL³/3EI + PL/κGA",
                "tip deflection, 4 elements [mm]", ref, float(u[-2]), REL_ROUND_OFF)


@_case
def case_cowper_shear_coefficient() -> Case:
    """Cowper's printed shear coefficient of a solid circle."""
    from plyshear.mechanics import beam

    return Case("mechanics", "cowper_shear_coefficient",
                "Cowper, J. Appl. Mech. 33 (1966): κ = 0.886 printed for a circle, ν = 0.3",
                "shear coefficient κ [-]", 0.886, beam.shear_coefficient_circle(0.3),
                REL_PRINTED_3)


def _hetenyi(half: float) -> tuple[float, float]:
    """(plyshear's largest moment, β) of a bolt on equal springs, loaded in the middle."""
    d, e, k, t_load, p = 20.0, 210000.0, 2000.0, 0.2, 10000.0
    beta = (k / (4 * e * math.pi * d**4 / 64)) ** 0.25
    spring = f"fy = 355\nfu = 490\nfoundation_modulus = {{}}\n"
    text = ('format = 1\nunits = "N-mm"\n'
            f'[bolt]\ndiameter = {d}\ngrade = "8.8"\nthreads = "excluded"\nE = {e}\n'
            + _ply("head", "fork", half(beta), spring.format(k))
            + _ply("loaded", "lug", t_load, spring.format(1e6))
            + _ply("nut", "fork", half(beta), spring.format(k))
            + f"[member.fork]\nsupport = true\n[member.lug]\nload = {p}\n"
            '[analysis]\nbeam = "euler-bernoulli"\nelements_per_ply = 12\n')
    _, sol = _solve(text)
    return sol.bolts[0].max_moment, beta


@_case
def case_hetenyi_infinite_beam_moment() -> Case:
    """Moment under a point load on a long beam on springs, P/4β."""
    m, beta = _hetenyi(lambda b: 7.0 / b)
    return Case("mechanics", "hetenyi_infinite_beam_moment",
                "Hetényi, Beams on Elastic Foundation (1946), ch. II: M = P/4β",
                "moment under the load, P = 10 kN [N·mm]", 10000.0 / (4 * beta), m, REL_HETENYI)


@_case
def case_hetenyi_finite_beam_moment() -> Case:
    """Moment at the centre of a free–free beam of βL = 2 on springs."""
    lam, p = 2.0, 10000.0
    m, beta = _hetenyi(lambda b: (lam / b - 0.2) / 2)
    ref = p / (4 * beta) * (math.cosh(lam) - math.cos(lam)) / (math.sinh(lam) + math.sin(lam))
    return Case("mechanics", "hetenyi_finite_beam_moment",
                "Hetényi (1946), ch. V, free ends, central load (from memory; checked by "
                "tests/verification against a BVP solve)",
                "central moment, βL = 2 [N·mm]", ref, m, REL_HETENYI)


@_case
def case_circle_shape_factor() -> Case:
    """Fully plastic moment of a solid circle over its first-yield moment."""
    from plyshear.mechanics.section import BoltSteel, moment_curvature, yield_moment

    d = 20.0
    steel = BoltSteel(model="elastic-plastic", E=210000.0, fy=640.0, fu=800.0, eu=0.12)
    kappa = 1000.0 * 2 * steel.ey / d
    m, _ = moment_curvature(steel, np.array([kappa]), np.array([d]))
    return Case("mechanics", "circle_shape_factor",
                "from memory: Neal, The Plastic Methods of Structural Analysis, ch. 1: "
                "Mp/My = 16/3π",
                "M(κ = 1000 κ_y)/M_y [-]", 16 / (3 * math.pi),
                float(m[0] / yield_moment(steel.fy, d)), REL_SHAPE_FACTOR)


def _clevis(a: float, b: float, c: float, extra: str = "") -> str:
    """A stiff pin in a symmetric clevis on soft bearing (uniform bearing)."""
    soft = "fy = 355\nfu = 490\nfoundation_modulus = 50.0\n"
    return ('format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 40\ngrade = "8.8"\n'
            'threads = "excluded"\n'
            + _ply("outer-1", "clevis", a, soft)
            + _ply("lug", "lug", b, soft + f"gap = {c}\n")
            + _ply("outer-2", "clevis", a, soft + f"gap = {c}\n")
            + "[member.clevis]\nsupport = true\n[member.lug]\nload = 100000.0\n" + extra)


@_case
def case_clevis_plane_shear_statics() -> Case:
    """Each plane of a symmetric clevis carries half the load."""
    _, sol = _solve(_clevis(10.0, 20.0, 2.0))
    return Case("mechanics", "clevis_plane_shear_statics",
                "statics and symmetry: V = F/2 per plane",
                "plane 1 shear, F = 100 kN [N]", 50000.0, sol.bolts[0].planes[0].shear,
                REL_STATICS)


# --- AISC 360-22 --------------------------------------------------------------


@_case
def case_aisc_table_j3_2_fnv_group_a_n() -> Case:
    """Nominal shear stress, Group A, threads included."""
    from plyshear.codes import aisc360 as aisc

    return Case("AISC 360-22", "aisc_table_j3_2_fnv_group_a_n",
                "AISC 360-22 Table J3.2: Fnv = 54 ksi, Group A, threads included",
                "Fnv [MPa]", 54.0 * KSI, aisc.F_nv("A", threads_excluded=False), REL_ROUND_OFF)


@_case
def case_aisc_manual_7_1_three_quarter_a_n() -> Case:
    """Design shear of a 3/4 in Group A-N bolt in single shear."""
    from plyshear.codes import aisc360 as aisc

    rn = aisc.R_n_shear(aisc.F_nv("A", threads_excluded=False), math.pi / 4 * (0.75 * IN) ** 2)
    return Case("AISC 360-22", "aisc_manual_7_1_three_quarter_a_n",
                "from memory: AISC Manual Table 7-1, 3/4 in Group A-N, single shear "
                "φrn = 17.9 kips (J3.6, Eq. J3-1)",
                "φRn [kip]", 17.9, aisc.available(rn, "lrfd", 0.75, 2.00) / KIP, REL_PRINTED_3)


@_case
def case_aisc_j3_10_bearing() -> Case:
    """Nominal bearing of a 3/4 in bolt on a 1/2 in A36 plate."""
    from plyshear.codes import aisc360 as aisc

    rn = aisc.R_n_bearing(0.75 * IN, 0.5 * IN, 58.0 * KSI)
    return Case("AISC 360-22", "aisc_j3_10_bearing",
                "AISC 360-22 J3.10(a): Rn = 2.4 d t Fu (d = 3/4 in, t = 1/2 in, Fu = 58 ksi)",
                "Rn [kip]", 2.4 * 0.75 * 0.5 * 58.0, rn / KIP, REL_ROUND_OFF)


@_case
def case_aisc_j5_2_filler_factor() -> Case:
    """Filler factor of a 1/2 in filler, US form against the SI form the code uses."""
    from plyshear.codes import aisc360 as aisc

    return Case("AISC 360-22", "aisc_j5_2_filler_factor",
                "AISC 360-22 J5.2(b): 1 − 0.4(t − 0.25), t = 0.5 in (US form)",
                "filler factor [-]", 1 - 0.4 * (0.5 - 0.25), aisc.filler_factor(0.5 * IN),
                REL_PRINTED_3)


@_case
def case_aisc_long_joint() -> Case:
    """Shear reduction of a pattern longer than 38 in."""
    from plyshear.codes import aisc360 as aisc

    return Case("AISC 360-22", "aisc_long_joint",
                "AISC 360-22 J3.6 (from memory): Fnv × 0.833 beyond 38 in",
                "factor at 40 in [-]", 0.833, aisc.long_joint_factor(40 * IN), REL_ROUND_OFF)


def _d7(extra: str = "") -> str:
    """AISC Design Example D.7: 1/2 in A36 plate on a 1 in pin, in a clevis."""
    a36 = "fy = 36\nfu = 58\n"
    return ('format = 1\nunits = "kip-in"\n[bolt]\ndiameter = 1.0\ngrade = "A325"\n'
            'threads = "excluded"\n'
            + _ply("clevis-1", "clevis", 1.0, a36) + _ply("plate", "plate", 0.5, a36)
            + _ply("clevis-2", "clevis", 1.0, a36)
            + "[member.clevis]\nsupport = true\n[member.plate]\nload = 24.0\n"
            '[check]\nstandard = "aisc360-22"\nmethod = "lrfd"\nconnector = "pin"\n' + extra)


@_case
def case_aisc_example_d7_pin_bearing() -> Case:
    """Design Example D.7 end to end: model, solve, check, pin bearing."""
    item = _item(_d7(), "pin bearing", "ply plate")
    return Case("AISC 360-22", "aisc_example_d7_pin_bearing",
                "AISC Design Examples, Example D.7: φRn = 0.75 × 1.8 Fy Apb = 24.3 kips "
                "(J7, Eq. J7-1)",
                "pin bearing design strength [kip]", 24.3, item.capacity / KIP, REL_PRINTED_3)


@_case
def case_aisc_example_d7_demand() -> Case:
    """Design Example D.7 end to end: the solved bearing demand is the load."""
    item = _item(_d7(), "pin bearing", "ply plate")
    return Case("AISC 360-22", "aisc_example_d7_demand",
                "AISC Design Examples, Example D.7: Pu = 1.2(4) + 1.6(12) = 24.0 kips",
                "plate bearing demand [kip]", 24.0, item.demand / KIP, REL_STATICS)


def _filler_joint() -> str:
    """A 3/4 in A325-X bolt through a 1/2 in loose filler, three plies (kip-in)."""
    a36 = "fy = 36\nfu = 58\n"
    return ('format = 1\nunits = "kip-in"\n[bolt]\ndiameter = 0.75\ngrade = "A325"\n'
            'threads = "excluded"\n'
            + _ply("plate", "plate", 0.75, a36) + _ply("filler", None, 0.5, a36)
            + _ply("splice", "splice", 0.75, a36)
            + "[member.plate]\nsupport = true\n[member.splice]\nload = 10.0\n"
            '[check]\nstandard = "aisc360-22"\nmethod = "lrfd"\n')


@_case
def case_aisc_bolt_shear_through_filler() -> Case:
    """End to end: a plane bounding a 1/2 in filler, threads excluded."""
    item = _item(_filler_joint(), "bolt shear", "plane 1")
    ref = 0.75 * 68.0 * math.pi / 4 * 0.75**2 * (1 - 0.4 * (0.5 - 0.25))
    return Case("AISC 360-22", "aisc_bolt_shear_through_filler",
                "AISC 360-22 J3.6 Eq. J3-1, Table J3.2 (Fnv = 68 ksi, A-X), J5.2(b) filler: "
                "0.75 Fnv Ab [1 − 0.4(t − 0.25)]",
                "plane 1 design shear strength [kip]", ref, item.capacity / KIP, REL_PRINTED_3)


# --- EN 1993-1-8 ----------------------------------------------------------------


@_case
def case_en_table_3_4_m20_8_8_threads() -> Case:
    """Shear resistance per plane of an M20 8.8 through its threads."""
    from plyshear.codes import en1993_1_8 as en

    value = en.F_v_Rd(en.alpha_v("8.8", threads_in_plane=True), 800.0, 245.0) / 1000
    return Case("EN 1993-1-8", "en_table_3_4_m20_8_8_threads",
                "ArcelorMittal/SCI Orange Book, bolt resistances, M20 8.8: 94.1 kN "
                "(EN 1993-1-8 Table 3.4, As = 245 mm², ISO 898-1)",
                "Fv,Rd per plane [kN]", 94.1, value, REL_PRINTED_3)


@_case
def case_en_packing_beta_p() -> Case:
    """Packing factor for a 30 mm pack on an M20."""
    from plyshear.codes import en1993_1_8 as en

    return Case("EN 1993-1-8", "en_packing_beta_p",
                "EN 1993-1-8 3.6.1(12): βp = 9d/(8d + 3tp), d = 20, tp = 30 mm",
                "βp [-]", 9 * 20 / (8 * 20 + 3 * 30), en.beta_p(20.0, 30.0), REL_ROUND_OFF)


@_case
def case_en_long_joint_beta_lf() -> Case:
    """Long-joint factor at Lj = 30 d."""
    from plyshear.codes import en1993_1_8 as en

    return Case("EN 1993-1-8", "en_long_joint_beta_lf",
                "EN 1993-1-8 3.8(1): βLf = 1 − (Lj − 15d)/200d, Lj = 30 d",
                "βLf [-]", 1 - 15 / 200, en.beta_Lf(600.0, 20.0), REL_ROUND_OFF)


def _en_pack_joint() -> str:
    """An M20 8.8 through a 30 mm pack of S355 between two members (N-mm)."""
    s355 = 'steel = "S355"\n'
    return ('format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "8.8"\n'
            'threads = "excluded"\n'
            + _ply("chord", "chord", 15.0, s355 + "edge = 40\nwidth = 100\n")
            + _ply("pack", None, 30.0, s355)
            + _ply("cover", "cover", 15.0, s355 + "edge = 40\nwidth = 100\n")
            + "[member.chord]\nsupport = true\n[member.cover]\nload = 50000.0\n"
            '[check]\nstandard = "en1993-1-8"\n')


@_case
def case_en_shear_through_pack() -> Case:
    """End to end: the plane bounding a 30 mm pack, shank in the plane."""
    item = _item(_en_pack_joint(), "bolt shear", "plane 1")
    beta_p = 9 * 20 / (8 * 20 + 3 * 30)
    ref = beta_p * 0.6 * 800.0 * math.pi * 20**2 / 4 / 1.25
    return Case("EN 1993-1-8", "en_shear_through_pack",
                "EN 1993-1-8 Table 3.4 (αv = 0.6, shank, γM2 = 1.25) × 3.6.1(12) βp",
                "plane 1 Fv,Rd [N]", ref, item.capacity, REL_END_TO_END)


@_case
def case_en_bearing_end_bolt() -> Case:
    """End to end: bearing of a 15 mm S355 ply, e1 = 40, e2 = 50 mm, M20 8.8."""
    item = _item(_en_pack_joint(), "bearing", "ply chord")
    d0, fu = 22.0, 510.0  # EN 1090-2 normal hole d + 2; EN 10025-2 S355 fu (t ≤ 40 mm)
    alpha_b = min(40 / (3 * d0), 800.0 / fu, 1.0)
    k1 = min(2.8 * 50 / d0 - 1.7, 2.5)
    ref = k1 * alpha_b * fu * 20 * 15 / 1.25
    return Case("EN 1993-1-8", "en_bearing_end_bolt",
                "EN 1993-1-8 Table 3.4: Fb,Rd = k1 αb fu d t/γM2 (end bolt: αb = e1/3d0)",
                "ply chord Fb,Rd [N]", ref, item.capacity, REL_END_TO_END)


@_case
def case_en_table_3_10_pin_moment() -> Case:
    """Pin moment in a clevis against the formula of Figure 3.11."""
    a, b, c = 10.0, 20.0, 2.0
    _, sol = _solve(_clevis(a, b, c))
    return Case("EN 1993-1-8", "en_table_3_10_pin_moment",
                "EN 1993-1-8 3.13.2, Table 3.10 / Figure 3.11: M = F(b + 4c + 2a)/8",
                "largest pin moment, F = 100 kN [N·mm]", 100000.0 * (b + 4 * c + 2 * a) / 8,
                sol.bolts[0].max_moment, REL_PIN_FORMULA)


# --- capacity -------------------------------------------------------------------


def _johansen(t: tuple[float, ...], q: tuple[float, ...], my: float, double: bool) -> float:
    """The collapse LP of a dowel with given line strengths and constant My."""
    from plyshear.mechanics.collapse import collapse
    from plyshear.model.joint import Bolt, Joint, Member, Ply

    bolt = Bolt(diameter=20.0, grade="8.8", fyb=640.0, fub=800.0, stress_area=245.0,
                threads="excluded")
    owners = ("outer", "mid", "outer") if double else ("m1", "m2")
    plies = tuple(Ply(name=f"p{i}", member=m, thickness=ti, fy=355.0, fu=490.0)
                  for i, (m, ti) in enumerate(zip(owners, t, strict=True)))
    first, second = dict.fromkeys(owners)
    joint = Joint(bolt=bolt, plies=plies,
                  members=(Member(first, support=True), Member(second, load=(1000.0, 0.0))))
    result = collapse(joint, list(q), lambda z: np.full_like(z, my),
                      lambda z: np.full_like(z, np.inf))
    return result.load


def _en1995_single(t1: float, t2: float, q1: float, q2: float, my: float) -> dict[str, float]:
    """EN 1995-1-1 eq. (8.6) without 1.05, 1.15 and the rope effect (from memory)."""
    b, r = q2 / q1, t2 / t1
    return {
        "c": q1 * t1 / (1 + b) * (math.sqrt(b + 2 * b**2 * (1 + r + r**2) + b**3 * r**2)
                                  - b * (1 + r)),
        "f": math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1),
    }


@_case
def case_johansen_single_rotation() -> Case:
    """A stiff dowel rotating in two thin members (Johansen's mode c)."""
    t1, t2, q1, q2, my = 10.0, 12.0, 1000.0, 1500.0, 1e6
    return Case("capacity", "johansen_single_rotation",
                "Johansen (1949), from memory; EN 1995-1-1 eq. (8.6) mode (c), unmodified",
                "collapse load, single shear [N]", _en1995_single(t1, t2, q1, q2, my)["c"],
                _johansen((t1, t2), (q1, q2), my, False), REL_COLLAPSE)


@_case
def case_johansen_single_two_hinges() -> Case:
    """A slender dowel with a hinge in each member (Johansen's mode f)."""
    t1, t2, q1, q2, my = 40.0, 40.0, 1000.0, 1500.0, 2e4
    return Case("capacity", "johansen_single_two_hinges",
                "Johansen (1949), from memory; EN 1995-1-1 eq. (8.6) mode (f), unmodified",
                "collapse load, single shear [N]", _en1995_single(t1, t2, q1, q2, my)["f"],
                _johansen((t1, t2), (q1, q2), my, False), REL_COLLAPSE)


@_case
def case_johansen_double_four_hinges() -> Case:
    """Double shear with four hinges (Johansen's mode k), both planes."""
    t1, t2, q1, q2, my = 40.0, 60.0, 1000.0, 1500.0, 2e4
    b = q2 / q1
    ref = 2 * math.sqrt(2 * b / (1 + b)) * math.sqrt(2 * my * q1)
    return Case("capacity", "johansen_double_four_hinges",
                "Johansen (1949), from memory; EN 1995-1-1 eq. (8.7) mode (k) × 2, unmodified",
                "collapse load, double shear [N]", ref,
                _johansen((t1, t2, t1), (q1, q2, q1), my, True), REL_COLLAPSE)


def _alternating(planes: int, t: float, law: str = "component") -> str:
    """Plies alternating between two members, S355, an M20 10.9 pin (N-mm)."""
    body = ""
    for j in range(planes + 1):
        body += _ply(f"p{j}", "a" if j % 2 == 0 else "b", t, 'steel = "S355"\n')
    return ('format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "10.9"\n'
            'threads = "excluded"\n' + body
            + "[member.a]\nsupport = true\n[member.b]\nload = 10000.0\n"
            f'[analysis]\nbearing = "{law}"\n')


@_case
def case_shear_only_bound_alternating() -> Case:
    """Max-flow bound of an alternating stack with strong plies: every plane cut."""
    from plyshear.mechanics import loadpath, strengths

    joint = _model(_alternating(3, 40.0))
    s = strengths.strengths(joint)
    bound = loadpath.plastic_bound(joint, list(s.plane), list(s.ply_force))
    ref = 3 * 0.62 * 1000.0 * math.pi * 20**2 / 4
    return Case("capacity", "shear_only_bound_alternating",
                "Ford & Fulkerson (1956), min cut = 3 planes; Kulak, Fisher & Struik (1987) "
                "§4.2: 0.62 fub Ab per plane",
                "shear-only bound, 3 planes [N]", ref, bound.load, REL_ROUND_OFF)


def _thin_ply() -> str:
    """A 4 mm loaded ply between two thick held plies, M20 10.9 (N-mm)."""
    s355 = 'steel = "S355"\n'
    return ('format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "10.9"\n'
            'threads = "excluded"\n'
            + _ply("held-1", "held", 30.0, s355) + _ply("thin", "thin", 4.0, s355)
            + _ply("held-2", "held", 30.0, s355)
            + "[member.held]\nsupport = true\n[member.thin]\nload = 10000.0\n"
            '[analysis]\nbearing = "elastic-plastic"\nbolt = "elastic-plastic"\n')


@_case
def case_collapse_thin_ply() -> Case:
    """Collapse LP of a joint whose thin ply governs: its bearing strength."""
    from plyshear.mechanics import strengths
    from plyshear.mechanics.collapse import collapse

    joint = _model(_thin_ply())
    s = strengths.strengths(joint)
    lp = collapse(joint, list(s.bearing), s.moment, s.shear, list(s.net_section))
    return Case("capacity", "collapse_thin_ply",
                "AISC 360-22 J3.10(a)(1): 2.4 d t Fu of the thin ply (statics: it alone "
                "carries its member); EN 10025-2 S355 fu = 510 MPa",
                "collapse load [N]", 2.4 * 20 * 4 * 510.0, lp.load, REL_COLLAPSE)


@_case
def case_incremental_thin_ply() -> Case:
    """Incremental analysis of the same joint: it ends on the thin ply's plateau."""
    from plyshear.mechanics.incremental import analyse

    result = analyse(_model(_thin_ply()))
    return Case("capacity", "incremental_thin_ply",
                "AISC 360-22 J3.10(a)(1): 2.4 d t Fu, reached at the 1/4 in hole elongation "
                "(Commentary J3.10)",
                "nonlinear capacity [N]", 2.4 * 20 * 4 * 510.0, result.load, REL_PLATEAU)


# --- rows -------------------------------------------------------------------------


def _lap(ta: float, tb: float, positions: list[float] | None) -> str:
    """Two plies lapped on M20 8.8 bolts: ply a loaded before, ply b held after (N-mm)."""
    ply = 'steel = "S355"\nwidth = 60\n'
    pattern = f"[pattern]\npositions = {positions!r}\n" if positions else ""
    enters = ('enters = "before"\n', 'enters = "after"\n') if positions else ("", "")
    return ('format = 1\nunits = "N-mm"\n[bolt]\ndiameter = 20\ngrade = "8.8"\n'
            'threads = "excluded"\n' + pattern
            + _ply("a", "a", ta, ply) + _ply("b", "b", tb, ply)
            + f"[member.a]\nload = 100000.0\n{enters[0]}[member.b]\nsupport = true\n{enters[1]}")


def _bolt_spring(ta: float, tb: float) -> float:
    """The slip stiffness of one bolt of the lap, N/mm: load over the member's slip."""
    joint, sol = _solve(_lap(ta, tb, None))
    a = [m.name for m in joint.members].index("a")
    slip = next(m.displacement_xy[0] for m in sol.members if m.member == a)
    return 100000.0 / slip


def _row_shares(ta: float, tb: float, n: int) -> np.ndarray:
    """plyshear's bolt shares of the lap with n bolts at 70 mm pitch, N."""
    _, sol = _solve(_lap(ta, tb, [70.0 * i for i in range(n)]))
    return np.array([b.plies[0].force for b in sol.bolts])


def compatibility_shares(k: float, pitch: float, ea_a: float, ea_b: float, load: float,
                         n: int) -> np.ndarray:
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


@_case
def case_row_two_bolts_unequal() -> Case:
    """Two bolts, plates 10 and 20 mm: the closed form of the first bolt's share."""
    e, w, p, load = 210000.0, 60.0, 70.0, 100000.0
    k = _bolt_spring(10.0, 20.0)
    fa, fb = p / (e * 10 * w), p / (e * 20 * w)
    ref = load * (1 / k + fa) / (2 / k + fa + fb)
    return Case("rows", "row_two_bolts_unequal",
                "compatibility of a two-bolt lap (from memory: Tate & Rosenfeld 1946): "
                "R1 = P(1/k + p/EAa)/(2/k + p/EAa + p/EAb)",
                "bolt 1 share, plates 10/20 mm [N]", ref, _row_shares(10.0, 20.0, 2)[0],
                REL_STATICS)


@_case
def case_row_three_bolts_equal() -> Case:
    """Three bolts, equal plates: the end bolts' share P(1 + α)/(3 + 2α)."""
    e, w, p, load = 210000.0, 60.0, 70.0, 100000.0
    alpha = _bolt_spring(12.0, 12.0) * p / (e * 12 * w)
    return Case("rows", "row_three_bolts_equal",
                "compatibility of a three-bolt lap, equal plates (from memory: Tate & "
                "Rosenfeld 1946): R1 = R3 = P(1 + α)/(3 + 2α), α = kp/EA",
                "bolt 1 share, plates 12/12 mm [N]", load * (1 + alpha) / (3 + 2 * alpha),
                _row_shares(12.0, 12.0, 3)[0], REL_STATICS)


@_case
def case_row_three_bolts_unequal() -> Case:
    """Three bolts, plates 8 and 24 mm: the middle bolt by the compatibility equations."""
    e, w, p = 210000.0, 60.0, 70.0
    k = _bolt_spring(8.0, 24.0)
    ref = compatibility_shares(k, p, e * 8 * w, e * 24 * w, 100000.0, 3)[1]
    return Case("rows", "row_three_bolts_unequal",
                "compatibility of a three-bolt lap (from memory: Tate & Rosenfeld 1946), "
                "solved as three linear equations",
                "bolt 2 share, plates 8/24 mm [N]", ref, _row_shares(8.0, 24.0, 3)[1],
                REL_STATICS)


# --- the document -------------------------------------------------------------------

HEADER = "<!-- generated by `python -m plyshear.verify`; do not edit -->"


def verification_modules(root: Path) -> list[tuple[str, str]]:
    """The verification test modules on disk: (path, first line of the docstring)."""
    folder = root / "tests" / "verification"
    out = []
    for path in sorted(folder.glob("test_*.py")):
        doc = ast.get_docstring(ast.parse(path.read_text(encoding="utf-8"))) or ""
        out.append((path.relative_to(root).as_posix(), doc.strip().splitlines()[0] if doc
                    else ""))
    return out


def _num(x: float) -> str:
    return f"{x:.6g}"


def render(cases: list[Case], modules: list[tuple[str, str]]) -> str:
    """The Markdown of docs/verification.md."""
    lines = [HEADER, "", "# Verification", "",
             "Every row is a case of `plyshear/verify.py`: plyshear's value against a value "
             "from outside the project, with the tolerance it must meet. The test suite runs "
             "the same cases (`tests/test_verify.py`) and fails when this page is stale; "
             "regenerate it with `python -m plyshear.verify`. Sources are listed in "
             "[references.md](references.md); the method is in [theory.md](theory.md).", "",
             f"{sum(c.passes for c in cases)} of {len(cases)} cases pass.", ""]
    for group in GROUPS:
        rows = [c for c in cases if c.group == group]
        if not rows:
            continue
        lines += [f"## {group}", "",
                  "| case | source | quantity | reference | plyshear | ratio | tolerance "
                  "| pass |",
                  "|---|---|---|---:|---:|---:|---:|---|"]
        lines += [f"| `{c.name}` | {c.source} | {c.quantity} | {_num(c.reference)} | "
                  f"{_num(c.value)} | {c.ratio:.5f} | {c.tol:.0e} | "
                  f"{'yes' if c.passes else '**NO**'} |" for c in rows]
        lines.append("")
    lines += ["## The verification test modules", "",
              "Beyond these cases, each module below checks one published source in more "
              "depth (its docstring gives the full reference):", "",
              "| module | subject |", "|---|---|"]
    lines += [f"| `{path}` | {subject} |" for path, subject in modules]
    return "\n".join(lines) + "\n"


def document(root: Path) -> str:
    """The document for the repository at ``root``."""
    return render(run_all(), verification_modules(root))


def main(argv: list[str] | None = None) -> int:
    """Write (or with ``--check`` compare) docs/verification.md; exit 1 if a case fails."""
    parser = argparse.ArgumentParser(prog="python -m plyshear.verify",
                                     description="Run the verification cases and write "
                                                 "docs/verification.md.")
    parser.add_argument("--root", type=Path, default=Path("."),
                        help="the repository's root (default: the current folder)")
    parser.add_argument("--check", action="store_true",
                        help="do not write; exit 1 if the committed document is stale")
    args = parser.parse_args(argv)
    target = args.root / "docs" / "verification.md"
    if not (args.root / "tests" / "verification").is_dir():
        print(f"error: {args.root}: not a plyshear repository (no tests/verification)",
              file=sys.stderr)
        return 2
    text = document(args.root)
    failing = [c.name for c in run_all() if not c.passes]
    if args.check:
        current = target.read_text(encoding="utf-8") if target.exists() else ""
        if current != text:
            print(f"{target}: stale; run python -m plyshear.verify", file=sys.stderr)
            return 1
    else:
        if target.exists() and not target.read_text(encoding="utf-8").startswith(HEADER):
            print(f"error: {target}: exists and was not generated; not replaced",
                  file=sys.stderr)
            return 2
        tmp = target.with_suffix(".md.tmp")
        tmp.write_text(text, encoding="utf-8")
        tmp.replace(target)
        print(f"wrote {target}: {len(run_all())} cases, {len(failing)} failing")
    return 1 if failing else 0


if __name__ == "__main__":
    sys.exit(main())
