"""Model-file rules from the independent review (issue 13): what is no joint is refused.

A joint whose members carry no load, a bolt that does not reach through its stack,
and the thread rules of pins and plain dowels.
"""

from __future__ import annotations

import math

import pytest

import plyshear
from plyshear.model import modelfile
from tests.conftest import FORK

REL_EXACT = 1e-12


def test_a_joint_without_load_is_refused() -> None:
    text = FORK.replace("[member.lug]\nload = 100", "[member.lug]")
    with pytest.raises(modelfile.ModelError, match="no member carries a load") as info:
        modelfile.loads(text)
    assert info.value.key == "member"
    assert "allow_unloaded = true" in info.value.message


def test_a_zero_load_is_no_load() -> None:
    with pytest.raises(modelfile.ModelError, match="no member carries a load"):
        modelfile.loads(FORK.replace("load = 100", "load = [0, 0]"))


def test_allow_unloaded_accepts_it_and_the_check_sees_nothing() -> None:
    text = FORK.replace("[member.lug]\nload = 100", "[member.lug]")
    joint = modelfile.loads(text + "\n[check]\nallow_unloaded = true\n")
    assert joint.check.allow_unloaded
    result = plyshear.check(joint, plyshear.solve(joint))
    # statics: no load, no demand anywhere
    assert max(i.utilization for i in result.items) == 0.0


def test_allow_unloaded_must_be_a_boolean() -> None:
    with pytest.raises(modelfile.ModelError, match="check.allow_unloaded: must be true or false"):
        modelfile.loads(FORK + "\n[check]\nallow_unloaded = 1\n")


def test_a_bolt_shorter_than_the_grip_is_refused() -> None:
    # the review's case: a 40 mm bolt on a 56 mm grip (18 + 20 + 18)
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 40').replace(
        "thickness = 10", "thickness = 18"
    )
    with pytest.raises(modelfile.ModelError) as info:
        modelfile.loads(text)
    assert info.value.key == "bolt.length"
    assert info.value.message.startswith("40 mm is shorter than the grip 56 mm")
    # a bolt exactly the grip (10 + 20 + 10 = 40 mm) reaches: no error (the protrusion
    # warning is sanity's)
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 40\nthread_length = 10')
    assert modelfile.loads(text).bolt.length == pytest.approx(40.0, rel=REL_EXACT)


def test_a_pin_with_a_length_needs_no_thread_length() -> None:
    # a 21 mm pin: no thread table has the size (ISO 261 has M20 and M22)
    text = FORK.replace(
        'diameter = 24\ngrade = "8.8"',
        'diameter = 21\ngrade = "8.8"\nthreads = "excluded"\nlength = 60',
    )
    joint = modelfile.loads(text + '\n[check]\nconnector = "pin"\n')
    assert joint.bolt.thread_length is None
    # no thread data: the pin's section is its gross area pi d^2 / 4
    assert joint.bolt.stress_area == pytest.approx(math.pi * 21**2 / 4, rel=REL_EXACT)
    sol = plyshear.solve(joint)
    assert not any(p.threads for p in sol.first_bolt_planes)
    for standard in ("aisc360-22", "en1993-1-8"):
        result = plyshear.check(joint, sol, standard)
        assert result.items
    # a bolt (threads "auto") of that size still needs its thread placed
    text = FORK.replace(
        'diameter = 24\ngrade = "8.8"',
        'diameter = 21\ngrade = "8.8"\nstress_area = 270\nlength = 60',
    )
    with pytest.raises(modelfile.ModelError, match="bolt.thread_length: not given"):
        modelfile.loads(text)


def test_thread_length_zero_is_accepted() -> None:
    text = FORK.replace('grade = "8.8"', 'grade = "8.8"\nlength = 70\nthread_length = 0')
    joint = modelfile.loads(text)
    assert joint.bolt.thread_length == 0.0
    # geometry: the thread starts at 70 - 0 = 70 mm, past the 40 mm stack
    assert not any(p.threads for p in plyshear.solve(joint).first_bolt_planes)


@pytest.mark.parametrize(
    ("key", "value", "field", "expected"),
    [
        ("loads", '"service"', "loads", "service"),
        ("loads", '"factored"', "loads", "factored"),
        ("pin_interaction", '"same-section"', "pin_interaction", "same-section"),
    ],
)
def test_the_new_check_keys_are_read(key, value, field, expected) -> None:
    joint = modelfile.loads(FORK + f"\n[check]\n{key} = {value}\n")
    assert getattr(joint.check, field) == expected


def test_the_defaults_of_the_new_check_keys() -> None:
    check = modelfile.loads(FORK).check
    assert check.loads is None  # the level the check's method takes
    assert check.pin_interaction == "max-max"
    assert check.allow_unloaded is False


@pytest.mark.parametrize(("key", "value"), [("loads", '"ultimate"'), ("pin_interaction", '"max"')])
def test_the_new_check_keys_refuse_other_words(key, value) -> None:
    with pytest.raises(modelfile.ModelError, match=f"check.{key}: must be one of"):
        modelfile.loads(FORK + f"\n[check]\n{key} = {value}\n")
