"""Impressed-current groundbeds: anode-to-earth resistance, the circuit, the rectifier, the anode life.

- A single vertical anode or backfill column (Dwight 1936): R_V = ρ/(2πL)·[ln(8L/d) − 1]; the handbooks
  write it R_V = ρ·K/L with ρ in Ω·cm, L in ft and the shape function K = (ln(8L/d) − 1)/(2π·30.48).
- A single horizontal anode at depth h (Dwight, with its image; S = 2h), from memory:
  R_H = ρ/(2πL)·[ln((4L² + 4L·√(S² + L²))/(d·S)) + S/L − √(S² + L²)/L − 1].
- N vertical anodes in a line at spacing S, two ways: the handbooks' empirical form
  R_N = R_V/N + ρ·P/S with their paralleling factor P (table; ρ in Ω·cm, S in ft), or Sunde's formula
  R = ρ/(2πNL)·[ln(8L/d) − 1 + (2L/S)·ln(0.656·N)].
- The circuit R_T = R_N + R_W + R_C (groundbed, cables, structure to earth R_C = R_s/A), the rectifier
  V = I·R_T + back voltage, with a stated margin, and the anode life Y = W·E/(S·I).
"""

import math

from .catalogue import paralleling_factor, table
from .units import feet, ohm_cm

#: the handbooks' unit factor of Dwight's equation: 1/(2π × 30.48 cm/ft) [ft/cm]
HANDBOOK_K = 1.0 / (2.0 * math.pi * 30.48)


def dwight_vertical(resistivity, length, diameter):
    """Resistance of a single vertical anode (or backfill column) to earth, R_V = ρ/(2πL)·[ln(8L/d) − 1].

    Args:
        resistivity: soil resistivity ρ [Ω·m]
        length: anode or backfill-column length L [m]
        diameter: anode or backfill-column diameter d [m]

    Returns:
        resistance to remote earth [Ω]

    References:
        H. B. Dwight, "Calculation of resistances to ground", Electrical Engineering 55 (1936) 1319;
        MIL-HDBK-1004/10 para 6.2.1.4a; USACE ETL 1110-9-10 (1991) eq 1-6.

    >>> round(dwight_vertical(20.0, 7 * 0.3048, 10 * 0.0254), 2)  # the handbook: 4.77 Ω with K rounded to 0.0167
    4.79
    """
    return resistivity / (2.0 * math.pi * length) * (math.log(8.0 * length / diameter) - 1.0)


def shape_function(length, diameter):
    """The handbooks' shape function K of a vertical anode, R_V = ρ[Ω·cm]·K/L[ft].

    Args:
        length: anode length, any unit (only L/d counts) [m]
        diameter: anode diameter, the unit of the length [m]

    Returns:
        K [ft/cm]

    References:
        MIL-HDBK-1004/10 para 6.2.1.4a; USACE ETL 1110-9-10 (1991) Table A-4 (Dwight's equation in feet).

    >>> round(shape_function(60, 2), 4)  # L/d = 30: the tables' 0.0234
    0.0234
    """
    return HANDBOOK_K * (math.log(8.0 * length / diameter) - 1.0)


def handbook_vertical(resistivity, length, k):
    """Resistance of a single vertical anode from the handbooks' shape function, R_V = ρ·K/L.

    For an anode of a catalogue whose K the handbook tabulates (K for ρ in Ω·cm and L in ft);
    :func:`shape_function` gives the K of Dwight's equation for any L/d.

    Args:
        resistivity: electrolyte resistivity ρ [Ω·m]
        length: anode length L [m]
        k: the handbook's shape function K of the anode [ft/cm]

    Returns:
        resistance to remote earth [Ω]

    References:
        MIL-HDBK-1004/10 (1990) para 6.2.1.4a, R_V = (P/L)K; USACE ETL 1110-9-10 (1991) eq 1-6, R_A = ρK/L.

    >>> round(handbook_vertical(0.22, 4 * 0.3048, 0.017), 3)  # MIL-HDBK-1004/10 p. 209: 0.093 Ω
    0.093
    """
    return ohm_cm(resistivity) * k / feet(length)


def dwight_horizontal(resistivity, length, diameter, depth):
    """Resistance of a single horizontal anode at a depth, with its image (S = 2h); from memory.

    R_H = ρ/(2πL)·[ln((4L² + 4L·√(S² + L²))/(d·S)) + S/L − √(S² + L²)/L − 1]

    Args:
        resistivity: soil resistivity ρ [Ω·m]
        length: anode or backfill length L [m]
        diameter: anode or backfill diameter d [m]
        depth: depth of the anode's axis h [m]

    Returns:
        resistance to remote earth [Ω]

    References:
        H. B. Dwight (1936), horizontal conductor with its image, in the form of MIL-HDBK-1004/10
        para 6.2.1.4: from memory, not re-read.

    >>> round(dwight_horizontal(20.0, 3.0, 0.2, 1.5), 3)
    3.779
    """
    s = 2.0 * depth
    root = math.sqrt(s * s + length * length)
    return resistivity / (2.0 * math.pi * length) * (
        math.log((4.0 * length ** 2 + 4.0 * length * root) / (diameter * s)) + s / length - root / length - 1.0)


def handbook_group(single, count, resistivity, spacing, factor):
    """Resistance of N anodes in a line by the handbooks' form, R_N = R_V/N + ρ·P/S.

    Args:
        single: resistance of one anode R_V [Ω]
        count: number of anodes N [unitless]
        resistivity: soil resistivity ρ, used in Ω·cm as the table's P needs [Ω·m]
        spacing: centre-to-centre spacing S, used in ft as the table's P needs [m]
        factor: paralleling factor P of the table for N [ft/cm]

    Returns:
        groundbed resistance [Ω]

    References:
        MIL-HDBK-1004/10 para 6.2.1.4b; USACE ETL 1110-9-10 (1991) eq 1-11 and Table 3-5.

    >>> round(handbook_group(4.77, 3, 20.0, 20 * 0.3048, 0.00289), 2)  # the handbook's 1.87 Ω
    1.88
    """
    return single / count + ohm_cm(resistivity) * factor / feet(spacing)


