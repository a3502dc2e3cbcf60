"""Solution conditions of a request and the activity of every species of a half-reaction.

Conventions (stated once, used by :mod:`calc.electrode`, :mod:`calc.cell` and :mod:`calc.eph`):

- aqueous species: the activity given (``activities``), or γ·m from a molality (``molalities``)
  with γ from the chosen model (:mod:`calc.activity`) at the ionic strength taken from, in order,
  ``ionic_strength``, ``env`` (the environment's ionic strength), ``composition`` or the
  molalities given; H+ from ``pH`` (a(H+) = 10^−pH); OH− from a(OH−) = Kw(T)/a(H+), Kw from
  :func:`calc.water.pKw` (Bandura & Lvov 2006), liquid water at unit activity;
- gases: a = p/p°, p given in atm (``pressures``), converted to bar (1 atm = 1.01325 bar); the
  standard state is p° = 1 bar (IUPAC since 1982, the basis of the NBS 1982 tables);
- solids and liquid water: unit activity (water: unless ``activities`` gives a(H2O), e.g. about
  0.98 in seawater);
- any aqueous species or gas not given is taken at unit activity, with a warning naming it.

pH is accepted from −2 to 16 and warned outside 0–14 (outside it the activity scale and the
dilute-solution models lose meaning).
"""

import math
import re
from dataclasses import dataclass

from . import water
from .activity import activity_coefficient, check_model
from .bounds import BOUNDS, check
from .derivation import check_number, check_temperature, fmt
from .errors import InputError
from .ionic import check_ionic_strength, environment_ionic_strength, ion, ionic_strength, ionic_strength_terms

#: 1 atm in bar (exact by definition of the atmosphere) [bar/atm]
BAR_PER_ATM = 1.01325
#: pH accepted (calc.bounds), and the usual range outside which a warning is given
PH_HARD = (BOUNDS["pH"].low, BOUNDS["pH"].high)
PH_USUAL = (0.0, 14.0)
#: highest activity accepted [unitless]; above 10 a warning is given
ACTIVITY_MAX = BOUNDS["activity"].high
#: highest partial pressure accepted [atm]; above 10 atm a warning is given
PRESSURE_MAX_ATM = BOUNDS["pressure_atm"].high
MOLALITY_MAX = BOUNDS["molality"].high
#: request keys that describe solution conditions
KEYS = ("temp_C", "activities", "molalities", "pressures", "ionic_strength", "env", "composition", "model", "pH")


def key_of(name):
    """Matching key of a species name: phase suffix, spaces and '^' dropped, case kept.

    Args:
        name: a species as typed, e.g. ``Hg2^2+``, ``O2(g)`` or ``Zn2+`` [unitless]

    Returns:
        the key [unitless]

    References:
        Species grammar of DEVELOPERS.md.

    >>> key_of("Hg2^2+(aq)"), key_of(" O2(g)"), key_of("Zn2+")
    ('Hg22+', 'O2', 'Zn2+')
    """
    text = re.sub(r"\((aq|s|l|g)\)\s*$", "", str(name).strip())
    return text.replace("^", "").replace(" ", "")


def _mapping(req, name_of_field, low, high, allowed, prefix="", low_open=True):
    raw = req.get(name_of_field)
    field = prefix + name_of_field
    if raw is None:
        return {}
    if not isinstance(raw, dict):
        raise InputError(field, raw, "a mapping {species: value}, e.g. {\"Zn2+\": 0.1}")
    out = {}
    for name, value in raw.items():
        if not isinstance(name, str) or not name.strip():
            raise InputError(field, name, "species names such as Zn2+ or O2")
        key = key_of(name)
        if key in out:
            raise InputError(f"{field}.{name}", value, "one value per species", "the species is given twice")
        out[key] = (name, check_number(value, f"{field}.{name}", allowed, low=low, high=high, low_open=low_open))
    return out


@dataclass(frozen=True)
class Conditions:
    """The checked conditions of one request (one electrode, or both of a couple)."""

    temp_C: float
    activities: dict
    molalities: dict
    pressures_atm: dict
    pH: float
    model: str
    ionic_strength: object  # float, or None when not given and not needed
    ionic_strength_origin: str
    composition: dict
    env: str


