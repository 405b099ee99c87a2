'''Coating estimates: areas to coat by face, coats, spreading rates and quantities.

Everything here is a pure function of the engine's
:class:`~revolve.geometry.measure.Measurement` and of plain numbers; the
command line (``revolve coat``) reads files and renders the results.

Areas to coat
-------------
:func:`surfaces` splits the swept surface of a measurement into
:class:`Surface` pieces, one per face name and the way it faces. The groups
say which side of the material a surface is on, as a painter means it on a
part or on a vessel alike. At each point of a closed section take the
outward normal (out of the material):

``inside``
    its radial part points towards the axis: bores, the inner faces of a
    vessel's shell and heads (crowns included, right to the pole), the far
    side of a hole in the section;
``outside``
    its radial part points away from the axis: outside diameters, domes and
    cones seen from outside, however slanted, chamfers on an outside edge;
``ends``
    it is parallel to the axis: flat faces square to the axis (a bushing's
    end faces, both faces of a flat head), within :data:`ENDS_TOLERANCE`
    (0.0001 rad);
``cut``
    the two flat faces left by a partial revolution (angle below 360°), each
    the section's area; counted only when asked for.

Segments are split where they turn back along the axis (where the radial
part of the normal changes sign: an arc at its top and bottom, a curve where
dz/dt changes sign), so a face may appear in several groups, each piece in
exactly one.

A loop normally encloses material. A profile file with ``section = "space"``
(``revolve vessel`` writes it on the liquid space) encloses empty space: the
material is around it, so its surfaces face the other way, and the liquid
space of a vessel is all ``inside`` (flat heads: ``ends``).

An open chain (a sheet or shell, surface only) has no thickness: each piece
has two sides of equal area. Its *inner side* is the side that faces the
axis over more of the chain's area (for a chain that only lies flat, the
side facing along the axis direction); the other is the *outer side*. Each
side of each piece is then grouped by its own normal as above: the inner
side of a tank wall drawn as a chain is ``inside``, the inner side of its
flat bottom is an end.

:func:`select` then keeps what the estimator asks for: face names or group
words to include (a face name written in the profile wins over a group word
of the same spelling), names to mask (exclude), the chain sides to count
(``both``, ``outer`` or ``inner``) and whether to count cut faces. The areas
are the engine's own: for each face, the pieces add up to the measurement's
surface of that face.

Coats
-----
A :class:`Coat` has a dry film thickness (DFT, stored in µm), volume solids
(VS, %), a loss factor (%: overspray, losses on the part, left in the tin)
and optionally a price per litre. Its figures follow the trade's formulas
(common practice, no source):

* theoretical spreading rate, m²/L = 10 × VS / DFT(µm);
* practical spreading rate = theoretical × (1 − loss / 100);
* wet film thickness WFT = DFT × 100 / VS;
* litres to buy = area / practical spreading rate.

In US units the theoretical rate is 1604.17 × (VS / 100) / DFT(mils) ft² per
US gallon (231 in³ spread 0.001 in thick covers 231 000 in² = 1604.17 ft²);
:func:`spreading_rate_in` converts with the exact unit definitions.

Coating-system file
-------------------
Several coats are given in a small TOML file (read with :mod:`tomllib`;
every key not listed here is refused with its file and line)::

    name = "Two-coat epoxy for idler rollers"   # optional
    currency = "EUR"                            # optional label for prices

    [[coat]]                       # one table per coat, in the order applied
    name = "zinc epoxy primer"     # optional, default "coat 1", "coat 2", ...
    dft_um = 60                    # dry film thickness in µm; or dft_mils = 2.4
    volume_solids = 58             # volume solids, %: above 0, at most 100
    loss = 35                      # loss factor, %: at least 0, below 100
    price_per_litre = 21.5         # optional; or price_per_us_gallon = 81.4

    [[coat]]
    name = "polyurethane finish"
    dft_mils = 2
    volume_solids = 52
    loss = 35

Numbers are plain TOML integers or decimals (no units, no expressions).

What a coat is bought as (all optional; :mod:`revolve.jobs.packs` does the
arithmetic, common practice, no source)::

    product = "two-pack epoxy"     # coats naming one product are bought together
    packs_litres = [16, 4]         # pack sizes in litres (the base of a two-pack product)
    pack_prices = [310, 86]        # one price per pack size
    mix_ratio = [4, 1]             # two-pack: base : hardener by volume
    hardener_packs_litres = [4, 1] # and hardener_pack_prices
    minimum_mix_litres = 1         # least mixed at a time, per coat
    thinner_percent = 5            # by volume of the mixed product
    thinner_limit_percent = 10     # the data sheet's most (more is refused)
    thinner_packs_litres = [5, 1]  # and thinner_pack_prices

A system per face group replaces the ``[[coat]]`` tables with ``[[group]]``
tables, each with its ``name``, its ``faces`` (face names or the groups
``inside``, ``outside``, ``ends``, ``all``) and its own ``[[group.coat]]``
tables; a surface counted must fall in at most one group, and one in no
group is not coated (the estimate says so). The groups sum to the whole
(``examples/coating-tank-groups.toml``).

Examples
--------
>>> c = make_coat("primer", dft_um=75, volume_solids=60, loss=25, price_per_litre=20)
>>> c.spreading_rate_theoretical, c.spreading_rate_practical, c.wet_film_um
(8.0, 6.0, 125.0)
>>> round(c.litres_for(30.0), 12), c.cost_for(5.0)
(5.0, 100.0)
'''

from __future__ import annotations

import dataclasses
import difflib
import math
import os
import re
from dataclasses import dataclass, field
from fractions import Fraction
from typing import Any, Dict, Iterable, List, Mapping, Optional, Sequence, Tuple

from revolve.errors import FormatError, RevolveError
from revolve.jobs.results import Result

#: The groups a surface can face, besides its face name.
GROUPS = ("outside", "inside", "ends")
#: Group of the two flat faces of a partial revolution.
CUT = "cut"
#: Face name given to the cut faces.
CUT_FACE = "cut faces"
#: Choices for the sides of an open chain.
SIDES = ("both", "outer", "inner")
#: Word that selects every surface.
ALL = "all"

#: Litres in one US gallon: 231 in³ with 1 in = 25.4 mm (exact by definition).
US_GALLON_LITRES = 231 * 2.54 ** 3 / 1000
#: Square feet spread by one US gallon at 1 mil and 100 % volume solids: 231 in³ / 0.001 in / 144.
US_RATE_CONSTANT = 231 / 0.001 / 144
#: Micrometres in one mil (0.001 in).
UM_PER_MIL = 25.4
#: Thickest dry film accepted, µm (50 mm): above this a unit was almost certainly mixed up.
MAX_DFT_UM = 50_000.0


class CoatingError(RevolveError):
    """A coat or coating system is invalid (film thickness, solids, loss, price, faces)."""


# -- areas to coat ------------------------------------------------------------------


@dataclass(frozen=True)
class Surface:
    """One piece of the surface to coat, in the profile's unit squared.

    ``facing`` is one of :data:`GROUPS` or :data:`CUT`; ``side`` is "outer" or
    "inner" for a side of an open chain and None for a solid's face; ``kind``
    is "solid", "chain" or "cut".
    """

    face: str
    facing: str
    area: float
    kind: str = "solid"
    side: Optional[str] = None

    @property
    def label(self) -> str:
        """The face name with its side for a chain, e.g. ``"shell, inner side"``.

        >>> Surface("shell", "inside", 2.0, "chain", "inner").label
        'shell, inner side'
        >>> Surface("bore", "inside", 2.0).label
        'bore'
        """
        return f"{self.face}, {self.side} side" if self.side else self.face


@dataclass(frozen=True)
class Chosen:
    """A surface with whether it is counted and, if not, why."""

    surface: Surface
    included: bool
    reason: Optional[str] = None
    #: The face group whose system coats it (files with ``[[group]]`` tables), else None.
    group: Optional[str] = None


#: A piece counts as an end when its axial extent is at most this fraction of its chord
#: (its outward normal within about 0.0001 rad, 0.006°, of the axis).
ENDS_TOLERANCE = 1e-4


def turning_pieces(seg) -> list:
    """A frame segment split where it turns back along the axis (where dz/ds changes sign).

    Within each piece the radial part of the normal keeps one sign, so each
    piece faces the axis or away from it all along (or lies flat). The cuts
    are the segment's own :meth:`turning_parameters` along the axis (a line
    has none, an arc turns at the angles 0 and π from its centre, a curve
    where dz/dt changes sign, a polyline at the vertices where z turns back).

    >>> from revolve.geometry.segments import arc_from_centre
    >>> circle_top = arc_from_centre((-1.0, 3.0), (1.0, 3.0), (0.0, 3.0), clockwise=True)
    >>> [(p.start, p.end) for p in turning_pieces(circle_top)]
    [((-1.0, 3.0), (1.0, 3.0))]
    >>> whole = arc_from_centre((0.0, 2.0), (0.0, 4.0), (0.0, 3.0), clockwise=False)
    >>> [tuple(round(v, 12) for v in p.end) for p in turning_pieces(whole)]
    [(1.0, 3.0), (0.0, 4.0)]
    """
    out = []
    for piece in seg.split_at(seg.turning_parameters(0)):
        out.extend(_square_runs_apart(piece))
    return out


def _square_runs_apart(piece) -> list:
    """A piece cut where it starts and stops running square to the axis.

    A polyline that only moves one way along the axis may still climb a
    shoulder (an edge square to the axis, within :data:`ENDS_TOLERANCE` of
    its length, as :func:`classify` judges a single line) between two
    diameters; cutting it at the ends of each such run puts the shoulder in
    its own piece, which :func:`classify` then counts as an end. A segment of
    one edge is classified whole.

    >>> import numpy as np
    >>> from revolve.geometry.segments import Polyline
    >>> step = Polyline(np.array([[0.0, 2.0], [5.0, 2.0], [5.0, 3.0], [9.0, 3.0]]))
    >>> [(p.start, p.end) for p in _square_runs_apart(step)]
    [((0.0, 2.0), (5.0, 2.0)), ((5.0, 2.0), (5.0, 3.0)), ((5.0, 3.0), (9.0, 3.0))]
    >>> tilted = Polyline(np.array([[0.0, 2.0], [5.0, 2.0], [5.0 + 1e-15, 3.0], [9.0, 3.0]]))
    >>> len(_square_runs_apart(tilted))            # rounding noise is still a shoulder
    3
    """
    import numpy as np

    if piece.edge_count() < 2:
        return [piece]
    pts = np.asarray(piece.flatten(), dtype=float)      # a many-edge kind: its vertices
    d = np.diff(pts, axis=0)
    square = np.abs(d[:, 0]) <= ENDS_TOLERANCE * np.hypot(d[:, 0], d[:, 1])
    changes = np.flatnonzero(square[1:] != square[:-1]) + 1    # vertices where a run starts
    if not changes.size:
        return [piece]
    p0, p1 = piece.parameter_range()
    step = (p1 - p0) / (len(pts) - 1)
    return list(piece.split_at([p0 + step * float(i) for i in changes]))


def classify(axial_extent: float, radial_normal: float, chord: float) -> str:
    """Group of one side of a piece: ends, inside or outside.

    ``axial_extent`` is how far the piece runs along the axis, ``chord`` the
    distance between its ends and ``radial_normal`` the radial part of the
    side's normal anywhere inside it (its sign is the same all along a piece
    from :func:`turning_pieces`).

    >>> classify(0.0, 0.0, 2.0), classify(5.0, -1.0, 5.0), classify(1.0, 0.3, 3.0)
    ('ends', 'inside', 'outside')
    >>> classify(1e-5, 1.0, 1.0)   # a face off square by 0.0006°: still an end
    'ends'
    """
    if abs(axial_extent) <= ENDS_TOLERANCE * chord:
        return "ends"
    return "outside" if radial_normal > 0 else "inside"


def _piece_facing(piece, factor: float) -> str:
    """Group of a piece for the side whose normal is ``factor`` × the right-hand normal.

    The right-hand normal of the direction (dz, dr) is (dr, −dz): its radial
    part has the sign of −dz.
    """
    (z0, r0), (z1, r1) = piece.start, piece.end
    dz = z1 - z0
    return classify(dz, -factor * dz, math.hypot(dz, r1 - r0))


