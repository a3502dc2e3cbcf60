"""Reference pages generated from the dataset bundle at build time.

:func:`generate_pages` maps doc paths (relative to ``docs/``) to Markdown. The mkdocs hook adds
them as generated files, so they are never committed. Rules the pages keep:

- every data string is escaped (:func:`esc`): data is text, never HTML or Markdown, so a
  ``<script>`` in a note shows literally;
- every value carries a link to its source's anchor on ``reference/sources.md``
  (``#src-<id>``), and values recalled rather than read carry the :data:`RECALLED` badge;
- links are relative ``.md`` links, which mkdocs rewrites for ``use_directory_urls``;
- titles carry names, UNS numbers and couple ids so the built-in search finds them.
"""

import functools
import html
import json
import posixpath
import re

from calc.errors import InputError
from calc.species import parse_species

from .charts import CHART_PATH, SERIES_NOTE

#: the badge on a value recalled from its source and not re-read (defined once, used everywhere)
RECALLED = ('<abbr class="cw-recalled" title="recalled: this value was not re-read in the cited source; '
            'check it there before relying on it">(r)</abbr>')
#: the badge on a value computed here from other published values
COMPUTED = ('<abbr class="cw-computed" title="computed: derived here from published values '
            '(see the source note)">(c)</abbr>')
#: the flag on a couple whose ion is not stable in water
HYPOTHETICAL = ('<abbr class="cw-hypothetical" title="hypothetical couple: the ion is not stable in water, '
                'so the value is estimated, not measured">hypothetical</abbr>')

LEGEND = (f"{RECALLED} value recalled from the cited source, not re-read: check it before relying on it. "
          f"{COMPUTED} value computed here from published values. "
          "Each value links to its source in the [bibliography]({sources}).")

# characters that mean something to Markdown or its extensions (tables, attr_list, emoji,
# mark, caret, tilde, arithmatex) or to HTML: written as character references
_ESCAPE = {c: f"&#{ord(c)};" for c in "\\`*_{}[]#|~^=:$<>\"'&"}
_ESCAPE_TABLE = str.maketrans(_ESCAPE)
_CONTROL_RE = re.compile(r"[\x00-\x08\x0b\x0c\x0e-\x1f\x7f]")
_SPACE_RE = re.compile(r"\s+")


def esc(text):
    """Data text as Markdown that renders to exactly that text (no markup, no HTML).

    Args:
        text: any data value; None gives an empty string [unitless]

    Returns:
        the escaped text, on one line

    >>> esc("<script>alert(1)</script>")
    '&#60;script&#62;alert(1)&#60;/script&#62;'
    >>> esc("a | b *c*")
    'a &#124; b &#42;c&#42;'
    """
    if text is None:
        return ""
    text = _CONTROL_RE.sub("\ufffd", str(text))
    text = _SPACE_RE.sub(" ", text).strip()
    return text.translate(_ESCAPE_TABLE).replace("--", "-&#45;")


def _attr(text):
    return html.escape(re.sub(r"\s+", " ", str(text)), quote=True)


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


def electrode_anchor(electrode_id):
    """Anchor of a reference electrode on the electrodes page."""
    return "ref-" + _slug(electrode_id)


def environment_anchor(env_id):
    """Anchor of an environment on the environments page."""
    return "env-" + _slug(env_id)


def material_file(material_id):
    """File name of a material's page inside ``reference/materials/``.

    >>> material_file("stainless-316-passive")
    'stainless-316-passive.md'
    """
    name = re.sub(r"[^a-z0-9-]+", "-", str(material_id).lower()).strip("-") or "material"
    return ("material-" + name if name == "index" else name) + ".md"


def _num(value, places=0):
    """A number as written in the data (shortest round-trip form), with at least ``places`` decimals."""
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        return esc(value)
    if isinstance(value, int):
        return f"{value:.{places}f}" if places else str(value)
    text = repr(value)
    if "e" in text or "n" in text:  # exponent, nan, inf
        return text
    decimals = len(text.split(".")[1]) if "." in text else 0
    if text.endswith(".0") and not places:
        return text[:-2]
    return f"{value:.{max(decimals, places)}f}"


def _signed(value, places=0):
    text = _num(value, places)
    return "+" + text if isinstance(value, (int, float)) and not isinstance(value, bool) and value > 0 else text


def _pair_text(pair, unit, sep=" to ", places=0):
    if isinstance(pair, list) and len(pair) == 2:
        return f"{_signed(pair[0], places)}{sep}{_signed(pair[1], places)} {unit}".strip()
    return esc(pair)


