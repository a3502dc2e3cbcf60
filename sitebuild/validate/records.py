"""Records of every kind: duplicate ids, aliases and UNS numbers; environments and ions coherent.

Duplicates are compared the way calc's lookups compare names (:func:`calc.requests.norm`), so
two names that a lookup cannot tell apart are reported.
"""

import re

from calc.errors import InputError
from calc.requests import norm as lookup_key
from calc.species import parse_species

from .collect import KIND_ORDER, each, fmt, is_num
from .ranges import SERIES_FIELDS

SEVERITIES = ("harsh", "normal", "controlled")


# --- duplicates ------------------------------------------------------------------------------------
def _names(kind, rec):
    """(field, text) of every name a lookup finds the record by."""
    if kind == "ions":
        names = [("species", rec.get("species"))]
    else:
        names = [("id", rec.get("id"))]
        aliases = rec.get("aliases")
        if isinstance(aliases, list):
            names += [(f"aliases[{i}]", a) for i, a in enumerate(aliases)]
    if kind == "materials" and isinstance(rec.get("uns"), list):
        names += [(f"uns[{i}]", u) for i, u in enumerate(rec["uns"])]
    return names


def linked_states(a, b):
    """True when two material records are the two states (passive, active) of one alloy."""
    other_a, other_b = a.get("other_state"), b.get("other_state")
    return other_a is not None and (other_a == b.get("id") or other_b == a.get("id"))


def _shared_uns(kind, field, first_field, rec, first_rec):
    """The same alloy in its passive and active states shares its UNS numbers."""
    return kind == "materials" and field.startswith("uns") and first_field.startswith("uns") \
        and linked_states(rec, first_rec)


def _duplicates_of(kind, raw, out):
    seen = {}  # key -> (label, field, text, record)
    for label, rec in each(raw, kind):
        mine = set()
        for field, text in _names(kind, rec):
            if not isinstance(text, str) or not text.strip():
                continue
            key = lookup_key(text)
            if key in mine:
                continue  # the same name twice in one record is redundant, not ambiguous
            mine.add(key)
            if key not in seen:
                seen[key] = (label, field, text, rec)
                continue
            first_label, first_field, first_text, first_rec = seen[key]
            if not _shared_uns(kind, field, first_field, rec, first_rec):
                out.error(kind, label, field, f"{text!r} is already used by {first_label} ({first_field} "
                                              f"{first_text!r}); lookups ignore case, spaces, '-' and '_'")


def check_duplicates(raw, out):
    """Duplicate ids, aliases and UNS numbers within each kind."""
    for kind in KIND_ORDER:
        _duplicates_of(kind, raw, out)


# --- environments and ions ----------------------------------------------------------------------------
def check_environments(raw, out):
    """A galvanic-series basis names a series the materials carry; an anodic-index one a severity."""
    k = "environments"
    for label, rec in each(raw, k):
        basis = rec.get("basis")
        if basis == "galvanic-series":
            series = rec.get("series")
            if series is None:
                out.error(k, label, "series", "an environment on the galvanic-series basis needs 'series' "
                                              f"(one of {', '.join(SERIES_FIELDS)})")
            elif series not in SERIES_FIELDS:
                out.error(k, label, "series", f"series {fmt(series)} is not one the materials carry: "
                                              f"expected one of {', '.join(SERIES_FIELDS)}")
        elif basis == "anodic-index":
            sev = rec.get("severity")
            if sev not in SEVERITIES:
                out.error(k, label, "severity", f"severity {fmt(sev)} on the anodic-index basis: expected one of "
                                                f"{', '.join(SEVERITIES)}")


def _charge_hint(sp, z):
    """How to write a formula that ends in a digit and carries charge ±1, e.g. 'HPO4^-'."""
    m = re.match(r"^(.*[A-Za-z)])(\d+)([+-])$", sp)
    if m and "^" not in sp and abs(z) == 1:
        return (f"; digits before the sign are the charge, so when the formula ends in a digit "
                f"write {m.group(1) + m.group(2) + '^' + m.group(3)!r}")
    return ""


def check_ions(raw, out):
    """Each ion's species reads as a charged species and its charge field agrees with it."""
    k = "ions"
    for label, rec in each(raw, k):
        sp, z = rec.get("species"), rec.get("charge")
        if not isinstance(sp, str):
            continue
        try:
            parsed = parse_species(sp if sp.endswith(")") else sp + "(aq)")
        except InputError:
            out.error(k, label, "species", f"species {sp!r} cannot be read: expected an ion such as 'Zn2+' or 'SO4^2-'")
            continue
        if parsed.charge == 0:
            out.error(k, label, "species", f"species {sp!r} carries no charge: ions.yaml holds ions")
        elif is_num(z) and z != parsed.charge:
            out.error(k, label, "charge", f"value {fmt(z)} differs from the charge written in {sp!r} "
                                          f"({parsed.charge:+d}){_charge_hint(sp, z)}")
