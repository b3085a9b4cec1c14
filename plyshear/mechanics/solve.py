"""Linear solve of a joint on bearing springs.

The banded block ``A`` (bolt and own ply DOFs) is factorised once by LAPACK's
banded Cholesky; the few free-member DOFs are solved from their Schur
complement. x and y share the factorisation (two right-hand sides).
:func:`solve_stacked` does this for many same-shaped systems at once (the
batch path); a single solve is a stack of one.
"""

from __future__ import annotations

import numpy as np
from scipy.linalg import lapack

from plyshear.errors import SolveError
from plyshear.mechanics.assembly import System, assemble
from plyshear.mechanics.conditioning import scaled_condition
from plyshear.mechanics.loadpath import require_load_path
from plyshear.mechanics.recovery import Batch, recover
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint


def banded_matvec(ab: np.ndarray, x: np.ndarray) -> np.ndarray:
    """Multiply symmetric matrices in upper banded storage by ``x``.

    Args:
        ab: Shape (u + 1, n), or (batch, u + 1, n).
        x: Shape (n,) or (n, k); with a batch, (batch, n, k).
    """
    if ab.ndim == 2:
        x2 = x[:, None] if x.ndim == 1 else x
        y = banded_matvec(ab[None], x2[None])[0]
        return y[:, 0] if x.ndim == 1 else y
    u = ab.shape[1] - 1
    n = ab.shape[2]
    y = ab[:, u, :, None] * x
    for k in range(1, u + 1):
        d = ab[:, u - k, k:, None]
        y[:, : n - k] += d * x[:, k:]
        y[:, k:] += d * x[:, : n - k]
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
        return recover_one(joint, sys, x, y, kappa)


def recover_one(joint: Joint, sys: System, x: np.ndarray, y: np.ndarray, kappa: float) -> Solution:
    """The solution of one solved system (a batch of one for :func:`recover`)."""
    lay = sys.layout
    batch = Batch(
        joints=(joint,),
        layout=lay,
        z=lay.mesh.z[None],
        stations=lay.stations[None],
        kel=lay.kel[None],
        kbb=sys.kbb[None],
        kbu=sys.kbu[None],
        kply=sys.k[None],
        kspring=np.array([[sp.k for sp in lay.springs]]).reshape(1, -1),
        x=x[None],
        y=y[None],
        kappa=np.array([kappa]),
        unbalance=system_unbalance(
            sys.ab[None], sys.B[None], sys.C[None], x[None], y[None], sys.loads[None]
        ),
    )
    return recover(batch)[0]


def _solve_system(sys: System) -> tuple[np.ndarray, np.ndarray, float]:
    """Solve one system for its member loads: ``(x, y, kappa)`` (see :func:`solve_stacked`)."""
    x, y, kappa = solve_stacked(sys.ab[None], sys.B[None], sys.C[None], sys.loads[None])
    return x[0], y[0], float(kappa[0])


def band_factor(ab: np.ndarray) -> np.ndarray:
    """Cholesky factor of a symmetric positive definite matrix in upper banded storage.

    LAPACK's ``dpbtrf`` called directly: for the small systems of a bolt the
    checks of :func:`scipy.linalg.cholesky_banded` cost more than the factorisation.

    Raises:
        SolveError: If the matrix is not positive definite.
    """
    c, info = lapack.dpbtrf(ab, lower=0)
    if info != 0:
        raise SolveError(
            f"the bolt stiffness matrix is singular (leading minor {info} is not positive definite)"
        )
    return c


def band_solve(c: np.ndarray, rhs: np.ndarray) -> np.ndarray:
    """Solve with the factor of :func:`band_factor` (LAPACK's ``dpbtrs``); rhs (n, k)."""
    x, _ = lapack.dpbtrs(c, rhs, lower=0)
    return x


def solve_stacked(
    ab: np.ndarray, B: np.ndarray, C: np.ndarray, loads: np.ndarray
) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Solve n bordered banded systems ``[[A, B], [Bᵀ, C]]`` at once.

    The blocks ``A`` laid side by side form one banded matrix of the same
    bandwidth (the entries that would couple neighbours lie in the unused corner
    of each block's storage and are zero), factorised by one LAPACK call; the
    free members' unknowns are solved from their Schur complements
    ``S = C − Bᵀ A⁻¹ B``.

    Args:
        ab: Upper banded blocks, shape (n, bw + 1, na).
        B: Borders, shape (n, na, nm).
        C: Corners, shape (n, nm, nm).
        loads: Member loads, shape (n, nm, 2).

    Returns:
        ``(x, y, kappa)``: shapes (n, na, 2), (n, nm, 2), and the scaled condition
        estimate of every system, (n,).

    Raises:
        SolveError: If any system is singular.
    """
    n, u1, na = ab.shape
    nm = C.shape[-1]
    cb = band_factor(np.ascontiguousarray(ab.transpose(1, 0, 2).reshape(u1, n * na)))

    def a_solve(rhs: np.ndarray) -> np.ndarray:
        """Solve every block for its own right-hand sides, (n, na, k) → (n, na, k)."""
        k = rhs.shape[2]
        return band_solve(cb, rhs.reshape(n * na, k)).reshape(n, na, k)

    XB = a_solve(B) if nm else np.zeros((n, na, 0))
    BT = np.swapaxes(B, 1, 2)
    S = C - BT @ XB
    if nm:
        try:
            np.linalg.cholesky(S)
        except np.linalg.LinAlgError as exc:
            raise SolveError(f"the member system is singular ({exc})") from None
        # the condition estimate's solves need only a few digits: the small member
        # system's inverse once, then products (the solution itself is solved below)
        S_inv = np.linalg.inv(S)

    def apply(rhs: np.ndarray) -> np.ndarray:
        """Solve the whole systems for right-hand sides (n, na + nm)."""
        xa = band_solve(cb, rhs[:, :na].reshape(n * na, 1)).reshape(n, na)
        if not nm:
            return xa
        ym = np.einsum("bij,bj->bi", S_inv, rhs[:, na:] - np.einsum("bij,bj->bi", BT, xa))
        return np.concatenate([xa - np.einsum("bij,bj->bi", XB, ym), ym], axis=1)

    kappa = scaled_condition(ab, B, C, apply)
    if not nm:
        return np.zeros((n, na, 2)), np.zeros((n, 0, 2)), kappa
    y = np.linalg.solve(S, loads)
    return -XB @ y, y, kappa


def system_unbalance(
    ab: np.ndarray, B: np.ndarray, C: np.ndarray, x: np.ndarray, y: np.ndarray, loads: np.ndarray
) -> np.ndarray:
    """Largest |K u − f| of a batch of bordered systems, N, shape (n,).

    Args:
        ab: Upper banded blocks, (n, u + 1, na).
        B: Borders, (n, na, nm).
        C: Corners, (n, nm, nm).
        x: Solved unknowns of the blocks, (n, na, c).
        y: Solved member unknowns, (n, nm, c).
        loads: Member loads, (n, nm, c).
    """
    r_a = banded_matvec(ab, x) + B @ y
    r_m = np.swapaxes(B, 1, 2) @ x + C @ y - loads
    n = ab.shape[0]
    return np.maximum(
        np.abs(r_a).reshape(n, -1).max(axis=1, initial=0.0),
        np.abs(r_m).reshape(n, -1).max(axis=1, initial=0.0),
    )
