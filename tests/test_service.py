"""Service conditions (calc.service), the electrolyte's conductivity and the IR path (calc.ir), the
polarization data (data/polarization.yaml, calc.polarization) and the service defaults.

Checks against sources outside the project, each named beside it:
- seawater conductivity by PSS-78 against the TEOS-10 Gibbs SeaWater toolbox, ``gsw.C_from_SP``
  (IOC, SCOR and IAPSO, TEOS-10 Manual 2010; the gsw package on PyPI, a general-purpose library);
- the anodic line of steel in seawater against C. Batt and M. J. Robinson, "Optimum cathodic
  protection potentials for high strength steels in seawater", JCSE vol. 4, preprint 1, abstract
  (54 mV/decade; 0.001 mm/yr at -770 mV SCE), read;
- free potentials against the flowing-seawater galvanic series (ASTM G82-98 (R2014) Fig. 1, after
  LaQue 1975), read in the Australasian Corrosion Association's reproduction (data/materials.yaml);
- free corrosion of carbon steel in still aerated seawater, about 0.1-0.2 mm/y (F. L. LaQue,
  Marine Corrosion, 1975; Revie & Uhlig 4th ed.), from memory and provisional
  (/work/shared/REFERENCE-DATA.md CP-2b), so checked as a band;
- free corrosion of 90-10 copper-nickel, "normally 0.02-0.002 mm/yr" (Copper Development
  Association, copper-nickel for seawater, section General Corrosion Rates), read.
"""

import math

import pytest

from calc import rate as g102
from calc.dataset import current
from calc.errors import InputError
from calc.ir import (disk_resistance_ohm, fresh_water_conductivity_S_per_m, joint_resistance_ohm,
                     seawater_conductivity_S_per_m)
from calc.kinetics import free_corrosion
from calc.polarization import part_kinetics, record_for, slope_at
from calc.service import SERVICE_FIELDS, read_service
from calc.spec import opening

gsw = pytest.importorskip("gsw")


@pytest.fixture(scope="module")
def ds():
    return current()


def service(ds, env, **given):
    s, unused = read_service(given, ds.get("environments", env), ds)
    return s, unused


# ---------------------------------------------------------------- conductivity and the IR path


@pytest.mark.parametrize("S", [2.0, 5.0, 10.0, 20.0, 30.0, 35.0, 40.0, 42.0])
@pytest.mark.parametrize("t", [0.0, 5.0, 15.0, 25.0, 35.0])
def test_seawater_conductivity_matches_gsw(S, t):
    # TEOS-10 gsw.C_from_SP(SP, t, p = 0) in mS/cm; PSS-78 as coded here, within 1e-6 relative
    assert seawater_conductivity_S_per_m(S, t) == pytest.approx(gsw.C_from_SP(S, t, 0.0) / 10.0, rel=1e-6)


def test_fresh_water_conductivity_follows_the_2_percent_rule():
    # common practice: linear compensation at 2 %/K from 25 °C
    assert fresh_water_conductivity_S_per_m(0.04, 25.0) == 0.04
    assert fresh_water_conductivity_S_per_m(0.04, 35.0) == pytest.approx(0.048, rel=1e-12)


def test_disk_resistance_is_one_over_four_kappa_r():
    # J. Newman, J. Electrochem. Soc. 113 (1966) 501, R = 1/(4κr) (from memory): a disk of 1 cm radius
    # in 5 S/m seawater is 5 Ω; two such parts in series 10 Ω; the resistance falls as 1/√A
    assert disk_resistance_ohm(5.0, math.pi) == pytest.approx(5.0, rel=1e-12)
    assert joint_resistance_ohm(5.0, math.pi, math.pi) == pytest.approx(10.0, rel=1e-12)
    assert disk_resistance_ohm(5.0, 100 * math.pi) == pytest.approx(0.5, rel=1e-12)


# ---------------------------------------------------------------- conditions and where they came from


