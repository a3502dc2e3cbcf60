"""Dissolved oxygen (calc.oxygen): air-saturation solubility, seawater density, concentrations.

Independent checks:
- the TEOS-10 GSW package (IOC, SCOR and IAPSO, TEOS-10 manual, 2010; ``gsw.O2sol_SP_pt``, the
  Garcia & Gordon, Limnol. Oceanogr. 37 (1992) 1307 fit of the Benson & Krause 1984 data, and
  ``gsw.rho`` for density) over 0–40 °C and practical salinity 0–40;
- P. R. Roberge, Corrosion Engineering: Principles and Practice (McGraw-Hill 2008), Table 5.2,
  "Solubility of oxygen in air-saturated water" (ppm), values read;
- G. S. Kell (1975) density of pure water, as coded in calc.water (itself checked there).
"""

import math

import gsw
import pytest

from calc import oxygen
from calc.errors import InputError
from calc.water import density_kg_m3

TEMPS = [0.0, 2.5, 5.0, 10.0, 15.0, 20.0, 25.0, 30.0, 35.0, 40.0]
SALINITIES = [0.0, 5.0, 10.0, 20.0, 30.0, 35.0, 40.0]


@pytest.mark.parametrize("t", TEMPS)
@pytest.mark.parametrize("s", SALINITIES)
def test_solubility_matches_gsw_o2sol_sp_pt(t, s):
    # gsw.O2sol_SP_pt (TEOS-10 GSW 3.6) codes the same equation (Garcia & Gordon 1992, eq. 8,
    # Table 1, Benson & Krause data, t68 = 1.00024·t): agreement to 1e-9 relative shows the
    # coefficients and the temperature conversion are copied right
    assert oxygen.o2_solubility_umol_kg(t, s) == pytest.approx(float(gsw.O2sol_SP_pt(s, t)), rel=1e-9)


@pytest.mark.parametrize("t, ppm", [(0, 14.58), (5, 12.72), (10, 11.29), (15, 10.00), (20, 9.15),
                                    (25, 8.29), (30, 7.57)])
def test_fresh_water_mg_per_L_matches_roberge_table_5_2(t, ppm):
    # Roberge 2008, Table 5.2 (air-saturated water, ppm); within 1 % (the table's own source and
    # rounding are not stated; the Benson & Krause values are what limnologists tabulate today)
    assert oxygen.dissolved_oxygen(t, 0.0).o2_mg_L == pytest.approx(ppm, rel=0.01)


@pytest.mark.parametrize("t", TEMPS)
@pytest.mark.parametrize("s", SALINITIES)
def test_density_matches_teos10_within_the_correlations_accuracy(t, s):
    # Sharqawy et al., Desalination and Water Treatment 16 (2010) 354, eq. (8) states ±0.1 %;
    # TEOS-10 gsw.rho at sea pressure 0 with the reference salinity of the practical salinity
    sr = float(gsw.SR_from_SP(s))
    ct = float(gsw.CT_from_t(sr, t, 0.0))
    assert oxygen.seawater_density_kg_m3(t, s) == pytest.approx(float(gsw.rho(sr, ct, 0.0)), rel=1e-3)


@pytest.mark.parametrize("t", [0.0, 4.0, 20.0, 40.0, 60.0, 80.0, 100.0])
def test_pure_water_density_matches_kell(t):
    # Kell (1975) as coded in calc.water (within 0.02 kg/m³ of IAPWS-95); Sharqawy eq. (8) at S = 0
    assert oxygen.seawater_density_kg_m3(t, 0.0) == pytest.approx(density_kg_m3(t), rel=2e-4)


def test_units_mol_m3_and_mg_L_agree():
    ox = oxygen.dissolved_oxygen(15.0, 35.0)
    assert ox.saturation_mol_m3 == pytest.approx(ox.saturation_umol_kg * ox.density_kg_m3 * 1e-6, rel=1e-12)
    assert ox.saturation_mg_L == pytest.approx(ox.saturation_mol_m3 * 31.998, rel=1e-9)
    assert ox.o2_mg_L == ox.saturation_mg_L and not ox.o2_given


