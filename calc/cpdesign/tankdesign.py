"""JSON entry point ``tank``: impressed-current anodes inside a water storage tank.

The models are those of :mod:`calc.cpdesign.tank` (MIL-HDBK-1004/10; USACE ETL 1110-9-10; UFC
3-570-02A, Appendix D); this module reads the request, chooses the arrangement of the anodes and
writes the derivation:

- ``centre``: short anodes in the water of a (small) tank, R = 0.012·ρ·log10(D/d)/L each, several of
  them grouped by the handbooks' paralleling factor (the hot-water tank of MIL-HDBK-1004/10);
- ``rod-circle``: a circle of rod (or string) anodes, R_N = 0.0052·ρ·ln[D/(2·AR·DE)]/L_B (ETL eq
  1-13), the circle's radius from r = D·N/(2(π + N)) when not given (UFC eq D-8);
- ``hoop``: a wire hoop, R = (0.0016·ρ/D_R)·[ln(8·D_R/D_A) + ln(2·D_R/H)] (ETL eq 1-14).

Short rods and anodes (L/d below 100) take the fringe factor of the handbooks' curve (MIL Figure 101,
ETL figure 2-18), which is a figure: the request gives the value read from it, and without it the
resistance is the formula's and a warning says so. Then: the wetted area and the current, the anode
material for the life (W = Y·S·I/E), the anodes for their rating (ETL eq 1-2), the circuit and the
rectifier, as for a groundbed (:mod:`calc.cpdesign.impressed`).
"""

import math

from ..dataset import current
from ..derivation import Derivation, fmt
from ..errors import InputError
from ..requests import read
from .buried import read_current
from .cautions import cautions
from .catalogue import alloy_group, row_source, table
from .groundbed import group_resistance
from .impressed import RULE_OF_THUMB_OHM, read_circuit, read_rectifier
from .limits import check, check_count
from .mass import count_for, handbook_mass
from .tank import (FRINGE_BELOW_L_OVER_D, circle_radius, circle_spacing, cylinder_area, ellipsoidal_bottom_area,
                   flat_bottom_area, fringe, hoop, rod_circle, tank_anode)

ARRANGEMENTS = ("centre", "rod-circle", "hoop")
BOTTOMS = ("flat", "ellipsoidal", "none")
#: arrangement -> its words; request key -> its words, for the messages
ARRANGEMENT_WORDS = {"centre": "anodes in the middle of the tank", "rod-circle": "circle of rods",
                     "hoop": "hoop of wire"}
KEY_WORDS = {"area_m2": "the wetted area", "current_A": "the current"}
_ARRANGED = ", ".join(f"{k} ({v})" for k, v in ARRANGEMENT_WORDS.items())
#: the share of the tank diameter a hoop usually has (ETL 1110-9-10 p. 13, read: "typically between 40
#: and 70 percent of the tank diameter") [unitless]
HOOP_SHARE = (0.40, 0.70)
#: the fields of one arrangement only (the others refuse them)
ONLY = {"centre": ("spacing_m",),
        "rod-circle": ("circle_radius_m", "equivalent_diameter_factor"),
        "hoop": ("hoop_diameter_m", "wire_diameter_m", "depth_m", "wire_rating_A_per_m")}
FIELDS = ("current_A", "area_m2", "wall_height_m", "bottom", "bottom_depth_m", "current_density_mA_per_m2",
          "coating_efficiency", "count", "anode_length_m", "anode_diameter_m", "spacing_m", "circle_radius_m",
          "equivalent_diameter_factor", "fringe_factor", "hoop_diameter_m", "wire_diameter_m", "depth_m",
          "life_years", "anode_material", "consumption_kg_per_A_yr", "efficiency", "anode_mass_kg",
          "anode_rating_A", "wire_rating_A_per_m", "max_resistance_ohm", "cable_length_m", "cable_ohm_per_km",
          "cable_resistance_ohm", "structure_resistance_ohm", "coating_resistance_ohm_m2", "structure_area_m2",
          "back_emf_V", "margin")


