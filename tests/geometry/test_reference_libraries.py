"""The engine against independent general-purpose libraries.

* sympy (``sympy.integrate``): exact disk, washer and shell integrals of
  symbolic profiles;
* scipy (``scipy.integrate.dblquad`` of 2π r over the section region,
  ``scipy.integrate.quad`` of 2π r ds along a curve);
* shapely (``Polygon.area``, ``Polygon.centroid``, ``Polygon.length``) for
  random simple polygons with holes;
* trimesh (``Trimesh.volume``, ``.area``, ``.center_mass``,
  ``.moment_inertia``) of a revolved triangle mesh built here, which must
  converge to the engine's figures as the mesh is refined.
"""

from __future__ import annotations

import math

import numpy as np
import pytest
import sympy

from geometry_testkit import (CROSS_TOL, CURVE_TOL, LINE_ARC_TOL, T, assert_rel, polygon,
                              reverse_loop)
from revolve.geometry.measure import measure
from revolve.geometry.profile import Axis, Loop, Profile, Revolution
from revolve.geometry.segments import Line, curve_from_expressions

Z = sympy.Symbol("z", real=True)


def _region_between(lower, upper, z0, z1):
    """Loop of the region lower(z) ≤ r ≤ upper(z), z0 ≤ z ≤ z1 (sympy expressions in Z)."""
    lo = lower.subs(Z, T)
    up = upper.subs(Z, T)
    f = lambda e, v: float(e.subs(Z, v))  # noqa: E731
    segs = []
    if lower == 0:
        segs.append(Line((z0, 0.0), (z1, 0.0), face="lower"))
    else:
        segs.append(curve_from_expressions(T, lo, z0, z1, face="lower"))
    segs.append(Line((z1, f(lower, z1)), (z1, f(upper, z1)), face="end"))
    # Upper edge travelled backwards: the parameter runs from z1 down to z0.
    segs.append(curve_from_expressions(T, up, z1, z0, face="upper"))
    segs.append(Line((z0, f(upper, z0)), (z0, f(lower, z0)), face="start"))
    return Loop(tuple(segs))


# -- sympy: disk, washer and shell integrals -------------------------------------------

def test_disk_integral_sympy():
    upper = 2 + sympy.sin(Z)
    m = measure(Revolution(Profile(loops=(_region_between(sympy.Integer(0), upper, 0.0, 3.0),)),
                           Axis.x()))
    # sympy.integrate: disk method V = π ∫ r(z)² dz, area ∫ r dz, first moment ∫ z r dz
    volume = sympy.pi * sympy.integrate(upper ** 2, (Z, 0, 3))
    area = sympy.integrate(upper, (Z, 0, 3))
    z_bar = sympy.integrate(Z * upper, (Z, 0, 3)) / area
    assert_rel(m.volume, float(volume), CURVE_TOL, "disk volume")
    assert_rel(m.area, float(area), CURVE_TOL, "area")
    assert_rel(m.centroid[0], float(z_bar), CURVE_TOL, "centroid along the axis")
    assert m.crosscheck.agrees(CROSS_TOL)


def test_washer_integral_sympy():
    lower = sympy.Rational(1, 2) + Z ** 2 / 8
    upper = 1 + Z - Z ** 2 / 4
    m = measure(Revolution(Profile(loops=(_region_between(lower, upper, 0.0, 2.0),)), Axis.x()),
                symbolic=False)
    # sympy.integrate: washer method V = π ∫ (R(z)² − r(z)²) dz
    volume = sympy.pi * sympy.integrate(upper ** 2 - lower ** 2, (Z, 0, 2))
    assert_rel(m.volume, float(volume), CURVE_TOL, "washer volume")
    # sympy.integrate: mass moment of inertia about the axis, ρ = 1: (π/2) ∫ (R⁴ − r⁴) dz
    inertia = sympy.pi / 2 * sympy.integrate(upper ** 4 - lower ** 4, (Z, 0, 2))
    m1 = measure(Revolution(Profile(loops=(_region_between(lower, upper, 0.0, 2.0),)), Axis.x()),
                 density=1.0, symbolic=False, crosscheck=False)
    assert_rel(m1.inertia_axis, float(inertia), CURVE_TOL, "inertia about the axis")


