"""Ions and the ionic strength of a solution or of a named environment.

I = ½ Σ m_i z_i² (Lewis & Randall 1921), from a stated composition, or the value a dataset
environment records with its source; ions are read with the species grammar of DEVELOPERS.md.
"""

from .bounds import check
from .dataset import current
from .derivation import Derivation, fmt
from .errors import InputError
from .species import parse_species

#: highest ion charge accepted (free aqueous ions beyond ±4 are rare; common practice) [unitless]
ION_CHARGE_MAX = 6


def ion(species):
    """Parse an ion as written in requests: ``Zn2+``, ``SO4^2-`` or ``Zn2+(aq)``.

    Args:
        species: the ion, with or without ``(aq)`` [unitless]

    Returns:
        a :class:`calc.species.Species` (coefficient 1)

    References:
        Species grammar of DEVELOPERS.md (calc.species.parse_species).

    >>> ion("SO4^2-").charge
    -2
    >>> ion("Cu2+(aq)").name
    'Cu2+'
    """
    if not isinstance(species, str) or not species.strip():
        raise InputError("species", species, "an ion such as Zn2+ or SO4^2-")
    text = species.strip()
    if not text.endswith(")"):
        text += "(aq)"
    try:
        sp = parse_species(text)
    except InputError:
        raise InputError("species", species, "an ion such as Zn2+, Cl- or SO4^2-") from None
    if sp.coeff != 1:
        raise InputError("species", species, "one ion without a coefficient, such as Zn2+")
    if abs(sp.charge) > ION_CHARGE_MAX:
        raise InputError("species", species, f"an ion with a charge from -{ION_CHARGE_MAX} to +{ION_CHARGE_MAX}",
                         "the Debye–Hückel models have no meaning for higher charges")
    return sp


def ionic_strength(composition):
    """Ionic strength of a solution: I = ½ Σ m_i z_i².

    Args:
        composition: {ion: molality}, e.g. {"Zn2+": 0.1, "SO4^2-": 0.1} [mol/kg]

    Returns:
        ionic strength [mol/kg]

    References:
        G. N. Lewis and M. Randall, J. Am. Chem. Soc. 43 (1921) 1112 (definition of I).

    >>> ionic_strength({"Zn2+": 0.1, "SO4^2-": 0.1})
    0.4
    >>> round(ionic_strength({"Na+": 0.5, "Cl-": 0.5}), 12)
    0.5
    """
    if not isinstance(composition, dict) or not composition:
        raise InputError("composition", composition, "a non-empty {ion: molality} mapping, e.g. {\"Na+\": 0.5, \"Cl-\": 0.5}")
    total = 0.0
    for name, m in composition.items():
        sp = ion(name)
        m = check("composition_molality", m, f"composition.{name}")
        total += m * sp.charge ** 2
    return 0.5 * total


def ionic_strength_terms(composition):
    """The sum of an ionic strength written out for a derivation step.

    Args:
        composition: {ion: molality} [mol/kg]

    Returns:
        text such as ``0.1·(+2)² + 0.1·(−2)²``

    References:
        Presentation of I = ½ Σ m_i z_i² (Lewis & Randall 1921).

    >>> ionic_strength_terms({"Zn2+": 0.1, "SO4^2-": 0.1})
    '0.1·(+2)² + 0.1·(−2)²'
    """
    parts = []
    for name, m in composition.items():
        z = ion(name).charge
        sign = "+" if z > 0 else "−" if z < 0 else ""
        parts.append(f"{fmt(float(m))}·({sign}{abs(z)})²")
    return " + ".join(parts)


def check_ionic_strength(value, field="ionic_strength"):
    """An ionic strength from a request: a finite number from 0 to 5 mol/kg.

    Args:
        value: the ionic strength [mol/kg]
        field: the input field shown in an error [unitless]

    Returns:
        the ionic strength [mol/kg]

    References:
        Range of this module (I_HARD_MAX; the models are extrapolations far above 1 mol/kg).

    >>> check_ionic_strength(0.7)
    0.7
    """
    return check("ionic_strength", value, field)


def environment_ionic_strength(env_id, field="env"):
    """The ionic strength of a named environment from the dataset.

    Args:
        env_id: an environment id, e.g. ``seawater-flowing`` [unitless]
        field: the input field shown in an error [unitless]

    Returns:
        (ionic strength [mol/kg], Derivation with the step and source)

    References:
        data/environments.yaml field ionic_strength_mol_per_kg and its source.

    >>> environment_ionic_strength("no-such-place")  # doctest: +ELLIPSIS
    Traceback (most recent call last):
    ...
    calc.errors.InputError: env = 'no-such-place': expected a known environment id...
    """
    rec = current().get("environments", env_id, field)
    value = rec.get("ionic_strength_mol_per_kg")
    if value is None:
        raise InputError(field, env_id, "an environment with an electrolyte (one that has an ionic strength)",
                         "give ionic_strength instead")
    d = Derivation()
    I = check_ionic_strength(value, f"{field} {rec['id']}: ionic_strength_mol_per_kg")
    d.cite(rec.get("ionic_strength_source"))
    d.step("Ionic strength of the environment", f"I of '{rec['id']}' from the dataset",
           f"{rec.get('name', rec['id'])}", f"I = {fmt(I)} mol/kg")
    return I, d
