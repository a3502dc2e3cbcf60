"""Data validation: every kind of broken data folder is caught, named and never silently accepted.

Each broken case is a complete data folder: the minimal valid folder of
``tests/fixtures/minimal`` with one thing broken. The YAML-level cases that must stay byte-exact
(duplicate key, alias bomb, non-UTF-8 bytes) are real folders under ``tests/fixtures/broken``;
the others are made in a temporary copy by the test. Each case runs
``couplewise data check DIR`` in a subprocess and asserts exit status 1 and a line
``file:record:field: message`` naming the file, the record and the field.

Values in the fixtures: Vanýsek, "Electrochemical Series", CRC Handbook of Chemistry and Physics,
92nd ed. (2011), Table 1; Fe2+/Fe -0.44 V from Bratsch, J. Phys. Chem. Ref. Data 18 (1989),
Table 1 (from memory); seawater ranges ASTM G82-98 Fig. 1 after LaQue (1975); SCE polynomial as
quoted from Ives & Janz (1961) by Sawyer et al. (1995) (from memory).
"""

import contextlib
import copy
import filecmp
import io
import os
import re
import shutil
import subprocess
import sys

import pytest
import yaml

from calc import cli
from sitebuild import validate
from sitebuild.dataset import FILES, read_folder

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
FIXTURES = os.path.join(ROOT, "tests", "fixtures")
MINIMAL = os.path.join(FIXTURES, "minimal")
BROKEN = os.path.join(FIXTURES, "broken")
PYTHON = os.path.join(ROOT, ".venv", "bin", "python")
if not os.path.exists(PYTHON):  # pragma: no cover - outside the project's venv
    PYTHON = sys.executable


def run_check(folder):
    """``couplewise data check FOLDER`` in a subprocess: (exit status, stdout lines)."""
    proc = subprocess.run([PYTHON, "-m", "calc.cli", "data", "check", str(folder)], cwd=ROOT,
                          capture_output=True, text=True, timeout=120)
    assert "Traceback" not in proc.stderr, proc.stderr
    return proc.returncode, [ln for ln in proc.stdout.splitlines() if ln.strip()]


def check(folder):
    """The same command run in this process (for the many variants of one case): (status, lines)."""
    out, err = io.StringIO(), io.StringIO()
    with contextlib.redirect_stdout(out), contextlib.redirect_stderr(err):
        status = cli.main(["data", "check", str(folder)])
    return status, [ln for ln in out.getvalue().splitlines() if ln.strip()]


def load(folder, fname):
    with open(os.path.join(folder, fname), encoding="utf-8") as fh:
        return yaml.safe_load(fh)


def dump(folder, fname, doc):
    """Write a dataset file with its schema line first, as the data format asks."""
    header = f"# yaml-language-server: $schema=schema/{fname[:-5]}.schema.json\n"
    with open(os.path.join(folder, fname), "w", encoding="utf-8") as fh:
        fh.write(header + yaml.safe_dump(doc, sort_keys=False, allow_unicode=True))


def record(doc, key, rid):
    for rec in doc[key]:
        if rec.get("id", rec.get("species")) == rid:
            return rec
    raise KeyError(rid)


@pytest.fixture
def folder(tmp_path):
    """A fresh copy of the minimal valid data folder."""
    dest = tmp_path / "data"
    shutil.copytree(MINIMAL, dest)
    return str(dest)


def edit(folder, fname, change):
    """Load one file of a folder, let ``change(doc)`` break it, write it back."""
    doc = load(folder, fname)
    change(doc)
    dump(folder, fname, doc)


def assert_names(lines, fname, rec, field, *words):
    """Some error line is ``fname:rec:field: ...`` and contains every word."""
    pattern = re.compile(rf"^{re.escape(fname)}:{re.escape(rec)}(?: \(line \d+\))?:{re.escape(field)}: ")
    hits = [ln for ln in lines if pattern.match(ln) and all(w in ln for w in words)]
    assert hits, f"no line {fname}:{rec}:{field}: ... with {words} in:\n" + "\n".join(lines)
    return hits


