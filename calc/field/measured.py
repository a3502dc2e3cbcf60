"""A joint judged from the corrosion potentials of its two parts, measured on site.

The two readings are taken against one electrode. The more negative part is the anode; the
difference of the two readings is compared with the allowable difference of the named
environment, with the tier words of :mod:`calc.series` (matched, compatible, guarded, unsuited;
limit inclusive). Both readings are also put on one scale (SCE, the scale of the published
galvanic series, and SHE) by :mod:`calc.refelec`. When both materials are named, the
published-series judgement of :func:`calc.joint.judge_joint` is shown beside the measured one;
where they disagree the site measurement wins.
"""

from dataclasses import dataclass

from ..dataset import current
from ..derivation import fmt
from ..errors import InputError
from ..joint import judge_joint
from ..requests import label, read
from ..service import SERVICE_FIELDS
from ..series import EPS_V, TIER_MEANING, basis_of, midpoint, tier_for
from .electrodes import AGAGCL_SW, field_electrode, on_scale, plausibility, read_reading, start_derivation

MEASURED_CAUTIONS = (
    "Measure each part's own potential with the parts electrically separated (or before they are joined): two "
    "connected parts polarise each other and read almost the same potential, so a small difference measured on a "
    "joined pair does not prove them compatible.",
    "Potentials drift with time, flow, aeration, temperature and where the electrode sits; read both parts at the "
    "same time, with the electrode close to the surface.",
    "Screening only. For structural, pressure-retaining, potable-water or other safety-relevant joints, apply the "
    "governing codes and standards and have the joint assessed by a qualified corrosion professional.",
)
#: how far outside its published range a part may read before a warning says so [V]
RANGE_SLACK_V = 0.02


@dataclass(frozen=True)
class MeasuredJoint:
    """A measured joint judgement; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON."""
        return dict(self.data)


def _env_name(envrec):
    return envrec.get("name", envrec["id"])


def _on_scales(d, el, labels, ra, rb):
    """Both readings vs SHE and vs SCE, with their steps: (E_a SHE, E_b SHE, {part: E SCE})."""
    t = el.temp_C
    ea, eb = ra + el.E_V_SHE, rb + el.E_V_SHE
    for w in (plausibility(ra, ea, "a_reading_V", "corrosion", el.id)
              + plausibility(rb, eb, "b_reading_V", "corrosion", el.id)):
        d.warn(w["field"], w["message"])
    sce_a, sce_rec = on_scale(ea, "SCE", t)
    sce_b = eb - sce_rec.E_V_SHE
    a_label, b_label = labels["a"], labels["b"]
    e_txt = f"{fmt(el.E_V_SHE - el.shift_V)} + {fmt(el.shift_V)}" if el.shift_V else fmt(el.E_V_SHE)
    d.step("Both readings vs SHE", f"E(SHE) = reading + E({el.id} vs SHE at {fmt(t)} °C)"
           + (" + chloride shift ΔE" if el.shift_V else ""),
           f"{a_label}: {fmt(ra)} + {e_txt}; {b_label}: {fmt(rb)} + {e_txt}",
           f"{a_label} {fmt(ea, 4)} V, {b_label} {fmt(eb, 4)} V vs SHE")
    d.step("Both readings vs SCE (the scale of the galvanic series)",
           f"E(SCE) = E(SHE) − E(SCE vs SHE at {fmt(t)} °C)",
           f"− {fmt(sce_rec.E_V_SHE)} V", f"{a_label} {fmt(sce_a, 4)} V, {b_label} {fmt(sce_b, 4)} V vs SCE")
    for s in sce_rec.sources:
        d.cite(s)
    return ea, eb, {"a": sce_a, "b": sce_b}


def _anode(d, labels, ra, rb):
    """The difference of the readings and which part is the anode: (ΔE, anode, cathode, anode part)."""
    delta = round(abs(ra - rb), 9)
    if delta <= EPS_V:
        anode = cathode = anode_part = None
    elif ra < rb:
        anode, cathode, anode_part = labels["a"], labels["b"], "a"
    else:
        anode, cathode, anode_part = labels["b"], labels["a"], "b"
    d.step("Anode and potential difference", "the more negative part is the anode; ΔE = |E_a − E_b| (the same "
           "electrode for both, so its value cancels)", f"|{fmt(ra)} − ({fmt(rb)})| V",
           f"ΔE = {fmt(delta, 4)} V; anode: {anode or 'neither (equal readings)'}")
    return delta, anode, cathode, anode_part


