"""The service-condition part of a joint's judgement: conditions, parts, the mixed-potential answer, effects.

:func:`service_part` gathers, for :func:`calc.joint.judge_joint`, everything that depends on the
service conditions (:mod:`calc.service`): each part's state and passivity (:mod:`calc.partstate`),
the coded warnings of the trade, the mixed-potential judgement (:mod:`calc.couplemix`) with its
Evans diagram, and the effects of each condition in plain words. The series verdict is untouched:
it stays the quick first look.
"""

import math
from dataclasses import dataclass

from .couplemix import assess
from .derivation import Derivation, fmt
from .partstate import limit_warnings, part_state, series_range_warning
from .polarization import record_for
from .service import read_service


@dataclass(frozen=True)
class ServicePart:
    """What the service conditions add to a joint's result."""

    service: object  # calc.service.Service, or None without a service model
    keys: tuple  # ((result key, value), ...)
    steps: tuple
    warnings: tuple
    sources: tuple


def _effects(service, assessment, ratio, parts):
    """Each effect of the conditions on the answer, in plain words."""
    s, v = service.supply, service.values
    out = [f"Oxygen: at {fmt(v['temp_C'])} °C and salinity {fmt(s.salinity, 3)} the water holds "
           f"{fmt(s.o2_mg_L, 3)} mg/L O2 ({'as stated' if s.o2_given else 'air saturation'}), diffusing at "
           f"{fmt(s.diffusivity_m2_s * 1e9, 3)}e-9 m²/s."]
    if s.correlation == "still-layer":
        flow = f"still water: a diffusion layer of {fmt(s.delta_m * 1e3, 3)} mm"
    else:
        flow = (f"{fmt(v['velocity_m_s'])} m/s over the {s.geometry} thins the diffusion layer to "
                f"{fmt(s.delta_m * 1e3, 3)} mm (Re {fmt(s.reynolds, 3)}, Sh {fmt(s.sherwood, 3)})")
    out.append(f"Flow: {flow}; no cathode can draw more than i_L = {fmt(s.i_L_uA_per_cm2, 3)} µA/cm² of O2 there.")
    out += [p["note"][0].upper() + p["note"][1:] + "." for p in parts if p.get("note")]
    if assessment is None:
        return out
    share = assessment["cathode_o2_share_of_limit"]
    if share is not None:
        rule = ("the O2 supply rules (diffusion-limited)" if share > 0.8 else
                "its own kinetics rule, not the O2 supply" if share < 0.2 else "kinetics and O2 supply both count")
        out.append(f"Cathode: at the couple potential its O2 reduction runs at {fmt(100 * share, 3)} % of i_L: {rule}.")
    anode = next((p for p in assessment["parts"] if p["role"] == "anode"), None)
    if anode is not None and anode["change_ratio"]:
        out.append(f"Anode: coupled, {anode['state_used']} dissolves at {fmt(anode['dissolution_current_density_uA_per_cm2'], 3)} "
                   f"µA/cm² ({fmt(anode['penetration_mm_per_year'], 3)} mm/y), {fmt(anode['change_ratio'], 3)} times its "
                   f"uncoupled {fmt(anode['free_penetration_mm_per_year'], 3)} mm/y; the cathode's area is "
                   f"{fmt(ratio)} times the anode's.")
    ir = assessment["with_ir"]
    if ir is not None:
        out.append(f"Electrolyte resistance: with κ = {fmt(ir['conductivity_S_per_m'], 3)} S/m the path between the parts "
                   f"is {fmt(ir['resistance_ohm'], 3)} Ω and the anode's attack away from the line of contact is "
                   f"{fmt(100 * ir['attack_ratio_to_metallic_contact'], 3)} % of the metallic-contact answer.")
    return out


def _evans(assessment):
    """The joint's Evans diagram for its chart (None without a mixed-potential judgement)."""
    if assessment is None:
        return None
    ev = dict(assessment.pop("evans"))
    ev["scale"] = "V vs SCE"
    ev["areas_cm2"] = {p["state_used"]: p["area_cm2"] for p in assessment["parts"]}
    # the decades worth drawing: 3 below the smallest marked current, 3 above the couple's (the Tafel lines
    # run on far beyond, to currents no part ever carries)
    marks = [p["log10_I_A"] for p in ev["free_corrosion_points"]] + [ev["couple_point"]["log10_I_A"]]
    ev["log10_I_window"] = [math.floor(min(marks)) - 3, math.ceil(ev["couple_point"]["log10_I_A"]) + 3]
    return ev


