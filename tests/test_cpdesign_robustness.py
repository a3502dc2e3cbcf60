"""The design entry points under arbitrary input: a plain-JSON result or one InputError, never another exception.

Every field of every design entry point is driven here (``tests/test_robustness.py`` takes the
same requests for its run over all entry points): a worked request (VALID), each optional field
with a good value of its own (OPTIONAL), and fields made missing or replaced by junk (wrong types,
NaN, ±Infinity, huge and tiny numbers, negative values, unknown names, nested junk).
"""

import json
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc.cpdesign import anode_resistance_entry, anodes_entry, buried_entry, groundbed_entry, tank_entry, wenner_entry
from calc import clicp
from calc.cpdesign import anodes, buried, galvanic, impressed, tankdesign
from calc.errors import InputError

JUNK = st.one_of(
    st.none(), st.booleans(), st.text(max_size=12), st.integers(min_value=-10 ** 30, max_value=10 ** 30),
    st.floats(allow_nan=True, allow_infinity=True), st.sampled_from([0, -1, 1e308, 5e-324, "3.5", "", [], {}]),
    st.lists(st.integers(), max_size=3), st.dictionaries(st.text(max_size=5), st.integers(), max_size=3))

VALID = {
    "anodes": (anodes_entry, {
        "zones": [{"area_m2": 1000, "depth_m": 20, "coating": "category-ii"}, {"area_m2": 200, "zone": "seabed"}],
        "life_years": 25, "water_temp_C": 10, "alloy": "al-zn-in", "anode_type": "long-slender-standoff",
        "resistivity_ohm_m": 0.3, "anode": {"net_mass_kg": 200, "length_m": 2.0, "radius_m": 0.1, "standoff_m": 0.3}}),
    "anode-resistance": (anode_resistance_entry, {"shape": "standoff", "resistivity_ohm_m": 0.3, "length_m": 2,
                                                  "radius_m": 0.1, "standoff_m": 0.3}),
    "buried": (buried_entry, {"current_A": 0.858, "resistivity_ohm_m": 45, "alloy": "magnesium",
                              "anode": "17-lb-packaged", "life_years": 15}),
    "groundbed": (groundbed_entry, {"resistivity_ohm_m": 20, "length_m": 2.1, "diameter_m": 0.25, "count": 3,
                                    "spacing_m": 6.1, "current_A": 5, "max_resistance_ohm": 2,
                                    "anode_material": "high-silicon-cast-iron", "anode_mass_kg": 27}),
    "wenner": (wenner_entry, {"spacing_m": 3.0, "resistance_ohm": 2.0}),
    "tank": (tank_entry, {"resistivity_ohm_m": 86, "tank_diameter_m": 1.167, "arrangement": "centre",
                          "anode_length_m": 0.2286, "anode_diameter_m": 0.0381, "count": 3, "spacing_m": 1.2192,
                          "current_A": 0.84}),
}

#: every other field each entry takes, with a good value of its own (alone it may still clash with VALID)
OPTIONAL = {
    "anodes": {"current_initial_A": 60, "current_mean_A": 40, "current_final_A": 50, "region": "temperate",
               "capacity_Ah_per_kg": 2000, "closed_circuit_V": -1.05, "utilisation": 0.85, "protection_V": -0.8,
               "structure": "carbon-steel"},
    "anode-resistance": {"periphery_m": 0.6, "width_m": 0.2, "area_m2": 0.36},
    "buried": {"area_m2": 400, "current_density_mA_per_m2": 20, "coating_efficiency": 0.9, "size_factor": 1.0,
               "anode_mass_kg": 7.7, "structure_potential_V_CSE": -0.9, "coating": "bare", "output_constant": 120000},
    "groundbed": {"orientation": "horizontal", "depth_m": 1.5, "paralleling": "sunde", "cable_length_m": 100,
                  "cable_ohm_per_km": 1.2, "cable_resistance_ohm": 0.1, "structure_resistance_ohm": 0.2,
                  "coating_resistance_ohm_m2": 250, "structure_area_m2": 1000, "back_emf_V": 2, "margin": 0.25,
                  "consumption_kg_per_A_yr": 0.45, "life_years": 20, "anode_rating_A": 2},
    "wenner": {},
    "tank": {"area_m2": 20, "wall_height_m": 1.5, "bottom": "ellipsoidal", "bottom_depth_m": 0.3,
             "current_density_mA_per_m2": 30, "coating_efficiency": 0.5, "circle_radius_m": 0.4,
             "equivalent_diameter_factor": 0.07, "fringe_factor": 0.48, "hoop_diameter_m": 0.6,
             "wire_diameter_m": 0.0016, "depth_m": 0.8, "life_years": 15, "anode_material": "high-silicon-cast-iron",
             "consumption_kg_per_A_yr": 0.45, "efficiency": 0.5, "anode_mass_kg": 2, "anode_rating_A": 0.5,
             "wire_rating_A_per_m": 0.3, "max_resistance_ohm": 50, "cable_length_m": 20, "cable_ohm_per_km": 8,
             "cable_resistance_ohm": 0.05, "structure_resistance_ohm": 0.0, "coating_resistance_ohm_m2": 10,
             "structure_area_m2": 20, "back_emf_V": 0, "margin": 0.25},
}
#: the fields each entry reads (its module's own list, the required ones first)
TAKES = {
    "anodes": galvanic.FIELDS,
    "anode-resistance": ("shape", "resistivity_ohm_m") + anodes.RESISTANCE_FIELDS,
    "buried": buried.FIELDS,
    "groundbed": impressed.FIELDS,
    "wenner": ("spacing_m", "resistance_ohm"),
    "tank": ("resistivity_ohm_m", "tank_diameter_m", "arrangement") + tankdesign.FIELDS,
}


