"""Result tables as rows, and writing them as CSV or JSON files.

A result table is a list of rows, each a dict with the same keys (for
``revolve measure``: ``table``, ``quantity``, ``value``, ``unit``). Values
stay plain numbers at full precision; a missing value is written empty in
CSV and ``null`` in JSON. Files are written atomically (a temporary file
beside the target, then a rename).

Examples
--------
>>> import os, tempfile
>>> path = os.path.join(tempfile.mkdtemp(), "t.csv")
>>> write_csv([{"quantity": "volume", "value": 1 / 3, "unit": "mm³"},
...            {"quantity": "mass", "value": None, "unit": "kg"}], path)
>>> with open(path, encoding="utf-8") as f:
...     print(f.read(), end="")
quantity,value,unit
volume,0.3333333333333333,mm³
mass,,kg
"""

from __future__ import annotations

import csv
import io
import json
import math
from typing import Any, Dict, Iterable, List, Optional, Sequence

Row = Dict[str, Any]


def _cell(value: Any) -> str:
    if value is None:
        return ""
    if isinstance(value, bool):
        return "true" if value else "false"
    if isinstance(value, float):
        return repr(value) if math.isfinite(value) else ""
    return str(value)


def csv_text(rows: Iterable[Row], columns: Optional[Sequence[str]] = None) -> str:
    """CSV text of rows: a header line, then one line per row.

    Columns are ``columns`` if given, else every key in order of first
    appearance. Floats keep every digit (``repr``); None and NaN are empty.

    >>> print(csv_text([{"a": 1, "b": "x, y"}, {"a": float("nan"), "c": True}]), end="")
    a,b,c
    1,"x, y",
    ,,true
    >>> csv_text([])
    ''
    """
    rows = list(rows)
    if columns is None:
        seen: Dict[str, None] = {}
        for r in rows:
            for k in r:
                seen.setdefault(str(k), None)
        columns = list(seen)
    if not columns:
        return ""
    buffer = io.StringIO()
    writer = csv.writer(buffer, lineterminator="\n")
    writer.writerow(columns)
    for r in rows:
        writer.writerow([_cell(r.get(c)) for c in columns])
    return buffer.getvalue()


def check_table_path(path: str) -> None:
    """Refuse, before any work is done, a CSV file name that cannot be written.

    >>> check_table_path("results.txt")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: results.txt: tables are written as .csv files, not ".txt"
    >>> check_table_path("no/such/folder/t.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: no/such/folder/t.csv: the folder for this file does not exist
    """
    import os

    from revolve.errors import FormatError

    ext = os.path.splitext(path)[1].lower()
    if ext != ".csv":
        raise FormatError(f'tables are written as .csv files, not "{ext or path}"', file=path)
    if not os.path.isdir(os.path.dirname(os.path.abspath(path))):
        raise FormatError("the folder for this file does not exist", file=path)
    if os.path.isdir(path):
        raise FormatError("this is a folder; give a file name", file=path)


def write_csv(rows: Iterable[Row], path: str, columns: Optional[Sequence[str]] = None,
              option: Optional[str] = "--csv") -> None:
    """Write rows as a CSV file (UTF-8, ``\\n`` line ends), atomically.

    >>> write_csv([{"a": 1}], "no/such/folder/t.csv")
    Traceback (most recent call last):
    ...
    revolve.errors.FormatError: --csv: no/such/folder/t.csv: cannot write the file (No such file or directory)
    """
    from revolve.formats.files import write_text_atomically

    write_text_atomically(path, csv_text(rows, columns), option=option)


def json_text(obj: Any) -> str:
    """Strict JSON (NaN and infinities become null), indented, UTF-8 characters kept.

    >>> print(json_text({"v": float("nan"), "unit": "mm³"}))
    {
      "v": null,
      "unit": "mm³"
    }
    """
    from revolve.render.output import clean_json

    return json.dumps(clean_json(obj), indent=2, ensure_ascii=False)


def write_json(obj: Any, path: str) -> None:
    """Write ``obj`` as a JSON file, atomically.

    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "r.json")
    >>> write_json({"volume": 2.5}, path)
    >>> with open(path, encoding="utf-8") as f:
    ...     json.load(f)
    {'volume': 2.5}
    """
    from revolve.formats.files import write_text_atomically

    write_text_atomically(path, json_text(obj) + "\n")