def surfaces(measurement, space: bool = False) -> Tuple[Surface, ...]:
    """Every surface of a measured revolution, by face name and facing, in profile unit².

    The groups say which way a surface faces, seen from the material (see the
    module docstring): the side of each point whose normal points towards
    the axis is ``inside``, away from it ``outside``, and pieces square to the
    axis are ``ends``. Segments are split where they turn back along the
    axis, so a dome's inner surface is inside all the way to its crown.

    Chains give two surfaces per piece (outer and inner side); a partial
    revolution of a solid adds the cut faces (both together). Pieces that
    sweep no area (segments on the axis) are left out. For each face name the
    solid pieces plus one side of its chain pieces add up to the
    measurement's ``surface_by_face``.

    Parameters
    ----------
    measurement : Measurement
        From :func:`revolve.geometry.measure.measure`.
    space : bool
        The loops enclose empty space, not material (the liquid space of a
        vessel, ``section = "space"`` in the profile file): the material is
        around them, so their surfaces face the other way (a vessel's wall
        is inside).

    Returns
    -------
    tuple of Surface
        In order of first appearance of each face.

    Examples
    --------
    A tube 10 long, bore radius 1, outside radius 2, about the x axis.

    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Loop, Profile, Revolution
    >>> tube = Loop.from_points([(0, 1), (10, 1), (10, 2), (0, 2)])
    >>> m = measure(Revolution(Profile(loops=(tube,))))
    >>> [(s.facing, round(s.area / math.pi, 9)) for s in surfaces(m)]
    [('inside', 20.0), ('ends', 6.0), ('outside', 40.0)]

    The same section as the space inside a vessel: the wall around a space
    faces the axis where the material's surface faced away from it.

    >>> [(s.facing, round(s.area / math.pi, 9)) for s in surfaces(m, space=True)]
    [('outside', 20.0), ('ends', 6.0), ('inside', 40.0)]
    """
    import numpy as np

    from revolve.geometry.integrals import COL, segment_integrals
    from revolve.geometry.profile import UNNAMED_FACE

    m = measurement
    rev = m.revolution
    prep = m.prepared          # the checked profile the measurement came from: not prepared again
    if prep is None:           # a measurement built by hand, without its prepared profile
        from revolve.geometry.checks import prepare

        prep = prepare(rev.profile, rev.axis)
    theta = rev.angle_radians
    factors = iter(m.section.loop_factors)
    # (face, facing, kind, side) per piece; chains: two entries per piece
    entries: List[Tuple[str, str, str, Optional[str]]] = []
    pieces = []
    for closed, path in zip(prep.closed, prep.paths):
        split = [(seg.face or UNNAMED_FACE, piece) for seg in path for piece in turning_pieces(seg)]
        if closed:
            f = float(next(factors)) * (-1.0 if space else 1.0)
            for face, piece in split:
                entries.append((face, _piece_facing(piece, f), "solid", None))
                pieces.append(piece)
            continue
        # An open chain: its inner side is the hand that faces the axis over more of the
        # swept area (for a chain that only lies flat, the hand facing along the axis).
        inner = _chain_inner_hand(split, theta)
        for face, piece in split:
            for side, hand in (("outer", -inner), ("inner", inner)):
                entries.append((face, _piece_facing(piece, hand), "chain", side))
                pieces.append(piece)
    raw = theta * segment_integrals(pieces, symbolic=False).values[:, COL["length_y"]] \
        if pieces else np.zeros(0)
    # Scale each face's pieces so they add up to the engine's figure for that face (a chain
    # piece is counted twice, once per side, so its face's total is halved).
    totals: Dict[str, float] = {}
    for (face, _, kind, _), a in zip(entries, raw):
        totals[face] = totals.get(face, 0.0) + float(a) * (0.5 if kind == "chain" else 1.0)
    found: Dict[Tuple[str, str, str, Optional[str]], float] = {}
    for key, a in zip(entries, raw):
        face = key[0]
        want = m.surface_by_face.get(face, 0.0)
        scale = want / totals[face] if totals[face] > 0 else 0.0
        found[key] = found.get(key, 0.0) + float(a) * scale
    out: List[Surface] = []
    for (face, facing, kind, side), area in found.items():
        if area > 0:
            out.append(Surface(face, facing, area, kind, side))
    if m.cut_face_area is not None and m.cut_face_area > 0:
        out.append(Surface(CUT_FACE, CUT, 2.0 * m.cut_face_area, "cut"))
    return tuple(out)


def _chain_inner_hand(split, theta: float) -> float:
    """+1 when a chain's inner side is on the right-hand normal of its direction, else −1."""
    from revolve.geometry.integrals import COL, segment_integrals

    pieces = [p for _, p in split]
    areas = segment_integrals(pieces, symbolic=False).values[:, COL["length_y"]] if pieces else []
    leaning = 0.0
    for piece, a in zip(pieces, areas):
        facing = _piece_facing(piece, 1.0)
        leaning += {"inside": float(a), "outside": -float(a)}.get(facing, 0.0)
    if leaning != 0.0:
        return 1.0 if leaning > 0 else -1.0
    # only flat pieces (or a perfect balance): the hand whose normal points along +z
    for piece in pieces:
        r0, r1 = piece.start[1], piece.end[1]
        if r1 != r0:
            return 1.0 if r1 > r0 else -1.0   # right-hand normal (dr, −dz) has axial part dr
    return 1.0


def face_names(found: Iterable[Surface]) -> Tuple[str, ...]:
    """Face names in order of first appearance.

    >>> face_names([Surface("a", "ends", 1.0), Surface("b", "inside", 1.0), Surface("a", "outside", 1.0)])
    ('a', 'b')
    """
    return tuple(dict.fromkeys(s.face for s in found))


def split_names(values: Optional[Iterable[str]]) -> Tuple[str, ...]:
    """Names from options that may each hold a comma-separated list; blanks dropped.

    >>> split_names(["bore, end face", "rim"]), split_names(None)
    (('bore', 'end face', 'rim'), ())
    """
    out: List[str] = []
    for value in values or ():
        out.extend(p.strip() for p in value.split(",") if p.strip())
    return tuple(out)


def check_names(names: Sequence[str], known_faces: Iterable[str], option: str,
                file: Optional[str] = None) -> None:
    """Refuse names that are neither a face of any profile nor a group word, with close names.

    Parameters
    ----------
    names : sequence of str
        What the user wrote.
    known_faces : iterable of str
        Face names of every profile in the run.
    option : str
        The option, for the message (``"--faces"``).
    file : str, optional
        The profile file when there is only one.

    Examples
    --------
    >>> check_names(["bore", "ends"], ["bore", "rim"], "--faces")
    >>> check_names(["bor"], ["bore", "rim"], "--faces", file="a.toml")
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: a.toml: --faces: no face or group "bor"; did you mean "bore"? The faces are bore, rim; the groups outside, inside, ends, all
    """
    known = list(dict.fromkeys(known_faces))
    words = list(GROUPS) + [ALL]
    for name in names:
        if name in known or name in words:
            continue
        close = difflib.get_close_matches(name, known + words, n=2, cutoff=0.6)
        if not close:
            lowered = {k.lower(): k for k in known + words}
            close = [lowered[c] for c in difflib.get_close_matches(name.lower(), list(lowered),
                                                                   n=2, cutoff=0.6)]
        hint = (" did you mean " + " or ".join(f'"{c}"' for c in close) + "?") if close else ""
        raise CoatingError(f'no face or group "{name}"' + (f";{hint} The" if hint else "; the")
                           + ' faces are '
                           f"{', '.join(known) or '(none)'}; the groups {', '.join(words)}",
                           file=file, place=option)


def _matches(s: Surface, name: str, faces: Sequence[str]) -> bool:
    if name == ALL:
        return True
    if name in faces:          # a face name written in the profile wins
        return s.face == name
    return s.facing == name


def select(found: Sequence[Surface], include: Sequence[str] = (), mask: Sequence[str] = (),
           sides: str = "both", cut_faces: bool = False) -> Tuple[Chosen, ...]:
    """Decide which surfaces are coated.

    Parameters
    ----------
    found : sequence of Surface
        From :func:`surfaces`.
    include : sequence of str
        Face names or group words (outside, inside, ends, all); empty means all.
    mask : sequence of str
        Face names or group words to leave out (masked); masking wins.
    sides : {"both", "outer", "inner"}
        Which sides of open chains to count.
    cut_faces : bool
        Count the cut faces of a partial revolution.

    Returns
    -------
    tuple of Chosen

    Examples
    --------
    >>> found = (Surface("bore", "inside", 3.0), Surface("rim", "outside", 5.0),
    ...          Surface("shell", "outside", 2.0, "chain", "outer"),
    ...          Surface("shell", "inside", 2.0, "chain", "inner"))
    >>> [c.included for c in select(found, mask=["bore"], sides="inner")]
    [False, True, False, True]
    >>> [c.reason for c in select(found, include=["outside"])]
    ['not chosen', None, None, 'not chosen']
    >>> coated_area(select(found))
    12.0
    """
    if sides not in SIDES:
        raise CoatingError(f'--sides must be one of {", ".join(SIDES)}, got "{sides}"')
    faces = face_names(found)
    out = []
    for s in found:
        reason = None
        if s.kind == "cut" and not cut_faces:
            reason = "add --cut-faces to count them"
        elif include and not any(_matches(s, n, faces) for n in include):
            reason = "not chosen"
        elif any(_matches(s, n, faces) for n in mask):
            reason = "masked"
        elif s.side is not None and sides not in ("both", s.side):
            reason = f"only the {sides} side"
        out.append(Chosen(s, reason is None, reason))
    return tuple(out)


def coated_area(chosen: Iterable[Chosen]) -> float:
    """Sum of the areas counted.

    >>> coated_area([Chosen(Surface("a", "ends", 1.5), True), Chosen(Surface("b", "ends", 4.0), False)])
    1.5
    """
    return float(math.fsum(c.surface.area for c in chosen if c.included))


def area_by_face(chosen: Iterable[Chosen]) -> Dict[str, float]:
    """Counted area per face name (sides and groups of a face added together).

    >>> area_by_face([Chosen(Surface("a", "ends", 1.5), True), Chosen(Surface("a", "outside", 2.0), True)])
    {'a': 3.5}
    """
    out: Dict[str, float] = {}
    for c in chosen:
        if c.included:
            out[c.surface.face] = out.get(c.surface.face, 0.0) + c.surface.area
    return out


# -- coats --------------------------------------------------------------------------


def spreading_rate_theoretical(volume_solids: float, dft_um: float) -> float:
    """Theoretical spreading rate in m²/L: 10 × VS(%) / DFT(µm) (common practice, no source).

    >>> spreading_rate_theoretical(100, 100), spreading_rate_theoretical(50, 125)
    (10.0, 4.0)
    """
    return 10.0 * volume_solids / dft_um


def spreading_rate_practical(theoretical: float, loss: float) -> float:
    """Practical spreading rate: theoretical × (1 − loss %/100) (common practice, no source).

    >>> spreading_rate_practical(8.0, 25)
    6.0
    """
    return theoretical * (1.0 - loss / 100.0)


def wet_film_um(dft_um: float, volume_solids: float) -> float:
    """Wet film thickness: DFT × 100 / VS(%), same unit as the DFT (common practice, no source).

    >>> wet_film_um(75, 60)
    125.0
    """
    return dft_um * 100.0 / volume_solids


def spreading_rate_in(rate_m2_per_litre: float, area_unit: str, volume_unit: str) -> float:
    """A spreading rate in m²/L converted to ``area_unit`` per ``volume_unit``.

    >>> round(spreading_rate_in(10.0 * 100 / UM_PER_MIL, "ft^2", "US_gal"), 2)  # 1 mil, 100 %
    1604.17
    """
    from revolve import units

    return rate_m2_per_litre / units.factor(area_unit, "area") * (
        units.factor(volume_unit, "volume") / units.factor("L", "volume"))


def _exact(value: Any) -> Fraction:
    """A number as the user wrote it, exactly: an int or a float's shortest decimal.

    >>> _exact(2.4), _exact(3), _exact(Fraction(1, 3))
    (Fraction(12, 5), Fraction(3, 1), Fraction(1, 3))
    """
    if isinstance(value, (int, Fraction)):
        return Fraction(value)
    return Fraction(repr(float(value)))


def film_in(um: float, um_exact: Optional[Fraction], unit: str) -> float:
    """A film thickness given in µm, in ``unit``; exact when both are exact.

    Converting through exact fractions (1 mil = 25.4 µm by definition) brings
    the user's own number back unchanged: 1 mil is 1 mil, not 0.9999999999999999.

    >>> film_in(25.4, Fraction(127, 5), "mil"), round(film_in(25.4, None, "mil"), 12)
    (1.0, 1.0)
    >>> film_in(60.0, Fraction(60), "mm")
    0.06
    """
    from revolve import units

    exact = units.exact_factor(unit, "length")
    if um_exact is not None and exact is not None:
        return float(um_exact / 1_000_000 / exact)
    return um * 1e-6 / units.factor(unit, "length")


