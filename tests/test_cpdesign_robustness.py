"""The design entry points under arbitrary input: a plain-JSON result or one InputError, never another exception.

Until the entries join ``calc.api.ENTRY_POINTS`` (and so ``tests/test_robustness.py``), this file
drives them the same way: valid requests with fields replaced by junk (missing, wrong types, NaN,
±Infinity, huge and tiny numbers, negative values, unknown names, nested junk).
"""

import json
import math

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc.cpdesign import anode_resistance_entry, anodes_entry, buried_entry, groundbed_entry, wenner_entry
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
}


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
    for key in data.draw(st.lists(st.sampled_from(sorted(valid) + ["extra"]), min_size=1, max_size=3)):
        if data.draw(st.booleans()) and key in req:
            del req[key]
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