def _area(request, diameter, d):
    """The wetted area [m²] from the tank's geometry, or None (given, or a current given)."""
    if request.get("wall_height_m") is None:
        for key in ("bottom", "bottom_depth_m"):
            if request.get(key) is not None:
                raise InputError(key, request[key], "with the wetted height of the shell")
        return None
    if request.get("area_m2") is not None or request.get("current_A") is not None:
        key = "area_m2" if request.get("area_m2") is not None else "current_A"
        raise InputError("wall_height_m", request["wall_height_m"], f"the tank's geometry or {KEY_WORDS[key]}, not both")
    r, h = diameter / 2.0, check("length_m", request["wall_height_m"], "wall_height_m")
    bottom = request.get("bottom", "flat")
    if bottom not in BOTTOMS:
        raise InputError("bottom", bottom, "one of " + ", ".join(BOTTOMS))
    shell = cylinder_area(r, h)
    if bottom == "ellipsoidal":
        if request.get("bottom_depth_m") is None:
            raise InputError("bottom_depth_m", None, "the depth of the ellipsoidal bottom below the shell in m")
        a = check("length_m", request["bottom_depth_m"], "bottom_depth_m")
        base, words = ellipsoidal_bottom_area(r, a), f"2πr·√((a² + r²)/2) with a = {fmt(a)} m"
    elif bottom == "flat":
        base, words = flat_bottom_area(r), "πr²"
    else:
        base, words = 0.0, "no bottom (a riser or a shell alone)"
    d.step("Wetted area", "A = 2πrh + bottom (UFC 3-570-02A eq D-5 to D-7)",
           f"r = {fmt(r)} m, h = {fmt(h)} m: 2πrh = {fmt(shell, 5)} m²; bottom {words} = {fmt(base, 5)} m²",
           f"A = {fmt(shell + base, 5)} m²")
    return shell + base


def _fringe(request, resistance, length, diameter, d):
    """(the resistance after the fringe factor [Ω], the factor or None, L/d or None)."""
    ratio = None if diameter is None else length / diameter
    factor = request.get("fringe_factor")
    if factor is None and ratio is None:
        d.warn("anode_diameter_m", "no anode diameter given: whether the fringe factor of short anodes (L/d below "
                                   f"{FRINGE_BELOW_L_OVER_D:g}) applies is not checked")
    if factor is None:
        if ratio is not None and ratio < FRINGE_BELOW_L_OVER_D:
            d.warn("fringe_factor", f"L/d = {fmt(ratio, 3)} is below {FRINGE_BELOW_L_OVER_D:g}: the handbooks multiply "
                                    "the resistance by a fringe factor read from their curve (MIL-HDBK-1004/10 "
                                    "Figure 101, ETL 1110-9-10 figure 2-18); none was given, so none is applied")
        return resistance, None, ratio
    factor = check("fraction", factor, "fringe_factor")
    if ratio is not None and ratio >= FRINGE_BELOW_L_OVER_D:
        d.warn("fringe_factor", f"L/d = {fmt(ratio, 4)}: the handbooks apply the fringe factor only below "
                                f"{FRINGE_BELOW_L_OVER_D:g}")
    value = fringe(resistance, factor)
    d.step("Fringe factor of a short anode", "R_adj = R·F (ETL 1110-9-10 eq 2-7; F from the curve, as given)",
           f"R_adj = {fmt(resistance, 5)} Ω × {fmt(factor)}" + ("" if ratio is None else f" (L/d = {fmt(ratio, 4)})"),
           f"R_adj = {fmt(value, 5)} Ω")
    return value, factor, ratio


def _need(request, key, bound, words):
    if request.get(key) is None:
        raise InputError(key, None, words)
    return check(bound, request[key], key)


