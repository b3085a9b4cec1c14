"""Figures for the terminal's ``--plot`` and the calculation report.

Free functions that draw on an Axes (``plot_shear(solution, ax=None)``) and
return it; :func:`solution_figure` composes the stack and the diagrams. Figures
are built with :class:`matplotlib.figure.Figure` (no pyplot state, no
``show()``, and so no global backend to select: a Figure saves itself through
the canvas of the file format), legible in greyscale: plies are told apart by hatching and grey
level, curves by line style.
"""

from __future__ import annotations

import io
from typing import Any

import numpy as np
from matplotlib.axes import Axes
from matplotlib.figure import Figure
from matplotlib.patches import Rectangle
from matplotlib.ticker import MaxNLocator

from plyshear.mechanics.capacity import CapacitySummary
from plyshear.mechanics.results import Solution, signed_resultant
from plyshear.mechanics.strengths import pin_hole
from plyshear.mechanics.studies import PlanesRow, ScatterResult
from plyshear.model.joint import Joint, Ply
from plyshear.report.quantities import display
from plyshear.report.text import fmt

INK = "#1b1b1b"
GREYS = ("#d9d9d9", "#9e9e9e", "#f2f2f2", "#6e6e6e", "#bdbdbd", "#ffffff")
HATCHES = ("", "///", "...", "\\\\\\", "xx", "--")
FILLER_HATCH = "oo"


def _new_axes(ax: Axes | None) -> Axes:
    if ax is not None:
        return ax
    fig = Figure(figsize=(4, 5), layout="constrained")
    return fig.add_subplot()


def style_axes(ax: Axes) -> None:
    """The house style of an axes: a few x ticks, a light grid, open top and right."""
    ax.xaxis.set_major_locator(MaxNLocator(nbins=4))
    ax.grid(True, color="#cccccc", linewidth=0.5)
    for side in ("top", "right"):
        ax.spines[side].set_visible(False)
    ax.tick_params(labelsize=8)


def member_styles(joint: Joint) -> dict[str | None, tuple[str, str]]:
    """Return (fill grey, hatch) for each member name, and for fillers (None)."""
    styles: dict[str | None, tuple[str, str]] = {
        m.name: (GREYS[i % len(GREYS)], HATCHES[i % len(HATCHES)])
        for i, m in enumerate(joint.members)
    }
    styles[None] = ("#ffffff", FILLER_HATCH)
    return styles


def _pin_plate_dimensions(joint: Joint, ply: Ply, ln: float) -> str:
    """A pin plate's a (beyond the hole, along the force) and c (beside it), as a label tail."""
    if joint.check.connector != "pin" or ply.edge is None or ply.width is None:
        return ""
    dh = pin_hole(joint)
    return f"  a {fmt((ply.edge - dh / 2.0) / ln, 3)}, c {fmt((ply.width - dh) / 2.0 / ln, 3)}"


