"""What calibration adds to a level table: tilt, gauge datum, deadwood, temperature, uncertainty.

:func:`revolve.jobs.levels.level_table` builds every table; this module holds
the parts it uses when a table is a gauge table (no printing, no files
written):

* :class:`Gauge`: volumes against the level read at a gauge point, level or
  tilted (:mod:`revolve.geometry.tilted`), forward, inverse and the
  independent cross-check;
* readers of what a user types: temperatures with their unit
  (:func:`parse_temperature`), expansion coefficients (:func:`parse_expansion`);
* :func:`read_deadwood`: the small TOML list of deadwood items and fittings;
* :func:`read_uncertainty` and :func:`uncertainty_model`: the dimensions of a
  vessel built by ``revolve vessel`` with their tolerances, and the model the
  GUM combination differentiates (:func:`revolve.jobs.gauging.combined_uncertainty`).

The level of a table
--------------------
A table's level is the plumb height of the liquid surface above the gauge
point (:mod:`revolve.geometry.tilted`): for a vessel standing as drawn, the
height above the lowest inside point (horizontal) or above the axis point at
the gauge point (vertical: the lowest point unless ``gauge_point`` moves it).
A gauge point is given as a distance along the axis from the vessel's end at
the start of the axis (the bottom of a vertical vessel, head 1 of a lying
one). Innage (the reading of a dip) is the level above the datum plate,
``level - datum_offset``; ullage is ``reference_height - innage``.

Examples
--------
>>> parse_temperature("35 °C"), parse_temperature("95 degF"), parse_temperature("300 K")
(35.0, 35.0, 26.850000000000023)
>>> parse_expansion("6.2e-6 /°F")
1.116e-05
"""

from __future__ import annotations

import math
import os
import re
from dataclasses import dataclass
from typing import Any, Callable, Dict, Mapping, Optional, Tuple

import numpy as np

from revolve.errors import FormatError, RevolveError, quoted

__all__ = ["Gauge", "make_gauge", "step_levels", "parse_temperature", "parse_expansion",
           "read_deadwood", "read_uncertainty", "uncertainty_model", "VesselDimensions",
           "input_unit",
           "CROSSCHECK_BOUND", "MAX_FILE_CHARACTERS", "MAX_ITEMS"]

#: Largest difference (of the capacity) allowed between a tilted table and its chord-sum check.
CROSSCHECK_BOUND = 2e-3
#: Rows of a tilted table checked by the chord sums (spread over the table).
CROSSCHECK_ROWS = 41
#: Most characters of a deadwood or uncertainty file, and most items in it.
MAX_FILE_CHARACTERS = 200_000
MAX_ITEMS = 500


# -- levels against volumes at a gauge point, level or tilted ----------------------------------

@dataclass(frozen=True)
class Gauge:
    """Volumes against the level at a gauge point (profile units), level or tilted.

    ``shift``: for a vessel standing as drawn, the engine's level (from the
    lowest inside point) is the table's level plus ``shift``. ``low`` and
    ``high`` are the table's levels of the empty and the full vessel.
    ``gauge_z`` is the gauge point's axial position in the axis frame.
    """

    space: Any
    tilt: Optional[float]
    gauge_z: Optional[float]
    shift: float
    low: float
    high: float
    pieces: Any = None

    def forward(self, levels):
        """Volume, error estimate and wetted area at each table level (profile units)."""
        from revolve.geometry.tilted import tilted_levels
        from revolve.jobs.levels import _forward

        lv = np.clip(np.asarray(levels, dtype=float), self.low, self.high)
        if self.tilt is None:
            v, a, e = _forward(self.space, np.clip(lv + self.shift, 0.0, self.space.height))
            return v, e, a
        return tilted_levels(self.space.prepared, lv, self.tilt, self.space.orientation,
                             self.gauge_z, pieces=self.pieces)

    def inverse(self, volumes):
        """The table level holding each geometric volume (profile units cubed)."""
        from revolve.geometry.tilted import tilted_level_for_volume
        from revolve.jobs.levels import level_for_volume

        if self.tilt is None:
            return np.asarray(level_for_volume(self.space, volumes).level) - self.shift
        return np.asarray(tilted_level_for_volume(self.space.prepared, volumes, self.tilt,
                                                  self.space.orientation, self.gauge_z,
                                                  pieces=self.pieces))

    def crosscheck(self, levels):
        """The tilted volumes by chord sums over (z, w) (:func:`tilted_crosscheck`)."""
        from revolve.geometry.tilted import tilted_crosscheck

        return tilted_crosscheck(self.space.prepared, levels, self.tilt or 0.0,
                                 self.space.orientation, self.gauge_z, pieces=self.pieces)


