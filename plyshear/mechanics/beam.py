"""Bolt beam elements: Timoshenko (or Euler–Bernoulli) with a Winkler foundation.

Each element has the degrees of freedom ``(w_i, θ_i, w_j, θ_j)``: lateral
displacement and section rotation at both ends. The stiffness is the exact
two-node Timoshenko element; the foundation matrices are integrated with the
same element's exact static displacement shapes (interdependent interpolation),
so with Φ = 0 everything reduces to the Hermite-cubic Euler–Bernoulli element.

References:
    Przemieniecki, *Theory of Matrix Structural Analysis* (1968), §5.6, the
    two-node shear-deformable beam stiffness. Reddy, *An Introduction to the
    Finite Element Method*, 3rd ed. (2006), §5.3, interdependent interpolation
    of the Timoshenko element. Cowper, J. Appl. Mech. 33 (1966), the shear
    coefficient of a solid circle κ = 6(1+ν)/(7+6ν).
"""

from __future__ import annotations

import numpy as np

#: Four-point Gauss–Legendre rule on [0, 1]: exact for the degree-6 products of
#: two cubic shape functions.
_G, _W = np.polynomial.legendre.leggauss(4)
GAUSS_XI = (_G + 1.0) / 2.0
GAUSS_W = _W / 2.0


def shear_coefficient_circle(poisson: float) -> float:
    """Return Cowper's shear coefficient of a solid circular section.

    Args:
        poisson: Poisson's ratio ν.

    Returns:
        κ = 6(1+ν)/(7+6ν) (0.886 at ν = 0.3).
    """
    return 6.0 * (1.0 + poisson) / (7.0 + 6.0 * poisson)


def circle_properties(d: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Return area and second moment of solid circles of diameter ``d`` (mm², mm⁴)."""
    return np.pi * d**2 / 4.0, np.pi * d**4 / 64.0


def phi_shear(EI: np.ndarray, kGA: np.ndarray | None, L: np.ndarray) -> np.ndarray:
    """Return the shear-flexibility ratio Φ = 12EI/(κGA·L²) (0 without shear deformation)."""
    if kGA is None:
        return np.zeros_like(L)
    return 12.0 * EI / (kGA * L**2)


def stiffness(EI: np.ndarray, phi: np.ndarray, L: np.ndarray) -> np.ndarray:
    r"""Return the exact two-node Timoshenko stiffness matrices, shape (n, 4, 4).

    Args:
        EI: Bending stiffness of each element, N·mm².
        phi: Φ of each element.
        L: Element lengths, mm.

    Returns:
        Stiffness matrices in N/mm, N, N·mm.

    .. math::
        K = \frac{EI}{(1+Φ)L^3}\begin{bmatrix}12 & 6L & -12 & 6L\\
        6L & (4+Φ)L^2 & -6L & (2-Φ)L^2\\ -12 & -6L & 12 & -6L\\
        6L & (2-Φ)L^2 & -6L & (4+Φ)L^2\end{bmatrix}
    """
    c = EI / ((1.0 + phi) * L**3)
    L2 = L * L
    k = np.empty((L.size, 4, 4))
    k[:, 0, 0] = k[:, 2, 2] = 12.0
    k[:, 0, 2] = k[:, 2, 0] = -12.0
    k[:, 0, 1] = k[:, 1, 0] = k[:, 0, 3] = k[:, 3, 0] = 6.0 * L
    k[:, 1, 2] = k[:, 2, 1] = k[:, 2, 3] = k[:, 3, 2] = -6.0 * L
    k[:, 1, 1] = k[:, 3, 3] = (4.0 + phi) * L2
    k[:, 1, 3] = k[:, 3, 1] = (2.0 - phi) * L2
    return k * c[:, None, None]


def shape_w(xi: np.ndarray, phi: np.ndarray, L: np.ndarray) -> np.ndarray:
    """Return the displacement shapes N(ξ) of each element, shape (n, len(ξ), 4).

    Args:
        xi: Local coordinates in [0, 1].
        phi: Φ of each element.
        L: Element lengths, mm.

    Returns:
        Values of the four shape functions (the rotation ones carry a length).
    """
    x = xi[None, :]
    p = phi[:, None]
    ln = L[:, None]
    mu = 1.0 + p
    n = np.empty((phi.size, xi.size, 4))
    n[..., 0] = (1 - 3 * x**2 + 2 * x**3 + p * (1 - x)) / mu
    n[..., 1] = ln * (x - 2 * x**2 + x**3 + 0.5 * p * (x - x**2)) / mu
    n[..., 2] = (3 * x**2 - 2 * x**3 + p * x) / mu
    n[..., 3] = ln * (-(x**2) + x**3 - 0.5 * p * (x - x**2)) / mu
    return n


def foundation(k: np.ndarray, phi: np.ndarray, L: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
    """Return the Winkler-foundation matrices of each element.

    The foundation acts on the relative displacement ``w(z) − u`` between the
    bolt and a rigid ply displacement ``u``: energy ½∫k(w − u)² dz.

    Args:
        k: Foundation modulus of each element (N/mm per mm), 0 in gaps.
        phi: Φ of each element.
        L: Element lengths, mm.

    Returns:
        ``(Kbb, Kbu)``: shape (n, 4, 4), the bolt–bolt block ∫k NᵀN dz, and
        shape (n, 4), the bolt–ply coupling −∫k N dz. The ply–ply term is k·L.
    """
    n = shape_w(GAUSS_XI, phi, L)  # (e, g, 4)
    wk = GAUSS_W[None, :] * (k * L)[:, None]  # (e, g)
    wn = n * wk[:, :, None]  # (e, g, 4)
    kbb = np.swapaxes(wn, 1, 2) @ n  # Σ_g w_g k L N_gᵀ N_g
    kbu = -wn.sum(axis=1)
    return kbb, kbu
