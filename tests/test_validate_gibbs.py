"""E° against Gibbs energies of formation (sitebuild.validate.gibbs): ΔrG° = −nFE° within 10 mV.

Values: ΔG°f of Zn2+(aq) -147.1 kJ/mol, OH-(aq) -157.2, H2O(l) -237.1 (OpenStax Chemistry 2e
(2019), Appendix G, reproducing Wagman et al., NBS tables, 1982); F = 96485.33212 C/mol (CODATA
2018, exact by the 2019 SI).
"""

import pytest

from sitebuild.dataset import PROJECT_DATA
from sitebuild.validate import check_folder
from sitebuild.validate.gibbs import TOLERANCE_V, potential_from_gibbs, reference_state

from validatekit import assert_names, check, edit, folder, record  # noqa: F401 - folder is a fixture


def test_zinc_from_its_gibbs_energy():
    # E° = −ΔG°f(Zn2+)/(2F) = 147100/(2 × 96485.33212) = 0.76229 V, sign negative (Zn2+ is formed)
    E = potential_from_gibbs({"oxidised": ["Zn2+(aq)"], "reduced": ["Zn(s)"], "n": 2}, {"Zn2+(aq)": -147.1})
    assert E == pytest.approx(-147100 / (2 * 96485.33212), abs=1e-9)


def test_oxygen_in_alkali_from_gibbs_energies():
    # O2 + 2 H2O + 4e- -> 4 OH-: ΔrG° = 4(-157.2) - 2(-237.1) = -154.6 kJ/mol, E° = 154600/(4F) = 0.40058 V
    rec = {"oxidised": ["O2(g)", "2 H2O(l)"], "reduced": ["4 OH-(aq)"], "n": 4}
    E = potential_from_gibbs(rec, {"OH-(aq)": -157.2, "H2O(l)": -237.1})
    assert E == pytest.approx(154600 / (4 * 96485.33212), abs=1e-9)


def test_a_species_without_a_gibbs_energy_skips_the_couple():
    assert potential_from_gibbs({"oxidised": ["Sn2+(aq)"], "reduced": ["Sn(s)"], "n": 2}, {"Zn2+(aq)": -147.1}) is None


def test_reference_states_count_zero_and_other_forms_do_not():
    from calc.species import parse_species

    assert all(reference_state(parse_species(t)) for t in ("Fe(s)", "Hg(l)", "Cl2(g)", "Br2(l)", "I2(s)", "S(s)"))
    assert not any(reference_state(parse_species(t)) for t in ("Cl2(aq)", "Br2(aq)", "Fe2+(aq)", "H2O(l)", "O3(g)"))


def test_the_stated_tolerance():
    assert TOLERANCE_V == 0.010


def test_a_potential_off_by_more_than_the_tolerance_is_an_error_with_both_numbers(folder):
    edit(folder, "half_reactions.yaml", lambda doc: record(doc, "half_reactions", "Zn2+/Zn").__setitem__("E0_V", -0.70))
    status, lines = check(folder)
    assert status == 1
    assert_names(lines, "half_reactions.yaml", "Zn2+/Zn", "E0_V", "-0.7000 V", "-0.7623 V", "gibbs_note")


def test_a_kept_disagreement_is_a_warning(folder):
    def change(doc):
        rec = record(doc, "half_reactions", "Zn2+/Zn")
        rec["E0_V"] = -0.70
        rec["gibbs_note"] = "kept for the test"
    edit(folder, "half_reactions.yaml", change)
    _, lines = check(folder)
    assert any(ln.startswith("warning: half_reactions.yaml:Zn2+/Zn:E0_V:") and "-0.7623 V" in ln for ln in lines), lines
    assert not any(ln.startswith("half_reactions.yaml:Zn2+/Zn:E0_V:") for ln in lines), lines


def test_the_project_data_agrees_or_says_which_value_it_keeps():
    lines = check_folder(PROJECT_DATA)
    assert not [ln for ln in lines if "Gibbs energies" in ln and not ln.startswith("warning")], lines
    kept = [ln for ln in lines if "Gibbs energies" in ln]
    # the iron couple whose handbooks differ by 38 mV: CRC -0.447 V kept, NBS -0.409 V shown
    assert any("Fe2+/Fe:E0_V" in ln and "-0.4470 V" in ln and "-0.4089 V" in ln for ln in kept), kept
