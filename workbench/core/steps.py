"""The shaft as it will be turned: a short row of steps along its axis.

A *step* is one axial part of the shaft: the ``body`` (the bar's own profile), the bearing
``journal``s, the hub ``seat`` of the driving element (with its keyseat), and the ``shoulder``s
between them (a shoulder is a point on the axis, where the diameter changes). The *section* of a
step keeps its usual meaning: the cross-section of that step (a ShaftGeometry).

Defaults a fitter can rely on (each stated again in the README):
- the shaft as found is uniform unless journal or seat sizes are given;
- a candidate keeps the existing journal and seat diameters (the bearings and hubs are reused) and
  gets shoulders from its body down to them, with the default fillet r/d = DEFAULT_FILLET_PER_D
  (0.02, the "sharp" fillet of Shigley 9th ed. Table 7-1; the turning sheet prints it as the minimum);
- a journal can be turned only if the bar's inscribed size is at least the journal's upper limit
  (nominal + JOURNAL_UPPER_DEVIATION_M) plus the clean-up allowance (clean_up_allowance_m);
  otherwise the layout is refused, naming the option;
- ``as_bar`` (square-bore bearings and hubs): the bar runs through as it is, no journal, no keyseat.
SI floats only; no pint.
"""

from __future__ import annotations

import functools
import math
from dataclasses import dataclass, replace

from workbench.core.geometry import ShaftGeometry
from workbench.core.layout import LayoutError, Placed
from workbench.core.records import built

DEFAULT_FILLET_PER_D = 0.02  # r/d of the default shoulder fillet (Shigley 9th ed., Table 7-1 "sharp" fillet)
JOURNAL_UPPER_DEVIATION_M = 0.05e-3  # above nominal: covers m6 bearing seats up to 180 mm (ISO 286-2; from memory)
CLEAN_UP_MIN_M = 1.0e-3  # clean-up allowance on diameter, at least 1 mm ... (common practice)
CLEAN_UP_PER_D = 0.02  # ... or 2 % of the journal diameter, whichever is larger (common practice)
JOURNAL_LENGTH_PER_D = 1.0  # assumed bearing width / journal diameter, for drawing and lengths only
STEP_KINDS = ("body", "journal", "seat", "shoulder")


@dataclass(frozen=True)
class Step:
    """One step of a shaft.

    kind:        "body" | "journal" | "seat" | "shoulder"
    label:       words for the report ("hub seat", "bearing 1 journal", "shoulder at the hub seat", ...)
    x_start_m, x_end_m: its extent along the shaft [m] (equal for a shoulder)
    diameter_m:  turned diameter; for the body its inscribed size; for a shoulder the smaller diameter [m]
    fillet_m:    shoulder fillet radius [m] (0 elsewhere)
    keyed:       a keyseat is cut in this step (the seat; a shoulder the seat's keyseat may run into)
    geometry:    the section of the step
    check_from_m, check_to_m: where its moment is taken (largest |M| over this range) [m]
    larger_m:    shoulder: the larger diameter D (circumscribed for a non-round body) [m]
    larger_round: shoulder: whether the larger part is round
    feature_word: a stress raiser typed in the spec ("sharp", "rounded"), checked at this step
    """

    kind: str
    label: str
    x_start_m: float
    x_end_m: float
    diameter_m: float
    geometry: ShaftGeometry
    check_from_m: float
    check_to_m: float
    fillet_m: float = 0.0
    keyed: bool = False
    larger_m: float = 0.0
    larger_round: bool = True
    feature_word: str = "none"


def clean_up_allowance_m(journal_m: float) -> float:
    """Clean-up allowance on diameter [m] for turning a journal of ``journal_m`` from bar stock:
    max(1 mm, 2 % of the journal) (common practice)."""
    return max(CLEAN_UP_MIN_M, CLEAN_UP_PER_D * journal_m)


def inscribed_m(geometry: ShaftGeometry) -> float:
    """Largest round that fits inside the bar's profile [m]: round/tube/square/hex: the size
    (side, across flats); flat: its thickness. Ground flats on a round reduce it by their depth."""
    if geometry.profile == "flat":
        return geometry.second_m
    if geometry.profile == "round" and geometry.flats:
        return geometry.size_m - 2.0 * geometry.flat_depth_m if geometry.flats > 1 else geometry.size_m - geometry.flat_depth_m
    return geometry.size_m


