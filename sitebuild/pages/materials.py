"""The materials: one page each, their list, and the galvanic series in flowing seawater."""

from calc.gradepren import LIMITS_MAX, LIMITS_MIN, record_pren

from ..charts import CHART_PATH, SERIES_NOTE
from .cite import citation
from .links import material_file, source_anchor
from .text import DASH, Md
from .values import isnum, leftover_rows, num, pair_text

INDEX_PAGE = "reference/materials/index.md"
GALVANIC_PAGE = "reference/galvanic-series.md"


def galvanic_order(m):
    """Sort key: materials with a seawater range by its noble end, most noble first; then the rest."""
    rng = m.get("seawater_range_V_SCE")
    if isinstance(rng, list) and len(rng) == 2 and all(isnum(v) for v in rng):
        return (0, -rng[1], -rng[0], str(m.get("name")))
    return (1, 0, 0, str(m.get("name")))


def _uns(m):
    return Md.escape(", ".join(m.get("uns") or [])) or DASH


def _state(m):
    return Md.escape(m.get("state")) or DASH


def materials_index(site):
    """The list of materials in galvanic order, each linking to its page."""
    page = site.page(INDEX_PAGE)
    rows = []
    for m in sorted(site.recs("materials"), key=galvanic_order):
        rng, ai = m.get("seawater_range_V_SCE"), m.get("anodic_index_V")
        rng_txt = pair_text(rng, "", places=2) + page.cite(m, "seawater") if rng is not None else DASH
        ai_txt = num(ai, 2) + page.cite(m, "anodic_index") if ai is not None else DASH
        rows.append([page.a(m.get("name"), material_file(m.get("id"))), _uns(m), _state(m), rng_txt, ai_txt])
    return page.render("materials_index.md.j2", rows=rows)


def galvanic_series(site):
    """The seawater ranges as a chart and a table, most noble first."""
    page = site.page(GALVANIC_PAGE)
    mats = sorted((m for m in site.recs("materials") if isinstance(m.get("seawater_range_V_SCE"), list)),
                  key=galvanic_order)
    rows = [[page.a(m.get("name"), f"materials/{material_file(m.get('id'))}"), _uns(m), _state(m),
             pair_text(m["seawater_range_V_SCE"], "", places=2) + page.cite(m, "seawater")] for m in mats]
    return page.render("galvanic_series.md.j2", note=SERIES_NOTE.replace("\n", " "), count=len(mats),
                       chart=CHART_PATH.rsplit("/", 1)[-1], rows=rows)


def _equivalent_weight(m):
    ew = m.get("equivalent_weight_g")
    text = Md("{} g").format(num(ew, 2)) if ew is not None else Md("none")
    val = m.get("equivalent_weight_valences")
    if isinstance(val, dict) and val:
        text += Md(" from valences ") + Md(", ").join(Md("{} {}").format(el, num(v)) for el, v in val.items())
    if m.get("equivalent_weight_note"):
        text += Md(": {}").format(m["equivalent_weight_note"])
    return text


def _limits_rows(m, cite):
    """The composition limits of a grade and the PREN computed from them, as table rows."""
    lo, hi = m.get(LIMITS_MIN), m.get(LIMITS_MAX)
    if not (isinstance(lo, dict) and isinstance(hi, dict) and lo):
        return []
    basis = m.get("composition_limits_basis") or "specification"
    parts = [Md("{} {}").format(el, num(lo[el])) if lo[el] == hi.get(el) else
             Md("{} max {}").format(el, num(hi.get(el))) if lo[el] == 0 else
             Md("{} {}{}{}").format(el, num(lo[el]), DASH, num(hi.get(el))) for el in lo]
    label = "the limits of its standard" if basis == "specification" else "nominal values"
    rows = [("Composition limits", Md(", ").join(parts) + Md(" wt% ({})").format(label)
             + cite("composition_limits", "composition limits"))]
    if m.get("composition_limits_note"):
        rows[0] = (rows[0][0], rows[0][1] + Md(". {}").format(m["composition_limits_note"]))
    grade = record_pren(m)
    if grade is not None:
        span = (num(round(grade.pren_min, 1)) if abs(grade.pren_max - grade.pren_min) < 0.05 else
                Md("{} at the minimum composition, {} at the maximum").format(num(round(grade.pren_min, 1)),
                                                                             num(round(grade.pren_max, 1))))
        rows.append(("PREN", span + Md(" ({}; computed from the limits above, an element not listed taken as 0)")
                     .format(grade.formula)))
    return rows


