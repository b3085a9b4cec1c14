"""Read a model file (TOML) into a :class:`~plyshear.model.joint.Joint`.

All validation lives here. Every problem raises :class:`ModelError` with the
file, the key path (``ply[2].thickness``, plies counted from 1 on the head
side) and what was expected, so the command line can print it as one line.
"""

from __future__ import annotations

import dataclasses
import datetime as dt
import difflib
import math
import os
import tomllib
from collections.abc import Callable, Mapping
from pathlib import Path
from typing import Any

from plyshear import units as _units
from plyshear.errors import ModelError
from plyshear.model import catalog
from plyshear.model.joint import (
    BEAM_THEORIES,
    BEARING_LAWS,
    BOLT_MODELS,
    CLEARANCE_MODES,
    END_FIXITIES,
    HOLE_TYPES,
    METHODS,
    STANDARDS,
    THREAD_MODES,
    TITLE_BLOCK_KEYS,
    Analysis,
    Bolt,
    CheckSettings,
    Joint,
    LoadCase,
    Member,
    Ply,
    TitleBlock,
)
from plyshear.model.loadcases import LOAD_LEVELS, MAX_CASES

FORMAT_VERSION = 1
MAX_FILE_BYTES = 4_000_000
#: Longest line read (the TOML parser's time and memory grow with a line's structure).
MAX_LINE_CHARS = 1_000_000
#: Most parts of one dotted key (``a.b.c`` has three); the model file needs four at most.
MAX_KEY_PARTS = 64
MAX_PLIES = 2000
MAX_ELEMENTS_PER_PLY = 1000
#: Largest magnitude accepted for any value, in N, mm or MPa: far beyond any joint,
#: and far below where squares and cubes of it overflow.
MAX_MAGNITUDE = 1e12
#: Smallest nonzero length accepted, mm (a nanometre): below it a ply or gap is no
#: plate, and its cubes and inverses leave the range of double precision.
MIN_LENGTH = 1e-6

#: Faying-surface classes: AISC 360-22 J3.8 (A, B); EN 1993-1-8 Table 3.7 (A to D).
SLIP_CLASSES = {"aisc360-22": ("A", "B"), "en1993-1-8": ("A", "B", "C", "D")}

TOP_KEYS = (
    "format",
    "title",
    "project",
    "units",
    "bolt",
    "ply",
    "member",
    "analysis",
    "check",
    "pattern",
    "combination",
    *TITLE_BLOCK_KEYS,
)
COMBINATION_KEYS = ("name", "factors", "level")
PATTERN_KEYS = ("positions", "count", "pitch")
MAX_STATIONS = 500
BOLT_KEYS = (
    "diameter",
    "grade",
    "length",
    "thread_length",
    "threads",
    "ends",
    "pretension",
    "tension",
    "hole",
    "E",
    "poisson",
    "stress_area",
)
PLY_KEYS = (
    "name",
    "member",
    "thickness",
    "steel",
    "fy",
    "fu",
    "gap",
    "edge",
    "width",
    "foundation_modulus",
    "link_stiffness",
    "E",
    "hole_offset",
)
MEMBER_KEYS = ("support", "load", "enters")
ANALYSIS_KEYS = (
    "bearing",
    "elements_per_ply",
    "beam",
    "clearance",
    "hole_clearance",
    "bolt",
    "deformation_limits",
)
CHECK_KEYS = (
    "standard",
    "method",
    "connector",
    "deformation_considered",
    "fillers",
    "slip_critical",
    "slip_class",
    "joint_length",
    "loads",
    "allow_unloaded",
    "pin_interaction",
    "replaceable",
    "combinations",
    "category",
)
#: What the file's loads are: design (factored) or service level.
#: EN 1993-1-8 Table 3.10 pin bending with shear: the maxima wherever they occur, or
#: the moment and the shear of one section.
PIN_INTERACTIONS = ("max-max", "same-section")


