"""What the joint result tells the user beyond its numbers (calc.advice): warnings on the basis,
mitigations, alternatives and cautions, on the shipped dataset."""

import json

import pytest

from calc import advice as A
from calc import joint as J
from calc import series as S
from calc.dataset import current
from jointkit import SEA, env_with


@pytest.fixture(scope="module")
def ds():
    return current()


def test_anodic_index_basis_for_an_immersed_electrolyte_warns():
    # ASTM G82 §5 and the legacy table's scope (equipment in air): an immersed electrolyte needs a series
    basis = S.basis_of({"id": "demo-immersed", "name": "Demo tank", "basis": "anodic-index", "severity": "harsh",
                        "allowable_V": 0.15, "ionic_strength_mol_per_kg": 0.1})
    assert basis.immersed
    warnings = A.basis_warnings(basis)
    assert len(warnings) == 1 and "immersed" in warnings[0]["message"]


def test_mitigations_for_a_failing_immersed_joint():
    r = J.joint_entry({"a": "carbon steel", "b": "316", "env": SEA, "area_ratio": 20})
    ids = [m["id"] for m in r["mitigations"]]
    assert {"isolate", "coat-cathode", "noble-fastener", "cathodic-protection"} <= set(ids)
    coat = next(m for m in r["mitigations"] if m["id"] == "coat-cathode")
    assert "only the anode" in coat["text"]  # the caution: coating only the anode concentrates the attack
    assert all(set(m) == {"id", "text", "reason"} and m["reason"] for m in r["mitigations"])


def test_no_cathodic_protection_advice_in_air(ds):
    harsh = env_with(ds, basis="anodic-index", severity="harsh")
    r = J.joint_entry({"a": "carbon steel", "b": "316", "env": harsh})
    assert r["verdict"] == "unsuited"
    ids = [m["id"] for m in r["mitigations"]]
    assert "cathodic-protection" not in ids and "seal" in ids and "isolate" in ids


def test_cathodic_protection_advice_for_a_joint_in_soil(ds):
    # Buried steel is the classic case of cathodic protection: 49 CFR 192.455(a)(2) requires a cathodic
    # protection system on buried or submerged gas pipelines installed after July 31, 1971 (read), and
    # 49 CFR 192.453 its design by or under a person qualified in corrosion control (read).
    r = J.joint_entry({"a": "carbon steel", "b": "copper", "env": "buried-soil"})
    assert r["verdict"] == "unsuited"
    cp = next(m for m in r["mitigations"] if m["id"] == "cathodic-protection")
    assert "magnesium or zinc" in cp["text"] and "groundbed" in cp["text"] and "qualified" in cp["text"]
    assert "49 CFR 192" in cp["reason"] and "§192.455" in cp["reason"] and "§192.453" in cp["reason"]
    # the immersed wording stays for water, the soil wording is for soil only
    sea = J.joint_entry({"a": "carbon steel", "b": "copper", "env": SEA})
    assert "49 CFR" not in next(m for m in sea["mitigations"] if m["id"] == "cathodic-protection")["reason"]


def test_alternatives_pass_against_the_kept_partner(ds):
    r = J.joint_entry({"a": "carbon steel", "b": "316", "env": SEA})
    assert [x["replace"] for x in r["alternatives"]] == [r["a"], r["b"]]
    for alt in r["alternatives"]:
        opts = alt["options"]
        assert 0 < len(opts) <= A.N_ALTERNATIVES
        keys = [(S.TIERS.index(o["verdict"]), -o["margin_V"]) for o in opts]
        assert keys == sorted(keys)  # best tier first, then by margin
        for o in opts:
            assert o["verdict"] != "unsuited" and o["margin_V"] >= 0
            assert o["material"] not in (r["a"], r["b"])
            assert ds.get("materials", o["material"]).get("state") != "active"
            again = J.joint_entry({"a": o["material"], "b": alt["keep"], "env": SEA})
            assert again["verdict"] == o["verdict"] and again["delta_E_V"] == o["delta_E_V"]


def test_remembered_alternatives_equal_fresh_ones_and_follow_the_data(ds):
    """The ranked alternatives are remembered per dataset (they do not depend on the area ratio);
    a remembered answer equals a fresh one, and other data gives other alternatives."""
    from calc import dataset as D

    req = {"a": "aluminium 5083", "b": "316", "env": SEA, "area_ratio": 0.3}
    A._ALTERNATIVES_CACHE.clear()
    fresh = J.joint_entry(dict(req))
    for ar in (0.1, 2.0, 0.3):  # filled, then used
        again = J.joint_entry(dict(req, area_ratio=ar))
        assert again["alternatives"] == fresh["alternatives"]
    assert J.joint_entry(dict(req)) == fresh
    # a caller changing its result does not change the next one
    fresh["alternatives"][0]["options"][0]["margin_V"] = -99.0
    assert J.joint_entry(dict(req))["alternatives"][0]["options"][0]["margin_V"] != -99.0
    # the same request against other data: the best alternative of the first list made unsuited
    best = J.joint_entry(dict(req))["alternatives"][0]["options"][0]["material"]
    bundle = json.loads(json.dumps(D.current().bundle))
    for m in bundle["materials"]:
        if m["id"] == best:
            m["seawater_range_V_SCE"] = [-1.60, -1.55]
    old = D._current
    try:
        D.set_dataset(bundle)
        other = J.joint_entry(dict(req))["alternatives"][0]["options"]
        assert best not in [o["material"] for o in other]
    finally:
        D._current = old


def test_cautions_defer_to_standards_and_professionals():
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA})
    text = " ".join(r["cautions"]).lower()
    assert "screening" in text and "qualified corrosion professional" in text
    for word in ("crevices", "flow", "temperature", "biofilm", "coatings", "geometry", "potable", "pressure"):
        assert word in text



# ---------------------------------------------------------------- sacrificial by design

@pytest.mark.parametrize("anode,cathode,env,by_design", [
    ("zinc", "carbon steel", SEA, True),                     # a zinc anode on a steel hull
    ("galvanized steel", "cast iron", "marine-atmosphere", True),  # a zinc coating protects cut edges in air
    ("magnesium", "carbon steel", SEA, True),                # a magnesium anode in water
    ("magnesium", "carbon steel", "marine-atmosphere", False),  # no anode works in air
    ("aluminium-5083", "carbon steel", SEA, False),          # a structural aluminium alloy is no anode
    ("zinc", "copper", SEA, False),                          # zinc on copper protects no steel
])
def test_sacrificial_anodes_and_coatings_on_steel(ds, anode, cathode, env, by_design):
    # Common practice of cathodic protection: zinc, magnesium and aluminium anode alloys, and zinc
    # coatings, protect steel by corroding in its place
    basis = S.basis_of(ds.get("environments", env), ds)
    out = A.sacrificial_by_design(ds.get("materials", anode), ds.get("materials", cathode), basis)
    assert (out is not None) == by_design
    if by_design:
        assert out["source"] == "common-practice" and "sacrificial by design" in out["text"]
        assert out["anode"] == ds.get("materials", anode)["id"]