def test_seawater_at_25_C_holds_about_6_8_mg_per_L():
    # 206.8 µmol/kg (gsw.O2sol_SP_pt(35, 25)) × 1.0237 kg/L × 32.00 mg/mmol
    assert oxygen.dissolved_oxygen(25.0, 35.0).o2_mg_L == pytest.approx(6.77, abs=0.01)


def test_solubility_falls_with_temperature_and_salinity():
    for s in SALINITIES:
        values = [oxygen.o2_solubility_umol_kg(t, s) for t in TEMPS + [60.0, 80.0, 100.0]]
        assert all(a > b > 0 for a, b in zip(values, values[1:]))
    for t in TEMPS:
        values = [oxygen.o2_solubility_umol_kg(t, s) for s in SALINITIES]
        assert all(a > b for a, b in zip(values, values[1:]))


def test_partial_saturation_is_used_and_reported():
    ox = oxygen.dissolved_oxygen(20.0, 35.0, o2_mg_L=3.0)
    assert ox.o2_given and ox.o2_mg_L == 3.0
    assert ox.o2_mol_m3 == pytest.approx(3.0 / 31.998, rel=1e-9)
    assert any("% of air saturation" in st["result"] for st in ox.steps)
    assert oxygen.dissolved_oxygen(20.0, 35.0, o2_mg_L=0).o2_mol_m3 == 0.0


def test_supersaturation_up_to_twice_air_saturation_is_accepted_with_a_warning():
    sat = oxygen.dissolved_oxygen(10.0, 0.0).saturation_mg_L
    ox = oxygen.dissolved_oxygen(10.0, 0.0, o2_mg_L=1.5 * sat)
    assert [w["field"] for w in ox.warnings] == ["o2_mg_L"]


@pytest.mark.parametrize("value", [-0.1, 30.0, 1e9, float("nan"), "much"])
def test_oxygen_far_above_saturation_or_negative_is_refused(value):
    with pytest.raises(InputError) as e:
        oxygen.dissolved_oxygen(25.0, 35.0, o2_mg_L=value)
    assert e.value.field == "o2_mg_L" and "twice air saturation" in str(e.value)


@pytest.mark.parametrize("t", [-1.0, 100.5, 150.0])
def test_temperature_outside_0_to_100_is_refused(t):
    with pytest.raises(InputError) as e:
        oxygen.dissolved_oxygen(t, 35.0)
    assert e.value.field == "temp_C"


@pytest.mark.parametrize("s", [-0.5, 45.5, None])
def test_salinity_outside_0_to_45_or_missing_is_refused(s):
    with pytest.raises(InputError) as e:
        oxygen.dissolved_oxygen(25.0, s)
    assert e.value.field == "salinity"


def test_salinity_from_chloride_uses_the_knudsen_relation():
    # S = 1.80655·Cl (Knudsen, kept in PSS-78): 19.374 g/kg chlorinity is salinity 35
    ox = oxygen.dissolved_oxygen(25.0, chloride_mg_per_L=19374.0)
    assert ox.salinity == pytest.approx(35.0, abs=1e-3)
    assert ox.steps[0]["title"] == "Salinity from chloride"
    with pytest.raises(InputError) as e:
        oxygen.dissolved_oxygen(25.0, 35.0, chloride_mg_per_L=19374.0)
    assert e.value.field == "chloride_mg_per_L"


def test_out_of_fit_range_is_warned_not_refused():
    hot = oxygen.dissolved_oxygen(60.0, 35.0)
    assert [w["field"] for w in hot.warnings] == ["temp_C"] and math.isfinite(hot.o2_mg_L)
    assert [w["field"] for w in oxygen.dissolved_oxygen(20.0, 44.0).warnings] == ["salinity"]
    assert oxygen.dissolved_oxygen(20.0, 35.0).warnings == ()
