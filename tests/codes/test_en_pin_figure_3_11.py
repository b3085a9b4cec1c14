"""EN 1993-1-8 3.13.2: the pin's bending moment is never below Figure 3.11's.

Figure 3.11 (uniform bearing on cheeks a, lug b, gaps c): M_Ed = F_Ed (b + 4c + 2a)/8.
A beam on bearing springs concentrates the bearing near the planes and gives a lower
moment for thick cheeks; the standard's check takes the figure's.
"""

from __future__ import annotations

import pytest

import plyshear
from plyshear.model import modelfile


def _clevis(a: float, b: float, c: float) -> str:
    plies = "".join(
        f'[[ply]]\nname = "{n}"\nmember = "{m}"\nthickness = {t}\nsteel = "S355"\ngap = {g}\n'
        for n, m, t, g in (("c1", "clevis", a, 0.0), ("lug", "lug", b, c), ("c2", "clevis", a, c))
    )
    return (
        'format = 1\nunits = "kN-mm"\n[bolt]\ndiameter = 30\ngrade = "8.8"\n'
        'threads = "excluded"\n' + plies + "[member.clevis]\nsupport = true\n"
        '[member.lug]\nload = 200\n[check]\nstandard = "en1993-1-8"\nconnector = "pin"\n'
    )


@pytest.mark.parametrize(("a", "c"), [(12.0, 2.0), (30.0, 0.0), (30.0, 10.0)])
def test_pin_bending_is_at_least_the_figure_3_11_moment(a: float, c: float) -> None:
    joint = modelfile.loads(_clevis(a, 25.0, c))
    result = plyshear.check(plyshear.solve(joint))
    bending = next(i for i in result.items if i.what == "pin bending")
    figure = 200e3 * (25.0 + 4 * c + 2 * a) / 8.0  # EN 1993-1-8 Figure 3.11, N*mm
    assert bending.demand >= figure * (1 - 1e-9)
    solved = plyshear.solve(joint).bolts[0].max_moment
    assert bending.demand == pytest.approx(max(solved, figure), rel=1e-9)


def test_a_pin_with_no_thread_needs_no_thread_data() -> None:
    # thread_length = 0: a plain shank, so an M21 (no ISO thread row) is a pin of its own
    text = (
        _clevis(12.0, 25.0, 0.0)
        .replace('threads = "excluded"\n', "length = 80\nthread_length = 0\n")
        .replace("diameter = 30", "diameter = 21")
    )
    joint = modelfile.loads(text)
    assert joint.bolt.stress_area == pytest.approx(3.141592653589793 * 21.0**2 / 4.0)
    assert not any(p.threads for p in plyshear.solve(joint).bolts[0].planes)
