"""Validation of the dataset: JSON Schema first, then semantic checks; every problem collected.

Each problem is one line ``file:record:field: message`` where ``record`` is the record's id (or
``#index`` when it has none) and ``field`` the field concerned (``-`` when the problem is about a
whole file or record). Lines that start with ``warning`` report something a maintainer should look
at (for example two handbook values that agree only to a few millivolts) but do not fail a check.

Checks, in order:

1. file shape: the ``# yaml-language-server`` first line, one top-level key per file;
2. JSON Schema (Draft 2020-12) of ``schema/<file>.schema.json``, every error reported;
3. sources: every ``source``/``*_source`` id exists, every source is used, every value has a
   source and a confidence;
4. duplicate ids, aliases and UNS numbers within a kind (compared the way lookups compare them);
5. physical ranges and range ends in the right order;
6. half-reactions: species parse, atoms and charge balance, the id names the reaction's species;
7. thermodynamic consistency: free-energy additivity of linked couples (A: X→Y, B: Y→Z,
   C: X→Z), and acid/alkaline forms of a couple through the ionic product of water;
8. reference electrodes: the temperature model gives ``E_V_SHE`` at 25 °C within 1 mV;
9. materials: ``other_state`` links point back, passive states are nobler than active ones;
10. environments and ions: basis, series, tiers and charges are coherent;
11. cathodic-protection criteria: structure, setting and electrode ids exist, values and ranges
    are coherent, one base criterion and one limit per structure and setting, limits below
    protection potentials.
"""

import json
import math
import os
import re

from calc.constants import FARADAY, T_STANDARD, nernst_slope
from calc.dataset import _norm as lookup_key  # the key calc's lookups use: duplicates must differ in it
from calc.errors import InputError
from calc.species import balance_problems, parse_species

from .dataset import FILES, PROJECT_DATA

FILE_OF = {key: fname for fname, key in FILES.items()}
KIND_ORDER = ["sources", "half_reactions", "reference_electrodes", "materials", "environments", "ions",
              "cp_criteria"]

CONFIDENCES = ("read", "recalled", "computed")
MAX_SCHEMA_ERRORS_PER_FILE = 200

# --- physical bounds (generous: they catch typos and unit slips, not handbook disagreements) -------
#: standard potentials of aqueous couples lie within about -3.1 V (Li) and +2.9 V (F2) [V vs SHE]
#: (common practice; bounds as set in the project brief)
E0_RANGE_V = (-4.0, 3.5)
#: electrons transferred in a tabulated half-reaction [unitless] (project brief)
N_RANGE = (1, 8)
#: isothermal temperature coefficients of tabulated couples stay within about ±2 mV/K [mV/K]
#: (common practice; e.g. O2/OH- is about -1.68 mV/K, Bratsch 1989 Table 2, from memory)
DEDT_RANGE_MV_PER_K = (-5.0, 5.0)
#: reaction heat-capacity changes of simple couples [J/(mol·K)] (common practice)
DCP_RANGE = (-1500.0, 1500.0)
#: temperatures of validity and of environments [°C] (project brief)
TEMP_RANGE_C = (-50.0, 200.0)
#: corrosion potentials in seawater: Mg about -1.6 V, graphite about +0.3 V vs SCE (ASTM G82
#: Fig. 1 after LaQue 1975, from memory); bounds with room for other electrolytes [V vs SCE]
SERIES_RANGE_V = (-2.0, 1.0)
#: legacy anodic index runs 0 (gold) to 1.85 V (beryllium) [V] (legacy military/industry table)
ANODIC_INDEX_RANGE_V = (0.0, 2.0)
#: densities of engineering metals: Mg 1.74 to Os/Ir 22.6 g/cm3 [g/cm3] (project brief)
DENSITY_RANGE = (0.5, 23.0)
#: ASTM G102 equivalent weights: atomic weight / valence, at most about 200 g (Au+) [g]
EW_MAX_G = 250.0
#: allowable potential differences [V] (common practice)
ALLOWABLE_MAX_V = 2.0
#: ionic strength of natural waters and brines [mol/kg] (common practice)
IONIC_STRENGTH_MAX = 10.0
#: cathodic current densities: 0 up to 1 A/cm2 [µA/cm2] (common practice)
CURRENT_DENSITY_MAX = 1.0e6
#: Kielland ion-size parameters run 2.5 to 11 Å (Kielland 1937, from memory) [Å]
ION_SIZE_RANGE = (0.5, 15.0)
ION_CHARGE_RANGE = (-4, 4)
#: how far a reference electrode's temperature model may be from E_V_SHE at 25 °C [V] (brief)
REFELEC_TOLERANCE_V = 0.001
#: reference electrodes change by a few tenths of a mV/K up to about 1 mV/K (common practice);
#: beyond this rate the coefficients hold a typo [V/K]
REFELEC_MAX_SLOPE_V_PER_K = 0.005

# --- thermodynamic consistency -----------------------------------------------------------------
#: free-energy additivity, in volts of n·E° of the combined couple: below WARN nothing is said;
#: WARN..ERROR is a warning (handbooks genuinely differ by a few mV: CRC's Cu2+/Cu+ 0.153 V,
#: Cu+/Cu 0.521 V and Cu2+/Cu 0.3419 V miss by 9.8 mV; Vanýsek, CRC Handbook 92nd ed. 2011,
#: Table 1); beyond ERROR it is an error (a typo, a sign or a wrong n).
ADDITIVITY_WARN_V = 0.005
ADDITIVITY_ERROR_V = 0.100
#: the same for temperature coefficients, in mV/K of n·dE°/dT
ADDITIVITY_DEDT_WARN = 0.05
ADDITIVITY_DEDT_ERROR = 1.0
#: pKw at 25 °C, 0.1 MPa (Bandura & Lvov, J. Phys. Chem. Ref. Data 35 (2006) 15, from memory)
PKW_25C = 13.995
#: ΔS° of H2O(l) -> H+(aq) + OH-(aq) [J/(mol·K)]: S°(OH-) - S°(H2O, l) with S°(H+) = 0,
#: -10.75 - 69.91 (Wagman et al., NBS tables, J. Phys. Chem. Ref. Data 11 Suppl. 2, 1982)
DELTA_S_WATER = -10.75 - 69.91

