"""A reading with the protective current applied, and the readings that go with it at one test post.

- The criterion that admits on readings (kind ``protection-on`` in data/cp_criteria.yaml: -0.85 V
  vs CSE with the protective current applied, the IR drop considered; 49 CFR 192 Appendix D,
  Section I.A(1) with Sections II and IV, read as reproduced in MIL-HDBK-1004/10 Appendix E):
  judged from an on reading and the way its IR drop was considered, one of the record's
  ``ir_drop_methods`` (UFC 3-570-06 (2003) 6-3.1.1: measuring or calculating the drop, or
  judging it from the system's history, the structure and its environment, or the absence of
  physical evidence of corrosion). An instant-off reading does not fall under this criterion
  (UFC 3-570-06 Chapter 7): it is judged against the polarised criteria.
- The IR drop of a pair of readings at one post: E(on) − E(instant-off).
- The polarisation shift from the native (depolarised) potential: E(instant-off) − E(native),
  whose size is the cathodic polarisation of the 100 mV criterion (49 CFR 192 App. D Section III:
  measured from the reading after the immediate shift when the current is interrupted).
"""

from ..dataset import current
from ..derivation import fmt
from ..errors import InputError
from ..series import EPS_V
from .cpwords import margin_text, potential_text, shift_text
from .criteria import describe

#: the request's word for an IR drop that was not considered
NOT_CONSIDERED = "none"
#: an on reading less negative than its instant-off by more than this: the current is not cathodic here [V]
REVERSED_V = 0.005


def ir_methods():
    """The ways an IR drop may be considered, from every criterion that admits on readings.

    Returns:
        dict id -> method (id, name, subtract) in file order

    References:
        data/cp_criteria.yaml ``ir_drop_methods`` (UFC 3-570-06 (2003) 6-3.1.1 note).

    >>> sorted(ir_methods())
    ['characteristics', 'evidence', 'history', 'measured']
    """
    out = {}
    for rec in current().records("cp_criteria"):
        for m in rec.get("ir_drop_methods") or []:
            out.setdefault(m["id"], m)
    return out


def ir_method(value):
    """The IR-drop method a request names: a method id, or None for ``none`` or nothing given.

    Args:
        value: what the user gave (``measured``, ``history``, ...; ``none``) [unitless]

    Returns:
        the method id, or None

    References:
        data/cp_criteria.yaml ``ir_drop_methods``.

    >>> ir_method("Measured"), ir_method("none"), ir_method(None)
    ('measured', None, None)
    """
    if value is None:
        return None
    methods = ir_methods()
    key = value.strip().lower() if isinstance(value, str) else None
    if key == NOT_CONSIDERED:
        return None
    if key in methods:
        return key
    raise InputError("ir_drop_method", value, "how the IR drop of the on reading was considered: "
                     + ", ".join([NOT_CONSIDERED, *methods]))


def polarisation_shift_mV(off_V, native_V):
    """The cathodic polarisation: how far the instant-off potential lies below the native potential.

    Args:
        off_V: the instant-off potential [V vs electrode]
        native_V: the native (depolarised) potential against the same electrode [V vs electrode]

    Returns:
        E(native) − E(instant-off) [mV]: positive when the structure is polarised cathodically

    References:
        49 CFR 192 Appendix D, Sections I.A(3) and III (as reproduced in MIL-HDBK-1004/10
        Appendix E); UFC 3-570-06 (2003) 6-3.1.3.

    >>> round(polarisation_shift_mV(-0.78, -0.65), 6)
    130.0
    """
    return (native_V - off_V) * 1000.0


def ir_drop_V(on_V, off_V):
    """The IR drop of a pair of readings at one post.

    Args:
        on_V: the reading with the protective current applied [V vs electrode]
        off_V: the instant-off reading [V vs electrode]

    Returns:
        E(on) − E(instant-off) [V]: negative when the current flows onto the structure

    References:
        UFC 3-570-06 (2003) Chapter 7 (the IR error of an on reading); common practice.

    >>> round(ir_drop_V(-1.05, -0.88), 6)
    -0.17
    """
    return on_V - off_V


