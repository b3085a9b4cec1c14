"""Linear solve of one bolt on bearing springs.

The banded block ``A`` (bolt and own ply DOFs) is factorised once with
:func:`scipy.linalg.cholesky_banded`; the few free-member DOFs are solved from
their Schur complement. x and y share the factorisation (two right-hand sides).
"""

from __future__ import annotations

import numpy as np
from scipy.linalg import cho_factor, cho_solve, cho_solve_banded, cholesky_banded

from plyshear.mechanics.assembly import (
    FIXED,
    Layout,
    System,
    assemble,
    element_displacements,
    endpoint_value,
)
from plyshear.mechanics.conditioning import COND_WARN, scaled_condition
from plyshear.mechanics.loadpath import require_load_path
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


class SolveError(RuntimeError):
    """The system could not be solved (singular or not positive definite)."""


def banded_matvec(ab: np.ndarray, x: np.ndarray) -> np.ndarray:
    """Multiply a symmetric matrix in upper banded storage by ``x`` (n or n×k)."""
    u = ab.shape[0] - 1
    n = ab.shape[1]
    y = ab[u][:, None] * x if x.ndim == 2 else ab[u] * x
    for k in range(1, u + 1):
        d = ab[u - k, k:]
        if x.ndim == 2:
            d = d[:, None]
        y[: n - k] += d * x[k:]
        y[k:] += d * x[: n - k]
    return y


def solve(joint: Joint) -> Solution:
    """Solve the plane shears, bolt moments and ply bearings of ``joint``.

    Args:
        joint: The joint (linear bearing law).

    Returns:
        The :class:`Solution`.

    Raises:
        plyshear.ModelError: If the joint is a mechanism.
        SolveError: If the stiffness matrix cannot be factorised.
    """
    require_load_path(joint)
    # Overflow or 0/0 from absurd magnitudes ends in the finiteness check below, as
    # one SolveError, not as numpy warnings on the terminal.
    with np.errstate(all="ignore"):
        sys = assemble(joint)
        x, y, kappa = _solve_system(sys)
        if not (np.all(np.isfinite(x)) and np.all(np.isfinite(y))):
            raise SolveError("the solution is not finite: check the magnitudes of the inputs")
        return _results(joint, sys, x, y, kappa)


def _solve_system(sys: System) -> tuple[np.ndarray, np.ndarray, float]:
    """Solve for the member loads.

    Returns:
        The A-block and member displacements, each with two columns (x, y), and
        the scaled condition estimate of the whole system.
    """
    try:
        cb = cholesky_banded(sys.ab, lower=False, check_finite=False)
    except np.linalg.LinAlgError as exc:
        raise SolveError(f"the bolt stiffness matrix is singular ({exc})") from None
    nm = sys.C.shape[0]
    XB = cho_solve_banded((cb, False), sys.B, check_finite=False)
    S = sys.C - sys.B.T @ XB
    try:
        cf = cho_factor(S, check_finite=False) if nm else None
    except np.linalg.LinAlgError as exc:
        raise SolveError(f"the member system is singular ({exc})") from None
    na = sys.ab.shape[1]

    def apply(rhs: np.ndarray) -> np.ndarray:
        """Solve the whole system for right-hand sides (k, na + nm)."""
        r_a, r_m = rhs[:, :na].T, rhs[:, na:].T
        xa = cho_solve_banded((cb, False), r_a, check_finite=False)
        if cf is None:
            return xa.T
        ym = cho_solve(cf, r_m - sys.B.T @ xa, check_finite=False)
        return np.concatenate([xa - XB @ ym, ym]).T

    kappa = float(scaled_condition(sys.ab[None], sys.B[None], sys.C[None], apply)[0])
    if cf is None:
        return np.zeros((na, 2)), np.zeros((0, 2)), kappa
    y = cho_solve(cf, sys.loads, check_finite=False)
    x = -XB @ y
    return x, y, kappa


