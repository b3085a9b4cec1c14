"""Physical sanity warnings (plyshear.model.sanity): each fires when it should, and only then.

Each warning is triggered by an edit of the test fork (tests/conftest.py) and
named by its ply or key; none fires for the shipped examples in
plyshear/models, whose geometry is ordinary practice (checked below).
"""

from __future__ import annotations

import pytest

from plyshear.model import modelfile, sanity
from tests.conftest import FORK, MODELS


def _joint(text: str):
    return modelfile.loads(text)


def _edit(old: str, new: str, text: str = FORK) -> str:
    assert old in text
    return text.replace(old, new, 1)


def _only(text: str, fragment: str) -> str:
    found = sanity.warnings(_joint(text))
    assert len(found) == 1, found
    assert fragment in found[0], found
    return found[0]


def test_the_fork_has_no_warnings() -> None:
    assert sanity.warnings(_joint(FORK)) == []


@pytest.mark.parametrize("model", sorted(p.name for p in MODELS.glob("*.toml")))
def test_no_example_has_a_warning(model: str) -> None:
    assert sanity.warnings(modelfile.load(MODELS / model)) == []


def test_grip_longer_than_the_bolt() -> None:
    # the model file refuses it (tests/model); a joint built in Python still warns.
    # The plies add up to 40 mm; the bolt is 30 mm under the head.
    joint = _joint(FORK).with_bolt(length=30.0, thread_length=10.0)
    found = [w for w in sanity.warnings(joint) if w.startswith("bolt.length")]
    assert len(found) == 1, found
    assert "40 mm" in found[0]
    assert "30 mm" in found[0]


# Nut heights, from memory: ISO 4032 style 1 m max M24 = 21.5 mm; ASME B18.2.2 heavy hex
# 3/4 in: H = 47/64 in. Pitches: ISO 261 coarse M24 = 3 mm; UNC 3/4-10: 0.1 in.
NUT_M24, PITCH_M24 = 21.5, 3.0
NUT_3_4_IN, PITCH_3_4_IN = 47 / 64, 1 / 10


def test_a_protrusion_short_of_a_nut_and_two_pitches_warns() -> None:
    length = 40 + NUT_M24 + 2 * PITCH_M24 - 0.5  # grip 40 mm
    text = _edit('grade = "8.8"', f'grade = "8.8"\nlength = {length}\nthread_length = 10')
    line = _only(text, "bolt.length")
    assert f"protrudes {NUT_M24 + 2 * PITCH_M24 - 0.5:g} mm past the grip" in line
    assert f"a nut ({NUT_M24:g} mm) plus 2 thread pitches ({PITCH_M24:g} mm each)" in line
    # exactly a nut and two pitches is enough
    enough = text.replace(f"length = {length}", f"length = {length + 0.5}")
    assert sanity.warnings(_joint(enough)) == []
    # and a pin has no nut to protrude past
    pin = text.replace("thread_length = 10", 'threads = "excluded"')
    # (its plies, without edge and width, draw the pin-plate warning instead)
    pin_warnings = sanity.warnings(_joint(pin + '\n[check]\nconnector = "pin"\n'))
    assert [w for w in pin_warnings if "pin plate" not in w] == []


def test_thread_in_a_ply_thinner_than_the_pitch() -> None:
    # M24: pitch 3 mm. A 2 mm ply in the threaded length (threads from z = 20 mm).
    text = _edit('grade = "8.8"', 'grade = "8.8"\nlength = 60\nthread_length = 40')
    text = _edit(
        'name = "leg-2"\nmember = "fork"\nthickness = 10',
        'name = "leg-2"\nmember = "fork"\nthickness = 2',
        text,
    )
    found = sanity.warnings(_joint(text))
    assert any("ply[3] 'leg-2'.thickness" in w and "thread pitch 3 mm" in w for w in found)


def test_a_thin_ply_on_the_shank_is_no_thread_warning() -> None:
    # same 2 mm ply, but the thread starts past the stack
    text = _edit('grade = "8.8"', 'grade = "8.8"\nlength = 90\nthread_length = 40')
    text = _edit(
        'name = "leg-2"\nmember = "fork"\nthickness = 10',
        'name = "leg-2"\nmember = "fork"\nthickness = 2',
        text,
    )
    assert not any("pitch" in w for w in sanity.warnings(_joint(text)))


