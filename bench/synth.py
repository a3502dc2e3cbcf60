"""A synthetic dataset N times the shipped one, for the build-scaling benchmark (never shipped).

Every record of every kind is kept and cloned N-1 times. Clone k (1..N-1) of a record:

- sources: id ``<id>-c<k>``; every ``source``/``*_source`` field of a clone points at the
  clone-k source, so every cloned source is used and every value keeps a valid source;
- half-reactions and ions: every element symbol except H and O is renamed to a symbol that is
  no element (a different one per clone and element), in the species and in the id, so the
  stoichiometry still balances in atoms and charge, linked couples stay linked within a clone,
  and acid/alkaline pairs stay pairs. Records made of H and O only (water, H+, OH-, O2) cannot
  get a new id this way and are not cloned;
- reference electrodes, materials, environments: id (and ``other_state``) suffixed
  (``-c<k>`` or `` c<k>``), aliases suffixed, UNS numbers left to the originals, names marked.

Values are the originals: the clones are valid records, not new data.
``python -m bench.synth OUT_DIR [--factor 10]`` writes a data folder (YAML + schema/).
"""

import argparse
import copy
import itertools
import os
import re
import shutil
import string
import sys

HERE = os.path.dirname(os.path.abspath(__file__))
ROOT = os.path.dirname(HERE)
DATA = os.path.join(ROOT, "data")

ELEMENTS = set("""H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga
Ge As Se Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb
Dy Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn Fr Ra Ac Th Pa U Np Pu Am Cm Bk Cf Es
Fm Md No Lr Rf Db Sg Bh Hs Mt Ds Rg Cn Nh Fl Mc Lv Ts Og""".split())
KEEP = {"H", "O"}
SPECIES_RE = re.compile(r"^((?:\d+(?:\.\d+)? )?)(.+?)(\((?:aq|s|l|g)\))$")
TOKEN_RE = re.compile(r"[A-Z][a-z]?")
FILES = ("sources", "half_reactions", "reference_electrodes", "materials", "environments", "ions")


def _pool():
    """Two-letter symbols that are no element, in a fixed order."""
    for a, b in itertools.product(string.ascii_uppercase, string.ascii_lowercase):
        if a + b not in ELEMENTS:
            yield a + b


class Renamer:
    """Element symbol -> stand-in symbol, one map per clone, all stand-ins distinct."""

    def __init__(self):
        self._pool = _pool()
        self._maps = {}

    def symbol(self, clone, element):
        m = self._maps.setdefault(clone, {})
        if element not in m:
            m[element] = next(self._pool)
        return m[element]

    def formula(self, clone, text):
        return TOKEN_RE.sub(lambda t: t.group(0) if t.group(0) in KEEP else self.symbol(clone, t.group(0)), text)

    def species(self, clone, text):
        m = SPECIES_RE.match(text.strip())
        if not m:
            raise ValueError(f"cannot read species {text!r}")
        return m.group(1) + self.formula(clone, m.group(2)) + m.group(3)

    def couple_id(self, clone, rid):
        return "/".join(self.formula(clone, part) for part in rid.split("/"))


def _resource(value, k):
    if isinstance(value, str):
        return f"{value}-c{k}"
    if isinstance(value, list):
        return [_resource(v, k) for v in value]
    return value


def _sources_to_clone(obj, k):
    """Point every source / *_source field (at any depth) at the clone-k source."""
    if isinstance(obj, dict):
        return {key: (_resource(v, k) if key == "source" or key.endswith("_source") or key == "sources"
                      else _sources_to_clone(v, k)) for key, v in obj.items()}
    if isinstance(obj, list):
        return [_sources_to_clone(v, k) for v in obj]
    return obj


def _aliases(rec, k):
    if rec.get("aliases"):
        rec["aliases"] = [f"{a} c{k}" for a in rec["aliases"]]