class _Pages:
    """Shared state while the pages are written: sources, citations, badge lookups."""

    def __init__(self, bundle):
        self.bundle = bundle
        self.sources = {s.get("id"): s for s in self._recs("sources") if isinstance(s.get("id"), str)}
        self.cited = {}  # source id -> list of (kind, record id, what, link from sources.md)

    def _recs(self, kind):
        return [r for r in self.bundle.get(kind, []) or [] if isinstance(r, dict)]

    # -- values with source and confidence ------------------------------------------------------
    def cite(self, rec, prefix, *, where, what, link, parent=None):
        """' [src](…#src-id) (r)' for the value ``prefix`` of a record; registers the citation."""
        sid = rec.get(f"{prefix}_source") if prefix else None
        conf = rec.get(f"{prefix}_confidence") if prefix else None
        sid = sid if sid is not None else rec.get("source")
        conf = conf if conf is not None else rec.get("confidence")
        if sid is None and parent is not None:
            sid = parent.get("source")
            conf = conf if conf is not None else parent.get("confidence")
        if sid is None:
            return ""
        self.cited.setdefault(sid, []).append((what, link))
        badge = {"recalled": " " + RECALLED, "computed": " " + COMPUTED}.get(conf, "")
        return f" [{esc(sid)}]({where}#{source_anchor(sid)}){badge}"

    def footer(self, sources_link):
        version = esc(self.bundle.get("version", "unversioned"))
        date = esc(self.bundle.get("date", ""))
        return ("\n---\n\n" + LEGEND.format(sources=sources_link) +
                f"\n\nData version {version}" + (f" ({date})" if date else "") + ".\n")

    # -- pages ------------------------------------------------------------------------------------
    def series(self):
        recs = [r for r in self._recs("half_reactions")]
        recs.sort(key=lambda r: (-(r.get("E0_V") if _isnum(r.get("E0_V")) else -99), str(r.get("id"))))
        lines = [
            "# Electrochemical series: standard reduction potentials",
            "",
            "Standard reduction potentials E° at 25 °C (298.15 K) and unit activities, in volts against "
            "the standard hydrogen electrode (SHE), most noble first. dE°/dT is the isothermal "
            "temperature coefficient. These are thermodynamic values for ideal solutions: they do not "
            "predict which metal corrodes in a real joint; for that see the "
            "[galvanic series in flowing seawater](galvanic-series.md).",
            "",
            f"{len(recs)} half-reactions.",
            "",
            "| Couple | Half-reaction (reduction) | n | E° / V vs SHE | dE°/dT / mV/K | Flags |",
            "|---|---|---|---|---|---|",
        ]
        notes = []
        for r in recs:
            cid = r.get("id")
            anchor = couple_anchor(cid)
            what = f"E° of {cid}"
            link = f"series.md#{anchor}"
            e0 = _signed(r.get("E0_V"), 2) + self.cite(r, "E0", where="sources.md", what=what, link=link)
            if _isnum(r.get("dEdT_mV_per_K")):
                dedt = _signed(r["dEdT_mV_per_K"]) + self.cite(r, "dEdT", where="sources.md",
                                                                 what=f"dE°/dT of {cid}", link=link)
            else:
                dedt = "–"
            if _isnum(r.get("dCp_J_per_mol_K")):
                dedt += (f"<br>ΔCp° {_signed(r['dCp_J_per_mol_K'])} J/(mol·K)"
                         + self.cite(r, "dCp", where="sources.md", what=f"ΔCp° of {cid}", link=link))
            flags = []
            if r.get("hypothetical"):
                flags.append(HYPOTHETICAL)
            if r.get("spread") or r.get("note"):
                flags.append(f"[see note](#note-{anchor})" + (" (handbooks differ)" if r.get("spread") else ""))
            valid = r.get("valid_C")
            if isinstance(valid, list) and len(valid) == 2:
                flags.append(f"valid {_num(valid[0])} to {_num(valid[1])} °C")
            name = esc(r.get("name"))
            aliases = r.get("aliases") or []
            alias_txt = ("<br>also: " + ", ".join(esc(a) for a in aliases)) if aliases else ""
            lines.append(f"| <span id=\"{anchor}\"></span>**{esc(cid)}**<br>{name}{alias_txt} | "
                         f"{reaction_html(r)} | {_num(r.get('n'))} | {e0} | {dedt} | {'<br>'.join(flags)} |")
            parts = []
            if r.get("spread"):
                parts.append("Published values: " + esc(r["spread"]) + ".")
            if r.get("note"):
                parts.append(esc(r["note"]))
            if parts:
                notes.append(f"- <span id=\"note-{anchor}\"></span>[{esc(cid)}](#{anchor}): " + " ".join(parts))
        if notes:
            lines += ["", "## Notes", ""] + notes
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def materials_index(self):
        mats = self._recs("materials")
        mats.sort(key=_galvanic_order)
        lines = [
            "# Materials",
            "",
            "Metals and alloys of the dataset, in galvanic order in flowing seawater (most noble first). "
            "Each name opens the material's page with its values and sources. Alloys that can be "
            "passive or active are listed once per state.",
            "",
            "| Material | UNS | State | Seawater range / V vs SCE | Anodic index / V |",
            "|---|---|---|---|---|",
        ]
        for m in mats:
            fname = material_file(m.get("id"))
            link = f"{fname}"
            rng = m.get("seawater_range_V_SCE")
            rng_txt = (_pair_text(rng, "", places=2) + self.cite(m, "seawater", where="../sources.md",
                                                       what=None, link=None)
                       if rng is not None else "–")
            ai = m.get("anodic_index_V")
            ai_txt = (_num(ai, 2) + self.cite(m, "anodic_index", where="../sources.md",
                                           what=None, link=None)
                      if ai is not None else "–")
            lines.append(f"| [{esc(m.get('name'))}]({link}) | {esc(', '.join(m.get('uns') or [])) or '–'} | "
                         f"{esc(m.get('state')) or '–'} | {rng_txt} | {ai_txt} |")
        lines.append(self.footer("../sources.md"))
        return "\n".join(lines)

    def _leftovers(self, rec, shown, where, what, link):
        """Rows for fields no renderer knows, so that no data value is ever dropped silently."""
        rows = []
        for key, value in rec.items():
            if key in shown or key.endswith(("_source", "_confidence")) or key in ("source", "confidence"):
                continue
            if value is None or value == [] or value == {}:
                continue
            prefix = key
            for p in _prefixes(key):
                if f"{p}_source" in rec:
                    prefix = p
                    break
            rows.append((esc(key.replace("_", " ")), _value_text(value)
                         + self.cite(rec, prefix, where=where, what=f"{key} of {what}", link=link)))
        return rows

    def material(self, m, by_id):
        mid = m.get("id")
        name = m.get("name") or mid
        uns = m.get("uns") or []
        title = esc(name) + (f" (UNS {esc(', '.join(uns))})" if uns else "")
        link = f"materials/{material_file(mid)}"
        src = "../sources.md"

        def cite(prefix, what):
            return self.cite(m, prefix, where=src, what=f"{what} of {name}", link=link)

        shown = {"id", "name", "note"}
        rows = [("Id", f"`{_code(mid)}`")]
        if m.get("aliases"):
            rows.append(("Also known as", ", ".join(esc(a) for a in m["aliases"])))
        if uns:
            rows.append(("UNS", ", ".join(esc(u) for u in uns)))
        if m.get("family"):
            rows.append(("Family", esc(m["family"])))
        shown |= {"aliases", "uns", "family", "state", "other_state"}
        state = m.get("state")
        other = by_id.get(m.get("other_state"))
        if state:
            text = esc(state)
            if other is not None:
                text += (f"; the same alloy {esc(other.get('state'))}: "
                         f"[{esc(other.get('name'))}]({material_file(other.get('id'))})")
            rows.append(("State", text))
        rng = m.get("seawater_range_V_SCE")
        shown.add("seawater_range_V_SCE")
        if rng is not None:
            rows.append(("Flowing seawater range", _pair_text(rng, "V vs SCE", places=2)
                         + " (active end to noble end)" + cite("seawater", "seawater range")))
        shown |= {"anodic_index_V", "anodic_index_group"}
        if m.get("anodic_index_V") is not None:
            group = f" (group: {esc(m['anodic_index_group'])})" if m.get("anodic_index_group") else ""
            rows.append(("Anodic index (legacy table)", _num(m["anodic_index_V"], 2) + " V" + group
                         + cite("anodic_index", "anodic index")))
        shown.add("density_g_cm3")
        if m.get("density_g_cm3") is not None:
            rows.append(("Density", _num(m["density_g_cm3"], 2) + " g/cm³" + cite("density", "density")))
        shown |= {"equivalent_weight_g", "equivalent_weight_note", "equivalent_weight_valences"}
        if "equivalent_weight_g" in m:
            ew = m.get("equivalent_weight_g")
            text = (_num(ew, 2) + " g") if ew is not None else "none"
            val = m.get("equivalent_weight_valences")
            if isinstance(val, dict) and val:
                text += " from valences " + ", ".join(f"{esc(el)} {_num(v)}" for el, v in val.items())
            if m.get("equivalent_weight_note"):
                text += ": " + esc(m["equivalent_weight_note"])
            rows.append(("Equivalent weight (ASTM G102)", text + cite("equivalent_weight", "equivalent weight")))
        comp = m.get("composition_wt_pct")
        shown.add("composition_wt_pct")
        if isinstance(comp, dict) and comp:
            text = ", ".join(f"{esc(el)} {_num(v)}" for el, v in comp.items()) + " wt% (nominal)"
            prefix = "composition" if "composition_source" in m else "equivalent_weight"
            rows.append(("Composition", text + cite(prefix, "composition")))
        rows += self._leftovers(m, shown, src, name, link)
        lines = [f"# {title}", ""]
        lines += ["| Property | Value |", "|---|---|"]
        lines += [f"| {k} | {v} |" for k, v in rows]
        if m.get("note"):
            lines += ["", f"Note: {esc(m['note'])}"]
        lines += ["", "See where it sits among the others in the [galvanic series](../galvanic-series.md) "
                      "and the [list of materials](index.md)."]
        used = []
        for key, value in m.items():
            if (key == "source" or key.endswith("_source")) and isinstance(value, str) and value not in used:
                used.append(value)
        if used:
            lines += ["", "## Sources", ""]
            for sid in used:
                lines.append(f"- [{esc(sid)}]({src}#{source_anchor(sid)}): {citation(self.sources.get(sid, {}))}")
        lines.append(self.footer(src))
        return "\n".join(lines)

    def electrodes(self):
        recs = self._recs("reference_electrodes")
        lines = [
            "# Reference electrodes",
            "",
            "Potentials of reference electrodes against the standard hydrogen electrode (SHE), with the "
            "temperature model used to correct them and its range of validity. The reversible hydrogen "
            "electrode (RHE) is not stored: it is computed from pH.",
            "",
            "| Electrode | E / V vs SHE at 25 °C | Temperature model | Valid range | Source of the model |",
            "|---|---|---|---|---|",
        ]
        notes = []
        for r in recs:
            rid = r.get("id")
            anchor = electrode_anchor(rid)
            link = f"electrodes.md#{anchor}"
            e = _signed(r.get("E_V_SHE"), 2) + self.cite(r, "", where="sources.md", what=f"E of {rid}", link=link)
            model = r.get("temperature")
            if isinstance(model, dict):
                model_txt = model_text(model)
                valid = model.get("valid_C")
                valid_txt = (f"{_num(valid[0])} to {_num(valid[1])} °C"
                             if isinstance(valid, list) and len(valid) == 2 else "–")
                msrc = self.cite(model, "", where="sources.md", what=f"temperature model of {rid}", link=link,
                                 parent=r).strip()
            else:
                model_txt, valid_txt, msrc = "–", "–", "–"
            aliases = r.get("aliases") or []
            alias_txt = ("<br>also: " + ", ".join(esc(a) for a in aliases)) if aliases else ""
            lines.append(f"| <span id=\"{anchor}\"></span>**{esc(rid)}**<br>{esc(r.get('name'))}{alias_txt} | {e} | "
                         f"{model_txt} | {valid_txt} | {msrc or '–'} |")
            parts = []
            if r.get("note"):
                parts.append(esc(r["note"]))
            if r.get("spread"):
                parts.append("Published values: " + esc(r["spread"]))
            if isinstance(model, dict) and model.get("note"):
                parts.append("Temperature model: " + esc(model["note"]))
            if parts:
                notes.append(f"- [{esc(rid)}](#{anchor}): " + " ".join(parts))
        if notes:
            lines += ["", "## Notes", ""] + notes
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def environments(self):
        recs = self._recs("environments")
        lines = [
            "# Environments",
            "",
            "The environments a joint can be judged in: the basis of the judgement (a galvanic series "
            "measured in that electrolyte, or the legacy anodic index), the allowable potential "
            "difference, and the values used to estimate an attack rate.",
            "",
        ]
        for e in recs:
            eid = e.get("id")
            anchor = environment_anchor(eid)
            link = f"environments.md#{anchor}"

            def cite(prefix, what, e=e, eid=eid, link=link):
                return self.cite(e, prefix, where="sources.md", what=f"{what} of {eid}", link=link)

            shown = {"id", "name", "note", "aliases", "basis", "series", "severity", "allowable_V", "negligible_V",
                     "temperature_range_C", "ionic_strength_mol_per_kg", "resistivity_ohm_m",
                     "cathodic_current_density_uA_per_cm2", "cathodic_current_density_note", "atmospheric_corrosivity"}
            rows = [("Id", f"`{_code(eid)}`")]
            if e.get("aliases"):
                rows.append(("Also known as", ", ".join(esc(a) for a in e["aliases"])))
            if e.get("basis"):
                rows.append(("Basis", esc(e["basis"])))
            if e.get("series"):
                rows.append(("Galvanic series", f"[{esc(e['series'])}](galvanic-series.md)"))
            if e.get("severity"):
                rows.append(("Severity", esc(e["severity"])))
            if e.get("allowable_V") is not None:
                rows.append(("Allowable difference", f"{_num(e['allowable_V'], 2)} V"
                             + cite("allowable", "allowable difference")))
            if e.get("negligible_V") is not None:
                prefix = "negligible" if "negligible_source" in e else "allowable"
                rows.append(("Negligible below", f"{_num(e['negligible_V'], 2)} V"
                             + cite(prefix, "negligible difference")))
            if e.get("temperature_range_C") is not None:
                cit = cite("temperature_range", "temperature range") if "temperature_range_source" in e else ""
                rows.append(("Temperature", _value_text(e["temperature_range_C"], "°C") + cit))
            if e.get("ionic_strength_mol_per_kg") is not None:
                rows.append(("Ionic strength", f"{_num(e['ionic_strength_mol_per_kg'])} mol/kg"
                             + cite("ionic_strength", "ionic strength")))
            if e.get("resistivity_ohm_m") is not None:
                rows.append(("Resistivity", _value_text(e["resistivity_ohm_m"], "Ω·m")
                             + cite("resistivity", "resistivity")))
            if e.get("atmospheric_corrosivity"):
                rows.append(("Atmospheric corrosivity (ISO 9223)",
                             ", ".join(esc(c) for c in e["atmospheric_corrosivity"])
                             + cite("atmospheric_corrosivity", "corrosivity category")))
            if "cathodic_current_density_uA_per_cm2" in e:
                cd = e.get("cathodic_current_density_uA_per_cm2")
                text = _value_text(cd, "µA/cm²") if cd is not None else "not screened"
                if cd is not None:
                    text += cite("cathodic_current_density", "cathodic current density")
                if e.get("cathodic_current_density_note"):
                    text += "<br>" + esc(e["cathodic_current_density_note"])
                rows.append(("Cathodic current density", text))
            rows += self._leftovers(e, shown, "sources.md", eid, link)
            lines += [f"## {esc(e.get('name') or eid)} {{#{anchor}}}", "", "| Property | Value |", "|---|---|"]
            lines += [f"| {k} | {v} |" for k, v in rows]
            lines.append("")
            if e.get("note"):
                lines += [f"Note: {esc(e['note'])}", ""]
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def ions(self):
        recs = self._recs("ions")
        lines = [
            "# Ion-size parameters",
            "",
            "Ion-size parameters å used by the extended Debye–Hückel activity model. Where the table "
            "has no value (–) the calculators fall back to a model that needs none.",
            "",
            "| Ion | Charge | å / Å | Note |",
            "|---|---|---|---|",
        ]
        for r in recs:
            sp = r.get("species")
            anchor = "ion-" + _slug(sp, charges=True)
            size = r.get("size_angstrom")
            size_txt = _num(size) if size is not None else "–"
            lines.append(f"| <span id=\"{anchor}\"></span>{species_html(sp)} | {_signed(r.get('charge'))} | "
                         f"{size_txt}"
                         + self.cite(r, "size", where="sources.md", what=f"ion size of {sp}", link=f"ions.md#{anchor}")
                         + " | "
                         f"{esc(r.get('note'))} |")
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def galvanic_series(self):
        mats = [m for m in self._recs("materials") if isinstance(m.get("seawater_range_V_SCE"), list)]
        mats.sort(key=_galvanic_order)
        chart_file = CHART_PATH.rsplit("/", 1)[-1]
        lines = [
            "# Galvanic series in flowing seawater",
            "",
            SERIES_NOTE.replace("\n", " "),
            "",
            f"![Chart of the corrosion potential ranges of {len(mats)} materials in flowing seawater, "
            f"volts against the saturated calomel electrode, most noble at the top]({chart_file})",
            "",
            "The same ranges as a table (most noble first):",
            "",
            "| Material | UNS | State | Range / V vs SCE |",
            "|---|---|---|---|",
        ]
        for m in mats:
            rng = m["seawater_range_V_SCE"]
            lines.append(f"| [{esc(m.get('name'))}](materials/{material_file(m.get('id'))}) | "
                         f"{esc(', '.join(m.get('uns') or [])) or '–'} | {esc(m.get('state')) or '–'} | "
                         f"{_pair_text(rng, '', places=2)}"
                         f"{self.cite(m, 'seawater', where='sources.md', what=None, link=None)} |")
        lines += [
            "",
            "A galvanic series holds for the electrolyte it was measured in. In a joint, the material "
            "lower in the list tends to become the anode; how fast it corrodes depends on the area "
            "ratio, films, flow and temperature. This is a screening aid: decisions on structural "
            "joints, pressure equipment, potable water or cathodic protection follow the applicable "
            "codes and standards and a qualified corrosion professional.",
        ]
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def cp_criteria(self):
        """The cathodic-protection criteria, grouped by structure, each with its standard and clause."""
        from calc.fieldcheck import SETTINGS, STRUCTURES

        recs = self._recs("cp_criteria")
        electrodes = {r.get("id") for r in self._recs("reference_electrodes")}
        lines = [
            "# Cathodic-protection criteria",
            "",
            "Potential criteria of cathodic protection (CP) as the standards state them: the value, the "
            "reference electrode it is stated against, whether it needs the IR-free (\"instant-off\") "
            "potential, and the standard and clause, with every other document that states the same "
            "criterion. The site-readings calculator and the survey log judge readings against these "
            "records.",
            "",
            "An on reading, taken with the protective current flowing, includes the IR drop of that "
            "current in the soil or water and looks more negative than the structure's polarised "
            "potential. A criterion marked IR-free needs the potential read at the instant the current "
            "is interrupted (instant-off) or on a coupon.",
            "",
            f"{PROVISIONAL} marks a value recalled and not re-read in its standard, or one on which the "
            "documents differ: check it in the standard before relying on it. Where documents differ, the "
            "value used for judging is shown with the span they give.",
            "",
            "!!! warning \"Safety\"",
            "    Criteria apply as the named standard defines them. Follow the operator's procedures, the "
            "local regulation and a qualified cathodic-protection specialist.",
            "",
        ]
        if not recs:
            lines += ["No criteria in this dataset.", ""]
        groups = {}
        for r in recs:
            groups.setdefault(r.get("structure"), []).append(r)
        notes = []
        for sid, group in groups.items():
            title = STRUCTURES[sid][0] if sid in STRUCTURES else sid
            lines += [f"## {esc(title)} {{#cp-structure-{_slug(sid)}}}", "",
                      "| Criterion | Where | Value | IR-free | Standard and clause | Also stated in |",
                      "|---|---|---|---|---|---|"]
            for r in group:
                rid = r.get("id")
                anchor = "cp-" + _slug(rid)
                link = f"cp-criteria.md#{anchor}"
                what = f"CP criterion {rid}"
                kind = r.get("kind")
                el = r.get("electrode")
                el_txt = (f"[{esc(el)}](electrodes.md#{electrode_anchor(el)})" if el in electrodes
                          else esc(el)) if el else ""
                if kind in ("protection", "limit") and _isnum(r.get("potential_V")):
                    sign = "≤" if kind == "protection" else "not below"
                    value = f"{sign} {_signed(r['potential_V'], 2)} V vs {el_txt}"
                elif _isnum(r.get("shift_V")):
                    what_shift = " shift, current on" if kind == "shift-on" else " polarisation"
                    value = f"≥ {_num(round(r['shift_V'] * 1000, 6))} mV" + what_shift
                else:
                    value = esc(r.get("potential_V", r.get("shift_V")))
                rng = r.get("range_V")
                if isinstance(rng, list) and len(rng) == 2:
                    value += f"<br>documents: {_pair_text(rng, 'V', places=2)}"
                temp = r.get("structure_temp_C")
                if isinstance(temp, list) and len(temp) == 2:
                    value += f"<br>structure at {_num(temp[0])} to {_num(temp[1])} °C"
                    ramp = r.get("ramp_C")
                    if isinstance(ramp, list) and len(ramp) == 2:
                        value += f", linear from {_num(ramp[0])} to {_num(ramp[1])} °C"
                settings = r.get("settings") or []
                where = "<br>".join(esc(SETTINGS[s][0] if s in SETTINGS else s) for s in settings)
                std = citation_short(self.sources.get(r.get("source")), r.get("source"))
                src = f"{std}, {esc(r.get('clause'))}" + self.cite(r, "", where="sources.md", what=what, link=link)
                also, also_notes = [], []
                for a in r.get("also") or []:
                    if not isinstance(a, dict):
                        continue
                    short = citation_short(self.sources.get(a.get("source")), a.get("source"))
                    also.append(f"{short}, {esc(a.get('clause'))}"
                                + self.cite(a, "", where="sources.md", what=what, link=link))
                    if a.get("note"):
                        also_notes.append(f"{short}: {esc(a['note'])}")
                flags = f" {PROVISIONAL}" if r.get("provisional") else ""
                lines.append(f"| <span id=\"{anchor}\"></span>**{esc(r.get('name') or rid)}**{flags}<br>"
                             f"`{_code(rid)}` | {where} | {value} | "
                             f"{'yes' if r.get('ir_free') else 'no'} | {src} | {'<br>'.join(also) or '–'} |")
                if r.get("note") or also_notes:
                    text = " ".join([esc(r["note"])] if r.get("note") else [])
                    if also_notes:
                        text += (" " if text else "") + " ".join(n.rstrip(".") + "." for n in also_notes)
                    notes.append(f"- [{esc(r.get('name') or rid)}](#{anchor}): {text}")
            lines.append("")
        if notes:
            lines += ["## Notes", ""] + notes
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)

    def sources_page(self):
        lines = [
            "# Sources",
            "",
            "The published sources behind every value on this site. Each value links here; each entry "
            "lists what it is cited for.",
            "",
        ]
        for s in self._recs("sources"):
            sid = s.get("id")
            anchor = source_anchor(sid)
            lines += [f"## {esc(sid)} {{#{anchor}}}", "", citation(s), ""]
            if s.get("note"):
                lines += [f"Note: {esc(s['note'])}", ""]
            used = [(w, lk) for w, lk in self.cited.get(sid, []) if w]
            if used:
                seen, items = set(), []
                for what, link in used:
                    if (what, link) in seen:
                        continue
                    seen.add((what, link))
                    items.append(f"[{esc(what)}]({link})" if link else esc(what))
                lines += ["Cited for: " + "; ".join(items) + ".", ""]
        lines.append(self.footer("sources.md"))
        return "\n".join(lines)