def _centre(request, rho, diameter, d):
    """Short anodes in the water: (one anode [Ω], the group [Ω], layout, paralleling or None)."""
    length = _need(request, "anode_length_m", "length_m", "the anode length in m")
    dia = _need(request, "anode_diameter_m", "diameter_m", "the anode diameter in m")
    if dia >= diameter:
        raise InputError("anode_diameter_m", dia, f"an anode thinner than the tank ({fmt(diameter)} m)")
    raw = tank_anode(rho, diameter, dia, length)
    d.step("Resistance of one anode in the tank", "R = 0.012·ρ·log10(D/d)/L (MIL-HDBK-1004/10; ρ in Ω·cm, L in ft)",
           f"R = 0.012 × {fmt(rho * 100)} Ω·cm × log10({fmt(diameter)}/{fmt(dia)}) / {fmt(length / 0.3048, 5)} ft",
           f"R = {fmt(raw, 5)} Ω")
    single, factor, ratio = _fringe(request, raw, length, dia, d)
    n = check_count(request.get("count", 1), "count")
    layout = {"count": n, "formula_resistance_ohm": raw, "fringe_factor": factor, "length_to_diameter": ratio}
    if n == 1:
        return single, single, layout, None
    spacing = _need(request, "spacing_m", "spacing_m", "the spacing of the anodes in m")
    group, p, row = group_resistance("table", single, rho, length, dia, n, spacing)
    src, conf = row_source(table("paralleling-factor"), row)
    d.cite(src)
    d.step(f"{n} anodes in a line (the handbooks' paralleling factor)", "R_N = R_V/N + ρ·P/S (ρ in Ω·cm, S in ft)",
           f"R_N = {fmt(single, 5)}/{n} + {fmt(rho * 100)} × {fmt(p)} / {fmt(spacing / 0.3048, 5)} ft (P {conf})",
           f"R_N = {fmt(group, 5)} Ω")
    return single, group, dict(layout, spacing_m=spacing), {"method": "table", "factor": p, "confidence": conf,
                                                            "source": src}


def _rod_circle(request, rho, diameter, d):
    """A circle of rods: (its resistance [Ω] twice, layout, None)."""
    length = _need(request, "anode_length_m", "length_m", "the length of each rod (L_B) in m")
    de = _need(request, "equivalent_diameter_factor", "factor",
               "the equivalent diameter factor DE read from ETL 1110-9-10 figure 2-17 for the number of rods")
    n = check_count(request["count"], "count") if request.get("count") is not None else None
    if request.get("circle_radius_m") is not None:
        ar = check("length_m", request["circle_radius_m"], "circle_radius_m")
    elif n is not None:
        ar = circle_radius(diameter, n)
        d.step("Radius of the anode circle", "r = D·N/(2(π + N)) (UFC 3-570-02A eq D-8)",
               f"r = {fmt(diameter)} m × {n} / (2(π + {n}))", f"r = {fmt(ar, 4)} m")
    else:
        raise InputError("circle_radius_m", None, "the radius of the anode circle in m, or the number of rods to compute it")
    if ar >= diameter / 2.0:
        raise InputError("circle_radius_m", ar, f"a circle inside the tank (radius below {fmt(diameter / 2.0)} m)")
    if diameter / (2.0 * ar * de) <= 1.0:
        raise InputError("equivalent_diameter_factor", de, "a factor with D/(2·AR·DE) above 1 (the figure's values "
                                                           "are small fractions)")
    raw = rod_circle(rho, diameter, ar, de, length)
    d.step("Resistance of the circle of rods", "R_N = 0.0052·ρ·ln[D/(2·AR·DE)]/L_B (ETL 1110-9-10 eq 1-13; "
           "ρ in Ω·cm, lengths in ft)", f"R_N = 0.0052 × {fmt(rho * 100)} Ω·cm × ln[{fmt(diameter)}/(2 × {fmt(ar, 4)} × "
           f"{fmt(de)})] / {fmt(length / 0.3048, 5)} ft", f"R_N = {fmt(raw, 5)} Ω")
    dia = (check("diameter_m", request["anode_diameter_m"], "anode_diameter_m")
           if request.get("anode_diameter_m") is not None else None)
    value, factor, ratio = _fringe(request, raw, length, dia, d)
    layout = {"count": n, "circle_radius_m": ar, "formula_resistance_ohm": raw, "fringe_factor": factor,
              "length_to_diameter": ratio}
    if n is not None:
        c = circle_spacing(ar, n)
        d.step("Spacing on the circle", "C = 2πr/N (UFC 3-570-02A eq D-9, ETL eq 2-5)", f"C = 2π × {fmt(ar, 4)} / {n}",
               f"C = {fmt(c, 4)} m")
        layout["spacing_m"] = c
    return value, value, layout, None


