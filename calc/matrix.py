"""The pair table: every pair of a list of materials judged in one environment.

Each pair gets the verdict of :func:`calc.series.tier_for`, as a joint of the two would
(:mod:`calc.joint`), including the passive/active state check; the table is computed from the
positions directly so that all pairs of the ~50 materials of a series take a few milliseconds.
"""

import copy
import csv
import io
from dataclasses import dataclass

from . import service as svc
from .advice import CAUTIONS, SACRIFICIAL_RULE, basis_warnings, sacrificial_by_design, volts
from .dataset import current
from .derivation import Derivation
from .errors import InputError
from .matrixservice import service_table
from .requests import read
from .series import EPS_V, TIER_MEANING, TIER_RANK, TIERS, basis_of, material_on, position, states, tier_for

#: the columns of each entry of a matrix result's ``pairs``
PAIR_FIELDS = ("a", "b", "delta_E_V", "verdict", "anode")
#: the columns of each entry of a matrix result's ``details`` (one per pair, in the order of ``pairs``)
DETAIL_FIELDS = ("best_V", "worst_V", "why", "other_state_V", "by_design")
#: why a pair got its verdict: code -> meaning (the codes of a result's ``details``)
WHY = {
    "over": "the nominal difference exceeds the allowable",
    "range": "the nominal difference is within the allowable, but the published ranges of the two allow a "
             "difference beyond it",
    "state": "the parts as named are within the allowable, but with another passive/active state of a part (a "
             "stainless steel turning active in a crevice, for instance) the pair no longer passes cleanly: its "
             "difference, or the spread of its published ranges, exceeds the allowable",
    "negligible": "the nominal difference is within the band treated as negligible",
    "within": "the difference is within the allowable, the published ranges included",
}
#: most materials in one table
MATERIALS_MAX = 500


@dataclass(frozen=True)
class MatrixResult:
    """All pairs of a list of materials in one environment; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON (the pairs are copied row by row: they are flat already)."""
        return {k: [list(p) for p in v] if k in ("pairs", "details") else copy.deepcopy(v) for k, v in self.data}


#: the service conditions a matrix takes (the anode area of the IR term is a joint's)
MATRIX_SERVICE = tuple(k for k in svc.SERVICE_FIELDS if k != "anode_area_cm2")


def _materials(ds, materials, basis):
    """The records of the materials asked for (each once, in order), or every one with a position."""
    if materials is None:
        return [r for r in ds.records("materials") if position(r, basis) is not None]
    if not isinstance(materials, (list, tuple)) or not materials:
        raise InputError("materials", materials, "a non-empty list of material ids")
    if len(materials) > MATERIALS_MAX:
        raise InputError("materials", f"{len(materials)} items", f"at most {MATERIALS_MAX} materials")
    recs, seen = [], set()
    for k, name in enumerate(materials):
        rec = material_on(ds, name, f"materials[{k}]", basis)
        if rec["id"] not in seen:
            seen.add(rec["id"])
            recs.append(rec)
    return recs


def _spread(pa, pb):
    """Nominal and worst-case difference of two (nominal, low, high) positions [V]."""
    d = pa[0] - pb[0]
    w1, w2 = pa[2] - pb[1], pb[2] - pa[1]
    return (-d if d < 0 else d), (w1 if w1 > w2 else w2)


def _pairs(vals, basis):
    """Every pair (i < j) as (i, j, ΔE, verdict, anode index), the count of each verdict, and the
    detail of each pair (best and worst ΔE of the ranges, why the verdict, ΔE of the worst other state)."""
    allow, neg = basis.allowable_V, basis.negligible_V
    guarded = TIER_RANK["guarded"]

    def worst_other_state(vi, vj):
        """ΔE of the worst combination of other passive/active states that does not pass cleanly (guarded or
        unsuited), or None."""
        worst = None
        for si, pa in enumerate(vi):
            for sj, pb in enumerate(vj):
                if si or sj:
                    d, w = _spread(pa, pb)
                    if TIER_RANK[tier_for(d, w, allow, neg)] >= guarded and (worst is None or d > worst):
                        worst = d
        return worst

    counts = dict.fromkeys(TIERS, 0)
    pairs, details = [], []
    for i, vi in enumerate(vals):
        for j in range(i + 1, len(vals)):
            vj = vals[j]
            d, worst = _spread(vi[0], vj[0])
            t = tier_for(d, worst, allow, neg)
            other = worst_other_state(vi, vj) if len(vi) > 1 or len(vj) > 1 else None
            if TIER_RANK[t] < guarded and other is not None:
                t = tier_for(d, worst, allow, neg, state_fail=True)
            why = _why(t, d, worst, basis)
            d = round(d, 6)
            anode = None if d <= EPS_V else (i if vi[0][0] < vj[0][0] else j)
            counts[t] += 1
            pairs.append((i, j, round(d, 4), t, anode))
            best = max(0.0, max(vi[0][1], vj[0][1]) - min(vi[0][2], vj[0][2]))
            details.append([round(best, 4), round(worst, 4), why, None if other is None else round(other, 4)])
    return pairs, counts, details


