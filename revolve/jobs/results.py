"""Result objects of every job: fields that know their kind of quantity, and the units to show them in.

A job returns a :class:`Result`: its inputs (plain JSON-ready values), its
tables (:class:`Table`, rows of values in SI units: metre, m², m³, kg, kg/m³,
second; money in its currency; counts and texts as they are), the notes and
the cautions that apply, and the :class:`OutputUnits` chosen for it. Each
field of a table names a **role** (``length``, ``level``, ``film``, ``area``,
``capacity``, ``volume``, ``mass``, ``density``, ``time``, ``money``, or a
ratio of two roles such as ``area/capacity`` for a spreading rate, or a
product such as ``mass·length²`` for a moment of inertia); the
output units say which unit each role is shown in, so one renderer
(:mod:`revolve.render.output`) makes the human tables, the CSV and the JSON
of every command, and every conversion goes through :mod:`revolve.units`.

:meth:`Result.to_dict` is the JSON a command prints with ``--json``: one
object, with ``command``, ``inputs``, ``units`` (each role used, once), each
table under its key (a list of rows, or one object for a table of figures),
``notes`` and ``cautions`` — the metadata once, the rows in a list.

Units by trade (:func:`trade_units`, stated in the README): parts are shown
in the drawing's unit (its square and cube) and kg; vessel and level-table
capacities in litres, their areas in m²; coating areas in m², paint in
litres, films in µm; turning in mm, cm², cm³ and kg. An inch or foot drawing
gets the inch-pound counterparts (US gallons, ft², mil, lb). Every default
can be overridden by the command's unit options.

Examples
--------
>>> u = trade_units("vessel", "mm")
>>> u.unit("capacity"), u.unit("area"), u.unit("length"), u.unit("area/capacity")
('L', 'm²', 'mm', 'm²/L')
>>> round(u.show(2.0943951024, "capacity"), 6)          # m³ -> L
2094.395102
>>> trade_units("vessel", "in").unit("capacity")
'US gal'
>>> t = Table("levels", "Levels", (Field("level", "level", "level"),
...                                Field("volume", "volume", "capacity")),
...           ({"level": 0.5, "volume": 0.25},))
>>> r = Result("levels", u, {"profile": "tank.toml"}, (t,), cautions=("vessel",))
>>> r.to_dict()["levels"], r.to_dict()["units"]
([{'level': 500.0, 'volume': 250.0}], {'level': 'mm', 'capacity': 'L'})
"""

from __future__ import annotations

from dataclasses import dataclass, field as dc_field, replace
from fractions import Fraction
from typing import Any, Dict, Iterable, Mapping, Optional, Tuple

from revolve.errors import RevolveError, UnitError

__all__ = ["CAUTIONS", "ROLES", "OutputUnits", "trade_units", "Field", "Table", "Result", "IMPERIAL_LENGTHS"]

#: The caution texts, by kind, printed (and put in JSON) where they apply.
CAUTIONS = {
    "lifting": "Mass and centre of mass are estimates from nominal geometry. Rigging and lifts "
               "are planned by a competent person under local rules.",
    "vessel": "Capacity and level tables are geometry only. Wall and head thickness for "
              "pressure, supports and nozzles are for the applicable code and a licensed "
              "engineer; tables for custody transfer need certified calibration.",
    "coating": "Quantities are estimates. Follow the coating's data sheet; ventilation, fire and "
               "confined-space rules apply to work inside vessels; respect local rules on emissions.",
    "turning": "Times and costs are estimates; cutting data comes from the tool supplier. Guard "
               "rotating stock and respect the machine's speed limit for the part's size and balance.",
    "rotating": "A part spun fast stores energy: balance and speed limits are for the machine "
                "maker's data and local rules.",
}

#: The kind of quantity (as :mod:`revolve.units` knows it) behind each role.
ROLES = {
    "length": "length", "level": "length", "film": "length", "diameter": "length",
    "area": "area", "section": "area", "coverage": "area",
    "volume": "volume", "capacity": "volume", "paint": "volume",
    "mass": "mass", "density": "density", "time": "time",
    # the distance in a cutting speed (m/min, ft/min): "cutting_distance/time"
    "cutting_distance": "length",
}

