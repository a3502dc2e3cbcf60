"""The service conditions of a joint: what the engineer states, and the environment's defaults for the rest.

A joint, a matrix or a measured joint in an immersed environment may state its service conditions:
temperature, salinity or chloride, dissolved oxygen (a measured value, air saturation or
deaerated), flow velocity with the geometry it acts on (inside a pipe of a diameter, along an open
surface of a length, or still), pH, the electrolyte's conductivity and the anode's wetted area
(for the solution-resistance term). Whatever is not stated is taken from the environment's record
in ``data/service_defaults.yaml``; every value of the result says which (``from``: ``user``,
``environment`` or ``computed``) and names its source. Environments without such a record (the
atmospheres, soil) have no service model here: stated conditions are then reported as not used.

From the conditions: the O2 limiting current (:func:`calc.o2supply.oxygen_limiting_current`), the
electrolyte class the polarization data are chosen by (seawater at a salinity of 2 or more, the
lower end of PSS-78; fresh water below it) and the conductivity (:mod:`calc.ir`).
"""

from dataclasses import dataclass

from .bounds import check
from .derivation import Derivation, fmt
from .errors import InputError
from .field.seawater import SALINITY_LOW
from .ir import PSS78_S_RANGE, PSS78_T_RANGE_C, fresh_water_conductivity_S_per_m, seawater_conductivity_S_per_m
from .o2supply import geometry_id, oxygen_limiting_current
from .requests import norm

#: the service-condition fields a request may hold, in the order they are shown
SERVICE_FIELDS = ("temp_C", "salinity", "chloride_mg_per_L", "o2_mg_L", "aeration", "velocity_m_s", "geometry",
                  "diameter_m", "length_m", "pH", "conductivity_S_per_m", "anode_area_cm2")
#: request field -> (field of data/service_defaults.yaml, unit)
DATA_FIELDS = {"temp_C": ("temp_C", "°C"), "salinity": ("salinity_g_per_kg", "g/kg"),
               "chloride_mg_per_L": ("chloride_mg_per_L", "mg/L"), "o2_mg_L": (None, "mg/L"),
               "aeration": ("aeration", ""), "velocity_m_s": ("velocity_m_s", "m/s"), "geometry": ("geometry", ""),
               "diameter_m": ("diameter_m", "m"), "length_m": ("length_m", "m"), "pH": ("pH_value", ""),
               "conductivity_S_per_m": ("conductivity_S_per_m", "S/m"), "anode_area_cm2": (None, "cm²")}
AERATIONS = ("air-saturated", "deaerated")
#: salinity from which the seawater polarization data apply (PSS-78's lower end) [g/kg]
SEAWATER_SALINITY_MIN = SALINITY_LOW
#: below this salinity a seawater-class water is brackish: warned [g/kg]
BRACKISH_BELOW = 30.0


@dataclass(frozen=True)
class Service:
    """The service conditions used, with where each value came from, and what follows from them."""

    env_id: str
    values: dict  # request field -> value used
    origin: dict  # request field -> "user", "environment" or "computed"
    source: dict  # request field -> source id or None
    electrolyte: str  # "seawater" or "fresh-water"
    supply: object  # calc.o2supply.OxygenLimitingCurrent
    conductivity_S_per_m: float
    anode_area_cm2: float  # None: no IR term
    steps: tuple
    warnings: tuple
    sources: tuple

    def conditions(self):
        """The conditions as the result shows them: field -> {value, unit, from, source}."""
        out = {"electrolyte": self.electrolyte}
        for key in SERVICE_FIELDS:
            if key in self.values:
                out[key] = {"value": self.values[key], "unit": DATA_FIELDS[key][1], "from": self.origin[key],
                            "source": self.source.get(key)}
        return out

    def oxygen(self):
        """The oxygen supply as the result shows it."""
        s = self.supply
        return {"o2_mg_L": s.o2_mg_L, "o2_saturation_mg_L": s.o2_saturation_mg_L, "o2_given": s.o2_given,
                "diffusivity_m2_s": s.diffusivity_m2_s, "kinematic_viscosity_m2_s": s.kinematic_viscosity_m2_s,
                "schmidt": s.schmidt, "reynolds": s.reynolds, "sherwood": s.sherwood, "correlation": s.correlation,
                "delta_m": s.delta_m, "i_L_A_per_m2": s.i_L_A_per_m2, "i_L_uA_per_cm2": s.i_L_uA_per_cm2}


