"""Cathodic-protection criteria checks (sitebuild.validate.cp) and the two catalogues they name:
structure and setting ids are checked against cp_structures.yaml and cp_settings.yaml (the data
the validator is given), whose records are checked for sources and duplicates like every other kind.
"""

import copy

from sitebuild import validate
from sitebuild.dataset import read_folder
from validatekit import MINIMAL, assert_names, check, edit, folder, record  # noqa: F401 - folder is a fixture


def _minimal_raw():
    raw, problems = read_folder(MINIMAL)
    assert not problems
    return copy.deepcopy(raw)


def test_the_minimal_catalogues_are_clean():
    assert validate.validate_raw(_minimal_raw(), MINIMAL) == []


def test_an_unknown_structure_is_named_against_the_catalogue(folder):
    edit(folder, "cp_criteria.yaml", lambda doc: record(doc, "cp_criteria", "steel-soil-aerobic")
         .__setitem__("structure", "unobtainium"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "cp_criteria.yaml", "steel-soil-aerobic", "structure", "'unobtainium'",
                 "cp_structures.yaml", "carbon-steel")


def test_an_unknown_setting_is_named_against_the_catalogue(folder):
    edit(folder, "cp_criteria.yaml", lambda doc: record(doc, "cp_criteria", "steel-soil-aerobic")["settings"]
         .append("moon-dust"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "cp_criteria.yaml", "steel-soil-aerobic", "settings[1]", "'moon-dust'",
                 "cp_settings.yaml", "soil-aerobic")


def test_a_structure_the_catalogue_no_longer_holds_is_reported():
    raw = _minimal_raw()
    raw["cp_structures"][0]["id"] = "mild-steel"
    lines = validate.validate_raw(raw, None)
    assert any(ln.startswith("cp_criteria.yaml:steel-soil-aerobic:structure: structure 'carbon-steel'")
               for ln in lines), lines


def test_catalogue_records_have_known_sources_and_distinct_names(folder):
    edit(folder, "cp_settings.yaml", lambda doc: record(doc, "cp_settings", "soil-aerobic")
         .__setitem__("source", "nowhere-1999"))
    edit(folder, "cp_structures.yaml", lambda doc: doc["cp_structures"].append(
        {"id": "structural-steel", "name": "Structural steel", "aliases": ["Carbon Steel"],
         "source": "common-practice", "confidence": "recalled"}))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "cp_settings.yaml", "soil-aerobic", "source", "unknown source id 'nowhere-1999'")
    assert_names(lines, "cp_structures.yaml", "structural-steel", "aliases[0]", "already used by carbon-steel")


def test_data_without_the_catalogues_is_checked_without_them():
    """A data set read without cp_structures/cp_settings (e.g. an older folder): no crash, and
    nothing to check the ids against."""
    raw = _minimal_raw()
    del raw["cp_structures"], raw["cp_settings"]
    lines = validate.validate_raw(raw, None)
    assert not [ln for ln in lines if ":structure:" in ln or ":settings[" in ln], lines
