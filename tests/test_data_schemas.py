"""Data checks for data/*.yaml: JSON Schema validation, stoichiometry, source references.

Every YAML file is loaded with yaml.safe_load semantics (plus a duplicate-key check) and validated
against its draft 2020-12 schema in data/schema/. The species strings of every half-reaction are
parsed with a small parser for the grammar in DEVELOPERS.md (kept here on purpose, independent of
calc.species) and checked for balance in atoms and charge. Every `source` / `*_source` id must exist
in data/sources.yaml and every source must be used.
"""

from __future__ import annotations

import json
import re
from collections import Counter
from fractions import Fraction
from pathlib import Path

import pytest
import yaml
from jsonschema import Draft202012Validator

ROOT = Path(__file__).resolve().parent.parent
DATA = ROOT / "data"
SCHEMA_DIR = DATA / "schema"

# file stem -> top-level key holding the records
FILES = {
    "sources": "sources",
    "half_reactions": "half_reactions",
    "reference_electrodes": "reference_electrodes",
    "materials": "materials",
    "environments": "environments",
    "ions": "ions",
    "cp_criteria": "cp_criteria",
    "cp_structures": "cp_structures",
    "cp_settings": "cp_settings",
    "gibbs_energies": "gibbs_energies",
}


# --------------------------------------------------------------------------- loading
class _UniqueKeySafeLoader(yaml.SafeLoader):
    """SafeLoader that rejects duplicate mapping keys (safe_load silently keeps the last one)."""


def _construct_mapping(loader, node, deep=False):
    seen = set()
    for key_node, _ in node.value:
        key = loader.construct_object(key_node, deep=deep)
        if key in seen:
            raise yaml.constructor.ConstructorError(
                None, None, f"duplicate key {key!r}", key_node.start_mark
            )
        seen.add(key)
    return yaml.SafeLoader.construct_mapping(loader, node, deep=deep)


_UniqueKeySafeLoader.add_constructor(
    yaml.resolver.BaseResolver.DEFAULT_MAPPING_TAG, _construct_mapping
)


def _load(stem: str):
    text = (DATA / f"{stem}.yaml").read_text(encoding="utf-8")
    doc = yaml.load(text, Loader=_UniqueKeySafeLoader)  # noqa: S506 - a SafeLoader subclass
    assert doc == yaml.safe_load(text)
    return doc


DOCS = {stem: _load(stem) for stem in FILES}
RECORDS = {stem: DOCS[stem][key] for stem, key in FILES.items()}
SOURCE_IDS = {s["id"] for s in RECORDS["sources"]}
HR = {r["id"]: r for r in RECORDS["half_reactions"]}
REF = {r["id"]: r for r in RECORDS["reference_electrodes"]}
MAT = {r["id"]: r for r in RECORDS["materials"]}
ENV = {r["id"]: r for r in RECORDS["environments"]}


# --------------------------------------------------------------------------- species parser
ELEMENTS = set(
    "H He Li Be B C N O F Ne Na Mg Al Si P S Cl Ar K Ca Sc Ti V Cr Mn Fe Co Ni Cu Zn Ga Ge As Se "
    "Br Kr Rb Sr Y Zr Nb Mo Tc Ru Rh Pd Ag Cd In Sn Sb Te I Xe Cs Ba La Ce Pr Nd Pm Sm Eu Gd Tb Dy "
    "Ho Er Tm Yb Lu Hf Ta W Re Os Ir Pt Au Hg Tl Pb Bi Po At Rn Fr Ra Ac Th Pa U Np Pu".split()
)
_SPECIES_RE = re.compile(r"(?:(?P<coeff>[1-9][0-9]*(?:\.[0-9]+)?) )?(?P<body>\S+)\((?P<phase>aq|s|l|g)\)")
_TOKEN_RE = re.compile(r"([A-Z][a-z]?)|(\()|(\))|([0-9]+)")