@dataclass(frozen=True)
class Coat:
    """One coat: dry film (µm), volume solids (%), loss factor (%), price per litre or None.

    ``dft_exact`` keeps the film as the user gave it (an exact fraction of a
    µm), so that it reads back in any unit without float noise.
    """

    name: str
    dft_um: float
    volume_solids: float
    loss: float
    price_per_litre: Optional[float] = None
    #: The dry film in µm exactly as the user's number and unit give it (None: not known).
    dft_exact: Optional[Fraction] = field(default=None, compare=False, repr=False)
    #: The price per litre exactly as the user's number and unit give it (None: not known).
    price_exact: Optional[Fraction] = field(default=None, compare=False, repr=False)
    #: What the coat is bought as (:class:`revolve.jobs.packs.Product`): packs, two-pack
    #: mixing ratio, minimum mix, thinner; None when no packs are given.
    product: Any = field(default=None, compare=False, repr=False)

    def price_in(self, volume_unit: str) -> Optional[float]:
        """The price per ``volume_unit``, converted exactly from what the user wrote; or None.

        >>> make_coat(dft_um=50, volume_solids=50, loss=0, price_per_us_gallon=0.17).price_in("US_gal")
        0.17
        >>> make_coat(dft_um=50, volume_solids=50, loss=0, price_per_litre=2).price_in("m^3")
        2000.0
        """
        from revolve import units

        if self.price_per_litre is None:
            return None
        exact = units.exact_factor(volume_unit, "volume")
        if self.price_exact is not None and exact is not None:
            return float(self.price_exact * exact * 1000)
        return self.price_per_litre * units.factor(volume_unit, "volume") / units.factor("L",
                                                                                         "volume")

    def dft_in(self, unit: str) -> float:
        """The dry film in ``unit``, converted exactly from what the user wrote.

        >>> make_coat(dft_mils=1, volume_solids=50, loss=0).dft_in("mil")
        1.0
        >>> make_coat(dft_mils=2.4, volume_solids=50, loss=0).dft_in("um")
        60.96
        """
        return film_in(self.dft_um, self.dft_exact, unit)

    def wet_film_in(self, unit: str) -> float:
        """The wet film (DFT × 100 / VS) in ``unit``.

        >>> make_coat(dft_mils=1, volume_solids=50, loss=0).wet_film_in("mil")
        2.0
        """
        if self.dft_exact is None:
            return film_in(self.wet_film_um, None, unit)
        return film_in(self.wet_film_um,
                       self.dft_exact * 100 / _exact(self.volume_solids), unit)

    @property
    def spreading_rate_theoretical(self) -> float:
        """m²/L at the dry film thickness, no losses."""
        return spreading_rate_theoretical(self.volume_solids, self.dft_um)

    @property
    def spreading_rate_practical(self) -> float:
        """m²/L after the loss factor."""
        return spreading_rate_practical(self.spreading_rate_theoretical, self.loss)

    @property
    def wet_film_um(self) -> float:
        """Wet film thickness to apply, µm."""
        return wet_film_um(self.dft_um, self.volume_solids)

    def litres_for(self, area_m2: float) -> float:
        """Litres to buy for ``area_m2`` square metres, losses included."""
        return area_m2 / self.spreading_rate_practical

    def litres_theoretical_for(self, area_m2: float) -> float:
        """Litres that end up as film on ``area_m2``, no losses."""
        return area_m2 / self.spreading_rate_theoretical

    def cost_for(self, litres: float) -> Optional[float]:
        """Cost of ``litres``, or None without a price."""
        return None if self.price_per_litre is None else litres * self.price_per_litre


def make_coat(name: Optional[str] = None, *, dft_um: Any = None, dft_mils: Any = None,
              volume_solids: Any = None, loss: Any = None, price_per_litre: Any = None,
              price_per_us_gallon: Any = None, where: Optional[Mapping[str, Tuple]] = None,
              number: int = 1) -> Coat:
    """Check one coat's inputs and build it.

    Parameters
    ----------
    name : str, optional
        Default ``"coat N"`` with N = ``number``.
    dft_um, dft_mils : float
        Dry film thickness in µm or in mils (0.001 in): exactly one.
    volume_solids : float
        Percent, above 0 and at most 100.
    loss : float
        Loss factor, percent, at least 0 and below 100.
    price_per_litre, price_per_us_gallon : float, optional
        At most one; at least 0.
    where : mapping, optional
        For each input name, ``(file, line, place)`` to put in an error.
    number : int
        The coat's position, for the default name.

    Raises
    ------
    CoatingError
        Missing or impossible values.

    Examples
    --------
    >>> make_coat(dft_mils=2, volume_solids=50, loss=0).dft_um
    50.8
    >>> make_coat(dft_um=75, volume_solids=0, loss=10)
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: volume_solids: the volume solids must be above 0 and at most 100 %, got 0
    >>> make_coat(dft_um=75, volume_solids=60, loss=100, where={"loss": ("s.toml", 9, "coat 2, loss")})
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: s.toml:9: coat 2, loss: the loss factor must be at least 0 and below 100 %, got 100
    """
    where = dict(where or {})

    def fail(key: str, message: str) -> CoatingError:
        file, line, place = where.get(key, (None, None, key))
        return CoatingError(message, file=file, line=line, place=place)

    def value(key: str, raw: Any, what: str) -> Optional[float]:
        if raw is None:
            return None
        if isinstance(raw, str):
            raise fail(key, f"{what} must be a plain number, without quotes, units or a % sign; "
                            f"got {raw!r}")
        if isinstance(raw, bool) or not isinstance(raw, (int, float, Fraction)):
            raise fail(key, f"{what} must be a number, got {raw!r}")
        v = float(raw)
        if not math.isfinite(v):
            raise fail(key, f"{what} must be a finite number, got {raw!r}")
        return v

    if dft_um is not None and dft_mils is not None:
        raise fail("dft_mils", "give the dry film thickness once: in µm or in mils, not both")
    if dft_um is None and dft_mils is None:
        raise fail("dft", "the dry film thickness is missing; give it in µm or in mils")
    if dft_um is not None:
        dft = value("dft_um", dft_um, "the dry film thickness")
        key, shown, exact = "dft_um", f"{dft:g} µm", _exact(dft_um)
    else:
        mils = value("dft_mils", dft_mils, "the dry film thickness")
        key, shown = "dft_mils", f"{mils:g} mils"
        exact = _exact(dft_mils) * Fraction(127, 5)       # 1 mil = 25.4 µm exactly
    dft = float(exact)
    if not dft > 0:
        raise fail(key, f"the dry film thickness must be above 0, got {shown}")
    if dft > MAX_DFT_UM:
        raise fail(key, f"a dry film of {shown} is thicker than 50 mm; is the unit right "
                        "(µm, or mils = 0.001 in)?")
    vs = value("volume_solids", volume_solids, "the volume solids")
    if vs is None:
        raise fail("volume_solids", "the volume solids (%) are missing; see the data sheet")
    if not 0 < vs <= 100:
        raise fail("volume_solids", f"the volume solids must be above 0 and at most 100 %, got {vs:g}")
    lf = value("loss", loss, "the loss factor")
    if lf is None:
        raise fail("loss", "the loss factor (%) is missing; give 0 for none")
    if not 0 <= lf < 100:
        raise fail("loss", f"the loss factor must be at least 0 and below 100 %, got {lf:g}")
    if price_per_litre is not None and price_per_us_gallon is not None:
        raise fail("price_per_us_gallon", "give the price per litre or per US gallon, not both")
    price = value("price_per_litre", price_per_litre, "the price per litre")
    price_exact = None if price is None else _exact(price_per_litre)
    if price_per_us_gallon is not None:
        gal = value("price_per_us_gallon", price_per_us_gallon, "the price per US gallon")
        if gal < 0:
            raise fail("price_per_us_gallon", f"the price must be at least 0, got {gal:g}")
        # 1 US gal = 231 in³ = 3.785411784 L exactly
        price_exact = _exact(price_per_us_gallon) / Fraction(473176473, 125000000)
        price = float(price_exact)
    if price is not None and price < 0:
        raise fail("price_per_litre", f"the price must be at least 0, got {price:g}")
    if name is not None and (not isinstance(name, str) or not name.strip()):
        raise fail("name", f"the coat's name must be a non-empty text, got {name!r}")
    return Coat(name.strip() if name else f"coat {number}", dft, vs, lf, price, exact,
                price_exact)


def parse_film_thickness(text: str, default_unit: str = "um") -> float:
    """A dry film thickness from text, in µm: ``"75"`` (in ``default_unit``), ``"3 mil"``, ``"0.1 mm"``.

    >>> parse_film_thickness("75"), parse_film_thickness("2 mils"), parse_film_thickness("2", "mil")
    (75.0, 50.8, 50.8)
    >>> parse_film_thickness("thick")
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: --dft: give the dry film thickness as a number (µm) or with its unit, e.g. 75 um or 3 mil; got 'thick'
    """
    key, value = read_film_thickness(text, default_unit)
    return float(value * Fraction(127, 5)) if key == "dft_mils" else float(value)


def read_film_thickness(text: str, default_unit: str = "um",
                        option: str = "--dft") -> Tuple[str, Any]:
    """A dry film thickness from text, as :func:`make_coat` takes it: ``("dft_um", µm)`` or
    ``("dft_mils", mils)``, the number kept exact (a Fraction) where the unit is exact.

    >>> read_film_thickness("1", "mil"), read_film_thickness("0.1 mm")
    (('dft_mils', Fraction(1, 1)), ('dft_um', Fraction(100, 1)))

    A pint quantity is read as its magnitude and unit (``Quantity(75, "um")``).
    """
    from revolve import units

    if hasattr(text, "magnitude") and hasattr(text, "units"):          # a pint quantity
        text = f"{float(text.magnitude)!r} {text.units:~}"
    found = re.fullmatch(r"\s*([+-]?(?:\d+\.?\d*|\.\d+)(?:[eE][+-]?\d+)?)\s*(.*?)\s*", text or "")
    if found:
        unit = found.group(2) or default_unit
        try:
            exact = units.exact_factor(unit, "length")
            plain = float(found.group(1))
            if exact is not None and len(found.group(1)) <= 40 \
                    and (plain == 0 or 1e-300 < abs(plain) < 1e300):
                number = Fraction(found.group(1))
                if units.canonical(unit) == "mil":
                    return "dft_mils", number
                return "dft_um", number * exact * 1_000_000
            return "dft_um", plain * units.factor(unit, "length") * 1e6
        except (RevolveError, ValueError, OverflowError, ZeroDivisionError):
            pass
    raise CoatingError("give the dry film thickness as a number "
                       f"({units.canonical(default_unit)}) or with its unit, e.g. 75 um or 3 mil; "
                       f"got {text!r}", place=option)


@dataclass(frozen=True)
class CoatingSystem:
    """Coats in the order they are applied, with an optional name and currency label."""

    coats: Tuple[Coat, ...]
    name: Optional[str] = None
    currency: Optional[str] = None
    file: Optional[str] = None
    #: A system per face group (``[[group]]`` tables): then ``coats`` is empty.
    groups: Tuple["FaceGroup", ...] = ()

    def plans(self) -> Tuple[Tuple[Optional[str], Tuple[str, ...], "CoatingSystem"], ...]:
        """(group name or None, its faces, its coats as a system) for each group, or the whole.

        >>> one = CoatingSystem((make_coat(dft_um=50, volume_solids=50, loss=0),))
        >>> [(g, f, len(s.coats)) for g, f, s in one.plans()]
        [(None, (), 1)]
        """
        if not self.groups:
            return ((None, (), self),)
        return tuple((g.name, g.faces, CoatingSystem(g.coats, g.name, self.currency, self.file))
                     for g in self.groups)

    @property
    def all_coats(self) -> Tuple[Coat, ...]:
        """Every coat of every group (the coats of a system without groups)."""
        return self.coats + tuple(c for g in self.groups for c in g.coats)

    @property
    def dft_um(self) -> float:
        """Total dry film of the system, µm."""
        return float(math.fsum(c.dft_um for c in self.coats))

    def dft_in(self, unit: str) -> float:
        """Total dry film in ``unit``, exact when every coat's film is.

        >>> system = CoatingSystem((make_coat(dft_mils=1, volume_solids=50, loss=0),
        ...                         make_coat(dft_mils=2, volume_solids=50, loss=0)))
        >>> system.dft_in("mil")
        3.0
        """
        exact = [c.dft_exact for c in self.coats]
        total = sum(exact, Fraction(0)) if all(e is not None for e in exact) else None
        return film_in(self.dft_um, total, unit)


@dataclass(frozen=True)
class FaceGroup:
    """A face group of a coating-system file: its name, faces (names or group words), coats."""

    name: str
    faces: Tuple[str, ...]
    coats: Tuple[Coat, ...]


#: Keys of the coating-system file.
SYSTEM_KEYS = ("name", "currency", "coat", "group")
#: Keys of one ``[[group]]`` table (a system for some faces).
GROUP_KEYS = ("name", "faces", "coat")
#: What a coat is bought as: keys of a ``[[coat]]`` table for :class:`packs.Product`.
PRODUCT_KEYS = ("product", "packs_litres", "pack_prices", "mix_ratio", "hardener_packs_litres",
                "hardener_pack_prices", "minimum_mix_litres", "thinner_percent",
                "thinner_limit_percent", "thinner_packs_litres", "thinner_pack_prices")
#: Keys of one ``[[coat]]`` table.
COAT_KEYS = ("name", "dft_um", "dft_mils", "volume_solids", "loss", "price_per_litre",
             "price_per_us_gallon") + PRODUCT_KEYS

_HEADER = re.compile(r"\s*(\[\[?)\s*([A-Za-z0-9_.\"' -]+?)\s*\]\]?\s*(?:#.*)?$")
_KEY = re.compile(r"\s*([A-Za-z0-9_-]+|\"[^\"]*\"|'[^']*')\s*[.=]")


def key_lines(text: str) -> Dict[str, int]:
    """Line of each key of a coating-system file: ``"name"``, ``"coat 2"``, ``"coat 2.loss"``.

    A light scan of the text that tomllib has already accepted; layouts it does
    not follow simply give fewer lines.

    >>> key_lines('name = "x"\\n[[coat]]\\ndft_um = 5\\n\\n[[coat]]\\n# c\\nloss = 3\\n')
    {'name': 1, 'coat 1': 2, 'coat 1.dft_um': 3, 'coat 2': 5, 'coat 2.loss': 7}
    >>> key_lines('[[group]]\\nfaces = ["inside"]\\n[[group.coat]]\\nloss = 3\\n')
    {'group 1': 1, 'group 1.faces': 2, 'group 1, coat 1': 3, 'group 1, coat 1.loss': 4}
    """
    found: Dict[str, int] = {}
    table = ""
    count = 0
    groups = 0
    in_string = None
    for number, line in enumerate(text.splitlines(), 1):
        if in_string:
            if line.count(in_string) % 2:
                in_string = None
            continue
        for quote in ('"""', "'''"):
            if line.count(quote) % 2:
                in_string = quote
        m = _HEADER.match(line)
        if m:
            name = m.group(2).strip().strip("\"'")
            if m.group(1) == "[[" and name == "coat":
                count += 1
                table = f"coat {count}"
            elif m.group(1) == "[[" and name == "group":
                groups += 1
                count = 0
                table = f"group {groups}"
            elif m.group(1) == "[[" and name == "group.coat" and groups:
                count += 1
                table = f"group {groups}, coat {count}"
            else:
                table = name
            found.setdefault(table, number)
            continue
        m = _KEY.match(line)
        if m:
            key = m.group(1).strip("\"'")
            found.setdefault(f"{table}.{key}" if table else key, number)
    return found


