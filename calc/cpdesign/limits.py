"""Every bound on an input of the cathodic-protection design calculators, written once.

The bounds catch typing slips and unit mistakes (a resistivity in Ω·cm given as Ω·m, a length in
millimetres); they are not design limits. Each has the words its error shows. The entries of
:mod:`calc.cpdesign` check every input here, so a bad value gets the same message from the
command line and the page.
"""

from dataclasses import asdict

from ..bounds import Bound
from ..derivation import check_number
from ..errors import InputError


def _span(low, high, unit, what, note=""):
    """A closed bound [low, high] with its words: the floor keeps a positive quantity off 0 and off underflow."""
    words = f"{what} from {low:g} to {high:g}{' ' + unit if unit else ''}{note}"
    return Bound(low, high, False, unit, words, f"{low:g} to {high:g}{' ' + unit if unit else ''}")


#: name -> Bound (the Bound of :mod:`calc.bounds`, the same shape as every other calculator's)
BOUNDS = {
    "resistivity_ohm_m": _span(1.0e-4, 1.0e6, "Ω·m", "a resistivity",
                               " (seawater about 0.2-0.3 Ω·m, soils about 1 to 10 000 Ω·m)"),
    "length_m": _span(1.0e-3, 1000.0, "m", "a length"),
    "radius_m": _span(1.0e-4, 10.0, "m", "a radius"),
    "diameter_m": _span(1.0e-4, 20.0, "m", "a diameter"),
    "width_m": _span(1.0e-3, 100.0, "m", "a width"),
    "periphery_m": _span(1.0e-3, 60.0, "m", "a cross-section periphery"),
    "anode_area_m2": _span(1.0e-6, 1000.0, "m²", "an exposed anode area"),
    "area_m2": _span(1.0e-6, 1.0e8, "m²", "a surface area"),
    "depth_m": _span(0.0, 10000.0, "m", "a depth"),
    "standoff_m": _span(0.0, 100.0, "m", "a clearance between anode and structure"),
    "life_years": _span(0.01, 100.0, "years", "a design life"),
    "current_A": _span(1.0e-6, 1.0e5, "A", "a current"),
    "current_density_mA_per_m2": _span(1.0e-3, 1.0e4, "mA/m²", "a current density"),
    "capacity_Ah_per_kg": _span(1.0, 3000.0, "A·h/kg", "an electrochemical capacity",
                                " (aluminium's theoretical capacity is about 2980)"),
    "consumption_kg_per_A_yr": _span(1.0e-4, 20.0, "kg/(A·yr)", "a consumption rate"),
    "fraction": _span(0.01, 1.0, "", "a fraction"),
    "coating_efficiency": _span(0.0, 1.0, "", "a coating efficiency", " (below 1: 1 would need no current)"),
    "potential_V": _span(-3.0, 1.0, "V", "a potential"),
    "water_temp_C": _span(-2.0, 40.0, "°C", "a surface-water temperature"),
    "anode_mass_kg": _span(1.0e-6, 1.0e5, "kg", "an anode mass", " (a platinum film weighs milligrams)"),
    "spacing_m": _span(1.0e-3, 1.0e4, "m", "a spacing"),
    "resistance_ohm": _span(1.0e-6, 1.0e7, "Ω", "a resistance"),
    "circuit_ohm": _span(0.0, 1.0e4, "Ω", "a resistance"),
    "cable_ohm_per_km": _span(0.0, 1.0e4, "Ω/km", "a cable resistance"),
    "coating_resistance_ohm_m2": _span(1.0e-6, 1.0e9, "Ω·m²", "a coating resistance"),
    "back_emf_V": _span(0.0, 20.0, "V", "a back voltage"),
    "margin": _span(0.0, 5.0, "", "a margin", " (0.25 adds 25 %)"),
    "factor": _span(1.0e-3, 100.0, "", "a factor"),
    "tank_diameter_m": _span(1.0e-2, 200.0, "m", "a tank (or hoop) diameter"),
    "current_per_length_A_per_m": _span(1.0e-5, 100.0, "A/m", "a wire anode's rated current per metre"),
    "constant_C": _span(1.0, 1.0e7, "mA·Ω·cm", "a constant"),
}
#: most anodes in one design [unitless]
COUNT_MAX = 10000


def check(name, value, field=None):
    """A design input inside its bound of :data:`BOUNDS`, as :func:`calc.bounds.check` does for the others.

    Args:
        name: the bound's name in :data:`BOUNDS` [unitless]
        value: the value given [the bound's unit]
        field: the request field the error names, by default the bound's name [unitless]

    Returns:
        the value as a float, or an InputError with the bound's words [the bound's unit]

    References:
        Input rule of the project (DESIGN.md: calc decides what is allowed and says why).

    >>> check("resistivity_ohm_m", "0.3")
    0.3
    >>> check("life_years", 0)
    Traceback (most recent call last):
    ...
    calc.errors.InputError: life_years = 0.0: expected a design life from 0.01 to 100 years
    """
    b = BOUNDS[name]
    return check_number(value, field or name, b.allowed, low=b.low, high=b.high, low_open=b.low_open)


def check_count(value, field, allowed="a whole number of anodes from 1 to 10000"):
    """A count of anodes: a whole number from 1 to :data:`COUNT_MAX`.

    Args:
        value: the value given [unitless]
        field: the request field shown in an error [unitless]
        allowed: plain words for what is allowed [unitless]

    Returns:
        the count [unitless]

    References:
        Input rule of the project (a count is a whole number).

    >>> check_count(3, "count")
    3
    """
    number = check_number(value, field, allowed, low=1, high=COUNT_MAX)
    if number != int(number):
        raise InputError(field, value, allowed)
    return int(number)


def as_data():
    """The table as plain data for the page (``cp_bounds`` of spec.json): name -> {low, high, low_open, unit, text}.

    Returns:
        a dict of dicts, the shape of :func:`calc.bounds.as_data` [the bounds' units]

    References:
        Project convention (one generated file carries the bounds to the page).

    >>> as_data()["life_years"]["text"]
    '0.01 to 100 years'
    """
    return {name: {k: v for k, v in asdict(b).items() if k != "allowed"} for name, b in BOUNDS.items()}