def parse_formula(formula: str) -> Counter:
    """Atom counts of a formula such as 'Fe(OH)2' or 'Hg2Cl2' (nested parentheses allowed)."""
    pos = 0
    stack = [Counter()]
    while pos < len(formula):
        m = _TOKEN_RE.match(formula, pos)
        if not m:
            raise ValueError(f"formula {formula!r}: unexpected character {formula[pos]!r} at {pos}")
        element, opening, closing, digits = m.groups()
        pos = m.end()
        count = 1
        if element or closing:
            d = _TOKEN_RE.match(formula, pos)
            if d and d.group(4):
                count = int(d.group(4))
                pos = d.end()
        if element:
            if element not in ELEMENTS:
                raise ValueError(f"formula {formula!r}: unknown element {element!r}")
            stack[-1][element] += count
        elif opening:
            stack.append(Counter())
        elif closing:
            if len(stack) == 1:
                raise ValueError(f"formula {formula!r}: unbalanced ')'")
            group = stack.pop()
            for el, k in group.items():
                stack[-1][el] += k * count
        else:
            raise ValueError(f"formula {formula!r}: count {digits!r} without an element or group")
    if len(stack) != 1:
        raise ValueError(f"formula {formula!r}: unbalanced '('")
    if not stack[0]:
        raise ValueError(f"formula {formula!r}: no atoms")
    return stack[0]


def split_charge(body: str) -> tuple[str, int]:
    """Split 'Zn2+' -> ('Zn', 2), 'Hg2^2+' -> ('Hg2', 2), 'OH-' -> ('OH', -1), 'H2O' -> ('H2O', 0)."""
    if "^" in body:
        formula, charge = body.split("^", 1)
        m = re.fullmatch(r"([0-9]*)([+-])", charge)
        if not m or not formula:
            raise ValueError(f"species {body!r}: bad charge after '^'")
    else:
        m0 = re.fullmatch(r"(.*?)([0-9]*)([+-])", body)
        if not m0:
            return body, 0
        formula = m0.group(1)
        m = re.fullmatch(r"([0-9]*)([+-])", m0.group(2) + m0.group(3))
        if not formula:
            raise ValueError(f"species {body!r}: no formula before the charge")
    magnitude = int(m.group(1)) if m.group(1) else 1
    return formula, magnitude if m.group(2) == "+" else -magnitude


def parse_species(text: str) -> tuple[Fraction, Counter, int, str, str]:
    """'2 H2O(l)' -> (coeff, atoms, charge, phase, formula-with-charge)."""
    m = _SPECIES_RE.fullmatch(text)
    if not m:
        raise ValueError(f"species {text!r}: expected [COEFF ]FORMULA[CHARGE](PHASE), PHASE aq|s|l|g")
    coeff = Fraction(m.group("coeff")) if m.group("coeff") else Fraction(1)
    formula, charge = split_charge(m.group("body"))
    return coeff, parse_formula(formula), charge, m.group("phase"), m.group("body")


def side_totals(side: list[str]) -> tuple[Counter, Fraction]:
    atoms: Counter = Counter()
    charge = Fraction(0)
    for text in side:
        coeff, counts, z, _, _ = parse_species(text)
        for el, k in counts.items():
            atoms[el] += coeff * k
        charge += coeff * z
    return atoms, charge


def reaction_vector(hr: dict) -> Counter:
    """Species -> net stoichiometric coefficient (oxidised side positive, electrons as 'e-')."""
    vec: Counter = Counter()
    for text in hr["oxidised"]:
        coeff, _, _, phase, body = parse_species(text)
        vec[f"{body}({phase})"] += coeff
    for text in hr["reduced"]:
        coeff, _, _, phase, body = parse_species(text)
        vec[f"{body}({phase})"] -= coeff
    vec["e-"] += hr["n"]
    return vec


# --------------------------------------------------------------------------- the parser itself
@pytest.mark.parametrize(
    "text, atoms, charge, phase",
    [
        ("Hg2^2+(aq)", {"Hg": 2}, 2, "aq"),
        ("SO4^2-(aq)", {"S": 1, "O": 4}, -2, "aq"),
        ("Zn2+(aq)", {"Zn": 1}, 2, "aq"),
        ("OH-(aq)", {"O": 1, "H": 1}, -1, "aq"),
        ("H+(aq)", {"H": 1}, 1, "aq"),
        ("Fe(OH)2(s)", {"Fe": 1, "O": 2, "H": 2}, 0, "s"),
        ("2 H2O(l)", {"H": 2, "O": 1}, 0, "l"),
        ("Cr2O7^2-(aq)", {"Cr": 2, "O": 7}, -2, "aq"),
        ("NO3^-(aq)", {"N": 1, "O": 3}, -1, "aq"),
        ("Ca3(PO4)2(s)", {"Ca": 3, "P": 2, "O": 8}, 0, "s"),
    ],
)
def test_species_parser_reads_the_grammar(text, atoms, charge, phase):
    _, got_atoms, got_charge, got_phase, _ = parse_species(text)
    assert dict(got_atoms) == atoms
    assert got_charge == charge
    assert got_phase == phase


