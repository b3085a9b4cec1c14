"""Many same-shaped joints solved together.

A design sweep changes values (ply thicknesses, the bolt diameter, the grade,
the loads) but rarely the shape of the system: the same plies and members, the
same number of elements per ply, the same numbering of the unknowns. Joints
that share a shape share one :class:`~plyshear.mechanics.assembly.Layout`
numbering; only numbers differ. For such a group:

* the element matrices of every joint are computed in one vectorised call
  (:func:`plyshear.mechanics.beam.stiffness`, :func:`~plyshear.mechanics.beam.foundation`);
* their assembly is one sparse matrix product with an assembly operator built
  once from the shared numbering (:func:`assembly_operator`);
* their banded blocks are factorised side by side as one banded matrix and
  their member borders solved with batched dense algebra
  (:func:`plyshear.mechanics.solve.solve_stacked`, which a single solve calls
  with one block);
* their results are recovered with array operations
  (:func:`plyshear.mechanics.recovery.recover`, as for a single solve).

The assembly is the only step a single solve does differently (its own
scatter), so the two agree to round-off. A group whose batched factorisation
fails, or that is too large to lay out, falls back to solving its joints one by
one, so that the failing ones report their own errors.
"""

from __future__ import annotations

from collections.abc import Sequence

import numpy as np
import scipy.sparse as sp

from plyshear.errors import ModelError, SolveError
from plyshear.mechanics import beam
from plyshear.mechanics.assembly import (
    Layout,
    Mesh,
    build_mesh,
    layout,
    ply_moduli,
    scatter_indices,
    section,
    shape_key,
    spring_stiffness,
)
from plyshear.mechanics.loadpath import require_load_path
from plyshear.mechanics.recovery import Batch, recover
from plyshear.mechanics.results import Solution
from plyshear.mechanics.solve import solve as solve_one
from plyshear.mechanics.solve import solve_stacked, system_unbalance
from plyshear.model.joint import Joint

#: Joints assembled in one product: bounds the dense source block
#: (about 21 doubles per element and joint: 1000 joints of 100 elements ≈ 17 MB).
CHUNK = 1000
#: Doubles a batch may hold in its stacked systems (the single solve's own limit,
#: MAX_BAND_ENTRIES, is per joint): larger groups are cut into smaller batches.
BATCH_ENTRIES = 20_000_000

Outcome = Solution | ModelError | SolveError


def assembly_operator(lay: Layout) -> sp.csr_matrix:
    """The linear map from element and spring stiffnesses to the assembled system.

    See :func:`plyshear.mechanics.assembly.scatter_indices` for the source and
    destination vectors.

    Args:
        lay: The shared numbering.

    Returns:
        A sparse matrix of shape (destination size, source size).
    """
    dest, src, sign, shape = scatter_indices(lay)
    return sp.csr_matrix((sign, (dest, src)), shape=shape)


def solve_many(joints: Sequence[Joint]) -> list[Outcome]:
    """Solve many joints, batching those of the same shape.

    Args:
        joints: The joints (linear bearing law), in any mix of shapes.

    Returns:
        One outcome per joint, in order: its :class:`Solution`, or the
        :class:`ModelError` (a mechanism) or :class:`SolveError` that its own
        solve would raise.
    """
    out: list[Outcome | None] = [None] * len(joints)
    groups: dict[tuple[object, ...], list[tuple[int, Mesh]]] = {}
    sound: set[tuple[object, ...]] = set()  # load paths known to be sound
    for i, joint in enumerate(joints):
        # what plyshear.mechanics.loadpath.require_load_path looks at
        path_key = (
            tuple(p.member for p in joint.plies),
            tuple(ply_moduli(joint) > 0.0),
            tuple((m.name, m.support, m.is_loaded) for m in joint.members),
        )
        if path_key not in sound:
            try:
                require_load_path(joint)
            except ModelError as exc:
                out[i] = exc
                continue
            sound.add(path_key)
        mesh = build_mesh(joint)
        groups.setdefault(shape_key(joint, mesh), []).append((i, mesh))
    for members in groups.values():
        for start in range(0, len(members), CHUNK):
            part = members[start : start + CHUNK]
            for (i, _), outcome in zip(
                part, _solve_group([joints[i] for i, _ in part], [m for _, m in part]), strict=True
            ):
                out[i] = outcome
    return [o for o in out if o is not None]


