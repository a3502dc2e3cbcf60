"""ASTM G102 Faraday conversions (calc.rate), on the shipped dataset."""

import math
import os
import sys

import pytest

ROOT = os.path.dirname(os.path.dirname(os.path.abspath(__file__)))
if ROOT not in sys.path:  # run from anywhere without installing the package
    sys.path.insert(0, ROOT)

from calc import api, constants  # noqa: E402
from calc import rate as g102  # noqa: E402
from calc.dataset import current  # noqa: E402
from calc.errors import InputError  # noqa: E402


@pytest.fixture(scope="module")
def ds():
    return current()


# ---------------------------------------------------------------- the constants


def test_k1_is_faradays_law():
    # ASTM G102-89 (R2015) Eq. (1): K1 = 3.27e-3 mm·g/(µA·cm·y); rebuilt from F (CODATA 2018) and a
    # 365.25-day year it is 1e-6 × 365.25 × 86400 × 10 / 96485.33212 = 3.2707e-3 (computed)
    assert g102.K1_MM == pytest.approx(g102.k1_from_faraday(365.25), rel=1e-3)
    assert g102.k1_from_faraday(365.25) == pytest.approx(3.2707e-3, abs=1e-7)


def test_k2_is_faradays_law():
    # ASTM G102-89 (R2015) Eq. (2): K2 = 8.954e-3 g·cm²/(µA·m²·d), rebuilt from F (CODATA 2018)
    assert g102.K2_G_M2_D == pytest.approx(g102.k2_from_faraday(), rel=1e-4)


def test_faraday_constant_used_is_codata_2018():
    # CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93, 025010, 2021): F = 96 485.332 12 C/mol
    assert constants.FARADAY == pytest.approx(96485.33212, abs=1e-5)


# ---------------------------------------------------------------- published rates


def test_iron_11_6_um_per_year_per_uA_cm2():
    # ASTM G102-89 (R2015), table of equivalent weights and densities: iron EW 27.92 g, ρ 7.87 g/cm³
    # (from memory: the inputs here); 1 µA/cm² -> 11.6 µm/y (Faraday's law, computed)
    ew = g102.equivalent_weight({"Fe": 100}).value_g
    assert ew == pytest.approx(27.92, abs=0.005)  # 55.845/2, IUPAC standard atomic weight of Fe
    r = g102.corrosion_rate(1.0, ew, 7.87)
    assert r.penetration_mm_per_year * 1000 == pytest.approx(11.6, abs=0.05)
    # fully determined by G102 Eq. (1) and the inputs: 3.27e-3 × 27.9225 / 7.87 = 1.16019e-2 mm/y
    assert r.penetration_mm_per_year == pytest.approx(3.27e-3 * 27.9225 / 7.87, rel=1e-4)


def test_zinc_15_0_um_per_year_per_uA_cm2():
    # ASTM G102-89 (R2015), table: zinc EW 32.68 g, ρ 7.13 g/cm³ (from memory: the inputs);
    # 1 µA/cm² -> 3.27e-3 × 32.68 / 7.13 = 1.49879e-2 mm/y, 15.0 µm/y (G102 Eq. 1, computed)
    r = g102.corrosion_rate(1.0, 32.68, 7.13)
    assert r.penetration_mm_per_year * 1000 == pytest.approx(15.0, abs=0.05)
    assert r.penetration_mm_per_year == pytest.approx(1.49879e-2, rel=1e-5)


def test_aluminium_and_copper_rates():
    # ASTM G102-89 (R2015), table (from memory: the inputs): Al EW 8.99, ρ 2.70 -> 3.27e-3 × 8.99 / 2.70
    # = 10.888 µm/y; Cu EW 31.77, ρ 8.96 -> 11.595 µm/y per µA/cm² (G102 Eq. 1, computed)
    assert g102.corrosion_rate(1, 8.99, 2.70).penetration_mm_per_year * 1000 == pytest.approx(10.9, abs=0.05)
    assert g102.corrosion_rate(1, 31.77, 8.96).penetration_mm_per_year * 1000 == pytest.approx(11.6, abs=0.05)
    assert g102.corrosion_rate(1, 8.99, 2.70).penetration_mm_per_year * 1000 == pytest.approx(10.888, abs=0.001)
    assert g102.corrosion_rate(1, 31.77, 8.96).penetration_mm_per_year * 1000 == pytest.approx(11.595, abs=0.001)