@pytest.mark.parametrize("bad", ["Zn2+", "Zn(x)", "Xx(s)", "Fe(OH2(s)", "0 H2O(l)", "2H2O(l)", "^2+(aq)"])
def test_species_parser_rejects_bad_strings(bad):
    with pytest.raises(ValueError):
        parse_species(bad)


# --------------------------------------------------------------------------- files and schemas
@pytest.mark.parametrize("stem", sorted(FILES))
def test_first_line_links_the_schema(stem):
    first = (DATA / f"{stem}.yaml").read_text(encoding="utf-8").splitlines()[0]
    assert first == f"# yaml-language-server: $schema=schema/{stem}.schema.json"


@pytest.mark.parametrize("stem", sorted(FILES))
def test_yaml_validates_against_its_schema(stem):
    schema = json.loads((SCHEMA_DIR / f"{stem}.schema.json").read_text(encoding="utf-8"))
    Draft202012Validator.check_schema(schema)
    assert schema["$schema"] == "https://json-schema.org/draft/2020-12/schema"
    validator = Draft202012Validator(schema)
    errors = sorted(validator.iter_errors(DOCS[stem]), key=lambda e: list(e.absolute_path))
    messages = [
        f"{stem}.yaml:{'/'.join(map(str, e.absolute_path))}: {e.message}" for e in errors
    ]
    assert not messages, "\n".join(messages)


def _strict_everywhere(node, where="$"):
    """Every object schema in the file must forbid unknown keys."""
    problems = []
    if isinstance(node, dict):
        if node.get("type") == "object" and node.get("additionalProperties") not in (False,) and (
            "properties" in node
        ):
            problems.append(where)
        for k, v in node.items():
            problems += _strict_everywhere(v, f"{where}/{k}")
    elif isinstance(node, list):
        for i, v in enumerate(node):
            problems += _strict_everywhere(v, f"{where}/{i}")
    return problems


@pytest.mark.parametrize("stem", sorted(FILES))
def test_schemas_are_strict(stem):
    schema = json.loads((SCHEMA_DIR / f"{stem}.schema.json").read_text(encoding="utf-8"))
    assert _strict_everywhere(schema) == []


@pytest.mark.parametrize(
    "stem, record",
    [
        ("half_reactions", {"id": "X/Y", "name": "x", "oxidised": ["Zn2+(aq)"], "reduced": ["Zn(s)"],
                            "n": 2, "E0_V": 5.0, "E0_source": "crc-vanysek", "E0_confidence": "read"}),
        ("half_reactions", {"id": "X/Y", "name": "x", "oxidised": ["Zn2+"], "reduced": ["Zn(s)"],
                            "n": 2, "E0_V": -0.76, "E0_source": "crc-vanysek", "E0_confidence": "read"}),
        ("half_reactions", {"id": "X/Y", "name": "x", "oxidised": ["Zn2+(aq)"], "reduced": ["Zn(s)"],
                            "n": 2, "E0_V": -0.76, "E0_source": "crc-vanysek", "E0_confidence": "guessed"}),
        ("materials", {"id": "x", "name": "x", "family": "x", "state": "passive"}),
        ("materials", {"id": "x", "name": "x", "family": "x", "state": None, "colour": "red"}),
        ("materials", {"id": "x", "name": "x", "family": "x", "state": None, "equivalent_weight_g": None,
                       "equivalent_weight_source": "common-practice", "equivalent_weight_confidence": "read"}),
        ("environments", {"id": "x", "name": "x", "basis": "anodic-index", "allowable_V": 0.15,
                          "allowable_source": "anodic-index-legacy", "allowable_confidence": "read",
                          "cathodic_current_density_uA_per_cm2": None, "cathodic_current_density_note": "n"}),
        ("environments", {"id": "x", "name": "x", "basis": "galvanic-series", "series": "seawater-flowing",
                          "allowable_V": 0.25, "allowable_source": "common-practice",
                          "allowable_confidence": "recalled", "cathodic_current_density_uA_per_cm2": None}),
        ("reference_electrodes", {"id": "X", "name": "x", "E_V_SHE": 0.2, "source": "common-practice",
                                  "confidence": "read", "temperature": {"kind": "linear", "t_ref_C": 20,
                                  "slope_mV_per_K": -1, "valid_C": [0, 50], "source": "common-practice",
                                  "confidence": "read"}}),
        ("ions", {"species": "Zn2+", "charge": 0, "size_angstrom": 6, "source": "kielland-1937",
                  "confidence": "recalled"}),
    ],
)
def test_schemas_reject_bad_records(stem, record):
    schema = json.loads((SCHEMA_DIR / f"{stem}.schema.json").read_text(encoding="utf-8"))
    assert not Draft202012Validator(schema).is_valid({FILES[stem]: [record]})