# --- the valid folders ------------------------------------------------------------------------------
def test_minimal_fixture_is_clean():
    assert validate.check_folder(MINIMAL) == []
    status, lines = run_check(MINIMAL)
    assert (status, lines) == (0, [])


def test_project_data_passes():
    """The shipped dataset has no error (warnings are allowed: they do not fail)."""
    status, lines = run_check(os.path.join(ROOT, "data"))
    errors = [ln for ln in lines if not ln.startswith("warning")]
    assert status == 0 and errors == [], "\n".join(errors)


def test_real_broken_folders_differ_from_minimal_in_one_file():
    """The byte-exact broken folders are complete copies of minimal with one file broken."""
    expected = {"duplicate-key": "half_reactions.yaml", "alias-bomb": "environments.yaml",
                "non-utf8": "materials.yaml"}
    for case, broken_file in expected.items():
        match, mismatch, errors = filecmp.cmpfiles(MINIMAL, os.path.join(BROKEN, case), list(FILES), shallow=False)
        assert mismatch == [broken_file] and not errors, \
            f"{case}: {mismatch} {errors}: run .venv/bin/python tests/fixtures/make_broken.py after changing minimal/"


# --- YAML-level cases (real files) ------------------------------------------------------------------
def test_duplicate_key():
    status, lines = run_check(os.path.join(BROKEN, "duplicate-key"))
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Fe3+/Fe2+", "E0_V", "duplicate key", "first at line")


def test_alias_bomb_is_refused_without_expanding():
    status, lines = run_check(os.path.join(BROKEN, "alias-bomb"))
    assert status == 1
    assert any(re.match(r"^environments\.yaml:line \d+:-: .*aliases", ln) for ln in lines), lines


def test_non_utf8_bytes():
    status, lines = run_check(os.path.join(BROKEN, "non-utf8"))
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "-", "not UTF-8", "byte")


# --- YAML-level cases (made here) -------------------------------------------------------------------
def test_malformed_yaml(folder):
    path = os.path.join(folder, "ions.yaml")
    with open(path, "a", encoding="utf-8") as fh:
        fh.write('  - species: "Na+"\n    charge: [1, 2\n')
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "ions.yaml", "Na+", "-", "YAML error")


def test_huge_file(folder):
    path = os.path.join(folder, "sources.yaml")
    with open(path, "a", encoding="utf-8") as fh:
        fh.write("# " + "x" * 2_100_000 + "\n")
    status, lines = run_check(folder)
    assert status == 1
    assert any(ln.startswith("sources.yaml:-:-: file is") and "limit" in ln for ln in lines), lines


def test_missing_file_and_wrong_top_level(folder):
    os.remove(os.path.join(folder, "ions.yaml"))
    with open(os.path.join(folder, "environments.yaml"), "a", encoding="utf-8") as fh:
        fh.write("extras: []\n")
    status, lines = run_check(folder)
    assert status == 1
    assert "ions.yaml:-:-: file is missing" in lines
    assert_names(lines, "environments.yaml", "-", "extras", "unknown top-level key")


def test_schema_line_first(folder):
    path = os.path.join(folder, "materials.yaml")
    with open(path, encoding="utf-8") as fh:
        text = fh.read()
    with open(path, "w", encoding="utf-8") as fh:
        fh.write(text.split("\n", 1)[1])
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "-", "-", "yaml-language-server")


# --- records ------------------------------------------------------------------------------------------
def test_duplicate_ids(folder):
    def change(doc):
        twin = copy.deepcopy(record(doc, "half_reactions", "Zn2+/Zn"))
        twin["E0_V"] = -0.7626
        doc["half_reactions"].append(twin)
    edit(folder, "half_reactions.yaml", change)
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "id", "already used")


