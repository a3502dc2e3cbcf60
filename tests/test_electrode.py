"""The potential of one electrode (calc.electrode, calc.conditions): Nernst with the full quotient."""

import json
import math

import pytest

from calc import water
from calc.electrode import electrode_entry, nernst
from calc.errors import InputError
from oracles import NERNST_SLOPE_V, nernst_slope_V

# The Nernst slope ln10·RT/F is written out from CODATA 2018 R and F (tests/oracles.py), never taken
# from calc.constants: 0.059 159 35 V per decade at 25 °C.
SLOPE25 = nernst_slope_V(25.0)


def E(id_, **cond):
    return electrode_entry({"id": id_, **cond})["potential_V"]


# ---------------------------------------------------------------- concentration cells

def test_concentration_cell_by_electrodes(shipped):
    # Ag+/Ag, n = 1: a ten-fold activity ratio gives one Nernst slope, 59.159 mV at 25 °C
    # (ln10·RT/F from CODATA 2018 R and F, tests/oracles.py)
    assert E("Ag+/Ag", activities={"Ag+": 0.1}) - E("Ag+/Ag", activities={"Ag+": 0.01}) == pytest.approx(SLOPE25, rel=1e-12)
    # at 60 °C the slope grows with T: ln10·R·333.15 K/F = 66.104 mV (the same constants)
    d = E("Ag+/Ag", temp_C=60, activities={"Ag+": 0.1}) - E("Ag+/Ag", temp_C=60, activities={"Ag+": 0.01})
    assert d * 1000 == pytest.approx(66.104, abs=0.001)
    assert d == pytest.approx(NERNST_SLOPE_V[60], rel=1e-9)


# ---------------------------------------------------------------- hydrogen and oxygen electrodes

@pytest.mark.parametrize("pH", [0, 1, 4, 7, 10, 14])
def test_hydrogen_electrode(shipped, pH):
    # Nernst for 2H+ + 2e- → H2 at p(H2) = 1 bar: E = −(ln10·RT/F)·pH = −0.059159·pH at 25 °C
    assert E("H+/H2", pH=pH) == pytest.approx(-SLOPE25 * pH, abs=1e-12)
    # the alkaline form H2O/H2 (Vanýsek, CRC Handbook 92nd ed. 2011, Table 1: −0.8277 V) gives the same
    # line within 1 mV: −0.059159 × pKw 13.995 = −0.8279 V (computed)
    assert E("H2O/H2", pH=pH) == pytest.approx(-SLOPE25 * pH, abs=0.001)


@pytest.mark.parametrize("pH", [0, 3, 7, 8.2, 14])
def test_oxygen_electrode(shipped, pH):
    # 1.229 − 0.059159·pH at p(O2) = 1 bar (Vanýsek, CRC Handbook 92nd ed. 2011, Table 1, E° of O2/H2O;
    # the Nernst equation with the CODATA 2018 slope)
    assert E("O2/H2O", pH=pH) == pytest.approx(1.229 - SLOPE25 * pH, abs=1e-9)
    # the alkaline form O2/OH- (the same table: 0.401 V) agrees within 1 mV: 1.229 − 0.059159 × 13.995 = 0.401 V
    assert E("O2/OH-", pH=pH) == pytest.approx(1.229 - SLOPE25 * pH, abs=0.001)


def test_oxygen_in_air_pressure_in_atm(shipped):
    # p(O2) = 0.21 atm → a = 0.21 × 1.01325 (standard state 1 bar); n = 4
    e = E("O2/H2O", pH=7, pressures={"O2": 0.21})
    assert e == pytest.approx(1.229 - SLOPE25 * 7 + SLOPE25 / 4 * math.log10(0.21 * 1.01325), abs=1e-12)
    # written out: 1.229 − 0.414115 − 0.009940 = 0.804945 V
    assert e == pytest.approx(0.804945, abs=1e-6)


