"""The units a report prints in: the model's, in engineering form.

A model in N-mm prints forces in kN and moments in kN·m (1463223 N*mm is
1.463 kN·m); a model in kN-mm prints moments in kN·m. Lengths and stresses
stay in the model's units (mm, MPa; in, ksi). US units stay kip and kip·in,
as US calculations are written. The terminal and the JSON keep the model's
own units; only the report (HTML, PDF, notebook tables) is in this form.
"""

from __future__ import annotations

from dataclasses import dataclass

from plyshear import units as _units

#: Newtons per kilonewton, millimetres per metre (exact).
N_PER_KN = 1000.0
MM_PER_M = 1000.0


@dataclass(frozen=True)
class Display:
    """Factors (internal value of one printed unit) and labels per dimension.

    Attributes:
        name: The model's unit system.
        factors: Internal value (N, mm, MPa, N·mm, ...) of one printed unit.
        labels: Printed unit of each dimension.
    """

    name: str
    factors: dict[str, float]
    labels: dict[str, str]

    def factor(self, dimension: str) -> float:
        """Return the internal value of one printed unit of ``dimension``."""
        return self.factors[dimension]

    def label(self, dimension: str) -> str:
        """Return the printed unit of ``dimension``."""
        return self.labels[dimension]


def display(units: str) -> Display:
    """Return the report's units for a model in the unit system ``units``."""
    u = _units.system(units)
    dims = ("force", "length", "moment", "stress", "stiffness", "area")
    factors = {d: u.factor(d) for d in dims}
    labels = {d: u.label(d) for d in dims}
    labels["moment"] = labels["moment"].replace("*", "·")
    if units in ("N-mm", "kN-mm"):
        factors["force"], labels["force"] = N_PER_KN, "kN"
        factors["moment"], labels["moment"] = N_PER_KN * MM_PER_M, "kN·m"
        factors["stiffness"], labels["stiffness"] = N_PER_KN, "kN/mm"
    labels["area"] = labels["area"].replace("^2", "²")
    return Display(units, factors, labels)
