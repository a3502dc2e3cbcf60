"""Materials: computed equivalent weights follow ASTM G102, UNS numbers are well formed, and the
passive and active states of one alloy point at each other, the passive one nobler."""

import re

from calc.elements import atomic_weight
from calc.errors import DataError, InputError
from calc.rate import equivalent_weight

from .collect import each, fmt, ids_of, is_num
from .ranges import SERIES_FIELDS

#: a computed equivalent weight may differ from its recomputation by rounding only [fraction]
EW_WARN_FRACTION = 0.002
EW_ERROR_FRACTION = 0.01
STATES = ("passive", "active")
UNS_RE = re.compile(r"^[A-Z][0-9]{5}$")


def _recomputed_ew(label, comp, valences, out):
    """ASTM G102's 1/Σ(f_i·n_i/W_i) over the elements given a valence, or None (warned when it cannot be)."""
    for el, n in valences.items():
        if atomic_weight(el) is None or not (is_num(comp.get(el)) and is_num(n)):
            out.warning("materials", label, f"equivalent_weight_valences.{el}", "cannot re-compute the equivalent "
                        f"weight: {el} needs a mass fraction in composition_wt_pct and a known atomic weight")
            return None
    try:
        return equivalent_weight({el: comp[el] for el in valences}, valences, min_wt_pct=0.0).value_g
    except DataError as exc:  # an element calc.rate holds no atomic weight or valence for
        out.warning("materials", label, "equivalent_weight_valences", f"cannot re-compute the equivalent weight: {exc}")
    except (InputError, ZeroDivisionError):
        pass  # shares or valences out of range, or none above zero: the schema and ranges report them
    return None


def _equivalent_weight(label, rec, out):
    """A computed EW must equal ASTM G102's 1/Σ(f_i·n_i/W_i) over the elements given a valence."""
    ew, comp, val = rec.get("equivalent_weight_g"), rec.get("composition_wt_pct"), rec.get("equivalent_weight_valences")
    if not (is_num(ew) and ew > 0 and isinstance(comp, dict) and isinstance(val, dict) and val):
        return
    recomputed = _recomputed_ew(label, comp, val, out)
    if recomputed is None:
        return
    rel = abs(ew - recomputed) / recomputed
    text = (f"equivalent weight {ew:g} g, but 1/Σ(f·n/W) over composition_wt_pct and equivalent_weight_valences "
            f"gives {recomputed:.2f} g ({rel * 100:.1f} % apart; ASTM G102)")
    if rel > EW_ERROR_FRACTION:
        out.error("materials", label, "equivalent_weight_g", text)
    elif rel > EW_WARN_FRACTION:
        out.warning("materials", label, "equivalent_weight_g", text)


def _uns(label, rec, out):
    uns = rec.get("uns")
    for i, u in enumerate(uns if isinstance(uns, list) else []):
        if isinstance(u, str) and not UNS_RE.match(u):
            out.error("materials", label, f"uns[{i}]", f"{u!r} is not a UNS number: a capital letter and five "
                                                       "digits, e.g. S31600")


def _passive_nobler(label, rec, other, orec, out):
    for fld in SERIES_FIELDS.values():
        p, a = rec.get(fld), orec.get(fld)
        if all(isinstance(v, list) and len(v) == 2 and all(is_num(x) for x in v) for v in (p, a)) and p[1] <= a[1]:
            out.error("materials", label, fld, f"the passive range {fmt(p)} is not nobler than the active range of "
                                               f"{other} {fmt(a)}")


def _states(label, rec, other, orec, out):
    k, state = "materials", rec.get("state")
    if orec.get("other_state") != rec.get("id"):
        out.error(k, label, "other_state", f"other_state {other!r} does not point back: {other} has other_state "
                                           f"{fmt(orec.get('other_state'))}")
    if state not in STATES:
        out.error(k, label, "state", f"state {fmt(state)} with an other_state: expected passive or active")
    elif orec.get("state") == state:
        out.error(k, label, "state", f"{label} and {other} are both {state!r}: one must be passive, the other active")
    elif state == "passive":
        _passive_nobler(label, rec, other, orec, out)


def _other_state(label, rec, by_id, out):
    k, other = "materials", rec.get("other_state")
    if other is None:
        if rec.get("state") in STATES:
            out.warning(k, label, "other_state", f"state is {rec.get('state')!r} but no other_state names the "
                                                 "same alloy in its other state")
    elif not isinstance(other, str):
        return
    elif other == rec.get("id"):
        out.error(k, label, "other_state", "other_state points to the record itself")
    elif other not in by_id:
        out.error(k, label, "other_state", f"other_state {other!r} is not a material id")
    else:
        _states(label, rec, other, by_id[other], out)


def check_materials(raw, out):
    """Equivalent weights, UNS numbers and the two states of each alloy."""
    by_id = ids_of(raw, "materials")
    for label, rec in each(raw, "materials"):
        _equivalent_weight(label, rec, out)
        _uns(label, rec, out)
        _other_state(label, rec, by_id, out)