def circumscribed_m(geometry: ShaftGeometry) -> float:
    """Diameter of the circle round the bar's profile [m] (the conservative D of a shoulder):
    square a sqrt 2, flat sqrt(b^2 + t^2), hex s / cos 30 deg; rounds their diameter. Corner radii and
    chamfers are ignored (they only make the true figure smaller)."""
    g = geometry
    if g.profile == "square":
        return g.size_m * math.sqrt(2.0)
    if g.profile == "flat":
        return math.hypot(g.size_m, g.second_m)
    if g.profile == "hex":
        return g.size_m * 2.0 / math.sqrt(3.0)
    return g.size_m


def largest_turnable_journal_m(geometry: ShaftGeometry) -> float:
    """Largest journal [m] the bar can give: inscribed size less the clean-up allowance and the
    journal's upper deviation (solving d + dev + max(1 mm, 0.02 d) <= inscribed for d)."""
    room = inscribed_m(geometry) - JOURNAL_UPPER_DEVIATION_M
    return min(room - CLEAN_UP_MIN_M, room / (1.0 + CLEAN_UP_PER_D))


def can_turn(geometry: ShaftGeometry, journal_m: float) -> bool:
    """True when the bar's inscribed size >= journal upper limit + clean-up allowance."""
    need = journal_m + JOURNAL_UPPER_DEVIATION_M + clean_up_allowance_m(journal_m)
    return inscribed_m(geometry) >= need - 1e-12


@functools.lru_cache(maxsize=1024)  # pure in the (frozen) body and the size: the journals of a shaft repeat it
def _turned(body: ShaftGeometry, diameter_m: float, keyed: bool) -> ShaftGeometry:
    """The section of a journal or seat turned on ``body``: a round (a tube keeps its bore)."""
    key = dict(keyed=keyed, key_standard=body.key_standard)
    if keyed and body.key_width_m and body.key_depth_m:  # the seat as typed (the body is passed unkeyed)
        key.update(key_width_m=body.key_width_m, key_depth_m=body.key_depth_m, key_radius_m=body.key_radius_m)
    if body.profile == "tube":
        return ShaftGeometry("tube", diameter_m, body.second_m, finish=body.finish, **key)
    return ShaftGeometry("round", diameter_m, finish=body.finish, **key)


@dataclass(frozen=True)
class StepPlan:
    """What a shaft's steps are built from (all SI, None = the default)."""

    body: ShaftGeometry
    journal_m: float | None = None
    seat_m: float | None = None
    fillet_m: float | None = None
    keyed_seat: bool = False
    as_bar: bool = False
    journal_field: str = "journal"
    seat_field: str = "seat"
    fillet_field: str = "fillet"


def _check_turn(plan: StepPlan, d_m: float, field: str, what: str) -> None:
    body = plan.body
    if body.profile == "tube" and d_m <= body.second_m:
        raise LayoutError(field, f"a {d_m * 1000:g} mm {what} leaves no wall on a tube with a "
                                 f"{body.second_m * 1000:g} mm bore")
    if not can_turn(body, d_m):
        need = d_m + JOURNAL_UPPER_DEVIATION_M + clean_up_allowance_m(d_m)
        option = {"journal": "--journal", "seat": "--seat"}.get(field, f"--candidate-{what}")
        across = " across flats" if body.profile == "hex" else ""
        inscribed = " across flats" if body.profile == "hex" else " inscribed"
        raise LayoutError(field, f"a {body.profile} {body.size_m * 1000:g} mm{across} bar cannot give a "
                                 f"{d_m * 1000:g} mm {what}: it needs at least {need * 1000:.2f} mm{inscribed} "
                                 f"(upper limit + {clean_up_allowance_m(d_m) * 1000:g} mm clean-up); "
                                 f"give a smaller {option}, a larger bar, "
                                 "or --as-bar for square-bore bearings and hubs")


@functools.lru_cache(maxsize=256)  # pure in the (frozen) geometry
def _plain_body(geometry: ShaftGeometry) -> ShaftGeometry:
    """The bar's body: its own profile with no keyseat and no stress raiser typed in the spec."""
    return replace(geometry, keyed=False, shoulder="none")


