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
from html.parser import HTMLParser

import pytest
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


class HtmlPage(HTMLParser):
    """A page read with the standard library's html.parser: its tables in page order as
    ``(key, rows of cell texts)`` (the key is the table's ``data-key``, else its class), and
    every tag, attribute and piece of text seen."""

    def __init__(self):
        super().__init__(convert_charrefs=True)
        self.tables, self.tags, self.attrs, self.text = [], [], [], []
        self._rows, self._row, self._cell = None, None, None

    def handle_starttag(self, tag, attrs):
        a = dict(attrs)
        self.tags.append(tag)
        self.attrs.extend((tag, k, v) for k, v in attrs)
        if tag == "table":
            self._rows = []
            self.tables.append((a.get("data-key") or a.get("class"), self._rows))
        elif tag == "tr" and self._rows is not None:
            self._row = []
            self._rows.append(self._row)
        elif tag in ("td", "th") and self._row is not None:
            self._cell = []

    def handle_endtag(self, tag):
        if tag in ("td", "th") and self._cell is not None:
            self._row.append("".join(self._cell).strip())
            self._cell = None
        elif tag == "table":
            self._rows = None

    def handle_data(self, data):
        self.text.append(data)
        if self._cell is not None:
            self._cell.append(data)

    def table(self, key, occurrence=0):
        """Rows of the table with this key (the first, or the ``occurrence``-th)."""
        return [rows for k, rows in self.tables if k == key][occurrence]


@pytest.fixture
def html_page():
    """A function that reads HTML text into an :class:`HtmlPage` (the report tests' parser)."""
    def read(text: str) -> HtmlPage:
        page = HtmlPage()
        page.feed(text)
        page.close()
        return page
    return read