def _hoop(request, rho, diameter, d):
    """A wire hoop: (its resistance [Ω] twice, layout, None)."""
    dr = _need(request, "hoop_diameter_m", "tank_diameter_m", "the diameter of the wire hoop in m")
    da = _need(request, "wire_diameter_m", "diameter_m", "the diameter of the anode wire in m")
    depth = _need(request, "depth_m", "depth_m", "the hoop's depth below the high water level in m")
    if dr >= diameter:
        raise InputError("hoop_diameter_m", dr, f"a hoop inside the tank (below {fmt(diameter)} m)")
    if depth <= 0:
        raise InputError("depth_m", depth, "a depth above 0 m below the high water level")
    if da >= dr / 10.0:
        raise InputError("wire_diameter_m", da, f"a wire much thinner than the hoop (below {fmt(dr / 10.0)} m)")
    share = dr / diameter
    if not HOOP_SHARE[0] <= share <= HOOP_SHARE[1]:
        d.warn("hoop_diameter_m", f"the hoop is {fmt(share * 100, 3)} % of the tank diameter; the ETL finds 40 to "
                                  "70 % usual (ETL 1110-9-10 p. 13)")
    value = hoop(rho, dr, da, depth)
    if value <= 0:
        raise InputError("depth_m", depth, "a hoop less deep (the formula gives no positive resistance this deep)")
    d.step("Resistance of the wire hoop", "R = (0.0016·ρ/D_R)·[ln(8·D_R/D_A) + ln(2·D_R/H)] (ETL 1110-9-10 eq 1-14; "
           "ρ in Ω·cm, lengths in ft)", f"R = 0.0016 × {fmt(rho * 100)} Ω·cm / {fmt(dr / 0.3048, 5)} ft × "
           f"[ln(8 × {fmt(dr)}/{fmt(da)}) + ln(2 × {fmt(dr)}/{fmt(depth)})]", f"R = {fmt(value, 5)} Ω")
    layout = {"count": 1, "hoop_diameter_m": dr, "wire_length_m": math.pi * dr, "formula_resistance_ohm": value,
              "fringe_factor": None, "length_to_diameter": None}
    return value, value, layout, None


def _material(request, d):
    """(consumption S [kg/(A·yr)] or None (not consumed), efficiency E) of the request."""
    eff = check("fraction", request["efficiency"], "efficiency") if request.get("efficiency") is not None else None
    if request.get("consumption_kg_per_A_yr") is not None:
        if request.get("anode_material") is not None:
            raise InputError("consumption_kg_per_A_yr", request["consumption_kg_per_A_yr"],
                             "anode_material or consumption_kg_per_A_yr, not both")
        return check("consumption_kg_per_A_yr", request["consumption_kg_per_A_yr"]), 1.0 if eff is None else eff
    if request.get("anode_material") is None:
        return None, eff
    rec, imp = alloy_group(request["anode_material"], "impressed", "anode_material")
    d.cite(imp["source"])
    if imp["consumption_kg_per_A_yr"] is None:
        d.warn("anode_material", f"{rec['name']} is not consumed: the number of anodes follows from their rating")
        return None, eff
    if eff is None and imp.get("efficiency") is not None:
        eff = float(imp["efficiency"])
        d.step("Anode material", "consumption rate S and efficiency E", rec["name"],
               f"S = {fmt(imp['consumption_kg_per_A_yr'], 5)} kg/(A·yr), E = {fmt(eff)} ({imp['confidence']})")
    if eff is None:
        eff = 1.0
        if not imp.get("includes_efficiency"):
            d.warn("efficiency", "no efficiency given: 1 assumed, so the mass is the least possible")
    return float(imp["consumption_kg_per_A_yr"]), eff