def sunde(resistivity, length, diameter, count, spacing):
    """Resistance of N vertical anodes in a line, Sunde's formula.

    R = ρ/(2πNL)·[ln(8L/d) − 1 + (2L/S)·ln(0.656·N)]

    Args:
        resistivity: soil resistivity ρ [Ω·m]
        length: anode length L [m]
        diameter: anode diameter d [m]
        count: number of anodes N [unitless]
        spacing: centre-to-centre spacing S [m]

    Returns:
        groundbed resistance [Ω]

    References:
        E. D. Sunde, Earth Conduction Effects in Transmission Systems (Dover, 1968), as used in
        cathodic-protection texts: from memory, not re-read.

    >>> round(sunde(20.0, 7 * 0.3048, 10 * 0.0254, 3, 20 * 0.3048), 2)  # the handbook's table gives 1.88 Ω
    1.83
    """
    return resistivity / (2.0 * math.pi * count * length) * (
        math.log(8.0 * length / diameter) - 1.0 + 2.0 * length / spacing * math.log(0.656 * count))


def group_resistance(method, single, resistivity, length, diameter, count, spacing):
    """Groundbed resistance of N anodes by a method, with the paralleling factor used (table method).

    Args:
        method: ``table`` (the handbooks' P) or ``sunde`` [unitless]
        single: resistance of one anode [Ω]
        resistivity: soil resistivity [Ω·m]
        length: anode (column) length [m]
        diameter: anode (column) diameter [m]
        count: number of anodes [unitless]
        spacing: centre-to-centre spacing [m]

    Returns:
        (resistance [Ω], paralleling factor or None, its table row or None)

    References:
        :func:`handbook_group`, :func:`sunde`.

    >>> round(group_resistance("table", 21.06, 45.0, 1.524, 0.0508, 9, 3.048)[0], 2)  # ETL example 2-3
    3.29
    """
    if count == 1:
        return single, None, None
    if method == "sunde":
        return sunde(resistivity, length, diameter, count, spacing), None, None
    p, row = paralleling_factor(count)
    return handbook_group(single, count, resistivity, spacing, p), p, row


def count_for_resistance(single, resistivity, spacing, target, method="table", length=None, diameter=None):
    """The fewest anodes in a line whose groundbed resistance is at most a target (None when none does).

    Args:
        single: resistance of one anode [Ω]
        resistivity: soil resistivity [Ω·m]
        spacing: centre-to-centre spacing [m]
        target: the largest groundbed resistance allowed [Ω]
        method: ``table`` (only the counts the table holds) or ``sunde`` (any count up to 100) [unitless]
        length: anode length, for Sunde's formula [m]
        diameter: anode diameter, for Sunde's formula [m]

    Returns:
        (count, its resistance [Ω]) or (None, None)

    References:
        The trial-and-error step of MIL-HDBK-1004/10's groundbed example and ETL 1110-9-10 example 2-3.

    >>> count_for_resistance(4.77, 20.0, 20 * 0.3048, 2.0)[0]  # the handbook's three anodes
    3
    """
    if single <= target:
        return 1, single
    counts = ([r["count"] for r in table("paralleling-factor")["rows"]] if method == "table"
              else list(range(2, 101)))
    for n in counts:
        value = group_resistance(method, single, resistivity, length, diameter, n, spacing)[0]
        if value <= target:
            return n, value
    return None, None


def cable_resistance(length, ohm_per_km):
    """Resistance of a cable run, R_W = L·r.

    Args:
        length: cable length [m]
        ohm_per_km: conductor resistance per length [Ω/km]

    Returns:
        resistance [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-15 (R_W = L_W·R_MFT, there per 1000 ft).

    >>> round(cable_resistance(15 * 0.3048, 2.58 / 0.3048), 4)  # 15 ft of No. 14 AWG: the ETL's 0.039 Ω
    0.0387
    """
    return length * ohm_per_km / 1000.0


def structure_resistance(coating_resistance, area):
    """Structure-to-electrolyte resistance of a coated structure, R_C = R_s/A.

    Args:
        coating_resistance: effective coating resistance R_s [Ω·m²]
        area: the structure's surface area A [m²]

    Returns:
        resistance [Ω]

    References:
        USACE ETL 1110-9-10 (1991) eq 1-16.

    >>> round(structure_resistance(2500 * 0.09290304, 11791 * 0.09290304), 3)  # the ETL's 0.212 Ω
    0.212
    """
    return coating_resistance / area


def rectifier(current, resistance, back_emf=0.0, margin=0.0):
    """Rectifier output for a design current: V = I·R_T + back voltage, and the rating with a margin.

    Args:
        current: the design current I [A]
        resistance: the total circuit resistance R_T [Ω]
        back_emf: back voltage between anodes and structure [V]
        margin: the margin on the current (0.25 adds 25 %) [unitless]

    Returns:
        (voltage at the design current, rated current, rated voltage) [V, A, V]

    References:
        MIL-HDBK-1004/10 rectifier sizing (dc voltage = IR + 3 in its pier example); the margin is ours.

    >>> [round(x, 3) for x in rectifier(14.7, 0.06, 3.0)]
    [3.882, 14.7, 3.882]
    """
    rated = current * (1.0 + margin)
    return current * resistance + back_emf, rated, rated * resistance + back_emf