def defaults_for(ds, env_id):
    """The service-defaults record of an environment, or None.

    Args:
        ds: the dataset [unitless]
        env_id: an environment id [unitless]

    Returns:
        the record of ``data/service_defaults.yaml`` for it, or None

    References:
        Project data layout (DEVELOPERS.md: one file per kind of record).

    >>> from calc.dataset import current
    >>> defaults_for(current(), "marine-atmosphere") is None
    True
    """
    return next((r for r in ds.records("service_defaults") if r.get("id") == env_id), None)


def stated(request):
    """The service-condition fields a request states (not None), in :data:`SERVICE_FIELDS` order.

    Args:
        request: a request dict [unitless]

    Returns:
        field -> value

    References:
        Project convention (an absent field and a null field both mean "not stated").

    >>> stated({"temp_C": 5, "pH": None, "a": "zinc"})
    {'temp_C': 5}
    """
    return {k: request[k] for k in SERVICE_FIELDS if request.get(k) is not None}


def _aeration(given, rec):
    """(o2_mg_L or None for air saturation, aeration words, origin, source)."""
    if "o2_mg_L" in given and "aeration" in given:
        raise InputError("aeration", given["aeration"], "o2_mg_L or aeration, not both")
    if "o2_mg_L" in given:
        return given["o2_mg_L"], "measured", "user", None
    if "aeration" in given:
        word = given["aeration"]
        key = norm(word) if isinstance(word, str) else None
        match = next((a for a in AERATIONS if norm(a) == key), None)
        if match is None:
            raise InputError("aeration", word, "one of " + ", ".join(AERATIONS), "or give o2_mg_L")
        return (0.0 if match == "deaerated" else None), match, "user", None
    word = rec.get("aeration", "air-saturated")
    return (0.0 if word == "deaerated" else None), word, "environment", rec.get("aeration_source")


def _pick(key, given, rec, origin, source):
    """The user's value of a field, else the environment's (None when neither)."""
    if key in given:
        origin[key], source[key] = "user", None
        return given[key]
    field = DATA_FIELDS[key][0]
    if field and rec.get(field) is not None:
        origin[key], source[key] = "environment", _source_of(rec, field)
        return rec[field]
    return None


def _source_of(rec, data_field):
    """The source id the defaults record gives for one of its fields."""
    prefix = data_field
    while prefix:
        if rec.get(prefix + "_source"):
            return rec[prefix + "_source"]
        prefix = prefix.rpartition("_")[0]
    return rec.get("source")


def _flow(given, rec, values, origin, source):
    """Geometry, velocity and the geometry's size, user's first."""
    for key in ("geometry", "velocity_m_s", "diameter_m", "length_m"):
        if key in given:  # a size given is checked even where its geometry does not use it
            value = given[key] if key == "geometry" else check(key, given[key])
            values[key], origin[key], source[key] = value, "user", None
        elif rec.get(DATA_FIELDS[key][0]) is not None:
            values[key], origin[key] = rec[DATA_FIELDS[key][0]], "environment"
            source[key] = _source_of(rec, DATA_FIELDS[key][0])
    geo = geometry_id(values.get("geometry", "still"))
    if ("velocity_m_s" in given and origin.get("geometry") == "environment" and geo == "still"
            and check("velocity_m_s", given["velocity_m_s"]) > 0.0):
        raise InputError("geometry", None, "pipe (with diameter_m) or surface (with length_m)",
                         "a flow velocity acts on a geometry; this environment's default is still water")
    values["geometry"] = geo
    if geo == "still" and "velocity_m_s" not in given:
        values["velocity_m_s"] = 0.0


