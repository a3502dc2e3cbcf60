"""Seawater-type water from its salinity: chloride, ionic strength, chloride activity.

What the Ag/AgCl/seawater electrode needs in brackish water: it responds to chloride (Nernst),
so a reading taken with it in water less salty than seawater is shifted by
(ln10·RT/F)·log10(a_Cl,sw / a_Cl). Chloride from salinity through chlorinity (S = 1.80655·Cl,
the Knudsen relation as kept in PSS-78), ionic strength I = 19.924·S/(1000 − 1.005·S) (Dickson &
Goyet 1994), single-ion activity coefficients by Davies; reference seawater S = 35.
EN 12473:2014 Annex C gives a correction graph, which was not consulted.
"""

import math

from .. import constants, water
from ..activity import log10_gamma
from ..bounds import BOUNDS
from ..elements import ATOMIC_WEIGHTS

#: salinity of the seawater the Ag/AgCl/seawater electrode value refers to [g/kg]
SALINITY_REF = 35.0
#: Knudsen relation S = 1.80655·Cl (chlorinity in g/kg), kept in PSS-78 [unitless]
SALINITY_PER_CHLORINITY = 1.80655
#: salinity and chloride accepted [g/kg], [mg/L]
SALINITY_MAX = BOUNDS["salinity"].high
CHLORIDE_MAX_MG_PER_L = BOUNDS["chloride_mg_per_L"].high
#: below this salinity the Ag/AgCl/seawater electrode is unreliable and PSS-78 does not apply [g/kg]
SALINITY_LOW = 2.0


def salinity_from_chloride(chloride_mg_per_L):
    """Salinity of seawater-type water from its chloride content, taking 1 L of water as 1 kg.

    Args:
        chloride_mg_per_L: chloride (chlorinity) of the water [mg/L]

    Returns:
        S [g/kg]

    References:
        Knudsen relation S = 1.80655·Cl as kept in PSS-78 (UNESCO 1981, from memory).

    >>> round(salinity_from_chloride(19374.0), 3)
    35.0
    """
    return SALINITY_PER_CHLORINITY * chloride_mg_per_L / 1000.0


def chloride_molality(salinity):
    """Chloride molality of seawater-type water from its salinity, through chlorinity.

    Args:
        salinity: salinity (practical salinity, about g/kg) [g/kg]

    Returns:
        m(Cl−) [mol/kg of water]

    References:
        Knudsen relation S = 1.80655·Cl as kept in PSS-78 (UNESCO 1981, from memory); molar mass
        of Cl 35.453 g/mol (IUPAC, :data:`calc.elements.ATOMIC_WEIGHTS`). Bromide is counted as
        chloride (chlorinity convention).

    >>> round(chloride_molality(35.0), 4)
    0.5663
    """
    cl_g_per_kg = salinity / SALINITY_PER_CHLORINITY
    return cl_g_per_kg / ATOMIC_WEIGHTS["Cl"] / (1.0 - salinity / 1000.0)


def seawater_ionic_strength(salinity):
    """Ionic strength of seawater-type water from its salinity.

    Args:
        salinity: salinity [g/kg]

    Returns:
        I [mol/kg]

    References:
        A. G. Dickson and C. Goyet (eds.), DOE Handbook of Methods for the Analysis of the Various
        Parameters of the Carbon Dioxide System in Sea Water, 1994, ch. 5: I = 19.924·S/(1000 − 1.005·S).

    >>> round(seawater_ionic_strength(35.0), 4)
    0.7228
    """
    return 19.924 * salinity / (1000.0 - 1.005 * salinity)


def chloride_activity(salinity, temp_C=25.0):
    """Activity of chloride in seawater-type water: m·γ with γ by Davies.

    Args:
        salinity: salinity [g/kg]
        temp_C: temperature [°C]

    Returns:
        a(Cl−) [unitless]

    References:
        :func:`chloride_molality`, :func:`seawater_ionic_strength`; C. W. Davies, Ion Association
        (1962), with A(T) of :func:`calc.water.debye_huckel_A`. Seawater's ionic strength lies above
        the Davies range (0.5 mol/kg): the activity is an estimate.

    >>> 0.40 < chloride_activity(35.0, 25.0) < 0.45
    True
    """
    lg = log10_gamma(-1, seawater_ionic_strength(salinity), "davies", water.debye_huckel_A(temp_C))
    return chloride_molality(salinity) * 10.0 ** lg


def brackish_shift(salinity, temp_C=25.0):
    """How far an Ag/AgCl/seawater electrode reads from its seawater value in brackish water.

    The electrode sits at E(seawater) + shift; add the shift to a reading taken with it to refer
    the reading to the electrode in seawater (salinity 35).

    Args:
        salinity: salinity of the water the electrode is in [g/kg]
        temp_C: temperature [°C]

    Returns:
        shift [V], positive in water less salty than seawater

    References:
        Nernst equation of AgCl + e− → Ag + Cl−: E = E° − (ln10·RT/F)·log10 a(Cl−) (e.g. Bard &
        Faulkner, Electrochemical Methods, 2nd ed., 2001, ch. 2, from memory); activities by
        :func:`chloride_activity`. An estimate, not the EN 12473:2014 Annex C graph.

    >>> brackish_shift(35.0)
    0.0
    >>> 0.030 < brackish_shift(10.0) < 0.034
    True
    """
    if abs(salinity - SALINITY_REF) < 1e-12:
        return 0.0
    slope = constants.nernst_slope(temp_C + constants.T_ZERO_C)
    return slope * math.log10(chloride_activity(SALINITY_REF, temp_C) / chloride_activity(salinity, temp_C))