#: standard atomic weights [g/mol], abridged to 4-5 figures (IUPAC/CIAAW standard atomic weights,
#: 2021 abridged table, from memory); used to re-compute ASTM G102 equivalent weights
ATOMIC_WEIGHTS = {
    "H": 1.008, "Li": 6.94, "Be": 9.0122, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999,
    "Na": 22.990, "Mg": 24.305, "Al": 26.982, "Si": 28.085, "P": 30.974, "S": 32.06, "K": 39.098,
    "Ca": 40.078, "Ti": 47.867, "V": 50.942, "Cr": 51.996, "Mn": 54.938, "Fe": 55.845, "Co": 58.933,
    "Ni": 58.693, "Cu": 63.546, "Zn": 65.38, "Ga": 69.723, "As": 74.922, "Se": 78.971, "Zr": 91.224,
    "Nb": 92.906, "Mo": 95.95, "Ru": 101.07, "Rh": 102.91, "Pd": 106.42, "Ag": 107.87, "Cd": 112.41,
    "In": 114.82, "Sn": 118.71, "Sb": 121.76, "Te": 127.60, "Hf": 178.49, "Ta": 180.95, "W": 183.84,
    "Ir": 192.22, "Pt": 195.08, "Au": 196.97, "Pb": 207.2, "Bi": 208.98,
}
#: a computed equivalent weight may differ from its recomputation by rounding only [fraction]
EW_WARN_FRACTION = 0.002
EW_ERROR_FRACTION = 0.01

#: the galvanic series the dataset carries, and the materials field that holds it
SERIES_FIELDS = {"seawater-flowing": "seawater_range_V_SCE"}
BASES = ("galvanic-series", "anodic-index")
SEVERITIES = ("harsh", "normal", "controlled")
STATES = ("passive", "active")
UNS_RE = re.compile(r"^[A-Z][0-9]{5}$")

#: numeric fields that are conditions or definitions, not values read in a source
NO_SOURCE_FIELDS = {"n", "charge", "valid_C", "t_ref_C", "temperature_range_C"}
#: a value without its own source (and confidence) field may use another value's
SOURCE_FALLBACK = {
    "composition_wt_pct": ["equivalent_weight"],
    "negligible_V": ["allowable"],
}


# --- small helpers ---------------------------------------------------------------------------------
def _is_num(value):
    return isinstance(value, (int, float)) and not isinstance(value, bool)


def _fmt(value):
    if isinstance(value, float):
        return f"{value:g}"
    text = repr(value)
    return text if len(text) <= 80 else text[:77] + "..."


def _label(records, index):
    """A record's label in messages: its id (ions: species), else #index."""
    rec = records[index] if isinstance(records, list) and isinstance(index, int) and index < len(records) else None
    if isinstance(rec, dict):
        for key in ("id", "species"):
            if isinstance(rec.get(key), str) and rec[key].strip():
                return rec[key]
    return f"#{index}"


def _field_path(parts):
    out = ""
    for part in parts:
        if isinstance(part, int):
            out += f"[{part}]"
        else:
            out += ("." if out else "") + str(part)
    return out or "-"


class _Collector:
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
        self.lines.append(f"{FILE_OF.get(kind, kind)}:{record}:{field}: {message}")

    def warning(self, kind, record, field, message):
        self.lines.append(f"warning: {FILE_OF.get(kind, kind)}:{record}:{field}: {message}")


def _records(raw, kind):
    recs = raw.get(kind)
    return recs if isinstance(recs, list) else []


def _each(raw, kind):
    """(label, record) for every record that is a mapping."""
    recs = _records(raw, kind)
    for i, rec in enumerate(recs):
        if isinstance(rec, dict):
            yield _label(recs, i), rec


# --- 1. file shape ---------------------------------------------------------------------------------
_TOP_KEY_RE = re.compile(r"^([^\s#\-][^:\n]*?)\s*:(?:[ \t]|$)", re.M)


def _file_shape(raw, data_dir, out):
    """The schema line first and one top-level key per file (read from the text: no second parse)."""
    for fname, key in FILES.items():
        path = os.path.join(data_dir, fname)
        if not os.path.exists(path) or os.path.getsize(path) > 2 * 1024 * 1024:
            continue  # reported by the reader
        expected = f"# yaml-language-server: $schema=schema/{fname[:-5]}.schema.json"
        with open(path, encoding="utf-8", errors="replace") as fh:
            text = fh.read()
        if text.split("\n", 1)[0].strip() != expected:
            out.error(key, "-", "-", f"the first line must be '{expected}' so editors validate while typing")
        top = [k.strip("'\"") for k in _TOP_KEY_RE.findall(text)]
        if not top:
            out.error(key, "-", "-", f"the file holds no mapping: expected the top-level key '{key}'")
            continue
        if key not in raw:
            continue  # unreadable: reported by the reader
        if key not in top:
            out.error(key, "-", key, f"the top-level key '{key}' is missing")
        for other in top:
            if other != key:
                out.error(key, "-", other, f"unknown top-level key {other!r}: the file holds only '{key}'")


# --- 2. JSON Schema ----------------------------------------------------------------------------------
def _schema_path(fname, data_dir):
    name = fname[:-5] + ".schema.json"
    for base in (os.path.join(data_dir, "schema"), os.path.join(PROJECT_DATA, "schema")):
        path = os.path.join(base, name)
        if os.path.exists(path):
            return path
    return None


def _schema_message(err):
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
    best = min(candidates, key=len)
    out = []
    for sub in best:
        out += _leaf_errors(sub)
    return out


def _schema_problems(kind, records, data_dir, out):
    fname = FILE_OF[kind]
    path = _schema_path(fname, data_dir)
    if path is None:
        out.error(kind, "-", "-", f"no JSON Schema schema/{fname[:-5]}.schema.json to validate against")
        return
    try:
        from jsonschema import Draft202012Validator
        from jsonschema.exceptions import SchemaError

        with open(path, encoding="utf-8") as fh:
            schema = json.load(fh)
        Draft202012Validator.check_schema(schema)
    except (OSError, ValueError) as exc:
        out.error(kind, "-", "-", f"schema {os.path.basename(path)} cannot be read: {exc}")
        return
    except SchemaError as exc:
        out.error(kind, "-", "-", f"schema {os.path.basename(path)} is not a valid JSON Schema: {exc.message}")
        return
    validator = Draft202012Validator(schema)
    props = schema.get("properties", {}) if isinstance(schema, dict) else {}
    if isinstance(props, dict) and kind in props:
        instance, strip = {kind: records}, 1  # the schema describes the whole file
    elif isinstance(schema, dict) and schema.get("type") == "array":
        instance, strip = records, 0  # the schema describes the list
    else:
        instance, strip = None, 0  # the schema describes one record
    if instance is not None:
        errors = list(validator.iter_errors(instance))
        located = [(list(e.absolute_path)[strip:], e) for e in errors]
    else:
        located = []
        for i, rec in enumerate(records if isinstance(records, list) else []):
            located += [([i] + list(e.absolute_path), e) for e in validator.iter_errors(rec)]
    flat = []
    for path, err in located:
        extra = len(err.absolute_path)
        for leaf in _leaf_errors(err):
            flat.append((path + list(leaf.absolute_path)[extra:], leaf))
    flat.sort(key=lambda pe: [str(p) for p in pe[0]])
    lines = []
    for path, err in flat:
        if not path:
            lines.append(("-", "-", _schema_message(err)))
            continue
        label = _label(records, path[0]) if isinstance(path[0], int) else "-"
        rest = path[1:] if isinstance(path[0], int) else path
        if err.validator == "required" and isinstance(err.instance, dict):
            for name in err.validator_value:
                if name not in err.instance:
                    lines.append((label, _field_path(rest + [name]), "required field is missing"))
        elif err.validator in ("dependentRequired", "dependencies") and isinstance(err.instance, dict):
            for given, needs in (err.validator_value or {}).items():
                if given in err.instance and isinstance(needs, list):
                    for name in needs:
                        if name not in err.instance:
                            lines.append((label, _field_path(rest + [name]),
                                          f"required field is missing (needed with '{given}')"))
        elif err.validator in ("additionalProperties", "unevaluatedProperties") and isinstance(err.instance, dict):
            known = set(err.schema.get("properties", {}) or {})
            patterns = list((err.schema.get("patternProperties") or {}).keys())
            extras = [k for k in err.instance if k not in known and not any(re.search(p, str(k)) for p in patterns)]
            if not extras:
                lines.append((label, _field_path(rest), _schema_message(err)))
            for name in extras:
                lines.append((label, _field_path(rest + [name]),
                              "unknown field: not in the schema (check the spelling)"))
        else:
            lines.append((label, _field_path(rest), _schema_message(err)))
    unique = list(dict.fromkeys(lines))
    for label, field, msg in unique[:MAX_SCHEMA_ERRORS_PER_FILE]:
        out.error(kind, label, field, f"schema: {msg}")
        out.flag(kind, label, field)
    lines = unique
    if len(lines) > MAX_SCHEMA_ERRORS_PER_FILE:
        out.error(kind, "-", "-", f"schema: {len(lines) - MAX_SCHEMA_ERRORS_PER_FILE} more schema problems not shown")


