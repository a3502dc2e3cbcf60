"""The catalogue of cathodic-protection criteria: structures, settings, criteria, reading kinds.

The structures (``data/cp_structures.yaml``) and settings (``data/cp_settings.yaml``) are data
with their sources, like the criteria (``data/cp_criteria.yaml``) that name them. Lookups are
forgiving: an id, an alias or the name, with case, spaces, hyphens and underscores ignored.
"""

from ..dataset import current
from ..errors import DataError, InputError
from ..requests import norm

READING_KINDS = ("on", "instant-off")
#: the states of a judged reading (their words: calc.field.cpwords.STATES)
VERDICTS = ("protected", "unconfirmed", "not protected", "over-protected")
#: the two catalogues, each with plain words for one of its entries
CATALOGUES = {"cp_structures": "a structure", "cp_settings": "a setting"}


def catalogue(kind):
    """The records of one catalogue of the dataset, in file order.

    Args:
        kind: ``cp_structures`` or ``cp_settings`` [unitless]

    Returns:
        list of records (dicts with id, name, source, confidence; structures also aliases,
        settings also electrolyte)

    References:
        data/cp_structures.yaml and data/cp_settings.yaml (each record cites the standard whose
        criteria table defines it).

    >>> [r["id"] for r in catalogue("cp_settings")][:2]
    ['soil-aerobic', 'soil-anaerobic']
    """
    recs = current().records(kind)
    if not recs:
        raise DataError(f"the dataset holds no {kind} records: rebuild it ('couplewise data bundle')")
    return recs


def lookup(kind, name, field, what=None):
    """The id of a structure or setting given by id, alias or name (case, spaces and hyphens ignored).

    Args:
        kind: ``cp_structures`` or ``cp_settings`` [unitless]
        name: what the user gave [unitless]
        field: the request field, for the error [unitless]
        what: plain words for the kind of thing, for the error (default: a structure, a setting) [unitless]

    Returns:
        the id

    References:
        Lookup rule of the project (DESIGN.md: lookups are forgiving).

    >>> lookup("cp_structures", "Mild Steel", "structure")
    'carbon-steel'
    """
    recs = catalogue(kind)
    if isinstance(name, str) and name.strip():
        key = norm(name)
        for rec in recs:
            if key in {norm(rec["id"]), norm(rec["name"]), *(norm(a) for a in rec.get("aliases") or ())}:
                return rec["id"]
    raise InputError(field, name, f"{what or CATALOGUES[kind]}: one of " + ", ".join(r["id"] for r in recs))


def name_of(kind, rid):
    """The name of a structure or setting, as shown to the user.

    Args:
        kind: ``cp_structures`` or ``cp_settings`` [unitless]
        rid: its id [unitless]

    Returns:
        the name

    References:
        data/cp_structures.yaml, data/cp_settings.yaml.

    >>> name_of("cp_settings", "seawater-aerobic")
    'Immersed in aerobic seawater'
    """
    return next(r["name"] for r in catalogue(kind) if r["id"] == rid)


def standard_name(ds, source_id):
    """Short name of a cited document: its designation (container) or title and year.

    Args:
        ds: the dataset [unitless]
        source_id: an id of data/sources.yaml [unitless]

    Returns:
        text

    References:
        Presentation of data/sources.yaml (no published method).

    >>> standard_name(current(), "iso-15589-1-2015")
    'ISO 15589-1:2015'
    """
    src = ds.source(source_id) or {}
    if src.get("container"):
        return src["container"]
    title = src.get("title") or source_id
    return f"{title}, {src['year']}" if src.get("year") else title


def reading_kind(value):
    """The kind of a CP reading: ``on`` or ``instant-off`` (also ``off``, ``instant off``).

    Args:
        value: what the user gave [unitless]

    Returns:
        ``on`` or ``instant-off``

    References:
        Terms of CP practice (NACE SP0169-2013 and ISO 15589-1:2015 use on and instant-off potentials).

    >>> reading_kind("Instant Off"), reading_kind("ON")
    ('instant-off', 'on')
    """
    key = norm(value) if isinstance(value, str) else None
    if key == "on":
        return "on"
    if key in ("instantoff", "off"):
        return "instant-off"
    raise InputError("reading_kind", value, "on (current flowing) or instant-off (current just interrupted)")


def criteria_for(structure, setting):
    """The CP criteria records of the dataset for a structure in a setting.

    Args:
        structure: structure id of data/cp_structures.yaml [unitless]
        setting: setting id of data/cp_settings.yaml [unitless]

    Returns:
        list of criteria records (dicts), in file order

    References:
        data/cp_criteria.yaml (each record cites its standard and clause).

    >>> [r["id"] for r in criteria_for("carbon-steel", "seawater-aerobic")]
    ['steel-seawater-aerobic', 'steel-seawater-limit']
    """
    return [r for r in current().records("cp_criteria")
            if r.get("structure") == structure and setting in (r.get("settings") or [])]


def settings_with_criteria(structure):
    """The settings the dataset holds criteria for, for one structure.

    Args:
        structure: structure id of data/cp_structures.yaml [unitless]

    Returns:
        sorted list of setting ids

    References:
        data/cp_criteria.yaml.

    >>> settings_with_criteria("stainless-pren-40")
    ['seawater-aerobic']
    """
    return sorted({s for r in current().records("cp_criteria") if r.get("structure") == structure
                   for s in r.get("settings", [])})


def describe(ds, rec):
    """A criterion record as a result shows it: its standard, clause, confidence and other documents.

    Args:
        ds: the dataset [unitless]
        rec: a record of data/cp_criteria.yaml [unitless]

    Returns:
        dict (id, name, kind, standard, clause, source, confidence, provisional, ir_free,
        electrode, note, condition, also)

    References:
        data/cp_criteria.yaml (each record cites its standard and clause).

    >>> describe(current(), criteria_for("carbon-steel", "soil-aerobic")[0])["standard"]
    'UFC 3-570-06'
    """
    return {"id": rec["id"], "name": rec.get("name", rec["id"]), "kind": rec["kind"],
            "standard": standard_name(ds, rec["source"]), "clause": rec.get("clause"), "source": rec["source"],
            "confidence": rec.get("confidence"), "provisional": bool(rec.get("provisional")),
            "ir_free": bool(rec.get("ir_free")), "electrode": rec.get("electrode"), "note": rec.get("note"),
            "condition": rec.get("condition"),
            "also": [{"source": a["source"], "standard": standard_name(ds, a["source"]),
                      "clause": a.get("clause"), "confidence": a.get("confidence"), "note": a.get("note")}
                     for a in rec.get("also") or []]}