def test_mass_loss_of_iron():
    # ASTM G102-89 (R2015) Eq. (2): MR = 8.954e-3 × 1 × 27.92 = 0.2499957 g/(m²·d) (computed)
    assert g102.corrosion_rate(1.0, 27.92, 7.87).mass_loss_g_per_m2_day == pytest.approx(0.250, abs=0.0005)
    assert g102.corrosion_rate(1.0, 27.92, 7.87).mass_loss_g_per_m2_day == pytest.approx(0.2499957, rel=1e-6)


def test_carbon_steel_on_the_shipped_data(ds):
    # ASTM G102-89 (R2015): 1 µA/cm² on carbon steel is 11.6 µm/y (Eq. 1 with the record's EW 27.92 g and
    # ρ 7.86 g/cm³, both recalled from the G102 table: 3.27e-3 × 27.92 / 7.86 = 11.616 µm/y, computed)
    r = g102.rate_entry({"material": "carbon steel", "current_density_uA_per_cm2": 1})
    assert r["material"] == ds.get("materials", "carbon steel")["id"]
    assert r["penetration_mm_per_year"] * 1000 == pytest.approx(11.6, abs=0.05)
    assert set(r) >= {"material", "penetration_mm_per_year", "mass_loss_g_per_m2_day", "equivalent_weight_g",
                      "density_g_cm3", "steps", "warnings", "sources", "data_version"}
    assert r["data_version"] == ds.version
    assert "astm-g102" in r["sources"]


def test_zinc_on_the_shipped_data():
    # ASTM G102-89 (R2015): zinc 15.0 µm/y per µA/cm² (Eq. 1 with the record's EW and density, computed)
    r = g102.rate_entry({"material": "Zn", "current_density_uA_per_cm2": 1.0})
    assert r["penetration_um_per_year"] == pytest.approx(15.0, abs=0.05)


def test_rate_is_linear_in_current_density():
    # Faraday's law: the rate is proportional to the current (ASTM G102 Eq. 1)
    r1 = g102.rate_entry({"material": "copper", "current_density_uA_per_cm2": 1})
    r7 = g102.rate_entry({"material": "copper", "current_density_uA_per_cm2": 7})
    assert r7["penetration_mm_per_year"] == pytest.approx(7 * r1["penetration_mm_per_year"], rel=1e-12)
    assert g102.rate_entry({"material": "copper", "current_density_uA_per_cm2": 0})["penetration_mm_per_year"] == 0


# ---------------------------------------------------------------- equivalent weights


def test_equivalent_weight_of_pure_metals():
    # ASTM G102-89 (R2015) §5: EW = W/n for a pure metal; G102 table (from memory): Fe 27.92, Cu 31.77,
    # Ni 29.36, Al 8.99, Zn 32.68; computed here from IUPAC standard atomic weights
    for comp, ew in (({"Fe": 100}, 27.92), ({"Cu": 100}, 31.77), ({"Ni": 100}, 29.35), ({"Al": 100}, 8.99),
                     ({"Zn": 100}, 32.69)):
        assert g102.equivalent_weight(comp).value_g == pytest.approx(ew, abs=0.015)


def test_equivalent_weight_of_316_close_to_g102():
    # ASTM G102-89 (R2015) table: S31600 EW 25.50 g (from memory); nominal 316 (Cr 17, Ni 12, Mo 2.5, Fe bal.)
    # with valences Fe 2, Cr 3, Ni 2, Mo 3 gives 25.6: the method agrees within 1 %
    ew = g102.equivalent_weight({"Cr": 17, "Ni": 12, "Mo": 2.5, "Fe": "balance"}).value_g
    assert ew == pytest.approx(25.50, rel=0.01)


def test_elements_below_one_percent_are_left_out():
    # ASTM G102-89 (R2015) Table 1 note: elements below 1 % by mass are not included
    with_mn = g102.equivalent_weight({"Fe": 99.1, "Mn": 0.9})
    assert "Mn" in with_mn.ignored
    assert with_mn.value_g == pytest.approx(1 / (2 * 0.991 / 55.845), rel=1e-12)
    kept = g102.equivalent_weight({"Fe": 98.9, "Mn": 1.1})
    assert "Mn" not in kept.ignored