def _life(request, amps, d):
    """{mass_required_kg, count_for_life} for the design life, or Nones."""
    out = {"mass_required_kg": None, "count_for_life": None}
    rate, eff = _material(request, d)
    if request.get("life_years") is None or rate is None:
        if request.get("anode_mass_kg") is not None and rate is not None:
            raise InputError("life_years", None, "the design life in years, for the anode mass it needs")
        return out
    life = check("life_years", request["life_years"])
    w = handbook_mass(life, rate, amps, eff)
    d.step("Anode material for the life", "W = Y·S·I/E (MIL-HDBK-1004/10)", f"W = {fmt(life)} yr × {fmt(rate, 4)} "
           f"kg/(A·yr) × {fmt(amps, 5)} A / {fmt(eff)}", f"W = {fmt(w, 5)} kg")
    out["mass_required_kg"] = w
    if request.get("anode_mass_kg") is not None:
        each = check("anode_mass_kg", request["anode_mass_kg"])
        out["count_for_life"] = count_for(w, each)
        d.step("Anodes for the life", "N = W/m (rounded up)", f"N = {fmt(w, 5)} / {fmt(each)} kg",
               f"N = {out['count_for_life']}")
    return out


def _rating(request, amps, layout, checks, d):
    """{count_for_rating, wire_length_needed_m}: the anodes (or wire) the current needs at their rating."""
    out = {"count_for_rating": None, "wire_length_needed_m": None}
    if request.get("anode_rating_A") is not None:
        rating = check("current_A", request["anode_rating_A"], "anode_rating_A")
        out["count_for_rating"] = count_for(amps, rating)
        d.step("Anodes for their rated current", "N = I/I_A (ETL 1110-9-10 eq 1-2a, rounded up)",
               f"N = {fmt(amps, 5)} A / {fmt(rating)} A", f"N = {out['count_for_rating']}")
        if layout.get("count"):
            checks.append({"name": "current rating", "passed": layout["count"] >= out["count_for_rating"],
                           "words": f"{layout['count']} anodes, {out['count_for_rating']} needed"})
    if request.get("wire_rating_A_per_m") is not None:
        per_m = check("current_per_length_A_per_m", request["wire_rating_A_per_m"], "wire_rating_A_per_m")
        need = amps / per_m
        out["wire_length_needed_m"] = need
        d.step("Wire for its rated current", "L = I/I_A (ETL 1110-9-10 eq 1-2b)", f"L = {fmt(amps, 5)} A / "
               f"{fmt(per_m)} A/m", f"L = {fmt(need, 4)} m")
        if layout.get("wire_length_m") is not None:
            have = layout["wire_length_m"]
            checks.append({"name": "wire length", "passed": have >= need,
                           "words": f"the hoop holds {fmt(have, 4)} m of wire, {fmt(need, 4)} m needed"})
    return out


