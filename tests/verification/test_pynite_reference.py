"""plyshear against the same beam-on-springs model built in a general FE library.

Reference:
    PyNiteFEA (``Pynite``), a general-purpose 3D frame finite-element library
    (D. Craig Brown et al., https://github.com/JWock82/Pynite, PyPI
    ``PyNiteFEA``), used here only as an independent solver. Its frame member is
    the Euler–Bernoulli element (no shear deformation), so plyshear runs with
    ``[analysis] beam = "euler-bernoulli"``.

The PyNite model, built from the same ply data as the model file:

* The bolt is one physical member along global X (z of plyshear = X), with
  nodes on every ply face, ``N_PYNITE`` elements in each ply and two in each
  gap (no load acts there; the element is exact). Bending is in the X–Y plane:
  the load acts along global Y (plyshear's x); the head node is restrained in
  DX, DZ, RX and RY, which holds the unloaded out-of-plane and axial motions.
* Each bearing body (a member whose plies are rigidly tied to it, a filler, or
  an elastically linked ply) is one node at Y = H_FAR, far out along the load
  direction. Every bolt node inside a ply gets a spring (``add_spring``) to
  that ply's body node with the lumped stiffness ks = k × tributary length
  (half of each adjacent element in the ply). The springs are axial, so they
  act along the line joining their nodes: at H_FAR = 1e7 mm that line departs
  from Y by at most grip/H_FAR ≈ 1e-5 rad, a stiffness error below 1e-10. The
  small X components load the bolt axially, which does not couple back into
  bending (second order in that angle).
* Body nodes: supported members fully fixed; loaded members and fillers free in
  DY only, loaded members with the nodal load. An elastically linked ply's node
  connects to its member's node (further out, at the same X, so the link is
  exactly along Y) by a spring of stiffness ``link_stiffness``.

plyshear integrates a consistent foundation, PyNite sums lumped springs; both
converge with refinement to the same continuum answer (checked by
:func:`test_meshes_are_converged`).

Signs: plyshear's load along +x maps to PyNite's +Y. plyshear's plane shear is
V = the force that the plies on the head side receive from the bolt; from
PyNite it is the sum, over the plies on the head side of the plane, of the
spring forces on their bodies: a spring's ``axial()`` is its end force at the
i (bolt) node along i → j, which is also the force the spring puts on the j
(body) node along i → j, i.e. the bolt's push on the ply. PyNite's segment
moment is M(x) = M1 − V1·x (``BeamSegZ.moment``) with its member shear
``shear("Fy")`` = V1 of the opposite sign to plyshear's V, so for this member
(along +X, bending about Z) ``moment("Mz")`` has plyshear's sign:
M_x = +Mz (:data:`MZ_SIGN`; both are zero at the free head).
"""

import math
from dataclasses import dataclass
from functools import cache

import numpy as np
import pytest

import plyshear
from plyshear.mechanics.results import Solution
from plyshear.model.modelfile import loads

pynite = pytest.importorskip("Pynite")

# Halving either mesh changes the results by < 0.1 % (test_meshes_are_converged);
# 0.5 % allows for the remaining discretisation difference between a lumped and
# a consistent foundation (measured ≤ 2e-4).
REL_FE_REFERENCE = 5e-3
# DESIGN.md's convergence criterion: doubling the mesh changes results by < 0.1 %.
REL_CONVERGED = 1e-3

D = 20.0  # mm
E = 210000.0  # MPa
NU = 0.3
N_PLYSHEAR = 40  # elements per ply and gap
N_PYNITE = 48
H_FAR = 1.0e7  # mm, lateral offset of the body nodes
MZ_SIGN = 1.0  # plyshear M_x = MZ_SIGN × PyNite Mz (see the module docstring)
COMBO = "Combo 1"


@dataclass(frozen=True)
class P:
    """One ply of a test stack (mm, MPa, N/mm)."""

    name: str
    member: str | None
    t: float
    k: float
    gap: float = 0.0
    link: float | None = None


