"""calc.field.seawater: chloride, ionic strength and the Ag/AgCl/seawater electrode in brackish water.

Sources named beside each check:

- Seawater ionic strength I = 19.924 S/(1000 - 1.005 S) (Dickson & Goyet 1994, the formula from
  memory), checked against the values printed in the TEOS-10 GSW toolbox documentation of
  gsw_ionic_strength_from_SA (version 3.01, after Millero et al., Deep-Sea Res. I 55 (2008) 50, eqs.
  5.9 and 5.12; read).
- Chlorinity S = 1.80655 Cl: IHO Hydrographic Dictionary (S-32), entry "salinity" (read): adopted by
  IAPO in 1963 and ICES in 1964, kept in PSS-78.
- Nernst slope ln10·RT/F from CODATA 2018 R and F (tests/oracles.py); Davies (1962) with
  A = 0.5092 at 25 °C (Helgeson & Kirkham, Am. J. Sci. 274 (1974) 1199, as tabulated in W. M. White,
  Geochemistry, 2013, ch. 3; read).
- Seawater resistivity from PSS-78 (UNESCO 1981) through the TEOS-10 gsw package (gsw.C_from_SP).
"""

import math

import pytest

from calc.field.seawater import brackish_shift, chloride_molality, salinity_from_chloride, seawater_ionic_strength
from oracles import SLOPE_25C_V


def test_chloride_of_seawater():
    # S = 35: Cl = 35/1.80655 = 19.374 g/kg (IHO S-32, read) -> 19.374/35.453/(1 − 0.035) = 0.5663 mol/kg
    # of water (computed); I = 19.924·35/(1000 − 1.005·35) = 0.7228 mol/kg (Dickson & Goyet 1994, computed)
    assert chloride_molality(35.0) == pytest.approx(0.566, abs=0.001)
    assert seawater_ionic_strength(35.0) == pytest.approx(0.7228, abs=0.0001)


@pytest.mark.parametrize("sa, printed", [(34.7118, 0.712981183609951), (35.0256, 0.719660593278309)])
def test_ionic_strength_against_teos10(sa, printed):
    # TEOS-10 GSW toolbox, gsw_ionic_strength_from_SA, its printed example (read): Absolute Salinity SA in
    # g/kg -> I in mol/kg. Practical salinity SP = SA·35/35.16504 (the Reference-Composition Salinity of
    # Millero et al. 2008); the Dickson–Goyet formula agrees within 0.02 %.
    assert seawater_ionic_strength(sa * 35.0 / 35.16504) == pytest.approx(printed, abs=3e-4)


def _davies_gamma(ionic):
    # Davies (1962) with A = 0.5092 kg^1/2 mol^-1/2 at 25 °C (Helgeson & Kirkham 1974, read in White 2013);
    # written out here, independent of calc.water
    return 10 ** (-0.5092 * (math.sqrt(ionic) / (1 + math.sqrt(ionic)) - 0.3 * ionic))


def test_brackish_shift_is_nernst_on_chloride():
    # Nernst: 59.159 mV per decade of chloride activity at 25 °C (ln10·RT/F, CODATA 2018, tests/oracles.py);
    # salinity 35 is the seawater the electrode value refers to (EN 12473:2014 Annex C, from memory). The
    # engine's A(25 °C) is 0.5108, 0.3 % above the 0.5092 used here: within 0.3 mV
    assert brackish_shift(35.0, 25.0) == 0.0
    for s in (2.0, 5.0, 10.0, 20.0):
        a_sw = chloride_molality(35.0) * _davies_gamma(seawater_ionic_strength(35.0))
        a_x = chloride_molality(s) * _davies_gamma(seawater_ionic_strength(s))
        expected = SLOPE_25C_V * math.log10(a_sw / a_x)
        assert brackish_shift(s, 25.0) == pytest.approx(expected, abs=0.0003), s
    assert brackish_shift(5.0, 25.0) > brackish_shift(10.0, 25.0) > brackish_shift(20.0, 25.0) > 0
    # a colder electrode: smaller Nernst slope
    assert brackish_shift(10.0, 5.0) < brackish_shift(10.0, 25.0)


def test_brackish_shift_against_the_resistivity_rule():
    # The resistivity rule +59·log10(ρ/ρ_sw) mV (Nernst with chloride ∝ 1/ρ, computed); PSS-78 resistivities
    # at 15 °C (UNESCO 1981, through the TEOS-10 gsw package, computed): S = 35 0.233 Ω·m, S = 10 0.730 Ω·m,
    # S = 5 1.389 Ω·m. The rule ignores the fall of molar conductivity with concentration: tolerance 5 mV
    for s, rho in ((10.0, 0.73), (5.0, 1.39)):
        assert brackish_shift(s, 25.0) == pytest.approx(0.05916 * math.log10(rho / 0.233), abs=0.005), s


def test_the_resistivities_of_the_rule_are_pss78():
    gsw = pytest.importorskip("gsw")
    # conductivity in mS/cm at 15 °C, sea pressure 0: ρ = 10/C Ω·m
    for s, rho in ((35.0, 0.233), (10.0, 0.73), (5.0, 1.39)):
        assert 10.0 / gsw.C_from_SP(s, 15.0, 0.0) == pytest.approx(rho, rel=0.005), s


def test_chloride_and_salinity_invert():
    # S = 1.80655 Cl (IHO S-32, "salinity", read): 19.374 g/L of chloride is seawater of salinity 35
    assert salinity_from_chloride(35.0 / 1.80655 * 1000) == pytest.approx(35.0, abs=1e-9)
