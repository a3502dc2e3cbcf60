"""The stainless and nickel grades of the dataset: composition limits, PREN, and the seawater grades.

Checks against published figures, each named beside it:
- R. M. Davison and J. D. Redmond, "Practical Guide to Using 6 Mo Austenitic Stainless Steels"
  (Nickel Development Institute reprint), Table 1 (read in a public copy): the composition limits of
  S31254, N08367, S30403 and S31603 stored in data/materials.yaml are the printed ones.
- Fine Tubes, data sheet "Alloy 6Mo (UNS S31254)", e110, August 2011 (read in a public copy): printed
  PREN 25 for S31603 and 43 for S31254 (rounded to units), which the stored limits must bracket.
- Corrosion 77 (2021) 382, "Clarifying the applicability of PREN equations" (read): PREN ranks
  stainless steels only; the seawater rule of thumb, PREN above about 32 for pitting and about 40
  for crevices (common practice), is the basis of the passive/active split tested in test_passivity.
"""

import pytest

from calc.dataset import current
from calc.errors import InputError
from calc.gradepren import record_pren
from calc.passivity import pren, pren_w
from calc.rate import material_faraday_data
from calc.series import basis_of, material_on

DS = current()
NEW_GRADES = {"S32205": "duplex-s32205", "S32750": "super-duplex-s32750", "S32760": "super-duplex-s32760",
              "S31254": "stainless-6mo-s31254", "N08367": "stainless-6mo-n08367", "N06625": "alloy-625"}

# Davison & Redmond, Table 1 (read): Cr, Ni, Mo, N limits in wt % ("max" as [0, max])
DAVISON_REDMOND = {
    "stainless-6mo-s31254-passive": {"Cr": (19.50, 20.50), "Ni": (17.50, 18.50), "Mo": (6.00, 6.50),
                                     "Cu": (0.50, 1.00), "N": (0.18, 0.22)},
    "stainless-6mo-n08367-passive": {"Cr": (20.00, 22.00), "Ni": (23.50, 25.50), "Mo": (6.00, 7.00),
                                     "Cu": (0.0, 0.75), "N": (0.18, 0.25)},
    "stainless-304-passive": {"Cr": (18.00, 20.00), "Ni": (8.00, 12.00), "N": (0.0, 0.10)},
    "stainless-316-passive": {"Cr": (16.00, 18.00), "Ni": (10.00, 14.00), "Mo": (2.00, 3.00), "N": (0.0, 0.10)},
}


def _rec(rid):
    return DS.get("materials", rid)


@pytest.mark.parametrize("rid", sorted(DAVISON_REDMOND))
def test_stored_limits_are_the_printed_ones(rid):
    rec = _rec(rid)
    assert rec["composition_limits_confidence"] == "read" and rec["composition_limits_where"].startswith("Table 1")
    printed = DAVISON_REDMOND[rid]
    assert set(rec["composition_limits_min_wt_pct"]) == set(printed)
    for el, (lo, hi) in printed.items():
        assert rec["composition_limits_min_wt_pct"][el] == pytest.approx(lo, abs=1e-9), el
        assert rec["composition_limits_max_wt_pct"][el] == pytest.approx(hi, abs=1e-9), el


@pytest.mark.parametrize("rid, printed", [("stainless-316-passive", 25), ("stainless-6mo-s31254-passive", 43)])
def test_pren_of_the_limits_brackets_a_published_typical_pren(rid, printed):
    # Fine Tubes e110 (2011), printed PREN of the typical compositions, rounded to units (read)
    grade = record_pren(_rec(rid))
    assert grade.pren_min - 0.5 <= printed <= grade.pren_max + 0.5


def test_pren_of_the_read_limits_worked_by_hand():
    # PREN = Cr + 3.3·Mo + 16·N of Davison & Redmond's Table 1 minima and maxima, worked by hand
    s31254 = record_pren(_rec("stainless-6mo-s31254-passive"))
    assert (s31254.pren_min, s31254.pren_max) == pytest.approx((19.50 + 3.3 * 6.00 + 16 * 0.18,
                                                                20.50 + 3.3 * 6.50 + 16 * 0.22), abs=1e-9)
    assert (s31254.pren_min, s31254.pren_max) == pytest.approx((42.18, 45.47), abs=0.005)
    n08367 = record_pren(_rec("stainless-6mo-n08367-passive"))
    assert (n08367.pren_min, n08367.pren_max) == pytest.approx((42.68, 49.10), abs=0.005)