def plot_stack(joint: Joint, ax: Axes | None = None, dimensions: bool = True) -> Axes:
    """Draw the stack elevation: plies as bars across the bolt, z downwards.

    Args:
        joint: The joint.
        ax: Axes to draw on (a new figure when omitted).
        dimensions: Dimension every ply thickness and gap on the left.

    Returns:
        The Axes.
    """
    ax = _new_axes(ax)
    u = display(joint.units)
    ln = u.factor("length")
    styles = member_styles(joint)
    d = joint.bolt.diameter / ln
    starts = joint.ply_starts() / ln
    width = 6.0 * d
    for j, ply in enumerate(joint.plies):
        fill, hatch = styles[ply.member]
        ax.add_patch(
            Rectangle(
                (-width / 2, starts[j]),
                width,
                ply.thickness / ln,
                facecolor=fill,
                edgecolor=INK,
                hatch=hatch,
                linewidth=0.8,
            )
        )
        label = ply.name if ply.member is None else f"{ply.name} ({ply.member})"
        label += _pin_plate_dimensions(joint, ply, ln) if dimensions else ""
        ax.text(
            width / 2 + 0.3 * d,
            starts[j] + ply.thickness / ln / 2,
            label,
            va="center",
            fontsize=7,
            color=INK,
        )
    grip = joint.grip / ln
    _draw_bolt(joint, ax, d, ln)
    _stack_legend(joint, ax, styles)
    if dimensions:
        x_dim = -width / 2 - 0.5 * d
        ends = starts + np.array([p.thickness / ln for p in joint.plies])
        edges = [0.0]
        for e in sorted([*starts.tolist(), *ends.tolist()]):
            if e - edges[-1] > 1e-9 * max(grip, 1.0):
                edges.append(e)
        for a, b in zip(edges, edges[1:], strict=False):
            ax.annotate(
                "",
                (x_dim, a),
                (x_dim, b),
                arrowprops={"arrowstyle": "<->", "color": INK, "linewidth": 0.6},
            )
            ax.text(
                x_dim - 0.15 * d,
                0.5 * (a + b),
                fmt(b - a, 3),
                rotation=90,
                fontsize=6,
                ha="right",
                va="center",
                color=INK,
            )
    ax.axvline(0.0, color=INK, linewidth=0.5, linestyle="-.")
    ax.set_xlim(-width / 2 - (2.0 if dimensions else 1.0) * d, width / 2 + 4 * d)
    ax.set_ylim(*stack_ylim(joint))
    ax.set_xticks([])
    ax.set_ylabel(f"z along bolt [{u.label('length')}]")
    ax.set_title("stack", fontsize=9)
    for side in ("top", "right", "bottom"):
        ax.spines[side].set_visible(False)
    return ax


def stack_ylim(joint: Joint) -> tuple[float, float]:
    """The z range of the stack's elevation (head to the bolt's end), report units, downwards."""
    ln = display(joint.units).factor("length")
    d, grip = joint.bolt.diameter / ln, joint.grip / ln
    length = grip if joint.bolt.length is None else joint.bolt.length / ln
    return max(grip, length) + 0.3 * d, -0.8 * d


def _draw_bolt(joint: Joint, ax: Axes, d: float, ln: float) -> None:
    """The bolt to its real length (under-head), its head, and where its thread starts.

    Without a length in the model the bolt is drawn just past the grip, dashed.
    """
    b = joint.bolt
    grip = joint.grip / ln
    known = b.length is not None
    length = b.length / ln if b.length is not None else grip + 0.2 * d
    ax.add_patch(
        Rectangle(
            (-d / 2, 0.0),
            d,
            length,
            facecolor="none",
            edgecolor=INK,
            linewidth=1.2,
            linestyle="-" if known else "--",
        )
    )
    ax.add_patch(
        Rectangle(
            (-0.8 * d, -0.6 * d),
            1.6 * d,
            0.6 * d,
            facecolor="#ffffff",
            edgecolor=INK,
            linewidth=1.0,
        )
    )  # the head (or the pin's collar)
    if known and b.thread_length:
        start = length - b.thread_length / ln
        ax.plot([-d / 2, d / 2], [start, start], color=INK, linewidth=1.0)
        for x in (-0.4 * d, 0.4 * d):
            ax.plot([x, x], [start, length], color=INK, linewidth=0.5, linestyle=":")
        ax.text(
            0.0,
            start,
            "thread",
            fontsize=6,
            ha="center",
            va="bottom",
            color=INK,
            bbox={"facecolor": "white", "edgecolor": "none", "pad": 0.5},
        )


def _stack_legend(joint: Joint, ax: Axes, styles: dict[str | None, tuple[str, str]]) -> None:
    """What each fill and hatching of the stack means: a member each, loose fillers/packs."""
    from matplotlib.lines import Line2D

    handles: list[Any] = [
        Rectangle(
            (0, 0),
            1,
            1,
            facecolor=styles[m.name][0],
            hatch=styles[m.name][1],
            edgecolor=INK,
            linewidth=0.6,
            label=f"member {m.name}",
        )
        for m in joint.members
    ]
    if any(p.member is None for p in joint.plies):
        fill, hatch = styles[None]
        handles.append(
            Rectangle(
                (0, 0),
                1,
                1,
                facecolor=fill,
                hatch=hatch,
                edgecolor=INK,
                linewidth=0.6,
                label="loose filler / pack (no member)",
            )
        )
    known = joint.bolt.length is not None
    handles.append(
        Line2D(
            [],
            [],
            color=INK,
            linewidth=1.2,
            linestyle="-" if known else "--",
            label="bolt to its length" if known else "bolt (length not given)",
        )
    )
    ax.legend(
        handles=handles,
        fontsize=6,
        frameon=False,
        loc="upper center",
        bbox_to_anchor=(0.5, -0.02),
        ncol=1,
        handlelength=1.5,
    )


