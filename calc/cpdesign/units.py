"""Unit factors of the design methods: the handbooks print feet, pounds and ohm-centimetres.

The engine works in SI (metres, kilograms, ohm-metres); the published methods of the US handbooks
(MIL-HDBK-1004/10, USACE ETL 1110-9-10) write their constants for feet, square feet, pounds and
ohm-centimetres, so each model that keeps such a constant converts at its edge, with the factor
named here once.
"""

#: one foot, exactly [m] (international foot, 1959)
FT_M = 0.3048
#: one square foot [m²]
FT2_M2 = FT_M * FT_M
#: one pound (avoirdupois), exactly [kg] (international pound, 1959)
LB_KG = 0.45359237
#: ohm-centimetres in one ohm-metre [Ω·cm per Ω·m]
OHM_CM_PER_OHM_M = 100.0
#: hours in a design year as the offshore standards count it (DNV-RP-B401 net mass equation) [h]
HOURS_PER_YEAR = 8760.0


def ohm_cm(resistivity):
    """A resistivity in ohm-centimetres, the unit of the handbooks' constants.

    Args:
        resistivity: resistivity [Ω·m]

    Returns:
        the same resistivity [Ω·cm]

    References:
        Definition of the units (1 Ω·m = 100 Ω·cm).

    >>> ohm_cm(45.0)
    4500.0
    """
    return resistivity * OHM_CM_PER_OHM_M


def feet(length):
    """A length in feet, the unit of the handbooks' spacing and length terms.

    Args:
        length: length [m]

    Returns:
        the same length [ft]

    References:
        International foot of 1959 (1 ft = 0.3048 m exactly).

    >>> round(feet(6.096), 6)
    20.0
    """
    return length / FT_M
