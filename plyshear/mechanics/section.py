r"""The bolt's bending beyond yield: moment–curvature of a solid circular section.

The bolt material is elastic to f_yb and then, under ``[analysis] bolt``:

* ``"strain-hardening"`` (default): hardens linearly to f_ub at the grade's
  minimum elongation after fracture, then stays at f_ub;
* ``"elastic-plastic"``: stays at f_yb (no hardening);
* ``"elastic"``: never yields (M = EI·κ).

Both yielding laws are sums of elastic–perfectly-plastic (EPP) parts, so the
section's moment is a sum of closed forms. For one EPP part of modulus E and
yield strain ε_y on a circle of radius r, with the elastic core half-depth
c = ε_y/|κ| < r:

.. math::
    M = \operatorname{sign}(\kappa)\left[\frac{4\sigma_y}{c}J(c)
        + \frac{4}{3}\sigma_y\,(r^2 - c^2)^{3/2}\right],\qquad
    \frac{dM}{d\kappa} = 4E\,J(c),

    J(c) = \int_0^c y^2\sqrt{r^2-y^2}\,dy
         = \frac{c}{8}(2c^2 - r^2)\sqrt{r^2-c^2} + \frac{r^4}{8}\arcsin\frac{c}{r},

and M = EIκ for c ≥ r (from memory: any text on the plastic bending of
beams, e.g. Neal, *The Plastic Methods of Structural Analysis*, ch. 1). As
κ → ∞ the moment tends to M_p = σ_y·d³/6 = (16/3π)·M_y ≈ 1.70·M_y. The trilinear
hardening law σ(ε) = min(Eε, f_y + E_t(ε − ε_y), f_u) is the EPP part
(E − E_t, ε_y) plus the EPP part (E_t, ε_u).

The moment is a function of the current curvature only (deformation theory):
under the proportional, monotonic loading of the capacity analysis a section
unloads only after the peak, where the analysis ends.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from plyshear.model.joint import Bolt

#: Minimum elongation after fracture of the bolt grades, as a strain. The
#: strain-hardening law reaches f_ub there, and the capacity analysis ends when
#: the bolt's outer fibre reaches it.
MIN_ELONGATION: dict[str, float] = {
    # from memory: ISO 898-1:2013 Table 3, minimum elongation after fracture A
    "4.6": 0.22,
    "5.6": 0.20,
    "8.8": 0.12,
    "10.9": 0.09,
    "12.9": 0.08,
    # from memory: ASTM F3125/F3125M-23 Table 3 (14 % for both strength levels)
    "A325": 0.14,
    "F1852": 0.14,
    "F3125-A325": 0.14,
    "A490": 0.14,
    "F2280": 0.14,
    "F3125-A490": 0.14,
    # from memory: ASTM A307-21 Grade A, 18 % in 2 in
    "A307": 0.18,
}
#: The elongation taken for a grade that is not in :data:`MIN_ELONGATION` (the
#: smallest there: the conservative choice, and the output says so).
UNKNOWN_ELONGATION = min(MIN_ELONGATION.values())
#: A tangent floor, as a fraction of EI, that keeps the tangent regular on a
#: perfectly plastic plateau (it lifts the moment by this fraction of EI·κ).
PLATEAU_STIFFNESS = 1e-7


def elongation(bolt: Bolt) -> tuple[float, bool]:
    """Return the grade's minimum elongation (strain) and whether the grade is known."""
    if bolt.grade in MIN_ELONGATION:
        return MIN_ELONGATION[bolt.grade], True
    return UNKNOWN_ELONGATION, False