def make_gauge(space, tilt: Optional[float], gauge_point: Optional[float]) -> Gauge:
    """A :class:`Gauge` of a liquid space; ``gauge_point`` from the start of the axis (profile units).

    >>> from revolve.geometry.profile import Axis, Chain, Profile
    >>> from revolve.jobs.levels import liquid_space
    >>> drum = liquid_space(Profile(chains=(Chain.from_points([(0, 0), (1, 0), (1, 2), (0, 2)]),)),
    ...                     Axis.y())
    >>> g = make_gauge(drum, None, 0.5)             # levels read above the axis 0.5 up
    >>> (g.low, g.high), [round(float(v) / math.pi, 12) for v in g.forward([0.0, 1.5])[0]]
    ((-0.5, 1.5), [0.5, 2.0])
    >>> make_gauge(drum, None, 3.0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: the gauge point 3 is beyond the vessel's length 2 along the axis (in the profile's unit)
    """
    from revolve.geometry.tilted import plane_coefficients, tilted_pieces, tilted_range

    pieces = tilted_pieces(space.prepared)
    length = pieces.z_max - pieces.z_min
    if gauge_point is not None:
        g = float(gauge_point)
        if not math.isfinite(g) or g < -1e-12 * length or g > length * (1 + 1e-12):
            raise RevolveError(f"the gauge point {g:g} is beyond the vessel's length {length:g} "
                               "along the axis (in the profile's unit)")
        gauge_z = pieces.z_min + min(max(g, 0.0), length)
    else:
        gauge_z = None
    if tilt is not None:
        plane_coefficients(tilt, space.orientation)        # refuses a tilt beyond 45°
        low, high = tilted_range(space.prepared, tilt, space.orientation, gauge_z, pieces=pieces)
        return Gauge(space, float(tilt), gauge_z, 0.0, low, high, pieces)
    shift = 0.0
    if space.orientation == "vertical" and gauge_z is not None:
        shift = gauge_z - pieces.z_min
    return Gauge(space, None, gauge_z, shift, 0.0 - shift, space.height - shift, pieces)


def step_levels(low: float, high: float, step: float, origin: float = 0.0,
                max_rows: int = 200_000) -> np.ndarray:
    """Levels ``origin + k·step`` between ``low`` and ``high``, with both ends as rows.

    Multiples of the step are counted from ``origin`` (the datum plate: innages
    of whole increments), not added up, so no rounding drift.

    >>> step_levels(0.0, 2.0, 0.75).tolist()
    [0.0, 0.75, 1.5, 2.0]
    >>> step_levels(-0.3, 1.0, 0.5, origin=0.1).tolist()
    [-0.3, 0.1, 0.6, 1.0]
    """
    from revolve.jobs.gauging import _decimals

    if not (math.isfinite(step) and step > 0):
        raise RevolveError(f"the step must be a positive number, got {step:g}")
    if (high - low) / step > max_rows:
        raise RevolveError(f"a step of {step:g} gives {(high - low) / step:.3g} rows (most "
                           f"{max_rows}); make it larger")
    first = math.ceil((low - origin) / step - 1e-9)
    last = math.floor((high - origin) / step + 1e-9)
    k = np.arange(first, last + 1, dtype=float)
    lv = origin + step * k
    places = _decimals(step)
    if places is not None and _decimals(origin) is not None:
        lv = np.round(lv, max(places, _decimals(origin)))
    tiny = 1e-9 * step
    lv = lv[(lv > low + tiny) & (lv < high - tiny)]
    return np.concatenate([[low], lv, [high]])


# -- temperatures and expansion coefficients, each with its unit -------------------------------

_NUMBER = r"[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?"
_TEMPERATURE_UNITS = {"°c": "C", "degc": "C", "c": "C", "celsius": "C", "°f": "F", "degf": "F",
                      "f": "F", "fahrenheit": "F", "k": "K", "kelvin": "K"}


