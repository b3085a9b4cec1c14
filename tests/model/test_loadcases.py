"""Load cases and combinations in the model file: reading, and the one-line refusals."""

from __future__ import annotations

import pytest

from plyshear.model import modelfile
from plyshear.model.modelfile import ModelError
from tests.conftest import FORK

REL_EXACT = 1e-12

#: Three plies, three members: the head-side one held, the other two loaded by cases.
CHAIN = """\
format = 1
units = "kN-mm"

[bolt]
diameter = 20
grade = "8.8"

[[ply]]
name = "a"
member = "a"
thickness = 10
steel = "S355"

[[ply]]
name = "b"
member = "b"
thickness = 12
steel = "S355"

[[ply]]
name = "c"
member = "c"
thickness = 10
steel = "S355"

[member.a]
support = true

[member.b]
load = { dead = 50, live = [0, 30] }

[member.c]
load = { wind = -120 }
"""

COMBOS = """
[[combination]]
name = "gravity"
factors = { dead = 1.2, live = 1.6 }
level = "factored"

[[combination]]
name = "uplift"
factors = { dead = 0.9, wind = 1.0 }
"""


def test_cases_are_known_to_every_member_and_absent_ones_carry_nothing() -> None:
    joint = modelfile.loads(CHAIN + COMBOS)
    assert [c.name for c in joint.cases] == ["dead", "live", "wind"]
    names = [m.name for m in joint.members]
    wind = dict(zip(names, next(c for c in joint.cases if c.name == "wind").loads, strict=True))
    assert wind == {"a": (0.0, 0.0), "b": (0.0, 0.0), "c": (-120e3, 0.0)}  # kN -> N
    live = dict(zip(names, joint.cases[1].loads, strict=True))
    assert live["b"] == (0.0, 30e3)  # [Fx, Fy] as for a plain load


def test_members_carry_the_first_combination_and_for_combination_the_others() -> None:
    joint = modelfile.loads(CHAIN + COMBOS)
    assert joint.combination == "gravity"
    # statics of the factored sum, by hand: 1.2 * 50 kN along x, 1.6 * 30 kN along y
    assert joint.member("b").load == pytest.approx((60e3, 48e3), rel=REL_EXACT)
    assert joint.member("c").load == (0.0, 0.0)
    uplift = joint.for_combination("uplift")
    assert uplift.member("b").load == pytest.approx((45e3, 0.0), rel=REL_EXACT)  # 0.9 * 50
    assert uplift.member("c").load == pytest.approx((-120e3, 0.0), rel=REL_EXACT)
    assert uplift.combination == "uplift"
    assert uplift.check.loads == "factored"


def test_a_plain_load_is_one_case_as_before() -> None:
    joint = modelfile.loads(FORK)
    assert joint.cases == ()
    assert joint.combinations == ()
    assert joint.combination == ""
    assert not joint.has_cases
    assert joint.member("lug").load == (100e3, 0.0)


def test_level_defaults_to_what_the_method_takes() -> None:
    # AISC 360-22 B3.1 / B3.2: LRFD takes factored loads, ASD service (nominal) loads
    joint = modelfile.loads(
        CHAIN + COMBOS.replace('level = "factored"\n', "") + '\n[check]\nmethod = "lrfd"\n'
    )
    assert {c.level for c in joint.combinations} == {"factored"}
    asd = modelfile.loads(
        CHAIN + COMBOS.replace('level = "factored"\n', "") + '\n[check]\nmethod = "asd"\n'
    )
    assert {c.level for c in asd.combinations} == {"service"}


def test_generated_combinations_are_read_from_check() -> None:
    joint = modelfile.loads(CHAIN + '\n[check]\ncombinations = "asce7-22"\n')
    names = [c.name for c in joint.combinations]
    # ASCE 7-22 2.3.1 (from memory) for D, L, W: eq. 1, 2, 4 (with and without L), 5
    assert names == ["2.3.1-1", "2.3.1-2", "2.3.1-4-1", "2.3.1-4-2", "2.3.1-5"]
    en = modelfile.loads(
        CHAIN + '\n[check]\nstandard = "en1993-1-8"\ncombinations = "en1990"\ncategory = "E"\n'
    )
    # EN 1990 Table A1.1 (from memory): storage (category E) psi0 = 1.0 -> 1.5 * 1.0
    assert dict(en.combination_named("6.10-6").factors)["live"] == pytest.approx(1.5)


@pytest.mark.parametrize(
    ("text", "key", "words"),
    [
        (
            CHAIN + COMBOS.replace("live = 1.6", "snow = 1.6"),
            "combination[1].factors.snow",
            "names no load case",
        ),
        (
            CHAIN + COMBOS.replace("wind = 1.0", 'wind = "x"'),
            "combination[2].factors.wind",
            "plain number",
        ),
        (
            CHAIN + COMBOS.replace("wind = 1.0", "wind = nan"),
            "combination[2].factors.wind",
            "finite",
        ),
        (
            CHAIN + COMBOS.replace('level = "factored"', 'level = "service"'),
            "combination[1].level",
            "contradict",
        ),
        (CHAIN + COMBOS + '\n[check]\nmethod = "asd"\n', "combination[1].level", "contradict"),
        (CHAIN, "combination", "no combination"),
        (FORK + COMBOS, "combination", "named load cases"),
        (FORK + '\n[check]\ncombinations = "asce7-22"\n', "check.combinations", "named load cases"),
        (
            CHAIN.replace("wind = -120", "crane = -120") + '\n[check]\ncombinations = "asce7-22"\n',
            "check.combinations",
            "crane",
        ),
        (
            CHAIN + '\n[check]\ncombinations = "asce7-22"\ncategory = "A"\n',
            "check.category",
            "en1990",
        ),
        (
            CHAIN + '\n[check]\ncombinations = "en1990"\nmethod = "asd"\n',
            "check.combinations",
            "ASD",
        ),
        (
            CHAIN + '\n[check]\ncombinations = "en1990"\ncategory = "Z"\n',
            "check.category",
            "must be one of",
        ),
        (
            CHAIN.replace("load = { wind = -120 }", "load = 5") + COMBOS,
            "member.c.load",
            "plain load beside load cases",
        ),
        (CHAIN + COMBOS + COMBOS, "combination", "two combinations"),
        (CHAIN.replace("load = { wind = -120 }", "load = {}") + COMBOS, "member.c.load", "empty"),
        (CHAIN + COMBOS.replace('name = "uplift"\n', ""), "combination[2].name", "missing"),
        (
            CHAIN.replace("dead = 50, live = [0, 30]", "dead = 0").replace(
                "wind = -120", "wind = 0"
            )
            + COMBOS.replace(", live = 1.6", ""),
            "member",
            "no member carries a load",
        ),
    ],
)
def test_bad_cases_and_combinations_are_refused_in_one_line(
    text: str, key: str, words: str
) -> None:
    with pytest.raises(ModelError) as info:
        modelfile.loads(text, "m.toml")
    assert info.value.key == key
    assert words in info.value.message
    assert "\n" not in str(info.value)
