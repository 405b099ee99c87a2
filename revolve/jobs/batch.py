"""Many parts in one run: the same per-part work over many files, on every core.

:func:`run_many` applies one task to many inputs and returns one
:class:`PartResult` per input, in input order. A part whose input is refused
(any :class:`~revolve.errors.RevolveError`: a bad file, a profile the engine
cannot revolve) gives a result that carries the one-sentence error; the other
parts are never lost. Below :data:`SERIAL_BELOW` parts the work runs in this
process (a pool costs more than it saves); from there on a standard-library
process pool with one worker per core takes the inputs in chunks, so that the
cost of handing work to a worker is paid once per chunk, not once per part.
The results are the same either way: each part is computed by the same
function from the same input.

:func:`run_many` is :func:`iter_many` collected in a list; the iterator gives
each result as soon as it and those before it are ready, holding only a few
chunks at a time, so that a long run can write its rows as they come.

:func:`measure_many` (and :func:`iter_measure`) is ``revolve measure`` over many
files: the command line calls :func:`iter_measure` with a ``convert`` step
that runs in the workers and turns each part into its output row there
(JSON line, table cells, CSV row), so that only small plain data comes back
and the parent only writes. ``revolve turn`` runs its parts through
:func:`run_many` the same way, each file read once by its part's task.

Examples
--------
>>> import os, tempfile
>>> folder = tempfile.mkdtemp()
>>> path = os.path.join(folder, "ring.txt")
>>> with open(path, "w") as f:
...     _ = f.write("0,1\\n2,1\\n2,3\\n0,3\\n")
>>> results = measure_many([path, os.path.join(folder, "gone.txt")], units="mm")
>>> [r.ok for r in results]
[True, False]
>>> round(results[0].value.measurement.volume, 6)     # π (3² − 1²) · 2 = 16π
50.265482
>>> print(results[1].error)                            # doctest: +ELLIPSIS
/...gone.txt: no such file; check the name and folder
>>> measure_many([])
[]
"""

from __future__ import annotations

import dataclasses
import itertools
import math
import os
from collections import deque
from dataclasses import dataclass
from typing import Any, Callable, Iterator, List, Optional, Sequence

from revolve.errors import RevolveError

#: Below this many parts the work runs in this process: starting a pool (tens of ms) and handing
#: out the work would cost about what it saves at a few ms per part.
SERIAL_BELOW = 32

#: Chunks per worker: enough to balance uneven parts, few enough that each hand-over is cheap.
CHUNKS_PER_WORKER = 4

#: Largest chunk (parts handed to a worker at once), so that progress is seen on long runs.
LARGEST_CHUNK = 256


@dataclass(frozen=True)
class PartResult:
    """What one part gave: its value, or the one-sentence error that stopped it.

    Examples
    --------
    >>> PartResult("a.toml", value=3).ok, PartResult("b.toml", error="b.toml: not closed").ok
    (True, False)
    """

    file: str
    value: Any = None
    error: Optional[str] = None

    @property
    def ok(self) -> bool:
        return self.error is None


def _run_one(task: Callable[[Any], Any], item: Any) -> PartResult:
    file = item if isinstance(item, str) else item[0]
    try:
        return PartResult(file, value=task(item))
    except RevolveError as e:
        return PartResult(file, error=str(e.located(file=file)))


def _run_chunk(task: Callable[[str], Any], items: Sequence[str]) -> List[PartResult]:
    return [_run_one(task, item) for item in items]


def chunk_size(count: int, workers: int) -> int:
    """Parts handed to a worker at once: about :data:`CHUNKS_PER_WORKER` chunks per worker.

    Examples
    --------
    >>> chunk_size(1000, 2), chunk_size(10**6, 8), chunk_size(3, 4), chunk_size(0, 2)
    (125, 256, 1, 1)
    """
    return max(1, min(LARGEST_CHUNK, math.ceil(count / (max(1, workers) * CHUNKS_PER_WORKER))))


def check_workers(workers: Optional[int], option: str = "--workers") -> None:
    """Refuse a number of worker processes below 1 (``--workers``).

    Examples
    --------
    >>> check_workers(None), check_workers(2)
    (None, None)
    >>> check_workers(0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --workers: give a whole number of at least 1, got 0
    """
    if workers is not None and workers < 1:
        raise RevolveError(f"give a whole number of at least 1, got {workers}", option=option)


