"""Which model-file values a sweep varies, and how they are written.

A sweep edits the parsed model file (the dict TOML gives), never the joint: each
case then goes through the same loader and validation as a file would, so a
value out of a catalogue's range is reported against its key like any other
model error, and strings with units (``"0.5 in"``) work as they do in the file.

Key syntax, following the model file and its error messages:

* ``bolt.diameter``, ``analysis.elements_per_ply``, ``check.standard``,
  ``pattern.pitch``: a key of a table;
* ``ply[2].thickness``: the second ply from the head (1-based, as in errors), or
  ``ply.NAME.thickness`` by the ply's name;
* ``member.NAME.load``: a member's key.

Value syntax: ``16,20,24`` (a list), ``8:20:2`` (from 8 to 20 in steps of 2,
both ends included), ``8.8,10.9`` or ``S355,S460`` (names), ``0.5 in,0.75 in``
(quantities with units), ``[100,50],[200,100]`` (arrays, e.g. a load
``[Fx, Fy]``).
"""

from __future__ import annotations

import copy
import csv
import difflib
import io
import itertools
import math
import os
import re
import stat
from collections.abc import Mapping, Sequence
from dataclasses import dataclass
from pathlib import Path
from typing import Any

from plyshear.model import modelfile

#: Tables a sweep may edit and their keys (the model file's own lists).
TABLE_KEYS: dict[str, tuple[str, ...]] = {
    "bolt": modelfile.BOLT_KEYS,
    "ply": modelfile.PLY_KEYS,
    "member": modelfile.MEMBER_KEYS,
    "analysis": modelfile.ANALYSIS_KEYS,
    "check": modelfile.CHECK_KEYS,
    "pattern": modelfile.PATTERN_KEYS,
}
#: Most cases one sweep may have (a 10 000-case sweep takes seconds; this takes hours).
MAX_CASES = 1_000_000
#: Largest --cases file read, bytes (a million cases of a few keys fit in it).
MAX_CASES_BYTES = 64_000_000
#: A range end within this fraction of a step of the stop still counts as the stop.
RANGE_TOL = 1e-9

#: Keys whose values are names: ``8.8`` stays the text "8.8", not a number.
NAME_KEYS = frozenset(
    {
        "grade",
        "steel",
        "threads",
        "ends",
        "hole",
        "bearing",
        "beam",
        "clearance",
        "standard",
        "method",
        "connector",
        "slip_class",
        "fillers",
        "enters",
        "member",
    }
)

_PLY_INDEX = re.compile(r"^ply\[([0-9]{1,9})\]$")
_NUMBER = re.compile(r"^[+-]?([0-9]+\.?[0-9]*|\.[0-9]+)([eE][+-]?[0-9]+)?$")
_INTEGER = re.compile(r"^[+-]?[0-9]+$")
#: Integers with more digits than this are read as numbers (floats), as the model's
#: loader would refuse them anyway, and Python limits conversions of huge integers.
MAX_INT_DIGITS = 18


class SweepError(ValueError):
    """A --vary or --cases specification that cannot be used; one line, naming the key."""


@dataclass(frozen=True)
class Key:
    """A value of the model file that a sweep sets.

    Attributes:
        text: The key as the user wrote it (the column title of the results).
        path: Where it lives in the parsed file: table names, 0-based array
            indices and key names, e.g. ``("ply", 1, "thickness")``.
    """

    text: str
    path: tuple[str | int, ...]


