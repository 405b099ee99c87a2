"""Materials: densities from the package's table, found by name or alias.

The table is ``revolve/data/materials.toml``; every row carries its source
(shown to users) and may carry a note on how the figure was taken ("from
memory"), kept for the tests only.
Names are matched ignoring case, spaces and punctuation, so ``"Stainless
304"``, ``"stainless-304"`` and ``"STAINLESS_304"`` are the same material.
A density can also be given directly as text with a unit
(:func:`density_from_text`). Neither needs pint for the usual cases.
The density options of every command and the library's ``density``
arguments go through :func:`parse_density`, :func:`density_value`,
:func:`material_or_density` and :func:`file_density`: always kg/m³; a bare
number is kg/m³ (:data:`BARE_DENSITY_UNIT`), text and pint quantities carry
their unit.

Densities are nominal figures at room temperature: real alloys vary by grade
and condition, so masses computed from them are estimates. For a lift, the
rigging is planned by a competent person under local rules.

Examples
--------
>>> steel = find_material("Mild Steel")
>>> steel.key, steel.density, steel.group
('carbon_steel', 7850.0, 'steel')
>>> find_material("aluminum").name
'Aluminium (pure)'
>>> density_from_text("7.85 g/cm^3")
7850.0
"""

from __future__ import annotations

import math
import numbers
import re
from dataclasses import dataclass
from functools import lru_cache
from typing import Any, Mapping, Optional

from revolve.errors import MaterialError, RevolveError, UnitError, quoted
from revolve.units import parse_quantity

__all__ = ["BARE_DENSITY_UNIT", "GROUPS", "Material", "MaterialError", "density_from_text",
           "density_value", "file_density", "find_material", "load_materials",
           "material_or_density", "parse_density", "parse_materials"]

#: Material groups; each selects a set of turning cutting data.
GROUPS = ("steel", "stainless", "cast iron", "aluminium", "copper alloy",
          "titanium", "plastic", "liquid", "other")

_FILE = "materials.toml"
_FIELDS = ("key", "name", "aliases", "density_kg_m3", "group", "source")
_OPTIONAL = ("note",)
_KEY = re.compile(r"[a-z][a-z0-9_]*\Z")


@dataclass(frozen=True)
class Material:
    """One material of the table.

    Attributes
    ----------
    key : str
        Plain identifier, e.g. ``"carbon_steel"``.
    name : str
        Display name.
    density : float
        Density in kg/m³.
    group : str
        One of :data:`GROUPS`.
    source : str
        Where the density comes from, as users read it (a handbook's title,
        or "common practice, no source").
    aliases : tuple of str
        Other names that find this material.
    note : str
        How the figure was taken (e.g. "from memory"), for the tests that
        check the table against its references; never shown to users.

    Examples
    --------
    >>> m = Material("test", "Test", 1000.0, "liquid", "invented, demo only")
    >>> m.density
    1000.0
    >>> m.density = 2.0
    Traceback (most recent call last):
    ...
    dataclasses.FrozenInstanceError: cannot assign to field 'density'
    """

    key: str
    name: str
    density: float
    group: str
    source: str
    aliases: tuple[str, ...] = ()
    note: str = ""

    @property
    def reference(self) -> str:
        """The source with its note, as the tests name it: ``"CRC Handbook … (from memory)"``.

        >>> Material("w", "W", 998.2, "liquid", "CRC Handbook", note="from memory").reference
        'CRC Handbook (from memory)'
        >>> Material("s", "S", 7850.0, "steel", "common practice, no source").reference
        'common practice, no source'
        """
        return f"{self.source} ({self.note})" if self.note else self.source


def _normal(name: str) -> str:
    """Folded form for matching: lower case, letters and digits only.

    >>> _normal(" Stainless-Steel 304 ")
    'stainlesssteel304'
    >>> _normal("Water, 20 °C")
    'water20c'
    """
    import unicodedata

    text = unicodedata.normalize("NFKD", name).casefold()
    return "".join(ch for ch in text if ch.isalnum())


