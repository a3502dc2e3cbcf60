"""Dissimilar-metal joints in a named environment.

Which part is the anode, how far apart the two metals sit, whether that is within what the
environment allows, what the wetted-area ratio does to the attack, a screening rate, what to do
about it, and closer-matched materials from the dataset.

The environment record fixes the basis of comparison:

- ``galvanic-series``: steady corrosion potentials measured in one electrolyte, as ranges
  [active end, noble end] in V vs SCE (ASTM G82-98 (R2014) Fig. 1, reproducing F. L. LaQue,
  *Marine Corrosion: Causes and Prevention*, 1975, flowing seawater). The nominal potential of
  a material is the mid-point of its range; the more negative one is the anode. A galvanic
  series is specific to the electrolyte it was measured in (ASTM G82 §5).
- ``anodic-index``: the legacy military/industry anodic-index table (0 V gold to 1.85 V
  beryllium), with allowable differences by severity: harsh 0.15 V, normal 0.25 V, controlled
  0.50 V. The larger index is the anode.

Verdict tiers (our own names, best to worst): see :data:`TIERS` and :data:`TIER_MEANING`. The
limit is inclusive: a difference equal to the allowable passes.

Area effect (catchment principle, common practice): the cathode collects its oxygen-limited
current density i_c over its whole wetted area, and all of that current leaves through the
anode, so i_a = i_c · A_c/A_a; i_a is turned into a rate by ASTM G102 (:mod:`calc.rate`).
"""

import csv
import io
import weakref
from dataclasses import dataclass

from . import rate as g102
from .dataset import current
from .errors import DataError, InputError

#: verdict tiers, best first (our own names)
TIERS = ("matched", "compatible", "guarded", "unsuited")
#: what each tier means, in plain words
TIER_MEANING = {
    "matched": "the potentials are so close that the galvanic effect is negligible",
    "compatible": "the difference is within what this environment allows",
    "guarded": ("within the allowance as named, but the published spread of the potentials or a change "
                "between passive and active state takes it beyond: acceptable only with precautions"),
    "unsuited": ("the difference exceeds what this environment allows: the anode will corrode faster "
                 "where the metals meet; do not join them bare"),
}
_RANK = {t: i for i, t in enumerate(TIERS)}
#: tolerance on the limit comparison, so 0.65 - 0.50 counts as 0.15 [V]
EPS_V = 1e-9
#: area ratios outside [AREA_LOW, AREA_HIGH] get a warning [unitless]
AREA_LOW, AREA_HIGH = 0.001, 1000.0
#: largest area ratio accepted at all (as on the page); beyond it the screening rate overflows [unitless]
AREA_MAX = 1.0e6
#: number of alternatives listed per direction
N_ALTERNATIVES = 8

_G82 = "ASTM G82"


def _step(title, formula, substituted, result):
    return {"title": title, "formula": formula, "substituted": substituted, "result": result}


def _v(x):
    """Voltage text: 3 decimals, one trailing zero dropped (0.250 -> 0.25, 0.265 -> 0.265)."""
    s = f"{x:.3f}"
    return s[:-1] if s.endswith("0") else s


def _sig(x, n=6):
    return float(f"{x:.{n}g}")


def _plain(value):
    if isinstance(value, tuple):
        return [_plain(v) for v in value]
    if isinstance(value, list):
        return [_plain(v) for v in value]
    if isinstance(value, dict):
        return {k: _plain(v) for k, v in value.items()}
    return value


# --------------------------------------------------------------------------------------------
# basis of comparison


@dataclass(frozen=True)
class Basis:
    """How an environment compares materials, and its limits."""

    kind: str  # galvanic-series | anodic-index
    env_id: str
    env_name: str
    series: str  # electrolyte the series was measured in ('' for anodic index)
    value_field: str  # material field holding the value
    source_field: str
    confidence_field: str
    allowable_V: float
    allowable_source: str
    negligible_V: float  # or None
    severity: str  # anodic-index severity, or ''
    immersed: bool
    description: str


def _series_prefix(series):
    """Material field prefix for a series id: 'seawater-flowing' -> 'seawater'."""
    return str(series).split("-")[0].replace(" ", "_").lower()


def _immersed(env):
    """An environment is an immersed electrolyte when it says so or carries an ionic strength."""
    if "immersed" in env and env["immersed"] is not None:
        return bool(env["immersed"])
    if env.get("exposure") in ("immersed", "atmospheric"):
        return env["exposure"] == "immersed"
    return env.get("ionic_strength_mol_per_kg") is not None


def basis_of(env, series_name=None):
    """The basis of comparison and the limits of an environment record.

    Args:
        env: an environment record of the dataset [unitless]
        series_name: plain name of the electrolyte the series was measured in, for the text [unitless]

    Returns:
        a :class:`Basis` (allowable and negligible differences in [V])

    References:
        ASTM G82-98 (R2014) §5 (a galvanic series belongs to its electrolyte); legacy anodic-index
        table (harsh 0.15 V, normal 0.25 V, controlled 0.50 V).

    >>> b = basis_of({"id": "demo", "name": "Demo", "basis": "anodic-index", "severity": "harsh",
    ...               "allowable_V": 0.15, "allowable_source": "x"})
    >>> (b.kind, b.value_field, b.allowable_V)
    ('anodic-index', 'anodic_index_V', 0.15)
    """
    kind = env.get("basis")
    eid = env.get("id", "?")
    if kind not in ("galvanic-series", "anodic-index"):
        raise DataError(f"environments:{eid}:basis: {kind!r} is not galvanic-series or anodic-index")
    allow = env.get("allowable_V")
    if isinstance(allow, bool) or not isinstance(allow, (int, float)) or not allow > 0:
        raise DataError(f"environments:{eid}:allowable_V: {allow!r} is not a positive number")
    neg = env.get("negligible_V")
    neg = float(neg) if isinstance(neg, (int, float)) and not isinstance(neg, bool) else None
    name = env.get("name", eid)
    if kind == "galvanic-series":
        series = env.get("series") or eid
        prefix = _series_prefix(series)
        desc = (f"galvanic series measured in {series_name or series}: steady corrosion potentials as ranges "
                "in V vs SCE; "
                "the mid-point of a range is the nominal potential and the more negative metal is the anode")
        return Basis(kind, eid, name, series, f"{prefix}_range_V_SCE", f"{prefix}_source", f"{prefix}_confidence",
                     float(allow), env.get("allowable_source", ""), neg, env.get("severity") or "",
                     _immersed(env), desc)
    desc = ("anodic index (legacy military/industry table): one value per metal group in V, 0 for gold; "
            "the larger index is the anode; the allowable difference depends on the severity of exposure")
    return Basis(kind, eid, name, "", "anodic_index_V", "anodic_index_source", "anodic_index_confidence",
                 float(allow), env.get("allowable_source", ""), neg, env.get("severity") or "",
                 _immersed(env), desc)