def _file_product(table: Mapping[str, Any], name: str, places: Mapping[str, Tuple],
                  label: str) -> Any:
    """The :class:`packs.Product` of a ``[[coat]]`` table, or None without ``packs_litres``."""
    from revolve.jobs import packs

    given = [k for k in PRODUCT_KEYS if k in table]
    if not given:
        return None

    def fail(key: str, message: str) -> FormatError:
        file, line, place = places.get(key, (None, None, label))
        return FormatError(message, file=file, line=line, place=place)

    if "packs_litres" not in table:
        raise fail(given[0], f"{given[0]} needs packs_litres: the sizes the product is sold in")

    def numbers(key: str, *, positive: bool) -> Optional[List[float]]:
        raw = table.get(key)
        if raw is None:
            return None
        items = raw if isinstance(raw, list) else [raw]
        ok = items and all(not isinstance(v, bool) and isinstance(v, (int, float))
                           and math.isfinite(v) and (v > 0 if positive else v >= 0)
                           for v in items)
        if not ok:
            raise fail(key, f"{key} must be a list of plain numbers "
                            f"{'above 0' if positive else 'of 0 or more'}, got {raw!r}")
        return [float(v) for v in items]

    def pack_list(sizes_key: str, prices_key: str) -> Tuple:
        sizes = numbers(sizes_key, positive=True)
        if sizes is None:
            if prices_key in table:
                raise fail(prices_key, f"{prices_key} needs {sizes_key}")
            return ()
        prices = numbers(prices_key, positive=False)
        if prices is not None and len(prices) != len(sizes):
            raise fail(prices_key, f"give one price for each pack size ({len(sizes)} sizes, "
                                   f"{len(prices)} prices)")
        return tuple(packs.Pack(v, None if prices is None else prices[i])
                     for i, v in enumerate(sizes))

    def one(key: str) -> Optional[float]:
        v = table.get(key)
        if v is None:
            return None
        if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v) \
                or v < 0 or (key.endswith("percent") and v > 100):
            raise fail(key, f"{key} must be a plain number of 0 or more"
                            f"{' and at most 100' if key.endswith('percent') else ''}, got {v!r}")
        return float(v)

    product_name = table.get("product", name)
    if not isinstance(product_name, str) or not product_name.strip():
        raise fail("product", f"product must be a non-empty text in quotes, got {product_name!r}")
    ratio = numbers("mix_ratio", positive=True)
    if ratio is not None and len(ratio) != 2:
        raise fail("mix_ratio", f"mix_ratio is two numbers, base and hardener by volume, such "
                                f"as [4, 1]; got {table['mix_ratio']!r}")
    base = pack_list("packs_litres", "pack_prices")
    hardener = pack_list("hardener_packs_litres", "hardener_pack_prices")
    thinner = pack_list("thinner_packs_litres", "thinner_pack_prices")
    least, percent, limit = (one("minimum_mix_litres"), one("thinner_percent"),
                             one("thinner_limit_percent"))
    try:
        return packs.Product(product_name.strip(), base,
                             mix_ratio=None if ratio is None else tuple(ratio),
                             hardener_packs=hardener, minimum_mix=least or 0.0,
                             thinner_percent=percent or 0.0, thinner_limit=limit,
                             thinner_packs=thinner)
    except RevolveError as e:
        key = "mix_ratio" if "ratio" in e.message or "hardener" in e.message else \
            "thinner_percent" if "thinn" in e.message else "packs_litres"
        raise fail(key, e.message) from None


def _suggest_key(key: str, options: Sequence[str]) -> str:
    close = difflib.get_close_matches(key, list(options), n=2, cutoff=0.6)
    if close:
        return "; did you mean " + " or ".join(f'"{c}"' for c in close) + "?"
    return "; the keys here are " + ", ".join(options)


def parse_coating_system(text: str, file: Optional[str] = None) -> CoatingSystem:
    """Read a coating-system file (see the module docstring for its keys).

    Parameters
    ----------
    text : str
        The TOML text.
    file : str, optional
        The file name, for messages.

    Raises
    ------
    FormatError
        Malformed TOML, unknown keys, wrong types, no coats.
    CoatingError
        Impossible values (VS 0, loss 100 %, negative film...), with file and line.

    Examples
    --------
    >>> s = parse_coating_system('name = "one coat"\\n[[coat]]\\ndft_um = 80\\nvolume_solids = 80\\nloss = 20\\n')
    >>> s.name, s.coats[0].name, s.coats[0].spreading_rate_practical
    ('one coat', 'coat 1', 8.0)
    >>> parse_coating_system('[[coat]]\\ndft = 80\\n', file="s.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: s.toml:2: coat 1: unknown key "dft"; did you mean "dft_um"?
    """
    from revolve.datafiles import toml

    tomllib = toml()

    if not text.strip():
        raise FormatError("the coating-system file is empty", file=file)
    try:
        data = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        found = re.search(r"at line (\d+)", str(exc))
        raise FormatError(f"malformed TOML: {exc}", file=file,
                          line=int(found.group(1)) if found else None) from None
    lines = key_lines(text)

    def where(key: str, place: Optional[str] = None) -> Tuple:
        line = lines.get(key)
        if line is None and "." in key:
            line = lines.get(key.split(".", 1)[0])
        return (file, line, place)

    def fail(message: str, key: str, place: Optional[str] = None) -> FormatError:
        f, line, p = where(key, place)
        return FormatError(message, file=f, line=line, place=p)

    for key in data:
        if key not in SYSTEM_KEYS:
            hint = _suggest_key(key, SYSTEM_KEYS)
            if key in COAT_KEYS:
                hint = "; it belongs under a [[coat]] header"
            raise fail(f'unknown key "{key}"{hint}', key)
    texts = {}
    for key in ("name", "currency"):
        v = data.get(key)
        if v is not None and (not isinstance(v, str) or not v.strip()):
            raise fail(f"{key} must be a non-empty text in quotes, got {v!r}", key, key)
        texts[key] = v.strip() if v else None
    def read_coats(raw: Any, prefix: str, header: str) -> Tuple[Coat, ...]:
        if raw is None or raw == []:
            raise fail(f"no {header}; a coating system needs at least one coat",
                       prefix.rstrip(", ") or "coat", prefix.rstrip(", ") or None)
        if isinstance(raw, dict):
            raise fail(f"write {header} with two brackets, one header for each coat",
                       f"{prefix}coat 1" if prefix else "coat", "coat")
        if not isinstance(raw, list):
            raise fail(f"coat must be given as {header} tables, got {raw!r}", "coat", "coat")
        coats = []
        for i, table in enumerate(raw, 1):
            label = f"{prefix}coat {i}"
            if not isinstance(table, dict):
                raise fail(f"{label} must be a table, got {table!r}", label, label)
            for key in table:
                if key not in COAT_KEYS:
                    raise fail(f'unknown key "{key}"{_suggest_key(key, COAT_KEYS)}',
                               f"{label}.{key}", label)
            places = {k: where(f"{label}.{k}", f"{label}, {k}") for k in COAT_KEYS}
            places["dft"] = where(label, label)
            coat = make_coat(table.get("name"), dft_um=table.get("dft_um"),
                             dft_mils=table.get("dft_mils"),
                             volume_solids=table.get("volume_solids"), loss=table.get("loss"),
                             price_per_litre=table.get("price_per_litre"),
                             price_per_us_gallon=table.get("price_per_us_gallon"),
                             where=places, number=i)
            product = _file_product(table, coat.name, places, label)
            coats.append(dataclasses.replace(coat, product=product) if product else coat)
        return tuple(coats)

    if "group" in data:
        if "coat" in data:
            raise fail("give [[coat]] tables or [[group]] tables (a system per face group), "
                       "not both", "group", "group")
        raw_groups = data["group"]
        if not isinstance(raw_groups, list) or not raw_groups:
            raise fail("write [[group]] with two brackets, one header for each face group",
                       "group 1", "group")
        groups, seen = [], set()
        for g, table in enumerate(raw_groups, 1):
            label = f"group {g}"
            if not isinstance(table, dict):
                raise fail(f"{label} must be a table, got {table!r}", label, label)
            for key in table:
                if key not in GROUP_KEYS:
                    hint = _suggest_key(key, GROUP_KEYS)
                    if key in COAT_KEYS:
                        hint = "; it belongs under a [[group.coat]] header"
                    raise fail(f'unknown key "{key}"{hint}', f"{label}.{key}", label)
            gname = table.get("name", label)
            if not isinstance(gname, str) or not gname.strip():
                raise fail(f"name must be a non-empty text in quotes, got {gname!r}",
                           f"{label}.name", f"{label}, name")
            gname = gname.strip()
            if gname in seen:
                raise fail(f"the group name {gname!r} is used twice", f"{label}.name",
                           f"{label}, name")
            seen.add(gname)
            faces = table.get("faces")
            if isinstance(faces, str):
                faces = [faces]
            if not isinstance(faces, list) or not faces or \
                    not all(isinstance(f, str) and f.strip() for f in faces):
                raise fail('faces must be a list of face names or groups in quotes, such as '
                           '["inside"]', f"{label}.faces" if "faces" in table else label,
                           f"{label}, faces")
            groups.append(FaceGroup(gname, tuple(f.strip() for f in faces),
                                    read_coats(table.get("coat"), f"{label}, ",
                                               "[[group.coat]]")))
        return CoatingSystem((), texts["name"], texts["currency"], file, tuple(groups))
    if data.get("coat") in (None, []):
        raise FormatError("the file has no [[coat]]; a coating system needs at least one coat",
                          file=file)
    coats = read_coats(data.get("coat"), "", "[[coat]]")
    return CoatingSystem(tuple(coats), texts["name"], texts["currency"], file)


# -- quantities for a batch -----------------------------------------------------------


@dataclass(frozen=True)
class PartArea:
    """One kind of part in the batch: area to coat on one part (m²) and how many.

    ``by_face`` holds (face, m² on one part) pairs.
    """

    name: str
    area_each: float
    quantity: int = 1
    by_face: Tuple[Tuple[str, float], ...] = ()

    @property
    def area_total(self) -> float:
        return self.area_each * self.quantity


@dataclass(frozen=True)
class CoatQuantity:
    """One coat over an area (m²): litres to buy, litres left as film, cost (None: no price)."""

    coat: Coat
    area: float
    litres: float
    litres_theoretical: float
    cost: Optional[float]


@dataclass(frozen=True)
class PartEstimate:
    """A part of the batch with its coats (for its whole quantity)."""

    part: PartArea
    coats: Tuple[CoatQuantity, ...]

    @property
    def litres(self) -> float:
        return float(math.fsum(c.litres for c in self.coats))

    @property
    def cost(self) -> Optional[float]:
        return _cost_sum(self.coats)


@dataclass(frozen=True)
class Estimate:
    """Coating quantities for a batch: per part and per coat, and the totals (m², L, money)."""

    system: CoatingSystem
    parts: Tuple[PartEstimate, ...]
    coats: Tuple[CoatQuantity, ...]

    @property
    def area(self) -> float:
        """Area coated by each coat, m² (every coat covers the whole batch)."""
        return float(math.fsum(p.part.area_total for p in self.parts))

    @property
    def quantity(self) -> int:
        return sum(p.part.quantity for p in self.parts)

    @property
    def litres(self) -> float:
        return float(math.fsum(c.litres for c in self.coats))

    @property
    def cost(self) -> Optional[float]:
        """Total cost of the priced coats; None when no coat has a price."""
        return _cost_sum(self.coats)

    @property
    def cost_complete(self) -> bool:
        """Whether every coat has a price."""
        return all(c.price_per_litre is not None for c in self.system.coats)


def _cost_sum(quantities: Sequence[CoatQuantity]) -> Optional[float]:
    costs = [q.cost for q in quantities if q.cost is not None]
    return float(math.fsum(costs)) if costs else None


def coat_quantity(coat: Coat, area_m2: float) -> CoatQuantity:
    """Litres and cost of one coat over ``area_m2``.

    >>> q = coat_quantity(Coat("finish", 50, 50, 20, 10.0), 16.0)
    >>> q.litres, q.litres_theoretical, q.cost
    (2.0, 1.6, 20.0)
    """
    litres = coat.litres_for(area_m2)
    return CoatQuantity(coat, area_m2, litres, coat.litres_theoretical_for(area_m2),
                        coat.cost_for(litres))


def estimate(system: CoatingSystem, parts: Sequence[PartArea]) -> Estimate:
    """Quantities of every coat for every part of a batch, and in total.

    Examples
    --------
    >>> system = CoatingSystem((Coat("primer", 100, 50, 0, 2.0), Coat("finish", 50, 50, 50)))
    >>> e = estimate(system, [PartArea("a", 1.5, 4), PartArea("b", 2.0, 2)])
    >>> e.area, [c.litres for c in e.coats], e.cost, e.cost_complete
    (10.0, [2.0, 2.0], 4.0, False)
    >>> [p.litres for p in e.parts]
    [2.4, 1.6]
    """
    per_part = tuple(PartEstimate(p, tuple(coat_quantity(c, p.area_total) for c in system.coats))
                     for p in parts)
    total_area = float(math.fsum(p.area_total for p in parts))
    return Estimate(system, per_part, tuple(coat_quantity(c, total_area) for c in system.coats))


