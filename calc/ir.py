"""Solution resistance of a joint: the electrolyte's conductivity, the path between the two parts,
and the couple solved with the IR drop.

- Seawater conductivity from its practical salinity and temperature by the Practical Salinity
  Scale 1978 (PSS-78; UNESCO Technical Papers in Marine Science 37 (1981) and 44 (1983); E. L.
  Lewis and R. G. Perkin, Deep-Sea Res. 28A (1981) 1123), inverted for the conductivity ratio:
  :func:`pss78_salinity` is the scale's equation, :func:`seawater_conductivity_S_per_m` solves it.
  Coefficients from memory, checked in the tests against the TEOS-10 ``gsw.C_from_SP``.
- Fresh water: a stated conductivity at 25 °C, corrected to the service temperature by the linear
  2 %/K compensation of conductivity meters (:func:`fresh_water_conductivity_S_per_m`, common
  practice).
- The path: each part taken as a disk of its wetted area, flush in an insulating plane, whose
  primary-current resistance to far away is R = 1/(4·κ·r) (J. Newman, J. Electrochem. Soc. 113
  (1966) 501, from memory); the joint's path is the two in series (:func:`joint_resistance_ohm`).
  Next to the line of contact the path is shorter, so the attack there approaches the
  metallic-contact answer: the IR term shows how far from the joint the attack reaches, it does
  not make the joint safe.
- The couple with the drop (:func:`couple_with_ir`): E_cathode − E_anode = I·R, each part on its
  own polarization curve, solved by bisection on the current between 0 and the metallic-contact
  galvanic current.
"""

import math

#: PSS-78 coefficients a0..a5, b0..b5, k (UNESCO 1981, from memory) [unitless]
PSS78_A = (0.0080, -0.1692, 25.3851, 14.0941, -7.0261, 2.7081)
PSS78_B = (0.0005, -0.0056, -0.0066, -0.0375, 0.0636, -0.0144)
PSS78_K = 0.0162
#: r_t = C(35, t, 0)/C(35, 15, 0) polynomial c0..c4 in t68 (UNESCO 1981, from memory) [unitless]
PSS78_C = (0.6766097, 2.00564e-2, 1.104259e-4, -6.9698e-7, 1.0031e-9)
#: conductivity of standard seawater S = 35 at 15 °C and 0 dbar, 42.914 mS/cm [S/m]
C_35_15_S_PER_M = 4.2914
#: ITS-90 to IPTS-68 temperature factor (as in calc.oxygen) [unitless]
T68_PER_T90 = 1.00024
#: PSS-78 is defined for 2 ≤ S ≤ 42 and −2 to 35 °C [g/kg], [°C]
PSS78_S_RANGE = (2.0, 42.0)
PSS78_T_RANGE_C = (-2.0, 35.0)
#: linear temperature compensation of fresh-water conductivity, per kelvin from 25 °C (common practice)
FRESH_ALPHA_PER_K = 0.02


def pss78_salinity(ratio, temp_C):
    """Practical salinity from the conductivity ratio R_t = C(S, t, 0)/C(35, t, 0), PSS-78.

    Args:
        ratio: conductivity ratio R_t at the sample's temperature, 0 dbar [unitless]
        temp_C: temperature (ITS-90) [°C]

    Returns:
        S = Σ a_i·R_t^(i/2) + (t − 15)/(1 + k·(t − 15))·Σ b_i·R_t^(i/2) [g/kg, practical salinity]

    References:
        PSS-78, UNESCO Tech. Pap. Mar. Sci. 37 (1981) eq. for S(R_t, t) (from memory).

    >>> round(pss78_salinity(1.0, 15.0), 6)
    35.0
    """
    t = T68_PER_T90 * temp_C
    root = math.sqrt(ratio)
    powers = [root ** i for i in range(6)]
    delta = (t - 15.0) / (1.0 + PSS78_K * (t - 15.0)) * sum(b * p for b, p in zip(PSS78_B, powers))
    return sum(a * p for a, p in zip(PSS78_A, powers)) + delta