class _Reader:
    """Typed access to one table of the file, with key paths for errors."""

    def __init__(self, path: str, system: _units.UnitSystem) -> None:
        self.path = path
        self.system = system

    def fail(self, key: str, message: str) -> ModelError:
        return ModelError(self.path, key, message)

    def table(self, data: Any, key: str) -> Mapping[str, Any]:
        if not isinstance(data, Mapping):
            raise self.fail(key, f"must be a table (got {_kind(data)})")
        return data

    def only(self, data: Mapping[str, Any], allowed: tuple[str, ...], prefix: str) -> None:
        for k in data:
            if k not in allowed:
                hint = difflib.get_close_matches(k, allowed, n=1)
                extra = f"; did you mean '{hint[0]}'?" if hint else f"; known: {', '.join(allowed)}"
                raise self.fail(_join(prefix, k), "unknown key" + extra)

    def quantity(self, value: Any, key: str, dimension: str) -> float:
        number = self._quantity(value, key, dimension)
        if abs(number) > MAX_MAGNITUDE:
            raise self.fail(
                key, f"out of range (|value| must be at most {MAX_MAGNITUDE:g} in N, mm and MPa)"
            )
        return number

    def _quantity(self, value: Any, key: str, dimension: str) -> float:
        if isinstance(value, bool):
            raise self.fail(key, f"must be a number or a {dimension} with a unit (got a boolean)")
        if isinstance(value, int | float):
            try:
                number = float(value)
            except OverflowError:
                raise self.fail(key, "out of range") from None
            if not math.isfinite(number):
                raise self.fail(key, f"must be finite (got {value})")
            return self.system.to_internal(number, dimension)
        if isinstance(value, str):
            try:
                return _units.parse_quantity(value, dimension)
            except ValueError as exc:
                raise self.fail(key, str(exc)) from None
        raise self.fail(key, f"must be a number or a {dimension} with a unit (got {_kind(value)})")

    def number(self, value: Any, key: str) -> float:
        if isinstance(value, bool) or not isinstance(value, int | float):
            raise self.fail(key, f"must be a plain number (got {_kind(value)})")
        try:
            value = float(value)
        except OverflowError:
            raise self.fail(key, "out of range") from None
        if not math.isfinite(value):
            raise self.fail(key, f"must be finite (got {value})")
        return float(value)

    def positive(self, value: Any, key: str, dimension: str, *, zero_ok: bool = False) -> float:
        number = self.quantity(value, key, dimension)
        if number < 0 or (number == 0 and not zero_ok):
            shown = (
                self.system.from_internal(number, dimension)
                if not isinstance(value, str)
                else value
            )
            rule = "≥ 0" if zero_ok else "> 0"
            raise self.fail(key, f"must be {rule} (got {_fmt(shown)})")
        if dimension == "length" and 0 < number < MIN_LENGTH:
            raise self.fail(
                key,
                f"too small: a nonzero length must be at least {MIN_LENGTH:g} mm "
                f"(got {number:g} mm)",
            )
        return number

    def choice(self, value: Any, key: str, allowed: tuple[str, ...]) -> str:
        if not isinstance(value, str) or value not in allowed:
            hint = difflib.get_close_matches(str(value), allowed, n=1)
            extra = f"; did you mean '{hint[0]}'?" if hint else ""
            raise self.fail(key, f"must be one of {', '.join(allowed)} (got {value!r}){extra}")
        return value

    def text(self, value: Any, key: str) -> str:
        if not isinstance(value, str):
            raise self.fail(key, f"must be a string (got {_kind(value)})")
        return value


def _kind(value: Any) -> str:
    return {
        dict: "a table",
        list: "an array",
        str: "a string",
        bool: "a boolean",
        int: "an integer",
        float: "a number",
    }.get(type(value), type(value).__name__)


def _fmt(value: Any) -> str:
    return f"{value:g}" if isinstance(value, float) else str(value)


def _join(prefix: str, key: str) -> str:
    return f"{prefix}.{key}" if prefix else key


def load(path: str | os.PathLike[str]) -> Joint:
    """Read and validate a model file.

    Args:
        path: The TOML model file.

    Returns:
        The joint in N, mm, MPa.

    Raises:
        ModelError: For any problem, naming the file and key.
    """
    return from_dict(read(path), str(path))


