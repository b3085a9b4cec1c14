"""Catalogue data: fastener grades, plate steels, threads, thread lengths and holes.

Every table is a CSV file in ``plyshear/model/data`` with a ``source`` column
naming the published source of the row (``from memory: ...`` where the value
was recalled rather than read). Provenance stays in the catalogue and the docs:
a message a user reads names the standard and the range only (the steels'
``standard`` column). The files are read once, on first use, with
:mod:`importlib.resources`.

Internal units are N, mm and MPa. Inch data are stored in inches (sizes,
thread lengths, hole clearances) or ksi (strengths) with an explicit unit,
and converted here, exactly: 1 in = 25.4 mm and
1 ksi = 4448.2216152605 N / 645.16 mm² = 6.894757293168361 MPa.
"""

from __future__ import annotations

import csv
import math
import re
from dataclasses import dataclass
from fractions import Fraction
from functools import cache, lru_cache
from importlib import resources

from plyshear.model.joint import HOLE_TYPES, STANDARDS
from plyshear.units import MM_PER_IN, MPA_PER_KSI

SIZE_TOL = 0.05
"""Tolerance, mm, when a diameter is matched against a tabulated size (inclusive)."""
_ROUNDOFF = 1e-9  # mm: keeps the tolerance inclusive despite binary round-off

DATA_FILES = (
    "fasteners.csv",
    "steels.csv",
    "threads.csv",
    "thread_lengths_astm.csv",
    "holes.csv",
    "nuts.csv",
)


class CatalogError(KeyError):
    """An unknown catalogue key; the message lists the known keys.

    ``str(err)`` is the plain message (a bare :class:`KeyError` would quote it).
    """

    def __init__(self, message: str) -> None:
        super().__init__(message)
        self.message = message

    def __str__(self) -> str:
        return self.message


@dataclass(frozen=True)
class FastenerGrade:
    """A bolt or pin material (property class or ASTM grade).

    Attributes:
        key: Model-file key ("8.8", "A325", ...).
        system: "iso" (ISO 898-1 property class) or "astm".
        fyb: Yield (or 0.2 % proof) strength, MPa.
        fub: Tensile strength, MPa.
        aisc_group: AISC 360 bolt group "A", "B" or "C"; None for A307 and for
            ISO property classes.
        aisc_group_2022: The strength-named group of AISC 360-22 ("120", "150",
            "200"), or None.
        E: Elastic modulus, MPa.
        source: Published source of the row.
    """

    key: str
    system: str
    fyb: float
    fub: float
    aisc_group: str | None
    aisc_group_2022: str | None
    E: float
    source: str


@dataclass(frozen=True)
class PlateSteel:
    """A plate or section steel with thickness-dependent strengths.

    Attributes:
        key: Model-file key ("S355", "A36", ...).
        E: Elastic modulus, MPa.
        source: Published sources of the thickness bands, "; "-joined (provenance:
            for the catalogue and the docs, never for a user's error line).
        bands: ``(t_max, fy, fu)`` per band in increasing ``t_max``, mm and MPa;
            a band covers ``previous t_max < t <= t_max``.
        standard: The standard and table the bands come from, as an error line
            names it ("EN 1993-1-1:2005 Table 3.1, EN 10025-2").
    """

    key: str
    E: float
    source: str
    bands: tuple[tuple[float, float, float], ...] = ()
    standard: str = ""

    def strength(self, t: float) -> tuple[float, float]:
        """Yield and tensile strength for a thickness.

        Args:
            t: Nominal thickness, mm.

        Returns:
            ``(fy, fu)``, MPa.

        Raises:
            ValueError: If ``t <= 0`` or ``t`` is beyond the last tabulated band.
        """
        if not t > 0:
            raise ValueError(f"steel {self.key}: thickness must be > 0 mm, got {t}")
        for t_max, fy, fu in self.bands:
            if t <= t_max:
                return fy, fu
        t_top = self.bands[-1][0]
        raise ValueError(
            f"steel {self.key}: thickness {t:g} mm is outside the tabulated range "
            f"0 < t <= {t_top:g} mm ({self.standard})"
        )