def _step(kind: str, label: str, x_start_m: float, x_end_m: float, diameter_m: float, geometry: ShaftGeometry,
          check_from_m: float, check_to_m: float, fillet_m: float = 0.0, keyed: bool = False,
          larger_m: float = 0.0, larger_round: bool = True, feature_word: str = "none") -> Step:
    """``Step(...)`` with the same arguments (built without the field-by-field frozen ``__init__``)."""
    return built(Step, kind, label, x_start_m, x_end_m, diameter_m, geometry, check_from_m, check_to_m, fillet_m,
                 keyed, larger_m, larger_round, feature_word)


def _same(a: float, b: float) -> bool:
    return abs(a - b) <= 1e-9


def build_steps(plan: StepPlan, placed: Placed) -> tuple[list[Step], list[str]]:
    """The steps of one shaft along ``placed`` (see the module docstring for the defaults).

    Returns (steps, notes). Raises LayoutError naming the option for a layout that cannot be made.
    Moments are taken (check_from_m..check_to_m): seat over its length (to the bearing centre
    when no hub length is given); journals and the shoulders beside them at the bearing centre
    and the bearing face (the bearing width is assumed); the body over its whole length.
    """
    body = _plain_body(plan.body)
    notes: list[str] = []
    inscribed = inscribed_m(body)
    round_body = body.profile in ("round", "tube") and not body.flats
    if plan.as_bar:
        return _bar_steps(body, placed), ["run through as a bar (square-bore bearings and hubs): "
                                          "no journal, no keyseat"]
    journal = plan.journal_m if plan.journal_m is not None else (inscribed if round_body else None)
    seat = plan.seat_m
    if journal is None:
        journal = largest_turnable_journal_m(body)
        notes.append(f"no journal size known: the {body.profile} is taken turned to the largest journal it "
                     f"gives, {journal * 1000:.1f} mm (give --candidate-journal for the bearings' bore)")
    if seat is None:
        seat = inscribed if round_body else journal
    for size, field, what in ((journal, plan.journal_field, "journal"), (seat, plan.seat_field, "seat")):
        if size <= 0.0:
            raise LayoutError(field, "must be more than zero")
        if not round_body:
            _check_turn(plan, size, field, what)
        elif size > inscribed + 1e-9 or (body.profile == "tube" and size <= body.second_m):
            _check_turn(plan, size, field, what)
        elif not _same(size, inscribed) and not can_turn(body, size):
            notes.append(f"the {size * 1000:g} mm {what} leaves less than the {clean_up_allowance_m(size) * 1000:g} mm "
                         f"clean-up allowance on the {body.size_m * 1000:g} mm bar")
    fillet_given = plan.fillet_m
    for size, field in ((journal, plan.journal_field), (seat, plan.seat_field)):
        if fillet_given is not None and fillet_given >= size / 2.0:
            raise LayoutError(plan.fillet_field, f"{fillet_given * 1000:g} mm is not smaller than the radius of the "
                                                 f"{size * 1000:g} mm step it runs into")
    larger = circumscribed_m(body)
    b1, b2 = placed.bearing_x_m
    half_j = JOURNAL_LENGTH_PER_D * journal / 2.0
    steps: list[Step] = []

    def fillet_for(d_m: float) -> float:
        return fillet_given if fillet_given is not None else DEFAULT_FILLET_PER_D * d_m

    def shoulder(x: float, d_m: float, label: str, lo: float, hi: float, keyed: bool, word: str = "none",
                 big_m: float | None = None, big_round: bool | None = None):
        """A shoulder from the larger part (the body unless ``big_m``) down to ``d_m`` at x."""
        big = larger if big_m is None else big_m
        big_is_round = round_body if big_round is None else big_round
        stepped = not (_same(d_m, big) and big_is_round)
        if not stepped and word == "none":
            return
        steps.append(_step("shoulder", label, x, x, d_m, _turned(body, d_m, keyed), lo, hi,
                          fillet_m=fillet_for(d_m) if stepped else 0.0, keyed=keyed,
                          larger_m=big if stepped else d_m, larger_round=big_is_round, feature_word=word))

    seat_lo, seat_hi = placed.seat_m
    check_lo, check_hi = placed.seat_check_m
    keyed = plan.keyed_seat
    word = plan.body.shoulder
    seat_label = "hub seat" + (", keyseat" if keyed else "")
    seat_step = _step("seat", seat_label, seat_lo, seat_hi, seat, _turned(body, seat, keyed), check_lo, check_hi,
                     keyed=keyed)
    journal1 = _step("journal", "bearing 1 journal", b1 - half_j, b1 + half_j, journal, _turned(body, journal, False),
                    b1 - half_j, b1 + half_j)
    overhung = placed.layout.position == "overhung"
    end = b2 + half_j if b2 is not None else b1 + half_j + max(2.0 * larger, 0.1)
    if placed.driven_x_m is not None and placed.layout.driven.position == "far-end":
        end = max(end, placed.driven_x_m + half_j)
    if overhung:
        steps.append(seat_step)
        # the seat's inboard end: a shoulder to the body (or the typed stress raiser), taken where the seat is
        if seat_hi < b1 - half_j - 1e-9:
            shoulder(seat_hi, seat, "shoulder at the hub seat", check_hi, check_hi, keyed, word)
            steps.append(_step("body", "body between hub and bearing 1", seat_hi, b1 - half_j, inscribed, body,
                              seat_hi, b1 - half_j))
            shoulder(b1 - half_j, journal, "shoulder at bearing 1 (outboard)", b1 - half_j, b1, False)
        else:  # the seat runs into the journal: a shoulder only where their diameters differ
            small, big = sorted((seat, journal))
            shoulder(seat_hi, small, "shoulder at the hub seat", check_hi, max(check_hi, b1 - half_j),
                     keyed and _same(small, seat), word, big_m=big, big_round=True)
        steps.append(journal1)
        shoulder(b1 + half_j, journal, "shoulder at bearing 1", b1, b1 + half_j, False)
        body_end = (b2 - half_j) if b2 is not None else end
        steps.append(_step("body", "body between the bearings" if b2 is not None else "body past bearing 1",
                          b1 + half_j, body_end, inscribed, body, b1 + half_j, body_end))
    else:
        steps.append(journal1)
        shoulder(b1 + half_j, journal, "shoulder at bearing 1", b1, b1 + half_j, False)
        steps.append(_step("body", "body between bearing 1 and the hub", b1 + half_j, seat_lo, inscribed, body,
                          b1 + half_j, seat_lo))
        shoulder(seat_lo, seat, "shoulder at the hub seat", seat_lo, seat_lo, keyed, word)
        steps.append(seat_step)
        shoulder(seat_hi, seat, "shoulder at the hub seat (far side)", seat_hi, seat_hi, keyed)
        body_end = (b2 - half_j) if b2 is not None else seat_hi + max(2.0 * larger, 0.1)
        steps.append(_step("body", "body between the hub and bearing 2" if b2 is not None else "body past the hub",
                          seat_hi, body_end, inscribed, body, seat_hi, body_end))
        end = max(end, body_end)
    if b2 is not None:
        shoulder(b2 - half_j, journal, "shoulder at bearing 2", b2 - half_j, b2, False)
        steps.append(_step("journal", "bearing 2 journal", b2 - half_j, b2 + half_j, journal,
                          _turned(body, journal, False), b2 - half_j, b2 + half_j))
        if end > b2 + half_j + 1e-9:
            shoulder(b2 + half_j, journal, "shoulder at bearing 2 (outboard)", b2, b2 + half_j, False)
            steps.append(_step("body", "body past bearing 2", b2 + half_j, end, inscribed, body, b2 + half_j, end))
    return steps, notes


def _bar_steps(body: ShaftGeometry, placed: Placed) -> list[Step]:
    """The bar run through as it is: one body step over the whole shaft."""
    b1, b2 = placed.bearing_x_m
    size = inscribed_m(body)
    half = JOURNAL_LENGTH_PER_D * size / 2.0
    end = max(placed.length_m, (b2 if b2 is not None else b1) + half)
    return [_step("body", "bar through (square-bore units)", 0.0, end, size, body, 0.0, end)]
