"""Impressed-current protection of the inside of a water storage tank: anode resistance and layout.

The hand methods of the US handbooks for tank interiors (MIL-HDBK-1004/10, 1990, Section 9 examples
of an elevated water tank and a hot-water tank; USACE ETL 1110-9-10, 1991, eq 1-13, 1-14 and 2-7;
UFC 3-570-02A, 2005, Appendix D, eq D-4 to D-9). Each keeps its printed constant, written for
ohm-centimetres and feet, and converts at its edge (:mod:`calc.cpdesign.units`):

- a short anode in a cylindrical tank (MIL): R = 0.012·ρ·log10(D/d)/L;
- a circle of rod anodes (ETL eq 1-13): R_N = 0.0052·ρ·ln[D/(2·AR·DE)]/L_B, DE from its figure 2-17;
- a wire hoop anode (ETL eq 1-14): R = (0.0016·ρ/D_R)·[ln(8·D_R/D_A) + ln(2·D_R/H)];
- the fringe factor F of short anodes, L/d below 100 (MIL Figure 101, ETL figure 2-18 and eq 2-7):
  R_adj = R·F, F read from the figure;
- the anode circle r = D·N/(2(π + N)) (UFC eq D-8) and its spacing C = 2πr/N (eq D-9, ETL eq 2-5);
- the wetted areas: a cylinder 2πrh (eq D-5, D-7), an ellipsoidal bottom 2πr·√((a² + r²)/2) (eq D-6),
  a flat bottom πr², the annulus of the bottom a set of stub anodes covers π(r₂² − r₁²) (MIL p. 165).
"""

import math

from .units import feet, ohm_cm

#: the handbook's constant of a short anode in a tank, R = 0.012·ρ·log10(D/d)/L (ρ in Ω·cm, L in ft);
#: ln 10/(2π × 30.48) = 0.01202: the resistance between coaxial cylinders (our reading of it) [ft/cm]
TANK_ANODE_K = 0.012
#: the ETL's constant of a circle of rods, eq 1-13 (ρ in Ω·cm, L in ft); 1/(2π × 30.48) = 0.005222 [ft/cm]
ROD_CIRCLE_K = 0.0052
#: the ETL's constant of a wire hoop, eq 1-14 (ρ in Ω·cm, D_R in ft); 1/(2π² × 30.48) = 0.00166, the ring
#: of Dwight's formulas (our reading of it) [ft/cm]
HOOP_K = 0.0016
#: below this length-to-diameter ratio the handbooks correct a tank anode by the fringe factor [unitless]
FRINGE_BELOW_L_OVER_D = 100.0


def tank_anode(resistivity, tank_diameter, anode_diameter, length):
    """Resistance of a short anode inside a cylindrical tank, R = 0.012·ρ·log10(D/d)/L.

    Args:
        resistivity: water resistivity ρ [Ω·m]
        tank_diameter: inside diameter of the tank D [m]
        anode_diameter: anode diameter d [m]
        length: anode length L [m]

    Returns:
        anode-to-water resistance before the fringe factor [Ω]

    References:
        MIL-HDBK-1004/10 (1990) Section 9, hot-water storage tank example (p. 189) and riser anodes
        (p. 168), ρ in Ω·cm and L in ft; the same in UFC 3-570-02A (2005) Appendix D.

    >>> round(tank_anode(86.0, 3.83 * 0.3048, 1.5 * 0.0254, 9 * 0.0254), 1)  # the handbook's 204.5 Ω
    204.5
    """
    return TANK_ANODE_K * ohm_cm(resistivity) * math.log10(tank_diameter / anode_diameter) / feet(length)


def rod_circle(resistivity, tank_diameter, circle_radius, factor, length):
    """Resistance of a circle of rod anodes in a tank, R_N = 0.0052·ρ·ln[D/(2·AR·DE)]/L_B.

    Args:
        resistivity: water resistivity ρ [Ω·m]
        tank_diameter: tank diameter D [m]
        circle_radius: radius of the anode circle AR [m]
        factor: equivalent diameter factor DE of the ETL's figure 2-17 (by the number of rods) [unitless]
        length: length of each rod L_B [m]

    Returns:
        anode-to-water resistance of the circle before the fringe factor [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-13, ρ in Ω·cm and lengths in ft.

    >>> round(rod_circle(40.0, 56 * 0.3048, 7 * 0.3048, 0.07, 4 * 0.3048), 2)  # the ETL's stub anodes: 21.03 Ω
    21.04
    """
    return ROD_CIRCLE_K * ohm_cm(resistivity) * math.log(tank_diameter / (2.0 * circle_radius * factor)) / feet(length)


