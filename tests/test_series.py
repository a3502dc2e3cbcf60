"""Galvanic series positions and the verdict tiers (calc.series), on the shipped dataset."""

import pytest

from calc import series as S
from calc.dataset import current


@pytest.mark.parametrize("limit", [0.15, 0.25, 0.50])
def test_tier_boundaries(limit):
    # legacy anodic-index table limits 0.15 / 0.25 / 0.50 V, inclusive; float noise (0.65 - 0.50) must pass
    assert S.tier_for(limit, limit, limit) == "compatible"
    assert S.tier_for(0.65 - 0.50, 0.65 - 0.50, 0.15) == "compatible"
    assert S.tier_for(limit + 0.001, limit + 0.001, limit) == "unsuited"
    assert S.tier_for(limit - 0.01, limit + 0.01, limit) == "guarded"
    assert S.tier_for(0.05, 0.05, limit, 0.05) == "matched"
    assert S.tier_for(0.051, 0.051, limit, 0.05) == "compatible"



def test_position_is_the_midpoint_of_the_published_range():
    # ASTM G82-98 (R2014) Fig. 1 gives ranges; the nominal potential is their mid-point (calc.series.midpoint)
    ds = current()
    basis = S.basis_of(ds.get("environments", "seawater-flowing"), ds)
    for rec in ds.records("materials"):
        p = S.position(rec, basis)
        if p is not None:
            assert p.nominal == S.midpoint(rec["seawater_range_V_SCE"])
            assert p.low <= p.nominal <= p.high


def test_other_state_failing_lowers_the_verdict_to_guarded():
    # the tier rule's state_fail: passive 316 with Ni-Cu alloy 400 passes as named (ASTM G82-98 (R2014) Fig. 1
    # after LaQue 1975, as restated by the Australasian Corrosion Association: 316 passive 0.00 to -0.10 V SCE,
    # alloy 400 -0.03 to -0.14 V SCE, worst case 0.14 V within the 0.15 V allowed), its active state (-0.33 to
    # -0.46 V SCE) does not
    ds = current()
    basis = S.basis_of(ds.get("environments", "seawater-flowing"), ds)
    j = S.judge_pair(ds, ds.get("materials", "alloy-400"), ds.get("materials", "316"), basis)
    assert j.primary.tier in ("matched", "compatible") and j.tier == "guarded" and j.state_demoted
    assert j.worst.tier == "unsuited" and j.combos[0] == j.primary


# ---------------------------------------------------------------- the allowable difference: one rule

def _envs():
    ds = current()
    return ds, [S.basis_of(e, ds) for e in ds.records("environments")]


def test_every_environment_takes_the_allowance_of_its_severity_class():
    # legacy anodic-index table, as read in its reproductions (anodic-index-legacy): harsh 0.15 V, normal 0.25 V,
    # controlled 0.50 V; each environment names its class and carries that value, read, with where it stands
    ds, bases = _envs()
    classes = {"harsh": 0.15, "normal": 0.25, "controlled": 0.50}
    for e, b in zip(ds.records("environments"), bases):
        assert e.get("severity") in classes, e["id"]
        assert b.allowable_V == pytest.approx(classes[e["severity"]]), e["id"]
        assert e["allowable_source"] == "anodic-index-legacy" and e["allowable_confidence"] == "read"
        assert e["severity"] in e["allowable_where"] and f"{classes[e['severity']]:.2f}" in e["allowable_where"]


def test_immersed_and_buried_environments_take_the_harsh_class_with_its_source():
    # ESA's restatement of ECSS-Q-70-71 (esa-bimetallic-couples): only level 0 holds in immersion in salt water,
    # level 1 (an uncontrolled workshop) excludes immersion; so immersion takes the strictest class (calc.scope)
    ds, bases = _envs()
    immersed = [(e, b) for e, b in zip(ds.records("environments"), bases) if b.kind == "galvanic-series"]
    assert {e["id"] for e, _ in immersed} >= {"seawater-flowing", "seawater-quiescent", "brackish-water",
                                              "fresh-water", "buried-soil"}
    for e, b in immersed:
        assert e["severity"] == "harsh" and e["severity_source"] == "esa-bimetallic-couples", e["id"]
        assert e["severity_confidence"] == "read" and "immersion" in e["severity_where"]
        assert "immersion" in b.allowable_note and "MIL-DTL-14072F" in b.allowable_note


def test_immersion_is_never_judged_more_leniently_than_any_atmosphere():
    # the rule across the dataset: for every immersed or buried environment and every atmosphere, the same
    # difference (nominal and worst case) never gets a better tier in the water than in the air
    ds, bases = _envs()
    wet = [b for b in bases if b.kind == "galvanic-series"]
    air = [b for b in bases if b.kind == "anodic-index"]
    assert wet and air
    steps = [k / 100 for k in range(0, 81)]
    for w in wet:
        for a in air:
            assert w.allowable_V <= a.allowable_V + S.EPS_V, (w.env_id, a.env_id)
            assert (w.negligible_V or 0) <= (a.negligible_V or 0) + S.EPS_V, (w.env_id, a.env_id)
            for d in steps:
                for spread in (0.0, 0.05, 0.12):
                    tw = S.tier_for(d, d + spread, w.allowable_V, w.negligible_V)
                    ta = S.tier_for(d, d + spread, a.allowable_V, a.negligible_V)
                    assert S.TIER_RANK[tw] >= S.TIER_RANK[ta], (w.env_id, a.env_id, d, spread, tw, ta)


def test_the_negligible_band_is_one_group_of_the_index_table():
    # MIL-DTL-14072F §3.13 (public copy): Table VI groups metals whose potentials against SCE in sea-water agree
    # within 0.05 V; a difference within one group is taken as negligible, in every environment alike
    ds, bases = _envs()
    for e, b in zip(ds.records("environments"), bases):
        assert b.negligible_V == pytest.approx(0.05), e["id"]
        assert e["negligible_source"] == "mil-dtl-14072f" and "0.05 volt" in e["negligible_where"]


@pytest.mark.parametrize("env, code", [("buried-soil", "series-other-electrolyte"),
                                       ("fresh-water", "series-other-electrolyte"),
                                       ("brackish-water", "series-other-electrolyte"),
                                       ("seawater-quiescent", "series-other-conditions")])
def test_a_series_used_outside_its_electrolyte_says_so_with_its_basis(env, code):
    # ASTM G82-98 (R2014) §5 and MIL-STD-889B Notice 1 (1979) §5.1.2 (read): a galvanic series applies to the
    # electrolyte it was measured in; soil and fresh water are not seawater
    from calc.scope import series_caveat

    ds = current()
    b = S.basis_of(ds.get("environments", env), ds)
    caveat = series_caveat(b)
    assert caveat["code"] == code and "ASTM G82" in caveat["basis"] and "§5" in caveat["basis"]
    assert series_caveat(S.basis_of(ds.get("environments", "seawater-flowing"), ds)) is None
    assert series_caveat(S.basis_of(ds.get("environments", "marine-atmosphere"), ds)) is None
