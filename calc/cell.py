"""Galvanic couples: the anode, the balanced overall reaction, E_cell, ΔG and K of two half-reactions.

The electrode with the lower potential at the stated conditions is the anode; the overall
reaction is the cathode reduction plus the anode oxidation, each scaled to
n = lcm(n_anode, n_cathode) electrons, with species on both sides cancelled;
E_cell = E_cathode − E_anode, ΔG = −nF·E_cell, log10 K = nF·E°_cell/(RT·ln10).
Electrode potentials from :mod:`calc.electrode`; constants: CODATA 2018 (:mod:`calc.constants`).
"""

import math

from . import constants
from .conditions import KEYS as CONDITION_KEYS
from .conditions import key_of, note_unused, read_conditions
from .dataset import current
from .derivation import Derivation, fmt
from .electrode import HALF_REACTION_ID, LOG10_K_MAX, electrode_under
from .eph import couple_chart
from .errors import InputError
from .requests import read
from .standard import half_reaction, sides, term

#: side-condition fields a couple accepts for one electrode only
SIDE_KEYS = ("activities", "molalities", "pressures", "pH")
#: the fields of a ``couple`` request, listed in this order in a message
COUPLE_FIELDS = tuple(sorted(set(CONDITION_KEYS) | {"a", "b", "a_conditions", "b_conditions"}))


def cell_potential(E_cathode_V, E_anode_V):
    """Cell potential: E_cell = E_cathode − E_anode.

    Args:
        E_cathode_V: potential of the cathode (the electrode reduced) [V vs SHE]
        E_anode_V: potential of the anode (the electrode oxidised) [V vs SHE]

    Returns:
        E_cell [V]

    References:
        Bard & Faulkner, Electrochemical Methods, 2nd ed. (2001), §2.1 (from memory).

    >>> round(cell_potential(0.3419, -0.7618), 4)
    1.1037
    """
    return E_cathode_V - E_anode_V


def reaction_free_energy(n, E_V):
    """Free energy of the cell reaction: ΔG = −n·F·E.

    Args:
        n: electrons transferred in the reaction as written [unitless]
        E_V: the cell potential (E_cell, or E°_cell for ΔG°) [V]

    Returns:
        ΔG [kJ/mol of the reaction as written]

    References:
        Bard & Faulkner, Electrochemical Methods, 2nd ed. (2001), §2.1 (from memory).

    >>> round(reaction_free_energy(2, 1.1037), 2)
    -212.98
    """
    return -n * constants.FARADAY * E_V / 1000.0


def log10_equilibrium_constant(n, E0_cell_V, temp_C):
    """Equilibrium constant of the cell reaction: log10 K = n·F·E°_cell/(ln10·R·T).

    Args:
        n: electrons transferred in the reaction as written [unitless]
        E0_cell_V: standard cell potential at the temperature [V]
        temp_C: temperature [°C]

    Returns:
        log10 K [unitless]

    References:
        ΔG° = −RT·ln K = −nFE°: Bard & Faulkner, Electrochemical Methods, 2nd ed. (2001), §2.1
        (from memory).

    >>> round(log10_equilibrium_constant(2, 1.1037, 25.0), 3)
    37.313
    """
    return n * E0_cell_V / constants.nernst_slope(temp_C + constants.T_ZERO_C)


def balanced_reaction(cathode_rec, anode_rec, same=False):
    """The overall cell reaction: the cathode reduction plus the anode oxidation, electrons cancelled.

    Args:
        cathode_rec: the half-reaction record of the cathode [unitless]
        anode_rec: the half-reaction record of the anode [unitless]
        same: True for a concentration cell (one half-reaction on both sides) [unitless]

    Returns:
        (n, text, k_cathode, k_anode): n = lcm(n_cathode, n_anode) [unitless], the reaction,
        and the factors of the two half-reactions [unitless]

    References:
        Balancing by the least common multiple of the electrons (common practice).

    >>> balanced_reaction(half_reaction("Fe3+/Fe2+"), half_reaction("Fe2+/Fe"))[:2]
    (2, '2 Fe3+(aq) + Fe(s) → 3 Fe2+(aq)')
    """
    ox_c, red_c, n_c = sides(cathode_rec)
    ox_a, red_a, n_a = sides(anode_rec)
    n = n_c * n_a // math.gcd(n_c, n_a)
    kc, ka = n // n_c, n // n_a
    left = _scaled({}, ((ox_c, kc, "cathode"), (red_a, ka, "anode")), same)
    right = _scaled({}, ((red_c, kc, "cathode"), (ox_a, ka, "anode")), same)
    _cancel(left, right)
    return n, _side_text(left) + " → " + _side_text(right), kc, ka