def ir_corrected_V(on_V, ir_drop_mV):
    """An on reading with its measured or calculated IR drop subtracted.

    Args:
        on_V: the reading with the protective current applied [V vs electrode]
        ir_drop_mV: the size of the IR drop, the part of the reading's negative value the current's
            voltage drop contributes [mV]

    Returns:
        the reading less its IR drop [V vs electrode]

    References:
        49 CFR 192 Appendix D, Section II; UFC 3-570-06 (2003) 6-3.1.1 note (measuring or
        calculating the voltage drop).

    >>> round(ir_corrected_V(-0.95, 120.0), 6)
    -0.83
    """
    return on_V + ir_drop_mV / 1000.0


def _not_for(rd, info, why):
    info.update({"met": None, "conclusive": None, "text": why})
    return info


def on_criterion(rd, rec, method, ir_mV):
    """The reading against the criterion that admits on readings; the criterion as the result shows it.

    Args:
        rd: the :class:`calc.field.protection.Reading` [unitless]
        rec: a ``protection-on`` record of data/cp_criteria.yaml [unitless]
        method: the IR-drop method id, or None when the IR drop was not considered [unitless]
        ir_mV: the IR drop subtracted, for a method that subtracts, else None [mV]

    Returns:
        the criterion as shown (dict; potentials in [V]): ``met`` True, False or None (not for
        this reading), ``value_met`` whether the reading meets the value before the IR drop is
        considered

    References:
        49 CFR 192 Appendix D, Section I.A(1) with Sections II and IV; UFC 3-570-06 (2003)
        6-3.1.1 and Chapter 7.

    >>> from calc.field.criteria import criteria_for
    >>> from calc.field.electrodes import field_electrode
    >>> from calc.field.protection import start_reading
    >>> rd = start_reading(current(), field_electrode("CSE", 25.0), -0.95, "on", 25.0)
    >>> rec = next(r for r in criteria_for("carbon-steel", "soil-aerobic") if r["kind"] == "protection-on")
    >>> c = on_criterion(rd, rec, "measured", 60.0)
    >>> c["met"], c["judged_V"]
    (True, -0.89)
    """
    info = describe(rd.ds, rec)
    value = float(rec["potential_V"])
    meth = ir_methods().get(method) if method else None
    info.update({"role": "on", "value_V": value, "published_V": value, "condition": rec.get("condition"),
                 "ir_drop_method": method, "ir_drop_method_name": meth["name"] if meth else None,
                 "ir_drop_mV": ir_mV, "value_met": None, "borderline": False, "range_V": None})
    rd.cite(rec)
    where = f"{rec['name']} ({rd.standard(rec)})"
    if rd.kind != "on":
        return _not_for(rd, info, f"{where} is for a reading with the protective current applied: the instant-off "
                                  "reading is judged against the polarised-potential criteria instead")
    ev = rd.on(rec["electrode"])
    judged = ev if not (meth and meth["subtract"]) else ir_corrected_V(ev, ir_mV)
    value_met = ev <= value + EPS_V
    met = judged <= value + EPS_V
    info.update({"reading_V": round(ev, 6), "judged_V": round(judged, 6), "value_met": value_met,
                 "margin_V": round(value - judged, 6),
                 "margin_text": margin_text("protection", value - judged, rd.unit)})
    shown = potential_text(ev, rd.unit)
    if meth is None:
        info.update({"met": False if not value_met else None, "conclusive": not value_met, "text": (
            f"{shown} vs {rec['electrode']} with the current applied is {'at or below' if value_met else 'above'} "
            f"the {potential_text(value, rd.unit)} of {rd.standard(rec)}, which counts only with the IR drop "
            "considered: say how it was considered" + ("" if value_met else "; not met in any case, since the "
                                                                          "IR drop only makes the reading more "
                                                                          "negative") + ".")})
        return info
    if meth["subtract"]:
        rd.d.step(f"IR drop subtracted: {rec['name']}", "E = E(on) + IR drop (the drop as a positive number)",
                  f"{fmt(ev, 4)} V + {fmt(ir_mV)} mV", f"E = {fmt(judged, 4)} V vs {rec['electrode']}")
        how = f"less its IR drop of {shift_text(ir_mV, rd.unit)}, {potential_text(judged, rd.unit)}"
    else:
        how = f"with the IR drop {meth['name']}"
    rd.d.step(f"Criterion with the current applied: {rec['name']}",
              f"protected when E ≤ criterion, IR drop considered ({meth['name']}); {rd.standard(rec)}",
              f"{fmt(judged, 4)} V {'≤' if met else '>'} {fmt(value, 4)} V vs {rec['electrode']}",
              "met" if met else "not met")
    info.update({"met": met, "conclusive": True, "text": (
        f"{shown} vs {rec['electrode']} with the current applied, {how}, is {'at or below' if met else 'above'} the "
        f"{potential_text(value, rd.unit)} of {rd.standard(rec)}"
        + ("" if meth["subtract"] else "; this rests on that judgement, which is for a person qualified in "
                                       "corrosion control to make") + ".")})
    return info


