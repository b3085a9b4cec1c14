"""The bolt beam element against the closed-form Timoshenko cantilever.

References:
    S. P. Timoshenko, "On the correction for shear of the differential equation
    for transverse vibrations of prismatic bars", *Philosophical Magazine*
    41 (1921) 744–746, and S. P. Timoshenko & J. M. Gere, *Mechanics of
    Materials* (1972): a cantilever of length L with a tip load P deflects
    w(L) = PL³/(3EI) + PL/(κGA) and its section rotates ψ(L) = PL²/(2EI).

    G. R. Cowper, "The shear coefficient in Timoshenko's beam theory",
    *J. Appl. Mech.* 33(2) (1966) 335–340: for a solid circle
    κ = 6(1+ν)/(7+6ν), printed as 0.886 at ν = 0.3. (Timoshenko's own 1922
    coefficient (6+12ν+6ν²)/(7+12ν+4ν²) gives 0.925 for the same section; the
    check below tells the two apart.)

The element of :mod:`plyshear.mechanics.beam` is the exact two-node
shear-deformable element, so a cantilever of any number of elements must
reproduce the closed form to round-off.
"""

import math

import numpy as np
import pytest

from plyshear.mechanics import beam

# The element is exact for end loads, so only round-off remains: measured
# ≤ 2e-13 for 1–10 elements (the small dense solve); 1e-9 is a margin for other
# platforms' BLAS while still catching any error in a matrix term.
REL_EXACT_ELEMENT = 1e-9
# Cowper prints κ to three digits: half a unit of the last printed digit.
ABS_PRINTED_3_DIGITS = 5e-4
# A closed-form expression evaluated in floating point.
REL_ROUNDOFF = 1e-12

D = 20.0  # mm: a stubby bolt-like cantilever, where shear deformation matters
LENGTH = 30.0  # mm
E = 210000.0  # MPa
NU = 0.3
P = 1000.0  # N


def _cantilever_tip(n: int, shear: bool) -> tuple[float, float]:
    """Return the tip (w, θ) of an n-element cantilever clamped at node 0."""
    area, inertia = beam.circle_properties(np.full(n, D))
    ei = E * inertia
    g = E / (2.0 * (1.0 + NU))
    kga = beam.shear_coefficient_circle(NU) * g * area if shear else None
    lengths = np.full(n, LENGTH / n)
    k_el = beam.stiffness(ei, beam.phi_shear(ei, kga, lengths), lengths)
    k = np.zeros((2 * (n + 1), 2 * (n + 1)))
    for e in range(n):
        k[2 * e : 2 * e + 4, 2 * e : 2 * e + 4] += k_el[e]
    f = np.zeros(2 * (n + 1))
    f[-2] = P
    u = np.linalg.solve(k[2:, 2:], f[2:])  # node 0 clamped: w = θ = 0
    return float(u[-2]), float(u[-1])


def _ei() -> float:
    return E * math.pi * D**4 / 64.0


def _kga() -> float:
    return beam.shear_coefficient_circle(NU) * E / (2.0 * (1.0 + NU)) * math.pi * D**2 / 4.0


@pytest.mark.parametrize("n", [1, 3, 10])
def test_timoshenko_cantilever_tip_deflection(n: int) -> None:
    w, theta = _cantilever_tip(n, shear=True)
    # Timoshenko cantilever, tip load: w = PL³/3EI + PL/κGA
    w_ref = P * LENGTH**3 / (3.0 * _ei()) + P * LENGTH / _kga()
    assert w == pytest.approx(w_ref, rel=REL_EXACT_ELEMENT)
    # Timoshenko cantilever, tip load: section rotation ψ = PL²/2EI (bending only)
    assert theta == pytest.approx(P * LENGTH**2 / (2.0 * _ei()), rel=REL_EXACT_ELEMENT)


@pytest.mark.parametrize("n", [1, 3, 10])
def test_euler_bernoulli_cantilever_tip_deflection(n: int) -> None:
    w, theta = _cantilever_tip(n, shear=False)
    # Euler–Bernoulli cantilever, tip load (Φ = 0): w = PL³/3EI, θ = PL²/2EI
    assert w == pytest.approx(P * LENGTH**3 / (3.0 * _ei()), rel=REL_EXACT_ELEMENT)
    assert theta == pytest.approx(P * LENGTH**2 / (2.0 * _ei()), rel=REL_EXACT_ELEMENT)


def test_shear_deformation_matters_for_this_cantilever() -> None:
    # Guard on the test itself: the shear term PL/κGA is ~20 % of the bending
    # term for this stubby beam, so the two tests above tell Φ ≠ 0 from Φ = 0.
    w_t, _ = _cantilever_tip(4, shear=True)
    w_eb, _ = _cantilever_tip(4, shear=False)
    assert w_t / w_eb - 1.0 == pytest.approx(
        3.0 * _ei() / (_kga() * LENGTH**2), rel=REL_EXACT_ELEMENT
    )


def test_cowper_1966_shear_coefficient_solid_circle() -> None:
    # Cowper (1966), solid circle: κ = 0.886 at ν = 0.3 (three printed digits)
    assert beam.shear_coefficient_circle(0.3) == pytest.approx(0.886, abs=ABS_PRINTED_3_DIGITS)
    # Cowper (1966), solid circle: κ = 6(1+ν)/(7+6ν); ν = 0 gives 6/7
    assert beam.shear_coefficient_circle(0.0) == pytest.approx(6.0 / 7.0, rel=REL_ROUNDOFF)