def _scaled(out, parts, same):
    """Species -> summed coefficient of (species, factor, electrode) parts; in a concentration cell
    the dissolved and gaseous species are told apart by their side."""
    for species, k, where in parts:
        for s in species:
            key = f"{s.name}({s.phase}, {where} side)" if same and s.phase in ("aq", "g") else s.key
            out[key] = out.get(key, 0) + k * s.coeff
    return out


def _cancel(left, right):
    """Take a species standing on both sides off both, as far as it goes."""
    for key in list(left):
        if key in right:
            m = min(left[key], right[key])
            left[key] -= m
            right[key] -= m


def _side_text(side):
    return " + ".join(term(c, k) for k, c in side.items() if c > 1e-12) or "(nothing)"


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
            merged[k] = _overridden(merged.get(k), extra[k], f"{field}.{k}", k)
    if "pH" in extra:
        merged["pH"] = extra["pH"]
    return merged, extra


def _overridden(base, extra, field, base_field):
    """A shared {species: value} mapping with one electrode's values put over it."""
    if not isinstance(extra, dict):
        raise InputError(field, extra, "a mapping {species: value}")
    base = base or {}
    if not isinstance(base, dict):
        raise InputError(base_field, base, "a mapping {species: value}")
    over = {key_of(n) for n in extra}
    return {**{n: v for n, v in base.items() if key_of(n) not in over}, **extra}


def _overrides(extra):
    """The (field, key) pairs one electrode's own fields set."""
    keys = set()
    for field in ("activities", "molalities", "pressures"):
        for name in (extra.get(field) or {}):
            keys.add((field, key_of(name)))
    if extra.get("pH") is not None:
        keys.add(("pH", ""))
    return keys


def _electrodes(recs, req, temp_C):
    """Both electrodes at their own conditions: the potentials, the values each used, each one's own fields."""
    results, used, extras = {}, {}, {}
    for side, rec in zip(("a", "b"), recs):
        merged, extras[side] = _side_request(req, side)
        cond = read_conditions(merged, f"{side}_conditions." if extras[side] else "", checked_temp_C=temp_C)
        used[side] = set()
        results[side] = electrode_under(rec, cond, side, used[side])
    return results, used, extras


def _anode_side(results, extras):
    """The side with the lower potential; ties are broken by quantities that do not depend on the
    order of a and b."""
    return min(("a", "b"), key=lambda s: (results[s].potential_V, results[s].standard_potential_V, results[s].id,
                                          repr(sorted(extras[s].items(), key=str))))


def _role_derivation(anode, cathode):
    """The derivations of both electrodes, each step titled with the electrode's role."""
    d = Derivation()
    for role, el in (("Anode", anode), ("Cathode", cathode)):
        d.steps.extend({**st, "title": f"{role} {el.id}: {st['title']}"} for st in el.steps)
        for w in el.warnings:
            d.warn(w["field"], w["message"])
        for s in el.sources:
            d.cite(s)
    return d


def _note_unused(cond, used, extras, d):
    """Warn about values given that neither electrode used (shared ones, then each side's own)."""
    ov = {side: _overrides(extras[side]) for side in ("a", "b")}
    shared_used = {k for side in ("a", "b") for k in used[side] if k not in ov[side]}
    note_unused(cond, shared_used, d)
    for side in ("a", "b"):
        if extras[side]:
            own = read_conditions(extras[side], f"{side}_conditions.", checked_temp_C=cond.temp_C)
            note_unused(own, used[side] & ov[side], d, prefix=f"{side}_conditions.")


def _cell_steps(d, anode, cathode, n, kc, ka, overall, E_cell, E0_cell):
    """Steps of the roles, the overall reaction and the cell potentials."""
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


def _energy_steps(d, n, t, E_cell, E0_cell, dG, dG0, log10_K, K):
    """Steps of the reaction free energies and the equilibrium constant."""
    F = constants.FARADAY
    d.step("Reaction free energy", "ΔG = −n·F·E_cell, ΔG° = −n·F·E°_cell (per mole of the overall reaction as written)",
           f"ΔG = −{n}·{fmt(F, 9)} C/mol·{fmt(E_cell)} V; ΔG° = −{n}·{fmt(F, 9)} C/mol·{fmt(E0_cell)} V",
           f"ΔG = {fmt(dG)} kJ/mol, ΔG° = {fmt(dG0)} kJ/mol")
    d.step("Equilibrium constant", "log10 K = n·F·E°_cell/(ln10·R·T) = n·E°_cell/(ln10·R·T/F)",
           f"log10 K = {n}·{fmt(E0_cell)} V / {fmt(constants.nernst_slope(t + constants.T_ZERO_C))} V",
           f"log10 K = {fmt(log10_K)}" + (f", K = {fmt(K)}" if K is not None else " (K itself overflows: see log10_K)"))


