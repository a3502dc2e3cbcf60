"""The sampled Evans diagram (calc.evans): the sums of the partial currents, the exchange points,
and the couple point where the sums cross.

Published examples are the ones tests/test_kinetics.py solves (each names where its printed
numbers were read); here they check what the diagram draws of them.
"""

import json
import math

import pytest

from calc.evans import total_points
from calc.kinetics import Electrode, Reaction
from calc.mixed import mixed_entry
from calc.spec import OPENINGS


def rx(name, e_eq, i0, ba=None, bc=None, il=None):
    out = {"name": name, "E_eq_V": e_eq, "i0_A_per_cm2": i0}
    for key, value in (("b_anodic_V", ba), ("b_cathodic_V", bc), ("i_lim_A_per_cm2", il)):
        if value is not None:
            out[key] = value
    return out


def el(name, area, *reactions):
    return {"name": name, "area_cm2": area, "reactions": list(reactions)}


def diagram(*electrodes):
    r = mixed_entry({"electrodes": list(electrodes)})
    return r, r["evans"]


def total(ev, branch):
    return next(t for t in ev["totals"] if t["branch"] == branch)


def crossing(ev):
    """The potential where the sampled anodic and cathodic sums cross (linear between samples)."""
    a, c = total(ev, "anodic")["points"], total(ev, "cathodic")["points"]
    for k in range(1, len(a)):
        d0 = a[k - 1]["log10_I_A"] - c[k - 1]["log10_I_A"]
        d1 = a[k]["log10_I_A"] - c[k]["log10_I_A"]
        if d0 <= 0.0 <= d1:
            e0, e1 = a[k - 1]["E_V"], a[k]["E_V"]
            return e0 + (e1 - e0) * (-d0) / (d1 - d0)
    raise AssertionError("the sums do not cross")


# Jones, Principles and Prevention of Corrosion, 2nd ed. (1996), Problem 6-5, as set and answered in
# a course answer key (EMA 4324 Problem Set 11 key, read in a public copy): metals P and Q, 1 cm² each,
# in acid of unit H+ activity, all Tafel constants 0.1 V/decade; part (b) sums the hydrogen exchange
# currents of the two equal areas to i0(C) = 1.1e-5 A (printed).
JONES_P = el("P", 1.0, rx("P dissolution", -0.5, 3e-7, ba=0.1), rx("H2 on P", 0.0, 1e-6, bc=0.1))
JONES_Q = el("Q", 1.0, rx("Q dissolution", -0.6, 2e-6, ba=0.1), rx("H2 on Q", 0.0, 1e-5, bc=0.1))


def test_the_cathodic_sum_of_jones_p_and_q_is_one_tafel_line_from_the_summed_exchange_current():
    _, ev = diagram(JONES_P, JONES_Q)
    cathodic = total(ev, "cathodic")
    assert cathodic["count"] == 2
    for p in cathodic["points"]:  # log10 I = log10(1.1e-5) - E/0.1 with E_eq(H2) = 0 (Jones key, part b)
        assert p["log10_I_A"] == pytest.approx(math.log10(1.1e-5) - p["E_V"] / 0.1, abs=1e-12)


def test_the_sums_cross_at_the_couple_point_of_jones_p_and_q():
    # the key's couple with all slopes 0.1 V/decade: 10^(10E)·(3e-7·10^5 + 2e-6·10^6) = 1.1e-5·10^(-10E)
    r, ev = diagram(JONES_P, JONES_Q)
    e_couple = math.log10(1.1e-5 / 2.03) / 20.0
    assert crossing(ev) == pytest.approx(e_couple, abs=1e-9)  # straight lines in log I: exact between samples
    assert ev["couple_point"]["E_V"] == pytest.approx(e_couple, abs=1e-12)
    assert 10 ** ev["couple_point"]["log10_I_A"] == pytest.approx(1.1e-5 * 10 ** (-10 * e_couple), rel=1e-9)
    assert r["E_mixed_V"] == ev["couple_point"]["E_V"]


def test_the_couple_point_of_zinc_in_acid_lies_on_both_sums_callister_example_16_2():
    # Callister & Rethwisch, Fundamentals of Materials Science and Engineering, 3rd ed. (Wiley 2008),
    # Example Problem 16.2, p. 677 (read in a public copy): Zn V = -0.763 V, i0 = 1e-7 A/cm²,
    # β = +0.09; H2 V = 0, i0 = 1e-10 A/cm², β = -0.08; printed log i_C = -3.924.
    _, ev = diagram(el("Zn", 1.0, rx("Zn", -0.763, 1e-7, ba=0.09), rx("H2", 0.0, 1e-10, bc=0.08)))
    assert ev["couple_point"]["log10_I_A"] == pytest.approx(-3.924, abs=0.0005)
    e = ev["couple_point"]["E_V"]
    assert crossing(ev) == pytest.approx(e, abs=1e-9)
    # one electrode alone: its free-corrosion point is the couple point
    (free,) = ev["free_corrosion_points"]
    assert (free["E_V"], free["log10_I_A"]) == pytest.approx((e, ev["couple_point"]["log10_I_A"]), abs=1e-9)


