"""E–pH lines: the potentials of several half-reactions across a range of pH, in one calculation.

At every pH value a(H+) = 10^−pH (a(OH−) from the ion product of water) and the potential is the
Nernst equation with the full reaction quotient (:mod:`calc.electrode`), exactly as one
``electrode`` calculation at that pH gives it. The couple page's chart (both water lines and the
two electrodes of a couple) comes with the couple's result: :func:`couple_chart`.
"""

from dataclasses import replace

from .conditions import KEYS as CONDITION_KEYS
from .conditions import PH_HARD, PH_USUAL, activities_for, note_unused, read_conditions
from .dataset import current
from .derivation import Derivation, check_number, check_temperature, fmt
from .electrode import HALF_REACTION_ID, log10_quotient, nernst
from .errors import InputError
from .requests import read
from .standard import half_reaction, sides, standard_potential_at

#: pH values of an E–pH line unless the request gives its own [unitless]
EPH_PH = tuple(float(p) for p in range(15))
#: most lines and most pH values one E–pH request may ask for
EPH_MAX_LINES, EPH_MAX_POINTS = 8, 141
#: condition fields of one line (the temperature is shared and pH is the axis)
EPH_LINE_KEYS = ("id",) + tuple(k for k in CONDITION_KEYS if k not in ("temp_C", "pH"))
#: the water stability lines drawn under every couple, at unit pressure
WATER_LINES = ("H+/H2", "O2/H2O")
#: the fields of one line a couple's chart takes over from the couple's request
CHART_FIELDS = ("activities", "pressures")


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
    :func:`calc.electrode.electrode_potential` computes it at that pH (without writing the
    derivation of every point). Lines of half-reactions without H+ or OH− are flat: pH changes
    none of their activities, so their potential is computed once and stands for every pH value.

    Args:
        lines: a list of ``{"id": half-reaction id, activities, molalities, pressures, ionic_strength,
            env, composition, model}`` (each as in :func:`calc.conditions.read_conditions`) [unitless]
        temp_C: temperature shared by all lines, 0 to 100 [°C]
        pH_values: the pH values, 2 to 141 of them, each from -2 to 16 [unitless]

    Returns:
        dict with temp_C, pH (the values), lines (id, name, n, standard_potential_V [V vs SHE],
        pH_dependent, potential_V [V vs SHE], one per pH value, and where the line means nothing
        because a hydroxide or oxide is the stable solid: meaningful, meaningful_up_to_pH,
        not_meaningful, :func:`solid_clipping`), steps, warnings, sources

    References:
        :func:`calc.standard.standard_potential`, :func:`calc.electrode.nernst`; activities per
        :mod:`calc.conditions` (pKw: Bandura & Lvov 2006).

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
    return _lines_at(lines, t, pHs)


def _lines_at(lines, t, pHs):
    """The lines at a checked temperature and checked pH values, with the derivation of the whole chart."""
    d = Derivation()
    out = []
    for k, line in enumerate(lines):
        pre = f"lines[{k}]."
        base = _line_conditions(line, k, t)
        rec = half_reaction(line["id"], pre + "id")
        sp = standard_potential_at(rec, t, pre + "id")
        potentials, depends, dl = _line_potentials(rec, base, sp.standard_potential_V, pHs, pre)
        for w in sp.warnings:
            d.warn(w["field"], w["message"])
        for w in dl.warnings:  # the pH warnings are given once, for pH_values, below
            f = w["field"]
            if f != "pH":
                d.warn(f if not f or f == "temp_C" or f.startswith(pre) else pre + f, w["message"])
        for src in list(sp.sources) + dl.sources:
            d.cite(src)
        out.append({"id": rec["id"], "name": rec.get("name", rec["id"]), "n": sp.n,
                    "standard_potential_V": sp.standard_potential_V,
                    "pH_dependent": depends, "potential_V": potentials,
                    **solid_clipping(rec, base, potentials, pHs)})
    outside = [p for p in pHs if not PH_USUAL[0] <= p <= PH_USUAL[1]]
    if outside:
        listed = ", ".join(fmt(p) for p in outside[:3]) + (", …" if len(outside) > 3 else "")
        d.warn("pH_values", f"pH values outside 0-14 ({listed}): activities this far from the dilute range are uncertain")
    d.step("E–pH lines: the Nernst equation at each pH",
           "E(pH) = E°(T) − (ln10·R·T/(n·F))·log10 Q, a(H+) = 10^−pH, a(OH−) = Kw(T)/a(H+); other activities as given",
           f"{len(out)} half-reaction(s) at {fmt(t)} °C; pH {fmt(pHs[0])} to {fmt(pHs[-1])} ({len(pHs)} values)",
           "; ".join(f"{ln['id']}: {fmt(ln['potential_V'][0])} to {fmt(ln['potential_V'][-1])} V vs SHE" for ln in out))
    return {"temp_C": t, "pH": pHs, "lines": out, **d.as_dict()}


