"""What is bought for a coating job: packs, two-pack mixes, thinner, preparation, stripe coats, labour.

The coating estimate (:mod:`revolve.jobs.coating`) says how many litres each
coat needs; this module turns litres into what a shop orders and does:

* :func:`choose_packs` rounds litres up to the packs a product is sold in;
* :func:`buy` does it for a product, two-pack products base and hardener
  separately in their mixing ratio by volume, with a minimum mix and thinner
  as a percentage by volume;
* :func:`preparation` gives the blast or preparation area and the abrasive;
* :func:`profile_edges` and :func:`stripe_coat` give the stripe coat on edges;
* :func:`face_group_estimate` applies a different system to each face group
  (inside lining, outside paint) and sums the groups to the whole;
* :func:`labour` gives application time and its cost.

Units: areas in m², lengths in metres, volumes in **litres** (the coating
trade's unit, as in :mod:`revolve.jobs.coating`), abrasive in kg, time in
hours, money in the user's currency. Every rule is common practice, no source.

Examples
--------
9.2 L of a product sold in 1 L, 5 L and 20 L tins: the fewest tins, and the
least left over (then the fewest tins):

>>> tins = (Pack(1.0), Pack(5.0), Pack(20.0))
>>> choose_packs(9.2, tins, rule="fewest").text()
'1 × 20 L'
>>> choice = choose_packs(9.2, tins, rule="least left over")
>>> choice.text(), choice.litres
('2 × 5 L', 10.0)
"""

from __future__ import annotations

import math
import re
from fractions import Fraction
from dataclasses import dataclass, field
from typing import Any, Dict, Iterable, Mapping, Optional, Sequence, Tuple

from revolve.errors import RevolveError
from revolve.inputs import checked_number

#: The rules :func:`choose_packs` knows.
RULES = ("cheapest", "fewest", "least left over")
#: Largest number of pack-size steps the search may look through (a bound on the work).
MAX_STEPS = 50_000
#: Relative slack when comparing volumes (rounding of decimal litres).
_SLACK = 1e-9

#: Cautions a coating quote shows.
CAUTIONS = (
    "Quantities are estimates; follow the coating's data sheet for film thickness, "
    "recoat times and application.",
    "Ventilate: solvent vapour is harmful and can ignite; keep sources of ignition away.",
    "Work inside vessels and tanks is confined-space work: follow the confined-space rules "
    "(permit, gas testing, forced ventilation, a standby person) and local regulations.",
    "Two-pack products have a pot life once mixed: mix only what can be applied within it, "
    "in the data sheet's mixing ratio.",
    "Do not thin beyond the data sheet's thinning limit; thinning also raises the solvent "
    "given off.",
)


def _number(value, what: str, *, zero: bool = True) -> float:
    """:func:`revolve.inputs.checked_number`, where zero is allowed unless said otherwise."""
    return checked_number(value, what, zero=zero)


def _litres(v: float) -> str:
    return f"{v:.6g} L"


# --------------------------------------------------------------------------- packs

@dataclass(frozen=True)
class Pack:
    """A pack a product is sold in: its size in litres and, optionally, its price.

    >>> Pack(2.5, 31.0)
    Pack(size=2.5, price=31.0)
    >>> Pack(0.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: pack size: must be a positive number, got 0.0
    """

    size: float
    price: Optional[float] = None
    #: How the user wrote the size (``"1 US gal"``), for order lines; None: litres.
    label: Optional[str] = field(default=None, compare=False, repr=False)

    def __post_init__(self):
        object.__setattr__(self, "size", _number(self.size, "pack size", zero=False))
        if self.price is not None:
            object.__setattr__(self, "price", _number(self.price, "pack price"))


@dataclass(frozen=True)
class PackChoice:
    """Packs bought to cover ``needed`` litres: ``counts`` pairs each pack with how many."""

    needed: float
    counts: Tuple[Tuple[Pack, int], ...]
    rule: str

    @property
    def litres(self) -> float:
        """Litres bought."""
        return math.fsum(p.size * n for p, n in self.counts)

    @property
    def surplus(self) -> float:
        return self.litres - self.needed

    @property
    def packs(self) -> int:
        return sum(n for _, n in self.counts)

    @property
    def cost(self) -> Optional[float]:
        """Money for the packs, None when a pack bought has no price."""
        if any(p.price is None for p, n in self.counts if n):
            return None
        return math.fsum(p.price * n for p, n in self.counts)

    def text(self) -> str:
        """The packs as an order line, largest first ("nothing" when none)."""
        parts = [f"{n} × {p.label or f'{p.size:g} L'}"
                 for p, n in sorted(self.counts, key=lambda c: -c[0].size) if n]
        return " + ".join(parts) or "nothing"