def _state_check(d, ds, recs, measured_sce, labels, allowable_V):
    """If a passive part turned active: would the difference exceed the allowable? (notes, any fails)."""
    notes, state_fail = [], False
    for part, rec in recs.items():
        other_id = rec.get("other_state")
        if rec.get("state") != "passive" or not other_id:
            continue
        other = ds.get("materials", other_id)
        mp, mo = midpoint(rec.get("seawater_range_V_SCE")), midpoint(other.get("seawater_range_V_SCE"))
        if mp is None or mo is None:
            continue
        drop = mp - mo
        alt = measured_sce[part] - drop
        alt_delta = abs(alt - measured_sce["b" if part == "a" else "a"])
        fails = alt_delta > allowable_V + EPS_V
        state_fail = state_fail or fails
        notes.append({"part": part, "material": rec["id"], "other_state": other_id, "drop_V": round(drop, 4),
                      "delta_E_if_active_V": round(alt_delta, 4), "fails": fails})
        d.step(f"If {labels[part]} turns active",
               "E_active ≈ E_measured − (mid-point passive − mid-point active) of the published ranges",
               f"{fmt(measured_sce[part], 4)} − {fmt(drop, 4)} V vs SCE",
               f"ΔE would be {fmt(alt_delta, 4)} V: {'beyond' if fails else 'within'} the "
               f"{fmt(allowable_V)} V allowed")
        d.cite(rec.get("seawater_source"))
        d.cite(other.get("seawater_source"))
    return notes, state_fail


def _tier(d, envrec, basis, delta, state_fail):
    """The measured tier: :func:`calc.series.tier_for` with the measured difference as its own worst case."""
    tier = tier_for(delta, delta, basis.allowable_V, basis.negligible_V, state_fail=state_fail)
    cmp_sign = "≤" if delta <= basis.allowable_V + EPS_V else ">"
    d.step("Check against the allowable difference", "passes when ΔE ≤ allowable (limit inclusive)",
           f"{fmt(delta, 4)} V {cmp_sign} {fmt(basis.allowable_V)} V ({_env_name(envrec)})",
           f"tier: {tier}")
    d.cite(basis.allowable_source)
    if basis.negligible_V is not None:
        d.cite(envrec.get("negligible_source") or basis.allowable_source)
    return tier


def _service_summary(pub, recs):
    """The mixed-potential judgement at the service conditions, as the measured result shows it (or None)."""
    a = pub.get("assessment")
    if not a:
        return None
    free = {part: next((p["free_potential_V_SCE"] for p in a["parts"] if p["id"] == rec["id"]), None)
            for part, rec in recs.items()}
    return {"couple_potential_V_SCE": a["couple_potential_V_SCE"], "anode": a["anode"],
            "attack_mm_per_year": a["anode_penetration_mm_per_year"], "free_potentials_V_SCE": free,
            "service_conditions": pub["service_conditions"]}


def _published_judgement(recs, envrec, labels, service=None):
    """The published-series judgement of the two materials, as the measured result shows it."""
    try:
        pub = judge_joint(recs["a"]["id"], recs["b"]["id"], envrec["id"], service=service).to_dict()
    except InputError as exc:
        raise InputError({"a": "a_material", "b": "b_material"}.get(exc.field, exc.field), exc.value,
                         exc.allowed, exc.hint) from None
    pub_anode = {recs["a"]["id"]: labels["a"], recs["b"]["id"]: labels["b"]}.get(pub["anode"])
    if recs["a"]["id"] == recs["b"]["id"]:
        pub_anode = None
    return pub, {"verdict": pub["verdict"], "anode": pub["anode"], "anode_part_name": pub_anode,
                 "delta_E_V": pub["delta_E_V"], "delta_E_range_V": pub["delta_E_range_V"],
                 "basis": pub["basis"], "verdict_text": pub["verdict_text"], "positions": pub["positions"],
                 "sources": pub["sources"], "at_service": _service_summary(pub, recs)}


