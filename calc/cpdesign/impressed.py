"""JSON entry point ``groundbed``: an impressed-current groundbed, its circuit, rectifier and anode life.

The models are those of :mod:`calc.cpdesign.groundbed`; this module reads the request, chooses the
model (vertical or horizontal anode; the handbooks' paralleling table or Sunde's formula), and writes
the derivation. Checks against the worked examples of MIL-HDBK-1004/10 and USACE ETL 1110-9-10 are in
``tests/test_cpdesign_groundbed.py``.
"""

from ..dataset import current
from ..derivation import Derivation, fmt
from ..errors import InputError
from ..requests import read
from .cautions import cautions
from .catalogue import alloy_group, row_source, table
from .groundbed import (cable_resistance, count_for_resistance, dwight_horizontal, dwight_vertical, group_resistance,
                        rectifier, shape_function, structure_resistance)
from .limits import check, check_count
from .mass import count_for, handbook_life

#: a 2-ohm maximum groundbed resistance is often used to limit the rectifier voltage (ETL 1110-9-10, read) [Ω]
RULE_OF_THUMB_OHM = 2.0
#: the margin on the rectifier current when the request gives none (common practice, from memory) [unitless]
MARGIN_DEFAULT = 0.25
#: back voltage between impressed-current anodes and steel when the request gives none (common practice,
#: from memory: about 2 V; the handbook's pier example adds 3 V) [V]
BACK_EMF_DEFAULT_V = 2.0
PARALLELING = ("table", "sunde")
FIELDS = ("resistivity_ohm_m", "length_m", "diameter_m", "orientation", "depth_m", "count", "spacing_m", "paralleling",
          "max_resistance_ohm", "current_A", "cable_length_m", "cable_ohm_per_km", "cable_resistance_ohm",
          "structure_resistance_ohm", "coating_resistance_ohm_m2", "structure_area_m2", "back_emf_V", "margin",
          "anode_material", "anode_mass_kg", "consumption_kg_per_A_yr", "life_years", "anode_rating_A")


def _single(request, rho, d):
    """(one anode's resistance [Ω], orientation, L, D)."""
    length = check("length_m", request["length_m"])
    diameter = check("diameter_m", request["diameter_m"])
    orientation = request.get("orientation", "vertical")
    if orientation == "vertical":
        value = dwight_vertical(rho, length, diameter)
        d.step("Resistance of one vertical anode (Dwight 1936)", "R_V = ρ/(2πL)·[ln(8L/d) − 1]",
               f"R_V = {fmt(rho)} Ω·m/(2π × {fmt(length)} m) × [ln(8 × {fmt(length)}/{fmt(diameter)}) − 1]; "
               f"the handbooks' shape function K = {fmt(shape_function(length, diameter), 4)}",
               f"R_V = {fmt(value, 5)} Ω")
        return value, orientation, length, diameter
    if orientation != "horizontal":
        raise InputError("orientation", orientation, "vertical or horizontal")
    if request.get("depth_m") is None:
        raise InputError("depth_m", None, "the depth of the horizontal anode's axis in m")
    depth = check("depth_m", request["depth_m"])
    if depth <= 0:
        raise InputError("depth_m", depth, "a depth above 0 m for a horizontal anode")
    value = dwight_horizontal(rho, length, diameter, depth)
    d.step("Resistance of one horizontal anode (Dwight, with its image; from memory)",
           "R_H = ρ/(2πL)·[ln((4L² + 4L·√(S² + L²))/(d·S)) + S/L − √(S² + L²)/L − 1], S = 2h",
           f"ρ = {fmt(rho)} Ω·m, L = {fmt(length)} m, d = {fmt(diameter)} m, h = {fmt(depth)} m",
           f"R_H = {fmt(value, 5)} Ω")
    d.warn("orientation", "the horizontal-anode formula is recalled, not re-read in the handbook")
    return value, orientation, length, diameter


