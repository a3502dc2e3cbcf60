"""Electrode kinetics and the mixed-potential solution: calc.kinetics, calc.mixed, calc.evans.

Published worked examples (each names where its printed numbers were read), the limiting cases of
F. Mansfeld, "Area relationships in galvanic corrosion", Corrosion 27 (1971) 436 (as far as its
abstract states them), invariants of the solution, and robustness of the ``mixed`` entry point.
"""

import json
import math

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from calc.errors import InputError
from calc.evans import branch_points
from calc.kinetics import Electrode, Reaction, butler_volmer, diffusion_limited, free_corrosion, log10_tafel, tafel
from calc.mixed import BALANCE_TOLERANCE, ELECTRODES_MAX, REACTIONS_MAX, mixed_entry

PROFILE = settings(max_examples=150, deadline=None, suppress_health_check=[HealthCheck.too_slow])


def rx(name, e_eq, i0, ba=None, bc=None, il=None):
    """A reaction of a request."""
    out = {"name": name, "E_eq_V": e_eq, "i0_A_per_cm2": i0}
    for key, value in (("b_anodic_V", ba), ("b_cathodic_V", bc), ("i_lim_A_per_cm2", il)):
        if value is not None:
            out[key] = value
    return out


def el(name, area, *reactions):
    """An electrode of a request."""
    return {"name": name, "area_cm2": area, "reactions": list(reactions)}


def solve(*electrodes):
    return mixed_entry({"electrodes": list(electrodes)})


def part(result, name):
    return next(e for e in result["electrodes"] if e["name"] == name)


def closes(result):
    """The current balance recomputed from the listed reaction currents, relative to the anodic total."""
    total = sum(r["current_density_A_per_cm2"] * e["area_cm2"] for e in result["electrodes"] for r in e["reactions"])
    return abs(total) <= BALANCE_TOLERANCE * result["anodic_total_A"]


# ---------------------------------------------------------------------------- the models

def test_tafel_is_i0_at_zero_overpotential_and_one_decade_per_slope():
    assert tafel(3e-7, 0.0, 0.1) == 3e-7
    assert tafel(3e-7, 0.1, 0.1) == pytest.approx(3e-6, rel=1e-12)
    assert log10_tafel(3e-7, 0.25, 0.05) == pytest.approx(math.log10(tafel(3e-7, 0.25, 0.05)), rel=1e-12)


def test_butler_volmer_is_zero_at_equilibrium_and_tends_to_its_tafel_branches():
    assert butler_volmer(1e-5, 0.0, 0.06, 0.12) == 0.0
    assert butler_volmer(1e-5, 0.4, 0.06, 0.12) == pytest.approx(tafel(1e-5, 0.4, 0.06), rel=1e-9)
    assert butler_volmer(1e-5, -0.4, 0.06, 0.12) == pytest.approx(-tafel(1e-5, 0.4, 0.12), rel=1e-6)
    assert butler_volmer(1e-6, 0.03, 0.1, 0.1) == pytest.approx(-butler_volmer(1e-6, -0.03, 0.1, 0.1), rel=1e-12)


def test_diffusion_limit_is_the_harmonic_combination():
    assert diffusion_limited(2e-5, 2e-5) == pytest.approx(1e-5, rel=1e-12)
    assert diffusion_limited(1e3, 1e-5) == pytest.approx(1e-5, rel=1e-7)
    assert diffusion_limited(1e-9, 1e-5) == pytest.approx(1e-9, rel=1e-4)


# ---------------------------------------------------------------------------- published examples

def test_zinc_in_acid_callister_example_16_2():
    # W. D. Callister and D. G. Rethwisch, Fundamentals of Materials Science and Engineering, 3rd ed.
    # (Wiley 2008), Example Problem 16.2 "Rate of Oxidation Computation", p. 677 (read in a public
    # copy): Zn V = -0.763 V, i0 = 1e-7 A/cm², β = +0.09; H2 V = 0, i0 = 1e-10 A/cm², β = -0.08;
    # printed log i_C = -3.924. V_C = -0.486 V and i_C = 1.19e-4 A/cm² as printed for the same
    # data on Princeton MAE 324 "Corrosion & Environmental Degradation", page corro_24.
    r = solve(el("Zn", 1.0, rx("Zn dissolution", -0.763, 1e-7, ba=0.09), rx("H2 evolution", 0.0, 1e-10, bc=0.08)))
    zn = part(r, "Zn")
    assert math.log10(zn["dissolution_current_density_A_per_cm2"]) == pytest.approx(-3.924, abs=0.0005)
    assert r["E_mixed_V"] == pytest.approx(-0.486, abs=0.0005)
    assert zn["dissolution_current_density_A_per_cm2"] == pytest.approx(1.19e-4, rel=0.005)
    assert r["galvanic_current_A"] == 0.0 and zn["free_corrosion"]["E_V"] == pytest.approx(r["E_mixed_V"], abs=1e-12)


