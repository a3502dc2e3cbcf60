"""Electrode potentials: E°(T), the Nernst equation with the full reaction quotient, and couples.

Methods:

- E°(T): the Gibbs–Helmholtz integration of the standard reaction (the half-reaction against the
  standard hydrogen electrode) with a constant ΔCp°:
  E°(T) = E°(T0) + ΔS°/(nF)·(T − T0) − ΔCp°/(nF)·[(T − T0) − T·ln(T/T0)], ΔS° = nF·(dE°/dT)
  (e.g. A. J. Bard, R. Parsons, J. Jordan, *Standard Potentials in Aqueous Solution*, IUPAC 1985,
  ch. 1; S. G. Bratsch, J. Phys. Chem. Ref. Data 18 (1989) 1, eqs. (2)–(4), from memory). With no
  ΔCp° the last term is dropped (a constant isothermal coefficient). E°(H+/H2) = 0 at every
  temperature by convention. Records state their valid range (default 0–100 °C); outside it a
  warning is given; the engine refuses temperatures outside 0–100 °C (see :mod:`calc.derivation`).
- Nernst: E = E°(T) − (ln10·RT/nF)·log10 Q, Q = Π a(reduced side)^ν / Π a(oxidised side)^ν for
  the reduction ``oxidised + n e− → reduced``; activities as in :mod:`calc.conditions`.
- Couples: the electrode with the lower potential at the stated conditions is the anode; the
  overall reaction is the cathode reduction plus the anode oxidation, each scaled to
  n = lcm(n_anode, n_cathode) electrons, with species on both sides cancelled;
  E_cell = E_cathode − E_anode, ΔG = −nF·E_cell, log10 K = nF·E°_cell/(RT·ln10).
- Constants: CODATA 2018 (:mod:`calc.constants`).
"""

import math
from dataclasses import asdict, dataclass, replace

from . import constants
from .conditions import KEYS as CONDITION_KEYS
from .conditions import PH_HARD, PH_USUAL, activities_for, key_of, note_unused, read_conditions
from .dataset import current
from .derivation import Derivation, check_number, check_temperature, fmt
from .errors import DataError, InputError
from .species import parse_species

#: reference temperature of the tabulated standard potentials [K]
T0_K = constants.T_STANDARD
#: beyond this |log10 K| the equilibrium constant is not given as a number (a double overflows near 1e308)
LOG10_K_MAX = 300.0
#: side-condition fields a couple accepts for one electrode only
SIDE_KEYS = ("activities", "molalities", "pressures", "pH")


def half_reaction(half_reaction_id, field="id"):
    """The dataset record of a half-reaction, by id or alias (closest matches on a miss).

    Args:
        half_reaction_id: e.g. ``Zn2+/Zn`` [unitless]
        field: the input field shown in an error [unitless]

    Returns:
        the record (dict)

    References:
        data/half_reactions.yaml (DEVELOPERS.md).

    >>> half_reaction("Cu2+/Cu")["n"]
    2
    """
    return current().get("half_reactions", half_reaction_id, field)


def _sides(rec):
    try:
        ox = [parse_species(s) for s in rec["oxidised"]]
        red = [parse_species(s) for s in rec["reduced"]]
        n = int(rec["n"])
    except (KeyError, TypeError, ValueError, InputError) as exc:
        raise DataError(f"half-reaction {rec.get('id')!r} is malformed in the dataset: {exc}") from None
    return ox, red, n


def _term(coeff, key):
    if abs(coeff - round(coeff)) < 1e-9:
        c = int(round(coeff))
        return key if c == 1 else f"{c} {key}"
    return f"{fmt(coeff, 4)} {key}"


def reaction_text(oxidised, reduced, n):
    """A reduction written out: ``Zn2+(aq) + 2 e- → Zn(s)``.

    Args:
        oxidised: the species of the oxidised side [unitless]
        reduced: the species of the reduced side [unitless]
        n: electrons transferred [unitless]

    Returns:
        text

    References:
        IUPAC convention of writing electrode reactions as reductions.

    >>> reaction_text([parse_species("O2(g)"), parse_species("4 H+(aq)")], [parse_species("2 H2O(l)")], 4)
    'O2(g) + 4 H+(aq) + 4 e- → 2 H2O(l)'
    """
    left = [_term(s.coeff, s.key) for s in oxidised] + [_term(n, "e-")]
    right = [_term(s.coeff, s.key) for s in reduced]
    return " + ".join(left) + " → " + " + ".join(right)