#: The sign rule printed on each diagram (the result records' own conventions).
SIGN_RULES = {
    "shear": "V: force on the head-side plies,\n+ along the load",
    "moment": "M: dM/dz = V, 0 at a free head",
    "pressure": "bearing of the bolt on each ply,\n+ along the load; dashed: strength",
}


def _sign_rule(ax: Axes, which: str) -> None:
    ax.text(
        0.02,
        0.01,
        SIGN_RULES[which],
        transform=ax.transAxes,
        fontsize=6,
        va="bottom",
        ha="left",
        color="#444444",
        bbox={"facecolor": "white", "edgecolor": "none", "alpha": 0.8, "pad": 0.5},
    )


def _components(ax: Axes, joint: Joint, arr: np.ndarray, z: np.ndarray, k: float) -> None:
    """The x and y components of an inclined load's diagram, dashed and dotted."""
    if np.allclose(arr[:, 1], 0.0) or np.allclose(arr[:, 0], 0.0):
        return
    ax.plot(arr[:, 0] / k, z, color=INK, linewidth=0.7, linestyle="--", label="x")
    ax.plot(arr[:, 1] / k, z, color=INK, linewidth=0.7, linestyle=":", label="y")
    ax.legend(fontsize=6, frameon=False, loc="lower right")


def _diagram(sol: Solution, which: str, ax: Axes | None, bolt: int, **kw: Any) -> Axes:
    ax = _new_axes(ax)
    joint = sol.joint
    u = display(joint.units)
    b = sol.bolts[bolt]
    dim = {"shear": "force", "moment": "moment", "deflection": "length"}[which]
    arr = {"shear": b.V, "moment": b.M, "deflection": b.w}[which]
    values = signed_resultant(arr, joint.load_axis()) / u.factor(dim)
    z = b.z / u.factor("length")
    style = {"color": INK, "linewidth": 1.4, **kw}
    ax.plot(values, z, **style)
    ax.fill_betweenx(z, 0.0, values, color="#bbbbbb", alpha=0.5, linewidth=0)
    ax.axvline(0.0, color=INK, linewidth=0.6)
    if which != "deflection":
        _components(ax, joint, arr, z, u.factor(dim))
        _sign_rule(ax, which)
        for p in b.planes:
            ax.axhline(p.z / u.factor("length"), color="#888888", linewidth=0.5, linestyle=":")
    ax.set_ylim(z[-1] + 0.05 * (z[-1] - z[0]), z[0] - 0.05 * (z[-1] - z[0]))
    symbol = {"shear": "V", "moment": "M", "deflection": "w"}[which]
    ax.set_xlabel(f"bolt {which} {symbol} [{u.label(dim)}]")
    ax.set_ylabel(f"z along bolt [{u.label('length')}]")
    style_axes(ax)
    return ax


