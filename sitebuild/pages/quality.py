"""The data-quality page: how each value was obtained, file by file, and the values still recalled.

Counts every confidence flag of the bundle (the same flags the validator checks, see
:func:`sitebuild.validate.where.each_flag`): the shares of ``read``, ``recalled`` and
``computed`` by file and by kind of value, and the list of values still recalled (file, record,
field, source) as a work list for maintainers. Each record in the list links to its reference
page where it has one.
"""

from calc.dataset import KINDS

from ..validate.where import each_flag
from .cite import SOURCES_PAGE
from .gibbs import GIBBS_PAGE, gibbs_anchor
from .links import (couple_anchor, cp_anchor, cp_structure_anchor, electrode_anchor, environment_anchor,
                    ion_anchor, material_file, source_anchor)
from .text import Md

QUALITY_PAGE = "reference/data-quality.md"
CONFIDENCES = ("read", "recalled", "computed")
#: the aim of the data: at most this share of a file's flags recalled [unitless]
RECALLED_TARGET = 0.20
#: kind -> (page, anchor of a record id) of the records that have a reference page
RECORD_PAGES = {
    "half_reactions": ("reference/series.md", couple_anchor),
    "reference_electrodes": ("reference/electrodes.md", electrode_anchor),
    "environments": ("reference/environments.md", environment_anchor),
    "ions": ("reference/ions.md", ion_anchor),
    "gibbs_energies": (GIBBS_PAGE, gibbs_anchor),
    "cp_criteria": ("reference/cp-criteria.md", cp_anchor),
    "cp_structures": ("reference/cp-criteria.md", cp_structure_anchor),
}


def record_link(kind, record):
    """The doc path (with anchor) of a record's reference page, or None.

    >>> record_link("materials", "zinc"), record_link("ions", "OH-"), record_link("cp_coatings", "x")
    ('reference/materials/zinc.md', 'reference/ions.md#ion-ohm', None)
    """
    if kind == "materials":
        return "reference/materials/" + material_file(record)
    if kind in RECORD_PAGES:
        page, anchor = RECORD_PAGES[kind]
        return f"{page}#{anchor(record)}"
    return None


def tally(flags):
    """Counts of each confidence and the recalled share of a list of flags.

    Returns:
        dict with total, read, recalled, computed, other (counts) and recalled_share [unitless]

    >>> class F: pass
    >>> fs = [F(), F(), F()]; fs[0].confidence, fs[1].confidence, fs[2].confidence = "read", "recalled", "read"
    >>> t = tally(fs); (t["total"], t["read"], t["recalled"], round(t["recalled_share"], 3))
    (3, 2, 1, 0.333)
    """
    out = {c: 0 for c in CONFIDENCES}
    out["other"] = 0
    for f in flags:
        out[f.confidence if f.confidence in CONFIDENCES else "other"] += 1
    out["total"] = sum(out[c] for c in CONFIDENCES) + out["other"]
    out["recalled_share"] = out["recalled"] / out["total"] if out["total"] else 0.0
    return out


def _pct(n, total):
    return Md(f"{100 * n / total:.0f} %") if total else Md("–")


def _count_row(label, t):
    mark = Md(" ✔") if t["recalled_share"] <= RECALLED_TARGET else Md()
    return [label, Md(str(t["total"])), Md("{} ({})").format(t["read"], _pct(t["read"], t["total"])),
            Md("{} ({})").format(t["recalled"], _pct(t["recalled"], t["total"])) + mark,
            Md("{} ({})").format(t["computed"], _pct(t["computed"], t["total"]))]


def _record_cell(page, flag):
    """The record of a flag, linked to its reference page where it has one."""
    link = record_link(flag.kind, flag.record)
    if not link:
        return Md.escape(flag.record)
    doc, _, anchor = link.partition("#")
    return page.a(flag.record, f"{page.to(doc)}#{anchor}" if anchor else page.to(doc))


def _source_cell(page, flag):
    """The source of a flag, linked to the bibliography."""
    if not isinstance(flag.source, str):
        return Md("–")
    return page.a(flag.source, f"{page.to(SOURCES_PAGE)}#{source_anchor(flag.source)}")


def quality_summary(bundle):
    """The flags of a bundle, tallied: (per file, per kind of value, all, recalled flags).

    Args:
        bundle: the dataset bundle (or the raw records) [unitless]

    Returns:
        (list of (file, tally), list of (file, group, tally), tally of all, list of recalled flags)
    """
    kinds = [k for k in KINDS if k != "sources"]
    flags = list(each_flag(bundle, kinds))
    by_file, by_group = [], []
    for kind in kinds:
        mine = [f for f in flags if f.kind == kind]
        if not mine:
            continue
        by_file.append((f"{kind}.yaml", tally(mine)))
        for group in sorted({f.group for f in mine}):
            by_group.append((f"{kind}.yaml", group, tally([f for f in mine if f.group == group])))
    return by_file, by_group, tally(flags), [f for f in flags if f.confidence == "recalled"]


def quality_page(site):
    """The data-quality page of the site's bundle."""
    page = site.page(QUALITY_PAGE)
    by_file, by_group, total, recalled = quality_summary(site.bundle)
    files = [_count_row(page.code(name), t) for name, t in by_file] + [_count_row(page.strong("all files"), total)]
    groups = [_count_row(page.code(name) + Md(" ") + Md.escape(group), t) for name, group, t in by_group]
    work = [[page.code(f"{f.kind}.yaml"), _record_cell(page, f), page.code(f.field), _source_cell(page, f)]
            for f in recalled]
    return page.render("quality.md.j2", files=files, groups=groups, work=work, total=total,
                       target=f"{100 * RECALLED_TARGET:.0f} %")