def parse_temperature(text) -> float:
    """A temperature with its unit (°C, degC, °F, degF, K) in °C; a bare number is refused.

    >>> parse_temperature("-5 degC"), parse_temperature("60 °F")
    (-5.0, 15.555555555555555)
    >>> parse_temperature("35")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: '35' has no unit; write a temperature such as '35 °C', '95 °F' or '308 K'
    """
    if hasattr(text, "to") and hasattr(text, "magnitude"):          # a pint quantity
        return float(text.to("degC").magnitude)
    s = str(text).strip()[:100]
    m = re.fullmatch(rf"({_NUMBER})\s*(°\s*[CcFf]|[A-Za-z°]+)?", s)
    if m is None:
        raise RevolveError(f"{quoted(s)} is not a temperature; write one such as '35 °C', "
                           "'95 °F' or '308 K'")
    if not m.group(2):
        raise RevolveError(f"{quoted(s)} has no unit; write a temperature such as '35 °C', "
                           "'95 °F' or '308 K'")
    unit = _TEMPERATURE_UNITS.get(m.group(2).replace(" ", "").lower())
    if unit is None:
        raise RevolveError(f"{quoted(m.group(2))} is not a temperature unit; use °C, °F or K")
    v = float(m.group(1))
    if not math.isfinite(v):
        raise RevolveError(f"{quoted(s)} is not a finite temperature")
    c = v if unit == "C" else (v - 32.0) * 5.0 / 9.0 if unit == "F" else v - 273.15
    if c < -273.15:
        raise RevolveError(f"{quoted(s)} is below absolute zero")
    return c


def parse_expansion(text) -> float:
    """A linear expansion coefficient with its unit (``/K``, ``/°C``, ``/°F``), per kelvin.

    >>> parse_expansion("11.16e-6 /K"), parse_expansion("12e-6 per degC")
    (1.116e-05, 1.2e-05)
    >>> parse_expansion("12e-6")
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: '12e-6' has no unit; write a coefficient such as '12e-6 /K' or '6.7e-6 /°F'
    """
    s = str(text).strip()[:100]
    m = re.fullmatch(rf"({_NUMBER})\s*(?:(?:/|per\s*|1/)\s*(°?\s*[A-Za-z]+))?", s)
    if m is None:
        raise RevolveError(f"{quoted(s)} is not an expansion coefficient; write one such as "
                           "'12e-6 /K' or '6.7e-6 /°F'")
    if not m.group(2):
        raise RevolveError(f"{quoted(s)} has no unit; write a coefficient such as '12e-6 /K' or "
                           "'6.7e-6 /°F'")
    unit = _TEMPERATURE_UNITS.get(m.group(2).replace(" ", "").lower())
    if unit is None:
        raise RevolveError(f"{quoted(m.group(2))} is not a temperature unit; use /K, /°C or /°F")
    alpha = float(m.group(1)) * (1.8 if unit == "F" else 1.0)
    if not (math.isfinite(alpha) and 0 < alpha < 1e-3):
        raise RevolveError(f"the expansion coefficient must be between 0 and 1e-3 per kelvin, "
                           f"got {alpha:g}")
    return alpha


# -- small TOML files (deadwood, uncertainty) --------------------------------------------------

def _load_toml(path: str, what: str) -> Tuple[dict, str]:
    from revolve.formats.files import read_text
    from revolve.formats.source_lines import find_oversize

    from revolve.datafiles import toml

    tomllib = toml()

    text = read_text(path)
    if len(text) > MAX_FILE_CHARACTERS:
        raise FormatError(f"a {what} file of {len(text)} characters is too long (at most "
                          f"{MAX_FILE_CHARACTERS})", file=path)
    big = find_oversize(text, max_depth=4, max_word=60, max_string=2000)
    if big is not None:
        raise FormatError(f"{big.kind} too large ({big.size}); a {what} file needs short values "
                          "and brackets at most 4 deep", file=path, line=big.line)
    try:
        return tomllib.loads(text), text
    except tomllib.TOMLDecodeError as exc:
        found = re.search(r"at line (\d+)", str(exc))
        raise FormatError(f"not valid TOML: {exc}", file=path,
                          line=int(found.group(1)) if found else None) from None


def _header_lines(text: str, header: str):
    return [k + 1 for k, line in enumerate(text.splitlines())
            if re.match(rf"\s*\[\[\s*{header}\s*\]\]", line)]


def _length_m(value, default_unit: Optional[str]) -> float:
    from revolve.inputs import parse_length

    return parse_length(value).metres(default_unit)