# --------------------------------------------------------------------------- counts and ids
@pytest.mark.parametrize(
    "stem, minimum",
    [("half_reactions", 60), ("reference_electrodes", 13), ("materials", 40),
     ("environments", 9), ("ions", 35)],
)
def test_minimum_record_counts(stem, minimum):
    assert len(RECORDS[stem]) >= minimum


@pytest.mark.parametrize("stem", sorted(FILES))
def test_ids_and_aliases_are_unique(stem):
    key = "species" if stem == "ions" else "id"
    ids = [r[key] for r in RECORDS[stem]]
    assert len(ids) == len(set(ids)), [i for i in ids if ids.count(i) > 1]
    names = Counter()
    for r in RECORDS[stem]:
        for name in [r[key], *r.get("aliases", [])]:
            names[" ".join(str(name).lower().split())] += 1
    assert [n for n, c in names.items() if c > 1] == []


def test_required_ids_present():
    for hid in ["Li+/Li", "Na+/Na", "K+/K", "Ca2+/Ca", "Ba2+/Ba", "Mg2+/Mg", "Be2+/Be", "Al3+/Al",
                "Ti2+/Ti", "Ti3+/Ti", "Mn2+/Mn", "Zn2+/Zn", "Cr3+/Cr", "Cr2+/Cr", "Cr3+/Cr2+",
                "Cr2O7^2-/Cr3+", "Fe2+/Fe", "Fe3+/Fe", "Fe3+/Fe2+", "Cd2+/Cd", "Co2+/Co", "Ni2+/Ni",
                "Sn2+/Sn", "Sn4+/Sn2+", "Pb2+/Pb", "Cu+/Cu", "Cu2+/Cu", "Cu2+/Cu+", "Ag+/Ag",
                "Hg2^2+/Hg", "Hg2+/Hg", "Hg2+/Hg2^2+", "Pd2+/Pd", "Pt2+/Pt", "Au+/Au", "Au3+/Au",
                "H+/H2", "H2O/H2", "O2/H2O", "O2/OH-", "O2/H2O2", "H2O2/H2O", "AgCl/Ag", "Hg2Cl2/Hg",
                "Hg2SO4/Hg", "HgO/Hg", "PbSO4/Pb", "PbO2/PbSO4", "Fe(OH)2/Fe", "Fe(OH)3/Fe(OH)2",
                "Ni(OH)2/Ni", "Cu2O/Cu", "Al(OH)3/Al", "Mg(OH)2/Mg", "Cd(OH)2/Cd", "Cl2/Cl-"]:
        assert hid in HR, hid
    assert HR["Ti2+/Ti"].get("hypothetical") is True
    for rid in ["SHE", "SCE", "CSE", "Ag/AgCl sat. KCl", "Ag/AgCl 3 M KCl", "Ag/AgCl 3.5 M KCl",
                "Ag/AgCl 1 M KCl", "Ag/AgCl 0.1 M KCl", "Ag/AgCl seawater", "Zn seawater",
                "calomel 1 M KCl", "calomel 0.1 M KCl", "calomel 3.5 M KCl", "Hg/Hg2SO4 sat. K2SO4",
                "Hg/HgO 0.1 M NaOH"]:
        assert rid in REF, rid
    for eid in ["seawater-flowing", "seawater-quiescent", "brackish-water", "fresh-water",
                "marine-atmosphere", "industrial-atmosphere", "indoor-uncontrolled",
                "indoor-controlled"]:
        assert eid in ENV, eid


