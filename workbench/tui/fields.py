"""The job sheet's fields, in the order the job goes, and the shaft-spec builder.

Each field is typed as text (the job contract takes strings exactly as typed) or picked from a
short list. A shaft is entered as profile + size (+ bore/thickness) + keyseat + finish and turned
into a spec string such as ``round 40mm keyed``; typing a whole spec into the size field also works.
"""

from __future__ import annotations

import re
from dataclasses import dataclass, field

MOUNTS = ("coupling", "vbelt", "flat-belt", "sprocket", "timing-belt", "gear")
PROFILES = ("round", "tube", "square", "flat", "hex")
KEYSEATS = ("plain", "keyed")
FINISHES = ("machined", "ground", "cold-drawn", "hot-rolled", "forged")
CRITERIA = ("goodman", "gerber", "asme-elliptic", "soderberg")
#: bearing types of data/bearing_slopes.csv, the default (deep-groove ball) first; a test keeps
#: this list equal to workbench.core.bearing_limits.bearing_types() (not imported: start-up)
BEARING_TYPES = ("deep-groove-ball", "cylindrical-roller", "tapered-roller", "spherical-roller",
                 "self-aligning-ball", "spherical-ball")
ELEMENT_POSITIONS = ("overhung", "between")
DRIVEN_POSITIONS = ("none", "between", "far-end")
YES_NO = ("no", "yes")
#: the driven machine's duty (load class x hours a day, data/service_factors.csv via workbench.duty),
#: "not given" first; a test parses every entry with workbench.duty (not imported here: start-up)
DUTIES = ("not given", *(f"{load} {hours}h" for load in ("uniform", "moderate", "heavy", "extreme")
                         for hours in ("1/2", "3", "10", "24")))
#: hub materials of data/hub_materials.csv, the default (steel) first; kept equal by a test
HUB_MATERIALS = ("steel", "steel-s355", "steel-1045", "ductile-iron-400", "ductile-iron-500",
                 "ductile-iron-600", "cast-iron-200", "cast-iron-250", "cast-iron-astm30")


@dataclass(frozen=True)
class FieldSpec:
    """One row of the job sheet: the contract key it fills, its label, hint and kind."""

    key: str
    label: str
    hint: str = ""
    placeholder: str = ""
    choices: tuple[str, ...] = ()
    section: str = ""


@dataclass(frozen=True)
class SectionSpec:
    """A block of the job sheet, read top to bottom."""

    id: str
    title: str
    fields: tuple[FieldSpec, ...] = field(default_factory=tuple)


def _shaft_fields(prefix: str, material_key: str, material_placeholder: str) -> tuple[FieldSpec, ...]:
    return (
        FieldSpec(f"{prefix}_profile", "Profile", "r t s f h", choices=PROFILES),
        FieldSpec(f"{prefix}_size", "Size", "dia., bare = mm", placeholder="e.g. 40"),
        FieldSpec(f"{prefix}_second", "Bore", "bare = mm", placeholder="inside dia."),
        FieldSpec(f"{prefix}_keyseat", "Keyseat", "k = keyed, p = plain", choices=KEYSEATS),
        FieldSpec(f"{prefix}_finish", "Finish", "m g c h f", choices=FINISHES),
        FieldSpec(material_key, "Material", "^L list · EN19 ok", placeholder=material_placeholder),
    )