def read_deadwood(path: str, vessel_space, *, default_unit: Optional[str] = None) -> tuple:
    """The deadwood items and fittings of a small TOML file (see ``examples/deadwood-*.toml``).

    Each ``[[item]]`` has a ``name`` and either ``volume`` (with its unit,
    ``"38 L"``) spread evenly from level ``from`` to level ``to`` (lengths
    with units, levels of the table: above the lowest inside point), or
    ``profile``: a profile file of a body of revolution on the vessel's axis
    (relative to this file). ``fitting = true`` adds the volume (a sump, a
    nozzle stub) instead of taking it up.

    >>> import tempfile, os
    >>> d = tempfile.mkdtemp(); p = os.path.join(d, "dw.toml")
    >>> _ = open(p, "w").write('[[item]]\\nname = "ladder"\\nvolume = "20 L"\\nfrom = "0 m"\\nto = "2 m"\\n')
    >>> (item,) = read_deadwood(p, None); item.name, item.volume, item.top
    ('ladder', 0.02, 2.0)
    >>> _ = open(p, "w").write('[[item]]\\nname = "ladder"\\nvolume = 20\\nfrom = 0\\nto = 1\\n')
    >>> read_deadwood(p, None)    # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: ...dw.toml:1: item 1 (ladder): volume: '20' has no unit; write it like '20 L'
    """
    from revolve.jobs.gauging import RevolvedItem, SpreadItem

    data, text = _load_toml(path, "deadwood")
    extra = sorted(set(data) - {"item"})
    if extra:
        raise FormatError(f"unknown key {quoted(extra[0])}; a deadwood file holds [[item]] "
                          "tables only", file=path)
    raw = data.get("item")
    if not isinstance(raw, list) or not raw:
        raise FormatError("the file has no [[item]]; give each deadwood item or fitting as an "
                          "[[item]] table", file=path)
    if len(raw) > MAX_ITEMS:
        raise FormatError(f"{len(raw)} items are too many (at most {MAX_ITEMS})", file=path)
    lines = _header_lines(text, "item")
    keys = {"name", "volume", "from", "to", "profile", "fitting"}
    items = []
    for k, entry in enumerate(raw):
        line = lines[k] if k < len(lines) else None
        name = entry.get("name") if isinstance(entry, dict) else None
        place = f"item {k + 1}" + (f" ({name})" if isinstance(name, str) and name else "")

        def fail(message, key=None):
            return FormatError((f"{key}: " if key else "") + message, file=path, line=line,
                               place=place)

        if not isinstance(entry, dict):
            raise fail("each item must be a table")
        unknown = sorted(set(entry) - keys)
        if unknown:
            raise fail(f"unknown key {quoted(unknown[0])}; an item has name, volume, from, to, "
                       "profile and fitting")
        if not isinstance(name, str) or not name.strip():
            raise fail("give each item a name in quotes", "name")
        fitting = entry.get("fitting", False)
        if not isinstance(fitting, bool):
            raise fail(f"give true or false, got {fitting!r}", "fitting")
        try:
            if "profile" in entry:
                if {"volume", "from", "to"} & set(entry):
                    raise fail("give either a profile or a volume with from and to, not both")
                target = entry["profile"]
                if not isinstance(target, str) or not target.strip():
                    raise fail("give the profile file's name in quotes", "profile")
                from revolve.jobs.measuring import as_document

                full = os.path.join(os.path.dirname(os.path.abspath(path)), target)
                doc = as_document(full, None)
                axis = doc.axis or vessel_space.axis
                items.append(RevolvedItem.from_profile(doc.profile, axis, vessel_space,
                                                       name=name.strip(), fitting=fitting))
                continue
            missing = [key for key in ("volume", "from", "to") if key not in entry]
            if missing:
                raise fail(f"give {', '.join(missing)} (or a profile of the body)", missing[0])
            volume = _volume_m3(entry["volume"])
            lo = _keyed(lambda v: _length_m(v, default_unit), entry["from"], "from", fail)
            hi = _keyed(lambda v: _length_m(v, default_unit), entry["to"], "to", fail)
            items.append(SpreadItem(volume, lo, hi, name=name.strip(), fitting=fitting))
        except FormatError:
            raise
        except RevolveError as e:
            message = e.message.removeprefix(f"item {quoted(name.strip())}: ")
            raise FormatError(message if e.file is None else str(e), file=path, line=line,
                              place=place) from None
    return tuple(items)


def _keyed(fn, value, key, fail):
    try:
        return fn(value)
    except RevolveError as e:
        raise fail(e.message, key) from None


def _volume_m3(value) -> float:
    from revolve import units as registry

    s = str(value).strip()[:100]
    m = re.fullmatch(rf"({_NUMBER})\s*([A-Za-zµ_][A-Za-zµ_0-9²³^ ]*)?", s)
    if m is None:
        raise RevolveError(f"volume: {quoted(s)} is not a volume; write one such as '38 L'")
    if not m.group(2):
        raise RevolveError(f"volume: {quoted(s)} has no unit; write it like '{s} L'")
    return float(m.group(1)) * registry.factor(m.group(2).strip().replace(" ", "_"), "volume")