JONES_P = el("P", 1.0, rx("P dissolution", -0.5, 3e-7, ba=0.1), rx("H2 on P", 0.0, 1e-6, bc=0.1))
JONES_Q = el("Q", 1.0, rx("Q dissolution", -0.6, 2e-6, ba=0.1), rx("H2 on Q", 0.0, 1e-5, bc=0.1))


def test_metals_p_and_q_uncoupled_jones_problem_6_5():
    # D. A. Jones, Principles and Prevention of Corrosion, 2nd ed. (1996), Problem 6-5, as set and
    # answered in a course answer key (EMA 4324 Problem Set 11 key, read in a public copy): equal
    # 1 cm² areas in acid of unit H+ activity, all Tafel constants 0.1 V/decade; printed answers
    # i_corr(P) = 1.73e-4 A, E_corr(P) = -0.223 V, i_corr(Q) = 4.47e-3 A, E_corr(Q) = -0.265 V.
    p, q = solve(JONES_P), solve(JONES_Q)
    assert part(p, "P")["dissolution_current_density_A_per_cm2"] == pytest.approx(1.73e-4, rel=0.005)
    assert p["E_mixed_V"] == pytest.approx(-0.223, abs=0.0015)  # -0.2239: the key rounds from its rounded i_corr
    assert part(q, "Q")["dissolution_current_density_A_per_cm2"] == pytest.approx(4.47e-3, rel=0.005)
    assert q["E_mixed_V"] == pytest.approx(-0.265, abs=0.0005)


def test_metals_p_and_q_coupled_jones_problem_6_5():
    # The same key, part (b), sums the hydrogen exchange currents of the equal areas, i0(C) = 1e-5 +
    # 1e-6 = 1.1e-5 A (printed). With all slopes 0.1 V/decade the couple then solves in closed form:
    # 10^(10E)·(3e-7·10^5 + 2e-6·10^6) = 1.1e-5·10^(-10E)  (derived here; the key's figure is not read).
    r = solve(JONES_P, JONES_Q)
    e_couple = math.log10(1.1e-5 / 2.03) / 20.0
    assert r["E_mixed_V"] == pytest.approx(e_couple, abs=1e-12)
    q_net = 2e-6 * 10 ** (10 * (e_couple + 0.6)) - 1e-5 * 10 ** (-10 * e_couple)
    assert r["galvanic_current_A"] == pytest.approx(q_net, rel=1e-9)
    assert part(r, "Q")["role"].startswith("anode") and part(r, "P")["role"].startswith("cathode")
    # parts (d) and (e): P is cathodically protected, and hydrogen evolution rises on P, falls on Q
    assert part(r, "P")["dissolution_vs_free"] < 1.0 < part(r, "Q")["dissolution_vs_free"]
    assert r["E_mixed_V"] < solve(JONES_P)["E_mixed_V"] and r["E_mixed_V"] > solve(JONES_Q)["E_mixed_V"]
    assert closes(r)


# D. A. Jones, Problem 6-7, as printed in the same course's problem set (read; no answer printed):
# metal A b_A = 0.05, b_C = 0.1 V/decade, I_corr = 1e-7 A; metal C b_A = 0.04, b_C = 0.1 V/decade,
# I_corr = 1e-6 A; E_corr(C) - E_corr(A) = 0.500 V. Each metal is written as its two Tafel lines
# through its free-corrosion point (E_eq_V = E_corr, i0 = i_corr), the form Mansfeld's Case 2 uses.
def jones_a(area=1.0):
    return el("A", area, rx("A anodic", -0.5, 1e-7, ba=0.05), rx("A cathodic", -0.5, 1e-7, bc=0.1))


def jones_c(area=1.0):
    return el("C", area, rx("C anodic", 0.0, 1e-6, ba=0.04), rx("C cathodic", 0.0, 1e-6, bc=0.1))


