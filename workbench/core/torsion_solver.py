"""Saint-Venant torsion of a prismatic bar of any polygonal section, by finite elements.

Method (Prandtl stress function; Timoshenko & Goodier, Theory of Elasticity, 3rd ed., McGraw-Hill
1970, §§101-103 and §115 for hollow sections). With twist per length theta and shear modulus G,
the stress function phi solves

    laplacian(phi) = -2 G theta   in the section,
    phi = 0 on the outer boundary, phi = C_k (constant) on the boundary of hole k,

the constants C_k fixed by the circulation condition  integral over hole k of d(phi)/dn ds = -2 G theta A_k
(A_k the area of the hole). The shear stresses are tau_xz = d(phi)/dy, tau_yz = -d(phi)/dx, so
|tau| = |grad phi|, and the torque is T = 2 integral(phi dA) + 2 sum C_k A_k = G theta J.
Solving with G theta = 1 gives J [m^4] directly and the peak shear per unit torque
tau_max / T = max|grad phi| / J [Pa per N m = 1/m^3].

Discretisation: quadratic (6-node) triangles on a conforming Delaunay mesh of the polygon, graded
towards short boundary features (fillets, keyseat corners). The hole constant is one extra unknown
carrying the load 2 A_k: minimising the complementary energy with phi = C_k on the hole then gives
the circulation condition as its natural condition. The magnitude |grad phi| is largest on the
boundary (it is subharmonic when laplacian(phi) is constant), so the peak is read from the
gradients at the element vertices, averaged over the elements that share each vertex.

numpy is imported at module level; scipy (Delaunay, sparse solver) only inside the solve, so
importing this module does not pull in scipy.
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from functools import lru_cache

import numpy as np

from workbench.core.geometry import ShaftGeometry

DEFAULT_RESOLUTION = 12
"""Mesh cells across the shorter side of the section's bounding box at the default resolution."""

_GRADING = 0.3  # growth of the mesh size away from a short boundary feature, per unit distance
_MAX_CONFORM_PASSES = 8


@dataclass(frozen=True)
class TorsionSolution:
    """Numerical torsion properties of one section.

    torsion_constant_m4:         J with T = G theta J  [m^4]
    shear_per_torque_Pa_per_Nm:  peak shear stress per unit torque, tau_max / T  [Pa/(N m) = 1/m^3]
    peak_location_m:             (x, y) where the peak occurs, in the profile's frame  [m]
    area_m2:                     net area of the meshed section  [m^2]
    method:                      one line naming the method and mesh size
    """

    torsion_constant_m4: float
    shear_per_torque_Pa_per_Nm: float
    peak_location_m: tuple[float, float]
    area_m2: float
    method: str
    element_count: int = 0
    node_count: int = 0
    _triangulation: object = field(default=None, repr=False, compare=False)
    _element_of_simplex: np.ndarray | None = field(default=None, repr=False, compare=False)
    _vertex_gradients: np.ndarray | None = field(default=None, repr=False, compare=False)
    _bounds_m: tuple[float, float, float, float] = field(default=(0.0, 0.0, 0.0, 0.0), repr=False,
                                                         compare=False)

    def shear_at(self, x_m: np.ndarray, y_m: np.ndarray) -> tuple[np.ndarray, np.ndarray]:
        """(inside mask, |tau|/T [1/m^3]) at points [m]; NaN/False outside the section.

        |tau| is interpolated linearly inside the element holding each point from the recovered
        vertex gradients (each the average over the elements sharing that vertex), so the field
        is continuous and never exceeds the reported peak.
        """
        x = np.asarray(x_m, dtype=float)
        y = np.asarray(y_m, dtype=float)
        shape = np.broadcast(x, y).shape
        pts = np.column_stack([np.broadcast_to(x, shape).ravel(), np.broadcast_to(y, shape).ravel()])
        tri = self._triangulation
        simplex = tri.find_simplex(pts)
        element = np.where(simplex >= 0, self._element_of_simplex[np.maximum(simplex, 0)], -1)
        inside = element >= 0
        tau = np.full(len(pts), np.nan)
        if inside.any():
            el = element[inside]
            s = simplex[inside]
            transform = tri.transform[s]  # barycentric transform of the Delaunay simplex
            b01 = np.einsum("nij,nj->ni", transform[:, :2, :], pts[inside] - transform[:, 2, :])
            bary = np.column_stack([b01, 1.0 - b01.sum(axis=1)])
            # order the barycentrics as the element's vertices (elements keep simplex vertex order)
            grad = np.einsum("nk,nkd->nd", bary, self._vertex_gradients[el])
            tau[inside] = np.hypot(grad[:, 0], grad[:, 1]) / self.torsion_constant_m4
        return inside.reshape(shape), tau.reshape(shape)

    def shear_on_grid(self, cols: int, rows: int) -> tuple[np.ndarray, np.ndarray]:
        """(inside mask, |tau|/T [1/m^3]) sampled at cell centres of a ``rows`` x ``cols`` grid.

        The grid covers the section's bounding box; row 0 is the top (largest y), column 0 the
        left (smallest x). Cells outside the section are False / NaN.
        """
        xs, ys = grid_centres_m(self._bounds_m, cols, rows)
        return self.shear_at(xs[np.newaxis, :], ys[:, np.newaxis])


