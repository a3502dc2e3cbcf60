"""Species strings and half-reaction stoichiometry.

Grammar (see DEVELOPERS.md): ``[COEFF ]FORMULA[CHARGE](PHASE)``, e.g. ``4 H+(aq)``,
``Hg2^2+(aq)``, ``Fe(OH)2(s)``, ``2 H2O(l)``.
"""

import re
from dataclasses import dataclass

from .errors import InputError

PHASES = ("aq", "s", "l", "g")
_SPECIES_RE = re.compile(r"^(?:(\d+(?:\.\d+)?) )?(.+?)\((aq|s|l|g)\)$")
_CHARGE_CARET_RE = re.compile(r"^(.+)\^(\d*)([+-])$")
_CHARGE_RE = re.compile(r"^(.+?)(\d*)([+-])$")
_TOKEN_RE = re.compile(r"([A-Z][a-z]?|\(|\)|\d+)")


@dataclass(frozen=True)
class Species:
    """One species of a half-reaction, with its stoichiometric coefficient."""

    coeff: float
    formula: str
    charge: int
    phase: str

    @property
    def name(self):
        """The species without coefficient or phase, as written in couples: ``Fe3+``."""
        if self.charge == 0:
            return self.formula
        sign = "+" if self.charge > 0 else "-"
        mag = abs(self.charge)
        num = "" if mag == 1 else str(mag)
        sep = "^" if self.formula[-1].isdigit() else ""
        return f"{self.formula}{sep}{num}{sign}"

    @property
    def key(self):
        """Name with phase, unique within a reaction: ``Fe3+(aq)``."""
        return f"{self.name}({self.phase})"

    def atoms(self):
        """Element counts of one formula unit."""
        return formula_atoms(self.formula)


def parse_species(text):
    """Parse one species string.

    Args:
        text: species as ``[COEFF ]FORMULA[CHARGE](PHASE)`` [unitless]

    Returns:
        a Species

    References:
        Species grammar of DEVELOPERS.md ("Species strings").

    >>> parse_species("4 H+(aq)")
    Species(coeff=4.0, formula='H', charge=1, phase='aq')
    >>> parse_species("Hg2^2+(aq)").name
    'Hg2^2+'
    >>> parse_species("Fe(OH)2(s)").atoms() == {'Fe': 1, 'O': 2, 'H': 2}
    True
    """
    if not isinstance(text, str):
        raise InputError("species", text, "a species string such as '2 H2O(l)'")
    m = _SPECIES_RE.match(text.strip())
    if not m:
        raise InputError("species", text, "FORMULA[CHARGE](PHASE) with PHASE one of aq, s, l, g")
    coeff = float(m.group(1)) if m.group(1) else 1.0
    body, phase = m.group(2), m.group(3)
    charge = 0
    formula = body
    cm = _CHARGE_CARET_RE.match(body) or _CHARGE_RE.match(body)
    if cm:
        formula = cm.group(1)
        if len(cm.group(2)) > 3:
            raise InputError("species", text, "a charge of at most three digits, e.g. Fe3+ or SO4^2-")
        mag = int(cm.group(2)) if cm.group(2) else 1
        charge = mag if cm.group(3) == "+" else -mag
    formula_atoms(formula)  # validates
    return Species(coeff, formula, charge, phase)