@dataclass(frozen=True)
class _Thread:
    d: float  # mm
    label: str
    system: str  # "iso" | "unc"
    pitch: float  # mm
    stress_area: float  # mm²
    source: str


@dataclass(frozen=True)
class _HoleRow:
    standard: str
    hole: str
    d_min: float  # mm
    d_max: float  # mm (inf: open-ended rule)
    width_add: float  # mm
    length_add: float | None  # mm
    length_factor: float | None
    inch: bool  # sizes tabulated in inches
    source: str


# --------------------------------------------------------------------------- loading


def _rows(name: str) -> list[dict[str, str]]:
    """Read one package CSV file into a list of dicts (values stripped)."""
    text = resources.files("plyshear.model").joinpath("data", name).read_text(encoding="utf-8")
    reader = csv.DictReader(text.splitlines())
    return [{k.strip(): (v or "").strip() for k, v in row.items()} for row in reader]


def _parse_number(text: str) -> float:
    """Parse ``"inf"``, ``"2.5"``, ``"3/4"`` or a mixed fraction ``"1-1/8"``."""
    if text == "inf":
        return math.inf
    return float(sum(Fraction(part) for part in text.split("-")))


def _to_mpa(value: float, unit: str) -> float:
    if unit == "MPa":
        return value
    if unit == "ksi":
        return value * MPA_PER_KSI
    raise ValueError(f"unknown stress unit {unit!r} in the fastener table")


@cache
def _fasteners() -> dict[str, FastenerGrade]:
    grades = {}
    for row in _rows("fasteners.csv"):
        grades[row["key"]] = FastenerGrade(
            key=row["key"],
            system=row["system"],
            fyb=_to_mpa(float(row["fyb"]), row["unit"]),
            fub=_to_mpa(float(row["fub"]), row["unit"]),
            aisc_group=row["aisc_group"] or None,
            aisc_group_2022=row["aisc_group_2022"] or None,
            E=float(row["E_MPa"]),
            source=row["source"],
        )
    return grades


@cache
def _steels() -> dict[str, PlateSteel]:
    bands: dict[str, list[tuple[float, float, float]]] = {}
    sources: dict[str, list[str]] = {}
    moduli: dict[str, float] = {}
    standards: dict[str, str] = {}
    for row in _rows("steels.csv"):
        key = row["key"]
        unit = row["unit"]
        bands.setdefault(key, []).append(
            (
                _parse_number(row["t_max"]),
                _to_mpa(float(row["fy"]), unit),
                _to_mpa(float(row["fu"]), unit),
            )
        )
        if row["source"] not in sources.setdefault(key, []):
            sources[key].append(row["source"])
        moduli[key] = float(row["E"])
        standards[key] = row["standard"]
    return {
        key: PlateSteel(
            key=key,
            E=moduli[key],
            source="; ".join(sources[key]),
            bands=tuple(sorted(bands[key])),
            standard=standards[key],
        )
        for key in bands
    }


@cache
def _threads() -> tuple[_Thread, ...]:
    threads = []
    for row in _rows("threads.csv"):
        if row["system"] == "iso":
            pitch = float(row["pitch_mm"])
            area = float(row["stress_area_mm2"])
        else:
            pitch = MM_PER_IN / float(row["tpi"])
            area = float(row["stress_area_in2"]) * MM_PER_IN**2
        threads.append(
            _Thread(float(row["d_mm"]), row["label"], row["system"], pitch, area, row["source"])
        )
    return tuple(threads)


@cache
def _astm_thread_lengths() -> tuple[tuple[float, str, float], ...]:
    """``(d mm, label, b mm)`` per size."""
    return tuple(
        (float(r["d_mm"]), r["label"], float(r["thread_length_in"]) * MM_PER_IN)
        for r in _rows("thread_lengths_astm.csv")
    )


@cache
def _nuts() -> tuple[tuple[float, float], ...]:
    """``(d mm, nut height mm)`` per size."""
    rows = []
    for r in _rows("nuts.csv"):
        scale = MM_PER_IN if r["unit"] == "in" else 1.0
        rows.append((_parse_number(r["d"]) * scale, _parse_number(r["height"]) * scale))
    return tuple(rows)