# -- uncertainty from the dimensions of a vessel ---------------------------------------------------

#: The inputs a tolerance may be given for, and what they are. A head dimension written
#: without ``head_1_``/``head_2_`` is a tolerance of each head that has it (made apart:
#: independent inputs).
UNCERTAIN_INPUTS = {"diameter": "shell diameter", "length": "straight shell length",
                    "thickness": "wall thickness", "tilt": "tilt (degrees)",
                    "reading": "gauge reading"}
#: Head dimensions by tolerance name: what it is, and the head kinds that have it.
HEAD_DIMENSIONS = {"crown": "crown radius", "knuckle": "knuckle radius",
                   "angle": "cone half-angle", "depth": "inside depth"}
for _h in (1, 2):
    for _k, _what in HEAD_DIMENSIONS.items():
        UNCERTAIN_INPUTS[f"head_{_h}_{_k}"] = f"head {_h} {_what}"
del _h, _k, _what
#: Inputs in degrees (the rest are lengths, in metres inside the model).
ANGLE_INPUTS = ("tilt", "head_1_angle", "head_2_angle")


def input_unit(name: str) -> str:
    """The unit a model input is in: ``"°"`` for angles, ``"m"`` for lengths.

    >>> input_unit("head_2_angle"), input_unit("head_1_crown")
    ('°', 'm')
    """
    return "°" if name in ANGLE_INPUTS else "m"


@dataclass(frozen=True)
class VesselDimensions:
    """A vessel as ``revolve vessel`` builds it (lengths in ``unit``), for the uncertainty model.

    ``head_1`` and ``head_2`` are the head texts ``revolve vessel`` takes
    (``"torispherical:crown=1000,knuckle=100"``); :meth:`dimensions_of`
    gives every dimension a tolerance may be given for, and :meth:`space`
    rebuilds the liquid space with any of them changed.

    Examples
    --------
    >>> v = VesselDimensions(1000.0, 2000.0, "torispherical", "ellipsoidal", "mm")
    >>> v.dimensions_of()
    {'diameter': 1000.0, 'length': 2000.0, 'head_1_crown': 1000.0, 'head_1_knuckle': 60.0, 'head_2_depth': 250.0}
    >>> round(v.space("vertical").capacity / 1e9, 6) == round(
    ...     v.space("vertical", head_2_depth=250.0).capacity / 1e9, 6)
    True
    """

    diameter: float
    length: float
    head_1: str
    head_2: str
    unit: str
    dimensions: str = "inside"
    thickness: Optional[float] = None

    def heads(self, diameter: Optional[float] = None):
        """The two :class:`~revolve.jobs.vessel.HeadSpec` (percentages of ``diameter``)."""
        from revolve.jobs.vessel import parse_head

        D = self.diameter if diameter is None else diameter
        return parse_head(self.head_1, D, "head 1"), parse_head(self.head_2, D, "head 2")

    def dimensions_of(self) -> Dict[str, float]:
        """Each dimension of the vessel a tolerance may be given for (vessel units, degrees)."""
        out = {"diameter": self.diameter, "length": self.length}
        if self.thickness is not None:
            out["thickness"] = self.thickness
        design = self._design({})
        for k, spec in enumerate(design.heads, start=1):
            for key in ("crown", "knuckle", "angle"):
                value = getattr(spec, key)
                if value is not None and not (key == "knuckle" and value == 0.0):
                    out[f"head_{k}_{key}"] = float(value)
            if spec.kind == "ellipsoidal":
                pole = design.poles[0] if k == 1 else design.poles[1] - design.length
                out[f"head_{k}_depth"] = abs(float(pole))
        return out

    def _design(self, changes: Mapping[str, float]):
        from dataclasses import replace

        from revolve.jobs.vessel import design_vessel

        D = changes.get("diameter", self.diameter)
        specs = list(self.heads(D))
        for k in (1, 2):
            head = {key: changes[f"head_{k}_{key}"] for key in ("crown", "knuckle", "angle")
                    if f"head_{k}_{key}" in changes}
            if head:
                specs[k - 1] = replace(specs[k - 1], **head)
        return design_vessel(D, changes.get("length", self.length), specs[0], specs[1],
                             thickness=changes.get("thickness", self.thickness),
                             dimensions=self.dimensions, unit=self.unit)

    def space(self, orientation: str, **changes: float):
        """The liquid space of the vessel with dimensions changed (vessel units, degrees).

        ``changes`` are named as in :meth:`dimensions_of`. A head's depth
        (ellipsoidal heads) changes by stretching that head's inside along the
        axis: an ellipsoid of revolution stays one, with the new depth.
        """
        from dataclasses import replace

        from revolve.geometry.profile import Loop
        from revolve.geometry.segments import Line
        from revolve.jobs.levels import liquid_space
        from revolve.jobs.vessel import sketch_profile

        design = self._design(changes)
        if any(f"head_{k}_depth" in changes for k in (1, 2)):
            L = design.length
            depths = (-design.poles[0], design.poles[1] - L)
            scale = [changes.get(f"head_{k}_depth", depths[k - 1]) / depths[k - 1]
                     for k in (1, 2)]
            for k, s in enumerate(scale, start=1):
                if not (math.isfinite(s) and s > 0):
                    raise RevolveError(f"head {k}: the depth must be positive")
            segs = []
            for seg in design.inside.segments[:-1]:          # the last: the axis, pole to pole
                face = getattr(seg, "face", None)
                if face == "head 1":
                    seg = seg.transformed((scale[0], 0.0, 0.0, 1.0), (0.0, 0.0))
                elif face == "head 2":
                    seg = seg.transformed((scale[1], 0.0, 0.0, 1.0), ((1 - scale[1]) * L, 0.0))
                segs.append(seg)
            poles = (design.poles[0] * scale[0], L + depths[1] * scale[1])
            segs.append(Line((poles[1], 0.0), (poles[0], 0.0)))
            design = replace(design, inside=Loop(tuple(segs)), poles=poles)
        profile, axis = sketch_profile(design, orientation)
        return liquid_space(profile, axis, orientation=orientation)


