"""Turning: part, stock, material removed, bar use, times and cost of a turned part.

Pure functions over the engine's results (:func:`revolve.geometry.measure.measure`
and :func:`revolve.geometry.checks.prepare`); the geometry is never redone.
Everything here is a plain float in SI units: metres, square and cubic
metres, kilograms, kg/m³, seconds, metres per second (cutting speed),
metres per revolution (feed) and revolutions per second (spindle speed).
Money is a plain number in the user's currency; machine rates are per hour.
A ``length_factor`` converts the profile's length unit to metres on the way
in.

The trade formulas (all "common practice, no source"):

* metal removal rate ``Q = vc · ap · f`` (in trade units, cm³/min = m/min × mm × mm/rev);
* spindle speed ``n = vc / (π D)`` (in trade units, rev/min = 1000 vc / (π D), D in mm);
* roughing time ``V / Q`` over the volume cut away as chips;
* finishing time ``A / (vc · f)`` over the finished faces' area;
* one pass at a fixed spindle speed ``t = L / (f n)`` -- what the two times
  above become where a machine speed limit caps the spindle;
* parts per bar ``floor((bar length − remnant) / (length per part + parting width))``.

Stock per part is one **stock length** of the chosen bar, tube or blank::

    stock length = part length + 2 × facing allowance + parting width + holding length

which is also what each part takes from a bar, so parts per bar uses the same
length. The volume removed is ``stock − part``; the holding piece (if any)
leaves as an offcut and the rest as chips.

Examples
--------
A plain steel pin, ⌀30 × 50 mm, from ⌀32 bar:

>>> from revolve.geometry.profile import Loop, Profile, Revolution, Axis
>>> from revolve.geometry.checks import prepare
>>> from revolve.geometry.measure import measure
>>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)]),))
>>> prep = prepare(pin, Axis.x())
>>> m = measure(Revolution(pin, Axis.x()))
>>> part = part_figures(m, prep, density=7850.0, length_factor=0.001)
>>> round(part.envelope.diameter, 12), round(part.envelope.length, 12)
(0.03, 0.05)
>>> bar = StockSize(0.032)
>>> allow = Allowances(turning=0.002, facing=0.001, parting_width=0.003)
>>> stock = stock_figures(bar, stock_length(part.envelope.length, allow), 7850.0)
>>> round(stock.length * 1000, 9)
55.0
>>> cut = removal(part, stock, allow)
>>> cut.removed_volume == stock.volume - part.volume
True
>>> round(cut.utilisation, 4)   # (30² × 50) / (32² × 55)
0.799
"""

from __future__ import annotations

import math
from dataclasses import dataclass, field
from typing import Dict, Mapping, Optional, Sequence, Tuple

from revolve.errors import ProfileError, RevolveError

#: Relative slack when comparing sizes and counting parts (a nanometre per metre):
#: a bar that covers a diameter exactly is taken, an exact fit counts.
FIT_TOLERANCE = 1e-9

STOCK_KINDS = ("bar", "tube", "blank")
STOCK_CHOICES = ("bar", "tube", "lighter")
PRICE_BASES = ("kg", "m")


def _check_number(value, name: str, *, positive: bool = False, allow_none: bool = False):
    """A finite number, zero or positive (or strictly positive); raise RevolveError naming ``name``.

    >>> _check_number(2, "feed")
    2.0
    >>> _check_number(-1.0, "parting width")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: parting width: must be zero or positive, got -1
    >>> _check_number(0.0, "feed", positive=True)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: feed: must be positive, got 0
    """
    if value is None and allow_none:
        return None
    if isinstance(value, bool):
        raise RevolveError(f"must be a number, got {value!r}", place=name)
    try:
        v = float(value)
    except (TypeError, ValueError):
        raise RevolveError(f"must be a number, got {value!r}", place=name) from None
    if not math.isfinite(v):
        raise RevolveError(f"must be a finite number, got {value!r}", place=name)
    if positive and not v > 0:
        raise RevolveError(f"must be positive, got {v:g}", place=name)
    if v < 0:
        raise RevolveError(f"must be zero or positive, got {v:g}", place=name)
    return v


def _length(value: float, unit: str = "mm") -> str:
    """A length in metres as text in ``unit`` for messages.

    >>> _length(0.0508, "in"), _length(0.05)
    ('2 in', '50 mm')
    """
    from revolve.units import factor

    return f"{value / factor(unit, 'length'):.6g} {unit}"


# --------------------------------------------------------------------------- part

@dataclass(frozen=True)
class Envelope:
    """The part's extent in the axis frame, in metres.

    ``z_start`` and ``z_end`` are axial positions from the axis point;
    ``max_radius`` is the largest distance from the axis over every segment
    (an arc's bulge included), ``min_radius`` the smallest. ``through_bore``
    says the section keeps clear of the axis everywhere, so a tube can be used.

    Examples
    --------
    >>> e = Envelope(0.0, 0.04, 0.016, 0.01, True)
    >>> round(e.length, 12), round(e.diameter, 12), round(e.bore_diameter, 12)
    (0.04, 0.032, 0.02)
    >>> Envelope(0.0, 0.04, 0.016, 0.0, False).bore_diameter
    0.0
    """

    z_start: float
    z_end: float
    max_radius: float
    min_radius: float
    through_bore: bool

    @property
    def length(self) -> float:
        return self.z_end - self.z_start

    @property
    def diameter(self) -> float:
        return 2.0 * self.max_radius

    @property
    def bore_diameter(self) -> float:
        """Smallest bore diameter, 0 when the part is solid at the axis somewhere."""
        return 2.0 * self.min_radius if self.through_bore else 0.0


