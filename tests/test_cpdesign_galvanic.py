"""calc.cpdesign.galvanic: the offshore galvanic-anode design entry (``anodes``).

The method is that of DNV-RP-B401 as restated by El-Reedy, Offshore Structures (2012), ch. 6 (read):
demand from the zones, net mass M = I_m·t_f·8760/(u·ε), output I = ΔE/R, and the number of anodes from
the mass and from the final output, the larger governing. The design values of the dataset for it
are recalled (DNV-RP-B401 2010, from memory): the checks here are of the method's arithmetic [C] and
of its invariants, not of published numbers.
"""

import math

import pytest

from calc.cpdesign.galvanic import anodes_entry
from calc.errors import InputError

DIRECT = {"current_mean_A": 50, "current_final_A": 60, "current_initial_A": 80, "life_years": 25,
          "alloy": "al-zn-in", "anode_type": "long-slender-standoff", "resistivity_ohm_m": 0.3,
          "anode": {"net_mass_kg": 300, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3}}
JACKET = {"zones": [{"name": "members 0-30 m", "area_m2": 5000, "depth_m": 20, "coating": "bare"},
                    {"name": "coated legs", "area_m2": 2000, "depth_m": 10, "coating": "category-ii"},
                    {"name": "deep members", "area_m2": 3000, "depth_m": 60},
                    {"name": "piles", "area_m2": 800, "zone": "seabed"}],
          "life_years": 25, "water_temp_C": 9, "alloy": "al-zn-in", "anode_type": "long-slender-standoff",
          "resistivity_ohm_m": 0.3, "anode": {"net_mass_kg": 300, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3}}


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def test_direct_design_arithmetic():
    r = anodes_entry(DIRECT)
    mass = 50 * 25 * 8760 / (0.90 * 2000)
    assert r["net_mass_kg"] == pytest.approx(mass)
    assert r["driving_V"] == pytest.approx(-0.80 - (-1.05))
    r_i = 0.3 / (2 * math.pi * 2.5) * (math.log(4 * 2.5 / 0.12) - 1)
    assert r["resistance_ohm"]["initial"] == pytest.approx(r_i)
    assert r["output_A"]["initial"] == pytest.approx(0.25 / r_i)
    assert r["count_by"]["mass"] == math.ceil(mass / 300)
    assert r["count_by"]["final current output"] == math.ceil(60 / r["output_A"]["final"])
    assert r["count"] == max(r["count_by"].values())
    assert r["governed_by"] in r["count_by"] and r["count_by"][r["governed_by"]] == r["count"]
    assert all(c["passed"] for c in r["checks"]) and len(r["checks"]) == 3
    assert r["life_of_count_years"] >= 25


def test_the_result_carries_what_the_issue_names():
    r = anodes_entry(DIRECT)
    for key in ("current_demand_A", "net_mass_kg", "count", "resistance_ohm", "output_A", "governed_by", "steps",
                "warnings", "cautions", "sources", "data_version", "checks"):
        assert key in r
    assert set(r["current_demand_A"]) == {"initial", "mean", "final"}
    assert any("hydrogen" in c for c in r["cautions"]) and any("qualified" in c for c in r["cautions"])
    assert any("DNV-RP-B401" in c for c in r["cautions"])


def test_jacket_zones_sum_and_steps():
    r = anodes_entry(JACKET)
    zones = r["zones"]
    assert [z["name"] for z in zones] == [z["name"] for z in JACKET["zones"]]
    for stage in ("initial", "mean", "final"):
        assert r["current_demand_A"][stage] == pytest.approx(sum(z["current_A"][stage] for z in zones))
    bare = zones[0]
    assert bare["breakdown"] == {"initial": 1.0, "mean": 1.0, "final": 1.0}
    assert bare["current_A"]["final"] == pytest.approx(5000 * bare["current_density_A_per_m2"]["final"])
    assert zones[3]["region"] == "seabed-sediment" and zones[0]["region"] == "temperate"
    assert zones[2]["current_density_A_per_m2"] != zones[0]["current_density_A_per_m2"]  # another depth band
    assert {"dnv-rp-b401", "el-reedy-2012"} <= set(r["sources"])


def test_more_coating_breakdown_never_lowers_the_demand():
    demands = []
    for coating in ("category-iii", "category-ii", "category-i", "bare"):
        req = dict(JACKET, zones=[{"area_m2": 1000, "depth_m": 15, "coating": coating},
                                  {"area_m2": 500, "depth_m": 45, "coating": coating}])
        demands.append(anodes_entry(req)["current_demand_A"])
    for stage in ("initial", "mean", "final"):
        values = [x[stage] for x in demands]
        assert values == sorted(values), (stage, values)


def test_longer_life_never_lowers_mass_or_count():
    masses, counts = [], []
    for life in (5, 10, 20, 30, 40):
        r = anodes_entry(dict(JACKET, life_years=life))
        masses.append(r["net_mass_kg"])
        counts.append(r["count"])
    assert masses == sorted(masses) and counts == sorted(counts)


def test_final_dimensions_given_are_used():
    req = dict(DIRECT, anode=dict(DIRECT["anode"], final={"length_m": 2.3, "radius_m": 0.06}))
    r = anodes_entry(req)
    assert r["resistance_ohm"]["final"] == pytest.approx(0.3 / (2 * math.pi * 2.3) * (math.log(4 * 2.3 / 0.06) - 1))