@dataclass(frozen=True)
class Position:
    """Where a material sits on a basis. ``low``/``high``/``nominal`` are in 'more noble = higher'
    order (V vs SCE for a galvanic series, minus the anodic index for the index basis)."""

    material_id: str
    low: float
    high: float
    nominal: float
    shown: str  # the value as published, for the steps
    source: str
    confidence: str


def position(rec, basis):
    """Where a material sits on a basis, or None when the dataset has no value for it.

    Args:
        rec: a material record [unitless]
        basis: the :class:`Basis` of the environment [unitless]

    Returns:
        a :class:`Position` (potentials in [V vs SCE], or minus the anodic index in [V]), or None

    References:
        ASTM G82-98 (R2014) Fig. 1 (ranges); legacy anodic-index table.

    >>> b = basis_of({"id": "sw", "basis": "galvanic-series", "series": "seawater-flowing",
    ...               "allowable_V": 0.25})
    >>> position({"id": "demo-steel", "seawater_range_V_SCE": [-0.72, -0.60]}, b).nominal
    -0.66
    """
    raw = rec.get(basis.value_field)
    if raw is None:
        return None
    src = rec.get(basis.source_field) or rec.get("source") or ""
    conf = rec.get(basis.confidence_field) or rec.get("confidence") or ""
    if basis.kind == "galvanic-series":
        if (not isinstance(raw, (list, tuple)) or len(raw) != 2
                or not all(isinstance(x, (int, float)) and not isinstance(x, bool) for x in raw)):
            raise DataError(f"materials:{rec.get('id')}:{basis.value_field}: {raw!r} is not a [low, high] pair")
        lo, hi = float(min(raw)), float(max(raw))
        mid = round((lo + hi) / 2.0, 9)
        return Position(rec["id"], lo, hi, mid, f"[{_v(lo)}, {_v(hi)}] V vs SCE, mid-point {_v(mid)} V", src, conf)
    if isinstance(raw, bool) or not isinstance(raw, (int, float)):
        raise DataError(f"materials:{rec.get('id')}:{basis.value_field}: {raw!r} is not a number")
    e = -float(raw)
    return Position(rec["id"], e, e, e, f"anodic index {_v(float(raw))} V", src, conf)


# --------------------------------------------------------------------------------------------
# comparing two positions


def tier_for(delta_E_V, worst_V, allowable_V, negligible_V=None):
    """Verdict tier of a pair from its nominal and worst-case potential difference.

    ``unsuited`` when the nominal difference exceeds the allowable; otherwise ``guarded`` when the
    worst case of the published ranges exceeds it; otherwise ``matched`` when the nominal
    difference is within the negligible band, else ``compatible``. Limits are inclusive.

    Args:
        delta_E_V: nominal potential difference [V]
        worst_V: largest difference the published ranges allow [V]
        allowable_V: allowable difference of the environment [V]
        negligible_V: difference treated as negligible, or None [V]

    Returns:
        one of :data:`TIERS`

    References:
        ASTM G82-98 (R2014) §5-6 (use of a galvanic series); legacy anodic-index table limits.

    >>> tier_for(0.15, 0.15, 0.15)
    'compatible'
    >>> tier_for(0.20, 0.20, 0.15)
    'unsuited'
    >>> tier_for(0.06, 0.16, 0.25, 0.05)
    'compatible'
    >>> tier_for(0.20, 0.30, 0.25, 0.05)
    'guarded'
    """
    if delta_E_V > allowable_V + EPS_V:
        return "unsuited"
    if worst_V > allowable_V + EPS_V:
        return "guarded"
    if negligible_V is not None and delta_E_V <= negligible_V + EPS_V:
        return "matched"
    return "compatible"


@dataclass(frozen=True)
class Pairing:
    """Two positions compared: anode, cathode, differences and tier."""

    a: str
    b: str
    anode: str  # None when the nominal potentials are equal
    cathode: str
    delta_E_V: float
    best_V: float
    worst_V: float
    tier: str

    def to_dict(self):
        """Plain data for JSON."""
        return {"a": self.a, "b": self.b, "anode": self.anode, "cathode": self.cathode,
                "delta_E_V": round(self.delta_E_V, 4),
                "delta_E_range_V": [round(self.best_V, 4), round(self.worst_V, 4)], "verdict": self.tier}


