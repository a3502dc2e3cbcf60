"""Bundle the YAML dataset into one JSON-ready dict with a content hash as its version.

Build-time only (CPython with PyYAML). The bundle is validated first: any problem stops the
bundling with every problem listed (see :mod:`sitebuild.validate`).
"""

import datetime
import hashlib
import json
import os

from calc.dataset import KINDS, data_files

HERE = os.path.dirname(os.path.abspath(__file__))
PROJECT_ROOT = os.path.dirname(HERE)
PROJECT_DATA = os.path.join(PROJECT_ROOT, "data")

#: file name -> top-level key: one file per kind of record, the kinds the engine knows
FILES = {name: kind for name, kind in zip(data_files(), KINDS)}


class DataProblems(Exception):
    """The data folder has problems; ``problems`` lists them all as file:record:field: message."""

    def __init__(self, problems):
        self.problems = list(problems)
        super().__init__(f"{len(self.problems)} data problem(s):\n" + "\n".join(self.problems))


def read_folder(data_dir):
    """Read every dataset file of a folder with the strict loader. Returns (raw dict, problems)."""
    from .yamlsafe import load_file

    raw, problems = {}, []
    for fname, key in FILES.items():
        path = os.path.join(data_dir, fname)
        if not os.path.exists(path):
            problems.append(f"{fname}:-:-: file is missing")
            continue
        doc, probs = load_file(path)
        problems.extend(probs)
        if isinstance(doc, dict):
            raw[key] = doc.get(key, [])
    return raw, problems


def bundle_from_raw(raw, data_dir=None):
    """Add the version (content hash), date, bundle format and YAML digest to the records, and
    each half-reaction's species parsed (``species``: the page holds no species grammar)."""
    from calc.dataset import BUNDLE_FORMAT, yaml_digest
    from calc.species import as_record

    body = {key: raw.get(key, []) for key in FILES.values()}
    text = json.dumps(body, sort_keys=True, ensure_ascii=False, separators=(",", ":"))
    digest = hashlib.sha256(text.encode("utf-8")).hexdigest()[:12]
    body["half_reactions"] = [dict(rec, species=[as_record(t, side) for side in ("oxidised", "reduced")
                                                 for t in rec.get(side) or []])
                              for rec in body["half_reactions"]]
    body["version"] = digest
    body["date"] = os.environ.get("COUPLEWISE_DATA_DATE") or _data_date()
    body["format"] = BUNDLE_FORMAT
    body["yaml_digest"] = yaml_digest(data_dir) if data_dir else None
    return body


def _data_date():
    """Date of the newest data file (so the same data gives the same bundle date)."""
    newest = 0.0
    for fname in FILES:
        path = os.path.join(PROJECT_DATA, fname)
        if os.path.exists(path):
            newest = max(newest, os.path.getmtime(path))
    return datetime.date.fromtimestamp(newest or 0).isoformat()


def load_bundle(data_dir):
    """Read, validate and bundle a data folder; raises DataProblems listing every error."""
    from .validate import validate_raw

    raw, problems = read_folder(data_dir)
    if not problems:
        problems = [p for p in validate_raw(raw, data_dir) if not p.startswith("warning")]
    if problems:
        raise DataProblems(problems)
    return bundle_from_raw(raw, data_dir)


CACHE_DIR = os.path.join(os.path.dirname(HERE), ".cache")

#: the code that reads, checks and bundles the data (project-relative paths): a cached bundle is
#: valid only for the code that made it, so these files' bytes are part of the cache key
BUNDLER_SOURCES = tuple(sorted(
    os.path.relpath(os.path.join(d, f), PROJECT_ROOT).replace(os.sep, "/")
    for folder in ("calc", os.path.join("sitebuild", "validate"))  # the validator calls calc's models
    for d, _, names in os.walk(os.path.join(PROJECT_ROOT, folder)) if "__pycache__" not in d
    for f in names if f.endswith(".py"))) + ("sitebuild/dataset.py", "sitebuild/yamlsafe.py")


def _files_digest(data_dir):
    """Cache key of a data folder's bundle: data and schema bytes, and the bundling code's bytes."""
    h = hashlib.sha256()
    for rel in BUNDLER_SOURCES:
        h.update(b"code\0" + rel.encode() + b"\0")
        try:
            with open(os.path.join(PROJECT_ROOT, rel), "rb") as fh:
                h.update(hashlib.sha256(fh.read()).digest())
        except OSError:
            h.update(b"missing")
    for fname in sorted(FILES):
        path = os.path.join(data_dir, fname)
        h.update(fname.encode() + b"\0")
        if os.path.exists(path):
            with open(path, "rb") as fh:
                h.update(hashlib.sha256(fh.read()).digest())
    # the schemas the validator uses: the folder's own schema/, else the project's (as
    # sitebuild.validate.schema.schema_path looks them up)
    schema_dirs = [os.path.join(data_dir, "schema"), os.path.join(PROJECT_DATA, "schema")]
    seen = set()
    for sdir in schema_dirs:
        names = sorted(os.listdir(sdir)) if os.path.isdir(sdir) else []
        for name in names:
            if name in seen:
                continue
            seen.add(name)
            with open(os.path.join(sdir, name), "rb") as fh:
                h.update(name.encode() + hashlib.sha256(fh.read()).digest())
    return h.hexdigest()[:20]


def load_project_bundle(data_dir=None, use_cache=True):
    """The validated bundle of the project's own data/ (or another folder).

    A bundle that passed validation is cached in .cache/ under a hash of the data and schema
    files' bytes and of the code that validates and bundles them (``BUNDLER_SOURCES``), so the
    command line starts fast; any edit to the data or to that code makes a new hash and a full
    validation.
    """
    data_dir = data_dir or PROJECT_DATA
    cache = os.path.join(CACHE_DIR, f"dataset-{_files_digest(data_dir)}.json") if use_cache else None
    if cache and os.path.exists(cache):
        try:
            with open(cache, encoding="utf-8") as fh:
                return json.load(fh)
        except (OSError, ValueError):
            pass
    bundle = load_bundle(data_dir)
    if cache:
        try:
            os.makedirs(CACHE_DIR, exist_ok=True)
            tmp = cache + ".tmp"
            with open(tmp, "w", encoding="utf-8") as fh:
                json.dump(bundle, fh, ensure_ascii=False)
            os.replace(tmp, cache)
        except OSError:
            pass  # a read-only checkout still works, only slower
    return bundle


def write_engine_bundle(data_dir=None, path=None):
    """Validate and bundle a data folder into the engine's ``calc/dataset.json``; returns its path.

    What the command line does when calc refuses a missing or stale bundle
    (``couplewise data bundle``); the test session does it first too (``tests/conftest.py``).
    """
    from calc.dataset import BUNDLE_PATH

    bundle = load_project_bundle(data_dir)
    path = path or BUNDLE_PATH
    tmp = path + ".tmp"
    with open(tmp, "w", encoding="utf-8") as fh:
        json.dump(bundle, fh, ensure_ascii=False, separators=(",", ":"), allow_nan=False)
    os.replace(tmp, path)
    return path