def read(path: str | os.PathLike[str]) -> dict[str, Any]:
    """Read a model file as TOML, unvalidated (what :func:`from_dict` takes).

    Raises:
        ModelError: If the file cannot be read, is too large, or is not UTF-8 TOML.
    """
    name = str(path)
    p = Path(path)
    try:
        size = p.stat().st_size
    except OSError as exc:
        raise ModelError(name, "", f"cannot read the file ({exc.strerror or exc})") from None
    if not p.is_file():
        raise ModelError(name, "", "is not a file")
    if size > MAX_FILE_BYTES:
        raise ModelError(name, "", f"file too large ({size} bytes; at most {MAX_FILE_BYTES})")
    try:
        raw = p.read_bytes()
    except OSError as exc:
        raise ModelError(name, "", f"cannot read the file ({exc.strerror or exc})") from None
    try:
        text = raw.decode("utf-8")
    except UnicodeDecodeError as exc:
        raise ModelError(name, "", f"not UTF-8 text (byte {exc.start})") from None
    return _parse(text, name)


def loads(text: str, path: str = "<model>") -> Joint:
    """Parse and validate model-file text.

    Args:
        text: The TOML text.
        path: Name used in error messages.

    Returns:
        The joint.

    Raises:
        ModelError: For any problem.
    """
    return from_dict(_parse(text, path), path)


def _precheck(text: str, path: str) -> None:
    """Refuse, before parsing, what would cost the TOML parser minutes and gigabytes.

    A line longer than :data:`MAX_LINE_CHARS`, or a key (``a.b.c = 1`` or a table
    header ``[a.b.c]``) of more than :data:`MAX_KEY_PARTS` dotted parts.
    """
    for number, line in enumerate(text.splitlines(), start=1):
        if len(line) > MAX_LINE_CHARS:
            raise ModelError(path, "", f"line {number} is longer than {MAX_LINE_CHARS} characters")
        if line.count(".") < MAX_KEY_PARTS:
            continue  # cheap: most lines cannot hold a long key at all
        parts = _key_parts(line)
        if parts > MAX_KEY_PARTS:
            raise ModelError(
                path, "", f"line {number}: a key of {parts} dotted parts (at most {MAX_KEY_PARTS})"
            )


def _key_parts(line: str) -> int:
    """The most dotted parts of any key on a line (quotes respected; inline tables too)."""
    most, parts, quote = 1, 1, ""
    for ch in line:
        if quote:
            quote = "" if ch == quote else quote
        elif ch in "\"'":
            quote = ch
        elif ch == ".":
            parts += 1
            most = max(most, parts)
        elif ch in "=,{}[]#":
            parts = 1
    return most


def _parse(text: str, path: str) -> dict[str, Any]:
    _precheck(text, path)
    try:
        return tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise ModelError(path, "", f"not valid TOML: {exc}") from None
    except RecursionError:
        raise ModelError(path, "", "not valid TOML: nested too deeply") from None


