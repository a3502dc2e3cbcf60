"""Liquid water at atmospheric pressure, 0–100 °C: density, dielectric constant, ion product,
and the Debye–Hückel parameters A and B computed from them.

Methods:

- density: G. S. Kell, "Density, thermal expansivity, and compressibility of liquid water from
  0 °C to 150 °C", J. Chem. Eng. Data 20 (1975) 97: the rational function for air-free water at
  101.325 kPa (IPTS-68), as reproduced in F. E. Jones and G. L. Harris, J. Res. NIST 97 (1992)
  335, eq. (1). That reprint's text shows 16.897850e-3 in the denominator; 16.879850e-3 is the
  value that reproduces IAPWS-95 at 0.101325 MPa (within 0.02 kg/m³ over 0–100 °C, see
  tests/test_water.py), so it is used here.
- relative permittivity: C. G. Malmberg and A. A. Maryott, "Dielectric constant of water from
  0 °C to 100 °C", J. Res. Natl. Bur. Stand. 56 (1956) 1, the fitted cubic in t; within 0.2 (0.35 %) of the
  IAPWS R8-97 formulation (Fernández et al. 1997) over 0–100 °C.
- ion product: A. V. Bandura and S. N. Lvov, "The ionization constant of water over wide ranges
  of temperature and density", J. Phys. Chem. Ref. Data 35 (2006) 15 (the IAPWS R11-07
  formulation; coefficients from memory, confirmed by two R11-07 check values: 13.906565 at
  300 K, 1 g/cm³ and 21.048874 at 600 K, 0.07 g/cm³), evaluated at the Kell density. The iapws
  1.5.5 package codes another coefficient set (it returns 13.906672 at 300 K, 1 g/cm³); over
  0–100 °C at 1 atm the two agree within 0.002 (tests/test_water.py).
- Debye–Hückel: P. Debye and E. Hückel, Phys. Z. 24 (1923) 185; the molal forms of A and B as
  in R. A. Robinson and R. H. Stokes, *Electrolyte Solutions*, 2nd ed. (1959), ch. 9, whose
  Appendix 7.1 tabulates them (A = 0.5115, B = 0.3291 per Å at 25 °C, from memory), with CODATA
  2018 constants (:mod:`calc.constants`). The small difference comes from the older dielectric
  constant used there.
"""

import math

from . import constants
from .derivation import check_temperature

#: molar mass of water used by Bandura & Lvov (2006) [g/mol]
M_WATER_G_MOL = 18.015268


def density_kg_m3(temp_C):
    """Density of air-free liquid water at 1 atm.

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        density [kg/m³]

    References:
        G. S. Kell, J. Chem. Eng. Data 20 (1975) 97: the rational function of t (IPTS-68) for
        0–150 °C at 101.325 kPa, as reproduced in Jones & Harris, J. Res. NIST 97 (1992) 335, eq. (1).

    >>> round(density_kg_m3(25), 3)
    997.045
    >>> round(density_kg_m3(4), 2)
    999.97
    """
    t = check_temperature(temp_C)
    num = (999.83952 + 16.945176 * t - 7.9870401e-3 * t ** 2 - 46.170461e-6 * t ** 3
           + 105.56302e-9 * t ** 4 - 280.54253e-12 * t ** 5)
    return num / (1.0 + 16.879850e-3 * t)


def permittivity(temp_C):
    """Relative permittivity (static dielectric constant) of liquid water at 1 atm.

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        relative permittivity εr [unitless]

    References:
        C. G. Malmberg and A. A. Maryott, J. Res. NBS 56 (1956) 1, the paper's fitted cubic:
        εr = 87.740 − 0.40008 t + 9.398e-4 t² − 1.410e-6 t³ (0–100 °C).

    >>> round(permittivity(25), 2)
    78.3
    """
    t = check_temperature(temp_C)
    return 87.740 - 0.40008 * t + 9.398e-4 * t ** 2 - 1.410e-6 * t ** 3


def bjerrum_length_m(temp_C):
    """Bjerrum length of water: the distance at which two unit charges interact with energy kT.

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        λB = e² / (4π ε0 εr k T) [m]

    References:
        N. Bjerrum, Kgl. Danske Vid. Selsk. Math.-fys. Medd. 7 (1926) no. 9; εr from Malmberg &
        Maryott (1956); e, ε0, k from CODATA 2018.

    >>> round(bjerrum_length_m(25) * 1e10, 3)
    7.158
    """
    t = check_temperature(temp_C)
    temp_K = t + constants.T_ZERO_C
    return constants.E_CHARGE ** 2 / (4 * math.pi * constants.EPSILON_0 * permittivity(t)
                                      * constants.K_B * temp_K)


