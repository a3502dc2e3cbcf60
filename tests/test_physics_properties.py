"""Physics the engine must obey for any input, checked under hypothesis on the shipped dataset.

Where test_robustness.py checks the contract (a result or a named error), these check the numbers:

- reference electrodes (calc.refelec): a conversion round-trips and is transitive, and its offset is
  E(from, t) − E(to, t) from the temperature models published in data/reference_electrodes.yaml,
  evaluated in tests/oracles.py (the RHE: −(ln10·RT/F)·pH);
- Nernst (calc.electrode): ∂E/∂log10 a(i) = −ν_i·(ln10·RT/F)/n for every species i of every
  half-reaction, ν_i > 0 on the reduced side and < 0 on the oxidised side (IUPAC Green Book, 3rd
  ed. 2007, §2.13), with the slope from CODATA 2018 R and F written out in tests/oracles.py;
  ∂E/∂pH = (ν_H+ − ν_OH-)·slope/n;
- joints (calc.joint): the anode, the verdict, the difference and the rate do not depend on which part
  is called a and which b;
- rates (ASTM G102-89 (R2015) Eqs. 1 and 2, K1 = 3.27e-3, K2 = 8.954e-3 written out): proportional to
  the current density, and the joint's screening rate proportional to the area ratio (the catchment
  estimate of calc.joint: i_a = i_c·A_c/A_a);
- the mixed-potential solution (calc.kinetics, calc.mixed): the current balance and "more cathode area
  never lowers the anode's attack" are in tests/test_kinetics.py; added here: for two electrodes the
  mixed potential lies between their free-corrosion potentials, the galvanic current is the net
  current of each side, and the anode is the electrode with the lower free-corrosion potential
  (C. Wagner and W. Traud, Z. Elektrochem. 44 (1938) 391, from memory).
"""

import math

import pytest
from hypothesis import HealthCheck, assume, given, settings
from hypothesis import strategies as st

from calc import rate as g102
from calc.electrode import electrode_entry
from calc.errors import InputError
from calc.joint import joint_entry
from calc.refelec import convert
from calc.species import parse_species
from oracles import data_records, nernst_slope_V, published_model_V, stored_reference_electrodes
from test_kinetics import corroding, el, part, physical

PROFILE = settings(max_examples=120, deadline=None,
                   suppress_health_check=[HealthCheck.too_slow, HealthCheck.function_scoped_fixture])

# the ids to draw from, read from data/*.yaml as written (the tests themselves run on the validated bundle)
_HALF = {r["id"]: r for r in data_records("half_reactions")}
_MATERIALS = data_records("materials")
_ENVS = data_records("environments")
ELECTRODES = stored_reference_electrodes()
REFERENCES = sorted(ELECTRODES) + ["RHE"]
HALF_REACTIONS = sorted(_HALF)
SERIES_MATERIALS = sorted(m["id"] for m in _MATERIALS if m.get("seawater_range_V_SCE"))
ENVIRONMENTS = sorted(e["id"] for e in _ENVS)
RATED_ENVIRONMENTS = sorted(e["id"] for e in _ENVS if e.get("cathodic_current_density_uA_per_cm2"))
FARADAY_MATERIALS = sorted(m["id"] for m in _MATERIALS
                           if m.get("equivalent_weight_g") is not None and m.get("density_g_cm3") is not None)

temperatures = st.floats(0.0, 100.0)
readings = st.floats(-2.0, 2.0)
pHs = st.floats(0.0, 14.0)


def _E_vs_she(ref, t, pH):
    """The independent value: the published model, or the RHE from the literal Nernst slope."""
    return -nernst_slope_V(t) * pH if ref == "RHE" else published_model_V(ELECTRODES[ref], t)


# ---------------------------------------------------------------- reference electrodes

@PROFILE
@given(a=st.sampled_from(REFERENCES), b=st.sampled_from(REFERENCES), v=readings, t=temperatures, pH=pHs)
def test_conversion_round_trips_and_follows_the_published_models(shipped, a, b, v, t, pH):
    there = convert(v, a, b, t, pH)["value_V"]
    assert convert(there, b, a, t, pH)["value_V"] == pytest.approx(v, abs=1e-12)
    assert there == pytest.approx(v + _E_vs_she(a, t, pH) - _E_vs_she(b, t, pH), abs=1e-12)


