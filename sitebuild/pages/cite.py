"""Sources: the link and confidence mark of every value, citation lines, the bibliography page.

Every value links to its source's anchor on ``reference/sources.md`` (``#src-<id>``); values
recalled rather than read carry :data:`RECALLED`, values computed here :data:`COMPUTED`, values
read carry the place they were read (:func:`where_text`). The bibliography lists, under each
source, what the other pages cited it for, so it is written last.
"""

from .links import source_anchor
from .text import Md

#: the badge on a value recalled from its source and not re-read (defined once, used everywhere)
RECALLED = Md('<abbr class="cw-recalled" title="recalled: this value was not re-read in the cited source; '
              'check it there before relying on it">(r)</abbr>')
#: the badge on a value computed here from other published values
COMPUTED = Md('<abbr class="cw-computed" title="computed: derived here from published values '
              '(see the source note)">(c)</abbr>')
_BADGES = {"recalled": Md(" ") + RECALLED, "computed": Md(" ") + COMPUTED}
SOURCES_PAGE = "reference/sources.md"


def _citation_of(rec, prefix, parent):
    """(source id, confidence, where) of the value ``prefix`` of ``rec``: its own
    ``<prefix>_source``/``_confidence``, else the record's, else its parent's; the place read
    (``_where``/``where``) comes with the confidence it belongs to."""
    sid = rec.get(f"{prefix}_source") if prefix else None
    conf = rec.get(f"{prefix}_confidence") if prefix else None
    where = rec.get(f"{prefix}_where") if conf is not None else None
    sid = sid if sid is not None else rec.get("source")
    if conf is None:
        conf, where = rec.get("confidence"), rec.get("where")
    if sid is None and parent is not None:
        sid = parent.get("source")
        if conf is None:
            conf, where = parent.get("confidence"), parent.get("where")
    return sid, conf, where


def where_text(where):
    """Where a read value was read, as shown beside its source link: `` (Table 1, row Zn2+/Zn)``.

    >>> where_text("Table 1, row <Zn>"), where_text(None)
    (Md(' <span class="cw-where" title="where it was read">(Table 1, row &#60;Zn&#62;)</span>'), Md(''))
    """
    if not isinstance(where, str) or not where.strip():
        return Md()
    return Md(' <span class="cw-where" title="where it was read">({})</span>').format(where)


class Citations:
    """The sources by id, and what each was cited for on the pages written so far."""

    def __init__(self, sources):
        self.sources = {s.get("id"): s for s in sources if isinstance(s.get("id"), str)}
        self.cited = {}  # source id -> list of (what, link from sources.md)

    def cite(self, page, rec, prefix, *, what=None, link=None, parent=None):
        """' [src](…#src-id) (r)' for the value ``prefix`` of a record; registers the citation.

        Args:
            page: the page the value is written on [unitless]
            rec: the record; its ``<prefix>_source`` / ``<prefix>_confidence``, else its
                ``source`` / ``confidence``, else those of ``parent`` [unitless]
            prefix: the value's field prefix, "" for the record's own source [unitless]
            what: what the source is cited for, listed on the bibliography (None: not listed) [unitless]
            link: the link from the bibliography to the value [unitless]
            parent: the record that holds ``rec`` [unitless]
        """
        sid, conf, where = _citation_of(rec, prefix, parent)
        if sid is None:
            return Md()
        if what:
            self.cited.setdefault(sid, []).append((what, link))
        target = f"{page.to(SOURCES_PAGE)}#{source_anchor(sid)}"
        return Md(" ") + page.a(sid, target) + _BADGES.get(conf, Md()) + where_text(where)

    def cited_for(self, page, sid):
        """The links to what the source ``sid`` was cited for, each once."""
        seen, items = set(), []
        for what, link in self.cited.get(sid, []):
            if (what, link) not in seen:
                seen.add((what, link))
                items.append(page.a(what, link) if link else Md.escape(what))
        return items


def citation_short(s, source_id=None):
    """A cited document's designation (e.g. ``ISO 15589-1:2015``), or its title and year (escaped).

    >>> citation_short({"container": "EN 12954:2001", "title": "x"})
    Md('EN 12954&#58;2001')
    """
    if not s:
        return Md.escape(source_id)
    if s.get("container"):
        return Md.escape(s["container"])
    return Md.escape(s.get("title") or source_id) + (Md(", {}").format(s["year"]) if s.get("year") else Md())


def citation(s):
    """One source record as a citation line (escaped).

    >>> citation({"author": "A. Author", "title": "On <x>", "year": 1989})
    Md('A. Author. <cite>On &#60;x&#62;</cite>, 1989.')
    """
    if not s:
        return Md("(not in the bibliography)")
    parts = []
    if s.get("author"):
        parts.append(Md.escape(s["author"]))
    if s.get("title"):
        parts.append(Md("<cite>{}</cite>").format(s["title"]))
    if s.get("container"):
        parts.append(Md("in {}").format(s["container"]))
    for key, fmt in (("edition", "{} edition"), ("volume", "vol. {}"), ("pages", "pp. {}"),
                     ("publisher", "{}"), ("year", "{}")):
        if s.get(key) is not None:
            parts.append(Md(fmt).format(s[key]))
    text = Md(". ").join(parts[:2]) + (Md(", ") + Md(", ").join(parts[2:]) if parts[2:] else Md()) + Md(".")
    if s.get("table"):
        text += Md(" {}.").format(s["table"])
    if s.get("doi"):
        text += Md(" DOI {}.").format(s["doi"])
    if s.get("url"):
        text += Md(" {}").format(s["url"])
    return text


def bibliography(site):
    """The page of sources, each with its citation, note and what the other pages cited it for."""
    page = site.page(SOURCES_PAGE)
    entries = []
    for s in site.recs("sources"):
        sid = s.get("id")
        used = site.citations.cited_for(page, sid)
        entries.append({"id": sid, "anchor": source_anchor(sid), "citation": citation(s), "note": s.get("note"),
                        "cited_for": Md("Cited for: ") + Md("; ").join(used) + Md(".") if used else None})
    return page.render("sources.md.j2", entries=entries)
