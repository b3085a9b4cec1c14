"""The generated combinations against the standards' equations (count and factors).

References (all from memory; the engineer checks the generated list, which every
command prints):

* ASCE/SEI 7-22, Minimum Design Loads and Associated Criteria for Buildings and
  Other Structures, §2.3.1 (strength, eqs. 1-5), §2.3.6 (with seismic, eqs. 6-7),
  §2.4.1 (allowable stress, eqs. 1-8).
* EN 1990:2002+A1:2005, Basis of structural design, eq. (6.10) with Table A1.2(B)
  (γG,sup = 1.35, γG,inf = 1.00, γQ = 1.5) and Table A1.1 (ψ0).
"""

from __future__ import annotations

import pytest

from plyshear.model import combinations as gen

REL_EXACT = 1e-12


def as_sets(combos: tuple) -> list[dict[str, float]]:
    return [dict(c.factors) for c in combos]


def same(got: list[dict[str, float]], expected: list[dict[str, float]]) -> None:
    assert len(got) == len(expected)
    for g, e in zip(got, expected, strict=True):
        assert set(g) == set(e)
        for k in e:
            assert g[k] == pytest.approx(e[k], rel=REL_EXACT)


def test_categories_from_the_names() -> None:
    assert gen.category_of("dead") == "dead"
    assert gen.category_of("D") == "dead"
    assert gen.category_of("wind_north") == "wind"
    assert gen.category_of("wind-2") == "wind"
    assert gen.category_of("roof_live") == "roof_live"
    assert gen.category_of("Lr") == "roof_live"
    assert gen.category_of("snow2") == "snow"
    assert gen.category_of("imposed") == "live"
    assert gen.category_of("crane") is None


def test_asce_strength_dead_live_wind() -> None:
    cases = [("D", "dead"), ("L", "live"), ("W", "wind")]
    got = gen.generate("asce7-22", cases, method="lrfd")
    # from memory: ASCE 7-22 §2.3.1; eq. 3 needs Lr, S or R (absent); eq. 4 with L
    # acting and not acting (§2.3.1: loads not acting are investigated)
    same(
        as_sets(got),
        [
            {"D": 1.4},  # eq. 1
            {"D": 1.2, "L": 1.6},  # eq. 2
            {"D": 1.2, "W": 1.0, "L": 1.0},  # eq. 4
            {"D": 1.2, "W": 1.0},  # eq. 4, L not acting
            {"D": 0.9, "W": 1.0},  # eq. 5
        ],
    )
    assert {c.level for c in got} == {"factored"}
    assert all("from memory" in c.source for c in got)


def test_asce_strength_with_snow_and_two_wind_directions() -> None:
    cases = [("D", "dead"), ("S", "snow"), ("Wn", "wind"), ("Ws", "wind")]
    got = as_sets(gen.generate("asce7-22", cases, method="lrfd"))
    # from memory: ASCE 7-22 §2.3.1; eq. 2 exists for L (absent); the two wind
    # cases are alternatives of one load W, never added
    same(
        got,
        [
            {"D": 1.4},  # eq. 1
            {"D": 1.2, "S": 1.6},  # eq. 3
            {"D": 1.2, "S": 1.6, "Wn": 0.5},  # eq. 3 with 0.5W
            {"D": 1.2, "S": 1.6, "Ws": 0.5},
            {"D": 1.2, "Wn": 1.0, "S": 0.5},  # eq. 4
            {"D": 1.2, "Wn": 1.0},
            {"D": 1.2, "Ws": 1.0, "S": 0.5},
            {"D": 1.2, "Ws": 1.0},
            {"D": 0.9, "Wn": 1.0},  # eq. 5
            {"D": 0.9, "Ws": 1.0},
        ],
    )


def test_asce_strength_with_earthquake() -> None:
    cases = [("D", "dead"), ("E", "earthquake")]
    # from memory: ASCE 7-22 §2.3.6 eqs. 6 and 7 with Ev not generated (it needs S_DS)
    same(
        as_sets(gen.generate("asce7-22", cases)),
        [{"D": 1.4}, {"D": 1.2, "E": 1.0}, {"D": 0.9, "E": 1.0}],
    )


