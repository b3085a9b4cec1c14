"""Figures: the plotted data are the solution's arrays, and every axis carries a unit."""

from __future__ import annotations

import re

import numpy as np
import pytest

import plyshear
from plyshear.mechanics.results import signed_resultant
from plyshear.report import diagrams
from tests.conftest import MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
REL_EXACT = 1e-12
UNIT = re.compile(r"\[[^\]]+\]")


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_plotted_diagrams_equal_the_solution_arrays(path) -> None:
    joint = plyshear.load_model(path)
    sol = plyshear.solve(joint)
    u = plyshear.units.system(joint.units)
    b = sol.bolts[0]
    axis = joint.load_axis()
    fig = diagrams.solution_figure(sol, pressure=True)
    stack, shear, moment, pressure = fig.axes
    v, z = shear.lines[0].get_data()
    assert np.asarray(z) == pytest.approx(b.z / u.factor("length"), rel=REL_EXACT)
    assert np.asarray(v) == pytest.approx(signed_resultant(b.V, axis) / u.factor("force"),
                                          rel=REL_EXACT, abs=1e-12)
    m, _ = moment.lines[0].get_data()
    assert np.asarray(m) == pytest.approx(signed_resultant(b.M, axis) / u.factor("moment"),
                                          rel=REL_EXACT, abs=1e-12)
    q, _ = pressure.lines[0].get_data()
    expected = signed_resultant(b.q.reshape(-1, 2), axis) / joint.bolt.diameter \
        / u.factor("stress")
    assert np.asarray(q) == pytest.approx(expected, rel=REL_EXACT, abs=1e-12)
    for ax in fig.axes:
        assert UNIT.search(ax.get_ylabel()) or ax is not stack
        if ax is not stack:
            assert UNIT.search(ax.get_xlabel()), ax.get_xlabel()
    assert UNIT.search(stack.get_ylabel())


def test_plane_labels_show_value_and_utilization() -> None:
    joint = plyshear.load_model(MODELS / "splice-with-filler.toml")
    sol = plyshear.solve(joint)
    ax = diagrams.plot_shear(sol, utilization={1: 0.824})
    labels = [t.get_text() for t in ax.texts]
    assert "18.6 (0.82)" in labels


def test_no_pyplot_state_is_left_behind() -> None:
    import matplotlib

    diagrams.solution_figure(plyshear.solve(plyshear.load_model(EXAMPLES[0])))
    import sys

    if "matplotlib.pyplot" in sys.modules:
        import matplotlib.pyplot as plt

        assert plt.get_fignums() == []
    assert matplotlib.get_backend().lower() == "agg"


def test_importing_the_figures_selects_no_backend(tmp_path) -> None:
    # the user's backend stays theirs (MPLBACKEND, matplotlib's documented variable);
    # figures are still written, through the canvas of the file format
    import os
    import subprocess
    import sys

    code = ("import sys, matplotlib\n"
            "from plyshear.report import diagrams\n"
            "from matplotlib.figure import Figure\n"
            "fig = Figure()\nfig.add_subplot().plot([0, 1], [1, 0])\n"
            "png = diagrams.figure_bytes(fig, 'png')\n"
            "print(matplotlib.get_backend(), 'matplotlib.pyplot' in sys.modules, png[:4])")
    env = {**os.environ, "MPLBACKEND": "svg"}
    out = subprocess.run([sys.executable, "-c", code], capture_output=True, text=True,
                         check=True, timeout=120, env=env, cwd=tmp_path)
    assert out.stdout.split() == ["svg", "False", r"b'\x89PNG'"]
