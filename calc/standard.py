"""Standard potentials at a temperature: E°(T) of a half-reaction from its tabulated E°, dE°/dT and ΔCp°.

Method: the Gibbs–Helmholtz integration of the standard reaction (the half-reaction against the
standard hydrogen electrode) with a constant ΔCp°:
E°(T) = E°(T0) + ΔS°/(nF)·(T − T0) − ΔCp°/(nF)·[(T − T0) − T·ln(T/T0)], ΔS° = nF·(dE°/dT)
(e.g. A. J. Bard, R. Parsons, J. Jordan, *Standard Potentials in Aqueous Solution*, IUPAC 1985,
ch. 1; S. G. Bratsch, J. Phys. Chem. Ref. Data 18 (1989) 1, eqs. (2)–(4), from memory). With no
ΔCp° the last term is dropped (a constant isothermal coefficient). E°(H+/H2) = 0 at every
temperature by convention. Records state their valid range (default 0–100 °C); outside it a
warning is given; the engine refuses temperatures outside 0–100 °C (see :mod:`calc.derivation`).
Constants: CODATA 2018 (:mod:`calc.constants`).
"""

import math
from dataclasses import dataclass
from functools import lru_cache

from . import constants
from .dataset import current
from .derivation import Derivation, check_temperature, fmt
from .errors import DataError, InputError
from .species import parse_species

#: reference temperature of the tabulated standard potentials [K]
T0_K = constants.T_STANDARD
#: where E°(T) of a record is stated valid when the record gives no range [°C]
VALID_C_DEFAULT = (0.0, 100.0)


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


def sides(rec):
    """The two sides of a half-reaction record, parsed, and its number of electrons.

    Args:
        rec: a half-reaction record (from :func:`half_reaction`) [unitless]

    Returns:
        (oxidised, reduced, n): two lists of :class:`calc.species.Species` and n [unitless]

    References:
        Species grammar of DEVELOPERS.md (:func:`calc.species.parse_species`).

    >>> ox, red, n = sides(half_reaction("O2/H2O"))
    >>> [s.key for s in ox], [s.key for s in red], n
    (['O2(g)', 'H+(aq)'], ['H2O(l)'], 4)
    """
    try:
        ox = _parsed_all(rec["oxidised"])
        red = _parsed_all(rec["reduced"])
        n = int(rec["n"])
    except (KeyError, TypeError, ValueError, InputError) as exc:
        raise DataError(f"half-reaction {rec.get('id')!r} is malformed in the dataset: {exc}") from None
    return ox, red, n


def _parsed_all(texts):
    """The species of one side, parsed once per spelling (a couple and its chart read each side often)."""
    try:
        return list(_parsed(tuple(texts)))
    except TypeError:  # not a list of strings: parsed uncached, so the message names what is wrong
        return [parse_species(s) for s in texts]


@lru_cache(maxsize=1024)
def _parsed(texts):
    return tuple(parse_species(s) for s in texts)


def term(coeff, key):
    """One term of a reaction as written: the coefficient (left out when it is 1), then the species.

    Args:
        coeff: the stoichiometric coefficient [unitless]
        key: the species as written, e.g. ``H2O(l)`` [unitless]

    Returns:
        text

    References:
        IUPAC convention of writing chemical equations (common practice).

    >>> term(2.0, "H2O(l)"), term(1, "Zn(s)"), term(0.5, "O2(g)")
    ('2 H2O(l)', 'Zn(s)', '0.5 O2(g)')
    """
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
    left = [term(s.coeff, s.key) for s in oxidised] + [term(n, "e-")]
    right = [term(s.coeff, s.key) for s in reduced]
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
        18 (1989) 1, eqs. (2)–(4) (from memory).

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
    return standard_potential_at(rec, check_temperature(temp_C), field)