def test_free_corrosion_points_of_jones_problem_6_7_are_recovered():
    r = solve(jones_a(), jones_c())
    assert part(r, "A")["free_corrosion"]["E_V"] == pytest.approx(-0.5, abs=1e-12)
    assert part(r, "A")["free_corrosion"]["current_density_A_per_cm2"] == pytest.approx(1e-7, rel=1e-9)
    assert part(r, "C")["free_corrosion"]["E_V"] == pytest.approx(0.0, abs=1e-12)
    one, ten = solve(jones_a(), jones_c(1.0)), solve(jones_a(), jones_c(10.0))  # parts (a) and (b)
    assert ten["galvanic_current_A"] > one["galvanic_current_A"] > 0.0


# ---------------------------------------------------------------------------- Mansfeld 1971

def test_mansfeld_case_1_tafel_dissolution_and_reduction_only():
    # Case 1 (abstract): only dissolution on the active metal A and only reduction on C, with Tafel
    # behaviour. Then I_g = i0a·A_A·10^(η_a/b_a) = i0c·A_C·10^(-η_c/b_c), so log i_gA rises with
    # log(A_C/A_A) at b_c/(b_a + b_c) and E_g at b_a·b_c/(b_a + b_c) per decade (derived here from the
    # Tafel lines; Mansfeld's own equations are not read).
    b_a, b_c = 0.06, 0.12

    def couple(ratio):
        return solve(el("A", 1.0, rx("A dissolution", -0.7, 1e-6, ba=b_a)),
                     el("C", ratio, rx("O2 reduction on C", 0.4, 1e-8, bc=b_c)))

    one, hundred = couple(1.0), couple(100.0)
    i1, i100 = (part(x, "A")["dissolution_current_density_A_per_cm2"] for x in (one, hundred))
    assert (math.log10(i100) - math.log10(i1)) / 2.0 == pytest.approx(b_c / (b_a + b_c), rel=1e-9)
    assert (hundred["E_mixed_V"] - one["E_mixed_V"]) / 2.0 == pytest.approx(b_a * b_c / (b_a + b_c), rel=1e-9)
    assert one["galvanic_current_A"] == pytest.approx(i1, rel=1e-9)  # i_gA = i_dA: nothing else on A
    inert = part(one, "C")
    assert inert["free_corrosion"] is None and "no free-corrosion point" in inert["free_corrosion_note"]


def test_mansfeld_case_2_galvanic_current_is_not_the_dissolution_rate():
    # Case 2 (abstract): A polarized only slightly from its corrosion potential; the galvanic
    # current density i_gA is not the dissolution rate i_dA. With A's Tafel lines through its free
    # point: i_dA = i_corr·10^(ΔE/b_a) and i_gA = i_corr·(10^(ΔE/b_a) − 10^(−ΔE/b_c)), ΔE = E_g − E_corr.
    r = solve(jones_a(), jones_c(1e-5))  # a small noble part: A moves about 35 mV
    a = part(r, "A")
    d_e = r["E_mixed_V"] - (-0.5)
    assert 0.0 < d_e < 0.05  # slightly polarized
    assert a["dissolution_current_density_A_per_cm2"] == pytest.approx(1e-7 * 10 ** (d_e / 0.05), rel=1e-9)
    i_g = 1e-7 * (10 ** (d_e / 0.05) - 10 ** (-d_e / 0.1))
    assert a["net_current_density_A_per_cm2"] == pytest.approx(i_g, rel=1e-6)
    assert r["galvanic_current_A"] == pytest.approx(i_g, rel=1e-6)
    own_cathodic = a["dissolution_current_density_A_per_cm2"] - a["net_current_density_A_per_cm2"]
    assert own_cathodic == pytest.approx(1e-7 * 10 ** (-d_e / 0.1), rel=1e-6) and own_cathodic > 0.0


@pytest.mark.parametrize("ratio", [1.0, 10.0, 100.0, 1000.0])
def test_mansfeld_case_3_catchment_principle(ratio):
    # Case 3 (abstract): the cathodic process on both metals entirely diffusion controlled; the
    # dissolution rate of the anode grows with A_C/A_A (the catchment principle): i_dA = i_L·(1 + A_C/A_A).
    i_lim = 1e-5

    def oxygen(where):
        return rx(f"O2 on {where}", 0.8, 1e-4, bc=0.06, il=i_lim)

    r = solve(el("A", 1.0, rx("A dissolution", -0.76, 1e-6, ba=0.04), oxygen("A")), el("C", ratio, oxygen("C")))
    assert part(r, "A")["dissolution_current_density_A_per_cm2"] == pytest.approx(i_lim * (1.0 + ratio), rel=1e-6)
    assert r["galvanic_current_A"] == pytest.approx(i_lim * ratio, rel=1e-6)