def test_tungsten_grade_uses_the_iso_15156_3_form():
    grade = record_pren(_rec("super-duplex-s32760-passive"))
    assert grade.formula.startswith("PREN_W")
    lo = grade.low
    assert grade.pren_min == pytest.approx(pren_w(lo[0], lo[1], lo[3], lo[2]), abs=1e-12)
    assert grade.pren_min > pren(lo[0], lo[1], lo[2])  # tungsten counts
    assert record_pren(_rec("duplex-s32205-passive")).formula == "PREN = Cr + 3.3·Mo + 16·N"


def test_every_stainless_state_has_chromium_limits_and_both_states_agree():
    for rec in DS.records("materials"):
        if rec.get("family") == "stainless steel" and rec.get("state"):
            grade = record_pren(rec)
            assert grade is not None and grade.pren_min <= grade.pren_max, rec["id"]
            twin = _rec(rec["other_state"])
            assert record_pren(twin) == grade, rec["id"]


def test_seawater_rule_separates_the_grades():
    # PREN about 32 (pitting) and about 40 (crevice) in ambient seawater (common practice): 316L and
    # 304L are below 32 even at their maxima; the 6Mo grades are above 40 at their minima.
    assert record_pren(_rec("stainless-316-passive")).pren_max < 32
    assert record_pren(_rec("stainless-304-passive")).pren_max < 32
    for rid in ("stainless-6mo-s31254-passive", "stainless-6mo-n08367-passive"):
        assert record_pren(_rec(rid)).pren_min > 40, rid


@pytest.mark.parametrize("uns", sorted(NEW_GRADES))
def test_new_grades_are_found_by_uns_and_have_both_states(uns):
    rec = DS.get("materials", uns)
    assert rec["id"] == NEW_GRADES[uns] + "-passive" and rec["state"] == "passive"
    active = _rec(rec["other_state"])
    assert active["state"] == "active" and active["other_state"] == rec["id"] and active["uns"] == [uns]


@pytest.mark.parametrize("uns", sorted(NEW_GRADES))
def test_new_grades_give_a_faraday_rate(uns):
    # ASTM G102: EW = 1/Σ(n·f/W) over the elements of 1 % or more; stainless and nickel grades lie
    # near 25 g (G102 prints 25.12 for S30400 and 25.50 for S31600, from memory)
    fd = material_faraday_data(DS.get("materials", uns))
    assert 24.0 < fd.equivalent_weight_g < 26.5 and 7.7 < fd.density_g_cm3 < 8.5


@pytest.mark.parametrize("uns", sorted(NEW_GRADES))
def test_the_series_refuses_a_grade_it_has_no_position_for(uns):
    ds = DS
    basis = basis_of(ds.get("environments", "seawater-flowing"), ds)
    with pytest.raises(InputError) as exc:
        material_on(ds, uns, "a", basis)
    assert exc.value.field == "a" and NEW_GRADES[uns] in str(exc.value)
    assert "no row for this grade" in DS.get("materials", uns)["seawater_note"]


@pytest.mark.parametrize("rid, low, high", [
    ("duplex-s32205-passive", 28, 38), ("super-duplex-s32750-passive", 38, 45), ("super-duplex-s32760-passive", 38, 45)])
def test_mid_range_pren_lies_in_the_published_class(rid, low, high):
    # Wikipedia, "Duplex stainless steel", section "Grades of duplex stainless steels" (read): standard
    # duplex (2205) PREN 28-38, super duplex PREN 38-45. The stored limits are ASTM A240's, recalled.
    grade = record_pren(_rec(rid))
    mid = 0.5 * (grade.pren_min + grade.pren_max)
    assert low <= mid <= high
