"""One table of the elements the engine needs: standard atomic weights and dissolution valences.

Used wherever an equivalent weight (ASTM G102) or a molar mass is computed: the engine's rates,
the seawater chemistry and the data validator's re-computation of stored equivalent weights.
"""

#: Standard atomic weights [g/mol]: IUPAC/CIAAW abridged values to five significant figures
#: (T. Prohaska et al., "Standard atomic weights of the elements 2021 (IUPAC Technical Report)",
#: Pure Appl. Chem. 94, 573 (2022), Table 2 abridged values) - from memory. Cl is the
#: conventional 35.453 of the seawater chlorinity relation (abridged value 35.45).
ATOMIC_WEIGHTS = {
    "H": 1.008, "Li": 6.94, "Be": 9.0122, "B": 10.81, "C": 12.011, "N": 14.007, "O": 15.999,
    "Na": 22.990, "Mg": 24.305, "Al": 26.982, "Si": 28.085, "P": 30.974, "S": 32.06, "Cl": 35.453,
    "K": 39.098, "Ca": 40.078, "Ti": 47.867, "V": 50.942, "Cr": 51.996, "Mn": 54.938, "Fe": 55.845,
    "Co": 58.933, "Ni": 58.693, "Cu": 63.546, "Zn": 65.38, "Ga": 69.723, "As": 74.922, "Se": 78.971,
    "Zr": 91.224, "Nb": 92.906, "Mo": 95.95, "Ru": 101.07, "Rh": 102.91, "Pd": 106.42, "Ag": 107.87,
    "Cd": 112.41, "In": 114.82, "Sn": 118.71, "Sb": 121.76, "Te": 127.60, "Hf": 178.49, "Ta": 180.95,
    "W": 183.84, "Ir": 192.22, "Pt": 195.08, "Au": 196.97, "Pb": 207.2, "Bi": 208.98,
}

#: Valence n_i taken for each element when it dissolves [unitless]: the lowest common oxidation
#: state in near-neutral aerated water, the convention of ASTM G102 Table 1 (Fe 2, Ni 2, Cr 3,
#: Mo 3, Cu 2, Zn 2, Al 3) - from memory. Ti 4 and Si 4 (oxide products), Sn 2, Pb 2 stated by us.
VALENCES = {
    "Ag": 1, "Al": 3, "Be": 2, "Cd": 2, "Co": 2, "Cr": 3, "Cu": 2, "Fe": 2, "Mg": 2, "Mn": 2,
    "Mo": 3, "Nb": 3, "Ni": 2, "Pb": 2, "Sb": 3, "Si": 4, "Sn": 2, "Ti": 4, "V": 3, "W": 4,
    "Zn": 2, "Zr": 4,
}


def atomic_weight(symbol):
    """Standard atomic weight of an element, or None when the table does not hold it.

    Args:
        symbol: element symbol, e.g. ``Fe`` [unitless]

    Returns:
        the atomic weight [g/mol], or None

    References:
        Prohaska et al., Pure Appl. Chem. 94, 573 (2022), Table 2 (abridged), from memory.

    >>> atomic_weight("Fe"), atomic_weight("Xx")
    (55.845, None)
    """
    return ATOMIC_WEIGHTS.get(symbol)