def read_conditions(req, prefix="", checked_temp_C=None):
    """Check the condition fields of a request.

    Fields: ``temp_C`` [°C]; ``activities`` {species: a} [unitless]; ``molalities``
    {species: m} [mol/kg]; ``pressures`` {gas: p} [atm]; ``ionic_strength`` [mol/kg] or ``env``
    (environment id) or ``composition`` {ion: m} [mol/kg]; ``model`` (activity model); ``pH``.

    Args:
        req: the request dict [unitless]
        prefix: prefix of field names in error messages, e.g. ``a_conditions.`` [unitless]
        checked_temp_C: the request's temperature when it is already checked (it is then not read
            again from ``req``), or None [°C]

    Returns:
        a :class:`Conditions`

    References:
        Conventions in the module docstring.

    >>> c = read_conditions({"pH": 7, "activities": {"Zn2+": 0.1}})
    >>> c.pH, c.activities["Zn2+"][1], c.temp_C
    (7.0, 0.1, 25.0)
    """
    t = checked_temp_C if checked_temp_C is not None else check_temperature(req.get("temp_C"), prefix + "temp_C")
    acts = _mapping(req, "activities", 0.0, ACTIVITY_MAX, BOUNDS["activity"].allowed,
                    prefix)
    mols = _mapping(req, "molalities", 0.0, MOLALITY_MAX, BOUNDS["molality"].allowed,
                    prefix)
    press = _mapping(req, "pressures", 0.0, PRESSURE_MAX_ATM,
                     BOUNDS["pressure_atm"].allowed, prefix)
    for key, (name, _) in acts.items():
        if key in mols:
            raise InputError(f"{prefix}activities.{name}", acts[key][1], "either an activity or a molality for a species, not both")
        if key in press:
            raise InputError(f"{prefix}activities.{name}", acts[key][1], "either an activity or a partial pressure for a gas, not both")
    pH = req.get("pH")
    if pH is not None:
        pH = check("pH", pH, prefix + "pH")
        for field, mp in (("activities", acts), ("molalities", mols)):
            for k in ("H+", "OH-"):
                if k in mp:
                    raise InputError(f"{prefix}{field}.{mp[k][0]}", mp[k][1], "no value for H+ or OH- when pH is given",
                                     "pH sets a(H+) and a(OH-)")
    given = [k for k in ("ionic_strength", "env", "composition") if req.get(k) is not None]
    if len(given) > 1:
        raise InputError(prefix + given[1], req.get(given[1]), "one source of ionic strength only",
                         f"{' and '.join(given)} were both given")
    I, origin, env = None, "", None
    comp = {}
    if req.get("ionic_strength") is not None:
        I = check_ionic_strength(req["ionic_strength"], prefix + "ionic_strength")
        origin = "given"
    elif req.get("env") is not None:
        env = req["env"]
        environment_ionic_strength(env, prefix + "env")  # checked now, even when no molality needs it
        origin = "env"
    elif req.get("composition") is not None:
        if not isinstance(req["composition"], dict):
            raise InputError(prefix + "composition", req["composition"], "a mapping {ion: molality}")
        comp = dict(req["composition"])
        ionic_strength(comp)  # checked now, even when no molality needs it
        origin = "composition"
    model = check_model(req.get("model"), prefix + "model")
    return Conditions(t, acts, mols, press, pH, model, I, origin, comp, env)


def _ionic_strength(cond, d):
    """The ionic strength needed for molalities, with its derivation."""
    if cond.ionic_strength_origin == "given":
        d.step("Ionic strength", "I given", "", f"I = {fmt(cond.ionic_strength)} mol/kg")
        return cond.ionic_strength
    if cond.ionic_strength_origin == "env":
        I, env_d = environment_ionic_strength(cond.env)
        d.merge(env_d)
        return I
    comp = cond.composition
    what = "the composition given"
    if cond.ionic_strength_origin != "composition":
        comp = {name: m for (name, m) in cond.molalities.values()}
        what = "the molalities given"
    I = ionic_strength(comp)
    terms = ionic_strength_terms(comp)
    d.step(f"Ionic strength from {what}", "I = ½·Σ m_i·z_i²", f"I = ½·({terms}) mol/kg", f"I = {fmt(I)} mol/kg")
    charge = sum(float(m) * ion(s).charge for s, m in comp.items())
    if abs(charge) > 1e-9:
        d.warn("ionic_strength", f"the ions in {what} are not electrically neutral (Σ m·z = {fmt(charge)} mol/kg): "
                                 "the counter-ions are missing, so I is underestimated; list them (e.g. SO4^2-=0.1) "
                                 "or give ionic_strength or env")
    return I


@dataclass(frozen=True)
class SpeciesActivity:
    """The activity used for one species of a reaction, and how it was obtained."""

    species: str
    phase: str
    activity: float
    basis: str

    def to_dict(self):
        """Plain data for JSON."""
        return {"species": self.species, "phase": self.phase, "activity": self.activity, "basis": self.basis}