def _isnum(value):
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def _prefixes(field):
    parts = str(field).split("_")
    return ["_".join(parts[:i]) for i in range(len(parts) - 1, 0, -1)]


def _value_text(value, unit=""):
    """Any data value as escaped text: numbers as written, [a, b] as a range, mappings as k v."""
    unit = f" {unit}" if unit else ""
    if _isnum(value):
        return _num(value) + unit
    if isinstance(value, list) and len(value) == 2 and all(_isnum(v) for v in value):
        return f"{_num(value[0])} to {_num(value[1])}{unit}"
    if isinstance(value, list):
        return ", ".join(_value_text(v) for v in value) + unit
    if isinstance(value, dict):
        return ", ".join(f"{esc(k)} {_value_text(v)}" for k, v in value.items()) + unit
    if isinstance(value, bool):
        return "yes" if value else "no"
    return esc(value) + unit


def _code(text):
    """Text for inside a code span: no backticks, no line breaks (code spans show text literally)."""
    return re.sub(r"\s+", " ", str(text)).replace("`", "'")


def _galvanic_order(m):
    rng = m.get("seawater_range_V_SCE")
    if isinstance(rng, list) and len(rng) == 2 and all(_isnum(v) for v in rng):
        return (0, -rng[1], -rng[0], str(m.get("name")))
    return (1, 0, 0, str(m.get("name")))


