"""Shaft specs: one short string per shaft, read into a core ShaftGeometry.

Syntax (ours):  PROFILE SIZE [WORD ...]

    round 35mm            tube 60mm/50mm        square 30mm
    flat 50mm x 20mm      hex 27mm              round 1-1/4in keyed ground
    round 40mm keyed sharp-shoulder             round 1 1/4" key 5/16x5/16in
    round 40mm key 12x8 (a DIN key b x h)       round 40mm keyseat 12x5mm (the seat: width x depth)
    round 25mm d-flat 2mm                       square 30mm radius 3mm

SIZE: round = diameter; tube = outside/inside diameter; square = side; flat = width x thickness;
hex = ACROSS FLATS (not across corners). Bare numbers (one rule): a unit written anywhere in the
size applies to every bare number of the spec (``flat 2in x 12`` is 2 x 12 in, and the sizes of
the words after it take it too); a spec with no unit at all is millimetres, except that a fraction
with no unit (``round 2 1/2``) is refused — fractions are inch sizes, write ``2-1/2in``. Inch sizes
accept 1.25in, 1-1/4in, 1 1/4"; a fraction with a metric unit (``3/8mm``) is refused.
WORDS (each at most once): ``keyed`` (standard keyseat for the diameter: DIN 6885-1 for metric
sizes, ANSI B17.1 for inch sizes), ``key BxH`` (the KEY, width x height as keys are designated:
``key 12x8`` is the DIN 6885-1 12 x 8 key, whose shaft seat is 5 mm deep; it must be a listed key),
``keyseat WxD`` (the SEAT itself: width x depth in the shaft, measured at the centreline for
metric sizes, at the side wall for inch sizes as ANSI B17.1 does), ``d-flat DEPTH`` / ``double-d DEPTH``
(one or two ground flats on a round), ``radius R`` / ``chamfer C`` (corners of square or flat bar),
a finish (ground, machined, cold-drawn, hot-rolled, forged), a shoulder (sharp-shoulder,
round-shoulder). Flats, radii and chamfers are solved numerically (no closed form exists).
"""

from __future__ import annotations

import re

from workbench.core.geometry import FINISHES, PROFILES, ShaftGeometry
from workbench.units import LENGTH, QuantityError, parse_quantity

MIN_SIZE_M = 2e-3
MAX_SIZE_M = 0.5  # a bench tool for motor-drive shafts: anything wider is a typing slip

_SHOULDERS = {"sharp-shoulder": "sharp", "round-shoulder": "rounded", "shoulder": "sharp"}
_INCH = re.compile(r"(in\b|inch|\"|″|'')", re.I)
_TUBE_SPLIT = re.compile(r"(?<=[A-Za-z\"″'])\s*/\s*")
_TIMES = re.compile(r"\s*[x×*]\s*", re.I)
_SIZED_WORDS = ("d-flat", "double-d", "radius", "chamfer")
_WORDS = ("keyed", "keyseat", "key", *_SIZED_WORDS, *FINISHES, *_SHOULDERS)
_WORD_RE = re.compile(r"\s(" + "|".join(re.escape(w) for w in sorted(_WORDS, key=len, reverse=True)) + r")(?=\s|$)", re.I)

SPEC_HELP = ("e.g. 'round 35mm', 'tube 60mm/50mm', 'square 30mm', 'flat 50mm x 20mm', 'hex 27mm' (across flats), "
             "'round 1-1/4in keyed', 'round 40mm key 12x8' (key b x h)")
_FRACTION_NO_UNIT = re.compile(r"\d\s*/\s*\d")
_METRIC_FRACTION = re.compile(r"\d+\s*/\s*\d+\s*(mm|cm|m)\b", re.I)


def parse_length(field: str, text: str, *, default_unit: str = "mm") -> float:
    """A shaft dimension in metres, within 2 mm .. 500 mm."""
    return parse_quantity(field, text, LENGTH, default_unit, low=MIN_SIZE_M, high=MAX_SIZE_M)


