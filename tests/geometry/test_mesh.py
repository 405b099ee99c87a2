"""The triangle mesh of a revolved profile against published formulas and trimesh.

References, named beside each check:

* CRC *Standard Mathematical Tables and Formulae* (from memory): torus,
  sphere, paraboloid of revolution, right circular cone, circular sector;
* Pappus–Guldinus (Stewart, *Calculus*, "Moments and centers of mass", from
  memory) for sections whose area and centroid are elementary;
* reference library trimesh (``trimesh.Trimesh(...).volume``, ``.area``,
  ``.is_watertight``, ``.is_winding_consistent``, ``.area_faces``) measuring the
  mesh independently of :class:`revolve.geometry.mesh.TriangleMesh`;
* reference library shapely (``Polygon.area``, ``unary_union``) for the
  triangulation of cut faces, and (``Polygon.area``, ``Polygon.centroid``)
  with Pappus for polyline sections;
* area of a regular n-gon inscribed in a circle, n/2 r² sin(2π/n) (CRC, from
  memory): a straight profile swept in n equal steps keeps exactly that
  fraction of the volume.

A mesh's volume must *converge* to the exact value: each check runs several
tolerances and looks at the trend (the error shrinks in proportion to the
chord tolerance), never at one mesh alone.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import sympy
import trimesh
from shapely.geometry import Polygon
from shapely.ops import unary_union

from revolve.errors import ProfileError, RevolveError
from revolve.geometry.mesh import (CUT_FACE_END, CUT_FACE_START, MOST_STEPS, chord_steps,
                                   flatten_segment, revolve_mesh, signed_area,
                                   triangulate_section)
from revolve.geometry.profile import Axis, Chain, Loop, Profile, Revolution
from revolve.geometry.measure import measure
from revolve.geometry.segments import Line, Polyline, arc_from_centre, curve_from_expressions

T = sympy.Symbol("t", real=True)
TOLERANCES = (0.04, 0.02, 0.01, 0.005, 0.0025)


def circle(cx, cy, r, face=None):
    """A full circle as two half arcs, anticlockwise."""
    return Loop((arc_from_centre((cx + r, cy), (cx - r, cy), (cx, cy), False, face=face),
                 arc_from_centre((cx - r, cy), (cx + r, cy), (cx, cy), False, face=face)))


def sphere_profile(r):
    """Half disc on the x axis: the arc, then the diameter along the axis."""
    return Profile(loops=(Loop((arc_from_centre((r, 0.0), (-r, 0.0), (0.0, 0.0), False, face="sphere"),
                                Line((-r, 0.0), (r, 0.0), face="axis"))),))


def reference(mesh) -> trimesh.Trimesh:
    """The same triangles handed to trimesh (no merging or repair, so nothing is hidden)."""
    return trimesh.Trimesh(mesh.vertices, mesh.triangles, process=False)


def relative_errors(revolution, exact_volume, exact_area, tolerances=TOLERANCES):
    out = []
    for tol in tolerances:
        tm = reference(revolve_mesh(revolution, tol))
        out.append(((tm.volume - exact_volume) / exact_volume, (tm.area - exact_area) / exact_area))
    return np.array(out)


def assert_converges_linearly(errors, tolerances=TOLERANCES, what=""):
    """|error| falls with the tolerance, roughly in proportion (error / tolerance about constant)."""
    e = np.abs(np.asarray(errors, dtype=float))
    assert np.all(np.diff(e) < 0), f"{what}: errors do not shrink: {e}"
    ratio = e / np.asarray(tolerances)
    assert ratio.max() / ratio.min() < 2.0, f"{what}: error not proportional to tolerance: {ratio}"


# -- closed, oriented, converging ------------------------------------------------------

@pytest.mark.parametrize("axis", [Axis.x(), Axis((-1.0, 0.5), (0.6, -0.8))], ids=["x", "tilted"])
def test_torus_converges_to_crc(axis):
    # Torus, tube radius r = 1 at R = 3 from the axis (the circle drawn at distance 3 from
    # whichever axis): CRC (from memory) V = 2π² R r², S = 4π² R r.
    ux, uy = axis.unit_direction()
    px, py = axis.point
    cx, cy = px + 3 * -uy, py + 3 * ux  # 3 to the left of the axis
    rev = Revolution(Profile(loops=(circle(cx, cy, 1.0, "tube"),)), axis)
    errs = relative_errors(rev, 2 * math.pi ** 2 * 3, 4 * math.pi ** 2 * 3)
    assert np.all(errs < 0)  # an inscribed mesh of a convex tube is inside it
    assert_converges_linearly(errs[:, 0], what="torus volume")
    assert_converges_linearly(errs[:, 1], what="torus area")
    # Leading order: an inscribed polygon of sagitta s keeps 1 − (4/3) s / ρ of a circle's
    # area (CRC circular segment, expanded); the tube (ρ = 1) and the sweep (ρ = 4, the
    # largest radius) each lose that much at most, s ≤ tol/2 (each takes half the budget).
    bound = 4 / 3 * np.array(TOLERANCES) / 2 * (1 / 1 + 1 / 4)
    assert np.all(np.abs(errs[:, 0]) <= 1.02 * bound)
    assert np.all(np.abs(errs[:, 0]) >= 0.3 * bound)


def test_torus_mesh_is_closed_and_outward():
    rev = Revolution(Profile(loops=(circle(0.0, 3.0, 1.0),)), Axis.x())
    mesh = revolve_mesh(rev, 0.01)
    tm = reference(mesh)
    assert tm.is_watertight and tm.is_winding_consistent          # trimesh
    assert tm.volume > 0                                            # normals point outwards
    assert mesh.open_edge_count() == 0 and mesh.is_consistently_oriented()
    assert math.isclose(mesh.volume(), tm.volume, rel_tol=1e-12)    # our sum agrees with trimesh
    assert math.isclose(mesh.area(), tm.area, rel_tol=1e-12)
    # Every outward normal points away from the tube's centre circle (trimesh face normals).
    centres = tm.triangles_center
    ring = centres.copy()
    rho = np.hypot(centres[:, 1], centres[:, 2])
    ring[:, 1:] = centres[:, 1:] * (3.0 / rho)[:, None]
    ring[:, 0] = 0.0
    assert np.all(np.einsum("ij,ij->i", tm.face_normals, centres - ring) > 0)


@pytest.mark.parametrize("r", [1.0, 2.5])
def test_sphere_axis_points_collapse(r):
    # CRC (from memory): V = 4/3 π r³, S = 4 π r².
    rev = Revolution(sphere_profile(r), Axis.x())
    mesh = revolve_mesh(rev, 0.005 * r)
    tm = reference(mesh)
    assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0
    # The two poles are single vertices; nothing of zero area is left in.
    on_axis = np.hypot(mesh.vertices[:, 1], mesh.vertices[:, 2]) == 0
    assert int(on_axis.sum()) == 2
    assert tm.area_faces.min() > 1e-6 * tm.area / len(tm.faces)
    errs = relative_errors(rev, 4 / 3 * math.pi * r ** 3, 4 * math.pi * r ** 2,
                           tuple(t * r for t in TOLERANCES))
    assert_converges_linearly(errs[:, 0], tuple(t * r for t in TOLERANCES), "sphere volume")
    assert_converges_linearly(errs[:, 1], tuple(t * r for t in TOLERANCES), "sphere area")


def test_solid_cylinder_on_the_axis_has_no_degenerate_triangles():
    # A bar of radius 2 and length 5 (its section touches the axis along a whole side):
    # CRC (from memory) V = π r² h, S = 2 π r h + 2 π r².
    bar = Loop.from_points([(0, 0), (5, 0), (5, 2), (0, 2)])
    rev = Revolution(Profile(loops=(bar,)), Axis.x())
    mesh = revolve_mesh(rev, 0.001)
    tm = reference(mesh)
    assert tm.is_watertight and tm.is_winding_consistent
    assert tm.area_faces.min() > 0
    assert int((np.hypot(mesh.vertices[:, 1], mesh.vertices[:, 2]) == 0).sum()) == 2
    assert math.isclose(tm.volume, math.pi * 4 * 5, rel_tol=2e-3)
    assert math.isclose(tm.area, 2 * math.pi * 2 * 5 + 2 * math.pi * 4, rel_tol=2e-3)


def test_paraboloid_curve_converges_to_crc():
    # Paraboloid of revolution, radius r = 2, height h = 3, axis along x: the curve
    # x = h t², y = r t, the flat end, and the axis. CRC (from memory): V = π r² h / 2,
    # lateral area π r / (6 h²) [(r² + 4 h²)^(3/2) − r³]; plus the flat end π r².
    r, h = 2.0, 3.0
    curve = curve_from_expressions(h * T ** 2, r * T, 0, 1, face="dome")
    loop = Loop((curve, Line((h, r), (h, 0.0), face="end"), Line((h, 0.0), (0.0, 0.0))))
    rev = Revolution(Profile(loops=(loop,)), Axis.x())
    lateral = math.pi * r / (6 * h * h) * ((r * r + 4 * h * h) ** 1.5 - r ** 3)
    errs = relative_errors(rev, math.pi * r * r * h / 2, lateral + math.pi * r * r)
    assert_converges_linearly(errs[:, 0], what="paraboloid volume")
    assert_converges_linearly(errs[:, 1], what="paraboloid area")
    tm = reference(revolve_mesh(rev, 0.01))
    assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0


# -- the promise: no point of any triangle is farther than the tolerance from the surface ---

def triangle_samples(mesh, n=12):
    """Points on every triangle: a barycentric grid of (n + 1)(n + 2)/2 points each."""
    w = np.array([(i / n, j / n, 1 - i / n - j / n) for i in range(n + 1) for j in range(n + 1 - i)])
    return np.einsum("wk,mkd->mwd", w, mesh.corners()).reshape(-1, 3)


def meridian(points):
    """Axial position and distance from the x axis of 3-D points (the profile's frame)."""
    return points[:, 0], np.hypot(points[:, 1], points[:, 2])


def distance_to_segments(z, rho, segments):
    """Distance in the meridian half-plane from (z, rho) to straight profile pieces.

    For a surface of revolution the nearest point lies in the point's own meridian
    half-plane (|P − Q|² = Δz² + ρ² + ρ'² − 2ρρ' cos Δψ ≥ Δz² + (ρ − ρ')²), so this is the
    exact distance to the swept surface.
    """
    best = np.full(z.shape, np.inf)
    p = np.column_stack([z, rho])
    for a, b in segments:
        a, b = np.asarray(a, float), np.asarray(b, float)
        ab = b - a
        s = np.clip((p - a) @ ab / (ab @ ab), 0.0, 1.0)
        best = np.minimum(best, np.linalg.norm(p - a - s[:, None] * ab, axis=1))
    return best


@pytest.mark.parametrize("tol", [0.05, 0.01, 0.002])
def test_sphere_and_torus_stay_within_the_tolerance(tol):
    # The true largest distance, measured on a barycentric grid over every triangle against
    # the exact surface: sphere |P| = 1 (distance ||P| − 1|), torus of tube 1 at 3 from the
    # axis (distance |√((ρ − 3)² + z²) − 1|), analytic geometry, no source needed.
    mesh = revolve_mesh(Revolution(sphere_profile(1.0), Axis.x()), tol)
    d_sphere = np.abs(np.linalg.norm(triangle_samples(mesh), axis=1) - 1.0).max()
    mesh = revolve_mesh(Revolution(Profile(loops=(circle(0.0, 3.0, 1.0),)), Axis.x()), tol)
    z, rho = meridian(triangle_samples(mesh))
    d_torus = np.abs(np.hypot(rho - 3.0, z) - 1.0).max()
    for d in (d_sphere, d_torus):
        assert d <= tol
        assert d > 0.5 * tol   # and the budget is used, not wasted (both sagittas add)


def test_cone_and_frustum_stay_within_the_tolerance():
    # Straight profile: only the sweep's steps depart from the surface; the exact distance
    # is the meridian distance to the profile's lines (see distance_to_segments).
    tol = 0.01
    frustum = [(0.0, 0.0), (0.0, 3.0), (4.0, 2.0), (4.0, 0.0)]
    cone = [(0.0, 0.0), (3.0, 2.0), (3.0, 0.0)]
    for pts in (frustum, cone):
        mesh = revolve_mesh(Revolution(Profile(loops=(Loop.from_points(pts),)), Axis.x()), tol)
        z, rho = meridian(triangle_samples(mesh))
        edges = [(pts[k], pts[(k + 1) % len(pts)]) for k in range(len(pts))]
        edges = [(a, b) for a, b in edges if a[1] != 0 or b[1] != 0]   # the axis sweeps nothing
        d = distance_to_segments(z, rho, edges).max()
        assert 0.25 * tol < d <= tol


def test_curve_profile_stays_within_the_tolerance():
    # A paraboloid dish x = 3 t², y = 2 t (t in 0..1) closed by its flat end. Distance to the
    # curve: nearest of 200 001 points along it (scipy.spatial.cKDTree; the spacing, under
    # 4e-5, adds at most 2e-5 to any distance; farther than 2 tol counts as infinite), and to
    # the end disc exactly.
    from scipy.spatial import cKDTree

    r, h, tol = 2.0, 3.0, 0.01
    curve = curve_from_expressions(h * T ** 2, r * T, 0, 1)
    loop = Loop((curve, Line((h, r), (h, 0.0)), Line((h, 0.0), (0.0, 0.0))))
    mesh = revolve_mesh(Revolution(Profile(loops=(loop,)), Axis.x()), tol)
    z, rho = meridian(triangle_samples(mesh))
    t = np.linspace(0.0, 1.0, 200_001)
    d_curve, _ = cKDTree(np.column_stack([h * t * t, r * t])).query(
        np.column_stack([z, rho]), distance_upper_bound=2 * tol)
    d = np.minimum(d_curve, distance_to_segments(z, rho, [((h, r), (h, 0.0))]))
    assert d.max() <= tol


# -- every segment kind, through the segment contract ---------------------------------------

def wavy_polyline(n=2000):
    """A closed wavy outline 1.7 to 4.3 from the x axis as ONE Polyline of ``n`` edges."""
    a = np.linspace(0.0, 2 * np.pi, n + 1)
    r = 1.0 + 0.3 * np.sin(5 * a)
    pts = np.column_stack([r * np.cos(a), 3.0 + r * np.sin(a)])
    pts[-1] = pts[0]
    return Polyline(pts, face="wavy")


def kind_profile(kind):
    """A solid section made (mostly) of segments of one kind."""
    if kind == "line":
        return Profile(loops=(Loop.from_points([(0, 1), (4, 1), (3, 3), (0, 2)]),))
    if kind == "arc":   # a D: a half circle bulging towards +x, closed by its diameter
        return Profile(loops=(Loop((arc_from_centre((0.0, 1.0), (0.0, 3.0), (0.0, 2.0), False),
                                    Line((0.0, 3.0), (0.0, 1.0)))),))
    if kind == "curve":
        curve = curve_from_expressions(3 * T ** 2, 1 + 2 * T, 0, 1, face="dome")
        return Profile(loops=(Loop((curve, Line((3.0, 3.0), (3.0, 1.0)), Line((3.0, 1.0), (0.0, 1.0)))),))
    return Profile(loops=(Loop((wavy_polyline(400),)),))


@pytest.mark.parametrize("kind", ["line", "arc", "curve", "polyline"])
def test_every_kind_converges_to_the_engines_volume(kind):
    # The mesh is a different computation from the engine's Pappus sums (exact section
    # integrals of each kind, themselves checked against published formulas elsewhere):
    # its volume must converge to them in proportion to the tolerance (the rule above).
    rev = Revolution(kind_profile(kind), Axis.x())
    m = measure(rev, crosscheck=False)
    errs = relative_errors(rev, m.volume, m.surface_total)
    assert_converges_linearly(errs[:, 0], what=f"{kind} volume")
    for tol in TOLERANCES:
        tm = reference(revolve_mesh(rev, tol))
        assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0


def test_polyline_section_against_shapely_and_the_inscribed_polygon():
    # The wavy outline as one Polyline: shapely's area and centroid with Pappus
    # (V = 2π ȳ A) give the volume of the revolved polygon; swept in n equal steps its mesh
    # keeps exactly the fraction (n / 2π) sin(2π / n) of it (inscribed regular n-gon, CRC,
    # from memory), since the profile's chords are its own edges and add no error.
    poly = wavy_polyline()
    shape = Polygon(poly.points)
    pappus = 2 * math.pi * shape.centroid.y * shape.area
    rev = Revolution(Profile(loops=(Loop((poly,)),)), Axis.x())
    assert math.isclose(measure(rev, crosscheck=False).volume, pappus, rel_tol=1e-12)
    for tol in (0.05, 0.01):
        mesh = revolve_mesh(rev, tol)
        n = mesh.angular_steps
        assert math.isclose(reference(mesh).volume, pappus * n / (2 * math.pi) * math.sin(2 * math.pi / n),
                            rel_tol=1e-11)
        # the Polyline's vertices are the mesh's rings: n vertices each, nothing added
        assert len(mesh.vertices) == (len(poly.points) - 1) * n


def test_polyline_mesh_stays_within_the_tolerance():
    # A zigzag outline as one Polyline; the exact distance from each sample of each
    # triangle to the swept surface is the meridian distance to the polyline's edges
    # (see distance_to_segments).
    pts = np.array([(0, 1), (1, 2), (2, 1.5), (3, 2.5), (4, 1), (4, 0.5), (0, 0.5), (0, 1)], float)
    rev = Revolution(Profile(loops=(Loop((Polyline(pts),)),)), Axis.x())
    for tol in (0.05, 0.01):
        mesh = revolve_mesh(rev, tol)
        z, rho = meridian(triangle_samples(mesh, n=6))
        d = distance_to_segments(z, rho, list(zip(pts[:-1], pts[1:]))).max()
        assert 0.25 * tol < d <= tol


def test_a_polyline_too_long_for_the_triangle_cap_is_refused_before_any_work():
    # At a tolerance of 1e-4 every edge is swept in more than 500 steps (chord_steps on the
    # ends' radius), two triangles each: 5·10⁴ edges are past the cap of 2·10⁷ triangles.
    big = wavy_polyline(50_000)
    rev = Revolution(Profile(loops=(Loop((big,)),)), Axis.x())
    with pytest.raises(RevolveError, match="would give more than 20,000,000 triangles"):
        revolve_mesh(rev, 1e-4)


# -- partial revolutions: cut faces -------------------------------------------------------

@pytest.mark.parametrize("degrees", [30.0, 90.0, 180.0, 270.0, 359.0])
def test_partial_solid_cylinder_sector(degrees):
    # A solid cylinder (r = 2, h = 5) swept through θ: a cylindrical sector.
    # CRC (from memory): sector area θ r²/2, so V = θ r² h / 2; surface θ r h (curved)
    # + 2 · θ r²/2 (ends) + 2 · r h (the two cut rectangles).
    theta = math.radians(degrees)
    bar = Loop.from_points([(0, 0), (5, 0), (5, 2), (0, 2)])
    rev = Revolution(Profile(loops=(bar,)), Axis.x(), degrees)
    mesh = revolve_mesh(rev, 0.002)
    tm = reference(mesh)
    assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0
    assert tm.area_faces.min() > 0
    assert CUT_FACE_START in mesh.face_names and CUT_FACE_END in mesh.face_names
    assert math.isclose(tm.volume, theta * 4 * 5 / 2, rel_tol=3e-3)
    assert math.isclose(tm.area, theta * 2 * 5 + theta * 4 + 2 * 2 * 5, rel_tol=3e-3)
    # Each cut face is the 2 × 5 rectangle: exactly, since its edges are straight.
    cut = np.isin(np.array(mesh.face_names)[mesh.face_of], [CUT_FACE_START, CUT_FACE_END])
    assert math.isclose(float(tm.area_faces[cut].sum()), 2 * 10.0, rel_tol=1e-12)


def box_with_holes():
    """A 6 × 6 square section 1 from the axis with a round hole, a square hole and an island."""
    outer = Loop.from_points([(0, 1), (6, 1), (6, 7), (0, 7)], face="outside")
    return Profile(loops=(outer, circle(1.8, 4.0, 0.8, "round hole"),
                          Loop.from_points([(3.5, 2), (5.5, 2), (5.5, 6), (3.5, 6)], face="square hole"),
                          Loop.from_points([(4, 3), (5, 3), (5, 5), (4, 5)], face="island")))


def test_partial_revolution_with_holes_converges():
    # Pappus (Stewart, from memory): V = θ Σ ± A_k d_k over the loops, each an elementary
    # shape whose area and centroid height are known: square 36 at 4, circle π 0.8² at 4,
    # rectangle 8 at 4, square 2 at 4 (all centred 4 from the axis).
    theta = math.radians(120.0)
    area = 36 - math.pi * 0.8 ** 2 - 8 + 2
    exact = theta * area * 4.0
    rev = Revolution(box_with_holes(), Axis.x(), 120.0)
    vols = []
    for tol in TOLERANCES:
        mesh = revolve_mesh(rev, tol)
        tm = reference(mesh)
        assert tm.is_watertight and tm.is_winding_consistent and tm.volume > 0
        assert tm.area_faces.min() > 0
        vols.append((tm.volume - exact) / exact)
        # Both cut faces together: twice the section, a little more since the round hole's
        # polygon is inscribed (about (4/3)(tol/r) π r² more, CRC circular segment).
        cut = np.isin(np.array(mesh.face_names)[mesh.face_of], [CUT_FACE_START, CUT_FACE_END])
        excess = (float(tm.area_faces[cut].sum()) / 2 - area) / area
        assert 0 < excess < 0.5 * tol
    assert_converges_linearly(vols, what="box with holes")


def test_chain_gives_an_open_cone():
    # A chain from the apex on the axis to the rim: an open cone, radius 2, height 3.
    # CRC (from memory): lateral area π r √(r² + h²); the straight chord makes it exact
    # apart from the polygonal rim: the error shrinks with the tolerance.
    rev = Revolution(Profile(chains=(Chain.from_points([(0, 0), (3, 2)], face="cone"),)), Axis.x())
    exact = math.pi * 2 * math.sqrt(4 + 9)
    errs = []
    for tol in TOLERANCES:
        mesh = revolve_mesh(rev, tol)
        tm = reference(mesh)
        assert not mesh.closed and not tm.is_watertight
        assert mesh.open_edge_count() == mesh.angular_steps   # only the rim is open
        errs.append((tm.area - exact) / exact)
    assert_converges_linearly(errs, what="cone area")


# -- flattening: the chord tolerance ------------------------------------------------------

def polyline_distance(points, poly):
    """Largest distance from ``points`` to the polyline ``poly`` (brute force, numpy)."""
    a, b = poly[:-1][None], poly[1:][None]
    p = points[:, None]
    ab = b - a
    s = np.clip(((p - a) * ab).sum(-1) / (ab * ab).sum(-1), 0, 1)
    return float(np.min(np.linalg.norm(p - a - s[..., None] * ab, axis=-1), axis=1).max())


@pytest.mark.parametrize("tol", [0.1, 0.01, 0.001])
def test_arc_chords_use_the_sagitta_exactly(tol):
    # Sagitta of a chord spanning Δ on radius R: R (1 − cos(Δ/2)) (CRC, circular segment).
    R = 5.0
    arc = arc_from_centre((R, 0.0), (0.0, R), (0.0, 0.0), clockwise=False)
    pts = flatten_segment(arc, tol)
    n = len(pts) - 1
    assert R * (1 - math.cos(math.pi / 2 / n / 2)) <= tol
    if n > 1:  # one piece fewer would break the tolerance: the count is the least
        assert R * (1 - math.cos(math.pi / 2 / (n - 1) / 2)) > tol
    a = np.linspace(0, math.pi / 2, 5001)
    dense = np.column_stack([R * np.cos(a), R * np.sin(a)])
    assert polyline_distance(dense, pts) <= tol * (1 + 1e-9)


@pytest.mark.parametrize("tol", [0.05, 0.005, 0.0005])
def test_curve_flattening_keeps_the_tolerance(tol):
    # A wavy curve: the flattened points stay within the tolerance of the true curve,
    # sampled densely (numpy), and no more points are used than needed by a factor ~3.
    c = curve_from_expressions(T, sympy.sin(3 * T) + 0.2 * T ** 2, 0, 4)
    pts = flatten_segment(c, tol)
    tt = np.linspace(0, 4, 12001)
    x, y, _, _ = c.evaluate(tt)
    assert polyline_distance(np.column_stack([x, y]), pts) <= tol * 1.05
    assert pts[0].tolist() == list(c.start) and pts[-1].tolist() == list(c.end)
    # The curvature is below 9.4 (|y''| ≤ 9 + 0.4): chords of length √(8 tol / 9.4) would
    # do everywhere, so adaptive subdivision needs at most about twice as many.
    length = float(np.hypot(np.diff(x), np.diff(y)).sum())
    assert len(pts) < 3 * length / math.sqrt(8 * tol / 9.4) + 40


def test_chord_steps_minimal():
    for R, sweep, tol in [(10, 2 * math.pi, 0.01), (1, math.pi / 3, 1e-4), (100, 1.0, 0.5)]:
        n = chord_steps(R, sweep, tol)
        assert R * (1 - math.cos(sweep / n / 2)) <= tol * (1 + 1e-12)
        assert R * (1 - math.cos(sweep / (n - 1) / 2)) > tol


# -- triangulating a section with holes -----------------------------------------------------

def comb(teeth=7):
    """A comb of ``teeth`` teeth on a base 0 ≤ y ≤ 1: many reflex corners (anticlockwise)."""
    pts = [(0.0, 0.0), (2.0 * teeth, 0.0), (2.0 * teeth, 1.0)]
    for k in range(teeth - 1, -1, -1):
        pts += [(2 * k + 1.6, 1.0), (2 * k + 1.6, 3.0), (2 * k + 0.4, 3.0), (2 * k + 0.4, 1.0)]
    pts.append((0.0, 1.0))
    return np.array(pts)


@pytest.mark.parametrize("case", ["square", "comb", "comb with holes", "clockwise outer"])
def test_triangulation_covers_the_polygon_exactly(case):
    outer = np.array([[0, 0], [4, 0], [4, 4], [0, 4]], dtype=float)
    holes = []
    if case.startswith("comb"):
        outer = comb()
    if case == "comb with holes":
        t = np.linspace(0, 2 * np.pi, 40, endpoint=False)
        holes = [np.column_stack([4.0 + 0.3 * np.cos(t), 0.5 + 0.3 * np.sin(t)]),
                 np.array([[10.2, 0.2], [10.2, 0.7], [12.5, 0.7], [12.5, 0.2]])]
    if case == "clockwise outer":
        outer = outer[::-1]
    tri = triangulate_section(outer, holes)
    pts = np.vstack([outer] + holes)
    areas = np.array([signed_area(pts[t]) for t in tri])
    assert np.all(areas > 0)                                  # anticlockwise, no zero area
    shape = Polygon(outer, holes)                             # shapely
    assert math.isclose(areas.sum(), shape.area, rel_tol=1e-12)
    union = unary_union([Polygon(pts[t]) for t in tri])
    assert union.symmetric_difference(shape).area < 1e-9 * shape.area  # no overlap, no gap
    assert len(tri) == len(pts) - 2 + 2 * len(holes)          # Euler: n − 2 + 2 h triangles


# -- bad input ------------------------------------------------------------------------------

@pytest.mark.parametrize("bad", [0, -1.0, float("nan"), float("inf"), "abc"])
def test_bad_tolerance_is_refused(bad):
    rev = Revolution(Profile(loops=(circle(0, 3, 1),)), Axis.x())
    with pytest.raises(RevolveError, match="chord tolerance must be a positive number"):
        revolve_mesh(rev, bad)


def test_too_fine_a_tolerance_is_refused_before_any_work():
    rev = Revolution(Profile(loops=(circle(0, 3, 1),)), Axis.x())
    with pytest.raises(RevolveError, match="use a larger tolerance"):
        revolve_mesh(rev, 1e-9)


@pytest.mark.parametrize("tol", [1e-300, 5e-324, 1e-30])
@pytest.mark.parametrize("shape", ["arcs", "lines", "curve"])
def test_vanishing_tolerance_is_refused_not_divided_by(tol, shape):
    # Once a ZeroDivisionError in chord_steps (1 − cos(Δ/2) rounds to 0 below 1e-16).
    if shape == "arcs":
        prof = Profile(loops=(circle(0, 3, 1),))
    elif shape == "lines":
        prof = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),))
    else:
        prof = Profile(loops=(Loop((curve_from_expressions(T, 2 + sympy.sin(T), 0, 3),
                                    Line((3.0, 2 + math.sin(3.0)), (3.0, 1.0)),
                                    Line((3.0, 1.0), (0.0, 1.0)), Line((0.0, 1.0), (0.0, 2.0)))),))
    with pytest.raises(RevolveError, match=r"^the chord tolerance .* would give more than "
                                           r"20,000,000 triangles; use a larger tolerance$"):
        revolve_mesh(Revolution(prof, Axis.x()), tol)


