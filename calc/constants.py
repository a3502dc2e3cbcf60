"""Physical constants, CODATA 2018 (exact SI values where the SI defines them).

References: E. Tiesinga, P. J. Mohr, D. B. Newell, B. N. Taylor, "CODATA recommended values of
the fundamental physical constants: 2018", Rev. Mod. Phys. 93, 025010 (2021).
"""

import math

#: Elementary charge [C] (exact)
E_CHARGE = 1.602176634e-19
#: Avogadro constant [1/mol] (exact)
N_A = 6.02214076e23
#: Boltzmann constant [J/K] (exact)
K_B = 1.380649e-23
#: Faraday constant F = N_A·e [C/mol] (exact)
FARADAY = N_A * E_CHARGE
#: Molar gas constant R = N_A·k [J/(mol·K)] (exact)
R_GAS = N_A * K_B
#: Vacuum electric permittivity [F/m] (CODATA 2018)
EPSILON_0 = 8.8541878128e-12
#: 0 °C [K]
T_ZERO_C = 273.15
#: Standard temperature [K]
T_STANDARD = 298.15
LN10 = math.log(10.0)


def nernst_slope(temp_K):
    """The Nernst slope ln(10)·RT/F at a temperature.

    Args:
        temp_K: absolute temperature [K]

    Returns:
        slope [V per decade]

    References:
        Nernst equation, E = E° − (ln10·RT/nF)·log10 Q (IUPAC Green Book, 3rd ed. 2007, §2.13); R and F from CODATA 2018.

    >>> round(nernst_slope(298.15), 8)
    0.05915935
    """
    return LN10 * R_GAS * temp_K / FARADAY
