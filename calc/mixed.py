"""JSON entry point ``mixed``: explicit electrode kinetics in, the mixed-potential (Evans) solution out.

An engineer gives measured or published polarization parameters per electrode and reaction; the
solution is :func:`calc.kinetics.mixed_potential`, the diagram :func:`calc.evans.evans_diagram`.

Request: ``{"electrodes": [{"name", "area_cm2", "reactions": [{"name", "E_eq_V", "i0_A_per_cm2",
"b_anodic_V", "b_cathodic_V", "i_lim_A_per_cm2"}]}]}``: slopes positive, at least one per reaction
(one: that direction only; both: Butler–Volmer); ``i_lim_A_per_cm2`` limits the cathodic branch.

Result: ``E_mixed_V``; per electrode ``net_current_A`` (positive net anodic) and per reaction
``current_density_A_per_cm2`` (positive anodic); ``galvanic_current_A``, the current through the
metallic connection (Σ of the net anodic electrode currents: 0 for one electrode, the anode's net
anodic current for two); the free-corrosion point of each electrode on its own; the Evans
diagram; ``steps``, ``warnings``. The balance Σ I = 0 closes to a relative 1e-9 of the total
anodic current, or the result says it does not.
"""

from .dataset import current
from .derivation import Derivation, check_number, fmt
from .errors import InputError
from .evans import evans_diagram
from .kinetics import Electrode, Reaction, check_currents, dissolution_density, free_corrosion, mixed_potential
from .requests import label, read

#: most electrodes and reactions per electrode in one request: a joint has two or three metals with
#: two to four reactions each (common practice); the result carries every branch of the Evans
#: diagram, and the caps keep it small enough for the page [unitless]
ELECTRODES_MAX = 10
REACTIONS_MAX = 8
#: equilibrium potentials accepted: standard potentials in water lie within about ±3.1 V vs SHE
#: (Li+/Li to F2/F−), so ±5 V holds any of them on any common reference scale [V]
E_EQ_MAX_V = 5.0
#: Tafel slopes accepted: b = 2.303·R·T/(α·n·F) is 0.059/(α·n) V/decade at 25 °C, so 0.005 V/decade
#: would need α·n ≈ 12; 10 V/decade is an almost potential-independent current (a passive film) [V/decade]
SLOPE_MIN_V, SLOPE_MAX_V = 0.005, 10.0
#: exchange and limiting current densities accepted: i0 of hydrogen on platinum is about 1e-3 A/cm²
#: (from memory), a limiting current of 100 A/cm² is far beyond any stirred solution [A/cm²]
I0_MAX, I_LIM_MAX = 10.0, 100.0
#: electrode areas accepted, up to 1e12 cm² (1e8 m², a very large offshore structure) [cm²]
AREA_MAX_CM2 = 1.0e12


def _number(value, field, allowed, low, high, low_open=True):
    return check_number(value, field, allowed, low=low, high=high, low_open=low_open)


def _slope(raw, field):
    if raw is None:
        return None
    return _number(raw, field, f"a Tafel slope from {SLOPE_MIN_V:g} to {SLOPE_MAX_V:g} V/decade, positive",
                   SLOPE_MIN_V, SLOPE_MAX_V, low_open=False)


REACTION_FIELDS = {"name": "a name for the reaction", "E_eq_V": "its equilibrium potential in V",
                   "i0_A_per_cm2": "its exchange current density in A/cm²"}
REACTION_OPTIONAL = ("b_anodic_V", "b_cathodic_V", "i_lim_A_per_cm2")
ELECTRODE_FIELDS = {"name": "a name for the electrode", "area_cm2": "its wetted area in cm²",
                    "reactions": "a list of its reactions"}


def _read_part(obj, path, entry, required, optional=()):
    """requests.read for a nested object, its fields named with their path in any error."""
    if not isinstance(obj, dict):
        raise InputError(path, obj, "a JSON object")
    try:
        return read(obj, entry, required, optional)
    except InputError as exc:
        raise InputError(f"{path}.{exc.field}", exc.value, exc.allowed, exc.hint) from None