def _shell_region(p, X):
    """Region under y = p(x) for 1 ≤ x ≤ 3 (to be revolved about the y axis, on its right)."""
    top = curve_from_expressions(T, p.subs(X, T), 3.0, 1.0)
    return Loop((Line((1.0, 0.0), (3.0, 0.0)), Line((3.0, 0.0), (3.0, float(p.subs(X, 3)))), top,
                 Line((1.0, float(p.subs(X, 1))), (1.0, 0.0))))


@pytest.mark.parametrize("reverse", [False, True], ids=["ccw", "cw"])
def test_shell_integral_sympy(reverse):
    X = sympy.Symbol("x", real=True)
    p = 1 + X * (sympy.Rational(31, 10) - X) / 2       # highest at x = 1.55
    loop = _shell_region(p, X)
    if reverse:
        loop = reverse_loop(loop)
    m = measure(Revolution(Profile(loops=(loop,)), Axis.y()), symbolic=False)
    # sympy.integrate: shell method V = 2π ∫ x p(x) dx
    volume = 2 * sympy.pi * sympy.integrate(X * p, (X, 1, 3))
    assert_rel(m.volume, float(volume), CURVE_TOL, "shell volume")
    assert m.crosscheck.agrees(CROSS_TOL)


def test_shell_integral_turning_point_volume_sympy():
    X = sympy.Symbol("x", real=True)
    p = 1 + X * (3 - X) / 2                             # highest at x = 1.5
    m = measure(Revolution(Profile(loops=(_shell_region(p, X),)), Axis.y()), symbolic=False)
    # sympy.integrate: shell method V = 2π ∫ x p(x) dx (= 14π)
    volume = 2 * sympy.pi * sympy.integrate(X * p, (X, 1, 3))
    assert_rel(m.volume, float(volume), CURVE_TOL, "shell volume")


def test_shell_integral_turning_point_crosscheck_sympy():
    X = sympy.Symbol("x", real=True)
    p = 1 + X * (3 - X) / 2                             # turns back along the axis at x = 1.5
    m = measure(Revolution(Profile(loops=(_shell_region(p, X),)), Axis.y()), symbolic=False)
    # sympy.integrate: shell method V = 2π ∫ x p(x) dx (= 14π); the washers must find it too
    volume = 2 * sympy.pi * sympy.integrate(X * p, (X, 1, 3))
    assert_rel(m.crosscheck.volume, float(volume), CURVE_TOL, "washer volume")


# -- scipy: dblquad over the region, quad along a curve --------------------------------

def test_dblquad_and_quad_scipy():
    from scipy.integrate import dblquad, quad

    lower = sympy.Rational(1, 2) + Z ** 2 / 10
    upper = 2 + sympy.sin(Z)
    lo_f = sympy.lambdify(Z, lower)
    up_f = sympy.lambdify(Z, upper)
    dup_f = sympy.lambdify(Z, sympy.diff(upper, Z))
    dlo_f = sympy.lambdify(Z, sympy.diff(lower, Z))
    z0, z1 = 0.0, 2.0
    m = measure(Revolution(Profile(loops=(_region_between(lower, upper, z0, z1),)), Axis.x()),
                symbolic=False)
    opts = dict(epsabs=0.0, epsrel=1e-13)
    # scipy.integrate.dblquad: V = ∫∫ 2π r dr dz over the section
    volume, _ = dblquad(lambda r, z: 2 * math.pi * r, z0, z1, lo_f, up_f, **opts)
    area, _ = dblquad(lambda r, z: 1.0, z0, z1, lo_f, up_f, **opts)
    assert_rel(m.volume, volume, CURVE_TOL, "volume")
    assert_rel(m.area, area, CURVE_TOL, "area")
    # scipy.integrate.quad: S = ∫ 2π r ds along each curve
    s_up, _ = quad(lambda z: 2 * math.pi * up_f(z) * math.hypot(1.0, dup_f(z)), z0, z1, **opts)
    s_lo, _ = quad(lambda z: 2 * math.pi * lo_f(z) * math.hypot(1.0, dlo_f(z)), z0, z1, **opts)
    assert_rel(m.surface_by_face["upper"], s_up, CURVE_TOL, "upper face")
    assert_rel(m.surface_by_face["lower"], s_lo, CURVE_TOL, "lower face")
    # scipy.integrate.quad: length ∫ ds
    length, _ = quad(lambda z: math.hypot(1.0, dup_f(z)) + math.hypot(1.0, dlo_f(z)), z0, z1, **opts)
    ends = (up_f(z0) - lo_f(z0)) + (up_f(z1) - lo_f(z1))
    assert_rel(m.perimeter, length + ends, CURVE_TOL, "perimeter")