# --------------------------------------------------------------------------- sources
def _walk_source_refs(node, path):
    if isinstance(node, dict):
        for k, v in node.items():
            if k == "source" or k.endswith("_source"):
                yield f"{path}.{k}", v
            else:
                yield from _walk_source_refs(v, f"{path}.{k}")
    elif isinstance(node, list):
        for i, v in enumerate(node):
            yield from _walk_source_refs(v, f"{path}[{i}]")


def _all_refs():
    for stem in FILES:
        if stem == "sources":
            continue
        key = "species" if stem == "ions" else "id"
        for r in RECORDS[stem]:
            yield from _walk_source_refs(r, f"{stem}.yaml:{r[key]}")


def test_every_source_reference_exists():
    missing = [f"{where}: unknown source id {sid!r}" for where, sid in _all_refs() if sid not in SOURCE_IDS]
    assert not missing, "\n".join(missing)


def _other_refs():
    """Source ids cited by the engine's other data files (those this module does not check)."""
    from calc.dataset import KINDS

    for kind in (k for k in KINDS if k not in FILES):
        path = DATA / f"{kind}.yaml"
        if path.exists():
            for r in yaml.safe_load(path.read_text(encoding="utf-8")).get(kind) or []:
                yield from _walk_source_refs(r, f"{kind}.yaml")


def test_every_source_is_used():
    # a restatement names the original it reproduces (``restates``): the original counts as used
    used = {sid for _, sid in _all_refs()} | {sid for _, sid in _other_refs()}
    used |= {s["restates"] for s in RECORDS["sources"] if s.get("restates")}
    unused = sorted(SOURCE_IDS - used)
    assert not unused, f"sources.yaml: ids never used by a value: {unused}"


UNIT_SUFFIXES = ("_V_SCE", "_V_SHE", "_mV_per_K", "_J_per_mol_K", "_kJ_per_mol", "_g_cm3", "_uA_per_cm2",
                 "_mol_per_kg", "_ohm_m", "_wt_pct", "_angstrom", "_V", "_C", "_g")
# structural numbers that belong to the record's own source or are not published values
NOT_VALUES = {"n", "charge", "t_ref_C", "coeffs_V", "slope_mV_per_K", "valid_C",
              "equivalent_weight_valences"}


def _has_number(v):
    if isinstance(v, bool):
        return False
    if isinstance(v, (int, float)):
        return True
    if isinstance(v, list):
        return any(_has_number(x) for x in v)
    if isinstance(v, dict):
        return any(_has_number(x) for x in v.values())
    return False


def _value_source_problems(record, where):
    problems = []
    for key, value in record.items():
        if isinstance(value, dict) and key == "temperature":
            if "source" not in value or "confidence" not in value:
                problems.append(f"{where}.{key}: a temperature model needs source and confidence")
            continue
        if key in NOT_VALUES or not _has_number(value):
            continue
        suffix = next((s for s in UNIT_SUFFIXES if key.endswith(s)), None)
        if suffix is None:
            problems.append(f"{where}.{key}: numeric field without a unit in its name")
            continue
        stem = key[: -len(suffix)]
        prefixes = [stem]
        while "_" in stem:
            stem = stem.rsplit("_", 1)[0]
            prefixes.append(stem)
        prefix = next((p for p in prefixes if f"{p}_source" in record), None)
        if prefix is None and "source" not in record:
            problems.append(f"{where}.{key}: no sibling *_source")
        elif prefix is not None and f"{prefix}_confidence" not in record and "confidence" not in record:
            problems.append(f"{where}.{key}: no sibling *_confidence")
    return problems