def _water(given, rec, values, origin, source):
    """Salinity or chloride, user's first (one of them)."""
    if "salinity" in given or "chloride_mg_per_L" in given:
        if "salinity" in given and "chloride_mg_per_L" in given:
            raise InputError("chloride_mg_per_L", given["chloride_mg_per_L"], "salinity or chloride_mg_per_L, not both")
        key = "salinity" if "salinity" in given else "chloride_mg_per_L"
        values[key], origin[key], source[key] = given[key], "user", None
        return
    for key in ("salinity", "chloride_mg_per_L"):
        field = DATA_FIELDS[key][0]
        if rec.get(field) is not None:
            values[key], origin[key], source[key] = rec[field], "environment", _source_of(rec, field)
            return
    raise InputError("salinity", None, "a salinity or chloride_mg_per_L", "the environment's defaults give none")


def _conductivity(d, given, rec, t, s, electrolyte):
    """The electrolyte's conductivity [S/m], how it was obtained and its source; (None, None, None) when it
    cannot be told (refused only when the IR term needs it, in :func:`read_service`)."""
    if "conductivity_S_per_m" in given:
        k = check("conductivity_S_per_m", given["conductivity_S_per_m"])
        d.step("Conductivity of the water (given)", "κ as stated at the service temperature", f"κ = {fmt(k)} S/m",
               f"κ = {fmt(k, 4)} S/m, ρ = {fmt(1.0 / k, 4)} Ω·m")
        return k, "user", None
    k25 = rec.get("conductivity_S_per_m")
    if electrolyte == "fresh-water" and k25 is not None:
        k = fresh_water_conductivity_S_per_m(k25, t)
        d.step("Conductivity of the fresh water", "κ = κ25·(1 + 0.02·(t − 25)) (2 %/K, common practice)",
               f"κ25 = {fmt(k25)} S/m (environment default), t = {fmt(t)} °C",
               f"κ = {fmt(k, 4)} S/m, ρ = {fmt(1.0 / k, 4)} Ω·m")
        return k, "environment", _source_of(rec, "conductivity_S_per_m")
    if s <= 0.0:
        return None, None, None
    k = seawater_conductivity_S_per_m(s, t)
    d.step("Conductivity of seawater (PSS-78, inverted)",
           "S = Σ a_i·R_t^(i/2) + ΔS(t); κ = R_t·r_t(t)·42.914 mS/cm",
           f"S = {fmt(s, 4)}, t = {fmt(t)} °C", f"κ = {fmt(k, 4)} S/m, ρ = {fmt(1.0 / k, 4)} Ω·m")
    if not (PSS78_S_RANGE[0] <= s <= PSS78_S_RANGE[1] and PSS78_T_RANGE_C[0] <= t <= PSS78_T_RANGE_C[1]):
        d.warn("temp_C" if PSS78_S_RANGE[0] <= s else "salinity",
               f"the practical salinity scale is defined for S 2–42 and −2 to 35 °C: the conductivity at S "
               f"{fmt(s, 4)}, {fmt(t)} °C is extrapolated")
    return k, "computed", "teos10-pss78"


BOUND_WORDS = "an electrolyte conductivity from 0.0001 to 20 S/m"


def _origin_words(service):
    return "; ".join(f"{k} {fmt(v) if not isinstance(v, str) else v} ({service[1][k]})"
                     for k, v in service[0].items())


