"""One CP reading against each kind of criterion: protection potential, polarisation, negative limit.

Limits are inclusive: a reading exactly on a protection criterion is protected, one exactly on
a negative limit is within it. A reading is converted to each criterion's own electrode at the
electrode's temperature.

IR drop (common practice; ISO 15589-1:2015, NACE SP0169-2013): a reading taken with the
protective current flowing ("on") includes the voltage drop of that current between the
structure and the electrode, which makes the reading more negative than the structure's
polarised potential. A criterion defined for the IR-free potential needs an "instant-off"
reading. From an on reading a criterion that is *not* met is conclusive (the polarised potential
is even less negative), one that *is* met is not; for the negative limit it is the other way
round.
"""

from dataclasses import dataclass, field

from ..derivation import fmt
from ..series import EPS_V
from .cpwords import margin_text, potential_text, shift_text
from .criteria import describe, standard_name
from .electrodes import on_scale, plausibility, start_derivation

#: structures above this temperature need more polarisation (ISO 15589-1, NACE SP0169) [°C]
ELEVATED_C = 40.0
IR_WORDS = {True: "needs the IR-free (instant-off) potential", False: "is stated for the on potential"}


@dataclass
class Reading:
    """One CP reading while it is judged: the derivation it writes to, and its value on each scale."""

    ds: object
    d: object
    el: object
    e_she: float
    kind: str
    structure_temp_C: float
    value_V: float = 0.0
    unit: object = None  # the unit of the texts: V, mV or None (see calc.field.cpwords)
    scales: dict = field(default_factory=dict)

    def on(self, electrode_id):
        """The reading against a criterion's electrode [V], with the conversion step written once."""
        if electrode_id not in self.scales:
            t, d, el = self.el.temp_C, self.d, self.el
            v, ref = on_scale(self.e_she, electrode_id, t)
            self.scales[electrode_id] = v
            if ref.id != el.id or el.shift_V:
                d.steps.extend(ref.steps)
                d.step(f"Reading vs {ref.id}", f"E({ref.id}) = E(SHE) − E({ref.id} vs SHE at {fmt(t)} °C)",
                       f"{fmt(self.e_she, 5)} − ({fmt(ref.E_V_SHE)})", f"E = {fmt(v, 4)} V vs {ref.id}")
            for s in ref.sources:
                d.cite(s)
        return self.scales[electrode_id]

    def cite(self, rec):
        """Cite a criterion record and every other document it names."""
        self.d.cite(rec.get("source"))
        for a in rec.get("also") or []:
            self.d.cite(a.get("source"))

    def standard(self, rec):
        """The standard and clause of a criterion, as the texts name them."""
        return f"{standard_name(self.ds, rec['source'])}, {rec['clause']}"


def start_reading(ds, el, value_V, kind, structure_temp_C, unit=None):
    """A reading to judge: on the SHE scale, checked for plausibility, with its first steps.

    Args:
        ds: the dataset [unitless]
        el: the :class:`calc.field.electrodes.Electrode` it was taken with [unitless]
        value_V: the reading as taken [V vs electrode]
        kind: ``on`` or ``instant-off`` [unitless]
        structure_temp_C: temperature of the structure [°C]
        unit: the unit of the texts, ``V``, ``mV`` or None [unitless]

    Returns:
        a :class:`Reading` (``e_she`` in [V vs SHE])

    References:
        E(SHE) = reading + E(electrode vs SHE at T); :func:`calc.field.electrodes.plausibility`.

    >>> from calc.dataset import current
    >>> from calc.field.electrodes import field_electrode
    >>> round(start_reading(current(), field_electrode("CSE", 25.0), -0.85, "on", 25.0).e_she, 3)
    -0.534
    """
    d = start_derivation(el)
    e_she = value_V + el.E_V_SHE
    for w in plausibility(value_V, e_she, "reading_V", kind, el.id):
        d.warn(w["field"], w["message"])
    d.step("Reading vs SHE", f"E(SHE) = reading + E({el.id} vs SHE at {fmt(el.temp_C)} °C)",
           f"{fmt(value_V)} V + {fmt(el.E_V_SHE)} V", f"E = {fmt(e_she, 5)} V vs SHE")
    return Reading(ds, d, el, e_she, kind, structure_temp_C, value_V, unit)


