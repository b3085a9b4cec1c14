"""The capacity does not depend on the magnitude of the load pattern.

The capacity analysis scales the pattern; the magnitude the model gives is only
a direction and a proportion. A pattern of 1e-12 kN or 1e9 kN (both within the
model file's range) once failed to converge or lost the bending event to
underflow. Invariance under scaling of the loads is a property of the
mechanics, not a number from a source.
"""

from __future__ import annotations

import pytest

from plyshear.mechanics.capacity import summarize
from plyshear.model import modelfile
from tests.conftest import FORK

REL_SCALE = 1e-6  # Newton tolerances 1e-9 of the load, bisection of the event


def _summary(load: str):
    return summarize(modelfile.loads(FORK.replace("load = 100", f"load = {load}")))


@pytest.mark.parametrize("load", ["1e-300", "1e-12", "1e9", "-3.5"])
def test_capacity_is_invariant_to_the_pattern_magnitude(load: str) -> None:
    ref = _summary("100")
    other = _summary(load)
    for a, b in (
        (ref.elastic, other.elastic),
        (ref.nonlinear, other.nonlinear),
        (ref.plastic, other.plastic),
    ):
        assert b.load == pytest.approx(a.load, rel=REL_SCALE)
        assert b.event == a.event