# -- the job: profiles and a coating system to a Result ------------------------------------

#: Relative tolerance of the surface cross-check unless told otherwise (``--tolerance``).
DEFAULT_TOLERANCE = 1e-9
#: The small-part rule: when every part's coated area would show below this in the default
#: area unit (m², ft²), areas are shown in :data:`SMALL_AREA` instead; when every coat's paint
#: would show below it in the default paint unit (L, US gal), paint is shown in mL.
SMALL = 0.01
#: The area unit of small parts (metric, inch-pound).
SMALL_AREA = ("cm²", "in²")

#: How errors name each input on the command line ...
CLI_NAMES = {"dft": "--dft", "volume_solids": "--volume-solids", "loss": "--loss",
             "price_per_litre": "--price-per-litre", "price_per_gallon": "--price-per-gallon",
             "coat_name": "--coat-name", "currency": "--currency", "system": "--system",
             "quantity": "--quantity", "faces": "--faces", "mask": "--mask", "sides": "--sides",
             "area_unit": "--area-unit", "paint_unit": "--volume-unit", "film_unit": "--film-unit",
             "axis": "--axis", "angle": "--angle", "units": "--units", "tolerance": "--tolerance",
             "packs": "--packs", "mix_ratio": "--mix-ratio", "hardener_packs": "--hardener-packs",
             "minimum_mix": "--minimum-mix", "thinner": "--thinner",
             "thinner_limit": "--thinner-limit", "thinner_packs": "--thinner-packs",
             "pack_rule": "--pack-rule", "prepare": "--prepare", "abrasive": "--abrasive",
             "stripe_band": "--stripe-band", "stripe_percent": "--stripe-percent",
             "application_rate": "--application-rate", "labour_rate": "--labour-rate"}
#: ... and in the library (the parameters of :func:`estimate_coating`).
LIBRARY_NAMES = {key: key for key in CLI_NAMES}

#: The trade's formulas, printed under the estimate.
FORMULAS = ("rate: the theoretical spreading rate, 10 × VS % ÷ DFT in µm, m²/L (1604.17 × VS % "
            "÷ 100 ÷ DFT in mils, ft²/US gal); practical = rate × (1 − loss % ÷ 100); to buy = "
            "area ÷ practical; WFT = DFT × 100 ÷ VS % (VS: volume solids)")


@dataclass(frozen=True, repr=False)
class CoatingResult(Result):
    """A coating estimate (:func:`estimate_coating`): tables in SI, shown in :attr:`units`.

    ``disagreements`` lists ``(file or name, relative difference)`` for every
    part whose two surface computations differ by more than the tolerance
    (the command then exits with code 1).

    Examples
    --------
    A pin 30 across and 50 long, painted all over: 2π·15·50 + 2π·15² =
    1950π mm² = 61.2611 cm² (from memory); at 100 µm dry and 50 % volume
    solids with no loss, 2 × 100 µm of wet paint over it, 1.22522 mL:

    >>> from revolve.geometry.profile import Loop, Profile
    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)]),), name="pin")
    >>> c = estimate_coating(pin, dft="100 um", volume_solids="50 %", loss=0)
    >>> c
    <CoatingResult: 1 part, area 61.2611 cm², paint 1.22522 mL>
    >>> round(c.area, 4) == round(1950 * math.pi / 100, 4), c.to_dict()["units"]["paint"]
    (True, 'mL')
    >>> c._repr_html_().startswith("<table>")
    True
    """

    disagreements: Tuple[Tuple[str, float], ...] = ()

    def __repr__(self) -> str:
        u = self.to_dict()["units"]
        n = self._total("quantity")
        cost = self.cost
        money = "" if cost is None else \
            f", cost {cost:.2f}{' ' + self.units.currency if self.units.currency else ''}"
        return (f"<CoatingResult: {n} part{'s' if n != 1 else ''}, area {self.area:.6g} "
                f"{u['area']}, paint {self.paint:.6g} {u['paint']}{money}>")

    def _total(self, key: str) -> Optional[float]:
        return self.table("total").json(self.units).get(key)

    @property
    def area(self) -> float:
        """Area each coat covers over the whole batch, in ``to_dict()["units"]["area"]``."""
        return self._total("area")

    @property
    def paint(self) -> float:
        """Paint to buy, every coat and part, losses included, in ``units["paint"]``."""
        return self._total("paint")

    @property
    def cost(self) -> Optional[float]:
        """Cost of the priced coats (None when no coat has a price)."""
        return self._total("cost")


def _quantities(value: Any, count: int, option: str) -> List[int]:
    """One quantity per part: None (1 each), a whole number, a list, or text ``"200,50,100"``.

    >>> _quantities(None, 2, "quantity"), _quantities("3", 2, "quantity"), _quantities([2, 5], 2, "q")
    ([1, 1], [3, 3], [2, 5])
    >>> _quantities([1, 2, 3], 2, "--quantity")
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: --quantity: give one quantity for every part, or one per part in order (2 parts); got 3
    """
    from revolve.inputs import parse_list

    def whole(item: Any) -> int:
        text = str(item).strip()
        if isinstance(item, bool) or not text.isdigit() or len(text) > 9 or int(text) < 1:
            raise CoatingError(f"{item!r} is not a whole number of 1 or more", option=option)
        return int(text)

    if value is None:
        values = [1]
    elif isinstance(value, str):
        try:
            values = parse_list(value, whole, "whole number")
        except RevolveError as e:
            raise e.located(option=option)
    elif isinstance(value, (list, tuple)):
        values = [whole(v) for v in value]
    else:
        values = [whole(value)]
    if not values:
        values = [1]
    if len(values) == 1:
        return values * count
    if len(values) != count:
        raise CoatingError(f"give one quantity for every part, or one per part in order ({count} "
                           f"part{'s' if count != 1 else ''}); got {len(values)}", option=option)
    return values


def _percent(value: Any, option: str) -> Any:
    """A percentage as given (number, or text with or without %), for :func:`make_coat`."""
    if not isinstance(value, str):
        return value
    from revolve.inputs import parse_percent

    try:
        return parse_percent(value)
    except RevolveError as e:
        raise e.located(option=option)


def _percent_in_range(value: Any, option: str) -> float:
    """A percentage from 0 to 100 (a number, or text with or without %).

    >>> _percent_in_range("5 %", "thinner"), _percent_in_range(12, "thinner")
    (5.0, 12.0)
    >>> _percent_in_range(150, "thinner")
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: thinner: give a percentage from 0 to 100, got 150
    """
    v = _percent(value, option)
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not 0 <= v <= 100:
        raise CoatingError(f"give a percentage from 0 to 100, got {value!r}", option=option)
    return float(v)


def _money(value: Any, option: str) -> Tuple[Any, Optional[str]]:
    """An amount and its currency code (None) from a number, text such as "21.50 EUR" or a Money."""
    from revolve.inputs import Money, parse_money

    if value is None:
        return None, None
    if isinstance(value, str):
        try:
            value = parse_money(value)
        except RevolveError as e:
            raise e.located(option=option)
    if isinstance(value, Money):
        return value.amount, value.currency
    return value, None


def _system(system: Any, names: Mapping[str, str], *, coat_name, dft, volume_solids, loss,
            price_per_litre, price_per_gallon, currency, film_unit: str,
            bought_as: Optional[Mapping[str, Any]] = None,
            labour_rate: Any = None) -> CoatingSystem:
    """The coating system: a file (or a CoatingSystem), or one coat from the single-coat inputs."""
    from dataclasses import replace

    litre, litre_code = _money(price_per_litre, names["price_per_litre"])
    gallon, gallon_code = _money(price_per_gallon, names["price_per_gallon"])
    from revolve.jobs.packs import pack_currency

    bought_as = dict(bought_as or {})
    codes = {names[k]: c for k, c in (("currency", currency and currency.strip().upper()),
                                      ("price_per_litre", litre_code),
                                      ("price_per_gallon", gallon_code),
                                      ("labour_rate", _money(labour_rate,
                                                             names["labour_rate"])[1]),
                                      *((k, pack_currency(bought_as.get(k)))
                                        for k in ("packs", "hardener_packs", "thinner_packs")))
             if c}
    if len(set(codes.values())) > 1:
        raise CoatingError("the prices and the currency name different currencies ("
                           + ", ".join(f"{k} {v}" for k, v in codes.items())
                           + "); give one currency", option=next(iter(codes)))
    code = next(iter(codes.values()), None)
    single = {"dft": dft, "volume_solids": volume_solids, "loss": loss, "coat_name": coat_name,
              "price_per_litre": price_per_litre, "price_per_gallon": price_per_gallon,
              **bought_as}
    given = [names[k] for k, v in single.items() if v is not None]
    if system is not None:
        if given:
            raise CoatingError(f"give either a coating-system file or the inputs of one coat, not "
                               f"both ({', '.join(given)} given with it)", option=names["system"])
        if isinstance(system, CoatingSystem):
            found = system
        else:
            from revolve.formats.files import read_text

            found = parse_coating_system(read_text(os.fspath(system)), file=os.fspath(system))
        if code and found.currency and code != found.currency.strip().upper():
            raise CoatingError(f"the system file's currency is {found.currency} and "
                               f"{next(iter(codes))} names {code}; give one currency",
                               option=next(iter(codes)))
        return replace(found, currency=code) if code else found
    if dft is None and volume_solids is None and loss is None:
        raise CoatingError(f"no coating given: give a coating-system file ({names['system']}), or "
                           f"{names['dft']}, {names['volume_solids']} and {names['loss']} for one "
                           "coat")
    where = {"dft": (None, None, names["dft"]), "dft_um": (None, None, names["dft"]),
             "dft_mils": (None, None, names["dft"]),
             "volume_solids": (None, None, names["volume_solids"]),
             "loss": (None, None, names["loss"]),
             "price_per_litre": (None, None, names["price_per_litre"]),
             "price_per_us_gallon": (None, None, names["price_per_gallon"]),
             "name": (None, None, names["coat_name"])}
    film = {}
    if dft is not None:
        text = dft if isinstance(dft, str) or hasattr(dft, "magnitude") else repr(dft)
        film = dict([read_film_thickness(text, film_unit, names["dft"])])
    coat = make_coat(coat_name, **film, volume_solids=_percent(volume_solids,
                                                               names["volume_solids"]),
                     loss=_percent(loss, names["loss"]), price_per_litre=litre,
                     price_per_us_gallon=gallon, where=where)
    product = _option_product(names, coat.name, **bought_as) if bought_as else None
    if product is not None:
        coat = dataclasses.replace(coat, product=product)
    return CoatingSystem((coat,), None, code, None)


def _document(item: Any, units_text: Optional[str], names: Mapping[str, str]):
    """A profile document from a file name or a profile built in Python."""
    from revolve import units
    from revolve.errors import UnitError
    from revolve.jobs.measuring import as_document

    if units_text is not None:
        try:
            units.factor(units_text, "length")
        except UnitError as e:
            raise e.located(option=names["units"])
    if isinstance(item, (str, os.PathLike)):
        from revolve.formats import load_profile

        return load_profile(os.fspath(item), unit=units_text)
    return as_document(item)


@dataclass(frozen=True)
class CoatedPart:
    """One kind of part of the batch: its measurement (once), surfaces and choice."""

    name: str
    file: Optional[str]
    unit: str
    quantity: int
    measurement: Any
    found: Tuple[Surface, ...]
    si: float                              # m² per (profile unit)²
    chosen: Tuple[Chosen, ...] = ()


def _measure(doc, axis, angle, quantity: int, number: int,
             angle_option: str = "--angle") -> CoatedPart:
    """Measure a document once (the engine's :class:`Measurement` and its prepared profile)."""
    from revolve import units
    from revolve.geometry.measure import measure
    from revolve.jobs.measuring import revolution_for

    rev = revolution_for(doc, axis, angle, angle_option=angle_option)
    try:
        m = measure(rev)
    except RevolveError as e:
        raise e.located(file=doc.file)
    found = surfaces(m, space=getattr(doc, "section", "material") == "space")
    name = doc.name or doc.file or f"part {number}"
    return CoatedPart(name, doc.file, doc.profile.unit, quantity, m, found,
                      units.factor(doc.profile.unit, "length") ** 2)


def _output_units(imperial: bool, area_unit, paint_unit, film_unit, names, ests, currency):
    """Trade units (:func:`trade_units` "coating"), the user's choices, then the small-part rule."""
    from revolve.jobs.results import trade_units

    chosen = {"area": area_unit, "coverage": area_unit, "paint": paint_unit,
              "capacity": paint_unit, "film": film_unit}
    options = {"area": names["area_unit"], "coverage": names["area_unit"],
               "paint": names["paint_unit"], "capacity": names["paint_unit"],
               "film": names["film_unit"]}
    u = trade_units("coating", "in" if imperial else "m", chosen, options=options,
                    currency=currency).with_units({"time": "h"})
    small = {}
    each = [math.fsum(e.parts[i].part.area_each for _, e in ests)
            for i in range(len(ests[0][1].parts))]
    if area_unit is None and max(each) < SMALL * u.read(1, "area"):
        small["area"] = SMALL_AREA[1 if imperial else 0]
    litres = max(q.litres for _, e in ests for q in e.coats)
    if paint_unit is None and litres / 1000 < SMALL * u.read(1, "paint"):
        small["paint"] = "mL"
    return (u.with_units(small) if small else u), small


