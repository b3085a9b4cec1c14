"""The capacity answers as structured data: the JSON section, design values, the verdict.

The capacity analyses (:mod:`plyshear.mechanics.capacity`) are nominal; here
they meet the model's standard (its factor from nominal to design strength)
and the check's verdict, for the terminal, the JSON and the report alike.
"""

from __future__ import annotations

from dataclasses import dataclass
from typing import Any

from plyshear import units as _units
from plyshear.codes.check import load_level
from plyshear.codes.resistance import design_factor
from plyshear.codes.result import CheckResult
from plyshear.mechanics.capacity import Answer, CapacitySummary, governing_lugs, lug_rules
from plyshear.model.joint import Joint
from plyshear.report.numbers import fmt

#: The answers in the order they are reported, with their labels.
ANSWERS = (
    ("elastic", "elastic (linear, first event)"),
    ("nonlinear", "nonlinear (ultimate)"),
    ("collapse", "collapse (rigid-plastic, LP)"),
    ("plastic", "shear-only bound (max flow)"),
)


@dataclass(frozen=True)
class Verdict:
    """How the capacity stands against the model's load and the check.

    Attributes:
        agrees: Whether the nonlinear design capacity and the check say the same.
        text: One sentence for the report.
    """

    agrees: bool
    text: str


def factor(joint: Joint) -> tuple[float, str]:
    """The model's factor from a nominal capacity to a design value, and its basis."""
    return design_factor(joint.check.standard, joint.check.method)


def where(a: Answer, joint: Joint) -> str:
    """An answer's place in the joint's units."""
    if a.z is None:
        return a.where
    u = _units.system(joint.units)
    return f"{a.where} at z = {a.z / u.factor('length'):.4g} {u.label('length')}"


def mechanism_parts(summary: CapacitySummary, joint: Joint) -> list[str]:
    """The collapse mechanism, one phrase per active constraint, in the joint's units."""
    u = _units.system(joint.units)
    ln, ll = u.factor("length"), u.label("length")
    m = summary.mechanism.mechanism
    many = len(joint.stations) > 1

    def bolt(b: int) -> str:
        return f"bolt {b + 1} " if many else ""

    parts = [f"{bolt(h.bolt)}hinge at z = {h.z / ln:.4g} {ll}" for h in m.hinges]
    lugs = lug_rules(joint, summary.strengths)
    parts += [
        f"{bolt(b)}ply {name} at full bearing" + (f" ({lugs[name]})" if name in lugs else "")
        for b, name in m.bearing
    ]
    parts += [f"{bolt(b)}plane {i} ruptured" for b, i in m.planes]
    parts += [
        f"ply {name} net section between bolts {i + 1} and {i + 2}" for name, i in m.net_sections
    ]
    return parts


def mechanism_short(summary: CapacitySummary) -> str:
    """The collapse mechanism counted: hinges, plies at full bearing, planes ruptured."""
    m = summary.mechanism.mechanism
    out = [
        f"{len(m.hinges)} hinge{'s' * (len(m.hinges) != 1)}",
        f"{len(m.bearing)} ply bearing{'s' * (len(m.bearing) != 1)}",
        f"{len(m.planes)} plane{'s' * (len(m.planes) != 1)} ruptured",
    ]
    if m.net_sections:
        out.append(f"{len(m.net_sections)} net section{'s' * (len(m.net_sections) != 1)}")
    return ", ".join(out)


def _end_reason(summary: CapacitySummary, joint: Joint) -> str:
    """What ended the nonlinear analysis, and the rigid-plastic mechanism, in words."""
    a = summary.nonlinear
    out = (
        f"the analysis ended at {a.event} ({where(a, joint)}); its rigid-plastic "
        f"mechanism: {'; '.join(mechanism_parts(summary, joint)) or 'none'}"
    )
    if a.event in ("bolt fibre strain at elongation", "bolt bending and shear"):
        out += "; the check does not limit the bolt's bending"
    if (
        joint.bolt.ends == "free"
        and summary.mechanism.mechanism.hinges == ()
        and not summary.mechanism.mechanism.planes
        and summary.planes == len(joint.stations)
    ):
        out += (
            "; a single-shear bolt with free ends tips in its holes: a headed, tightened "
            'bolt may be nearer [bolt] ends = "clamped"'
        )
    return out


def verdict(summary: CapacitySummary, joint: Joint, result: CheckResult | None) -> Verdict:
    """Set the nonlinear design capacity against the model's load and the check's verdict."""
    f, basis = factor(joint)
    u = _units.system(joint.units)
    fu, lf = u.factor("force"), u.label("force")
    design = summary.nonlinear.load * f
    load = summary.model_load
    level = load_level(joint, joint.check.standard, joint.check.method)
    holds = design >= load
    numbers = (
        f"the nonlinear design capacity {fmt(design / fu)} {lf} ({basis}) against the "
        f"model's {level} load {fmt(load / fu)} {lf}"
    )
    if result is None:
        return Verdict(True, f"{numbers}: {'enough' if holds else 'NOT enough'}.")
    if result.passes and not holds:
        return Verdict(
            False, f"The check passes, but {numbers} is not enough: {_end_reason(summary, joint)}."
        )
    if not result.passes and holds:
        return Verdict(
            False,
            f"The check fails, but {numbers} is enough: the check takes the "
            "linear split, while the analysis lets the plies and the bolt yield "
            "and share the load; the standard's check governs the design.",
        )
    word = "passes" if result.passes else "fails"
    return Verdict(True, f"The check {word} and {numbers} agrees.")