def read_reaction(obj, path):
    """One reaction of a ``mixed`` request, checked.

    Args:
        obj: ``{"name", "E_eq_V", "i0_A_per_cm2", "b_anodic_V", "b_cathodic_V", "i_lim_A_per_cm2"}`` [unitless]
        path: the request path of the object, for messages [unitless]

    Returns:
        a :class:`Reaction`

    References:
        Project input rule (STYLE.md: typed errors naming the field, the value and what is allowed).

    >>> read_reaction({"name": "H2", "E_eq_V": 0, "i0_A_per_cm2": 1e-10, "b_cathodic_V": 0.08}, "r").b_c
    0.08
    """
    _read_part(obj, path, "mixed reaction", REACTION_FIELDS, REACTION_OPTIONAL)
    name = label(obj["name"], f"{path}.name", "a name for the reaction")
    e_eq = _number(obj["E_eq_V"], f"{path}.E_eq_V", f"a potential from {-E_EQ_MAX_V:g} to {E_EQ_MAX_V:g} V",
                   -E_EQ_MAX_V, E_EQ_MAX_V, low_open=False)
    i0 = _number(obj["i0_A_per_cm2"], f"{path}.i0_A_per_cm2",
                 f"an exchange current density above 0 and up to {I0_MAX:g} A/cm²", 0.0, I0_MAX)
    b_a = _slope(obj.get("b_anodic_V"), f"{path}.b_anodic_V")
    b_c = _slope(obj.get("b_cathodic_V"), f"{path}.b_cathodic_V")
    if b_a is None and b_c is None:
        raise InputError(f"{path}.b_anodic_V", None, "a Tafel slope: give b_anodic_V, b_cathodic_V or both",
                         "a reaction without slopes has no kinetics")
    i_lim = obj.get("i_lim_A_per_cm2")
    if i_lim is not None:
        i_lim = _number(i_lim, f"{path}.i_lim_A_per_cm2",
                        f"a limiting current density above 0 and up to {I_LIM_MAX:g} A/cm²", 0.0, I_LIM_MAX)
        if b_c is None:
            raise InputError(f"{path}.i_lim_A_per_cm2", i_lim, "no limiting current without b_cathodic_V",
                             "i_lim limits the cathodic branch only")
    return Reaction(name, e_eq, i0, b_a, b_c, i_lim)


def _listed(value, field, what, longest):
    if not isinstance(value, list) or not value:
        raise InputError(field, value, f"a non-empty list of {what}")
    if len(value) > longest:
        raise InputError(field, f"a list of {len(value)}", f"at most {longest} {what}",
                         "the result carries every branch of the Evans diagram; a joint has two or three metals")
    return value


def read_electrodes(request):
    """The electrodes of a ``mixed`` request, checked.

    Args:
        request: ``{"electrodes": [{"name", "area_cm2", "reactions": [...]}]}`` [unitless]

    Returns:
        a tuple of :class:`Electrode`

    References:
        Project input rule (STYLE.md); request fields of issue 15 ("The mixed-potential assessment").

    >>> r = {"name": "H2", "E_eq_V": 0, "i0_A_per_cm2": 1e-10, "b_cathodic_V": 0.08}
    >>> read_electrodes({"electrodes": [{"name": "Zn", "area_cm2": 2, "reactions": [r]}]})[0].area_cm2
    2.0
    """
    read(request, "mixed", {"electrodes": "a list of electrodes, each {name, area_cm2, reactions}"})
    items = _listed(request["electrodes"], "electrodes", "electrodes", ELECTRODES_MAX)
    out, names = [], set()
    for i, obj in enumerate(items):
        path = f"electrodes[{i}]"
        _read_part(obj, path, "mixed electrode", ELECTRODE_FIELDS)
        name = label(obj["name"], f"{path}.name", "a name for the electrode")
        if name in names:
            raise InputError(f"{path}.name", name, "a name no other electrode has")
        names.add(name)
        area = _number(obj["area_cm2"], f"{path}.area_cm2", f"an area above 0 and up to {AREA_MAX_CM2:g} cm²",
                       0.0, AREA_MAX_CM2)
        reactions = _listed(obj["reactions"], f"{path}.reactions", "reactions", REACTIONS_MAX)
        out.append(Electrode(name, area, tuple(read_reaction(r, f"{path}.reactions[{k}]")
                                               for k, r in enumerate(reactions))))
    return tuple(out)



#: the current balance must close to this relative residual of the total anodic current [unitless]
BALANCE_TOLERANCE = 1.0e-9
#: a relative residual below this is the rounding of the sum itself (double precision, many terms), reported
#: as 0 so that the answer does not depend on the last bit of a platform's maths library [unitless]
BALANCE_FLOOR = 1.0e-12
#: a one-slope reaction driven past its E_eq by more than this gets a warning [V]
PAST_EQ_WARN_V = 0.05

ASSUMPTIONS = [
    "one potential for all electrodes: a metallic connection and no IR drop in the electrolyte (the "
    "largest galvanic effect these kinetics allow)",
    "uniform current over each electrode's wetted area, at steady state",
    "a reaction given one Tafel slope runs only in that direction",
]