@cache
def _holes() -> tuple[_HoleRow, ...]:
    rows = []
    for r in _rows("holes.csv"):
        scale = MM_PER_IN if r["unit"] == "in" else 1.0
        rows.append(
            _HoleRow(
                standard=r["standard"],
                hole=r["hole"],
                d_min=_parse_number(r["d_min"]) * scale,
                d_max=_parse_number(r["d_max"]) * scale,
                width_add=_parse_number(r["width_add"]) * scale,
                length_add=_parse_number(r["length_add"]) * scale if r["length_add"] else None,
                length_factor=float(r["length_factor"]) if r["length_factor"] else None,
                inch=r["unit"] == "in",
                source=r["source"],
            )
        )
    return tuple(rows)


# --------------------------------------------------------------------------- grades, steels


def fastener(key: str) -> FastenerGrade:
    """Look up a fastener grade.

    Args:
        key: Model-file grade key, e.g. "8.8" or "A325".

    Returns:
        The grade record (strengths in MPa).

    Raises:
        CatalogError: If the key is unknown; the message lists the known keys.
    """
    grades = _fasteners()
    if key not in grades:
        raise CatalogError(f"unknown grade {key!r}; known: {', '.join(grades)}")
    return grades[key]


def fastener_keys() -> list[str]:
    """Known fastener grade keys, in table order.

    Returns:
        A new list of keys.
    """
    return list(_fasteners())


def steel(key: str) -> PlateSteel:
    """Look up a plate steel.

    Args:
        key: Model-file steel key, e.g. "S355" or "A572-50".

    Returns:
        The steel record; call :meth:`PlateSteel.strength` for ``(fy, fu)``.

    Raises:
        CatalogError: If the key is unknown; the message lists the known keys.
    """
    steels = _steels()
    base = _base_grade(key)
    if base not in steels:
        raise CatalogError(
            f"unknown steel {key!r}; known: {', '.join(steels)} (with a quality suffix "
            "such as S355J2 or S355NL too)"
        )
    return steels[base]


#: EN 10025 quality designations that leave the strengths unchanged: the impact-test
#: qualities of EN 10025-2 (JR, J0, J2, K2, with a delivery condition +AR or +N), and
#: the low-temperature variants NL and ML of EN 10025-3 and -4, whose tables give the
#: same fy and fu as N and M. From memory: EN 10025-2:2019 Table 7, EN 10025-3:2019
#: Table 5, EN 10025-4:2019 Table 5.
_QUALITY = re.compile(r"^(S\d{3})(?:(?:JR|J0|J2|K2)(?:\+AR|\+N)?|(N)L?|(M)L?)$")


def _base_grade(key: str) -> str:
    """The catalogue key of a designation: "S355J2+N" is "S355", "S355NL" is "S355N"."""
    match = _QUALITY.match(key.strip().upper())
    if match is None:
        return key
    grade, normalised, thermo = match.groups()
    return grade + (normalised or thermo or "")


def steel_keys() -> list[str]:
    """Known plate steel keys, in table order.

    Returns:
        A new list of keys.
    """
    return list(_steels())


# --------------------------------------------------------------------------- threads


def _thread(d: float) -> _Thread | None:
    for thread in _threads():
        if abs(thread.d - d) <= SIZE_TOL + _ROUNDOFF:
            return thread
    return None


def size_label(d: float) -> str | None:
    """Designation of a tabulated size ("M20", "3/4"), or None.

    Args:
        d: Nominal diameter, mm.

    Returns:
        The label, or None if ``d`` is not within 0.05 mm of a tabulated size.
    """
    thread = _thread(d)
    return thread.label if thread else None


def is_inch_size(d: float) -> bool:
    """Whether a diameter is a tabulated inch (UNC) size.

    Args:
        d: Nominal diameter, mm.

    Returns:
        True if ``d`` is within 0.05 mm of an inch size in the thread table.
    """
    thread = _thread(d)
    return thread is not None and thread.system == "unc"


def _is_metric_size(d: float) -> bool:
    thread = _thread(d)
    return thread is not None and thread.system == "iso"


def thread_pitch(d: float) -> float | None:
    """Coarse thread pitch (ISO 261 coarse or UNC) of a tabulated size.

    Args:
        d: Nominal diameter, mm.

    Returns:
        Pitch, mm (``25.4 / n`` for UNC with ``n`` threads per inch), or None
        if the size is not tabulated.
    """
    thread = _thread(d)
    return thread.pitch if thread else None