def capacity_dict(
    summary: CapacitySummary, joint: Joint, result: CheckResult | None = None
) -> dict[str, Any]:
    """The JSON ``capacity`` section, in the joint's units."""
    u = _units.system(joint.units)
    f, ln, mo = u.factor("force"), u.factor("length"), u.factor("moment")
    k, basis = factor(joint)

    def answer(a: Answer) -> dict[str, Any]:
        return {
            "load": a.load / f,
            "design_load": a.load * k / f,
            "event": a.event,
            "where": where(a, joint),
        }

    s = summary.strengths
    hist = summary.analysis.history
    lp = summary.mechanism
    nonlinear = answer(summary.nonlinear)
    nonlinear["events"] = [
        {
            "event": e.event,
            "load": e.load / f,
            "where": where(Answer(e.load, e.event, e.where, e.z), joint),
        }
        for e in summary.analysis.events
    ]
    nonlinear["peak"] = summary.analysis.peak / f
    out: dict[str, Any] = {
        "planes": summary.planes,
        "plane_strength": summary.plane_strength / f,
        "model_load": summary.model_load / f,
        "design_factor": {"value": k, "basis": basis},
        "strengths": {
            "bolt_plastic_moment": s.shank_moment / mo,
            "planes": [
                {"index": i + 1, "shear_strength": float(v) / f, "threads": t}
                for i, (v, t) in enumerate(zip(s.plane, s.plane_threaded, strict=True))
            ],
            "plies": [
                {"name": p.name, "bearing_strength": float(q) / f, "rule": r}
                for p, q, r in zip(joint.plies, s.ply_force, s.bearing_rule, strict=True)
            ],
        },
        "elastic": answer(summary.elastic),
        "nonlinear": nonlinear,
        "collapse": {
            "load": summary.collapse.load / f,
            "design_load": summary.collapse.load * k / f,
            "efficiency": summary.efficiency(summary.collapse.load),
            "mechanism": {
                "hinges": [h.z / ln for h in lp.mechanism.hinges],
                "bearing": [name for _, name in lp.mechanism.bearing],
                "lugs": [
                    {"ply": name, "rule": rule} for name, rule in governing_lugs(joint, s, lp)
                ],
                "planes": [i for _, i in lp.mechanism.planes],
                "net_sections": [
                    f"{name} between bolts {i + 1} and {i + 2}"
                    for name, i in lp.mechanism.net_sections
                ],
            },
            "elements_per_ply": lp.elements,
        },
        "plastic": {
            "load": summary.plastic.load / f,
            "design_load": summary.plastic.load * k / f,
            "cut": list(summary.cut),
        },
        "efficiency": {name: summary.efficiency(a.load) for name, a in summary.answers.items()},
        "bearing": joint.analysis.bearing,
        "bolt": joint.analysis.bolt,
        "deformation_limits": joint.analysis.deformation_limits,
        "clearance": joint.analysis.clearance,
        "curve": {
            "slip": [st.slip / ln for st in hist],
            "load": [st.load / f for st in hist],
            "plane_shear": [(st.plane_shear / f).tolist() for st in hist],
        },
    }
    if len(joint.stations) > 1:
        out["collapse"]["mechanism"]["hinges_bolt"] = [h.bolt + 1 for h in lp.mechanism.hinges]
    if result is not None:
        v = verdict(summary, joint, result)
        out["verdict"] = {"agrees": v.agrees, "text": v.text}
    return out


def notes(summary: CapacitySummary, joint: Joint) -> list[str]:
    """What the engineer must know to read the answers."""
    out = []
    if not summary.analysis.elongation_known and joint.analysis.bolt != "elastic":
        out.append(
            f"the elongation of bolt grade {joint.bolt.grade!r} is not tabulated: the "
            "smallest tabulated one (8 %) was used"
        )
    if joint.analysis.bolt == "strain-hardening":
        out.append(
            "the nonlinear analysis lets the bolt harden to fub; the collapse load uses "
            "the plastic moment at fyb, so the nonlinear answer may exceed it"
        )
    if joint.analysis.bearing == "component":
        out.append("bearing: the linear component stiffness, capped at each ply's bearing strength")
    if summary.elastic.load > summary.nonlinear.load:
        out.append(
            "the elastic answer scales the linear split (the stiffness law of the check); "
            "the nonlinear bearing law is softer, so its ultimate can lie below it"
        )
    if not joint.analysis.deformation_limits:
        out.append(
            "deformation limits off: the analysis runs to its peak or a slip of one bolt diameter"
        )
    return out
