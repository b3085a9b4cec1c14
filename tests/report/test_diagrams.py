"""Figures: the plotted data are the solution's arrays, and every axis carries a unit."""

from __future__ import annotations

import re

import numpy as np
import pytest

import plyshear
from plyshear.mechanics.results import signed_resultant
from plyshear.report import diagrams
from plyshear.report.quantities import display
from tests.conftest import MODELS

EXAMPLES = sorted(MODELS.glob("*.toml"))
REL_EXACT = 1e-12
UNIT = re.compile(r"\[[^\]]+\]")


@pytest.mark.parametrize("path", EXAMPLES, ids=[p.stem for p in EXAMPLES])
def test_plotted_diagrams_equal_the_solution_arrays(path) -> None:
    joint = plyshear.load_model(path)
    sol = plyshear.solve(joint)
    u = display(joint.units)  # the report's engineering form (kN, kN·m for metric models)
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


def test_metric_figures_are_in_kn_and_kn_m() -> None:
    joint = plyshear.load_model(MODELS / "lug-cheek-plates.toml")  # an N-mm model
    sol = plyshear.solve(joint)
    fig = diagrams.solution_figure(sol)
    moment = fig.axes[2]
    assert "[kN·m]" in moment.get_xlabel()
    m, _ = moment.lines[0].get_data()
    N_MM_PER_KN_M = 1e6  # exact: 1 kN = 1000 N, 1 m = 1000 mm
    expected = signed_resultant(sol.bolts[0].M, joint.load_axis()) / N_MM_PER_KN_M
    assert np.asarray(m) == pytest.approx(expected, rel=REL_EXACT, abs=1e-12)
    assert "[kN]" in fig.axes[1].get_xlabel()


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