def formula_atoms(formula):
    """Element counts of a formula with optional parentheses.

    Args:
        formula: chemical formula such as ``Hg2Cl2`` or ``Fe(OH)3`` [unitless]

    Returns:
        dict element -> count

    References:
        Species grammar of DEVELOPERS.md ("Species strings").

    >>> formula_atoms("Hg2Cl2") == {'Hg': 2, 'Cl': 2}
    True
    """
    tokens = _TOKEN_RE.findall(formula)
    if "".join(tokens) != formula or not tokens:
        raise InputError("formula", formula, "element symbols with counts, e.g. Fe(OH)3")
    if any(t.isdigit() and len(t) > 6 for t in tokens):
        raise InputError("formula", formula, "counts of at most six digits")
    stack = [{}]
    i = 0
    while i < len(tokens):
        tok = tokens[i]
        if tok == "(":
            stack.append({})
            i += 1
            continue
        if tok == ")":
            if len(stack) == 1:
                raise InputError("formula", formula, "balanced parentheses")
            group = stack.pop()
            mult = 1
            if i + 1 < len(tokens) and tokens[i + 1].isdigit():
                mult = int(tokens[i + 1])
                i += 1
            for el, c in group.items():
                stack[-1][el] = stack[-1].get(el, 0) + c * mult
            i += 1
            continue
        if tok.isdigit():
            raise InputError("formula", formula, "a count after an element or a ')'")
        count = 1
        if i + 1 < len(tokens) and tokens[i + 1].isdigit():
            count = int(tokens[i + 1])
            i += 1
        stack[-1][tok] = stack[-1].get(tok, 0) + count
        i += 1
    if len(stack) != 1:
        raise InputError("formula", formula, "balanced parentheses")
    return stack[0]


def balance_problems(oxidised, reduced, n):
    """Atom and charge balance of a reduction ``oxidised + n e- -> reduced``.

    Args:
        oxidised: species strings on the oxidised side [unitless]
        reduced: species strings on the reduced side [unitless]
        n: electrons transferred [unitless]

    Returns:
        list of problems (empty when balanced)

    References:
        Conservation of atoms and charge in a half-reaction (IUPAC Green Book, 3rd ed. 2007, §2.13), common practice.

    >>> balance_problems(["O2(g)", "4 H+(aq)"], ["2 H2O(l)"], 4)
    []
    >>> balance_problems(["Fe3+(aq)"], ["Fe(s)"], 2)
    ['charge: oxidised side 3 - 2 e- = 1, reduced side 0']
    """
    left = [parse_species(s) for s in oxidised]
    right = [parse_species(s) for s in reduced]
    problems = []
    atoms_l, atoms_r = {}, {}
    for side, acc in ((left, atoms_l), (right, atoms_r)):
        for sp in side:
            for el, c in sp.atoms().items():
                acc[el] = acc.get(el, 0) + c * sp.coeff
    for el in sorted(set(atoms_l) | set(atoms_r)):
        a, b = atoms_l.get(el, 0), atoms_r.get(el, 0)
        if abs(a - b) > 1e-9:
            problems.append(f"atoms: {el} is {a:g} on the oxidised side, {b:g} on the reduced side")
    ql = sum(sp.coeff * sp.charge for sp in left)
    qr = sum(sp.coeff * sp.charge for sp in right)
    if abs(ql - n - qr) > 1e-9:
        problems.append(f"charge: oxidised side {ql:g} - {n:g} e- = {ql - n:g}, reduced side {qr:g}")
    return problems


def as_record(text, side):
    """One species of a half-reaction as the bundle carries it, parsed, for the page.

    The page needs each species' name (as written, the key of its activity field), phase and
    coefficient; it gets them here, parsed once at build time, so it holds no species grammar.

    Args:
        text: species as ``[COEFF ]FORMULA[CHARGE](PHASE)`` [unitless]
        side: ``oxidised`` or ``reduced`` [unitless]

    Returns:
        ``{"text", "name", "phase", "coeff", "charge", "side"}``

    References:
        Species grammar of DEVELOPERS.md.

    >>> as_record("2 H2O(l)", "reduced")["name"], as_record("Hg2^2+(aq)", "oxidised")["charge"]
    ('H2O', 2)
    """
    sp = parse_species(text)
    name = _SPECIES_RE.match(text.strip()).group(2)
    return {"text": text, "name": name, "phase": sp.phase, "coeff": sp.coeff, "charge": sp.charge, "side": side}
