"""Will a passive stainless or nickel alloy stay passive? PREN, CPT/CCT estimates and a judgement.

- PREN = Cr + 3.3·Mo + 16·N (wt %), and with tungsten PREN_W = Cr + 3.3·(Mo + 0.5·W) + 16·N, the
  form of ISO 15156-3 (NACE MR0175/ISO 15156-3) [the standard not read; the forms as restated].
  "Clarifying the applicability of PREN equations: a review", Corrosion 77 (2021) 382 (read in its
  public text, section "Genesis of the PREN equation"): the nitrogen factor ranges from 9 to 36 in
  the work it reviews, the tungsten factor may be as high as 1 for nickel alloys, and the equations
  hold only for aerated saline waters (seawater with its dissolved oxygen or other oxidisers).
- Estimated start temperatures of the ASTM G48 Methods E (CPT) and F (CCT) tests for stainless
  steels (Methods E and F as the scope of G48-11 names them), CPT ≈ 2.5·Cr + 7.6·Mo + 31.9·N − 41.0
  and CCT ≈ 3.2·Cr + 7.6·Mo + 10.5·N − 81.0 [°C]: **from memory**, not re-read in the standard, and
  no open-access paper printing these fits (or another CPT-PREN fit) was found to read, so the
  coefficients are kept as recalled and every result says so. They do not count tungsten, and the
  nickel-alloy Methods C and D are not modelled.
- :func:`holds` judges the passive state at a service temperature and chloride content on published
  rules of the trade, each named in its ``basis``.
- :func:`record_pren` reads a material record's composition limits (``composition_limits_min_wt_pct``
  and ``composition_limits_max_wt_pct`` in data/materials.yaml) and gives the PREN at both ends.

These are screening estimates: heat treatment, welds, surface finish, crevice geometry, biofilm and
chlorination matter more than a point of PREN (Steinsmo, Rogne & Drugli, Corrosion 53 (1997),
abstract); safety-relevant choices go through the applicable standards and a corrosion specialist.
"""

from dataclasses import dataclass

from .bounds import check
from .dataset import current
from .derivation import Derivation, check_number, check_temperature, fmt
from .errors import InputError
from .field.seawater import SALINITY_PER_CHLORINITY
from .requests import read

#: seawater rule of thumb: PREN above about 32 resists pitting, above about 40 crevice corrosion, in
#: ambient seawater (common practice; restated in "Pitting resistance equivalent number", Wikipedia,
#: citing K. R. Larsen, Materials Performance 2016) [unitless]
PREN_PITTING_SEAWATER = 32.0
PREN_CREVICE_SEAWATER = 40.0
#: "ambient" for the seawater rule and the natural-water guideline (common practice, from memory);
#: temperature is the major parameter of crevice corrosion in European seawaters (Féron et al.,
#: EFC seawater programmes, abstract) [°C]
AMBIENT_MAX_C = 30.0
#: natural waters: crevice attack is rare below 100-200 mg/L chloride on 304 and below 1000 mg/L on
#: 316 (NiDI 11 003, Guidelines for Selection of Stainless Steels for Marine Environments, Natural
#: Waters and Brines, as restated by the Nickel Development Institute) [mg/L]
CHLORIDE_304_MG_L = 200.0
CHLORIDE_316_MG_L = 1000.0
#: PREN of the minimum compositions of those grades: S30400 Cr 18.0; S31603 Cr 16.0, Mo 2.00 (ASTM
#: A240 Table 1 and its tube counterpart, as restated by suppliers); N is left out at its minimum of 0
PREN_304_TYPE = 18.0
PREN_316_TYPE = 16.0 + 3.3 * 2.00
#: a stainless steel has at least 10.5 % Cr (EN 10088-1; restated by Eurofer, 2002) [wt %]
CR_STAINLESS_MIN = 10.5
#: accepted composition ranges [wt %]
CR_MAX, MO_MAX, N_MAX, W_MAX = 50.0, 30.0, 1.0, 20.0
#: seawater of salinity 35 taken when the request gives no chloride: the seawater rule applies [g/kg]
SALINITY_DEFAULT = 35.0

ESTIMATE_CONFIDENCE = "from memory"


def pren(cr, mo, n):
    """Pitting resistance equivalent number, PREN = Cr + 3.3·Mo + 16·N.

    Args:
        cr: chromium [wt %]
        mo: molybdenum [wt %]
        n: nitrogen [wt %]

    Returns:
        PREN [unitless]

    References:
        The common form (ISO 15156-3 without tungsten; restated by Euro Inox and Wikipedia); nitrogen
        factor 16 of the 9-36 range reviewed in Corrosion 77 (2021) 382, section "Genesis of the PREN
        equation" (read).

    >>> round(pren(22.0, 3.0, 0.14), 2)
    34.14
    """
    return cr + 3.3 * mo + 16.0 * n


