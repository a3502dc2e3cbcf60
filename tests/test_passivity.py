"""Passivity of stainless and nickel alloys: calc.passivity (PREN, CPT/CCT estimates, the judgement).

PREN of standard grades from compositions read in published tables (each named beside it); the
ASTM G48 CPT/CCT estimates are recalled, not re-read, so they are tested only as the formulas
implemented, never as published checks.
"""

import json

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc.errors import InputError
from calc.passivity import (AMBIENT_MAX_C, CHLORIDE_304_MG_L, CHLORIDE_316_MG_L, PREN_304_TYPE, PREN_316_TYPE,
                            cct_estimate, chloride_from_salinity, cpt_estimate, holds, passivity_entry, pren, pren_w)

SEAWATER_CL = chloride_from_salinity(35.0)


# ---------------------------------------------------------------------------- PREN of standard grades

# R. M. Davison and J. D. Redmond, "Practical Guide to Using 6 Mo Austenitic Stainless Steels"
# (Nickel Development Institute reprint), Table 1 "6 Mo Austenitic Stainless Steels and Other
# Austenitic Grades" (read in a public copy): Cr, Mo, N ranges in wt %.
DAVISON_REDMOND_TABLE_1 = {
    "S31254": {"cr": (19.50, 20.50), "mo": (6.00, 6.50), "n": (0.18, 0.22)},
    "N08367": {"cr": (20.00, 22.00), "mo": (6.00, 7.00), "n": (0.18, 0.25)},
    "S31603": {"cr": (16.00, 18.00), "mo": (2.00, 3.00), "n": (0.0, 0.10)},  # N 0.10 max
}
# UNS S32205 (ASTM A240 Table 1: Cr 22.0-23.0, Mo 3.0-3.5, N 0.14-0.20) and UNS S32750 (ASTM A240
# Table 1: Cr 24.0-26.0, Mo 3.0-5.0, N 0.24-0.32), from memory: an earlier reading in suppliers' copies
# cannot be named, so these two rows are recalled (the same figures as data/materials.yaml, recalled).
ASTM_RESTATED = {
    "S32205": {"cr": (22.0, 23.0), "mo": (3.0, 3.5), "n": (0.14, 0.20)},
    "S32750": {"cr": (24.00, 26.00), "mo": (3.00, 5.00), "n": (0.24, 0.32)},
}
# PREN of those ranges' minimum and maximum compositions, worked by hand from PREN = Cr + 3.3·Mo + 16·N
PREN_RANGES = {"S31254": (42.18, 45.47), "N08367": (42.68, 49.10), "S31603": (22.60, 29.50),
               "S32205": (34.14, 37.75), "S32750": (37.74, 47.62)}


@pytest.mark.parametrize("uns", sorted(PREN_RANGES))
def test_pren_of_standard_grades_from_their_composition_ranges(uns):
    comp = {**DAVISON_REDMOND_TABLE_1, **ASTM_RESTATED}[uns]
    low = pren(comp["cr"][0], comp["mo"][0], comp["n"][0])
    high = pren(comp["cr"][1], comp["mo"][1], comp["n"][1])
    assert (low, high) == pytest.approx(PREN_RANGES[uns], abs=0.005)


def test_super_duplex_with_tungsten_uses_the_iso_15156_3_form():
    # UNS S32760 minimum composition as restated by a supplier (read): Cr 24.00, Mo 3.00, W 0.50,
    # N 0.20 wt %; PREN_W = Cr + 3.3·(Mo + 0.5·W) + 16·N (ISO 15156-3, as restated).
    assert pren_w(24.00, 3.00, 0.50, 0.20) == pytest.approx(37.925, abs=1e-9)
    assert pren_w(24.00, 3.00, 0.0, 0.20) == pytest.approx(pren(24.00, 3.00, 0.20), abs=1e-12)
    r = passivity_entry({"cr": 24.0, "mo": 3.0, "w": 0.5, "n": 0.2})
    assert r["pren_formula"].startswith("PREN_W") and r["pren"] == pytest.approx(37.925, abs=1e-9)