def parse_key(text: str, data: Mapping[str, Any]) -> Key:
    """Resolve a key against the parsed model file.

    Args:
        text: E.g. ``ply[2].thickness``.
        data: The parsed model file.

    Returns:
        The :class:`Key`.

    Raises:
        SweepError: Naming the key and what is wrong with it.
    """
    parts = text.strip().split(".")
    if not text.strip() or any(not p for p in parts):
        raise SweepError(f"{text!r}: not a key; write e.g. bolt.diameter or ply[2].thickness")
    head, rest = parts[0], parts[1:]
    m = _PLY_INDEX.match(head)
    if m:
        plies = data.get("ply")
        count = len(plies) if isinstance(plies, list) else 0
        index = int(m.group(1))
        if not 1 <= index <= count:
            raise SweepError(f"{text}: the model has plies 1 to {count} (got ply[{index}])")
        return Key(text, ("ply", index - 1, *_leaf(text, rest, "ply")))
    if head not in TABLE_KEYS:
        hint = difflib.get_close_matches(head, [*TABLE_KEYS, "ply[1]"], n=1)
        extra = (
            f"; did you mean '{hint[0]}'?"
            if hint
            else f"; vary one of {', '.join(TABLE_KEYS)} (ply as ply[N] or ply.NAME)"
        )
        raise SweepError(f"{text}: unknown table '{head}'{extra}")
    if head == "ply":
        if len(rest) != 2:
            raise SweepError(f"{text}: write a ply's key as ply[N].KEY or ply.NAME.KEY")
        names = [p.get("name") for p in data.get("ply", []) if isinstance(p, Mapping)]
        if rest[0] not in names:
            hint = difflib.get_close_matches(rest[0], [str(n) for n in names], n=1)
            extra = f"; did you mean '{hint[0]}'?" if hint else ""
            raise SweepError(f"{text}: no ply is named '{rest[0]}'{extra}")
        return Key(text, ("ply", names.index(rest[0]), *_leaf(text, rest[1:], "ply")))
    if head == "member":
        if len(rest) != 2:
            raise SweepError(f"{text}: write a member's key as member.NAME.KEY")
        members = data.get("member", {})
        if not isinstance(members, Mapping) or rest[0] not in members:
            known = list(members) if isinstance(members, Mapping) else []
            hint = difflib.get_close_matches(rest[0], known, n=1)
            extra = f"; did you mean '{hint[0]}'?" if hint else f"; known: {', '.join(known)}"
            raise SweepError(f"{text}: no member is named '{rest[0]}'{extra}")
        return Key(text, ("member", rest[0], *_leaf(text, rest[1:], "member")))
    return Key(text, (head, *_leaf(text, rest, head)))


def _leaf(text: str, rest: list[str], table: str) -> tuple[str]:
    allowed = TABLE_KEYS[table]
    if len(rest) != 1:
        raise SweepError(
            f"{text}: expected one key after the {table} table (one of {', '.join(allowed)})"
        )
    if rest[0] == "name" and table == "ply":
        raise SweepError(f"{text}: a ply's name cannot be varied")
    if rest[0] not in allowed:
        hint = difflib.get_close_matches(rest[0], allowed, n=1)
        extra = f"; did you mean '{hint[0]}'?" if hint else f"; known: {', '.join(allowed)}"
        raise SweepError(f"{text}: unknown key '{rest[0]}' of {table}{extra}")
    return (rest[0],)


def parse_value(token: str, key: Key | None = None) -> Any:
    """One value as written: an integer, a number, an array, true/false, or a string.

    For a key whose values are names (:data:`NAME_KEYS`) the text is kept as written.
    """
    t = token.strip()
    if len(t) >= 2 and t[0] == t[-1] and t[0] in "\"'":
        return t[1:-1]
    if key is not None and key.path[-1] in NAME_KEYS:
        return t
    if t.startswith("[") or t.endswith("]"):
        if not (t.startswith("[") and t.endswith("]")) or t.count("[") != t.count("]"):
            raise SweepError(f"{key.text if key else 'value'}: unbalanced brackets in {t!r}")
        inner = t[1:-1].strip()
        return [parse_value(x) for x in _split(inner)] if inner else []
    if t in ("true", "false"):
        return t == "true"
    if _NUMBER.match(t):
        if _INTEGER.match(t) and len(t.lstrip("+-")) <= MAX_INT_DIGITS:
            return int(t)
        return float(t)
    return t


def _split(text: str) -> list[str]:
    """Split at commas outside brackets and quotes."""
    out: list[str] = []
    cur: list[str] = []
    depth, quote = 0, ""
    for ch in text:
        if quote:
            quote = "" if ch == quote else quote
        elif ch in "\"'":
            quote = ch
        elif ch == "[":
            depth += 1
        elif ch == "]":
            depth -= 1
        elif ch == "," and depth == 0:
            out.append("".join(cur))
            cur = []
            continue
        cur.append(ch)
    out.append("".join(cur))
    return out


def _is_range(key: Key, text: str) -> bool:
    return (
        ":" in text
        and "[" not in text
        and not any(q in text for q in "\"'")
        and key.path[-1] not in NAME_KEYS
    )


def count_values(key: Key, text: str) -> int:
    """How many values ``text`` gives, without expanding a range."""
    text = text.strip()
    if text and _is_range(key, text):
        return _range_spec(key.text, text)[2]
    return len(_split(text))


def parse_values(key: Key, text: str) -> list[Any]:
    """The values of one ``--vary``: a list, or a range ``start:stop:step``.

    Raises:
        SweepError: Naming the key.
    """
    text = text.strip()
    if not text:
        raise SweepError(f"{key.text}: no values after '='")
    if _is_range(key, text):
        return _range(key.text, text)
    tokens = _split(text)
    if any(not t.strip() for t in tokens):
        raise SweepError(f"{key.text}: an empty value in {text!r}")
    return [parse_value(t, key) for t in tokens]