@PROFILE
@given(a=st.sampled_from(REFERENCES), b=st.sampled_from(REFERENCES), c=st.sampled_from(REFERENCES), v=readings,
       t=temperatures, pH=pHs)
def test_conversion_is_transitive_at_any_temperature_and_pH(shipped, a, b, c, v, t, pH):
    direct = convert(v, a, c, t, pH)["value_V"]
    via = convert(convert(v, a, b, t, pH)["value_V"], b, c, t, pH)["value_V"]
    assert direct == pytest.approx(via, abs=1e-12)


# ---------------------------------------------------------------- Nernst

def _net_coefficients(rid):
    """ν per (name, phase): reduced side positive, oxidised side negative; and n."""
    rec = _HALF[rid]
    nu = {}
    for side, sign in (("oxidised", -1.0), ("reduced", 1.0)):
        for text in rec[side]:
            sp = parse_species(text)
            nu[(sp.name, sp.phase)] = nu.get((sp.name, sp.phase), 0.0) + sign * sp.coeff
    return nu, rec["n"]


def _variable(nu):
    """The species whose activity a request can set: aqueous ones (H+ and OH- come from pH) and gases."""
    return sorted(k for k, v in nu.items() if v and (k[1] == "g" or (k[1] == "aq" and k[0] not in ("H+", "OH-"))))


def _request(rid, t, values):
    acts = {name: a for (name, phase), a in values.items() if phase == "aq"}
    press = {name: a for (name, phase), a in values.items() if phase == "g"}
    return {"id": rid, "temp_C": t, "pH": 7.0, "activities": acts, "pressures": press}


@PROFILE
@given(rid=st.sampled_from(HALF_REACTIONS), t=temperatures, data=st.data())
def test_nernst_slope_of_every_species(shipped, rid, t, data):
    nu, n = _net_coefficients(rid)
    variable = _variable(nu)
    assume(variable)
    base = {k: 10.0 ** data.draw(st.floats(-6.0, 0.0)) for k in variable}
    k = data.draw(st.sampled_from(variable))
    step = data.draw(st.floats(-3.0, 3.0))
    moved = {**base, k: base[k] * 10.0 ** step}
    e0 = electrode_entry(_request(rid, t, base))["potential_V"]
    e1 = electrode_entry(_request(rid, t, moved))["potential_V"]
    assert e1 - e0 == pytest.approx(-nu[k] * nernst_slope_V(t) / n * step, abs=1e-9), (rid, k)


def _pH_weight(rid):
    nu, _ = _net_coefficients(rid)
    return nu.get(("H+", "aq"), 0.0) - nu.get(("OH-", "aq"), 0.0)


PH_REACTIONS = [rid for rid in HALF_REACTIONS if _pH_weight(rid)]


@PROFILE
@given(rid=st.sampled_from(PH_REACTIONS), t=temperatures, pH=st.floats(0.0, 14.0), step=st.floats(-2.0, 2.0))
def test_nernst_slope_with_pH(shipped, rid, t, pH, step):
    nu, n = _net_coefficients(rid)
    dnu = _pH_weight(rid)
    assume(0.0 <= pH + step <= 14.0)
    e0 = electrode_entry({"id": rid, "temp_C": t, "pH": pH})["potential_V"]
    e1 = electrode_entry({"id": rid, "temp_C": t, "pH": pH + step})["potential_V"]
    # log10 a(H+) = −pH, log10 a(OH-) = pH − pKw: dE/dpH = (ν_H+ − ν_OH-)·slope/n
    assert e1 - e0 == pytest.approx(dnu * nernst_slope_V(t) / n * step, abs=1e-9), rid


# ---------------------------------------------------------------- joints

def _joint(a, b, env, ratio=None):
    req = {"a": a, "b": b, "env": env}
    if ratio is not None:
        req["area_ratio"] = ratio
    try:
        return joint_entry(req)
    except InputError as exc:  # a material without data for the environment's basis
        assume(exc.field not in ("a", "b"))
        raise


@PROFILE
@given(a=st.sampled_from(SERIES_MATERIALS), b=st.sampled_from(SERIES_MATERIALS), env=st.sampled_from(ENVIRONMENTS),
       ratio=st.one_of(st.none(), st.floats(0.001, 1000.0)))
