"""The sweep's chart: one response against one or two varied keys."""

from __future__ import annotations

from collections.abc import Sequence
from typing import Any

from matplotlib.figure import Figure

from plyshear import units as _units
from plyshear.report.diagrams import INK, style_axes

#: Responses that can be plotted, with their dimension (for the axis label).
RESPONSES = {
    "utilization": "ratio",
    "max_shear": "force",
    "max_moment": "moment",
    "capacity_elastic": "force",
    "capacity_nonlinear": "force",
    "capacity_collapse": "force",
    "capacity_plastic": "force",
    "efficiency_nonlinear": "ratio",
}
#: Beyond this many values of the series key, two keys are drawn as a colour map.
MAX_LINES = 8
_MARKERS = "osD^v<>p"


def response_dimension(response: str) -> str | None:
    """The dimension of a response column, or None if it is not a plottable one."""
    if response in RESPONSES:
        return RESPONSES[response]
    if response.startswith("shear_plane_") and response[12:].isdigit():
        return "force"
    return None


def sweep_figure(
    rows: Sequence[dict[str, Any]],
    x: str,
    series: str | None,
    fixed: dict[str, Any],
    response: str,
    units: str,
    title: str = "",
) -> Figure:
    """Plot ``response`` against key ``x``, one line per value of key ``series``.

    Args:
        rows: The sweep's rows (failed cases are left out).
        x: The key on the horizontal axis.
        series: A second key (one line per value, or a colour map when it has
            more than :data:`MAX_LINES` values), or None.
        fixed: Values of the other varied keys at which the chart is drawn.
        response: The plotted column.
        units: The model's unit system.
        title: A title (the model the variants come from).

    Returns:
        The figure.
    """
    dim = response_dimension(response)
    if dim is None:
        raise ValueError(f"cannot plot {response!r}")
    u = _units.system(units)
    label = response.replace("_", " ") + ("" if dim == "ratio" else f" [{u.label(dim)}]")
    keep = [
        r
        for r in rows
        if not r.get("error")
        and r.get(response) is not None
        and all(r.get(k) == v for k, v in fixed.items())
    ]
    xs = _distinct((r[x] for r in keep), key_dimension(x))
    numeric = all(isinstance(v, int | float) and not isinstance(v, bool) for v in xs)
    pos = {v: (v if numeric else i) for i, v in enumerate(xs)}
    fig = Figure(figsize=(7.0, 4.2), layout="constrained")
    ax = fig.subplots()
    groups = _distinct((r[series] for r in keep), key_dimension(series)) if series else [None]
    if (
        series
        and len(groups) > MAX_LINES
        and numeric
        and all(isinstance(v, int | float) for v in groups)
    ):
        import numpy as np

        grid = np.full((len(groups), len(xs)), np.nan)
        for r in keep:
            grid[groups.index(r[series]), xs.index(r[x])] = r[response]
        mesh = ax.pcolormesh(
            np.array(xs, dtype=float),
            np.array(groups, dtype=float),
            grid,
            shading="nearest",
            cmap="viridis",
        )
        fig.colorbar(mesh, ax=ax, label=label)
        ax.set_ylabel(key_label(series, units))
    else:
        for n, g in enumerate(groups):
            pts = sorted((pos[r[x]], r[response]) for r in keep if series is None or r[series] == g)
            ax.plot(
                [p[0] for p in pts],
                [p[1] for p in pts],
                color=INK,
                marker=_MARKERS[n % len(_MARKERS)],
                linestyle="-",
                linewidth=1.0,
                markersize=4,
                alpha=1.0 - 0.6 * n / max(len(groups), 1),
                label=None if series is None else f"{series} = {g}",
            )
        ax.set_ylabel(label)
        if response == "utilization":
            ax.axhline(1.0, color="#aa0000", linewidth=0.8, linestyle="--")
        if series:
            ax.legend(fontsize=7, frameon=False)
    style_axes(ax)  # first: it sets a tick locator of its own
    if not numeric:
        ax.set_xticks(list(pos.values()), [str(v) for v in xs])
    ax.set_xlabel(key_label(x, units))
    at = ", ".join(f"{k} = {v}" for k, v in fixed.items())
    head = " — ".join(t for t in (title, f"at {at}" if at else "") if t)
    if head:
        ax.set_title(head, fontsize=9)
    return fig


#: The dimension of the values of a key, by its last part (for the axis label).
KEY_DIMENSIONS = {
    "diameter": "length",
    "length": "length",
    "thread_length": "length",
    "thickness": "length",
    "gap": "length",
    "edge": "length",
    "width": "length",
    "pitch": "length",
    "hole_offset": "length",
    "hole_clearance": "length",
    "joint_length": "length",
    "load": "force",
    "pretension": "force",
    "tension": "force",
    "fy": "stress",
    "fu": "stress",
    "E": "stress",
    "foundation_modulus": "stress",
    "link_stiffness": "stiffness",
}


def key_label(key: str, units: str) -> str:
    """The axis label of a varied key, with its unit where the key has one."""
    dim = KEY_DIMENSIONS.get(key.rsplit(".", 1)[-1])
    return key if dim is None else f"{key} [{_units.system(units).label(dim)}]"


def key_dimension(key: str | None) -> str | None:
    """The dimension of a varied key's values, or None (a name, a ratio)."""
    return None if key is None else KEY_DIMENSIONS.get(key.rsplit(".", 1)[-1])


def _distinct(values: Any, dimension: str | None = None) -> list[Any]:
    """The distinct values in natural order: numbers by value, names like 8.8 and 10.9 too.

    Values with a unit ("3/4 in", "1 in", "25 mm") sort by their quantity in the
    key's ``dimension``, not as text.
    """
    out: list[Any] = []
    for v in values:
        if v not in out:
            out.append(v)

    def order(v: Any) -> tuple[int, float, str]:
        try:
            return (0, float(v), "")
        except (TypeError, ValueError):
            pass
        if dimension is not None and isinstance(v, str):
            try:
                return (0, _units.parse_quantity(v, dimension), "")
            except ValueError:
                pass
        return (1, 0.0, str(v))

    return sorted(out, key=order)
