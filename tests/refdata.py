"""A small dataset bundle for engine tests that need records the shipped data/ does not hold (a
Bates–Bower polynomial electrode, a ΔCp° term) or that must not move when the shipped data is curated.

Values and their flags, each from the published document:
- E°: P. Vanýsek, "Electrochemical Series", CRC Handbook of Chemistry and Physics, 92nd ed. (2011),
  Table 1, read as reproduced in OpenStax, Chemistry 2e (2019), Appendix L; Fe2+/Fe -0.447 and
  Fe3+/Fe -0.037 V recalled.
- dE°/dT: computed as ΔS°/(nF) from the NBS entropies (D. D. Wagman et al., J. Phys. Chem. Ref.
  Data 11, Suppl. 2, 1982, read in the OpenStax Chemistry 2e Appendix G copy), the method of
  S. G. Bratsch, J. Phys. Chem. Ref. Data 18 (1989) 1.
- Reference electrodes: SCE polynomial of D. J. G. Ives and G. J. Janz, Reference Electrodes (1961),
  recalled; CSE +0.316 V (S. Szabó and I. Bakos, Int. J. Corrosion 2010, art. 756950, Table 2, read)
  and +0.9 mV/K (common practice); Ag/AgCl seawater +0.25 V (DNV-RP-B401, recalled); Ag/AgCl E°(t)
  polynomial of R. G. Bates and V. E. Bower, J. Res. NBS 53 (1954) 283, recalled.
- Ion sizes: J. Kielland, J. Am. Chem. Soc. 59 (1937) 1675, read as reproduced in R. A. Freeze and
  J. A. Cherry, Groundwater (1979), Appendix IV.
"""


def _hr(id_, ox, red, n, E0, dEdT=None, dCp=None, **extra):
    rec = {"id": id_, "name": id_, "oxidised": ox, "reduced": red, "n": n, "E0_V": E0,
           "E0_source": "crc-vanysek", "E0_confidence": "read"}
    if dEdT is not None:
        rec.update(dEdT_mV_per_K=dEdT, dEdT_source="wagman-nbs-1982", dEdT_confidence="computed")
    if dCp is not None:
        rec.update(dCp_J_per_mol_K=dCp, dCp_source="wagman-nbs-1982", dCp_confidence="recalled")
    rec.update(extra)
    return rec