def _tolerance(value, key, fail, unit):
    """A tolerance given as a length (or angle) text, or a table {value, distribution, coverage}.

    ``unit`` is metres per unit of a bare length.
    """
    from revolve.jobs.gauging import Tolerance

    table = value if isinstance(value, dict) else {"value": value}
    unknown = sorted(set(table) - {"value", "distribution", "coverage"})
    if unknown:
        raise fail(f"unknown key {quoted(unknown[0])}; a tolerance has value, distribution "
                   "(rectangular, triangular, normal) and coverage", key)
    if "value" not in table:
        raise fail("give the tolerance's value (a half-width)", key)
    raw = table["value"]
    try:
        if key in ANGLE_INPUTS or key == "angle":
            m = re.fullmatch(rf"\s*({_NUMBER})\s*(?:°|deg|degrees?)\s*", str(raw)[:100])
            if m is None:
                raise RevolveError(f"{quoted(str(raw)[:100])}: give the tolerance of an angle in "
                                   "degrees, such as '0.1 deg'")
            half = float(m.group(1))
        else:
            half = _length_m(raw, None)
        return Tolerance(half, str(table.get("distribution", "rectangular")),
                         float(table.get("coverage", 2.0)))
    except (RevolveError, TypeError, ValueError) as e:
        raise fail(getattr(e, "message", str(e)), key) from None


