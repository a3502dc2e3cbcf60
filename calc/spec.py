"""What the page needs to know of the engine besides the data: bounds and opening requests.

Each calculator page opens with a demonstration request (a scenario of our own, not a check
against any published value). :data:`OPENINGS` holds each one exactly as the page's form sends
it when opened with no parameters; :data:`FORM` holds the values its form shows in fields that
request does not send (the pH field of a pair that needs no pH). The build writes both, with the
bounds of :mod:`calc.bounds`, to ``assets/data/spec.json`` (:func:`page_spec`); the page fills its
forms from it, the build computes their answers in advance from it
(``sitebuild/precompute.py``), and ``couplewise example NAME`` prints one.
"""

import copy

from . import bounds
from .cpdesign import limits as cp_limits

#: calculator name -> the request its page sends on opening (demonstration values, ours)
OPENINGS = {
    "couple": {"a": "Zn2+/Zn", "b": "Cu2+/Cu", "temp_C": 35.0, "activities": {"Zn2+": 1e-05, "Cu2+": 1e-06},
               "pressures": {}},
    "electrode": {"id": "Zn2+/Zn", "temp_C": 30.0, "activities": {"Zn2+": 2e-06}},
    "convert": {"from": "Ag/AgCl seawater", "to": "CSE", "value_V": -0.93, "temp_C": 18.0},
    "activity": {"species": "Zn2+", "model": "extended", "ionic_strength": 0.02, "temp_C": 40.0},
    "joint": {"a": "aluminium-5083", "b": "stainless-316-passive", "env": "seawater-quiescent", "area_ratio": 0.2},
    "matrix": {"env": "seawater-quiescent",  # materials in the dataset's order, as the page's picker keeps them
               "materials": ["titanium", "stainless-316-passive", "stainless-316-active", "nickel-aluminium-bronze",
                             "cuni-90-10", "copper", "carbon-steel", "cast-iron", "aluminium-5083", "zinc"]},
    # CP design page (demonstration scenarios, ours): the steel piles of a small fishing jetty,
    # a coated buried water line to a pump house, the groundbed of a small tank farm's pipework
    "anodes": {"zones": [
        {"name": "Piles, coated (tidal and upper)", "zone": "seawater", "depth_m": 2.0, "area_m2": 180.0,
         "coating": "category-iii"},
        {"name": "Piles, bare (lower)", "zone": "seawater", "depth_m": 8.0, "area_m2": 260.0, "coating": "bare"},
        {"name": "Piles in the seabed", "zone": "seabed", "depth_m": 12.0, "area_m2": 150.0, "coating": "bare"}],
        "life_years": 20.0, "region": "sub-tropical", "alloy": "al-zn-in", "anode_type": "long-slender-standoff",
        "anode": {"net_mass_kg": 120.0, "length_m": 1.5, "radius_m": 0.09, "standoff_m": 0.3},
        "resistivity_ohm_m": 0.25, "structure": "carbon-steel"},
    "buried": {"area_m2": 420.0, "current_density_mA_per_m2": 20.0, "coating_efficiency": 0.95,
               "resistivity_ohm_m": 40.0, "alloy": "magnesium", "anode": "17-lb-packaged", "coating": "well-coated",
               "structure_potential_V_CSE": -0.85, "life_years": 20.0},
    "groundbed": {"resistivity_ohm_m": 25.0, "length_m": 2.1, "diameter_m": 0.25, "orientation": "vertical",
                  "count": 6, "spacing_m": 4.5, "paralleling": "table", "current_A": 12.0, "cable_length_m": 150.0,
                  "cable_ohm_per_km": 1.15, "margin": 0.25, "back_emf_V": 2.0,
                  "anode_material": "high-silicon-cast-iron", "anode_mass_kg": 20.0, "life_years": 20.0},
    "wenner": {"spacing_m": 3.0, "resistance_ohm": 1.4},
    # mixed-potential page: demonstration kinetics, invented (not measured), of a steel coupon on a
    # copper alloy in aerated water, potentials on the SHE scale
    "mixed": {"electrodes": [
        {"name": "Steel coupon", "area_cm2": 10.0, "reactions": [
            {"name": "Fe → Fe2+", "E_eq_V": -0.62, "i0_A_per_cm2": 1e-07, "b_anodic_V": 0.06},
            {"name": "O2 reduction", "E_eq_V": 0.8, "i0_A_per_cm2": 1e-10, "b_cathodic_V": 0.12,
             "i_lim_A_per_cm2": 2e-05}]},
        {"name": "Copper alloy", "area_cm2": 40.0, "reactions": [
            {"name": "Cu ⇄ CuCl2−", "E_eq_V": -0.14, "i0_A_per_cm2": 1e-08, "b_anodic_V": 0.06,
             "b_cathodic_V": 0.06, "i_lim_A_per_cm2": 1e-07},
            {"name": "O2 reduction", "E_eq_V": 0.8, "i0_A_per_cm2": 1e-12, "b_cathodic_V": 0.12,
             "i_lim_A_per_cm2": 2e-05}]}]},
    # passivity page: a duplex-like composition of our own in warm seawater (demonstration)
    "passivity": {"cr": 22.5, "mo": 3.1, "n": 0.17, "temp_C": 30.0, "salinity": 35.0},
}

#: calculator name -> values shown in fields that its opening request does not send
FORM = {
    "couple": {"pH": 6.5},
    "electrode": {"pH": 7.8},
    "convert": {"pH": 7.0},
}


def opening(name):
    """A calculator's opening request (a copy, safe to change).

    Args:
        name: calculator name, e.g. ``couple`` [unitless]

    Returns:
        the request dict

    References:
        Project convention (demonstration inputs, not a published example).

    >>> opening("convert")["to"]
    'CSE'
    """
    return copy.deepcopy(OPENINGS[name])


def page_spec():
    """The page's copy of the bounds and the opening requests, as plain JSON-ready data.

    Returns:
        ``{"bounds": {...}, "cp_bounds": {...}, "openings": {...}, "form": {...}}`` (``cp_bounds``: the
        bounds of the cathodic-protection design inputs, :mod:`calc.cpdesign.limits`)

    References:
        Project convention (DESIGN.md: one rule, one place; nothing parses JavaScript as text).

    >>> sorted(page_spec())
    ['bounds', 'cp_bounds', 'form', 'openings']
    """
    return {"bounds": bounds.as_data(), "cp_bounds": cp_limits.as_data(), "openings": copy.deepcopy(OPENINGS),
            "form": copy.deepcopy(FORM)}
