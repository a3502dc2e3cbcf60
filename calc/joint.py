"""Dissimilar-metal joints in a named environment: the judgement of one joint.

Which part is the anode, how far apart the two metals sit, whether that is within what the
environment allows (the positions and the tier rule of :mod:`calc.series`: the quick first look),
what the wetted-area ratio does to the attack, the upper-bound screen i_a = i_L·(1 + A_c/A_a)
(:mod:`calc.screen`), and what to tell the user (:mod:`calc.advice`). At the service conditions
(:mod:`calc.service`, the environment's defaults for what is not stated) the joint is also judged
by mixed-potential theory with the dataset's polarization parameters (:mod:`calc.jointservice`):
each part's state and passivity, the couple potential, each part's attack and its change from
uncoupled corrosion, the Evans diagram, and the effect of each condition in words.
"""

from dataclasses import dataclass

from . import rate as g102
from . import service as svc
from .advice import CAUTIONS, alternatives, basis_warnings, mitigations, verdict_text, volts
from .bounds import BOUNDS
from .dataset import current
from .derivation import Derivation
from .errors import InputError
from .jointservice import service_part
from .requests import read
from .screen import screen
from .series import EPS_V, TIER_MEANING, basis_of, judge_pair, material_on, position, states

#: area ratios outside [AREA_LOW, AREA_HIGH] get a warning [unitless]
AREA_LOW, AREA_HIGH = 0.001, 1000.0
#: largest area ratio accepted at all; beyond it the screening rate overflows [unitless]
AREA_MAX = BOUNDS["area_ratio"].high


def _plain(value):
    if isinstance(value, (tuple, list)):
        return [_plain(v) for v in value]
    if isinstance(value, dict):
        return {k: _plain(v) for k, v in value.items()}
    return value


def _area_ratio(value, warnings):
    """The area ratio given (or 1) and whether it was given; a warning when it is extreme."""
    if value is None:
        return 1.0, False
    allowed = BOUNDS["area_ratio"].allowed
    if (isinstance(value, bool) or not isinstance(value, (int, float)) or not g102.finite(value) or value <= 0
            or value > AREA_MAX):
        raise InputError("area_ratio", value, allowed)
    value = float(value)
    if value > AREA_HIGH or value < AREA_LOW:
        warnings.append({"field": "area_ratio", "message":
                         f"area ratio {value:g} is outside {AREA_LOW:g}-{AREA_HIGH:g}: check that it is the cathode's "
                         "wetted area over the anode's, in the same units"})
    return value, True


def _confidence_warnings(positions, basis, names):
    what = "position in the galvanic series" if basis.kind == "galvanic-series" else "anodic index"
    return [{"field": "material", "message": f"{names[p.material_id]}: its {what} is recalled, not re-read in "
             "its source"} for p in positions if p.confidence == "recalled"]


# --------------------------------------------------------------------------------------------
# the parts of a joint's result


def _shown(p, basis):
    """A position as published, for the result."""
    if basis.kind == "galvanic-series":
        return f"[{volts(p.low)}, {volts(p.high)}] V vs SCE, mid-point {volts(p.nominal)} V"
    return f"anodic index {volts(-p.nominal)} V"


def _positions(pos_a, pos_b, basis):
    """Each part's position as the result shows it (the anodic index as published, not negated)."""
    index = basis.kind == "anodic-index"
    return {p.material_id: {"value": _shown(p, basis), "nominal_V": -p.nominal if index else p.nominal,
                            "range_V": None if index else [p.low, p.high]} for p in (pos_a, pos_b)}