# (a) a fork with three legs (supported) and a lug with two plies (loaded)
FORK_5 = (
    [
        P("leg 1", "fork", 8.0, 2.2e4),
        P("lug 1", "lug", 12.0, 2.6e4),
        P("leg 2", "fork", 20.0, 3.0e4),
        P("lug 2", "lug", 14.0, 2.6e4),
        P("leg 3", "fork", 10.0, 2.4e4),
    ],
    {"fork": None, "lug": 30000.0},
)
# (b) asymmetric: a loose filler between the main plate and the loaded plate
FILLER = (
    [
        P("main", "main", 12.0, 2.5e4),
        P("filler", None, 6.0, 1.5e4),
        P("lapped", "load", 20.0, 3.0e4),
        P("cover", "main", 8.0, 2.0e4, gap=2.0),
    ],
    {"main": None, "load": 25000.0},
)
# (c) elastic links, to a supported and to a loaded member
LINKED = (
    [
        P("leg 1", "fork", 10.0, 2.5e4),
        P("lug 1", "lug", 15.0, 2.8e4),
        P("leg 2", "fork", 12.0, 2.5e4, link=6.0e4),
        P("lug 2", "lug", 15.0, 2.8e4, link=9.0e4),
        P("leg 3", "fork", 10.0, 2.5e4),
    ],
    {"fork": None, "lug": 20000.0},
)
# member name -> None for a support, else the load along plyshear x / PyNite +Y
Stack = tuple[list[P], dict[str, float | None]]
STACKS: dict[str, Stack] = {
    "five-ply fork and lug": FORK_5,
    "filler": FILLER,
    "elastic links": LINKED,
}


def _model_text(stack: Stack, elements: int) -> str:
    plies, members = stack
    text = f'format = 1\nunits = "N-mm"\n[bolt]\ndiameter = {D}\ngrade = "8.8"\n'
    text += f'threads = "excluded"\nE = {E}\npoisson = {NU}\n'
    for p in plies:
        text += (
            f'[[ply]]\nname = "{p.name}"\nthickness = {p.t!r}\ngap = {p.gap!r}\n'
            f"fy = 355\nfu = 490\nfoundation_modulus = {p.k!r}\n"
        )
        if p.member is not None:
            text += f'member = "{p.member}"\n'
        if p.link is not None:
            text += f"link_stiffness = {p.link!r}\n"
    for name, load in members.items():
        text += f"[member.{name}]\n" + ("support = true\n" if load is None else f"load = {load}\n")
    text += f'[analysis]\nbeam = "euler-bernoulli"\nelements_per_ply = {elements}\n'
    return text


@cache
def _plyshear(name: str, elements: int = N_PLYSHEAR) -> Solution:
    return plyshear.solve(loads(_model_text(STACKS[name], elements)))


@dataclass(frozen=True)
class Reference:
    """PyNite's answer: signed plane shears and moments (plyshear's signs), max |M|."""

    shear: np.ndarray
    moment: np.ndarray
    max_moment: float