def test_threads_everywhere_when_the_geometry_is_unknown() -> None:
    # no length: threads are assumed in every plane (the conservative reading)
    text = _edit("thickness = 20", "thickness = 2.5")
    found = sanity.warnings(_joint(text))
    assert any("ply[2] 'lug'" in w and "pitch" in w for w in found)


def test_a_shim_thinner_than_a_quarter_of_the_diameter() -> None:
    # 0.25 d = 6 mm for M24; 5 mm warns, and it is no thinner than the 3 mm pitch
    text = _edit("thickness = 20", "thickness = 5")
    line = _only(text, "ply[2] 'lug'.thickness")
    assert "0.25 d = 6 mm" in line
    assert "common practice" in line
    assert sanity.warnings(_joint(_edit("thickness = 20", "thickness = 6"))) == []


def test_edge_below_en_1993_1_8_table_3_3() -> None:
    # M24 in a normal hole: d0 = 26 mm, e1,min = 1.2 d0 = 31.2 mm
    text = FORK + '\n[check]\nstandard = "en1993-1-8"\n'
    low = _edit('name = "lug"', 'name = "lug"\nedge = 31', text)
    line = _only(low, "ply[2] 'lug'.edge")
    assert "31.2 mm" in line
    assert "Table 3.3" in line
    ok = _edit('name = "lug"', 'name = "lug"\nedge = 31.2', text)
    assert sanity.warnings(_joint(ok)) == []


def test_edge_below_aisc_360_22_table_j3_4_metric() -> None:
    # M24: 30 mm minimum edge distance (Table J3.4M)
    low = _edit('name = "lug"', 'name = "lug"\nedge = 29')
    line = _only(low, "ply[2] 'lug'.edge")
    assert "30 mm" in line
    assert "J3.4" in line
    assert sanity.warnings(_joint(_edit('name = "lug"', 'name = "lug"\nedge = 30'))) == []


def test_edge_below_aisc_360_22_table_j3_4_inch() -> None:
    # 3/4 in bolt: 1 in minimum; in the splice example
    text = (MODELS / "splice-with-filler.toml").read_text(encoding="utf-8")
    low = _edit("edge = 1.5", "edge = 0.99", text)
    line = _only(low, "ply[1] 'cover-top'.edge")
    assert "1 in" in line


def test_edge_of_a_large_aisc_bolt_is_1_25_d() -> None:
    # beyond M36: 1.25 d (M42: 52.5 mm)
    text = _edit("diameter = 24", "diameter = 42")
    text = _edit('name = "lug"', 'name = "lug"\nedge = 52', text)
    found = [w for w in sanity.warnings(_joint(text)) if ".edge" in w]
    assert len(found) == 1
    assert found[0].startswith("ply[2] 'lug'.edge")
    assert "52.5 mm" in found[0]


def test_pin_plates_are_left_to_the_check() -> None:
    text = FORK + '\n[check]\nstandard = "en1993-1-8"\nconnector = "pin"\n'
    text = _edit('name = "lug"', 'name = "lug"\nedge = 20\nwidth = 80', text)
    # no edge-distance warning for the 20 mm edge: Table 3.9 is the check's; only the
    # legs, without edge and width, draw the pin-plate warning
    found = sanity.warnings(_joint(text))
    assert [w.split(":")[0] for w in found] == ["ply[1] 'leg-1'.edge", "ply[3] 'leg-2'.edge"]
    assert all("pin plate without edge and width" in w for w in found)


def test_very_long_grip() -> None:
    # grip 40 + 460 = 500 mm on M24: grip/d = 20.8
    text = _edit("thickness = 20", "thickness = 20\ngap = 460")
    line = _only(text, "bolt.diameter")
    assert "grip/d = 20.8" in line


def test_a_ply_a_thousand_times_thinner_than_its_neighbour() -> None:
    text = FORK.replace("thickness = 10", "thickness = 500").replace(
        "thickness = 20", "thickness = 0.5"
    )
    text = text.replace('steel = "S355"', "fy = 355\nfu = 490")
    found = [w for w in sanity.warnings(_joint(text)) if "thickness" in w and "fold" in w]
    assert len(found) == 2  # leg-1/lug and lug/leg-2
    assert all(w.startswith("ply[2].thickness") for w in found)


