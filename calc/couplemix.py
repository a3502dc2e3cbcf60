"""A joint judged by mixed-potential theory at its service conditions (the Evans solution of the two parts).

The two parts, each in the state it is judged in (:mod:`calc.partstate`), get their kinetics from
``data/polarization.yaml`` at the service conditions (:mod:`calc.polarization`: the anodic line,
O2 reduction limited by the service i_L, 1/i = 1/i_act + 1/i_L, and H2 evolution). The couple is
solved by the same solver as the ``mixed`` entry point (:func:`calc.kinetics.mixed_potential`,
:func:`calc.mixed.mixed_result`): the couple potential, the galvanic current, each part's
dissolution current density (the anode's attack includes its own cathodic reaction: Mansfeld,
Corrosion 27 (1971) 436, Case 2), its penetration rate by ASTM G102 with the dataset's equivalent
weight, and its change from its uncoupled (free) corrosion. With an anode area stated, the couple
is also solved with the electrolyte's resistance between the parts (:mod:`calc.ir`).

Areas: the cathode is the part the galvanic series makes the cathode, A_c = area_ratio·A_a; A_a is
the stated anode area, else 1 cm² (without an IR term only the ratio matters).
"""

from . import rate as g102
from .derivation import Derivation, fmt
from .errors import InputError
from .ir import couple_with_ir, joint_resistance_ohm
from .kinetics import dissolution_density, free_corrosion, mixed_potential
from .mixed import mixed_result
from .polarization import part_kinetics, record_for

#: the nominal anode area when none is stated: only the area ratio matters without an IR term [cm²]
NOMINAL_ANODE_CM2 = 1.0

ASSUMPTIONS = (
    "each part's kinetics are Tafel lines from data/polarization.yaml (most of them estimates, flagged "
    "recalled): a screening judgement, not a measurement",
    "Tafel slopes scale with the absolute temperature; reference current densities stay as measured (no "
    "activation energies in the dataset), so the temperature acts through the O2 supply, the slopes and passivity",
    "the metallic-contact answer puts both parts at one potential (no IR drop): the largest galvanic effect these "
    "kinetics allow, and the attack next to the line of contact",
    "uniform current over each part's wetted area, at steady state; films, fouling and calcareous deposits that "
    "grow with time are not modelled",
)


def _rate(i_A_per_cm2, fd):
    """ASTM G102 penetration [mm/y] of a dissolution current density [A/cm²]."""
    return g102.corrosion_rate(i_A_per_cm2 * 1e6, fd.equivalent_weight_g, fd.density_g_cm3).penetration_mm_per_year


def _kinetics(ds, parts, recs, service, areas, faraday):
    """Each part's :class:`calc.polarization.PartKinetics`, or (None, reason)."""
    out = []
    for p, area in zip(parts, areas):
        used = recs[p["state_used"]]
        pol = record_for(ds, used["id"], service.electrolyte)
        if pol is None:
            return None, (f"no polarization data for {used.get('name', used['id'])} in {service.electrolyte} in the "
                          "dataset, so no mixed-potential judgement is made; the series verdict and the upper-bound "
                          "screen stand")
        out.append(part_kinetics(ds, pol, used, service, area, faraday[used["id"]]))
    return out, None


def _faraday(recs, ids):
    out = {}
    for mid in ids:
        try:
            out[mid] = g102.material_faraday_data(recs[mid], field_name="material")
        except InputError as exc:
            return None, f"no Faraday rate for {recs[mid].get('name', mid)}: {exc.hint or exc.allowed}"
    return out, None


