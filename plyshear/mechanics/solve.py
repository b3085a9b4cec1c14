"""Linear solve of one bolt on bearing springs.

The banded block ``A`` (bolt and own ply DOFs) is factorised once with
:func:`scipy.linalg.cholesky_banded`; the few free-member DOFs are solved from
their Schur complement. x and y share the factorisation (two right-hand sides).
"""

from __future__ import annotations

import numpy as np
from scipy.linalg import cho_factor, cho_solve, cho_solve_banded, cholesky_banded

from plyshear.mechanics.assembly import System, assemble
from plyshear.mechanics.conditioning import scaled_condition
from plyshear.mechanics.loadpath import require_load_path
from plyshear.mechanics.recovery import Batch, recover
from plyshear.mechanics.results import Solution
from plyshear.model.joint import Joint


class SolveError(RuntimeError):
    """The system could not be solved (singular or not positive definite)."""


def banded_matvec(ab: np.ndarray, x: np.ndarray) -> np.ndarray:
    """Multiply symmetric matrices in upper banded storage by ``x``.

    Args:
        ab: Shape (u + 1, n), or (batch, u + 1, n).
        x: Shape (n,) or (n, k); with a batch, (batch, n, k).
    """
    if ab.ndim == 3:
        u = ab.shape[1] - 1
        n = ab.shape[2]
        y = ab[:, u, :, None] * x
        for k in range(1, u + 1):
            d = ab[:, u - k, k:, None]
            y[:, : n - k] += d * x[:, k:]
            y[:, k:] += d * x[:, : n - k]
        return y
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
        return recover_one(joint, sys, x, y, kappa)


def recover_one(joint: Joint, sys: System, x: np.ndarray, y: np.ndarray,
                kappa: float) -> Solution:
    """The solution of one solved system (a batch of one for :func:`recover`)."""
    lay = sys.layout
    batch = Batch(
        joints=(joint,), layout=lay, z=lay.mesh.z[None], stations=lay.stations[None],
        kel=lay.kel[None], kbb=sys.kbb[None], kbu=sys.kbu[None], kply=sys.k[None],
        kspring=np.array([[sp.k for sp in lay.springs]]).reshape(1, -1),
        x=x[None], y=y[None], kappa=np.array([kappa]),
        unbalance=system_unbalance(sys.ab[None], sys.B[None], sys.C[None], x[None], y[None],
                                   sys.loads[None]))
    return recover(batch)[0]


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


def system_unbalance(ab: np.ndarray, B: np.ndarray, C: np.ndarray, x: np.ndarray,
                     y: np.ndarray, loads: np.ndarray) -> np.ndarray:
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
    return np.maximum(np.abs(r_a).reshape(n, -1).max(axis=1, initial=0.0),
                      np.abs(r_m).reshape(n, -1).max(axis=1, initial=0.0))
