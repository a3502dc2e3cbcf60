"""The command-line options of the cathodic-protection design commands, written once.

``anodes``, ``anode-resistance``, ``buried``, ``groundbed`` and ``tank`` take their request either as
options (the usual fields, one option each, named after the field with its unit) or, when no option
is given, as one JSON object on standard input (every field of the entry point, zones included).
:mod:`calc.cli` adds the parsers and reads the request here; calc decides what is allowed.
"""

import json

from .errors import InputError

#: the request of the JSON entry point, read when a command is given no option
STDIN_WORDS = "with no option, the request as one JSON object on standard input"
#: command -> (help, [(option, request field, metavar, help)]); a field "anode.x" goes into the request's
#: "anode" object; every option takes a number except those with metavar NAME
OPTIONS = {
    "anodes": ("galvanic-anode design of an immersed structure (DNV-RP-B401 method) from its design currents", [
        ("--current-mean-A", "current_mean_A", "A", "mean current demand [A]"),
        ("--current-initial-A", "current_initial_A", "A", "initial current demand [A]"),
        ("--current-final-A", "current_final_A", "A", "final current demand [A]"),
        ("--life-years", "life_years", "Y", "design life [years]"),
        ("--alloy", "alloy", "NAME", "anode alloy: al-zn-in or zinc"),
        ("--capacity-Ah-per-kg", "capacity_Ah_per_kg", "E", "electrochemical capacity, instead of --alloy [A·h/kg]"),
        ("--closed-circuit-V", "closed_circuit_V", "V", "anode closed-circuit potential [V vs Ag/AgCl seawater]"),
        ("--anode-type", "anode_type", "NAME", "anode type, e.g. long-slender-standoff"),
        ("--utilisation", "utilisation", "U", "utilisation factor, instead of --anode-type [unitless]"),
        ("--resistivity-ohm-m", "resistivity_ohm_m", "R", "seawater (or sediment) resistivity [Ω·m]"),
        ("--protection-V", "protection_V", "V", "design protection potential [V vs Ag/AgCl seawater]"),
        ("--net-mass-kg", "anode.net_mass_kg", "M", "net mass of one anode [kg]"),
        ("--length-m", "anode.length_m", "L", "anode length [m]"),
        ("--radius-m", "anode.radius_m", "R", "anode radius [m]"),
        ("--width-m", "anode.width_m", "W", "anode width (flush-mounted) [m]"),
        ("--area-m2", "anode.area_m2", "A", "exposed anode area (short flush, bracelet, plate) [m²]"),
        ("--standoff-m", "anode.standoff_m", "S", "clearance between anode and structure [m]")]),
    "anode-resistance": ("resistance of one galvanic anode by its shape (DNV-RP-B401 formulas)", [
        ("--shape", "shape", "NAME", "standoff, short-standoff, flush, short-flush, bracelet or plate"),
        ("--resistivity-ohm-m", "resistivity_ohm_m", "R", "electrolyte resistivity [Ω·m]"),
        ("--length-m", "length_m", "L", "anode length [m]"),
        ("--radius-m", "radius_m", "R", "anode radius [m]"),
        ("--periphery-m", "periphery_m", "P", "cross-section periphery, instead of --radius-m [m]"),
        ("--width-m", "width_m", "W", "anode width [m]"),
        ("--area-m2", "area_m2", "A", "exposed anode area [m²]"),
        ("--standoff-m", "standoff_m", "S", "clearance between anode and structure [m]")]),
    "buried": ("galvanic anodes for a buried structure (MIL-HDBK-1004/10 method)", [
        ("--current-A", "current_A", "A", "current required [A]"),
        ("--area-m2", "area_m2", "A", "surface area, instead of --current-A [m²]"),
        ("--current-density-mA-per-m2", "current_density_mA_per_m2", "I", "current density of bare steel [mA/m²]"),
        ("--coating-efficiency", "coating_efficiency", "CE", "share of the surface the coating insulates [unitless]"),
        ("--resistivity-ohm-m", "resistivity_ohm_m", "R", "soil resistivity [Ω·m]"),
        ("--alloy", "alloy", "NAME", "magnesium, magnesium-high-potential or zinc"),
        ("--anode", "anode", "NAME", "an anode of the size-factor table, e.g. 17-lb-packaged"),
        ("--size-factor", "size_factor", "F", "anode size factor f, instead of --anode [unitless]"),
        ("--anode-mass-kg", "anode_mass_kg", "M", "mass of one anode, with --size-factor [kg]"),
        ("--structure-potential-V-CSE", "structure_potential_V_CSE", "V", "structure potential [V vs CSE]"),
        ("--coating", "coating", "NAME", "well-coated or bare (magnesium's output constant)"),
        ("--life-years", "life_years", "Y", "design life [years]")]),
    "groundbed": ("impressed-current groundbed: resistance, rectifier, anode life", [
        ("--resistivity-ohm-m", "resistivity_ohm_m", "R", "soil resistivity [Ω·m]"),
        ("--length-m", "length_m", "L", "anode (or backfill column) length [m]"),
        ("--diameter-m", "diameter_m", "D", "anode (or backfill column) diameter [m]"),
        ("--count", "count", "N", "number of anodes in a line [unitless]"),
        ("--spacing-m", "spacing_m", "S", "centre-to-centre spacing [m]"),
        ("--orientation", "orientation", "NAME", "vertical or horizontal"),
        ("--depth-m", "depth_m", "H", "depth of a horizontal anode's axis [m]"),
        ("--paralleling", "paralleling", "NAME", "table (the handbooks' factor P) or sunde (Sunde's formula)"),
        ("--max-resistance-ohm", "max_resistance_ohm", "R", "largest groundbed resistance allowed [Ω]"),
        ("--current-A", "current_A", "A", "design current [A]"),
        ("--cable-resistance-ohm", "cable_resistance_ohm", "R", "resistance of the cables [Ω]"),
        ("--back-emf-V", "back_emf_V", "V", "back voltage between anodes and structure [V]"),
        ("--margin", "margin", "M", "margin on the rectifier current, 0.25 adds 25 % [unitless]"),
        ("--anode-material", "anode_material", "NAME", "e.g. high-silicon-cast-iron or mixed-metal-oxide"),
        ("--anode-mass-kg", "anode_mass_kg", "M", "mass of one anode [kg]"),
        ("--life-years", "life_years", "Y", "design life asked [years]"),
        ("--anode-rating-A", "anode_rating_A", "A", "rated current of one anode [A]")]),
    "tank": ("impressed-current anodes inside a water storage tank (MIL-HDBK-1004/10, ETL 1110-9-10)", [
        ("--resistivity-ohm-m", "resistivity_ohm_m", "R", "water resistivity [Ω·m]"),
        ("--tank-diameter-m", "tank_diameter_m", "D", "inside diameter of the tank [m]"),
        ("--arrangement", "arrangement", "NAME", "centre, rod-circle or hoop"),
        ("--current-A", "current_A", "A", "current required [A]"),
        ("--area-m2", "area_m2", "A", "wetted area, instead of --current-A [m²]"),
        ("--current-density-mA-per-m2", "current_density_mA_per_m2", "I", "current density of bare steel [mA/m²]"),
        ("--count", "count", "N", "number of anodes (rods, strings) [unitless]"),
        ("--anode-length-m", "anode_length_m", "L", "length of one anode or rod [m]"),
        ("--anode-diameter-m", "anode_diameter_m", "D", "anode diameter [m]"),
        ("--spacing-m", "spacing_m", "S", "spacing of anodes in a line (centre) [m]"),
        ("--circle-radius-m", "circle_radius_m", "R", "radius of the anode circle (rod-circle) [m]"),
        ("--equivalent-diameter-factor", "equivalent_diameter_factor", "DE",
         "DE of ETL 1110-9-10 figure 2-17 (rod-circle) [unitless]"),
        ("--fringe-factor", "fringe_factor", "F", "fringe factor of a short anode, read from the handbooks' curve "
                                                  "[unitless]"),
        ("--hoop-diameter-m", "hoop_diameter_m", "D", "diameter of the wire hoop (hoop) [m]"),
        ("--wire-diameter-m", "wire_diameter_m", "D", "diameter of the anode wire (hoop) [m]"),
        ("--depth-m", "depth_m", "H", "hoop depth below the high water level [m]"),
        ("--life-years", "life_years", "Y", "design life [years]"),
        ("--anode-material", "anode_material", "NAME", "e.g. high-silicon-cast-iron or platinised-titanium"),
        ("--efficiency", "efficiency", "E", "current efficiency the consumption is divided by [unitless]"),
        ("--anode-mass-kg", "anode_mass_kg", "M", "mass of one anode [kg]"),
        ("--anode-rating-A", "anode_rating_A", "A", "rated current of one anode [A]"),
        ("--cable-resistance-ohm", "cable_resistance_ohm", "R", "resistance of the cables [Ω]"),
        ("--back-emf-V", "back_emf_V", "V", "back voltage [V]"),
        ("--margin", "margin", "M", "margin on the rectifier current [unitless]")]),
}


