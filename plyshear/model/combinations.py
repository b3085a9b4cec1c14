"""Load combinations generated from a standard's equations.

``[check] combinations = "asce7-22"`` or ``"en1990"`` builds the basic
combinations of the standard from the model's load cases. A case's category
comes from its name: the name itself or its first part before ``_``, ``-`` or a
digit (``wind_north``, ``snow2``), from the words in :data:`CATEGORY_NAMES`.

The equations are cited from memory (the equation numbers and factors as the
standards print them, as far as this author recalls them); the engineer checks
the generated list, which every command prints.

Rules that turn an equation into combinations:

* A companion (non-principal) variable action is also left out in turn (it acts
  only where unfavourable); the principal one never is.
* Every case of category ``dead`` (EN: permanent) is in every combination with
  the equation's dead-load factor: permanent actions act together.
* The cases of one variable category are alternatives (two wind directions are
  two cases of category ``wind``); "Lr or S or R" in an equation means one
  combination for each case of those categories.
* An equation is generated only when its principal action (the one it exists
  for: L in ASCE 7 eq. 2, W in eq. 4, the leading action in EN 1990 eq. 6.10) is
  among the cases; terms of absent categories drop out.
* Combinations with the same factors are kept once (the first name).
* Load factors the standards allow to be reduced (ASCE 7 0.5L for light
  occupancies) are kept at their full value; seismic vertical effects (Ev,
  which need S_DS) are not generated: give them as a case of your own.
"""

from __future__ import annotations

import itertools
import re
from collections.abc import Iterator, Sequence

from plyshear.model.joint import Combination

GENERATORS = ("asce7-22", "en1990")
#: Case categories and the case names that say them (lower case).
CATEGORY_NAMES: dict[str, tuple[str, ...]] = {
    "dead": ("dead", "d", "permanent", "g"),
    "live": ("live", "l", "imposed", "q"),
    "roof_live": ("roof_live", "roof-live", "rooflive", "lr"),
    "snow": ("snow", "s"),
    "rain": ("rain", "r"),
    "wind": ("wind", "w"),
    "earthquake": ("earthquake", "seismic", "e"),
}
#: EN 1990 building categories (Table A1.1) for ``[check] category``.
EN_CATEGORIES = ("A", "B", "C", "D", "E", "F", "G", "H")
#: ψ0 of imposed loads by category: EN 1990:2002 Table A1.1 (from memory:
#: EN 1990:2002+A1:2005 Table A1.1, recommended values).
PSI0_IMPOSED = {"A": 0.7, "B": 0.7, "C": 0.7, "D": 0.7, "E": 1.0, "F": 0.7, "G": 0.7, "H": 0.0}
#: ψ0 of snow (sites at altitude H ≤ 1000 m a.s.l.) and wind: EN 1990 Table A1.1
#: (from memory: EN 1990:2002+A1:2005 Table A1.1, recommended values).
PSI0_SNOW = 0.5
PSI0_WIND = 0.6
#: EN 1990 Table A1.2(B), eq. 6.10 (from memory: recommended γ values, STR/GEO set B).
GAMMA_G_SUP = 1.35
GAMMA_G_INF = 1.0
GAMMA_Q = 1.5