def test_every_numeric_value_has_a_source_and_confidence():
    problems = []
    for stem in FILES:
        if stem == "sources":
            continue
        key = "species" if stem == "ions" else "id"
        for r in RECORDS[stem]:
            problems += _value_source_problems(r, f"{stem}.yaml:{r[key]}")
    assert not problems, "\n".join(problems)


# --------------------------------------------------------------------------- half-reactions
@pytest.mark.parametrize("hid", sorted(HR))
def test_half_reaction_balances(hid):
    hr = HR[hid]
    atoms_ox, charge_ox = side_totals(hr["oxidised"])
    atoms_red, charge_red = side_totals(hr["reduced"])
    assert atoms_ox == atoms_red, f"{hid}: atoms {dict(atoms_ox)} vs {dict(atoms_red)}"
    assert charge_ox - hr["n"] == charge_red, (
        f"{hid}: charge(oxidised) {charge_ox} - n {hr['n']} != charge(reduced) {charge_red}"
    )


@pytest.mark.parametrize("hid", sorted(HR))
def test_half_reaction_id_names_its_species(hid):
    hr = HR[hid]
    ox_id, red_id = hid.split("/")
    ox_bodies = {parse_species(s)[4] for s in hr["oxidised"]}
    red_bodies = {parse_species(s)[4] for s in hr["reduced"]}
    assert ox_id in ox_bodies, f"{hid}: {ox_id!r} not among oxidised species {ox_bodies}"
    assert red_id in red_bodies, f"{hid}: {red_id!r} not among reduced species {red_bodies}"


# Free-energy additivity: k * whole = part1 + part2 as reactions, so
# k * n_w * E_w = n_1 E_1 + n_2 E_2. Where the handbook values miss by more than 2 mV, a note
# on one of the three records must say the published values are inconsistent.
LINKED = [
    ("Fe3+/Fe", 1, "Fe3+/Fe2+", "Fe2+/Fe"),
    ("Cu2+/Cu", 1, "Cu2+/Cu+", "Cu+/Cu"),
    ("Cr3+/Cr", 1, "Cr3+/Cr2+", "Cr2+/Cr"),
    ("Au3+/Au", 1, "Au3+/Au+", "Au+/Au"),
    ("Hg2+/Hg", 2, "Hg2+/Hg2^2+", "Hg2^2+/Hg"),
    ("O2/H2O", 1, "O2/H2O2", "H2O2/H2O"),
]


@pytest.mark.parametrize("whole, k, part1, part2", LINKED)
def test_linked_couples_add_up(whole, k, part1, part2):
    w, a, b = HR[whole], HR[part1], HR[part2]
    scaled = Counter({s: k * c for s, c in reaction_vector(w).items()})
    combined = reaction_vector(a)
    combined.update(reaction_vector(b))
    assert {s: c for s, c in scaled.items() if c} == {s: c for s, c in combined.items() if c}, (
        f"{part1} + {part2} is not {k} x {whole}"
    )
    gap_V = (k * w["n"] * w["E0_V"] - a["n"] * a["E0_V"] - b["n"] * b["E0_V"]) / (k * w["n"])
    if abs(gap_V) > 0.002:
        notes = " ".join(r.get("note", "") for r in (w, a, b)).lower()
        assert "inconsistent" in notes, (
            f"{whole}: free-energy additivity misses by {gap_V * 1000:.1f} mV and no note says so"
        )
    # the same additivity for the temperature coefficients, where all three carry one
    if all("dEdT_mV_per_K" in r for r in (w, a, b)):
        gap_mV_K = (k * w["n"] * w["dEdT_mV_per_K"] - a["n"] * a["dEdT_mV_per_K"]
                    - b["n"] * b["dEdT_mV_per_K"]) / (k * w["n"])
        assert abs(gap_mV_K) < 0.01


# Acid and alkaline forms of the same couple differ by the water ionisation:
# E(alk) = E(acid) - (ln10 RT/F) * pKw * nH/n, with ln10 RT/F = 0.05916 V at 25 °C (computed from
# CODATA 2018 F and R) and pKw = 14.00 (common practice).
KW_PAIRS = [("O2/H2O", "O2/OH-"), ("H+/H2", "H2O/H2")]


