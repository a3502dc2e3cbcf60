"""Galvanic anodes for a buried structure: the method of MIL-HDBK-1004/10 (1990) and its successors.

The handbook's steps (continued in UFC 3-570-02N, 2004, and UFC 3-570-02A, 2005, eq C-1 to C-3):

1. current required, I = A·I'·(1 − CE), from the area, the current density of bare steel and the
   coating efficiency (or given);
2. the anode mass for the life, W = Y·S·I/E (S the consumption rate, E the current efficiency);
3. the output of one anode, i = C·f·y/P (P the soil resistivity in Ω·cm; C a constant of the alloy
   and coating, f the anode size factor, y the structure potential factor, after Tefankjian 1972);
4. the number of anodes, n = I/i, and the life of the anodes installed, Y = W·E/(S·I).

The handbook's simplified output equation assumes a resistivity above 500 Ω·cm and about 10 ft
between anode and structure; closely spaced groups need its multiplying factor, not modelled here.
"""

from ..dataset import current
from ..derivation import Derivation, fmt
from ..errors import InputError
from ..requests import read
from .cautions import cautions
from .catalogue import alloy_group, names_of, row_source, table
from .limits import check
from .mass import count_for, handbook_life, handbook_mass
from .units import LB_KG, ohm_cm

#: the handbook's output equation is meant for soils above this resistivity (para 4.2.5, read) [Ω·cm]
RESISTIVITY_MIN_OHM_CM = 500.0
#: the structure potential of the factor y when the request gives none [V vs CSE] (NACE -0.85 V criterion)
POTENTIAL_DEFAULT_V_CSE = -0.85
#: the structure's coating as the output constant's table tells them apart -> its row for magnesium
COATINGS = {"well-coated": "magnesium-well-coated", "bare": "magnesium-bare"}
#: alloy id -> the column of the potential-factor table and the alloy of the output constant
ALLOY_FAMILY = {"magnesium": "magnesium", "magnesium-high-potential": "magnesium", "zinc": "zinc"}
FIELDS = ("current_A", "area_m2", "current_density_mA_per_m2", "coating_efficiency", "resistivity_ohm_m", "alloy",
          "anode", "size_factor", "anode_mass_kg", "structure_potential_V_CSE", "coating", "output_constant",
          "life_years")


def current_required(area, density, coating_efficiency):
    """Current required by a buried structure, I = A·I'·(1 − CE).

    Args:
        area: the structure's surface area A [m²]
        density: current density for bare steel I' [mA/m²]
        coating_efficiency: share of the surface the coating insulates, CE [unitless]

    Returns:
        current required [mA]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-1; TM 5-811-7 as carried in UFC 3-570-02A (2005).

    >>> round(current_required(1095.4, 21.528, 0.90))  # 11 791 ft², 2 mA/ft², CE 0.90
    2358
    """
    return area * density * (1.0 - coating_efficiency)


def anode_output(constant, size_factor, potential_factor, resistivity_ohm_cm):
    """Current output of one galvanic anode in soil, i = C·f·y/P.

    Args:
        constant: C of the alloy and coating (120 000 for magnesium on well-coated structures) [mA·Ω·cm]
        size_factor: anode size factor f [unitless]
        potential_factor: structure potential factor y [unitless]
        resistivity_ohm_cm: soil resistivity P [Ω·cm]

    Returns:
        anode output [mA]

    References:
        MIL-HDBK-1004/10 (1990) para 4.2.5; UFC 3-570-02A (2005) eq C-2 (after Tefankjian, Materials
        Protection and Performance 11, 1972).

    >>> round(anode_output(120000, 1.00, 1.00, 4500), 1)
    26.7
    """
    return constant * size_factor * potential_factor / resistivity_ohm_cm


