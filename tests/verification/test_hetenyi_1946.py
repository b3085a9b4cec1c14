"""Bolt on a Winkler foundation against Hetényi's beam-on-elastic-foundation solutions.

Reference:
    M. Hetényi, *Beams on Elastic Foundation: Theory with Applications in the
    Fields of Civil and Mechanical Engineering*, University of Michigan Press,
    Ann Arbor (1946). With β = (k/4EI)^¼:

    * infinite beam, point load P (Ch. II): deflection under the load
      w = Pβ/(2k), moment under the load M = P/(4β);
    * finite beam of length L with free ends, central point load P (Ch. V),
      λ = βL: w_c = (Pβ/2k)(2 + cosh λ + cos λ)/(sinh λ + sin λ),
      M_c = (P/4β)(cosh λ − cos λ)/(sinh λ + sin λ).

The finite-beam formulas were written down from memory, so
:func:`test_finite_free_beam_formula_against_direct_integration` first checks
them against an independent numerical integration of EI w'''' + k w = 0
(scipy's collocation boundary-value solver) before the bolt is compared with
them.

The plyshear model: a bolt (Euler–Bernoulli, ``threads = "excluded"`` so that
EI = E·πd⁴/64 over the whole length) through two supported plies of equal
foundation modulus k, with a thin loaded ply between them that carries P.
"""

import math

import numpy as np
import pytest
from scipy.integrate import solve_bvp

import plyshear
from plyshear.mechanics.results import Solution
from plyshear.model.modelfile import loads

# The point load is really spread over the thin ply, and the foundation of the
# supported plies is missing over that thickness t; both shift w by about
# βt/2 ≈ 0.2 % here (measured 0.19–0.28 %), well inside 1 %.
REL_CLOSED_FORM = 1e-2
# The formula check against the BVP solver is limited by the solver's tolerance.
REL_BVP = 1e-6
# Symmetric plane shears are P/2 by statics; the thin ply's very short elements
# make the system stiff (condition ~1e13), which costs a few digits.
REL_STATICS = 1e-3

D = 20.0  # mm, bolt diameter
E = 210000.0  # MPa
K = 2000.0  # MPa, foundation modulus of the supported plies
T_LOAD = 0.2  # mm, the thin loaded ply
K_LOAD = 1.0e6  # MPa, stiff bearing of the loaded ply: its force enters over T_LOAD
P = 10000.0  # N
ELEMENTS = 12  # per ply

EI = E * math.pi * D**4 / 64.0
BETA = (K / (4.0 * EI)) ** 0.25


def _ply(name: str, member: str, thickness: float, k: float) -> str:
    return (
        f'[[ply]]\nname = "{name}"\nmember = "{member}"\nthickness = {thickness!r}\n'
        f"fy = 355\nfu = 490\nfoundation_modulus = {k!r}\n"
    )


def _solve_loaded_beam(half_length: float) -> Solution:
    """Solve the bolt with a supported ply of ``half_length`` either side of the load."""
    text = (
        'format = 1\nunits = "N-mm"\n'
        f'[bolt]\ndiameter = {D}\ngrade = "8.8"\nthreads = "excluded"\nE = {E}\n'
        + _ply("head side", "fork", half_length, K)
        + _ply("loaded", "lug", T_LOAD, K_LOAD)
        + _ply("nut side", "fork", half_length, K)
        + f"[member.fork]\nsupport = true\n[member.lug]\nload = {P}\n"
        f'[analysis]\nbeam = "euler-bernoulli"\nelements_per_ply = {ELEMENTS}\n'
    )
    return plyshear.solve(loads(text))


def _deflection_at_load(sol: Solution, half_length: float) -> float:
    bolt = sol.bolts[0]
    return float(np.interp(half_length + T_LOAD / 2.0, bolt.z, np.hypot(*bolt.w.T)))