# ---------------------------------------------------------------------------- invariants

slopes = st.floats(0.02, 0.3)
currents = st.floats(-10.0, -2.0).map(lambda x: 10.0 ** x)
potentials = st.floats(-1.2, 1.2)


@st.composite
def corroding(draw, name):
    """An electrode with a metal reaction (anodic, or Butler–Volmer) and a cathodic reaction."""
    metal = rx(f"{name} metal", draw(potentials), draw(currents), ba=draw(slopes),
               bc=draw(st.one_of(st.none(), slopes)))
    cathodic = rx(f"{name} reduction", draw(potentials), draw(currents), bc=draw(slopes),
                  il=draw(st.one_of(st.none(), currents)))
    return [metal, cathodic]


def physical(*electrodes):
    """The solution, or the case skipped when its currents are refused as beyond anything in water."""
    try:
        return solve(*electrodes)
    except InputError as exc:
        assume("beyond any electrode in water" not in str(exc))
        raise


def _free(reactions):
    try:
        return free_corrosion(Electrode("x", 1.0, _reactions(reactions)))
    except InputError as exc:
        assume("beyond any electrode in water" not in str(exc))
        raise


def _reactions(request_reactions):
    from calc.mixed import read_reaction

    return tuple(read_reaction(r, "r") for r in request_reactions)


@PROFILE
@given(corroding("A"), corroding("C"), st.floats(-3.0, 3.0), st.floats(0.1, 3.0))
def test_more_cathode_area_never_lowers_the_anodes_attack(a, c, log_ratio, more):
    free_a, free_c = _free(a)[0], _free(c)[0]
    assume(free_a < free_c - 1e-6)  # A is the anode of the pair
    small = physical(el("A", 1.0, *a), el("C", 10.0 ** log_ratio, *c))
    large = physical(el("A", 1.0, *a), el("C", 10.0 ** (log_ratio + more), *c))
    attack_small = part(small, "A")["dissolution_current_density_A_per_cm2"]
    attack_large = part(large, "A")["dissolution_current_density_A_per_cm2"]
    assert attack_large >= attack_small * (1.0 - 1e-9)
    assert closes(small) and closes(large)


@PROFILE
@given(corroding("A"), corroding("C"))
def test_uncoupled_corrosion_is_recovered_as_the_partners_area_goes_to_zero(a, c):
    e_free, i_free = _free(a)
    assume(all(max(r.log10_partials(e_free)) < 5.0 for r in _reactions(c)))  # else refused: beyond water
    partner = abs(sum(r.current_density(e_free) for r in _reactions(c)))
    area = min(1e12, max(1e-300, 1e-9 * i_free / max(partner, 1e-300)))  # its current: 1e-9 of A's corrosion
    near = physical(el("A", 1.0, *a), el("C", area, *c))
    assert near["E_mixed_V"] == pytest.approx(e_free, abs=1e-6)
    assert part(near, "A")["dissolution_current_density_A_per_cm2"] == pytest.approx(i_free, rel=1e-6)


def test_partners_area_to_zero_converges_for_the_jones_pair():
    free_p = solve(JONES_P)["E_mixed_V"]
    gaps = [abs(solve(JONES_P, el("Q", area, *JONES_Q["reactions"]))["E_mixed_V"] - free_p)
            for area in (1e-2, 1e-4, 1e-6)]
    assert gaps[0] > gaps[1] > gaps[2] and gaps[2] < 1e-5


def test_three_electrodes_balance_and_galvanic_current_is_the_anodic_side():
    zinc = el("Zn", 0.5, rx("Zn", -0.9, 1e-6, ba=0.04), rx("H2 on Zn", -0.3, 1e-9, bc=0.12))
    r = solve(jones_a(2.0), jones_c(5.0), zinc)
    nets = [e["net_current_A"] for e in r["electrodes"]]
    assert r["galvanic_current_A"] == pytest.approx(sum(-n for n in nets if n < 0), rel=1e-9)
    assert closes(r) and r["balance_relative"] <= BALANCE_TOLERANCE


# ---------------------------------------------------------------------------- the Evans diagram