def post_readings(rd, kind, on_V, native_V, polarisation_mV):
    """The other readings of the test post: the IR drop of an on/instant-off pair, the polarisation
    from the native potential. Returns (polarisation used [mV] or None, its origin, IR drop [V] or None).

    Args:
        rd: the :class:`calc.field.protection.Reading` (the reading judged) [unitless]
        kind: ``on`` or ``instant-off`` [unitless]
        on_V: the on reading beside an instant-off reading, or None [V vs electrode]
        native_V: the native (depolarised) potential, or None [V vs electrode]
        polarisation_mV: a polarisation shift given directly, or None [mV]

    Returns:
        (polarisation [mV] or None, ``native`` / ``given`` / None, IR drop [V] or None)

    References:
        See :func:`polarisation_shift_mV` and :func:`ir_drop_V`.

    >>> from calc.field.electrodes import field_electrode
    >>> from calc.field.protection import start_reading
    >>> rd = start_reading(current(), field_electrode("CSE", 25.0), -0.88, "instant-off", 25.0)
    >>> p, origin, ir = post_readings(rd, "instant-off", -1.02, -0.70, None)
    >>> round(p, 6), origin, round(ir, 6)
    (180.0, 'native', -0.14)
    """
    value, d, unit = rd.value_V, rd.d, rd.unit
    ir = None
    if on_V is not None:
        ir = ir_drop_V(on_V, value)
        d.step("IR drop at the post", "IR drop = E(on) − E(instant-off)", f"{fmt(on_V)} V − ({fmt(value)} V)",
               f"{fmt(ir * 1000.0, 4)} mV")
        if ir > REVERSED_V:
            d.warn("on_V", f"the on reading is {shift_text(ir * 1000.0, unit)} less negative than the instant-off "
                           "reading: the current is not flowing onto the structure at this post (interference, "
                           "a reversed connection or a drifting reading); the IR-drop reasoning does not hold here")
    if native_V is None:
        return polarisation_mV, ("given" if polarisation_mV is not None else None), ir
    if kind != "instant-off":
        d.warn("native_V", "the native potential was not used: the polarisation shift is the instant-off potential "
                           "minus the native potential, and an on reading includes the IR drop")
        return None, None, ir
    pol = round(polarisation_shift_mV(value, native_V), 6)
    d.step("Polarisation from the native potential", "shift = E(native) − E(instant-off)",
           f"{fmt(native_V)} V − ({fmt(value)} V)", f"{fmt(pol, 4)} mV")
    if pol < 0:
        d.warn("native_V", f"the instant-off reading is {shift_text(-pol, unit)} more positive than the native "
                           "potential: no cathodic polarisation at this post")
    return pol, "native", ir