def _split_pair(field: str, text: str, splitter: re.Pattern, what: str) -> tuple[str, str]:
    parts = splitter.split(text.strip(), maxsplit=1)
    if len(parts) != 2 or not parts[0] or not parts[1]:
        raise QuantityError(field, f"needs {what}, {SPEC_HELP}")
    first, second = parts
    # a unit written only once ("50 x 20 mm") applies to both
    if re.fullmatch(r"[\d.\s/-]+", first.strip()):
        unit = re.sub(r"^[\d.\s/-]+", "", second.strip())
        first = f"{first.strip()} {unit}"
    return first, second


def parse_spec(text: str, field: str = "shaft") -> ShaftGeometry:
    """Read a shaft spec string; raises QuantityError naming ``field`` with what it expects."""
    raw = " ".join(str(text).split())
    if not raw:
        raise QuantityError(field, f"is empty; {SPEC_HELP}")
    profile, _, rest = raw.partition(" ")
    profile = profile.lower()
    if profile not in PROFILES:
        raise QuantityError(field, f"unknown profile {profile!r}; expected one of {', '.join(PROFILES)} ({SPEC_HELP})")
    match = _WORD_RE.search(" " + rest)
    size_text = (" " + rest)[: match.start()].strip() if match else rest.strip()
    words = (" " + rest)[match.start():].split() if match else []
    if not size_text:
        raise QuantityError(field, f"has no size; {SPEC_HELP}")
    try:
        return _parse_sized(field, profile, size_text, words)
    except QuantityError as err:
        if "fraction" not in err.message and "repeats" not in err.message:
            _blame_stray_word(field, profile, size_text, words, err)
        raise


def _blame_stray_word(field: str, profile: str, size_text: str, words: list[str], err: QuantityError) -> None:
    """If the size only fails because a word we do not know follows it, say so (not "unknown unit")."""
    from workbench.units import registry

    tokens = size_text.split()
    try:
        registry().parse_units(tokens[-1])
        return  # the last word is a unit, only of the wrong kind: the original message says so
    except Exception:
        pass
    for keep in range(len(tokens) - 1, 0, -1):
        try:
            _parse_sized(field, profile, " ".join(tokens[:keep]), [])
        except QuantityError:
            continue
        raise QuantityError(
            field,
            f"unknown word {tokens[keep]!r}; expected keyed, key BxH, keyseat WxD, d-flat, double-d, radius, chamfer, "
            f"a finish or a shoulder after the size",
        ) from err