def test_evans_branches_meet_at_the_exchange_point_and_the_couple_point_is_marked():
    bv = el("Fe", 2.0, rx("Fe", -0.44, 1e-6, ba=0.06, bc=0.06), rx("O2", 0.8, 1e-9, bc=0.1, il=2e-5))
    r = solve(bv)
    curves = {(c["reaction"], c["branch"]): c["points"] for c in r["evans"]["curves"]}
    meet = math.log10(1e-6 * 2.0)
    for branch in ("anodic", "cathodic"):
        at_eq = [p for p in curves[("Fe", branch)] if p["E_V"] == -0.44]
        assert at_eq and at_eq[0]["log10_I_A"] == pytest.approx(meet, abs=1e-12)
    assert all(p["E_V"] >= -0.44 for p in curves[("Fe", "anodic")])
    assert max(p["log10_I_A"] for p in curves[("O2", "cathodic")]) <= math.log10(2e-5 * 2.0) + 1e-12
    low, high = r["evans"]["range_V"]
    assert low < r["E_mixed_V"] < high and r["evans"]["couple_point"]["E_V"] == r["E_mixed_V"]
    assert r["evans"]["free_corrosion_points"][0]["electrode"] == "Fe"
    json.dumps(r, allow_nan=False)


def test_a_one_slope_branch_spans_the_whole_range():
    h = Reaction("H2", 0.0, 1e-10, None, 0.08, None)
    pts = branch_points(h, 1.0, -0.5, 0.5, "cathodic", 11)
    assert len(pts) == 11 and pts[0]["log10_I_A"] == pytest.approx(-10.0 + 0.5 / 0.08, rel=1e-12)


# ---------------------------------------------------------------------------- bad input

GOOD = el("Zn", 1.0, rx("Zn", -0.76, 1e-7, ba=0.09), rx("H2", 0.0, 1e-10, bc=0.08))


def refused(request):
    with pytest.raises(InputError) as exc:
        mixed_entry(request)
    return exc.value.field, str(exc.value)


def test_a_reaction_without_slopes_is_refused_naming_the_field():
    field, msg = refused({"electrodes": [el("Zn", 1.0, rx("Zn", -0.76, 1e-7))]})
    assert field == "electrodes[0].reactions[0].b_anodic_V" and "slope" in msg


@pytest.mark.parametrize("area", [-1.0, 0.0, float("nan"), float("inf"), "x", None, True, 1e13])
def test_bad_areas_are_refused(area):
    assert refused({"electrodes": [el("Zn", area, *GOOD["reactions"])]})[0] == "electrodes[0].area_cm2"


@pytest.mark.parametrize("key, value", [("E_eq_V", float("nan")), ("E_eq_V", 6.0), ("i0_A_per_cm2", 0.0),
                                        ("i0_A_per_cm2", -1e-6), ("i0_A_per_cm2", float("inf")),
                                        ("b_anodic_V", 0.0), ("b_anodic_V", -0.06), ("b_anodic_V", 11.0),
                                        ("i_lim_A_per_cm2", 0.0)])
def test_bad_reaction_numbers_are_refused(key, value):
    reaction = dict(rx("Zn", -0.76, 1e-7, ba=0.09, bc=0.09), **{key: value})
    field, _ = refused({"electrodes": [el("Zn", 1.0, reaction, GOOD["reactions"][1])]})
    assert field == f"electrodes[0].reactions[0].{key}"


def test_too_many_electrodes_or_reactions_are_refused_with_the_reason():
    many = [el(f"M{k}", 1.0, *GOOD["reactions"]) for k in range(ELECTRODES_MAX + 1)]
    field, msg = refused({"electrodes": many})
    assert field == "electrodes" and f"at most {ELECTRODES_MAX}" in msg and "Evans diagram" in msg
    field, msg = refused({"electrodes": [el("Zn", 1.0, *([GOOD["reactions"][0]] * (REACTIONS_MAX + 1)))]})
    assert field == "electrodes[0].reactions" and f"at most {REACTIONS_MAX}" in msg