def _past_equilibrium(d, el, r, E):
    """Warn when a one-slope reaction runs past its E_eq, where its missing reverse branch would rule."""
    eta = E - r.E_eq_V
    if r.b_a and not r.b_c and eta < -PAST_EQ_WARN_V:
        words = f"runs anodically {fmt(-eta, 3)} V below its E_eq_V without b_cathodic_V"
    elif r.b_c and not r.b_a and eta > PAST_EQ_WARN_V:
        words = f"runs cathodically {fmt(eta, 3)} V above its E_eq_V without b_anodic_V"
    else:
        return
    d.warn("electrodes", f"{el.name}, {r.name}: {words}. As an equilibrium potential that cannot be "
                         "(give both slopes for Butler–Volmer); as a fit through a corrosion potential it is "
                         "the Tafel line extrapolated")


def _reaction_out(d, el, r, E, reference_lines=False):
    i = r.current_density(E)
    if not reference_lines:
        _past_equilibrium(d, el, r, E)
    lim = None
    if r.i_lim:  # the share of the diffusion limit the cathodic branch runs at
        lim = min(1.0, 10.0 ** r.log10_partials(E)[1] / r.i_lim)
    slopes = ", ".join(f"{k} = {fmt(v)} V/decade" for k, v in (("b_a", r.b_a), ("b_c", r.b_c)) if v)
    d.step(f"{el.name}: {r.name}", r.model(),
           f"E_eq = {fmt(r.E_eq_V)} V, i0 = {fmt(r.i0)} A/cm², {slopes}"
           + (f", i_L = {fmt(r.i_lim)} A/cm²" if r.i_lim else "") + f"; η = {fmt(E - r.E_eq_V)} V",
           f"i = {fmt(i)} A/cm²" + (f" ({fmt(100 * lim, 3)} % of i_L)" if lim is not None else ""))
    return {"name": r.name, "model": r.model(), "E_eq_V": r.E_eq_V, "overpotential_V": E - r.E_eq_V,
            "current_density_A_per_cm2": i, "current_A": i * el.area_cm2, "limited_fraction": lim}


def _signed_sum(values):
    """Numbers written as a sum: 1 − 2 + 3."""
    text = ""
    for k, v in enumerate(values):
        text += (fmt(v) if k == 0 else (" − " if v < 0 else " + ") + fmt(abs(v)))
    return text


def _role(net, tolerance, single):
    if single:
        return "freely corroding (no partner)"
    if net > tolerance:
        return "anode (net anodic)"
    if net < -tolerance:
        return "cathode (net cathodic)"
    return "no net current"


def _electrode_out(d, el, E, free, anodic_total, single, reference_lines=False):
    reactions = [_reaction_out(d, el, r, E, reference_lines) for r in el.reactions]
    net = sum(x["current_A"] for x in reactions)
    attack = dissolution_density(el, E)
    d.step(f"Net current of {el.name}", "I = A·Σ_k i_k (positive: net anodic)",
           f"I = {fmt(el.area_cm2)} cm² × ({_signed_sum(x['current_density_A_per_cm2'] for x in reactions)}) A/cm²",
           f"I = {fmt(net)} A; anodic attack Σ max(i_k, 0) = {fmt(attack)} A/cm²")
    out = {"name": el.name, "area_cm2": el.area_cm2, "net_current_A": net,
           "net_current_density_A_per_cm2": net / el.area_cm2,
           "role": _role(net, BALANCE_TOLERANCE * anodic_total, single),
           "dissolution_current_density_A_per_cm2": attack, "free_corrosion": None, "dissolution_vs_free": None,
           "reactions": reactions}
    if free is None:
        out["free_corrosion_note"] = "on its own it has no anodic or no cathodic reaction, so no free-corrosion point"
        return out
    out["free_corrosion"] = {"E_V": free[0], "current_density_A_per_cm2": free[1]}
    if free[1] > 0.0:
        out["dissolution_vs_free"] = attack / free[1]
    if not single:
        d.step(f"Free corrosion of {el.name} on its own", "Σ_k i_k(E_corr) = 0 on this electrode alone",
               f"E_corr = {fmt(free[0])} V, i_corr = {fmt(free[1])} A/cm²",
               f"coupled attack / free attack = {fmt(out['dissolution_vs_free'], 4)}"
               if out["dissolution_vs_free"] is not None else "no anodic attack when free")
    return out