@cache
def _pynite(name: str, elements: int = N_PYNITE) -> Reference:
    from Pynite import FEModel3D

    plies, members = STACKS[name]
    # Bolt nodes: on every ply face, ``elements`` elements in every ply.
    z = [0.0]
    owner: list[int] = []  # ply of each element, −1 in a gap
    planes: list[float] = []
    for j, p in enumerate(plies):
        if p.gap > 0.0:
            # No load acts in a gap, where the beam element is exact: two
            # elements put a node at the middle (and keep PyNite's residual-based
            # stability check clear of very short elements).
            z += list(z[-1] + np.linspace(0.0, p.gap, 3)[1:])
            owner += [-1] * 2
            if j > 0:
                planes.append(z[-1] - p.gap / 2.0)
        elif j > 0:
            planes.append(z[-1])
        z += list(z[-1] + np.linspace(0.0, p.t, elements + 1)[1:])
        owner += [j] * elements
    zs = np.array(z)
    h = np.diff(zs)

    m = FEModel3D()
    m.add_material("steel", E, E / (2.0 * (1.0 + NU)), NU, 7.85e-9)
    inertia = math.pi * D**4 / 64.0
    m.add_section("bolt", math.pi * D**2 / 4.0, inertia, inertia, 2.0 * inertia)
    for i, x in enumerate(zs):
        m.add_node(f"b{i}", float(x), 0.0, 0.0)
    # Out of plane, the unloaded bolt is a cantilever from its head node (DZ, RY),
    # held axially (DX) and in torsion (RX) there; DY and RZ stay free everywhere.
    m.def_support("b0", True, False, True, True, True, False)
    m.add_member("bolt", "b0", f"b{zs.size - 1}", "steel", "bolt")

    # Body nodes: one per member, plus one per filler or linked ply.
    x_mid = float(zs[-1] / 2.0)
    body: dict[int, str] = {}
    for name, load in members.items():
        m.add_node(f"m:{name}", x_mid, 2.0 * H_FAR, 0.0)
        m.def_support(f"m:{name}", True, load is None, True, True, True, True)
        if load is not None:
            m.add_node_load(f"m:{name}", "FY", load)
    for j, p in enumerate(plies):
        if p.member is None or p.link is not None:
            m.add_node(f"p:{j}", x_mid, H_FAR, 0.0)
            m.def_support(f"p:{j}", True, False, True, True, True, True)
            body[j] = f"p:{j}"
            if p.link is not None:
                m.add_spring(f"link:{j}", f"p:{j}", f"m:{p.member}", p.link)
        else:
            body[j] = f"m:{p.member}"
    springs: dict[int, list[str]] = {j: [] for j in range(len(plies))}
    for i in range(zs.size):
        for j, p in enumerate(plies):
            trib = sum(h[e] / 2.0 for e in (i - 1, i) if 0 <= e < h.size and owner[e] == j)
            if trib > 0.0:
                name = f"s{i}:{j}"
                m.add_spring(name, f"b{i}", body[j], p.k * trib)
                springs[j].append(name)
    m.add_load_combo(COMBO, {"Case 1": 1.0})
    m.analyze_linear(check_statics=False)

    def push_on_ply(j: int) -> float:
        total = 0.0
        for name in springs[j]:
            s = m.springs[name]
            e_y = (s.j_node.Y - s.i_node.Y) / s.L()
            total += s.axial(COMBO) * e_y
        return total

    bearing = np.array([push_on_ply(j) for j in range(len(plies))])
    n_planes = len(planes)
    shear = np.cumsum(bearing)[:n_planes]
    bolt = m.members["bolt"]
    moment = np.array([MZ_SIGN * bolt.moment("Mz", zp, COMBO) for zp in planes])
    m_nodes = [abs(bolt.moment("Mz", float(x), COMBO)) for x in zs]
    return Reference(shear=shear, moment=moment, max_moment=float(max(m_nodes)))


@pytest.mark.parametrize("stack", list(STACKS))
def test_plane_shears_match_pynite(stack: str) -> None:
    sol = _plyshear(stack)
    ref = _pynite(stack)
    # PyNiteFEA, same beam on lumped springs: signed plane shears (x ↔ Y)
    planes = sol.first_bolt_planes
    assert [p.shear_xy[0] for p in planes] == pytest.approx(ref.shear, rel=REL_FE_REFERENCE)
    assert [p.shear for p in planes] == pytest.approx(np.abs(ref.shear), rel=REL_FE_REFERENCE)


@pytest.mark.parametrize("stack", list(STACKS))
def test_moments_match_pynite(stack: str) -> None:
    sol = _plyshear(stack)
    ref = _pynite(stack)
    # PyNiteFEA, same beam on lumped springs: largest bolt moment
    assert sol.bolts[0].max_moment == pytest.approx(ref.max_moment, rel=REL_FE_REFERENCE)
    # PyNiteFEA: signed moments at the planes, relative to the largest moment
    # (a plane moment may be near zero, where a relative error means nothing)
    scale = ref.max_moment
    got = np.array([p.moment_xy[0] for p in sol.first_bolt_planes]) / scale
    assert got == pytest.approx(ref.moment / scale, abs=REL_FE_REFERENCE)


@pytest.mark.parametrize("stack", list(STACKS))
def test_meshes_are_converged(stack: str) -> None:
    coarse, fine = _plyshear(stack, N_PLYSHEAR // 2), _plyshear(stack)
    assert fine.first_bolt_shears() == pytest.approx(coarse.first_bolt_shears(), rel=REL_CONVERGED)
    assert fine.bolts[0].max_moment == pytest.approx(coarse.bolts[0].max_moment, rel=REL_CONVERGED)
    ref_coarse, ref_fine = _pynite(stack, N_PYNITE // 2), _pynite(stack)
    assert ref_fine.shear == pytest.approx(ref_coarse.shear, rel=REL_CONVERGED)
    assert ref_fine.max_moment == pytest.approx(ref_coarse.max_moment, rel=REL_CONVERGED)
