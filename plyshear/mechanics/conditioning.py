"""Condition estimate of a joint's stiffness system, without forming its inverse.

The solve's accuracy is bounded by κ·ε: with ε ≈ 1.1e-16 (double precision) a
condition number of 1e10 leaves about six significant digits. Cholesky is
insensitive to a symmetric diagonal scaling of the matrix (van der Sluis), so the
relevant number is the condition of the Jacobi-scaled matrix
``D^-1/2 K D^-1/2``; without the scaling, the mismatch of units between the
bolt's translations (mm) and rotations (rad) alone would give 1e5 or more.

The norm of the inverse is estimated by Hager's method (W. W. Hager, "Condition
estimates", SIAM J. Sci. Stat. Comput. 5 (1984) 311–316) as refined by Higham
(N. J. Higham, "FORTRAN codes for estimating the one-norm of a real or complex
matrix", ACM TOMS 14 (1988) 381–396; LAPACK's ``xLACN2``): a few solves with
the existing factorisation. The estimate is a lower bound that is almost always
within a factor of three of the true value.

Every function works on a batch of independent systems at once (leading axis),
so the single-case solve and the batch path share it.
"""

from __future__ import annotations

from collections.abc import Callable

import numpy as np

#: Above this scaled condition estimate the solution is flagged: κ·ε ≈ 1e-6, so
#: fewer than about six significant digits of the results can be trusted.
COND_WARN = 1e10
#: Hager–Higham iterations (LAPACK's xLACN2 allows five; two or three suffice in practice).
ITERATIONS = 5

Solver = Callable[[np.ndarray], np.ndarray]


def banded_column_norms(ab: np.ndarray) -> np.ndarray:
    """Return the absolute column sums of symmetric matrices in upper banded storage.

    Args:
        ab: Upper banded storage, shape (..., u + 1, n).

    Returns:
        Column sums of |A|, shape (..., n).
    """
    u = ab.shape[-2] - 1
    n = ab.shape[-1]
    s = np.abs(ab[..., u, :]).copy()
    for k in range(1, u + 1):
        d = np.abs(ab[..., u - k, k:])
        s[..., k:] += d  # A[j-k, j] in column j
        s[..., : n - k] += d  # its mirror A[j, j-k] in column j-k
    return s


def inverse_norm1(solve: Solver, n: int, batch: int = 1) -> np.ndarray:
    """Estimate ‖A⁻¹‖₁ of symmetric matrices given only a solver.

    Args:
        solve: Maps right-hand sides of shape (batch, n) to solutions of the same shape.
        n: Order of each matrix.
        batch: Number of independent matrices.

    Returns:
        The estimates, shape (batch,).
    """
    x = np.full((batch, n), 1.0 / n)
    est = np.zeros(batch)
    active = np.ones(batch, dtype=bool)
    rows = np.arange(batch)
    for _ in range(ITERATIONS):
        y = solve(x)
        new = np.abs(y).sum(axis=1)
        grew = active & (new > est)
        est = np.where(grew, new, est)
        active &= grew
        if not active.any():
            break
        xi = np.where(y >= 0.0, 1.0, -1.0)
        z = solve(xi)  # A symmetric: A⁻ᵀ ξ = A⁻¹ ξ
        j = np.argmax(np.abs(z), axis=1)
        active &= np.abs(z[rows, j]) > np.einsum("bi,bi->b", z, x)
        x = np.zeros((batch, n))
        x[rows, j] = 1.0
    # Higham's extra vector guards against the rare matrices that fool the iteration.
    alt = (-1.0) ** np.arange(n) * (1.0 + np.arange(n) / max(n - 1, 1))
    y = solve(np.broadcast_to(alt, (batch, n)).copy())
    return np.maximum(est, 2.0 * np.abs(y).sum(axis=1) / (3.0 * n))


def scaled_condition(ab: np.ndarray, B: np.ndarray, C: np.ndarray, solve: Solver) -> np.ndarray:
    """Return the 1-norm condition estimate of Jacobi-scaled bordered systems.

    The systems are ``K = [[A, B], [Bᵀ, C]]`` with ``A`` in upper banded storage.

    Args:
        ab: Upper banded storage of ``A``, shape (batch, u + 1, na).
        B: Border, shape (batch, na, nm).
        C: Corner, shape (batch, nm, nm).
        solve: Solver of the unscaled ``K``, (batch, na + nm) → (batch, na + nm).

    Returns:
        κ₁(D^-1/2 K D^-1/2) estimates, shape (batch,); ``inf`` where a diagonal
        entry is not positive.
    """
    batch, u1, na = ab.shape
    nm = C.shape[-1]
    u = u1 - 1
    d = np.concatenate([ab[:, u, :], np.diagonal(C, axis1=1, axis2=2)], axis=1)
    bad = ~np.all(d > 0.0, axis=1)
    r = 1.0 / np.sqrt(np.where(d > 0.0, d, 1.0))
    ra, rm = r[:, :na], r[:, na:]
    abs_ = ab.copy()
    for k in range(u + 1):
        abs_[:, u - k, k:] *= ra[:, : na - k] * ra[:, k:]
    Bs = np.abs(B) * ra[:, :, None] * rm[:, None, :]
    Cs = np.abs(C) * rm[:, :, None] * rm[:, None, :]
    norm = np.concatenate(
        [banded_column_norms(abs_) + Bs.sum(axis=2), Bs.sum(axis=1) + Cs.sum(axis=1)], axis=1
    ).max(axis=1)

    def scaled_solve(x: np.ndarray) -> np.ndarray:
        return solve(x / r) / r  # (D^-1/2 K D^-1/2)⁻¹ = D^1/2 K⁻¹ D^1/2

    kappa = norm * inverse_norm1(scaled_solve, na + nm, batch)
    return np.where(bad, np.inf, kappa)