def _dest(field):
    return "cp__" + field.replace(".", "__")


def add_parsers(sub, number):
    """Add the design commands and their options to the command line's sub-parsers.

    Args:
        sub: the ``add_subparsers`` object of the command line [unitless]
        number: the argparse type that reads one number (the project's number rule) [unitless]

    Returns:
        the parsers added, in the order of :data:`OPTIONS`

    References:
        Project convention (DESIGN.md: the command line and the page call the same entry points).

    >>> import argparse
    >>> parsers = add_parsers(argparse.ArgumentParser().add_subparsers(dest="command"), float)
    >>> len(parsers) == len(OPTIONS)
    True
    """
    added = []
    for name, (words, options) in OPTIONS.items():
        sp = sub.add_parser(name, help=f"{words}; {STDIN_WORDS}")
        for flag, field, metavar, text in options:
            sp.add_argument(flag, dest=_dest(field), type=str if metavar == "NAME" else number, metavar=metavar,
                            help=text.replace("%", "%%"))
        added.append(sp)
    return added


def request_of(ns, stdin):
    """The request of a design command: from its options, or, with none given, the JSON object on stdin.

    Args:
        ns: the parsed command line (argparse namespace) [unitless]
        stdin: the standard input, read only when no option is given [unitless]

    Returns:
        the request (a dict), or an InputError naming what is wrong

    References:
        Input rule of the project (one clear message naming the field).

    >>> import argparse
    >>> ns = argparse.Namespace(command="anodes", cp__length_m=2.0, cp__anode__radius_m=0.1)
    >>> request_of(ns, None)
    {'length_m': 2.0, 'anode': {'radius_m': 0.1}}
    """
    req = {}
    for key, value in vars(ns).items():
        if not key.startswith("cp__") or value is None:
            continue
        parts = key[4:].split("__")
        (req.setdefault(parts[0], {}) if len(parts) == 2 else req)[parts[-1]] = value
    return req if req else read_stdin(stdin)


def read_stdin(stdin):
    """One JSON object from standard input.

    Args:
        stdin: the standard input (a text stream) [unitless]

    Returns:
        the request (a dict), or an InputError saying the input is not a JSON object

    References:
        Input rule of the project (one clear message naming the field).

    >>> import io
    >>> read_stdin(io.StringIO('{"spacing_m": 3}'))
    {'spacing_m': 3}
    """
    try:
        req = json.loads(stdin.read())
    except ValueError as exc:
        raise InputError("request", "standard input", f"a JSON object ({exc})") from None
    except OSError:  # no standard input to read (closed, or a terminal that cannot be read)
        raise InputError("request", "standard input", "a JSON object on standard input") from None
    if not isinstance(req, dict):
        raise InputError("request", type(req).__name__, "a JSON object")
    return req
