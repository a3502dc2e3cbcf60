"""The potential of one electrode: the Nernst equation with the full reaction quotient.

E = E°(T) − (ln10·RT/nF)·log10 Q, Q = Π a(reduced side)^ν / Π a(oxidised side)^ν for the
reduction ``oxidised + n e− → reduced``; E°(T) from :mod:`calc.standard`, activities as in
:mod:`calc.conditions`. Constants: CODATA 2018 (:mod:`calc.constants`).
"""

import math
from dataclasses import dataclass, replace

from . import constants, refelec
from .conditions import KEYS as CONDITION_KEYS
from .conditions import activities_for, note_unused, read_conditions
from .dataset import current
from .derivation import Derivation, fmt
from .errors import InputError
from .requests import read
from .standard import half_reaction, sides, standard_potential_at, term

#: beyond this |log10 K| the equilibrium constant is not given as a number (a double overflows near 1e308)
LOG10_K_MAX = 300.0
#: what a missing half-reaction id must hold
HALF_REACTION_ID = "a half-reaction id such as Zn2+/Zn"
#: the fields of an ``electrode`` request, listed in this order in a message
ELECTRODE_FIELDS = tuple(sorted(set(CONDITION_KEYS) | {"id"}))
#: the reference electrodes field engineers read potentials against (ids of the dataset), in the
#: order a result lists them: buried and fresh-water work (CSE), the laboratory (SCE, Ag/AgCl in
#: saturated KCl) and seawater work (Ag/AgCl in seawater) (common practice)
FIELD_SCALES = ("CSE", "SCE", "Ag/AgCl sat. KCl", "Ag/AgCl seawater")


def nernst(E0_V, n, log10_Q, temp_C):
    """Nernst equation: E = E° − (ln10·RT/nF)·log10 Q.

    Args:
        E0_V: standard potential at the temperature [V vs SHE]
        n: electrons transferred [unitless]
        log10_Q: log10 of the reaction quotient [unitless]
        temp_C: temperature [°C]

    Returns:
        E [V vs SHE]

    References:
        W. Nernst, Z. physik. Chem. 4 (1889) 129; Bard & Faulkner, Electrochemical Methods,
        2nd ed. (2001), eq. (2.1.45) (from memory).

    >>> round(nernst(1.1037, 2, math.log10(0.1 / 0.001), 25.0), 4)
    1.0445
    """
    return E0_V - constants.nernst_slope(temp_C + constants.T_ZERO_C) / n * log10_Q


def log10_quotient(oxidised, reduced, activities):
    """log10 of the reaction quotient of a reduction: log10 Q = Σ ν·log10 a(reduced) − Σ ν·log10 a(oxidised).

    Args:
        oxidised: the species of the oxidised side [unitless]
        reduced: the species of the reduced side [unitless]
        activities: species key -> :class:`calc.conditions.SpeciesActivity` [unitless]

    Returns:
        log10 Q [unitless]

    References:
        The reaction quotient of the Nernst equation, e.g. Bard & Faulkner, Electrochemical
        Methods, 2nd ed. (2001), §2.1 (from memory).

    >>> from calc.conditions import SpeciesActivity
    >>> from calc.species import parse_species
    >>> acts = {"Zn2+(aq)": SpeciesActivity("Zn2+", "aq", 0.01, "given"),
    ...         "Zn(s)": SpeciesActivity("Zn", "s", 1.0, "solid")}
    >>> log10_quotient([parse_species("Zn2+(aq)")], [parse_species("Zn(s)")], acts)
    2.0
    """
    return sum(s.coeff * math.log10(activities[s.key].activity) for s in reduced) - \
        sum(s.coeff * math.log10(activities[s.key].activity) for s in oxidised)


def _quotient_text(ox, red, acts):
    """Q written with symbols and with the numbers put in (solids and liquids left out)."""
    def prod(side):
        parts = []
        for s in side:
            a = acts[s.key].activity
            if s.phase in ("s", "l"):
                continue
            sym = f"a({s.name})" if s.phase == "aq" else f"(p({s.name})/p°)"
            val = fmt(a)
            if s.coeff != 1:
                sym += f"^{term(s.coeff, '').strip()}"
                val = f"{val}^{term(s.coeff, '').strip()}"
            parts.append((sym, val))
        return parts

    def join(parts, i, bracket):
        text = "·".join(p[i] for p in parts) or "1"
        return f"[{text}]" if bracket and len(parts) > 1 else text

    num, den = prod(red), prod(ox)
    sym = join(num, 0, False) + " / " + join(den, 0, True)
    val = join(num, 1, False) + " / " + join(den, 1, True)
    return sym, val


@dataclass(frozen=True)
class ElectrodePotential:
    """The potential of one electrode under stated conditions, with its derivation."""

    id: str
    name: str
    reaction: str
    n: int
    temp_C: float
    potential_V: float
    standard_potential_V: float
    standard_potential_25C_V: float
    Q: object  # float, or None when it overflows a double
    log10_Q: float
    activities: tuple
    hypothetical: bool
    steps: tuple
    warnings: tuple
    sources: tuple

    def to_dict(self):
        """Plain data for JSON (activities as dicts)."""
        out = {key: getattr(self, key) for key in self.__dataclass_fields__}
        out["activities"] = [a.to_dict() for a in self.activities]
        for key in ("steps", "warnings"):
            out[key] = [dict(item) for item in out[key]]
        out["sources"] = list(self.sources)
        return out


