"""Reference pages generated from the dataset bundle at build time.

:func:`generate_pages` maps doc paths (relative to ``docs/``) to Markdown, written with the
Jinja2 templates of ``templates/`` (see :mod:`.kit`). The mkdocs hook adds them as generated
files, so they are never committed. Rules the pages keep:

- every data string is escaped (:func:`esc`, the templates' autoescape): data is text, never
  HTML or Markdown, so a ``<script>`` in a note shows literally;
- every value carries a link to its source's anchor on ``reference/sources.md``
  (``#src-<id>``), values recalled rather than read carry the :data:`RECALLED` badge, and
  values read carry the place they were read (``_where``) beside the link;
- ``reference/data-quality.md`` counts the flags by file and kind of value and lists the
  values still recalled;
- links are relative ``.md`` links, which mkdocs rewrites for ``use_directory_urls``;
- titles carry names, UNS numbers and couple ids so the built-in search finds them.
"""

from .cite import COMPUTED, RECALLED, bibliography, citation, citation_short
from .cp import PROVISIONAL, cp_criteria_page
from .electrodes import electrodes_page, model_text
from .environments import environments_page
from .gibbs import gibbs_page
from .kit import _TITLE_SAFE, Site, with_title
from .links import (_slug, couple_anchor, electrode_anchor, environment_anchor, href, material_file, page_url,
                    source_anchor)
from .materials import galvanic_series, material_pages, materials_index
from .quality import quality_page
from .series import HYPOTHETICAL, ions_page, reaction_html, series_page, species_html
from .text import esc

__all__ = ["COMPUTED", "HYPOTHETICAL", "PROVISIONAL", "RECALLED", "_TITLE_SAFE", "_slug", "citation",
           "citation_short", "couple_anchor", "electrode_anchor", "environment_anchor", "esc", "generate_pages",
           "href", "material_file", "model_text", "page_url", "reaction_html", "source_anchor", "species_html",
           "with_title"]


def generate_pages(bundle, raw_html=True):
    """Every generated reference page of a dataset bundle.

    Args:
        bundle: the validated dataset bundle (see ``sitebuild.dataset.load_bundle``) [unitless]
        raw_html: write tables, lists and "Cited for" lines as raw HTML blocks (what the site
            uses, see :mod:`sitebuild.pages.kit`); False gives the plain Markdown they stand for [unitless]

    Returns:
        dict doc path (relative to ``docs/``) -> Markdown text
    """
    site = Site(bundle, html=raw_html)
    pages = {"reference/series.md": series_page(site)}
    pages.update(material_pages(site))
    pages["reference/materials/index.md"] = materials_index(site)
    pages["reference/electrodes.md"] = electrodes_page(site)
    pages["reference/environments.md"] = environments_page(site)
    pages["reference/ions.md"] = ions_page(site)
    pages["reference/gibbs-energies.md"] = gibbs_page(site)
    pages["reference/galvanic-series.md"] = galvanic_series(site)
    pages["reference/cp-criteria.md"] = cp_criteria_page(site)
    pages["reference/data-quality.md"] = quality_page(site)
    pages["reference/sources.md"] = bibliography(site)  # last: it lists what every other page cited
    return pages
