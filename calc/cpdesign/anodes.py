"""Resistance of a galvanic anode to the electrolyte by its shape, and its current output.

The formulas of the offshore practice (DNV-RP-B401, restated by El-Reedy 2012, ch. 6):

- long slender stand-off anode (length at least 4 radii): modified Dwight, R = ρ/(2πL)·[ln(4L/r) − 1],
  valid with at least 0.30 m between anode and structure and used ×1.3 from 0.15 to 0.30 m; not
  valid closer (the anode is then flush-mounted);
- short slender stand-off anode (recalled form, below);
- long flush-mounted anode: R = ρ/(2S), S = (L + W)/2 (Lloyd);
- short flush-mounted, bracelet and plate anodes: R = 0.315·ρ/√A, A the exposed area (McCoy).

The output of an anode is I = ΔE/R with ΔE the protection potential minus the anode's closed-circuit
potential.
"""

import math

from ..dataset import current
from ..derivation import Derivation, fmt
from ..errors import InputError
from ..requests import read
from .cautions import cautions
from .catalogue import record
from .limits import check

#: the resistance formulas, by shape
SHAPES = ("standoff", "short-standoff", "flush", "short-flush", "bracelet", "plate")
#: shape -> its name in words
SHAPE_NAMES = {"standoff": "long slender stand-off", "short-standoff": "short slender stand-off",
               "flush": "long flush-mounted", "short-flush": "short flush-mounted", "bracelet": "bracelet",
               "plate": "plate"}
#: the shapes as a message lists them: the word to give, then the shape in words
SHAPES_TEXT = ", ".join(k if k == v else f"{k} ({v})" for k, v in SHAPE_NAMES.items())
#: a stand-off anode is "long" from a length of 4 radii, a flush one from 4 widths (DNV-RP-B401, recalled)
LONG_RATIO = 4.0
#: the consumed length of a long stand-off anode, as a share of its initial length (DNV-RP-B401, from memory)
CONSUMED_LENGTH_SHARE = 0.9


def standoff_long(resistivity, length, radius):
    """Resistance of a long slender stand-off anode, R = ρ/(2πL)·[ln(4L/r) − 1] (modified Dwight).

    Args:
        resistivity: electrolyte resistivity ρ [Ω·m]
        length: anode length L [m]
        radius: anode radius r (or periphery/2π) [m]

    Returns:
        anode resistance [Ω]

    References:
        DNV-RP-B401 (modified Dwight), as restated by El-Reedy, Offshore Structures (2012), ch. 6.

    >>> round(standoff_long(0.30, 2.5, 0.12), 4)
    0.0654
    """
    return resistivity / (2.0 * math.pi * length) * (math.log(4.0 * length / radius) - 1.0)


def standoff_short(resistivity, length, radius):
    """Resistance of a short stand-off anode (length below 4 radii), from memory.

    R = ρ/(2πL)·[ln{(2L/r)·(1 + √(1 + (r/2L)²))} + r/(2L) − √(1 + (r/2L)²)]

    Args:
        resistivity: electrolyte resistivity ρ [Ω·m]
        length: anode length L [m]
        radius: anode radius r [m]

    Returns:
        anode resistance [Ω]

    References:
        DNV-RP-B401 resistance table, short slender stand-off anode: from memory, not re-read.

    >>> round(standoff_short(0.30, 0.4, 0.12), 4)
    0.2071
    """
    q = math.sqrt(1.0 + (radius / (2.0 * length)) ** 2)
    return resistivity / (2.0 * math.pi * length) * (
        math.log(2.0 * length / radius * (1.0 + q)) + radius / (2.0 * length) - q)


def flush_long(resistivity, length, width):
    """Resistance of a long flush-mounted anode, R = ρ/(2S) with S = (L + W)/2 (Lloyd).

    Args:
        resistivity: electrolyte resistivity ρ [Ω·m]
        length: anode length L [m]
        width: anode width W [m]

    Returns:
        anode resistance [Ω]

    References:
        DNV-RP-B401 (Lloyd's formula), as restated by El-Reedy, Offshore Structures (2012), ch. 6.

    >>> round(flush_long(0.30, 1.5, 0.2), 4)
    0.1765
    """
    return resistivity / (2.0 * (length + width) / 2.0)


def compact(resistivity, area):
    """Resistance of a short flush-mounted, bracelet or plate anode, R = 0.315·ρ/√A (McCoy).

    Args:
        resistivity: electrolyte resistivity ρ [Ω·m]
        area: exposed anode surface area A [m²]

    Returns:
        anode resistance [Ω]

    References:
        DNV-RP-B401 (McCoy's formula), as restated by El-Reedy, Offshore Structures (2012), ch. 6.

    >>> round(compact(0.30, 0.36), 4)
    0.1575
    """
    return 0.315 * resistivity / math.sqrt(area)