def compare(p, q, basis):
    """Compare two positions on one basis.

    Args:
        p: position of the first material [V]
        q: position of the second material [V]
        basis: the environment's :class:`Basis` [unitless]

    Returns:
        a :class:`Pairing` (differences in [V])

    References:
        ASTM G82-98 (R2014) §6: the more active metal of a couple is the anode.

    >>> b = basis_of({"id": "sw", "basis": "galvanic-series", "allowable_V": 0.25, "negligible_V": 0.05})
    >>> steel = Position("demo-steel", -0.72, -0.60, -0.66, "", "", "")
    >>> ss = Position("demo-ss", -0.10, 0.0, -0.05, "", "", "")
    >>> c = compare(steel, ss, b)
    >>> (c.anode, round(c.delta_E_V, 3), round(c.best_V, 3), round(c.worst_V, 3), c.tier)
    ('demo-steel', 0.61, 0.5, 0.72, 'unsuited')
    """
    d = round(abs(p.nominal - q.nominal), 9)
    best = round(max(0.0, max(p.low, q.low) - min(p.high, q.high)), 9)
    worst = round(max(p.high - q.low, q.high - p.low), 9)
    if d <= EPS_V:
        anode = cathode = None
    elif p.nominal < q.nominal:
        anode, cathode = p.material_id, q.material_id
    else:
        anode, cathode = q.material_id, p.material_id
    return Pairing(p.material_id, q.material_id, anode, cathode, d, best, worst,
                   tier_for(d, worst, basis.allowable_V, basis.negligible_V))


def _states(ds, rec, basis):
    """The material's own position and that of its other passive/active state, where known."""
    own = position(rec, basis)
    out = [(rec, own)]
    other_id = rec.get("other_state")
    if other_id:
        try:
            other = ds.get("materials", other_id)
        except InputError:
            raise DataError(f"materials:{rec.get('id')}:other_state: unknown material {other_id!r}") from None
        op = position(other, basis)
        if op is not None:
            out.append((other, op))
    return out


def _judge(ds, rec_a, rec_b, basis):
    """Primary pairing, every state combination, and the tier after the state check."""
    states_a, states_b = _states(ds, rec_a, basis), _states(ds, rec_b, basis)
    combos = [compare(pa, pb, basis) for _, pa in states_a for _, pb in states_b]
    primary = combos[0]
    tier = primary.tier
    worse = [c for c in combos[1:] if _RANK[c.tier] >= _RANK["guarded"]]
    state_demoted = False
    if _RANK[tier] < _RANK["guarded"] and worse:
        tier, state_demoted = "guarded", True
    worst = max(combos, key=lambda c: (_RANK[c.tier], c.delta_E_V))
    return primary, combos, worst, tier, state_demoted


# --------------------------------------------------------------------------------------------
# request handling


def _check_keys(request, allowed):
    if not isinstance(request, dict):
        raise InputError("request", type(request).__name__, "a JSON object")
    unknown = sorted(set(request) - set(allowed))
    if unknown:
        raise InputError(unknown[0], request[unknown[0]], "one of the fields " + ", ".join(allowed))


def _material(ds, name, fieldname, basis, env):
    if name is None:
        raise InputError(fieldname, None, "a material id, alias or UNS number")
    rec = ds.get("materials", name, field=fieldname)
    if position(rec, basis) is None:
        what = (f"a value in the galvanic series measured in {basis.series}" if basis.kind == "galvanic-series"
                else "an anodic index")
        raise InputError(fieldname, name, f"a material with {what} (the basis of {env.get('id')})",
                         f"{rec['id']} has none in the dataset")
    return rec


def _area_ratio(value, warnings):
    if value is None:
        return 1.0, False
    allowed = f"a cathode-to-anode wetted-area ratio, a finite number above 0 and at most {AREA_MAX:g}"
    if (isinstance(value, bool) or not isinstance(value, (int, float)) or not g102.finite(value) or value <= 0
            or value > AREA_MAX):
        raise InputError("area_ratio", value, allowed)
    value = float(value)
    if value > AREA_HIGH or value < AREA_LOW:
        warnings.append({"field": "area_ratio", "message":
                         f"area ratio {value:g} is outside {AREA_LOW:g}-{AREA_HIGH:g}: check that it is the cathode's "
                         "wetted area over the anode's, in the same units"})
    return value, True


def _series_name(ds, env):
    """Plain name of the electrolyte an environment's galvanic series was measured in."""
    series = env.get("series") or env.get("id")
    try:
        return ds.get("environments", series).get("name", series)
    except InputError:
        return series


def _env_basis(ds, env):
    return basis_of(env, _series_name(ds, env) if env.get("basis") == "galvanic-series" else None)


def _basis_warnings(basis, env, ds):
    out = []
    if basis.kind == "galvanic-series" and basis.series != basis.env_id:
        series_name = _series_name(ds, env)
        out.append({"field": "env", "message":
                    f"the galvanic series used was measured in {series_name}, not in {basis.env_name}: a galvanic "
                    f"series is specific to the electrolyte it was measured in ({_G82}), so positions and the "
                    "order of close neighbours may differ here"})
    if basis.kind == "anodic-index" and basis.immersed:
        out.append({"field": "env", "message":
                    f"{basis.env_name} is an immersed electrolyte but is judged on the anodic index, a table for "
                    f"equipment in air; a galvanic series measured in that electrolyte ({_G82}) is the right basis"})
    return out


def _confidence_warnings(positions, basis, names):
    what = "position in the galvanic series" if basis.kind == "galvanic-series" else "anodic index"
    out = []
    for p in positions:
        if p.confidence == "recalled":
            out.append({"field": "material", "message":
                        f"{names[p.material_id]}: its {what} is recalled, not re-read in its source"})
    return out


