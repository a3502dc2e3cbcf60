"""calc.field.seawater: chloride, ionic strength and the Ag/AgCl/seawater electrode in brackish water.

Sources named beside each check:

- Seawater ionic strength I = 19.924 S/(1000 - 1.005 S) (Dickson & Goyet 1994, from memory);
  chlorinity S = 1.80655 Cl (Knudsen relation kept in PSS-78, from memory).
- Nernst slope ln10·RT/F (CODATA 2018); Davies (1962) with A = 0.509 at 25 °C (Robinson &
  Stokes 1959, from memory).
"""

import math

import pytest

from calc.field.seawater import brackish_shift, chloride_molality, salinity_from_chloride, seawater_ionic_strength


def test_chloride_of_seawater():
    # S = 35: Cl = 35/1.80655 = 19.374 g/kg (Knudsen, from memory) -> 0.566 mol/kg of water
    # (REFERENCE-DATA §3 uses 0.566); I = 0.7228 mol/kg (Dickson & Goyet 1994, from memory)
    assert chloride_molality(35.0) == pytest.approx(0.566, abs=0.001)
    assert seawater_ionic_strength(35.0) == pytest.approx(0.7228, abs=0.0001)


def _davies_gamma(ionic):
    # Davies (1962) with A = 0.509 kg^1/2 mol^-1/2 at 25 °C (Robinson & Stokes, Electrolyte
    # Solutions, 1959, from memory); written out here, independent of calc.water
    return 10 ** (-0.509 * (math.sqrt(ionic) / (1 + math.sqrt(ionic)) - 0.3 * ionic))


def test_brackish_shift_is_nernst_on_chloride():
    # Nernst: 59.16 mV per decade of chloride activity at 25 °C (ln10·RT/F, CODATA 2018); salinity
    # 35 is the seawater the electrode value refers to (EN 12473:2014 Annex C, from memory)
    assert brackish_shift(35.0, 25.0) == 0.0
    for s in (2.0, 5.0, 10.0, 20.0):
        a_sw = chloride_molality(35.0) * _davies_gamma(seawater_ionic_strength(35.0))
        a_x = chloride_molality(s) * _davies_gamma(seawater_ionic_strength(s))
        expected = 0.0591594 * math.log10(a_sw / a_x)
        assert brackish_shift(s, 25.0) == pytest.approx(expected, abs=0.0003), s
    assert brackish_shift(5.0, 25.0) > brackish_shift(10.0, 25.0) > brackish_shift(20.0, 25.0) > 0
    # a colder electrode: smaller Nernst slope
    assert brackish_shift(10.0, 5.0) < brackish_shift(10.0, 25.0)


def test_brackish_shift_against_the_resistivity_rule():
    # REFERENCE-DATA CP-1c [C]: +59·log10(ρ/ρ_sw) mV; PSS-78 resistivities at 15 °C (CP-4 [C]):
    # S = 35 0.233 Ω·m, S = 10 0.73 Ω·m, S = 5 1.39 Ω·m. The rule takes chloride ∝ 1/ρ and ignores
    # the fall of molar conductivity with concentration: tolerance 5 mV
    for s, rho in ((10.0, 0.73), (5.0, 1.39)):
        assert brackish_shift(s, 25.0) == pytest.approx(0.05916 * math.log10(rho / 0.233), abs=0.005), s


def test_chloride_and_salinity_invert():
    # S = 1.80655 Cl (Knudsen, from memory): 19.374 g/L of chloride is seawater of salinity 35
    assert salinity_from_chloride(35.0 / 1.80655 * 1000) == pytest.approx(35.0, abs=1e-9)