def test_flush_anode_without_final_dimensions_warns():
    req = dict(DIRECT, anode_type="long-flush", anode={"net_mass_kg": 100, "length_m": 1.5, "width_m": 0.25})
    r = anodes_entry(req)
    assert any(w["field"] == "anode.final" for w in r["warnings"])
    assert r["resistance_ohm"]["initial"] == pytest.approx(0.3 / (1.5 + 0.25))


def test_zinc_has_less_driving_voltage_and_capacity():
    al, zn = anodes_entry(DIRECT), anodes_entry(dict(DIRECT, alloy="zinc"))
    assert zn["driving_V"] < al["driving_V"] and zn["net_mass_kg"] > al["net_mass_kg"]


def test_high_strength_steel_is_warned_about_hydrogen():
    r = anodes_entry(dict(DIRECT, structure="high-strength-steel"))
    assert any("hydrogen" in w["message"] for w in r["warnings"])
    assert not any("hydrogen" in w["message"] for w in anodes_entry(DIRECT)["warnings"])


def test_direct_mode_with_capacity_and_utilisation_only():
    r = anodes_entry({"current_mean_A": 10, "life_years": 20, "capacity_Ah_per_kg": 2000, "utilisation": 0.9,
                      "anode": {"net_mass_kg": 100}})
    assert r["net_mass_kg"] == pytest.approx(10 * 20 * 8760 / 1800)
    assert r["count"] == math.ceil(r["net_mass_kg"] / 100) and r["governed_by"] == "mass"
    assert r["resistance_ohm"] is None and r["output_A"] is None
    assert any(w["field"] == "current_final_A" for w in r["warnings"])


def test_without_anode_size_there_is_no_count_but_a_warning():
    r = anodes_entry({"current_mean_A": 10, "life_years": 20, "alloy": "zinc", "anode_type": "bracelet"})
    assert r["count"] is None and any(w["field"] == "anode" for w in r["warnings"])


@pytest.mark.parametrize("change, field", [
    ({"life_years": 0}, "life_years"),
    ({"life_years": -5}, "life_years"),
    ({"life_years": None}, "life_years"),
    ({"resistivity_ohm_m": 0}, "resistivity_ohm_m"),
    ({"resistivity_ohm_m": -0.3}, "resistivity_ohm_m"),
    ({"resistivity_ohm_m": None}, "resistivity_ohm_m"),
    ({"alloy": "copper"}, "alloy"),
    ({"alloy": "magnesium"}, "alloy"),  # no seawater design values in the dataset
    ({"anode_type": "torpedo"}, "anode_type"),
    ({"current_mean_A": 0}, "current_mean_A"),
    ({"current_mean_A": None}, "zones"),
    ({"current_final_A": -1}, "current_final_A"),
    ({"zones": [{"area_m2": 10}]}, "current_initial_A"),  # zones and currents, not both
    ({"utilisation": 0.9}, "utilisation"),
    ({"capacity_Ah_per_kg": 2000}, "capacity_Ah_per_kg"),
    ({"protection_V": -5}, "protection_V"),
    ({"structure": "wood"}, "structure"),
    ({"anode": {"net_mass_kg": 300, "length_m": 0, "radius_m": 0.12, "standoff_m": 0.3}}, "anode.length_m"),
    ({"anode": {"net_mass_kg": 300, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.1}}, "anode.standoff_m"),
    ({"anode": {"net_mass_kg": 0, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3}}, "anode.net_mass_kg"),
    ({"anode": {"net_mass_kg": 300, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3, "mass": 1}}, "anode.mass"),
    ({"anode": {"length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3, "final": {"radius_m": -1, "length_m": 2}}},
     "anode.final.radius_m"),
    ({"closed_circuit_V": -0.5, "alloy": None, "capacity_Ah_per_kg": 2000}, "closed_circuit_V"),
])
def test_bad_input_is_refused_naming_the_field(change, field):
    req = {k: v for k, v in dict(DIRECT, **change).items() if v is not None}
    with pytest.raises(InputError) as exc:
        anodes_entry(req)
    assert exc.value.field == field, str(exc.value)


@pytest.mark.parametrize("change, field", [
    ({"zones": [{"area_m2": 100, "coating": "category-iv"}]}, "zones[0].coating"),
    ({"zones": [{"area_m2": 100, "coating": "III"}, {"area_m2": -1}]}, "zones[1].area_m2"),
    ({"water_temp_C": None}, "region"),
    ({"water_temp_C": 60}, "water_temp_C"),
    ({"water_temp_C": None, "region": "tundra"}, "region"),
])
def test_bad_zone_input_is_refused_naming_the_field(change, field):
    req = {k: v for k, v in dict(JACKET, **change).items() if v is not None}
    with pytest.raises(InputError) as exc:
        anodes_entry(req)
    assert exc.value.field == field, str(exc.value)


def test_unknown_coating_message_names_the_categories():
    with pytest.raises(InputError) as exc:
        anodes_entry(dict(JACKET, zones=[{"area_m2": 100, "coating": "category-iv"}]))
    assert "category-i" in str(exc.value)