def _tier_text(tier, primary, rec_a, rec_b, basis, state_worst, state_demoted, names):
    env = basis.env_name
    allow = _v(basis.allowable_V)
    d = _v(primary.delta_E_V)
    if rec_a["id"] == rec_b["id"]:
        head = f"Both parts are {names[rec_a['id']]}: there is no galvanic couple"
    elif primary.anode is None:
        head = (f"{names[rec_a['id']]} and {names[rec_b['id']]} have the same nominal potential"
                if basis.kind == "galvanic-series" else
                f"{names[rec_a['id']]} and {names[rec_b['id']]} are in the same anodic-index group")
    else:
        head = (f"{names[primary.anode]} is the anode, {d} V below {names[primary.cathode]}"
                if basis.kind == "galvanic-series" else
                f"{names[primary.anode]} is the anode: its anodic index is {d} V above that of "
                f"{names[primary.cathode]}")
    if tier == "unsuited":
        tail = (f"more than the {allow} V allowed in {env}, so it will corrode faster where the two meet "
                "unless the joint is isolated or protected")
        if primary.best_V <= basis.allowable_V + EPS_V:
            tail += f" (even though the published ranges come within {_v(primary.best_V)} V at their closest)"
        return f"{head}: {tail}."
    if tier == "guarded":
        if state_demoted:
            other = state_worst
            changed = [r for r, sid in ((rec_a, other.a), (rec_b, other.b)) if r["id"] != sid]
            part = " and ".join(names[r["id"]] for r in changed) or "a passive part"
            verb = "turn" if len(changed) > 1 else "turns"
            if all(r.get("state") == "passive" for r in changed):
                change = f"{verb} active (crevices, deposits, stagnant or de-aerated water)"
            elif all(r.get("state") == "active" for r in changed):
                change = f"{verb} passive again"
            else:
                change = f"{verb} to the other state"
            why = (f"but if {part} {change} the difference becomes {_v(other.delta_E_V)} V with "
                   f"{names.get(other.anode, 'neither')} as the anode, beyond the limit")
        else:
            why = f"but the published ranges allow up to {_v(primary.worst_V)} V, beyond the limit"
        return (f"{head}; that is within the {allow} V allowed in {env} as named, {why}: "
                "join them only with precautions.")
    if tier == "matched":
        return (f"{head}; the difference of {d} V is inside the {_v(basis.negligible_V)} V treated as negligible "
                f"in {env}, so the galvanic effect does not matter.")
    return f"{head}; that is within the {allow} V allowed in {env}, so the joint is acceptable on galvanic grounds."


# --------------------------------------------------------------------------------------------
# alternatives and mitigations


#: ranked alternatives per dataset object, then per (basis, kept part, replaced part): they do not
#: depend on the area ratio, the input a user changes most, and ranking them judges every material
#: (most of a joint assessment's time). Weak keys: a dataset that is replaced takes its entries along.
_ALTERNATIVES_CACHE = weakref.WeakKeyDictionary()
_ALTERNATIVES_CACHE_MAX = 512


def _alternatives(ds, basis, keep, replace, names):
    """Materials that pass against ``keep``: best tier first, then by margin (allowable - ΔE); top N."""
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
        if rec["id"] in excluded or rec.get("state") == "active":
            continue
        if position(rec, basis) is None:
            continue
        primary, _, _, tier, _ = _judge(ds, rec, keep, basis)
        if tier == "unsuited":
            continue
        options.append({"material": rec["id"], "name": rec.get("name", rec["id"]),
                        "delta_E_V": round(primary.delta_E_V, 4),
                        "margin_V": round(basis.allowable_V - primary.delta_E_V, 4),
                        "verdict": tier, "anode": primary.anode})
    options.sort(key=lambda o: (_RANK[o["verdict"]], -o["margin_V"], o["material"]))
    return tuple(options)


def _mitigations(tier, primary, state_demoted, state_worst, basis, area_ratio, area_given, names, have_alternatives,
                 passive_drop):
    if tier == "matched" or primary.anode is None and tier != "guarded":
        return []
    anode = names.get(primary.anode, "the anode") if primary.anode else "the more active part"
    cathode = names.get(primary.cathode, "the cathode") if primary.cathode else "the more noble part"
    small_anode = (not area_given) or area_ratio > 1.0
    out = []

    def add(mid, text, reason):
        out.append({"id": mid, "text": text, "reason": reason})

    if tier == "guarded" and state_demoted:
        drop = f" by about {_v(passive_drop)} V" if passive_drop else ""
        add("keep-passive",
            "Keep the passive part passive: no crevices, deposits, lap joints or stagnant and de-aerated pockets "
            f"where it can lose its film; there its potential falls{drop}.",
            f"the joint passes only while the passive state holds (active: {_v(state_worst.delta_E_V)} V)")
    if tier == "unsuited":
        add("isolate",
            "Break the metal path: insulating washers, sleeves and gaskets so no current passes between the two "
            "metals; check after assembly that no bolt, bond or wet deposit bridges them.",
            f"the difference of {_v(primary.delta_E_V)} V exceeds the {_v(basis.allowable_V)} V allowed")
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
    if tier == "unsuited" and have_alternatives:
        add("closer-match",
            "Choose a closer-matched pair from the alternatives listed below.",
            "materials in the dataset sit within the allowable difference of one of the parts")
    return out


CAUTIONS = (
    "Screening estimate only: it ranks a joint by published potentials and a simple area rule; it does not "
    "predict a service life.",
    "Crevices, flow velocity, temperature, biofilm (which raises the potential of stainless steels and titanium in "
    "natural seawater), deposits, coatings and geometry change real behaviour; test or survey where it matters.",
    "For structural, pressure-retaining, potable-water or other safety-relevant joints, apply the governing codes "
    "and standards and have the design reviewed by a qualified corrosion professional.",
)


# --------------------------------------------------------------------------------------------
# the screening rate


