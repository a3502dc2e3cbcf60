"""Oxygen supply to a surface: viscosity, O2 diffusivity, Sherwood correlations, limiting current.

Methods (each function names its source; ranges marked "from memory" await a re-check):

- viscosity: M. H. Sharqawy, J. H. Lienhard V, S. M. Zubair, Desalination and Water Treatment 16
  (2010) 354: pure water eq. (23) (a fit to the IAPWS 2008 formulation), seawater eq. (22),
  0–180 °C and 0–150 g/kg, ±1.5 %; kinematic viscosity ν = μ/ρ with ρ of
  :func:`calc.oxygen.seawater_density_kg_m3`.
- O2 diffusivity in water: P. Han and D. M. Bartels, "Temperature dependence of oxygen diffusion
  in H2O and D2O", J. Phys. Chem. 100 (1996) 5597, the interpolation formula of the abstract
  (measured −0.5 to 95 °C); in seawater scaled by the viscosity ratio (Stokes–Einstein, D·μ
  constant at one temperature, the correction of Y.-H. Li and S. Gregory, Geochim. Cosmochim.
  Acta 38 (1974) 703, from memory).
- mass transfer (Sherwood number Sh = k·L/D; diffusion layer δ = L/Sh):
  pipe, turbulent: D. J. Berger and K.-F. Hau, Int. J. Heat Mass Transfer 20 (1977) 1185,
  Sh = 0.0165·Re^0.86·Sc^0.33 (range Re 1e4–2e5, Sc 1000–6000, from memory);
  pipe, laminar and fully developed: Sh = 3.66 (constant wall concentration);
  open surface in parallel flow, averaged over its length L: laminar Sh = 0.664·Re^0.5·Sc^(1/3)
  (Re_L < 5e5), turbulent from the leading edge Sh = 0.037·Re^0.8·Sc^(1/3) (5e5–1e8); both from
  F. P. Incropera, D. P. DeWitt, T. L. Bergman, A. S. Lavine, Fundamentals of Heat and Mass
  Transfer, 6th ed., Wiley 2007, §7.2 and §8.4 by the heat–mass analogy (equation numbers and
  the Sc range 0.6–3000 of the analogy from memory). Above Re_L = 5e5 the whole surface is taken
  turbulent (a rough, fouled or disturbed surface trips early; this gives the larger current).
  still water: a stated diffusion layer, :data:`STILL_LAYER_M`, also the thickest layer used with
  flow (natural convection never leaves a thicker one).
- limiting current: i_L = n·F·D·C/δ, n = 4 (O2 + 2 H2O + 4 e⁻ → 4 OH⁻): P. R. Roberge, Corrosion
  Engineering: Principles and Practice, McGraw-Hill 2008, §5.3, Eq. (5.14).
"""

from .constants import FARADAY
from .derivation import fmt

#: electrons per O2 reduced [unitless]
N_O2 = 4
#: Sharqawy et al. (2010) eq. (23) μ_w = c4 + 1/(c1·(t + c2)² + c3) [kg/(m·s)]
SHARQAWY_MU_W = (0.157, 64.993, -91.296, 4.2844e-5)
#: eq. (22) A = a1 + a2·t + a3·t², B = b1 + b2·t + b3·t² (S in kg/kg) [unitless]
SHARQAWY_MU_A = (1.541, 1.998e-2, -9.52e-5)
SHARQAWY_MU_B = (7.974, -7.561e-2, 4.724e-4)
#: reference-composition salinity per practical salinity (Millero et al. 2008) [unitless]
SR_PER_SP = 35.16504 / 35.0
#: Han & Bartels (1996) log10(D/cm² s⁻¹) = h0 + h1/T − (h2/T)² [unitless, K, K]
HAN_BARTELS = (-4.410, 773.8, 506.4)
HAN_BARTELS_RANGE_C = (-0.5, 95.0)
#: diffusion layer at a surface in still water [m]: 1 mm, a choice of this project (common
#: practice): 1–2 mm reproduces the 5–20 µA/cm² cathodic current of still aerated seawater and
#: steel's 0.1–0.2 mm/y there (both recalled, data/environments.yaml, laque-1975); unstirred
#: laboratory cells are often quoted nearer 0.5 mm (from memory). Natural convection driven by
#: O2 depletion alone is too weak for a usable correlation (a relative density change of order
#: 1e-7, taking O2's partial molar volume as about 32 cm³/mol, from memory); in still water the
#: layer is set by stray motion and small temperature differences.
STILL_LAYER_M = 1.0e-3
#: laminar–turbulent transition: pipe (Re_D) and flat plate (Re_L) [unitless]
RE_PIPE_LAMINAR_MAX = 2300.0
RE_PLATE_LAMINAR_MAX = 5.0e5