def test_chord_steps_survive_tiny_tolerances():
    # 2 R sin²(Δ/4) = tol solved exactly: Δ = 4 asin(√(tol / 2R)) (trigonometry, no source);
    # the count never divides by zero and is capped where no mesh could use it.
    assert chord_steps(1.0, 2 * math.pi, 1e-20) == math.ceil(2 * math.pi / (4 * math.sqrt(0.5e-20)))
    assert chord_steps(1.0, 2 * math.pi, 5e-324) == MOST_STEPS


def test_profile_errors_come_from_the_engine_checks():
    crossing = Profile(loops=(Loop.from_points([(0, -1), (2, -1), (2, 3), (0, 3)]),))
    with pytest.raises(ProfileError, match="crosses the axis"):
        revolve_mesh(Revolution(crossing, Axis.x()), 0.01)


def random_section(rng):
    """A star-shaped outer polygon with up to three star-shaped holes well inside it."""
    n = int(rng.integers(5, 60))
    ang = np.sort(rng.uniform(0, 2 * np.pi, n))
    rad = rng.uniform(3, 6, n)
    outer = np.column_stack([rad * np.cos(ang), rad * np.sin(ang)])
    holes = []
    for _ in range(int(rng.integers(0, 4))):
        c = rng.uniform(-1.5, 1.5, 2)
        m = int(rng.integers(3, 30))
        a = np.sort(rng.uniform(0, 2 * np.pi, m))
        r = rng.uniform(0.1, 0.6, m)
        h = c + np.column_stack([r * np.cos(a), r * np.sin(a)])
        ph = Polygon(h)
        if ph.is_valid and Polygon(outer).contains(ph) and all(Polygon(o).distance(ph) > 0.05 for o in holes):
            holes.append(h)
    return outer, holes


@pytest.mark.parametrize("seed", list(range(40)) + [215, 289])  # 215, 289: a hole joined through
def test_triangulation_of_random_sections_matches_shapely(seed):  # another hole's cut end
    # Several holes may join the outside through one another: each cut must leave the
    # polygon weakly simple, or triangles overlap (shapely: Polygon.area, unary_union).
    outer, holes = random_section(np.random.default_rng(seed))
    shape = Polygon(outer, holes)
    if not shape.is_valid:
        pytest.skip("random polygon not simple")
    tri = triangulate_section(outer, holes)
    pts = np.vstack([outer] + holes)
    areas = np.array([signed_area(pts[t]) for t in tri])
    assert np.all(areas > 0)
    assert math.isclose(areas.sum(), shape.area, rel_tol=1e-12)
    union = unary_union([Polygon(pts[t]) for t in tri])
    assert union.symmetric_difference(shape).area < 1e-9 * shape.area
    assert len(tri) == len(pts) - 2 + 2 * len(holes)