def _group(request, rho, single, orientation, length, diameter, d):
    """(groundbed resistance, count, method, paralleling record or None)."""
    n = check_count(request.get("count", 1), "count")
    method = request.get("paralleling", "table")
    if method not in PARALLELING:
        raise InputError("paralleling", method, "the handbooks' paralleling table (table) or Sunde's formula (sunde)")
    if n == 1:
        return single, n, None, None, None
    if request.get("spacing_m") is None:
        raise InputError("spacing_m", None, "the centre-to-centre spacing of the anodes in m")
    spacing = check("spacing_m", request["spacing_m"])
    if method == "sunde" and orientation == "horizontal":
        raise InputError("paralleling", method, "the handbooks' paralleling table for horizontal anodes (Sunde's formula is for vertical ones)")
    value, p, row = group_resistance(method, single, rho, length, diameter, n, spacing)
    if method == "table":
        src, conf = row_source(table("paralleling-factor"), row)
        d.cite(src)
        d.step(f"Groundbed of {n} anodes in a line (the handbooks' paralleling factor)", "R_N = R_V/N + ρ·P/S "
               "(ρ in Ω·cm, S in ft)", f"R_N = {fmt(single, 5)}/{n} + {fmt(rho * 100)} Ω·cm × {fmt(p)} / "
               f"{fmt(spacing / 0.3048, 5)} ft (P {conf})", f"R_N = {fmt(value, 5)} Ω")
        if conf != "read":
            d.warn("count", f"the paralleling factor for {n} anodes ({fmt(p)}) is recalled, not re-read")
        if orientation == "horizontal":
            d.warn("orientation", "the paralleling form is for vertical anodes; for horizontal ones it is an "
                                  "approximation (ETL 1110-9-10)")
        return value, n, method, {"method": method, "factor": p, "confidence": conf, "source": src}, spacing
    d.step(f"Groundbed of {n} anodes in a line (Sunde's formula, from memory)",
           "R = ρ/(2πNL)·[ln(8L/d) − 1 + (2L/S)·ln(0.656·N)]",
           f"ρ = {fmt(rho)} Ω·m, N = {n}, L = {fmt(length)} m, d = {fmt(diameter)} m, S = {fmt(spacing)} m",
           f"R = {fmt(value, 5)} Ω")
    return value, n, method, {"method": method, "factor": None, "confidence": "recalled", "source": None}, spacing


def read_circuit(request, bed, d):
    """The circuit of a request: groundbed, cable and structure resistances and their sum, R_T = R_N + R_W + R_C.

    Args:
        request: the request, with cable_resistance_ohm or cable_length_m and cable_ohm_per_km, and
            structure_resistance_ohm or coating_resistance_ohm_m2 with structure_area_m2 [Ω, m, Ω/km, Ω·m², m²]
        bed: the groundbed's (or the anodes') resistance R_N [Ω]
        d: the derivation the steps are written to [unitless]

    Returns:
        dict with groundbed, cable, structure and total [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-3, 1-15 and 1-16 (:func:`calc.cpdesign.groundbed.cable_resistance`,
        :func:`calc.cpdesign.groundbed.structure_resistance`).

    >>> from calc.derivation import Derivation
    >>> round(read_circuit({"cable_resistance_ohm": 0.05}, 0.01, Derivation())["total"], 3)  # the pier: 0.06 Ω
    0.06
    """
    cable = 0.0
    if request.get("cable_resistance_ohm") is not None:
        cable = check("circuit_ohm", request["cable_resistance_ohm"], "cable_resistance_ohm")
    elif request.get("cable_length_m") is not None:
        if request.get("cable_ohm_per_km") is None:
            raise InputError("cable_ohm_per_km", None, "the cable's resistance in Ω/km")
        length = check("length_m", request["cable_length_m"], "cable_length_m")
        per_km = check("cable_ohm_per_km", request["cable_ohm_per_km"])
        cable = cable_resistance(length, per_km)
        d.step("Cable resistance", "R_W = L·r", f"R_W = {fmt(length)} m × {fmt(per_km)} Ω/km",
               f"R_W = {fmt(cable, 4)} Ω")
    structure = 0.0
    if request.get("structure_resistance_ohm") is not None:
        structure = check("circuit_ohm", request["structure_resistance_ohm"], "structure_resistance_ohm")
    elif request.get("coating_resistance_ohm_m2") is not None:
        rs = check("coating_resistance_ohm_m2", request["coating_resistance_ohm_m2"])
        if request.get("structure_area_m2") is None:
            raise InputError("structure_area_m2", None, "the structure's surface area in m²")
        area = check("area_m2", request["structure_area_m2"], "structure_area_m2")
        structure = structure_resistance(rs, area)
        d.step("Structure-to-earth resistance", "R_C = R_s/A", f"R_C = {fmt(rs)} Ω·m² / {fmt(area)} m²",
               f"R_C = {fmt(structure, 4)} Ω")
    total = bed + cable + structure
    d.step("Total circuit resistance", "R_T = R_N + R_W + R_C", f"R_T = {fmt(bed, 5)} + {fmt(cable, 4)} + "
           f"{fmt(structure, 4)} Ω", f"R_T = {fmt(total, 5)} Ω")
    return {"groundbed": bed, "cable": cable, "structure": structure, "total": total}


