"""data/cp_structures.yaml and data/cp_settings.yaml: schema, sources, lookups, and the old shape.

The two catalogues were constants in the engine's code before they became data; the ids and names
the calculators show must stay exactly those (the names are our own wording of the categories of
the criteria tables: ISO 15589-1:2015 Table 1, EN 12473:2014 Table 1, ISO 15589-2:2012 Table 1,
DNV-RP-B401, MIL-HDBK-1004/10 §3.3.1.2; each record says whether its wording was read or recalled).
"""

import json
from pathlib import Path

import pytest
import yaml
from jsonschema import Draft202012Validator

from calc.errors import InputError
from calc.field.criteria import catalogue, lookup, name_of

ROOT = Path(__file__).resolve().parent.parent
DATA = ROOT / "data"
KINDS = ("cp_structures", "cp_settings")

#: the ids, names and aliases as the engine's code held them before they became data (in file order)
STRUCTURES = {
    "carbon-steel": ("Carbon steel (C-Mn and low-alloy, yield strength up to 550 MPa)",
                     ("steel", "carbon steel", "mild steel", "C-Mn steel", "low-alloy steel")),
    "high-strength-steel": ("High-strength steel (specified minimum yield strength above 550 MPa)",
                            ("high strength steel", "HSS")),
    "stainless-pren-40": ("Austenitic stainless steel, PREN 40 or more", ("stainless PREN >= 40",)),
    "stainless-pren-below-40": ("Austenitic stainless steel, PREN below 40", ("stainless PREN < 40",)),
    "copper-alloys": ("Copper and copper alloys without aluminium", ("copper", "copper alloy")),
    "aluminium": ("Aluminium and aluminium alloys", ("aluminum", "aluminium alloy", "aluminum alloy")),
    "galvanized-steel": ("Galvanized (zinc-coated) steel", ("galvanised steel", "zinc-coated steel")),
}
SETTINGS = {
    "soil-aerobic": ("Buried, aerobic soil, resistivity below 100 Ω·m", "soil"),
    "soil-anaerobic": ("Buried, anaerobic soil with sulfate-reducing bacteria", "soil"),
    "soil-aerated-100-1000": ("Buried, aerated sandy soil, 100 to 1000 Ω·m", "soil"),
    "soil-aerated-above-1000": ("Buried, aerated soil, 1000 Ω·m or more", "soil"),
    "seawater-aerobic": ("Immersed in aerobic seawater", "seawater"),
    "seawater-anaerobic": ("In seawater sediment, anaerobic (sulfate-reducing bacteria)", "seawater"),
}


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def _text(kind):
    return (DATA / f"{kind}.yaml").read_text(encoding="utf-8")


def _schema(kind):
    return json.loads((DATA / "schema" / f"{kind}.schema.json").read_text(encoding="utf-8"))


# ---------------------------------------------------------------- the files

@pytest.mark.parametrize("kind", KINDS)
def test_file_links_its_schema_and_validates(kind):
    text = _text(kind)
    assert text.split("\n", 1)[0] == f"# yaml-language-server: $schema=schema/{kind}.schema.json"
    schema = _schema(kind)
    Draft202012Validator.check_schema(schema)
    errors = list(Draft202012Validator(schema).iter_errors(yaml.safe_load(text)))
    assert not errors, [e.message for e in errors]


@pytest.mark.parametrize("kind, bad", [
    ("cp_structures", {"id": "Carbon Steel", "name": "x", "source": "en-12473", "confidence": "read"}),
    ("cp_structures", {"id": "x", "name": "x", "source": "en-12473"}),
    ("cp_structures", {"id": "x", "name": "x", "source": "en-12473", "confidence": "guessed"}),
    ("cp_structures", {"id": "x", "name": "x", "source": "en-12473", "confidence": "read", "colour": "red"}),
    ("cp_settings", {"id": "x", "name": "x", "source": "en-12473", "confidence": "read"}),
    ("cp_settings", {"id": "x", "name": "x", "electrolyte": "air", "source": "en-12473", "confidence": "read"}),
    ("cp_settings", {"id": "x", "name": "", "electrolyte": "soil", "source": "en-12473", "confidence": "read"}),
])
def test_schema_refuses_a_bad_record(kind, bad):
    assert not Draft202012Validator(_schema(kind)).is_valid({kind: [bad]})


