"""Bearing laws: how stiffly a ply bears on the bolt.

A law returns the foundation modulus of a ply, k (N/mm of force per mm of bolt
length per mm of relative displacement, i.e. MPa), which the assembly spreads
over the ply thickness. A ply's own ``foundation_modulus`` overrides the law.

To add a linear law: write a function ``(bolt, ply) -> float`` here, citing its
source, add it to :data:`LAWS`, and add its name to
:data:`plyshear.model.joint.BEARING_LAWS` so model files may name it. Nonlinear
laws live in :mod:`plyshear.mechanics.laws`; their initial slope serves the
linear solve.
"""

from __future__ import annotations

from collections.abc import Callable

from plyshear.model.joint import Bolt, Ply

D_M16 = 16.0  # mm, the reference diameter of EN 1993-1-8 Table 6.11


def component_spring(bolt: Bolt, ply: Ply) -> float:
    r"""Return the bearing spring of one ply on one bolt, N/mm.

    EN 1993-1-8:2005 Table 6.11, component "bolts in bearing" (row 12), with
    one bolt row (nb = 1); the spring of the component is E·k12:

    .. math::
        k_{12} = \frac{24\,n_b\,k_b\,k_t\,d\,f_u}{E}, \quad
        k_b = \min(0.25\,e_b/d + 0.5,\ 1.25), \quad
        k_t = \min(1.5\,t_j/d_{M16},\ 2.5)

    With no edge distance given, k_b takes its upper limit 1.25. The
    bolt-in-shear component of the same table is not added: the beam itself
    deforms in bending and shear.

    Args:
        bolt: The bolt (its diameter d, mm).
        ply: The ply (thickness t_j, mm; fu and E, MPa; edge e_b, mm).

    Returns:
        E·k12 in N/mm.
    """
    d = bolt.diameter
    kb = 1.25 if ply.edge is None else min(0.25 * ply.edge / d + 0.5, 1.25)
    kt = min(1.5 * ply.thickness / D_M16, 2.5)
    k12 = 24.0 * kb * kt * d * ply.fu / ply.E
    return ply.E * k12


def component(bolt: Bolt, ply: Ply) -> float:
    """Return the EN 1993-1-8 Table 6.11 bearing spring spread over the ply, MPa."""
    return component_spring(bolt, ply) / ply.thickness


#: Linear bearing laws by model-file name.
LAWS: dict[str, Callable[[Bolt, Ply], float]] = {"component": component}


def modulus(law: str, bolt: Bolt, ply: Ply) -> float:
    """Return the linear foundation modulus of ``ply``, MPa.

    The ply's override, else the law's. A nonlinear law (see
    :mod:`plyshear.mechanics.laws`) contributes its initial slope; the elastic
    parts of those laws start from the component stiffness.
    """
    k_component = (
        ply.foundation_modulus
        if ply.foundation_modulus is not None
        else LAWS["component"](bolt, ply)
    )
    if law in LAWS:
        return (
            ply.foundation_modulus if ply.foundation_modulus is not None else LAWS[law](bolt, ply)
        )
    from plyshear.mechanics import laws

    if law in ("elastic-plastic",):
        return k_component
    return laws.curve(law, bolt, ply, k_component).k0
