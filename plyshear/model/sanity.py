"""Physical sanity warnings for a joint: things that load and solve but look wrong.

A warning is not an error: the joint is valid and can be solved, but its
geometry is outside what the standards or ordinary practice expect, so the
engineer should look again. Each warning is one line that names the ply or
the key it concerns, in the joint's own units.

The rules, with their sources:

* **grip longer than the bolt**: ``joint.grip > bolt.length`` — the bolt cannot
  pass the stack (geometry, no clause). The model file refuses such a bolt; the
  warning remains for joints built in Python.
* **short protrusion**: a bolt (not a pin) whose length past the grip is less
  than a nut plus two thread pitches, the usual minimum for full nut engagement
  (common practice; nut heights of ISO 4032 and ASME B18.2.2 heavy hex nuts from
  :func:`plyshear.model.catalog.nut_height`).
* **sizes in the wrong units**: a bolt diameter outside
  :data:`BOLT_DIAMETER_RANGE` or a ply thickness outside
  :data:`PLY_THICKNESS_RANGE` (mm) is far more likely a number typed in another
  unit system than a real part; the line names the file's ``units`` and the
  value as read.
* **thread in a ply thinner than one pitch**: a ply in the threaded length
  (by ``bolt.threaded_at``) that is thinner than the coarse thread pitch bears
  on less than one thread turn (geometry; pitch from
  :func:`plyshear.model.catalog.thread_pitch`, ISO 261 / ASME B1.1).
* **shim**: a ply thinner than :data:`SHIM_RATIO` · d. Common practice, not a
  clause of either standard: such a ply acts as a shim or pack rather than a
  bearing plate, and the beam-on-springs idealisation of its bearing is
  doubtful.
* **edge distance below the standard's minimum**: EN 1993-1-8:2005 Table 3.3,
  e1 ≥ 1.2 d0 (bolts; pins follow Table 3.9, which depends on the ply force
  and is left to the check); AISC 360-22 Table J3.4 / J3.4M minimum edge
  distance (:data:`AISC_MIN_EDGE_IN`, :data:`AISC_MIN_EDGE_MM`). d0 is the
  hole of :func:`plyshear.model.catalog.hole_diameter`.
* **very long grip**: grip / d > :data:`LONG_GRIP_RATIO` — bending governs
  and the solve may be ill-conditioned (common practice; compare the AISC
  360-22 J3.2 reduction of A307 bolts for grips beyond 5 d).
* **stiffness or thickness contrast**: a ply :data:`CONTRAST_RATIO` times
  thinner than, or with a foundation modulus that many times that of, a
  neighbour (numerical conditioning of the solve; only explicit
  ``foundation_modulus`` values are compared, the default bearing law
  belongs to the mechanics).

The model layer does not import the design-code modules: the few minimum
distances needed here are small data in this file, with their source.
"""

from __future__ import annotations

import math

from plyshear import units as _units
from plyshear.model import catalog
from plyshear.model.joint import Joint, Ply

#: A ply thinner than this fraction of the bolt diameter is a shim (common practice).
SHIM_RATIO = 0.25
#: Grip over diameter above which the grip is very long (common practice).
LONG_GRIP_RATIO = 20.0
#: Ratio of thickness or foundation modulus between neighbours flagged as extreme.
CONTRAST_RATIO = 1000.0
#: EN 1993-1-8:2005 Table 3.3: e1,min = e2,min = 1.2 d0.
EN_E_MIN_FACTOR = 1.2
#: Thread pitches a bolt should protrude past its nut (common practice).
PROTRUSION_PITCHES = 2
#: Bolt and pin diameters outside this range, mm, suggest the wrong units (common practice).
BOLT_DIAMETER_RANGE = (3.0, 200.0)
#: Ply thicknesses outside this range, mm, suggest the wrong units (common practice).
PLY_THICKNESS_RANGE = (0.5, 500.0)
#: AISC 360-22 Table J3.4 beyond the tabulated sizes: 1.25 d.
AISC_E_MIN_FACTOR_LARGE = 1.25