def _agreement(pub, pub_anode, anode, tier, delta):
    """Whether the published series and the site readings agree, and the sentence that says so."""
    same_anode = pub_anode == anode
    if pub["verdict"] == tier and same_anode:
        return True, f"The published series agrees: {pub['verdict']}, with {anode or 'neither part'} as the anode."
    parts = []
    if pub["verdict"] != tier:
        parts.append(f"the published series says {pub['verdict']} (ΔE {fmt(pub['delta_E_V'], 3)} V), the "
                     f"site readings {tier} (ΔE {fmt(delta, 3)} V)")
    if not same_anode:
        parts.append(f"the published series makes {pub_anode or 'neither part'} the anode, the site readings "
                     f"{anode or 'neither part'}")
    return False, ("They disagree: " + "; ".join(parts) + ". The site measurement wins: it measures "
                   "these parts in this water, at this temperature and flow, with their actual surface "
                   "films, whereas the published series gives ranges measured in flowing seawater at "
                   "10-27 °C. Check that both readings were taken with the parts separated and repeat "
                   "them before relying on either.")


def _outside_published_ranges(d, recs, measured_sce, labels):
    """Warn where a part reads outside the published seawater range of its material."""
    for part, rec in recs.items():
        rng = rec.get("seawater_range_V_SCE")
        if isinstance(rng, list) and len(rng) == 2:
            lo, hi = min(rng), max(rng)
            if not lo - RANGE_SLACK_V <= measured_sce[part] <= hi + RANGE_SLACK_V:
                d.warn(f"{part}_reading_V",
                       f"{labels[part]} reads {fmt(measured_sce[part], 3)} V vs SCE, outside the published "
                       f"range of {rec.get('name', rec['id'])} ({fmt(lo)} to {fmt(hi)} V vs SCE in flowing "
                       "seawater): another state, electrolyte or surface condition, or a reading fault")


def _beside_published(d, recs, envrec, labels, anode, tier, delta, measured_sce, service=None):
    """The published-series judgement beside the measured one: (published, agreement, its text)."""
    if len(recs) == 1:
        d.warn("b_material" if "a" in recs else "a_material",
               "the published-series judgement needs both materials; only one was given")
    if len(recs) != 2:
        return None, None, None
    pub, published = _published_judgement(recs, envrec, labels, service)
    for s in pub["sources"]:
        d.cite(s)
    agreement, agreement_text = _agreement(pub, published["anode_part_name"], anode, tier, delta)
    if pub["basis"] == "galvanic-series":
        _outside_published_ranges(d, recs, measured_sce, labels)
    return published, agreement, agreement_text


def _context_warnings(d, basis, envrec, el, temp_given):
    """What the environment and the electrode mean for readings taken there."""
    if basis.kind == "anodic-index":
        d.warn("env", f"{_env_name(envrec)} is judged on the anodic index (a table for equipment in "
                      "air); site potentials are read in an electrolyte, so take them in the film or water the parts "
                      "actually share")
    if el.id == AGAGCL_SW and el.salinity is None and not envrec["id"].startswith("seawater"):
        d.warn("salinity", f"an Ag/AgCl seawater electrode in {_env_name(envrec).lower()}: the "
                           "difference of the two readings is unaffected, but their values on the SCE scale need "
                           "the salinity or chloride_mg_per_L (the electrode is taken to be in seawater of "
                           "salinity 35)")
    if not temp_given:
        d.warn("temp_C", "temperature not given: 25 °C assumed for the electrode")


def _verdict_text(tier, anode, cathode, delta, basis, envrec, state_notes, labels):
    """The verdict in one or two sentences."""
    env_name, allow = _env_name(envrec), fmt(basis.allowable_V)
    if tier == "unsuited":
        return (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: more than the "
                f"{allow} V allowed in {env_name}, so it will corrode faster where the two meet unless they are "
                "isolated or protected.")
    if anode is None:
        return f"The two parts read the same potential: no galvanic driving force was measured ({tier})."
    if tier == "guarded":
        bad = [n for n in state_notes if n["fails"]]
        return (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: within the "
                f"{allow} V allowed, but if {labels[bad[0]['part']]} turns active (crevices, "
                f"deposits, still water) the difference would be about {fmt(bad[0]['delta_E_if_active_V'], 3)} V, "
                "beyond it: join them only with precautions.")
    if tier == "matched":
        return (f"{anode} is the anode, only {fmt(delta, 3)} V below {cathode} as measured: inside the "
                f"{fmt(basis.negligible_V)} V treated as negligible, so the galvanic effect does not matter.")
    return (f"{anode} is the anode, {fmt(delta, 3)} V below {cathode} as measured: within the "
            f"{allow} V allowed in {env_name}.")