def standoff_factor(clearance, rule, field="anode.standoff_m"):
    """The factor on the long stand-off formula at a clearance between anode and structure.

    Args:
        clearance: clear distance between anode and structure [m]
        rule: the ``standoff`` block of the anode type (min_m, near_min_m, near_factor) [m]
        field: the request field of the clearance, for the error [unitless]

    Returns:
        1 at ``min_m`` or more, ``near_factor`` from ``near_min_m`` up to it [unitless]

    References:
        DNV-RP-B401 as restated by El-Reedy (2012), ch. 6: valid from 0.30 m, ×1.3 from 0.15 to 0.30 m.

    >>> standoff_factor(0.2, {"min_m": 0.30, "near_min_m": 0.15, "near_factor": 1.3})
    1.3
    """
    if clearance >= rule["min_m"]:
        return 1.0
    if clearance >= rule["near_min_m"]:
        return rule["near_factor"]
    raise InputError(field, clearance, f"a clearance of at least {rule['near_min_m']:g} m for a "
                     "stand-off anode", "closer to the structure the stand-off formula is not valid: use a "
                     "flush-mounted anode type")


def consumed_standoff(length, radius, utilisation, core_radius=0.0):
    """Final (consumed) length and radius of a long stand-off anode, from memory.

    The length shrinks to 90 % and the remaining share (1 − u) of the anode material lies on the core:
    L_f = 0.9·L, r_f² = r_c² + (1 − u)·(r² − r_c²)·L/L_f.

    Args:
        length: initial length [m]
        radius: initial radius [m]
        utilisation: utilisation factor u [unitless]
        core_radius: radius of the steel core, 0 when not given [m]

    Returns:
        (final length, final radius) [m]

    References:
        DNV-RP-B401 rule for final anode dimensions: from memory, not re-read.

    >>> [round(x, 4) for x in consumed_standoff(2.5, 0.12, 0.90)]
    [2.25, 0.04]
    """
    lf = CONSUMED_LENGTH_SHARE * length
    rf = math.sqrt(core_radius ** 2 + (1.0 - utilisation) * (radius ** 2 - core_radius ** 2) * length / lf)
    return lf, rf


def output(driving, resistance):
    """Current output of one anode, I = ΔE/R.

    Args:
        driving: driving voltage ΔE, protection potential minus the anode's closed-circuit potential [V]
        resistance: anode resistance R [Ω]

    Returns:
        anode current output [A]

    References:
        Ohm's law as applied in DNV-RP-B401 (restated by El-Reedy 2012, ch. 6).

    >>> round(output(0.25, 0.0654), 3)
    3.823
    """
    return driving / resistance


def _radius(dims, prefix):
    if dims.get("radius_m") is not None:
        return check("radius_m", dims["radius_m"], prefix + "radius_m")
    if dims.get("periphery_m") is not None:
        return check("periphery_m", dims["periphery_m"], prefix + "periphery_m") / (2.0 * math.pi)
    raise InputError(prefix + "radius_m", None, "the anode radius in m (or the periphery of its cross-section)")


def _need(dims, key, bound, prefix, words):
    if dims.get(key) is None:
        raise InputError(prefix + key, None, words)
    return check(bound, dims[key], prefix + key)


