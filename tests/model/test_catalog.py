"""Catalogue data against the published tables and the thread-standard formulas.

References: ISO 898-1:2013 (property classes, stress areas), ISO 261:1998
(coarse pitches), ASME B1.1-2019 (UNC threads), ASME B18.2.6-2019 / AISC
Manual Table 7-15 (thread lengths), ISO 4014 (thread lengths), ASTM F3125,
A307, F3043, F3111 (bolt strengths), EN 1993-1-1:2005 Table 3.1 (plate
steels), AISC 360-22 Tables J3.3 / J3.3M and EN 1090-2:2018 Table 11 (holes).
Values marked ``from memory`` are to be checked against the printed standard.
"""

import csv
import math
from fractions import Fraction
from importlib import resources

import pytest

from plyshear import units
from plyshear.model import catalog

# Tabulated stress areas are rounded to 3 (ISO) or 4 (ASME) significant
# digits: half a unit in the last digit of the smallest entry is < 5e-3.
REL_TABLE_ROUNDING = 5e-3
# Unit conversions and exact arithmetic: round-off only.
REL_EXACT = 1e-12

KSI = 6.894757293168361  # MPa per ksi (1 lbf/in², exact definition of the pound-force)
IN = 25.4  # mm per inch (exact)


def _csv_rows(name):
    text = resources.files("plyshear.model").joinpath("data", name).read_text(encoding="utf-8")
    return list(csv.DictReader(text.splitlines()))


# --------------------------------------------------------------------------- data files


@pytest.mark.parametrize("name", catalog.DATA_FILES)
def test_every_csv_row_names_its_source(name):
    rows = _csv_rows(name)
    assert rows, name
    for row in rows:
        assert row["source"].strip(), (name, row)


def test_ksi_conversion_is_exact_definition():
    assert units.MPA_PER_KSI == pytest.approx(KSI, rel=REL_EXACT)


# --------------------------------------------------------------------------- fastener grades


@pytest.mark.parametrize(
    ("key", "fyb", "fub"),
    [
        ("4.6", 240.0, 400.0),  # ISO 898-1:2013 Table 3
        ("5.6", 300.0, 500.0),  # ISO 898-1:2013 Table 3
        ("8.8", 640.0, 800.0),  # ISO 898-1:2013 Table 3
        ("10.9", 900.0, 1000.0),  # ISO 898-1:2013 Table 3
        ("12.9", 1080.0, 1200.0),  # ISO 898-1:2013 Table 3
    ],
)
def test_iso_898_1_table_3_property_classes(key, fyb, fub):
    grade = catalog.fastener(key)
    assert grade.system == "iso"
    assert grade.fyb == pytest.approx(fyb, rel=REL_EXACT)
    assert grade.fub == pytest.approx(fub, rel=REL_EXACT)
    assert grade.aisc_group is None
    assert grade.E == pytest.approx(210000.0, rel=REL_EXACT)  # EN 1993-1-1:2005 3.2.6


@pytest.mark.parametrize(
    ("key", "fyb_ksi", "fub_ksi", "group", "group_2022"),
    [
        ("A307", 36.0, 60.0, None, None),  # from memory: ASTM A307 Gr A (yield assumed)
        ("A325", 92.0, 120.0, "A", "120"),  # from memory: ASTM F3125 Table 3; AISC 360-22 J3.1
        ("F1852", 92.0, 120.0, "A", "120"),  # from memory: ASTM F3125 Table 3
        ("A490", 130.0, 150.0, "B", "150"),  # from memory: ASTM F3125 Table 3
        ("F2280", 130.0, 150.0, "B", "150"),  # from memory: ASTM F3125 Table 3
        ("F3043", 180.0, 200.0, "C", "200"),  # from memory: ASTM F3043 Grade 1
        ("F3111", 180.0, 200.0, "C", "200"),  # from memory: ASTM F3111 Grade 1
        ("F3125-A325", 92.0, 120.0, "A", "120"),  # from memory: ASTM F3125 Table 3
        ("F3125-A490", 130.0, 150.0, "B", "150"),  # from memory: ASTM F3125 Table 3
    ],
)
def test_astm_f3125_and_related_bolt_strengths(key, fyb_ksi, fub_ksi, group, group_2022):
    grade = catalog.fastener(key)
    assert grade.system == "astm"
    assert grade.fyb == pytest.approx(fyb_ksi * KSI, rel=REL_EXACT)
    assert grade.fub == pytest.approx(fub_ksi * KSI, rel=REL_EXACT)
    assert grade.aisc_group == group
    assert grade.aisc_group_2022 == group_2022
    # AISC 360-22 Symbols: E = 29 000 ksi (200 000 MPa)
    assert grade.E == pytest.approx(200000.0, rel=REL_EXACT)