def _row(raw: Any, number: int, file: str) -> Material:
    """Check one ``[[material]]`` table and build its Material."""
    place = f"material {number}"
    if not isinstance(raw, dict):
        raise MaterialError("each material must be a table", file=file,
                            place=place)
    if isinstance(raw.get("key"), str):
        place += f" ({raw['key']})"
    unknown = sorted(set(raw) - set(_FIELDS) - set(_OPTIONAL))
    missing = [f for f in _FIELDS if f not in raw]
    if unknown or missing:
        what = ([f"unknown field(s) {', '.join(unknown)}"] if unknown else []) + \
               ([f"missing field(s) {', '.join(missing)}"] if missing else [])
        raise MaterialError("; ".join(what), file=file, place=place)
    key, name, aliases = raw["key"], raw["name"], raw["aliases"]
    density, group, source = raw["density_kg_m3"], raw["group"], raw["source"]
    if not isinstance(key, str) or not _KEY.match(key):
        raise MaterialError("key must be lower-case letters, digits and '_'",
                            file=file, place=place)
    note = raw.get("note", "")
    checked = (("name", name), ("source", source)) + ((("note", note),) if "note" in raw else ())
    for field, value in checked:
        if not isinstance(value, str) or not value.strip():
            raise MaterialError(f"{field} must be non-empty text", file=file,
                                place=place)
    if (not isinstance(aliases, list)
            or not all(isinstance(a, str) and _normal(a) for a in aliases)):
        raise MaterialError("aliases must be a list of names", file=file,
                            place=place)
    if (isinstance(density, bool) or not isinstance(density, (int, float))
            or not math.isfinite(density) or density <= 0):
        raise MaterialError(f"density_kg_m3 must be a positive number, not "
                            f"{density!r}", file=file, place=place)
    if group not in GROUPS:
        raise MaterialError(f"group must be one of {', '.join(GROUPS)}, not "
                            f"{group!r}", file=file, place=place)
    return Material(key, name, float(density), group, source, tuple(aliases), note)


def parse_materials(text: str, file: str = _FILE) -> tuple[Material, ...]:
    """Read and check a material table in the format of ``materials.toml``.

    Parameters
    ----------
    text : str
        TOML text with one ``[[material]]`` table per material.
    file : str, optional
        File name for error messages.

    Returns
    -------
    tuple of Material
        In file order.

    Raises
    ------
    MaterialError
        On bad TOML, a missing or unknown field, a bad value, or a name that
        would find two different materials.

    Examples
    --------
    >>> rows = parse_materials('''
    ... [[material]]
    ... key = "oil"
    ... name = "Demo oil"
    ... aliases = ["test oil"]
    ... density_kg_m3 = 870
    ... group = "liquid"
    ... source = "invented, demo only"
    ... ''')
    >>> rows[0].density, rows[0].aliases
    (870.0, ('test oil',))
    >>> parse_materials('[[material]]\\nkey = "x"', file="extra.toml")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: extra.toml: material 1 (x): missing field(s) name, aliases, density_kg_m3, group, source
    """
    from revolve.datafiles import toml

    tomllib = toml()

    try:
        document = tomllib.loads(text)
    except tomllib.TOMLDecodeError as exc:
        raise MaterialError(f"not valid TOML: {exc}", file=file) from None
    extra = sorted(set(document) - {"material"})
    if extra:
        raise MaterialError(f"unknown top-level key(s) {', '.join(extra)}; "
                            f"only [[material]] tables belong here", file=file)
    rows = document.get("material", [])
    if not isinstance(rows, list):
        raise MaterialError("'material' must be an array of tables: write "
                            "[[material]]", file=file)
    materials = tuple(_row(raw, i, file) for i, raw in enumerate(rows, 1))
    owner: dict[str, Material] = {}
    for material in materials:
        for name in (material.key, material.name) + material.aliases:
            other = owner.setdefault(_normal(name), material)
            if other is not material:
                raise MaterialError(
                    f"the name '{name}' would find both '{other.key}' and "
                    f"'{material.key}'", file=file,
                    place=f"material {materials.index(material) + 1} "
                          f"({material.key})")
    return materials


