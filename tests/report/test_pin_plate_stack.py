"""The stack figure dimensions a and c of each pin plate."""

from __future__ import annotations

import plyshear
from plyshear.report.diagrams import plot_stack
from tests.conftest import MODELS


def test_pin_plates_carry_a_and_c() -> None:
    joint = plyshear.load_model(MODELS / "lifting-lug-aisc.toml")
    texts = [t.get_text() for t in plot_stack(joint).texts]
    # fork-left: 2 in pin, hole 2 1/32 in (AISC 360-22 D5.2 limit), edge 4.75 in, width 7.5 in:
    # a = 4.75 - 2.03125/2 = 3.734 in, c = (7.5 - 2.03125)/2 = 2.734 in (geometry)
    assert "fork-left (fork)  a 3.73, c 2.73" in texts


def test_bolt_plies_carry_no_pin_plate_dimensions() -> None:
    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")  # a bolt: connector default
    assert not any(", c " in t.get_text() for t in plot_stack(joint).texts)