def pss78_rt(temp_C):
    """r_t = C(35, t, 0)/C(35, 15, 0), the temperature ratio of standard seawater.

    Args:
        temp_C: temperature (ITS-90) [°C]

    Returns:
        r_t [unitless]

    References:
        PSS-78, UNESCO Tech. Pap. Mar. Sci. 37 (1981), polynomial r_t(t) (from memory).

    >>> round(pss78_rt(15.0 / T68_PER_T90), 7)
    1.0
    """
    t = T68_PER_T90 * temp_C
    return sum(c * t ** i for i, c in enumerate(PSS78_C))


def seawater_conductivity_S_per_m(salinity, temp_C):
    """Conductivity of seawater at 0 dbar from its practical salinity and temperature (PSS-78 inverted).

    Args:
        salinity: practical salinity [g/kg]
        temp_C: temperature [°C]

    Returns:
        κ = R_t·r_t·C(35, 15, 0) [S/m], R_t found by bisection on :func:`pss78_salinity`

    References:
        PSS-78 (UNESCO 1981); C(35, 15, 0) = 42.914 mS/cm (from memory).

    >>> round(seawater_conductivity_S_per_m(35.0, 15.0 / T68_PER_T90), 6)
    4.2914
    """
    lo, hi = 0.0, 4.0
    for _ in range(80):  # S rises with R_t: halve the bracket until it is below a double's resolution
        mid = 0.5 * (lo + hi)
        if pss78_salinity(mid, temp_C) < salinity:
            lo = mid
        else:
            hi = mid
    return 0.5 * (lo + hi) * pss78_rt(temp_C) * C_35_15_S_PER_M


def fresh_water_conductivity_S_per_m(conductivity_25_S_per_m, temp_C):
    """Fresh-water conductivity at a temperature from its value at 25 °C, κ = κ25·(1 + α·(t − 25)).

    Args:
        conductivity_25_S_per_m: conductivity at 25 °C [S/m]
        temp_C: temperature [°C]

    Returns:
        κ [S/m], α = 0.02 per K

    References:
        Linear temperature compensation of conductivity meters, about 2 %/K for natural waters
        (common practice).

    >>> round(fresh_water_conductivity_S_per_m(0.04, 15.0), 4)
    0.032
    """
    return conductivity_25_S_per_m * (1.0 + FRESH_ALPHA_PER_K * (temp_C - 25.0))


def disk_resistance_ohm(conductivity_S_per_m, area_cm2):
    """Primary-current resistance of a disk electrode of a given area to far away, R = 1/(4·κ·r).

    Args:
        conductivity_S_per_m: electrolyte conductivity [S/m]
        area_cm2: the disk's area [cm²]

    Returns:
        R [Ω], with r = √(A/π)

    References:
        J. Newman, "Resistance for flow of current to a disk", J. Electrochem. Soc. 113 (1966) 501
        (from memory).

    >>> round(disk_resistance_ohm(4.0, 100.0 * math.pi), 4)
    0.625
    """
    radius_m = math.sqrt(area_cm2 * 1e-4 / math.pi)
    return 1.0 / (4.0 * conductivity_S_per_m * radius_m)


def joint_resistance_ohm(conductivity_S_per_m, anode_area_cm2, cathode_area_cm2):
    """Resistance of the electrolyte path of a joint: the two parts' disk resistances in series.

    Args:
        conductivity_S_per_m: electrolyte conductivity [S/m]
        anode_area_cm2: the anode's wetted area [cm²]
        cathode_area_cm2: the cathode's wetted area [cm²]

    Returns:
        R = 1/(4κ)·(1/r_a + 1/r_c) [Ω]

    References:
        :func:`disk_resistance_ohm` (Newman 1966, from memory); series addition of the two paths.

    >>> round(joint_resistance_ohm(4.0, 100.0 * math.pi, 100.0 * math.pi), 4)
    1.25
    """
    return disk_resistance_ohm(conductivity_S_per_m, anode_area_cm2) + disk_resistance_ohm(
        conductivity_S_per_m, cathode_area_cm2)