def envelope(prepared, length_factor: float = 1.0) -> Envelope:
    """Extent of a prepared profile (axis frame): length along the axis, largest and smallest radius.

    From :func:`revolve.geometry.envelope.extent` (every segment's bounds: an
    arc or curve that bulges past its ends counts at its crest), in metres.

    Parameters
    ----------
    prepared : PreparedProfile
        From :func:`revolve.geometry.checks.prepare`; only closed loops count
        (chains have no material).
    length_factor : float
        Profile unit to metres.

    Returns
    -------
    Envelope

    Raises
    ------
    ProfileError
        When the profile has no closed loop.

    Examples
    --------
    A ⌀36 × 20 collar whose top is an arc of radius 26 bulging 2 above its ends:

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.segments import Line, arc_from_radius
    >>> from revolve.geometry.checks import prepare
    >>> top = arc_from_radius((20.0, 18.0), (0.0, 18.0), radius=26.0, side="right")
    >>> loop = Loop((Line((0.0, 0.0), (20.0, 0.0)), Line((20.0, 0.0), (20.0, 18.0)), top,
    ...              Line((0.0, 18.0), (0.0, 0.0))))
    >>> e = envelope(prepare(Profile(loops=(loop,)), Axis.x()))
    >>> round(e.max_radius, 12), e.min_radius, e.length, e.through_bore
    (20.0, 0.0, 20.0, False)
    >>> from revolve.geometry.profile import Chain
    >>> envelope(prepare(Profile(chains=(Chain.from_points([(0, 1), (5, 1)]),)), Axis.x()))
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: turning needs a solid section (a closed loop); this profile has only open chains
    """
    from revolve.geometry.envelope import extent

    box = extent(prepared)
    if box is None:
        raise ProfileError("turning needs a solid section (a closed loop); this profile has only "
                           "open chains")
    r_min = max(0.0, box.r_min)
    through = r_min > prepared.tolerance
    if not through:
        r_min = 0.0
    f = float(length_factor)
    return Envelope(box.z_min * f, box.z_max * f, box.r_max * f, r_min * f, through)


@dataclass(frozen=True)
class Part:
    """The finished part, in SI units.

    ``centre_of_mass_axial`` is along the axis from its point (as in
    ``revolve measure``); ``centre_of_mass_from_start`` from the part's first
    end along the axis direction (``envelope.z_start``).
    ``surface_by_face`` is every face's swept area, including faces that are
    not finished (see :func:`finished_faces`).
    """

    volume: float
    density: float
    mass: float
    centre_of_mass_axial: float
    centre_of_mass_from_start: float
    surface_by_face: Mapping[str, float]
    surface_total: float
    envelope: Envelope
    hollows: int = 0  # closed hollows inside the material (a lathe cannot cut them)


def part_figures(measurement, prepared, density: float, length_factor: float = 1.0) -> Part:
    """Volume, mass, axial centre of mass and surface by face of a turned part.

    Parameters
    ----------
    measurement : Measurement
        From :func:`revolve.geometry.measure.measure` (any density: the mass
        is recomputed from ``density``).
    prepared : PreparedProfile
        The same profile and axis, prepared.
    density : float
        kg/m³.
    length_factor : float
        Profile unit to metres.

    Raises
    ------
    ProfileError
        When the revolution is not a full turn or there is no solid section.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile, Revolution, Axis
    >>> from revolve.geometry.checks import prepare
    >>> from revolve.geometry.measure import measure
    >>> disc = Profile(loops=(Loop.from_points([(0, 0), (10, 0), (10, 50), (0, 50)], face="all"),))
    >>> p = part_figures(measure(Revolution(disc, Axis.x())), prepare(disc, Axis.x()), 2700.0, 0.001)
    >>> round(p.mass, 9) == round(2700 * math.pi * 0.05 ** 2 * 0.01, 9)
    True
    >>> round(p.centre_of_mass_from_start, 12)
    0.005
    >>> half = Revolution(disc, Axis.x(), 180)
    >>> part_figures(measure(half), prepare(disc, Axis.x()), 2700.0)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: angle: a turned part is a full revolution (360°), not 180°
    """
    rev = measurement.revolution
    if not rev.full:
        raise ProfileError(f"a turned part is a full revolution (360°), not "
                           f"{float(rev.angle_degrees):g}°", place="angle")
    env = envelope(prepared, length_factor)
    if not measurement.has_solid:
        raise ProfileError("turning needs a solid section (a closed loop)")
    density = _check_number(density, "density", positive=True)
    f = float(length_factor)
    volume = measurement.volume * f ** 3
    com = measurement.centre_of_mass_axial * f
    faces = {k: v * f * f for k, v in measurement.surface_by_face.items()}
    # A hole loop lies strictly inside a solid loop (loops may not touch), so it
    # sweeps a closed hollow.
    hollows = sum(1 for d in prepared.depths if d % 2 == 1)
    return Part(volume=volume, density=density, mass=density * volume,
                centre_of_mass_axial=com, centre_of_mass_from_start=com - env.z_start,
                surface_by_face=faces, surface_total=measurement.surface_total * f * f,
                envelope=env, hollows=hollows)


# --------------------------------------------------------------------------- stock

@dataclass(frozen=True)
class StockSize:
    """One stock size, in metres: a round bar, a tube (hollow bar) or a user's blank.

    ``length`` is set only for a blank of given length.

    Examples
    --------
    >>> s = StockSize(0.05, 0.032, "50 × 32 mm", "tube")
    >>> round(s.section_area, 12) == round(math.pi / 4 * (0.05 ** 2 - 0.032 ** 2), 12)
    True
    >>> StockSize(0.02, 0.03)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stock size: the inside diameter 0.03 must be smaller than the outside diameter 0.02
    """

    outside_diameter: float
    inside_diameter: float = 0.0
    label: str = ""
    kind: str = "bar"
    source: str = ""
    length: Optional[float] = None

    def __post_init__(self):
        od = _check_number(self.outside_diameter, "stock size", positive=True)
        idia = _check_number(self.inside_diameter, "stock size")
        if idia >= od:
            raise RevolveError(f"the inside diameter {idia:g} must be smaller than the outside "
                               f"diameter {od:g}", place="stock size")
        if self.kind not in STOCK_KINDS:
            raise RevolveError(f"kind must be one of {', '.join(STOCK_KINDS)}", place="stock size")
        if self.length is not None:
            _check_number(self.length, "stock length", positive=True)

    @property
    def section_area(self) -> float:
        """π/4 (D² − d²)."""
        return math.pi / 4.0 * (self.outside_diameter ** 2 - self.inside_diameter ** 2)