def _life(request, amps, n, d):
    """Life of the anodes installed [years], or None (no material or mass, or a material not consumed)."""
    if request.get("anode_mass_kg") is None:
        return None
    each = check("anode_mass_kg", request["anode_mass_kg"])
    if request.get("consumption_kg_per_A_yr") is not None:
        rate, src = check("consumption_kg_per_A_yr", request["consumption_kg_per_A_yr"]), None
    elif request.get("anode_material") is not None:
        rec, imp = alloy_group(request["anode_material"], "impressed", "anode_material")
        rate, src = imp["consumption_kg_per_A_yr"], imp["source"]
        d.cite(src)
        if rate is None:
            d.warn("anode_material", f"{rec['name']} is not consumed: its life is the maker's rating for the current")
            return None
        if not imp.get("includes_efficiency"):
            d.warn("anode_material", "the consumption rate is the theoretical one: the life is an upper bound")
    else:
        raise InputError("anode_material", None, "an impressed-current anode material, or its consumption rate in kg/(A·yr)")
    years = handbook_life(n * each, rate, amps)
    d.step("Life of the anodes", "Y = W/(S·I) (S including the efficiency)",
           f"Y = {n} × {fmt(each)} kg / ({fmt(rate, 4)} kg/(A·yr) × {fmt(amps, 5)} A)", f"Y = {fmt(years, 4)} years")
    if request.get("life_years") is not None:
        want = check("life_years", request["life_years"])
        if years < want:
            d.warn("anode_mass_kg", f"the anodes last about {fmt(years, 3)} years, less than the {fmt(want)} years "
                                    "asked")
    return years


def read_rectifier(request, total, d):
    """The rectifier of a request: output at the design current and rating with the margin, or None.

    Args:
        request: the request, with current_A and optionally margin and back_emf_V [A, unitless, V]
        total: the total circuit resistance R_T [Ω]
        d: the derivation the steps and warnings are written to [unitless]

    Returns:
        dict with current_A, voltage_V, rated_current_A, rated_voltage_V, margin, back_emf_V, or None
        without a design current

    References:
        :func:`calc.cpdesign.groundbed.rectifier` (MIL-HDBK-1004/10; the margin is ours).

    >>> from calc.derivation import Derivation
    >>> round(read_rectifier({"current_A": 14.7, "back_emf_V": 3, "margin": 0}, 0.06, Derivation())["voltage_V"], 3)
    3.882
    """
    if request.get("current_A") is None:
        return None
    amps = check("current_A", request["current_A"])
    margin = check("margin", request.get("margin", MARGIN_DEFAULT))
    back = check("back_emf_V", request.get("back_emf_V", BACK_EMF_DEFAULT_V))
    for key, words, value in (("margin", "no rectifier margin given", MARGIN_DEFAULT),
                              ("back_emf_V", "no back voltage given", BACK_EMF_DEFAULT_V)):
        if request.get(key) is None:
            d.warn(key, f"{words}: {fmt(value)}{' V' if key == 'back_emf_V' else ''} assumed (common practice)")
    volts, rated_a, rated_v = rectifier(amps, total, back, margin)
    d.step("Rectifier", "V = I·R_T + back voltage; rating: I(1 + margin) and the voltage it needs",
           f"V = {fmt(amps, 5)} A × {fmt(total, 5)} Ω + {fmt(back)} V; margin {fmt(margin)}",
           f"V = {fmt(volts, 4)} V; rated {fmt(rated_a, 4)} A at {fmt(rated_v, 4)} V")
    return {"current_A": amps, "voltage_V": volts, "rated_current_A": rated_a, "rated_voltage_V": rated_v,
            "margin": margin, "back_emf_V": back}


def _target(request, rho, single, n, method, spacing, length, diameter, bed, checks, d):
    """The fewest anodes for ``max_resistance_ohm`` (a check of the groundbed against it), or None."""
    if request.get("max_resistance_ohm") is None:
        return None
    target = check("resistance_ohm", request["max_resistance_ohm"], "max_resistance_ohm")
    found = None
    if n > 1 or request.get("spacing_m") is not None:
        sp = spacing or check("spacing_m", request["spacing_m"])
        cnt, val = count_for_resistance(single, rho, sp, target, method or "table", length, diameter)
        found = {"count": cnt, "resistance_ohm": val, "method": method or "table"}
        d.step("Anodes needed for the resistance", f"the fewest N with R_N ≤ {fmt(target)} Ω", f"S = {fmt(sp)} m",
               f"N = {cnt}" if cnt else "no count of the table reaches it")
    checks.append({"name": "groundbed resistance", "passed": bed <= target,
                   "words": f"R_N = {fmt(bed, 4)} Ω {'≤' if bed <= target else '>'} {fmt(target)} Ω"})
    return found