def _assumptions(envrec, basis):
    out = [
        "both readings were taken against the same electrode, each part on its own (not connected to the other)",
        "the limit is inclusive: a difference equal to the allowable passes",
        "the difference of the two readings does not depend on the electrode's own value; the SCE and SHE values "
        "do, and carry that electrode's uncertainty",
    ]
    if envrec.get("allowable_source") == "common-practice":
        out.append(f"the allowable {fmt(basis.allowable_V)} V for {_env_name(envrec)} is a "
                   "rule of thumb of the trade, not a standard")
    return out


def measured_joint(a_name, a_reading_V, b_name, b_reading_V, electrode, env, temp_C=None, salinity=None,
                   chloride_mg_per_L=None, a_material=None, b_material=None, service=None):
    """Judge a joint from the two parts' potentials measured on site against one electrode.

    Args:
        a_name: label of the first part, e.g. "hull plate" [unitless]
        a_reading_V: its potential [V vs electrode]
        b_name: label of the second part [unitless]
        b_reading_V: its potential [V vs electrode]
        electrode: the reference electrode both readings were taken with [unitless]
        env: environment id or alias (sets the allowable difference) [unitless]
        temp_C: temperature of the electrode, default 25 [°C]
        salinity: salinity of the water, for an Ag/AgCl seawater electrode [g/kg]
        chloride_mg_per_L: chloride instead of salinity [mg/L]
        a_material: dataset material id of the first part, optional [unitless]
        b_material: dataset material id of the second part, optional [unitless]
        service: further service conditions for the published judgement (:data:`calc.service.SERVICE_FIELDS`:
            oxygen, flow, pH, conductivity), optional; temp_C, salinity and chloride count too [unitless]

    Returns:
        a :class:`MeasuredJoint` (potentials in [V], difference in [V])

    References:
        ASTM G82-98 (R2014) §6 (the more active metal of a couple is the anode); the environment's
        allowable difference as in :mod:`calc.joint`; reference conversion by :mod:`calc.refelec`.

    >>> r = measured_joint("hull", -0.62, "shaft", -0.05, "SCE", "seawater-flowing").to_dict()
    >>> r["anode"], r["delta_E_V"], r["verdict"]
    ('hull', 0.57, 'unsuited')
    """
    ds = current()
    labels = {"a": label(a_name, "a_name", "a label for the first part, e.g. hull plate"),
              "b": label(b_name, "b_name", "a label for the second part, e.g. propeller")}
    ra, rb = read_reading(a_reading_V, "a_reading_V"), read_reading(b_reading_V, "b_reading_V")
    el = field_electrode(electrode, temp_C, salinity, chloride_mg_per_L)
    envrec = ds.get("environments", env, field="env")
    basis = basis_of(envrec)
    d = start_derivation(el)
    ea, eb, sce = _on_scales(d, el, labels, ra, rb)
    delta, anode, cathode, anode_part = _anode(d, labels, ra, rb)
    recs = {part: ds.get("materials", name, field=f"{part}_material")
            for part, name in (("a", a_material), ("b", b_material)) if name is not None}
    state_notes, state_fail = _state_check(d, ds, recs, sce, labels, basis.allowable_V)
    tier = _tier(d, envrec, basis, delta, state_fail)
    if service and not recs:  # conditions act only on the published-series judgement, which needs the materials
        d.warn("a_material", "the service conditions given (" + ", ".join(sorted(service)) + ") are used only for "
               "the judgement from the published series at those conditions, which needs both materials: give "
               "a_material and b_material, or leave the conditions out")
    conditions = dict(service or {})
    conditions.update({k: v for k, v in (("temp_C", temp_C), ("salinity", salinity),
                                          ("chloride_mg_per_L", chloride_mg_per_L)) if v is not None})
    published, agreement, agreement_text = _beside_published(d, recs, envrec, labels, anode, tier, delta, sce,
                                                             conditions)
    _context_warnings(d, basis, envrec, el, temp_C is not None)
    data = (
        ("a_name", labels["a"]), ("b_name", labels["b"]), ("a_reading_V", ra), ("b_reading_V", rb),
        ("electrode", el.id), ("temp_C", el.temp_C), ("env", envrec["id"]), ("env_name", _env_name(envrec)),
        ("salinity", el.salinity), ("electrode_shift_V", round(el.shift_V, 6)),
        ("electrode_V_SHE", round(el.E_V_SHE, 6)),
        ("scale", "SCE"), ("a_V_SCE", round(sce["a"], 6)), ("b_V_SCE", round(sce["b"], 6)),
        ("a_V_SHE", round(ea, 6)), ("b_V_SHE", round(eb, 6)),
        ("anode", anode), ("cathode", cathode), ("anode_part", anode_part),
        ("delta_E_V", round(delta, 4)), ("allowable_V", basis.allowable_V), ("negligible_V", basis.negligible_V),
        ("allowable_source", basis.allowable_source or None),
        ("passes", delta <= basis.allowable_V + EPS_V), ("margin_V", round(basis.allowable_V - delta, 4)),
        ("verdict", tier),
        ("verdict_text", _verdict_text(tier, anode, cathode, delta, basis, envrec, state_notes, labels)),
        ("verdict_meaning", TIER_MEANING[tier]),
        ("materials", {p: r["id"] for p, r in recs.items()}),
        ("state_check", state_notes),
        ("published", published), ("agreement", agreement), ("agreement_text", agreement_text),
        ("assumptions", _assumptions(envrec, basis)), ("cautions", list(MEASURED_CAUTIONS)),
        ("steps", d.steps), ("warnings", d.warnings), ("sources", d.sources), ("data_version", ds.version),
    )
    return MeasuredJoint(data)