SECTIONS: tuple[SectionSpec, ...] = (
    SectionSpec(
        "drive",
        "1 Drive (motor nameplate)",
        (
            FieldSpec("power", "Power", "kW, hp · bare = kW", placeholder="e.g. 7.5 kW"),
            FieldSpec("speed", "Speed", "rpm, rev/s · bare = rpm", placeholder="e.g. 1460"),
            FieldSpec("ratio", "Ratio", "motor:shaft, e.g. 25:1", placeholder="default 1"),
            FieldSpec("efficiency", "Efficiency", "0.95 or 95%", placeholder="default 1"),
            FieldSpec("service_factor", "Service factor", "overrides Duty", placeholder="default 1"),
            FieldSpec("duty", "Duty", "u m h e · load, h/day", choices=DUTIES),
            FieldSpec("peak_factor", "Start torque ×", "× running torque", placeholder="default 2"),
            FieldSpec("torque", "or Torque", "instead of power+speed", placeholder="N·m, lbf·in"),
        ),
    ),
    SectionSpec(
        "mount",
        "2 What is mounted",
        (
            FieldSpec("mount", "Element", "c v f s t g", choices=MOUNTS),
            FieldSpec("pitch_diameter", "Pitch dia.", "bare = mm", placeholder="e.g. 200"),
            FieldSpec("overhang", "Overhang", "to load line, bare = mm", placeholder="e.g. 60"),
        ),
    ),
    SectionSpec("shaft", "3 Shaft as found", _shaft_fields("shaft", "material", "default 1045-cd")),
    SectionSpec(
        "candidate", "4 Candidate", _shaft_fields("candidate", "candidate_material", "same as found")
    ),
    SectionSpec(
        "layout",
        "5 Layout (blank = defaults)",
        (
            FieldSpec("bearing_span", "Bearing span", "c to c · bare = mm", placeholder="not known"),
            FieldSpec("bearing_type", "Bearings", "d c t s", choices=BEARING_TYPES),
            FieldSpec("element_position", "Element sits", "o, b = between", choices=ELEMENT_POSITIONS),
            FieldSpec("load_from_bearing", "From bearing", "to load · bare = mm", placeholder="e.g. 150"),
            FieldSpec("hub_length", "Hub length", "along the shaft", placeholder="default"),
            FieldSpec("element_mass", "Element mass", "kg, lb · bare = kg", placeholder="not known"),
            FieldSpec("hub_material", "Hub material", "for the key", choices=HUB_MATERIALS),
            FieldSpec("journal", "Journals", "as found · bare = mm", placeholder="= shaft"),
            FieldSpec("seat", "Hub seat", "as found · bare = mm", placeholder="= shaft"),
            FieldSpec("fillet", "Fillet r", "as found · bare = mm", placeholder="r/d 0.02"),
            FieldSpec("candidate_journal", "Cand. journals", "bare = mm", placeholder="= as found"),
            FieldSpec("candidate_seat", "Cand. seat", "bare = mm", placeholder="= as found"),
            FieldSpec("candidate_fillet", "Cand. fillet", "bare = mm", placeholder="r/d 0.02"),
            FieldSpec("as_bar", "Run as bar", "square-bore units", choices=YES_NO),
            FieldSpec("driven_position", "Driven elem.", "drum, fan wheel", choices=DRIVEN_POSITIONS),
            FieldSpec("driven_from_bearing", "Driven at", "from its bearing", placeholder="e.g. 200"),
            FieldSpec("driven_mass", "Driven mass", "bare = kg", placeholder="0"),
            FieldSpec("driven_load", "Driven load", "radial · bare = N", placeholder="0"),
        ),
    ),
    SectionSpec(
        "settings",
        "6 Check settings",
        (
            FieldSpec("required_sf", "Required SF", "for the verdict", placeholder="default 1.5"),
            FieldSpec("criterion", "Fatigue rule", "g e a s", choices=CRITERIA),
            FieldSpec("reliability", "Reliability", "0.5 … 0.9999", placeholder="default 0.9"),
            FieldSpec("twist_limit", "Twist limit", "e.g. 0.25 deg/m", placeholder="default 1°/20 d"),
        ),
    ),
)

ALL_FIELDS: tuple[FieldSpec, ...] = tuple(f for s in SECTIONS for f in s.fields)
FIELD_BY_KEY = {f.key: f for f in ALL_FIELDS}

#: contract keys that the sheet does not hold as one widget, and the widget that shows their error
ERROR_TARGET = {"shaft": "shaft_size", "candidate": "candidate_size"}

#: choice fields whose first entry is the contract default: left out of the inputs when unchanged
CHOICE_DEFAULTS = {"mount": "coupling", "criterion": "goodman", "bearing_type": BEARING_TYPES[0],
                   "element_position": ELEMENT_POSITIONS[0], "hub_material": HUB_MATERIALS[0],
                   "as_bar": YES_NO[0], "driven_position": DRIVEN_POSITIONS[0],
                   "duty": DUTIES[0]}

#: layout fields shown (and sent) only for some picks of another field; hidden rows are skipped
#: by Tab, so the standard job costs no keys for them
SHOWN_WHEN = {
    "load_from_bearing": ("element_position", ("between",)),
    "driven_from_bearing": ("driven_position", ("between", "far-end")),
    "driven_mass": ("driven_position", ("between", "far-end")),
    "driven_load": ("driven_position", ("between", "far-end")),
}

SECOND_LABEL = {"tube": "Bore", "flat": "Thickness"}
SIZE_HINT = {
    "round": "dia., bare = mm",
    "tube": "outside dia., bare = mm",
    "square": "side, bare = mm",
    "flat": "width, bare = mm",
    "hex": "across flats, bare = mm",
}

#: spec words that shape a profile further, each followed by a size; typed after the size
#: ("40 d-flat 2" on a round, "30 radius 3" on a square or flat), they ride in the Size field
PROFILE_WORDS = ("d-flat", "double-d", "radius", "chamfer")
PROFILE_WORDS_FOR = {"round": ("d-flat", "double-d"), "square": ("radius", "chamfer"),
                     "flat": ("radius", "chamfer")}
SIZE_PLACEHOLDER = {
    "round": "e.g. 40 d-flat 2",
    "tube": "e.g. 60",
    "square": "e.g. 40 radius 3",
    "flat": "e.g. 50 chamfer 2",
    "hex": "e.g. 27",
}


def profile_words_tip(profile: str) -> str:
    """One line telling the fitter which shape words the size field takes for ``profile``."""
    words = PROFILE_WORDS_FOR.get(profile)
    if not words:
        return ""
    first = f"{words[0]} {3 if words[0] == 'radius' else 2}"
    return f"size + {first} or {words[1]} 2"