#: AISC 360-22 Table J3.4, minimum edge distance from the centre of a standard
#: hole to an edge, in: bolt diameter (in) → distance (in). From memory (the
#: values are the same as AISC 360-16); beyond 1-1/4 in: 1.25 d.
AISC_MIN_EDGE_IN: tuple[tuple[float, float], ...] = (
    (0.5, 0.75),
    (0.625, 0.875),
    (0.75, 1.0),
    (0.875, 1.125),
    (1.0, 1.25),
    (1.125, 1.5),
    (1.25, 1.625),
)
#: AISC 360-22 Table J3.4M, the same in mm: bolt diameter (mm) → distance (mm).
#: From memory (as AISC 360-16 Table J3.4M); beyond M36: 1.25 d.
AISC_MIN_EDGE_MM: tuple[tuple[float, float], ...] = (
    (16.0, 22.0),
    (20.0, 26.0),
    (22.0, 28.0),
    (24.0, 30.0),
    (27.0, 34.0),
    (30.0, 38.0),
    (36.0, 46.0),
)
_TOL = 1e-9  # mm: geometric comparisons are inclusive of round-off


def warnings(joint: Joint) -> list[str]:
    """Return the physical sanity warnings of ``joint``, one line each.

    Args:
        joint: The joint (N, mm, MPa).

    Returns:
        Warnings in stack order: bolt-level first, then ply by ply; empty when
        nothing looks wrong.
    """
    u = _units.system(joint.units)
    out: list[str] = []
    out += _grip(joint, u)
    out += _protrusion(joint, u)
    out += _unit_ranges(joint, u)
    out += _threads_in_thin_plies(joint, u)
    out += _shims(joint, u)
    out += _edges(joint, u)
    out += _pin_plates(joint)
    out += _contrasts(joint)
    return out


def _pin_plates(joint: Joint) -> list[str]:
    """A pin's plies without ``edge`` or ``width``: their pin-plate rules cannot be checked."""
    if joint.check.connector != "pin":
        return []
    rules = (
        "AISC 360-22 D5 net tension, shear-out and D5.2 dimensions"
        if joint.check.standard == "aisc360-22"
        else "EN 1993-1-8 Table 3.9 geometry"
    )
    out = []
    for i, ply in enumerate(joint.plies):
        missing = [k for k in ("edge", "width") if getattr(ply, k) is None]
        if missing and not ply.is_filler:
            out.append(
                f"{_ply_key(i, ply)}.{missing[0]}: a pin plate without "
                f"{' and '.join(missing)}: its plate checks ({rules}) cannot be made"
            )
    return out


def notes(joint: Joint) -> list[str]:
    """Return what ``validate`` says of assumptions the check will make, one line each.

    Not warnings (the joint is ordinary), but values the model leaves to a
    conservative default: an EN 1993-1-8 bolt bearing on a ply without ``width``
    takes k1 from the standard's minimum edge distance e2 = 1.2 d0 (Table 3.3),
    k1 = 2.8 · 1.2 − 1.7 = 1.66 (Table 3.4).

    Args:
        joint: The joint (N, mm, MPa).

    Returns:
        Notes in ply order; empty when nothing is assumed.
    """
    if joint.check.standard != "en1993-1-8" or joint.check.connector == "pin":
        return []
    out = []
    for i, ply in enumerate(joint.plies):
        if ply.width is None and not ply.is_filler:
            out.append(
                f"{_ply_key(i, ply)}.width: not given; EN 1993-1-8 bearing takes k1 "
                f"from the minimum edge distance across the load, e2 = "
                f"{EN_E_MIN_FACTOR:g} d0 (Table 3.3): k1 = "
                f"{2.8 * EN_E_MIN_FACTOR - 1.7:.2f}, conservative"
            )
    return out