def _steps(packs: Sequence[Pack]) -> Tuple[Fraction, Tuple[int, ...]]:
    """A common step (litres, exact) and each pack's size in steps.

    Sizes are read as exact decimals of a litre (to the nanolitre), so packs in
    US gallons and quarts (231 in³ and a quarter of it) share a step as
    packs in litres and millilitres do.

    >>> _steps((Pack(5.0), Pack(0.25)))
    (Fraction(1, 4), (20, 1))
    >>> step, units = _steps((Pack(3.785411784), Pack(0.946352946)))
    >>> units
    (4, 1)
    """
    exact = [Fraction(repr(round(p.size, 9))) for p in packs]      # to the nanolitre
    for p, f in zip(packs, exact):
        if f <= 0:
            raise RevolveError(f"{p.size!r} L is below a nanolitre", place="pack size")
    common = 1
    for f in exact:
        common = common * f.denominator // math.gcd(common, f.denominator)
    whole = [int(f * common) for f in exact]
    g = 0
    for v in whole:
        g = math.gcd(g, v)
    return Fraction(g, common), tuple(v // g for v in whole)


def choose_packs(litres: float, packs: Sequence[Pack], rule: str = "cheapest") -> PackChoice:
    """The packs to buy that hold at least ``litres``, chosen by ``rule``.

    The rule, stated (common practice, no source):

    * ``"cheapest"``: the least money; among equal money the fewest packs,
      then the least left over. Every pack needs a price.
    * ``"fewest"``: the fewest packs; among equal counts the least left over,
      then the least money.
    * ``"least left over"``: the least surplus; among equal surplus the
      fewest packs, then the least money.

    The search is exact (a knapsack over the packs' common step, an exact
    fraction of a litre). For large orders the bulk goes in the best pack (the
    cheapest per litre, or the largest) and the rest is searched: any other
    pack used as many times as the best pack's size in steps could be swapped
    for the best pack at no loss, so that bounds the rest. The work is bounded
    by :data:`MAX_STEPS`; pack sizes whose common step is too fine are refused.

    Parameters
    ----------
    litres : float
        What is needed (0 buys nothing).
    packs : sequence of Pack
        The sizes the product is sold in.
    rule : {"cheapest", "fewest", "least left over"}

    Examples
    --------
    Worked by hand: 12 L from 5 L at 40 and 20 L at 120. Cheapest: 3 × 5 L
    = 120 ties with 1 × 20 L = 120; the tie goes to fewer packs (1 × 20 L).
    With the 20 L tin at 125 the three 5 L tins win:

    >>> five, twenty = Pack(5.0, 40.0), Pack(20.0, 120.0)
    >>> choose_packs(12, (five, twenty)).text()
    '1 × 20 L'
    >>> choose_packs(12, (five, Pack(20.0, 125.0))).text()
    '3 × 5 L'

    Fewest packs for 7 L from 2.5 L and 4 L: 2 × 4 L (8 L, left over 1 L)
    beats 1 × 4 + 2 × 2.5 (9 L, 3 packs) and 3 × 2.5 (7.5 L, 3 packs):

    >>> c = choose_packs(7, (Pack(2.5), Pack(4)), rule="fewest")
    >>> c.text(), c.packs, c.surplus
    ('2 × 4 L', 2, 1.0)
    >>> choose_packs(0, (Pack(5.0),), rule="fewest").text()
    'nothing'
    >>> choose_packs(3, (Pack(5.0),))
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: pack price: the cheapest packs need a price for every pack; give the prices or choose the fewest packs
    """
    need = _number(litres, "litres needed")
    if rule not in RULES:
        raise RevolveError(f"unknown rule {rule!r}; use one of: {', '.join(RULES)}", place="pack rule")
    packs = tuple(packs)
    if not packs:
        raise RevolveError("the product has no pack sizes", place="pack sizes")
    if rule == "cheapest" and any(p.price is None for p in packs):
        raise RevolveError("the cheapest packs need a price for every pack; give the prices or "
                           "choose the fewest packs", place="pack price")
    if need == 0:
        return PackChoice(0.0, tuple((p, 0) for p in packs), rule)
    step, units = _steps(packs)
    need_units = math.ceil(need / float(step) * (1 - _SLACK))
    price = [p.price if p.price is not None else 0.0 for p in packs]
    if rule == "cheapest":
        best = min(range(len(packs)), key=lambda i: (price[i] / units[i], -units[i]))
    else:
        best = max(range(len(packs)), key=lambda i: units[i])
    u_best = units[best]
    rest = sum((u_best - 1) * u for i, u in enumerate(units) if i != best)
    forced = max(0, (need_units - rest) // u_best)
    remaining = need_units - forced * u_best
    top = remaining + max(units)
    if top > MAX_STEPS:
        raise RevolveError(f"the pack sizes share only a {float(step) * 1000:.6g} mL step, too "
                           f"fine to search; round the pack sizes", place="pack sizes")

    def key(cost: float, count: int, volume: int):
        c = round(cost, 9)
        if rule == "cheapest":
            return (c, count, volume)
        return (count, volume, c) if rule == "fewest" else (volume, count, c)

    # exact-volume knapsack: table[v] = (cost, count, last pack) of the best way to make v steps
    table: list = [None] * (top + 1)
    table[0] = (0.0, 0, -1)
    for v in range(1, top + 1):
        found = None
        for i, u in enumerate(units):
            if u <= v and table[v - u] is not None:
                cost, count, _ = table[v - u]
                cand = (cost + price[i], count + 1, i)
                if found is None or key(cand[0], cand[1], v) < key(found[0], found[1], v):
                    found = cand
        table[v] = found
    end = min((v for v in range(max(0, remaining), top + 1) if table[v] is not None),
              key=lambda v: key(table[v][0] + forced * price[best], table[v][1] + forced, v))
    counts = [0] * len(packs)
    counts[best] += forced
    v = end
    while v > 0:
        i = table[v][2]
        counts[i] += 1
        v -= units[i]
    return PackChoice(need, tuple(zip(packs, counts)), rule)


# --------------------------------------------------------------------------- products

@dataclass(frozen=True)
class Product:
    """A coating product as sold.

    ``packs`` are the packs of the product (the base of a two-pack product);
    a two-pack product gives ``mix_ratio`` = (base, hardener) parts by volume
    and ``hardener_packs``. ``minimum_mix`` (litres of mixed product) is the
    least that is mixed at a time; ``thinner_percent`` is thinner by volume of
    the mixed product, ``thinner_limit`` the data sheet's most (refused above
    it) and ``thinner_packs`` what thinner is sold in.

    Examples
    --------
    >>> Product("epoxy", (Pack(4.0),), mix_ratio=(4, 1))
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: epoxy: a two-pack product needs its hardener packs
    >>> Product("enamel", (Pack(1.0),), thinner_percent=15, thinner_limit=10)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: enamel: thinning 15 % is above the data sheet's limit of 10 %; follow the data sheet
    """

    name: str
    packs: Tuple[Pack, ...]
    mix_ratio: Optional[Tuple[float, float]] = None
    hardener_packs: Tuple[Pack, ...] = ()
    minimum_mix: float = 0.0
    thinner_percent: float = 0.0
    thinner_limit: Optional[float] = None
    thinner_packs: Tuple[Pack, ...] = ()

    def __post_init__(self):
        object.__setattr__(self, "packs", tuple(self.packs))
        object.__setattr__(self, "hardener_packs", tuple(self.hardener_packs))
        object.__setattr__(self, "thinner_packs", tuple(self.thinner_packs))
        if not self.packs:
            raise RevolveError("the product has no pack sizes", place=self.name)
        _number(self.minimum_mix, f"{self.name}: minimum mix")
        _number(self.thinner_percent, f"{self.name}: thinner")
        if self.mix_ratio is not None:
            if len(self.mix_ratio) != 2:
                raise RevolveError("the mixing ratio is two numbers, base and hardener",
                                   place=self.name)
            for part in self.mix_ratio:
                _number(part, f"{self.name}: mixing ratio", zero=False)
            if not self.hardener_packs:
                raise RevolveError("a two-pack product needs its hardener packs", place=self.name)
        elif self.hardener_packs:
            raise RevolveError("hardener packs need a mixing ratio", place=self.name)
        if self.thinner_limit is not None:
            limit = _number(self.thinner_limit, f"{self.name}: thinner limit")
            if self.thinner_percent > limit:
                raise RevolveError(f"thinning {self.thinner_percent:g} % is above the data sheet's "
                                   f"limit of {limit:g} %; follow the data sheet",
                                   place=self.name)

    @property
    def two_pack(self) -> bool:
        return self.mix_ratio is not None


@dataclass(frozen=True)
class Purchase:
    """What is bought of one product for ``needed`` litres of mixed, unthinned product.

    ``mixed`` is what is mixed (at least the minimum mix); ``base_litres`` and
    ``hardener_litres`` its parts in the mixing ratio; ``base`` and
    ``hardener`` the packs; ``mixable`` the litres the packs bought make in the
    ratio; ``thinner_litres`` = mixed × thinner % / 100.
    """

    product: Product
    needed: float
    mixed: float
    base_litres: float
    hardener_litres: float
    base: PackChoice
    hardener: Optional[PackChoice]
    mixable: float
    thinner_litres: float
    thinner: Optional[PackChoice]
    notes: Tuple[str, ...] = ()

    @property
    def cost(self) -> Optional[float]:
        """Money for every pack bought; None when a price is missing."""
        parts = [c.cost for c in (self.base, self.hardener, self.thinner) if c is not None]
        return None if any(p is None for p in parts) else math.fsum(parts)


def buy(product: Product, litres: float, rule: str = "cheapest") -> Purchase:
    """Packs to buy of ``product`` for ``litres`` of mixed product (common practice, no source).

    The mixed quantity is at least the product's minimum mix. A two-pack
    product splits it by volume in its ratio b:h, base = mixed × b/(b + h),
    hardener = mixed × h/(b + h), and each is rounded up to its own packs
    (:func:`choose_packs` with ``rule``); ``mixable`` is what the bought packs
    make in the ratio, min(base bought × (b + h)/b, hardener bought × (b + h)/h).
    Thinner = mixed × thinner % / 100, rounded to its packs if any are given.

    Examples
    --------
    Worked by hand: 13 L of a 4:1 epoxy, base in 4 L and 16 L, hardener in 1 L
    and 4 L, least left over: base 13 × 4/5 = 10.4 L → 3 × 4 L (12 L); hardener
    13/5 = 2.6 L → 3 × 1 L (3 L); mixable min(12 × 5/4, 3 × 5) = 15 L;
    thinner 5 % of 13 L = 0.65 L → 1 × 1 L:

    >>> epoxy = Product("epoxy", (Pack(4.0), Pack(16.0)), mix_ratio=(4, 1),
    ...                 hardener_packs=(Pack(1.0), Pack(4.0)), thinner_percent=5,
    ...                 thinner_packs=(Pack(1.0),))
    >>> p = buy(epoxy, 13, rule="least left over")
    >>> round(p.base_litres, 12), round(p.hardener_litres, 12), p.base.text(), p.hardener.text()
    (10.4, 2.6, '3 × 4 L', '3 × 1 L')
    >>> p.mixable, round(p.thinner_litres, 12), p.thinner.text()
    (15.0, 0.65, '1 × 1 L')

    A small touch-up raised to the minimum mix:

    >>> small = Product("primer", (Pack(1.0),), minimum_mix=2.0)
    >>> q = buy(small, 0.4, rule="fewest")
    >>> q.mixed, q.base.text(), q.notes[0]
    (2.0, '2 × 1 L', 'primer: 0.4 L needed is below the minimum mix; 2 L is mixed')
    >>> buy(small, 0, rule="fewest").base.text()
    'nothing'
    """
    need = _number(litres, f"{product.name}: litres needed")
    notes = []
    mixed = need
    if 0 < need < product.minimum_mix:
        mixed = product.minimum_mix
        notes.append(f"{product.name}: {_litres(need)} needed is below the minimum mix; "
                     f"{_litres(mixed)} is mixed")
    if product.two_pack:
        b, h = (float(x) for x in product.mix_ratio)
        base_l, hard_l = mixed * b / (b + h), mixed * h / (b + h)
        base = choose_packs(base_l, product.packs, rule)
        hardener = choose_packs(hard_l, product.hardener_packs, rule)
        mixable = min(base.litres * (b + h) / b, hardener.litres * (b + h) / h)
    else:
        base_l, hard_l = mixed, 0.0
        base, hardener = choose_packs(mixed, product.packs, rule), None
        mixable = base.litres
    thinner_l = mixed * product.thinner_percent / 100.0
    thinner = choose_packs(thinner_l, product.thinner_packs, rule) \
        if product.thinner_packs and thinner_l > 0 else None
    if product.thinner_percent > 0 and not product.thinner_packs:
        notes.append(f"{product.name}: {_litres(thinner_l)} of thinner; no thinner packs given")
    return Purchase(product, need, mixed, base_l, hard_l, base, hardener, mixable, thinner_l,
                    thinner, tuple(notes))


# --------------------------------------------------------------------------- preparation

@dataclass(frozen=True)
class Preparation:
    """Area prepared (m²: coated + masked but prepared) and abrasive (kg, None without a rate)."""

    coated_area: float
    masked_prepared_area: float
    abrasive_rate: Optional[float]

    @property
    def area(self) -> float:
        return self.coated_area + self.masked_prepared_area

    @property
    def abrasive(self) -> Optional[float]:
        return None if self.abrasive_rate is None else self.area * self.abrasive_rate


def preparation(coated_area: float, masked_prepared_area: float = 0.0,
                abrasive_rate: Optional[float] = None) -> Preparation:
    """Blast or preparation area and abrasive (common practice, no source).

    area = coated + masked but prepared (m²); abrasive = area × the rate the
    user gives (kg/m²).

    Examples
    --------
    >>> p = preparation(12.5, 1.5, abrasive_rate=30)
    >>> p.area, p.abrasive
    (14.0, 420.0)
    >>> preparation(0.0).abrasive is None
    True
    """
    return Preparation(_number(coated_area, "coated area"),
                       _number(masked_prepared_area, "masked but prepared area"),
                       None if abrasive_rate is None
                       else _number(abrasive_rate, "abrasive consumption rate"))


# --------------------------------------------------------------------------- edges

@dataclass(frozen=True)
class Edge:
    """A circular edge of the revolved part: where the profile has a corner or a free end.

    ``z`` and ``radius`` (metres) place it in the axis frame; ``angle`` is the
    change of direction at a corner (radians; π for a free end of an open
    chain); ``length`` = sweep × radius (m).
    """

    z: float
    radius: float
    angle: float
    kind: str
    length: float


def profile_edges(prepared, length_factor: float = 1.0, sweep: float = 2.0 * math.pi,
                  min_angle: float = math.radians(30.0),
                  faces: Optional[Iterable[str]] = None) -> Tuple[Edge, ...]:
    """The edges of a revolved profile, from its corners, through the segments' tangents.

    A corner is a joint of two segments whose directions (from each kind's
    :meth:`tangents_at`, at the end of one and the start of the next) turn by
    more than ``min_angle``; it sweeps a circle of length ``sweep × r``.
    Inside one segment (a point list's vertices) the corners are found along
    the kind's :meth:`flatten`, taken finely enough (steps of at most half of
    ``min_angle``) that an arc or a smooth curve shows none. A free end of an
    open chain (a sheet's edge) is an edge too. Corners on the axis have no
    length and are left out. With ``faces`` given, an edge counts when a
    segment meeting there has one of those faces.

    Examples
    --------
    A ⌀40 × 30 mm bush with a ⌀20 bore: its drawing has four corners, at
    radii 10, 10, 20, 20 mm, so the edges are 2π (10 + 10 + 20 + 20) mm
    = 120 π mm long (geometry):

    >>> from revolve.geometry.profile import Loop, Profile, Axis
    >>> from revolve.geometry.checks import prepare
    >>> bush = Profile(loops=(Loop.from_points([(0, 10), (30, 10), (30, 20), (0, 20)]),))
    >>> edges = profile_edges(prepare(bush, Axis.x()), length_factor=0.001)
    >>> sorted(round(e.radius * 1000, 9) for e in edges)
    [10.0, 10.0, 20.0, 20.0]
    >>> round(sum(e.length for e in edges), 12) == round(0.120 * math.pi, 12)
    True

    A solid pin's corners on the axis have no length:

    >>> pin = Profile(loops=(Loop.from_points([(0, 0), (30, 0), (30, 20), (0, 20)]),))
    >>> len(profile_edges(prepare(pin, Axis.x())))
    2
    """
    import numpy as np

    wanted = None if faces is None else set(faces)
    step = min(0.5 * min_angle, math.pi / 36)
    out = []

    def add(z, r, angle, kind):
        if r > prepared.tolerance:
            out.append(Edge(z * length_factor, r * length_factor, angle, kind,
                            sweep * r * length_factor))

    def turn(u, v) -> float:
        nu, nv = math.hypot(*u), math.hypot(*v)
        if nu == 0 or nv == 0:
            return 0.0
        return math.acos(max(-1.0, min(1.0, (u[0] * v[0] + u[1] * v[1]) / (nu * nv))))

    for segs, closed in zip(prepared.paths, prepared.closed):
        n = len(segs)
        for seg in segs:                       # corners inside one segment (a point list's vertices)
            if wanted is not None and seg.face not in wanted:
                continue
            pts = np.asarray(seg.flatten(max_angle=step), dtype=float)
            d = np.diff(pts, axis=0)
            keep = np.hypot(d[:, 0], d[:, 1]) > 0
            d, at = d[keep], pts[1:][keep]
            if len(d) < 2:
                continue
            cos = np.einsum("ij,ij->i", d[:-1], d[1:]) / (
                np.hypot(d[:-1, 0], d[:-1, 1]) * np.hypot(d[1:, 0], d[1:, 1]))
            angles = np.arccos(np.clip(cos, -1.0, 1.0))
            for k in np.nonzero(angles > min_angle)[0]:
                add(float(at[k, 0]), float(at[k, 1]), float(angles[k]), "corner")
        joints = [(segs[i], segs[i + 1]) for i in range(n - 1)]
        if closed:
            joints.append((segs[-1], segs[0]))
        for a, b in joints:                    # corners between segments
            if wanted is not None and a.face not in wanted and b.face not in wanted:
                continue
            angle = turn(a.tangents_at([a.parameter_range()[1]])[0],
                         b.tangents_at([b.parameter_range()[0]])[0])
            if angle > min_angle:
                z, r = (float(c) for c in b.points_at([b.parameter_range()[0]])[0])
                add(z, r, angle, "corner")
        if not closed and n:
            for seg, end in ((segs[0], 0), (segs[-1], 1)):
                if wanted is None or seg.face in wanted:
                    z, r = (float(c) for c in seg.points_at([seg.parameter_range()[end]])[0])
                    add(z, r, math.pi, "free end")
    return tuple(out)


@dataclass(frozen=True)
class StripeCoat:
    """The stripe-coat allowance, shown apart from the full coats: area (m²) and how it was found."""

    area: float
    edge_length: Optional[float]
    band_width: Optional[float]
    percent: Optional[float]
    rule: str


def stripe_coat(edge_length: Optional[float] = None, band_width: Optional[float] = None, *,
                coated_area: Optional[float] = None,
                percent: Optional[float] = None) -> StripeCoat:
    """Stripe coat on edges: edge length × band width, or a percentage of the coated area.

    Examples
    --------
    The bush's 120 π mm of edges with a 50 mm band:

    >>> s = stripe_coat(0.12 * math.pi, 0.05)
    >>> round(s.area, 12) == round(0.006 * math.pi, 12), s.rule
    (True, 'edge length × band width')
    >>> stripe_coat(coated_area=20.0, percent=5).area
    1.0
    >>> stripe_coat(1.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: stripe coat: give an edge length and a band width, or a coated area and a percentage
    """
    if edge_length is not None and band_width is not None and percent is None:
        length = _number(edge_length, "edge length")
        band = _number(band_width, "band width")
        return StripeCoat(length * band, length, band, None, "edge length × band width")
    if percent is not None and coated_area is not None and edge_length is None \
            and band_width is None:
        pct = _number(percent, "stripe coat percentage")
        return StripeCoat(_number(coated_area, "coated area") * pct / 100.0, None, None, pct,
                          "percentage of the coated area")
    raise RevolveError("give an edge length and a band width, or a coated area and a "
                       "percentage", place="stripe coat")


# --------------------------------------------------------------------------- systems by face group

@dataclass(frozen=True)
class SystemCoat:
    """One coat of a system: its practical spreading rate (m²/L) and, optionally, its product."""

    name: str
    spreading_rate: float
    product: Optional[Product] = None

    def __post_init__(self):
        _number(self.spreading_rate, f"{self.name}: spreading rate", zero=False)


@dataclass(frozen=True)
class System:
    """A coating system: its coats in order."""

    name: str
    coats: Tuple[SystemCoat, ...]

    def __post_init__(self):
        object.__setattr__(self, "coats", tuple(self.coats))
        if not self.coats:
            raise RevolveError("a system needs at least one coat", place=self.name)


@dataclass(frozen=True)
class GroupEstimate:
    """One face group under its system: area (m²), litres per coat, coat-area (m² × coats)."""

    group: str
    faces: Tuple[str, ...]
    system: System
    area: float
    litres: Tuple[float, ...]

    @property
    def coat_area(self) -> float:
        return self.area * len(self.system.coats)

    @property
    def total_litres(self) -> float:
        return math.fsum(self.litres)


@dataclass(frozen=True)
class FaceGroupsEstimate:
    """Every face group's estimate; the whole is their sum. ``uncoated`` faces are in no group."""

    groups: Tuple[GroupEstimate, ...]
    uncoated: Tuple[str, ...]

    @property
    def area(self) -> float:
        return math.fsum(g.area for g in self.groups)

    @property
    def litres(self) -> float:
        return math.fsum(g.total_litres for g in self.groups)

    @property
    def coat_area(self) -> float:
        return math.fsum(g.coat_area for g in self.groups)

    def litres_by_product(self) -> Dict[str, float]:
        """Litres summed over the groups for each product name (coats without one by coat name)."""
        out: Dict[str, float] = {}
        for g in self.groups:
            for coat, litres in zip(g.system.coats, g.litres):
                name = coat.product.name if coat.product is not None else coat.name
                out[name] = out.get(name, 0.0) + litres
        return out


def face_group_estimate(area_by_face: Mapping[str, float],
                        groups: Mapping[str, Sequence[str]],
                        systems: Mapping[str, System]) -> FaceGroupsEstimate:
    """A different system for each face group, summed to the whole.

    Parameters
    ----------
    area_by_face : mapping
        m² per face name (the measurement's surface by face).
    groups : mapping
        Group name → the face names in it; a face may be in one group only.
    systems : mapping
        Group name → its :class:`System`.

    Examples
    --------
    A vessel lined inside (2 coats at 5 m²/L) and painted outside (3 coats at
    8 m²/L), its ends left bare; worked by hand: lining 10 m² → 2 × 2 L,
    paint 16 m² → 3 × 2 L, whole 26 m² and 10 L:

    >>> lining = System("lining", (SystemCoat("epoxy 1", 5.0), SystemCoat("epoxy 2", 5.0)))
    >>> paint = System("paint", tuple(SystemCoat(f"coat {k}", 8.0) for k in (1, 2, 3)))
    >>> est = face_group_estimate({"inner": 10.0, "outer": 12.0, "top": 4.0, "ends": 1.0},
    ...                           {"inside": ["inner"], "outside": ["outer", "top"]},
    ...                           {"inside": lining, "outside": paint})
    >>> [(g.group, g.area, g.litres) for g in est.groups]
    [('inside', 10.0, (2.0, 2.0)), ('outside', 16.0, (2.0, 2.0, 2.0))]
    >>> est.area, est.litres, est.uncoated
    (26.0, 10.0, ('ends',))
    >>> face_group_estimate({"a": 1.0}, {"x": ["a"], "y": ["a"]}, {"x": lining, "y": paint})
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: face groups: the face 'a' is in two groups, 'x' and 'y'
    """
    from revolve.errors import quoted

    owner: Dict[str, str] = {}
    for group, faces in groups.items():
        if group not in systems:
            raise RevolveError(f"the group {quoted(group)} has no system", place="face groups")
        for face in faces:
            if face not in area_by_face:
                raise RevolveError(f"the group {quoted(group)} names the face {quoted(face)}, "
                                   f"which the profile does not have; faces: "
                                   f"{', '.join(area_by_face)}", place="face groups")
            if face in owner:
                raise RevolveError(f"the face {quoted(face)} is in two groups, "
                                   f"{quoted(owner[face])} and {quoted(group)}",
                                   place="face groups")
            owner[face] = group
    out = []
    for group, faces in groups.items():
        area = math.fsum(_number(area_by_face[f], f"area of {f}") for f in faces)
        system = systems[group]
        out.append(GroupEstimate(group, tuple(faces), system, area,
                                 tuple(area / c.spreading_rate for c in system.coats)))
    return FaceGroupsEstimate(tuple(out), tuple(f for f in area_by_face if f not in owner))


# --------------------------------------------------------------------------- labour

@dataclass(frozen=True)
class Labour:
    """Application time (hours) and its cost (None without a labour rate)."""

    hours: float
    cost: Optional[float]
    rule: str


def labour(coat_area: float, rate: float, labour_rate: Optional[float] = None) -> Labour:
    """Application time from a rate per m² per coat: hours = Σ (area × coats) / rate.

    Parameters
    ----------
    coat_area : float
        m² × coats (each coat counts its area once; see
        :attr:`FaceGroupsEstimate.coat_area`).
    rate : float
        m² applied per hour per coat.
    labour_rate : float, optional
        Money per hour.

    Examples
    --------
    26 m² in 2 and 3 coats (10 × 2 + 16 × 3 = 68 m²) at 12 m²/h and 45 an hour:

    >>> job = labour(68.0, 12.0, 45.0)
    >>> round(job.hours, 9), round(job.cost, 9)
    (5.666666667, 255.0)
    >>> labour(0.0, 12.0).hours, labour(0.0, 12.0).cost
    (0.0, None)
    """
    area = _number(coat_area, "coated area × coats")
    r = _number(rate, "application rate", zero=False)
    hours = area / r
    cost = None if labour_rate is None else hours * _number(labour_rate, "labour rate")
    return Labour(hours, cost, "hours = area × coats / rate per m² per coat")


# --------------------------------------------------------------------------- what people type

_NUMBER = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?"


def parse_volume_litres(text: str, option: Optional[str] = None) -> float:
    """A volume with its unit (``"20 L"``, ``"1 US_gal"``, ``"500 mL"``), in litres.

    A bare number is refused: the unit is never guessed.

    >>> parse_volume_litres("500 mL"), round(parse_volume_litres("1 US_gal"), 9)
    (0.5, 3.785411784)
    >>> parse_volume_litres("20", option="--minimum-mix")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --minimum-mix: '20' has no unit; write it like '20 L'
    """
    from revolve import units

    try:
        return units.parse_quantity(str(text), "volume") * 1000.0
    except RevolveError as e:
        raise e.located(option=option) if option else e


def parse_packs(text: Any, option: Optional[str] = None) -> Tuple[Pack, ...]:
    """Pack sizes as a shop lists them: ``"20 L, 5 L, 1 L"``, each with an optional
    price after ``@``: ``"20 L @ 120, 5 L @ 40 EUR"``.

    A list of :class:`Pack` passes through; a list of texts is read as one.

    >>> parse_packs("20 L @ 120, 5 L @ 40 EUR, 500 mL")
    (Pack(size=20.0, price=120.0), Pack(size=5.0, price=40.0), Pack(size=0.5, price=None))
    >>> parse_packs("5 L @ 40 EUR, 1 L @ 10 USD")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: pack prices: the prices name different currencies (EUR, USD); give one currency
    >>> parse_packs("5 L, 5 L", option="--packs")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --packs: the pack size 5 L is listed twice
    """
    from revolve.inputs import parse_list, parse_money

    if isinstance(text, (list, tuple)) and text and all(isinstance(p, Pack) for p in text):
        return tuple(text)
    if isinstance(text, (list, tuple)):         # ["20 L @ 120", "5 L"]: each with its unit
        text = ", ".join(str(v) for v in text)
    currencies = set()

    def one(item: str) -> Pack:
        size_text, _, price_text = item.partition("@")
        litres = parse_volume_litres(size_text.strip())
        price = None
        if price_text.strip():
            money = parse_money(price_text.strip())
            price = money.amount
            if money.currency:
                currencies.add(money.currency)
        return Pack(litres, price, label=_volume_label(size_text))

    try:
        found = tuple(parse_list(str(text), one, "pack size"))
        if len(currencies) > 1:
            raise RevolveError(f"the prices name different currencies "
                               f"({', '.join(sorted(currencies))}); give one currency",
                               place="pack prices")
        sizes = [round(p.size, 9) for p in found]
        for p in found:
            if sizes.count(round(p.size, 9)) > 1:
                raise RevolveError(f"the pack size {p.label or p.size} is listed twice")
    except RevolveError as e:
        raise e.located(option=option) if option else e
    return found


def _volume_label(text: str) -> str:
    """A pack size as an order line shows it: the number as written, the unit's display name.

    >>> _volume_label(" 1  US_gal"), _volume_label("500 ml"), _volume_label("20L")
    ('1 US gal', '500 mL', '20 L')
    """
    from revolve import units

    m = re.fullmatch(rf"\s*({_NUMBER})\s*(.+?)\s*", text)
    if m is None:
        return re.sub(r"\s+", " ", text.strip())
    try:
        return f"{m.group(1)} {units.canonical(m.group(2), 'volume')}"
    except RevolveError:
        return f"{m.group(1)} {m.group(2)}"


def pack_currency(text: Any) -> Optional[str]:
    """The currency code written with the pack prices, if any.

    >>> pack_currency("5 L @ 40 EUR, 1 L @ 12"), pack_currency("5 L")
    ('EUR', None)
    """
    found = re.findall(r"@\s*(?:([A-Za-z]{3})\s*)?[\d.]+\s*([A-Za-z]{3})?", str(text)) \
        if isinstance(text, str) else []
    codes = {(a or b).upper() for a, b in found if a or b}
    return codes.pop() if len(codes) == 1 else None


def parse_ratio(text: Any, option: Optional[str] = None) -> Tuple[float, float]:
    """A mixing ratio by volume, base to hardener: ``"4:1"`` (or a pair of numbers).

    >>> parse_ratio("4:1"), parse_ratio("3 : 1.5"), parse_ratio([2, 1])
    ((4.0, 1.0), (3.0, 1.5), (2.0, 1.0))
    >>> parse_ratio("4", option="--mix-ratio")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --mix-ratio: '4' is not a mixing ratio; write base to hardener by volume, such as '4:1'
    """
    from revolve.errors import quoted

    if isinstance(text, (list, tuple)) and len(text) == 2:
        values = text
    else:
        m = re.fullmatch(rf"\s*({_NUMBER})\s*:\s*({_NUMBER})\s*", str(text)) \
            if len(str(text)) <= 60 else None
        if m is None:
            raise RevolveError(f"{quoted(str(text))} is not a mixing ratio; write base to "
                               "hardener by volume, such as '4:1'", option=option)
        values = (float(m.group(1)), float(m.group(2)))
    out = []
    for v in values:
        try:
            out.append(_number(v, "mixing ratio", zero=False))
        except RevolveError:
            raise RevolveError(f"both parts of the mixing ratio must be above 0, got {text!r}",
                               option=option) from None
    return out[0], out[1]


def parse_rate(text: Any, top: str, bottom: str, option: Optional[str] = None, *,
               example: str = "", invert: bool = False) -> float:
    """A rate ``"<number> <unit of top>/<unit of bottom>"`` in SI (``"25 kg/m^2"``).

    ``top`` and ``bottom`` are unit kinds of :mod:`revolve.units`; with
    ``invert`` the rate may also be written the other way up (``"5 min/m^2"``
    for an application rate in m²/h) and is turned over. A bare number is
    refused.

    >>> parse_rate("25 kg/m^2", "mass", "area"), round(parse_rate("5 lb/ft^2", "mass", "area"), 6)
    (25.0, 24.412138)
    >>> parse_rate("12 m^2/h", "area", "time") * 3600, parse_rate("5 min/m^2", "area", "time", invert=True) * 3600
    (12.0, 12.0)
    >>> parse_rate("25", "mass", "area", "--abrasive", example="25 kg/m^2")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --abrasive: '25' needs its unit, such as '25 kg/m^2'
    """
    from revolve import units
    from revolve.errors import quoted

    raw = str(text).strip()
    m = re.fullmatch(rf"({_NUMBER})\s*([^/]+?)\s*/\s*(.+)", raw) if len(raw) <= 80 else None
    if m is None:
        raise RevolveError(f"{quoted(raw)} needs its unit, such as '{example}'", option=option)
    number = float(m.group(1))
    num, den = m.group(2), m.group(3)
    try:
        try:
            value = number * units.factor(num, top) / units.factor(den, bottom)
        except RevolveError:
            if not invert:
                raise
            per = number * units.factor(num, bottom) / units.factor(den, top)
            if per <= 0:
                raise RevolveError(f"{quoted(raw)} must be above 0")
            value = 1.0 / per
    except RevolveError as e:
        raise RevolveError(f"{quoted(raw)}: {e.message}; "
                           f"write it like '{example}'", option=option) from None
    if not (math.isfinite(value) and value > 0):
        raise RevolveError(f"{quoted(raw)} must be a finite rate above 0", option=option)
    return value