def gibbs_helmholtz(E0_V, dEdT_V_per_K, n, temp_C, dCp_J_per_mol_K=None, t0_C=25.0):
    """Standard potential at a temperature from its value, slope and ΔCp° at T0.

    E°(T) = E°(T0) + ΔS°/(nF)·(T − T0) − ΔCp°/(nF)·[(T − T0) − T·ln(T/T0)], ΔS° = nF·dE°/dT.

    Args:
        E0_V: standard potential at t0_C [V vs SHE]
        dEdT_V_per_K: isothermal temperature coefficient dE°/dT at t0_C [V/K]
        n: electrons transferred [unitless]
        temp_C: temperature [°C]
        dCp_J_per_mol_K: heat-capacity change of the reaction against the SHE, or None [J/(mol·K)]
        t0_C: temperature of E0_V and the slope [°C]

    Returns:
        E°(T) [V vs SHE]

    References:
        Gibbs–Helmholtz integration with constant ΔCp°: Bard, Parsons & Jordan, Standard
        Potentials in Aqueous Solution (IUPAC 1985), ch. 1; Bratsch, J. Phys. Chem. Ref. Data
        18 (1989) 1 (from memory).

    >>> round(gibbs_helmholtz(0.7996, -0.989e-3, 1, 50.0), 4)
    0.7749
    >>> round(gibbs_helmholtz(0.22233, -0.6457e-3, 1, 60.0, -176.0), 4)
    0.1961
    """
    T = temp_C + constants.T_ZERO_C
    T0 = t0_C + constants.T_ZERO_C
    E = E0_V + dEdT_V_per_K * (T - T0)
    if dCp_J_per_mol_K:
        E -= dCp_J_per_mol_K / (n * constants.FARADAY) * ((T - T0) - T * math.log(T / T0))
    return E


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


def _is_hydrogen_reference(ox, red):
    return ([(s.name, s.phase, s.coeff) for s in ox] == [("H+", "aq", 2.0)]
            and [(s.name, s.phase, s.coeff) for s in red] == [("H2", "g", 1.0)])


@dataclass(frozen=True)
class StandardPotential:
    """E° of a half-reaction at a temperature, with its derivation."""

    id: str
    n: int
    reaction: str
    temp_C: float
    standard_potential_V: float
    standard_potential_25C_V: float
    hypothetical: bool
    steps: tuple
    warnings: tuple
    sources: tuple


def _num(rec, key):
    v = rec.get(key)
    if v is None:
        return None
    if isinstance(v, bool) or not isinstance(v, (int, float)) or not math.isfinite(v):
        raise DataError(f"half-reaction {rec.get('id')!r}: {key} = {v!r} is not a number")
    return float(v)


