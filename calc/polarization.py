"""The dataset's polarization parameters turned into electrode kinetics at the service conditions.

Each record of ``data/polarization.yaml`` gives, for one material in one electrolyte (seawater or
fresh water), three Tafel lines through reference points (V vs SCE): the metal's dissolution (or,
for a passive alloy, its passive current density), O2 reduction on it and H2 evolution on it. At
the service conditions:

- every Tafel slope scales with the absolute temperature, b(T) = b_ref·T/T_ref, as
  b = 2.303·R·T/(α·n·F) does at constant α (:func:`slope_at`; Bard & Faulkner 2001, eq. 3.4.11,
  from memory); reference current densities stay as measured (no activation energies are in the
  dataset: stated in the result);
- the O2 and H2 reference potentials follow the equilibrium potentials of their reactions with pH,
  −(ln10·RT/F) per pH unit (:func:`ph_shifted`; Nernst, IUPAC Green Book 2007 §2.13);
- the O2 activation current is first order in dissolved O2, i_act ∝ C/C_ref with C_ref air
  saturation of the reference water (:func:`o2_scaled`), and its cathodic branch is limited by the
  service i_L, 1/i = 1/i_act + 1/i_L (:func:`calc.kinetics.diffusion_limited`);
- a passive current density is a line of :data:`PASSIVE_SLOPE_V` (almost independent of potential).

A dissolution rate given instead of a current density is converted by ASTM G102 Eq. (1) with the
material's equivalent weight and density (:mod:`calc.rate`).
"""

from dataclasses import dataclass

from .constants import T_ZERO_C, nernst_slope
from .derivation import Derivation, fmt
from .kinetics import Electrode, Reaction
from .oxygen import dissolved_oxygen
from .rate import K1_MM

#: a passive current density is taken as a Tafel line this steep: almost independent of potential,
#: the steepest slope the ``mixed`` entry point accepts [V/decade]
PASSIVE_SLOPE_V = 10.0
#: salinity of the reference water of each electrolyte, for the O2 concentration the O2 kinetics refer to [g/kg]
REFERENCE_SALINITY = {"seawater": 35.0, "fresh-water": 0.0}
BRANCHES = ("anodic", "oxygen", "hydrogen")


def slope_at(b_ref_V, temp_C, ref_temp_C):
    """A Tafel slope at another temperature, b = b_ref·T/T_ref (absolute temperatures).

    Args:
        b_ref_V: the slope at the reference temperature [V/decade]
        temp_C: the service temperature [°C]
        ref_temp_C: the reference temperature [°C]

    Returns:
        b [V/decade]

    References:
        b = 2.303·R·T/(α·n·F) at constant α·n (Bard & Faulkner, Electrochemical Methods, 2nd ed.
        2001, eq. 3.4.11, from memory).

    >>> round(slope_at(0.12, 40.0, 20.0), 5)
    0.12819
    """
    return b_ref_V * (temp_C + T_ZERO_C) / (ref_temp_C + T_ZERO_C)


def ph_shifted(E_ref_V, pH, ref_pH, temp_C):
    """A reference potential of an O2 or H2 line moved with pH as the reaction's equilibrium potential moves.

    Args:
        E_ref_V: the reference potential at the reference pH [V]
        pH: the service pH [unitless]
        ref_pH: the reference pH [unitless]
        temp_C: the service temperature [°C]

    Returns:
        E_ref − (ln10·RT/F)·(pH − pH_ref) [V]

    References:
        Nernst equation of O2 + 2 H2O + 4 e⁻ = 4 OH⁻ and 2 H2O + 2 e⁻ = H2 + 2 OH⁻: −59 mV per pH unit at
        25 °C (IUPAC Green Book, 3rd ed. 2007, §2.13).

    >>> round(ph_shifted(-1.0, 7.1, 8.1, 25.0), 4)
    -0.9408
    """
    return E_ref_V - nernst_slope(temp_C + T_ZERO_C) * (pH - ref_pH)


