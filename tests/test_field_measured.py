"""calc.field.measured: a joint judged from two potentials measured on site.

Sources named beside each check: ASTM G82-98 §6 and Fig. 1 (after LaQue 1975); SCE 0.2412 V vs
SHE at 25 °C (Sawyer et al. 1995); CSE 0.316 V (Szabó & Bakos 2010); the allowable and negligible
differences as environments.yaml gives them, with their sources.
"""

import pytest

from calc import api
from calc.field.measured import measured_joint_entry
from calc.field.seawater import brackish_shift


@pytest.fixture(autouse=True)
def _shipped(shipped):
    return shipped


def test_measured_joint_puts_both_readings_on_the_sce_scale():
    # SCE 0.2412 V vs SHE at 25 °C (Sawyer et al. 1995); CSE 0.316 V (Szabó & Bakos 2010)
    r = measured_joint_entry({"a_name": "pipe", "a_reading_V": -0.70, "b_name": "valve", "b_reading_V": -0.40,
                              "electrode": "CSE", "env": "fresh-water", "temp_C": 25})
    assert r["a_V_SCE"] == pytest.approx(-0.70 + 0.316 - 0.2412, abs=1e-9)
    assert r["b_V_SCE"] == pytest.approx(-0.40 + 0.316 - 0.2412, abs=1e-9)
    assert r["scale"] == "SCE"


# ---------------------------------------------------------------- measured joint

def joint_req(a, b, env="seawater-flowing", **kw):
    req = {"a_name": "part A", "a_reading_V": a, "b_name": "part B", "b_reading_V": b, "electrode": "SCE",
           "env": env, "temp_C": 20}
    req.update(kw)
    return measured_joint_entry(req)


def test_anode_is_the_more_negative_part():
    # ASTM G82-98 §6: the more active metal of a couple is the anode
    r = joint_req(-0.30, -0.62)
    assert r["anode"] == "part B" and r["cathode"] == "part A" and r["anode_part"] == "b"
    assert r["delta_E_V"] == pytest.approx(0.32, abs=1e-9)
    equal = joint_req(-0.4, -0.4)
    assert equal["anode"] is None and equal["verdict"] == "matched"


def _env(eid):
    from calc.dataset import current

    return next(e for e in current().records("environments") if e["id"] == eid)


def test_measured_limits_inclusive():
    # the allowable and negligible differences of flowing seawater as the record gives them, with their
    # sources (environments.yaml: the legacy anodic-index table's harsh class, 0.15 V; MIL-DTL-14072F
    # §3.13, 0.05 V, both read): the rule checked here is that both limits are inclusive
    env = _env("seawater-flowing")
    allow, negl = env["allowable_V"], env["negligible_V"]
    assert (allow, negl) == (0.15, 0.05)
    assert joint_req(-0.25 - allow, -0.25)["verdict"] == "compatible"
    assert joint_req(-0.25 - allow - 1e-4, -0.25)["verdict"] == "unsuited"
    assert joint_req(-0.25 - negl, -0.25)["verdict"] == "matched"
    assert joint_req(-0.25 - negl - 1e-4, -0.25)["verdict"] == "compatible"
    # the difference does not depend on the electrode or its temperature
    for el in ("CSE", "Ag/AgCl seawater", "Zn seawater"):
        assert joint_req(-0.25 - allow, -0.25, electrode=el, temp_C=8)["verdict"] == "compatible"


def test_tiers_are_those_of_calc_joint():
    from calc.series import TIERS  # the tiers calc.joint judges with

    seen = {joint_req(a, b)["verdict"] for a, b in ((-0.3, -0.28), (-0.3, -0.45), (-0.1, -0.6))}
    assert seen <= set(TIERS) and len(seen) == 3


def test_guarded_when_a_passive_part_can_turn_active():
    # 316 passive 0.00 to -0.10, active -0.33 to -0.46 V vs SCE; titanium +0.06 to -0.04
    # (ASTM G82 Fig. 1 after LaQue 1975): the active state would widen the gap beyond the allowable
    r = joint_req(-0.10, 0.05, a_material="stainless-316-passive", b_material="titanium")
    assert r["delta_E_V"] == pytest.approx(0.15, abs=1e-9) and r["verdict"] == "guarded"
    assert r["state_check"][0]["fails"] is True and "turns active" in r["verdict_text"]