def _rating(request, n, checks, d):
    """The anodes the design current needs at their rated current (ceramic anodes), or None."""
    if request.get("anode_rating_A") is None:
        return None
    if request.get("current_A") is None:
        raise InputError("current_A", None, "the design current in A, which the anodes' rating must carry")
    rating = check("current_A", request["anode_rating_A"], "anode_rating_A")
    amps = check("current_A", request["current_A"])
    needed = count_for(amps, rating)
    d.step("Anodes for their current rating", "N = I/I_A (rounded up)", f"N = {fmt(amps)} A / {fmt(rating)} A",
           f"N = {needed}")
    checks.append({"name": "current rating", "passed": n >= needed, "words": f"{n} anodes, {needed} needed"})
    return needed


def groundbed_entry(request):
    """JSON entry point ``groundbed``: resistance of an impressed-current groundbed, circuit, rectifier, life.

    Args:
        request: ``{"resistivity_ohm_m", "length_m", "diameter_m", "orientation" (vertical,
            horizontal), "depth_m", "count", "spacing_m", "paralleling" (table, sunde),
            "max_resistance_ohm", "current_A", "cable_length_m", "cable_ohm_per_km" or
            "cable_resistance_ohm", "structure_resistance_ohm" or ("coating_resistance_ohm_m2",
            "structure_area_m2"), "back_emf_V", "margin", "anode_material" or
            "consumption_kg_per_A_yr", "anode_mass_kg", "life_years", "anode_rating_A"}``
            [Ω·m, m, A, Ω/km, Ω, Ω·m², m², V, kg, kg/(A·yr), years]

    Returns:
        dict with resistance_ohm (groundbed), single_anode_ohm, count, paralleling, circuit_ohm,
        count_for_resistance, count_for_rating, rectifier, life_years, checks, steps, warnings,
        cautions, sources, data_version

    References:
        :mod:`calc.cpdesign.groundbed` (Dwight 1936; MIL-HDBK-1004/10; USACE ETL 1110-9-10, 1991).

    >>> r = groundbed_entry({"resistivity_ohm_m": 45, "length_m": 1.524, "diameter_m": 0.0508, "count": 9,
    ...                      "spacing_m": 3.048})
    >>> round(r["resistance_ohm"], 2)  # ETL 1110-9-10 example 2-3: 3.29 Ω
    3.29
    """
    read(request, "groundbed", {"resistivity_ohm_m": "the soil resistivity in Ω·m",
                                "length_m": "the anode (or backfill column) length in m",
                                "diameter_m": "the anode (or backfill column) diameter in m"}, FIELDS)
    d = Derivation()
    rho = check("resistivity_ohm_m", request["resistivity_ohm_m"])
    if request.get("life_years") is not None:  # a bad life is refused even where it is not needed
        check("life_years", request["life_years"])
    single, orientation, length, diameter = _single(request, rho, d)
    d.cite("mil-hdbk-1004-10")
    bed, n, method, par, spacing = _group(request, rho, single, orientation, length, diameter, d)
    checks = []
    by_r = _target(request, rho, single, n, method, spacing, length, diameter, bed, checks, d)
    by_rating = _rating(request, n, checks, d)
    circuit = read_circuit(request, bed, d)
    if circuit["total"] > RULE_OF_THUMB_OHM:
        d.warn(None, f"the circuit resistance {fmt(circuit['total'], 4)} Ω is above the {RULE_OF_THUMB_OHM:g} Ω "
                     "often used to limit the rectifier voltage (ETL 1110-9-10)")
        d.cite("usace-etl-1110-9-10-1991")
    rect = read_rectifier(request, circuit["total"], d)
    if rect is None and request.get("anode_mass_kg") is not None:
        d.warn("current_A", "no design current given: the anode life is not computed")
    life = _life(request, rect["current_A"], n, d) if rect else None
    return {"resistance_ohm": bed, "single_anode_ohm": single, "orientation": orientation, "count": n,
            "paralleling": par, "circuit_ohm": circuit, "count_for_resistance": by_r, "count_for_rating": by_rating,
            "rectifier": rect, "life_years": life, "checks": checks, "steps": d.steps, "warnings": d.warnings,
            "cautions": cautions("impressed"), "sources": d.sources, "data_version": current().version}