def plot_shear(
    solution: Solution,
    ax: Axes | None = None,
    bolt: int = 0,
    utilization: dict[int, float] | None = None,
    **kw: Any,
) -> Axes:
    """Draw the bolt shear V(z) (signed resultant); plane shears are labelled.

    Args:
        solution: The solution.
        ax: Axes to draw on (a new figure when omitted).
        bolt: Which bolt.
        utilization: Utilization of each plane (by plane index), added to its label.
        **kw: Passed to ``Axes.plot``.

    Returns:
        The Axes; its first line holds (V, z) in the joint's units.
    """
    ax = _diagram(solution, "shear", ax, bolt, **kw)
    u = display(solution.joint.units)
    for p in solution.bolts[bolt].planes:
        v = signed_resultant(_as_row(p.shear_xy), solution.joint.load_axis())[0]
        label = fmt(p.shear / u.factor("force"), 3)
        if utilization and p.index in utilization:
            label += f" ({utilization[p.index]:.2f})"
        right = v >= 0.0  # the label sits outside the curve: right of a positive peak
        ax.annotate(
            label,
            (v / u.factor("force"), p.z / u.factor("length")),
            fontsize=7,
            xytext=(3 if right else -3, -3),
            textcoords="offset points",
            color=INK,
            ha="left" if right else "right",
            va="top",
            bbox={"facecolor": "white", "edgecolor": "none", "alpha": 0.85, "pad": 0.3},
        )
    return ax


def plot_moment(solution: Solution, ax: Axes | None = None, bolt: int = 0, **kw: Any) -> Axes:
    """Draw the bolt bending moment M(z) (signed resultant).

    Returns:
        The Axes; its first line holds (M, z) in the joint's units.
    """
    return _diagram(solution, "moment", ax, bolt, **kw)


def plot_bearing_pressure(
    solution: Solution, ax: Axes | None = None, bolt: int = 0, **kw: Any
) -> Axes:
    """Draw the bearing pressure on the bolt, q(z) / d (force per unit length over d).

    The pressure is the bearing of the bolt on the plies (the ply-bearing table's
    force, per unit length over d), signed along the load; each ply's bearing
    strength is drawn dashed.

    Returns:
        The Axes; its first line holds (q/d, z) in stress units of the joint.
    """
    ax = _new_axes(ax)
    joint = solution.joint
    u = display(joint.units)
    b = solution.bolts[bolt]
    ends = -b.q.reshape(-1, 2)  # element ends in z order: (ne * 2, comp); on the ply
    q = signed_resultant(ends, joint.load_axis()) / joint.bolt.diameter / u.factor("stress")
    z = np.stack([b.z[:-1], b.z[1:]], axis=1).ravel() / u.factor("length")
    ax.plot(q, z, color=INK, linewidth=1.2, **kw)
    ax.fill_betweenx(z, 0.0, q, color="#dddddd", linewidth=0)
    z = b.z / u.factor("length")
    ax.axvline(0.0, color=INK, linewidth=0.6)
    ax.set_ylim(z[-1] + 0.05 * (z[-1] - z[0]), z[0] - 0.05 * (z[-1] - z[0]))
    _bearing_strengths(joint, ax, u.factor("length"), u.factor("stress"))
    _sign_rule(ax, "pressure")
    ax.set_xlabel(f"bearing pressure q/d [{u.label('stress')}]")
    ax.set_ylabel(f"z along bolt [{u.label('length')}]")
    style_axes(ax)
    return ax


def _bearing_strengths(joint: Joint, ax: Axes, ln: float, st: float) -> None:
    """Each ply's bearing strength per unit length over d, dashed, on both sides of zero."""
    from plyshear.mechanics.strengths import ply_bearing

    strength, _ = ply_bearing(joint)
    starts = joint.ply_starts()
    for p, z0, qs in zip(joint.plies, starts, strength, strict=True):
        level = qs / joint.bolt.diameter / st
        for sign in (1.0, -1.0):
            ax.plot(
                [sign * level] * 2,
                [z0 / ln, (z0 + p.thickness) / ln],
                color=INK,
                linewidth=0.7,
                linestyle="--",
            )


def plot_deflection(solution: Solution, ax: Axes | None = None, bolt: int = 0, **kw: Any) -> Axes:
    """Draw the bolt deflection w(z).

    Returns:
        The Axes; its first line holds (w, z) in the joint's units.
    """
    return _diagram(solution, "deflection", ax, bolt, **kw)


def _as_row(v: tuple[float, float]) -> Any:
    return np.array([v])