#: Length units after which a drawing is taken as inch-pound work.
IMPERIAL_LENGTHS = frozenset({"in", "ft", "yd", "mil"})

# Trade defaults: (metric, inch-pound); "{u}" is the drawing's length unit.
_TRADES = {
    "part": ({"length": "{u}", "level": "{u}", "diameter": "{u}", "area": "{u}²", "section": "{u}²",
              "volume": "{u}³", "capacity": "{u}³", "mass": "kg", "density": "kg/m³"},
             {"length": "{u}", "level": "{u}", "diameter": "{u}", "area": "{u}²", "section": "{u}²",
              "volume": "{u}³", "capacity": "{u}³", "mass": "lb", "density": "lb/ft³"}),
    "vessel": ({"length": "{u}", "level": "{u}", "diameter": "{u}", "area": "m²", "section": "{u}²",
                "volume": "L", "capacity": "L", "mass": "kg", "density": "kg/m³"},
               {"length": "{u}", "level": "{u}", "diameter": "{u}", "area": "ft²", "section": "{u}²",
                "volume": "US gal", "capacity": "US gal", "mass": "lb", "density": "lb/ft³"}),
    "coating": ({"length": "{u}", "area": "m²", "coverage": "m²", "paint": "L", "capacity": "L",
                 "film": "µm", "mass": "kg"},
                {"length": "{u}", "area": "ft²", "coverage": "ft²", "paint": "US gal",
                 "capacity": "US gal", "film": "mil", "mass": "lb"}),
    "turning": ({"length": "mm", "diameter": "mm", "area": "cm²", "section": "cm²", "volume": "cm³",
                 "mass": "kg", "density": "kg/m³", "time": "min", "cutting_distance": "m"},
                {"length": "in", "diameter": "in", "area": "in²", "section": "in²", "volume": "in³",
                 "mass": "lb", "density": "lb/ft³", "time": "min", "cutting_distance": "ft"}),
}


