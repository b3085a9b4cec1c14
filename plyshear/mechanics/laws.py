"""Nonlinear bearing laws: the force–deformation curve of one ply bearing on the bolt.

Each law is a published load–deformation curve R(Δ) of a whole ply (N against
mm), turned into the per-unit-thickness form the assembly integrates over the
ply, q = R/t (N/mm per mm of ply thickness). The linear bearing laws of
:mod:`plyshear.mechanics.bearing` give the initial modulus ``k_linear`` (MPa)
that the "linear" and "elastic-plastic" laws use.

Curves are odd in δ: q(−δ) = −q(δ), dq(−δ) = dq(δ) (the bolt bears the same
way on either side of the hole); the solver passes contact deformations δ ≥ 0.

To add a law: subclass :class:`BearingCurve` (override ``_q`` and ``_dq`` for
δ ≥ 0), build it in :func:`curve`, add its name to :data:`NONLINEAR_LAWS`, and
cite its source in the class docstring and in ``source``.
"""

from __future__ import annotations

import math
from dataclasses import dataclass

import numpy as np

from plyshear.model.joint import Bolt, Ply
from plyshear.units import MM_PER_IN as IN
from plyshear.units import MPA_PER_KSI as KSI
from plyshear.units import N_PER_KIP as KIP

#: Nonlinear law names :func:`curve` builds.
NONLINEAR_LAWS: tuple[str, ...] = ("linear", "elastic-plastic", "plate-bearing", "bolt-shear")


#: AISC 360-22 J3.10(a): nominal bearing strength 2.4 d t Fu, tied to a hole
#: elongation of about 1/4 in (AISC 360-22 Commentary J3.10).
C_BEARING = 2.4
C_TEAROUT = 1.5  #: tear-out factor on Lc t Fu used for the plate-bearing Rn
HOLE_ELONGATION = 0.25 * IN  #: mm, the 1/4 in hole elongation behind 2.4 d t Fu
HOLE_CLEARANCE = IN / 16.0  #: mm, standard hole d_h = d + 1/16 in
NO_EDGE = 10.0  #: Le/d taken when a ply gives no edge distance (plate-bearing)

#: Rex & Easterling (2003) normalised curve R/Rn = A·x/(1 + √x)² − B·x.
RE_A = 1.74
RE_B = 0.009
#: Crawford & Kulak (1971): R = Rult (1 − exp(−μΔ))^λ, Δ in inches.
CK_MU = 10.0  # 1/in
CK_LAMBDA = 0.55
CK_DELTA_MAX = 0.34 * IN  #: mm, the bolt's deformation at fracture
CK_DELTA0 = 0.001 * IN  #: mm, end of the linear branch replacing the infinite initial slope
SHEAR_OVER_TENSION = 0.62  #: bolt shear / tensile strength (Kulak, Fisher & Struik 1987)


@dataclass(frozen=True)
class BearingCurve:
    """Force–deformation of one ply bearing on the bolt, per unit ply thickness.

    Attributes:
        name: The law's name (one of :data:`NONLINEAR_LAWS`).
        q_max: The largest value the curve reaches (its supremum), N/mm per mm.
        delta_limit: The ply's bearing deformation limit, mm (a failure event
            of the capacity analysis).
        k0: Initial (or regularised initial) slope dq/dδ at δ = 0, MPa.
        source: The published source.
    """

    name: str
    q_max: float
    delta_limit: float
    k0: float
    source: str

    def q(self, delta: np.ndarray) -> np.ndarray:
        """Return the bearing force per unit ply thickness.

        Args:
            delta: Contact deformation δ, mm (odd extension for δ < 0).

        Returns:
            q(δ), N/mm per mm of ply thickness, shaped like ``delta``.
        """
        d = np.asarray(delta, dtype=float)
        return np.sign(d) * self._q(np.abs(d))

    def dq(self, delta: np.ndarray) -> np.ndarray:
        """Return the tangent slope dq/dδ, finite everywhere.

        Args:
            delta: Contact deformation δ, mm (even extension for δ < 0).

        Returns:
            dq/dδ, MPa, shaped like ``delta``.
        """
        return self._dq(np.abs(np.asarray(delta, dtype=float)))

    def _q(self, delta: np.ndarray) -> np.ndarray:
        """Return q for δ ≥ 0 (each law overrides this)."""
        raise NotImplementedError

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        """Return dq/dδ for δ ≥ 0 (each law overrides this)."""
        raise NotImplementedError