def from_dict(data: Mapping[str, Any], path: str = "<model>") -> Joint:
    """Validate a parsed model file (a dict as TOML gives it) into a Joint.

    Args:
        data: The parsed file.
        path: Name used in error messages.

    Returns:
        The joint.

    Raises:
        ModelError: For any problem.
    """
    r = _Reader(path, _units.SYSTEMS["N-mm"])
    r.table(data, "")
    r.only(data, TOP_KEYS, "")
    if "format" not in data:
        raise r.fail("format", f"missing; this reader expects format = {FORMAT_VERSION}")
    if isinstance(data["format"], bool) or data["format"] != FORMAT_VERSION:
        raise r.fail("format", f"must be {FORMAT_VERSION} (got {data['format']!r})")
    if "units" not in data:
        raise r.fail("units", f"missing; give one of {', '.join(_units.SYSTEMS)}")
    units_name = r.choice(data["units"], "units", tuple(_units.SYSTEMS))
    r.system = _units.SYSTEMS[units_name]
    title = r.text(data.get("title", ""), "title")
    project = r.text(data.get("project", ""), "project")
    title_block = _title_block(r, data)

    if "bolt" not in data:
        raise r.fail("bolt", "missing; the joint needs a [bolt] table")
    bolt = _memo(_bolt, r, r.table(data["bolt"], "bolt"))

    plies_raw = data.get("ply")
    if plies_raw is None:
        raise r.fail("ply", "missing; give at least two [[ply]] tables")
    if not isinstance(plies_raw, list):
        raise r.fail("ply", f"must be an array of tables [[ply]] (got {_kind(plies_raw)})")
    if len(plies_raw) < 2:
        raise r.fail("ply", f"needs at least two plies (got {len(plies_raw)})")
    if len(plies_raw) > MAX_PLIES:
        raise r.fail("ply", f"at most {MAX_PLIES} plies (got {len(plies_raw)})")
    plies = tuple(_memo(_ply, r, raw, i) for i, raw in enumerate(plies_raw, start=1))
    seen: dict[str, int] = {}
    for i, ply in enumerate(plies, start=1):
        if ply.name in seen:
            raise r.fail(
                f"ply[{i}].name", f"'{ply.name}' is already the name of ply[{seen[ply.name]}]"
            )
        seen[ply.name] = i

    case_loads: dict[str, dict[str, tuple[float, float]]] = {}
    members = _members(r, data.get("member", {}), plies, case_loads)
    stations = (
        _pattern(r, r.table(data.get("pattern", {}), "pattern")) if "pattern" in data else (0.0,)
    )
    if len(stations) > 1:
        for i, ply in enumerate(plies, start=1):
            if ply.width is None:
                raise r.fail(
                    f"ply[{i}].width",
                    "missing; a bolt row needs every ply's width for its axial stiffness",
                )
    analysis = _analysis(r, r.table(data.get("analysis", {}), "analysis"))
    check_raw = r.table(data.get("check", {}), "check")
    check = _check(r, check_raw)
    _require_reach(r, bolt, plies)
    from plyshear.model import loadcases

    cases, combos = loadcases.read(r, data, check_raw, check, members, case_loads)
    if cases:
        first = Joint(bolt=bolt, plies=plies, members=members, cases=cases, combinations=combos)
        members = first.with_loads(first.combined_loads(dict(combos[0].factors))).members
        check = dataclasses.replace(check, loads=combos[0].level)
    _require_load(r, members, check, cases)
    return Joint(
        bolt=bolt,
        plies=plies,
        members=members,
        title=title,
        units=units_name,
        analysis=analysis,
        check=check,
        source=path,
        project=project,
        stations=stations,
        cases=cases,
        combinations=combos,
        combination=combos[0].name if combos else "",
        title_block=title_block,
    )


def _title_block(r: _Reader, data: Mapping[str, Any]) -> TitleBlock:
    """The title block's keys: strings, or (for ``date``) a TOML date."""
    values = {}
    for key in TITLE_BLOCK_KEYS:
        value = data.get(key, "")
        if key == "date" and isinstance(value, dt.date):
            value = value.isoformat()
        values[key] = r.text(value, key)
    return TitleBlock(**values)


def _require_reach(r: _Reader, bolt: Bolt, plies: tuple[Ply, ...]) -> None:
    """Refuse a bolt shorter than the grip: it does not reach through the stack."""
    grip = sum(p.gap + p.thickness for p in plies)
    if bolt.length is not None and grip > bolt.length * (1 + 1e-12):
        shown = r.system.from_internal
        unit = r.system.label("length")
        raise r.fail(
            "bolt.length",
            f"{_fmt(shown(bolt.length, 'length'))} {unit} is shorter "
            f"than the grip {_fmt(shown(grip, 'length'))} {unit}: the bolt does not "
            "reach through the stack; give the under-head length of a longer bolt",
        )


