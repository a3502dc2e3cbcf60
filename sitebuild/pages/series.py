"""The electrochemical series (half-reactions) and the ion-size parameters."""

import re

from calc.errors import InputError
from calc.species import parse_species

from ..validate.gibbs import gibbs_table, potential_from_gibbs
from .links import couple_anchor, ion_anchor
from .text import DASH, Md, esc
from .values import isnum, num, range_text, signed

#: the flag on a couple whose ion is not stable in water
HYPOTHETICAL = Md('<abbr class="cw-hypothetical" title="hypothetical couple: the ion is not stable in water, '
                  'so the value is estimated, not measured">hypothetical</abbr>')
SERIES_PAGE = "reference/series.md"
IONS_PAGE = "reference/ions.md"


def species_html(text):
    """One species as HTML with sub- and superscripts (read with calc's species grammar).

    >>> species_html("Fe(OH)2(s)"), species_html("SO4^2-")
    (Md('Fe(OH)<sub>2</sub>(s)'), Md('SO<sub>4</sub><sup>2−</sup>'))
    """
    try:
        sp = parse_species(text if str(text).endswith(")") else f"{text}(aq)")
    except (InputError, TypeError):
        return Md.escape(text)
    formula = Md(re.sub(r"(\d+)", r"<sub>\1</sub>", esc(sp.formula)))
    if sp.charge:
        mag = abs(sp.charge)
        formula += Md(f"<sup>{'' if mag == 1 else mag}{'+' if sp.charge > 0 else '−'}</sup>")
    coeff = "" if sp.coeff == 1 else (f"{int(sp.coeff)} " if sp.coeff == int(sp.coeff) else f"{sp.coeff:g} ")
    phase = Md("({})").format(sp.phase) if str(text).endswith(")") else Md()
    return Md(coeff) + formula + phase


def reaction_html(rec):
    """The reduction written out: ``Fe3+(aq) + e- -> Fe2+(aq)`` with sub/superscripts.

    >>> reaction_html({"oxidised": ["Fe3+(aq)"], "reduced": ["Fe2+(aq)"], "n": 1})
    Md('Fe<sup>3+</sup>(aq) + e<sup>−</sup> → Fe<sup>2+</sup>(aq)')
    """
    ox, red, n = rec.get("oxidised") or [], rec.get("reduced") or [], rec.get("n")
    electrons = Md("{} e<sup>−</sup>").format(num(n)) if isnum(n) and n != 1 else Md("e<sup>−</sup>")
    left = Md(" + ").join([species_html(s) for s in ox] + [electrons])
    right = Md(" + ").join(species_html(s) for s in red)
    return Md("{} → {}").format(left, right)


def _couple_row(page, r, table=None):
    cid = r.get("id")
    anchor = couple_anchor(cid)
    link = f"series.md#{anchor}"
    e0 = signed(r.get("E0_V"), 2) + page.cite(r, "E0", what=f"E° of {cid}", link=link)
    derived = potential_from_gibbs(r, table) if table and r.get("gibbs_note") else None
    if derived is not None:  # the handbook line and the thermodynamic value disagree: show both
        e0 += Md('<br>from ΔG°f: {} <span class="cw-where">({})</span>').format(
            signed(round(derived, 3), 2), page.a("computed", "gibbs-energies.md#gibbs-check"))
    if isnum(r.get("dEdT_mV_per_K")):
        dedt = signed(r["dEdT_mV_per_K"]) + page.cite(r, "dEdT", what=f"dE°/dT of {cid}", link=link)
    else:
        dedt = DASH
    if isnum(r.get("dCp_J_per_mol_K")):
        dedt += (Md("<br>ΔCp° {} J/(mol·K)").format(signed(r["dCp_J_per_mol_K"]))
                 + page.cite(r, "dCp", what=f"ΔCp° of {cid}", link=link))
    flags = []
    if r.get("hypothetical"):
        flags.append(HYPOTHETICAL)
    if r.get("spread") or r.get("note") or r.get("gibbs_note"):
        differ = r.get("spread") or r.get("gibbs_note")
        flags.append(page.a("see note", f"#note-{anchor}") + Md(" (handbooks differ)" if differ else ""))
    valid = r.get("valid_C")
    if isinstance(valid, list) and len(valid) == 2:
        flags.append(Md("valid ") + range_text(valid, "°C"))
    aliases = r.get("aliases") or []
    name = Md("{}{}<br>{}").format(page.span(anchor), page.strong(cid), r.get("name"))
    if aliases:
        name += Md("<br>also: ") + Md(", ").join(aliases)
    return [name, reaction_html(r), num(r.get("n")), e0, dedt, Md("<br>").join(flags)]


def _couple_note(page, r):
    parts = []
    if r.get("spread"):
        parts.append(Md("Published values: {}.").format(r["spread"]))
    if r.get("note"):
        parts.append(Md.escape(r["note"]))
    if r.get("gibbs_note"):
        parts.append(Md("From the Gibbs energies of formation: {}").format(r["gibbs_note"]))
    if not parts:
        return None
    anchor = couple_anchor(r.get("id"))
    return Md("{}{}: ").format(page.span(f"note-{anchor}"), page.a(r.get("id"), f"#{anchor}")) + Md(" ").join(parts)


def _potential_order(r):
    return (-(r.get("E0_V") if isnum(r.get("E0_V")) else -99), str(r.get("id")))


def series_page(site):
    """Standard reduction potentials, most noble first, each with its sources and notes."""
    page = site.page(SERIES_PAGE)
    recs = sorted(site.recs("half_reactions"), key=_potential_order)
    table = gibbs_table(site.bundle)
    rows = [_couple_row(page, r, table) for r in recs]
    notes = [n for n in (_couple_note(page, r) for r in recs) if n]
    return page.render("series.md.j2", count=len(recs), rows=rows, notes=notes)


def ions_page(site):
    """Ion-size parameters of the extended Debye–Hückel model."""
    page = site.page(IONS_PAGE)
    rows = []
    for r in site.recs("ions"):
        sp = r.get("species")
        anchor = ion_anchor(sp)
        size = r.get("size_angstrom")
        size_txt = (num(size) if size is not None else DASH) + page.cite(r, "size", what=f"ion size of {sp}",
                                                                          link=f"ions.md#{anchor}")
        rows.append([page.span(anchor) + species_html(sp), signed(r.get("charge")), size_txt,
                     Md.escape(r.get("note"))])
    return page.render("ions.md.j2", rows=rows)
