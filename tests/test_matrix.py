"""The pair table (calc.matrix), on the shipped dataset."""

import csv
import io
import json
import time

import pytest
from hypothesis import given, settings
from hypothesis import strategies as st

from calc import api
from calc import joint as J
from calc import matrix as M
from calc import series as S
from calc.dataset import current
from jointkit import ENVS, NAMES, SEA, env_with, mid


@pytest.fixture(scope="module")
def ds():
    return current()


def test_every_pair_anode_is_the_lower_potential(ds):
    # Invariant over the whole table: the anode of every couple has the more negative mid-point
    m = M.matrix_entry({"env": SEA})
    ids = m["materials"]
    mids = {i: mid(ds, i) for i in ids}
    assert m["pair_fields"] == ["a", "b", "delta_E_V", "verdict", "anode"]
    for i, j, delta, verdict, anode in m["pairs"]:
        a, b = ids[i], ids[j]
        if abs(mids[a] - mids[b]) < 1e-9:
            assert anode is None
        else:
            assert ids[anode] == (a if mids[a] < mids[b] else b)
            assert delta == pytest.approx(abs(mids[a] - mids[b]), abs=1e-4)


def test_matrix_defaults_to_every_material_with_data(ds):
    for env in (SEA, env_with(ds, basis="anodic-index", severity="harsh")):
        m = M.matrix_entry({"env": env})
        field = "seawater_range_V_SCE" if m["basis"] == "galvanic-series" else "anodic_index_V"
        expected = [r["id"] for r in ds.records("materials") if r.get(field) is not None]
        assert m["materials"] == expected
        n = len(expected)
        # every pair once, a before b in the order of the materials; a material with itself is no pair
        assert [(p[0], p[1]) for p in m["pairs"]] == [(i, j) for i in range(n) for j in range(i + 1, n)]
        assert all(p[4] in (None, p[0], p[1]) and p[3] in S.TIERS for p in m["pairs"])
        assert sum(m["counts"].values()) == len(m["pairs"])
        assert "csv" not in m  # made only when asked for


def test_matrix_agrees_with_joint(ds):
    m = M.matrix_entry({"env": SEA})
    ids = m["materials"]
    n = len(ids)
    pairs = [(i, j) for i in range(n) for j in range(i + 1, n) if (i * 7 + j * 3) % 23 == 0]
    pairs += [(ids.index(ds.get("materials", "316")["id"]), j) for j in range(n)]
    cells = {(p[0], p[1]): p for p in m["pairs"]}
    for i, j in pairs:
        if i == j:
            continue
        r = J.joint_entry({"a": ids[i], "b": ids[j], "env": SEA})
        _, _, delta, verdict, anode = cells[(min(i, j), max(i, j))]
        assert (verdict, None if anode is None else ids[anode], delta) == (r["verdict"], r["anode"], r["delta_E_V"])


def test_matrix_csv(ds):
    m = M.matrix_entry({"env": SEA, "materials": ["zinc", "carbon steel", "316", "titanium"], "csv": True})
    assert {k: v for k, v in m.items() if k != "csv"} == \
        M.matrix_entry({"env": SEA, "materials": ["zinc", "carbon steel", "316", "titanium"], "csv": False})
    cells = {(m["materials"][p[0]], m["materials"][p[1]]): p for p in m["pairs"]}
    lines = m["csv"].splitlines()
    assert lines[0].startswith("#") and ds.version in lines[0]
    rows = list(csv.reader(io.StringIO("\n".join(lines[1:]))))
    assert rows[0] == ["a", "b", "anode", "delta_E_V", "verdict"]
    assert len(rows) == 1 + 4 * 3 // 2
    for a, b, anode, d, verdict in rows[1:]:
        _, _, delta, tier, k = cells[(a, b)]
        assert float(d) == pytest.approx(delta, abs=1e-4)
        assert verdict == tier and anode == ("" if k is None else m["materials"][k])


def test_matrix_input_errors():
    assert api.call("matrix", {"env": SEA, "materials": ["zinc", "nope-metal"]})["error"]["field"] == "materials[1]"
    assert api.call("matrix", {"env": SEA, "materials": []})["error"]["field"] == "materials"
    assert api.call("matrix", {"env": SEA, "materials": "zinc"})["error"]["field"] == "materials"
    assert api.call("matrix", {})["error"]["field"] == "env"
    assert api.call("matrix", {"env": SEA, "cols": 1})["error"]["field"] == "cols"
    for junk in ("yes", 1, [], {}):
        assert api.call("matrix", {"env": SEA, "csv": junk})["error"]["field"] == "csv"