def _line_conditions(line, k, t):
    """The checked conditions of line k (its own fields, the shared temperature)."""
    pre = f"lines[{k}]."
    if not isinstance(line, dict):
        raise InputError(f"lines[{k}]", line, "a mapping {id, activities, pressures, ...}")
    for key in line:
        if key not in EPH_LINE_KEYS:
            raise InputError(pre + str(key), line[key], "no such field",
                             "a line takes: " + ", ".join(EPH_LINE_KEYS) + " (temp_C is shared; pH is the axis)")
    if "id" not in line:
        raise InputError(pre + "id", None, HALF_REACTION_ID)
    return read_conditions({key: v for key, v in line.items() if key != "id"}, pre, checked_temp_C=t)


def _line_potentials(rec, base, E0_V, pHs, pre):
    """E at each pH by :func:`calc.electrode.nernst`; whether pH enters; the line's own warnings."""
    ox, red, n = sides(rec)
    used, dl = set(), Derivation()
    depends = any(s.name in ("H+", "OH-") for s in ox + red)
    potentials = []
    for pH in pHs if depends else pHs[:1]:  # without H+ or OH-, pH changes no activity: one point
        acts = activities_for(ox + red, replace(base, pH=pH), dl, used)
        potentials.append(nernst(E0_V, n, log10_quotient(ox, red, acts), base.temp_C))
    if not depends:
        potentials *= len(pHs)
    note_unused(base, used, dl, pre)
    return potentials, depends, dl


# --------------------------------------------------------------------------------------------
# where a metal-ion line means nothing: a hydroxide or oxide of the metal is the stable solid

#: the species of water a hydroxide or oxide electrode holds besides its solid and its metal
_WATER_SPECIES = ("H+", "OH-", "H2O")
#: what the clipping leaves out
HYDROXO_CAVEAT = ("dissolved hydroxo-complexes that some metals form at high pH (zincate, aluminate, ...) are not in "
                  "the dataset, so the solid is taken to hold up to pH 14")


def _ion_and_metal(rec):
    """(ion, metal) of a line M^z+ + z e− → M (a dissolved cation and its own metal), else None."""
    ox, red, _ = sides(rec)
    if (len(ox) == 1 and len(red) == 1 and ox[0].phase == "aq" and ox[0].charge > 0
            and red[0].phase in ("s", "l") and ox[0].formula == red[0].formula):
        return ox[0], red[0]
    return None


def _solid_of(rec, metal):
    """The hydroxide or oxide of ``metal`` that the half-reaction reduces to the metal, else None."""
    ox, red, _ = sides(rec)
    solids = [s for s in ox if s.phase == "s"]
    if len(solids) != 1 or not {"O", metal.formula} <= set(solids[0].atoms()) or solids[0].formula == metal.formula:
        return None
    water = all(s.name in _WATER_SPECIES for s in ox if s is not solids[0])
    to_metal = [s for s in red if s.name not in _WATER_SPECIES]
    takes_pH = any(s.name in ("H+", "OH-") for s in ox + red)
    if water and takes_pH and [(s.formula, s.phase) for s in to_metal] == [(metal.formula, metal.phase)]:
        return solids[0]
    return None


def solid_boundary(ion_E_V, solid_E_V, pHs):
    """The pH above which a hydroxide or oxide line lies below a flat metal-ion line.

    Both lines belong to one metal: the ion line M^z+/M is flat in pH, the solid's line falls
    with pH. Where the solid's line is the lower, the metal oxidises to the solid rather than to
    the ion, so the ion line no longer bounds the metal (the domains of a Pourbaix diagram: the
    metal is stable below the lowest of the lines of its oxidation products).

    Args:
        ion_E_V: potential of the ion line [V vs SHE]
        solid_E_V: potentials of the solid's line at each pH value [V vs SHE]
        pHs: the pH values, ascending [unitless]

    Returns:
        the pH of the crossing [unitless], or None when the solid's line does not fall with pH

    References:
        M. Pourbaix, Atlas of Electrochemical Equilibria in Aqueous Solutions, 2nd English ed.
        (NACE, 1974), ch. 2 (from memory): the lines of the equilibria of a metal with each of its
        oxidation products, and the lowest one bounds the domain of the metal.

    >>> solid_boundary(-0.9097, [-0.4317 - 0.05916 * p for p in (0, 14)], [0, 14])
    8.08
    """
    slope = (solid_E_V[-1] - solid_E_V[0]) / (pHs[-1] - pHs[0])
    if not slope < 0:
        return None
    return round(pHs[0] + (ion_E_V - solid_E_V[0]) / slope, 2)