@lru_cache(maxsize=None)
def load_materials() -> tuple[Material, ...]:
    """Return the package's material table (read once, then cached).

    Returns
    -------
    tuple of Material
        In file order.

    Examples
    --------
    >>> table = load_materials()
    >>> table is load_materials()
    True
    >>> [m.key for m in table][:3]
    ['water', 'aluminium', 'copper']
    """
    from revolve.datafiles import bundled_text

    return parse_materials(bundled_text(_FILE), file=_FILE)


@lru_cache(maxsize=None)
def _index() -> Mapping[str, Material]:
    from types import MappingProxyType

    index: dict[str, Material] = {}
    for material in load_materials():
        for name in (material.key, material.name) + material.aliases:
            index[_normal(name)] = material
    return MappingProxyType(index)


def find_material(name: str) -> Material:
    """Find a material by key, display name or alias.

    Case, spaces and punctuation are ignored.

    Parameters
    ----------
    name : str
        E.g. ``"carbon_steel"``, ``"Stainless 316"``, ``"PA6"``.

    Returns
    -------
    Material

    Raises
    ------
    MaterialError
        If no material has that name; close names are suggested.

    Examples
    --------
    >>> find_material("STAINLESS-316").density
    7980.0
    >>> find_material("pa 6").key
    'nylon_pa6'
    >>> find_material("brsas")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: unknown material 'brsas'; did you mean 'brass'?
    >>> find_material("   ")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: no material name given
    """
    if not isinstance(name, str):
        raise MaterialError(f"a material name must be text, not "
                            f"{type(name).__name__}")
    folded = _normal(name)
    if not folded:
        raise MaterialError("no material name given")
    index = _index()
    if folded in index:
        return index[folded]
    raise MaterialError(f"unknown material '{name.strip()}'"
                        + _suggestion(folded, index))


def _suggestion(folded: str, index: Mapping[str, Material]) -> str:
    import difflib

    close = difflib.get_close_matches(folded, list(index), n=6, cutoff=0.6)
    keys: list[str] = []
    for match in close:
        if index[match].key not in keys:
            keys.append(index[match].key)
    if keys:
        return "; did you mean " + " or ".join(f"'{k}'" for k in keys[:3]) + "?"
    return ("; known materials: " + ", ".join(m.key for m in load_materials())
            + "; or give a density such as '7850 kg/m^3'")


def density_from_text(text: str, default_unit: Optional[str] = None) -> float:
    """Read a density with its unit, such as ``"7.85 g/cm^3"``, into kg/m³.

    Parameters
    ----------
    text : str
        A positive number and a density unit.
    default_unit : str, optional
        Unit for a bare number; without it a bare number is an error,
        because 7.85 and 7850 are both plausible steel densities.

    Returns
    -------
    float
        Density in kg/m³.

    Raises
    ------
    UnitError
        If the text is not a density.
    MaterialError
        If the density is not positive.

    Examples
    --------
    >>> density_from_text("7850 kg/m3")
    7850.0
    >>> round(density_from_text("0.0975 lb/in^3"), 1)
    2698.8
    >>> density_from_text("1.14", default_unit="g/cm^3")
    1140.0
    >>> density_from_text("0 kg/m^3")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: a density must be positive, not '0 kg/m^3'
    """
    value = parse_quantity(text, "density", default_unit=default_unit)
    if not value > 0.0:
        raise MaterialError(f"a density must be positive, not '{text.strip()}'")
    return value


#: The unit of a density option given as a bare number (``--density 7850``), as the help says.
BARE_DENSITY_UNIT = "kg/m^3"


def parse_density(text: str, option: Optional[str] = None) -> float:
    """A density option in kg/m³: a number with a unit, or a bare number in kg/m³.

    This is the one reader of density options (``--density``,
    ``--liquid-density``) for every command; errors name ``option``.

    >>> parse_density("7850"), parse_density("7.85 g/cm^3"), round(parse_density("0.284 lb/in^3"))
    (7850.0, 7850.0, 7861)
    >>> parse_density("-850", "--liquid-density")
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: --liquid-density: a density must be positive, not '-850'
    >>> parse_density("7850 kg", "--density")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --density: 'kg' is a mass unit, not a density unit
    """
    try:
        return density_from_text(text, default_unit=BARE_DENSITY_UNIT)
    except RevolveError as e:
        raise e.located(option=option)


