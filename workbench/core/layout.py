"""Where things sit along the shaft: bearings, the driving element, an optional driven element;
the side loads they put on the shaft, the bearing reactions, and the bending-moment and torque
diagrams along its axis.

Axis: x [m] runs along the shaft from its driving end (x = 0). Bearing 1 is the bearing nearest the
driving element; bearing 2 is ``bearing_span_m`` further on (centre to centre). All side loads act in
ONE plane and add: the belt/chain/gear pull and the elements' weights are taken in the same
direction, the conservative combination when their directions are not known. The shaft is a beam
on two simple supports at the bearing centres (statics; Shigley's Mechanical Engineering Design,
9th ed., Table A-9, cases 1, 4 and 10 for the single loads this superposes).

Where a fitter gives less, the conservative place is used and said so (``Layout.notes``):
- no bearing span: the moment beyond bearing 1 is held at its bearing-1 value (it falls to zero at
  bearing 2 in truth); an element between the bearings is taken as a cantilever from bearing 1,
  M = F b, which is above F b (L - b) / L for any span L;
- no hub length: the hub seat may reach the bearing, so it is checked at the bearing-centre moment;
- no element mass: no weight (today's overhung moment M = F a exactly).
Pure SI floats; no pint, no printing.
"""

from __future__ import annotations

from dataclasses import dataclass, field

GRAVITY_M_S2 = 9.80665  # standard gravity (ISO 80000-3)
POSITIONS = ("overhung", "between")
DRIVEN_POSITIONS = ("between", "far-end")


class LayoutError(ValueError):
    """A layout that cannot be built; ``field`` is the job input key that is wrong."""

    def __init__(self, field: str, message: str) -> None:
        super().__init__(f"{field}: {message}")
        self.field = field
        self.message = message


@dataclass(frozen=True)
class DrivenElement:
    """The driven element (a drum between the bearings, a fan wheel on the far end).

    position:   "between" (distance from bearing 1) or "far-end" (overhung beyond bearing 2)
    distance_m: between: bearing-1 centre to its load line; far-end: bearing-2 centre to its load line [m]
    mass_kg:    its mass [kg] (its weight is a side load and, with the mass, enters the critical speed)
    radial_load_N: its own radial load (belt pull, process load) [N], beside its weight
    The torque flows from the driving element to the driven element; beyond it the shaft carries none.
    """

    position: str
    distance_m: float
    mass_kg: float = 0.0
    radial_load_N: float = 0.0


@dataclass(frozen=True)
class Layout:
    """The layout as given (None = not given).

    position:   "overhung" (today's case: beyond bearing 1) or "between" the bearings
    overhang_m: overhung: bearing-1 centre to the element's load line [m]; None = the hub right
                beside the bearing (a coupling: half the hub plus half the bearing width)
    load_from_bearing_m: between: bearing-1 centre to the element's load line [m]
    bearing_span_m: bearing centre to centre [m]
    bearing_type: key of data/bearing_slopes.csv, for the slope limit
    hub_length_m: the driving element's hub length = its seat length [m]
    element_mass_kg: the driving element's mass [kg]
    driven:     the driven element, if given
    """

    position: str = "overhung"
    overhang_m: float | None = 0.0
    load_from_bearing_m: float | None = None
    bearing_span_m: float | None = None
    bearing_type: str | None = None
    hub_length_m: float | None = None
    element_mass_kg: float = 0.0
    driven: DrivenElement | None = None


@dataclass(frozen=True)
class Placed:
    """The layout placed along x [m], with the notes on every default used."""

    layout: Layout
    load_x_m: float  # driving element's load line
    bearing_x_m: tuple[float, float | None]
    seat_m: tuple[float, float]  # the driving element's hub seat (x_start, x_end)
    seat_check_m: tuple[float, float]  # where the seat is checked (to the bearing when no hub length)
    driven_x_m: float | None
    length_m: float  # the shaft's length as drawn
    notes: tuple[str, ...] = field(default=())

    @property
    def span_known(self) -> bool:
        return self.bearing_x_m[1] is not None


