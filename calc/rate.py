"""Corrosion rate from a current density by Faraday's law, as ASTM G102 writes it.

Method: ASTM G102-89 (reapproved 2015), *Standard Practice for Calculation of Corrosion Rates
and Related Information from Electrochemical Measurements*:

- penetration rate, Eq. (1):  CR = K1 · i · EW / ρ   [mm/y], K1 = 3.27e-3 mm·g/(µA·cm·y)
- mass-loss rate,   Eq. (2):  MR = K2 · i · EW       [g/(m²·d)], K2 = 8.954e-3 g·cm²/(µA·m²·d)
- equivalent weight of an alloy, Eqs. (4)-(6) and Table 1: EW = 1 / Σ (n_i · f_i / W_i), with f_i
  the mass fraction, n_i the valence and W_i the atomic weight of element i; elements below
  1 % by mass are left out, as in G102 Table 1.

K1 and K2 are Faraday's law with unit conversions; :func:`k1_from_faraday` and
:func:`k2_from_faraday` rebuild them from the CODATA 2018 Faraday constant as a check.
"""

import math
from dataclasses import asdict, dataclass, field

from . import constants
from .bounds import BOUNDS
from .dataset import current
from .derivation import Derivation
from .elements import ATOMIC_WEIGHTS, VALENCES
from .errors import DataError, InputError
from .requests import read

#: ASTM G102-89 (R2015) Eq. (1) constant for CR in mm/y with i in µA/cm², ρ in g/cm³ [mm·g/(µA·cm·y)]
K1_MM = 3.27e-3
#: ASTM G102-89 (R2015) Eq. (2) constant for MR in g/(m²·d) with i in µA/cm² [g·cm²/(µA·m²·d)]
K2_G_M2_D = 8.954e-3
#: elements below this share are left out of the equivalent weight (ASTM G102 Table 1 note) [wt %]
MIN_WT_PCT = 1.0
#: current densities above this are far beyond any oxygen-limited cathode in water: warn [µA/cm²]
HIGH_CURRENT_UA_CM2 = 10000.0
#: highest current density accepted at all, 1 A/cm² (the bound the data validator uses; common
#: practice); far above it the rates overflow a double [µA/cm²]
CURRENT_MAX_UA_CM2 = BOUNDS["current_density_uA_per_cm2"].high

#: material families that have no meaningful Faraday rate, with the reason shown to the user
_NO_DISSOLUTION = {
    "graphite": "graphite is not a metal: it does not dissolve anodically, it only serves as a cathode",
    "carbon": "carbon is not a metal: it does not dissolve anodically, it only serves as a cathode",
    "noble metal": "a noble metal does not dissolve anodically in these waters, it serves as a cathode",
    "precious metal": "a noble metal does not dissolve anodically in these waters, it serves as a cathode",
}
_NOBLE_WORDS = ("platinum", "gold", "graphite", "rhodium")


def k1_from_faraday(year_days=365.25):
    """ASTM G102 K1 rebuilt from Faraday's law and unit conversions.

    K1 = (1e-6 A/µA) · (s per year) · (10 mm/cm) / F.

    Args:
        year_days: length of the year used [d]

    Returns:
        K1 [mm·g/(µA·cm·y)]

    References:
        ASTM G102-89 (R2015) Eq. (1) and its Note on K1; F from CODATA 2018.

    >>> round(k1_from_faraday(), 7)
    0.0032707
    """
    return 1e-6 * year_days * 86400.0 * 10.0 / constants.FARADAY


def k2_from_faraday():
    """ASTM G102 K2 rebuilt from Faraday's law and unit conversions.

    K2 = (1e-6 A/µA) · (86 400 s/d) · (1e4 cm²/m²) / F.

    Returns:
        K2 [g·cm²/(µA·m²·d)]

    References:
        ASTM G102-89 (R2015) Eq. (2); F from CODATA 2018.

    >>> round(k2_from_faraday(), 7)
    0.0089547
    """
    return 1e-6 * 86400.0 * 1e4 / constants.FARADAY


