"""The standard Gibbs energies of formation and the check of each half-reaction against them.

Lists every ΔG°f of ``gibbs_energies.yaml`` with its source and the place it was read, and every
half-reaction whose species all have one, with its handbook E° beside the E° that ΔrG° = −nFE°
gives (:func:`sitebuild.validate.gibbs.potential_from_gibbs`, the validator's own function) and
the difference; a couple beyond the validator's tolerance links to its note, which says which
value is kept and why.
"""

from ..validate.gibbs import TOLERANCE_V, gibbs_table, potential_from_gibbs
from .links import _slug, couple_anchor
from .series import SERIES_PAGE, reaction_html, species_html
from .text import Md
from .values import isnum, num, signed

GIBBS_PAGE = "reference/gibbs-energies.md"


def gibbs_anchor(species):
    """Anchor of a species on the Gibbs-energy page: ``dg-<slug>``.

    >>> gibbs_anchor("Fe2+(aq)"), gibbs_anchor("Fe(OH)2(s)")
    ('dg-fe2p-aq', 'dg-fe-oh-2-s')
    """
    return "dg-" + _slug(species, charges=True)


def gibbs_derived(bundle):
    """couple id -> E° [V] from the ΔG°f of its species, for every couple where all have one."""
    table = gibbs_table(bundle)
    out = {}
    for r in bundle.get("half_reactions") or []:
        e = potential_from_gibbs(r, table) if isinstance(r, dict) else None
        if e is not None:
            out[r.get("id")] = e
    return out


def _species_row(page, r):
    sp = r.get("id")
    anchor = gibbs_anchor(sp)
    value = num(r.get("dGf_kJ_per_mol")) if isnum(r.get("dGf_kJ_per_mol")) else Md("–")
    value += page.cite(r, "", what=f"ΔG°f of {sp}", link=f"gibbs-energies.md#{anchor}")
    return [page.span(anchor) + species_html(sp), value]


def _check_row(page, r, derived):
    cid = r.get("id")
    stored = r.get("E0_V")
    diff_mV = (stored - derived) * 1000
    if abs(diff_mV) <= TOLERANCE_V * 1000:
        verdict = Md("within {} mV").format(num(TOLERANCE_V * 1000))
    else:
        note = f"{page.to(SERIES_PAGE)}#note-{couple_anchor(cid)}"
        verdict = Md("differs; {} kept, ").format(signed(stored, 2)) + page.a("see note", note)
    link = page.a(cid, f"{page.to(SERIES_PAGE)}#{couple_anchor(cid)}")
    return [link, reaction_html(r), signed(stored, 2) + page.cite(r, "E0"), signed(round(derived, 4), 2),
            Md(f"{diff_mV:+.1f}" if abs(diff_mV) >= 0.05 else "0.0"), verdict]


def gibbs_page(site):
    """ΔG°f of the stored species and the ΔrG° = −nFE° check of the half-reactions."""
    page = site.page(GIBBS_PAGE)
    species = [_species_row(page, r) for r in site.recs("gibbs_energies")]
    derived = gibbs_derived(site.bundle)
    checks = [_check_row(page, r, derived[r.get("id")]) for r in site.recs("half_reactions")
              if r.get("id") in derived and isnum(r.get("E0_V"))]
    return page.render("gibbs.md.j2", species=species, checks=checks, count=len(species),
                       tolerance=num(TOLERANCE_V * 1000))