def run_many(task: Callable[[Any], Any], items: Sequence[Any], *, workers: Optional[int] = None,
             serial_below: int = SERIAL_BELOW,
             progress: Optional[Callable[[int], None]] = None,
             chunk: Optional[int] = None) -> List[PartResult]:
    """Apply ``task`` to every item; one :class:`PartResult` per item, in input order.

    Parameters
    ----------
    task : callable
        ``task(item) -> value``; it must be picklable (a module-level function,
        a ``functools.partial`` of one, or a frozen dataclass with
        ``__call__``) when a pool is used. A :class:`RevolveError` it raises
        becomes that item's error, located in the item's file.
    items : sequence
        File names, or tuples whose first element is a file name (the rest
        is for the task), each handed to ``task`` as it is.
    workers : int, optional
        Worker processes; default ``os.cpu_count()``. 1 runs in this process.
    serial_below : int
        Fewer items than this run in this process (default :data:`SERIAL_BELOW`).
    progress : callable, optional
        Called with the number of items just finished, as they finish.
    chunk : int, optional
        Items handed to a worker at once; default :func:`chunk_size`.

    Returns
    -------
    list of PartResult

    Examples
    --------
    >>> run_many(len, ["ab", "abc"])
    [PartResult(file='ab', value=2, error=None), PartResult(file='abc', value=3, error=None)]
    >>> run_many(len, [])
    []
    >>> run_many(len, ["a"], workers=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: --workers: give a whole number of at least 1, got 0
    """
    return list(iter_many(task, items, workers=workers, serial_below=serial_below,
                          progress=progress, chunk=chunk))


def iter_many(task: Callable[[Any], Any], items: Sequence[Any], *,
              workers: Optional[int] = None, serial_below: int = SERIAL_BELOW,
              progress: Optional[Callable[[int], None]] = None,
              chunk: Optional[int] = None) -> Iterator[PartResult]:
    """:func:`run_many` as an iterator: results in input order, as soon as they are ready.

    A long run can write each part's row as it comes, holding only a few
    chunks in memory: at most :data:`CHUNKS_PER_WORKER` chunks per worker are
    handed out ahead of the one being read. The settings are checked at
    once, before any part is read.

    Examples
    --------
    >>> [r.value for r in iter_many(str.upper, ["a.toml", "b.toml"])]
    ['A.TOML', 'B.TOML']
    """
    items = list(items)
    check_workers(workers)
    if workers is None:
        workers = os.cpu_count() or 1
    if workers <= 1 or len(items) < max(2, serial_below):
        return _serial(task, items, progress)
    return _pooled(task, items, workers, progress,
                   chunk_size(len(items), workers) if chunk is None else max(1, int(chunk)))


def _serial(task, items, progress) -> Iterator[PartResult]:
    for item in items:
        result = _run_one(task, item)
        if progress is not None:
            progress(1)
        yield result


def _pooled(task, items, workers: int, progress, size: int) -> Iterator[PartResult]:
    from concurrent.futures import ProcessPoolExecutor  # only when a pool is used: start-up

    chunks = iter([items[i:i + size] for i in range(0, len(items), size)])
    count = math.ceil(len(items) / size)
    pool = ProcessPoolExecutor(max_workers=min(workers, count))
    try:
        window = deque()
        for chunk in itertools.islice(chunks, workers * CHUNKS_PER_WORKER):
            window.append((pool.submit(_run_chunk, task, chunk), len(chunk)))
        while window:
            future, n = window.popleft()
            results = future.result()
            following = next(chunks, None)
            if following is not None:
                window.append((pool.submit(_run_chunk, task, following), len(following)))
            if progress is not None:
                progress(n)
            yield from results
    finally:
        pool.shutdown(wait=True, cancel_futures=True)


# -- measuring many files ------------------------------------------------------------------


from revolve.jobs.measuring import PartMeasurement  # noqa: E402
from revolve.materials import density_value  # noqa: E402


@dataclass(frozen=True)
class MeasureTask:
    """How to measure one file: the settings shared by every part of a batch (picklable).

    Each setting left as None comes from the file, else the default: the
    axis (an :class:`~revolve.geometry.profile.Axis`) from the file's
    ``[axis]``, else the sketch x axis; the angle in degrees from the file,
    else 360; the density (kg/m³, with ``density_label``) from the file's
    ``material`` or ``density``, else none; ``units`` is the length unit of
    files that do not say (plain point lists), default mm. ``convert``, if
    given, is applied to the :class:`PartMeasurement` where it was computed
    (in the worker) and its value returned instead.

    Examples
    --------
    >>> import os, tempfile
    >>> path = os.path.join(tempfile.mkdtemp(), "p.txt")
    >>> with open(path, "w") as f:
    ...     _ = f.write("0,1\\n2,1\\n2,3\\n0,3\\n")
    >>> part = MeasureTask(angle=90.0, density=1000.0, density_label="water")(path)
    >>> round(part.measurement.volume, 6), round(part.measurement.mass, 9)   # 16π/4 mm³, × 1e-6 kg
    (12.566371, 1.2566e-05)
    >>> MeasureTask(angle=400.0)(path)
    Traceback (most recent call last):
    ...
    revolve.errors.ProfileError: --angle: the revolution angle must be above 0 and at most 360 degrees, got 400
    """

    axis: Any = None
    angle: Optional[float] = None
    units: Optional[str] = None
    density: Optional[float] = None
    density_label: Optional[str] = None
    convert: Optional[Callable[[PartMeasurement], Any]] = None
    #: Keep exact values where a reader would not otherwise (a point list's Fractions), for --exact.
    exact: bool = False

    def __call__(self, path: str) -> Any:
        part = measure_part(path, self)
        return part if self.convert is None else self.convert(part)