def _property_rows(page, m, by_id):
    """The (label, value) rows of a material's table, and the fields they show."""
    name = m.get("name") or m.get("id")
    link = f"materials/{material_file(m.get('id'))}"

    def cite(prefix, what):
        return page.cite(m, prefix, what=f"{what} of {name}", link=link)

    uns = m.get("uns") or []
    rows = [("Id", page.code(m.get("id")))]
    if m.get("aliases"):
        rows.append(("Also known as", Md(", ").join(m["aliases"])))
    if uns:
        rows.append(("UNS", Md(", ").join(uns)))
    if m.get("family"):
        rows.append(("Family", Md.escape(m["family"])))
    other = by_id.get(m.get("other_state"))
    if m.get("state"):
        text = Md.escape(m["state"])
        if other is not None:
            text += Md("; the same alloy {}: ").format(other.get("state")) + page.a(
                other.get("name"), material_file(other.get("id")))
        rows.append(("State", text))
    if m.get("seawater_range_V_SCE") is not None:
        rows.append(("Flowing seawater range", pair_text(m["seawater_range_V_SCE"], "V vs SCE", places=2)
                     + Md(" (active end to noble end)") + cite("seawater", "seawater range")))
    elif m.get("seawater_note"):
        rows.append(("Flowing seawater range", Md.escape(m["seawater_note"])))
    if m.get("anodic_index_V") is not None:
        group = Md(" (group: {})").format(m["anodic_index_group"]) if m.get("anodic_index_group") else Md()
        rows.append(("Anodic index (legacy table)", num(m["anodic_index_V"], 2) + Md(" V") + group
                     + cite("anodic_index", "anodic index")))
    if m.get("density_g_cm3") is not None:
        rows.append(("Density", num(m["density_g_cm3"], 2) + Md(" g/cm³") + cite("density", "density")))
    if "equivalent_weight_g" in m:
        rows.append(("Equivalent weight (ASTM G102)", _equivalent_weight(m)
                     + cite("equivalent_weight", "equivalent weight")))
    comp = m.get("composition_wt_pct")
    if isinstance(comp, dict) and comp:
        text = Md(", ").join(Md("{} {}").format(el, num(v)) for el, v in comp.items()) + Md(" wt% (nominal)")
        rows.append(("Composition", text + cite("composition" if "composition_source" in m else "equivalent_weight",
                                                "composition")))
    rows += _limits_rows(m, cite)
    shown = {"id", "name", "note", "aliases", "uns", "family", "state", "other_state", "seawater_range_V_SCE",
             "anodic_index_V", "anodic_index_group", "density_g_cm3", "equivalent_weight_g",
             "equivalent_weight_note", "equivalent_weight_valences", "composition_wt_pct", "seawater_note",
             LIMITS_MIN, LIMITS_MAX, "composition_limits_basis", "composition_limits_note"}
    return rows + leftover_rows(page, m, shown, name, link)


def material_page(site, m, by_id):
    """One material: its values with their sources, and the sources it cites."""
    page = site.page(f"reference/materials/{material_file(m.get('id'))}")
    uns = m.get("uns") or []
    title = Md.escape(m.get("name") or m.get("id"))
    if uns:
        title += Md(" (UNS {})").format(", ".join(uns))
    used = []
    for key, value in m.items():
        if (key == "source" or key.endswith("_source")) and isinstance(value, str) and value not in used:
            used.append(value)
    sources = [page.a(sid, f"{page.to('reference/sources.md')}#{source_anchor(sid)}")
               + Md(": ") + citation(site.citations.sources.get(sid, {})) for sid in used]
    return page.render("material.md.j2", title=title, rows=_property_rows(page, m, by_id), note=m.get("note"),
                       sources=sources)


def material_pages(site):
    """doc path -> page of every material."""
    by_id = {m.get("id"): m for m in site.recs("materials")}
    return {f"reference/materials/{material_file(m.get('id'))}": material_page(site, m, by_id)
            for m in site.recs("materials")}