def _require_load(
    r: _Reader, members: tuple[Member, ...], check: CheckSettings, cases: tuple[LoadCase, ...] = ()
) -> None:
    """Refuse a joint whose members carry no load (in any case), unless the file allows it."""
    if (
        check.allow_unloaded
        or any(m.is_loaded for m in members)
        or any(f != (0.0, 0.0) for c in cases for f in c.loads)
    ):
        return
    raise r.fail(
        "member",
        "no member carries a load, so every check would pass with "
        "utilization 0; give a loaded member a load (or set [check] "
        "allow_unloaded = true, e.g. for a sweep that sets the loads)",
    )


#: Bolts and plies already read, by their table's exact content (a sweep reads the
#: same tables thousands of times; the catalogue look-ups dominate). Bounded.
_READ: dict[tuple[Any, ...], Any] = {}
_READ_MAX = 4096


def _memo(read: Callable[..., Any], r: _Reader, raw: Any, *where: Any) -> Any:
    """``read(r, raw, *where)``, remembered for tables of plain values (errors are not)."""
    try:
        key = (read.__name__, r.path, r.system.name, where, _frozen(raw))
        hash(key)
    except TypeError:
        return read(r, raw, *where)
    hit = _READ.get(key)
    if hit is None:
        hit = read(r, raw, *where)
        if len(_READ) >= _READ_MAX:
            _READ.clear()
        _READ[key] = hit
    return hit


def _frozen(value: Any) -> Any:
    """A hashable image of a TOML value that keeps types apart (``1`` is not ``true``)."""
    if isinstance(value, Mapping):
        return ("table", tuple(sorted((str(k), _frozen(v)) for k, v in value.items())))
    if isinstance(value, list):
        return ("array", tuple(_frozen(v) for v in value))
    return (type(value).__name__, value)


def _bolt(r: _Reader, b: Mapping[str, Any]) -> Bolt:
    r.only(b, BOLT_KEYS, "bolt")
    if "diameter" not in b:
        raise r.fail("bolt.diameter", "missing; the nominal diameter is required")
    d = r.positive(b["diameter"], "bolt.diameter", "length")
    if "grade" not in b:
        raise r.fail("bolt.grade", f"missing; known: {', '.join(catalog.fastener_keys())}")
    grade_key = r.text(b["grade"], "bolt.grade")
    try:
        grade = catalog.fastener(grade_key)
    except catalog.CatalogError as exc:
        raise r.fail("bolt.grade", str(exc)) from None
    threads = r.choice(b.get("threads", "auto"), "bolt.threads", THREAD_MODES)
    ends = r.choice(b.get("ends", "free"), "bolt.ends", END_FIXITIES)
    hole = r.choice(b.get("hole", "standard"), "bolt.hole", HOLE_TYPES)
    length = r.positive(b["length"], "bolt.length", "length") if "length" in b else None
    thread_length = None
    if "thread_length" in b:
        if length is None:
            raise r.fail("bolt.thread_length", "needs bolt.length to place the threads")
        thread_length = r.positive(b["thread_length"], "bolt.thread_length", "length", zero_ok=True)
        if thread_length > length:
            raise r.fail("bolt.thread_length", "must not exceed bolt.length")
    elif length is not None:
        try:
            thread_length = min(length, catalog.thread_length(d, grade.key, length))
        except catalog.CatalogError as exc:
            if threads != "excluded":
                raise r.fail("bolt.thread_length", f"not given and {exc}") from None
            # a pin or plain dowel: no thread in any plane, nothing to place
    if "stress_area" in b:
        stress_area = r.positive(b["stress_area"], "bolt.stress_area", "area")
        if stress_area > math.pi * d * d / 4:
            raise r.fail("bolt.stress_area", "must not exceed the gross area πd²/4")
    else:
        found = catalog.stress_area(d)
        if found is None:
            # threads excluded, or no thread at all (thread_length = 0): a plain shank
            if threads == "excluded" or thread_length == 0.0:
                found = math.pi * d * d / 4
            else:
                raise r.fail(
                    "bolt.diameter",
                    f"no thread data for a {_fmt(d)} mm diameter; "
                    'give bolt.stress_area, or threads = "excluded" for a pin',
                )
        stress_area = found
    e_mod = r.positive(b["E"], "bolt.E", "stress") if "E" in b else grade.E
    nu = r.number(b["poisson"], "bolt.poisson") if "poisson" in b else 0.3
    if not -1.0 < nu < 0.5:
        raise r.fail("bolt.poisson", f"must lie in (-1, 0.5) (got {nu:g})")
    pretension = r.positive(b.get("pretension", 0), "bolt.pretension", "force", zero_ok=True)
    tension = r.positive(b.get("tension", 0), "bolt.tension", "force", zero_ok=True)
    return Bolt(
        diameter=d,
        grade=grade.key,
        fyb=grade.fyb,
        fub=grade.fub,
        stress_area=stress_area,
        E=e_mod,
        poisson=nu,
        length=length,
        thread_length=thread_length,
        threads=threads,
        ends=ends,
        pretension=pretension,
        tension=tension,
        hole=hole,
    )


