"""Load cases and combinations of a model file (part of its validation).

A member's ``load`` may be a table of named cases
(``load = { dead = 40, live = [0, 65] }``); every case named by one member is
known to all (a member that does not name it carries nothing in it).
Combinations are ``[[combination]]`` tables (``name``, ``factors``, ``level``)
and/or generated from a standard's equations by ``[check] combinations``
(:mod:`plyshear.model.combinations`). Every problem is one
:class:`~plyshear.model.modelfile.ModelError` naming the key.
"""

from __future__ import annotations

import difflib
from collections.abc import Mapping
from typing import TYPE_CHECKING, Any

from plyshear.model import combinations as gen
from plyshear.model.joint import CheckSettings, Combination, LoadCase, Member

#: What a model's loads are: the level a check takes them at.
LOAD_LEVELS = ("factored", "service")
#: Most load cases and combinations in one file.
MAX_CASES = 200
MAX_COMBINATIONS = 2000

if TYPE_CHECKING:
    from plyshear.model.modelfile import _Reader


def strength_level(check: CheckSettings) -> str:
    """The level the check's method takes: service for AISC ASD, factored otherwise."""
    return "service" if check.standard == "aisc360-22" and check.method == "asd" else "factored"


def read(
    r: _Reader,
    data: Mapping[str, Any],
    check_raw: Mapping[str, Any],
    check: CheckSettings,
    members: tuple[Member, ...],
    case_loads: dict[str, dict[str, tuple[float, float]]],
) -> tuple[tuple[LoadCase, ...], tuple[Combination, ...]]:
    """The model's load cases and combinations (both empty for plain loads).

    Args:
        r: The file's reader (for errors and units).
        data: The parsed file.
        check_raw: Its ``[check]`` table.
        check: The check settings read from it.
        members: The members (plain loads already read).
        case_loads: Case name → member name → force, from the members' tables.

    Raises:
        ModelError: For an unknown case, a factor that is not a finite number, a
            level the method contradicts, cases with no combination, and so on.
    """
    table_combos = data.get("combination")
    generator = check_raw.get("combinations")
    if not case_loads:
        if table_combos is not None:
            raise r.fail(
                "combination",
                "combinations need named load cases: give a member load = { dead = 40, live = 65 }",
            )
        if generator is not None:
            raise r.fail(
                "check.combinations",
                "generated combinations need named load cases: "
                "give a member load = { dead = 40, live = 65 }",
            )
        if "category" in check_raw:
            raise r.fail("check.category", 'applies with [check] combinations = "en1990" only')
        return (), ()
    plain = [m.name for m in members if m.is_loaded]
    if plain:
        raise r.fail(
            f"member.{plain[0]}.load",
            "a plain load beside load cases: give it as a table of cases too, e.g. { dead = 40 }",
        )
    if len(case_loads) > MAX_CASES:
        raise r.fail("member", f"at most {MAX_CASES} load cases (got {len(case_loads)})")
    cases = tuple(
        LoadCase(
            name=name,
            loads=tuple(by_member.get(m.name, (0.0, 0.0)) for m in members),
            category=gen.category_of(name),
        )
        for name, by_member in case_loads.items()
    )
    combos = list(_tables(r, table_combos, cases, check)) if table_combos is not None else []
    if generator is not None:
        combos += _generated(r, generator, check_raw, check, cases)
    elif "category" in check_raw:
        raise r.fail("check.category", 'applies with [check] combinations = "en1990" only')
    if not combos:
        raise r.fail(
            "combination",
            "the loads are load cases but no combination is given: "
            'add [[combination]] tables or [check] combinations = "asce7-22" or '
            '"en1990"',
        )
    seen: set[str] = set()
    for c in combos:
        if c.name in seen:
            raise r.fail("combination", f"two combinations are named '{c.name}'")
        seen.add(c.name)
    return cases, tuple(combos)


def _tables(
    r: _Reader, raw: Any, cases: tuple[LoadCase, ...], check: CheckSettings
) -> list[Combination]:
    """The ``[[combination]]`` tables."""
    if not isinstance(raw, list):
        raise r.fail("combination", "must be an array of tables [[combination]]")
    if len(raw) > MAX_COMBINATIONS:
        raise r.fail("combination", f"at most {MAX_COMBINATIONS} combinations (got {len(raw)})")
    names = [c.name for c in cases]
    need = strength_level(check)
    out = []
    for i, body in enumerate(raw, start=1):
        key = f"combination[{i}]"
        c = r.table(body, key)
        r.only(c, ("name", "factors", "level"), key)
        if "name" not in c:
            raise r.fail(f"{key}.name", "missing; every combination needs a name")
        name = r.text(c["name"], f"{key}.name")
        if not name.strip():
            raise r.fail(f"{key}.name", "must not be empty")
        if "factors" not in c:
            raise r.fail(f"{key}.factors", "missing; e.g. factors = { dead = 1.2, live = 1.6 }")
        factors = r.table(c["factors"], f"{key}.factors")
        if not factors:
            raise r.fail(f"{key}.factors", "is empty; give at least one case's factor")
        pairs = []
        for case, value in factors.items():
            if case not in names:
                hint = difflib.get_close_matches(case, names, n=1)
                extra = f"; did you mean '{hint[0]}'?" if hint else f"; known: {', '.join(names)}"
                raise r.fail(f"{key}.factors.{case}", "names no load case" + extra)
            pairs.append((case, r.number(value, f"{key}.factors.{case}")))
        level = r.choice(c.get("level", need), f"{key}.level", LOAD_LEVELS)
        if level != need:
            raise r.fail(f"{key}.level", _level_message(level, need, check))
        out.append(Combination(name=name, factors=tuple(pairs), level=level))
    return out


def _level_message(level: str, need: str, check: CheckSettings) -> str:
    method = (
        "EN 1993-1-8" if check.standard == "en1993-1-8" else f"AISC 360-22 {check.method.upper()}"
    )
    return f"{level} loads contradict the check's method: {method} takes {need} combinations"


def _generated(
    r: _Reader,
    generator: Any,
    check_raw: Mapping[str, Any],
    check: CheckSettings,
    cases: tuple[LoadCase, ...],
) -> list[Combination]:
    """The combinations of ``[check] combinations``."""
    name = r.choice(generator, "check.combinations", gen.GENERATORS)
    category = "A"
    if "category" in check_raw:
        if name != "en1990":
            raise r.fail(
                "check.category",
                'applies with combinations = "en1990" only '
                "(the EN 1990 Table A1.1 building category)",
            )
        category = r.choice(check_raw["category"], "check.category", gen.EN_CATEGORIES)
    known = gen.EN_KNOWN if name == "en1990" else tuple(gen.CATEGORY_NAMES)
    for case in cases:
        if case.category is None or case.category not in known:
            words = ", ".join(n for c in known for n in gen.CATEGORY_NAMES[c][:1])
            raise r.fail(
                "check.combinations",
                f"cannot tell what load case '{case.name}' is: "
                f"{name} combines cases named (or starting with) {words}; rename it "
                "or give [[combination]] tables",
            )
    method = "asd" if strength_level(check) == "service" else "lrfd"
    try:
        return list(
            gen.generate(
                name, [(c.name, c.category or "") for c in cases], method=method, category=category
            )
        )
    except ValueError as exc:
        raise r.fail("check.combinations", str(exc)) from None