#: request fields of ``measured``, in the order its messages list them
MEASURED_FIELDS = ("a_name", "a_reading_V", "b_name", "b_reading_V", "electrode", "temp_C", "env",
                   "chloride_mg_per_L", "salinity", "a_material", "b_material")
#: the further service conditions the published judgement takes (:mod:`calc.service`)
MEASURED_SERVICE = tuple(k for k in SERVICE_FIELDS if k not in MEASURED_FIELDS)
#: the required ones, in the order they are reported, with what each must hold
MEASURED_REQUIRED = {"a_name": "a label for the first part", "a_reading_V": "a reading in V",
                     "b_name": "a label for the second part", "b_reading_V": "a reading in V",
                     "electrode": "a reference electrode id such as CSE or Ag/AgCl seawater",
                     "env": "an environment id"}


def measured_joint_entry(req):
    """JSON entry point ``measured``: judge a joint from two potentials measured on site.

    Request fields: ``a_name``, ``a_reading_V`` [V], ``b_name``, ``b_reading_V`` [V],
    ``electrode``, ``env``; optional ``temp_C`` [°C, default 25], ``salinity`` [g/kg] or
    ``chloride_mg_per_L`` [mg/L] (Ag/AgCl seawater electrode), ``a_material``, ``b_material``; and the
    further service conditions of the published judgement (:data:`MEASURED_SERVICE`).

    Args:
        req: the request dict [unitless]

    Returns:
        dict: anode, cathode, delta_E_V [V], allowable_V [V], verdict, verdict_text, a_V_SCE and
        b_V_SCE [V vs SCE], published (the published-series judgement or None), agreement_text,
        state_check, assumptions, cautions, steps, warnings, sources, data_version

    References:
        See :func:`measured_joint`.

    >>> r = measured_joint_entry({"a_name": "pile", "a_reading_V": -0.70, "b_name": "ladder",
    ...                           "b_reading_V": -0.66, "electrode": "SCE", "env": "seawater-flowing"})
    >>> r["verdict"], r["anode"]
    ('matched', 'pile')
    """
    read(req, "measured", None, MEASURED_FIELDS + MEASURED_SERVICE)  # the fields listed in their order, as always
    read(req, "measured", MEASURED_REQUIRED, MEASURED_FIELDS + MEASURED_SERVICE)
    service = {k: req[k] for k in MEASURED_SERVICE if req.get(k) is not None}
    return measured_joint(req["a_name"], req["a_reading_V"], req["b_name"], req["b_reading_V"], req["electrode"],
                          req["env"], req.get("temp_C"), req.get("salinity"), req.get("chloride_mg_per_L"),
                          req.get("a_material"), req.get("b_material"), service).to_dict()