def _results(joint: Joint, sys: System, x: np.ndarray, y: np.ndarray,
             kappa: float) -> Solution:
    lay = sys.layout
    mesh = sys.mesh
    nplies = len(joint.plies)
    de_all, u_all, u_ply = element_displacements(lay, x, y)
    # Foundation forces on the element DOFs; their w-sum is the force the bolt applies
    # to the ply over the element.
    ff_all = np.matmul(sys.kbb, de_all) \
        + sys.kbu[:, :, None] * u_all[:, None, :]
    reaction = np.zeros((len(joint.members), 2))
    bolts = []
    L = mesh.lengths
    tply = np.array([p.thickness for p in joint.plies])
    k_el = np.where(mesh.ply >= 0, sys.k[np.maximum(mesh.ply, 0)], 0.0)[:, None, None]
    clamped = joint.bolt.ends == "clamped"
    for st, x_st in enumerate(lay.stations):
        rows = lay.station_slice(st)
        de, u_el, ff = de_all[rows], u_all[rows], ff_all[rows]
        held = np.array([kind == "0" for kind, _ in lay.target[st]])
        _balance_supports(sys, ff, held)
        V, M = _internal_forces(lay, ff, de, u_el, clamped)
        d = np.concatenate([de[:, :2], de[-1:, 2:]], axis=0)  # node, (w, θ), component
        w = d[:, 0, :]
        on_bolt_el = -(ff[:, 0] + ff[:, 2])  # force each element's ply applies to the bolt
        on_bolt = np.zeros((nplies, 2))
        np.add.at(on_bolt, np.maximum(mesh.ply, 0),
                  np.where(mesh.ply[:, None] >= 0, on_bolt_el, 0.0))
        # Mean bolt displacement over each ply, for the slip.
        wmean = np.zeros((nplies, 2))
        np.add.at(wmean, np.maximum(mesh.ply, 0),
                  np.where(mesh.ply[:, None] >= 0, 0.5 * (de[:, 0] + de[:, 2]) * L[:, None],
                           0.0))
        wmean /= tply[:, None]
        # Bearing pressure at both ends of every element (zero in gaps).
        q = k_el * (u_el[:, None, :] - np.stack([w[:-1], w[1:]], axis=1))
        planes = tuple(
            PlaneShear(index=i + 1, z=float(mesh.z[n]), above=i, below=i + 1,
                       shear_xy=(float(V[n, 0]), float(V[n, 1])),
                       moment_xy=(float(M[n, 0]), float(M[n, 1])),
                       threads=joint.bolt.threaded_at(float(mesh.z[n])))
            for i, n in enumerate(mesh.plane_nodes)
        )
        plies = tuple(
            PlyBearing(ply=j, force_xy=(float(-on_bolt[j, 0]), float(-on_bolt[j, 1])),
                       slip_xy=(float(u_ply[st, j, 0] - wmean[j, 0]),
                                float(u_ply[st, j, 1] - wmean[j, 1])))
            for j in range(nplies)
        )
        for j, (kind, held_by) in enumerate(lay.target[st]):
            if kind == "0":
                reaction[held_by] += on_bolt[j]
        bolts.append(BoltResult(x=float(x_st), z=mesh.z, V=V, M=M, w=w, q=q, planes=planes,
                                plies=plies))
    # Springs held by a support pull on it: links, and the segments next to a held ply.
    segments = np.zeros((max(len(lay.stations) - 1, 0), nplies, 2))
    for sp in lay.springs:
        ua, ub = endpoint_value(sp.a, x, y), endpoint_value(sp.b, x, y)
        for end, other in ((sp.a, ub), (sp.b, ua)):
            if end[0] == "0":
                reaction[end[1]] -= sp.k * other
        if sp.segment >= 0:
            segments[sp.segment, sp.ply] = sp.k * (ub - ua)  # tension positive
    members = []
    for i, m in enumerate(joint.members):
        md = lay.member_dof[i]
        disp = y[md] if md != FIXED else np.zeros(2)
        react = reaction[i] if m.support else np.zeros(2)
        members.append(MemberResult(member=i, displacement_xy=(float(disp[0]), float(disp[1])),
                                    reaction_xy=(float(react[0]), float(react[1]))))
    residual = _residual(joint, sys, x, y, reaction)
    from plyshear.model import sanity

    warnings: list[str] = sanity.warnings(joint)
    if not kappa <= COND_WARN:
        warnings.append(f"ill-conditioned: condition estimate {kappa:.1e} of the scaled "
                        "stiffness matrix (round-off may leave fewer than "
                        f"{max(0, int(-np.log10(kappa * EPS))) if np.isfinite(kappa) else 0} "
                        "significant digits); stiffness contrasts in the stack are extreme")
    elif not residual <= RESIDUAL_WARN:
        warnings.append(f"ill-conditioned: equilibrium residual {residual:.1e} of the load; "
                        "stiffness contrasts in the stack are extreme, treat results with care")
    return Solution(joint=joint, bolts=tuple(bolts), members=tuple(members),
                    equilibrium_residual=residual, warnings=tuple(warnings), condition=kappa,
                    segment_forces=segments)