def read_uncertainty(source, *, names: Optional[Mapping[str, str]] = None):
    """The vessel's dimensions (optional) and the tolerances of an uncertainty file or mapping.

    The file (or a mapping of the same shape, for the library)::

        [vessel]                 # optional: the vessel as revolve vessel built it
        diameter = "1200 mm"
        length = "2400 mm"
        head = "torispherical"   # or head_1 and head_2, with settings as revolve vessel
                                 # takes them ("conical:angle=30,knuckle=50");
                                 # dimensions = "outside", thickness = "6 mm"
        [tolerance]              # half-widths (rectangular unless a table says otherwise)
        diameter = "3 mm"
        length = { value = "5 mm", distribution = "normal", coverage = 2 }
        crown = "10 mm"          # each head's crown radius (or head_1_crown, head_2_crown)
        knuckle = "3 mm"         # also angle (conical, degrees), depth (ellipsoidal), thickness
        tilt = "0.2 deg"
        reading = "2 mm"

    A head dimension without ``head_1_`` or ``head_2_`` is a tolerance of
    each head that has it, the two heads independent. Returns
    ``(VesselDimensions or None, {input: Tolerance})`` — lengths in metres
    in the tolerances, angles in degrees, the vessel's in its own unit.

    >>> dims, tol = read_uncertainty({"tolerance": {"tilt": "0.5 deg", "reading": "1 mm"}})
    >>> dims, round(tol["tilt"].standard, 6), round(tol["reading"].standard * 1e3, 6)
    (None, 0.288675, 0.57735)
    >>> vessel = {"diameter": "1 m", "length": "2 m", "head_1": "torispherical",
    ...           "head_2": "flat"}
    >>> sorted(read_uncertainty({"vessel": vessel, "tolerance": {"crown": "5 mm"}})[1])
    ['head_1_crown']
    >>> read_uncertainty({"tolerance": {"diameter": "1 mm"}})
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: tolerance: diameter: a tolerance of the diameter needs the vessel's dimensions in a [vessel] table (the profile file does not record them)
    >>> read_uncertainty({"vessel": vessel, "tolerance": {"head_2_knuckle": "1 mm"}})
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: tolerance: head_2_knuckle: the vessel has no head 2 knuckle radius (head 2 is flat); tolerances it takes: diameter, length, tilt, reading, head_1_crown, head_1_knuckle
    """
    from revolve import units as registry

    file = None
    if isinstance(source, (str, os.PathLike)):
        file = str(source)
        data, text = _load_toml(file, "uncertainty")
    elif isinstance(source, Mapping):
        data, text = dict(source), ""
    else:
        raise RevolveError("give the uncertainty as a file name or a mapping with [vessel] and "
                           "[tolerance]")

    def line_of(header):
        for k, line in enumerate(text.splitlines()):
            if re.match(rf"\s*\[\s*{header}\s*\]", line):
                return k + 1
        return None

    def failer(header):
        def fail(message, key=None):
            return FormatError((f"{key}: " if key else "") + message, file=file,
                               line=line_of(header), place=header)
        return fail

    extra = sorted(set(data) - {"vessel", "tolerance"})
    if extra:
        raise FormatError(f"unknown key {quoted(extra[0])}; an uncertainty file holds [vessel] "
                          "and [tolerance]", file=file)
    dims = None
    available: Dict[str, float] = {}
    vessel = data.get("vessel")
    if vessel is not None:
        fail = failer("vessel")
        if not isinstance(vessel, dict):
            raise fail("[vessel] must be a table")
        allowed = {"diameter", "length", "head", "head_1", "head_2", "units", "dimensions",
                   "thickness"}
        unknown = sorted(set(vessel) - allowed)
        if unknown:
            raise fail(f"unknown key {quoted(unknown[0])}; give " + ", ".join(sorted(allowed)))
        unit = vessel.get("units", "mm")
        try:
            unit = registry.canonical(str(unit), "length")
        except RevolveError as e:
            raise fail(e.message, "units") from None
        per = registry.factor(unit, "length")
        values = {}
        for key in ("diameter", "length", "thickness"):
            if key in vessel:
                values[key] = _keyed(lambda v: _length_m(v, unit) / per, vessel[key], key, fail)
        for key in ("diameter", "length"):
            if key not in values:
                raise fail(f"give the vessel's {key}", key)
        head = vessel.get("head")
        if head is not None and ("head_1" in vessel or "head_2" in vessel):
            raise fail("give head (both ends) or head_1 and head_2, not both", "head")
        h1, h2 = (head, head) if head is not None else (vessel.get("head_1"), vessel.get("head_2"))
        if not (isinstance(h1, str) and isinstance(h2, str)):
            raise fail("give head (both ends) or head_1 and head_2, as revolve vessel takes them",
                       "head")
        dimensions = vessel.get("dimensions", "inside")
        if dimensions not in ("inside", "outside"):
            raise fail(f"give inside or outside, got {dimensions!r}", "dimensions")
        dims = VesselDimensions(values["diameter"], values["length"], h1, h2, unit,
                                dimensions, values.get("thickness"))
        try:
            available = dims.dimensions_of()
        except RevolveError as e:
            raise fail(e.message if e.place is None else f"{e.place}: {e.message}") from None
    tolerances = {}
    raw = data.get("tolerance")
    fail = failer("tolerance")
    if not isinstance(raw, dict) or not raw:
        raise fail("give the tolerances in a [tolerance] table: diameter, length, thickness, "
                   "crown, knuckle, angle, depth (or head_1_…, head_2_…), tilt, reading")
    taken = [k for k in UNCERTAIN_INPUTS if k in available or k in ("tilt", "reading")]

    for key, value in raw.items():
        if key in HEAD_DIMENSIONS:
            targets = [f"head_{k}_{key}" for k in (1, 2)]
        elif key in UNCERTAIN_INPUTS:
            targets = [key]
        else:
            raise fail(f"no tolerance can be given for {quoted(key)}; give "
                       + ", ".join(("diameter", "length", "thickness", *HEAD_DIMENSIONS,
                                    "head_1_…", "head_2_…", "tilt", "reading")))
        if key not in ("tilt", "reading") and dims is None:
            raise fail(f"a tolerance of the {key} needs the vessel's dimensions in a [vessel] "
                       "table (the profile file does not record them)", key)
        if dims is not None:
            have = [t for t in targets if t in available or t in ("tilt", "reading")]
            if not have:
                what = UNCERTAIN_INPUTS[targets[0]]
                if key == "thickness":
                    why = "no thickness in [vessel]"
                elif key in HEAD_DIMENSIONS:
                    why = f"heads {dims.head_1}, {dims.head_2}"
                else:
                    k = targets[0][5]
                    why = f"head {k} is {dims.head_1 if k == '1' else dims.head_2}"
                if key in HEAD_DIMENSIONS:
                    what = f"head {HEAD_DIMENSIONS[key]}"
                raise fail(f"the vessel has no {what} ({why}); tolerances it takes: "
                           + ", ".join(taken), key)
            targets = have
        t = _tolerance(value, key, fail, 1.0)
        for target in targets:
            if target in tolerances:
                raise fail(f"a tolerance of {UNCERTAIN_INPUTS[target]} is given twice", key)
            if dims is not None and target in available:
                _check_buildable(dims, available, target, t.half_width, key, fail)
            tolerances[target] = t
    return dims, tolerances