def _net_current_A(electrode, E):
    return electrode.area_cm2 * sum(r.current_density(E) for r in electrode.reactions)


def potential_at_current(electrode, current_A, low, high):
    """The potential at which an electrode carries a given net current, by bisection.

    Args:
        electrode: a :class:`calc.kinetics.Electrode` [unitless]
        current_A: the net current it carries, positive anodic [A]
        low: a potential at which its net current is at most current_A [V]
        high: a potential at which its net current is at least current_A [V]

    Returns:
        E [V]

    References:
        Bisection on the monotone net current of the electrode (its polarization curve).

    >>> from calc.kinetics import Electrode, Reaction
    >>> el = Electrode("x", 1.0, (Reaction("a", 0.0, 1e-6, 0.1, None, None),))
    >>> round(potential_at_current(el, 1e-5, -1.0, 1.0), 9)
    0.1
    """
    for _ in range(200):
        mid = 0.5 * (low + high)
        if mid <= low or mid >= high:
            break
        if _net_current_A(electrode, mid) < current_A:
            low = mid
        else:
            high = mid
    return 0.5 * (low + high)


def couple_with_ir(anode, cathode, free_anode_V, free_cathode_V, E_couple_V, current_A, resistance_ohm):
    """The couple of two parts with an electrolyte resistance between them: E_c − E_a = I·R.

    Args:
        anode: the anode, a :class:`calc.kinetics.Electrode` [unitless]
        cathode: the cathode, a :class:`calc.kinetics.Electrode` [unitless]
        free_anode_V: the anode's free-corrosion potential [V]
        free_cathode_V: the cathode's free-corrosion potential [V]
        E_couple_V: the couple potential with no resistance [V]
        current_A: the galvanic current with no resistance [A]
        resistance_ohm: the electrolyte path's resistance [Ω]

    Returns:
        (I [A], E_anode [V], E_cathode [V])

    References:
        Kirchhoff's voltage law around the cell, each part on its own polarization curve
        (X. G. Zhang, "Galvanic corrosion", ch. 10 of Uhlig's Corrosion Handbook, 3rd ed. 2011,
        section I, from its contents); bisection on the current.

    >>> from calc.kinetics import Electrode, Reaction
    >>> a = Electrode("a", 1.0, (Reaction("a", -0.5, 1e-6, 0.1, None, None), Reaction("ac", -0.5, 1e-6, None, 0.1, None)))
    >>> c = Electrode("c", 1.0, (Reaction("c", 0.0, 1e-6, 0.1, None, None), Reaction("cc", 0.0, 1e-6, None, 0.1, None)))
    >>> i, ea, ec = couple_with_ir(a, c, -0.5, 0.0, -0.25, 1e-6 * (10 ** 2.5 - 10 ** -2.5), 0.0)
    >>> round(ec - ea, 9)
    0.0
    """
    lo, hi = 0.0, current_A
    ea = ec = E_couple_V
    for _ in range(200):
        mid = 0.5 * (lo + hi)
        ea = potential_at_current(anode, mid, free_anode_V, E_couple_V)
        ec = potential_at_current(cathode, -mid, E_couple_V, free_cathode_V)
        if ec - ea - mid * resistance_ohm > 0.0:
            lo = mid
        else:
            hi = mid
        if hi - lo <= 1e-12 * current_A:
            break
    i = 0.5 * (lo + hi)
    return i, potential_at_current(anode, i, free_anode_V, E_couple_V), potential_at_current(
        cathode, -i, E_couple_V, free_cathode_V)