def water_viscosity_Pa_s(temp_C):
    """Dynamic viscosity of pure water at 0.1 MPa (Sharqawy et al. 2010, eq. 23).

    Args:
        temp_C: temperature [°C]

    Returns:
        μ_w [Pa·s]

    References:
        M. H. Sharqawy, J. H. Lienhard V, S. M. Zubair, Desalination and Water Treatment 16
        (2010) 354, eq. (23): μ_w = 4.2844e-5 + 1/(0.157·(t + 64.993)² − 91.296), a fit to IAPWS 2008.

    >>> round(water_viscosity_Pa_s(20.0) * 1e3, 4)
    1.0018
    """
    c1, c2, c3, c4 = SHARQAWY_MU_W
    return c4 + 1.0 / (c1 * (temp_C + c2) ** 2 + c3)


def seawater_viscosity_Pa_s(temp_C, salinity):
    """Dynamic viscosity of seawater at 0.1 MPa (Sharqawy et al. 2010, eq. 22).

    Args:
        temp_C: temperature [°C]
        salinity: practical salinity [g/kg]

    Returns:
        μ_sw [Pa·s]

    References:
        Sharqawy et al. (2010) eq. (22): μ_sw = μ_w·(1 + A·s + B·s²), s = S_R/1000 kg/kg,
        A = 1.541 + 1.998e-2·t − 9.52e-5·t², B = 7.974 − 7.561e-2·t + 4.724e-4·t².

    >>> round(seawater_viscosity_Pa_s(25.0, 35.0) * 1e3, 4)
    0.9592
    """
    t, s = temp_C, salinity * SR_PER_SP / 1000.0
    a1, a2, a3 = SHARQAWY_MU_A
    b1, b2, b3 = SHARQAWY_MU_B
    return water_viscosity_Pa_s(t) * (1.0 + (a1 + a2 * t + a3 * t ** 2) * s + (b1 + b2 * t + b3 * t ** 2) * s ** 2)


def o2_diffusivity_water_m2_s(temp_C):
    """Diffusion coefficient of O2 in pure water (Han & Bartels 1996).

    Args:
        temp_C: temperature [°C]

    Returns:
        D [m²/s]

    References:
        P. Han and D. M. Bartels, J. Phys. Chem. 100 (1996) 5597, abstract:
        log10(D/cm² s⁻¹) = −4.410 + 773.8/T − (506.4/T)², T in K, measured −0.5 to 95 °C.

    >>> round(o2_diffusivity_water_m2_s(25.0) * 1e9, 3)
    1.998
    """
    h0, h1, h2 = HAN_BARTELS
    T = temp_C + 273.15
    return 10.0 ** (h0 + h1 / T - (h2 / T) ** 2) * 1e-4


def o2_diffusivity_m2_s(temp_C, salinity):
    """Diffusion coefficient of O2 in seawater: the water value scaled by the viscosity ratio.

    Args:
        temp_C: temperature [°C]
        salinity: practical salinity, 0 for fresh water [g/kg]

    Returns:
        D [m²/s]

    References:
        D_sw = D_w·μ_w/μ_sw (Stokes–Einstein at one temperature; as Li & Gregory, Geochim.
        Cosmochim. Acta 38 (1974) 703, correct diffusivities to seawater, from memory), with
        :func:`o2_diffusivity_water_m2_s` and :func:`seawater_viscosity_Pa_s`.

    >>> round(o2_diffusivity_m2_s(25.0, 35.0) * 1e9, 3)
    1.854
    """
    return o2_diffusivity_water_m2_s(temp_C) * water_viscosity_Pa_s(temp_C) / seawater_viscosity_Pa_s(temp_C, salinity)