@dataclass(frozen=True)
class LinearCurve(BearingCurve):
    r"""The linear bearing law unchanged: :math:`q = k\,\delta`.

    Attributes:
        k: Foundation modulus, MPa.
    """

    k: float

    def _q(self, delta: np.ndarray) -> np.ndarray:
        return self.k * delta

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        return np.zeros_like(delta) + self.k  # k may be an array (stacked curves)


@dataclass(frozen=True)
class ElasticPlasticCurve(BearingCurve):
    r"""Elastic–perfectly plastic bearing: :math:`q = \min(k\,\delta,\ q_y)`.

    The slope is ``k`` below the yield deformation :math:`q_y/k` and 0 from it on.

    Attributes:
        k: Elastic foundation modulus, MPa.
        q_y: Yield value, N/mm per mm.
    """

    k: float
    q_y: float

    def _q(self, delta: np.ndarray) -> np.ndarray:
        return np.minimum(self.k * delta, self.q_y)

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        return np.where(self.k * delta < self.q_y, self.k, 0.0)


@dataclass(frozen=True)
class PlateBearingCurve(BearingCurve):
    r"""Rex & Easterling (2003) plate in bearing, per unit thickness.

    .. math::
        \frac{R}{R_n} = \frac{1.74\,\bar\Delta}{(1 + \sqrt{\bar\Delta})^2}
        - 0.009\,\bar\Delta, \qquad \bar\Delta = \frac{\Delta\,K_i}{R_n},
        \qquad
        \frac{dR}{d\Delta} = K_i\left(\frac{1.74}{(1 + \sqrt{\bar\Delta})^3}
        - 0.009\right)

    The slope is finite at Δ = 0 (1.731 K_i), so no regularisation is needed.
    Past the peak (Δ̄ ≈ 22.9) the curve softens.

    Attributes:
        Ki: Initial stiffness of the whole ply, N/mm.
        Rn: Nominal strength of the whole ply, N.
        t: Ply thickness, mm.
    """

    Ki: float
    Rn: float
    t: float

    def _q(self, delta: np.ndarray) -> np.ndarray:
        x = delta * self.Ki / self.Rn
        return self.Rn / self.t * (RE_A * x / (1.0 + np.sqrt(x)) ** 2 - RE_B * x)

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        x = delta * self.Ki / self.Rn
        return self.Ki / self.t * (RE_A / (1.0 + np.sqrt(x)) ** 3 - RE_B)


@dataclass(frozen=True)
class BoltShearCurve(BearingCurve):
    r"""Crawford & Kulak (1971) bolt in shear, per unit thickness of the ply.

    .. math::
        R = R_{ult}\,(1 - e^{-\mu\Delta})^{\lambda}, \quad \mu = 10\ \mathrm{in^{-1}},
        \ \lambda = 0.55

    Its slope is infinite at Δ = 0; below ``delta0`` the curve is replaced by
    the chord from the origin to :math:`R(\Delta_0)` (continuous in value,
    with a kink at Δ0), whose slope is ``k0``.

    Attributes:
        R_ult: Ultimate shear of one bolt plane, N.
        t: Ply thickness, mm.
        delta0: End of the linear branch, mm.
    """

    R_ult: float
    t: float
    delta0: float

    def _exact(self, delta: np.ndarray) -> np.ndarray:
        """Return the published R(Δ)/t for Δ ≥ 0 (mm), without regularisation."""
        return self.R_ult / self.t * (-np.expm1(-CK_MU * delta / IN)) ** CK_LAMBDA

    def _q(self, delta: np.ndarray) -> np.ndarray:
        small = delta < self.delta0
        return np.where(small, self.k0 * delta, self._exact(np.where(small, self.delta0, delta)))

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        d = np.maximum(delta, self.delta0)
        mu = CK_MU / IN  # 1/mm
        one_minus = -np.expm1(-mu * d)
        exact = (
            self.R_ult / self.t * CK_LAMBDA * mu * np.exp(-mu * d) * one_minus ** (CK_LAMBDA - 1.0)
        )
        return np.where(delta < self.delta0, self.k0, exact)


@dataclass(frozen=True)
class CappedCurve(BearingCurve):
    """A law capped at a strength: q = min(q_law(δ), q_cap), flat from there on.

    The bearing law gives the stiffness; the ply's bearing strength
    (:mod:`plyshear.mechanics.strengths`) bounds it.

    Attributes:
        inner: The uncapped law.
    """

    inner: BearingCurve

    def _q(self, delta: np.ndarray) -> np.ndarray:
        return np.minimum(self.inner._q(delta), self.q_max)

    def _dq(self, delta: np.ndarray) -> np.ndarray:
        return np.where(self.inner._q(delta) < self.q_max, self.inner._dq(delta), 0.0)


