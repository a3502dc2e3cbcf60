"""The problem collector and the small helpers every check of the validator shares.

A problem is one line ``file:record:field: message``; ``record`` is the record's id (ions: its
species, else ``#index``) and ``field`` the field concerned (``-`` for a whole file or record).
"""

import difflib

from ..dataset import FILES

#: the kinds of record, in the order their problems are reported
KIND_ORDER = ["sources", "half_reactions", "reference_electrodes", "materials", "environments", "ions",
              "cp_structures", "cp_settings", "cp_criteria", "cp_anode_alloys", "cp_anode_types", "cp_coatings",
              "cp_current_densities", "cp_design_tables", "gibbs_energies", "polarization", "service_defaults"]
#: kind -> file name (a kind the dataset does not read yet is named after its key)
FILE_OF = {kind: f"{kind}.yaml" for kind in KIND_ORDER}
FILE_OF.update({key: fname for fname, key in FILES.items()})
#: how a value was obtained
CONFIDENCES = ("read", "recalled", "computed")


def is_num(value):
    """True for an int or float that is not a bool."""
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def fmt(value):
    """A value as shown in a message: floats short, anything else its repr cut to 80 characters."""
    if isinstance(value, float):
        return f"{value:g}"
    text = repr(value)
    return text if len(text) <= 80 else text[:77] + "..."


def label_of(records, index):
    """A record's label in messages: its id (ions: species), else #index."""
    rec = records[index] if isinstance(records, list) and isinstance(index, int) and index < len(records) else None
    if isinstance(rec, dict):
        for key in ("id", "species"):
            if isinstance(rec.get(key), str) and rec[key].strip():
                return rec[key]
    return f"#{index}"


def field_path(parts):
    """A field's path as written in messages: ``temperature.valid_C``, ``uns[1]``; ``-`` when empty."""
    out = ""
    for part in parts:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out += ("." if out else "") + str(part)
    return out or "-"


def records(raw, kind):
    """The records of a kind, or [] when the file did not hold a list."""
    recs = raw.get(kind)
    return recs if isinstance(recs, list) else []


def each(raw, kind):
    """(label, record) for every record of a kind that is a mapping."""
    recs = records(raw, kind)
    for i, rec in enumerate(recs):
        if isinstance(rec, dict):
            yield label_of(recs, i), rec


def ids_of(raw, kind):
    """id -> record of every record of a kind with a string id."""
    return {rec.get("id"): rec for _, rec in each(raw, kind) if isinstance(rec.get("id"), str)}


def closest_hint(value, known):
    """`` (closest: a, b)`` naming up to three known names like ``value``, or ''."""
    close = difflib.get_close_matches(value, list(known), n=3, cutoff=0.5)
    return f" (closest: {', '.join(close)})" if close else ""


class Collector:
    """Collects problems as file:record:field: message lines."""

    def __init__(self):
        self.lines = []
        self.schema_flagged = {}  # (kind, record) -> fields the schema already reported

    def flag(self, kind, record, field):
        """Note that the schema reported this field."""
        self.schema_flagged.setdefault((kind, record), set()).add(field)

    def flagged(self, kind, record, field):
        """True when the schema already reported this field (or a part or parent of it)."""
        for fld in self.schema_flagged.get((kind, record), ()):
            if fld == field or fld.startswith(field + "[") or field.startswith(fld + "[") \
                    or field.startswith(fld + "."):
                return True
        return False

    def error(self, kind, record, field, message):
        """Report a problem that fails the check."""
        self.lines.append(f"{FILE_OF.get(kind, kind)}:{record}:{field}: {message}")

    def warning(self, kind, record, field, message):
        """Report something a maintainer should look at; it does not fail the check."""
        self.lines.append(f"warning: {FILE_OF.get(kind, kind)}:{record}:{field}: {message}")