def hoop(resistivity, hoop_diameter, wire_diameter, depth):
    """Resistance of a wire hoop anode in a tank, R = (0.0016·ρ/D_R)·[ln(8·D_R/D_A) + ln(2·D_R/H)].

    Args:
        resistivity: water resistivity ρ [Ω·m]
        hoop_diameter: diameter of the wire circle D_R [m]
        wire_diameter: diameter of the anode wire D_A [m]
        depth: depth of the hoop below the high water level H [m]

    Returns:
        anode-to-water resistance [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-14, ρ in Ω·cm and lengths in ft.

    >>> round(hoop(20.0, 27.5 * 0.3048, 0.0052 * 0.3048, 12 * 0.3048), 2)  # the ETL's 1.42 Ω
    1.42
    """
    return HOOP_K * ohm_cm(resistivity) / feet(hoop_diameter) * (
        math.log(8.0 * hoop_diameter / wire_diameter) + math.log(2.0 * hoop_diameter / depth))


def fringe(resistance, factor):
    """A short tank anode's resistance corrected by the fringe factor, R_adj = R·F.

    Args:
        resistance: the anode-to-water resistance of the formula [Ω]
        factor: fringe factor F read from the handbooks' curve for the anode's L/d [unitless]

    Returns:
        adjusted resistance [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 2-7 and figure 2-18; MIL-HDBK-1004/10 (1990) Figure 101 (its
        hot-water tank example: 204.5 Ω × 0.48 = 98.2 Ω at L/d = 6).

    >>> round(fringe(204.5, 0.48), 1)
    98.2
    """
    return resistance * factor


def circle_radius(tank_diameter, count):
    """Radius of the circle of main anodes in a tank, r = D·N/(2(π + N)).

    Args:
        tank_diameter: tank diameter D [m]
        count: number of anodes (strings) on the circle N [unitless]

    Returns:
        radius of the anode circle [m]

    References:
        UFC 3-570-02A (2005) eq D-8; MIL-HDBK-1004/10 (1990) elevated water tank example (p. 159).

    >>> round(circle_radius(56.0, 10), 1)  # in feet: the handbook's 21.3 ft
    21.3
    """
    return tank_diameter * count / (2.0 * (math.pi + count))


def circle_spacing(radius, count):
    """Circumferential spacing of N anodes on a circle, C = 2πr/N.

    Args:
        radius: radius of the anode circle r [m]
        count: number of anodes N [unitless]

    Returns:
        spacing along the circle [m]

    References:
        UFC 3-570-02A (2005) eq D-9; USACE ETL 1110-9-10 (1991) eq 2-5; MIL-HDBK-1004/10 (1990) p. 159.

    >>> round(circle_spacing(22.0, 10), 1)  # in feet: 13.8 ft
    13.8
    """
    return 2.0 * math.pi * radius / count


def cylinder_area(radius, height):
    """Wetted area of a cylindrical shell (or a riser pipe), A = 2πrh.

    Args:
        radius: radius r [m]
        height: wetted height h [m]

    Returns:
        area [m²]

    References:
        UFC 3-570-02A (2005) eq D-5 and D-7 (eq D-4, the top section, the same); ETL 1110-9-10 eq 2-2.

    >>> round(cylinder_area(2.5, 115))  # in ft²: the riser's 1806 ft²
    1806
    """
    return 2.0 * math.pi * radius * height


def ellipsoidal_bottom_area(radius, depth):
    """Wetted area of an ellipsoidal tank bottom, A = 2πr·√((a² + r²)/2).

    Args:
        radius: tank radius r [m]
        depth: depth of the bottom below the shell a [m]

    Returns:
        area [m²]

    References:
        UFC 3-570-02A (2005) eq D-6; MIL-HDBK-1004/10 (1990) elevated water tank example (p. 158).

    >>> round(ellipsoidal_bottom_area(28, 14))  # in ft²: 3894 ft²
    3894
    """
    return 2.0 * math.pi * radius * math.sqrt((depth ** 2 + radius ** 2) / 2.0)


def flat_bottom_area(radius):
    """Wetted area of a flat tank bottom, A = πr².

    Args:
        radius: tank radius r [m]

    Returns:
        area [m²]

    References:
        USACE ETL 1110-9-10 (1991) ground storage tank example (p. 106: 2π·23·20 + π·23²).

    >>> round(flat_bottom_area(23))  # in ft²: 1662 ft²
    1662
    """
    return math.pi * radius ** 2


def annulus_area(outer, inner):
    """Area of the ring of a tank bottom between two radii, A = π(r₂² − r₁²).

    Args:
        outer: outer radius r₂ [m]
        inner: inner radius r₁ (the riser) [m]

    Returns:
        area [m²]

    References:
        MIL-HDBK-1004/10 (1990) elevated water tank example, the bottom the stub anodes protect (p. 165).

    >>> round(annulus_area(13, 2.5), 1)  # in ft²: 511.3 ft²
    511.3
    """
    return math.pi * (outer ** 2 - inner ** 2)