def o2_scaled(i_ref, c_mol_m3, c_ref_mol_m3):
    """The O2 activation current density at another O2 concentration, first order in O2.

    Args:
        i_ref: the activation current density at the reference concentration [A/cm²]
        c_mol_m3: the service O2 concentration [mol/m³]
        c_ref_mol_m3: the reference concentration [mol/m³]

    Returns:
        i_ref·C/C_ref [A/cm²]

    References:
        First-order rate in dissolved O2 of its cathodic reduction (Bard & Faulkner 2001, eq. 3.4.10
        with C_O at the surface, from memory).

    >>> o2_scaled(1e-5, 0.1, 0.2)
    5e-06
    """
    return i_ref * c_mol_m3 / c_ref_mol_m3


def record_for(ds, material_id, electrolyte):
    """The polarization record of a material in an electrolyte, or None.

    Args:
        ds: the dataset [unitless]
        material_id: a material id [unitless]
        electrolyte: "seawater" or "fresh-water" [unitless]

    Returns:
        the record, or None when the dataset has none

    References:
        Project data layout (``data/polarization.yaml``).

    >>> from calc.dataset import current
    >>> record_for(current(), "graphite", "seawater") is None
    True
    """
    return next((r for r in ds.records("polarization")
                 if r.get("material") == material_id and r.get("electrolyte") == electrolyte), None)


@dataclass(frozen=True)
class PartKinetics:
    """One part's electrode at the service conditions, with what each line was built from."""

    material_id: str
    record_id: str
    electrode: Electrode
    lines: tuple  # per reaction {branch, name, b_V, E_ref_V_SCE, i_ref_A_per_cm2, i_lim_A_per_cm2, confidence, source}
    confidence: str  # "read" only when every value is read, else "recalled" or "computed"
    steps: tuple
    sources: tuple


def _flag(branch, key):
    """(source, confidence) of one value of a branch: its own, else the branch's."""
    prefix = {"b_V": "b", "E_ref_V_SCE": "E_ref", "i_ref_A_per_cm2": "i_ref", "rate_ref_mm_per_year": "rate_ref",
              "i_pass_A_per_cm2": "i_pass"}[key]
    return (branch.get(prefix + "_source") or branch.get("source"),
            branch.get(prefix + "_confidence") or branch.get("confidence"))


def _anodic_i_ref(d, rec, branch, faraday):
    """The anodic reference current density [A/cm²], converting a reference rate by ASTM G102 Eq. (1)."""
    if branch.get("i_ref_A_per_cm2") is not None:
        return branch["i_ref_A_per_cm2"], "i_ref_A_per_cm2"
    rate = branch["rate_ref_mm_per_year"]
    i_uA = rate / (K1_MM * faraday.equivalent_weight_g / faraday.density_g_cm3)
    d.step(f"Dissolution rate at the reference point of {rec['material']} (ASTM G102 Eq. 1 solved for i)",
           "i = CR·ρ/(K1·EW), K1 = 3.27e-3 mm·g/(µA·cm·y)",
           f"i = {fmt(rate)} mm/y × {fmt(faraday.density_g_cm3)} / (3.27e-3 × {fmt(faraday.equivalent_weight_g, 4)})",
           f"i = {fmt(i_uA, 4)} µA/cm² at {fmt(branch['E_ref_V_SCE'])} V vs SCE")
    return i_uA * 1e-6, "rate_ref_mm_per_year"


def _worst(flags):
    order = {"read": 0, "computed": 1, "recalled": 2}
    return max((f for f in flags if f), key=lambda f: order.get(f, 2), default="recalled")


