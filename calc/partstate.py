"""Each part of a joint at the service conditions: the state it is judged in, and the rules of the trade.

- A passive stainless or nickel alloy keeps its passive state only where its passivity holds at
  the service temperature and chloride (:func:`calc.passivity.holds`, with the PREN of its
  composition limits, :func:`calc.gradepren.record_pren`, and the CPT/CCT estimates of its minimum
  composition); where it does not, the part is judged in its active state and the result says so.
- Coded warnings, each with its source: a galvanic series applied outside the temperature range it
  was measured in (the environment's ``temperature_range_C``: ASTM G82, LaQue's series 10-27 °C);
  the published temperature limits a polarization record carries (``limits``: zinc's polarity
  reversal against steel in hot fresh water, EN ISO 14713-1; crevice corrosion of titanium in hot
  chloride water).
"""

from .derivation import fmt
from .gradepren import record_pren
from .passivity import cct_estimate, chloride_from_salinity, cpt_estimate, holds

#: the state words of a part as the result gives them
STATES = ("passive", "active")


def service_chloride(service):
    """The chloride of the service water [mg/L]: as stated, else from its salinity (Knudsen).

    Args:
        service: the :class:`calc.service.Service` conditions [unitless]

    Returns:
        chloride [mg/L]

    References:
        :func:`calc.passivity.chloride_from_salinity` (S = 1.80655·Cl).

    >>> from calc.dataset import current
    >>> from calc.service import read_service
    >>> ds = current(); s, _ = read_service({"salinity": 35}, ds.get("environments", "seawater-flowing"), ds)
    >>> round(service_chloride(s))
    19374
    """
    if "chloride_mg_per_L" in service.values:
        return float(service.values["chloride_mg_per_L"])
    return chloride_from_salinity(service.supply.salinity)


def _passivity(rec, temp_C, chloride):
    """{pren, cpt_C, cct_C, holds, reason} of a material record at a temperature and chloride."""
    if rec.get("state") not in STATES:
        return {"pren": None, "cpt_C": None, "cct_C": None, "holds": None,
                "reason": "no passive/active states in the dataset: no passivity judgement"}
    grade = record_pren(rec)
    if grade is None:
        return {"pren": None, "cpt_C": None, "cct_C": None, "holds": None,
                "reason": "no composition limits in the dataset: passivity not judged, the state as named is used"}
    cr, mo, n, _ = grade.low
    cpt, cct = cpt_estimate(cr, mo, n), cct_estimate(cr, mo, n)
    j = holds(grade.pren_min, cpt, cct, temp_C, chloride)
    return {"pren": grade.pren_min, "cpt_C": cpt, "cct_C": cct, "holds": j.holds,
            "reason": j.reason + " (PREN of the minimum composition; CPT and CCT estimated, from memory)"}


def part_state(ds, rec, service):
    """The state a part is judged in at the service conditions, with its passivity.

    Args:
        ds: the dataset [unitless]
        rec: the part's material record, as named [unitless]
        service: the :class:`calc.service.Service` conditions [unitless]

    Returns:
        dict: id, name, state_used (the material id judged), passivity {pren, cpt_C, cct_C,
        holds, reason}, note (plain words, or None) [PREN unitless, temperatures in °C]

    References:
        :func:`calc.passivity.holds` and its published rules of the trade.

    >>> from calc.dataset import current
    >>> from calc.service import read_service
    >>> ds = current(); s, _ = read_service({}, ds.get("environments", "seawater-flowing"), ds)
    >>> part_state(ds, ds.get("materials", "316"), s)["state_used"]
    'stainless-316-active'
    """
    t, chloride = service.values["temp_C"], service_chloride(service)
    passivity = _passivity(rec, t, chloride)
    used, note = rec["id"], None
    if rec.get("state") == "passive" and passivity["holds"] is False and rec.get("other_state"):
        other = ds.get("materials", rec["other_state"])
        used = other["id"]
        note = (f"{rec.get('name', rec['id'])} is judged in its active state ({other.get('name', other['id'])}) at "
                f"{fmt(t)} °C and {fmt(chloride, 6)} mg/L chloride: its passivity does not hold there "
                f"({passivity['reason']})")
    elif rec.get("state") == "active":
        note = (f"{rec.get('name', rec['id'])} is judged in the active state as named"
                + (" (its passive state would hold here)" if passivity["holds"] else ""))
    return {"id": rec["id"], "name": rec.get("name", rec["id"]), "state_used": used, "passivity": passivity,
            "note": note}


def series_range_warning(envrec, basis, temp_C):
    """A coded warning when the service temperature is outside the range the galvanic series was measured in.

    Args:
        envrec: the environment record [unitless]
        basis: its :class:`calc.series.Basis` [unitless]
        temp_C: the service temperature [°C]

    Returns:
        a warning dict {code, field, message, source}, or None

    References:
        ASTM G82-98 (R2014) §5: a galvanic series belongs to its electrolyte and conditions; LaQue's
        flowing-seawater series was measured at 10-27 °C (the environment's ``temperature_range_C``).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of
    >>> env = current().get("environments", "seawater-flowing")
    >>> series_range_warning(env, basis_of(env, current()), 40.0)["code"]
    'series-temperature-range'
    """
    rng = envrec.get("temperature_range_C")
    if basis.kind != "galvanic-series" or not rng or rng[0] <= temp_C <= rng[1]:
        return None
    return {"code": "series-temperature-range", "field": "temp_C", "source": envrec.get("temperature_range_source"),
            "message": f"{fmt(temp_C)} °C is outside the {fmt(rng[0])}-{fmt(rng[1])} °C the galvanic series was "
                       "measured in: the series verdict is a first look only there; potentials and even the order "
                       "of metals can change with temperature"}


def limit_warnings(pol_rec, material, partner, temp_C):
    """Coded warnings of the temperature limits a polarization record carries, for this joint.

    Args:
        pol_rec: the part's polarization record (or None) [unitless]
        material: the part's material record [unitless]
        partner: the other part's material record [unitless]
        temp_C: the service temperature [°C]

    Returns:
        a list of warning dicts {code, field, message, source}

    References:
        The ``limits`` of ``data/polarization.yaml``, each with its source (e.g. EN ISO 14713-1 on
        zinc's polarity reversal against steel in hot fresh water).

    >>> lim = {"kind": "polarity-reversal", "above_C": 60, "partner_family": "steel", "text": "reverses",
    ...        "source": "s", "confidence": "recalled"}
    >>> [w["code"] for w in limit_warnings({"limits": [lim]}, {"id": "zinc"}, {"family": "steel"}, 70.0)]
    ['polarity-reversal']
    """
    out = []
    for lim in (pol_rec or {}).get("limits") or []:
        if temp_C <= lim["above_C"]:
            continue
        family = lim.get("partner_family")
        if lim["kind"] == "polarity-reversal" and family and partner.get("family") != family:
            continue
        out.append({"code": lim["kind"], "field": "temp_C", "source": lim["source"],
                    "message": f"{material.get('name', material['id'])} at {fmt(temp_C)} °C: {lim['text']} "
                               f"({lim['confidence']})"})
    return out
