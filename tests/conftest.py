"""Settings shared by the whole test suite.

Property tests run under a hypothesis settings profile chosen by the environment:

- ``fixed`` (the default, and always under CI): derandomised, so every run of the suite tries
  exactly the same examples, and no example database, so nothing a previous run found can
  change what this run does. A fresh clone and the hundredth run behave the same.
- ``explore`` (``HYPOTHESIS_PROFILE=explore``): a random search with the example database,
  for looking for new counterexamples on a developer's machine. Anything it finds is turned
  into an explicit ``@example`` beside its test before it is committed.

Per-test ``@settings(max_examples=...)`` keep their own example counts in both profiles; the
profile only decides randomness and storage.
"""

from __future__ import annotations

import os

from hypothesis import HealthCheck, settings
from hypothesis.database import DirectoryBasedExampleDatabase

settings.register_profile(
    "fixed",
    derandomize=True,
    database=None,
    deadline=None,
    print_blob=True,
    suppress_health_check=[HealthCheck.too_slow],
)
settings.register_profile(
    "explore",
    derandomize=False,
    database=DirectoryBasedExampleDatabase(".hypothesis/examples"),
    deadline=None,
    print_blob=True,
    suppress_health_check=[HealthCheck.too_slow],
)

_chosen = os.environ.get("HYPOTHESIS_PROFILE", "fixed")
if os.environ.get("CI"):
    _chosen = "fixed"  # CI never depends on luck or on what an earlier run stored
settings.load_profile(_chosen)