def _cli_options():
    """command -> [(option, a good value as typed)] of the design commands, from VALID and OPTIONAL."""
    out = {}
    for name, (_, options) in clicp.OPTIONS.items():
        good = {**OPTIONAL[name], **VALID[name][1]}
        anode = good["anode"] if isinstance(good.get("anode"), dict) else {}
        out[name] = []
        for flag, field, _, _ in options:
            value = anode.get(field[len("anode."):]) if field.startswith("anode.") else good.get(field)
            if value is not None and not isinstance(value, (dict, list)):
                out[name].append((flag, str(value)))
    return out


#: the design commands' options with good values, for tests/test_robustness.py's run over the command line
CLI = _cli_options()


def test_every_field_of_every_design_entry_is_driven():
    for name, (_, valid) in VALID.items():
        assert set(valid) | set(OPTIONAL[name]) == set(TAKES[name]), name


def _finite(value):
    if isinstance(value, float):
        assert math.isfinite(value)
    elif isinstance(value, dict):
        for v in value.values():
            _finite(v)
    elif isinstance(value, list):
        for v in value:
            _finite(v)


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


@pytest.mark.parametrize("name", sorted(VALID))
def test_the_valid_request_gives_a_plain_json_result(name):
    func, req = VALID[name]
    out = func(json.loads(json.dumps(req)))
    json.dumps(out, allow_nan=False)
    _finite(out)


@pytest.mark.parametrize("name", sorted(VALID))
@settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(data=st.data())
def test_junk_gives_a_result_or_one_clear_error(name, data):
    func, valid = VALID[name]
    req = json.loads(json.dumps(valid))
    keys = sorted(valid) + sorted(OPTIONAL[name]) + ["extra"]
    for key in data.draw(st.lists(st.sampled_from(keys), min_size=1, max_size=4)):
        how = data.draw(st.integers(0, 2))
        if how == 0 and key in req:
            del req[key]
        elif how == 1 and key in OPTIONAL[name]:
            req[key] = OPTIONAL[name][key]
        else:
            req[key] = data.draw(JUNK)
    try:
        out = func(req)
    except InputError as exc:
        text = str(exc)
        assert "\n" not in text and text.startswith(exc.field)
        return
    json.dumps(out, allow_nan=False)
    _finite(out)


@settings(max_examples=200, deadline=None, suppress_health_check=[HealthCheck.function_scoped_fixture])
@given(data=st.data())
def test_junk_inside_the_zones_and_the_anode(data):
    req = json.loads(json.dumps(VALID["anodes"][1]))
    zone, anode = req["zones"][0], req["anode"]
    for target, keys in ((zone, ["area_m2", "depth_m", "coating", "zone", "name", "x"]),
                         (anode, ["net_mass_kg", "length_m", "radius_m", "standoff_m", "final", "width_m"])):
        for key in data.draw(st.lists(st.sampled_from(keys), max_size=2)):
            target[key] = data.draw(JUNK)
    if data.draw(st.booleans()):
        req["zones"].append(data.draw(JUNK))
    try:
        out = anodes_entry(req)
    except InputError as exc:
        assert "\n" not in str(exc) and str(exc).startswith(exc.field)
        return
    json.dumps(out, allow_nan=False)
    _finite(out)
