"""The page kit: the Jinja2 templates, and what one page writes into its tables and lists.

The templates (``templates/*.md.j2``) write the pages as Markdown: headings (the table of
contents, the permalinks and the search are made from them), prose, and the tables, bullet lists
and "Cited for" lines of ``_blocks.md.j2``. Those blocks come in two forms:

- the site's form (``html=True``): raw HTML blocks, as Python-Markdown would make of the
  Markdown form. Python-Markdown passes a raw block through instead of running its inline
  patterns over every cell, which made the generated pages the costliest part of the build. mkdocs
  does not rewrite links inside raw HTML, so :meth:`Page.a` writes the URLs of the built site;
- the plain Markdown form (``html=False``) they stand for; a test builds both and compares.

Autoescape is on: a value a template writes is escaped with :func:`esc` unless it is page text
already (:class:`~.text.Md`, a macro's output).
"""

import html
import json
import os
import re

import jinja2

from .cite import COMPUTED, RECALLED, Citations
from .links import href, relative
from .text import Md, attr, code_text

def heading_id(anchor):
    """The attr_list suffix that gives a heading its anchor: ``{#anchor}`` (``{#`` opens a comment
    in a template, so the templates call this)."""
    return Md("{#" + attr(anchor) + "}")


TEMPLATES = os.path.join(os.path.dirname(os.path.abspath(__file__)), "templates")

ENV = jinja2.Environment(
    loader=jinja2.FileSystemLoader(TEMPLATES),
    autoescape=True,
    finalize=Md.escape,
    undefined=jinja2.StrictUndefined,
    trim_blocks=True,
    lstrip_blocks=True,
    keep_trailing_newline=True,
)
ENV.globals.update(RECALLED=RECALLED, COMPUTED=COMPUTED, heading_id=heading_id)


class Site:
    """One writing of the pages: the bundle, the form of the blocks, the citations so far.

    Args:
        bundle: the validated dataset bundle [unitless]
        html: write tables, lists and "Cited for" lines as raw HTML blocks [unitless]
    """

    def __init__(self, bundle, html=True):
        self.bundle = bundle
        self.html = html
        self.citations = Citations(self.recs("sources"))

    def recs(self, kind):
        """The records of one kind that are mappings (a damaged record is left out, not fatal)."""
        return [r for r in self.bundle.get(kind, []) or [] if isinstance(r, dict)]

    def names(self, kind):
        """id -> name of the records of one kind (e.g. ``cp_structures``)."""
        return {r.get("id"): r.get("name") for r in self.recs(kind) if r.get("name")}

    def page(self, doc):
        """The writer of the page ``doc`` (a path relative to ``docs/``)."""
        return Page(self, doc)


class Page:
    """What one page writes inside its blocks: links, strong text, code, anchors, citations."""

    def __init__(self, site, doc):
        self.site = site
        self.doc = doc
        self.html = site.html

    def to(self, doc):
        """The relative ``.md`` link from this page to the doc path ``doc``."""
        return Md(relative(self.doc, doc))

    def a(self, text, target):
        """A link inside a block: ``text`` (escaped unless page text) to a relative ``.md`` target."""
        if self.html:
            return Md('<a href="{}">{}</a>').format(Md(attr(href(str(target), self.doc))), text)
        return Md("[{}]({})").format(text, Md(target))

    def strong(self, text):
        """Strong text inside a block."""
        return Md("<strong>{}</strong>" if self.html else "**{}**").format(text)

    def code(self, text):
        """A code span inside a block (shows the text literally)."""
        if self.html:
            return Md("<code>" + html.escape(code_text(text).strip(), quote=False) + "</code>")
        return Md("`" + code_text(text) + "`")

    @staticmethod
    def span(anchor):
        """An empty anchor element: ``<span id="..."></span>`` (anchors are slugs)."""
        return Md('<span id="{}"></span>').format(Md(attr(anchor)))

    def cite(self, rec, prefix, *, what=None, link=None, parent=None):
        """' [source](…sources.md#src-id) (r)' for the value ``prefix`` of ``rec`` (see
        :meth:`.cite.Citations.cite`)."""
        return self.site.citations.cite(self, rec, prefix, what=what, link=link, parent=parent)

    def render(self, template, **context):
        """The page from its template (a name in ``templates/`` or a template of :data:`ENV`),
        with its title as front matter."""
        meta = {"version": self.site.bundle.get("version", "unversioned"), "date": self.site.bundle.get("date", "")}
        text = ENV.get_template(template).render(page=self, html=self.html, **meta, **context)
        return with_title(_BLANK_LINES_RE.sub("\n\n", text).rstrip("\n") + "\n")


_BLANK_LINES_RE = re.compile(r"\n{3,}")  # the blocks stand between blank lines; one is enough
_TITLE_SAFE = str.maketrans({"<": "‹", ">": "›", "&": "+", '"': "”", "'": "’", "`": "’", "\\": "/"})


def with_title(markdown_text):
    """Front matter with the page title as plain text.

    mkdocs takes a page's title from its first heading with character references decoded and
    the theme writes it into ``<title>`` unescaped, so data text in a heading could close the
    element. The front-matter title wins over the heading: it carries the same words with the
    characters that HTML would read as markup replaced by look-alikes.

    >>> with_title("# Zinc &#60;b&#62;\\n\\ntext").split("\\n")[1]
    'title: "Zinc ‹b›"'
    """
    first = markdown_text.split("\n", 1)[0]
    if not first.startswith("# "):
        return markdown_text
    plain = html.unescape(re.sub(r"<[^>]*>", "", first[2:]))
    plain = plain.translate(_TITLE_SAFE)
    plain = re.sub(r"\s+", " ", plain).strip()
    return "---\ntitle: " + json.dumps(plain, ensure_ascii=False) + "\n---\n\n" + markdown_text