@dataclass(frozen=True)
class Allowances:
    """Allowances in metres; ``turning`` and ``bore`` are on the diameter, ``facing`` per end.

    Examples
    --------
    >>> Allowances(turning=0.002).facing
    0.0
    >>> Allowances(facing=-0.001)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: facing allowance: must be zero or positive, got -0.001
    """

    turning: float = 0.0
    bore: float = 0.0
    facing: float = 0.0
    parting_width: float = 0.0
    holding_length: float = 0.0

    def __post_init__(self):
        for name, label in (("turning", "turning allowance"), ("bore", "bore allowance"),
                            ("facing", "facing allowance"), ("parting_width", "parting width"),
                            ("holding_length", "holding length")):
            object.__setattr__(self, name, _check_number(getattr(self, name), label))


def _covers(size: float, need: float) -> bool:
    """``size`` is at least ``need`` (an exact fit counts, within FIT_TOLERANCE).

    >>> _covers(0.05, 0.05), _covers(0.0499, 0.05), _covers(2 * 0.0254, 0.0508)
    (True, False, True)
    """
    return size >= need * (1.0 - FIT_TOLERANCE)


def required_outside_diameter(env: Envelope, allowances: Allowances) -> float:
    """Largest part diameter plus the turning allowance (on the diameter).

    >>> required_outside_diameter(Envelope(0, 0.04, 0.024, 0, False), Allowances(turning=0.002))
    0.05
    """
    return env.diameter + allowances.turning


def largest_inside_diameter(env: Envelope, allowances: Allowances) -> float:
    """Largest stock bore that still leaves the bore allowance: smallest bore − allowance; 0 if solid.

    >>> round(largest_inside_diameter(Envelope(0, 0.04, 0.03, 0.01, True), Allowances(bore=0.002)), 12)
    0.018
    >>> largest_inside_diameter(Envelope(0, 0.04, 0.03, 0.0, False), Allowances(bore=0.002))
    0.0
    """
    return max(0.0, env.bore_diameter - allowances.bore)


def choose_bar(sizes: Sequence[StockSize], need: float, unit: str = "mm") -> StockSize:
    """The smallest round bar whose diameter covers ``need``.

    Raises
    ------
    RevolveError
        When no bar in the list is large enough.

    Examples
    --------
    >>> bars = [StockSize(d / 1000, label=f"{d} mm") for d in (40, 45, 50)]
    >>> choose_bar(bars, 0.045).label, choose_bar(bars, 0.0451).label
    ('45 mm', '50 mm')
    >>> choose_bar(bars, 0.051)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stock: the part needs a bar of at least 51 mm diameter; the largest in the list is 50 mm; give a blank or a larger bar
    """
    fits = [s for s in sizes if s.inside_diameter == 0 and _covers(s.outside_diameter, need)]
    if not fits:
        largest = max((s.outside_diameter for s in sizes), default=0.0)
        raise RevolveError(f"the part needs a bar of at least {_length(need, unit)} diameter; the "
                           f"largest in the list is {_length(largest, unit)}; give a blank or a "
                           f"larger bar", place="stock")
    return min(fits, key=lambda s: s.outside_diameter)


def choose_tube(sizes: Sequence[StockSize], need_outside: float, max_inside: float,
                unit: str = "mm") -> StockSize:
    """The tube with the least cross-section whose outside covers ``need_outside`` and whose
    bore is at most ``max_inside``.

    Raises
    ------
    RevolveError
        When the part has no bore to suit or no tube fits.

    Examples
    --------
    >>> tubes = [StockSize(0.05, 0.032, "50 × 32", "tube"), StockSize(0.05, 0.025, "50 × 25", "tube"),
    ...          StockSize(0.056, 0.04, "56 × 40", "tube")]
    >>> choose_tube(tubes, 0.048, 0.034).label
    '50 × 32'
    >>> choose_tube(tubes, 0.048, 0.03).label
    '50 × 25'
    >>> choose_tube(tubes, 0.048, 0.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stock: the part has no through bore (or it is smaller than the bore allowance), so no tube suits it; use a round bar
    """
    if not max_inside > 0:
        raise RevolveError("the part has no through bore (or it is smaller than the bore "
                           "allowance), so no tube suits it; use a round bar", place="stock")
    fits = [s for s in sizes if s.inside_diameter > 0 and _covers(s.outside_diameter, need_outside)
            and _covers(max_inside, s.inside_diameter)]
    if not fits:
        raise RevolveError(f"no tube in the list has an outside diameter of at least "
                           f"{_length(need_outside, unit)} and a bore of at most "
                           f"{_length(max_inside, unit)}; use a round bar or give a blank",
                           place="stock")
    return min(fits, key=lambda s: (s.section_area, s.outside_diameter))


