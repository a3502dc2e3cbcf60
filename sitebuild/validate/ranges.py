"""Physical ranges of the values, and range ends in the right order.

The bounds are generous: they catch typos and unit slips, not handbook disagreements.
"""

import math

from .collect import each, fmt, is_num

#: standard potentials of aqueous couples lie within about -3.1 V (Li) and +2.9 V (F2) [V vs SHE]
#: (common practice; bounds as set in the project brief)
E0_RANGE_V = (-4.0, 3.5)
#: electrons transferred in a tabulated half-reaction [unitless] (project brief)
N_RANGE = (1, 8)
#: isothermal temperature coefficients of tabulated couples stay within about ±2 mV/K [mV/K]
#: (common practice; e.g. O2/OH- is about -1.68 mV/K, Bratsch 1989 Table 2, from memory)
DEDT_RANGE_MV_PER_K = (-5.0, 5.0)
#: reaction heat-capacity changes of simple couples [J/(mol·K)] (common practice)
DCP_RANGE = (-1500.0, 1500.0)
#: temperatures of validity and of environments [°C] (project brief)
TEMP_RANGE_C = (-50.0, 200.0)
#: corrosion potentials in seawater: Mg about -1.6 V, graphite about +0.3 V vs SCE (ASTM G82
#: Fig. 1 after LaQue 1975, from memory); bounds with room for other electrolytes [V vs SCE]
SERIES_RANGE_V = (-2.0, 1.0)
#: legacy anodic index runs 0 (gold) to 1.85 V (beryllium) [V] (legacy military/industry table)
ANODIC_INDEX_RANGE_V = (0.0, 2.0)
#: densities of engineering metals: Mg 1.74 to Os/Ir 22.6 g/cm3 [g/cm3] (project brief)
DENSITY_RANGE = (0.5, 23.0)
#: ASTM G102 equivalent weights: atomic weight / valence, at most about 200 g (Au+) [g]
EW_MAX_G = 250.0
#: allowable potential differences [V] (common practice)
ALLOWABLE_MAX_V = 2.0
#: ionic strength of natural waters and brines [mol/kg] (common practice)
IONIC_STRENGTH_MAX = 10.0
#: cathodic current densities: 0 up to 1 A/cm2 [µA/cm2] (common practice)
CURRENT_DENSITY_MAX = 1.0e6
#: Kielland ion-size parameters run 2.5 to 11 Å (Kielland 1937, from memory) [Å]
ION_SIZE_RANGE = (0.5, 15.0)
ION_CHARGE_RANGE = (-4, 4)
#: the galvanic series the dataset carries, and the materials field that holds it
SERIES_FIELDS = {"seawater-flowing": "seawater_range_V_SCE"}


def in_range(kind, label, field, value, lo, hi, unit, out, lo_open=False):
    """A number within [lo, hi] (or (lo, hi]); True when it is, False after reporting it or when
    it is no number or the schema already reported the field."""
    if not is_num(value) or out.flagged(kind, label, field):
        return False
    if not math.isfinite(value):
        out.error(kind, label, field, f"value {value} is not a finite number")
        return False
    low_bad = value <= lo if lo_open else value < lo
    if low_bad or value > hi:
        lo_txt = f"more than {lo:g}" if lo_open else f"{lo:g}"
        out.error(kind, label, field,
                  f"value {value:g} is outside the physical range {lo_txt} to {hi:g} {unit}".rstrip())
        return False
    return True


def pair(kind, label, field, value, lo, hi, unit, out, strict=False, ends="[low, high]"):
    """A two-number range: both ends in bounds and in order. Returns the pair or None."""
    if not (isinstance(value, list) and len(value) == 2 and all(is_num(v) for v in value)) \
            or out.flagged(kind, label, field):
        return None  # the schema reports the shape
    ok = [in_range(kind, label, f"{field}[{i}]", v, lo, hi, unit, out) for i, v in enumerate(value)]
    if not all(ok):
        return None
    a, b = value
    if a > b or (strict and a == b):
        out.error(kind, label, field, f"range ends in the wrong order: {fmt(value)}; write {ends}"
                  + ("" if a == b else f" = [{b:g}, {a:g}]"))
        return None
    return a, b


def whole_number(value, lo, hi):
    """True for a finite whole number from lo to hi."""
    return math.isfinite(value) and value == int(value) and lo <= value <= hi