def _rate(ds, env, basis, primary, area_ratio, names, rec_by_id):
    """Catchment-area screening rate of the anode, or (None, reason)."""
    ic = env.get("cathodic_current_density_uA_per_cm2")
    if primary.anode is None:
        return None, "no anode: the two sit at the same nominal potential"
    if not ic:
        return None, (f"{basis.env_name} has no cathodic current density in the dataset (in air the wetted film, not "
                      "the metal, limits the current), so no rate is estimated")
    if primary.tier == "matched":
        return None, ("the difference is within the negligible band: the catchment estimate, which lets the cathode "
                      "run at its full oxygen-limited current, would grossly overstate the attack")
    try:
        fd = g102.material_faraday_data(rec_by_id[primary.anode], field_name="anode")
    except InputError as exc:
        return None, f"no Faraday rate for {names[primary.anode]}: {exc.hint or exc.allowed}"
    lo, hi = float(min(ic)), float(max(ic))
    ia_lo, ia_hi = lo * area_ratio, hi * area_ratio
    r_lo = g102.corrosion_rate(ia_lo, fd.equivalent_weight_g, fd.density_g_cm3)
    r_hi = g102.corrosion_rate(ia_hi, fd.equivalent_weight_g, fd.density_g_cm3)
    steps = list(fd.steps) + [
        _step("Anode current density (catchment area)", "i_a = i_c × A_c/A_a",
              f"i_a = [{lo:g}, {hi:g}] µA/cm² × {area_ratio:g}", f"i_a = [{ia_lo:.4g}, {ia_hi:.4g}] µA/cm²"),
        _step("Screening rate of the anode (ASTM G102 Eq. 1)", "CR = K1·i_a·EW/ρ, K1 = 3.27e-3 mm·g/(µA·cm·y)",
              f"CR = 3.27e-3 × [{ia_lo:.4g}, {ia_hi:.4g}] × {fd.equivalent_weight_g:.4g} / {fd.density_g_cm3:g}",
              f"CR = [{r_lo.penetration_mm_per_year:.3g}, {r_hi.penetration_mm_per_year:.3g}] mm/y"),
        _step("Mass loss of the anode (ASTM G102 Eq. 2)", "MR = K2·i_a·EW, K2 = 8.954e-3 g·cm²/(µA·m²·d)",
              f"MR = 8.954e-3 × [{ia_lo:.4g}, {ia_hi:.4g}] × {fd.equivalent_weight_g:.4g}",
              f"MR = [{r_lo.mass_loss_g_per_m2_day:.3g}, {r_hi.mass_loss_g_per_m2_day:.3g}] g/(m²·d)"),
    ]
    out = {
        "kind": "screening estimate",
        "anode": primary.anode,
        "area_ratio": area_ratio,
        "cathodic_current_density_uA_per_cm2": [lo, hi],
        "anode_current_density_uA_per_cm2": [_sig(ia_lo), _sig(ia_hi)],
        "penetration_mm_per_year": [_sig(r_lo.penetration_mm_per_year), _sig(r_hi.penetration_mm_per_year)],
        "mass_loss_g_per_m2_day": [_sig(r_lo.mass_loss_g_per_m2_day), _sig(r_hi.mass_loss_g_per_m2_day)],
        "equivalent_weight_g": fd.equivalent_weight_g,
        "density_g_cm3": fd.density_g_cm3,
        "note": "the galvanic part only: the anode's own free corrosion is not included",
        "steps": steps,
        "sources": [s for s in (env.get("cathodic_current_density_source"),) + fd.sources if s],
        "warnings": list(fd.warnings),
    }
    return out, None


# --------------------------------------------------------------------------------------------
# entry points


@dataclass(frozen=True)
class JointResult:
    """Everything the joint calculation found; :meth:`to_dict` is the JSON result."""

    data: tuple  # ((key, value), ...) in output order

    def to_dict(self):
        """Plain data for JSON."""
        return _plain(dict(self.data))