#: the flag on a CP criterion recalled and not re-read, or on which the documents differ
PROVISIONAL = ('<abbr class="cw-provisional" title="provisional: recalled and not re-read, or the documents '
               'differ; check it in the standard">provisional</abbr>')


def citation_short(s, source_id=None):
    """A cited document's designation (e.g. ``ISO 15589-1:2015``), or its title and year (escaped).

    >>> citation_short({"container": "EN 12954:2001", "title": "x"})
    'EN 12954&#58;2001'
    """
    if not s:
        return esc(source_id)
    if s.get("container"):
        return esc(s["container"])
    return esc(s.get("title") or source_id) + (f", {esc(s['year'])}" if s.get("year") else "")


def citation(s):
    """One source record as a citation line (escaped)."""
    if not s:
        return "(not in the bibliography)"
    parts = []
    if s.get("author"):
        parts.append(esc(s["author"]))
    if s.get("title"):
        parts.append(f"<cite>{esc(s['title'])}</cite>")
    if s.get("container"):
        parts.append("in " + esc(s["container"]))
    for key, fmt in (("edition", "{} edition"), ("volume", "vol. {}"), ("pages", "pp. {}"),
                     ("publisher", "{}"), ("year", "{}")):
        if s.get(key) is not None:
            parts.append(fmt.format(esc(s[key])))
    text = ". ".join(p for p in parts[:2]) + (", " + ", ".join(parts[2:]) if parts[2:] else "") + "."
    if s.get("table"):
        text += f" {esc(s['table'])}."
    if s.get("doi"):
        text += f" DOI {esc(s['doi'])}."
    if s.get("url"):
        text += f" {esc(s['url'])}"
    return text