def _half_reaction(label, rec, out):
    k = "half_reactions"
    in_range(k, label, "E0_V", rec.get("E0_V"), *E0_RANGE_V, "V vs SHE", out)
    n = rec.get("n")
    if is_num(n) and not whole_number(n, *N_RANGE):
        out.error(k, label, "n", f"value {fmt(n)} is not a whole number of electrons "
                                 f"from {N_RANGE[0]} to {N_RANGE[1]}")
    in_range(k, label, "dEdT_mV_per_K", rec.get("dEdT_mV_per_K"), *DEDT_RANGE_MV_PER_K, "mV/K", out)
    in_range(k, label, "dCp_J_per_mol_K", rec.get("dCp_J_per_mol_K"), *DCP_RANGE, "J/(mol·K)", out)
    pair(k, label, "valid_C", rec.get("valid_C"), *TEMP_RANGE_C, "°C", out, strict=True)


def _reference_electrode(label, rec, out):
    k = "reference_electrodes"
    in_range(k, label, "E_V_SHE", rec.get("E_V_SHE"), *E0_RANGE_V, "V vs SHE", out)
    model, base = rec.get("temperature"), "temperature"
    if not isinstance(model, dict):
        return
    pair(k, label, f"{base}.valid_C", model.get("valid_C"), *TEMP_RANGE_C, "°C", out, strict=True)
    if "t_ref_C" in model:
        in_range(k, label, f"{base}.t_ref_C", model.get("t_ref_C"), *TEMP_RANGE_C, "°C", out)
    if "slope_mV_per_K" in model:
        in_range(k, label, f"{base}.slope_mV_per_K", model.get("slope_mV_per_K"), *DEDT_RANGE_MV_PER_K, "mV/K", out)


def _composition(label, comp, out):
    k = "materials"
    total, ok = 0.0, True
    for el, pct in comp.items():
        if in_range(k, label, f"composition_wt_pct.{el}", pct, 0.0, 100.0, "wt%", out, lo_open=True):
            total += pct
        else:
            ok = ok and not is_num(pct)
    if ok and total > 100.5:
        out.error(k, label, "composition_wt_pct", f"the mass fractions add up to {total:g} wt%: at most 100")


def _material(label, rec, out):
    k = "materials"
    for series_field in SERIES_FIELDS.values():
        pair(k, label, series_field, rec.get(series_field), *SERIES_RANGE_V, "V vs SCE", out,
             ends="[active end, noble end]")
    in_range(k, label, "anodic_index_V", rec.get("anodic_index_V"), *ANODIC_INDEX_RANGE_V, "V", out)
    in_range(k, label, "density_g_cm3", rec.get("density_g_cm3"), *DENSITY_RANGE, "g/cm3", out)
    in_range(k, label, "equivalent_weight_g", rec.get("equivalent_weight_g"), 0.0, EW_MAX_G, "g", out, lo_open=True)
    if isinstance(rec.get("composition_wt_pct"), dict):
        _composition(label, rec["composition_wt_pct"], out)


def _environment(label, rec, out):
    k = "environments"
    allow = rec.get("allowable_V")
    ok_allow = in_range(k, label, "allowable_V", allow, 0.0, ALLOWABLE_MAX_V, "V", out, lo_open=True)
    negl = rec.get("negligible_V")
    if in_range(k, label, "negligible_V", negl, 0.0, ALLOWABLE_MAX_V, "V", out) and ok_allow and negl >= allow:
        out.error(k, label, "negligible_V", f"value {negl:g} V is not below allowable_V {allow:g} V")
    pair(k, label, "temperature_range_C", rec.get("temperature_range_C"), *TEMP_RANGE_C, "°C", out)
    in_range(k, label, "ionic_strength_mol_per_kg", rec.get("ionic_strength_mol_per_kg"), 0.0,
             IONIC_STRENGTH_MAX, "mol/kg", out)
    cd, cd_field = rec.get("cathodic_current_density_uA_per_cm2"), "cathodic_current_density_uA_per_cm2"
    check = in_range if is_num(cd) else pair
    check(k, label, cd_field, cd, 0.0, CURRENT_DENSITY_MAX, "µA/cm2", out)


def _ion(label, rec, out):
    k = "ions"
    in_range(k, label, "size_angstrom", rec.get("size_angstrom"), *ION_SIZE_RANGE, "Å", out)
    z = rec.get("charge")
    if is_num(z) and (not whole_number(z, *ION_CHARGE_RANGE) or z == 0):
        out.error(k, label, "charge", f"value {fmt(z)} is not a non-zero whole charge from "
                                      f"{ION_CHARGE_RANGE[0]} to +{ION_CHARGE_RANGE[1]}")


_BY_KIND = {"half_reactions": _half_reaction, "reference_electrodes": _reference_electrode,
            "materials": _material, "environments": _environment, "ions": _ion}


def check_ranges(raw, out):
    """The physical range of every value of the half-reactions, electrodes, materials,
    environments and ions (the CP criteria's: see :mod:`.cp`)."""
    for kind, check in _BY_KIND.items():
        for label, rec in each(raw, kind):
            check(label, rec, out)