def test_alias_clashes_with_an_id_ignoring_case(folder):
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "zinc").setdefault("aliases", []).append("Stainless 316 Passive"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "aliases[0]", "already used by stainless-316-passive")


def test_uns_shared_only_by_the_two_states_of_one_alloy(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc")["uns"].append("S31600"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "uns[1]", "S31600")
    assert not any(ln.startswith("materials.yaml:stainless-316-active:uns") for ln in lines)


def test_missing_source(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Fe3+/Fe2+").pop("E0_source"))
    status, lines = run_check(folder)
    assert status == 1
    hits = [ln for ln in lines if ln.startswith("half_reactions.yaml:Fe3+/Fe2+:E0_")]
    assert hits, lines
    assert_names(lines, "half_reactions.yaml", "Fe3+/Fe2+", "E0_V", "no source", "E0_source")


def test_unknown_source(folder):
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "zinc").__setitem__("density_source", "astm-g012"))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "density_source", "unknown source id 'astm-g012'", "astm-g102")


def test_unknown_source_in_a_nested_model(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE")["temperature"].__setitem__("source", "ives-1961"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SCE", "temperature.source", "unknown source id")


def test_unused_source(folder):
    def change(doc):
        doc["sources"].append({"id": "orphan-2020", "kind": "book", "author": "A. Nobody",
                               "title": "A book no value cites", "year": 2020})
    edit(folder, "sources.yaml", change)
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "sources.yaml", "orphan-2020", "id", "cited by no value")


def test_missing_confidence(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").pop("density_confidence"))
    status, lines = check(folder)
    assert status == 1
    assert any(ln.startswith("materials.yaml:zinc:density_") and "confidence" in ln for ln in lines), lines


def test_wrong_type_from_the_command_line(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Fe3+/Fe2+").__setitem__("E0_V", "0.771 V"))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Fe3+/Fe2+", "E0_V", "'0.771 V'")


@pytest.mark.parametrize("fname,rid,field,value", [
    ("half_reactions.yaml", "Zn2+/Zn", "E0_V", "-0.7618 V"),
    ("half_reactions.yaml", "Zn2+/Zn", "n", "two"),
    ("materials.yaml", "zinc", "density_g_cm3", [7.13]),
    ("reference_electrodes.yaml", "SCE", "E_V_SHE", None),
    ("environments.yaml", "seawater-flowing", "allowable_V", True),
])
def test_wrong_types(folder, fname, rid, field, value):
    key = FILES[fname]
    edit(folder, fname, lambda doc: record(doc, key, rid).__setitem__(field, value))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, fname, rid, field)


def test_unknown_field_is_named(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("E0_mV", -761.8))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "E0_mV")


def test_out_of_range_from_the_command_line(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").__setitem__("density_g_cm3", 0.0713))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "density_g_cm3", "0.0713")


# Bounds of the project brief: E° -4..+3.5 V, n 1..8, densities 0.5..23 g/cm3, EW > 0,
# temperatures -50..200 °C, allowable > 0, current densities >= 0. The schema holds bounds of its
# own; a value outside either is reported once, naming the field and the value.
@pytest.mark.parametrize("fname,rid,field,value,reported,words", [
    ("half_reactions.yaml", "Fe3+/Fe2+", "E0_V", 7.71, "E0_V", ("7.71",)),
    ("half_reactions.yaml", "Zn2+/Zn", "n", 12, "n", ("12",)),
    ("materials.yaml", "zinc", "density_g_cm3", 71.3, "density_g_cm3", ("71.3",)),
    ("materials.yaml", "zinc", "density_g_cm3", 24.0, "density_g_cm3", ("24", "0.5 to 23 g/cm3")),
    ("materials.yaml", "zinc", "equivalent_weight_g", 0, "equivalent_weight_g", ("0",)),
    ("environments.yaml", "seawater-flowing", "allowable_V", -0.25, "allowable_V", ("-0.25",)),
    ("environments.yaml", "seawater-flowing", "ionic_strength_mol_per_kg", 70.0, "ionic_strength_mol_per_kg", ("70",)),
    ("ions.yaml", "Cl-", "size_angstrom", 300, "size_angstrom", ("300",)),
    ("half_reactions.yaml", "Zn2+/Zn", "valid_C", [-80, 60], "valid_C[0]", ("-80",)),
    ("materials.yaml", "zinc", "seawater_range_V_SCE", [-3.0, -0.98], "seawater_range_V_SCE[0]", ("-3",)),
    ("environments.yaml", "seawater-flowing", "cathodic_current_density_uA_per_cm2", [-5, 20],
     "cathodic_current_density_uA_per_cm2[0]", ("-5",)),
    ("environments.yaml", "seawater-flowing", "temperature_range_C", [10, 270], "temperature_range_C[1]", ("270",)),
])
def test_value_out_of_physical_range(folder, fname, rid, field, value, reported, words):
    key = FILES[fname]
    edit(folder, fname, lambda doc: record(doc, key, rid).__setitem__(field, value))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, fname, rid, reported, *words)


