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
    assert np.asarray(v) == pytest.approx(
        signed_resultant(b.V, axis) / u.factor("force"), rel=REL_EXACT, abs=1e-12
    )
    m, _ = moment.lines[0].get_data()
    assert np.asarray(m) == pytest.approx(
        signed_resultant(b.M, axis) / u.factor("moment"), rel=REL_EXACT, abs=1e-12
    )
    q, _ = pressure.lines[0].get_data()
    # drawn as the bearing of the bolt on the plies, -q (q: the plies on the bolt), as the
    # ply-bearing table gives it
    expected = (
        signed_resultant(-b.q.reshape(-1, 2), axis) / joint.bolt.diameter / u.factor("stress")
    )
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


def test_importing_the_figures_selects_no_backend(tmp_path) -> None:
    # the user's backend stays theirs (MPLBACKEND, matplotlib's documented variable);
    # figures are still written, through the canvas of the file format
    import os
    import subprocess
    import sys

    code = (
        "import sys, matplotlib\n"
        "from plyshear.report import diagrams\n"
        "from matplotlib.figure import Figure\n"
        "fig = Figure()\nfig.add_subplot().plot([0, 1], [1, 0])\n"
        "png = diagrams.figure_bytes(fig, 'png')\n"
        "print(matplotlib.get_backend(), 'matplotlib.pyplot' in sys.modules, png[:4])"
    )
    env = {**os.environ, "MPLBACKEND": "svg"}
    out = subprocess.run(
        [sys.executable, "-c", code],
        capture_output=True,
        text=True,
        check=True,
        timeout=120,
        env=env,
        cwd=tmp_path,
    )
    assert out.stdout.split() == ["svg", "False", r"b'\x89PNG'"]


def _stack_axes(name: str):
    joint = plyshear.load_model(MODELS / name)
    sol = plyshear.solve(joint)
    return joint, sol, diagrams.solution_figure(sol, pressure=True)


def test_stack_legend_names_every_member_and_the_filler() -> None:
    _, _, fig = _stack_axes("splice-with-filler.toml")
    labels = [t.get_text() for t in fig.axes[0].get_legend().get_texts()]
    assert "member beam" in labels
    assert "member splice-plates" in labels
    assert "loose filler / pack (no member)" in labels


def test_bolt_is_drawn_to_its_length_with_its_thread_start() -> None:
    _, _, fig = _stack_axes("fork-four-planes.toml")
    stack = fig.axes[0]
    # from the model file: length = 110 mm, thread_length = 54 mm: the thread starts at 56
    heights = [p.get_height() for p in stack.patches]
    assert any(h == pytest.approx(110.0, rel=REL_EXACT) for h in heights)
    rules = [line.get_ydata() for line in stack.lines if len(line.get_ydata()) == 2]
    assert any(list(y) == pytest.approx([56.0, 56.0], rel=REL_EXACT) for y in rules)
    low, high = sorted(stack.get_ylim())
    assert high >= 110.0  # the whole bolt is in view


def test_negative_plane_labels_sit_clear_of_the_curve() -> None:
    _, sol, fig = _stack_axes("fork-four-planes.toml")
    shear = fig.axes[1]
    from matplotlib.backends.backend_agg import FigureCanvasAgg

    renderer = FigureCanvasAgg(fig).get_renderer()
    inverse = shear.transData.inverted()
    negative = [t for t in shear.texts if hasattr(t, "xy") and t.xy[0] < 0]
    assert negative  # the demo's planes 2 and 4 carry negative shear along the load
    for t in negative:
        box = t.get_window_extent(renderer)
        right_edge = inverse.transform((box.x1, box.y1))[0]
        assert right_edge <= t.xy[0]  # the whole label lies outside (left of) the peak


def test_every_diagram_states_its_sign_rule() -> None:
    _, _, fig = _stack_axes("fork-four-planes.toml")
    for ax, word in zip(fig.axes[1:], ("V:", "M:", "bearing of the bolt"), strict=True):
        assert any(word in t.get_text() for t in ax.texts), word


def test_bearing_pressure_has_the_ply_table_sign_and_the_strengths() -> None:
    from plyshear.mechanics.strengths import hole_clearance

    joint, sol, fig = _stack_axes("fork-four-planes.toml")
    pressure = fig.axes[3]
    q, z = (np.asarray(a) for a in pressure.lines[0].get_data())
    axis = joint.load_axis()
    starts = joint.ply_starts()
    for pb, z0, ply in zip(sol.bolts[0].plies, starts, joint.plies, strict=True):
        inside = (z > z0 + 1e-9) & (z < z0 + ply.thickness - 1e-9)
        table_sign = np.sign(np.dot(pb.force_xy, axis))  # the ply-bearing table's force
        assert np.sign(q[inside].mean()) == table_sign, ply.name
    # AISC J3.10(a): tear-out 1.2 lc t Fu per unit thickness, lc = e - dh/2, over d
    d, hanger = joint.bolt.diameter, joint.plies[1]
    dh = d + hole_clearance(joint)
    level = 1.2 * (hanger.edge - dh / 2) * hanger.fu / d
    drawn = [line.get_xdata()[0] for line in pressure.lines[1:] if line.get_linestyle() == "--"]
    assert any(x == pytest.approx(level, rel=REL_EXACT) for x in drawn)


def test_inclined_load_draws_x_and_y_components() -> None:
    _, _, fig = _stack_axes("lug-cheek-plates.toml")  # load [300, 120] kN
    labels = [t.get_text() for t in fig.axes[1].get_legend().get_texts()]
    assert labels == ["x", "y"]
    _, _, straight = _stack_axes("fork-four-planes.toml")
    assert straight.axes[1].get_legend() is None


def test_histogram_counts_are_integers() -> None:
    from plyshear.mechanics.studies import ScatterResult

    joint = plyshear.load_model(MODELS / "fork-four-planes.toml")
    result = ScatterResult(
        service_shear=np.array([60e3, 61e3, 63e3]),
        capacity=np.array([640e3, 650e3, 655e3]),
        service_load=250e3,
        clearance=2.0,
        failed=0,
        planes=4,
    )
    fig = diagrams.scatter_figure(result, joint)
    for ax in fig.axes:
        ticks = ax.get_yticks()
        assert all(float(t).is_integer() for t in ticks)