def pren_w(cr, mo, w, n):
    """PREN with tungsten, PREN_W = Cr + 3.3·(Mo + 0.5·W) + 16·N.

    Args:
        cr: chromium [wt %]
        mo: molybdenum [wt %]
        w: tungsten [wt %]
        n: nitrogen [wt %]

    Returns:
        PREN_W [unitless]

    References:
        ISO 15156-3 (NACE MR0175/ISO 15156-3), as restated by Wikipedia "Pitting resistance
        equivalent number" and steel suppliers; Corrosion 77 (2021) 382 (read): the factor 0.5 on W
        is for stainless steels, nickel alloys may warrant up to 1.

    >>> round(pren_w(24.0, 3.0, 0.5, 0.20), 3)
    37.925
    """
    return cr + 3.3 * (mo + 0.5 * w) + 16.0 * n


def cpt_estimate(cr, mo, n):
    """Estimated critical pitting temperature, the ASTM G48 Method E start temperature (from memory).

    Args:
        cr: chromium [wt %]
        mo: molybdenum [wt %]
        n: nitrogen [wt %]

    Returns:
        CPT ≈ 2.5·Cr + 7.6·Mo + 31.9·N − 41.0 [°C]

    References:
        ASTM G48 Method E (critical pitting temperature test for stainless steels), the estimate of
        its starting temperature from memory: not re-read in the standard, and no published fit was
        found to read in its place.

    >>> round(cpt_estimate(20.0, 6.1, 0.20), 2)
    61.74
    """
    return 2.5 * cr + 7.6 * mo + 31.9 * n - 41.0


def cct_estimate(cr, mo, n):
    """Estimated critical crevice temperature, the ASTM G48 Method F start temperature (from memory).

    Args:
        cr: chromium [wt %]
        mo: molybdenum [wt %]
        n: nitrogen [wt %]

    Returns:
        CCT ≈ 3.2·Cr + 7.6·Mo + 10.5·N − 81.0 [°C]

    References:
        ASTM G48 Method F (critical crevice temperature test for stainless steels), the estimate of
        its starting temperature from memory: not re-read in the standard, and no published fit was
        found to read in its place.

    >>> round(cct_estimate(20.0, 6.1, 0.20), 2)
    31.46
    """
    return 3.2 * cr + 7.6 * mo + 10.5 * n - 81.0


def chloride_from_salinity(salinity):
    """Chloride of seawater-type water from its salinity, Cl = S/1.80655, taking 1 L as 1 kg.

    Args:
        salinity: salinity [g/kg]

    Returns:
        chloride (chlorinity) [mg/L]

    References:
        Knudsen relation S = 1.80655·Cl as kept in PSS-78 (UNESCO 1981, from memory), the constant
        of :data:`calc.field.seawater.SALINITY_PER_CHLORINITY`.

    >>> round(chloride_from_salinity(35.0))
    19374
    """
    return 1000.0 * salinity / SALINITY_PER_CHLORINITY


@dataclass(frozen=True)
class Judgement:
    """Whether a passive state holds, the reason in plain words, and the rules it rests on."""

    holds: bool
    reason: str
    basis: tuple
    checks: tuple  # each {"rule", "passed", "words"}


def _seawater_checks(pren_value, temp_C):
    """Chloride above the 316 guideline: the seawater rule of thumb (necessary, not sufficient, when warm)."""
    basis = ("seawater rule of thumb: PREN above about 32 for pitting and about 40 for crevice resistance "
             "in ambient seawater (common practice)")
    warm = (f" (above the ambient {AMBIENT_MAX_C:g} °C of the rule: necessary, not sufficient)"
            if temp_C > AMBIENT_MAX_C else "")
    return [("PREN against pitting in seawater", pren_value >= PREN_PITTING_SEAWATER,
             f"PREN {fmt(pren_value, 4)} {'≥' if pren_value >= PREN_PITTING_SEAWATER else '<'} about "
             f"{PREN_PITTING_SEAWATER:g}{warm}", basis),
            ("PREN against crevice corrosion in seawater", pren_value >= PREN_CREVICE_SEAWATER,
             f"PREN {fmt(pren_value, 4)} {'≥' if pren_value >= PREN_CREVICE_SEAWATER else '<'} about "
             f"{PREN_CREVICE_SEAWATER:g}: a joint is a crevice{warm}", basis)]