def material_or_density(material: Optional[str], density: Optional[str], *,
                        material_option: str = "--material", density_option: str = "--density"):
    """``(density in kg/m³, label, material key)`` from a material option or a density option.

    ``(None, None, None)`` when neither is given; the key is None for a
    density. Errors name the option.

    >>> material_or_density("water", None)[0], material_or_density(None, "850")[:2]
    (998.2, (850.0, '850 kg/m³ (given)'))
    >>> material_or_density("Stahl", None)  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: --material: unknown material 'Stahl'...
    >>> material_or_density("water", "1000", material_option="--liquid",
    ...                     density_option="--liquid-density")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --liquid-density: give either --liquid or --liquid-density, not both
    """
    if material is not None and density is not None:
        raise RevolveError(f"give either {material_option} or {density_option}, not both",
                           option=density_option)
    if material is not None:
        try:
            m = find_material(material)
        except RevolveError as e:
            raise e.located(option=material_option)
        return m.density, f"{m.name}, {m.density:g} kg/m³ ({m.source})", m.key
    if density is not None:
        d = parse_density(density, density_option)
        return d, f"{d:g} kg/m³ (given)", None
    return None, None, None


def file_density(doc):
    """Density in kg/m³ and a label from a document's ``material`` or ``density``; else Nones.

    Examples
    --------
    >>> from types import SimpleNamespace
    >>> file_density(SimpleNamespace(material=None, density=None))
    (None, None)
    >>> file_density(SimpleNamespace(material=None, density="1000 kg/m^3", file="t.toml",
    ...                              line_of=lambda key: 3))
    (1000.0, '1000 kg/m³ (from the file)')
    """
    if doc.material:
        try:
            m = find_material(doc.material)
        except RevolveError as e:
            raise e.located(file=doc.file, line=doc.line_of("material"), place="material")
        return m.density, f"{m.name}, {m.density:g} kg/m³ ({m.source})"
    if doc.density:
        try:
            d = density_from_text(doc.density)
        except RevolveError as e:
            raise e.located(file=doc.file, line=doc.line_of("density"), place="density")
        return d, f"{d:g} kg/m³ (from the file)"
    return None, None


def density_value(density: Any, option: Optional[str] = "density"):
    """``(density in kg/m³, label)`` from text with a unit, a pint quantity or a bare number.

    A bare number is kg/m³ (:data:`BARE_DENSITY_UNIT`, as ``--density 7850``
    on the command line); text and quantities carry their own unit, never a
    unit guessed from the profile. None gives ``(None, None)``. Errors are
    the command line's, naming ``option``.

    Examples
    --------
    >>> density_value("7.85 g/cm^3"), density_value(7850)
    ((7850.0, '7850 kg/m³ (given)'), (7850.0, '7850 kg/m³ (given)'))
    >>> density_value(None)
    (None, None)
    >>> density_value("heavy")                       # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: density: ...
    >>> density_value(0)
    Traceback (most recent call last):
    ...
    revolve.errors.MaterialError: density: a density must be positive, not '0.0'
    >>> density_value(True)
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: density: give a density such as "7850 kg/m^3" or a number in kg/m³, got True
    """
    if density is None:
        return None, None
    if isinstance(density, str):
        d = parse_density(density, option)
    elif isinstance(density, numbers.Real) and not isinstance(density, bool):
        d = parse_density(repr(float(density)), option)
    elif hasattr(density, "to") and hasattr(density, "magnitude"):   # a pint quantity
        try:
            value = float(density.to("kg/m**3").magnitude)
        except Exception:  # pint's DimensionalityError (pint is the caller's, not imported here)
            raise UnitError(f"{quoted(str(density))} is not a density; give a mass per volume "
                            "such as 7850 kg/m^3", option=option) from None
        d = parse_density(repr(value), option)
    else:
        raise UnitError(f'give a density such as "7850 kg/m^3" or a number in kg/m³, '
                        f"got {density!r}", option=option)
    return d, f"{d:g} kg/m³ (given)"