def choose_stock(env: Envelope, allowances: Allowances, bars: Sequence[StockSize],
                 tubes: Sequence[StockSize], choice: str = "bar", unit: str = "mm") -> StockSize:
    """Pick the stock size: ``"bar"``, ``"tube"``, or ``"lighter"`` (a suitable tube when it is
    lighter than the bar, else the bar).

    Examples
    --------
    >>> bars = [StockSize(0.05, label="50")]
    >>> tubes = [StockSize(0.05, 0.032, "50 × 32", "tube")]
    >>> bush = Envelope(0, 0.04, 0.024, 0.018, True)
    >>> choose_stock(bush, Allowances(0.002, 0.002), bars, tubes, "lighter").label
    '50 × 32'
    >>> pin = Envelope(0, 0.04, 0.024, 0.0, False)
    >>> choose_stock(pin, Allowances(0.002, 0.002), bars, tubes, "lighter").label
    '50'
    """
    if choice not in STOCK_CHOICES:
        raise RevolveError(f"choose one of {', '.join(STOCK_CHOICES)}, not {choice!r}",
                           place="stock")
    need = required_outside_diameter(env, allowances)
    if choice == "bar":
        return choose_bar(bars, need, unit)
    if choice == "tube":
        return choose_tube(tubes, need, largest_inside_diameter(env, allowances), unit)
    bar = choose_bar(bars, need, unit)
    try:
        tube = choose_tube(tubes, need, largest_inside_diameter(env, allowances), unit)
    except RevolveError:
        return bar
    return tube if tube.section_area < bar.section_area else bar


def check_blank(blank: StockSize, env: Envelope, allowances: Allowances,
                unit: str = "mm") -> Tuple[str, ...]:
    """Refuse a blank that cannot hold the part; return notes where it leaves less than the allowances.

    Examples
    --------
    >>> env = Envelope(0, 0.04, 0.024, 0.0, False)
    >>> check_blank(StockSize(0.049, kind="blank"), env, Allowances(turning=0.002))
    ('the blank leaves 1 mm on the diameter, less than the turning allowance of 2 mm',)
    >>> check_blank(StockSize(0.047, kind="blank"), env, Allowances())
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --blank: the blank's diameter 47 mm is smaller than the part's largest diameter 48 mm
    """
    notes = []
    if not _covers(blank.outside_diameter, env.diameter):
        raise RevolveError(f"the blank's diameter {_length(blank.outside_diameter, unit)} is smaller "
                           f"than the part's largest diameter {_length(env.diameter, unit)}",
                           option="--blank")
    if blank.inside_diameter > 0 and not _covers(env.bore_diameter, blank.inside_diameter):
        what = (f"the part's smallest bore {_length(env.bore_diameter, unit)}" if env.through_bore
                else "a part that is solid at the axis")
        raise RevolveError(f"the blank's bore {_length(blank.inside_diameter, unit)} is too large for "
                           f"{what}", option="--blank")
    if blank.length is not None and not _covers(blank.length, env.length):
        raise RevolveError(f"the blank's length {_length(blank.length, unit)} is shorter than the "
                           f"part's length {_length(env.length, unit)}", option="--blank-length")
    extra = blank.outside_diameter - env.diameter
    if not _covers(extra, allowances.turning) and allowances.turning > 0:
        notes.append(f"the blank leaves {_length(extra, unit)} on the diameter, less than the "
                     f"turning allowance of {_length(allowances.turning, unit)}")
    if blank.inside_diameter > 0:
        inner = env.bore_diameter - blank.inside_diameter
        if allowances.bore > 0 and not _covers(inner, allowances.bore):
            notes.append(f"the blank's bore leaves {_length(inner, unit)} on the diameter, less "
                         f"than the bore allowance of {_length(allowances.bore, unit)}")
    if blank.length is not None:
        need = stock_length(env.length, allowances)
        if not _covers(blank.length, need):
            notes.append(f"the blank's length {_length(blank.length, unit)} is less than part length "
                         f"+ allowances ({_length(need, unit)})")
    return tuple(notes)


def stock_length(part_length: float, allowances: Allowances) -> float:
    """Part length + facing allowance at each end + parting width + holding length.

    Examples
    --------
    >>> round(stock_length(0.040, Allowances(facing=0.001, parting_width=0.003,
    ...                                      holding_length=0.015)), 12)
    0.06
    """
    return (part_length + 2.0 * allowances.facing + allowances.parting_width
            + allowances.holding_length)


@dataclass(frozen=True)
class Stock:
    """The stock for one part: its size, length, volume π/4 (D² − d²) L and mass."""

    size: StockSize
    length: float
    volume: float
    mass: float


def stock_figures(size: StockSize, length: float, density: float) -> Stock:
    """Volume and mass of one stock length.

    Examples
    --------
    >>> s = stock_figures(StockSize(0.05), 0.1, 7850.0)
    >>> round(s.volume, 15) == round(math.pi / 4 * 0.05 ** 2 * 0.1, 15), round(s.mass, 6)
    (True, 1.541344)
    """
    length = _check_number(length, "stock length", positive=True)
    volume = size.section_area * length
    return Stock(size, length, volume, volume * float(density))


@dataclass(frozen=True)
class Removal:
    """Material removed from one stock length.

    ``removed_volume`` is stock − part exactly; ``offcut_volume`` the holding
    piece (left as an offcut, not cut); ``chip_volume`` the rest (turned,
    faced and parted away), which sets the roughing time. Each has its mass
    (m³ and kg).
    """

    removed_volume: float
    removed_mass: float
    offcut_volume: float
    chip_volume: float
    chip_mass: float
    utilisation: float
    offcut_mass: float = 0.0


