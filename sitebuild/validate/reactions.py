"""Half-reactions: the species parse (:func:`calc.species.parse_species`, the one grammar), atoms
and charge balance, and the id names the reaction's oxidised and reduced species."""

import functools
import re

from calc.errors import InputError
from calc.species import balance_problems, parse_species

from .collect import each, fmt, is_num

K = "half_reactions"


def name_key(text):
    """Compare species names the way ids write them: 'Hg2^2+' = 'Hg2 2+' = 'Hg22+'."""
    return re.sub(r"[\s^]", "", str(text))


@functools.lru_cache(maxsize=None)
def key_name(key):
    """The name key of a species key of a reaction vector: 'Fe3+(aq)' -> 'Fe3+' ('e-' stays)."""
    return key if key == "e-" else name_key(parse_species(key).name)


def reaction(rec):
    """Net stoichiometry {species key: coefficient} (oxidised side +, reduced side -, 'e-': n), or None."""
    ox, red, n = rec.get("oxidised"), rec.get("reduced"), rec.get("n")
    if not (isinstance(ox, list) and isinstance(red, list) and is_num(n)):
        return None
    vec = {"e-": float(n)}
    try:
        for sign, side in ((1, ox), (-1, red)):
            for text in side:
                sp = parse_species(text)
                vec[sp.key] = vec.get(sp.key, 0.0) + sign * sp.coeff
    except InputError:
        return None
    return {k: v for k, v in vec.items() if abs(v) > 1e-12}


def _sides_read(label, rec, out):
    """True when both sides are non-empty lists of species that parse (each that does not is reported)."""
    sides_ok = True
    for side in ("oxidised", "reduced"):
        species = rec.get(side)
        if not isinstance(species, list) or not species:
            sides_ok = False
            continue  # the schema reports the shape
        for i, text in enumerate(species):
            try:
                parse_species(text)
            except InputError as exc:
                sides_ok = False
                out.error(K, label, f"{side}[{i}]", f"species {fmt(text)} cannot be read: expected {exc.allowed} "
                                                    "(e.g. '2 H2O(l)', 'Hg2^2+(aq)', 'Fe(OH)2(s)')")
    return sides_ok


def _id_names_species(label, rec, out):
    rid = rec.get("id")
    if not isinstance(rid, str):
        return
    if rid.count("/") != 1:
        out.error(K, label, "id", f"id {rid!r} must be written OXIDISED/REDUCED with one '/' (e.g. 'Fe3+/Fe2+')")
        return
    for part, side, form in zip(rid.split("/"), ("oxidised", "reduced"), ("oxidised form", "reduced form")):
        if name_key(part) not in {name_key(parse_species(s).name) for s in rec[side]}:
            out.error(K, label, "id", f"the id names {part!r} as the {form}, but {side} lists {', '.join(rec[side])}")


def check_stoichiometry(raw, out):
    """Species that parse, balanced atoms and charge, and an id that names the reaction."""
    for label, rec in each(raw, K):
        n = rec.get("n")
        if not _sides_read(label, rec, out) or not is_num(n):
            continue
        for prob in balance_problems(rec["oxidised"], rec["reduced"], n):
            out.error(K, label, "n" if prob.startswith("charge") else "reduced",
                      f"the half-reaction does not balance: {prob}")
        _id_names_species(label, rec, out)
