"""E°(T) of a half-reaction (calc.standard): Gibbs–Helmholtz, the dataset's coefficients, the constants."""

import pytest

from calc import constants, dataset
from calc.standard import gibbs_helmholtz, standard_potential
from oracles import NERNST_SLOPE_V
from refdata import reference_bundle


# ---------------------------------------------------------------- constants

def test_faraday_and_gas_constant_match_scipy():
    sc = pytest.importorskip("scipy.constants")
    # CODATA 2018 (Tiesinga et al., Rev. Mod. Phys. 93 (2021) 025010) via scipy.constants:
    # F = 96485.33212331 C/mol, R = 8.31446261815324 J/(mol·K); also written out, so the check stands without scipy
    assert constants.FARADAY == pytest.approx(96485.33212331, rel=1e-13)
    assert constants.R_GAS == pytest.approx(8.31446261815324, rel=1e-13)
    assert constants.FARADAY == pytest.approx(sc.physical_constants["Faraday constant"][0], rel=1e-12)
    assert constants.R_GAS == pytest.approx(sc.R, rel=1e-12)
    assert constants.EPSILON_0 == pytest.approx(sc.epsilon_0, rel=1e-9)


def test_nernst_slope_table():
    # ln10·RT/F from CODATA 2018 R and F (computed): 54.199 mV at 0 °C, 59.159 mV at 25 °C, 74.041 mV at 100 °C
    for t, mv in ((0, 54.199), (25, 59.159), (100, 74.041)):
        assert constants.nernst_slope(t + 273.15) * 1000 == pytest.approx(mv, abs=0.001)
    # the same to 1e-12 V, written out with 30-digit arithmetic in tests/oracles.py
    for t, slope in NERNST_SLOPE_V.items():
        assert constants.nernst_slope(t + 273.15) == pytest.approx(slope, abs=1e-12), t


# ---------------------------------------------------------------- E°(T)

# NBS entropies (Wagman et al., J. Phys. Chem. Ref. Data 11 Suppl. 2, 1982), read in the copy of
# OpenStax, Chemistry 2e (2019), Appendix G, J/(mol·K): S°(H2) 130.684 (printed 130.7), S°(H+) 0 by convention
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
    # E° of Vanýsek, CRC Handbook 92nd ed. (2011), Table 1 (0.7996 and 0.3419 V) with the isothermal
    # coefficients from the NBS entropies above (the same as Bratsch, J. Phys. Chem. Ref. Data 18 (1989) 1,
    # Table 1, recalled): Ag+/Ag −0.989 mV/K, Cu2+/Cu +0.011 mV/K, so
    # E°(60 °C) = 0.7996 − 0.989e-3 × 35 = 0.7650 V and 0.3419 + 0.011e-3 × 35 = 0.3423 V
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
