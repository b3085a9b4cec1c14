"""Result records of a solve: frozen, with arrays carrying a component axis.

Sign conventions (x and y components alike):

* ``V(z)``, the bolt shear, is the force that the plies on the head side of
  ``z`` receive from the bolt; a plane's shear is V at the plane.
* ``M(z)`` is the bolt's bending moment, with dM/dz = V (zero at a free head).
* A ply's bearing is the force the bolt applies to the ply.
* A supported member's reaction is the force its support applies to it.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np

from plyshear import units as _units
from plyshear.model.joint import Joint


def signed_resultant(values: np.ndarray, axis: np.ndarray) -> np.ndarray:
    """Return |v| signed by its projection on ``axis``, for one-line diagrams.

    Args:
        values: Vectors, shape (n, 2).
        axis: Unit vector, shape (2,), normally the joint's load direction.
    """
    sign = np.where(values @ axis < 0.0, -1.0, 1.0)
    return np.hypot(values[:, 0], values[:, 1]) * sign


@dataclass(frozen=True)
class PlaneShear:
    """The bolt shear in one shear plane.

    Attributes:
        index: Plane number from the head side, from 1.
        z: Position along the bolt, mm.
        above: Index (0-based) of the ply on the head side.
        below: Index of the ply on the nut side.
        shear_xy: Shear components, N.
        moment_xy: Bending-moment components at the plane, N·mm.
        threads: True if the plane passes through the threaded length.
    """

    index: int
    z: float
    above: int
    below: int
    shear_xy: tuple[float, float]
    moment_xy: tuple[float, float]
    threads: bool

    @property
    def shear(self) -> float:
        """Resultant plane shear, N."""
        return float(np.hypot(*self.shear_xy))

    @property
    def moment(self) -> float:
        """Resultant bending moment at the plane, N·mm."""
        return float(np.hypot(*self.moment_xy))


@dataclass(frozen=True)
class PlyBearing:
    """The bearing force between the bolt and one ply.

    Attributes:
        ply: Ply index (0-based).
        force_xy: Force the bolt applies to the ply, N.
        slip_xy: Ply displacement relative to the bolt's mean displacement
            over the ply, mm.
    """

    ply: int
    force_xy: tuple[float, float]
    slip_xy: tuple[float, float]

    @property
    def force(self) -> float:
        """Resultant bearing force, N."""
        return float(np.hypot(*self.force_xy))


@dataclass(frozen=True)
class BoltResult:
    """Everything solved along one bolt.

    Attributes:
        x: Station of the bolt along the joint, mm.
        z: Node positions, mm, shape (nn,).
        V: Bolt shear, N, shape (nn, 2).
        M: Bending moment, N·mm, shape (nn, 2).
        w: Bolt deflection, mm, shape (nn, 2).
        q: Bearing pressure on the bolt per unit length (force the plies apply
            to the bolt), N/mm, at both ends of every element, shape (ne, 2, 2)
            (element, end, component); zero in gaps.
        planes: Every shear plane.
        plies: Every ply's bearing.
    """

    x: float
    z: np.ndarray
    V: np.ndarray
    M: np.ndarray
    w: np.ndarray
    q: np.ndarray
    planes: tuple[PlaneShear, ...]
    plies: tuple[PlyBearing, ...]

    @property
    def max_moment(self) -> float:
        """Largest resultant bending moment along the bolt, N·mm."""
        return float(np.max(np.hypot(self.M[:, 0], self.M[:, 1])))

    @property
    def max_moment_z(self) -> float:
        """Where the largest resultant moment occurs, mm."""
        return float(self.z[int(np.argmax(np.hypot(self.M[:, 0], self.M[:, 1])))])


@dataclass(frozen=True)
class MemberResult:
    """A member's displacement and, if supported, its reaction.

    Attributes:
        member: Member index in the joint.
        displacement_xy: mm.
        reaction_xy: Force from the support, N (zero for free members).
    """

    member: int
    displacement_xy: tuple[float, float]
    reaction_xy: tuple[float, float]


@dataclass(frozen=True)
class Solution:
    """The linear solution of a joint.

    Attributes:
        joint: The joint that was solved.
        bolts: One result per bolt.
        members: One result per member.
        equilibrium_residual: Largest out-of-balance force of the solved
            system, relative to the applied load (round-off level when sound).
        warnings: Things the engineer must know about this solution.
        condition: Estimate of the 1-norm condition number of the Jacobi-scaled
            stiffness matrix; round-off may cost about log10(condition) of the
            16 significant digits (0 where not estimated).
        segment_forces: Axial force of every ply between consecutive bolts,
            N, shape (S − 1, plies, 2), tension positive (empty for one bolt).
    """

    joint: Joint
    bolts: tuple[BoltResult, ...]
    members: tuple[MemberResult, ...]
    equilibrium_residual: float
    warnings: tuple[str, ...] = ()
    condition: float = 0.0
    segment_forces: np.ndarray = field(default_factory=lambda: np.zeros((0, 0, 2)))

    @property
    def first_bolt_planes(self) -> tuple[PlaneShear, ...]:
        """The planes of the first bolt only (the whole answer for a single bolt).

        A bolt row has planes at every bolt: ``bolts[k].planes``.
        """
        return self.bolts[0].planes

    def first_bolt_shears(self) -> np.ndarray:
        """Resultant shear of every plane of the first bolt only, N."""
        return np.array([p.shear for p in self.bolts[0].planes])

    def to_dict(self, diagram: bool = True) -> dict[str, Any]:
        """Return the JSON result of the model-file contract, in the joint's units.

        Args:
            diagram: Include the diagram arrays.
        """
        u = _units.system(self.joint.units)
        f, mo, ln = u.factor("force"), u.factor("moment"), u.factor("length")
        plies = self.joint.plies
        names = [m.name for m in self.joint.members]

        def vec(v: tuple[float, float] | np.ndarray, s: float) -> list[float]:
            return [float(v[0]) / s, float(v[1]) / s]

        axis = self.joint.load_axis()
        bolts = []
        for b in self.bolts:
            entry: dict[str, Any] = {
                "x": b.x / ln,
                "planes": [
                    {
                        "index": p.index,
                        "z": p.z / ln,
                        "above": plies[p.above].name,
                        "below": plies[p.below].name,
                        "shear": p.shear / f,
                        "shear_xy": vec(p.shear_xy, f),
                        "moment": p.moment / mo,
                        "moment_xy": vec(p.moment_xy, mo),
                        "threads": p.threads,
                    }
                    for p in b.planes
                ],
                "plies": [
                    {
                        "name": plies[pb.ply].name,
                        "member": plies[pb.ply].member,
                        "bearing": pb.force / f,
                        "bearing_xy": vec(pb.force_xy, f),
                    }
                    for pb in b.plies
                ],
                "max_moment": b.max_moment / mo,
            }
            if diagram:
                entry["diagram"] = {
                    "z": (b.z / ln).tolist(),
                    "shear": (signed_resultant(b.V, axis) / f).tolist(),
                    "moment": (signed_resultant(b.M, axis) / mo).tolist(),
                    "deflection": (np.hypot(b.w[:, 0], b.w[:, 1]) / ln).tolist(),
                    "shear_xy": (b.V / f).tolist(),
                    "moment_xy": (b.M / mo).tolist(),
                    "deflection_xy": (b.w / ln).tolist(),
                }
            bolts.append(entry)
        return {
            "format": 1,
            "units": u.labels(),
            "title": self.joint.title,
            "bolts": bolts,
            "members": [
                {
                    "name": names[m.member],
                    "support": self.joint.members[m.member].support,
                    "reaction_xy": vec(m.reaction_xy, f),
                    "displacement_xy": vec(m.displacement_xy, ln),
                }
                for m in self.members
            ],
            "equilibrium_residual": self.equilibrium_residual,
            "condition_estimate": self.condition,
            "warnings": list(self.warnings),
            **self._segments_dict(f, ln),
        }

    def _segments_dict(self, f: float, ln: float) -> dict[str, Any]:
        """Ply forces between the bolts of a row (an extension; empty for one bolt)."""
        if self.segment_forces.shape[0] == 0:
            return {}
        xs = [b.x for b in self.bolts]
        return {
            "segments": [
                {
                    "ply": ply.name,
                    "from_x": xs[s] / ln,
                    "to_x": xs[s + 1] / ln,
                    "force_xy": [float(v) / f for v in self.segment_forces[s, j]],
                }
                for s in range(len(xs) - 1)
                for j, ply in enumerate(self.joint.plies)
            ]
        }