@dataclass(frozen=True)
class EquivalentWeight:
    """Equivalent weight of an alloy by the G102 method, with the terms that made it."""

    value_g: float
    terms: tuple  # (element, wt %, valence, atomic weight, n·f/W)
    ignored: tuple  # elements below MIN_WT_PCT
    total_wt_pct: float
    steps: tuple = field(default=())


def _composition_numbers(composition_wt_pct, field_name):
    """Mass shares as numbers; one element may be given as 'balance'."""
    if not isinstance(composition_wt_pct, dict) or not composition_wt_pct:
        raise InputError(field_name, composition_wt_pct, "a mapping element -> mass share in %, e.g. {'Fe': 98}")
    numbers, balance = {}, None
    for el, pct in composition_wt_pct.items():
        if isinstance(pct, str) and pct.strip().lower() in ("bal", "balance", "rem", "remainder"):
            if balance is not None:
                raise InputError(f"{field_name}.{el}", pct, "at most one element given as 'balance'")
            balance = el
            continue
        if isinstance(pct, bool) or not isinstance(pct, (int, float)) or not math.isfinite(pct) or not 0 <= pct <= 100:
            raise InputError(f"{field_name}.{el}", pct, "a mass share from 0 to 100 %")
        numbers[el] = float(pct)
    if balance is not None:
        rest = 100.0 - sum(numbers.values())
        if rest < 0:
            raise InputError(field_name, composition_wt_pct, "shares that leave room for the balance element")
        numbers[balance] = rest
    return numbers


def equivalent_weight(composition_wt_pct, valences=None, min_wt_pct=MIN_WT_PCT):
    """Equivalent weight of a metal or alloy from its composition (ASTM G102 method).

    EW = 1 / Σ (n_i · f_i / W_i); elements below ``min_wt_pct`` are left out (not renormalised),
    as in G102 Table 1. Valences are those given, else :data:`calc.elements.VALENCES`; a valence of
    0 marks an element that is not oxidised (graphitic carbon in cast iron, left out). Atomic
    weights from :data:`calc.elements.ATOMIC_WEIGHTS`.

    Args:
        composition_wt_pct: element symbol -> mass share, one element may be 'balance' [wt %]
        valences: element symbol -> valence n_i, overriding the defaults [unitless]
        min_wt_pct: elements below this share are left out [wt %]

    Returns:
        an :class:`EquivalentWeight` (``value_g`` in [g per equivalent])

    References:
        ASTM G102-89 (R2015) §5 Eqs. (4)-(6) and Table 1 (equivalent weights of alloys).

    >>> round(equivalent_weight({"Fe": 100}).value_g, 2)   # Fe -> Fe2+
    27.92
    >>> round(equivalent_weight({"Zn": 100}).value_g, 2)   # Zn -> Zn2+
    32.69
    >>> round(equivalent_weight({"Cr": 17, "Ni": 12, "Mo": 2.5, "Mn": 0.5, "Fe": "balance"}).value_g, 2)
    25.62
    """
    comp = _composition_numbers(composition_wt_pct, "composition_wt_pct")
    table = dict(VALENCES)
    table["C"] = 0  # carbon in steels and cast irons is not oxidised to a dissolved ion
    if valences:
        if not isinstance(valences, dict):
            raise InputError("valences", valences, "a mapping element -> valence")
        for el, n in valences.items():
            if isinstance(n, bool) or not isinstance(n, (int, float)) or n < 0 or not math.isfinite(n):
                raise InputError(f"valences.{el}", n, "a valence of 0 or more")
            table[el] = n
    total = sum(comp.values())
    terms, ignored, parts, inert = [], [], [], []
    for el, pct in sorted(comp.items(), key=lambda kv: -kv[1]):
        if pct < min_wt_pct:
            ignored.append(el)
            continue
        if table.get(el) == 0:
            inert.append(el)
            continue
        if el not in ATOMIC_WEIGHTS or el not in table:
            raise DataError(f"composition_wt_pct.{el}: no valence or atomic weight stated for {el!r} "
                            f"(known: {', '.join(sorted(set(ATOMIC_WEIGHTS) & set(table)))})")
        n, w = table[el], ATOMIC_WEIGHTS[el]
        term = n * (pct / 100.0) / w
        terms.append((el, pct, n, w, term))
        parts.append(f"{n}·{pct / 100:.4g}/{w:g}")
    if not terms:
        raise InputError("composition_wt_pct", composition_wt_pct, f"at least one element at {min_wt_pct:g} % or more")
    ew = 1.0 / sum(t[4] for t in terms)
    d = Derivation()
    d.step("Equivalent weight of the alloy (ASTM G102 Eq. 6)", "EW = 1 / Σ(n_i·f_i/W_i), elements < 1 % left out",
           "EW = 1 / (" + " + ".join(parts) + ")"
           + (f"; below 1 %, left out: {', '.join(ignored)}" if ignored else "")
           + (f"; not oxidised, left out: {', '.join(inert)}" if inert else ""),
           f"EW = {ew:.4g} g")
    return EquivalentWeight(ew, tuple(terms), tuple(ignored + inert), total, tuple(d.steps))