def standard_potential(half_reaction_id, temp_C=25.0, field="id"):
    """Standard potential E° of a half-reaction at a temperature.

    Args:
        half_reaction_id: the half-reaction id, e.g. ``Cu2+/Cu`` [unitless]
        temp_C: temperature, 0 to 100 [°C]
        field: the input field shown in an error [unitless]

    Returns:
        a :class:`StandardPotential`

    References:
        E° at 25 °C and dE°/dT, ΔCp° from the dataset (with their source ids); integration as in
        :func:`gibbs_helmholtz`.

    >>> r = standard_potential("Cu2+/Cu", 25)
    >>> r.standard_potential_V == r.standard_potential_25C_V
    True
    """
    rec = half_reaction(half_reaction_id, field)
    t = check_temperature(temp_C)
    ox, red, n = _sides(rec)
    d = Derivation()
    E25 = _num(rec, "E0_V")
    if E25 is None:
        raise DataError(f"half-reaction {rec.get('id')!r} has no E0_V")
    d.cite(rec.get("E0_source"))
    conf = rec.get("E0_confidence")
    spread = f"; spread: {rec['spread']}" if rec.get("spread") else ""
    rid = rec["id"]
    d.step(f"Standard potential of {rid} at 25 °C (tabulated)", reaction_text(ox, red, n),
           f"source {rec.get('E0_source', '?')}" + (f" ({conf})" if conf else "") + spread,
           f"E°(25 °C) = {fmt(E25)} V vs SHE")
    if rec.get("hypothetical"):
        d.warn(field, f"{rid} is a hypothetical couple: its ion is not stable in water, so its potential is a thermodynamic estimate only")
    lo, hi = 0.0, 100.0
    if rec.get("valid_C") is not None:
        try:
            lo, hi = (float(x) for x in rec["valid_C"])
        except (TypeError, ValueError):
            raise DataError(f"half-reaction {rid!r}: valid_C = {rec['valid_C']!r} is not [low, high]") from None
    dEdT_mV = _num(rec, "dEdT_mV_per_K")
    dCp = _num(rec, "dCp_J_per_mol_K")
    T = t + constants.T_ZERO_C
    if _is_hydrogen_reference(ox, red):
        E = 0.0
        d.step("Standard potential at the temperature", "E°(H+/H2) = 0 V at every temperature (convention)",
               f"t = {fmt(t)} °C", "E°(T) = 0 V vs SHE")
    elif dEdT_mV is None:
        E = E25
        if abs(t - 25.0) > 1e-9:
            d.warn("temp_C", f"{rid} has no temperature coefficient in the dataset: E° at 25 °C is used at {fmt(t)} °C")
        d.step("Standard potential at the temperature", "no dE°/dT in the dataset: E°(T) = E°(25 °C)",
               f"t = {fmt(t)} °C", f"E°(T) = {fmt(E)} V vs SHE")
    else:
        d.cite(rec.get("dEdT_source"))
        dS = n * constants.FARADAY * dEdT_mV / 1000.0
        E = gibbs_helmholtz(E25, dEdT_mV / 1000.0, n, t, dCp)
        if dCp:
            d.cite(rec.get("dCp_source"))
            d.step("Standard potential at the temperature (Gibbs–Helmholtz, constant ΔCp°)",
                   "E°(T) = E°(T0) + ΔS°/(nF)·(T − T0) − ΔCp°/(nF)·[(T − T0) − T·ln(T/T0)], ΔS° = nF·dE°/dT, T0 = 298.15 K",
                   f"dE°/dT = {fmt(dEdT_mV)} mV/K → ΔS° = {fmt(dS, 5)} J/(mol·K); ΔCp° = {fmt(dCp)} J/(mol·K); "
                   f"E°(T) = {fmt(E25)} V + ({fmt(dEdT_mV / 1000.0)} V/K)·({fmt(T)} K − 298.15 K) − "
                   f"{fmt(dCp)}/({n}·{fmt(constants.FARADAY, 9)})·[({fmt(T - T0_K)}) − {fmt(T)}·ln({fmt(T)}/298.15)] V",
                   f"E°({fmt(t)} °C) = {fmt(E)} V vs SHE")
        else:
            d.step("Standard potential at the temperature (isothermal coefficient)",
                   "E°(T) = E°(T0) + (dE°/dT)·(T − T0), T0 = 298.15 K (ΔS° = nF·dE°/dT taken constant)",
                   f"E°(T) = {fmt(E25)} V + ({fmt(dEdT_mV)} mV/K)·({fmt(T)} K − 298.15 K); ΔS° = {fmt(dS, 5)} J/(mol·K)",
                   f"E°({fmt(t)} °C) = {fmt(E)} V vs SHE")
    if not lo - 1e-9 <= t <= hi + 1e-9:
        d.warn("temp_C", f"t = {fmt(t)} °C is outside the range where E°(T) of {rid} is stated valid ({fmt(lo)}–{fmt(hi)} °C): extrapolated")
    return StandardPotential(rid, n, reaction_text(ox, red, n), t, E, E25, bool(rec.get("hypothetical")),
                             tuple(d.steps), tuple(d.warnings), tuple(d.sources))


def _quotient_text(ox, red, acts):
    def prod(side):
        parts = []
        for s in side:
            a = acts[s.key].activity
            if s.phase in ("s", "l"):
                continue
            sym = f"a({s.name})" if s.phase == "aq" else f"(p({s.name})/p°)"
            val = fmt(a)
            if s.coeff != 1:
                sym += f"^{_term(s.coeff, '').strip()}"
                val = f"{val}^{_term(s.coeff, '').strip()}"
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
        out = asdict(self)
        out["activities"] = [a.to_dict() for a in self.activities]
        for key in ("steps", "warnings", "sources"):
            out[key] = list(out[key])
        return out


def _log10_Q(ox, red, acts):
    """log10 of the reaction quotient: reduced side over oxidised side, each activity to its coefficient."""
    return sum(s.coeff * math.log10(acts[s.key].activity) for s in red) - \
        sum(s.coeff * math.log10(acts[s.key].activity) for s in ox)


