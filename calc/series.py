"""Galvanic series positions, the comparison of two of them, and the verdict tiers of a pair.

The environment record fixes the basis of comparison:

- ``galvanic-series``: steady corrosion potentials measured in one electrolyte, as ranges
  [active end, noble end] in V vs SCE (ASTM G82-98 (R2014) Fig. 1, reproducing F. L. LaQue,
  *Marine Corrosion: Causes and Prevention*, 1975, flowing seawater). The nominal potential of
  a material is the mid-point of its range; the more negative one is the anode. A galvanic
  series is specific to the electrolyte it was measured in (ASTM G82 §5; MIL-STD-889B
  Notice 1, 1979, §5.1.2): where an environment's electrolyte is not the series' one, the basis
  says so (:func:`series_caveat`) and every result carries the warning.
- ``anodic-index``: the legacy military/industry anodic-index table (0 V gold to 1.85 V
  beryllium), with allowable differences by severity class (harsh, normal, controlled; the
  values are data, in each environment's ``allowable_V``). The larger index is the anode.

The allowable difference of every environment is the one of its severity class, and an
environment in continuous contact with an electrolyte takes the harsh class
(:data:`calc.scope.IMMERSION_RULE`), so immersion is never judged more leniently than any atmosphere.
The tier rule is written here once (:func:`tier_for`): the joint, the matrix, the alternatives
and the measured joint all call it.
"""

from dataclasses import dataclass

from .errors import DataError, InputError
from .basis import Basis, basis_of  # noqa: F401 -- its own module; callers import it from here too

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
#: tier -> its place in :data:`TIERS` (0 best)
TIER_RANK = {t: i for i, t in enumerate(TIERS)}
#: tolerance on the limit comparison, so 0.65 - 0.50 counts as 0.15 [V]
EPS_V = 1e-9

def midpoint(range_V):
    """Nominal potential of a published range: its mid-point, or None when it is not a pair.

    Args:
        range_V: ``[active end, noble end]`` of a galvanic-series range [V vs SCE]

    Returns:
        (low + high) / 2 rounded to 1e-9 V [V vs SCE], or None

    References:
        ASTM G82-98 (R2014) §5 and Fig. 1 (a material's position is a range; we take its mid-point).

    >>> midpoint([-0.72, -0.60]), midpoint(None)
    (-0.66, None)
    """
    if not isinstance(range_V, (list, tuple)) or len(range_V) != 2:
        return None
    return round((float(range_V[0]) + float(range_V[1])) / 2.0, 9)


def tier_for(delta_E_V, worst_V, allowable_V, negligible_V=None, state_fail=False):
    """Verdict tier of a pair from its nominal and worst-case potential difference.

    ``unsuited`` when the nominal difference exceeds the allowable; otherwise ``guarded`` when the
    worst case of the published ranges exceeds it, or a change of passive/active state does
    (``state_fail``); otherwise ``matched`` when the nominal difference is within the negligible
    band, else ``compatible``. Limits are inclusive.

    Args:
        delta_E_V: nominal potential difference [V]
        worst_V: largest difference the published ranges allow [V]
        allowable_V: allowable difference of the environment [V]
        negligible_V: difference treated as negligible, or None [V]
        state_fail: whether the other state of a passive/active alloy exceeds the allowable [unitless]

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
    >>> tier_for(0.03, 0.03, 0.25, 0.05, state_fail=True)
    'guarded'
    """
    if delta_E_V > allowable_V + EPS_V:
        return "unsuited"
    if state_fail or worst_V > allowable_V + EPS_V:
        return "guarded"
    if negligible_V is not None and delta_E_V <= negligible_V + EPS_V:
        return "matched"
    return "compatible"


# --------------------------------------------------------------------------------------------
# positions


@dataclass(frozen=True)
class Position:
    """Where a material sits on a basis. ``low``/``high``/``nominal`` are in 'more noble = higher'
    order (V vs SCE for a galvanic series, minus the anodic index for the index basis)."""

    material_id: str
    low: float
    high: float
    nominal: float
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
        return Position(rec["id"], lo, hi, midpoint((lo, hi)), src, conf)
    if isinstance(raw, bool) or not isinstance(raw, (int, float)):
        raise DataError(f"materials:{rec.get('id')}:{basis.value_field}: {raw!r} is not a number")
    e = -float(raw)
    return Position(rec["id"], e, e, e, src, conf)