@pytest.mark.parametrize("acid, alkaline", KW_PAIRS)
def test_acid_and_alkaline_forms_agree_through_kw(acid, alkaline):
    a, b = HR[acid], HR[alkaline]
    n_h = sum(parse_species(s)[0] for s in a["oxidised"] if parse_species(s)[4] == "H+")
    expected = a["E0_V"] - 0.05916 * 14.00 * float(n_h) / a["n"]
    assert b["E0_V"] == pytest.approx(expected, abs=0.002)


def test_hypothetical_couples_explain_themselves():
    for hid, hr in HR.items():
        if hr.get("hypothetical"):
            assert "hypothetical" in hr["note"].lower(), hid


def test_every_ion_in_a_half_reaction_has_an_ion_record():
    known = set()
    for ion in RECORDS["ions"]:
        _, atoms, charge, _, _ = parse_species(ion["species"] + "(aq)")
        assert charge == ion["charge"], f"ions.yaml:{ion['species']}: charge field {ion['charge']} != {charge}"
        known.add((frozenset(atoms.items()), charge))
    missing = set()
    for hr in HR.values():
        for text in hr["oxidised"] + hr["reduced"]:
            _, atoms, charge, phase, body = parse_species(text)
            if charge and (frozenset(atoms.items()), charge) not in known:
                missing.add(body)
    assert not missing, f"ions.yaml lacks {sorted(missing)}"


# --------------------------------------------------------------------------- reference electrodes
def _electrode_at(rec, t_C):
    tm = rec["temperature"]
    if tm["kind"] == "constant":
        return rec["E_V_SHE"]
    if tm["kind"] == "linear":
        return rec["E_V_SHE"] + tm["slope_mV_per_K"] / 1000.0 * (t_C - tm["t_ref_C"])
    x = t_C - tm["t_ref_C"]
    return sum(c * x**i for i, c in enumerate(tm["coeffs_V"]))


@pytest.mark.parametrize("rid", sorted(REF))
def test_temperature_model_matches_the_25C_value(rid):
    rec = REF[rid]
    tm = rec["temperature"]
    lo, hi = tm["valid_C"]
    assert lo < hi and lo <= 25 <= hi
    assert _electrode_at(rec, 25.0) == pytest.approx(rec["E_V_SHE"], abs=5e-5)
    if tm["kind"] == "polynomial" and tm["t_ref_C"] == 25:
        assert tm["coeffs_V"][0] == rec["E_V_SHE"]


def test_she_is_zero_at_every_temperature():
    # IUPAC convention (Cohen et al., Quantities, Units and Symbols in Physical Chemistry, 2007)
    she = REF["SHE"]
    assert she["temperature"]["kind"] == "constant"
    for t in range(0, 101, 10):
        assert _electrode_at(she, t) == 0.0


def test_sce_polynomial_follows_the_published_temperature_table():
    # L. Meites (ed.), Handbook of Analytical Chemistry, 1963 (attribution from memory), table of
    # reference-electrode potentials with junction: SCE 0.2511 V at 15 °C, 0.2444 at 25 °C,
    # 0.2376 at 35 °C, read in a reproduction. Compare differences from 25 °C, removing the offset.
    sce = REF["SCE"]
    assert _electrode_at(sce, 15) - _electrode_at(sce, 25) == pytest.approx(0.2511 - 0.2444, abs=3e-4)
    assert _electrode_at(sce, 35) - _electrode_at(sce, 25) == pytest.approx(0.2376 - 0.2444, abs=3e-4)


# --------------------------------------------------------------------------- materials
# IUPAC (CIAAW) standard atomic weights, abridged, from memory.
ATOMIC_WEIGHT = {"Mg": 24.305, "Al": 26.982, "Si": 28.085, "Ti": 47.867, "Cr": 51.996, "Mn": 54.938,
                 "Fe": 55.845, "Ni": 58.693, "Cu": 63.546, "Zn": 65.38, "Mo": 95.95, "Ag": 107.87,
                 "Cd": 112.41, "Sn": 118.71, "W": 183.84, "Pt": 195.08, "Au": 196.97, "Pb": 207.2,
                 "Be": 9.0122, "Nb": 92.906}


