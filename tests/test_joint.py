"""The judgement of one joint (calc.joint), on the shipped dataset."""

import inspect
import json
import re

import pytest
from hypothesis import HealthCheck, given, settings
from hypothesis import strategies as st

from calc import advice as A
from calc import api
from calc import joint as J
from calc import matrix as M
from calc import rate as g102
from calc.screen import screen
from calc import series as S
from calc.dataset import current
from calc.errors import InputError
from jointkit import ENVS, NAMES, SEA, env_with, mid


@pytest.fixture(scope="module")
def ds():
    return current()


# ---------------------------------------------------------------- lookups


def test_materials_resolve_by_id_alias_and_uns(ds):
    by_uns = J.joint_entry({"a": "s31600", "b": "r50400", "env": SEA})
    by_alias = J.joint_entry({"a": "316", "b": "CP Titanium", "env": "Flowing Seawater"})
    assert by_uns["a"] == by_alias["a"] == ds.get("materials", "S31600")["id"]
    assert ds.get("materials", by_uns["a"])["state"] == "passive"
    assert by_uns["b"] == by_alias["b"] == ds.get("materials", "R50400")["id"]
    assert by_uns["env"] == by_alias["env"] == SEA


def test_unknown_material_gives_closest_matches():
    out = api.call("joint", {"a": "titanum", "b": "zinc", "env": SEA})
    assert not out["ok"] and out["error"]["field"] == "a"
    assert "titanium" in out["error"]["message"]


def test_unknown_environment():
    out = api.call("joint", {"a": "titanium", "b": "zinc", "env": "lava"})
    assert not out["ok"] and out["error"]["field"] == "env"


def test_material_without_data_for_the_basis_is_refused(ds):
    gold = ds.get("materials", "gold")
    assert gold.get("seawater_range_V_SCE") is None  # the series has no gold row (ASTM G82 Fig. 1)
    out = api.call("joint", {"a": "gold", "b": "zinc", "env": SEA})
    assert not out["ok"] and out["error"]["field"] == "a" and "galvanic series" in out["error"]["message"]


def test_unknown_and_missing_fields():
    assert api.call("joint", {"a": "zinc", "b": "copper", "env": SEA, "ratio": 2})["error"]["field"] == "ratio"
    assert api.call("joint", {"a": "zinc", "env": SEA})["error"]["field"] == "b"
    assert api.call("joint", {"a": "zinc", "b": "copper"})["error"]["field"] == "env"


# ---------------------------------------------------------------- the galvanic series


# ASTM G82-98 (R2014) Fig. 1, reproducing LaQue (Marine Corrosion, 1975), flowing seawater: from the
# active end, magnesium, zinc, aluminium alloys, mild steel, copper, 316 (passive), titanium, graphite
SEAWATER_ORDER = ["magnesium", "zinc", "aluminium 5083", "carbon steel", "copper", "S31600", "R50400", "graphite"]


@pytest.mark.parametrize("active,noble", list(zip(SEAWATER_ORDER, SEAWATER_ORDER[1:])))
def test_seawater_series_order(ds, active, noble):
    # ASTM G82-98 (R2014) Fig. 1 (after LaQue 1975): each metal is anodic to the next
    r = J.joint_entry({"a": noble, "b": active, "env": SEA})
    assert r["anode"] == ds.get("materials", active)["id"]
    assert r["cathode"] == ds.get("materials", noble)["id"]
    # the series' own warnings are about recalled positions only; the service judgement's are coded
    assert all("recalled" in w["message"] for w in r["warnings"] if "code" not in w)


def test_carbon_steel_on_passive_316_in_seawater_fails(ds):
    # ASTM G82-98 (R2014) Fig. 1 (after LaQue 1975): mild steel -0.60 to -0.72 V SCE, 316 passive 0.00 to
    # -0.10 V SCE: steel is the anode, ΔE of the mid-points 0.61 V, far above the 0.15 V allowed in immersion
    # (the harsh class of the legacy anodic-index table, read in its reproductions: calc.scope.IMMERSION_RULE)
    r = J.joint_entry({"a": "carbon steel", "b": "316", "env": SEA})
    assert r["anode"] == ds.get("materials", "carbon steel")["id"]
    assert r["delta_E_V"] == pytest.approx(0.61, abs=0.005)
    assert r["delta_E_range_V"] == pytest.approx([0.50, 0.72], abs=0.005)
    assert r["verdict"] == "unsuited" and r["passes"] is False
    assert r["allowable_V"] == pytest.approx(0.15) and r["allowable_source"] == "anodic-index-legacy"