@pytest.mark.parametrize("kind", KINDS)
def test_every_record_cites_a_standard_that_defines_its_criteria(kind):
    """Each category's source is a document of sources.yaml, and one that a criterion of the
    category cites (its own source or one of its `also`), so the category is that table's."""
    sources = {s["id"] for s in yaml.safe_load(_text("sources"))["sources"]}
    criteria = yaml.safe_load(_text("cp_criteria"))["cp_criteria"]
    for rec in yaml.safe_load(_text(kind))[kind]:
        assert rec["source"] in sources, rec["id"]
        mine = [c for c in criteria if rec["id"] == c["structure"] or rec["id"] in c["settings"]]
        cited = {c["source"] for c in mine} | {a["source"] for c in mine for a in c.get("also") or []}
        assert rec["source"] in cited, rec["id"]


def test_ids_names_and_aliases_as_before():
    assert {r["id"]: (r["name"], tuple(r.get("aliases") or ())) for r in catalogue("cp_structures")} == STRUCTURES
    assert {r["id"]: (r["name"], r["electrolyte"]) for r in catalogue("cp_settings")} == SETTINGS
    assert [r["id"] for r in catalogue("cp_structures")] == list(STRUCTURES)  # the order lists show
    assert [r["id"] for r in catalogue("cp_settings")] == list(SETTINGS)


def test_electrolyte_matches_the_id():
    for r in catalogue("cp_settings"):
        assert r["id"].startswith(r["electrolyte"]), r["id"]


def test_every_category_has_criteria():
    criteria = yaml.safe_load(_text("cp_criteria"))["cp_criteria"]
    assert {c["structure"] for c in criteria} == set(STRUCTURES)
    assert {s for c in criteria for s in c["settings"]} == set(SETTINGS)


# ---------------------------------------------------------------- lookups

@pytest.mark.parametrize("given, expected", [
    ("carbon-steel", "carbon-steel"), ("Mild Steel", "carbon-steel"), ("C-Mn steel", "carbon-steel"),
    ("carbon_steel", "carbon-steel"), ("HSS", "high-strength-steel"), ("aluminum alloy", "aluminium"),
    ("Galvanized (zinc-coated) steel", "galvanized-steel"), ("  copper  ", "copper-alloys"),
])
def test_structure_by_id_alias_or_name(given, expected):
    assert lookup("cp_structures", given, "structure") == expected


@pytest.mark.parametrize("given, expected", [
    ("soil-aerobic", "soil-aerobic"), ("soil aerobic", "soil-aerobic"), ("SEAWATER_ANAEROBIC", "seawater-anaerobic"),
    ("Immersed in aerobic seawater", "seawater-aerobic"),
])
def test_setting_by_id_or_name(given, expected):
    assert lookup("cp_settings", given, "setting") == expected


@pytest.mark.parametrize("kind, field, given", [
    ("cp_structures", "structure", "unobtainium"), ("cp_structures", "structure", ""),
    ("cp_structures", "structure", None), ("cp_settings", "setting", "moon"), ("cp_settings", "setting", 3),
])
def test_unknown_names_every_id(kind, field, given):
    with pytest.raises(InputError) as exc:
        lookup(kind, given, field)
    assert exc.value.field == field
    what = {"cp_structures": "a structure", "cp_settings": "a setting"}[kind]
    table = STRUCTURES if kind == "cp_structures" else SETTINGS
    assert exc.value.allowed == f"{what}: one of " + ", ".join(table)


def test_names_as_shown():
    assert name_of("cp_structures", "aluminium") == STRUCTURES["aluminium"][0]
    assert name_of("cp_settings", "soil-anaerobic") == SETTINGS["soil-anaerobic"][0]