def place(layout: Layout, journal_length_m: float) -> Placed:
    """Positions along x of the bearings, the seat and the loads; raises LayoutError naming the input.

    ``journal_length_m`` is the assumed bearing width, used for drawing and for the length of the
    journals only (moments at a journal and at its shoulders are taken at the bearing centre).
    """
    notes: list[str] = []
    span = layout.bearing_span_m
    hub = layout.hub_length_m
    half_j = journal_length_m / 2.0
    if span is not None and span <= journal_length_m:
        raise LayoutError("bearing_span", f"{span * 1000:g} mm is not more than the bearing width assumed "
                                          f"({journal_length_m * 1000:g} mm)")
    if layout.position == "overhung":
        a = layout.overhang_m
        if a is None:
            a = (hub / 2.0 + half_j) if hub is not None else 0.0
        if hub is not None and hub / 2.0 > a:
            raise LayoutError("hub_length", f"a {hub * 1000:g} mm hub centred {a * 1000:g} mm from the bearing "
                                            "centre would run past the bearing (check --overhang)")
        load_x = hub / 2.0 if hub is not None else 0.0
        b1 = load_x + a
        seat = (0.0, hub if hub is not None else max(b1 - half_j, 0.0))
    elif layout.position == "between":
        b = layout.load_from_bearing_m
        if b is None:
            if span is None:
                raise LayoutError("element_position", "between needs --load-from-bearing (bearing 1 to the "
                                                      "element's load line) or --bearing-span (taken at mid-span)")
            b = span / 2.0
            notes.append("element between the bearings with no distance given: taken at mid-span, "
                         "where its moment is largest")
        if span is not None and b >= span:
            raise LayoutError("load_from_bearing", f"{b * 1000:g} mm is not between the bearings "
                                                   f"(span {span * 1000:g} mm)")
        b1 = half_j
        load_x = b1 + b
        h = hub if hub is not None else 0.0
        if hub is not None and (load_x - h / 2.0 < b1 + half_j - 1e-12
                                or (span is not None and load_x + h / 2.0 > b1 + span - half_j + 1e-12)):
            raise LayoutError("hub_length", f"a {hub * 1000:g} mm hub at {b * 1000:g} mm from the bearing "
                                            "runs into a bearing")
        seat = (load_x - h / 2.0, load_x + h / 2.0)
    else:
        raise LayoutError("element_position", f"unknown {layout.position!r}; expected overhung or between")
    if hub is not None and span is not None and hub >= span:
        raise LayoutError("hub_length", f"{hub * 1000:g} mm is not shorter than the bearing span {span * 1000:g} mm")
    b2 = None if span is None else b1 + span
    if hub is None:
        notes.append("--hub-length: none given, the hub seat is checked at the bearing-centre moment "
                     "(conservative) and the key's safety factors are not computed")
        seat_check = (seat[0], b1) if layout.position == "overhung" else seat
    else:
        seat_check = seat
    if span is None:
        notes.append("--bearing-span: none given, moments past bearing 1 are held at their largest value "
                     "(conservative); deflection, slopes and critical speed not computed")
    driven_x = None
    if layout.driven is not None:
        if b2 is None:
            raise LayoutError("bearing_span", "is needed to place the driven element")
        d = layout.driven
        if d.position == "between":
            if not 0.0 < d.distance_m < span:
                raise LayoutError("driven_from_bearing", f"{d.distance_m * 1000:g} mm is not between the bearings "
                                                         f"(span {span * 1000:g} mm)")
            driven_x = b1 + d.distance_m
        elif d.position == "far-end":
            driven_x = b2 + d.distance_m
        else:
            raise LayoutError("driven_position", f"unknown {d.position!r}; expected between or far-end")
    end = max(x for x in (b1 + half_j, b2 + half_j if b2 is not None else 0.0, seat[1], driven_x or 0.0))
    if driven_x is not None and layout.driven.position == "far-end":
        end = max(end, driven_x + half_j)
    return Placed(layout, load_x, (b1, b2), seat, seat_check, driven_x, end, tuple(notes))


@dataclass(frozen=True)
class SideLoads:
    """The side loads in the one plane [N] for one torque level."""

    driving_N: float  # pull of the driving element (2 T K / D), scales with the torque
    driving_weight_N: float
    driven_N: float  # driven element's radial load + weight


def point_loads(placed: Placed, loads: SideLoads) -> list[tuple[float, float]]:
    """(x [m], force [N]) of every transverse load, all in one direction."""
    out = [(placed.load_x_m, loads.driving_N + loads.driving_weight_N)]
    if placed.driven_x_m is not None and loads.driven_N:
        out.append((placed.driven_x_m, loads.driven_N))
    return out


def reactions_N(placed: Placed, forces: list[tuple[float, float]]) -> tuple[float, float] | None:
    """Bearing reactions (R1, R2) [N] of a beam on two simple supports (statics), or None with no span.

    Positive = opposite to the loads. Sum of forces and of moments about bearing 1 vanish:
    R2 = sum F_i (x_i - x1) / L, R1 = sum F_i - R2.
    """
    b1, b2 = placed.bearing_x_m
    if b2 is None:
        return None
    span = b2 - b1
    r2 = sum(f * (x - b1) for x, f in forces) / span
    return sum(f for _, f in forces) - r2, r2


