"""Where each value was read: every value flagged ``read`` names its place in the document read.

A value's confidence ``<field>_confidence: read`` needs ``<field>_where`` in the same mapping
(``E0_confidence`` -> ``E0_where``); a mapping's own ``confidence: read`` (a record, a group or a
table row holding one value) needs ``where``. The text names a place a reader can find again: a
table and its row, a page, a figure, an equation ("Table 1, row Zn2+/Zn", "p. 27", "Eq. 5.14").
A value whose place cannot be named was not read: flag it ``recalled``.
"""

from .collect import FILE_OF, each, field_path
from .sources import NO_SOURCE_FIELDS, _numeric

_SUFFIX = "_confidence"


def where_key(conf_key):
    """The ``where`` field that goes with a confidence field.

    >>> where_key("E0_confidence"), where_key("confidence")
    ('E0_where', 'where')
    """
    return "where" if conf_key == "confidence" else conf_key[: -len(_SUFFIX)] + "_where"


def _has_text(value):
    return isinstance(value, str) and bool(value.strip())


def _value_field(mapping, conf_key):
    """The field the confidence is about: ``E0_V`` for ``E0_confidence``, else the where key."""
    if conf_key == "confidence":
        return None
    prefix = conf_key[: -len(_SUFFIX)] + "_"
    for key in mapping:
        if isinstance(key, str) and key.startswith(prefix) and not key.endswith(("_source", _SUFFIX, "_where")):
            return key
    return None


def _mappings(value, path=()):
    """(path, mapping) of a record and of every mapping nested in it (list items included)."""
    if isinstance(value, dict):
        yield path, value
        for key, sub in value.items():
            yield from _mappings(sub, path + (key,))
    elif isinstance(value, list):
        for i, sub in enumerate(value):
            yield from _mappings(sub, path + (i,))


def _orphans(mapping):
    """``<field>_where`` keys with no ``<field>_confidence`` beside them."""
    for key in mapping:
        if isinstance(key, str) and key.endswith("_where") and key[: -len("_where")] + _SUFFIX not in mapping:
            yield key


def check_where(raw, out):
    """Every value flagged ``read`` says where it was read; no ``_where`` stands without its value."""
    for flag in each_flag(raw):
        if flag.confidence == "read" and not _has_text(flag.where):
            src = f" in {flag.source!r}" if isinstance(flag.source, str) else ""
            out.error(flag.kind, flag.record, flag.field,
                      f"value flagged read{src} but no '{flag.where_key}': say where in the document it was read "
                      "(e.g. 'Table 1, row Zn2+/Zn', 'p. 27', 'Eq. 5.14'), or flag it recalled")
    for kind in (k for k in FILE_OF if k != "sources"):
        for label, rec in each(raw, kind):
            for path, mapping in _mappings(rec):
                for key in _orphans(mapping):
                    out.error(kind, label, field_path(path + (key,)),
                              f"'{key}' without '{key[:-len('_where')]}{_SUFFIX}': a place read belongs to a value")


class Flag:
    """One confidence flag: where it stands, what it says, the source and place it names."""

    __slots__ = ("kind", "record", "field", "group", "confidence", "source", "where", "where_key")

    def __init__(self, kind, record, field, group, confidence, source, where, where_key):
        self.kind, self.record, self.field, self.group = kind, record, field, group
        self.confidence, self.source, self.where, self.where_key = confidence, source, where, where_key


def _group_of(path, conf_key):
    """The kind of value a flag is about: ``E0`` for ``E0_confidence``, else the mapping's path
    without list indices (``temperature``, ``also``) or ``record`` for the record's own."""
    if conf_key != "confidence":
        head = [p for p in path if isinstance(p, str)]
        return ".".join(head + [conf_key[: -len(_SUFFIX)]])
    names = [p for p in path if isinstance(p, str)]
    return ".".join(names) if names else "record"


def each_flag(raw, kinds=None):
    """Every confidence flag of the records (``sources`` excluded), in file and record order.

    Args:
        raw: top-level key -> list of records (the raw files or the bundle) [unitless]
        kinds: the kinds to walk; default every kind the dataset reads [unitless]

    Returns:
        an iterator of :class:`Flag`

    >>> raw = {"ions": [{"species": "H+", "size_angstrom": 9, "source": "s", "confidence": "read", "where": "row H"}]}
    >>> [(f.kind, f.record, f.field, f.group, f.confidence, f.where) for f in each_flag(raw, ["ions"])]
    [('ions', 'H+', 'size_angstrom', 'record', 'read', 'row H')]
    """
    for kind in kinds or [k for k in FILE_OF if k != "sources"]:
        for label, rec in each(raw, kind):
            for path, mapping in _mappings(rec):
                for key, conf in mapping.items():
                    if not (isinstance(key, str) and (key == "confidence" or key.endswith(_SUFFIX))):
                        continue
                    src_key = "source" if key == "confidence" else key[: -len(_SUFFIX)] + "_source"
                    field = _value_field(mapping, key) if key != "confidence" else _first_value(mapping)
                    wkey = where_key(key)
                    yield Flag(kind, label, field_path(path + ((field or wkey),)), _group_of(path, key),
                               conf, mapping.get(src_key), mapping.get(wkey), field_path(path + (wkey,)))


def _first_value(mapping):
    """The first field of a mapping that holds a sourced value (a number or numbers), for naming a flag."""
    for key, value in mapping.items():
        if isinstance(key, str) and key not in NO_SOURCE_FIELDS and _numeric(value):
            return key
    return None
