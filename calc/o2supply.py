"""The diffusion-limited oxygen-reduction current of a surface at its service conditions.

One calculation: O2 in the water (:mod:`calc.oxygen`), its diffusivity and the water's viscosity,
the Sherwood number of the flow over the surface and the diffusion layer it leaves
(:mod:`calc.transport`), and i_L = n·F·D·C/δ, shown in A/m² and µA/cm². i_L is the most oxygen a
cathode can reduce there: an upper bound of its cathodic current. Films, fouling and calcareous
deposits keep a real cathode below it; a biofilm on a passive alloy brings it closer.
"""

from dataclasses import dataclass

from .bounds import BOUNDS, check
from .constants import FARADAY
from .derivation import Derivation, fmt
from .errors import InputError
from .oxygen import DissolvedOxygen, dissolved_oxygen
from .requests import norm
from .transport import (CORRELATIONS, HAN_BARTELS_RANGE_C, N_O2, RE_PIPE_LAMINAR_MAX, RE_PLATE_LAMINAR_MAX,
                        STILL_LAYER_M, diffusion_layer_m, limiting_current_density_A_m2, o2_diffusivity_m2_s,
                        o2_diffusivity_water_m2_s, reynolds_number, schmidt_number, seawater_viscosity_Pa_s,
                        validity_warnings, water_viscosity_Pa_s)

#: geometry -> accepted spellings
GEOMETRIES = {"pipe": ("pipe", "tube", "inside a pipe"), "surface": ("surface", "plate", "open surface", "hull"),
              "still": ("still", "quiescent", "stagnant")}


@dataclass(frozen=True)
class OxygenLimitingCurrent:
    """The O2 limiting current of a surface, with what it was computed from."""

    temp_C: float
    salinity: float
    geometry: str
    velocity_m_s: float
    diameter_m: float  # pipe only, else None
    length_m: float  # open surface only, else None
    o2_mg_L: float
    o2_mol_m3: float
    o2_saturation_mg_L: float
    o2_given: bool  # True: the user's value; False: air saturation
    density_kg_m3: float
    viscosity_Pa_s: float
    kinematic_viscosity_m2_s: float
    diffusivity_m2_s: float
    schmidt: float
    reynolds: float  # None in still water
    sherwood: float  # None in still water
    correlation: str  # a key of calc.transport.CORRELATIONS, or "still-layer"
    delta_m: float
    i_L_A_per_m2: float
    i_L_uA_per_cm2: float
    steps: tuple
    warnings: tuple
    sources: tuple

    to_dict = DissolvedOxygen.to_dict  # the result as plain data (lists for the tuples)


def geometry_id(geometry):
    """The geometry a name stands for: pipe, surface or still.

    Args:
        geometry: "pipe", "surface" or "still", or an accepted spelling [unitless]

    Returns:
        the geometry id [unitless]

    References:
        Lookup rule of the project (calc.requests.norm: case, spaces and hyphens ignored).

    >>> geometry_id("Open surface"), geometry_id("quiescent")
    ('surface', 'still')
    """
    key = norm(geometry) if isinstance(geometry, str) else None
    for gid, names in GEOMETRIES.items():
        if key in {norm(n) for n in names}:
            return gid
    raise InputError("geometry", geometry, "one of " + ", ".join(GEOMETRIES))


def _size(d, geo, diameter_m, length_m):
    """The characteristic length the geometry needs (checked), and a warning for one it ignores."""
    need = {"pipe": ("diameter_m", diameter_m), "surface": ("length_m", length_m)}
    for gid, (field, value) in need.items():
        if gid != geo and value is not None:
            d.warn(field, f"{field} was not used: the {geo} geometry does not need it")
    if geo == "still":
        return None
    field, value = need[geo]
    if value is None:
        raise InputError(field, None, f"{BOUNDS[field].allowed} (the {geo} geometry needs it)")
    return check(field, value)


def _correlation(geo, re):
    """The Sherwood correlation of a geometry at a Reynolds number."""
    if geo == "pipe":
        return "pipe-laminar" if re < RE_PIPE_LAMINAR_MAX else "pipe-turbulent"
    return "plate-laminar" if re < RE_PLATE_LAMINAR_MAX else "plate-turbulent"


