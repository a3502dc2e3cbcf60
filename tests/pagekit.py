"""Shared by the page tests: write generated reference pages into a docs folder for mkdocs."""

import os

from sitebuild import charts


def write_docs(docs, out, bundle):
    """Write the generated pages ``out`` (path -> text), the galvanic-series chart of ``bundle`` and
    a home page into the folder ``docs``."""
    for path, text in out.items():
        full = os.path.join(docs, path)
        os.makedirs(os.path.dirname(full), exist_ok=True)
        with open(full, "w", encoding="utf-8") as fh:
            fh.write(text)
    with open(os.path.join(docs, charts.CHART_PATH), "w", encoding="utf-8") as fh:
        fh.write(charts.galvanic_series_svg(bundle))
    with open(os.path.join(docs, "index.md"), "w", encoding="utf-8") as fh:
        fh.write("# Home\n")
