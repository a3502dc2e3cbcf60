"""The pair table at the service conditions: each material's state, and each pair's mixed-potential answer.

For a matrix in an environment with a service model (:mod:`calc.service`), every material is
judged in the state its passivity allows at the service temperature and chloride
(:func:`calc.partstate.part_state`), and every pair of equal wetted areas is solved by the same
mixed-potential solver as a joint (:func:`calc.kinetics.mixed_potential`) with the dataset's
polarization parameters (:mod:`calc.polarization`): which part is the anode there, the couple
potential, the anode's attack by ASTM G102 and its uncoupled rate. The series verdicts of the
table are untouched (the quick first look). Up to :data:`PAIRS_MATERIALS_MAX` materials are solved
pair by pair; a larger table gets the states only, and says so.
"""

from . import rate as g102
from .errors import InputError
from .kinetics import dissolution_density, free_corrosion, mixed_potential
from .partstate import part_state, series_range_warning
from .polarization import part_kinetics, record_for
from .service import read_service

#: most materials whose pairs are all solved (a pair a few milliseconds: 20 materials, 190 pairs) [unitless]
PAIRS_MATERIALS_MAX = 20
#: the columns of each entry of ``service_pairs`` (one per pair, in the order of ``pairs``)
SERVICE_PAIR_FIELDS = ("anode", "couple_potential_V_SCE", "anode_attack_mm_per_year", "anode_uncoupled_mm_per_year")


def _rate(i_A_per_cm2, fd):
    return g102.corrosion_rate(i_A_per_cm2 * 1e6, fd.equivalent_weight_g, fd.density_g_cm3).penetration_mm_per_year


def _material_kinetics(ds, rec, service):
    """(electrode of 1 cm², free (E, i), Faraday data) of a material at the service conditions, or None."""
    pol = record_for(ds, rec["id"], service.electrolyte)
    if pol is None:
        return None
    try:
        fd = g102.material_faraday_data(rec)
    except InputError:  # a material without a Faraday rate has no attack to show
        return None
    el = part_kinetics(ds, pol, rec, service, 1.0, fd).electrode
    return el, free_corrosion(el), fd


def _pair(ka, kb, ia, ib):
    """One pair's row of :data:`SERVICE_PAIR_FIELDS` (anode as an index into the materials)."""
    (ea, fa, fda), (eb, fb, fdb) = ka, kb
    E, _ = mixed_potential([ea, eb])
    net_a = sum(r.current_density(E) for r in ea.reactions)
    a_is_anode = net_a > 0.0
    el, free, fd, idx = (ea, fa, fda, ia) if a_is_anode else (eb, fb, fdb, ib)
    attack = _rate(dissolution_density(el, E), fd)
    return [idx, E, attack, _rate(free[1], fd) if free else None]


def service_table(ds, envrec, basis, recs, request):
    """The service-condition keys of a matrix result, or {} when the environment has no service model.

    Args:
        ds: the dataset [unitless]
        envrec: the environment record [unitless]
        basis: its :class:`calc.series.Basis` [unitless]
        recs: the material records of the table, in its order [unitless]
        request: the request's service-condition fields [unitless]

    Returns:
        dict with service_conditions, oxygen_supply, states_used (per material: state_used and
        passivity), service_pair_fields, service_pairs (per pair [anode index, E_couple V vs SCE,
        attack mm/y, uncoupled mm/y], or None without data), service_pairs_reason, service_warnings

    References:
        As :func:`calc.couplemix.assess` (mixed-potential theory; ASTM G102-89 (R2015) Eq. (1)).

    >>> from calc.dataset import current
    >>> from calc.series import basis_of
    >>> ds = current(); env = ds.get("environments", "seawater-flowing")
    >>> recs = [ds.get("materials", m) for m in ("zinc", "carbon-steel")]
    >>> t = service_table(ds, env, basis_of(env, ds), recs, {})
    >>> t["service_pairs"][0][0]  # zinc, material 0, is the anode
    0
    """
    service, unused = read_service(request, envrec, ds)
    if service is None:
        return {"service_warnings": unused} if unused else {}
    by_id = {r["id"]: r for r in ds.records("materials")}
    states = [part_state(ds, r, service) for r in recs]
    warnings = [w for w in [series_range_warning(envrec, basis, service.values["temp_C"])] if w]
    warnings += [{"code": "judged-active", "field": "temp_C", "source": None, "message": s["note"]}
                 for s in states if s["state_used"] != s["id"]]
    out = {"service_conditions": service.conditions(), "oxygen_supply": service.oxygen(),
           "states_used": [{"id": s["id"], "state_used": s["state_used"], "passivity": s["passivity"]}
                           for s in states],
           "service_pair_fields": list(SERVICE_PAIR_FIELDS), "service_pairs": None, "service_pairs_reason": None,
           "service_warnings": list(unused) + list(service.warnings) + warnings}
    if len(recs) > PAIRS_MATERIALS_MAX:
        out["service_pairs_reason"] = (f"{len(recs)} materials: the pairs are solved at the service conditions for at "
                                       f"most {PAIRS_MATERIALS_MAX}; pick fewer, or open a joint")
        return out
    kin = [_material_kinetics(ds, by_id[s["state_used"]], service) for s in states]
    rows = []
    for i in range(len(recs)):
        for j in range(i + 1, len(recs)):
            rows.append(_pair(kin[i], kin[j], i, j) if kin[i] and kin[j] else None)
    out["service_pairs"] = rows
    missing = [recs[i]["id"] for i, k in enumerate(kin) if k is None]
    if missing:
        out["service_pairs_reason"] = ("no polarization data in " + service.electrolyte + " for " + ", ".join(missing)
                                       + ": their pairs have no mixed-potential answer (null)")
    return out