def capped(cv: BearingCurve, q_cap: float) -> BearingCurve:
    """Return ``cv`` capped at ``q_cap`` (N/mm per mm); unchanged if its own peak is lower.

    A capped law with no deformation limit of its own takes the 1/4 in hole
    elongation that the 2.4 d t Fu strength is tied to (AISC 360-22
    Commentary J3.10).
    """
    if cv.q_max <= q_cap:
        return cv
    limit = cv.delta_limit if math.isfinite(cv.delta_limit) else HOLE_ELONGATION
    return CappedCurve(
        name=cv.name,
        q_max=q_cap,
        delta_limit=limit,
        k0=cv.k0,
        source=f"{cv.source}; capped at the ply's bearing strength",
        inner=cv,
    )


def rex_easterling_stiffness(bolt: Bolt, ply: Ply) -> tuple[float, float, float, float]:
    r"""Return the Rex & Easterling (2003) initial stiffness of a ply and its parts, N/mm.

    .. math::
        K_i = \left(\frac{1}{K_{br}} + \frac{1}{K_b} + \frac{1}{K_v}\right)^{-1},\quad
        K_{br} = 120\,F_y\,t\,d^{0.8},\quad
        K_b = 32\,E\,t\left(\frac{L_e}{d} - \frac12\right)^3,\quad
        K_v = 6.67\,G\,t\left(\frac{L_e}{d} - \frac12\right)

    K_br is empirical (kip/in with F_y in ksi, t and d in in) and is evaluated
    in those units and converted exactly; K_b and K_v are dimensionally
    homogeneous (any consistent units). G = E/2.6 (ν = 0.3). With no edge
    distance, L_e = 10 d (a far edge: K_b and K_v are then large and K_br governs).

    Args:
        bolt: The bolt (diameter d, mm).
        ply: The ply (thickness t, mm; fy and E, MPa; edge L_e, mm or None).

    Returns:
        (K_i, K_br, K_b, K_v), each N/mm.

    Raises:
        ValueError: If L_e ≤ d/2.
    """
    d, t = bolt.diameter, ply.thickness
    le_d = NO_EDGE if ply.edge is None else ply.edge / d
    if le_d <= 0.5:
        raise ValueError(f"plate-bearing needs an edge distance > d/2, got Le/d = {le_d:g}")
    k_br = 120.0 * (ply.fy / KSI) * (t / IN) * (d / IN) ** 0.8 * (KIP / IN)
    k_b = 32.0 * ply.E * t * (le_d - 0.5) ** 3
    k_v = 6.67 * (ply.E / 2.6) * t * (le_d - 0.5)
    k_i = 1.0 / (1.0 / k_br + 1.0 / k_b + 1.0 / k_v)
    return k_i, k_br, k_b, k_v


def nominal_bearing(bolt: Bolt, ply: Ply) -> float:
    r"""Return the nominal strength R_n of a ply bearing on the bolt, N.

    .. math::
        R_n = \min(2.4\,d\,t\,F_u,\ 1.5\,L_c\,t\,F_u), \quad
        L_c = L_e - d_h/2, \quad d_h = d + 1/16\ \mathrm{in}

    (the AISC bearing and tear-out forms; with no edge distance L_e = 10 d,
    so bearing governs).

    Args:
        bolt: The bolt (diameter d, mm).
        ply: The ply (thickness t, mm; fu, MPa; edge L_e, mm or None).

    Returns:
        R_n in N.

    Raises:
        ValueError: If the clear distance L_c ≤ 0.
    """
    d, t = bolt.diameter, ply.thickness
    le = NO_EDGE * d if ply.edge is None else ply.edge
    lc = le - (d + HOLE_CLEARANCE) / 2.0
    if lc <= 0.0:
        raise ValueError(f"edge {le:g} mm leaves no material beyond the hole (Lc = {lc:g} mm)")
    return min(C_BEARING * d * t * ply.fu, C_TEAROUT * lc * t * ply.fu)


def rex_easterling_peak() -> tuple[float, float]:
    r"""Return the peak (x*, R/R_n at x*) of the Rex & Easterling normalised curve.

    Setting the slope to zero, :math:`1.74/(1+\sqrt{x})^3 = 0.009`, gives
    :math:`x^* = ((1.74/0.009)^{1/3} - 1)^2 \approx 22.87` and R/R_n ≈ 0.9844.

    Returns:
        (x*, R(x*)/R_n), both dimensionless.
    """
    s = (RE_A / RE_B) ** (1.0 / 3.0) - 1.0
    x = s * s
    return x, RE_A * x / (1.0 + s) ** 2 - RE_B * x


