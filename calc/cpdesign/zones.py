"""The surfaces of an immersed structure, by zone, and their current demand.

A request lists the structure as zones: each an area in seawater at a depth, or buried in the
seabed, bare or with a coating category. Each zone's initial, mean and final demand is its design
current density (by climatic region and depth) times its area times its coating breakdown factor
(:mod:`calc.cpdesign.demand`); the structure's demand is their sum.
"""

from ..derivation import fmt
from ..errors import InputError
from ..requests import label, read
from .catalogue import names_of, record, region_for
from .demand import STAGES, breakdown_factors, current_demand, demand_text, densities
from .limits import check

#: most zones in one request [unitless]
ZONES_MAX = 200
#: where a zone's surface is
ZONE_KINDS = ("seawater", "seabed")
ZONE_FIELDS = {"area_m2": "the zone's surface area in m²"}
ZONE_OPTIONAL = ("name", "zone", "depth_m", "coating")


def _zone(item, i):
    """One zone of the request, checked: (name, kind, depth, area, coating id as given)."""
    where = f"zones[{i}]"
    try:
        read(item, where, ZONE_FIELDS, ZONE_OPTIONAL)
    except InputError as exc:
        raise InputError(f"{where}.{exc.field}" if exc.field != "request" else where, exc.value, exc.allowed,
                         exc.hint) from None
    name = (label(item["name"], f"{where}.name", "a name for the zone") if item.get("name") is not None
            else f"zone {i + 1}")
    kind = item.get("zone", "seawater")
    if kind not in ZONE_KINDS:
        raise InputError(f"{where}.zone", kind, "seawater or seabed")
    depth = check("depth_m", item.get("depth_m", 0.0), f"{where}.depth_m")
    area = check("area_m2", item["area_m2"], f"{where}.area_m2")
    return name, kind, depth, area, item.get("coating", "bare")


def read_zones(zones):
    """The zones of a request, checked.

    Args:
        zones: list of ``{"area_m2", "name", "zone", "depth_m", "coating"}`` [m², m]

    Returns:
        list of (name, zone kind, depth, area, coating as given) [m, m²]

    References:
        Input rule of the project (every field checked, errors name the field).

    >>> read_zones([{"area_m2": 100, "coating": "II", "depth_m": 12}])[0]
    ('zone 1', 'seawater', 12.0, 100.0, 'II')
    """
    if not isinstance(zones, list) or not zones or len(zones) > ZONES_MAX:
        raise InputError("zones", zones if not isinstance(zones, list) else f"a list of {len(zones)}",
                         f"a list of 1 to {ZONES_MAX} zones, each with its surface area (and where it is, its depth, "
                         "its coating and a name)")
    return [_zone(item, i) for i, item in enumerate(zones)]


def _regions():
    """The climatic regions of the dataset, by name."""
    return names_of("cp_current_densities", lambda rec: rec.get("zone") == "seawater")


def region_of(request, need):
    """The climatic region of a request: named (``region``) or from ``water_temp_C``.

    Args:
        request: the request, with ``region`` or ``water_temp_C`` [unitless, °C]
        need: True when a seawater zone needs a region [unitless]

    Returns:
        the region record, or None when none is needed and none given

    References:
        Climatic regions by surface-water temperature (DNV-RP-B401, recalled; data/cp_current_densities.yaml).

    >>> region_of({"water_temp_C": 25}, True)["id"]
    'tropical'
    """
    if request.get("region") is not None and request.get("water_temp_C") is not None:
        raise InputError("water_temp_C", request["water_temp_C"], "a climatic region or the surface-water temperature, not both")
    if request.get("region") is not None:
        rec = record("cp_current_densities", request["region"], "region")
        if rec.get("zone") != "seawater":
            raise InputError("region", request["region"], "a climatic region: " + _regions())
        return rec
    if request.get("water_temp_C") is not None:
        return region_for(check("water_temp_C", request["water_temp_C"]))
    if need:
        raise InputError("region", None, f"a climatic region ({_regions()}) or the surface-water temperature "
                                         "in °C")
    return None


def zone_demand(zone, region, life, d, field="coating"):
    """One zone's current demand, initial, mean and final, with its derivation steps.

    Args:
        zone: (name, kind, depth, area, coating) as :func:`read_zones` gives it [m, m²]
        region: climatic region record (seawater zones) [unitless]
        life: design life [years]
        d: the Derivation collecting the steps and sources [unitless]
        field: the request field of the zone's coating, for an unknown category [unitless]

    Returns:
        dict name, zone, depth_m, area_m2, coating, region, current_density_A_per_m2,
        breakdown, current_A (each initial/mean/final) [A/m², A]

    References:
        :func:`calc.cpdesign.demand.current_demand`, :func:`calc.cpdesign.demand.breakdown_factors`.

    >>> from calc.derivation import Derivation
    >>> from calc.cpdesign.catalogue import record
    >>> temperate = record("cp_current_densities", "temperate", "region")
    >>> z = zone_demand(("legs", "seawater", 10.0, 1000.0, "bare"), temperate, 25, Derivation())
    >>> z["current_A"]["final"]
    130.0
    """
    name, kind, depth, area, coating = zone
    rec_dens, dens = densities(region, kind, depth)
    coat, band, f = breakdown_factors(coating, depth, life, field=field)
    amps = {s: current_demand(dens[s], area, f[s]) for s in STAGES}
    d.cite(rec_dens["source"])
    d.cite(coat["source"])
    d.cite(coat.get("model_source"))
    where = f"{name} ({kind}" + (f", {fmt(depth)} m" if kind == "seawater" else "") + f", {coat['name']})"
    if coat["id"] != "bare":
        d.step(f"Coating breakdown, {name}", "f_i = a; f_m = a + 0.5·b·t_f (or 1 − (1 − a)²/(2·b·t_f) once the "
               "coating is used up); f_f = a + b·t_f; each at most 1",
               f"a = {fmt(band['a'])}, b = {fmt(band['b'])}/yr, t_f = {fmt(life)} yr",
               ", ".join(f"f_{s} = {fmt(f[s], 4)}" for s in STAGES))
    d.step(f"Current demand, {where}", "I = i·A·f (design current density of bare steel × area × breakdown factor)",
           "; ".join(demand_text(s, dens[s], area, f[s], amps[s]) for s in STAGES),
           ", ".join(f"I_{s} = {fmt(amps[s], 5)} A" for s in STAGES))
    return {"name": name, "zone": kind, "depth_m": depth, "area_m2": area, "coating": coat["id"],
            "region": rec_dens["id"], "current_density_A_per_m2": dens, "breakdown": f, "current_A": amps}