def grid_centres_m(bounds_m: tuple[float, float, float, float], cols: int,
                   rows: int) -> tuple[np.ndarray, np.ndarray]:
    """Cell-centre x (left to right) and y (top to bottom) of a grid over a bounding box [m]."""
    if cols < 1 or rows < 1:
        raise ValueError("a grid needs at least one column and one row")
    x0, y0, x1, y1 = bounds_m
    xs = x0 + (np.arange(cols) + 0.5) * (x1 - x0) / cols
    ys = y1 - (np.arange(rows) + 0.5) * (y1 - y0) / rows
    return xs, ys


# --------------------------------------------------------------------------- public entry points


def solve_torsion(geometry: ShaftGeometry, resolution: int | None = None) -> TorsionSolution:
    """Torsion constant and peak shear per torque of a measured bar section (see module docstring).

    Results are cached per geometry and resolution; a repeat costs microseconds.
    """
    return _solve_geometry_cached(_geometry_key(geometry), resolution or DEFAULT_RESOLUTION)


def solve_polygon(outer, holes=(), resolution: int | None = None) -> TorsionSolution:
    """Torsion of a polygon: ``outer`` ring and ``holes`` as sequences of (x, y) [m].

    Rings may be open or closed (last point = first) and of either orientation. ``resolution``
    is the number of mesh cells across the shorter side of the bounding box (default
    DEFAULT_RESOLUTION); short boundary features get finer cells. Cached per input.
    """
    key = (_ring_key(outer), tuple(_ring_key(h) for h in holes))
    return _solve_rings_cached(key, int(resolution or DEFAULT_RESOLUTION))


def clear_cache() -> None:
    """Forget all cached solutions (for timing runs)."""
    _solve_rings_cached.cache_clear()
    _solve_geometry_cached.cache_clear()


def _ring_key(ring) -> tuple[tuple[float, float], ...]:
    pts = [(float(p[0]), float(p[1])) for p in ring]
    if len(pts) > 1 and pts[0] == pts[-1]:
        pts.pop()
    return tuple(pts)


_GEOMETRY_FIELDS = ("profile", "size_m", "second_m", "keyed", "key_standard", "key_width_m",
                    "key_depth_m", "key_radius_m", "flats", "flat_depth_m", "corner_radius_m",
                    "chamfer_m")


def _geometry_key(geometry: ShaftGeometry) -> ShaftGeometry:
    """The geometry with the fields that do not change the section (finish, shoulder) reset."""
    values = {name: getattr(geometry, name) for name in _GEOMETRY_FIELDS}
    return ShaftGeometry(**values)


@lru_cache(maxsize=128)
def _solve_geometry_cached(geometry: ShaftGeometry, resolution: int) -> TorsionSolution:
    from workbench.core.profiles import profile_polygon

    poly = profile_polygon(geometry)
    return solve_polygon(poly.outer, poly.holes, resolution)


