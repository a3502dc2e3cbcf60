"""The environments a joint can be judged in, one section each."""

from .links import environment_anchor
from .text import Md
from .values import leftover_rows, num, value_text

ENVIRONMENTS_PAGE = "reference/environments.md"
#: the fields the rows below show (the others are listed as they are, see leftover_rows)
SHOWN = {"id", "name", "note", "aliases", "basis", "series", "severity", "allowable_V", "negligible_V",
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
    if e.get("series"):
        rows.append(("Galvanic series", page.a(e["series"], "galvanic-series.md")))
    if e.get("severity"):
        rows.append(("Severity", Md.escape(e["severity"])))
    if e.get("allowable_V") is not None:
        rows.append(("Allowable difference", Md("{} V").format(num(e["allowable_V"], 2))
                     + cite("allowable", "allowable difference")))
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


def environments_page(site):
    """Every environment: basis, allowable difference and the values of the rate estimate."""
    page = site.page(ENVIRONMENTS_PAGE)
    sections = [{"title": e.get("name") or e.get("id"), "anchor": environment_anchor(e.get("id")),
                 "rows": _rows(page, e), "note": e.get("note")} for e in site.recs("environments")]
    return page.render("environments.md.j2", sections=sections)