def within(t, window):
    """Whether a temperature lies in a record's window (inclusive; no window: always).

    Args:
        t: the temperature [°C]
        window: ``[low, high]`` or None [°C]

    Returns:
        True or False

    References:
        data/cp_criteria.yaml ``structure_temp_C`` (limits inclusive, a decision of this project).

    >>> within(40.0, [0, 40]), within(41.0, [0, 40]), within(80.0, None)
    (True, False, True)
    """
    return window is None or (window[0] - EPS_V <= t <= window[1] + EPS_V)


def ramp(threshold, target, ramp_C, t):
    """A criterion that moves linearly with the structure's temperature: base to target over the ramp.

    Args:
        threshold: the base criterion [V]
        target: the criterion at and above the full temperature [V]
        ramp_C: ``[from, full]`` temperatures of the ramp [°C]
        t: the structure's temperature [°C]

    Returns:
        the criterion at t [V]

    References:
        ISO 15589-1:2015 Table 1, footnote on operating temperature (from memory): linear between
        40 and 60 °C.

    >>> round(ramp(-0.85, -0.95, [40, 60], 50.0), 6)
    -0.9
    """
    frac = (t - ramp_C[0]) / (ramp_C[1] - ramp_C[0])
    return threshold + (target - threshold) * max(0.0, min(1.0, frac))


def _elevated(rd, base, temps):
    """The base criterion moved by the elevated-temperature records that apply: (threshold, records used)."""
    threshold, used, ts = float(base["potential_V"]), [base], rd.structure_temp_C
    for tr in temps:
        if not within(ts, tr.get("structure_temp_C")):
            continue
        target, rng = float(tr["potential_V"]), tr.get("ramp_C")
        if rng and ts < rng[1]:
            moved = ramp(threshold, target, rng, ts)
            formula = f"linear from {fmt(threshold)} V at {fmt(rng[0])} °C to {fmt(target)} V at {fmt(rng[1])} °C"
        else:
            start = rng[1] if rng else tr["structure_temp_C"][0]
            moved, formula = target, f"{fmt(target)} V at {fmt(start)} °C or more"
        if moved < threshold:
            rd.d.step("Elevated structure temperature", formula, f"structure at {fmt(ts)} °C",
                      f"criterion {fmt(moved, 4)} V vs {base['electrode']} instead of {fmt(threshold)} V")
            threshold = moved
            used.append(tr)
            rd.cite(tr)
    return threshold, used


def _borderline(rng, unit, comma=""):
    """The end of a criterion's text for a reading inside the span the documents give."""
    span = (f"{fmt(min(rng))} to {fmt(max(rng))} V" if unit != "mV" else
            f"{fmt(min(rng) * 1000.0)} to {fmt(max(rng) * 1000.0)} mV")
    return f"; the documents give {span}{comma} and the reading lies in that span: borderline"


def _shown(rd, rec, role, value_V, ev, margin_V, outcome, decisive, borderline):
    """A potential criterion as the result shows it. An on reading cannot show that an IR-free
    criterion is met (or a limit exceeded): its IR drop alone may do that, so that is not conclusive."""
    info = describe(rd.ds, rec)
    info.update({"role": role, "value_V": value_V, "published_V": rec["potential_V"], "reading_V": round(ev, 6),
                 "margin_V": round(margin_V, 6), "margin_text": margin_text(role, margin_V, rd.unit), **outcome,
                 "conclusive": rd.kind == "instant-off" or not rec.get("ir_free") or not decisive,
                 "borderline": borderline, "range_V": rec.get("range_V")})
    return info