def test_model_file_grade_keys_are_all_known():
    # MODELFILE.md: these names never change
    required = ["4.6", "5.6", "8.8", "10.9", "12.9", "A307", "A325", "A490", "F1852", "F2280"]
    required += ["F3043", "F3111"]
    assert set(required) <= set(catalog.fastener_keys())


def test_unknown_grade_raises_catalog_error_listing_known_keys():
    with pytest.raises(catalog.CatalogError) as info:
        catalog.fastener("8.9")
    message = str(info.value)
    assert message.startswith("unknown grade '8.9'; known: 4.6, 5.6, 8.8")
    assert "A325" in message
    assert isinstance(info.value, KeyError)


# --------------------------------------------------------------------------- plate steels


@pytest.mark.parametrize(
    ("key", "t", "fy", "fu"),
    [
        ("S235", 10.0, 235.0, 360.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-2
        ("S235", 40.0, 235.0, 360.0),  # from memory: EN 1993-1-1:2005 Table 3.1 (t <= 40)
        ("S235", 40.5, 215.0, 360.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S275", 20.0, 275.0, 430.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S275", 80.0, 255.0, 410.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S355", 12.0, 355.0, 510.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-2
        ("S355", 40.0, 355.0, 510.0),  # from memory: EN 1993-1-1:2005 Table 3.1 (t <= 40)
        ("S355", 40.5, 335.0, 470.0),  # from memory: EN 1993-1-1:2005 Table 3.1 (40 < t <= 80)
        ("S355", 80.0, 335.0, 470.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S450", 30.0, 440.0, 550.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-2
        ("S450", 50.0, 410.0, 550.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-2
        ("S460", 30.0, 460.0, 540.0),  # from memory: Table 3.1, S460N and S460M both 460/540
        ("S460", 50.0, 430.0, 530.0),  # from memory: Table 3.1, the lower: S460M/ML 430/530
        ("S275N", 20.0, 275.0, 390.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S275N", 60.0, 255.0, 370.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S355N", 20.0, 355.0, 490.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S355N", 60.0, 335.0, 470.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S420N", 20.0, 420.0, 520.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S420N", 60.0, 390.0, 520.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S460N", 20.0, 460.0, 540.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S460N", 60.0, 430.0, 540.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-3
        ("S275M", 20.0, 275.0, 370.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S275M", 60.0, 255.0, 360.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S355M", 20.0, 355.0, 470.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S355M", 60.0, 335.0, 450.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S420M", 20.0, 420.0, 520.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S420M", 60.0, 390.0, 500.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S460M", 20.0, 460.0, 540.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
        ("S460M", 60.0, 430.0, 530.0),  # from memory: EN 1993-1-1:2005 Table 3.1, EN 10025-4
    ],
)
def test_en_1993_1_1_table_3_1_thickness_bands(key, t, fy, fu):
    s = catalog.steel(key)
    assert s.strength(t) == (pytest.approx(fy, rel=REL_EXACT), pytest.approx(fu, rel=REL_EXACT))
    assert s.E == pytest.approx(210000.0, rel=REL_EXACT)  # EN 1993-1-1:2005 3.2.6


@pytest.mark.parametrize("key", ["S235", "S275", "S355", "S450", "S460", "S355N", "S460M"])
def test_en_1993_1_1_table_3_1_beyond_80_mm_raises(key):
    with pytest.raises(ValueError, match="0 < t <= 80 mm"):
        catalog.steel(key).strength(80.5)


def test_out_of_range_message_names_the_standard_and_range_not_the_provenance():
    with pytest.raises(ValueError, match="outside the tabulated range") as info:
        catalog.steel("S355").strength(90.0)
    # EN 1993-1-1:2005 Table 3.1 tabulates t <= 80 mm
    assert str(info.value) == (
        "steel S355: thickness 90 mm is outside the tabulated range "
        "0 < t <= 80 mm (EN 1993-1-1:2005 Table 3.1, EN 10025-2)"
    )
    assert "memory" not in str(info.value)


@pytest.mark.parametrize("t", [0.0, -5.0])
def test_steel_thickness_must_be_positive(t):
    with pytest.raises(ValueError, match="> 0"):
        catalog.steel("S355").strength(t)


@pytest.mark.parametrize(
    ("key", "fy_ksi", "fu_ksi", "fy_si", "fu_si"),
    [
        ("A36", 36.0, 58.0, 250.0, 400.0),  # from memory: ASTM A36/A36M (36/58 ksi; 250/400 MPa)
        ("A572-50", 50.0, 65.0, 345.0, 450.0),  # from memory: ASTM A572/A572M Gr 50 [345]
        ("A992", 50.0, 65.0, 345.0, 450.0),  # from memory: ASTM A992/A992M (50/65 ksi)
    ],
)
def test_astm_plate_steels_in_ksi(key, fy_ksi, fu_ksi, fy_si, fu_si):
    s = catalog.steel(key)
    # stored in the standards' US customary values, so a kip-in model sees them exactly
    assert s.strength(25.0) == (
        pytest.approx(fy_ksi * KSI, rel=REL_EXACT),
        pytest.approx(fu_ksi * KSI, rel=REL_EXACT),
    )
    assert s.E == pytest.approx(200000.0, rel=REL_EXACT)  # AISC 360-22
    # the printed SI values are the ksi values rounded to the nearest 5 MPa
    assert s.strength(25.0)[0] == pytest.approx(fy_si, abs=5.0)
    assert s.strength(25.0)[1] == pytest.approx(fu_si, abs=5.0)


def test_unknown_steel_raises_catalog_error_listing_known_keys():
    with pytest.raises(catalog.CatalogError) as info:
        catalog.steel("S999")
    known = [
        "S235",
        "S275",
        "S355",
        "S450",
        "S460",
        "S275N",
        "S355N",
        "S420N",
        "S460N",
        "S275M",
        "S355M",
        "S420M",
        "S460M",
        "A36",
        "A572-50",
        "A992",
    ]
    assert str(info.value) == (
        f"unknown steel 'S999'; known: {', '.join(known)} "
        "(with a quality suffix such as S355J2 or S355NL too)"
    )
    assert catalog.steel_keys() == known


# --------------------------------------------------------------------------- threads


@pytest.mark.parametrize(
    ("d", "pitch", "area"),
    [
        (12.0, 1.75, 84.3),  # ISO 898-1:2013 Table 4; pitch from memory: ISO 261
        (16.0, 2.0, 157.0),  # ISO 898-1:2013 Table 4
        (20.0, 2.5, 245.0),  # ISO 898-1:2013 Table 4
        (22.0, 2.5, 303.0),  # ISO 898-1:2013 Table 4
        (24.0, 3.0, 353.0),  # ISO 898-1:2013 Table 4
        (27.0, 3.0, 459.0),  # ISO 898-1:2013 Table 4
        (30.0, 3.5, 561.0),  # ISO 898-1:2013 Table 4
        (36.0, 4.0, 817.0),  # ISO 898-1:2013 Table 4
        (64.0, 6.0, 2680.0),  # from memory: As nom by the ISO 898-1 formula
    ],
)
def test_iso_898_1_table_4_stress_areas(d, pitch, area):
    assert catalog.thread_pitch(d) == pytest.approx(pitch, rel=REL_EXACT)
    assert catalog.stress_area(d) == pytest.approx(area, rel=REL_EXACT)
    assert not catalog.is_inch_size(d)


def test_iso_898_1_table_stress_areas_match_formula():
    for row in _csv_rows("threads.csv"):
        if row["system"] != "iso":
            continue
        d, p = float(row["d_mm"]), float(row["pitch_mm"])
        # ISO 898-1:2013 9.1.6.1: As = pi/4 (d - 0.9382 P)^2, rounded in the table
        ref = math.pi / 4.0 * (d - 0.9382 * p) ** 2
        assert float(row["stress_area_mm2"]) == pytest.approx(ref, rel=REL_TABLE_ROUNDING), row
        assert catalog.stress_area_formula(d, p, "iso") == pytest.approx(ref, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("d_in", "tpi", "area_in2"),
    [
        (0.5, 13, 0.1419),  # from memory: ASME B1.1 (AISC Manual prints 0.142)
        (0.625, 11, 0.226),  # from memory: ASME B1.1
        (0.75, 10, 0.334),  # ASME B1.1 (docs/references.md: read)
        (0.875, 9, 0.462),  # ASME B1.1 (docs/references.md: read)
        (1.0, 8, 0.606),  # ASME B1.1 (docs/references.md: read)
        (1.125, 7, 0.763),  # from memory: ASME B1.1
        (1.25, 7, 0.969),  # from memory: ASME B1.1
        (1.375, 6, 1.155),  # from memory: ASME B1.1
        (1.5, 6, 1.405),  # from memory: ASME B1.1
    ],
)
def test_asme_b1_1_unc_stress_areas(d_in, tpi, area_in2):
    d = d_in * IN
    assert catalog.is_inch_size(d)
    assert catalog.thread_pitch(d) == pytest.approx(IN / tpi, rel=REL_EXACT)
    assert catalog.stress_area(d) == pytest.approx(area_in2 * IN**2, rel=REL_EXACT)


def test_asme_b1_1_table_stress_areas_match_formula():
    for row in _csv_rows("threads.csv"):
        if row["system"] != "unc":
            continue
        d_in, n = float(row["d_mm"]) / IN, float(row["tpi"])
        ref_in2 = 0.7854 * (d_in - 0.9743 / n) ** 2  # ASME B1.1 tensile stress area
        assert float(row["stress_area_in2"]) == pytest.approx(ref_in2, rel=REL_TABLE_ROUNDING)
        got = catalog.stress_area_formula(d_in * IN, IN / n, "unc")
        assert got == pytest.approx(ref_in2 * IN**2, rel=REL_EXACT)


def test_inch_sizes_are_exact_conversions_of_their_labels():
    for row in _csv_rows("threads.csv"):
        if row["system"] == "unc":
            d_in = sum(Fraction(part) for part in row["label"].split("-"))
            assert Fraction(row["d_mm"]) == d_in * Fraction("25.4")


@pytest.mark.parametrize("d", [19.0, 19.1, 20.04, 19.96])
def test_sizes_match_within_005_mm(d):
    assert catalog.thread_pitch(d) is not None


@pytest.mark.parametrize("d", [23.0, 19.2, 100.0])
def test_untabulated_sizes_return_none(d):
    assert catalog.thread_pitch(d) is None
    assert catalog.stress_area(d) is None
    assert not catalog.is_inch_size(d)


def test_stress_area_formula_rejects_unknown_system():
    with pytest.raises(ValueError, match="unknown thread system"):
        catalog.stress_area_formula(20.0, 2.5, "whitworth")


# --------------------------------------------------------------------------- thread lengths


@pytest.mark.parametrize(
    ("d_in", "b_in"),
    [
        (0.5, 1.00),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (0.625, 1.25),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (0.75, 1.38),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (0.875, 1.50),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (1.0, 1.75),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (1.125, 2.00),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (1.25, 2.00),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (1.375, 2.25),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
        (1.5, 2.25),  # from memory: ASME B18.2.6 / AISC Manual Table 7-15
    ],
)
def test_asme_b18_2_6_heavy_hex_thread_lengths(d_in, b_in):
    assert catalog.thread_length(d_in * IN, "A325", None) == pytest.approx(b_in * IN, rel=REL_EXACT)
    assert catalog.thread_length(d_in * IN, "A490", 500.0) == pytest.approx(
        b_in * IN, rel=REL_EXACT
    )


@pytest.mark.parametrize(
    ("d", "length", "b"),
    [
        (20.0, None, 46.0),  # from memory: ISO 4014, b = 2d + 6 for l <= 125
        (20.0, 125.0, 46.0),  # from memory: ISO 4014, 2d + 6
        (20.0, 150.0, 52.0),  # from memory: ISO 4014, 2d + 12 for 125 < l <= 200
        (24.0, 200.0, 60.0),  # from memory: ISO 4014, 2d + 12
        (24.0, 220.0, 73.0),  # from memory: ISO 4014, 2d + 25 for l > 200
        (16.0, 30.0, 30.0),  # capped at the bolt length
    ],
)
def test_iso_4014_thread_lengths(d, length, b):
    assert catalog.thread_length(d, "8.8", length) == pytest.approx(b, rel=REL_EXACT)


@pytest.mark.parametrize(("d", "grade"), [(23.0, "8.8"), (20.0, "A325"), (19.05, "10.9")])
def test_thread_length_unknown_size_raises_catalog_error(d, grade):
    with pytest.raises(catalog.CatalogError, match="known sizes"):
        catalog.thread_length(d, grade, None)


def test_thread_length_unknown_grade_raises_catalog_error():
    with pytest.raises(catalog.CatalogError, match="unknown grade"):
        catalog.thread_length(20.0, "9.9", None)


# --------------------------------------------------------------------------- holes


@pytest.mark.parametrize(
    ("d", "hole", "width", "length"),
    [
        (16.0, "standard", 18.0, None),  # AISC 360-16 Table J3.3M (2022 unchanged: from memory)
        (20.0, "standard", 22.0, None),  # AISC 360-16 Table J3.3M
        (24.0, "standard", 27.0, None),  # AISC 360-16 Table J3.3M
        (20.0, "oversized", 24.0, None),  # AISC 360-16 Table J3.3M
        (22.0, "oversized", 28.0, None),  # AISC 360-16 Table J3.3M
        (30.0, "oversized", 38.0, None),  # AISC 360-16 Table J3.3M
        (20.0, "short-slot", 22.0, 26.0),  # AISC 360-16 Table J3.3M
        (24.0, "short-slot", 27.0, 32.0),  # AISC 360-16 Table J3.3M
        (20.0, "long-slot", 22.0, 50.0),  # AISC 360-16 Table J3.3M
        (27.0, "long-slot", 30.0, 67.0),  # AISC 360-16 Table J3.3M (printed 67, not 2.5d)
        (36.0, "standard", 39.0, None),  # AISC 360-16 Table J3.3M, d + 3 for >= M36
        (42.0, "oversized", 50.0, None),  # AISC 360-16 Table J3.3M, d + 8
        (36.0, "short-slot", 39.0, 46.0),  # AISC 360-16 Table J3.3M, (d + 3) x (d + 10)
        (48.0, "long-slot", 51.0, 120.0),  # AISC 360-16 Table J3.3M, (d + 3) x 2.5d
    ],
)
def test_aisc_360_table_j3_3m_metric_holes(d, hole, width, length):
    assert catalog.hole_diameter(d, hole, "aisc360-22") == pytest.approx(width, rel=REL_EXACT)
    got = catalog.hole_slot_length(d, hole, "aisc360-22")
    if length is None:
        assert got is None
    else:
        assert got == pytest.approx(length, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("d_in", "hole", "width_in", "length_in"),
    [
        (0.75, "standard", 13 / 16, None),  # AISC 360-22 Table J3.3
        (0.5, "standard", 9 / 16, None),  # AISC 360-22 Table J3.3
        (0.875, "standard", 15 / 16, None),  # AISC 360-22 Table J3.3
        (1.0, "standard", 1 + 1 / 16, None),  # AISC 360-22 Table J3.3 (360-16: 1-1/8)
        (1.25, "standard", 1 + 5 / 16, None),  # AISC 360-22 Table J3.3, d + 1/16
        (0.625, "oversized", 13 / 16, None),  # AISC 360-22 Table J3.3
        (0.75, "oversized", 15 / 16, None),  # AISC 360-22 Table J3.3
        (0.875, "oversized", 1 + 1 / 16, None),  # AISC 360-22 Table J3.3
        (1.0, "oversized", 1.25, None),  # AISC 360-22 Table J3.3
        (1.125, "oversized", 1 + 7 / 16, None),  # AISC 360-22 Table J3.3, d + 5/16
        (0.5, "short-slot", 9 / 16, 11 / 16),  # AISC 360-22 Table J3.3
        (0.75, "short-slot", 13 / 16, 1.0),  # AISC 360-22 Table J3.3
        (1.0, "short-slot", 1 + 1 / 16, 1 + 5 / 16),  # AISC 360-22 Table J3.3
        (1.5, "short-slot", 1 + 9 / 16, 1 + 7 / 8),  # AISC 360-22 Table J3.3, d + 3/8
        (0.75, "long-slot", 13 / 16, 1 + 7 / 8),  # AISC 360-22 Table J3.3
        (0.875, "long-slot", 15 / 16, 2 + 3 / 16),  # AISC 360-22 Table J3.3
        (1.5, "long-slot", 1 + 9 / 16, 3.75),  # AISC 360-22 Table J3.3, 2.5d
    ],
)
def test_aisc_360_22_table_j3_3_inch_holes(d_in, hole, width_in, length_in):
    d = d_in * IN
    assert catalog.hole_diameter(d, hole, "aisc360-22") == pytest.approx(
        width_in * IN, rel=REL_EXACT
    )
    got = catalog.hole_slot_length(d, hole, "aisc360-22")
    if length_in is None:
        assert got is None
    else:
        assert got == pytest.approx(length_in * IN, rel=REL_EXACT)


@pytest.mark.parametrize(
    ("d", "hole", "width", "length"),
    [
        (12.0, "standard", 13.0, None),  # EN 1090-2:2018 Table 11: 1 mm
        (10.0, "standard", 11.0, None),  # EN 1090-2:2018 Table 11 note a (also below M12)
        (20.0, "standard", 22.0, None),  # EN 1090-2:2018 Table 11: 2 mm
        (24.0, "standard", 26.0, None),  # EN 1090-2:2018 Table 11: 2 mm
        (30.0, "standard", 33.0, None),  # EN 1090-2:2018 Table 11: 3 mm
        (48.0, "standard", 51.0, None),  # EN 1090-2:2018 Table 11 note b (also above M36)
        (12.0, "oversized", 15.0, None),  # EN 1090-2:2018 Table 11: 3 mm
        (20.0, "oversized", 24.0, None),  # EN 1090-2:2018 Table 11: 4 mm
        (24.0, "oversized", 30.0, None),  # EN 1090-2:2018 Table 11: 6 mm
        (36.0, "oversized", 44.0, None),  # EN 1090-2:2018 Table 11: 8 mm
        (14.0, "short-slot", 15.0, 18.0),  # EN 1090-2:2018 Table 11: length +4
        (20.0, "short-slot", 22.0, 26.0),  # EN 1090-2:2018 Table 11: length +6
        (24.0, "short-slot", 26.0, 32.0),  # EN 1090-2:2018 Table 11: length +8
        (30.0, "short-slot", 33.0, 40.0),  # EN 1090-2:2018 Table 11: length +10
        (20.0, "long-slot", 22.0, 50.0),  # EN 1090-2:2018 Table 11: length +1.5d
    ],
)
def test_en_1090_2_table_11_clearances(d, hole, width, length):
    assert catalog.hole_diameter(d, hole, "en1993-1-8") == pytest.approx(width, rel=REL_EXACT)
    got = catalog.hole_slot_length(d, hole, "en1993-1-8")
    if length is None:
        assert got is None
    else:
        assert got == pytest.approx(length, rel=REL_EXACT)


def test_hole_unknown_type_or_standard_raises_value_error():
    with pytest.raises(ValueError, match="unknown hole type 'round'"):
        catalog.hole_diameter(20.0, "round", "en1993-1-8")
    with pytest.raises(ValueError, match="unknown standard 'bs5950'"):
        catalog.hole_slot_length(20.0, "standard", "bs5950")


@pytest.mark.parametrize(
    ("d", "standard"),
    [(33.0, "aisc360-22"), (12.0, "aisc360-22"), (0.25 * IN, "aisc360-22"), (19.05, "en1993-1-8")],
)
def test_hole_untabulated_size_raises_catalog_error(d, standard):
    with pytest.raises(catalog.CatalogError, match="known sizes"):
        catalog.hole_diameter(d, "standard", standard)


def test_model_package_init_is_empty():
    text = resources.files("plyshear.model").joinpath("__init__.py").read_text(encoding="utf-8")
    assert text == ""


@pytest.mark.parametrize(
    ("key", "t", "fy", "fu"),
    [
        ("S355J2", 12.0, 355.0, 510.0),  # from memory: EN 10025-2 qualities share Table 3.1's row
        ("S355J2+N", 50.0, 335.0, 470.0),  # from memory: EN 1993-1-1:2005 Table 3.1 (40 < t)
        ("S275JR", 20.0, 275.0, 430.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S355K2", 20.0, 355.0, 510.0),  # from memory: EN 1993-1-1:2005 Table 3.1
        ("S355NL", 20.0, 355.0, 490.0),  # from memory: EN 10025-3, NL as N
        ("S460ML", 60.0, 430.0, 530.0),  # from memory: EN 10025-4, ML as M
    ],
)
def test_quality_designations_take_their_grades_strengths(key, t, fy, fu):
    s = catalog.steel(key)
    assert s.strength(t) == (pytest.approx(fy, rel=REL_EXACT), pytest.approx(fu, rel=REL_EXACT))


@pytest.mark.parametrize("key", ["S355X", "S355J3", "S355NM", "S999J2"])
def test_a_designation_of_no_known_grade_is_refused(key):
    with pytest.raises(catalog.CatalogError, match="unknown steel"):
        catalog.steel(key)
