"""The sweep chart draws the rows it is given: lines, a colour map, natural order of names."""

from __future__ import annotations

import numpy as np
import pytest

from plyshear.report.sweepplot import key_label, sweep_figure


def _rows(xs, series, f):
    rows, case = [], 1
    for s in series:
        for x in xs:
            rows.append({"case": case, "error": "", "a": x, "b": s, "max_shear": f(x, s)})
            case += 1
    return rows


def test_many_series_values_become_a_colour_map() -> None:
    xs, ss = [10, 12, 14], list(range(20, 30))  # ten values of b: more than MAX_LINES
    rows = _rows(xs, ss, lambda x, s: x * 100 + s)
    fig = sweep_figure(rows, "a", "b", {}, "max_shear", "kN-mm")
    mesh = fig.axes[0].collections[0]
    grid = np.asarray(mesh.get_array()).reshape(len(ss), len(xs))
    assert grid == pytest.approx(np.array([[x * 100 + s for x in xs] for s in ss]))


def test_names_sort_naturally_and_failed_cases_are_left_out() -> None:
    rows = _rows(["10.9", "4.6", "8.8"], [1], lambda x, s: float(x))
    rows.append({"case": 9, "error": "ply[1].thickness: too thick", "a": "5.6", "b": 1})
    fig = sweep_figure(rows, "a", None, {}, "max_shear", "kN-mm")
    ax = fig.axes[0]
    assert [t.get_text() for t in ax.get_xticklabels()] == ["4.6", "8.8", "10.9"]
    assert list(ax.get_lines()[0].get_ydata()) == [4.6, 8.8, 10.9]


def test_axis_labels_carry_units() -> None:
    assert key_label("ply[2].thickness", "kip-in") == "ply[2].thickness [in]"
    assert key_label("member.lug.load", "kN-mm") == "member.lug.load [kN]"
    assert key_label("bolt.grade", "kN-mm") == "bolt.grade"