def potential_factor(potential, family):
    """The structure potential factor y at a potential, linearly between the table's rows.

    Args:
        potential: structure-to-soil potential [V vs CSE]
        family: ``magnesium`` or ``zinc`` [unitless]

    Returns:
        (y, the table record) [unitless]

    References:
        UFC 3-570-02A (2005) Table C-5 (data/cp_design_tables.yaml); interpolation between rows is ours.

    >>> potential_factor(-0.85, "magnesium")[0], round(potential_factor(-0.95, "zinc")[0], 3)
    (1.0, 0.6)
    """
    tab = table("structure-potential-factor")
    rows = sorted(tab["rows"], key=lambda r: -r["potential_V_CSE"])  # -0.70 first
    if not rows[-1]["potential_V_CSE"] <= potential <= rows[0]["potential_V_CSE"]:
        raise InputError("structure_potential_V_CSE", potential, f"a structure potential from "
                         f"{rows[-1]['potential_V_CSE']} to {rows[0]['potential_V_CSE']} V vs CSE (the table's span)")
    for hi, lo in zip(rows, rows[1:]):
        e1, e2 = hi["potential_V_CSE"], lo["potential_V_CSE"]
        if e2 <= potential <= e1:
            w = (e1 - potential) / (e1 - e2)
            return hi[family] + w * (lo[family] - hi[family]), tab
    return rows[0][family], tab


def _constant(request, family, d):
    """The output constant C [mA·Ω·cm], given or from the table."""
    coating = request.get("coating", "well-coated")
    if not isinstance(coating, str) or coating not in COATINGS:
        raise InputError("coating", coating, "well-coated or bare (poorly coated)")
    if request.get("output_constant") is not None:
        if request.get("coating") is not None:
            d.warn("coating", "the output constant C is given, so the coating (which only chooses C) is not used")
        return check("constant_C", request["output_constant"], "output_constant")
    tab = table("output-constant")
    rows = [r for r in tab["rows"] if r["alloy"] == family]
    if family == "magnesium":
        rows = [r for r in rows if r["id"] == COATINGS[coating]]
    row = rows[0]
    src, conf = row_source(tab, row)
    d.cite(src)
    d.step("Output constant", "C by alloy and coating (MIL-HDBK-1004/10 para 4.2.5)", f"{family}, {row['coating']}",
           f"C = {fmt(row['C_mA_ohm_cm'])} mA·Ω·cm ({conf})")
    if conf != "read":
        d.warn("coating", f"the constant C = {fmt(row['C_mA_ohm_cm'])} is recalled, not re-read in the handbook")
    return float(row["C_mA_ohm_cm"])


def _anode(request, d):
    """(size factor f, anode mass [kg], anode id or None)."""
    if request.get("anode") is not None:
        if request.get("size_factor") is not None or request.get("anode_mass_kg") is not None:
            raise InputError("size_factor", request.get("size_factor"),
                             "an anode of the handbook's table, or a size factor with the anode mass, not both")
        tab = table("anode-size-factor")
        given = request["anode"].strip().lower() if isinstance(request["anode"], str) else None
        row = next((r for r in tab["rows"] if r["id"] == given), None)
        if row is None:
            raise InputError("anode", request["anode"], "one of the handbook's anodes: " + "; ".join(
                f"{r['mass_lb']} lb {r['group']}" for r in tab["rows"]))
        d.cite(tab["source"])
        mass = row["mass_lb"] * LB_KG
        d.step("Anode size factor", "f of the anode (UFC 3-570-02A Table C-4)", f"{row['mass_lb']} lb, {row['group']}",
               f"f = {fmt(row['f'])}, anode mass {fmt(mass, 4)} kg")
        return float(row["f"]), mass, row["id"]
    if request.get("size_factor") is None:
        raise InputError("anode", None, "an anode of the handbook's table (e.g. the 17 lb standard packaged one), or a "
                                        "size factor with the anode mass")
    f = check("factor", request["size_factor"], "size_factor")
    mass = (check("anode_mass_kg", request["anode_mass_kg"], "anode_mass_kg")
            if request.get("anode_mass_kg") is not None else None)
    return f, mass, None