def test_titanium_with_passive_316_is_a_small_difference(ds):
    # common practice: titanium and passive austenitic stainless steel sit close in seawater; acceptable
    r = J.joint_entry({"a": "titanium", "b": "316", "env": SEA})
    assert r["delta_E_V"] <= 0.10
    # fully determined by the two published ranges (ASTM G82-98 Fig. 1 after LaQue 1975, as the records hold
    # them): the difference of the mid-points
    assert r["delta_E_V"] == pytest.approx(abs(mid(ds, "titanium") - mid(ds, "316")), abs=1e-4)
    assert r["passes"] is True and r["verdict"] != "unsuited"
    # ... but 316 has an active state (ASTM G82 Fig. 1, -0.33 to -0.46 V): judged too, the worse one stated
    active = ds.get("materials", "316")["other_state"]
    assert r["worst_state"]["b"] == active and r["worst_state"]["verdict"] == "unsuited"
    # the ranges allow up to 0.16 V (titanium +0.06 to -0.04, 316 passive 0.00 to -0.10 V SCE), past the 0.15 V
    # allowed in immersion: guarded by the ranges already, before the state check
    assert r["delta_E_range_V"][1] == pytest.approx(0.16, abs=0.005)
    assert r["verdict"] == "guarded" and "ranges" in r["verdict_text"]


def test_both_dual_state_parts_give_four_combinations(ds):
    r = J.joint_entry({"a": "304", "b": "316", "env": SEA})
    assert len(r["states"]) == 4
    pairs = {(s["a"], s["b"]) for s in r["states"]}
    assert len(pairs) == 4
    assert r["states"][0]["a"] == r["a"] and r["states"][0]["b"] == r["b"]
    worst = max(r["states"], key=lambda s: (S.TIERS.index(s["verdict"]), s["delta_E_V"]))
    assert r["worst_state"] == worst


def test_range_best_and_worst(ds):
    # best = gap between the published ranges (0 when they overlap), worst = largest separation
    r = J.joint_entry({"a": "copper", "b": "tin", "env": SEA})
    cu, sn = ds.get("materials", "copper")["seawater_range_V_SCE"], ds.get("materials", "tin")["seawater_range_V_SCE"]
    assert r["delta_E_range_V"][0] == 0.0  # the copper and tin ranges overlap (ASTM G82 Fig. 1)
    assert r["delta_E_range_V"][1] == pytest.approx(max(cu[1] - sn[0], sn[1] - cu[0]), abs=1e-9)