def _balance_supports(sys: System, ff: np.ndarray, held: np.ndarray) -> None:
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
        sys: The system.
        ff: Foundation forces of this bolt's elements, shape (ne, 4, 2).
        held: Per ply, True where it is held by a support at this bolt.
    """
    if not held.any():
        return
    ply = sys.mesh.ply
    imbalance = (ff[:, 0] + ff[:, 2]).sum(axis=0)  # Σ bolt-on-ply over all plies: should be 0
    stiff = np.where((ply >= 0) & held[np.maximum(ply, 0)],
                     sys.k[np.maximum(ply, 0)] * sys.mesh.lengths, 0.0)
    share = stiff / stiff.sum()
    ff[:, 0] -= 0.5 * share[:, None] * imbalance
    ff[:, 2] -= 0.5 * share[:, None] * imbalance


def _internal_forces(lay: Layout, ff: np.ndarray, de: np.ndarray, u_el: np.ndarray,
                     clamped: bool) -> tuple[np.ndarray, np.ndarray]:
    """Return the bolt shear V and moment M at the nodes, shape (nn, 2) each.

    Both follow from equilibrium of the foundation forces, element by element
    from the head, where the bolt is free in translation (V = 0) and, unless
    clamped, in rotation (M = 0). Working from the foundation forces rather
    than from the beam stiffness times displacements avoids the cancellation
    of very stiff short elements, so statics hold to round-off.
    """
    L = lay.mesh.lengths
    nn = L.size + 1
    V = np.zeros((nn, 2))
    V[1:] = np.cumsum(ff[:, 0] + ff[:, 2], axis=0)
    M = np.zeros((nn, 2))
    if clamped:
        # the head's reaction moment: the first element's full end force
        M[0] = np.einsum("ij,jc->ic", lay.kel[0], de[0])[1] + ff[0, 1]
    step = L[:, None] * V[1:] - (ff[:, 1] + ff[:, 3] + L[:, None] * ff[:, 2])
    M[1:] = M[0] + np.cumsum(step, axis=0)
    return V, M


def _residual(joint: Joint, sys: System, x: np.ndarray, y: np.ndarray,
              reaction: np.ndarray) -> float:
    """Return the largest out-of-balance force relative to the applied load."""
    loads = np.array([m.load for m in joint.members], dtype=float)
    scale = float(np.max(np.abs(loads))) if loads.size else 0.0
    if scale == 0.0:
        return 0.0
    r_a = banded_matvec(sys.ab, x) + sys.B @ y
    r_m = sys.B.T @ x + sys.C @ y - sys.loads
    supports = np.array([m.support for m in joint.members])
    total = loads.sum(axis=0) + reaction[supports].sum(axis=0)
    parts = [np.abs(r_a).max(initial=0.0), np.abs(r_m).max(initial=0.0), np.abs(total).max()]
    return float(max(parts) / scale)