def read_current(request, d):
    """The current a request needs: current_A as given, or I = A·I'·(1 − CE) from the area.

    Args:
        request: the request, with current_A, or area_m2 with current_density_mA_per_m2 and
            coating_efficiency (0 when not given) [A, m², mA/m², unitless]
        d: the derivation the step is written to [unitless]

    Returns:
        the current required [A]

    References:
        :func:`current_required` (USACE ETL 1110-9-10, 1991, eq 1-1).

    >>> from calc.derivation import Derivation
    >>> round(read_current({"area_m2": 1095.4, "current_density_mA_per_m2": 21.528,
    ...                     "coating_efficiency": 0.9}, Derivation()), 3)
    2.358
    """
    area_given = request.get("area_m2") is not None
    if request.get("current_A") is not None:
        if area_given:
            raise InputError("area_m2", request["area_m2"], "the current required, or the surface area with its current density, not both")
        return check("current_A", request["current_A"])
    if not area_given:
        raise InputError("current_A", None, "the current required in A, or the surface area with the current density "
                                            "of bare steel and the coating efficiency")
    area = check("area_m2", request["area_m2"])
    if request.get("current_density_mA_per_m2") is None:
        raise InputError("current_density_mA_per_m2", None, "the current density of bare steel in mA/m²")
    dens = check("current_density_mA_per_m2", request["current_density_mA_per_m2"])
    ce = check("coating_efficiency", request.get("coating_efficiency", 0.0))
    if ce >= 1.0:
        raise InputError("coating_efficiency", ce, "a coating efficiency below 1 (1 would need no current)")
    ma = current_required(area, dens, ce)
    d.step("Current required", "I = A·I'·(1 − CE)", f"I = {fmt(area)} m² × {fmt(dens)} mA/m² × (1 − {fmt(ce)})",
           f"I = {fmt(ma, 5)} mA")
    return ma / 1000.0


def _alloy_names():
    """The anode alloys of the handbook's method, by name."""
    return names_of("cp_anode_alloys", lambda rec: rec["id"] in ALLOY_FAMILY)


