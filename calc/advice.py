"""What to tell the user about a joint beyond its numbers: the verdict in words, warnings on the
basis, what to do about it (mitigations), closer-matched materials (alternatives) and the cautions.

The mitigations are the usual practice of the trade for dissimilar-metal joints (common
practice): break the metal path, coat the cathode (never the anode alone), make the small part
the noble one, keep the electrolyte out, and, in an immersed electrolyte or in soil, cathodic
protection designed under the applicable standard.
"""

import weakref

from .scope import series_caveat
from .series import EPS_V, TIER_RANK, judge_pair, position

#: number of alternatives listed per direction
N_ALTERNATIVES = 8

CAUTIONS = (
    "Screening estimate only: it ranks a joint by published potentials and a simple area rule; it does not "
    "predict a service life.",
    "Crevices, flow velocity, temperature, biofilm (which raises the potential of stainless steels and titanium in "
    "natural seawater), deposits, coatings and geometry change real behaviour; test or survey where it matters.",
    "For structural, pressure-retaining, potable-water or other safety-relevant joints, apply the governing codes "
    "and standards and have the design reviewed by a qualified corrosion professional.",
)

_G82 = "ASTM G82"


def volts(x):
    """Voltage text of the results: 3 decimals, one trailing zero dropped.

    Args:
        x: a potential or a potential difference [V]

    Returns:
        the text, without the unit

    References:
        Presentation only (no published method).

    >>> volts(0.25), volts(0.265), volts(-0.6)
    ('0.25', '0.265', '-0.60')
    """
    s = f"{x:.3f}"
    return s[:-1] if s.endswith("0") else s


def basis_warnings(basis):
    """Warnings about the basis itself: a series used outside its electrolyte, an index in water.

    Args:
        basis: the environment's :class:`calc.series.Basis` [unitless]

    Returns:
        a list of ``{field, message}``

    References:
        ASTM G82-98 (R2014) §5 (a galvanic series is specific to its electrolyte); the legacy
        anodic-index table's scope (equipment in air).

    >>> from calc.series import basis_of
    >>> b = basis_of({"id": "tank", "name": "Tank", "basis": "anodic-index", "allowable_V": 0.15,
    ...               "immersed": True})
    >>> "immersed" in basis_warnings(b)[0]["message"]
    True
    """
    out = []
    if basis.kind == "galvanic-series" and basis.series != basis.env_id:
        out.append({"field": "env", "message":
                    f"the galvanic series used was measured in {basis.series_name}, not in {basis.env_name}: a "
                    f"galvanic series is specific to the electrolyte it was measured in ({_G82}), so positions and "
                    "the order of close neighbours may differ here", **series_caveat(basis)})
    if basis.kind == "anodic-index" and basis.immersed:
        out.append({"field": "env", "message":
                    f"{basis.env_name} is an immersed electrolyte but is judged on the anodic index, a table for "
                    f"equipment in air; a galvanic series measured in that electrolyte ({_G82}) is the right basis"})
    return out


# --------------------------------------------------------------------------------------------
# the verdict in words


def _who(judgement, rec_a, rec_b, basis, names):
    """The first half of the verdict: which part is the anode, and by how much."""
    primary = judgement.primary
    d = volts(primary.delta_E_V)
    if rec_a["id"] == rec_b["id"]:
        return f"Both parts are {names[rec_a['id']]}: there is no galvanic couple"
    if primary.anode is None:
        return (f"{names[rec_a['id']]} and {names[rec_b['id']]} have the same nominal potential"
                if basis.kind == "galvanic-series" else
                f"{names[rec_a['id']]} and {names[rec_b['id']]} are in the same anodic-index group")
    if basis.kind == "galvanic-series":
        return f"{names[primary.anode]} is the anode, {d} V below {names[primary.cathode]}"
    return (f"{names[primary.anode]} is the anode: its anodic index is {d} V above that of "
            f"{names[primary.cathode]}")


def _state_change(judgement, rec_a, rec_b, names):
    """Why a joint that passes as named is guarded: the other state of a part, in words."""
    other = judgement.worst
    changed = [r for r, sid in ((rec_a, other.a), (rec_b, other.b)) if r["id"] != sid]
    part = " and ".join(names[r["id"]] for r in changed) or "a passive part"
    verb = "turn" if len(changed) > 1 else "turns"
    if all(r.get("state") == "passive" for r in changed):
        change = f"{verb} active (crevices, deposits, stagnant or de-aerated water)"
    elif all(r.get("state") == "active" for r in changed):
        change = f"{verb} passive again"
    else:
        change = f"{verb} to the other state"
    return (f"but if {part} {change} the difference becomes {volts(other.delta_E_V)} V with "
            f"{names.get(other.anode, 'neither')} as the anode, beyond the limit")