_BARE_NUMBER = re.compile(r"^\s*\d+(?:\.\d*)?\s*$|^\s*\.\d+\s*$")
_SPEC_START = re.compile(r"^\s*(round|tube|square|flat|hex)\b", re.IGNORECASE)


def with_mm(size: str) -> str:
    """A size as typed, with ``mm`` added when it is a bare number (bare sizes are millimetres)."""
    size = size.strip()
    return f"{size}mm" if _BARE_NUMBER.match(size) else size


def is_full_spec(text: str) -> bool:
    """True when a size field holds a whole spec (it starts with a profile word)."""
    return bool(_SPEC_START.match(text))


def split_size_words(size: str) -> tuple[str, list[str]]:
    """(the size, the profile words after it) of a Size field: "40 d-flat 2" -> ("40", [...]).

    A bare number after a profile word gets ``mm`` (bare sizes are millimetres).

    >>> split_size_words("40 d-flat 2")
    ('40', ['d-flat', '2mm'])
    """
    tokens = size.split()
    for index, token in enumerate(tokens):
        if token.lower() in PROFILE_WORDS:
            words = tokens[index:]
            words = [with_mm(w) if i % 2 else w.lower() for i, w in enumerate(words)]
            return " ".join(tokens[:index]), words
    return size.strip(), []


def compose_spec(profile: str, size: str, second: str, keyseat: str, finish: str) -> str:
    """The spec string for a shaft from its sheet fields; "" when no size is given.

    The Size field may end in profile words (ground flats, corner radius or chamfer), which go
    after the size in the spec.

    >>> compose_spec("round", "40", "", "keyed", "machined")
    'round 40mm keyed'
    >>> compose_spec("flat", "50", "20", "plain", "ground")
    'flat 50mm x 20mm ground'
    >>> compose_spec("square", "40 radius 3", "", "plain", "machined")
    'square 40mm radius 3mm'
    """
    size = size.strip()
    if not size:
        return ""
    if is_full_spec(size):
        return size
    size, shape_words = split_size_words(size)
    if profile == "tube":
        body = f"tube {with_mm(size)}/{with_mm(second)}" if second.strip() else f"tube {with_mm(size)}"
    elif profile == "flat":
        body = f"flat {with_mm(size)} x {with_mm(second)}" if second.strip() else f"flat {with_mm(size)}"
    else:
        body = f"{profile} {with_mm(size)}"
    words = [body, *shape_words]
    if keyseat == "keyed":  # any profile: the keyseat is cut in the turned hub seat
        words.append("keyed")
    if finish and finish != "machined":
        words.append(finish)
    return " ".join(words)


def _strip_mm(size: str) -> str:
    size = size.strip()
    if size.endswith("mm") and _BARE_NUMBER.match(size[:-2]):
        return size[:-2].strip()
    return size


def split_spec(spec: str) -> dict[str, str] | None:
    """The sheet fields for a spec string, or None when it is not simple enough to split.

    >>> split_spec("square 40mm")["size"]
    '40'
    >>> split_spec('round 1 1/4" keyed')["size"]
    '1 1/4"'
    """
    match = _SPEC_START.match(spec or "")
    if not match:
        return None
    profile = match.group(1).lower()
    tokens = spec[match.end():].split()
    keyseat, finish = "plain", "machined"
    shape_words: list[str] = []
    kept: list[str] = []
    index = 0
    while index < len(tokens):  # profile words and their sizes, wherever they stand
        token = tokens[index]
        if token.lower() in PROFILE_WORDS and index + 1 < len(tokens):
            shape_words += [token.lower(), tokens[index + 1]]
            index += 2
            continue
        kept.append(token)
        index += 1
    tokens = kept
    while tokens and (tokens[-1] == "keyed" or tokens[-1] in FINISHES):
        word = tokens.pop()
        if word == "keyed":
            keyseat = "keyed"
        else:
            finish = word
    if not tokens or any(re.fullmatch(r"[a-z-]+", t, re.IGNORECASE) and t != "x" for t in tokens):
        return None  # a shoulder or another word the sheet has no field for: keep the spec whole
    size_text, second = " ".join(tokens), ""
    if profile == "tube":
        if size_text.count("/") != 1 and not re.fullmatch(r"\S+mm\s*/\s*\S+mm", size_text):
            return None
        size_text, second = (p.strip() for p in size_text.split("/", 1)) if size_text.count("/") == 1 else (size_text, "")
    elif profile == "flat":
        parts = re.split(r"\s*x\s*", size_text)
        if len(parts) != 2:
            return None
        size_text, second = parts
    size_field = " ".join([_strip_mm(size_text), *shape_words])
    return {
        "profile": profile,
        "size": size_field,
        "second": _strip_mm(second),
        "keyseat": keyseat,
        "finish": finish,
    }
