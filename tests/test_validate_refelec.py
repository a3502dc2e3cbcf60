"""Reference-electrode checks (sitebuild.validate.refelec): the SHE at 0 V, temperature models."""

import pytest

from sitebuild.dataset import read_folder
from validatekit import MINIMAL, assert_names, check, edit, folder, record  # noqa: F401 - folder is a fixture


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


def test_the_validator_evaluates_calcs_temperature_model():
    """One statement of the model: the validator's potential is calc.refelec.temperature_model_E's."""
    from calc.refelec import temperature_model_E
    from sitebuild.validate import refelec_potential

    raw, _ = read_folder(MINIMAL)
    for rec in raw["reference_electrodes"]:
        for t in (0.0, 25.0, 37.5, 60.0):
            assert refelec_potential(rec, t) == temperature_model_E(rec["temperature"], rec["E_V_SHE"], t), rec["id"]


@pytest.mark.parametrize("model", [
    {"kind": "polynomial", "t_ref_C": 25, "coeffs_V": 0.2412},
    {"kind": "polynomial", "t_ref_C": 25, "coeffs_V": []},
    {"kind": "polynomial", "t_ref_C": 25, "coeffs_V": [0.2412, "x"]},
    {"kind": "linear", "t_ref_C": 25, "slope_mV_per_K": None},
    {"kind": "linear", "t_ref_C": "25", "slope_mV_per_K": 0.9},
    {"kind": "cubic"},
    [0.2412],
])
def test_a_model_that_cannot_be_evaluated_is_named_not_raised(folder, model):
    from sitebuild.validate import refelec_potential

    assert refelec_potential({"id": "X", "E_V_SHE": 0.2412, "temperature": model}, 25.0) is None
    edit(folder, "reference_electrodes.yaml",
         lambda doc: record(doc, "reference_electrodes", "SCE").__setitem__("temperature", model))
    status, lines = check(folder)
    assert status == 1
    assert any(ln.startswith("reference_electrodes.yaml:SCE:temperature") for ln in lines), lines