def solution_figure(
    solution: Solution, utilization: dict[int, float] | None = None, pressure: bool = False
) -> Figure:
    """Return the stack beside the bolt's shear and moment diagrams, on one z axis.

    Args:
        solution: The solution.
        utilization: Plane utilizations to print beside the plane shears.
        pressure: Add a panel with the bearing pressure along the bolt.
    """
    panels = 4 if pressure else 3
    fig = Figure(figsize=(12 if pressure else 10, 5), layout="constrained")
    ratios = [1.3] + [1] * (panels - 1)
    axs = fig.subplots(1, panels, sharey=True, gridspec_kw={"width_ratios": ratios})
    plot_stack(solution.joint, axs[0])
    plot_shear(solution, axs[1], utilization=utilization)
    plot_moment(solution, axs[2])
    titles = ["shear (utilization)" if utilization else "shear", "bending moment"]
    if pressure:
        plot_bearing_pressure(solution, axs[3])
        titles.append("bearing pressure")
    for ax, title in zip(axs[1:], titles, strict=True):
        ax.set_ylabel("")
        ax.set_title(title, fontsize=9)
    axs[0].set_ylim(*stack_ylim(solution.joint))  # shared: the whole bolt in every panel
    if solution.joint.title:
        fig.suptitle(solution.joint.title, fontsize=10)
    return fig


def row_figure(solution: Solution) -> Figure:
    """The load share along a bolt row beside the first bolt's diagrams."""
    fig = Figure(figsize=(13, 5), layout="constrained")
    axs = fig.subplots(1, 4, gridspec_kw={"width_ratios": [1.3, 1, 1, 1.4]})
    plot_stack(solution.joint, axs[0])
    plot_shear(solution, axs[1])
    plot_moment(solution, axs[2])
    axs[1].set_title("shear, bolt 1", fontsize=9)
    axs[2].set_title("moment, bolt 1", fontsize=9)
    plot_row(solution, axs[3])
    if solution.joint.title:
        fig.suptitle(solution.joint.title, fontsize=10)
    return fig


def figure_bytes(fig: Figure, fmt: str, salt: str = "plyshear") -> bytes:
    """Render a figure to PNG, SVG or PDF bytes (the caller writes the file).

    The bytes depend only on the figure: SVG ids are hashed with ``salt`` (give
    each figure of one document its own, so their ids differ), and no date is
    written (PDF and PNG take ``SOURCE_DATE_EPOCH`` if it is set).
    """
    import matplotlib

    buf = io.BytesIO()
    meta = {"Date": None} if fmt == "svg" else {}
    with matplotlib.rc_context({"svg.hashsalt": salt}):
        fig.savefig(buf, format=fmt, dpi=150, metadata=meta)
    return buf.getvalue()


LINESTYLES = ("-", "--", "-.", ":", (0, (5, 1, 1, 1)), (0, (1, 2)))


def plot_load_slip(summary: CapacitySummary, joint: Joint, ax: Axes | None = None) -> Axes:
    """Draw the joint's load against its slip (generalised displacement along the load).

    Returns:
        The Axes; its first line holds (slip, load) in the joint's units.
    """
    ax = _new_axes(ax)
    u = display(joint.units)
    hist = summary.analysis.history
    slip = [s.slip / u.factor("length") for s in hist]
    load = [s.load / u.factor("force") for s in hist]
    ax.plot(slip, load, color=INK, linewidth=1.4, marker=".", markersize=3)
    for answer, label, style in (
        (summary.collapse, "collapse (LP)", "-."),
        (summary.plastic, "shear-only bound", "--"),
    ):
        level = answer.load / u.factor("force")
        ax.axhline(level, color=INK, linestyle=style, linewidth=0.8)
        ax.annotate(
            label, (slip[-1], level), fontsize=7, xytext=(-70, 3), textcoords="offset points"
        )
    ax.plot([slip[-1]], [load[-1]], marker="x", color=INK)
    ax.set_xlabel(f"slip along the load [{u.label('length')}]")
    ax.set_ylabel(f"load [{u.label('force')}]")
    ax.set_title("load–slip", fontsize=9)
    style_axes(ax)
    return ax