def service_part(ds, request, envrec, basis, recs, rec_a, rec_b, primary, ratio):
    """The keys a joint's result gains from its service conditions.

    Args:
        ds: the dataset [unitless]
        request: the request's service-condition fields (:data:`calc.service.SERVICE_FIELDS`) [unitless]
        envrec: the environment record [unitless]
        basis: its :class:`calc.series.Basis` [unitless]
        recs: material id -> record [unitless]
        rec_a: the first part's record [unitless]
        rec_b: the second part's record [unitless]
        primary: the series comparison of the parts as named [unitless]
        ratio: wetted area of the cathode over the anode [unitless]

    Returns:
        a :class:`ServicePart`

    References:
        :func:`calc.service.read_service`, :func:`calc.partstate.part_state`, :func:`calc.couplemix.assess`.

    >>> from calc.dataset import current
    >>> from calc.series import basis_of, judge_pair
    >>> ds = current(); env = ds.get("environments", "seawater-quiescent"); b = basis_of(env, ds)
    >>> recs = {r["id"]: r for r in ds.records("materials")}
    >>> pair = judge_pair(ds, recs["zinc"], recs["carbon-steel"], b).primary
    >>> part = service_part(ds, {"temp_C": 5}, env, b, recs, recs["zinc"], recs["carbon-steel"], pair, 1.0)
    >>> dict(part.keys)["service_conditions"]["temp_C"]["from"], dict(part.keys)["assessment"]["anode"]
    ('user', 'zinc')
    """
    service, unused = read_service(request, envrec, ds)
    d = Derivation()
    for w in unused:
        d.warn(w["field"], w["message"])
    if service is None:
        reason = f"{basis.env_name} has no service model (immersed-water defaults), so no mixed-potential judgement"
        keys = (("service_conditions", None), ("oxygen_supply", None), ("parts", None), ("assessment", None),
                ("assessment_reason", reason), ("attack_mm_per_year", None), ("evans", None), ("effects", []))
        return ServicePart(None, keys, (), tuple(d.warnings), ())
    d.steps.extend(service.steps)
    for w in service.warnings:
        d.warn(w["field"], w["message"])
    for s in service.sources:
        d.cite(s)
    t = service.values["temp_C"]
    parts = [part_state(ds, r, service) for r in (rec_a, rec_b)]
    coded = [series_range_warning(envrec, basis, t)]
    for p, partner in ((parts[0], rec_b), (parts[1], rec_a)):
        used = recs[p["state_used"]]
        coded += limit_warnings(record_for(ds, used["id"], service.electrolyte), used, partner, t)
        if p["state_used"] != p["id"]:
            coded.append({"code": "judged-active", "field": "temp_C", "source": None, "message": p["note"]})
    coded = [w for w in coded if w]
    cathode_index = 1 if primary.anode == rec_a["id"] else 0
    assessment, reason, ad = assess(ds, service, parts, recs, cathode_index, ratio)
    d.merge(ad)
    if assessment is not None and assessment["anode"] and primary.anode and assessment["anode"] not in (
            primary.anode, recs[primary.anode].get("other_state")):
        coded.append({"code": "kinetics-polarity", "field": "a", "source": None,
                      "message": f"the mixed-potential judgement makes {assessment['anode']} the anode, unlike the "
                                 "series: at these conditions the parts' kinetics reverse the polarity (the area "
                                 "ratio still counts the series' cathode)"})
    for s in (w["source"] for w in coded):
        d.cite(s)
    effects = _effects(service, assessment, ratio, parts)
    keys = (("service_conditions", service.conditions()), ("oxygen_supply", service.oxygen()), ("parts", parts),
            ("assessment", assessment), ("assessment_reason", reason),
            ("attack_mm_per_year", assessment["anode_penetration_mm_per_year"] if assessment else None),
            ("evans", _evans(assessment)), ("effects", effects))
    # the models' papers are named in the steps; only the ids the dataset holds are listed as sources
    sources = tuple(s for s in d.sources if ds.source(s) is not None)
    return ServicePart(service, keys, tuple(d.steps), tuple(coded) + tuple(d.warnings), sources)