def solid_clipping(rec, base, potentials, pHs):
    """Where the line of a metal ion means nothing because a hydroxide or oxide is the stable solid.

    For a line M^z+/M every hydroxide and oxide electrode of the same metal in the dataset is
    computed at the same temperature (solids and water at unit activity, a(H+) = 10^−pH); above
    the pH where the lowest of them crosses the ion line (:func:`solid_boundary`) the ion line is
    not meaningful. Other lines are meaningful at every pH.

    Args:
        rec: the half-reaction record of the line [unitless]
        base: the line's checked :class:`calc.conditions.Conditions` [unitless]
        potentials: the line's potentials at each pH value [V vs SHE]
        pHs: the pH values, ascending [unitless]

    Returns:
        dict with ``meaningful`` (a bool per pH value), ``meaningful_up_to_pH`` (the crossing, or
        None) and ``not_meaningful`` (a list of {from_pH, solid, line, reason, caveats})

    References:
        :func:`solid_boundary`; the potentials of both lines by :func:`calc.electrode.nernst`.

    >>> from calc.conditions import read_conditions
    >>> r = solid_clipping(half_reaction("Zn2+/Zn"), read_conditions({"activities": {"Zn2+": 1e-5}}),
    ...                    [-0.9097] * 15, list(range(15)))
    >>> r["meaningful_up_to_pH"], r["not_meaningful"][0]["solid"], r["meaningful"][8:10]
    (8.07, 'ZnO', [True, False])
    """
    found = _ion_and_metal(rec)
    none = {"meaningful": [True] * len(pHs), "meaningful_up_to_pH": None, "not_meaningful": []}
    if found is None or len(pHs) < 2 or pHs[-1] <= pHs[0]:
        return none
    ion, metal = found
    best = None
    for srec in current().records("half_reactions"):
        solid = _solid_of(srec, metal)
        if solid is None:
            continue
        sp = standard_potential_at(srec, base.temp_C, "lines")
        solid_E, _, _ = _line_potentials(srec, base, sp.standard_potential_V, pHs, "")
        x = solid_boundary(potentials[0], solid_E, pHs)
        if x is not None and (best is None or x < best[0]):
            best = (x, srec, solid, sp)
    if best is None or best[0] >= pHs[-1]:
        return none
    x, srec, solid, sp = best
    a_ion = activities_for([ion], base, Derivation())[ion.key].activity
    reason = (f"above pH {fmt(x, 3)} {metal.name} oxidises to {solid.name} rather than to {ion.name} at "
              f"a({ion.name}) = {fmt(a_ion, 3)}: the {srec['id']} line lies below the {rec['id']} line there, so "
              f"{solid.name} is the stable solid and the {rec['id']} line is not drawn")
    caveats = [HYDROXO_CAVEAT] + [w["message"] for w in sp.warnings]
    return {"meaningful": [p <= x for p in pHs], "meaningful_up_to_pH": x,
            "not_meaningful": [{"from_pH": x, "solid": solid.name, "line": srec["id"], "reason": reason,
                                "caveats": caveats}]}


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
    read(req, "eph", {"lines": "a list of lines, each {id, activities, pressures, ...}"}, ("temp_C", "pH_values"))
    pHs = req.get("pH_values")
    out = eph_lines(req["lines"], req.get("temp_C"), EPH_PH if pHs is None else pHs)
    out["data_version"] = current().version
    return out


def chart_line(rec, conditions):
    """One couple's line of its E–pH chart: the id, with the activities and pressures given for its species.

    Args:
        rec: the half-reaction record [unitless]
        conditions: the couple's request; of its ``activities`` [unitless] and ``pressures`` [atm]
            only the species of this half-reaction are kept (by name as written) [unitless]

    Returns:
        a line for :func:`eph_lines` (a dict)

    References:
        Presentation of the couple page's chart (no published method).

    >>> chart_line(half_reaction("Zn2+/Zn"), {"activities": {"Zn2+": 1e-5, "Cu2+": 1}, "pressures": {"O2": 0.21}})
    {'id': 'Zn2+/Zn', 'activities': {'Zn2+': 1e-05}}
    """
    ox, red, _ = sides(rec)
    names = {s.name for s in ox + red}
    line = {"id": rec["id"]}
    for key in CHART_FIELDS:
        kept = {name: v for name, v in (conditions.get(key) or {}).items() if name in names}
        if kept:
            line[key] = kept
    return line


def couple_chart(rec_a, rec_b, conditions, temp_C):
    """The E–pH chart of a couple: the water lines, then both electrodes at the couple's conditions.

    The same result as :func:`eph_entry` for the lines ``H+/H2``, ``O2/H2O``,
    :func:`chart_line` of a and of b, at the couple's temperature and the default pH values.

    Args:
        rec_a: the record of half-reaction a [unitless]
        rec_b: the record of half-reaction b [unitless]
        conditions: the couple's request (its activities and pressures are used) [unitless]
        temp_C: the couple's temperature, already checked [°C]

    Returns:
        dict as :func:`eph_entry` returns it

    References:
        See :func:`eph_lines`.

    >>> r = couple_chart(half_reaction("Zn2+/Zn"), half_reaction("Cu2+/Cu"), {}, 25.0)
    >>> [ln["id"] for ln in r["lines"]], len(r["pH"])
    (['H+/H2', 'O2/H2O', 'Zn2+/Zn', 'Cu2+/Cu'], 15)
    """
    lines = [{"id": rid} for rid in WATER_LINES] + [chart_line(rec, conditions) for rec in (rec_a, rec_b)]
    out = _lines_at(lines, temp_C, list(EPH_PH))
    out["data_version"] = current().version
    return out