def test_a_value_outside_schema_and_physical_bounds_is_reported_once(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Fe3+/Fe2+").__setitem__("E0_V", 7.71))
    status, lines = check(folder)
    assert status == 1
    assert len([ln for ln in lines if ln.startswith("half_reactions.yaml:Fe3+/Fe2+:E0_V:")]) == 1, lines


def test_wrong_order_from_the_command_line(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "stainless-316-active")
         .__setitem__("seawater_range_V_SCE", [-0.33, -0.46]))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-active", "seawater_range_V_SCE", "wrong order",
                 "[active end, noble end] = [-0.46, -0.33]")


@pytest.mark.parametrize("fname,rid,field,value", [
    ("materials.yaml", "zinc", "seawater_range_V_SCE", [-0.98, -1.03]),
    ("half_reactions.yaml", "Zn2+/Zn", "valid_C", [100, 0]),
    ("environments.yaml", "seawater-flowing", "temperature_range_C", [27, 10]),
    ("environments.yaml", "seawater-flowing", "cathodic_current_density_uA_per_cm2", [20, 5]),
])
def test_range_ends_in_wrong_order(folder, fname, rid, field, value):
    key = FILES[fname]
    edit(folder, fname, lambda doc: record(doc, key, rid).__setitem__(field, value))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, fname, rid, field, "wrong order")


def test_temperature_model_range_in_wrong_order(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE")["temperature"].__setitem__("valid_C", [60, 0]))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SCE", "temperature.valid_C", "wrong order")


def test_negligible_not_below_allowable(folder):
    edit(folder, "environments.yaml",
         lambda doc: record(doc, "environments", "seawater-flowing").__setitem__("negligible_V", 0.30))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "environments.yaml", "seawater-flowing", "negligible_V", "not below allowable_V")


# --- stoichiometry ----------------------------------------------------------------------------------------
def test_unbalanced_atoms(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "O2/H2O").__setitem__("reduced", ["H2O(l)"]))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "O2/H2O", "reduced", "does not balance", "atoms: H")


def test_unbalanced_charge(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("n", 1))
    status, lines = run_check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "n", "does not balance", "charge")


def test_unparseable_species(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("oxidised", ["Zn2+"]))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "oxidised[0]", "cannot be read", "'Zn2+'")