def verdict_text(judgement, rec_a, rec_b, basis, names):
    """The verdict of a joint as one sentence.

    Args:
        judgement: the pair judged in every state (:func:`calc.series.judge_pair`) [unitless]
        rec_a: first material record [unitless]
        rec_b: second material record [unitless]
        basis: the environment's :class:`calc.series.Basis` [unitless]
        names: material id -> name [unitless]

    Returns:
        the sentence, ending with a full stop

    References:
        ASTM G82-98 (R2014) §6 (the more active metal is the anode); the tier rule of
        :func:`calc.series.tier_for`.

    >>> from calc.dataset import current
    >>> from calc.series import basis_of, judge_pair
    >>> ds = current(); b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> zn, cu = ds.get("materials", "zinc"), ds.get("materials", "copper")
    >>> verdict_text(judge_pair(ds, zn, cu, b), zn, cu, b, {"zinc": "Zinc", "copper": "Copper"})[:40]
    'Zinc is the anode, 0.67 V below Copper: '
    """
    head = _who(judgement, rec_a, rec_b, basis, names)
    primary, env, allow = judgement.primary, basis.env_name, volts(basis.allowable_V)
    if judgement.tier == "unsuited":
        tail = (f"more than the {allow} V allowed in {env}, so it will corrode faster where the two meet "
                "unless the joint is isolated or protected")
        if primary.best_V <= basis.allowable_V + EPS_V:
            tail += f" (even though the published ranges come within {volts(primary.best_V)} V at their closest)"
        return f"{head}: {tail}."
    if judgement.tier == "guarded":
        why = (_state_change(judgement, rec_a, rec_b, names) if judgement.state_demoted else
               f"but the published ranges allow up to {volts(primary.worst_V)} V, beyond the limit")
        return (f"{head}; that is within the {allow} V allowed in {env} as named, {why}: "
                "join them only with precautions.")
    if judgement.tier == "matched":
        return (f"{head}; the difference of {volts(primary.delta_E_V)} V is inside the {volts(basis.negligible_V)} V "
                f"treated as negligible in {env}, so the galvanic effect does not matter.")
    return f"{head}; that is within the {allow} V allowed in {env}, so the joint is acceptable on galvanic grounds."


# --------------------------------------------------------------------------------------------
# sacrificial by design


#: families of the metals whose corrosion on steel is the purpose (common practice): zinc as an
#: anode or a coating (galvanizing, zinc plate; a coating protects cut edges and scratches in the
#: atmosphere too), magnesium and aluminium anode alloys as anodes in water or soil. The
#: structural aluminium alloys (family "aluminium alloy") are not anodes by design: an aluminium
#: hull or bracket on steel is a joint to keep apart, not a protection.
SACRIFICIAL_FAMILIES = {"zinc": "any", "magnesium": "immersed", "aluminium anode alloy": "immersed"}
#: the families those anodes and coatings protect
PROTECTED_FAMILIES = ("steel", "cast iron")
#: the rule in words, with :func:`sacrificial_by_design`
SACRIFICIAL_RULE = (
    "zinc (as an anode or a coating) on steel or cast iron, and magnesium or aluminium anode alloys on them in "
    "water or soil, are sacrificial by design: the anode corrodes so that the steel does not (cathodic "
    "protection). The verdict still holds for a part that must last: a structural zinc or magnesium part on steel "
    "corrodes just as the verdict says.")


def sacrificial_by_design(anode_rec, cathode_rec, basis):
    """Whether a failing pair is a sacrificial anode or coating on steel: its attack is the purpose.

    Args:
        anode_rec: the material record of the anode [unitless]
        cathode_rec: the material record of the cathode [unitless]
        basis: the environment's :class:`calc.series.Basis` [unitless]

    Returns:
        ``{anode, cathode, text, source}`` with source ``common-practice``, or None

    References:
        Common practice of cathodic protection: zinc, magnesium and aluminium alloy anodes, and
        zinc coatings, protect steel by corroding in its place (:data:`SACRIFICIAL_RULE`).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of
    >>> ds = current(); b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> sacrificial_by_design(ds.get("materials", "zinc"), ds.get("materials", "mild steel"), b)["source"]
    'common-practice'
    >>> sacrificial_by_design(ds.get("materials", "aluminium-5083"), ds.get("materials", "mild steel"), b) is None
    True
    """
    where = SACRIFICIAL_FAMILIES.get(anode_rec.get("family"))
    if where is None or cathode_rec.get("family") not in PROTECTED_FAMILIES or (where == "immersed"
                                                                                and not basis.immersed):
        return None
    anode, cathode = anode_rec.get("name", anode_rec["id"]), cathode_rec.get("name", cathode_rec["id"])
    use = "an anode or a coating" if where == "any" else "an anode"
    return {"anode": anode_rec["id"], "cathode": cathode_rec["id"], "source": "common-practice",
            "text": f"sacrificial by design when {anode} is {use}: it corrodes so that {cathode} does not "
                    "(cathodic protection); size it for the life wanted. For a part that must last, the verdict "
                    "holds."}