def removal(part: Part, stock: Stock, allowances: Allowances) -> Removal:
    """Removed volume and mass, chips, offcut and utilisation (part mass / stock mass).

    Raises
    ------
    RevolveError
        When the part is larger than the stock (a blank too small).

    Examples
    --------
    >>> env = Envelope(0, 0.05, 0.015, 0.0, False)
    >>> part = Part(math.pi * 0.015 ** 2 * 0.05, 7850.0, 7850.0 * math.pi * 0.015 ** 2 * 0.05,
    ...             0.025, 0.025, {}, 0.0, env)
    >>> stock = stock_figures(StockSize(0.032), 0.07, 7850.0)
    >>> cut = removal(part, stock, Allowances(holding_length=0.015))
    >>> cut.removed_volume == stock.volume - part.volume
    True
    >>> round(cut.offcut_volume / (math.pi / 4 * 0.032 ** 2 * 0.015), 12)
    1.0
    """
    removed = stock.volume - part.volume
    if removed < -FIT_TOLERANCE * stock.volume:
        raise RevolveError("the part's volume is larger than the stock's; the stock cannot hold it",
                           place="stock")
    offcut = stock.size.section_area * allowances.holding_length
    if stock.size.length is not None:
        offcut = min(offcut, max(0.0, removed))
    chips = removed - offcut
    return Removal(removed_volume=removed, removed_mass=removed * part.density,
                   offcut_volume=offcut, chip_volume=chips, chip_mass=chips * part.density,
                   utilisation=part.mass / stock.mass if stock.mass else float("nan"),
                   offcut_mass=offcut * part.density)


# --------------------------------------------------------------------------- bars

def parts_per_bar(bar_length: float, remnant: float, length_per_part: float) -> int:
    """floor((bar length − remnant) / length per part) (common practice, no source).

    ``length_per_part`` is the stock length (part, facing allowances and
    holding length, plus the parting width). An exact fit counts.

    Examples
    --------
    >>> parts_per_bar(3.0, 0.1, 0.029), parts_per_bar(3.0, 0.1, 0.0290001)
    (100, 99)
    >>> parts_per_bar(0.05, 0.1, 0.02)
    0
    """
    usable = float(bar_length) - float(remnant)
    if usable <= 0:
        return 0
    return int(math.floor(usable / float(length_per_part) * (1.0 + FIT_TOLERANCE)))