def _finite_free_beam(lam: float) -> tuple[float, float]:
    """Return (w_c, M_c) of the free–free beam, central load (Hetényi 1946)."""
    den = math.sinh(lam) + math.sin(lam)
    w_c = P * BETA / (2.0 * K) * (2.0 + math.cosh(lam) + math.cos(lam)) / den
    m_c = P / (4.0 * BETA) * (math.cosh(lam) - math.cos(lam)) / den
    return w_c, m_c


def test_infinite_beam_point_load_deflection_and_moment() -> None:
    half_length = 7.0 / BETA  # βL = 7 each side: the free ends are far enough away
    assert BETA * half_length > 6.0
    sol = _solve_loaded_beam(half_length)
    # Hetényi (1946), infinite beam, point load: w = Pβ/2k under the load
    assert _deflection_at_load(sol, half_length) == pytest.approx(
        P * BETA / (2.0 * K), rel=REL_CLOSED_FORM
    )
    # Hetényi (1946), infinite beam, point load: M = P/4β under the load
    assert sol.bolts[0].max_moment == pytest.approx(P / (4.0 * BETA), rel=REL_CLOSED_FORM)
    assert sol.bolts[0].max_moment_z == pytest.approx(half_length + T_LOAD / 2.0, abs=T_LOAD)


def test_infinite_beam_plane_shears_are_half_the_load() -> None:
    half_length = 7.0 / BETA
    sol = _solve_loaded_beam(half_length)
    shears = [p.shear for p in sol.bolts[0].planes]
    # statics: the symmetric stack passes P/2 through each face of the loaded ply
    assert shears == pytest.approx([P / 2.0, P / 2.0], rel=REL_STATICS)


@pytest.mark.parametrize("lam", [2.0, 4.0])
def test_finite_free_beam_formula_against_direct_integration(lam: float) -> None:
    # Half beam 0 ≤ x ≤ L/2 from the load: EI w'''' + k w = 0, w'(0) = 0,
    # EI w'''(0+) = P/2 (half the jump P), M = V = 0 at the free end.
    half = lam / BETA / 2.0

    def rhs(x: np.ndarray, y: np.ndarray) -> np.ndarray:
        return np.vstack([y[1], y[2], y[3], -K / EI * y[0]])

    def bc(ya: np.ndarray, yb: np.ndarray) -> np.ndarray:
        return np.array([ya[1], EI * ya[3] - P / 2.0, yb[2], yb[3]])

    x = np.linspace(0.0, half, 200)
    res = solve_bvp(rhs, bc, x, np.zeros((4, x.size)), tol=1e-10, max_nodes=100000)
    assert res.success
    w_c, m_c = _finite_free_beam(lam)
    # Hetényi (1946), finite free–free beam, central load: deflection under the load
    assert res.sol(0.0)[0] == pytest.approx(w_c, rel=REL_BVP)
    # Hetényi (1946), finite free–free beam, central load: M = −EI w''(0)
    assert -EI * res.sol(0.0)[2] == pytest.approx(m_c, rel=REL_BVP)


@pytest.mark.parametrize("lam", [2.0, 4.0])
def test_finite_free_beam_central_load(lam: float) -> None:
    half_length = (lam / BETA - T_LOAD) / 2.0  # total bolt length L = λ/β
    sol = _solve_loaded_beam(half_length)
    w_c, m_c = _finite_free_beam(lam)
    # Hetényi (1946), finite free–free beam, central load: w_c
    assert _deflection_at_load(sol, half_length) == pytest.approx(w_c, rel=REL_CLOSED_FORM)
    # Hetényi (1946), finite free–free beam, central load: M_c
    assert sol.bolts[0].max_moment == pytest.approx(m_c, rel=REL_CLOSED_FORM)
    # The finite length matters here: the infinite-beam values are off by more
    # than the tolerance, so this test tells the two solutions apart.
    assert abs(w_c / (P * BETA / (2.0 * K)) - 1.0) > 3 * REL_CLOSED_FORM