# --- 3. sources ------------------------------------------------------------------------------------
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
    if _is_num(value):
        return True
    if isinstance(value, list) and value:
        return all(_is_num(v) for v in value)
    if isinstance(value, dict) and value:
        return all(_is_num(v) for v in value.values())
    return False


def _prefixes(field):
    parts = field.split("_")
    return ["_".join(parts[:i]) for i in range(len(parts) - 1, 0, -1)]


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
        field = _field_path(path + (key,))
        prefixes = _prefixes(key)
        prefixes_all = prefixes + SOURCE_FALLBACK.get(key, [])
        own = [p + "_source" for p in prefixes_all]
        if not any(c in rec for c in own) and not any("source" in r for r in chain):
            want = (prefixes[-1] + "_source") if prefixes else "source"
            out.error(kind, label, field, f"value {_fmt(value)} has no source: "
                                          f"add '{want}' with an id from sources.yaml")
        own_conf = [p + "_confidence" for p in prefixes_all]
        conf_key = next((c for c in own_conf if c in rec), None)
        holder = rec if conf_key else next((r for r in chain if "confidence" in r), None)
        if holder is None:
            want = (prefixes[-1] + "_confidence") if prefixes else "confidence"
            out.error(kind, label, field, f"value {_fmt(value)} has no confidence: add '{want}' "
                                          f"(one of {', '.join(CONFIDENCES)})")
        else:
            ckey = conf_key or "confidence"
            conf = holder.get(ckey)
            if conf not in CONFIDENCES:
                cfield = _field_path(path + (ckey,)) if holder is rec else ckey
                out.error(kind, label, cfield, f"confidence {_fmt(conf)} is not one of {', '.join(CONFIDENCES)}")


def _sources(raw, out):
    have_sources = isinstance(raw.get("sources"), list)
    ids = {}
    for label, rec in _each(raw, "sources"):
        sid = rec.get("id")
        if isinstance(sid, str):
            ids.setdefault(sid, label)
    used = set()
    for kind in KIND_ORDER:
        if kind == "sources":
            continue
        for label, rec in _each(raw, kind):
            for path, value in _source_fields(rec):
                field = _field_path(path)
                if not isinstance(value, str):
                    continue  # the schema reports the type
                used.add(value)
                if have_sources and value not in ids:
                    import difflib

                    close = difflib.get_close_matches(value, list(ids), n=3, cutoff=0.5)
                    hint = f" (closest: {', '.join(close)})" if close else ""
                    out.error(kind, label, field, f"unknown source id {value!r}: not in sources.yaml{hint}")
            _value_sourcing(kind, label, rec, out)
    # unused sources only when every file was read (a source may be cited in an unreadable file)
    if have_sources and all(isinstance(raw.get(k), list) for k in KIND_ORDER):
        for sid, label in ids.items():
            if sid not in used:
                out.error("sources", label, "id", f"source {sid!r} is cited by no value: remove it or cite it")


# --- 4. duplicates ---------------------------------------------------------------------------------
def _duplicates(raw, out):
    for kind in KIND_ORDER:
        seen = {}  # key -> (label, field, text, record)
        for label, rec in _each(raw, kind):
            names = []
            if kind == "ions":
                names.append(("species", rec.get("species")))
            else:
                names.append(("id", rec.get("id")))
                aliases = rec.get("aliases")
                if isinstance(aliases, list):
                    names += [(f"aliases[{i}]", a) for i, a in enumerate(aliases)]
            if kind == "materials" and isinstance(rec.get("uns"), list):
                names += [(f"uns[{i}]", u) for i, u in enumerate(rec["uns"])]
            mine = set()
            for field, text in names:
                if not isinstance(text, str) or not text.strip():
                    continue
                key = lookup_key(text)
                if key in mine:
                    continue  # the same name twice in one record is redundant, not ambiguous
                mine.add(key)
                if key in seen:
                    first_label, first_field, first_text, first_rec = seen[key]
                    if kind == "materials" and field.startswith("uns") and first_field.startswith("uns") \
                            and _linked_states(rec, first_rec):
                        continue  # the same alloy in its passive and active states shares its UNS numbers
                    out.error(kind, label, field, f"{text!r} is already used by {first_label} ({first_field} "
                                                  f"{first_text!r}); lookups ignore case, spaces, '-' and '_'")
                else:
                    seen[key] = (label, field, text, rec)


def _linked_states(a, b):
    other_a, other_b = a.get("other_state"), b.get("other_state")
    return other_a is not None and (other_a == b.get("id") or other_b == a.get("id"))


# --- 5. ranges -------------------------------------------------------------------------------------
def _in_range(kind, label, field, value, lo, hi, unit, out, lo_open=False):
    if not _is_num(value) or out.flagged(kind, label, field):
        return False
    if not math.isfinite(value):
        out.error(kind, label, field, f"value {value} is not a finite number")
        return False
    low_bad = value <= lo if lo_open else value < lo
    if low_bad or value > hi:
        lo_txt = f"more than {lo:g}" if lo_open else f"{lo:g}"
        out.error(kind, label, field,
                  f"value {value:g} is outside the physical range {lo_txt} to {hi:g} {unit}".rstrip())
        return False
    return True