def test_dblquad_polar_region_scipy():
    # A quarter ellipse x = a cos t, y = b sin t and its two half-axes, revolved about y = -1.
    from scipy.integrate import dblquad

    a, b, off = 2.0, 1.0, 1.0
    quarter = curve_from_expressions(a * sympy.cos(T), b * sympy.sin(T), 0, sympy.pi / 2)
    loop = Loop((quarter, Line((0.0, b), (0.0, 0.0)), Line((0.0, 0.0), (a, 0.0))))
    m = measure(Revolution(Profile(loops=(loop,)), Axis((0.0, -off), (1.0, 0.0))), symbolic=False)
    # scipy.integrate.dblquad: V = ∫∫ 2π (y + off) dy dx over 0 ≤ y ≤ b √(1 − x²/a²)
    volume, _ = dblquad(lambda y, x: 2 * math.pi * (y + off), 0.0, a,
                        0.0, lambda x: b * math.sqrt(max(1 - x * x / (a * a), 0.0)),
                        epsabs=0.0, epsrel=1e-13)
    assert_rel(m.volume, volume, CURVE_TOL, "volume")


# -- shapely: random polygons with holes -----------------------------------------------

def _star(rng, centre, r_lo, r_hi, n):
    ang = np.sort(rng.uniform(0.0, 2 * math.pi, n))
    rad = rng.uniform(r_lo, r_hi, n)
    return [(centre[0] + r * math.cos(a), centre[1] + r * math.sin(a)) for a, r in zip(ang, rad)]


def _random_section(seed):
    """A random simple polygon with 0 to 3 holes, each loop in a random direction."""
    from shapely.geometry import Polygon

    rng = np.random.default_rng(seed)
    centre = (rng.uniform(-5, 5), rng.uniform(8, 12))
    while True:
        outer = _star(rng, centre, 2.0, 6.0, int(rng.integers(5, 16)))
        if Polygon(outer).is_valid:
            break
    holes = []
    for _ in range(int(rng.integers(0, 4))):
        for _attempt in range(50):
            c = (centre[0] + rng.uniform(-3, 3), centre[1] + rng.uniform(-3, 3))
            hole = _star(rng, c, 0.2, 0.8, int(rng.integers(3, 9)))
            hp = Polygon(hole)
            if hp.is_valid and Polygon(outer).buffer(-0.05).contains(hp) and \
                    all(hp.distance(Polygon(h)) > 0.05 for h in holes):
                holes.append(hole)
                break
    shape = Polygon(outer, holes)
    assert shape.is_valid
    loops = []
    for pts in [outer] + holes:
        loop = polygon(pts)
        loops.append(reverse_loop(loop) if rng.random() < 0.5 else loop)
    return shape, loops


@pytest.mark.parametrize("seed", range(12))
def test_random_polygons_with_holes_shapely(seed):
    shape, loops = _random_section(seed)
    m = measure(Revolution(Profile(loops=tuple(loops)), Axis.x(), 360.0))
    size = math.hypot(*(np.array(shape.bounds[2:]) - np.array(shape.bounds[:2])))
    # shapely: Polygon.area, Polygon.centroid, Polygon.length
    assert_rel(m.area, shape.area, LINE_ARC_TOL, "area")
    c = shape.centroid
    assert math.hypot(m.centroid[0] - c.x, m.centroid[1] - c.y) <= LINE_ARC_TOL * size
    assert_rel(m.perimeter, shape.length, LINE_ARC_TOL, "perimeter")
    # Stewart, Calculus, "Moments and centers of mass" (from memory): V = 2π ȳ A, with shapely's ȳ and A
    assert_rel(m.volume, 2 * math.pi * c.y * shape.area, LINE_ARC_TOL, "volume")
    assert m.crosscheck.agrees(CROSS_TOL)


# -- trimesh: a revolved triangle mesh, refined ----------------------------------------