def species_html(text):
    """One species as HTML with sub- and superscripts, e.g. ``Fe(OH)2(s)`` -> Fe(OH)<sub>2</sub>(s)."""
    try:
        sp = parse_species(text if str(text).endswith(")") else f"{text}(aq)")
    except (InputError, TypeError):
        return esc(text)
    formula = re.sub(r"(\d+)", r"<sub>\1</sub>", esc(sp.formula))
    if sp.charge:
        mag = abs(sp.charge)
        formula += f"<sup>{'' if mag == 1 else mag}{'+' if sp.charge > 0 else '−'}</sup>"
    coeff = "" if sp.coeff == 1 else (f"{int(sp.coeff)} " if sp.coeff == int(sp.coeff) else f"{sp.coeff:g} ")
    phase = f"({sp.phase})" if str(text).endswith(")") else ""
    return coeff + formula + phase


def reaction_html(rec):
    """The reduction written out: ``Fe3+(aq) + e- -> Fe2+(aq)`` with sub/superscripts."""
    ox, red, n = rec.get("oxidised") or [], rec.get("reduced") or [], rec.get("n")
    electrons = f"{_num(n)} e<sup>−</sup>" if _isnum(n) and n != 1 else "e<sup>−</sup>"
    left = " + ".join([species_html(s) for s in ox] + [electrons])
    right = " + ".join(species_html(s) for s in red)
    return f"{left} → {right}"


