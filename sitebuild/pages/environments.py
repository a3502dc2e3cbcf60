"""The environments a joint can be judged in, one section each."""

from calc.scope import IMMERSION_RULE, SERIES_SCOPE_BASIS

from .links import environment_anchor
from .text import Md
from .values import leftover_rows, num, value_text

ENVIRONMENTS_PAGE = "reference/environments.md"
#: the fields the rows below show (the others are listed as they are, see leftover_rows)
SHOWN = {"id", "name", "note", "aliases", "basis", "series", "electrolyte", "severity", "allowable_V", "negligible_V",
         "temperature_range_C", "ionic_strength_mol_per_kg", "resistivity_ohm_m",
         "cathodic_current_density_uA_per_cm2", "cathodic_current_density_note", "atmospheric_corrosivity"}


def _cathodic_current(e, cite):
    cd = e.get("cathodic_current_density_uA_per_cm2")
    if cd is None:
        text = Md("not screened")
    else:
        text = value_text(cd, "µA/cm²") + cite("cathodic_current_density", "cathodic current density")
    if e.get("cathodic_current_density_note"):
        text += Md("<br>{}").format(e["cathodic_current_density_note"])
    return text


def _rows(page, e):
    eid = e.get("id")
    link = f"environments.md#{environment_anchor(eid)}"

    def cite(prefix, what):
        return page.cite(e, prefix, what=f"{what} of {eid}", link=link)

    rows = [("Id", page.code(eid))]
    if e.get("aliases"):
        rows.append(("Also known as", Md(", ").join(e["aliases"])))
    if e.get("basis"):
        rows.append(("Basis", Md.escape(e["basis"])))
    if e.get("electrolyte"):
        rows.append(("Electrolyte", Md.escape(e["electrolyte"])))
    if e.get("series"):
        rows.append(("Galvanic series", page.a(e["series"], "galvanic-series.md")
                     + (cite("series", "choice of series") if "series_source" in e else Md())))
    if e.get("severity"):
        rows.append(("Severity class", Md.escape(e["severity"])
                     + (cite("severity", "severity class") if "severity_source" in e else Md())))
    if e.get("allowable_V") is not None:
        rows.append(("Allowable difference", Md("{} V").format(num(e["allowable_V"], 2))
                     + cite("allowable", "allowable difference")))
        if e.get("basis") == "galvanic-series" and e.get("severity") == "harsh":
            rows.append(("Why this allowance", Md.escape(IMMERSION_RULE[0].upper() + IMMERSION_RULE[1:] + ".")))
    if e.get("negligible_V") is not None:
        rows.append(("Negligible below", Md("{} V").format(num(e["negligible_V"], 2))
                     + cite("negligible" if "negligible_source" in e else "allowable", "negligible difference")))
    if e.get("temperature_range_C") is not None:
        cit = cite("temperature_range", "temperature range") if "temperature_range_source" in e else Md()
        rows.append(("Temperature", value_text(e["temperature_range_C"], "°C") + cit))
    if e.get("ionic_strength_mol_per_kg") is not None:
        rows.append(("Ionic strength", Md("{} mol/kg").format(num(e["ionic_strength_mol_per_kg"]))
                     + cite("ionic_strength", "ionic strength")))
    if e.get("resistivity_ohm_m") is not None:
        rows.append(("Resistivity", value_text(e["resistivity_ohm_m"], "Ω·m") + cite("resistivity", "resistivity")))
    if e.get("atmospheric_corrosivity"):
        rows.append(("Atmospheric corrosivity (ISO 9223)", Md(", ").join(e["atmospheric_corrosivity"])
                     + cite("atmospheric_corrosivity", "corrosivity category")))
    if "cathodic_current_density_uA_per_cm2" in e:
        rows.append(("Cathodic current density", _cathodic_current(e, cite)))
    return rows + leftover_rows(page, e, SHOWN, eid, link)


def _caveat(e, by_id):
    """The loud caveat of an environment judged on a series measured in another electrolyte, or None."""
    series = by_id.get(e.get("series")) or {}
    own, theirs = e.get("electrolyte"), series.get("electrolyte")
    if e.get("basis") != "galvanic-series" or not own or not theirs or own == theirs:
        return None
    return Md("Joints in {} are judged on the galvanic series measured in {}, not in {}: {}. Positions and the "
              "order of close neighbours may differ here; no series measured in {} is in the dataset, so "
              "treat these verdicts as a rough first screen and measure the potentials on site where the "
              "joint matters.").format(e.get("name") or e.get("id"), series.get("name") or e.get("series"),
                                       own, SERIES_SCOPE_BASIS, own)


def environments_page(site):
    """Every environment: basis, allowable difference and the values of the rate estimate."""
    page = site.page(ENVIRONMENTS_PAGE)
    recs = site.recs("environments")
    by_id = {e.get("id"): e for e in recs}
    sections = [{"title": e.get("name") or e.get("id"), "anchor": environment_anchor(e.get("id")),
                 "rows": _rows(page, e), "note": e.get("note"), "caveat": _caveat(e, by_id)} for e in recs]
    return page.render("environments.md.j2", sections=sections)