def test_published_judgement_beside_and_disagreement():
    # mild steel and 316 passive: the published series says unsuited (ASTM G82 Fig. 1); two readings
    # 0.12 V apart (an example of our own) are within the 0.15 V allowed (environments.yaml, read), guarded
    # only because the 316 could turn active: the site measurement wins, with the reason
    from calc.joint import judge_joint

    r = joint_req(-0.62, -0.50, a_material="carbon-steel", b_material="stainless-316-passive")
    pub = judge_joint("carbon-steel", "stainless-316-passive", "seawater-flowing").to_dict()
    assert r["published"]["verdict"] == pub["verdict"] == "unsuited"
    assert r["verdict"] == "guarded" and r["state_check"][0]["fails"] is True and r["agreement"] is False
    assert "site measurement wins" in r["agreement_text"]
    assert any(w["field"] == "b_reading_V" and "outside the published range" in w["message"] for w in r["warnings"])
    agree = joint_req(-0.66, -0.05, a_material="carbon-steel", b_material="stainless-316-passive")
    assert agree["agreement"] is True and agree["verdict"] == "unsuited"


def test_anode_disagreement_is_named():
    # zinc is the anode to steel in the published series (ASTM G82 Fig. 1); readings that invert them
    r = joint_req(-0.60, -0.70, a_material="zinc", b_material="carbon-steel")
    assert r["anode"] == "part B" and r["published"]["anode_part_name"] == "part A"
    assert r["agreement"] is False and "the anode" in r["agreement_text"]


def test_one_material_only_warns():
    r = joint_req(-0.6, -0.3, a_material="carbon-steel")
    assert r["published"] is None and any(w["field"] == "b_material" for w in r["warnings"])


def test_brackish_measured_joint():
    r = joint_req(-0.7, -0.3, env="brackish-water", electrode="Ag/AgCl seawater")
    assert any(w["field"] == "salinity" for w in r["warnings"])
    s = joint_req(-0.7, -0.3, env="brackish-water", electrode="Ag/AgCl seawater", salinity=10)
    assert s["delta_E_V"] == r["delta_E_V"]  # the correction cancels in the difference
    assert s["a_V_SCE"] == pytest.approx(r["a_V_SCE"] + brackish_shift(10, 20), abs=1e-6)


BAD_MEASURED = [
    ({"a_reading_V": "minus"}, "a_reading_V"),
    ({"b_reading_V": float("nan")}, "b_reading_V"),
    ({"a_name": ""}, "a_name"),
    ({"b_name": "x" * 101}, "b_name"),
    ({"b_name": 7}, "b_name"),
    ({"a_reading_V": 1.5}, "a_reading_V"),  # +1.74 V vs SHE
    ({"b_reading_V": -2.6}, "b_reading_V"),  # below magnesium: no corrosion potential there
    ({"electrode": "calomel"}, "electrode"),
    ({"env": "mars"}, "env"),
    ({"a_material": "kryptonite"}, "a_material"),
    ({"b_material": ""}, "b_material"),
    ({"temp_C": -1}, "temp_C"),
    ({"salinity": 50}, "salinity"),
    ({"extra": 1}, "extra"),
]


@pytest.mark.parametrize("change, field", BAD_MEASURED, ids=[f"{f}-{i}" for i, (_, f) in enumerate(BAD_MEASURED)])
def test_bad_measured_input_names_the_field(change, field):
    req = {"a_name": "pile", "a_reading_V": -0.65, "b_name": "ladder", "b_reading_V": -0.10, "electrode": "SCE",
           "env": "seawater-flowing"}
    req.update(change)
    out = api.call("measured", req)
    assert out["ok"] is False and out["error"]["field"] == field, out


def test_service_conditions_without_the_materials_are_not_silently_ignored():
    """Conditions act only on the published-series judgement; without both materials the result says so."""
    from calc import api

    req = {"a_name": "pile", "a_reading_V": -0.70, "b_name": "ladder", "b_reading_V": -0.66, "electrode": "SCE",
           "env": "seawater-flowing"}
    plain = api.call("measured", req)["result"]
    flowing = api.call("measured", dict(req, velocity_m_s=3.0))["result"]
    assert not [w for w in plain["warnings"] if w["field"] == "a_material"]
    said = [w["message"] for w in flowing["warnings"] if w["field"] == "a_material"]
    assert said and "velocity_m_s" in said[0] and "both materials" in said[0]