def part_kinetics(ds, rec, material, service, area_cm2, faraday):
    """One part's electrode at the service conditions, from its polarization record.

    Args:
        ds: the dataset [unitless]
        rec: the part's polarization record [unitless]
        material: the part's material record [unitless]
        service: the :class:`calc.service.Service` conditions [unitless]
        area_cm2: the part's wetted area [cm²]
        faraday: the material's :class:`calc.rate.MaterialFaradayData` (for a reference rate) [unitless]

    Returns:
        a :class:`PartKinetics` (potentials in [V vs SCE], current densities in [A/cm²])

    References:
        :func:`slope_at`, :func:`ph_shifted`, :func:`o2_scaled`; the limited cathodic branch of
        :func:`calc.kinetics.diffusion_limited`; ASTM G102-89 (R2015) Eq. (1).

    >>> from calc.dataset import current
    >>> from calc.rate import material_faraday_data
    >>> from calc.service import read_service
    >>> ds = current(); s, _ = read_service({}, ds.get("environments", "seawater-flowing"), ds)
    >>> steel = ds.get("materials", "carbon-steel")
    >>> k = part_kinetics(ds, record_for(ds, "carbon-steel", "seawater"), steel, s, 1.0, material_faraday_data(steel))
    >>> [line["branch"] for line in k.lines]
    ['anodic', 'oxygen', 'hydrogen']
    """
    d = Derivation()
    t, t_ref = service.values["temp_C"], rec["reference_temp_C"]
    ph = service.values.get("pH", rec["reference_pH"])
    c = service.supply.o2_mol_m3
    c_ref = dissolved_oxygen(t_ref, REFERENCE_SALINITY[rec["electrolyte"]]).o2_mol_m3
    i_lim = service.supply.i_L_A_per_m2 * 1e-4  # A/m² -> A/cm²
    name = material.get("name", material["id"])
    reactions, lines, flags = [], [], []
    for branch_name in BRANCHES:
        br = rec[branch_name]
        e_ref = br["E_ref_V_SCE"]
        if branch_name == "anodic" and br["kind"] == "passive":
            b, i_ref, i_key = PASSIVE_SLOPE_V, br["i_pass_A_per_cm2"], "i_pass_A_per_cm2"
            formula = f"passive current density i_p, a line of {PASSIVE_SLOPE_V:g} V/decade (almost flat)"
        else:
            b = slope_at(br["b_V"], t, t_ref)
            if branch_name == "anodic":
                i_ref, i_key = _anodic_i_ref(d, rec, br, faraday)
            else:
                i_ref, i_key = br["i_ref_A_per_cm2"], "i_ref_A_per_cm2"
            formula = f"b = {fmt(br['b_V'])} × T/T_ref V/decade"
        if branch_name != "anodic":
            e_ref = ph_shifted(e_ref, ph, rec["reference_pH"], t)
        if branch_name == "oxygen":
            if c <= 0.0 or i_lim <= 0.0:
                d.step(f"O2 reduction on {name}", "no dissolved O2", "deaerated water", "no O2 reduction")
                continue
            i_ref = o2_scaled(i_ref, c, c_ref)
            formula += ", i_ref × C/C_ref, 1/i = 1/i_act + 1/i_L"
        anodic = branch_name == "anodic"
        if anodic:
            label = f"{material['id']} dissolution" + (" (passive)" if br["kind"] == "passive" else "")
        else:
            label = f"{'O2 reduction' if branch_name == 'oxygen' else 'H2 evolution'} on {material['id']}"
        reactions.append(Reaction(label, e_ref, i_ref, b if anodic else None, None if anodic else b,
                                  i_lim if branch_name == "oxygen" else None))
        source, conf = _flag(br, i_key)
        flags += [conf] + [_flag(br, k)[1] for k in ("b_V", "E_ref_V_SCE") if k in br]
        lines.append({"branch": branch_name, "name": label, "b_V": b, "E_ref_V_SCE": e_ref, "i_ref_A_per_cm2": i_ref,
                      "i_lim_A_per_cm2": i_lim if branch_name == "oxygen" else None, "confidence": conf,
                      "source": source})
        d.step(f"{label} at the service conditions", formula,
               f"{fmt(t)} °C (reference {fmt(t_ref)} °C), pH {fmt(ph)} (reference {fmt(rec['reference_pH'])})"
               + (f", C = {fmt(c, 4)} of C_ref {fmt(c_ref, 4)} mol/m³" if branch_name == "oxygen" else ""),
               f"b = {fmt(b, 4)} V/decade through {fmt(e_ref, 4)} V vs SCE at {fmt(i_ref, 4)} A/cm²"
               + (f", i_L = {fmt(i_lim, 4)} A/cm²" if branch_name == "oxygen" else ""))
        for key in ("b_V", "E_ref_V_SCE", i_key):
            if key in br:
                d.cite(_flag(br, key)[0])
    d.cite(rec.get("reference_source"))
    electrode = Electrode(material["id"], area_cm2, tuple(reactions))
    return PartKinetics(material["id"], rec["id"], electrode, tuple(lines), _worst(flags), tuple(d.steps),
                        tuple(d.sources))
