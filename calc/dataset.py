"""The bundled dataset: records by id, forgiving lookups, the data version.

The dataset is the validated bundle of ``data/*.yaml`` written at build time as ``dataset.json``
(see ``sitebuild.dataset``). In the browser it ships inside the calc wheel
(``calc/dataset.json``); on the command line it is bundled from the YAML on first use.
"""

import difflib
import json
import os
import re

from .errors import DataError, InputError

KINDS = ("half_reactions", "reference_electrodes", "materials", "environments", "ions", "sources", "cp_criteria")
_BUNDLE_NAME = "dataset.json"
_current = None


def _norm(text):
    """Lookup key: case-folded, spaces, hyphens and underscores dropped."""
    return re.sub(r"[\s_\-]+", "", str(text)).casefold()


class Dataset:
    """Records of every kind, indexed by id, alias and (materials) UNS number."""

    def __init__(self, bundle):
        if not isinstance(bundle, dict) or "half_reactions" not in bundle:
            raise DataError("dataset bundle is not a dict with half_reactions")
        self.bundle = bundle
        self.version = bundle.get("version", "unversioned")
        self.date = bundle.get("date", "")
        self._index = {}
        for kind in KINDS:
            idx = {}
            for rec in bundle.get(kind, []):
                keys = [rec.get("id")] + list(rec.get("aliases", []) or [])
                if kind == "materials":
                    keys += list(rec.get("uns", []) or [])
                if kind == "ions":
                    keys = [rec.get("species")]
                for k in keys:
                    if k is not None:
                        idx.setdefault(_norm(k), rec)
            self._index[kind] = idx

    def records(self, kind):
        """All records of a kind, in file order."""
        return list(self.bundle.get(kind, []))

    def get(self, kind, name, field=None):
        """Look a record up by id, alias or UNS number (case-insensitive).

        Args:
            kind: one of half_reactions, reference_electrodes, materials, environments, ions, sources [unitless]
            name: the id, an alias or a UNS number [unitless]
            field: the input field name used in an error message [unitless]

        Returns:
            the record (a dict)
        """
        field = field or kind.rstrip("s")
        if not isinstance(name, str) or not name.strip():
            raise InputError(field, name, f"the id of one of the {len(self.bundle.get(kind, []))} {kind.replace('_', ' ')}")
        rec = self._index[kind].get(_norm(name))
        if rec is None:
            ids = [r.get("id") or r.get("species") for r in self.bundle.get(kind, [])]
            close = difflib.get_close_matches(name, ids, n=3, cutoff=0.4)
            if not close:  # try aliases and UNS numbers too, and report the record ids they belong to
                keys = list(self._index[kind])
                near = difflib.get_close_matches(_norm(name), keys, n=6, cutoff=0.4)
                close = []
                for k in near:
                    rid = self._index[kind][k].get("id") or self._index[kind][k].get("species")
                    if rid not in close:
                        close.append(rid)
                close = close[:3]
            hint = ("closest: " + ", ".join(close)) if close else "see the reference pages for the list"
            raise InputError(field, name, f"a known {kind.replace('_', ' ')[:-1]} id", hint)
        return rec

    def source(self, source_id):
        """The citation record of a source id, or None."""
        return self._index["sources"].get(_norm(source_id))


def set_dataset(bundle):
    """Install a dataset bundle (a dict or JSON text) as the current one and return it."""
    global _current
    if isinstance(bundle, (str, bytes)):
        bundle = json.loads(bundle)
    _current = Dataset(bundle)
    return _current


def current():
    """The current dataset: installed, shipped beside calc, or bundled from the project's data/."""
    global _current
    if _current is not None:
        return _current
    here = os.path.dirname(os.path.abspath(__file__))
    shipped = os.path.join(here, _BUNDLE_NAME)
    if os.path.exists(shipped):
        with open(shipped, encoding="utf-8") as fh:
            return set_dataset(json.load(fh))
    try:
        from sitebuild.dataset import DataProblems, load_project_bundle  # build-time tools, CPython only
    except ImportError as exc:  # pragma: no cover - only without the project checkout
        raise DataError("no dataset.json beside calc and no project data/ to bundle") from exc
    try:
        return set_dataset(load_project_bundle())
    except DataProblems as exc:
        raise DataError(f"the project's data has {len(exc.problems)} problem(s); run 'couplewise data check': "
                        + exc.problems[0]) from None
