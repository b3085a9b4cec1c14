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

import contextlib
import functools
import math
from collections import OrderedDict
from dataclasses import dataclass, field

import numpy as np

from plyshear.errors import ResourceError
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
    bolt = joint.bolt
    thread_z = bolt.thread_start if bolt.threads == "auto" else None
    # Segments (start, end, elements, ply or −1) in z order, then all nodes at once.
    segs: list[tuple[float, float, int, int]] = []
    plane_at: list[float] = []
    prev_end = 0.0
    for j, ply in enumerate(joint.plies):
        z0 = prev_end + ply.gap
        z1 = z0 + ply.thickness
        if ply.gap > 0:
            m = _count(n, z0 - prev_end, h_min)
            m = 2 * ((m + 1) // 2)  # even, so the middle of the gap is a node
            segs += _split(prev_end, z0, m, thread_z, -1)
            if j > 0:
                plane_at.append(0.5 * (prev_end + z0))
        elif j > 0:
            plane_at.append(z0)
        segs += _split(z0, z1, _count(n, ply.thickness, h_min), thread_z, j)
        prev_end = z1
    a = np.array([s[0] for s in segs])
    b = np.array([s[1] for s in segs])
    count = np.array([s[2] for s in segs])
    seg = np.repeat(np.arange(len(segs)), count)
    i = np.arange(seg.size) - np.repeat(np.cumsum(count) - count, count)
    z = np.append(a[seg] + (b - a)[seg] * (i / count[seg]), prev_end)
    ply_of = np.array([s[3] for s in segs])[seg]
    mid = 0.5 * (z[:-1] + z[1:])
    threaded = bolt.threaded_along(mid)
    plane_nodes = _nearest(z, np.array(plane_at))
    return Mesh(z=z, ply=ply_of, threaded=threaded, plane_nodes=plane_nodes)


def _nearest(z: np.ndarray, at: np.ndarray) -> np.ndarray:
    """Index of the node of the sorted ``z`` nearest to each of ``at``."""
    right = np.clip(np.searchsorted(z, at), 1, z.size - 1)
    left = right - 1
    return np.where(np.abs(z[left] - at) <= np.abs(z[right] - at), left, right)


def _count(n: int, length: float, h_min: float) -> int:
    """Return n, or fewer elements so that none is shorter than ``h_min`` (at least 1)."""
    return max(1, min(n, int(length / h_min * (1 + 1e-9))))  # no ulp-sized jumps


def _split(
    a: float, b: float, n: int, split: float | None, ply: int
) -> list[tuple[float, float, int, int]]:
    """Cut [a, b] into n equal elements: one segment, or two at ``split`` if it is inside."""
    if split is not None and a + 1e-9 < split < b - 1e-9:
        frac = (split - a) / (b - a)
        n1 = max(1, math.ceil(n * frac))
        n2 = max(1, math.ceil(n * (1 - frac)))
        return [(a, split, n1, ply), (split, b, n2, ply)]
    return [(a, b, n, ply)]


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
    numbering: Numbering | None = field(default=None, repr=False, compare=False)

    @property
    def ne(self) -> int:
        """Elements of one bolt."""
        return self.mesh.ply.size

    @functools.cached_property
    def scatter_map(self) -> tuple[np.ndarray, np.ndarray, np.ndarray, tuple[int, int]]:
        """:func:`scatter_indices` of this numbering, computed once per shape."""
        if self.numbering is None:
            return scatter_indices(self)
        if not self.numbering.scatter:
            self.numbering.scatter.append(scatter_indices(self))
        return self.numbering.scatter[0]

    @functools.cached_property
    def target_arrays(self) -> tuple[np.ndarray, np.ndarray]:
        """``target`` as arrays of kinds and indices, shape (S, plies) each."""
        return (
            np.array([[t[0] for t in row] for row in self.target]),
            np.array([[t[1] for t in row] for row in self.target]),
        )

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
    return np.array([bearing.modulus(joint.analysis.bearing, joint.bolt, p) for p in joint.plies])


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


def shape_key(joint: Joint, mesh: Mesh) -> tuple[object, ...]:
    """What fixes the numbering of a joint's unknowns (equal keys: one layout fits both).

    Args:
        joint: The joint.
        mesh: Its bolt mesh.

    Returns:
        A hashable key.
    """
    plies = tuple((p.member, p.link_stiffness is None, p.gap > 0) for p in joint.plies)
    members = tuple((m.name, m.support, m.enters) for m in joint.members)
    return (
        plies,
        members,
        len(joint.stations),
        joint.bolt.ends,
        joint.analysis.beam,
        mesh.ply.tobytes(),
        mesh.threaded.tobytes(),
        mesh.plane_nodes.tobytes(),
    )


@dataclass(frozen=True)
class Numbering:
    """The part of a :class:`Layout` that depends on the joint's shape alone.

    Sweeps, studies and the capacity analysis number many joints of one shape;
    :func:`numbering` computes this once per shape (see :func:`shape_key`) and
    the arrays are shared, read-only.
    """

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
    springs: tuple[tuple[Endpoint, Endpoint, int, int], ...]  # (a, b, ply, segment)
    scatter: list = field(default_factory=list, compare=False, repr=False)  # its map, once


#: Numberings of the shapes seen last, by :func:`shape_key`.
_NUMBERINGS: OrderedDict[tuple[object, ...], Numbering] = OrderedDict()
NUMBERINGS_KEPT = 64


def numbering(joint: Joint, mesh: Mesh) -> Numbering:
    """The numbering of ``joint``'s unknowns, from the cache when its shape was seen.

    Raises:
        plyshear.ModelError: If the system would be too large.
    """
    key = shape_key(joint, mesh)
    found = _NUMBERINGS.get(key)
    if found is not None:
        with contextlib.suppress(KeyError):  # evicted meanwhile by another thread
            _NUMBERINGS.move_to_end(key)
        return found
    num = _number(joint, mesh)
    for a in (num.bolt_dof, num.edofs, num.el_ply, num.tgt_kind, num.tgt_idx, num.member_dof):
        a.setflags(write=False)
    _NUMBERINGS[key] = num
    if len(_NUMBERINGS) > NUMBERINGS_KEPT:
        with contextlib.suppress(KeyError):
            _NUMBERINGS.popitem(last=False)
    return num


def layout(joint: Joint, mesh: Mesh | None = None) -> Layout:
    """Number the unknowns of ``joint`` and compute the beam stiffness.

    Args:
        joint: The joint.
        mesh: A mesh of one bolt to reuse; built from the joint when omitted.

    Returns:
        The :class:`Layout`.
    """
    mesh = mesh or build_mesh(joint)
    num = numbering(joint, mesh)
    ns = len(joint.stations)
    springs = tuple(
        Spring(a, b, spring_stiffness(joint, ply, seg), ply, seg) for a, b, ply, seg in num.springs
    )
    loads = np.zeros((num.nm, 2))
    for i, m in enumerate(joint.members):
        if num.member_dof[i] != FIXED:
            loads[num.member_dof[i]] = m.load
    EI, phi = section(joint, mesh)
    kel = np.tile(beam.stiffness(EI, phi, mesh.lengths), (ns, 1, 1))
    return Layout(
        mesh=mesh,
        stations=np.asarray(joint.stations, dtype=float),
        na=num.na,
        nm=num.nm,
        bw=num.bw,
        bolt_dof=num.bolt_dof,
        edofs=num.edofs,
        target=num.target,
        el_ply=num.el_ply,
        tgt_kind=num.tgt_kind,
        tgt_idx=num.tgt_idx,
        member_dof=num.member_dof,
        springs=springs,
        loads=loads,
        kel=kel,
        phi=np.tile(phi, ns),
        numbering=num,
    )


def _number(joint: Joint, mesh: Mesh) -> Numbering:
    """Number the unknowns of ``joint`` (see :func:`numbering`)."""
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

    # tied[s, j]: ply j shares its member's displacement at station s (rigid tie, at
    # the station where the member's force enters)
    entry = {m.name: 0 if m.enters == "before" else ns - 1 for m in members}
    tied = np.zeros((ns, nplies), dtype=bool)
    for j, ply in enumerate(joint.plies):
        if ply.member is not None and ply.link_stiffness is None:
            tied[entry[ply.member], j] = True

    # Numbering of A, station by station: bolt DOFs by node; a ply's own DOF
    # right after the last node inside it (a ply ends at a node of its own).
    last_node = np.zeros(nplies, dtype=int)
    in_ply = mesh.ply >= 0
    np.maximum.at(last_node, mesh.ply[in_ply], np.flatnonzero(in_ply) + 1)
    bolt_dof = np.empty((ns, nn, 2), dtype=int)
    target: list[list[Endpoint]] = [[("0", FIXED)] * nplies for _ in range(ns)]
    next_dof = 0
    for s in range(ns):
        own = np.flatnonzero(~tied[s])
        per_node = 2 + np.bincount(last_node[own], minlength=nn)
        start = next_dof + np.cumsum(per_node) - per_node
        bolt_dof[s, :, 0] = start
        bolt_dof[s, :, 1] = start + 1
        for j, dof in zip(own.tolist(), (start[last_node[own]] + 2).tolist(), strict=True):
            target[s][j] = ("a", dof)
        next_dof += int(per_node.sum())
    if joint.bolt.ends == "clamped":
        bolt_dof, target, next_dof = _drop_rotations(bolt_dof, target, next_dof)
    for s in range(ns):
        for j in np.flatnonzero(tied[s]).tolist():
            member = joint.plies[j].member
            assert member is not None
            i = midx[member]
            target[s][j] = ("m", int(member_dof[i])) if member_dof[i] != FIXED else ("0", i)

    springs: list[tuple[Endpoint, Endpoint, int, int]] = []
    for j, ply in enumerate(joint.plies):
        if ply.link_stiffness is not None and ply.member is not None:
            i = midx[ply.member]
            s = entry_station(joint, ply.member, ns)
            other: Endpoint = ("m", int(member_dof[i])) if member_dof[i] != FIXED else ("0", i)
            springs.append((target[s][j], other, j, -1))
        for s in range(ns - 1):
            springs.append((target[s][j], target[s + 1][j], j, s))

    el_ply = np.tile(mesh.ply, ns)
    edofs = np.concatenate(
        [np.concatenate([bolt_dof[s, :-1], bolt_dof[s, 1:]], axis=1) for s in range(ns)]
    )
    station_of = np.repeat(np.arange(ns), ne)
    kinds = np.array([[t[0] for t in row] for row in target])  # (S, plies)
    indices = np.array([[t[1] if t[0] != "0" else FIXED for t in row] for row in target])
    in_ply = el_ply >= 0
    tgt_kind = np.where(in_ply, kinds[station_of, np.maximum(el_ply, 0)], "-")
    tgt_idx = np.where(in_ply, indices[station_of, np.maximum(el_ply, 0)], FIXED)
    bw = max(
        _element_bandwidth(edofs),
        _own_bandwidth(edofs, tgt_kind, tgt_idx),
        _spring_bandwidth(springs),
    )
    if (bw + 1) * next_dof > MAX_BAND_ENTRIES:
        raise ResourceError(
            joint.source or "<model>",
            f"the system is too large ({next_dof} unknowns with bandwidth {bw}); "
            "use fewer plies, bolts or elements_per_ply",
        )
    return Numbering(
        na=next_dof,
        nm=nm,
        bw=bw,
        bolt_dof=bolt_dof,
        edofs=edofs,
        target=tuple(tuple(t) for t in target),
        el_ply=el_ply,
        tgt_kind=tgt_kind,
        tgt_idx=tgt_idx,
        member_dof=member_dof,
        springs=tuple(springs),
    )


def scatter_indices(lay: Layout) -> tuple[np.ndarray, np.ndarray, np.ndarray, tuple[int, int]]:
    """Where every element and spring stiffness goes in the assembled system.

    The source vector of a joint is the concatenation of ``kel + kbb``
    (S·ne × 4 × 4), ``kbu`` (S·ne × 4), ``kuu`` (S·ne) and the springs' stiffnesses;
    the destination is the concatenation of ``ab`` ((bw+1) × na), ``B`` (na × nm)
    and ``C`` (nm × nm), each flattened in C order. The system is
    ``dest[d] += sign · source[s]`` over the returned triples.

    Args:
        lay: The numbering.

    Returns:
        ``(dest, src, sign, (destination size, source size))``.
    """
    bw, na, nm = lay.bw, lay.na, lay.nm
    edofs, kind, idx = lay.edofs, lay.tgt_kind, lay.tgt_idx
    ne = edofs.shape[0]
    n_ab, n_b = (bw + 1) * na, na * nm
    off_kbu, off_kuu, off_sp = 16 * ne, 20 * ne, 21 * ne
    e = np.arange(ne)
    dest: list[np.ndarray] = []
    src: list[np.ndarray] = []
    sign: list[np.ndarray] = []

    def add(d: np.ndarray, s: np.ndarray, v: float = 1.0) -> None:
        dest.append(np.asarray(d, dtype=np.int64).ravel())
        src.append(np.asarray(s, dtype=np.int64).ravel())
        sign.append(np.full(np.size(d), v))

    def ab_at(r: np.ndarray, c: np.ndarray) -> np.ndarray:
        return (bw + r - c) * na + c

    # Beam and foundation blocks: upper triangle of the bolt DOFs (an element's DOFs
    # are numbered in increasing order, so the pairs a <= b of its matrix).
    pa, pb = np.triu_indices(4)
    rows, cols = edofs[:, pa], edofs[:, pb]
    ok = (rows >= 0) & (cols >= 0)
    add(ab_at(rows[ok], cols[ok]), (e[:, None] * 16 + pa * 4 + pb)[ok])
    # Bolt–ply coupling: to the ply's own DOF in A, or to a free member's in B.
    own = (kind == "a")[:, None] & (edofs >= 0)
    tgt = np.broadcast_to(idx[:, None], edofs.shape)
    add(
        ab_at(np.minimum(edofs, tgt)[own], np.maximum(edofs, tgt)[own]),
        (off_kbu + e[:, None] * 4 + np.arange(4)[None, :])[own],
    )
    mem = (kind == "m")[:, None] & (edofs >= 0)
    add(n_ab + edofs[mem] * nm + tgt[mem], (off_kbu + e[:, None] * 4 + np.arange(4))[mem])
    # Ply–ply terms.
    own_e, mem_e = kind == "a", kind == "m"
    add(ab_at(idx[own_e], idx[own_e]), off_kuu + e[own_e])
    add(n_ab + n_b + idx[mem_e] * nm + idx[mem_e], off_kuu + e[mem_e])
    for s, spring in enumerate(lay.springs):
        one = np.array([off_sp + s])
        ends = [end for end in (spring.a, spring.b) if end[0] != "0"]
        for k, i in ends:
            add(
                ab_at(np.array([i]), np.array([i]))
                if k == "a"
                else np.array([n_ab + n_b + i * nm + i]),
                one,
            )
        if len(ends) == 2:
            (ka, ia), (kb, ib) = ends
            if ka == "a" and kb == "a":
                add(ab_at(np.array([min(ia, ib)]), np.array([max(ia, ib)])), one, -1.0)
            elif ka == "m" and kb == "m":
                add(
                    np.array([n_ab + n_b + ia * nm + ib, n_ab + n_b + ib * nm + ia]),
                    np.array([off_sp + s, off_sp + s]),
                    -1.0,
                )
            else:
                a_i, m_i = (ia, ib) if ka == "a" else (ib, ia)
                add(np.array([n_ab + a_i * nm + m_i]), one, -1.0)
    shape = (n_ab + n_b + nm * nm, off_sp + len(lay.springs))
    return np.concatenate(dest), np.concatenate(src), np.concatenate(sign), shape


def scatter(
    lay: Layout, kbb: np.ndarray, kbu: np.ndarray, kuu: np.ndarray
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Assemble the beams, the given foundation matrices and the springs into (ab, B, C).

    Args:
        lay: The numbering.
        kbb: Foundation bolt–bolt block of each element, shape (S·ne, 4, 4).
        kbu: Foundation bolt–ply coupling of each element, shape (S·ne, 4).
        kuu: Foundation ply–ply term of each element, shape (S·ne,).

    Returns:
        The upper-banded block ``A``, the border ``B`` and the block ``C``.
    """
    dest, src, sign, (n_dest, _) = lay.scatter_map
    source = np.concatenate(
        [(lay.kel + kbb).ravel(), kbu.ravel(), kuu.ravel(), [sp.k for sp in lay.springs]]
    )
    flat = np.bincount(dest, weights=sign * source[src], minlength=n_dest)
    bw, na, nm = lay.bw, lay.na, lay.nm
    n_ab = (bw + 1) * na
    return (
        flat[:n_ab].reshape(bw + 1, na),
        flat[n_ab : n_ab + na * nm].reshape(na, nm),
        flat[n_ab + na * nm :].reshape(nm, nm),
    )


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


def element_displacements(
    lay: Layout, x: np.ndarray, y: np.ndarray
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Spread solved unknowns onto the elements.

    Args:
        lay: The numbering.
        x: ``A`` unknowns, shape (..., na, c) for c components (a leading batch
            axis is optional).
        y: Member unknowns, shape (..., nm, c).

    Returns:
        ``(de, u_el, u_ply)``: element bolt DOFs (..., S·ne, 4, c), the
        displacement of the body each element bears against (..., S·ne, c), and
        per station and ply (..., S, np, c).
    """
    ed = lay.edofs
    de = np.where((ed >= 0)[..., None], x[..., np.maximum(ed, 0), :], 0.0)
    kind, index = lay.target_arrays
    u_ply = np.zeros((*x.shape[:-2], *kind.shape, x.shape[-1]))
    on_a, on_m = kind == "a", kind == "m"
    u_ply[..., on_a, :] = x[..., index[on_a], :]
    u_ply[..., on_m, :] = y[..., index[on_m], :]
    ns = len(lay.target)
    station_of = np.repeat(np.arange(ns), lay.ne)
    ply = lay.el_ply
    u_el = np.where((ply >= 0)[:, None], u_ply[..., station_of, np.maximum(ply, 0), :], 0.0)
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


def _spring_bandwidth(springs: list[tuple[Endpoint, Endpoint, int, int]]) -> int:
    """Return the largest |i − j| between two ``A`` endpoints of a spring."""
    spans = [abs(a[1] - b[1]) for a, b, _, _ in springs if a[0] == "a" and b[0] == "a"]
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
    target = [
        [(kind, int(new[i])) if kind == "a" else (kind, i) for kind, i in row] for row in target
    ]
    return bolt_dof, target, int(used.sum())
