"""Anchors, file names and URLs of the generated pages.

Links are written as relative ``.md`` paths, which mkdocs rewrites for ``use_directory_urls``;
inside the raw HTML blocks (tables, lists, "Cited for" lines) mkdocs rewrites nothing, so there
:func:`href` writes the URL of the built site (``use_directory_urls: true``, as in mkdocs.yml).
Anchors are ``id`` attributes in those blocks and ``{#id}`` on headings; hand-written pages and
the search link to them.
"""

import functools
import posixpath
import re


def _slug(text, charges=False):
    """Anchor-safe slug of an id: 'seawater-flowing' -> 'seawater-flowing'; with ``charges``
    (couple and ion ids) '+' and '-' are charge signs: 'Fe3+/Fe2+' -> 'fe3p-fe2p', 'OH-' -> 'ohm'."""
    out = []
    for ch in str(text):
        if ch.isascii() and ch.isalnum():
            out.append(ch.lower())
        elif charges and ch == "+":
            out.append("p")
        elif charges and ch == "-":
            out.append("m")
        elif ch in "^":
            continue
        else:
            out.append("-")
    slug = re.sub(r"-+", "-", "".join(out)).strip("-")
    return slug or "x"


def source_anchor(source_id):
    """Anchor of a source on the bibliography page: ``src-<id>``.

    >>> source_anchor("crc-vanysek")
    'src-crc-vanysek'
    """
    return "src-" + re.sub(r"[^a-z0-9-]+", "-", str(source_id).lower()).strip("-")


def couple_anchor(couple_id):
    """Anchor of a half-reaction on the series page: ``hr-<slug>``.

    >>> couple_anchor("Fe3+/Fe2+")
    'hr-fe3p-fe2p'
    """
    return "hr-" + _slug(couple_id, charges=True)


def ion_anchor(species):
    """Anchor of an ion on the ion-size page: ``ion-<slug>``.

    >>> ion_anchor("SO4^2-")
    'ion-so42m'
    """
    return "ion-" + _slug(species, charges=True)


def electrode_anchor(electrode_id):
    """Anchor of a reference electrode on the electrodes page."""
    return "ref-" + _slug(electrode_id)


def environment_anchor(env_id):
    """Anchor of an environment on the environments page."""
    return "env-" + _slug(env_id)


def cp_anchor(criterion_id):
    """Anchor of a CP criterion on the criteria page: ``cp-<slug>``."""
    return "cp-" + _slug(criterion_id)


def cp_structure_anchor(structure_id):
    """Anchor of a structure's section on the criteria page: ``cp-structure-<slug>``."""
    return "cp-structure-" + _slug(structure_id)


def material_file(material_id):
    """File name of a material's page inside ``reference/materials/``.

    >>> material_file("stainless-316-passive")
    'stainless-316-passive.md'
    """
    name = re.sub(r"[^a-z0-9-]+", "-", str(material_id).lower()).strip("-") or "material"
    return ("material-" + name if name == "index" else name) + ".md"


def page_url(doc):
    """The URL (relative to the site root) of a doc path with ``use_directory_urls``.

    >>> page_url("reference/materials/index.md"), page_url("reference/series.md"), page_url("a/b.svg")
    ('reference/materials/', 'reference/series/', 'a/b.svg')
    """
    if not doc.endswith(".md"):
        return doc
    stem = doc[:-3]
    if stem == "index" or stem.endswith("/index"):
        return stem[:-5]
    return stem + "/"


@functools.lru_cache(maxsize=65536)
def href(link, doc):
    """A Markdown link target written on the page ``doc`` (a relative ``.md`` path, maybe with an
    anchor) as the relative URL mkdocs would write for it.

    >>> href("../sources.md#src-x", "reference/materials/zinc.md")
    '../../sources/#src-x'
    >>> href("materials/index.md", "reference/series.md"), href("#hr-x", "reference/series.md")
    ('../materials/', '#hr-x')
    """
    if link.startswith("#") or re.match(r"^[a-z][a-z0-9+.-]*:", link):
        return link
    target, hash_, anchor = link.partition("#")
    resolved = posixpath.normpath(posixpath.join(posixpath.dirname(doc), target))
    url = page_url(resolved)
    here = page_url(doc)
    base = here if here.endswith("/") else posixpath.dirname(here) + "/"
    rel = posixpath.relpath(url or ".", base.rstrip("/") or ".")
    if url.endswith("/") or not url:
        rel = "./" if rel == "." else rel + "/"
    return rel + hash_ + anchor


def relative(doc, to):
    """The relative ``.md`` link from the page ``doc`` to the doc path ``to``.

    >>> relative("reference/materials/zinc.md", "reference/sources.md")
    '../sources.md'
    """
    return posixpath.relpath(to, posixpath.dirname(doc))