def schmidt_number(kinematic_viscosity_m2_s, diffusivity_m2_s):
    """Schmidt number Sc = ν/D.

    Args:
        kinematic_viscosity_m2_s: kinematic viscosity ν [m²/s]
        diffusivity_m2_s: diffusion coefficient D [m²/s]

    Returns:
        Sc [unitless]

    References:
        Definition (e.g. Incropera et al., Fundamentals of Heat and Mass Transfer, 6th ed., 2007, §6.5).

    >>> round(schmidt_number(1.0e-6, 2.0e-9), 6)
    500.0
    """
    return kinematic_viscosity_m2_s / diffusivity_m2_s


def reynolds_number(velocity_m_s, length_m, kinematic_viscosity_m2_s):
    """Reynolds number Re = v·L/ν.

    Args:
        velocity_m_s: mean flow velocity (pipe) or free-stream velocity (surface) [m/s]
        length_m: pipe diameter or surface length in the flow direction [m]
        kinematic_viscosity_m2_s: kinematic viscosity ν [m²/s]

    Returns:
        Re [unitless]

    References:
        Definition (e.g. Incropera et al. 2007, §6.3).

    >>> round(reynolds_number(2.0, 0.1, 1.0e-6))
    200000
    """
    return velocity_m_s * length_m / kinematic_viscosity_m2_s


def sherwood_pipe_turbulent(re, sc):
    """Wall mass transfer in turbulent pipe flow (Berger & Hau 1977).

    Args:
        re: Reynolds number on the diameter [unitless]
        sc: Schmidt number [unitless]

    Returns:
        Sh = k·d/D [unitless]

    References:
        D. J. Berger and K.-F. Hau, Int. J. Heat Mass Transfer 20 (1977) 1185:
        Sh = 0.0165·Re^0.86·Sc^0.33 (Re 1e4–2e5, Sc 1000–6000, from memory).

    >>> round(sherwood_pipe_turbulent(1.0e5, 1000.0), 1)
    3217.2
    """
    return 0.0165 * re ** 0.86 * sc ** 0.33


def sherwood_pipe_laminar(re, sc):
    """Wall mass transfer in fully developed laminar pipe flow at constant wall concentration.

    Args:
        re: Reynolds number on the diameter, below 2300 [unitless]
        sc: Schmidt number [unitless]

    Returns:
        Sh = 3.66 [unitless] (a shorter pipe's entrance length gives more)

    References:
        Incropera et al. (2007) §8.4, Nu_D = 3.66 for uniform wall temperature, and by the
        heat–mass analogy Sh_D = 3.66 (equation number from memory: 8.55).

    >>> sherwood_pipe_laminar(1000.0, 500.0)
    3.66
    """
    return 3.66


def sherwood_plate_laminar(re, sc):
    """Mass transfer averaged over a flat surface of length L in laminar parallel flow.

    Args:
        re: Reynolds number on the length L [unitless]
        sc: Schmidt number [unitless]

    Returns:
        Sh_L = k·L/D [unitless]

    References:
        Incropera et al. (2007) §7.2, Nu_L = 0.664·Re^(1/2)·Pr^(1/3), Re_L < 5e5, Pr ≥ 0.6, and its
        mass-transfer form Sh_L = 0.664·Re^(1/2)·Sc^(1/3) (equation numbers from memory: 7.30, 7.32).

    >>> round(sherwood_plate_laminar(1.0e5, 1000.0), 1)
    2099.8
    """
    return 0.664 * re ** 0.5 * sc ** (1.0 / 3.0)