def _pair(kind, label, field, value, lo, hi, unit, out, strict=False, ends="[low, high]"):
    """A two-number range: both ends in bounds and in order. Returns the pair or None."""
    if not (isinstance(value, list) and len(value) == 2 and all(_is_num(v) for v in value)) \
            or out.flagged(kind, label, field):
        return None  # the schema reports the shape
    ok = [_in_range(kind, label, f"{field}[{i}]", v, lo, hi, unit, out) for i, v in enumerate(value)]
    if not all(ok):
        return None
    a, b = value
    if a > b or (strict and a == b):
        out.error(kind, label, field, f"range ends in the wrong order: {_fmt(value)}; write {ends}"
                  + ("" if a == b else f" = [{b:g}, {a:g}]"))
        return None
    return a, b


def _temperature_model_fields(kind, label, model, out, base):
    if not isinstance(model, dict):
        return
    _pair(kind, label, f"{base}.valid_C", model.get("valid_C"), *TEMP_RANGE_C, "°C", out, strict=True)
    if "t_ref_C" in model:
        _in_range(kind, label, f"{base}.t_ref_C", model.get("t_ref_C"), *TEMP_RANGE_C, "°C", out)
    if "slope_mV_per_K" in model:
        _in_range(kind, label, f"{base}.slope_mV_per_K", model.get("slope_mV_per_K"), *DEDT_RANGE_MV_PER_K, "mV/K", out)


def _ranges(raw, out):
    for label, rec in _each(raw, "half_reactions"):
        k = "half_reactions"
        _in_range(k, label, "E0_V", rec.get("E0_V"), *E0_RANGE_V, "V vs SHE", out)
        n = rec.get("n")
        if _is_num(n) and (n != int(n) or not N_RANGE[0] <= n <= N_RANGE[1]):
            out.error(k, label, "n", f"value {_fmt(n)} is not a whole number of electrons "
                                     f"from {N_RANGE[0]} to {N_RANGE[1]}")
        _in_range(k, label, "dEdT_mV_per_K", rec.get("dEdT_mV_per_K"), *DEDT_RANGE_MV_PER_K, "mV/K", out)
        _in_range(k, label, "dCp_J_per_mol_K", rec.get("dCp_J_per_mol_K"), *DCP_RANGE, "J/(mol·K)", out)
        _pair(k, label, "valid_C", rec.get("valid_C"), *TEMP_RANGE_C, "°C", out, strict=True)
    for label, rec in _each(raw, "reference_electrodes"):
        k = "reference_electrodes"
        _in_range(k, label, "E_V_SHE", rec.get("E_V_SHE"), *E0_RANGE_V, "V vs SHE", out)
        _temperature_model_fields(k, label, rec.get("temperature"), out, "temperature")
    for label, rec in _each(raw, "materials"):
        k = "materials"
        for series_field in SERIES_FIELDS.values():
            _pair(k, label, series_field, rec.get(series_field), *SERIES_RANGE_V, "V vs SCE", out,
                  ends="[active end, noble end]")
        _in_range(k, label, "anodic_index_V", rec.get("anodic_index_V"), *ANODIC_INDEX_RANGE_V, "V", out)
        _in_range(k, label, "density_g_cm3", rec.get("density_g_cm3"), *DENSITY_RANGE, "g/cm3", out)
        _in_range(k, label, "equivalent_weight_g", rec.get("equivalent_weight_g"), 0.0, EW_MAX_G, "g", out,
                  lo_open=True)
        comp = rec.get("composition_wt_pct")
        if isinstance(comp, dict):
            total, ok = 0.0, True
            for el, pct in comp.items():
                if _in_range(k, label, f"composition_wt_pct.{el}", pct, 0.0, 100.0, "wt%", out, lo_open=True):
                    total += pct
                else:
                    ok = ok and not _is_num(pct)
            if ok and total > 100.5:
                out.error(k, label, "composition_wt_pct", f"the mass fractions add up to {total:g} wt%: at most 100")
    for label, rec in _each(raw, "environments"):
        k = "environments"
        allow = rec.get("allowable_V")
        ok_allow = _in_range(k, label, "allowable_V", allow, 0.0, ALLOWABLE_MAX_V, "V", out, lo_open=True)
        negl = rec.get("negligible_V")
        if _in_range(k, label, "negligible_V", negl, 0.0, ALLOWABLE_MAX_V, "V", out) and ok_allow and negl >= allow:
            out.error(k, label, "negligible_V", f"value {negl:g} V is not below allowable_V {allow:g} V")
        _pair(k, label, "temperature_range_C", rec.get("temperature_range_C"), *TEMP_RANGE_C, "°C", out)
        _in_range(k, label, "ionic_strength_mol_per_kg", rec.get("ionic_strength_mol_per_kg"), 0.0,
                  IONIC_STRENGTH_MAX, "mol/kg", out)
        cd = rec.get("cathodic_current_density_uA_per_cm2")
        if _is_num(cd):
            _in_range(k, label, "cathodic_current_density_uA_per_cm2", cd, 0.0, CURRENT_DENSITY_MAX, "µA/cm2", out)
        else:
            _pair(k, label, "cathodic_current_density_uA_per_cm2", cd, 0.0, CURRENT_DENSITY_MAX, "µA/cm2", out)
    for label, rec in _each(raw, "ions"):
        k = "ions"
        _in_range(k, label, "size_angstrom", rec.get("size_angstrom"), *ION_SIZE_RANGE, "Å", out)
        z = rec.get("charge")
        if _is_num(z) and (z != int(z) or z == 0 or not ION_CHARGE_RANGE[0] <= z <= ION_CHARGE_RANGE[1]):
            out.error(k, label, "charge", f"value {_fmt(z)} is not a non-zero whole charge from "
                                          f"{ION_CHARGE_RANGE[0]} to +{ION_CHARGE_RANGE[1]}")


# --- 6. half-reaction stoichiometry ------------------------------------------------------------------
def _name_key(text):
    """Compare species names the way ids write them: 'Hg2^2+' = 'Hg2 2+' = 'Hg22+'."""
    return re.sub(r"[\s^]", "", str(text))


def _reaction(rec):
    """Net stoichiometry {species key: coefficient} (oxidised side +, reduced side -, 'e-': n), or None."""
    ox, red, n = rec.get("oxidised"), rec.get("reduced"), rec.get("n")
    if not (isinstance(ox, list) and isinstance(red, list) and _is_num(n)):
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