def model_text(model):
    """A reference electrode's temperature model in words and a formula (escaped)."""
    kind = model.get("kind")
    t_ref = model.get("t_ref_C", 25)
    if kind == "constant":
        return "constant" + (f" {_signed(model['E_V'])} V" if _isnum(model.get("E_V")) else "")
    if kind == "linear" and _isnum(model.get("slope_mV_per_K")):
        return f"linear: {_signed(model['slope_mV_per_K'])} mV/K from {_num(t_ref)} °C"
    if kind == "polynomial" and isinstance(model.get("coeffs_V"), list):
        x = "t" if t_ref == 0 else f"(t − {_num(t_ref)})"
        terms = []
        for i, c in enumerate(model["coeffs_V"]):
            if not _isnum(c):
                return esc(model.get("coeffs_V"))
            mag = _num(abs(c))
            sign = "−" if c < 0 else "+"
            power = "" if i == 0 else (f" {x}" if i == 1 else f" {x}<sup>{i}</sup>")
            terms.append((sign, mag + power))
        text = ("−" if terms[0][0] == "−" else "") + terms[0][1]
        for sign, t in terms[1:]:
            text += f" {sign} {t}"
        return f"polynomial: E = {text} V (t in °C)"
    return esc(kind)


def generate_pages(bundle, raw_html=True):
    """Every generated reference page of a dataset bundle.

    Args:
        bundle: the validated dataset bundle (see ``sitebuild.dataset.load_bundle``) [unitless]
        raw_html: write tables, lists and "Cited for" lines as raw HTML blocks (what the site
            uses, see :func:`html_blocks`); False gives the plain Markdown they are made from [unitless]

    Returns:
        dict doc path (relative to ``docs/``) -> Markdown text
    """
    p = _Pages(bundle)
    pages = {}
    pages["reference/series.md"] = p.series()
    by_id = {m.get("id"): m for m in p._recs("materials")}
    for m in p._recs("materials"):
        pages[f"reference/materials/{material_file(m.get('id'))}"] = p.material(m, by_id)
    pages["reference/materials/index.md"] = p.materials_index()
    pages["reference/electrodes.md"] = p.electrodes()
    pages["reference/environments.md"] = p.environments()
    pages["reference/ions.md"] = p.ions()
    pages["reference/galvanic-series.md"] = p.galvanic_series()
    pages["reference/cp-criteria.md"] = p.cp_criteria()
    pages["reference/sources.md"] = p.sources_page()  # last: it lists what every other page cited
    if raw_html:
        pages = {path: html_blocks(text, path) for path, text in pages.items()}
    return {path: _with_title(text) for path, text in pages.items()}