def sherwood_plate_turbulent(re, sc):
    """Mass transfer averaged over a flat surface turbulent from its leading edge.

    Args:
        re: Reynolds number on the length L [unitless]
        sc: Schmidt number [unitless]

    Returns:
        Sh_L [unitless]

    References:
        Incropera et al. (2007) §7.2, Nu_L = 0.037·Re^(4/5)·Pr^(1/3) for a boundary layer turbulent
        over the whole plate (Re_L 5e5–1e8), by the analogy Sh_L = 0.037·Re^0.8·Sc^(1/3)
        (equation number from memory: 7.38 with the laminar part dropped).

    >>> round(sherwood_plate_turbulent(1.0e6, 1000.0), 0)
    23345.0
    """
    return 0.037 * re ** 0.8 * sc ** (1.0 / 3.0)


#: correlation -> (function, (Re low, high), (Sc low, high), words); None: no bound that side
CORRELATIONS = {
    "pipe-turbulent": (sherwood_pipe_turbulent, (1.0e4, 2.0e5), (1.0e3, 6.0e3),
                       "Berger & Hau 1977, Sh = 0.0165·Re^0.86·Sc^0.33"),
    "pipe-laminar": (sherwood_pipe_laminar, (None, RE_PIPE_LAMINAR_MAX), (None, None),
                     "fully developed laminar pipe flow, Sh = 3.66"),
    "plate-laminar": (sherwood_plate_laminar, (None, RE_PLATE_LAMINAR_MAX), (0.6, 3.0e3),
                      "laminar flat plate, Sh = 0.664·Re^0.5·Sc^(1/3)"),
    "plate-turbulent": (sherwood_plate_turbulent, (RE_PLATE_LAMINAR_MAX, 1.0e8), (0.6, 3.0e3),
                        "turbulent flat plate, Sh = 0.037·Re^0.8·Sc^(1/3)"),
}


def validity_warnings(correlation, re, sc):
    """What is outside the range a Sherwood correlation was fitted or derived for.

    Args:
        correlation: a key of :data:`CORRELATIONS` [unitless]
        re: Reynolds number [unitless]
        sc: Schmidt number [unitless]

    Returns:
        a list of plain-word messages, empty inside the range

    References:
        The ranges of :data:`CORRELATIONS` (see each correlation's function).

    >>> validity_warnings("pipe-turbulent", 5.0e4, 500.0)  # doctest: +ELLIPSIS
    ['Sc = 500 is outside 1000–6000 of Berger & Hau 1977...']
    """
    _, re_range, sc_range, words = CORRELATIONS[correlation]
    out = []
    for name, value, (low, high) in (("Re", re, re_range), ("Sc", sc, sc_range)):
        if (low is not None and value < low) or (high is not None and value > high):
            span = f"{low or 0:g}–{high:g}" if high is not None else f"{low:g} and above"
            out.append(f"{name} = {fmt(value, 4)} is outside {span} of {words}: extrapolated")
    return out


def diffusion_layer_m(length_m, sherwood):
    """Thickness of the equivalent (Nernst) diffusion layer, δ = L/Sh.

    Args:
        length_m: the length the Sherwood number is based on (diameter or plate length) [m]
        sherwood: Sherwood number [unitless]

    Returns:
        δ [m]

    References:
        Sh = k·L/D with k = D/δ (film model; e.g. Roberge 2008, §5.3, Fig. 5.6).

    >>> diffusion_layer_m(0.1, 1000.0)
    0.0001
    """
    return length_m / sherwood


def limiting_current_density_A_m2(diffusivity_m2_s, concentration_mol_m3, delta_m, n=N_O2):
    """Diffusion-limited cathodic current density, i_L = n·F·D·C/δ.

    Args:
        diffusivity_m2_s: diffusion coefficient of the reacting species [m²/s]
        concentration_mol_m3: its bulk concentration [mol/m³]
        delta_m: diffusion-layer thickness [m]
        n: electrons per molecule reduced, 4 for O2 [unitless]

    Returns:
        i_L [A/m²] (1 A/m² = 100 µA/cm²)

    References:
        P. R. Roberge, Corrosion Engineering: Principles and Practice, McGraw-Hill 2008, §5.3,
        Eq. (5.14); F from CODATA 2018 (:data:`calc.constants.FARADAY`).

    >>> round(limiting_current_density_A_m2(2.0e-9, 0.25, 1.0e-3), 4)
    0.193
    """
    return n * FARADAY * diffusivity_m2_s * concentration_mol_m3 / delta_m