def _stoichiometry(raw, out):
    k = "half_reactions"
    for label, rec in _each(raw, k):
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
                    out.error(k, label, f"{side}[{i}]", f"species {_fmt(text)} cannot be read: expected {exc.allowed} "
                                                        "(e.g. '2 H2O(l)', 'Hg2^2+(aq)', 'Fe(OH)2(s)')")
        n = rec.get("n")
        if not sides_ok or not _is_num(n):
            continue
        for prob in balance_problems(rec["oxidised"], rec["reduced"], n):
            field = "n" if prob.startswith("charge") else "reduced"
            out.error(k, label, field, f"the half-reaction does not balance: {prob}")
        rid = rec.get("id")
        if isinstance(rid, str) and rid.count("/") == 1:
            want_ox, want_red = (_name_key(p) for p in rid.split("/"))
            names_ox = {_name_key(parse_species(s).name) for s in rec["oxidised"]}
            names_red = {_name_key(parse_species(s).name) for s in rec["reduced"]}
            if want_ox not in names_ox:
                out.error(k, label, "id", f"the id names {rid.split('/')[0]!r} as the oxidised form, but "
                                          f"oxidised lists {', '.join(rec['oxidised'])}")
            if want_red not in names_red:
                out.error(k, label, "id", f"the id names {rid.split('/')[1]!r} as the reduced form, but "
                                          f"reduced lists {', '.join(rec['reduced'])}")
        elif isinstance(rid, str):
            out.error(k, label, "id", f"id {rid!r} must be written OXIDISED/REDUCED with one '/' (e.g. 'Fe3+/Fe2+')")


# --- 7. thermodynamic consistency ----------------------------------------------------------------------
def _couples(raw):
    """Half-reactions usable in the consistency checks: (label, record, ox name, red name, vector)."""
    out = []
    for label, rec in _each(raw, "half_reactions"):
        rid, vec = rec.get("id"), _reaction(rec)
        if not (isinstance(rid, str) and rid.count("/") == 1 and vec and _is_num(rec.get("E0_V"))):
            continue
        ox, red = (_name_key(p) for p in rid.split("/"))
        out.append((label, rec, ox, red, vec))
    return out


def _coeff(vec, name, sign):
    """Net coefficient of the species called ``name`` on one side (sign +1 oxidised, -1 reduced)."""
    total = 0.0
    for key, c in vec.items():
        if key != "e-" and _name_key(key.rsplit("(", 1)[0]) == name and c * sign > 0:
            total += c
    return total


def _additivity(raw, out):
    k = "half_reactions"
    couples = _couples(raw)
    by_ox = {}
    for c in couples:
        by_ox.setdefault(c[2], []).append(c)
    for la, ra, x, y, va in couples:
        for lb, rb, y2, z, vb in by_ox.get(y, []):
            if lb == la or z == x:
                continue
            for lc, rc, x3, z3, vc in by_ox.get(x, []):
                if z3 != z or lc in (la, lb):
                    continue
                ca, cc = _coeff(va, x, 1), _coeff(vc, x, 1)
                cb, cz = _coeff(vb, z, -1), _coeff(vc, z, -1)
                if not (ca and cc and cb and cz):
                    continue
                alpha, beta = cc / ca, cz / cb
                keys = set(va) | set(vb) | set(vc)
                resid = {key: alpha * va.get(key, 0) + beta * vb.get(key, 0) - vc.get(key, 0) for key in keys}
                if any(abs(r) > 1e-9 for r in resid.values()):
                    left = ", ".join(f"{key} {r:+g}" for key, r in sorted(resid.items()) if abs(r) > 1e-9)
                    out.warning(k, lc, "oxidised", f"{lc} should be the sum of {la} and {lb}, but the reactions do not "
                                                   f"add up (left over: {left}); additivity not checked")
                    continue
                _check_triple(out, (la, ra, alpha), (lb, rb, beta), (lc, rc))


def _check_triple(out, a, b, c):
    k = "half_reactions"
    (la, ra, alpha), (lb, rb, beta), (lc, rc) = a, b, c
    na, nb, nc = ra["n"], rb["n"], rc["n"]
    ea, eb, ec = ra["E0_V"], rb["E0_V"], rc["E0_V"]
    combined = alpha * na * ea + beta * nb * eb
    stated = nc * ec
    diff = stated - combined
    implied = combined / nc

    def term(scale, n, e):
        return f"{n:g} × {e:g}" if abs(scale - 1) < 1e-12 else f"{scale:g} × {n:g} × {e:g}"

    text = (f"free-energy additivity: n·E° of {lc} is {nc:g} × {ec:g} = {stated:.4f} V, but {la} + {lb} give "
            f"{term(alpha, na, ea)} + {term(beta, nb, eb)} = {combined:.4f} V; the difference is "
            f"{diff * 1000:.1f} mV (E° implied by the other two: {implied:.4f} V)")
    if abs(diff) > ADDITIVITY_ERROR_V:
        out.error(k, lc, "E0_V", text + f"; more than {ADDITIVITY_ERROR_V * 1000:g} mV is an error")
    elif abs(diff) > ADDITIVITY_WARN_V:
        out.warning(k, lc, "E0_V", text + f" (warning above {ADDITIVITY_WARN_V * 1000:g} mV: where handbooks "
                                          "genuinely differ, keep the published values and say so in 'spread' "
                                          "or 'note')")
    da, db, dc = ra.get("dEdT_mV_per_K"), rb.get("dEdT_mV_per_K"), rc.get("dEdT_mV_per_K")
    if all(_is_num(d) for d in (da, db, dc)):
        dcomb = alpha * na * da + beta * nb * db
        ddiff = nc * dc - dcomb
        dtext = (f"additivity of temperature coefficients: n·dE°/dT of {lc} is {nc * dc:.3f} mV/K, {la} + {lb} give "
                 f"{dcomb:.3f} mV/K (difference {ddiff:+.3f} mV/K)")
        if abs(ddiff) > ADDITIVITY_DEDT_ERROR:
            out.error(k, lc, "dEdT_mV_per_K", dtext)
        elif abs(ddiff) > ADDITIVITY_DEDT_WARN:
            out.warning(k, lc, "dEdT_mV_per_K", dtext)


def _non_water_species(vec, water):
    """The species of a reaction vector other than H+, OH- and H2O (electrons included)."""
    return frozenset(key for key in vec if key not in water)