def judge_joint(a, b, env, area_ratio=None):
    """Judge a joint of two materials in a named environment.

    Args:
        a: first material: id, alias or UNS number [unitless]
        b: second material: id, alias or UNS number [unitless]
        env: environment id or alias [unitless]
        area_ratio: wetted area of the cathode over that of the anode; None assumes 1 [unitless]

    Returns:
        a :class:`JointResult` (potentials in [V], rates in [mm/y] and [g/(m²·d)])

    References:
        ASTM G82-98 (R2014) §5-6 and Fig. 1 (galvanic series in flowing seawater, after LaQue 1975);
        legacy anodic-index table; ASTM G102-89 (R2015) Eqs. (1)-(2) for the rate.

    >>> r = judge_joint("mild steel", "stainless-316-passive", "seawater-flowing").to_dict()
    >>> (r["anode"], r["verdict"])
    ('carbon-steel', 'unsuited')
    """
    ds = current()
    warnings = []
    envrec = ds.get("environments", env, field="env")
    basis = _env_basis(ds, envrec)
    rec_a = _material(ds, a, "a", basis, envrec)
    rec_b = _material(ds, b, "b", basis, envrec)
    ratio, ratio_given = _area_ratio(area_ratio, warnings)
    names = {r["id"]: r.get("name", r["id"]) for r in ds.records("materials")}
    rec_by_id = {r["id"]: r for r in ds.records("materials")}

    primary, combos, state_worst, tier, state_demoted = _judge(ds, rec_a, rec_b, basis)
    pos_a, pos_b = position(rec_a, basis), position(rec_b, basis)
    warnings += _basis_warnings(basis, envrec, ds)
    used_positions = {}
    for rec in [rec_a, rec_b] + [rec_by_id[c.a] for c in combos] + [rec_by_id[c.b] for c in combos]:
        used_positions[rec["id"]] = position(rec, basis)
    warnings += _confidence_warnings(used_positions.values(), basis, names)

    # steps
    steps = []
    if basis.kind == "galvanic-series":
        steps.append(_step("Basis of comparison",
                           "galvanic series of the environment; allowable ΔE from the environment",
                           f"{basis.env_name}: series measured in {_series_name(ds, envrec)}",
                           f"allowable {_v(basis.allowable_V)} V" +
                           (f", negligible {_v(basis.negligible_V)} V" if basis.negligible_V is not None else "")))
        for p in (pos_a, pos_b):
            steps.append(_step(f"Position of {names[p.material_id]}", "E_nom = (E_active + E_noble) / 2",
                               f"E_nom = ({_v(p.low)} + {_v(p.high)}) / 2", f"E_nom = {_v(p.nominal)} V vs SCE"))
        anode_rule = "anode = the more negative E_nom; ΔE = E_nom(cathode) − E_nom(anode)"
    else:
        steps.append(_step("Basis of comparison", "anodic index (legacy table); allowable ΔE by severity",
                           f"{basis.env_name}: severity {basis.severity or 'not stated'}",
                           f"allowable {_v(basis.allowable_V)} V"))
        for p in (pos_a, pos_b):
            steps.append(_step(f"Anodic index of {names[p.material_id]}", "from the legacy anodic-index table",
                               f"{names[p.material_id]}", f"{_v(-p.nominal)} V"))
        anode_rule = "anode = the larger anodic index; ΔE = index(anode) − index(cathode)"
    steps.append(_step("Anode and nominal difference", anode_rule,
                       f"|{_v(pos_a.nominal)} − ({_v(pos_b.nominal)})|" if basis.kind == "galvanic-series"
                       else f"|{_v(-pos_a.nominal)} − {_v(-pos_b.nominal)}|",
                       f"ΔE = {_v(primary.delta_E_V)} V, anode: {names.get(primary.anode, 'none')}"))
    if basis.kind == "galvanic-series":
        steps.append(_step("Spread from the published ranges",
                           "ΔE_best = gap between the ranges (0 if they overlap); ΔE_worst = largest separation",
                           f"ranges [{_v(pos_a.low)}, {_v(pos_a.high)}] and [{_v(pos_b.low)}, {_v(pos_b.high)}] V",
                           f"ΔE from {_v(primary.best_V)} to {_v(primary.worst_V)} V"))
    cmp_sign = "≤" if primary.delta_E_V <= basis.allowable_V + EPS_V else ">"
    steps.append(_step("Check against the allowable difference", "passes when ΔE ≤ allowable (limit inclusive)",
                       f"{_v(primary.delta_E_V)} V {cmp_sign} {_v(basis.allowable_V)} V", f"tier: {primary.tier}"))
    if len(combos) > 1:
        steps.append(_step("Other passive/active states", "each state of each part compared the same way",
                           "; ".join(f"{c.a} + {c.b}: {_v(c.delta_E_V)} V {c.tier}" for c in combos[1:]),
                           f"worst: {state_worst.a} + {state_worst.b} ({state_worst.tier})" +
                           ("; verdict lowered to guarded" if state_demoted else "")))

    # area effect and rate
    rate, rate_reason = _rate(ds, envrec, basis, primary, ratio, names, rec_by_id)
    assumptions = [
        "screening estimate from published potentials: no polarisation curves, no electrolyte resistance",
        ("nominal potential = mid-point of each published range; the range spread gives best and worst cases"
         if basis.kind == "galvanic-series" else "one anodic-index value per metal group; no spread is published"),
        "the limit is inclusive: ΔE equal to the allowable passes",
        *([f"the allowable {_v(basis.allowable_V)} V for {basis.env_name} is a rule of thumb of the trade, "
           "not a standard"] if envrec.get("allowable_source") == "common-practice" else []),
        (f"area_ratio = {ratio:g}: wetted area of the cathode over the anode" if ratio_given
         else "area_ratio not given: equal wetted areas assumed (1)"),
    ]
    if rate is not None:
        steps += rate["steps"]
        warnings += rate["warnings"]
        assumptions += [
            "catchment area: the cathode takes its whole oxygen-limited current density from the environment "
            "and all of that current leaves through the anode (i_a = i_c × A_c/A_a)",
            "the anode corrodes uniformly over its wetted area (ASTM G102); the attack is in fact concentrated next "
            "to the joint",
            "the anode's own free corrosion is not included",
        ]
        if envrec.get("cathodic_current_density_confidence") in ("recalled", "computed"):
            assumptions.append(f"the cathodic current density of {basis.env_name} is provisional "
                               f"({envrec['cathodic_current_density_confidence']}): the rate is good to its order "
                               "of magnitude at best")
        if rec_by_id[primary.anode].get("state") == "passive":
            assumptions.append("the anode is a passive alloy: its current may go into its film or concentrate at a "
                               "crevice or pit rather than spread evenly")
    if len(combos) > 1:
        assumptions.append("every passive/active state of the parts was compared; the verdict is lowered to guarded "
                           "when another state fails")

    passive_drop = None
    for rec in (rec_a, rec_b):
        sts = _states(ds, rec, basis)
        if len(sts) > 1:
            passive_drop = max(passive_drop or 0.0, abs(sts[0][1].nominal - sts[1][1].nominal))

    alternatives = [_alternatives(ds, basis, rec_b, rec_a, names), _alternatives(ds, basis, rec_a, rec_b, names)]
    have_alt = any(x["options"] for x in alternatives)
    mitigations = _mitigations(tier, primary, state_demoted, state_worst, basis, ratio, ratio_given, names, have_alt,
                               passive_drop)

    sources = []
    for p in used_positions.values():
        if p is not None and p.source:
            sources.append(p.source)
    if basis.allowable_source:
        sources.append(basis.allowable_source)
    if envrec.get("negligible_source"):
        sources.append(envrec["negligible_source"])
    if rate is not None:
        sources += rate["sources"]
    if rate is not None and ds.source("astm-g102"):
        sources.append("astm-g102")
    sources = list(dict.fromkeys(sources))

    area_text = None
    if primary.anode is not None:
        if ratio > 1.0:
            area_text = (f"the cathode has {ratio:g} times the anode's wetted area: the anode's attack is "
                         f"{ratio:g} times what equal areas would give (unfavourable)")
        elif ratio < 1.0:
            area_text = (f"the cathode has {ratio:g} times the anode's wetted area: the attack is spread over a large "
                         "anode (favourable)")
        else:
            area_text = "equal wetted areas"

    verdict_text = _tier_text(tier, primary, rec_a, rec_b, basis, state_worst, state_demoted, names)
    data = (
        ("a", rec_a["id"]), ("b", rec_b["id"]), ("env", envrec["id"]),
        ("anode", primary.anode), ("cathode", primary.cathode),
        ("anode_name", names.get(primary.anode)), ("cathode_name", names.get(primary.cathode)),
        ("basis", basis.kind),
        ("basis_description", basis.description),
        ("basis_source", pos_a.source or pos_b.source or None),
        ("basis_sources", list(dict.fromkeys(s for s in (pos_a.source, pos_b.source) if s))),
        ("series", basis.series or None), ("severity", basis.severity or None),
        ("positions", {rec_a["id"]: {"value": pos_a.shown, "nominal_V": -pos_a.nominal if basis.kind == "anodic-index"
                                     else pos_a.nominal,
                                     "range_V": None if basis.kind == "anodic-index" else [pos_a.low, pos_a.high]},
                       rec_b["id"]: {"value": pos_b.shown, "nominal_V": -pos_b.nominal if basis.kind == "anodic-index"
                                     else pos_b.nominal,
                                     "range_V": None if basis.kind == "anodic-index" else [pos_b.low, pos_b.high]}}),
        ("delta_E_V", round(primary.delta_E_V, 4)),
        ("delta_E_range_V", [round(primary.best_V, 4), round(primary.worst_V, 4)]),
        ("allowable_V", basis.allowable_V), ("allowable_source", basis.allowable_source or None),
        ("negligible_V", basis.negligible_V),
        ("passes", primary.delta_E_V <= basis.allowable_V + EPS_V),
        ("verdict", tier), ("verdict_text", verdict_text), ("verdict_meaning", TIER_MEANING[tier]),
        ("states", [c.to_dict() for c in combos]),
        ("worst_state", state_worst.to_dict()),
        ("area_ratio", ratio), ("area_ratio_given", ratio_given), ("area_effect", area_text),
        ("rate_mm_per_year", rate["penetration_mm_per_year"] if rate else None),
        ("rate", ({k: v for k, v in rate.items() if k not in ("steps", "sources", "warnings")} if rate else None)),
        ("rate_reason", rate_reason),
        ("assumptions", assumptions),
        ("mitigations", mitigations),
        ("alternatives", alternatives),
        ("cautions", list(CAUTIONS)),
        ("steps", steps), ("warnings", warnings), ("sources", sources),
        ("data_version", ds.version),
    )
    return JointResult(data)