def _film(c: Coat):
    return c.dft_exact / 1_000_000 if c.dft_exact is not None else c.dft_um * 1e-6


def _tables(parts: Sequence[CoatedPart], ests, heading: str, tolerance: float, buying=()):
    """The estimate's tables, values in SI (m, m², m³, m²/m³; money as it is).

    ``ests`` holds (group or None, :class:`Estimate`) pairs; ``buying`` the
    tables of what is bought and done (packs, stripe coat, preparation, labour).
    """
    from revolve.jobs.results import Field, Table

    grouped = ests[0][0] is not None
    surfaces_rows, parts_rows, lines = [], [], []
    for i, p in enumerate(parts):
        for ch in p.chosen:
            s = ch.surface
            row = {"part": p.name, "face": s.face, "facing": s.facing, "area": s.area * p.si,
                   "area_batch": s.area * p.si * p.quantity if ch.included else None,
                   "counted": ch.included}
            if s.side:
                row["side"] = s.side
            if ch.group:
                row["group"] = ch.group
            if ch.reason:
                row["reason"] = ch.reason
            surfaces_rows.append(row)
        c = p.measurement.crosscheck
        pes = [(g, e.parts[i]) for g, e in ests]
        costs = [pe.cost for _, pe in pes if pe.cost is not None]
        row = {"part": p.name, "quantity": p.quantity,
               "area_each": math.fsum(pe.part.area_each for _, pe in pes),
               "area": math.fsum(pe.part.area_total for _, pe in pes),
               "paint": math.fsum(pe.litres for _, pe in pes) / 1000,
               "surface_check": c.surface_difference}
        if costs:
            row["cost"] = math.fsum(costs)
        parts_rows.append(row)
        for g, pe in pes:
            for q in pe.coats:
                line = {"part": p.name, "coat": q.coat.name, "area": q.area,
                        "paint": q.litres / 1000, "paint_theoretical": q.litres_theoretical / 1000}
                if g:
                    line["group"] = g
                if q.cost is not None:
                    line["cost"] = q.cost
                lines.append(line)
    coats_rows, paint_rows = [], []
    for g, est in ests:
        for q in est.coats:
            c = q.coat
            film = _film(c)
            wet = film * 100 / _exact(c.volume_solids) if c.dft_exact is not None \
                else c.wet_film_um * 1e-6
            row = {"coat": c.name, "dft": film, "volume_solids": c.volume_solids,
                   "wet_film": wet, "loss": c.loss,
                   "spreading_rate_theoretical": c.spreading_rate_theoretical * 1000,
                   "spreading_rate_practical": c.spreading_rate_practical * 1000}
            if c.price_per_litre is not None:
                row["price"] = c.price_exact * 1000 if c.price_exact is not None \
                    else c.price_per_litre * 1000
            row2 = {"coat": c.name, "area": q.area, "paint": q.litres / 1000,
                    "paint_theoretical": q.litres_theoretical / 1000}
            if q.cost is not None:
                row2["cost"] = q.cost
            if g:
                row = {"group": g, **row}
                row2 = {"group": g, **row2}
            coats_rows.append(row)
            paint_rows.append(row2)
    costs = [e.cost for _, e in ests if e.cost is not None]
    total = {"quantity": ests[0][1].quantity,
             "area": math.fsum(e.area for _, e in ests),
             "paint": math.fsum(e.litres for _, e in ests) / 1000,
             "paint_theoretical": math.fsum(q.litres_theoretical for _, e in ests
                                            for q in e.coats) / 1000}
    if not grouped:
        films = [c.dft_exact for c in ests[0][1].system.coats]
        total["dft"] = sum(films, Fraction(0)) / 1_000_000 if all(f is not None for f in films) \
            else ests[0][1].system.dft_um * 1e-6
    if costs:
        total["cost"] = math.fsum(costs)
        total["cost_complete"] = all(e.cost_complete for _, e in ests)
    for t in buying:
        if t.key == "stripe":
            total["stripe_paint"] = math.fsum(r["paint"] for r in t.rows)
        if t.key == "packs" and any("cost" in r for r in t.rows):
            total["packs_cost"] = math.fsum(r.get("cost", 0.0) for r in t.rows)
        if t.key == "labour" and t.rows and "cost" in t.rows[0]:
            total["labour_cost"] = t.rows[0]["cost"]
    money = Field("cost", "cost", style="money")
    group_field = Field("group", "group", style="text")
    system = ests[0][1].system
    name = (system.name if not grouped else None) or \
        ("a system per face group" if grouped else "one coat, from the options")
    file = system.file
    return (
        Table("surfaces", f"{heading}: surfaces to coat", (
            Field("part", "part", style="text"), Field("face", "face", style="text"),
            Field("facing", "facing", style="text"), Field("side", "side", style="text"),
            Field("area", "each", "area"), Field("area_batch", "batch", "area"), group_field,
            Field("counted", "counted", style="text"), Field("reason", "why not", style="text")),
            tuple(surfaces_rows)),
        Table("parts", "Parts", (
            Field("part", "part", style="text"), Field("quantity", "quantity", style="count"),
            Field("area_each", "each", "area"), Field("area", "batch", "area"),
            Field("paint", "paint", "paint"), money,
            Field("surface_check", "surface check", digits=2)), tuple(parts_rows)),
        Table("coats", f"Coats: {name}" + (f" ({file})" if file else ""), (
            group_field, Field("coat", "coat", style="text"), Field("dft", "DFT", "film"),
            Field("volume_solids", "VS", style="percent"), Field("wet_film", "WFT", "film"),
            Field("loss", "loss", style="percent"),
            Field("spreading_rate_theoretical", "rate", "coverage/capacity"),
            Field("spreading_rate_practical", "practical", "coverage/capacity"),
            Field("price", "price", "money/capacity", style="money")), tuple(coats_rows)),
        Table("paint", "Paint by coat, for the whole batch", (
            group_field, Field("coat", "coat", style="text"), Field("area", "area", "area"),
            Field("paint", "to buy", "paint"), Field("paint_theoretical", "as film", "paint"),
            money), tuple(paint_rows)),
        Table("quantities", "Paint by part and coat", (
            Field("part", "part", style="text"), group_field, Field("coat", "coat", style="text"),
            Field("area", "area", "area"), Field("paint", "to buy", "paint"),
            Field("paint_theoretical", "as film", "paint"), money), tuple(lines)),
        *buying,
        Table("total", "Total", (
            Field("quantity", "parts", style="count"),
            Field("area", "area coated" if grouped else "area, each coat", "area"),
            Field("dft", "dry film, all coats", "film"), Field("paint", "paint to buy", "paint"),
            Field("paint_theoretical", "paint left as film", "paint"),
            Field("stripe_paint", "stripe coat paint (apart)", "paint"), money,
            Field("cost_complete", "every coat priced", style="text"),
            Field("packs_cost", "packs bought", style="money"),
            Field("labour_cost", "labour", style="money")), (total,), figures=True),
    )


def _as_text(value: Any) -> Any:
    """An input for the JSON ``inputs``: numbers and lists as they are, typed values as text.

    >>> from revolve.inputs import Length, Money
    >>> _as_text(Length(50.0, "mm")), _as_text(Money(45.0, "EUR")), _as_text(12.5)
    ('50 mm', '45 EUR', 12.5)
    """
    from revolve.inputs import Length, Money

    if isinstance(value, Length):
        return f"{value.value:g}" + (f" {value.unit}" if value.unit else "")
    if isinstance(value, Money):
        return f"{value.amount:g}" + (f" {value.currency}" if value.currency else "")
    if isinstance(value, (list, tuple)):
        return [_as_text(v) for v in value]
    if isinstance(value, (bool, int, float)):
        return value
    return str(value)


def _axis_text(axis: Any) -> Optional[str]:
    if axis is None or isinstance(axis, str):
        return axis
    return ",".join(f"{v:g}" for v in (*axis.point, *axis.direction))


def _option_product(names: Mapping[str, str], name: str, *, packs: Any, mix_ratio: Any,
                    hardener_packs: Any, minimum_mix: Any, thinner: Any, thinner_limit: Any,
                    thinner_packs: Any) -> Any:
    """The one coat's :class:`packs.Product` from the options, or None without ``packs``."""
    from revolve.jobs import packs as buying

    given = {"mix_ratio": mix_ratio, "hardener_packs": hardener_packs,
             "minimum_mix": minimum_mix, "thinner": thinner, "thinner_limit": thinner_limit,
             "thinner_packs": thinner_packs}
    if packs is None:
        extra = [names[k] for k, v in given.items() if v is not None]
        if extra:
            raise CoatingError(f"{extra[0]} needs {names['packs']}: the pack sizes the coat is "
                               "sold in, such as '20 L, 5 L, 1 L'", option=extra[0])
        return None
    base = buying.parse_packs(packs, names["packs"])
    hardener = buying.parse_packs(hardener_packs, names["hardener_packs"]) \
        if hardener_packs is not None else ()
    ratio = buying.parse_ratio(mix_ratio, names["mix_ratio"]) if mix_ratio is not None else None
    if ratio is not None and not hardener:
        raise CoatingError(f"a two-pack product needs its hardener packs; give "
                           f"{names['hardener_packs']}", option=names["mix_ratio"])
    if hardener and ratio is None:
        raise CoatingError(f"hardener packs need the mixing ratio; give {names['mix_ratio']} "
                           "(base to hardener by volume, such as '4:1')",
                           option=names["hardener_packs"])
    least = 0.0 if minimum_mix is None else \
        buying.parse_volume_litres(minimum_mix, names["minimum_mix"])
    if least < 0:
        raise CoatingError("the minimum mix must be 0 or more", option=names["minimum_mix"])
    percent = _percent(thinner, names["thinner"]) if thinner is not None else 0.0
    limit = _percent(thinner_limit, names["thinner_limit"]) if thinner_limit is not None else None
    if limit is not None and percent > limit:
        raise CoatingError(f"thinning {percent:g} % is above the data sheet's limit of {limit:g} "
                           "%; follow the data sheet", option=names["thinner"])
    return buying.Product(name, base, mix_ratio=ratio, hardener_packs=hardener,
                          minimum_mix=least, thinner_percent=percent, thinner_limit=limit,
                          thinner_packs=buying.parse_packs(thinner_packs, names["thinner_packs"])
                          if thinner_packs is not None else ())


def _assign_groups(p: CoatedPart, plans, file: Optional[str]) -> CoatedPart:
    """Each counted surface of a part into the one face group that names it (or none)."""
    if plans[0][0] is None:
        return p
    faces = face_names(p.found)
    out = []
    for ch in p.chosen:
        if not ch.included:
            out.append(ch)
            continue
        owners = [g for g, names, _ in plans if any(_matches(ch.surface, n, faces) for n in names)]
        if len(owners) > 1:
            raise CoatingError(f"the surface {ch.surface.label!r} ({ch.surface.facing}) is in two "
                               f"face groups, {owners[0]!r} and {owners[1]!r}; give each face to "
                               "one group", file=file, place="coating system")
        if owners:
            out.append(dataclasses.replace(ch, group=owners[0]))
        else:
            out.append(Chosen(ch.surface, False, "in no face group"))
    return dataclasses.replace(p, chosen=tuple(out))