def activities_for(species_list, cond, d, used=None):
    """The activity of each species of a half-reaction under the conditions.

    Args:
        species_list: the :class:`calc.species.Species` of the reaction (both sides) [unitless]
        cond: the :class:`Conditions` [unitless]
        d: the :class:`calc.derivation.Derivation` receiving steps and warnings [unitless]
        used: a set receiving the keys of the given values that were used [unitless]

    Returns:
        dict species key (``Zn2+(aq)``) -> :class:`SpeciesActivity`

    References:
        Conventions in the module docstring; pKw: Bandura & Lvov (2006); γ: :mod:`calc.activity`.

    >>> from calc.species import parse_species
    >>> c = read_conditions({"pH": 3})
    >>> from calc.derivation import Derivation
    >>> r = activities_for([parse_species("2 H+(aq)"), parse_species("H2(g)")], c, Derivation())
    >>> round(r["H+(aq)"].activity, 12), r["H2(g)"].activity
    (0.001, 1.0)
    """
    used = used if used is not None else set()
    out = {}
    assumed = []
    I_cache = []
    t = cond.temp_C
    ph_given = cond.pH is not None
    if ph_given and not PH_USUAL[0] <= cond.pH <= PH_USUAL[1]:
        d.warn("pH", f"pH {fmt(cond.pH)} is outside 0-14: activities this far from the dilute range are uncertain "
                     "and glass-electrode pH readings are unreliable")

    def from_molality(sp, name, m):
        if not I_cache:
            I_cache.append(_ionic_strength(cond, d))
        res = activity_coefficient(sp.name, I_cache[0], cond.model, t)
        for w in res.warnings:
            d.warn(w["field"], w["message"])
        for s in res.sources:
            d.cite(s)
        if not any(st["title"].startswith("Debye–Hückel A and B") for st in d.steps) and cond.model != "ideal":
            d.steps.append(res.steps[0])
        if not res.gamma * m > 0:  # a subnormal molality times γ < 1 rounds to 0
            raise InputError(f"molalities.{name}", m, "a molality whose activity γ·m is above 0 in double precision "
                             "(above about 1e-300 mol/kg)")
        d.step(f"Activity of {sp.name} from its molality ({cond.model} model)", "a = γ·m/m°, m° = 1 mol/kg",
               f"γ = {fmt(res.gamma, 5)} at I = {fmt(I_cache[0])} mol/kg; a = {fmt(res.gamma, 5)}·{fmt(m)}",
               f"a({sp.name}) = {fmt(res.gamma * m, 5)}")
        return res.gamma * m

    # H+ first, since OH- may follow from it
    ordered = sorted(species_list, key=lambda s: 0 if s.name == "H+" else 1)
    for sp in ordered:
        if sp.key in out:
            continue
        k = key_of(sp.name)
        if sp.phase == "l" and sp.formula == "H2O" and "H2O" in cond.activities:
            used.add(("activities", "H2O"))
            aw = cond.activities["H2O"][1]
            d.step("Activity of liquid water", "a(H2O) given", "", f"a(H2O) = {fmt(aw)}")
            out[sp.key] = SpeciesActivity(sp.name, sp.phase, aw, "activity given")
            continue
        if sp.phase in ("s", "l"):
            what = "solid" if sp.phase == "s" else "liquid water" if sp.formula == "H2O" else "pure liquid"
            out[sp.key] = SpeciesActivity(sp.name, sp.phase, 1.0, f"{what}: unit activity")
            continue
        if sp.phase == "g":
            if k in cond.pressures_atm:
                used.add(("pressures", k))
                p_atm = cond.pressures_atm[k][1]
                a = p_atm * BAR_PER_ATM
                d.step(f"Activity of {sp.name} from its partial pressure", "a = p/p°, p° = 1 bar; 1 atm = 1.01325 bar",
                       f"a = {fmt(p_atm)} atm × 1.01325 bar/atm / 1 bar", f"a({sp.name}) = {fmt(a)}")
                if p_atm > 10:
                    d.warn(f"pressures.{sp.name}", f"p = {fmt(p_atm)} atm: the ideal-gas activity p/p° ignores fugacity corrections at high pressure")
                out[sp.key] = SpeciesActivity(sp.name, sp.phase, a, f"p = {fmt(p_atm)} atm")
            elif k in cond.activities:
                used.add(("activities", k))
                a = cond.activities[k][1]
                out[sp.key] = SpeciesActivity(sp.name, sp.phase, a, "activity (fugacity/p°) given")
            else:
                assumed.append(sp.name + "(g)")
                out[sp.key] = SpeciesActivity(sp.name, sp.phase, 1.0, "assumed: p = 1 bar")
            continue
        # aqueous
        if k in cond.activities:
            used.add(("activities", k))
            a = cond.activities[k][1]
            basis = "activity given"
        elif k in cond.molalities:
            used.add(("molalities", k))
            m = cond.molalities[k][1]
            a = from_molality(sp, cond.molalities[k][0], m)
            basis = f"m = {fmt(m)} mol/kg, {cond.model} model"
        elif sp.name == "H+" and ph_given:
            used.add(("pH", ""))
            a = 10.0 ** (-cond.pH)
            basis = f"pH {fmt(cond.pH)}"
            d.step("Activity of H+ from pH", "a(H+) = 10^(−pH)", f"a(H+) = 10^(−{fmt(cond.pH)})", f"a(H+) = {fmt(a)}")
        elif sp.name == "OH-" and (ph_given or "H+" in cond.activities or "H+" in cond.molalities):
            pkw = water.pKw(t)
            if ph_given:
                used.add(("pH", ""))
                log_aH = -cond.pH
                how = f"pH {fmt(cond.pH)}"
            else:
                aH = out["H+(aq)"].activity if "H+(aq)" in out else _h_activity(cond, from_molality)
                log_aH = math.log10(aH)
                how = f"a(H+) = {fmt(aH)}"
            aw = 1.0
            if "H2O" in cond.activities:
                used.add(("activities", "H2O"))
                aw = cond.activities["H2O"][1]
            a = aw * 10.0 ** (-pkw - log_aH)
            if not a > 0:  # a(H2O) so small that a(OH-) rounds to 0
                raise InputError("activities.H2O", aw, "a water activity for which a(OH-) = Kw·a(H2O)/a(H+) is above 0 "
                                 "in double precision (about 0.9 to 1 in natural waters)")
            d.step("Activity of OH− from pH and the ion product of water",
                   "a(OH−) = Kw(T)·a(H2O)/a(H+); pKw(T): Bandura & Lvov (2006)",
                   f"pKw({fmt(t)} °C) = {fmt(pkw, 5)}, a(H2O) = {fmt(aw)}; "
                   f"a(OH−) = a(H2O)·10^(−{fmt(pkw, 5)} − log10 a(H+)), {how}",
                   f"a(OH−) = {fmt(a)}")
            basis = f"Kw(T)/a(H+), {how}"
        else:
            assumed.append(sp.name)
            a = 1.0
            basis = "assumed: unit activity"
        if a > 10:
            d.warn(f"activities.{sp.name}", f"a({sp.name}) = {fmt(a)} is far outside the dilute solutions these models describe")
        out[sp.key] = SpeciesActivity(sp.name, sp.phase, a, basis)
    if assumed:
        d.warn("activities", "taken at unit activity (standard state) because no value was given: "
               + ", ".join(assumed))
    return out