def test_water_at_unit_activity_and_hydroxide_from_kw(shipped):
    r = electrode_entry({"id": "O2/OH-", "pH": 9, "temp_C": 50})
    acts = {a["species"]: a for a in r["activities"]}
    assert acts["H2O"]["activity"] == 1.0
    # a(OH-) = Kw(T)/a(H+); pKw(50 °C, 0.1 MPa) = 13.264 in the CRC Handbook of Chemistry and Physics table
    # "Ionization Constant of Water as a Function of Temperature and Pressure" (computed there with
    # Bandura & Lvov, J. Phys. Chem. Ref. Data 35 (2006) 15; read in the online edition, section 5)
    assert acts["OH-"]["activity"] == pytest.approx(10 ** (9 - 13.264), rel=0.003)
    assert acts["OH-"]["activity"] == pytest.approx(10 ** (9 - water.pKw(50)), rel=1e-12)
    assert water.pKw(50) == pytest.approx(13.264, abs=0.001)


# ---------------------------------------------------------------- activities from molality

def test_molality_with_model_and_ionic_strength(shipped):
    r = electrode_entry({"id": "Zn2+/Zn", "molalities": {"Zn2+": 0.01, "SO4^2-": 0.01}, "model": "davies"})
    # I = ½(0.01·4 + 0.01·4) = 0.04; Davies γ(z=2) with 0.3·I (C. W. Davies, Ion Association, 1962)
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


# ---------------------------------------------------------------- flags of the dataset

def test_hypothetical_flag(shipped):
    hyp = [r["id"] for r in shipped.records("half_reactions") if r.get("hypothetical")]
    assert "Ti2+/Ti" in hyp
    r = electrode_entry({"id": "Ti2+/Ti"})
    assert r["hypothetical"] is True
    assert any("hypothetical" in w["message"] for w in r["warnings"])


# ---------------------------------------------------------------- invariants over the whole table

def test_every_half_reaction_computes(shipped):
    for rec in shipped.records("half_reactions"):
        for t in (0, 25, 100):
            r = electrode_entry({"id": rec["id"], "temp_C": t, "pH": 7})
            json.dumps(r, allow_nan=False)
            assert math.isfinite(r["potential_V"])


def test_nernst_function():
    # E = E° − (ln10·RT/nF)·log10 Q (IUPAC Green Book, 3rd ed. 2007, §2.13), the slope written out from
    # CODATA 2018 R and F (tests/oracles.py): 59.159 mV at 25 °C, 54.199 mV at 0 °C, 74.041 mV at 100 °C
    assert nernst(0.0, 1, 1.0, 25.0) == pytest.approx(-0.0591593497, abs=1e-10)
    for t, slope in NERNST_SLOPE_V.items():
        assert nernst(0.0, 1, 1.0, t) == pytest.approx(-slope, rel=1e-9), t
        assert nernst(0.5, 2, -3.0, t) == pytest.approx(0.5 + 1.5 * slope, rel=1e-9), t
        assert nernst(0.0, 1, 1.0, t) == pytest.approx(-nernst_slope_V(t), rel=1e-9), t


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
    # Nernst, n = 2: −0.7618 + (0.059159/2)·log10 0.01 = −0.820959 V
    assert r["potential_V"] == pytest.approx(-0.7618 + SLOPE25 / 2 * math.log10(0.01), abs=1e-12)
    assert r["potential_V"] == pytest.approx(-0.820959, abs=1e-6)
    assert any(w["field"] == "ionic_strength" for w in r["warnings"])


def test_an_unknown_field_lists_the_fields_in_sorted_order(shipped):
    # the message as it read before the request reader was shared (calc.requests.read)
    with pytest.raises(InputError) as exc:
        electrode_entry({"id": "Zn2+/Zn", "temperature": 30})
    assert str(exc.value) == ("temperature = 30: expected no such field (electrode takes: activities, composition, "
                              "env, id, ionic_strength, model, molalities, pH, pressures, temp_C)")
    with pytest.raises(InputError) as exc:
        electrode_entry({"temp_C": 30})
    assert str(exc.value) == "id = None: expected a half-reaction id such as Zn2+/Zn"


# ---------------------------------------------------------------- the field scales (potential_vs)