#: ASCE/SEI 7-22 §2.3.1 and §2.3.6 strength combinations (from memory), as
#: (equation, principal categories, terms); a term is (factor, categories):
#: one case of any of the categories (alternatives).
ASCE_STRENGTH: tuple[
    tuple[str, tuple[str, ...], tuple[tuple[float, tuple[str, ...]], ...]], ...
] = (
    ("ASCE 7-22 2.3.1 (1)", ("dead",), ((1.4, ("dead",)),)),
    (
        "ASCE 7-22 2.3.1 (2)",
        ("live",),
        ((1.2, ("dead",)), (1.6, ("live",)), (0.5, ("roof_live", "snow", "rain"))),
    ),
    (
        "ASCE 7-22 2.3.1 (3)",
        ("roof_live", "snow", "rain"),
        ((1.2, ("dead",)), (1.6, ("roof_live", "snow", "rain")), (1.0, ("live",))),
    ),
    (
        "ASCE 7-22 2.3.1 (3)",
        ("roof_live", "snow", "rain"),
        ((1.2, ("dead",)), (1.6, ("roof_live", "snow", "rain")), (0.5, ("wind",))),
    ),
    (
        "ASCE 7-22 2.3.1 (4)",
        ("wind",),
        (
            (1.2, ("dead",)),
            (1.0, ("wind",)),
            (1.0, ("live",)),
            (0.5, ("roof_live", "snow", "rain")),
        ),
    ),
    ("ASCE 7-22 2.3.1 (5)", ("wind",), ((0.9, ("dead",)), (1.0, ("wind",)))),
    (
        "ASCE 7-22 2.3.6 (6)",
        ("earthquake",),
        ((1.2, ("dead",)), (1.0, ("earthquake",)), (1.0, ("live",)), (0.15, ("snow",))),
    ),
    ("ASCE 7-22 2.3.6 (7)", ("earthquake",), ((0.9, ("dead",)), (1.0, ("earthquake",)))),
)
#: ASCE/SEI 7-22 §2.4.1 allowable-stress combinations (from memory), as above.
ASCE_ALLOWABLE: tuple[
    tuple[str, tuple[str, ...], tuple[tuple[float, tuple[str, ...]], ...]], ...
] = (
    ("ASCE 7-22 2.4.1 (1)", ("dead",), ((1.0, ("dead",)),)),
    ("ASCE 7-22 2.4.1 (2)", ("live",), ((1.0, ("dead",)), (1.0, ("live",)))),
    (
        "ASCE 7-22 2.4.1 (3)",
        ("roof_live", "snow", "rain"),
        ((1.0, ("dead",)), (1.0, ("roof_live", "snow", "rain"))),
    ),
    (
        "ASCE 7-22 2.4.1 (4)",
        ("live", "roof_live", "snow", "rain"),
        ((1.0, ("dead",)), (0.75, ("live",)), (0.75, ("roof_live", "snow", "rain"))),
    ),
    ("ASCE 7-22 2.4.1 (5)", ("wind",), ((1.0, ("dead",)), (0.6, ("wind",)))),
    ("ASCE 7-22 2.4.1 (5)", ("earthquake",), ((1.0, ("dead",)), (0.7, ("earthquake",)))),
    (
        "ASCE 7-22 2.4.1 (6a)",
        ("wind",),
        (
            (1.0, ("dead",)),
            (0.75, ("live",)),
            (0.45, ("wind",)),
            (0.75, ("roof_live", "snow", "rain")),
        ),
    ),
    (
        "ASCE 7-22 2.4.1 (6b)",
        ("earthquake",),
        ((1.0, ("dead",)), (0.75, ("live",)), (0.525, ("earthquake",)), (0.75, ("snow",))),
    ),
    ("ASCE 7-22 2.4.1 (7)", ("wind",), ((0.6, ("dead",)), (0.6, ("wind",)))),
    ("ASCE 7-22 2.4.1 (8)", ("earthquake",), ((0.6, ("dead",)), (0.7, ("earthquake",)))),
)
#: EN 1990 categories of the variable actions and the categories they cover.
EN_VARIABLE = ("live", "snow", "wind")
#: Categories EN 1990 knows (roof live, rain, earthquake are not combined by eq. 6.10).
EN_KNOWN = ("dead", *EN_VARIABLE)


def category_of(name: str) -> str | None:
    """The category a case's name says, or None.

    The whole name, or its first part before ``_``, ``-``, a space or a digit
    (``roof_live`` and ``roof-live`` are whole names), compared in lower case.
    """
    low = name.strip().lower()
    first = re.split(r"[_\-\s\d]", low, maxsplit=1)[0]
    for category, names in CATEGORY_NAMES.items():
        if low in names:
            return category
    for category, names in CATEGORY_NAMES.items():
        if first and first in names:
            return category
    return None


def generate(
    generator: str, cases: Sequence[tuple[str, str]], *, method: str = "lrfd", category: str = "A"
) -> tuple[Combination, ...]:
    """The basic combinations of a standard for the given cases.

    Args:
        generator: ``"asce7-22"`` or ``"en1990"``.
        cases: ``(name, category)`` of every case (categories from :func:`category_of`).
        method: ``"lrfd"`` (strength: factored) or ``"asd"`` (ASCE 7 §2.4: service);
            EN 1990 eq. 6.10 is always factored.
        category: EN 1990 building category A–H for ψ0 of imposed loads.

    Returns:
        The combinations, named ``<generator> <equation>-<n>`` in order.

    Raises:
        ValueError: For an unknown generator or category, or ASD with EN 1990.
    """
    if generator == "asce7-22":
        table = ASCE_ALLOWABLE if method == "asd" else ASCE_STRENGTH
        level = "service" if method == "asd" else "factored"
        raw = list(_from_table(table, cases))
    elif generator == "en1990":
        if method == "asd":
            raise ValueError(
                "EN 1990 eq. 6.10 gives factored combinations; ASD takes service "
                'loads: use combinations = "asce7-22" or method = "lrfd"'
            )
        if category not in EN_CATEGORIES:
            raise ValueError(
                f"unknown EN 1990 category '{category}'; known: {', '.join(EN_CATEGORIES)}"
            )
        level = "factored"
        raw = list(_en_610(cases, category))
    else:
        raise ValueError(f"unknown generator '{generator}'; known: {', '.join(GENERATORS)}")
    return _named(raw, level)


