"""E°(T), the Nernst equation and couples (calc.potentials, calc.conditions)."""

import itertools
import json
import math

import pytest

from calc import constants, dataset, water
from calc.errors import InputError
from calc.potentials import (couple, couple_entry, electrode_entry, gibbs_helmholtz, nernst, standard_potential)
from calc.species import balance_problems
from refdata import reference_bundle

SLOPE25 = constants.nernst_slope(298.15)


def E(id_, **cond):
    return electrode_entry({"id": id_, **cond})["potential_V"]


# ---------------------------------------------------------------- constants

def test_faraday_and_gas_constant_match_scipy():
    sc = pytest.importorskip("scipy.constants")
    # CODATA 2018 via scipy.constants (REFERENCE-DATA §1: F = 96485.33212331, R = 8.31446261815324)
    assert constants.FARADAY == pytest.approx(sc.physical_constants["Faraday constant"][0], rel=1e-12)
    assert constants.R_GAS == pytest.approx(sc.R, rel=1e-12)
    assert constants.EPSILON_0 == pytest.approx(sc.epsilon_0, rel=1e-9)


def test_nernst_slope_table():
    # REFERENCE-DATA §1 [C]: ln10·RT/F = 54.199 mV at 0 °C, 59.159 mV at 25 °C, 74.041 mV at 100 °C
    for t, mv in ((0, 54.199), (25, 59.159), (100, 74.041)):
        assert constants.nernst_slope(t + 273.15) * 1000 == pytest.approx(mv, abs=0.001)


# ---------------------------------------------------------------- Daniell cell

