"""Record checks (sitebuild.validate.records): duplicate names, environments and ions coherent."""

import copy

from validatekit import assert_names, check, edit, folder, record, run_check  # noqa: F401 - folder is a fixture


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