def measure_part(path: str, task: MeasureTask = MeasureTask()) -> PartMeasurement:
    """Read one file and measure its revolution under ``task``'s settings.

    Errors are located in the file (or name the option that caused them,
    ``--angle``); see :class:`MeasureTask` for the rules and an example.
    """
    from revolve.formats import load_profile
    from revolve.jobs.measuring import measure_document

    doc = load_profile(path, unit=task.units, exact=task.exact)
    part = measure_document(doc, axis=task.axis, angle=task.angle, density=task.density,
                            density_label=task.density_label)
    return part if part.file else dataclasses.replace(part, file=path)


def check_units(units: Optional[str], option: str = "--units") -> None:
    """Refuse, once and before any file is read, a ``units`` that is not a length unit.

    Examples
    --------
    >>> check_units(None), check_units("in")
    (None, None)
    >>> check_units("gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    if units is None:
        return
    from revolve import units as registry
    from revolve.errors import UnitError

    try:
        registry.factor(units, "length")
    except UnitError as e:
        raise e.located(option=option)


def measure_many(paths: Sequence[str], *, axis=None, angle: Optional[float] = None,
                 units: Optional[str] = None, density: Any = None,
                 density_label: Optional[str] = None,
                 convert: Optional[Callable[[PartMeasurement], Any]] = None,
                 workers: Optional[int] = None, serial_below: int = SERIAL_BELOW,
                 progress: Optional[Callable[[int], None]] = None) -> List[PartResult]:
    """Measure every file; one :class:`PartResult` per file, in the order given.

    Parameters
    ----------
    paths : sequence of str
        Profile files (any format :func:`revolve.formats.load_profile` reads).
    axis : Axis, optional
        Default: each file's axis, else the sketch x axis.
    angle : float, optional
        Revolution angle in degrees; default: each file's, else 360.
    units : str, optional
        Length unit of files that do not say (plain point lists); default mm.
    density : str, pint quantity or float, optional
        Density with its unit (``"7850 kg/m^3"``, ``"7.85 g/cm^3"`` or a pint
        quantity); a bare number is kg/m³ (as ``--density 7850`` on the
        command line), never per cubed profile unit. For every part; default: each
        file's ``material`` or ``density``, else no mass. ``density_label``
        says where it came from, for the results.
    convert : callable, optional
        Applied to each :class:`PartMeasurement` where it is computed (in the
        worker); its value is returned instead. Must be picklable.
    workers, serial_below, progress
        As for :func:`run_many`.

    Returns
    -------
    list of PartResult
        Each value a :class:`PartMeasurement` (or what ``convert`` made of
        it); a file that is refused gives its error instead, and the others
        are still measured.

    See the module's examples.

    Examples
    --------
    Errors name the library's arguments; no file given is no row:

    >>> measure_many([])
    []
    >>> measure_many(["a.txt"], units="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: units: 'gallon' is a volume unit, not a length unit
    >>> measure_many(["a.txt"], workers=0)
    Traceback (most recent call last):
    ...
    revolve.errors.RevolveError: workers: give a whole number of at least 1, got 0
    """
    check_units(units, option="units")
    check_workers(workers, option="workers")
    return list(iter_measure(paths, axis=axis, angle=angle, units=units, density=density,
                             density_label=density_label, convert=convert, workers=workers,
                             serial_below=serial_below, progress=progress))


def iter_measure(paths: Sequence[str], *, axis=None, angle: Optional[float] = None,
                 units: Optional[str] = None, density: Any = None,
                 density_label: Optional[str] = None,
                 convert: Optional[Callable[[PartMeasurement], Any]] = None,
                 workers: Optional[int] = None, serial_below: int = SERIAL_BELOW,
                 progress: Optional[Callable[[int], None]] = None) -> Iterator[PartResult]:
    """:func:`measure_many` as an iterator, in input order (``revolve measure`` over many files).

    The settings are checked at once; the parts are read as the iterator is
    consumed, so a long run holds only a few chunks of results at a time.

    Examples
    --------
    >>> iter_measure(["a.txt"], units="gallon")
    Traceback (most recent call last):
    ...
    revolve.errors.UnitError: --units: 'gallon' is a volume unit, not a length unit
    """
    check_units(units)
    if density is not None and density_label is None:
        density, density_label = density_value(density)
    task = MeasureTask(axis=axis, angle=angle, units=units, density=density,
                       density_label=density_label, convert=convert)
    return iter_many(task, [os.fspath(p) for p in paths], workers=workers,
                     serial_below=serial_below, progress=progress)