def _part_out(d, el, part, fd, res_el, free, E):
    """One part's numbers at the couple: attack, rate, free corrosion, change."""
    attack = res_el["dissolution_current_density_A_per_cm2"]
    rate = _rate(attack, fd)
    out = {"id": part["id"], "state_used": part["state_used"], "area_cm2": el.area_cm2,
           "role": res_el["role"].split(" ")[0], "potential_V_SCE": E,
           "net_current_A": res_el["net_current_A"],
           "dissolution_current_density_uA_per_cm2": attack * 1e6, "penetration_mm_per_year": rate,
           "free_potential_V_SCE": None, "free_current_density_uA_per_cm2": None,
           "free_penetration_mm_per_year": None, "change_ratio": None, "change_mm_per_year": None}
    if free is not None:
        free_rate = _rate(free[1], fd)
        out.update(free_potential_V_SCE=free[0], free_current_density_uA_per_cm2=free[1] * 1e6,
                   free_penetration_mm_per_year=free_rate, change_mm_per_year=rate - free_rate,
                   change_ratio=attack / free[1] if free[1] > 0 else None)
    d.step(f"Attack on {part['state_used']} (ASTM G102 Eq. 1)",
           "i_d = Σ anodic partials at the couple potential (its own cathodic reaction runs beside it); CR = K1·i_d·EW/ρ",
           f"i_d = {fmt(attack * 1e6, 4)} µA/cm², EW = {fmt(fd.equivalent_weight_g, 4)} g, ρ = {fmt(fd.density_g_cm3)} g/cm³",
           f"CR = {fmt(rate, 3)} mm/y"
           + (f"; uncoupled {fmt(out['free_penetration_mm_per_year'], 3)} mm/y at {fmt(free[0], 4)} V vs SCE, "
              f"coupled/uncoupled = {fmt(out['change_ratio'], 4)}" if free is not None and out["change_ratio"] else ""))
    return out


def _film_assumptions(recs, cathode):
    """What a passive cathode's kinetics leave out, in plain words ([] for another cathode)."""
    if cathode is None:
        return []
    rec = recs[cathode["state_used"]]
    if rec.get("state") != "passive" and rec.get("family") != "titanium":
        return []
    return ["the passive cathode's O2 kinetics are those of a clean film: in natural seawater a biofilm can raise "
            "its cathodic efficiency 10-100 times within weeks (recalled), so the anode's attack can be larger; "
            "chlorination suppresses the biofilm"]


def _with_ir(d, service, els, frees, E, galvanic, parts_out):
    """The couple with the electrolyte's resistance, or None without an anode area."""
    if service.anode_area_cm2 is None or galvanic <= 0.0:
        return None
    anode_k = 0 if parts_out[0]["net_current_A"] > 0 else 1
    cathode_k = 1 - anode_k
    if frees[anode_k] is None or frees[cathode_k] is None:
        return None
    k = service.conductivity_S_per_m
    R = joint_resistance_ohm(k, els[anode_k].area_cm2, els[cathode_k].area_cm2)
    i, ea, ec = couple_with_ir(els[anode_k], els[cathode_k], frees[anode_k][0], frees[cathode_k][0], E, galvanic, R)
    attack = dissolution_density(els[anode_k], ea)
    d.step("Solution resistance of the joint (each part a disk of its area, Newman 1966)",
           "R = 1/(4κ)·(1/r_a + 1/r_c), r = √(A/π)",
           f"κ = {fmt(k, 4)} S/m, A_a = {fmt(els[anode_k].area_cm2)} cm², A_c = {fmt(els[cathode_k].area_cm2)} cm²",
           f"R = {fmt(R, 4)} Ω")
    ratio = attack * 1e6 / parts_out[anode_k]["dissolution_current_density_uA_per_cm2"]
    d.step("Couple with the IR drop", "E_c − E_a = I·R, each part on its own polarization curve",
           f"I = {fmt(i, 4)} A, I·R = {fmt(i * R, 4)} V", f"E_a = {fmt(ea, 4)} V, E_c = {fmt(ec, 4)} V vs SCE; the "
           f"anode's attack is {fmt(100.0 * ratio, 3)} % of the metallic-contact answer")
    return {"resistance_ohm": R, "conductivity_S_per_m": k, "galvanic_current_A": i, "ir_drop_V": i * R,
            "anode_potential_V_SCE": ea, "cathode_potential_V_SCE": ec,
            "anode_dissolution_current_density_uA_per_cm2": attack * 1e6,
            "anode_penetration_mm_per_year": parts_out[anode_k]["penetration_mm_per_year"] * ratio,
            "attack_ratio_to_metallic_contact": ratio}