def _ply(r: _Reader, raw: Any, i: int) -> Ply:
    key = f"ply[{i}]"
    p = r.table(raw, key)
    r.only(p, PLY_KEYS, key)
    name = r.text(p.get("name", f"ply{i}"), f"{key}.name")
    if not name.strip():
        raise r.fail(f"{key}.name", "must not be empty")
    member = r.text(p["member"], f"{key}.member") if "member" in p else None
    if "thickness" not in p:
        raise r.fail(f"{key}.thickness", "missing; every ply needs a thickness")
    t = r.positive(p["thickness"], f"{key}.thickness", "length")
    steel_key = r.text(p["steel"], f"{key}.steel") if "steel" in p else None
    fy = r.positive(p["fy"], f"{key}.fy", "stress") if "fy" in p else None
    fu = r.positive(p["fu"], f"{key}.fu", "stress") if "fu" in p else None
    e_mod = r.positive(p["E"], f"{key}.E", "stress") if "E" in p else None
    if steel_key is not None:
        try:
            grade = catalog.steel(steel_key)
        except catalog.CatalogError as exc:
            raise r.fail(f"{key}.steel", str(exc)) from None
        try:
            fy_cat, fu_cat = grade.strength(t)
        except ValueError as exc:
            raise r.fail(f"{key}.thickness", str(exc)) from None
        fy = fy if fy is not None else fy_cat
        fu = fu if fu is not None else fu_cat
        e_mod = e_mod if e_mod is not None else grade.E
    if fy is None or fu is None:
        missing = "fy" if fy is None else "fu"
        raise r.fail(
            f"{key}.{missing}",
            f"missing; give {key}.steel "
            f"(known: {', '.join(catalog.steel_keys())}) or both fy and fu",
        )
    if fu < fy:
        raise r.fail(f"{key}.fu", "must not be less than fy")
    gap = r.positive(p.get("gap", 0), f"{key}.gap", "length", zero_ok=True)
    edge = r.positive(p["edge"], f"{key}.edge", "length") if "edge" in p else None
    width = r.positive(p["width"], f"{key}.width", "length") if "width" in p else None
    k = r.positive(
        p.get("foundation_modulus", 0), f"{key}.foundation_modulus", "stress", zero_ok=True
    )
    link = r.positive(
        p.get("link_stiffness", 0), f"{key}.link_stiffness", "stiffness", zero_ok=True
    )
    offset = r.quantity(p.get("hole_offset", 0), f"{key}.hole_offset", "length")
    if link > 0 and member is None:
        raise r.fail(f"{key}.link_stiffness", "a filler ply (no member) has no link")
    return Ply(
        name=name,
        member=member,
        thickness=t,
        fy=fy,
        fu=fu,
        E=e_mod if e_mod is not None else 210000.0,
        steel=steel_key,
        gap=gap,
        edge=edge,
        width=width,
        foundation_modulus=k if k > 0 else None,
        link_stiffness=link if link > 0 else None,
        hole_offset=offset,
    )


