"""Current demand of an immersed structure: design current densities times area times coating breakdown.

The offshore method (DNV-RP-B401, restated by El-Reedy 2012, ch. 6): a surface of area A with a
design current density i (initial, mean, final, by climatic region and depth) and a coating
breakdown factor f needs I = A·i·f. The breakdown factor grows with the coating's age,
f = a + b·t; the mean over the design life t_f is a + 0.5·b·t_f, the final one a + b·t_f, both capped
at 1, and when the life outlasts the coating (a + b·t_f > 1) the mean is 1 − (1 − a)²/(2·b·t_f).
"""

from ..dataset import current
from ..derivation import fmt
from .catalogue import band_of, record

#: the three design stages, in order
STAGES = ("initial", "mean", "final")


def breakdown_initial(a):
    """Initial coating breakdown factor, f_i = a.

    Args:
        a: the coating's breakdown constant a [unitless]

    Returns:
        f_i [unitless]

    References:
        DNV-RP-B401 as restated by El-Reedy, Offshore Structures (2012), ch. 6 (f_ci = a).

    >>> breakdown_initial(0.05)
    0.05
    """
    return min(a, 1.0)


def breakdown_final(a, b, life):
    """Final coating breakdown factor, f_f = a + b·t_f, capped at 1.

    Args:
        a: breakdown constant a [unitless]
        b: breakdown rate b [1/yr]
        life: design life t_f [years]

    Returns:
        f_f [unitless]

    References:
        El-Reedy, Offshore Structures (2012), eq. 6.12, and the cap at 1 (restating DNV-RP-B401).

    >>> breakdown_final(0.05, 0.025, 20)
    0.55
    >>> breakdown_final(0.10, 0.10, 20)
    1.0
    """
    return min(a + b * life, 1.0)


def coating_life(a, b):
    """The age at which the coating breakdown factor reaches 1, t = (1 − a)/b (None when b = 0).

    Args:
        a: breakdown constant a [unitless]
        b: breakdown rate b [1/yr]

    Returns:
        the coating's life in the model, or None when it never reaches 1 [years]

    References:
        From f = a + b·t (El-Reedy 2012, eq. 6.10) set equal to 1.

    >>> coating_life(0.10, 0.10)
    9.0
    """
    return None if b <= 0.0 else (1.0 - a) / b


def breakdown_mean(a, b, life):
    """Mean coating breakdown factor over the design life.

    f_m = a + 0.5·b·t_f while the coating lasts; when the design life outlasts it (a + b·t_f > 1),
    f_m = 1 − (1 − a)²/(2·b·t_f), the time average of f capped at 1.

    Args:
        a: breakdown constant a [unitless]
        b: breakdown rate b [1/yr]
        life: design life t_f [years]

    Returns:
        f_m [unitless]

    References:
        El-Reedy, Offshore Structures (2012), eq. 6.11 and 6.13 (restating DNV-RP-B401).

    >>> breakdown_mean(0.05, 0.025, 20)
    0.3
    >>> round(breakdown_mean(0.10, 0.10, 20), 4)  # the coating is gone after 9 years
    0.7975
    """
    if a >= 1.0:
        return 1.0
    if a + b * life <= 1.0:
        return a + 0.5 * b * life
    return 1.0 - (1.0 - a) ** 2 / (2.0 * b * life)


def current_demand(density, area, breakdown):
    """Current demand of one surface, I = i·A·f.

    Args:
        density: design current density of bare steel [A/m²]
        area: the surface's area [m²]
        breakdown: coating breakdown factor (1 for bare steel) [unitless]

    Returns:
        current demand [A]

    References:
        DNV-RP-B401 as restated by El-Reedy (2012), ch. 6 (I_c = A_c·i_c·f_c).

    >>> round(current_demand(0.13, 1000.0, 0.55), 6)
    71.5
    """
    return density * area * breakdown


def breakdown_factors(coating, depth, life, field="coating"):
    """The initial, mean and final breakdown factors of a coating category at a depth.

    Args:
        coating: coating category id or alias of data/cp_coatings.yaml [unitless]
        depth: depth of the surface below the water surface [m]
        life: design life [years]
        field: the request field, for an unknown category [unitless]

    Returns:
        (coating record, band used, {"initial", "mean", "final"} factors) [unitless]

    References:
        :func:`breakdown_initial`, :func:`breakdown_mean`, :func:`breakdown_final`.

    >>> breakdown_factors("II", 10.0, 20)[2]
    {'initial': 0.05, 'mean': 0.3, 'final': 0.55}
    """
    rec = record("cp_coatings", coating, field)
    band = band_of(rec["bands"], depth, "depth_m")
    a, b = band["a"], band["b"]
    return rec, band, {"initial": breakdown_initial(a), "mean": breakdown_mean(a, b, life),
                       "final": breakdown_final(a, b, life)}


def densities(region, zone, depth):
    """The design current densities of bare steel for a region, zone and depth.

    Args:
        region: climatic region record of data/cp_current_densities.yaml (seawater zones) [unitless]
        zone: ``seawater`` or ``seabed`` [unitless]
        depth: depth below the water surface [m]

    Returns:
        (the record used, {"initial", "mean", "final"} densities) [A/m²]

    References:
        DNV-RP-B401 (2010) Tables 10-1 and 10-2, recalled (data/cp_current_densities.yaml).

    >>> from calc.cpdesign.catalogue import record
    >>> densities(record("cp_current_densities", "temperate", "region"), "seawater", 20.0)[1]["final"]
    0.13
    """
    if zone == "seabed":
        region = next(r for r in current().records("cp_current_densities") if r.get("zone") == "seabed")
    band = band_of(region["bands"], depth, "depth_m")
    return region, {s: band[f"{s}_A_per_m2"] for s in STAGES}


def demand_text(stage, density, area, factor, amps):
    """The substituted line of one demand step, as the derivation shows it.

    Args:
        stage: ``initial``, ``mean`` or ``final`` [unitless]
        density: design current density [A/m²]
        area: surface area [m²]
        factor: coating breakdown factor [unitless]
        amps: the demand [A]

    Returns:
        text

    References:
        Presentation of the derivation (no published method).

    >>> demand_text("final", 0.13, 100.0, 1.0, 13.0)
    'I_final = 0.13 A/m² × 100 m² × 1 = 13 A'
    """
    return f"I_{stage} = {fmt(density)} A/m² × {fmt(area)} m² × {fmt(factor, 4)} = {fmt(amps, 5)} A"