_JOINT_KEYS = ("a", "b", "env", "area_ratio")


def joint_entry(request):
    """JSON entry point: judge a joint of two materials in an environment.

    Args:
        request: ``{"a": material, "b": material, "env": environment, "area_ratio": A_c/A_a (optional)}`` [unitless]

    Returns:
        dict: anode, cathode, basis (with basis_description, basis_source), delta_E_V [V], delta_E_range_V [V],
        allowable_V [V], allowable_source, negligible_V [V],
        verdict, verdict_text, states, worst_state, area_ratio, rate_mm_per_year [mm/y], rate, assumptions,
        mitigations, alternatives, cautions, steps, warnings, sources, data_version

    References:
        ASTM G82-98 (R2014); legacy anodic-index table; ASTM G102-89 (R2015) Eqs. (1)-(2).

    >>> r = joint_entry({"a": "zinc", "b": "mild steel", "env": "seawater-flowing", "area_ratio": 1})
    >>> (r["anode"], r["cathode"])
    ('zinc', 'carbon-steel')
    """
    _check_keys(request, _JOINT_KEYS)
    for key in ("a", "b", "env"):
        if key not in request:
            raise InputError(key, None, "an environment id" if key == "env" else "a material id, alias or UNS number")
    return judge_joint(request["a"], request["b"], request["env"], request.get("area_ratio")).to_dict()


# --------------------------------------------------------------------------------------------
# matrix


#: the columns of each entry of a matrix result's ``pairs``
PAIR_FIELDS = ("a", "b", "delta_E_V", "verdict", "anode")


@dataclass(frozen=True)
class MatrixResult:
    """All pairs of a list of materials in one environment; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON (the pairs are copied row by row: they are flat already)."""
        return {k: [list(p) for p in v] if k == "pairs" else _plain(v) for k, v in self.data}


