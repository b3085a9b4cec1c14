"""Mesh, degree-of-freedom numbering and the global system of a joint.

A joint has one bolt at each station of its row (one station for a single
bolt). Every bolt is meshed along z with nodes on every ply face, every thread
start and the middle of every gap. Unknowns, station by station:

* bolt DOFs ``(w, θ)`` per node, in z order;
* each ply's own displacement at the station, numbered right after the last
  node inside the ply, so it couples to a contiguous stretch; except where the
  ply shares its member's displacement (rigidly tied, at the station where the
  member's force enters);

then one displacement per free (not supported) member, numbered last.

The first group forms a banded symmetric block ``A`` (a ply segment between two
stations couples DOFs one station apart); the member DOFs form a small border
(``B``, ``C``). Supported members are held at zero and are not unknowns. For
linear laws the x and y directions use the same matrix.
"""

from __future__ import annotations

import functools
from dataclasses import dataclass

import numpy as np

from plyshear.mechanics import beam, bearing
from plyshear.model.joint import Joint

FIXED = -1  # DOF index of a displacement held at zero
MAX_BAND_ENTRIES = 50_000_000  # 400 MB of banded storage: refuse larger systems


@dataclass(frozen=True)
class Mesh:
    """The bolt mesh.

    Attributes:
        z: Node coordinates, mm, shape (nn,).
        ply: Ply index (0-based) of each element, −1 in gaps, shape (ne,).
        threaded: Whether each element lies in the threaded length.
        plane_nodes: Node index of each shear plane (between consecutive plies).
    """

    z: np.ndarray
    ply: np.ndarray
    threaded: np.ndarray
    plane_nodes: np.ndarray

    @property
    def lengths(self) -> np.ndarray:
        """Element lengths, mm."""
        return np.diff(self.z)


#: Shortest element, as a fraction of the bolt diameter. Thin plies and narrow gaps
#: get fewer elements than ``elements_per_ply`` so that no element is shorter: a very
#: short element is far stiffer (12EI/h³) than its bearing (k·h), and the system's
#: condition number grows as 1/h⁴. Within a ply this thin the bolt is straight anyway.
MIN_ELEMENT_FRACTION = 1.0 / 40.0


