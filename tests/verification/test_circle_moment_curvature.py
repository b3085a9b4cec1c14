"""Moment–curvature of a solid circular section against closed forms and quadrature.

References:

* Elastic–perfectly-plastic bending of a solid circle (from memory: e.g. Neal,
  *The Plastic Methods of Structural Analysis*, ch. 1; any strength-of-materials
  text): first yield at M_y = σ_y·πd³/32, full plasticity at
  M_p = σ_y·d³/6, shape factor M_p/M_y = 16/(3π) ≈ 1.698; with the elastic core
  of half-depth c = ε_y/κ, M/M_p → 1 as c → 0.
* The moment as the integral of the fibre stresses, M = ∫ σ(κy)·y·b(y) dy with
  b(y) = 2√(r² − y²), evaluated independently by ``scipy.integrate.quad``.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
from scipy.integrate import quad

from plyshear.mechanics.section import PLATEAU_STIFFNESS, BoltSteel, moment_curvature

D = 20.0  # mm
E, FY, FU, EU = 210000.0, 640.0, 800.0, 0.12  # MPa, a grade 8.8 bolt (ISO 898-1)
REL_QUAD = 1e-7  # quad's error on a smooth integrand, and the plateau floor
REL_ROUNDOFF = 1e-12


def _steel(model: str) -> BoltSteel:
    return BoltSteel(model=model, E=E, fy=FY, fu=FU, eu=EU)


def _by_quadrature(steel: BoltSteel, kappa: float) -> float:
    """M = ∫ σ(κ y) y b(y) dy over the circle, by adaptive quadrature."""
    r = D / 2.0
    c = min(steel.ey / kappa, r)

    def f(y: float) -> float:
        return float(steel.stress(np.array(kappa * y))) * y * 2.0 * math.sqrt(r * r - y * y)

    # split at the yield fibres (and the hardening's end), where σ has a kink
    pts = sorted({0.0, c, min(steel.eu / kappa, r), r})
    pieces = zip(pts, pts[1:], strict=False)
    return 2.0 * sum(quad(f, a, b, epsabs=0.0, epsrel=1e-12)[0] for a, b in pieces)


def test_first_yield_and_the_shape_factor_1_70() -> None:
    steel = _steel("elastic-plastic")
    m_y = FY * math.pi * D**3 / 32.0  # closed form: first yield of a solid circle
    m_p = FY * D**3 / 6.0  # closed form: Z = d³/6
    kappa_y = 2.0 * FY / E / D
    m, dm = moment_curvature(steel, np.array([kappa_y]), np.array([D]))
    assert m[0] == pytest.approx(m_y * (1.0 + PLATEAU_STIFFNESS), rel=REL_ROUNDOFF)
    # the tangent is continuous at first yield: EI on both sides
    assert dm[0] == pytest.approx(E * math.pi * D**4 / 64.0 * (1 + PLATEAU_STIFFNESS), rel=1e-9)
    big = np.array([1e4 * kappa_y])
    m_big, _ = moment_curvature(steel, big, np.array([D]))
    floor = PLATEAU_STIFFNESS * E * math.pi * D**4 / 64.0 * big[0]
    assert (m_big[0] - floor) / m_y == pytest.approx(16.0 / (3.0 * math.pi), rel=1e-6)
    assert (m_big[0] - floor) == pytest.approx(m_p, rel=1e-6)


@pytest.mark.parametrize("model", ["elastic-plastic", "strain-hardening"])
@pytest.mark.parametrize("ratio", [0.5, 1.0, 1.5, 3.0, 10.0, 40.0, 400.0])
def test_moment_is_the_integral_of_the_fibre_stresses(model: str, ratio: float) -> None:
    steel = _steel(model)
    kappa = ratio * 2.0 * FY / E / D
    m, _ = moment_curvature(steel, np.array([kappa]), np.array([D]))
    floor = PLATEAU_STIFFNESS * E * math.pi * D**4 / 64.0 * kappa
    assert m[0] - floor == pytest.approx(_by_quadrature(steel, kappa), rel=REL_QUAD)


@pytest.mark.parametrize("model", ["elastic-plastic", "strain-hardening"])
def test_tangent_is_the_derivative_of_the_moment(model: str) -> None:
    steel = _steel(model)
    kappa = np.geomspace(0.2, 300.0, 40) * 2.0 * FY / E / D
    m, dm = moment_curvature(steel, kappa, np.full(kappa.size, D))
    h = 1e-6 * kappa
    mp, _ = moment_curvature(steel, kappa + h, np.full(kappa.size, D))
    mm, _ = moment_curvature(steel, kappa - h, np.full(kappa.size, D))
    # central differences, away from the kinks of the stress-strain law
    assert dm == pytest.approx((mp - mm) / (2 * h), rel=1e-5)
    # odd in the curvature
    m_neg, dm_neg = moment_curvature(steel, -kappa, np.full(kappa.size, D))
    assert m_neg == pytest.approx(-m, rel=REL_ROUNDOFF)
    assert dm_neg == pytest.approx(dm, rel=REL_ROUNDOFF)


def test_strain_hardening_reaches_the_tensile_strength_moment() -> None:
    steel = _steel("strain-hardening")
    # the law's stresses: fy at yield, fu at the elongation, fu beyond
    eps = np.array([FY / E, EU, 2 * EU])
    assert steel.stress(eps) == pytest.approx([FY, FU, FU], rel=REL_ROUNDOFF)
    kappa = np.array([1e3 * EU * 2.0 / D])
    m, _ = moment_curvature(steel, kappa, np.array([D]))
    floor = PLATEAU_STIFFNESS * E * math.pi * D**4 / 64.0 * kappa[0]
    # the whole section at fu, bar a core of 1/1000 of the radius: fu d³/6
    assert m[0] - floor == pytest.approx(FU * D**3 / 6.0, rel=1e-5)