def test_defaults_fill_what_is_not_stated_and_say_so(ds):
    s, unused = service(ds, "seawater-flowing", temp_C=12)
    assert unused == []
    assert s.origin["temp_C"] == "user" and s.values["temp_C"] == 12.0
    for key in ("salinity", "aeration", "velocity_m_s", "geometry", "length_m", "pH"):
        assert s.origin[key] == "environment" and s.source[key], key
    assert s.origin["o2_mg_L"] == "computed" and s.origin["conductivity_S_per_m"] == "computed"
    shown = s.conditions()
    assert shown["temp_C"] == {"value": 12.0, "unit": "°C", "from": "user", "source": None}
    assert shown["electrolyte"] == "seawater" and all(shown[k]["from"] for k in shown if k != "electrolyte")


def test_every_immersed_water_has_defaults_and_the_atmospheres_none(ds):
    for env in ds.records("environments"):
        s, unused = service(ds, env["id"], temp_C=30)
        if env["basis"] == "anodic-index" or env["id"] == "buried-soil":
            assert s is None and [w["field"] for w in unused] == ["temp_C"]
            assert "not used" in unused[0]["message"]
        else:
            assert s is not None and s.supply.i_L_A_per_m2 > 0


def test_fresh_water_is_judged_with_fresh_water_data(ds):
    s, _ = service(ds, "fresh-water")
    assert s.electrolyte == "fresh-water" and s.origin["chloride_mg_per_L"] == "environment"
    assert s.conductivity_S_per_m == pytest.approx(fresh_water_conductivity_S_per_m(0.04, 15.0), rel=1e-12)
    salty, _ = service(ds, "fresh-water", salinity=20)
    assert salty.electrolyte == "seawater" and any(w["field"] == "salinity" for w in salty.warnings)


def test_deaerated_water_has_no_oxygen(ds):
    s, _ = service(ds, "seawater-quiescent", aeration="deaerated")
    assert s.supply.i_L_A_per_m2 == 0.0 and s.values["o2_mg_L"] == 0.0 and s.origin["o2_mg_L"] == "user"


@pytest.mark.parametrize("given, field", [
    ({"velocity_m_s": -0.1, "geometry": "pipe", "diameter_m": 0.1}, "velocity_m_s"),
    ({"velocity_m_s": 31}, "velocity_m_s"),
    ({"velocity_m_s": 2.0}, "geometry"),  # still water by default: a velocity needs a geometry
    ({"velocity_m_s": 2.0, "geometry": "pipe"}, "diameter_m"),
    ({"geometry": "duct"}, "geometry"),
    ({"o2_mg_L": 40}, "o2_mg_L"),  # far above saturation (7.4 mg/L): refused
    ({"o2_mg_L": -1}, "o2_mg_L"),
    ({"o2_mg_L": 5, "aeration": "deaerated"}, "aeration"),
    ({"aeration": "bubbly"}, "aeration"),
    ({"salinity": 35, "chloride_mg_per_L": 19000}, "chloride_mg_per_L"),
    ({"salinity": 50}, "salinity"),
    ({"temp_C": 120}, "temp_C"),
    ({"pH": 20}, "pH"),
    ({"conductivity_S_per_m": 0}, "conductivity_S_per_m"),
    ({"anode_area_cm2": 0}, "anode_area_cm2"),
    ({"anode_area_cm2": 10, "salinity": 0}, "conductivity_S_per_m"),  # salt-free water: no conductivity to take
])
def test_bad_conditions_are_refused_naming_the_field(ds, given, field):
    with pytest.raises(InputError) as e:
        service(ds, "seawater-quiescent", **given)
    assert e.value.field == field and str(e.value).startswith(field + " = ")


def test_the_service_fields_are_the_request_fields():
    assert SERVICE_FIELDS == ("temp_C", "salinity", "chloride_mg_per_L", "o2_mg_L", "aeration", "velocity_m_s",
                              "geometry", "diameter_m", "length_m", "pH", "conductivity_S_per_m", "anode_area_cm2")


# ---------------------------------------------------------------- the polarization data


def test_every_material_of_the_matrix_opening_has_seawater_kinetics(ds):
    for mid in opening("matrix")["materials"]:
        assert record_for(ds, mid, "seawater") is not None, mid