def _check_buildable(dims: VesselDimensions, available, target: str, half: float, key, fail):
    """Refuse a tolerance so wide that the vessel cannot be built at either end of it."""
    from revolve import units as registry

    per = 1.0 if target in ANGLE_INPUTS else registry.factor(dims.unit, "length")
    unit = "°" if target in ANGLE_INPUTS else f" {dims.unit}"
    nominal = available[target]
    for sign in (-1.0, 1.0):
        value = nominal + sign * half / per
        try:
            if target.endswith("_depth"):
                if not value > 0:
                    raise RevolveError("the depth must be positive")
            else:
                dims._design({target: value})
        except RevolveError as e:
            raise fail(f"the vessel cannot be built at {nominal:g}{unit} "
                       f"{'−' if sign < 0 else '+'} {half / per:g}{unit} ({e.message}); give a "
                       "smaller tolerance", key) from None


def uncertainty_model(dims: Optional[VesselDimensions], space, *, tilt: Optional[float],
                      gauge_point: Optional[float], levels_si, net: Callable,
                      toleranced=None) -> Tuple[Callable[..., np.ndarray], Dict[str, float]]:
    """The model (inputs in metres and degrees) -> net capacity and the net volume at each level.

    ``levels_si`` are the table's levels (m); ``net(levels_si, geometric_m3)``
    applies deadwood and the shell factor. The vessel's diameter and length
    are inputs (lengths in metres), and so are those of its other dimensions
    (named as :meth:`VesselDimensions.dimensions_of`) named in
    ``toleranced`` (all of them if None): each call rebuilds the vessel with
    the values it is given. A dimension left out follows the vessel's
    description (a 2:1 head stays 2:1, a crown given as a share of the
    diameter stays that share, as the diameter changes). Returns the model
    and the values of its inputs.
    """
    from revolve import units as registry

    metre = registry.factor(space.profile.unit, "length")
    values: Dict[str, float] = {"tilt": float(tilt or 0.0), "reading": 0.0}
    per = 1.0
    if dims is not None:
        per = registry.factor(dims.unit, "length")
        values.update({k: (v if k in ANGLE_INPUTS else v * per)
                       for k, v in dims.dimensions_of().items()
                       if k in ("diameter", "length") or toleranced is None or k in toleranced})
    levels_si = np.asarray(levels_si, dtype=float)

    def model(tilt=0.0, reading=0.0, **dimensions):
        if dims is not None:
            changes = {k: (v if k in ANGLE_INPUTS else v / per) for k, v in dimensions.items()}
            s = dims.space(space.orientation, **changes)
            m = registry.factor(s.profile.unit, "length")
        else:
            s, m = space, metre
        engine = make_gauge(s, tilt if (tilt or tilt_used) else None,
                            None if gauge_point is None else gauge_point * metre / m)
        lv = np.clip((levels_si + reading) / m, engine.low, engine.high)
        geometric = engine.forward(np.concatenate([[engine.high], lv]))[0] * m ** 3
        return net(np.concatenate([[engine.high * m], levels_si + reading]), geometric)

    tilt_used = tilt is not None
    return model, values