def material_on(ds, name, field, basis):
    """The record of a named material that has a position on the basis, or an InputError saying why not.

    Args:
        ds: the dataset (:func:`calc.dataset.current`) [unitless]
        name: material id, alias or UNS number as given [unitless]
        field: the request field, for the message [unitless]
        basis: the environment's :class:`Basis` [unitless]

    Returns:
        the material record

    References:
        ASTM G82-98 (R2014) Fig. 1 (the materials of the series); legacy anodic-index table.

    >>> from calc.dataset import current
    >>> ds = current()
    >>> material_on(ds, "mild steel", "a", basis_of(ds.get("environments", "seawater-flowing"), ds))["id"]
    'carbon-steel'
    """
    if name is None:
        raise InputError(field, None, "a material id, alias or UNS number")
    rec = ds.get("materials", name, field=field)
    if position(rec, basis) is None:
        what = (f"a value in the galvanic series measured in {basis.series}" if basis.kind == "galvanic-series"
                else "an anodic index")
        raise InputError(field, name, f"a material with {what} (the basis of {basis.env_id})",
                         f"{rec['id']} has none in the dataset")
    return rec


def states(ds, rec, basis):
    """The material's own position and that of its other passive/active state, where known.

    Args:
        ds: the dataset (:func:`calc.dataset.current`) [unitless]
        rec: a material record with a position on the basis [unitless]
        basis: the environment's :class:`Basis` [unitless]

    Returns:
        a list of (record, :class:`Position`), the material's own state first (potentials in [V])

    References:
        ASTM G82-98 (R2014) Fig. 1 (active and passive ranges of stainless steels and nickel alloys).

    >>> from calc.dataset import current
    >>> ds = current()
    >>> b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> [r["id"] for r, _ in states(ds, ds.get("materials", "316"), b)]
    ['stainless-316-passive', 'stainless-316-active']
    """
    out = [(rec, position(rec, basis))]
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


# --------------------------------------------------------------------------------------------
# comparing two positions


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
    >>> steel = Position("demo-steel", -0.72, -0.60, -0.66, "", "")
    >>> ss = Position("demo-ss", -0.10, 0.0, -0.05, "", "")
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


@dataclass(frozen=True)
class Judgement:
    """A pair judged in every passive/active state of its parts."""

    primary: Pairing  # the parts as named
    combos: tuple  # every state combination, the primary first
    worst: Pairing  # the worst combination
    tier: str  # the verdict after the state check
    state_demoted: bool  # lowered to guarded because another state fails


def judge_pair(ds, rec_a, rec_b, basis):
    """Judge two materials in each of their states: lowered to guarded when another state fails.

    Args:
        ds: the dataset (:func:`calc.dataset.current`) [unitless]
        rec_a: first material record, with a position on the basis [unitless]
        rec_b: second material record, with a position on the basis [unitless]
        basis: the environment's :class:`Basis` [unitless]

    Returns:
        a :class:`Judgement` (differences in [V])

    References:
        ASTM G82-98 (R2014) Fig. 1 and §6 (active and passive ranges; the more active metal is the anode).

    >>> from calc.dataset import current
    >>> ds = current()
    >>> b = basis_of(ds.get("environments", "seawater-flowing"), ds)
    >>> j = judge_pair(ds, ds.get("materials", "alloy-400"), ds.get("materials", "316"), b)
    >>> (j.primary.tier, j.tier, j.state_demoted, j.worst.b)
    ('matched', 'guarded', True, 'stainless-316-active')
    """
    combos = tuple(compare(pa, pb, basis) for _, pa in states(ds, rec_a, basis) for _, pb in states(ds, rec_b, basis))
    primary = combos[0]
    state_fail = any(TIER_RANK[c.tier] >= TIER_RANK["guarded"] for c in combos[1:])
    tier = tier_for(primary.delta_E_V, primary.worst_V, basis.allowable_V, basis.negligible_V, state_fail)
    worst = max(combos, key=lambda c: (TIER_RANK[c.tier], c.delta_E_V))
    return Judgement(primary, combos, worst, tier, state_fail and TIER_RANK[primary.tier] < TIER_RANK["guarded"])