@lru_cache(maxsize=128)
def _solve_rings_cached(key, resolution: int) -> TorsionSolution:
    outer, holes = key
    return _solve(outer, holes, resolution)


# --------------------------------------------------------------------------- geometry helpers


def _prepare_ring(ring) -> np.ndarray:
    pts = np.asarray(ring, dtype=float)
    if pts.ndim != 2 or pts.shape[1] != 2:
        raise ValueError("a ring is a sequence of (x, y) points")
    if len(pts) > 1 and np.allclose(pts[0], pts[-1]):
        pts = pts[:-1]
    keep = np.ones(len(pts), dtype=bool)
    keep[1:] = np.hypot(*(pts[1:] - pts[:-1]).T) > 0
    pts = pts[keep]
    if len(pts) < 3:
        raise ValueError("a ring needs at least three distinct points")
    return pts


def _signed_area(ring: np.ndarray) -> float:
    x, y = ring[:, 0], ring[:, 1]
    return 0.5 * float(np.dot(x, np.roll(y, -1)) - np.dot(np.roll(x, -1), y))


def _inside(points: np.ndarray, rings: list[np.ndarray]) -> np.ndarray:
    """Even-odd point-in-polygon test of points (N, 2) against all rings (vectorised ray cast)."""
    px = points[:, 0:1]
    py = points[:, 1:2]
    crossings = np.zeros(len(points), dtype=np.int64)
    for ring in rings:
        x0, y0 = ring[:, 0], ring[:, 1]
        x1, y1 = np.roll(x0, -1), np.roll(y0, -1)
        straddle = (y0 > py) != (y1 > py)
        with np.errstate(divide="ignore", invalid="ignore"):
            x_cross = x0 + (py - y0) * (x1 - x0) / (y1 - y0)
        crossings += np.count_nonzero(straddle & (px < x_cross), axis=1)
    return crossings % 2 == 1


