"""calc.cpdesign.demand and calc.cpdesign.zones: coating breakdown and current demand.

The model is that of DNV-RP-B401 as restated by M. A. El-Reedy, Offshore Structures (2012), ch. 6,
eq. 6.10-6.13 (read): f = a + b·t; f_m = a + 0.5·b·t_f; f_f = a + b·t_f; capped at 1; when the
design life outlasts the coating, f_m = 1 − (1 − a)²/(2·b·t_f). No worked numbers were read: the
values below are computed from those equations [C], and the data values (current densities,
coating constants) are recalled from DNV-RP-B401 (2010), so they are checked for shape, not value.
"""

import pytest

from calc.cpdesign.catalogue import record, region_for
from calc.cpdesign.demand import (STAGES, breakdown_factors, breakdown_final, breakdown_initial, breakdown_mean,
                                  coating_life, current_demand, densities)
from calc.cpdesign.zones import read_zones, region_of
from calc.dataset import current
from calc.errors import InputError


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def test_the_equations_as_restated():
    # El-Reedy (2012) eq. 6.11 and 6.12 [C]: a = 0.05, b = 0.025, t_f = 20 years
    assert breakdown_initial(0.05) == 0.05
    assert breakdown_mean(0.05, 0.025, 20) == pytest.approx(0.30)
    assert breakdown_final(0.05, 0.025, 20) == pytest.approx(0.55)


def test_cap_and_the_life_beyond_the_coating():
    # El-Reedy (2012) eq. 6.13 [C]: a = 0.10, b = 0.10, t_f = 20: the coating reaches f = 1 after 9 years
    assert coating_life(0.10, 0.10) == pytest.approx(9.0)
    assert breakdown_final(0.10, 0.10, 20) == 1.0
    assert breakdown_mean(0.10, 0.10, 20) == pytest.approx(1 - 0.9 ** 2 / 4.0)
    # it is the time average of min(a + b·t, 1): 9 years rising from 0.1 to 1, then 11 years at 1
    average = (9 * (0.10 + 1.0) / 2 + 11 * 1.0) / 20
    assert breakdown_mean(0.10, 0.10, 20) == pytest.approx(average)


@pytest.mark.parametrize("a, b", [(0.02, 0.012), (0.05, 0.025), (0.1, 0.1), (0.3, 0.05)])
def test_the_two_mean_forms_meet_where_the_coating_is_used_up(a, b):
    t = coating_life(a, b)
    below, above = breakdown_mean(a, b, t * (1 - 1e-9)), breakdown_mean(a, b, t * (1 + 1e-9))
    assert below == pytest.approx(above, abs=1e-8) == pytest.approx((1 + a) / 2, abs=1e-8)


def test_demand_is_density_times_area_times_factor():
    assert current_demand(0.13, 2000.0, 0.55) == pytest.approx(143.0)


# ------------------------------------------------------------------ invariants

def _factor_grid():
    for a in (0.0, 0.02, 0.05, 0.1, 0.3, 0.6, 1.0):
        for b in (0.0, 0.005, 0.012, 0.025, 0.05, 0.1, 0.3):
            for t in (1, 5, 10, 25, 40, 100):
                yield a, b, t


def test_more_coating_breakdown_never_lowers_the_factors():
    for a, b, t in _factor_grid():
        for fn in (breakdown_mean, breakdown_final):
            base = fn(a, b, t)
            assert 0 <= base <= 1
            assert fn(min(a + 0.01, 1.0), b, t) >= base - 1e-12, (fn.__name__, a, b, t)
            assert fn(a, b + 0.01, t) >= base - 1e-12, (fn.__name__, a, b, t)
            assert fn(a, b, t + 1) >= base - 1e-12, (fn.__name__, a, b, t)
        assert breakdown_initial(a) <= breakdown_mean(a, b, t) + 1e-12 <= breakdown_final(a, b, t) + 2e-12


def test_more_coating_breakdown_never_lowers_the_demand_over_the_catalogue():
    # bare ≥ category I ≥ II ≥ III at every depth, life and stage (the shipped constants)
    order = ["bare", "category-i", "category-ii", "category-iii"]
    for depth in (0.0, 15.0, 30.0, 80.0):
        for life in (5, 15, 25, 40):
            f = [breakdown_factors(c, depth, life)[2] for c in order]
            for stage in STAGES:
                values = [x[stage] for x in f]
                assert values == sorted(values, reverse=True), (depth, life, stage, values)


def test_current_density_tables_are_coherent():
    # every band holds initial ≥ final ≥ mean (the shape of DNV-RP-B401's tables, recalled), bands tile the depth
    for rec in current().records("cp_current_densities"):
        ends = [b["depth_m"] for b in rec["bands"]]
        assert ends[0][0] == 0 and ends[-1][1] is None
        assert all(x[1] == y[0] for x, y in zip(ends, ends[1:]))
        for band in rec["bands"]:
            assert band["initial_A_per_m2"] >= band["final_A_per_m2"] >= band["mean_A_per_m2"] > 0


def test_colder_water_needs_more_current_near_the_surface():
    order = ["tropical", "sub-tropical", "temperate", "arctic"]
    values = [densities(record("cp_current_densities", r, "region"), "seawater", 10.0)[1] for r in order]
    for stage in STAGES:
        assert [v[stage] for v in values] == sorted(v[stage] for v in values)


@pytest.mark.parametrize("temp, region", [(25, "tropical"), (20, "tropical"), (15, "sub-tropical"),
                                          (12, "sub-tropical"), (8, "temperate"), (7, "temperate"), (3, "arctic"),
                                          (-1, "arctic")])
def test_region_by_surface_water_temperature(temp, region):
    assert region_for(temp)["id"] == region


def test_seabed_density_does_not_depend_on_region():
    a = densities(record("cp_current_densities", "tropical", "r"), "seabed", 50.0)
    b = densities(record("cp_current_densities", "arctic", "r"), "seabed", 50.0)
    assert a == b and a[0]["id"] == "seabed-sediment"


# ------------------------------------------------------------------ zones and their errors

@pytest.mark.parametrize("zones, field", [
    ([], "zones"),
    ("legs", "zones"),
    ([{"area_m2": 0}], "zones[0].area_m2"),
    ([{"area_m2": -3}], "zones[0].area_m2"),
    ([{"area_m2": 10}, {"area_m2": 5, "depth_m": -1}], "zones[1].depth_m"),
    ([{"area_m2": 10, "zone": "air"}], "zones[0].zone"),
    ([{"area_m2": 10, "paint": "red"}], "zones[0].paint"),
    ([{"depth_m": 3}], "zones[0].area_m2"),
    ([{"area_m2": 10, "name": ""}], "zones[0].name"),
])
def test_bad_zones_are_refused_naming_the_field(zones, field):
    with pytest.raises(InputError) as exc:
        read_zones(zones)
    assert exc.value.field == field


def test_unknown_coating_category_is_refused_with_the_closest():
    with pytest.raises(InputError) as exc:
        breakdown_factors("category-iv", 10.0, 20, field="zones[0].coating")
    assert exc.value.field == "zones[0].coating"
    assert "category-i" in str(exc.value)


def test_region_must_be_given_for_seawater_zones():
    with pytest.raises(InputError) as exc:
        region_of({}, True)
    assert exc.value.field == "region"
    with pytest.raises(InputError) as exc:
        region_of({"region": "seabed-sediment"}, True)
    assert exc.value.field == "region"
    with pytest.raises(InputError) as exc:
        region_of({"region": "temperate", "water_temp_C": 9}, True)
    assert exc.value.field == "water_temp_C"
    assert region_of({}, False) is None