@dataclass(frozen=True)
class FaradayRate:
    """Penetration and mass-loss rates for one current density (ASTM G102 Eqs. 1-2)."""

    current_density_uA_per_cm2: float
    equivalent_weight_g: float
    density_g_cm3: float
    penetration_mm_per_year: float
    mass_loss_g_per_m2_day: float
    steps: tuple = field(default=())

    def to_dict(self):
        """The rate as plain data."""
        out = asdict(self)
        out["steps"] = list(self.steps)
        return out


def corrosion_rate(current_density_uA_per_cm2, equivalent_weight_g, density_g_cm3):
    """Penetration and mass-loss rate of a uniformly corroding metal from its current density.

    Args:
        current_density_uA_per_cm2: anodic (corrosion) current density [µA/cm²]
        equivalent_weight_g: equivalent weight of the metal [g]
        density_g_cm3: density of the metal [g/cm³]

    Returns:
        a :class:`FaradayRate`: penetration [mm/y] and mass loss [g/(m²·d)]

    References:
        ASTM G102-89 (R2015) §4, Eq. (1) CR = K1·i·EW/ρ and Eq. (2) MR = K2·i·EW.

    >>> r = corrosion_rate(1.0, 27.92, 7.87)          # iron at 1 µA/cm²
    >>> round(r.penetration_mm_per_year * 1000, 1)    # µm/y
    11.6
    >>> round(r.mass_loss_g_per_m2_day, 4)
    0.25
    """
    _number("current_density_uA_per_cm2", current_density_uA_per_cm2, "a current density of 0 or more in µA/cm²",
            low=0.0)
    _number("equivalent_weight_g", equivalent_weight_g, "an equivalent weight above 0 g", low=0.0, strict=True)
    _number("density_g_cm3", density_g_cm3, "a density above 0 g/cm³", low=0.0, strict=True)
    i, ew, rho = float(current_density_uA_per_cm2), float(equivalent_weight_g), float(density_g_cm3)
    cr = K1_MM * i * ew / rho
    mr = K2_G_M2_D * i * ew
    d = Derivation()
    d.step("Penetration rate (ASTM G102 Eq. 1)", "CR = K1·i·EW/ρ, K1 = 3.27e-3 mm·g/(µA·cm·y)",
           f"CR = 3.27e-3 × {i:g} × {ew:.4g} / {rho:g}", f"CR = {cr:.4g} mm/y")
    d.step("Mass-loss rate (ASTM G102 Eq. 2)", "MR = K2·i·EW, K2 = 8.954e-3 g·cm²/(µA·m²·d)",
           f"MR = 8.954e-3 × {i:g} × {ew:.4g}", f"MR = {mr:.4g} g/(m²·d)")
    return FaradayRate(i, ew, rho, cr, mr, tuple(d.steps))