def _steps(basis, pos_a, pos_b, j, names):
    """The derivation of the verdict: basis, positions, anode and difference, spread, limit, states."""
    d = Derivation()
    primary, series = j.primary, basis.kind == "galvanic-series"
    allowed = f"allowable {volts(basis.allowable_V)} V"
    if series:
        neg = f", negligible {volts(basis.negligible_V)} V" if basis.negligible_V is not None else ""
        d.step("Basis of comparison", "galvanic series of the environment; allowable ΔE from the environment",
               f"{basis.env_name}: series measured in {basis.series_name}", allowed + neg)
        for p in (pos_a, pos_b):
            d.step(f"Position of {names[p.material_id]}", "E_nom = (E_active + E_noble) / 2",
                   f"E_nom = ({volts(p.low)} + {volts(p.high)}) / 2", f"E_nom = {volts(p.nominal)} V vs SCE")
    else:
        d.step("Basis of comparison", "anodic index (legacy table); allowable ΔE by severity",
               f"{basis.env_name}: severity {basis.severity or 'not stated'}", allowed)
        for p in (pos_a, pos_b):
            d.step(f"Anodic index of {names[p.material_id]}", "from the legacy anodic-index table",
                   f"{names[p.material_id]}", f"{volts(-p.nominal)} V")
    d.step("Anode and nominal difference",
           "anode = the more negative E_nom; ΔE = E_nom(cathode) − E_nom(anode)" if series
           else "anode = the larger anodic index; ΔE = index(anode) − index(cathode)",
           f"|{volts(pos_a.nominal)} − ({volts(pos_b.nominal)})|" if series
           else f"|{volts(-pos_a.nominal)} − {volts(-pos_b.nominal)}|",
           f"ΔE = {volts(primary.delta_E_V)} V, anode: {names.get(primary.anode, 'none')}")
    if series:
        d.step("Spread from the published ranges",
               "ΔE_best = gap between the ranges (0 if they overlap); ΔE_worst = largest separation",
               f"ranges [{volts(pos_a.low)}, {volts(pos_a.high)}] and [{volts(pos_b.low)}, {volts(pos_b.high)}] V",
               f"ΔE from {volts(primary.best_V)} to {volts(primary.worst_V)} V")
    sign = "≤" if primary.delta_E_V <= basis.allowable_V + EPS_V else ">"
    d.step("Check against the allowable difference", "passes when ΔE ≤ allowable (limit inclusive)",
           f"{volts(primary.delta_E_V)} V {sign} {volts(basis.allowable_V)} V", f"tier: {primary.tier}")
    if len(j.combos) > 1:
        d.step("Other passive/active states", "each state of each part compared the same way",
               "; ".join(f"{c.a} + {c.b}: {volts(c.delta_E_V)} V {c.tier}" for c in j.combos[1:]),
               f"worst: {j.worst.a} + {j.worst.b} ({j.worst.tier})"
               + ("; verdict lowered to guarded" if j.state_demoted else ""))
    return d.steps


def _assumptions(basis, env, ratio, ratio_given, rate, anode_rec, n_combos, assessment):
    """What the judgement and the screening rate take for granted, in plain words."""
    out = [
        "the series verdict is a quick first look from published potentials: no polarisation curves, no "
        "electrolyte resistance" + ("; the mixed-potential judgement at the service conditions goes further"
                                    if assessment else ""),
        ("nominal potential = mid-point of each published range; the range spread gives best and worst cases"
         if basis.kind == "galvanic-series" else "one anodic-index value per metal group; no spread is published"),
        "the limit is inclusive: ΔE equal to the allowable passes",
    ]
    if env.get("allowable_source") == "common-practice":
        out.append(f"the allowable {volts(basis.allowable_V)} V for {basis.env_name} is a rule of thumb of the trade, "
                   "not a standard")
    out.append(f"area_ratio = {ratio:g}: wetted area of the cathode over the anode" if ratio_given
               else "area_ratio not given: equal wetted areas assumed (1)")
    if rate is not None:
        out += [
            "upper-bound screen: both parts' cathodic reactions run at the O2 diffusion limit i_L and all of the "
            "cathode's current leaves through the anode, which also carries its own (i_a = i_L × (1 + A_c/A_a))",
            "the anode corrodes uniformly over its wetted area (ASTM G102); the attack is in fact concentrated next "
            "to the joint",
        ]
        if rate["limiting_current_from"] == "environment range":
            confidence = env.get("cathodic_current_density_confidence")
            if confidence in ("recalled", "computed"):
                out.append(f"the cathodic current density of {basis.env_name} is provisional ({confidence}): the rate "
                           "is good to its order of magnitude at best")
        if anode_rec.get("state") == "passive":
            out.append("the anode is a passive alloy: its current may go into its film or concentrate at a "
                       "crevice or pit rather than spread evenly")
    if n_combos > 1:
        out.append("every passive/active state of the parts was compared; the verdict is lowered to guarded "
                   "when another state fails")
    return out + list((assessment or {}).get("assumptions", []))