def _acid_alkaline(raw, out):
    """Pairs whose reactions differ by ν (H+ + OH- - H2O): E°alk = E°acid - slope·pKw·ν/n."""
    k = "half_reactions"
    slope = nernst_slope(T_STANDARD)
    water = {"H+(aq)", "OH-(aq)", "H2O(l)"}
    couples = _couples(raw)
    # Two reactions can differ by water's ions only when they hold the same other species (the
    # electrons included): group by that set, so each reaction is compared with its group only
    # (linear in the number of half-reactions; the groups keep the records' order, so the
    # findings come in the same order as comparing every pair).
    groups = {}
    for c in couples:
        groups.setdefault(_non_water_species(c[4], water), []).append(c)
    for la, ra, _, _, va in couples:
        for lb, rb, _, _, vb in groups[_non_water_species(va, water)]:
            if la == lb:
                continue
            keys = set(va) | set(vb)
            d = {key: va.get(key, 0) - vb.get(key, 0) for key in keys}
            d = {key: v for key, v in d.items() if abs(v) > 1e-12}
            if set(d) != water:
                continue
            nu = d["H+(aq)"]
            if nu <= 0 or abs(d["OH-(aq)"] - nu) > 1e-9 or abs(d["H2O(l)"] + nu) > 1e-9:
                continue
            n = ra["n"]
            expected = ra["E0_V"] - slope * PKW_25C * nu / n
            diff = rb["E0_V"] - expected
            text = (f"acid and alkaline forms: E° of {lb} is {rb['E0_V']:g} V, but {la} ({ra['E0_V']:g} V) and "
                    f"pKw {PKW_25C} give {ra['E0_V']:g} - {slope:.5f} × {PKW_25C} × {nu:g}/{n:g} = {expected:.4f} V; "
                    f"the difference is {diff * 1000:.1f} mV")
            if abs(diff) > ADDITIVITY_ERROR_V:
                out.error(k, lb, "E0_V", text + f"; more than {ADDITIVITY_ERROR_V * 1000:g} mV is an error")
            elif abs(diff) > ADDITIVITY_WARN_V:
                out.warning(k, lb, "E0_V", text)
            da, db = ra.get("dEdT_mV_per_K"), rb.get("dEdT_mV_per_K")
            if _is_num(da) and _is_num(db):
                dexp = da + nu / n * DELTA_S_WATER / FARADAY * 1000.0
                ddiff = db - dexp
                dtext = (f"acid and alkaline forms: dE°/dT of {lb} is {db:g} mV/K, {la} and ΔS° of water "
                         f"dissociation ({DELTA_S_WATER:.2f} J/(mol·K)) give {dexp:.3f} mV/K "
                         f"(difference {ddiff:+.3f} mV/K)")
                if abs(ddiff) * n > ADDITIVITY_DEDT_ERROR:
                    out.error(k, lb, "dEdT_mV_per_K", dtext)
                elif abs(ddiff) * n > ADDITIVITY_DEDT_WARN:
                    out.warning(k, lb, "dEdT_mV_per_K", dtext)


# --- 8. reference electrodes ----------------------------------------------------------------------------
def refelec_potential(rec, temp_C):
    """E of a reference electrode record at a temperature from its temperature model.

    Args:
        rec: a reference_electrodes record [unitless]
        temp_C: temperature [°C]

    Returns:
        potential [V vs SHE], or None when the model cannot be evaluated

    >>> refelec_potential({"E_V_SHE": 0.2, "temperature": {"kind": "linear", "slope_mV_per_K": -1.0}}, 35)
    0.19
    """
    e25 = rec.get("E_V_SHE")
    model = rec.get("temperature")
    if model is None:
        return e25 if _is_num(e25) else None
    if not isinstance(model, dict):
        return None
    kind = model.get("kind")
    t_ref = model.get("t_ref_C", 25)
    if not _is_num(t_ref):
        return None
    if kind == "constant":
        value = model.get("E_V", e25)
        return value if _is_num(value) else None
    if kind == "linear":
        slope = model.get("slope_mV_per_K")
        base = model.get("E_V", e25 if t_ref == 25 else None)
        if not (_is_num(slope) and _is_num(base)):
            return None
        return round(base + slope / 1000.0 * (temp_C - t_ref), 12)
    if kind == "polynomial":
        coeffs = model.get("coeffs_V")
        if not (isinstance(coeffs, list) and coeffs and all(_is_num(c) for c in coeffs)):
            return None
        x = temp_C - t_ref
        return sum(c * x ** i for i, c in enumerate(coeffs))
    return None


def _reference_electrodes(raw, out):
    k = "reference_electrodes"
    for label, rec in _each(raw, k):
        e25 = rec.get("E_V_SHE")
        model = rec.get("temperature")
        if rec.get("id") == "SHE":
            if _is_num(e25) and e25 != 0:
                out.error(k, label, "E_V_SHE", f"value {e25:g}: the SHE is 0 V at every temperature by convention")
            if isinstance(model, dict) and model.get("kind") not in (None, "constant"):
                out.error(k, label, "temperature.kind", f"kind {model.get('kind')!r}: the SHE is 0 V at every "
                                                        "temperature, use kind constant")
        if not (_is_num(e25) and isinstance(model, dict)):
            continue
        kind = model.get("kind")
        if kind not in ("constant", "linear", "polynomial"):
            continue  # the schema reports the value
        at25 = refelec_potential(rec, 25.0)
        if at25 is None:
            out.error(k, label, "temperature", f"the {kind} model cannot be evaluated: check its fields")
            continue
        if abs(at25 - e25) > REFELEC_TOLERANCE_V:
            out.error(k, label, "temperature", f"the {kind} model gives {at25:.4f} V at 25 °C but E_V_SHE is "
                                               f"{e25:g} V: they must agree within {REFELEC_TOLERANCE_V * 1000:g} mV")
        valid = model.get("valid_C")
        if isinstance(valid, list) and len(valid) == 2 and all(_is_num(v) for v in valid) and valid[0] < valid[1]:
            lo, hi = valid
            steps = max(1, int(hi - lo))
            prev = refelec_potential(rec, lo)
            for i in range(1, steps + 1):
                t = lo + (hi - lo) * i / steps
                cur = refelec_potential(rec, t)
                rate = (cur - prev) / ((hi - lo) / steps)
                if abs(rate) > REFELEC_MAX_SLOPE_V_PER_K:
                    out.error(k, label, "temperature",
                              f"the {kind} model changes by {rate * 1000:.2f} mV/K near {t:g} °C: more than "
                              f"{REFELEC_MAX_SLOPE_V_PER_K * 1000:g} mV/K means a coefficient is wrong")
                    break
                prev = cur


# --- 9. materials ------------------------------------------------------------------------------------
def _equivalent_weight(k, label, rec, out):
    """A computed EW must equal ASTM G102's 1/Σ(f_i·n_i/W_i) over the elements given a valence."""
    ew, comp, val = rec.get("equivalent_weight_g"), rec.get("composition_wt_pct"), rec.get("equivalent_weight_valences")
    if not (_is_num(ew) and ew > 0 and isinstance(comp, dict) and isinstance(val, dict) and val):
        return
    total = 0.0
    for el, n in val.items():
        pct = comp.get(el)
        if el not in ATOMIC_WEIGHTS or not (_is_num(pct) and _is_num(n)):
            out.warning(k, label, f"equivalent_weight_valences.{el}", f"cannot re-compute the equivalent weight: "
                        f"{el} needs a mass fraction in composition_wt_pct and a known atomic weight")
            return
        total += pct / 100.0 * n / ATOMIC_WEIGHTS[el]
    if total <= 0:
        return
    recomputed = 1.0 / total
    rel = abs(ew - recomputed) / recomputed
    text = (f"equivalent weight {ew:g} g, but 1/Σ(f·n/W) over composition_wt_pct and equivalent_weight_valences "
            f"gives {recomputed:.2f} g ({rel * 100:.1f} % apart; ASTM G102)")
    if rel > EW_ERROR_FRACTION:
        out.error(k, label, "equivalent_weight_g", text)
    elif rel > EW_WARN_FRACTION:
        out.warning(k, label, "equivalent_weight_g", text)