class _SizeField:
    """Target mesh size [m]: h0, finer near polygon vertices whose adjacent edges are short."""

    def __init__(self, rings: list[np.ndarray], h0: float):
        self.h0 = h0
        centres, sizes = [], []
        for ring in rings:
            edge = np.hypot(*(np.roll(ring, -1, axis=0) - ring).T)
            local = np.minimum(edge, np.roll(edge, 1))
            fine = local < h0
            centres.append(ring[fine])
            sizes.append(local[fine])
        self.centres = np.concatenate(centres) if centres else np.empty((0, 2))
        self.sizes = np.concatenate(sizes) if sizes else np.empty(0)

    def __call__(self, points: np.ndarray) -> np.ndarray:
        out = np.full(len(points), self.h0)
        if len(self.centres) == 0 or len(points) == 0:
            return out
        chunk = max(1, 2_000_000 // len(self.centres))
        for start in range(0, len(points), chunk):
            p = points[start:start + chunk]
            d = np.hypot(p[:, None, 0] - self.centres[None, :, 0], p[:, None, 1] - self.centres[None, :, 1])
            out[start:start + chunk] = np.minimum(self.h0, (self.sizes[None, :] + _GRADING * d).min(axis=1))
        return out


def _boundary_points(rings: list[np.ndarray], size: _SizeField) -> tuple[np.ndarray, np.ndarray, list]:
    """Points along every ring, edges split until no piece is longer than the local size.

    Returns (points, ring id per point, segments per ring as index pairs into points).
    """
    all_pts, ring_ids, segments = [], [], []
    offset = 0
    for k, ring in enumerate(rings):
        pieces = []
        nxt = np.roll(ring, -1, axis=0)
        for a, b in zip(ring, nxt):
            ts = [0.0, 1.0]
            # bisect until every piece fits the size at its midpoint
            while True:
                t = np.asarray(ts)
                mids = 0.5 * (t[:-1] + t[1:])
                mid_pts = a + np.outer(mids, b - a)
                length = (t[1:] - t[:-1]) * math.dist(a, b)
                split = length > 1.0 * size(mid_pts)
                if not split.any():
                    break
                ts = sorted(set(ts) | set(mids[split].tolist()))
            t = np.asarray(ts[:-1])
            pieces.append(a + np.outer(t, b - a))
        pts = np.concatenate(pieces)
        n = len(pts)
        all_pts.append(pts)
        ring_ids.append(np.full(n, k))
        idx = offset + np.arange(n)
        segments.append(np.column_stack([idx, np.roll(idx, -1)]))
        offset += n
    return np.concatenate(all_pts), np.concatenate(ring_ids), segments


def _interior_points(rings: list[np.ndarray], size: _SizeField, boundary: np.ndarray) -> np.ndarray:
    """Centres of a quadtree whose cells are no larger than the local size, away from the edge."""
    from scipy.spatial import cKDTree

    lo = np.min([r.min(axis=0) for r in rings], axis=0)
    hi = np.max([r.max(axis=0) for r in rings], axis=0)
    h0 = size.h0
    nx = max(1, int(math.ceil((hi[0] - lo[0]) / h0)))
    ny = max(1, int(math.ceil((hi[1] - lo[1]) / h0)))
    cell = max((hi[0] - lo[0]) / nx, (hi[1] - lo[1]) / ny)
    gx, gy = np.meshgrid(lo[0] + (np.arange(nx) + 0.5) * cell, lo[1] + (np.arange(ny) + 0.5) * cell)
    centres = np.column_stack([gx.ravel(), gy.ravel()])
    leaves = []
    while len(centres):
        split = cell > 1.05 * size(centres)
        leaves.append((centres[~split], cell))
        c = centres[split]
        cell /= 2.0
        q = cell / 2.0
        centres = np.concatenate([c + [-q, -q], c + [q, -q], c + [-q, q], c + [q, q]]) if len(c) else c
    pts = np.concatenate([p for p, _ in leaves])
    sizes = np.concatenate([np.full(len(p), s) for p, s in leaves])
    inside = _inside(pts, rings)
    pts, sizes = pts[inside], sizes[inside]
    dist, _ = cKDTree(boundary).query(pts)
    return pts[dist > 0.55 * sizes]


def _mesh(rings: list[np.ndarray], h0: float):
    """Conforming Delaunay mesh of the polygon: (points, triangles, ring id per point or -1, delaunay, map)."""
    from scipy.spatial import Delaunay

    size = _SizeField(rings, h0)
    boundary, ring_ids, segments = _boundary_points(rings, size)
    interior = _interior_points(rings, size, boundary)
    segs = np.concatenate(segments)
    for _ in range(_MAX_CONFORM_PASSES):
        points = np.concatenate([boundary, interior])
        tri = Delaunay(points)
        simp = tri.simplices
        centroid = points[simp].mean(axis=1)
        keep = _inside(centroid, rings)
        e = points[simp[:, 1]] - points[simp[:, 0]]
        f = points[simp[:, 2]] - points[simp[:, 0]]
        area2 = e[:, 0] * f[:, 1] - e[:, 1] * f[:, 0]
        keep &= np.abs(area2) > 1e-10 * h0 * h0
        kept = simp[keep]
        edges = np.sort(np.concatenate([kept[:, [0, 1]], kept[:, [1, 2]], kept[:, [2, 0]]]), axis=1)
        n = len(points)
        seg_sorted = np.sort(segs, axis=1)
        missing = ~np.isin(seg_sorted[:, 0] * n + seg_sorted[:, 1], edges[:, 0] * n + edges[:, 1])
        if not missing.any():
            break
        # split each missing segment at its midpoint and drop interior points in its diametral circle
        bad = segs[missing]
        mids = 0.5 * (boundary[bad[:, 0]] + boundary[bad[:, 1]])
        radius = 0.5 * np.hypot(*(boundary[bad[:, 1]] - boundary[bad[:, 0]]).T)
        if len(interior):
            d = np.hypot(interior[:, None, 0] - mids[None, :, 0], interior[:, None, 1] - mids[None, :, 1])
            interior = interior[~(d <= 1.01 * radius[None, :]).any(axis=1)]
        boundary, ring_ids, segs = _insert_midpoints(boundary, ring_ids, segs, missing)
    else:
        raise RuntimeError("could not build a mesh that follows the section boundary")
    element_of_simplex = np.full(len(simp), -1, dtype=np.int64)
    element_of_simplex[np.flatnonzero(keep)] = np.arange(int(keep.sum()))
    point_ring = np.concatenate([ring_ids, np.full(len(interior), -1)])
    # orient elements counter-clockwise is not needed: the formulas use |det| and signed gradients
    return points, kept, point_ring, tri, element_of_simplex


def _insert_midpoints(boundary, ring_ids, segs, missing):
    """Add the midpoint of each missing boundary segment, keeping the segment list consistent."""
    new_pts = [boundary]
    new_ids = [ring_ids]
    new_segs = [segs[~missing]]
    n = len(boundary)
    for j, (a, b) in enumerate(segs[missing]):
        m = n + j
        new_pts.append(0.5 * (boundary[a] + boundary[b])[None, :])
        new_ids.append(np.array([ring_ids[a]]))
        new_segs.append(np.array([[a, m], [m, b]]))
    return np.concatenate(new_pts), np.concatenate(new_ids), np.concatenate(new_segs)


# --------------------------------------------------------------------------- quadratic elements


def _solve(outer, holes, resolution: int) -> TorsionSolution:
    from scipy.sparse import coo_matrix
    from scipy.sparse.linalg import spsolve

    if resolution < 2:
        raise ValueError("resolution must be at least 2")
    rings = [_prepare_ring(outer)] + [_prepare_ring(h) for h in holes]
    lo = rings[0].min(axis=0)
    hi = rings[0].max(axis=0)
    h0 = float(min(hi - lo)) / resolution
    points, tris, point_ring, tri, element_of_simplex = _mesh(rings, h0)

    # midside nodes: one per unique edge
    n_vert = len(points)
    e_all = np.concatenate([tris[:, [0, 1]], tris[:, [1, 2]], tris[:, [2, 0]]])
    e_sorted = np.sort(e_all, axis=1)
    codes = e_sorted[:, 0] * n_vert + e_sorted[:, 1]
    uniq, edge_index, edge_count = np.unique(codes, return_inverse=True, return_counts=True)
    n_edges = len(uniq)
    ea, eb = uniq // n_vert, uniq % n_vert
    n_el = len(tris)
    mids = (n_vert + edge_index).reshape(3, n_el).T  # element's midside nodes on edges 01, 12, 20
    conn = np.column_stack([tris, mids])  # 6 nodes per element
    n_nodes = n_vert + n_edges

    # which ring each node lies on: boundary edges are those used by one element only
    node_ring = np.full(n_nodes, -1)
    node_ring[:n_vert] = point_ring
    boundary_edge = edge_count == 1
    ring_of_edge = np.where(boundary_edge, np.maximum(point_ring[ea], point_ring[eb]), -1)
    node_ring[n_vert:] = ring_of_edge
    # a vertex flagged as a ring point always lies on that ring; interior vertices stay -1

    # degrees of freedom: free nodes, then one per hole; outer boundary fixed at zero
    free = node_ring == -1
    dof = np.full(n_nodes, -1)
    n_free = int(free.sum())
    dof[free] = np.arange(n_free)
    n_holes = len(rings) - 1
    for k in range(1, len(rings)):
        dof[node_ring == k] = n_free + k - 1
    n_dof = n_free + n_holes

    # element geometry: barycentric gradients
    p = points[tris]
    x, y = p[:, :, 0], p[:, :, 1]
    det = (x[:, 1] - x[:, 0]) * (y[:, 2] - y[:, 0]) - (x[:, 2] - x[:, 0]) * (y[:, 1] - y[:, 0])
    area = 0.5 * np.abs(det)
    dl = np.empty((n_el, 3, 2))  # d(lambda_i)/d(x, y)
    for i in range(3):
        j, k = (i + 1) % 3, (i + 2) % 3
        dl[:, i, 0] = (y[:, j] - y[:, k]) / det
        dl[:, i, 1] = (x[:, k] - x[:, j]) / det

    def shape_gradients(lam):
        """(n_el, 6, 2) gradients of the 6 quadratic shape functions at barycentric point lam."""
        l0, l1, l2 = lam
        g = np.empty((n_el, 6, 2))
        g[:, 0] = (4 * l0 - 1) * dl[:, 0]
        g[:, 1] = (4 * l1 - 1) * dl[:, 1]
        g[:, 2] = (4 * l2 - 1) * dl[:, 2]
        g[:, 3] = 4 * (l0 * dl[:, 1] + l1 * dl[:, 0])
        g[:, 4] = 4 * (l1 * dl[:, 2] + l2 * dl[:, 1])
        g[:, 5] = 4 * (l2 * dl[:, 0] + l0 * dl[:, 2])
        return g

    # stiffness: the integrand is quadratic, the 3-point edge-midpoint rule is exact
    ke = np.zeros((n_el, 6, 6))
    for lam in ((0.5, 0.5, 0.0), (0.0, 0.5, 0.5), (0.5, 0.0, 0.5)):
        g = shape_gradients(lam)
        ke += np.einsum("eid,ejd->eij", g, g)
    ke *= (area / 3.0)[:, None, None]
    # load 2 * integral(N_i): zero for vertex nodes, area/3 for midside nodes
    fe = np.zeros((n_el, 6))
    fe[:, 3:] = 2.0 * area[:, None] / 3.0

    ed = dof[conn]
    rows = np.repeat(ed, 6, axis=1).ravel()
    cols = np.tile(ed, (1, 6)).ravel()
    vals = ke.ravel()
    use = (rows >= 0) & (cols >= 0)
    k_mat = coo_matrix((vals[use], (rows[use], cols[use])), shape=(n_dof, n_dof)).tocsc()
    load = np.zeros(n_dof)
    fd = ed.ravel()
    np.add.at(load, fd[fd >= 0], fe.ravel()[fd >= 0])
    hole_areas = [abs(_signed_area(r)) for r in rings[1:]]
    for k, a_hole in enumerate(hole_areas):
        load[n_free + k] += 2.0 * a_hole
    phi_dof = spsolve(k_mat, load) if n_dof else np.zeros(0)
    torsion_constant = float(load @ phi_dof)  # = 2 int(phi) + 2 sum C_k A_k

    phi = np.zeros(n_nodes)
    phi[dof >= 0] = phi_dof[dof[dof >= 0]]
    phi_el = phi[conn]
    # gradient at the three vertices of every element (linear inside the element)
    vertex_grad = np.empty((n_el, 3, 2))
    for i, lam in enumerate(((1.0, 0.0, 0.0), (0.0, 1.0, 0.0), (0.0, 0.0, 1.0))):
        vertex_grad[:, i] = np.einsum("ei,eid->ed", phi_el, shape_gradients(lam))

    # peak: vertex gradients averaged over the elements sharing the vertex
    summed = np.zeros((n_vert, 2))
    count = np.zeros(n_vert)
    np.add.at(summed, tris.ravel(), vertex_grad.reshape(-1, 2))
    np.add.at(count, tris.ravel(), 1.0)
    nodal = summed / np.maximum(count, 1)[:, None]
    magnitude = np.hypot(nodal[:, 0], nodal[:, 1])
    at = int(np.argmax(magnitude))
    peak = float(magnitude[at]) / torsion_constant

    area_total = float(area.sum())
    net_area = abs(_signed_area(rings[0])) - sum(hole_areas)
    if abs(area_total - net_area) > 1e-9 * max(net_area, 1e-30) + 1e-12 * h0 * h0:
        raise RuntimeError("the mesh does not cover the section exactly")

    # the Delaunay simplex order matches tris, so nodal[tris] rows line up with barycentrics
    x0, y0 = rings[0].min(axis=0)
    x1, y1 = rings[0].max(axis=0)
    return TorsionSolution(
        torsion_constant_m4=torsion_constant,
        shear_per_torque_Pa_per_Nm=peak,
        peak_location_m=(float(points[at, 0]), float(points[at, 1])),
        area_m2=area_total,
        method=f"finite elements, 6-node triangles, {n_el} elements",
        element_count=n_el,
        node_count=n_nodes,
        _triangulation=tri,
        _element_of_simplex=element_of_simplex,
        _vertex_gradients=nodal[tris],
        _bounds_m=(float(x0), float(y0), float(x1), float(y1)),
    )
