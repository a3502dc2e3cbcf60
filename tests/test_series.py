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
    # the tier rule's state_fail: passive 316 with titanium passes as named, its active state does not
    ds = current()
    basis = S.basis_of(ds.get("environments", "seawater-flowing"), ds)
    j = S.judge_pair(ds, ds.get("materials", "titanium"), ds.get("materials", "316"), basis)
    assert j.primary.tier in ("matched", "compatible") and j.tier == "guarded" and j.state_demoted
    assert j.worst.tier == "unsuited" and j.combos[0] == j.primary