def _materials(raw, out):
    k = "materials"
    by_id = {rec.get("id"): (label, rec) for label, rec in _each(raw, k) if isinstance(rec.get("id"), str)}
    for label, rec in _each(raw, k):
        _equivalent_weight(k, label, rec, out)
        state, other = rec.get("state"), rec.get("other_state")
        uns = rec.get("uns")
        if isinstance(uns, list):
            for i, u in enumerate(uns):
                if isinstance(u, str) and not UNS_RE.match(u):
                    out.error(k, label, f"uns[{i}]", f"{u!r} is not a UNS number: a capital letter and five digits, "
                                                     "e.g. S31600")
        if other is None:
            if state in STATES:
                out.warning(k, label, "other_state", f"state is {state!r} but no other_state names the same alloy "
                                                     "in its other state")
            continue
        if not isinstance(other, str):
            continue
        if other == rec.get("id"):
            out.error(k, label, "other_state", "other_state points to the record itself")
            continue
        if other not in by_id:
            out.error(k, label, "other_state", f"other_state {other!r} is not a material id")
            continue
        olabel, orec = by_id[other]
        if orec.get("other_state") != rec.get("id"):
            out.error(k, label, "other_state", f"other_state {other!r} does not point back: {other} has other_state "
                                               f"{_fmt(orec.get('other_state'))}")
        if state not in STATES:
            out.error(k, label, "state", f"state {_fmt(state)} with an other_state: expected passive or active")
        elif orec.get("state") == state:
            out.error(k, label, "state", f"{label} and {other} are both {state!r}: "
                                         "one must be passive, the other active")
        elif state == "passive":
            for fld in SERIES_FIELDS.values():
                p, a = rec.get(fld), orec.get(fld)
                if all(isinstance(v, list) and len(v) == 2 and all(_is_num(x) for x in v) for v in (p, a)) \
                        and p[1] <= a[1]:
                    out.error(k, label, fld, f"the passive range {_fmt(p)} is not nobler than the active range of "
                                             f"{other} {_fmt(a)}")


# --- 10. environments and ions ------------------------------------------------------------------------
def _environments(raw, out):
    k = "environments"
    for label, rec in _each(raw, k):
        basis = rec.get("basis")
        if basis == "galvanic-series":
            series = rec.get("series")
            if series is None:
                out.error(k, label, "series", "an environment on the galvanic-series basis needs 'series' "
                                              f"(one of {', '.join(SERIES_FIELDS)})")
            elif series not in SERIES_FIELDS:
                out.error(k, label, "series", f"series {_fmt(series)} is not one the materials carry: "
                                              f"expected one of {', '.join(SERIES_FIELDS)}")
        elif basis == "anodic-index":
            sev = rec.get("severity")
            if sev not in SEVERITIES:
                out.error(k, label, "severity", f"severity {_fmt(sev)} on the anodic-index basis: expected one of "
                                                f"{', '.join(SEVERITIES)}")


def _ions(raw, out):
    k = "ions"
    for label, rec in _each(raw, k):
        sp, z = rec.get("species"), rec.get("charge")
        if not isinstance(sp, str):
            continue
        try:
            parsed = parse_species(sp if sp.endswith(")") else sp + "(aq)")
        except InputError:
            out.error(k, label, "species", f"species {sp!r} cannot be read: expected an ion such as 'Zn2+' or 'SO4^2-'")
            continue
        if parsed.charge == 0:
            out.error(k, label, "species", f"species {sp!r} carries no charge: ions.yaml holds ions")
        elif _is_num(z) and z != parsed.charge:
            hint = ""
            m = re.match(r"^(.*[A-Za-z)])(\d+)([+-])$", sp)
            if m and "^" not in sp and abs(z) == 1:
                hint = (f"; digits before the sign are the charge, so when the formula ends in a digit "
                        f"write {m.group(1) + m.group(2) + '^' + m.group(3)!r}")
            out.error(k, label, "charge", f"value {_fmt(z)} differs from the charge written in {sp!r} "
                                          f"({parsed.charge:+d}){hint}")


# --- 11. cathodic-protection criteria -----------------------------------------------------------------
#: potentials of CP criteria: beyond magnesium anodes (about -1.75 V CSE) or oxygen evolution is a
#: typo or a unit slip [V] (common practice)
CP_POTENTIAL_RANGE_V = (-2.5, 1.0)
#: polarisation and on-potential shifts of CP criteria: 100 and 300 mV are the published ones [V]
#: (common practice)
CP_SHIFT_MAX_V = 1.0


