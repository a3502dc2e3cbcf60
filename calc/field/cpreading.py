"""One cathodic-protection reading judged against the criteria of the dataset.

One structure-to-electrolyte potential of a cathodically protected structure against the
potential criteria of ``data/cp_criteria.yaml`` (protected, unconfirmed, not protected,
over-protected; limits inclusive), each criterion assessed by :mod:`calc.field.protection` and
:mod:`calc.field.onreading`. The verdict says whether it is conclusive: an on reading includes
the IR drop, so one that meets the value of a criterion stated for the polarised potential is
*unconfirmed* (:mod:`calc.field.cpwords`), unless a criterion that admits on readings is met
with the IR drop considered. The readings of one test post travel together: an instant-off
reading with the on reading beside it (the IR drop) and the native potential (the polarisation).
"""

from dataclasses import dataclass

from ..bounds import BOUNDS, check
from ..dataset import current
from ..derivation import fmt
from ..errors import DataError, InputError
from ..requests import read
from ..series import EPS_V
from . import protection as assess
from .cpwords import UNITS, ir_text, verdict_label, verdict_text
from .criteria import catalogue, criteria_for, lookup, name_of, reading_kind, settings_with_criteria
from .electrodes import AGAGCL_SW, PLAUSIBLE_SHE_V, field_electrode, read_reading
from .onreading import ir_method, ir_methods, on_criterion, post_readings

CP_CAUTIONS = (
    "Safety-relevant: cathodic protection keeps pipelines, tanks and structures whose failure can hurt people "
    "and the environment. This check helps read one number; it does not accept or certify a CP system.",
    "The criteria apply as the named standard defines them: its electrode, whether it needs an IR-free "
    "(instant-off) value, the structure's material and temperature, the soil or water. Where documents differ "
    "the value used and the span are shown.",
    "Follow the operator's procedures and the local regulation, and have CP surveys interpreted by a qualified "
    "cathodic-protection specialist.",
    "One reading is one point: coating defects, interference and telluric currents, and poorly placed electrodes "
    "are found only by a survey along the structure.",
)


@dataclass(frozen=True)
class CPResult:
    """A CP reading judged against the criteria; :meth:`to_dict` is the JSON result."""

    data: tuple

    def to_dict(self):
        """Plain data for JSON."""
        return dict(self.data)


def _inputs(structure, setting, reading_V, electrode, kind, temp_C, polarisation_mV, structure_temp_C,
            salinity, chloride_mg_per_L):
    """The request checked, in the order its errors are reported."""
    sid = lookup("cp_structures", structure, "structure")
    sett = lookup("cp_settings", setting, "setting")
    rkind = reading_kind(kind)
    value = read_reading(reading_V, "reading_V")
    el = field_electrode(electrode, temp_C, salinity, chloride_mg_per_L)
    ts = el.temp_C if structure_temp_C is None else check("structure_temp_C", structure_temp_C)
    pol = None if polarisation_mV is None else check("polarisation_mV", polarisation_mV)
    recs = criteria_for(sid, sett)
    if not recs:
        have = settings_with_criteria(sid)
        raise InputError("setting", setting, f"a setting with criteria for {sid}: " + (", ".join(have) or "none"))
    return sid, sett, rkind, value, el, ts, pol, recs