def stress_area(d: float) -> float | None:
    """Tabulated tensile stress area of a size.

    Args:
        d: Nominal diameter, mm.

    Returns:
        A_s, mm² (ISO 898-1 for metric, ASME B1.1 for inch sizes), or None if
        the size is not tabulated.
    """
    thread = _thread(d)
    return thread.stress_area if thread else None


def stress_area_formula(d: float, pitch: float, system: str) -> float:
    r"""Tensile stress area from the thread standards' formulas.

    ISO 898-1 (metric):

    .. math:: A_s = \frac{\pi}{4}\,(d - 0.9382\,P)^2

    ASME B1.1 (inch, in inches with ``n = 1/P`` threads per inch):

    .. math:: A_s = 0.7854\,(D - 0.9743/n)^2

    Args:
        d: Nominal diameter, mm.
        pitch: Thread pitch, mm.
        system: "iso" for metric; "unc" (or "astm") for inch threads.

    Returns:
        A_s, mm².

    Raises:
        ValueError: If the system is unknown or the inputs are not positive.
    """
    if not (d > 0 and pitch > 0):
        raise ValueError(f"diameter and pitch must be > 0 mm, got d={d}, pitch={pitch}")
    if system == "iso":
        return math.pi / 4.0 * (d - 0.9382 * pitch) ** 2
    if system in ("unc", "astm"):
        d_in = d / MM_PER_IN
        n = MM_PER_IN / pitch
        return 0.7854 * (d_in - 0.9743 / n) ** 2 * MM_PER_IN**2
    raise ValueError(f"unknown thread system {system!r}; known: iso, unc (or astm)")


def thread_length(d: float, grade: str, length: float | None = None) -> float:
    """Standard thread length b of a structural bolt.

    ASTM grades: heavy hex structural bolts, ASME B18.2.6 (AISC Manual Table
    7-15), independent of the bolt length. ISO property classes: ISO 4014
    hexagon head bolts, b(ref) = 2d + 6 (l <= 125), 2d + 12 (125 < l <= 200),
    2d + 25 (l > 200). (Preloadable EN 14399 bolts have shorter threads; give
    ``thread_length`` in the model file for those.) The result never exceeds
    the bolt length.

    Args:
        d: Nominal diameter, mm.
        grade: Fastener grade key (selects the ASTM or ISO rule).
        length: Under-head bolt length, mm; None is taken as l <= 125 mm.

    Returns:
        Thread length b, mm.

    Raises:
        CatalogError: If the grade or the size is unknown.
        ValueError: If ``length`` is given and not positive.
    """
    system = fastener(grade).system
    if length is not None and not length > 0:
        raise ValueError(f"bolt length must be > 0 mm, got {length}")
    if system == "astm":
        for d_tab, _, b_tab in _astm_thread_lengths():
            if abs(d_tab - d) <= SIZE_TOL + _ROUNDOFF:
                b = b_tab
                break
        else:
            known = ", ".join(label for _, label, _ in _astm_thread_lengths())
            raise CatalogError(
                f"no thread length for d = {d:g} mm with grade {grade!r}; known sizes (in): {known}"
            )
    else:
        if not _is_metric_size(d):
            known = ", ".join(t.label for t in _threads() if t.system == "iso")
            raise CatalogError(
                f"no thread length for d = {d:g} mm with grade {grade!r}; known sizes: {known}"
            )
        if length is None or length <= 125.0:
            b = 2.0 * d + 6.0
        elif length <= 200.0:
            b = 2.0 * d + 12.0
        else:
            b = 2.0 * d + 25.0
    return b if length is None else min(b, length)


def nut_height(d: float) -> float | None:
    """Height of the nut of a tabulated size.

    ISO 4032 hexagon nuts (style 1, the largest height m) for metric sizes;
    ASME B18.2.2 heavy hex nuts (the ASTM A563 structural nut) for inch sizes.

    Args:
        d: Nominal diameter, mm.

    Returns:
        Nut height, mm, or None if the size is not tabulated.
    """
    for d_tab, height in _nuts():
        if abs(d_tab - d) <= SIZE_TOL + _ROUNDOFF:
            return height
    return None


