"""The factor from a nominal capacity to a design value, per standard and method.

The capacity analyses give nominal strengths; set against the model's loads
(factored for LRFD and EN, service for ASD) they need the standard's factor.
"""

from __future__ import annotations

from plyshear.codes.aisc360_check import OMEGA_BOLT, PHI_BOLT

#: EN 1993-1-8:2005 Table 2.1: partial factor for bolts, pins and plates in bearing
#: (the recommended value; a National Annex may change it).
GAMMA_M2 = 1.25


def design_factor(standard: str, method: str) -> tuple[float, str]:
    """Return the factor on a nominal capacity and how it reads in a report.

    Args:
        standard: "aisc360-22" or "en1993-1-8".
        method: "lrfd" or "asd" (AISC only).

    Returns:
        (factor, label), e.g. (0.75, "phi = 0.75").
    """
    if standard == "en1993-1-8":
        return 1.0 / GAMMA_M2, f"1/gamma_M2 = 1/{GAMMA_M2:.2f}, EN 1993-1-8 Table 2.1"
    if method == "asd":
        return 1.0 / OMEGA_BOLT, f"1/Omega = 1/{OMEGA_BOLT:.2f}, AISC 360-22 J3.6 and J3.10"
    return PHI_BOLT, f"phi = {PHI_BOLT:.2f}, AISC 360-22 J3.6 and J3.10"