def _passive_drop(ds, recs, basis):
    """Largest difference between a part's two states (how far a passive part falls when active) [V], or None."""
    drops = [abs(sts[0][1].nominal - sts[1][1].nominal) for sts in (states(ds, r, basis) for r in recs)
             if len(sts) > 1]
    return max(drops) if drops else None


def _sources(used, basis, env, rate, ds, extra=()):
    """The source ids of the positions, the limits, the rate and the service judgement, each once."""
    out = [p.source for p in used if p is not None and p.source]
    out += [s for s in (basis.allowable_source, env.get("negligible_source")) if s]
    if rate is not None:
        out += [s for s in rate["sources"] if ds.source(s) is not None]
        out += ["astm-g102"] if ds.source("astm-g102") else []
    return list(dict.fromkeys(out + [s for s in extra if s]))


def _area_effect(primary, ratio):
    """What the area ratio does to the anode's attack, in words (None without an anode)."""
    if primary.anode is None:
        return None
    if ratio > 1.0:
        return (f"the cathode has {ratio:g} times the anode's wetted area: the anode's attack is "
                f"{ratio:g} times what equal areas would give (unfavourable)")
    if ratio < 1.0:
        return (f"the cathode has {ratio:g} times the anode's wetted area: the attack is spread over a large "
                "anode (favourable)")
    return "equal wetted areas"


# --------------------------------------------------------------------------------------------
# entry points


@dataclass(frozen=True)
class JointResult:
    """Everything the joint calculation found; :meth:`to_dict` is the JSON result."""

    data: tuple  # ((key, value), ...) in output order

    def to_dict(self):
        """Plain data for JSON."""
        return _plain(dict(self.data))


