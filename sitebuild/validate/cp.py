"""Cathodic-protection criteria: the structure, setting and electrode ids exist (in
cp_structures.yaml, cp_settings.yaml and reference_electrodes.yaml), values and ranges are
coherent, one base criterion and one limit per structure and setting, limits below protection
potentials."""

from .collect import FILE_OF, closest_hint, each, fmt, ids_of, is_num
from .ranges import TEMP_RANGE_C, in_range, pair
from .refelec import refelec_potential

K = "cp_criteria"
#: potentials of CP criteria: beyond magnesium anodes (about -1.75 V CSE) or oxygen evolution is a
#: typo or a unit slip [V] (common practice)
CP_POTENTIAL_RANGE_V = (-2.5, 1.0)
#: polarisation and on-potential shifts of CP criteria: 100 and 300 mV are the published ones [V]
#: (common practice)
CP_SHIFT_MAX_V = 1.0


def _catalogue(raw, kind):
    """id -> record of a kind the criteria refer to, or None when the data holds no list of it
    (a file not read: nothing to check against)."""
    return ids_of(raw, kind) if isinstance(raw.get(kind), list) else None


def _in_catalogue(label, field, what, value, known, kind, out):
    if known is not None and value not in known:
        out.error(K, label, field, f"{what} {value!r} is not an id in {FILE_OF[kind]}: expected one of "
                                   f"{', '.join(known)}")


def _known_ids(label, rec, settings, raw, out):
    """structure, settings and electrode name records that exist."""
    structure, electrode = rec.get("structure"), rec.get("electrode")
    if isinstance(structure, str):
        known = _catalogue(raw, "cp_structures")
        _in_catalogue(label, "structure", "structure", structure, known, "cp_structures", out)
    known_settings = _catalogue(raw, "cp_settings")
    for i, s in enumerate(settings):
        _in_catalogue(label, f"settings[{i}]", "setting", s, known_settings, "cp_settings", out)
    refs = _catalogue(raw, "reference_electrodes")
    if isinstance(electrode, str) and refs is not None and electrode not in refs:
        out.error(K, label, "electrode", f"unknown reference electrode {electrode!r}: not an id in "
                                         f"reference_electrodes.yaml{closest_hint(electrode, refs)}")


def _potentials(label, rec, out):
    """potential_V, shift_V and range_V in bounds, the range around the potential."""
    pot = rec.get("potential_V")
    pot_ok = in_range(K, label, "potential_V", pot, *CP_POTENTIAL_RANGE_V, "V", out)
    in_range(K, label, "shift_V", rec.get("shift_V"), 0.0, CP_SHIFT_MAX_V, "V", out, lo_open=True)
    rng = pair(K, label, "range_V", rec.get("range_V"), *CP_POTENTIAL_RANGE_V, "V", out, strict=True,
               ends="[most negative, least negative]")
    if rng and pot_ok and not rng[0] <= pot <= rng[1]:
        out.error(K, label, "range_V", f"the range {fmt(rec['range_V'])} does not contain potential_V {pot:g}")


def _temperatures(label, rec, out):
    """structure_temp_C and ramp_C in bounds and in order, the ramp inside the window."""
    window = pair(K, label, "structure_temp_C", rec.get("structure_temp_C"), *TEMP_RANGE_C, "°C", out, strict=True)
    ramp = pair(K, label, "ramp_C", rec.get("ramp_C"), *TEMP_RANGE_C, "°C", out, strict=True, ends="[from, full]")
    if "ramp_C" in rec and "structure_temp_C" not in rec:
        out.error(K, label, "ramp_C", "ramp_C needs structure_temp_C (the temperatures the record applies to)")
    elif ramp and window and not (window[0] <= ramp[0] and ramp[1] <= window[1]):
        out.error(K, label, "ramp_C", f"the ramp {fmt(rec['ramp_C'])} lies outside structure_temp_C "
                                      f"{fmt(rec['structure_temp_C'])}")
    if "ramp_C" in rec and rec.get("kind") == "limit":
        out.error(K, label, "ramp_C", "only protection criteria can move with temperature")


def _also(label, rec, out):
    also = rec.get("also")
    for i, cit in enumerate(also if isinstance(also, list) else []):
        if isinstance(cit, dict) and cit.get("source") is not None and cit.get("source") == rec.get("source"):
            out.error(K, label, f"also[{i}].source", f"{cit['source']!r} is already the record's own source")


def _one_per_key(label, rec, key, table, what, out):
    if key in table:
        out.error(K, label, "settings", f"{key[0]} in {key[1]} already has {what} ({table[key][0]}): "
                                        "one per structure and setting")
    else:
        table[key] = (label, rec)


def _register(label, rec, settings, tables, out):
    """File the record as its structure's and settings' base criterion, limit or temperature criterion."""
    base, limits, ramps = tables
    kind = rec.get("kind")
    for s in settings:
        key = (rec.get("structure"), s)
        if kind == "protection" and "structure_temp_C" not in rec:
            _one_per_key(label, rec, key, base, "a base protection criterion", out)
        elif kind == "limit":
            _one_per_key(label, rec, key, limits, "a negative limit", out)
    if kind == "protection" and "structure_temp_C" in rec:
        ramps.append((label, rec, settings))


def _ramps_have_a_base(base, ramps, out):
    for label, rec, settings in ramps:
        for s in settings:
            b = base.get((rec.get("structure"), s))
            if b is None:
                out.error(K, label, "settings", f"no base protection criterion for {rec.get('structure')} in {s} "
                                                "for this temperature criterion to move from")
            elif b[1].get("electrode") != rec.get("electrode"):
                out.error(K, label, "electrode", f"the temperature criterion is against {rec.get('electrode')!r} but "
                                                 f"its base {b[0]} against {b[1].get('electrode')!r}: use the same")


def _at25(rec, refs):
    """A criterion's potential vs SHE at 25 °C, or None."""
    ref = refs.get(rec.get("electrode"))
    e_ref = refelec_potential(ref, 25.0) if ref else None
    return rec["potential_V"] + e_ref if is_num(rec.get("potential_V")) and is_num(e_ref) else None


def _limits_below(base, limits, refs, out):
    for key, (llabel, lrec) in limits.items():
        b = base.get(key)
        if b is None:
            continue
        e_lim, e_prot = _at25(lrec, refs), _at25(b[1], refs)
        if e_lim is not None and e_prot is not None and e_lim >= e_prot:
            out.error(K, llabel, "potential_V", f"the negative limit {lrec['potential_V']:g} V vs {lrec['electrode']} "
                                                f"is not below the protection criterion {b[0]} "
                                                f"({b[1]['potential_V']:g} V vs {b[1]['electrode']}) for {key[0]} in "
                                                f"{key[1]}")


def check_cp_criteria(raw, out):
    """Every check of the CP criteria, record by record, then across records."""
    tables = ({}, {}, [])  # base criteria, limits: (structure, setting) -> (label, record); temperature criteria
    for label, rec in each(raw, K):
        settings = rec.get("settings")
        settings = [s for s in settings if isinstance(s, str)] if isinstance(settings, list) else []
        _known_ids(label, rec, settings, raw, out)
        _potentials(label, rec, out)
        _temperatures(label, rec, out)
        _also(label, rec, out)
        _register(label, rec, settings, tables, out)
    base, limits, ramps = tables
    _ramps_have_a_base(base, ramps, out)
    _limits_below(base, limits, ids_of(raw, "reference_electrodes"), out)