def test_every_computed_equivalent_weight_in_the_dataset_follows_g102(ds):
    # Invariant: each EW the dataset marks as computed equals the ASTM G102 method (EW = 1/Σ n f / W,
    # elements < 1 % ignored) on its own composition and stated valences, within 0.1 % (rounding)
    checked = 0
    for m in ds.records("materials"):
        if m.get("equivalent_weight_confidence") == "computed" and m.get("composition_wt_pct"):
            ew = g102.equivalent_weight(m["composition_wt_pct"], m.get("equivalent_weight_valences")).value_g
            assert ew == pytest.approx(m["equivalent_weight_g"], rel=1e-3), m["id"]
            checked += 1
    assert checked >= 20


def test_mass_loss_and_penetration_agree_for_every_material(ds):
    # Invariant: MR [g/(m²·d)] = CR [mm/y] × ρ [g/cm³] × 1000 / 365.25 (unit conversion, computed),
    # within the 0.1 % by which K1 = 3.27e-3 is rounded in ASTM G102
    n = 0
    for m in ds.records("materials"):
        if m.get("equivalent_weight_g") is None or m.get("density_g_cm3") is None:
            continue
        r = g102.rate_entry({"material": m["id"], "current_density_uA_per_cm2": 10})
        assert r["mass_loss_g_per_m2_day"] == pytest.approx(
            r["penetration_mm_per_year"] * r["density_g_cm3"] * 1000 / 365.25, rel=1e-3), m["id"]
        n += 1
    assert n >= 40


def test_stated_valences_override_defaults():
    # ASTM G102 §5: the valence is the user's choice; titanium as Ti(IV) 11.97 g, as Ti(II) 23.93 g (computed)
    assert g102.equivalent_weight({"Ti": 100}).value_g == pytest.approx(11.97, abs=0.005)
    assert g102.equivalent_weight({"Ti": 100}, {"Ti": 2}).value_g == pytest.approx(23.93, abs=0.005)


def test_graphitic_carbon_is_not_oxidised():
    # computed-g102-ew (data/sources.yaml): graphitic carbon in cast iron is left out of the EW
    ew = g102.equivalent_weight({"Fe": 93.5, "C": 3.3, "Si": 2.2, "Mn": 0.7}, {"Fe": 2, "Si": 4})
    assert "C" in ew.ignored and "Mn" in ew.ignored
    assert ew.value_g == pytest.approx(1 / (2 * 0.935 / 55.845 + 4 * 0.022 / 28.085), rel=1e-12)


# ---------------------------------------------------------------- bad input


def test_graphite_has_no_rate_and_says_why():
    with pytest.raises(InputError) as exc:
        g102.rate_entry({"material": "graphite", "current_density_uA_per_cm2": 1})
    msg = str(exc.value)
    assert exc.value.field == "material" and "graphite" in msg.lower() and "cathode" in msg


@pytest.mark.parametrize("value", [-1, -1e-9, float("nan"), float("inf"), "1", None, True, [1]])
def test_bad_current_density(value):
    with pytest.raises(InputError) as exc:
        g102.rate_entry({"material": "zinc", "current_density_uA_per_cm2": value})
    assert exc.value.field == "current_density_uA_per_cm2"


def test_unknown_material_names_closest():
    out = api.call("rate", {"material": "zinck", "current_density_uA_per_cm2": 1})
    assert not out["ok"] and out["error"]["field"] == "material"
    assert "closest" in out["error"]["message"] and "zinc" in out["error"]["message"]


def test_unknown_field_is_refused():
    out = api.call("rate", {"material": "zinc", "current_density": 1})
    assert not out["ok"] and out["error"]["field"] == "current_density"


def test_missing_fields():
    assert api.call("rate", {"material": "zinc"})["error"]["field"] == "current_density_uA_per_cm2"
    assert api.call("rate", {"current_density_uA_per_cm2": 1})["error"]["field"] == "material"


def test_very_high_current_warns():
    r = g102.rate_entry({"material": "zinc", "current_density_uA_per_cm2": 20000})
    assert any(w["field"] == "current_density_uA_per_cm2" for w in r["warnings"])
    assert math.isfinite(r["penetration_mm_per_year"])


def test_bad_composition():
    with pytest.raises(InputError):
        g102.equivalent_weight({"Fe": 120})
    with pytest.raises(InputError):
        g102.equivalent_weight({"Fe": 0.5})  # nothing left at 1 % or more
    with pytest.raises(InputError):
        g102.equivalent_weight({})