# --- the long parts of a page as HTML blocks ---------------------------------------------------------
# The pages are written as Markdown (above); their tables, lists and "Cited for" lines are then
# written out as the HTML Python-Markdown would make of them, as raw HTML blocks: Python-Markdown
# passes a raw block through untouched instead of running its inline patterns over every cell,
# which made the generated pages the costliest part of the build. Headings, the legend and
# other prose stay Markdown (the table of contents and the permalinks are made from them).
# mkdocs does not rewrite links inside raw HTML, so their targets are written as the URLs of the
# built site here (``use_directory_urls: true``, as in mkdocs.yml).
_TABLE_RULE_RE = re.compile(r"^\|(?:-+\|)+$")
_CODE_RE = re.compile(r"`([^`]+)`")
_STRONG_RE = re.compile(r"\*\*(.+?)\*\*")
_LINK_RE = re.compile(r"\[([^\]]*)\]\(([^)\s]+)\)")
_HOLD_RE = re.compile("\x02(\\d+)\x03")


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


def inline_html(text, doc):
    """The Markdown of one table cell or list item, as written by this module, as HTML.

    Only the constructs this module writes occur outside data text (data text is escaped by
    :func:`esc` and holds no Markdown or HTML): code spans, ``**strong**``, links, inline HTML.
    """
    if "`" not in text and "*" not in text and "](" not in text:
        return text  # nothing but escaped text and inline HTML
    held = []

    def hold(fragment):
        held.append(fragment)
        return f"\x02{len(held) - 1}\x03"

    text = _CODE_RE.sub(lambda m: hold("<code>" + html.escape(m.group(1).strip(), quote=False) + "</code>"), text)
    text = _STRONG_RE.sub(r"<strong>\1</strong>", text)
    text = _LINK_RE.sub(lambda m: f'<a href="{_attr(href(m.group(2), doc))}">{m.group(1)}</a>', text)
    return _HOLD_RE.sub(lambda m: held[int(m.group(1))], text)