def electrode_under(rec, cond, field="id", used=None):
    """Potential of one half-reaction record under checked conditions (Nernst with the full quotient).

    Args:
        rec: a half-reaction record (from :func:`calc.standard.half_reaction`) [unitless]
        cond: the checked :class:`calc.conditions.Conditions` [unitless]
        field: the input field shown in a warning about the half-reaction [unitless]
        used: a set receiving the (field, key) pairs of the given values that were used [unitless]

    Returns:
        an :class:`ElectrodePotential`

    References:
        :func:`calc.standard.standard_potential_at`, :func:`log10_quotient`, :func:`nernst`.

    >>> r = electrode_under(half_reaction("Cu2+/Cu"), read_conditions({"activities": {"Cu2+": 0.01}}))
    >>> round(r.potential_V - r.standard_potential_V, 5)
    -0.05916
    """
    used = used if used is not None else set()
    sp = standard_potential_at(rec, cond.temp_C, field)
    ox, red, n = sides(rec)
    d = Derivation()
    d.merge(sp)
    acts = activities_for(ox + red, cond, d, used)
    log10_Q = log10_quotient(ox, red, acts)
    Q = 10.0 ** log10_Q if abs(log10_Q) <= LOG10_K_MAX else None
    sym, val = _quotient_text(ox, red, acts)
    d.step("Reaction quotient (reduced side over oxidised side; solids and liquid water at unit activity)",
           f"Q = {sym}", f"Q = {val}", f"log10 Q = {fmt(log10_Q)}" + (f", Q = {fmt(Q)}" if Q is not None else ""))
    t = cond.temp_C
    E = nernst(sp.standard_potential_V, n, log10_Q, t)
    d.step("Nernst equation", "E = E°(T) − (ln10·R·T/(n·F))·log10 Q",
           f"E = {fmt(sp.standard_potential_V)} V − ({fmt(constants.nernst_slope(t + constants.T_ZERO_C))} V/{n})·"
           f"({fmt(log10_Q)})", f"E({rec['id']}) = {fmt(E)} V vs SHE")
    return ElectrodePotential(rec["id"], rec.get("name", rec["id"]), sp.reaction, n, t, E, sp.standard_potential_V,
                              sp.standard_potential_25C_V, Q, log10_Q, tuple(acts[s.key] for s in ox + red),
                              sp.hypothetical, tuple(d.steps), tuple(d.warnings), tuple(d.sources))


def electrode_potential(half_reaction_id, conditions=None):
    """Potential of one half-reaction at stated conditions (Nernst with the full quotient).

    Args:
        half_reaction_id: the half-reaction id, e.g. ``Zn2+/Zn`` [unitless]
        conditions: condition fields as in :func:`calc.conditions.read_conditions` (temp_C [°C],
            activities [unitless], molalities [mol/kg], pressures [atm], ionic_strength [mol/kg],
            env, composition [mol/kg], model, pH [unitless]) [unitless]

    Returns:
        an :class:`ElectrodePotential`

    References:
        :func:`calc.standard.standard_potential`, :func:`nernst`, activities per :mod:`calc.conditions`.

    >>> r = electrode_potential("H+/H2", {"pH": 7, "pressures": {"H2": 1 / 1.01325}})
    >>> round(r.potential_V, 4)
    -0.4141
    """
    conditions = conditions or {}
    if not isinstance(conditions, dict):
        raise InputError("conditions", conditions, "a mapping of condition fields")
    cond = read_conditions(conditions)
    used = set()
    res = electrode_under(half_reaction(half_reaction_id, "id"), cond, "id", used)
    d = Derivation()
    note_unused(cond, used, d)
    return replace(res, warnings=res.warnings + tuple(d.warnings)) if d.warnings else res


def field_scales(E_V_SHE, temp_C, scales=FIELD_SCALES):
    """A potential on the reference scales of field work, each electrode at the same temperature.

    Each value is :func:`calc.refelec.convert` of the potential from SHE to that electrode (the
    electrode's own temperature model from the dataset); one derivation step per electrode.

    Args:
        E_V_SHE: the potential [V vs SHE]
        temp_C: temperature of the electrodes, 0 to 100 [°C]
        scales: reference electrode ids [unitless]

    Returns:
        dict with ``potential_vs`` (electrode id -> potential [V vs that electrode]) and
        ``detail`` (steps, warnings, sources)

    References:
        Reference-electrode scale conversion, :func:`calc.refelec.convert`; each electrode's
        value and temperature model from the dataset (with its source id).

    >>> r = field_scales(-0.534, 25.0)
    >>> round(r["potential_vs"]["CSE"], 3), round(r["potential_vs"]["Ag/AgCl seawater"], 3)
    (-0.85, -0.784)
    """
    d = Derivation()
    out = {}
    for rid in scales:
        try:
            r = refelec.convert(E_V_SHE, "SHE", rid, temp_C)
        except InputError as exc:  # a potential no meter reads (beyond the readings calc converts)
            d.warn("potential_V", f"{fmt(E_V_SHE)} V vs SHE is not expressed on the field scales: {exc.allowed}")
            return {"potential_vs": {}, "detail": d.as_dict()}
        out[r["to"]] = r["value_V"]
        d.step(f"On the {r['to']} scale", f"E(vs {r['to']}) = E(vs SHE) − E({r['to']} vs SHE at t)",
               f"E = {fmt(E_V_SHE)} V − ({fmt(r['E_to_V_SHE'])} V) at {fmt(r['temp_C'])} °C",
               f"E = {fmt(r['value_V'])} V vs {r['to']}")
        for w in r["warnings"]:
            d.warn(w["field"], w["message"])
        for src in r["sources"]:
            d.cite(src)
    return {"potential_vs": out, "detail": d.as_dict()}