def _properties(d, t, s, rho):
    """Viscosity, kinematic viscosity, O2 diffusivity and Schmidt number, with their steps."""
    mu_w, mu = water_viscosity_Pa_s(t), seawater_viscosity_Pa_s(t, s)
    nu = mu / rho
    d.step("Viscosity of the water (Sharqawy et al. 2010, eqs. 22–23)",
           "μ_w = 4.2844e-5 + 1/(0.157·(t + 64.993)² − 91.296); μ = μ_w·(1 + A·s + B·s²); ν = μ/ρ",
           f"t = {fmt(t)} °C, S = {fmt(s, 4)} g/kg, ρ = {fmt(rho, 6)} kg/m³",
           f"μ_w = {fmt(mu_w * 1e3, 5)} mPa·s, μ = {fmt(mu * 1e3, 5)} mPa·s, ν = {fmt(nu, 5)} m²/s")
    D_w, D = o2_diffusivity_water_m2_s(t), o2_diffusivity_m2_s(t, s)
    d.step("O2 diffusivity (Han & Bartels 1996; seawater by the viscosity ratio)",
           "log10(D_w/cm² s⁻¹) = −4.410 + 773.8/T − (506.4/T)²; D = D_w·μ_w/μ",
           f"T = {fmt(t + 273.15)} K: D_w = {fmt(D_w, 5)} m²/s; μ_w/μ = {fmt(mu_w / mu, 5)}",
           f"D = {fmt(D, 5)} m²/s")
    sc = schmidt_number(nu, D)
    d.step("Schmidt number", "Sc = ν/D", f"Sc = {fmt(nu, 5)} / {fmt(D, 5)}", f"Sc = {fmt(sc, 5)}")
    if not HAN_BARTELS_RANGE_C[0] <= t <= HAN_BARTELS_RANGE_C[1]:
        d.warn("temp_C", f"{fmt(t)} °C is outside the −0.5 to 95 °C of the O2 diffusivity data: extrapolated")
    for cite in ("sharqawy-2010", "han-bartels-1996"):
        d.cite(cite)
    return mu, nu, D, sc