def _buying_tables(parts, ests, names, *, pack_rule, prepare, abrasive, stripe_band,
                   stripe_percent, application_rate, labour_rate, notes, cautions):
    """What is bought and done: stripe coat, packs, preparation, labour (tables in SI)."""
    from revolve import units as registry
    from revolve.geometry.profile import UNNAMED_FACE
    from revolve.jobs import packs as buying
    from revolve.jobs.results import Field, Table

    tables = []
    # -- stripe coat: one coat on the edges, in each group's first coat, shown apart
    stripe_litres: Dict[Tuple[Optional[str], int], float] = {}
    if stripe_band is not None and stripe_percent is not None:
        raise CoatingError(f"give the stripe coat as a band width ({names['stripe_band']}) or "
                           f"as a percentage ({names['stripe_percent']}), not both",
                           option=names["stripe_band"])
    if stripe_band is not None or stripe_percent is not None:
        band = None
        if stripe_band is not None:
            from revolve.inputs import Length, parse_length

            try:
                length = stripe_band if isinstance(stripe_band, Length) else \
                    parse_length(str(stripe_band))
                band = length.metres()
            except RevolveError as e:
                raise e.located(option=names["stripe_band"])
            if not band > 0:
                raise CoatingError(f"the band width must be above 0, got {stripe_band!r}",
                                   option=names["stripe_band"])
        pct = _percent(stripe_percent, names["stripe_percent"]) \
            if stripe_percent is not None else None
        taken = set()
        rows = []
        shared = sorted({ch.surface.face for p in parts for ch in p.chosen if ch.included
                         and any(o.included and o.group != ch.group and
                                 o.surface.face == ch.surface.face for o in p.chosen)})
        if shared and band is not None:
            notes.append("stripe coat: faces in more than one face group ("
                         + ", ".join(repr(f) for f in shared) + "): their edges are counted "
                         "once, in the first group that has them (name the faces in the profile "
                         "to tell them apart)")
        for g, est in ests:
            edge_length, count = 0.0, 0
            for p in parts:
                group_faces = {ch.surface.face for ch in p.chosen if ch.included and ch.group == g}
                if not group_faces or band is None:
                    continue
                if UNNAMED_FACE in group_faces:          # segments without a face name
                    group_faces.add(None)
                prep = p.measurement.prepared
                if prep is None:
                    from revolve.geometry.checks import prepare as check

                    rev = p.measurement.revolution
                    prep = check(rev.profile, rev.axis)
                for e in buying.profile_edges(prep, registry.factor(p.unit, "length"),
                                              p.measurement.revolution.angle_radians,
                                              faces=group_faces):
                    key = (p.name, round(e.z, 12), round(e.radius, 12))
                    if key not in taken:
                        taken.add(key)
                        edge_length += e.length * p.quantity
                        count += p.quantity
            area = est.area
            s = buying.stripe_coat(edge_length, band) if band is not None else \
                buying.stripe_coat(coated_area=area, percent=pct)
            coat = est.system.coats[0]
            litres = coat.litres_for(s.area)
            stripe_litres[(g, 0)] = litres
            row = {"coat": coat.name, "area": s.area, "paint": litres / 1000}
            if g:
                row = {"group": g, **row}
            if band is not None:
                row.update(edges=count, edge_length=edge_length, band=band)
            else:
                row["percent"] = pct
            if coat.price_per_litre is not None:
                row["cost"] = litres * coat.price_per_litre
            rows.append(row)
        if any(r["area"] > e.area for r, (_, e) in zip(rows, ests) if e.area > 0):
            notes.append("the stripe coat's area is more than the area it edges: the band is "
                         "wide for these parts (bands overlap); check the band width")
        tables.append(Table("stripe", "Stripe coat on edges (one coat, in the first coat's "
                                      "paint; shown apart)", (
            Field("group", "group", style="text"), Field("coat", "paint of", style="text"),
            Field("edges", "edges", style="count"), Field("edge_length", "edge length", "length"),
            Field("band", "band", "length"), Field("percent", "of the area", style="percent"),
            Field("area", "area", "area"), Field("paint", "to buy", "paint"),
            Field("cost", "cost", style="money")), tuple(rows)))
        notes.append("stripe coat: edges are the profile's corners (turning by more than 30°) and "
                     "the free ends of sheets, each swept round the axis; area = edge length × "
                     "band width (or a percentage of the coated area); its paint is bought with "
                     "the first coat (common practice, no source)")
    # -- packs: litres of each product (coats sharing a product bought together)
    if pack_rule is not None:
        pack_rule = str(pack_rule).strip().lower().replace("-", " ")
        if pack_rule not in buying.RULES:
            raise CoatingError(f"give {', '.join(buying.RULES)}; got {pack_rule!r}",
                               option=names["pack_rule"])
    products: Dict[str, Any] = {}
    for g, est in ests:
        for k, q in enumerate(est.coats):
            product = q.coat.product
            if product is None:
                continue
            need = q.litres + stripe_litres.get((g, k), 0.0)
            mixed = max(need, product.minimum_mix) if need > 0 else 0.0
            if 0 < need < product.minimum_mix:
                notes.append(f"{product.name}: {need:.3g} L needed for {q.coat.name} is below "
                             f"the minimum mix; {product.minimum_mix:g} L is mixed")
            seen = products.get(product.name)
            if seen is not None and seen[0] != product:
                raise CoatingError(f"the product {product.name!r} is given twice with different "
                                   "packs, ratio or thinner; give it once the same way",
                                   file=est.system.file, place="coating system")
            label = f"{g}: {q.coat.name}" if g else q.coat.name
            if seen is None:
                products[product.name] = (product, need, mixed, [label])
            else:
                products[product.name] = (product, seen[1] + need, seen[2] + mixed,
                                          seen[3] + [label])
    if pack_rule is not None and not products:
        raise CoatingError(f"{names['pack_rule']} needs packs: give {names['packs']}, or "
                           "packs_litres in the coating-system file", option=names["pack_rule"])
    if products:
        rows, rules = [], []
        for product, need, mixed, labels in products.values():
            if need == 0:
                continue
            if len(labels) > 1:
                notes.append(f"{product.name} is bought once for: {'; '.join(labels)}")
            every = product.packs + product.hardener_packs + product.thinner_packs
            rule = pack_rule or ("cheapest" if all(p.price is not None for p in every)
                                 else "fewest")
            try:
                bought = buying.buy(product, mixed, rule)
            except RevolveError as e:
                raise e.located(option=names["pack_rule"] if pack_rule else names["packs"])
            notes.extend(n for n in bought.notes if "minimum mix" not in n)
            litres = bought.base.litres + (bought.hardener.litres if bought.hardener else 0.0)
            rules.append(f"{product.name} by {rule}")
            row = {"product": product.name, "coats": "; ".join(labels),
                   "needed": need / 1000, "mixed": mixed / 1000,
                   "base": bought.base.text(), "bought": litres / 1000,
                   "left_over": (litres - mixed) / 1000}
            if bought.hardener is not None:
                row["ratio"] = ":".join(f"{v:g}" for v in product.mix_ratio)
                row["hardener"] = bought.hardener.text()
            if bought.thinner_litres > 0:
                row["thinner"] = bought.thinner_litres / 1000
                if bought.thinner is not None:
                    row["thinner_packs"] = bought.thinner.text()
            if bought.cost is not None and any(p.price is not None for p in every):
                row["cost"] = bought.cost
            rows.append(row)
            if product.two_pack:
                cautions.append(buying.CAUTIONS[3])
            if product.thinner_percent > 0:
                cautions.append(buying.CAUTIONS[4])
        tables.append(Table("packs", "What is bought, by product (packs rounded up)", (
            Field("product", "product", style="text"), Field("coats", "for", style="text"),
            Field("needed", "needed", "paint"), Field("mixed", "mixed", "paint"),
            Field("ratio", "ratio", style="text"), Field("base", "packs", style="text"),
            Field("hardener", "hardener", style="text"),
            Field("bought", "bought", "paint"), Field("left_over", "left", "paint"),
            Field("thinner", "thinner", "paint"), Field("thinner_packs", "in packs",
                                                        style="text"),
            Field("cost", "cost", style="money")), tuple(rows)))
        notes.append("packs chosen: " + "; ".join(rules) + " (cheapest: least money; fewest: "
                     "fewest packs; least left over: least surplus)")
        notes.append("packs: each product's litres (with its stripe coat, each coat at least the "
                     "minimum mix) rounded up to whole packs; a two-pack product is split base : "
                     "hardener by volume and each part rounded up; thinner is a percentage of "
                     "the mixed volume (common practice, no source)")
        missing = [q.coat.name for _, e in ests for q in e.coats if q.coat.product is None]
        if missing:
            notes.append(f"no packs given for: {', '.join(missing)} (litres only)")
    # -- preparation and abrasive
    if prepare or abrasive is not None:
        rate = None
        if abrasive is not None:
            rate = buying.parse_rate(abrasive, "mass", "area", names["abrasive"],
                                     example="25 kg/m^2")
        coated = math.fsum(e.area for _, e in ests)
        masked = 0.0
        if prepare:
            for p in parts:
                faces = face_names(p.found)
                for ch in p.chosen:
                    if not ch.included and ch.surface.kind != "cut" and \
                            any(_matches(ch.surface, n, faces) for n in prepare):
                        masked += ch.surface.area * p.si * p.quantity
        prep = buying.preparation(coated, masked, rate)
        row = {"coated": coated, "masked": masked, "area": prep.area}
        if rate is not None:
            row.update(rate=rate, abrasive=prep.abrasive)
        tables.append(Table("preparation", "Surface preparation (blast or other)", (
            Field("coated", "area coated", "area"),
            Field("masked", "masked but prepared", "area"),
            Field("area", "area to prepare", "area"),
            Field("rate", "abrasive rate", "mass/coverage"),
            Field("abrasive", "abrasive", "mass")), (row,), figures=True))
        if prepare and masked == 0:
            notes.append(f"{names['prepare']}: none of the faces named is masked on these parts; "
                         "only the coated area is prepared")
    # -- labour
    if labour_rate is not None and application_rate is None:
        raise CoatingError(f"{names['labour_rate']} needs {names['application_rate']}: the area "
                           "one person applies per hour, per coat", option=names["labour_rate"])
    if application_rate is not None:
        rate = buying.parse_rate(application_rate, "area", "time", names["application_rate"],
                                 example="12 m^2/h", invert=True)
        coat_area = math.fsum(e.area * len(e.system.coats) for _, e in ests)
        stripe_area = math.fsum(r["area"] for t in tables if t.key == "stripe" for r in t.rows)
        money, code = _money(labour_rate, names["labour_rate"])
        hours = buying.labour(coat_area + stripe_area, rate * 3600,
                              None if money is None else float(money))
        row = {"coat_area": coat_area + stripe_area, "rate": rate, "time": hours.hours * 3600}
        if money is not None:
            row.update(labour_rate=float(money) / 3600, cost=hours.cost)
        tables.append(Table("labour", "Labour (application)", (
            Field("coat_area", "area × coats", "area"),
            Field("rate", "application rate, per coat", "coverage/time"),
            Field("time", "time", "time"),
            Field("labour_rate", "labour rate", "money/time", style="money"),
            Field("cost", "cost", style="money")), (row,), figures=True))
        notes.append("labour: time = area × coats (and the stripe coat once) ÷ the application "
                     "rate per coat; cost = time × labour rate (common practice, no source)")
    return tuple(tables)


