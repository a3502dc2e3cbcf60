"""Numbers the engine tests compare with, written out here and never taken from calc.

The Nernst slope ln(10)·R·T/F from the CODATA 2018 constants: E. Tiesinga, P. J. Mohr,
D. B. Newell and B. N. Taylor, "CODATA recommended values of the fundamental physical constants:
2018", Rev. Mod. Phys. 93 (2021) 025010. In the 2019 SI both are exact products of defined
constants: R = N_A·k = 6.022 140 76e23 × 1.380 649e-23 = 8.314 462 618 153 24 J/(mol·K) and
F = N_A·e = 6.022 140 76e23 × 1.602 176 634e-19 = 96 485.332 123 310 0 C/mol. ln 10 is written out
to 16 digits. The slope at 25 °C, 0.059 159 35 V per decade, is the textbook 0.05916 V (e.g.
A. J. Bard and L. R. Faulkner, Electrochemical Methods, 2nd ed., Wiley 2001).

A test that takes its slope from here fails when the engine's constants, its ln 10 or its
temperature scale are wrong, which a test computing its expectation with
calc.constants.nernst_slope cannot.

The reference electrodes' potentials at a temperature are evaluated here from the published
temperature models in data/reference_electrodes.yaml, read with PyYAML, so a conversion check does
not go through calc.refelec.
"""

#: CODATA 2018, exact: R = N_A·k [J/(mol·K)], F = N_A·e [C/mol]
R_J_PER_MOL_K = 8.31446261815324
F_C_PER_MOL = 96485.33212331001
#: ln 10 [unitless] and 0 °C [K]
LN10 = 2.302585092994046
T_ZERO_C_K = 273.15

#: ln(10)·R·T/F at t [V per decade], each computed with 30-digit decimal arithmetic from the
#: constants above (T = t + 273.15 K) and rounded to 1e-12 V
NERNST_SLOPE_V = {
    0: 0.054198813907,
    10: 0.056183028218,
    25: 0.059159349685,
    40: 0.062135671151,
    60: 0.066104099774,
    100: 0.074040957018,
}
SLOPE_25C_V = NERNST_SLOPE_V[25]


def nernst_slope_V(temp_C):
    """ln(10)·R·T/F at temp_C [V per decade], from the literal constants of this module."""
    return LN10 * R_J_PER_MOL_K * (temp_C + T_ZERO_C_K) / F_C_PER_MOL


# ---------------------------------------------------------------- the data files, and reference electrodes

def data_records(kind):
    """The records of data/<kind>.yaml as written there, read with PyYAML (not through calc or the validator)."""
    import os

    import yaml

    path = os.path.join(os.path.dirname(os.path.dirname(os.path.abspath(__file__))), "data", f"{kind}.yaml")
    with open(path, encoding="utf-8") as fh:
        return yaml.safe_load(fh)[kind]


def stored_reference_electrodes():
    """The records of data/reference_electrodes.yaml by id."""
    return {r["id"]: r for r in data_records("reference_electrodes")}


def published_model_V(rec, temp_C):
    """E vs SHE at temp_C from a record's published temperature model, evaluated here [V].

    polynomial: Σ c_i·(t − t_ref)^i; linear: E25 + slope/1000·(t − t_ref); constant: E25; the SHE 0 V
    at every temperature (IUPAC convention); t_ref defaults to 25 °C as data/reference_electrodes.yaml says.
    """
    model = rec.get("temperature") or {"kind": "constant"}
    x = temp_C - model.get("t_ref_C", 25.0)
    if rec["id"] == "SHE":
        return 0.0
    if model["kind"] == "polynomial":
        return sum(c * x ** i for i, c in enumerate(model["coeffs_V"]))
    if model["kind"] == "linear":
        return rec["E_V_SHE"] + model["slope_mV_per_K"] / 1000.0 * x
    return rec["E_V_SHE"]