def galvanic_matrix(env, materials=None, with_csv=False):
    """Every pair of a list of materials judged in one environment.

    Each pair is listed once (the upper triangle, ``a`` before ``b`` in the order of the
    materials) as ``[a, b, delta_E_V, verdict, anode]`` (:data:`PAIR_FIELDS`): ``a``, ``b``
    and ``anode`` are indices into ``materials`` (``anode`` None when the nominal potentials are
    equal). A material with itself is no couple and is not listed.

    Args:
        env: environment id or alias [unitless]
        materials: material ids, aliases or UNS numbers; None takes every material with data for the basis [unitless]
        with_csv: also write the pairs as CSV text (``csv``, material ids instead of indices) [unitless]

    Returns:
        a :class:`MatrixResult` (pairs with delta_E_V in [V], verdict, anode; counts; csv text when asked)

    References:
        as :func:`judge_joint` (ASTM G82-98 (R2014); legacy anodic-index table).

    >>> m = galvanic_matrix("seawater-flowing", ["zinc", "mild steel"]).to_dict()
    >>> a, b, dE, verdict, anode = m["pairs"][0]
    >>> m["materials"][anode], verdict
    ('zinc', 'unsuited')
    >>> "csv" in m, galvanic_matrix("seawater-flowing", ["zinc", "mild steel"], True).to_dict()["csv"].splitlines()[2]
    (False, 'zinc,carbon-steel,zinc,0.3450,unsuited')
    """
    ds = current()
    envrec = ds.get("environments", env, field="env")
    basis = _env_basis(ds, envrec)
    all_recs = ds.records("materials")
    if materials is None:
        recs = [r for r in all_recs if position(r, basis) is not None]
    else:
        if not isinstance(materials, (list, tuple)) or not materials:
            raise InputError("materials", materials, "a non-empty list of material ids")
        if len(materials) > 500:
            raise InputError("materials", f"{len(materials)} items", "at most 500 materials")
        recs, seen = [], set()
        for k, name in enumerate(materials):
            rec = _material(ds, name, f"materials[{k}]", basis, envrec)
            if rec["id"] not in seen:
                seen.add(rec["id"])
                recs.append(rec)
    ids = [r["id"] for r in recs]
    n = len(ids)
    allow, neg = basis.allowable_V, basis.negligible_V
    # precomputed per material: (nominal, low, high) of each state, own state first
    vals = []
    for r in recs:
        sts = _states(ds, r, basis)
        vals.append([(p.nominal, p.low, p.high) for _, p in sts])
    lim = allow + EPS_V
    neg_lim = None if neg is None else neg + EPS_V

    def tier(pa, pb):
        d = pa[0] - pb[0]
        d = -d if d < 0 else d
        if d > lim:
            return "unsuited", d
        w1, w2 = pa[2] - pb[1], pb[2] - pa[1]
        if (w1 if w1 > w2 else w2) > lim:
            return "guarded", d
        if neg_lim is not None and d <= neg_lim:
            return "matched", d
        return "compatible", d

    counts = dict.fromkeys(TIERS, 0)
    pairs = []
    for i in range(n):
        vi = vals[i]
        for j in range(i + 1, n):
            vj = vals[j]
            t, d = tier(vi[0], vj[0])
            if t in ("matched", "compatible") and (len(vi) > 1 or len(vj) > 1):
                for si, pa in enumerate(vi):
                    for sj, pb in enumerate(vj):
                        if (si or sj) and tier(pa, pb)[0] in ("guarded", "unsuited"):
                            t = "guarded"
            d = round(d, 6)
            anode = None if d <= EPS_V else (i if vi[0][0] < vj[0][0] else j)
            counts[t] += 1
            pairs.append((i, j, round(d, 4), t, anode))
    warnings = _basis_warnings(basis, envrec, ds)
    sources = list(dict.fromkeys(
        [s for r in recs for s in (r.get(basis.source_field),) if s] +
        [s for s in (basis.allowable_source, envrec.get("negligible_source")) if s]))
    steps = [
        _step("Basis of comparison", basis.description, f"{basis.env_name}",
              f"allowable {_v(allow)} V" + (f", negligible {_v(neg)} V" if neg is not None else "")),
        _step("Each pair", ("ΔE = |E_nom(a) − E_nom(b)|, E_nom = mid-point of the published range"
                            if basis.kind == "galvanic-series" else "ΔE = |index(a) − index(b)|"),
              f"{n} materials, {n * (n - 1) // 2} pairs",
              ", ".join(f"{counts[t]} {t}" for t in TIERS)),
        _step("Tiers", "unsuited: ΔE > allowable; guarded: passes but the range spread or another passive/active "
              "state fails; matched: ΔE ≤ negligible; otherwise compatible", "limit inclusive", ""),
    ]
    data = [
        ("env", envrec["id"]), ("basis", basis.kind), ("allowable_V", allow), ("negligible_V", neg),
        ("materials", ids), ("names", [r.get("name", r["id"]) for r in recs]),
        ("pair_fields", list(PAIR_FIELDS)), ("pairs", pairs), ("counts", counts),
    ]
    if with_csv:
        data.append(("csv", _pairs_csv(envrec, basis, ds, ids, pairs)))
    data += [
        ("tiers", [{"id": t, "meaning": TIER_MEANING[t]} for t in TIERS]),
        ("cautions", list(CAUTIONS)),
        ("steps", steps), ("warnings", warnings), ("sources", sources), ("data_version", ds.version),
    ]
    return MatrixResult(tuple(data))


def _pairs_csv(envrec, basis, ds, ids, pairs):
    """The pairs as CSV text: a comment line (environment, basis, data version), then a, b, anode, ΔE, verdict."""
    buf = io.StringIO()
    buf.write(f"# Couplewise pair table: environment {envrec['id']}, basis {basis.kind}, allowable "
              f"{_v(basis.allowable_V)} V, data version {ds.version}\n")
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["a", "b", "anode", "delta_E_V", "verdict"])
    for i, j, d, t, anode in pairs:
        writer.writerow([ids[i], ids[j], "" if anode is None else ids[anode], f"{d:.4f}", t])
    return buf.getvalue()


_MATRIX_KEYS = ("env", "materials", "csv")


def matrix_entry(request):
    """JSON entry point: every pair of materials in one environment.

    Args:
        request: ``{"env": environment, "materials": [ids] (optional), "csv": true (optional)}`` [unitless]

    Returns:
        dict: env, basis, allowable_V, negligible_V, materials, names, pair_fields, pairs (indices a, b,
        delta_E_V [V], verdict, anode index), counts, csv (only when asked), tiers, cautions, steps,
        warnings, sources, data_version

    References:
        as :func:`judge_joint`.

    >>> m = matrix_entry({"env": "seawater-flowing"})
    >>> n = len(m["materials"]); len(m["pairs"]) == n * (n - 1) // 2
    True
    """
    _check_keys(request, _MATRIX_KEYS)
    if "env" not in request:
        raise InputError("env", None, "an environment id")
    with_csv = request.get("csv")
    if with_csv is not None and not isinstance(with_csv, bool):
        raise InputError("csv", with_csv, "true or false (whether to add the pairs as CSV text)")
    return galvanic_matrix(request["env"], request.get("materials"), bool(with_csv)).to_dict()