def _range_spec(key: str, text: str) -> tuple[float, float, int, bool]:
    """``(start, step, count, integral)`` of a range ``start:stop[:step]``."""
    parts = text.split(":")
    if len(parts) not in (2, 3) or not all(_NUMBER.match(p.strip()) for p in parts):
        raise SweepError(
            f"{key}: a range is start:stop or start:stop:step with plain "
            f"numbers (got {_cut(text)!r})"
        )
    nums = [float(p) for p in parts]
    start, stop = nums[0], nums[1]
    step = nums[2] if len(nums) == 3 else (1.0 if stop >= start else -1.0)
    if not all(math.isfinite(v) for v in nums):
        raise SweepError(f"{key}: the range {text!r} is not finite")
    if step == 0 or (stop - start) * step < 0:
        raise SweepError(f"{key}: the step {step:g} never gets from {start:g} to {stop:g}")
    steps = (stop - start) / step
    if not math.isfinite(steps) or steps >= MAX_CASES:
        raise SweepError(f"{key}: the range {text!r} has more than {MAX_CASES} values")
    count = int(math.floor(steps + RANGE_TOL)) + 1
    if count > MAX_CASES:
        raise SweepError(f"{key}: the range {text!r} has {count} values (at most {MAX_CASES})")
    return start, step, count, all(_INTEGER.match(p.strip()) for p in parts)


def _cut(text: str, most: int = 60) -> str:
    return text if len(text) <= most else text[:most] + "..."


def _range(key: str, text: str) -> list[float | int]:
    start, step, count, integral = _range_spec(key, text)
    values = [start + i * step for i in range(count)]
    return (
        [int(round(v)) for v in values] if integral else [float(f"{v:.12g}") for v in values]
    )  # 0.1 steps print as 0.3, not 0.30000000000000004


def parse_vary(spec: str, data: Mapping[str, Any]) -> tuple[Key, list[Any]]:
    """Parse one ``KEY=VALUES``.

    Raises:
        SweepError: Naming the key.
    """
    key, values = _split_vary(spec, data)
    return key, parse_values(key, values)


def _split_vary(spec: str, data: Mapping[str, Any]) -> tuple[Key, str]:
    if "=" not in spec:
        raise SweepError(f"{_cut(spec)!r}: write --vary KEY=VALUES, e.g. bolt.diameter=16,20,24")
    key_text, values = spec.split("=", 1)
    return parse_key(key_text, data), values


def parse_varies(
    specs: Sequence[str], data: Mapping[str, Any], rows: int = 1
) -> list[tuple[Key, list[Any]]]:
    """Parse every ``--vary``, counting the combinations before any range is expanded.

    Args:
        specs: The ``KEY=VALUES`` texts.
        data: The parsed model file.
        rows: Rows of a case table crossed with them (1 without one).

    Raises:
        SweepError: Naming the key, or the count when it exceeds :data:`MAX_CASES`.
    """
    split = [_split_vary(s, data) for s in specs]
    count = rows
    for key, text in split:
        count *= count_values(key, text)
        if count > MAX_CASES:
            raise SweepError(
                f"--vary: more than {MAX_CASES} cases; vary fewer keys or fewer values"
            )
    return [(key, parse_values(key, text)) for key, text in split]


def read_cases(path: str | Path, data: Mapping[str, Any]) -> tuple[list[Key], list[list[Any]]]:
    """Read a CSV of cases: a header of keys, then one case a row (empty cell: the model's value).

    Raises:
        SweepError: Naming the file, and the row or key.
    """
    name = str(path)
    try:
        text = _read_cases_text(path)
        reader = csv.reader(io.StringIO(text, newline=""))
        rows = []
        for r in reader:
            if r:  # [] is a blank line
                rows.append((reader.line_num, r))
            if len(rows) > MAX_CASES + 1:  # the header and one case too many: stop here
                raise SweepError(f"{name}: more than {MAX_CASES} cases")
    except OSError as exc:
        raise SweepError(f"{name}: cannot read the file ({exc.strerror or exc})") from None
    except UnicodeDecodeError as exc:
        raise SweepError(f"{name}: not UTF-8 text ({exc.reason} at byte {exc.start})") from None
    except csv.Error as exc:
        raise SweepError(f"{name}: not a readable CSV file ({exc})") from None
    if not rows:
        raise SweepError(f"{name}: empty; the first row names the keys")
    try:
        keys = [parse_key(h.strip(), data) for h in rows[0][1]]
    except SweepError as exc:
        raise SweepError(f"{name}: header: {exc}") from None
    _no_repeats(keys, name)
    cases = []
    for line, row in rows[1:]:
        if len(row) != len(keys):
            raise SweepError(f"{name}: line {line}: {len(row)} cells for {len(keys)} keys")
        try:
            cases.append(
                [parse_value(c, k) if c.strip() else None for c, k in zip(row, keys, strict=True)]
            )
        except SweepError as exc:
            raise SweepError(f"{name}: line {line}: {exc}") from None
    if not cases:
        raise SweepError(f"{name}: no cases below the header")
    return keys, cases