def _members(
    r: _Reader,
    raw: Any,
    plies: tuple[Ply, ...],
    case_loads: dict[str, dict[str, tuple[float, float]]] | None = None,
) -> tuple[Member, ...]:
    """Read the members.

    A load given as a table of cases goes into ``case_loads`` (case → member →
    force), and the member's own load stays (0, 0) until a combination is chosen.
    """
    table = r.table(raw, "member")
    used = [p.member for p in plies if p.member is not None]
    for i, ply in enumerate(plies, start=1):
        if ply.member is not None and ply.member not in table:
            hint = difflib.get_close_matches(ply.member, list(table), n=1)
            extra = f"; did you mean '{hint[0]}'?" if hint else ""
            raise r.fail(
                f"ply[{i}].member",
                f"member '{ply.member}' is not declared as [member.{ply.member}]{extra}",
            )
    members = []
    for name, body in table.items():
        key = f"member.{name}"
        m = r.table(body, key)
        r.only(m, MEMBER_KEYS, key)
        if name not in used:
            raise r.fail(key, "declared but no ply belongs to it")
        support = m.get("support", False)
        if not isinstance(support, bool):
            raise r.fail(f"{key}.support", f"must be true or false (got {_kind(support)})")
        load = (0.0, 0.0)
        if "load" in m:
            if support:
                raise r.fail(f"{key}.load", "a supported member cannot also be loaded")
            if isinstance(m["load"], Mapping):
                if case_loads is None:
                    raise r.fail(f"{key}.load", "a table of load cases is not accepted here")
                for case, value in _case_table(r, m["load"], f"{key}.load").items():
                    case_loads.setdefault(case, {})[name] = value
            else:
                load = _load(r, m["load"], f"{key}.load")
        enters = r.choice(m.get("enters", "before"), f"{key}.enters", ("before", "after"))
        members.append(Member(name=name, support=support, load=load, enters=enters))
    if not any(m.support for m in members):
        raise r.fail("member", "no supported member; mark at least one with support = true")
    return tuple(members)


def _case_table(r: _Reader, raw: Mapping[str, Any], key: str) -> dict[str, tuple[float, float]]:
    """A member's ``load = { dead = 40, live = [0, 65] }``: case name → (Fx, Fy), N."""
    if not raw:
        raise r.fail(key, "an empty table of load cases; give e.g. { dead = 40, live = 65 }")
    if len(raw) > MAX_CASES:
        raise r.fail(key, f"at most {MAX_CASES} load cases (got {len(raw)})")
    out = {}
    for case, value in raw.items():
        if not case.strip():
            raise r.fail(key, "a load case needs a name")
        if isinstance(value, Mapping):
            raise r.fail(f"{key}.{case}", "must be a scalar (along x) or [Fx, Fy] (got a table)")
        out[case] = _load(r, value, f"{key}.{case}")
    return out


def _load(r: _Reader, raw: Any, key: str) -> tuple[float, float]:
    if isinstance(raw, list):
        if len(raw) != 2:
            raise r.fail(key, f"must be a scalar (along x) or [Fx, Fy] (got {len(raw)} values)")
        return (r.quantity(raw[0], f"{key}[1]", "force"), r.quantity(raw[1], f"{key}[2]", "force"))
    return (r.quantity(raw, key, "force"), 0.0)


def _pattern(r: _Reader, p: Mapping[str, Any]) -> tuple[float, ...]:
    r.only(p, PATTERN_KEYS, "pattern")
    if "positions" in p:
        if "count" in p or "pitch" in p:
            raise r.fail("pattern", "give positions, or count and pitch, not both")
        raw = p["positions"]
        if not isinstance(raw, list) or not raw:
            raise r.fail("pattern.positions", f"must be a non-empty array (got {_kind(raw)})")
        if len(raw) > MAX_STATIONS:
            raise r.fail("pattern.positions", f"at most {MAX_STATIONS} bolts (got {len(raw)})")
        xs = [
            r.quantity(v, f"pattern.positions[{i}]", "length") for i, v in enumerate(raw, start=1)
        ]
    else:
        if "count" not in p or "pitch" not in p:
            raise r.fail("pattern", "give positions, or both count and pitch")
        n = p["count"]
        if isinstance(n, bool) or not isinstance(n, int) or not 1 <= n <= MAX_STATIONS:
            raise r.fail("pattern.count", f"must be an integer in 1..{MAX_STATIONS} (got {n!r})")
        pitch = r.positive(p["pitch"], "pattern.pitch", "length")
        xs = [i * pitch for i in range(n)]
    for i in range(1, len(xs)):
        if not xs[i] > xs[i - 1]:
            raise r.fail(f"pattern.positions[{i + 1}]", "positions must increase")
    return tuple(xs)