def _named(raw: list[tuple[str, dict[str, float]]], level: str) -> tuple[Combination, ...]:
    """Drop repeats (same factors) and empty ones; name them by equation.

    ``2.3.1-2`` for the only combination of ASCE 7 eq. 2.3.1 (2), ``2.3.1-3-1``,
    ``2.3.1-3-2`` for several of one equation; ``6.10-1``... for EN 1990.
    """
    seen: set[tuple[tuple[str, float], ...]] = set()
    kept: list[tuple[str, dict[str, float]]] = []
    for source, factors in raw:
        nonzero = {k: v for k, v in factors.items() if v != 0.0}
        key = tuple(sorted(nonzero.items()))
        if not key or key in seen:
            continue
        seen.add(key)
        kept.append((source, nonzero))
    counts: dict[str, int] = {}
    for source, _ in kept:
        counts[source] = counts.get(source, 0) + 1
    out: list[Combination] = []
    done: dict[str, int] = {}
    for source, factors in kept:
        eq = _equation_label(source)
        done[source] = done.get(source, 0) + 1
        name = eq if counts[source] == 1 else f"{eq}-{done[source]}"
        out.append(
            Combination(
                name=name,
                factors=tuple(factors.items()),
                level=level,
                source=source + " (from memory)",
            )
        )
    return tuple(out)


def _equation_label(source: str) -> str:
    """``"ASCE 7-22 2.3.1 (3)"`` → ``"2.3.1-3"``; ``"EN 1990 6.10"`` → ``"6.10"``."""
    match = re.search(r"(\d+(?:\.\d+)+)(?: \((\w+)\))?$", source)
    if match is None:
        return source
    return match.group(1) + (f"-{match.group(2)}" if match.group(2) else "")


def _from_table(
    table: Sequence[tuple[str, tuple[str, ...], tuple[tuple[float, tuple[str, ...]], ...]]],
    cases: Sequence[tuple[str, str]],
) -> Iterator[tuple[str, dict[str, float]]]:
    """Expand table equations: the product over terms of their alternatives."""
    by_cat: dict[str, list[str]] = {}
    for name, cat in cases:
        by_cat.setdefault(cat, []).append(name)
    for source, principal, terms in table:
        if not all(any(c in by_cat for c in cats) for cats in _principal_groups(principal)):
            continue
        dead = [(f, cats) for f, cats in terms if cats == ("dead",)]
        variable = [(f, cats) for f, cats in terms if cats != ("dead",)]
        # A companion may also be absent (ASCE 7 §2.3.1, §2.4.1: the effects of one
        # or more loads not acting are investigated); a principal term may not.
        choices = [
            [(f, n) for c in cats for n in by_cat.get(c, [])]
            + ([] if _is_principal(cats, principal) else [None])
            for f, cats in variable
        ]
        for pick in itertools.product(*choices):
            factors: dict[str, float] = {}
            for f, _ in dead:
                for n in by_cat.get("dead", []):
                    factors[n] = f
            for item in pick:
                if item is not None:
                    factors[item[1]] = factors.get(item[1], 0.0) + item[0]
            if any(factors.get(n, 0.0) for c in principal for n in by_cat.get(c, [])):
                yield source, factors


def _is_principal(cats: tuple[str, ...], principal: tuple[str, ...]) -> bool:
    """True when a term's categories are (one of) the equation's principal group(s)."""
    return cats in _principal_groups(principal)


def _principal_groups(principal: tuple[str, ...]) -> list[tuple[str, ...]]:
    """ASD eq. 4 needs L and one of Lr/S/R; elsewhere one of the principal categories."""
    if principal == ("live", "roof_live", "snow", "rain"):
        return [("live",), ("roof_live", "snow", "rain")]
    return [principal]


def psi0(category: str, building: str) -> float:
    """ψ0 of a variable action of ``category`` (EN 1990 Table A1.1, from memory)."""
    if category == "live":
        return PSI0_IMPOSED[building]
    return {"snow": PSI0_SNOW, "wind": PSI0_WIND}[category]


def _en_610(
    cases: Sequence[tuple[str, str]], building: str
) -> Iterator[tuple[str, dict[str, float]]]:
    """EN 1990 eq. 6.10 with Table A1.2(B): each variable case leading in turn.

    Permanent actions at γG,sup = 1.35 and, for each leading action, also at
    γG,inf = 1.0 (the permanent action favourable, e.g. against wind uplift); the
    leading action at γQ = 1.5, every other category's worst companion at
    γQ ψ0 (one case of each other category: alternatives of one category never
    act together), or absent (a variable action acts only where unfavourable).
    """
    dead = [n for n, c in cases if c == "dead"]
    by_cat: dict[str, list[str]] = {}
    for name, cat in cases:
        if cat in EN_VARIABLE:
            by_cat.setdefault(cat, []).append(name)
    yield "EN 1990 6.10", {n: GAMMA_G_SUP for n in dead}
    for lead_cat in EN_VARIABLE:
        for lead in by_cat.get(lead_cat, []):
            others = [
                [(c, n) for n in by_cat[c]] for c in EN_VARIABLE if c != lead_cat and c in by_cat
            ]
            for gamma_g in (GAMMA_G_SUP, GAMMA_G_INF):
                for pick in itertools.product(*[[*o, None] for o in others]):
                    factors = {n: gamma_g for n in dead}
                    factors[lead] = GAMMA_Q
                    for item in pick:
                        if item is not None:
                            factors[item[1]] = round(GAMMA_Q * psi0(item[0], building), 12)
                    yield "EN 1990 6.10", factors
