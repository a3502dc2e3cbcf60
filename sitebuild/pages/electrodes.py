"""The reference electrodes: potential at 25 °C, temperature model and its range, sources.

The page states the temperature model of each electrode as the dataset gives it; the model
itself (E at a temperature) is ``calc.refelec.temperature_model_E``, which the calculators use.
"""

from .links import electrode_anchor
from .text import DASH, Md
from .values import isnum, num, range_text, signed

ELECTRODES_PAGE = "reference/electrodes.md"


def model_text(model):
    """A reference electrode's temperature model in words and a formula (escaped).

    >>> model_text({"kind": "linear", "t_ref_C": 25, "slope_mV_per_K": 0.9})
    Md('linear: +0.9 mV/K from 25 °C')
    >>> model_text({"kind": "polynomial", "t_ref_C": 0, "coeffs_V": [0.2412, -6.61e-4]})
    Md('polynomial: E = 0.2412 − 0.000661 t V (t in °C)')
    """
    kind = model.get("kind")
    t_ref = model.get("t_ref_C", 25)
    if kind == "constant":
        return Md("constant")
    if kind == "linear" and isnum(model.get("slope_mV_per_K")):
        return Md("linear: {} mV/K from {} °C").format(signed(model["slope_mV_per_K"]), num(t_ref))
    if kind == "polynomial" and isinstance(model.get("coeffs_V"), list):
        x = "t" if t_ref == 0 else f"(t − {num(t_ref)})"
        terms = []
        for i, c in enumerate(model["coeffs_V"]):
            if not isnum(c):
                return Md.escape(model.get("coeffs_V"))
            power = "" if i == 0 else (f" {x}" if i == 1 else f" {x}<sup>{i}</sup>")
            terms.append(("−" if c < 0 else "+", num(abs(c)) + Md(power)))
        text = Md("−" if terms[0][0] == "−" else "") + terms[0][1]
        for sign, term in terms[1:]:
            text += Md(f" {sign} ") + term
        return Md("polynomial: E = {} V (t in °C)").format(text)
    return Md.escape(kind)


def _row(page, r):
    rid = r.get("id")
    anchor = electrode_anchor(rid)
    link = f"electrodes.md#{anchor}"
    e = signed(r.get("E_V_SHE"), 2) + page.cite(r, "", what=f"E of {rid}", link=link)
    model = r.get("temperature")
    if isinstance(model, dict):
        valid = model.get("valid_C")
        valid_txt = range_text(valid, "°C") if isinstance(valid, list) and len(valid) == 2 else DASH
        msrc = page.cite(model, "", what=f"temperature model of {rid}", link=link, parent=r).strip() or DASH
        model_cells = [model_text(model), valid_txt, msrc]
    else:
        model_cells = [DASH, DASH, DASH]
    name = Md("{}{}<br>{}").format(page.span(anchor), page.strong(rid), r.get("name"))
    if r.get("aliases"):
        name += Md("<br>also: ") + Md(", ").join(r["aliases"])
    return [name, e] + model_cells


def _note(page, r):
    model = r.get("temperature")
    parts = []
    if r.get("note"):
        parts.append(Md.escape(r["note"]))
    if r.get("spread"):
        parts.append(Md("Published values: {}").format(r["spread"]))
    if isinstance(model, dict) and model.get("note"):
        parts.append(Md("Temperature model: {}").format(model["note"]))
    if not parts:
        return None
    return page.a(r.get("id"), f"#{electrode_anchor(r.get('id'))}") + Md(": ") + Md(" ").join(parts)


def electrodes_page(site):
    """Every reference electrode, with its temperature model and notes."""
    page = site.page(ELECTRODES_PAGE)
    recs = site.recs("reference_electrodes")
    rows = [_row(page, r) for r in recs]
    notes = [n for n in (_note(page, r) for r in recs) if n]
    return page.render("electrodes.md.j2", rows=rows, notes=notes)