def moment_at_Nm(placed: Placed, forces: list[tuple[float, float]], x_m: float) -> float:
    """Bending moment magnitude |M(x)| [N*m] from the loads and bearing reactions.

    With the span: M(x) = sum over loads and reactions left of x of F (x - x_F) (statics).
    Without it (overhung driving element only), M = F (x - x_load) up to bearing 1 and held at its
    bearing-1 value F a beyond (conservative); an element between the bearings is taken as a
    cantilever from bearing 1, M = F b over the whole span (conservative).
    """
    return MomentLine(placed, forces).at(x_m)


class MomentLine:
    """The bending-moment diagram of one set of loads, with its reactions worked out once."""

    __slots__ = ("placed", "forces", "terms")

    def __init__(self, placed: Placed, forces: list[tuple[float, float]]) -> None:
        self.placed = placed
        self.forces = forces
        b1, b2 = placed.bearing_x_m
        if b2 is None:
            self.terms = None
        else:
            r1, r2 = reactions_N(placed, forces)
            self.terms = sorted([*forces, (b1, -r1), (b2, -r2)])

    def at(self, x_m: float) -> float:
        """|M(x)| [N*m] (see :func:`moment_at_Nm`)."""
        if self.terms is None:
            placed = self.placed
            b1 = placed.bearing_x_m[0]
            x_load, force = self.forces[0]
            if placed.layout.position == "overhung":
                return abs(force) * max(0.0, min(x_m, b1) - x_load)
            return abs(force) * abs(x_load - b1) if x_m >= b1 else 0.0
        total = 0.0
        for x, f in self.terms:
            if x >= x_m:
                break
            total += f * (x_m - x)
        return abs(total)

    def max_over(self, x_lo: float, x_hi: float) -> float:
        """Largest |M| over [x_lo, x_hi] [N*m]: the diagram is piecewise linear, so the largest value
        is at an end or at a load or support inside."""
        at = self.at
        best = at(x_lo)
        value = at(x_hi)
        if value > best:  # max(), keeping the first of equals
            best = value
        terms = self.terms
        for x, _ in (terms if terms is not None else self.forces):
            if x_lo < x < x_hi:
                value = at(x)
                if value > best:
                    best = value
        if terms is None:
            b1 = self.placed.bearing_x_m[0]
            if x_lo < b1 < x_hi:
                value = at(b1)
                if value > best:
                    best = value
        return best


def max_moment_Nm(placed: Placed, forces: list[tuple[float, float]], x_lo: float, x_hi: float) -> float:
    """Largest |M| over [x_lo, x_hi] [N*m] (see :meth:`MomentLine.max_over`)."""
    return MomentLine(placed, forces).max_over(x_lo, x_hi)


def torque_fraction(placed: Placed, x_lo: float, x_hi: float) -> float:
    """Share of the transmitted torque carried over [x_lo, x_hi] (1 or 0).

    The torque enters at the driving element's seat and leaves at the driven element; with no driven
    element given, the whole shaft is taken to carry it (conservative). Over a hub seat itself the
    full torque is taken (the torque builds up along the seat; its end carries all of it).
    """
    seat_lo, seat_hi = placed.seat_m
    if placed.driven_x_m is None:
        return 1.0
    low, high = sorted((seat_lo, placed.driven_x_m))
    return 1.0 if x_hi >= low - 1e-12 and x_lo <= high + 1e-12 else 0.0


def moment_diagram(placed: Placed, forces: list[tuple[float, float]], torque_Nm: float, points: int = 0):
    """(x_m, moment_Nm, torque_Nm) lists along the shaft, with every break point of the diagram."""
    xs = {0.0, placed.length_m, placed.load_x_m, *placed.seat_m}
    xs.update(b for b in placed.bearing_x_m if b is not None)
    if placed.driven_x_m is not None:
        xs.add(placed.driven_x_m)
    if points:
        xs.update(placed.length_m * i / points for i in range(points + 1))
    ordered = sorted(x for x in xs if 0.0 <= x <= placed.length_m)
    line = MomentLine(placed, forces)
    moments = [line.at(x) for x in ordered]
    torques = [torque_Nm * torque_fraction(placed, x, x) for x in ordered]
    return ordered, moments, torques
