"""From solved displacements to plane shears, moments, bearings and reactions.

Works on a batch of joints that share one numbering (a single solve is a batch
of one), so that the batch path of a sweep recovers thousands of solutions with
array operations and builds only the small result records one by one.

Shears and moments follow from equilibrium of the foundation forces, element by
element from the free head, not from the beam stiffness times displacements:
that avoids the cancellation of very stiff short elements, so statics hold to
round-off.
"""

from __future__ import annotations

from collections.abc import Sequence
from dataclasses import dataclass

import numpy as np

from plyshear.mechanics.assembly import FIXED, Layout, element_displacements, endpoint_value
from plyshear.mechanics.conditioning import COND_WARN
from plyshear.mechanics.results import (
    BoltResult,
    MemberResult,
    PlaneShear,
    PlyBearing,
    Solution,
)
from plyshear.model.joint import Joint

#: Above this equilibrium residual the solution is flagged: round-off amplified by
#: an ill-conditioned system (extreme stiffness contrasts) has eaten the digits.
RESIDUAL_WARN = 1e-6
EPS = float(np.finfo(float).eps)


@dataclass(frozen=True)
class Batch:
    """Solved joints that share one numbering; arrays have a leading joint axis (n).

    Attributes:
        joints: The joints.
        layout: Their shared numbering (its mesh gives the element-to-ply map).
        z: Node positions of every joint's bolt, mm, (n, nn).
        stations: Bolt stations, mm, (n, S).
        kel: Beam stiffness of every element, (n, S·ne, 4, 4).
        kbb: Foundation bolt–bolt blocks, (n, S·ne, 4, 4).
        kbu: Foundation bolt–ply couplings, (n, S·ne, 4).
        kply: Foundation modulus of every ply, MPa, (n, plies).
        kspring: Stiffness of every spring of the layout, N/mm, (n, springs).
        x: Solved ``A`` unknowns, (n, na, 2).
        y: Solved member unknowns, (n, nm, 2).
        kappa: Condition estimates, (n,).
        unbalance: Largest |K u − f| of every system, N, (n,).
    """

    joints: Sequence[Joint]
    layout: Layout
    z: np.ndarray
    stations: np.ndarray
    kel: np.ndarray
    kbb: np.ndarray
    kbu: np.ndarray
    kply: np.ndarray
    kspring: np.ndarray
    x: np.ndarray
    y: np.ndarray
    kappa: np.ndarray
    unbalance: np.ndarray