def buried_entry(request):
    """JSON entry point ``buried``: galvanic anodes for a buried structure (MIL-HDBK-1004/10 method).

    Args:
        request: ``{"current_A" or ("area_m2", "current_density_mA_per_m2", "coating_efficiency"),
            "resistivity_ohm_m", "alloy" (magnesium, magnesium-high-potential, zinc), "anode" (an id
            of the size-factor table) or ("size_factor", "anode_mass_kg"), "structure_potential_V_CSE",
            "coating" (well-coated or bare, magnesium), "output_constant", "life_years"}``
            [A, m², mA/m², Ω·m, kg, V vs CSE, mA·Ω·cm, years]

    Returns:
        dict with current_required_A, anode_output_mA, count_exact, count_for_output,
        mass_required_kg, count_for_life, count, governed_by, life_of_count_years, size_factor,
        potential_factor, output_constant, steps, warnings, cautions, sources, data_version

    References:
        :func:`current_required`, :func:`anode_output`, :func:`calc.cpdesign.mass.handbook_mass`
        (MIL-HDBK-1004/10, 1990; UFC 3-570-02A, 2005, eq C-1 to C-3).

    >>> r = buried_entry({"current_A": 0.858, "resistivity_ohm_m": 45, "alloy": "magnesium",
    ...                   "anode": "17-lb-packaged", "life_years": 15})
    >>> round(r["anode_output_mA"], 1), round(r["count_exact"], 1), r["count"]  # the handbook: 26.7 mA, 32.1
    (26.7, 32.2, 33)
    """
    read(request, "buried", {"resistivity_ohm_m": "the soil resistivity in Ω·m", "alloy": "the anode alloy: "
                             + _alloy_names(), "life_years": "the design life in years"}, FIELDS)
    d = Derivation()
    life = check("life_years", request["life_years"])
    rho = check("resistivity_ohm_m", request["resistivity_ohm_m"])
    rec, bur = alloy_group(request["alloy"], "buried")
    family = ALLOY_FAMILY.get(rec["id"])
    if family is None:
        raise InputError("alloy", request["alloy"], "an anode alloy of the handbook's method: " + _alloy_names())
    d.cite(bur["source"])
    amps = read_current(request, d)
    s, e = bur["consumption_kg_per_A_yr"], bur["efficiency"]
    w = handbook_mass(life, s, amps, e)
    d.step("Anode mass for the life", "W = Y·S·I/E", f"W = {fmt(life)} yr × {fmt(s, 5)} kg/(A·yr) × {fmt(amps, 5)} A "
           f"/ {fmt(e)}", f"W = {fmt(w, 5)} kg ({fmt(w / LB_KG, 5)} lb)")
    f, each, anode_id = _anode(request, d)
    pot = check("potential_V", request.get("structure_potential_V_CSE", POTENTIAL_DEFAULT_V_CSE),
                "structure_potential_V_CSE")
    y, ytab = potential_factor(pot, family)
    d.cite(ytab["source"])
    on_row = any(abs(r["potential_V_CSE"] - pot) < 1e-9 for r in ytab["rows"])
    d.step("Structure potential factor", "y of the structure potential (UFC 3-570-02A Table C-5)",
           f"{fmt(pot)} V vs CSE, {family} anodes" + ("" if on_row else " (between two rows: linear, our choice)"),
           f"y = {fmt(y, 4)}")
    c = _constant(request, family, d)
    p = ohm_cm(rho)
    if p < RESISTIVITY_MIN_OHM_CM:
        d.warn("resistivity_ohm_m", f"{fmt(p)} Ω·cm is below the {RESISTIVITY_MIN_OHM_CM:g} Ω·cm the handbook's output "
                                    "equation assumes: compute the anode resistance instead")
    i = anode_output(c, f, y, p)
    d.step("Output of one anode", "i = C·f·y/P", f"i = {fmt(c)} × {fmt(f)} × {fmt(y, 4)} / {fmt(p)} Ω·cm",
           f"i = {fmt(i, 4)} mA")
    n_exact = amps * 1000.0 / i
    by = {"current output": count_for(amps * 1000.0, i)}
    if each is not None:
        by["anode life"] = count_for(w, each)
    n = max(by.values())
    governed = next(k for k in by if by[k] == n)
    d.step("Number of anodes", "n = I/i (rounded up); with the life: W/(mass of one anode), the larger governs",
           f"n = {fmt(amps * 1000.0, 5)} mA / {fmt(i, 4)} mA = {fmt(n_exact, 4)}" + (
               f"; W/m = {fmt(w, 5)} / {fmt(each, 4)} kg = {fmt(w / each, 4)}" if each else ""),
           f"n = {n} (governed by {governed})")
    if n > 1:
        d.warn(None, "the anodes are taken as widely spaced (the handbook's multiplying factor for closely spaced "
                     "magnesium anode groups is not applied)")
    life_n = None if each is None else handbook_life(n * each, s, amps, e)
    if life_n is not None:
        d.step("Life of the anodes installed", "Y = W·E/(S·I)", f"Y = {n} × {fmt(each, 4)} kg × {fmt(e)} / "
               f"({fmt(s, 5)} kg/(A·yr) × {fmt(amps, 5)} A)", f"Y = {fmt(life_n, 4)} years")
    return {"current_required_A": amps, "anode_output_mA": i, "count_exact": n_exact, "count_for_output": by[
        "current output"], "mass_required_kg": w, "count_for_life": by.get("anode life"), "count": n,
        "governed_by": governed, "life_of_count_years": life_n, "life_years": life, "alloy": rec["id"],
        "anode": anode_id, "anode_mass_kg": each, "size_factor": f, "potential_factor": y, "output_constant": c,
        "resistivity_ohm_cm": p, "steps": d.steps, "warnings": d.warnings, "cautions": cautions("buried"),
        "sources": d.sources, "data_version": current().version}
