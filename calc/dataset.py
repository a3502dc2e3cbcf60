"""The bundled dataset: records by id, forgiving lookups, the data version.

The dataset is the validated bundle of ``data/*.yaml`` written by the build tools as
``calc/dataset.json`` (see ``sitebuild.dataset``). The engine reads that file and nothing else:
in the browser it ships inside the calc wheel; in a checkout the bundle records a digest of the
YAML files it came from (:func:`yaml_digest`, standard library only), and a bundle whose digest
no longer matches ``data/`` is refused as stale. The command line then rebuilds it with the build
tools (``couplewise data bundle``).
"""

import difflib
import hashlib
import json
import os

from .errors import DataError, InputError
from .requests import norm as _norm

KINDS = ("half_reactions", "reference_electrodes", "materials", "environments", "ions", "sources", "cp_criteria",
         "cp_structures", "cp_settings", "cp_anode_alloys", "cp_anode_types", "cp_coatings", "cp_current_densities",
         "cp_design_tables", "gibbs_energies", "polarization", "service_defaults")
_BUNDLE_NAME = "dataset.json"
#: the bundle's layout; a bundle written by other bundling code is refused (bump on a change)
BUNDLE_FORMAT = 2
HERE = os.path.dirname(os.path.abspath(__file__))
#: where the engine's bundle lives, and the project's data folder in a checkout
BUNDLE_PATH = os.path.join(HERE, _BUNDLE_NAME)
PROJECT_DATA = os.path.join(os.path.dirname(HERE), "data")
_current = None


def data_files():
    """File name of each kind of record in a data folder, in bundle order: ``<kind>.yaml``.

    Returns:
        the file names [unitless]

    References:
        Project layout (DESIGN.md: one YAML file per kind of record).

    >>> data_files()[0]
    'half_reactions.yaml'
    """
    return tuple(kind + ".yaml" for kind in KINDS)


def yaml_digest(data_dir):
    """Digest of the YAML files of a data folder, as the bundle records it (standard library only).

    Args:
        data_dir: the data folder [unitless]

    Returns:
        a hex digest, or None when the folder holds none of the files

    References:
        SHA-256 (FIPS 180-4) over each file's name and bytes, in :func:`data_files` order.

    >>> yaml_digest("/nonexistent") is None
    True
    """
    h, found = hashlib.sha256(b"couplewise-data 1\0"), False
    for name in data_files():
        path = os.path.join(data_dir, name)
        h.update(name.encode() + b"\0")
        if os.path.isfile(path):
            found = True
            with open(path, "rb") as fh:
                h.update(hashlib.sha256(fh.read()).digest())
        else:
            h.update(b"missing")
    return h.hexdigest()[:16] if found else None


def stale_reason(bundle, data_dir=PROJECT_DATA):
    """Why a bundle does not match the data folder beside calc, or None when it does.

    Args:
        bundle: a bundle dict [unitless]
        data_dir: the data folder it should come from (absent in the browser: never stale) [unitless]

    Returns:
        plain words, or None

    References:
        Project convention (calc refuses a stale bundle; the command line rebuilds it).

    >>> stale_reason({"format": BUNDLE_FORMAT, "yaml_digest": "x"}, "/nonexistent") is None
    True
    """
    if bundle.get("format") != BUNDLE_FORMAT:
        return f"it was written by other bundling code (format {bundle.get('format')!r}, expected {BUNDLE_FORMAT})"
    digest = yaml_digest(data_dir)
    if digest is not None and bundle.get("yaml_digest") != digest:
        return f"data/ has changed since it was bundled (digest {bundle.get('yaml_digest')} there, {digest} now)"
    return None


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
    """Install a dataset bundle (a dict or JSON text) as the current one and return it.

    Args:
        bundle: a bundle dict, or its JSON text [unitless]

    Returns:
        the installed :class:`Dataset`

    References:
        Project convention (DESIGN.md: calc reads its dataset.json).

    >>> import calc.dataset
    >>> saved = calc.dataset._current
    >>> set_dataset({"half_reactions": [], "version": "demo"}).version
    'demo'
    >>> calc.dataset._current = saved
    """
    global _current
    if isinstance(bundle, (str, bytes)):
        bundle = json.loads(bundle)
    _current = Dataset(bundle)
    return _current


def current():
    """The current dataset: the one installed, else ``calc/dataset.json`` (refused when stale).

    Returns:
        the :class:`Dataset`; raises DataError when there is no usable bundle

    References:
        Project convention (DESIGN.md: the engine reads its dataset.json, nothing else).

    >>> len(current().records("half_reactions")) > 0
    True
    """
    global _current
    if _current is not None:
        return _current
    try:
        with open(BUNDLE_PATH, encoding="utf-8") as fh:
            bundle = json.load(fh)
    except FileNotFoundError:
        raise DataError("no dataset.json beside calc: run 'couplewise data bundle' (or 'make site')") from None
    except (OSError, ValueError) as exc:
        raise DataError(f"calc/dataset.json cannot be read ({exc}): run 'couplewise data bundle'") from None
    reason = stale_reason(bundle)
    if reason:
        raise DataError(f"calc/dataset.json is stale: {reason}; run 'couplewise data bundle'")
    return set_dataset(bundle)