def _fresh_water_checks(pren_value, chloride):
    """Chloride up to the 316 guideline: the natural-water guideline, mapped to PREN."""
    basis = ("natural waters: crevice attack rare below about 200 mg/L chloride on 304 and 1000 mg/L on 316 "
             "(NiDI 11 003); here a PREN of at least that of the grade's minimum composition stands for it")
    if chloride <= CHLORIDE_304_MG_L:
        need, grade = PREN_304_TYPE, "304"
    else:
        need, grade = PREN_316_TYPE, "316"
    return [(f"PREN against the {grade} guideline in natural water", pren_value >= need,
             f"chloride {fmt(chloride, 4)} mg/L needs a {grade}-type alloy: PREN {fmt(pren_value, 4)} "
             f"{'≥' if pren_value >= need else '<'} {fmt(need, 4)}", basis)]


def holds(pren, cpt_C, cct_C, temp_C, chloride):
    """Judge whether a passive alloy stays passive at a service temperature and chloride content.

    Args:
        pren: the alloy's PREN or PREN_W [unitless]
        cpt_C: estimated critical pitting temperature, or None [°C]
        cct_C: estimated critical crevice temperature, or None [°C]
        temp_C: service temperature [°C]
        chloride: chloride content of the water [mg/L]

    Returns:
        a :class:`Judgement`: holds only when every rule that applies is met

    References:
        Seawater PREN rule of thumb (common practice); NiDI 11 003 natural-water chloride guideline;
        CPT as a safe-use limit in chlorinated seawater and CCT from tests too high for one (Steinsmo,
        Rogne & Drugli, Corrosion 53 (1997), abstract); ASTM G48 Methods E/F estimates (from memory).

    >>> j = holds(25.0, 18.9, -12.8, 20.0, 19374.0)
    >>> j.holds, j.reason.split(":")[0]
    (False, 'judged not passive')
    >>> holds(45.0, 70.0, 40.0, 20.0, 19374.0).holds
    True
    """
    seawater_class = chloride > CHLORIDE_316_MG_L
    checks = _seawater_checks(pren, temp_C) if seawater_class else _fresh_water_checks(pren, chloride)
    cpt_basis = ("CPT as a safe-use limit in chlorinated seawater (Steinsmo, Rogne & Drugli 1997); CPT from the "
                 "ASTM G48 Method E estimate (from memory)")
    if seawater_class or temp_C > AMBIENT_MAX_C:  # in cool low-chloride water the ferric chloride test says nothing
        severe = ("" if seawater_class else
                  " (the ferric chloride test is far more severe than this water: on the safe side)")
        if cpt_C is not None:
            checks.append(("service temperature against the CPT", temp_C < cpt_C,
                           f"{fmt(temp_C, 4)} °C {'<' if temp_C < cpt_C else '≥'} CPT {fmt(cpt_C, 3)} °C{severe}",
                           cpt_basis))
        if cct_C is not None:
            checks.append(("service temperature against the CCT", temp_C < cct_C,
                           f"{fmt(temp_C, 4)} °C {'<' if temp_C < cct_C else '≥'} CCT {fmt(cct_C, 3)} °C{severe}"
                           + ("; a CCT from tests is too high for a safe-use limit, so below it is no guarantee"
                              if temp_C < cct_C else ""),
                           "CCT from the ASTM G48 Method F estimate (from memory); Steinsmo, Rogne & Drugli 1997"))
    failed = [c for c in checks if not c[1]]
    words = "; ".join(c[2] for c in (failed or checks))
    reason = ("judged not passive: " if failed else "judged passive: ") + words
    basis = tuple(dict.fromkeys(c[3] for c in checks))
    return Judgement(not failed, reason, basis,
                     tuple({"rule": c[0], "passed": c[1], "words": c[2]} for c in checks))


def _composition(request):
    """The composition of the request, checked [wt %]."""
    def share(key, high):
        return check_number(request[key], key, f"a share from 0 to {high:g} wt %", low=0.0, high=high)

    cr, mo, n = share("cr", CR_MAX), share("mo", MO_MAX), share("n", N_MAX)
    w = share("w", W_MAX) if request.get("w") is not None else None
    return cr, mo, n, w


def _chloride(request, d):
    """The chloride content used [mg/L] and how it was given."""
    if request.get("salinity") is not None and request.get("chloride_mg_per_L") is not None:
        raise InputError("chloride_mg_per_L", request["chloride_mg_per_L"], "salinity or chloride_mg_per_L, not both")
    if request.get("chloride_mg_per_L") is not None:
        return check("chloride_mg_per_L", request["chloride_mg_per_L"]), "given"
    given = request.get("salinity") is not None
    s = check("salinity", request["salinity"]) if given else SALINITY_DEFAULT
    cl = chloride_from_salinity(s)
    d.step("Chloride from salinity", "Cl = S/1.80655 (Knudsen), 1 L of water taken as 1 kg",
           f"Cl = {fmt(s, 4)} g/kg / 1.80655", f"Cl = {fmt(cl, 5)} mg/L")
    return cl, ("from salinity" if given else f"assumed: seawater of salinity {SALINITY_DEFAULT:g}")