def mixed_result(electrodes, E, halvings, free, reference_lines=False):
    """The result of a mixed-potential solution: the currents, the checks, the derivation, the diagram.

    Args:
        electrodes: the electrodes, each a :class:`calc.kinetics.Electrode` [unitless]
        E: the mixed potential [V]
        halvings: bisection steps taken [unitless]
        free: per electrode (E_corr [V], i_corr [A/cm²]) on its own, or None [V, A/cm²]
        reference_lines: True when each reaction's E_eq_V is the reference point of a Tafel line
            (dataset kinetics), not an equilibrium potential: no warning for running past it [unitless]

    Returns:
        the result dict of :func:`mixed_entry`

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory); Mansfeld, Corrosion 27 (1971) 436.

    >>> zn = Electrode("Zn", 1.0, (Reaction("Zn", -0.763, 1e-7, 0.09, None, None),
    ...                            Reaction("H2", 0.0, 1e-10, None, 0.08, None)))
    >>> E = mixed_potential([zn])[0]
    >>> round(mixed_result([zn], E, 50, [free_corrosion(zn)])["balance_relative"], 12)
    0.0
    """
    check_currents(electrodes, E)
    d = Derivation()
    single = len(electrodes) == 1
    anodic_total = sum(el.area_cm2 * 10.0 ** r.log10_partials(E)[0] for el in electrodes for r in el.reactions)
    d.step("Mixed potential",
           "Σ_e A_e·Σ_k i_k(E) = 0, every electrode at one potential (metallic contact, no IR drop)",
           f"bisection on log10 ΣI_anodic − log10 ΣI_cathodic from a bracket around the E_eq values, "
           f"{halvings} halvings", f"E_mixed = {fmt(E, 9)} V")
    parts = [_electrode_out(d, el, E, f, anodic_total, single, reference_lines) for el, f in zip(electrodes, free)]
    residual = sum(p["net_current_A"] for p in parts)
    balance = abs(residual) / anodic_total
    if balance < BALANCE_FLOOR:
        balance = 0.0
        d.step("Current balance", f"|Σ_e I_e| / ΣI_anodic ≤ {BALANCE_TOLERANCE:g}",
               f"the residual is below {BALANCE_FLOOR:g} of {fmt(anodic_total)} A: the rounding of the sum",
               "0 (to the rounding of the sum)")
    else:
        d.step("Current balance", f"|Σ_e I_e| / ΣI_anodic ≤ {BALANCE_TOLERANCE:g}",
               f"|{fmt(residual)}| A / {fmt(anodic_total)} A", f"{fmt(balance, 3)}")
    if balance > BALANCE_TOLERANCE:
        d.warn("electrodes", f"the current balance closes only to {fmt(balance, 3)} of the anodic current "
                             f"(required {BALANCE_TOLERANCE:g}): treat the numbers with caution")
    galvanic = 0.0 if single else sum(max(p["net_current_A"], 0.0) for p in parts)
    d.step("Galvanic current", "I_g = Σ_e max(I_e, 0): the current through the metallic connection",
           "one electrode: no connection" if single else
           " + ".join(f"max({fmt(p['net_current_A'])}, 0)" for p in parts), f"I_g = {fmt(galvanic)} A")
    return {"E_mixed_V": E, "galvanic_current_A": galvanic, "anodic_total_A": anodic_total,
            "balance_relative": balance, "electrodes": parts,
            "evans": evans_diagram(electrodes, E, anodic_total, free),
            "assumptions": list(ASSUMPTIONS), "steps": d.steps, "warnings": d.warnings, "sources": [],
            "data_version": current().version}


def mixed_entry(request):
    """JSON entry point ``mixed``: the mixed potential of metallically connected electrodes.

    Args:
        request: ``{"electrodes": [{"name", "area_cm2", "reactions": [{"name", "E_eq_V",
            "i0_A_per_cm2", "b_anodic_V", "b_cathodic_V", "i_lim_A_per_cm2"}]}]}`` [V, A/cm², V/decade, cm²]

    Returns:
        the dict of :func:`mixed_result`

    References:
        Mixed-potential theory (Wagner & Traud 1938, from memory); Mansfeld, Corrosion 27 (1971) 436;
        the models of :mod:`calc.kinetics`.

    >>> zn = {"name": "Zn", "E_eq_V": -0.763, "i0_A_per_cm2": 1e-7, "b_anodic_V": 0.09}
    >>> h = {"name": "H2", "E_eq_V": 0, "i0_A_per_cm2": 1e-10, "b_cathodic_V": 0.08}
    >>> r = mixed_entry({"electrodes": [{"name": "Zn", "area_cm2": 1, "reactions": [zn, h]}]})
    >>> round(r["E_mixed_V"], 3), r["galvanic_current_A"]
    (-0.486, 0.0)
    """
    electrodes = read_electrodes(request)
    E, halvings = mixed_potential(electrodes)
    return mixed_result(electrodes, E, halvings, [free_corrosion(el) for el in electrodes])
