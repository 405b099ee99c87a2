"""revolve: exact volumes, surfaces and masses of axisymmetric parts.

The public face: the names a script or notebook calls, listed in ``__all__``
and loaded lazily on first use (a module-level ``__getattr__``), so that
``import revolve`` stays as light as the command line's start-up.

Building profiles
    :class:`Line`, :func:`arc_from_radius`, :func:`arc_from_centre`,
    :func:`curve` (expression text, whitelist-parsed), :class:`Polyline`
    (many points as one array), :class:`Loop` (closed: a section),
    :class:`Chain` (open: a surface only), :class:`Profile`, :class:`Axis`,
    :class:`Revolution`
Files
    :func:`load_profile`, :func:`write_profile`
Measuring
    :func:`measure` (one part; ``to_dict()`` is ``revolve measure --json``),
    :func:`measure_many` (many files, on every core)
Pictures
    :func:`draw` (on a matplotlib Axes)
Trade jobs
    :func:`estimate_coating` (a :class:`CoatingResult`; ``to_dict()`` is
    ``revolve coat --json``),
    :func:`quote_turning` (one part, a :class:`TurningResult`; ``to_dict()`` is
    ``revolve turn --json``),
    :func:`quote_turning_many` (many files, one row per part),
    :func:`build_vessel` (a :class:`VesselResult`; ``revolve vessel --json``),
    :func:`level_table` (forward and inverse, a :class:`LevelResult`;
    ``revolve levels --json``)
Errors
    :class:`RevolveError` (a ``ValueError``; one sentence naming where)

Lengths are in the profile's ``unit`` (default mm); densities carry their
unit (``"7850 kg/m^3"``), a bare number being kg/m³. Every other dimensional
argument of a job (diameters, lengths, steps, levels, volumes, film
thicknesses, times, speeds) takes text with its unit (``"1/8 in"``,
``"500 L"``, ``"75 um"``) or a pint quantity; a bare number is the unit its
function documents (the vessel's ``units``, the level unit, the capacity
unit, µm, mm of a metric bar list) or is refused. Prices say what they are
per (``"2.40/kg"``, ``"85/h"``). Errors are :class:`RevolveError`, one
sentence naming the argument (``density``, ``step``), not the command's option.

Examples
--------
>>> import revolve
>>> ring = revolve.Profile(loops=(revolve.Loop.from_points([(0, 1), (2, 1), (2, 3), (0, 3)]),))
>>> round(revolve.measure(ring).volume, 6)           # π (3² − 1²) · 2 = 16π mm³
50.265482
>>> "measure" in dir(revolve), revolve.__version__ == revolve.__dict__["__version__"]
(True, True)
>>> revolve.measure(ring, density="7850 kg")
Traceback (most recent call last):
...
revolve.errors.UnitError: density: 'kg' is a mass unit, not a density unit
>>> revolve.no_such_name
Traceback (most recent call last):
...
AttributeError: module 'revolve' has no attribute 'no_such_name'
"""

from revolve.errors import RevolveError

#: The one place the version is written (``revolve --version`` and the package metadata read it).
__version__ = "0.1.0"

#: Public name -> the module that defines it (imported on first use).
_LAZY = {
    "Line": "revolve.geometry.segments",
    "Polyline": "revolve.geometry.segments",
    "arc_from_radius": "revolve.geometry.segments",
    "arc_from_centre": "revolve.geometry.segments",
    "curve": "revolve.geometry.constructions",
    "Loop": "revolve.geometry.profile",
    "Chain": "revolve.geometry.profile",
    "Profile": "revolve.geometry.profile",
    "Axis": "revolve.geometry.profile",
    "Revolution": "revolve.geometry.profile",
    "load_profile": "revolve.formats",
    "write_profile": "revolve.formats",
    "measure": "revolve.jobs.measuring",
    "MeasureResult": "revolve.jobs.measuring",
    "measure_many": "revolve.jobs.batch",
    "draw": "revolve.render.drawing",
    "estimate_coating": "revolve.jobs.coating",
    "CoatingResult": "revolve.jobs.coating",
    "quote_turning": "revolve.jobs.turning_quote",
    "quote_turning_many": "revolve.jobs.turning_quote",
    "TurningResult": "revolve.jobs.turning_quote",
    "build_vessel": "revolve.jobs.vessel",
    "VesselResult": "revolve.jobs.vessel",
    "level_table": "revolve.jobs.levels",
    "LevelResult": "revolve.jobs.levels",
}

__all__ = sorted(_LAZY) + ["RevolveError", "__version__"]


def __getattr__(name):
    module = _LAZY.get(name)
    if module is None:
        raise AttributeError(f"module {__name__!r} has no attribute {name!r}")
    import importlib

    value = getattr(importlib.import_module(module), name)
    globals()[name] = value
    return value


def __dir__():
    return sorted(set(globals()) | set(__all__))