def _post_inputs(rkind, pol, post):
    """The readings of the test post and the IR-drop choice, checked: (on_V, native_V, method, ir_mV, unit)."""
    on_V, native_V, method, ir_mV, unit = (post.get(k) for k in ("on_V", "native_V", "ir_drop_method",
                                                                  "ir_drop_mV", "unit"))
    if unit not in UNITS:
        raise InputError("unit", unit, "V or mV (the unit of the texts; the numbers of the result stay in V and mV)")
    if on_V is not None:
        if rkind == "on":
            raise InputError("on_V", on_V, "an on reading beside an instant-off reading (with reading_kind on, "
                                           "reading_V is the on reading)")
        on_V = check("reading_V", on_V, "on_V")
    if native_V is not None:
        if pol is not None:
            raise InputError("native_V", native_V, "the native potential or the polarisation shift, not both")
        native_V = check("reading_V", native_V, "native_V")
    method = ir_method(method)
    subtracts = method is not None and ir_methods()[method]["subtract"]
    if ir_mV is not None:
        if not subtracts:
            raise InputError("ir_drop_method", post.get("ir_drop_method"),
                             "measured (an IR drop measured or calculated, subtracted from the reading) "
                             "to use the IR drop given")
        ir_mV = check("ir_drop_mV", ir_mV)
    elif subtracts:
        raise InputError("ir_drop_mV", None, "the size of the IR drop measured or calculated, "
                                             + BOUNDS["ir_drop_mV"].allowed)
    return on_V, native_V, method, ir_mV, unit


def _by_kind(recs, sid, sett):
    """The criteria records by role: base and elevated-temperature protection, polarisation, limit, shift-on."""
    protect = [r for r in recs if r["kind"] == "protection"]
    groups = {"base": [r for r in protect if not r.get("structure_temp_C")],
              "temps": [r for r in protect if r.get("structure_temp_C")],
              "polarisation": [r for r in recs if r["kind"] == "polarisation"],
              "limit": [r for r in recs if r["kind"] == "limit"],
              "shift-on": [r for r in recs if r["kind"] == "shift-on"],
              "on": [r for r in recs if r["kind"] == "protection-on"]}
    if len(groups["base"]) > 1 or len(groups["limit"]) > 1 or len(groups["on"]) > 1:
        raise DataError(f"cp_criteria: more than one base protection or limit record for {sid} in {sett}")
    return groups


def _need_a_criterion(criteria, where, polarisation_mV, structure_temp_C):
    """Refuse a request for which no protection criterion could be checked, saying what is missing."""
    if any(c["role"] == "polarisation" and c.get("applies") for c in criteria):
        raise InputError("polarisation_mV", polarisation_mV,
                         f"the polarisation shift in mV: {where} "
                         "has no potential criterion, only a polarisation criterion")
    raise InputError("structure_temp_C", structure_temp_C,
                     "a temperature at which a protection criterion applies to this structure and setting")


def _on_criterion(rd, groups, method, ir_mV, where):
    """The criterion that admits on readings, where the structure and setting have one and it applies."""
    recs = [r for r in groups["on"] if assess.within(rd.structure_temp_C, r.get("structure_temp_C"))]
    if method is not None and not recs:
        rd.d.warn("ir_drop_method", f"no criterion that admits on readings applies to {where}: the way the IR "
                                    "drop was considered was not used")
    if recs and method is not None and rd.kind != "on":
        rd.d.warn("ir_drop_method", "the way the IR drop was considered was not used: the reading is instant-off")
    return on_criterion(rd, recs[0], method, ir_mV) if recs else None


def _assess(rd, groups, pol, names, polarisation_mV, structure_temp_C, method=None, ir_mV=None):
    """Every criterion of the structure and setting against the reading:
    (criteria, protection, polarisation, limit, on-criterion)."""
    where = f"{names[0].lower()} in {names[1].lower()}"
    criteria = []
    prot = assess.protection(rd, groups["base"][0], groups["temps"], names[1]) if groups["base"] else None
    criteria += [prot] if prot else []
    on_info = _on_criterion(rd, groups, method, ir_mV, where)
    criteria += [on_info] if on_info else []
    pols = [assess.polarisation(rd, r, pol) for r in groups["polarisation"]]
    criteria += pols
    pol_info = next((c for c in reversed(pols) if c["met"] is not None), None)
    if pol is not None and not pols:
        rd.d.warn("polarisation_mV", f"no polarisation criterion is stored for {where}: the polarisation given "
                                     "was not used")
    if prot is None and pol_info is None and on_info is None:
        _need_a_criterion(criteria, where, polarisation_mV, structure_temp_C)
    lim = assess.limit(rd, groups["limit"][0]) if groups["limit"] else None
    if lim:
        criteria.append(lim)
    else:
        rd.d.warn(None, f"no negative (over-protection) limit is stored for {where}")
    criteria += [assess.not_checked(rd, r) for r in groups["shift-on"]]
    return criteria, prot, pol_info, lim, on_info