def _analysis(r: _Reader, a: Mapping[str, Any]) -> Analysis:
    r.only(a, ANALYSIS_KEYS, "analysis")
    bearing = r.choice(a.get("bearing", "component"), "analysis.bearing", BEARING_LAWS)
    n = a.get("elements_per_ply", 10)
    if isinstance(n, bool) or not isinstance(n, int):
        raise r.fail("analysis.elements_per_ply", f"must be an integer (got {_kind(n)})")
    if not 1 <= n <= MAX_ELEMENTS_PER_PLY:
        raise r.fail(
            "analysis.elements_per_ply", f"must lie in 1..{MAX_ELEMENTS_PER_PLY} (got {n})"
        )
    beam = r.choice(a.get("beam", "timoshenko"), "analysis.beam", BEAM_THEORIES)
    clearance = r.choice(a.get("clearance", "fitted"), "analysis.clearance", CLEARANCE_MODES)
    hole = (
        r.positive(a["hole_clearance"], "analysis.hole_clearance", "length", zero_ok=True)
        if "hole_clearance" in a
        else None
    )
    bolt = r.choice(a.get("bolt", "strain-hardening"), "analysis.bolt", BOLT_MODELS)
    limits = a.get("deformation_limits", True)
    if not isinstance(limits, bool):
        raise r.fail("analysis.deformation_limits", f"must be true or false (got {_kind(limits)})")
    return Analysis(
        bearing=bearing,
        elements_per_ply=n,
        beam=beam,
        clearance=clearance,
        hole_clearance=hole,
        bolt=bolt,
        deformation_limits=limits,
    )


def _check(r: _Reader, c: Mapping[str, Any]) -> CheckSettings:
    r.only(c, CHECK_KEYS, "check")
    standard = r.choice(c.get("standard", "aisc360-22"), "check.standard", STANDARDS)
    method = r.choice(c.get("method", "lrfd"), "check.method", METHODS)
    connector = r.choice(c.get("connector", "bolt"), "check.connector", ("bolt", "pin"))
    fillers = r.choice(
        c.get("fillers", "undeveloped"), "check.fillers", ("undeveloped", "developed")
    )
    flags = {}
    for key, default in (
        ("deformation_considered", True),
        ("slip_critical", False),
        ("replaceable", False),
    ):
        value = c.get(key, default)
        if not isinstance(value, bool):
            raise r.fail(f"check.{key}", f"must be true or false (got {_kind(value)})")
        flags[key] = value
    classes = SLIP_CLASSES[standard]
    slip_class = (
        r.choice(c["slip_class"], "check.slip_class", classes) if "slip_class" in c else None
    )
    length = r.positive(c.get("joint_length", 0), "check.joint_length", "length", zero_ok=True)
    unloaded = c.get("allow_unloaded", False)
    if not isinstance(unloaded, bool):
        raise r.fail("check.allow_unloaded", f"must be true or false (got {_kind(unloaded)})")
    loads = r.choice(c["loads"], "check.loads", LOAD_LEVELS) if "loads" in c else None
    interaction = r.choice(
        c.get("pin_interaction", "max-max"), "check.pin_interaction", PIN_INTERACTIONS
    )
    return CheckSettings(
        standard=standard,
        method=method,
        connector=connector,
        fillers=fillers,
        slip_class=slip_class,
        joint_length=length,
        loads=loads,
        allow_unloaded=unloaded,
        pin_interaction=interaction,
        **flags,
    )