def resistance(shape, rho, dims, prefix="anode.", rule=None):
    """Resistance of an anode of a shape, with the formula and its numbers for the derivation.

    Args:
        shape: one of :data:`SHAPES` [unitless]
        rho: electrolyte resistivity [Ω·m]
        dims: length_m, radius_m or periphery_m, width_m, area_m2, standoff_m as the shape needs [m, m²]
        prefix: the request path of ``dims``, for errors [unitless]
        rule: the stand-off rule (min_m, near_min_m, near_factor); default that of the long stand-off type [m]

    Returns:
        (R, formula text, substituted text, warnings) [Ω]

    References:
        :func:`standoff_long`, :func:`standoff_short`, :func:`flush_long`, :func:`compact`.

    >>> round(resistance("plate", 0.3, {"area_m2": 0.36})[0], 4)
    0.1575
    """
    warnings = []
    if shape in ("standoff", "short-standoff"):
        length = _need(dims, "length_m", "length_m", prefix, "the anode length in m")
        r = _radius(dims, prefix)
        long = length >= LONG_RATIO * r
        if shape == "standoff" and not long:
            warnings.append(f"the anode length {fmt(length)} m is below {LONG_RATIO:g} radii: the short stand-off formula "
                            "is used")
        if shape == "short-standoff" and long:
            warnings.append(f"the anode length {fmt(length)} m is {LONG_RATIO:g} radii or more: the long stand-off formula "
                            "is used")
        if long:
            rule = rule or record("cp_anode_types", "long-slender-standoff", "anode_type")["standoff"]
            if dims.get("standoff_m") is None:
                raise InputError(prefix + "standoff_m", None, "the clearance between anode and structure in m")
            field = prefix + "standoff_m"
            k = standoff_factor(check("standoff_m", dims["standoff_m"], field), rule, field)
            value = k * standoff_long(rho, length, r)
            return (value, "R = k·ρ/(2πL)·[ln(4L/r) − 1] (modified Dwight; k = 1.3 close to the structure)",
                    f"R = {fmt(k)} × {fmt(rho)} Ω·m/(2π × {fmt(length)} m) × [ln(4 × {fmt(length)}/{fmt(r, 4)}) − 1]",
                    warnings)
        value = standoff_short(rho, length, r)
        return (value, "R = ρ/(2πL)·[ln{(2L/r)(1 + √(1 + (r/2L)²))} + r/2L − √(1 + (r/2L)²)] (from memory)",
                f"ρ = {fmt(rho)} Ω·m, L = {fmt(length)} m, r = {fmt(r, 4)} m", warnings)
    if shape == "flush":
        length = _need(dims, "length_m", "length_m", prefix, "the anode length in m")
        width = _need(dims, "width_m", "width_m", prefix, "the anode width in m")
        if length < LONG_RATIO * width:
            warnings.append(f"the anode length {fmt(length)} m is below {LONG_RATIO:g} widths: the anode is short; the area "
                            "formula of a short flush-mounted anode suits it better")
        return (flush_long(rho, length, width), "R = ρ/(2S), S = (L + W)/2 (Lloyd)",
                f"R = {fmt(rho)} Ω·m/(2 × ({fmt(length)} + {fmt(width)}) m/2)", warnings)
    if shape in ("short-flush", "bracelet", "plate"):
        area = _need(dims, "area_m2", "anode_area_m2", prefix, "the exposed anode area in m²")
        return (compact(rho, area), "R = 0.315·ρ/√A (McCoy)", f"R = 0.315 × {fmt(rho)} Ω·m/√({fmt(area)} m²)",
                warnings)
    raise InputError(prefix + "shape" if prefix else "shape", shape, "a shape of anode: " + SHAPES_TEXT)


#: request fields of ``anode-resistance``
RESISTANCE_FIELDS = ("length_m", "radius_m", "periphery_m", "width_m", "area_m2", "standoff_m")


def anode_resistance_entry(request):
    """JSON entry point ``anode-resistance``: the resistance of one galvanic anode by its shape.

    Args:
        request: ``{"shape", "resistivity_ohm_m", and as the shape needs "length_m", "radius_m"
            (or "periphery_m"), "width_m", "area_m2", "standoff_m"}`` [Ω·m, m, m²]

    Returns:
        dict with resistance_ohm, shape, formula, steps, warnings, cautions, sources, data_version

    References:
        :func:`resistance` (DNV-RP-B401 formulas as restated by El-Reedy 2012, ch. 6).

    >>> r = anode_resistance_entry({"shape": "bracelet", "resistivity_ohm_m": 0.3, "area_m2": 0.36})
    >>> round(r["resistance_ohm"], 4)
    0.1575
    """
    read(request, "anode-resistance", {"shape": "the anode shape: " + SHAPES_TEXT,
                                       "resistivity_ohm_m": "the electrolyte resistivity in Ω·m"}, RESISTANCE_FIELDS)
    shape = request["shape"]
    if shape not in SHAPES:
        raise InputError("shape", shape, "a shape of anode: " + SHAPES_TEXT)
    rho = check("resistivity_ohm_m", request["resistivity_ohm_m"])
    d = Derivation()
    value, formula, text, warns = resistance(shape, rho, request, prefix="")
    for w in warns:
        d.warn(None, w)
    d.step(f"Anode resistance ({SHAPE_NAMES[shape]} anode)", formula, text, f"R = {fmt(value, 5)} Ω")
    rec = record("cp_anode_types", "long-slender-standoff", "anode_type")
    d.cite(rec["standoff"]["source"] if shape == "standoff" else rec["source"])
    return {"resistance_ohm": value, "shape": shape, "formula": formula, "steps": d.steps, "warnings": d.warnings,
            "cautions": cautions("offshore"), "sources": d.sources, "data_version": current().version}