def _cells(row):
    return [c.strip() for c in row.strip()[1:-1].split("|")]


def html_blocks(markdown_text, doc):
    """A generated page with its tables, bullet lists and "Cited for" lines as raw HTML blocks."""
    lines = markdown_text.split("\n")
    out, i = [], 0
    while i < len(lines):
        line = lines[i]
        if line.startswith("|") and i + 1 < len(lines) and _TABLE_RULE_RE.match(lines[i + 1]):
            block = ["<table>", "<thead>", "<tr>"]
            block += [f"<th>{inline_html(c, doc)}</th>" for c in _cells(line)]
            block += ["</tr>", "</thead>", "<tbody>"]
            i += 2
            while i < len(lines) and lines[i].startswith("|"):
                block.append("<tr>")
                block += [f"<td>{inline_html(c, doc)}</td>" for c in _cells(lines[i])]
                block.append("</tr>")
                i += 1
            block += ["</tbody>", "</table>"]
        elif line.startswith("- "):
            block = ["<ul>"]
            while i < len(lines) and lines[i].startswith("- "):
                block.append(f"<li>{inline_html(lines[i][2:], doc)}</li>")
                i += 1
            block.append("</ul>")
        elif line.startswith("Cited for: ") and (i + 1 == len(lines) or not lines[i + 1].strip()):
            block = [f"<p>{inline_html(line, doc)}</p>"]
            i += 1
        else:
            out.append(line)
            i += 1
            continue
        if out and out[-1].strip():
            out.append("")
        out += block
        if i < len(lines) and lines[i].strip():
            out.append("")
    return "\n".join(out)


def _with_title(markdown_text):
    """Front matter with the page title as plain text.

    mkdocs takes a page's title from its first heading with character references decoded and
    the theme writes it into ``<title>`` unescaped, so data text in a heading could close the
    element. The front-matter title wins over the heading: it carries the same words with the
    characters that HTML would read as markup replaced by look-alikes.
    """
    first = markdown_text.split("\n", 1)[0]
    if not first.startswith("# "):
        return markdown_text
    plain = html.unescape(re.sub(r"<[^>]*>", "", first[2:]))
    plain = plain.translate(_TITLE_SAFE)
    plain = re.sub(r"\s+", " ", plain).strip()
    return "---\ntitle: " + json.dumps(plain, ensure_ascii=False) + "\n---\n\n" + markdown_text


_TITLE_SAFE = str.maketrans({"<": "‹", ">": "›", "&": "+", '"': "”", "'": "’", "`": "’", "\\": "/"})