# --------------------------------------------------------------------------------------------
# mitigations


#: the cathodic-protection advice for a joint buried in soil, the classic case of cathodic protection.
#: Its basis, read: 49 CFR 192.455(a)(2) (each buried or submerged gas pipeline installed after
#: July 31, 1971 must have a cathodic protection system, placed in operation within a year of
#: construction; (b) and (c) except a demonstrated non-corrosive environment, (d) not for coated
#: pipe) and 49 CFR 192.453 (designed by or under a person qualified in pipeline corrosion control).
SOIL_CP_TEXT = (
    "Protect the joint cathodically: buried steel is the classic case. Galvanic anodes (magnesium or zinc) or an "
    "impressed-current groundbed make both metals cathodes, together with the structure's coating. It is a design "
    "of its own: follow the applicable standard (ISO 15589-1, NACE SP0169, EN 12954) and have it designed by a "
    "qualified corrosion professional (over-protection can embrittle high-strength steel and lift coatings; the "
    "current can corrode neighbouring buried metal).")
SOIL_CP_REASON = ("the soil around a buried joint reaches both parts, so cathodic protection protects the whole "
                  "joint; United States regulation requires it on buried or submerged gas pipelines installed after "
                  "July 31, 1971, unless tests show the soil is not corrosive (49 CFR 192 Subpart I, §192.455), "
                  "designed by or under a person qualified in corrosion control (§192.453)")


def mitigations(judgement, basis, area_ratio, area_given, names, have_alternatives, passive_drop_V):
    """What to do about a joint, each with the reason it applies here.

    Args:
        judgement: the pair judged in every state (:func:`calc.series.judge_pair`) [unitless]
        basis: the environment's :class:`calc.series.Basis` [unitless]
        area_ratio: wetted area of the cathode over that of the anode [unitless]
        area_given: whether the user gave the area ratio [unitless]
        names: material id -> name [unitless]
        have_alternatives: whether closer-matched materials are listed [unitless]
        passive_drop_V: largest fall of a part's potential when it turns active, or None [V]

    Returns:
        a list of ``{id, text, reason}``, none for a matched joint

    References:
        Common practice of the trade for dissimilar-metal joints (isolation, coating the cathode,
        area ratio, sealing, cathodic protection).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of, judge_pair
    >>> ds = current(); b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> j = judge_pair(ds, ds.get("materials", "zinc"), ds.get("materials", "copper"), b)
    >>> [m["id"] for m in mitigations(j, b, 10.0, True, {"zinc": "Zinc", "copper": "Copper"}, True, None)]
    ['isolate', 'coat-cathode', 'noble-fastener', 'seal', 'cathodic-protection', 'closer-match']
    """
    tier, primary = judgement.tier, judgement.primary
    if tier == "matched" or primary.anode is None and tier != "guarded":
        return []
    anode = names.get(primary.anode, "the anode") if primary.anode else "the more active part"
    cathode = names.get(primary.cathode, "the cathode") if primary.cathode else "the more noble part"
    small_anode = (not area_given) or area_ratio > 1.0
    out = []

    def add(mid, text, reason):
        out.append({"id": mid, "text": text, "reason": reason})

    if tier == "guarded" and judgement.state_demoted:
        drop = f" by about {volts(passive_drop_V)} V" if passive_drop_V else ""
        add("keep-passive",
            "Keep the passive part passive: no crevices, deposits, lap joints or stagnant and de-aerated pockets "
            f"where it can lose its film; there its potential falls{drop}.",
            f"the joint passes only while the passive state holds (active: {volts(judgement.worst.delta_E_V)} V)")
    if tier == "unsuited":
        add("isolate",
            "Break the metal path: insulating washers, sleeves and gaskets so no current passes between the two "
            "metals; check after assembly that no bolt, bond or wet deposit bridges them.",
            f"the difference of {volts(primary.delta_E_V)} V exceeds the {volts(basis.allowable_V)} V allowed")
        add("coat-cathode",
            f"Coat the cathode ({cathode}), or both parts. Never coat only the anode: each pore or scratch in that "
            "coating becomes a small anode facing the whole bare cathode, and the attack there is fast and deep.",
            "coating the cathode cuts the area that drives the attack")
    if tier in ("unsuited", "guarded", "compatible") and small_anode and primary.anode is not None:
        if tier != "compatible" or (area_given and area_ratio > 1.0):
            add("noble-fastener",
                "Make the smaller part (fasteners, rivets, weld metal) the more noble metal, so a large anode faces a "
                "small cathode and the attack spreads thin.",
                (f"the cathode is {area_ratio:g} times the anode's wetted area: the attack concentrates on {anode}"
                 if area_given else "the area ratio was not given; a small anode on a large cathode is the bad case"))
    if tier in ("unsuited", "guarded"):
        add("seal",
            "Keep the electrolyte out of the joint: sealant or jointing compound in the faying surfaces, drainage, "
            "no water traps; without a wet path between the metals no galvanic current flows.",
            ("in air the electrolyte is a film of condensation or spray that can be kept out" if not basis.immersed
             else "sealed faying surfaces keep crevices dry even when the outside is wetted"))
    if tier == "unsuited" and basis.immersed:
        add("cathodic-protection",
            "Protect the joint cathodically: sacrificial anodes (zinc, aluminium or magnesium alloy suited to the "
            "water) or impressed current make both metals cathodes. It is a design of its own: follow the "
            "applicable standard and have it designed by a qualified corrosion professional (over-protection can "
            "embrittle high-strength steel and lift coatings).",
            f"{basis.env_name} is an immersed electrolyte, where cathodic protection reaches the whole joint")
    elif tier == "unsuited" and basis.electrolyte == "soil":
        add("cathodic-protection", SOIL_CP_TEXT, SOIL_CP_REASON)
    if tier == "unsuited" and have_alternatives:
        add("closer-match",
            "Choose a closer-matched pair from the alternatives listed below.",
            "materials in the dataset sit within the allowable difference of one of the parts")
    return out