def protection(rd, base, temps, setting_name):
    """The reading against the protection potential (moved for a hot structure); the criterion as shown.

    Args:
        rd: the :class:`Reading` [unitless]
        base: the base protection record of the structure and setting [unitless]
        temps: the elevated-temperature protection records [unitless]
        setting_name: the setting's name, for a warning [unitless]

    Returns:
        the criterion as the result shows it (dict; potentials in [V])

    References:
        The record's standard and clause (data/cp_criteria.yaml); protected when E ≤ criterion.

    >>> from calc.dataset import current
    >>> from calc.field.criteria import criteria_for
    >>> from calc.field.electrodes import field_electrode
    >>> rd = start_reading(current(), field_electrode("CSE", 25.0), -0.9, "instant-off", 25.0)
    >>> protection(rd, criteria_for("carbon-steel", "soil-aerobic")[0], [], "soil")["met"]
    True
    """
    rd.cite(base)
    threshold, used = _elevated(rd, base, temps)
    ts = rd.structure_temp_C
    if ts > ELEVATED_C + EPS_V and not temps:
        rd.d.warn("structure_temp_C", f"the structure is at {fmt(ts)} °C: the dataset holds no elevated-temperature "
                                      f"criterion for {setting_name.lower()}; hot structures need more "
                                      "polarisation (ISO 15589-1, NACE SP0169): ask a CP specialist")
    ev = rd.on(base["electrode"])
    met = ev <= threshold + EPS_V
    rng = base.get("range_V")
    borderline = bool(rng) and not met and ev <= max(rng) + EPS_V
    info = _shown(rd, base, "protection", round(threshold, 6), ev, threshold - ev, {"met": met}, met, borderline)
    info["applied"] = [u["id"] for u in used]
    rd.d.step(f"Protection criterion: {base['name']}",
              f"protected when E ≤ criterion (limit inclusive); {rd.standard(base)}",
              f"{fmt(ev, 4)} V {'≤' if met else '>'} {fmt(threshold, 4)} V vs {base['electrode']}",
              "met" if met else "not met")
    info["text"] = (f"{potential_text(ev, rd.unit)} vs {base['electrode']} is {'at or below' if met else 'above'} the "
                    f"{potential_text(threshold, rd.unit)} of {rd.standard(base)}; the criterion "
                    f"{IR_WORDS[bool(base.get('ir_free'))]}" + (_borderline(rng, rd.unit, ",") if borderline else "") + ".")
    return info


def polarisation(rd, rec, pol):
    """The polarisation shift given against a polarisation criterion; the criterion as shown.

    Args:
        rd: the :class:`Reading` [unitless]
        rec: a polarisation record of data/cp_criteria.yaml [unitless]
        pol: the polarisation shift given, or None [mV]

    Returns:
        the criterion as the result shows it (dict; shifts in [mV]); ``met`` None when it was not checked

    References:
        The record's standard and clause (NACE SP0169-2013 §6.2.2: at least 100 mV of polarisation).

    >>> from calc.dataset import current
    >>> from calc.field.criteria import criteria_for
    >>> from calc.field.electrodes import field_electrode
    >>> rd = start_reading(current(), field_electrode("CSE", 25.0), -0.7, "instant-off", 25.0)
    >>> rec = next(r for r in criteria_for("carbon-steel", "soil-aerobic") if r["kind"] == "polarisation")
    >>> polarisation(rd, rec, 120.0)["met"]
    True
    """
    info = describe(rd.ds, rec)
    need_mV = float(rec["shift_V"]) * 1000.0
    applies = within(rd.structure_temp_C, rec.get("structure_temp_C"))
    info.update({"role": "polarisation", "value_mV": round(need_mV, 6), "given_mV": pol, "applies": applies})
    rd.cite(rec)
    where = f"{rec['name']} ({rd.standard(rec)})"
    if not applies:
        lo, hi = rec["structure_temp_C"]
        info.update({"met": None, "conclusive": None, "text": (
            f"{where} does not apply at a structure temperature of {fmt(rd.structure_temp_C)} °C "
            f"(only {fmt(lo)} to {fmt(hi)} °C here)")})
        if pol is not None:
            rd.d.warn("polarisation_mV", info["text"] + ": the polarisation given was not used")
    elif pol is None:
        info.update({"met": None, "conclusive": None, "text": (
            f"{where} can also show protection: give the polarisation shift (instant-off potential minus "
            "depolarised potential) to check it")})
    else:
        met = pol >= need_mV - 1e-6
        info.update({"met": met, "conclusive": True, "text": (
            f"polarisation {shift_text(pol, rd.unit)} is {'at least' if met else 'less than'} the "
            f"{shift_text(need_mV, rd.unit)} of {rd.standard(rec)}.")})
        rd.d.step(f"Polarisation criterion: {rec['name']}", "protected when the polarisation ≥ the shift (inclusive)",
                  f"{fmt(pol)} mV {'≥' if met else '<'} {fmt(need_mV)} mV", "met" if met else "not met")
    return info