@dataclass(frozen=True)
class OutputUnits:
    """The unit each role is shown in, and the factor that turns an SI value into it.

    ``units`` maps a role to ``(display, factor)`` where ``display`` is the
    unit's display spelling (``m²``, ``US gal``) and ``shown = si / factor``.
    ``currency`` is the money role's display (no conversion is ever made
    between currencies). Build one with :meth:`of` or :func:`trade_units`.

    Examples
    --------
    >>> u = OutputUnits.of({"length": "in", "capacity": "US_gal"})
    >>> u.unit("length"), round(u.show(0.0254, "length"), 12), u.unit("capacity")
    ('in', 1.0, 'US gal')
    >>> OutputUnits.of({"length": "kg"})
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: 'kg' is a mass unit, not a length unit
    >>> OutputUnits.of({"capacity": "gallon"}, options={"capacity": "--volume-unit"})
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --volume-unit: 'gallon' is ambiguous: write 'US_gallon' (231 in³) or 'imperial_gallon' (4.54609 L)
    """

    units: Mapping[str, Tuple[str, float]]
    currency: Optional[str] = None

    @classmethod
    def of(cls, names: Mapping[str, Optional[str]], *, currency: Optional[str] = None,
           options: Optional[Mapping[str, str]] = None) -> "OutputUnits":
        """Units from role -> unit text; a refused unit names its option (``options[role]``)."""
        from revolve import units as registry

        out: Dict[str, Tuple[str, float]] = {}
        for role, text in names.items():
            if text is None:
                continue
            kind = ROLES.get(role)
            if kind is None:
                raise ValueError(f"unknown role {role!r}")
            try:
                out[role] = (registry.canonical(text, kind), registry.factor(text, kind))
            except UnitError as e:
                option = (options or {}).get(role)
                raise e.located(option=option) if option else e
        return cls(out, currency)

    def with_units(self, names: Mapping[str, Optional[str]], *,
                   options: Optional[Mapping[str, str]] = None) -> "OutputUnits":
        """A copy with some roles given other units (None leaves a role as it is)."""
        given = OutputUnits.of(names, options=options)
        return replace(self, units={**self.units, **given.units})

    def with_currency(self, currency: Optional[str]) -> "OutputUnits":
        return replace(self, currency=currency)

    def _pair(self, role: str) -> Tuple[str, float]:
        if "·" in role:            # a product such as "mass·length²" (moment of inertia)
            shown, factor = [], 1.0
            for part in role.split("·"):
                power = 2 if part.endswith("²") else 1
                a, fa = self._pair(part.rstrip("²"))
                shown.append(a + ("²" if power == 2 else ""))
                factor *= fa ** power
            return "·".join(shown), factor
        if "/" in role:
            top, bottom = role.split("/", 1)
            (a, fa), (b, fb) = self._pair(top), self._pair(bottom)
            return (f"{a}/{b}" if a else f"per {b}"), fa / fb
        if role == "money":
            return (self.currency or ""), 1.0
        try:
            return self.units[role]
        except KeyError:
            raise RevolveError(f"no output unit chosen for {role}") from None

    def __getitem__(self, role: str) -> str:
        """``units["volume"]``: the same as :meth:`unit` (results read like a mapping)."""
        return self.unit(role)

    def unit(self, role: Optional[str]) -> str:
        """The display spelling of the unit of ``role`` ('' for a role-less field)."""
        return "" if role is None else self._pair(role)[0]

    def exact(self, role: str) -> Optional[Fraction]:
        """The exact factor of ``role``'s unit (a Fraction), or None when it has none.

        >>> OutputUnits.of({"film": "mil", "paint": "US gal"}).exact("film")
        Fraction(127, 5000000)
        >>> OutputUnits.of({"paint": "L"}).exact("money/paint")
        Fraction(1000, 1)
        """
        from revolve import units as registry

        if "/" in role:
            top, bottom = role.split("/", 1)
            a, b = self.exact(top), self.exact(bottom)
            return None if a is None or b is None else a / b
        if role == "money":
            return Fraction(1)
        display = self.units.get(role, (None,))[0]
        return None if display is None else registry.exact_factor(display, ROLES[role])

    def show(self, value: Any, role: Optional[str]) -> Any:
        """``value`` (SI) in the unit of ``role``; non-numbers (None, text) pass through.

        A Fraction is converted exactly where the unit has an exact factor, so
        a film the user gave as 1 mil reads back 1.0, not 0.9999999999999999.

        >>> OutputUnits.of({"film": "mil"}).show(Fraction(254, 10**7), "film")
        1.0
        """
        if role is None or value is None or isinstance(value, (str, bool)):
            return value
        if isinstance(value, (list, tuple)):
            return [self.show(v, role) for v in value]
        if isinstance(value, Fraction):
            exact = self.exact(role)
            if exact is not None:
                return float(value / exact)
        return float(value) / self._pair(role)[1]

    def read(self, value: float, role: str) -> float:
        """The inverse of :meth:`show`: a value in the role's unit, in SI."""
        return float(value) * self._pair(role)[1]

    def roles(self) -> Dict[str, str]:
        """Every role with its unit, for the JSON ``units`` object."""
        out = {r: d for r, (d, _) in self.units.items()}
        if self.currency:
            out["money"] = self.currency
        return out