@dataclass(frozen=True)
class BoltSteel:
    """The bolt's uniaxial stress–strain law.

    Attributes:
        model: "strain-hardening", "elastic-plastic" or "elastic".
        E: Elastic modulus, MPa.
        fy: Yield strength, MPa.
        fu: Tensile strength, MPa.
        eu: Strain at which f_u is reached (the minimum elongation), or inf.
    """

    model: str
    E: float
    fy: float
    fu: float
    eu: float

    @classmethod
    def of(cls, bolt: Bolt, model: str) -> BoltSteel:
        """The law of ``bolt``'s grade under ``model``."""
        if model not in ("strain-hardening", "elastic-plastic", "elastic"):
            raise ValueError(f"unknown bolt model {model!r}")
        return cls(model=model, E=bolt.E, fy=bolt.fyb, fu=bolt.fub, eu=elongation(bolt)[0])

    @property
    def ey(self) -> float:
        """Yield strain."""
        return self.fy / self.E

    @property
    def peak_stress(self) -> float:
        """The largest stress the law reaches (inf when elastic)."""
        return {"elastic": np.inf, "elastic-plastic": self.fy}.get(self.model, self.fu)

    def parts(self) -> list[tuple[float, float]]:
        """The EPP parts (modulus, yield strain) whose sum is the law."""
        if self.model == "elastic-plastic":
            return [(self.E, self.ey)]
        et = (self.fu - self.fy) / (self.eu - self.ey) if self.eu > self.ey else 0.0
        return [(self.E - et, self.ey), (et, self.eu)]

    def stress(self, eps: np.ndarray) -> np.ndarray:
        """σ(ε), MPa (odd in ε)."""
        eps = np.asarray(eps, dtype=float)
        if self.model == "elastic":
            return self.E * eps
        out = np.zeros_like(eps)
        for E, e0 in self.parts():
            out = out + np.clip(E * eps, -E * e0, E * e0)
        return out


def _epp_circle(
    kappa: np.ndarray, r: np.ndarray, E: float, e0: float
) -> tuple[np.ndarray, np.ndarray]:
    """Moment and tangent of one EPP part on circles of radius ``r``.

    The elastic sections take E·I·κ; the closed form of the partly plastic
    section is evaluated on the others only (most sections, most of the time,
    are elastic).
    """
    ak = np.abs(kappa)
    inertia = np.pi * r**4 / 4.0
    with np.errstate(divide="ignore", invalid="ignore"):
        c = np.where(ak > 0.0, e0 / ak, np.inf)
    plastic = ~(c >= r)
    M = E * inertia * kappa
    dM = np.broadcast_to(E * inertia, kappa.shape).copy()
    if plastic.any():
        cc, rr = c[plastic], r[plastic]
        root = np.sqrt(np.maximum(rr * rr - cc * cc, 0.0))
        J = cc / 8.0 * (2.0 * cc * cc - rr * rr) * root + rr**4 / 8.0 * np.arcsin(
            np.minimum(cc / rr, 1.0)
        )
        sy = E * e0
        m_pl = 4.0 * sy * J / cc + 4.0 / 3.0 * sy * root**3
        M[plastic] = np.sign(kappa[plastic]) * m_pl
        dM[plastic] = 4.0 * E * J
    return M, dM


def moment_curvature(
    steel: BoltSteel, kappa: np.ndarray, d: np.ndarray
) -> tuple[np.ndarray, np.ndarray]:
    """Bending moment and tangent dM/dκ of solid circles of diameter ``d`` at curvature κ.

    Args:
        steel: The bolt's stress–strain law.
        kappa: Curvatures, 1/mm.
        d: Section diameters, mm (broadcast with ``kappa``).

    Returns:
        (M, dM/dκ), N·mm and N·mm².
    """
    kappa = np.asarray(kappa, dtype=float)
    r = np.broadcast_to(np.asarray(d, dtype=float) / 2.0, kappa.shape)
    EI = steel.E * np.pi * r**4 / 4.0
    if steel.model == "elastic":
        return EI * kappa, EI
    M = np.zeros_like(kappa)
    dM = np.zeros_like(kappa)
    for E, e0 in steel.parts():
        if E <= 0.0:
            continue
        m, t = _epp_circle(kappa, r, E, e0)
        M += m
        dM += t
    floor = PLATEAU_STIFFNESS * EI
    return M + floor * kappa, dM + floor


def plastic_moment(fy: float, d: np.ndarray | float) -> np.ndarray:
    """Plastic moment of solid circles, σ·d³/6 (Z = d³/6), N·mm."""
    return fy * np.asarray(d, dtype=float) ** 3 / 6.0


def yield_moment(fy: float, d: np.ndarray | float) -> np.ndarray:
    """First-yield moment of solid circles, σ·πd³/32, N·mm."""
    return fy * np.pi * np.asarray(d, dtype=float) ** 3 / 32.0