def _verdict(prot, pol_info, lim, implausible, on_info=None):
    """The verdict and whether it is conclusive: beyond the limit first, then a criterion met by a
    reading it admits (protected), then one whose value an on reading meets (unconfirmed)."""
    prot_met = prot is not None and prot["met"]
    pol_met = pol_info is not None and pol_info["met"]
    on_met = on_info is not None and on_info["met"] is True
    on_value_only = on_info is not None and on_info["met"] is None and bool(on_info["value_met"])
    if lim is not None and lim["exceeded"]:
        verdict, conclusive = "over-protected", lim["conclusive"]
    elif pol_met or on_met or (prot_met and prot["conclusive"]):
        verdict, conclusive = "protected", True
    elif prot_met or on_value_only:
        verdict, conclusive = "unconfirmed", False
    else:
        verdict = "not protected"
        conclusive = all(c["conclusive"] for c in (prot, pol_info, on_info) if c is not None and c["conclusive"] is not None)
    return verdict, conclusive and not implausible


def _used_warnings(d, used, el):
    """Warn of the provisional values used, and of a conversion to another electrode."""
    for c in used:
        if c["provisional"]:
            d.warn(None, f"{c['name']}: provisional value ({c['standard']}, {c['clause']}; {c['confidence']}): "
                         "check it in the standard before relying on the verdict")
    for c in used:
        if c.get("electrode") and c["electrode"] != el.id:
            d.warn("electrode", f"the reading was converted from {el.id} to {c['electrode']} with the dataset's "
                                "electrode values; the standards' working equivalences differ by up to about 15 mV "
                                "(e.g. -0.80 V Ag/AgCl seawater is taken as -0.85 V CSE): near a limit, measure with "
                                f"a {c['electrode']} electrode")
            break


def _assumptions(ts, structure_temp_C, pol, el):
    out = [
        "limits are inclusive: a reading exactly on a protection criterion is protected, one exactly on a negative "
        "limit is within it",
        "the reading was converted to each criterion's electrode at the electrode's temperature; liquid-junction "
        "potentials are not included",
        f"structure temperature {fmt(ts)} °C"
        + ("" if structure_temp_C is not None else " (taken as the electrode's)"),
        "the protective current flows onto the structure (cathodic); under stray-current interference the reasoning "
        "about IR drop does not hold",
    ]
    if pol is not None:
        out.append("the polarisation is the shift from the depolarised (or native) potential to the "
                   "instant-off potential, free of IR drop")
    if el.id == AGAGCL_SW and el.salinity is None:
        out.append("the Ag/AgCl seawater electrode is in full-strength seawater (salinity 35); in brackish "
                   "water give the salinity or chloride to correct it")
    return out