def reference_bundle(**changes):
    """The bundle as a dict; keyword arguments replace whole kinds (e.g. ions=[])."""
    half = [
        _hr("Zn2+/Zn", ["Zn2+(aq)"], ["Zn(s)"], 2, -0.7618, 0.119),
        _hr("Cu2+/Cu", ["Cu2+(aq)"], ["Cu(s)"], 2, 0.3419, 0.011),
        _hr("Ag+/Ag", ["Ag+(aq)"], ["Ag(s)"], 1, 0.7996, -0.989),
        _hr("Fe2+/Fe", ["Fe2+(aq)"], ["Fe(s)"], 2, -0.447, 0.178),
        _hr("Fe3+/Fe", ["Fe3+(aq)"], ["Fe(s)"], 3, -0.037, 0.508),
        _hr("Fe3+/Fe2+", ["Fe3+(aq)"], ["Fe2+(aq)"], 1, 0.771, 1.170),
        _hr("H+/H2", ["2 H+(aq)"], ["H2(g)"], 2, 0.0, 0.0),
        _hr("H2O/H2", ["2 H2O(l)"], ["H2(g)", "2 OH-(aq)"], 2, -0.8277, -0.836),
        _hr("O2/H2O", ["O2(g)", "4 H+(aq)"], ["2 H2O(l)"], 4, 1.229, -0.846),
        _hr("O2/OH-", ["O2(g)", "2 H2O(l)"], ["4 OH-(aq)"], 4, 0.401, -1.680),
        _hr("AgCl/Ag", ["AgCl(s)"], ["Ag(s)", "Cl-(aq)"], 1, 0.22233, -0.648),
        _hr("Hg2Cl2/Hg", ["Hg2Cl2(s)"], ["2 Hg(l)", "2 Cl-(aq)"], 2, 0.26808, -0.301),
        _hr("Hg2^2+/Hg", ["Hg2^2+(aq)"], ["2 Hg(l)"], 2, 0.7973, -0.327),
        _hr("Ti2+/Ti", ["Ti2+(aq)"], ["Ti(s)"], 2, -1.630, hypothetical=True),
        _hr("Au3+/Au", ["Au3+(aq)"], ["Au(s)"], 3, 1.498),
        _hr("Li+/Li", ["Li+(aq)"], ["Li(s)"], 1, -3.0401, -0.514),
    ]
    refs = [
        {"id": "SHE", "name": "Standard hydrogen electrode", "E_V_SHE": 0.0, "source": "iupac",
         "temperature": {"kind": "constant", "valid_C": [0, 100], "source": "iupac"}},
        {"id": "SCE", "name": "Saturated calomel electrode", "E_V_SHE": 0.2412, "source": "ijc-2010",
         "temperature": {"kind": "polynomial", "t_ref_C": 25, "coeffs_V": [0.2412, -6.61e-4, -1.75e-6, -9.0e-10],
                         "valid_C": [10, 40], "source": "ives-janz-1961"}},
        {"id": "CSE", "name": "Copper/copper sulfate, saturated", "aliases": ["Cu/CuSO4"], "E_V_SHE": 0.316,
         "source": "ijc-2010",
         "temperature": {"kind": "linear", "t_ref_C": 25, "slope_mV_per_K": 0.9, "valid_C": [0, 50],
                         "source": "common-practice"}},
        {"id": "Ag/AgCl seawater", "name": "Silver/silver chloride in seawater", "E_V_SHE": 0.25,
         "source": "dnv-rp-b401", "temperature": {"kind": "constant", "valid_C": [5, 30], "source": "dnv-rp-b401"}},
        {"id": "Ag/AgCl sat. KCl", "name": "Silver/silver chloride, saturated KCl", "E_V_SHE": 0.197,
         "source": "ijc-2010", "temperature": {"kind": "linear", "t_ref_C": 25, "slope_mV_per_K": -1.0,
                                               "valid_C": [15, 35], "source": "meites-1963"}},
        {"id": "Ag/AgCl E0", "name": "Silver/silver chloride at unit chloride activity", "E_V_SHE": 0.22233,
         "source": "bates-bower-1954",
         "temperature": {"kind": "polynomial", "t_ref_C": 0, "coeffs_V": [0.23659, -4.8564e-4, -3.4205e-6, 5.869e-9],
                         "valid_C": [0, 95], "source": "bates-bower-1954"}},
    ]
    ions = [{"species": s, "charge": z, "size_angstrom": a, "source": "kielland-1937"} for s, z, a in [
        ("H+", 1, 9), ("Fe3+", 3, 9), ("Al3+", 3, 9), ("Mg2+", 2, 8), ("Cu2+", 2, 6), ("Zn2+", 2, 6),
        ("Fe2+", 2, 6), ("Ni2+", 2, 6), ("Cd2+", 2, 5), ("Pb2+", 2, 4.5), ("SO4^2-", -2, 4), ("Hg2^2+", 2, 4),
        ("OH-", -1, 3.5), ("K+", 1, 3), ("Cl-", -1, 3), ("NO3-", -1, 3), ("Ag+", 1, 2.5), ("Na+", 1, 4)]]
    envs = [
        {"id": "seawater-flowing", "name": "Flowing seawater", "ionic_strength_mol_per_kg": 0.7,
         "ionic_strength_source": "dickson-millero"},
        {"id": "indoor-dry", "name": "Indoors, dry", "ionic_strength_mol_per_kg": None},
    ]
    ids = {"crc-vanysek", "wagman-nbs-1982", "iupac", "ijc-2010", "ives-janz-1961", "common-practice",
           "dnv-rp-b401", "meites-1963", "bates-bower-1954", "kielland-1937", "dickson-millero"}
    bundle = {"half_reactions": half, "reference_electrodes": refs, "materials": [], "environments": envs,
              "ions": ions, "sources": [{"id": i, "title": i} for i in sorted(ids)], "version": "refdata-test"}
    bundle.update(changes)
    return bundle