def test_polarization_records_name_known_materials_once_each(ds):
    ids = {r["id"] for r in ds.records("materials")}
    seen = set()
    for rec in ds.records("polarization"):
        assert rec["material"] in ids, rec["id"]
        key = (rec["material"], rec["electrolyte"])
        assert key not in seen, rec["id"]
        seen.add(key)


def _free(ds, mid, electrolyte, env, **given):
    s, _ = service(ds, env, **given)
    mat = ds.get("materials", mid)
    fd = g102.material_faraday_data(mat)
    k = part_kinetics(ds, record_for(ds, mid, electrolyte), mat, s, 1.0, fd)
    e, i = free_corrosion(k.electrode)
    return e, g102.corrosion_rate(i * 1e6, fd.equivalent_weight_g, fd.density_g_cm3).penetration_mm_per_year


def test_free_potentials_in_still_seawater_sit_on_the_galvanic_series(ds):
    # ASTM G82 Fig. 1 ranges as read (ACA reproduction); a free potential within 0.02 V of its range
    for rec in ds.records("polarization"):
        if rec["electrolyte"] != "seawater":
            continue
        lo, hi = ds.get("materials", rec["material"])["seawater_range_V_SCE"]
        e, _ = _free(ds, rec["material"], "seawater", "seawater-quiescent")
        assert lo - 0.02 <= e <= hi + 0.02, (rec["id"], e)


def test_steel_in_still_seawater_corrodes_at_the_published_rate(ds):
    # LaQue 1975 / Revie & Uhlig (from memory, provisional): about 0.1-0.2 mm/y in still aerated seawater
    e, mm = _free(ds, "carbon-steel", "seawater", "seawater-quiescent")
    assert 0.1 <= mm <= 0.2 and -0.70 <= e <= -0.60


def test_steel_anodic_line_is_batt_and_robinson(ds):
    # Batt & Robinson (JCSE vol. 4), abstract: 0.001 mm/yr at -770 mV SCE, 54 mV/decade in natural seawater
    s, _ = service(ds, "seawater-quiescent", temp_C=20)
    mat = ds.get("materials", "carbon-steel")
    fd = g102.material_faraday_data(mat)
    line = part_kinetics(ds, record_for(ds, "carbon-steel", "seawater"), mat, s, 1.0, fd).lines[0]
    assert line["b_V"] == pytest.approx(0.054, rel=1e-12) and line["E_ref_V_SCE"] == -0.770
    rate = g102.corrosion_rate(line["i_ref_A_per_cm2"] * 1e6, fd.equivalent_weight_g, fd.density_g_cm3)
    assert rate.penetration_mm_per_year == pytest.approx(0.001, rel=1e-9) and line["confidence"] == "read"


def test_copper_nickel_free_corrosion_is_the_cda_figure(ds):
    # CDA, General Corrosion Rates: "normally 0.02-0.002 mm/yr" (read; the upper figure is the dataset's)
    _, mm = _free(ds, "cuni-90-10", "seawater", "seawater-quiescent")
    assert 0.002 <= mm <= 0.0205


def test_slopes_scale_with_absolute_temperature():
    # b = 2.303RT/(αnF): at constant α·n, b ∝ T (Bard & Faulkner 2001, eq. 3.4.11, from memory)
    assert slope_at(0.12, 20.0, 20.0) == 0.12
    assert slope_at(0.12, 76.15, 20.0) / 0.12 == pytest.approx(349.3 / 293.15, rel=1e-12)


@pytest.mark.parametrize("field", ["diameter_m", "length_m"])
def test_a_size_the_geometry_does_not_use_is_still_checked(field):
    """An infinite or negative size is refused by name even in still water (found by the robustness run)."""
    from calc import api

    for bad in (float("inf"), -1.0):
        out = api.call("matrix", {"env": "seawater-quiescent", "materials": ["carbon-steel", "copper"],
                                  "geometry": "still", field: bad})
        assert not out["ok"] and out["error"]["field"] == field