def test_series_used_outside_its_electrolyte_warns(ds):
    # ASTM G82-98 (R2014) §5: a galvanic series is specific to the environment it was measured in
    env = env_with(ds, basis="galvanic-series", series=SEA, id="seawater-quiescent")
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": env})
    assert any("ASTM G82" in w["message"] and w["field"] == "env" for w in r["warnings"])
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA})
    assert not any("ASTM G82" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------- anodic-index limits


def _index_pair(ds, a, b, delta):
    ia, ib = ds.get("materials", a)["anodic_index_V"], ds.get("materials", b)["anodic_index_V"]
    assert abs(ia - ib) == pytest.approx(delta, abs=1e-9), (a, b, ia, ib)


def test_anodic_index_harsh_boundary_is_inclusive(ds):
    # legacy anodic-index table: silver 0.15 V, nickel 0.30 V, titanium 0.30 V, 18 % Cr steels 0.50 V;
    # harsh environments allow ΔE ≤ 0.15 V (limit inclusive)
    harsh = env_with(ds, basis="anodic-index", severity="harsh")
    _index_pair(ds, "silver", "nickel", 0.15)
    r = J.joint_entry({"a": "silver", "b": "nickel", "env": harsh})
    assert r["allowable_V"] == pytest.approx(0.15)
    assert r["passes"] is True and r["verdict"] == "compatible"
    _index_pair(ds, "titanium", "316", 0.20)
    r = J.joint_entry({"a": "titanium", "b": "316", "env": harsh})
    assert r["passes"] is False and r["verdict"] == "unsuited"
    assert r["anode"] == ds.get("materials", "316")["id"]  # the larger index is the anode


def test_anodic_index_normal_boundary(ds):
    # legacy anodic-index table: normal environments allow ΔE ≤ 0.25 V; copper 0.35, chromium plate 0.60,
    # titanium 0.30, 18 % Cr steels 0.50, tin-lead solder 0.65
    normal = env_with(ds, basis="anodic-index", severity="normal")
    _index_pair(ds, "titanium", "316", 0.20)
    assert J.joint_entry({"a": "titanium", "b": "316", "env": normal})["passes"] is True
    _index_pair(ds, "copper", "chrome plate", 0.25)
    r = J.joint_entry({"a": "copper", "b": "chrome plate", "env": normal})
    assert r["passes"] is True and r["verdict"] == "compatible"
    _index_pair(ds, "titanium", "tin-lead solder", 0.35)
    assert J.joint_entry({"a": "titanium", "b": "tin-lead solder", "env": normal})["verdict"] == "unsuited"


def test_anodic_index_controlled_boundary(ds):
    # legacy anodic-index table: controlled environments allow ΔE ≤ 0.50 V; gold 0.00, 18 % Cr steels 0.50,
    # chromium plate 0.60
    controlled = env_with(ds, basis="anodic-index", severity="controlled")
    _index_pair(ds, "gold", "316", 0.50)
    assert J.joint_entry({"a": "gold", "b": "316", "env": controlled})["passes"] is True
    _index_pair(ds, "gold", "chrome plate", 0.60)
    assert J.joint_entry({"a": "gold", "b": "chrome plate", "env": controlled})["passes"] is False


# ---------------------------------------------------------------- area ratio and rate


def test_small_anode_on_large_cathode_corrodes_faster():
    # F. Mansfeld, Corrosion 27 (1971) 436, Case 3 (abstract, the catchment principle): with both cathodic
    # reactions diffusion-limited the anode dissolves at i_L·(1 + A_c/A_a), so ratios 10 and 0.1 differ by 11/1.1
    small_anode = J.joint_entry({"a": "carbon steel", "b": "316", "env": SEA, "area_ratio": 10})
    large_anode = J.joint_entry({"a": "carbon steel", "b": "316", "env": SEA, "area_ratio": 0.1})
    hi, lo = small_anode["rate_mm_per_year"], large_anode["rate_mm_per_year"]
    assert hi[0] > lo[0] and hi[1] > lo[1]
    assert hi[0] / lo[0] == pytest.approx(11 / 1.1, rel=1e-4)
    assert small_anode["attack_mm_per_year"] > large_anode["attack_mm_per_year"]


def test_rate_is_g102_of_the_upper_bound_current(ds):
    # i_a = i_L·(1 + A_c/A_a) (Mansfeld 1971, Case 3), converted by ASTM G102 Eq. (1) with the anode's EW and
    # density; i_L from the service conditions (the environment's defaults here)
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA, "area_ratio": 3})
    assert r["rate"]["kind"] == "upper-bound screen" and r["rate"]["anode"] == ds.get("materials", "zinc")["id"]
    i_l = r["oxygen_supply"]["i_L_uA_per_cm2"]
    assert r["rate"]["limiting_current_from"] == "service conditions"
    zn = g102.rate_entry({"material": "zinc", "current_density_uA_per_cm2": i_l * 4})["penetration_mm_per_year"]
    assert r["rate_mm_per_year"] == pytest.approx([zn, zn], rel=1e-5)
    assert "upper bound" in r["rate"]["note"] and "own" in r["rate"]["note"]
    assert any("upper-bound screen" in a for a in r["assumptions"])
    # the mixed-potential answer never exceeds the upper bound
    assert r["attack_mm_per_year"] <= zn


def test_rate_from_the_environment_range_without_a_service_model(ds):
    # buried soil has no service model: the screen takes the environment's published range, i_c·(1 + A_c/A_a)
    env = ds.get("environments", "buried-soil")
    lo, hi = env["cathodic_current_density_uA_per_cm2"]
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": "buried-soil", "area_ratio": 3})
    assert r["rate"]["limiting_current_from"] == "environment range" and r["assessment"] is None
    zn_lo = g102.rate_entry({"material": "zinc", "current_density_uA_per_cm2": lo * 4})["penetration_mm_per_year"]
    zn_hi = g102.rate_entry({"material": "zinc", "current_density_uA_per_cm2": hi * 4})["penetration_mm_per_year"]
    assert r["rate_mm_per_year"] == pytest.approx([zn_lo, zn_hi], rel=1e-5)
    assert "no service model" in r["assessment_reason"]


def test_no_rate_without_a_current_density(ds):
    harsh = env_with(ds, basis="anodic-index", severity="harsh")
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": harsh})
    assert r["rate_mm_per_year"] is None and r["rate"] is None and r["rate_reason"]


