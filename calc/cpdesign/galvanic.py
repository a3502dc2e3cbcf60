"""Galvanic-anode design of an immersed structure: demand, net mass, anode resistance and output, count.

The offshore method (DNV-RP-B401 and its public restatements, El-Reedy 2012 ch. 6): the current
demand of the structure's zones (initial, mean, final), the net anode mass for the mean demand over
the design life, the resistance of one anode at its initial and final (consumed) dimensions and its
output I = ΔE/R, and the number of anodes: the largest of the counts from the mass, from the initial
and from the final output. The design can start from the zones or directly from the design currents.
"""

from ..dataset import current
from ..derivation import Derivation, fmt
from ..errors import InputError
from ..field.criteria import criteria_for
from ..requests import read
from .anodes import SHAPE_NAMES, consumed_standoff, output, resistance
from .cautions import cautions
from .catalogue import alloy_group, names_of, record, short_name
from .demand import STAGES
from .limits import check
from .mass import count_for, net_mass
from .units import HOURS_PER_YEAR
from .zones import read_zones, region_of, zone_demand

#: the protection criterion used for the driving voltage when the request gives none (data/cp_criteria.yaml)
PROTECTION_CRITERION = "steel-seawater-aerobic"
#: the setting whose negative limit the anode's potential is checked against
LIMIT_SETTING = "seawater-aerobic"
#: request fields of ``anodes``
FIELDS = ("zones", "current_initial_A", "current_mean_A", "current_final_A", "life_years", "region", "water_temp_C",
          "alloy", "capacity_Ah_per_kg", "closed_circuit_V", "anode_type", "utilisation", "anode",
          "resistivity_ohm_m", "protection_V", "structure")
ANODE_FIELDS = ("net_mass_kg", "length_m", "radius_m", "periphery_m", "width_m", "area_m2", "standoff_m",
                "core_radius_m", "final")
DIMENSIONS = ("length_m", "radius_m", "periphery_m", "width_m", "area_m2")


def _sea(rec):
    """True for an anode material with seawater design values."""
    return isinstance(rec.get("seawater"), dict)


def _demand(request, life, d):
    """The initial, mean and final demand [A], and the zones they came from (None in direct mode)."""
    if request.get("zones") is not None:
        for key in ("current_initial_A", "current_mean_A", "current_final_A"):
            if request.get(key) is not None:
                raise InputError(key, request[key], "zones or the design currents, not both")
        zones = read_zones(request["zones"])
        region = region_of(request, any(z[1] == "seawater" for z in zones))
        if region is not None:
            d.step("Climatic region", "by the surface-water temperature (or as named)", region["name"],
                   short_name(region))
        rows = [zone_demand(z, region, life, d, field=f"zones[{i}].coating") for i, z in enumerate(zones)]
        total = {s: sum(r["current_A"][s] for r in rows) for s in STAGES}
        d.step("Current demand of the structure", "I = Σ zones",
               "; ".join(f"I_{s} = " + " + ".join(fmt(r['current_A'][s], 5) for r in rows) for s in STAGES),
               ", ".join(f"I_{s} = {fmt(total[s], 5)} A" for s in STAGES))
        return total, rows
    if request.get("current_mean_A") is None:
        raise InputError("zones", None, "the structure's zones, or the mean design current (and the final one) directly")
    total = {s: (check("current_A", request[f"current_{s}_A"], f"current_{s}_A")
                 if request.get(f"current_{s}_A") is not None else None) for s in STAGES}
    if total["final"] is None:
        d.warn("current_final_A", "no final current demand given: the final output check is skipped")
    d.step("Current demand (given)", "design currents as given", ", ".join(
        f"I_{s} = {fmt(total[s], 5)} A" for s in STAGES if total[s] is not None), "taken as given")
    return total, None