def test_asce_allowable_dead_live_roof_wind() -> None:
    cases = [("D", "dead"), ("L", "live"), ("Lr", "roof_live"), ("W", "wind")]
    got = gen.generate("asce7-22", cases, method="asd")
    # from memory: ASCE 7-22 §2.4.1 eqs. 1-8 (no E: eqs. 5 with E, 6b, 8 absent)
    same(
        as_sets(got),
        [
            {"D": 1.0},  # eq. 1
            {"D": 1.0, "L": 1.0},  # eq. 2
            {"D": 1.0, "Lr": 1.0},  # eq. 3
            {"D": 1.0, "L": 0.75, "Lr": 0.75},  # eq. 4
            {"D": 1.0, "W": 0.6},  # eq. 5
            {"D": 1.0, "L": 0.75, "W": 0.45, "Lr": 0.75},  # eq. 6a: 0.75 (0.6 W)
            {"D": 1.0, "L": 0.75, "W": 0.45},
            {"D": 1.0, "W": 0.45, "Lr": 0.75},
            {"D": 1.0, "W": 0.45},
            {"D": 0.6, "W": 0.6},  # eq. 7
        ],
    )
    assert {c.level for c in got} == {"service"}


def test_en1990_610_office_with_wind() -> None:
    cases = [("G", "dead"), ("Q", "live"), ("W", "wind")]
    got = gen.generate("en1990", cases, category="B")
    # from memory: EN 1990 eq. (6.10), Table A1.2(B): 1.35 / 1.0 G, 1.5 leading Q;
    # Table A1.1: psi0 = 0.7 (category B offices), 0.6 (wind)
    g, q = 1.35, 1.5
    same(
        as_sets(got),
        [
            {"G": g},
            {"G": g, "Q": q, "W": q * 0.6},
            {"G": g, "Q": q},
            {"G": 1.0, "Q": q, "W": q * 0.6},
            {"G": 1.0, "Q": q},
            {"G": g, "W": q, "Q": q * 0.7},
            {"G": g, "W": q},
            {"G": 1.0, "W": q, "Q": q * 0.7},
            {"G": 1.0, "W": q},
        ],
    )
    assert [c.name for c in got][:2] == ["6.10-1", "6.10-2"]


@pytest.mark.parametrize(
    ("category", "psi0"),
    [
        ("A", 0.7),
        ("C", 0.7),
        ("E", 1.0),
        ("H", 0.0),  # EN 1990 Table A1.1 (from memory)
    ],
)
def test_en1990_psi0_of_imposed_loads_by_category(category: str, psi0: float) -> None:
    got = gen.generate("en1990", [("G", "dead"), ("Q", "live"), ("S", "snow")], category=category)
    snow_leading = [dict(c.factors) for c in got if dict(c.factors).get("S") == 1.5]
    companions = sorted({d.get("Q", 0.0) for d in snow_leading})
    # a companion with psi0 = 0 (roofs, category H) is no companion at all
    assert companions == pytest.approx(sorted({0.0, 1.5 * psi0}), rel=REL_EXACT)
    # snow as companion: psi0 = 0.5 at H <= 1000 m a.s.l. (Table A1.1, from memory)
    q_leading = [
        d for d in map(dict, (c.factors for c in got)) if d.get("Q") == 1.5 and d.get("S") != 1.5
    ]
    assert sorted({d.get("S", 0.0) for d in q_leading}) == pytest.approx([0.0, 1.5 * 0.5])


def test_generator_refusals() -> None:
    with pytest.raises(ValueError, match="ASD"):
        gen.generate("en1990", [("G", "dead")], method="asd")
    with pytest.raises(ValueError, match="category"):
        gen.generate("en1990", [("G", "dead")], category="Z")
    with pytest.raises(ValueError, match="generator"):
        gen.generate("bs6399", [("G", "dead")])