def tank_entry(request):
    """JSON entry point ``tank``: impressed-current anodes inside a water storage tank.

    Args:
        request: ``{"resistivity_ohm_m", "tank_diameter_m", "arrangement" (centre, rod-circle, hoop),
            "current_A" or ("area_m2" or "wall_height_m" with "bottom" (flat, ellipsoidal, none) and
            "bottom_depth_m") with "current_density_mA_per_m2" and "coating_efficiency"; centre:
            "anode_length_m", "anode_diameter_m", "count", "spacing_m"; rod-circle: "anode_length_m",
            "equivalent_diameter_factor", "circle_radius_m" or "count", "anode_diameter_m"; hoop:
            "hoop_diameter_m", "wire_diameter_m", "depth_m"; "fringe_factor"; "life_years",
            "anode_material" or "consumption_kg_per_A_yr", "efficiency", "anode_mass_kg",
            "anode_rating_A", "wire_rating_A_per_m"; the circuit and rectifier fields of groundbed}``
            [Ω·m, m, A, m², mA/m², kg/(A·yr), kg, A/m, Ω, V]

    Returns:
        dict with resistance_ohm (the anodes to the water), single_anode_ohm, arrangement, layout,
        paralleling, area_m2, current_required_A, mass_required_kg, count_for_life, count_for_rating,
        wire_length_needed_m, circuit_ohm, rectifier, checks, steps, warnings, cautions, sources,
        data_version

    References:
        :mod:`calc.cpdesign.tank` (MIL-HDBK-1004/10, 1990; USACE ETL 1110-9-10, 1991; UFC 3-570-02A, 2005).

    >>> r = tank_entry({"resistivity_ohm_m": 86, "tank_diameter_m": 1.167, "arrangement": "centre",
    ...                 "anode_length_m": 0.2286, "anode_diameter_m": 0.0381, "fringe_factor": 0.48,
    ...                 "count": 3, "spacing_m": 1.2192, "current_A": 0.84})
    >>> round(r["single_anode_ohm"], 1), round(r["resistance_ohm"], 1)  # MIL-HDBK-1004/10 p. 189: 98.2, 38.94
    (98.2, 38.9)
    """
    read(request, "tank", {"resistivity_ohm_m": "the water resistivity in Ω·m",
                           "tank_diameter_m": "the tank's inside diameter in m",
                           "arrangement": "how the anodes are placed: " + _ARRANGED}, FIELDS)
    d = Derivation()
    rho = check("resistivity_ohm_m", request["resistivity_ohm_m"])
    diameter = check("tank_diameter_m", request["tank_diameter_m"])
    arrangement = request["arrangement"]
    if not isinstance(arrangement, str) or arrangement not in ARRANGEMENTS:
        raise InputError("arrangement", arrangement, "one of " + _ARRANGED)
    for other, keys in ONLY.items():
        for key in keys:
            if other != arrangement and request.get(key) is not None:
                raise InputError(key, request[key], "no such field", f"it belongs to the {ARRANGEMENT_WORDS[other]}, "
                                                                   f"not to the {ARRANGEMENT_WORDS[arrangement]}")
    if arrangement == "hoop":
        for key in ("anode_length_m", "anode_diameter_m", "fringe_factor", "count"):
            if request.get(key) is not None:
                raise InputError(key, request[key], "no such field", "a hoop is given by its diameter, its wire's "
                                                                   "diameter and its depth")
    if request.get("life_years") is not None:  # a bad life is refused even where it is not needed
        check("life_years", request["life_years"])
    d.cite("mil-hdbk-1004-10")
    d.cite("usace-etl-1110-9-10-1991")
    area = _area(request, diameter, d)
    if area is None and request.get("area_m2") is not None:
        area = check("area_m2", request["area_m2"])
    amps = None
    if area is not None or request.get("area_m2") is not None or request.get("current_A") is not None:
        amps = read_current(dict(request, area_m2=area) if area is not None else request, d)
    model = {"centre": _centre, "rod-circle": _rod_circle, "hoop": _hoop}[arrangement]
    single, group, layout, par = model(request, rho, diameter, d)
    checks = []
    life = _life(request, amps, d) if amps is not None else {"mass_required_kg": None, "count_for_life": None}
    rating = _rating(request, amps, layout, checks, d) if amps is not None else {
        "count_for_rating": None, "wire_length_needed_m": None}
    if amps is None and any(request.get(k) is not None for k in ("life_years", "anode_rating_A", "wire_rating_A_per_m")):
        d.warn("current_A", "no current given (the current, or the area and its current density): the anode "
                            "material and the number for the rating are not computed")
    circuit = read_circuit(request, group, d)
    if request.get("max_resistance_ohm") is not None:
        target = check("resistance_ohm", request["max_resistance_ohm"], "max_resistance_ohm")
        checks.append({"name": "circuit resistance", "passed": circuit["total"] <= target,
                       "words": f"R_T = {fmt(circuit['total'], 4)} Ω {'≤' if circuit['total'] <= target else '>'} "
                                f"{fmt(target)} Ω"})
    if circuit["total"] > RULE_OF_THUMB_OHM:
        d.warn(None, f"the circuit resistance {fmt(circuit['total'], 4)} Ω is above the {RULE_OF_THUMB_OHM:g} Ω often "
                     "used to limit the rectifier voltage (ETL 1110-9-10); a small current may allow more")
    rect = read_rectifier(dict(request, current_A=amps), circuit["total"], d) if amps is not None else None
    return {"resistance_ohm": group, "single_anode_ohm": single, "arrangement": arrangement, "layout": layout,
            "paralleling": par, "area_m2": area,
            "current_required_A": amps, **life, **rating, "circuit_ohm": circuit, "rectifier": rect,
            "checks": checks, "steps": d.steps, "warnings": d.warnings, "cautions": cautions("tank"),
            "sources": d.sources, "data_version": current().version}