def test_id_does_not_name_the_reaction(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("id", "Zn2+/Cd"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Cd", "id", "reduced form")


# --- thermodynamic consistency -------------------------------------------------------------------------
def test_inconsistent_linked_couples_fail(folder):
    # 3 E°(Fe3+/Fe) = E°(Fe3+/Fe2+) + 2 E°(Fe2+/Fe): with +0.50 V for Fe3+/Fe the sum misses by 1.6 V
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Fe3+/Fe").__setitem__("E0_V", 0.50))
    status, lines = run_check(folder)
    assert status == 1
    hit = assert_names(lines, "half_reactions.yaml", "Fe3+/Fe", "E0_V", "free-energy additivity",
                       "Fe3+/Fe2+", "Fe2+/Fe")[0]
    assert "3 × 0.5 = 1.5000 V" in hit and "-0.1090 V" in hit  # 0.771 + 2 × (-0.44) = -0.109


def test_linked_couples_that_differ_by_millivolts_warn_but_pass(folder):
    # CRC 92nd ed. Table 1: Fe2+/Fe -0.447, Fe3+/Fe2+ 0.771, Fe3+/Fe -0.037: 3×(-0.037) = -0.111
    # against 0.771 - 0.894 = -0.123 V, 12 mV apart: handbooks genuinely differ (warning only)
    def change(doc):
        rec = record(doc, "half_reactions", "Fe2+/Fe")
        rec.update(E0_V=-0.447, E0_source="crc-vanysek", E0_confidence="read")
    edit(folder, "half_reactions.yaml", change)
    lines = validate.check_folder(folder)
    # bratsch-1989 is now cited by no value: that is the only error
    assert [ln for ln in lines if not ln.startswith("warning")] == [
        "sources.yaml:bratsch-1989:id: source 'bratsch-1989' is cited by no value: remove it or cite it"]
    warn = [ln for ln in lines if ln.startswith("warning: half_reactions.yaml:Fe3+/Fe:E0_V:")]
    assert len(warn) == 1 and "12.0 mV" in warn[0] and "-0.1110" in warn[0] and "-0.1230" in warn[0]


def test_acid_and_alkaline_forms_must_agree_through_kw(folder):
    # E°(O2/OH-) = E°(O2/H2O) - 0.05916 × pKw = 1.229 - 0.828 = 0.401 V (CRC 92nd ed. Table 1);
    # 0.60 V is 199 mV off
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "O2/OH-").__setitem__("E0_V", 0.60))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "O2/OH-", "E0_V", "acid and alkaline", "O2/H2O", "0.4011")


def test_reactions_that_do_not_add_up_are_reported():
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    rec = record(raw, "half_reactions", "Fe3+/Fe")
    rec["reduced"] = ["Fe(l)"]  # balanced, but not the Fe(s) the other two couples end with
    lines = validate.validate_raw(raw, None)
    assert any(ln.startswith("warning: half_reactions.yaml:Fe3+/Fe:oxidised:") and "do not add up" in ln
               for ln in lines), lines


def test_triples_with_fractional_multipliers():
    """Hg2+/Hg2^2+ (2 Hg2+ + 2e -> Hg2^2+) + Hg2^2+/Hg combine with factors 1/2 into Hg2+/Hg."""
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    # Vanýsek, CRC Handbook 92nd ed. (2011), Table 1: 0.920, 0.7973, 0.851 V
    raw["half_reactions"] += [
        {"id": "Hg2+/Hg2^2+", "name": "x", "oxidised": ["2 Hg2+(aq)"], "reduced": ["Hg2^2+(aq)"], "n": 2,
         "E0_V": 0.920, "E0_source": "crc-vanysek", "E0_confidence": "read"},
        {"id": "Hg2^2+/Hg", "name": "x", "oxidised": ["Hg2^2+(aq)"], "reduced": ["2 Hg(l)"], "n": 2,
         "E0_V": 0.7973, "E0_source": "crc-vanysek", "E0_confidence": "read"},
        {"id": "Hg2+/Hg", "name": "x", "oxidised": ["Hg2+(aq)"], "reduced": ["Hg(l)"], "n": 2,
         "E0_V": 0.851, "E0_source": "crc-vanysek", "E0_confidence": "read"},
    ]
    lines = validate.validate_raw(raw, None)
    warn = [ln for ln in lines if "Hg2+/Hg:E0_V" in ln]
    # 2 × 0.851 = 1.702 against 0.920 + 0.7973 = 1.7173 V: 15.3 mV, a warning
    assert len(warn) == 1 and warn[0].startswith("warning") and "-15.3 mV" in warn[0], lines