def recover(b: Batch) -> list[Solution]:
    """Return the :class:`Solution` of every joint of the batch."""
    lay = b.layout
    n = len(b.joints)
    ns = len(lay.target)
    nplies = len(lay.target[0])
    ply = lay.mesh.ply
    in_ply = ply >= 0
    # Each ply's elements are one run: sums over a ply are sums from its first element
    # to the next ply's first (the gap between, zeroed, adds nothing).
    runs = np.flatnonzero(np.diff(ply, prepend=-2) != 0)
    first = runs[ply[runs] >= 0]

    def per_ply(values: np.ndarray) -> np.ndarray:
        """Sum element values (n, ne, c) over each ply → (n, plies, c)."""
        return np.add.reduceat(np.where(in_ply[None, :, None], values, 0.0), first, axis=1)

    L = np.diff(b.z, axis=1)  # (n, ne)
    # Element displacements and the body each element bears against.
    de_all, u_all, u_ply = element_displacements(lay, b.x, b.y)
    # Foundation forces on the element DOFs; their w-sum is the force the bolt
    # applies to the ply over the element.
    ff_all = b.kbb @ de_all + b.kbu[..., None] * u_all[:, :, None, :]
    k_el = np.where(in_ply[None, :], b.kply[:, np.maximum(ply, 0)], 0.0)  # (n, ne)
    tply = np.array([[p.thickness for p in j.plies] for j in b.joints])  # (n, plies)
    reaction = np.zeros((n, len(b.joints[0].members), 2))
    clamped = b.joints[0].bolt.ends == "clamped"
    per_station = []
    for st in range(ns):
        rows = lay.station_slice(st)
        de, u_el, ff = de_all[:, rows], u_all[:, rows], ff_all[:, rows]
        held = np.array([kd == "0" for kd, _ in lay.target[st]])
        _balance_supports(ff, held, ply, k_el * L)
        V, M = _internal_forces(ff, de, L, b.kel[:, rows][:, 0] if clamped else None)
        d = np.concatenate([de[:, :, :2], de[:, -1:, 2:]], axis=1)  # (n, node, (w, θ), c)
        w = d[:, :, 0, :]
        on_bolt = -per_ply(ff[:, :, 0] + ff[:, :, 2])
        wmean = per_ply(0.5 * (de[:, :, 0] + de[:, :, 2]) * L[:, :, None]) / tply[:, :, None]
        # Bearing pressure at both ends of every element (zero in gaps).
        q = k_el[:, :, None, None] * (u_el[:, :, None, :] - np.stack([w[:, :-1], w[:, 1:]], axis=2))
        for j, (kd, held_by) in enumerate(lay.target[st]):
            if kd == "0":
                reaction[:, held_by] += on_bolt[:, j]
        per_station.append((V, M, w, q, on_bolt, u_ply[:, st] - wmean))
    # Springs held by a support pull on it: links, and the segments next to a held ply.
    segments = np.zeros((n, max(ns - 1, 0), nplies, 2))
    x_by_dof, y_by_dof = np.moveaxis(b.x, 1, 0), np.moveaxis(b.y, 1, 0)  # (dof, n, 2)
    for s_i, sp in enumerate(lay.springs):
        ua, ub = endpoint_value(sp.a, x_by_dof, y_by_dof), endpoint_value(sp.b, x_by_dof, y_by_dof)
        k = b.kspring[:, s_i, None]
        for end, other in ((sp.a, ub), (sp.b, ua)):
            if end[0] == "0":
                reaction[:, end[1]] -= k * other
        if sp.segment >= 0:
            segments[:, sp.segment, sp.ply] = k * (ub - ua)  # tension positive
    residual = _residuals(b, reaction)
    return [
        _solution(b, i, per_station, reaction[i], segments[i], float(residual[i])) for i in range(n)
    ]


def _solution(
    b: Batch, i: int, per_station: list, reaction: np.ndarray, segments: np.ndarray, residual: float
) -> Solution:
    """The result records of joint i."""
    joint = b.joints[i]
    lay = b.layout
    z = b.z[i]
    plane_nodes = lay.mesh.plane_nodes
    threads = joint.bolt.threaded_along(z[plane_nodes]).tolist()
    zp = z[plane_nodes].tolist()
    bolts = []
    for st, (V, M, w, q, on_bolt, slip) in enumerate(per_station):
        Vp, Mp = V[i, plane_nodes].tolist(), M[i, plane_nodes].tolist()
        planes = tuple(
            PlaneShear(
                index=k + 1,
                z=zp[k],
                above=k,
                below=k + 1,
                shear_xy=tuple(Vp[k]),
                moment_xy=tuple(Mp[k]),
                threads=threads[k],
            )
            for k in range(len(zp))
        )
        force, sl = (-on_bolt[i]).tolist(), slip[i].tolist()
        plies = tuple(
            PlyBearing(ply=j, force_xy=tuple(force[j]), slip_xy=tuple(sl[j]))
            for j in range(len(force))
        )
        bolts.append(
            BoltResult(
                x=float(b.stations[i, st]),
                z=z,
                V=V[i],
                M=M[i],
                w=w[i],
                q=q[i],
                planes=planes,
                plies=plies,
            )
        )
    members = []
    for m_i, m in enumerate(joint.members):
        md = lay.member_dof[m_i]
        disp = b.y[i, md].tolist() if md != FIXED else [0.0, 0.0]
        react = reaction[m_i].tolist() if m.support else [0.0, 0.0]
        members.append(
            MemberResult(member=m_i, displacement_xy=tuple(disp), reaction_xy=tuple(react))
        )
    from plyshear.model import sanity

    warnings: list[str] = sanity.warnings(joint)
    kappa = float(b.kappa[i])
    if not kappa <= COND_WARN:
        digits = int(-np.log10(kappa * EPS)) if np.isfinite(kappa) and kappa * EPS < 1 else 0
        left = (
            "no significant digit"
            if digits < 1
            else f"fewer than {digits} significant digit{'s' if digits > 1 else ''}"
        )
        warnings.append(
            f"ill-conditioned: condition estimate {kappa:.1e} of the scaled "
            f"stiffness matrix (round-off may leave {left}); stiffness "
            "contrasts in the stack are extreme"
        )
    elif not residual <= RESIDUAL_WARN:
        warnings.append(
            f"ill-conditioned: equilibrium residual {residual:.1e} of the load; "
            "stiffness contrasts in the stack are extreme, treat results with care"
        )
    return Solution(
        joint=joint,
        bolts=tuple(bolts),
        members=tuple(members),
        equilibrium_residual=residual,
        warnings=tuple(warnings),
        condition=kappa,
        segment_forces=segments,
    )