#: temperatures of the curve of E against temperature that an electrode result carries [°C]
CURVE_TEMPS_C = (0.0, 10.0, 20.0, 25.0, 30.0, 40.0, 50.0, 60.0, 70.0, 80.0, 90.0, 100.0)
#: log10 of the activities of the curve of E against the activity of a dissolved species [unitless]
CURVE_LOG10_A = tuple(float(k) for k in range(-8, 1))


def _potential_or_none(rec, conditions):
    try:
        return electrode_under(rec, read_conditions(conditions)).potential_V
    except InputError:  # a point the conditions do not allow (e.g. an activity model beyond its range)
        return None


def electrode_curves(rec, conditions):
    """The curves an electrode result carries for its charts: E against temperature, and E against
    the activity of its first dissolved species given by activity (the other conditions as given).

    Args:
        rec: the half-reaction record [unitless]
        conditions: the request's condition fields (as for :func:`electrode_potential`) [unitless]

    Returns:
        dict with ``temperature`` ({temp_C [°C], potential_V [V vs SHE]}) and ``activity``
        ({species, log10_activity [unitless], potential_V [V vs SHE]}, or None); a point the
        conditions do not allow is None

    References:
        :func:`electrode_under` at each point (Nernst with the full reaction quotient).

    >>> c = electrode_curves(half_reaction("Cu2+/Cu"), {"activities": {"Cu2+": 0.01}})
    >>> len(c["temperature"]["potential_V"]), c["activity"]["species"]
    (12, 'Cu2+')
    """
    temps = [_potential_or_none(rec, {**conditions, "temp_C": t}) for t in CURVE_TEMPS_C]
    ox, red, _ = sides(rec)
    given = conditions.get("activities") if isinstance(conditions.get("activities"), dict) else {}
    ion = next((x.name for x in ox + red if x.phase == "aq" and x.name not in ("H+", "OH-") and x.name in given), None)
    curve = None
    if ion is not None:
        curve = {"species": ion, "log10_activity": list(CURVE_LOG10_A), "potential_V": [
            _potential_or_none(rec, {**conditions, "activities": {**given, ion: 10.0 ** lg}}) for lg in CURVE_LOG10_A]}
    return {"temperature": {"temp_C": list(CURVE_TEMPS_C), "potential_V": temps}, "activity": curve}


def electrode_entry(req):
    """JSON entry point ``electrode``: the potential of one half-reaction at stated conditions.

    Request fields: ``id`` (half-reaction id) and the condition fields of
    :func:`calc.conditions.read_conditions`.

    Args:
        req: the request dict [unitless]

    Returns:
        dict with id, name, potential_V, standard_potential_V, standard_potential_25C_V,
        temp_C, reaction, n, Q, log10_Q, activities, hypothetical, steps, warnings, sources,
        potential_vs (the potential on each of :data:`FIELD_SCALES`: electrode id -> [V vs that
        electrode], at the request's temperature), potential_vs_detail (its steps, warnings and
        sources, :func:`field_scales`), curves (:func:`electrode_curves`, for the page's charts),
        data_version

    References:
        See :func:`electrode_potential`.

    >>> r = electrode_entry({"id": "Cu2+/Cu", "activities": {"Cu2+": 0.01}})
    >>> round(r["potential_V"] - r["standard_potential_V"], 5)
    -0.05916
    >>> sorted(r["potential_vs"]) == sorted(FIELD_SCALES)
    True
    """
    read(req, "electrode", None, ELECTRODE_FIELDS)  # the fields listed in sorted order, as always
    read(req, "electrode", {"id": HALF_REACTION_ID}, ELECTRODE_FIELDS)
    res = electrode_potential(req["id"], {k: v for k, v in req.items() if k != "id"})
    out = res.to_dict()
    scales = field_scales(res.potential_V, res.temp_C)
    out["potential_vs"] = scales["potential_vs"]
    out["potential_vs_detail"] = scales["detail"]
    out["curves"] = electrode_curves(half_reaction(req["id"], "id"), {k: v for k, v in req.items() if k != "id"})
    out["data_version"] = current().version
    return out