def finite(value):
    """True for a finite number that a double holds (an integer beyond ~1.8e308 is not).

    Args:
        value: an int or float [any unit]

    Returns:
        True or False

    References:
        IEEE 754 double precision (common practice).

    >>> finite(1e308), finite(float("inf")), finite(10 ** 400)
    (True, False, False)
    """
    try:
        return math.isfinite(value)
    except OverflowError:  # an integer beyond the range of a double
        return False


def _number(field_name, value, allowed, low=None, strict=False):
    if isinstance(value, bool) or not isinstance(value, (int, float)):
        raise InputError(field_name, value, allowed)
    if not finite(value):
        raise InputError(field_name, value, allowed)
    if low is not None and (value <= low if strict else value < low):
        raise InputError(field_name, value, allowed)
    return float(value)


@dataclass(frozen=True)
class MaterialFaradayData:
    """What the G102 conversion needs from one material record."""

    material_id: str
    equivalent_weight_g: float
    density_g_cm3: float
    ew_basis: str  # "dataset" or "composition"
    sources: tuple
    steps: tuple
    warnings: tuple


def material_faraday_data(rec, field_name="material"):
    """Equivalent weight and density of a material record, or an InputError saying why not.

    The dataset's ``equivalent_weight_g`` is used where given (it carries a source); otherwise
    the EW is computed from ``composition_wt_pct`` by :func:`equivalent_weight`. Where both are
    given and differ by more than 3 %, a warning says so.

    Args:
        rec: a material record of the dataset [unitless]
        field_name: the input field named in an error [unitless]

    Returns:
        a :class:`MaterialFaradayData` (EW in [g], density in [g/cm³])

    References:
        ASTM G102-89 (R2015) §5 and Table 1.

    >>> d = material_faraday_data({"id": "demo-iron", "composition_wt_pct": {"Fe": 100}, "density_g_cm3": 7.874})
    >>> (round(d.equivalent_weight_g, 2), d.ew_basis)
    (27.92, 'composition')
    """
    mid = rec.get("id", "?")
    ew_rec = rec.get("equivalent_weight_g")
    comp = rec.get("composition_wt_pct")
    if ew_rec is None and not comp:
        raise InputError(field_name, mid, "a material with an equivalent weight for a Faraday (ASTM G102) rate",
                         _no_dissolution_reason(rec))
    rho = rec.get("density_g_cm3")
    if rho is None:
        raise InputError(field_name, mid, "a material with a density for a Faraday (ASTM G102) rate",
                         "the dataset gives no density for it")
    d = Derivation()
    computed = None
    if comp:
        try:
            computed = equivalent_weight(comp, rec.get("equivalent_weight_valences"))
        except (DataError, InputError):
            if ew_rec is None:
                raise
            # the composition is only a cross-check when the dataset gives the EW itself
            d.warn(field_name, f"{mid}: the EW could not be recomputed from its composition; the dataset value is used")
    if ew_rec is not None:
        ew, basis, sources = float(ew_rec), "dataset", [rec.get("equivalent_weight_source")]
        d.step("Equivalent weight from the dataset", "EW (ASTM G102 Table 1 or computed by its method)",
               f"{mid}: EW = {ew:g} g", f"EW = {ew:g} g")
        if computed is not None:
            d.steps.extend(computed.steps)
            dev = abs(computed.value_g - ew) / ew
            if dev > 0.03:
                d.warn(field_name, f"{mid}: the dataset's EW {ew:g} g differs by {dev * 100:.0f} % from the EW "
                                   f"{computed.value_g:.4g} g computed from its nominal composition; "
                                   "the dataset value is used")
    else:
        ew, basis, sources = computed.value_g, "composition", [rec.get("composition_source")]
        d.steps.extend(computed.steps)
    sources = tuple(s for s in sources + [rec.get("density_source")] if s)
    return MaterialFaradayData(mid, ew, float(rho), basis, sources, tuple(d.steps), tuple(d.warnings))