def limit(rd, rec):
    """The reading against the negative (over-protection) limit; the limit as shown.

    Args:
        rd: the :class:`Reading` [unitless]
        rec: the limit record of the structure and setting [unitless]

    Returns:
        the limit as the result shows it (dict; potentials in [V]); ``exceeded`` True when beyond it

    References:
        The record's standard and clause (data/cp_criteria.yaml); over-protected when E < limit.

    >>> from calc.dataset import current
    >>> from calc.field.criteria import criteria_for
    >>> from calc.field.electrodes import field_electrode
    >>> rd = start_reading(current(), field_electrode("Ag/AgCl seawater", 12.0), -1.2, "instant-off", 12.0)
    >>> limit(rd, criteria_for("carbon-steel", "seawater-aerobic")[1])["exceeded"]
    True
    """
    rd.cite(rec)
    ev = rd.on(rec["electrode"])
    limit_v = float(rec["potential_V"])
    over = ev < limit_v - EPS_V
    rng = rec.get("range_V")
    borderline = bool(rng) and over and ev >= min(rng) - EPS_V
    info = _shown(rd, rec, "limit", limit_v, ev, ev - limit_v, {"exceeded": over}, over, borderline)
    rd.d.step(f"Negative limit: {rec['name']}",
              f"over-protected when E < limit (a reading on the limit is within it); {rd.standard(rec)}",
              f"{fmt(ev, 4)} V {'<' if over else '≥'} {fmt(limit_v, 4)} V vs {rec['electrode']}",
              "beyond the limit" if over else "within the limit")
    info["text"] = (f"{potential_text(ev, rd.unit)} vs {rec['electrode']} is {'beyond' if over else 'within'} the "
                    f"{potential_text(limit_v, rd.unit)} limit of {rd.standard(rec)}"
                    + (_borderline(rng, rd.unit) if borderline else "") + ".")
    return info


def not_checked(rd, rec):
    """A criterion one reading cannot show (a shift of the on potential); listed with the reason.

    Args:
        rd: the :class:`Reading` [unitless]
        rec: a shift-on record of data/cp_criteria.yaml [unitless]

    Returns:
        the criterion as the result shows it (dict; shift in [mV])

    References:
        49 CFR 192 Appendix D Section I.A(2): a 300 mV shift with the current applied.

    >>> from calc.dataset import current
    >>> from calc.field.criteria import criteria_for
    >>> from calc.field.electrodes import field_electrode
    >>> rd = start_reading(current(), field_electrode("CSE", 25.0), -0.9, "on", 25.0)
    >>> rec = next(r for r in criteria_for("carbon-steel", "soil-aerobic") if r["kind"] == "shift-on")
    >>> not_checked(rd, rec)["value_mV"]
    300.0
    """
    info = describe(rd.ds, rec)
    info.update({"role": "not checked", "value_mV": round(float(rec["shift_V"]) * 1000.0, 6), "met": None,
                 "conclusive": None, "text": (
                     f"{rec['name']} ({rd.standard(rec)}) is not checked: it needs "
                     "the shift of the on potential from the native potential, not one reading")})
    rd.cite(rec)
    return info