def _cp_criteria(raw, out):
    from calc.fieldcheck import SETTINGS, STRUCTURES

    k = "cp_criteria"
    ref_recs = {rec.get("id"): rec for _, rec in _each(raw, "reference_electrodes") if isinstance(rec.get("id"), str)}
    have_refs = isinstance(raw.get("reference_electrodes"), list)
    base, limits, ramps = {}, {}, []
    for label, rec in _each(raw, k):
        structure, settings, kind = rec.get("structure"), rec.get("settings"), rec.get("kind")
        if isinstance(structure, str) and structure not in STRUCTURES:
            out.error(k, label, "structure", f"structure {structure!r} is not one calc knows: expected one of "
                                             f"{', '.join(STRUCTURES)} (calc.fieldcheck.STRUCTURES)")
        settings = [s for s in settings if isinstance(s, str)] if isinstance(settings, list) else []
        for i, s in enumerate(settings):
            if s not in SETTINGS:
                out.error(k, label, f"settings[{i}]", f"setting {s!r} is not one calc knows: expected one of "
                                                      f"{', '.join(SETTINGS)} (calc.fieldcheck.SETTINGS)")
        electrode = rec.get("electrode")
        if isinstance(electrode, str) and have_refs and electrode not in ref_recs:
            import difflib

            close = difflib.get_close_matches(electrode, list(ref_recs), n=3, cutoff=0.5)
            hint = f" (closest: {', '.join(close)})" if close else ""
            out.error(k, label, "electrode", f"unknown reference electrode {electrode!r}: not an id in "
                                             f"reference_electrodes.yaml{hint}")
        pot = rec.get("potential_V")
        pot_ok = _in_range(k, label, "potential_V", pot, *CP_POTENTIAL_RANGE_V, "V", out)
        _in_range(k, label, "shift_V", rec.get("shift_V"), 0.0, CP_SHIFT_MAX_V, "V", out, lo_open=True)
        rng = _pair(k, label, "range_V", rec.get("range_V"), *CP_POTENTIAL_RANGE_V, "V", out, strict=True,
                    ends="[most negative, least negative]")
        if rng and pot_ok and not rng[0] <= pot <= rng[1]:
            out.error(k, label, "range_V", f"the range {_fmt(rec['range_V'])} does not contain potential_V {pot:g}")
        window = _pair(k, label, "structure_temp_C", rec.get("structure_temp_C"), *TEMP_RANGE_C, "°C", out,
                       strict=True)
        ramp = _pair(k, label, "ramp_C", rec.get("ramp_C"), *TEMP_RANGE_C, "°C", out, strict=True,
                     ends="[from, full]")
        if "ramp_C" in rec and "structure_temp_C" not in rec:
            out.error(k, label, "ramp_C", "ramp_C needs structure_temp_C (the temperatures the record applies to)")
        elif ramp and window and not (window[0] <= ramp[0] and ramp[1] <= window[1]):
            out.error(k, label, "ramp_C", f"the ramp {_fmt(rec['ramp_C'])} lies outside structure_temp_C "
                                          f"{_fmt(rec['structure_temp_C'])}")
        if "ramp_C" in rec and kind == "limit":
            out.error(k, label, "ramp_C", "only protection criteria can move with temperature")
        also = rec.get("also")
        for i, cit in enumerate(also if isinstance(also, list) else []):
            if isinstance(cit, dict) and cit.get("source") is not None and cit.get("source") == rec.get("source"):
                out.error(k, label, f"also[{i}].source", f"{cit['source']!r} is already the record's own source")
        for s in settings:
            key = (structure, s)
            if kind == "protection" and "structure_temp_C" not in rec:
                if key in base:
                    out.error(k, label, "settings", f"{structure} in {s} already has a base protection criterion "
                                                    f"({base[key][0]}): one per structure and setting")
                else:
                    base[key] = (label, rec)
            elif kind == "limit":
                if key in limits:
                    out.error(k, label, "settings", f"{structure} in {s} already has a negative limit "
                                                    f"({limits[key][0]}): one per structure and setting")
                else:
                    limits[key] = (label, rec)
        if kind == "protection" and "structure_temp_C" in rec:
            ramps.append((label, rec, settings))

    def at25(rec):  # a record's potential vs SHE at 25 °C, or None
        ref = ref_recs.get(rec.get("electrode"))
        e_ref = refelec_potential(ref, 25.0) if ref else None
        return rec["potential_V"] + e_ref if _is_num(rec.get("potential_V")) and _is_num(e_ref) else None

    for label, rec, settings in ramps:
        for s in settings:
            b = base.get((rec.get("structure"), s))
            if b is None:
                out.error(k, label, "settings", f"no base protection criterion for {rec.get('structure')} in {s} "
                                                "for this temperature criterion to move from")
            elif b[1].get("electrode") != rec.get("electrode"):
                out.error(k, label, "electrode", f"the temperature criterion is against {rec.get('electrode')!r} but "
                                                 f"its base {b[0]} against {b[1].get('electrode')!r}: use the same")
    for key, (llabel, lrec) in limits.items():
        b = base.get(key)
        if b is None:
            continue
        e_lim, e_prot = at25(lrec), at25(b[1])
        if e_lim is not None and e_prot is not None and e_lim >= e_prot:
            out.error(k, llabel, "potential_V", f"the negative limit {lrec['potential_V']:g} V vs {lrec['electrode']} "
                                                f"is not below the protection criterion {b[0]} "
                                                f"({b[1]['potential_V']:g} V vs {b[1]['electrode']}) for {key[0]} in "
                                                f"{key[1]}")


# --- entry points ------------------------------------------------------------------------------------
def validate_raw(raw, data_dir):
    """Every problem in the raw records, as ``file:record:field: message`` lines.

    Args:
        raw: top-level key -> list of records, as read by :func:`sitebuild.dataset.read_folder` [unitless]
        data_dir: the folder the records came from (for the file checks and its schema/) [unitless]

    Returns:
        list of problem lines; lines that start with ``warning`` do not fail a check
    """
    out = _Collector()
    if data_dir:
        _file_shape(raw, data_dir, out)
    for kind in KIND_ORDER:
        if kind in raw:
            records = raw[kind]
            if records is None or (isinstance(records, list) and not records):
                out.error(kind, "-", kind, f"no records: '{kind}' must list at least one record")
            _schema_problems(kind, records, data_dir or PROJECT_DATA, out)
    _sources(raw, out)
    _duplicates(raw, out)
    _ranges(raw, out)
    _stoichiometry(raw, out)
    _additivity(raw, out)
    _acid_alkaline(raw, out)
    _reference_electrodes(raw, out)
    _materials(raw, out)
    _environments(raw, out)
    _ions(raw, out)
    _cp_criteria(raw, out)
    return out.lines


_READ_PROBLEM_RE = re.compile(r"^(?P<file>[^:]+\.yaml):line (?P<line>\d+):-: (?P<msg>.*)$")
_DUPLICATE_RE = re.compile(r"duplicate key (?P<key>'[^']*'|\"[^\"]*\"|\S+)")
_RECORD_START_RE = re.compile(r"^\s*-\s+(?:id|species):\s*(?P<id>.+?)\s*(?:#.*)?$")


def _record_at(path, line):
    """The id of the record a line of a data file belongs to (the nearest '- id:' above it)."""
    try:
        with open(path, encoding="utf-8", errors="replace") as fh:
            lines = fh.read().splitlines()[:line]
    except OSError:
        return None
    for text in reversed(lines):
        m = _RECORD_START_RE.match(text)
        if m:
            return m.group("id").strip("'\"")
        if re.match(r"^\S", text) and not text.startswith("#"):
            return None  # reached the top-level key
    return None


def _locate_read_problems(problems, folder):
    """Name the record (and, for a duplicate key, the field) of a YAML problem reported by line."""
    out = []
    for prob in problems:
        m = _READ_PROBLEM_RE.match(prob)
        if not m:
            out.append(prob)
            continue
        line = int(m.group("line"))
        rec = _record_at(os.path.join(folder, m.group("file")), line)
        where = f"{rec} (line {line})" if rec else f"line {line}"
        field = "-"
        dup = _DUPLICATE_RE.search(m.group("msg"))
        if dup:
            field = dup.group("key").strip("'\"")
        out.append(f"{m.group('file')}:{where}:{field}: {m.group('msg')}")
    return out


def check_folder(data_dir=None):
    """Read and validate a data folder: every problem of reading, then of validation.

    Args:
        data_dir: the folder holding the dataset files; default the project's data/ [unitless]

    Returns:
        list of ``file:record:field: message`` lines; lines that start with ``warning`` do not fail
    """
    from .dataset import read_folder

    folder = data_dir or PROJECT_DATA
    if not os.path.isdir(folder):
        return [f"-:-:-: {folder} is not a folder"]
    raw, problems = read_folder(folder)
    return _locate_read_problems(problems, folder) + validate_raw(raw, folder)