def debye_huckel_A(temp_C):
    """Debye–Hückel A on the log10, molal basis: log10 γ = −A z² √I in the limiting law.

    A = (1/ln 10) · √(2π N_A ρw) · λB^(3/2), with ρw the density of water and λB the Bjerrum length.

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        A [kg^1/2 mol^-1/2]

    References:
        P. Debye and E. Hückel, Phys. Z. 24 (1923) 185; molal form as in R. A. Robinson and
        R. H. Stokes, Electrolyte Solutions, 2nd ed. (1959), ch. 9 and Appendix 7.1;
        ρw from Kell (1975), εr from Malmberg & Maryott (1956); CODATA 2018.

    >>> round(debye_huckel_A(25), 4)
    0.5108
    """
    t = check_temperature(temp_C)
    lb = bjerrum_length_m(t)
    return math.sqrt(2 * math.pi * constants.N_A * density_kg_m3(t)) * lb ** 1.5 / constants.LN10


def debye_huckel_B(temp_C):
    """Debye–Hückel B of the extended law, per ångström of ion size: log10 γ = −A z² √I / (1 + B å √I).

    B = √(8π N_A ρw λB) (the Debye screening parameter κ per √I), converted from 1/m to 1/Å.

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        B [kg^1/2 mol^-1/2 Å^-1]

    References:
        P. Debye and E. Hückel, Phys. Z. 24 (1923) 185; molal form as in Robinson & Stokes
        (1959), ch. 9 and Appendix 7.1; ρw from Kell (1975), εr from Malmberg & Maryott (1956).

    >>> round(debye_huckel_B(25), 4)
    0.3287
    """
    t = check_temperature(temp_C)
    kappa_per_sqrt_I = math.sqrt(8 * math.pi * constants.N_A * density_kg_m3(t) * bjerrum_length_m(t))
    return kappa_per_sqrt_I * 1e-10


def pKw(temp_C):
    """Ion product of water, pKw = −log10(a(H+)·a(OH−)/a(H2O)), at 1 atm.

    Evaluated with the Bandura–Lvov formulation at the density of liquid water at 1 atm (Kell 1975).

    Args:
        temp_C: temperature, 0 to 100 [°C]

    Returns:
        pKw [unitless]

    References:
        A. V. Bandura and S. N. Lvov, J. Phys. Chem. Ref. Data 35 (2006) 15, the pKw equation
        with its fitted constants (adopted as IAPWS R11-07, 2007; from memory): n = 6, α0 = −0.864671, α1 = 8659.19 K, α2 = −22786.2 K²,
        β0 = 0.642044, β1 = −56.8534 K, β2 = −0.375754; pKw(G) of the ideal-gas reaction as given
        there. Published check values: 13.995 at 25 °C, 0.1 MPa; 13.906565 at 300 K and 1 g/cm³.

    >>> round(pKw(25), 3)
    13.995
    >>> round(pKw(0), 2), round(pKw(100), 2)
    (14.95, 12.25)
    """
    t = check_temperature(temp_C)
    return pKw_bandura_lvov(t + constants.T_ZERO_C, density_kg_m3(t) / 1000.0)


def pKw_bandura_lvov(temp_K, density_g_cm3):
    """The Bandura–Lvov (IAPWS R11-07) formulation of pKw at a temperature and water density.

    Args:
        temp_K: absolute temperature [K]
        density_g_cm3: density of water [g/cm³]

    Returns:
        pKw [unitless]

    References:
        A. V. Bandura and S. N. Lvov, J. Phys. Chem. Ref. Data 35 (2006) 15; IAPWS R11-07 (2007),
        "Revised Release on the Ionization Constant of H2O", check values 13.906565 at 300 K,
        1 g/cm³ and 21.048874 at 600 K, 0.07 g/cm³ (from memory; both reproduced to 1e-6).

    >>> round(pKw_bandura_lvov(300.0, 1.0), 6)
    13.906565
    """
    T, rho = temp_K, density_g_cm3
    n, a0, a1, a2 = 6, -0.864671, 8659.19, -22786.2
    b0, b1, b2 = 0.642044, -56.8534, -0.375754
    z = rho * math.exp(a0 + a1 / T + a2 / T ** 2 * rho ** (2.0 / 3.0))
    pkw_gas = 0.61415 + 48251.33 / T - 67707.93 / T ** 2 + 10102100.0 / T ** 3
    return (-2 * n * (math.log10(1 + z) - z / (z + 1) * rho * (b0 + b1 / T + b2 * rho))
            + pkw_gas + 2 * math.log10(M_WATER_G_MOL / 1000.0))