def assess(ds, service, parts, recs, cathode_index, area_ratio):
    """The mixed-potential judgement of a joint at its service conditions.

    Args:
        ds: the dataset [unitless]
        service: the :class:`calc.service.Service` conditions [unitless]
        parts: the two parts of :func:`calc.partstate.part_state`, in request order [unitless]
        recs: material id -> record [unitless]
        cathode_index: which part (0 or 1) the series makes the cathode (its area is area_ratio × the other's) [unitless]
        area_ratio: wetted area of the cathode over that of the anode [unitless]

    Returns:
        (assessment dict or None, reason or None, Derivation); potentials in [V vs SCE], current
        densities in [µA/cm²], currents in [A], rates in [mm/y]

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory); F. Mansfeld, Corrosion 27 (1971)
        436 (area relationships); ASTM G102-89 (R2015) Eq. (1); :mod:`calc.polarization`, :mod:`calc.ir`.

    >>> from calc.dataset import current
    >>> from calc.partstate import part_state
    >>> from calc.service import read_service
    >>> ds = current(); s, _ = read_service({}, ds.get("environments", "seawater-quiescent"), ds)
    >>> recs = {r["id"]: r for r in ds.records("materials")}
    >>> parts = [part_state(ds, recs[m], s) for m in ("zinc", "carbon-steel")]
    >>> a, reason, _ = assess(ds, s, parts, recs, 1, 1.0)
    >>> a["anode"], a["balance_relative"] < 1e-9
    ('zinc', True)
    """
    d = Derivation()
    a_area = service.anode_area_cm2 or NOMINAL_ANODE_CM2
    areas = [a_area, a_area]
    areas[cathode_index] = a_area * area_ratio
    missing = [recs[p["state_used"]] for p in parts if record_for(ds, p["state_used"], service.electrolyte) is None]
    if missing:
        return None, (f"no polarization data for {missing[0].get('name', missing[0]['id'])} in {service.electrolyte} "
                      "in the dataset, so no mixed-potential judgement is made; the series verdict and the "
                      "upper-bound screen stand"), d
    faraday, reason = _faraday(recs, [p["state_used"] for p in parts])
    if faraday is None:
        return None, reason, d
    kin, reason = _kinetics(ds, parts, recs, service, areas, faraday)
    if kin is None:
        return None, reason, d
    for k in kin:
        d.steps.extend(k.steps)
        for s in k.sources:
            d.cite(s)
    els = [k.electrode for k in kin]
    E, halvings = mixed_potential(els)
    frees = [free_corrosion(el) for el in els]
    res = mixed_result(els, E, halvings, frees, reference_lines=True)
    d.steps.extend(res["steps"])
    d.step("Couple potential of the joint (metallic contact)", "the potential of the mixed-potential solution above",
           " and ".join(f"{el.name} {fmt(el.area_cm2)} cm²" for el in els), f"E_couple = {fmt(E, 4)} V vs SCE")
    for w in res["warnings"]:
        d.warn(w["field"], w["message"])
    out_parts = [_part_out(d, el, p, faraday[p["state_used"]], r, f, E)
                 for el, p, r, f in zip(els, parts, res["electrodes"], frees)]
    galvanic = res["galvanic_current_A"]
    anode = next((p for p in out_parts if p["role"] == "anode"), None)
    cathode = next((p for p in out_parts if p["role"] == "cathode"), None)
    o2_share = None
    if cathode is not None:
        k = out_parts.index(cathode)
        lim = [x["limited_fraction"] for x in res["electrodes"][k]["reactions"] if x["limited_fraction"] is not None]
        o2_share = lim[0] if lim else None
    ir = _with_ir(d, service, els, frees, E, galvanic, out_parts)
    return {
        "kind": "mixed potential",
        "couple_potential_V_SCE": E,
        "galvanic_current_A": galvanic,
        "galvanic_current_density_on_anode_uA_per_cm2": (galvanic / anode["area_cm2"] * 1e6) if anode else 0.0,
        "anode": anode["state_used"] if anode else None,
        "cathode": cathode["state_used"] if cathode else None,
        "anode_penetration_mm_per_year": anode["penetration_mm_per_year"] if anode else None,
        "cathode_o2_share_of_limit": o2_share,
        "balance_relative": res["balance_relative"],
        "parts": out_parts,
        "kinetics": [{"id": k.material_id, "record": k.record_id, "confidence": k.confidence, "lines": list(k.lines)}
                     for k in kin],
        "with_ir": ir,
        "evans": res["evans"],
        "assumptions": list(ASSUMPTIONS) + _film_assumptions(recs, cathode),
    }, None, d
