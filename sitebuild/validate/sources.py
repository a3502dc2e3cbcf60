"""Sources: every ``source``/``*_source`` id exists in sources.yaml, every source is cited, every
value has a source and a confidence (its own, a fallback's or its record's). A restatement names
the original it reproduces (``restates``), which counts as cited."""

from ..dataset import FILES
from .collect import CONFIDENCES, KIND_ORDER, closest_hint, each, field_path, fmt, is_num

#: numeric fields that are conditions or definitions, not values read in a source
NO_SOURCE_FIELDS = {"n", "charge", "valid_C", "t_ref_C", "temperature_range_C"}
#: a value without its own source (and confidence) field may use another value's
SOURCE_FALLBACK = {
    "composition_wt_pct": ["equivalent_weight"],
    "negligible_V": ["allowable"],
}


def _source_fields(rec, prefix=()):
    """(field path, value) of every source/*_source field, nested mappings included."""
    for key, value in rec.items():
        if key == "source" or (isinstance(key, str) and key.endswith("_source")):
            yield prefix + (key,), value
        elif isinstance(value, dict):
            yield from _source_fields(value, prefix + (key,))
        elif isinstance(value, list):  # lists of citations (e.g. cp_criteria also[])
            for i, item in enumerate(value):
                if isinstance(item, dict):
                    yield from _source_fields(item, prefix + (key, i))


def _numeric(value):
    """True for a number, or a non-empty list or mapping of numbers."""
    if is_num(value):
        return True
    if isinstance(value, list) and value:
        return all(is_num(v) for v in value)
    if isinstance(value, dict) and value:
        return all(is_num(v) for v in value.values())
    return False


def _prefixes(field):
    """The field's name cut at each '_', longest first: E0_V -> [E0]; a_b_c -> [a_b, a]."""
    parts = field.split("_")
    return ["_".join(parts[:i]) for i in range(len(parts) - 1, 0, -1)]


def _source_problem(kind, label, rec, chain, field, key, value, out):
    prefixes = _prefixes(key)
    own = [p + "_source" for p in prefixes + SOURCE_FALLBACK.get(key, [])]
    if not any(c in rec for c in own) and not any("source" in r for r in chain):
        want = (prefixes[-1] + "_source") if prefixes else "source"
        out.error(kind, label, field, f"value {fmt(value)} has no source: add '{want}' with an id from sources.yaml")


def _confidence_problem(kind, label, rec, chain, path, key, value, out):
    prefixes = _prefixes(key)
    own = [p + "_confidence" for p in prefixes + SOURCE_FALLBACK.get(key, [])]
    conf_key = next((c for c in own if c in rec), None)
    holder = rec if conf_key else next((r for r in chain if "confidence" in r), None)
    if holder is None:
        want = (prefixes[-1] + "_confidence") if prefixes else "confidence"
        out.error(kind, label, field_path(path + (key,)), f"value {fmt(value)} has no confidence: add '{want}' "
                                                          f"(one of {', '.join(CONFIDENCES)})")
        return
    ckey = conf_key or "confidence"
    conf = holder.get(ckey)
    if conf not in CONFIDENCES:
        cfield = field_path(path + (ckey,)) if holder is rec else ckey
        out.error(kind, label, cfield, f"confidence {fmt(conf)} is not one of {', '.join(CONFIDENCES)}")


def _value_sourcing(kind, label, rec, out, parents=(), path=()):
    """Every numeric value has a source and a confidence (its own, a fallback or the record's)."""
    chain = (rec,) + parents
    for key, value in rec.items():
        if not isinstance(key, str):
            continue
        if isinstance(value, dict) and not _numeric(value):
            _value_sourcing(kind, label, value, out, chain, path + (key,))
            continue
        if key in NO_SOURCE_FIELDS or key.endswith(("_source", "_confidence")) or value is None or not _numeric(value):
            continue
        _source_problem(kind, label, rec, chain, field_path(path + (key,)), key, value, out)
        _confidence_problem(kind, label, rec, chain, path, key, value, out)


def _cited_ids(raw, known, out):
    """Every source id cited by a record (unknown ids reported), each record's values checked too."""
    used = set()
    for kind in (k for k in KIND_ORDER if k != "sources"):
        for label, rec in each(raw, kind):
            for path, value in _source_fields(rec):
                if not isinstance(value, str):
                    continue  # the schema reports the type
                used.add(value)
                if known is not None and value not in known:
                    out.error(kind, label, field_path(path),
                              f"unknown source id {value!r}: not in sources.yaml{closest_hint(value, known)}")
            _value_sourcing(kind, label, rec, out)
    return used


def _restated_ids(raw, known, out):
    """The originals that restatements name (``restates``): each must be a source; it counts as cited."""
    used = set()
    for label, rec in each(raw, "sources"):
        orig = rec.get("restates")
        if not isinstance(orig, str):
            continue
        used.add(orig)
        if known is not None and orig not in known:
            out.error("sources", label, "restates",
                      f"unknown source id {orig!r}: the original a restatement reproduces must be in sources.yaml"
                      f"{closest_hint(orig, known)}")
        elif orig == rec.get("id"):
            out.error("sources", label, "restates", "a source cannot restate itself")
    return used


def check_sources(raw, out):
    """Unknown, uncited and missing sources, and values without a confidence."""
    have_sources = isinstance(raw.get("sources"), list)
    ids = {}
    for label, rec in each(raw, "sources"):
        if isinstance(rec.get("id"), str):
            ids.setdefault(rec["id"], label)
    used = _cited_ids(raw, ids if have_sources else None, out)
    used |= _restated_ids(raw, ids if have_sources else None, out)
    # uncited sources only when every file was read (a source may be cited in an unreadable file)
    if have_sources and all(isinstance(raw.get(k), list) for k in KIND_ORDER if k in FILES.values()):
        for sid, label in ids.items():
            if sid not in used:
                out.error("sources", label, "id", f"source {sid!r} is cited by no value: remove it or cite it")

