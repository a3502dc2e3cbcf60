"""Where each value was read (sitebuild.validate.where): a value flagged read names its place in
the document read (``<field>_where``, or ``where`` for a mapping with one value); a missing one is
reported as ``file:record:field``."""

import os

import yaml

from sitebuild.dataset import FILES, PROJECT_DATA, read_folder
from sitebuild.validate import check_folder
from sitebuild.validate.where import each_flag, where_key

from validatekit import assert_names, check, edit, folder, record  # noqa: F401 - folder is a fixture


def _where_lines(lines):
    return [ln for ln in lines if "_where'" in ln or "'where'" in ln]


def test_where_key_beside_its_confidence():
    assert where_key("E0_confidence") == "E0_where"
    assert where_key("seawater_confidence") == "seawater_where"
    assert where_key("confidence") == "where"


def test_missing_where_on_a_read_value_is_reported_with_file_record_field(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").pop("E0_where"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "E0_V", "flagged read", "'E0_where'", "crc-vanysek")


def test_missing_where_of_a_record_with_one_value_names_the_value(folder):
    edit(folder, "reference_electrodes.yaml", lambda doc: record(doc, "reference_electrodes", "SHE").pop("where"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SHE", "E_V_SHE", "'where'")


def test_missing_where_in_a_nested_model(folder):
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SHE")["temperature"].pop("where"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "reference_electrodes.yaml", "SHE", "temperature.where", "'temperature.where'")


def test_blank_where_counts_as_missing(folder):
    edit(folder, "materials.yaml", lambda doc: record(doc, "materials", "zinc").__setitem__("seawater_where", "   "))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "materials.yaml", "zinc", "seawater_range_V_SCE", "'seawater_where'")


def test_a_recalled_value_needs_no_where(folder):
    def change(doc):
        rec = record(doc, "half_reactions", "Zn2+/Zn")
        rec["E0_confidence"] = "recalled"
        rec.pop("E0_where")
    edit(folder, "half_reactions.yaml", change)
    _, lines = check(folder)
    assert not [ln for ln in _where_lines(lines) if "Zn2+/Zn" in ln], lines


def test_a_where_without_its_value_is_reported(folder):
    edit(folder, "half_reactions.yaml",
         lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("dEdT_where", "Table 1"))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "dEdT_where", "without 'dEdT_confidence'")


def test_every_read_value_of_the_project_says_where_it_was_read():
    assert _where_lines(check_folder(PROJECT_DATA)) == []


def _confidence_keys(value):
    """Count of the confidence keys of a record, walked independently of the validator."""
    if isinstance(value, dict):
        return sum((k == "confidence" or str(k).endswith("_confidence")) + _confidence_keys(v)
                   for k, v in value.items())
    if isinstance(value, list):
        return sum(_confidence_keys(v) for v in value)
    return 0


def test_each_flag_finds_every_confidence_key_of_the_project():
    raw, problems = read_folder(PROJECT_DATA)
    for fname, kind in FILES.items():
        if kind == "sources":
            continue
        with open(os.path.join(PROJECT_DATA, fname), encoding="utf-8") as fh:
            expected = _confidence_keys(yaml.safe_load(fh)[kind])
        assert len([f for f in each_flag(raw, [kind])]) == expected, fname
