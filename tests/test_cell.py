"""Couples (calc.cell): anode, overall reaction, E_cell, ΔG, K, and the E–pH chart carried with the result."""

import itertools
import json

import pytest

from calc import constants, dataset
from calc.cell import couple, couple_entry
from calc.electrode import electrode_entry
from calc.eph import eph_entry
from calc.errors import InputError
from calc.species import balance_problems, parse_species
from oracles import nernst_slope_V
from refdata import reference_bundle

# ln10·RT/F at 25 °C from CODATA 2018 R and F, written out in tests/oracles.py (not calc.constants)
SLOPE25 = nernst_slope_V(25.0)


def E(id_, **cond):
    return electrode_entry({"id": id_, **cond})["potential_V"]


# ---------------------------------------------------------------- Daniell cell

def test_daniell_cell_standard(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu"})
    # Vanýsek, CRC Handbook 92nd ed. (2011), Table 1: E° = 0.3419 − (−0.7618) = 1.1037 V (≈ 1.10 V)
    assert r["anode"] == "Zn2+/Zn" and r["cathode"] == "Cu2+/Cu"
    assert r["standard_cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)
    assert r["cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)
    assert r["n_electrons"] == 2
    assert r["overall_reaction"] == "Cu2+(aq) + Zn(s) → Cu(s) + Zn2+(aq)"
    # ΔG° = −nFE° = −2 × 96485.332 × 1.1037 J/mol = −212.98 kJ/mol; log10 K = 2·1.1037/0.0591593 = 37.313
    # (computed from the above with CODATA 2018 F, R)
    assert r["standard_delta_G_kJ_per_mol"] == pytest.approx(-212.98, abs=0.01)
    assert r["log10_K"] == pytest.approx(37.313, abs=0.001)
    assert r["equilibrium_constant"] == pytest.approx(10 ** r["log10_K"], rel=1e-12)
    # both assumed at unit activity, and the user is told which
    assumed = " ".join(w["message"] for w in r["warnings"] if w["field"] == "activities")
    assert "Zn2+" in assumed and "Cu2+" in assumed


def test_daniell_cell_with_activities(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": 0.1, "Cu2+": 0.001}})
    # Nernst: E = 1.1037 − (0.0591593/2)·log10(0.1/0.001) = 1.044541 V (computed with the CODATA 2018 slope)
    assert r["cell_potential_V"] == pytest.approx(1.0445, abs=5e-5)
    assert r["cell_potential_V"] == pytest.approx(1.1037 - SLOPE25, abs=1e-9)
    assert r["delta_G_kJ_per_mol"] == pytest.approx(-2 * constants.FARADAY * r["cell_potential_V"] / 1000)
    # ΔG = −nFE with F = 96 485.332 12 C/mol (CODATA 2018) written out: −201.566 kJ/mol
    assert r["delta_G_kJ_per_mol"] == pytest.approx(-2 * 96485.33212 * (1.1037 - SLOPE25) / 1000, rel=1e-9)
    assert r["warnings"] == []


# ---------------------------------------------------------------- concentration cells

def test_concentration_cell(shipped):
    r = couple_entry({"a": "Cu2+/Cu", "b": "Cu2+/Cu", "a_conditions": {"activities": {"Cu2+": 0.001}},
                      "b_conditions": {"activities": {"Cu2+": 0.1}}})
    # Nernst: E = (0.0591593/2)·log10(0.1/0.001) = 0.0591593 V (CODATA 2018 slope); the dilute side is the anode
    assert r["cell_potential_V"] == pytest.approx(SLOPE25, abs=1e-9)
    assert r["anode_electrode"]["activities"][0]["activity"] == 0.001
    assert r["standard_cell_potential_V"] == 0.0 and r["log10_K"] == 0.0 and r["equilibrium_constant"] == 1.0
    assert r["overall_reaction"] == "Cu2+(aq, cathode side) → Cu2+(aq, anode side)"


def test_same_electrode_same_conditions_warns(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Zn2+/Zn"})
    assert r["cell_potential_V"] == 0.0
    assert any("no driving force" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------- couple rules

def test_standard_anode_reversal_sn_pb(shipped):
    # E°(Sn2+/Sn) = −0.1375 V < E°(Pb2+/Pb) = −0.1262 V (CRC Table 1): Sn is the standard anode;
    # with a(Pb2+) = 0.001 lead drops by (0.0591593/2)·3 = 0.0887 V and becomes the anode (Nernst, computed)
    r = couple_entry({"a": "Sn2+/Sn", "b": "Pb2+/Pb", "activities": {"Pb2+": 0.001, "Sn2+": 1}})
    assert r["anode"] == "Pb2+/Pb" and r["standard_anode"] == "Sn2+/Sn"
    assert r["standard_cell_potential_V"] == pytest.approx(-0.1375 - (-0.1262), abs=1e-9)
    assert r["standard_delta_G_kJ_per_mol"] > 0
    assert any("reverse" in w["message"] for w in r["warnings"])


def test_lcm_and_species_cancelled(shipped):
    r = couple_entry({"a": "Fe3+/Fe2+", "b": "Fe2+/Fe"})
    assert r["n_electrons"] == 2
    assert r["overall_reaction"] == "2 Fe3+(aq) + Fe(s) → 3 Fe2+(aq)"
    r = couple_entry({"a": "O2/H2O", "b": "Zn2+/Zn", "pH": 7})
    assert r["n_electrons"] == 4
    assert r["overall_reaction"] == "O2(g) + 4 H+(aq) + 2 Zn(s) → 2 H2O(l) + 2 Zn2+(aq)"
    r = couple_entry({"a": "Fe3+/Fe", "b": "Fe3+/Fe2+"})
    assert r["n_electrons"] == 3


def test_equilibrium_constant_overflow_is_null(shipped):
    r = couple_entry({"a": "Cr2O7^2-/Cr3+", "b": "Li+/Li"})
    assert r["n_electrons"] == 6
    assert r["log10_K"] > 300 and r["equilibrium_constant"] is None
    assert "log10_K" in r["equilibrium_constant_note"]
    json.dumps(r, allow_nan=False)


# ---------------------------------------------------------------- invariants over the whole table

def _swapped_fields(result):
    """The result with warning fields a and b exchanged (they name the inputs, which were swapped)."""
    swap = {"a": "b", "b": "a"}
    return {**result, "warnings": [{**w, "field": swap.get(w["field"], w["field"])} for w in result["warnings"]]}


def _without_chart(result):
    return {k: v for k, v in result.items() if k != "eph"}


def _overall_problems(text):
    """Parse an overall reaction string back and check atoms and charge balance."""
    left, right = text.split(" → ")
    lhs = [s for s in left.split(" + ") if s != "(nothing)"]
    rhs = [s for s in right.split(" + ") if s != "(nothing)"]
    return balance_problems(lhs, rhs, 0)


def test_couple_invariants_over_the_table(shipped):
    ids = [r["id"] for r in shipped.records("half_reactions")]
    partners = ["Zn2+/Zn", "O2/H2O", "Fe3+/Fe2+", "Cu2+/Cu"]
    F = constants.FARADAY
    for a, b in itertools.product(ids, partners):
        if a == b:
            continue
        req = {"a": a, "b": b, "pH": 6.5, "temp_C": 40}
        r = couple_entry(req)
        s = couple_entry({**req, "a": b, "b": a})
        # swapping a and b changes nothing but the input names, and the order of the two couple
        # lines (after the two water lines) in the E–pH chart the result carries
        assert _without_chart(r) == _swapped_fields(_without_chart(s)), (a, b)
        assert r["eph"]["lines"] == s["eph"]["lines"][:2] + s["eph"]["lines"][:1:-1], (a, b)
        assert r["anode_potential_V"] <= r["cathode_potential_V"]  # the anode is the lower potential
        assert r["cell_potential_V"] >= 0 and r["delta_G_kJ_per_mol"] <= 0
        assert r["delta_G_kJ_per_mol"] == pytest.approx(-r["n_electrons"] * F * r["cell_potential_V"] / 1000)
        assert _overall_problems(r["overall_reaction"]) == [], (a, b, r["overall_reaction"])


def test_free_energy_additivity_of_linked_couples(shipped):
    # E_cell(A,C) = E_cell(A,B) + E_cell(B,C) for A below B below C: ΔG per electron is additive
    ids = ["Zn2+/Zn", "Fe2+/Fe", "Ni2+/Ni", "Cu2+/Cu", "Ag+/Ag", "O2/H2O"]
    for t in (25, 60):
        for a, b, c in itertools.combinations(ids, 3):
            ab = couple_entry({"a": a, "b": b, "temp_C": t, "pH": 5})["cell_potential_V"]
            bc = couple_entry({"a": b, "b": c, "temp_C": t, "pH": 5})["cell_potential_V"]
            ac = couple_entry({"a": a, "b": c, "temp_C": t, "pH": 5})["cell_potential_V"]
            pots = sorted([a, b, c], key=lambda i: E(i, temp_C=t, pH=5))
            if pots == [a, b, c]:
                assert ac == pytest.approx(ab + bc, abs=1e-12)


@pytest.mark.parametrize("req, field", [
    ({"a": "Zn2+/Zn"}, "b"),
    ({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "a_conditions": {"temp_C": 30}}, "a_conditions.temp_C"),
    ({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "b_conditions": 3}, "b_conditions"),
    ({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "a_conditions": {"activities": {"Zn2+": -1}}}, "a_conditions.activities.Zn2+"),
    ({"a": "Zn2+/Zn", "b": "Copper"}, "b"),
])
def test_couple_rejects_bad_input(shipped, req, field):
    with pytest.raises(InputError) as exc:
        couple_entry(req)
    assert exc.value.field == field


def test_couple_function_matches_entry(shipped):
    r = couple("Zn2+/Zn", "Cu2+/Cu", {"temp_C": 30})
    assert r["cell_potential_V"] == couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 30})["cell_potential_V"]


def test_an_unknown_field_lists_the_fields_in_sorted_order(shipped):
    # the message as it read before the request reader was shared (calc.requests.read)
    with pytest.raises(InputError) as exc:
        couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "c": 1})
    assert str(exc.value) == ("c = 1: expected no such field (couple takes: a, a_conditions, activities, b, "
                              "b_conditions, composition, env, ionic_strength, model, molalities, pH, pressures, "
                              "temp_C)")


# ---------------------------------------------------------------- the E–pH chart in the couple's result

def _page_line(shipped, rid, req):
    """The line the couple page asked ``eph`` for, for one electrode, before the chart came with the
    result (lineFor in docs/assets/js/calculators.mjs): the resolved id, and the request's activities
    and pressures of the species of that half-reaction (by name), each only when not empty."""
    rec = shipped.get("half_reactions", rid)
    names = {parse_species(t).name for t in rec["oxidised"] + rec["reduced"]}
    line = {"id": rec["id"]}
    for key in ("activities", "pressures"):
        kept = {name: v for name, v in (req.get(key) or {}).items() if name in names}
        if kept:
            line[key] = kept
    return line


CHART_REQUESTS = [
    {"a": "Zn2+/Zn", "b": "Cu2+/Cu"},
    # activities of both metals and of a species in neither half-reaction (left out of the lines)
    {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 35, "activities": {"Zn2+": 1e-5, "Cu2+": 1e-6, "Fe2+": 0.1}, "pH": 6.5},
    # a pH-dependent couple: oxygen in air against iron, ids as typed in lower case
    {"a": "o2/h2o", "b": "fe2+/fe", "temp_C": 20, "pressures": {"O2": 0.21}, "activities": {"Fe2+": 1e-6}, "pH": 8},
    # both electrodes pH-dependent, with empty mappings as the page sends them
    {"a": "H2O/H2", "b": "O2/OH-", "temp_C": 60, "pH": 10, "activities": {}, "pressures": {}},
]


@pytest.mark.parametrize("req", CHART_REQUESTS)
def test_the_chart_is_what_eph_gives_for_the_lines_the_page_asked_for(shipped, req):
    lines = [{"id": "H+/H2"}, {"id": "O2/H2O"}, _page_line(shipped, req["a"], req), _page_line(shipped, req["b"], req)]
    ask = {"lines": lines, **({"temp_C": req["temp_C"]} if "temp_C" in req else {})}
    r = couple_entry(req)
    assert r["eph"] == eph_entry(ask)
    assert r["eph"]["temp_C"] == r["temp_C"] and r["eph"]["pH"] == [float(p) for p in range(15)]


def test_the_chart_passes_through_the_couples_own_potentials(shipped):
    # at the request's pH (8, one of the chart's pH values) each couple line is the electrode's
    # potential in the result: the same Nernst equation with the same activities
    r = couple_entry(CHART_REQUESTS[2])
    o2, fe = r["eph"]["lines"][2:]
    assert o2["pH_dependent"] and not fe["pH_dependent"]
    by_id = {r["anode_electrode"]["id"]: r["anode_electrode"], r["cathode_electrode"]["id"]: r["cathode_electrode"]}
    assert o2["potential_V"][8] == by_id["O2/H2O"]["potential_V"]
    assert fe["potential_V"][8] == by_id["Fe2+/Fe"]["potential_V"]


def test_a_chart_that_cannot_be_drawn_leaves_the_couple_standing():
    bundle = reference_bundle()
    bundle["half_reactions"] = [h for h in bundle["half_reactions"] if h["id"] != "O2/H2O"]
    dataset.set_dataset(bundle)
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu"})
    assert r["anode"] == "Zn2+/Zn" and r["cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)
    assert set(r["eph"]) == {"error"} and r["eph"]["error"]["field"] == "lines[1].id"
    assert r["eph"]["error"]["message"].startswith("lines[1].id = 'O2/H2O': expected a known half reaction id")
    json.dumps(r, allow_nan=False)


def test_a_couple_checks_its_temperature_once(shipped, monkeypatch):
    from calc import conditions, derivation, eph, standard

    calls = []

    def counted(value, field="temp_C"):
        calls.append(field)
        return derivation.check_temperature(value, field)

    for module in (conditions, eph, standard):
        monkeypatch.setattr(module, "check_temperature", counted)
    couple_entry({"a": "Zn2+/Zn", "b": "O2/H2O", "temp_C": 40, "pH": 7, "b_conditions": {"pressures": {"O2": 0.21}}})
    assert calls == ["temp_C"]


# ---------------------------------------------------------------- E–pH lines that stop at a solid

def test_the_metal_ion_line_stops_where_the_oxide_is_the_stable_solid(shipped):
    # Zn2+/Zn at a(Zn2+) = 1e-5, 25 °C: E = −0.7618 + (0.059159/2)·(−5) V (OpenStax Chemistry 2e,
    # Appendix L); ZnO/Zn (ZnO + H2O + 2e− → Zn + 2 OH−, CRC −1.260 V, recalled) is
    # E = −1.260 − 0.059159·(pH − pKw), pKw 13.995 at 25 °C (Bandura & Lvov 2006). The two cross at
    # pH = pKw − (E_ion + 1.260)/0.059159 = 8.07; above it ZnO, not Zn2+, is what zinc oxidises to.
    slope = nernst_slope_V(25)
    e_ion = -0.7618 + slope / 2 * -5
    expected = 13.995 - (e_ion + 1.260) / slope
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": 1e-5, "Cu2+": 1}})
    lines = {ln["id"]: ln for ln in r["eph"]["lines"]}
    zn = lines["Zn2+/Zn"]
    assert zn["meaningful_up_to_pH"] == pytest.approx(expected, abs=0.02)
    assert zn["meaningful"] == [p <= zn["meaningful_up_to_pH"] for p in r["eph"]["pH"]]
    stop = zn["not_meaningful"][0]
    assert (stop["solid"], stop["line"]) == ("ZnO", "ZnO/Zn") and "ZnO is the stable solid" in stop["reason"]
    assert any("hydroxo-complexes" in c for c in stop["caveats"])
    for rid in ("H+/H2", "O2/H2O"):  # the water lines hold at every pH
        assert lines[rid]["meaningful"] == [True] * 15 and lines[rid]["not_meaningful"] == []
    # the potentials themselves are those of the line as before: only the marks are added
    assert zn["potential_V"] == [pytest.approx(e_ion, abs=2e-4)] * 15


def test_the_lower_activity_the_later_the_solid_takes_over(shipped):
    # A more dilute ion line lies lower, so the falling oxide line crosses it at a higher pH: two
    # decades of a(Zn2+) move the crossing by one pH unit (n = 2, the oxide line's slope is one Nernst slope)
    at = {a: couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": a}})["eph"]["lines"][2]
          for a in (1e-4, 1e-6)}
    assert at[1e-6]["meaningful_up_to_pH"] - at[1e-4]["meaningful_up_to_pH"] == pytest.approx(1.0, abs=0.02)


def test_the_eph_entry_marks_its_lines_the_same_way(shipped):
    r = eph_entry({"lines": [{"id": "Zn2+/Zn", "activities": {"Zn2+": 1e-5}}, {"id": "Cr2O7^2-/Cr3+"}]})
    zn, cr = r["lines"]
    c = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": 1e-5}})["eph"]["lines"][2]
    assert zn["meaningful_up_to_pH"] == c["meaningful_up_to_pH"] and zn["meaningful"] == c["meaningful"]
    assert cr["meaningful_up_to_pH"] is None  # not a metal-ion line: nothing to clip