def read_service(request, envrec, ds):
    """The service conditions of a request in an environment, the environment's defaults filling the rest.

    Args:
        request: the request dict (its service-condition fields, :data:`SERVICE_FIELDS`) [unitless]
        envrec: the environment record [unitless]
        ds: the dataset [unitless]

    Returns:
        (a :class:`Service` or None when the environment has no service model, warnings list)

    References:
        The O2 supply of :func:`calc.o2supply.oxygen_limiting_current`; conductivity by PSS-78
        (:mod:`calc.ir`); defaults from ``data/service_defaults.yaml``.

    >>> from calc.dataset import current
    >>> env = current().get("environments", "seawater-quiescent")
    >>> s, _ = read_service({"temp_C": 5}, env, current())
    >>> s.origin["temp_C"], s.origin["salinity"], s.electrolyte
    ('user', 'environment', 'seawater')
    """
    given = stated(request)
    rec = defaults_for(ds, envrec["id"])
    if rec is None:
        words = (f"{envrec.get('name', envrec['id'])} has no service model (no immersed-water defaults): the "
                 "stated condition is not used")
        return None, [{"field": k, "message": words} for k in given]
    values, origin, source = {}, {}, {}
    values["temp_C"] = check("temp_C", _pick("temp_C", given, rec, origin, source))
    _water(given, rec, values, origin, source)
    o2, aeration, origin["aeration"], source["aeration"] = _aeration(given, rec)
    values["aeration"] = aeration
    if o2 is not None and aeration == "measured":
        values["o2_mg_L"], origin["o2_mg_L"], source["o2_mg_L"] = o2, "user", None
    _flow(given, rec, values, origin, source)
    supply = oxygen_limiting_current(values["temp_C"], values.get("salinity"), o2, values.get("velocity_m_s", 0.0),
                                     values["geometry"], values.get("diameter_m") if values["geometry"] == "pipe"
                                     else None, values.get("length_m") if values["geometry"] == "surface" else None,
                                     values.get("chloride_mg_per_L"))
    if aeration == "deaerated":
        values["o2_mg_L"], origin["o2_mg_L"], source["o2_mg_L"] = 0.0, origin["aeration"], source["aeration"]
    elif "o2_mg_L" not in values:  # air saturation at the service temperature and salinity
        values["o2_mg_L"], origin["o2_mg_L"], source["o2_mg_L"] = supply.o2_mg_L, "computed", "garcia-gordon-1992"
    ph = _pick("pH", given, rec, origin, source)
    if ph is not None:
        values["pH"] = check("pH", ph)
    d = Derivation()
    electrolyte = "seawater" if supply.salinity >= SEAWATER_SALINITY_MIN else "fresh-water"
    k, how, where = _conductivity(d, given, rec, values["temp_C"], supply.salinity, electrolyte)
    if k is not None:
        values["conductivity_S_per_m"], origin["conductivity_S_per_m"], source["conductivity_S_per_m"] = k, how, where
    area = None
    if "anode_area_cm2" in given:
        area = values["anode_area_cm2"] = check("anode_area_cm2", given["anode_area_cm2"])
        origin["anode_area_cm2"], source["anode_area_cm2"] = "user", None
        if k is None:
            raise InputError("conductivity_S_per_m", None, BOUND_WORDS,
                             "the IR term of anode_area_cm2 needs it: water of salinity 0 has no default")
    for key in ("temp_C", "velocity_m_s", "diameter_m", "length_m"):
        if key in values and not isinstance(values[key], str):
            values[key] = float(values[key])
    shown = {k: values[k] for k in SERVICE_FIELDS if k in values}
    d.step("Service conditions", "each value as stated, else the environment's default",
           _origin_words((shown, origin)), f"electrolyte: {electrolyte} (salinity {fmt(supply.salinity, 4)} g/kg)")
    if electrolyte == "seawater" and supply.salinity < BRACKISH_BELOW:
        d.warn("salinity", f"brackish water (salinity {fmt(supply.salinity, 4)}): the seawater polarization data are "
                           "applied; potentials and films differ from full-strength seawater")
    for w in supply.warnings:
        d.warn(w["field"], w["message"])
    for s in (*supply.sources, *(v for v in source.values() if v)):
        d.cite(s)
    return Service(envrec["id"], shown, origin, source, electrolyte, supply, k, area,
                   tuple(supply.steps) + tuple(d.steps), tuple(d.warnings), tuple(d.sources)), []
