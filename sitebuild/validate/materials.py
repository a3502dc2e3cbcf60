"""Materials: computed equivalent weights follow ASTM G102, UNS numbers are well formed, the
passive and active states of one alloy point at each other, the passive one nobler, and the
composition limits that PREN is computed from are coherent (min <= max, nominal inside them, the
same for both states, chromium given for every stainless steel with a passive state)."""

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
LOW, HIGH = "composition_limits_min_wt_pct", "composition_limits_max_wt_pct"
#: a nominal share may sit outside its limits by rounding only [wt %]
LIMIT_SLACK_WT_PCT = 1e-6
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


def _limits(label, rec, out):
    """The element -> (min, max) limits of a record that are coherent; each incoherent one reported."""
    mins, maxs, good = rec.get(LOW), rec.get(HIGH), {}
    if not (isinstance(mins, dict) and isinstance(maxs, dict)):
        return good
    for el in sorted(set(mins) ^ set(maxs)):
        where, other = (LOW, HIGH) if el in mins else (HIGH, LOW)
        out.error("materials", label, f"{other}", f"{el} has a limit in {where} but none in {other}: give both "
                                                  "(a maximum alone is minimum 0)")
    nominal = rec.get("composition_limits_basis") == "nominal"
    for el in (e for e in mins if e in maxs):
        lo, hi = mins[el], maxs[el]
        if not (is_num(lo) and is_num(hi)):
            continue  # the schema reports the type
        if lo > hi:
            out.error("materials", label, f"{LOW}.{el}", f"minimum {lo:g} wt % above the maximum {hi:g} wt %")
        elif nominal and lo != hi:
            out.error("materials", label, f"{LOW}.{el}", f"limits {lo:g}-{hi:g} wt % with composition_limits_basis "
                                                         "nominal: a nominal value has min = max; use basis "
                                                         "specification for a range")
        else:
            good[el] = (lo, hi)
    return good


def _composition_limits(label, rec, out):
    """The nominal composition lies inside the limits; a stainless steel with a passive state has Cr limits."""
    limits = _limits(label, rec, out)
    comp = rec.get("composition_wt_pct")
    for el, (lo, hi) in limits.items():
        share = comp.get(el) if isinstance(comp, dict) else None
        if is_num(share) and not lo - LIMIT_SLACK_WT_PCT <= share <= hi + LIMIT_SLACK_WT_PCT:
            out.error("materials", label, f"composition_wt_pct.{el}", f"nominal {share:g} wt % lies outside the "
                                                                      f"limits {lo:g}-{hi:g} wt % of the grade")
    if rec.get("family") == "stainless steel" and rec.get("state") in STATES and "Cr" not in limits:
        what = f"has no {LOW}" if LOW not in rec else "gives no Cr limits"
        out.error("materials", label, LOW, f"a stainless steel with a {rec['state']} state {what}: its PREN "
                                           "(Cr + 3.3·Mo + 16·N) needs at least the Cr limits of its standard")


def _same_limits_both_states(label, rec, by_id, out):
    other = by_id.get(rec.get("other_state")) if isinstance(rec.get("other_state"), str) else None
    if other is None or LOW not in rec:
        return
    for fld in (LOW, HIGH):
        if rec.get(fld) != other.get(fld):
            out.error("materials", label, fld, f"composition limits {fmt(rec.get(fld))} differ from those of "
                                               f"{rec['other_state']} {fmt(other.get(fld))}: both states are one alloy")


def check_materials(raw, out):
    """Equivalent weights, UNS numbers, the two states of each alloy and the composition limits."""
    by_id = ids_of(raw, "materials")
    for label, rec in each(raw, "materials"):
        _equivalent_weight(label, rec, out)
        _uns(label, rec, out)
        _other_state(label, rec, by_id, out)
        _composition_limits(label, rec, out)
        _same_limits_both_states(label, rec, by_id, out)
