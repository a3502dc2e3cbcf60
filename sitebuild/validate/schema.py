"""JSON Schema (Draft 2020-12) of ``schema/<file>.schema.json``: every error, each at its field."""

import functools
import json
import os
import re

from ..dataset import PROJECT_DATA
from .collect import FILE_OF, field_path, label_of

MAX_SCHEMA_ERRORS_PER_FILE = 200


def schema_path(fname, data_dir):
    """The schema of a data file: the folder's own schema/, else the project's; None when neither has it."""
    name = fname[:-5] + ".schema.json"
    for base in (os.path.join(data_dir, "schema"), os.path.join(PROJECT_DATA, "schema")):
        path = os.path.join(base, name)
        if os.path.exists(path):
            return path
    return None


def _message(err):
    msg = err.message
    return msg if len(msg) <= 240 else msg[:237] + "..."


def _leaf_errors(err):
    """The errors worth showing for one schema error.

    For ``oneOf``/``anyOf`` the branch meant is the one whose discriminator (a ``const`` or
    ``enum`` at the branch's top, e.g. ``kind: linear``) matches, else the branch with the
    fewest errors; its errors are shown, each at its own field.
    """
    if err.validator not in ("oneOf", "anyOf") or not err.context:
        return [err]
    branches = {}
    for sub in err.context:
        branches.setdefault(sub.schema_path[0] if sub.schema_path else 0, []).append(sub)
    depth = len(err.absolute_path)

    def mismatched(errs):  # the branch is for another kind of value (kind: linear, null, ...)
        return any((e.validator in ("const", "enum") and len(e.absolute_path) == depth + 1)
                   or (e.validator == "type" and len(e.absolute_path) == depth) for e in errs)

    candidates = [b for b in branches.values() if not mismatched(b)] or list(branches.values())
    return [leaf for sub in min(candidates, key=len) for leaf in _leaf_errors(sub)]


@functools.lru_cache(maxsize=64)
def _compiled(text):
    """(validator, schema) of a schema's text, checked against the metaschema once per text."""
    from jsonschema import Draft202012Validator

    schema = json.loads(text)
    Draft202012Validator.check_schema(schema)
    return Draft202012Validator(schema), schema


def _validator(kind, path, out):
    """(validator, schema) of a schema file, or None after reporting why it cannot be used."""
    from jsonschema.exceptions import SchemaError

    try:
        with open(path, encoding="utf-8") as fh:
            return _compiled(fh.read())
    except (OSError, ValueError) as exc:
        out.error(kind, "-", "-", f"schema {os.path.basename(path)} cannot be read: {exc}")
    except SchemaError as exc:
        out.error(kind, "-", "-", f"schema {os.path.basename(path)} is not a valid JSON Schema: {exc.message}")
    return None


def _located_errors(validator, schema, kind, records):
    """(path from the record list, error) of every error, the schema being of the file, list or record."""
    props = schema.get("properties", {}) if isinstance(schema, dict) else {}
    if isinstance(props, dict) and kind in props:  # the schema describes the whole file
        return [(list(e.absolute_path)[1:], e) for e in validator.iter_errors({kind: records})]
    if isinstance(schema, dict) and schema.get("type") == "array":  # the schema describes the list
        return [(list(e.absolute_path), e) for e in validator.iter_errors(records)]
    located = []  # the schema describes one record
    for i, rec in enumerate(records if isinstance(records, list) else []):
        located += [([i] + list(e.absolute_path), e) for e in validator.iter_errors(rec)]
    return located


def _leaves(located):
    """Every leaf error at its own path, sorted by path."""
    flat = []
    for path, err in located:
        extra = len(err.absolute_path)
        for leaf in _leaf_errors(err):
            flat.append((path + list(leaf.absolute_path)[extra:], leaf))
    flat.sort(key=lambda pe: [str(p) for p in pe[0]])
    return flat


def _missing(label, rest, err):
    if err.validator == "required":
        return [(label, field_path(rest + [name]), "required field is missing")
                for name in err.validator_value if name not in err.instance]
    return [(label, field_path(rest + [name]), f"required field is missing (needed with '{given}')")
            for given, needs in (err.validator_value or {}).items()
            if given in err.instance and isinstance(needs, list)
            for name in needs if name not in err.instance]


def _unknown(label, rest, err):
    known = set(err.schema.get("properties", {}) or {})
    patterns = list((err.schema.get("patternProperties") or {}).keys())
    extras = [k for k in err.instance if k not in known and not any(re.search(p, str(k)) for p in patterns)]
    if not extras:
        return [(label, field_path(rest), _message(err))]
    return [(label, field_path(rest + [name]), "unknown field: not in the schema (check the spelling)")
            for name in extras]


def _lines_of(records, path, err):
    """(record label, field, message) lines of one leaf error."""
    if not path:
        return [("-", "-", _message(err))]
    label = label_of(records, path[0]) if isinstance(path[0], int) else "-"
    rest = path[1:] if isinstance(path[0], int) else path
    if isinstance(err.instance, dict):
        if err.validator in ("required", "dependentRequired", "dependencies"):
            return _missing(label, rest, err)
        if err.validator in ("additionalProperties", "unevaluatedProperties"):
            return _unknown(label, rest, err)
    return [(label, field_path(rest), _message(err))]


def schema_problems(kind, records, data_dir, out):
    """Every schema error of one kind's records, at most MAX_SCHEMA_ERRORS_PER_FILE shown."""
    fname = FILE_OF[kind]
    path = schema_path(fname, data_dir)
    if path is None:
        out.error(kind, "-", "-", f"no JSON Schema schema/{fname[:-5]}.schema.json to validate against")
        return
    loaded = _validator(kind, path, out)
    if loaded is None:
        return
    lines = [line for p, err in _leaves(_located_errors(*loaded, kind, records)) for line in _lines_of(records, p, err)]
    unique = list(dict.fromkeys(lines))
    for label, field, msg in unique[:MAX_SCHEMA_ERRORS_PER_FILE]:
        out.error(kind, label, field, f"schema: {msg}")
        out.flag(kind, label, field)
    if len(unique) > MAX_SCHEMA_ERRORS_PER_FILE:
        out.error(kind, "-", "-", f"schema: {len(unique) - MAX_SCHEMA_ERRORS_PER_FILE} more schema problems not shown")