def bars_needed(quantity: int, per_bar: int) -> int:
    """Bars for ``quantity`` parts at ``per_bar`` parts a bar: ceil(quantity / per bar).

    >>> bars_needed(100, 25), bars_needed(101, 25), bars_needed(1, 25)
    (4, 5, 1)
    """
    if per_bar <= 0:
        raise RevolveError("a bar gives no part; use a longer bar or a shorter remnant",
                           option="--bar-length")
    return -(-int(quantity) // int(per_bar))


@dataclass(frozen=True)
class BarUse:
    """Parts from bars of ``bar_length`` with ``remnant`` left over each; lengths in metres."""

    bar_length: float
    remnant: float
    length_per_part: float
    parts_per_bar: int
    quantity: int
    bars_needed: int
    unused_per_bar: float  # bar − remnant − parts × length per part
    parts_on_last_bar: int


def bar_use(bar_length: float, remnant: float, length_per_part: float, quantity: int,
            unit: str = "mm") -> BarUse:
    """Parts per bar and bars needed for ``quantity``.

    Raises
    ------
    RevolveError
        When one bar gives no part.

    Examples
    --------
    >>> b = bar_use(3.0, 0.1, 0.046, 200)
    >>> b.parts_per_bar, b.bars_needed, b.parts_on_last_bar, round(b.unused_per_bar * 1000, 6)
    (63, 4, 11, 2.0)
    >>> bar_use(0.1, 0.1, 0.046, 2)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --bar-length: a bar of 100 mm less a remnant of 100 mm gives no part of 46 mm; use a longer bar or a shorter remnant
    """
    bar_length = _check_number(bar_length, "bar length", positive=True)
    remnant = _check_number(remnant, "remnant")
    per = parts_per_bar(bar_length, remnant, length_per_part)
    if per <= 0:
        raise RevolveError(f"a bar of {_length(bar_length, unit)} less a remnant of "
                           f"{_length(remnant, unit)} gives no part of {_length(length_per_part, unit)}"
                           f"; use a longer bar or a shorter remnant", option="--bar-length")
    bars = bars_needed(quantity, per)
    last = int(quantity) - (bars - 1) * per
    unused = max(0.0, bar_length - remnant - per * length_per_part)
    return BarUse(bar_length, remnant, length_per_part, per, int(quantity), bars, unused, last)


# --------------------------------------------------------------------------- cutting

@dataclass(frozen=True)
class CuttingData:
    """Cutting speed vc (m/s), feed f (m per revolution), depth of cut ap (m).

    Examples
    --------
    >>> cd = CuttingData.from_trade_units(200, 0.3, 3)   # m/min, mm/rev, mm
    >>> round(cd.cutting_speed, 12), cd.feed, cd.depth_of_cut
    (3.333333333333, 0.0003, 0.003)
    >>> cd.trade_units()
    (200.0, 0.3, 3.0)
    >>> CuttingData(0.0, 0.0003, 0.003)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: cutting speed vc: must be positive, got 0
    """

    cutting_speed: float
    feed: float
    depth_of_cut: float

    def __post_init__(self):
        for name, label in (("cutting_speed", "cutting speed vc"), ("feed", "feed f"),
                            ("depth_of_cut", "depth of cut ap")):
            object.__setattr__(self, name, _check_number(getattr(self, name), label,
                                                         positive=True))

    @classmethod
    def from_trade_units(cls, vc_m_per_min: float, f_mm_per_rev: float, ap_mm: float) -> "CuttingData":
        return cls(vc_m_per_min / 60.0, f_mm_per_rev / 1000.0, ap_mm / 1000.0)

    def trade_units(self) -> Tuple[float, float, float]:
        """(vc in m/min, f in mm/rev, ap in mm), rounded to 12 significant digits."""
        return tuple(float(f"{v:.12g}") for v in (self.cutting_speed * 60.0, self.feed * 1000.0,
                                                  self.depth_of_cut * 1000.0))


def metal_removal_rate(cd: CuttingData) -> float:
    """Q = vc · ap · f in m³/s (common practice, no source).

    >>> round(metal_removal_rate(CuttingData.from_trade_units(200, 0.3, 3)) * 1e6 * 60, 9)  # cm³/min
    180.0
    """
    return cd.cutting_speed * cd.depth_of_cut * cd.feed


def spindle_speed(cutting_speed: float, diameter: float) -> float:
    """n = vc / (π D) in revolutions per second; infinite at D = 0.

    >>> round(spindle_speed(200 / 60, 0.05) * 60, 6)   # 1000 × 200 / (π × 50) rev/min
    1273.239545
    >>> spindle_speed(1.0, 0.0)
    inf
    """
    return math.inf if diameter <= 0 else cutting_speed / (math.pi * diameter)


def roughing_time(volume: float, cd: CuttingData) -> float:
    """Time to cut ``volume`` away at Q = vc · ap · f, in seconds.

    >>> round(roughing_time(180e-6, CuttingData.from_trade_units(200, 0.3, 3)), 9)   # 180 cm³ at 180 cm³/min
    60.0
    """
    return max(0.0, volume) / metal_removal_rate(cd)


def finishing_time(area: float, cd: CuttingData) -> float:
    """Time to finish ``area`` in one pass: A / (vc · f), in seconds.

    >>> round(finishing_time(0.01, CuttingData.from_trade_units(300, 0.1, 0.5)), 9)  # 100 cm² at 300 m/min × 0.1 mm
    20.0
    """
    return max(0.0, area) / (cd.cutting_speed * cd.feed)


def limit_radius(cd: CuttingData, speed_limit: Optional[float]) -> float:
    """Radius below which the spindle would pass ``speed_limit`` (rev/s): vc / (2π n max); 0 if none.

    >>> round(limit_radius(CuttingData(1.0, 1e-4, 1e-3), 10.0), 12) == round(1 / (20 * math.pi), 12)
    True
    >>> limit_radius(CuttingData(1.0, 1e-4, 1e-3), None)
    0.0
    """
    if speed_limit is None:
        return 0.0
    return cd.cutting_speed / (2.0 * math.pi * speed_limit)


def _G(r: float, vc: float, n: float) -> float:
    """∫₀ʳ g, with g(ρ) = max(0, 1/n − 2πρ/vc): the extra time per unit ``f``·area below the limit.

    >>> _G(0.0, 1.0, 1.0), round(_G(10.0, 2 * math.pi, 1.0), 12)    # rc = 1: ∫₀¹ (1 − ρ) dρ
    (0.0, 0.5)
    """
    rc = vc / (2.0 * math.pi * n)
    rr = min(max(float(r), 0.0), rc)
    return rr / n - math.pi * rr * rr / vc


def _section_g_integral(prepared, vc: float, n: float, length_factor: float) -> float:
    """∫∫ g(r) dA over the part's section (holes subtracted), in SI.

    g(r) = max(0, 1/n − 2πr/vc) = (2π/vc) max(0, rc − r) with rc = vc / (2πn), so
    this is (2π/vc) times the exact ramp integral of
    :func:`revolve.geometry.envelope.ramp_area_integral`, scaled to metres.
    """
    from revolve.geometry.envelope import ramp_area_integral

    f = float(length_factor)
    rc = vc / (2.0 * math.pi * n)
    return 2.0 * math.pi / vc * ramp_area_integral(prepared, rc / f).value * f ** 3


def roughing_time_limited(chip_volume: float, cut_length: float, stock: StockSize, prepared,
                          cd: CuttingData, speed_limit: Optional[float],
                          length_factor: float = 1.0) -> float:
    """Roughing time with the spindle capped at ``speed_limit`` (rev/s).

    Where 2πr n max < vc the cut runs at the limit, slower than vc:
    time = ∫ dV / (ap f v(r)) with v = min(vc, 2π r n max), which is
    V / Q plus (1/(ap f)) ∫∫ max(0, 1/n − 2πr/vc) dA over the chip region
    (stock over ``cut_length`` minus the part). Without a limit it is V / Q.

    Examples
    --------
    >>> cd = CuttingData(1.0, 1e-4, 1e-3)
    >>> roughing_time_limited(1e-6, 0.01, StockSize(0.02), None, cd, None) == roughing_time(1e-6, cd)
    True
    """
    base = roughing_time(chip_volume, cd)
    if speed_limit is None:
        return base
    vc, n = cd.cutting_speed, float(speed_limit)
    ro, ri = stock.outside_diameter / 2.0, stock.inside_diameter / 2.0
    stock_part = cut_length * (_G(ro, vc, n) - _G(ri, vc, n))
    extra = stock_part - _section_g_integral(prepared, vc, n, length_factor)
    return base + max(0.0, extra) / (cd.depth_of_cut * cd.feed)


def finished_faces(surface_by_face: Mapping[str, float], skip: Sequence[str] = ()) -> Dict[str, float]:
    """Faces that are finished: every face with area, except those in ``skip``.

    Raises
    ------
    RevolveError
        When ``skip`` names a face the part does not have.

    Examples
    --------
    >>> finished_faces({"bore": 2.0, "outside": 3.0, "other": 0.0}, skip=["bore"])
    {'outside': 3.0}
    >>> finished_faces({"bore": 2.0}, skip=["bores"])
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --no-finish: the part has no face 'bores'; its faces are: bore
    """
    names = [k for k in surface_by_face]
    for s in skip:
        if s not in surface_by_face:
            raise RevolveError(f"the part has no face {s!r}; its faces are: {', '.join(names)}",
                               option="--no-finish")
    return {k: v for k, v in surface_by_face.items() if v > 0 and k not in set(skip)}


def finishing_time_limited(prepared, faces: Sequence[str], area: float, cd: CuttingData,
                           speed_limit: Optional[float], length_factor: float = 1.0) -> float:
    """Finishing time of the named faces with the spindle capped at ``speed_limit`` (rev/s).

    ∫ 2πr ds / (f · min(vc, 2πr n max)): A / (vc f) plus (1/f) ∫ max(0, 1/n − 2πr/vc) ds along
    the finished segments. Where the whole face runs at the limit this is
    t = L / (f n) (common practice, no source). Without a limit it is A / (vc f).

    Examples
    --------
    >>> cd = CuttingData(1.0, 1e-4, 1e-3)
    >>> finishing_time_limited(None, [], 0.01, cd, None) == finishing_time(0.01, cd)
    True
    """
    base = finishing_time(area, cd)
    if speed_limit is None or not faces:
        return base
    from revolve.geometry.envelope import ramp_boundary_integral
    from revolve.geometry.profile import UNNAMED_FACE

    wanted = set(faces)
    segs = [s for path in prepared.paths for s in path if (s.face or UNNAMED_FACE) in wanted]
    f = float(length_factor)
    vc, n = cd.cutting_speed, float(speed_limit)
    rc = vc / (2.0 * math.pi * n)
    # ∫ g ds with g = (2π/vc) max(0, rc − r): the exact ramp integral along the faces, in metres.
    extra = 2.0 * math.pi / vc * ramp_boundary_integral(segs, rc / f).value * f * f
    return base + extra / cd.feed


@dataclass(frozen=True)
class Times:
    """Times in seconds; spindle speeds in rev/s.

    ``roughing_speed`` is n at the stock's outside diameter with the roughing
    vc, ``finishing_speed`` n at the part's largest diameter with the
    finishing vc; ``*_limited`` say they pass ``speed_limit``;
    ``*_limit_diameter`` is the diameter below which the spindle would pass
    the limit (0 without one).
    """

    roughing: float
    finishing: float
    handling: float
    setup: float
    roughing_speed: float
    finishing_speed: float
    speed_limit: Optional[float]
    roughing_limited: bool
    finishing_limited: bool
    roughing_limit_diameter: float
    finishing_limit_diameter: float
    finished_area: float
    finished_faces: Tuple[str, ...]

    @property
    def cycle(self) -> float:
        """Per part: roughing + finishing + handling."""
        return self.roughing + self.finishing + self.handling


# --------------------------------------------------------------------------- cost

@dataclass(frozen=True)
class Prices:
    """Prices and rates; ``stock_price`` per kg or per metre (``basis``), ``machine_rate`` per hour,
    times in seconds. None means not given.

    Examples
    --------
    >>> Prices(quantity=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --quantity: must be a whole number of at least 1, got 0
    """

    stock_price: Optional[float] = None
    basis: str = "kg"
    machine_rate: Optional[float] = None
    setup_time: float = 0.0
    handling_time: float = 0.0
    quantity: int = 1
    whole_bars: bool = False

    def __post_init__(self):
        if isinstance(self.quantity, bool) or not isinstance(self.quantity, int) or self.quantity < 1:
            raise RevolveError(f"must be a whole number of at least 1, got {self.quantity!r}",
                               option="--quantity")
        if self.basis not in PRICE_BASES:
            raise RevolveError("the stock price is per kg or per m", option="--stock-price")
        _check_number(self.stock_price, "--stock-price", allow_none=True)
        _check_number(self.machine_rate, "--machine-rate", allow_none=True)
        _check_number(self.setup_time, "--setup-time")
        _check_number(self.handling_time, "--handling-time")


@dataclass(frozen=True)
class Cost:
    """Cost per part and per batch; a figure is None when its price or rate was not given."""

    stock_per_part: Optional[float]
    machine_per_part: Optional[float]
    setup_per_part: Optional[float]
    per_part: Optional[float]
    stock_batch: Optional[float]
    machine_batch: Optional[float]
    setup_batch: Optional[float]
    batch: Optional[float]
    quantity: int
    complete: bool  # both stock price and machine rate given


def _sum(values):
    known = [v for v in values if v is not None]
    return sum(known) if known else None


def stock_price_of(prices: Prices, length: float, mass: float) -> Optional[float]:
    """Price of a piece of stock of ``length`` (m) and ``mass`` (kg); None without a price.

    >>> stock_price_of(Prices(2.5, "kg"), 0.1, 2.0), stock_price_of(Prices(8.0, "m"), 0.25, 2.0)
    (5.0, 2.0)
    """
    if prices.stock_price is None:
        return None
    return prices.stock_price * (mass if prices.basis == "kg" else length)


def cost(prices: Prices, stock: Stock, times: Times, bars: Optional[BarUse] = None) -> Cost:
    """Stock, machine and set-up cost per part and per batch of ``prices.quantity``.

    Stock per part is the price of one stock length; with ``whole_bars`` the
    batch pays for every bar it needs (remnants included) and each part its share.
    Machine: rate × cycle time; set-up: rate × set-up time, shared over the batch.

    Examples
    --------
    >>> t = Times(60.0, 30.0, 30.0, 1800.0, 0, 0, None, False, False, 0.0, 0.0, 0.0, ())
    >>> s = stock_figures(StockSize(0.05), 0.1, 7850.0)
    >>> c = cost(Prices(2.0, "m", machine_rate=60.0, setup_time=1800.0, quantity=10), s, t)
    >>> round(c.stock_per_part, 9), round(c.machine_per_part, 9), round(c.setup_per_part, 9)
    (0.2, 2.0, 3.0)
    >>> round(c.per_part, 9), round(c.batch, 9)
    (5.2, 52.0)
    """
    q = prices.quantity
    stock_part = stock_price_of(prices, stock.length, stock.mass)
    stock_batch = None if stock_part is None else stock_part * q
    if prices.whole_bars and bars is not None and prices.stock_price is not None:
        bar_mass = stock.size.section_area * bars.bar_length * (stock.mass / stock.volume)
        stock_batch = bars.bars_needed * stock_price_of(prices, bars.bar_length, bar_mass)
        stock_part = stock_batch / q
    rate = prices.machine_rate
    machine_part = None if rate is None else rate * times.cycle / 3600.0
    machine_batch = None if machine_part is None else machine_part * q
    setup_batch = None if rate is None else rate * times.setup / 3600.0
    setup_part = None if setup_batch is None else setup_batch / q
    return Cost(stock_per_part=stock_part, machine_per_part=machine_part, setup_per_part=setup_part,
                per_part=_sum([stock_part, machine_part, setup_part]),
                stock_batch=stock_batch, machine_batch=machine_batch, setup_batch=setup_batch,
                batch=_sum([stock_batch, machine_batch, setup_batch]), quantity=q,
                complete=prices.stock_price is not None and rate is not None)


# --------------------------------------------------------------------------- the whole job

@dataclass(frozen=True)
class TurningJob:
    """Everything a quote needs besides the part: lengths in metres, speeds in rev/s.

    ``bars`` and ``tubes`` are the stock lists; ``blank`` a user's blank that
    replaces them; ``bar_length`` None for no bar figures (a blank is never
    cut from a bar here); ``skip_faces`` are faces left out of finishing.
    """

    allowances: Allowances
    roughing: CuttingData
    finishing: CuttingData
    bars: Tuple[StockSize, ...] = ()
    tubes: Tuple[StockSize, ...] = ()
    choice: str = "bar"
    blank: Optional[StockSize] = None
    bar_length: Optional[float] = None
    remnant: float = 0.0
    prices: Prices = field(default_factory=Prices)
    speed_limit: Optional[float] = None
    skip_faces: Tuple[str, ...] = ()
    display_unit: str = "mm"  # for lengths in messages

    def __post_init__(self):
        if self.speed_limit is not None:
            _check_number(self.speed_limit, "--max-speed", positive=True)
        if self.choice not in STOCK_CHOICES:
            raise RevolveError(f"choose one of {', '.join(STOCK_CHOICES)}, not {self.choice!r}",
                               option="--stock")


@dataclass(frozen=True)
class Quote:
    """A turned part's full quote: part, stock, removal, bars, times, cost, notes."""

    part: Part
    stock: Stock
    removal: Removal
    bars: Optional[BarUse]
    times: Times
    cost: Cost
    job: TurningJob
    notes: Tuple[str, ...] = ()


def quote(measurement, prepared, density: float, job: TurningJob,
          length_factor: float = 1.0) -> Quote:
    """Work out the whole quote for one part.

    Examples
    --------
    >>> from revolve.geometry.profile import Loop, Profile, Revolution, Axis
    >>> from revolve.geometry.checks import prepare
    >>> from revolve.geometry.measure import measure
    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (50, 0), (50, 15), (0, 15)], face="all"),))
    >>> job = TurningJob(Allowances(0.002, 0.0, 0.001, 0.003), CuttingData.from_trade_units(200, 0.3, 3),
    ...                  CuttingData.from_trade_units(260, 0.12, 0.5),
    ...                  bars=(StockSize(0.032, label="32 mm"),), bar_length=3.0, remnant=0.1,
    ...                  prices=Prices(quantity=100))
    >>> q = quote(measure(Revolution(pin, Axis.x())), prepare(pin, Axis.x()), 7850.0, job, 0.001)
    >>> q.stock.size.label, round(q.stock.length * 1000, 9), q.bars.parts_per_bar, q.bars.bars_needed
    ('32 mm', 55.0, 52, 2)
    """
    part = part_figures(measurement, prepared, density, length_factor)
    env = part.envelope
    a = job.allowances
    notes = []
    if part.hollows:
        notes.append("the section has a closed hollow inside the material; a lathe cannot cut it, "
                     "and the figures include it as empty")
    if job.blank is not None:
        size = job.blank
        notes.extend(check_blank(size, env, a, job.display_unit))
        length = size.length if size.length is not None else stock_length(env.length, a)
    else:
        size = choose_stock(env, a, job.bars, job.tubes, job.choice, job.display_unit)
        length = stock_length(env.length, a)
    stock = stock_figures(size, length, density)
    cut = removal(part, stock, a)
    bars = None
    if job.blank is None and job.bar_length is not None:
        bars = bar_use(job.bar_length, job.remnant, stock.length, job.prices.quantity,
                       job.display_unit)
    faces = finished_faces(part.surface_by_face, job.skip_faces)
    area = float(sum(faces.values()))
    limit = job.speed_limit
    rough, fin = job.roughing, job.finishing
    cut_length = max(0.0, stock.length - a.holding_length)
    t_rough = roughing_time_limited(cut.chip_volume, cut_length, size, prepared, rough, limit,
                                    length_factor)
    t_fin = finishing_time_limited(prepared, tuple(faces), area, fin, limit, length_factor)
    n_rough = spindle_speed(rough.cutting_speed, size.outside_diameter)
    n_fin = spindle_speed(fin.cutting_speed, env.diameter)
    times = Times(roughing=t_rough, finishing=t_fin, handling=job.prices.handling_time,
                  setup=job.prices.setup_time, roughing_speed=n_rough, finishing_speed=n_fin,
                  speed_limit=limit,
                  roughing_limited=limit is not None and n_rough > limit,
                  finishing_limited=limit is not None and n_fin > limit,
                  roughing_limit_diameter=2 * limit_radius(rough, limit),
                  finishing_limit_diameter=2 * limit_radius(fin, limit),
                  finished_area=area, finished_faces=tuple(faces))
    price = cost(job.prices, stock, times, bars)
    return Quote(part, stock, cut, bars, times, price, job, tuple(notes))