def test_potential_on_the_field_scales_at_25_C(shipped):
    # The hydrogen electrode at pH 0 and p(H2) = 1 bar is 0 V vs SHE, so against each reference it is
    # minus that electrode's potential: SCE 0.2412 V (Sawyer, Sobkowiak & Roberts, Electrochemistry for
    # Chemists, 2nd ed. 1995), CSE 0.316 V (Szabó & Bakos, Int. J. Corros. 2010, 756950, Table 2),
    # Ag/AgCl sat. KCl 0.197 V (Sawyer et al. 1995) and Ag/AgCl seawater 0.25 V (EN 12473, recalled).
    r = electrode_entry({"id": "H+/H2", "pH": 0, "pressures": {"H2": 1 / 1.01325}})
    assert r["potential_V"] == pytest.approx(0.0, abs=1e-12)
    assert list(r["potential_vs"]) == ["CSE", "SCE", "Ag/AgCl sat. KCl", "Ag/AgCl seawater"]
    expected = {"CSE": -0.316, "SCE": -0.2412, "Ag/AgCl sat. KCl": -0.197, "Ag/AgCl seawater": -0.25}
    for rid, v in expected.items():
        assert r["potential_vs"][rid] == pytest.approx(v, abs=1e-4), rid
    assert len(r["potential_vs_detail"]["steps"]) == 4 and r["potential_vs_detail"]["warnings"] == []


def test_potential_on_the_field_scales_follows_the_request_temperature(shipped):
    # Each electrode at the request's temperature, by its published model (evaluated in tests/oracles.py
    # from data/reference_electrodes.yaml, not through calc): E(vs X) = E(vs SHE) − E(X vs SHE at t)
    from oracles import published_model_V, stored_reference_electrodes

    refs = stored_reference_electrodes()
    r = electrode_entry({"id": "Cu2+/Cu", "temp_C": 35, "activities": {"Cu2+": 0.01}})
    for rid, v in r["potential_vs"].items():
        assert v == pytest.approx(r["potential_V"] - published_model_V(refs[rid], 35.0), abs=1e-12), rid
    # the CSE warms by 0.9 mV/K (makers' figure, common practice): 9 mV more positive at 35 °C
    assert r["potential_V"] - r["potential_vs"]["CSE"] == pytest.approx(0.316 + 0.009, abs=1e-9)
    hot = electrode_entry({"id": "Cu2+/Cu", "temp_C": 75, "activities": {"Cu2+": 0.01}})
    warned = " ".join(w["message"] for w in hot["potential_vs_detail"]["warnings"])
    assert "SCE temperature model" in warned and "extrapolated" in warned


def test_a_potential_no_meter_reads_is_not_put_on_the_field_scales(shipped):
    # a(Zn2+) = 1e-300 puts Zn2+/Zn near −9.6 V vs SHE: within calc's range of potentials, but the
    # conversion of readings takes −10 to +10 V only; beyond that nothing is converted, with a warning
    r = electrode_entry({"id": "Zn2+/Zn", "temp_C": 75, "activities": {"Zn2+": 1e-300}})
    assert r["potential_V"] < -10
    assert r["potential_vs"] == {} and "not expressed on the field scales" in r["potential_vs_detail"]["warnings"][0]["message"]


def test_the_curves_of_the_page_are_the_potential_at_each_point(shipped):
    # One request carries the page's two curves; each point is the electrode at that temperature or activity
    req = {"id": "Zn2+/Zn", "temp_C": 30, "activities": {"Zn2+": 2e-6}}
    r = electrode_entry(req)
    t = r["curves"]["temperature"]
    assert t["temp_C"][0] == 0 and t["temp_C"][-1] == 100 and len(t["temp_C"]) == len(t["potential_V"])
    k = t["temp_C"].index(30.0)
    assert t["potential_V"][k] == pytest.approx(r["potential_V"], abs=1e-12)
    a = r["curves"]["activity"]
    assert a["species"] == "Zn2+" and a["log10_activity"] == [float(x) for x in range(-8, 1)]
    for lg, e in zip(a["log10_activity"], a["potential_V"]):
        one = electrode_entry({**req, "activities": {"Zn2+": 10.0 ** lg}})["potential_V"]
        assert e == pytest.approx(one, abs=1e-12)
    # ten-fold activity: one Nernst slope over n = 2 at 30 °C (CODATA 2018 constants, tests/oracles.py)
    assert a["potential_V"][-1] - a["potential_V"][-2] == pytest.approx(nernst_slope_V(30) / 2, rel=1e-9)
    assert electrode_entry({"id": "H+/H2", "pH": 3})["curves"]["activity"] is None  # no dissolved species given