# --- reference electrodes and materials ---------------------------------------------------------------------
def test_reference_electrode_model_off_at_25C(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE")["temperature"]["coeffs_V"].__setitem__(0, 0.2444))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SCE", "temperature", "0.2444 V at 25 °C", "within 1 mV")


def test_reference_electrode_model_with_a_wild_coefficient(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE")["temperature"]["coeffs_V"].__setitem__(1, -6.61e-2))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SCE", "temperature", "mV/K")


def test_she_is_zero(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SHE").__setitem__("E_V_SHE", 0.001))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SHE", "E_V_SHE", "0 V at every temperature")


def test_other_state_must_point_back(folder):
    def change(doc):
        record(doc, "materials", "stainless-316-active")["other_state"] = "zinc"
    edit(folder, "materials.yaml", change)
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "other_state", "does not point back")
    assert_names(lines, "materials.yaml", "stainless-316-active", "other_state", "does not point back")


def test_other_state_unknown_and_same_state(folder):
    def change(doc):
        record(doc, "materials", "stainless-316-active")["state"] = "passive"
    edit(folder, "materials.yaml", change)
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-active", "state", "both 'passive'")


def test_passive_state_must_be_nobler(folder):
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "stainless-316-passive")
         .__setitem__("seawater_range_V_SCE", [-0.58, -0.44]))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "stainless-316-passive", "seawater_range_V_SCE", "not nobler")


def test_environment_series_must_exist(folder):
    edit(folder, "environments.yaml",
         lambda doc: record(doc, "environments", "seawater-flowing").__setitem__("series", "river-water"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "environments.yaml", "seawater-flowing", "series", "river-water")


def test_ion_charge_must_match_species(folder):
    edit(folder, "ions.yaml", lambda doc: record(doc, "ions", "Zn2+").__setitem__("charge", 1))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "ions.yaml", "Zn2+", "charge", "differs")


# --- all problems at once ----------------------------------------------------------------------------------
def test_every_problem_is_reported_at_once(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("n", 1))
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").__setitem__("density_g_cm3", 71.3))
    edit(folder, "ions.yaml", lambda doc: record(doc, "ions", "Zn2+").__setitem__("source", "nowhere"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "n")
    assert_names(lines, "materials.yaml", "zinc", "density_g_cm3")
    assert_names(lines, "ions.yaml", "Zn2+", "source")


def test_validate_raw_never_raises_on_garbage():
    """Records of the wrong shape give problems, not exceptions."""
    raw = {"sources": [1, None, {"id": 3}], "half_reactions": [{"id": "A/B", "oxidised": "x", "n": "2"}, []],
           "reference_electrodes": {"not": "a list"}, "materials": [{"other_state": 5, "uns": "S31600"}],
           "environments": None, "ions": [{"species": 7}]}
    lines = validate.validate_raw(raw, None)
    assert lines and all(re.match(r"^(warning: )?[a-z_]+\.yaml:[^:]+:[^:]+: ", ln) for ln in lines), lines


def test_computed_equivalent_weight_must_match_composition(folder):
    # ASTM G102: EW = 1/Σ(f·n/W); zinc, n = 2, W = 65.38 g/mol (IUPAC standard atomic weight,
    # from memory) gives 32.69 g; 30.0 g is 8 % off
    def change(doc):
        zinc = record(doc, "materials", "zinc")
        zinc.update(composition_wt_pct={"Zn": 100}, composition_source="astm-g102", composition_confidence="recalled",
                    equivalent_weight_valences={"Zn": 2}, equivalent_weight_confidence="computed")
    edit(folder, "materials.yaml", change)
    assert check(folder) == (0, [])
    edit(folder, "materials.yaml",
         lambda doc: record(doc, "materials", "zinc").__setitem__("equivalent_weight_g", 30.0))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "equivalent_weight_g", "30", "32.69")