def _why(tier, d, worst, basis):
    """The code of :data:`WHY` that says why a pair got its tier."""
    if tier == "unsuited":
        return "over"
    if tier == "guarded":
        return "range" if worst > basis.allowable_V + EPS_V else "state"
    return "negligible" if tier == "matched" else "within"


def _by_design(recs, pairs, basis):
    """Per pair, whether a failing pair is a sacrificial anode or coating on steel (:func:`calc.advice.sacrificial_by_design`)."""
    out = []
    for i, j, _, t, anode in pairs:
        if anode is None or TIER_RANK[t] < TIER_RANK["guarded"]:
            out.append(False)
            continue
        out.append(sacrificial_by_design(recs[anode], recs[j if anode == i else i], basis) is not None)
    return out


def _steps(basis, n, counts):
    d = Derivation()
    neg = basis.negligible_V
    d.step("Basis of comparison", basis.description, f"{basis.env_name}",
           f"allowable {volts(basis.allowable_V)} V" + (f", negligible {volts(neg)} V" if neg is not None else ""))
    d.step("Each pair", ("ΔE = |E_nom(a) − E_nom(b)|, E_nom = mid-point of the published range"
                         if basis.kind == "galvanic-series" else "ΔE = |index(a) − index(b)|"),
           f"{n} materials, {n * (n - 1) // 2} pairs", ", ".join(f"{counts[t]} {t}" for t in TIERS))
    d.step("Tiers", "unsuited: ΔE > allowable; guarded: passes but the range spread or another passive/active "
           "state fails; matched: ΔE ≤ negligible; otherwise compatible", "limit inclusive", "")
    return d.steps