def _alloy(request, d):
    """(capacity [A·h/kg], closed-circuit potential [V vs Ag/AgCl seawater], alloy id or None)."""
    direct = request.get("capacity_Ah_per_kg") is not None or request.get("closed_circuit_V") is not None
    if direct and request.get("alloy") is not None:
        raise InputError("capacity_Ah_per_kg", request.get("capacity_Ah_per_kg"),
                         "an anode alloy, or its capacity with its closed-circuit potential, not both")
    if request.get("alloy") is not None:
        rec, sea = alloy_group(request["alloy"], "seawater")
        d.cite(sea["source"])
        d.step("Anode alloy", "design electrochemical capacity ε and closed-circuit potential E_a",
               rec["name"], f"ε = {fmt(sea['capacity_Ah_per_kg'])} A·h/kg, E_a = {fmt(sea['closed_circuit_V'])} V "
               f"vs {sea['electrode']} ({sea['confidence']})")
        return float(sea["capacity_Ah_per_kg"]), float(sea["closed_circuit_V"]), rec["id"]
    if request.get("capacity_Ah_per_kg") is None:
        raise InputError("alloy", None, f"an anode alloy ({names_of('cp_anode_alloys', _sea)}) or its "
                                         "electrochemical capacity directly")
    eps = check("capacity_Ah_per_kg", request["capacity_Ah_per_kg"])
    e_a = (check("potential_V", request["closed_circuit_V"], "closed_circuit_V")
           if request.get("closed_circuit_V") is not None else None)
    return eps, e_a, None


def _anode_type(request, d):
    """(utilisation, shape or None, type record or None)."""
    if request.get("anode_type") is not None and request.get("utilisation") is not None:
        raise InputError("utilisation", request["utilisation"], "an anode type or a utilisation factor, not both")
    if request.get("anode_type") is not None:
        rec = record("cp_anode_types", request["anode_type"], "anode_type")
        d.cite(rec["source"])
        d.step("Anode type", "utilisation factor u and resistance formula", rec["name"],
               f"u = {fmt(rec['utilisation'])} ({rec['confidence']}), formula: {SHAPE_NAMES[rec['shape']]}")
        return float(rec["utilisation"]), rec["shape"], rec
    if request.get("utilisation") is None:
        raise InputError("anode_type", None, "an anode type (e.g. a long slender stand-off anode) or its utilisation factor "
                                              "directly")
    return check("fraction", request["utilisation"], "utilisation"), None, None


def _protection(request, e_a, d):
    """(protection potential [V vs Ag/AgCl seawater], structure id)."""
    structure = request.get("structure", "carbon-steel")
    rec = record("cp_structures", structure, "structure")
    sid = rec["id"]
    if request.get("protection_V") is not None:
        e_c = check("potential_V", request["protection_V"], "protection_V")
    else:
        crit = record("cp_criteria", PROTECTION_CRITERION, "protection_V")
        e_c = float(crit["potential_V"])
        d.cite(crit["source"])
        d.step("Design protection potential", "the protection criterion of steel in aerobic seawater",
               f"{crit['name']} ({crit['electrode']})", f"E_c = {fmt(e_c)} V")
    limits = [r for r in criteria_for(sid, LIMIT_SETTING) if r.get("kind") == "limit"]
    if e_a is not None and limits and e_a < limits[0]["potential_V"]:
        d.warn("alloy", f"the anode's closed-circuit potential {fmt(e_a)} V is more negative than the limit "
                        f"{fmt(limits[0]['potential_V'])} V for {short_name(rec).lower()}: risk of hydrogen embrittlement; "
                        "limit the potential (a less negative alloy, or diodes where the standard allows them)")
        d.cite(limits[0]["source"])
    return e_c, sid


def _dims(block, prefix):
    """The dimensions of an anode block, each checked where given."""
    if not isinstance(block, dict):
        raise InputError(prefix.rstrip("."), block, "an object with the anode's dimensions")
    for key in block:
        if key not in ANODE_FIELDS or (prefix.endswith("final.") and key in ("final", "net_mass_kg")):
            raise InputError(prefix + key, block[key], "no such field", "an anode takes: " + ", ".join(ANODE_FIELDS))
    return block