def _standard_anode(ea, eb, anode, t, d):
    """The anode at unit activities, with a warning when the stated conditions reverse the couple."""
    std_anode = min((ea, eb), key=lambda e: (e.standard_potential_V, e.id)).id
    if std_anode != anode.id and abs(ea.standard_potential_V - eb.standard_potential_V) > 1e-12:
        d.warn("activities", f"at standard conditions (unit activities, {fmt(t)} °C) the anode would be "
                             f"{std_anode}: the stated conditions reverse the couple, so the standard "
                             "cell potential and ΔG° are negative for the reaction as written")
    return std_anode


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
        dict as described in :func:`couple_entry` (without eph and data_version)

    References:
        :func:`cell_potential`, :func:`reaction_free_energy`, :func:`log10_equilibrium_constant`,
        :func:`balanced_reaction`; electrode potentials by :func:`calc.electrode.electrode_under`.

    >>> r = couple("Zn2+/Zn", "Cu2+/Cu")
    >>> r["anode"], round(r["cell_potential_V"], 4), r["overall_reaction"]
    ('Zn2+/Zn', 1.1037, 'Cu2+(aq) + Zn(s) → Cu(s) + Zn2+(aq)')
    """
    return _couple(half_reaction(a, "a"), half_reaction(b, "b"), dict(conditions or {}))


def _couple(rec_a, rec_b, req):
    """:func:`couple` of two records: the derivation assembled from the electrodes and the cell models."""
    cond = read_conditions({k: req[k] for k in CONDITION_KEYS if k in req})
    t = cond.temp_C
    results, used, extras = _electrodes((rec_a, rec_b), req, t)
    an = _anode_side(results, extras)
    anode, cathode = results[an], results["b" if an == "a" else "a"]
    d = _role_derivation(anode, cathode)
    _note_unused(cond, used, extras, d)
    same = rec_a["id"] == rec_b["id"]
    recs = {rec_a["id"]: rec_a, rec_b["id"]: rec_b}
    n, overall, kc, ka = balanced_reaction(recs[cathode.id], recs[anode.id], same)
    E_cell = cell_potential(cathode.potential_V, anode.potential_V)
    E0_cell = cell_potential(cathode.standard_potential_V, anode.standard_potential_V)
    dG, dG0 = reaction_free_energy(n, E_cell), reaction_free_energy(n, E0_cell)
    log10_K = log10_equilibrium_constant(n, E0_cell, t)
    if abs(log10_K) <= LOG10_K_MAX:
        K, K_note = 10.0 ** log10_K, None
    else:
        K, K_note = None, f"K = 10^{fmt(log10_K, 6)} is beyond the range of a double-precision number; use log10_K"
    _cell_steps(d, anode, cathode, n, kc, ka, overall, E_cell, E0_cell)
    _energy_steps(d, n, t, E_cell, E0_cell, dG, dG0, log10_K, K)
    std_anode = None if same else _standard_anode(results["a"], results["b"], anode, t, d)
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


def _chart(rec_a, rec_b, req, temp_C):
    """The couple's E–pH chart, or the error that stopped it (the couple itself stands)."""
    try:
        return couple_chart(rec_a, rec_b, req, temp_C)
    except InputError as exc:
        return {"error": exc.to_dict()}


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
        anode_electrode, cathode_electrode, steps, warnings, sources, eph (the lines of the
        couple's E–pH chart, :func:`calc.eph.couple_chart`, or ``{"error": {field, message}}``),
        data_version

    References:
        See :func:`couple`.

    >>> r = couple_entry({"a": "Cu2+/Cu", "b": "Zn2+/Zn", "activities": {"Zn2+": 0.1, "Cu2+": 0.001}})
    >>> round(r["cell_potential_V"], 4), r["n_electrons"], [ln["id"] for ln in r["eph"]["lines"]]
    (1.0445, 2, ['H+/H2', 'O2/H2O', 'Cu2+/Cu', 'Zn2+/Zn'])
    """
    read(req, "couple", None, COUPLE_FIELDS)  # the fields listed in sorted order, as always
    read(req, "couple", {"a": HALF_REACTION_ID, "b": HALF_REACTION_ID}, COUPLE_FIELDS)
    rec_a, rec_b = half_reaction(req["a"], "a"), half_reaction(req["b"], "b")
    out = _couple(rec_a, rec_b, {k: v for k, v in req.items() if k not in ("a", "b")})
    out["eph"] = _chart(rec_a, rec_b, req, out["temp_C"])
    out["data_version"] = current().version
    return out