def test_matrix_is_fast(ds):
    # all pairs of every seawater material (about 50): well under 100 ms in CPython (best of 3)
    m = M.matrix_entry({"env": SEA})
    assert len(m["materials"]) >= 45
    best = min(_timed(lambda: M.matrix_entry({"env": SEA})) for _ in range(3))
    assert best < 0.1, f"{best * 1000:.0f} ms"


def _timed(fn):
    t = time.perf_counter()
    fn()
    return time.perf_counter() - t


@settings(max_examples=40, deadline=None)
@given(env=ENVS, mats=st.one_of(st.none(), st.lists(NAMES, max_size=4)))
def test_matrix_any_input_gives_a_result_or_a_clear_error(env, mats):
    req = {"env": env}
    if mats is not None:
        req["materials"] = mats
    out = api.call("matrix", req)
    if out["ok"]:
        json.dumps(out["result"], allow_nan=False)
    else:
        assert out["error"]["field"] and out["error"]["message"]



# ---------------------------------------------------------------- why each verdict; sacrificial by design

def test_matrix_details_say_why_each_verdict(ds):
    m = M.matrix_entry({"env": "seawater-quiescent"})
    assert m["detail_fields"] == ["best_V", "worst_V", "why", "other_state_V", "by_design"]
    assert len(m["details"]) == len(m["pairs"]) and set(m["why"]) == {"over", "range", "state", "negligible", "within"}
    allow = m["allowable_V"]
    for (_, _, delta, verdict, _), (best, worst, why, other, _) in zip(m["pairs"], m["details"]):
        assert best - 1e-9 <= delta <= worst + 1e-9
        assert why == {"unsuited": "over", "matched": "negligible", "compatible": "within"}.get(verdict, why)
        if verdict == "guarded":
            assert (why == "range") == (worst > allow + 1e-9)
            assert why == "range" or other is not None  # another state is guarded or unsuited
    assert {d[2] for d in m["details"]} >= {"over", "range", "state", "within"}


def test_matrix_details_agree_with_the_joint(ds):
    # the best and worst case of each pair, and the state reason, as a joint of the two has them
    mats = ["titanium", "stainless-316-passive", "nickel-aluminium-bronze", "cuni-90-10", "copper", "zinc"]
    m = M.matrix_entry({"env": SEA, "materials": mats})
    ids = m["materials"]
    for (i, j, _, verdict, _), (best, worst, why, other, _) in zip(m["pairs"], m["details"]):
        r = J.joint_entry({"a": ids[i], "b": ids[j], "env": SEA})
        assert [best, worst] == pytest.approx(r["delta_E_range_V"], abs=1e-4)
        assert r["verdict"] == verdict
        if why == "state":
            assert other == pytest.approx(r["worst_state"]["delta_E_V"], abs=1e-4)


def test_matrix_flags_sacrificial_anodes_on_steel_and_keeps_their_verdict(ds):
    # zinc on mild steel in seawater: 0.345 V, unsuited as a joint (ASTM G82 Fig. 1), and a zinc anode
    # by design (common practice); zinc on copper is no protection of steel
    m = M.matrix_entry({"env": SEA, "materials": ["copper", "carbon steel", "zinc"]})
    ids = m["materials"]
    flags = {frozenset((ids[p[0]], ids[p[1]])): (p[3], d[4]) for p, d in zip(m["pairs"], m["details"])}
    assert flags[frozenset(("carbon-steel", "zinc"))] == ("unsuited", True)
    assert flags[frozenset(("copper", "zinc"))] == ("unsuited", False)
    assert flags[frozenset(("copper", "carbon-steel"))][1] is False
    assert m["by_design_rule"]["source"] == "common-practice"


@pytest.mark.parametrize("env", ["buried-soil", "fresh-water"])
def test_soil_and_fresh_water_results_carry_the_loud_caveat(env):
    # ASTM G82-98 (R2014) §5: a galvanic series is specific to its electrolyte; the joint and the matrix judged
    # in soil or fresh water on the seawater series say so, with the code the pages show as a banner
    from calc.joint import joint_entry

    for result in (M.matrix_entry({"env": env, "materials": ["zinc", "carbon-steel", "copper"]}),
                   joint_entry({"a": "copper", "b": "carbon-steel", "env": env})):
        loud = [w for w in result["warnings"] if w.get("code") == "series-other-electrolyte"]
        assert len(loud) == 1 and "seawater" in loud[0]["message"].lower()
        assert "ASTM G82" in loud[0]["basis"] and "§5" in loud[0]["basis"]
    calm = M.matrix_entry({"env": "seawater-flowing", "materials": ["zinc", "copper"]})
    assert not [w for w in calm["warnings"] if w.get("code")]