@pytest.mark.parametrize("grade, comp, printed", [
    ("S31603", (17.5, 2.25, 0.0), 25), ("S31254", (20.0, 6.1, 0.20), 43), ("N06625", (21.5, 8.5, 0.0), 50)])
def test_pren_of_typical_compositions_against_a_published_data_sheet(grade, comp, printed):
    # Fine Tubes, data sheet "Alloy 6Mo (UNS S31254)", e110, August 2011 (read in a public copy):
    # typical compositions Cr 17.5 / 20 / 21.5 and Mo 2.25 / 6.1 / 8.5, N 0.20 for 6Mo (none printed
    # for the others), and the printed PREN 25 (S31603), 43 (S31254), 50 (N06625), rounded to units.
    # The copy's Mo row holds five values for six alloys; read in column order with the 904L value
    # missing, which gives 8.5 for N06625 (within its usual 8-10 %, from memory).
    assert pren(*comp) == pytest.approx(printed, abs=0.5)


# ---------------------------------------------------------------------------- the estimates (from memory)

def test_cpt_and_cct_estimates_are_the_formulas_implemented():
    # ASTM G48 Methods E and F start-temperature estimates, from memory (not a published check): no
    # open-access paper printing these fits, or another CPT-PREN fit, was found to check them against.
    assert cpt_estimate(20.0, 6.0, 0.2) == pytest.approx(2.5 * 20 + 7.6 * 6 + 31.9 * 0.2 - 41.0, abs=1e-12)
    assert cct_estimate(20.0, 6.0, 0.2) == pytest.approx(3.2 * 20 + 7.6 * 6 + 10.5 * 0.2 - 81.0, abs=1e-12)
    r = passivity_entry({"cr": 20.0, "mo": 6.0, "n": 0.2})
    assert r["estimates_confidence"] == "from memory"
    assert any("recalled" in w["message"] for w in r["warnings"])


def test_chloride_of_standard_seawater():
    # S = 1.80655·Cl (IHO Hydrographic Dictionary S-32, entry "salinity", read; adopted by IAPO 1963 and
    # ICES 1964): S = 35 is chlorinity 35/1.80655 = 19.374 g/kg
    assert chloride_from_salinity(35.0) == pytest.approx(19374.0, abs=1.0)


# ---------------------------------------------------------------------------- the judgement

def test_the_seawater_rule_of_thumb():
    # PREN above about 32 for pitting and about 40 for crevice resistance in ambient seawater (common practice)
    assert not holds(31.9, 80.0, 60.0, 20.0, SEAWATER_CL).holds
    mid = holds(35.0, 80.0, 60.0, 20.0, SEAWATER_CL)
    assert not mid.holds and "a joint is a crevice" in mid.reason
    assert holds(40.0, 80.0, 60.0, 20.0, SEAWATER_CL).holds


def test_service_temperature_against_the_estimates():
    assert not holds(45.0, 50.0, 25.0, 30.0, SEAWATER_CL).holds  # at or above the CCT
    assert not holds(45.0, 30.0, 60.0, 30.0, SEAWATER_CL).holds  # at or above the CPT
    warm = holds(45.0, 70.0, 50.0, 40.0, SEAWATER_CL)
    assert warm.holds and "necessary, not sufficient" in warm.reason and 40.0 > AMBIENT_MAX_C


def test_natural_water_guideline_mapped_to_pren():
    # NiDI 11 003 as restated: crevice attack rare below about 200 mg/L chloride on 304, 1000 mg/L on 316
    assert holds(PREN_304_TYPE, 0.0, -20.0, 20.0, CHLORIDE_304_MG_L).holds
    assert not holds(PREN_304_TYPE, 0.0, -20.0, 20.0, 500.0).holds
    assert holds(PREN_316_TYPE, 0.0, -20.0, 20.0, CHLORIDE_316_MG_L).holds
    assert not holds(PREN_316_TYPE, 0.0, -20.0, 20.0, CHLORIDE_316_MG_L + 1.0).holds  # seawater class
    assert not holds(16.0, 0.0, -20.0, 20.0, 50.0).holds  # a 17 % Cr ferritic type