def test_swapping_the_parts_changes_neither_the_anode_nor_the_verdict(shipped, a, b, env, ratio):
    ab, ba = _joint(a, b, env, ratio), _joint(b, a, env, ratio)
    for key in ("anode", "cathode", "verdict", "passes", "delta_E_V", "delta_E_range_V", "rate_mm_per_year"):
        assert ab[key] == ba[key], key
    assert ab["worst_state"]["verdict"] == ba["worst_state"]["verdict"]


@PROFILE
@given(a=st.sampled_from(SERIES_MATERIALS), b=st.sampled_from(SERIES_MATERIALS),
       env=st.sampled_from(RATED_ENVIRONMENTS), ratio=st.floats(0.001, 1000.0))
def test_the_joint_rate_is_proportional_to_the_area_ratio(shipped, a, b, env, ratio):
    # issue 15: the upper-bound screen i_a = i_L·(1 + A_c/A_a) (Mansfeld, Corrosion 27 (1971) 436, Case 3)
    one, r = _joint(a, b, env, 1.0), _joint(a, b, env, ratio)
    assume(r["rate"] is not None)
    for lo_hi in range(2):
        assert r["rate_mm_per_year"][lo_hi] == pytest.approx((1 + ratio) / 2 * one["rate_mm_per_year"][lo_hi],
                                                             rel=2e-5)
    # and it is ASTM G102 Eq. (1), K1 = 3.27e-3 written out, of i_a = i_L·(1 + A_c/A_a)
    rate = r["rate"]
    for lo_hi in range(2):
        i_a = rate["cathodic_current_density_uA_per_cm2"][lo_hi] * (1 + ratio)
        expected = 3.27e-3 * i_a * rate["equivalent_weight_g"] / rate["density_g_cm3"]
        assert rate["penetration_mm_per_year"][lo_hi] == pytest.approx(expected, rel=1e-5)


# ---------------------------------------------------------------- ASTM G102 rates

@PROFILE
@given(material=st.sampled_from(FARADAY_MATERIALS), i=st.floats(0.0, 1.0e4), k=st.floats(0.01, 100.0))
def test_rates_are_proportional_to_the_current_density(shipped, material, i, k):
    try:
        r1 = g102.rate_entry({"material": material, "current_density_uA_per_cm2": i})
    except InputError as exc:  # a material the data marks as not dissolving (a cathode only)
        assume(exc.field != "material")
        raise
    assume(i * k <= 1.0e5)
    rk = g102.rate_entry({"material": material, "current_density_uA_per_cm2": i * k})
    assert rk["penetration_mm_per_year"] == pytest.approx(k * r1["penetration_mm_per_year"], rel=1e-12, abs=1e-300)
    assert rk["mass_loss_g_per_m2_day"] == pytest.approx(k * r1["mass_loss_g_per_m2_day"], rel=1e-12, abs=1e-300)
    ew, rho = r1["equivalent_weight_g"], r1["density_g_cm3"]
    assert r1["penetration_mm_per_year"] == pytest.approx(3.27e-3 * i * ew / rho, rel=1e-12, abs=1e-300)
    assert r1["mass_loss_g_per_m2_day"] == pytest.approx(8.954e-3 * i * ew, rel=1e-12, abs=1e-300)


# ---------------------------------------------------------------- the mixed potential of two electrodes

@PROFILE
@given(corroding("A"), corroding("C"), st.floats(-3.0, 3.0))
def test_two_electrodes_settle_between_their_free_corrosion_potentials(a, c, log_ratio):
    r = physical(el("A", 1.0, *a), el("C", 10.0 ** log_ratio, *c))
    fa, fc = part(r, "A")["free_corrosion"]["E_V"], part(r, "C")["free_corrosion"]["E_V"]
    lo, hi = min(fa, fc), max(fa, fc)
    assert lo - 1e-9 <= r["E_mixed_V"] <= hi + 1e-9
    net_a, net_c = part(r, "A")["net_current_A"], part(r, "C")["net_current_A"]
    scale = r["anodic_total_A"]
    assert net_a + net_c == pytest.approx(0.0, abs=1e-8 * scale)
    assert r["galvanic_current_A"] == pytest.approx(max(net_a, net_c), abs=1e-8 * scale)
    if abs(fa - fc) > 1e-6 and r["galvanic_current_A"] > 1e-6 * scale:
        anode = "A" if fa < fc else "C"
        assert part(r, anode)["net_current_A"] > 0.0
        assert math.isfinite(r["E_mixed_V"])