def _len(value: float, u: _units.UnitSystem) -> str:
    return f"{u.from_internal(value, 'length'):.4g} {u.label('length')}"


def _ply_key(i: int, ply: Ply) -> str:
    return f"ply[{i + 1}] '{ply.name}'"


def _grip(joint: Joint, u: _units.UnitSystem) -> list[str]:
    out = []
    bolt = joint.bolt
    grip = joint.grip
    if bolt.length is not None and grip > bolt.length + _TOL:
        out.append(
            f"bolt.length: the grip {_len(grip, u)} is longer than the bolt "
            f"({_len(bolt.length, u)}): the bolt cannot pass the stack"
        )
    ratio = grip / bolt.diameter
    if ratio > LONG_GRIP_RATIO:
        out.append(
            f"bolt.diameter: very long grip, grip/d = {ratio:.3g} > {LONG_GRIP_RATIO:g} "
            "(common practice): bending governs and the solve may be ill-conditioned"
        )
    return out


def _protrusion(joint: Joint, u: _units.UnitSystem) -> list[str]:
    bolt = joint.bolt
    if bolt.length is None or joint.check.connector == "pin":
        return []
    nut = catalog.nut_height(bolt.diameter)
    pitch = catalog.thread_pitch(bolt.diameter)
    if nut is None or pitch is None:
        return []
    past = bolt.length - joint.grip
    need = nut + PROTRUSION_PITCHES * pitch
    if past < 0 or past >= need - _TOL:
        return []  # shorter than the grip: refused by the model file, warned by _grip
    return [
        f"bolt.length: the bolt protrudes {_len(past, u)} past the grip, less than a nut "
        f"({_len(nut, u)}) plus {PROTRUSION_PITCHES} thread pitches ({_len(pitch, u)} "
        f"each) = {_len(need, u)} (common practice): choose a bolt at least "
        f"{_len(joint.grip + need, u)} long"
    ]


def _as_read(value: float, dimension: str, u: _units.UnitSystem) -> str:
    """A length as the file gave it, with its system, and in mm when that differs."""
    shown = f"{u.from_internal(value, dimension):.4g} {u.label(dimension)}"
    mm = "" if u.label(dimension) == "mm" else f" = {value:.4g} mm"
    return f'{shown} as read with units = "{u.name}"{mm}'


def _unit_ranges(joint: Joint, u: _units.UnitSystem) -> list[str]:
    out = []
    lo, hi = BOLT_DIAMETER_RANGE
    d = joint.bolt.diameter
    if not lo <= d <= hi:
        out.append(
            f"bolt.diameter: {_as_read(d, 'length', u)} is outside {lo:g} to {hi:g} mm, "
            "the range of bolts and pins: is the file's units right?"
        )
    lo, hi = PLY_THICKNESS_RANGE
    for i, ply in enumerate(joint.plies):
        if not lo <= ply.thickness <= hi:
            out.append(
                f"{_ply_key(i, ply)}.thickness: {_as_read(ply.thickness, 'length', u)} "
                f"is outside {lo:g} to {hi:g} mm, the range of plates: is the file's "
                "units right?"
            )
    return out


def _threads_in_thin_plies(joint: Joint, u: _units.UnitSystem) -> list[str]:
    bolt = joint.bolt
    pitch = catalog.thread_pitch(bolt.diameter)
    if pitch is None:
        return []
    out = []
    starts = joint.ply_starts()
    for i, ply in enumerate(joint.plies):
        z0 = float(starts[i])
        z1 = z0 + ply.thickness
        # threads run from thread_start to the end: a ply is in them if its far face
        # is past the start (a ply that only touches the start is not)
        threaded = bolt.threaded_at(0.5 * (z0 + z1)) or bolt.threaded_at(z1 - _TOL * 10)
        if threaded and ply.thickness < pitch - _TOL:
            out.append(
                f"{_ply_key(i, ply)}.thickness: {_len(ply.thickness, u)} is thinner "
                f"than the thread pitch {_len(pitch, u)} and lies in the threaded "
                "length: it bears on less than one thread turn"
            )
    return out