def oxygen_limiting_current(temp_C, salinity=None, o2_mg_L=None, velocity_m_s=0.0, geometry="still",
                            diameter_m=None, length_m=None, chloride_mg_per_L=None, still_layer_m=None):
    """The diffusion-limited O2 reduction current density of a surface in flowing or still water.

    Args:
        temp_C: water temperature, 0 to 100 [°C]
        salinity: practical salinity, 0 for fresh water, up to 45 [g/kg]
        o2_mg_L: measured dissolved O2, None for air saturation, 0 for deaerated [mg/L]
        velocity_m_s: mean velocity in the pipe or free-stream velocity past the surface [m/s]
        geometry: "pipe" (inside wall), "surface" (open surface in parallel flow) or "still" [unitless]
        diameter_m: inside diameter of the pipe, for "pipe" [m]
        length_m: length of the surface in the flow direction, for "surface" [m]
        chloride_mg_per_L: chloride content instead of salinity [mg/L]
        still_layer_m: diffusion layer in still water, default 1 mm (:data:`STILL_LAYER_M`) [m]

    Returns:
        an :class:`OxygenLimitingCurrent` (i_L in [A/m²] and [µA/cm²])

    References:
        i_L = n·F·D·C/δ, P. R. Roberge, Corrosion Engineering: Principles and Practice (2008),
        §5.3 Eq. (5.14); C by Garcia & Gordon (1992) eq. (8); D by Han & Bartels (1996); ν by
        Sharqawy et al. (2010) eqs. (8), (22), (23); δ = L/Sh from Berger & Hau (1977) in pipes
        and the flat-plate correlations of Incropera et al. (2007) §7.2 (see :mod:`calc.transport`).

    >>> r = oxygen_limiting_current(25.0, 35.0)
    >>> round(r.i_L_uA_per_cm2, 1), r.correlation
    (15.1, 'still-layer')
    >>> r = oxygen_limiting_current(25.0, 35.0, velocity_m_s=3.0, geometry="pipe", diameter_m=0.1)
    >>> r.correlation, r.i_L_uA_per_cm2 > 500
    ('pipe-turbulent', True)
    """
    ox = dissolved_oxygen(temp_C, salinity, chloride_mg_per_L, o2_mg_L)
    geo = geometry_id(geometry)
    v = check("velocity_m_s", velocity_m_s)
    d = Derivation()  # it starts with the oxygen's steps, warnings and sources
    d.steps.extend(ox.steps), d.warnings.extend(ox.warnings), d.sources.extend(ox.sources)
    size = _size(d, geo, diameter_m, length_m)
    layer = STILL_LAYER_M if still_layer_m is None else check("still_layer_m", still_layer_m)
    t, s = ox.temp_C, ox.salinity
    mu, nu, D, sc = _properties(d, t, s, ox.density_kg_m3)
    re = sh = None
    corr, delta = "still-layer", layer
    basis = "given" if still_layer_m is not None else "common practice"
    layer_words = f"δ = {fmt(layer * 1e3, 4)} mm in still water ({basis})"
    if geo == "still":
        if v > 0:
            d.warn("velocity_m_s", "the velocity was not used: the still geometry has no flow; give pipe or surface")
        d.step("Diffusion layer in still water", "δ = δ_still (stated)", layer_words, f"δ = {fmt(layer, 4)} m")
    elif v == 0:
        d.step("Diffusion layer without flow", "δ = δ_still (stated)", layer_words, f"δ = {fmt(layer, 4)} m")
    else:
        re = reynolds_number(v, size, nu)
        corr = _correlation(geo, re)
        func, _, _, words = CORRELATIONS[corr]
        sh = func(re, sc)
        L = "d" if geo == "pipe" else "L"
        d.step("Reynolds number", f"Re = v·{L}/ν", f"Re = {fmt(v)} m/s × {fmt(size)} m / {fmt(nu, 5)} m²/s",
               f"Re = {fmt(re, 5)}")
        d.step(f"Sherwood number ({words})", "Sh = f(Re, Sc)", f"Re = {fmt(re, 5)}, Sc = {fmt(sc, 5)}",
               f"Sh = {fmt(sh, 5)}")
        for msg in validity_warnings(corr, re, sc):
            d.warn("velocity_m_s", msg)
        forced = diffusion_layer_m(size, sh)
        if forced < layer:
            delta = forced
            d.step("Diffusion layer", f"δ = {L}/Sh", f"δ = {fmt(size)} m / {fmt(sh, 5)}",
                   f"δ = {fmt(forced * 1e3, 4)} mm")
        else:
            corr = "still-layer"
            d.step("Diffusion layer: the flow is too slow to thin it", f"δ = min({L}/Sh, δ_still)",
                   f"{L}/Sh = {fmt(forced * 1e3, 4)} mm; {layer_words}", f"δ = {fmt(layer * 1e3, 4)} mm")
        d.cite("berger-hau-1977" if geo == "pipe" else "incropera-2007")
    if corr == "still-layer" and still_layer_m is None:
        d.cite("common-practice")
    i = limiting_current_density_A_m2(D, ox.o2_mol_m3, delta)
    d.step("Diffusion-limited O2 reduction current (an upper bound of the cathode's current)",
           f"i_L = n·F·D·C/δ, n = {N_O2} (O2 + 2 H2O + 4 e⁻ → 4 OH⁻)",
           f"i_L = {N_O2} × {fmt(FARADAY)} C/mol × {fmt(D, 5)} m²/s × {fmt(ox.o2_mol_m3, 4)} mol/m³ "
           f"/ {fmt(delta, 4)} m",
           f"i_L = {fmt(i, 4)} A/m² = {fmt(i * 100.0, 4)} µA/cm²")
    d.cite("roberge-2008")
    return OxygenLimitingCurrent(
        t, s, geo, v, size if geo == "pipe" else None, size if geo == "surface" else None, ox.o2_mg_L,
        ox.o2_mol_m3, ox.saturation_mg_L, ox.o2_given, ox.density_kg_m3, mu, nu, D, sc, re, sh, corr, delta,
        i, i * 100.0, tuple(d.steps), tuple(d.warnings), tuple(d.sources))