def _balance_supports(
    ff: np.ndarray, held: np.ndarray, ply: np.ndarray, stiff_el: np.ndarray
) -> None:
    """Restore one bolt's equilibrium exactly, in place, on its supported plies.

    The solved bolt rows carry a residual of order eps·|K|·|u|, which for a very
    stiff bolt on soft bearing is far above round-off of the load. The plies
    held by a support at this bolt have no equation of their own: their bearing
    is whatever the bolt leaves, so the residual lands on them. Sharing the
    bolt's lack of balance among them, in proportion to their bearing
    stiffness, makes the bearing forces satisfy statics exactly (a determinate
    stack then gives the statics shears to round-off) and changes nothing a
    sound solve would show.

    Args:
        ff: Foundation forces of this bolt's elements, shape (n, ne, 4, 2).
        held: Per ply, True where it is held by a support at this bolt.
        ply: Ply of every element (−1 in gaps), shape (ne,).
        stiff_el: Bearing stiffness k·L of every element, shape (n, ne).
    """
    if not held.any():
        return
    imbalance = (ff[:, :, 0] + ff[:, :, 2]).sum(axis=1)  # Σ bolt-on-ply: should be 0
    on_held = (ply >= 0) & held[np.maximum(ply, 0)]
    stiff = np.where(on_held[None, :], stiff_el, 0.0)
    share = stiff / stiff.sum(axis=1, keepdims=True)
    ff[:, :, 0] -= 0.5 * share[:, :, None] * imbalance[:, None, :]
    ff[:, :, 2] -= 0.5 * share[:, :, None] * imbalance[:, None, :]


def _internal_forces(
    ff: np.ndarray, de: np.ndarray, L: np.ndarray, kel_first: np.ndarray | None
) -> tuple[np.ndarray, np.ndarray]:
    """Return the bolt shear V and moment M at the nodes, shape (n, nn, 2) each.

    From the head, where the bolt is free in translation (V = 0) and, unless
    clamped (``kel_first`` given: the first element's beam stiffness), in
    rotation (M = 0).
    """
    n, ne = L.shape
    V = np.zeros((n, ne + 1, 2))
    V[:, 1:] = np.cumsum(ff[:, :, 0] + ff[:, :, 2], axis=1)
    M = np.zeros((n, ne + 1, 2))
    if kel_first is not None:
        # the head's reaction moment: the first element's full end force
        M[:, 0] = (kel_first @ de[:, 0])[:, 1] + ff[:, 0, 1]
    step = L[:, :, None] * V[:, 1:] - (ff[:, :, 1] + ff[:, :, 3] + L[:, :, None] * ff[:, :, 2])
    M[:, 1:] = M[:, :1] + np.cumsum(step, axis=1)
    return V, M


def _residuals(b: Batch, reaction: np.ndarray) -> np.ndarray:
    """The largest out-of-balance force of every joint relative to its largest load."""
    loads = np.array([[m.load for m in j.members] for j in b.joints], dtype=float)
    supports = np.array([m.support for m in b.joints[0].members])
    scale = np.abs(loads).reshape(len(b.joints), -1).max(axis=1, initial=0.0)
    total = loads.sum(axis=1) + reaction[:, supports].sum(axis=1)
    worst = np.maximum(b.unbalance, np.abs(total).max(axis=1))
    with np.errstate(divide="ignore", invalid="ignore"):
        return np.where(scale > 0.0, worst / np.where(scale > 0.0, scale, 1.0), 0.0)
