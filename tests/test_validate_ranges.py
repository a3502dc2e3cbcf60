"""Physical ranges (sitebuild.validate.ranges): values out of bounds and range ends in the wrong order."""

import copy

import pytest

from sitebuild import validate
from sitebuild.dataset import FILES, read_folder
from validatekit import (
    MINIMAL, assert_names, check, edit, folder, record, run_check)  # noqa: F401 - folder is a fixture


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


def test_a_count_that_is_not_a_finite_number_is_named_not_raised():
    """YAML's .nan and .inf are numbers to the loader: n and charge say so instead of raising."""
    raw, _ = read_folder(MINIMAL)
    raw = copy.deepcopy(raw)
    record(raw, "half_reactions", "Zn2+/Zn")["n"] = float("nan")
    record(raw, "ions", "Zn2+")["charge"] = float("inf")
    lines = validate.validate_raw(raw, None)
    assert any(ln.startswith("half_reactions.yaml:Zn2+/Zn:n: value nan is not a whole number") for ln in lines), lines
    assert any(ln.startswith("ions.yaml:Zn2+:charge: value inf is not a non-zero whole charge") for ln in lines), lines