def _shims(joint: Joint, u: _units.UnitSystem) -> list[str]:
    d = joint.bolt.diameter
    out = []
    for i, ply in enumerate(joint.plies):
        if ply.thickness < SHIM_RATIO * d - _TOL:
            out.append(
                f"{_ply_key(i, ply)}.thickness: {_len(ply.thickness, u)} is less than "
                f"{SHIM_RATIO:g} d = {_len(SHIM_RATIO * d, u)} (common practice): a shim "
                "rather than a bearing plate; its bearing model is doubtful"
            )
    return out


def _aisc_min_edge(d: float) -> float | None:
    """AISC 360-22 Table J3.4 / J3.4M minimum edge distance, mm, or None if not covered."""
    if catalog.is_inch_size(d):
        table = tuple((a * catalog.MM_PER_IN, b * catalog.MM_PER_IN) for a, b in AISC_MIN_EDGE_IN)
    else:
        table = AISC_MIN_EDGE_MM
    for d_tab, e_tab in table:
        if abs(d - d_tab) <= catalog.SIZE_TOL + _TOL:
            return e_tab
    if d > table[-1][0]:
        return AISC_E_MIN_FACTOR_LARGE * d
    return None


def _edges(joint: Joint, u: _units.UnitSystem) -> list[str]:
    bolt = joint.bolt
    standard = joint.check.standard
    if standard == "en1993-1-8" and joint.check.connector == "pin":
        return []  # pin plates: EN 1993-1-8 Table 3.9, which needs the ply force
    try:
        d0 = catalog.hole_diameter(bolt.diameter, bolt.hole, standard)
    except (catalog.CatalogError, ValueError):
        d0 = None
    if standard == "en1993-1-8":
        if d0 is None:
            return []
        e_min: float | None = EN_E_MIN_FACTOR * d0
        rule = f"EN 1993-1-8 Table 3.3: e1 ≥ 1.2 d0 = 1.2 × {_len(d0, u)}"
    else:
        e_min = _aisc_min_edge(bolt.diameter)
        rule = "AISC 360-22 Table J3.4"
    if e_min is None:
        return []
    out = []
    for i, ply in enumerate(joint.plies):
        if ply.edge is not None and ply.edge < e_min - _TOL:
            out.append(
                f"{_ply_key(i, ply)}.edge: {_len(ply.edge, u)} is below the minimum "
                f"edge distance {_len(e_min, u)} ({rule})"
            )
    return out


def _ratio(a: float, b: float) -> float:
    lo, hi = min(a, b), max(a, b)
    return math.inf if lo <= 0 else hi / lo


def _contrasts(joint: Joint) -> list[str]:
    out = []
    plies = joint.plies
    for i in range(len(plies) - 1):
        a, b = plies[i], plies[i + 1]
        pair = f"{_ply_key(i, a)} and {_ply_key(i + 1, b)}"
        r = _ratio(a.thickness, b.thickness)
        if r >= CONTRAST_RATIO:
            thin = i + 1 if a.thickness > b.thickness else i
            out.append(
                f"ply[{thin + 1}].thickness: {pair} differ {r:.3g}-fold in thickness "
                f"(≥ {CONTRAST_RATIO:g}): the solve may be ill-conditioned"
            )
        ka, kb = a.foundation_modulus, b.foundation_modulus
        if ka is not None and kb is not None:
            r = _ratio(ka, kb)
            if r >= CONTRAST_RATIO:
                soft = i + 1 if ka > kb else i
                out.append(
                    f"ply[{soft + 1}].foundation_modulus: {pair} differ {r:.3g}-fold "
                    f"in bearing stiffness (≥ {CONTRAST_RATIO:g}): the solve may be "
                    "ill-conditioned"
                )
    return out