def build_mesh(joint: Joint) -> Mesh:
    """Mesh the bolt through the stack of ``joint``.

    Every ply and every gap gets ``elements_per_ply`` equal elements, fewer where
    they would be shorter than :data:`MIN_ELEMENT_FRACTION` of the diameter.
    """
    n = joint.analysis.elements_per_ply
    h_min = MIN_ELEMENT_FRACTION * joint.bolt.diameter
    starts = joint.ply_starts()
    bolt = joint.bolt
    thread_z = bolt.thread_start if bolt.threads == "auto" else None
    pieces: list[np.ndarray] = []
    plies: list[np.ndarray] = []
    plane_at: list[float] = []
    prev_end = 0.0
    for j, ply in enumerate(joint.plies):
        z0, z1 = float(starts[j]), float(starts[j] + ply.thickness)
        if ply.gap > 0:
            m = _count(n, z0 - prev_end, h_min)
            m = 2 * ((m + 1) // 2)  # even, so the middle of the gap is a node
            seg = _segment(prev_end, z0, m, thread_z)
            pieces.append(seg[:-1])
            plies.append(np.full(seg.size - 1, -1))
            if j > 0:
                plane_at.append(0.5 * (prev_end + z0))
        elif j > 0:
            plane_at.append(z0)
        seg = _segment(z0, z1, _count(n, ply.thickness, h_min), thread_z)
        pieces.append(seg[:-1])
        plies.append(np.full(seg.size - 1, j))
        prev_end = z1
    z = np.concatenate([*pieces, [prev_end]])
    ply_of = np.concatenate(plies)
    mid = 0.5 * (z[:-1] + z[1:])
    threaded = bolt.threaded_along(mid)
    plane_nodes = np.argmin(np.abs(z[:, None] - np.array(plane_at)[None, :]), axis=0) \
        if plane_at else np.zeros(0, dtype=int)
    return Mesh(z=z, ply=ply_of, threaded=threaded, plane_nodes=plane_nodes)


def _count(n: int, length: float, h_min: float) -> int:
    """Return n, or fewer elements so that none is shorter than ``h_min`` (at least 1)."""
    return max(1, min(n, int(length / h_min * (1 + 1e-9))))  # no ulp-sized jumps


def _segment(a: float, b: float, n: int, split: float | None) -> np.ndarray:
    """Return n equal elements on [a, b] (nodes), split at ``split`` if it is inside."""
    if split is not None and a + 1e-9 < split < b - 1e-9:
        frac = (split - a) / (b - a)
        n1 = max(1, int(np.ceil(n * frac)))
        n2 = max(1, int(np.ceil(n * (1 - frac))))
        return np.concatenate([_nodes(a, split, n1)[:-1], _nodes(split, b, n2)])
    return _nodes(a, b, n)


@functools.lru_cache(maxsize=256)
def _fractions(n: int) -> np.ndarray:
    f = np.arange(n + 1) / n
    f.flags.writeable = False
    return f


def _nodes(a: float, b: float, n: int) -> np.ndarray:
    """N + 1 equally spaced nodes from a to b, both ends exact (as numpy.linspace)."""
    z = a + (b - a) * _fractions(n)
    z[-1] = b
    return z


Endpoint = tuple[str, int]  # ("a", index in A) | ("m", member DOF) | ("0", member index)


@dataclass(frozen=True)
class Spring:
    """A linear spring between two displacements (a link or a ply segment).

    Attributes:
        a, b: The endpoints: ``("a", i)`` an unknown of ``A``, ``("m", i)`` a free
            member DOF, ``("0", m)`` a displacement held by supported member m.
        k: Stiffness, N/mm.
        ply: The ply it belongs to.
        segment: For a ply segment between stations s and s+1, s; else −1.
    """

    a: Endpoint
    b: Endpoint
    k: float
    ply: int
    segment: int = -1


@dataclass(frozen=True)
class Layout:
    """The numbering of a joint's unknowns and the law-independent parts of its system.

    A joint has one bolt per station; every bolt is meshed alike. Element
    arrays run station by station (``S·ne`` rows).

    Attributes:
        mesh: The mesh of one bolt.
        stations: Bolt positions along x, mm.
        na: Number of unknowns in the banded block ``A`` (bolt and own ply DOFs).
        nm: Number of free-member unknowns (the border).
        bw: Upper bandwidth of ``A``.
        bolt_dof: Index into ``A`` of (w, θ) per station and node, FIXED where
            restrained, shape (S, nn, 2).
        edofs: The four ``A`` indices of each element, shape (S·ne, 4).
        target: For each station and ply, what the ply bears against there:
            ("a", i) its own DOF in A, ("m", i) a free member DOF, or ("0", m)
            held by supported member m.
        el_ply: Ply index of each element (−1 in gaps), shape (S·ne,).
        tgt_kind, tgt_idx: ``target`` per element ("-" and FIXED in gaps).
        member_dof: Free-member DOF index per member, FIXED for supported ones.
        springs: Links and ply segments.
        loads: Member loads on the border, shape (nm, 2) (x and y).
        kel: Beam stiffness of each element, shape (S·ne, 4, 4).
        phi: Φ of each element.
    """

    mesh: Mesh
    stations: np.ndarray
    na: int
    nm: int
    bw: int
    bolt_dof: np.ndarray
    edofs: np.ndarray
    target: tuple[tuple[Endpoint, ...], ...]
    el_ply: np.ndarray
    tgt_kind: np.ndarray
    tgt_idx: np.ndarray
    member_dof: np.ndarray
    springs: tuple[Spring, ...]
    loads: np.ndarray
    kel: np.ndarray
    phi: np.ndarray

    @property
    def ne(self) -> int:
        """Elements of one bolt."""
        return self.mesh.ply.size

    def station_slice(self, s: int) -> slice:
        """The element rows of station s."""
        return slice(s * self.ne, (s + 1) * self.ne)


@dataclass(frozen=True)
class System:
    """The assembled linear system of one bolt.

    Attributes:
        layout: The numbering.
        ab: Upper banded storage of block ``A``, shape (bw + 1, na), for
            :func:`scipy.linalg.cholesky_banded`.
        B: Coupling of ``A`` DOFs to the free member DOFs, shape (na, nm).
        C: Member–member block, shape (nm, nm).
        k: Foundation modulus per ply, MPa.
        kbb, kbu: Element foundation matrices, kept for the results.
    """

    layout: Layout
    ab: np.ndarray
    B: np.ndarray
    C: np.ndarray
    k: np.ndarray
    kbb: np.ndarray
    kbu: np.ndarray

    @property
    def mesh(self) -> Mesh:
        """The mesh."""
        return self.layout.mesh

    @property
    def loads(self) -> np.ndarray:
        """Member loads on the border, shape (nm, 2)."""
        return self.layout.loads


def section(joint: Joint, mesh: Mesh) -> tuple[np.ndarray, np.ndarray]:
    """Return EI (N·mm²) and Φ of every element from the bolt geometry."""
    bolt = joint.bolt
    d_thread = float(np.sqrt(4.0 * bolt.stress_area / np.pi))
    d = np.where(mesh.threaded, d_thread, bolt.diameter)
    area, inertia = beam.circle_properties(d)
    EI = bolt.E * inertia
    if joint.analysis.beam == "euler-bernoulli":
        return EI, np.zeros_like(EI)
    G = bolt.E / (2.0 * (1.0 + bolt.poisson))
    kGA = beam.shear_coefficient_circle(bolt.poisson) * G * area
    return EI, beam.phi_shear(EI, kGA, mesh.lengths)


def ply_moduli(joint: Joint) -> np.ndarray:
    """Return the linear foundation modulus of every ply, MPa."""
    return np.array([bearing.modulus(joint.analysis.bearing, joint.bolt, p)
                     for p in joint.plies])


def entry_station(joint: Joint, member: str, stations: int) -> int:
    """The station where a member's force enters its plies."""
    return 0 if joint.member(member).enters == "before" else stations - 1


def spring_stiffness(joint: Joint, ply: int, segment: int) -> float:
    """The stiffness of a ply's link (``segment`` −1) or of its segment after station s, N/mm."""
    p = joint.plies[ply]
    if segment < 0:
        assert p.link_stiffness is not None
        return p.link_stiffness
    assert p.width is not None
    xs = joint.stations
    return p.E * p.thickness * p.width / (xs[segment + 1] - xs[segment])


def layout(joint: Joint, mesh: Mesh | None = None) -> Layout:
    """Number the unknowns of ``joint`` and compute the beam stiffness.

    Args:
        joint: The joint.
        mesh: A mesh of one bolt to reuse; built from the joint when omitted.

    Returns:
        The :class:`Layout`.
    """
    mesh = mesh or build_mesh(joint)
    nn = mesh.z.size
    ne = nn - 1
    nplies = len(joint.plies)
    members = joint.members
    midx = joint.member_index()
    xs = np.asarray(joint.stations, dtype=float)
    ns = xs.size

    member_dof = np.full(len(members), FIXED)
    nm = 0
    for i, m in enumerate(members):
        if not m.support:
            member_dof[i] = nm
            nm += 1

    def tied(j: int, s: int) -> bool:
        """True where ply j shares its member's displacement at station s."""
        ply = joint.plies[j]
        return (ply.member is not None and ply.link_stiffness is None
                and s == entry_station(joint, ply.member, ns))

    # Numbering of A, station by station: bolt DOFs by node; a ply's own DOF
    # right after the last node inside it.
    own_after: dict[int, list[int]] = {}
    for j in range(nplies):
        last_node = int(np.nonzero(mesh.ply == j)[0][-1]) + 1
        own_after.setdefault(last_node, []).append(j)
    bolt_dof = np.empty((ns, nn, 2), dtype=int)
    target: list[list[Endpoint]] = [[("0", FIXED)] * nplies for _ in range(ns)]
    next_dof = 0
    for s in range(ns):
        for node in range(nn):
            bolt_dof[s, node] = (next_dof, next_dof + 1)
            next_dof += 2
            for j in own_after.get(node, []):
                if not tied(j, s):
                    target[s][j] = ("a", next_dof)
                    next_dof += 1
    if joint.bolt.ends == "clamped":
        bolt_dof, target, next_dof = _drop_rotations(bolt_dof, target, next_dof)
    for s in range(ns):
        for j, ply in enumerate(joint.plies):
            if tied(j, s):
                assert ply.member is not None
                i = midx[ply.member]
                target[s][j] = ("m", int(member_dof[i])) if member_dof[i] != FIXED else ("0", i)

    springs: list[Spring] = []
    for j, ply in enumerate(joint.plies):
        if ply.link_stiffness is not None and ply.member is not None:
            i = midx[ply.member]
            s = entry_station(joint, ply.member, ns)
            other: Endpoint = ("m", int(member_dof[i])) if member_dof[i] != FIXED else ("0", i)
            springs.append(Spring(target[s][j], other, spring_stiffness(joint, j, -1), j))
        for s in range(ns - 1):
            springs.append(Spring(target[s][j], target[s + 1][j],
                                  spring_stiffness(joint, j, s), j, s))

    el_ply = np.tile(mesh.ply, ns)
    edofs = np.concatenate([np.concatenate([bolt_dof[s, :-1], bolt_dof[s, 1:]], axis=1)
                            for s in range(ns)])
    station_of = np.repeat(np.arange(ns), ne)
    tgt_kind = np.array([target[s][j][0] if j >= 0 else "-"
                         for s, j in zip(station_of, el_ply, strict=True)])
    tgt_idx = np.array([target[s][j][1] if j >= 0 and target[s][j][0] != "0" else FIXED
                        for s, j in zip(station_of, el_ply, strict=True)])
    bw = max(_element_bandwidth(edofs), _own_bandwidth(edofs, tgt_kind, tgt_idx),
             _spring_bandwidth(springs))
    if (bw + 1) * next_dof > MAX_BAND_ENTRIES:
        from plyshear.model.modelfile import ModelError

        raise ModelError(joint.source or "<model>", "ply",
                         f"the system is too large ({next_dof} unknowns with bandwidth {bw}); "
                         "use fewer plies, bolts or elements_per_ply")
    loads = np.zeros((nm, 2))
    for i, m in enumerate(members):
        if member_dof[i] != FIXED:
            loads[member_dof[i]] = m.load
    EI, phi = section(joint, mesh)
    kel = np.tile(beam.stiffness(EI, phi, mesh.lengths), (ns, 1, 1))
    return Layout(mesh=mesh, stations=xs, na=next_dof, nm=nm, bw=bw, bolt_dof=bolt_dof,
                  edofs=edofs, target=tuple(tuple(t) for t in target), el_ply=el_ply,
                  tgt_kind=tgt_kind, tgt_idx=tgt_idx, member_dof=member_dof,
                  springs=tuple(springs), loads=loads, kel=kel, phi=np.tile(phi, ns))


def scatter(lay: Layout, kbb: np.ndarray, kbu: np.ndarray,
            kuu: np.ndarray) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Assemble the beams, the given foundation matrices and the springs into (ab, B, C).

    Args:
        lay: The numbering.
        kbb: Foundation bolt–bolt block of each element, shape (S·ne, 4, 4).
        kbu: Foundation bolt–ply coupling of each element, shape (S·ne, 4).
        kuu: Foundation ply–ply term of each element, shape (S·ne,).

    Returns:
        The upper-banded block ``A``, the border ``B`` and the block ``C``.
    """
    bw, edofs, kind, idx = lay.bw, lay.edofs, lay.tgt_kind, lay.tgt_idx
    ke = lay.kel + kbb
    ab = np.zeros((bw + 1, lay.na))
    B = np.zeros((lay.na, lay.nm))
    C = np.zeros((lay.nm, lay.nm))
    for a in range(4):
        for b in range(4):
            rows, cols = edofs[:, a], edofs[:, b]
            ok = (rows >= 0) & (cols >= 0) & (rows <= cols)
            np.add.at(ab, (bw + rows[ok] - cols[ok], cols[ok]), ke[ok, a, b])
    # Bolt–ply coupling and ply–ply terms.
    for a in range(4):
        bdof = edofs[:, a]
        own_e = (kind == "a") & (bdof >= 0)
        r = np.minimum(bdof[own_e], idx[own_e])
        c = np.maximum(bdof[own_e], idx[own_e])
        np.add.at(ab, (bw + r - c, c), kbu[own_e, a])
        mem_e = (kind == "m") & (bdof >= 0)
        np.add.at(B, (bdof[mem_e], idx[mem_e]), kbu[mem_e, a])
    own_e = kind == "a"
    np.add.at(ab, (bw, idx[own_e]), kuu[own_e])
    mem_e = kind == "m"
    np.add.at(C, (idx[mem_e], idx[mem_e]), kuu[mem_e])
    for sp in lay.springs:
        _add_spring(ab, B, C, bw, sp)
    return ab, B, C


def _add_spring(ab: np.ndarray, B: np.ndarray, C: np.ndarray, bw: int, sp: Spring) -> None:
    """Add one spring's stiffness between its endpoints."""
    ends = [e for e in (sp.a, sp.b) if e[0] != "0"]
    for kind, i in ends:
        if kind == "a":
            ab[bw, i] += sp.k
        else:
            C[i, i] += sp.k
    if len(ends) == 2:
        (ka, ia), (kb, ib) = ends
        if ka == "a" and kb == "a":
            r, c = min(ia, ib), max(ia, ib)
            ab[bw + r - c, c] -= sp.k
        elif ka == "m" and kb == "m":
            C[ia, ib] -= sp.k
            C[ib, ia] -= sp.k
        else:
            a_i, m_i = (ia, ib) if ka == "a" else (ib, ia)
            B[a_i, m_i] -= sp.k


def endpoint_value(end: Endpoint, x: np.ndarray, y: np.ndarray) -> np.ndarray:
    """The displacement at a spring endpoint (zero where held)."""
    kind, i = end
    if kind == "a":
        return x[i]
    if kind == "m":
        return y[i]
    return np.zeros(x.shape[1:])


def assemble(joint: Joint, mesh: Mesh | None = None) -> System:
    """Assemble the banded linear system of ``joint``.

    Args:
        joint: The joint.
        mesh: A mesh to reuse; built from the joint when omitted.

    Returns:
        The :class:`System`.
    """
    lay = layout(joint, mesh)
    kply = ply_moduli(joint)
    lengths = np.tile(lay.mesh.lengths, len(lay.stations))
    k_el = np.where(lay.el_ply >= 0, kply[np.maximum(lay.el_ply, 0)], 0.0)
    kbb, kbu = beam.foundation(k_el, lay.phi, lengths)
    ab, B, C = scatter(lay, kbb, kbu, k_el * lengths)
    return System(layout=lay, ab=ab, B=B, C=C, k=kply, kbb=kbb, kbu=kbu)


def element_displacements(lay: Layout, x: np.ndarray, y: np.ndarray
                          ) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Spread solved unknowns onto the elements.

    Args:
        lay: The numbering.
        x: ``A`` unknowns, shape (na, c) for c components.
        y: Member unknowns, shape (nm, c).

    Returns:
        ``(de, u_el, u_ply)``: element bolt DOFs (S·ne, 4, c), the displacement
        of the body each element bears against (S·ne, c), and per station and
        ply (S, np, c).
    """
    ed = lay.edofs
    de = np.where((ed >= 0)[:, :, None], x[np.maximum(ed, 0)], 0.0)
    kind = np.array([[t[0] for t in row] for row in lay.target])
    index = np.array([[t[1] for t in row] for row in lay.target])
    u_ply = np.zeros((*kind.shape, x.shape[1]))
    on_a, on_m = kind == "a", kind == "m"
    u_ply[on_a] = x[index[on_a]]
    u_ply[on_m] = y[index[on_m]]
    ns = len(lay.target)
    station_of = np.repeat(np.arange(ns), lay.ne)
    ply = lay.el_ply
    u_el = np.where(ply[:, None] >= 0, u_ply[station_of, np.maximum(ply, 0)], 0.0)
    return de, u_el, u_ply


def _element_bandwidth(edofs: np.ndarray) -> int:
    """Return the largest |i − j| between the free DOFs of one bolt element."""
    valid = edofs >= 0
    hi = np.where(valid, edofs, np.iinfo(int).min).max(axis=1)
    lo = np.where(valid, edofs, np.iinfo(int).max).min(axis=1)
    return int(np.max(hi - lo))


def _own_bandwidth(edofs: np.ndarray, kind: np.ndarray, idx: np.ndarray) -> int:
    """Return the largest |i − j| between a bolt DOF and its ply's own DOF."""
    sel = kind == "a"
    if not np.any(sel):
        return 0
    e = edofs[sel]
    t = idx[sel][:, None]
    return int(np.max(np.where(e >= 0, np.abs(t - e), 0)))


def _spring_bandwidth(springs: list[Spring]) -> int:
    """Return the largest |i − j| between two ``A`` endpoints of a spring."""
    spans = [abs(sp.a[1] - sp.b[1]) for sp in springs if sp.a[0] == "a" and sp.b[0] == "a"]
    return max(spans, default=0)


def _drop_rotations(
    bolt_dof: np.ndarray, target: list[list[Endpoint]], n: int
) -> tuple[np.ndarray, list[list[Endpoint]], int]:
    """Restrain the rotation at every bolt's head and nut and renumber A compactly."""
    used = np.zeros(n, dtype=bool)
    bolt_dof = bolt_dof.copy()
    bolt_dof[:, 0, 1] = FIXED
    bolt_dof[:, -1, 1] = FIXED
    used[bolt_dof[bolt_dof >= 0]] = True
    for row in target:
        for kind, i in row:
            if kind == "a":
                used[i] = True
    new = np.cumsum(used) - 1
    bolt_dof = np.where(bolt_dof >= 0, new[np.maximum(bolt_dof, 0)], FIXED)
    target = [[(kind, int(new[i])) if kind == "a" else (kind, i) for kind, i in row]
              for row in target]
    return bolt_dof, target, int(used.sum())