def check_cp_reading(structure, setting, reading_V, electrode, kind, temp_C=None, polarisation_mV=None,
                     structure_temp_C=None, salinity=None, chloride_mg_per_L=None, **post):
    """Judge one structure-to-electrolyte potential against the CP criteria of the dataset.

    Args:
        structure: structure id or alias (carbon-steel, aluminium, ...) [unitless]
        setting: setting id (soil-aerobic, seawater-aerobic, ...) [unitless]
        reading_V: the reading as taken [V vs electrode]
        electrode: the reference electrode it was taken with [unitless]
        kind: ``on`` or ``instant-off`` [unitless]
        temp_C: temperature of the electrode, default 25 [°C]
        polarisation_mV: cathodic polarisation shift (instant-off to depolarised), optional [mV]
        structure_temp_C: temperature of the structure, default temp_C [°C]
        salinity: salinity of the water, for an Ag/AgCl seawater electrode [g/kg]
        chloride_mg_per_L: chloride instead of salinity [mg/L]
        post: the other readings of the test post and choices, each optional: ``on_V`` (the on
            reading beside an instant-off one) [V vs electrode], ``native_V`` (the native
            potential, instead of polarisation_mV) [V vs electrode], ``ir_drop_method`` (how the
            IR drop of an on reading was considered) [unitless], ``ir_drop_mV`` (the IR drop
            subtracted, for ``measured``) [mV], ``unit`` (``V`` or ``mV``, of the texts) [unitless]

    Returns:
        a :class:`CPResult` (potentials in [V], shifts in [mV])

    References:
        The criteria of data/cp_criteria.yaml with their standards and clauses (49 CFR 192 App. D
        as reproduced in MIL-HDBK-1004/10 App. E; UFC 3-570-06 (2003) 6-3; ISO 15589-1:2015
        Table 1; NACE SP0169-2013 §6.2.2; EN 12473:2014 Table 1; DNV-RP-B401; ISO 15589-2:2012;
        MIL-HDBK-1004/10 §3.3.1); conversion by :mod:`calc.refelec`.

    >>> r = check_cp_reading("carbon-steel", "soil-aerobic", -0.85, "CSE", "instant-off", 25).to_dict()
    >>> r["verdict"], r["conclusive"]
    ('protected', True)
    >>> check_cp_reading("carbon-steel", "soil-aerobic", -0.95, "CSE", "on", 25).to_dict()["verdict"]
    'unconfirmed'
    """
    ds = current()
    sid, sett, rkind, value, el, ts, pol, recs = _inputs(structure, setting, reading_V, electrode, kind, temp_C,
                                                         polarisation_mV, structure_temp_C, salinity,
                                                         chloride_mg_per_L)
    on_V, native_V, method, ir_mV, unit = _post_inputs(rkind, pol, post)
    rd = assess.start_reading(ds, el, value, rkind, ts, unit)
    d, e_she = rd.d, rd.e_she
    implausible = e_she < PLAUSIBLE_SHE_V[0] - EPS_V
    names = (name_of("cp_structures", sid), name_of("cp_settings", sett))
    pol, pol_from, ir_V = post_readings(rd, rkind, on_V, native_V, pol)
    groups = _by_kind(recs, sid, sett)
    criteria, prot, pol_info, lim, on_info = _assess(rd, groups, pol, names, polarisation_mV, structure_temp_C,
                                                     method, ir_mV)
    verdict, conclusive = _verdict(prot, pol_info, lim, implausible, on_info)
    used = [c for c in criteria if c.get("met") is not None or c["role"] == "limit"]
    _used_warnings(d, used, el)
    ir_needed = [c for c in used if c["ir_free"] and c["role"] in ("protection", "limit")]
    reasons = [c["text"] for c in (prot, on_info, pol_info, lim)
               if c is not None and (c.get("met") is not None or c is lim or (c is on_info and c["value_met"]))]
    if temp_C is None:
        d.warn("temp_C", "temperature not given: 25 °C assumed for the electrode")
    admits_on = on_info is not None and rkind == "on"
    method_name = on_info["ir_drop_method_name"] if admits_on else None
    data = (
        ("structure", sid), ("structure_name", names[0]), ("setting", sett),
        ("setting_name", names[1]), ("reading_V", value), ("electrode", el.id), ("temp_C", el.temp_C),
        ("structure_temp_C", ts), ("reading_kind", rkind), ("polarisation_mV", pol),
        ("salinity", el.salinity), ("electrode_shift_V", round(el.shift_V, 6)), ("reading_V_SHE", round(e_she, 6)),
        ("verdict", verdict), ("conclusive", conclusive),
        ("verdict_label", verdict_label(verdict, conclusive, rkind)),
        ("verdict_text", verdict_text(verdict, conclusive, implausible, reasons, admits_on)),
        ("implausible", implausible), ("criteria", criteria),
        ("ir_drop", ir_text(rkind, ir_needed, admits_on, method_name)),
        ("instant_off_needed", bool(ir_needed)), ("assumptions", _assumptions(ts, structure_temp_C, pol, el)),
        ("cautions", list(CP_CAUTIONS)),
        ("steps", d.steps), ("warnings", d.warnings), ("sources", d.sources), ("data_version", ds.version),
        ("polarisation_from", pol_from), ("native_V", native_V), ("on_V", on_V),
        ("ir_drop_V", None if ir_V is None else round(ir_V, 6)), ("ir_drop_method", method),
        ("ir_drop_mV", ir_mV), ("unit", unit),
    )
    return CPResult(data)


