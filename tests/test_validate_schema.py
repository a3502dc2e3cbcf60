"""JSON Schema checks (sitebuild.validate.schema): wrong types and unknown fields are named."""

import pytest

from sitebuild.dataset import FILES
from validatekit import assert_names, check, edit, folder, record, run_check  # noqa: F401 - folder is a fixture


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