def _electrode(rec_id, cond, field, used):
    """Potential of one half-reaction under checked conditions; records what it used."""
    sp = standard_potential(rec_id, cond.temp_C, field)
    rec = half_reaction(rec_id, field)
    ox, red, n = _sides(rec)
    d = Derivation()
    d.steps.extend(sp.steps)
    for w in sp.warnings:
        d.warn(w["field"], w["message"])
    for s in sp.sources:
        d.cite(s)
    acts = activities_for(ox + red, cond, d, used)
    log10_Q = _log10_Q(ox, red, acts)
    Q = 10.0 ** log10_Q if abs(log10_Q) <= LOG10_K_MAX else None
    sym, val = _quotient_text(ox, red, acts)
    d.step("Reaction quotient (reduced side over oxidised side; solids and liquid water at unit activity)",
           f"Q = {sym}", f"Q = {val}", f"log10 Q = {fmt(log10_Q)}" + (f", Q = {fmt(Q)}" if Q is not None else ""))
    t = cond.temp_C
    slope = constants.nernst_slope(t + constants.T_ZERO_C)
    E = nernst(sp.standard_potential_V, n, log10_Q, t)
    d.step("Nernst equation", "E = E°(T) − (ln10·R·T/(n·F))·log10 Q",
           f"E = {fmt(sp.standard_potential_V)} V − ({fmt(slope)} V/{n})·({fmt(log10_Q)})",
           f"E({rec['id']}) = {fmt(E)} V vs SHE")
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
        :func:`standard_potential`, :func:`nernst`, activities per :mod:`calc.conditions`.

    >>> r = electrode_potential("H+/H2", {"pH": 7, "pressures": {"H2": 1 / 1.01325}})
    >>> round(r.potential_V, 4)
    -0.4141
    """
    conditions = conditions or {}
    if not isinstance(conditions, dict):
        raise InputError("conditions", conditions, "a mapping of condition fields")
    cond = read_conditions(conditions)
    used = set()
    res = _electrode(half_reaction_id, cond, "id", used)
    d = Derivation()
    note_unused(cond, used, d)
    if d.warnings:
        res = ElectrodePotential(**{**{k: getattr(res, k) for k in res.__dataclass_fields__},
                                    "warnings": res.warnings + tuple(d.warnings)})
    return res


def _check_request(req):
    if not isinstance(req, dict):
        raise InputError("request", type(req).__name__, "a JSON object")


def electrode_entry(req):
    """JSON entry point ``electrode``: the potential of one half-reaction at stated conditions.

    Request fields: ``id`` (half-reaction id) and the condition fields of
    :func:`calc.conditions.read_conditions`.

    Args:
        req: the request dict [unitless]

    Returns:
        dict with id, name, potential_V, standard_potential_V, standard_potential_25C_V,
        temp_C, reaction, n, Q, log10_Q, activities, hypothetical, steps, warnings, sources,
        data_version

    References:
        See :func:`electrode_potential`.

    >>> r = electrode_entry({"id": "Cu2+/Cu", "activities": {"Cu2+": 0.01}})
    >>> round(r["potential_V"] - r["standard_potential_V"], 5)
    -0.05916
    """
    _check_request(req)
    allowed = set(CONDITION_KEYS) | {"id"}
    for k in req:
        if k not in allowed:
            raise InputError(k, req[k], "no such field", "electrode takes: " + ", ".join(sorted(allowed)))
    if "id" not in req:
        raise InputError("id", None, "a half-reaction id such as Zn2+/Zn")
    res = electrode_potential(req["id"], {k: v for k, v in req.items() if k != "id"})
    out = res.to_dict()
    out["data_version"] = current().version
    return out


def _side_request(req, side):
    """Shared condition fields, with the one-electrode fields of ``<side>_conditions`` merged in."""
    shared = {k: req[k] for k in CONDITION_KEYS if k in req}
    extra = req.get(f"{side}_conditions")
    if extra is None:
        return shared, {}
    field = f"{side}_conditions"
    if not isinstance(extra, dict):
        raise InputError(field, extra, "a mapping with any of " + ", ".join(SIDE_KEYS))
    for k in extra:
        if k not in SIDE_KEYS:
            raise InputError(f"{field}.{k}", extra[k], "only " + ", ".join(SIDE_KEYS) + " per electrode",
                             "temperature, ionic strength and model apply to the whole cell")
    merged = dict(shared)
    for k in ("activities", "molalities", "pressures"):
        if k in extra:
            if not isinstance(extra[k], dict):
                raise InputError(f"{field}.{k}", extra[k], "a mapping {species: value}")
            base = merged.get(k) or {}
            if not isinstance(base, dict):
                raise InputError(k, base, "a mapping {species: value}")
            over = {key_of(n) for n in extra[k]}
            merged[k] = {**{n: v for n, v in base.items() if key_of(n) not in over}, **extra[k]}
    if "pH" in extra:
        merged["pH"] = extra["pH"]
    return merged, extra


def _overrides(extra):
    keys = set()
    for field in ("activities", "molalities", "pressures"):
        for name in (extra.get(field) or {}):
            keys.add((field, key_of(name)))
    if extra.get("pH") is not None:
        keys.add(("pH", ""))
    return keys


def _balanced(cathode_rec, anode_rec, same):
    """The overall cell reaction with electrons cancelled by the least common multiple."""
    ox_c, red_c, n_c = _sides(cathode_rec)
    ox_a, red_a, n_a = _sides(anode_rec)
    n = n_c * n_a // math.gcd(n_c, n_a)
    kc, ka = n // n_c, n // n_a

    def tag(s, where):
        if same and s.phase in ("aq", "g"):
            return f"{s.name}({s.phase}, {where} side)"
        return s.key

    left, right = {}, {}
    for s in ox_c:
        left[tag(s, "cathode")] = left.get(tag(s, "cathode"), 0) + kc * s.coeff
    for s in red_a:
        left[tag(s, "anode")] = left.get(tag(s, "anode"), 0) + ka * s.coeff
    for s in red_c:
        right[tag(s, "cathode")] = right.get(tag(s, "cathode"), 0) + kc * s.coeff
    for s in ox_a:
        right[tag(s, "anode")] = right.get(tag(s, "anode"), 0) + ka * s.coeff
    for key in list(left):
        if key in right:
            m = min(left[key], right[key])
            left[key] -= m
            right[key] -= m
    lhs = [_term(c, k) for k, c in left.items() if c > 1e-12]
    rhs = [_term(c, k) for k, c in right.items() if c > 1e-12]
    text = (" + ".join(lhs) or "(nothing)") + " → " + (" + ".join(rhs) or "(nothing)")
    return n, text, kc, ka


def _public(el):
    out = el.to_dict()
    for key in ("steps", "warnings", "sources"):
        out.pop(key)
    return out


def couple(a, b, conditions=None):
    """Which of two half-reactions is the anode at stated conditions, and the cell it makes.

    Args:
        a: one half-reaction id [unitless]
        b: the other half-reaction id [unitless]
        conditions: the condition fields of :func:`calc.conditions.read_conditions`, optionally
            with ``a_conditions`` / ``b_conditions`` (activities, molalities, pressures, pH for
            one electrode only, e.g. a concentration cell) [unitless]

    Returns:
        dict as described in :func:`couple_entry` (without data_version)

    References:
        E_cell = E_cathode − E_anode; ΔG = −nFE; log10 K = nFE°/(RT ln10): e.g. Bard & Faulkner,
        Electrochemical Methods, 2nd ed. (2001), ch. 2 (from memory).

    >>> r = couple("Zn2+/Zn", "Cu2+/Cu")
    >>> r["anode"], round(r["cell_potential_V"], 4), r["overall_reaction"]
    ('Zn2+/Zn', 1.1037, 'Cu2+(aq) + Zn(s) → Cu(s) + Zn2+(aq)')
    """
    req = dict(conditions or {})
    rec_a = half_reaction(a, "a")
    rec_b = half_reaction(b, "b")
    same = rec_a["id"] == rec_b["id"]
    cond = read_conditions({k: req[k] for k in CONDITION_KEYS if k in req})
    results, used, extras = {}, {}, {}
    for side, rid in (("a", rec_a["id"]), ("b", rec_b["id"])):
        merged, extra = _side_request(req, side)
        extras[side] = extra
        side_cond = read_conditions(merged, prefix=f"{side}_conditions." if extra else "")
        used[side] = set()
        results[side] = _electrode(rid, side_cond, side, used[side])
    ea, eb = results["a"], results["b"]
    # the lower potential is the anode; ties are broken by quantities that do not depend on the order of a and b
    order = sorted(("a", "b"), key=lambda s: (results[s].potential_V, results[s].standard_potential_V, results[s].id,
                                             repr(sorted(extras[s].items(), key=str))))
    an, ca = order[0], order[1]
    anode, cathode = results[an], results[ca]
    d = Derivation()
    for role, el in (("Anode", anode), ("Cathode", cathode)):
        for st in el.steps:
            d.steps.append({**st, "title": f"{role} {el.id}: {st['title']}"})
        for w in el.warnings:
            d.warn(w["field"], w["message"])
        for s in el.sources:
            d.cite(s)
    # values given and used by neither electrode
    ov_a, ov_b = _overrides(extras["a"]), _overrides(extras["b"])
    shared_used = {k for k in used["a"] if k not in ov_a} | {k for k in used["b"] if k not in ov_b}
    note_unused(cond, shared_used, d)
    for side, ov in (("a", ov_a), ("b", ov_b)):
        if extras[side]:
            note_unused(read_conditions(extras[side], prefix=f"{side}_conditions."), used[side] & ov, d,
                        prefix=f"{side}_conditions.")
    t = cond.temp_C
    n, overall, kc, ka = _balanced(half_reaction(cathode.id), half_reaction(anode.id), same)
    E_cell = cathode.potential_V - anode.potential_V
    E0_cell = cathode.standard_potential_V - anode.standard_potential_V
    F = constants.FARADAY
    dG = -n * F * E_cell / 1000.0
    dG0 = -n * F * E0_cell / 1000.0
    slope = constants.nernst_slope(t + constants.T_ZERO_C)
    log10_K = n * E0_cell / slope
    if abs(log10_K) <= LOG10_K_MAX:
        K, K_note = 10.0 ** log10_K, None
    else:
        K, K_note = None, (f"K = 10^{fmt(log10_K, 6)} is beyond the range of a double-precision number; "
                           "use log10_K")
    d.step("Anode and cathode", "anode = the electrode with the lower potential at the stated conditions",
           f"E({anode.id}) = {fmt(anode.potential_V)} V, E({cathode.id}) = {fmt(cathode.potential_V)} V vs SHE",
           f"anode: {anode.id}; cathode: {cathode.id}")
    if abs(E_cell) < 1e-12:
        d.warn("b", "both electrodes are at the same potential: no driving force, no galvanic current")
    d.step("Overall reaction (electrons cancelled by the least common multiple)",
           f"n = lcm({anode.n}, {cathode.n}); cathode reduction × {kc} + anode oxidation × {ka}",
           f"n = {n}", overall)
    d.step("Cell potential", "E_cell = E_cathode − E_anode",
           f"E_cell = {fmt(cathode.potential_V)} V − ({fmt(anode.potential_V)} V)", f"E_cell = {fmt(E_cell)} V")
    d.step("Standard cell potential at the temperature (same anode and cathode)", "E°_cell = E°_cathode(T) − E°_anode(T)",
           f"E°_cell = {fmt(cathode.standard_potential_V)} V − ({fmt(anode.standard_potential_V)} V)",
           f"E°_cell = {fmt(E0_cell)} V")
    d.step("Reaction free energy", "ΔG = −n·F·E_cell, ΔG° = −n·F·E°_cell (per mole of the overall reaction as written)",
           f"ΔG = −{n}·{fmt(F, 9)} C/mol·{fmt(E_cell)} V; ΔG° = −{n}·{fmt(F, 9)} C/mol·{fmt(E0_cell)} V",
           f"ΔG = {fmt(dG)} kJ/mol, ΔG° = {fmt(dG0)} kJ/mol")
    d.step("Equilibrium constant", "log10 K = n·F·E°_cell/(ln10·R·T) = n·E°_cell/(ln10·R·T/F)",
           f"log10 K = {n}·{fmt(E0_cell)} V / {fmt(slope)} V", f"log10 K = {fmt(log10_K)}"
           + (f", K = {fmt(K)}" if K is not None else " (K itself overflows: see log10_K)"))
    std_anode = None
    if not same:
        std = sorted((ea, eb), key=lambda e: (e.standard_potential_V, e.id))
        std_anode = std[0].id
        if std_anode != anode.id and abs(ea.standard_potential_V - eb.standard_potential_V) > 1e-12:
            d.warn("activities", f"at standard conditions (unit activities, {fmt(t)} °C) the anode would be "
                                 f"{std_anode}: the stated conditions reverse the couple, so the standard "
                                 "cell potential and ΔG° are negative for the reaction as written")
    return {
        "anode": anode.id, "cathode": cathode.id, "temp_C": t,
        "cell_potential_V": E_cell, "standard_cell_potential_V": E0_cell, "n_electrons": n,
        "delta_G_kJ_per_mol": dG, "standard_delta_G_kJ_per_mol": dG0,
        "log10_K": log10_K, "equilibrium_constant": K, "equilibrium_constant_note": K_note,
        "overall_reaction": overall,
        "anode_potential_V": anode.potential_V, "cathode_potential_V": cathode.potential_V,
        "standard_anode": std_anode,
        "anode_electrode": _public(anode), "cathode_electrode": _public(cathode),
        **d.as_dict(),
    }


def couple_entry(req):
    """JSON entry point ``couple``: anode, cathode, cell potential, ΔG and K of two half-reactions.

    Request fields: ``a``, ``b`` (half-reaction ids), the condition fields of
    :func:`calc.conditions.read_conditions` (shared by both electrodes), and optionally
    ``a_conditions`` / ``b_conditions`` (activities, molalities, pressures, pH of one electrode).

    Args:
        req: the request dict [unitless]

    Returns:
        dict with anode, cathode, temp_C, cell_potential_V, standard_cell_potential_V,
        n_electrons, delta_G_kJ_per_mol, standard_delta_G_kJ_per_mol, log10_K,
        equilibrium_constant (null with equilibrium_constant_note when it overflows),
        overall_reaction, anode_potential_V, cathode_potential_V, standard_anode,
        anode_electrode, cathode_electrode, steps, warnings, sources, data_version

    References:
        See :func:`couple`.

    >>> r = couple_entry({"a": "Cu2+/Cu", "b": "Zn2+/Zn", "activities": {"Zn2+": 0.1, "Cu2+": 0.001}})
    >>> round(r["cell_potential_V"], 4), r["n_electrons"]
    (1.0445, 2)
    """
    _check_request(req)
    allowed = set(CONDITION_KEYS) | {"a", "b", "a_conditions", "b_conditions"}
    for k in req:
        if k not in allowed:
            raise InputError(k, req[k], "no such field", "couple takes: " + ", ".join(sorted(allowed)))
    for k in ("a", "b"):
        if k not in req:
            raise InputError(k, None, "a half-reaction id such as Zn2+/Zn")
    out = couple(req["a"], req["b"], {k: v for k, v in req.items() if k not in ("a", "b")})
    out["data_version"] = current().version
    return out


# --------------------------------------------------------------------------------------------
# E–pH lines

#: pH values of an E–pH line unless the request gives its own [unitless]
EPH_PH = tuple(float(p) for p in range(15))
#: most lines and most pH values one E–pH request may ask for
EPH_MAX_LINES, EPH_MAX_POINTS = 8, 141
#: condition fields of one line (the temperature is shared and pH is the axis)
EPH_LINE_KEYS = ("id",) + tuple(k for k in CONDITION_KEYS if k not in ("temp_C", "pH"))


def _eph_values(values):
    if not isinstance(values, (list, tuple)) or not 2 <= len(values) <= EPH_MAX_POINTS:
        raise InputError("pH_values", values if not isinstance(values, (list, tuple)) or len(values) < 2
                         else f"a list of {len(values)} values", f"a list of 2 to {EPH_MAX_POINTS} pH values")
    return [check_number(v, f"pH_values[{k}]", f"a pH from {PH_HARD[0]:g} to {PH_HARD[1]:g}",
                         low=PH_HARD[0], high=PH_HARD[1]) for k, v in enumerate(values)]


def eph_lines(lines, temp_C=25.0, pH_values=EPH_PH):
    """Potentials of several half-reactions across a range of pH: the lines of an E–pH chart.

    Each line is one half-reaction with its own activities, pressures or molalities (and activity
    model); at every pH value a(H+) = 10^−pH (a(OH−) from the ion product of water) and the
    potential is the Nernst equation with the full reaction quotient, exactly as
    :func:`electrode_potential` computes it at that pH (without writing the derivation of every
    point). Lines of half-reactions without H+ or OH− are flat: pH changes none of their
    activities, so their potential is computed once and stands for every pH value.

    Args:
        lines: a list of ``{"id": half-reaction id, activities, molalities, pressures, ionic_strength,
            env, composition, model}`` (each as in :func:`calc.conditions.read_conditions`) [unitless]
        temp_C: temperature shared by all lines, 0 to 100 [°C]
        pH_values: the pH values, 2 to 141 of them, each from -2 to 16 [unitless]

    Returns:
        dict with temp_C, pH (the values), lines (id, name, n, standard_potential_V [V vs SHE],
        pH_dependent, potential_V [V vs SHE], one per pH value), steps, warnings, sources

    References:
        :func:`standard_potential`, :func:`nernst`; activities per :mod:`calc.conditions`
        (pKw: Bandura & Lvov 2006).

    >>> r = eph_lines([{"id": "H+/H2", "pressures": {"H2": 1 / 1.01325}}], 25.0, [0, 7])
    >>> [round(e, 4) for e in r["lines"][0]["potential_V"]]
    [0.0, -0.4141]
    """
    t = check_temperature(temp_C)
    pHs = _eph_values(pH_values)
    if not isinstance(lines, (list, tuple)) or not 1 <= len(lines) <= EPH_MAX_LINES:
        raise InputError("lines", lines if not isinstance(lines, (list, tuple)) or not lines
                         else f"a list of {len(lines)} lines",
                         f"a list of 1 to {EPH_MAX_LINES} lines, each {{id, activities, pressures, ...}}")
    d = Derivation()
    out = []
    for k, line in enumerate(lines):
        pre = f"lines[{k}]."
        if not isinstance(line, dict):
            raise InputError(f"lines[{k}]", line, "a mapping {id, activities, pressures, ...}")
        for key in line:
            if key not in EPH_LINE_KEYS:
                raise InputError(pre + str(key), line[key], "no such field",
                                 "a line takes: " + ", ".join(EPH_LINE_KEYS) + " (temp_C is shared; pH is the axis)")
        if "id" not in line:
            raise InputError(pre + "id", None, "a half-reaction id such as Zn2+/Zn")
        base = read_conditions({**{key: v for key, v in line.items() if key != "id"}, "temp_C": t}, pre)
        sp = standard_potential(line["id"], t, pre + "id")
        rec = half_reaction(line["id"], pre + "id")
        ox, red, n = _sides(rec)
        used, dl = set(), Derivation()
        depends = any(s.name in ("H+", "OH-") for s in ox + red)
        potentials = []
        for pH in pHs if depends else pHs[:1]:  # without H+ or OH-, pH changes no activity: one point
            acts = activities_for(ox + red, replace(base, pH=pH), dl, used)
            potentials.append(nernst(sp.standard_potential_V, n, _log10_Q(ox, red, acts), t))
        if not depends:
            potentials *= len(pHs)
        note_unused(base, used, dl, pre)
        for w in sp.warnings:
            d.warn(w["field"], w["message"])
        for w in dl.warnings:  # the pH warnings are given once, for pH_values, below
            f = w["field"]
            if f != "pH":
                d.warn(f if not f or f == "temp_C" or f.startswith(pre) else pre + f, w["message"])
        for src in list(sp.sources) + dl.sources:
            d.cite(src)
        out.append({"id": rec["id"], "name": rec.get("name", rec["id"]), "n": n,
                    "standard_potential_V": sp.standard_potential_V,
                    "pH_dependent": depends, "potential_V": potentials})
    outside = [p for p in pHs if not PH_USUAL[0] <= p <= PH_USUAL[1]]
    if outside:
        listed = ", ".join(fmt(p) for p in outside[:3]) + (", …" if len(outside) > 3 else "")
        d.warn("pH_values", f"pH values outside 0-14 ({listed}): activities this far from the dilute range are uncertain")
    d.step("E–pH lines: the Nernst equation at each pH",
           "E(pH) = E°(T) − (ln10·R·T/(n·F))·log10 Q, a(H+) = 10^−pH, a(OH−) = Kw(T)/a(H+); other activities as given",
           f"{len(out)} half-reaction(s) at {fmt(t)} °C; pH {fmt(pHs[0])} to {fmt(pHs[-1])} ({len(pHs)} values)",
           "; ".join(f"{ln['id']}: {fmt(ln['potential_V'][0])} to {fmt(ln['potential_V'][-1])} V vs SHE" for ln in out))
    return {"temp_C": t, "pH": pHs, "lines": out, **d.as_dict()}


def eph_entry(req):
    """JSON entry point ``eph``: the lines of an E–pH chart in one calculation.

    Request fields: ``lines`` (see :func:`eph_lines`), ``temp_C`` (optional, default 25 °C) and
    ``pH_values`` (optional, default 0, 1, …, 14).

    Args:
        req: the request dict [unitless]

    Returns:
        dict with temp_C, pH, lines (id, name, n, standard_potential_V, pH_dependent, potential_V),
        steps, warnings, sources, data_version

    References:
        See :func:`eph_lines`.

    >>> r = eph_entry({"lines": [{"id": "Zn2+/Zn", "activities": {"Zn2+": 1e-6}}, {"id": "O2/H2O"}]})
    >>> len(r["pH"]), r["lines"][0]["pH_dependent"], r["lines"][1]["pH_dependent"]
    (15, False, True)
    """
    _check_request(req)
    allowed = ("lines", "temp_C", "pH_values")
    for k in req:
        if k not in allowed:
            raise InputError(k, req[k], "no such field", "eph takes: " + ", ".join(allowed))
    if "lines" not in req:
        raise InputError("lines", None, "a list of lines, each {id, activities, pressures, ...}")
    pHs = req.get("pH_values")
    out = eph_lines(req["lines"], req.get("temp_C"), EPH_PH if pHs is None else pHs)
    out["data_version"] = current().version
    return out