def test_exchange_points_are_e_eq_and_i0_times_the_area():
    # Callister Example 16.2 data (above) on a 2.5 cm² electrode: the lines start at (V_Zn, i0·A)
    _, ev = diagram(el("Zn", 2.5, rx("Zn", -0.763, 1e-7, ba=0.09), rx("H2", 0.0, 1e-10, bc=0.08)))
    got = {p["reaction"]: (p["E_V"], p["log10_I_A"]) for p in ev["exchange_points"]}
    assert got["Zn"] == pytest.approx((-0.763, math.log10(2.5e-7)), abs=1e-12)
    assert got["H2"] == pytest.approx((0.0, math.log10(2.5e-10)), abs=1e-12)
    for c in ev["curves"]:  # a one-slope line passes through its exchange point (Tafel: η = 0 gives i0)
        x, y = got[c["reaction"]]
        slope = 0.09 if c["branch"] == "anodic" else -0.08
        for p in c["points"]:
            assert p["log10_I_A"] == pytest.approx(y + (p["E_V"] - x) / slope, abs=1e-9)


def test_a_direction_with_one_branch_has_a_total_of_one_and_areas_add():
    # an equal reaction on 1 and 9 cm²: the sum is that of 10 cm² (Σ A·i, common practice)
    a = Electrode("A", 1.0, (Reaction("H2", 0.0, 1e-6, None, 0.1, None),))
    b = Electrode("B", 9.0, (Reaction("H2", 0.0, 1e-6, None, 0.1, None),))
    pts = total_points([a, b], -0.3, 0.0, "cathodic", 7)
    assert [p["log10_I_A"] for p in pts] == pytest.approx([-5.0 - p["E_V"] / 0.1 for p in pts], abs=1e-12)
    _, ev = diagram(JONES_P)
    assert [(t["branch"], t["count"]) for t in ev["totals"]] == [("anodic", 1), ("cathodic", 1)]


@pytest.mark.parametrize("electrodes", [
    # one part only anodic, the other only cathodic (each direction absent somewhere), limits, Butler–Volmer
    [el("Zn", 1.0, rx("Zn", -0.76, 1e-7, ba=0.09)), el("Pt", 5.0, rx("H2", 0.0, 1e-3, bc=0.12, il=1e-4))],
    [el("Fe", 3.0, rx("Fe", -0.44, 1e-6, ba=0.06, bc=0.06), rx("O2", 0.8, 1e-9, bc=0.1, il=2e-5))],
    [el(f"M{k}", 10.0 ** k, rx("M", -0.5 + 0.1 * k, 10.0 ** (-k - 5), ba=0.05 + 0.01 * k),
        rx("O2", 0.8, 1e-10, bc=0.12, il=1e-5)) for k in range(4)],
])
def test_every_sampled_value_is_finite_and_the_sums_cross_at_the_couple_point(electrodes):
    r, ev = diagram(*electrodes)
    json.dumps(r, allow_nan=False)
    for t in ev["totals"]:
        assert all(math.isfinite(p["log10_I_A"]) for p in t["points"])
    assert crossing(ev) == pytest.approx(ev["couple_point"]["E_V"], abs=0.01)  # sampled every ~30 mV
    low, high = ev["range_V"]
    assert all(low <= p["E_V"] <= high for p in ev["exchange_points"])


def test_the_opening_demonstration_carries_its_whole_diagram():
    # the page's opening request (calc.spec, invented kinetics): its result draws without a second request
    r = mixed_entry(OPENINGS["mixed"])
    ev = r["evans"]
    reactions = sum(len(e["reactions"]) for e in OPENINGS["mixed"]["electrodes"])
    assert len(ev["exchange_points"]) == reactions
    assert {c["electrode"] for c in ev["curves"]} == {e["name"] for e in OPENINGS["mixed"]["electrodes"]}
    assert len(ev["free_corrosion_points"]) == 2 and {t["branch"] for t in ev["totals"]} == {"anodic", "cathodic"}
    assert crossing(ev) == pytest.approx(r["E_mixed_V"], abs=0.01)