def galvanic_matrix(env, materials=None, with_csv=False, service=None):
    """Every pair of a list of materials judged in one environment.

    Each pair is listed once (the upper triangle, ``a`` before ``b`` in the order of the
    materials) as ``[a, b, delta_E_V, verdict, anode]`` (:data:`PAIR_FIELDS`): ``a``, ``b``
    and ``anode`` are indices into ``materials`` (``anode`` None when the nominal potentials are
    equal). A material with itself is no couple and is not listed.

    Args:
        env: environment id or alias [unitless]
        materials: material ids, aliases or UNS numbers; None takes every material with data for the basis [unitless]
        with_csv: also write the pairs as CSV text (``csv``, material ids instead of indices) [unitless]
        service: stated service conditions (:data:`MATRIX_SERVICE`), None: the defaults [°C, g/kg, m/s]

    With a service model (:mod:`calc.service`), each material's state and each pair's mixed-potential
    answer are added (:func:`calc.matrixservice.service_table`).

    Each pair also has its ``details`` (:data:`DETAIL_FIELDS`, in the order of ``pairs``): the
    best and worst differences of the published ranges, the code of :data:`WHY` that says why it
    got its verdict, the difference of the worst failing other passive/active state (or None),
    and whether a failing pair is a sacrificial anode or coating on steel by design
    (:func:`calc.advice.sacrificial_by_design`; the verdict itself is unchanged).

    Returns:
        a :class:`MatrixResult` (pairs with delta_E_V in [V], verdict, anode; details with best_V and
        worst_V in [V]; counts; csv text when asked)

    References:
        as :func:`calc.joint.judge_joint` (ASTM G82-98 (R2014); legacy anodic-index table).

    >>> m = galvanic_matrix("seawater-flowing", ["zinc", "mild steel"]).to_dict()
    >>> a, b, dE, verdict, anode = m["pairs"][0]
    >>> m["materials"][anode], verdict
    ('zinc', 'unsuited')
    >>> "csv" in m, galvanic_matrix("seawater-flowing", ["zinc", "mild steel"], True).to_dict()["csv"].splitlines()[2]
    (False, 'zinc,carbon-steel,zinc,0.3450,unsuited')
    >>> dict(zip(m["detail_fields"], m["details"][0]))["by_design"]
    True
    """
    ds = current()
    envrec = ds.get("environments", env, field="env")
    basis = basis_of(envrec, ds)
    recs = _materials(ds, materials, basis)
    ids = [r["id"] for r in recs]
    # per material: (nominal, low, high) of each state, own state first
    vals = [[(p.nominal, p.low, p.high) for _, p in states(ds, r, basis)] for r in recs]
    pairs, counts, details = _pairs(vals, basis)
    for row, flag in zip(details, _by_design(recs, pairs, basis)):
        row.append(flag)
    sources = list(dict.fromkeys(
        [s for r in recs for s in (r.get(basis.source_field),) if s] +
        [s for s in (basis.allowable_source, envrec.get("negligible_source")) if s]))
    data = [
        ("env", envrec["id"]), ("basis", basis.kind), ("allowable_V", basis.allowable_V),
        ("negligible_V", basis.negligible_V),
        ("materials", ids), ("names", [r.get("name", r["id"]) for r in recs]),
        ("pair_fields", list(PAIR_FIELDS)), ("pairs", pairs), ("counts", counts),
        ("detail_fields", list(DETAIL_FIELDS)), ("details", details), ("why", dict(WHY)),
        ("by_design_rule", {"text": SACRIFICIAL_RULE, "source": "common-practice"}),
    ]
    if with_csv:
        data.append(("csv", _pairs_csv(basis, ds, ids, pairs)))
    data += list(service_table(ds, envrec, basis, recs, service or {}).items())
    data += [
        ("tiers", [{"id": t, "meaning": TIER_MEANING[t]} for t in TIERS]),
        ("cautions", list(CAUTIONS)),
        ("steps", _steps(basis, len(ids), counts)), ("warnings", basis_warnings(basis)), ("sources", sources),
        ("data_version", ds.version),
    ]
    return MatrixResult(tuple(data))


def _pairs_csv(basis, ds, ids, pairs):
    """The pairs as CSV text: a comment line (environment, basis, data version), then a, b, anode, ΔE, verdict."""
    buf = io.StringIO()
    buf.write(f"# Couplewise pair table: environment {basis.env_id}, basis {basis.kind}, allowable "
              f"{volts(basis.allowable_V)} V, data version {ds.version}\n")
    writer = csv.writer(buf, lineterminator="\n")
    writer.writerow(["a", "b", "anode", "delta_E_V", "verdict"])
    for i, j, d, t, anode in pairs:
        writer.writerow([ids[i], ids[j], "" if anode is None else ids[anode], f"{d:.4f}", t])
    return buf.getvalue()


def matrix_entry(request):
    """JSON entry point: every pair of materials in one environment.

    Args:
        request: ``{"env"}``, optional materials, csv and :data:`MATRIX_SERVICE` [unitless, °C, m/s]

    Returns:
        dict: env, basis, allowable_V, negligible_V, materials, names, pair_fields, pairs (indices a, b,
        delta_E_V [V], verdict, anode index), counts, detail_fields, details (per pair: best_V [V],
        worst_V [V], why, other_state_V [V], by_design), why (code -> meaning), by_design_rule,
        csv (only when asked), and with a service model service_conditions, oxygen_supply, states_used,
        service_pair_fields, service_pairs (per pair: anode index, E_couple [V vs SCE], attack and uncoupled
        rate [mm/y]), service_pairs_reason, service_warnings; tiers, cautions, steps, warnings, sources,
        data_version

    References:
        as :func:`calc.joint.judge_joint`.

    >>> m = matrix_entry({"env": "seawater-flowing"})
    >>> n = len(m["materials"]); len(m["pairs"]) == n * (n - 1) // 2
    True
    """
    read(request, "matrix", {"env": "an environment id"}, ("materials", "csv") + MATRIX_SERVICE)
    with_csv = request.get("csv")
    if with_csv is not None and not isinstance(with_csv, bool):
        raise InputError("csv", with_csv, "true or false (whether to add the pairs as CSV text)")
    return galvanic_matrix(request["env"], request.get("materials"), bool(with_csv), svc.stated(request)).to_dict()