#: request fields of ``cp``, in the order its messages list them
CP_FIELDS = ("structure", "setting", "reading_V", "electrode", "temp_C", "reading_kind", "polarisation_mV",
             "structure_temp_C", "salinity", "chloride_mg_per_L", "on_V", "native_V", "ir_drop_method", "ir_drop_mV",
             "unit")
#: the optional fields of the test post and the choices, passed on by name
POST_FIELDS = CP_FIELDS[10:]


def _cp_required():
    """The required fields of ``cp``, in the order they are reported, with what each must hold."""
    return {"structure": "a structure: one of " + ", ".join(r["id"] for r in catalogue("cp_structures")),
            "setting": "a setting: one of " + ", ".join(r["id"] for r in catalogue("cp_settings")),
            "reading_V": "a reading in V",
            "electrode": "a reference electrode id such as CSE or Ag/AgCl seawater",
            "reading_kind": "on or instant-off"}


def cp_reading_entry(req):
    """JSON entry point ``cp``: judge one CP reading against the criteria of the dataset.

    Request fields: ``structure``, ``setting``, ``reading_V`` [V], ``electrode``,
    ``reading_kind`` (``on`` or ``instant-off``); optional ``temp_C`` [°C, default 25],
    ``polarisation_mV`` [mV] or ``native_V`` [V], ``structure_temp_C`` [°C], ``salinity`` [g/kg]
    or ``chloride_mg_per_L`` [mg/L]; with an instant-off reading ``on_V`` [V]; with an on
    reading ``ir_drop_method`` (``none``, ``measured``, ``history``, ``characteristics``,
    ``evidence``) and, for ``measured``, ``ir_drop_mV`` [mV]; ``unit`` (``V`` or ``mV``) of the
    texts.

    Args:
        req: the request dict [unitless]

    Returns:
        dict: verdict (protected, unconfirmed, not protected, over-protected), conclusive,
        verdict_text, criteria (each with its standard, clause, value in [V], the reading on its
        electrode in [V], margin_text, whether it needs an instant-off value), ir_drop,
        polarisation_mV and polarisation_from, ir_drop_V, assumptions, cautions, steps,
        warnings, sources, data_version

    References:
        See :func:`check_cp_reading`.

    >>> r = cp_reading_entry({"structure": "carbon-steel", "setting": "seawater-aerobic", "reading_V": -1.05,
    ...                       "electrode": "Ag/AgCl seawater", "reading_kind": "instant-off", "temp_C": 12})
    >>> r["verdict"], [c["value_V"] for c in r["criteria"]]
    ('protected', [-0.8, -1.1])
    """
    read(req, "cp", None, CP_FIELDS)  # the fields listed in their order, as always
    read(req, "cp", _cp_required(), CP_FIELDS)
    return check_cp_reading(req["structure"], req["setting"], req["reading_V"], req["electrode"], req["reading_kind"],
                            req.get("temp_C"), req.get("polarisation_mV"), req.get("structure_temp_C"),
                            req.get("salinity"), req.get("chloride_mg_per_L"),
                            **{k: req[k] for k in POST_FIELDS if k in req}).to_dict()
