"""Measurements of a revolved profile: section, Pappus–Guldinus, mass, cross-check.

:func:`section` sums the exact segment integrals into section properties;
:func:`measure` applies the Pappus–Guldinus theorems (volume = θ · d̄ · A,
surface = θ · d̄_L · L), adds mass properties for a density, and runs the
independent cross-check of :mod:`revolve.geometry.slicing`.

All lengths are in the profile's unit; a density is in mass units per cubed
profile unit, and the mass comes out in those mass units.

Examples
--------
A torus: a circle of radius 1 whose centre is 3 from the axis.

>>> from revolve.geometry.segments import arc_from_centre
>>> from revolve.geometry.profile import Loop, Profile, Revolution, Axis
>>> top = arc_from_centre((4.0, 0.0), (2.0, 0.0), (3.0, 0.0), clockwise=False)
>>> bottom = arc_from_centre((2.0, 0.0), (4.0, 0.0), (3.0, 0.0), clockwise=False)
>>> circle = Loop((top, bottom))
>>> m = measure(Revolution(Profile(loops=(circle,)), Axis.y()))
>>> abs(m.volume / (2 * math.pi ** 2 * 3) - 1) < 1e-14        # V = 2π² R r²
True
>>> abs(m.surface_total / (4 * math.pi ** 2 * 3) - 1) < 1e-14  # S = 4π² R r
True
>>> m.crosscheck.agrees(1e-9)
True
>>> m.prepared.side, m.prepared.closed      # the checked profile (right of the y axis: side −1)
(-1.0, (True,))
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Dict, Optional, Tuple

import numpy as np

from revolve.errors import ProfileError
from revolve.geometry.checks import PreparedProfile, loop_factor, prepare
from revolve.geometry.integrals import COL, segment_integrals
from revolve.geometry.profile import UNNAMED_FACE, Revolution
from revolve.geometry.slicing import surface_by_quadrature, washer_volume


@dataclass(frozen=True)
class Section:
    """Properties of the plane section and of its boundary, in the axis frame.

    ``area`` and the moments are of the closed loops only (holes subtracted);
    ``boundary_length`` and its moments cover every segment, loops and chains.
    ``moments`` maps "M00", "M10" (∫∫ z dA), "M01" (∫∫ r dA), "M20", "M11",
    "M02", "M03" to their values, with ``z`` measured from the axis point.
    """

    area: float
    moments: Dict[str, float]
    perimeter: float
    boundary_length: float
    boundary_z: float
    boundary_r: float
    face_length: Dict[str, float]
    face_r_length: Dict[str, float]  # ∫ r ds per face
    loop_factors: Tuple[float, ...]
    error: Dict[str, float]
    methods: Tuple[str, ...]

    @property
    def centroid_z(self) -> float:
        return self.moments["M10"] / self.area if self.area else float("nan")

    @property
    def centroid_r(self) -> float:
        return self.moments["M01"] / self.area if self.area else float("nan")


def section(prep: PreparedProfile, symbolic: bool = False) -> Section:
    """Sum the segment integrals of a prepared profile into a :class:`Section`.

    A polyline is one row of sums over its edge arrays, so a 10⁶-vertex outline
    costs a few passes over memory and no Python loop over its vertices.

    >>> from revolve.geometry.checks import prepare
    >>> from revolve.geometry.profile import Axis, Loop, Profile
    >>> ring = Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),))
    >>> sec = section(prepare(ring, Axis.x()))
    >>> sec.area, sec.centroid_r, sec.perimeter, sec.methods
    (4.0, 2.0, 8.0, ('closed form',))
    """
    paths = prep.paths
    segs = [s for p in paths for s in p]
    owner = np.concatenate([np.full(len(p), k) for k, p in enumerate(paths)]) \
        if segs else np.zeros(0, dtype=int)
    # Take sector moments about the middle of the profile, not the axis, so that a
    # small section far from the axis loses no digits; shift them back below.
    box = np.array([s.bounds() for s in segs], dtype=float).reshape(-1, 4)
    z_ref = float((box[:, 0].min() + box[:, 2].max()) / 2) if box.size else 0.0
    r_ref = float((box[:, 1].min() + box[:, 3].max()) / 2) if box.size else 0.0
    res = segment_integrals(segs, symbolic=symbolic, about=(z_ref, r_ref))
    vals, errs = res.values, res.errors
    # Loop factors: solid loops count positive, holes negative, whatever their direction.
    factors = []
    loop_index = {}
    for k, (closed) in enumerate(prep.closed):
        if closed:
            loop_index[k] = len(factors)
            factors.append(loop_factor(float(vals[owner == k, COL["M00"]].sum()),
                                       prep.depths[loop_index[k]]))
    seg_factor = np.array([factors[loop_index[k]] if prep.closed[k] else 0.0 for k in owner])
    m = {name: float((vals[:, COL[name]] * seg_factor).sum())
         for name in ("M00", "M10", "M01", "M20", "M11", "M02", "M03")}
    merr = {name: float(errs[:, COL[name]].sum()) for name in m}
    # Undo the shift: z = z' + z_ref, r = r' + r_ref (binomial expansion of each moment).
    a, zr, rr = m["M00"], z_ref, r_ref
    m10, m01, m20, m11, m02, m03 = m["M10"], m["M01"], m["M20"], m["M11"], m["M02"], m["M03"]
    m["M10"] = m10 + zr * a
    m["M01"] = m01 + rr * a
    m["M20"] = m20 + 2 * zr * m10 + zr * zr * a
    m["M11"] = m11 + zr * m01 + rr * m10 + zr * rr * a
    m["M02"] = m02 + 2 * rr * m01 + rr * rr * a
    m["M03"] = m03 + 3 * rr * m02 + 3 * rr * rr * m01 + rr ** 3 * a
    length = vals[:, COL["length"]]
    closed_mask = np.array([prep.closed[k] for k in owner], dtype=bool) if segs else np.zeros(0, bool)
    L = float(length.sum())
    faces: Dict[str, float] = {}
    faces_r: Dict[str, float] = {}
    vals[:, COL["length_x"]] += z_ref * length
    vals[:, COL["length_y"]] += r_ref * length
    for s, l_, rl in zip(segs, length, vals[:, COL["length_y"]]):
        name = s.face or UNNAMED_FACE
        faces[name] = faces.get(name, 0.0) + float(l_)
        faces_r[name] = faces_r.get(name, 0.0) + float(rl)
    err = {**merr,
           "length": float(errs[:, COL["length"]].sum()),
           "length_r": float(errs[:, COL["length_y"]].sum())}
    return Section(area=m["M00"], moments=m, perimeter=float(length[closed_mask].sum()),
                   boundary_length=L,
                   boundary_z=float(vals[:, COL["length_x"]].sum()) / L if L else float("nan"),
                   boundary_r=float(vals[:, COL["length_y"]].sum()) / L if L else float("nan"),
                   face_length=faces, face_r_length=faces_r, loop_factors=tuple(factors),
                   error=err, methods=res.method)


@dataclass(frozen=True)
class CrossCheck:
    """The second, independent computation and how far it is from the first."""

    volume: float
    volume_error: float
    surface_area: float
    surface_error: float
    volume_difference: float   # relative
    surface_difference: float  # relative

    def agrees(self, tolerance: float) -> bool:
        """Both relative differences within ``tolerance`` (NaN never agrees)."""
        return bool(self.volume_difference <= tolerance and self.surface_difference <= tolerance)


@dataclass(frozen=True)
class Measurement:
    """Everything ``revolve measure`` reports, in the profile's units (see module docs).

    Positions ``centroid`` and ``boundary_centroid`` are sketch coordinates;
    ``centre_of_mass_axial`` is measured along the axis from its point;
    ``centre_of_mass_offset`` is the centre of mass's distance from the axis
    (zero for a full revolution), on the bisector of the swept angle.
    ``prepared`` is the checked profile in the axis frame that the figures
    came from (:func:`~revolve.geometry.checks.prepare`): jobs that need the
    frame geometry read it here instead of preparing again.
    """

    revolution: Revolution
    section: Section
    side: float
    angle: float
    area: float
    centroid: Tuple[float, float]
    centroid_distance: float
    perimeter: float
    boundary_length: float
    boundary_centroid: Tuple[float, float]
    boundary_centroid_distance: float
    volume: float
    surface_by_face: Dict[str, float]
    surface_total: float
    cut_face_area: Optional[float]
    centre_of_mass_axial: Optional[float]
    centre_of_mass_offset: Optional[float]
    volume_error: float
    surface_error: float
    crosscheck: Optional[CrossCheck]
    density: Optional[float] = None
    mass: Optional[float] = None
    inertia_axis: Optional[float] = None
    radius_of_gyration: Optional[float] = None
    notes: Tuple[str, ...] = field(default=())
    prepared: Optional[PreparedProfile] = field(default=None, compare=False, repr=False)

    @property
    def has_solid(self) -> bool:
        return self.area > 0


def _relative(a: float, b: float) -> float:
    scale = max(abs(a), abs(b))
    return 0.0 if scale == 0 else abs(a - b) / scale


def measure(revolution: Revolution, density: Optional[float] = None, *,
            crosscheck: bool = True, symbolic: bool = False) -> Measurement:
    """Measure a revolution: section, Pappus volume and surface, mass, cross-check."""
    axis = revolution.axis
    prep = prepare(revolution.profile, axis)
    sec = section(prep, symbolic=symbolic)
    theta = revolution.angle_radians
    has_loops = any(prep.closed)
    if has_loops and not abs(sec.area) > (prep.tolerance ** 2):
        raise ProfileError("the section has zero area; a solid needs a closed loop that encloses "
                           "something (use a chain for a surface only)")
    if has_loops and sec.area < 0:
        raise ProfileError("the holes are larger than the loops around them; check which loop is "
                           "the outside")
    A = sec.area
    d = sec.centroid_r if has_loops else float("nan")
    volume = theta * d * A if has_loops else 0.0
    surface_faces = {name: theta * v for name, v in sec.face_r_length.items()}
    surface_total = theta * sec.boundary_r * sec.boundary_length
    cz, cr = (sec.centroid_z, sec.centroid_r) if has_loops else (float("nan"), float("nan"))
    centroid = tuple(float(v) for v in axis.from_frame(cz, cr, prep.side))
    bcent = tuple(float(v) for v in axis.from_frame(sec.boundary_z, sec.boundary_r, prep.side))
    m = sec.moments
    com_axial = m["M11"] / m["M01"] if has_loops and m["M01"] else None
    com_offset = None
    if has_loops and m["M01"]:
        com_offset = 0.0 if revolution.full else m["M02"] * 2 * math.sin(theta / 2) / (theta * m["M01"])
    mass = inertia = gyration = None
    if density is not None and has_loops:
        mass = density * volume
        inertia = density * theta * m["M03"]
        gyration = math.sqrt(inertia / mass) if mass else None
    vol_err = theta * sec.error["M01"]
    surf_err = theta * sec.error["length_r"]
    check = None
    if crosscheck:
        wv, we = washer_volume(prep, sec.loop_factors, theta) if has_loops else (0.0, 0.0)
        sq, se = surface_by_quadrature(prep, theta)
        st = float(sum(sq))
        check = CrossCheck(volume=wv, volume_error=we, surface_area=st, surface_error=float(sum(se)),
                           volume_difference=_relative(volume, wv),
                           surface_difference=_relative(surface_total, st))
    notes = []
    if any(mm != "closed form" for mm in sec.methods):
        notes.append("curves: " + ", ".join(sorted(set(mm for mm in sec.methods if mm != "closed form"))))
    return Measurement(
        revolution=revolution, section=sec, side=prep.side, angle=theta,
        area=A if has_loops else 0.0, centroid=centroid, centroid_distance=d,
        perimeter=sec.perimeter, boundary_length=sec.boundary_length,
        boundary_centroid=bcent, boundary_centroid_distance=sec.boundary_r,
        volume=volume, surface_by_face=surface_faces, surface_total=surface_total,
        cut_face_area=(A if (has_loops and not revolution.full) else None),
        centre_of_mass_axial=com_axial, centre_of_mass_offset=com_offset,
        volume_error=vol_err, surface_error=surf_err, crosscheck=check,
        density=density, mass=mass, inertia_axis=inertia, radius_of_gyration=gyration,
        notes=tuple(notes), prepared=prep)
