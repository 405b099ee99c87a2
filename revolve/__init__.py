"""revolve: exact volumes, surfaces and masses of axisymmetric parts.

The package is layered: ``revolve.geometry`` is pure math (no I/O),
``revolve.formats`` reads and writes files, ``revolve.jobs`` holds the trade
calculations and ``revolve.cli`` the command line. Heavy libraries (scipy,
sympy, pint, matplotlib) are imported only where a computation needs them, so
that a small line-and-arc profile is measured quickly.
"""

from revolve.errors import RevolveError

__all__ = ["RevolveError", "__version__"]
__version__ = "0.1.0"