def plot_plane_shares(summary: CapacitySummary, joint: Joint, ax: Axes | None = None) -> Axes:
    """Draw every plane's shear against the joint load (which plane saturates first).

    Returns:
        The Axes; line k holds (load, shear of plane k+1) in the joint's units.
    """
    ax = _new_axes(ax)
    u = display(joint.units)
    f = u.factor("force")
    hist = summary.analysis.history
    load = np.array([s.load for s in hist]) / f
    shear = np.array([s.plane_shear for s in hist]) / f  # (states, bolts, planes)
    many = shear.shape[1] > 1
    for b in range(shear.shape[1]):
        for k in range(shear.shape[2]):
            label = f"bolt {b + 1} plane {k + 1}" if many else f"plane {k + 1}"
            ax.plot(
                load,
                shear[:, b, k],
                color=INK,
                linestyle=LINESTYLES[k % len(LINESTYLES)],
                linewidth=1.2 if b in (0, shear.shape[1] - 1) else 0.5,
                label=label if (not many or b in (0, shear.shape[1] - 1)) else None,
            )
    ax.axhline(summary.plane_strength / f, color="#777777", linewidth=0.8)
    ax.set_xlabel(f"joint load [{u.label('force')}]")
    ax.set_ylabel(f"plane shear [{u.label('force')}]")
    ax.set_title("plane shears", fontsize=9)
    ax.legend(fontsize=7, frameon=False)
    style_axes(ax)
    return ax


def plot_row_at_capacity(summary: CapacitySummary, joint: Joint, ax: Axes | None = None) -> Axes:
    """Each plane's shear along a bolt row at the first step and at capacity (scaled).

    Returns:
        The Axes; the lines hold (x, plane shear / load) per plane, first at the
        start of loading, then at capacity.
    """
    ax = _new_axes(ax)
    u = display(joint.units)
    x = np.asarray(joint.stations) / u.factor("length")
    hist = [s for s in summary.analysis.history if s.load > 0]
    for state, style, when in ((hist[0], ":", "service"), (hist[-1], "-", "capacity")):
        share = state.plane_shear / state.load
        for k in range(share.shape[1]):
            ax.plot(
                x,
                share[:, k],
                color=INK,
                linestyle=style,
                marker="os^vD"[k % 5],
                markersize=3,
                label=f"plane {k + 1}, {when}",
            )
    ax.set_xlabel(f"bolt position x [{u.label('length')}]")
    ax.set_ylabel("plane shear / joint load [-]")
    ax.set_title("share along the row", fontsize=9)
    ax.legend(fontsize=6, frameon=False)
    style_axes(ax)
    return ax


def capacity_figure(summary: CapacitySummary, joint: Joint) -> Figure:
    """Return the load–slip curve beside the plane shears against load.

    For a bolt row, a third panel shows the share along the row at the start of
    loading and at capacity.
    """
    row = len(joint.stations) > 1
    fig = Figure(figsize=(14 if row else 10, 4.2), layout="constrained")
    axs = fig.subplots(1, 3 if row else 2)
    plot_load_slip(summary, joint, axs[0])
    plot_plane_shares(summary, joint, axs[1])
    if row:
        plot_row_at_capacity(summary, joint, axs[2])
    if joint.title:
        fig.suptitle(joint.title, fontsize=10)
    return fig