def run(profiles: Any, *, system: Any = None, dft: Any = None, volume_solids: Any = None,
        loss: Any = None, price_per_litre: Any = None, price_per_gallon: Any = None,
        coat_name: Optional[str] = None, currency: Optional[str] = None, quantity: Any = None,
        faces: Any = None, mask: Any = None, sides: str = "both", cut_faces: bool = False,
        axis: Any = None, angle: Optional[float] = None, units: Optional[str] = None,
        area_unit: Optional[str] = None, paint_unit: Optional[str] = None,
        film_unit: Optional[str] = None, us: bool = False,
        tolerance: float = DEFAULT_TOLERANCE, packs: Any = None, mix_ratio: Any = None,
        hardener_packs: Any = None, minimum_mix: Any = None, thinner: Any = None,
        thinner_limit: Any = None, thinner_packs: Any = None, pack_rule: Optional[str] = None,
        prepare: Any = None, abrasive: Any = None, stripe_band: Any = None,
        stripe_percent: Any = None, application_rate: Any = None, labour_rate: Any = None,
        names: Mapping[str, str] = LIBRARY_NAMES, left_out: Sequence[str] = ()) -> CoatingResult:
    """The coating estimate, for the command line and the library (see :func:`estimate_coating`).

    ``names`` says how errors name each input (:data:`CLI_NAMES` on the
    command line); ``left_out`` lists files of folders that were not profiles.
    """
    from revolve import units as registry
    from revolve.formats.document import ProfileDocument
    from revolve.geometry.profile import Profile, Revolution
    from revolve.jobs.measuring import parse_axis
    from revolve.jobs.results import IMPERIAL_LENGTHS, OutputUnits

    if not (isinstance(tolerance, (int, float)) and tolerance > 0):
        raise CoatingError(f"the tolerance must be a number above 0, got {tolerance!r}",
                           option=names["tolerance"])
    sides = (sides or "both").strip().lower()
    if sides not in SIDES:
        raise CoatingError(f'give both, outer or inner, got "{sides}"', option=names["sides"])
    OutputUnits.of({"area": area_unit, "paint": paint_unit, "film": film_unit},
                   options={"area": names["area_unit"], "paint": names["paint_unit"],
                            "film": names["film_unit"]})          # refused before any work
    if isinstance(axis, str):
        axis = parse_axis(axis, option=names["axis"])
    single_kinds = (str, os.PathLike, Profile, ProfileDocument, Revolution)
    items = [profiles] if isinstance(profiles, single_kinds) else list(profiles)
    if not items:
        raise CoatingError("no profiles given; give one or more profile files")
    docs = [_document(item, units, names) for item in items]
    imperial = us or all(registry.canonical(d.profile.unit, "length") in IMPERIAL_LENGTHS
                         for d in docs)
    film_text = film_unit or ("mil" if imperial else "um")
    if imperial and not us and film_unit is None and dft is not None and \
            not re.search(r"[A-Za-zµ]", str(dft)):
        # mils only because the drawings are in inches: a bare number would be a guess
        raise CoatingError(f"give the dry film thickness with its unit, such as '3 mil' or "
                           f"'75 um', got {str(dft)!r} (or choose the film unit with "
                           f"{names['film_unit']})", option=names["dft"])
    # typed values read once, as the command line's option types read them (same JSON inputs)
    from revolve.inputs import parse_length, parse_money

    def typed(parse, value: Any, key: str) -> Any:
        try:
            return parse(value) if isinstance(value, str) else value
        except RevolveError as e:
            raise e.located(option=names[key])

    labour_rate = typed(parse_money, labour_rate, "labour_rate")
    stripe_band = typed(parse_length, stripe_band, "stripe_band")
    thinner, thinner_limit, stripe_percent = (
        None if v is None else _percent_in_range(v, names[k]) for k, v in
        (("thinner", thinner), ("thinner_limit", thinner_limit),
         ("stripe_percent", stripe_percent)))
    bought_as = dict(packs=packs, mix_ratio=mix_ratio, hardener_packs=hardener_packs,
                     minimum_mix=minimum_mix, thinner=thinner, thinner_limit=thinner_limit,
                     thinner_packs=thinner_packs)
    found_system = _system(system, names, coat_name=coat_name, dft=dft,
                           volume_solids=volume_solids, loss=loss,
                           price_per_litre=price_per_litre, price_per_gallon=price_per_gallon,
                           currency=currency, film_unit=film_text, bought_as=bought_as,
                           labour_rate=labour_rate)
    counts = _quantities(quantity, len(docs), names["quantity"])
    parts = [_measure(d, axis, angle, q, i, names["angle"])
             for i, (d, q) in enumerate(zip(docs, counts), 1)]
    include = split_names([faces] if isinstance(faces, str) else faces)
    masked = split_names([mask] if isinstance(mask, str) else mask)
    prepared = split_names([prepare] if isinstance(prepare, str) else prepare)
    known = [name for p in parts for name in face_names(p.found)]
    single = parts[0].file if len(parts) == 1 else None
    check_names(include, known, names["faces"], single)
    check_names(masked, known, names["mask"], single)
    check_names(prepared, known, names["prepare"], single)
    plans = found_system.plans()
    for g, group_faces, _ in plans:
        if g is not None:
            check_names(group_faces, known, f"group {g!r}, faces", found_system.file)
    notes: List[str] = []
    if left_out:
        notes.append("left out of the folders (not profiles): " + ", ".join(left_out))
    areas = []
    group_areas: Dict[Optional[str], List[PartArea]] = {g: [] for g, _, _ in plans}
    for i, p in enumerate(parts):
        chosen = select(p.found, include, masked, sides, cut_faces)
        parts[i] = p = _assign_groups(dataclasses.replace(p, chosen=chosen), plans,
                                       found_system.file)
        chosen = p.chosen
        for g in group_areas:
            mine = [ch for ch in chosen if ch.group == g]
            group_areas[g].append(PartArea(p.name, coated_area(mine) * p.si, p.quantity,
                                           tuple((k, v * p.si)
                                                 for k, v in area_by_face(mine).items())))
        by_face = tuple((k, v * p.si) for k, v in area_by_face(chosen).items())
        areas.append(PartArea(p.name, coated_area(chosen) * p.si, p.quantity, by_face))
        if any(ch.reason == "in no face group" for ch in chosen):
            left = sorted({ch.surface.label for ch in chosen if ch.reason == "in no face group"})
            notes.append(f"{p.name}: in no face group of the system, so not coated: "
                         + ", ".join(left))
        if any(ch.surface.kind == "chain" for ch in chosen):
            counted = {"both": "both sides counted", "outer": "one side counted (outer)",
                       "inner": "one side counted (inner)"}[sides]
            notes.append(f"{p.name}: an open chain is a sheet with two sides of equal area; "
                         f"{counted} ({CLI_NAMES['sides']})")
        angle_text = f"{float(p.measurement.revolution.angle_degrees):g}°"
        if any(ch.surface.kind == "cut" and not ch.included for ch in chosen):
            notes.append(f"{p.name}: the flat cut faces of the {angle_text} revolution are not "
                         "counted; add --cut-faces to coat them")
        if cut_faces and p.measurement.revolution.full:
            notes.append(f"{p.name}: a full revolution has no cut faces")
        if areas[-1].area_each == 0:
            notes.append(f"{p.name}: none of the faces chosen has any area on this part")
    if not any(a.area_each > 0 for a in areas):
        raise CoatingError("nothing to coat: the faces chosen have no area on any part; check "
                           f"{names['faces']}, {names['mask']} and {names['sides']}", file=single,
                           option=names["faces"] if include else names["mask"])
    ests = [(g, estimate(sub, group_areas[g])) for g, _, sub in plans]
    for g, est in ests:
        if g is not None and est.area == 0:
            notes.append(f"the face group {g!r} has no area on these parts")
    if any(e.cost is not None for _, e in ests) and not all(e.cost_complete for _, e in ests):
        missing = ", ".join(c.name for c in found_system.all_coats if c.price_per_litre is None)
        notes.append(f"the cost leaves out the coats without a price: {missing}")
    cautions: List[str] = ["coating"]
    buying = _buying_tables(parts, ests, names, pack_rule=pack_rule, prepare=prepared,
                            abrasive=abrasive, stripe_band=stripe_band,
                            stripe_percent=stripe_percent, application_rate=application_rate,
                            labour_rate=labour_rate, notes=notes, cautions=cautions)
    u, small = _output_units(imperial, area_unit, paint_unit, film_unit, names, ests,
                             found_system.currency)
    if "area" in small:
        notes.append(f"every part's coated area is below {SMALL:g} "
                     f"{'ft²' if imperial else 'm²'}: areas are in {small['area']} "
                     f"({CLI_NAMES['area_unit']} to choose)")
    if "paint" in small:
        notes.append(f"every coat needs below {SMALL:g} {'US gal' if imperial else 'L'}: paint "
                     f"is in mL ({CLI_NAMES['paint_unit']} to choose)")
    notes.append(FORMULAS)
    n, kinds = ests[0][1].quantity, len(parts)
    heading = (f"Coating estimate, {n} part{'s' if n != 1 else ''}"
               + (f" of {kinds} kinds" if kinds > 1 else "")
               + f" (faces: {', '.join(include) or ALL}"
               + (f"; masked: {', '.join(masked)}" if masked else "") + ")")
    inputs = {"profiles": [p.file or p.name for p in parts], "quantity": counts,
              "faces": list(include) or [ALL], "mask": list(masked), "sides": sides,
              "cut_faces": bool(cut_faces), "axis": _axis_text(axis), "angle": angle,
              "system": {"name": found_system.name, "file": found_system.file,
                         "currency": found_system.currency,
                         "coats": len(found_system.all_coats)},
              "tolerance": tolerance}
    if found_system.groups:
        inputs["system"]["groups"] = {g.name: list(g.faces) for g in found_system.groups}
    extra_inputs = {"pack_rule": pack_rule, "prepare": list(prepared) or None,
                    "abrasive": abrasive, "stripe_band": stripe_band,
                    "stripe_percent": stripe_percent, "application_rate": application_rate,
                    "labour_rate": labour_rate, **bought_as}
    inputs.update({k: _as_text(v) for k, v in extra_inputs.items() if v is not None and v != []})
    bad = tuple((p.file or p.name, p.measurement.crosscheck.surface_difference) for p in parts
                if not p.measurement.crosscheck.surface_difference <= tolerance)
    return CoatingResult("coat", u, inputs, _tables(parts, ests, heading, tolerance, buying),
                         tuple(notes), tuple(dict.fromkeys(cautions)), disagreements=bad)


def estimate_coating(profiles_or_paths: Any, *, system: Any = None, dft: Any = None,
                     volume_solids: Any = None, loss: Any = None, price_per_litre: Any = None,
                     price_per_gallon: Any = None, coat_name: Optional[str] = None,
                     currency: Optional[str] = None, quantity: Any = None, faces: Any = None,
                     mask: Any = None, sides: str = "both", cut_faces: bool = False,
                     axis: Any = None, angle: Optional[float] = None,
                     units: Optional[str] = None, area_unit: Optional[str] = None,
                     paint_unit: Optional[str] = None, film_unit: Optional[str] = None,
                     us: bool = False, tolerance: float = DEFAULT_TOLERANCE, packs: Any = None,
                     mix_ratio: Any = None, hardener_packs: Any = None, minimum_mix: Any = None,
                     thinner: Any = None, thinner_limit: Any = None, thinner_packs: Any = None,
                     pack_rule: Optional[str] = None, prepare: Any = None, abrasive: Any = None,
                     stripe_band: Any = None, stripe_percent: Any = None,
                     application_rate: Any = None, labour_rate: Any = None) -> CoatingResult:
    """A coating estimate for a batch of parts: areas by face, and each coat's paint and cost.

    The same job as ``revolve coat``; ``result.to_dict()`` is exactly the
    object ``revolve coat ... --json`` prints for the same inputs.

    Parameters
    ----------
    profiles_or_paths : str, os.PathLike, Profile, or a list of them
        Profile files (any format :func:`revolve.load_profile` reads) or
        profiles built in Python; one kind of part each.
    system : str, os.PathLike or CoatingSystem, optional
        A coating-system file (TOML, several coats); or give one coat with:
    dft : str or float
        Dry film thickness with its unit (``"75 um"``, ``"3 mil"``); a bare
        number is in µm, or in mils with ``us=True`` or ``film_unit="mil"``
        (for inch or foot drawings otherwise, the unit must be written).
    volume_solids, loss : float or str
        Percentages (``58`` or ``"58 %"``): volume solids above 0 and at most
        100, loss factor at least 0 and below 100.
    price_per_litre, price_per_gallon : float or str, optional
        The coat's price per litre or per US gallon (``"21.50 EUR"``).
    coat_name, currency : str, optional
        The coat's name; the currency's code (a label, never converted).
    quantity : int, list of int or str, optional
        How many of each part: one number for every part, or one per part
        (``[200, 50, 100]`` or ``"200,50,100"``). Default 1.
    faces, mask : str or list of str, optional
        Face names or the groups ``outside``, ``inside``, ``ends``, ``all``
        to coat (default all) and to leave out.
    sides : {"both", "outer", "inner"}
        Which sides of open chains (sheets) to count.
    cut_faces : bool
        Count the two flat faces of a revolution below 360°.
    axis, angle, units
        As for :func:`revolve.measure`.
    area_unit, paint_unit, film_unit : str, optional
        Output units; default by the coating trade: m², L, µm (ft², US gal,
        mil when every drawing is in inches or feet, or with ``us=True``).
        Areas of small parts (every part below 0.01 m², or 0.01 ft²) are in
        cm² (in²); paint below 0.01 L (US gal) for every coat is in mL.
    tolerance : float
        Relative tolerance of the surface cross-check.
    packs, hardener_packs, thinner_packs : str, optional
        What the one coat is sold in: sizes with their unit, each with an
        optional price after ``@`` (``"20 L @ 120 EUR, 5 L @ 40"``). A
        system file gives ``packs_litres`` (and the rest) per coat.
    mix_ratio : str, optional
        Two-pack: base to hardener by volume, ``"4:1"`` (with ``hardener_packs``).
    minimum_mix : str, optional
        Least mixed at a time, ``"2 L"``.
    thinner, thinner_limit : float or str, optional
        Thinner, % by volume of the mixed product; the data sheet's most.
    pack_rule : {"cheapest", "fewest", "least left over"}, optional
        Default: cheapest when every pack has a price, else fewest.
    prepare : str or list of str, optional
        Masked faces or groups that are prepared all the same.
    abrasive : str, optional
        Abrasive per area prepared, ``"25 kg/m^2"``.
    stripe_band, stripe_percent : str, optional
        Stripe coat on the profile's edges: a band width (``"50 mm"``), or a
        percentage of the coated area.
    application_rate, labour_rate : str, optional
        Area applied per hour per coat (``"12 m^2/h"``); money per hour.

    Returns
    -------
    CoatingResult
        Tables ``surfaces``, ``parts``, ``coats``, ``paint``, ``quantities``, ``total``;
        ``.area``, ``.paint``, ``.cost`` in its units.

    Raises
    ------
    revolve.RevolveError
        With the command line's one-sentence message, naming the parameter.

    Examples
    --------
    A tube 1 m long, 100 mm outside diameter, 80 mm bore, outside only:
    π × 0.1 m × 1 m = 0.314159 m², at 10 × 50/100 × (1 − 0.2) = 4 m²/L.

    >>> from revolve.geometry.profile import Loop, Profile
    >>> tube = Profile(loops=(Loop.from_points([(0, 40), (1000, 40), (1000, 50), (0, 50)]),),
    ...                unit="mm", name="tube")
    >>> r = estimate_coating(tube, dft="100 um", volume_solids=50, loss="20 %", faces="outside",
    ...                      price_per_litre="12 EUR", quantity=10)
    >>> r
    <CoatingResult: 10 parts, area 3.14159 m², paint 0.785398 L, cost 9.42 EUR>
    >>> round(r.area, 6), round(r.paint, 6), round(r.cost, 4), r.to_dict()["units"]["paint"]
    (3.141593, 0.785398, 9.4248, 'L')

    A part with nothing to coat among the faces chosen is refused:

    >>> estimate_coating(tube, dft="100 um", volume_solids=50, loss=20, faces="ends", mask="ends")
    Traceback (most recent call last):
    ...
    revolve.jobs.coating.CoatingError: faces: nothing to coat: the faces chosen have no area on any part; check faces, mask and sides
    """
    return run(profiles_or_paths, system=system, dft=dft, volume_solids=volume_solids, loss=loss,
               price_per_litre=price_per_litre, price_per_gallon=price_per_gallon,
               coat_name=coat_name, currency=currency, quantity=quantity, faces=faces,
               mask=mask, sides=sides, cut_faces=cut_faces, axis=axis, angle=angle, units=units,
               area_unit=area_unit, paint_unit=paint_unit, film_unit=film_unit, us=us,
               tolerance=tolerance, packs=packs, mix_ratio=mix_ratio,
               hardener_packs=hardener_packs, minimum_mix=minimum_mix, thinner=thinner,
               thinner_limit=thinner_limit, thinner_packs=thinner_packs, pack_rule=pack_rule,
               prepare=prepare, abrasive=abrasive, stripe_band=stripe_band,
               stripe_percent=stripe_percent, application_rate=application_rate,
               labour_rate=labour_rate)