def _no_dissolution_reason(rec):
    """Why a material without an equivalent weight or a composition has no Faraday rate."""
    words = " ".join(str(rec.get(k) or "") for k in ("family", "name", "id")).lower()
    reason = rec.get("equivalent_weight_note") or _NO_DISSOLUTION.get(str(rec.get("family") or "").lower())
    if reason is None and any(w in words for w in _NOBLE_WORDS):
        reason = (f"{rec.get('name', rec.get('id', '?'))} does not dissolve anodically in these waters, "
                  "it serves as a cathode")
    return reason or "the dataset gives neither an equivalent weight nor a composition for it"


def rate_entry(request):
    """JSON entry point: ASTM G102 penetration and mass-loss rate of a named material.

    Args:
        request: ``{"material": id, alias or UNS, "current_density_uA_per_cm2": i}`` [unitless; i in µA/cm²]

    Returns:
        dict with material, penetration_mm_per_year [mm/y], mass_loss_g_per_m2_day [g/(m²·d)],
        equivalent_weight_g [g], density_g_cm3 [g/cm³], steps, warnings, sources, data_version

    References:
        ASTM G102-89 (R2015) Eqs. (1), (2), (6) and Table 1.

    >>> r = rate_entry({"material": "carbon steel", "current_density_uA_per_cm2": 1})
    >>> round(r["penetration_mm_per_year"] * 1000, 1)   # µm/y
    11.6
    """
    read(request, "rate", {"material": "a material id, alias or UNS number",
                           "current_density_uA_per_cm2": "a current density of 0 or more in µA/cm²"})
    allowed = f"a current density from 0 to {CURRENT_MAX_UA_CM2:g} µA/cm²"
    i = _number("current_density_uA_per_cm2", request["current_density_uA_per_cm2"], allowed, low=0.0)
    if i > CURRENT_MAX_UA_CM2:
        raise InputError("current_density_uA_per_cm2", i, allowed, "1 A/cm²: no corrosion cell in water comes near it")
    ds = current()
    rec = ds.get("materials", request["material"], field="material")
    fd = material_faraday_data(rec)
    rate = corrosion_rate(i, fd.equivalent_weight_g, fd.density_g_cm3)
    warnings = list(fd.warnings)
    if i > HIGH_CURRENT_UA_CM2:
        warnings.append({"field": "current_density_uA_per_cm2", "message":
                         f"{i:g} µA/cm² is above {HIGH_CURRENT_UA_CM2:g} µA/cm² (100 A/m²), far beyond an "
                         "oxygen-limited cathode in natural waters: check the units"})
    for key in ("equivalent_weight_confidence", "density_confidence"):
        if rec.get(key) == "recalled":
            warnings.append({"field": "material", "message":
                             f"{rec['id']}: {key.split('_confidence')[0].replace('_', ' ')} recalled, "
                             "not re-read in its source"})
    noble = str(rec.get("family") or "").lower() == "noble metal"
    if noble and any(w in str(rec.get("name", "")).lower() for w in ("platinum", "gold")):
        warnings.append({"field": "material", "message":
                         f"{rec.get('name', rec['id'])} hardly dissolves in natural waters: an anodic current on it "
                         "goes mostly to oxygen or chlorine evolution, so this Faraday rate is an upper bound"})
    sources = list(dict.fromkeys(fd.sources + (("astm-g102",) if ds.source("astm-g102") else ())))
    return {
        "material": rec["id"],
        "material_name": rec.get("name", rec["id"]),
        "current_density_uA_per_cm2": i,
        "penetration_mm_per_year": rate.penetration_mm_per_year,
        "penetration_um_per_year": rate.penetration_mm_per_year * 1000.0,
        "mass_loss_g_per_m2_day": rate.mass_loss_g_per_m2_day,
        "equivalent_weight_g": fd.equivalent_weight_g,
        "equivalent_weight_basis": fd.ew_basis,
        "density_g_cm3": fd.density_g_cm3,
        "assumptions": [
            "uniform corrosion over the whole surface (ASTM G102 assumes it; pits and crevices go deeper)",
            "all of the anodic current dissolves the metal at the stated valences",
        ],
        "steps": list(fd.steps) + list(rate.steps),
        "warnings": warnings,
        "sources": sources,
        "data_version": ds.version,
    }