def planes_figure(rows: list[PlanesRow], joint: Joint) -> Figure:
    """Capacity and plane efficiency against the number of planes (the study's chart)."""
    u = display(joint.units)
    f = u.factor("force")
    n = [r.planes for r in rows]
    fig = Figure(figsize=(10, 4.2), layout="constrained")
    axs = fig.subplots(1, 2)
    marks = {
        "elastic": ("o", ":", "elastic"),
        "nonlinear": ("s", "-", "nonlinear"),
        "collapse": ("D", "-.", "collapse (LP)"),
        "plastic": ("^", "--", "shear-only bound"),
    }
    for key, (marker, style, label) in marks.items():
        loads = [r.summary.answers[key].load / f for r in rows]
        eff = [r.summary.efficiency(r.summary.answers[key].load) for r in rows]
        axs[0].plot(n, loads, color=INK, marker=marker, linestyle=style, label=label)
        axs[1].plot(n, eff, color=INK, marker=marker, linestyle=style, label=label)
    ideal = [r.planes * r.summary.plane_strength / f for r in rows]
    axs[0].plot(n, ideal, color="#888888", linewidth=0.8, label="planes x one plane")
    axs[0].set_ylabel(f"capacity [{u.label('force')}]")
    axs[1].set_ylabel("plane efficiency [-]")
    axs[1].axhline(1.0, color="#888888", linewidth=0.8)
    for ax in axs:
        ax.set_xlabel("number of shear planes [-]")
        ax.set_xticks(n)
        ax.legend(fontsize=7, frameon=False)
        style_axes(ax)
        ax.xaxis.set_major_locator(MaxNLocator(integer=True))
    axs[0].set_title("capacity", fontsize=9)
    axs[1].set_title("does the extra plane pay?", fontsize=9)
    if joint.title:
        fig.suptitle(joint.title, fontsize=10)
    return fig


def scatter_figure(result: ScatterResult, joint: Joint) -> Figure:
    """Histograms of the worst plane shear at the model's load and of the capacity.

    A vertical line marks the model's load on the capacity histogram (samples to
    its left fail below it) and its equal split over the planes on the shear
    histogram. Samples with no finite value (failed below the load, not
    converged) cannot be drawn; the panel's title counts them.
    """
    u = display(joint.units)
    f, lf = u.factor("force"), u.label("force")
    fig = Figure(figsize=(10, 4.0), layout="constrained")
    axs = fig.subplots(1, 2)
    load = result.service_load / f
    panels = (
        (
            axs[0],
            result.service_shear,
            "worst plane shear at the model's load",
            load / result.planes,
            f"equal split {load / result.planes:.4g} {lf}",
        ),
        (axs[1], result.capacity, "capacity", load, f"model load {load:.4g} {lf}"),
    )
    for ax, values, label, mark, mark_label in panels:
        finite = values[np.isfinite(values)] / f
        if finite.size:
            ax.hist(
                finite,
                bins=min(30, max(5, finite.size // 10)),
                color="#bbbbbb",
                edgecolor=INK,
                linewidth=0.6,
            )
        ax.axvline(mark, color=INK, linestyle="--", linewidth=1.0, label=mark_label)
        ax.legend(fontsize=7, frameon=False)
        off = values.size - finite.size
        if off:
            ax.set_title(f"{off} of {values.size} samples not drawn (no finite value)", fontsize=8)
        ax.set_xlabel(f"{label} [{lf}]")
        ax.set_ylabel("samples [-]")
        style_axes(ax)
        ax.yaxis.set_major_locator(MaxNLocator(integer=True))
    fig.suptitle(
        f"hole positions scattered within {result.clearance:.3g} mm clearance "
        f"({result.service_shear.size} samples)",
        fontsize=10,
    )
    return fig


def plot_row(solution: Solution, ax: Axes | None = None) -> Axes:
    """Draw each plane's shear at every bolt along the row (the long-joint share).

    Returns:
        The Axes; line k holds (x, shear of plane k+1) in the joint's units.
    """
    ax = _new_axes(ax)
    joint = solution.joint
    u = display(joint.units)
    x = np.array([b.x for b in solution.bolts]) / u.factor("length")
    shear = np.array([[p.shear for p in b.planes] for b in solution.bolts]) / u.factor("force")
    for k in range(shear.shape[1]):
        ax.plot(
            x,
            shear[:, k],
            color=INK,
            marker="os^vD"[k % 5],
            linestyle=LINESTYLES[k % len(LINESTYLES)],
            linewidth=1.2,
            label=f"plane {k + 1}",
        )
    ax.set_xlabel(f"bolt position x [{u.label('length')}]")
    ax.set_ylabel(f"plane shear [{u.label('force')}]")
    ax.set_title("plane shears along the row", fontsize=9)
    ax.legend(fontsize=7, frameon=False)
    style_axes(ax)
    return ax