def _parse_sized(field: str, profile: str, size_text: str, words: list[str]) -> ShaftGeometry:
    """The size part and the words after it (see parse_spec)."""
    inch = bool(_INCH.search(size_text))
    unit = "in" if inch else "mm"
    if not re.search(r"[A-Za-z\"″']", size_text) and _FRACTION_NO_UNIT.search(size_text) and not (
            profile == "tube" and re.fullmatch(r"\s*\d+(\.\d+)?\s*/\s*\d+(\.\d+)?\s*", size_text)):
        raise QuantityError(field, f"{size_text!r} is a fraction with no unit; fractions are inch sizes: write "
                                   f"{size_text.strip()}in (or the size in mm)")
    for text in (size_text, *words):
        if _METRIC_FRACTION.search(text):
            raise QuantityError(field, f"{text!r}: a fraction with a metric unit; fractions are inch sizes "
                                       "(write 3/8x3/16in, or the size in mm as decimals)")
    seen: set[str] = set()
    for w in words:
        lw = w.lower()
        if lw in _WORDS:
            group = "keyseat" if lw in ("keyed", "key", "keyseat") else "shoulder" if lw in _SHOULDERS else (
                "finish" if lw in FINISHES else "flats" if lw in ("d-flat", "double-d") else lw)
            if group in seen:
                raise QuantityError(field, f"{w!r} repeats a word already given ({group}); give each once")
            seen.add(group)
    second = 0.0
    if profile == "tube":
        simple = re.fullmatch(r"\s*(\d+(?:\.\d+)?)\s*/\s*(\d+(?:\.\d+)?)\s*([A-Za-z\"]*)\s*", size_text)
        if simple and not _TUBE_SPLIT.search(size_text):
            outside_text = f"{simple[1]} {simple[3]}"
            inside_text = f"{simple[2]} {simple[3]}"
        else:
            outside_text, inside_text = _split_pair(field, size_text, _TUBE_SPLIT, "outside/inside diameters")
        size = parse_length(field, outside_text, default_unit=unit)
        second = parse_length(field, inside_text, default_unit=unit)
        if second >= size:
            raise QuantityError(field, "tube inside diameter must be smaller than its outside diameter")
    elif profile == "flat":
        width_text, thick_text = _split_pair(field, size_text, _TIMES, "width x thickness")
        size = parse_length(field, width_text, default_unit=unit)
        second = parse_length(field, thick_text, default_unit=unit)
        size, second = max(size, second), min(size, second)
    else:
        size = parse_length(field, size_text, default_unit=unit)
    options: dict = {}
    i = 0
    while i < len(words):
        word = words[i].lower()
        if word == "keyed":
            options["keyed"] = True
        elif word in ("key", "keyseat"):
            if i + 1 >= len(words):
                example = "'key 12x8' (key width x height)" if word == "key" else "'keyseat 12x5mm' (seat width x depth)"
                raise QuantityError(field, f"'{word}' needs its size, e.g. {example}")
            key_text = words[i + 1]
            i += 1
            what = "key width x height" if word == "key" else "keyseat width x depth"
            width_text, depth_text = _split_pair(field, key_text, _TIMES, what)
            key_unit = "in" if (inch or _INCH.search(key_text)) else unit
            first = parse_quantity(field, width_text, LENGTH, key_unit, low=0.5e-3, high=size)
            second_ = parse_quantity(field, depth_text, LENGTH, key_unit, low=0.2e-3, high=size)
            options["keyed"] = True
            standard = "ansi" if key_unit == "in" else "iso"
            options["key_width_m"], options["key_depth_m"] = _keyseat_from(
                field, word, key_text, first, second_, size, standard)
        elif word in _SIZED_WORDS:
            if i + 1 >= len(words):
                raise QuantityError(field, f"'{word}' needs a size, e.g. '{word} 3mm'")
            value = parse_quantity(field, words[i + 1], LENGTH, unit, low=1e-4, high=size / 2)
            i += 1
            if word in ("d-flat", "double-d"):
                if profile != "round":
                    raise QuantityError(field, f"'{word}' (ground flats) is only for a round shaft")
                options["flats"] = 1 if word == "d-flat" else 2
                if word == "double-d" and value >= size / 2 * (1 - 1e-9):
                    raise QuantityError(field, f"double-d flats {words[i]} deep meet in the middle: each "
                                               f"must be less than half the diameter ({size * 500:g} mm)")
                options["flat_depth_m"] = value
            else:
                if profile not in ("square", "flat"):
                    raise QuantityError(field, f"a corner {word} is only for square or flat bar")
                options["corner_radius_m" if word == "radius" else "chamfer_m"] = value
        elif word in FINISHES:
            options["finish"] = word
        elif word in _SHOULDERS:
            options["shoulder"] = _SHOULDERS[word]
        else:
            raise QuantityError(field, f"unknown word {words[i]!r}; expected keyed, key BxH, keyseat WxD, a finish or a shoulder")
        i += 1
    # ``keyed`` on a square, hex or flat bar: the keyseat is cut in its turned (round) hub seat
    if options.get("keyed") and options.get("flats"):
        raise QuantityError(field, "a keyseat and ground flats on the same section are not modelled; check each")
    if options.get("corner_radius_m") and options.get("chamfer_m"):
        raise QuantityError(field, "give a corner radius or a chamfer, not both")
    corner = options.get("corner_radius_m", 0.0) + options.get("chamfer_m", 0.0)
    if corner and corner >= (second if profile == "flat" else size) / 2:
        raise QuantityError(field, "the corner radius or chamfer must be less than half the bar's thickness")
    return ShaftGeometry(profile=profile, size_m=size, second_m=second, key_standard="ansi" if inch else "iso", **options)