def test_no_rate_for_an_anode_without_equivalent_weight(ds):
    # graphite has no equivalent weight in the dataset; a graphite anode needs a nobler partner: platinum's
    # range overlaps graphite's, so pick the pair where graphite comes out as the anode, if any
    graphite = ds.get("materials", "graphite")
    assert graphite.get("equivalent_weight_g") is None
    basis = S.basis_of(ds.get("environments", SEA))
    fake = S.Pairing("graphite", "x", "graphite", "x", 0.3, 0.2, 0.4, "unsuited")
    rate, reason = screen(ds.get("environments", SEA), basis, fake, 1.0, {"graphite": "Graphite", "x": "x"},
                          {"graphite": graphite})
    assert rate is None and "Graphite" in reason


def test_area_ratio_assumed_one_when_not_given():
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA})
    assert r["area_ratio"] == 1.0 and r["area_ratio_given"] is False
    assert any("area_ratio not given" in a for a in r["assumptions"])


@pytest.mark.parametrize("value", [0, -1, float("nan"), float("inf"), "2", True, [2]])
def test_area_ratio_must_be_positive_and_finite(value):
    with pytest.raises(InputError) as exc:
        J.joint_entry({"a": "zinc", "b": "copper", "env": SEA, "area_ratio": value})
    assert exc.value.field == "area_ratio"


@pytest.mark.parametrize("value,warns", [(1000, False), (1000.5, True), (0.001, False), (0.0009, True)])
def test_area_ratio_extremes_warn(value, warns):
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA, "area_ratio": value})
    assert any(w["field"] == "area_ratio" for w in r["warnings"]) is warns


# ---------------------------------------------------------------- the result


def test_result_shape_and_json(ds):
    r = J.joint_entry({"a": "zinc", "b": "copper", "env": SEA, "area_ratio": 4})
    for key in ("anode", "cathode", "basis", "delta_E_V", "delta_E_range_V", "allowable_V", "negligible_V",
                "verdict", "verdict_text", "mitigations", "alternatives", "cautions", "steps", "sources",
                "data_version", "assumptions", "warnings", "rate_mm_per_year"):
        assert key in r, key
    assert r["basis"] == "galvanic-series" and r["basis_description"] and r["series"] == SEA
    assert r["basis_source"] == ds.get("materials", "zinc")["seawater_source"]
    assert r["verdict"] in S.TIERS and r["verdict_text"].endswith(".")
    assert all(set(s) == {"title", "formula", "substituted", "result"} for s in r["steps"])
    assert r["data_version"] == ds.version
    for sid in r["sources"]:
        assert ds.source(sid) is not None, sid
    json.dumps(r, allow_nan=False)


def test_same_material_is_no_couple():
    r = J.joint_entry({"a": "copper", "b": "Cu", "env": SEA})
    assert r["anode"] is None and r["delta_E_V"] == 0 and r["rate_mm_per_year"] is None
    assert r["verdict"] in ("matched", "compatible")


# ---------------------------------------------------------------- robustness and documentation


_RATIOS = st.one_of(st.none(), st.floats(allow_nan=True, allow_infinity=True), st.integers(), st.text(max_size=3))


@settings(max_examples=60, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(a=NAMES, b=NAMES, env=ENVS, ratio=_RATIOS)
def test_joint_any_input_gives_a_result_or_a_clear_error(a, b, env, ratio):
    req = {"a": a, "b": b, "env": env}
    if ratio is not None:
        req["area_ratio"] = ratio
    out = api.call("joint", req)
    if out["ok"]:
        json.dumps(out["result"], allow_nan=False)
    else:
        assert out["error"]["field"] and out["error"]["message"]


def _public_functions(module):
    for name, fn in inspect.getmembers(module, inspect.isfunction):
        if not name.startswith("_") and fn.__module__ == module.__name__:
            yield name, fn


@pytest.mark.parametrize("module", [J, g102, S, A, M], ids=["joint", "rate", "series", "advice", "matrix"])
def test_public_functions_document_units_references_and_examples(module):
    for name, fn in _public_functions(module):
        doc = inspect.getdoc(fn) or ""
        assert ">>>" in doc, f"{name}: no doctest example"
        for param in inspect.signature(fn).parameters:
            m = re.search(rf"^\s*{param}: (.+)$", doc, re.M)
            assert m, f"{name}: parameter {param} has no description"
            assert re.search(r"\[[^\]]+\]\s*$", m.group(1)), f"{name}: parameter {param} has no [unit]"
        if fn.__code__.co_argcount:
            assert "References:" in doc, f"{name}: no references"