def judge_joint(a, b, env, area_ratio=None, service=None):
    """Judge a joint of two materials in a named environment, at its service conditions.

    Args:
        a: first material: id, alias or UNS number [unitless]
        b: second material: id, alias or UNS number [unitless]
        env: environment id or alias [unitless]
        area_ratio: wetted area of the cathode over that of the anode; None assumes 1 [unitless]
        service: stated service conditions (:data:`calc.service.SERVICE_FIELDS`), None: the defaults [°C, g/kg, m/s]

    Returns:
        a :class:`JointResult` (potentials in [V], rates in [mm/y] and [g/(m²·d)])

    References:
        ASTM G82-98 (R2014) §5-6 and Fig. 1 (galvanic series in flowing seawater, after LaQue 1975);
        legacy anodic-index table; ASTM G102-89 (R2015) Eqs. (1)-(2) for the rate; Mansfeld,
        Corrosion 27 (1971) 436 (the upper-bound screen); :mod:`calc.jointservice`.

    >>> r = judge_joint("mild steel", "stainless-316-passive", "seawater-flowing").to_dict()
    >>> (r["anode"], r["verdict"])
    ('carbon-steel', 'unsuited')
    """
    ds = current()
    envrec = ds.get("environments", env, field="env")
    basis = basis_of(envrec, ds)
    rec_a, rec_b = material_on(ds, a, "a", basis), material_on(ds, b, "b", basis)
    warnings = []
    ratio, ratio_given = _area_ratio(area_ratio, warnings)
    names = {r["id"]: r.get("name", r["id"]) for r in ds.records("materials")}
    rec_by_id = {r["id"]: r for r in ds.records("materials")}

    j = judge_pair(ds, rec_a, rec_b, basis)
    primary = j.primary
    pos_a, pos_b = position(rec_a, basis), position(rec_b, basis)
    ids = [rec_a["id"], rec_b["id"]] + [c.a for c in j.combos] + [c.b for c in j.combos]
    used = [position(rec_by_id[i], basis) for i in dict.fromkeys(ids)]
    warnings += basis_warnings(basis) + _confidence_warnings(used, basis, names)
    steps = _steps(basis, pos_a, pos_b, j, names)
    part = service_part(ds, service or {}, envrec, basis, rec_by_id, rec_a, rec_b, primary, ratio)
    steps += list(part.steps)
    warnings += list(part.warnings)
    rate, rate_reason = screen(envrec, basis, primary, ratio, names, rec_by_id, part.service)
    if rate is not None:
        steps += rate["steps"]
        warnings += rate["warnings"]
    extra = dict(part.keys)
    anode_rec = rec_by_id.get(primary.anode)
    alts = [alternatives(ds, basis, rec_b, rec_a, names), alternatives(ds, basis, rec_a, rec_b, names)]
    advice = mitigations(j, basis, ratio, ratio_given, names, any(x["options"] for x in alts),
                         _passive_drop(ds, (rec_a, rec_b), basis))
    data = (
        ("a", rec_a["id"]), ("b", rec_b["id"]), ("env", envrec["id"]),
        ("anode", primary.anode), ("cathode", primary.cathode),
        ("anode_name", names.get(primary.anode)), ("cathode_name", names.get(primary.cathode)),
        ("basis", basis.kind),
        ("basis_description", basis.description),
        ("basis_source", pos_a.source or pos_b.source or None),
        ("basis_sources", list(dict.fromkeys(s for s in (pos_a.source, pos_b.source) if s))),
        ("series", basis.series or None), ("severity", basis.severity or None),
        ("positions", _positions(pos_a, pos_b, basis)),
        ("delta_E_V", round(primary.delta_E_V, 4)),
        ("delta_E_range_V", [round(primary.best_V, 4), round(primary.worst_V, 4)]),
        ("allowable_V", basis.allowable_V), ("allowable_source", basis.allowable_source or None),
        ("negligible_V", basis.negligible_V),
        ("allowable_note", basis.allowable_note or None), ("electrolyte", basis.electrolyte or None),
        ("passes", primary.delta_E_V <= basis.allowable_V + EPS_V),
        ("verdict", j.tier), ("verdict_text", verdict_text(j, rec_a, rec_b, basis, names)),
        ("verdict_meaning", TIER_MEANING[j.tier]),
        ("states", [c.to_dict() for c in j.combos]),
        ("worst_state", j.worst.to_dict()),
        ("area_ratio", ratio), ("area_ratio_given", ratio_given), ("area_effect", _area_effect(primary, ratio)),
        ("rate_mm_per_year", rate["penetration_mm_per_year"] if rate else None),
        ("rate", ({k: v for k, v in rate.items() if k not in ("steps", "sources", "warnings")} if rate else None)),
        ("rate_reason", rate_reason),
        *part.keys,
        ("assumptions", _assumptions(basis, envrec, ratio, ratio_given, rate, anode_rec, len(j.combos),
                                     extra["assessment"])),
        ("mitigations", advice),
        ("alternatives", alts),
        ("cautions", list(CAUTIONS)),
        ("steps", steps), ("warnings", warnings),
        ("sources", _sources(used, basis, envrec, rate, ds, part.sources)),
        ("data_version", ds.version),
    )
    return JointResult(data)


def joint_entry(request):
    """JSON entry point: judge a joint of two materials in an environment.

    Args:
        request: ``{"a", "b", "env"}``, optional area_ratio and :data:`calc.service.SERVICE_FIELDS` [unitless, °C, m/s]

    Returns:
        dict: anode, cathode, basis (with basis_description, basis_source), delta_E_V [V], delta_E_range_V [V],
        allowable_V [V], allowable_source, negligible_V [V],
        verdict, verdict_text, states, worst_state, area_ratio, rate_mm_per_year [mm/y] (the upper-bound
        screen), rate, service_conditions, oxygen_supply, parts, assessment (mixed potential [V vs SCE]),
        assessment_reason, attack_mm_per_year [mm/y], evans, effects, assumptions,
        mitigations, alternatives, cautions, steps, warnings, sources, data_version

    References:
        ASTM G82-98 (R2014); legacy anodic-index table; ASTM G102-89 (R2015) Eqs. (1)-(2).

    >>> r = joint_entry({"a": "zinc", "b": "mild steel", "env": "seawater-flowing", "area_ratio": 1})
    >>> (r["anode"], r["cathode"])
    ('zinc', 'carbon-steel')
    """
    material = "a material id, alias or UNS number"
    read(request, "joint", {"a": material, "b": material, "env": "an environment id"},
         ("area_ratio",) + svc.SERVICE_FIELDS)
    return judge_joint(request["a"], request["b"], request["env"], request.get("area_ratio"),
                       svc.stated(request)).to_dict()