def standard_potential_at(rec, temp_C, field="id"):
    """Standard potential E° of a half-reaction record at a temperature already checked.

    Args:
        rec: a half-reaction record (from :func:`half_reaction`) [unitless]
        temp_C: temperature, checked by :func:`calc.derivation.check_temperature` [°C]
        field: the input field shown in a warning [unitless]

    Returns:
        a :class:`StandardPotential`

    References:
        As :func:`standard_potential`.

    >>> round(standard_potential_at(half_reaction("Ag+/Ag"), 60.0).standard_potential_V, 4)
    0.765
    """
    ox, red, n = sides(rec)
    d = Derivation()
    E25 = _tabulated(rec, reaction_text(ox, red, n), field, d)
    lo, hi = _valid_range(rec)
    dEdT_mV = _num(rec, "dEdT_mV_per_K")
    dCp = _num(rec, "dCp_J_per_mol_K")
    t = temp_C
    if _is_hydrogen_reference(ox, red):
        E = 0.0
        d.step("Standard potential at the temperature", "E°(H+/H2) = 0 V at every temperature (convention)",
               f"t = {fmt(t)} °C", "E°(T) = 0 V vs SHE")
    elif dEdT_mV is None:
        E = _without_coefficient(rec["id"], E25, t, d)
    else:
        E = _with_coefficient(rec, E25, dEdT_mV, dCp, n, t, d)
    if not lo - 1e-9 <= t <= hi + 1e-9:
        d.warn("temp_C", f"t = {fmt(t)} °C is outside the range where E°(T) of {rec['id']} is stated valid "
                         f"({fmt(lo)}–{fmt(hi)} °C): extrapolated")
    return StandardPotential(rec["id"], n, reaction_text(ox, red, n), t, E, E25, bool(rec.get("hypothetical")),
                             tuple(d.steps), tuple(d.warnings), tuple(d.sources))


def _tabulated(rec, reaction, field, d):
    """E° at 25 °C as tabulated, with its step, source and the warning of a hypothetical couple."""
    E25 = _num(rec, "E0_V")
    rid = rec["id"]
    if E25 is None:
        raise DataError(f"half-reaction {rec.get('id')!r} has no E0_V")
    d.cite(rec.get("E0_source"))
    conf = rec.get("E0_confidence")
    spread = f"; spread: {rec['spread']}" if rec.get("spread") else ""
    d.step(f"Standard potential of {rid} at 25 °C (tabulated)", reaction,
           f"source {rec.get('E0_source', '?')}" + (f" ({conf})" if conf else "") + spread,
           f"E°(25 °C) = {fmt(E25)} V vs SHE")
    if rec.get("hypothetical"):
        d.warn(field, f"{rid} is a hypothetical couple: its ion is not stable in water, so its potential is a thermodynamic estimate only")
    return E25


def _valid_range(rec):
    """The temperatures where the record states E°(T) valid [°C]."""
    if rec.get("valid_C") is None:
        return VALID_C_DEFAULT
    try:
        lo, hi = (float(x) for x in rec["valid_C"])
    except (TypeError, ValueError):
        raise DataError(f"half-reaction {rec['id']!r}: valid_C = {rec['valid_C']!r} is not [low, high]") from None
    return lo, hi


def _without_coefficient(rid, E25, t, d):
    """No dE°/dT in the dataset: E° at 25 °C stands, with a warning away from 25 °C."""
    if abs(t - 25.0) > 1e-9:
        d.warn("temp_C", f"{rid} has no temperature coefficient in the dataset: E° at 25 °C is used at {fmt(t)} °C")
    d.step("Standard potential at the temperature", "no dE°/dT in the dataset: E°(T) = E°(25 °C)",
           f"t = {fmt(t)} °C", f"E°(T) = {fmt(E25)} V vs SHE")
    return E25


def _with_coefficient(rec, E25, dEdT_mV, dCp, n, t, d):
    """E°(T) by :func:`gibbs_helmholtz`, with the step written for the terms the record has."""
    d.cite(rec.get("dEdT_source"))
    T = t + constants.T_ZERO_C
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
    return E