def test_a_ply_a_thousand_times_stiffer_than_its_neighbour() -> None:
    text = _edit('name = "lug"', 'name = "lug"\nfoundation_modulus = 1e6')
    text = _edit('name = "leg-2"', 'name = "leg-2"\nfoundation_modulus = 1e3', text)
    line = _only(text, "foundation_modulus")
    assert line.startswith("ply[3].foundation_modulus")
    assert "1e+03-fold" in line
    mild = _edit("foundation_modulus = 1e3", "foundation_modulus = 1.01e3", text)
    assert sanity.warnings(_joint(mild)) == []


def test_messages_are_in_the_models_units() -> None:
    # grip 0.5 + 0.625 + 0.375 + 0.5 = 2 in; a 2.5 in bolt protrudes 0.5 in
    text = (MODELS / "splice-with-filler.toml").read_text(encoding="utf-8")
    text = _edit('grade = "A325"\nlength = 3.25', 'grade = "A325"\nlength = 2.5', text)
    line = _only(text, "bolt.length")
    assert "protrudes 0.5 in" in line
    need = NUT_3_4_IN + 2 * PITCH_3_4_IN
    assert f"= {need:.4g} in" in line
    assert f"at least {2 + need:.4g} in long" in line


@pytest.mark.parametrize(
    ("diameter", "units", "shown"),
    [
        ("1.5", "kN-mm", '1.5 mm as read with units = "kN-mm"'),
        ("250", "kN-mm", '250 mm as read with units = "kN-mm"'),
    ],
)
def test_a_diameter_outside_bolt_sizes_names_the_units(diameter, units, shown) -> None:
    # common practice: bolts and pins run from about 3 mm to 200 mm
    text = _edit("diameter = 24", f'diameter = {diameter}\nthreads = "excluded"')
    found = [w for w in sanity.warnings(_joint(text)) if w.startswith("bolt.diameter")]
    assert any(shown in w and "outside 3 to 200 mm" in w for w in found), found


def test_a_kip_in_diameter_read_as_inches_names_the_mm() -> None:
    # 24 typed as a metric diameter in a kip-in file: 24 in = 609.6 mm (1 in = 25.4 mm)
    text = (MODELS / "splice-with-filler.toml").read_text(encoding="utf-8")
    text = _edit('diameter = "3/4 in"', "diameter = 24", text)
    text = _edit('threads = "auto"', 'threads = "excluded"', text)
    text = _edit("length = 3.25", "length = 30", text)
    found = [w for w in sanity.warnings(_joint(text)) if w.startswith("bolt.diameter")]
    assert len(found) == 1, found
    assert f'24 in as read with units = "kip-in" = {24 * 25.4:.4g} mm' in found[0]


@pytest.mark.parametrize("t", ["0.4", "600"])
def test_a_ply_outside_plate_sizes_names_the_units(t) -> None:
    # common practice: plates run from about 0.5 mm to 500 mm
    text = _edit('thickness = 20\nsteel = "S355"', f"thickness = {t}\nfy = 355\nfu = 510")
    found = [w for w in sanity.warnings(_joint(text)) if "outside 0.5 to 500 mm" in w]
    assert len(found) == 1, sanity.warnings(_joint(text))
    assert found[0].startswith(f"ply[2] 'lug'.thickness: {t} mm as read with units = \"kN-mm\"")


@pytest.mark.parametrize(("t", "warned"), [("5.99", True), ("6.01", False)])
def test_a_ply_thinner_than_a_quarter_of_the_bolt_is_a_shim(t, warned) -> None:
    # common practice, no source: a ply under d/4 (M24: 6 mm) bears as a shim
    joint = _joint(_edit("thickness = 20", f"thickness = {t}"))
    found = [w for w in sanity.warnings(joint) if "0.25 d" in w]
    assert bool(found) == warned, found
    if warned:
        assert found[0].startswith(
            f"ply[2] 'lug'.thickness: {t} mm is less than 0.25 d = {0.25 * 24:g} mm"
        )
    # and the warnings leave the joint as it was (frozen: the same solve after)
    assert joint.plies[1].thickness == pytest.approx(float(t), rel=1e-15)