def _final_dims(anode, shape, u, d):
    """The consumed dimensions: given, the stand-off rule (from memory), or the initial ones with a warning."""
    if anode.get("final") is not None:
        return dict(_dims(anode["final"], "anode.final."), standoff_m=anode.get("standoff_m"))
    if shape == "standoff" and anode.get("length_m") is not None and anode.get("radius_m") is not None:
        core = (check("radius_m", anode["core_radius_m"], "anode.core_radius_m")
                if anode.get("core_radius_m") is not None else 0.0)
        lf, rf = consumed_standoff(check("length_m", anode["length_m"], "anode.length_m"),
                                   check("radius_m", anode["radius_m"], "anode.radius_m"), u, core)
        d.step("Final (consumed) anode dimensions", "L_f = 0.9·L; r_f² = r_c² + (1 − u)·(r² − r_c²)·L/L_f "
               "(rule from memory; give the consumed dimensions to use your own)", f"u = {fmt(u)}, r_c = {fmt(core)} m",
               f"L_f = {fmt(lf, 4)} m, r_f = {fmt(rf, 4)} m")
        return {"length_m": lf, "radius_m": rf, "standoff_m": anode.get("standoff_m")}
    d.warn("anode.final", "no consumed dimensions given: the final resistance uses the initial ones, so the final "
                          "output and the count from it are optimistic; give the consumed (final) anode "
                          "dimensions")
    return anode


def _outputs(request, shape, rule, u, driving, d):
    """({"initial", "final"} resistances and outputs) of one anode, or (None, None) without its geometry."""
    anode = request.get("anode") or {}
    if not any(anode.get(k) is not None for k in DIMENSIONS):
        return None, None
    if shape is None:
        raise InputError("anode_type", request.get("anode_type"), "an anode type, whose resistance formula "
                                                                   "the anode's dimensions need")
    if driving is None:
        raise InputError("closed_circuit_V", None, "the anode's closed-circuit potential in V vs Ag/AgCl seawater")
    if request.get("resistivity_ohm_m") is None:
        raise InputError("resistivity_ohm_m", None, "the seawater (or sediment) resistivity in Ω·m")
    rho = check("resistivity_ohm_m", request["resistivity_ohm_m"])
    if shape == "standoff" and rule:
        d.cite(rule["source"])
    res, out = {}, {}
    for stage, dims in (("initial", anode), ("final", _final_dims(anode, shape, u, d))):
        prefix = "anode." if stage == "initial" else "anode.final."
        value, formula, text, warns = resistance(shape, rho, dims, prefix, rule)
        for w in warns:
            d.warn(prefix.rstrip("."), w)
        res[stage], out[stage] = value, output(driving, value)
        d.step(f"Anode resistance, {stage}", formula, text, f"R_{stage} = {fmt(value, 5)} Ω")
        d.step(f"Anode output, {stage}", "I_a = ΔE/R", f"I_a = {fmt(driving, 4)} V / {fmt(value, 5)} Ω",
               f"I_a,{stage} = {fmt(out[stage], 5)} A")
    return res, out


def _counts(demand, mass, each_kg, out, d):
    """(count, counts by criterion, governing criterion, checks)."""
    by = {}
    if each_kg is not None:
        by["mass"] = count_for(mass, each_kg)
    for stage in ("final", "initial"):
        if out is not None and demand.get(stage) is not None:
            by[f"{stage} current output"] = count_for(demand[stage], out[stage])
    if not by:
        d.warn("anode", "give the net mass and the dimensions of one anode for the number of anodes")
        return None, by, None, []
    n = max(by.values())
    governed = next(k for k in by if by[k] == n)
    d.step("Number of anodes", "N = max(⌈M/m_a⌉, ⌈I_f/I_a,f⌉, ⌈I_i/I_a,i⌉): the largest governs",
           ", ".join(f"{k}: {v}" for k, v in by.items()), f"N = {n} (governed by {governed})")
    checks = []
    if each_kg is not None:
        checks.append({"name": "net mass", "passed": n * each_kg >= mass - 1e-9,
                       "words": f"{n} × {fmt(each_kg)} kg = {fmt(n * each_kg, 5)} kg ≥ {fmt(mass, 5)} kg"})
    for stage in ("initial", "final"):
        if out is not None and demand.get(stage) is not None:
            have = n * out[stage]
            checks.append({"name": f"{stage} current", "passed": have >= demand[stage] - 1e-9,
                           "words": f"{n} × {fmt(out[stage], 4)} A = {fmt(have, 5)} A ≥ {fmt(demand[stage], 5)} A"})
    return n, by, governed, checks