@pytest.mark.parametrize("mid", sorted(MAT))
def test_material_ranges_and_states(mid):
    m = MAT[mid]
    if "seawater_range_V_SCE" in m:
        lo, hi = m["seawater_range_V_SCE"]
        assert lo <= hi, f"{mid}: seawater range must be [active end, noble end]"
    if m["state"] is not None:
        other = MAT[m["other_state"]]
        assert other["other_state"] == mid
        assert {m["state"], other["state"]} == {"passive", "active"}
        assert other.get("uns") == m.get("uns")
        if m["state"] == "passive" and "seawater_range_V_SCE" in m:
            assert other["seawater_range_V_SCE"][1] < m["seawater_range_V_SCE"][1]


@pytest.mark.parametrize("mid", sorted(m for m in MAT if MAT[m].get("equivalent_weight_confidence") == "computed"))
def test_computed_equivalent_weight_follows_g102(mid):
    # ASTM G102-89 (2015): EW = 1 / sum(n_i f_i / W_i), elements below 1 % by mass ignored.
    m = MAT[mid]
    comp, val = m["composition_wt_pct"], m["equivalent_weight_valences"]
    for el in val:
        assert comp.get(el, 0) >= 1.0, f"{mid}: valence given for {el} below 1 %"
    for el, pct in comp.items():
        if pct >= 1.0 and el not in val:
            assert el == "C", f"{mid}: {el} at {pct} % is left out of the equivalent weight"
    ew = 1.0 / sum(val[el] * comp[el] / 100.0 / ATOMIC_WEIGHT[el] for el in val)
    assert m["equivalent_weight_g"] == pytest.approx(ew, rel=1e-3)
    assert sum(comp.values()) <= 100.5


PURE = {"Ag": "silver", "Cu": "copper", "Zn": "zinc", "Sn": "tin", "Pb": "lead"}


@pytest.mark.parametrize("mid", sorted(m for m in MAT if MAT[m].get("density_source") == "computed-mixture-density"))
def test_computed_density_follows_the_mixture_rule(mid):
    m = MAT[mid]
    comp = m["composition_wt_pct"]
    inv = sum(pct / 100.0 / MAT[PURE[el]]["density_g_cm3"] for el, pct in comp.items())
    assert m["density_g_cm3"] == pytest.approx(1.0 / inv, rel=2e-3)


def test_anodic_index_groups_are_consistent():
    # legacy anodic-index table: one value per group wording
    seen = {}
    for mid, m in MAT.items():
        if "anodic_index_V" in m:
            g = m["anodic_index_group"]
            assert seen.setdefault(g, m["anodic_index_V"]) == m["anodic_index_V"], (mid, g)
    # end points of the scale: "0 (gold) to 1.85 (beryllium)", legacy table, read in reproductions
    assert MAT["gold"]["anodic_index_V"] == 0.0
    assert MAT["beryllium"]["anodic_index_V"] == 1.85
    assert MAT["aluminium-2024"]["anodic_index_V"] == 0.75


def test_seawater_series_order_of_key_materials():
    # ASTM G82-98 (2014), Fig. 1 after LaQue 1975: magnesium < zinc < aluminium < mild steel < copper
    # < 316 passive < graphite at the noble ends of their ranges.
    order = ["magnesium", "zinc", "aluminium-6061", "carbon-steel", "copper",
             "stainless-316-passive", "graphite"]
    nobles = [MAT[m]["seawater_range_V_SCE"][1] for m in order]
    assert nobles == sorted(nobles)


# --------------------------------------------------------------------------- environments
def test_environment_limits():
    # legacy anodic-index table (read in reproductions): harsh 0.15, normal 0.25, controlled 0.50 V
    severity_limit = {"harsh": 0.15, "normal": 0.25, "controlled": 0.50}
    for eid, e in ENV.items():
        if e["basis"] == "anodic-index":
            assert e["allowable_V"] == severity_limit[e["severity"]], eid
        else:
            assert e["series"] in {"seawater-flowing"}
            assert e.get("negligible_V", 0) < e["allowable_V"], eid
        cd = e["cathodic_current_density_uA_per_cm2"]
        if cd is not None:
            assert 0 < cd[0] <= cd[1], eid
        for key in ("temperature_range_C", "resistivity_ohm_m"):
            if key in e:
                assert e[key][0] <= e[key][1], (eid, key)