def passivity_entry(request):
    """JSON entry point ``passivity``: PREN, CPT/CCT estimates and whether the passive state holds.

    Args:
        request: ``{"cr", "mo", "n", "w" (optional), "temp_C" (optional), "salinity" or
            "chloride_mg_per_L" (optional)}`` [wt %, °C, g/kg, mg/L]

    Returns:
        dict with pren, pren_formula, cpt_C, cct_C, estimates_confidence, holds, reason, basis,
        checks, temp_C, chloride_mg_per_L, steps, warnings, sources

    References:
        :func:`pren`, :func:`pren_w`, :func:`cpt_estimate`, :func:`cct_estimate`, :func:`holds`.

    >>> r = passivity_entry({"cr": 25.0, "mo": 3.8, "n": 0.27, "temp_C": 20})
    >>> round(r["pren"], 2), r["holds"]
    (41.86, True)
    """
    read(request, "passivity", {"cr": "chromium in wt %", "mo": "molybdenum in wt %", "n": "nitrogen in wt %"},
         ("w", "temp_C", "salinity", "chloride_mg_per_L"))
    cr, mo, n, w = _composition(request)
    d = Derivation()
    temp_given = request.get("temp_C") is not None
    t = check_temperature(request.get("temp_C"))
    if w is None:
        value, formula = pren(cr, mo, n), "PREN = Cr + 3.3·Mo + 16·N"
        d.step("PREN", formula, f"PREN = {fmt(cr)} + 3.3 × {fmt(mo)} + 16 × {fmt(n)}", f"PREN = {fmt(value, 4)}")
    else:
        value, formula = pren_w(cr, mo, w, n), "PREN_W = Cr + 3.3·(Mo + 0.5·W) + 16·N (ISO 15156-3)"
        d.step("PREN with tungsten", formula,
               f"PREN_W = {fmt(cr)} + 3.3 × ({fmt(mo)} + 0.5 × {fmt(w)}) + 16 × {fmt(n)}",
               f"PREN_W = {fmt(value, 4)}")
    cpt, cct = cpt_estimate(cr, mo, n), cct_estimate(cr, mo, n)
    d.step("CPT estimate (ASTM G48 Method E, from memory)", "CPT ≈ 2.5·Cr + 7.6·Mo + 31.9·N − 41.0",
           f"CPT ≈ 2.5 × {fmt(cr)} + 7.6 × {fmt(mo)} + 31.9 × {fmt(n)} − 41.0", f"CPT ≈ {fmt(cpt, 3)} °C")
    d.step("CCT estimate (ASTM G48 Method F, from memory)", "CCT ≈ 3.2·Cr + 7.6·Mo + 10.5·N − 81.0",
           f"CCT ≈ 3.2 × {fmt(cr)} + 7.6 × {fmt(mo)} + 10.5 × {fmt(n)} − 81.0", f"CCT ≈ {fmt(cct, 3)} °C")
    d.warn(None, "the CPT and CCT estimate formulas are recalled, not re-read in ASTM G48; they are for stainless "
                 "steels in ferric chloride and do not count tungsten")
    chloride, chloride_given = _chloride(request, d)
    if not temp_given:
        d.warn("temp_C", "no service temperature given: 25 °C assumed")
    if cr < CR_STAINLESS_MIN:
        judgement = Judgement(False, f"judged not passive: {fmt(cr)} % Cr is below the {CR_STAINLESS_MIN:g} % of a "
                              "stainless steel, so there is no passive film to rely on in chloride water",
                              ("a stainless steel has at least 10.5 % Cr (EN 10088-1)",), ())
    else:
        judgement = holds(value, cpt, cct, t, chloride)
    d.step("Will the passive state hold?", "every rule that applies must be met", "; ".join(
        f"{c['rule']}: {'met' if c['passed'] else 'not met'}" for c in judgement.checks) or "composition",
        judgement.reason)
    return {"pren": value, "pren_formula": formula, "cpt_C": cpt, "cct_C": cct,
            "estimates_confidence": ESTIMATE_CONFIDENCE, "holds": judgement.holds, "reason": judgement.reason,
            "basis": list(judgement.basis), "checks": list(judgement.checks), "temp_C": t,
            "temp_given": temp_given, "chloride_mg_per_L": chloride, "chloride_given": chloride_given,
            "steps": d.steps, "warnings": d.warnings, "sources": [],
            "data_version": current().version}


# --------------------------------------------------------------------------------------------
