"""Anode mass for a design life, and the life of a given mass.

Offshore form (DNV-RP-B401): the net mass that delivers the mean current over the design life,
M = I_m·t_f·8760/(u·ε), with ε the alloy's electrochemical capacity and u the utilisation factor of
the anode type. Handbook form (MIL-HDBK-1004/10): W = Y·S·I/E with S the consumption rate and E
the current efficiency, and its rearrangement Y = W·E/(S·I) for the life.
"""

import math

from .units import HOURS_PER_YEAR


def net_mass(mean_current, life, utilisation, capacity):
    """Net anode mass for the mean current over the design life, M = I_m·t_f·8760/(u·ε).

    Args:
        mean_current: mean current demand I_m [A]
        life: design life t_f [years]
        utilisation: utilisation factor u of the anode type [unitless]
        capacity: electrochemical capacity ε of the alloy [A·h/kg]

    Returns:
        net anode mass [kg]

    References:
        DNV-RP-B401, net anode mass equation, as restated by El-Reedy, Offshore Structures (2012), ch. 6.

    >>> round(net_mass(50.0, 25, 0.90, 2000), 1)
    6083.3
    """
    return mean_current * life * HOURS_PER_YEAR / (utilisation * capacity)


def handbook_mass(life, consumption, current, efficiency=1.0):
    """Mass of anode material for a life, W = Y·S·I/E.

    Args:
        life: design life Y [years]
        consumption: consumption rate S of the material [kg/(A·yr)]
        current: the current the anodes deliver I [A]
        efficiency: current efficiency E (1 where S already includes it) [unitless]

    Returns:
        mass W [kg] (in the handbook's units, lb when S is in lb/(A·yr))

    References:
        MIL-HDBK-1004/10 (1990), the anode weight equation W = YSI/E of its worked examples.

    >>> round(handbook_mass(15, 8.8, 0.858, 0.50), 1)  # S in lb/(A·yr) gives lb: the handbook's 227 lb
    226.5
    """
    return life * consumption * current / efficiency


def handbook_life(mass, consumption, current, efficiency=1.0):
    """Life of a mass of anode material, Y = W·E/(S·I).

    Args:
        mass: anode mass W [kg]
        consumption: consumption rate S [kg/(A·yr)]
        current: the current delivered I [A]
        efficiency: current efficiency E (1 where S already includes it) [unitless]

    Returns:
        life [years]

    References:
        MIL-HDBK-1004/10 (1990), the rearranged weight equation Y = WE/SI of its groundbed example.

    >>> round(handbook_life(226.5, 8.8, 0.858, 0.50), 2)
    15.0
    """
    return mass * efficiency / (consumption * current)


def count_for(total, each):
    """The whole number of items that reach a total, N = ⌈total/each⌉ (a tiny excess is forgiven).

    Args:
        total: what is needed (mass, current) [any unit]
        each: what one item gives [same unit]

    Returns:
        N [unitless]

    References:
        Common practice (round the number of anodes up).

    >>> count_for(6083.3, 300.0), count_for(3.0, 1.0)
    (21, 3)
    """
    ratio = total / each
    return max(1, math.ceil(ratio - 1e-9))