#: A concave polygonal section, clear of the axis (so the mesh is a closed manifold).
MESH_PROFILE = [(0.0, 1.0), (2.0, 1.0), (3.0, 2.0), (2.0, 2.5), (2.5, 4.0), (0.5, 3.5)]


def revolved_mesh(points, n):
    """A watertight triangle mesh of the polygon (z, r) turned about the x axis in n steps."""
    import trimesh

    pts = np.asarray(points, dtype=float)
    m = len(pts)
    phi = 2 * math.pi * np.arange(n) / n
    z = np.repeat(pts[:, 0][None, :], n, axis=0)                    # (n, m)
    y = pts[:, 1][None, :] * np.cos(phi)[:, None]
    w = pts[:, 1][None, :] * np.sin(phi)[:, None]
    vertices = np.column_stack([z.ravel(), y.ravel(), w.ravel()])  # index k*m + i
    k = np.arange(n)[:, None]
    i = np.arange(m)[None, :]
    a = k * m + i
    b = k * m + (i + 1) % m
    c = ((k + 1) % n) * m + (i + 1) % m
    d = ((k + 1) % n) * m + i
    faces = np.concatenate([np.stack([a, b, c], -1).reshape(-1, 3),
                            np.stack([a, c, d], -1).reshape(-1, 3)])
    mesh = trimesh.Trimesh(vertices=vertices, faces=faces, process=False)
    if mesh.volume < 0:
        mesh.invert()
    return mesh


def test_revolved_mesh_converges_trimesh():
    m = measure(Revolution(Profile(loops=(polygon(MESH_PROFILE),)), Axis.x()), density=1.0)
    ns = [32, 64, 128, 256]
    vol_err, area_err, inertia_err = [], [], []
    volumes = []
    for n in ns:
        mesh = revolved_mesh(MESH_PROFILE, n)
        assert mesh.is_watertight and mesh.is_winding_consistent
        # trimesh: Trimesh.volume, .area, .moment_inertia (about the centre of mass, axis aligned)
        volumes.append(mesh.volume)
        vol_err.append(abs(mesh.volume - m.volume) / m.volume)
        area_err.append(abs(mesh.area - m.surface_total) / m.surface_total)
        inertia_err.append(abs(mesh.moment_inertia[0, 0] - m.inertia_axis) / m.inertia_axis)
        # trimesh: Trimesh.center_mass. Every slice of the faceted solid is a regular n-gon
        # scaled like the circle, so the axial centre of mass is the same for every n.
        assert abs(mesh.center_mass[0] - m.centre_of_mass_axial) <= 1e-12 * 5
    for errs, what in ((vol_err, "volume"), (area_err, "area"), (inertia_err, "inertia")):
        # Error falls as the mesh is refined, about fourfold per doubling (∝ 1/n²).
        ratios = [e0 / e1 for e0, e1 in zip(errs[:-1], errs[1:])]
        assert all(3.6 < q < 4.4 for q in ratios), (what, errs, ratios)
        assert errs[-1] < 1e-3, (what, errs)
    # Richardson extrapolation of the two finest meshes removes the 1/n² term.
    extrapolated = (4 * volumes[-1] - volumes[-2]) / 3
    assert_rel(m.volume, extrapolated, 1e-7, "extrapolated mesh volume")


def test_revolved_mesh_partial_profile_with_hole_trimesh():
    # A ring section with a square hole: the mesh of the outer loop minus the mesh of the hole.
    outer = [(0.0, 2.0), (4.0, 2.0), (4.0, 5.0), (0.0, 5.0)]
    hole = [(1.0, 3.0), (1.0, 4.0), (3.0, 4.0), (3.0, 3.0)]       # clockwise
    m = measure(Revolution(Profile(loops=(polygon(outer), polygon(hole))), Axis.x()))
    errs = []
    for n in (32, 64, 128, 256):
        # trimesh: Trimesh.volume of each closed mesh
        v = revolved_mesh(outer, n).volume - revolved_mesh(hole[::-1], n).volume
        errs.append(abs(v - m.volume) / m.volume)
    ratios = [e0 / e1 for e0, e1 in zip(errs[:-1], errs[1:])]
    assert all(3.6 < q < 4.4 for q in ratios), (errs, ratios)
