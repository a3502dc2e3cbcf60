"""The cathodic-protection criteria, grouped by structure, each with its standard and clause.

The names of the structures and settings come from the bundle (``cp_structures``,
``cp_settings``); a structure or setting the bundle does not name is shown by its id.
"""

from .cite import citation_short
from .links import cp_anchor, cp_structure_anchor, electrode_anchor
from .text import DASH, Md
from .values import isnum, num, pair_text, range_text, signed

CP_PAGE = "reference/cp-criteria.md"
#: the flag on a CP criterion recalled and not re-read, or on which the documents differ
PROVISIONAL = Md('<abbr class="cw-provisional" title="provisional: recalled and not re-read, or the documents '
                 'differ; check it in the standard">provisional</abbr>')


def _value(page, r, electrodes):
    """The criterion's value: the potential or shift, the span of the documents, the temperatures."""
    kind, el = r.get("kind"), r.get("electrode")
    if el:
        el_txt = page.a(el, f"electrodes.md#{electrode_anchor(el)}") if el in electrodes else Md.escape(el)
    else:
        el_txt = Md()
    if kind in ("protection", "protection-on", "limit") and isnum(r.get("potential_V")):
        sign = "not below" if kind == "limit" else "≤"
        value = Md(sign + " {} V vs {}").format(signed(r["potential_V"], 2), el_txt)
        if kind == "protection-on":
            value += Md("<br>with the current applied, IR drop considered")
    elif isnum(r.get("shift_V")):
        what = " shift, current on" if kind == "shift-on" else " polarisation"
        value = Md("≥ {} mV" + what).format(num(round(r["shift_V"] * 1000, 6)))
    else:
        value = Md.escape(r.get("potential_V", r.get("shift_V")))
    rng = r.get("range_V")
    if isinstance(rng, list) and len(rng) == 2:
        value += Md("<br>documents: ") + pair_text(rng, "V", places=2)
    temp = r.get("structure_temp_C")
    if isinstance(temp, list) and len(temp) == 2:
        value += Md("<br>structure at ") + range_text(temp, "°C")
        ramp = r.get("ramp_C")
        if isinstance(ramp, list) and len(ramp) == 2:
            value += Md(", linear from ") + range_text(ramp, "°C")
    return value


def _condition(r):
    """The condition of a criterion that admits on readings and the ways its IR drop may be considered."""
    if not r.get("condition"):
        return Md()
    ways = [m.get("name") for m in r.get("ir_drop_methods") or [] if isinstance(m, dict) and m.get("name")]
    text = Md("Condition: {}").format(r["condition"].rstrip("."))
    if ways:
        text += Md(". The IR drop may be considered as: {}").format("; ".join(ways))
    return text + Md(".")


def _row(page, r, electrodes, settings):
    """The table row of a criterion, and its note (or None)."""
    rid = r.get("id")
    anchor = cp_anchor(rid)
    link = f"cp-criteria.md#{anchor}"
    what = f"CP criterion {rid}"
    sources = page.site.citations.sources
    where = Md("<br>").join(settings.get(s) or s for s in r.get("settings") or [])
    src = (Md("{}, {}").format(citation_short(sources.get(r.get("source")), r.get("source")), r.get("clause"))
           + page.cite(r, "", what=what, link=link))
    also, also_notes = [], []
    for a in r.get("also") or []:
        if not isinstance(a, dict):
            continue
        short = citation_short(sources.get(a.get("source")), a.get("source"))
        also.append(Md("{}, {}").format(short, a.get("clause")) + page.cite(a, "", what=what, link=link))
        if a.get("note"):
            also_notes.append(Md("{}: {}").format(short, a["note"]))
    name = r.get("name") or rid
    flags = Md(" ") + PROVISIONAL if r.get("provisional") else Md()
    row = [Md("{}{}{}<br>{}").format(page.span(anchor), page.strong(name), flags, page.code(rid)), where,
           _value(page, r, electrodes), Md("yes" if r.get("ir_free") else "no"), src, Md("<br>").join(also) or DASH]
    note = None
    extra = _condition(r)
    if r.get("note") or also_notes or extra:
        text = Md.escape(r["note"]) if r.get("note") else Md()
        if also_notes:
            text += (Md(" ") if text else Md()) + Md(" ").join(n.rstrip(".") + Md(".") for n in also_notes)
        text += (Md(" ") if text else Md()) + extra if extra else Md()
        note = page.a(name, f"#{anchor}") + Md(": ") + text
    return row, note


def cp_criteria_page(site):
    """The criteria by structure, with the standard and clause of each and the documents that agree."""
    page = site.page(CP_PAGE)
    structures, settings = site.names("cp_structures"), site.names("cp_settings")
    electrodes = {r.get("id") for r in site.recs("reference_electrodes")}
    groups = {}
    for r in site.recs("cp_criteria"):
        groups.setdefault(r.get("structure"), []).append(r)
    sections, notes = [], []
    for sid, group in groups.items():
        rows = []
        for r in group:
            row, note = _row(page, r, electrodes, settings)
            rows.append(row)
            if note:
                notes.append(note)
        sections.append({"title": structures.get(sid) or sid, "anchor": cp_structure_anchor(sid), "rows": rows})
    return page.render("cp_criteria.md.j2", sections=sections, notes=notes, provisional=PROVISIONAL)