def curve(law: str, bolt: Bolt, ply: Ply, k_linear: float) -> BearingCurve:
    """Return the bearing curve of ``ply`` on ``bolt`` under a nonlinear law.

    Laws (each q = R/t for a whole-ply curve R):

    * ``"linear"``: q = k_linear·δ; q_max = delta_limit = inf.
    * ``"elastic-plastic"`` (a teaching law): q = min(k_linear·δ, 2.4·d·fu),
      the AISC 360-22 J3.10(a) nominal bearing strength per unit thickness;
      delta_limit = 1/4 in = 6.35 mm, the hole elongation that strength is
      tied to (AISC 360-22 Commentary J3.10).
    * ``"plate-bearing"``: Rex & Easterling (2003), :class:`PlateBearingCurve`
      with K_i from :func:`rex_easterling_stiffness` and R_n from
      :func:`nominal_bearing`. q_max is the curve's peak, 0.9844·R_n/t.
      delta_limit = min(1/4 in, Δ at the peak): the curve is normalised by a
      nominal strength tied to 1/4 in of hole elongation, and past the peak
      the ply softens (a plyshear choice, not the paper's).
    * ``"bolt-shear"``: Crawford & Kulak (1971), :class:`BoltShearCurve` with
      R_ult = 0.62·fub·A_gross (one shear plane of the bolt body; Kulak,
      Fisher & Struik 1987); linear up to Δ0 = 0.001 in; q_max = R_ult/t
      (approached as Δ → ∞; 0.9815 of it at the limit); delta_limit = 0.34 in.

    Args:
        law: One of :data:`NONLINEAR_LAWS`.
        bolt: The bolt (N, mm, MPa).
        ply: The ply (N, mm, MPa).
        k_linear: The ply's linear foundation modulus, MPa (from the linear
            bearing law or the ply's ``foundation_modulus`` override).

    Returns:
        The ply's :class:`BearingCurve`.

    Raises:
        ValueError: For an unknown law, or a non-positive ``k_linear`` where
            the law uses it.
    """
    if law not in NONLINEAR_LAWS:
        raise ValueError(f"unknown nonlinear bearing law {law!r}; allowed: {NONLINEAR_LAWS}")
    t = ply.thickness
    if law in ("linear", "elastic-plastic") and not k_linear > 0.0:
        raise ValueError(f"k_linear must be > 0 MPa, got {k_linear!r}")
    if law == "linear":
        return LinearCurve(
            name=law,
            q_max=math.inf,
            delta_limit=math.inf,
            k0=k_linear,
            source="the linear bearing law (plyshear.mechanics.bearing) or the "
            "ply's foundation_modulus",
            k=k_linear,
        )
    if law == "elastic-plastic":
        q_y = C_BEARING * bolt.diameter * ply.fu
        return ElasticPlasticCurve(
            name=law,
            q_max=q_y,
            delta_limit=HOLE_ELONGATION,
            k0=k_linear,
            source="AISC 360-22 J3.10(a) (2.4 d t Fu) and Commentary J3.10 (1/4 in)",
            k=k_linear,
            q_y=q_y,
        )
    if law == "plate-bearing":
        k_i = rex_easterling_stiffness(bolt, ply)[0]
        r_n = nominal_bearing(bolt, ply)
        x_peak, r_peak = rex_easterling_peak()
        return PlateBearingCurve(
            name=law,
            q_max=r_peak * r_n / t,
            delta_limit=min(HOLE_ELONGATION, x_peak * r_n / k_i),
            k0=(RE_A - RE_B) * k_i / t,
            source="Rex & Easterling (2003), J. Struct. Eng. 129(6), 'Behavior and "
            "modeling of a bolt bearing on a single plate'",
            Ki=k_i,
            Rn=r_n,
            t=t,
        )
    r_ult = SHEAR_OVER_TENSION * bolt.fub * bolt.gross_area
    r0 = r_ult * (-math.expm1(-CK_MU * CK_DELTA0 / IN)) ** CK_LAMBDA
    return BoltShearCurve(
        name=law,
        q_max=r_ult / t,
        delta_limit=CK_DELTA_MAX,
        k0=r0 / CK_DELTA0 / t,
        source="Crawford & Kulak (1971), J. Struct. Div. 97(ST3); R_ult = 0.62 fub A "
        "(Kulak, Fisher & Struik 1987, Guide to Design Criteria, 2nd ed.)",
        R_ult=r_ult,
        t=t,
        delta0=CK_DELTA0,
    )