def test_daniell_cell_standard(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu"})
    # Vanýsek, CRC Handbook 92nd ed. (2011), Table 1: E° = 0.3419 − (−0.7618) = 1.1037 V (≈ 1.10 V)
    assert r["anode"] == "Zn2+/Zn" and r["cathode"] == "Cu2+/Cu"
    assert r["standard_cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)
    assert r["cell_potential_V"] == pytest.approx(1.1037, abs=1e-9)
    assert r["n_electrons"] == 2
    assert r["overall_reaction"] == "Cu2+(aq) + Zn(s) → Cu(s) + Zn2+(aq)"
    # ΔG° = −nFE° = −212.98 kJ/mol; log10 K = 2·1.1037/0.0591594 = 37.31 (computed from the above)
    assert r["standard_delta_G_kJ_per_mol"] == pytest.approx(-212.98, abs=0.01)
    assert r["log10_K"] == pytest.approx(37.313, abs=0.001)
    assert r["equilibrium_constant"] == pytest.approx(10 ** r["log10_K"], rel=1e-12)
    # both assumed at unit activity, and the user is told which
    assumed = " ".join(w["message"] for w in r["warnings"] if w["field"] == "activities")
    assert "Zn2+" in assumed and "Cu2+" in assumed


def test_daniell_cell_with_activities(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Cu2+/Cu", "activities": {"Zn2+": 0.1, "Cu2+": 0.001}})
    # Nernst: E = 1.1037 − (0.05916/2)·log10(0.1/0.001) = 1.0445 V (common practice textbook example)
    assert r["cell_potential_V"] == pytest.approx(1.0445, abs=5e-5)
    assert r["delta_G_kJ_per_mol"] == pytest.approx(-2 * constants.FARADAY * r["cell_potential_V"] / 1000)
    assert r["warnings"] == []


# ---------------------------------------------------------------- concentration cells

def test_concentration_cell(shipped):
    r = couple_entry({"a": "Cu2+/Cu", "b": "Cu2+/Cu", "a_conditions": {"activities": {"Cu2+": 0.001}},
                      "b_conditions": {"activities": {"Cu2+": 0.1}}})
    # Nernst, common practice: E = (0.05916/2)·log10(0.1/0.001) = 0.05916 V; the dilute side is the anode
    assert r["cell_potential_V"] == pytest.approx(SLOPE25, abs=1e-9)
    assert r["anode_electrode"]["activities"][0]["activity"] == 0.001
    assert r["standard_cell_potential_V"] == 0.0 and r["log10_K"] == 0.0 and r["equilibrium_constant"] == 1.0
    assert r["overall_reaction"] == "Cu2+(aq, cathode side) → Cu2+(aq, anode side)"


def test_concentration_cell_by_electrodes(shipped):
    # Ag+/Ag, n = 1: ten-fold activity ratio gives one Nernst slope (common practice)
    assert E("Ag+/Ag", activities={"Ag+": 0.1}) - E("Ag+/Ag", activities={"Ag+": 0.01}) == pytest.approx(SLOPE25, rel=1e-12)
    # at 60 °C the slope grows with T (REFERENCE-DATA §1: 66.104 mV at 60 °C)
    d = E("Ag+/Ag", temp_C=60, activities={"Ag+": 0.1}) - E("Ag+/Ag", temp_C=60, activities={"Ag+": 0.01})
    assert d * 1000 == pytest.approx(66.104, abs=0.001)


def test_same_electrode_same_conditions_warns(shipped):
    r = couple_entry({"a": "Zn2+/Zn", "b": "Zn2+/Zn"})
    assert r["cell_potential_V"] == 0.0
    assert any("no driving force" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------- hydrogen and oxygen electrodes

@pytest.mark.parametrize("pH", [0, 1, 4, 7, 10, 14])
def test_hydrogen_electrode(shipped, pH):
    # Nernst for 2H+ + 2e- → H2 at p(H2) = 1 bar: E = −0.05916·pH (common practice)
    assert E("H+/H2", pH=pH) == pytest.approx(-SLOPE25 * pH, abs=1e-12)
    # the alkaline form H2O/H2 (CRC −0.8277 V) gives the same line within 1 mV
    # (REFERENCE-DATA §2: −0.05916 × 13.996 = −0.8280)
    assert E("H2O/H2", pH=pH) == pytest.approx(-SLOPE25 * pH, abs=0.001)


@pytest.mark.parametrize("pH", [0, 3, 7, 8.2, 14])
def test_oxygen_electrode(shipped, pH):
    # 1.229 − 0.05916·pH at p(O2) = 1 bar (CRC Table 1 E° of O2/H2O; common practice)
    assert E("O2/H2O", pH=pH) == pytest.approx(1.229 - SLOPE25 * pH, abs=1e-9)
    # the alkaline form O2/OH- (CRC 0.401 V) agrees within 1 mV (REFERENCE-DATA §2: 1.229 − 0.05916×14 = 0.401)
    assert E("O2/OH-", pH=pH) == pytest.approx(1.229 - SLOPE25 * pH, abs=0.001)


def test_oxygen_in_air_pressure_in_atm(shipped):
    # p(O2) = 0.21 atm → a = 0.21 × 1.01325 (standard state 1 bar); n = 4
    e = E("O2/H2O", pH=7, pressures={"O2": 0.21})
    assert e == pytest.approx(1.229 - SLOPE25 * 7 + SLOPE25 / 4 * math.log10(0.21 * 1.01325), abs=1e-12)


def test_water_at_unit_activity_and_hydroxide_from_kw(shipped):
    r = electrode_entry({"id": "O2/OH-", "pH": 9, "temp_C": 50})
    acts = {a["species"]: a for a in r["activities"]}
    assert acts["H2O"]["activity"] == 1.0
    # a(OH-) = Kw(T)/a(H+), pKw(50 °C) = 13.26 (Bandura & Lvov 2006, from memory)
    assert acts["OH-"]["activity"] == pytest.approx(10 ** (9 - water.pKw(50)), rel=1e-12)
    assert water.pKw(50) == pytest.approx(13.26, abs=0.01)


# ---------------------------------------------------------------- E°(T)

# NBS entropies (Wagman et al., J. Phys. Chem. Ref. Data 11 Suppl. 2, 1982), read in the
# OpenStax Chemistry 2e Appendix G copy (REFERENCE-DATA §2): S°(H2) 130.684, S°(H+) 0
S = {"Ag+": 72.68, "Ag": 42.55, "Cu2+": -99.6, "Cu": 33.15, "Zn2+": -112.1, "Zn": 41.6}


@pytest.mark.parametrize("ion, metal, n", [("Ag+", "Ag", 1), ("Cu2+", "Cu", 2), ("Zn2+", "Zn", 2)])
def test_temperature_coefficient_from_nbs_entropies(shipped, ion, metal, n):
    # dE°/dT = ΔS°/(nF) for M^n+ + n/2 H2 → M + n H+ (Bratsch, J. Phys. Chem. Ref. Data 18 (1989) 1)
    dS = S[metal] - S[ion] - n / 2 * 130.684
    rec = shipped.get("half_reactions", f"{ion}/{metal}")
    assert rec["dEdT_mV_per_K"] == pytest.approx(dS / (n * constants.FARADAY) * 1000, abs=0.005)
    for t in (0, 50, 100):
        r = standard_potential(f"{ion}/{metal}", t)
        assert r.standard_potential_V == pytest.approx(rec["E0_V"] + dS / (n * constants.FARADAY) * (t - 25), abs=2e-4)


def test_silver_and_copper_at_60_C(shipped):
    # CRC E° with Bratsch (1989) coefficients (REFERENCE-DATA §2): Ag+/Ag −0.989 mV/K,
    # Cu2+/Cu +0.011 mV/K: E°(60 °C) = 0.7996 − 0.0346 = 0.7650 V and 0.3419 + 0.0004 = 0.3423 V
    assert standard_potential("Ag+/Ag", 60).standard_potential_V == pytest.approx(0.7650, abs=2e-4)
    assert standard_potential("Cu2+/Cu", 60).standard_potential_V == pytest.approx(0.3423, abs=2e-4)


def test_heat_capacity_term_against_bates_bower():
    dataset.set_dataset(reference_bundle())
    bb = lambda t: 0.23659 - 4.8564e-4 * t - 3.4205e-6 * t ** 2 + 5.869e-9 * t ** 3  # noqa: E731
    # Bates & Bower, J. Res. NBS 53 (1954) 283: E°(AgCl/Ag) polynomial, 0-95 °C (from memory).
    # ΔCp° = Cp(Ag) + Cp(Cl-) − Cp(AgCl) − ½Cp(H2) = 25.35 − 136.4 − 50.79 − 14.41 = −176.25 J/(mol·K)
    # (NBS Cp° values, Wagman et al. 1982, from memory); slope −0.6457 mV/K is the polynomial's at 25 °C
    for t in (0, 10, 40, 60, 80, 95):
        with_cp = gibbs_helmholtz(bb(25), -0.6457e-3, 1, t, -176.25)
        assert with_cp == pytest.approx(bb(t), abs=0.0015), t
    # without the ΔCp° term the 95 °C value is more than 10 mV off: the term matters and its sign is right
    assert gibbs_helmholtz(bb(25), -0.6457e-3, 1, 95) - bb(95) > 0.010


def test_heat_capacity_in_a_record():
    bundle = reference_bundle()
    rec = next(r for r in bundle["half_reactions"] if r["id"] == "AgCl/Ag")
    rec.update(dEdT_mV_per_K=-0.6457, dCp_J_per_mol_K=-176.25, dCp_source="wagman-nbs-1982")
    dataset.set_dataset(bundle)
    r = standard_potential("AgCl/Ag", 80)
    assert r.standard_potential_V == pytest.approx(gibbs_helmholtz(0.22233, -0.6457e-3, 1, 80, -176.25), abs=1e-12)
    assert "ΔCp°" in r.steps[1]["formula"]


def test_hydrogen_zero_at_every_temperature(shipped):
    for t in range(0, 101, 5):
        assert standard_potential("H+/H2", t).standard_potential_V == 0.0


def test_no_coefficient_warns_away_from_25(shipped):
    rec = next(r for r in shipped.records("half_reactions") if r.get("dEdT_mV_per_K") is None)
    assert standard_potential(rec["id"], 25).warnings == ()
    w = standard_potential(rec["id"], 50).warnings
    assert w and w[0]["field"] == "temp_C"


def test_valid_range_warning():
    bundle = reference_bundle()
    rec = next(r for r in bundle["half_reactions"] if r["id"] == "Cu2+/Cu")
    rec["valid_C"] = [0, 60]
    dataset.set_dataset(bundle)
    assert standard_potential("Cu2+/Cu", 60).warnings == ()
    w = standard_potential("Cu2+/Cu", 61).warnings
    assert w and "outside the range" in w[0]["message"]


# ---------------------------------------------------------------- activities from molality

def test_molality_with_model_and_ionic_strength(shipped):
    r = electrode_entry({"id": "Zn2+/Zn", "molalities": {"Zn2+": 0.01, "SO4^2-": 0.01}, "model": "davies"})
    # I = ½(0.01·4 + 0.01·4) = 0.04; Davies γ(z=2) computed the same way as calc.activity
    A = water.debye_huckel_A(25)
    g = 10 ** (-A * 4 * (0.2 / 1.2 - 0.3 * 0.04))
    assert r["potential_V"] == pytest.approx(-0.7618 + SLOPE25 / 2 * math.log10(g * 0.01), abs=1e-12)
    assert not any(w["field"].startswith("molalities") for w in r["warnings"])


def test_missing_counter_ion_warned(shipped):
    r = electrode_entry({"id": "Zn2+/Zn", "molalities": {"Zn2+": 0.01}})
    assert any("counter-ions" in w["message"] for w in r["warnings"])


def test_environment_ionic_strength(shipped):
    env = shipped.get("environments", "seawater-flowing")
    r = electrode_entry({"id": "Zn2+/Zn", "molalities": {"Zn2+": 1e-4}, "env": "seawater-flowing", "model": "davies"})
    I = env["ionic_strength_mol_per_kg"]
    A = water.debye_huckel_A(25)
    g = 10 ** (-A * 4 * (math.sqrt(I) / (1 + math.sqrt(I)) - 0.3 * I))
    assert r["potential_V"] == pytest.approx(-0.7618 + SLOPE25 / 2 * math.log10(g * 1e-4), abs=1e-12)
    assert env["ionic_strength_source"] in r["sources"]


# ---------------------------------------------------------------- couple rules

def test_standard_anode_reversal_sn_pb(shipped):
    # E°(Sn2+/Sn) = −0.1375 V < E°(Pb2+/Pb) = −0.1262 V (CRC Table 1): Sn is the standard anode;
    # with a(Pb2+) = 0.001 lead drops by 0.0887 V and becomes the anode (common practice)
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


def test_hypothetical_flag(shipped):
    hyp = [r["id"] for r in shipped.records("half_reactions") if r.get("hypothetical")]
    assert "Ti2+/Ti" in hyp
    r = electrode_entry({"id": "Ti2+/Ti"})
    assert r["hypothetical"] is True
    assert any("hypothetical" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------- invariants over the whole table

def _swapped_fields(result):
    """The result with warning fields a and b exchanged (they name the inputs, which were swapped)."""
    swap = {"a": "b", "b": "a"}
    return {**result, "warnings": [{**w, "field": swap.get(w["field"], w["field"])} for w in result["warnings"]]}


def _overall_problems(text):
    """Parse an overall reaction string back and check atoms and charge balance."""
    left, right = text.split(" → ")
    lhs = [s for s in left.split(" + ") if s != "(nothing)"]
    rhs = [s for s in right.split(" + ") if s != "(nothing)"]
    return balance_problems(lhs, rhs, 0)


def test_every_half_reaction_computes(shipped):
    for rec in shipped.records("half_reactions"):
        for t in (0, 25, 100):
            r = electrode_entry({"id": rec["id"], "temp_C": t, "pH": 7})
            json.dumps(r, allow_nan=False)
            assert math.isfinite(r["potential_V"])


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
        assert r == _swapped_fields(s), (a, b)  # swapping a and b changes nothing but the input names
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


def test_nernst_function():
    # E = E° − (0.05916/n)·log10 Q (Nernst 1889)
    assert nernst(0.0, 1, 1.0, 25.0) == pytest.approx(-SLOPE25, rel=1e-12)


# ---------------------------------------------------------------- bad input, each bound

@pytest.mark.parametrize("req, field", [
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": 0}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": -0.1}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": float("nan")}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": float("inf")}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": "lots"}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": {"Zn2+": 1e7}}, "activities.Zn2+"),
    ({"id": "Zn2+/Zn", "activities": [0.1]}, "activities"),
    ({"id": "Zn2+/Zn", "molalities": {"Zn2+": 0}}, "molalities.Zn2+"),
    ({"id": "O2/H2O", "pressures": {"O2": 0}}, "pressures.O2"),
    ({"id": "Zn2+/Zn", "temp_C": -0.01}, "temp_C"),
    ({"id": "Zn2+/Zn", "temp_C": 100.01}, "temp_C"),
    ({"id": "H+/H2", "pH": -2.01}, "pH"),
    ({"id": "H+/H2", "pH": 16.01}, "pH"),
    ({"id": "H+/H2", "pH": 7, "activities": {"H+": 1e-7}}, "activities.H+"),
    ({"id": "Zn2+/Zn", "model": "sit"}, "model"),
    ({"id": "Zn2+/Zn", "ionic_strength": 0.1, "env": "seawater-flowing"}, "env"),
    ({"id": "Zn2+/Zn", "env": "the moon"}, "env"),
    ({"id": "Zn2+/Zn", "env": "indoor-controlled"}, "env"),
    ({"id": "Zn2+/Zn", "composition": {"Na+": -1}}, "composition.Na+"),
    ({"id": "Zn2+/Zn", "composition": [1]}, "composition"),
    ({"id": "Zn2+/Zn", "ionic_strength": 6}, "ionic_strength"),
    ({"id": "Zn2/Zn"}, "id"),
    ({"id": 12}, "id"),
    ({}, "id"),
    ({"id": "Zn2+/Zn", "temperature": 30}, "temperature"),
])
def test_electrode_rejects_bad_input(shipped, req, field):
    with pytest.raises(InputError) as exc:
        electrode_entry(req)
    assert exc.value.field == field


def test_unknown_id_offers_closest(shipped):
    with pytest.raises(InputError) as exc:
        electrode_entry({"id": "Zn2/Zn"})
    assert "Zn2+/Zn" in str(exc.value)


@pytest.mark.parametrize("pH, warned", [(-1, True), (0, False), (14, False), (15, True)])
def test_ph_warning_outside_0_14(shipped, pH, warned):
    r = electrode_entry({"id": "H+/H2", "pH": pH})
    assert any(w["field"] == "pH" for w in r["warnings"]) is warned


def test_unused_values_are_reported(shipped):
    r = electrode_entry({"id": "Zn2+/Zn", "activities": {"Zn2+": 0.1, "Cu2+": 0.1}, "pH": 7})
    fields = {w["field"] for w in r["warnings"]}
    assert "activities.Cu2+" in fields and "pH" in fields
    r = electrode_entry({"id": "Zn2+/Zn", "activities": {"Zn2+": 0.1}, "env": "seawater-flowing"})
    assert [w["field"] for w in r["warnings"]] == ["env"]


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


def test_water_activity_can_be_given(shipped):
    # O2/OH- at pH 8 with a(H2O) = 0.98 (seawater, common practice): a(H2O) enters Q on the oxidised
    # side with power 2 and a(OH-) = Kw·a(H2O)/a(H+) with power 4: net log10 Q changes by 2·log10 0.98
    base = electrode_entry({"id": "O2/OH-", "pH": 8})
    wet = electrode_entry({"id": "O2/OH-", "pH": 8, "activities": {"H2O": 0.98}})
    assert wet["log10_Q"] - base["log10_Q"] == pytest.approx(2 * math.log10(0.98), abs=1e-12)
    assert wet["warnings"] == base["warnings"]


def test_ideal_model_warns_at_real_ionic_strength(shipped):
    r = electrode_entry({"id": "Zn2+/Zn", "molalities": {"Zn2+": 0.01, "SO4^2-": 0.01}, "model": "ideal"})
    # ideal is taken as valid to 0.001 mol/kg only; here I = 0.04 mol/kg
    assert r["potential_V"] == pytest.approx(-0.7618 + SLOPE25 / 2 * math.log10(0.01), abs=1e-12)
    assert any(w["field"] == "ionic_strength" for w in r["warnings"])