def _read_cases_text(path: str | Path) -> str:
    """The text of a --cases file: a regular file of at most :data:`MAX_CASES_BYTES`.

    A FIFO, a device (``/dev/zero``) or a folder is refused before it is opened, so
    nothing blocks or grows without bound; a file that grows while it is read is cut
    at the limit and refused.

    Raises:
        SweepError: Naming the file.
        OSError: If it cannot be read.
        UnicodeDecodeError: If it is not UTF-8.
    """
    name = str(path)
    # opened without blocking (a FIFO with no writer would wait for ever), then checked
    fd = os.open(path, os.O_RDONLY | getattr(os, "O_NONBLOCK", 0))
    with os.fdopen(fd, "rb") as fh:
        info = os.fstat(fd)
        if not stat.S_ISREG(info.st_mode):
            raise SweepError(f"{name}: not a regular file (a CSV file of cases is expected)")
        if info.st_size > MAX_CASES_BYTES:
            raise SweepError(f"{name}: {info.st_size} bytes (at most {MAX_CASES_BYTES})")
        raw = fh.read(MAX_CASES_BYTES + 1)
    if len(raw) > MAX_CASES_BYTES:
        raise SweepError(f"{name}: larger than {MAX_CASES_BYTES} bytes")
    return raw.decode("utf-8-sig")


def _no_repeats(keys: Sequence[Key], where: str) -> None:
    seen: dict[tuple[str | int, ...], str] = {}
    for k in keys:
        if k.path in seen:
            raise SweepError(f"{where}: {k.text} and {seen[k.path]} set the same value")
        seen[k.path] = k.text


def cases(
    varies: Sequence[tuple[Key, list[Any]]], table: tuple[list[Key], list[list[Any]]] | None = None
) -> tuple[list[Key], list[list[Any]]]:
    """The full factorial of the varied keys, crossed with the rows of a case table.

    Args:
        varies: ``(key, values)`` per ``--vary``, the first varying slowest.
        table: Keys and rows from :func:`read_cases`, or None.

    Returns:
        The keys (columns) and one list of values per case.

    Raises:
        SweepError: Too many cases, or one value set twice.
    """
    keys = [k for k, _ in varies]
    count = math.prod(len(v) for _, v in varies)
    if table is not None:
        keys = [*table[0], *keys]
        count *= len(table[1])
    _no_repeats(keys, "--vary/--cases")
    if count > MAX_CASES:
        raise SweepError(
            f"--vary: {count} cases (at most {MAX_CASES}); vary fewer keys or fewer values"
        )
    rows = [list(c) for c in itertools.product(*(v for _, v in varies))]
    if table is not None:
        rows = [[*t, *r] for t in table[1] for r in rows]
    return keys, rows


def apply(data: Mapping[str, Any], keys: Sequence[Key], values: Sequence[Any]) -> dict[str, Any]:
    """Return the parsed model file with ``values`` set at ``keys`` (None: unchanged).

    ``data`` is not changed: the tables and arrays along each key's path are
    copied (the rest is shared, and the loader only reads it). A case that sets
    ``bolt.diameter`` drops the file's ``bolt.stress_area`` (it belongs to the
    file's diameter), so the loader finds the new diameter's, unless the case
    sets ``bolt.stress_area`` too.
    """
    out = dict(data)
    given = {tuple(k.path): v for k, v in zip(keys, values, strict=True) if v is not None}
    bolt = out.get("bolt")
    if (
        isinstance(bolt, Mapping)
        and "stress_area" in bolt
        and ("bolt", "stress_area") not in given
        and given.get(("bolt", "diameter"), bolt.get("diameter")) != bolt.get("diameter")
    ):
        out["bolt"] = {k: v for k, v in bolt.items() if k != "stress_area"}
    for key, value in zip(keys, values, strict=True):
        if value is None:
            continue
        node: Any = out
        for part, nxt in zip(key.path[:-1], key.path[1:], strict=True):
            child = node.get(part, {}) if isinstance(part, str) else node[part]
            child = list(child) if isinstance(nxt, int) else dict(child)
            node[part] = child
            node = child
        node[key.path[-1]] = copy.deepcopy(value)
    return out