# --------------------------------------------------------------------------- holes


@lru_cache(maxsize=256)  # every solve's sanity check asks; a scan of the table each time
def _hole_row(d: float, hole: str, standard: str) -> tuple[_HoleRow, float]:
    """The matching hole-table row and the bolt diameter to apply it to, mm."""
    if hole not in HOLE_TYPES:
        raise ValueError(f"unknown hole type {hole!r}; known: {', '.join(HOLE_TYPES)}")
    if standard not in STANDARDS:
        raise ValueError(f"unknown standard {standard!r}; known: {', '.join(STANDARDS)}")
    if not d > 0:
        raise ValueError(f"bolt diameter must be > 0 mm, got {d}")
    # AISC has an inch table and a metric table: pick by the size itself.
    inch = standard == "aisc360-22" and is_inch_size(d)
    thread = _thread(d)
    for row in _holes():
        if row.standard != standard or row.hole != hole or row.inch != inch:
            continue
        if math.isinf(row.d_max):
            if d >= row.d_min - SIZE_TOL:
                return row, thread.d if thread else d
        elif thread is not None and row.d_min - SIZE_TOL <= d <= row.d_max + SIZE_TOL:
            # a closed range covers the tabulated sizes of its own system only
            if (thread.system == "unc") == row.inch:
                return row, thread.d
    sizes = _known_hole_sizes(standard, hole)
    raise CatalogError(f"no {hole} hole for d = {d:g} mm in {standard}; known sizes: {sizes}")


def _fmt_size(d: float, inch: bool) -> str:
    """A size for messages: mixed fraction in inches ("1-1/8 in") or mm."""
    if not inch or math.isinf(d):
        return f"{d:g} mm"
    frac = Fraction(d / MM_PER_IN).limit_denominator(64)
    whole, rest = divmod(frac, 1)
    text = "-".join(str(x) for x in (whole, rest) if x) or "0"
    return f"{text} in"


def _known_hole_sizes(standard: str, hole: str) -> str:
    parts = []
    for row in _holes():
        if row.standard != standard or row.hole != hole:
            continue
        lo, hi = _fmt_size(row.d_min, row.inch), _fmt_size(row.d_max, row.inch)
        if math.isinf(row.d_max):
            parts.append(f">= {lo}")
        elif row.d_max == row.d_min:
            parts.append(lo)
        elif row.d_min == 0:
            parts.append(f"<= {hi}")
        else:
            parts.append(f"{lo} to {hi}")
    return ", ".join(parts)


def hole_diameter(d: float, hole: str, standard: str) -> float:
    """Nominal hole diameter (for slots: the width across the slot).

    AISC 360-22 Table J3.3 (inch sizes) and Table J3.3M (metric sizes);
    EN 1993-1-8 refers to EN 1090-2:2018 Table 11 nominal clearances (its note
    for towers and masts, normal round holes 0.5 mm tighter, is not applied).

    Args:
        d: Nominal bolt diameter, mm.
        hole: One of :data:`HOLE_TYPES`.
        standard: One of :data:`STANDARDS`.

    Returns:
        Hole diameter or slot width, mm.

    Raises:
        ValueError: If the hole type or standard is unknown, or ``d <= 0``.
        CatalogError: If the size is not covered by the standard's table.
    """
    row, d_nom = _hole_row(d, hole, standard)
    return d_nom + row.width_add


def hole_slot_length(d: float, hole: str, standard: str) -> float | None:
    """Nominal slot length (along the slot) of a slotted hole.

    Args:
        d: Nominal bolt diameter, mm.
        hole: One of :data:`HOLE_TYPES`.
        standard: One of :data:`STANDARDS`.

    Returns:
        Slot length, mm, or None for round holes.

    Raises:
        ValueError: If the hole type or standard is unknown, or ``d <= 0``.
        CatalogError: If the size is not covered by the standard's table.
    """
    row, d_nom = _hole_row(d, hole, standard)
    if row.length_add is not None:
        return d_nom + row.length_add
    if row.length_factor is not None:
        return row.length_factor * d_nom
    return None