def measure_rows(measurement, units, *, tolerance: Optional[float] = None) -> List[Row]:
    """Every figure of ``revolve measure``'s two tables as rows, in the output units.

    Parameters
    ----------
    measurement : revolve.geometry.measure.Measurement
    units : revolve.cli.common.OutputUnits
    tolerance : float, optional
        The cross-check tolerance; when given, an ``agrees`` row (1 or 0) is added.

    Returns
    -------
    list of dict
        Keys ``table`` ("results" or "cross-check"), ``quantity``, ``value``, ``unit``.

    Examples
    --------
    >>> from revolve.cli.common import output_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> ring = Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)], face="ring")
    >>> m = measure(Revolution(Profile(loops=(ring,)), Axis.x()))
    >>> rows = measure_rows(m, output_units("mm", volume="L"))
    >>> [(r["quantity"], round(r["value"], 9), r["unit"]) for r in rows if r["quantity"] == "volume"]
    [('volume', 5.0265e-05, 'L')]
    >>> sorted({r["table"] for r in rows})
    ['cross-check', 'results']
    """
    from revolve.cli.commands.measure import shown_faces

    m, u = measurement, units
    L, A, V, M = u.length_factor, u.area_factor, u.volume_factor, u.mass_factor
    rows: List[Row] = []

    def add(quantity, value, unit="", table="results"):
        rows.append({"table": table, "quantity": quantity,
                     "value": None if value is None else float(value), "unit": unit})

    if m.has_solid:
        add("section area", m.area * A, u.area)
        add("section centroid x", m.centroid[0] * L, u.length)
        add("section centroid y", m.centroid[1] * L, u.length)
        add("section centroid distance from the axis", m.centroid_distance * L, u.length)
        add("section perimeter", m.perimeter * L, u.length)
    add("boundary length", m.boundary_length * L, u.length)
    add("boundary centroid x", m.boundary_centroid[0] * L, u.length)
    add("boundary centroid y", m.boundary_centroid[1] * L, u.length)
    add("boundary centroid distance from the axis", m.boundary_centroid_distance * L, u.length)
    if m.has_solid:
        add("volume", m.volume * V, u.volume)
    for face, s in shown_faces(m).items():
        add(f"surface: {face}", s * A, u.area)
    add("surface, swept total", m.surface_total * A, u.area)
    if m.cut_face_area is not None:
        add("cut face area (each of two)", m.cut_face_area * A, u.area)
    if m.centre_of_mass_axial is not None:
        add("centre of mass along the axis", m.centre_of_mass_axial * L, u.length)
        add("centre of mass distance from the axis", (m.centre_of_mass_offset or 0.0) * L, u.length)
    if m.mass is not None:
        add("density", m.density / u.si_length ** 3, "kg/m³")
        add("mass", m.mass * M, u.mass)
        add("moment of inertia about the axis", m.inertia_axis * M * L * L, u.inertia_unit())
        add("radius of gyration", m.radius_of_gyration * L, u.length)
    add("volume error estimate", m.volume_error * V, u.volume)
    add("surface error estimate", m.surface_error * A, u.area)
    c = m.crosscheck
    if c is not None:
        check = "cross-check"
        if m.has_solid:
            add("volume, Pappus", m.volume * V, u.volume, check)
            add("volume, washers", c.volume * V, u.volume, check)
            add("volume, relative difference", c.volume_difference, "", check)
        add("surface, Pappus", m.surface_total * A, u.area, check)
        add("surface, quadrature of r ds", c.surface_area * A, u.area, check)
        add("surface, relative difference", c.surface_difference, "", check)
        if tolerance is not None:
            add("agrees within the tolerance", 1.0 if c.agrees(tolerance) else 0.0, "", check)
            add("tolerance", tolerance, "", check)
    return rows


def mesh_rows(mesh, measurement, units, file: Optional[str] = None) -> List[Row]:
    """The figures ``revolve mesh`` reports, as rows ``quantity``, ``value``, ``unit``.

    ``measurement`` (the exact figures) may be None, e.g. for a profile of
    open chains only.

    >>> from revolve.cli.common import output_units
    >>> from revolve.geometry.measure import measure
    >>> from revolve.geometry.mesh import revolve_mesh
    >>> from revolve.geometry.profile import Axis, Loop, Profile, Revolution
    >>> rev = Revolution(Profile(loops=(Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),)), Axis.x())
    >>> rows = mesh_rows(revolve_mesh(rev, 0.01), measure(rev), output_units("mm"))
    >>> {r["quantity"]: r["value"] for r in rows}["open edges"]
    0
    >>> [r["quantity"] for r in rows if "relative" in r["quantity"]]
    ['area, relative difference', 'volume, relative difference']
    """
    u = units
    L, A, V = u.length_factor, u.area_factor, u.volume_factor
    rows: List[Row] = []

    def add(quantity, value, unit=""):
        rows.append({"quantity": quantity, "value": value, "unit": unit})

    if file is not None:
        add("file", file)
    add("triangles", int(len(mesh.triangles)))
    add("vertices", int(len(mesh.vertices)))
    add("angular steps", int(mesh.angular_steps))
    add("chord tolerance", mesh.tolerance * L, u.length)
    add("open edges", mesh.open_edge_count())
    area = mesh.area()
    add("mesh area", area * A, u.area)
    if measurement is not None:
        exact_area = measurement.surface_total + 2 * (measurement.cut_face_area or 0.0)
        add("exact area", exact_area * A, u.area)
        add("area, relative difference", _relative(area, exact_area))
    if mesh.closed:
        vol = mesh.volume()
        add("mesh volume", vol * V, u.volume)
        if measurement is not None and measurement.has_solid:
            add("exact volume", measurement.volume * V, u.volume)
            add("volume, relative difference", _relative(vol, measurement.volume))
    return rows


def _relative(got: float, want: float) -> float:
    return abs(got - want) / abs(want) if want else float("nan")