# --------------------------------------------------------------------------------------------
# alternatives


#: ranked alternatives per dataset object, then per (basis, kept part, replaced part): they do not
#: depend on the area ratio, the input a user changes most, and ranking them judges every material
#: (most of a joint assessment's time). Weak keys: a dataset that is replaced takes its entries along.
_ALTERNATIVES_CACHE = weakref.WeakKeyDictionary()
_ALTERNATIVES_CACHE_MAX = 512


def alternatives(ds, basis, keep, replace, names):
    """Materials that pass against ``keep`` in place of ``replace``: best tier first, then by margin.

    Args:
        ds: the dataset (:func:`calc.dataset.current`) [unitless]
        basis: the environment's :class:`calc.series.Basis` [unitless]
        keep: the material record kept [unitless]
        replace: the material record replaced [unitless]
        names: material id -> name [unitless]

    Returns:
        ``{replace, keep, text, options, count}``: the first :data:`N_ALTERNATIVES` options, each
        with material, name, delta_E_V [V], margin_V [V], verdict and anode; count of all that pass

    References:
        The tier rule of :func:`calc.series.tier_for` applied to every material of the dataset
        (ASTM G82-98 (R2014) Fig. 1; legacy anodic-index table).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of
    >>> ds = current(); b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> steel, ss = ds.get("materials", "carbon steel"), ds.get("materials", "316")
    >>> alt = alternatives(ds, b, ss, steel, {r["id"]: r["name"] for r in ds.records("materials")})
    >>> all(o["verdict"] != "unsuited" for o in alt["options"]) and alt["count"] >= len(alt["options"])
    True
    """
    per_ds = _ALTERNATIVES_CACHE.setdefault(ds, {})
    key = (basis, keep["id"], replace["id"])
    if key not in per_ds:
        if len(per_ds) >= _ALTERNATIVES_CACHE_MAX:
            per_ds.clear()
        per_ds[key] = _rank_alternatives(ds, basis, keep, replace)
    options = per_ds[key]
    return {"replace": replace["id"], "keep": keep["id"],
            "text": f"in place of {names[replace['id']]}, against {names[keep['id']]}",
            "options": [dict(o) for o in options[:N_ALTERNATIVES]], "count": len(options)}


def _rank_alternatives(ds, basis, keep, replace):
    """Every material that passes against ``keep`` in place of ``replace``, ranked (a tuple)."""
    excluded = {keep["id"], replace["id"], keep.get("other_state"), replace.get("other_state")}
    options = []
    for rec in ds.records("materials"):
        if rec["id"] in excluded or rec.get("state") == "active" or position(rec, basis) is None:
            continue
        j = judge_pair(ds, rec, keep, basis)
        if j.tier == "unsuited":
            continue
        options.append({"material": rec["id"], "name": rec.get("name", rec["id"]),
                        "delta_E_V": round(j.primary.delta_E_V, 4),
                        "margin_V": round(basis.allowable_V - j.primary.delta_E_V, 4),
                        "verdict": j.tier, "anode": j.primary.anode})
    options.sort(key=lambda o: (TIER_RANK[o["verdict"]], -o["margin_V"], o["material"]))
    return tuple(options)