def anodes_entry(request):
    """JSON entry point ``anodes``: galvanic-anode design of an immersed structure.

    Args:
        request: ``{"zones": [{"area_m2", "zone": seawater|seabed, "depth_m", "coating", "name"}] or
            "current_mean_A" (+ "current_initial_A", "current_final_A"), "life_years", "region" or
            "water_temp_C", "alloy" or "capacity_Ah_per_kg" (+ "closed_circuit_V"), "anode_type" or
            "utilisation", "anode": {"net_mass_kg", "length_m", "radius_m" or "periphery_m", "width_m",
            "area_m2", "standoff_m", "core_radius_m", "final": {dimensions}}, "resistivity_ohm_m",
            "protection_V", "structure"}`` [m², m, years, °C, A·h/kg, V vs Ag/AgCl seawater, kg, Ω·m]

    Returns:
        dict with current_demand_A {initial, mean, final}, zones, life_years, capacity_Ah_per_kg,
        utilisation, net_mass_kg, protection_V, closed_circuit_V, driving_V, resistance_ohm and
        output_A {initial, final} (or None), count, count_by, governed_by, checks, life_of_count_years,
        steps, warnings, cautions, sources, data_version

    References:
        :mod:`calc.cpdesign.demand`, :func:`calc.cpdesign.mass.net_mass`, :mod:`calc.cpdesign.anodes`
        (DNV-RP-B401 as restated by El-Reedy, Offshore Structures, 2012, ch. 6).

    >>> r = anodes_entry({"current_mean_A": 50, "current_final_A": 60, "life_years": 25, "alloy": "al-zn-in",
    ...                   "anode_type": "long-slender-standoff", "resistivity_ohm_m": 0.3,
    ...                   "anode": {"net_mass_kg": 300, "length_m": 2.5, "radius_m": 0.12, "standoff_m": 0.3}})
    >>> r["count"], r["governed_by"], round(r["net_mass_kg"])
    (23, 'final current output', 6083)
    """
    read(request, "anodes", {"life_years": "the design life in years"}, FIELDS)
    d = Derivation()
    life = check("life_years", request["life_years"])
    demand, zones = _demand(request, life, d)
    eps, e_a, alloy = _alloy(request, d)
    u, shape, _type = _anode_type(request, d)
    mass = net_mass(demand["mean"], life, u, eps)
    d.step("Net anode mass", "M = I_m·t_f·8760/(u·ε)",
           f"M = {fmt(demand['mean'], 5)} A × {fmt(life)} yr × 8760 h/yr / ({fmt(u)} × {fmt(eps)} A·h/kg)",
           f"M = {fmt(mass, 5)} kg")
    e_c, structure = _protection(request, e_a, d)
    driving = None if e_a is None else e_c - e_a
    if driving is not None:
        if driving <= 0:
            raise InputError("closed_circuit_V", e_a, f"an anode potential more negative than the protection "
                                                     f"potential {fmt(e_c)} V (no driving voltage otherwise)")
        d.step("Driving voltage", "ΔE = E_c − E_a", f"ΔE = {fmt(e_c)} − ({fmt(e_a)}) V", f"ΔE = {fmt(driving, 4)} V")
    anode = _dims(request.get("anode") or {}, "anode.")
    rule = _type.get("standoff") if _type else None
    res, out = _outputs(request, shape, rule, u, driving, d)
    each = (check("anode_mass_kg", anode["net_mass_kg"], "anode.net_mass_kg")
            if anode.get("net_mass_kg") is not None else None)
    n, by, governed, checks = _counts(demand, mass, each, out, d)
    life_n = None if n is None or each is None else n * each * u * eps / (demand["mean"] * HOURS_PER_YEAR)
    return {"current_demand_A": demand, "zones": zones, "life_years": life, "capacity_Ah_per_kg": eps,
            "utilisation": u, "alloy": alloy, "net_mass_kg": mass, "protection_V": e_c, "closed_circuit_V": e_a,
            "driving_V": driving, "structure": structure, "resistance_ohm": res, "output_A": out, "count": n,
            "count_by": by, "governed_by": governed, "checks": checks, "life_of_count_years": life_n,
            "steps": d.steps, "warnings": d.warnings, "cautions": cautions("offshore"), "sources": d.sources,
            "data_version": current().version}