def clone_record(kind, rec, k, renamer):
    """Clone k of one record, or None when it cannot get a distinct id."""
    if kind == "sources":
        out = copy.deepcopy(rec)
        out["id"] = f"{rec['id']}-c{k}"
        return out
    out = _sources_to_clone(copy.deepcopy(rec), k)
    if kind == "half_reactions":
        new_id = renamer.couple_id(k, rec["id"])
        if new_id == rec["id"]:
            return None
        out["id"] = new_id
        out["oxidised"] = [renamer.species(k, s) for s in rec["oxidised"]]
        out["reduced"] = [renamer.species(k, s) for s in rec["reduced"]]
        out["name"] = f"{rec['name']} (synthetic copy {k})"
        _aliases(out, k)
    elif kind == "ions":
        new = renamer.formula(k, rec["species"])
        if new == rec["species"]:
            return None
        out["species"] = new
    elif kind == "reference_electrodes":
        out["id"] = f"{rec['id']} c{k}"
        out["name"] = f"{rec['name']} (synthetic copy {k})"
        _aliases(out, k)
    elif kind in ("materials", "environments"):
        out["id"] = f"{rec['id']}-c{k}"
        out["name"] = f"{rec['name']} (synthetic copy {k})"
        _aliases(out, k)
        out.pop("uns", None)
        if out.get("other_state"):
            out["other_state"] = f"{rec['other_state']}-c{k}"
    return out


def _cited(obj, acc):
    """Source ids cited anywhere in obj."""
    if isinstance(obj, dict):
        for key, v in obj.items():
            if key == "source" or key.endswith("_source") or key == "sources":
                acc.update(v if isinstance(v, list) else [v])
            else:
                _cited(v, acc)
    elif isinstance(obj, list):
        for v in obj:
            _cited(v, acc)
    return acc


def synthesize(out_dir, factor=10, data_dir=DATA, marker=None):
    """Write a data folder ``factor`` times the size of ``data_dir``; returns record counts
    {kind: (shipped, synthetic)}. A ``marker`` is appended to the first source's note: the
    records stay valid, the data version changes (as after a maintainer's edit).

    Kinds this module does not know are copied as they are (not cloned); a source gets clones
    only where clones cite it."""
    import yaml

    renamer = Renamer()
    os.makedirs(out_dir, exist_ok=True)
    shutil.copytree(os.path.join(data_dir, "schema"), os.path.join(out_dir, "schema"), dirs_exist_ok=True)
    docs = {}
    for fname in sorted(os.listdir(data_dir)):
        if fname.endswith(".yaml"):
            with open(os.path.join(data_dir, fname), encoding="utf-8") as fh:
                docs[fname[:-5]] = yaml.safe_load(fh)
    out, counts = {}, {}
    for kind, doc in docs.items():
        records = doc.get(kind) if isinstance(doc, dict) else None
        if kind not in FILES or kind == "sources" or not isinstance(records, list):
            continue
        recs = list(records)
        for k in range(1, factor):
            recs += [c for c in (clone_record(kind, r, k, renamer) for r in records) if c is not None]
        out[kind] = recs
    if "sources" in docs:
        records = docs["sources"]["sources"]
        cited = _cited(out, set())
        recs = list(records)
        if marker and recs:
            recs[0] = dict(recs[0], note=(recs[0].get("note", "") + f" [{marker}]").strip())
        for k in range(1, factor):
            recs += [clone_record("sources", r, k, renamer) for r in records if f"{r['id']}-c{k}" in cited]
        out["sources"] = recs
    for kind, doc in docs.items():
        if kind in out:
            counts[kind] = (len(doc[kind]), len(out[kind]))
            text = yaml.safe_dump({kind: out[kind]}, allow_unicode=True, sort_keys=False, width=120)
            with open(os.path.join(out_dir, kind + ".yaml"), "w", encoding="utf-8") as fh:
                fh.write(f"# yaml-language-server: $schema=schema/{kind}.schema.json\n")
                fh.write(f"# Synthetic: the shipped {kind} and {factor - 1} renamed copies (benchmark only).\n")
                fh.write(text)
        else:  # a kind this generator does not know: kept as it is
            shutil.copy2(os.path.join(data_dir, kind + ".yaml"), os.path.join(out_dir, kind + ".yaml"))
            recs = next((v for v in doc.values() if isinstance(v, list)), []) if isinstance(doc, dict) else []
            counts[kind] = (len(recs), len(recs))
    return counts


def main(argv=None):
    p = argparse.ArgumentParser(prog="python -m bench.synth", description=__doc__.splitlines()[0])
    p.add_argument("out_dir")
    p.add_argument("--factor", type=int, default=10)
    ns = p.parse_args(argv)
    for kind, (a, b) in synthesize(ns.out_dir, ns.factor).items():
        print(f"{kind:22s} {a:5d} -> {b:6d}")
    return 0


if __name__ == "__main__":
    sys.exit(main())