@pytest.mark.parametrize("request_, field", [
    ({}, "electrodes"), ({"electrodes": []}, "electrodes"), ({"electrodes": [GOOD], "temp": 1}, "temp"),
    ({"electrodes": [dict(GOOD, colour="red")]}, "electrodes[0].colour"),
    ({"electrodes": [{"name": "Zn", "reactions": GOOD["reactions"]}]}, "electrodes[0].area_cm2"),
    ({"electrodes": [GOOD, GOOD]}, "electrodes[1].name"), ({"electrodes": ["Zn"]}, "electrodes[0]"),
    ({"electrodes": [el("Zn", 1.0, rx("H2", 0.0, 1e-6, ba=0.1, il=1e-5))]},
     "electrodes[0].reactions[0].i_lim_A_per_cm2"),
    ({"electrodes": [el("Zn", 1.0, rx("Zn", -0.76, 1e-7, ba=0.09))]}, "electrodes"),
    ({"electrodes": [el(" ", 1.0, *GOOD["reactions"])]}, "electrodes[0].name"),
])
def test_malformed_requests_name_the_field(request_, field):
    assert refused(request_)[0] == field


def test_kinetics_beyond_anything_in_water_are_refused_not_overflowed():
    wild = el("X", 1.0, rx("X", -5.0, 10.0, ba=0.005), rx("Ox", 5.0, 10.0, bc=0.005))
    field, msg = refused({"electrodes": [wild]})
    assert field == "electrodes" and "A/cm²" in msg


def test_one_slope_run_past_its_equilibrium_is_warned():
    r = solve(el("Zn", 1.0, rx("Zn", -0.2, 1e-3, ba=0.06), rx("H2", -0.3, 1e-10, bc=0.08)))
    assert any("below its E_eq_V" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------------------- any request

NUMBERS = st.one_of(st.floats(allow_nan=True, allow_infinity=True), st.integers(-10, 10),
                    st.sampled_from([0, -0.0, 1e-300, 5e-324, 1e308, "0.1", "x", None, True, [], {}]))
SANE = {"E_eq_V": st.floats(-5, 5), "i0_A_per_cm2": st.floats(-30, 1).map(lambda x: 10.0 ** x),
        "b_anodic_V": st.floats(0.005, 10), "b_cathodic_V": st.floats(0.005, 10),
        "i_lim_A_per_cm2": st.floats(-12, 2).map(lambda x: 10.0 ** x)}


@st.composite
def valid_reaction(draw, k):
    out = {"name": f"r{k}", "E_eq_V": draw(SANE["E_eq_V"]), "i0_A_per_cm2": draw(SANE["i0_A_per_cm2"])}
    direction = draw(st.sampled_from(["anodic", "cathodic", "both"]))
    if direction != "cathodic":
        out["b_anodic_V"] = draw(SANE["b_anodic_V"])
    if direction != "anodic":
        out["b_cathodic_V"] = draw(SANE["b_cathodic_V"])
        if draw(st.booleans()):
            out["i_lim_A_per_cm2"] = draw(SANE["i_lim_A_per_cm2"])
    return out


@st.composite
def valid_request(draw):
    electrodes = []
    for e in range(draw(st.integers(1, 4))):
        reactions = [draw(valid_reaction(k)) for k in range(draw(st.integers(1, 4)))]
        electrodes.append({"name": f"E{e}", "area_cm2": draw(st.floats(-6, 12).map(lambda x: 10.0 ** x)),
                           "reactions": reactions})
    return {"electrodes": electrodes}


@st.composite
def mutated_request(draw):
    """A valid request with one field replaced by junk, dropped, or one unknown field added."""
    request = draw(valid_request())
    e = draw(st.sampled_from(request["electrodes"]))
    target = draw(st.one_of(st.just(e), st.sampled_from(e["reactions"])))
    key = draw(st.sampled_from(sorted(target) + ["junk"]))
    action = draw(st.sampled_from(["replace", "drop"]))
    if action == "drop" and key in target:
        del target[key]
    else:
        target[key] = draw(NUMBERS)
    return request


JUNK_REQUESTS = st.sampled_from([None, [], "x", {}, {"electrodes": "x"}, {"electrodes": [None]},
                                 {"electrodes": [{}]}, {"electrodes": [], "x": 1}])


@settings(max_examples=300, deadline=None, suppress_health_check=[HealthCheck.too_slow])
@given(st.one_of(valid_request(), valid_request(), mutated_request(), JUNK_REQUESTS))
def test_any_request_gives_a_result_or_a_clear_input_error(request_):
    try:
        r = mixed_entry(request_)
    except InputError as exc:
        assert str(exc).startswith(exc.field) and "\n" not in str(exc)
        return
    json.dumps(r, allow_nan=False)
    assert closes(r) and r["balance_relative"] <= BALANCE_TOLERANCE
    assert len(r["electrodes"]) == len(request_["electrodes"])