def _solve_group(joints: list[Joint], meshes: list[Mesh]) -> list[Outcome]:
    """Solve joints of one shape together."""
    with np.errstate(all="ignore"):
        try:
            lay0 = layout(joints[0], meshes[0])
            per_joint = (lay0.bw + 1) * lay0.na + lay0.na * lay0.nm + 22 * lay0.edofs.shape[0]
            step = max(1, BATCH_ENTRIES // per_joint)
            out: list[Outcome] = []
            for i in range(0, len(joints), step):
                out += _solve_batched(joints[i : i + step], meshes[i : i + step], lay0)
            return out
        except (SolveError, ModelError):
            pass  # singular, or too large: one by one, each with its own error
    outcomes: list[Outcome] = []
    for joint in joints:
        try:
            outcomes.append(solve_one(joint))
        except (ModelError, SolveError) as exc:
            outcomes.append(exc)
    return outcomes


def _solve_batched(joints: list[Joint], meshes: list[Mesh], lay0: Layout) -> list[Outcome]:
    """Assemble, solve and recover joints that share the numbering ``lay0``."""
    n = len(joints)
    ns, ne = len(lay0.stations), lay0.ne
    # Per joint: the numbers that differ.
    EI = np.empty((n, ne))
    phi = np.empty((n, ne))
    kply = np.empty((n, len(joints[0].plies)))
    ksp = np.empty((n, len(lay0.springs)))
    loads = np.zeros((n, *lay0.loads.shape))
    for i, (joint, mesh) in enumerate(zip(joints, meshes, strict=True)):
        EI[i], phi[i] = section(joint, mesh)
        kply[i] = ply_moduli(joint)
        ksp[i] = [spring_stiffness(joint, s.ply, s.segment) for s in lay0.springs]
        for m_i, m in enumerate(joint.members):
            if lay0.member_dof[m_i] >= 0:
                loads[i, lay0.member_dof[m_i]] = m.load
    z = np.stack([m.z for m in meshes])
    L = np.tile(np.diff(z, axis=1), (1, ns)).ravel()
    phi_all = np.tile(phi, (1, ns)).ravel()
    el_ply = lay0.el_ply
    k_el = np.where(el_ply >= 0, kply[:, np.maximum(el_ply, 0)], 0.0).ravel()
    kel = beam.stiffness(np.tile(EI, (1, ns)).ravel(), phi_all, L).reshape(n, ns * ne, 4, 4)
    kbb, kbu = beam.foundation(k_el, phi_all, L)
    kbb = kbb.reshape(n, ns * ne, 4, 4)
    kbu = kbu.reshape(n, ns * ne, 4)
    kuu = (k_el * L).reshape(n, ns * ne)
    source = np.concatenate([(kel + kbb).reshape(n, -1), kbu.reshape(n, -1), kuu, ksp], axis=1)
    dest = (assembly_operator(lay0) @ source.T).T
    bw, na, nm = lay0.bw, lay0.na, lay0.nm
    ab = dest[:, : (bw + 1) * na].reshape(n, bw + 1, na)
    B = dest[:, (bw + 1) * na : (bw + 1) * na + na * nm].reshape(n, na, nm)
    C = dest[:, (bw + 1) * na + na * nm :].reshape(n, nm, nm)
    x, y, kappa = solve_stacked(ab, B, C, loads)
    finite = np.isfinite(x).reshape(n, -1).all(axis=1) & np.isfinite(y).reshape(n, -1).all(axis=1)
    ok = np.nonzero(finite)[0]
    batch = Batch(
        joints=[joints[i] for i in ok],
        layout=lay0,
        z=z[ok],
        stations=np.array([joints[i].stations for i in ok], dtype=float).reshape(ok.size, ns),
        kel=kel[ok],
        kbb=kbb[ok],
        kbu=kbu[ok],
        kply=kply[ok],
        kspring=ksp[ok],
        x=x[ok],
        y=y[ok],
        kappa=kappa[ok],
        unbalance=system_unbalance(ab[ok], B[ok], C[ok], x[ok], y[ok], loads[ok]),
    )
    solved = iter(recover(batch) if ok.size else [])
    return [
        next(solved)
        if finite[i]
        else SolveError("the solution is not finite: check the magnitudes of the inputs")
        for i in range(n)
    ]
