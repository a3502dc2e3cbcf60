"""Standard potentials against standard Gibbs energies of formation: ΔrG° = −nFE°.

For every half-reaction whose species all have a ΔG°f in gibbs_energies.yaml (an element in its
reference state counts as 0 by definition), ΔrG° = Σ ΔG°f(reduced side) − Σ ΔG°f(oxidised side)
(electrons count 0) gives E° = −ΔrG°/(nF). The stored E° must agree within
:data:`TOLERANCE_V`; a couple beyond it is an error, reported with both numbers, unless its record
says which value it keeps and why (``gibbs_note``), when it is a warning with both numbers.

Tolerance: 10 mV. The ΔG°f values are printed to 0.1 kJ/mol (1 kJ/mol for Al3+), which is at most
about 1 mV of E° for n = 1 per species; the CRC, Bratsch (1989) and NBS-derived figures of
well-measured couples spread by a few mV (Li+/Li 0.3 mV, Zn2+/Zn 0.5 mV, K+/K 5 mV in this
dataset). More than 10 mV means the handbook line rests on other thermochemistry (Fe2+/Fe, Ni2+/Ni)
or is wrong.
"""

import re

from calc.cell import reaction_free_energy
from calc.errors import InputError
from calc.species import parse_species

from .collect import each, is_num

K = "half_reactions"
#: largest accepted |E°(stored) − E°(from ΔG°f)| [V]
TOLERANCE_V = 0.010
#: the reference phase of the elements that are not solid at 25 °C and 1 bar (others: solid)
REFERENCE_PHASE = {"H2": "g", "O2": "g", "N2": "g", "F2": "g", "Cl2": "g", "Br2": "l", "Hg": "l", "I2": "s"}
_ELEMENT_RE = re.compile(r"^[A-Z][a-z]?[0-9]?$")


def reference_state(sp):
    """True for an element in its reference state (ΔG°f = 0 by definition).

    >>> [reference_state(parse_species(t)) for t in ("Zn(s)", "Hg(l)", "H2(g)", "O2(g)", "Zn2+(aq)", "Hg(g)")]
    [True, True, True, True, False, False]
    """
    if sp.charge != 0 or not _ELEMENT_RE.match(sp.formula):
        return False
    want = REFERENCE_PHASE.get(sp.formula)
    if want is None:
        return sp.phase == "s" and not sp.formula[-1].isdigit()
    return sp.phase == want


def gibbs_table(raw):
    """id (species with phase) -> ΔG°f [kJ/mol] of the records of gibbs_energies.yaml."""
    return {rec["id"]: rec["dGf_kJ_per_mol"] for _, rec in each(raw, "gibbs_energies")
            if isinstance(rec.get("id"), str) and is_num(rec.get("dGf_kJ_per_mol"))}


def _side_energy(texts, table):
    """Σ coeff·ΔG°f of one side [kJ/mol], or None when a species has no value."""
    total = 0.0
    for text in texts or []:
        try:
            sp = parse_species(text)
        except InputError:
            return None
        body = text.strip().split(" ", 1)[1] if text.strip()[0].isdigit() else text.strip()
        if body in table:
            total += sp.coeff * table[body]
        elif not reference_state(sp):
            return None
    return total


def potential_from_gibbs(rec, table):
    """E° [V] of a half-reaction from ΔG°f of its species, or None when one is missing.

    Args:
        rec: a half-reaction record (oxidised, reduced, n) [unitless]
        table: species -> ΔG°f [kJ/mol], see :func:`gibbs_table` [unitless]

    Returns:
        E° = −ΔrG°/(nF) [V], or None

    References:
        ΔrG° = −nFE° (Bard & Faulkner, Electrochemical Methods, 2nd ed. 2001, §2.1, from memory),
        with ΔrG° = Σ ΔG°f(products) − Σ ΔG°f(reactants) and ΔG°f = 0 for elements in their reference
        state (Wagman et al., NBS tables, J. Phys. Chem. Ref. Data 11 Suppl. 2, 1982).

    >>> round(potential_from_gibbs({"oxidised": ["Zn2+(aq)"], "reduced": ["Zn(s)"], "n": 2}, {"Zn2+(aq)": -147.1}), 4)
    -0.7623
    """
    ox, red, n = _side_energy(rec.get("oxidised"), table), _side_energy(rec.get("reduced"), table), rec.get("n")
    if ox is None or red is None or not is_num(n) or n == 0:
        return None
    # ΔrG° = −nFE°: reaction_free_energy(n, 1 V) is the ΔG [kJ/mol] of one volt
    return (red - ox) / reaction_free_energy(n, 1.0)


def check_gibbs(raw, out):
    """Each half-reaction with ΔG°f for all its species agrees with ΔrG° = −nFE° within the tolerance."""
    table = gibbs_table(raw)
    if not table:
        return
    for label, rec in each(raw, K):
        stored = rec.get("E0_V")
        calc = potential_from_gibbs(rec, table)
        if calc is None or not is_num(stored):
            continue
        diff = stored - calc
        if abs(diff) <= TOLERANCE_V:
            continue
        text = (f"E° {stored:.4f} V, but the Gibbs energies of formation of its species give "
                f"{calc:.4f} V (ΔrG° = −nFE°); the difference is {diff * 1000:.1f} mV, more than "
                f"{TOLERANCE_V * 1000:g} mV")
        if isinstance(rec.get("gibbs_note"), str) and rec["gibbs_note"].strip():
            out.warning(K, label, "E0_V", text + " (kept: see gibbs_note)")
        else:
            out.error(K, label, "E0_V", text + ": correct the value, or say in 'gibbs_note' which value is kept "
                                               "and why")