def _keyseat_from(field: str, word: str, text: str, first: float, second: float, size: float,
                  standard: str) -> tuple[float, float]:
    """(seat width, seat depth at the centreline) [m] from ``key BxH`` (a listed key: its table
    seat depth) or ``keyseat WxD`` (the seat; inch depths are at the side wall, ANSI B17.1)."""
    from workbench.core.keyseat_factors import side_wall_to_centre_depth_m
    from workbench.core.tables import key_sizes
    from workbench.readings import note

    name = "DIN 6885-1" if standard == "iso" else "ANSI B17.1"
    unit, scale = ("mm", 1e3) if standard == "iso" else ("in", 1 / 0.0254)
    if word == "key":
        rows = [r for r in key_sizes(standard)
                if abs(r.width_m - first) < 1e-6 and abs(r.height_m - second) < 1e-6]
        if not rows:
            raise QuantityError(field, f"'key {text}' is no {name} key (width x height); give the seat itself as "
                                       f"'keyseat WxD' (width x depth in the shaft)")
        row = rows[0]
        depth = row.shaft_depth_m
        centre = side_wall_to_centre_depth_m(size, row.width_m, depth) if standard == "ansi" else depth
        note(field, f"'key {text}' read as the {name} key b x h = {first * scale:.4g} x {second * scale:.4g} {unit}: "
                    f"shaft seat {row.width_m * scale:.4g} {unit} wide, {depth * scale:.4g} {unit} deep")
        return row.width_m, centre
    centre = side_wall_to_centre_depth_m(size, first, second) if standard == "ansi" else second
    where = "at the side wall (ANSI B17.1)" if standard == "ansi" else "at the centreline"
    note(field, f"'keyseat {text}' read as a seat {first * scale:.4g} {unit} wide, {second * scale:.4g} {unit} deep "
                f"{where}")
    return first, centre


def inch_text(inches: float) -> str:
    """Inches as the trade writes them: ``1-1/4`` for a multiple of 1/64, else a decimal (6 digits)."""
    sixty_fourths = round(inches * 64)
    if sixty_fourths > 0 and abs(inches * 64 - sixty_fourths) < 1e-6:
        whole, part = divmod(sixty_fourths, 64)
        if part == 0:
            return f"{whole}"
        num, den = part, 64
        while num % 2 == 0:
            num, den = num // 2, den // 2
        return f"{whole}-{num}/{den}" if whole else f"{num}/{den}"
    return f"{inches:.6g}"


def format_spec(geometry: ShaftGeometry, system: str = "metric") -> str:
    """A spec string that parses back to ``geometry`` (sizes in mm or inch)."""
    def size(value_m: float) -> str:
        if system == "inch":
            return inch_text(value_m / 0.0254) + "in"
        return f"{value_m * 1000:.6g}mm"

    g = geometry
    if g.profile == "tube":
        text = f"tube {size(g.size_m)}/{size(g.second_m)}"
    elif g.profile == "flat":
        text = f"flat {size(g.size_m)} x {size(g.second_m)}"
    else:
        text = f"{g.profile} {size(g.size_m)}"
    if g.keyed:
        if g.key_width_m and g.key_depth_m:
            depth = g.key_depth_m
            if system == "inch" or g.key_standard == "ansi":
                r = g.size_m / 2.0  # back to the side-wall depth that an inch keyseat is written with
                depth -= r - (r * r - g.key_width_m ** 2 / 4.0) ** 0.5
            text += f" keyseat {size(g.key_width_m)}x{size(depth)}"
        else:
            text += " keyed"
    if g.flats:
        text += f" {'d-flat' if g.flats == 1 else 'double-d'} {size(g.flat_depth_m)}"
    if g.corner_radius_m:
        text += f" radius {size(g.corner_radius_m)}"
    if g.chamfer_m:
        text += f" chamfer {size(g.chamfer_m)}"
    if g.finish != "machined":
        text += f" {g.finish}"
    if g.shoulder != "none":
        text += " sharp-shoulder" if g.shoulder == "sharp" else " round-shoulder"
    return text