def test_standard_grades_in_seawater_at_20_and_35_degrees():
    lo = {k: v[0] for k, v in DAVISON_REDMOND_TABLE_1["S31254"].items()}
    at_20 = passivity_entry({**lo, "temp_C": 20, "salinity": 35})
    assert at_20["holds"] and at_20["pren"] == pytest.approx(42.18, abs=0.005)
    assert not passivity_entry({**lo, "temp_C": 35, "salinity": 35})["holds"]
    lean = passivity_entry({"cr": 17.0, "mo": 2.1, "n": 0.05, "temp_C": 20, "salinity": 35})
    assert not lean["holds"] and lean["reason"].startswith("judged not passive")
    assert passivity_entry({"cr": 17.0, "mo": 2.1, "n": 0.05, "temp_C": 20, "chloride_mg_per_L": 150})["holds"]


def test_below_the_chromium_of_a_stainless_steel_nothing_is_passive():
    r = passivity_entry({"cr": 5.0, "mo": 0.5, "n": 0.0})
    assert not r["holds"] and "10.5 % of a stainless steel" in r["reason"]


def test_defaults_are_said_in_the_result():
    r = passivity_entry({"cr": 25.0, "mo": 3.8, "n": 0.27})
    assert r["temp_C"] == 25.0 and not r["temp_given"]
    assert r["chloride_given"].startswith("assumed") and r["chloride_mg_per_L"] == pytest.approx(SEAWATER_CL)
    assert any(w["field"] == "temp_C" for w in r["warnings"])
    json.dumps(r, allow_nan=False)


# ---------------------------------------------------------------------------- bad input

@pytest.mark.parametrize("request_, field", [
    ({"mo": 1, "n": 0}, "cr"), ({"cr": 18, "n": 0}, "mo"), ({"cr": 18, "mo": 0}, "n"),
    ({"cr": -1, "mo": 0, "n": 0}, "cr"), ({"cr": 60, "mo": 0, "n": 0}, "cr"), ({"cr": 18, "mo": 0, "n": 2}, "n"),
    ({"cr": float("nan"), "mo": 0, "n": 0}, "cr"), ({"cr": 18, "mo": 0, "n": 0, "w": -0.1}, "w"),
    ({"cr": 18, "mo": 0, "n": 0, "temp_C": 120}, "temp_C"), ({"cr": 18, "mo": 0, "n": 0, "salinity": 0}, "salinity"),
    ({"cr": 18, "mo": 0, "n": 0, "salinity": 35, "chloride_mg_per_L": 100}, "chloride_mg_per_L"),
    ({"cr": 18, "mo": 0, "n": 0, "ni": 8}, "ni"), ({"cr": "x", "mo": 0, "n": 0}, "cr"),
])
def test_bad_input_names_the_field(request_, field):
    with pytest.raises(InputError) as exc:
        passivity_entry(request_)
    assert exc.value.field == field


SHARE = st.one_of(st.floats(-5, 60), st.floats(allow_nan=True, allow_infinity=True), st.none(),
                  st.sampled_from(["1", "x", True, [], 10 ** 400]))


@settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.fixed_dictionaries({"cr": SHARE, "mo": SHARE, "n": SHARE},
                             optional={"w": SHARE, "temp_C": SHARE, "salinity": SHARE, "chloride_mg_per_L": SHARE}))
def test_any_request_gives_a_result_or_a_clear_input_error(request_):
    try:
        r = passivity_entry(request_)
    except InputError as exc:
        assert str(exc).startswith(exc.field) and "\n" not in str(exc)
        return
    json.dumps(r, allow_nan=False)
    assert isinstance(r["holds"], bool) and r["reason"].startswith("judged")