def _h_activity(cond, from_molality):
    """a(H+) from an activity or molality given, when OH- needs it before H+ was resolved."""
    from .species import parse_species

    if "H+" in cond.activities:
        return cond.activities["H+"][1]
    return from_molality(parse_species("H+(aq)"), "H+", cond.molalities["H+"][1])


def note_unused(cond, used, d, prefix=""):
    """Warn about given values that no species of the reaction(s) used.

    Args:
        cond: the :class:`Conditions` [unitless]
        used: the set of (field, key) pairs used [unitless]
        d: the :class:`calc.derivation.Derivation` receiving the warnings [unitless]
        prefix: prefix of field names, e.g. ``a_conditions.`` [unitless]

    References:
        Input rule of the project: nothing given is dropped silently.

    >>> from calc.derivation import Derivation
    >>> c = read_conditions({"activities": {"Na+": 0.5}}); d = Derivation()
    >>> note_unused(c, set(), d); d.warnings[0]["field"]
    'activities.Na+'
    """
    for field, mp in (("activities", cond.activities), ("pressures", cond.pressures_atm)):
        for key, (name, value) in mp.items():
            if (field, key) not in used:
                d.warn(f"{prefix}{field}.{name}", f"{name} is not in the half-reaction(s): its {field[:-1] if field != 'activities' else 'activity'} was not used")
    counted = cond.ionic_strength_origin == "" and any((("molalities", k) in used) for k in cond.molalities)
    for key, (name, value) in cond.molalities.items():
        if ("molalities", key) not in used:
            if counted:
                continue  # it entered the ionic strength: a counter-ion
            d.warn(f"{prefix}molalities.{name}", f"{name} is not in the half-reaction(s): its molality was not used")
    if cond.ionic_strength_origin in ("given", "env", "composition") and \
            not any(f == "molalities" for f, _ in used):
        field = {"given": "ionic_strength"}.get(cond.ionic_strength_origin, cond.ionic_strength_origin)
        d.warn(prefix + field, "the ionic strength was not used: it matters only for species given by molality")
    if cond.pH is not None and ("pH", "") not in used:
        d.warn(f"{prefix}pH", f"pH {fmt(cond.pH)} was not used: no H+ or OH- in the half-reaction(s)")