def trade_units(trade: str, profile_unit: str, overrides: Optional[Mapping[str, Optional[str]]] = None,
                *, options: Optional[Mapping[str, str]] = None,
                currency: Optional[str] = None) -> OutputUnits:
    """The default units of a trade for a drawing in ``profile_unit``, with the user's overrides.

    ``trade`` is ``part`` (measure, mesh, picture), ``vessel`` (vessel and
    level tables), ``coating`` or ``turning``. An inch, foot, yard or mil
    drawing takes the inch-pound column.

    >>> trade_units("part", "cm").unit("volume"), trade_units("part", "in").unit("mass")
    ('cm³', 'lb')
    >>> trade_units("coating", "ft").unit("film"), trade_units("coating", "mm").unit("area/paint")
    ('mil', 'm²/L')
    >>> trade_units("vessel", "mm", {"capacity": "m3"}).unit("capacity")
    'm³'
    """
    from revolve import units as registry

    metric, imperial = _TRADES[trade]
    shown = registry.canonical(profile_unit, "length")
    table = imperial if shown in IMPERIAL_LENGTHS else metric
    names = {role: text.replace("{u}", shown) for role, text in table.items()}
    base = OutputUnits.of(names, currency=currency)
    if overrides:
        base = base.with_units(overrides, options=options)
    return base


@dataclass(frozen=True)
class Field:
    """One column of a table (or one line of a table of figures).

    ``role`` names the unit role (see :data:`ROLES`; a ratio ``a/b`` too) or
    is None for a count, a text or a flag; ``style`` is ``number``,
    ``money``, ``percent``, ``text`` or ``count``; ``digits`` overrides the
    table's significant figures for this field.
    """

    key: str
    label: str
    role: Optional[str] = None
    style: str = "number"
    digits: Optional[int] = None


@dataclass(frozen=True)
class Table:
    """A titled table of rows (values in SI), shown as rows or, with ``figures``, as label-value lines.

    ``figures=True`` means one record shown one field per line (quantity,
    value, unit) and written to JSON as one object; otherwise every record is
    a row and the JSON holds a list.
    """

    key: str
    title: str
    fields: Tuple[Field, ...]
    rows: Tuple[Mapping[str, Any], ...]
    figures: bool = False

    def json(self, units: OutputUnits) -> Any:
        """The rows in ``units``, at full precision (a list, or one object for figures)."""
        out = [{f.key: units.show(row.get(f.key), f.role) for f in self.fields if f.key in row}
               for row in self.rows]
        if self.figures:
            return out[0] if out else {}
        return out


@dataclass(frozen=True)
class Result:
    """What a job gives: inputs, tables, notes and cautions, with the units to show them in."""

    command: str
    units: OutputUnits
    inputs: Mapping[str, Any]
    tables: Tuple[Table, ...]
    notes: Tuple[str, ...] = ()
    cautions: Tuple[str, ...] = ()
    extra: Mapping[str, Any] = dc_field(default_factory=dict)

    def table(self, key: str) -> Table:
        for t in self.tables:
            if t.key == key:
                return t
        raise KeyError(key)

    def roles_used(self) -> Dict[str, str]:
        used: Dict[str, str] = {}
        for t in self.tables:
            for f in t.fields:
                if f.role is not None and f.role not in used and any(f.key in r for r in t.rows):
                    used[f.role] = self.units.unit(f.role)
        return used

    def __repr__(self) -> str:
        parts = []
        for t in self.tables:
            parts.append(f"{t.key}: {len(t.fields)} figures" if t.figures else
                         f"{t.key}: {len(t.rows)} rows")
        return f"<{type(self).__name__} {self.command}: {', '.join(parts)}>"

    def _repr_html_(self) -> str:
        """Tables for a notebook (the same figures and units as the terminal's)."""
        from revolve.render.output import html      # the renderer, loaded only when shown

        return html(self)

    def to_dict(self) -> Dict[str, Any]:
        """The command's ``--json`` object: metadata once, then each table under its key."""
        out: Dict[str, Any] = {"command": self.command, "inputs": dict(self.inputs),
                               "units": self.roles_used()}
        out.update(self.extra)
        for t in self.tables:
            out[t.key] = t.json(self.units)
        out["notes"] = list(self.notes)
        out["cautions"] = [CAUTIONS.get(c, c) for c in self.cautions]
        return out


def rows_of(records: Iterable[Mapping[str, Any]]) -> Tuple[Dict[str, Any], ...]:
    """Rows as an immutable tuple of plain dicts (a helper for jobs building tables)."""
    return tuple(dict(r) for r in records)
